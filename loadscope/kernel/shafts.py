"""Shaft statics in 3D: support reactions, internal diagrams, deflections.

Sign convention (stated once, used everywhere). A shaft has a local frame:
the unit axis a and two transverse units e1, e2 with e1 x e2 = a (for a shaft
along +x: e1 = +y, e2 = +z). Loads are gathered at stations s [m] along the
axis as a force f = (f_a, f_1, f_2) [N] and a moment m = (m_a, m_1, m_2)
[N*m] about the axis point. At a cut at s, with sums over everything to the
left of the cut (s_i < s, reactions included):

* axial force      N(s)  = -sum f_a                  (tension positive)
* shear            V1(s) =  sum f_1,   V2(s) = sum f_2
* bending, a-e1    M1(s) =  sum f_1 (s - s_i) - sum m_2
* bending, a-e2    M2(s) =  sum f_2 (s - s_i) + sum m_1
* torque           T(s)  =  sum m_a
* Euler-Bernoulli: v1'' = M1 / (E I),  v2'' = M2 / (E I),  phi' = -T / (G J)
  with phi the twist about +a (right-hand rule): T sums the moments on the
  part left of the cut, so the cut face of that part carries -T

so a beam on two supports under a load toward -e1 has M1 > 0 (sagging) and
deflects toward -e1. Supports are simple (radial, no moment); they take axial
load as their mode says. Two supports: closed-form statics. More: the
redundant reactions follow from zero deflection at every support, with the
curvature M/(EI) of the stepped shaft integrated exactly (M is piecewise
linear and EI piecewise constant between stations, so the integration has no
discretisation error).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import cached_property, lru_cache

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ..errors import MechanismError
from .model import Shaft
from .vec import cross

FloatArray = NDArray[np.float64]
_MERGE = 1e-12  # [m] stations closer than this are one station


def local_frame(axis: ArrayLike) -> FloatArray:
    """Rows a, e1, e2 of a shaft's right-handed local frame (global comps).

    e1 is the projection of global +y (up) on the transverse plane (of
    global -x for a shaft within about 25 deg of vertical), e2 = a x e1, so
    a shaft along +x gets e1 = +y, e2 = +z.

    >>> local_frame([1.0, 0.0, 0.0]).round(12)
    array([[1., 0., 0.],
           [0., 1., 0.],
           [0., 0., 1.]])
    """
    return _frame(tuple(float(c) for c in np.asarray(axis, dtype=float).reshape(3))).copy()


@lru_cache(maxsize=256)
def _frame(axis: tuple[float, float, float]) -> FloatArray:
    a = np.asarray(axis, dtype=float)
    a = a / np.linalg.norm(a)
    ref = np.array([0.0, 1.0, 0.0]) if abs(a[1]) < 0.9 else np.array([-1.0, 0.0, 0.0])
    e1 = ref - (ref @ a) * a
    e1 /= np.linalg.norm(e1)
    e2 = cross(a, e1)
    return np.vstack([a, e1, e2])


def two_support_reactions(s_a: ArrayLike, s_b: ArrayLike, s: ArrayLike, f1: ArrayLike, f2: ArrayLike,
                          m1: ArrayLike = 0.0, m2: ArrayLike = 0.0) -> tuple[FloatArray, FloatArray,
                                                                             FloatArray, FloatArray]:
    r"""Transverse reactions [N] of a shaft on two simple supports (closed form).

    Statics in each plane (loads along the last axis, everything broadcasts):

    .. math::
        R_{b1} = -\frac{\sum f_1 (s_i - s_a) + \sum m_2}{s_b - s_a},\quad
        R_{b2} = \frac{\sum m_1 - \sum f_2 (s_i - s_a)}{s_b - s_a}

    and R_a = -sum f - R_b in each plane.

    Parameters
    ----------
    s_a, s_b : array_like
        Support stations [m], s_a != s_b.
    s : array_like
        Load stations [m], last axis indexes the loads.
    f1, f2 : array_like
        Transverse forces along e1, e2 [N].
    m1, m2 : array_like
        Moments about e1, e2 [N*m].

    Returns
    -------
    (R_a1, R_a2, R_b1, R_b2) : tuple of ndarray
        Reactions the supports exert on the shaft [N].

    Examples
    --------
    1000 N down (-e1) at the middle of a 0.2 m span:

    >>> [float(r) + 0.0 for r in two_support_reactions(0.0, 0.2, [0.1], [-1000.0], [0.0])]
    [500.0, 0.0, 500.0, 0.0]
    """
    s_a = np.asarray(s_a, dtype=float)
    s_b = np.asarray(s_b, dtype=float)
    s, f1, f2, m1, m2 = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (s, f1, f2, m1, m2)))
    span = s_b - s_a
    if np.any(span == 0.0):
        raise MechanismError("supports", "two supports stand at one point: the shaft can rotate about it",
                             "distinct support positions")
    arm = s - s_a[..., None]
    rb1 = -((f1 * arm).sum(-1) + m2.sum(-1)) / span
    rb2 = (m1.sum(-1) - (f2 * arm).sum(-1)) / span
    return -f1.sum(-1) - rb1, -f2.sum(-1) - rb2, rb1, rb2


@dataclass(frozen=True)
class ShaftSolution:
    """Everything solved on one shaft, in the shaft's local frame (see module
    docstring) unless a name says global.

    ``stations`` [m] are the sorted distinct load/support/step positions;
    ``left`` and ``right`` hold N, V1, V2, M1, M2, T (columns, see
    QUANTITIES) just left and right of each station, which fixes every
    diagram exactly (they are piecewise constant or linear between
    stations). ``diagram`` (computed on first use) maps names to sample
    arrays along ``diagram["s"]``, which repeats each station for the values
    just left and right of it and adds interior points for the curves.
    """

    shaft_id: str
    frame: FloatArray                # rows a, e1, e2
    support_ids: tuple[str, ...]
    reactions_local: FloatArray      # (k, 3): axial, e1, e2 [N]
    reactions_global: FloatArray     # (k, 3) [N]
    stations: FloatArray
    left: FloatArray                 # (n_stations, 6)
    right: FloatArray                # (n_stations, 6)
    deflection_at: FloatArray        # (n_stations, 2) v1, v2 [m]
    slope_at: FloatArray             # (n_stations, 2) [rad]
    twist_at: FloatArray             # (n_stations,) phi [rad], 0 at the shaft's start
    residual_force: FloatArray       # global [N]
    residual_moment: FloatArray      # global, about the shaft origin [N*m]
    curvature_left: FloatArray = field(repr=False, default_factory=lambda: np.zeros((0, 3)))
    curvature_right: FloatArray = field(repr=False, default_factory=lambda: np.zeros((0, 3)))
    samples: int = 64

    @cached_property
    def diagram(self) -> dict[str, FloatArray]:
        """Sampled diagrams: s, N, V1, V2, M1, M2, T, M (resultant), v1, v2,
        deflection, theta1, theta2, phi."""
        theta = np.column_stack([self.slope_at, self.twist_at])
        return _sample(self.stations, self.left, self.right, self.curvature_left, self.curvature_right,
                       self.deflection_at, theta, self.samples)


def _sections(shaft: Shaft) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
    lengths = np.array([sec.length for sec in shaft.sections])
    bounds = np.concatenate([[0.0], np.cumsum(lengths)])
    ei = shaft.E * np.array([sec.second_moment for sec in shaft.sections])
    ea = shaft.E * np.array([sec.area for sec in shaft.sections])
    gj = shaft.G * 2.0 * np.array([sec.second_moment for sec in shaft.sections])
    return bounds, ei, ea, gj


def _merge_stations(values: FloatArray) -> FloatArray:
    v = np.sort(values)
    keep = np.concatenate([[True], np.diff(v) > _MERGE])
    return v[keep]


def _integrate(kl: FloatArray, kr: FloatArray, h: FloatArray) -> tuple[FloatArray, FloatArray]:
    """Slope and value at every station of y'' = k, y = y' = 0 at the first.

    ``kl``/``kr`` are k just left/right of each station, shape (n, ...);
    k is linear between stations, so the sums are exact.
    """
    k0, k1 = kr[:-1], kl[1:]
    hh = h.reshape((-1,) + (1,) * (kl.ndim - 1))
    dtheta = hh * (k0 + k1) / 2.0
    theta = np.concatenate([np.zeros_like(kl[:1]), np.cumsum(dtheta, axis=0)])
    dv = theta[:-1] * hh + hh**2 * (2.0 * k0 + k1) / 6.0
    v = np.concatenate([np.zeros_like(kl[:1]), np.cumsum(dv, axis=0)])
    return theta, v


QUANTITIES = ("N", "V1", "V2", "M1", "M2", "T")


def _left_sums(st: FloatArray, f: FloatArray, m: FloatArray) -> tuple[FloatArray, FloatArray]:
    """N, V1, V2, M1, M2, T (columns, see QUANTITIES) just left and just right
    of each station, from station loads f, m of shape (n, 3)."""
    c = np.cumsum(np.hstack([f, f * st[:, None], m]), axis=0)
    right = np.empty((st.size, 6))
    right[:, 0] = -c[:, 0]
    right[:, 1] = c[:, 1]
    right[:, 2] = c[:, 2]
    right[:, 3] = st * c[:, 1] - c[:, 4] - c[:, 8]
    right[:, 4] = st * c[:, 2] - c[:, 5] + c[:, 7]
    right[:, 5] = c[:, 6]
    left = np.empty_like(right)
    left[0] = 0.0
    cl = c[:-1]
    sl = st[1:]
    left[1:, 0] = -cl[:, 0]
    left[1:, 1] = cl[:, 1]
    left[1:, 2] = cl[:, 2]
    left[1:, 3] = sl * cl[:, 1] - cl[:, 4] - cl[:, 8]
    left[1:, 4] = sl * cl[:, 2] - cl[:, 5] + cl[:, 7]
    left[1:, 5] = cl[:, 6]
    return left, right


def solve_shaft(shaft: Shaft, s: FloatArray, f_global: FloatArray, m_global: FloatArray,
                samples: int = 64) -> ShaftSolution:
    """Reactions, diagrams and deflections of one shaft.

    Parameters
    ----------
    shaft : Shaft
        Geometry, sections, supports.
    s : ndarray, shape (n,)
        Load stations [m].
    f_global, m_global : ndarray, shape (n, 3)
        Forces [N] and moments about the axis point at each station [N*m],
        global components.
    samples : int
        Approximate number of interior diagram samples along the shaft.
    """
    where = shaft.path or f"shaft {shaft.id!r}"
    supports = shaft.supports
    if len(supports) < 2:
        raise MechanismError(f"{where}.supports",
                             f"has {len(supports)} support(s): the shaft is free to rotate (a mechanism)",
                             "at least two bearings")
    sup_s = np.array([sp.at for sp in supports])
    order = np.argsort(sup_s)
    if np.any(np.diff(sup_s[order]) <= _MERGE):
        i, j = order[np.argmin(np.diff(sup_s[order]))], order[np.argmin(np.diff(sup_s[order])) + 1]
        raise MechanismError(f"{where}.supports",
                             f"supports {supports[i].id!r} and {supports[j].id!r} stand at one point "
                             f"({sup_s[i]:.6g} m): the shaft can rotate about it", "distinct positions")
    frame = local_frame(shaft.axis)
    f_loc = np.asarray(f_global, dtype=float).reshape(-1, 3) @ frame.T
    m_loc = np.asarray(m_global, dtype=float).reshape(-1, 3) @ frame.T
    s = np.asarray(s, dtype=float).reshape(-1)

    bounds, ei_sec, ea_sec, gj_sec = _sections(shaft)
    length = bounds[-1]
    st = _merge_stations(np.concatenate([bounds, sup_s, s]))
    n = st.size
    idx_load = np.clip(np.searchsorted(st, s - _MERGE), 0, n - 1)
    idx_sup = np.clip(np.searchsorted(st, sup_s - _MERGE), 0, n - 1)
    gather = (idx_load[None, :] == np.arange(n)[:, None]).astype(float)   # station <- load
    f = gather @ f_loc
    m = gather @ m_loc

    nsec = len(shaft.sections)
    sec_l = np.clip(np.searchsorted(bounds, st, side="left") - 1, 0, nsec - 1)
    sec_r = np.clip(np.searchsorted(bounds, st, side="right") - 1, 0, nsec - 1)
    h = np.diff(st)

    scale_f = max(float(np.abs(f).max(initial=0.0)), 1e-300)
    scale_m = max(float(np.abs(m).max(initial=0.0)), scale_f * max(length, 1e-3))
    torque_sum = float(m[:, 0].sum())
    if abs(torque_sum) > 1e-9 * scale_m:
        raise MechanismError(where, f"the torque about its axis does not balance ({torque_sum:.6g} N*m): "
                             "bearings do not hold torque", "torques that balance on every shaft")

    reactions = np.zeros((len(supports), 3))
    reactions[:, 1:] = _transverse_reactions(st, f, m, sup_s, idx_sup, ei_sec[sec_l], ei_sec[sec_r], h)
    reactions[:, 0] = _axial_reactions(shaft, where, st, f, sup_s, idx_sup, ea_sec[sec_r], h, scale_f)

    f_all = f + (idx_sup[None, :] == np.arange(n)[:, None]).astype(float) @ reactions
    left, right = _left_sums(st, f_all, m)
    kl, kr, v_at, th_at = _deflections(st, left, right, ei_sec, gj_sec, sec_l, sec_r, h, sup_s[order[[0, -1]]])

    r_glob = reactions @ frame
    origin = np.asarray(shaft.origin, dtype=float)
    pts = origin + np.outer(st, frame[0])
    f_all_g = f_all @ frame
    res_f = f_all_g.sum(axis=0)
    res_m = (cross(pts - origin, f_all_g) + m @ frame).sum(axis=0)
    return ShaftSolution(shaft_id=shaft.id, frame=frame, support_ids=tuple(sp.id for sp in supports),
                         reactions_local=reactions, reactions_global=r_glob, stations=st, left=left, right=right,
                         deflection_at=v_at[:, :2], slope_at=th_at[:, :2], twist_at=th_at[:, 2],
                         residual_force=res_f, residual_moment=res_m, curvature_left=kl, curvature_right=kr,
                         samples=samples)


def _transverse_reactions(st: FloatArray, f: FloatArray, m: FloatArray, sup_s: FloatArray,
                          idx_sup: NDArray[np.intp], ei_l: FloatArray, ei_r: FloatArray,
                          h: FloatArray) -> FloatArray:
    """(k, 2) reactions along e1, e2 from statics (k = 2) or compatibility."""
    k = sup_s.size
    if k == 2:
        ra1, ra2, rb1, rb2 = two_support_reactions(sup_s[0], sup_s[1], st, f[:, 1], f[:, 2], m[:, 1], m[:, 2])
        return np.array([[ra1, ra2], [rb1, rb2]], dtype=float)
    # Free-free beam integrated from the left end; v = v_p + sum R G + c0 + c1 s.
    left, right = _left_sums(st, f, m)
    kl = left[:, 3:5] / ei_l[:, None]
    kr = right[:, 3:5] / ei_r[:, None]
    _, v_p = _integrate(kl, kr, h)
    unit_m = np.maximum(st[:, None] - sup_s[None, :], 0.0)      # M of a unit force at each support
    _, g = _integrate(unit_m / ei_l[:, None], unit_m / ei_r[:, None], h)
    a = np.zeros((k + 2, k + 2))
    a[:k, :k] = g[idx_sup]
    a[:k, k] = 1.0
    a[:k, k + 1] = sup_s
    a[k, :k] = 1.0
    a[k + 1, :k] = sup_s
    rhs = np.zeros((k + 2, 2))
    rhs[:k] = -v_p[idx_sup]
    rhs[k] = -f[:, 1:].sum(axis=0)
    rhs[k + 1, 0] = -((f[:, 1] * st).sum() + m[:, 2].sum())
    rhs[k + 1, 1] = m[:, 1].sum() - (f[:, 2] * st).sum()
    # Scale columns: the deflection rows are tiny next to the statics rows.
    col = np.abs(a).max(axis=0)
    sol = np.linalg.solve(a / col, rhs) / col[:, None]
    return sol[:k]


def _axial_reactions(shaft: Shaft, where: str, st: FloatArray, f: FloatArray, sup_s: FloatArray,
                     idx_sup: NDArray[np.intp], ea_r: FloatArray, h: FloatArray, scale_f: float) -> FloatArray:
    """Axial reactions: the one support that can take the thrust, or, for
    several, the split that keeps the shaft's axial length compatible."""
    need = -float(f[:, 0].sum())    # total the supports must push toward +axis
    out = np.zeros(sup_s.size)
    balanced = abs(need) <= 1e-12 * scale_f
    if balanced:
        # Axial loads that balance among themselves still load two or more
        # axially held supports (compatibility), so only skip the split when
        # at most one support takes axial load.
        ok_modes: tuple[str, ...] = ("locating", "positive", "negative")
    else:
        ok_modes = ("locating", "positive") if need > 0 else ("locating", "negative")
    cand = [i for i, sp in enumerate(shaft.supports) if sp.axial in ok_modes]
    if balanced and len(cand) < 2:
        return out
    if not cand:
        sense = "+axis" if need < 0 else "-axis"
        raise MechanismError(f"{where}.supports",
                             f"an axial load of {abs(need):.6g} N acts toward {sense} and no support takes "
                             "axial load that way: the shaft would slide", "a locating bearing")
    while True:
        if len(cand) == 1:
            out[:] = 0.0
            out[cand[0]] = need
            return out
        # u' = N / EA; u(s_j) = 0 at every candidate support, up to a rigid shift.
        n_p = -np.cumsum(f[:, 0])                  # N just right of each station
        du = h * n_p[:-1] / ea_r[:-1]
        u_p = np.concatenate([[0.0], np.cumsum(du)])
        cs = sup_s[cand]
        unit_n = -(st[:-1, None] >= cs[None, :] - _MERGE).astype(float)
        hu = np.vstack([np.zeros((1, len(cand))), np.cumsum(h[:, None] * unit_n / ea_r[:-1, None], axis=0)])
        kk = len(cand)
        a = np.zeros((kk + 1, kk + 1))
        a[:kk, :kk] = hu[idx_sup[cand]]
        a[:kk, kk] = 1.0
        a[kk, :kk] = 1.0
        rhs = np.concatenate([-u_p[idx_sup[cand]], [need]])
        col = np.abs(a).max(axis=0)
        sol = np.linalg.solve(a / col, rhs) / col
        wrong = [c for c, r in zip(cand, sol[:kk])
                 if (shaft.supports[c].axial == "positive" and r < 0)
                 or (shaft.supports[c].axial == "negative" and r > 0)]
        if not wrong:
            out[:] = 0.0
            out[cand] = sol[:kk]
            return out
        cand = [c for c in cand if c not in wrong]


def _deflections(st: FloatArray, left: FloatArray, right: FloatArray, ei_sec: FloatArray, gj_sec: FloatArray,
                 sec_l: NDArray[np.intp], sec_r: NDArray[np.intp], h: FloatArray,
                 bc: FloatArray) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
    """Curvatures (k1, k2, twist rate) just left/right of each station, and
    deflection v (n, 3) and slope (n, 3) at each station; the third column of
    the slope is the twist phi."""
    stiff_l = np.column_stack([ei_sec[sec_l], ei_sec[sec_l], -gj_sec[sec_l]])
    stiff_r = np.column_stack([ei_sec[sec_r], ei_sec[sec_r], -gj_sec[sec_r]])
    kl = left[:, [3, 4, 5]] / stiff_l
    kr = right[:, [3, 4, 5]] / stiff_r
    theta, v = _integrate(kl, kr, h)
    # Third column: phi' = -T / GJ, so its "slope" is the twist phi (its "value" is unused).
    # Rigid-body line so that v = 0 at the outermost supports (stations hold them exactly).
    ia, ib = np.searchsorted(st, bc[0] - _MERGE), np.searchsorted(st, bc[1] - _MERGE)
    slope = (v[ib, :2] - v[ia, :2]) / (st[ib] - st[ia])
    v[:, :2] -= v[ia, :2] + np.outer(st - st[ia], slope)
    theta[:, :2] -= slope
    return kl, kr, v, theta


def _sample(st: FloatArray, left: FloatArray, right: FloatArray, kl: FloatArray, kr: FloatArray, v: FloatArray,
            theta: FloatArray, samples: int) -> dict[str, FloatArray]:
    """Each station twice (left, right) and interior points between; the
    curves between stations are the exact polynomials of the integration."""
    h = np.diff(st)
    length = st[-1] - st[0]
    n_sub = np.maximum(1, np.ceil(h / max(length, 1e-300) * samples)).astype(int)
    seg = np.repeat(np.arange(h.size), n_sub - 1)
    frac = np.concatenate([np.arange(1, k) / k for k in n_sub]) if h.size else np.zeros(0)
    hs = h[seg][:, None]
    tt = (frac * h[seg])[:, None]
    k0, k1 = kr[:-1][seg], kl[1:][seg]
    dk = (k1 - k0) / hs
    v_in = v[seg] + theta[seg, :2] * tt + k0[:, :2] * tt**2 / 2 + dk[:, :2] * tt**3 / 6
    th_in = theta[seg] + k0 * tt + dk * tt**2 / 2
    q_in = right[:-1][seg] + (left[1:][seg] - right[:-1][seg]) * frac[:, None]

    s_samp = np.concatenate([np.repeat(st, 2), st[seg] + tt[:, 0]])
    order = np.argsort(s_samp, kind="stable")
    both_q = np.stack([left, right], axis=1).reshape(-1, 6)
    q = np.vstack([both_q, q_in])[order]
    vv = np.vstack([np.repeat(v, 2, axis=0), v_in])[order]
    th = np.vstack([np.repeat(theta, 2, axis=0), th_in])[order]
    diag = {"s": s_samp[order]}
    for j, name in enumerate(QUANTITIES):
        diag[name] = q[:, j]
    diag["M"] = np.hypot(q[:, 3], q[:, 4])
    diag["v1"], diag["v2"] = vv[:, 0], vv[:, 1]
    diag["theta1"], diag["theta2"], diag["phi"] = th[:, 0], th[:, 1], th[:, 2]
    diag["deflection"] = np.hypot(vv[:, 0], vv[:, 1])
    return diag

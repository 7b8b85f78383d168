"""Loads on the mounting bolts of a housing.

A bolt group in a mounting plane (unit normal n pointing from the foundation
into the housing) must hand the housing a force L and a moment L_M about the
group centroid. Every bolt is taken with the same area and stiffness.

* In-plane shear, elastic method: an equal direct share of the in-plane
  force plus a torsional part proportional to the distance from the
  centroid, perpendicular to it: f_i = L_s / n + (L_M . n) (n x r_i) / sum r^2.
* Axial, elastic method: force along n linear over the plane about the
  centroid, f_i = L_n / n + g . r_i, with g from the in-plane moment and the
  group's second moments (I_uu, I_vv, I_uv).
* Axial, tipping-edge variant: the housing tips about a given edge line of
  its foot; the overturning moment about that edge is taken by the bolts on
  the far side, each in proportion to its distance from the edge (the edge
  takes the compression); the normal force is shared equally, and the
  moment of those equal shares about the edge counts toward the balance
  (so the edge contact is left a force only, no moment about the edge).

Bolt tension is positive when the bolt pulls the housing toward the
foundation (the bolt's force on the housing points along -n).

References
----------
.. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering
   Design, 9th ed., Sec. 8-12 "Bolted and riveted joints loaded in shear"
   (primary and secondary shear, Eqs. 8-55 to 8-57).
.. [2] Blodgett, O. W., Design of Welded Structures, Lincoln Arc Welding
   Foundation, 1966, Sec. 3.3 (bolt group treated as a line group) -- the
   tipping-edge variant is common practice for foot-mounted machinery.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ..errors import InputError, MechanismError
from .vec import cross

FloatArray = NDArray[np.float64]


@dataclass(frozen=True)
class BoltLoads:
    """Bolt loads, one row per bolt.

    ``force`` [N] is the force each bolt exerts on the housing (global);
    ``shear`` [N] its in-plane magnitude; ``tension`` [N] the axial load
    (positive in tension). ``centroid`` [m] of the group; ``residual_force``
    and ``residual_moment`` are what the bolt forces leave unbalanced of the
    load to carry: zero (to round-off) for the elastic method; for the tipping
    variant, what the foot's contact along the edge must carry.
    """

    force: FloatArray
    shear: FloatArray
    tension: FloatArray
    centroid: FloatArray
    residual_force: FloatArray
    residual_moment: FloatArray


def _plane_axes(normal: FloatArray) -> tuple[FloatArray, FloatArray]:
    ref = np.array([1.0, 0.0, 0.0]) if abs(normal[0]) < 0.9 else np.array([0.0, 0.0, 1.0])
    u = ref - (ref @ normal) * normal
    u /= np.linalg.norm(u)
    return u, cross(normal, u)


def bolt_loads(positions: ArrayLike, normal: ArrayLike, force: ArrayLike, moment: ArrayLike,
               method: str = "elastic", edge_point: ArrayLike | None = None,
               edge_direction: ArrayLike | None = None) -> BoltLoads:
    """Share a load among the bolts of a group.

    Parameters
    ----------
    positions : array_like, shape (n, 3)
        Bolt positions [m] in the mounting plane (projected onto it).
    normal : array_like, shape (3,)
        Plane normal, from the foundation into the housing.
    force : array_like, shape (3,)
        Force [N] the bolts together must exert on the housing.
    moment : array_like, shape (3,)
        Moment [N*m] the bolts together must exert, about the group centroid.
    method : {"elastic", "tipping"}
        Axial distribution (see module docstring).
    edge_point, edge_direction : array_like, optional
        The tipping edge line (``method="tipping"``).

    Examples
    --------
    Four bolts on a 0.2 m x 0.1 m rectangle, 1000 N of shear along x and a
    100 N*m twist about the normal y:

    >>> pos = [[0.1, 0, 0.05], [-0.1, 0, 0.05], [-0.1, 0, -0.05], [0.1, 0, -0.05]]
    >>> b = bolt_loads(pos, [0, 1, 0], [1000, 0, 0], [0, 100, 0])
    >>> b.shear.round(1)
    array([403.1, 403.1, 250. , 250. ])
    """
    p = np.asarray(positions, dtype=float).reshape(-1, 3)
    nrm = np.asarray(normal, dtype=float)
    nrm = nrm / np.linalg.norm(nrm)
    f = np.asarray(force, dtype=float)
    m = np.asarray(moment, dtype=float)
    nb = p.shape[0]
    c = p.mean(axis=0)
    r = p - c
    r = r - np.outer(r @ nrm, nrm)
    u, v = _plane_axes(nrm)
    ru, rv = r @ u, r @ v
    scale_m = max(float(np.linalg.norm(m)), float(np.linalg.norm(f)) * max(float(np.abs(r).max(initial=0)), 1e-3))

    f_n = float(f @ nrm)
    f_s = f - f_n * nrm
    m_n = float(m @ nrm)
    j = float((ru**2 + rv**2).sum())
    shear = np.tile(f_s / nb, (nb, 1))
    if j > 0.0:
        shear += m_n * cross(nrm, r) / j
    elif abs(m_n) > 1e-9 * scale_m:
        raise MechanismError("housing.bolts", "a single bolt cannot resist a twisting moment about the plane "
                             "normal", "at least two bolts apart")

    m_u, m_v = float(m @ u), float(m @ v)
    if method == "elastic":
        iuu, ivv, iuv = float((ru * ru).sum()), float((rv * rv).sum()), float((ru * rv).sum())
        # sum f_i v_i = M_u, -sum f_i u_i = M_v with f_i = a + g_u u_i + g_v v_i
        a2 = np.array([[iuv, ivv], [-iuu, -iuv]])
        det = iuu * ivv - iuv**2
        if det > 1e-12 * max(iuu + ivv, 1e-300) ** 2:
            g = np.linalg.solve(a2, np.array([m_u, m_v]))
        else:
            g = np.linalg.lstsq(a2, np.array([m_u, m_v]), rcond=None)[0]
            if np.linalg.norm(a2 @ g - [m_u, m_v]) > 1e-9 * scale_m:
                raise MechanismError("housing.bolts", "the bolts stand on one line: they cannot resist an "
                                     "overturning moment about it", "bolts not all on one line")
        axial = f_n / nb + g[0] * ru + g[1] * rv
    elif method == "tipping":
        if edge_point is None or edge_direction is None:
            raise InputError("housing.tipping_edge", "the tipping method needs an edge", "point and direction")
        e0 = np.asarray(edge_point, dtype=float)
        ed = np.asarray(edge_direction, dtype=float)
        ed = ed - (ed @ nrm) * nrm
        if np.linalg.norm(ed) < 1e-12:
            raise InputError("housing.tipping_edge.direction", "must lie in the mounting plane", "in-plane")
        ed /= np.linalg.norm(ed)
        side = cross(nrm, ed)            # in-plane, away from the edge
        d = (p - e0) @ side
        # A bolt tension t at distance d gives the housing a moment -t d about
        # the edge direction (side x n = edge direction). The bolts take the
        # moment about the edge that their shear and equal normal shares leave
        # over (a line contact along the edge carries no moment about it).
        base = shear + np.outer(np.full(nb, f_n / nb), nrm)
        m_edge = float((m + cross(c - e0, f) - cross(p - e0, base).sum(axis=0)) @ ed)
        far = d > 1e-12
        denom = float((d[far] ** 2).sum())
        k = max(-m_edge / denom, 0.0) if denom > 0.0 else 0.0
        if denom == 0.0 and m_edge < -1e-9 * scale_m:
            raise MechanismError("housing.tipping_edge", "no bolt stands on the far side of the tipping edge",
                                 "an edge with bolts beyond it")
        axial = f_n / nb - np.where(far, k * d, 0.0)
    else:
        raise InputError("housing.bolt_method", f"unknown method {method!r}", "elastic, tipping")

    forces = shear + np.outer(axial, nrm)
    res_f = forces.sum(axis=0) - f
    res_m = cross(p - c, forces).sum(axis=0) - m
    return BoltLoads(force=forces, shear=np.linalg.norm(shear, axis=1), tension=-axial, centroid=c,
                     residual_force=res_f, residual_moment=res_m)

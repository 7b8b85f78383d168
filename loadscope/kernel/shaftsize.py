"""The inverse of a shaft section's rating: the smallest diameter that
reaches a target fatigue or first-cycle yield factor.

Same method and units as :mod:`loadscope.kernel.sections` (SI: [m], [N*m],
[N], [Pa]): a rotating round section, solid or with a bore in a fixed ratio
d_i / d, bending fully reversed, torque steady plus an alternating part,
steady axial force, Kf and Kfs fixed, one of the four DE criteria (Shigley
9th ed. Eqs. 7-7 to 7-16). With no axial force and Se independent of d
the answers are the closed forms of Shigley 9th ed. Eqs. 7-8, 7-10, 7-12,
7-14 (fatigue) and d^3 = 16 n sigma'_1 / (pi Sy (1 - k^4)) (yield, from
Eq. 7-15, sigma'_1 the von Mises stress of a unit-cubed section). With an
axial force (a d^-2 term beside the d^-3 ones) or the Marin size factor kb
(which depends on d, Eq. 6-20: an implicit equation) there is no closed
form; both factors still rise monotonically with d, so the root is found by
a secant iteration on (log d, log n), started from the closed form, every
element of the arrays at once, with a bisection on log d as the fallback
for any element the secant does not settle (kb has a 0.2 % jump at 51 mm).

References
----------
.. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering
   Design, 9th ed., McGraw-Hill, 2011, Sec. 7-4 (Eqs. 7-7 to 7-16) and
   Eq. 6-20 (size factor).

Results are for preliminary design; they must be checked by a qualified
engineer, and local codes, standards and licensed practice govern.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike

from ..errors import InputError, join_path
from . import arraychecks as ac
from . import sections as sec
from .sections import Criterion, FloatArray

_WIDE = (1e-4, 10.0)          # [m] the bracket when Se does not depend on d
_RATING = (1e-6, 10.0)        # [m] the rating's bracket: a lighter load reports 1 um (the safe side)
_TOL = 1e-14                  # on log d: round-off


@dataclass(frozen=True)
class _Loads:
    """Stress coefficients of a unit diameter: each stress is coef / d^3 (bending,
    torsion) or coef / d^2 (axial), Kf applied, bore ratio k folded in."""

    sa: FloatArray
    sm_b: FloatArray
    sm_ax: FloatArray
    ta: FloatArray
    tm: FloatArray

    def alternating_midrange(self, d: FloatArray) -> tuple[FloatArray, FloatArray]:
        """sigma_a', sigma_m' [Pa] at diameter d [m]."""
        d3 = d**3
        sm = self.sm_b / d3 + self.sm_ax / d**2
        return np.sqrt(self.sa**2 + 3.0 * self.ta**2) / d3, np.sqrt(sm**2 + 3.0 * (self.tm / d3) ** 2)

    def maximum(self, d: FloatArray) -> FloatArray:
        """sigma'_max [Pa] at diameter d [m]."""
        d3 = d**3
        s = (self.sa + self.sm_b) / d3 + self.sm_ax / d**2
        return np.sqrt(s**2 + 3.0 * ((self.ta + self.tm) / d3) ** 2)


def _loads(ma: ArrayLike, tm: ArrayLike, kf: ArrayLike, kfs: ArrayLike, mm: ArrayLike, ta: ArrayLike,
           fm: ArrayLike, bore_ratio: ArrayLike, kf_axial: ArrayLike | None, path: str) -> tuple[_Loads, FloatArray]:
    k = ac.within(bore_ratio, 0.0, 1.0, join_path(path, "bore_ratio"), hi_open=True)
    kfb = sec._kf_check(kf, join_path(path, "kf"))
    kft = sec._kf_check(kfs, join_path(path, "kfs"))
    kfa = kfb if kf_axial is None else sec._kf_check(kf_axial, join_path(path, "kf_axial"))
    z = math.pi * (1.0 - k**4)                      # 32 I / d^4
    area = math.pi * (1.0 - k**2) / 4.0             # A / d^2

    def mag(v: ArrayLike, name: str, unit: str) -> FloatArray:
        return np.abs(ac.finite(v, join_path(path, name), unit))

    loads = _Loads(sa=kfb * 32.0 * mag(ma, "ma", "N*m") / z, sm_b=kfb * 32.0 * mag(mm, "mm", "N*m") / z,
                   sm_ax=kfa * mag(fm, "fm", "N") / area, ta=kft * 16.0 * mag(ta, "ta", "N*m") / z,
                   tm=kft * 16.0 * mag(tm, "tm", "N*m") / z)
    return loads, k


def _solve(log_n: Callable[[FloatArray], FloatArray], log_target: FloatArray, x0: FloatArray, lo: float,
           hi: float) -> FloatArray:
    """x = log d with log_n(x) = log_target, log_n rising; secant from x0,
    bisection on [log lo, log hi] for what the secant leaves."""
    x0 = np.clip(x0, math.log(lo), math.log(hi))
    f0 = log_n(x0) - log_target
    x1 = np.clip(x0 - f0 / 3.0, math.log(lo), math.log(hi))      # n ~ d^3 for the first step
    f1 = log_n(x1) - log_target
    for _ in range(40):
        step = np.abs(x1 - x0)
        if np.all(step < _TOL):
            break
        den = f1 - f0
        slope = np.where((np.abs(den) > 0.0) & (step > 0.0), den / np.where(step > 0.0, x1 - x0, 1.0), 3.0)
        slope = np.where(slope > 0.5, slope, 3.0)                  # keep the step downhill of a rising n
        x0, f0 = x1, f1
        x1 = np.clip(x1 - f1 / slope, math.log(lo), math.log(hi))
        f1 = log_n(x1) - log_target
    settled = (np.abs(x1 - x0) < _TOL) & (f1 >= -1e-12)
    if np.all(settled):
        return x1
    a = np.full(np.shape(x1), math.log(lo))
    b = np.full(np.shape(x1), math.log(hi))
    for _ in range(64):
        mid = 0.5 * (a + b)
        up = log_n(mid) >= log_target
        b = np.where(up, mid, b)
        a = np.where(up, a, mid)
    return np.where(settled, x1, b)


def _fatigue_log_n(loads: _Loads, se: FloatArray, sm: FloatArray, criterion: str,
                   size_factor: bool) -> Callable[[FloatArray], FloatArray]:
    lo, hi = sec.SIZE_RANGE

    def log_n(x: FloatArray) -> FloatArray:
        d = np.exp(x)
        se_d = se * sec._kb(np.clip(d, lo, hi) * 1e3) if size_factor else se
        alt, mid = loads.alternating_midrange(d)
        return -np.log(sec._inverse_n(alt / se_d, mid / sm, criterion))

    return log_n


def min_shaft_diameter(target: ArrayLike, ma: ArrayLike, tm: ArrayLike, kf: ArrayLike, kfs: ArrayLike,
                       se: ArrayLike, sut: ArrayLike, sy: ArrayLike | None = None,
                       criterion: Criterion = "goodman", mm: ArrayLike = 0.0, ta: ArrayLike = 0.0,
                       fm: ArrayLike = 0.0, bore_ratio: ArrayLike = 0.0, size_factor: bool = False,
                       kf_axial: ArrayLike | None = None, path: str = "") -> FloatArray:
    """Smallest diameter whose fatigue safety factor reaches ``target`` [m]
    (the inverse of :func:`~loadscope.kernel.sections.shaft_fatigue_factor`).

    Solves n(d) = target, n by one of the DE criteria (Shigley 9th ed. Eqs.
    7-7 to 7-14); see the module docstring for the method. Found to
    round-off (the factor at the result equals the target to ~1e-12).

    Parameters
    ----------
    target : array_like
        Required safety factor n [-], > 0.
    ma, tm, kf, kfs, mm, ta, fm, kf_axial : see :func:`~loadscope.kernel.sections.shaft_stresses`.
    se : array_like
        Endurance limit [Pa]; with ``size_factor=True`` the endurance limit
        *without* kb, which is then recomputed at each trial diameter by
        Eq. 6-20 (rotating; valid 2.79 to 254 mm).
    sut, sy, criterion : see :func:`~loadscope.kernel.sections.fatigue_safety_factor`.
    bore_ratio : array_like
        d_i / d [-], 0 <= ratio < 1 (0: solid).
    size_factor : bool
    path : str
        Field-path prefix for error messages.

    Raises
    ------
    InputError
        An unloaded section (no diameter follows), or a target that is not
        reached within 0.1 mm to 10 m (2.79 to 254 mm with the size factor).

    Examples
    --------
    The diameter of Shigley 9th ed. Example 7-1 (from memory) back from its factor:

    >>> lbf_in = 0.1129848
    >>> d = min_shaft_diameter(1.62, 1260 * lbf_in, 1100 * lbf_in, 1.58, 1.39, 29.3 * sec.KPSI, 105 * sec.KPSI)
    >>> round(float(d) / sec.INCH, 3)
    1.1
    """
    n_t = ac.positive(target, join_path(path, "target"))
    sev, sm = sec._strengths(se, sut, sy, criterion, path)
    loads, _ = _loads(ma, tm, kf, kfs, mm, ta, fm, bore_ratio, kf_axial, path)
    shape = np.broadcast_shapes(n_t.shape, sev.shape, sm.shape, *(np.shape(v) for v in vars(loads).values()))
    lo_d, hi_d = sec.SIZE_RANGE if size_factor else _WIDE
    log_n = _fatigue_log_n(loads, sev, sm, criterion, size_factor)
    with np.errstate(divide="ignore"):
        n_lo, n_hi = np.exp(log_n(np.full(shape, math.log(lo_d)))), np.exp(log_n(np.full(shape, math.log(hi_d))))
    if np.any(np.isinf(n_lo)):
        raise InputError(path or "section", "the section carries no load; no minimum diameter follows",
                         "a non-zero moment, torque or axial force")
    n_tb = np.broadcast_to(n_t, shape)
    if np.any(n_hi < n_tb):
        v, at = ac.first_bad(n_tb, n_hi < n_tb)
        raise InputError(join_path(path, "target"), f"{v:g}{at} is not reached below a diameter of {hi_d:g} m",
                         f"a target reached within {lo_d:g} to {hi_d:g} m")
    if np.any(n_lo > n_tb):
        v, at = ac.first_bad(n_tb, n_lo > n_tb)
        raise InputError(join_path(path, "target"), f"{v:g}{at} is already met at {lo_d:g} m, the smallest "
                         "diameter this method covers", f"a target not met below {lo_d:g} m")
    return ac.scalar_or_array(np.exp(_solve(log_n, np.log(n_tb), _guess(log_n, n_tb, lo_d), lo_d, hi_d)))


def _guess(log_n: Callable[[FloatArray], FloatArray], n_t: FloatArray, at: float) -> FloatArray:
    """Closed-form start: the d^-3 scaling from a probe at 10 * ``at``."""
    x = np.full(np.shape(n_t), math.log(10.0 * at))
    return x + (np.log(n_t) - log_n(x)) / 3.0


def min_yield_diameter(target: ArrayLike, ma: ArrayLike, tm: ArrayLike, kf: ArrayLike, kfs: ArrayLike,
                       sy: ArrayLike, mm: ArrayLike = 0.0, ta: ArrayLike = 0.0, fm: ArrayLike = 0.0,
                       bore_ratio: ArrayLike = 0.0, kf_axial: ArrayLike | None = None,
                       path: str = "") -> FloatArray:
    """Smallest diameter whose first-cycle yield factor Sy / sigma'_max
    reaches ``target`` [m] (the inverse of
    :func:`~loadscope.kernel.sections.shaft_yield_factor`, Shigley 9th ed.
    Eqs. 7-15, 7-16).

    Without axial force d^3 = 16 n sqrt(4 (Kf (M_a + M_m))^2
    + 3 (Kfs (T_a + T_m))^2) / (pi Sy (1 - k^4)), k = d_i / d; with it the
    root of the same equation with the d^-2 axial term (secant iteration).
    An unloaded section gives 0 (any diameter holds).

    Parameters
    ----------
    target : array_like
        Required factor [-], > 0.
    sy : array_like
        Yield strength [Pa], > 0.
    ma, tm, kf, kfs, mm, ta, fm, bore_ratio, kf_axial, path : see :func:`min_shaft_diameter`.

    Examples
    --------
    Shigley 9th ed. Example 7-1 (from memory) has n_y = 4.48 at 1.100 in:

    >>> lbf_in = 0.1129848
    >>> d = min_yield_diameter(4.48, 1260 * lbf_in, 1100 * lbf_in, 1.58, 1.39, 82 * sec.KPSI)
    >>> round(float(d) / sec.INCH, 3)
    1.1
    """
    n_t = ac.positive(target, join_path(path, "target"))
    syv = ac.positive(sy, join_path(path, "sy"), "Pa")
    loads, _ = _loads(ma, tm, kf, kfs, mm, ta, fm, bore_ratio, kf_axial, path)
    return ac.scalar_or_array(_yield_diameter(loads, n_t, syv))


def _yield_diameter(loads: _Loads, n_t: FloatArray, sy: FloatArray) -> FloatArray:
    shape = np.broadcast_shapes(n_t.shape, sy.shape, *(np.shape(v) for v in vars(loads).values()))
    one = np.ones(shape)
    unit = loads.maximum(one)                             # sigma'_max at d = 1 m
    bend = np.sqrt((loads.sa + loads.sm_b) ** 2 + 3.0 * (loads.ta + loads.tm) ** 2) * one
    closed = np.cbrt(n_t * bend / sy)
    if not np.any(loads.sm_ax):
        return closed
    unloaded = unit <= 0.0

    def log_n(x: FloatArray) -> FloatArray:
        with np.errstate(divide="ignore"):
            return np.log(sy) - np.log(loads.maximum(np.exp(x)))

    with np.errstate(divide="ignore"):
        x0 = np.where(closed > 0.0, np.log(np.where(closed > 0.0, closed, 1.0)), math.log(1e-3))
    x = _solve(lambda v: np.where(unloaded, 0.0, log_n(v)), np.where(unloaded, 0.0, np.log(n_t * one)), x0,
               *_RATING)
    return np.where(unloaded, 0.0, np.exp(x))


@dataclass(frozen=True)
class SectionMinimum:
    """Minimum diameters [m] of rated sections: ``fatigue`` for the target
    fatigue factor (Marin kb recomputed at each diameter), ``yield_`` for
    the target first-cycle yield factor, ``governing`` the larger of the
    two. 0 for an unloaded section."""

    fatigue: FloatArray
    yield_: FloatArray
    governing: FloatArray


def section_minimum_diameters(target: ArrayLike, ma: ArrayLike, tm: ArrayLike, kf: ArrayLike, kfs: ArrayLike,
                              se_without_kb: ArrayLike, sut: float, sy: float, criterion: Criterion,
                              ta: ArrayLike = 0.0, fm: ArrayLike = 0.0, bore_ratio: ArrayLike = 0.0,
                              path: str = "") -> SectionMinimum:
    """Both minimum diameters of a shaft's critical sections in one call, for
    the rating (no error for a target met at any diameter).

    The fatigue diameter solves n(d) = target with Se = kb(d) Se_0 (Shigley
    9th ed. Eq. 6-20); below 2.79 mm kb is held at its 2.79 mm value (a
    smaller kb than the true one: the safe side), above 254 mm at its
    254 mm value (outside the fit: such a result is out of the method's
    range). Diameters are sought from 1 um to 10 m; a section so lightly
    loaded that it needs less than 1 um reports 1 um (the safe side).
    Parameters as :func:`min_shaft_diameter` (``se_without_kb`` the
    endurance limit with every Marin factor but kb [Pa]) and
    :func:`min_yield_diameter`.

    Examples
    --------
    >>> m = section_minimum_diameters([1.5, 1.5], [200.0, 0.0], [300.0, 0.0], 1.7, 1.5, 250e6, 700e6, 500e6,
    ...                               "goodman")
    >>> [round(float(v) * 1e3, 2) for v in m.fatigue], [round(float(v) * 1e3, 2) for v in m.yield_]
    ([31.99, 0.0], [25.1, 0.0])
    """
    n_t = ac.positive(target, join_path(path, "target"))
    sev, sm = sec._strengths(se_without_kb, sut, sy, criterion, path)
    syv = ac.positive(sy, join_path(path, "sy"), "Pa")
    loads, _ = _loads(ma, tm, kf, kfs, 0.0, ta, fm, bore_ratio, None, path)
    log_n = _fatigue_log_n(loads, sev, sm, criterion, True)
    shape = np.broadcast_shapes(n_t.shape, *(np.shape(v) for v in vars(loads).values()))
    unloaded = np.broadcast_to(loads.maximum(np.ones(shape)) <= 0.0, shape)
    n_tb = np.broadcast_to(n_t, shape)

    def safe_log_n(x: FloatArray) -> FloatArray:
        with np.errstate(divide="ignore", invalid="ignore"):
            return np.where(unloaded, 0.0, log_n(x))

    target_log = np.where(unloaded, 0.0, np.log(n_tb))
    x = _solve(safe_log_n, target_log, _guess(safe_log_n, np.where(unloaded, 1.0, n_tb), sec.SIZE_RANGE[0]),
               *_RATING)
    fat = np.where(unloaded, 0.0, np.exp(x))
    yld = np.broadcast_to(_yield_diameter(loads, n_t, syv), shape)
    return SectionMinimum(fatigue=fat, yield_=yld, governing=np.maximum(fat, yld))

"""Rolling-bearing ratings: support loads, equivalent load, rating life.

Every function broadcasts over numpy arrays (a sweep is one call). Forces
[N], speeds [rad/s] (the sign is ignored: life does not care which way a
bearing turns), lives in millions of revolutions [10^6 rev] as ISO 281
states them and in hours [h] at a speed. Reliability is a fraction (0.9 for
the 90 % of L10).

* Support loads: the radial load Fr is the part of the reaction normal to the
  shaft axis, the axial load Fa the part along it.
* Equivalent dynamic load (ISO 281:2007, 6.1): P = X Fr + Y Fa, with
  X = 1, Y = 0 while Fa/Fr <= e (single-row bearings). For single-row
  deep-groove ball bearings X, Y and e come from ISO 281:2007 Table 3 as a
  function of the relative axial load f0 Fa / C0, interpolated linearly. The
  f0 Fa / C0 form is used (not the older Fa / C0 of ISO 281:1990) because it
  is the one the current standard tabulates and because f0 carries the
  bearing's internal geometry; the old column is the new one divided by
  f0 = 12.3 (0.172 / 0.014 = 6.89 / 0.56 = 12.3). For other bearing types X,
  Y and e are given by the user (from the bearing's catalogue).
* Paired angular-contact and tapered-roller bearings (X = face-to-face, O =
  back-to-back): the catalogue method. A radial load makes each bearing push
  the shaft axially by its induced force, Fi = 0.5 Fr / Y for tapered rollers
  (Fi = 0.47 Fr / K in Timken's form), Fi = R Fr for angular-contact ball
  bearings (R = 1.14 for a 40 deg contact angle, catalogue practice). Each
  bearing carries at least its own induced force, and the external thrust
  Ka goes to the bearing that faces it:
  Fa_B = max(Fi_B, Fi_A + Ka), Fa_A = max(Fi_A, Fi_B - Ka). These two lines
  are the whole of the catalogues' six-case table (cases 1a-1c, 2a-2c).
* Life (ISO 281:2007, 7.1 and 9.1): L10 = (C / P)^p with p = 3 for ball and
  10/3 for roller bearings; modified life Lnm = a1 a_ISO L10 with a1 from the
  reliability table (ISO 281:2007, 9.2, Table 12) and a_ISO given by the user
  (1 when not assessed).
* Static load (ISO 76:2006, cl. 5 ball, cl. 6 roller bearings): the static
  equivalent radial load P0 = X0 Fr + Y0 Fa, not less than Fr, with X0, Y0
  of ISO 76 Tables 1 and 2 (see :func:`static_load_factors`), and the static
  safety factor s0 = C0 / P0 against a required s0 (common practice: 1 for
  ball and 1.5 for roller bearings in normal operation, more under shock).
* Duty cycle: the equivalent load of the cycle is the p-mean of the case
  loads weighted by the revolutions of each case (ISO 281:2007, 6.3 gives
  the cube mean for balls; the 10/3 mean is the roller counterpart), and the
  Palmgren-Miner sum of damage gives the same life.

References
----------
.. [1] ISO 281:2007, Rolling bearings -- Dynamic load ratings and rating
   life. Clauses 6 (P, Table 3), 7 (L10), 9 (a1, Table 12).
.. [2] ISO 76:2006, Rolling bearings -- Static load ratings. Clauses 5.2
   (radial ball bearings, Table 1), 6.2 (radial roller bearings, Table 2).
.. [3] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering
   Design, 9th ed., Ch. 11 (Eq. 11-3 life-load relation; Sec. 11-9 tapered
   roller bearings, induced load 0.47 Fr / K).
.. [4] Palmgren, A., "Die Lebensdauer von Kugellagern", VDI-Z. 68 (1924);
   Miner, M. A., "Cumulative damage in fatigue", J. Appl. Mech. 12 (1945).

Results are for preliminary design; they must be checked by a qualified
engineer, and local codes, standards and licensed practice govern.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ..errors import InputError, join_path
from . import arraychecks as ac
from .bearingpairs import (  # noqa: F401  (re-exported: the pair method is part of the bearing API)
    PairAxialLoads,
    angular_contact_induced_load,
    paired_axial_loads,
    tapered_roller_induced_load,
)

FloatArray = NDArray[np.float64]
BearingKind = Literal["ball", "roller"]

LIFE_EXPONENT: dict[str, float] = {"ball": 3.0, "roller": 10.0 / 3.0}
"""ISO 281:2007, 7.1: p = 3 for ball bearings, 10/3 for roller bearings."""

# ISO 281:2007 Table 3, single-row radial-contact (deep-groove) ball bearings:
# relative axial load f0 Fa / C0, e, and Y for Fa/Fr > e (X = 0.56 there).
DEEP_GROOVE_REL = np.array([0.172, 0.345, 0.689, 1.03, 1.38, 2.07, 3.45, 5.17, 6.89])
DEEP_GROOVE_E = np.array([0.19, 0.22, 0.26, 0.28, 0.30, 0.34, 0.38, 0.42, 0.44])
DEEP_GROOVE_Y = np.array([2.30, 1.99, 1.71, 1.55, 1.45, 1.31, 1.15, 1.04, 1.00])
DEEP_GROOVE_X = 0.56

# ISO 281:2007, 9.2, Table 12: reliability [fraction] -> a1.
A1_TABLE: dict[float, float] = {
    0.90: 1.0, 0.95: 0.64, 0.96: 0.55, 0.97: 0.47, 0.98: 0.37, 0.99: 0.25, 0.992: 0.22, 0.994: 0.19,
    0.996: 0.16, 0.998: 0.12, 0.999: 0.093, 0.9992: 0.087, 0.9994: 0.080, 0.9995: 0.077,
}
RELIABILITY_RANGE = (0.90, 0.9995)

_SECONDS_PER_HOUR = 3600.0


def _p(kind: str, path: str) -> float:
    return LIFE_EXPONENT[ac.choice(kind, tuple(LIFE_EXPONENT), join_path(path, "kind"))]


def support_loads(reaction: ArrayLike, axis: ArrayLike) -> tuple[FloatArray, FloatArray]:
    """Radial and axial load of a support from its reaction vector.

    Fr = |R - (R . a) a|,  Fa = R . a (signed along the unit axis a).

    Parameters
    ----------
    reaction : array_like, shape (..., 3)
        Force [N] the support exerts on the shaft (global components).
    axis : array_like, shape (3,) or (..., 3)
        Shaft axis (any non-zero length; normalised here).

    Returns
    -------
    (radial, axial) : ndarrays
        Fr >= 0 [N] and the signed axial component [N] along the axis; the
        bearing's axial load is ``abs(axial)``.

    Examples
    --------
    >>> fr, fa = support_loads([300.0, -400.0, 0.0], [0.0, 0.0, 1.0])
    >>> float(fr), float(fa)
    (500.0, 0.0)
    """
    r = ac.finite(reaction, "reaction", "N")
    a = ac.finite(axis, "axis")
    n = np.linalg.norm(a, axis=-1, keepdims=True)
    if np.any(n < 1e-12):
        raise InputError("axis", "must be a non-zero direction", "any non-zero [x, y, z]")
    a = a / n
    fa = (r * a).sum(axis=-1)
    fr = np.linalg.norm(r - fa[..., None] * a, axis=-1)
    return ac.scalar_or_array(fr), ac.scalar_or_array(fa)


def equivalent_load(radial: ArrayLike, axial: ArrayLike, x: ArrayLike, y: ArrayLike, e: ArrayLike | None = None,
                    x_low: ArrayLike = 1.0, y_low: ArrayLike = 0.0, path: str = "") -> FloatArray:
    """Equivalent dynamic load with user-given factors (ISO 281:2007, 6.1).

    P = X Fr + Y Fa when Fa/Fr > e (or always, when ``e`` is None), else
    P = X_low Fr + Y_low Fa (1 and 0 for single-row bearings; double-row
    angular-contact bearings have Y_low > 0 in their catalogue).

    Parameters
    ----------
    radial, axial : array_like
        Fr and Fa [N]; the sign of Fa is ignored.
    x, y : array_like
        Factors for Fa/Fr > e [-], >= 0.
    e : array_like, optional
        Limit of Fa/Fr [-], >= 0.
    x_low, y_low : array_like
        Factors for Fa/Fr <= e [-].
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    A tapered roller bearing with X = 0.4, Y = 1.6, e = 0.37:

    >>> float(equivalent_load(4000.0, 2000.0, 0.4, 1.6, 0.37))
    4800.0
    >>> float(equivalent_load(4000.0, 1000.0, 0.4, 1.6, 0.37))
    4000.0
    """
    fr = ac.non_negative(radial, join_path(path, "radial"), "N")
    fa = np.abs(ac.finite(axial, join_path(path, "axial"), "N"))
    xv = ac.non_negative(x, join_path(path, "x"))
    yv = ac.non_negative(y, join_path(path, "y"))
    high = xv * fr + yv * fa
    if e is None:
        return ac.scalar_or_array(high)
    ev = ac.non_negative(e, join_path(path, "e"))
    low = ac.non_negative(x_low, join_path(path, "x_low")) * fr + ac.non_negative(y_low, join_path(path, "y_low")) * fa
    return ac.scalar_or_array(np.where(fa <= ev * fr, low, high))


def deep_groove_factors(relative_axial: ArrayLike, clamp: bool = False,
                        path: str = "") -> tuple[FloatArray, FloatArray, FloatArray]:
    """e, X and Y of a single-row deep-groove ball bearing (ISO 281:2007 Table 3).

    Linear interpolation in the relative axial load f0 Fa / C0 between the
    table's rows; X = 0.56 and Y apply when Fa/Fr > e (else X = 1, Y = 0).

    Parameters
    ----------
    relative_axial : array_like
        f0 Fa / C0 [-]. The table spans 0.172 to 6.89.
    clamp : bool
        Outside the table ISO 281 gives no values: by default that raises
        InputError. ``clamp=True`` takes the nearest row instead (what many
        catalogue calculators do; common practice, not ISO 281).
    path : str
        Field-path prefix for error messages.

    Returns
    -------
    (e, X, Y) : ndarrays [-]

    Examples
    --------
    >>> e, x, y = deep_groove_factors(1.03)
    >>> float(e), float(x), float(y)
    (0.28, 0.56, 1.55)
    >>> e, x, y = deep_groove_factors(0.8595)   # half-way between rows 0.689 and 1.03
    >>> round(float(e), 4), round(float(y), 4)
    (0.27, 1.63)
    """
    rel = ac.finite(relative_axial, join_path(path, "relative_axial"))
    if not clamp:
        rel = ac.within(rel, DEEP_GROOVE_REL[0], DEEP_GROOVE_REL[-1], join_path(path, "relative_axial"),
                        note="f0*Fa/C0 rows of ISO 281:2007 Table 3")
    e = np.interp(rel, DEEP_GROOVE_REL, DEEP_GROOVE_E)
    y = np.interp(rel, DEEP_GROOVE_REL, DEEP_GROOVE_Y)
    return ac.scalar_or_array(e), ac.scalar_or_array(np.full_like(e, DEEP_GROOVE_X)), ac.scalar_or_array(y)


def deep_groove_equivalent_load(radial: ArrayLike, axial: ArrayLike, static_rating: ArrayLike, f0: ArrayLike,
                                clamp: bool = False, path: str = "") -> FloatArray:
    """Equivalent dynamic load of a single-row deep-groove ball bearing.

    P = Fr for Fa/Fr <= e, else P = 0.56 Fr + Y Fa, with e and Y from
    ISO 281:2007 Table 3 at f0 Fa / C0 (see :func:`deep_groove_factors`).
    A bearing without axial load needs no table: P = Fr.

    Parameters
    ----------
    radial, axial : array_like
        Fr and Fa [N] (sign of Fa ignored).
    static_rating : array_like
        Basic static radial load rating C0 [N], > 0.
    f0 : array_like
        Calculation factor f0 of the bearing [-] (catalogue; ISO 76), > 0.
    clamp : bool
        See :func:`deep_groove_factors`.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    Fr = 5 kN, Fa = 1.8 kN, C0 = 19 kN, f0 = 14 (f0 Fa / C0 = 1.326):

    >>> round(float(deep_groove_equivalent_load(5000.0, 1800.0, 19e3, 14.0)), 1)
    5437.6
    """
    fr = ac.non_negative(radial, join_path(path, "radial"), "N")
    fa = np.abs(ac.finite(axial, join_path(path, "axial"), "N"))
    c0 = ac.positive(static_rating, join_path(path, "static_rating"), "N")
    f0v = ac.positive(f0, join_path(path, "f0"))
    fr, fa, c0, f0v = np.broadcast_arrays(fr, fa, c0, f0v)
    rel = f0v * fa / c0
    loaded = fa > 0.0
    # Only the elements that carry axial load consult the table.
    rel_used = np.where(loaded, rel, DEEP_GROOVE_REL[0])
    if not clamp:
        ac.within(rel_used, DEEP_GROOVE_REL[0], DEEP_GROOVE_REL[-1], join_path(path, "f0*axial/static_rating"),
                  note="ISO 281:2007 Table 3 rows; give X, Y, e yourself or clamp=True outside them")
    e, x, y = deep_groove_factors(rel_used, clamp=True)
    p = np.where(loaded & (fa > e * fr), x * fr + y * fa, fr)
    return ac.scalar_or_array(p)


def basic_rating_life(rating: ArrayLike, load: ArrayLike, kind: BearingKind = "ball", path: str = "") -> FloatArray:
    """Basic rating life L10 = (C / P)^p [10^6 rev] (ISO 281:2007, 7.1).

    Parameters
    ----------
    rating : array_like
        Basic dynamic load rating C [N], > 0.
    load : array_like
        Equivalent dynamic load P [N], >= 0. P = 0 gives inf: an unloaded
        bearing has no rating life to reach (the one deliberate inf here; a
        load so small that the life overflows a float gives inf too).
    kind : {"ball", "roller"}
        p = 3 or 10/3.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> float(basic_rating_life(30e3, 3e3))
    1000.0
    >>> round(float(basic_rating_life(30e3, 3e3, "roller")), 1)
    2154.4
    """
    p = _p(kind, path)
    c = ac.positive(rating, join_path(path, "rating"), "N")
    load_ = ac.non_negative(load, join_path(path, "load"), "N")
    with np.errstate(divide="ignore", over="ignore"):
        life = np.where(load_ > 0.0, (c / np.where(load_ > 0.0, load_, 1.0)) ** p, np.inf)
    return ac.scalar_or_array(life)


def life_hours(life: ArrayLike, speed: ArrayLike, path: str = "") -> FloatArray:
    """A life in hours at a constant speed: L_h = 10^6 L 2 pi / (|omega| 3600).

    Parameters
    ----------
    life : array_like
        Life [10^6 rev], >= 0 (inf passes through).
    speed : array_like
        Shaft speed omega [rad/s], non-zero (sign ignored).

    Examples
    --------
    1000 million revolutions at 1500 rpm:

    >>> round(float(life_hours(1000.0, 1500 * 2 * 3.141592653589793 / 60)), 3)
    11111.111
    """
    life_ = np.asarray(life, dtype=float)
    ac.non_negative(np.where(np.isposinf(life_), 0.0, life_), join_path(path, "life"), "10^6 rev")
    w = np.abs(ac.finite(speed, join_path(path, "speed"), "rad/s"))
    if np.any(w == 0.0):
        raise InputError(join_path(path, "speed"), "must not be zero: a bearing at rest has no life in hours",
                         "non-zero rad/s")
    with np.errstate(over="ignore"):
        return ac.scalar_or_array(life_ * 1e6 * 2.0 * math.pi / (w * _SECONDS_PER_HOUR))


def revolutions(hours: ArrayLike, speed: ArrayLike, path: str = "") -> FloatArray:
    """Millions of revolutions run in ``hours`` [h] at ``speed`` [rad/s]:
    L = |omega| 3600 h / (2 pi 10^6) [10^6 rev] (the inverse of
    :func:`life_hours`).

    >>> round(float(revolutions(20000.0, 100.0)), 4)
    1145.9156
    """
    h = ac.non_negative(hours, join_path(path, "hours"), "h")
    w = np.abs(ac.finite(speed, join_path(path, "speed"), "rad/s"))
    return ac.scalar_or_array(h * w * _SECONDS_PER_HOUR / (2.0 * math.pi * 1e6))


def _a1_weibull(r: FloatArray) -> FloatArray:
    return 0.95 * (np.log(1.0 / r) / math.log(1.0 / 0.9)) ** (2.0 / 3.0) + 0.05


def reliability_factor(reliability: ArrayLike, method: Literal["table", "weibull"] = "table",
                       path: str = "") -> FloatArray:
    """Life modification factor for reliability a1 (ISO 281:2007, 9.2).

    ``method="table"``: the values of ISO 281:2007 Table 12 at its
    reliabilities 0.90, 0.95, 0.96, 0.97, 0.98, 0.99, 0.992, 0.994, 0.996,
    0.998, 0.999, 0.9992, 0.9994, 0.9995 only.
    ``method="weibull"``: any reliability R in 0.90..0.9995 by the Weibull
    form behind the table (slope 1.5, life floor 0.05 L10),
    a1 = 0.95 (ln(1/R) / ln(1/0.9))^(2/3) + 0.05, which reproduces every
    tabulated value to its printed digits.

    Parameters
    ----------
    reliability : array_like
        Probability of survival R [-], 0.90..0.9995.
    method : {"table", "weibull"}
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> float(reliability_factor(0.99))
    0.25
    >>> round(float(reliability_factor(0.995, method="weibull")), 4)
    0.1747
    """
    field = join_path(path, "reliability")
    r = ac.within(reliability, *RELIABILITY_RANGE, field, note="ISO 281:2007 Table 12")
    ac.choice(method, ("table", "weibull"), join_path(path, "method"))
    if method == "weibull":
        return ac.scalar_or_array(_a1_weibull(r))
    keys = np.array(list(A1_TABLE))
    vals = np.array(list(A1_TABLE.values()))
    match = np.isclose(r[..., None], keys, rtol=0.0, atol=1e-9)
    ok = match.any(axis=-1)
    if not np.all(ok):
        v, at = ac.first_bad(r, ~ok)
        raise InputError(field, f"{v:g}{at} is not a reliability of ISO 281:2007 Table 12; use method='weibull' "
                         "between its rows", ", ".join(f"{k:g}" for k in keys))
    return ac.scalar_or_array(vals[np.argmax(match, axis=-1)])


def modified_rating_life(rating: ArrayLike, load: ArrayLike, kind: BearingKind = "ball", reliability: ArrayLike = 0.9,
                         a_iso: ArrayLike = 1.0, method: Literal["table", "weibull"] = "table",
                         path: str = "") -> FloatArray:
    """Modified rating life Lnm = a1 a_ISO (C / P)^p [10^6 rev] (ISO 281:2007, 9.1).

    Parameters
    ----------
    rating, load, kind : see :func:`basic_rating_life`.
    reliability : array_like
        R [-] for a1 (see :func:`reliability_factor`).
    a_iso : array_like
        Life modification factor for the systems approach [-] (ISO 281:2007,
        9.3; lubrication, contamination, fatigue load limit), > 0; 1 when not
        assessed. Given by the user; not computed here.
    method : {"table", "weibull"}
        How a1 is found.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> float(modified_rating_life(30e3, 3e3, reliability=0.99))
    250.0
    """
    a1 = reliability_factor(reliability, method, path)
    aiso = ac.positive(a_iso, join_path(path, "a_iso"))
    return ac.scalar_or_array(a1 * aiso * basic_rating_life(rating, load, kind, path))


def required_dynamic_rating(load: ArrayLike, target_life: ArrayLike, kind: BearingKind = "ball",
                            reliability: ArrayLike = 0.9, a_iso: ArrayLike = 1.0,
                            method: Literal["table", "weibull"] = "table", path: str = "") -> FloatArray:
    """Minimum basic dynamic load rating for a target life (inverse of
    :func:`modified_rating_life`): C = P (Lnm / (a1 a_ISO))^(1/p) [N].

    Parameters
    ----------
    load : array_like
        Equivalent dynamic load P [N], >= 0.
    target_life : array_like
        Required Lnm [10^6 rev], > 0 (from hours: :func:`revolutions`).
    kind, reliability, a_iso, method, path : see :func:`modified_rating_life`.

    Examples
    --------
    >>> round(float(required_dynamic_rating(3e3, 250.0, reliability=0.99)), 6)
    30000.0
    """
    p = _p(kind, path)
    load_ = ac.non_negative(load, join_path(path, "load"), "N")
    life = ac.positive(target_life, join_path(path, "target_life"), "10^6 rev")
    a1 = reliability_factor(reliability, method, path)
    aiso = ac.positive(a_iso, join_path(path, "a_iso"))
    return ac.scalar_or_array(load_ * (life / (a1 * aiso)) ** (1.0 / p))


# ISO 76:2006 Table 1, single-row angular-contact ball bearings: Y0 by contact angle
# 20..45 deg (X0 = 0.5), read here against the e of each angle in ISO 281:2007 Table 3
# (e 0.57, 0.68, 0.80, 0.95, 1.14, 1.34; both from memory).
ANGULAR_CONTACT_STATIC_E = np.array([0.57, 0.68, 0.80, 0.95, 1.14, 1.34])
ANGULAR_CONTACT_STATIC_Y0 = np.array([0.42, 0.38, 0.33, 0.29, 0.26, 0.22])
STATIC_FACTORS_BY_TYPE = ("deep_groove", "angular_contact", "tapered_roller")
#: Required s0 when the user gives none (common practice for normal operation:
#: ball 1, roller 1.5; raise it for shock loads or where quiet running matters).
STATIC_SAFETY_DEFAULT: dict[str, float] = {"ball": 1.0, "roller": 1.5}


def static_load_factors(bearing_type: str, e: ArrayLike = 1.14, path: str = "") -> tuple[FloatArray, FloatArray]:
    """X0 and Y0 of a single-row bearing for the static equivalent load (ISO 76:2006).

    * ``deep_groove`` (radial-contact groove ball, Table 1): X0 = 0.6, Y0 = 0.5.
    * ``angular_contact`` (Table 1): X0 = 0.5, Y0 by contact angle, 0.42 at
      20 deg to 0.22 at 45 deg (0.26 at 40 deg), found here from the
      bearing's e (ISO 281:2007 Table 3 gives e for each angle) by linear
      interpolation; e from 0.57 (20 deg) to 1.34 (45 deg).
    * ``tapered_roller`` (radial roller, alpha != 0, cl. 6.2): X0 = 0.5,
      Y0 = 0.22 cot(alpha), with cot(alpha) = 1.5 / e (ISO 281:2007, 6.2:
      e = 1.5 tan(alpha)), so Y0 = 0.33 / e; e from 0.05 to 3.

    Other types: give X0 and Y0 from the catalogue.

    Parameters
    ----------
    bearing_type : {"deep_groove", "angular_contact", "tapered_roller"}
    e : array_like
        The bearing's e [-] (ignored for deep groove).
    path : str
        Field-path prefix for error messages.

    Returns
    -------
    (X0, Y0) : ndarrays [-]

    Examples
    --------
    >>> [float(v) for v in static_load_factors("angular_contact", 1.14)]
    [0.5, 0.26]
    >>> [round(float(v), 3) for v in static_load_factors("tapered_roller", 0.37)]
    [0.5, 0.892]
    """
    ac.choice(bearing_type, STATIC_FACTORS_BY_TYPE, join_path(path, "type"))
    if bearing_type == "deep_groove":
        one = np.ones(np.shape(e))
        return ac.scalar_or_array(0.6 * one), ac.scalar_or_array(0.5 * one)
    if bearing_type == "angular_contact":
        ev = ac.within(e, ANGULAR_CONTACT_STATIC_E[0], ANGULAR_CONTACT_STATIC_E[-1], join_path(path, "e"),
                       note="20 to 45 deg contact angle, ISO 76:2006 Table 1; give y0 otherwise")
        y0 = np.interp(ev, ANGULAR_CONTACT_STATIC_E, ANGULAR_CONTACT_STATIC_Y0)
    else:
        ev = ac.within(e, 0.05, 3.0, join_path(path, "e"), note="e = 1.5 tan(alpha)")
        y0 = 0.33 / ev
    return ac.scalar_or_array(np.full_like(y0, 0.5)), ac.scalar_or_array(y0)


def static_equivalent_load(radial: ArrayLike, axial: ArrayLike, x0: ArrayLike, y0: ArrayLike,
                           path: str = "") -> FloatArray:
    """Static equivalent radial load P0 = max(X0 Fr + Y0 Fa, Fr) [N]
    (ISO 76:2006, 5.2 and 6.2; single-row radial bearings).

    Parameters
    ----------
    radial, axial : array_like
        Fr >= 0 and Fa [N] (sign of Fa ignored); the largest load the
        bearing carries at rest or turning slowly, or a peak (a jam).
    x0, y0 : array_like
        Static radial and axial factors [-]: 0 < X0 <= 1, Y0 >= 0 (see
        :func:`static_load_factors`).
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    A deep-groove ball bearing, Fr = 5 kN, Fa = 3 kN (0.6 Fr + 0.5 Fa = 4.5 kN < Fr):

    >>> float(static_equivalent_load(5000.0, 3000.0, 0.6, 0.5))
    5000.0
    >>> float(static_equivalent_load(2000.0, 4000.0, 0.6, 0.5))
    3200.0
    """
    fr = ac.non_negative(radial, join_path(path, "radial"), "N")
    fa = np.abs(ac.finite(axial, join_path(path, "axial"), "N"))
    xv = ac.within(x0, 0.0, 1.0, join_path(path, "x0"), lo_open=True)
    yv = ac.non_negative(y0, join_path(path, "y0"))
    return ac.scalar_or_array(np.maximum(xv * fr + yv * fa, fr))


def static_safety_factor(static_rating: ArrayLike, load: ArrayLike, path: str = "") -> FloatArray:
    """Static safety factor s0 = C0 / P0 [-] (ISO 76:2006, the basic static
    rating against the static equivalent load). An unloaded bearing gives inf.

    Parameters
    ----------
    static_rating : array_like
        Basic static load rating C0 [N], > 0.
    load : array_like
        P0 [N], >= 0.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> float(static_safety_factor(60e3, 24e3))
    2.5
    """
    c0 = ac.positive(static_rating, join_path(path, "C0"), "N")
    p0 = ac.non_negative(load, join_path(path, "load"), "N")
    with np.errstate(divide="ignore"):
        return ac.scalar_or_array(np.where(p0 > 0.0, c0 / np.where(p0 > 0.0, p0, 1.0), np.inf))


def required_static_rating(load: ArrayLike, s0: ArrayLike, path: str = "") -> FloatArray:
    """The basic static rating that just reaches the required s0: C0 = s0 P0 [N]
    (the inverse of :func:`static_safety_factor`).

    Parameters
    ----------
    load : array_like
        P0 [N], >= 0.
    s0 : array_like
        Required static safety factor [-], 0 < s0 <= 10.

    Examples
    --------
    >>> float(required_static_rating(24e3, 1.5))
    36000.0
    """
    p0 = ac.non_negative(load, join_path(path, "load"), "N")
    return ac.scalar_or_array(p0 * ac.within(s0, 0.0, 10.0, join_path(path, "s0"), lo_open=True))


def _cycle(loads: ArrayLike, speeds: ArrayLike, shares: ArrayLike,
           path: str) -> tuple[FloatArray, FloatArray, FloatArray]:
    """Case loads, revolution weights u_i = q_i |n_i| / sum q |n| (cases on
    the last axis) and the cycle's mean speed sum q |n| [rad/s]."""
    p_ = ac.non_negative(loads, join_path(path, "loads"), "N")
    w = np.abs(ac.finite(speeds, join_path(path, "speeds"), "rad/s"))
    q = ac.within(shares, 0.0, 1.0, join_path(path, "shares"), note="shares of time of each case")
    p_, w, q = np.broadcast_arrays(np.atleast_1d(p_), np.atleast_1d(w), np.atleast_1d(q))
    total = q.sum(axis=-1)
    if np.any(np.abs(total - 1.0) > 1e-6):
        v, at = ac.first_bad(total, np.abs(total - 1.0) > 1e-6)
        raise InputError(join_path(path, "shares"), f"must add up to 1, got {v:.6g}{at}", "sum of shares = 1")
    rev = q * w
    rev_total = rev.sum(axis=-1, keepdims=True)
    if np.any(rev_total == 0.0):
        raise InputError(join_path(path, "speeds"), "no case turns the bearing: the cycle has no revolutions",
                         "at least one case with non-zero speed and share")
    return p_, rev / rev_total, rev_total[..., 0]


def duty_cycle_equivalent_load(loads: ArrayLike, speeds: ArrayLike, shares: ArrayLike, kind: BearingKind = "ball",
                               path: str = "") -> FloatArray:
    """Equivalent load of a duty cycle: the p-mean of the case loads weighted
    by revolutions, P = (sum u_i P_i^p)^(1/p), u_i = q_i |n_i| / sum q |n|
    (ISO 281:2007, 6.3, for p = 3; p = 10/3 for rollers).

    Parameters
    ----------
    loads : array_like, shape (..., cases)
        Equivalent load P_i of each case [N], >= 0.
    speeds : array_like, shape (..., cases)
        Speed of each case [rad/s] (sign ignored).
    shares : array_like, shape (..., cases)
        Share of time q_i of each case [-], 0..1, adding up to 1.
    kind : {"ball", "roller"}
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    Two cases of equal time, the second at twice the speed:

    >>> round(float(duty_cycle_equivalent_load([3000.0, 1500.0], [100.0, 200.0], [0.5, 0.5])), 2)
    2240.7
    """
    p = _p(kind, path)
    p_, u, _ = _cycle(loads, speeds, shares, path)
    return ac.scalar_or_array(((u * p_**p).sum(axis=-1)) ** (1.0 / p))


@dataclass(frozen=True)
class DutyCycleLife:
    """Life over a duty cycle: ``life`` [10^6 rev] and ``hours`` [h] by the
    Palmgren-Miner sum, ``equivalent_load`` [N] of the cycle, and
    ``damage_share`` [-] of each case (last axis; adds up to 1 where the
    cycle does damage)."""

    life: FloatArray
    hours: FloatArray
    equivalent_load: FloatArray
    damage_share: FloatArray


def duty_cycle_life(rating: ArrayLike, loads: ArrayLike, speeds: ArrayLike, shares: ArrayLike,
                    kind: BearingKind = "ball", reliability: ArrayLike = 0.9, a_iso: ArrayLike = 1.0,
                    method: Literal["table", "weibull"] = "table", path: str = "") -> DutyCycleLife:
    """Rating life over a duty cycle by Palmgren-Miner.

    Each case i runs a share u_i of the revolutions at the life L_i of its own
    load; the cycle's life is 1 / L = sum u_i / L_i [10^6 rev], and its hours
    follow from the cycle's mean speed sum q_i |n_i|. Because L_i is a power
    of P_i this equals the life at :func:`duty_cycle_equivalent_load`, and
    with one case it is the single-case :func:`modified_rating_life`.

    Parameters
    ----------
    rating : array_like
        C [N], > 0 (broadcast against the leading axes of the cases).
    loads, speeds, shares : array_like, shape (..., cases)
        See :func:`duty_cycle_equivalent_load`.
    kind, reliability, a_iso, method, path : see :func:`modified_rating_life`.

    Examples
    --------
    >>> r = duty_cycle_life(30e3, [3000.0, 1500.0], [100.0, 200.0], [0.5, 0.5])
    >>> round(float(r.life), 1), round(float(r.hours), 1)
    (2400.0, 27925.3)
    >>> [round(float(s), 4) for s in r.damage_share]
    [0.8, 0.2]
    """
    p = _p(kind, path)
    c = ac.positive(rating, join_path(path, "rating"), "N")
    p_, u, mean_speed = _cycle(loads, speeds, shares, path)
    a1 = reliability_factor(reliability, method, path)
    aiso = ac.positive(a_iso, join_path(path, "a_iso"))
    c_case = np.asarray(c)[..., None]
    damage = u * (p_ / c_case) ** p                  # per 10^6 rev, before a1 a_ISO
    total = damage.sum(axis=-1)
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        life = np.where(total > 0.0, np.asarray(a1 * aiso) / np.where(total > 0.0, total, 1.0), np.inf)
        share = np.where(total[..., None] > 0.0, damage / np.where(total > 0.0, total, 1.0)[..., None], 0.0)
    with np.errstate(over="ignore"):
        hours = life * 1e6 * 2.0 * math.pi / (mean_speed * _SECONDS_PER_HOUR)
    p_eq = ((u * p_**p).sum(axis=-1)) ** (1.0 / p)
    return DutyCycleLife(life=ac.scalar_or_array(np.asarray(life)), hours=ac.scalar_or_array(np.asarray(hours)),
                         equivalent_load=ac.scalar_or_array(np.asarray(p_eq)), damage_share=share)

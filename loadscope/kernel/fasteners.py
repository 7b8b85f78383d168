"""Mounting bolts: thread areas, property classes, stresses and safety factors.

SI units: diameters and pitches [m], areas [m^2], forces [N], stresses and
strengths [Pa]. The inch tables are kept in inches and pounds, as published,
and converted where they are read.

* Tensile stress area (ISO 898-1:2013, 9.1.6.1):
  As = (pi/4) ((d2 + d3)/2)^2 = (pi/4) (d - 0.938194 P)^2 for ISO metric
  threads, with d2 = d - 0.649519 P and d3 = d - 1.226869 P (ISO 724); for
  Unified inch threads (ASME B1.1) As = 0.7854 (d - 0.9743 / n)^2, n threads
  per inch (here with the pitch P = 1/n: (pi/4) (d - 0.9743 P)^2).
* Minor-diameter area Ar = (pi/4) d_r^2 with d_r = d3 = d - 1.226869 P
  (metric) or the basic minor diameter d - 1.299038 P (Unified), as Shigley
  9th ed. Tables 8-1 and 8-2 list them.
* Shear: tau = V / A with A the shank area (pi/4) d^2 when the shear plane
  crosses the plain shank, the minor-diameter area (or, by choice, As) when
  it crosses the thread (Shigley 9th ed. Sec. 8-12).
* Tension of a preloaded bolt (Shigley 9th ed. Eqs. 8-24, 8-28):
  F_b = F_i + C P while the joint stays closed, P once it separates, with
  the joint constant C = k_b / (k_b + k_m) (1 takes all of P into the bolt).
* Combined check, two rules:

  - von Mises: sigma_vM = sqrt(sigma^2 + 3 tau^2) with sigma = F_b / As,
    factors against the proof, yield and tensile strengths (the elliptical
    interaction (sigma/S)^2 + (tau/(S/sqrt 3))^2 <= 1 is the same rule).
  - EN 1993-1-8:2005 Table 3.4 (linear interaction for bolts in shear and
    tension): F_v / F_v,Rd + F_t / (1.4 F_t,Rd) <= 1 with
    F_v,Rd = alpha_v f_ub A / gamma_M2, F_t,Rd = 0.9 f_ub A_s / gamma_M2
    (from memory; it covers classes 4.6 to 10.9 only).

References
----------
.. [1] ISO 898-1:2013, Mechanical properties of fasteners made of carbon
   steel and alloy steel -- Part 1: Bolts, screws and studs. Table 3
   (property classes), 9.1.6.1 (stress area).
.. [2] ISO 261:1998, ISO general purpose metric screw threads -- General
   plan; ISO 262:1998 (selected sizes); ISO 724:1993 (basic dimensions).
.. [3] ASME B1.1-2003, Unified Inch Screw Threads. SAE J429, Mechanical
   and Material Requirements for Externally Threaded Fasteners.
.. [4] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering
   Design, 9th ed., Tables 8-1, 8-2, 8-9, 8-11; Eqs. 8-24, 8-28; Sec. 8-12.
.. [5] EN 1993-1-8:2005, Eurocode 3: Design of steel structures -- Part 1-8:
   Design of joints, Tables 3.1 and 3.4.

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

FloatArray = NDArray[np.float64]
ThreadForm = Literal["metric", "unified"]
ShearPlane = Literal["thread", "shank"]
ThreadArea = Literal["minor", "stress"]

MM = 1e-3
INCH = 0.0254
MPA = 1e6
KPSI = 6.894757293168361e6

# ISO 261 / ISO 262 coarse pitches [mm] of the selected sizes M5 to M36.
METRIC_COARSE_PITCH: dict[float, float] = {
    5: 0.8, 6: 1.0, 8: 1.25, 10: 1.5, 12: 1.75, 14: 2.0, 16: 2.0, 18: 2.5, 20: 2.5, 22: 2.5, 24: 3.0,
    27: 3.0, 30: 3.5, 33: 3.5, 36: 4.0,
}
# ASME B1.1 UNC threads per inch, nominal size [in] -> n.
UNC_THREADS_PER_INCH: dict[float, int] = {
    0.25: 20, 0.3125: 18, 0.375: 16, 0.4375: 14, 0.5: 13, 0.5625: 12, 0.625: 11, 0.75: 10, 0.875: 9,
    1.0: 8, 1.125: 7, 1.25: 7, 1.375: 6, 1.5: 6,
}
# Coefficient of P in the mean of the pitch and minor diameters, and in the minor diameter.
_STRESS_COEFF = {"metric": 0.938194, "unified": 0.9743}
_MINOR_COEFF = {"metric": 1.226869, "unified": 1.299038}

# ISO 898-1:2013 Table 3: class -> rows (largest d [mm], proof stress Sp, Rm min,
# lower yield ReL / Rp0.2 / Rpf min) [MPa]. The standard covers d = 1.6 to 39 mm.
ISO_898_1: dict[str, tuple[tuple[float, float, float, float], ...]] = {
    "4.6": ((39.0, 225.0, 400.0, 240.0),),
    "4.8": ((39.0, 310.0, 420.0, 340.0),),
    "5.6": ((39.0, 280.0, 500.0, 300.0),),
    "5.8": ((39.0, 380.0, 520.0, 420.0),),
    "6.8": ((39.0, 440.0, 600.0, 480.0),),
    "8.8": ((16.0, 580.0, 800.0, 640.0), (39.0, 600.0, 830.0, 660.0)),
    "9.8": ((16.0, 650.0, 900.0, 720.0),),
    "10.9": ((39.0, 830.0, 1040.0, 940.0),),
    "12.9": ((39.0, 970.0, 1220.0, 1100.0),),
}
ISO_898_1_SIZES = (1.6, 39.0)   # [mm]
# SAE J429: grade -> rows (largest d [in], proof, tensile min, yield min) [kpsi];
# the standard covers 1/4 to 1 1/2 in.
SAE_J429: dict[str, tuple[tuple[float, float, float, float], ...]] = {
    "2": ((0.75, 55.0, 74.0, 57.0), (1.5, 33.0, 60.0, 36.0)),
    "5": ((1.0, 85.0, 120.0, 92.0), (1.5, 74.0, 105.0, 81.0)),
    "8": ((1.5, 120.0, 150.0, 130.0),),
}
SAE_J429_SIZES = (0.25, 1.5)    # [in]
# EN 1993-1-8 Table 3.4 alpha_v with the thread in the shear plane (from memory).
EN1993_ALPHA_V_THREAD = {"4.6": 0.6, "5.6": 0.6, "8.8": 0.6, "4.8": 0.5, "5.8": 0.5, "6.8": 0.5, "10.9": 0.5}


def _lookup(value: float, table: dict, tol: float) -> float | None:
    for k in table:
        if abs(value - k) <= tol:
            return k
    return None


def metric_coarse_pitch(diameter: float, path: str = "") -> float:
    """Coarse pitch [m] of an ISO metric thread M5 to M36 (ISO 261, ISO 262 selected sizes).

    Parameters
    ----------
    diameter : float
        Nominal diameter d [m].
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(metric_coarse_pitch(0.012) * 1e3, 4)
    1.75
    """
    d = float(ac.positive(diameter, join_path(path, "diameter"), "m")) / MM
    k = _lookup(d, METRIC_COARSE_PITCH, 1e-6)
    if k is None:
        raise InputError(join_path(path, "diameter"), f"M{d:g} is not a tabulated coarse-thread size",
                         "M" + ", M".join(f"{s:g}" for s in METRIC_COARSE_PITCH) + " (ISO 262)")
    return METRIC_COARSE_PITCH[k] * MM


def unc_pitch(diameter: float, path: str = "") -> float:
    """Pitch 1/n [m] of a UNC thread, 1/4 to 1 1/2 in (ASME B1.1).

    >>> round(1 / (unc_pitch(0.5 * INCH) / INCH), 6)
    13.0
    """
    d = float(ac.positive(diameter, join_path(path, "diameter"), "m")) / INCH
    k = _lookup(d, UNC_THREADS_PER_INCH, 1e-6)
    if k is None:
        raise InputError(join_path(path, "diameter"), f"{d:g} in is not a tabulated UNC size",
                         ", ".join(f"{s:g}" for s in UNC_THREADS_PER_INCH) + " in (ASME B1.1)")
    return INCH / UNC_THREADS_PER_INCH[k]


def _thread(diameter: ArrayLike, pitch: ArrayLike, form: str, path: str) -> tuple[FloatArray, FloatArray]:
    ac.choice(form, tuple(_STRESS_COEFF), join_path(path, "form"))
    d = ac.positive(diameter, join_path(path, "diameter"), "m")
    p = ac.positive(pitch, join_path(path, "pitch"), "m")
    d, p = np.broadcast_arrays(d, p)
    limit = d / _MINOR_COEFF[form]
    if np.any(p >= limit):
        v, at = ac.first_bad(p, p >= limit)
        raise InputError(join_path(path, "pitch"), f"{v:.6g} m{at} leaves no thread core",
                         f"< diameter / {_MINOR_COEFF[form]:g}")
    return d, p


def tensile_stress_area(diameter: ArrayLike, pitch: ArrayLike, form: ThreadForm = "metric",
                        path: str = "") -> FloatArray:
    """Tensile stress area As [m^2] of a thread (ISO 898-1 9.1.6.1; ASME B1.1).

    As = (pi/4) (d - c P)^2 with c = 0.938194 (metric: the mean of d2 and d3)
    or c = 0.9743 (Unified: the mean of the pitch and basic minor diameters).

    Parameters
    ----------
    diameter : array_like
        Nominal (major) diameter d [m], > 0.
    pitch : array_like
        Pitch P [m] (1/n for inch threads), 0 < P < d / 1.23.
    form : {"metric", "unified"}
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(tensile_stress_area(0.012, 1.75e-3)) * 1e6, 1)
    84.3
    >>> round(float(tensile_stress_area(0.5 * INCH, INCH / 13, "unified")) / INCH**2, 4)
    0.1419
    """
    d, p = _thread(diameter, pitch, form, path)
    return ac.scalar_or_array(math.pi / 4.0 * (d - _STRESS_COEFF[form] * p) ** 2)


def minor_diameter_area(diameter: ArrayLike, pitch: ArrayLike, form: ThreadForm = "metric",
                        path: str = "") -> FloatArray:
    """Minor-diameter (root) area Ar = (pi/4) d_r^2 [m^2], d_r = d - 1.226869 P
    (metric d3, ISO 724) or d - 1.299038 P (Unified basic minor diameter).

    >>> round(float(minor_diameter_area(0.012, 1.75e-3)) * 1e6, 1)
    76.2
    """
    d, p = _thread(diameter, pitch, form, path)
    return ac.scalar_or_array(math.pi / 4.0 * (d - _MINOR_COEFF[form] * p) ** 2)


@dataclass(frozen=True)
class BoltStrength:
    """Minimum strengths [Pa] of a bolt material: ``proof`` (proof stress Sp),
    ``tensile`` (Rm, Sut), ``yield_`` (ReL, Rp0.2 or Rpf; Sy); ``source``
    names the standard and the row."""

    name: str
    proof: float
    tensile: float
    yield_: float
    source: str


def iso_property_class(name: str, diameter: float, path: str = "") -> BoltStrength:
    """Strengths of an ISO 898-1 property class at a nominal diameter.

    Classes 4.6, 4.8, 5.6, 5.8, 6.8, 8.8 (two rows: d <= 16 mm and
    d > 16 mm), 9.8 (d <= 16 mm only), 10.9, 12.9; d from 1.6 to 39 mm.

    Parameters
    ----------
    name : str
        Property class, e.g. "8.8".
    diameter : float
        Nominal diameter d [m].
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> s = iso_property_class("8.8", 0.020)
    >>> s.proof / 1e6, s.tensile / 1e6, s.yield_ / 1e6
    (600.0, 830.0, 660.0)
    """
    ac.choice(name, tuple(ISO_898_1), join_path(path, "property_class"))
    d = float(ac.within(diameter, ISO_898_1_SIZES[0] * MM, ISO_898_1_SIZES[1] * MM, join_path(path, "diameter"), "m",
                        note="ISO 898-1:2013 scope, M1.6 to M39"))
    for d_max, sp, rm, rel in ISO_898_1[name]:
        if d <= d_max * MM * (1 + 1e-9):
            return BoltStrength(name, sp * MPA, rm * MPA, rel * MPA, f"ISO 898-1:2013 Table 3, class {name}, "
                                f"d <= {d_max:g} mm")
    top = ISO_898_1[name][-1][0]
    raise InputError(join_path(path, "diameter"), f"class {name} is defined only up to M{top:g}, got "
                     f"{d / MM:g} mm", f"<= {top:g} mm")


def sae_grade(grade: str, diameter: float, path: str = "") -> BoltStrength:
    """Strengths of an SAE J429 grade (2, 5, 8) at a nominal diameter, 1/4 to 1 1/2 in.

    Examples
    --------
    >>> s = sae_grade("5", 0.5 * INCH)
    >>> round(s.proof / KPSI), round(s.tensile / KPSI), round(s.yield_ / KPSI)
    (85, 120, 92)
    """
    ac.choice(grade, tuple(SAE_J429), join_path(path, "grade"))
    d = float(ac.within(diameter, SAE_J429_SIZES[0] * INCH, SAE_J429_SIZES[1] * INCH, join_path(path, "diameter"),
                        "m", note="SAE J429 scope, 1/4 to 1 1/2 in")) / INCH
    for d_max, sp, sut, sy in SAE_J429[grade]:
        if d <= d_max * (1 + 1e-9):
            return BoltStrength(f"SAE grade {grade}", sp * KPSI, sut * KPSI, sy * KPSI,
                                f"SAE J429 grade {grade}, d <= {d_max:g} in")
    raise AssertionError("unreachable: the size range was checked")


def _shear_area(diameter: ArrayLike, pitch: ArrayLike, plane: str, thread_area: str, form: ThreadForm,
                path: str) -> FloatArray:
    ac.choice(plane, ("thread", "shank"), join_path(path, "plane"))
    ac.choice(thread_area, ("minor", "stress"), join_path(path, "thread_area"))
    d, p = _thread(diameter, pitch, form, path)
    if plane == "shank":
        return math.pi / 4.0 * d**2
    if thread_area == "minor":
        return np.asarray(minor_diameter_area(d, p, form, path))
    return np.asarray(tensile_stress_area(d, p, form, path))


def bolt_shear_stress(shear: ArrayLike, diameter: ArrayLike, pitch: ArrayLike, plane: ShearPlane = "thread",
                      thread_area: ThreadArea = "minor", form: ThreadForm = "metric", path: str = "") -> FloatArray:
    """Average shear stress tau = V / A of a bolt in one shear plane [Pa].

    A is the shank area (pi/4) d^2 for ``plane="shank"``; for
    ``plane="thread"`` the minor-diameter area (Shigley's choice, on the
    safe side) or, with ``thread_area="stress"``, the tensile stress area
    (as EN 1993-1-8 takes it).

    Parameters
    ----------
    shear : array_like
        Shear force V [N] (magnitude is used).
    diameter, pitch, form : see :func:`tensile_stress_area`.
    plane : {"thread", "shank"}
    thread_area : {"minor", "stress"}
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(bolt_shear_stress(5000.0, 0.012, 1.75e-3)) / 1e6, 2)
    65.58
    >>> round(float(bolt_shear_stress(5000.0, 0.012, 1.75e-3, plane="shank")) / 1e6, 2)
    44.21
    """
    v = np.abs(ac.finite(shear, join_path(path, "shear"), "N"))
    return ac.scalar_or_array(v / _shear_area(diameter, pitch, plane, thread_area, form, path))


def bolt_tension(external: ArrayLike, preload: ArrayLike = 0.0, stiffness_fraction: ArrayLike = 1.0,
                 path: str = "") -> FloatArray:
    """Bolt tension under an external load on a preloaded joint (Shigley 9th ed. Eq. 8-24) [N].

    F_b = F_i + C P while the joint stays closed; once (1 - C) P exceeds the
    preload the joint separates and the bolt takes P alone:
    F_b = max(F_i + C P, P, 0) (a compressive P is carried by the faces).

    Parameters
    ----------
    external : array_like
        External load on the bolt P [N] (tension > 0), e.g. the ``tension``
        of :func:`loadscope.kernel.bolts.bolt_loads`.
    preload : array_like
        F_i [N], >= 0.
    stiffness_fraction : array_like
        Joint constant C = k_b / (k_b + k_m) [-], 0..1; the default 1 sends
        all of P into the bolt.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> float(bolt_tension(4000.0, preload=20e3, stiffness_fraction=0.25))
    21000.0
    >>> float(bolt_tension(40e3, preload=20e3, stiffness_fraction=0.25))
    40000.0
    """
    p = ac.finite(external, join_path(path, "external"), "N")
    fi = ac.non_negative(preload, join_path(path, "preload"), "N")
    c = ac.within(stiffness_fraction, 0.0, 1.0, join_path(path, "stiffness_fraction"),
                  note="joint constant C = kb / (kb + km)")
    return ac.scalar_or_array(np.maximum(np.maximum(fi + c * p, p), 0.0))


@dataclass(frozen=True)
class BoltCheck:
    """Stresses [Pa] and safety factors [-] of a bolt under tension and shear
    (von Mises rule): ``tensile_stress`` F_b / As, ``shear_stress``,
    ``von_mises``, and the factors against the proof, yield and tensile
    strengths (inf for an unloaded bolt)."""

    tensile_stress: FloatArray
    shear_stress: FloatArray
    von_mises: FloatArray
    proof_factor: FloatArray
    yield_factor: FloatArray
    tensile_factor: FloatArray


def bolt_check(tension: ArrayLike, shear: ArrayLike, diameter: ArrayLike, pitch: ArrayLike, strength: BoltStrength,
               plane: ShearPlane = "thread", thread_area: ThreadArea = "minor", form: ThreadForm = "metric",
               path: str = "") -> BoltCheck:
    """Combined tension and shear of a bolt by the von Mises rule.

    sigma = max(F_b, 0) / As, tau = V / A (see :func:`bolt_shear_stress`),
    sigma_vM = sqrt(sigma^2 + 3 tau^2), n = S / sigma_vM for S = Sp, Sy, Rm.

    Parameters
    ----------
    tension : array_like
        Bolt tension F_b [N] including preload (see :func:`bolt_tension`).
    shear : array_like
        Shear force [N].
    diameter, pitch, form : see :func:`tensile_stress_area`.
    strength : BoltStrength
        From :func:`iso_property_class` or :func:`sae_grade`.
    plane, thread_area : see :func:`bolt_shear_stress`.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    M12 class 8.8 with 30 kN of tension and 5 kN of shear in the thread:

    >>> c = bolt_check(30e3, 5e3, 0.012, 1.75e-3, iso_property_class("8.8", 0.012))
    >>> round(float(c.von_mises) / 1e6, 1), round(float(c.proof_factor), 3)
    (373.7, 1.552)
    """
    f = ac.finite(tension, join_path(path, "tension"), "N")
    a_s = np.asarray(tensile_stress_area(diameter, pitch, form, path))
    sigma = np.maximum(f, 0.0) / a_s
    tau = np.asarray(bolt_shear_stress(shear, diameter, pitch, plane, thread_area, form, path))
    vm = np.sqrt(sigma**2 + 3.0 * tau**2)

    def factor(s: float) -> FloatArray:
        with np.errstate(divide="ignore"):
            return ac.scalar_or_array(np.where(vm > 0.0, s / np.where(vm > 0.0, vm, 1.0), np.inf))

    return BoltCheck(tensile_stress=ac.scalar_or_array(sigma), shear_stress=ac.scalar_or_array(tau),
                     von_mises=ac.scalar_or_array(vm), proof_factor=factor(strength.proof),
                     yield_factor=factor(strength.yield_), tensile_factor=factor(strength.tensile))


def proof_load_factor(strength: BoltStrength, stress_area: ArrayLike, external: ArrayLike, preload: ArrayLike = 0.0,
                      stiffness_fraction: ArrayLike = 1.0, path: str = "") -> FloatArray:
    """Load factor against the proof load, n_L = (Sp As - F_i) / (C P) (Shigley 9th ed. Eq. 8-28) [-].

    The factor by which the external load P may grow before the bolt reaches
    its proof load; inf for P <= 0.

    Examples
    --------
    >>> round(float(proof_load_factor(iso_property_class("8.8", 0.012), 84.3e-6, 8e3, 30e3, 0.25)), 3)
    9.447
    """
    a_s = ac.positive(stress_area, join_path(path, "stress_area"), "m^2")
    p = ac.finite(external, join_path(path, "external"), "N")
    fi = ac.non_negative(preload, join_path(path, "preload"), "N")
    c = ac.within(stiffness_fraction, 0.0, 1.0, join_path(path, "stiffness_fraction"), lo_open=True)
    margin = strength.proof * a_s - fi
    if np.any(margin <= 0.0):
        fi_b, m_b = np.broadcast_arrays(fi, margin)
        v, at = ac.first_bad(fi_b, m_b <= 0.0)
        raise InputError(join_path(path, "preload"), f"{v:.6g} N{at} reaches the proof load already",
                         f"< Sp As = {float(np.min(strength.proof * a_s)):.6g} N")
    with np.errstate(divide="ignore"):
        n = np.where(p > 0.0, margin / (c * np.where(p > 0.0, p, 1.0)), np.inf)
    return ac.scalar_or_array(n)


@dataclass(frozen=True)
class En1993Utilisation:
    """Utilisations [-] by EN 1993-1-8 Table 3.4: ``shear`` F_v / F_v,Rd,
    ``tension`` F_t / F_t,Rd and ``combined`` F_v / F_v,Rd + F_t / (1.4 F_t,Rd);
    each must be <= 1. ``shear_resistance`` and ``tension_resistance`` [N]."""

    shear: FloatArray
    tension: FloatArray
    combined: FloatArray
    shear_resistance: FloatArray
    tension_resistance: FloatArray


def en1993_bolt_utilisation(tension: ArrayLike, shear: ArrayLike, diameter: ArrayLike, pitch: ArrayLike,
                            property_class: str, plane: ShearPlane = "thread", gamma_m2: float = 1.25,
                            path: str = "") -> En1993Utilisation:
    """Bolt in shear and tension by EN 1993-1-8:2005 Table 3.4 (from memory).

    F_v,Rd = alpha_v f_ub A / gamma_M2 with A = As and alpha_v = 0.6 (4.6,
    5.6, 8.8) or 0.5 (4.8, 5.8, 6.8, 10.9) for the thread in the shear plane,
    A = (pi/4) d^2 and alpha_v = 0.6 for the shank; F_t,Rd = 0.9 f_ub As /
    gamma_M2; f_ub the nominal ultimate strength of the class (Table 3.1:
    100 times its first number, in MPa).

    Parameters
    ----------
    tension, shear : array_like
        Design forces F_t, F_v [N] per bolt and shear plane.
    diameter, pitch : array_like
        Metric thread d, P [m].
    property_class : str
        One of 4.6, 4.8, 5.6, 5.8, 6.8, 8.8, 10.9.
    plane : {"thread", "shank"}
    gamma_m2 : float
        Partial factor [-], > 0 (1.25 recommended by EN 1993-1-8).
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> u = en1993_bolt_utilisation(20e3, 15e3, 0.012, 1.75e-3, "8.8")
    >>> round(float(u.shear), 3), round(float(u.tension), 3), round(float(u.combined), 3)
    (0.464, 0.412, 0.758)
    """
    ac.choice(property_class, tuple(EN1993_ALPHA_V_THREAD), join_path(path, "property_class"))
    g = float(ac.positive(gamma_m2, join_path(path, "gamma_m2")))
    fub = float(property_class.split(".")[0]) * 100.0 * MPA
    alpha_v = EN1993_ALPHA_V_THREAD[property_class] if plane == "thread" else 0.6
    a_shear = _shear_area(diameter, pitch, plane, "stress", "metric", path)
    a_s = np.asarray(tensile_stress_area(diameter, pitch, "metric", path))
    fv_rd = alpha_v * fub * a_shear / g
    ft_rd = 0.9 * fub * a_s / g
    uv = np.abs(ac.finite(shear, join_path(path, "shear"), "N")) / fv_rd
    ut = np.maximum(ac.finite(tension, join_path(path, "tension"), "N"), 0.0) / ft_rd
    return En1993Utilisation(shear=ac.scalar_or_array(uv), tension=ac.scalar_or_array(ut),
                             combined=ac.scalar_or_array(uv + ut / 1.4), shear_resistance=ac.scalar_or_array(fv_rd),
                             tension_resistance=ac.scalar_or_array(ft_rd))

"""Shaft sections: nominal stresses, notch factors, endurance limit, safety factors.

Every function broadcasts over numpy arrays. SI units: lengths [m], moments
and torques [N*m], forces [N], stresses and strengths [Pa], temperatures
[K]. The fits of the textbook below are stated in kpsi and inches; they are
converted here, at the formula, and their ranges are checked in SI.

* Nominal stresses of a round section of diameter d and bore d_i (0 for a
  solid section): sigma_b = 32 M d / (pi (d^4 - d_i^4)),
  tau = 16 T d / (pi (d^4 - d_i^4)), sigma_ax = 4 F / (pi (d^2 - d_i^2)).
* Fatigue stress-concentration factor Kf = 1 + q (Kt - 1) (Shigley Eq. 6-32)
  with Kt, Kts given by the user (from a chart or finite elements) and the
  notch sensitivity q either given, or from Neuber's equation
  q = 1 / (1 + sqrt(a / r)) (Eq. 6-33/6-34) with Neuber's constant sqrt(a)
  (Eq. 6-35 fits for steels), or from Peterson's q = 1 / (1 + a / r) with a
  user-given Peterson constant a (Pilkey, Peterson's Stress Concentration
  Factors, 3rd ed., Eq. 1.49; from memory).
* Endurance limit Se = ka kb kc kd ke kf Se' with the Marin factors (Eqs.
  6-18 to 6-29; Table 6-2 surface, Table 6-5 reliability).
* A rotating shaft: bending fully reversed (M_a), torque steady (T_m), with
  optional steady bending M_m, alternating torque T_a and steady axial force
  F_m. Distortion-energy (von Mises) alternating and midrange stresses
  sigma_a' = sqrt((Kf sigma_a)^2 + 3 (Kfs tau_a)^2), and likewise sigma_m',
  enter one of four criteria (Eqs. 7-7 to 7-14, in stress form 6-45 to
  6-48):

  - DE-Goodman:       1/n = sigma_a'/Se + sigma_m'/Sut
  - DE-Gerber:        n sigma_a'/Se + (n sigma_m'/Sut)^2 = 1
  - DE-ASME elliptic: (n sigma_a'/Se)^2 + (n sigma_m'/Sy)^2 = 1
  - DE-Soderberg:     1/n = sigma_a'/Se + sigma_m'/Sy

  First-cycle yield: n_y = Sy / sigma'_max with
  sigma'_max = sqrt((sigma_a + sigma_m)^2 + 3 (tau_a + tau_m)^2), Kf applied
  (Eq. 7-15/7-16).

References
----------
.. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering
   Design, 9th ed., McGraw-Hill, 2011: Sec. 6-9 (Marin factors, Eqs. 6-18
   to 6-29, Tables 6-2, 6-4, 6-5), Sec. 6-10 (Eqs. 6-32 to 6-35), Sec. 6-12
   (Eqs. 6-45 to 6-48), Sec. 7-4 (Eqs. 7-7 to 7-16).
.. [2] Pilkey, W. D., Pilkey, D. F., Peterson's Stress Concentration
   Factors, 3rd ed., Wiley, 2008, Sec. 1.9 (notch sensitivity).

Values recalled from memory rather than checked against a copy of the book
are marked so beside them. Results are for preliminary design; they must be
checked by a qualified engineer, and local codes, standards and licensed
practice govern.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from statistics import NormalDist
from typing import Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ..errors import InputError, join_path
from . import arraychecks as ac

FloatArray = NDArray[np.float64]
Criterion = Literal["goodman", "gerber", "asme_elliptic", "soderberg"]
Finish = Literal["ground", "machined", "cold_drawn", "hot_rolled", "as_forged"]
Loading = Literal["bending", "axial", "torsion"]

CRITERIA: tuple[str, ...] = ("goodman", "gerber", "asme_elliptic", "soderberg")
KPSI = 6.894757293168361e6      # [Pa]
INCH = 0.0254                   # [m]
MPA = 1e6                       # [Pa]

# Shigley 9th ed. Table 6-2: ka = a Sut^b with Sut in MPa.
SURFACE_FACTORS: dict[str, tuple[float, float]] = {
    "ground": (1.58, -0.085),
    "machined": (4.51, -0.265),
    "cold_drawn": (4.51, -0.265),
    "hot_rolled": (57.7, -0.718),
    "as_forged": (272.0, -0.995),
}
# Shigley 9th ed. Eq. 6-26.
LOAD_FACTORS: dict[str, float] = {"bending": 1.0, "axial": 0.85, "torsion": 0.59}
# Eq. 6-35 (steels, Sut in kpsi, sqrt(a) in sqrt(in)); bending/axial coefficients
# as printed in the 9th ed., torsion coefficients from memory.
_NEUBER_COEFFS: dict[str, tuple[float, float, float, float]] = {
    "bending": (0.245799, -0.307794e-2, 0.150874e-4, -0.266978e-7),
    "axial": (0.245799, -0.307794e-2, 0.150874e-4, -0.266978e-7),
    "torsion": (0.190, -0.251e-2, 0.135e-4, -0.267e-7),
}
NEUBER_SUT_RANGE = (50.0 * KPSI, 200.0 * KPSI)   # span of Figs. 6-20, 6-21 (from memory)
SIZE_RANGE = (2.79e-3, 254e-3)                   # Eq. 6-20 [m]
TEMPERATURE_RANGE = (293.15, (1000.0 - 32.0) / 1.8 + 273.15)   # 20 degC .. 1000 degF, Eq. 6-27 [K]
RELIABILITY_RANGE = (0.5, 0.999999)              # Table 6-5 span


def _sec(diameter: ArrayLike, bore: ArrayLike, path: str) -> tuple[FloatArray, FloatArray]:
    d = ac.positive(diameter, join_path(path, "diameter"), "m")
    di = ac.non_negative(bore, join_path(path, "bore"), "m")
    if np.any(di >= d):
        d_b, di_b = np.broadcast_arrays(d, di)
        v, at = ac.first_bad(di_b, di_b >= d_b)
        raise InputError(join_path(path, "bore"), f"must be smaller than the diameter, got {v:.6g} m{at}",
                         "0 <= bore < diameter")
    return d, di


def bending_stress(moment: ArrayLike, diameter: ArrayLike, bore: ArrayLike = 0.0, path: str = "") -> FloatArray:
    """Nominal outer-fibre bending stress sigma = 32 M d / (pi (d^4 - d_i^4)) [Pa].

    Parameters
    ----------
    moment : array_like
        Bending moment M [N*m] (the resultant of both planes); the sign is kept.
    diameter : array_like
        Outer diameter d [m], > 0.
    bore : array_like
        Bore d_i [m], 0 <= d_i < d (0: solid).
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(bending_stress(100.0, 0.03)) / 1e6, 3)
    37.726
    """
    d, di = _sec(diameter, bore, path)
    m = ac.finite(moment, join_path(path, "moment"), "N*m")
    return ac.scalar_or_array(32.0 * m * d / (math.pi * (d**4 - di**4)))


def torsion_stress(torque: ArrayLike, diameter: ArrayLike, bore: ArrayLike = 0.0, path: str = "") -> FloatArray:
    """Nominal outer-fibre shear stress tau = 16 T d / (pi (d^4 - d_i^4)) [Pa].

    Parameters
    ----------
    torque : array_like
        Torque T [N*m].
    diameter, bore, path : see :func:`bending_stress`.

    Examples
    --------
    >>> round(float(torsion_stress(100.0, 0.03, 0.015)) / 1e6, 3)
    20.12
    """
    d, di = _sec(diameter, bore, path)
    t = ac.finite(torque, join_path(path, "torque"), "N*m")
    return ac.scalar_or_array(16.0 * t * d / (math.pi * (d**4 - di**4)))


def axial_stress(force: ArrayLike, diameter: ArrayLike, bore: ArrayLike = 0.0, path: str = "") -> FloatArray:
    """Nominal axial stress sigma = 4 F / (pi (d^2 - d_i^2)) [Pa] (tension > 0).

    Examples
    --------
    >>> round(float(axial_stress(10e3, 0.02)) / 1e6, 3)
    31.831
    """
    d, di = _sec(diameter, bore, path)
    f = ac.finite(force, join_path(path, "force"), "N")
    return ac.scalar_or_array(4.0 * f / (math.pi * (d**2 - di**2)))


def neuber_constant_steel(sut: ArrayLike, loading: Loading = "bending", path: str = "") -> FloatArray:
    """Neuber's constant sqrt(a) [sqrt(m)] of a steel (Shigley 9th ed. Eq. 6-35).

    sqrt(a) = c0 + c1 S + c2 S^2 + c3 S^3 [sqrt(in)], S = Sut in kpsi: for
    bending and axial load c = (0.245799, -0.307794e-2, 0.150874e-4,
    -0.266978e-7); for torsion c = (0.190, -2.51e-3, 1.35e-5, -2.67e-8)
    (torsion coefficients from memory). Valid for steels with
    50 <= Sut <= 200 kpsi (345 to 1379 MPa).

    Parameters
    ----------
    sut : array_like
        Ultimate tensile strength [Pa].
    loading : {"bending", "axial", "torsion"}
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    Sut = 690 MPa in bending: 0.0621 sqrt(in) = 0.313 sqrt(mm):

    >>> round(float(neuber_constant_steel(690e6)) / math.sqrt(INCH), 4)
    0.0621
    """
    ac.choice(loading, tuple(_NEUBER_COEFFS), join_path(path, "loading"))
    s = ac.within(sut, *NEUBER_SUT_RANGE, join_path(path, "sut"), "Pa",
                  note="steels, 50 to 200 kpsi (Shigley 9th ed. Eq. 6-35)") / KPSI
    c0, c1, c2, c3 = _NEUBER_COEFFS[loading]
    return ac.scalar_or_array((c0 + s * (c1 + s * (c2 + s * c3))) * math.sqrt(INCH))


def notch_sensitivity(radius: ArrayLike, *, neuber: ArrayLike | None = None, peterson: ArrayLike | None = None,
                      path: str = "") -> FloatArray:
    """Notch sensitivity q [-] of a notch of root radius r.

    Neuber: q = 1 / (1 + sqrt(a) / sqrt(r)) with Neuber's constant sqrt(a)
    [sqrt(m)] (Shigley 9th ed. Eqs. 6-33, 6-34; steels: see
    :func:`neuber_constant_steel`). Peterson: q = 1 / (1 + a / r) with
    Peterson's constant a [m] (Pilkey, Peterson's SCFs, 3rd ed., Sec. 1.9).
    Give exactly one of the two.

    Parameters
    ----------
    radius : array_like
        Notch root radius r [m], > 0.
    neuber : array_like, optional
        sqrt(a) [sqrt(m)], >= 0.
    peterson : array_like, optional
        a [m], >= 0.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(notch_sensitivity(0.003, neuber=neuber_constant_steel(690e6))), 3)
    0.847
    >>> round(float(notch_sensitivity(0.003, peterson=0.1e-3)), 4)
    0.9677
    """
    if (neuber is None) == (peterson is None):
        raise InputError(join_path(path, "notch_sensitivity"), "give one material constant",
                         "either neuber [sqrt(m)] or peterson [m]")
    r = ac.positive(radius, join_path(path, "radius"), "m")
    if neuber is not None:
        sqrt_a = ac.non_negative(neuber, join_path(path, "neuber"), "sqrt(m)")
        return ac.scalar_or_array(1.0 / (1.0 + sqrt_a / np.sqrt(r)))
    assert peterson is not None          # one of the two was checked above
    a = ac.non_negative(peterson, join_path(path, "peterson"), "m")
    return ac.scalar_or_array(1.0 / (1.0 + a / r))


def fatigue_factor(kt: ArrayLike, q: ArrayLike, path: str = "") -> FloatArray:
    """Fatigue stress-concentration factor Kf = 1 + q (Kt - 1) (Shigley 9th ed. Eq. 6-32).

    Parameters
    ----------
    kt : array_like
        Theoretical stress-concentration factor Kt (or Kts) [-], >= 1.
    q : array_like
        Notch sensitivity [-], 0..1.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(fatigue_factor(1.68, 0.85)), 3)
    1.578
    """
    k = ac.finite(kt, join_path(path, "kt"))
    if np.any(k < 1.0):
        v, at = ac.first_bad(k, k < 1.0)
        raise InputError(join_path(path, "kt"), f"a stress-concentration factor below 1 is not possible, got "
                         f"{v:.6g}{at}", ">= 1")
    qv = ac.within(q, 0.0, 1.0, join_path(path, "q"), note="notch sensitivity")
    return ac.scalar_or_array(1.0 + qv * (k - 1.0))


def von_mises(sigma: ArrayLike, tau: ArrayLike) -> FloatArray:
    """Von Mises stress of a normal and a shear stress: sqrt(sigma^2 + 3 tau^2) [Pa].

    >>> round(float(von_mises(30e6, 10e6)) / 1e6, 4)
    34.641
    """
    s = ac.finite(sigma, "sigma", "Pa")
    t = ac.finite(tau, "tau", "Pa")
    return ac.scalar_or_array(np.sqrt(s**2 + 3.0 * t**2))


def surface_factor(sut: ArrayLike, finish: Finish, path: str = "") -> FloatArray:
    """Marin surface factor ka = a Sut^b, Sut in MPa (Shigley 9th ed. Eq. 6-19, Table 6-2).

    a, b: ground 1.58, -0.085; machined or cold-drawn 4.51, -0.265;
    hot-rolled 57.7, -0.718; as-forged 272, -0.995.

    Parameters
    ----------
    sut : array_like
        Ultimate tensile strength [Pa], > 0.
    finish : {"ground", "machined", "cold_drawn", "hot_rolled", "as_forged"}
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(surface_factor(1226e6, "machined")), 3)
    0.685
    """
    ac.choice(finish, tuple(SURFACE_FACTORS), join_path(path, "finish"))
    s = ac.positive(sut, join_path(path, "sut"), "Pa") / MPA
    a, b = SURFACE_FACTORS[finish]
    return ac.scalar_or_array(a * s**b)


def _kb(d_mm: FloatArray) -> FloatArray:
    return np.where(d_mm <= 51.0, (d_mm / 7.62) ** -0.107, 1.51 * d_mm**-0.157)


def size_factor(diameter: ArrayLike, loading: Loading = "bending", rotating: bool = True,
                path: str = "") -> FloatArray:
    """Marin size factor kb (Shigley 9th ed. Eqs. 6-20, 6-21, 6-24).

    Bending or torsion: kb = (d / 7.62)^-0.107 for 2.79 <= d <= 51 mm,
    1.51 d^-0.157 for 51 < d <= 254 mm (d in mm); axial load: kb = 1. A
    non-rotating round section in bending uses the equivalent diameter
    d_e = 0.370 d (Eq. 6-24, from memory).

    Parameters
    ----------
    diameter : array_like
        d [m]; 2.79 to 254 mm (for a non-rotating section, d_e in that range).
    loading : {"bending", "axial", "torsion"}
    rotating : bool
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(size_factor(0.022)), 3)
    0.893
    """
    ac.choice(loading, tuple(LOAD_FACTORS), join_path(path, "loading"))
    d = ac.positive(diameter, join_path(path, "diameter"), "m")
    if loading == "axial":
        return ac.scalar_or_array(np.ones_like(d))
    de = d if rotating else 0.370 * d
    ac.within(de, *SIZE_RANGE, join_path(path, "diameter" if rotating else "equivalent_diameter"), "m",
              note="Shigley 9th ed. Eq. 6-20")
    return ac.scalar_or_array(_kb(de * 1e3))


def load_factor(loading: Loading, path: str = "") -> float:
    """Marin load factor kc: 1 bending, 0.85 axial, 0.59 torsion (Shigley 9th ed. Eq. 6-26).

    With the distortion-energy criteria below, combined loading uses kc = 1
    (the torsion enters through the von Mises stress).

    >>> load_factor("axial")
    0.85
    """
    return LOAD_FACTORS[ac.choice(loading, tuple(LOAD_FACTORS), join_path(path, "loading"))]


def temperature_factor(temperature: ArrayLike, path: str = "") -> FloatArray:
    """Marin temperature factor kd (Shigley 9th ed. Eq. 6-27).

    kd = 0.975 + 0.432e-3 T_F - 0.115e-5 T_F^2 + 0.104e-8 T_F^3
    - 0.595e-12 T_F^4, T_F in degF, a fit for steels valid for
    70 <= T_F <= 1000 degF (from memory). From 20 degC (68 degF) to 70 degF
    kd = 1, the room-temperature row of Table 6-4 (ST/SRT = 1.000, from
    memory) that the fit approximates (it gives 0.99995 at 70 degF), so a
    section at room temperature has Se = ka kb kc ke kf Se' exactly.

    Parameters
    ----------
    temperature : array_like
        Operating temperature [K], 293.15 K (20 degC) to 810.9 K (1000 degF).
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> float(temperature_factor(293.15))
    1.0
    >>> round(float(temperature_factor((550 - 32) / 1.8 + 273.15)), 4)
    0.9833
    """
    t = ac.within(temperature, *TEMPERATURE_RANGE, join_path(path, "temperature"), "K",
                  note="20 degC to 1000 degF; Shigley 9th ed. Eq. 6-27")
    tf = (t - 273.15) * 1.8 + 32.0
    kd = 0.975 + tf * (0.432e-3 + tf * (-0.115e-5 + tf * (0.104e-8 + tf * -0.595e-12)))
    return ac.scalar_or_array(np.where(tf <= 70.0, 1.0, kd))


def reliability_factor(reliability: ArrayLike, path: str = "") -> FloatArray:
    """Marin reliability factor ke = 1 - 0.08 z_a (Shigley 9th ed. Eq. 6-29, Table 6-5).

    z_a is the standard normal variate of the reliability R (8 % standard
    deviation of the endurance limit): R = 0.99 gives z_a = 2.326 and
    ke = 0.814.

    Parameters
    ----------
    reliability : array_like
        R [-], 0.5 to 0.999999.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(reliability_factor(0.99)), 3)
    0.814
    """
    r = ac.within(reliability, *RELIABILITY_RANGE, join_path(path, "reliability"), note="Shigley 9th ed. Table 6-5")
    inv = np.vectorize(NormalDist().inv_cdf, otypes=[float])
    return ac.scalar_or_array(1.0 - 0.08 * inv(r))


def endurance_limit_estimate(sut: ArrayLike, path: str = "") -> FloatArray:
    """Rotating-beam endurance limit of a steel, Se' = 0.5 Sut up to
    Sut = 1400 MPa, 700 MPa above (Shigley 9th ed. Eq. 6-8) [Pa].

    >>> float(endurance_limit_estimate(1226e6)) / 1e6
    613.0
    """
    s = ac.positive(sut, join_path(path, "sut"), "Pa")
    return ac.scalar_or_array(np.where(s <= 1400e6, 0.5 * s, 700e6))


def endurance_limit(se_prime: ArrayLike, sut: ArrayLike, ka: ArrayLike = 1.0, kb: ArrayLike = 1.0,
                    kc: ArrayLike = 1.0, kd: ArrayLike = 1.0, ke: ArrayLike = 1.0, kf: ArrayLike = 1.0,
                    path: str = "") -> FloatArray:
    """Endurance limit at the critical location Se = ka kb kc kd ke kf Se' (Shigley 9th ed. Eq. 6-18) [Pa].

    Parameters
    ----------
    se_prime : array_like
        Rotating-beam endurance limit Se' [Pa], 0 < Se' < Sut.
    sut : array_like
        Ultimate tensile strength [Pa], > 0; checks that the endurance data
        do not contradict it.
    ka, kb, kc, kd, ke, kf : array_like
        Marin factors [-], > 0 (kf: miscellaneous effects).
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(endurance_limit(613e6, 1226e6, ka=0.685, kb=0.893)) / 1e6, 1)
    375.0
    """
    se1 = ac.positive(se_prime, join_path(path, "se_prime"), "Pa")
    s = ac.positive(sut, join_path(path, "sut"), "Pa")
    _not_above(se1, s, join_path(path, "se_prime"), "the ultimate tensile strength")
    k = np.ones(())
    for name, v in (("ka", ka), ("kb", kb), ("kc", kc), ("kd", kd), ("ke", ke), ("kf", kf)):
        k = k * ac.positive(v, join_path(path, name))
    return ac.scalar_or_array(k * se1)


def _not_above(low: FloatArray, high: FloatArray, path: str, what: str, strict: bool = True) -> None:
    lo, hi = np.broadcast_arrays(low, high)
    bad = lo >= hi if strict else lo > hi
    if np.any(bad):
        v, at = ac.first_bad(lo, bad)
        h = float(hi[np.unravel_index(int(np.flatnonzero(bad)[0]), hi.shape)])
        raise InputError(path, f"{v:.6g} Pa{at} contradicts {what} {h:.6g} Pa",
                         f"{'<' if strict else '<='} {h:.6g} Pa")


@dataclass(frozen=True)
class EnduranceLimit:
    """The endurance limit ``se`` [Pa] and the parts it is built from:
    ``se_prime`` [Pa] and the Marin factors ka, kb, kc, kd, ke, kf [-]."""

    se: FloatArray
    se_prime: FloatArray
    ka: FloatArray
    kb: FloatArray
    kc: float
    kd: FloatArray
    ke: FloatArray
    kf: FloatArray


def marin_endurance_limit(sut: ArrayLike, finish: Finish, diameter: ArrayLike, loading: Loading = "bending",
                          temperature: ArrayLike = 293.15, reliability: ArrayLike = 0.5,
                          se_prime: ArrayLike | None = None, kf: ArrayLike = 1.0, rotating: bool = True,
                          path: str = "") -> EnduranceLimit:
    """Endurance limit of a steel shaft section from its Marin factors.

    Se = ka kb kc kd ke kf Se' with ka from the surface finish, kb from the
    diameter, kc from the loading, kd from the temperature, ke from the
    reliability (see the factor functions) and Se' = 0.5 Sut (steels,
    Eq. 6-8) unless given. For a shaft rated by the distortion-energy
    criteria use ``loading="bending"`` (kc = 1).

    Parameters
    ----------
    sut : array_like
        Ultimate tensile strength [Pa].
    finish : {"ground", "machined", "cold_drawn", "hot_rolled", "as_forged"}
    diameter : array_like
        Section diameter [m] (for kb).
    loading : {"bending", "axial", "torsion"}
    temperature : array_like
        [K]; 293.15 K (20 degC) gives kd = 1.
    reliability : array_like
        [-]; 0.5 gives ke = 1.
    se_prime : array_like, optional
        Measured rotating-beam endurance limit [Pa], < Sut.
    kf : array_like
        Miscellaneous-effects factor [-].
    rotating : bool
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    A machined 1.100 in section, Sut = 105 kpsi, 99 % reliability:

    >>> e = marin_endurance_limit(105 * KPSI, "machined", 1.1 * INCH, reliability=0.99)
    >>> round(float(e.ka), 3), round(float(e.kb), 3), round(float(e.se) / KPSI, 1)
    (0.788, 0.87, 29.3)
    """
    s = ac.positive(sut, join_path(path, "sut"), "Pa")
    se1 = endurance_limit_estimate(s, path) if se_prime is None else ac.positive(se_prime, join_path(path, "se_prime"),
                                                                                 "Pa")
    ka = surface_factor(s, finish, path)
    kb = size_factor(diameter, loading, rotating, path)
    kc = load_factor(loading, path)
    kd = temperature_factor(temperature, path)
    ke = reliability_factor(reliability, path)
    kfv = ac.positive(kf, join_path(path, "kf"))
    se = endurance_limit(se1, s, ka, kb, kc, kd, ke, kfv, path)
    return EnduranceLimit(se=se, se_prime=ac.scalar_or_array(np.asarray(se1)), ka=ka, kb=kb, kc=kc, kd=kd, ke=ke,
                          kf=ac.scalar_or_array(kfv))


@dataclass(frozen=True)
class SectionStresses:
    """Von Mises stresses [Pa] of a shaft section with Kf applied:
    ``alternating`` sigma_a', ``midrange`` sigma_m' and ``maximum``
    sigma'_max (for first-cycle yield)."""

    alternating: FloatArray
    midrange: FloatArray
    maximum: FloatArray


def shaft_stresses(diameter: ArrayLike, ma: ArrayLike, tm: ArrayLike, kf: ArrayLike, kfs: ArrayLike,
                   mm: ArrayLike = 0.0, ta: ArrayLike = 0.0, fm: ArrayLike = 0.0, bore: ArrayLike = 0.0,
                   kf_axial: ArrayLike | None = None, path: str = "") -> SectionStresses:
    """Distortion-energy stresses of a rotating shaft section (Shigley 9th ed. Eqs. 7-5, 7-6, 7-15).

    sigma_a = Kf 32 M_a d / (pi (d^4 - d_i^4)), tau_a = Kfs 16 T_a d / (...),
    sigma_m = Kf 32 M_m d / (...) + Kf_ax 4 F_m / (pi (d^2 - d_i^2)),
    tau_m = Kfs 16 T_m d / (...); sigma_a' = sqrt(sigma_a^2 + 3 tau_a^2),
    sigma_m' likewise, sigma'_max = sqrt((sigma_a + sigma_m)^2 + 3 (tau_a + tau_m)^2).

    Parameters
    ----------
    diameter, bore : array_like
        d, d_i [m].
    ma, mm : array_like
        Alternating and midrange bending moments [N*m] (magnitudes).
    tm, ta : array_like
        Midrange and alternating torques [N*m] (magnitudes).
    kf, kfs : array_like
        Fatigue stress-concentration factors in bending and torsion [-], >= 1.
    fm : array_like
        Steady axial force [N] (tension > 0; a compressive load is taken as
        its magnitude, on the safe side).
    kf_axial : array_like, optional
        Kf for the axial stress; Kf when not given.
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> s = shaft_stresses(1.1 * INCH, 1260 * 0.112985, 1100 * 0.112985, 1.58, 1.39)
    >>> round(float(s.alternating) / KPSI, 2), round(float(s.midrange) / KPSI, 2)
    (15.24, 10.13)
    """
    d, di = _sec(diameter, bore, path)
    kfb = _kf_check(kf, join_path(path, "kf"))
    kft = _kf_check(kfs, join_path(path, "kfs"))
    kfa = kfb if kf_axial is None else _kf_check(kf_axial, join_path(path, "kf_axial"))
    z = math.pi * (d**4 - di**4) / d           # 32 I / d
    area = math.pi * (d**2 - di**2) / 4.0
    sa = kfb * 32.0 * np.abs(ac.finite(ma, join_path(path, "ma"), "N*m")) / z
    sm = (kfb * 32.0 * np.abs(ac.finite(mm, join_path(path, "mm"), "N*m")) / z
          + kfa * np.abs(ac.finite(fm, join_path(path, "fm"), "N")) / area)
    ta_ = kft * 16.0 * np.abs(ac.finite(ta, join_path(path, "ta"), "N*m")) / z
    tm_ = kft * 16.0 * np.abs(ac.finite(tm, join_path(path, "tm"), "N*m")) / z
    return SectionStresses(alternating=ac.scalar_or_array(np.sqrt(sa**2 + 3.0 * ta_**2)),
                           midrange=ac.scalar_or_array(np.sqrt(sm**2 + 3.0 * tm_**2)),
                           maximum=ac.scalar_or_array(np.sqrt((sa + sm) ** 2 + 3.0 * (ta_ + tm_) ** 2)))


def _kf_check(value: ArrayLike, path: str) -> FloatArray:
    k = ac.finite(value, path)
    if np.any(k < 1.0):
        v, at = ac.first_bad(k, k < 1.0)
        raise InputError(path, f"a stress-concentration factor below 1 is not possible, got {v:.6g}{at}", ">= 1")
    return k


def _strengths(se: ArrayLike, sut: ArrayLike, sy: ArrayLike | None, criterion: str,
               path: str) -> tuple[FloatArray, FloatArray]:
    """Checked Se and the midrange strength the criterion uses (Sut or Sy)."""
    ac.choice(criterion, CRITERIA, join_path(path, "criterion"))
    sev = ac.positive(se, join_path(path, "se"), "Pa")
    s = ac.positive(sut, join_path(path, "sut"), "Pa")
    _not_above(sev, s, join_path(path, "se"), "the ultimate tensile strength")
    if sy is not None:
        syv = ac.positive(sy, join_path(path, "sy"), "Pa")
        _not_above(syv, s, join_path(path, "sy"), "the ultimate tensile strength", strict=False)
    elif criterion in ("asme_elliptic", "soderberg"):
        raise InputError(join_path(path, "sy"), f"the {criterion} criterion needs the yield strength",
                         "> 0 Pa, <= sut")
    return sev, (s if criterion in ("goodman", "gerber") else syv)


def _inverse_n(a: FloatArray, b: FloatArray, criterion: str) -> FloatArray:
    """1/n from a = sigma_a'/Se and b = sigma_m'/S_m."""
    if criterion in ("goodman", "soderberg"):
        return a + b
    if criterion == "gerber":
        return 0.5 * (a + np.sqrt(a**2 + 4.0 * b**2))
    return np.sqrt(a**2 + b**2)


def fatigue_safety_factor(alternating: ArrayLike, midrange: ArrayLike, se: ArrayLike, sut: ArrayLike,
                          sy: ArrayLike | None = None, criterion: Criterion = "goodman",
                          path: str = "") -> FloatArray:
    """Fatigue safety factor n from von Mises alternating and midrange stresses
    (Shigley 9th ed. Eqs. 6-45 to 6-48 with the distortion-energy stresses of Sec. 7-4).

    Goodman 1/n = a + b, Soderberg the same with Sy, Gerber
    1/n = (a + sqrt(a^2 + 4 b^2)) / 2, ASME elliptic 1/n = sqrt(a^2 + b^2),
    where a = sigma_a'/Se and b = sigma_m'/Sut (Goodman, Gerber) or
    sigma_m'/Sy (ASME elliptic, Soderberg). An unloaded section gives inf.

    Parameters
    ----------
    alternating, midrange : array_like
        sigma_a', sigma_m' [Pa], >= 0.
    se : array_like
        Endurance limit Se [Pa], 0 < Se < Sut.
    sut : array_like
        Ultimate tensile strength [Pa].
    sy : array_like, optional
        Yield strength [Pa], <= Sut; needed by "asme_elliptic" and "soderberg".
    criterion : {"goodman", "gerber", "asme_elliptic", "soderberg"}
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    >>> round(float(fatigue_safety_factor(100e6, 100e6, 200e6, 600e6)), 4)
    1.5
    >>> round(float(fatigue_safety_factor(100e6, 100e6, 200e6, 600e6, criterion="gerber")), 4)
    1.8167
    """
    sev, sm = _strengths(se, sut, sy, criterion, path)
    a = ac.non_negative(alternating, join_path(path, "alternating"), "Pa") / sev
    b = ac.non_negative(midrange, join_path(path, "midrange"), "Pa") / sm
    inv = _inverse_n(a, b, criterion)
    with np.errstate(divide="ignore"):
        n = np.where(inv > 0.0, 1.0 / np.where(inv > 0.0, inv, 1.0), np.inf)
    return ac.scalar_or_array(n)


def shaft_fatigue_factor(diameter: ArrayLike, ma: ArrayLike, tm: ArrayLike, kf: ArrayLike, kfs: ArrayLike,
                         se: ArrayLike, sut: ArrayLike, sy: ArrayLike | None = None,
                         criterion: Criterion = "goodman", mm: ArrayLike = 0.0, ta: ArrayLike = 0.0,
                         fm: ArrayLike = 0.0, bore: ArrayLike = 0.0, kf_axial: ArrayLike | None = None,
                         path: str = "") -> FloatArray:
    """Fatigue safety factor of a rotating shaft section (Shigley 9th ed. Eqs. 7-7, 7-9, 7-11, 7-13).

    :func:`shaft_stresses` followed by :func:`fatigue_safety_factor`; see
    both for the parameters.

    Examples
    --------
    Shigley 9th ed. Example 7-1 (from memory): d = 1.100 in, M_a = 1260
    lbf in, T_m = 1100 lbf in, Kf = 1.58, Kfs = 1.39, Se = 29.3 kpsi,
    Sut = 105 kpsi; DE-Goodman gives n = 1.62:

    >>> lbf_in = 0.1129848
    >>> n = shaft_fatigue_factor(1.1 * INCH, 1260 * lbf_in, 1100 * lbf_in, 1.58, 1.39, 29.3 * KPSI, 105 * KPSI)
    >>> round(float(n), 2)
    1.62
    """
    st = shaft_stresses(diameter, ma, tm, kf, kfs, mm, ta, fm, bore, kf_axial, path)
    return fatigue_safety_factor(st.alternating, st.midrange, se, sut, sy, criterion, path)


def shaft_yield_factor(diameter: ArrayLike, ma: ArrayLike, tm: ArrayLike, kf: ArrayLike, kfs: ArrayLike,
                       sy: ArrayLike, mm: ArrayLike = 0.0, ta: ArrayLike = 0.0, fm: ArrayLike = 0.0,
                       bore: ArrayLike = 0.0, kf_axial: ArrayLike | None = None, path: str = "") -> FloatArray:
    """First-cycle yield safety factor n_y = Sy / sigma'_max (Shigley 9th ed. Eq. 7-16).

    Parameters as :func:`shaft_stresses`; ``sy`` the yield strength [Pa], > 0.
    An unloaded section gives inf.

    Examples
    --------
    >>> lbf_in = 0.1129848
    >>> round(float(shaft_yield_factor(1.1 * INCH, 1260 * lbf_in, 1100 * lbf_in, 1.58, 1.39, 82 * KPSI)), 2)
    4.48
    """
    syv = ac.positive(sy, join_path(path, "sy"), "Pa")
    smax = shaft_stresses(diameter, ma, tm, kf, kfs, mm, ta, fm, bore, kf_axial, path).maximum
    with np.errstate(divide="ignore"):
        n = np.where(smax > 0.0, syv / np.where(smax > 0.0, smax, 1.0), np.inf)
    return ac.scalar_or_array(n)


"""Shaft-section formulas against published worked examples and sympy.

Sources, named beside each check:

* Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design,
  9th ed., McGraw-Hill, 2011 ("Shigley 9th"): Examples 6-3 to 6-6 (Marin
  factors, notch sensitivity), Table 6-2 (surface factor, both unit columns),
  Table 6-5 (reliability factor), Example 7-1 (a machined shoulder of a
  rotating shaft rated by the four distortion-energy criteria). No copy of
  the book was at hand: every input and printed answer below was recalled,
  and is marked "from memory". The printed answers carry three significant
  figures, so the tolerances are half a unit of the last printed digit,
  unless a check says why it needs more.
* sympy (an independent symbolic solver): the four fatigue criteria are
  written as the equations of their failure lines, solved for the safety
  factor and for the diameter, and compared with the module's closed forms
  at 1e-12 relative (both sides are a few floating-point operations).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import sympy as sp

from loadscope.kernel import sections as s
from loadscope.kernel import shaftsize

KPSI = s.KPSI
INCH = s.INCH
LBF_IN = 4.4482216152605 * INCH          # [N*m] per lbf*in (exact by definition of lbf and inch)


def _f_to_k(t_f: float) -> float:
    return (t_f - 32.0) / 1.8 + 273.15


# --- Marin factors, Shigley 9th ch. 6 ----------------------------------------

def test_surface_factor_example_6_3():
    # Shigley 9th Example 6-3 (from memory): Sut = 520 MPa, machined: ka = 4.51 (520)^-0.265 = 0.860.
    assert float(s.surface_factor(520e6, "machined")) == pytest.approx(0.860, abs=5e-4)


# Shigley 9th Table 6-2 (from memory): finish -> (a with Sut in kpsi, a with Sut in MPa, b).
TABLE_6_2 = {"ground": (1.34, 1.58, -0.085), "machined": (2.70, 4.51, -0.265), "cold_drawn": (2.70, 4.51, -0.265),
             "hot_rolled": (14.4, 57.7, -0.718), "as_forged": (39.9, 272.0, -0.995)}


@pytest.mark.parametrize("finish", list(TABLE_6_2))
@pytest.mark.parametrize("sut_kpsi", [60.0, 105.0, 200.0])
def test_surface_factor_agrees_with_the_kpsi_column(finish, sut_kpsi):
    # The module holds the MPa column; evaluated at the same strength, the kpsi
    # column must agree to the table's three significant figures (a
    # transcription check of both columns: 0.5 % covers rounding a to 3 digits).
    a_kpsi, a_mpa, b = TABLE_6_2[finish]
    assert s.SURFACE_FACTORS[finish] == (a_mpa, b)
    got = float(s.surface_factor(sut_kpsi * KPSI, finish))
    assert got == pytest.approx(a_kpsi * sut_kpsi**b, rel=5e-3)


def test_size_factor_example_6_4():
    # Shigley 9th Example 6-4 (from memory): d = 32 mm in bending; rotating kb = 0.858;
    # not rotating, d_e = 0.370 d = 11.84 mm, kb = 0.954.
    assert float(s.size_factor(0.032)) == pytest.approx(0.858, abs=5e-4)
    assert float(s.size_factor(0.032, rotating=False)) == pytest.approx(0.954, abs=5e-4)


def test_temperature_factor_example_6_5():
    # Shigley 9th Example 6-5 (from memory): 450 degF, Eq. 6-27 gives kd = 1.007
    # (Table 6-4 interpolated also gives 1.007).
    assert float(s.temperature_factor(_f_to_k(450.0))) == pytest.approx(1.007, abs=5e-4)
    # Room temperature: Table 6-4 ST/SRT = 1.000 at 70 degF (from memory).
    assert float(s.temperature_factor(293.15)) == 1.0


# Shigley 9th Table 6-5 (from memory): reliability -> ke (printed to 3 decimals).
TABLE_6_5 = [(0.50, 1.000), (0.90, 0.897), (0.95, 0.868), (0.99, 0.814), (0.999, 0.753), (0.9999, 0.702),
             (0.99999, 0.659), (0.999999, 0.620)]


@pytest.mark.parametrize("r, ke", TABLE_6_5)
def test_reliability_factor_table_6_5(r, ke):
    assert float(s.reliability_factor(r)) == pytest.approx(ke, abs=5e-4)


def test_notch_sensitivity_example_6_6():
    # Shigley 9th Example 6-6 (from memory): Sut = 690 MPa, fillet r = 3 mm, Kt = 1.65;
    # Eq. 6-35: sqrt(a) = 0.0622 sqrt(in) = 0.313 sqrt(mm); Eq. 6-33: Kf = 1.55.
    sqrt_a = float(s.neuber_constant_steel(100 * KPSI))           # the example's 690 MPa is 100 kpsi
    assert sqrt_a / math.sqrt(INCH) == pytest.approx(0.0622, abs=5e-5)
    assert sqrt_a / math.sqrt(1e-3) == pytest.approx(0.313, abs=5e-4)
    q = s.notch_sensitivity(3e-3, neuber=s.neuber_constant_steel(690e6))
    assert float(s.fatigue_factor(1.65, q)) == pytest.approx(1.55, abs=5e-3)


def test_endurance_estimate_eq_6_8():
    # Shigley 9th Eq. 6-8: Se' = 0.5 Sut up to 1400 MPa, 700 MPa above.
    assert float(s.endurance_limit_estimate(1000e6)) == 500e6
    assert float(s.endurance_limit_estimate(1600e6)) == 700e6


# --- Shigley 9th Example 7-1 ---------------------------------------------------
# A machined shoulder, d = 1.100 in, D = 1.65 in, r = 0.11 in; M_a = 1260 lbf in,
# T_m = 1100 lbf in; Sut = 105 kpsi, Sy = 82 kpsi, 99 % reliability (all from memory).
# The book reads Kt = 1.68, Kts = 1.42 from its charts and q = 0.85, qs = 0.92
# from Figs. 6-20, 6-21, giving Kf = 1.58, Kfs = 1.39 (from memory).
EX71 = dict(d=1.100 * INCH, ma=1260 * LBF_IN, tm=1100 * LBF_IN, sut=105 * KPSI, sy=82 * KPSI, kf=1.58, kfs=1.39)


def test_example_7_1_endurance_limit():
    # Printed (from memory): ka = 2.70 (105)^-0.265 = 0.787, kb = (1.100/0.30)^-0.107 = 0.870,
    # ke = 0.814, Se = 0.787 (0.870) (0.814) (52.5) = 29.3 kpsi.
    e = s.marin_endurance_limit(EX71["sut"], "machined", EX71["d"], reliability=0.99)
    # ka: the module evaluates the MPa column (4.51), the book the kpsi column (2.70),
    # whose a values differ in their 3rd digit: 0.788 against 0.787, so 1.5e-3.
    assert float(e.ka) == pytest.approx(0.787, abs=1.5e-3)
    assert float(e.kb) == pytest.approx(0.870, abs=5e-4)
    assert float(e.ke) == pytest.approx(0.814, abs=5e-4)
    assert e.kc == 1.0 and float(e.kd) == 1.0 and float(e.kf) == 1.0
    assert float(e.se) / KPSI == pytest.approx(29.3, abs=0.05)


def test_example_7_1_kf_from_neuber():
    # The book's q = 0.85 read from Fig. 6-20 (from memory): Neuber's Eq. 6-35 at
    # r = 0.11 in, Sut = 105 kpsi gives q = 0.851 and Kf = 1 + q (1.68 - 1) = 1.58.
    q = s.notch_sensitivity(0.11 * INCH, neuber=s.neuber_constant_steel(EX71["sut"]))
    assert float(q) == pytest.approx(0.85, abs=5e-3)
    assert float(s.fatigue_factor(1.68, q)) == pytest.approx(1.58, abs=5e-3)


def test_example_7_1_stresses():
    # Printed (from memory): sigma_a' = 32 Kf Ma / (pi d^3) = 15.2 kpsi,
    # sigma_m' = sqrt(3) 16 Kfs Tm / (pi d^3) = 10.1 kpsi.
    st = s.shaft_stresses(EX71["d"], EX71["ma"], EX71["tm"], EX71["kf"], EX71["kfs"])
    assert float(st.alternating) / KPSI == pytest.approx(15.2, abs=0.05)
    assert float(st.midrange) / KPSI == pytest.approx(10.1, abs=0.05)


# Printed safety factors of Example 7-1 (from memory).
EX71_FACTORS = {"goodman": 1.62, "gerber": 1.87, "asme_elliptic": 1.88, "soderberg": 1.56}


@pytest.mark.parametrize("criterion", list(EX71_FACTORS))
def test_example_7_1_fatigue_factors(criterion):
    # Tolerance 0.01: the book carries the stresses at three significant
    # figures (15.2, 10.1 kpsi) and Se = 29.3 kpsi into these equations; that
    # moves n by up to 0.005 on top of the printed rounding (recomputing with
    # the rounded stresses gives 1.63, 1.87, 1.88, 1.56).
    n = s.shaft_fatigue_factor(EX71["d"], EX71["ma"], EX71["tm"], EX71["kf"], EX71["kfs"], 29.3 * KPSI,
                               EX71["sut"], EX71["sy"], criterion)
    assert float(n) == pytest.approx(EX71_FACTORS[criterion], abs=0.01)


def test_example_7_1_yield_factor():
    # Printed (from memory): sigma'_max = sqrt(15.2^2 + 10.1^2) = 18.3 kpsi, n_y = 82 / 18.3 = 4.48.
    n = s.shaft_yield_factor(EX71["d"], EX71["ma"], EX71["tm"], EX71["kf"], EX71["kfs"], EX71["sy"])
    assert float(n) == pytest.approx(4.48, abs=5e-3)


# --- the four criteria against sympy ------------------------------------------

N, SA, SM, SE, SUT, SY = sp.symbols("n sigma_a sigma_m S_e S_ut S_y", positive=True)
# The failure line of each criterion with the stresses scaled by n (Shigley 9th Eqs. 6-45 to 6-48).
FAILURE_LINES = {
    "goodman": N * SA / SE + N * SM / SUT - 1,
    "gerber": N * SA / SE + (N * SM / SUT) ** 2 - 1,
    "asme_elliptic": (N * SA / SE) ** 2 + (N * SM / SY) ** 2 - 1,
    "soderberg": N * SA / SE + N * SM / SY - 1,
}


def _sympy_factor(criterion):
    roots = sp.solve(FAILURE_LINES[criterion], N)
    assert len(roots) == 1, roots          # positive=True leaves the one physical root
    return sp.lambdify((SA, SM, SE, SUT, SY), roots[0], "math")


def _samples(count, seed):
    rng = np.random.default_rng(seed)
    sut = rng.uniform(400e6, 1600e6, count)
    sy = sut * rng.uniform(0.5, 1.0, count)
    se = sut * rng.uniform(0.1, 0.5, count)
    sa = rng.uniform(1e6, 400e6, count)
    sm = rng.uniform(1e6, 400e6, count)
    return sa, sm, se, sut, sy


@pytest.mark.parametrize("criterion", list(FAILURE_LINES))
def test_fatigue_factor_matches_sympy(criterion):
    ref = _sympy_factor(criterion)
    sa, sm, se, sut, sy = _samples(50, 7)
    got = s.fatigue_safety_factor(sa, sm, se, sut, sy, criterion)
    want = [ref(*row) for row in zip(sa, sm, se, sut, sy)]
    np.testing.assert_allclose(got, want, rtol=1e-12)


@pytest.mark.parametrize("criterion", list(FAILURE_LINES))
def test_min_diameter_matches_sympy(criterion):
    # A solid section with Kf sigma_a' = A / d^3 and sigma_m' = B / d^3 (no axial
    # force, Se independent of d): put the stresses in the failure line, solve
    # for d at the target n (Shigley 9th Eqs. 7-8, 7-10, 7-12, 7-14 are these roots).
    # Solved for u = d^3 (Gerber is a quadratic in u) to keep sympy to real roots.
    a_, b_, u = sp.symbols("A B u", positive=True)
    line = FAILURE_LINES[criterion].subs({SA: a_ / u, SM: b_ / u})
    probe = {N: 2, a_: 3, b_: 5, SE: 7, SUT: 11, SY: 13}
    roots = [r for r in sp.solve(line, u) if r.subs(probe) > 0]     # drop the negative root of Gerber
    assert len(roots) == 1, roots
    ref = sp.lambdify((N, a_, b_, SE, SUT, SY), sp.cbrt(roots[0]), "math")
    rng = np.random.default_rng(11)
    kf, kfs = rng.uniform(1.0, 3.0, (2, 12))
    ma, tm = rng.uniform(10.0, 5000.0, (2, 12))
    sut = rng.uniform(500e6, 1500e6, 12)
    se, sy = 0.3 * sut, 0.8 * sut
    n_t = rng.uniform(1.2, 4.0, 12)
    a_v = kf * 32.0 * ma / math.pi                       # Kf 32 M_a / pi
    b_v = math.sqrt(3.0) * kfs * 16.0 * tm / math.pi     # sqrt(3) Kfs 16 T_m / pi
    want = [float(ref(*row)) for row in zip(n_t, a_v, b_v, se, sut, sy)]
    got = shaftsize.min_shaft_diameter(n_t, ma, tm, kf, kfs, se, sut, sy, criterion)      # one broadcast call
    np.testing.assert_allclose(got, want, rtol=1e-12)


def test_goodman_diameter_eq_7_8():
    # Shigley 9th Eq. 7-8 (from memory), written out by hand as a second check of the
    # sympy root: d = (16 n / pi (2 Kf Ma / Se + sqrt(3) Kfs Tm / Sut))^(1/3)
    # (M_m = T_a = 0). Example 7-1's inputs and n = 1.62 give d = 1.100 in back.
    d = (16 * 1.62 / math.pi * (2 * EX71["kf"] * EX71["ma"] / (29.3 * KPSI)
                                + math.sqrt(3) * EX71["kfs"] * EX71["tm"] / EX71["sut"])) ** (1 / 3)
    got = shaftsize.min_shaft_diameter(1.62, EX71["ma"], EX71["tm"], EX71["kf"], EX71["kfs"], 29.3 * KPSI, EX71["sut"])
    assert float(got) == pytest.approx(d, rel=1e-12)
    assert d / INCH == pytest.approx(1.100, abs=5e-4)

"""Shaft-section formulas: closed forms, limiting cases, properties, bad input.

Published examples and the sympy derivations are in
tests/reference/test_sections_reference.py. Here:

* Closed forms: the stresses of solid and hollow round sections, Kf, the
  endurance-limit product, each criterion at its limiting cases (pure
  alternating stress gives Se / sigma_a', pure midrange stress the strength
  over sigma_m').
* Properties (hypothesis): every criterion's factor is homogeneous of degree
  -1 in the stresses and falls as either grows; Gerber >= Goodman >=
  Soderberg and ASME elliptic >= Soderberg (their failure lines nest, Sy <=
  Sut); the shaft factor rises with the diameter; the minimum diameter gives
  the target factor back (with and without the size factor, solid and
  hollow); one broadcast call equals the loop.
* Bad input: each gets InputError naming the field and the accepted range.

Tolerances: 1e-12 relative for closed forms of a few operations; the
solve of shaftsize.min_shaft_diameter runs to round-off, so its round trip is held
to 1e-9 relative.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadscope.errors import InputError
from loadscope.kernel import sections as s
from loadscope.kernel import shaftsize

FAST = settings(max_examples=60, deadline=None)
CRITERIA = list(s.CRITERIA)


# --- closed forms -----------------------------------------------------------

def test_section_stresses_closed_forms():
    d, di = 0.04, 0.025
    assert float(s.bending_stress(250.0, d)) == pytest.approx(250.0 / (math.pi * d**3 / 32), rel=1e-14)
    assert float(s.torsion_stress(250.0, d)) == pytest.approx(250.0 / (math.pi * d**3 / 16), rel=1e-14)
    i = math.pi * (d**4 - di**4) / 64
    assert float(s.bending_stress(-250.0, d, di)) == pytest.approx(-250.0 * (d / 2) / i, rel=1e-14)
    assert float(s.torsion_stress(250.0, d, di)) == pytest.approx(250.0 * (d / 2) / (2 * i), rel=1e-14)
    assert float(s.axial_stress(-9e3, d, di)) == pytest.approx(-9e3 / (math.pi / 4 * (d**2 - di**2)), rel=1e-14)
    assert float(s.von_mises(0.0, 10e6)) == pytest.approx(math.sqrt(3) * 10e6, rel=1e-15)


def test_shaft_stresses_combine_the_parts():
    d, di, kf, kfs, kfa = 0.05, 0.01, 1.7, 1.4, 2.1
    ma, mm, ta, tm, fm = 300.0, 40.0, 60.0, 500.0, -2e3
    st_ = s.shaft_stresses(d, ma, tm, kf, kfs, mm, ta, fm, di, kfa)
    sa = kf * s.bending_stress(ma, d, di)
    sm = kf * s.bending_stress(mm, d, di) + kfa * abs(s.axial_stress(fm, d, di))
    ta_, tm_ = kfs * s.torsion_stress(ta, d, di), kfs * s.torsion_stress(tm, d, di)
    assert float(st_.alternating) == pytest.approx(float(s.von_mises(sa, ta_)), rel=1e-13)
    assert float(st_.midrange) == pytest.approx(float(s.von_mises(sm, tm_)), rel=1e-13)
    assert float(st_.maximum) == pytest.approx(float(s.von_mises(sa + sm, ta_ + tm_)), rel=1e-13)


def test_fatigue_factor_and_notch_sensitivity():
    assert float(s.fatigue_factor(2.0, 0.0)) == 1.0          # insensitive material: no notch effect
    assert float(s.fatigue_factor(2.0, 1.0)) == 2.0          # fully sensitive: Kf = Kt
    assert float(s.notch_sensitivity(1e-3, neuber=0.0)) == 1.0
    # Both forms give q = 1/2 where the root radius equals the material length (r = a).
    assert float(s.notch_sensitivity(4e-4, neuber=0.02)) == pytest.approx(0.5, rel=1e-15)
    assert float(s.notch_sensitivity(4e-4, peterson=4e-4)) == pytest.approx(0.5, rel=1e-15)


def test_endurance_limit_is_the_product_of_its_factors():
    e = s.marin_endurance_limit(900e6, "ground", 0.06, "torsion", 400.0, 0.999, kf=0.9)
    assert float(e.se_prime) == 450e6 and e.kc == 0.59
    product = float(e.ka * e.kb * e.kd * e.ke * e.kf) * e.kc * float(e.se_prime)
    assert float(e.se) == pytest.approx(product, rel=1e-14)
    assert float(s.size_factor(0.06, "axial")) == 1.0
    # Eq. 6-20 branches (d in mm): (d/7.62)^-0.107 up to 51 mm, 1.51 d^-0.157 above.
    assert float(s.size_factor(0.051)) == pytest.approx((51 / 7.62) ** -0.107, rel=1e-14)
    assert float(s.size_factor(0.1)) == pytest.approx(1.51 * 100**-0.157, rel=1e-14)


@pytest.mark.parametrize("criterion", CRITERIA)
def test_criteria_limiting_cases(criterion):
    se, sut, sy = 200e6, 800e6, 600e6
    # Fully reversed stress only: every criterion gives Se / sigma_a'.
    assert float(s.fatigue_safety_factor(50e6, 0.0, se, sut, sy, criterion)) == pytest.approx(4.0, rel=1e-14)
    # Steady stress only: Sut / sigma_m' (Goodman, Gerber) or Sy / sigma_m' (the others).
    strength = sut if criterion in ("goodman", "gerber") else sy
    got = float(s.fatigue_safety_factor(0.0, 100e6, se, sut, sy, criterion))
    assert got == pytest.approx(strength / 100e6, rel=1e-14)
    # An unloaded section: the one deliberate inf.
    assert math.isinf(float(s.fatigue_safety_factor(0.0, 0.0, se, sut, sy, criterion)))


# --- properties ---------------------------------------------------------------

stress = st.floats(1e5, 1e9)


@FAST
@given(sa=stress, sm=stress, k=st.floats(0.01, 100.0), criterion=st.sampled_from(CRITERIA))
def test_factor_is_homogeneous_and_falls_with_stress(sa, sm, k, criterion):
    se, sut, sy = 250e6, 900e6, 700e6
    n = float(s.fatigue_safety_factor(sa, sm, se, sut, sy, criterion))
    assert float(s.fatigue_safety_factor(k * sa, k * sm, se, sut, sy, criterion)) == pytest.approx(n / k, rel=1e-12)
    assert float(s.fatigue_safety_factor(sa * 1.01, sm, se, sut, sy, criterion)) < n
    assert float(s.fatigue_safety_factor(sa, sm * 1.01, se, sut, sy, criterion)) < n


@FAST
@given(sa=stress, sm=stress, sut=st.floats(300e6, 2e9), ry=st.floats(0.4, 1.0), re=st.floats(0.05, 0.7))
def test_criteria_nest(sa, sm, sut, ry, re):
    sy, se = ry * sut, re * sut
    n = {c: float(s.fatigue_safety_factor(sa, sm, se, sut, sy, c)) for c in CRITERIA}
    tol = 1 + 1e-12
    assert n["gerber"] * tol >= n["goodman"] >= n["soderberg"] / tol
    assert n["asme_elliptic"] * tol >= n["soderberg"]


@FAST
@given(d1=st.floats(0.01, 0.2), d2=st.floats(0.01, 0.2), criterion=st.sampled_from(CRITERIA))
def test_shaft_factor_rises_with_diameter(d1, d2, criterion):
    lo, hi = sorted((d1, d2))
    args = (300.0, 400.0, 1.8, 1.5, 250e6, 900e6, 700e6, criterion)
    assert float(s.shaft_fatigue_factor(lo, *args)) <= float(s.shaft_fatigue_factor(hi, *args))


@settings(max_examples=25, deadline=None)      # each example is a 64-step bisection
@given(n_t=st.floats(1.1, 5.0), ma=st.floats(1.0, 5e3), tm=st.floats(0.0, 5e3), ta=st.floats(0.0, 500.0),
       fm=st.floats(0.0, 5e4), bore_ratio=st.sampled_from([0.0, 0.5]), size=st.booleans(),
       criterion=st.sampled_from(CRITERIA))
def test_min_diameter_gives_the_target_back(n_t, ma, tm, ta, fm, bore_ratio, size, criterion):
    kf, kfs, sut, sy = 1.9, 1.6, 800e6, 600e6
    se = 0.4 * sut            # without kb when size=True
    try:
        d = float(shaftsize.min_shaft_diameter(n_t, ma, tm, kf, kfs, se, sut, sy, criterion, ta=ta, fm=fm,
                                       bore_ratio=bore_ratio, size_factor=size))
    except InputError as err:  # outside the size factor's 2.79 to 254 mm: the message says so
        assert size and "target" in err.path
        return
    se_d = se * float(s.size_factor(d)) if size else se
    n = float(s.shaft_fatigue_factor(d, ma, tm, kf, kfs, se_d, sut, sy, criterion, ta=ta, fm=fm,
                                     bore=bore_ratio * d))
    assert n == pytest.approx(n_t, rel=1e-9)


def test_min_diameter_broadcasts_like_a_loop():
    targets = np.array([1.5, 2.0, 3.0])
    ma = np.array([[100.0], [800.0]])                  # (2, 1) against (3,)
    got = shaftsize.min_shaft_diameter(targets, ma, 300.0, 1.7, 1.4, 200e6, 700e6, 500e6, "gerber")
    assert got.shape == (2, 3)
    for i in range(2):
        for j in range(3):
            one = shaftsize.min_shaft_diameter(targets[j], float(ma[i, 0]), 300.0, 1.7, 1.4, 200e6, 700e6, 500e6,
                                               "gerber")
            assert float(got[i, j]) == pytest.approx(float(one), rel=1e-15)
    n = s.shaft_fatigue_factor(np.array([0.02, 0.03]), ma, 300.0, 1.7, 1.4, 200e6, 700e6, 500e6, "asme_elliptic")
    for i in range(2):
        for j, d in enumerate((0.02, 0.03)):
            one = s.shaft_fatigue_factor(d, float(ma[i, 0]), 300.0, 1.7, 1.4, 200e6, 700e6, 500e6, "asme_elliptic")
            assert float(n[i, j]) == float(one)


# --- bad input ------------------------------------------------------------------

def test_bad_inputs_name_the_field_and_range():
    with pytest.raises(InputError) as err:
        s.fatigue_factor(0.9, 0.8, path="shafts[0].sections[2]")
    assert err.value.path == "shafts[0].sections[2].kt" and "below 1 is not possible" in str(err.value)
    with pytest.raises(InputError) as err:
        s.shaft_stresses(0.03, 10.0, 10.0, 1.5, 0.95)
    assert err.value.path == "kfs" and err.value.accepted == ">= 1"
    with pytest.raises(InputError) as err:
        s.bending_stress(10.0, 0.03, 0.03)
    assert err.value.path == "bore" and err.value.accepted == "0 <= bore < diameter"
    with pytest.raises(InputError) as err:
        s.endurance_limit(500e6, 400e6)
    assert err.value.path == "se_prime" and "contradicts the ultimate tensile strength" in str(err.value)
    with pytest.raises(InputError) as err:
        s.fatigue_safety_factor(1e6, 1e6, 100e6, 500e6, 600e6, "soderberg")
    assert err.value.path == "sy" and err.value.accepted.startswith("<=")
    with pytest.raises(InputError) as err:
        s.fatigue_safety_factor(1e6, 1e6, 100e6, 500e6, criterion="asme_elliptic")
    assert err.value.path == "sy" and "needs the yield strength" in str(err.value)
    with pytest.raises(InputError) as err:
        s.fatigue_safety_factor(1e6, 1e6, 100e6, 500e6, criterion="morrow")
    assert err.value.path == "criterion" and "goodman" in err.value.accepted
    with pytest.raises(InputError) as err:
        s.surface_factor(600e6, "polished")
    assert err.value.path == "finish"
    with pytest.raises(InputError) as err:
        s.size_factor(0.3)
    assert err.value.path == "diameter" and "Eq. 6-20" in err.value.accepted
    with pytest.raises(InputError) as err:
        s.temperature_factor(1000.0)
    assert err.value.path == "temperature"
    with pytest.raises(InputError) as err:
        s.reliability_factor(0.3)
    assert err.value.path == "reliability" and "Table 6-5" in err.value.accepted
    with pytest.raises(InputError) as err:
        s.neuber_constant_steel(2000e6)
    assert err.value.path == "sut" and "50 to 200 kpsi" in err.value.accepted
    with pytest.raises(InputError) as err:
        s.notch_sensitivity(1e-3)
    assert err.value.path == "notch_sensitivity"
    with pytest.raises(InputError) as err:
        s.notch_sensitivity(1e-3, neuber=0.01, peterson=1e-4)
    assert err.value.path == "notch_sensitivity"
    with pytest.raises(InputError) as err:
        shaftsize.min_shaft_diameter(2.0, 0.0, 0.0, 1.5, 1.3, 200e6, 700e6, path="s")
    assert "carries no load" in str(err.value)
    with pytest.raises(InputError) as err:
        shaftsize.min_shaft_diameter(2.0, 1e-4, 1e-4, 1.5, 1.3, 200e6, 700e6, size_factor=True)
    assert err.value.path == "target" and "already met" in str(err.value)
    with pytest.raises(InputError) as err:
        s.shaft_fatigue_factor(0.03, [10.0, float("nan")], 10.0, 1.5, 1.3, 200e6, 700e6)
    assert err.value.path == "ma" and "(at index 1)" in str(err.value)

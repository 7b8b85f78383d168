"""Bolt formulas: closed forms, limiting cases, properties, bad input.

The thread tables and property classes are checked against the standards in
tests/reference/test_fasteners_reference.py. Here:

* Closed forms: shear over the right area, the von Mises combination, the
  EN 1993-1-8 resistances, the preloaded-joint tension (Shigley 9th Eq.
  8-24) on both sides of separation.
* Inverse: the proof-load factor n_L (Eq. 8-28) brings the bolt exactly to
  its proof load when the external load is multiplied by it.
* Properties (hypothesis): the stress area lies between the root area and
  the shank area and grows with d, falls with P; bolt tension never falls
  as the external load grows; one broadcast call equals the loop.
* Bad input: InputError naming the field and the accepted range.

Tolerances 1e-12 relative: every check is a few floating-point operations.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadscope.errors import InputError
from loadscope.kernel import fasteners as f

FAST = settings(max_examples=60, deadline=None)
MM = 1e-3


@FAST
@given(d=st.floats(1.6e-3, 0.1), ratio=st.floats(0.02, 0.2), form=st.sampled_from(["metric", "unified"]))
def test_thread_areas_nest(d, ratio, form):
    p = ratio * d
    a_s = float(f.tensile_stress_area(d, p, form))
    a_r = float(f.minor_diameter_area(d, p, form))
    assert a_r < a_s < math.pi / 4 * d**2
    assert float(f.tensile_stress_area(d * 1.01, p, form)) > a_s
    assert float(f.tensile_stress_area(d, p * 1.01, form)) < a_s


def test_shear_stress_areas():
    d, p, v = 0.016, 2e-3, 12e3
    assert float(f.bolt_shear_stress(v, d, p, "shank")) == pytest.approx(v / (math.pi / 4 * d**2), rel=1e-14)
    assert float(f.bolt_shear_stress(-v, d, p)) == pytest.approx(v / float(f.minor_diameter_area(d, p)), rel=1e-14)
    assert float(f.bolt_shear_stress(v, d, p, thread_area="stress")) == pytest.approx(
        v / float(f.tensile_stress_area(d, p)), rel=1e-14)


def test_bolt_tension_closed_form():
    fi, c = 20e3, 0.3
    # Joint closed: F_b = F_i + C P (Shigley 9th Eq. 8-24).
    assert float(f.bolt_tension(10e3, fi, c)) == pytest.approx(fi + c * 10e3, rel=1e-14)
    # Separation at P0 = F_i / (1 - C): both branches meet there.
    p0 = fi / (1 - c)
    assert float(f.bolt_tension(p0, fi, c)) == pytest.approx(p0, rel=1e-14)
    assert float(f.bolt_tension(2 * p0, fi, c)) == pytest.approx(2 * p0, rel=1e-14)
    # A compressive external load unloads the bolt by C |P| while the joint is closed, never below zero.
    assert float(f.bolt_tension(-5e3, fi, c)) == pytest.approx(fi - c * 5e3, rel=1e-14)
    assert float(f.bolt_tension(-5e3, 0.0, c)) == 0.0


@FAST
@given(p1=st.floats(-1e5, 1e5), p2=st.floats(-1e5, 1e5), fi=st.floats(0.0, 1e5), c=st.floats(0.0, 1.0))
def test_bolt_tension_never_falls_as_the_load_grows(p1, p2, fi, c):
    lo, hi = sorted((p1, p2))
    assert float(f.bolt_tension(lo, fi, c)) <= float(f.bolt_tension(hi, fi, c))


def test_bolt_check_closed_form():
    strength = f.iso_property_class("10.9", 0.016)
    d, p = 0.016, 2e-3
    c = f.bolt_check(40e3, 8e3, d, p, strength, plane="shank")
    sigma = 40e3 / float(f.tensile_stress_area(d, p))
    tau = 8e3 / (math.pi / 4 * d**2)
    vm = math.sqrt(sigma**2 + 3 * tau**2)
    assert float(c.von_mises) == pytest.approx(vm, rel=1e-14)
    assert float(c.proof_factor) == pytest.approx(830e6 / vm, rel=1e-14)
    assert float(c.yield_factor) == pytest.approx(940e6 / vm, rel=1e-14)
    assert float(c.tensile_factor) == pytest.approx(1040e6 / vm, rel=1e-14)
    # Compression does not load the thread in tension; an unloaded bolt has infinite factors.
    assert float(f.bolt_check(-10e3, 0.0, d, p, strength).tensile_stress) == 0.0
    assert math.isinf(float(f.bolt_check(0.0, 0.0, d, p, strength).proof_factor))


@FAST
@given(p=st.floats(100.0, 1e5), fi_share=st.floats(0.0, 0.9), c=st.floats(0.05, 1.0))
def test_proof_load_factor_round_trip(p, fi_share, c):
    # n_L = (Sp As - F_i) / (C P): at n_L P the closed joint's bolt is at its proof load.
    strength = f.iso_property_class("8.8", 0.012)
    a_s = float(f.tensile_stress_area(0.012, 1.75e-3))
    fi = fi_share * strength.proof * a_s
    n = float(f.proof_load_factor(strength, a_s, p, fi, c))
    assert fi + c * n * p == pytest.approx(strength.proof * a_s, rel=1e-12)


def test_en1993_closed_form():
    d, p = 0.020, 2.5e-3
    a_s = float(f.tensile_stress_area(d, p))
    u = f.en1993_bolt_utilisation(30e3, 20e3, d, p, "10.9", gamma_m2=1.25)
    assert float(u.shear_resistance) == pytest.approx(0.5 * 1000e6 * a_s / 1.25, rel=1e-14)
    assert float(u.tension_resistance) == pytest.approx(0.9 * 1000e6 * a_s / 1.25, rel=1e-14)
    assert float(u.combined) == pytest.approx(float(u.shear) + float(u.tension) / 1.4, rel=1e-14)
    shank = f.en1993_bolt_utilisation(0.0, 20e3, d, p, "10.9", plane="shank")
    assert float(shank.shear_resistance) == pytest.approx(0.6 * 1000e6 * math.pi / 4 * d**2 / 1.25, rel=1e-14)


def test_broadcast_equals_loop():
    d = np.array([8e-3, 12e-3, 20e-3])
    p = np.array([1.25e-3, 1.75e-3, 2.5e-3])
    shear = np.array([[1e3], [5e3]])                 # (2, 1) against (3,)
    strength = f.iso_property_class("8.8", 0.012)
    c = f.bolt_check(10e3, shear, d, p, strength)
    assert c.von_mises.shape == (2, 3)
    for i in range(2):
        for j in range(3):
            one = f.bolt_check(10e3, float(shear[i, 0]), d[j], p[j], strength)
            assert float(c.von_mises[i, j]) == float(one.von_mises)
            assert float(c.proof_factor[i, j]) == float(one.proof_factor)


def test_table_boundaries():
    # 8.8 changes rows above M16; 9.8 stops at M16; SAE grade 5 changes above 1 in.
    assert f.iso_property_class("8.8", 0.016).tensile == 800e6
    assert f.iso_property_class("8.8", 0.018).tensile == 830e6
    assert f.sae_grade("5", 1.0 * f.INCH).proof == pytest.approx(85 * f.KPSI, rel=1e-14)
    assert f.sae_grade("5", 1.125 * f.INCH).proof == pytest.approx(74 * f.KPSI, rel=1e-14)


def test_bad_inputs_name_the_field_and_range():
    with pytest.raises(InputError) as err:
        f.iso_property_class("9.8", 0.020, path="bolts[0]")
    assert err.value.path == "bolts[0].diameter" and err.value.accepted == "<= 16 mm"
    with pytest.raises(InputError) as err:
        f.iso_property_class("8.8", 0.048)
    assert err.value.path == "diameter" and "M1.6 to M39" in err.value.accepted
    with pytest.raises(InputError) as err:
        f.iso_property_class("11.9", 0.012)
    assert err.value.path == "property_class" and "12.9" in err.value.accepted
    with pytest.raises(InputError) as err:
        f.sae_grade("7", 0.5 * f.INCH)
    assert err.value.path == "grade"
    with pytest.raises(InputError) as err:
        f.sae_grade("5", 2.0 * f.INCH)
    assert err.value.path == "diameter" and "1/4 to 1 1/2 in" in err.value.accepted
    with pytest.raises(InputError) as err:
        f.metric_coarse_pitch(0.013)
    assert "M13 is not a tabulated coarse-thread size" in str(err.value) and "M12" in err.value.accepted
    with pytest.raises(InputError) as err:
        f.unc_pitch(0.3 * f.INCH)
    assert "not a tabulated UNC size" in str(err.value)
    with pytest.raises(InputError) as err:
        f.tensile_stress_area(0.006, 5e-3)
    assert err.value.path == "pitch" and "leaves no thread core" in str(err.value)
    with pytest.raises(InputError) as err:
        f.tensile_stress_area(0.006, 1e-3, form="whitworth")
    assert err.value.path == "form"
    with pytest.raises(InputError) as err:
        f.bolt_tension(1e3, -1.0)
    assert err.value.path == "preload"
    with pytest.raises(InputError) as err:
        f.bolt_tension(1e3, 0.0, 1.5)
    assert err.value.path == "stiffness_fraction"
    strength = f.iso_property_class("8.8", 0.012)
    with pytest.raises(InputError) as err:
        f.proof_load_factor(strength, 84.3e-6, 1e3, 60e3)
    assert err.value.path == "preload" and "reaches the proof load" in str(err.value)
    with pytest.raises(InputError) as err:
        f.bolt_shear_stress(1e3, 0.012, 1.75e-3, plane="head")
    assert err.value.path == "plane"
    with pytest.raises(InputError) as err:
        f.en1993_bolt_utilisation(1e3, 1e3, 0.012, 1.75e-3, "12.9")
    assert err.value.path == "property_class"

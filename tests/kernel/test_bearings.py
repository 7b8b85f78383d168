"""Checks of loadscope.kernel.bearings against ISO 281 and closed forms.

Oracles, by kind:

* ISO 281:2007 Table 3 (X, Y, e of single-row deep-groove ball bearings) and
  Table 12 (a1): the tabulated values, recalled from memory and checked here
  for internal consistency (P continuous at Fa/Fr = e; the old Fa/C0 column
  of ISO 281:1990 is the new one divided by f0 = 12.3; a1 follows the
  Weibull form behind the table to its printed digits).
* Closed forms: L10 = (C/P)^p, hours = 10^6 L / (60 n) with n in rpm.
* Inverses and properties (hypothesis): minimum C gives the target life
  back; a one-case duty cycle gives the single-case life; Palmgren-Miner
  equals the life at the cycle's equivalent load; a bearing pair balances
  the thrust.

Tolerances: 1e-12 relative where the computation is a few floating-point
operations (round-trips of powers), exact where the code copies a table.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadscope.errors import InputError
from loadscope.kernel import bearings as b

RPM = 2.0 * math.pi / 60.0
FAST = settings(max_examples=60, deadline=None)

# ISO 281:2007 Table 3, single-row radial-contact ball bearings (from memory):
# f0*Fa/C0, e, Y for Fa/Fr > e; X = 0.56 there.
ISO281_TABLE3 = [
    (0.172, 0.19, 2.30), (0.345, 0.22, 1.99), (0.689, 0.26, 1.71), (1.03, 0.28, 1.55), (1.38, 0.30, 1.45),
    (2.07, 0.34, 1.31), (3.45, 0.38, 1.15), (5.17, 0.42, 1.04), (6.89, 0.44, 1.00),
]
# ISO 281:1990 Table 3 relative axial load Fa/C0 for the same rows (from memory).
ISO281_1990_FA_C0 = [0.014, 0.028, 0.056, 0.084, 0.11, 0.17, 0.28, 0.42, 0.56]
# ISO 281:2007 Table 12, reliability % -> a1 (from memory).
ISO281_TABLE12 = [
    (90, 1.0), (95, 0.64), (96, 0.55), (97, 0.47), (98, 0.37), (99, 0.25), (99.2, 0.22), (99.4, 0.19),
    (99.6, 0.16), (99.8, 0.12), (99.9, 0.093), (99.92, 0.087), (99.94, 0.080), (99.95, 0.077),
]


# --- ISO 281 Table 3 -------------------------------------------------------

@pytest.mark.parametrize("rel, e, y", ISO281_TABLE3)
def test_deep_groove_table_rows(rel, e, y):
    # ISO 281:2007 Table 3 (from memory): each row comes back exactly.
    ev, xv, yv = b.deep_groove_factors(rel)
    assert float(ev) == pytest.approx(e, abs=1e-12)
    assert float(xv) == 0.56
    assert float(yv) == pytest.approx(y, abs=1e-12)


def test_deep_groove_table_is_consistent():
    # e is where the two branches meet, X + Y e = 1, to the table's rounding
    # (ISO 281 defines e so P does not jump); a typo in a row would break it.
    for _, e, y in ISO281_TABLE3:
        assert abs(0.56 + y * e - 1.0) < 0.01
    # The 2007 column is the 1990 Fa/C0 column times f0 = 12.3 (bearings.py docstring).
    for (rel, _, _), old in zip(ISO281_TABLE3, ISO281_1990_FA_C0):
        assert rel / 12.3 == pytest.approx(old, abs=0.005)


def test_deep_groove_interpolates_linearly_between_rows():
    # ISO 281:2007 Table 3: linear interpolation for intermediate values.
    for (r0, e0, y0), (r1, e1, y1) in zip(ISO281_TABLE3, ISO281_TABLE3[1:]):
        for t in (0.25, 0.5, 0.9):
            ev, _, yv = b.deep_groove_factors(r0 + t * (r1 - r0))
            assert float(ev) == pytest.approx(e0 + t * (e1 - e0), rel=1e-12)
            assert float(yv) == pytest.approx(y0 + t * (y1 - y0), rel=1e-12)


def test_deep_groove_equivalent_load_branches():
    c0, f0 = 20e3, 14.0
    # Fa/Fr below e: P = Fr (X = 1, Y = 0).
    fa = 0.172 * c0 / f0                                  # first row exactly, e = 0.19
    assert float(b.deep_groove_equivalent_load(fa / 0.15, fa, c0, f0)) == pytest.approx(fa / 0.15)
    # Above e: P = 0.56 Fr + Y Fa with the row's Y.
    fr = fa / 0.5
    assert float(b.deep_groove_equivalent_load(fr, fa, c0, f0)) == pytest.approx(0.56 * fr + 2.30 * fa)
    # Pure radial load needs no table, whatever C0.
    assert float(b.deep_groove_equivalent_load(3000.0, 0.0, c0, f0)) == 3000.0
    # Vectorised: one call equals the element-wise calls.
    frs = np.array([1000.0, 2000.0, 4000.0])
    fas = np.array([1500.0, 400.0, 0.0])
    one = b.deep_groove_equivalent_load(frs, fas, c0, f0)
    assert np.allclose(one, [b.deep_groove_equivalent_load(x, y, c0, f0) for x, y in zip(frs, fas)], rtol=1e-15)


def test_deep_groove_table_limits_enforced():
    with pytest.raises(InputError) as err:
        b.deep_groove_factors(7.5)
    assert err.value.path == "relative_axial"
    assert "0.172 <= value <= 6.89" in str(err.value)
    with pytest.raises(InputError) as err:
        b.deep_groove_equivalent_load(1000.0, 100.0, 30e3, 14.0, path="bearings[2]")   # f0 Fa/C0 = 0.047
    assert err.value.path == "bearings[2].f0*axial/static_rating"
    assert "got 0.0466667" in str(err.value) and "0.172" in err.value.accepted
    # clamp=True takes the nearest row (common practice, not ISO 281).
    e, _, y = b.deep_groove_factors(0.05, clamp=True)
    assert (float(e), float(y)) == (0.19, 2.30)


# --- user-given X, Y, e ----------------------------------------------------

def test_equivalent_load_user_factors():
    # A tapered roller bearing (X = 0.4, Y = 1.6, e = 0.37, catalogue form).
    assert float(b.equivalent_load(5000.0, 1000.0, 0.4, 1.6, 0.37)) == 5000.0
    assert float(b.equivalent_load(5000.0, 2000.0, 0.4, 1.6, 0.37)) == pytest.approx(0.4 * 5000 + 1.6 * 2000)
    # Double-row style low branch: X1 = 1, Y1 = 0.92.
    assert float(b.equivalent_load(5000.0, 500.0, 0.67, 1.41, 0.37, 1.0, 0.92)) == pytest.approx(5000 + 0.92 * 500)
    # Without e the high branch always applies; the sign of Fa does not matter.
    assert float(b.equivalent_load(100.0, -50.0, 1.0, 2.0)) == 200.0


# --- life ------------------------------------------------------------------

def test_basic_rating_life_closed_form():
    # ISO 281:2007, 7.1: L10 = (C/P)^3 ball, (C/P)^(10/3) roller.
    assert float(b.basic_rating_life(10.0, 1.0)) == pytest.approx(1000.0, rel=1e-15)
    assert float(b.basic_rating_life(10.0, 1.0, "roller")) == pytest.approx(10.0 ** (10.0 / 3.0), rel=1e-15)
    # The one deliberate inf: an unloaded bearing.
    assert math.isinf(float(b.basic_rating_life(10e3, 0.0)))


def test_life_hours_closed_form():
    # L10h = 10^6 L10 / (60 n), n in rpm (the trade's usual conversion).
    assert float(b.life_hours(1000.0, 1500.0 * RPM)) == pytest.approx(1e9 / (60 * 1500), rel=1e-14)
    assert float(b.life_hours(1000.0, -1500.0 * RPM)) == pytest.approx(1e9 / (60 * 1500), rel=1e-14)
    assert float(b.revolutions(float(b.life_hours(777.0, 33.0)), 33.0)) == pytest.approx(777.0, rel=1e-14)


@pytest.mark.parametrize("pct, a1", ISO281_TABLE12)
def test_a1_table(pct, a1):
    # ISO 281:2007 Table 12 (from memory).
    assert float(b.reliability_factor(pct / 100.0)) == a1


@pytest.mark.parametrize("pct, a1", ISO281_TABLE12)
def test_a1_weibull_form_reproduces_table(pct, a1):
    # The Weibull form (slope 1.5, floor 0.05) gives every row to its printed digits.
    got = float(b.reliability_factor(pct / 100.0, method="weibull"))
    digits = 3 if a1 < 0.1 else 2
    assert round(got, digits) == pytest.approx(a1, abs=1e-12)


def test_a1_bad_inputs():
    with pytest.raises(InputError) as err:
        b.reliability_factor(0.985)
    assert "not a reliability of ISO 281:2007 Table 12" in str(err.value) and "0.99" in err.value.accepted
    with pytest.raises(InputError) as err:
        b.reliability_factor(0.8, path="bearings[0]")
    assert err.value.path == "bearings[0].reliability"
    assert "0.9 <= value <= 0.9995" in err.value.accepted


def test_modified_life():
    # ISO 281:2007, 9.1: Lnm = a1 a_ISO L10.
    assert float(b.modified_rating_life(30e3, 3e3, reliability=0.99, a_iso=2.0)) == pytest.approx(0.25 * 2 * 1000)


@FAST
@given(c=st.floats(1e3, 1e6), ratio=st.floats(1.05, 50.0), kind=st.sampled_from(["ball", "roller"]),
       pct=st.sampled_from([r for r, _ in ISO281_TABLE12]), a_iso=st.floats(0.1, 50.0))
def test_min_rating_round_trip(c, ratio, kind, pct, a_iso):
    # The inverse gives the rating back, and the life at the minimum C is the target.
    p = c / ratio
    life = b.modified_rating_life(c, p, kind, pct / 100.0, a_iso)
    assert float(b.required_dynamic_rating(p, life, kind, pct / 100.0, a_iso)) == pytest.approx(c, rel=1e-12)
    target = 1234.5
    c_min = b.required_dynamic_rating(p, target, kind, pct / 100.0, a_iso)
    assert float(b.modified_rating_life(c_min, p, kind, pct / 100.0, a_iso)) == pytest.approx(target, rel=1e-12)


# --- duty cycles -----------------------------------------------------------

@FAST
@given(c=st.floats(5e3, 5e5), p=st.floats(100.0, 5e3), w=st.floats(1.0, 500.0),
       kind=st.sampled_from(["ball", "roller"]), pct=st.sampled_from([90, 95, 99, 99.95]))
def test_duty_cycle_of_one_case_is_the_single_case_life(c, p, w, kind, pct):
    r = b.duty_cycle_life(c, [p], [w], [1.0], kind, pct / 100.0)
    single = b.modified_rating_life(c, p, kind, pct / 100.0)
    assert float(r.life) == pytest.approx(float(single), rel=1e-12)
    assert float(r.hours) == pytest.approx(float(b.life_hours(single, w)), rel=1e-12)
    assert float(r.equivalent_load) == pytest.approx(p, rel=1e-12)


@FAST
@given(loads=st.lists(st.floats(0.0, 1e4), min_size=2, max_size=5), data=st.data(),
       kind=st.sampled_from(["ball", "roller"]))
def test_miner_equals_equivalent_load_life(loads, data, kind):
    n = len(loads)
    speeds = data.draw(st.lists(st.floats(0.5, 400.0), min_size=n, max_size=n))
    raw = data.draw(st.lists(st.floats(0.01, 1.0), min_size=n, max_size=n))
    shares = np.array(raw) / sum(raw)
    c = 5e4
    r = b.duty_cycle_life(c, loads, speeds, shares, kind)
    p_eq = b.duty_cycle_equivalent_load(loads, speeds, shares, kind)
    assert float(r.equivalent_load) == pytest.approx(float(p_eq), rel=1e-12)
    if float(p_eq) == 0.0:
        assert math.isinf(float(r.life))
        return
    assert float(r.life) == pytest.approx(float(b.basic_rating_life(c, p_eq, kind)), rel=1e-10)
    # Hours: 1/Lh = sum q_i / Lh_i (Miner in time) gives the same.
    lh = b.life_hours(b.basic_rating_life(c, np.array(loads), kind), np.array(speeds))
    inv = float(np.sum(np.where(np.isinf(lh), 0.0, shares / np.where(np.isinf(lh), 1.0, lh))))
    assert float(r.hours) == pytest.approx(1.0 / inv, rel=1e-10)
    assert float(np.sum(r.damage_share)) == pytest.approx(1.0, rel=1e-12)


def test_duty_cycle_splitting_a_case_changes_nothing():
    one = b.duty_cycle_life(3e4, [2000.0, 800.0], [100.0, 50.0], [0.4, 0.6])
    two = b.duty_cycle_life(3e4, [2000.0, 2000.0, 800.0], [100.0, 100.0, 50.0], [0.1, 0.3, 0.6])
    assert float(two.life) == pytest.approx(float(one.life), rel=1e-13)
    assert float(two.hours) == pytest.approx(float(one.hours), rel=1e-13)


def test_duty_cycle_vectorised_over_variants():
    loads = np.array([[2000.0, 800.0], [1500.0, 900.0], [100.0, 5000.0]])
    speeds = np.array([100.0, 50.0])
    shares = np.array([0.3, 0.7])
    c = np.array([3e4, 4e4, 5e4])
    r = b.duty_cycle_life(c, loads, speeds, shares)
    for i in range(3):
        ri = b.duty_cycle_life(c[i], loads[i], speeds, shares)
        assert float(r.life[i]) == pytest.approx(float(ri.life), rel=1e-14)
        assert float(r.hours[i]) == pytest.approx(float(ri.hours), rel=1e-14)


def test_duty_cycle_bad_inputs():
    with pytest.raises(InputError) as err:
        b.duty_cycle_life(3e4, [1000.0, 500.0], [10.0, 10.0], [0.5, 0.4], path="cycle")
    assert err.value.path == "cycle.shares" and "must add up to 1, got 0.9" in str(err.value)
    with pytest.raises(InputError) as err:
        b.duty_cycle_life(3e4, [1000.0, 500.0], [0.0, 0.0], [0.5, 0.5])
    assert "no revolutions" in str(err.value)
    with pytest.raises(InputError) as err:
        b.duty_cycle_equivalent_load([1000.0, -5.0], [10.0, 10.0], [0.5, 0.5])
    assert err.value.path == "loads" and "got -5 N (at index 1)" in str(err.value)


# --- support loads and bearing pairs ---------------------------------------

@FAST
@given(r=st.lists(st.floats(-1e4, 1e4), min_size=3, max_size=3),
       a=st.lists(st.floats(-1.0, 1.0), min_size=3, max_size=3).filter(lambda v: np.linalg.norm(v) > 0.1))
def test_support_loads_split_the_reaction(r, a):
    fr, fa = b.support_loads(r, a)
    assert float(fr) ** 2 + float(fa) ** 2 == pytest.approx(float(np.dot(r, r)), rel=1e-9, abs=1e-6)
    assert float(fa) == pytest.approx(float(np.dot(r, a) / np.linalg.norm(a)), rel=1e-12, abs=1e-9)


# Catalogue case table for paired tapered-roller / angular-contact bearings
# (SKF and Schaeffler general catalogues, from memory). Bearing B takes the
# external thrust Ka, A is the other; Fi = 0.5 Fr / Y. Each row:
# (Fi_A, Fi_B, Ka, Fa_A, Fa_B).
CATALOGUE_CASES = [
    (2000.0, 1000.0, 300.0, 2000.0, 2300.0),   # 1a: Fi_A >= Fi_B, Ka >= 0 -> Fa_A = Fi_A, Fa_B = Fa_A + Ka
    (1000.0, 2000.0, 1500.0, 1000.0, 2500.0),  # 1b: Fi_A < Fi_B, Ka >= Fi_B - Fi_A -> same as 1a
    (1000.0, 2000.0, 400.0, 1600.0, 2000.0),   # 1c: Fi_A < Fi_B, Ka < Fi_B - Fi_A -> Fa_B = Fi_B, Fa_A = Fa_B - Ka
    (1500.0, 1500.0, 0.0, 1500.0, 1500.0),     # no thrust, equal bearings
]


@pytest.mark.parametrize("fi_a, fi_b, ka, fa_a, fa_b", CATALOGUE_CASES)
@pytest.mark.parametrize("arrangement", ["X", "O"])
def test_pair_catalogue_cases(fi_a, fi_b, ka, fa_a, fa_b, arrangement):
    # In O bearing 1 (left) stops the shaft moving right (+axis); in X bearing 2 does.
    # Thrust toward +axis: B is bearing 1 in O, bearing 2 in X; and the mirror
    # case (thrust toward -axis) swaps them (cases 2a-2c of the catalogues).
    for sign in (1.0, -1.0):
        b_is_1 = (arrangement == "O") == (sign > 0)
        fi1, fi2 = (fi_b, fi_a) if b_is_1 else (fi_a, fi_b)
        r = b.paired_axial_loads(fi1, fi2, sign * ka, arrangement)
        got_b, got_a = (r.axial_1, r.axial_2) if b_is_1 else (r.axial_2, r.axial_1)
        assert (float(got_a), float(got_b)) == pytest.approx((fa_a, fa_b), abs=1e-9)
        assert float(r.reaction_1 + r.reaction_2 + sign * ka) == pytest.approx(0.0, abs=1e-9)


@FAST
@given(fi1=st.floats(0.0, 1e4), fi2=st.floats(0.0, 1e4), k=st.floats(-2e4, 2e4),
       arrangement=st.sampled_from(["X", "O", "face_to_face", "back_to_back"]))
def test_pair_properties(fi1, fi2, k, arrangement):
    r = b.paired_axial_loads(fi1, fi2, k, arrangement)
    # Statics: the two bearings balance the thrust.
    assert float(r.reaction_1 + r.reaction_2 + k) == pytest.approx(0.0, abs=1e-9 * (1 + abs(k) + fi1 + fi2))
    # Each carries at least its own induced force; the held one exactly that.
    assert float(r.axial_1) >= fi1 - 1e-9 and float(r.axial_2) >= fi2 - 1e-9
    held = float(r.axial_1) if int(r.held) == 1 else float(r.axial_2)
    assert held == pytest.approx(fi1 if int(r.held) == 1 else fi2, abs=1e-9)
    # A bearing pushes the shaft only the way its arrangement lets it.
    d1 = 1.0 if arrangement in ("O", "back_to_back") else -1.0
    assert float(r.reaction_1) * d1 <= 1e-12 and float(r.reaction_2) * -d1 <= 1e-12


def test_induced_loads():
    # 0.5 Fr / Y (catalogue method) and 0.47 Fr / K (Timken form); R Fr for angular contact.
    assert float(b.tapered_roller_induced_load(6000.0, 1.5)) == pytest.approx(2000.0)
    assert float(b.tapered_roller_induced_load(6000.0, 1.5, factor=0.47)) == pytest.approx(1880.0)
    assert float(b.angular_contact_induced_load(1000.0)) == pytest.approx(1140.0)


# --- bad input -------------------------------------------------------------

def test_bad_inputs_name_the_field_and_range():
    with pytest.raises(InputError) as err:
        b.basic_rating_life(0.0, 100.0, path="shafts[0].supports[1]")
    assert str(err.value) == "shafts[0].supports[1].rating: must be positive, got 0 N (accepted: > 0 N)"
    with pytest.raises(InputError) as err:
        b.basic_rating_life(1e4, -1.0)
    assert str(err.value) == "load: must not be negative, got -1 N (accepted: >= 0 N)"
    with pytest.raises(InputError) as err:
        b.required_dynamic_rating(1000.0, 0.0)
    assert err.value.path == "target_life" and err.value.accepted == "> 0 10^6 rev"
    with pytest.raises(InputError) as err:
        b.basic_rating_life(1e4, 100.0, kind="needle")
    assert err.value.path == "kind" and err.value.accepted == "ball, roller"
    with pytest.raises(InputError) as err:
        b.life_hours(100.0, 0.0)
    assert "at rest" in str(err.value)
    with pytest.raises(InputError) as err:
        b.basic_rating_life([1e4, float("nan")], 100.0)
    assert "must be finite, got nan (at index 1)" in str(err.value)
    with pytest.raises(InputError) as err:
        b.paired_axial_loads(1.0, 1.0, 0.0, "tandem")
    assert err.value.path == "arrangement"
    with pytest.raises(InputError) as err:
        b.deep_groove_equivalent_load(1000.0, 500.0, -3.0, 14.0)
    assert err.value.path == "static_rating"

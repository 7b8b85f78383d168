"""Checks of loadscope.kernel.bearings against ISO 281 and closed forms.

Oracles, by kind:

* The tables of ISO 281 (Table 3, Table 12) and the textbook examples are
  checked in tests/reference/test_bearings_reference.py.
* Closed forms: hours = 10^6 L / (60 n) with n in rpm; P = X Fr + Y Fa.
* Inverses and properties (hypothesis): minimum C gives the target life
  back; a one-case duty cycle gives the single-case life; Palmgren-Miner
  equals the life at the cycle's equivalent load; a bearing pair balances
  the thrust; life falls with load and rises with rating, a1 falls with
  reliability; one broadcast call equals the loop over its elements.

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

RELIABILITIES = sorted(b.A1_TABLE)                # the rows of ISO 281:2007 Table 12

# --- deep-groove equivalent load (the table itself: tests/reference) --------

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

def test_life_hours_closed_form():
    # L10h = 10^6 L10 / (60 n), n in rpm (the trade's usual conversion).
    assert float(b.life_hours(1000.0, 1500.0 * RPM)) == pytest.approx(1e9 / (60 * 1500), rel=1e-14)
    assert float(b.life_hours(1000.0, -1500.0 * RPM)) == pytest.approx(1e9 / (60 * 1500), rel=1e-14)
    assert float(b.revolutions(float(b.life_hours(777.0, 33.0)), 33.0)) == pytest.approx(777.0, rel=1e-14)


def test_a1_bad_inputs():
    with pytest.raises(InputError) as err:
        b.reliability_factor(0.985)
    assert "not a reliability of ISO 281:2007 Table 12" in str(err.value) and "0.99" in err.value.accepted
    with pytest.raises(InputError) as err:
        b.reliability_factor(0.8, path="bearings[0]")
    assert err.value.path == "bearings[0].reliability"
    assert "0.9 <= value <= 0.9995" in err.value.accepted


@FAST
@given(c=st.floats(1e3, 1e6), ratio=st.floats(1.05, 50.0), kind=st.sampled_from(["ball", "roller"]),
       r=st.sampled_from(RELIABILITIES), a_iso=st.floats(0.1, 50.0))
def test_min_rating_round_trip(c, ratio, kind, r, a_iso):
    # The inverse gives the rating back, and the life at the minimum C is the target.
    p = c / ratio
    life = b.modified_rating_life(c, p, kind, r, a_iso)
    assert float(b.required_dynamic_rating(p, life, kind, r, a_iso)) == pytest.approx(c, rel=1e-12)
    target = 1234.5
    c_min = b.required_dynamic_rating(p, target, kind, r, a_iso)
    assert float(b.modified_rating_life(c_min, p, kind, r, a_iso)) == pytest.approx(target, rel=1e-12)


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
# A case carries no load or at least a millinewton: (C/P)^p of a vanishing load overflows
# to inf, and Miner's sum of reciprocals cannot take it (common practice: a bearing
# load below 1 mN is no load at all).
@given(loads=st.lists(st.one_of(st.just(0.0), st.floats(1e-3, 1e4)), min_size=2, max_size=5), data=st.data(),
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


# --- monotonicity and broadcasting (hypothesis) -----------------------------

@FAST
@given(c=st.floats(1e3, 1e6), p1=st.floats(10.0, 1e5), p2=st.floats(10.0, 1e5),
       kind=st.sampled_from(["ball", "roller"]))
def test_life_falls_with_load_and_rises_with_rating(c, p1, p2, kind):
    lo, hi = sorted((p1, p2))
    assert float(b.basic_rating_life(c, lo, kind)) >= float(b.basic_rating_life(c, hi, kind))
    assert float(b.basic_rating_life(c * 1.01, lo, kind)) > float(b.basic_rating_life(c, lo, kind))
    # Homogeneous of degree zero in (C, P): the life depends on C/P only.
    assert float(b.basic_rating_life(3.0 * c, 3.0 * lo, kind)) == pytest.approx(
        float(b.basic_rating_life(c, lo, kind)), rel=1e-12)


@FAST
@given(r1=st.floats(0.90, 0.9995), r2=st.floats(0.90, 0.9995))
def test_a1_falls_with_reliability(r1, r2):
    lo, hi = sorted((r1, r2))
    assert float(b.reliability_factor(lo, "weibull")) >= float(b.reliability_factor(hi, "weibull"))


def test_a1_table_falls_with_reliability():
    a1 = [b.A1_TABLE[r] for r in RELIABILITIES]
    assert all(x > y for x, y in zip(a1, a1[1:]))
    assert float(b.reliability_factor(0.9, "weibull")) == pytest.approx(1.0, rel=1e-15)


@FAST
@given(r1=st.floats(0.172, 6.89), r2=st.floats(0.172, 6.89))
def test_deep_groove_factors_are_monotone(r1, r2):
    # Table 3: e rises and Y falls with the relative axial load.
    lo, hi = sorted((r1, r2))
    (e_lo, _, y_lo), (e_hi, _, y_hi) = b.deep_groove_factors(lo), b.deep_groove_factors(hi)
    assert float(e_lo) <= float(e_hi) and float(y_lo) >= float(y_hi)


@FAST
@given(fr=st.floats(100.0, 2e4), fa1=st.floats(0.0, 1.5e4), fa2=st.floats(0.0, 1.5e4))
def test_deep_groove_load_rises_with_axial_load(fr, fa1, fa2):
    # P never falls as Fa grows, except at the switch Fa/Fr = e where the table's
    # rounding lets X + Y e differ from 1 by up to 0.01 (see the reference tests).
    c0, f0 = 20e3, 14.0
    lo, hi = sorted((fa1, fa2))
    p_lo = float(b.deep_groove_equivalent_load(fr, lo, c0, f0, clamp=True))
    p_hi = float(b.deep_groove_equivalent_load(fr, hi, c0, f0, clamp=True))
    assert p_hi >= p_lo - 0.01 * fr
    assert p_lo >= fr * (1.0 - 0.01)                  # P >= Fr but for the same table rounding at the switch


def test_life_functions_broadcast_like_a_loop():
    c = np.array([[2e4], [3e4], [5e4]])                 # (3, 1) against (4,)
    p = np.array([1e3, 2.5e3, 4e3, 0.0])
    r = np.array([0.9, 0.95, 0.99, 0.999])
    life = b.modified_rating_life(c, p, "roller", r, 2.0)
    need = b.required_dynamic_rating(p[:3], np.array([100.0, 200.0, 300.0]), "ball", 0.995, method="weibull")
    hours = b.life_hours(life, np.array([10.0, 20.0, 30.0, 40.0]))
    assert life.shape == hours.shape == (3, 4)
    for i in range(3):
        for j in range(4):
            one = b.modified_rating_life(float(c[i, 0]), p[j], "roller", r[j], 2.0)
            assert float(life[i, j]) == float(one)
            assert float(hours[i, j]) == float(b.life_hours(one, 10.0 * (j + 1)))
    for j in range(3):
        one = b.required_dynamic_rating(p[j], 100.0 * (j + 1), "ball", 0.995, method="weibull")
        assert float(need[j]) == float(one)
    # An unloaded bearing's infinite life passes through the hours unchanged.
    assert np.all(np.isinf(hours[:, 3]))
    frs, fas = b.support_loads(np.array([[100.0, 0.0, 50.0], [0.0, -30.0, 40.0]]), [0.0, 0.0, 1.0])
    assert np.allclose(frs, [100.0, 30.0], rtol=1e-15) and np.allclose(fas, [50.0, 40.0], rtol=1e-15)


@FAST
@given(p=st.floats(10.0, 1e5), life=st.floats(1.0, 1e5), r=st.floats(0.9, 0.9995),
       kind=st.sampled_from(["ball", "roller"]))
def test_min_rating_round_trip_between_table_rows(p, life, r, kind):
    # The inverse holds for the Weibull a1 at any reliability, not only the table's rows.
    c = b.required_dynamic_rating(p, life, kind, r, method="weibull")
    assert float(b.modified_rating_life(c, p, kind, r, method="weibull")) == pytest.approx(life, rel=1e-12)


def test_user_factor_bad_inputs():
    with pytest.raises(InputError) as err:
        b.equivalent_load(1000.0, 100.0, -0.4, 1.6, 0.37, path="b")
    assert err.value.path == "b.x" and err.value.accepted == ">= 0"
    with pytest.raises(InputError) as err:
        b.equivalent_load(1000.0, 100.0, 0.4, 1.6, -0.1)
    assert err.value.path == "e"
    with pytest.raises(InputError) as err:
        b.support_loads([1.0, 2.0, 3.0], [0.0, 0.0, 0.0])
    assert err.value.path == "axis" and "non-zero" in str(err.value)
    with pytest.raises(InputError) as err:
        b.tapered_roller_induced_load(1000.0, 0.0)
    assert err.value.path == "y"
    with pytest.raises(InputError) as err:
        b.modified_rating_life(3e4, 1e3, a_iso=0.0)
    assert err.value.path == "a_iso"
    with pytest.raises(InputError) as err:
        b.reliability_factor(0.95, method="lookup")
    assert err.value.path == "method"

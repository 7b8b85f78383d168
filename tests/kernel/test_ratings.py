"""Ratings of a whole drive: every bearing, section, stiffness limit and bolt
of the demo, per load case and over the duty cycle.

Oracles: the published formulas written out again by hand beside each check
(ISO 281:2007 cl. 6.1 and 7.1 for P and L10, Table 3 for the deep-groove X,
Y, e; Shigley's Mechanical Engineering Design, 9th ed., Eqs. 6-18 to 6-29
(Marin factors) and 7-7 (DE-Goodman); ISO 898-1:2013 9.1.6.1 (stress area),
Table 3 (proof stress); Shigley Eq. 8-24 (bolt tension)), the catalogue
method for paired bearings, limiting cases (a cycle of one case is that
case) and properties (life scales as C^p).
"""

from __future__ import annotations

import dataclasses
import math
from statistics import NormalDist

import numpy as np
import pytest
from hypothesis import given, settings
from strategies import drives

from loadscope import LoadCase, StiffnessLimits, rate, solve
from loadscope.kernel.cases import apply_case, drive_cases, solve_cases
from loadscope.kernel.ratingcheck import WATCH_BAND, RatingCheck, governing
from loadscope.kernel.ratings import DUTY_CYCLE


def _one(checks, kind, component, check_start=""):
    found = [c for c in checks if c.kind == kind and c.component == component and c.check.startswith(check_start)]
    assert len(found) == 1, (kind, component, check_start, [c.check for c in found])
    return found[0]


def test_every_part_is_rated_in_every_case_and_the_duty_cycle(drive, ratings):
    assert [c.case.name for c in ratings.cases] == ["rated", "part load", "jam"]
    bearings = {f"{s.id}/{p.id}" for s in drive.shafts for p in s.supports}
    bolts = {f"bolt {b.id}" for b in drive.housing.bolts}
    for checks in [cr.checks for cr in ratings.cases] + [ratings.duty]:
        kinds = {(c.kind, c.component) for c in checks}
        assert {("bearing", b) for b in bearings} <= kinds
        assert {("bolt", b) for b in bolts} <= kinds
        for s in drive.shafts:
            for label in [e.id for e in s.elements()] + [f.id for f in s.features]:
                assert ("shaft section", f"{s.id} at {label}") in kinds
            for g in s.gears:
                assert ("stiffness", f"{s.id} at {g.id}") in kinds
        assert {("mesh", f"mesh {m.id}") for m in drive.meshes} <= kinds
        assert all(c.method and c.status in ("pass", "watch", "fail") for c in checks)
        assert all(math.isfinite(c.value) or c.value == math.inf for c in checks)


def test_a_drive_without_rating_data_rates_only_its_stiffness(drive):
    bare = dataclasses.replace(
        drive, cases=(), housing=dataclasses.replace(drive.housing, fastener=None),
        shafts=tuple(dataclasses.replace(s, material=None, features=(), pair=None,
                                         supports=tuple(dataclasses.replace(p, bearing=None) for p in s.supports))
                     for s in drive.shafts))
    r = rate(bare)
    assert [c.case.name for c in r.cases] == ["nominal"]
    assert r.cases[0].case.share == 1.0 and r.cases[0].result.drive.speed == drive.speed
    assert {c.kind for c in r.checks} == {"stiffness", "mesh"}


def test_deep_groove_life_by_hand(ratings, drive):
    # ISO 281:2007 cl. 6.1 and Table 3 (X = 0.56, Y and e interpolated in f0 Fa / C0),
    # cl. 7.1: L10 = (C/P)^3, L10h = 10^6 L10 / (60 n) with n in rpm (common practice).
    cr = ratings.case("rated")
    shaft = drive.shafts[0]
    sol = cr.result.shaft("input").solution
    k = sol.support_ids.index("A")
    fa, fr = abs(sol.reactions_local[k, 0]), math.hypot(*sol.reactions_local[k, 1:])
    b = shaft.supports[0].bearing
    rel = b.f0 * fa / b.C0
    rows = [(0.172, 0.19, 2.30), (0.345, 0.22, 1.99), (0.689, 0.26, 1.71), (1.03, 0.28, 1.55), (1.38, 0.30, 1.45),
            (2.07, 0.34, 1.31), (3.45, 0.38, 1.15), (5.17, 0.42, 1.04), (6.89, 0.44, 1.00)]
    rel_c = min(max(rel, rows[0][0]), rows[-1][0])
    e = np.interp(rel_c, [r[0] for r in rows], [r[1] for r in rows])
    y = np.interp(rel_c, [r[0] for r in rows], [r[2] for r in rows])
    p = 0.56 * fr + y * fa if fa / fr > e else fr
    n_rpm = abs(cr.result.shaft("input").speed) * 30 / math.pi
    hours = 1e6 / (60 * n_rpm) * (b.C / p) ** 3
    c = _one(cr.checks, "bearing", "input/A", "life")
    assert c.details["equivalent_load"] == pytest.approx(p, rel=1e-12)
    assert c.value == pytest.approx(hours, rel=1e-12)
    assert (c.details["X"], c.details["Y"]) == ((0.56, pytest.approx(y)) if fa / fr > e else (1.0, 0.0))
    assert c.allowable == b.target_life and c.sense == "min"
    assert c.margin == pytest.approx(hours / b.target_life - 1, rel=1e-12)
    assert "ISO 281" in c.method
    # the inverse: the rating that just reaches the target life (ISO 281 cl. 7.1 solved for C)
    assert c.details["required_C"] == pytest.approx(p * (b.target_life * 60 * n_rpm / 1e6) ** (1 / 3), rel=1e-12)
    duty = _one(ratings.duty, "bearing", "input/A", "life")
    assert duty.details["required_C"] == pytest.approx(b.C * (b.target_life / duty.value) ** (1 / 3), rel=1e-12)


def test_tapered_pair_carries_the_thrust_by_the_catalogue_method(ratings, drive):
    # Catalogue method (module docstring of kernel/bearings.py): Fi = 0.5 Fr / Y; the bearing
    # that faces the thrust carries max(Fi_B, Fi_A + Ka), the other max(Fi_A, Fi_B - Ka).
    cr = ratings.case("rated")
    c, d = (_one(cr.checks, "bearing", f"intermediate/{s}", "life").details for s in "CD")
    y = drive.shafts[1].supports[0].bearing.y
    for det in (c, d):
        assert det["induced_axial"] == pytest.approx(0.5 * det["radial"] / y, rel=1e-12)
        assert det["axial"] >= det["induced_axial"] * (1 - 1e-12)
    thrust = next(t.axial for t in cr.result.teeth if t.gear == "g2")
    # Axial balance: the two bearings' axial loads differ by the thrust Ka, and one of them
    # stays at its own induced force.
    assert abs(d["axial"] - c["axial"]) == pytest.approx(thrust, rel=1e-9)
    assert any(det["axial"] == pytest.approx(det["induced_axial"], rel=1e-12) for det in (c, d))


def test_duty_cycle_of_one_case_is_that_case(drive):
    single = dataclasses.replace(drive, cases=(LoadCase("only", 1.0),))
    r = rate(single)
    for c in r.cases[0].checks:
        if c.kind == "bearing" and c.unit == "life":
            d = _one(r.duty, "bearing", c.component, "life")
            assert d.value == pytest.approx(c.value, rel=1e-12)
    split = dataclasses.replace(drive, cases=(LoadCase("a", 0.3), LoadCase("b", 0.7)))
    r2 = rate(split)
    for c in r.duty:
        if c.kind == "bearing" and c.unit == "life":
            assert _one(r2.duty, "bearing", c.component, "life").value == pytest.approx(c.value, rel=1e-12)


def test_life_scales_as_the_cube_of_the_rating(drive, ratings):
    # ISO 281:2007 cl. 7.1: L10 = (C / P)^3 for ball bearings.
    s0 = drive.shafts[0]
    sup = tuple(dataclasses.replace(p, bearing=dataclasses.replace(p.bearing, C=2 * p.bearing.C))
                for p in s0.supports)
    r = rate(dataclasses.replace(drive, shafts=(dataclasses.replace(s0, supports=sup), *drive.shafts[1:])))
    for comp in ("input/A", "input/B"):
        base = _one(ratings.duty, "bearing", comp, "life").value
        assert _one(r.duty, "bearing", comp, "life").value == pytest.approx(8 * base, rel=1e-12)


def test_section_fatigue_by_hand(ratings, drive):
    # Shigley 9th ed.: ka = 4.51 Sut^-0.265 (Table 6-2, machined, MPa), kb = (d/7.62)^-0.107
    # (Eq. 6-20), kd (Eq. 6-27, T in degF), ke = 1 - 0.08 z (Table 6-5), Se' = 0.5 Sut (Eq. 6-8);
    # DE-Goodman (Eq. 7-7): 1/n = sqrt(4 (Kf Ma)^2)/... written with von Mises stresses.
    cr = ratings.case("rated")
    c = _one(cr.checks, "shaft section", "intermediate at g2 keyseat", "fatigue")
    shaft = drive.shafts[1]
    mat = shaft.material
    det = c.details
    d = det["diameter"]
    assert d == 0.045
    tf = (mat.temperature - 273.15) * 1.8 + 32
    kd = 0.975 + 0.432e-3 * tf - 0.115e-5 * tf**2 + 0.104e-8 * tf**3 - 0.595e-12 * tf**4
    se = (4.51 * (mat.Sut / 1e6) ** -0.265 * (d * 1e3 / 7.62) ** -0.107 * kd
          * (1 - 0.08 * NormalDist().inv_cdf(mat.reliability)) * 0.5 * mat.Sut)
    z = math.pi * d**3 / 32
    sa = det["Kf"] * det["M"] / z
    tm = det["Kfs"] * det["T"] / (2 * z)
    sm = math.sqrt((det["Kf"] * abs(det["N"]) / (math.pi * d**2 / 4)) ** 2 + 3 * tm**2)
    n = 1 / (sa / se + sm / mat.Sut)
    assert det["Se"] == pytest.approx(se, rel=1e-9)
    assert c.value == pytest.approx(n, rel=1e-9)
    # the section's loads are the diagram's at the feature
    diag = cr.result.shaft("intermediate").solution.diagram
    at = np.isclose(diag["s"], 0.050, atol=1e-12)
    assert det["M"] == pytest.approx(float(diag["M"][at].max()), rel=1e-12)
    assert det["T"] == pytest.approx(float(np.abs(diag["T"][at]).max()), rel=1e-12)


def test_notch_factor_raises_the_stress_and_lowers_the_factor(ratings):
    cr = ratings.case("rated")
    plain = _one(cr.checks, "shaft section", "intermediate at g2", "fatigue")
    notched = _one(cr.checks, "shaft section", "intermediate at g2 keyseat", "fatigue")
    assert notched.at == plain.at and notched.details["Kf"] > 1.0 == plain.details["Kf"]
    assert notched.value < plain.value


def test_bolt_check_by_hand(ratings, drive):
    # ISO 898-1:2013 9.1.6.1: As = pi/4 (d - 0.938194 P)^2; minor area d3 = d - 1.226869 P (ISO 724);
    # Shigley 9th ed. Eq. 8-24: Fb = Fi + C P while the joint stays closed; proof stress of
    # class 8.8 at d <= 16 mm 580 MPa (ISO 898-1:2013 Table 3).
    cr = ratings.case("rated")
    f = drive.housing.fastener
    loads = cr.result.housing.bolts
    for i, b in enumerate(drive.housing.bolts):
        c = _one(cr.checks, "bolt", f"bolt {b.id}", "tension + shear")
        p = 2.0e-3
        a_s = math.pi / 4 * (0.016 - 0.938194 * p) ** 2
        a_r = math.pi / 4 * (0.016 - 1.226869 * p) ** 2
        fb = max(f.preload + f.stiffness_fraction * loads.tension[i], loads.tension[i])
        vm = math.hypot(fb / a_s, math.sqrt(3) * loads.shear[i] / a_r)
        assert c.value == pytest.approx(580e6 / vm, rel=1e-12)
        assert "ISO 898-1" in c.method


def test_stiffness_and_mesh_misalignment(ratings, drive):
    cr = ratings.case("rated")
    res = cr.result
    # stage 2: p3 (intermediate, at 110 mm) and g4 (output, at 110 mm); both shafts along +x.
    slopes = []
    for sid, x in (("intermediate", 0.110), ("output", 0.110)):
        sol = res.shaft(sid).solution
        k = int(np.flatnonzero(np.isclose(sol.stations, x, atol=1e-12))[0])
        slopes.append(sol.slope_at[k, 0] * sol.frame[1] + sol.slope_at[k, 1] * sol.frame[2])
    mis = _one(cr.checks, "mesh", "mesh stage2")
    assert mis.value == pytest.approx(float(np.linalg.norm(slopes[0] - slopes[1])), rel=1e-9)
    assert mis.allowable == StiffnessLimits().mesh_misalignment
    g4 = _one(cr.checks, "stiffness", "output at g4", "deflection")
    sol = res.shaft("output").solution
    k = int(np.flatnonzero(np.isclose(sol.stations, 0.110, atol=1e-12))[0])
    assert g4.value == pytest.approx(float(np.hypot(*sol.deflection_at[k])), rel=1e-9)
    # Shigley 9th ed. Table 7-2 (from memory): 0.010 in for P < 11 teeth/in (g4: m = 3 mm, P = 8.47),
    # 0.005 in for 11 <= P < 20 (p1: m_t = 2 * 21.743 / 21 = 2.071 mm, P = 12.3).
    assert g4.allowable == pytest.approx(0.010 * 0.0254, rel=1e-15)
    assert _one(cr.checks, "stiffness", "input at p1", "deflection").allowable == pytest.approx(0.005 * 0.0254)


def test_tighter_limits_make_a_check_fail(drive):
    strict = dataclasses.replace(drive, cases=(), limits=StiffnessLimits(gear_slope=1e-6))
    r = rate(strict)
    c = _one(r.cases[0].checks, "stiffness", "output at g4", "slope")
    assert c.allowable == 1e-6 and c.status == "fail" and "user limit" in c.method


def test_deep_groove_beyond_iso_table_fails_rather_than_raises(drive):
    s0 = drive.shafts[0]
    tiny = tuple(dataclasses.replace(p, bearing=dataclasses.replace(p.bearing, C0=10.0, C=50.0)) for p in s0.supports)
    r = rate(dataclasses.replace(drive, cases=(), shafts=(dataclasses.replace(s0, supports=tiny), *drive.shafts[1:])))
    c = _one(r.cases[0].checks, "bearing", "input/A", "relative axial")
    assert c.status == "fail" and c.value > 6.89


def test_cases_replace_power_and_speed_only(drive):
    case = LoadCase("slow", 1.0, torque=50.0, speed=-20.0)
    d = apply_case(drive, case)
    assert d.input.torque == 50.0 and d.input.power is None and d.speed == -20.0 and d.cases == ()
    assert d.shafts == drive.shafts and d.housing == drive.housing
    assert solve(d).shafts[0].torque == pytest.approx(50.0, rel=1e-12)
    assert [c.name for c in drive_cases(drive)] == ["rated", "part load", "jam"]
    runs = solve_cases(drive)
    assert [r.result.drive.input.power for r in runs] == [5500.0, 3000.0, 7500.0]


def test_worst_case_of_the_cycle(ratings):
    for d in ratings.duty:
        if d.kind == "bearing" and d.unit == "life":
            continue
        per_case = [c for cr in ratings.cases for c in cr.checks
                    if (c.kind, c.component, c.check) == (d.kind, d.component, d.check)]
        assert d.margin == min(c.margin for c in per_case)
        assert d.case == DUTY_CYCLE and "worst case of the cycle" in d.method


@pytest.mark.parametrize("value, allowable, sense, margin, status", [
    (2.0, 1.0, "min", 1.0, "pass"), (1.0, 1.0, "min", 0.0, "watch"), (0.5, 1.0, "min", -0.5, "fail"),
    (1.0 + WATCH_BAND, 1.0, "min", WATCH_BAND, "pass"), (0.5, 1.0, "max", 1.0, "pass"),
    (2.0, 1.0, "max", -0.5, "fail"), (0.0, 1.0, "max", math.inf, "pass"), (math.inf, 1.0, "min", math.inf, "pass"),
])
def test_margin_and_status(value, allowable, sense, margin, status):
    c = RatingCheck("c", "bolt", "b", "x", value, allowable, "factor", sense, "m")
    assert c.margin == pytest.approx(margin, rel=1e-12) and c.status == status


def test_governing_takes_the_smallest_margin_per_component():
    mk = lambda comp, v: RatingCheck("c", "bolt", comp, f"x{v}", v, 1.0, "factor", "min", "m")  # noqa: E731
    g = governing([mk("a", 2.0), mk("a", 1.2), mk("b", 3.0), mk("b", 0.9)])
    assert [(c.component, c.value) for c in g] == [("b", 0.9), ("a", 1.2)]


def test_a_shaft_beyond_the_marin_size_range_is_named(drive):
    from loadscope import InputError, Section
    s2 = drive.shafts[2]
    big = dataclasses.replace(s2, sections=(*s2.sections[:1], Section(s2.sections[1].length, 0.3),
                                            *s2.sections[2:]))
    with pytest.raises(InputError) as exc:
        rate(dataclasses.replace(drive, shafts=(*drive.shafts[:2], big)))
    assert exc.value.path == "shafts[2].sections[1].diameter" and exc.value.accepted == "2.79 to 254 mm"


@settings(max_examples=15, deadline=None)
@given(drives())
def test_random_drives_rate_without_nan(d):
    # Property: every check of a random valid drive is a number (or inf for an unloaded part),
    # and a cycle of one case gives that case's bearing life (ISO 281 cl. 6.3 with one term).
    from loadscope import Bearing, Material
    shafts = tuple(dataclasses.replace(
        s, material=Material(700e6, 500e6),
        supports=tuple(dataclasses.replace(p, bearing=Bearing("custom", 40e3, 10000.0, x=0.56, y=1.5, e=0.3,
                                                              kind="ball")) for p in s.supports))
        for s in d.shafts)
    r = rate(dataclasses.replace(d, shafts=shafts))
    for c in r.checks:
        assert not math.isnan(c.value) and not math.isnan(c.margin)
    case = {c.component: c.value for c in r.cases[0].checks if c.kind == "bearing"}
    duty = {c.component: c.value for c in r.duty if c.kind == "bearing" and c.unit == "life"}
    assert duty.keys() == case.keys()
    for k in case:
        assert duty[k] == pytest.approx(case[k], rel=1e-12)


def test_face_to_face_moves_the_thrust_to_the_other_bearing(drive, ratings):
    # Catalogue method: in O (back-to-back) each bearing stops the shaft moving toward the other,
    # in X (face-to-face) away from it, so the bearing B that faces the same thrust changes:
    # Fa_B = max(Fi_B, Fi_A + Ka), Fa_A = max(Fi_A, Fi_B - Ka). In the demo the thrust of g2
    # is faced by D in O and by C in X.
    s1 = drive.shafts[1]
    x = dataclasses.replace(s1, pair=dataclasses.replace(s1.pair, arrangement="face_to_face"))
    r = rate(dataclasses.replace(drive, cases=(), shafts=(drive.shafts[0], x, drive.shafts[2])))
    ka = next(t.axial for t in r.cases[0].result.teeth if t.gear == "g2")
    for checks, b, a in ((ratings.case("rated").checks, "D", "C"), (r.cases[0].checks, "C", "D")):
        fb, fa = (_one(checks, "bearing", f"intermediate/{s}", "life").details for s in (b, a))
        assert fb["axial"] == pytest.approx(max(fb["induced_axial"], fa["induced_axial"] + ka), rel=1e-12)
        assert fa["axial"] == pytest.approx(max(fa["induced_axial"], fb["induced_axial"] - ka), rel=1e-12)


def test_unpaired_angular_contact_uses_the_40_degree_row(drive):
    # ISO 281:2007 Table 3, single-row angular-contact ball bearings, alpha = 40 deg:
    # e = 1.14; X = 0.35, Y = 0.57 for Fa/Fr > e (from memory); P = Fr below e.
    from loadscope import Bearing
    s0 = drive.shafts[0]
    ac = Bearing("angular_contact", 30e3, 20000.0)
    sup = (dataclasses.replace(s0.supports[0], bearing=ac), s0.supports[1])
    r = rate(dataclasses.replace(drive, cases=(), shafts=(dataclasses.replace(s0, supports=sup),
                                                          *drive.shafts[1:])))
    c = _one(r.cases[0].checks, "bearing", "input/A", "life")
    fr, fa = c.details["radial"], c.details["axial"]
    p = 0.35 * fr + 0.57 * fa if fa / fr > 1.14 else fr
    assert c.details["equivalent_load"] == pytest.approx(p, rel=1e-12)
    assert c.details["L10"] == pytest.approx((30e3 / p) ** 3, rel=1e-12)

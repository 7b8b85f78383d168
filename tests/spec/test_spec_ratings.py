"""The rating part of the snapshot (version 2): bad rating data gets an
InputError naming its path and range; rating data round-trips exactly;
version 1 still reads.

Ranges checked against: ISO 281:2007 Table 12 (reliability 0.90 to 0.9995),
Table 3 (deep-groove X, Y, e come from the table, not the user); Shigley's
Mechanical Engineering Design, 9th ed., Fig. 6-17 (Se' of steels within
about 0.4 to 0.6 Sut, from memory); Kt >= 1 by definition of a
stress-concentration factor; ISO 898-1:2013 Table 3 (property classes).
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from snapshot_edits import at, popper, setter

from loadscope import Bearing, Fastener, Feature, LoadCase, Material, StiffnessLimits
from loadscope.errors import InputError
from loadscope.spec import demo_snapshot, drive_from_snapshot, dump_snapshot, load_snapshot, snapshot_from_drive

A = ("shafts", 0, "supports", 0, "bearing")
C = ("shafts", 1, "supports", 0, "bearing")
MAT = ("shafts", 2, "material")
FEAT = ("shafts", 2, "features", 0)
FAST = ("housing", "fastener")


CASES = [
    (setter(A, "C", "0 kN"), "shafts[0].supports[0].bearing.C", "must be positive", "> 0 N"),
    (setter(A, "C", "-25 kN"), "shafts[0].supports[0].bearing.C", "must be positive, got -25000 N", "> 0 N"),
    (setter(A, "C0", "0 N"), "shafts[0].supports[0].bearing.C0", "must be positive", "> 0 N"),
    (setter(A, "target_life", "0 h"), "shafts[0].supports[0].bearing.target_life", "out of range", "1 to 1e+07 h"),
    (setter(A, "target_life", "-5 h"), "shafts[0].supports[0].bearing.target_life", "out of range", "1 to 1e+07 h"),
    (setter(A, "target_life", "20000 mm"), "shafts[0].supports[0].bearing.target_life", "is a length",
     "a duration"),
    (setter(A, "reliability", 0.8), "shafts[0].supports[0].bearing.reliability", "out of range", "0.9 to 0.9995"),
    (setter(A, "x", 0.56), "shafts[0].supports[0].bearing.x", "read from ISO 281 Table 3", "omit"),
    (popper(A, "f0"), "shafts[0].supports[0].bearing.f0", "needs C0 and f0", "f0 5 to 20"),
    (setter(C, "y", 7.5), "shafts[1].supports[0].bearing.y", "out of range", "0 to 5"),
    (setter(C, "e", 0.0), "shafts[1].supports[0].bearing.e", "out of range", "0.05 to 3"),
    (setter(C, "x", 0.2), "shafts[1].supports[0].bearing.x", "out of range", "0.35 to 1"),
    (popper(C, "y"), "shafts[1].supports[0].bearing.y", "needs Y and e", "y 0 to 5"),
    (setter(C, "type", "spherical"), "shafts[1].supports[0].bearing.type", "must be one of", "deep_groove"),
    (setter(MAT, "Sut", "0 MPa"), "shafts[2].material.Sut", "out of range", "1e+08 to 3e+09 Pa"),
    (setter(MAT, "Sy", "-1 MPa"), "shafts[2].material.Sy", "must be positive", "> 0 Pa"),
    (setter(MAT, "Sy", "950 MPa"), "shafts[2].material.Sy", "exceeds the tensile strength", "<= Sut = 900 MPa"),
    (setter(MAT, "Se_prime", "600 MPa"), "shafts[2].material.Se_prime", "contradicts the tensile strength",
     "0 < Se' <= 540 MPa"),
    (setter(MAT, "Se_prime", "950 MPa"), "shafts[2].material.Se_prime", "contradicts the tensile strength",
     "<= 540 MPa"),
    (setter(MAT, "temperature", "900 degC"), "shafts[2].material.temperature", "out of range", "K"),
    (setter(MAT, "temperature", "60 kg"), "shafts[2].material.temperature", "needs a temperature unit", "degC"),
    (setter(MAT, "required_factor", 0.8), "shafts[2].material.required_factor", "out of range", "1 to 10"),
    (setter(FEAT, "Kt", 0.9), "shafts[2].features[0].Kt", "below 1 is not possible, got 0.9", "1 to 10"),
    (setter(FEAT, "Kts", 0.5), "shafts[2].features[0].Kts", "below 1 is not possible", "1 to 10"),
    (setter(("shafts", 2, "features", 1), "Kf", 0.95), "shafts[2].features[1].Kf", "below 1 is not possible",
     "1 to 10"),
    (popper(FEAT, "radius"), "shafts[2].features[0].radius", "is required", "radius > 0 m"),
    (setter(FEAT, "at", "2 m"), "shafts[2].features[0].at", "lies off the shaft", "0 to 0.25 m"),
    (setter(("shafts", 2), "alternating_torque", 1.5), "shafts[2].alternating_torque", "out of range", "0 to 1"),
    (setter(("shafts", 1, "pair"), "supports", ["C", "X"]), "shafts[1].pair.supports[1]", "no support 'X'", "C, D"),
    (lambda d: at(d, ("shafts", 1, "supports", 1, "bearing")).update(type="deep_groove", C0="20 kN", f0=14.0,
                                                                       y=None, e=None) or
     [at(d, ("shafts", 1, "supports", 1, "bearing")).pop(k) for k in ("y", "e")],
     "shafts[1].pair.supports[1]", "needs an angular-contact or tapered-roller bearing", "tapered_roller"),
    (setter(FAST, "grade", "7.7"), "housing.fastener.grade", "7.7", "8.8"),
    (setter(FAST, "standard", "sae_j429"), "housing.fastener.grade", "8.8", "2, 5, 8"),
    (setter(FAST, "diameter", "17 mm"), "housing.fastener.diameter", "not a tabulated coarse-thread size", "M16"),
    (setter(FAST, "preload", "-1 kN"), "housing.fastener.preload", "must not be negative", ">= 0 N"),
    (setter(FAST, "stiffness_fraction", 1.2), "housing.fastener.stiffness_fraction", "out of range", "0 to 1"),
    (setter(("cases", 0), "share", 0.5), "cases", "must add up to 1, got 0.8", "sum of shares = 1"),
    (setter(("cases", 1), "name", "rated"), "cases", "names must be unique", "unique names"),
    (setter(("cases", 0), "speed", "0 rpm"), "cases[0].speed", "must not be zero", "non-zero"),
    (setter(("cases", 0), "power", "-1 kW"), "cases[0].power", "must be positive", "> 0 W"),
    (setter(("cases", 0), "share", 1.5), "cases[0].share", "out of range", "0 to 1"),
    (setter(("limits",), "gear_slope", "0 rad"), "limits.gear_slope", "must be positive", "> 0 rad"),
]


@pytest.mark.parametrize("mutate, path, problem, accepted", CASES, ids=[f"{c[1]}:{c[2][:20]}" for c in CASES])
def test_bad_rating_data_names_path_problem_and_range(mutate, path, problem, accepted):
    doc = demo_snapshot()
    doc.setdefault("limits", {})
    mutate(doc)
    with pytest.raises(InputError) as exc:
        drive_from_snapshot(doc)
    err = exc.value
    assert err.path == path, str(err)
    assert problem in err.problem, str(err)
    assert accepted in err.accepted, str(err)


def test_version_1_reads_without_rating_data_and_refuses_it():
    doc = demo_snapshot()
    doc["version"] = 1
    with pytest.raises(InputError) as exc:
        drive_from_snapshot(doc)
    assert exc.value.path == "version" and "needs snapshot version 2" in exc.value.problem
    for s in doc["shafts"]:
        for k in ("material", "features", "pair", "alternating_torque"):
            s.pop(k, None)
        for p in s["supports"]:
            p.pop("bearing")
    doc["housing"].pop("fastener")
    doc.pop("cases")
    drive = drive_from_snapshot(doc)
    assert drive.cases == () and drive.limits == StiffnessLimits()
    assert snapshot_from_drive(drive)["version"] == 2


def test_demo_rating_data_round_trips_exactly():
    drive = drive_from_snapshot(demo_snapshot())
    assert drive_from_snapshot(snapshot_from_drive(drive)) == drive
    text = dump_snapshot(drive)
    assert dump_snapshot(load_snapshot(text)) == text
    assert drive.shafts[1].pair.arrangement == "back_to_back"
    assert drive.shafts[2].material.temperature == pytest.approx(333.15, rel=1e-15)
    assert [c.name for c in drive.cases] == ["rated", "part load", "jam"]
    assert drive.housing.fastener.strength().proof == 580e6      # ISO 898-1:2013 Table 3, 8.8, d <= 16 mm


def _with(drive, bearing=None, material=None, feature=None, fastener=None, case=None, limits=None):
    import dataclasses
    s0 = drive.shafts[0]
    sup = (dataclasses.replace(s0.supports[0], bearing=bearing or s0.supports[0].bearing), *s0.supports[1:])
    s0 = dataclasses.replace(s0, supports=sup, material=material or s0.material,
                             features=(feature,) if feature else s0.features)
    h = dataclasses.replace(drive.housing, fastener=fastener or drive.housing.fastener)
    return dataclasses.replace(drive, shafts=(s0, *drive.shafts[1:]), housing=h,
                               cases=(case,) if case else drive.cases, limits=limits or drive.limits)


pos = st.floats(1e-3, 1e6, allow_nan=False)


@settings(max_examples=40, deadline=None)
@given(c=st.floats(1e3, 1e6), life=st.floats(1.0, 1e7), rel=st.floats(0.9, 0.9995), y=st.floats(0.0, 5.0),
       e=st.floats(0.05, 3.0), sut=st.floats(300e6, 2000e6), ratio=st.floats(0.3, 1.0), se=st.floats(0.1, 0.6),
       temp=st.floats(293.15, 800.0), kt=st.floats(1.0, 10.0), r=st.floats(1e-5, 5e-3), pre=st.floats(0.0, 9e4),
       power=st.floats(1.0, 1e5), speed=st.floats(-1e3, 1e3).filter(lambda v: abs(v) > 1e-3),
       slope=st.floats(1e-6, 1e-2), x0=st.floats(0.5, 1.0), y0=st.floats(0.0, 5.0), s0=st.floats(1e-3, 10.0))
def test_rating_data_round_trips_bit_exact(c, life, rel, y, e, sut, ratio, se, temp, kt, r, pre, power, speed, slope,
                                           x0, y0, s0):
    base = drive_from_snapshot(demo_snapshot())
    d = _with(base, bearing=Bearing("custom", c, life, C0=0.7 * c, x=0.4, y=y, e=e, kind="roller", reliability=rel,
                                    x0=x0, y0=y0, required_s0=s0),
              material=Material(sut, ratio * sut, se * sut, "ground", temp, 0.95, "gerber", 2.0),
              feature=Feature("f", "groove", 0.1, Kt=kt, Kts=kt, radius=r),
              fastener=Fastener(0.016, "10.9", preload=pre, shear_plane="shank", stiffness_fraction=0.3),
              case=LoadCase("one", 1.0, power=power, speed=speed), limits=StiffnessLimits(gear_slope=slope))
    back = drive_from_snapshot(snapshot_from_drive(d))
    assert back == d
    assert math.copysign(1.0, back.cases[0].speed) == math.copysign(1.0, speed)
    text = dump_snapshot(d)
    assert dump_snapshot(load_snapshot(text)) == text

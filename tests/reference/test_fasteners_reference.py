"""Bolt formulas and tables against the standards and handbook tables.

Sources, named beside each check:

* ISO 68-1 (basic profile of ISO metric threads: H = (sqrt 3 / 2) P,
  d2 = d - 2 (3/8) H, d1 = d - 2 (5/8) H) and ISO 898-1:2013, 9.1.6.1
  (d3 = d1 - H/6, As = (pi/4) ((d2 + d3)/2)^2), with the stress areas the
  standard tabulates for the coarse threads M3 to M36 (ISO 898-1 Table 4 and
  Shigley 9th Table 8-1 print the same column).
* ASME B1.1 (As = 0.7854 (d - 0.9743 / n)^2) with the UNC stress areas of
  Shigley 9th Table 8-2.
* ISO 898-1:2013 Table 3 (proof stress, minimum tensile strength, minimum
  yield of the property classes) and its designation system (clause 4:
  the first number is Rm,nom / 100 MPa, the second ten times the nominal
  yield ratio).
* SAE J429 grades 2, 5, 8 as Shigley 9th Table 8-9 lists them.

No copy of the standards was at hand: every tabulated value below was
recalled and is marked "from memory"; the formulas are checked against the
tables to the tables' printed digits (three significant figures).
"""

from __future__ import annotations

import math

import pytest

from loadscope.kernel import fasteners as f

MM = 1e-3
INCH = f.INCH
KPSI = f.KPSI

# ISO 898-1 stress areas of the coarse-thread sizes, d [mm] -> (P [mm], As [mm^2]) (from memory).
ISO_STRESS_AREAS = {
    3: (0.5, 5.03), 4: (0.7, 8.78), 5: (0.8, 14.2), 6: (1.0, 20.1), 8: (1.25, 36.6), 10: (1.5, 58.0),
    12: (1.75, 84.3), 14: (2.0, 115.0), 16: (2.0, 157.0), 18: (2.5, 192.0), 20: (2.5, 245.0), 22: (2.5, 303.0),
    24: (3.0, 353.0), 27: (3.0, 459.0), 30: (3.5, 561.0), 33: (3.5, 694.0), 36: (4.0, 817.0),
}


def _round_sig(x: float, digits: int = 3) -> float:
    return round(x, digits - 1 - math.floor(math.log10(abs(x))))


@pytest.mark.parametrize("d", list(ISO_STRESS_AREAS))
def test_iso_stress_area_table(d):
    # ISO 898-1 stress-area column (from memory), printed to 3 significant figures:
    # the formula rounded the same way gives the printed number exactly.
    pitch, area = ISO_STRESS_AREAS[d]
    got = float(f.tensile_stress_area(d * MM, pitch * MM)) / MM**2
    assert _round_sig(got) == pytest.approx(area, abs=1e-9)


@pytest.mark.parametrize("d", list(ISO_STRESS_AREAS))
def test_iso_stress_area_from_the_basic_profile(d):
    # ISO 68-1 basic profile and ISO 898-1 9.1.6.1, built here from H, not from the
    # module's coefficients: As = (pi/4) ((d2 + d3)/2)^2, to round-off.
    pitch = ISO_STRESS_AREAS[d][0] * MM
    h = math.sqrt(3.0) / 2.0 * pitch
    d2 = d * MM - 2.0 * 3.0 / 8.0 * h
    d1 = d * MM - 2.0 * 5.0 / 8.0 * h
    d3 = d1 - h / 6.0
    assert float(f.tensile_stress_area(d * MM, pitch)) == pytest.approx(math.pi / 4 * ((d2 + d3) / 2) ** 2, rel=1e-6)
    assert float(f.minor_diameter_area(d * MM, pitch)) == pytest.approx(math.pi / 4 * d3**2, rel=1e-6)
    # rel 1e-6: the module's coefficients 0.938194 and 1.226869 are printed to 6 decimals.


def test_metric_coarse_pitches():
    # ISO 261 / ISO 262 coarse pitches of the table above (from memory).
    for d, (pitch, _) in ISO_STRESS_AREAS.items():
        if d >= 5:
            assert f.metric_coarse_pitch(d * MM) == pytest.approx(pitch * MM, rel=1e-12)


# Shigley 9th Table 8-2 UNC (from memory): size [in] -> (threads per inch, As [in^2]).
UNC_STRESS_AREAS = {
    0.25: (20, "0.0318"), 0.3125: (18, "0.0524"), 0.375: (16, "0.0775"), 0.4375: (14, "0.1063"),
    0.5: (13, "0.1419"), 0.5625: (12, "0.182"), 0.625: (11, "0.226"), 0.75: (10, "0.334"), 0.875: (9, "0.462"),
    1.0: (8, "0.606"), 1.25: (7, "0.969"), 1.5: (6, "1.405"),
}


@pytest.mark.parametrize("d", list(UNC_STRESS_AREAS))
def test_unc_stress_area_table(d):
    # ASME B1.1 As = 0.7854 (d - 0.9743/n)^2 against the printed column, to half a
    # unit of the last printed digit (the table prints 3 or 4 decimals).
    n, printed = UNC_STRESS_AREAS[d]
    assert f.unc_pitch(d * INCH) == pytest.approx(INCH / n, rel=1e-12)
    got = float(f.tensile_stress_area(d * INCH, INCH / n, "unified")) / INCH**2
    step = 10.0 ** -len(printed.split(".")[1])
    assert got == pytest.approx(float(printed), abs=0.5 * step + 1e-12)


# ISO 898-1:2013 Table 3 (from memory): class -> [(largest d [mm], Sp, Rm min, yield min)] [MPa].
ISO_898_1_TABLE_3 = {
    "4.6": [(39, 225, 400, 240)], "4.8": [(39, 310, 420, 340)], "5.6": [(39, 280, 500, 300)],
    "5.8": [(39, 380, 520, 420)], "6.8": [(39, 440, 600, 480)],
    "8.8": [(16, 580, 800, 640), (39, 600, 830, 660)], "9.8": [(16, 650, 900, 720)],
    "10.9": [(39, 830, 1040, 940)], "12.9": [(39, 970, 1220, 1100)],
}


@pytest.mark.parametrize("name", list(ISO_898_1_TABLE_3))
def test_iso_property_classes(name):
    lo = 1.6
    for d_max, sp_, rm, rel in ISO_898_1_TABLE_3[name]:
        for d in (lo, 0.5 * (lo + d_max), d_max):
            got = f.iso_property_class(name, d * MM)
            assert (got.proof, got.tensile, got.yield_) == (sp_ * 1e6, rm * 1e6, rel * 1e6)
            assert got.source.startswith("ISO 898-1:2013 Table 3")
        lo = d_max + 1e-3


@pytest.mark.parametrize("name", list(ISO_898_1_TABLE_3))
def test_iso_property_class_designation(name):
    # ISO 898-1 clause 4 (from memory): class "a.b" means Rm,nom = 100 a MPa and a
    # nominal yield of Rm,nom * b / 10. The minimum values of Table 3 never fall
    # below the nominal ones, and the proof stress lies below the minimum yield.
    a, b = (int(x) for x in name.split("."))
    rm_nom = 100.0 * a
    for d in (5.0, 20.0):
        if name == "9.8" and d > 16:
            continue
        got = f.iso_property_class(name, d * MM)
        assert got.tensile / 1e6 >= rm_nom
        assert got.yield_ / 1e6 >= rm_nom * b / 10.0
        assert got.proof < got.yield_ < got.tensile


# SAE J429 / Shigley 9th Table 8-9 (from memory): grade -> [(largest d [in], Sp, Sut, Sy)] [kpsi].
SAE_J429_TABLE = {
    "2": [(0.75, 55, 74, 57), (1.5, 33, 60, 36)],
    "5": [(1.0, 85, 120, 92), (1.5, 74, 105, 81)],
    "8": [(1.5, 120, 150, 130)],
}


@pytest.mark.parametrize("grade", list(SAE_J429_TABLE))
def test_sae_grades(grade):
    lo = 0.25
    for d_max, sp_, sut, sy in SAE_J429_TABLE[grade]:
        for d in (lo, d_max):
            got = f.sae_grade(grade, d * INCH)
            assert got.proof == pytest.approx(sp_ * KPSI, rel=1e-12)
            assert got.tensile == pytest.approx(sut * KPSI, rel=1e-12)
            assert got.yield_ == pytest.approx(sy * KPSI, rel=1e-12)
        lo = d_max + 0.125                   # the next tabulated size up

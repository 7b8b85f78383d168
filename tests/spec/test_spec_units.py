"""Reading quantities with units, and writing them back exactly.

Oracles: the unit definitions (NIST SP 811, Appendix B: 1 in = 25.4 mm and
1 lbf = 4.4482216152605 N exactly; 1 rev = 2 pi rad), pint's default registry
for the factors, and bit-for-bit identity for the canonical writer.
"""

from __future__ import annotations

import math
import re
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadscope.errors import InputError
from loadscope.spec import units
from loadscope.spec.units import DIMENSIONS, STANDARD_GRAVITY, format_quantity, parse_quantity

LBF = 4.4482216152605  # N, exact by definition (NIST SP 811, B.8)
INCH = 0.0254          # m, exact by definition (NIST SP 811, B.8)


@pytest.mark.parametrize("text, dimension, expected", [
    ("40 mm", "length", 0.040),
    ("1.75 in", "length", 1.75 * 25.4e-3),     # 0.04445 m
    ("3/4 in", "length", 0.75 * 25.4e-3),      # 0.01905 m
    ("1 3/4 in", "length", 1.75 * 25.4e-3),
    ("2 ft", "length", 2 * 12 * INCH),
    ("20 deg", "angle", 20 * math.pi / 180),
    ("20°", "angle", 20 * math.pi / 180),
    ("0.25 rad", "angle", 0.25),
    ("2.2 kW", "power", 2200.0),
    ("7.5 hp", "power", 7.5 * 550 * 12 * INCH * LBF),   # 1 hp = 550 ft*lbf/s
    ("1450 rpm", "speed", 1450 * 2 * math.pi / 60),
    ("-90 rpm", "speed", -90 * 2 * math.pi / 60),
    ("10 rad/s", "speed", 10.0),
    ("206 GPa", "pressure", 206e9),
    ("30e6 psi", "pressure", 30e6 * LBF / INCH**2),
    ("12 lbf", "force", 12 * LBF),
    ("1.5 kN", "force", 1500.0),
    ("300 lbf*in", "moment", 300 * LBF * INCH),
    ("36 N·m", "moment", 36.0),
    ("36 N m", "moment", 36.0),
    ("5.5 kg", "mass", 5.5),
    ("2e-3 m", "length", 0.002),
    ("0.98", "dimensionless", 0.98),
    ("98 percent", "dimensionless", 0.98),
])
def test_reads_si_and_us_units(text, dimension, expected):
    assert parse_quantity(text, dimension, "f") == pytest.approx(expected, rel=1e-15, abs=0.0)


def test_inch_is_exactly_25_4_mm():
    # NIST SP 811 Appendix B: 1 in = 2.54 cm exactly; pint's registry agrees.
    assert parse_quantity("1.75 in", "length", "f") == pytest.approx(0.04445, rel=1e-15)
    assert parse_quantity("1 in", "length", "f") == 0.0254


def test_plain_numbers_only_for_dimensionless_fields():
    assert parse_quantity(0.98, "dimensionless", "eta") == 0.98
    assert parse_quantity(3, "dimensionless", "n") == 3.0
    for dim in ("length", "angle", "force", "speed"):
        with pytest.raises(InputError) as exc:
            parse_quantity(20, dim, "shafts[0].gears[0].x")
        assert exc.value.path == "shafts[0].gears[0].x"
        assert "no unit" in exc.value.problem
        with pytest.raises(InputError, match="no unit"):
            parse_quantity("20", dim, "x")


@pytest.mark.parametrize("text, dimension, problem", [
    ("20 mm", "angle", "'20 mm' is a length, not an angle"),
    ("1 kg", "force", "'1 kg' is a mass, not a force"),
    ("24 Hz", "speed", "'24 Hz' is a frequency, not a rotational speed"),
    ("20 percent", "angle", "'20 percent' is a plain number, not an angle"),
    ("2 N*m", "force", "'2 N*m' is a moment or torque, not a force"),
    ("20 furlongz", "length", "'20 furlongz' has an unknown unit 'furlongz'"),
    ("twenty deg", "angle", "cannot read 'twenty deg' as an angle"),
    ("", "length", "cannot read '' as a length"),
    ("3/0 in", "length", "zero denominator"),
    ("2 m)", "length", "cannot read the unit 'm)'"),
    ("NaN deg", "angle", "must be finite"),
    ("inf m", "length", "must be finite"),
    ("-inf N", "force", "must be finite"),
    ("1e400 m", "length", "must be finite"),
])
def test_bad_quantities_name_path_and_dimension(text, dimension, problem):
    with pytest.raises(InputError) as exc:
        parse_quantity(text, dimension, "a.b[1].c")
    err = exc.value
    assert err.path == "a.b[1].c"
    assert problem in err.problem
    assert err.accepted == DIMENSIONS[dimension].accepted
    assert str(err).startswith("a.b[1].c: ")


def test_accepted_text_names_the_dimension_with_an_example():
    with pytest.raises(InputError) as exc:
        parse_quantity("20 mm", "angle", "g.pressure_angle")
    assert exc.value.accepted == "an angle, e.g. '20 deg'"


@pytest.mark.parametrize("value", [None, True, [1, 2], {"v": 1}])
def test_non_text_is_rejected(value):
    with pytest.raises(InputError, match="must be"):
        parse_quantity(value, "length", "x")


def test_nan_number_is_rejected_for_dimensionless():
    with pytest.raises(InputError, match="must be finite"):
        parse_quantity(float("nan"), "dimensionless", "eta")


def test_mass_to_weight_uses_standard_gravity():
    assert STANDARD_GRAVITY == 9.80665  # 3rd CGPM (1901)


@pytest.mark.parametrize("unit", sorted(units._KNOWN))
def test_fast_units_agree_with_pint(unit):
    dimension, factor = units._KNOWN[unit]
    ureg = units.registry()
    assert ureg.Quantity(1.0, unit).to(DIMENSIONS[dimension].pint_si).magnitude == factor
    # and the pint path reads the same spelling to the same factor
    units._pint_factor.cache_clear()
    assert units._pint_factor(unit, dimension) == factor


@settings(max_examples=200, deadline=None)
@given(st.floats(-1e6, 1e6, allow_nan=False), st.sampled_from(["in", "lbf", "hp", "deg", "rpm", "mm", "psi"]))
def test_value_is_number_times_pint_factor(x, unit):
    dimension = {"in": "length", "mm": "length", "lbf": "force", "hp": "power", "deg": "angle", "rpm": "speed",
                 "psi": "pressure"}[unit]
    text = f"{x!r} {unit}"
    ureg = units.registry()
    assert parse_quantity(text, dimension, "x") == ureg.Quantity(x, unit).to(DIMENSIONS[dimension].pint_si).magnitude


finite = st.floats(allow_nan=False, allow_infinity=False)


@settings(max_examples=400, deadline=None)
@given(finite | st.floats(-1e4, 1e4).map(lambda v: round(v, 3)),
       st.sampled_from(sorted(set(DIMENSIONS) - {"mass"})))
def test_canonical_text_reads_back_bit_exact(x, dimension):
    text = format_quantity(x, dimension)
    if dimension == "dimensionless":
        back = float(text)
    else:
        back = parse_quantity(text, dimension, "x")
    assert back == x and math.copysign(1.0, back) == math.copysign(1.0, x)
    assert format_quantity(back, dimension) == text


@pytest.mark.parametrize("text, dimension, canonical", [
    ("40 mm", "length", "40 mm"),
    ("0.04 m", "length", "40 mm"),
    ("20 deg", "angle", "20 deg"),
    ("14.5 deg", "angle", "14.5 deg"),
    ("0.1 rad", "angle", "0.1 rad"),
    ("1460 rpm", "speed", "1460 rpm"),
    ("5500 W", "power", "5.5 kW"),
    ("206 GPa", "pressure", "206 GPa"),
    ("850 N", "force", "850 N"),
])
def test_canonical_text_prefers_engineering_units(text, dimension, canonical):
    assert format_quantity(parse_quantity(text, dimension, "x"), dimension) == canonical


def test_only_units_module_imports_pint():
    root = Path(units.__file__).resolve().parents[1]
    offenders = []
    for path in root.rglob("*.py"):
        if path.name == "units.py" and path.parent.name == "spec":
            continue
        if re.search(r"^\s*(import pint|from pint\b)", path.read_text(encoding="utf-8"), re.MULTILINE):
            offenders.append(str(path.relative_to(root)))
    assert offenders == []

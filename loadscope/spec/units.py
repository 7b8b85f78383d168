"""Quantities with units, read from text and written back exactly.

Every dimensioned value of a snapshot is a string: a number, then a unit,
e.g. ``"20 deg"``, ``"3/4 in"``, ``"1 3/4 in"``, ``"2.2 kW"``, ``"1450 rpm"``,
``"206 GPa"``, ``"12 lbf"``. :func:`parse_quantity` turns one into the SI
float the kernel uses (m, N, N*m, W, rad, rad/s, Pa, kg); units are pint's
(its default registry: 1 in = 25.4 mm and 1 lbf = 4.4482216152605 N exactly,
as NIST SP 811 Appendix B defines them). This module is the only one in
loadscope that imports pint, and it does so lazily, on the first unit that is
not one of the few written by :func:`format_quantity`.

The number is read by this module, not by pint: a decimal (``1.75``,
``2e-3``), a fraction (``3/4``) or a mixed number (``1 3/4``). The value is
then ``number * factor``, with ``factor`` the SI value of one unit, so the
same text always gives the same float.

:func:`format_quantity` writes the canonical text of a float: the shortest
decimal (up to 12 significant digits) in the dimension's preferred unit
(mm, deg, rpm, kW, GPa, MPa) that reads back to the very same float, else
``repr(value)`` in the SI unit, which always does. Reading what it wrote
gives the float back bit for bit.

>>> parse_quantity("2.2 kW", "power", "x")
2200.0
>>> format_quantity(parse_quantity("20 deg", "angle", "x"), "angle")
'20 deg'
>>> format_quantity(parse_quantity("1.75 in", "length", "x"), "length")
'0.044449999999999996 m'
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass
from typing import Any

from ..errors import InputError

#: Standard acceleration of gravity [m/s^2] (3rd CGPM, 1901), turns a mass
#: into a weight.
STANDARD_GRAVITY = 9.80665


@dataclass(frozen=True)
class Dimension:
    """A kind of quantity: its SI unit, the pint unit that names it, the
    power of the radian it carries (pint counts angles as dimensionless, so
    an angle or a rotational speed must name an angle unit), the units
    :func:`format_quantity` prefers, and an example for error messages."""

    name: str
    article: str
    si: str
    pint_si: str
    radian: int
    preferred: tuple[str, ...]
    example: str

    @property
    def accepted(self) -> str:
        """The ``accepted`` text of an error about this dimension."""
        return f"{self.article}, e.g. {self.example}"


DIMENSIONS: dict[str, Dimension] = {d.name: d for d in (
    Dimension("length", "a length", "m", "meter", 0, ("mm",), "'40 mm' or '1.75 in'"),
    Dimension("force", "a force", "N", "newton", 0, (), "'850 N' or '12 lbf'"),
    Dimension("moment", "a moment or torque", "N*m", "newton * meter", 0, (), "'36 N*m' or '300 lbf*in'"),
    Dimension("power", "a power", "W", "watt", 0, ("kW",), "'5.5 kW' or '7.5 hp'"),
    Dimension("speed", "a rotational speed", "rad/s", "radian / second", 1, ("rpm",), "'1460 rpm'"),
    Dimension("angle", "an angle", "rad", "radian", 1, ("deg",), "'20 deg'"),
    Dimension("pressure", "a pressure or elastic modulus", "Pa", "pascal", 0, ("GPa", "MPa"),
              "'206 GPa' or '30e6 psi'"),
    Dimension("mass", "a mass", "kg", "kilogram", 0, (), "'5.5 kg' or '12 lb'"),
    # Bearing lives: the trade counts them in hours, so hours are this dimension's unit.
    Dimension("duration", "a duration", "h", "hour", 0, (), "'20000 h'"),
    Dimension("temperature", "a temperature", "K", "kelvin", 0, ("degC",), "'80 degC' or '176 degF'"),
    Dimension("dimensionless", "a plain number", "", "dimensionless", 0, (), "0.98"),
)}

# Units read and written without pint: SI value of one unit. Each factor is
# the one pint's default registry gives (a test checks it).
_KNOWN: dict[str, tuple[str, float]] = {
    "m": ("length", 1.0),
    "mm": ("length", 1e-3),
    "N": ("force", 1.0),
    "N*m": ("moment", 1.0),
    "W": ("power", 1.0),
    "kW": ("power", 1e3),
    "rad/s": ("speed", 1.0),
    "rpm": ("speed", math.pi / 30.0),
    "rad": ("angle", 1.0),
    "deg": ("angle", math.pi / 180.0),
    "Pa": ("pressure", 1.0),
    "MPa": ("pressure", 1e6),
    "GPa": ("pressure", 1e9),
    "kg": ("mass", 1.0),
    "h": ("duration", 1.0),
}

# Temperatures: an offset scale, read without pint's multiplicative factors.
# unit -> (kelvin per unit, kelvin at 0 of the unit); degF: 5/9 K, 0 degF = 459.67 * 5/9 K.
_TEMPERATURE_UNITS: dict[str, tuple[float, float]] = {
    "K": (1.0, 0.0), "kelvin": (1.0, 0.0), "degC": (1.0, 273.15), "degF": (5.0 / 9.0, 459.67 * 5.0 / 9.0),
}

_NUMBER = re.compile(r"""
    \s*(?P<sign>[+-]?)\s*
    (?:
        (?P<whole>\d+)\s+(?P<mnum>\d+)\s*/\s*(?P<mden>\d+)(?![\d.eE])   # mixed number: 1 3/4
      | (?P<fnum>\d+)\s*/\s*(?P<fden>\d+)(?![\d.eE])                    # fraction: 3/4
      | (?P<dec>(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)                   # decimal: 1.75, 2e-3
      | (?P<special>inf(?:inity)?|nan)(?![a-z])                         # caught to say "finite"
    )
    (?P<unit>.*)$
""", re.VERBOSE | re.IGNORECASE | re.DOTALL)

_SPELLINGS = (("\u00b7", "*"), ("\u22c5", "*"), ("\u00d7", "*"), ("\u00b0", " deg "))


class _UnitProblem(Exception):
    """A unit that cannot be used; ``{text}`` in the message stands for the
    quantity text, and the caller adds the field path."""


@functools.lru_cache(maxsize=1)
def registry() -> Any:
    """The one pint UnitRegistry of loadscope, created on first use."""
    import pint

    return pint.UnitRegistry()


def _dimension(name: str) -> Dimension:
    try:
        return DIMENSIONS[name]
    except KeyError:
        raise ValueError(f"unknown dimension {name!r}; one of {', '.join(DIMENSIONS)}") from None


def _radian_power(q: Any) -> float:
    root = registry().get_root_units(q.units)[1]
    return dict(root._units.items()).get("radian", 0)


def _matches(q: Any, dim: Dimension) -> bool:
    ureg = registry()
    return bool(q.dimensionality == ureg.Quantity(1.0, dim.pint_si).dimensionality
                and _radian_power(q) == dim.radian)


def _describe(q: Any) -> str:
    """What a pint quantity is, in words (for error messages)."""
    for dim in DIMENSIONS.values():
        if _matches(q, dim):
            return dim.article
    if q.dimensionality == registry().Quantity(1.0, "hertz").dimensionality:
        return "a frequency"
    return f"a quantity of dimension {q.dimensionality}"


@functools.lru_cache(maxsize=512)
def _pint_factor(unit: str, dimension: str) -> float:
    """SI value of one ``unit`` of ``dimension``, by pint."""
    import pint

    dim = _dimension(dimension)
    ureg = registry()
    try:
        q = ureg.Quantity(1.0, ureg.parse_units(unit))
    except pint.UndefinedUnitError as exc:
        name = exc.args[0] if exc.args else unit
        raise _UnitProblem(f"{{text}} has an unknown unit {name!r}") from None
    except Exception:  # pint raises many kinds for a malformed unit expression
        raise _UnitProblem(f"cannot read the unit {unit!r} of {{text}}") from None
    if not _matches(q, dim):
        raise _UnitProblem(f"{{text}} is {_describe(q)}, not {dim.article}")
    return float(q.to(dim.pint_si).magnitude)


def _factor(unit: str, dim: Dimension) -> float:
    known = _KNOWN.get(unit)
    if known is None:
        return _pint_factor(unit, dim.name)
    if known[0] != dim.name:
        raise _UnitProblem(f"{{text}} is {DIMENSIONS[known[0]].article}, not {dim.article}")
    return known[1]


def _read_number(m: re.Match[str]) -> float:
    sign = -1.0 if m.group("sign") == "-" else 1.0
    if m.group("dec") is not None:
        return sign * float(m.group("dec"))
    if m.group("special") is not None:
        return sign * float(m.group("special"))
    if m.group("fnum") is not None:
        num, den, whole = int(m.group("fnum")), int(m.group("fden")), 0
    else:
        num, den, whole = int(m.group("mnum")), int(m.group("mden")), int(m.group("whole"))
    if den == 0:
        raise _UnitProblem("{text} has a fraction with a zero denominator")
    return sign * (whole + num / den)


def parse_quantity(text: Any, dimension: str, path: str) -> float:
    """The SI value of a quantity written as text.

    Parameters
    ----------
    text : str, or int/float for a dimensionless field
        E.g. ``"20 deg"``, ``"3/4 in"``, ``"2.2 kW"``. A bare number is
        accepted only when ``dimension`` is ``"dimensionless"``.
    dimension : str
        One of :data:`DIMENSIONS`: length [m], force [N], moment [N*m],
        power [W], speed [rad/s], angle [rad], pressure [Pa], mass [kg],
        dimensionless.
    path : str
        The field path named in errors, e.g. ``"shafts[0].gears[1].at"``.

    Returns
    -------
    float
        The finite value in SI units.

    Raises
    ------
    InputError
        Unparsable text, unknown unit, wrong dimension, missing unit, or a
        value that is not finite; ``accepted`` names the dimension.

    >>> parse_quantity("40 mm", "length", "x")
    0.04
    >>> round(parse_quantity("3/4 in", "length", "x"), 15)
    0.01905
    >>> parse_quantity("20 mm", "angle", "gear.pressure_angle")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    loadscope.errors.InputError: gear.pressure_angle: '20 mm' is a length, not an angle (accepted: an angle, ...)
    """
    dim = _dimension(dimension)
    if isinstance(text, bool) or not isinstance(text, (str, int, float)):
        raise InputError(path, f"must be {_form(dim)}, got {_show(text)}", dim.accepted)
    if not isinstance(text, str):
        if dim.name != "dimensionless":
            raise InputError(path, f"the number {_show(text)} has no unit; {dim.article} needs one", dim.accepted)
        try:
            value = float(text)
        except OverflowError:
            value = math.inf
    else:
        m = _NUMBER.match(text)
        if m is None:
            raise InputError(path, f"cannot read {_show(text)} as {_form(dim)}", dim.accepted)
        unit = m.group("unit")
        for a, b in _SPELLINGS:
            unit = unit.replace(a, b)
        unit = unit.strip()
        try:
            number = _read_number(m)
            if dim.name == "temperature":
                return _temperature(number, unit, text, path)
            if unit:
                factor = _factor(unit, dim)
            elif dim.name == "dimensionless":
                factor = 1.0
            else:
                raise _UnitProblem(f"{{text}} has no unit; {dim.article} needs one")
        except _UnitProblem as exc:
            raise InputError(path, str(exc).replace("{text}", _show(text)), dim.accepted) from None
        value = number * factor
    if not math.isfinite(value):
        raise InputError(path, f"must be finite, got {_show(text)}", dim.accepted)
    return value


def _temperature(number: float, unit: str, text: str, path: str) -> float:
    key = unit.replace(" ", "")
    if key not in _TEMPERATURE_UNITS:
        raise InputError(path, f"{_show(text)} needs a temperature unit", "K, degC or degF, e.g. '80 degC'")
    scale, zero = _TEMPERATURE_UNITS[key]
    value = number * scale + zero if zero else number * scale     # keeps -0.0 K bit-exact
    if not math.isfinite(value):
        raise InputError(path, f"must be finite, got {_show(text)}", "K, degC or degF, e.g. '80 degC'")
    return value


def _form(dim: Dimension) -> str:
    return "a number" if dim.name == "dimensionless" else f"{dim.article} (a number and a unit)"


def _show(value: Any) -> str:
    text = repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


def _number_text(value: float) -> str:
    """Shortest text of a float that float() reads back exactly."""
    text = repr(value)
    return text[:-2] if text.endswith(".0") else text


#: A preferred unit is used only when its number needs at most this many
#: significant digits; past that the SI unit with repr() reads better.
_MAX_DIGITS = 12


def _significant(text: str) -> int:
    """Significant digits of a decimal text such as '-0.00125' or '2.5e-07'."""
    mantissa = text.lstrip("+-").split("e")[0].replace(".", "").lstrip("0")
    return len(mantissa)


def _same(a: float, b: float) -> bool:
    return a == b and math.copysign(1.0, a) == math.copysign(1.0, b)


def format_quantity(value: float, dimension: str) -> str:
    """Canonical text of an SI value: exact under :func:`parse_quantity`.

    Tries the dimension's preferred units (mm, deg, rpm, kW, GPa, MPa) with
    the fewest decimals (at most 12 significant digits) that read back to
    the same float, bit for bit; else writes ``repr(value)`` in the SI unit,
    which always reads back exactly.

    >>> format_quantity(0.04, "length")
    '40 mm'
    >>> format_quantity(0.1, "angle")
    '0.1 rad'
    """
    dim = _dimension(dimension)
    v = float(value)
    if not math.isfinite(v):
        raise ValueError(f"cannot write a non-finite {dim.name}: {v!r}")
    if dim.name == "dimensionless":
        return _number_text(v)
    for unit in dim.preferred:
        factor, zero = _TEMPERATURE_UNITS[unit] if dim.name == "temperature" else (_KNOWN[unit][1], 0.0)
        y = (v - zero) / factor
        if not math.isfinite(y):
            continue
        tried: set[str] = set()
        for digits in range(16):
            text = _number_text(round(y, digits))
            if text in tried or _significant(text) > _MAX_DIGITS:
                continue
            tried.add(text)
            back = float(text) * factor + zero if zero else float(text) * factor
            if _same(back, v):
                return f"{text} {unit}"
    return f"{_number_text(v)} {dim.si}"

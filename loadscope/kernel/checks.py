"""Validity checks shared by the kernel: every range written down is checked.

Each check raises :class:`loadscope.InputError` naming the field and the
accepted range, and returns the value so checks read as assignments.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np

from ..errors import InputError

# Ranges the trade uses (common practice): normal pressure angles run from
# 14.5 deg (old standard) to 25 deg (heavy duty); 10..35 deg keeps special
# designs in and nonsense out. Helix angles above 45 deg are not built.
PRESSURE_ANGLE_RANGE = (math.radians(10.0), math.radians(35.0))
HELIX_ANGLE_RANGE = (0.0, math.radians(45.0))

# The smallest sizes, moduli and speeds the kernel takes (common practice: far below any real drive).
# A 1 um diameter or radius, a 1 MPa modulus (softer than any shaft material) and 1e-6 rad/s (one turn
# in about 72 days) still solve; values near 1e-300 overflow the solve's quotients and fourth powers.
MIN_SIZE = 1e-6         # [m]
MIN_MODULUS = 1e6       # [Pa]
MIN_SPEED = 1e-6        # [rad/s]


def finite(value: float, path: str, unit: str = "") -> float:
    """Reject NaN and infinities."""
    try:
        v = float(value)
    except (TypeError, ValueError):
        raise InputError(path, f"must be a number, got {value!r}", _unit_range("finite", unit)) from None
    if not math.isfinite(v):
        raise InputError(path, f"must be finite, got {v}", _unit_range("finite", unit))
    return v


def positive(value: float, path: str, unit: str = "") -> float:
    """Require a finite value > 0."""
    v = finite(value, path, unit)
    if v <= 0.0:
        raise InputError(path, f"must be positive, got {_fmt(v, unit)}", _unit_range("> 0", unit))
    return v


def non_negative(value: float, path: str, unit: str = "") -> float:
    """Require a finite value >= 0."""
    v = finite(value, path, unit)
    if v < 0.0:
        raise InputError(path, f"must not be negative, got {_fmt(v, unit)}", _unit_range(">= 0", unit))
    return v


def at_least(value: float, lo: float, path: str, unit: str = "") -> float:
    """Require a finite value >= ``lo`` (> 0), the floor of a real drive's scale.

    >>> at_least(0.03, MIN_SIZE, "shafts[0].sections[0].diameter", "m")
    0.03
    >>> try:
    ...     at_least(1e-300, MIN_MODULUS, "shafts[0].E", "Pa")
    ... except InputError as exc:
    ...     print(exc)
    shafts[0].E: is below the scale of any real drive, got 1e-300 Pa (accepted: >= 1e+06 Pa)
    """
    v = finite(value, path, unit)
    if v < lo:
        raise InputError(path, f"is below the scale of any real drive, got {_fmt(v, unit)}",
                         _unit_range(f">= {lo:g}", unit))
    return v


def speed(value: float, path: str) -> float:
    """A signed shaft speed [rad/s]: not zero (power flow needs a sense of
    rotation) and at least ``MIN_SPEED`` in magnitude.

    >>> speed(-152.9, "input.speed")
    -152.9
    >>> try:
    ...     speed(1e-300, "cases[0].speed")
    ... except InputError as exc:
    ...     print(exc.accepted)
    a magnitude >= 1e-06 rad/s, either sense
    """
    v = finite(value, path, "rad/s")
    if v == 0.0:
        raise InputError(path, "must not be zero: power flow needs a sense of rotation", "any non-zero speed")
    if abs(v) < MIN_SPEED:
        raise InputError(path, f"is below the scale of any real drive, got {_fmt(v, 'rad/s')}",
                         f"a magnitude >= {MIN_SPEED:g} rad/s, either sense")
    return v


def within(value: float, lo: float, hi: float, path: str, unit: str = "", *, degrees: bool = False) -> float:
    """Require lo <= value <= hi (angles shown in degrees when ``degrees``)."""
    v = finite(value, path, unit)
    if not lo <= v <= hi:
        if degrees:
            shown, rng = f"{math.degrees(v):.6g} deg", f"{math.degrees(lo):g} to {math.degrees(hi):g} deg"
        else:
            shown, rng = _fmt(v, unit), f"{lo:g} to {hi:g}" + (f" {unit}" if unit else "")
        raise InputError(path, f"is out of range, got {shown}", rng)
    return v


def vector3(value: Sequence[float], path: str, unit: str = "") -> tuple[float, float, float]:
    """A finite 3-vector as a tuple of floats."""
    if len(value) != 3:
        raise InputError(path, f"must have 3 components, got {len(value)}", "[x, y, z]")
    return (finite(value[0], f"{path}[0]", unit), finite(value[1], f"{path}[1]", unit),
            finite(value[2], f"{path}[2]", unit))


def unit_vector(value: Sequence[float], path: str) -> tuple[float, float, float]:
    """Normalise a non-zero 3-vector."""
    t = vector3(value, path)
    v = np.array(t, dtype=float)
    n = float(np.linalg.norm(v))
    if n < 1e-12:
        raise InputError(path, "must be a non-zero direction", "any non-zero [x, y, z]")
    if abs(n - 1.0) <= 1e-15:
        # Already a unit vector (to round-off): keep it as given, so that
        # normalising is idempotent and a saved model reloads bit-exact.
        return t
    v = v / n
    return (float(v[0]), float(v[1]), float(v[2]))


def all_finite(array: np.ndarray, what: str) -> np.ndarray:
    """Guard a kernel result: the kernel never returns NaN or inf silently."""
    if not np.all(np.isfinite(array)):
        raise InputError("", f"{what} is not finite; the inputs leave it undefined")
    return array


def _fmt(v: float, unit: str) -> str:
    return f"{v:.6g} {unit}".rstrip()


def _unit_range(rng: str, unit: str) -> str:
    return f"{rng} {unit}".rstrip()

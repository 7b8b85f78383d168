"""Range checks for array arguments of the rating functions.

The scalar checks in :mod:`loadscope.kernel.checks` serve the value objects;
the rating functions broadcast over numpy arrays (a sweep is one call), so
their checks take arrays, name the first offending element and return the
value as a float array. Every check raises :class:`loadscope.InputError` with
the field path and the accepted range; none lets a NaN through.
"""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ..errors import InputError

FloatArray = NDArray[np.float64]


def _fmt(v: float, unit: str) -> str:
    return f"{v:.6g} {unit}".rstrip()


def first_bad(arr: FloatArray, bad: NDArray[np.bool_]) -> tuple[float, str]:
    """The first offending value and, for arrays, where it sits."""
    idx = np.unravel_index(int(np.flatnonzero(bad)[0]), arr.shape)
    v = float(arr[idx])
    if arr.ndim == 0:
        return v, ""
    at = str(idx[0]) if arr.ndim == 1 else str(tuple(int(i) for i in idx))
    return v, f" (at index {at})"


def finite(value: ArrayLike, path: str, unit: str = "") -> FloatArray:
    """A float array with no NaN or infinity.

    >>> finite([1.0, 2.0], "x")
    array([1., 2.])
    """
    try:
        arr = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise InputError(path, f"must be a number or an array of numbers, got {value!r}",
                         f"finite {unit}".rstrip()) from None
    bad = ~np.isfinite(arr)
    if bad.any():
        v, at = first_bad(arr, bad)
        raise InputError(path, f"must be finite, got {v}{at}", f"finite {unit}".rstrip())
    return arr


def positive(value: ArrayLike, path: str, unit: str = "") -> FloatArray:
    """Finite and > 0.

    >>> positive(-2.0, "bearing.C", "N")
    Traceback (most recent call last):
    ...
    loadscope.errors.InputError: bearing.C: must be positive, got -2 N (accepted: > 0 N)
    """
    arr = finite(value, path, unit)
    bad = arr <= 0.0
    if bad.any():
        v, at = first_bad(arr, bad)
        raise InputError(path, f"must be positive, got {_fmt(v, unit)}{at}", f"> 0 {unit}".rstrip())
    return arr


def non_negative(value: ArrayLike, path: str, unit: str = "") -> FloatArray:
    """Finite and >= 0."""
    arr = finite(value, path, unit)
    bad = arr < 0.0
    if bad.any():
        v, at = first_bad(arr, bad)
        raise InputError(path, f"must not be negative, got {_fmt(v, unit)}{at}", f">= 0 {unit}".rstrip())
    return arr


def within(value: ArrayLike, lo: float, hi: float, path: str, unit: str = "", *, lo_open: bool = False,
           hi_open: bool = False, note: str = "") -> FloatArray:
    """Finite and within lo..hi (each end closed unless marked open).

    ``note`` is appended to the accepted range (e.g. the source of the range).

    >>> within(1.5, 0.0, 1.0, "q")
    Traceback (most recent call last):
    ...
    loadscope.errors.InputError: q: is out of range, got 1.5 (accepted: 0 <= value <= 1)
    """
    arr = finite(value, path, unit)
    below = arr <= lo if lo_open else arr < lo
    above = arr >= hi if hi_open else arr > hi
    bad = below | above
    if bad.any():
        v, at = first_bad(arr, bad)
        u = f" {unit}" if unit else ""
        rng = f"{lo:g}{u} {'<' if lo_open else '<='} value {'<' if hi_open else '<='} {hi:g}{u}"
        if note:
            rng += f"; {note}"
        raise InputError(path, f"is out of range, got {_fmt(v, unit)}{at}", rng)
    return arr


def choice(value: str, options: tuple[str, ...], path: str) -> str:
    """One of a fixed set of names.

    >>> choice("gerber", ("goodman", "gerber"), "criterion")
    'gerber'
    """
    if value not in options:
        raise InputError(path, f"unknown value {value!r}", ", ".join(options))
    return value


def scalar_or_array(arr: FloatArray) -> FloatArray:
    """Give a 0-d result back as a numpy scalar, arrays unchanged."""
    return arr[()] if isinstance(arr, np.ndarray) and arr.ndim == 0 else arr

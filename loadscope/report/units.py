"""Display units: SI or US customary, always printed beside the value.

The kernel works in SI; these factors only turn its floats into what a
person reads. Conversion factors are exact by definition (NIST SP 811,
Appendix B: 1 in = 0.0254 m, 1 ft = 0.3048 m, 1 lbf = 4.4482216152605 N, 1 hp = 745.69987158227 W).
"""

from __future__ import annotations

import math

from ..errors import InputError

# quantity kind -> (unit label, SI value of one display unit)
SYSTEMS: dict[str, dict[str, tuple[str, float]]] = {
    "si": {
        "force": ("N", 1.0),
        "moment": ("N*m", 1.0),
        "length": ("mm", 1e-3),
        "deflection": ("mm", 1e-3),
        "slope": ("mrad", 1e-3),
        "speed": ("rpm", math.pi / 30.0),
        "power": ("kW", 1e3),
        "angle": ("deg", math.pi / 180.0),
        "stress": ("MPa", 1e6),
        "velocity": ("m/s", 1.0),
    },
    "us": {
        "force": ("lbf", 4.4482216152605),
        "moment": ("lbf*in", 4.4482216152605 * 0.0254),
        "length": ("in", 0.0254),
        "deflection": ("in", 0.0254),
        "slope": ("mrad", 1e-3),
        "speed": ("rpm", math.pi / 30.0),
        "power": ("hp", 745.69987158227),
        "angle": ("deg", math.pi / 180.0),
        "stress": ("psi", 4.4482216152605 / 0.0254**2),
        "velocity": ("ft/min", 0.3048 / 60.0),
    },
}


def system(name: str) -> dict[str, tuple[str, float]]:
    """The unit table of ``"si"`` or ``"us"``."""
    if name not in SYSTEMS:
        raise InputError("units", f"unknown unit system {name!r}", "si, us")
    return SYSTEMS[name]


def label(units: str, kind: str) -> str:
    """Unit label of a quantity kind: ``label("us", "force") == "lbf"``."""
    return system(units)[kind][0]


def convert(value, units: str, kind: str):
    """SI value (float or array) to display units."""
    return value / system(units)[kind][1]

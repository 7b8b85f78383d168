"""loadscope's own look: colour roles, sizes and number formatting.

The palette is ours, picked for contrast on a warm off-white page and for
telling roles apart when printed in grey: warm colours for what the drive
receives (tooth forces, other applied loads), a cool teal for what the
supports give back (reactions), muted hues for the hardware, and a blue /
raspberry / near-black triple for the two shaft planes and their resultant.
Every builder reads its colours and sizes from here, so a change of look is a
change of this one module.
"""

from __future__ import annotations

import math
from typing import Any

from .. import CAUTION
from ..errors import InputError

#: colour role -> CSS colour. The roles are the only names builders use.
PALETTE: dict[str, str] = {
    "applied": "#E4572E",      # tooth force at a pitch point
    "other_load": "#F0A202",   # strand pulls and point loads
    "reaction": "#0F9D8A",     # force of a support on its shaft
    "shaft": "#8C97A8",
    "gear": "#7A5C8E",
    "bearing": "#243B55",
    "bolt": "#A0412D",
    "plane1": "#2F6FA6",       # first transverse plane of a shaft (x-y for a shaft along x)
    "plane2": "#C73E5D",       # second transverse plane (x-z)
    "resultant": "#1E1F24",
    "torque": "#5E8C61",
    "radial": "#0F9D8A",       # radial part of a reaction (same hue as the reaction itself)
    "axial": "#E08E45",
    "x": "#C4493B",            # global components
    "y": "#3E8E5E",
    "z": "#3B64B0",
    "station_support": "#243B55",
    "station_element": "#7A5C8E",
    "page": "#FBFAF7",
    "plot": "#F3F1EB",
    "grid": "#DDD8CC",
    "ink": "#2B2D33",
    "faint": "#6E6A62",
}

#: sweep lines cycle through these (distinct from the force roles above)
SERIES: tuple[str, ...] = ("#2F6FA6", "#C73E5D", "#5E8C61", "#E08E45", "#7A5C8E", "#1E1F24", "#0F9D8A",
                           "#A0412D")

#: dash pattern of bar fills per load case (plotly pattern shapes), cycled
CASE_PATTERNS: tuple[str, ...] = ("", "/", ".", "x", "\\", "+", "-", "|")

FONT = {"family": "DejaVu Sans, Verdana, sans-serif", "size": 12, "color": PALETTE["ink"]}

SIZES: dict[str, float] = {
    "arrow_share": 0.40,        # the largest force's arrow is this share of the drive's size
    "head_share": 0.045,        # arrow head length, share of the drive's size ...
    "head_max": 0.45,           # ... at most this share of the arrow's own length
    "head_radius": 0.38,        # head base radius / head length
    "head_sides": 8,             # facets of an arrow head
    "arrow_width": 6.0,         # [px]
    "shaft_sides": 20,          # facets round a shaft
    "ring_sides": 40,           # segments of a gear, pulley or bearing ring
    "bearing_ring": 1.45,       # bearing ring radius / shaft radius at the seat
    "gear_opacity": 0.28,
    "ring_width": 4.0,          # [px]
    "bearing_width": 9.0,       # [px]
    "bolt_marker": 6.0,         # [px]
    "line_width": 2.2,          # [px] of diagram lines
    "scene_height": 620.0,      # [px]
    "bars_height": 380.0,       # [px]
    "diagram_row": 210.0,       # [px] per diagram row
    "row_gap": 0.035,           # share of the figure height between stacked rows
}


def number(value: float) -> str:
    """A value as people read it beside its unit: four significant digits,
    whole numbers from 1000 up, no exponent in the usual range.

    >>> number(1654.4532), number(623.5016), number(12833.51), number(0.0012345), number(-0.0)
    ('1654', '623.5', '12834', '0.001234', '0')
    """
    v = float(value)
    if not math.isfinite(v):
        raise InputError("value", f"cannot show a non-finite value ({v!r})", "a finite number")
    if v == 0.0:
        return "0"
    if abs(v) >= 1000.0:
        return f"{v:.0f}"
    return f"{v:.4g}"


def base_layout(height: float) -> dict:
    """Page, fonts and margins shared by every figure (a fresh dict)."""
    return {
        "template": {},           # no plotly default theme: every colour here is ours
        "height": height,
        "paper_bgcolor": PALETTE["page"],
        "plot_bgcolor": PALETTE["plot"],
        "font": dict(FONT),
        "colorway": list(SERIES),
        "margin": {"l": 70, "r": 30, "t": 60, "b": 70},
        "legend": {"bgcolor": "rgba(251,250,247,0.85)", "bordercolor": PALETTE["grid"], "borderwidth": 1},
        "hoverlabel": {"font": {"family": FONT["family"], "size": 12}},
    }


def axis_2d(title: str) -> dict:
    """A 2D axis with our grid and zero line."""
    return {"title": {"text": title}, "gridcolor": PALETTE["grid"], "zerolinecolor": PALETTE["faint"],
            "zerolinewidth": 1, "linecolor": PALETTE["faint"], "showline": True, "ticks": "outside",
            "tickcolor": PALETTE["faint"], "exponentformat": "none"}


def axis_3d(title: str) -> dict:
    """A 3D scene axis."""
    return {"title": {"text": title}, "backgroundcolor": PALETTE["plot"], "showbackground": True,
            "gridcolor": PALETTE["grid"], "zerolinecolor": PALETTE["faint"]}


def caution_annotation(yshift: float = -10.0) -> dict[str, Any]:
    """The usual caution (``loadscope.CAUTION``), small, at the foot of a
    figure, ``yshift`` [px] below the bottom of the plotting area."""
    return {"text": "Caution: " + CAUTION.replace(" They must", "<br>They must"), "xref": "paper", "yref": "paper",
            "x": 0.0, "y": 0.0, "xanchor": "left", "yanchor": "top", "yshift": yshift, "showarrow": False,
            "align": "left", "font": {"size": 10, "color": PALETTE["faint"]}}

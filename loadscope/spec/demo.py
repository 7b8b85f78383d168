"""The embedded demo drive: an invented two-stage reducer, "SR-17", driving a
bulk-material screw conveyor (every number made up, chosen to be plausible).

* Motor: 5.5 kW, 4-pole, 1460 rpm, into the input shaft through a flexible
  coupling (half-coupling 1.8 kg on the shaft).
* Stage 1, helical: normal module 2 mm, 21 / 92 teeth, centre distance
  117 mm, so cos(beta) = 2 (21 + 92) / (2 * 117) and beta = 15.03 deg; pitch
  radii r = m_n z / (2 cos beta) = 21.743 mm and 95.257 mm. Pinion right
  hand, wheel left hand; efficiency 0.98.
* Stage 2, spur: module 3 mm, 19 / 73 teeth, centre distance 138 mm, pitch
  radii 28.5 mm and 109.5 mm; efficiency 0.985.
* Overall ratio (92/21)(73/19) = 16.83: the conveyor screw turns at 86.7 rpm.
* Output: a 16B-1 chain sprocket (1 in pitch, 17 teeth, pitch diameter
  25.4 mm / sin(180 deg / 17) = 138.23 mm) overhung on the output shaft; the
  chain runs down toward the conveyor's head shaft, its strands leaving at
  114 and 126 deg from +y toward +z.
* Housing: cast iron, 68 kg, foot-mounted on four M16 bolts, foundation
  plane y = 0, shaft axes 180 mm above it; bearing walls at x = 75 mm and
  x = 210 mm.

Rating data (invented, catalogue-like, not any maker's):

* Bearings: input shaft two deep-groove ball bearings of 35 mm bore
  (C 25.5 kN, C0 15.3 kN, f0 13.8); intermediate shaft a pair of tapered
  roller bearings of 35 mm bore back to back (C 54 kN, C0 60 kN, Y 1.6,
  e 0.37); output shaft two heavy-series deep-groove ball bearings of 50 mm
  bore (C 62 kN, C0 38 kN, f0 13.2). Target 20 000 h at 90 % reliability (L10).
* Shafts: input and intermediate quenched-and-tempered alloy steel
  (Sut 900 MPa, Sy 650 MPa), all three machined, DE-Goodman, required factor 1.5. Keyseats at the
  coupling, the wheel g2, the wheel g4 and the sprocket; bearing shoulders;
  a retaining-ring groove at the end of the output shaft. The chain makes
  the output torque pulsate: 10 % of it alternates.
* Bolts: M16 property class 8.8, preloaded to 65 kN, joint constant 0.25,
  thread in the shear plane.
* Load cases: rated 5.5 kW at 1460 rpm (70 % of the time), part load 3 kW at
  980 rpm on a frequency inverter (25 %), and a jam at 7.5 kW (5 %).

Shafts run along +x and are placed by the (y, z) of their axes: input at
z = 0, intermediate at z = 117 mm, output at z = 255 mm. The snapshot is
written as a user would write it (mm, deg, rpm, kW, kg), not in canonical
form.
"""

from __future__ import annotations

import json

_TARGET = {"target_life": "20000 h", "reliability": 0.9}
_DEEP_GROOVE_35 = {"type": "deep_groove", "C": "25.5 kN", "C0": "15.3 kN", "f0": 13.8, **_TARGET}
_DEEP_GROOVE_50 = {"type": "deep_groove", "C": "62 kN", "C0": "38 kN", "f0": 13.2, **_TARGET}
_TAPERED_35 = {"type": "tapered_roller", "C": "54 kN", "C0": "60 kN", "y": 1.6, "e": 0.37, **_TARGET}
_ALLOY_STEEL = {"Sut": "900 MPa", "Sy": "650 MPa", "finish": "machined", "temperature": "60 degC",
                "reliability": 0.99, "criterion": "goodman", "required_factor": 1.5}

_DEMO = {
    "format": "loadscope.drive",
    "version": 2,
    "name": "SR-17 screw-conveyor reducer (invented demo)",
    "shafts": [
        {
            "id": "input",
            "origin": ["0 mm", "180 mm", "0 mm"],
            "axis": [1, 0, 0],
            "sections": [
                {"length": "50 mm", "diameter": "28 mm"},
                {"length": "15 mm", "diameter": "32 mm"},
                {"length": "20 mm", "diameter": "35 mm"},
                {"length": "115 mm", "diameter": "40 mm"},
                {"length": "20 mm", "diameter": "35 mm"},
            ],
            "supports": [
                {"id": "A", "at": "75 mm", "axial": "locating", "bearing": _DEEP_GROOVE_35},
                {"id": "B", "at": "210 mm", "axial": "floating", "bearing": _DEEP_GROOVE_35},
            ],
            "gears": [
                {"id": "p1", "at": "110 mm", "kind": "helical", "teeth": 21, "pitch_radius": "21.743 mm",
                 "pressure_angle": "20 deg", "helix_angle": "15.03 deg", "hand": "right", "mass": "0.6 kg"},
            ],
            "couplings": [{"id": "coupling", "at": "25 mm", "mass": "1.8 kg"}],
            "material": _ALLOY_STEEL,
            "features": [
                {"id": "coupling keyseat", "kind": "keyseat", "at": "25 mm", "Kt": 2.14, "Kts": 3.0,
                 "radius": "0.6 mm"},
                {"id": "seal shoulder", "kind": "shoulder", "at": "50 mm", "Kt": 1.9, "Kts": 1.5, "radius": "1 mm"},
                {"id": "bearing shoulder A", "kind": "shoulder", "at": "85 mm", "Kt": 2.1, "Kts": 1.7,
                 "radius": "0.8 mm"},
            ],
        },
        {
            "id": "intermediate",
            "origin": ["60 mm", "180 mm", "117 mm"],
            "sections": [
                {"length": "25 mm", "diameter": "35 mm"},
                {"length": "110 mm", "diameter": "45 mm"},
                {"length": "25 mm", "diameter": "35 mm"},
            ],
            "supports": [
                {"id": "C", "at": "15 mm", "axial": "locating", "bearing": _TAPERED_35},
                {"id": "D", "at": "150 mm", "axial": "floating", "bearing": _TAPERED_35},
            ],
            "gears": [
                {"id": "g2", "at": "50 mm", "kind": "helical", "teeth": 92, "pitch_radius": "95.257 mm",
                 "pressure_angle": "20 deg", "helix_angle": "15.03 deg", "hand": "left", "mass": "4.8 kg"},
                {"id": "p3", "at": "110 mm", "kind": "spur", "teeth": 19, "pitch_radius": "28.5 mm",
                 "pressure_angle": "20 deg", "mass": "1.6 kg"},
            ],
            "material": _ALLOY_STEEL,
            "features": [
                {"id": "g2 keyseat", "kind": "keyseat", "at": "50 mm", "Kt": 2.14, "Kts": 3.0, "radius": "0.9 mm"},
                {"id": "shoulder C", "kind": "shoulder", "at": "25 mm", "Kt": 2.1, "Kts": 1.7, "radius": "1 mm"},
                {"id": "shoulder D", "kind": "shoulder", "at": "135 mm", "Kt": 2.1, "Kts": 1.7, "radius": "1 mm"},
            ],
            "pair": {"supports": ["C", "D"], "arrangement": "back_to_back"},
        },
        {
            "id": "output",
            "origin": ["60 mm", "180 mm", "255 mm"],
            "sections": [
                {"length": "25 mm", "diameter": "50 mm"},
                {"length": "110 mm", "diameter": "60 mm"},
                {"length": "25 mm", "diameter": "50 mm"},
                {"length": "20 mm", "diameter": "48 mm"},
                {"length": "70 mm", "diameter": "45 mm"},
            ],
            "supports": [
                {"id": "E", "at": "15 mm", "axial": "locating", "bearing": _DEEP_GROOVE_50},
                {"id": "F", "at": "150 mm", "axial": "floating", "bearing": _DEEP_GROOVE_50},
            ],
            "gears": [
                {"id": "g4", "at": "110 mm", "kind": "spur", "teeth": 73, "pitch_radius": "109.5 mm",
                 "pressure_angle": "20 deg", "mass": "10.5 kg"},
            ],
            "pulleys": [
                {"id": "sprocket", "at": "215 mm", "pitch_diameter": "138.23 mm",
                 "strand_angles": ["114 deg", "126 deg"], "wrap": 1, "tension_ratio": "inf", "mass": "2.9 kg"},
            ],
            "material": {"Sut": "900 MPa", "Sy": "650 MPa", "finish": "machined", "temperature": "60 degC",
                         "reliability": 0.99, "criterion": "goodman", "required_factor": 1.5},
            "features": [
                {"id": "g4 keyseat", "kind": "keyseat", "at": "110 mm", "Kt": 2.14, "Kts": 3.0, "radius": "1.2 mm"},
                {"id": "sprocket keyseat", "kind": "keyseat", "at": "215 mm", "Kf": 2.2, "Kfs": 2.6},
                {"id": "ring groove", "kind": "groove", "at": "245 mm", "Kt": 5.0, "Kts": 3.0, "radius": "0.2 mm"},
            ],
            "alternating_torque": 0.1,
        },
    ],
    "meshes": [
        {"id": "stage1", "gears": ["p1", "g2"], "efficiency": 0.98},
        {"id": "stage2", "gears": ["p3", "g4"], "efficiency": 0.985},
    ],
    "input": {"shaft": "input", "element": "coupling", "speed": "1460 rpm", "power": "5.5 kW"},
    "outputs": [{"shaft": "output", "element": "sprocket"}],
    "housing": {
        "bolts": [
            {"id": "B1", "position": ["45 mm", "0 mm", "-85 mm"]},
            {"id": "B2", "position": ["250 mm", "0 mm", "-85 mm"]},
            {"id": "B3", "position": ["250 mm", "0 mm", "375 mm"]},
            {"id": "B4", "position": ["45 mm", "0 mm", "375 mm"]},
        ],
        "plane_point": ["0 mm", "0 mm", "0 mm"],
        "plane_normal": [0, 1, 0],
        "mass": "68 kg",
        "center_of_mass": ["150 mm", "150 mm", "140 mm"],
        "bolt_method": "elastic",
        "fastener": {"diameter": "16 mm", "grade": "8.8", "standard": "iso_898_1", "preload": "65 kN",
                     "shear_plane": "thread", "stiffness_fraction": 0.25},
    },
    "cases": [
        {"name": "rated", "share": 0.70, "power": "5.5 kW", "speed": "1460 rpm"},
        {"name": "part load", "share": 0.25, "power": "3 kW", "speed": "980 rpm"},
        {"name": "jam", "share": 0.05, "power": "7.5 kW", "speed": "1460 rpm"},
    ],
}


def demo_snapshot() -> dict:
    """The demo drive's snapshot (a fresh dict each call; user units, not
    canonical: pass it through :func:`~loadscope.spec.dump_snapshot` for the
    canonical text)."""
    # Through JSON, not deepcopy: the bearing and material dicts are shared in
    # _DEMO, and a caller who edits one bearing must not edit its twin.
    return json.loads(json.dumps(_DEMO))

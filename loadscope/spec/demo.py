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

Shafts run along +x and are placed by the (y, z) of their axes: input at
z = 0, intermediate at z = 117 mm, output at z = 255 mm. The snapshot is
written as a user would write it (mm, deg, rpm, kW, kg), not in canonical
form.
"""

from __future__ import annotations

import copy

_DEMO = {
    "format": "loadscope.drive",
    "version": 1,
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
                {"id": "A", "at": "75 mm", "axial": "locating"},
                {"id": "B", "at": "210 mm", "axial": "floating"},
            ],
            "gears": [
                {"id": "p1", "at": "110 mm", "kind": "helical", "teeth": 21, "pitch_radius": "21.743 mm",
                 "pressure_angle": "20 deg", "helix_angle": "15.03 deg", "hand": "right", "mass": "0.6 kg"},
            ],
            "couplings": [{"id": "coupling", "at": "25 mm", "mass": "1.8 kg"}],
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
                {"id": "C", "at": "15 mm", "axial": "locating"},
                {"id": "D", "at": "150 mm", "axial": "floating"},
            ],
            "gears": [
                {"id": "g2", "at": "50 mm", "kind": "helical", "teeth": 92, "pitch_radius": "95.257 mm",
                 "pressure_angle": "20 deg", "helix_angle": "15.03 deg", "hand": "left", "mass": "4.8 kg"},
                {"id": "p3", "at": "110 mm", "kind": "spur", "teeth": 19, "pitch_radius": "28.5 mm",
                 "pressure_angle": "20 deg", "mass": "1.6 kg"},
            ],
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
                {"id": "E", "at": "15 mm", "axial": "locating"},
                {"id": "F", "at": "150 mm", "axial": "floating"},
            ],
            "gears": [
                {"id": "g4", "at": "110 mm", "kind": "spur", "teeth": 73, "pitch_radius": "109.5 mm",
                 "pressure_angle": "20 deg", "mass": "10.5 kg"},
            ],
            "pulleys": [
                {"id": "sprocket", "at": "215 mm", "pitch_diameter": "138.23 mm",
                 "strand_angles": ["114 deg", "126 deg"], "wrap": 1, "tension_ratio": "inf", "mass": "2.9 kg"},
            ],
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
    },
}


def demo_snapshot() -> dict:
    """The demo drive's snapshot (a fresh dict each call; user units, not
    canonical: pass it through :func:`~loadscope.spec.dump_snapshot` for the
    canonical text)."""
    return copy.deepcopy(_DEMO)

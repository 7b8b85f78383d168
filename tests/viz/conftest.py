"""Shared fixtures of the viz tests: the demo drive and variants of it that
keep its topology (same shafts, sections, elements, meshes, bolts)."""

from __future__ import annotations

import pytest

from loadscope import solve
from loadscope.spec import demo_snapshot, drive_from_snapshot


def variant(**changes):
    """The demo snapshot with a few values changed (keys name what changes)."""
    snap = demo_snapshot()
    if "power" in changes:
        snap["input"]["power"] = changes["power"]
    if "speed" in changes:
        snap["input"]["speed"] = changes["speed"]
    if "pressure_angle" in changes:                 # both gears of the spur stage
        snap["shafts"][1]["gears"][1]["pressure_angle"] = changes["pressure_angle"]
        snap["shafts"][2]["gears"][0]["pressure_angle"] = changes["pressure_angle"]
    if "support_b" in changes:
        snap["shafts"][0]["supports"][1]["at"] = changes["support_b"]
    if "diameter" in changes:
        snap["shafts"][0]["sections"][3]["diameter"] = changes["diameter"]
    if "strands" in changes:
        snap["shafts"][2]["pulleys"][0]["strand_angles"] = changes["strands"]
    if changes.get("no_housing"):
        del snap["housing"]
    return solve(drive_from_snapshot(snap))


VARIANTS = {
    "power": {"power": "7.5 kW"},
    "speed": {"speed": "-980 rpm"},
    "pressure_angle": {"pressure_angle": "25 deg"},
    "support": {"support_b": "200 mm"},
    "diameter": {"diameter": "44 mm"},
    "strands": {"strands": ["200 deg", "215 deg"]},
}


@pytest.fixture(scope="session")
def demo():
    return solve(drive_from_snapshot(demo_snapshot()))


@pytest.fixture(scope="session", params=sorted(VARIANTS))
def changed(request):
    return variant(**VARIANTS[request.param])

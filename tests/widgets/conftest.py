"""Shared helpers of the widget tests: explorers whose page messages are
recorded (no kernel, no browser), and the demo snapshot with values changed
through the spec layer, for direct kernel solves to compare with."""

from __future__ import annotations

import pytest

from loadscope import solve
from loadscope.spec import demo_snapshot, drive_from_snapshot
from loadscope.widgets import DriveExplorer
from loadscope.widgets.capture import capture_comms


def demo_with(edit) -> dict:
    """The demo snapshot after ``edit(snapshot)`` (which changes it in place)."""
    snap = demo_snapshot()
    edit(snap)
    return snap


def solve_snapshot(snap: dict):
    """A direct kernel solve of a snapshot, the oracle the widgets must match."""
    return solve(drive_from_snapshot(snap))


@pytest.fixture
def recorded():
    """A fresh DriveExplorer on the demo drive and the recorder of all it sends."""
    with capture_comms() as rec:
        explorer = DriveExplorer()
    rec.clear()
    return explorer, rec

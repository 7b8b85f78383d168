"""The demo snapshot with values changed through the spec layer, and direct
kernel solves of it: the oracle the widget tests compare with."""

from __future__ import annotations

from loadscope import solve
from loadscope.spec import demo_snapshot, drive_from_snapshot


def demo_with(edit) -> dict:
    """The demo snapshot after ``edit(snapshot)`` (which changes it in place)."""
    snap = demo_snapshot()
    edit(snap)
    return snap


def solve_snapshot(snap: dict):
    """A direct kernel solve of a snapshot, the oracle the widgets must match."""
    return solve(drive_from_snapshot(snap))

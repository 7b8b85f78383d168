"""Shared fixture of the widget tests: an explorer whose page messages are
recorded (no kernel, no browser)."""

from __future__ import annotations

import pytest

from loadscope.widgets import DriveExplorer
from loadscope.widgets.capture import capture_comms


@pytest.fixture
def recorded():
    """A fresh DriveExplorer on the demo drive and the recorder of all it sends."""
    with capture_comms() as rec:
        explorer = DriveExplorer(rating="off")     # margins have their own tests (test_widget_margins.py)
    rec.clear()
    return explorer, rec

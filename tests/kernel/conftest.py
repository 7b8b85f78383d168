"""Fixtures shared by the rating tests: the demo drive and its ratings,
built once per session (both are frozen, so sharing them is safe)."""

import pytest

from loadscope import rate, spec


@pytest.fixture(scope="session")
def drive():
    return spec.drive_from_snapshot(spec.demo_snapshot())


@pytest.fixture(scope="session")
def ratings(drive):
    return rate(drive)

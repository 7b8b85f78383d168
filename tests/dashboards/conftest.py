"""Fixtures of the real-browser tests: one ``loadscope serve`` per session,
one headless Debian chromium (``/usr/bin/chromium``) per session, and helpers
that read a dashboard page the way a person sees it.

Jupyter, IPython and chromium write under a temporary HOME. Screenshots go to
``artifacts/`` (gitignored).
"""

from __future__ import annotations

import os
from pathlib import Path

import pytest
from dashboard_harness import CHROMIUM, Server, launch_browser, test_environment

ARTIFACTS = Path(__file__).resolve().parents[2] / "artifacts"


def pytest_collection_modifyitems(config, items):
    """Without chromium the browser tests cannot run: skip them on a
    developer's machine; ``make test`` installs chromium first, and on CI a
    missing browser fails the tests rather than skipping them."""
    if Path(CHROMIUM).exists() or os.environ.get("CI"):
        return
    skip = pytest.mark.skip(reason=f"{CHROMIUM} missing: `make test` installs it (apt-get install chromium)")
    for item in items:
        if "dashboards" in str(item.path) and "browser" in item.keywords:
            item.add_marker(skip)


@pytest.fixture(scope="session")
def env(tmp_path_factory):
    return test_environment(tmp_path_factory.mktemp("home"))


@pytest.fixture(scope="session")
def server(env, tmp_path_factory):
    """A dashboard server with one warm kernel per dashboard (the default)."""
    srv = Server(env, tmp_path_factory.mktemp("server"), pool=1)
    yield srv
    srv.stop()


@pytest.fixture(scope="session")
def browser(env):
    with launch_browser(env) as b:
        yield b


@pytest.fixture(scope="session")
def artifacts():
    ARTIFACTS.mkdir(exist_ok=True)
    return ARTIFACTS

"""``loadscope serve`` itself: its options are checked before anything
starts, it listens on loopback only, and plotly.js is a static file the
browser caches (the page loads it from there, not over the websocket)."""

from __future__ import annotations

import json
import urllib.request

import psutil
import pytest
from dashboard_harness import Dashboard

from loadscope import cli, spec
from loadscope.serving import SNAPSHOT_ENV, startup_snapshot


@pytest.mark.parametrize("argv, field", [
    (["serve", "--port", "70000"], "--port"),
    (["serve", "--pool", "-1"], "--pool"),
    (["serve", "--base-url", "loadscope"], "--base-url"),
    (["serve", "--snapshot", "no-such-file.json"], "--snapshot"),
])
def test_bad_option_is_reported_before_the_server_starts(argv, field, capsys):
    assert cli.main(argv + ["--no-browser"]) == cli.EXIT_INPUT
    err = capsys.readouterr().err
    assert err.startswith(f"loadscope: input error: {field}")
    assert "Traceback" not in err


def test_broken_snapshot_is_reported_before_the_server_starts(tmp_path, capsys):
    snap = spec.demo_snapshot()
    snap["input"]["speed"] = "-5 furlongs"
    bad = tmp_path / "bad.json"
    bad.write_text(json.dumps(snap))
    assert cli.main(["serve", "--snapshot", str(bad), "--no-browser"]) == cli.EXIT_INPUT
    assert "input.speed" in capsys.readouterr().err


def test_startup_snapshot_comes_from_the_environment(monkeypatch):
    monkeypatch.delenv(SNAPSHOT_ENV, raising=False)
    assert startup_snapshot() is None
    monkeypatch.setenv(SNAPSHOT_ENV, "/srv/drives/a.json")
    assert startup_snapshot() == "/srv/drives/a.json"


def test_server_listens_on_loopback_only(server):
    listening = [c.laddr for c in psutil.Process(server.proc.pid).net_connections(kind="inet")
                 if c.status == psutil.CONN_LISTEN]
    assert listening and all(addr.ip == "127.0.0.1" for addr in listening), listening
    assert server.port in {addr.port for addr in listening}


def test_plotly_js_is_a_static_file_cached_for_good(server):
    req = urllib.request.Request(server.url + "loadscope/static/plotly-basic.min.js?v=1", method="HEAD")
    with urllib.request.urlopen(req, timeout=30) as r:
        assert r.status == 200
        assert "immutable" in r.headers["Cache-Control"] and "max-age=31536000" in r.headers["Cache-Control"]
        assert "javascript" in r.headers["Content-Type"]


@pytest.mark.browser
def test_page_loads_plotly_from_the_static_route(server, browser):
    context = browser.new_context(viewport={"width": 1000, "height": 700})
    try:
        board = Dashboard.open(context, server, "shaft")
        urls = board.page.evaluate("() => performance.getEntriesByType('resource').map(e => e.name)")
        assert [u for u in urls if "/loadscope/static/plotly-basic.min.js?v=" in u]
        assert not [u for u in urls if "jupyterlab-plotly" in u]    # plotly's own lab extension stays out
        board.close()
    finally:
        context.close()


@pytest.mark.browser
def test_log_stays_quiet_while_pages_are_served(server, browser):
    """What `make demo` prints is what a user must read: no warning that
    the dashboards are "not trusted" (they are signed in the server's memory)
    and none that a kernel talks over unencrypted TCP (its channels are
    encrypted with CurveZMQ keys the server hands out)."""
    before = len(server.log.read_text())   # the session's server: earlier tests' lines (refused requests) stay out
    context = browser.new_context(viewport={"width": 1000, "height": 700})
    try:
        Dashboard.open(context, server, "gear_pair").close()
    finally:
        context.close()
    server.warm()                          # the pool's next kernel has started too
    log = server.log.read_text()
    assert "is not trusted" not in log
    assert "without encryption" not in log
    assert "WARNING" not in log[before:], log[before:][-2000:]


@pytest.mark.browser
def test_page_asks_nothing_of_other_hosts(server, browser):
    """A team server may be offline, and opening a dashboard should not tell
    a third party who did: every request of the page goes to our server
    (Voila's stock page fetches an icon font from a public CDN; our page
    template leaves it out)."""
    context = browser.new_context(viewport={"width": 1000, "height": 700})
    try:
        page = context.new_page()
        urls: list[str] = []
        page.on("request", lambda r: urls.append(r.url))
        board = Dashboard(page, "shaft")
        page.goto(server.page_url("shaft"), wait_until="commit")
        board.wait_ready()
        board.close()
    finally:
        context.close()
    assert urls
    elsewhere = [u for u in urls if not u.startswith((server.url, "blob:", "data:"))]
    assert elsewhere == []

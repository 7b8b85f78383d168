"""Margins and load cases in the explorers, compared with direct calls of
the kernel's rating (the oracle: the same drive written as a snapshot)."""

from __future__ import annotations

import asyncio
from concurrent.futures import ThreadPoolExecutor
from dataclasses import replace

import numpy as np
import pytest
from widget_drives import demo_with

from loadscope.kernel.cases import solve_cases
from loadscope.kernel.ratings import DUTY_CYCLE, rate
from loadscope.report import margins_rows
from loadscope.spec import drive_from_snapshot
from loadscope.viz import reaction_bars
from loadscope.widgets import DriveExplorer, ShaftExplorer
from loadscope.widgets.capture import capture_comms
from loadscope.widgets.state import RATING_DELAY, ExplorerState


@pytest.fixture
def rated():
    with capture_comms():
        return DriveExplorer(rating="sync")


def test_margins_follow_a_move_and_match_the_rating(rated):
    ex = rated
    ex.panel.set_value("shafts[2].supports[1].at", 140.0)        # mm
    want = rate(drive_from_snapshot(demo_with(lambda s: s["shafts"][2]["supports"][1].update(at="140 mm"))))
    assert ex.state.ratings_current
    assert ex.margins.rows == margins_rows(want, DUTY_CYCLE, "si")
    assert "output/F" in ex.margins.html.value and "Caution" in ex.margins.html.value
    ex.margins.case.value = "jam"
    assert ex.margins.rows == margins_rows(want, "jam", "si")


def test_load_case_bars_match_direct_case_solves(rated):
    ex = rated
    ex.panel.set_value("cases[2].power", 9.0)                    # kW, the "jam" case
    ex.reactions.bars.value = "cases"
    snap = demo_with(lambda s: s["cases"][2].update(power="9 kW"))
    runs = solve_cases(drive_from_snapshot(snap))
    want = reaction_bars(runs[0].result, "si", "radial_axial", {r.case.name: r.result for r in runs})
    got = ex.reactions.view.spec
    assert [t["name"] for t in got["data"]] == [t["name"] for t in want["data"]]
    assert got["data"][0]["name"].startswith("rated")
    for a, b in zip(got["data"], want["data"]):
        np.testing.assert_allclose(a["y"], b["y"], rtol=1e-12)


def test_deferred_rating_waits_for_the_controls_to_be_still():
    async def scenario():
        state = ExplorerState(rating="deferred")
        first = state.ratings
        for kw in (5.0, 5.2, 5.4):
            state.propose(lambda d, p=kw * 1e3: replace(d, input=replace(d.input, power=p), cases=()))
            assert not state.ratings_current and state.ratings is first      # nothing rated while moving
        await asyncio.sleep(RATING_DELAY * 2 + 0.2)
        assert state.ratings_current and state.ratings is not first
        assert state.ratings.cases[0].case.power == pytest.approx(5400.0)   # the last state, rated once
    # A fresh thread has no running event loop, whatever an earlier test (a browser
    # session's sync driver) left running on this one.
    with ThreadPoolExecutor(1) as pool:
        pool.submit(asyncio.run, scenario()).result()


def test_shaft_explorer_shows_only_its_margins():
    with capture_comms():
        ex = ShaftExplorer(shaft="output", rating="sync")
    assert ex.margins.rows
    assert {r["component"].split("/")[0].split(" at ")[0] for r in ex.margins.rows} == {"output"}


def _cli_margins(tmp_path, units: str) -> dict:
    """What `loadscope solve --format json` prints for the demo drive: the oracle of the sizing column."""
    import contextlib
    import io
    import json

    from loadscope.cli import main
    from loadscope.spec import demo_snapshot, dump_snapshot

    path = tmp_path / "demo.json"
    path.write_text(dump_snapshot(demo_snapshot()))
    out = io.StringIO()
    with contextlib.redirect_stdout(out):
        assert main(["solve", str(path), "--format", "json", "--units", units]) == 0
    return json.loads(out.getvalue())["ratings"]


def test_sizing_column_shows_what_the_cli_prints_in_both_unit_systems(rated, tmp_path):
    import html
    import re

    ex = rated
    for units, length, force in (("si", "mm", "N"), ("us", "in", "lbf")):
        ex.state.units = units
        cli = _cli_margins(tmp_path, units)
        for case in [*(c["name"] for c in cli["cases"]), DUTY_CYCLE]:
            ex.margins.case.value = case
            want = next((c["margins"] for c in cli["cases"] if c["name"] == case), cli["duty_cycle"]["margins"])
            cells = [html.unescape(c) for c in re.findall(r"<td class='sizing'>(.*?)</td>", ex.margins.html.value)]
            assert cells == [r["sizing"] for r in want], (units, case)
        assert "<th>sizing</th>" in ex.margins.html.value
        assert any(re.search(rf"d_min [\d.,]+ {length}", c) for c in cells)        # sections: d_min
        assert any(re.search(rf"C needed [\d.,]+ {force}", c) for c in cells)      # bearings: the C needed

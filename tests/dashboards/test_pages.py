"""Each dashboard in a real browser (headless Debian chromium): it renders
its widgets and figures without asking for WebGL, a slider changes the numbers and
every plot, a saved snapshot opens back to the same state, and a broken file
shows its message and keeps the state. Screenshots go to artifacts/."""

from __future__ import annotations

import json

import pytest
from dashboard_harness import COUNT_WEBGL, DASHBOARDS, FIGURES, Dashboard

from loadscope import CAUTION, spec
from loadscope.viz.style import PALETTE

pytestmark = pytest.mark.browser

#: a slider every dashboard shows first (the drive's own group)
SLIDER = "input power"


def _break_first(node, key, value):
    """Set the first ``key`` found in a snapshot (depth first) to ``value``."""
    if isinstance(node, dict):
        if key in node:
            node[key] = value
            return True
        return any(_break_first(v, key, value) for v in node.values())
    if isinstance(node, list):
        return any(_break_first(v, key, value) for v in node)
    return False


@pytest.fixture(scope="module", params=DASHBOARDS)
def board(request, server, browser):
    """One page per dashboard, shared by the tests below in order (a page
    load costs seconds of CPU in a software-rendering browser)."""
    context = browser.new_context(viewport={"width": 1400, "height": 1000}, accept_downloads=True)
    context.add_init_script(COUNT_WEBGL)
    page = Dashboard.open(context, server, request.param)
    yield page
    page.close()
    context.close()


def test_page_renders_its_widgets_and_figures(board, artifacts):
    assert board.figure_errors() == []
    assert all(n > 0 for n in board.plotted()), "every figure view holds a drawn plot"
    assert len(board.revs()) == FIGURES[board.name]
    page_text = board.page.inner_text("body")
    assert "SR-17" in page_text                      # the demo drive's name
    assert CAUTION.split(".")[0] in page_text        # the usual caution
    assert board.param(SLIDER).count() == 1
    assert board.webgl_contexts() == 0              # the 3D scene is drawn on a 2D canvas
    board.screenshot(artifacts / f"dashboard-{board.name}.png")


def test_slider_changes_the_numbers_and_every_plot(board):
    readout, table, revs = board.readout(SLIDER), board.table_text(), board.revs()
    board.move_slider(SLIDER, 3)
    board.wait_revs_above(revs)
    assert board.readout(SLIDER) != readout
    assert board.wait_table_change(table) != table
    board.settle()


def test_gear_pair_shows_its_pair_and_switches_to_another(board):
    if board.name != "gear_pair":
        pytest.skip("the gear-pair dashboard's own controls")
    pair = board.page.locator("table[data-table='pair'] caption")
    assert pair.inner_text().startswith("pair stage1: p1 on input / g2 on intermediate")
    revs = board.revs()
    board.page.locator(".loadscope-mesh-choice select").select_option("stage2")
    board.wait_revs_above(revs)                      # both figures redrawn for the other pair
    board.page.wait_for_function(
        "() => document.querySelector(\"table[data-table='pair'] caption\").innerText.startsWith('pair stage2')",
        timeout=20_000)
    assert "g4 on output" in pair.inner_text()
    assert board.figure_errors() == []
    revs = board.revs()
    board.page.locator(".loadscope-mesh-choice select").select_option("stage1")    # as it opened, for the tests after
    board.wait_revs_above(revs)
    board.settle()


def test_snapshot_saves_and_opens_back(board, tmp_path):
    saved_table, saved_readout = board.table_text(), board.readout(SLIDER)
    file = board.save_snapshot(tmp_path / "saved.json")
    drive = spec.load_snapshot(file)                 # the download is a valid snapshot
    assert [s.id for s in drive.shafts] == ["input", "intermediate", "output"]

    board.move_slider(SLIDER, 4)
    board.wait_table_change(saved_table)
    board.settle()
    assert board.readout(SLIDER) != saved_readout
    board.open_snapshot(file)
    board.wait_table(saved_table)
    assert board.readout(SLIDER) == saved_readout
    assert board.message().strip() == ""


def test_broken_snapshot_shows_its_error_and_keeps_the_state(board, tmp_path):
    good = json.loads(board.save_snapshot(tmp_path / "good.json").read_text())
    assert _break_first(good, "pressure_angle", "40 deg")
    broken = tmp_path / "broken.json"
    broken.write_text(json.dumps(good))
    table, readout, revs = board.table_text(), board.readout(SLIDER), board.revs()

    board.open_snapshot(broken)
    board.page.wait_for_function(
        "() => document.querySelector('.loadscope-message').innerText.includes('pressure_angle')", timeout=20_000)
    assert "35 deg" in board.message()               # the accepted range is named
    assert board.table_text() == table and board.readout(SLIDER) == readout and board.revs() == revs

    not_json = tmp_path / "notes.json"
    not_json.write_text("shafts: [input, output]\n")    # YAML-like text, not JSON
    board.open_snapshot(not_json)
    board.page.wait_for_function(
        "() => !document.querySelector('.loadscope-message').innerText.includes('pressure_angle')", timeout=20_000)
    assert "JSON" in board.message()
    assert board.table_text() == table and board.revs() == revs


def _rgb(hex_colour: str) -> tuple[int, int, int]:
    return tuple(int(hex_colour[i:i + 2], 16) for i in (1, 3, 5))  # type: ignore[return-value]


def test_scene_draws_the_drive_and_follows_slider_drag_and_reset(board):
    """The force scene's own canvas renderer: the drive and its applied-load
    arrows are on the canvas; a slider step and a drag each change the
    picture; a double click brings back the picture from before the drag;
    hovering an arrow shows its text."""
    if board.page.locator("[data-figure=force_scene]").count() == 0:
        pytest.skip(f"{board.name} shows no force scene")
    tooth = _rgb(PALETTE["applied"])
    before = board.scene_pixels(tooth)
    assert before is not None and before["drawn"] > 0.05, before    # hardware, axes and arrows drawn
    pulls = board.scene_pixels(_rgb(PALETTE["other_load"]))
    assert before["near"] + pulls["near"] > 50, (before, pulls)      # applied-load arrows in their colours

    revs = board.revs()
    board.move_slider(SLIDER, 3)
    board.wait_revs_above(revs)
    board.settle()
    moved = board.scene_pixels(tooth)
    assert moved["hash"] != before["hash"]

    box = board.page.locator("[data-figure=force_scene] canvas").bounding_box()
    x, y = box["x"] + box["width"] / 2, box["y"] + box["height"] / 2
    mouse = board.page.mouse
    mouse.move(x, y)
    mouse.down()
    mouse.move(x + 90, y + 30, steps=5)
    mouse.up()
    board.page.wait_for_timeout(300)
    turned = board.scene_pixels(tooth)
    assert turned["hash"] != moved["hash"] and turned["drawn"] > 0.05

    mouse.dblclick(x + 90, y + 30)
    board.page.wait_for_timeout(300)
    assert board.scene_pixels(tooth)["hash"] == moved["hash"]

    # hover on an applied-load arrow shows that load's text (both kinds carry "|F|")
    spot = board.scene_spot(_rgb(PALETTE["other_load"])) or board.scene_spot(tooth)
    assert spot is not None
    mouse.move(*spot)
    hover = board.page.locator("[data-figure=force_scene] .loadscope-scene-hover")
    hover.wait_for(state="visible", timeout=5_000)
    assert "|F|" in hover.inner_text()

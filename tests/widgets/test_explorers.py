"""Explorers driven as a person would, compared with direct kernel solves of
the same drive written as a snapshot (the spec layer and the kernel are the
oracle; the widgets must show exactly their numbers)."""

from __future__ import annotations

import json
import math

import numpy as np
import pandas as pd
import pytest
from widget_drives import demo_with, solve_snapshot

from loadscope import InputError
from loadscope.report import tables
from loadscope.spec import demo_snapshot, dump_snapshot
from loadscope.viz import force_scene, reaction_bars, shaft_diagrams
from loadscope.widgets import DriveExplorer, MeshExplorer, ShaftExplorer
from loadscope.widgets.capture import capture_comms
from loadscope.widgets.panel import unit_of

LBF = 4.4482216152605      # N, NIST SP 811 Appendix B (exact by definition)
HP = 745.69987158227       # W, same source


def _same_figures(explorer, expected, units="si"):
    """The explorer's figure specs equal the builders' specs of ``expected``."""
    scale = explorer.forces.view.spec["layout"]["meta"]["arrow_scale"]
    pairs = [
        (explorer.reactions.view.spec, reaction_bars(expected, units)),
        (explorer.diagrams.view.spec, shaft_diagrams(expected, explorer.diagrams.shaft.value, units)),
        (explorer.forces.view.spec, force_scene(expected, units, explorer.forces.show.value, scale)),
    ]
    for got, want in pairs:
        assert len(got["data"]) == len(want["data"])
        for tg, tw in zip(got["data"], want["data"]):
            for key in ("x", "y", "z"):
                if key in tw and any(isinstance(v, str) for v in tw[key]):
                    assert tg[key] == tw[key]
                elif key in tw:
                    a = np.array(tg[key], dtype=float)
                    b = np.array(tw[key], dtype=float)
                    np.testing.assert_allclose(a, b, rtol=1e-12, atol=1e-12)


def _same_tables(explorer, expected, units="si"):
    want = tables(expected, units)
    for name, frame in explorer.table.frames.items():
        pd.testing.assert_frame_equal(frame, want[name], rtol=1e-12)


def test_power_slider_matches_a_direct_solve(recorded):
    ex, rec = recorded
    before = {p: p.spec for p in ex.plots}
    ex.panel.set_value("input.power", 7.5)                       # kW
    assert ex.state.error == ""
    expected = solve_snapshot(demo_with(lambda s: s["input"].update(power="7.5 kW")))
    _same_figures(ex, expected)
    _same_tables(ex, expected)
    assert all(p.spec is not before[p] and p.rev == 1 for p in ex.plots)
    assert "7.5" in ex.table.value
    # one message per figure, each a delta
    assert sorted(c["kind"] for c in rec.custom()) == ["delta"] * 3


def test_pressure_angle_slider_sets_both_gears_of_the_pair(recorded):
    ex, _ = recorded
    ex.panel.set_value("meshes[1].pressure_angle", 25.0)         # deg

    def edit(s):
        s["shafts"][1]["gears"][1]["pressure_angle"] = "25 deg"
        s["shafts"][2]["gears"][0]["pressure_angle"] = "25 deg"
    expected = solve_snapshot(demo_with(edit))
    _same_figures(ex, expected)
    _same_tables(ex, expected)


def test_bearing_slider_moves_the_bearing(recorded):
    ex, _ = recorded
    ex.panel.set_value("shafts[2].supports[1].at", 140.0)        # mm
    expected = solve_snapshot(demo_with(lambda s: s["shafts"][2]["supports"][1].update(at="140 mm")))
    _same_figures(ex, expected)
    _same_tables(ex, expected)


def test_pitch_radius_slider_keeps_the_centre_distance(recorded):
    ex, _ = recorded
    ex.panel.set_value("meshes[0].pitch_radius", 30.0)           # mm; the mate follows
    assert ex.state.error == ""
    g = {gr.id: gr for sh in ex.state.drive.shafts for gr in sh.gears}
    # centre distance of the demo's stage 1: 117 mm (shafts at z = 0 and z = 117 mm)
    assert g["p1"].pitch_radius + g["g2"].pitch_radius == pytest.approx(0.117, rel=1e-12)
    assert g["p1"].teeth is None and g["g2"].teeth is None       # the ratio now comes from the radii

    def edit(s):
        for shaft, k, r in ((0, 0, "30 mm"), (1, 0, "87 mm")):
            gear = s["shafts"][shaft]["gears"][k]
            gear["pitch_radius"] = r
            del gear["teeth"]
    expected = solve_snapshot(demo_with(edit))
    _same_tables(ex, expected)
    # the ratio moved: intermediate speed = 1460 rpm * 30/87
    speed = ex.table.frames["shafts"].set_index("shaft").loc["intermediate", "speed [rpm]"]
    assert abs(speed) == pytest.approx(1460 * 30 / 87, rel=1e-9)


def test_pitch_radius_of_a_pinion_in_a_ring_keeps_the_centre_distance():
    def ring(s):            # stage 2 as an internal pair: 166.5 - 28.5 = 138 mm, the shafts' distance
        s["shafts"][2]["gears"][0].update(internal=True, pitch_radius="166.5 mm", teeth=111)
    with capture_comms():
        ex = DriveExplorer(demo_with(ring), rating="off")
    ex.panel.set_value("meshes[1].pitch_radius", 30.0)           # mm, the pinion p3; the ring follows
    assert ex.state.error == ""
    g = {gr.id: gr for sh in ex.state.drive.shafts for gr in sh.gears}
    assert g["g4"].pitch_radius - g["p3"].pitch_radius == pytest.approx(0.138, rel=1e-12)

    def edit(s):
        ring(s)
        for shaft, k, r in ((1, 1, "30 mm"), (2, 0, "168 mm")):
            s["shafts"][shaft]["gears"][k]["pitch_radius"] = r
            del s["shafts"][shaft]["gears"][k]["teeth"]
    _same_tables(ex, solve_snapshot(demo_with(edit)))


def test_bad_value_shows_the_message_and_keeps_the_state(recorded):
    ex, rec = recorded
    drive, result = ex.state.drive, ex.state.result
    specs = [p.spec for p in ex.plots]
    # bearing F onto bearing E: two supports at one point cannot hold the shaft
    ex.panel.set_value("shafts[2].supports[1].at", 15.0)
    assert ex.state.error
    assert "shafts[2]" in ex.state.error or "support" in ex.state.error
    assert ex.message.value and "Not applied" in ex.message.value
    assert ex.state.drive is drive and ex.state.result is result
    assert [p.spec for p in ex.plots] == specs and all(p.rev == 0 for p in ex.plots)
    assert rec.custom() == []
    assert ex.panel.value("shafts[2].supports[1].at") == pytest.approx(150.0)   # the control went back
    ex.panel.set_value("input.power", 6.0)                       # the next good value clears the message
    assert ex.state.error == "" and ex.message.value == ""


@pytest.mark.parametrize("key, value", [
    ("shafts[0].sections[3].diameter", float("nan")),     # a browser may send anything a number box holds
    ("input.power", float("nan")),
    ("meshes[0].efficiency", float("nan")),
])
def test_a_value_that_is_not_a_number_is_refused(recorded, key, value):
    ex, rec = recorded
    drive = ex.state.drive
    ex.panel.controls[key].input.value = value
    assert "must be" in ex.state.error and ex.state.drive is drive
    assert rec.custom() == []


def test_page_round_off_of_a_value_is_not_a_move(recorded):
    ex, rec = recorded
    result = ex.state.result
    ex.panel.set_value("meshes[0].pitch_radius", 21.743 * (1 + 1e-15))      # what a slider may echo back
    assert ex.state.result is result and rec.custom() == []
    assert ex.state.drive.shafts[0].gears[0].teeth == 21                    # nothing dropped


def test_units_toggle_changes_labels_and_converts_values(recorded):
    ex, rec0 = recorded
    si_table = ex.table.frames["reactions"].copy()
    with capture_comms() as rec:                                 # controls are made when their group opens
        controls = ex.panel.controls                             # every group opened
    rec.clear()
    rec0.clear()
    ex.units.value = "us"
    # each control's new bounds and value reach the page in one message (else the page clamps the value)
    for key, ctl in controls.items():
        if unit_of("si", ctl.param.kind) == unit_of("us", ctl.param.kind):
            continue                                             # rpm, deg, plain numbers: nothing to send
        sent = [m.data["state"] for m in rec0.messages + rec.messages
                if m.comm_id == ctl.input.comm.comm_id and m.data.get("method") == "update"]
        assert len(sent) == 1 and {"value", "max", "description"} <= set(sent[0]), key
    assert ex.state.units == "us"
    ctl = ex.panel.controls["input.power"]
    assert ctl.unit == "hp" and ctl.input.description == "input power [hp]"
    assert ex.panel.value("input.power") == pytest.approx(5500.0 / HP, rel=1e-12)
    assert ex.panel.value("shafts[2].supports[1].at") == pytest.approx(150.0 / 25.4, rel=1e-12)
    assert ex.panel.controls["meshes[0].pressure_angle"].unit == "deg"
    us_table = ex.table.frames["reactions"]
    assert "radial [lbf]" in us_table.columns and "radial [N]" not in us_table.columns
    np.testing.assert_allclose(us_table["radial [lbf]"], si_table["radial [N]"] / LBF, rtol=1e-12)
    assert "[lbf]" in ex.reactions.view.spec["layout"]["yaxis"]["title"]["text"]
    assert "[in]" in ex.diagrams.view.spec["layout"]["xaxis4"]["title"]["text"]
    assert "lbf" in ex.forces.view.spec["layout"]["title"]["text"]
    assert "lbf" in ex.table.value and "[N]" not in ex.table.value
    # a move in US units reaches the kernel in SI
    ex.panel.set_value("input.power", 10.0)                      # hp
    assert ex.state.drive.input.power == pytest.approx(10.0 * HP, rel=1e-12)
    expected = solve_snapshot(demo_with(lambda s: s["input"].update(power="10 hp")))
    _same_tables(ex, expected, "us")


def test_explorers_open_the_demo_and_any_snapshot(tmp_path):
    snap = demo_with(lambda s: s["input"].update(power="3 kW"))
    path = tmp_path / "drive.json"
    path.write_text(json.dumps(snap))
    with capture_comms():
        for source in (snap, str(path), path, json.dumps(snap)):
            ex = ShaftExplorer(source, shaft="output")
            assert ex.state.drive.input.power == pytest.approx(3000.0)
        demo = MeshExplorer()
        assert dump_snapshot(demo.state.drive) == dump_snapshot(demo_snapshot())
        assert set(demo.panel.controls) >= {"meshes[0].pressure_angle", "meshes[0].helix_angle",
                                            "meshes[0].pitch_radius", "input.speed", "input.power"}
        assert not any(k.startswith("shafts[") for k in demo.panel.controls)
        shaft = ShaftExplorer(shaft="intermediate")
        assert {"shafts[1].supports[0].at", "shafts[1].supports[1].at"} <= set(shaft.panel.controls)
        assert shaft.diagrams.shaft.value == "intermediate"
        with pytest.raises(InputError, match="no shaft 'nope'"):
            ShaftExplorer(shaft="nope")
        bad = demo_with(lambda s: s["shafts"][0]["gears"][0].update(pressure_angle="50 deg"))
        with pytest.raises(InputError, match=r"shafts\[0\]\.gears\[0\]\.pressure_angle"):
            DriveExplorer(bad)


def test_panel_offers_the_trade_inputs_with_units_and_ranges(recorded):
    ex, _ = recorded
    # only the open group's controls exist in the page at first
    assert set(ex.panel._built) == {"input.speed", "input.power"}
    keys = set(ex.panel.controls)
    assert {"input.speed", "input.power", "meshes[0].pressure_angle", "meshes[0].helix_angle",
            "meshes[0].pitch_radius", "meshes[1].pitch_radius", "shafts[0].supports[0].at"} <= keys
    for key, ctl in ex.panel.controls.items():
        lo, hi, v = ctl.input.min, ctl.input.max, ctl.input.value
        assert lo <= v <= hi and lo < hi, key
        assert ctl.param.kind == "number" or ctl.input.description.endswith(f"[{ctl.unit}]") and ctl.unit, key
    for key, ctl in ex.panel.controls.items():
        if ctl.param.control == "slider":
            # the page snaps a slider to min + n * step: the value shown must already be on that grid
            n = (ctl.input.value - ctl.input.min) / ctl.input.step
            assert n == pytest.approx(round(n), abs=1e-6), key
    pa = ex.panel.controls["meshes[0].pressure_angle"].input
    assert (pa.min, pa.max) == pytest.approx((10.0, 35.0))       # the kernel's accepted range
    assert math.isclose(ex.panel.value("input.speed"), 1460.0)

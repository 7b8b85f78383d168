"""The gear-pair explorer shows its pair: the two shafts that carry the
mesh's gears, their bearings' reactions, and the pair's readouts. Oracles:
a direct kernel solve of the same drive written as a snapshot, and closed
forms from the snapshot's own numbers (tooth counts, pitch radii, power,
speed)."""

from __future__ import annotations

import math

import numpy as np
import pytest
from widget_drives import demo_with, solve_snapshot

from loadscope.report import mesh_summary
from loadscope.spec import demo_snapshot
from loadscope.viz import force_scene, reaction_bars
from loadscope.widgets import MeshExplorer
from loadscope.widgets.capture import capture_comms


@pytest.fixture
def pair():
    with capture_comms():
        yield MeshExplorer()


def _readout(ex) -> dict[str, float]:
    return {q: v for q, v, _ in ex.pair.summary["rows"]}


def _same_focused_figures(ex, expected, shafts, units="si"):
    scale = ex.forces.view.spec["layout"]["meta"]["arrow_scale"]
    want = force_scene(expected, units, ex.forces.show.value, scale, shafts)
    assert ex.forces.view.spec["layout"]["meta"]["shafts"] == list(shafts)
    for got, exp in ((ex.forces.view.spec, want), (ex.reactions.view.spec, reaction_bars(expected, units,
                                                                                         shafts=shafts))):
        assert [t["name"] for t in got["data"]] == [t["name"] for t in exp["data"]]
        for tg, tw in zip(got["data"], exp["data"]):
            for key in ("x", "y", "z"):
                if key in tw and tw[key] and not any(isinstance(v, str) for v in tw[key]):
                    np.testing.assert_allclose(np.array(tg[key], dtype=float), np.array(tw[key], dtype=float),
                                               rtol=1e-12, atol=1e-12)
                elif key in tw:
                    assert tg[key] == tw[key]


def test_the_pair_opens_on_its_two_shafts_and_the_numbers_of_its_mesh(pair):
    ex = pair
    expected = solve_snapshot(demo_snapshot())
    _same_focused_figures(ex, expected, ("input", "intermediate"))
    assert ex.reactions.view.spec["data"][0]["x"] == ["input · A", "input · B", "intermediate · C",
                                                      "intermediate · D"]
    assert ex.pair.summary == mesh_summary(expected, "stage1", "si")
    html = ex.table.value
    assert "output" not in html.split("data-table='teeth'")[0]          # shafts and reactions: the pair's
    assert ">stage1<" in html and ">stage2<" not in html
    assert "data-table='pair'" in ex.pair.value and "Caution" in ex.children[-1].value


def test_readouts_agree_with_closed_forms_from_the_snapshot(pair):
    """Stage 1 of the demo: 21 / 92 teeth, pitch radii 21.743 / 95.257 mm,
    helical, normal pressure angle 20 deg, helix 15.03 deg; the pinion takes
    5.5 kW at 1460 rpm. W_t = P / (omega r) (Shigley 9th ed., Eq. 13-35, from
    memory), W_r = W_t tan(phi_t), tan(phi_t) = tan(phi_n) / cos(psi),
    W_a = W_t tan(psi) (Eq. 13-39); v = omega r; ratio = N2 / N1."""
    got = _readout(pair)
    a = 21.743e-3 + 95.257e-3                      # centre distance of the shafts' bores [m]
    r1 = a * 21 / (21 + 92)                        # operating pitch radius from the tooth ratio [m]
    omega = 1460 * math.pi / 30
    wt = 5500 / (omega * r1)
    psi, phi_n = math.radians(15.03), math.radians(20)
    assert got["transmitted force W_t"] == pytest.approx(wt, rel=1e-12)
    assert got["radial force"] == pytest.approx(wt * math.tan(phi_n) / math.cos(psi), rel=1e-9)
    assert got["axial force"] == pytest.approx(wt * math.tan(psi), rel=1e-9)
    assert got["speed ratio n_driver / n_driven"] == pytest.approx(92 / 21, rel=1e-12)
    assert got["centre distance"] == pytest.approx(117.0, rel=1e-12)            # mm
    assert got["pitch diameter of p1"] + got["pitch diameter of g2"] == pytest.approx(2 * 117.0, rel=1e-12)
    assert got["pitch-line speed"] == pytest.approx(omega * r1, rel=1e-12)      # m/s
    assert got["power through the mesh"] == pytest.approx(5.5, rel=1e-12)       # kW, the input power
    assert wt * got["pitch-line speed"] == pytest.approx(5500, rel=1e-12)       # P = W_t v


def test_a_move_and_the_units_toggle_follow_the_kernel(pair):
    ex = pair
    ex.panel.set_value("input.power", 7.5)                       # kW
    expected = solve_snapshot(demo_with(lambda s: s["input"].update(power="7.5 kW")))
    _same_focused_figures(ex, expected, ("input", "intermediate"))
    assert ex.pair.summary == mesh_summary(expected, "stage1", "si")
    ex.state.units = "us"
    assert ex.pair.summary == mesh_summary(expected, "stage1", "us")
    assert "ft/min" in ex.pair.value and "lbf" in ex.pair.value


def test_the_mesh_choice_moves_every_part_to_the_other_pair(pair):
    ex = pair
    assert list(ex.mesh.options) == ["stage1", "stage2"]
    ex.mesh.value = "stage2"
    expected = solve_snapshot(demo_snapshot())
    _same_focused_figures(ex, expected, ("intermediate", "output"))
    assert ex.pair.summary == mesh_summary(expected, "stage2", "si")
    assert _readout(ex)["speed ratio n_driver / n_driven"] == pytest.approx(73 / 19, rel=1e-12)
    keys = set(ex.panel.controls)
    assert "meshes[1].pressure_angle" in keys and not any(k.startswith("meshes[0]") for k in keys)
    # the strand pulls of the sprocket on the output shaft now act on a shaft of the pair
    assert ex.forces.view.spec["data"][-2]["name"] == "strand pulls and loads"
    assert len([v for v in ex.forces.view.spec["data"][-2]["x"] if v is None]) == 2
    ex.panel.set_value("meshes[1].pressure_angle", 25.0)            # deg, both gears of stage2
    moved = solve_snapshot(demo_with(lambda s: [g.update(pressure_angle="25 deg") for g in
                                                (s["shafts"][1]["gears"][1], s["shafts"][2]["gears"][0])]))
    assert ex.pair.summary == mesh_summary(moved, "stage2", "si")


def test_an_opened_drive_with_other_meshes_keeps_a_pair_in_view(pair):
    ex = pair
    snap = demo_snapshot()
    snap["meshes"] = [{**m, "id": f"m{k}"} for k, m in enumerate(snap["meshes"])]
    assert ex.state.open(snap)
    assert list(ex.mesh.options) == ["m0", "m1"] and ex.mesh.value == "m0"
    assert ex.pair.summary["mesh"] == "m0"
    assert ex.forces.view.spec["layout"]["meta"]["shafts"] == ["input", "intermediate"]
    assert "meshes[0].pitch_radius" in ex.panel.controls

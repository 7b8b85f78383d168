"""Reaction bars, shaft diagrams, the dashboard figure and sweep lines.

Oracles: the kernel's results (the charts must show exactly its numbers,
converted), the unit definitions of NIST SP 811 Appendix B (1 in = 0.0254 m,
1 lbf = 4.4482216152605 N, exact), and statics of a beam: the shear jumps by
the support reaction at a simple support (Gere & Goodno, Mechanics of
Materials, relation between load and shear force; the sign follows the
convention stated in loadscope.kernel.shafts).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from conftest import variant

from loadscope import CAUTION, InputError, solve
from loadscope.report.units import convert
from loadscope.spec import demo_snapshot, drive_from_snapshot
from loadscope.viz import DIAGRAM_ROWS, dashboard_figure, reaction_bars, shaft_diagrams, sweep_plot

LBF = 4.4482216152605          # [N] per lbf (NIST SP 811 B.8)
INCH = 0.0254                  # [m] per in (NIST SP 811 B.8)
KINDS = {"V1": "force", "V2": "force", "M1": "moment", "M2": "moment", "M": "moment", "T": "moment",
         "v1": "deflection", "v2": "deflection", "deflection": "deflection"}
CURVES = [key for _, _, curves in DIAGRAM_ROWS for key, _ in curves]


# --------------------------------------------------------------------------- reaction bars

def test_bars_show_radial_and_axial_of_every_bearing(demo):
    spec = reaction_bars(demo)
    radial, axial = spec["data"]
    cats = [f"{sr.id} · {sid}" for sr in demo.shafts for sid in sr.solution.support_ids]
    assert radial["x"] == cats == axial["x"] and len(cats) == 6
    rl = np.vstack([sr.solution.reactions_local for sr in demo.shafts])
    np.testing.assert_allclose(radial["y"], np.hypot(rl[:, 1], rl[:, 2]), rtol=1e-15)
    np.testing.assert_array_equal(axial["y"], rl[:, 0])
    assert spec["layout"]["yaxis"]["title"]["text"].endswith("[N]")
    assert "radial 1259 N" in radial["hovertext"][0]


def test_component_bars_are_the_global_reaction_vectors(demo):
    spec = reaction_bars(demo, parts="components")
    rg = np.vstack([sr.solution.reactions_global for sr in demo.shafts])
    assert [t["name"] for t in spec["data"]] == ["x (global)", "y (global, up)", "z (global)"]
    for j, tr in enumerate(spec["data"]):
        np.testing.assert_array_equal(tr["y"], rg[:, j])


def test_us_bars_divide_by_the_pound_force(demo):
    si, us = reaction_bars(demo), reaction_bars(demo, units="us")
    for a, b in zip(si["data"], us["data"]):
        np.testing.assert_allclose(np.array(b["y"]) * LBF, a["y"], rtol=1e-14)
        assert all(t.endswith(" lbf") for t in b["hovertext"])
    assert us["layout"]["yaxis"]["title"]["text"] == "reaction on the shaft [lbf]"


def test_load_cases_get_one_trace_per_case_and_part(demo):
    strong = variant(power="7.5 kW")
    spec = reaction_bars(demo, cases={"5.5 kW": demo, "7.5 kW": strong})
    assert [t["name"] for t in spec["data"]] == ["5.5 kW · radial", "5.5 kW · axial (along the shaft axis)",
                                                 "7.5 kW · radial", "7.5 kW · axial (along the shaft axis)"]
    rl = np.vstack([sr.solution.reactions_local for sr in strong.shafts])
    np.testing.assert_allclose(spec["data"][2]["y"], np.hypot(rl[:, 1], rl[:, 2]), rtol=1e-15)
    assert spec["data"][0]["marker"]["pattern"]["shape"] != spec["data"][2]["marker"]["pattern"]["shape"]
    # plotly's default fill mode paints a patterned bar in the pattern's background (the page
    # colour here), hiding the part colour; overlay keeps the colour under the hatch.
    assert all(t["marker"]["pattern"]["fillmode"] == "overlay" for t in spec["data"])
    assert len({t["offsetgroup"] for t in spec["data"]}) == 4


@pytest.mark.parametrize(("kwargs", "path", "accepted"), [
    ({"parts": "xyz"}, "parts", "radial_axial, components"),
    ({"units": "cgs"}, "units", "si, us"),
    ({"cases": {}}, "cases", "None, or {name: DriveResult, ...}"),
    ({"cases": {"a": 3}}, "cases['a']", "DriveResult"),
])
def test_bad_bar_arguments(demo, kwargs, path, accepted):
    with pytest.raises(InputError) as err:
        reaction_bars(demo, **kwargs)
    assert (err.value.path, err.value.accepted) == (path, accepted)


def test_cases_of_another_drive_are_refused(demo):
    reaction_bars(demo, cases={"bare": variant(no_housing=True)})      # the same bearings: accepted
    snap = demo_snapshot()
    snap["shafts"][0]["supports"][1]["id"] = "B2"
    with pytest.raises(InputError) as err:
        reaction_bars(demo, cases={"other": solve(drive_from_snapshot(snap))})
    assert err.value.path == "cases['other']" and "input.B," in err.value.accepted


# --------------------------------------------------------------------------- shaft diagrams

@pytest.mark.parametrize("shaft_id", ["input", "intermediate", "output"])
@pytest.mark.parametrize("units", ["si", "us"])
def test_diagram_curves_are_the_kernels_arrays_converted(demo, shaft_id, units):
    spec = shaft_diagrams(demo, shaft_id, units)
    d = demo.shaft(shaft_id).solution.diagram
    assert [t["hovertemplate"].split("<br>")[0] for t in spec["data"]] == [f"shaft {shaft_id} · {k}" for k in CURVES]
    for key, tr in zip(CURVES, spec["data"]):
        np.testing.assert_array_equal(tr["x"], convert(d["s"], units, "length"))
        np.testing.assert_array_equal(tr["y"], convert(d[key], units, KINDS[key]))


def test_us_diagrams_use_the_exact_factors_and_labels(demo):
    si, us = shaft_diagrams(demo, "output"), shaft_diagrams(demo, "output", "us")
    factor = {"force": LBF, "moment": LBF * INCH, "deflection": INCH / 1e-3}   # N, N*m, mm per US unit
    for key, a, b in zip(CURVES, si["data"], us["data"]):
        np.testing.assert_allclose(np.array(b["x"]) * INCH / 1e-3, a["x"], rtol=1e-14)
        np.testing.assert_allclose(np.array(b["y"]) * factor[KINDS[key]], a["y"], rtol=1e-13, atol=1e-300)
    titles = [us["layout"][f"yaxis{'' if n == 1 else n}"]["title"]["text"] for n in range(1, 5)]
    assert titles == ["shear [lbf]", "bending [lbf*in]", "torque [lbf*in]", "deflection [in]"]
    assert us["layout"]["xaxis4"]["title"]["text"] == "axial position on shaft output [in]"
    assert "lbf*in" in us["data"][2]["hovertemplate"]


def test_both_sides_of_each_jump_are_drawn_and_shear_jumps_by_the_reaction(demo):
    for sr in demo.shafts:
        spec = shaft_diagrams(demo, sr.id)
        s = np.array(spec["data"][0]["x"]) * 1e-3
        sol = sr.solution
        for st in sol.stations:
            assert np.count_nonzero(np.isclose(s, st, rtol=0, atol=1e-12)) >= 2
        sh = demo.drive.shaft(sr.id)
        for sp, rl in zip(sh.supports, sol.reactions_local):
            # No other load sits at the demo's bearing seats, so the jump is the reaction alone.
            idx = np.flatnonzero(np.isclose(s, sp.at, rtol=0, atol=1e-12))
            for j, key in ((0, "V1"), (1, "V2")):
                y = np.array(spec["data"][j]["y"])
                assert math.isclose(y[idx[-1]] - y[idx[0]], rl[1 + j], rel_tol=1e-12, abs_tol=1e-9), key


def test_stations_are_marked_on_every_row_and_the_axial_axis_is_shared(demo):
    spec = shaft_diagrams(demo, "output")
    sh = demo.drive.shaft("output")
    marks = [sp.at for sp in sh.supports] + [e.at for e in (*sh.gears, *sh.pulleys, *sh.couplings, *sh.loads)]
    shapes = spec["layout"]["shapes"]
    assert len(shapes) == 4 * len(marks) == 16
    for k, at in enumerate(marks):
        rows = shapes[4 * k:4 * k + 4]
        assert {r["x0"] for r in rows} == {at / 1e-3} and {r["yref"] for r in rows} == {
            "y domain", "y2 domain", "y3 domain", "y4 domain"}
    labels = [a["text"] for a in spec["layout"]["annotations"][:-1]]
    assert labels == ["E", "F", "g4", "sprocket"]
    for n in (1, 2, 3):
        assert spec["layout"]["xaxis" if n == 1 else f"xaxis{n}"]["matches"] == "x4"
    domains = [spec["layout"]["yaxis" if n == 1 else f"yaxis{n}"]["domain"] for n in range(1, 5)]
    assert all(0 <= lo < hi <= 1 for lo, hi in domains)
    assert all(domains[i][0] > domains[i + 1][1] for i in range(3))      # stacked, no overlap


def test_unknown_shaft_id_names_the_argument_and_the_shafts(demo):
    for build in (shaft_diagrams, dashboard_figure):
        with pytest.raises(InputError) as err:
            build(demo, "spindle")
        assert err.value.path == "shaft_id" and err.value.accepted == "input, intermediate, output"
        assert "'spindle'" in str(err.value)


def test_trace_counts_are_stable_under_parameter_changes(demo, changed):
    for build in (lambda r: reaction_bars(r), lambda r: shaft_diagrams(r, "input"),
                  lambda r: dashboard_figure(r, "output")):
        a, b = build(demo), build(changed)
        assert [(t["type"], t["name"], t.get("xaxis"), t.get("yaxis")) for t in a["data"]] == \
               [(t["type"], t["name"], t.get("xaxis"), t.get("yaxis")) for t in b["data"]]
        assert len(a["layout"].get("shapes", ())) == len(b["layout"].get("shapes", ()))


# --------------------------------------------------------------------------- dashboard

def test_dashboard_holds_the_bars_and_the_diagrams_in_one_figure(demo):
    dash = dashboard_figure(demo, "intermediate", "us")
    bars = reaction_bars(demo, "us")["data"]
    diag = shaft_diagrams(demo, "intermediate", "us")["data"]
    assert len(dash["data"]) == len(bars) + len(diag) == 11
    for a, b in zip(dash["data"][:2], bars):
        assert (a["x"], a["y"], a["xaxis"], a["yaxis"]) == (b["x"], b["y"], "x", "y")
    for n, (a, b) in enumerate(zip(dash["data"][2:], diag)):
        assert (a["x"], a["y"], a["name"]) == (b["x"], b["y"], b["name"])
        assert a["xaxis"] != "x" and a["yaxis"] != "y", n
    lay = dash["layout"]
    domains = [lay["yaxis" if n == 1 else f"yaxis{n}"]["domain"] for n in range(1, 6)]
    assert all(domains[i][0] > domains[i + 1][1] for i in range(4))
    assert lay["yaxis"]["title"]["text"] == "reaction [lbf]" and lay["xaxis2"]["matches"] == "x5"
    assert {s["xref"] for s in lay["shapes"]} == {"x2", "x3", "x4", "x5"}


# --------------------------------------------------------------------------- sweeps and caution

def test_sweep_plot_draws_each_series_against_x():
    spec = sweep_plot(np.array([1.0, 2.0, 3.0]), {"C": [10, 20, 30], "D": (1, 2, 4)}, "power [kW]", "load [N]")
    assert [t["name"] for t in spec["data"]] == ["C", "D"]
    assert spec["data"][1]["x"] == [1.0, 2.0, 3.0] and spec["data"][1]["y"] == [1.0, 2.0, 4.0]
    assert "kW" in spec["data"][0]["hovertemplate"] and "N" in spec["data"][0]["hovertemplate"]


@pytest.mark.parametrize(("args", "path"), [
    (([1, 2], {"a": [1, 2]}, "power", "load [N]"), "x_label"),
    (([1, 2], {"a": [1, 2]}, "power [kW]", "load"), "y_label"),
    (([1, 2], {"a": [1, 2, 3]}, "power [kW]", "load [N]"), "ys['a']"),
    (([1, float("nan")], {"a": [1, 2]}, "power [kW]", "load [N]"), "x[1]"),
    (([1, 2], {"a": [1, float("inf")]}, "power [kW]", "load [N]"), "ys['a'][1]"),
    (([1, 2], {}, "power [kW]", "load [N]"), "ys"),
    (([], {"a": []}, "power [kW]", "load [N]"), "x"),
])
def test_bad_sweep_input_is_refused_not_drawn(args, path):
    with pytest.raises(InputError) as err:
        sweep_plot(*args)
    assert err.value.path == path and err.value.accepted


def test_every_2d_figure_carries_the_caution(demo):
    for spec in (reaction_bars(demo), shaft_diagrams(demo, "input"), dashboard_figure(demo, "input"),
                 sweep_plot([0, 1], {"a": [0, 1]}, "x [mm]", "y [N]")):
        assert spec["layout"]["meta"]["caution"] == CAUTION
        assert "qualified engineer" in spec["layout"]["annotations"][-1]["text"]


def test_focused_bars_are_those_of_the_chosen_shafts(demo):
    whole = reaction_bars(demo, parts="components")
    pair = reaction_bars(demo, parts="components", shafts=["output", "intermediate"])
    assert pair["data"][0]["x"] == ["intermediate · C", "intermediate · D", "output · E", "output · F"]
    keep = [whole["data"][0]["x"].index(c) for c in pair["data"][0]["x"]]
    for a, b in zip(pair["data"], whole["data"]):
        assert a["y"] == [b["y"][i] for i in keep]
        assert a["hovertext"] == [b["hovertext"][i] for i in keep]
    assert pair["layout"]["meta"]["shafts"] == ["intermediate", "output"]
    assert reaction_bars(demo, shafts=None) == reaction_bars(demo)
    with pytest.raises(InputError, match="shafts: no shaft 'x'"):
        reaction_bars(demo, shafts=["x"])

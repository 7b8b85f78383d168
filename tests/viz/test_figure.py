"""Figure data as data: JSON-ready, valid for plotly, and updatable in place.

Oracles: the JSON standard (``json.dumps(..., allow_nan=False)`` refuses
NaN and infinity, which JSON does not have) and plotly's own validation
(``plotly.graph_objects.Figure`` checks every property name and value).
"""

from __future__ import annotations

import copy
import json

import plotly.graph_objects as go
import pytest
from conftest import variant

from loadscope import InputError
from loadscope.viz import (
    as_figure,
    dashboard_figure,
    figure_update,
    force_scene,
    reaction_bars,
    scene_update,
    shaft_diagrams,
    sweep_plot,
)

BUILDERS = {
    "scene": lambda r, u: force_scene(r, u, show="both"),
    "bars": lambda r, u: reaction_bars(r, u),
    "components": lambda r, u: reaction_bars(r, u, parts="components", cases={"a": r, "b": r}),
    "diagrams": lambda r, u: shaft_diagrams(r, "output", u),
    "dashboard": lambda r, u: dashboard_figure(r, "intermediate", u),
    "sweep": lambda r, u: sweep_plot([1, 2, 3], {"C": [3.0, 2.0, 1.0]}, "power [kW]", "load [N]"),
}


def plain(value) -> bool:
    """Only dict, list, str, bool, int, float and None, all the way down."""
    if isinstance(value, dict):
        return all(isinstance(k, str) and plain(v) for k, v in value.items())
    if isinstance(value, list):
        return all(plain(v) for v in value)
    return value is None or type(value) in (str, bool, int, float)


@pytest.mark.parametrize("units", ["si", "us"])
@pytest.mark.parametrize("name", sorted(BUILDERS))
def test_specs_are_plain_json_and_valid_plotly(demo, name, units):
    spec = BUILDERS[name](demo, units)
    assert plain(spec)                                  # no numpy scalars or arrays left inside
    text = json.dumps(spec, allow_nan=False)
    assert json.loads(text) == spec
    fig = as_figure(spec)                               # plotly validates every property here
    assert isinstance(fig, go.Figure) and len(fig.data) == len(spec["data"])


def apply(old, delta):
    """Apply a delta the way a FigureWidget update does (top-level keys per trace)."""
    new = copy.deepcopy(old)
    for trace, change in zip(new["data"], delta["data"]):
        trace.update(change)
    new["layout"].update(delta["layout"])
    return new


@pytest.mark.parametrize("name", sorted(BUILDERS))
def test_the_update_turns_the_old_spec_into_the_new_one(demo, changed, name):
    old, new = BUILDERS[name](demo, "si"), BUILDERS[name](changed, "si")
    delta = figure_update(old, new)
    assert apply(old, delta) == new
    json.dumps(delta, allow_nan=False)


def test_a_power_change_leaves_the_hardware_out_of_the_scene_update(demo):
    old, new = force_scene(demo), force_scene(variant(power="7.5 kW"))
    delta = scene_update(old, new)
    n = len(demo.shafts)
    assert delta["data"][:n + 3] == [{}] * (n + 3)          # shafts, gear discs and rings, bearings: not sent
    assert set(delta["data"][n + 3]) == {"hovertext"}       # bolts stay put; only their loads change
    for change in delta["data"]:
        assert not {"i", "j", "k", "type", "name"} & set(change)
    assert len(json.dumps(delta)) < len(json.dumps(new)) / 2


def test_the_update_reaches_a_plotly_figure(demo):
    old, new = dashboard_figure(demo, "output"), dashboard_figure(variant(support_b="200 mm"), "output")
    fig = as_figure(old)
    delta = figure_update(old, new)
    with fig.batch_update():
        for trace, change in zip(fig.data, delta["data"]):
            if change:
                trace.update(change)
        fig.layout.update(delta["layout"])
    assert fig.to_plotly_json() == as_figure(new).to_plotly_json()


def test_specs_of_another_structure_are_refused(demo):
    with pytest.raises(InputError) as err:
        figure_update(reaction_bars(demo), reaction_bars(demo, cases={"a": demo, "b": demo}))
    assert err.value.path == "new_spec" and "has 4 traces where old_spec has 2" in str(err.value)
    with pytest.raises(InputError) as err:
        figure_update(shaft_diagrams(demo, "input"), dashboard_figure(demo, "input"))
    assert err.value.path == "new_spec"
    a = reaction_bars(demo)
    b = reaction_bars(demo)
    b["data"][0]["name"] = "other"
    with pytest.raises(InputError) as err:
        figure_update(a, b)
    assert "trace 0 changes its name" in str(err.value)
    with pytest.raises(InputError) as err:
        figure_update({"data": []}, a)
    assert err.value.path == "old_spec"
    with pytest.raises(InputError) as err:
        as_figure([1, 2])
    assert err.value.path == "spec"

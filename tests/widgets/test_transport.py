"""The figure transport (PlotView): what it answers, what it ignores, and
that a delta on the wire rebuilds the new figure from the old one."""

from __future__ import annotations

import numpy as np
import pytest
from widget_drives import demo_with, solve_snapshot

from loadscope.vendor import PLOTLY_BASIC, installed_plotly_js, js_version
from loadscope.viz import figure_update, reaction_bars, shaft_diagrams
from loadscope.widgets import PlotView, apply_update
from loadscope.widgets.capture import capture_comms
from loadscope.widgets.plotview import decode, encode, plotly_bundle


def _close(a, b, rel):
    """Equal structure; floats equal to ``rel`` (float32 on the wire)."""
    if isinstance(a, dict):
        assert isinstance(b, dict) and a.keys() == b.keys(), (sorted(a), sorted(b))
        for k in a:
            _close(a[k], b[k], rel)
    elif isinstance(a, list):
        assert isinstance(b, list) and len(a) == len(b)
        for x, y in zip(a, b):
            _close(x, y, rel)
    elif isinstance(a, float) and not isinstance(b, str):
        assert b == pytest.approx(a, rel=rel, abs=1e-9)
    else:
        assert a == b


@pytest.fixture
def specs():
    old = solve_snapshot(demo_with(lambda s: None))
    new = solve_snapshot(demo_with(lambda s: s["input"].update(power="7.5 kW")))
    return old, new


def _view(spec):
    with capture_comms() as rec:
        view = PlotView(spec)
    rec.clear()
    return view, rec


def test_need_figure_gets_the_whole_figure(specs):
    spec = reaction_bars(specs[0])
    view, rec = _view(spec)
    view._handle_custom_msg({"kind": "need_figure"}, [])
    (msg,) = [m for m in rec.messages if m.data.get("method") == "custom"]
    content = msg.data["content"]
    assert content["kind"] == "figure" and content["rev"] == view.rev
    _close(spec, decode(content["figure"], msg.buffers), rel=5e-6)


def test_need_plotly_sends_the_bundle_once_in_a_while(specs):
    view, rec = _view(reaction_bars(specs[0]))
    view._handle_custom_msg({"kind": "need_plotly"}, [])
    view._handle_custom_msg({"kind": "need_plotly"}, [])      # a page asking again at once gets nothing
    sent = [m for m in rec.messages if m.data.get("method") == "custom"]
    assert len(sent) == 1
    assert sent[0].data["content"] == {"kind": "plotly"}
    assert sent[0].buffers == [plotly_bundle()]
    assert plotly_bundle().startswith(b"/**") and len(plotly_bundle()) > 1_000_000


def test_the_pages_plotly_js_is_the_2d_bundle_of_the_installed_plotly_version():
    # The HTML report embeds the installed plotly's full plotly.js; the pages load the vendored
    # 2D bundle. After a plotly upgrade, `make plotly-basic` fetches the matching one.
    assert js_version(PLOTLY_BASIC) == js_version(installed_plotly_js())
    head = plotly_bundle()[:200].decode()
    assert "(basic - minified)" in head and "MIT" in head
    assert len(plotly_bundle()) < len(installed_plotly_js().read_bytes()) / 3
    assert (PLOTLY_BASIC.parent / "plotly-basic.LICENSE").read_text().startswith("MIT License")


@pytest.mark.parametrize("content", [
    {"kind": "delete_everything"}, {"kind": "need_figure ", "rev": 3}, {"kind": None}, {}, "need_figure",
    ["need_figure"], 42, None, {"kind": ["need_figure"]},
])
def test_unknown_messages_are_ignored(specs, content):
    spec = reaction_bars(specs[0])
    view, rec = _view(spec)
    view._handle_custom_msg(content, [b"junk"])
    assert rec.messages == []
    assert view.rev == 0 and view.spec is spec


def test_delta_applied_to_the_old_spec_gives_the_new_spec(specs):
    old, new = (shaft_diagrams(r, "output") for r in specs)
    delta = figure_update(old, new)
    assert apply_update(old, delta) == new                      # exact, in Python
    view, rec = _view(old)
    view.show(new)
    (msg,) = [m for m in rec.messages if m.data.get("method") == "custom"]
    content = msg.data["content"]
    assert (content["kind"], content["rev"], content["base"]) == ("delta", 1, 0)
    on_wire = {"data": decode(content["data"], msg.buffers), "layout": decode(content["layout"], msg.buffers)}
    page_old = decode(*encode(old))                             # what the page holds before the move
    _close(new, apply_update(page_old, on_wire), rel=5e-6)     # 6 digits, float32 ~7


def test_a_structural_change_sends_the_whole_figure(specs):
    view, rec = _view(reaction_bars(specs[0]))
    bigger = reaction_bars(specs[0], cases={"a": specs[0], "b": specs[1]})
    view.show(bigger)
    (content,) = rec.custom()
    assert content["kind"] == "figure" and content["rev"] == 1


def test_encode_packs_numbers_and_repeated_texts():
    value = {"x": [float(i) / 3 for i in range(20)], "i": list(range(20)), "t": ["a"] * 18 + ["b", None],
             "short": [1.23456789, None], "s": 0.1234567891, "line": [0.5, 1.5, None] * 6}
    packed, buffers = encode(value)
    assert packed["x"] == {"$lsbuf": 0, "dtype": "f4"} and packed["i"] == {"$lsbuf": 1, "dtype": "i4"}
    assert packed["t"] == {"$lsrun": [["a", 18], ["b", 1], [None, 1]]}
    assert packed["short"] == [1.23457, None] and packed["s"] == 0.123457
    assert packed["line"] == {"$lsbuf": 2, "dtype": "f4", "gaps": 1}
    assert [len(b) for b in buffers] == [80, 80, 72]
    back = decode(packed, buffers)
    assert back["i"] == value["i"] and back["t"] == value["t"] and back["line"] == value["line"]
    assert encode({"a": value["x"], "b": list(value["x"])})[0] == {"a": packed["x"], "b": packed["x"]}
    np.testing.assert_allclose(back["x"], value["x"], rtol=1e-7)

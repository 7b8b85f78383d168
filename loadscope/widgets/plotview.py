"""PlotView: a small anywidget that shows one plotly figure whose data stays
in Python (see the transport notes in DEVELOPERS.md).

Why not plotly's ``FigureWidget``: it carries plotly.js (~5 MB) in its widget
state on every page load, and a figure whose start-up misses anywidget's
window never updates again. A PlotView's state is three small traits; its
JavaScript (``plotview.js``, a few kB) starts at once and loads plotly.js
once per page, shared by every view:

1. ``window.Plotly`` when the page has it already;
2. else from ``plotly_url`` (default: the environment variable
   ``LOADSCOPE_PLOTLY_URL``; a relative URL is resolved against the page's base
   URL), a static, cacheable file;
3. else it asks once with ``{"kind": "need_plotly"}`` and Python replies with
   the bundle as one binary buffer.

The bundle is plotly.js's 2D build (``loadscope.vendor.PLOTLY_BASIC``, 1.2 MB
instead of 4.8 MB): a figure made only of 3D traces (the force scene) is drawn
by the view's own canvas renderer (``scene3d.js``), without plotly.js and
without WebGL.

The figure itself travels in custom messages: a view asks
``{"kind": "need_figure"}`` on render and gets the full spec; a change sends
only :func:`loadscope.viz.figure_update` of the last and the new spec. Both
are packed by :func:`encode` (long number lists as float32 binary buffers,
repeated hover texts run-length coded, other floats rounded to ``DIGITS``
significant digits; display only, the kernel's result is untouched). ``rev``
counts the revisions; the browser element shows the revision on screen in
its ``data-rev`` attribute. Anything else the browser sends is ignored.
"""

from __future__ import annotations

import functools
import math
import os
import time
from pathlib import Path
from typing import Any

import anywidget
import numpy as np
import traitlets

from ..errors import InputError
from ..vendor import PLOTLY_BASIC
from ..viz import figure_update

#: significant digits of the floats sent to the browser (display only)
DIGITS = 6
#: shortest list of numbers or texts worth packing (see :func:`encode`)
PACK_MIN = 16
#: shortest time [s] between two plotly.js bundles sent by one view
PLOTLY_RESEND = 5.0
#: environment variable naming where the page loads plotly.js from
PLOTLY_URL_ENV = "LOADSCOPE_PLOTLY_URL"


@functools.lru_cache(maxsize=1)
def plotly_bundle() -> bytes:
    """plotly.js's 2D bundle shipped in loadscope (``loadscope.vendor``): the
    views draw only 2D figures with plotly.js, the 3D scene on their own."""
    return PLOTLY_BASIC.read_bytes()


def _esm_source() -> str:
    """The view's JavaScript module: the scene renderer (``scene3d.js``, no
    exports) in front of ``plotview.js``, which uses it; anywidget takes one
    module text."""
    here = Path(__file__).parent
    return "\n".join((here / name).read_text(encoding="utf-8") for name in ("scene3d.js", "plotview.js"))


def _round(value: float) -> float:
    if value == 0.0 or not math.isfinite(value):
        return value
    return float(f"{value:.{DIGITS}g}")


def _runs(items: list[Any]) -> list[list[Any]]:
    """Run-length pairs ``[[item, count], ...]`` of a list."""
    out: list[list[Any]] = []
    for item in items:
        if out and out[-1][0] == item:
            out[-1][1] += 1
        else:
            out.append([item, 1])
    return out


def encode(value: Any) -> tuple[Any, list[bytes]]:
    """``value`` (figure data) packed for the wire, and its binary buffers.

    Lists of at least ``PACK_MIN`` plain numbers become ``{"$lsbuf": i,
    "dtype": "f4" | "i4"}`` (little-endian float32 / int32 in buffer ``i``;
    float32 keeps about 7 significant digits, enough for display; equal
    arrays share one buffer); number lists with ``None`` gaps (polylines)
    carry the gaps as NaN and ``"gaps": 1``; lists of
    texts with repeats become ``{"$lsrun": [[text, count], ...]}`` when that
    halves them; other floats are rounded to ``DIGITS`` significant digits.
    ``plotview.js`` undoes this; :func:`decode` is the same in Python.
    """
    buffers: list[bytes] = []
    known: dict[bytes, int] = {}            # equal arrays (e.g. the shared x of diagram rows) go once

    def walk(v: Any) -> Any:
        if isinstance(v, float):
            return _round(v)
        if isinstance(v, dict):
            return {k: walk(x) for k, x in v.items()}
        if isinstance(v, list):
            if len(v) >= PACK_MIN:
                kinds = {type(x) for x in v}
                if kinds <= {int, float, type(None)} and kinds - {type(None)}:
                    gaps = type(None) in kinds
                    dtype = "<i4" if kinds == {int} and max(map(abs, v)) < 2**31 else "<f4"
                    raw = np.asarray([math.nan if x is None else x for x in v] if gaps else v, dtype=dtype).tobytes()
                    if raw not in known:
                        known[raw] = len(buffers)
                        buffers.append(raw)
                    ref = {"$lsbuf": known[raw], "dtype": dtype[1:]}
                    return {**ref, "gaps": 1} if gaps else ref
                if kinds <= {str, type(None)}:
                    runs = _runs(v)
                    if 2 * len(runs) <= len(v):
                        return {"$lsrun": runs}
            return [walk(x) for x in v]
        return v

    return walk(value), buffers


def decode(value: Any, buffers: list[bytes]) -> Any:
    """The figure data that :func:`encode` packed (numbers as float32 lists)."""
    if isinstance(value, dict):
        if "$lsbuf" in value:
            out = np.frombuffer(bytes(buffers[value["$lsbuf"]]), dtype="<" + value["dtype"]).tolist()
            return [None if x != x else x for x in out] if value.get("gaps") else out
        if "$lsrun" in value:
            return [item for item, count in value["$lsrun"] for _ in range(count)]
        return {k: decode(x, buffers) for k, x in value.items()}
    if isinstance(value, list):
        return [decode(x, buffers) for x in value]
    return value


def apply_update(spec: dict[str, Any], delta: dict[str, Any]) -> dict[str, Any]:
    """The spec that :func:`loadscope.viz.figure_update` ``delta`` makes of
    ``spec`` (what the browser does with a delta; a new dict, ``spec`` is
    not changed). A ``None`` value removes the key.

    >>> old = {"data": [{"y": [1.0], "name": "a"}], "layout": {"title": "t", "height": 3}}
    >>> apply_update(old, {"data": [{"y": [2.0]}], "layout": {"height": None}})
    {'data': [{'y': [2.0], 'name': 'a'}], 'layout': {'title': 't'}}
    """
    def merged(base: dict[str, Any], changes: dict[str, Any]) -> dict[str, Any]:
        out = dict(base)
        for k, v in changes.items():
            if v is None:
                out.pop(k, None)
            else:
                out[k] = v
        return out

    data = [merged(t, c) if c else dict(t) for t, c in zip(spec["data"], delta["data"])]
    return {"data": data, "layout": merged(spec["layout"], delta["layout"])}


class PlotView(anywidget.AnyWidget):
    """One plotly figure in the page; Python holds the figure data.

    Set a new figure with :meth:`show` (a spec from a ``loadscope.viz``
    builder): the first call, or one with another trace structure, sends the
    whole figure; later ones send only what changed.
    """

    _esm = _esm_source()
    plotly_url = traitlets.Unicode(help="where the page loads plotly.js from; empty: ask this kernel").tag(sync=True)
    rev = traitlets.Int(0, help="revision of the current figure; the page shows it in data-rev").tag(sync=True)

    def __init__(self, spec: dict[str, Any] | None = None, **kwargs: Any) -> None:
        kwargs.setdefault("plotly_url", os.environ.get(PLOTLY_URL_ENV, ""))
        super().__init__(**kwargs)
        self._spec: dict[str, Any] = spec if spec is not None else {"data": [], "layout": {}}
        self._plotly_sent = -math.inf
        self.on_msg(self._on_browser_msg)

    @property
    def spec(self) -> dict[str, Any]:
        """The current full figure spec (exact values; do not change it)."""
        return self._spec

    def show(self, spec: dict[str, Any]) -> None:
        """Make ``spec`` the figure: send the delta from the last one, or the
        whole figure when the trace structure changed."""
        try:
            delta = figure_update(self._spec, spec)
        except InputError:
            delta = None
        self._spec = spec
        self.rev += 1
        if delta is None:
            self._send_figure()
        else:
            packed, buffers = encode({"data": delta["data"] if any(delta["data"]) else [],
                                      "layout": delta["layout"]})
            self.send({"kind": "delta", "rev": self.rev, "base": self.rev - 1, **packed}, buffers=buffers)

    def _send_figure(self) -> None:
        packed, buffers = encode(self._spec)
        self.send({"kind": "figure", "rev": self.rev, "figure": packed}, buffers=buffers)

    def _on_browser_msg(self, _widget: Any, content: Any, _buffers: Any) -> None:
        # Untrusted: only the two known requests are answered.
        if not isinstance(content, dict):
            return
        kind = content.get("kind")
        if kind == "need_figure":
            self._send_figure()
        elif kind == "need_plotly":
            # ~1.2 MB: at most once per PLOTLY_RESEND seconds per view, whatever the page asks
            now = time.monotonic()
            if now - self._plotly_sent >= PLOTLY_RESEND:
                self._plotly_sent = now
                self.send({"kind": "plotly"}, buffers=[plotly_bundle()])

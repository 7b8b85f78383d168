"""Between figure data and plotly: :func:`as_figure` for notebooks and HTML
export, :func:`figure_update` for a live figure after a parameter change.

The builders return plain dicts because plotly's validation, not the
mechanics, dominates a widget callback (STACK-NOTES: 2-6 ms per small update,
of which numpy 0.013 ms). A widget builds its figure once with
:func:`as_figure` and afterwards applies only the delta of two specs.
"""

from __future__ import annotations

from typing import Any

from ..errors import InputError

#: trace keys that fix a trace's identity; a change of any needs a new figure
STRUCTURAL_KEYS = ("type", "name", "legendgroup", "xaxis", "yaxis", "scene")


def _check_spec(spec: Any, path: str) -> None:
    if not (isinstance(spec, dict) and isinstance(spec.get("data"), list) and isinstance(spec.get("layout"), dict)):
        raise InputError(path, "is not figure data", '{"data": [...], "layout": {...}} from a loadscope.viz builder')


def as_figure(spec: dict[str, Any]):
    """A validated ``plotly.graph_objects.Figure`` of a builder's spec (for
    notebooks and ``fig.write_html``). Not for the widget hot path: plotly
    validates every array here.

    >>> from loadscope.viz import sweep_plot
    >>> fig = as_figure(sweep_plot([0, 1], {"a": [2, 3]}, "t [s]", "F [N]"))
    >>> type(fig).__name__
    'Figure'
    """
    _check_spec(spec, "spec")
    try:
        import plotly.graph_objects as go
    except ImportError as exc:  # pragma: no cover - depends on the environment
        raise ImportError("loadscope.viz.as_figure needs plotly: pip install 'loadscope[widgets]'") from exc
    return go.Figure(spec)


def figure_update(old_spec: dict[str, Any], new_spec: dict[str, Any]) -> dict[str, Any]:
    """What changed from ``old_spec`` to ``new_spec`` (two specs of the same
    builder for the same drive topology), as ``{"data": [per-trace dict of
    changed keys], "layout": {changed top-level layout keys}}``.

    A key present in the old spec only is given as ``None`` (plotly resets it).
    Apply it to a ``FigureWidget`` in one message::

        with fig.batch_update():
            for trace, change in zip(fig.data, delta["data"]):
                if change:
                    trace.update(change)
            fig.layout.update(delta["layout"])

    For the force scene only x/y/z, hover texts, ``visible``, the ``meta``,
    ``annotations`` and ``title`` change; for the charts also the diagram
    sample counts (x/y lengths), ``shapes`` and bar values.

    Raises
    ------
    InputError
        When the specs differ in trace count or in a trace's
        ``STRUCTURAL_KEYS`` (another topology or another figure): build the
        figure again.

    Examples
    --------
    >>> from loadscope.viz import sweep_plot
    >>> a = sweep_plot([0, 1], {"F": [2, 3]}, "t [s]", "F [N]")
    >>> b = sweep_plot([0, 1], {"F": [2, 4]}, "t [s]", "F [N]")
    >>> figure_update(a, b)
    {'data': [{'y': [2.0, 4.0]}], 'layout': {}}
    """
    _check_spec(old_spec, "old_spec")
    _check_spec(new_spec, "new_spec")
    old, new = old_spec["data"], new_spec["data"]
    if len(old) != len(new):
        raise InputError("new_spec", f"has {len(new)} traces where old_spec has {len(old)}: build the figure again",
                         "a spec of the same figure and drive topology")
    fig_old = old_spec["layout"].get("meta", {}).get("figure")
    fig_new = new_spec["layout"].get("meta", {}).get("figure")
    if fig_old != fig_new:
        raise InputError("new_spec", f"is a {fig_new!r} figure, old_spec a {fig_old!r} one",
                         "two specs of the same builder")
    data = []
    for i, (a, b) in enumerate(zip(old, new)):
        for key in STRUCTURAL_KEYS:
            if a.get(key) != b.get(key):
                raise InputError("new_spec", f"trace {i} changes its {key} from {a.get(key)!r} to {b.get(key)!r}: "
                                 "build the figure again", "a spec of the same figure and drive topology")
        data.append(_changed(a, b))
    return {"data": data, "layout": _changed(old_spec["layout"], new_spec["layout"])}


def _changed(a: dict[str, Any], b: dict[str, Any]) -> dict[str, Any]:
    out = {k: v for k, v in b.items() if k not in a or a[k] != v}
    out.update({k: None for k in a if k not in b})
    return out

"""2D charts of a solved drive, as plain plotly figure data: bearing reaction
bars, the internal-load diagrams of one shaft, sweep lines, and the
dashboard figure that puts reactions and diagrams into one figure (one
figure with subplots stays inside the browser's widget start-up window where
several figures may not; see STACK-NOTES).

Diagram signs follow :mod:`loadscope.kernel.shafts` (plane 1 is a-e1, plane 2
a-e2 of the shaft's local frame; for a shaft along +x that is x-y and x-z).
The curves are the kernel's ``diagram`` samples converted to display units,
unchanged: stations appear twice, so both sides of every jump are drawn.

Trace order is fixed for a drive topology; only x/y arrays, hover texts and
bar values change with the parameters (see :func:`loadscope.viz.figure_update`).
"""

from __future__ import annotations

import re
from collections.abc import Collection, Iterable, Mapping
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .. import CAUTION
from ..errors import InputError
from ..kernel.model import Support
from ..kernel.solve import DriveResult, ShaftResult
from ..report.units import convert, label, system
from .focus import kept, shaft_focus
from .style import CASE_PATTERNS, PALETTE, SERIES, SIZES, axis_2d, base_layout, caution_annotation, number

FloatArray = NDArray[np.float64]

PARTS_CHOICES = ("radial_axial", "components")
_PART_KEYS = {"radial_axial": ("radial", "axial"), "components": ("x", "y", "z")}
_PART_NAMES = {"radial": "radial", "axial": "axial (along the shaft axis)", "x": "x (global)",
               "y": "y (global, up)", "z": "z (global)"}

#: diagram rows: title, quantity kind, [(diagram key, colour role)]
DIAGRAM_ROWS: tuple[tuple[str, str, tuple[tuple[str, str], ...]], ...] = (
    ("shear", "force", (("V1", "plane1"), ("V2", "plane2"))),
    ("bending", "moment", (("M1", "plane1"), ("M2", "plane2"), ("M", "resultant"))),
    ("torque", "moment", (("T", "torque"),)),
    ("deflection", "deflection", (("v1", "plane1"), ("v2", "plane2"), ("deflection", "resultant"))),
)
_GROUP_NAMES = {"torque": "torque T", "resultant": "resultant (M, deflection)"}


# --------------------------------------------------------------------------- reaction bars

def _bearings(result: DriveResult) -> list[tuple[str, str]]:
    return [(sr.id, sid) for sr in result.shafts for sid in sr.solution.support_ids]


def _case_list(result: DriveResult, cases: Mapping[str, DriveResult] | None) -> list[tuple[str, DriveResult]]:
    if cases is None:
        return [("", result)]
    if not isinstance(cases, Mapping) or not cases:
        raise InputError("cases", f"must be a non-empty mapping of case name to DriveResult, got {cases!r}",
                         "None, or {name: DriveResult, ...}")
    ref = _bearings(result)
    out = []
    for name, r in cases.items():
        if not isinstance(name, str) or not name:
            raise InputError("cases", f"case names must be non-empty strings, got {name!r}", "non-empty strings")
        if not isinstance(r, DriveResult):
            raise InputError(f"cases[{name!r}]", f"must be a DriveResult, got {type(r).__name__}", "DriveResult")
        if _bearings(r) != ref:
            raise InputError(f"cases[{name!r}]", "has other bearings than the drive shown",
                             "load cases of one drive: bearings " + ", ".join(f"{a}.{b}" for a, b in ref))
    for name, r in cases.items():
        out.append((name, r))
    return out


def _bar_traces(result: DriveResult, units: str, parts: str, cases: Mapping[str, DriveResult] | None,
                xaxis: str, yaxis: str, focus: Collection[str]) -> list[dict[str, Any]]:
    if parts not in PARTS_CHOICES:
        raise InputError("parts", f"unknown choice {parts!r}", ", ".join(PARTS_CHOICES))
    fu = label(units, "force")
    cats = [f"{s} · {b}" for s, b in _bearings(result) if s in focus]
    traces = []
    for ci, (case, r) in enumerate(_case_list(result, cases)):
        values: dict[str, list[float]] = {k: [] for k in _PART_KEYS[parts]}
        for sr in kept(r, focus):
            sol = sr.solution
            for rl, rg in zip(sol.reactions_local, sol.reactions_global):
                if parts == "radial_axial":
                    values["radial"].append(float(np.hypot(rl[1], rl[2])))
                    values["axial"].append(float(rl[0]))
                else:
                    for j, k in enumerate("xyz"):
                        values[k].append(float(rg[j]))
        prefix = f"{case} · " if case else ""
        for key, vals in values.items():
            y = np.asarray(convert(np.asarray(vals, dtype=float), units, "force")).tolist()
            traces.append({
                "type": "bar", "name": prefix + _PART_NAMES[key], "legendgroup": case or "reactions",
                "x": list(cats), "y": y, "xaxis": xaxis, "yaxis": yaxis, "offsetgroup": f"{ci}:{key}",
                "marker": {"color": PALETTE[key], "line": {"color": PALETTE["ink"], "width": 0.5},
                           "pattern": {"shape": CASE_PATTERNS[ci % len(CASE_PATTERNS)], "fgcolor": PALETTE["page"],
                                       "fillmode": "overlay"}},   # keep the part colour under the hatch
                "hoverinfo": "text",
                "hovertext": [f"{prefix}{c}<br>{_PART_NAMES[key]} {number(v)} {fu}" for c, v in zip(cats, y)],
            })
    return traces


def reaction_bars(result: DriveResult, units: str = "si", parts: str = "radial_axial",
                  cases: Mapping[str, DriveResult] | None = None,
                  shafts: Iterable[str] | None = None) -> dict[str, Any]:
    """Grouped bars of every bearing reaction (force of the support on the
    shaft), or of the bearings of a few shafts.

    Parameters
    ----------
    result : DriveResult
        The solved drive; its bearings are the bar categories
        (``"shaft · support"``).
    units : str
        ``"si"`` (N) or ``"us"`` (lbf).
    parts : str
        ``"radial_axial"``: radial magnitude and axial component (signed
        along the shaft axis); ``"components"``: global x, y, z (signed).
    cases : mapping or None
        Load cases to compare, ``{name: DriveResult}`` of drives with the
        same bearings; when given, exactly these are drawn (in order, one
        fill pattern each) and ``result`` only fixes the categories. ``None``
        draws ``result`` alone.
    shafts : iterable of str or None
        Draw only the bearings of these shafts (ids); ``None``: every bearing.

    Returns
    -------
    dict
        ``{"data": [...], "layout": {...}}``; one bar trace per case and
        part, in that order.

    Examples
    --------
    >>> from loadscope import solve
    >>> from loadscope.spec import demo_snapshot, drive_from_snapshot
    >>> spec = reaction_bars(solve(drive_from_snapshot(demo_snapshot())), units="us")
    >>> [t["name"] for t in spec["data"]], spec["layout"]["yaxis"]["title"]["text"]
    (['radial', 'axial (along the shaft axis)'], 'reaction on the shaft [lbf]')
    >>> reaction_bars(solve(drive_from_snapshot(demo_snapshot())), shafts=["output"])["data"][0]["x"]
    ['output · E', 'output · F']
    """
    system(units)
    focus = shaft_focus(result, shafts)
    data = _bar_traces(result, units, parts, cases, "x", "y", focus)
    layout = base_layout(SIZES["bars_height"])
    layout["margin"] = {"l": 70, "r": 30, "t": 60, "b": 110}
    title = f"Bearing reactions [{label(units, 'force')}]" + ("" if shafts is None else " · shafts "
                                                               + ", ".join(focus))
    layout.update({"title": {"text": title}, "barmode": "group",
                   "xaxis": axis_2d("bearing (shaft · support)"),
                   "yaxis": axis_2d(f"reaction on the shaft [{label(units, 'force')}]"),
                   "annotations": [caution_annotation(-62)],
                   "meta": {"figure": "reaction_bars", "units": units, "parts": parts,
                            "shafts": None if shafts is None else list(focus), "caution": CAUTION}})
    return {"data": data, "layout": layout}


# --------------------------------------------------------------------------- shaft diagrams

def _find_shaft(result: DriveResult, shaft_id: str) -> ShaftResult:
    for sr in result.shafts:
        if sr.id == shaft_id:
            return sr
    raise InputError("shaft_id", f"no shaft {shaft_id!r} in this drive", ", ".join(s.id for s in result.shafts))


def _plane_names(frame: FloatArray) -> tuple[str, str]:
    """Readable names of a shaft's planes a-e1, a-e2, e.g. ``"x–y (e1 = +y)"``
    for a shaft along +x; generic names for a skew shaft."""
    def axis_name(v: FloatArray) -> str | None:
        k = int(np.argmax(np.abs(v)))
        return ("+" if v[k] > 0 else "-") + "xyz"[k] if abs(abs(v[k]) - 1.0) < 1e-9 else None

    a, e1, e2 = (axis_name(frame[i]) for i in range(3))
    if a is None or e1 is None or e2 is None:
        return "a–e1", "a–e2"
    return f"{a[1]}–{e1[1]} (e1 = {e1})", f"{a[1]}–{e2[1]} (e2 = {e2})"


def _domains(weights: list[float], gaps: list[float]) -> list[tuple[float, float]]:
    """Vertical domains, top row first, for rows of relative ``weights``
    separated by ``gaps`` (shares of the figure height)."""
    free = 1.0 - sum(gaps)
    total = sum(weights)
    out = []
    top = 1.0
    for i, w in enumerate(weights):
        lo = top - free * w / total
        out.append((max(lo, 0.0), top))
        top = lo - (gaps[i] if i < len(gaps) else 0.0)
    return out


def _diagram_panel(result: DriveResult, shaft_id: str, units: str, first: int,
                   domains: list[tuple[float, float]]) -> tuple[list[dict], dict[str, Any], list[dict], list[dict]]:
    """Traces, axes, station shapes and station labels of the four diagram
    rows of one shaft on axes ``first`` .. ``first + 3``."""
    sr = _find_shaft(result, shaft_id)
    sh = result.drive.shaft(shaft_id)
    sol = sr.solution
    d = sol.diagram
    lu = label(units, "length")
    s = np.asarray(convert(d["s"], units, "length")).tolist()
    p1, p2 = _plane_names(sol.frame)
    group_names = {"plane1": f"plane 1: {p1}", "plane2": f"plane 2: {p2}", **_GROUP_NAMES}
    last = first + len(DIAGRAM_ROWS) - 1
    traces: list[dict[str, Any]] = []
    axes: dict[str, Any] = {}
    seen: set[str] = set()
    for row, (title, kind, curves) in enumerate(DIAGRAM_ROWS):
        n = first + row
        xa, ya = ("x" if n == 1 else f"x{n}"), ("y" if n == 1 else f"y{n}")
        unit = label(units, kind)
        for key, role in curves:
            traces.append({
                "type": "scatter", "mode": "lines", "name": group_names[role], "legendgroup": role,
                "showlegend": role not in seen, "x": s,
                "y": np.asarray(convert(d[key], units, kind)).tolist(), "xaxis": xa, "yaxis": ya,
                "line": {"color": PALETTE[role], "width": SIZES["line_width"]},
                "hovertemplate": f"shaft {shaft_id} · {key}<br>s = %{{x:.4g}} {lu}<br>{key} = %{{y:.4g}} {unit}"
                                 "<extra></extra>",
            })
            seen.add(role)
        xaxis = axis_2d(f"axial position on shaft {shaft_id} [{lu}]" if n == last else "")
        xaxis.update({"anchor": ya, "showticklabels": n == last})
        if n != last:
            xaxis["matches"] = f"x{last}"
        yaxis = axis_2d(f"{title} [{unit}]")
        yaxis.update({"anchor": xa, "domain": list(domains[row])})
        axes["xaxis" if n == 1 else f"xaxis{n}"] = xaxis
        axes["yaxis" if n == 1 else f"yaxis{n}"] = yaxis

    marks = [(sp.at, sp.id, "station_support", "dash") for sp in sh.supports]
    marks += [(e.at, e.id, "station_element", "dot") for e in sh.elements() if not isinstance(e, Support)]
    shapes = []
    labels = []
    for at, ident, role, dash in marks:
        x = float(convert(at, units, "length"))
        for row in range(len(DIAGRAM_ROWS)):
            n = first + row
            shapes.append({"type": "line", "xref": "x" if n == 1 else f"x{n}",
                           "yref": ("y" if n == 1 else f"y{n}") + " domain", "x0": x, "x1": x, "y0": 0.0, "y1": 1.0,
                           "line": {"color": PALETTE[role], "width": 1, "dash": dash}, "layer": "below"})
        labels.append({"text": ident, "x": x, "xref": "x" if first == 1 else f"x{first}",
                       "yref": ("y" if first == 1 else f"y{first}") + " domain", "y": 1.0, "yanchor": "bottom",
                       "showarrow": False, "font": {"size": 10, "color": PALETTE[role]}})
    return traces, axes, shapes, labels


def shaft_diagrams(result: DriveResult, shaft_id: str, units: str = "si") -> dict[str, Any]:
    """Shear, bending, torque and deflection of one shaft, stacked on a
    shared axial axis, with bearings (dashed) and elements (dotted) marked.

    Rows, top to bottom: shear V1, V2; bending M1, M2 and the resultant
    M = hypot(M1, M2); torque T; deflection v1, v2 and the resultant. Each
    curve is the kernel's ``diagram[key]`` in display units.

    Parameters
    ----------
    result : DriveResult
        The solved drive.
    shaft_id : str
        Which shaft.
    units : str
        ``"si"`` (mm, N, N*m) or ``"us"`` (in, lbf, lbf*in).

    Returns
    -------
    dict
        ``{"data": [...], "layout": {...}}``; nine line traces in
        ``DIAGRAM_ROWS`` order.

    Examples
    --------
    >>> from loadscope import solve
    >>> from loadscope.spec import demo_snapshot, drive_from_snapshot
    >>> spec = shaft_diagrams(solve(drive_from_snapshot(demo_snapshot())), "output")
    >>> len(spec["data"]), spec["layout"]["yaxis2"]["title"]["text"]
    (9, 'bending [N*m]')
    """
    system(units)
    rows = len(DIAGRAM_ROWS)
    domains = _domains([1.0] * rows, [SIZES["row_gap"]] * (rows - 1))
    traces, axes, shapes, labels = _diagram_panel(result, shaft_id, units, 1, domains)
    layout = base_layout(SIZES["diagram_row"] * rows + 120)
    layout["margin"] = {"l": 80, "r": 30, "t": 70, "b": 110}
    layout.update(axes)
    layout.update({"title": {"text": f"Shaft {shaft_id}: internal loads and deflection"},
                   "shapes": shapes, "annotations": [*labels, caution_annotation(-62)],
                   "meta": {"figure": "shaft_diagrams", "units": units, "shaft": shaft_id, "caution": CAUTION}})
    return {"data": traces, "layout": layout}


def dashboard_figure(result: DriveResult, shaft_id: str, units: str = "si",
                     parts: str = "radial_axial") -> dict[str, Any]:
    """One 2D figure: every bearing's reaction bars on top, the four diagram
    rows of one shaft below (see :func:`reaction_bars`,
    :func:`shaft_diagrams`; the 3D scene stays a figure of its own).

    Trace order: the bar traces, then the nine diagram traces.

    Examples
    --------
    >>> from loadscope import solve
    >>> from loadscope.spec import demo_snapshot, drive_from_snapshot
    >>> spec = dashboard_figure(solve(drive_from_snapshot(demo_snapshot())), "intermediate")
    >>> len(spec["data"]), spec["layout"]["xaxis5"]["title"]["text"]
    (11, 'axial position on shaft intermediate [mm]')
    """
    system(units)
    rows = len(DIAGRAM_ROWS)
    bars = _bar_traces(result, units, parts, None, "x", "y", shaft_focus(result, None))
    domains = _domains([1.4] + [1.0] * rows, [0.09] + [SIZES["row_gap"]] * (rows - 1))
    traces, axes, shapes, labels = _diagram_panel(result, shaft_id, units, 2, domains[1:])
    fu = label(units, "force")
    layout = base_layout(SIZES["bars_height"] + SIZES["diagram_row"] * rows + 60)
    layout["margin"] = {"l": 80, "r": 30, "t": 70, "b": 110}
    xbar = axis_2d("")
    xbar["anchor"] = "y"
    ybar = axis_2d(f"reaction [{fu}]")
    ybar.update({"anchor": "x", "domain": list(domains[0])})
    layout.update({"xaxis": xbar, "yaxis": ybar, **axes, "barmode": "group",
                   "title": {"text": f"{result.drive.name or 'Drive'}: bearing reactions and shaft {shaft_id}"},
                   "shapes": shapes, "annotations": [*labels, caution_annotation(-62)],
                   "meta": {"figure": "dashboard", "units": units, "shaft": shaft_id, "parts": parts,
                            "caution": CAUTION}})
    return {"data": [*bars, *traces], "layout": layout}


# --------------------------------------------------------------------------- sweeps

_UNIT_SUFFIX = re.compile(r"\[[^\[\]]+\]\s*$")


def _finite_vector(value: ArrayLike, path: str, length: int | None) -> list[float]:
    try:
        arr = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise InputError(path, "must be a sequence of numbers", "a 1D sequence of finite numbers") from None
    if arr.ndim != 1 or arr.size == 0:
        raise InputError(path, f"must be a non-empty 1D sequence, got shape {arr.shape}",
                         "a 1D sequence of finite numbers")
    if length is not None and arr.size != length:
        raise InputError(path, f"has {arr.size} values but x has {length}", f"{length} values")
    bad = np.flatnonzero(~np.isfinite(arr))
    if bad.size:
        raise InputError(f"{path}[{int(bad[0])}]", f"is not finite ({arr[bad[0]]!r})", "finite numbers")
    return arr.tolist()


def sweep_plot(x: ArrayLike, ys: Mapping[str, ArrayLike], x_label: str, y_label: str) -> dict[str, Any]:
    """Lines of several results against one swept parameter.

    Parameters
    ----------
    x : array_like
        The swept values, in the unit named in ``x_label``.
    ys : mapping
        ``{series name: values}``, each as long as ``x``, in the unit named
        in ``y_label``.
    x_label, y_label : str
        Axis titles ending in the unit in brackets, e.g.
        ``"helix angle [deg]"``, ``"radial load on C [N]"`` (``"[1]"`` for a
        pure number).

    Examples
    --------
    >>> spec = sweep_plot([10, 15, 20], {"C": [1.0, 1.2, 1.5]}, "helix angle [deg]", "radial load [kN]")
    >>> spec["data"][0]["y"], spec["layout"]["xaxis"]["title"]["text"]
    ([1.0, 1.2, 1.5], 'helix angle [deg]')
    """
    for name, text in (("x_label", x_label), ("y_label", y_label)):
        if not isinstance(text, str) or not _UNIT_SUFFIX.search(text):
            raise InputError(name, f"must end with its unit in brackets, got {text!r}",
                             'text ending in "[unit]", e.g. "input power [kW]"')
    xs = _finite_vector(x, "x", None)
    if not isinstance(ys, Mapping) or not ys:
        raise InputError("ys", f"must be a non-empty mapping of series name to values, got {ys!r}",
                         "{name: values, ...}")
    x_unit = _UNIT_SUFFIX.search(x_label).group(0).strip()          # type: ignore[union-attr]
    y_unit = _UNIT_SUFFIX.search(y_label).group(0).strip()          # type: ignore[union-attr]
    data = []
    for k, (name, values) in enumerate(ys.items()):
        data.append({"type": "scatter", "mode": "lines", "name": str(name), "x": xs,
                     "y": _finite_vector(values, f"ys[{name!r}]", len(xs)),
                     "line": {"color": SERIES[k % len(SERIES)], "width": SIZES["line_width"]},
                     "hovertemplate": f"{name}<br>%{{x:.4g}} {x_unit[1:-1]}<br>%{{y:.4g}} {y_unit[1:-1]}"
                                      "<extra></extra>"})
    layout = base_layout(SIZES["bars_height"])
    layout["margin"] = {"l": 70, "r": 30, "t": 40, "b": 110}
    layout.update({"xaxis": axis_2d(x_label), "yaxis": axis_2d(y_label), "annotations": [caution_annotation(-62)],
                   "meta": {"figure": "sweep_plot", "caution": CAUTION}})
    return {"data": data, "layout": layout}

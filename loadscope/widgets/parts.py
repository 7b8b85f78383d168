"""The parts an explorer is made of. Each observes one
:class:`~loadscope.widgets.state.ExplorerState` and redraws itself from
``loadscope.viz`` builders and ``loadscope.report`` tables; none does any
mechanics.

* :class:`ForceView` - the 3D force scene, applied loads / reactions / both
* :class:`ReactionView` - bearing reaction bars, radial/axial or x, y, z,
  the current state beside the pinned one
* :class:`PairReadout` - one gear pair's tooth forces and geometry
* :class:`DiagramView` - shear, bending, torque, deflection of a chosen shaft
* :class:`LoadTable` - tables of every load, with the change from the pinned
  state beside each value
* :class:`MarginTable` - the margins of every rated component, per load case
  and for the duty cycle
* :class:`UnitsToggle`, :class:`MessageBar`
"""

from __future__ import annotations

import html
import math
from collections.abc import Callable
from typing import Any

import ipywidgets as W

from .. import CAUTION
from ..kernel.ratings import DUTY_CYCLE
from ..kernel.solve import DriveResult
from ..report import case_names, margins_rows, mesh_summary, table_rows
from ..report.units import label
from ..viz import force_scene, reaction_bars, shaft_diagrams
from ..viz.style import PALETTE, number
from .plotview import PlotView
from .state import ExplorerState

#: what the units toggle offers: (label, system)
UNIT_CHOICES = (("SI · N, mm, N·m, kW", "si"), ("US · lbf, in, lbf·in, hp", "us"))
SHOW_LABELS = (("applied loads", "applied"), ("reactions", "reactions"), ("both", "both"))
PARTS_LABELS = (("radial and axial", "radial_axial"), ("x, y, z parts", "components"))
BARS_LABELS = (("this state", "state"), ("load cases", "cases"))

#: the shafts a figure draws, read from the result shown: ids, or None for the whole drive
Focus = Callable[[DriveResult], tuple[str, ...] | None]


def _whole_drive(_result: DriveResult) -> None:
    return None


class UnitsToggle(W.ToggleButtons):
    """SI / US customary for every label and number of the explorer."""

    def __init__(self, state: ExplorerState) -> None:
        super().__init__(options=UNIT_CHOICES, value=state.units, description="units",
                         style={"button_width": "170px"})
        self.add_class("loadscope-units")
        W.link((self, "value"), (state, "units"))


class MessageBar(W.HTML):
    """The message of the last rejected change (empty when all is well)."""

    def __init__(self, state: ExplorerState) -> None:
        super().__init__()
        self.add_class("loadscope-message")
        self._state = state
        state.observe(self._show, "error")
        self._show(None)

    def _show(self, _change: Any) -> None:
        err = self._state.error
        self.value = ("" if not err else
                      f"<div class='loadscope-error' role='alert'><b>Not applied</b> - {html.escape(err)}<br>"
                      "<small>The drive and the figures still show the last valid state.</small></div>")


class ForceView(W.VBox):
    """The 3D drive with its force arrows. The arrow scale [m/N] is fixed
    when the drive opens (or the focus moves to other shafts), so arrows
    grow and shrink as loads change. ``focus`` gives the shafts to draw for
    a result (None: the whole drive)."""

    def __init__(self, state: ExplorerState, focus: Focus = _whole_drive) -> None:
        self.state = state
        self.focus = focus
        self._shafts: tuple[str, ...] | None = None
        self.show = W.ToggleButtons(options=SHOW_LABELS, value="applied", description="arrows",
                                    style={"button_width": "110px"})
        self._scale: float | None = None
        self._topology = state.topology
        self.view = PlotView(self._spec())
        super().__init__([self.show, self.view])
        self.add_class("loadscope-force-view")
        self.show.observe(self.redraw, "value")
        state.observe(self.redraw, ["result", "units"])

    def _spec(self) -> dict[str, Any]:
        shafts = self.focus(self.state.result)
        if self._topology != self.state.topology or shafts != self._shafts:    # a fresh arrow scale
            self._topology, self._shafts, self._scale = self.state.topology, shafts, None
        spec = force_scene(self.state.result, self.state.units, self.show.value, self._scale, shafts)
        self._scale = spec["layout"]["meta"]["arrow_scale"] or None
        return spec

    def redraw(self, _change: Any = None) -> None:
        self.view.show(self._spec())


def _same_bearings(a: DriveResult, b: DriveResult) -> bool:
    return [(s.id, s.solution.support_ids) for s in a.shafts] == [(s.id, s.solution.support_ids) for s in b.shafts]


class ReactionView(W.VBox):
    """Bearing reaction bars: radial and axial, or global x, y, z parts.

    ``bars`` chooses what is drawn: ``"state"`` - the current state, and the
    pinned one beside it (hatched) when there is one; ``"cases"`` - one set of
    bars per load case of the drive (from the last rating; the note says
    when the rating is still to come). ``focus`` gives the shafts whose
    bearings are drawn (None: every bearing)."""

    def __init__(self, state: ExplorerState, focus: Focus = _whole_drive) -> None:
        self.state = state
        self.focus = focus
        self.parts = W.ToggleButtons(options=PARTS_LABELS, value="radial_axial", description="show",
                                     style={"button_width": "130px"})
        self.bars = W.ToggleButtons(options=BARS_LABELS, value="state", description="bars",
                                    style={"button_width": "130px"})
        self.note = W.HTML()
        self.view = PlotView(self._spec())
        super().__init__([W.HBox([self.parts, self.bars]), self.note, self.view])
        self.add_class("loadscope-reaction-view")
        self.parts.observe(self.redraw, "value")
        self.bars.observe(self.redraw, "value")
        state.observe(self._state_changed, ["result", "units", "pinned"])
        state.observe(self._ratings_changed, ["ratings", "ratings_current"])

    def cases(self) -> dict[str, DriveResult] | None:
        """The results drawn as separate sets of bars, or None for the current state alone."""
        st = self.state
        if self.bars.value == "cases":
            if st.ratings is not None and st.ratings.cases and _same_bearings(st.ratings.cases[0].result, st.result):
                return {c.case.name: c.result for c in st.ratings.cases}
            return None
        if st.pinned is not None and _same_bearings(st.pinned, st.result):
            return {"now": st.result, "pinned": st.pinned}
        return None

    def _spec(self) -> dict[str, Any]:
        st = self.state
        if self.bars.value == "cases":
            if st.rating == "off":
                text = "load cases are solved with the margins, which this explorer does not work out"
            else:
                text = "" if st.ratings_current else "load cases: updating when the controls are still"
            self.note.value = f"<span class='loadscope-note'>{text}</span>" if text else ""
        else:
            self.note.value = ""
        return reaction_bars(st.result, st.units, self.parts.value, self.cases(), self.focus(st.result))

    def _state_changed(self, _change: Any) -> None:
        self.redraw()

    def _ratings_changed(self, _change: Any) -> None:
        if self.bars.value == "cases":
            self.redraw()

    def redraw(self, _change: Any = None) -> None:
        self.view.show(self._spec())


class DiagramView(W.VBox):
    """Shear, bending (both planes and resultant), torque and deflection
    along the shaft chosen in the drop-down."""

    def __init__(self, state: ExplorerState, shaft: str | None = None) -> None:
        self.state = state
        ids = [s.id for s in state.drive.shafts]
        self.shaft = W.Dropdown(options=ids, value=shaft if shaft in ids else ids[-1], description="shaft")
        self.view = PlotView(self._spec())
        super().__init__([self.shaft, self.view])
        self.add_class("loadscope-diagram-view")
        self.shaft.observe(self.redraw, "value")
        state.observe(self._new_drive, "topology")
        state.observe(self.redraw, ["result", "units"])

    def _spec(self) -> dict[str, Any]:
        if self.shaft.value not in [s.id for s in self.state.drive.shafts]:
            self._new_drive(None)                      # the notice of a new drive may come after the result's
        return shaft_diagrams(self.state.result, self.shaft.value, self.state.units)

    def _new_drive(self, _change: Any) -> None:
        ids = [s.id for s in self.state.drive.shafts]
        keep = self.shaft.value if self.shaft.value in ids else ids[-1]
        self.shaft.options = ids                       # (this selects the first option ...)
        self.shaft.value = keep

    def redraw(self, _change: Any = None) -> None:
        self.view.show(self._spec())


# --------------------------------------------------------------------------- the load table

TABLE_TITLES = {
    "shafts": "Shafts: speed, torque, power, largest bending moment and deflection",
    "reactions": "Bearing reactions (force of the support on the shaft; global x, y, z)",
    "teeth": "Tooth forces (at the pitch point; global x, y, z)",
    "bolts": "Mounting bolts (tension positive)",
}


def _delta_text(d: float) -> str:
    if abs(d) < 5e-13:
        return "±0"
    return ("+" if d > 0 else "−") + number(abs(d))


Table = tuple[list[str], list[list[Any]]]


def _table_html(name: str, now: Table, pinned: Table | None, keep: Any, title: str | None = None) -> str:
    cols, rows = now
    ids = [j for j, v in enumerate(rows[0]) if isinstance(v, str)] if rows else []
    shown = [r for r in rows if keep({cols[j]: r[j] for j in ids})]
    if not shown:
        return ""
    before: dict[tuple, list[Any]] | None = None
    if pinned is not None and pinned[0] == cols:
        before = {tuple(r[j] for j in ids): r for r in pinned[1]}
    head = "".join(f"<th>{html.escape(c)}</th>" for c in cols)
    body = []
    for r in shown:
        old = before.get(tuple(r[j] for j in ids)) if before is not None else None
        cells = []
        for j, v in enumerate(r):
            if isinstance(v, str):
                cells.append(f"<td>{html.escape(v)}</td>")
                continue
            text = number(float(v))
            if old is not None:
                text += f"<span class='d'>{_delta_text(float(v) - float(old[j]))}</span>"
            cells.append(f"<td class='n'>{text}</td>")
        body.append("<tr>" + "".join(cells) + "</tr>")
    title = html.escape(title or TABLE_TITLES.get(name, name))
    return f"<table data-table='{name}'><caption>{title}</caption><tr>{head}</tr>{''.join(body)}</table>"


class LoadTable(W.HTML):
    """Every load of the drive in tables (``loadscope.report.table_rows``),
    in the chosen units; with a pinned state, each value carries its change
    from the pinned one (small, after the value; rows matched by their ids).
    ``shafts`` / ``meshes`` keep only the rows of those (None: all)."""

    def __init__(self, state: ExplorerState, shafts: tuple[str, ...] | None = None,
                 meshes: tuple[str, ...] | None = None) -> None:
        super().__init__()
        self.add_class("loadscope-table")
        self.state = state
        self._shafts = shafts
        self._meshes = meshes
        self.tables: dict[str, Table] = {}
        self._pinned_tables: tuple[Any, str, dict[str, Table]] | None = None
        state.observe(self.redraw, ["result", "units", "pinned"])
        self.redraw()

    @property
    def frames(self) -> dict[str, Any]:
        """The tables shown, as pandas DataFrames."""
        import pandas as pd

        return {k: pd.DataFrame(rows, columns=cols) for k, (cols, rows) in self.tables.items()}

    def refocus(self, shafts: tuple[str, ...] | None, meshes: tuple[str, ...] | None) -> None:
        """Show only the rows of these shafts / meshes (None: all) and redraw."""
        self._shafts, self._meshes = shafts, meshes
        self.redraw()

    def _keep(self, name: str) -> Any:
        if name in ("shafts", "reactions") and self._shafts is not None:
            return lambda row: row["shaft"] in self._shafts
        if name == "teeth" and self._meshes is not None:
            return lambda row: row["mesh"] in self._meshes
        if name == "bolts" and (self._shafts is not None or self._meshes is not None):
            return lambda row: False
        return lambda row: True

    def _pinned(self) -> dict[str, Table]:
        st = self.state
        if st.pinned is None:
            return {}
        cached = self._pinned_tables
        if cached is None or cached[0] is not st.pinned or cached[1] != st.units:
            cached = self._pinned_tables = (st.pinned, st.units, table_rows(st.pinned, st.units))
        return cached[2]

    def redraw(self, _change: Any = None) -> None:
        st = self.state
        self.tables = table_rows(st.result, st.units)
        before = self._pinned()
        parts = [_table_html(n, t, before.get(n), self._keep(n)) for n, t in self.tables.items()]
        pin = ("<p class='pin'>Small figures after each value: change from the pinned state.</p>"
               if st.pinned is not None else "")
        self.value = pin + "".join(parts) + f"<p class='caution'>Caution: {html.escape(CAUTION)}</p>"


class PairReadout(W.HTML):
    """One gear pair at a glance (``loadscope.report.mesh_summary``): the
    transmitted, radial and axial tooth force, the power through the mesh,
    the speed ratio, the centre distance, the pitch diameters and the
    pitch-line speed, in the chosen units; with a pinned state, each value's
    change from it. ``mesh`` gives the mesh id for a result (None: no pair)."""

    def __init__(self, state: ExplorerState, mesh: Callable[[DriveResult], str | None]) -> None:
        super().__init__()
        self.add_class("loadscope-table")
        self.state = state
        self.mesh = mesh
        self.summary: dict[str, Any] | None = None
        state.observe(self.redraw, ["result", "units", "pinned"])
        self.redraw()

    def redraw(self, _change: Any = None) -> None:
        st = self.state
        mesh = self.mesh(st.result)
        if mesh is None:
            self.summary = None
            self.value = "<p class='pin'>This drive has no gear mesh.</p>"
            return
        self.summary = s = mesh_summary(st.result, mesh, st.units)
        pinned = None
        if st.pinned is not None and mesh in {fl.geometry.mesh_id for fl in st.pinned.train.meshes}:
            pinned = (["quantity", "value", "unit"], mesh_summary(st.pinned, mesh, st.units)["rows"])
        gears = " / ".join(f"{g} on {sh}" for g, sh in zip(s["gears"], s["shafts"]))
        title = f"pair {mesh}: {gears}, {s['kind']}, driver {s['driver']}"
        self.value = _table_html("pair", (["quantity", "value", "unit"], s["rows"]), pinned, lambda row: True,
                                 title)


def _margin_text(m: float) -> str:
    if math.isinf(m):
        return "unloaded"
    return "> +999 %" if m > 9.99 else f"{m * 100:+.1f} %"


def _component_shaft(component: str) -> str:
    """The shaft a margins row belongs to ("output/F", "output at step 3")."""
    return component.split("/")[0].split(" at ")[0]


class MarginTable(W.VBox):
    """The margins of every rated component (``loadscope.report.margins_rows``:
    the governing check of each, smallest margin first) for the duty cycle or
    one load case, chosen in the drop-down. Margins come from the last rating
    (see :class:`~loadscope.widgets.state.ExplorerState`); a note says when
    the controls have moved since. ``shafts`` keeps the rows of those shafts.
    The sizing column puts each part's size beside the smallest that meets
    its target (``loadscope.report.margins.sizing``: a section's d and
    d_min, a bearing's C and the C needed, or C0 and the C0 needed)."""

    def __init__(self, state: ExplorerState, shafts: tuple[str, ...] | None = None) -> None:
        self.state = state
        self._shafts = shafts
        self.case = W.Dropdown(options=[DUTY_CYCLE], value=DUTY_CYCLE, description="margins of")
        self.html = W.HTML()
        self.html.add_class("loadscope-table")
        self.rows: list[dict[str, Any]] = []
        super().__init__([self.case, self.html])
        self.add_class("loadscope-margins")
        self.case.observe(self.redraw, "value")
        state.observe(self._rated, ["ratings", "ratings_current", "rating_error", "units"])
        self._rated(None)

    def _rated(self, _change: Any) -> None:
        r = self.state.ratings
        names = case_names(r) if r is not None else [DUTY_CYCLE]
        if list(self.case.options) != names:
            keep = self.case.value if self.case.value in names else DUTY_CYCLE
            self.case.options = names                  # (this selects the first option ...)
            self.case.value = keep                     # (... so the choice is put back)
        self.redraw()

    def redraw(self, _change: Any = None) -> None:
        st = self.state
        note = ""
        if st.rating_error:
            note = f"<div class='loadscope-error'>Margins not available - {html.escape(st.rating_error)}</div>"
        elif not st.ratings_current:
            note = "<p class='pin'>Margins of the last rated state: they follow when the controls are still.</p>"
        if st.ratings is None:
            self.rows = []
            self.html.value = note
            return
        rows = margins_rows(st.ratings, self.case.value, st.units)
        if self._shafts is not None:
            rows = [r for r in rows if _component_shaft(r["component"]) in self._shafts]
        self.rows = rows
        lu = html.escape(label(st.units, "length"))
        head = "".join(f"<th>{h}</th>" for h in ("component", "kind", f"at [{lu}]", "check", "value", "allowable",
                                                 "unit", "margin", "status", "sizing"))
        body = []
        for r in rows:
            at = "" if r["at"] is None else number(r["at"])
            value = "inf" if math.isinf(r["value"]) else number(r["value"])
            allow = "inf" if math.isinf(r["allowable"]) else number(r["allowable"])
            body.append(f"<tr class='{html.escape(r['status'])}' title='{html.escape(r['method'])}'>"
                        f"<td>{html.escape(r['component'])}</td><td>{html.escape(r['kind'])}</td>"
                        f"<td class='n'>{at}</td><td>{html.escape(r['check'])}</td><td class='n'>{value}</td>"
                        f"<td class='n'>{allow}</td><td>{html.escape(r['unit'])}</td>"
                        f"<td class='n'>{_margin_text(r['margin'])}</td><td>{html.escape(r['status'])}</td>"
                        f"<td class='sizing'>{html.escape(r['sizing'])}</td></tr>")
        caption = html.escape(f"Margins, {self.case.value}: governing check of each component, smallest first "
                              "(hover a row for its method)")
        self.html.value = (note + f"<table data-table='margins'><caption>{caption}</caption><tr>{head}</tr>"
                           f"{''.join(body)}</table><p class='caution'>Caution: {html.escape(CAUTION)}</p>")


#: the explorer's own styles (colours from loadscope.viz.style)
STYLE_HTML = f"""<style>
.loadscope-explorer {{ background: {PALETTE['page']}; color: {PALETTE['ink']}; padding: 6px; }}
.loadscope-title {{ font-size: 1.25em; font-weight: 600; color: {PALETTE['ink']}; }}
.loadscope-error {{ border-left: 5px solid {PALETTE['applied']}; background: #FCEDE8; padding: 6px 10px; }}
.loadscope-note {{ color: {PALETTE['faint']}; font-size: 0.85em; padding: 2px 0 6px 0; }}
.loadscope-table table {{ border-collapse: collapse; margin: 8px 0 14px 0; font-size: 0.9em; }}
.loadscope-table caption {{ text-align: left; font-weight: 600; padding: 4px 0; color: {PALETTE['bearing']}; }}
.loadscope-table th {{ background: {PALETTE['plot']}; border-bottom: 2px solid {PALETTE['grid']};
  padding: 3px 8px; text-align: right; }}
.loadscope-table td {{ border-bottom: 1px solid {PALETTE['grid']}; padding: 2px 8px; }}
.loadscope-table td.n {{ text-align: right; font-variant-numeric: tabular-nums; }}
.loadscope-table .d {{ color: {PALETTE['reaction']}; font-size: 0.8em; margin-left: 6px; }}
.loadscope-table tr.watch td {{ background: #FFF4DC; }}
.loadscope-table tr.fail td {{ background: #FCE3DC; font-weight: 600; }}
.loadscope-table .caution, .loadscope-caution {{ color: {PALETTE['faint']}; font-size: 0.85em; }}
</style>"""

"""The parts an explorer is made of. Each observes one
:class:`~loadscope.widgets.state.ExplorerState` and redraws itself from
``loadscope.viz`` builders and ``loadscope.report`` tables; none does any
mechanics.

* :class:`ForceView` - the 3D force scene, applied loads / reactions / both
* :class:`ReactionView` - bearing reaction bars, radial/axial or x, y, z,
  the current state beside the pinned one
* :class:`DiagramView` - shear, bending, torque, deflection of a chosen shaft
* :class:`LoadTable` - tables of every load, with the change from the pinned
  state beside each value
* :class:`UnitsToggle`, :class:`MessageBar`
"""

from __future__ import annotations

import html
from typing import Any

import ipywidgets as W

from .. import CAUTION
from ..kernel.solve import DriveResult
from ..report import table_rows
from ..viz import force_scene, reaction_bars, shaft_diagrams
from ..viz.style import PALETTE, number
from .plotview import PlotView
from .state import ExplorerState

#: what the units toggle offers: (label, system)
UNIT_CHOICES = (("SI · N, mm, N·m, kW", "si"), ("US · lbf, in, lbf·in, hp", "us"))
SHOW_LABELS = (("applied loads", "applied"), ("reactions", "reactions"), ("both", "both"))
PARTS_LABELS = (("radial and axial", "radial_axial"), ("x, y, z parts", "components"))


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
    when the drive opens, so arrows grow and shrink as loads change."""

    def __init__(self, state: ExplorerState) -> None:
        self.state = state
        self.show = W.ToggleButtons(options=SHOW_LABELS, value="applied", description="arrows",
                                    style={"button_width": "110px"})
        self._scale: float | None = None
        self.view = PlotView(self._spec())
        super().__init__([self.show, self.view])
        self.add_class("loadscope-force-view")
        self.show.observe(self.redraw, "value")
        state.observe(self._reset, "topology")
        state.observe(self.redraw, ["result", "units"])

    def _spec(self) -> dict[str, Any]:
        spec = force_scene(self.state.result, self.state.units, self.show.value, self._scale)
        self._scale = spec["layout"]["meta"]["arrow_scale"] or None
        return spec

    def _reset(self, _change: Any) -> None:
        self._scale = None

    def redraw(self, _change: Any = None) -> None:
        self.view.show(self._spec())


def _cases(state: ExplorerState) -> dict[str, DriveResult] | None:
    """The current result beside the pinned one, when both have the same bearings."""
    pinned = state.pinned
    if pinned is None:
        return None
    same = [(s.id, s.solution.support_ids) for s in pinned.shafts] == \
           [(s.id, s.solution.support_ids) for s in state.result.shafts]
    return {"now": state.result, "pinned": pinned} if same else None


class ReactionView(W.VBox):
    """Bearing reaction bars; the pinned state, when there is one, as a
    second, hatched set of bars."""

    def __init__(self, state: ExplorerState) -> None:
        self.state = state
        self.parts = W.ToggleButtons(options=PARTS_LABELS, value="radial_axial", description="show",
                                     style={"button_width": "130px"})
        self.view = PlotView(self._spec())
        super().__init__([self.parts, self.view])
        self.add_class("loadscope-reaction-view")
        self.parts.observe(self.redraw, "value")
        state.observe(self.redraw, ["result", "units", "pinned"])

    def _spec(self) -> dict[str, Any]:
        return reaction_bars(self.state.result, self.state.units, self.parts.value, _cases(self.state))

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
        return shaft_diagrams(self.state.result, self.shaft.value, self.state.units)

    def _new_drive(self, _change: Any) -> None:
        ids = [s.id for s in self.state.drive.shafts]
        with self.shaft.hold_trait_notifications():
            self.shaft.options = ids
            if self.shaft.value not in ids:
                self.shaft.value = ids[-1]

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


def _table_html(name: str, now: Table, pinned: Table | None, keep: Any) -> str:
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
    title = html.escape(TABLE_TITLES.get(name, name))
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
.loadscope-table .caution, .loadscope-caution {{ color: {PALETTE['faint']}; font-size: 0.85em; }}
</style>"""

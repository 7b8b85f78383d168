"""The composed explorers. Each holds one
:class:`~loadscope.widgets.state.ExplorerState` and arranges parts round it:

* :class:`DriveExplorer` - the whole drive: every parameter, the force scene,
  reaction bars, the diagrams of a chosen shaft, every load table;
* :class:`ShaftExplorer` - one shaft: its parameters and the drive's, its
  diagrams, the reaction bars and its loads;
* :class:`MeshExplorer` - one gear pair, chosen among the drive's meshes:
  its parameters and the drive's, the pair's readouts (tooth forces,
  ratio, centre distance, pitch-line speed), the force scene and the
  reaction bars of the pair's two shafts, their loads and tooth forces.

Each opens on the demo drive when given nothing, and on any snapshot (a
dict, JSON text, a file path, or a Drive) when given one. A snapshot that is
not valid raises :class:`~loadscope.InputError` at construction (there is no
last good state yet); afterwards a bad value anywhere shows its message and
the explorer keeps its last good state.
"""

from __future__ import annotations

import html
from typing import Any

import ipywidgets as W

from .. import CAUTION
from ..errors import InputError
from ..kernel.solve import DriveResult
from .panel import ParameterPanel
from .parts import (
    STYLE_HTML,
    DiagramView,
    ForceView,
    LoadTable,
    MarginTable,
    MessageBar,
    PairReadout,
    ReactionView,
    UnitsToggle,
)
from .snapshot import SnapshotBar
from .state import DriveSource, ExplorerState


class _Explorer(W.VBox):
    """Header (title, units, snapshot bar), message, panel beside the views."""

    def __init__(self, state: ExplorerState, groups: Any, views: list[W.Widget]) -> None:
        self.state = state
        self.title = W.HTML()
        self.units = UnitsToggle(self.state)
        self.snapshot = SnapshotBar(self.state)
        self.message = MessageBar(self.state)
        self.panel = ParameterPanel(self.state, groups)
        self.views = W.VBox(views, layout=W.Layout(flex="1 1 auto", min_width="480px"))
        header = W.HBox([self.title, self.units], layout=W.Layout(justify_content="space-between",
                                                                  align_items="center"))
        body = W.HBox([self.panel, self.views], layout=W.Layout(align_items="flex-start"))
        caution = W.HTML(f"<div class='loadscope-caution'>Caution: {CAUTION}</div>")
        super().__init__([W.HTML(STYLE_HTML), header, self.snapshot, self.message, body, caution])
        self.add_class("loadscope-explorer")
        self.state.observe(self._retitle, ["drive"])
        self._retitle(None)

    def _retitle(self, _change: Any) -> None:
        # the name may come from an uploaded file: escaped
        self.title.value = f"<span class='loadscope-title'>{html.escape(self.state.drive.name or 'drive')}</span>"


class DriveExplorer(_Explorer):
    """The whole drive: parameters, force scene, reaction bars, shaft
    diagrams and load tables.

    Parameters
    ----------
    source : Drive, dict, str, Path or None
        A snapshot (dict, JSON text or file path) or a Drive; None opens the
        demo drive.
    units : str
        ``"si"`` or ``"us"`` to start with.
    shaft : str or None
        The shaft whose diagrams show first (default: the last shaft).
    rating : str
        When margins are worked out: ``"deferred"`` (once the controls are
        still), ``"sync"`` (every change) or ``"off"``.
    """

    def __init__(self, source: DriveSource = None, units: str = "si", shaft: str | None = None,
                 rating: str = "deferred") -> None:
        state = ExplorerState(source, units, rating)
        self.forces = ForceView(state)
        self.reactions = ReactionView(state)
        self.diagrams = DiagramView(state, shaft)
        self.table = LoadTable(state)
        self.margins = MarginTable(state)
        super().__init__(state, None, [self.forces, self.reactions, self.diagrams, self.table, self.margins])

    @property
    def plots(self) -> list[Any]:
        """Every PlotView of the explorer."""
        return [self.forces.view, self.reactions.view, self.diagrams.view]


class ShaftExplorer(_Explorer):
    """One shaft with its loads: its parameters (and the drive's speed and
    power), its diagrams, the reaction bars and its rows of the load table.

    ``shaft`` is the shaft's id (default: the first shaft)."""

    def __init__(self, source: DriveSource = None, shaft: str | None = None, units: str = "si",
                 rating: str = "deferred") -> None:
        state = ExplorerState(source, units, rating)
        ids = [s.id for s in state.drive.shafts]
        shaft = ids[0] if shaft is None else shaft
        if shaft not in ids:
            raise InputError("shaft", f"no shaft {shaft!r} in this drive", ", ".join(ids))
        self.shaft_id = shaft
        self.diagrams = DiagramView(state, shaft)
        self.reactions = ReactionView(state)
        self.table = LoadTable(state, shafts=(shaft,), meshes=())
        self.margins = MarginTable(state, shafts=(shaft,))
        super().__init__(state, lambda g: g in ("drive", f"shaft {shaft}"),
                         [self.diagrams, self.reactions, self.table, self.margins])

    @property
    def plots(self) -> list[Any]:
        """Every PlotView of the explorer."""
        return [self.diagrams.view, self.reactions.view]


class MeshExplorer(_Explorer):
    """One gear pair: its parameters (pressure angle, helix angle, pitch
    radius, efficiency) and the drive's speed and power; the pair's
    readouts (transmitted, radial and axial tooth force, power, speed
    ratio, centre distance, pitch diameters, pitch-line speed); the force
    scene of the two shafts that carry the pair's gears (their gears,
    bearings and every arrow acting on them); the reaction bars of those
    shafts' bearings; their speeds, torques and reactions and the pair's
    tooth forces in the table.

    ``mesh`` is the mesh's id (default: the first mesh); the drop-down
    ``mesh`` switches to another mesh of the drive."""

    def __init__(self, source: DriveSource = None, mesh: str | None = None, units: str = "si",
                 rating: str = "off") -> None:
        state = ExplorerState(source, units, rating)
        ids = [m.id for m in state.drive.meshes]
        if not ids:
            raise InputError("meshes", "this drive has no gear mesh to explore", ">= 1 mesh")
        mesh = ids[0] if mesh is None else mesh
        if mesh not in ids:
            raise InputError("mesh", f"no mesh {mesh!r} in this drive", ", ".join(ids))
        self.mesh = W.Dropdown(options=ids, value=mesh, description="mesh")
        self.mesh.add_class("loadscope-mesh-choice")
        self.pair = PairReadout(state, self._mesh_of)
        self.forces = ForceView(state, self._shafts_of)
        self.reactions = ReactionView(state, self._shafts_of)
        self.table = LoadTable(state, shafts=self._shafts_of(state.result) or (), meshes=(mesh,))
        super().__init__(state, self._groups, [self.mesh, self.pair, self.forces, self.table, self.reactions])
        self.mesh.observe(self._refocus, "value")
        state.observe(self._new_drive, "topology")

    @property
    def mesh_id(self) -> str | None:
        """The mesh shown (None when an opened drive has no mesh)."""
        return self._mesh_of(self.state.result)

    def _mesh_of(self, result: DriveResult) -> str | None:
        # read from the result drawn: a new drive's notice may come after its result's
        ids = [m.id for m in result.drive.meshes]
        return self.mesh.value if self.mesh.value in ids else (ids[0] if ids else None)

    def _shafts_of(self, result: DriveResult) -> tuple[str, ...] | None:
        mesh = self._mesh_of(result)
        if mesh is None:
            return None
        gears = next(m.gears for m in result.drive.meshes if m.id == mesh)
        return tuple(s.id for s in result.drive.shafts if any(g.id in gears for g in s.gears))

    def _groups(self, group: str) -> bool:
        return group in ("drive", f"mesh {self._mesh_of(self.state.result)}")

    def _refocus(self, change: Any = None) -> None:
        mesh = self.mesh_id
        self.table.refocus(self._shafts_of(self.state.result) or (), () if mesh is None else (mesh,))
        self.pair.redraw()
        self.forces.redraw()
        self.reactions.redraw()
        if change is not None:          # a choice in the drop-down (a new drive rebuilds the panel itself)
            self.panel.regroup(self._groups)

    def _new_drive(self, _change: Any) -> None:
        ids = [m.id for m in self.state.drive.meshes]
        keep = self.mesh.value if self.mesh.value in ids else (ids[0] if ids else None)
        self.mesh.unobserve(self._refocus, "value")
        try:
            self.mesh.options = ids                    # (this selects the first option ...)
            self.mesh.value = keep                     # (... so the choice is put back)
        finally:
            self.mesh.observe(self._refocus, "value")
        self._refocus(None)

    @property
    def plots(self) -> list[Any]:
        """Every PlotView of the explorer."""
        return [self.forces.view, self.reactions.view]

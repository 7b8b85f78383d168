"""Jupyter widgets to explore the loads of a drive (needs the ``widgets``
extra: ipywidgets, anywidget, plotly).

Explorers (each opens on the demo drive, or on a snapshot dict, JSON text,
file path or Drive):

* :class:`DriveExplorer` - the whole drive
* :class:`ShaftExplorer` - one shaft with its loads
* :class:`MeshExplorer` - one gear pair (its two shafts, chosen among the drive's meshes)

Parts, to compose other layouts round one :class:`ExplorerState`:
:class:`ParameterPanel`, :class:`ForceView`, :class:`ReactionView`,
:class:`DiagramView`, :class:`LoadTable`, :class:`MarginTable`, :class:`PairReadout`, :class:`SnapshotBar`,
:class:`UnitsToggle`, :class:`MessageBar`; the figure transport
:class:`PlotView`. Results are for preliminary design (``loadscope.CAUTION``).
"""

from .explorers import DriveExplorer, MeshExplorer, ShaftExplorer
from .panel import ParameterPanel
from .params import Param, drive_params
from .parts import DiagramView, ForceView, LoadTable, MarginTable, MessageBar, PairReadout, ReactionView, UnitsToggle
from .plotview import PLOTLY_URL_ENV, PlotView, apply_update
from .snapshot import MAX_UPLOAD, DownloadButton, SnapshotBar
from .state import ExplorerState, read_drive

__all__ = [
    "MAX_UPLOAD", "PLOTLY_URL_ENV", "DiagramView", "DownloadButton", "DriveExplorer", "ExplorerState", "ForceView",
    "LoadTable", "MarginTable", "MeshExplorer", "MessageBar", "PairReadout", "Param", "ParameterPanel", "PlotView",
    "ReactionView",
    "ShaftExplorer", "SnapshotBar", "UnitsToggle", "apply_update", "drive_params", "read_drive",
]

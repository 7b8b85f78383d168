"""Plotly figure builders: a solved drive in, plain JSON-ready figure data
out (``{"data": [...], "layout": {...}}``). No state, no widgets, no I/O;
plotly itself is imported only by :func:`as_figure`.

* :func:`force_scene` - the 3D drive with tooth-force and reaction arrows
* :func:`reaction_bars` - bearing reactions, several load cases side by side
* :func:`shaft_diagrams` - shear, bending, torque and deflection of one shaft
* :func:`dashboard_figure` - reaction bars and one shaft's diagrams in one figure
* :func:`sweep_plot` - lines against a swept parameter
* :func:`as_figure`, :func:`figure_update` - to plotly, and the delta of two specs

Results are for preliminary design; every figure carries ``loadscope.CAUTION``.
"""

from .charts import DIAGRAM_ROWS, dashboard_figure, reaction_bars, shaft_diagrams, sweep_plot
from .figure import STRUCTURAL_KEYS, as_figure, figure_update
from .scene import SHOW_CHOICES, force_scene

#: the name the widgets issue asked for; the delta works for every builder's spec
scene_update = figure_update

__all__ = [
    "DIAGRAM_ROWS", "SHOW_CHOICES", "STRUCTURAL_KEYS", "as_figure", "dashboard_figure", "figure_update",
    "force_scene", "reaction_bars", "scene_update", "shaft_diagrams", "sweep_plot",
]

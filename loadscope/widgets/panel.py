"""The parameter panel: one slider or number box per :class:`Param` of the
drive, with its unit beside it, grouped by drive, mesh, shaft and housing.

Controls show display units (``state.units``); a move is turned back to SI
and proposed to the state. A rejected value puts the control back to the
value of the state (the message shows in the explorer).
"""

from __future__ import annotations

import html
import math
from collections.abc import Callable

import ipywidgets as W
from ipywidgets.widgets.widget_description import DescriptionStyle

from ..report.units import system
from .params import Param, drive_params
from .state import ExplorerState


def unit_of(units: str, kind: str) -> tuple[str, float]:
    """Display label and SI value of one display unit of a quantity kind
    (``"number"``: no unit)."""
    if kind == "number":
        return "", 1.0
    return system(units)[kind]


def _nice_step(span: float) -> float:
    """A round step giving about 200 slider positions over ``span``."""
    if span <= 0.0 or not math.isfinite(span):
        return 0.01
    raw = span / 200.0
    mag = 10.0 ** math.floor(math.log10(raw))
    for m in (1.0, 2.0, 5.0, 10.0):
        if raw <= m * mag:
            return m * mag
    return 10.0 * mag


class ParamControl:
    """A slider or number box bound to one :class:`Param`; its description
    is the label with the unit in brackets, e.g. ``input speed [rpm]``.
    ``input`` is the widget."""

    def __init__(self, param: Param, state: ExplorerState, on_value: Callable[[Param, float], None],
                 looks: dict[str, W.Widget]) -> None:
        self.param = param
        self._state = state
        self._on_value = on_value
        self._quiet = False
        shown = self._shown()
        if param.control == "slider":
            self.input: W.FloatSlider | W.BoundedFloatText = W.FloatSlider(
                readout_format=".4g", style=looks["slider_style"], layout=looks["slider"], continuous_update=True,
                **shown)
        else:
            self.input = W.BoundedFloatText(style=looks["box_style"], layout=looks["box"], **shown)
        self.input.add_class("loadscope-param")
        self.input.observe(self._moved, "value")

    @property
    def unit(self) -> str:
        """The unit shown now (empty for a plain number)."""
        return unit_of(self._state.units, self.param.kind)[0]

    def _shown(self) -> dict[str, object]:
        """Traits that show the state's value in the state's units."""
        p = self.param
        label, factor = unit_of(self._state.units, p.kind)
        lo, hi = p.lo / factor, p.hi / factor
        value = p.get(self._state.drive) / factor
        step = None
        if p.control == "slider":
            # The page's slider snaps to min + n * step and sends the snapped value back:
            # put the current value on the grid (bounds moved inward) so that showing it changes nothing.
            step = _nice_step(hi - lo)
            if lo <= value <= hi:
                lo = value - math.floor((value - lo) / step + 1e-9) * step
                hi = value + math.floor((hi - value) / step + 1e-9) * step
        return {"min": min(lo, value), "max": max(hi, value), "step": step, "value": value,
                "description": f"{p.label} [{label}]" if label else p.label,
                "tooltip": f"{p.key}: {lo:.4g} to {hi:.4g} {label}" + (f"; {p.note}" if p.note else "")}

    def refresh(self) -> None:
        """Show the state's value in the state's units (no proposal)."""
        shown = self._shown()
        self._quiet = True
        try:
            # one message with every key: the page must never see a value with the other units' bounds
            # (it would clamp it and send the clamped value back as a move)
            with self.input.hold_sync(), self.input.hold_trait_notifications():
                # widen first so that neither bound rejects the other on the way
                self.input.max = max(shown["max"], self.input.min)      # type: ignore[call-overload]
                for key in ("min", "max", "step", "value", "description", "tooltip"):
                    setattr(self.input, key, shown[key])
        finally:
            self._quiet = False

    def _moved(self, change: dict) -> None:
        if self._quiet:
            return
        _, factor = unit_of(self._state.units, self.param.kind)
        shown = self.param.get(self._state.drive) / factor
        new = float(change["new"])
        if abs(new - shown) <= 1e-9 * max(abs(shown), self.input.step or 0.0, 1e-300):
            return          # the page's round-off of the value it was given, not a move
        self._on_value(self.param, new * factor)


class ParameterPanel(W.VBox):
    """Controls for every adjustable number of the state's drive, grouped in
    an accordion (drive, meshes, shafts, housing, load cases). ``groups``
    keeps only the groups for which it returns True (the smaller explorers
    use it).

    A group's controls are made when its section is first opened (or when
    code asks for them through :attr:`controls`, :meth:`set_value` or
    :meth:`value`): a page then starts with a handful of widget models, not
    one per number of the drive."""

    def __init__(self, state: ExplorerState, groups: Callable[[str], bool] | None = None) -> None:
        super().__init__(layout=W.Layout(width="420px"))
        self.add_class("loadscope-panel")
        self.state = state
        self._keep = groups or (lambda g: True)
        self._built: dict[str, ParamControl] = {}
        # one layout and style of each kind, shared by every control: a few models in the page, not hundreds
        self._looks = {"slider": W.Layout(width="390px"), "box": W.Layout(width="300px"),
                       "slider_style": W.SliderStyle(description_width="190px"),
                       "box_style": DescriptionStyle(description_width="190px")}
        self._build()
        state.observe(self._rebuild, "topology")
        state.observe(self._refresh_all, "units")
        state.observe(self._follow, "drive")

    @property
    def controls(self) -> dict[str, ParamControl]:
        """Every control, by field path (makes those not made yet)."""
        for g in self._groups:
            self._open_group(g)
        return dict(self._built)

    def _build(self) -> None:
        params = [p for p in drive_params(self.state.drive, self.state.result) if self._keep(p.group)]
        self._groups: dict[str, list[Param]] = {}
        for p in params:
            self._groups.setdefault(p.group, []).append(p)
        self._group_of = {p.key: p.group for p in params}
        self._boxes = {g: W.VBox() for g in self._groups}
        self._built = {}
        self._acc = W.Accordion(children=list(self._boxes.values()), titles=tuple(self._groups))
        self._acc.observe(self._opened, "selected_index")
        self._acc.selected_index = 0 if self._groups else None
        self.children = [self._acc]

    def _opened(self, change: dict) -> None:
        if change["new"] is not None:
            self._open_group(list(self._groups)[change["new"]])

    def _open_group(self, group: str) -> None:
        box = self._boxes[group]
        if box.children:
            return
        params = self._groups[group]
        made = [ParamControl(p, self.state, self._propose, self._looks) for p in params]
        self._built.update({c.param.key: c for c in made})
        notes = [html.escape(f"{p.label}: {p.note}") for p in params if p.note]   # ids come from the snapshot
        box.children = [*(c.input for c in made), W.HTML("<div class='loadscope-note'>" + "<br>".join(notes)
                                                          + "</div>")]

    def regroup(self, groups: Callable[[str], bool] | None) -> None:
        """Show other groups (``groups`` as in the constructor): the panel is made again."""
        self._keep = groups or (lambda g: True)
        self._rebuild(None)

    def _rebuild(self, _change: dict | None) -> None:
        # close the old controls' models, or every import would leave them open in the kernel and page
        old_acc, old_boxes = self._acc, list(self._boxes.values())
        self._build()
        for box in old_boxes:
            for w in box.children:
                w.close()
            box.close()
        old_acc.close()

    def _refresh_all(self, _change: dict) -> None:
        for c in self._built.values():
            c.refresh()

    def _follow(self, _change: dict) -> None:
        # Only controls whose value the change moved (e.g. a drive set from code).
        for c in self._built.values():
            _, factor = unit_of(self.state.units, c.param.kind)
            now = c.param.get(self.state.drive) / factor
            if not math.isclose(now, c.input.value, rel_tol=1e-12, abs_tol=1e-15):
                c.refresh()

    def _propose(self, param: Param, value: float) -> None:
        ok = self.state.propose(lambda d: param.set(d, value))
        if not ok:
            self._built[param.key].refresh()

    def control(self, key: str) -> ParamControl:
        """The control of one field path (made if need be)."""
        if key not in self._group_of:
            raise KeyError(key)
        self._open_group(self._group_of[key])
        return self._built[key]

    def set_value(self, key: str, value: float) -> None:
        """Set a control as a person would, in display units."""
        self.control(key).input.value = value

    def value(self, key: str) -> float:
        """A control's value in display units."""
        return float(self.control(key).input.value)

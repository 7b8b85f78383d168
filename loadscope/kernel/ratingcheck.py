"""One rating check and its verdict: margin and pass / watch / fail.

The margin is the relative distance of a value to its allowable:

* for a value that must stay below its allowable (a stress, a deflection):
  margin = allowable / value - 1;
* for a value that must reach its allowable (a life, a safety factor):
  margin = value / allowable - 1;

so 0 is exactly at the limit and 0.25 is 25 % to spare. Status: ``fail``
below 0, ``watch`` from 0 up to :data:`WATCH_BAND` (0.10: within 10 % of
the limit, common practice for a first design pass), ``pass`` above. An
unloaded component has an infinite margin.

>>> c = RatingCheck("rated", "bolt", "bolt B1", "combined vs proof", 1.05, 1.0, "factor", "min", "example")
>>> round(c.margin, 6), c.status
(0.05, 'watch')
>>> RatingCheck("rated", "stiffness", "s at g", "deflection", 0.2e-3, 0.127e-3, "deflection", "max", "x").status
'fail'
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Literal

Sense = Literal["min", "max"]
Status = Literal["pass", "watch", "fail"]

#: A margin from 0 up to this value is ``watch`` (within 10 % of the limit).
WATCH_BAND = 0.10


@dataclass(frozen=True)
class RatingCheck:
    """One check of one component in one load case (or the duty cycle).

    ``kind`` is ``bearing``, ``shaft section``, ``stiffness``, ``mesh`` or
    ``bolt``; ``component`` names it (e.g. ``input/A``, ``input at p1``);
    ``check`` says what is compared; ``value`` and ``allowable`` are SI
    floats (lives in hours) of the quantity ``unit`` (a report/units kind:
    ``life``, ``factor``, ``ratio``, ``deflection``, ``slope``, ``stress``);
    ``sense`` is ``min`` (value must reach the allowable) or ``max`` (must
    stay below it); ``method`` names the published method or source;
    ``path`` the field path of the rated part; ``at`` [m] its axial
    position on its shaft (NaN-free: None where it has none); ``details``
    the intermediate numbers (SI) behind the value.
    """

    case: str
    kind: str
    component: str
    check: str
    value: float
    allowable: float
    unit: str
    sense: Sense
    method: str
    path: str = ""
    at: float | None = None
    details: dict[str, float] = field(default_factory=dict, compare=False)

    @property
    def margin(self) -> float:
        """Relative margin to the allowable (see the module docstring); inf when unloaded."""
        num, den = (self.value, self.allowable) if self.sense == "min" else (self.allowable, self.value)
        if den <= 0.0:
            return math.inf
        return num / den - 1.0

    @property
    def status(self) -> Status:
        """``pass``, ``watch`` (0 <= margin < WATCH_BAND) or ``fail`` (margin < 0)."""
        m = self.margin
        return "fail" if m < 0.0 else "watch" if m < WATCH_BAND else "pass"


def governing(checks: tuple[RatingCheck, ...] | list[RatingCheck]) -> list[RatingCheck]:
    """The governing check (smallest margin) of each component, sorted by margin."""
    best: dict[tuple[str, str], RatingCheck] = {}
    for c in checks:
        key = (c.kind, c.component)
        if key not in best or c.margin < best[key].margin:
            best[key] = c
    return sorted(best.values(), key=lambda c: (c.margin, c.kind, c.component))

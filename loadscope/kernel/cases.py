"""Load cases: solve a drive once per operating condition.

A case replaces the power or torque at the drive's loaded port (the one port
that gives power or torque) and the input speed; everything else stays. A
drive without cases has one, ``nominal``, from its own power and speed,
with the whole share of time.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass

from .model import Drive, Port
from .ratingdata import LoadCase
from .solve import DriveResult, solve

NOMINAL = "nominal"


def drive_cases(drive: Drive) -> tuple[LoadCase, ...]:
    """The drive's load cases, or the one nominal case when it has none."""
    if drive.cases:
        return drive.cases
    port = _loaded_port(drive)
    return (LoadCase(NOMINAL, 1.0, power=port.power, torque=port.torque, speed=drive.speed),)


def _loaded_port(drive: Drive) -> Port:
    return next(p for p in (drive.input, *drive.outputs) if p.power is not None or p.torque is not None)


def apply_case(drive: Drive, case: LoadCase) -> Drive:
    """The drive as it runs in ``case``: the loaded port's power or torque
    and the input speed replaced where the case gives them. The result has
    no cases of its own (it *is* one case)."""
    port = _loaded_port(drive)
    new_port = port
    if case.power is not None or case.torque is not None:
        new_port = dataclasses.replace(port, power=case.power, torque=case.torque)
    inp = new_port if port is drive.input else drive.input
    outs = tuple(new_port if o is port else o for o in drive.outputs)
    speed = drive.speed if case.speed is None else case.speed
    return dataclasses.replace(drive, input=inp, outputs=outs, speed=speed, cases=())


@dataclass(frozen=True)
class CaseResult:
    """One load case and the drive solved in it."""

    case: LoadCase
    result: DriveResult


def solve_cases(drive: Drive, samples: int = 64) -> tuple[CaseResult, ...]:
    """Solve the drive once per load case (see :func:`drive_cases`); the
    results come in the order of the cases."""
    return tuple(CaseResult(c, solve(apply_case(drive, c), samples)) for c in drive_cases(drive))

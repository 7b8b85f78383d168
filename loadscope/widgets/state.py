"""The state of one explorer: the current drive, its solved result, the
display units, the pinned state to compare with, and the last message.

Every part of an explorer observes this one object. A change goes through
:meth:`ExplorerState.propose`: the new drive is solved once; when the drive
or the solve raises :class:`~loadscope.InputError`, ``error`` holds the
message and the drive, result and every figure stay as they were.
"""

from __future__ import annotations

import logging
from collections.abc import Callable
from pathlib import Path

import traitlets

from ..errors import InputError
from ..kernel.model import Drive
from ..kernel.solve import DriveResult, solve
from ..spec import demo_snapshot, drive_from_snapshot, load_snapshot

log = logging.getLogger(__name__)

DriveSource = Drive | dict | str | Path | None


def read_drive(source: DriveSource) -> Drive:
    """A Drive from a Drive, a snapshot dict, JSON text or a file path;
    the demo drive for None.

    Raises
    ------
    InputError
        The snapshot is not valid (the message names the field).
    """
    if source is None:
        return drive_from_snapshot(demo_snapshot())
    if isinstance(source, Drive):
        return source
    if isinstance(source, (dict, str, Path)):
        try:
            return load_snapshot(source)
        except OSError as exc:
            raise InputError("snapshot", f"cannot read {source}: {exc.strerror or exc}",
                             "a readable snapshot file, JSON text or a dict") from None
    raise InputError("snapshot", f"cannot open a {type(source).__name__}",
                     "a Drive, a snapshot dict, JSON text or a file path")


def solved(drive: Drive) -> DriveResult:
    """``solve(drive)`` with every shaft's diagram sampled, so that the time
    of a change is all spent here, once."""
    result = solve(drive)
    for sr in result.shafts:
        _ = sr.solution.diagram
    return result


class ExplorerState(traitlets.HasTraits):
    """Current drive and result, display units, pinned result, last message."""

    drive = traitlets.Instance(Drive, help="the drive shown (SI, frozen)")
    result = traitlets.Instance(DriveResult, help="solve(drive)")
    units = traitlets.Enum(("si", "us"), "si", help="display units: SI or US customary")
    pinned = traitlets.Instance(DriveResult, allow_none=True, help="the state to compare with, or None")
    error = traitlets.Unicode("", help="message of the last rejected change; empty when it was accepted")
    topology = traitlets.Int(0, help="counts drives of another structure (imports); parts rebuild on it")

    def __init__(self, source: DriveSource = None, units: str = "si") -> None:
        drive = read_drive(source)
        super().__init__(drive=drive, result=solved(drive), units=units)

    def propose(self, change: Drive | Callable[[Drive], Drive], *, new_topology: bool = False) -> bool:
        """Make ``change`` (a Drive, or a function of the current drive) the
        current drive, solved once. Returns False and sets ``error`` (state
        kept) when the drive cannot be built or solved."""
        try:
            drive = change if isinstance(change, Drive) else change(self.drive)
            result = solved(drive)
        except InputError as exc:
            self.error = str(exc)
            return False
        except Exception as exc:  # never a raw traceback in the page; the state stays
            log.exception("solve failed")
            self.error = f"the drive could not be solved: {type(exc).__name__}: {exc}"
            return False
        with self.hold_trait_notifications():
            if new_topology:
                self.pinned = None
                self.topology += 1
            self.drive = drive
            self.result = result
            self.error = ""
        return True

    def open(self, source: DriveSource) -> bool:
        """Replace the drive by another snapshot (any structure); the pin is
        dropped. Returns False and sets ``error`` when it is not valid."""
        try:
            drive = read_drive(source)
        except InputError as exc:
            self.error = str(exc)
            return False
        return self.propose(drive, new_topology=True)

    def pin(self) -> None:
        """Compare later states with the current one."""
        self.pinned = self.result

    def unpin(self) -> None:
        """Stop comparing."""
        self.pinned = None

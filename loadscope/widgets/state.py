"""The state of one explorer: the current drive, its solved result, the
display units, the pinned state to compare with, the ratings, and the last
message.

Every part of an explorer observes this one object. A change goes through
:meth:`ExplorerState.propose`: the new drive is solved once; when the drive
or the solve raises :class:`~loadscope.InputError`, ``error`` holds the
message and the drive, result and every figure stay as they were.

Ratings (:func:`loadscope.kernel.ratings.rate`: every load case solved, every
bearing, section, stiffness limit and bolt checked) take several solves, too
long for every slider step. With ``rating="deferred"`` (the default) they run
once the controls have been still for ``RATING_DELAY`` seconds (on the
kernel's event loop; at once when no loop runs, as in a script); meanwhile
``ratings_current`` is False and the margins on show are those of the last
rated state. ``"sync"`` rates on every change, ``"off"`` never.
"""

from __future__ import annotations

import asyncio
import logging
from collections.abc import Callable
from pathlib import Path

import traitlets

from ..errors import InputError
from ..kernel.model import Drive
from ..kernel.ratings import DriveRatings, rate
from ..kernel.solve import DriveResult, solve
from ..spec import demo_snapshot, drive_from_snapshot, load_snapshot

log = logging.getLogger(__name__)

#: seconds of stillness after which a deferred rating runs
RATING_DELAY = 0.35
RATING_MODES = ("deferred", "sync", "off")

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
    ratings = traitlets.Instance(DriveRatings, allow_none=True, help="ratings of the last rated drive")
    ratings_current = traitlets.Bool(False, help="ratings are those of the current drive")
    rating_error = traitlets.Unicode("", help="why the last rating failed; empty when it did not")

    def __init__(self, source: DriveSource = None, units: str = "si", rating: str = "deferred") -> None:
        if rating not in RATING_MODES:
            raise InputError("rating", f"unknown mode {rating!r}", ", ".join(RATING_MODES))
        drive = read_drive(source)
        super().__init__(drive=drive, result=solved(drive), units=units)
        self.rating = rating
        self._pending: asyncio.TimerHandle | None = None
        if rating != "off":
            self.rate_now()

    def rate_now(self) -> None:
        """Rate the current drive now (cancels a deferred rating)."""
        if self._pending is not None:
            self._pending.cancel()
            self._pending = None
        drive = self.drive
        try:
            ratings = rate(drive)
        except InputError as exc:
            with self.hold_trait_notifications():
                self.ratings, self.ratings_current, self.rating_error = None, False, str(exc)
            return
        except Exception as exc:  # the loads stay on show; only the margins are missing
            log.exception("rating failed")
            with self.hold_trait_notifications():
                self.ratings, self.ratings_current = None, False
                self.rating_error = f"the drive could not be rated: {type(exc).__name__}: {exc}"
            return
        with self.hold_trait_notifications():
            self.ratings, self.ratings_current, self.rating_error = ratings, True, ""

    def _schedule_rating(self) -> None:
        if self.rating == "off":
            return
        self.ratings_current = False
        if self.rating == "sync":
            self.rate_now()
            return
        try:
            loop = asyncio.get_running_loop()
        except RuntimeError:
            loop = None
        if loop is None:
            self.rate_now()
            return
        if self._pending is not None:
            self._pending.cancel()
        self._pending = loop.call_later(RATING_DELAY, self._deferred)

    def _deferred(self) -> None:
        self._pending = None
        self.rate_now()

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
        self._schedule_rating()
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

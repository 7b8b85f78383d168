"""Which shafts a figure shows: the whole drive, or a few of its shafts
(the gear-pair view draws the two shafts of its mesh)."""

from __future__ import annotations

from collections.abc import Collection, Iterable

from ..errors import InputError
from ..kernel.solve import DriveResult, ShaftResult


def shaft_focus(result: DriveResult, shafts: Iterable[str] | None) -> tuple[str, ...]:
    """The ids of the shafts to draw, in drive order: every shaft for None,
    else those named in ``shafts`` (each must be a shaft of the drive).

    >>> from loadscope import solve
    >>> from loadscope.spec import demo_snapshot, drive_from_snapshot
    >>> r = solve(drive_from_snapshot(demo_snapshot()))
    >>> shaft_focus(r, ["intermediate", "input"])
    ('input', 'intermediate')
    """
    ids = [sr.id for sr in result.shafts]
    if shafts is None:
        return tuple(ids)
    if isinstance(shafts, str):
        shafts = (shafts,)
    chosen = list(shafts)
    for s in chosen:
        if s not in ids:
            raise InputError("shafts", f"no shaft {s!r} in this drive", ", ".join(ids))
    if not chosen:
        raise InputError("shafts", "names no shaft", "None (every shaft) or one or more of " + ", ".join(ids))
    return tuple(i for i in ids if i in chosen)


def kept(result: DriveResult, ids: Collection[str]) -> list[ShaftResult]:
    """The shaft results whose id is in ``ids``, in drive order."""
    return [sr for sr in result.shafts if sr.id in ids]

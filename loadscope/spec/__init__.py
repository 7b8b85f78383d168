"""The spec layer: the drive snapshot (loadscope's JSON format), its units
and its schema, and the embedded demo drive.

>>> from loadscope.spec import demo_snapshot, drive_from_snapshot
>>> drive = drive_from_snapshot(demo_snapshot())
>>> [s.id for s in drive.shafts]
['input', 'intermediate', 'output']
"""

from .demo import demo_snapshot
from .snapshot import (
                       FORMAT,
                       SCHEMA_ID,
                       VERSION,
                       drive_from_snapshot,
                       dump_snapshot,
                       load_snapshot,
                       snapshot_from_drive,
                       snapshot_schema,
                       write_schema_file,
)
from .units import STANDARD_GRAVITY, format_quantity, parse_quantity

__all__ = [
    "FORMAT", "SCHEMA_ID", "STANDARD_GRAVITY", "VERSION", "demo_snapshot", "drive_from_snapshot", "dump_snapshot",
    "format_quantity", "load_snapshot", "parse_quantity", "snapshot_from_drive", "snapshot_schema",
    "write_schema_file",
]

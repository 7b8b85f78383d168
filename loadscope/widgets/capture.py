"""Record what widgets send to the page, without a kernel or a browser.

Used by the tests and by ``bench/bench_widgets.py`` to count the bytes a
change costs. Widgets created inside :func:`capture_comms` get a comm that
keeps every message instead of sending it; sizes are measured the way the
kernel packs them (JSON, as ``jupyter_client`` writes it, plus the binary
buffers). The message headers (a few hundred bytes each) are not counted.
"""

from __future__ import annotations

import contextlib
import json
from collections.abc import Iterator
from dataclasses import dataclass, field
from typing import Any

import comm
from comm.base_comm import BaseComm


@dataclass
class Sent:
    """One message a widget sent: its type, content and buffers."""

    msg_type: str
    data: dict[str, Any]
    buffers: list[bytes]
    comm_id: str

    @property
    def size(self) -> int:
        """Bytes of the JSON content plus the buffers."""
        text = json.dumps(self.data, ensure_ascii=False, allow_nan=False, default=str)
        return len(text.encode("utf-8")) + sum(len(b) for b in self.buffers)


@dataclass
class Recorder:
    """Every message sent while capturing, oldest first."""

    messages: list[Sent] = field(default_factory=list)

    def clear(self) -> None:
        self.messages.clear()

    @property
    def size(self) -> int:
        """Total bytes sent."""
        return sum(m.size for m in self.messages)

    def custom(self, comm_id: str | None = None) -> list[dict[str, Any]]:
        """Contents of the custom messages (``method: custom``), optionally of one widget."""
        return [m.data["content"] for m in self.messages
                if m.data.get("method") == "custom" and (comm_id is None or m.comm_id == comm_id)]


class _RecordingComm(BaseComm):
    recorder: Recorder

    def publish_msg(self, msg_type: str, data: Any = None, metadata: Any = None, buffers: Any = None,
                    **keys: Any) -> None:
        self.recorder.messages.append(Sent(msg_type, dict(data or {}), [bytes(b) for b in (buffers or [])],
                                           self.comm_id))


@contextlib.contextmanager
def capture_comms() -> Iterator[Recorder]:
    """Widgets created inside record what they send in the yielded Recorder
    (they keep recording after the block ends)."""
    recorder = Recorder()
    cls = type("RecordingComm", (_RecordingComm,), {"recorder": recorder})
    original = comm.create_comm
    comm.create_comm = lambda *args, **kwargs: cls(*args, **kwargs)
    try:
        yield recorder
    finally:
        comm.create_comm = original

"""The snapshot bar: save the drive (and its loads) as JSON files the
browser downloads, open a snapshot file, pin the current state to compare.

Downloads go through :class:`DownloadButton` (a small anywidget): nothing is
sent to the page until the button is pressed, so a slider move costs no
bytes here. Uploads are untrusted: at most ``MAX_UPLOAD`` bytes, a ``.json``
name, UTF-8 JSON text, a valid snapshot; anything else shows its message and
the current state stays.
"""

from __future__ import annotations

import html
import re
from collections.abc import Callable
from pathlib import Path
from typing import Any

import anywidget
import ipywidgets as W
import traitlets

from ..errors import InputError
from ..report import to_json
from ..spec import dump_snapshot
from .state import ExplorerState

#: largest snapshot file accepted [bytes]
MAX_UPLOAD = 1_000_000


class DownloadButton(anywidget.AnyWidget):
    """A button that saves the file ``producer()`` returns as
    ``(name, mime type, bytes)``; the file is made when pressed."""

    _esm = Path(__file__).with_name("download.js")
    label = traitlets.Unicode("Download").tag(sync=True)
    hint = traitlets.Unicode("", help="shown when the pointer rests on the button").tag(sync=True)

    def __init__(self, producer: Callable[[], tuple[str, str, bytes]], **kwargs: Any) -> None:
        super().__init__(**kwargs)
        self._producer = producer
        self.on_msg(self._on_browser_msg)

    def file(self) -> tuple[str, str, bytes]:
        """The file the button would save now."""
        return self._producer()

    def _on_browser_msg(self, _widget: Any, content: Any, _buffers: Any) -> None:
        if isinstance(content, dict) and content.get("kind") == "download":
            name, mime, data = self._producer()
            self.send({"kind": "file", "name": name, "mime": mime}, buffers=[data])


def _file_stem(name: str) -> str:
    stem = re.sub(r"[^A-Za-z0-9._-]+", "-", name).strip("-.")[:60]
    return stem or "drive"


def read_upload(item: dict[str, Any]) -> str:
    """The text of one ``FileUpload`` entry, checked: size, name, UTF-8.

    Raises
    ------
    InputError
        Too large, not a .json file, or not UTF-8 text.
    """
    name = str(item.get("name", ""))
    content = item.get("content", b"")
    data = bytes(content)
    if len(data) > MAX_UPLOAD or int(item.get("size", 0) or 0) > MAX_UPLOAD:
        raise InputError("snapshot file", f"{name or 'the file'} is {max(len(data), int(item.get('size') or 0))} "
                         "bytes", f"at most {MAX_UPLOAD} bytes")
    if not name.lower().endswith(".json"):
        raise InputError("snapshot file", f"{name!r} is not a .json file", "a loadscope snapshot saved as .json")
    try:
        text = data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise InputError("snapshot file", f"{name} is not UTF-8 text ({exc.reason} at byte {exc.start})",
                         "a JSON snapshot in UTF-8") from None
    if not text.lstrip().startswith("{"):
        raise InputError("snapshot file", f"{name} does not hold a JSON object", '{"format": "loadscope.drive", ...}')
    return text


class SnapshotBar(W.HBox):
    """Save snapshot, save loads, open snapshot, pin / unpin."""

    def __init__(self, state: ExplorerState) -> None:
        self.state = state
        self.save = DownloadButton(self.snapshot_file, label="Save snapshot",
                                   hint="the drive as a loadscope snapshot (.json) - opens here and in the CLI")
        self.save_loads = DownloadButton(self.loads_file, label="Save loads",
                                         hint="every load of the current drive, in the chosen units (.json)")
        self.upload = W.FileUpload(accept=".json,application/json", multiple=False, description="Open snapshot",
                                   layout=W.Layout(width="150px"))
        self.pin_button = W.Button(description="Pin for comparison", icon="thumb-tack",
                                   tooltip="keep the current loads; every load then shows its change from them")
        self.unpin_button = W.Button(description="Unpin", disabled=True)
        self.status = W.HTML()
        super().__init__([self.save, self.save_loads, self.upload, self.pin_button, self.unpin_button, self.status],
                         layout=W.Layout(flex_flow="row wrap", align_items="center"))
        self.add_class("loadscope-snapshot-bar")
        self.upload.observe(self._uploaded, "value")
        self.pin_button.on_click(lambda _b: state.pin())
        self.unpin_button.on_click(lambda _b: state.unpin())
        state.observe(self._pin_changed, "pinned")

    def snapshot_file(self) -> tuple[str, str, bytes]:
        """The canonical snapshot of the current drive."""
        text = dump_snapshot(self.state.drive) + "\n"
        return f"{_file_stem(self.state.drive.name)}.json", "application/json", text.encode("utf-8")

    def loads_file(self) -> tuple[str, str, bytes]:
        """Every load of the current drive (``loadscope.report.to_json``)."""
        text = to_json(self.state.result, self.state.units) + "\n"
        return f"{_file_stem(self.state.drive.name)}-loads.json", "application/json", text.encode("utf-8")

    def open_text(self, text: str) -> bool:
        """Open snapshot JSON text; False (message shown, state kept) when invalid."""
        return self.state.open(text)

    def _uploaded(self, change: dict) -> None:
        items = change["new"]
        if not items:
            return
        try:
            text = read_upload(dict(items[0]))
        except InputError as exc:
            self.state.error = str(exc)
        else:
            if self.open_text(text):
                self.status.value = f"opened {html.escape(str(items[0].get('name', '')))}"   # a name from the page
        finally:
            self.upload.value = ()          # drop the file from the widget state

    def _pin_changed(self, _change: dict) -> None:
        pinned = self.state.pinned is not None
        self.unpin_button.disabled = not pinned
        self.status.value = "pinned: changes are shown beside every load" if pinned else ""

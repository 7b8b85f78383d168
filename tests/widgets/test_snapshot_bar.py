"""The snapshot bar: export, import (good and bad files), pin and compare."""

from __future__ import annotations

import datetime
import json

import pytest
from widget_drives import demo_with, solve_snapshot

from loadscope.report import tables
from loadscope.spec import dump_snapshot
from loadscope.widgets import MAX_UPLOAD


def _upload(ex, name: str, data: bytes):
    """What a browser upload puts into the FileUpload widget."""
    ex.snapshot.upload.value = ({"name": name, "type": "application/json", "size": len(data),
                                 "content": memoryview(data),
                                 "last_modified": datetime.datetime(2026, 1, 1, tzinfo=datetime.UTC)},)


def test_export_then_import_round_trips_exactly(recorded):
    ex, rec = recorded
    ex.panel.set_value("input.power", 4.25)
    ex.panel.set_value("shafts[0].supports[1].at", 190.0)
    name, mime, data = ex.snapshot.save.file()
    assert name.endswith(".json") and mime == "application/json"
    drive = ex.state.drive
    ex.panel.set_value("input.power", 9.0)                       # move away, then come back by import
    _upload(ex, name, data)
    assert ex.state.error == ""
    assert ex.state.drive == drive                               # the very same floats
    assert ex.snapshot.save.file()[2] == data                    # and the very same text
    assert data.decode() == dump_snapshot(drive) + "\n"
    assert ex.snapshot.upload.value == ()                        # the file does not stay in the page state


def test_download_button_sends_the_file_only_when_asked(recorded):
    ex, rec = recorded
    ex.snapshot.save._handle_custom_msg({"kind": "steal"}, [])
    assert rec.custom() == []
    ex.snapshot.save._handle_custom_msg({"kind": "download"}, [])
    (msg,) = [m for m in rec.messages if m.data.get("method") == "custom"]
    assert msg.data["content"]["kind"] == "file"
    assert msg.buffers == [ex.snapshot.save.file()[2]]
    loads = json.loads(ex.snapshot.save_loads.file()[2])
    assert loads["format"] == "loadscope.result" and loads["caution"]


@pytest.mark.parametrize("name, data, words", [
    ("drive.json", b'{"format": "loadscope.drive", "version": 1, "shafts": [', "not valid JSON"),
    ("drive.json", json.dumps(demo_with(lambda s: s["input"].update(speed="0 rpm"))).encode(), "input.speed"),
    ("drive.json", json.dumps(demo_with(lambda s: s["shafts"][1]["gears"][1].update(pressure_angle="45 deg")))
     .encode(), "shafts[1].gears[1].pressure_angle"),
    ("drive.json", json.dumps(demo_with(lambda s: s.update(colour="red"))).encode(), "colour"),
    ("drive.json", b"\xff\xfe{ }", "not UTF-8"),
    ("drive.json", b"[1, 2, 3]", "JSON object"),
    ("drive.txt", json.dumps(demo_with(lambda s: None)).encode(), "not a .json file"),
    ("big.json", b"{" + b" " * MAX_UPLOAD + b"}", f"at most {MAX_UPLOAD} bytes"),
])
def test_bad_import_shows_the_message_and_keeps_the_state(recorded, name, data, words):
    ex, rec = recorded
    ex.state.pin()
    drive, result, pinned = ex.state.drive, ex.state.result, ex.state.pinned
    table, revs = ex.table.value, [p.rev for p in ex.plots]
    rec.clear()
    _upload(ex, name, data)
    assert words in ex.state.error
    assert "Not applied" in ex.message.value
    assert ex.state.drive is drive and ex.state.result is result and ex.state.pinned is pinned
    assert ex.table.value == table and [p.rev for p in ex.plots] == revs
    assert rec.custom() == []


def test_import_of_another_drive_rebuilds_the_explorer(recorded):
    ex, rec = recorded
    snap = demo_with(lambda s: (s["shafts"][2].pop("pulleys"), s["outputs"][0].update(element="coupling"),
                                s["shafts"][2].update(couplings=[{"id": "coupling", "at": "200 mm"}])))
    ex.state.pin()
    _upload(ex, "other.json", json.dumps(snap).encode())
    assert ex.state.error == ""
    assert ex.state.pinned is None                               # nothing comparable any more
    assert "shafts[2].couplings[0].at" in ex.panel.controls
    assert "shafts[2].pulleys[0].at" not in ex.panel.controls
    kinds = {c["kind"] for c in rec.custom()}
    assert "figure" in kinds                                     # another structure: whole figures


def test_import_with_other_shaft_names_keeps_every_view_valid(recorded):
    ex, rec = recorded
    snap = demo_with(lambda s: (s["shafts"][2].update(id="head"), s["outputs"][0].update(shaft="head")))
    assert ex.diagrams.shaft.value == "output"
    _upload(ex, "<img src=x onerror=alert(1)>.json", json.dumps(snap).encode())
    assert ex.state.error == ""
    assert ex.diagrams.shaft.value in ("input", "intermediate", "head")
    assert "head" in ex.diagrams.shaft.options and "output" not in ex.diagrams.shaft.options
    assert "shaft head" in ex.table.value or ">head<" in ex.table.value
    assert "<img" not in ex.snapshot.status.value and "&lt;img" in ex.snapshot.status.value


def test_pin_shows_each_change_beside_its_load(recorded):
    ex, _ = recorded
    ex.snapshot.pin_button.click()
    assert ex.state.pinned is ex.state.result and not ex.snapshot.unpin_button.disabled
    ex.panel.set_value("input.power", 7.5)
    before = tables(solve_snapshot(demo_with(lambda s: None)))["reactions"]
    after = tables(solve_snapshot(demo_with(lambda s: s["input"].update(power="7.5 kW"))))["reactions"]
    change = after["radial [N]"] - before["radial [N]"]
    # every reaction's radial load is shown with its change (4 significant digits, as printed)
    for d in change:
        assert f"<span class='d'>+{float(f'{d:.4g}'):g}" in ex.table.value or f"+{d:.0f}<" in ex.table.value
    bars = ex.reactions.view.spec["data"]
    assert [t["name"] for t in bars][:2] == ["now · radial", "now · axial (along the shaft axis)"]
    assert any(t["name"].startswith("pinned") for t in bars)
    ex.snapshot.unpin_button.click()
    assert ex.state.pinned is None and "class='d'" not in ex.table.value

"""Fast smoke test of each dashboard notebook without a browser: nbclient
runs it in a fresh kernel (as Voila would), then one extra cell reads the
explorer it displayed."""

from __future__ import annotations

import json
from pathlib import Path

import nbformat
import pytest
from dashboard_harness import DASHBOARDS, test_environment
from nbclient import NotebookClient

from loadscope import spec
from loadscope.serving import SNAPSHOT_ENV

ROOT = Path(__file__).resolve().parents[2] / "dashboards"
EXPLORER = {"drive": "DriveExplorer", "gear_pair": "MeshExplorer", "shaft": "ShaftExplorer"}


def test_every_dashboard_is_listed():
    assert sorted(p.stem for p in ROOT.glob("*.ipynb")) == sorted(DASHBOARDS)


def _run(name, tmp_path, monkeypatch, snapshot=None):
    """Run a dashboard notebook plus one probe cell; returns (explorer output, probe)."""
    for key, value in test_environment(tmp_path).items():
        monkeypatch.setenv(key, value)
    if snapshot:
        monkeypatch.setenv(SNAPSHOT_ENV, str(snapshot))
    nb = nbformat.read(ROOT / f"{name}.ipynb", as_version=4)
    # the dashboards only import and arrange: one code cell, no outputs kept
    code = [c for c in nb.cells if c.cell_type == "code"]
    assert len(code) == 1 and not code[0].outputs
    nb.cells.append(nbformat.v4.new_code_cell(
        "import json\nprint(json.dumps({'cls': type(_).__name__, 'name': _.state.drive.name,"
        " 'shafts': [s.id for s in _.state.drive.shafts]}))"))
    NotebookClient(nb, timeout=120, kernel_name="python3", resources={"metadata": {"path": str(ROOT)}}).execute()
    return code[0].outputs, json.loads(nb.cells[-1].outputs[0].text)


@pytest.mark.parametrize("name", DASHBOARDS)
def test_notebook_runs_and_shows_its_explorer(name, tmp_path, monkeypatch):
    shown, probe = _run(name, tmp_path, monkeypatch)
    assert [o.output_type for o in shown] == ["execute_result"]
    assert "application/vnd.jupyter.widget-view+json" in shown[0].data
    assert probe["cls"] == EXPLORER[name]
    assert probe["shafts"] == ["input", "intermediate", "output"]       # the demo drive
    assert probe["name"] == spec.demo_snapshot()["name"]


def test_notebook_opens_the_snapshot_named_by_serve(tmp_path, monkeypatch):
    snap = spec.demo_snapshot()
    snap["name"] = "K-2 test drive"
    file = tmp_path / "k2.json"
    file.write_text(json.dumps(snap))
    _, probe = _run("drive", tmp_path, monkeypatch, snapshot=file)
    assert probe["name"] == "K-2 test drive"

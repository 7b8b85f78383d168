"""The command line end to end: demo -> snapshot -> solve, formats, units,
and bad input (one message, exit status 2, never a traceback)."""

from __future__ import annotations

import csv
import io
import json
import math
import subprocess
import sys

import pytest

from loadscope.cli import main


def run(*args: str, stdin: str | None = None) -> subprocess.CompletedProcess:
    return subprocess.run([sys.executable, "-m", "loadscope", *args], capture_output=True, text=True, input=stdin,
                          timeout=120)


@pytest.fixture(scope="module")
def demo_file(tmp_path_factory):
    path = tmp_path_factory.mktemp("cli") / "d.json"
    assert main(["demo", "--write", str(path)]) == 0
    return path


def test_demo_write_then_solve_json_has_every_load(demo_file, capsys):
    assert main(["solve", str(demo_file), "--format", "json"]) == 0
    doc = json.loads(capsys.readouterr().out)
    from loadscope.spec import load_snapshot

    drive = load_snapshot(demo_file)
    assert [s["id"] for s in doc["shafts"]] == [s.id for s in drive.shafts]
    for s, sh in zip(doc["shafts"], drive.shafts):
        assert [r["support"] for r in s["reactions"]] == [sp.id for sp in sh.supports]
        for r in s["reactions"]:
            assert len(r["force"]) == 3 and all(math.isfinite(c) for c in r["force"])
        assert math.isfinite(s["speed"]) and math.isfinite(s["torque"])
    assert len(doc["meshes"]) == len(drive.meshes)
    assert all(len(m["teeth"]) == 2 for m in doc["meshes"])
    assert len(doc["housing"]["bolts"]) == len(drive.housing.bolts)
    assert doc["max_residual"] < 1e-9
    assert all(v["force_rel"] < 1e-9 and v["moment_rel"] < 1e-9 for v in doc["residuals"].values())
    assert "qualified engineer" in doc["caution"]


def test_us_units_scale_forces_by_the_pound_force(demo_file, capsys):
    # 1 lbf = 4.4482216152605 N exactly (NIST SP 811, Appendix B.8).
    main(["solve", str(demo_file), "--format", "json"])
    si = json.loads(capsys.readouterr().out)
    main(["solve", str(demo_file), "--format", "json", "--units", "us"])
    us = json.loads(capsys.readouterr().out)
    assert us["units"]["force"] == "lbf"
    a = si["shafts"][0]["reactions"][0]["force"]
    b = us["shafts"][0]["reactions"][0]["force"]
    for x, y in zip(a, b):
        assert math.isclose(x, y * 4.4482216152605, rel_tol=1e-12, abs_tol=1e-9)


def test_csv_and_table_formats(demo_file, capsys, tmp_path):
    out = tmp_path / "loads.csv"
    assert main(["solve", str(demo_file), "--format", "csv", "--out", str(out)]) == 0
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    assert {r["group"] for r in rows} >= {"shaft", "reaction", "tooth", "bolt", "residual"}
    assert all(r["unit"] for r in rows)
    assert main(["solve", str(demo_file)]) == 0
    text = capsys.readouterr().out
    assert "Bearing reactions" in text and "CAUTION" in text


def test_schema_is_json(capsys):
    assert main(["schema"]) == 0
    schema = json.loads(capsys.readouterr().out)
    assert schema.get("type") == "object"


@pytest.mark.parametrize("mutate, path_part", [
    (lambda d: d["shafts"][0]["gears"][0].__setitem__("pressure_angle", "40 deg"), "pressure_angle"),
    (lambda d: d["shafts"][0]["gears"][0].__setitem__("pressure_angle", "20 mm"), "pressure_angle"),
    (lambda d: d["shafts"][0]["sections"][0].__setitem__("diameter", "-5 mm"), "diameter"),
])
def test_bad_input_is_one_clear_line(demo_file, tmp_path, mutate, path_part):
    doc = json.loads(demo_file.read_text())
    mutate(doc)
    bad = tmp_path / "bad.json"
    bad.write_text(json.dumps(doc))
    proc = run("solve", str(bad))
    assert proc.returncode == 2
    assert "Traceback" not in proc.stderr
    assert proc.stderr.startswith("loadscope: input error: ")
    assert path_part in proc.stderr and "accepted" in proc.stderr
    assert proc.stdout == ""


def test_missing_file_and_broken_json(tmp_path):
    proc = run("solve", str(tmp_path / "nope.json"))
    assert proc.returncode == 2 and "no such file" in proc.stderr and "Traceback" not in proc.stderr
    broken = tmp_path / "broken.json"
    broken.write_text("{ not json")
    proc = run("solve", str(broken))
    assert proc.returncode == 2 and "Traceback" not in proc.stderr


def test_mechanism_is_reported_in_words(demo_file, tmp_path):
    doc = json.loads(demo_file.read_text())
    doc["shafts"][0]["supports"] = doc["shafts"][0]["supports"][:1]
    bad = tmp_path / "one_support.json"
    bad.write_text(json.dumps(doc))
    proc = run("solve", str(bad))
    assert proc.returncode == 2 and "mechanism" in proc.stderr and "Traceback" not in proc.stderr


def test_solve_prints_the_margins_of_every_part_per_case(demo_file, capsys):
    from loadscope.spec import load_snapshot

    drive = load_snapshot(demo_file)
    assert main(["solve", str(demo_file)]) == 0
    text = capsys.readouterr().out
    margins = text[text.index("Margins"):]
    for case in ("rated", "part load", "jam"):
        assert f"Load case '{case}'" in margins
    duty = margins[margins.index("Duty cycle"):]
    for s in drive.shafts:
        for p in s.supports:
            assert f"{s.id}/{p.id} " in duty
        for f in s.features:
            assert f"{s.id} at {f.id} " in duty
    for b in drive.housing.bolts:
        assert f"bolt {b.id} " in duty
    assert "Palmgren-Miner" in duty and duty.rstrip().endswith("licensed practice govern.")


def test_json_and_csv_carry_the_margins(demo_file, capsys, tmp_path):
    assert main(["solve", str(demo_file), "--format", "json", "--units", "us"]) == 0
    doc = json.loads(capsys.readouterr().out)
    r = doc["ratings"]
    assert "qualified engineer" in r["caution"]
    assert [c["name"] for c in r["cases"]] == ["rated", "part load", "jam"]
    assert all(m["method"] and m["status"] in ("pass", "watch", "fail") for c in r["cases"] for m in c["margins"])
    # every load exists per case: the jam case (7.5 kW) loads the input shaft 7.5 / 5.5 times the rated one
    rated, jam = (c["loads"]["shafts"][0]["torque"] for c in r["cases"][::2])
    assert jam / rated == pytest.approx(7.5 / 5.5, rel=1e-12)
    out = tmp_path / "m.csv"
    assert main(["solve", str(demo_file), "--format", "csv", "--out", str(out)]) == 0
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    margins = [x for x in rows if x["group"] == "margin"]
    assert {x["case"] for x in margins} == {"rated", "part load", "jam", "duty cycle"}
    assert all(x["status"] and x["method"] and x["allowable"] for x in margins)
    assert any(x["group"] == "reaction" for x in rows)
    assert rows[-1]["group"] == "caution" and "qualified engineer" in rows[-1]["method"]


def test_bad_rating_data_is_one_clear_line(demo_file, tmp_path):
    doc = json.loads(demo_file.read_text())
    doc["shafts"][2]["features"][0]["Kt"] = 0.8
    bad = tmp_path / "kt.json"
    bad.write_text(json.dumps(doc))
    proc = run("solve", str(bad))
    assert proc.returncode == 2 and "Traceback" not in proc.stderr
    assert proc.stderr.startswith("loadscope: input error: shafts[2].features[0].Kt: a stress-concentration factor "
                                  "below 1 is not possible, got 0.8 (accepted: 1 to 10)")

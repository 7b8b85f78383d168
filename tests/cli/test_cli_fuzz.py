"""The command line under mutated snapshots (hypothesis).

The demo snapshot is mutated at random (a field deleted or replaced by a
wrong type, a negative, zero, NaN-like or huge value, a wrong unit; unknown
keys; deep nesting) and as bytes (truncated, spliced, not UTF-8, empty), and
``loadscope.cli.main`` runs in-process. Whatever the input:

* the exit status is 0 or 2;
* on 2, standard error is one line, ``loadscope: input error: ...``, naming
  the field path (or, for a file that is not a snapshot at all, the file),
  never a traceback;
* on 0, no NaN anywhere and no infinity as a load: ``inf`` appears only in
  the JSON and CSV margins, where it marks an unloaded part (a factor or life
  of an unloaded part, its margin); the text table says ``unloaded``.

Examples are kept few (every valid one solves and rates three load cases);
the deterministic cases below pin the inputs that once escaped as
tracebacks or NaN.
"""

from __future__ import annotations

import contextlib
import copy
import csv
import io
import json
import re
import tempfile
from pathlib import Path

import pytest
from hypothesis import HealthCheck, event, given, settings
from hypothesis import strategies as st

from loadscope import spec
from loadscope.cli import main

DEMO = spec.demo_snapshot()
CANONICAL = spec.dump_snapshot(spec.demo_snapshot()).encode("utf-8")
_TMP = tempfile.TemporaryDirectory(prefix="loadscope-fuzz-")     # removed when the session ends
WORKDIR = Path(_TMP.name)


def _paths(node, prefix=()):
    """Every key path of the snapshot tree (down to 12 levels: a nested mutation may go far deeper)."""
    items = node.items() if isinstance(node, dict) else enumerate(node) if isinstance(node, list) else ()
    if len(prefix) >= 12:
        return []
    out = []
    for k, v in items:
        out.append((*prefix, k))
        out += _paths(v, (*prefix, k))
    return out


def _get(doc, path):
    for k in path:
        doc = doc[k]
    return doc


BAD = [None, True, False, 0, -1, 0.0, -0.5, 1e308, -1e308, 10**30, 10**400, "", " ", "0", "abc",
       "-5 mm", "0 mm", "0 N", "0 kN", "-3 kW", "0 rpm", "-0 h", "nan", "nan mm", "NaN N", "inf", "inf N", "-inf rpm",
       "1e300 kN", "1e300 mm", "1e-300 mm", "1e-300 rpm", "1e-300 Pa", "1e13 m", "3 kg", "20 deg", "40 mm", "2.2 kW",
       "1460 rpm", "206 GPa", "20000 h", "60 degC", "-300 degC", "12 furlongs", "5 mm mm", "1/0 in", "3/4 in",
       "2 ** 2000 mm", "x" * 500, "\u00e9\u2603\u0000", [], {}, [[[]]], {"a": {"b": {}}}, ["1 mm", "2 mm"],
       0.5, 1.5, 2, 1e-12, "back_to_back", "deep_groove", "8.8", "p1", "C"]


NAME_KEYS = {"id", "name", "shaft", "element"}
NAMES = [v for v in BAD if not (isinstance(v, str) and re.search(r"(?i)\b(nan|inf)", v))]


def _deep(depth: int):
    v: object = "1 mm"
    for _ in range(depth):
        v = [v]
    return v


@st.composite
def mutated_document(draw) -> bytes:
    doc = copy.deepcopy(DEMO)
    for _ in range(draw(st.integers(1, 3))):
        live = _paths(doc)
        if not live:
            break
        action = draw(st.sampled_from(["set", "set", "set", "delete", "unknown", "nest", "duplicate"]))
        if action == "unknown":
            parent = _get(doc, draw(st.sampled_from([p for p in [(), *live] if isinstance(_get(doc, p), dict)])))
            parent[draw(st.sampled_from(["zzz", "Id", "speed ", "bearing", "cases", "x"]))] = draw(st.sampled_from(BAD))
            continue
        path = draw(st.sampled_from(live))
        parent, key = _get(doc, path[:-1]), path[-1]
        if action == "set":
            # A name may be any text, "nan" included; the output checks look for NaN among the numbers,
            # so names and references to them take no NaN- or inf-like text.
            named = key in NAME_KEYS or (isinstance(parent[key], str) and path[-2:-1] in (("gears",), ("supports",)))
            parent[key] = copy.deepcopy(draw(st.sampled_from(NAMES if named else BAD)))
        elif action == "delete":
            del parent[key]
        elif action == "nest":
            parent[key] = _deep(draw(st.sampled_from([3, 50, 5000])))
        elif isinstance(parent, list):
            parent.append(copy.deepcopy(parent[key]))
    try:
        return json.dumps(doc).encode("utf-8")
    except (RecursionError, ValueError):          # json cannot even write it: hand over the bytes as they come
        return b"[" * 5000


@st.composite
def mutated_bytes(draw) -> bytes:
    data = CANONICAL
    kind = draw(st.sampled_from(["truncate", "splice", "latin1", "empty", "garbage"]))
    if kind == "truncate":
        return data[: draw(st.integers(0, len(data) - 1))]
    if kind == "splice":
        i = draw(st.integers(0, len(data)))
        j = draw(st.integers(i, min(len(data), i + 40)))
        return data[:i] + draw(st.binary(max_size=24)) + data[j:]
    if kind == "latin1":
        return data.replace(b'"SR-17', '"SR-17 \u00e9'.encode("latin-1"), 1)
    if kind == "empty":
        return b""
    return draw(st.binary(max_size=64))


def run(data: bytes, fmt: str = "table", units: str = "si") -> tuple[int, str, str]:
    path = WORKDIR / "drive.json"
    path.write_bytes(data)
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        status = main(["solve", str(path), "--format", fmt, "--units", units])
    return status, out.getvalue(), err.getvalue()


# A field path at the start of the message: shafts[1].supports[0].bearing.C, cases[0], version, FILE ...
# (a misspelt key is named as written, spaces and all)
_SEG = r"[^.\[\]:,(){}\"']+"
FIELD = re.compile(rf"^{_SEG}(\[\d+\])*(\.{_SEG}(\[\d+\])*)*: ")
WHOLE_DOCUMENT = ("a snapshot must be a JSON object", "NaN is not valid JSON", "Infinity is not valid JSON")
OUT_OF_RANGE = "the solve ran out of the range of numbers"
_NAN = re.compile(r"(?i)\bnan\b")
_INF = re.compile(r"(?i)\binf(inity)?\b")
_UNLOADED_DETAILS = re.compile(r"factor$|^L(10|nm)h?$")


def check_error(status: int, out: str, err: str, path: Path) -> None:
    assert status == 2, (status, err)
    assert "Traceback" not in err and "Traceback" not in out
    line = err.rstrip("\n")
    assert line and "\n" not in line, err
    assert line.startswith("loadscope: input error: "), line
    msg = line.removeprefix("loadscope: input error: ")
    named = (FIELD.match(msg) or msg.startswith(str(path)) or msg.startswith(WHOLE_DOCUMENT)
             or msg.startswith(OUT_OF_RANGE))
    assert named, msg


def _check_json(doc) -> None:
    for key in ("shafts", "meshes", "housing", "residuals"):
        assert not _INF.search(json.dumps(doc.get(key))), key
    for case in doc["ratings"]["cases"]:
        assert not _INF.search(json.dumps(case.get("loads"))) and not _INF.search(json.dumps(case["speed"]))
    rows = [r for c in doc["ratings"]["cases"] for r in c["margins"]] + doc["ratings"]["duty_cycle"]["margins"]
    for r in rows:
        if r["value"] == "inf":
            assert r["margin"] == "inf", r
        assert r["allowable"] != "inf", r
        for k, v in r["details_si"].items():
            if v == "inf":
                assert _UNLOADED_DETAILS.search(k), (k, r)


def check_success(out: str, fmt: str) -> None:
    assert out.strip()
    assert not _NAN.search(out)
    if fmt == "json":
        _check_json(json.loads(out, parse_constant=lambda c: pytest.fail(f"{c} in the JSON")))
    elif fmt == "csv":
        for row in csv.DictReader(io.StringIO(out)):
            for col, v in row.items():
                if v is not None and _INF.search(v) and col != "method":
                    assert row["group"] == "margin" and col in ("value", "margin"), row
                    assert row["margin"] == "inf", row
    else:
        assert not _INF.search(out)


def _outcome(data: bytes, fmt: str, units: str) -> None:
    status, out, err = run(data, fmt, units)
    event(f"exit status {status}")
    if status == 0:
        check_success(out, fmt)
    else:
        check_error(status, out, err, WORKDIR / "drive.json")


# Few examples under the repeatable profile of `make test` (each valid one solves and rates the drive);
# `pytest --hypothesis-profile=explore` searches wider.
_WIDE = not settings.default.derandomize
FAST = settings(max_examples=1000 if _WIDE else 25, deadline=None, suppress_health_check=[HealthCheck.too_slow],
                database=None)


@FAST
@given(data=mutated_document(), fmt=st.sampled_from(["table", "json", "csv"]), units=st.sampled_from(["si", "us"]))
def test_mutated_snapshot_never_escapes(data, fmt, units):
    _outcome(data, fmt, units)


@settings(FAST, max_examples=1000 if _WIDE else 20)
@given(data=mutated_bytes())
def test_mutated_bytes_never_escape(data):
    _outcome(data, "table", "si")


def _edit(**where) -> bytes:
    doc = copy.deepcopy(DEMO)
    for dotted, value in where.items():
        *head, last = [int(k) if k.isdigit() else k for k in dotted.split("__")]
        _get(doc, head)[last] = value
    return json.dumps(doc).encode("utf-8")


@pytest.mark.parametrize(("data", "expect"), [
    (b"", "is not valid JSON"),
    (b"\xff\xfe{\x00", "is not UTF-8 text"),
    (b"[" * 100_000 + b"]" * 100_000, "nests lists or objects too deeply"),
    (CANONICAL.replace(b'"teeth": 21', b'"teeth": ' + b"9" * 5000, 1), "is not a readable snapshot"),
    (_edit(shafts__0__sections__0__diameter="1e300 mm"), "shafts[0].sections[0].diameter: is beyond the scale"),
    (_edit(housing__bolts__0__position=["1e300 mm", "0 mm", "0 mm"]), "housing.bolts[0].position[0]: is beyond"),
    (_edit(cases__0__power="1e300 kW"), "cases[0].power: is beyond the scale of any drive"),
    # tiny moduli, speeds and sizes overflowed the solve and were reported without the field's name before
    (_edit(shafts__0__E="1e-300 Pa"), "shafts[0].E: is below the scale of any real drive, got 1e-300 Pa "
                                      "(accepted: >= 1e+06 Pa)"),
    (_edit(shafts__1__G="1e-300 GPa"), "shafts[1].G: is below the scale of any real drive"),
    (_edit(input__speed="1e-300 rpm"), "input.speed: is below the scale of any real drive, got 1.0472e-301 rad/s "
                                       "(accepted: a magnitude >= 1e-06 rad/s, either sense)"),
    (_edit(cases__0__speed="-1e-300 rpm"), "cases[0].speed: is below the scale of any real drive"),
    (_edit(shafts__0__sections__1__diameter="1e-300 mm"), "shafts[0].sections[1].diameter: is below the scale of "
                                                          "any real drive, got 1e-303 m (accepted: >= 1e-06 m)"),
    (_edit(shafts__2__pulleys__0__pitch_diameter="1e-300 mm"), "shafts[2].pulleys[0].pitch_diameter: is below"),
])
def test_inputs_that_once_escaped_end_in_one_line(data, expect):
    status, out, err = run(data)
    check_error(status, out, err, WORKDIR / "drive.json")
    assert expect in err


def test_a_drive_with_no_load_reads_unloaded_not_inf():
    """Nearly no power: every section is unloaded, every life endless; the
    table says so in words, the JSON marks it with "inf" margins only."""
    data = _edit(cases__0__power="1e-300 kW")
    status, out, err = run(data)
    assert status == 0, err
    check_success(out, "table")
    assert "unloaded" in out and "no load" in out
    status, out, _ = run(data, "json")
    assert status == 0
    check_success(out, "json")


@pytest.mark.parametrize("data", [b"\xff\xfe{", b"", b"   \n", WORKDIR.as_posix().encode() + b"/drive.json\n"])
def test_standard_input_is_read_as_text_never_as_a_file_name(data, monkeypatch):
    """'-' reads the snapshot from standard input: bytes that are not UTF-8,
    nothing, or a text that is not JSON (even a file's name) are input
    errors, never a file to open (exit status 1) or a traceback."""
    (WORKDIR / "drive.json").write_bytes(CANONICAL)
    monkeypatch.setattr("sys.stdin", io.TextIOWrapper(io.BytesIO(data)))
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        status = main(["solve", "-"])
    check_error(status, out.getvalue(), err.getvalue(), WORKDIR / "drive.json")
    assert err.getvalue().startswith("loadscope: input error: FILE: standard input")


def test_standard_input_with_a_snapshot_solves(monkeypatch):
    monkeypatch.setattr("sys.stdin", io.TextIOWrapper(io.BytesIO(b"\xef\xbb\xbf" + CANONICAL)))   # with a BOM
    out = io.StringIO()
    with contextlib.redirect_stdout(out):
        assert main(["solve", "-", "--format", "csv"]) == 0
    check_success(out.getvalue(), "csv")

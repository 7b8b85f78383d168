"""The snapshot format: exact round trips, loading from every source, the
schema file, and field paths on the kernel objects.

Oracle for the round trip: identity. ``drive_from_snapshot(snapshot_from_drive(d))``
must equal ``d`` (dataclass equality, floats bit for bit) for random valid
drives over the whole float range of every field, and the canonical text
must be a fixed point of load-then-dump.
"""

from __future__ import annotations

import json
import math
import struct
from dataclasses import fields, is_dataclass

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from loadscope.errors import InputError
from loadscope.kernel.model import (
    AXIAL_MODES,
    Bolt,
    Coupling,
    Drive,
    Gear,
    Housing,
    Mesh,
    PointLoad,
    Port,
    Pulley,
    Section,
    Shaft,
    Support,
)
from loadscope.spec import (
    SCHEMA_ID,
    demo_snapshot,
    drive_from_snapshot,
    dump_snapshot,
    load_snapshot,
    snapshot_from_drive,
    snapshot_schema,
)
from loadscope.spec.snapshot import SCHEMA_FILE, schema_text

DEG = math.pi / 180.0

# --- strategies: any drive the format can hold (valid kernel objects, ids that resolve) -----------------------


def floats(lo: float, hi: float, **kw) -> st.SearchStrategy[float]:
    """Floats over the whole range, plus short decimals (the mm/deg path)."""
    short = st.floats(lo, hi, **kw).map(lambda v: round(v, 3)).filter(
        lambda v: (lo < v if kw.get("exclude_min") else lo <= v) and v <= hi)
    return st.floats(lo, hi, allow_nan=False, allow_infinity=False, **kw) | short


def vec(lo: float = -10.0, hi: float = 10.0) -> st.SearchStrategy[tuple[float, float, float]]:
    return st.tuples(floats(lo, hi), floats(lo, hi), floats(lo, hi))


directions = st.sampled_from([(1.0, 0.0, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, -1.0), (1.0, 1.0, 0.0)]) | st.tuples(
    st.floats(0.1, 1.0), st.floats(-1.0, 1.0), st.floats(-1.0, 1.0))
ident = st.text(st.characters(blacklist_categories=("Cs",)), min_size=1, max_size=6)
weights = floats(0.0, 1e4)


@st.composite
def sections(draw) -> Section:
    d = draw(floats(1e-4, 1.0))
    bore = draw(st.sampled_from([0.0, None]))
    if bore is None:
        bore = draw(st.floats(0.0, d, exclude_max=True))
    return Section(draw(floats(1e-4, 2.0)), d, bore)


@st.composite
def gears(draw, gid: str, at: st.SearchStrategy[float]) -> Gear:
    kind = draw(st.sampled_from(["spur", "helical", "bevel"]))
    helix, hand, cone = 0.0, draw(st.sampled_from([None, "right", "left"])), None
    if kind == "helical":
        helix = draw(st.floats(0.0, 45 * DEG, exclude_min=True))
        hand = draw(st.sampled_from(["right", "left"]))
    if kind == "bevel":
        cone = draw(st.none() | st.floats(1 * DEG, 89 * DEG))
    return Gear(gid, draw(at), draw(floats(1e-4, 2.0)), kind, draw(st.none() | st.integers(3, 400)),
                draw(st.floats(10 * DEG, 35 * DEG)), helix, hand, kind != "bevel" and draw(st.booleans()), cone,
                draw(weights))


@st.composite
def drives(draw) -> Drive:
    names = iter(draw(st.lists(ident, min_size=80, max_size=80, unique=True)))
    shafts, gear_ids, ports = [], [], []
    for k in range(draw(st.integers(1, 3))):
        secs = tuple(draw(st.lists(sections(), min_size=1, max_size=3)))
        length = float(sum(s.length for s in secs))
        at = st.floats(0.0, length)
        supports = tuple(Support(next(names), draw(at), draw(st.sampled_from(AXIAL_MODES)))
                         for _ in range(draw(st.integers(0, 3))))
        gs = tuple(draw(gears(next(names), at)) for _ in range(draw(st.integers(0, 2))))
        pulleys = tuple(Pulley(next(names), draw(at), draw(floats(1e-4, 2.0)),
                               (draw(floats(-10, 10)), draw(floats(-10, 10))), draw(st.sampled_from([1, -1])),
                               draw(st.just(math.inf) | st.floats(1.0, 1e6, exclude_min=True)), draw(weights))
                        for _ in range(draw(st.integers(0, 1))))
        couplings = tuple(Coupling(next(names), draw(at), draw(weights))
                          for _ in range(draw(st.integers(1 if k == 0 else 0, 2))))
        loads = tuple(PointLoad(next(names), draw(at), draw(vec(-1e6, 1e6)), draw(vec(-1e6, 1e6)), draw(vec()))
                      for _ in range(draw(st.integers(0, 1))))
        sid = next(names)
        shafts.append(Shaft(sid, secs, supports, draw(vec()), draw(directions), gs, pulleys, couplings, loads,
                            draw(floats(1e6, 1e12)), draw(floats(1e6, 1e12))))
        gear_ids += [g.id for g in gs]
        ports += [(sid, e.id) for e in (*couplings, *pulleys)]
    meshes = []
    if len(gear_ids) >= 2:
        for _ in range(draw(st.integers(0, 2))):
            pair = draw(st.lists(st.sampled_from(gear_ids), min_size=2, max_size=2, unique=True))
            meshes.append(Mesh(next(names), (pair[0], pair[1]), draw(st.floats(0.5, 1.0))))
    n_out = draw(st.integers(1, 3))
    chosen = [draw(st.sampled_from(ports)) for _ in range(n_out + 1)]
    given = draw(st.integers(0, n_out))
    port_list = []
    for j, (sid, eid) in enumerate(chosen):
        power = torque = None
        if j == given:
            if draw(st.booleans()):
                power = draw(floats(1e-3, 1e7, exclude_min=True))
            else:
                torque = draw(floats(1e-3, 1e7, exclude_min=True))
        port_list.append(Port(sid, eid, power, torque, draw(floats(1e-3, 10.0, exclude_min=True))))
    housing = None
    if draw(st.booleans()):
        method = draw(st.sampled_from(["elastic", "tipping"]))
        point = draw(vec()) if method == "tipping" else draw(st.none() | vec())
        direction = draw(directions) if method == "tipping" else draw(st.none() | directions)
        bolts = tuple(Bolt(next(names), draw(vec())) for _ in range(draw(st.integers(1, 4))))
        housing = Housing(bolts, draw(vec()), draw(directions), draw(weights), draw(vec()), method, point,
                          direction)
    speed = draw(floats(1e-3, 1e4)) * draw(st.sampled_from([1.0, -1.0]))
    return Drive(tuple(shafts), tuple(meshes), port_list[0], tuple(port_list[1:]), speed, housing,
                 draw(st.text(max_size=12)))


def bits(x: float) -> int:
    return struct.unpack("<q", struct.pack("<d", x))[0]


def assert_bit_identical(a, b, where="drive"):
    """Dataclass equality, and the same bits in every float (so -0.0 != 0.0)."""
    assert type(a) is type(b), where
    if is_dataclass(a):
        for f in fields(a):
            if f.compare:
                assert_bit_identical(getattr(a, f.name), getattr(b, f.name), f"{where}.{f.name}")
    elif isinstance(a, tuple):
        assert len(a) == len(b), where
        for i, (x, y) in enumerate(zip(a, b)):
            assert_bit_identical(x, y, f"{where}[{i}]")
    elif isinstance(a, float):
        assert bits(a) == bits(b), f"{where}: {a!r} != {b!r}"
    else:
        assert a == b, where


# --- round trips --------------------------------------------------------------------------------------------------

@settings(max_examples=80, deadline=None, suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(drives())
def test_drive_snapshot_drive_is_exact(drive):
    data = snapshot_from_drive(drive)
    back = drive_from_snapshot(json.loads(json.dumps(data)))
    assert back == drive
    assert_bit_identical(back, drive)
    text = dump_snapshot(drive)
    assert dump_snapshot(load_snapshot(text)) == text
    assert dump_snapshot(drive, indent=None) == json.dumps(json.loads(text), ensure_ascii=False)


def test_demo_round_trip_is_exact():
    drive = drive_from_snapshot(demo_snapshot())
    text = dump_snapshot(demo_snapshot())
    again = load_snapshot(text)
    assert again == drive
    assert_bit_identical(again, drive)
    assert dump_snapshot(again) == text
    assert dump_snapshot(json.loads(text)) == text


def test_canonical_text_is_readable_for_the_demo():
    text = dump_snapshot(demo_snapshot())
    assert '"pressure_angle": "20 deg"' in text
    assert '"speed": "1460 rpm"' in text
    assert '"power": "5.5 kW"' in text
    assert '"origin": ["60 mm", "180 mm", "117 mm"]' in text
    assert '"tension_ratio": "inf"' in text
    assert max(len(line) for line in text.splitlines()) <= 100


def test_user_units_give_the_same_drive_as_si():
    us = demo_snapshot()
    si = demo_snapshot()
    us["shafts"][0]["sections"][0]["length"] = "50 mm"
    si["shafts"][0]["sections"][0]["length"] = "0.05 m"
    us["input"]["speed"] = "1460 rpm"
    si["input"]["speed"] = f"{1460 * math.pi / 30!r} rad/s"
    a, b = drive_from_snapshot(us), drive_from_snapshot(si)
    assert a.shafts[0].sections[0].length == b.shafts[0].sections[0].length == 0.05
    assert a.speed == pytest.approx(b.speed, rel=1e-15)


def test_mass_and_pitch_diameter_are_read_and_written_as_weight_and_radius():
    data = demo_snapshot()
    drive = drive_from_snapshot(data)
    sprocket = drive.shafts[2].pulleys[0]
    assert sprocket.pitch_radius == pytest.approx(0.138_23 / 2, rel=1e-15)
    assert sprocket.weight == pytest.approx(2.9 * 9.80665, rel=1e-15)
    assert drive.housing.weight == pytest.approx(68 * 9.80665, rel=1e-15)
    out = snapshot_from_drive(drive)
    written = out["shafts"][2]["pulleys"][0]
    assert "pitch_diameter" not in written and "mass" not in written
    assert "weight" in written and "pitch_radius" in written


def test_defaults_are_the_kernel_defaults():
    data = demo_snapshot()
    gear = data["shafts"][0]["gears"][0]
    del gear["pressure_angle"]
    drive = drive_from_snapshot(data)
    assert drive.shafts[0].gears[0].pressure_angle == Gear("g", 0.0, 0.1).pressure_angle
    shaft = drive.shafts[0]
    ref = Shaft("s", (Section(1.0, 0.1),), ())
    assert (shaft.E, shaft.G, shaft.axis) == (ref.E, ref.G, ref.axis)
    assert drive.shafts[0].sections[0].bore == 0.0
    assert drive.meshes[0].efficiency == 0.98
    assert drive.outputs[0].share == 1.0 and drive.outputs[0].power is None


# --- paths ---------------------------------------------------------------------------------------------------------

def test_kernel_objects_carry_their_field_paths():
    drive = drive_from_snapshot(demo_snapshot())
    assert drive.shafts[1].path == "shafts[1]"
    assert drive.shafts[1].gears[0].path == "shafts[1].gears[0]"
    assert drive.shafts[0].sections[3].path == "shafts[0].sections[3]"
    assert drive.shafts[0].supports[1].path == "shafts[0].supports[1]"
    assert drive.shafts[2].pulleys[0].path == "shafts[2].pulleys[0]"
    assert drive.shafts[0].couplings[0].path == "shafts[0].couplings[0]"
    assert drive.meshes[1].path == "meshes[1]"
    assert drive.input.path == "input"
    assert drive.outputs[0].path == "outputs[0]"
    assert drive.housing.path == "housing"
    assert drive.housing.bolts[2].path == "housing.bolts[2]"


# --- sources -------------------------------------------------------------------------------------------------------

def test_load_from_path_str_text_and_dict(tmp_path):
    text = dump_snapshot(demo_snapshot())
    file = tmp_path / "drive.json"
    file.write_text(text + "\n", encoding="utf-8")
    expected = drive_from_snapshot(demo_snapshot())
    assert load_snapshot(file) == expected
    assert load_snapshot(str(file)) == expected
    assert load_snapshot(text) == expected
    assert load_snapshot(json.loads(text)) == expected


def test_malformed_json_is_an_input_error(tmp_path):
    bad = tmp_path / "broken.json"
    bad.write_text('{"format": "loadscope.drive", "version": 1,,}', encoding="utf-8")
    with pytest.raises(InputError) as exc:
        load_snapshot(bad)
    assert "not valid JSON" in exc.value.problem and "line 1" in exc.value.problem
    assert str(bad) in exc.value.problem
    with pytest.raises(InputError, match="not valid JSON"):
        load_snapshot("{ not json")
    with pytest.raises(InputError, match="NaN is not valid JSON"):
        load_snapshot('{"format": "loadscope.drive", "version": 1, "x": NaN}')
    with pytest.raises(InputError, match="must be a JSON object"):
        load_snapshot("[1, 2]")
    latin = tmp_path / "latin.json"
    latin.write_bytes(b'{"name": "\xe9"}')
    with pytest.raises(InputError, match="not UTF-8"):
        load_snapshot(latin)


def test_missing_file_is_an_os_error(tmp_path):
    with pytest.raises(OSError):
        load_snapshot(tmp_path / "nope.json")


# --- schema --------------------------------------------------------------------------------------------------------

def test_schema_has_identity_and_covers_every_field():
    schema = snapshot_schema()
    assert schema["$id"] == SCHEMA_ID
    assert schema["$schema"].startswith("https://json-schema.org/")
    assert schema["type"] == "object" and schema["title"] and schema["description"]
    assert set(schema["required"]) == {"format", "version", "shafts", "input", "outputs"}
    assert schema["properties"]["format"]["const"] == "loadscope.drive"
    defs = schema["$defs"]
    assert defs["GearSpec"]["properties"]["pressure_angle"]["default"] == "20 deg"
    assert defs["GearSpec"]["properties"]["pressure_angle"]["x-dimension"] == "angle"
    assert defs["GearSpec"]["additionalProperties"] is False
    # every kernel field has a home in the format
    kernel = {Section: "SectionSpec", Support: "SupportSpec", Gear: "GearSpec", Pulley: "PulleySpec",
              Coupling: "CouplingSpec", PointLoad: "LoadSpec", Shaft: "ShaftSpec", Mesh: "MeshSpec",
              Bolt: "BoltSpec"}
    for cls, name in kernel.items():
        props = set(defs[name]["properties"])
        assert {f.name for f in fields(cls)} - {"path"} <= props, name
    assert {"speed", "power", "torque", "share", "shaft", "element"} <= set(defs["InputSpec"]["properties"])
    assert {"tipping_edge", "plane_point", "plane_normal", "weight", "center_of_mass", "bolt_method",
            "bolts"} <= set(defs["HousingSpec"]["properties"])
    assert snapshot_schema() is not snapshot_schema()


def test_schema_file_is_current():
    current = SCHEMA_FILE.read_text(encoding="utf-8")
    assert current == schema_text(), (
        "loadscope/spec/schema.json is stale: run "
        "`.venv/bin/python -c 'from loadscope.spec import write_schema_file; write_schema_file()'`")


def test_demo_validates_against_the_schema_when_jsonschema_is_installed():
    jsonschema = pytest.importorskip("jsonschema")
    schema = snapshot_schema()
    jsonschema.validate(demo_snapshot(), schema)
    jsonschema.validate(json.loads(dump_snapshot(demo_snapshot())), schema)


# --- the documented example ----------------------------------------------------------------------------------------

def test_docs_example_loads_solves_and_dumps_as_documented():
    import re
    from pathlib import Path

    from loadscope.kernel.solve import solve

    doc = (Path(__file__).resolve().parents[2] / "docs" / "snapshot.md").read_text(encoding="utf-8")
    example, canonical_head = re.findall(r"```json\n(.*?)```", doc, re.DOTALL)[:2]
    drive = load_snapshot(example)
    assert solve(drive).max_residual < 1e-9
    assert dump_snapshot(drive).startswith(canonical_head.rstrip())
    assert drive.shafts[1].sections[0].diameter == pytest.approx(0.0508, rel=1e-15)  # 2 in, NIST SP 811

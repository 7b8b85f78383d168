"""Bad snapshots: each gives one InputError naming the field path, saying what
is wrong, and giving the accepted range or form."""

from __future__ import annotations

import json

import pytest
from snapshot_edits import at, setter

from loadscope.errors import InputError
from loadscope.spec import demo_snapshot, drive_from_snapshot, load_snapshot

GEAR = ("shafts", 0, "gears", 0)          # the helical input pinion
SPUR = ("shafts", 1, "gears", 1)          # the spur pinion of stage 2
SECTION = ("shafts", 1, "sections", 1)
SPROCKET = ("shafts", 2, "pulleys", 0)


def rejected(mutate) -> InputError:
    doc = demo_snapshot()
    mutate(doc)
    with pytest.raises(InputError) as exc:
        drive_from_snapshot(doc)
    return exc.value


CASES = [
    # (mutation, path, words in the problem, words in accepted)
    (setter(GEAR, "pitch_radius", "0 mm"), "shafts[0].gears[0].pitch_radius", "must be positive", "> 0 m"),
    (setter(GEAR, "pitch_radius", "-21 mm"), "shafts[0].gears[0].pitch_radius", "must be positive, got -0.021 m",
     "> 0 m"),
    (setter(SPROCKET, "pitch_diameter", "0 in"), "shafts[2].pulleys[0].pitch_diameter", "must be positive",
     "> 0 m"),
    (setter(SECTION, "diameter", "0 mm"), "shafts[1].sections[1].diameter", "must be positive", "> 0 m"),
    (setter(SECTION, "diameter", "-45 mm"), "shafts[1].sections[1].diameter", "must be positive", "> 0 m"),
    (setter(SECTION, "length", "-1 mm"), "shafts[1].sections[1].length", "must be positive", "> 0 m"),
    (setter(GEAR, "pressure_angle", "40 deg"), "shafts[0].gears[0].pressure_angle", "out of range, got 40 deg",
     "10 to 35 deg"),
    (setter(SPUR, "pressure_angle", "9.5 deg"), "shafts[1].gears[1].pressure_angle", "out of range, got 9.5 deg",
     "10 to 35 deg"),
    (setter(GEAR, "helix_angle", "50 deg"), "shafts[0].gears[0].helix_angle", "out of range, got 50 deg",
     "0 to 45 deg"),
    (setter(GEAR, "helix_angle", "-15 deg"), "shafts[0].gears[0].helix_angle", "out of range, got -15 deg",
     "0 to 45 deg"),
    (setter(GEAR, "helix_angle", "0 deg"), "shafts[0].gears[0].helix_angle", "needs a helix angle above 0 deg",
     "0 to 45 deg"),
    (setter(SPUR, "helix_angle", "10 deg"), "shafts[1].gears[1].helix_angle", "a spur gear has no helix angle",
     "kind helical"),
    (setter(GEAR, "at", "NaN mm"), "shafts[0].gears[0].at", "must be finite, got 'NaN mm'", "a length, e.g."),
    (setter(GEAR, "pressure_angle", "nan deg"), "shafts[0].gears[0].pressure_angle", "must be finite",
     "an angle, e.g. '20 deg'"),
    (setter(SECTION, "length", "inf mm"), "shafts[1].sections[1].length", "must be finite", "a length"),
    (setter(("input",), "power", "-inf kW"), "input.power", "must be finite", "a power"),
    (setter(("meshes", 0), "efficiency", "NaN"), "meshes[0].efficiency", "must be finite", "a plain number"),
    (setter(GEAR, "at", "110 furlongz"), "shafts[0].gears[0].at", "unknown unit 'furlongz'", "a length"),
    (setter(("input",), "speed", "1460 rpmm"), "input.speed", "unknown unit 'rpmm'", "'1460 rpm'"),
    (setter(GEAR, "pressure_angle", "20 mm"), "shafts[0].gears[0].pressure_angle",
     "'20 mm' is a length, not an angle", "an angle, e.g. '20 deg'"),
    (setter(("input",), "speed", "1460 N"), "input.speed", "is a force, not a rotational speed", "'1460 rpm'"),
    (setter(GEAR, "at", 0.11), "shafts[0].gears[0].at", "no unit", "a length"),
    (setter(GEAR, "pressure_angle", "20"), "shafts[0].gears[0].pressure_angle", "no unit", "an angle"),
    (setter(GEAR, "at", "one hundred mm"), "shafts[0].gears[0].at", "cannot read", "a length"),
    (lambda d: d["meshes"][1]["gears"].__setitem__(1, "g9"), "meshes[1].gears[1]", "no gear with id 'g9'",
     "p1, g2, p3, g4"),
    (lambda d: d["meshes"][0]["gears"].__setitem__(0, "P1"), "meshes[0].gears[0]", "no gear with id 'P1'", "p1"),
    (setter(("input",), "shaft", "motor"), "input.shaft", "no shaft with id 'motor'", "input, intermediate, output"),
    (setter(("outputs", 0), "shaft", "conveyor"), "outputs[0].shaft", "no shaft with id 'conveyor'", "output"),
    (setter(("input",), "element", "flange"), "input.element", "no coupling or pulley 'flange' on shaft 'input'",
     "coupling"),
    (setter(("outputs", 0), "element", "g4"), "outputs[0].element", "no coupling or pulley 'g4'", "sprocket"),
    (lambda d: d.__setitem__("version", 3), "version", "unsupported snapshot version 3", "1, 2"),
    (lambda d: d.__setitem__("version", "1"), "version", "unsupported snapshot version '1'", "1, 2"),
    (lambda d: d.pop("version"), "version", "is required", "1, 2"),
    (lambda d: d.__setitem__("format", "gearbox"), "format", "unknown format 'gearbox'", "loadscope.drive"),
    (lambda d: at(d, GEAR).pop("at"), "shafts[0].gears[0].at", "is required", "a length"),
    (setter(GEAR, "pitch_radiuss", "21 mm"), "shafts[0].gears[0].pitch_radiuss", "is not a field",
     "pitch_radius"),
    (setter(GEAR, "kind", "worm"), "shafts[0].gears[0].kind", "must be one of", "'spur', 'helical' or 'bevel'"),
    (setter(GEAR, "teeth", 20.5), "shafts[0].gears[0].teeth", "must be a whole number", "an integer"),
    (setter(GEAR, "teeth", 2), "shafts[0].gears[0].teeth", "at least 3", ">= 3"),
    (setter(("shafts", 0, "supports", 0), "axial", "fixed"), "shafts[0].supports[0].axial", "must be one of",
     "'locating', 'floating', 'positive' or 'negative'"),
    (setter(SPROCKET, "tension_ratio", 0.8), "shafts[2].pulleys[0].tension_ratio", "must exceed 1", "inf"),
    (setter(SPROCKET, "wrap", 0), "shafts[2].pulleys[0].wrap", "must be one of", "1 or -1"),
    (lambda d: at(d, SPROCKET)["strand_angles"].append("90 deg"), "shafts[2].pulleys[0].strand_angles",
     "at most 2 items", "2 items"),
    (setter(SPROCKET, "pitch_radius", "69 mm"), "shafts[2].pulleys[0].pitch_diameter",
     "give pitch_radius or pitch_diameter, not both", "one of"),
    (lambda d: at(d, GEAR).pop("pitch_radius"), "shafts[0].gears[0].pitch_radius", "is required", "a length"),
    (setter(("housing",), "weight", "600 N"), "housing.mass", "give weight or mass, not both", "one of"),
    (setter(("housing",), "mass", "-1 kg"), "housing.mass", "must not be negative", ">= 0 kg"),
    (setter(("housing",), "bolt_method", "tipping"), "housing.tipping_edge", "needs an edge", "point"),
    (setter(("housing",), "bolts", []), "housing.bolts", "at least one mounting bolt", ">= 1 bolt"),
    (setter(("input",), "speed", "0 rpm"), "input.speed", "must not be zero", "non-zero"),
    (setter(("input",), "torque", "36 N*m"), "input", "give power or torque, not both", "one of power, torque"),
    (setter(("outputs", 0), "power", "5 kW"), "input", "exactly one port, found 2", "exactly one"),
    (setter(("meshes", 0), "efficiency", 1.02), "meshes[0].efficiency", "out of range", "0.5 to 1"),
    (setter(GEAR, "at", "1 m"), "shafts[0].gears[0].at", "lies off the shaft", "0 to 0.22 m"),
    (lambda d: at(d, SPUR).__setitem__("id", "p1"), "shafts[1].gears[1].id", "gear id 'p1' is already used",
     "unique"),
    (setter(("shafts", 0), "axis", [0, 0, 0]), "shafts[0].axis", "non-zero direction", "non-zero"),
    (setter(("shafts", 0), "sections", []), "shafts[0].sections", "at least one section", ">= 1 section"),
    (lambda d: d.__setitem__("shafts", {}), "shafts", "must be a list", "a JSON array"),
    (lambda d: d.__setitem__("outputs", []), "outputs", "at least one output", ">= 1 output"),
]


@pytest.mark.parametrize("mutate, path, problem, accepted", CASES,
                         ids=[f"{c[1]}:{c[2][:24]}" for c in CASES])
def test_bad_input_names_path_problem_and_range(mutate, path, problem, accepted):
    err = rejected(mutate)
    assert err.path == path
    assert problem in err.problem
    assert accepted in err.accepted
    assert str(err).startswith(f"{path}: ")


def test_not_an_object():
    with pytest.raises(InputError, match="must be a JSON object"):
        drive_from_snapshot(["not", "a", "drive"])  # type: ignore[arg-type]


def test_malformed_json_text():
    with pytest.raises(InputError) as exc:
        load_snapshot('{"format": "loadscope.drive", "version": 1, "shafts": [}')
    assert exc.value.path == ""
    assert "not valid JSON" in exc.value.problem and "column" in exc.value.problem


def test_error_is_picklable_and_a_value_error():
    err = rejected(setter(GEAR, "pressure_angle", "20 mm"))
    assert isinstance(err, ValueError)
    import pickle

    again = pickle.loads(pickle.dumps(err))
    assert (again.path, again.problem, again.accepted) == (err.path, err.problem, err.accepted)


def test_cli_style_mutations_of_the_canonical_file(tmp_path):
    """The CLI reads the canonical dump and users edit it: the same errors."""
    from loadscope.spec import dump_snapshot

    doc = json.loads(dump_snapshot(demo_snapshot()))
    doc["shafts"][0]["gears"][0]["pressure_angle"] = "40 deg"
    path = tmp_path / "bad.json"
    path.write_text(json.dumps(doc), encoding="utf-8")
    with pytest.raises(InputError) as exc:
        load_snapshot(path)
    assert exc.value.path == "shafts[0].gears[0].pressure_angle"

"""The 3D force scene: structure, arrows, hover text, units, bad input.

Oracles: the kernel's own results (every arrow must carry exactly the force
the kernel computed, at the point where it acts), the unit definitions of
NIST SP 811 Appendix B (1 in = 25.4 mm, 1 lbf = 4.4482216152605 N, exact),
and plain geometry (a circle of radius r about c in the plane normal to the
shaft axis).
"""

from __future__ import annotations

import json
import math
import re

import numpy as np
import pytest
from conftest import variant
from hypothesis import HealthCheck, given, settings
from strategies import drives

from loadscope import CAUTION, InputError, solve
from loadscope.viz import SHOW_CHOICES, force_scene
from loadscope.viz.style import SIZES

MM = 1e-3           # [m] per mm
INCH = 0.0254       # [m] per in, exact (NIST SP 811 B.8)
LBF = 4.4482216152605  # [N] per lbf, exact (NIST SP 811 B.8)
HARDWARE = 4        # traces after the shaft meshes: discs, rings, bearings, bolts


def by_name(spec, name, kind):
    found = [t for t in spec["data"] if t["name"] == name and t["type"] == kind]
    assert len(found) == 1, (name, kind)
    return found[0]


def segments(tr):
    """Tails and tips of the arrows of a line trace (tail, tip, gap, ...)."""
    x, y, z = tr["x"], tr["y"], tr["z"]
    assert len(x) % 3 == 0
    assert all(v is None for v in x[2::3])
    pts = np.array([[a, b, c] for a, b, c in zip(x, y, z) if a is not None], dtype=float).reshape(-1, 2, 3)
    return pts[:, 0], pts[:, 1]


def structure(spec):
    """What must not change for one drive topology."""
    out = []
    for t in spec["data"]:
        out.append((t["type"], t["name"], t.get("legendgroup"), len(t["x"]), len(t.get("i", ())),
                    len(t["hovertext"]) if isinstance(t.get("hovertext"), list) else -1))
    return out, len(spec["layout"]["annotations"])


def seat_centres(result):
    """(shaft id, support id) -> seat centre [m]: origin + at * axis."""
    out = {}
    for sh in result.drive.shafts:
        for sp in sh.supports:
            out[(sh.id, sp.id)] = np.asarray(sh.origin) + sp.at * np.asarray(sh.axis)
    return out


def reaction_list(result):
    return [(sr.id, sid, rg) for sr in result.shafts
            for sid, rg in zip(sr.solution.support_ids, sr.solution.reactions_global)]


def other_loads(result):
    return [a for sr in result.shafts for a in sr.actions if a.kind in ("strand", "load")]


@pytest.fixture(scope="module")
def scene(demo):
    return force_scene(demo, show="both")


def test_trace_structure_is_stable_under_parameter_changes(demo, changed):
    # Same topology, other power / speed / pressure angle / support / diameter / strand angles.
    assert structure(force_scene(changed)) == structure(force_scene(demo))


def test_every_show_choice_has_the_same_structure_and_sets_visibility(demo):
    specs = {show: force_scene(demo, show=show) for show in SHOW_CHOICES}
    assert len({repr(structure(s)) for s in specs.values()}) == 1
    expect = {"applied": (True, "legendonly", True), "reactions": ("legendonly", True, "legendonly"),
              "both": (True, True, True)}
    for show, spec in specs.items():
        for name, vis in zip(("tooth forces", "bearing reactions", "strand pulls and loads"), expect[show]):
            assert by_name(spec, name, "scatter3d")["visible"] == vis
            assert by_name(spec, name, "mesh3d")["visible"] == vis       # the head goes with its line


def test_every_tooth_force_has_an_arrow_at_its_pitch_point(demo, scene):
    scale = scene["layout"]["meta"]["arrow_scale"]
    tails, tips = segments(by_name(scene, "tooth forces", "scatter3d"))
    assert len(tails) == len(demo.teeth) == 4
    size = scene["layout"]["meta"]["size"]
    texts = by_name(scene, "tooth forces", "scatter3d")["hovertext"]
    for k, t in enumerate(demo.teeth):
        np.testing.assert_allclose(tails[k], t.point / MM, rtol=0, atol=1e-12 * size)
        np.testing.assert_allclose(tips[k] - tails[k], t.force * scale / MM, rtol=0, atol=1e-12 * size)
        assert f"{t.mesh} · {t.gear} ({t.role}" in texts[3 * k]


def test_every_reaction_has_an_arrow_on_its_line_of_action(demo, scene):
    scale = scene["layout"]["meta"]["arrow_scale"]
    size = scene["layout"]["meta"]["size"]
    reactions = reaction_list(demo)
    tails, tips = segments(by_name(scene, "bearing reactions", "scatter3d"))
    rings = by_name(scene, "bearings", "scatter3d")
    sides = int(SIZES["ring_sides"])
    assert len(tails) == len(reactions) == 6
    centres = seat_centres(demo)
    for k, (sid, bid, rg) in enumerate(reactions):
        ring = np.array([rings["x"], rings["y"], rings["z"]], dtype=object).T[k * (sides + 2):(k + 1) * (sides + 2) - 2]
        ring = ring.astype(float)
        c = centres[(sid, bid)] / MM
        np.testing.assert_allclose(ring.mean(axis=0), c, rtol=0, atol=1e-12 * size)   # ring about the seat
        radius = np.linalg.norm(ring - c, axis=1)
        np.testing.assert_allclose(radius, radius[0], rtol=1e-12)
        # tail on the line of action through the seat centre, one ring radius out, along the force
        np.testing.assert_allclose(tails[k], c + radius[0] * rg / np.linalg.norm(rg), rtol=0, atol=1e-12 * size)
        np.testing.assert_allclose(tips[k] - tails[k], rg * scale / MM, rtol=0, atol=1e-12 * size)
        assert f"{sid} · bearing {bid}" in rings["hovertext"][k * (sides + 2)]


def test_strand_pulls_have_arrows_at_their_strand_points(demo, scene):
    scale = scene["layout"]["meta"]["arrow_scale"]
    size = scene["layout"]["meta"]["size"]
    loads = other_loads(demo)
    tails, tips = segments(by_name(scene, "strand pulls and loads", "scatter3d"))
    assert len(tails) == len(loads) == 2          # the sprocket's tight and slack strands
    for k, a in enumerate(loads):
        np.testing.assert_allclose(tails[k], a.point / MM, rtol=0, atol=1e-12 * size)
        np.testing.assert_allclose(tips[k] - tails[k], a.force * scale / MM, rtol=0, atol=1e-12 * size)


def all_arrows(result, spec):
    forces = [t.force for t in result.teeth] + [r[2] for r in reaction_list(result)]
    forces += [a.force for a in other_loads(result)]
    vecs = [tips - tails for tails, tips in (segments(by_name(spec, n, "scatter3d"))
                                             for n in ("tooth forces", "bearing reactions", "strand pulls and loads"))]
    return np.array(forces), np.vstack(vecs)


def test_arrow_length_is_proportional_to_magnitude(demo, scene):
    forces, vecs = all_arrows(demo, scene)
    f = np.linalg.norm(forces, axis=1)
    length = np.linalg.norm(vecs, axis=1)
    ratio = length[f > 0] / f[f > 0]
    np.testing.assert_allclose(ratio, ratio[0], rtol=1e-12)
    assert np.all(length[f == 0] == 0.0)           # the slack strand of a chain carries nothing


def test_auto_scale_makes_the_largest_arrow_a_fixed_share_of_the_drive(demo, scene):
    n = len(demo.shafts)
    hw = scene["data"][:n + HARDWARE]
    pts = np.array([(x, y, z) for t in hw for x, y, z in zip(t["x"], t["y"], t["z"]) if x is not None], dtype=float)
    size = float((pts.max(axis=0) - pts.min(axis=0)).max())
    assert math.isclose(scene["layout"]["meta"]["size"], size, rel_tol=1e-12)
    _, vecs = all_arrows(demo, scene)
    assert math.isclose(np.linalg.norm(vecs, axis=1).max(), SIZES["arrow_share"] * size, rel_tol=1e-12)


def test_a_given_arrow_scale_is_used_and_reported(demo):
    spec = force_scene(demo, arrow_scale=2e-5)
    assert spec["layout"]["meta"]["arrow_scale"] == 2e-5
    forces, vecs = all_arrows(demo, spec)
    np.testing.assert_allclose(vecs, forces * 2e-5 / MM, rtol=0, atol=1e-12 * spec["layout"]["meta"]["size"])
    # the legend note: 1 mm of arrow = 1e-3 m / 2e-5 m/N = 50 N
    assert "1 mm = 50 N" in spec["layout"]["annotations"][0]["text"]


def test_arrow_heads_end_at_the_tips_and_stay_inside_the_arrow(demo, scene):
    sides = int(SIZES["head_sides"])
    for name in ("tooth forces", "bearing reactions", "strand pulls and loads"):
        tails, tips = segments(by_name(scene, name, "scatter3d"))
        head = by_name(scene, name, "mesh3d")
        v = np.array([head["x"], head["y"], head["z"]]).T.reshape(len(tails), sides + 1, 3)
        np.testing.assert_array_equal(v[:, 0], tips)                      # apex at the tip
        length = np.linalg.norm(tips - tails, axis=1)
        along = np.einsum("kij,kj->ki", v - tails[:, None, :], tips - tails) / np.where(length > 0, length, 1)[:, None]
        assert np.all(along >= -1e-9) and np.all(along <= length[:, None] * (1 + 1e-12) + 1e-12)
        assert max(head["i"] + head["j"] + head["k"]) == len(head["x"]) - 1


def test_gear_rings_pass_through_the_pitch_points(demo, scene):
    # Each meshed gear's ring: a circle about its axis, in the plane normal to it, through the pitch point.
    rings = by_name(scene, "gears and pulleys", "scatter3d")
    sides = int(SIZES["ring_sides"])
    pts = np.array([rings["x"], rings["y"], rings["z"]], dtype=object).T
    circles = [pts[k * (sides + 2):(k + 1) * (sides + 2) - 2].astype(float) for k in range(len(pts) // (sides + 2))]
    assert len(circles) == 5              # four gears and the sprocket
    order = [(sh, g.id) for sh in demo.drive.shafts for g in sh.gears]
    for t in demo.teeth:
        ring = circles[order.index((demo.drive.shaft(t.shaft), t.gear))]
        c = ring.mean(axis=0)
        r = np.linalg.norm(ring - c, axis=1)
        np.testing.assert_allclose(r, r[0], rtol=1e-12)
        p = t.point / MM
        assert math.isclose(np.linalg.norm(p - c), r[0], rel_tol=1e-9)
        assert abs((p - c) @ np.asarray(demo.drive.shaft(t.shaft).axis)) < 1e-9 * r[0]


def test_shafts_are_their_stepped_sections(demo, scene):
    for k, sh in enumerate(demo.drive.shafts):
        m = scene["data"][k]
        v = np.array([m["x"], m["y"], m["z"]]).T * MM - np.asarray(sh.origin)
        a = np.asarray(sh.axis)
        s = v @ a
        r = np.linalg.norm(v - np.outer(s, a), axis=1)
        radii = {0.0} | {sec.diameter / 2 for sec in sh.sections}
        assert all(min(abs(x - q) for q in radii) < 1e-12 for x in r)
        assert math.isclose(s.min() + 1.0, 1.0, abs_tol=1e-12) and math.isclose(s.max(), sh.length, rel_tol=1e-12)
        assert max(m["i"] + m["j"] + m["k"]) == len(m["x"]) - 1


def test_hover_text_gives_values_with_their_units(demo):
    for units, factor, unit in (("si", 1.0, "N"), ("us", LBF, "lbf")):
        spec = force_scene(demo, units=units)
        texts = by_name(spec, "tooth forces", "scatter3d")["hovertext"][::3]
        for t, text in zip(demo.teeth, texts):
            for part in ("tangential", "radial", "axial"):
                got = float(re.search(rf"{part} (-?[\d.]+) {unit}\b", text).group(1))
                want = getattr(t, part) / factor
                assert math.isclose(got, want, rel_tol=5e-4, abs_tol=1e-9), (part, text)  # 4 significant digits
        texts = by_name(spec, "bearing reactions", "scatter3d")["hovertext"][::3]
        for (_, _, rg), text in zip(reaction_list(demo), texts):
            got = float(re.search(rf"\|R\| ([\d.]+) {unit}\b", text).group(1))
            assert math.isclose(got, np.linalg.norm(rg) / factor, rel_tol=5e-4)
    text = by_name(force_scene(demo), "tooth forces", "scatter3d")["hovertext"][0]
    assert text.startswith("stage1 · g2 (driven, shaft intermediate)<br>tangential 1654 N, radial 623.5 N")


def test_bolt_markers_carry_bolt_loads(demo, scene):
    bolts = by_name(scene, "mounting bolts", "scatter3d")
    h = demo.housing
    assert len(bolts["x"]) == len(h.bolt_ids) == 4
    for k, bid in enumerate(h.bolt_ids):
        np.testing.assert_allclose([bolts["x"][k], bolts["y"][k], bolts["z"][k]],
                                   np.asarray(demo.drive.housing.bolts[k].position) / MM, rtol=1e-12)
        got = float(re.search(r"shear ([\d.]+) N", bolts["hovertext"][k]).group(1))
        assert bid in bolts["hovertext"][k] and math.isclose(got, h.bolts.shear[k], rel_tol=5e-4)


def test_us_units_change_numbers_by_the_exact_factor_and_the_labels(demo):
    si, us = force_scene(demo, units="si"), force_scene(demo, units="us")
    for a, b in zip(si["data"], us["data"]):
        for key in ("x", "y", "z"):
            xa = np.array([np.nan if v is None else v for v in a[key]], dtype=float)
            xb = np.array([np.nan if v is None else v for v in b[key]], dtype=float)
            np.testing.assert_allclose(xb * INCH / MM, xa, rtol=1e-12, atol=1e-12 * si["layout"]["meta"]["size"])
    assert si["layout"]["meta"]["arrow_scale"] == pytest.approx(us["layout"]["meta"]["arrow_scale"], rel=1e-12)
    for ax in ("xaxis", "yaxis", "zaxis"):
        assert si["layout"]["scene"][ax]["title"]["text"].endswith("[mm]")
        assert us["layout"]["scene"][ax]["title"]["text"].endswith("[in]")
    assert "[lbf]" in us["layout"]["title"]["text"]
    assert " lbf" in by_name(us, "bearing reactions", "mesh3d")["hovertext"][0]
    assert "at 2.953 in" in by_name(us, "bearings", "scatter3d")["hovertext"][0]      # 75 mm / 25.4 mm


def test_y_is_up_and_the_caution_is_shown(scene):
    assert scene["layout"]["scene"]["camera"]["up"] == {"x": 0.0, "y": 1.0, "z": 0.0}
    assert scene["layout"]["scene"]["aspectmode"] == "data"
    assert scene["layout"]["meta"]["caution"] == CAUTION
    assert any("preliminary design" in a["text"] for a in scene["layout"]["annotations"])


def test_a_drive_without_housing_keeps_an_empty_bolt_trace(demo):
    bare = force_scene(variant(no_housing=True))
    assert [t["name"] for t in bare["data"]] == [t["name"] for t in force_scene(demo)["data"]]
    assert by_name(bare, "mounting bolts", "scatter3d")["x"] == []
    json.dumps(bare, allow_nan=False)


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(drives())
def test_random_drives_get_one_proportional_arrow_per_force(drive):
    result = solve(drive)
    spec = force_scene(result, show="both")
    forces, vecs = all_arrows(result, spec)
    assert len(vecs) == len(result.teeth) + sum(len(s.supports) for s in drive.shafts) + len(other_loads(result))
    scale = spec["layout"]["meta"]["arrow_scale"]
    np.testing.assert_allclose(vecs, forces * scale / MM, rtol=0, atol=1e-12 * spec["layout"]["meta"]["size"])
    json.dumps(spec, allow_nan=False)


@pytest.mark.parametrize(("kwargs", "path", "accepted"), [
    ({"show": "forces"}, "show", "applied, reactions, both"),
    ({"units": "imperial"}, "units", "si, us"),
    ({"arrow_scale": 0.0}, "arrow_scale", "> 0 m/N, or None for automatic"),
    ({"arrow_scale": float("nan")}, "arrow_scale", "> 0 m/N, or None for automatic"),
    ({"arrow_scale": True}, "arrow_scale", "> 0 m/N, or None for automatic"),
])
def test_bad_arguments_name_the_argument_and_the_accepted_values(demo, kwargs, path, accepted):
    with pytest.raises(InputError) as err:
        force_scene(demo, **kwargs)
    assert err.value.path == path and err.value.accepted == accepted
    assert str(err.value).startswith(f"{path}: ") and accepted in str(err.value)


def test_a_focus_draws_its_shafts_and_every_arrow_on_them_only(demo):
    pair = ("input", "intermediate")
    spec = force_scene(demo, show="both", shafts=pair)
    scale = spec["layout"]["meta"]["arrow_scale"]
    size = spec["layout"]["meta"]["size"]
    assert [t["hovertext"].split(":")[0] for t in spec["data"][:2]] == ["shaft input", "shaft intermediate"]
    assert spec["data"][2]["name"] == "gears and pulleys"        # trace order as for the whole drive
    # the kernel's tooth forces on those shafts: both of stage1, and stage2's driver p3 on the intermediate shaft
    teeth = [t for t in demo.teeth if t.shaft in pair]
    assert [(t.mesh, t.gear) for t in teeth] == [("stage1", "g2"), ("stage1", "p1"), ("stage2", "p3")]
    tails, tips = segments(by_name(spec, "tooth forces", "scatter3d"))
    assert len(tails) == len(teeth)
    for k, t in enumerate(teeth):
        np.testing.assert_allclose(tails[k], t.point / MM, rtol=0, atol=1e-12 * size)
        np.testing.assert_allclose(tips[k] - tails[k], t.force * scale / MM, rtol=0, atol=1e-12 * size)
    reactions = [r for r in reaction_list(demo) if r[0] in pair]
    tails, tips = segments(by_name(spec, "bearing reactions", "scatter3d"))
    assert len(tails) == len(reactions) == 4
    for k, (_, _, rg) in enumerate(reactions):
        np.testing.assert_allclose(tips[k] - tails[k], rg * scale / MM, rtol=0, atol=1e-12 * size)
    rings = by_name(spec, "gears and pulleys", "scatter3d")["hovertext"]
    assert {t.split(" · ")[0] for t in rings} == set(pair)      # no g4, no sprocket
    assert by_name(spec, "bearings", "scatter3d")["hovertext"][0].startswith("input · bearing A")
    assert by_name(spec, "mounting bolts", "scatter3d")["x"] == []        # the housing's, not the pair's
    assert len(segments(by_name(spec, "strand pulls and loads", "scatter3d"))[0]) == 0   # the sprocket is on output
    assert "shafts input, intermediate" in spec["layout"]["title"]["text"]
    # the legend names only what this view draws (common practice: no key for an empty layer)
    legend = {t["name"] for t in spec["data"] if t.get("showlegend", True)}
    assert "mounting bolts" not in legend and "strand pulls and loads" not in legend
    whole = {t["name"] for t in force_scene(demo, show="both")["data"] if t.get("showlegend", True)}
    assert {"mounting bolts", "strand pulls and loads", "tooth forces", "bearing reactions"} <= whole
    # the automatic scale follows what is drawn: the largest arrow shown is arrow_share of the size shown
    longest = max(float(np.linalg.norm(f)) for f in [t.force for t in teeth] + [r[2] for r in reactions])
    assert longest * scale / MM == pytest.approx(SIZES["arrow_share"] * size, rel=1e-12)


def test_no_focus_is_the_whole_drive_and_a_bad_focus_names_the_shafts(demo):
    assert force_scene(demo, shafts=None) == force_scene(demo)
    whole = force_scene(demo)
    every = force_scene(demo, arrow_scale=whole["layout"]["meta"]["arrow_scale"],
                        shafts=["output", "intermediate", "input"])       # all of them, in any order
    # the same hardware and arrows; only the bolts (and the head size, from the size of what is drawn) go
    kept = [k for k, t in enumerate(whole["data"])
            if t["name"] != "mounting bolts" and (k < 7 or t.get("mode") == "lines")]
    assert [every["data"][k] for k in kept] == [whole["data"][k] for k in kept]
    with pytest.raises(InputError, match=r"shafts: no shaft 'nope' in this drive.*input, intermediate, output"):
        force_scene(demo, shafts=["input", "nope"])
    with pytest.raises(InputError, match="shafts: names no shaft"):
        force_scene(demo, shafts=[])

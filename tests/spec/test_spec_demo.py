"""The embedded demo drive (an invented screw-conveyor reducer): it is
consistent as a gear design and it solves, with every balance closing.

Oracles: gear geometry (pitch radius r = m_n z / (2 cos beta); centre
distance = sum of pitch radii), the drive's ratio from tooth counts, and
Newton's laws through the kernel's residuals.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from loadscope.kernel.solve import solve
from loadscope.spec import demo_snapshot, drive_from_snapshot


@pytest.fixture(scope="module")
def drive():
    return drive_from_snapshot(demo_snapshot())


@pytest.fixture(scope="module")
def result(drive):
    return solve(drive)


def test_demo_is_a_fresh_dict_each_time():
    a = demo_snapshot()
    a["shafts"].clear()
    assert demo_snapshot()["shafts"]


def test_demo_is_invented_and_named(drive):
    assert "invented" in drive.name
    assert [s.id for s in drive.shafts] == ["input", "intermediate", "output"]


def test_shafts_run_along_x_and_gears_face_each_other(drive):
    for s in drive.shafts:
        assert s.axis == (1.0, 0.0, 0.0)
    for mesh in drive.meshes:
        (sa, ga), (sb, gb) = [next((s, g) for s in drive.shafts for g in s.gears if g.id == gid)
                              for gid in mesh.gears]
        assert sa.origin[0] + ga.at == pytest.approx(sb.origin[0] + gb.at, abs=1e-12)
        centre = math.hypot(sa.origin[1] - sb.origin[1], sa.origin[2] - sb.origin[2])
        assert ga.pitch_radius + gb.pitch_radius == pytest.approx(centre, rel=1e-5)
        assert ga.pressure_angle == gb.pressure_angle == pytest.approx(math.radians(20.0))
        assert 0.97 <= mesh.efficiency <= 0.99


def test_pitch_radii_follow_the_modules(drive):
    p1, g2 = drive.shafts[0].gears[0], drive.shafts[1].gears[0]
    p3, g4 = drive.shafts[1].gears[1], drive.shafts[2].gears[0]
    beta = p1.helix_angle
    assert (p1.kind, g2.kind, p3.kind, g4.kind) == ("helical", "helical", "spur", "spur")
    assert {p1.hand, g2.hand} == {"right", "left"}
    for g, module in ((p1, 2e-3), (g2, 2e-3)):
        assert g.pitch_radius == pytest.approx(module * g.teeth / (2 * math.cos(beta)), rel=2e-4)
    for g in (p3, g4):
        assert g.pitch_radius == pytest.approx(3e-3 * g.teeth / 2, rel=1e-12)


def test_ratio_speed_and_power(drive, result):
    ratio = result.shaft("input").speed / result.shaft("output").speed
    assert 15 <= abs(ratio) <= 20
    assert abs(ratio) == pytest.approx((92 / 21) * (73 / 19), rel=1e-12)
    assert result.shaft("input").rpm == pytest.approx(1460.0)
    assert result.train.power_in == pytest.approx(5500.0)
    assert result.train.power_out == pytest.approx(5500.0 * 0.98 * 0.985)
    assert result.shaft("output").rpm == pytest.approx(1460 / ratio, rel=1e-12)


def test_demo_solves_with_every_residual_tiny(result):
    assert set(result.residuals) >= {"shaft input", "shaft intermediate", "shaft output", "drive", "housing"}
    for name, r in result.residuals.items():
        for key, value in r.items():
            assert value < 1e-9, (name, key, value)


def test_housing_has_four_foot_bolts(drive, result):
    h = drive.housing
    assert len(h.bolts) == 4
    assert all(b.position[1] == 0.0 for b in h.bolts)
    assert h.plane_normal == (0.0, 1.0, 0.0)
    assert h.weight == pytest.approx(68 * 9.80665)
    assert np.all(np.isfinite(result.housing.bolts.tension))
    assert np.all(np.isfinite(result.housing.bolts.shear))


def test_output_drives_a_chain(drive):
    sprocket = drive.shafts[2].pulleys[0]
    assert math.isinf(sprocket.tension_ratio)
    assert sprocket.pitch_radius * 2 == pytest.approx(25.4e-3 / math.sin(math.pi / 17), rel=1e-4)

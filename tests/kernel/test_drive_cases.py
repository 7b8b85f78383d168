"""Whole-drive cases with known answers: bevel pair, internal (ring) gear,
idler, two outputs, and the drive-level input errors.

Oracles: closed-form tooth forces (Shigley's Mechanical Engineering Design,
9th ed., Eq. 13-36, 13-38, 13-39), kinematics of gear trains (an idler does
not change the ratio, an external mesh reverses, an internal one keeps the
sense: common practice), Newton's laws.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from loadscope import (
    Coupling,
    Drive,
    Gear,
    InputError,
    MechanismError,
    Mesh,
    Port,
    Section,
    Shaft,
    Support,
    bevel_mesh_forces,
    mesh_forces,
    solve,
)

DEG = math.pi / 180.0


def two_bearing(ident, length, d, origin=(0.0, 0.0, 0.0), axis=(1.0, 0.0, 0.0), **kw):
    return Shaft(ident, (Section(length, d),), (Support("A", 0.0, "locating"), Support("B", length)),
                 origin=origin, axis=axis, **kw)


def test_right_angle_bevel_pair():
    # Pinion on +x, 24 teeth, r_m = 40 mm; gear on +y... placed so the cone apex
    # is the origin: pinion centre at x = r_gear, gear centre at y = r_pinion.
    rp, rg = 0.040, 0.060
    pin = two_bearing("pinion", 0.3, 0.04, origin=(rg - 0.15, 0.0, 0.0),
                      gears=(Gear("bp", 0.15, rp, "bevel", teeth=24),), couplings=(Coupling("in", 0.0),))
    gear = two_bearing("gear", 0.3, 0.05, origin=(0.0, rp - 0.15, 0.0), axis=(0.0, 1.0, 0.0),
                       gears=(Gear("bg", 0.15, rg, "bevel", teeth=36),), couplings=(Coupling("out", 0.3),))
    drive = Drive((pin, gear), (Mesh("m", ("bp", "bg")),), Port("pinion", "in", torque=50.0),
                  (Port("gear", "out"),), speed=100.0)
    r = solve(drive)
    assert r.max_residual < 1e-9
    gamma_p = math.atan2(rp, rg)            # pitch cone angle, tan(gamma_p) = N_p / N_g for 90 deg
    ref = bevel_mesh_forces(50.0, rp, 20 * DEG, gamma_p)
    on_pinion = next(t for t in r.teeth if t.gear == "bp")
    assert math.isclose(on_pinion.tangential, float(ref.tangential), rel_tol=1e-12)
    assert math.isclose(on_pinion.radial, float(ref.radial), rel_tol=1e-12)
    assert math.isclose(on_pinion.axial, float(ref.axial), rel_tol=1e-12)
    # Thrust on the pinion points away from the cone apex (here: toward +x).
    assert on_pinion.force[0] > 0
    assert math.isclose(abs(r.train.speed[1]), 100.0 * 24 / 36, rel_tol=1e-12)


def test_internal_ring_keeps_the_sense_and_pushes_the_ring_outward():
    # Pinion 20 teeth r = 20 mm inside a 60-tooth ring r = 60 mm: centre distance 40 mm.
    pin = two_bearing("pinion", 0.2, 0.03, gears=(Gear("p", 0.1, 0.02, teeth=20),), couplings=(Coupling("in", 0.0),))
    ring = two_bearing("ring", 0.2, 0.05, origin=(0.0, 0.04, 0.0),
                       gears=(Gear("r", 0.1, 0.06, teeth=60, internal=True),), couplings=(Coupling("out", 0.2),))
    drive = Drive((pin, ring), (Mesh("m", ("p", "r")),), Port("pinion", "in", power=1000.0), (Port("ring", "out"),),
                  speed=200.0)
    r = solve(drive)
    assert r.max_residual < 1e-9
    assert math.isclose(r.train.speed[1], 200.0 / 3.0, rel_tol=1e-12)     # same sense
    on_ring = next(t for t in r.teeth if t.gear == "r")
    # The pitch point lies on the far side of the pinion from the ring centre (y = -0.02);
    # the ring's radial load points away from the ring's axis (-y).
    assert np.allclose(on_ring.point, [0.1, -0.02, 0.0])
    assert on_ring.force[1] < 0
    ref = mesh_forces(1000.0 / 200.0, 0.02, 20 * DEG)
    assert math.isclose(on_ring.radial, float(ref.radial), rel_tol=1e-12)


def test_idler_does_not_change_the_ratio():
    a = two_bearing("a", 0.2, 0.03, gears=(Gear("a1", 0.1, 0.03, teeth=30),), couplings=(Coupling("in", 0.0),))
    idl = Shaft("idler", (Section(0.3, 0.03),), (Support("A", 0.0, "locating"), Support("B", 0.3)),
                origin=(0.0, 0.06, 0.0), gears=(Gear("i1", 0.1, 0.03, teeth=30), Gear("i2", 0.2, 0.03, teeth=30)))
    b = two_bearing("b", 0.3, 0.03, origin=(0.0, 0.135, 0.0), gears=(Gear("b1", 0.2, 0.045, teeth=45),),
                    couplings=(Coupling("out", 0.3),))
    drive = Drive((a, idl, b), (Mesh("m1", ("a1", "i1")), Mesh("m2", ("i2", "b1"))), Port("a", "in", power=500.0),
                  (Port("b", "out"),), speed=100.0)
    r = solve(drive)
    assert r.max_residual < 1e-9
    # Two external meshes: the output turns the same way, at 30/45 of the input speed.
    assert math.isclose(r.train.speed[2], 100.0 * 30 / 45, rel_tol=1e-12)


def test_two_outputs_share_the_power():
    a = Shaft("a", (Section(0.3, 0.04),), (Support("A", 0.0, "locating"), Support("B", 0.3)),
              gears=(Gear("a1", 0.1, 0.03, teeth=20), Gear("a2", 0.2, 0.03, teeth=20)),
              couplings=(Coupling("in", 0.0),))
    b = two_bearing("b", 0.3, 0.04, origin=(0.0, 0.09, 0.0), gears=(Gear("b1", 0.1, 0.06, teeth=40),),
                    couplings=(Coupling("out", 0.3),))
    c = two_bearing("c", 0.3, 0.04, origin=(0.0, -0.09, 0.0), gears=(Gear("c1", 0.2, 0.06, teeth=40),),
                    couplings=(Coupling("out", 0.3),))
    drive = Drive((a, b, c), (Mesh("mb", ("a1", "b1"), 0.98), Mesh("mc", ("a2", "c1"), 0.96)),
                  Port("a", "in", power=3000.0), (Port("b", "out", share=2.0), Port("c", "out", share=1.0)),
                  speed=150.0)
    r = solve(drive)
    assert r.max_residual < 1e-9
    pb = -r.train.port_power[("b", "out")]
    pc = -r.train.port_power[("c", "out")]
    assert math.isclose(pb, 2 * pc, rel_tol=1e-12)
    assert math.isclose(pb / 0.98 + pc / 0.96, 3000.0, rel_tol=1e-12)


def test_radii_that_miss_the_centre_distance_say_by_how_much():
    a = two_bearing("a", 0.2, 0.03, gears=(Gear("a1", 0.1, 0.03),), couplings=(Coupling("in", 0.0),))
    b = two_bearing("b", 0.2, 0.03, origin=(0.0, 0.095, 0.0), gears=(Gear("b1", 0.1, 0.06),),
                    couplings=(Coupling("out", 0.2),))
    drive = Drive((a, b), (Mesh("m", ("a1", "b1")),), Port("a", "in", power=100.0), (Port("b", "out"),), speed=10.0)
    with pytest.raises(InputError, match=r"miss the centre distance 95 mm .* by -5 mm") as err:
        solve(drive)
    assert "0.1%" in err.value.accepted


def test_contradictory_loop_and_unconnected_shaft():
    # Three equal gears meshed in a triangle: each external mesh reverses the
    # sense, so going round the loop the input shaft would turn against itself.
    a = Shaft("a", (Section(0.3, 0.03),), (Support("A", 0.0, "locating"), Support("B", 0.3)),
              gears=(Gear("a1", 0.1, 0.03), Gear("a2", 0.2, 0.03)), couplings=(Coupling("in", 0.0),))
    b = Shaft("b", (Section(0.3, 0.03),), (Support("A", 0.0, "locating"), Support("B", 0.3)),
              origin=(0.0, 0.06, 0.0), gears=(Gear("b1", 0.1, 0.03), Gear("b2", 0.25, 0.03)))
    c_y, c_z = 0.03, math.sqrt(0.06**2 - 0.03**2)
    c = Shaft("c", (Section(0.3, 0.03),), (Support("A", 0.0, "locating"), Support("B", 0.3)),
              origin=(0.0, c_y, c_z), gears=(Gear("c1", 0.2, 0.03), Gear("c2", 0.25, 0.03)),
              couplings=(Coupling("out", 0.3),))
    meshes = (Mesh("ab", ("a1", "b1")), Mesh("bc", ("b2", "c2")), Mesh("ca", ("c1", "a2")))
    drive = Drive((a, b, c), meshes, Port("a", "in", power=100.0), (Port("c", "out"),), speed=10.0)
    with pytest.raises(MechanismError, match="loop whose ratios disagree"):
        solve(drive)
    lone = two_bearing("lone", 0.2, 0.03, origin=(0.0, 1.0, 0.0))
    drive = Drive((a, b, lone), (Mesh("ab", ("a1", "b1")),), Port("a", "in", power=100.0), (Port("b", "b"),),
                  speed=10.0)
    with pytest.raises(InputError):
        solve(drive)


def test_unknown_gear_id_in_a_mesh():
    a = two_bearing("a", 0.2, 0.03, gears=(Gear("a1", 0.1, 0.03),), couplings=(Coupling("in", 0.0),))
    drive = Drive((a,), (Mesh("m", ("a1", "zz")),), Port("a", "in", power=100.0), (Port("a", "in"),), speed=10.0)
    with pytest.raises(InputError, match="no gear with id 'zz'") as err:
        solve(drive)
    assert err.value.path == "meshes[0].gears[1]"


def test_helical_hands_must_be_opposite_in_an_external_mesh():
    g1 = Gear("a1", 0.1, 0.03, "helical", helix_angle=15 * DEG, hand="right")
    g2 = Gear("b1", 0.1, 0.06, "helical", helix_angle=15 * DEG, hand="right")
    a = two_bearing("a", 0.2, 0.03, gears=(g1,), couplings=(Coupling("in", 0.0),))
    b = two_bearing("b", 0.2, 0.03, origin=(0.0, 0.09, 0.0), gears=(g2,), couplings=(Coupling("out", 0.2),))
    drive = Drive((a, b), (Mesh("m", ("a1", "b1")),), Port("a", "in", power=100.0), (Port("b", "out"),), speed=10.0)
    with pytest.raises(InputError, match="opposite hands"):
        solve(drive)

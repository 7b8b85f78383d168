"""Properties of whole-drive solves, for random valid drives (hypothesis).

Oracles: Newton's laws (every free body balances; action equals reaction at
each mesh) and conservation of energy (power in = power out + mesh losses).
"""

from __future__ import annotations

import math

import numpy as np
from hypothesis import HealthCheck, given, settings
from strategies import drives

from loadscope import Coupling, Drive, Gear, Mesh, Port, Section, Shaft, Support, solve

SETTINGS = settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])


@SETTINGS
@given(drives())
def test_every_free_body_balances(drive):
    # Newton's first law on every shaft, on the drive and on the housing.
    result = solve(drive)
    for name, res in result.residuals.items():
        assert res["force_rel"] < 1e-9, name
        assert res["moment_rel"] < 1e-9, name


@SETTINGS
@given(drives())
def test_mating_tooth_forces_are_equal_and_opposite(drive):
    # Newton's third law at each pitch point.
    result = solve(drive)
    by_mesh: dict[str, list] = {}
    for t in result.teeth:
        by_mesh.setdefault(t.mesh, []).append(t)
    for pair in by_mesh.values():
        a, b = pair
        scale = np.linalg.norm(a.force)
        assert np.linalg.norm(a.force + b.force) <= 1e-12 * scale
        assert np.allclose(a.point, b.point, rtol=0, atol=1e-15)
        assert {a.role, b.role} == {"driver", "driven"}


@SETTINGS
@given(drives())
def test_power_balance(drive):
    # Energy: input power = output power + (1 - eta) of each mesh's power.
    result = solve(drive)
    p_in, p_out = result.train.power_in, result.train.power_out
    lost = sum((1 - fl.geometry.efficiency) * fl.power for fl in result.train.meshes)
    assert math.isclose(p_in, p_out + lost, rel_tol=1e-12)
    eta = math.prod(m.efficiency for m in drive.meshes)
    assert math.isclose(p_out, eta * p_in, rel_tol=1e-12)      # a chain of meshes
    # Port torques times speeds give the same powers.
    t_in = result.train.port_torque[(drive.input.shaft, drive.input.element)]
    assert math.isclose(t_in * drive.speed, p_in, rel_tol=1e-12)
    out = drive.outputs[0]
    i_out = [s.id for s in drive.shafts].index(out.shaft)
    t_out = result.train.port_torque[(out.shaft, out.element)]
    assert math.isclose(-t_out * result.train.speed[i_out], p_out, rel_tol=1e-12)


@SETTINGS
@given(drives())
def test_lossless_meshes_conserve_power(drive):
    lossless = Drive(drive.shafts, tuple(Mesh(m.id, m.gears, 1.0) for m in drive.meshes), drive.input,
                     drive.outputs, drive.speed, drive.housing)
    result = solve(lossless)
    assert math.isclose(result.train.power_out, result.train.power_in, rel_tol=1e-12)
    for sr in result.shafts:
        assert math.isclose(sr.power, result.train.power_in, rel_tol=1e-9)


def test_single_mesh_loses_one_minus_eta_of_the_input():
    # Closed form: P_lost = (1 - eta) P_in for one mesh (definition of mesh efficiency).
    pin = Shaft("in", (Section(0.3, 0.04),), (Support("A", 0.0, "locating"), Support("B", 0.3)),
                gears=(Gear("p", 0.15, 0.04, teeth=20),), couplings=(Coupling("m", 0.0),))
    out = Shaft("out", (Section(0.3, 0.05),), (Support("A", 0.0, "locating"), Support("B", 0.3)),
                origin=(0.0, 0.16, 0.0), gears=(Gear("g", 0.15, 0.12, teeth=60),), couplings=(Coupling("c", 0.3),))
    drive = Drive((pin, out), (Mesh("m", ("p", "g"), 0.97),), Port("in", "m", power=4000.0), (Port("out", "c"),),
                  speed=150.0)
    r = solve(drive)
    assert math.isclose(r.train.power_in - r.train.power_out, 0.03 * 4000.0, rel_tol=1e-12)
    assert math.isclose(r.train.speed[1], -50.0, rel_tol=1e-12)       # external mesh reverses, 20/60

"""Closed forms, limit cases and input checks of loadscope.kernel.gears.

Tolerance: 1e-12 relative for closed forms (the kernel evaluates the same
trigonometry; only round-off differs); 5e-3 relative against a textbook
example printed to three significant figures (half a unit in the third figure
is at most 0.5 %).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from loadscope.errors import InputError
from loadscope.kernel.gears import bevel_mesh_forces, bevel_tooth_force, cylindrical_tooth_force, mesh_forces

RTOL = 1e-12
deg = math.radians


# --------------------------------------------------------------------------------------------
# Magnitudes.
# Source: Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed.:
#   Eq. 13-36 (spur):    W_r = W_t tan(phi),  W = W_t / cos(phi)
#   Eq. 13-39 (helical): W_r = W sin(phi_n), W_t = W cos(phi_n) cos(psi), W_a = W cos(phi_n) sin(psi)
# ISO 6336-1:2019, 6.1: nominal tangential load F_t = 2000 T / d  (T in N*m, d in mm).
# --------------------------------------------------------------------------------------------
def test_iso_6336_tangential_load():
    T, d_mm = 350.0, 125.0                               # N*m, reference diameter in mm
    f = mesh_forces(T, d_mm / 2000.0, deg(20.0))          # pitch radius in m
    assert float(f.tangential) == pytest.approx(2000.0 * T / d_mm, rel=RTOL)


def test_spur_closed_form_eq_13_36():
    T, r, phi = 100.0, 0.05, deg(20.0)
    f = mesh_forces(T, r, phi)
    wt = T / r
    assert float(f.tangential) == pytest.approx(wt, rel=RTOL)
    assert float(f.radial) == pytest.approx(wt * math.tan(phi), rel=RTOL)
    assert float(f.axial) == 0.0
    assert float(f.total) == pytest.approx(wt / math.cos(phi), rel=RTOL)


@pytest.mark.parametrize("phi_n, psi", [(20.0, 15.0), (14.5, 30.0), (25.0, 45.0), (10.0, 0.5)])
def test_helical_closed_form_eq_13_39(phi_n, psi):
    phi_n, psi = deg(phi_n), deg(psi)
    T, r = 240.0, 0.071
    f = mesh_forces(T, r, phi_n, psi)
    W = float(f.total)
    # Eq. 13-39 written from the total force W
    assert float(f.radial) == pytest.approx(W * math.sin(phi_n), rel=RTOL)
    assert float(f.tangential) == pytest.approx(W * math.cos(phi_n) * math.cos(psi), rel=RTOL)
    assert float(f.axial) == pytest.approx(W * math.cos(phi_n) * math.sin(psi), rel=RTOL)
    # transverse pressure angle: tan(phi_t) = tan(phi_n) / cos(psi) (Shigley Eq. 13-19)
    phi_t = math.atan(math.tan(phi_n) / math.cos(psi))
    assert float(f.radial) == pytest.approx(float(f.tangential) * math.tan(phi_t), rel=RTOL)


def test_shigley_example_13_8_from_memory():
    """Shigley 9th ed., Example 13-8 (recalled from memory, US units): a 1 hp motor at 1800 rev/min
    drives an 18-tooth helical pinion, P_n = 12 teeth/in, phi_n = 20 deg, psi = 30 deg.
    Book: d = 1.732 in, V = 816 ft/min, W_t = 40.4 lbf, W_r = 17.0 lbf, W_a = 23.3 lbf, W = 49.6 lbf.
    Tolerance 5e-3: the book prints three significant figures."""
    psi = deg(30.0)
    d = 18 / (12 * math.cos(psi))                        # in
    V = math.pi * d * 1800 / 12                          # ft/min
    wt = 33000 * 1.0 / V                                 # lbf
    T = wt * d / 2                                       # lbf*in, so pitch radius in inches below
    f = mesh_forces(T, d / 2, deg(20.0), psi)
    assert d == pytest.approx(1.732, rel=5e-3) and V == pytest.approx(816, rel=5e-3)
    assert float(f.tangential) == pytest.approx(40.4, rel=5e-3)
    assert float(f.radial) == pytest.approx(17.0, rel=5e-3)
    assert float(f.axial) == pytest.approx(23.3, rel=5e-3)
    assert float(f.total) == pytest.approx(49.6, rel=5e-3)


def test_helix_zero_is_spur():
    a = mesh_forces(75.0, 0.04, deg(20.0), 0.0)
    b = mesh_forces(75.0, 0.04, deg(20.0))
    for name in ("tangential", "radial", "axial", "total"):
        assert float(getattr(a, name)) == float(getattr(b, name))
    # and the limit psi -> 0 is continuous
    c = mesh_forces(75.0, 0.04, deg(20.0), 1e-9)
    assert float(c.radial) == pytest.approx(float(b.radial), rel=1e-12)
    assert float(c.axial) == pytest.approx(0.0, abs=1e-9 * float(b.tangential))


def test_torque_sign_ignored():
    a, b = mesh_forces(-75.0, 0.04, deg(20.0), deg(10)), mesh_forces(75.0, 0.04, deg(20.0), deg(10))
    assert float(a.tangential) == float(b.tangential) and float(a.axial) == float(b.axial)


def test_broadcasting():
    torque = np.array([[10.0], [20.0], [30.0]])            # (3, 1)
    psi = np.radians([0.0, 10.0, 20.0, 30.0])              # (4,)
    f = mesh_forces(torque, 0.05, deg(20.0), psi)
    assert f.tangential.shape == f.radial.shape == f.axial.shape == f.total.shape == (3, 4)
    for i in range(3):
        for j in range(4):
            g = mesh_forces(float(torque[i, 0]), 0.05, deg(20.0), float(psi[j]))
            assert f.axial[i, j] == pytest.approx(float(g.axial), rel=RTOL, abs=0.0)
            assert f.radial[i, j] == pytest.approx(float(g.radial), rel=RTOL)
    b = bevel_mesh_forces([50.0, 100.0], 0.05, deg(20.0), np.radians([[30.0], [45.0], [60.0]]))
    assert b.radial.shape == (3, 2)


# --------------------------------------------------------------------------------------------
# Straight bevel. Source: Shigley 9th ed., Eq. 13-38: W_r = W_t tan(phi) cos(gamma),
# W_a = W_t tan(phi) sin(gamma), at the mean radius; W = W_t / cos(phi).
# --------------------------------------------------------------------------------------------
@pytest.mark.parametrize("gamma", [5.0, 18.43, 45.0, 71.57, 85.0])
def test_bevel_eq_13_38(gamma):
    g, phi = deg(gamma), deg(20.0)
    T, rm = 60.0, 0.035
    f = bevel_mesh_forces(T, rm, phi, g)
    wt = T / rm
    assert float(f.radial) == pytest.approx(wt * math.tan(phi) * math.cos(g), rel=RTOL)
    assert float(f.axial) == pytest.approx(wt * math.tan(phi) * math.sin(g), rel=RTOL)
    assert float(f.total) == pytest.approx(math.sqrt(wt**2 + f.radial**2 + f.axial**2), rel=RTOL)


def test_bevel_pair_at_right_angles_swaps_radial_and_axial():
    """Shafts at 90 deg: gamma_p + gamma_g = 90 deg, so the pinion's radial force is the gear's
    axial force and vice versa (Shigley Sec. 13-15, Fig. 13-35)."""
    gp = deg(18.43)
    p = bevel_mesh_forces(60.0, 0.035, deg(20.0), gp)
    g = bevel_mesh_forces(60.0 * 3, 0.035 * 3, deg(20.0), deg(90.0) - gp)
    assert float(p.radial) == pytest.approx(float(g.axial), rel=RTOL)
    assert float(p.axial) == pytest.approx(float(g.radial), rel=RTOL)


# --------------------------------------------------------------------------------------------
# Vector forms.
# --------------------------------------------------------------------------------------------
def _rand_frame(rng):
    a = rng.normal(size=3)
    a /= np.linalg.norm(a)
    r = np.cross(a, rng.normal(size=3))
    r /= np.linalg.norm(r)
    return a, r


@settings(max_examples=100, deadline=None)
@given(st.floats(1.0, 1e5), st.floats(10.0, 35.0), st.floats(0.0, 45.0), st.sampled_from([-1.0, 0.0, 1.0]),
       st.sampled_from([-1.0, 1.0]), st.booleans(), st.integers(0, 2**32 - 1))
def test_cylindrical_vector_matches_magnitudes(wt, phi, psi, hand, s, internal, seed):
    """|F| = total, and its parts along t, r, a are tangential, radial, axial of mesh_forces."""
    if hand == 0.0:
        psi = 0.0
    phi, psi = deg(phi), deg(psi)
    a, r = _rand_frame(np.random.default_rng(seed))
    F = cylindrical_tooth_force(wt, a, r, s, phi, psi, hand, internal)
    m = mesh_forces(wt, 1.0, phi, psi)      # torque wt on a 1 m radius gives W_t = wt
    t = np.cross(a, r)
    assert np.linalg.norm(F) == pytest.approx(float(m.total), rel=1e-12)
    assert F @ t == pytest.approx(s * wt, rel=1e-12)
    assert abs(F @ a) == pytest.approx(float(m.axial), rel=1e-12, abs=1e-12 * wt)
    # radial: toward the axis for an external gear, away from it for a ring gear
    assert F @ r == pytest.approx((1.0 if internal else -1.0) * float(m.radial), rel=1e-12)


def test_axial_sign_follows_hand():
    a, r = np.array([1.0, 0, 0]), np.array([0.0, 1, 0])
    right = cylindrical_tooth_force(1000.0, a, r, 1.0, deg(20), deg(20), 1.0)
    left = cylindrical_tooth_force(1000.0, a, r, 1.0, deg(20), deg(20), -1.0)
    assert right[0] == pytest.approx(-left[0], rel=RTOL) and right[0] != 0.0
    np.testing.assert_allclose(right[1:], left[1:], rtol=RTOL)
    # reversing the tangential load also flips the thrust (the tooth normal is fixed)
    back = cylindrical_tooth_force(1000.0, a, r, -1.0, deg(20), deg(20), 1.0)
    assert back[0] == pytest.approx(-right[0], rel=RTOL)


def test_thrust_on_a_right_hand_driver():
    """Geometry of the tooth normal: a right-hand tooth line runs along cos(psi) a + sin(psi) t;
    a driver whose pitch point moves along +t is pushed back by the driven tooth along
    -(cos(psi) t - sin(psi) a), i.e. its thrust points along +a. This is the catalogue rule
    "right-hand driver: curl the right hand's fingers with the rotation, the thumb gives the
    thrust on the driver" (e.g. KHK gear technical reference, thrust of helical gears; stated
    from memory, derived here)."""
    a, r = np.array([1.0, 0, 0]), np.array([0.0, 1, 0])
    # driver rotating +omega about +x: its pitch point moves along t = a x r = +z; the load on it
    # acts against the motion (s = -1)
    F = cylindrical_tooth_force(1000.0, a, r, -1.0, deg(20), deg(30), 1.0)
    assert F[0] > 0.0
    line = math.cos(deg(30)) * a + math.sin(deg(30)) * np.cross(a, r)
    assert F @ line == pytest.approx(0.0, abs=1e-9)    # no force along the tooth line (no friction)


def test_hand_is_independent_of_axis_sense():
    """Handedness is a property of the helix: describing the same gear with -a (and so -t) must
    give the same force vector."""
    a, r = np.array([1.0, 0, 0]), np.array([0.0, 0.6, 0.8])
    F1 = cylindrical_tooth_force(700.0, a, r, 1.0, deg(20), deg(25), 1.0)
    F2 = cylindrical_tooth_force(700.0, -a, r, -1.0, deg(20), deg(25), 1.0)
    np.testing.assert_allclose(F1, F2, rtol=RTOL, atol=RTOL * 700)


def test_internal_gear_radial_outward():
    a, r = np.array([0.0, 0, 1]), np.array([1.0, 0, 0])
    ext = cylindrical_tooth_force(500.0, a, r, 1.0, deg(20))
    ring = cylindrical_tooth_force(500.0, a, r, 1.0, deg(20), internal=True)
    assert ext @ r == pytest.approx(-500 * math.tan(deg(20)), rel=RTOL)
    assert ring @ r == pytest.approx(500 * math.tan(deg(20)), rel=RTOL)


@settings(max_examples=60, deadline=None)
@given(st.floats(1.0, 1e5), st.floats(10.0, 35.0), st.floats(1.0, 89.0), st.sampled_from([-1.0, 1.0]),
       st.integers(0, 2**32 - 1))
def test_bevel_vector_matches_magnitudes(wt, phi, gamma, s, seed):
    phi, gamma = deg(phi), deg(gamma)
    a, r = _rand_frame(np.random.default_rng(seed))
    F = bevel_tooth_force(wt, a, r, s, phi, gamma)
    m = bevel_mesh_forces(wt, 1.0, phi, gamma)
    assert np.linalg.norm(F) == pytest.approx(float(m.total), rel=1e-12)
    assert F @ a == pytest.approx(float(m.axial), rel=1e-12)          # away from the apex
    assert F @ r == pytest.approx(-float(m.radial), rel=1e-12)        # toward the gear's axis
    assert F @ np.cross(a, r) == pytest.approx(s * wt, rel=1e-12)
    # Eq. 13-38 ratios
    assert (F @ a) / wt == pytest.approx(math.tan(phi) * math.sin(gamma), rel=1e-12)
    assert -(F @ r) / wt == pytest.approx(math.tan(phi) * math.cos(gamma), rel=1e-12)


# --------------------------------------------------------------------------------------------
# Bad inputs name the argument and the accepted range.
# --------------------------------------------------------------------------------------------
@pytest.mark.parametrize("call, path, accepted", [
    (lambda: mesh_forces(10.0, 0.0, deg(20)), "pitch_radius", "> 0 m"),
    (lambda: mesh_forces(10.0, [0.05, -0.01], deg(20)), "pitch_radius", "> 0 m"),
    (lambda: mesh_forces(10.0, 0.05, deg(5)), "pressure_angle", "10 to 35 deg"),
    (lambda: mesh_forces(10.0, 0.05, deg(40)), "pressure_angle", "10 to 35 deg"),
    (lambda: mesh_forces(10.0, 0.05, deg(20), deg(50)), "helix_angle", "0 to 45 deg"),
    (lambda: mesh_forces(10.0, 0.05, deg(20), -deg(5)), "helix_angle", "0 to 45 deg"),
    (lambda: mesh_forces(float("nan"), 0.05, deg(20)), "torque", "finite numbers"),
    (lambda: mesh_forces(10.0, float("inf"), deg(20)), "pitch_radius", "finite numbers"),
    (lambda: bevel_mesh_forces(10.0, -0.05, deg(20), deg(45)), "mean_radius", "> 0 m"),
    (lambda: bevel_mesh_forces(10.0, 0.05, deg(20), deg(0.5)), "cone_angle", "1 to 89 deg"),
    (lambda: bevel_mesh_forces(10.0, 0.05, deg(20), deg(90)), "cone_angle", "1 to 89 deg"),
    (lambda: bevel_mesh_forces(10.0, 0.05, deg(36), deg(45)), "pressure_angle", "10 to 35 deg"),
])
def test_bad_inputs(call, path, accepted):
    with pytest.raises(InputError) as e:
        call()
    assert e.value.path == path
    assert e.value.accepted == accepted
    assert str(e.value).startswith(f"{path}: ") and f"(accepted: {accepted})" in str(e.value)


def test_bad_input_message_shows_value_in_degrees():
    with pytest.raises(InputError, match=r"pressure_angle: is out of range, got 40 deg \(accepted: 10 to 35 deg\)"):
        mesh_forces(10.0, 0.05, deg(40))

"""Bolt-group loads against independent references.

(a) The elastic method is the minimum-norm statically admissible solution.
    For n equal bolts at r_i (in the mounting plane, measured from the group
    centroid, so sum r_i = 0), minimise (1/2) sum |f_i|^2 subject to
    sum f_i = F and sum r_i x f_i = M. Lagrange: f_i = lam + mu x r_i, a rigid
    body "velocity field" of the plate. Split mu = mu_n n + mu_t (mu_t in the
    plane):
      * lam in the plane -> the direct shear F_s / n (sum r_i = 0 decouples it);
      * mu_n n x r_i     -> torsional shear, perpendicular to r_i and
                            proportional to |r_i|, mu_n = M_n / sum r^2;
      * lam along n      -> the equal axial share F_n / n;
      * mu_t x r_i       -> along n and linear in r_i: the linear axial
                            distribution, mu_t from the group's second moments.
    That is exactly the elastic method (Shigley 9th ed. Sec. 8-12 for the
    shear part; the axial part is the same argument one dimension up). The
    equivalence needs the bolts coplanar (r_i x in-plane forces then lie along
    n and r_i x axial forces in the plane, so shear and axial decouple) and
    the moment taken about the centroid. The reference is numpy's
    ``lstsq`` on the 6 x 3n equilibrium system, whose answer for an
    underdetermined consistent system is the minimum-norm solution.
    Tolerance 1e-9 relative to the largest bolt force: both are exact linear
    algebra, round-off is ~1e-14.
(b) Shigley's worked example of an eccentrically loaded bolt group (primary
    and secondary shear), numbers from memory; tolerance 5e-3 relative for the
    book's three significant figures.
(c) The tipping-edge variant against a closed form derived below.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from loadscope.errors import MechanismError
from loadscope.kernel.bolts import bolt_loads


def _skew(r):
    return np.array([[0.0, -r[2], r[1]], [r[2], 0.0, -r[0]], [-r[1], r[0], 0.0]])


def min_norm_bolt_forces(positions, force, moment):
    """Bolt forces of least sum of squares that balance force and moment (about the centroid):
    np.linalg.lstsq on A x = b, A = [[I I ... I], [[r_1]x ... [r_n]x]] (6 x 3n)."""
    p = np.asarray(positions, dtype=float)
    r = p - p.mean(axis=0)
    a = np.zeros((6, 3 * len(p)))
    for i, ri in enumerate(r):
        a[:3, 3 * i:3 * i + 3] = np.eye(3)
        a[3:, 3 * i:3 * i + 3] = _skew(ri)
    x, *_ = np.linalg.lstsq(a, np.concatenate([force, moment]), rcond=None)
    return x.reshape(-1, 3), a


def _unit(v):
    v = np.asarray(v, dtype=float)
    return v / np.linalg.norm(v)


coord = st.floats(-0.5, 0.5, allow_nan=False)
load = st.floats(-1e4, 1e4, allow_nan=False)


# --------------------------------------------------------------------------------------------
# (a) elastic method == minimum-norm solution (random patterns, planes and loads)
# --------------------------------------------------------------------------------------------
@settings(max_examples=150, deadline=None)
@given(st.lists(st.tuples(coord, coord), min_size=3, max_size=10),
       st.tuples(load, load, load), st.tuples(load, load, load),
       st.tuples(st.floats(-1, 1), st.floats(-1, 1), st.floats(-1, 1)),
       st.tuples(coord, coord, coord))
def test_elastic_is_minimum_norm(uv, force, moment, normal, origin):
    n_vec = np.asarray(normal, dtype=float)
    assume(np.linalg.norm(n_vec) > 0.1)
    n_vec = _unit(n_vec)
    u = _unit(np.cross(n_vec, [0.3, 0.5, 0.7]) if abs(n_vec @ _unit([0.3, 0.5, 0.7])) < 0.99
              else np.cross(n_vec, [1.0, 0.0, 0.0]))
    v = np.cross(n_vec, u)
    q = np.asarray(uv)
    # a pattern that is not (nearly) on one line: both principal second moments non-zero
    qc = q - q.mean(axis=0)
    ev = np.linalg.eigvalsh(qc.T @ qc)
    assume(ev[0] > 1e-3 * max(ev[1], 1e-12) and ev[1] > 1e-6)
    pos = np.asarray(origin) + q[:, :1] * u + q[:, 1:] * v
    b = bolt_loads(pos, n_vec, force, moment)
    ref, a = min_norm_bolt_forces(pos, np.asarray(force), np.asarray(moment))
    scale = max(np.abs(ref).max(), 1e-9)
    np.testing.assert_allclose(b.force, ref, rtol=0, atol=1e-9 * scale)
    # the reference does satisfy equilibrium (a consistent system), and so does the kernel
    np.testing.assert_allclose(a @ ref.ravel(), np.concatenate([force, moment]), atol=1e-9 * max(
        np.abs(force).max(), np.abs(moment).max(), 1.0))
    # residual is a sum of bolt forces: its round-off scales with them (a pure moment makes
    # large bolt forces that cancel), not with the applied force alone
    assert np.abs(b.residual_force).max() <= 1e-9 * max(np.abs(force).max(), scale, 1.0)
    # tension/shear split of the same forces
    np.testing.assert_allclose(b.tension, -(ref @ n_vec), atol=1e-9 * scale)
    shear = ref - np.outer(ref @ n_vec, n_vec)
    np.testing.assert_allclose(b.shear, np.linalg.norm(shear, axis=1), atol=1e-9 * scale)


def test_elastic_is_minimum_norm_on_one_line():
    """Bolts on one line with no moment about that line: the system is rank-deficient, lstsq still
    gives the minimum-norm solution and the elastic method must agree."""
    pos = np.array([[0.0, 0.0, -0.2], [0.0, 0.0, 0.05], [0.0, 0.0, 0.3]])
    force = np.array([300.0, -800.0, 150.0])
    moment = np.array([90.0, 45.0, 0.0])         # about x (in-plane, across the line) and the normal y
    b = bolt_loads(pos, [0, 1, 0], force, moment)
    ref, _ = min_norm_bolt_forces(pos, force, moment)
    np.testing.assert_allclose(b.force, ref, rtol=0, atol=1e-9 * np.abs(ref).max())
    with pytest.raises(MechanismError, match="stand on one line"):
        bolt_loads(pos, [0, 1, 0], force, [0.0, 0.0, 10.0])     # moment about the line itself


# --------------------------------------------------------------------------------------------
# (b) Shigley's Mechanical Engineering Design, 9th ed., Example 8-7 (numbers from memory):
# a 15 x 200 mm bar is bolted to a channel by four tightly fitted bolts A, B, C, D at the corners of
# a 150 x 120 mm rectangle (+-75 mm, +-60 mm about the centroid O); F = 16 kN acts downward
# 300 + 50 + 75 = 425 mm from O. Book: M = 16(425) = 6800 N*m, r = 96.0 mm for every bolt,
# primary shear F' = 4 kN, secondary F'' = M r / (4 r^2) = 17.7 kN; resultants 21.0 kN on the
# two bolts nearer the load and 14.8 kN on the other two.
# Tolerance 5e-3 relative: the book prints three significant figures.
# --------------------------------------------------------------------------------------------
def test_shigley_example_8_7_from_memory():
    pos = np.array([[-0.075, 0.060, 0.0], [0.075, 0.060, 0.0], [0.075, -0.060, 0.0], [-0.075, -0.060, 0.0]])
    F = 16e3
    load_point = np.array([0.425, 0.0, 0.0])
    # what the bolts must exert on the bar: +F up, and the opposite of the load's moment about O
    moment = -np.cross(load_point, [0.0, -F, 0.0])
    assert moment[2] == pytest.approx(6800.0, rel=1e-12)            # M = 6800 N*m
    b = bolt_loads(pos, [0, 0, 1], [0.0, F, 0.0], moment)
    r = np.linalg.norm(pos, axis=1)
    assert r == pytest.approx([0.0960] * 4, rel=5e-3)
    primary = np.array([0.0, F / 4, 0.0])
    secondary = np.linalg.norm(b.force - primary, axis=1)
    assert secondary == pytest.approx([17.7e3] * 4, rel=5e-3)
    near = pos[:, 0] > 0
    assert b.shear[near] == pytest.approx([21.0e3] * 2, rel=5e-3)
    assert b.shear[~near] == pytest.approx([14.8e3] * 2, rel=5e-3)
    # secondary shear is perpendicular to the radius (torsion of the group)
    assert np.abs(np.sum((b.force - primary) * pos, axis=1)).max() <= 1e-9 * F


# --------------------------------------------------------------------------------------------
# (c) Tipping-edge variant: a hand calculation.
#
# Mounting plane y = 0, normal n = +y; two rows of two bolts, row 1 at x = 0.05 m, row 2 at
# x = 0.35 m, z = +-0.1 m; centroid c = (0.2, 0, 0). Tipping edge: the foot's edge x = 0,
# along ed = +z, so side = n x ed = +x and the bolt distances from the edge are d = 0.05, 0.35 m.
# The bolts (with the foot) must exert on the housing F = (Fx, W, 0) and, about c,
# M = (0, Mt, -M0): M0 > 0 tips the housing up about the edge (x > 0 lifts).
#
#  * in-plane shear, elastic as always: Fx / 4 each, plus the twist Mt (n x r_i) / sum r^2;
#  * normal force shared equally: axial W / 4 each (along +n);
#  * moment about the edge line the bolts + edge must supply:
#      m_edge = [M + (c - e0) x F] . ed = -M0 + 0.2 W
#    of which the equal shares give sum (W/4) d_i = W (2*0.05 + 2*0.35) / 4 = 0.2 W and the
#    in-plane shears nothing (in-plane lever x in-plane force lies along n);
#  * the rest, -M0, by bolt tensions t_i = k d_i (each gives -t_i d_i about ed; the edge line
#    contact gives nothing about itself): k sum d^2 = M0, sum d^2 = 2 (0.05^2 + 0.35^2) = 0.25,
#      k = 4 M0,  tension_i = k d_i - W / 4  ->  row 1: 0.2 M0 - W/4,  row 2: 1.4 M0 - W/4;
#  * the edge takes the compression: contact force k sum d = 4 M0 * 0.8 = 3.2 M0 along +n,
#    and no moment about the edge line.
# With W = 0 this is the textbook rule t_i = M d_i / sum d^2 for a base tipping about its edge.
# --------------------------------------------------------------------------------------------
TIP_POS = np.array([[0.05, 0.0, 0.1], [0.05, 0.0, -0.1], [0.35, 0.0, 0.1], [0.35, 0.0, -0.1]])


@pytest.mark.parametrize("W", [0.0, 400.0, -300.0])
def test_tipping_two_rows_hand_calculation(W):
    M0, Fx, Mt = 1000.0, 600.0, 80.0
    b = bolt_loads(TIP_POS, [0, 1, 0], [Fx, W, 0.0], [0.0, Mt, -M0], method="tipping",
                   edge_point=[0.0, 0.0, 0.0], edge_direction=[0.0, 0.0, 1.0])
    t_row1, t_row2 = 0.2 * M0 - W / 4, 1.4 * M0 - W / 4
    np.testing.assert_allclose(b.tension, [t_row1, t_row1, t_row2, t_row2], rtol=1e-12, atol=1e-12 * M0)
    # shear: same as the elastic method
    el = bolt_loads(TIP_POS, [0, 1, 0], [Fx, W, 0.0], [0.0, Mt, -M0])
    np.testing.assert_allclose(b.shear, el.shear, rtol=1e-12)
    # what is left for the edge: a compressive force 3.2 M0 along +n and nothing else about the edge
    contact = -b.residual_force
    np.testing.assert_allclose(contact, [0.0, 3.2 * M0, 0.0], atol=1e-9 * M0)
    about_edge = b.residual_moment + np.cross(b.centroid - 0.0, b.residual_force)
    assert about_edge[2] == pytest.approx(0.0, abs=1e-9 * M0)


def test_tipping_no_lift():
    """A moment that presses the far side down (M0 < 0) does not tip the housing: no tension
    from it (k = 0), only the equal normal shares."""
    b = bolt_loads(TIP_POS, [0, 1, 0], [0.0, -800.0, 0.0], [0.0, 0.0, 500.0], method="tipping",
                   edge_point=[0.0, 0.0, 0.0], edge_direction=[0.0, 0.0, 1.0])
    np.testing.assert_allclose(b.tension, [200.0] * 4, rtol=1e-12)


def test_tipping_without_bolts_beyond_the_edge_is_a_mechanism():
    with pytest.raises(MechanismError, match="no bolt stands on the far side of the tipping edge"):
        bolt_loads(TIP_POS, [0, 1, 0], [0.0, 0.0, 0.0], [0.0, 0.0, -1000.0], method="tipping",
                   edge_point=[0.4, 0.0, 0.0], edge_direction=[0.0, 0.0, 1.0])


@settings(max_examples=100, deadline=None)
@given(st.tuples(load, load, load), st.tuples(load, load, load), st.floats(-0.3, 0.0),
       st.floats(-math.pi, math.pi))
def test_tipping_leaves_the_edge_a_line_force(force, moment, edge_x, angle):
    """Whatever the load, after the bolts take their share the tipping edge (a line contact) is
    left a force only: the residual has no moment about the edge line (it did before the fix,
    by F_n times the centroid's distance from the edge, whenever the normal force was not 0)."""
    ed = np.array([math.cos(angle) * 0.3, 0.0, 1.0])
    ed /= np.linalg.norm(ed)
    e0 = np.array([edge_x, 0.0, 0.0])
    b = bolt_loads(TIP_POS, [0, 1, 0], force, moment, method="tipping", edge_point=e0, edge_direction=ed)
    side = np.cross([0, 1, 0], ed)
    d = (TIP_POS - e0) @ side
    scale = max(np.abs(force).max() * 1.0, np.abs(moment).max(), 1.0)
    about_edge = (b.residual_moment + np.cross(b.centroid - e0, b.residual_force)) @ ed
    lifting = (np.asarray(moment) + np.cross(b.centroid - e0, force)) @ ed - force[1] * d.mean() < 0
    if lifting:
        assert abs(about_edge) <= 1e-9 * scale
        assert -b.residual_force[1] >= -1e-9 * scale       # the edge pushes, never pulls
    np.testing.assert_allclose(b.residual_force[[0, 2]], 0.0, atol=1e-9 * scale)   # shear all in bolts

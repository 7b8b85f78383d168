"""Shaft statics against an independent 3D frame solver: PyNite (PyNiteFEA).

Source of the reference: PyNite ``FEModel3D`` (direct stiffness method, 3D
frame members). Its member stiffness (``Member3D._ke_unc``) is the classical
12x12 Euler-Bernoulli matrix (12EI/L^3, 6EI/L^2, 4EI/L, 2EI/L; no shear
area, no Timoshenko term), the same beam theory as loadscope. With nodes at
every station and only nodal loads, both models are exact solutions of the
same problem: the answers differ by round-off only.

Tolerance: 1e-6 relative, as the brief asks, each quantity measured on the
scale of its own largest magnitude over the shaft (so components that are
zero in theory are held to 1e-6 of the peak). The observed agreement is
1e-12 or better (round-off in PyNite's stiffness solve, EA/L next to
EI/L^3); a modelling slip (sign, lever arm, frame, a missing couple) shows
up as an O(1) difference.

Mapping between the two models (checked from PyNite's source):

* supports: PyNite restrains global DOFs, so the shafts here run along a
  global axis; a radial bearing restrains the two transverse translations, a
  locating bearing also the axial one. Torsion is restrained at one node only;
  the applied torques balance, so that reaction must come out ~0.
* ``node.RxnF*`` are forces the support exerts on the structure: loadscope's
  ``reactions_global``.
* ``member.F()`` (global end forces, 12x1) are the forces the nodes exert on
  the member. The loads left of a cut just right of station k therefore add up
  to the i-end force of the member starting at k; just left of station k+1 to
  minus the j-end force of the member ending there. With (F_l, M_l) that
  resultant (moment about the cut point), loadscope's convention (shafts.py
  docstring) reads N = -F_l.a, V1 = F_l.e1, V2 = F_l.e2, M1 = -M_l.e2,
  M2 = M_l.e1, T = M_l.a.
* PyNite's own diagrams (member along +x: local y = +Y, local z = +Z):
  ``moment('Mz', x) = Mz_i - Fy_i x`` is the moment about local z of the loads
  left of the cut, so M1 = -Mz; ``moment('My', x)`` is minus their moment about
  local y, so M2 = -My; ``shear('Fy')`` = V1, ``shear('Fz')`` = V2.
* slopes: a small rotation theta (global) turns the axis a into a + theta x a,
  so v1' = theta.e2 and v2' = -theta.e1; twist phi = theta.a.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from loadscope.kernel.gears import cylindrical_tooth_force, mesh_forces
from loadscope.kernel.model import Section, Shaft, Support
from loadscope.kernel.shafts import local_frame, solve_shaft

pynite = pytest.importorskip("Pynite")

RTOL = 1e-6
COMBO = "Combo 1"
DOF_F = ("FX", "FY", "FZ")
DOF_M = ("MX", "MY", "MZ")


# --------------------------------------------------------------------------------------------
# PyNite model of a loadscope shaft
# --------------------------------------------------------------------------------------------
def _axis_index(axis) -> int:
    a = np.asarray(axis, dtype=float)
    k = int(np.argmax(np.abs(a)))
    assert np.allclose(np.abs(a), np.eye(3)[k]), "PyNite supports restrain global DOFs: use a global axis"
    return k


class PyniteShaft:
    """The shaft as a PyNite frame: nodes at every station, one member per segment, forces
    applied at their real points (a pitch-point load hangs on a radial arm member)."""

    def __init__(self, shaft: Shaft, point_loads, axis_moments, torsion_at: float):
        """point_loads: (s, offset (3,), force (3,)) with offset from the axis point (global);
        axis_moments: (s, moment (3,)) applied at the axis point (e.g. coupling torque)."""
        self.shaft = shaft
        self.frame = local_frame(shaft.axis)
        self.k_ax = _axis_index(shaft.axis)
        self.origin = np.asarray(shaft.origin, dtype=float)
        bounds = np.concatenate([[0.0], np.cumsum([sec.length for sec in shaft.sections])])
        pos = [*bounds, *(sp.at for sp in shaft.supports), *(p[0] for p in point_loads),
               *(p[0] for p in axis_moments), torsion_at]
        self.stations = np.unique(np.round(pos, 12))
        m = pynite.FEModel3D()
        self.model = m
        m.add_material("steel", shaft.E, shaft.G, shaft.E / (2 * shaft.G) - 1.0, 7850.0)
        for i, sec in enumerate(shaft.sections):
            ii = sec.second_moment
            m.add_section(f"sec{i}", sec.area, ii, ii, 2.0 * ii)       # J = 2I for a (hollow) circle
        m.add_section("arm", 1e-2, 1e-5, 1e-5, 2e-5)                  # statically determinate: any stiffness
        for j, s in enumerate(self.stations):
            m.add_node(f"n{j}", *self._point(s))
        for j in range(len(self.stations) - 1):
            mid = 0.5 * (self.stations[j] + self.stations[j + 1])
            isec = min(int(np.searchsorted(bounds, mid) - 1), len(shaft.sections) - 1)
            m.add_member(f"m{j}", f"n{j}", f"n{j + 1}", "steel", f"sec{isec}")
        for sp in shaft.supports:
            flags = [True, True, True]
            flags[self.k_ax] = sp.axial == "locating"
            assert sp.axial in ("locating", "floating")
            rot = [False, False, False]
            if abs(sp.at - torsion_at) < 1e-12:
                rot[self.k_ax] = True
            m.def_support(self.node(sp.at), *flags, *rot)
        if not any(abs(sp.at - torsion_at) < 1e-12 for sp in shaft.supports):
            rot = [False, False, False]
            rot[self.k_ax] = True
            m.def_support(self.node(torsion_at), False, False, False, *rot)
        self.torsion_node = self.node(torsion_at)
        for i, (s, offset, force) in enumerate(point_loads):
            if np.linalg.norm(offset) > 0:
                name = m.add_node(f"p{i}", *(self._point(s) + np.asarray(offset)))
                m.add_member(f"arm{i}", self.node(s), name, "steel", "arm")
            else:
                name = self.node(s)
            for d, v in zip(DOF_F, force):
                if v:
                    m.add_node_load(name, d, float(v))
        for s, moment in axis_moments:
            for d, v in zip(DOF_M, moment):
                if v:
                    m.add_node_load(self.node(s), d, float(v))
        m.analyze_linear()

    def _point(self, s):
        return self.origin + s * self.frame[0]

    def node(self, s) -> str:
        return f"n{int(np.argmin(np.abs(self.stations - s)))}"

    def reaction(self, s):
        n = self.model.nodes[self.node(s)]
        return np.array([n.RxnFX[COMBO], n.RxnFY[COMBO], n.RxnFZ[COMBO]])

    def torsion_reaction(self):
        n = self.model.nodes[self.torsion_node]
        return np.array([n.RxnMX[COMBO], n.RxnMY[COMBO], n.RxnMZ[COMBO]]) @ self.frame[0]

    def displacement(self):
        """(n, 2) v1, v2 and (n, 2) slopes v1', v2' and (n,) twist at the stations."""
        a, e1, e2 = self.frame
        u, th = [], []
        for j in range(len(self.stations)):
            n = self.model.nodes[f"n{j}"]
            u.append([n.DX[COMBO], n.DY[COMBO], n.DZ[COMBO]])
            th.append([n.RX[COMBO], n.RY[COMBO], n.RZ[COMBO]])
        u, th = np.array(u), np.array(th)
        return np.column_stack([u @ e1, u @ e2]), np.column_stack([th @ e2, -(th @ e1)]), th @ a

    def internal(self):
        """(n, 2, 6) [left, right] x [N, V1, V2, M1, M2, T] at every station, from member end
        forces (see the module docstring)."""
        a, e1, e2 = self.frame
        out = np.zeros((len(self.stations), 2, 6))

        def q(fl, ml):
            return [-(fl @ a), fl @ e1, fl @ e2, -(ml @ e2), ml @ e1, ml @ a]

        for j in range(len(self.stations) - 1):
            sub = next(iter(self.model.members[f"m{j}"].sub_members.values()))
            f = sub.F(COMBO).ravel()
            out[j, 1] = q(f[0:3], f[3:6])            # just right of station j
            out[j + 1, 0] = q(-f[6:9], -f[9:12])     # just left of station j + 1
        return out


# --------------------------------------------------------------------------------------------
# Comparison
# --------------------------------------------------------------------------------------------
def _close(actual, expected, what, rtol=RTOL):
    actual, expected = np.asarray(actual, dtype=float), np.asarray(expected, dtype=float)
    scale = max(float(np.abs(expected).max(initial=0.0)), 1e-300)
    err = float(np.abs(actual - expected).max(initial=0.0)) / scale
    assert err <= rtol, f"{what}: max difference {err:.3g} of its scale {scale:.6g} (tolerance {rtol:g})"
    return err


def _station_values(sol, st):
    """(n, 2, 6) left/right diagram values at the stations, in QUANTITIES order."""
    d = sol.diagram
    out = np.zeros((len(st), 2, 6))
    for j, s in enumerate(st):
        idx = np.flatnonzero(np.abs(d["s"] - s) < 1e-12)
        assert idx.size == 2
        for k, name in enumerate(("N", "V1", "V2", "M1", "M2", "T")):
            out[j, :, k] = d[name][idx]
    return out


def compare(shaft, point_loads, axis_moments, torsion_at, pynite_diagrams=False):
    """Solve with loadscope (loads moved to the axis point: f, and m = offset x f) and with
    PyNite (loads at their real points); compare everything; return the worst relative error."""
    s = np.array([p[0] for p in point_loads] + [p[0] for p in axis_moments], dtype=float)
    f = np.array([p[2] for p in point_loads] + [(0.0, 0.0, 0.0)] * len(axis_moments), dtype=float)
    m = np.array([np.cross(p[1], p[2]) for p in point_loads] + [p[1] for p in axis_moments], dtype=float)
    sol = solve_shaft(shaft, s, f, m)
    ref = PyniteShaft(shaft, point_loads, axis_moments, torsion_at)
    np.testing.assert_allclose(sol.stations, ref.stations, atol=1e-12)
    errs = []
    # reactions: all three global components at every support
    r_ref = np.array([ref.reaction(sp.at) for sp in shaft.supports])
    errs.append(_close(sol.reactions_global, r_ref, "reactions"))
    t_scale = max(np.abs(m @ ref.frame[0]).max(initial=0.0), 1.0)
    assert abs(ref.torsion_reaction()) <= 1e-9 * t_scale, "applied torques must balance (torsion reaction ~0)"
    # deflections, slopes and twist at every station
    v_ref, th_ref, phi_ref = ref.displacement()
    errs.append(_close(sol.deflection_at, v_ref, "deflection v1, v2"))
    errs.append(_close(sol.slope_at, th_ref, "slope v1', v2'"))
    ours = _station_values(sol, ref.stations)
    j0 = int(np.argmin(np.abs(ref.stations - torsion_at)))
    phi = np.array([sol.diagram["phi"][np.flatnonzero(np.abs(sol.diagram["s"] - x) < 1e-12)[0]] for x in ref.stations])
    if np.abs(phi_ref).max() > 0:
        errs.append(_close(phi - phi[j0], phi_ref - phi_ref[j0], "twist"))
    # internal forces and moments, both sides of every station
    theirs = ref.internal()
    names = ("N", "V1", "V2", "M1", "M2", "T")
    for k, name in enumerate(names):
        if k in (0, 5) and np.abs(theirs[..., k]).max() == 0.0:
            assert np.abs(ours[..., k]).max() <= 1e-12 * max(np.abs(f).max(), 1.0)
            continue
        # the very first "left" and last "right" values lie outside PyNite's members (zero)
        errs.append(_close(ours[1:, 0, k], theirs[1:, 0, k], f"{name} just left of stations"))
        errs.append(_close(ours[:-1, 1, k], theirs[:-1, 1, k], f"{name} just right of stations"))
        assert np.abs(ours[0, 0, k]) == 0.0 and np.abs(ours[-1, 1, k]) <= 1e-9 * max(np.abs(f).max(), 1.0)
    if pynite_diagrams:
        errs.append(_check_pynite_diagrams(sol, ref))
    return sol, ref, max(errs)


def _check_pynite_diagrams(sol, ref):
    """Interior samples of loadscope's diagrams against PyNite's own member diagrams (shaft
    along +x, where local y, z = global Y, Z; M1 = -Mz, M2 = -My, V1 = Fy, V2 = Fz)."""
    assert np.allclose(ref.frame, np.eye(3))
    d = sol.diagram
    st = ref.stations
    ours, theirs = [], []
    for s_, m1, m2, v1, v2 in zip(d["s"], d["M1"], d["M2"], d["V1"], d["V2"]):
        j = int(np.searchsorted(st, s_) - 1)
        if j < 0 or j >= len(st) - 1 or np.min(np.abs(st - s_)) < 1e-9:
            continue                                  # stations themselves are checked above
        mem = ref.model.members[f"m{j}"]
        x = s_ - st[j]
        theirs.append([-mem.moment("Mz", x, COMBO), -mem.moment("My", x, COMBO),
                       mem.shear("Fy", x, COMBO), mem.shear("Fz", x, COMBO)])
        ours.append([m1, m2, v1, v2])
    ours, theirs = np.array(ours), np.array(theirs)
    assert len(ours) > 20
    return max(_close(ours[:, k], theirs[:, k], f"PyNite diagram {n} at interior samples")
               for k, n in enumerate(("M1", "M2", "V1", "V2")))


# --------------------------------------------------------------------------------------------
# (a) Two bearings, helical gear, coupling torque.
# --------------------------------------------------------------------------------------------
def test_two_bearing_helical_gear_and_coupling():
    """A driving shaft along +x: coupling at s = 0 takes T = 120 N*m in (about +x), a right-hand
    helical pinion (r = 0.06 m, phi_n = 20 deg, psi = 15 deg) at s = 0.15 passes it on; locating
    bearing A at 0.05, floating bearing B at 0.25. The mesh (pitch point) lies at 30 deg from e1
    toward e2, so every load has parts in both planes.

    Tooth force built by hand (Shigley 9th ed. Eq. 13-39 magnitudes): the pinion drives, so the
    tangential load opposes its motion (along -t, t = a x r); the thrust of a right-hand driver
    turning +omega points along +a (see tests/kernel/test_gears.py); the radial load points to
    the axis. Applied at the pitch point it also bends the shaft by W_a * r (the thrust couple).
    """
    T, rp, phi_n, psi = 120.0, 0.06, math.radians(20.0), math.radians(15.0)
    shaft = Shaft("in", (Section(0.3, 0.04),),
                  (Support("A", 0.05, "locating"), Support("B", 0.25, "floating")))
    fr = local_frame(shaft.axis)
    a = fr[0]
    rhat = math.cos(math.radians(30)) * fr[1] + math.sin(math.radians(30)) * fr[2]
    t = np.cross(a, rhat)
    mf = mesh_forces(T, rp, phi_n, psi)
    wt, wr, wa = float(mf.tangential), float(mf.radial), float(mf.axial)
    F = -wt * t + wa * a - wr * rhat
    # the kernel's vector form gives the same tooth force (motion_sign -1: load against +t)
    np.testing.assert_allclose(cylindrical_tooth_force(wt, a, rhat, -1.0, phi_n, psi, 1.0), F, rtol=1e-12)
    offset = rp * rhat
    assert np.cross(offset, F) @ a == pytest.approx(-T, rel=1e-12)      # the gear takes the torque out
    # thrust couple |W_a r| bends the shaft
    assert np.linalg.norm(np.cross(offset, wa * a)) == pytest.approx(wa * rp, rel=1e-12)

    sol, ref, err = compare(shaft, [(0.15, offset, F)], [(0.0, (T, 0.0, 0.0))], torsion_at=0.25,
                            pynite_diagrams=True)
    # the locating bearing A takes the whole thrust, B none
    assert sol.reactions_global[0] @ a == pytest.approx(-wa, rel=1e-9)
    assert abs(ref.reaction(0.25) @ a) <= 1e-9 * wa
    # torque diagram: T between coupling and gear, zero beyond
    k = int(np.argmin(np.abs(sol.diagram["s"] - 0.1)))
    assert sol.diagram["T"][k] == pytest.approx(T, rel=1e-12)


def test_thrust_couple_matters():
    """Guard against a reference that cannot see the thrust couple: dropping W_a * r from
    loadscope's moment must break the agreement with PyNite by far more than the tolerance."""
    shaft = Shaft("in", (Section(0.3, 0.04),), (Support("A", 0.05, "locating"), Support("B", 0.25)))
    F = np.array([800.0, -400.0, -2000.0])
    offset = np.array([0.0, 0.06, 0.0])
    ref = PyniteShaft(shaft, [(0.15, offset, F)], [(0.0, np.cross(offset, F) * [-1, 0, 0])], 0.25)
    m_wrong = np.cross(offset, F * [0, 1, 1])                  # couple of the thrust left out
    sol = solve_shaft(shaft, np.array([0.15, 0.0]), np.array([F, [0, 0, 0]]),
                      np.array([m_wrong, -np.cross(offset, F) * [1, 0, 0]]))
    r_ref = np.array([ref.reaction(0.05), ref.reaction(0.25)])
    scale = np.abs(r_ref).max()
    assert np.abs(sol.reactions_global - r_ref).max() / scale > 1e-2


# --------------------------------------------------------------------------------------------
# (b) Three bearings (statically indeterminate), loads in both planes, several axis directions.
# --------------------------------------------------------------------------------------------
@pytest.mark.parametrize("axis", [(1.0, 0.0, 0.0), (0.0, 0.0, 1.0), (0.0, -1.0, 0.0)],
                         ids=["axis+x", "axis+z", "axis-y(vertical)"])
def test_three_bearing_indeterminate(axis):
    shaft = Shaft("mid", (Section(0.45, 0.045),),
                  (Support("C", 0.02, "locating"), Support("D", 0.20), Support("E", 0.38)),
                  origin=(0.1, -0.2, 0.3), axis=axis)
    fr = local_frame(axis)
    a, e1, e2 = fr

    def g(fa, f1, f2):       # local components to global
        return fa * a + f1 * e1 + f2 * e2

    loads = [
        (0.10, 0.05 * e1, g(300.0, -2500.0, 900.0)),      # gear-like load off the axis
        (0.30, -0.04 * e2, g(-120.0, 700.0, -1800.0)),
        (0.45, np.zeros(3), g(0.0, -600.0, -350.0)),       # overhung at the free end
    ]
    torque_0 = np.cross(loads[0][1], loads[0][2]) @ a
    torque_1 = np.cross(loads[1][1], loads[1][2]) @ a
    moments = [(0.0, -(torque_0 + torque_1) * a), (0.25, g(0.0, 40.0, -25.0))]   # balancing torque + couple
    sol, ref, err = compare(shaft, loads, moments, torsion_at=0.0,
                            pynite_diagrams=np.allclose(axis, (1, 0, 0)))
    # a real redundant: all three bearings carry load in both planes
    assert np.all(np.abs(sol.reactions_local[:, 1:]) > 10.0)


# --------------------------------------------------------------------------------------------
# (c) Stepped shaft (several diameters, hollow parts) on two and on three supports, overhung
# load; and two locating bearings sharing thrust through the stepped axial stiffness.
# --------------------------------------------------------------------------------------------
STEPPED = (Section(0.04, 0.030), Section(0.08, 0.040), Section(0.12, 0.055, 0.025),
           Section(0.10, 0.045), Section(0.06, 0.035, 0.015))       # 0.40 m long, two hollow steps


@pytest.mark.parametrize("supports", [
    (Support("A", 0.02, "locating"), Support("B", 0.30)),
    (Support("A", 0.02, "locating"), Support("B", 0.17), Support("C", 0.30)),
], ids=["two-supports", "three-supports"])
def test_stepped_shaft_overhung(supports):
    shaft = Shaft("out", STEPPED, supports)
    loads = [
        (0.10, np.array([0.0, 0.0, 0.09]), np.array([-450.0, -3000.0, 1100.0])),   # spur/helical gear
        (0.22, np.zeros(3), np.array([0.0, 800.0, 0.0])),
        (0.40, np.array([0.0, -0.05, 0.0]), np.array([0.0, -1500.0, -2600.0])),    # overhung sprocket
    ]
    torque = sum(np.cross(o, f)[0] for _, o, f in loads)
    sol, ref, err = compare(shaft, loads, [(0.0, (-torque, 0.0, 0.0))], torsion_at=0.0, pynite_diagrams=True)
    # the step positions are stations (EI changes there), and the overhang deflects the most
    for b in np.cumsum([s.length for s in STEPPED]):
        assert np.min(np.abs(sol.stations - b)) < 1e-12
    assert np.argmax(np.hypot(*sol.deflection_at.T)) == len(sol.stations) - 1


def test_stepped_shaft_two_locating_bearings_share_thrust():
    """Both bearings locating: the thrust splits by the axial stiffness of the stepped, partly
    hollow shaft on either side (PyNite: EA of each member). Includes a pair of opposite thrusts
    that cancel in total but still load both bearings."""
    shaft = Shaft("out", STEPPED, (Support("A", 0.02, "locating"), Support("B", 0.30, "locating")))
    loads = [(0.10, np.zeros(3), np.array([2500.0, -1000.0, 0.0])),
             (0.22, np.zeros(3), np.array([-2500.0, 0.0, 700.0]))]
    sol, ref, err = compare(shaft, loads, [], torsion_at=0.02)
    assert abs(sol.reactions_global[0, 0]) > 100.0       # both carry axial load
    loads[1] = (0.22, np.zeros(3), np.array([-1000.0, 0.0, 700.0]))
    compare(shaft, loads, [], torsion_at=0.02)

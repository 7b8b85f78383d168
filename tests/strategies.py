"""Hypothesis strategies shared by the test folders."""

from __future__ import annotations

import math

import numpy as np
from hypothesis import strategies as st

from loadscope import Bolt, Coupling, Drive, Gear, Housing, Mesh, Port, Pulley, Section, Shaft, Support

DEG = math.pi / 180.0


@st.composite
def drives(draw) -> Drive:
    """A chain of 2 or 3 parallel shafts along +x (or some reversed), each
    mesh spur or helical, external or (first stage only) internal."""
    n = draw(st.integers(2, 3))
    phi = draw(st.floats(14.5, 25.0)) * DEG
    shafts = []
    meshes = []
    center = np.zeros(2)
    prev_gear = None
    for i in range(n):
        length = draw(st.floats(0.15, 0.6))
        d1 = draw(st.floats(0.02, 0.06))
        d2 = draw(st.floats(0.02, 0.06))
        cut = draw(st.floats(0.2, 0.8)) * length
        sections = (Section(cut, d1), Section(length - cut, d2, bore=draw(st.sampled_from([0.0, 0.4])) * d2))
        sa = draw(st.floats(0.0, 0.3)) * length
        sb = draw(st.floats(0.6, 1.0)) * length
        locate = draw(st.sampled_from(["first", "second", "third"]))
        n_sup = 3 if locate == "third" else 2
        supports = [Support("A", sa, "locating" if locate == "first" else "floating"),
                    Support("B", sb, "locating" if locate == "second" else "floating")]
        if n_sup == 3:
            supports.append(Support("C", 0.5 * (sa + sb) + 0.01 * length, "locating"))
        flip = draw(st.booleans()) and i > 0
        axis = (-1.0, 0.0, 0.0) if flip else (1.0, 0.0, 0.0)
        gears = []
        if prev_gear is not None:
            g_prev, r_prev, kind, helix, hand_prev, internal_prev = prev_gear
            r = draw(st.floats(0.03, 0.12))
            ang = draw(st.floats(0, 2 * math.pi))
            dist = r_prev + r
            center = center + dist * np.array([math.cos(ang), math.sin(ang)])
            x_mesh = g_prev
            at = draw(st.floats(0.05, 0.95)) * length
            hand = None if kind == "spur" else ("left" if hand_prev == "right" else "right")
            gears.append(Gear(f"w{i}", at, r, kind, pressure_angle=phi, helix_angle=helix, hand=hand,
                              weight=draw(st.floats(0, 200))))
            meshes.append(Mesh(f"m{i}", (f"p{i - 1}", f"w{i}"), draw(st.floats(0.9, 1.0))))
        origin_x = 0.0
        if prev_gear is not None and i > 0 and gears:
            # Place the shaft so that its gear stands where its mate does.
            origin_x = x_mesh + gears[0].at if flip else x_mesh - gears[0].at
        origin = (origin_x, float(center[0]), float(center[1]))
        if i < n - 1:
            kind = draw(st.sampled_from(["spur", "helical"]))
            helix = draw(st.floats(5.0, 35.0)) * DEG if kind == "helical" else 0.0
            hand = draw(st.sampled_from(["right", "left"])) if kind == "helical" else None
            r = draw(st.floats(0.02, 0.08))
            at = draw(st.floats(0.05, 0.95)) * length
            gears.append(Gear(f"p{i}", at, r, kind, pressure_angle=phi, helix_angle=helix, hand=hand))
            x_global = origin_x - at if flip else origin_x + at
            prev_gear = (x_global, r, kind, helix, hand, False)
        pulleys = ()
        couplings = (Coupling("c", draw(st.floats(0, 1)) * length),)
        if i == n - 1 and draw(st.booleans()):
            pulleys = (Pulley("belt", draw(st.floats(0, 1)) * length, draw(st.floats(0.05, 0.2)),
                              (draw(st.floats(0, 2 * math.pi)), draw(st.floats(0, 2 * math.pi))),
                              draw(st.sampled_from([1, -1])), draw(st.sampled_from([2.5, 5.0, math.inf]))),)
        shafts.append(Shaft(f"s{i}", sections, tuple(supports), origin=origin, axis=axis, gears=tuple(gears),
                            couplings=couplings, pulleys=pulleys))
    out_el = "belt" if shafts[-1].pulleys else "c"
    speed = draw(st.floats(50, 300)) * draw(st.sampled_from([1, -1]))
    power = draw(st.floats(100, 50_000))
    bolts = tuple(Bolt(f"b{k}", (x, -0.3, z)) for k, (x, z) in enumerate([(-0.1, -0.2), (0.7, -0.2), (0.7, 0.2),
                                                                          (-0.1, 0.2)]))
    housing = Housing(bolts, plane_point=(0, -0.3, 0), weight=draw(st.floats(0, 2000)),
                      center_of_mass=(0.3, 0.0, 0.0))
    return Drive(tuple(shafts), tuple(meshes), Port("s0", "c", power=power), (Port(f"s{n - 1}", out_el),),
                 speed=speed, housing=housing)

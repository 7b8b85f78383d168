"""The shafts of a solved drive rebuilt as PyNiteFEA 3D frame models.

PyNiteFEA is an independent general-purpose frame solver: it gets the same
stations, sections, supports and applied loads (tooth forces as force plus
moment at the axis, port torques, weights, strand pulls) and solves the
reactions and deflections itself. Used by the bench (timing side by side)
and by the reference tests (agreement). Shafts must run along global x.
"""

from __future__ import annotations

import numpy as np
from Pynite import FEModel3D

from loadscope.kernel.solve import DriveResult


def shaft_model(result: DriveResult, index: int) -> FEModel3D:
    """A PyNite model of shaft ``index`` of a solved drive, not yet analysed."""
    sh = result.drive.shafts[index]
    sr = result.shafts[index]
    if not np.allclose(np.abs(sh.axis), (1.0, 0.0, 0.0)):
        raise ValueError("the PyNite rebuild handles shafts along x only")
    axis = np.asarray(sh.axis, dtype=float)
    origin = np.asarray(sh.origin, dtype=float)
    st = sr.solution.stations
    model = FEModel3D()
    model.add_material("steel", E=sh.E, G=sh.G, nu=0.3, rho=7850.0)
    names = []
    for k, s in enumerate(st):
        p = origin + s * axis
        names.append(model.add_node(f"n{k}", float(p[0]), float(p[1]), float(p[2])))
    bounds = np.concatenate([[0.0], np.cumsum([sec.length for sec in sh.sections])])
    for k in range(st.size - 1):
        mid = 0.5 * (st[k] + st[k + 1])
        j = min(int(np.searchsorted(bounds, mid) - 1), len(sh.sections) - 1)
        sec = sh.sections[j]
        name = f"sec{k}"
        i_ = sec.second_moment
        model.add_section(name, A=sec.area, Iy=i_, Iz=i_, J=2.0 * i_)
        model.add_member(f"m{k}", names[k], names[k + 1], "steel", name)
    twist_held = False
    for sp in sh.supports:
        k = int(np.argmin(np.abs(st - sp.at)))
        axial = sp.axial != "floating"
        model.def_support(names[k], support_DX=axial, support_DY=True, support_DZ=True,
                          support_RX=not twist_held)
        twist_held = True
    for a in sr.actions:
        k = int(np.argmin(np.abs(st - a.at)))
        center = origin + a.at * axis
        m = a.moment + np.cross(a.point - center, a.force)
        for comp, val in zip(("FX", "FY", "FZ"), a.force):
            if val != 0.0:
                model.add_node_load(names[k], comp, float(val))
        for comp, val in zip(("MX", "MY", "MZ"), m):
            if val != 0.0:
                model.add_node_load(names[k], comp, float(val))
    return model


def solve_models(result: DriveResult) -> list[FEModel3D]:
    """Build and analyse one PyNite model per shaft."""
    models = []
    for i in range(len(result.shafts)):
        model = shaft_model(result, i)
        model.analyze_linear(check_statics=False)
        models.append(model)
    return models

"""The drive's adjustable numbers, as a list generated from the drive itself.

Each :class:`Param` knows its field path, its group (the drive, one shaft,
one mesh, the housing), a label in the trade's words, its quantity kind (for
the display units), a sensible range in SI units, and how to read and
replace its value in a frozen :class:`~loadscope.kernel.model.Drive`
(``dataclasses.replace``, so every kernel check runs again on the new
drive). No widgets here: :mod:`loadscope.widgets.panel` draws them.

Mesh controls act on both gears of a pair, because the kernel requires mating
gears to share the pressure angle and helix angle. A pitch radius is set per
mesh on its first gear, and the mating radius follows so that the two still
fit the centre distance the housing bores fix (external: r1 + r2 = a;
internal: r_ring - r_pinion = a). The ratio therefore moves with the slider;
the pair's tooth counts no longer describe it and are dropped, so the ratio
comes from the radii (a note in the panel says so). The centre distance is
read from the kernel's solved mesh geometry, never computed here.
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Callable
from dataclasses import dataclass

from ..kernel.model import Drive, Gear
from ..kernel.solve import DriveResult

Setter = Callable[[Drive, float], Drive]
Getter = Callable[[Drive], float]

CONTROLS = ("slider", "box")


@dataclass(frozen=True)
class Param:
    """One adjustable number of a drive.

    ``lo``/``hi`` are SI values (the kernel's units); ``kind`` names the
    quantity for display (``"length"``, ``"angle"``, ``"force"``,
    ``"moment"``, ``"power"``, ``"speed"`` or ``"number"``).
    """

    key: str
    group: str
    label: str
    kind: str
    lo: float
    hi: float
    control: str
    get: Getter
    set: Setter
    note: str = ""


# --------------------------------------------------------------------------- replacing parts of a frozen drive

def _with_shaft(drive: Drive, i: int, **changes: object) -> Drive:
    shafts = list(drive.shafts)
    shafts[i] = dataclasses.replace(shafts[i], **changes)
    return dataclasses.replace(drive, shafts=tuple(shafts))


def _with_item(drive: Drive, i: int, attr: str, j: int, **changes: object) -> Drive:
    items = list(getattr(drive.shafts[i], attr))
    items[j] = dataclasses.replace(items[j], **changes)
    return _with_shaft(drive, i, **{attr: tuple(items)})


def _gear_index(drive: Drive, gear_id: str) -> tuple[int, int]:
    for i, sh in enumerate(drive.shafts):
        for j, g in enumerate(sh.gears):
            if g.id == gear_id:
                return i, j
    raise KeyError(gear_id)


def _gear(drive: Drive, gear_id: str) -> Gear:
    i, j = _gear_index(drive, gear_id)
    return drive.shafts[i].gears[j]


def _with_gears(drive: Drive, changes: dict[str, dict[str, object]]) -> Drive:
    """Replace several gears at once (one validation of the new drive)."""
    shafts = list(drive.shafts)
    for gid, kw in changes.items():
        i, j = _gear_index(drive, gid)
        gears = list(shafts[i].gears)
        gears[j] = dataclasses.replace(gears[j], **kw)
        shafts[i] = dataclasses.replace(shafts[i], gears=tuple(gears))
    return dataclasses.replace(drive, shafts=tuple(shafts))


def _power_port(drive: Drive) -> tuple[str, int]:
    """Which port carries the given power or torque: ("input", 0) or ("outputs", k)."""
    if drive.input.power is not None or drive.input.torque is not None:
        return "input", 0
    for k, p in enumerate(drive.outputs):
        if p.power is not None or p.torque is not None:
            return "outputs", k
    return "input", 0


def _with_port(drive: Drive, where: str, k: int, **changes: object) -> Drive:
    if where == "input":
        return dataclasses.replace(drive, input=dataclasses.replace(drive.input, **changes))
    outs = list(drive.outputs)
    outs[k] = dataclasses.replace(outs[k], **changes)
    return dataclasses.replace(drive, outputs=tuple(outs))


def _around(value: float, down: float, up: float, floor: float = 0.0) -> tuple[float, float]:
    """A slider range round a positive value: ``value/down`` to ``value*up``."""
    if value <= 0.0:
        return floor, 1.0
    return max(floor, value / down), value * up


# --------------------------------------------------------------------------- generation

def _drive_params(drive: Drive) -> list[Param]:
    out: list[Param] = []
    n = abs(drive.speed)
    sign = math.copysign(1.0, drive.speed)
    out.append(Param("input.speed", "drive", "input speed", "speed", max(n / 10.0, 1e-3), n * 3.0, "slider",
                     lambda d: abs(d.speed), lambda d, v: dataclasses.replace(d, speed=sign * v),
                     "sense of rotation kept"))
    where, k = _power_port(drive)
    port = drive.input if where == "input" else drive.outputs[k]
    place = "input" if where == "input" else f"outputs[{k}]"
    who = "input" if where == "input" else f"output {port.shaft}.{port.element}"
    if port.power is not None:
        lo, hi = _around(port.power, 10.0, 3.0)
        out.append(Param(f"{place}.power", "drive", f"{who} power", "power", lo, hi, "slider",
                         lambda d: _port_value(d, "power"),
                         lambda d, v, w=where, kk=k: _with_port(d, w, kk, power=v)))
    elif port.torque is not None:
        lo, hi = _around(port.torque, 10.0, 3.0)
        out.append(Param(f"{place}.torque", "drive", f"{who} torque", "moment", lo, hi, "slider",
                         lambda d: _port_value(d, "torque"),
                         lambda d, v, w=where, kk=k: _with_port(d, w, kk, torque=v)))
    if len(drive.outputs) > 1:
        for k2, o in enumerate(drive.outputs):
            out.append(Param(f"outputs[{k2}].share", "drive", f"power share of {o.shaft}.{o.element}", "number",
                             0.01, 10.0, "box", lambda d, kk=k2: d.outputs[kk].share,
                             lambda d, v, kk=k2: _with_port(d, "outputs", kk, share=v)))
    return out


def _port_value(drive: Drive, attr: str) -> float:
    where, k = _power_port(drive)
    port = drive.input if where == "input" else drive.outputs[k]
    return float(getattr(port, attr))


def _mesh_params(drive: Drive, result: DriveResult) -> list[Param]:
    out: list[Param] = []
    geometry = {fl.geometry.mesh_id: fl.geometry for fl in result.train.meshes}
    for m_i, mesh in enumerate(drive.meshes):
        group = f"mesh {mesh.id}"
        a_id, b_id = mesh.gears
        ga = _gear(drive, a_id)
        both = (a_id, b_id)
        out.append(Param(f"meshes[{m_i}].pressure_angle", group, "normal pressure angle", "angle",
                         math.radians(10.0), math.radians(35.0), "slider",
                         lambda d, g=a_id: _gear(d, g).pressure_angle,
                         lambda d, v, gs=both: _with_gears(d, {g: {"pressure_angle": v} for g in gs}),
                         "both gears of the pair"))
        if ga.kind == "helical":
            out.append(Param(f"meshes[{m_i}].helix_angle", group, "helix angle", "angle", math.radians(1.0),
                             math.radians(45.0), "slider", lambda d, g=a_id: _gear(d, g).helix_angle,
                             lambda d, v, gs=both: _with_gears(d, {g: {"helix_angle": v} for g in gs}),
                             "both gears; hands kept"))
        geo = geometry.get(mesh.id)
        if ga.kind != "bevel" and geo is not None:
            internal = ga.internal or _gear(drive, b_id).internal
            r_a, r_b = geo.radius
            centre = abs(r_a - r_b) if internal else r_a + r_b
            if not internal:
                lo, hi = 0.1 * centre, 0.9 * centre
            elif ga.internal:                       # the ring itself: it must stay larger than the distance
                lo, hi = 1.1 * centre, 4.0 * centre
            else:
                lo, hi = 0.1 * centre, 3.0 * centre
            out.append(Param(f"meshes[{m_i}].pitch_radius", group, f"pitch radius of {a_id}", "length", lo, hi,
                             "slider", lambda d, g=a_id: _gear(d, g).pitch_radius,
                             _radius_setter(a_id, b_id, centre, internal),
                             f"{b_id} follows to hold the centre distance; the ratio moves"))
        out.append(Param(f"meshes[{m_i}].efficiency", group, "mesh efficiency", "number", 0.5, 1.0, "box",
                         lambda d, k=m_i: d.meshes[k].efficiency,
                         lambda d, v, k=m_i: _with_mesh(d, k, efficiency=v)))
    return out


def _with_mesh(drive: Drive, k: int, **changes: object) -> Drive:
    meshes = list(drive.meshes)
    meshes[k] = dataclasses.replace(meshes[k], **changes)
    return dataclasses.replace(drive, meshes=tuple(meshes))


def _radius_setter(a_id: str, b_id: str, centre: float, internal: bool) -> Setter:
    def set_radius(drive: Drive, r: float) -> Drive:
        gb = _gear(drive, b_id)
        if internal:
            mate = r + centre if gb.internal else max(r - centre, 0.0)
        else:
            mate = centre - r
        return _with_gears(drive, {a_id: {"pitch_radius": r, "teeth": None},
                                   b_id: {"pitch_radius": mate, "teeth": None}})
    return set_radius


def _shaft_params(drive: Drive) -> list[Param]:
    out: list[Param] = []
    for i, sh in enumerate(drive.shafts):
        group = f"shaft {sh.id}"
        p = f"shafts[{i}]"
        length = sh.length
        for j, sp in enumerate(sh.supports):
            out.append(Param(f"{p}.supports[{j}].at", group, f"bearing {sp.id} position", "length", 0.0, length,
                             "slider", lambda d, a=i, b=j: d.shafts[a].supports[b].at,
                             lambda d, v, a=i, b=j: _with_item(d, a, "supports", b, at=v)))
        for j, pu in enumerate(sh.pulleys):
            out.append(Param(f"{p}.pulleys[{j}].at", group, f"pulley {pu.id} position", "length", 0.0, length,
                             "slider", lambda d, a=i, b=j: d.shafts[a].pulleys[b].at,
                             lambda d, v, a=i, b=j: _with_item(d, a, "pulleys", b, at=v)))
            lo, hi = _around(pu.pitch_radius, 3.0, 3.0)
            out.append(Param(f"{p}.pulleys[{j}].pitch_radius", group, f"pulley {pu.id} pitch radius", "length",
                             lo, hi, "slider", lambda d, a=i, b=j: d.shafts[a].pulleys[b].pitch_radius,
                             lambda d, v, a=i, b=j: _with_item(d, a, "pulleys", b, pitch_radius=v)))
            if math.isfinite(pu.tension_ratio):
                out.append(Param(f"{p}.pulleys[{j}].tension_ratio", group, f"pulley {pu.id} tight/slack ratio",
                                 "number", 1.01, 50.0, "box",
                                 lambda d, a=i, b=j: d.shafts[a].pulleys[b].tension_ratio,
                                 lambda d, v, a=i, b=j: _with_item(d, a, "pulleys", b, tension_ratio=v)))
        for j, c in enumerate(sh.couplings):
            out.append(Param(f"{p}.couplings[{j}].at", group, f"coupling {c.id} position", "length", 0.0, length,
                             "slider", lambda d, a=i, b=j: d.shafts[a].couplings[b].at,
                             lambda d, v, a=i, b=j: _with_item(d, a, "couplings", b, at=v)))
        for j, ld in enumerate(sh.loads):
            for c, axis in enumerate("xyz"):
                out.append(Param(f"{p}.loads[{j}].force[{c}]", group, f"load {ld.id} force {axis}", "force",
                                 -1e6, 1e6, "box", lambda d, a=i, b=j, cc=c: d.shafts[a].loads[b].force[cc],
                                 _load_setter(i, j, c)))
        for attr in ("gears", "pulleys", "couplings"):
            for j, e in enumerate(getattr(sh, attr)):
                lo, hi = _around(e.weight, 10.0, 5.0)
                out.append(Param(f"{p}.{attr}[{j}].weight", group, f"{attr[:-1]} {e.id} weight", "force", 0.0,
                                 max(hi, 100.0), "box", lambda d, a=i, b=j, t=attr: getattr(d.shafts[a], t)[b].weight,
                                 lambda d, v, a=i, b=j, t=attr: _with_item(d, a, t, b, weight=v)))
        for j, sec in enumerate(sh.sections):
            lo, hi = _around(sec.diameter, 2.0, 2.0)
            out.append(Param(f"{p}.sections[{j}].diameter", group, f"section {j + 1} diameter", "length", lo, hi,
                             "box", lambda d, a=i, b=j: d.shafts[a].sections[b].diameter,
                             lambda d, v, a=i, b=j: _with_item(d, a, "sections", b, diameter=v)))
    return out


def _load_setter(i: int, j: int, c: int) -> Setter:
    def set_component(drive: Drive, v: float) -> Drive:
        f = list(drive.shafts[i].loads[j].force)
        f[c] = v
        return _with_item(drive, i, "loads", j, force=(f[0], f[1], f[2]))
    return set_component


def _housing_params(drive: Drive) -> list[Param]:
    h = drive.housing
    if h is None:
        return []
    lo, hi = _around(h.weight, 10.0, 5.0)
    out = [Param("housing.weight", "housing", "housing weight", "force", 0.0, max(hi, 1000.0), "box",
                 lambda d: d.housing.weight if d.housing is not None else 0.0,
                 lambda d, v: dataclasses.replace(d, housing=dataclasses.replace(d.housing, weight=v)))]
    for c, axis in enumerate("xyz"):
        out.append(Param(f"housing.center_of_mass[{c}]", "housing", f"centre of mass {axis}", "length", -10.0, 10.0,
                         "box", lambda d, cc=c: d.housing.center_of_mass[cc] if d.housing is not None else 0.0,
                         _com_setter(c)))
    return out


def _com_setter(c: int) -> Setter:
    def set_com(drive: Drive, v: float) -> Drive:
        assert drive.housing is not None
        p = list(drive.housing.center_of_mass)
        p[c] = v
        return dataclasses.replace(drive, housing=dataclasses.replace(drive.housing,
                                                                      center_of_mass=(p[0], p[1], p[2])))
    return set_com


def _with_case(drive: Drive, k: int, **changes: object) -> Drive:
    cases = list(drive.cases)
    cases[k] = dataclasses.replace(cases[k], **changes)
    return dataclasses.replace(drive, cases=tuple(cases))


def _case_params(drive: Drive) -> list[Param]:
    """Power (or torque) and input speed of each load case; shares must add
    up to 1 and stay in the snapshot."""
    out: list[Param] = []
    for k, c in enumerate(drive.cases):
        p = f"cases[{k}]"
        for attr, kind in (("power", "power"), ("torque", "moment")):
            v = getattr(c, attr)
            if v is not None:
                lo, hi = _around(v, 10.0, 3.0)
                out.append(Param(f"{p}.{attr}", "load cases", f"{c.name}: {attr}", kind, lo, hi, "box",
                                 lambda d, kk=k, a=attr: getattr(d.cases[kk], a),
                                 lambda d, x, kk=k, a=attr: _with_case(d, kk, **{a: x})))
        if c.speed is not None:
            n = abs(c.speed)
            sign = math.copysign(1.0, c.speed)
            out.append(Param(f"{p}.speed", "load cases", f"{c.name}: input speed", "speed", max(n / 10.0, 1e-3),
                             n * 3.0, "box", lambda d, kk=k: abs(d.cases[kk].speed or 0.0),
                             lambda d, x, kk=k, sg=sign: _with_case(d, kk, speed=sg * x), "sense of rotation kept"))
    return out


def drive_params(drive: Drive, result: DriveResult) -> list[Param]:
    """Every adjustable number of ``drive`` (solved as ``result``), grouped:
    ``"drive"`` (speed, power or torque, output shares), ``"mesh <id>"``
    (pressure angle, helix angle, pitch radius, efficiency), ``"shaft <id>"``
    (bearing, pulley and coupling positions, pulley radius, point loads,
    weights, section diameters), ``"housing"`` and ``"load cases"`` (each
    case's power or torque and speed, when the drive has cases).

    >>> from loadscope import solve
    >>> from loadscope.spec import demo_snapshot, drive_from_snapshot
    >>> d = drive_from_snapshot(demo_snapshot())
    >>> ps = drive_params(d, solve(d))
    >>> [p.key for p in ps][:3]
    ['input.speed', 'input.power', 'meshes[0].pressure_angle']
    """
    return [*_drive_params(drive), *_mesh_params(drive, result), *_shaft_params(drive), *_housing_params(drive),
            *_case_params(drive)]

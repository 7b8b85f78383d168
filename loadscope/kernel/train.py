"""The drive train: mesh geometry, speeds and senses, and the power flow.

Speeds follow from the pitch-point velocity being common to both gears of a
mesh, v = omega_a r_a t_a = omega_b r_b t_b with t = axis x radial_out, which
reverses the sense in an external mesh and keeps it in an internal one for
any orientation of the shaft axes. Ratios come from tooth counts where both
are given, otherwise from the pitch radii.

Power flows from the input along the mesh tree. Each shaft needs the power
of its outputs plus what its downstream meshes draw; a mesh of efficiency
eta draws P / eta from the driver side. The tooth force is set by the power
the driver gives; the driven shaft keeps eta of it and the lost torque
(1 - eta) W_t r_driven acts on the driven shaft against its rotation, reacted
by the housing (a modelling choice: it keeps mating tooth forces equal and
opposite, and it is conservative for the driven shaft's bearings).
"""

from __future__ import annotations

import math
from collections import deque
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from ..errors import InputError, MechanismError
from .model import Drive, Gear, Port
from .vec import cross

FloatArray = NDArray[np.float64]

#: Pitch radii must fit the centre distance to within this share of it
#: (operating radii are then scaled to fit exactly).
FIT_TOLERANCE = 1e-3


@dataclass(frozen=True)
class MeshGeometry:
    """Where and how two gears meet. ``gear[i]`` is on shaft ``shaft[i]``;
    ``radius[i]`` is the operating pitch radius [m]; ``radial_out[i]`` the unit
    from that gear's axis to the pitch point; ``ratio`` = omega_b / omega_a
    (signed about each shaft's own axis)."""

    mesh_id: str
    index: int
    kind: str
    gear: tuple[Gear, Gear]
    shaft: tuple[int, int]
    point: FloatArray
    center: tuple[FloatArray, FloatArray]
    radius: tuple[float, float]
    radial_out: tuple[FloatArray, FloatArray]
    axis_from_apex: tuple[FloatArray, FloatArray] | None
    cone_angle: tuple[float, float] | None
    ratio: float
    efficiency: float


@dataclass(frozen=True)
class MeshFlow:
    """The power through one mesh: ``driver`` is 0 or 1 (index into the
    mesh's gears), ``tangential`` the tangential load W_t [N], ``power`` the
    power the driver gives [W], ``loss_torque`` the torque lost on the driven
    shaft [N*m]."""

    geometry: MeshGeometry
    driver: int
    tangential: float
    power: float
    loss_torque: float


@dataclass(frozen=True)
class TrainResult:
    """Speeds [rad/s] signed about each shaft's axis, in shaft order; port
    torques [N*m] signed about the shaft axis as applied to the shaft;
    ``power_in`` and ``power_out`` [W]."""

    speed: FloatArray
    meshes: tuple[MeshFlow, ...]
    port_torque: dict[tuple[str, str], float]
    port_power: dict[tuple[str, str], float]
    power_in: float
    power_out: float


def _gear_index(drive: Drive) -> dict[str, tuple[int, Gear]]:
    index: dict[str, tuple[int, Gear]] = {}
    for i, shaft in enumerate(drive.shafts):
        for g in shaft.gears:
            if g.id in index:
                raise InputError(g.path or f"shafts[{i}].gears", f"gear id {g.id!r} is used twice", "unique ids")
            index[g.id] = (i, g)
    return index


def _center(drive: Drive, i: int, at: float) -> tuple[FloatArray, FloatArray]:
    s = drive.shafts[i]
    axis = np.asarray(s.axis, dtype=float)
    return np.asarray(s.origin, dtype=float) + at * axis, axis


def mesh_geometry(drive: Drive) -> tuple[MeshGeometry, ...]:
    """Pitch points, operating radii and ratios of every mesh; checks that the
    gears fit their shafts' layout."""
    gears = _gear_index(drive)
    used: dict[str, str] = {}
    out = []
    for k, mesh in enumerate(drive.meshes):
        where = mesh.path or f"meshes[{k}]"
        pair = []
        for j, gid in enumerate(mesh.gears):
            if gid not in gears:
                raise InputError(f"{where}.gears[{j}]", f"no gear with id {gid!r}",
                                 ", ".join(sorted(gears)) or "a gear id")
            if gid in used:
                raise InputError(f"{where}.gears[{j}]", f"gear {gid!r} is already in mesh {used[gid]!r}",
                                 "each gear in one mesh (model a gear in two meshes as two gears)")
            used[gid] = mesh.id
            pair.append(gears[gid])
        (ia, ga), (ib, gb) = pair
        if ia == ib:
            raise InputError(f"{where}.gears", "both gears sit on one shaft", "gears on two different shafts")
        kinds = {ga.kind, gb.kind}
        if kinds == {"bevel"}:
            out.append(_bevel(drive, k, where, mesh.id, ia, ga, ib, gb, mesh.efficiency))
        elif "bevel" in kinds:
            raise InputError(f"{where}.gears", "a bevel gear meshes only with a bevel gear", "matching kinds")
        else:
            out.append(_cylindrical(drive, k, where, mesh.id, ia, ga, ib, gb, mesh.efficiency))
    return tuple(out)


def _teeth_ratio(ga: Gear, gb: Gear) -> float | None:
    return None if ga.teeth is None or gb.teeth is None else ga.teeth / gb.teeth


def _cylindrical(drive: Drive, k: int, where: str, mid: str, ia: int, ga: Gear, ib: int, gb: Gear,
                 eta: float) -> MeshGeometry:
    ca, axa = _center(drive, ia, ga.at)
    cb, axb = _center(drive, ib, gb.at)
    if np.linalg.norm(cross(axa, axb)) > 1e-9:
        raise InputError(f"{where}", f"spur and helical gears need parallel shafts; "
                         f"{drive.shafts[ia].id!r} and {drive.shafts[ib].id!r} are not", "parallel shaft axes")
    if ga.kind != gb.kind:
        raise InputError(f"{where}.gears", f"a {ga.kind} gear cannot mesh with a {gb.kind} gear", "same kind")
    if abs(ga.pressure_angle - gb.pressure_angle) > 1e-9:
        raise InputError(f"{where}.gears", "the two gears have different pressure angles "
                         f"({math.degrees(ga.pressure_angle):g} and {math.degrees(gb.pressure_angle):g} deg)",
                         "equal normal pressure angles")
    if ga.internal and gb.internal:
        raise InputError(f"{where}.gears", "two internal gears cannot mesh", "at most one internal gear")
    internal = ga.internal or gb.internal
    if ga.kind == "helical":
        if abs(ga.helix_angle - gb.helix_angle) > 1e-9:
            raise InputError(f"{where}.gears", "mating helical gears need equal helix angles", "equal angles")
        same = ga.hand == gb.hand
        if internal and not same:
            raise InputError(f"{where}.gears", "an internal helical mesh needs gears of the same hand",
                             "same hand")
        if not internal and same:
            raise InputError(f"{where}.gears", f"an external helical mesh needs opposite hands, both are "
                             f"{ga.hand}", "one right hand, one left hand")
    d = cb - ca
    axial_gap = float(d @ axa)
    perp = d - axial_gap * axa
    dist = float(np.linalg.norm(perp))
    nominal = abs(ga.pitch_radius - gb.pitch_radius) if internal else ga.pitch_radius + gb.pitch_radius
    tol = FIT_TOLERANCE * max(dist, nominal)
    sign = "-" if internal else "+"
    if abs(dist - nominal) > tol:
        raise InputError(f"{where}", f"pitch radii {ga.pitch_radius * 1e3:.6g} mm {sign} "
                         f"{gb.pitch_radius * 1e3:.6g} mm = {nominal * 1e3:.6g} mm miss the centre distance "
                         f"{dist * 1e3:.6g} mm of shafts {drive.shafts[ia].id!r} and {drive.shafts[ib].id!r} by "
                         f"{(nominal - dist) * 1e3:.6g} mm", f"within {FIT_TOLERANCE:.1%} ({tol * 1e3:.3g} mm)")
    if abs(axial_gap) > tol + 1e-4:
        raise InputError(f"{where}", f"the gears stand {axial_gap * 1e3:.6g} mm apart along the axes: their "
                         "faces do not overlap at the pitch point", f"within {(tol + 1e-4) * 1e3:.3g} mm")
    teeth = _teeth_ratio(ga, gb)
    rho = teeth if teeth is not None else ga.pitch_radius / gb.pitch_radius
    if teeth is not None and abs(teeth - ga.pitch_radius / gb.pitch_radius) > FIT_TOLERANCE * teeth:
        raise InputError(f"{where}", f"the pitch radii ratio {ga.pitch_radius / gb.pitch_radius:.6g} disagrees "
                         f"with the teeth ratio {ga.teeth}/{gb.teeth} = {teeth:.6g}",
                         f"within {FIT_TOLERANCE:.1%}")
    u = perp / dist
    if internal:
        ra, rb = (dist * rho / (1 - rho), dist / (1 - rho)) if rho < 1 else (dist * rho / (rho - 1),
                                                                             dist / (rho - 1))
        # The pitch point lies on the pinion's side away from the ring centre.
        if gb.internal:
            point, out_a, out_b = ca - ra * u, -u, -u
        else:
            point, out_a, out_b = ca + ra * u, u, u
    else:
        ra, rb = dist * rho / (1 + rho), dist / (1 + rho)
        point, out_a, out_b = ca + ra * u, u, -u
    point = point + 0.5 * axial_gap * axa
    ta, tb = cross(axa, out_a), cross(axb, out_b)
    ratio = (ra / rb) * float(ta @ tb)
    return MeshGeometry(mid, k, ga.kind, (ga, gb), (ia, ib), point, (ca, cb), (ra, rb), (out_a, out_b), None,
                        None, ratio, eta)


def _bevel(drive: Drive, k: int, where: str, mid: str, ia: int, ga: Gear, ib: int, gb: Gear,
           eta: float) -> MeshGeometry:
    ca, axa = _center(drive, ia, ga.at)
    cb, axb = _center(drive, ib, gb.at)
    axes_cross = cross(axa, axb)
    sin_sigma = float(np.linalg.norm(axes_cross))
    if sin_sigma < 1e-6:
        raise InputError(where, "bevel gears need intersecting, non-parallel shafts", "shaft angle 1 to 179 deg")
    if abs(ga.pressure_angle - gb.pressure_angle) > 1e-9:
        raise InputError(f"{where}.gears", "the two gears have different pressure angles", "equal angles")
    # Apex: the closest points of the two axis lines must coincide.
    w = ca - cb
    b = float(axa @ axb)
    den = 1.0 - b * b
    ta_ = (b * float(axb @ w) - float(axa @ w)) / den
    tb_ = (float(axb @ w) - b * float(axa @ w)) / den
    pa, pb = ca + ta_ * axa, cb + tb_ * axb
    scale = max(ga.pitch_radius, gb.pitch_radius)
    miss = float(np.linalg.norm(pa - pb))
    if miss > FIT_TOLERANCE * scale:
        raise InputError(where, f"the shaft axes of a bevel pair must intersect; they miss by {miss * 1e3:.6g} mm",
                         f"within {FIT_TOLERANCE * scale * 1e3:.3g} mm")
    apex = 0.5 * (pa + pb)
    teeth = _teeth_ratio(ga, gb)
    ra = ga.pitch_radius
    rb = ra / teeth if teeth is not None else gb.pitch_radius
    if abs(rb - gb.pitch_radius) > FIT_TOLERANCE * gb.pitch_radius:
        raise InputError(where, f"the mean radii ratio disagrees with the teeth ratio {ga.teeth}/{gb.teeth}",
                         f"within {FIT_TOLERANCE:.1%}")
    d = cb - ca
    perp = d - float(d @ axa) * axa
    out_a = perp / np.linalg.norm(perp)
    point = ca + ra * out_a
    rel_b = point - cb
    out_b_len = float(np.linalg.norm(rel_b - float(rel_b @ axb) * axb))
    off_plane = abs(float(rel_b @ axb))
    if abs(out_b_len - rb) > FIT_TOLERANCE * scale * 10 or off_plane > FIT_TOLERANCE * scale * 10:
        raise InputError(where, f"the gears' mean pitch circles do not meet: gear {gb.id!r} is "
                         f"{abs(out_b_len - rb) * 1e3:.4g} mm off radially and {off_plane * 1e3:.4g} mm axially",
                         f"within {FIT_TOLERANCE * scale * 10e3:.3g} mm")
    out_b = (rel_b - float(rel_b @ axb) * axb) / out_b_len
    dirs, cones = [], []
    for g, c, ax, r in ((ga, ca, axa, ra), (gb, cb, axb, rb)):
        along = float((c - apex) @ ax)
        gamma = math.atan2(r, abs(along))
        if g.cone_angle is not None and abs(g.cone_angle - gamma) > math.radians(0.5):
            raise InputError(g.path or f"gear {g.id!r}", f"pitch cone angle {math.degrees(g.cone_angle):.4g} deg "
                             f"disagrees with the layout ({math.degrees(gamma):.4g} deg)", "within 0.5 deg")
        dirs.append(ax if along >= 0 else -ax)
        cones.append(gamma)
    ta, tb = cross(axa, out_a), cross(axb, out_b)
    ratio = (ra / rb) * float(ta @ tb)
    return MeshGeometry(mid, k, "bevel", (ga, gb), (ia, ib), point, (ca, cb), (ra, rb), (out_a, out_b),
                        (dirs[0], dirs[1]), (cones[0], cones[1]), ratio, eta)


def _port_index(drive: Drive, port: Port, where: str) -> int:
    ids = [s.id for s in drive.shafts]
    if port.shaft not in ids:
        raise InputError(f"{where}.shaft", f"no shaft with id {port.shaft!r}", ", ".join(ids))
    i = ids.index(port.shaft)
    el = drive.shafts[i].element(port.element)
    names = [e.id for e in drive.shafts[i].couplings] + [e.id for e in drive.shafts[i].pulleys]
    if el is None or el.id not in names:
        raise InputError(f"{where}.element", f"no coupling or pulley {port.element!r} on shaft {port.shaft!r}",
                         ", ".join(names) or "add a coupling or pulley")
    return i


def solve_train(drive: Drive, geometry: tuple[MeshGeometry, ...] | None = None) -> TrainResult:
    """Speeds, torques and the power flow of the whole drive."""
    geo = mesh_geometry(drive) if geometry is None else geometry
    n = len(drive.shafts)
    i_in = _port_index(drive, drive.input, drive.input.path or "input")
    out_idx = [_port_index(drive, p, p.path or f"outputs[{j}]") for j, p in enumerate(drive.outputs)]
    for j, i in enumerate(out_idx):
        if i == i_in:
            raise InputError(drive.outputs[j].path or f"outputs[{j}]", "an output on the input shaft is not "
                             "modelled", "an output on another shaft")
    adj: list[list[tuple[MeshGeometry, int]]] = [[] for _ in range(n)]
    for g in geo:
        adj[g.shaft[0]].append((g, 0))
        adj[g.shaft[1]].append((g, 1))

    speed = np.full(n, np.nan)
    speed[i_in] = drive.speed
    parent: list[tuple[MeshGeometry, int] | None] = [None] * n
    order = [i_in]
    queue = deque([i_in])
    seen_mesh: set[int] = set()
    while queue:
        i = queue.popleft()
        for g, side in adj[i]:
            if g.index in seen_mesh:
                continue
            seen_mesh.add(g.index)
            j = g.shaft[1 - side]
            w = speed[i] * (g.ratio if side == 0 else 1.0 / g.ratio)
            if np.isnan(speed[j]):
                speed[j] = w
                parent[j] = (g, side)
                order.append(j)
                queue.append(j)
            elif abs(speed[j] - w) > 1e-9 * abs(w):
                raise MechanismError(g.gear[0].path or f"meshes[{g.index}]",
                                     f"the meshes form a loop whose ratios disagree: shaft "
                                     f"{drive.shafts[j].id!r} would turn at {speed[j] * 30 / math.pi:.6g} and "
                                     f"{w * 30 / math.pi:.6g} rpm", "a gear train without contradictions")
            else:
                raise MechanismError(f"meshes[{g.index}]", f"the meshes form a closed loop through shaft "
                                     f"{drive.shafts[j].id!r}: the torque split between the paths is statically "
                                     "indeterminate", "a tree of meshes (no loops)")
    for j in range(n):
        if np.isnan(speed[j]):
            raise InputError(drive.shafts[j].path or f"shafts[{j}]", f"shaft {drive.shafts[j].id!r} is not "
                             "connected to the input through any mesh", "every shaft geared to the input")

    total_share = sum(p.share for p in drive.outputs)
    share = {j: 0.0 for j in range(n)}
    for p, j in zip(drive.outputs, out_idx):
        share[j] += p.share / total_share
    # demand[j] * P_out is the power shaft j takes from its parent mesh.
    demand = np.zeros(n)
    for j in reversed(order):
        demand[j] += share[j]
        par = parent[j]
        if par is not None:
            g, side = par
            demand[g.shaft[side]] += demand[j] / g.efficiency

    given = [(p, j) for p, j in zip((drive.input, *drive.outputs), (i_in, *out_idx))
             if p.power is not None or p.torque is not None]
    p_given, j_given = given[0]
    power = p_given.power if p_given.power is not None else p_given.torque * abs(speed[j_given])
    if p_given is drive.input:
        p_out = power / demand[i_in]
    else:
        k = [q for q in drive.outputs].index(p_given)
        p_out = power / (drive.outputs[k].share / total_share)
    p_in = demand[i_in] * p_out

    flows = []
    for j in order[1:]:
        par = parent[j]
        assert par is not None          # every shaft but the input has a parent mesh
        g, side = par
        driver = side
        p_mesh = demand[j] * p_out / g.efficiency
        v_pitch = abs(speed[g.shaft[driver]]) * g.radius[driver]
        wt = p_mesh / v_pitch
        loss = (1.0 - g.efficiency) * wt * g.radius[1 - driver]
        flows.append(MeshFlow(g, driver, float(wt), float(p_mesh), float(loss)))
    flows.sort(key=lambda fl: fl.geometry.index)
    # Dead-end meshes (no flow) still appear, with zero load.
    done = {fl.geometry.index for fl in flows}
    for g in geo:
        if g.index not in done:
            flows.append(MeshFlow(g, 0, 0.0, 0.0, 0.0))
    flows.sort(key=lambda fl: fl.geometry.index)

    port_torque: dict[tuple[str, str], float] = {}
    port_power: dict[tuple[str, str], float] = {}
    sgn = math.copysign(1.0, drive.speed)
    port_torque[(drive.input.shaft, drive.input.element)] = sgn * p_in / abs(drive.speed)
    port_power[(drive.input.shaft, drive.input.element)] = p_in
    for p, j in zip(drive.outputs, out_idx):
        pk = p.share / total_share * p_out
        key = (p.shaft, p.element)
        port_torque[key] = port_torque.get(key, 0.0) - math.copysign(1.0, speed[j]) * pk / abs(speed[j])
        port_power[key] = port_power.get(key, 0.0) - pk
    return TrainResult(speed=speed, meshes=tuple(flows), port_torque=port_torque, port_power=port_power,
                       power_in=float(p_in), power_out=float(p_out))

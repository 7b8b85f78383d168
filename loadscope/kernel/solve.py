"""Solve a whole drive: mesh forces -> torque flow -> shaft statics ->
internal diagrams -> housing -> bolts, with equilibrium residuals.

The single entry point is :func:`solve`; the steps are small private
functions. Results are returned, never stored on the inputs.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from ..errors import InputError
from . import gears as gear_forces
from .bolts import BoltLoads, bolt_loads
from .model import Coupling, Drive, Gear, Pulley, Shaft
from .shafts import ShaftSolution, local_frame, solve_shaft
from .train import MeshFlow, TrainResult, mesh_geometry, solve_train
from .vec import cross

FloatArray = NDArray[np.float64]


@dataclass(frozen=True)
class Action:
    """One load on a shaft: ``force`` [N] at ``point`` [m] plus ``moment``
    [N*m], global components; ``kind`` is tooth, weight, strand, torque, loss
    or load; ``source`` names the element."""

    shaft: str
    at: float
    kind: str
    source: str
    point: FloatArray
    force: FloatArray
    moment: FloatArray


@dataclass(frozen=True)
class ToothForce:
    """The tooth force on one gear of a mesh (global, [N]) and its parts."""

    mesh: str
    gear: str
    shaft: str
    role: str                 # "driver" or "driven"
    point: FloatArray
    force: FloatArray
    tangential: float
    radial: float
    axial: float


@dataclass(frozen=True)
class ShaftResult:
    """One shaft: speed [rad/s] signed about its axis; the power it passes on
    [W] (what its input port or driving mesh hands it, after mesh losses) and
    the matching torque [N*m] (power / |speed|); ``peak_torque`` the largest
    |T(s)| of its torque diagram [N*m]; its loads and solution."""

    id: str
    speed: float
    torque: float
    power: float
    peak_torque: float
    actions: tuple[Action, ...]
    solution: ShaftSolution

    @property
    def rpm(self) -> float:
        """Speed in rev/min, signed."""
        return self.speed * 30.0 / math.pi


@dataclass(frozen=True)
class HousingResult:
    """What the drive hands to the housing about the bolt-group centroid
    (global [N], [N*m]) and the bolt loads."""

    force: FloatArray
    moment: FloatArray
    reference: FloatArray
    bolt_ids: tuple[str, ...]
    bolts: BoltLoads


@dataclass(frozen=True)
class DriveResult:
    """The solved drive. Residuals are absolute (global [N], [N*m]) and
    relative (divided by the largest force, and by the largest force times
    the drive's size, plus the largest moment)."""

    drive: Drive
    train: TrainResult
    shafts: tuple[ShaftResult, ...]
    teeth: tuple[ToothForce, ...]
    housing: HousingResult | None
    residuals: dict[str, dict[str, float]]

    def shaft(self, ident: str) -> ShaftResult:
        """The result of the shaft with this id."""
        for s in self.shafts:
            if s.id == ident:
                return s
        raise InputError("", f"no shaft with id {ident!r}", ", ".join(s.id for s in self.shafts))

    @property
    def max_residual(self) -> float:
        """The largest relative residual of any balance."""
        return max(max(v["force_rel"], v["moment_rel"]) for v in self.residuals.values())


def _tooth_forces(drive: Drive, flows: tuple[MeshFlow, ...], speed: FloatArray) -> list[ToothForce]:
    out = []
    for fl in flows:
        g = fl.geometry
        drv = fl.driver
        dvn = 1 - drv
        gd = g.gear[dvn]
        sd = g.shaft[dvn]
        axis = np.asarray(drive.shafts[sd].axis, dtype=float)
        motion = math.copysign(1.0, speed[sd])
        if g.kind == "bevel":
            assert g.axis_from_apex is not None and g.cone_angle is not None
            ax = g.axis_from_apex[dvn]
            # t = a_apex x r; the driven gear moves along sign(omega) (axis x r).
            s_move = motion * float(cross(axis, g.radial_out[dvn]) @ cross(ax, g.radial_out[dvn]))
            f = gear_forces.bevel_tooth_force(fl.tangential, ax, g.radial_out[dvn], s_move, gd.pressure_angle,
                                              g.cone_angle[dvn])
        else:
            hand = 0.0 if gd.kind == "spur" else (1.0 if gd.hand == "right" else -1.0)
            f = gear_forces.cylindrical_tooth_force(fl.tangential, axis, g.radial_out[dvn], motion,
                                                    gd.pressure_angle, gd.helix_angle, hand, gd.internal)
        for role, k, vec in (("driven", dvn, f), ("driver", drv, -f)):
            sh = drive.shafts[g.shaft[k]]
            ax_k = np.asarray(sh.axis, dtype=float)
            t_k = cross(ax_k, g.radial_out[k])
            out.append(ToothForce(g.mesh_id, g.gear[k].id, sh.id, role, g.point, vec,
                                  tangential=abs(float(vec @ t_k)), radial=abs(float(vec @ g.radial_out[k])),
                                  axial=abs(float(vec @ ax_k))))
    return out


def _strand_actions(shaft: Shaft, pulley_id: str, torque: float) -> list[Action]:
    """Strand tensions that give ``torque`` [N*m] about the axis (signed)."""
    p = next(q for q in shaft.pulleys if q.id == pulley_id)
    frame = local_frame(shaft.axis)
    axis = frame[0]
    center = np.asarray(shaft.origin, dtype=float) + p.at * axis
    dirs = [math.cos(a) * frame[1] + math.sin(a) * frame[2] for a in p.strand_angles]
    signs = (-float(p.wrap), float(p.wrap))     # torque sense of strand 0 and strand 1 (see Pulley)
    # torque = r (sign_tight T_tight + sign_slack T_slack), T_tight = k T_slack
    tight = 1 if signs[1] * torque > 0 else 0
    k = p.tension_ratio
    mag = abs(torque) / p.pitch_radius
    t_tight = mag if math.isinf(k) else mag * k / (k - 1.0)
    t_slack = 0.0 if math.isinf(k) else mag / (k - 1.0)
    tensions = [0.0, 0.0]
    tensions[tight], tensions[1 - tight] = t_tight, t_slack
    acts = []
    for j in (0, 1):
        point = center + signs[j] * p.pitch_radius * cross(dirs[j], axis)
        force = tensions[j] * dirs[j]
        acts.append(Action(shaft.id, p.at, "strand", f"{p.id}.strand{j}", point, force, np.zeros(3)))
    return acts


def _actions(drive: Drive, train: TrainResult, teeth: list[ToothForce]) -> list[list[Action]]:
    acts: list[list[Action]] = [[] for _ in drive.shafts]
    index = {s.id: i for i, s in enumerate(drive.shafts)}
    zero = np.zeros(3)
    for tf in teeth:
        i = index[tf.shaft]
        g = drive.shafts[i].element(tf.gear)
        assert g is not None
        acts[i].append(Action(tf.shaft, g.at, "tooth", f"{tf.mesh}:{tf.gear}", tf.point, tf.force, zero))
    for fl in train.meshes:
        if fl.loss_torque == 0.0:
            continue
        k = 1 - fl.driver
        i = fl.geometry.shaft[k]
        sh = drive.shafts[i]
        axis = np.asarray(sh.axis, dtype=float)
        g = fl.geometry.gear[k]
        c = fl.geometry.center[k]
        m = -math.copysign(1.0, train.speed[i]) * fl.loss_torque * axis
        acts[i].append(Action(sh.id, g.at, "loss", f"{fl.geometry.mesh_id}:loss", c, zero, m))
    for (sid, eid), torque in train.port_torque.items():
        i = index[sid]
        sh = drive.shafts[i]
        el = sh.element(eid)
        assert el is not None
        axis = np.asarray(sh.axis, dtype=float)
        if any(p.id == eid for p in sh.pulleys):
            acts[i].extend(_strand_actions(sh, eid, torque))
        else:
            c = np.asarray(sh.origin, dtype=float) + el.at * axis
            acts[i].append(Action(sid, el.at, "torque", eid, c, zero, torque * axis))
    down = np.array([0.0, -1.0, 0.0])
    for i, sh in enumerate(drive.shafts):
        axis = np.asarray(sh.axis, dtype=float)
        origin = np.asarray(sh.origin, dtype=float)
        heavy: list[Gear | Pulley | Coupling] = [*sh.gears, *sh.pulleys, *sh.couplings]
        for el in heavy:
            if el.weight > 0.0:
                acts[i].append(Action(sh.id, el.at, "weight", el.id, origin + el.at * axis, el.weight * down, zero))
        for ld in sh.loads:
            point = origin + ld.at * axis + np.asarray(ld.offset, dtype=float)
            acts[i].append(Action(sh.id, ld.at, "load", ld.id, point, np.asarray(ld.force, dtype=float),
                                  np.asarray(ld.moment, dtype=float)))
    return acts


def _rel(vec: FloatArray, scale: float) -> float:
    return float(np.linalg.norm(vec)) / scale if scale > 0 else float(np.linalg.norm(vec))


def solve(drive: Drive, samples: int = 64) -> DriveResult:
    """Solve every load in the drive.

    Parameters
    ----------
    drive : Drive
        The drive (SI).
    samples : int
        Interior samples per shaft for the internal diagrams.

    Returns
    -------
    DriveResult
        Tooth forces, shaft speeds and torques, reactions, diagrams,
        deflections, housing and bolt loads and every residual.
    """
    geo = mesh_geometry(drive)
    train = solve_train(drive, geo)
    teeth = _tooth_forces(drive, train.meshes, train.speed)
    acts = _actions(drive, train, teeth)
    inflow = [0.0] * len(drive.shafts)
    inflow[[x.id for x in drive.shafts].index(drive.input.shaft)] = train.power_in
    for fl in train.meshes:
        inflow[fl.geometry.shaft[1 - fl.driver]] += fl.geometry.efficiency * fl.power
    shafts = []
    residuals: dict[str, dict[str, float]] = {}
    f_scale_all = 0.0
    size = 1e-3
    tot_f = np.zeros(3)
    tot_m = np.zeros(3)
    for i, sh in enumerate(drive.shafts):
        a = acts[i]
        origin = np.asarray(sh.origin, dtype=float)
        axis = np.asarray(sh.axis, dtype=float)
        s = np.array([x.at for x in a]) if a else np.zeros(0)
        f = np.array([x.force for x in a]).reshape(-1, 3)
        centers = origin + np.outer(s, axis)
        pts = np.array([x.point for x in a]).reshape(-1, 3)
        m = np.array([x.moment for x in a]).reshape(-1, 3) + cross(pts - centers, f)
        sol = solve_shaft(sh, s, f, m, samples)
        peak = float(np.abs(sol.right[:, 5]).max(initial=0.0))     # T is constant between stations
        power = inflow[i]
        shafts.append(ShaftResult(sh.id, float(train.speed[i]), power / abs(float(train.speed[i])), power, peak,
                                  tuple(a), sol))
        f_scale = max([float(np.abs(f).max(initial=0.0)), float(np.abs(sol.reactions_global).max(initial=0.0))])
        m_scale = float(np.abs(m).max(initial=0.0)) + f_scale * max(sh.length, 1e-3)
        residuals[f"shaft {sh.id}"] = {"force_abs": float(np.linalg.norm(sol.residual_force)),
                                       "moment_abs": float(np.linalg.norm(sol.residual_moment)),
                                       "force_rel": _rel(sol.residual_force, f_scale),
                                       "moment_rel": _rel(sol.residual_moment, m_scale)}
        f_scale_all = max(f_scale_all, f_scale)
        size = max(size, float(np.linalg.norm(origin)) + sh.length)
        # Whole drive about the global origin: every action and reaction.
        sup_pts = origin + np.outer([sp.at for sp in sh.supports], axis)
        tot_f += f.sum(axis=0) + sol.reactions_global.sum(axis=0)
        tot_m += (cross(pts, f) + np.array([x.moment for x in a]).reshape(-1, 3)).sum(axis=0)
        tot_m += cross(sup_pts, sol.reactions_global).sum(axis=0)
    m_scale_all = f_scale_all * size
    residuals["drive"] = {"force_abs": float(np.linalg.norm(tot_f)), "moment_abs": float(np.linalg.norm(tot_m)),
                          "force_rel": _rel(tot_f, f_scale_all), "moment_rel": _rel(tot_m, m_scale_all)}
    housing = _housing(drive, shafts, residuals, f_scale_all, size)
    return DriveResult(drive=drive, train=train, shafts=tuple(shafts), teeth=tuple(teeth), housing=housing,
                       residuals=residuals)


def _housing(drive: Drive, shafts: list[ShaftResult], residuals: dict[str, dict[str, float]],
             f_scale: float, size: float) -> HousingResult | None:
    h = drive.housing
    if h is None:
        return None
    pos = np.array([b.position for b in h.bolts], dtype=float)
    ref = pos.mean(axis=0)
    force = np.zeros(3)
    moment = np.zeros(3)
    for sh, res in zip(drive.shafts, shafts):
        axis = np.asarray(sh.axis, dtype=float)
        pts = np.asarray(sh.origin, dtype=float) + np.outer([sp.at for sp in sh.supports], axis)
        r = -res.solution.reactions_global
        force += r.sum(axis=0)
        moment += cross(pts - ref, r).sum(axis=0)
        for a in res.actions:
            if a.kind == "loss":
                moment -= a.moment
    w = np.array([0.0, -h.weight, 0.0])
    carry_f = -(force + w)
    carry_m = -(moment + cross(np.asarray(h.center_of_mass, dtype=float) - ref, w))
    bolts = bolt_loads(pos, h.plane_normal, carry_f, carry_m, h.bolt_method, h.tipping_point, h.tipping_direction)
    if h.bolt_method == "elastic":
        residuals["housing"] = {"force_abs": float(np.linalg.norm(bolts.residual_force)),
                                "moment_abs": float(np.linalg.norm(bolts.residual_moment)),
                                "force_rel": _rel(bolts.residual_force, max(f_scale, h.weight)),
                                "moment_rel": _rel(bolts.residual_moment, max(f_scale, h.weight) * size)}
    return HousingResult(force=force, moment=moment, reference=ref, bolt_ids=tuple(b.id for b in h.bolts),
                         bolts=bolts)

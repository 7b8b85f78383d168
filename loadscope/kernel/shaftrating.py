"""Shaft ratings: stresses and safety factors at the critical sections, and
stiffness (deflection, slope, mesh misalignment) against allowable values.

Critical sections of a shaft with a material: every element (support, gear,
pulley, coupling, load), every notch feature, every step of diameter (a
shoulder) and the peak of the resultant bending moment. At each, the loads
are taken from the solved diagrams (the larger of the two sides of a
discontinuity; at a step the smaller diameter), and the section is rated as
a rotating shaft: bending fully reversed, torque steady (plus the shaft's
alternating torque share), axial force steady, by
:func:`~loadscope.kernel.sections.shaft_fatigue_factor` and
:func:`~loadscope.kernel.sections.shaft_yield_factor` with the endurance
limit from :func:`~loadscope.kernel.sections.marin_endurance_limit`.

Notch factors: a feature gives Kf, Kfs directly, or Kt, Kts and its radius
(Kf = 1 + q (Kt - 1), q by Neuber for steels of 345 to 1379 MPa, else q = 1
on the safe side). A step with no declared feature takes the first-pass
estimate of a well-rounded shoulder fillet, Kt = 1.7, Kts = 1.5 (Shigley
9th ed. Table 7-1, from memory) with q = 1. A plain section (an element seat
with no feature) has Kf = Kfs = 1: declare a keyseat or groove where there
is one.
"""

from __future__ import annotations

import functools
import math
from typing import Any

import numpy as np

from ..errors import InputError
from . import sections as sec
from . import shaftsize as size
from .model import Shaft
from .ratingcheck import RatingCheck
from .ratingdata import Feature, Material
from .solve import DriveResult, ShaftResult
from .vec import cross

_STEP_KT = (1.7, 1.5)
_STEP_SOURCE = "well-rounded shoulder, Kt 1.7, Kts 1.5 (Shigley 9th ed. Table 7-1, from memory), q = 1"
_NAMES = {"goodman": "DE-Goodman", "gerber": "DE-Gerber", "asme_elliptic": "DE-ASME elliptic",
          "soderberg": "DE-Soderberg"}
_TOL = 1e-9


def loads_at(diagram: dict[str, Any], x: float) -> dict[str, float]:
    """Internal loads at axial position ``x`` [m] from a sampled diagram: the
    larger magnitude of the two sides at a discontinuity, linear
    interpolation of each component between samples (exact: the moments
    are linear and N, T constant between stations). Keys M [N*m] (resultant),
    T [N*m], N [N], deflection [m], slope [rad] (magnitude), theta1, theta2,
    v1, v2."""
    s = diagram["s"]
    hit = np.flatnonzero(np.abs(s - x) <= _TOL)
    if hit.size == 0:
        j = int(np.clip(np.searchsorted(s, x), 1, s.size - 1))
        w = (x - s[j - 1]) / (s[j] - s[j - 1]) if s[j] > s[j - 1] else 0.0
        rows = [(j - 1, 1.0 - w, j, w)]
    else:
        rows = [(int(k), 1.0, int(k), 0.0) for k in hit]
    out: dict[str, float] = {}
    for name in ("M1", "M2", "T", "N", "v1", "v2", "theta1", "theta2"):
        vals = [diagram[name][a] * wa + diagram[name][b] * wb for a, wa, b, wb in rows]
        out[name] = float(max(vals, key=abs))
    m = [math.hypot(diagram["M1"][a] * wa + diagram["M1"][b] * wb, diagram["M2"][a] * wa + diagram["M2"][b] * wb)
         for a, wa, b, wb in rows]
    out["M"] = float(max(m))
    out["deflection"] = math.hypot(out["v1"], out["v2"])
    out["slope"] = math.hypot(out["theta1"], out["theta2"])
    return out


def section_at(shaft: Shaft, x: float) -> tuple[float, float]:
    """(diameter, bore) [m] at ``x``; at a step, the section of the smaller diameter."""
    sec_ = shaft.sections[_section_index(shaft, x)]
    return sec_.diameter, sec_.bore


def _steps(shaft: Shaft) -> list[float]:
    out, start = [], 0.0
    for a, b in zip(shaft.sections[:-1], shaft.sections[1:]):
        start += a.length
        if a.diameter != b.diameter:
            out.append(start)
    return out


@functools.lru_cache(maxsize=256)        # the same notch in every load case: found once
def _feature_factors(f: Feature, mat: Material, path: str) -> tuple[float, float, str]:
    if f.Kf is not None and f.Kfs is not None:
        return f.Kf, f.Kfs, f"{f.kind}, Kf {f.Kf:g}, Kfs {f.Kfs:g} (given)"
    assert f.Kt is not None and f.Kts is not None and f.radius is not None
    lo, hi = sec.NEUBER_SUT_RANGE
    if lo <= mat.Sut <= hi:
        qb = float(sec.notch_sensitivity(f.radius, neuber=sec.neuber_constant_steel(mat.Sut, "bending"), path=path))
        qt = float(sec.notch_sensitivity(f.radius, neuber=sec.neuber_constant_steel(mat.Sut, "torsion"), path=path))
        how = "q by Neuber (Shigley 9th ed. Eqs. 6-32 to 6-35)"
    else:
        qb = qt = 1.0
        how = "q = 1 (Sut outside the Neuber fit; safe side)"
    kf = float(sec.fatigue_factor(f.Kt, qb, path))
    kfs = float(sec.fatigue_factor(f.Kts, qt, path))
    return kf, kfs, f"{f.kind}, Kt {f.Kt:g}, Kts {f.Kts:g}, r {f.radius * 1e3:g} mm, {how}"


def _critical(shaft: Shaft, sr: ShaftResult, mat: Material) -> list[tuple[str, float, float, float, str, str]]:
    """(label, at, Kf, Kfs, notch note, path) of every critical section."""
    p = shaft.path or f"shaft {shaft.id!r}"
    out = []
    for e in shaft.elements():
        out.append((e.id, e.at, 1.0, 1.0, "plain section (no feature declared), Kf = Kfs = 1", e.path or p))
    declared = []
    for i, f in enumerate(shaft.features):
        where = f.path or f"{p}.features[{i}]"
        kf, kfs, note = _feature_factors(f, mat, where)
        out.append((f.id, f.at, kf, kfs, note, where))
        declared.append(f.at)
    for k, x in enumerate(_steps(shaft)):
        if not any(abs(x - a) <= 1e-6 for a in declared):
            out.append((f"step {k + 1}", x, _STEP_KT[0], _STEP_KT[1], _STEP_SOURCE, f"{p}.sections"))
    d = sr.solution.diagram
    x_peak = float(d["s"][int(np.argmax(d["M"]))])
    if not any(abs(x_peak - c[1]) <= 1e-6 for c in out):
        out.append(("peak M", x_peak, 1.0, 1.0, "plain section at the peak resultant moment", p))
    return out


@functools.lru_cache(maxsize=256)        # the same sections in every load case: found once
def _endurance(mat: Material, diameters: tuple[float, ...], path: str) -> sec.EnduranceLimit:
    return sec.marin_endurance_limit(mat.Sut, mat.finish, np.array(diameters), "bending", mat.temperature,
                                     mat.reliability, mat.Se_prime, path=path)


def _clean(value: float, scale: float) -> float:
    """A load below round-off of the shaft's largest is zero (an unloaded
    shaft end then rates as unloaded, not with a factor of 1e17)."""
    return 0.0 if abs(value) <= 1e-9 * scale else abs(value)


def _section_index(shaft: Shaft, x: float) -> int:
    """Index of the section that :func:`section_at` takes at ``x``."""
    start, best = 0.0, -1
    for k, s in enumerate(shaft.sections):
        end = start + s.length
        if start - _TOL <= x <= end + _TOL and (best < 0 or s.diameter < shaft.sections[best].diameter):
            best = k
        start = end
    return best if best >= 0 else len(shaft.sections) - 1


def section_checks(case: str, result: DriveResult) -> list[RatingCheck]:
    """Fatigue and first-cycle yield at every critical section of every shaft
    that has a material (see the module docstring). Each shaft's sections
    go through the formula functions as one array."""
    out: list[RatingCheck] = []
    for shaft, sr in zip(result.drive.shafts, result.shafts):
        mat = shaft.material
        if mat is None:
            continue
        mpath = mat.path or f"{shaft.path or shaft.id}.material"
        crit = _NAMES[mat.criterion]
        diag = sr.solution.diagram
        scale = {k: float(np.abs(diag[k]).max(initial=0.0)) for k in ("M", "T", "N")}
        crits = _critical(shaft, sr, mat)
        loads = [loads_at(diag, c[1]) for c in crits]
        idx = [_section_index(shaft, c[1]) for c in crits]
        for k in sorted(set(idx)):
            d_k = shaft.sections[k].diameter
            if not sec.SIZE_RANGE[0] <= d_k <= sec.SIZE_RANGE[1]:
                raise InputError(f"{shaft.path or shaft.id}.sections[{k}].diameter",
                                 f"{d_k * 1e3:.6g} mm lies outside the Marin size factor's range (Shigley 9th ed. "
                                 "Eq. 6-20); this shaft cannot be rated for fatigue", "2.79 to 254 mm")
        dia = np.array([shaft.sections[k].diameter for k in idx])
        bore = np.array([shaft.sections[k].bore for k in idx])
        ma, tm, fm = (np.array([_clean(ld[q], scale[q]) for ld in loads]) for q in ("M", "T", "N"))
        n_axial = np.array([ld["N"] for ld in loads])
        ta = shaft.alternating_torque * tm
        kf = np.array([c[2] for c in crits])
        kfs = np.array([c[3] for c in crits])
        where = shaft.path or shaft.id
        se = _endurance(mat, tuple(dia.tolist()), mpath)
        st = sec.shaft_stresses(dia, ma, tm, kf, kfs, ta=ta, fm=fm, bore=bore, path=where)
        nf = np.atleast_1d(sec.fatigue_safety_factor(st.alternating, st.midrange, se.se, mat.Sut, mat.Sy,
                                                     mat.criterion, path=where))
        with np.errstate(divide="ignore"):
            ny = np.where(st.maximum > 0.0, mat.Sy / np.where(st.maximum > 0.0, st.maximum, 1.0), np.inf)
        # The inverse, one call per shaft: the diameters that just reach the required factor.
        need = size.section_minimum_diameters(mat.required_factor, ma, tm, kf, kfs, se.se / se.kb, mat.Sut, mat.Sy,
                                              mat.criterion, ta=ta, fm=fm, bore_ratio=bore / dia, path=where)
        cols = {"diameter": dia, "bore": bore, "M": ma, "T": tm, "N": n_axial, "Kf": kf, "Kfs": kfs,
                "bending_stress": sec.bending_stress(ma, dia, bore),
                "torsion_stress": sec.torsion_stress(tm, dia, bore),
                "axial_stress": sec.axial_stress(n_axial, dia, bore), "von_mises_max": st.maximum,
                "alternating_vm": st.alternating, "midrange_vm": st.midrange, "Se": se.se, "ka": se.ka, "kb": se.kb,
                "kd": se.kd, "ke": se.ke, "fatigue_factor": nf, "yield_factor": ny,
                "d_min_fatigue": need.fatigue, "d_min_yield": need.yield_, "d_min": need.governing}
        table = {k: np.broadcast_to(np.asarray(v, dtype=float), dia.shape) for k, v in cols.items()}
        for j, (label, x, _, _, note, path) in enumerate(crits):
            det = {k: float(v[j]) for k, v in table.items()}
            comp = f"{shaft.id} at {label}"
            out.append(RatingCheck(case, "shaft section", comp, f"fatigue factor, {crit}", float(nf[j]),
                                   mat.required_factor, "factor", "min",
                                   f"{crit}, Shigley 9th ed. Eqs. 7-7 to 7-14; Se by Marin factors Eq. 6-18; {note}",
                                   path, x, det))
            out.append(RatingCheck(case, "shaft section", comp, "first-cycle yield factor, von Mises",
                                   float(ny[j]), mat.required_factor, "factor", "min",
                                   f"Shigley 9th ed. Eq. 7-16; {note}", path, x, det))
    return out


# --- stiffness --------------------------------------------------------------------------------------------------

def _tilt(shaft: Shaft, sr: ShaftResult, x: float) -> np.ndarray:
    """The slope of the deflected axis at ``x`` as a global vector [rad]
    (theta1 e1 + theta2 e2; perpendicular to the axis)."""
    ld = loads_at(sr.solution.diagram, x)
    frame = sr.solution.frame
    return ld["theta1"] * frame[1] + ld["theta2"] * frame[2]


def stiffness_checks(case: str, result: DriveResult) -> list[RatingCheck]:
    """Deflection and slope at every gear, slope at every support (the
    supports are rigid, so their deflection is zero by the model), and the
    misalignment of every parallel-axis mesh: |slope_a - s slope_b| with s
    = +1 for shafts whose axes point the same way, -1 for opposite ones.
    Bevel meshes (axes not parallel) are not checked for misalignment."""
    lim = result.drive.limits
    out: list[RatingCheck] = []
    where: dict[str, tuple[Shaft, ShaftResult, float]] = {}
    for shaft, sr in zip(result.drive.shafts, result.shafts):
        diag = sr.solution.diagram
        for g in shaft.gears:
            where[g.id] = (shaft, sr, g.at)
            ld = loads_at(diag, g.at)
            det = {"deflection": ld["deflection"], "slope": ld["slope"], "v1": ld["v1"], "v2": ld["v2"]}
            allow, src = lim.gear_deflection_for(g.pitch_radius, g.teeth)
            comp = f"{shaft.id} at {g.id}"
            path = g.path or comp
            out.append(RatingCheck(case, "stiffness", comp, "deflection at gear", ld["deflection"],
                                   allow, "deflection", "max", f"Euler-Bernoulli deflection; limit {src}", path, g.at,
                                   det))
            out.append(RatingCheck(case, "stiffness", comp, "slope at gear", ld["slope"], lim.gear_slope, "slope",
                                   "max", f"Euler-Bernoulli slope; limit {lim.source('gear_slope')}", path, g.at,
                                   det))
        for s in shaft.supports:
            ld = loads_at(diag, s.at)
            limit, name = lim.bearing_slope(s.bearing.type if s.bearing is not None else None)
            comp = f"{shaft.id}/{s.id}"
            btype = s.bearing.type.replace("_", " ") if s.bearing is not None else "no bearing data"
            out.append(RatingCheck(case, "stiffness", comp, f"slope at bearing ({btype})", ld["slope"], limit,
                                   "slope", "max", f"Euler-Bernoulli slope; limit {lim.source(name)}",
                                   s.path or comp, s.at, {"slope": ld["slope"]}))
    for m in result.drive.meshes:
        (sa, ra, xa), (sb, rb, xb) = where[m.gears[0]], where[m.gears[1]]
        axa, axb = np.asarray(sa.axis), np.asarray(sb.axis)
        if float(np.linalg.norm(cross(axa, axb))) > 1e-9:
            continue
        sign = 1.0 if float(axa @ axb) > 0 else -1.0
        mis = float(np.linalg.norm(_tilt(sa, ra, xa) - sign * _tilt(sb, rb, xb)))
        out.append(RatingCheck(case, "mesh", f"mesh {m.id}", "misalignment (relative slope of the gears)", mis,
                               lim.mesh_misalignment, "slope", "max",
                               f"difference of the shafts' slopes at the mesh; limit {lim.source('mesh_misalignment')}",
                               m.path or f"mesh {m.id}", None, {"misalignment": mis}))
    return out

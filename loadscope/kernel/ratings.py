"""Component ratings: every bearing, shaft section, stiffness limit and bolt
of a solved drive, per load case and over the duty cycle.

The entry point is :func:`rate` (drive -> :class:`DriveRatings`); it solves
the drive once per load case and calls the formula modules
(:mod:`~loadscope.kernel.bearings`, :mod:`~loadscope.kernel.sections`,
:mod:`~loadscope.kernel.fasteners`) on the solved loads. Pure, no I/O.

Every result is a :class:`~loadscope.kernel.ratingcheck.RatingCheck`: one
check of one component in one case, with its value, its allowable, the
sense of the comparison, the method it follows, its margin and its status
(see :mod:`loadscope.kernel.ratingcheck` for the margin and the watch band).

Bearings: Fr and Fa from the support's reaction; a pair (angular-contact or
tapered-roller) carries the shaft's whole thrust by the catalogue method
(:func:`~loadscope.kernel.bearings.paired_axial_loads`). An unpaired
angular-contact or tapered-roller bearing is rated with the axial load the
solver gives it: its induced force is not added (pair it to count it).
Deep-groove X, Y, e come from ISO 281 Table 3; below the table's first row
(f0 Fa / C0 < 0.172) the first row is used (its Y is the largest, the safe
side; common practice); beyond the last row a separate check fails, since
ISO 281 gives no value there.

Results are for preliminary design; they must be checked by a qualified
engineer, and local codes, standards and licensed practice govern.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from . import bearings as brg
from . import fasteners as fst
from .cases import CaseResult, solve_cases
from .model import Drive, Shaft
from .ratingcheck import RatingCheck
from .ratingdata import Bearing, LoadCase
from .shaftrating import section_checks, stiffness_checks
from .solve import DriveResult

DUTY_CYCLE = "duty cycle"


@dataclass(frozen=True)
class CaseRatings:
    """The ratings of one load case: the case, the solved drive and every check."""

    case: LoadCase
    result: DriveResult
    checks: tuple[RatingCheck, ...]


@dataclass(frozen=True)
class DriveRatings:
    """Ratings of a whole drive: one :class:`CaseRatings` per load case and
    the duty-cycle checks (bearing life by Palmgren-Miner; every other
    component at its worst case of the cycle)."""

    drive: Drive
    cases: tuple[CaseRatings, ...]
    duty: tuple[RatingCheck, ...]

    def case(self, name: str) -> CaseRatings:
        """The ratings of the case with this name."""
        for c in self.cases:
            if c.case.name == name:
                return c
        raise KeyError(name)

    @property
    def checks(self) -> tuple[RatingCheck, ...]:
        """Every check of every case, then the duty cycle's."""
        return tuple(c for cr in self.cases for c in cr.checks) + self.duty


# --- bearings ---------------------------------------------------------------------------------------------------

_ISO281 = "ISO 281:2007 (P cl. 6, L10 = (C/P)^p cl. 7, a1 cl. 9.2)"


@dataclass(frozen=True)
class _BearingLoad:
    support: str
    path: str
    bearing: Bearing
    radial: float
    axial: float
    load: float
    speed: float
    details: dict[str, float]


def _equivalent(b: Bearing, fr: float, fa: float, path: str) -> tuple[float, dict[str, float]]:
    """P [N] and the factors used: X, Y are those of the branch taken (1 and
    0 while Fa/Fr <= e), e the limit."""
    fa = abs(fa)
    if b.type == "deep_groove":
        assert b.C0 is not None and b.f0 is not None
        p = float(brg.deep_groove_equivalent_load(fr, fa, b.C0, b.f0, clamp=True, path=path))
        rel = b.f0 * fa / b.C0
        e, x, y = (float(v) for v in brg.deep_groove_factors(rel, clamp=True))
        det = {"relative_axial": rel}
    else:
        x, y, e = b.factors()
        p = float(brg.equivalent_load(fr, fa, x, y, e, path=path))
        det = {}
    if fa <= e * fr:
        x, y = 1.0, 0.0
    return p, dict(det, e=e, X=x, Y=y)


def _shaft_bearing_loads(shaft: Shaft, res: DriveResult, index: int) -> list[_BearingLoad]:
    sr = res.shafts[index]
    sol = sr.solution
    supports = {s.id: (j, s) for j, s in enumerate(shaft.supports)}
    fr_all, fa_all = brg.support_loads(sol.reactions_global, shaft.axis)
    fr_all, fa_all = np.atleast_1d(fr_all), np.atleast_1d(fa_all)
    axial = {sid: float(fa_all[k]) for k, sid in enumerate(sol.support_ids)}
    radial = {sid: float(fr_all[k]) for k, sid in enumerate(sol.support_ids)}
    notes: dict[str, dict[str, float]] = {sid: {} for sid in radial}
    pair = shaft.pair
    if pair is not None:
        a, b = sorted(pair.supports, key=lambda sid: supports[sid][1].at)
        induced = []
        for sid in (a, b):
            bb = supports[sid][1].bearing
            assert bb is not None
            _, y, e = bb.factors()
            where = f"{supports[sid][1].path or sid}.bearing"
            if bb.type == "tapered_roller":
                induced.append(float(brg.tapered_roller_induced_load(radial[sid], y, path=where)))
            else:
                induced.append(float(brg.angular_contact_induced_load(radial[sid], e, path=where)))
        thrust = -sum(axial.values())
        pl = brg.paired_axial_loads(induced[0], induced[1], thrust, pair.arrangement, path=pair.path or "pair")
        axial[a], axial[b] = float(pl.axial_1), float(pl.axial_2)
        notes[a]["induced_axial"], notes[b]["induced_axial"] = induced
    out = []
    for sid, (_, sup) in supports.items():
        if sup.bearing is None:
            continue
        where = f"{sup.path or sid}.bearing"
        p, det = _equivalent(sup.bearing, radial[sid], axial[sid], where)
        det.update(notes[sid], radial=radial[sid], axial=abs(axial[sid]), equivalent_load=p, speed=abs(sr.speed))
        out.append(_BearingLoad(sid, sup.path or f"{shaft.id}.{sid}", sup.bearing, radial[sid], abs(axial[sid]), p,
                                sr.speed, det))
    return out


_Loads = dict[tuple[int, str], _BearingLoad]


def _bearing_loads(res: DriveResult) -> _Loads:
    """Every rated bearing's loads in one solved case, by (shaft index, support id)."""
    return {(i, bl.support): bl for i, sh in enumerate(res.drive.shafts) for bl in _shaft_bearing_loads(sh, res, i)}


_ISO76 = "ISO 76:2006 (P0 = max(X0 Fr + Y0 Fa, Fr) cl. 5.2, 6.2; s0 = C0/P0)"


def _static_check(case: str, comp: str, bl: _BearingLoad, at: float) -> RatingCheck | None:
    """s0 = C0 / P0 against the required s0, for a bearing whose C0 is known."""
    b = bl.bearing
    factors = b.static_factors()
    if factors is None:
        return None
    assert b.C0 is not None
    where = f"{bl.path}.bearing"
    x0, y0 = factors
    p0 = float(brg.static_equivalent_load(bl.radial, bl.axial, x0, y0, where))
    s0 = float(brg.static_safety_factor(b.C0, p0, where))
    need = float(brg.required_static_rating(p0, b.s0_target, where))
    given = "given" if b.x0 is not None and b.y0 is not None else "ISO 76 table"
    src = "given" if b.required_s0 is not None else "common practice"
    return RatingCheck(case, "bearing", comp, "static safety s0", s0, b.s0_target, "factor", "min",
                       f"{_ISO76}; X0 {x0:.3g}, Y0 {y0:.3g} ({given}); required s0 {b.s0_target:g} ({src})",
                       bl.path, at, {"radial": bl.radial, "axial": bl.axial, "X0": x0, "Y0": y0,
                                     "static_equivalent_load": p0, "C0": b.C0, "s0": s0, "required_C0": need})


def _bearing_checks(case: str, res: DriveResult, loads: _Loads | None = None) -> list[RatingCheck]:
    out = []
    loads = _bearing_loads(res) if loads is None else loads
    for (i, _), bl in loads.items():
        shaft = res.drive.shafts[i]
        b = bl.bearing
        where = f"{bl.path}.bearing"
        l10 = float(brg.basic_rating_life(b.C, bl.load, b.rolling, where))
        lnm = float(brg.modified_rating_life(b.C, bl.load, b.rolling, b.reliability, method="weibull", path=where))
        hours = float(brg.life_hours(lnm, bl.speed, where))
        target_rev = brg.revolutions(b.target_life, bl.speed, where)
        need = float(brg.required_dynamic_rating(bl.load, target_rev, b.rolling, b.reliability, method="weibull",
                                                 path=where))
        det = dict(bl.details, L10=l10, L10h=float(brg.life_hours(l10, bl.speed, where)), Lnm=lnm, Lnmh=hours,
                   C=b.C, required_C=need)
        comp = f"{shaft.id}/{bl.support}"
        at = next(s.at for s in shaft.supports if s.id == bl.support)
        rel = f"{b.reliability * 100:g} %"
        out.append(RatingCheck(case, "bearing", comp, f"life Lnm ({rel} reliability)", hours,
                               b.target_life, "life", "min", f"{_ISO281}; {b.type.replace('_', ' ')}, "
                               f"p = {'3' if b.rolling == 'ball' else '10/3'}", bl.path, at, det))
        if b.type == "deep_groove" and bl.axial > 0.0:
            top = float(brg.DEEP_GROOVE_REL[-1])
            out.append(RatingCheck(case, "bearing", comp, "relative axial load f0 Fa/C0",
                                   det["relative_axial"], top, "ratio", "max",
                                   "ISO 281:2007 Table 3 (beyond its last row the bearing is axially overloaded)",
                                   bl.path, at, det))
        static = _static_check(case, comp, bl, at)
        if static is not None:
            out.append(static)
    return out


def _bearing_duty(runs: tuple[CaseResult, ...], per_case: list[_Loads]) -> list[RatingCheck]:
    if not runs:
        return []
    shares = np.array([r.case.share for r in runs])
    out = []
    drive = runs[0].result.drive
    for key, first in per_case[0].items():
        i, sid = key
        b = first.bearing
        loads = np.array([pc[key].load for pc in per_case])
        speeds = np.array([pc[key].speed for pc in per_case])
        where = f"{first.path}.bearing"
        life = brg.duty_cycle_life(b.C, loads, speeds, shares, b.rolling, b.reliability, method="weibull",
                                   path=where)
        shaft = drive.shafts[i]
        # The life goes as C^p, so the rating that just reaches the target follows by scaling.
        need = b.C * (b.target_life / float(life.hours)) ** (1.0 / brg.LIFE_EXPONENT[b.rolling])
        det = {"equivalent_load": float(life.equivalent_load), "Lnm": float(life.life), "Lnmh": float(life.hours),
               "C": b.C, "required_C": need}
        for r, share in zip(runs, np.atleast_1d(life.damage_share)):
            det[f"damage_share[{r.case.name}]"] = float(share)
        at = next(s.at for s in shaft.supports if s.id == sid)
        rel = f"{b.reliability * 100:g} %"
        out.append(RatingCheck(DUTY_CYCLE, "bearing", f"{shaft.id}/{sid}", f"life Lnm ({rel} reliability), cycle",
                               float(life.hours), b.target_life, "life", "min",
                               "ISO 281:2007 cl. 6.3 p-mean load weighted by revolutions; Palmgren-Miner",
                               first.path, at, det))
    return out


# --- bolts ------------------------------------------------------------------------------------------------------

def _bolt_checks(case: str, res: DriveResult) -> list[RatingCheck]:
    h = res.drive.housing
    if h is None or h.fastener is None or res.housing is None:
        return []
    f = h.fastener
    strength = f.strength()
    pitch = f.thread_pitch()
    loads = res.housing.bolts
    out = []
    for i, bolt_id in enumerate(res.housing.bolt_ids):
        path = h.bolts[i].path or f"housing.bolts[{i}]"
        ext = float(loads.tension[i])
        shear = float(loads.shear[i])
        fb = float(fst.bolt_tension(ext, f.preload, f.stiffness_fraction, f.path))
        chk = fst.bolt_check(fb, shear, f.diameter, pitch, strength, f.shear_plane, form=f.form, path=f.path)
        det = {"external_tension": ext, "bolt_tension": fb, "shear": shear,
               "tensile_stress": float(chk.tensile_stress), "shear_stress": float(chk.shear_stress),
               "von_mises": float(chk.von_mises), "proof_factor": float(chk.proof_factor),
               "yield_factor": float(chk.yield_factor), "tensile_factor": float(chk.tensile_factor)}
        comp = f"bolt {bolt_id}"
        thread = "thread" if f.shear_plane == "thread" else "shank"
        out.append(RatingCheck(case, "bolt", comp, f"tension + shear vs proof ({thread} in shear)",
                               float(chk.proof_factor), f.required_factor, "factor", "min",
                               f"von Mises, Shigley 9th ed. Eq. 8-24 and Sec. 8-12, no friction counted; "
                               f"{strength.source}", path,
                               None, det))
        if f.preload > 0.0 and f.stiffness_fraction < 1.0 and ext > 0.0:
            n0 = f.preload / (ext * (1.0 - f.stiffness_fraction))
            out.append(RatingCheck(case, "bolt", comp, "joint separation", n0, 1.0, "factor", "min",
                                   "n0 = Fi / (P (1 - C)), Shigley 9th ed. Sec. 8-9 (from memory)", path, None,
                                   dict(det, separation_factor=n0)))
    return out


# --- the whole drive --------------------------------------------------------------------------------------------

def rate_case(result: DriveResult, case: LoadCase, bearing_loads: _Loads | None = None) -> tuple[RatingCheck, ...]:
    """Every check of one solved load case: bearings with data (life; static
    safety where C0 is known), every critical section of every shaft with a
    material, stiffness at every gear, bearing and mesh, every bolt when the
    housing has fastener data. ``bearing_loads``: the case's bearing loads
    when already found (:func:`rate` shares them with the duty cycle)."""
    name = case.name
    out: list[RatingCheck] = []
    out += _bearing_checks(name, result, bearing_loads)
    out += section_checks(name, result)
    out += stiffness_checks(name, result)
    out += _bolt_checks(name, result)
    return tuple(out)


def _worst_of_cycle(cases: tuple[CaseRatings, ...]) -> list[RatingCheck]:
    """Each (kind, component, check) outside the bearings' life at its worst case."""
    worst: dict[tuple[str, str, str], RatingCheck] = {}
    for cr in cases:
        for c in cr.checks:
            if c.kind == "bearing" and c.unit == "life":
                continue
            key = (c.kind, c.component, c.check)
            if key not in worst or c.margin < worst[key].margin:
                worst[key] = c
    return [RatingCheck(DUTY_CYCLE, c.kind, c.component, c.check, c.value, c.allowable, c.unit, c.sense,
                        f"{c.method}; worst case of the cycle ({c.case})", c.path, c.at, c.details)
            for c in worst.values()]


def rate(drive: Drive, samples: int = 64) -> DriveRatings:
    """Solve the drive once per load case and rate every component.

    Parameters
    ----------
    drive : Drive
        The drive with its rating data (all optional: ratings appear only for
        what has data; stiffness needs none).
    samples : int
        Interior samples per shaft for the diagrams.

    Returns
    -------
    DriveRatings
        Per case: the solved drive and every :class:`RatingCheck`; and the
        duty cycle: bearing life by Palmgren-Miner over the cases, every other
        check at its worst case.
    """
    runs = solve_cases(drive, samples)
    loads = [_bearing_loads(r.result) for r in runs]
    cases = tuple(CaseRatings(r.case, r.result, rate_case(r.result, r.case, ld)) for r, ld in zip(runs, loads))
    duty = tuple(_bearing_duty(runs, loads)) + tuple(_worst_of_cycle(cases))
    return DriveRatings(drive, cases, duty)

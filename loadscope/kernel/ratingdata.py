"""Rating inputs: what a drive needs beyond its geometry to be rated.

Frozen value objects in SI units that validate themselves and name their
field path in errors, like :mod:`loadscope.kernel.model`. All of them are
optional on the drive: a drive without rating data still solves, and a
rating appears only for what has data (stiffness needs none: its limits have
defaults). Exceptions to SI, where the trade never uses SI: bearing lives in
hours [h].

* :class:`Bearing` (on a support): type, ratings C and C0, life target.
* :class:`BearingPair` (on a shaft): two angular-contact or tapered-roller
  bearings located together, face-to-face or back-to-back.
* :class:`Material` and :class:`Feature` (on a shaft): strengths, surface,
  fatigue criterion; notches with their stress-concentration factors.
* :class:`StiffnessLimits` (on the drive): allowable deflections and slopes.
* :class:`Fastener` (on the housing): size, class and preload of the bolts.
* :class:`LoadCase` (on the drive): power or torque, speed, share of time.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import ClassVar, Literal

from ..errors import InputError
from . import checks, fasteners
from .bearings import ANGULAR_CONTACT_STATIC_E, static_load_factors
from .fasteners import BoltStrength

BearingType = Literal["deep_groove", "angular_contact", "tapered_roller", "custom"]
RollingKind = Literal["ball", "roller"]
PairArrangement = Literal["face_to_face", "back_to_back"]
FeatureKind = Literal["shoulder", "groove", "keyseat", "other"]
Finish = Literal["ground", "machined", "cold_drawn", "hot_rolled", "as_forged"]
Criterion = Literal["goodman", "gerber", "asme_elliptic", "soderberg"]
BoltStandard = Literal["iso_898_1", "sae_j429"]
ShearPlane = Literal["thread", "shank"]

BEARING_TYPES = ("deep_groove", "angular_contact", "tapered_roller", "custom")
CRITERIA = ("goodman", "gerber", "asme_elliptic", "soderberg")
FINISHES = ("ground", "machined", "cold_drawn", "hot_rolled", "as_forged")

# Ranges of the user-given X, Y, e: ISO 281:2007 Tables 3 and 7 span X = 0.35..1,
# Y = 0..2.3 (ball) and Y = 0.4 cot(alpha) for rollers (up to ~4.6 at 5 deg), e up
# to 1.5 tan(alpha) (from memory; widened a little so catalogue values fit).
X_RANGE = (0.35, 1.0)
Y_RANGE = (0.0, 5.0)
E_RANGE = (0.05, 3.0)
LIFE_RANGE_H = (1.0, 1e7)                    # [h]
X0_RANGE = (0.5, 1.0)                       # ISO 76:2006 Tables 1, 2: X0 is 0.5, 0.6 or 1
S0_RANGE = (0.0, 10.0)                      # required static safety factor, > 0

BEARING_RELIABILITY = (0.90, 0.9995)        # ISO 281:2007 Table 12 span
MATERIAL_RELIABILITY = (0.5, 0.999999)      # Shigley 9th ed. Table 6-5 span
TEMPERATURE_RANGE = (293.15, (1000.0 - 32.0) / 1.8 + 273.15)   # [K], Shigley 9th ed. Eq. 6-27
KT_RANGE = (1.0, 10.0)
#: Se' may not exceed this share of Sut: rotating-beam tests of steels scatter
#: between about 0.4 and 0.6 Sut (Shigley 9th ed. Fig. 6-17 and Eq. 6-8, from
#: memory); a value above contradicts the tensile strength.
SE_PRIME_MAX_RATIO = 0.6
# Catalogue defaults for single-row 40 deg angular-contact ball bearings (ISO 281:2007
# Table 3 row alpha = 40 deg: e = 1.14, X = 0.35, Y = 0.57; from memory).
ANGULAR_CONTACT_DEFAULTS = {"x": 0.35, "y": 0.57, "e": 1.14}
TAPERED_ROLLER_X = 0.4      # ISO 281:2007 Table 7, single row, Fa/Fr > e (from memory)


def _opt_positive(value: float | None, path: str, unit: str) -> None:
    if value is not None:
        checks.positive(value, path, unit)


@dataclass(frozen=True)
class Bearing:
    """A rolling bearing in a support.

    ``type``: ``deep_groove`` (X, Y, e from ISO 281 Table 3; needs ``C0`` and
    ``f0``), ``angular_contact`` (single row; X, Y, e default to the 40 deg
    row, induced axial force ``R`` Fr with R = e), ``tapered_roller`` (X =
    0.4; ``y`` and ``e`` from the catalogue) or ``custom`` (``x``, ``y``,
    ``e`` and ``kind`` all given). ``C``, ``C0`` [N] basic dynamic and static
    load ratings; ``target_life`` [h]; ``reliability`` of the life (0.9 for
    L10). ``kind`` ball (p = 3) or roller (p = 10/3) follows from the type
    unless custom. Static check (when ``C0`` is given): ``x0``, ``y0`` the
    ISO 76 static factors (from ISO 76 by type when absent; required for
    custom) and ``required_s0`` the static safety factor to reach (absent:
    1 ball, 1.5 roller, common practice).
    """

    type: BearingType
    C: float
    target_life: float
    C0: float | None = None
    f0: float | None = None
    x: float | None = None
    y: float | None = None
    e: float | None = None
    kind: RollingKind | None = None
    reliability: float = 0.9
    x0: float | None = None
    y0: float | None = None
    required_s0: float | None = None
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = self.path or "bearing"
        if self.type not in BEARING_TYPES:
            raise InputError(f"{p}.type", f"unknown bearing type {self.type!r}", ", ".join(BEARING_TYPES))
        checks.positive(self.C, f"{p}.C", "N")
        _opt_positive(self.C0, f"{p}.C0", "N")
        checks.within(self.target_life, *LIFE_RANGE_H, f"{p}.target_life", "h")
        checks.within(self.reliability, *BEARING_RELIABILITY, f"{p}.reliability")
        if self.x is not None:
            checks.within(self.x, *X_RANGE, f"{p}.x")
        if self.y is not None:
            checks.within(self.y, *Y_RANGE, f"{p}.y")
        if self.e is not None:
            checks.within(self.e, *E_RANGE, f"{p}.e")
        if self.kind is not None and self.kind not in ("ball", "roller"):
            raise InputError(f"{p}.kind", f"unknown rolling element {self.kind!r}", "ball, roller")
        if self.type == "deep_groove":
            if self.C0 is None or self.f0 is None:
                missing = "C0" if self.C0 is None else "f0"
                raise InputError(f"{p}.{missing}", "a deep-groove bearing needs C0 and f0 for ISO 281 Table 3",
                                 "C0 > 0 N and f0 5 to 20 (catalogue)")
            checks.within(self.f0, 5.0, 20.0, f"{p}.f0")
            self._only(p, ("x", "y", "e"), "are read from ISO 281 Table 3 for a deep-groove bearing")
        elif self.type == "tapered_roller":
            for name in ("y", "e"):
                if getattr(self, name) is None:
                    raise InputError(f"{p}.{name}", "a tapered roller bearing needs Y and e from its catalogue",
                                     "y 0 to 5, e 0.05 to 3")
            if self.x is not None and self.x != TAPERED_ROLLER_X:
                raise InputError(f"{p}.x", f"is 0.4 for tapered roller bearings (ISO 281), got {self.x:g}",
                                 "omit, or 0.4")
        elif self.type == "custom":
            for name in ("x", "y", "e", "kind"):
                if getattr(self, name) is None:
                    raise InputError(f"{p}.{name}", "a custom bearing needs x, y, e and kind", "all four given")
        if self.x0 is not None:
            checks.within(self.x0, *X0_RANGE, f"{p}.x0")
        if self.y0 is not None:
            checks.within(self.y0, *Y_RANGE, f"{p}.y0")
        if self.required_s0 is not None:
            v = checks.finite(self.required_s0, f"{p}.required_s0")
            if not S0_RANGE[0] < v <= S0_RANGE[1]:
                raise InputError(f"{p}.required_s0", f"a static safety factor to reach must be above 0, got {v:g}"
                                 if v <= 0.0 else f"is out of range, got {v:g}", "0 < required_s0 <= 10")
        if self.C0 is not None and (self.x0 is None or self.y0 is None):
            self._static_table_covers(p)
        if self.C0 is not None and self.C0 > 20.0 * self.C:
            raise InputError(f"{p}.C0", f"{self.C0:.6g} N is more than 20 times C: ratings swapped?",
                             f"<= {20.0 * self.C:.6g} N")

    def _only(self, p: str, names: tuple[str, ...], why: str) -> None:
        for name in names:
            if getattr(self, name) is not None:
                raise InputError(f"{p}.{name}", f"{', '.join(names)} {why}", "omit")

    def _static_table_covers(self, p: str) -> None:
        missing = "x0" if self.x0 is None else "y0"
        if self.type == "custom":
            raise InputError(f"{p}.{missing}", "a custom bearing with C0 needs x0 and y0 (ISO 76) for its static "
                             "check", "x0 0.5 to 1, y0 0 to 5")
        if self.type == "angular_contact" and self.y0 is None:
            e = self.factors()[2]
            lo, hi = float(ANGULAR_CONTACT_STATIC_E[0]), float(ANGULAR_CONTACT_STATIC_E[-1])
            if not lo <= e <= hi:
                raise InputError(f"{p}.y0", f"ISO 76 Table 1 gives Y0 for contact angles 20 to 45 deg (e {lo:g} to "
                                 f"{hi:g}); e is {e:g}", "y0 0 to 5 from the catalogue")

    def static_factors(self) -> tuple[float, float] | None:
        """(X0, Y0) of ISO 76 for the static equivalent load, the given ones
        first; None without C0 (no static check)."""
        if self.C0 is None:
            return None
        if self.x0 is not None and self.y0 is not None:
            return self.x0, self.y0
        x0, y0 = static_load_factors(self.type, self.factors()[2] if self.type != "deep_groove" else 1.0)
        return (float(x0) if self.x0 is None else self.x0), (float(y0) if self.y0 is None else self.y0)

    @property
    def s0_target(self) -> float:
        """The static safety factor to reach: ``required_s0``, else 1 (ball) or 1.5 (roller), common practice."""
        if self.required_s0 is not None:
            return self.required_s0
        return 1.5 if self.rolling == "roller" else 1.0

    @property
    def rolling(self) -> RollingKind:
        """ball or roller (the life exponent's kind)."""
        if self.kind is not None:
            return self.kind
        return "roller" if self.type == "tapered_roller" else "ball"

    def factors(self) -> tuple[float, float, float]:
        """(X, Y, e) for Fa/Fr > e, for every type but deep groove."""
        if self.type == "angular_contact":
            d = ANGULAR_CONTACT_DEFAULTS
            return (self.x if self.x is not None else d["x"], self.y if self.y is not None else d["y"],
                    self.e if self.e is not None else d["e"])
        if self.type == "tapered_roller":
            assert self.y is not None and self.e is not None
            return TAPERED_ROLLER_X, self.y, self.e
        assert self.x is not None and self.y is not None and self.e is not None
        return self.x, self.y, self.e


@dataclass(frozen=True)
class BearingPair:
    """Two angular-contact or tapered-roller bearings (``supports``, ids on
    the shaft) that locate the shaft together in ``arrangement``."""

    supports: tuple[str, str]
    arrangement: PairArrangement
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = self.path or "pair"
        if len(self.supports) != 2 or self.supports[0] == self.supports[1]:
            raise InputError(f"{p}.supports", f"a pair joins two different supports, got {list(self.supports)!r}",
                             "[support id, support id]")
        if self.arrangement not in ("face_to_face", "back_to_back"):
            raise InputError(f"{p}.arrangement", f"unknown arrangement {self.arrangement!r}",
                             "face_to_face, back_to_back")


@dataclass(frozen=True)
class Material:
    """Shaft material and the fatigue method.

    ``Sut``, ``Sy`` [Pa]; ``Se_prime`` [Pa] the rotating-beam endurance limit
    (0.5 Sut up to 1400 MPa when not given, Shigley Eq. 6-8); ``finish`` for
    the Marin surface factor; ``temperature`` [K]; ``reliability`` for the
    Marin reliability factor; ``criterion`` the DE fatigue criterion;
    ``required_factor`` the safety factor a section must reach (fatigue and
    first-cycle yield; 1.5 by default, common practice).
    """

    Sut: float
    Sy: float
    Se_prime: float | None = None
    finish: Finish = "machined"
    temperature: float = 293.15
    reliability: float = 0.99
    criterion: Criterion = "goodman"
    required_factor: float = 1.5
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = self.path or "material"
        checks.within(self.Sut, 100e6, 3000e6, f"{p}.Sut", "Pa")
        checks.positive(self.Sy, f"{p}.Sy", "Pa")
        if self.Sy > self.Sut:
            raise InputError(f"{p}.Sy", f"{self.Sy / 1e6:.6g} MPa exceeds the tensile strength "
                             f"{self.Sut / 1e6:.6g} MPa", f"<= Sut = {self.Sut / 1e6:.6g} MPa")
        if self.Se_prime is not None:
            checks.positive(self.Se_prime, f"{p}.Se_prime", "Pa")
            top = SE_PRIME_MAX_RATIO * self.Sut
            if self.Se_prime > top:
                raise InputError(f"{p}.Se_prime", f"{self.Se_prime / 1e6:.6g} MPa contradicts the tensile strength: "
                                 f"more than {SE_PRIME_MAX_RATIO:g} Sut (steels, Shigley 9th ed. Fig. 6-17)",
                                 f"0 < Se' <= {top / 1e6:.6g} MPa")
        if self.finish not in FINISHES:
            raise InputError(f"{p}.finish", f"unknown surface finish {self.finish!r}", ", ".join(FINISHES))
        if self.criterion not in CRITERIA:
            raise InputError(f"{p}.criterion", f"unknown fatigue criterion {self.criterion!r}", ", ".join(CRITERIA))
        checks.within(self.temperature, *TEMPERATURE_RANGE, f"{p}.temperature", "K")
        checks.within(self.reliability, *MATERIAL_RELIABILITY, f"{p}.reliability")
        checks.within(self.required_factor, 1.0, 10.0, f"{p}.required_factor")


@dataclass(frozen=True)
class Feature:
    """A notch on a shaft at axial position ``at`` [m]: a shoulder fillet,
    a groove, a keyseat. Give ``Kt``, ``Kts`` (theoretical factors in
    bending and torsion, >= 1) with the notch ``radius`` [m] (for the notch
    sensitivity), or the fatigue factors ``Kf``, ``Kfs`` directly."""

    id: str
    kind: FeatureKind
    at: float
    Kt: float | None = None
    Kts: float | None = None
    radius: float | None = None
    Kf: float | None = None
    Kfs: float | None = None
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = self.path or f"feature {self.id!r}"
        if self.kind not in ("shoulder", "groove", "keyseat", "other"):
            raise InputError(f"{p}.kind", f"unknown feature kind {self.kind!r}", "shoulder, groove, keyseat, other")
        checks.finite(self.at, f"{p}.at", "m")
        theory = (self.Kt, self.Kts, self.radius)
        fatigue = (self.Kf, self.Kfs)
        if any(v is not None for v in fatigue):
            if any(v is not None for v in theory) or None in fatigue:
                raise InputError(p, "give Kt, Kts and radius, or Kf and Kfs", "one of the two sets, complete")
        elif None in theory:
            missing = ("Kt", "Kts", "radius")[theory.index(None)]
            raise InputError(f"{p}.{missing}", "is required (or give Kf and Kfs)", "Kt, Kts 1 to 10; radius > 0 m")
        for name in ("Kt", "Kts", "Kf", "Kfs"):
            v = getattr(self, name)
            if v is not None:
                v = checks.finite(v, f"{p}.{name}")
                if v < 1.0:
                    raise InputError(f"{p}.{name}", f"a stress-concentration factor below 1 is not possible, "
                                     f"got {v:.6g}", "1 to 10")
                checks.within(v, *KT_RANGE, f"{p}.{name}")
        _opt_positive(self.radius, f"{p}.radius", "m")


@dataclass(frozen=True)
class StiffnessLimits:
    """Allowable deflections [m] and slopes [rad]. Defaults are the usual
    limits of the trade (Shigley 9th ed. Table 7-2, from memory):
    gear deflection by tooth size when ``gear_deflection`` is None (the
    default; see :meth:`gear_deflection_for`), gear
    slope and mesh misalignment 0.5 mrad (uncrowned spur gears), bearing
    slope by type: deep-groove ball 1 mrad (lower end of 1..3 mrad),
    tapered roller 0.5 mrad, angular-contact ball 0.5 mrad (common practice:
    treated like tapered rollers), custom or no bearing 1 mrad."""

    gear_deflection: float | None = None
    gear_slope: float = 0.5e-3
    mesh_misalignment: float = 0.5e-3
    deep_groove_slope: float = 1.0e-3
    angular_contact_slope: float = 0.5e-3
    tapered_roller_slope: float = 0.5e-3
    other_bearing_slope: float = 1.0e-3
    path: str = field(default="limits", compare=False)

    SOURCES: ClassVar[dict[str, str]] = {
        "gear_deflection": "Shigley 9th ed. Table 7-2 (from memory)",
        "gear_slope": "Shigley 9th ed. Table 7-2 (from memory)",
        "mesh_misalignment": "Shigley 9th ed. Table 7-2 (from memory)",
        "deep_groove_slope": "Shigley 9th ed. Table 7-2 (from memory)",
        "angular_contact_slope": "common practice",
        "tapered_roller_slope": "Shigley 9th ed. Table 7-2 (from memory)",
        "other_bearing_slope": "common practice",
    }

    def __post_init__(self) -> None:
        for name in self.SOURCES:
            v = getattr(self, name)
            if v is not None:
                checks.positive(v, f"{self.path}.{name}", "m" if name == "gear_deflection" else "rad")

    def gear_deflection_for(self, pitch_radius: float, teeth: int | None) -> tuple[float, str]:
        """(allowable deflection [m], source) at a gear. Unless overridden, by
        Shigley 9th ed. Table 7-2 (from memory) in the gear's diametral pitch
        P = 25.4 / m [teeth/in] with the transverse module m = 2 r / z [mm]:
        0.010 in below P = 11, 0.005 in from 11 to below 20, 0.003 in from
        20; 0.005 in when the tooth count is not given.

        >>> StiffnessLimits().gear_deflection_for(0.0285, 19)[0] * 1e3     # m = 3 mm, P = 8.5
        0.254
        """
        if self.gear_deflection is not None:
            return self.gear_deflection, "user limit"
        src = "Shigley 9th ed. Table 7-2 (from memory)"
        if not teeth:
            return 0.005 * 0.0254, f"{src}, tooth size unknown: 0.005 in"
        p_dia = 25.4 / (2e3 * pitch_radius / teeth)
        inches = 0.010 if p_dia < 11 else 0.005 if p_dia < 20 else 0.003
        return inches * 0.0254, f"{src}, P = {p_dia:.3g} teeth/in: {inches:g} in"

    def bearing_slope(self, bearing_type: str | None) -> tuple[float, str]:
        """(limit [rad], field name) for a bearing type (None: no bearing data)."""
        name = {"deep_groove": "deep_groove_slope", "angular_contact": "angular_contact_slope",
                "tapered_roller": "tapered_roller_slope"}.get(bearing_type or "", "other_bearing_slope")
        return float(getattr(self, name)), name

    def source(self, name: str) -> str:
        """Where a limit comes from: the default's source, or "user" when overridden."""
        default = getattr(StiffnessLimits, name)
        return self.SOURCES[name] if getattr(self, name) == default else "user limit"


@dataclass(frozen=True)
class Fastener:
    """The mounting bolts of a housing (all alike): nominal ``diameter`` [m],
    ``pitch`` [m] (None: the coarse thread, ISO 262 or UNC), ``standard``
    ``iso_898_1`` (metric, property class e.g. "8.8") or ``sae_j429`` (inch,
    grade "2", "5", "8"), ``preload`` [N], where the shear plane crosses the
    bolt (``thread`` or ``shank``), the joint constant
    ``stiffness_fraction`` C = kb / (kb + km) (1: all of the external load
    into the bolt, the safe side) and the factor ``required_factor`` the
    combined stress must keep against the proof strength."""

    diameter: float
    grade: str
    standard: BoltStandard = "iso_898_1"
    pitch: float | None = None
    preload: float = 0.0
    shear_plane: ShearPlane = "thread"
    stiffness_fraction: float = 1.0
    required_factor: float = 1.0
    path: str = field(default="housing.fastener", compare=False)

    def __post_init__(self) -> None:
        p = self.path
        checks.positive(self.diameter, f"{p}.diameter", "m")
        _opt_positive(self.pitch, f"{p}.pitch", "m")
        checks.non_negative(self.preload, f"{p}.preload", "N")
        if self.standard not in ("iso_898_1", "sae_j429"):
            raise InputError(f"{p}.standard", f"unknown bolt standard {self.standard!r}", "iso_898_1, sae_j429")
        if self.shear_plane not in ("thread", "shank"):
            raise InputError(f"{p}.shear_plane", f"unknown shear plane {self.shear_plane!r}", "thread, shank")
        checks.within(self.stiffness_fraction, 0.0, 1.0, f"{p}.stiffness_fraction")
        checks.within(self.required_factor, 0.5, 10.0, f"{p}.required_factor")
        # Resolve the strength and thread now, so that a bad class or size is
        # reported at construction, with its path.
        self.strength()
        self.thread_pitch()

    @property
    def form(self) -> Literal["metric", "unified"]:
        """Thread form: metric for ISO 898-1, Unified inch for SAE J429."""
        return "metric" if self.standard == "iso_898_1" else "unified"

    def strength(self) -> BoltStrength:
        """The minimum strengths of the class at this diameter."""
        try:
            if self.standard == "iso_898_1":
                return fasteners.iso_property_class(self.grade, self.diameter, self.path)
            return fasteners.sae_grade(self.grade, self.diameter, self.path)
        except InputError as exc:
            if exc.path.endswith((".property_class", ".grade")):      # the snapshot calls it grade
                raise InputError(f"{self.path}.grade", exc.problem, exc.accepted) from None
            raise

    def thread_pitch(self) -> float:
        """The pitch [m]: given, or the coarse pitch of the nominal size."""
        if self.pitch is not None:
            fasteners.tensile_stress_area(self.diameter, self.pitch, self.form, self.path)
            return self.pitch
        if self.form == "metric":
            return fasteners.metric_coarse_pitch(self.diameter, self.path)
        return fasteners.unc_pitch(self.diameter, self.path)


@dataclass(frozen=True)
class LoadCase:
    """One operating condition: ``power`` [W] or ``torque`` [N*m] at the
    drive's loaded port (None keeps the drive's own), the input ``speed``
    [rad/s] signed like the drive's (None keeps it), and the ``share`` of
    time (0..1; the shares of a drive add up to 1)."""

    name: str
    share: float
    power: float | None = None
    torque: float | None = None
    speed: float | None = None
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = self.path or f"case {self.name!r}"
        if not self.name:
            raise InputError(f"{p}.name", "a load case needs a name", "a non-empty name")
        checks.within(self.share, 0.0, 1.0, f"{p}.share")
        if self.power is not None and self.torque is not None:
            raise InputError(p, "give power or torque, not both", "one of power, torque")
        _opt_positive(self.power, f"{p}.power", "W")
        _opt_positive(self.torque, f"{p}.torque", "N*m")
        if self.speed is not None:
            checks.speed(self.speed, f"{p}.speed")


SHARE_TOLERANCE = 1e-6


def check_cases(cases: tuple[LoadCase, ...]) -> None:
    """Case names unique, shares adding up to 1 (within 1e-6)."""
    names = [c.name for c in cases]
    dup = sorted({n for n in names if names.count(n) > 1})
    if dup:
        raise InputError("cases", f"load case names must be unique, repeated: {', '.join(dup)}", "unique names")
    if cases:
        total = math.fsum(c.share for c in cases)
        if abs(total - 1.0) > SHARE_TOLERANCE:
            raise InputError("cases", f"the shares of time must add up to 1, got {total:.6g}", "sum of shares = 1")

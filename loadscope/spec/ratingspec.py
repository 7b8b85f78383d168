"""The rating part of the snapshot (version 2): bearings, bearing pairs,
shaft materials and notch features, stiffness limits, fasteners, load cases.

Each pydantic model here has a reader (spec -> kernel value object, with the
field path set) and a writer (kernel -> spec, canonical), used by
:mod:`loadscope.spec.snapshot`. Every field is optional in the snapshot: a
version-1 snapshot (no rating data) still reads.
"""

from __future__ import annotations

from typing import Literal

from pydantic import Field

from ..kernel.model import Drive
from ..kernel.ratingdata import (
    Bearing,
    BearingPair,
    Fastener,
    Feature,
    LoadCase,
    Material,
    StiffnessLimits,
)
from .fields import (
    Angle,
    Duration,
    Force,
    Id,
    Length,
    Moment,
    Number,
    Power,
    Pressure,
    Speed,
    Temperature,
    _kernel_default,
    _q,
    _Spec,
)


class BearingSpec(_Spec):
    """A rolling bearing in a support, with its catalogue ratings and life target."""

    type: Literal["deep_groove", "angular_contact", "tapered_roller", "custom"] = Field(
        description="deep_groove (X, Y, e from ISO 281 Table 3; needs C0 and f0), angular_contact (single row; "
                    "X, Y, e default to the 40 deg row 0.35, 0.57, 1.14), tapered_roller (X = 0.4; needs y and e), "
                    "custom (needs x, y, e and kind)")
    C: Force = _q("force", "basic dynamic load rating C (catalogue), > 0")
    C0: Force | None = _q("force", "basic static load rating C0 (catalogue), > 0", None)
    f0: Number | None = Field(None, description="calculation factor f0 (catalogue), 5 to 20; deep groove only")
    x: Number | None = Field(None, description="radial factor X for Fa/Fr > e, 0.35 to 1")
    y: Number | None = Field(None, description="axial factor Y for Fa/Fr > e, 0 to 5")
    e: Number | None = Field(None, description="limit e of Fa/Fr, 0.05 to 3")
    kind: Literal["ball", "roller"] | None = Field(None, description="rolling elements (life exponent 3 or "
                                                                      "10/3); follows from the type unless custom")
    target_life: Duration = _q("duration", "required life Lnm in hours, 1 to 1e7")
    reliability: Number = Field(_kernel_default(Bearing, "reliability"),
                                description="reliability of the life, 0.90 to 0.9995 (0.9: L10)")
    x0: Number | None = Field(None, description="static radial factor X0 (ISO 76), 0.5 to 1; from ISO 76 by type "
                                                "when omitted (needed for custom with C0)")
    y0: Number | None = Field(None, description="static axial factor Y0 (ISO 76), 0 to 5; from ISO 76 by type "
                                                "when omitted (needed for custom with C0)")
    required_s0: Number | None = Field(None, description="static safety factor C0/P0 to reach, 0 to 10; 1 ball, "
                                                         "1.5 roller when omitted (common practice)")


class PairSpec(_Spec):
    """Two angular-contact or tapered-roller bearings that locate the shaft together."""

    supports: tuple[Id, Id] = Field(description="ids of the two supports")
    arrangement: Literal["face_to_face", "back_to_back"] = Field(description="face_to_face (X) or back_to_back (O)")


class MaterialSpec(_Spec):
    """The shaft's material and fatigue method."""

    Sut: Pressure = _q("pressure", "ultimate tensile strength, 100 to 3000 MPa")
    Sy: Pressure = _q("pressure", "yield strength, > 0, <= Sut")
    Se_prime: Pressure | None = _q("pressure", "rotating-beam endurance limit Se', <= 0.6 Sut; 0.5 Sut (at most "
                                               "700 MPa) when omitted", None)
    finish: Literal["ground", "machined", "cold_drawn", "hot_rolled", "as_forged"] = Field(
        _kernel_default(Material, "finish"), description="surface finish for the Marin surface factor")
    temperature: Temperature = _q("temperature", "operating temperature, 20 to 538 degC",
                                  _kernel_default(Material, "temperature"))
    reliability: Number = Field(_kernel_default(Material, "reliability"),
                                description="reliability for the Marin reliability factor, 0.5 to 0.999999")
    criterion: Literal["goodman", "gerber", "asme_elliptic", "soderberg"] = Field(
        _kernel_default(Material, "criterion"), description="distortion-energy fatigue criterion")
    required_factor: Number = Field(_kernel_default(Material, "required_factor"),
                                    description="safety factor every section must reach, 1 to 10")


class FeatureSpec(_Spec):
    """A notch: shoulder fillet, groove or keyseat; Kt, Kts and radius, or Kf and Kfs."""

    id: Id = Field(description="identifier, unique among the features of the shaft")
    kind: Literal["shoulder", "groove", "keyseat", "other"] = Field(description="what the notch is")
    at: Length = _q("length", "axial position from the shaft origin, 0 to the shaft length")
    Kt: Number | None = Field(None, description="theoretical stress-concentration factor in bending, 1 to 10")
    Kts: Number | None = Field(None, description="theoretical stress-concentration factor in torsion, 1 to 10")
    radius: Length | None = _q("length", "notch root radius, > 0 (for the notch sensitivity)", None)
    Kf: Number | None = Field(None, description="fatigue stress-concentration factor in bending, 1 to 10 "
                                                "(instead of Kt, Kts, radius)")
    Kfs: Number | None = Field(None, description="fatigue stress-concentration factor in torsion, 1 to 10")


_LIM = StiffnessLimits()


class LimitsSpec(_Spec):
    """Allowable deflections and slopes (defaults: Shigley 9th ed. Table 7-2, from memory, or common practice)."""

    gear_deflection: Length | None = _q("length", "deflection at a gear; by tooth size when omitted (0.010, "
                                                  "0.005 or 0.003 in, Shigley 9th ed. Table 7-2)", None)
    gear_slope: Angle = _q("angle", "slope at a gear", _LIM.gear_slope)
    mesh_misalignment: Angle = _q("angle", "relative slope of two gears in mesh", _LIM.mesh_misalignment)
    deep_groove_slope: Angle = _q("angle", "slope at a deep-groove ball bearing", _LIM.deep_groove_slope)
    angular_contact_slope: Angle = _q("angle", "slope at an angular-contact bearing", _LIM.angular_contact_slope)
    tapered_roller_slope: Angle = _q("angle", "slope at a tapered roller bearing", _LIM.tapered_roller_slope)
    other_bearing_slope: Angle = _q("angle", "slope at a custom bearing or a support without bearing data",
                                    _LIM.other_bearing_slope)


class FastenerSpec(_Spec):
    """The mounting bolts (all alike): size, class, preload."""

    diameter: Length = _q("length", "nominal diameter (ISO 898-1: M1.6 to M39; SAE J429: 1/4 to 1 1/2 in)")
    grade: str = Field(description="ISO 898-1 property class (4.6 ... 12.9) or SAE J429 grade (2, 5, 8)")
    standard: Literal["iso_898_1", "sae_j429"] = Field(_kernel_default(Fastener, "standard"),
                                                      description="iso_898_1 (metric) or sae_j429 (inch, UNC)")
    pitch: Length | None = _q("length", "thread pitch; the coarse pitch (ISO 262 or UNC) when omitted", None)
    preload: Force = _q("force", "preload per bolt, >= 0", _kernel_default(Fastener, "preload"))
    shear_plane: Literal["thread", "shank"] = Field(_kernel_default(Fastener, "shear_plane"),
                                                    description="what the shear plane crosses")
    stiffness_fraction: Number = Field(_kernel_default(Fastener, "stiffness_fraction"),
                                       description="joint constant C = kb / (kb + km), 0 to 1 (1: all of the "
                                                   "external load into the bolt)")
    required_factor: Number = Field(_kernel_default(Fastener, "required_factor"),
                                    description="factor of the combined stress against the proof strength, "
                                                "0.5 to 10")


class CaseSpec(_Spec):
    """A load case: power or torque at the drive's loaded port, input speed, share of time."""

    name: Id = Field(description="name of the case, unique")
    share: Number = Field(description="share of time, 0 to 1; the shares add up to 1")
    power: Power | None = _q("power", "power at the loaded port (the drive's own when omitted)", None)
    torque: Moment | None = _q("moment", "torque at the loaded port (instead of power)", None)
    speed: Speed | None = _q("speed", "input speed, signed like input.speed (the drive's own when omitted)", None)


# --- readers ----------------------------------------------------------------------------------------------------

def read_bearing(s: BearingSpec, p: str) -> Bearing:
    return Bearing(s.type, s.C, s.target_life, s.C0, s.f0, s.x, s.y, s.e, s.kind, s.reliability, s.x0, s.y0,
                   s.required_s0, path=p)


def read_pair(s: PairSpec, p: str) -> BearingPair:
    return BearingPair((s.supports[0], s.supports[1]), s.arrangement, path=p)


def read_material(s: MaterialSpec, p: str) -> Material:
    return Material(s.Sut, s.Sy, s.Se_prime, s.finish, s.temperature, s.reliability, s.criterion, s.required_factor,
                    path=p)


def read_feature(s: FeatureSpec, p: str) -> Feature:
    return Feature(s.id, s.kind, s.at, s.Kt, s.Kts, s.radius, s.Kf, s.Kfs, path=p)


def read_limits(s: LimitsSpec | None) -> StiffnessLimits:
    if s is None:
        return StiffnessLimits()
    return StiffnessLimits(**{k: getattr(s, k) for k in LimitsSpec.model_fields})


def read_fastener(s: FastenerSpec, p: str) -> Fastener:
    return Fastener(s.diameter, s.grade, s.standard, s.pitch, s.preload, s.shear_plane, s.stiffness_fraction,
                    s.required_factor, path=p)


def read_case(s: CaseSpec, p: str) -> LoadCase:
    return LoadCase(s.name, s.share, s.power, s.torque, s.speed, path=p)


# --- writers (canonical: every field, floats as floats) ---------------------------------------------------------

def _f(v: float | None) -> float | None:
    return None if v is None else float(v)


def write_bearing(b: Bearing) -> BearingSpec:
    return BearingSpec.model_construct(type=b.type, C=float(b.C), C0=_f(b.C0), f0=_f(b.f0), x=_f(b.x), y=_f(b.y),
                                       e=_f(b.e), kind=b.kind, target_life=float(b.target_life),
                                       reliability=float(b.reliability), x0=_f(b.x0), y0=_f(b.y0),
                                       required_s0=_f(b.required_s0))


def write_pair(p: BearingPair) -> PairSpec:
    return PairSpec.model_construct(supports=(p.supports[0], p.supports[1]), arrangement=p.arrangement)


def write_material(m: Material) -> MaterialSpec:
    return MaterialSpec.model_construct(Sut=float(m.Sut), Sy=float(m.Sy), Se_prime=_f(m.Se_prime), finish=m.finish,
                                        temperature=float(m.temperature), reliability=float(m.reliability),
                                        criterion=m.criterion, required_factor=float(m.required_factor))


def write_feature(f: Feature) -> FeatureSpec:
    return FeatureSpec.model_construct(id=f.id, kind=f.kind, at=float(f.at), Kt=_f(f.Kt), Kts=_f(f.Kts),
                                       radius=_f(f.radius), Kf=_f(f.Kf), Kfs=_f(f.Kfs))


def write_limits(lim: StiffnessLimits) -> LimitsSpec | None:
    """None for the default limits (they need not be written)."""
    if lim == StiffnessLimits():
        return None
    return LimitsSpec.model_construct(**{k: _f(getattr(lim, k)) for k in LimitsSpec.model_fields})


def write_fastener(f: Fastener) -> FastenerSpec:
    return FastenerSpec.model_construct(diameter=float(f.diameter), grade=f.grade, standard=f.standard,
                                        pitch=_f(f.pitch), preload=float(f.preload), shear_plane=f.shear_plane,
                                        stiffness_fraction=float(f.stiffness_fraction),
                                        required_factor=float(f.required_factor))


def write_case(c: LoadCase) -> CaseSpec:
    return CaseSpec.model_construct(name=c.name, share=float(c.share), power=_f(c.power), torque=_f(c.torque),
                                    speed=_f(c.speed))


def has_rating_data(drive: Drive) -> bool:
    """Whether the drive carries any rating data (which a version-1 snapshot cannot hold)."""
    h = drive.housing
    return bool(drive.cases or drive.limits != type(drive.limits)() or (h is not None and h.fastener is not None)
                or any(s.material is not None or s.features or s.pair is not None or s.alternating_torque
                       or any(x.bearing is not None for x in s.supports) for s in drive.shafts))

"""The drive snapshot: loadscope's own versioned JSON format of a whole drive.

A snapshot is a JSON object (docs/snapshot.md describes it field by field)::

    {"format": "loadscope.drive", "version": 1, "name": "...",
     "shafts": [...], "meshes": [...], "input": {...}, "outputs": [...],
     "housing": {...}}

Dimensioned values are strings with units (``"40 mm"``, ``"20 deg"``,
``"1460 rpm"``); plain numbers are for dimensionless fields only. The pydantic
models below check the structure and read the units; the kernel's
constructors check the ranges; both report the field path, e.g.
``shafts[1].gears[0].pressure_angle``.

Canonical dump (what :func:`dump_snapshot` writes): every field of the model
in schema order, omitting only absent optional ones (None); quantities as
:func:`~loadscope.spec.units.format_quantity` writes them (exact: reading
them back gives the same floats, bit for bit); numbers as JSON floats (Python
writes them with ``repr``, also exact). Hence
``drive_from_snapshot(snapshot_from_drive(d)) == d`` for every drive that the
format can hold, and ``dump(load(dump(x))) == dump(x)`` textually.
"""

from __future__ import annotations

import copy
import functools
import json
import typing
from pathlib import Path
from typing import Any, Literal

from pydantic import BaseModel, Field, ValidationError

from ..errors import InputError
from ..kernel import checks
from ..kernel.model import Bolt, Coupling, Drive, Gear, Housing, Mesh, PointLoad, Port, Pulley, Section, Shaft, Support
from . import ratingspec as rs
from .fields import (
    _AT,
    _ID,
    _MASS,
    _WEIGHT,
    _ZERO3,
    Angle,
    Direction,
    Force,
    ForceVec,
    Id,
    Length,
    LengthVec,
    Mass,
    Moment,
    MomentVec,
    Number,
    Power,
    Pressure,
    Ratio,
    Speed,
    _kernel_default,
    _q,
    _Spec,
)
from .ratingspec import BearingSpec, CaseSpec, FastenerSpec, FeatureSpec, LimitsSpec, MaterialSpec, PairSpec
from .units import DIMENSIONS, STANDARD_GRAVITY

FORMAT = "loadscope.drive"
#: The version written. Version 2 adds the optional rating data; a version-1
#: file (which has none) reads unchanged (see docs/snapshot.md, Versioning).
VERSION = 2
SUPPORTED_VERSIONS = (1, 2)
SCHEMA_ID = "urn:loadscope:schema:drive-snapshot:2"
SCHEMA_FILE = Path(__file__).with_name("schema.json")


class SectionSpec(_Spec):
    """A cylindrical step of a shaft; sections run end to end from the shaft origin along its axis."""

    length: Length = _q("length", "axial length, > 0")
    diameter: Length = _q("length", "outside diameter, > 0")
    bore: Length = _q("length", "bore of a hollow section, 0 for solid, < diameter", 0.0)


class SupportSpec(_Spec):
    """A bearing seat: holds the shaft radially; takes axial load as its mode says."""

    id: Id = _ID
    at: Length = _q("length", _AT)
    axial: Literal["locating", "floating", "positive", "negative"] = Field(
        "floating", description="axial load taken: locating both ways, floating none, positive only toward +axis, "
                                "negative only toward -axis")
    bearing: BearingSpec | None = Field(None, description="the rolling bearing to rate (version 2)")


class GearSpec(_Spec):
    """A spur, helical or straight bevel gear keyed to the shaft, its pitch circle centred on the axis."""

    id: Id = Field(description="identifier, unique among all gears of the drive (meshes name gears by id)")
    at: Length = _q("length", _AT + " (the centre of the face)")
    kind: Literal["spur", "helical", "bevel"] = Field("spur", description="gear type")
    teeth: int | None = Field(None, description="number of teeth, >= 3; when both gears of a mesh have it, "
                                                "the ratio comes from the tooth counts")
    pitch_radius: Length | None = _q("length", "reference pitch radius (mean radius for bevel), > 0; "
                                               "give pitch_radius or pitch_diameter", None)
    pitch_diameter: Length | None = _q("length", "reference pitch diameter, > 0 (instead of pitch_radius)", None)
    pressure_angle: Angle = _q("angle", "normal pressure angle, 10 to 35 deg",
                               _kernel_default(Gear, "pressure_angle"))
    helix_angle: Angle = _q("angle", "helix angle: above 0 up to 45 deg for helical, 0 otherwise", 0.0)
    hand: Literal["right", "left"] | None = Field(None, description="helix hand (helical gears)")
    internal: bool = Field(False, description="a ring gear with internal teeth")
    cone_angle: Angle | None = _q("angle", "pitch cone angle of a bevel gear, 1 to 89 deg; checked against "
                                           "the layout", None)
    weight: Force | None = _q("force", _WEIGHT, None)
    mass: Mass | None = _q("mass", _MASS, None)


class PulleySpec(_Spec):
    """A belt pulley or chain sprocket: two strands leave it in given directions."""

    id: Id = _ID
    at: Length = _q("length", _AT)
    pitch_radius: Length | None = _q("length", "pitch radius, > 0; give pitch_radius or pitch_diameter", None)
    pitch_diameter: Length | None = _q("length", "pitch diameter, > 0 (instead of pitch_radius)", None)
    strand_angles: tuple[Angle, Angle] = Field(
        description="directions in which strand 0 and strand 1 leave, each measured in the shaft's transverse "
                    "plane from its first transverse axis e1 toward e2 (for a shaft along +x: from +y toward +z); "
                    "angles, e.g. ['180 deg', '150 deg']")
    wrap: Literal[1, -1] = Field(1, description="+1 when the belt, followed from strand 0 round the pulley to "
                                                "strand 1, turns positively about the shaft axis, else -1")
    tension_ratio: Ratio = Field("inf", description="tight / slack strand tension, > 1; 'inf' (the default) for "
                                                    "a chain, whose slack strand carries nothing")
    weight: Force | None = _q("force", _WEIGHT, None)
    mass: Mass | None = _q("mass", _MASS, None)


class CouplingSpec(_Spec):
    """A coupling: passes pure torque, no force."""

    id: Id = _ID
    at: Length = _q("length", _AT)
    weight: Force | None = _q("force", _WEIGHT, None)
    mass: Mass | None = _q("mass", _MASS, None)


class LoadSpec(_Spec):
    """An extra force and moment (global components) applied at a point of the shaft."""

    id: Id = _ID
    at: Length = _q("length", _AT)
    force: ForceVec = _q("force", "force, global components", _ZERO3, vector=True)
    moment: MomentVec = _q("moment", "moment, global components", _ZERO3, vector=True)
    offset: LengthVec = _q("length", "offset of the point of application from the axis, global components, "
                                     "perpendicular to the axis", _ZERO3, vector=True)


class ShaftSpec(_Spec):
    """A stepped shaft with its bearings and the elements on it."""

    id: Id = Field(description="identifier, unique among the shafts")
    origin: LengthVec = _q("length", "global position of axial position 0", _ZERO3, vector=True)
    axis: Direction = Field(_kernel_default(Shaft, "axis"), description="direction of the axis, global "
                                                                       "[x, y, z] numbers (normalised)")
    sections: list[SectionSpec] = Field(description="the steps, from the origin along the axis; at least one")
    supports: list[SupportSpec] = Field(description="the bearing seats")
    gears: list[GearSpec] = Field(default_factory=list)
    pulleys: list[PulleySpec] = Field(default_factory=list, description="belt pulleys and chain sprockets")
    couplings: list[CouplingSpec] = Field(default_factory=list)
    loads: list[LoadSpec] = Field(default_factory=list, description="extra point loads")
    E: Pressure = _q("pressure", "elastic modulus", _kernel_default(Shaft, "E"))
    G: Pressure = _q("pressure", "shear modulus", _kernel_default(Shaft, "G"))
    material: MaterialSpec | None = Field(None, description="material and fatigue method, to rate the sections "
                                                            "(version 2)")
    features: list[FeatureSpec] | None = Field(None, description="notches: shoulders, grooves, keyseats "
                                                                 "(version 2)")
    pair: PairSpec | None = Field(None, description="two paired angular-contact or tapered-roller bearings "
                                                    "(version 2)")
    alternating_torque: Number | None = Field(None, description="alternating share of the torque for fatigue, "
                                                                "0 to 1; 0 when omitted (version 2)")


class MeshSpec(_Spec):
    """Two gears in mesh."""

    id: Id = Field(description="identifier of the mesh")
    gears: tuple[Id, Id] = Field(description="ids of the two gears, on two different shafts")
    efficiency: Number = Field(1.0, description="share of the power the mesh passes on, 0.5 to 1; the lost "
                                                "torque is reacted by the housing")


_PORT_SHAFT = Field(description="id of the shaft")
_PORT_ELEMENT = Field(description="id of a coupling or pulley on that shaft")
_GIVEN = "; give power or torque (magnitudes) at exactly one port of the drive"


class InputSpec(_Spec):
    """Where power enters: a coupling or pulley on the input shaft, and the input speed."""

    shaft: Id = _PORT_SHAFT
    element: Id = _PORT_ELEMENT
    speed: Speed = _q("speed", "input speed, signed about the input shaft axis by the right-hand rule, non-zero")
    power: Power | None = _q("power", "power" + _GIVEN, None)
    torque: Moment | None = _q("moment", "torque" + _GIVEN, None)
    share: Number = Field(1.0, description="kept for symmetry with outputs; no effect on the input")


class OutputSpec(_Spec):
    """Where power leaves: a coupling or pulley; several outputs split the power by share."""

    shaft: Id = _PORT_SHAFT
    element: Id = _PORT_ELEMENT
    power: Power | None = _q("power", "power" + _GIVEN, None)
    torque: Moment | None = _q("moment", "torque" + _GIVEN, None)
    share: Number = Field(1.0, description="share of the delivered power, > 0 (the shares are normalised)")


class BoltSpec(_Spec):
    """A mounting bolt in the mounting plane."""

    id: Id = Field(description="identifier of the bolt")
    position: LengthVec = _q("length", "global position", vector=True)


class TippingEdgeSpec(_Spec):
    """The edge line of the foot about which the housing tips (tipping method)."""

    point: LengthVec | None = _q("length", "a point of the edge, global", None, vector=True)
    direction: Direction | None = Field(None, description="direction of the edge, global [x, y, z] numbers, in "
                                                          "the mounting plane")


class HousingSpec(_Spec):
    """The housing, its weight and its mounting bolts."""

    bolts: list[BoltSpec] = Field(description="the mounting bolts; at least one")
    plane_point: LengthVec = _q("length", "a point of the mounting plane", _ZERO3, vector=True)
    plane_normal: Direction = Field(_kernel_default(Housing, "plane_normal"),
                                    description="normal of the mounting plane from the foundation into the "
                                                "housing, global [x, y, z] numbers (normalised)")
    weight: Force | None = _q("force", "housing weight, acting in -y at the centre of mass "
                                       "(give weight or mass, not both; default 0)", None)
    mass: Mass | None = _q("mass", _MASS, None)
    center_of_mass: LengthVec = _q("length", "centre of mass of the housing", _ZERO3, vector=True)
    bolt_method: Literal["elastic", "tipping"] = Field(
        "elastic", description="how the overturning moment loads the bolts: elastic (linear about the bolt-group "
                               "centroid) or tipping (about tipping_edge)")
    tipping_edge: TippingEdgeSpec | None = Field(None, description="the tipping edge; needed by bolt_method "
                                                                   "tipping")
    fastener: FastenerSpec | None = Field(None, description="size, class and preload of the bolts, to rate them "
                                                            "(version 2)")


class Snapshot(_Spec):
    """A whole gear drive, in SI-convertible units."""

    format: Literal["loadscope.drive"] = Field(description="always 'loadscope.drive'")
    version: Literal[1, 2] = Field(description="format version; this reader knows 1 and 2 (2 adds the rating "
                                               "data)")
    name: str = Field("", description="a name for the drive")
    shafts: list[ShaftSpec] = Field(description="the shafts, in any order")
    meshes: list[MeshSpec] = Field(default_factory=list, description="the gear meshes; they must form a tree")
    input: InputSpec = Field(description="the input port and its speed")
    outputs: list[OutputSpec] = Field(description="the output ports; at least one")
    housing: HousingSpec | None = Field(None, description="the housing and its bolts; omit to stop at the "
                                                          "bearing reactions")
    cases: list[CaseSpec] | None = Field(None, description="load cases; one nominal case from input and outputs "
                                                           "when omitted (version 2)")
    limits: LimitsSpec | None = Field(None, description="allowable deflections and slopes; the defaults when "
                                                        "omitted (version 2)")


# --- snapshot -> Drive ------------------------------------------------------------------------------------------

def _join(loc: tuple[Any, ...]) -> str:
    out = ""
    for part in loc:
        if isinstance(part, int):
            out += f"[{part}]"
        else:
            out = f"{out}.{part}" if out else str(part)
    return out


def _model_of(annotation: Any) -> type[BaseModel] | None:
    if isinstance(annotation, type) and issubclass(annotation, BaseModel):
        return annotation
    for arg in typing.get_args(annotation):
        found = _model_of(arg)
        if found is not None:
            return found
    return None


def _model_at(loc: tuple[Any, ...]) -> type[BaseModel] | None:
    model: type[BaseModel] | None = Snapshot
    for part in loc:
        if isinstance(part, int):
            continue
        if model is None or part not in model.model_fields:
            return None
        model = _model_of(model.model_fields[part].annotation)
    return model


def _short(value: Any) -> str:
    text = json.dumps(value, ensure_ascii=False, default=repr) if not isinstance(value, str) else repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


def _input_error(exc: ValidationError) -> InputError:
    """The first pydantic error as an InputError naming its field path."""
    err = exc.errors(include_url=False)[0]
    loc = tuple(err["loc"])
    path = _join(loc)
    ctx = err.get("ctx") or {}
    cause = ctx.get("error")
    if isinstance(cause, InputError):
        return InputError(path, cause.problem, cause.accepted)
    kind = err["type"]
    parent = _model_at(loc[:-1]) if loc else Snapshot
    if kind == "missing" and loc and isinstance(loc[-1], int):
        return InputError(_join(loc[:-1]), f"has too few items: item [{loc[-1]}] is missing", "")
    if kind == "missing":
        field = parent.model_fields.get(str(loc[-1])) if parent is not None and loc else None
        return InputError(path, "is required", (field.description or "") if field is not None else "")
    if kind == "extra_forbidden":
        known = ", ".join(parent.model_fields) if parent is not None else ""
        return InputError(path, "is not a field of this object (misspelt?)", known)
    if kind == "literal_error":
        return InputError(path, f"must be one of {ctx.get('expected', '')}, got {_short(err.get('input'))}",
                          str(ctx.get("expected", "")))
    got = _short(err.get("input"))
    if kind in ("too_long", "too_short"):
        n = ctx.get("max_length") if kind == "too_long" else ctx.get("min_length")
        size = ctx.get("actual_length")
        return InputError(path, f"must have {'at most' if kind == 'too_long' else 'at least'} {n} items, got {size}",
                          f"{n} items")
    if kind in _PLAIN_ERRORS:
        what, accepted = _PLAIN_ERRORS[kind]
        return InputError(path, f"must be {what}, got {got}", accepted)
    msg = str(err["msg"]).replace("Input should be", "must be", 1)
    return InputError(path, f"{msg[:1].lower()}{msg[1:]} (got {got})", "")


# pydantic error type -> (what the value must be, accepted)
_PLAIN_ERRORS = {
    "int_type": ("a whole number", "an integer"),
    "int_parsing": ("a whole number", "an integer"),
    "int_from_float": ("a whole number", "an integer"),
    "bool_type": ("true or false", "true, false"),
    "bool_parsing": ("true or false", "true, false"),
    "string_type": ("a string", "a JSON string"),
    "string_too_short": ("a non-empty string", "a non-empty string"),
    "list_type": ("a list", "a JSON array"),
    "tuple_type": ("a list", "a JSON array"),
    "dict_type": ("an object", "a JSON object"),
    "model_type": ("an object", "a JSON object"),
    "model_attributes_type": ("an object", "a JSON object"),
}


def _radius(spec: GearSpec | PulleySpec, p: str) -> float:
    if spec.pitch_radius is not None and spec.pitch_diameter is not None:
        raise InputError(f"{p}.pitch_diameter", "give pitch_radius or pitch_diameter, not both",
                         "one of pitch_radius, pitch_diameter")
    if spec.pitch_diameter is not None:
        if not spec.pitch_diameter > 0.0:
            raise InputError(f"{p}.pitch_diameter", f"must be positive, got {spec.pitch_diameter:.6g} m", "> 0 m")
        # the kernel's floor on the radius, named as the user wrote it
        return checks.at_least(spec.pitch_diameter, 2.0 * checks.MIN_SIZE, f"{p}.pitch_diameter", "m") / 2.0
    if spec.pitch_radius is None:
        raise InputError(f"{p}.pitch_radius", "is required (or give pitch_diameter)",
                         DIMENSIONS["length"].accepted)
    return spec.pitch_radius


def _weight(spec: GearSpec | PulleySpec | CouplingSpec | HousingSpec, p: str) -> float:
    if spec.weight is not None and spec.mass is not None:
        raise InputError(f"{p}.mass", "give weight or mass, not both", "one of weight, mass")
    if spec.mass is not None:
        if spec.mass < 0.0:
            raise InputError(f"{p}.mass", f"must not be negative, got {spec.mass:.6g} kg", ">= 0 kg")
        return spec.mass * STANDARD_GRAVITY
    return 0.0 if spec.weight is None else spec.weight


def _shaft(s: ShaftSpec, p: str) -> Shaft:
    sections = tuple(Section(x.length, x.diameter, x.bore, path=f"{p}.sections[{i}]")
                     for i, x in enumerate(s.sections))
    supports = tuple(Support(x.id, x.at, x.axial, None if x.bearing is None else
                             rs.read_bearing(x.bearing, f"{p}.supports[{i}].bearing"), path=f"{p}.supports[{i}]")
                     for i, x in enumerate(s.supports))
    gears = []
    for i, g in enumerate(s.gears):
        q = f"{p}.gears[{i}]"
        gears.append(Gear(g.id, g.at, _radius(g, q), g.kind, g.teeth, g.pressure_angle, g.helix_angle, g.hand,
                          g.internal, g.cone_angle, _weight(g, q), path=q))
    pulleys = []
    for i, u in enumerate(s.pulleys):
        q = f"{p}.pulleys[{i}]"
        pulleys.append(Pulley(u.id, u.at, _radius(u, q), (u.strand_angles[0], u.strand_angles[1]), u.wrap,
                              u.tension_ratio, _weight(u, q), path=q))
    couplings = tuple(Coupling(c.id, c.at, _weight(c, f"{p}.couplings[{i}]"), path=f"{p}.couplings[{i}]")
                      for i, c in enumerate(s.couplings))
    loads = tuple(PointLoad(x.id, x.at, x.force, x.moment, x.offset, path=f"{p}.loads[{i}]")
                  for i, x in enumerate(s.loads))
    material = None if s.material is None else rs.read_material(s.material, f"{p}.material")
    features = tuple(rs.read_feature(f, f"{p}.features[{i}]") for i, f in enumerate(s.features or ()))
    pair = None if s.pair is None else rs.read_pair(s.pair, f"{p}.pair")
    return Shaft(s.id, sections, supports, s.origin, s.axis, tuple(gears), tuple(pulleys), couplings, loads, s.E,
                 s.G, material, features, pair, s.alternating_torque or 0.0, path=p)


def _port(spec: InputSpec | OutputSpec, p: str, shafts: tuple[Shaft, ...]) -> Port:
    ids = [s.id for s in shafts]
    if spec.shaft not in ids:
        raise InputError(f"{p}.shaft", f"no shaft with id {spec.shaft!r}", ", ".join(ids))
    sh = shafts[ids.index(spec.shaft)]
    names = [e.id for e in (*sh.couplings, *sh.pulleys)]
    if spec.element not in names:
        raise InputError(f"{p}.element", f"no coupling or pulley {spec.element!r} on shaft {spec.shaft!r}",
                         ", ".join(names) or "add a coupling or pulley to that shaft")
    return Port(spec.shaft, spec.element, spec.power, spec.torque, spec.share, path=p)


def _housing(h: HousingSpec) -> Housing:
    p = "housing"
    bolts = tuple(Bolt(b.id, b.position, path=f"{p}.bolts[{i}]") for i, b in enumerate(h.bolts))
    edge = h.tipping_edge
    fastener = None if h.fastener is None else rs.read_fastener(h.fastener, f"{p}.fastener")
    return Housing(bolts, h.plane_point, h.plane_normal, _weight(h, p), h.center_of_mass, h.bolt_method,
                   edge.point if edge is not None else None, edge.direction if edge is not None else None, fastener,
                   path=p)


def _build(snap: Snapshot) -> Drive:
    shafts = tuple(_shaft(s, f"shafts[{i}]") for i, s in enumerate(snap.shafts))
    owner: dict[str, str] = {}
    for i, sh in enumerate(shafts):
        for j, g in enumerate(sh.gears):
            if g.id in owner:
                raise InputError(f"shafts[{i}].gears[{j}].id", f"gear id {g.id!r} is already used on shaft "
                                 f"{owner[g.id]!r}", "gear ids unique across the drive (meshes name gears by id)")
            owner[g.id] = sh.id
    meshes = []
    for k, m in enumerate(snap.meshes):
        for j, gid in enumerate(m.gears):
            if gid not in owner:
                raise InputError(f"meshes[{k}].gears[{j}]", f"no gear with id {gid!r}",
                                 ", ".join(owner) or "add gears to the shafts")
        meshes.append(Mesh(m.id, (m.gears[0], m.gears[1]), m.efficiency, path=f"meshes[{k}]"))
    port_in = _port(snap.input, "input", shafts)
    outputs = tuple(_port(o, f"outputs[{j}]", shafts) for j, o in enumerate(snap.outputs))
    housing = _housing(snap.housing) if snap.housing is not None else None
    cases = tuple(rs.read_case(c, f"cases[{i}]") for i, c in enumerate(snap.cases or ()))
    drive = Drive(shafts, tuple(meshes), port_in, outputs, snap.input.speed, housing, snap.name, cases,
                  rs.read_limits(snap.limits))
    if snap.version == 1 and rs.has_rating_data(drive):
        raise InputError("version", "rating data (bearings, materials, features, pairs, fasteners, cases, limits) "
                         "needs snapshot version 2", "2")
    return drive


def _check_header(data: Any) -> None:
    if not isinstance(data, dict):
        raise InputError("", f"a snapshot must be a JSON object, got {type(data).__name__}",
                         f'{{"format": "{FORMAT}", "version": {VERSION}, ...}}')
    if "format" not in data:
        raise InputError("format", "is required: this does not look like a loadscope drive snapshot",
                         repr(FORMAT))
    if data["format"] != FORMAT:
        raise InputError("format", f"unknown format {_short(data['format'])}", repr(FORMAT))
    if "version" not in data:
        raise InputError("version", "is required", ", ".join(map(str, SUPPORTED_VERSIONS)))
    version = data["version"]
    if isinstance(version, bool) or version not in SUPPORTED_VERSIONS:
        raise InputError("version", f"unsupported snapshot version {_short(version)}; this loadscope reads "
                         f"version {', '.join(map(str, SUPPORTED_VERSIONS))}",
                         ", ".join(map(str, SUPPORTED_VERSIONS)))


def drive_from_snapshot(data: dict) -> Drive:
    """The kernel :class:`~loadscope.kernel.model.Drive` of a snapshot dict.

    Validates the structure, reads every unit, and builds the kernel objects
    with their ``path`` set to their place in the snapshot (e.g.
    ``"shafts[1].gears[0]"``), so that every range check names the field.

    Raises
    ------
    InputError
        The first problem found, with its field path.
    """
    _check_header(data)
    try:
        snap = Snapshot.model_validate(data)
    except ValidationError as exc:
        raise _input_error(exc) from None
    return _build(snap)


def _reject_constant(name: str) -> Any:
    raise InputError("", f"{name} is not valid JSON", "finite JSON numbers; write a chain's tension_ratio as 'inf'")


def load_snapshot(source: str | Path | dict) -> Drive:
    """A Drive from a snapshot file path, JSON text or dict.

    A ``str`` that starts with ``{`` (after white space) is JSON text; any
    other ``str`` or a :class:`~pathlib.Path` is a file to read (an
    ``OSError`` propagates when it cannot be read).

    Raises
    ------
    InputError
        Malformed JSON, or any problem :func:`drive_from_snapshot` finds.
    """
    if isinstance(source, dict):
        return drive_from_snapshot(source)
    where = "the snapshot text"
    if isinstance(source, Path) or not source.lstrip().startswith(("{", "[")):
        where = str(source)
        raw = Path(source).read_bytes()
        try:
            text = raw.decode("utf-8-sig")
        except UnicodeDecodeError as exc:
            raise InputError("", f"{where} is not UTF-8 text: {exc.reason} at byte {exc.start}",
                             "a JSON snapshot in UTF-8") from None
    else:
        text = source
    try:
        data = json.loads(text, parse_constant=_reject_constant)
    except json.JSONDecodeError as exc:
        raise InputError("", f"{where} is not valid JSON: {exc.msg} at line {exc.lineno}, column {exc.colno}",
                         "a JSON object") from None
    except RecursionError:
        raise InputError("", f"{where} nests lists or objects too deeply to read",
                         "a snapshot's few levels of nesting") from None
    except InputError:
        raise
    except ValueError as exc:       # an integer beyond Python's digit limit for int()
        raise InputError("", f"{where} is not a readable snapshot: {exc}", "numbers of a sensible size") from None
    return drive_from_snapshot(data)


# --- Drive -> snapshot ------------------------------------------------------------------------------------------

def _vec(v: Any) -> tuple[float, float, float]:
    return (float(v[0]), float(v[1]), float(v[2]))


def _spec_shaft(s: Shaft) -> ShaftSpec:
    return ShaftSpec.model_construct(
        id=s.id, origin=_vec(s.origin), axis=_vec(s.axis),
        sections=[SectionSpec.model_construct(length=float(x.length), diameter=float(x.diameter),
                                              bore=float(x.bore)) for x in s.sections],
        supports=[SupportSpec.model_construct(id=x.id, at=float(x.at), axial=x.axial,
                                              bearing=None if x.bearing is None else rs.write_bearing(x.bearing))
                  for x in s.supports],
        gears=[GearSpec.model_construct(
            id=g.id, at=float(g.at), kind=g.kind, teeth=None if g.teeth is None else int(g.teeth),
            pitch_radius=float(g.pitch_radius), pitch_diameter=None, pressure_angle=float(g.pressure_angle),
            helix_angle=float(g.helix_angle), hand=g.hand, internal=bool(g.internal),
            cone_angle=None if g.cone_angle is None else float(g.cone_angle), weight=float(g.weight), mass=None)
            for g in s.gears],
        pulleys=[PulleySpec.model_construct(
            id=u.id, at=float(u.at), pitch_radius=float(u.pitch_radius), pitch_diameter=None,
            strand_angles=(float(u.strand_angles[0]), float(u.strand_angles[1])), wrap=int(u.wrap),
            tension_ratio=float(u.tension_ratio), weight=float(u.weight), mass=None) for u in s.pulleys],
        couplings=[CouplingSpec.model_construct(id=c.id, at=float(c.at), weight=float(c.weight), mass=None)
                   for c in s.couplings],
        loads=[LoadSpec.model_construct(id=x.id, at=float(x.at), force=_vec(x.force), moment=_vec(x.moment),
                                        offset=_vec(x.offset)) for x in s.loads],
        E=float(s.E), G=float(s.G), material=None if s.material is None else rs.write_material(s.material),
        features=[rs.write_feature(f) for f in s.features] or None,
        pair=None if s.pair is None else rs.write_pair(s.pair),
        alternating_torque=float(s.alternating_torque) or None)


def _opt(v: float | None) -> float | None:
    return None if v is None else float(v)


def snapshot_from_drive(drive: Drive) -> dict:
    """The canonical snapshot dict of a Drive (JSON-ready; see the module
    docstring for the canonical rule)."""
    h = drive.housing
    housing = None
    if h is not None:
        edge = None
        if h.tipping_point is not None or h.tipping_direction is not None:
            edge = TippingEdgeSpec.model_construct(
                point=None if h.tipping_point is None else _vec(h.tipping_point),
                direction=None if h.tipping_direction is None else _vec(h.tipping_direction))
        housing = HousingSpec.model_construct(
            bolts=[BoltSpec.model_construct(id=b.id, position=_vec(b.position)) for b in h.bolts],
            plane_point=_vec(h.plane_point), plane_normal=_vec(h.plane_normal), weight=float(h.weight), mass=None,
            center_of_mass=_vec(h.center_of_mass), bolt_method=h.bolt_method, tipping_edge=edge,
            fastener=None if h.fastener is None else rs.write_fastener(h.fastener))
    i = drive.input
    snap = Snapshot.model_construct(
        format=FORMAT, version=VERSION, name=drive.name,
        shafts=[_spec_shaft(s) for s in drive.shafts],
        meshes=[MeshSpec.model_construct(id=m.id, gears=(m.gears[0], m.gears[1]), efficiency=float(m.efficiency))
                for m in drive.meshes],
        input=InputSpec.model_construct(shaft=i.shaft, element=i.element, speed=float(drive.speed),
                                        power=_opt(i.power), torque=_opt(i.torque), share=float(i.share)),
        outputs=[OutputSpec.model_construct(shaft=o.shaft, element=o.element, power=_opt(o.power),
                                            torque=_opt(o.torque), share=float(o.share)) for o in drive.outputs],
        housing=housing, cases=[rs.write_case(c) for c in drive.cases] or None, limits=rs.write_limits(drive.limits))
    return snap.model_dump(mode="json", exclude_none=True)


#: Width within which an object or list of plain values stays on one line.
_LINE = 100


def _scalars(items: Any) -> bool:
    return not any(isinstance(v, (dict, list)) for v in items)


def _plain(value: Any) -> bool:
    """A list of plain values, or an object of plain values and such lists."""
    if isinstance(value, list):
        return _scalars(value)
    return all(_scalars(v) if isinstance(v, list) else not isinstance(v, dict) for v in value.values())


def _text(value: Any, indent: int, level: int, used: int) -> str:
    """JSON text: a list of plain values stays on one line; so does an object
    of plain values and such lists, when that line fits in ``_LINE`` columns (``used`` columns are taken
    by the indentation and key before it); anything else is spread over
    lines, ``indent`` spaces a level."""
    if isinstance(value, (dict, list)) and value:
        if _plain(value):
            flat = json.dumps(value, ensure_ascii=False, allow_nan=False)
            if isinstance(value, list) or used + len(flat) + 1 <= _LINE:
                return flat
        pad, inner = " " * (indent * level), " " * (indent * (level + 1))
        if isinstance(value, dict):
            items = []
            for k, v in value.items():
                head = f"{inner}{json.dumps(k, ensure_ascii=False)}: "
                items.append(head + _text(v, indent, level + 1, len(head)))
            return "{\n" + ",\n".join(items) + f"\n{pad}}}"
        return "[\n" + ",\n".join(inner + _text(v, indent, level + 1, len(inner)) for v in value) + f"\n{pad}]"
    return json.dumps(value, ensure_ascii=False, allow_nan=False)


def dump_snapshot(drive_or_dict: Drive | dict, indent: int | None = 2) -> str:
    """The canonical JSON text of a Drive or of a snapshot dict (which is
    validated first). Lists of plain values, and objects of plain values (or
    such lists) that fit in 100 columns, stay on one line; the rest is spread over lines with
    ``indent`` spaces a level; ``indent=None`` gives one line. No trailing
    newline."""
    drive = drive_or_dict if isinstance(drive_or_dict, Drive) else drive_from_snapshot(drive_or_dict)
    data = snapshot_from_drive(drive)
    if indent is None:
        return json.dumps(data, ensure_ascii=False, allow_nan=False)
    return _text(data, indent, 0, 0)


# --- schema -----------------------------------------------------------------------------------------------------

@functools.lru_cache(maxsize=1)
def _schema() -> dict:
    body = Snapshot.model_json_schema()
    body.pop("title", None)
    body.pop("description", None)
    return {
        "$schema": "https://json-schema.org/draft/2020-12/schema",
        "$id": SCHEMA_ID,
        "title": "loadscope drive snapshot, version 2",
        "description": ("A whole gear drive for loadscope: shafts with their sections, bearings, gears, pulleys, "
                        "couplings and loads; meshes; the input and output ports; the housing and its bolts; "
                        "optionally the rating data (bearings, materials, notches, fasteners, load cases). "
                        "Dimensioned values are strings of a number and a unit (e.g. '40 mm', '20 deg', "
                        "'1460 rpm'); see docs/snapshot.md."),
        **body,
    }


def snapshot_schema() -> dict:
    """The JSON Schema of the snapshot (a fresh copy)."""
    return copy.deepcopy(_schema())


def schema_text() -> str:
    """The text of loadscope/spec/schema.json."""
    return json.dumps(_schema(), indent=2, ensure_ascii=False) + "\n"


def write_schema_file(path: Path = SCHEMA_FILE) -> Path:
    """Write the schema to ``path`` (by default loadscope/spec/schema.json)."""
    path.write_text(schema_text(), encoding="utf-8")
    return path

"""The drive as the kernel sees it: frozen value objects in SI units.

Every object validates itself on construction and names its own field path in
errors (``path`` is set by the spec layer; when built by hand, the id is used).
Lengths [m], forces [N], moments and torques [N*m], angles [rad], speeds
[rad/s] signed about the shaft axis by the right-hand rule, powers [W],
stiffness moduli [Pa].

Frame (see DESIGN.md): right-handed x, y, z with y up. A shaft has an origin
point and a unit axis; positions on it (``at``) are axial coordinates measured
from the origin along the axis.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Literal

from ..errors import InputError
from . import checks
from .ratingdata import Bearing, BearingPair, Fastener, Feature, LoadCase, Material, StiffnessLimits, check_cases

Vec3 = tuple[float, float, float]
GearKind = Literal["spur", "helical", "bevel"]
Hand = Literal["right", "left"]
AxialMode = Literal["locating", "floating", "positive", "negative"]
BoltMethod = Literal["elastic", "tipping"]

AXIAL_MODES = ("locating", "floating", "positive", "negative")


def _where(path: str, kind: str, ident: str) -> str:
    return path or f"{kind} {ident!r}"


@dataclass(frozen=True)
class Section:
    """A cylindrical step of a shaft: ``length`` [m], ``diameter`` [m] and an
    optional ``bore`` [m] for a hollow section (0 for solid)."""

    length: float
    diameter: float
    bore: float = 0.0
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = self.path or "section"
        checks.positive(self.length, f"{p}.length", "m")
        checks.at_least(checks.positive(self.diameter, f"{p}.diameter", "m"), checks.MIN_SIZE, f"{p}.diameter", "m")
        checks.non_negative(self.bore, f"{p}.bore", "m")
        if self.bore >= self.diameter:
            raise InputError(f"{p}.bore", f"must be smaller than the diameter {self.diameter:.6g} m, "
                             f"got {self.bore:.6g} m", f"0 <= bore < {self.diameter:.6g} m")

    @property
    def second_moment(self) -> float:
        """Area second moment I = pi (d^4 - d_i^4) / 64 [m^4]."""
        return math.pi * (self.diameter**4 - self.bore**4) / 64.0

    @property
    def area(self) -> float:
        """Cross-section area [m^2]."""
        return math.pi * (self.diameter**2 - self.bore**2) / 4.0


@dataclass(frozen=True)
class Support:
    """A bearing seat at axial position ``at`` [m]. It always holds the shaft
    radially (a simple support: no moment). ``axial`` says which axial load it
    takes: ``locating`` both ways, ``floating`` none, ``positive`` only by
    pushing the shaft toward +axis, ``negative`` only toward -axis.
    ``bearing`` (optional) is the rolling bearing to rate."""

    id: str
    at: float
    axial: AxialMode = "floating"
    bearing: Bearing | None = None
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = _where(self.path, "support", self.id)
        checks.finite(self.at, f"{p}.at", "m")
        if self.axial not in AXIAL_MODES:
            raise InputError(f"{p}.axial", f"unknown axial mode {self.axial!r}", ", ".join(AXIAL_MODES))


@dataclass(frozen=True)
class Gear:
    """A gear keyed to a shaft, its pitch circle centred on the axis at ``at``.

    ``pitch_radius`` [m] is the reference pitch radius (the mean pitch radius
    for a bevel gear). ``pressure_angle`` is the normal pressure angle [rad];
    ``helix_angle`` [rad] and ``hand`` describe a helical gear; ``cone_angle``
    [rad] the pitch cone of a bevel gear (checked against the shaft layout).
    ``internal`` marks a ring gear (teeth inside). ``weight`` [N] acts in -y.
    """

    id: str
    at: float
    pitch_radius: float
    kind: GearKind = "spur"
    teeth: int | None = None
    pressure_angle: float = math.radians(20.0)
    helix_angle: float = 0.0
    hand: Hand | None = None
    internal: bool = False
    cone_angle: float | None = None
    weight: float = 0.0
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = _where(self.path, "gear", self.id)
        checks.finite(self.at, f"{p}.at", "m")
        checks.at_least(checks.positive(self.pitch_radius, f"{p}.pitch_radius", "m"), checks.MIN_SIZE,
                        f"{p}.pitch_radius", "m")
        checks.within(self.pressure_angle, *checks.PRESSURE_ANGLE_RANGE, f"{p}.pressure_angle", degrees=True)
        checks.non_negative(self.weight, f"{p}.weight", "N")
        if self.kind not in ("spur", "helical", "bevel"):
            raise InputError(f"{p}.kind", f"unknown gear kind {self.kind!r}", "spur, helical, bevel")
        if self.teeth is not None and (int(self.teeth) != self.teeth or self.teeth < 3):
            raise InputError(f"{p}.teeth", f"must be a whole number of at least 3, got {self.teeth!r}", ">= 3")
        if self.kind == "helical":
            lo, hi = checks.HELIX_ANGLE_RANGE
            checks.within(self.helix_angle, lo, hi, f"{p}.helix_angle", degrees=True)
            if self.helix_angle <= 0.0:
                raise InputError(f"{p}.helix_angle", "a helical gear needs a helix angle above 0 deg",
                                 "0 to 45 deg (exclusive of 0)")
            if self.hand not in ("right", "left"):
                raise InputError(f"{p}.hand", f"a helical gear needs a hand, got {self.hand!r}", "right, left")
        elif self.helix_angle != 0.0:
            raise InputError(f"{p}.helix_angle", f"a {self.kind} gear has no helix angle", "0 deg, or kind helical")
        if self.kind == "bevel":
            if self.internal:
                raise InputError(f"{p}.internal", "internal bevel gears are not modelled", "false")
            if self.cone_angle is not None:
                checks.within(self.cone_angle, math.radians(1.0), math.radians(89.0), f"{p}.cone_angle",
                              degrees=True)
        elif self.cone_angle is not None:
            raise InputError(f"{p}.cone_angle", f"a {self.kind} gear has no pitch cone", "omit, or kind bevel")


@dataclass(frozen=True)
class Pulley:
    """A belt pulley or chain sprocket at ``at`` [m], ``pitch_radius`` [m].

    The two strands leave in directions ``strand_angles`` [rad], each measured
    in the shaft's transverse plane from its first transverse axis e1 toward
    e2 (for a shaft along +x: from +y toward +z). ``wrap`` is +1 when the belt,
    followed from strand 0 round the pulley to strand 1, turns positively about
    the shaft axis, -1 otherwise. ``tension_ratio`` is tight/slack tension
    (> 1; ``math.inf`` for a chain whose slack strand carries nothing).
    """

    id: str
    at: float
    pitch_radius: float
    strand_angles: tuple[float, float]
    wrap: int = 1
    tension_ratio: float = math.inf
    weight: float = 0.0
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = _where(self.path, "pulley", self.id)
        checks.finite(self.at, f"{p}.at", "m")
        checks.at_least(checks.positive(self.pitch_radius, f"{p}.pitch_radius", "m"), checks.MIN_SIZE,
                        f"{p}.pitch_radius", "m")
        checks.finite(self.strand_angles[0], f"{p}.strand_angles[0]", "rad")
        checks.finite(self.strand_angles[1], f"{p}.strand_angles[1]", "rad")
        checks.non_negative(self.weight, f"{p}.weight", "N")
        if self.wrap not in (1, -1):
            raise InputError(f"{p}.wrap", f"must be +1 or -1, got {self.wrap!r}", "+1 (positive), -1 (negative)")
        if not (self.tension_ratio > 1.0):
            raise InputError(f"{p}.tension_ratio", f"must exceed 1, got {self.tension_ratio!r}",
                             "> 1 (inf for a chain)")


@dataclass(frozen=True)
class Coupling:
    """A coupling at ``at`` [m]: passes pure torque, no force."""

    id: str
    at: float
    weight: float = 0.0
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = _where(self.path, "coupling", self.id)
        checks.finite(self.at, f"{p}.at", "m")
        checks.non_negative(self.weight, f"{p}.weight", "N")


@dataclass(frozen=True)
class PointLoad:
    """A force [N] and a moment [N*m] (global components) applied at a point
    given by its axial position ``at`` [m] and a radial ``offset`` [m]
    (global components, perpendicular to the axis) from the axis."""

    id: str
    at: float
    force: Vec3 = (0.0, 0.0, 0.0)
    moment: Vec3 = (0.0, 0.0, 0.0)
    offset: Vec3 = (0.0, 0.0, 0.0)
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = _where(self.path, "load", self.id)
        checks.finite(self.at, f"{p}.at", "m")
        checks.vector3(self.force, f"{p}.force", "N")
        checks.vector3(self.moment, f"{p}.moment", "N*m")
        checks.vector3(self.offset, f"{p}.offset", "m")


@dataclass(frozen=True)
class Shaft:
    """A stepped shaft. ``sections`` run from axial position 0 along the axis;
    ``E`` and ``G`` are the elastic and shear moduli [Pa]. Rating data
    (optional): ``material``, notch ``features``, a bearing ``pair`` and the
    ``alternating_torque`` share of the torque (0..1) for fatigue."""

    id: str
    sections: tuple[Section, ...]
    supports: tuple[Support, ...]
    origin: Vec3 = (0.0, 0.0, 0.0)
    axis: Vec3 = (1.0, 0.0, 0.0)
    gears: tuple[Gear, ...] = ()
    pulleys: tuple[Pulley, ...] = ()
    couplings: tuple[Coupling, ...] = ()
    loads: tuple[PointLoad, ...] = ()
    E: float = 206e9
    G: float = 79.3e9
    material: Material | None = None
    features: tuple[Feature, ...] = ()
    pair: BearingPair | None = None
    alternating_torque: float = 0.0
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = _where(self.path, "shaft", self.id)
        if not self.sections:
            raise InputError(f"{p}.sections", "a shaft needs at least one section", ">= 1 section")
        checks.vector3(self.origin, f"{p}.origin", "m")
        object.__setattr__(self, "axis", checks.unit_vector(self.axis, f"{p}.axis"))
        for name in ("E", "G"):
            checks.at_least(checks.positive(getattr(self, name), f"{p}.{name}", "Pa"), checks.MIN_MODULUS,
                            f"{p}.{name}", "Pa")
        length = self.length
        groups: tuple[tuple[str, tuple[Element, ...]], ...] = (
            ("supports", self.supports), ("gears", self.gears), ("pulleys", self.pulleys),
            ("couplings", self.couplings), ("loads", self.loads))
        for kind, items in groups:
            for i, item in enumerate(items):
                if not -1e-12 <= item.at <= length + 1e-12:
                    where = item.path or f"{p}.{kind}[{i}]"
                    raise InputError(f"{where}.at", f"lies off the shaft, at {item.at:.6g} m",
                                     f"0 to {length:.6g} m")
        ids = [e.id for e in self.elements()]
        dup = sorted({i for i in ids if ids.count(i) > 1})
        if dup:
            raise InputError(p, f"element ids must be unique on a shaft, repeated: {', '.join(dup)}",
                             "unique ids")
        self._check_rating_data(p, length)

    def _check_rating_data(self, p: str, length: float) -> None:
        checks.within(self.alternating_torque, 0.0, 1.0, f"{p}.alternating_torque")
        names = [f.id for f in self.features]
        for i, f in enumerate(self.features):
            where = f.path or f"{p}.features[{i}]"
            if not -1e-12 <= f.at <= length + 1e-12:
                raise InputError(f"{where}.at", f"lies off the shaft, at {f.at:.6g} m", f"0 to {length:.6g} m")
            if names.count(f.id) > 1:
                raise InputError(f"{where}.id", f"feature id {f.id!r} is repeated", "unique feature ids")
        if self.pair is not None:
            where = self.pair.path or f"{p}.pair"
            sup = {s.id: s for s in self.supports}
            for j, sid in enumerate(self.pair.supports):
                if sid not in sup:
                    raise InputError(f"{where}.supports[{j}]", f"no support {sid!r} on this shaft",
                                     ", ".join(sup) or "add supports")
                b = sup[sid].bearing
                if b is None or b.type not in ("angular_contact", "tapered_roller"):
                    raise InputError(f"{where}.supports[{j}]", f"support {sid!r} needs an angular-contact or "
                                     "tapered-roller bearing to be paired",
                                     "bearing type angular_contact or tapered_roller")

    @property
    def length(self) -> float:
        """Overall length [m]."""
        return float(sum(s.length for s in self.sections))

    def elements(self) -> list[Element]:
        """Every element on the shaft: supports, gears, pulleys, couplings, loads."""
        out: list[Element] = [*self.supports, *self.gears, *self.pulleys, *self.couplings, *self.loads]
        return out

    def element(self, ident: str) -> Element | None:
        """The element with this id, or None."""
        for e in self.elements():
            if e.id == ident:
                return e
        return None


Element = Support | Gear | Pulley | Coupling | PointLoad


@dataclass(frozen=True)
class Mesh:
    """Two gears in mesh; ``efficiency`` is the share of power the mesh passes
    on (0 < eta <= 1); the lost torque is reacted by the housing."""

    id: str
    gears: tuple[str, str]
    efficiency: float = 1.0
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = _where(self.path, "mesh", self.id)
        checks.within(self.efficiency, 0.5, 1.0, f"{p}.efficiency")
        if len(self.gears) != 2 or self.gears[0] == self.gears[1]:
            raise InputError(f"{p}.gears", f"a mesh joins two different gears, got {list(self.gears)!r}",
                             "[gear id, gear id]")


@dataclass(frozen=True)
class Port:
    """Where power enters or leaves the drive: a coupling or pulley ``element``
    on ``shaft``. Give ``power`` [W] or ``torque`` [N*m] (magnitudes) at exactly
    one port of the drive; ``share`` splits the delivered power among several
    outputs (the shares are normalised)."""

    shaft: str
    element: str
    power: float | None = None
    torque: float | None = None
    share: float = 1.0
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        p = self.path or f"port {self.shaft}.{self.element}"
        if self.power is not None and self.torque is not None:
            raise InputError(p, "give power or torque, not both", "one of power, torque")
        if self.power is not None:
            checks.positive(self.power, f"{p}.power", "W")
        if self.torque is not None:
            checks.positive(self.torque, f"{p}.torque", "N*m")
        checks.positive(self.share, f"{p}.share")


@dataclass(frozen=True)
class Bolt:
    """A mounting bolt at ``position`` [m] (global) in the mounting plane."""

    id: str
    position: Vec3
    path: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        checks.vector3(self.position, f"{_where(self.path, 'bolt', self.id)}.position", "m")


@dataclass(frozen=True)
class Housing:
    """The housing and its mounting. The mounting plane passes through
    ``plane_point`` [m] with unit ``plane_normal`` pointing from the foundation
    into the housing. ``weight`` [N] acts in -y at ``center_of_mass`` [m].
    ``bolt_method`` chooses how the overturning moment loads the bolts:
    ``elastic`` (linear about the bolt-group centroid) or ``tipping`` (about the
    edge line through ``tipping_point`` along ``tipping_direction``)."""

    bolts: tuple[Bolt, ...]
    plane_point: Vec3 = (0.0, 0.0, 0.0)
    plane_normal: Vec3 = (0.0, 1.0, 0.0)
    weight: float = 0.0
    center_of_mass: Vec3 = (0.0, 0.0, 0.0)
    bolt_method: BoltMethod = "elastic"
    tipping_point: Vec3 | None = None
    tipping_direction: Vec3 | None = None
    fastener: Fastener | None = None
    path: str = field(default="housing", compare=False)

    def __post_init__(self) -> None:
        p = self.path
        object.__setattr__(self, "plane_normal", checks.unit_vector(self.plane_normal, f"{p}.plane_normal"))
        checks.vector3(self.plane_point, f"{p}.plane_point", "m")
        checks.non_negative(self.weight, f"{p}.weight", "N")
        checks.vector3(self.center_of_mass, f"{p}.center_of_mass", "m")
        if len(self.bolts) < 1:
            raise InputError(f"{p}.bolts", "a housing needs at least one mounting bolt", ">= 1 bolt")
        if self.bolt_method not in ("elastic", "tipping"):
            raise InputError(f"{p}.bolt_method", f"unknown method {self.bolt_method!r}", "elastic, tipping")
        if self.bolt_method == "tipping":
            if self.tipping_point is None or self.tipping_direction is None:
                raise InputError(f"{p}.tipping_edge", "the tipping method needs an edge (point and direction)",
                                 "point [x, y, z] and direction [x, y, z] in the mounting plane")
            object.__setattr__(self, "tipping_direction",
                               checks.unit_vector(self.tipping_direction, f"{p}.tipping_edge.direction"))


@dataclass(frozen=True)
class Drive:
    """A whole drive: shafts joined by meshes, one input port (with its signed
    ``speed`` [rad/s] about the input shaft axis), one or more output ports,
    and optionally the housing and its bolts. Rating data (optional, see
    :mod:`loadscope.kernel.ratingdata`): ``cases`` the load cases (none: one
    nominal case from the drive's own power and speed), ``limits`` the
    allowable deflections and slopes."""

    shafts: tuple[Shaft, ...]
    meshes: tuple[Mesh, ...]
    input: Port
    outputs: tuple[Port, ...]
    speed: float
    housing: Housing | None = None
    name: str = ""
    cases: tuple[LoadCase, ...] = ()
    limits: StiffnessLimits = field(default_factory=StiffnessLimits)

    def __post_init__(self) -> None:
        checks.speed(self.speed, "input.speed")
        if not self.outputs:
            raise InputError("outputs", "a drive needs at least one output", ">= 1 output")
        ids = [s.id for s in self.shafts]
        dup = sorted({i for i in ids if ids.count(i) > 1})
        if dup:
            raise InputError("shafts", f"shaft ids must be unique, repeated: {', '.join(dup)}", "unique ids")
        given = [p for p in (self.input, *self.outputs) if p.power is not None or p.torque is not None]
        if len(given) != 1:
            raise InputError("input", f"power or torque must be given at exactly one port, found {len(given)}",
                             "exactly one of input / outputs[*] with power or torque")
        check_cases(self.cases)

    def shaft(self, ident: str) -> Shaft:
        """The shaft with this id."""
        for s in self.shafts:
            if s.id == ident:
                return s
        raise InputError("", f"no shaft with id {ident!r}", ", ".join(s.id for s in self.shafts))

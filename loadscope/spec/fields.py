"""Value types shared by the snapshot models: quantities written as unit
strings, plain numbers, ratios, and the base model that forbids unknown
fields. The snapshot (:mod:`loadscope.spec.snapshot`) and its rating part
(:mod:`loadscope.spec.ratingspec`) both build on these.
"""

from __future__ import annotations

import dataclasses
import math
from typing import Annotated, Any

from pydantic import BaseModel, BeforeValidator, ConfigDict, Field, PlainSerializer, StringConstraints, WithJsonSchema

from ..errors import InputError
from .units import DIMENSIONS, format_quantity, parse_quantity

#: Largest magnitude a snapshot value may have, in its SI unit (1e12 m, N, W, Pa = 1000 GPa, ...): far
#: above every real drive, and low enough that the squares and products of the solve stay finite.
MAX_MAGNITUDE = 1e12


def _read(value: Any, dimension: str) -> float:
    v = parse_quantity(value, dimension, "")
    if abs(v) > MAX_MAGNITUDE:
        si = DIMENSIONS[dimension].si
        raise InputError("", f"is beyond the scale of any drive, got {value!r}",
                         f"a magnitude up to {MAX_MAGNITUDE:g} {si}".rstrip())
    return v


def _quantity_type(dimension: str) -> Any:
    dim = DIMENSIONS[dimension]

    def read(value: Any) -> float:
        return _read(value, dimension)

    def write(value: Any) -> str:
        # A default still in its text form (schema generation) stays as written.
        return value if isinstance(value, str) else format_quantity(value, dimension)

    example = dim.example.split(" or ")[0].strip("'")
    return Annotated[float, BeforeValidator(read), PlainSerializer(write, return_type=str),
                     WithJsonSchema({"type": "string", "examples": [example], "x-dimension": dimension,
                                     "x-si-unit": dim.si})]


def _read_number(value: Any) -> float:
    return _read(value, "dimensionless")


def _read_ratio(value: Any) -> float:
    if isinstance(value, str) and value.strip().lower() in ("inf", "infinity"):
        return math.inf
    if isinstance(value, float) and value == math.inf:
        return value
    return _read(value, "dimensionless")


def _write_ratio(value: Any) -> float | str:
    if isinstance(value, str):
        return value
    return "inf" if value == math.inf else float(value)


Length = _quantity_type("length")
Force = _quantity_type("force")
Moment = _quantity_type("moment")
Power = _quantity_type("power")
Speed = _quantity_type("speed")
Angle = _quantity_type("angle")
Pressure = _quantity_type("pressure")
Mass = _quantity_type("mass")
Duration = _quantity_type("duration")
Temperature = _quantity_type("temperature")
Number = Annotated[float, BeforeValidator(_read_number), PlainSerializer(float, return_type=float),
                   WithJsonSchema({"type": "number"})]
Ratio = Annotated[float, BeforeValidator(_read_ratio), PlainSerializer(_write_ratio),
                  WithJsonSchema({"anyOf": [{"type": "number", "exclusiveMinimum": 1}, {"const": "inf"}]})]
Id = Annotated[str, StringConstraints(min_length=1)]
LengthVec = tuple[Length, Length, Length]
ForceVec = tuple[Force, Force, Force]
MomentVec = tuple[Moment, Moment, Moment]
Direction = tuple[Number, Number, Number]


def _kernel_default(cls: type, name: str) -> Any:
    return next(f.default for f in dataclasses.fields(cls) if f.name == name)


def _q(dimension: str, description: str, default: Any = ..., vector: bool = False) -> Any:
    """A Field for a quantity; a float default is written in canonical text."""
    dim = DIMENSIONS[dimension]
    if isinstance(default, float):
        default = format_quantity(default, dimension)
    elif isinstance(default, tuple):
        default = tuple(format_quantity(float(c), dimension) for c in default)
    what = f"[x, y, z], each {dim.article}" if vector else dim.article
    return Field(default, description=f"{description}; {what}, e.g. {dim.example}")


_ZERO3 = (0.0, 0.0, 0.0)
_ID = Field(description="identifier, unique among the elements of its shaft")
_AT = "axial position from the shaft origin along its axis, 0 to the shaft length"
_WEIGHT = "weight, acting in -y (give weight or mass, not both; default 0)"
_MASS = "mass, turned into a weight with g = 9.80665 m/s^2 (give weight or mass, not both)"


class _Spec(BaseModel):
    model_config = ConfigDict(extra="forbid", validate_default=True)

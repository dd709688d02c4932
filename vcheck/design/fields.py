"""Building blocks of the design models: the base model and quantity field types.

Every section of a design file (machine, mounting, joints, fatigue details...) builds
its pydantic model from these, so that keys are kebab-case, unknown keys are refused,
NaN and infinity are refused, and every dimensional value is read through
:func:`~vcheck.design.units.parse_amount` into an SI :class:`Amount`.
"""

from typing import Annotated, Any, Callable

from pydantic import BaseModel, ConfigDict, Field
from pydantic_core import PydanticCustomError, core_schema

from .units import QUANTITY_KINDS, Amount, UnitError, parse_amount

__all__ = [
    "DesignModel",
    "Force",
    "Frequency",
    "Length",
    "Mass",
    "MassOrZero",
    "SpeedValue",
    "Stiffness",
    "Acceleration", "Area", "Coordinate", "Density", "Inertia", "InertiaOrZero", "InertiaProduct",
    "LinearDensity", "Power", "SecondMoment", "Stress", "StressOrZero", "Time", "Torque", "Velocity",
    "quantity",
    "read_by",
]


def _to_kebab(name: str) -> str:
    return name.replace("_", "-")


class DesignModel(BaseModel):
    """Base of every design model: kebab-case keys, no unknown keys, frozen."""

    model_config = ConfigDict(
        alias_generator=_to_kebab,
        populate_by_name=True,
        extra="forbid",
        frozen=True,
        allow_inf_nan=False,
        arbitrary_types_allowed=True,
        validate_default=True,
        defer_build=True,
    )

    def __getattr__(self, name: str):
        # A private attribute (design._analysis, ._file, ...) straight from the model's
        # private store: pydantic's own lookup first probes its declaration for a
        # descriptor, an exception each time, and rules read these on every design.
        # Anything else goes to pydantic, as before.
        try:
            return object.__getattribute__(self, "__pydantic_private__")[name]
        except (AttributeError, KeyError, TypeError):
            return super().__getattr__(name)


class read_by:
    """Field metadata: the value is read by ``read(raw)`` alone (no further validation
    of the annotated type), and documented in the JSON Schema by ``json_schema``.

    What ``PlainValidator(read)`` with ``WithJsonSchema(json_schema)`` does for reading
    and for the schema, built at a fraction of the cost: those derive a serializer from the
    annotated type and inspect ``read``'s signature for every field, and the design
    models have hundreds of such fields (about half the Design model's build time).
    Design models are never serialised, so no serializer is needed.
    """

    __slots__ = ("read", "json_schema")

    def __init__(self, read: Callable[[Any], Any], json_schema: dict) -> None:
        self.read = read
        self.json_schema = json_schema

    def __get_pydantic_core_schema__(self, source: Any, handler) -> core_schema.CoreSchema:
        return core_schema.no_info_plain_validator_function(self.read)

    def __get_pydantic_json_schema__(self, schema: core_schema.CoreSchema, handler) -> dict:
        return self.json_schema.copy()

    def __hash__(self) -> int:
        return id(self)


def quantity(kind: str, *, tolerance: bool = True, positive: bool | None = True):
    """An annotated field type: a string with a unit, read into an SI Amount.

    With ``positive`` True the whole tolerance band must lie above zero; with False it
    must not be negative; with None any sign is accepted (coordinates).
    """
    spec = QUANTITY_KINDS[kind]

    def read(raw: object) -> Amount:
        if isinstance(raw, Amount):
            amount = raw
        else:
            try:
                amount = parse_amount(raw, kind, allow_tolerance=tolerance)
            except UnitError as exc:
                raise PydanticCustomError("unit", str(exc)) from None
        if positive and not amount.low > 0:
            raise PydanticCustomError(
                "positive", f"{spec.name} must be greater than zero, got '{amount.text}'"
            )
        if positive is False and amount.low < 0:
            raise PydanticCustomError(
                "positive", f"{spec.name} must not be negative, got '{amount.text}'"
            )
        return amount

    example = spec.examples[0]
    schema = {
        "type": "string",
        "description": f"{spec.name} with its unit"
        + (", optionally with a tolerance (+-10%)" if tolerance else ""),
        "examples": list(spec.examples),
        "pattern": r"^\s*[+-]?[0-9.]",
    }
    return Annotated[Amount, read_by(read, schema), Field(examples=[example])]


Mass = quantity("mass")
MassOrZero = quantity("mass", positive=False)
Stiffness = quantity("stiffness")
Length = quantity("length")
Frequency = quantity("frequency")
SpeedValue = quantity("frequency", tolerance=False)
Force = quantity("force")
Velocity = quantity("velocity")
Acceleration = quantity("acceleration")
Stress = quantity("stress")
Torque = quantity("torque")
Time = quantity("time")
Inertia = quantity("inertia")
InertiaOrZero = quantity("inertia", positive=False)
InertiaProduct = quantity("inertia", tolerance=False, positive=None)
Coordinate = quantity("length", tolerance=False, positive=None)
Area = quantity("area")
SecondMoment = quantity("second-moment")
Density = quantity("density")
LinearDensity = quantity("linear-density")
Power = quantity("power")
StressOrZero = quantity("stress", positive=False)

"""Bolted joints of a design: the ``[[joint]]`` tables.

A joint is a group of equal bolts that clamps a vibrating part to what carries it::

    [[joint]]
    name = "motor feet"
    fastener = "M16"                     # ISO metric or unified thread designation
    property-class = "8.8"               # ISO 898-1, SAE J429 grade, ISO 3506-1 stainless
    count = 4
    tightening = { method = "torque-wrench", torque = "190 N*m" }
    clamps = "310 kg"                    # the vibrating mass the joint holds
    vibration = "4.5 mm/s"               # RMS at running speed; see Vibration

Everything else has a default that the fastener rules list as an assumption when they
use it: friction coefficients, interfaces, thread rolling, clamp length, roughness, the
vibration level. The thread and the property class are checked here, against the tables
of :mod:`vcheck.dynamics.joints.threads` and :mod:`vcheck.dynamics.joints.bolt_materials`, so that a
design with an unknown bolt never reaches a rule.

Messages of errors that already quote the value given are raised with the error types
the loader passes through unchanged ("unit" for a value that cannot be read or looked
up, "positive" for a value out of its range); see ``validation_problems`` in
:mod:`vcheck.design.loader`.
"""

from typing import Annotated, Literal

from pydantic import (
    Field,
    ValidationInfo,
    field_validator,
    model_validator,
)
from pydantic_core import PydanticCustomError

from ..dynamics.joints.threads import ThreadSize, thread_by_name
from ..records import Record
from .fields import DesignModel, Force, Frequency, Mass, Stress, Torque, quantity, read_by
from .modal import Direction, Point
from .units import Amount, UnitError, parse_amount

__all__ = [
    "AMPLITUDE_READINGS",
    "DEFAULT_FRICTION_CLASS",
    "FrictionBand",
    "Joint",
    "TIGHTENING_METHODS",
    "TORQUE_METHODS",
    "Tightening",
    "Vibration",
    "VibrationLevel",
    "default_hole_diameter",
    "friction_class_band",
    "read_vibration_level",
]

_READ = "unit"  # loader error type: the message is complete, the value cannot be used
_RANGE = "positive"  # loader error type: the message is complete, the value is out of range

Geometry = quantity("length", tolerance=False)
GeometryOrZero = quantity("length", tolerance=False, positive=False)

TighteningMethod = Literal[
    "torque-wrench",
    "torque-wrench-measured-friction",
    "impact-wrench",
    "hydraulic-tensioner",
    "ultrasonic-elongation",
    "measured-elongation",
    "angle-controlled",
    "yield-controlled",
]

TIGHTENING_METHODS: dict[str, str] = {
    "torque-wrench": "torque-wrench-estimated-friction",
    "torque-wrench-measured-friction": "torque-wrench-measured-friction",
    "impact-wrench": "impact-wrench",
    "hydraulic-tensioner": "hydraulic-tensioning",
    "ultrasonic-elongation": "ultrasonic-elongation",
    "measured-elongation": "mechanical-elongation",
    "angle-controlled": "angle-controlled",
    "yield-controlled": "yield-controlled",
}
"""Tightening methods of a design file -> key of the tightening-factor table
:data:`vcheck.dynamics.joints.preload.TIGHTENING_FACTORS_VDI_2230`. A plain "torque-wrench" is
one set with an estimated friction coefficient; "torque-wrench-measured-friction" one
whose torque was set by tests on the original parts."""

TORQUE_METHODS = ("torque-wrench", "torque-wrench-measured-friction", "impact-wrench")
"""Methods whose preload follows from a torque; the others set a preload directly."""

AMPLITUDE_READINGS: dict[str, str] = {
    "rms": "rms",
    "peak": "peak", "pk": "peak", "0-pk": "peak", "0-peak": "peak", "zero-to-peak": "peak",
    "peak-to-peak": "peak-to-peak", "pk-pk": "peak-to-peak", "p-p": "peak-to-peak",
}
"""Words that say how a vibration amplitude is stated, -> rms, peak or peak-to-peak."""

_LEVEL_EXAMPLES = '"4.5 mm/s rms", "0.5 g peak" or "50 um peak-to-peak"'


# ------------------------------------------------------------------ vibration level


class VibrationLevel(Record):
    """A vibration amplitude as stated in the design, SI inside.

    ``quantity`` is "velocity" [m/s], "acceleration" [m/s^2] or "displacement" [m];
    ``reading`` is "rms", "peak" or "peak-to-peak"; ``reading_stated`` is False when the
    design left the reading out and the default of its quantity was taken.
    """

    quantity: str
    amount: Amount
    reading: str
    reading_stated: bool

    @property
    def text(self) -> str:
        return self.amount.text


DEFAULT_READINGS: dict[str, str] = {
    "velocity": "rms",
    "acceleration": "rms",
    "displacement": "peak",
}
"""Reading taken when a level does not say: RMS for velocity, as ISO 10816 and ISO 20816
state severity (common practice); RMS for acceleration, the cautious reading (a peak
value read as RMS overstates the load by 1.41, never understates it); peak for
displacement, cautious against the common peak-to-peak reading."""


def read_vibration_level(raw: object) -> VibrationLevel:
    """Read a vibration level such as "4.5 mm/s rms"; raises ValueError if it cannot."""
    if isinstance(raw, VibrationLevel):
        return raw
    generic = (f"write a velocity, an acceleration or a displacement with its unit, "
               f"optionally with rms, peak or peak-to-peak, such as {_LEVEL_EXAMPLES}")
    if not isinstance(raw, str) or isinstance(raw, bool):
        raise ValueError(f"a vibration level is text: {generic}")
    words = raw.split()
    readings = [w for w in words if w.lower() in AMPLITUDE_READINGS]
    if len(readings) > 1:
        raise ValueError(f"'{raw}' says more than one reading ({', '.join(readings)}); "
                         f"give one of rms, peak, peak-to-peak")
    rest = " ".join(w for w in words if w.lower() not in AMPLITUDE_READINGS)
    for quantity_name, kind in (("velocity", "velocity"), ("acceleration", "acceleration"),
                                ("displacement", "length")):
        try:
            amount = parse_amount(rest, kind)
        except UnitError:
            continue
        if not amount.low > 0:
            raise ValueError(f"a vibration level must be greater than zero, got '{raw.strip()}'")
        reading = (AMPLITUDE_READINGS[readings[0].lower()] if readings
                   else DEFAULT_READINGS[quantity_name])
        amount = Amount(amount.value, amount.low, amount.high, raw.strip())
        return VibrationLevel(quantity_name, amount, reading, bool(readings))
    raise ValueError(f"cannot read '{raw.strip()}' as a vibration level: {generic}")


def _level(raw: object) -> VibrationLevel:
    try:
        return read_vibration_level(raw)
    except ValueError as exc:
        raise PydanticCustomError(_READ, str(exc)) from None


Level = Annotated[
    VibrationLevel,
    read_by(_level,
            {"type": "string", "examples": ["4.5 mm/s rms", "0.5 g peak"],
             "description": "vibration velocity, acceleration or displacement with "
                            "its unit and reading (rms, peak, peak-to-peak)"}),
]


class Vibration(DesignModel):
    """Vibration of the clamped part: a stated level, or the ISO 10816-3 default.

    Written as a string (``vibration = "4.5 mm/s"``: the level at running speed) or as a
    table: ``{ level = "0.8 g peak", frequency = "120 Hz" }``. Without a level the rules
    take the upper boundary of zone B of ISO 10816-3 for the machine group and support
    type given here, or assumed.
    """

    level: Level | None = Field(None, description="e.g. \"4.5 mm/s rms\", \"0.8 g peak\"")
    frequency: Frequency | None = Field(
        None, description="frequency of the vibration; running speed when left out")
    machine_group: int | None = Field(
        None, description="ISO 10816-3 group: 1 above 300 kW, 2 from 15 kW to 300 kW")
    support_type: Literal["rigid", "flexible"] | None = Field(
        None, description="ISO 10816-3 support type; from the natural frequencies otherwise")
    measured_on: Literal["clamped-part", "support", "bearing-housing"] | None = Field(
        None, description="where the level was measured: on the clamped part itself (taken "
        "as is), on the support under the joint (amplified by the design's natural "
        "frequencies between), or on the machine's bearing housings (the machine's own "
        "response, taken as is for the part it holds); on the support when left out, the "
        "cautious side")

    @model_validator(mode="before")
    @classmethod
    def _shorthand(cls, data: object) -> object:
        if isinstance(data, str):
            return {"level": data}
        return data

    @field_validator("machine_group")
    @classmethod
    def _group(cls, value: int | None) -> int | None:
        if value is not None and value not in (1, 2):
            raise PydanticCustomError(
                _RANGE, "the machine group of ISO 10816-3 is 1 (above 300 kW) or 2 (15 kW "
                f"to 300 kW), got {value}")
        return value

    @model_validator(mode="after")
    def _default_only(self) -> "Vibration":
        if self.level is not None and (self.machine_group or self.support_type):
            raise PydanticCustomError(
                "joint", "'machine-group' and 'support-type' choose the default level of "
                "ISO 10816-3; leave them out when a 'level' is given")
        if self.level is None and self.measured_on is not None:
            raise PydanticCustomError(
                "joint", "'measured-on' says where a stated 'level' was measured; the ISO "
                "10816-3 default is a bearing-housing level already (give a 'level' with "
                "it, or leave 'measured-on' out)")
        return self


# ------------------------------------------------------------------------ tightening


class Tightening(DesignModel):
    """How the bolts are tightened: the method and the torque or preload it gives."""

    method: TighteningMethod
    torque: Torque | None = Field(None, description="tightening torque, e.g. \"190 N*m\"")
    preload: Force | None = Field(
        None, description="preload the method aims at (mean), e.g. \"60 kN\"")
    nut_factor: float | None = Field(
        None, gt=0, lt=1, description="nut factor K of T = K F d, instead of the friction "
        "coefficients, e.g. 0.2")

    @model_validator(mode="after")
    def _consistent(self) -> "Tightening":
        method = self.method
        if method in TORQUE_METHODS:
            if self.torque is None and self.preload is None:
                raise PydanticCustomError(
                    "joint", f"tightening by '{method}' needs the 'torque' (e.g. \"190 N*m\") "
                    "or the 'preload' it gives (e.g. \"60 kN\")")
            if self.torque is not None and self.preload is not None:
                raise PydanticCustomError(
                    "joint", "give the 'torque' or the 'preload', not both: the preload "
                    "follows from the torque")
        else:
            if self.torque is not None:
                raise PydanticCustomError(
                    "joint", f"a torque does not set the preload with '{method}'; give the "
                    "'preload' it sets (e.g. \"80 kN\")")
            if self.preload is None:
                raise PydanticCustomError(
                    "joint", f"tightening by '{method}' needs the 'preload' it sets "
                    "(e.g. \"80 kN\")")
        if self.nut_factor is not None and self.torque is None:
            raise PydanticCustomError("joint", "'nut-factor' goes with a 'torque'")
        return self


# ----------------------------------------------------------------------------- joint


def default_hole_diameter(thread: ThreadSize) -> float:
    """Clearance hole D_h [m]: ISO 273 medium where tabulated, else 1.1 d.

    1.1 d is the ratio of the ISO 273 medium series (1.08 d to 1.13 d from M8 to M30),
    taken for the unified threads, which have no hole in the tables.
    """
    if thread.clearance_hole_diameter is not None:
        return thread.clearance_hole_diameter
    return 1.1 * thread.nominal_diameter


def default_clamp_length(thread: ThreadSize) -> float:
    """Clamp length l_K [m] assumed when the design gives none: 2 d."""
    return 2.0 * thread.nominal_diameter


def _mm(value: float) -> str:
    return f"{value * 1e3:.4g} mm"


class FrictionBand(Record):
    """A friction coefficient known within a band, ``low`` to ``high`` [unitless].

    ``text`` is how the design gave it ("0.12", "{ min = 0.08, max = 0.16 }", "class B").
    A single number is a band of no width: the engineer states the value.
    """

    low: float
    high: float
    text: str

    @property
    def is_band(self) -> bool:
        return self.high > self.low

    def shown(self) -> str:
        """'0.12' or '0.08 to 0.16'."""
        return f"{self.low:g}" if not self.is_band else f"{self.low:g} to {self.high:g}"


DEFAULT_FRICTION_CLASS = "B"
"""Friction class taken for thread and head when a joint gives neither the coefficients
nor a class: VDI 2230 Part 1 Table A5 class B, 0.08 to 0.16, steel bolts as delivered,
lightly oiled or phosphated (the class from memory; the usual class of suppliers' torque
tables)."""


def friction_class_band(name: str) -> FrictionBand:
    """The band of a VDI 2230 friction class "A" to "D"; ValueError otherwise."""
    from ..dynamics.joints.preload import FRICTION_CLASSES_VDI_2230

    low, high = FRICTION_CLASSES_VDI_2230.get(name, (None, None))
    if low is None or high is None:
        bounded = ", ".join(k for k, (_, hi) in FRICTION_CLASSES_VDI_2230.items() if hi)
        raise ValueError(f"friction class '{name}' is not a class with both bounds in VDI "
                         f"2230 Table A5 (valid: {bounded}); class E has no upper bound, give "
                         "{ min = 0.30, max = ... } instead")
    return FrictionBand(low, high, f"class {name}")


def _friction_band(label: str):
    example = "{ min = 0.08, max = 0.16 }"

    def read(raw: object) -> FrictionBand:
        if isinstance(raw, FrictionBand):
            return raw
        if isinstance(raw, dict):
            unknown = sorted(set(raw) - {"min", "max"})
            if unknown or set(raw) != {"min", "max"}:
                raise PydanticCustomError(
                    _READ, f"a {label} band is {example}: its 'min' and 'max', got "
                    f"{', '.join(repr(k) for k in raw) or 'an empty table'}")
            low, high = (_coefficient(raw[k], label) for k in ("min", "max"))
            if low > high:
                raise PydanticCustomError(
                    _RANGE, f"the {label} band's lower bound {low:g} exceeds its upper bound "
                    f"{high:g}; write the smaller first, such as {example}")
            return FrictionBand(low, high, f"{{ min = {low:g}, max = {high:g} }}")
        value = _coefficient(raw, label)
        return FrictionBand(value, value, f"{value:g}")

    return read


def _coefficient(raw: object, label: str) -> float:
    if isinstance(raw, bool) or not isinstance(raw, (int, float)):
        raise PydanticCustomError(
            _READ, f"{label} is a number such as 0.12, or a band such as "
            f"{{ min = 0.08, max = 0.16 }}, got {raw!r}")
    value = float(raw)
    if not 0 < value < 1:
        raise PydanticCustomError(
            _RANGE, f"{label} must be greater than 0 and less than 1, got {value:g}")
    return value


def _band_type(label: str):
    return Annotated[
        FrictionBand,
        read_by(_friction_band(label), {"anyOf": [
            {"type": "number", "exclusiveMinimum": 0, "exclusiveMaximum": 1},
            {"type": "object", "properties": {"min": {"type": "number"},
                                              "max": {"type": "number"}},
             "required": ["min", "max"], "additionalProperties": False}],
            "description": f"{label}: a value or a band {{ min, max }}",
            "examples": [0.12, {"min": 0.08, "max": 0.16}]}),
    ]


ThreadFriction = _band_type("thread friction")
HeadFriction = _band_type("head friction")


def _friction(value: float | None, label: str) -> float | None:
    if value is not None and not 0 < value < 1:
        raise PydanticCustomError(
            _RANGE, f"{label} must be greater than 0 and less than 1, got {value:g}")
    return value


class Joint(DesignModel):
    """A bolted joint carrying a vibrating part: a group of equal bolts."""

    name: str = Field(min_length=1, max_length=120,
                      description="what the joint holds, e.g. 'motor feet'")
    fastener: str = Field(description="thread designation, e.g. 'M16', 'M12x1.5', '3/8-16'")
    property_class: str = Field(
        description="e.g. '8.8', '10.9', 'SAE J429 grade 5', 'A2-70'",
        json_schema_extra=lambda schema: schema.update(type=["string", "number"]))
    count: int = Field(description="number of bolts in the joint")
    tightening: Tightening = Field(
        description="e.g. { method = \"torque-wrench\", torque = \"190 N*m\" }")
    thread_friction: ThreadFriction | None = Field(
        None, description="thread friction coefficient, a value (e.g. 0.12) or the band "
        "expected (e.g. { min = 0.08, max = 0.16 }): the low end sets the largest preload, "
        "the high end the least")
    head_friction: HeadFriction | None = Field(
        None, description="friction coefficient under the head or nut, a value or a band, "
        "as 'thread-friction'")
    friction_class: Literal["A", "B", "C", "D", "E"] | None = Field(
        None, description="VDI 2230 friction class of thread and head, e.g. \"B\" (0.08 "
        "to 0.16), for the coefficients not given; class B when neither is given")
    interface_friction: float | None = Field(
        None, description="friction coefficient between the clamped parts, e.g. 0.2")
    clamped_parts: int = Field(2, ge=2, le=20, description="parts clamped, shims included")
    shear_interfaces: int = Field(
        1, ge=1, le=19, description="interfaces that carry the transverse load side by side")
    engagement: Literal["nut", "tapped-hole"] = "nut"
    thread_rolled: Literal["before-heat-treatment", "after-heat-treatment"] | None = Field(
        None, description="when the thread was rolled; before heat treatment for most bolts")
    clamp_length: Geometry | None = Field(
        None, description="total thickness clamped, head to nut, e.g. \"40 mm\"")
    shank_length: GeometryOrZero | None = Field(
        None, description="plain shank inside the clamp length; \"0 mm\" for a fully "
        "threaded bolt")
    hole_diameter: Geometry | None = Field(None, description="clearance hole, e.g. \"17.5 mm\"")
    clamped_width: Geometry | None = Field(
        None, description="outside diameter of the clamped parts around one bolt")
    clamped_modulus: Stress | None = Field(
        None, description="Young's modulus of the clamped parts, e.g. \"110 GPa\" for cast iron")
    surface_roughness: Geometry | None = Field(
        None, description="averaged roughness depth Rz of the contact faces, e.g. \"16 um\"")
    clamps: Mass = Field(description="mass of the vibrating part the joint holds")
    vibration: Vibration | None = Field(
        None, description="vibration of the clamped part, e.g. \"4.5 mm/s\" (RMS)",
        json_schema_extra=lambda schema: schema.setdefault("anyOf", []).insert(0, {
            "type": "string", "examples": ["4.5 mm/s rms", "0.5 g peak"],
            "description": "the level at running speed, shorthand for { level = ... }"}))
    axial_load: Force | None = Field(
        None, description="static load pulling the joint apart, all bolts together")
    transverse_load: Force | None = Field(
        None, description="static load across the joint, all bolts together")
    machine_loads: Literal["carried", "not-carried"] | None = Field(
        None, description="whether the machine's own forces and moments (unbalance, crank, "
        "torque reaction, belt pull, stated loads) pass through this joint, as for the "
        "hold-down of a rigidly mounted machine; default carried when the design has such "
        "loads (the cautious side)")
    bolt_positions: tuple[Point, ...] = Field(
        (), description="where each bolt is, in machine axes, to share the machine's moments "
        "by the bolt pattern; one per bolt")
    bolt_axis: Direction | None = Field(
        None, description="direction of the bolts (the joint plane is square to it); "
        "default vertical, { z = 1 }")

    @field_validator("fastener")
    @classmethod
    def _thread(cls, value: str) -> str:
        try:
            thread = thread_by_name(value)
        except ValueError as exc:
            raise PydanticCustomError(_READ, str(exc)) from None
        if thread.head_bearing_diameter is None:
            raise PydanticCustomError(
                _READ, f"thread '{value}' has no hexagon head in the tables (ASME B18.2.1 "
                "from 1/4 in, ISO 4014 from M3): use a tabulated hex bolt size")
        return thread.designation

    @field_validator("property_class", mode="before")
    @classmethod
    def _class_as_text(cls, value: object) -> object:
        if isinstance(value, float):
            return f"{value:g}"
        return value

    @field_validator("property_class")
    @classmethod
    def _material(cls, value: str, info: ValidationInfo) -> str:
        from ..dynamics.joints.bolt_materials import bolt_material

        designation = info.data.get("fastener")
        if designation is None:  # the thread is wrong: check the name alone
            try:
                return bolt_material(value).name
            except ValueError as exc:
                if str(exc).startswith("unknown property class"):
                    raise PydanticCustomError(_READ, str(exc)) from None
                return value
        thread = thread_by_name(designation)
        try:
            material = bolt_material(value, diameter=thread.nominal_diameter)
        except ValueError as exc:
            raise PydanticCustomError(_READ, str(exc)) from None
        metric = thread.series.startswith("metric")
        inch_grade = material.name.startswith("SAE")
        if metric and inch_grade:
            raise PydanticCustomError(
                _READ, f"{material.name} is a grade of inch bolts; the metric thread "
                f"{designation} takes an ISO 898-1 property class such as '8.8' or an ISO "
                "3506-1 class such as 'A2-70'")
        if not metric and not inch_grade:
            raise PydanticCustomError(
                _READ, f"property class '{material.name}' is for metric bolts; the inch "
                f"thread {designation} takes an SAE J429 grade such as 'SAE J429 grade 5'")
        return material.name

    @field_validator("count", mode="before")
    @classmethod
    def _count(cls, value: object) -> object:
        if isinstance(value, bool) or not isinstance(value, int):
            return value  # pydantic says what a whole number is
        if value < 1:
            raise PydanticCustomError(_RANGE, f"a joint needs at least one bolt, got {value}")
        if value > 500:
            raise PydanticCustomError(_RANGE, f"a joint has at most 500 bolts, got {value}")
        return value

    @field_validator("friction_class")
    @classmethod
    def _friction_class(cls, value: str | None) -> str | None:
        if value is not None:
            try:
                friction_class_band(value)
            except ValueError as exc:
                raise PydanticCustomError(_RANGE, str(exc)) from None
        return value

    @field_validator("interface_friction")
    @classmethod
    def _interface_friction(cls, value: float | None) -> float | None:
        return _friction(value, "interface friction")

    @field_validator("shear_interfaces")
    @classmethod
    def _interfaces(cls, value: int, info: ValidationInfo) -> int:
        parts = info.data.get("clamped_parts")
        if parts is not None and value > parts - 1:
            raise PydanticCustomError(
                _RANGE, f"{parts} clamped parts have {parts - 1} interface(s) between them, "
                f"got shear-interfaces = {value}")
        return value

    @field_validator("shank_length")
    @classmethod
    def _shank(cls, value: Amount | None, info: ValidationInfo) -> Amount | None:
        thread = cls._known_thread(info)
        if value is None or thread is None:
            return value
        clamp = info.data.get("clamp_length")
        limit = clamp.value if clamp is not None else default_clamp_length(thread)
        if value.value > limit * (1 + 1e-9):
            which = "the clamp length" if clamp is not None else "the assumed clamp length 2 d"
            raise PydanticCustomError(
                _RANGE, f"the shank length must not exceed {which} ({_mm(limit)}), "
                f"got '{value.text}'")
        return value

    @field_validator("hole_diameter")
    @classmethod
    def _hole(cls, value: Amount | None, info: ValidationInfo) -> Amount | None:
        thread = cls._known_thread(info)
        if value is None or thread is None:
            return value
        d, dw = thread.nominal_diameter, thread.head_bearing_diameter
        if not d < value.value < dw:
            raise PydanticCustomError(
                _RANGE, f"the hole diameter must be larger than the bolt ({_mm(d)}) and "
                f"smaller than the bearing face of its head ({_mm(dw)}), got '{value.text}'")
        return value

    @field_validator("clamped_width")
    @classmethod
    def _width(cls, value: Amount | None, info: ValidationInfo) -> Amount | None:
        thread = cls._known_thread(info)
        if value is None or thread is None:
            return value
        hole = info.data.get("hole_diameter")
        limit = hole.value if hole is not None else default_hole_diameter(thread)
        if value.value <= limit:
            raise PydanticCustomError(
                _RANGE, f"the clamped width must be larger than the hole ({_mm(limit)}), "
                f"got '{value.text}'")
        return value

    @field_validator("surface_roughness")
    @classmethod
    def _roughness(cls, value: Amount | None) -> Amount | None:
        if value is not None and value.value >= 160e-6:
            raise PydanticCustomError(
                _RANGE, "the embedding guide values (VDI 2230 Part 1 Table 5) cover Rz "
                f"below 160 um, got '{value.text}'")
        return value

    @field_validator("vibration", mode="before")
    @classmethod
    def _vibration_shorthand(cls, value: object) -> object:
        if isinstance(value, str):  # vibration = "4.5 mm/s": errors located at the key
            return {"level": _level(value)}
        return value

    @model_validator(mode="after")
    def _bolt_pattern(self) -> "Joint":
        if self.bolt_positions and len(self.bolt_positions) != self.count:
            raise PydanticCustomError(
                "joint", f"'bolt-positions' gives {len(self.bolt_positions)} positions for "
                f"count = {self.count} bolts: give one per bolt")
        return self

    @staticmethod
    def _known_thread(info: ValidationInfo) -> ThreadSize | None:
        designation = info.data.get("fastener")
        return None if designation is None else thread_by_name(designation)

    @property
    def thread(self) -> ThreadSize:
        """Basic dimensions of the bolt thread [m]."""
        return thread_by_name(self.fastener)

    @property
    def material(self):
        """Strength of the bolt material at this diameter
        (:class:`vcheck.dynamics.joints.bolt_materials.BoltMaterial`) [Pa]."""
        from ..dynamics.joints.bolt_materials import bolt_material

        return bolt_material(self.property_class, diameter=self.thread.nominal_diameter)

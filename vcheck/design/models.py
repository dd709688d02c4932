"""Validated models of a design file, SI units inside.

One design file describes one installation: the machine, how it is mounted, what it
stands on, and any natural frequencies the engineer already knows. Keys in the file are
kebab-case; fields here are snake_case with kebab-case aliases. Every dimensional value
is an :class:`~vcheck.design.units.Amount` in SI units (speeds and frequencies in Hz).
"""


import math
from typing import Annotated, Literal

from pydantic import (
    Field,
    PrivateAttr,
    field_validator,
    model_validator,
)
from pydantic_core import PydanticCustomError

from ..records import Record
from .fatigue_details import FatigueDetail
from .fields import (
    DesignModel,
    Frequency,
    Length,
    Mass,
    MassOrZero,
    Power,
    SpeedValue,
    Stiffness,
    Time,
    read_by,
)
from .joints import Joint
from .loads import Crank, StatedLoad, TorqueReaction
from .measurements import Measurement, location_problems
from .modal import Beam, Direction, Envelope, InertiaTensor, LumpedModel, ModeFile, Mount, Point
from .shaft_trains import ShaftTrain
from .units import UnitError, parse_amount

__all__ = [
    "FORMAT_VERSIONS",
    "Design",
    "Excitation",
    "Machine",
    "MachineKind",
    "Mounting",
    "NaturalFrequency",
    "Rotor",
    "Speed",
    "StiffnessRatio",
    "StructureFile",
    "Support",
]

FORMAT_VERSIONS = (1,)
"""Design file format versions this vcheck reads."""


MachineKind = Literal[
    "centrifugal-pump",
    "fan",
    "compressor",
    "reciprocating-compressor",
    "motor",
    "engine",
    "generator-set",
    "chiller",
    "cooling-tower",
    "air-handler",
    "other",
]


class Speed(DesignModel):
    """Running speed: one value, or the range of a variable-speed drive [Hz]."""

    min: SpeedValue
    max: SpeedValue

    @classmethod
    def __get_pydantic_json_schema__(cls, core_schema, handler):
        table = handler(core_schema)
        single = {"type": "string", "description": "one running speed with its unit",
                  "examples": ["1480 rpm"]}
        return {"anyOf": [single, table]}

    @model_validator(mode="before")
    @classmethod
    def _single_value(cls, data: object) -> object:
        if isinstance(data, (str, int, float)) and not isinstance(data, bool):
            try:
                amount = parse_amount(data, "frequency", allow_tolerance=False)
            except UnitError as exc:
                raise PydanticCustomError("unit", str(exc)) from None
            return {"min": amount, "max": amount}
        return data

    @model_validator(mode="after")
    def _ordered(self) -> "Speed":
        if self.min.value > self.max.value:
            raise PydanticCustomError(
                "speed_range",
                f"the speed range is reversed: min '{self.min.text}' is above "
                f"max '{self.max.text}'",
            )
        return self

    @property
    def is_range(self) -> bool:
        return self.min.value != self.max.value


class Excitation(DesignModel):
    """A forcing source listed by the engineer: a fixed frequency or a speed order."""

    name: str = Field(min_length=1, description="what excites, e.g. 'belt pass'")
    frequency: Frequency | None = Field(None, description="fixed frequency, e.g. '8.2 Hz'")
    order: float | None = Field(
        None, gt=0, le=1000, description="multiple of running speed, e.g. 0.38 for a belt"
    )

    @model_validator(mode="after")
    def _one_of(self) -> "Excitation":
        if (self.frequency is None) == (self.order is None):
            raise PydanticCustomError(
                "excitation",
                "give exactly one of 'frequency' (e.g. \"8.2 Hz\") or 'order' (e.g. 0.38)",
            )
        return self


DriverKind = Literal["induction-motor", "synchronous-motor", "dc-motor", "engine", "turbine",
                     "belt-drive", "none"]


AC_MOTOR_KINDS = ("induction-motor", "synchronous-motor")
"""Driver kinds whose magnetic forcing follows the supply frequency."""


class Driver(DesignModel):
    """What drives the machine; an electric machine adds its magnetic forcing."""

    kind: DriverKind
    line_frequency: Frequency | None = Field(None, description="supply frequency, e.g. \"60 Hz\"")
    poles: int | None = Field(None, ge=2, le=64, description="poles of the motor (even)")
    supply: Literal["line", "drive"] | None = Field(
        None, description="how an AC motor is fed: 'line' (started across the line, magnetic "
        "forcing at twice line frequency) or 'drive' (a variable-frequency drive, magnetic "
        "forcing at poles x speed); default: 'line' at a single speed, both at a speed range")
    speed_ratio: float | None = Field(
        None, gt=0, le=100, description="motor speed / machine speed where a belt or gear "
        "sits between them (a drive-fed motor's forcing follows the motor's speed); default 1 "
        "without a belt")

    @field_validator("poles")
    @classmethod
    def _even_poles(cls, poles: int | None) -> int | None:
        if poles is not None and poles % 2:
            raise PydanticCustomError(
                "poles", f"'poles' must be even (north and south poles come in pairs), got "
                f"{poles}; e.g. 2, 4 or 6")
        return poles

    @model_validator(mode="after")
    def _line_frequency(self) -> "Driver":
        if self.supply is not None and self.kind not in AC_MOTOR_KINDS:
            raise PydanticCustomError(
                "driver", f"'supply' applies to an induction or synchronous motor, not to "
                f"kind = \"{self.kind}\"")
        if self.supply == "drive":
            if self.poles is None:
                raise PydanticCustomError(
                    "driver", "a motor fed by a drive needs 'poles' (e.g. 4): its magnetic "
                    "forcing is poles x speed")
            return self
        if self.kind in AC_MOTOR_KINDS and self.line_frequency is None:
            raise PydanticCustomError(
                "driver", "an electric motor needs 'line-frequency' (e.g. \"50 Hz\")")
        return self


class Bearing(DesignModel):
    """A rolling bearing on the machine shaft, for its defect frequencies."""

    name: str = Field(min_length=1, description="e.g. 'drive end, 6309'")
    balls: int = Field(ge=3, le=100, description="rolling elements")
    ball_diameter: Length
    pitch_diameter: Length
    contact_angle: float = Field(0.0, ge=0, lt=90, description="contact angle [degrees]")

    @model_validator(mode="after")
    def _geometry(self) -> "Bearing":
        if self.ball_diameter.value >= self.pitch_diameter.value:
            raise PydanticCustomError("bearing", "the ball diameter must be smaller than the "
                                      "pitch diameter")
        return self


class Gear(DesignModel):
    """A gear whose mesh excites: teeth on a shaft turning at a ratio of machine speed."""

    name: str = Field(min_length=1)
    teeth: int = Field(ge=5, le=1000)
    shaft_ratio: float = Field(1.0, ge=1e-3, le=1e3, description="shaft speed / machine speed")


class Belt(DesignModel):
    """A belt drive; its pass frequency comes from the machine pulley and belt length."""

    pulley_diameter: Length = Field(description="pitch diameter of the machine's pulley")
    length: Length = Field(description="pitch length of the belt")
    kind: Literal["v-belt", "poly-v", "flat", "synchronous"] | None = Field(
        None, description="for the belt pull from machine.power: v-belt, poly-v, flat or "
        "synchronous")
    pull_direction: Direction | None = Field(
        None, description="from the machine's pulley towards the other pulley; default "
        "across the shaft, { y = 1 }")
    position: Point | None = Field(None, description="centre of the machine's pulley; "
                                   "default the centre of gravity")


class Rotor(DesignModel):
    """The rotating assembly whose residual unbalance forces the machine once a revolution."""

    mass: Mass = Field(description="mass of the rotor: impeller or fan wheel with its shaft")
    balance_grade: str = Field(description="ISO 21940-11 balance quality grade, e.g. \"G6.3\"")
    position: Point | None = Field(None, description="centre of the rotor, where its "
                                   "unbalance acts; default the centre of gravity")

    @model_validator(mode="after")
    def _known_grade(self) -> "Rotor":
        # checked on the table, so that the message (which names the grade) is shown as is
        from ..dynamics.forcing.unbalance import balance_quality_from_grade

        try:
            balance_quality_from_grade(self.balance_grade)
        except ValueError as exc:
            raise PydanticCustomError("balance_grade", str(exc)) from None
        return self

    @property
    def balance_quality(self) -> float:
        """The grade's e_per * Omega [m/s] (G6.3 is 0.0063)."""
        from ..dynamics.forcing.unbalance import balance_quality_from_grade

        return balance_quality_from_grade(self.balance_grade)


class Machine(DesignModel):
    """The machine: what it is, what it weighs, how fast it runs."""

    tag: str = Field(min_length=1, max_length=80, description="equipment tag, e.g. 'P-101'")
    kind: MachineKind
    description: str = ""
    mass: Mass
    speed: Speed
    vanes: int | None = Field(None, ge=1, le=200, description="impeller vanes (vane pass)")
    blades: int | None = Field(None, ge=1, le=200, description="fan blades (blade pass)")
    cylinders: int | None = Field(None, ge=1, le=24, description="cylinders of an engine or "
                                  "reciprocating compressor")
    strokes: Literal[2, 4] | None = Field(None, description="two- or four-stroke cycle")
    driver: Driver | None = None
    bearing: tuple[Bearing, ...] = Field((), max_length=100)
    gear: tuple[Gear, ...] = ()
    belt: Belt | None = None
    excitation: tuple[Excitation, ...] = Field((), max_length=500)
    rotor: Rotor | None = Field(None, description="rotor mass and balance grade, for the "
                                "unbalance force")
    power: Power | None = Field(None, description="shaft power at the maximum speed, for the "
                                "torque reaction and the belt pull")
    crank: Crank | None = Field(None, description="crank mechanism, for the free forces and "
                                "moments of a reciprocating machine")
    torque: TorqueReaction | None = Field(None, description="torque reaction on the frame")
    load: tuple[StatedLoad, ...] = Field((), description="forces and moments stated directly")
    run_up: Time | None = Field(
        None, description="time from rest to full speed at start-up, e.g. \"6 s\" (the "
        "drive's ramp for a drive-fed motor); default by driver kind")
    run_down: Time | None = Field(
        None, description="time from full speed to rest at shut-down, e.g. \"20 s\" (the "
        "drive's ramp, or the coast-down); default by driver kind")

    @field_validator("run_up", "run_down")
    @classmethod
    def _run_time_in_reason(cls, value, info):
        if value is not None and not (1e-3 <= value.low and value.high <= 1e6):
            raise PydanticCustomError(
                "run_time", f"'{info.field_name.replace('_', '-')}' of '{value.text}' is outside "
                "the 1 ms to 1e6 s (about 12 days) this format accepts; e.g. \"8 s\"")
        return value

    @model_validator(mode="after")
    def _cycle_with_cylinders(self) -> "Machine":
        if self.cylinders is not None and self.strokes is None and self.kind != \
                "reciprocating-compressor":
            raise PydanticCustomError(
                "machine", "with 'cylinders', give 'strokes' (2 or 4)")
        return self

    @model_validator(mode="after")
    def _crank_with_cylinders(self) -> "Machine":
        crank = self.crank
        if crank is None:
            return self
        if self.cylinders is None:
            raise PydanticCustomError("machine", "with [machine.crank], give 'cylinders'")
        n = self.cylinders
        if crank.arrangement in ("vee", "opposed") and n % 2:
            raise PydanticCustomError(
                "machine", f"{_article(crank.arrangement)} {crank.arrangement} arrangement needs an "
                f"even number of cylinders (two banks), got cylinders = {n}; valid "
                "arrangements for an odd count: inline")
        if crank.crank_angles is not None and len(crank.crank_angles) != n:
            raise PydanticCustomError(
                "machine", f"'crank.crank-angles' gives {len(crank.crank_angles)} angles for "
                f"{n} cylinders: give one per cylinder")
        throws = n // 2 if crank.arrangement in ("vee", "opposed") else n
        if throws > 1 and crank.cylinder_spacing is None:
            raise PydanticCustomError(
                "machine", f"with {throws} crank throws, give 'crank.cylinder-spacing' (e.g. "
                "\"160 mm\"), for the free moments")
        return self

    @model_validator(mode="after")
    def _torque_inputs(self) -> "Machine":
        torque = self.torque
        if torque is None:
            return self
        if torque.mean_torque is None and self.power is None:
            raise PydanticCustomError("machine", "with [machine.torque], give machine 'power' "
                                      "(e.g. \"55 kW\") or torque 'mean-torque'")
        if torque.mean_torque is not None and self.power is not None:
            raise PydanticCustomError("machine", "give machine 'power' or torque "
                                      "'mean-torque', not both")
        if (torque.fluctuation is None or torque.order is None) and self.cylinders is None:
            raise PydanticCustomError(
                "machine", "the torque fluctuation and its order default from the cylinder "
                "count: give 'cylinders', or torque 'fluctuation' and 'order'")
        return self


def _article(word: str) -> str:
    return "an" if word[:1] in "aeiou" else "a"


class StiffnessRatio(Record):
    """A dynamic-to-static stiffness ratio of isolators, one value or a band [unitless]."""

    low: float
    value: float
    high: float

    @property
    def text(self) -> str:
        if self.low == self.high:
            return f"{self.value:g}"
        return f"{self.low:g}-{self.high:g}"

    @property
    def has_tolerance(self) -> bool:
        return self.low != self.high


def _stiffness_ratio(raw: object) -> StiffnessRatio:
    def number(value: object, what: str) -> float:
        if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(
                value):
            raise PydanticCustomError(
                "stiffness_ratio", f"'{what}' should be a finite number such as 1.4, got "
                f"{value!r}")
        if value < 1:
            raise PydanticCustomError(
                "stiffness_ratio", f"the dynamic-to-static stiffness ratio must be at least 1 "
                f"(isolators are no softer under vibration than under their weight), got "
                f"{value:g}; e.g. 1.4 for rubber")
        if value > 10:
            raise PydanticCustomError(
                "stiffness_ratio", f"a dynamic-to-static stiffness ratio of {value:g} is beyond "
                "the 10 this format accepts; elastomers range from about 1.2 to 3")
        return float(value)

    if isinstance(raw, StiffnessRatio):
        return raw
    if isinstance(raw, dict):
        unknown = sorted(set(raw) - {"min", "max"})
        if unknown or set(raw) != {"min", "max"}:
            raise PydanticCustomError(
                "stiffness_ratio", "give the ratio as a number (e.g. 1.4) or as a band "
                "{ min = 1.2, max = 1.6 }")
        low, high = number(raw["min"], "min"), number(raw["max"], "max")
        if low > high:
            raise PydanticCustomError(
                "stiffness_ratio", f"the ratio band is reversed: min {low:g} is above max "
                f"{high:g}")
        return StiffnessRatio(low, 0.5 * (low + high), high)
    value = number(raw, "dynamic-stiffness-ratio")
    return StiffnessRatio(value, value, value)


StiffnessRatioField = Annotated[
    StiffnessRatio, read_by(_stiffness_ratio,
                            {"anyOf": [{"type": "number", "minimum": 1, "maximum": 10},
                                       {"type": "object", "properties": {
                                           "min": {"type": "number", "minimum": 1},
                                           "max": {"type": "number", "maximum": 10}},
                                        "required": ["min", "max"], "additionalProperties": False}],
                             "description": "dynamic-to-static stiffness ratio, e.g. 1.4"})]


MountingKind = Literal["spring", "restrained-spring", "rubber", "pad", "air-spring", "rigid"]


class Mounting(DesignModel):
    """How the machine is mounted: isolators, their stiffness or rated deflection."""

    kind: MountingKind
    isolators: int | None = Field(None, ge=1, le=64, description="number of isolators")
    stiffness: Stiffness | None = Field(None, description="vertical stiffness of each isolator")
    static_deflection: Length | None = Field(
        None, description="rated static deflection of the isolators under this machine"
    )
    damping_ratio: float | None = Field(None, ge=0, lt=1, description="fraction of critical")
    loss_factor: float | None = Field(
        None, ge=0, lt=2, description="hysteretic loss factor of elastomer isolators, instead "
        "of 'damping-ratio'")
    base_mass: MassOrZero | None = Field(
        None, description="mass of an inertia base or skid carried on the isolators"
    )
    dynamic_stiffness_ratio: StiffnessRatioField | None = Field(
        None, description="dynamic-to-static stiffness ratio of the isolators, a number or "
        "{ min, max }; applies to the static deflection (and to a stated stiffness, taken "
        "then as static); default 1.4 for rubber and pads, 1.0 for springs")
    mount: tuple[Mount, ...] = Field((), max_length=1000, description="each mount of a "
                                     "rigid machine, for its six modes")
    centre_of_gravity: Point | None = Field(None, description="of machine and base, from the "
                                            "same reference point as the mounts")
    inertia: InertiaTensor | None = Field(None, description="about the centre of gravity")
    envelope: Envelope | None = Field(None, description="overall size, to estimate the "
                                      "inertia as a uniform box")

    @model_validator(mode="after")
    def _consistent(self) -> "Mounting":
        if self.kind == "rigid":
            return self
        if self.mount:
            if self.dynamic_stiffness_ratio is not None:
                raise PydanticCustomError(
                    "mounting", "'dynamic-stiffness-ratio' applies to isolators given by "
                    "'stiffness' or 'static-deflection'; with [[mounting.mount]] tables give "
                    "each mount's dynamic stiffness")
            if self.centre_of_gravity is None:
                raise PydanticCustomError(
                    "mounting", "with [[mounting.mount]] tables, give 'centre-of-gravity' "
                    "(e.g. { x = \"0 mm\", y = \"0 mm\", z = \"450 mm\" })")
            if (self.inertia is None) == (self.envelope is None):
                raise PydanticCustomError(
                    "mounting", "with [[mounting.mount]] tables, give 'inertia' "
                    "(xx, yy, zz about the centre of gravity) or 'envelope' (x, y, z), one "
                    "of them")
            if self.isolators is not None and self.isolators != len(self.mount):
                raise PydanticCustomError(
                    "mounting", f"'isolators' = {self.isolators} but {len(self.mount)} "
                    "[[mounting.mount]] tables are given")
            return self
        if self.stiffness is None and self.static_deflection is None:
            raise PydanticCustomError(
                "mounting",
                "isolators need 'stiffness' (each, e.g. \"180 kN/m\") or "
                "'static-deflection' (e.g. \"25 mm\")",
            )
        if self.stiffness is not None and self.isolators is None:
            raise PydanticCustomError(
                "mounting", "with 'stiffness' of each isolator, give 'isolators' (a count)"
            )
        return self

    @model_validator(mode="after")
    def _one_damping_measure(self) -> "Mounting":
        if self.damping_ratio is not None and self.loss_factor is not None:
            raise PydanticCustomError(
                "mounting", "give 'damping-ratio' (viscous, e.g. 0.05) or 'loss-factor' "
                "(hysteretic, e.g. 0.1), not both")
        return self


SupportKind = Literal[
    "slab-on-grade", "suspended-floor", "roof", "steel-frame", "skid", "foundation-block"
]


class Support(DesignModel):
    """What the installation stands on."""

    kind: SupportKind | None = None
    span: Length | None = Field(None, description="span of the supporting floor bay")
    structure: str | None = Field(None, min_length=1, description="a structure file shared by "
                                  "the machines on it, relative to the project root")
    description: str = ""
    floor_deflection: Length | None = Field(
        None, description="deflection of the floor at the machine under its weight")
    floor_stiffness: Stiffness | None = Field(
        None, description="vertical stiffness of the floor at the machine")

    @model_validator(mode="after")
    def _one_floor_measure(self) -> "Support":
        if self.floor_deflection is not None and self.floor_stiffness is not None:
            raise PydanticCustomError(
                "support", "give 'floor-deflection' (e.g. \"1.5 mm\") or 'floor-stiffness' "
                "(e.g. \"40000 kN/m\"), not both")
        return self

    @model_validator(mode="after")
    def _kind_or_structure(self) -> "Support":
        if self.kind is None and self.structure is None:
            raise PydanticCustomError("support", "give 'kind' (e.g. \"suspended-floor\") or "
                                      "'structure' (a structure file)")
        return self


class NaturalFrequency(DesignModel):
    """A natural frequency known from an FE model, a test or a hand calculation."""

    name: str = Field(min_length=1, description="the mode, e.g. 'deck bay, first bending'")
    frequency: Frequency
    source: str = Field("", description="where the value comes from, e.g. 'FE model rev C'")


def _check_format(version: object) -> object:
    if isinstance(version, bool) or version not in FORMAT_VERSIONS:
        known = ", ".join(str(v) for v in FORMAT_VERSIONS)
        raise PydanticCustomError(
            "format_version",
            f"unknown format version {version!r}; this vcheck reads format {known}",
        )
    return version


class Design(DesignModel):
    """One installation: a machine, its mounting, its support and known modes."""

    format: int = Field(description="design file format version")
    machine: Machine
    mounting: Mounting | None = None
    support: Support | None = None
    natural_frequency: tuple[NaturalFrequency, ...] = Field((), max_length=10_000)
    beam: tuple[Beam, ...] = Field((), max_length=100)
    lumped_model: tuple[LumpedModel, ...] = Field((), max_length=20)
    mode_file: tuple[ModeFile, ...] = Field((), max_length=20)
    joint: tuple[Joint, ...] = Field((), max_length=500)
    fatigue: tuple[FatigueDetail, ...] = Field((), max_length=200)
    shaft_train: tuple[ShaftTrain, ...] = Field((), max_length=20, description="rotating "
                                                "trains, for their torsional modes")
    measurement: tuple[Measurement, ...] = Field(
        (), max_length=500, description="measured vibration of a commissioning survey")

    _file: str = PrivateAttr("")
    _positions: dict = PrivateAttr(default_factory=dict)
    _structure: object = PrivateAttr(None)
    _imported_modes: tuple = PrivateAttr(())
    _analysis: object = PrivateAttr(None)
    _shared: dict = PrivateAttr(default_factory=dict)  # vcheck.analysis.shared
    _fatigue_inputs: tuple = PrivateAttr(())
    _spectra: tuple = PrivateAttr(())

    @field_validator("format", mode="before")
    @classmethod
    def _known_format(cls, version: object) -> object:
        return _check_format(version)

    @model_validator(mode="after")
    def _measured_where(self) -> "Design":
        errors = location_problems(self)
        if errors:
            from .fatigue_details import _located

            raise _located(errors)
        return self

    @property
    def file(self) -> str:
        """Path of the design file, relative to the project root, with '/'."""
        return self._file

    @property
    def structure(self):
        """The shared structure this machine stands on (a :class:`StructureFile`)."""
        return self._structure

    @property
    def imported_modes(self) -> tuple:
        """Modes read from this file's [[mode-file]] CSVs (:class:`ImportedMode`)."""
        return self._imported_modes

    def locate(self, path: tuple) -> tuple[str, int, int]:
        """File, line and column of a key path; falls back to the nearest parent key."""
        positions = self._positions
        probe = tuple(path)
        while probe:
            found = positions.get(probe)
            if found is not None:
                return self._file, found.line, found.column
            probe = probe[:-1]
        return self._file, 1, 1


class StructureInfo(DesignModel):
    """The ``[structure]`` table of a structure file."""

    name: str = Field(min_length=1, description="e.g. 'level-3 deck, bay C'")
    kind: SupportKind
    span: Length | None = None
    description: str = ""


class StructureFile(DesignModel):
    """A structure (floor bay, roof frame, skid) shared by the machines that stand on it."""

    format: int = Field(description="design file format version")
    structure: StructureInfo
    natural_frequency: tuple[NaturalFrequency, ...] = Field((), max_length=10_000)
    beam: tuple[Beam, ...] = Field((), max_length=100)
    lumped_model: tuple[LumpedModel, ...] = Field((), max_length=20)
    mode_file: tuple[ModeFile, ...] = Field((), max_length=20)

    _file: str = PrivateAttr("")
    _positions: dict = PrivateAttr(default_factory=dict)
    _imported_modes: tuple = PrivateAttr(())

    @field_validator("format", mode="before")
    @classmethod
    def _known_format(cls, version: object) -> object:
        return _check_format(version)

    file = Design.file
    imported_modes = Design.imported_modes
    locate = Design.locate

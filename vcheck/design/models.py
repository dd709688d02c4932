"""Validated models of a design file, SI units inside.

One design file describes one installation: the machine, how it is mounted, what it
stands on, and any natural frequencies the engineer already knows. Keys in the file are
kebab-case; fields here are snake_case with kebab-case aliases. Every dimensional value
is an :class:`~vcheck.design.units.Amount` in SI units (speeds and frequencies in Hz).
"""

from __future__ import annotations

from typing import Literal

from pydantic import Field, PrivateAttr, field_validator, model_validator
from pydantic_core import PydanticCustomError

from .fields import DesignModel, Frequency, Length, Mass, MassOrZero, SpeedValue, Stiffness
from .joints import Joint
from .units import UnitError, parse_amount

__all__ = [
    "FORMAT_VERSIONS",
    "Design",
    "Excitation",
    "Machine",
    "MachineKind",
    "Mounting",
    "NaturalFrequency",
    "Speed",
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
    def _ordered(self) -> Speed:
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
        None, gt=0, description="multiple of running speed, e.g. 0.38 for a belt"
    )

    @model_validator(mode="after")
    def _one_of(self) -> Excitation:
        if (self.frequency is None) == (self.order is None):
            raise PydanticCustomError(
                "excitation",
                "give exactly one of 'frequency' (e.g. \"8.2 Hz\") or 'order' (e.g. 0.38)",
            )
        return self


class Machine(DesignModel):
    """The machine: what it is, what it weighs, how fast it runs."""

    tag: str = Field(min_length=1, max_length=80, description="equipment tag, e.g. 'P-101'")
    kind: MachineKind
    description: str = ""
    mass: Mass
    speed: Speed
    vanes: int | None = Field(None, ge=1, le=200, description="impeller vanes (vane pass)")
    blades: int | None = Field(None, ge=1, le=200, description="fan blades (blade pass)")
    excitation: tuple[Excitation, ...] = ()


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
    base_mass: MassOrZero | None = Field(
        None, description="mass of an inertia base or skid carried on the isolators"
    )

    @model_validator(mode="after")
    def _consistent(self) -> Mounting:
        if self.kind == "rigid":
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


SupportKind = Literal[
    "slab-on-grade", "suspended-floor", "roof", "steel-frame", "skid", "foundation-block"
]


class Support(DesignModel):
    """What the installation stands on."""

    kind: SupportKind
    span: Length | None = Field(None, description="span of the supporting floor bay")
    description: str = ""


class NaturalFrequency(DesignModel):
    """A natural frequency known from an FE model, a test or a hand calculation."""

    name: str = Field(min_length=1, description="the mode, e.g. 'deck bay, first bending'")
    frequency: Frequency
    source: str = Field("", description="where the value comes from, e.g. 'FE model rev C'")


class Design(DesignModel):
    """One installation: a machine, its mounting, its support and known modes."""

    format: int = Field(description="design file format version")
    machine: Machine
    mounting: Mounting | None = None
    support: Support | None = None
    natural_frequency: tuple[NaturalFrequency, ...] = ()
    joint: tuple[Joint, ...] = ()

    _file: str = PrivateAttr("")
    _positions: dict = PrivateAttr(default_factory=dict)

    @field_validator("format", mode="before")
    @classmethod
    def _known_format(cls, version: object) -> object:
        if isinstance(version, bool) or version not in FORMAT_VERSIONS:
            known = ", ".join(str(v) for v in FORMAT_VERSIONS)
            raise PydanticCustomError(
                "format_version",
                f"unknown format version {version!r}; this vcheck reads format {known}",
            )
        return version

    @property
    def file(self) -> str:
        """Path of the design file, relative to the project root, with '/'."""
        return self._file

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

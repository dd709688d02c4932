"""Models of the loads a machine generates: crank mechanism, torque reaction, stated loads.

These tables sit under ``[machine]`` in a design file:

- ``[machine.crank]``: the crank mechanism of an engine or reciprocating compressor
  (arrangement, stroke, connecting rod, reciprocating and rotating masses, cylinder
  spacing, crank angles), from which the free forces and moments are derived by order;
- ``[machine.torque]``: the torque reaction on the frame, the mean from ``power`` and
  speed and its fluctuation at the firing orders;
- ``[[machine.load]]``: a force and/or moment stated directly, at an order of running
  speed or a fixed frequency, at a point (what a maker's data sheet gives); a stated
  load at an order replaces the derived crank load of that order.

The rotor's point of action (``rotor.position``) and the belt's kind and pull direction
are fields of :class:`~vcheck.design.models.Rotor` and :class:`~vcheck.design.models.Belt`.
"""

from typing import Literal

from pydantic import Field, model_validator
from pydantic_core import PydanticCustomError

from .fields import DesignModel, Frequency, Length, SpeedValue, quantity
from .modal import Point

__all__ = ["CRANK_ARRANGEMENTS", "Crank", "ForceVector", "MomentVector", "StatedLoad",
           "TorqueReaction"]

MassOrZero = quantity("mass", positive=False)
ForceOrZero = quantity("force", positive=False)
TorqueOrZero = quantity("torque", positive=False)
Spacing = quantity("length", tolerance=False)

CRANK_ARRANGEMENTS = ("inline", "vee", "opposed")
"""Cylinder arrangements whose crank phasing vcheck can derive by default."""


class Crank(DesignModel):
    """The crank mechanism of an engine or reciprocating compressor."""

    arrangement: Literal[CRANK_ARRANGEMENTS] = Field(
        description="inline, vee (two banks at 'vee-angle') or opposed (banks at 180 degrees)")
    vee_angle: float | None = Field(None, description="angle between the banks of a vee "
                                    "[degrees], e.g. 90")
    stroke: Length = Field(description="piston stroke, twice the crank radius")
    connecting_rod: Length = Field(description="connecting rod length, centre to centre")
    reciprocating_mass: MassOrZero = Field(
        description="per cylinder: piston, rings, pin and the small-end share of the rod")
    rotating_mass: MassOrZero = Field(
        "0 kg", description="per cylinder, at crank radius and not balanced by "
        "counterweights: crankpin and the big-end share of the rod")
    cylinder_spacing: Spacing | None = Field(
        None, description="distance between neighbouring cylinder lines (or throws of a "
        "vee) along the shaft; needed for free moments with more than one throw")
    crank_angles: tuple[float, ...] | None = Field(
        None, description="crank angle of each cylinder's throw [degrees], cylinder 1 at 0; "
        "default by arrangement")
    centre: Point | None = Field(None, description="middle of the crankshaft between the "
                                 "outer throws; default the centre of gravity")

    @model_validator(mode="after")
    def _geometry(self) -> "Crank":
        wrong = []
        if self.arrangement == "vee":
            if self.vee_angle is None:
                wrong.append("a vee needs 'vee-angle' in degrees, e.g. 90")
            elif not 0 < self.vee_angle < 180:
                wrong.append(f"'vee-angle' must be between 0 and 180 degrees, got "
                             f"{self.vee_angle:g}")
        elif self.vee_angle is not None:
            wrong.append(f"'vee-angle' applies to a vee only, not to an {self.arrangement} "
                         "arrangement")
        if not self.connecting_rod.low > self.stroke.high / 2:
            wrong.append(f"the connecting rod '{self.connecting_rod.text}' must be longer than "
                         f"the crank radius, half the stroke '{self.stroke.text}'")
        if wrong:
            raise PydanticCustomError("crank", "; ".join(wrong))
        return self


class TorqueReaction(DesignModel):
    """The torque reaction on the machine frame: mean torque and its fluctuation."""

    fluctuation: float | None = Field(
        None, ge=0, le=20, description="amplitude of the torque at the major firing order "
        "over the mean torque; default by cylinder count (a screening value, from memory)")
    order: float | None = Field(None, gt=0, le=100, description="order of the fluctuation; "
                                "default the major firing order")
    mean_torque: TorqueOrZero | None = Field(
        None, description="mean torque, instead of machine.power")


class ForceVector(DesignModel):
    """Force amplitudes along the machine axes; missing components are zero."""

    x: ForceOrZero = Field("0 N", description="along the shaft")
    y: ForceOrZero = Field("0 N", description="across the shaft, horizontal")
    z: ForceOrZero = Field("0 N", description="vertical")

    def as_tuple(self) -> tuple[float, float, float]:
        return (self.x.high, self.y.high, self.z.high)


class MomentVector(DesignModel):
    """Moment amplitudes about the machine axes; missing components are zero."""

    x: TorqueOrZero = Field("0 N*m", description="about the shaft (roll)")
    y: TorqueOrZero = Field("0 N*m", description="about the horizontal cross axis (pitch)")
    z: TorqueOrZero = Field("0 N*m", description="about the vertical (yaw)")

    def as_tuple(self) -> tuple[float, float, float]:
        return (self.x.high, self.y.high, self.z.high)


class StatedLoad(DesignModel):
    """A force and moment the machine puts on its mounting, as a maker's data sheet gives."""

    name: str = Field(min_length=1, max_length=120, description="e.g. 'free primary moment, "
                      "maker's data'")
    order: float | None = Field(None, gt=0, le=200, description="multiple of running speed")
    frequency: Frequency | None = Field(None, description="a fixed frequency, e.g. \"100 Hz\"")
    force: ForceVector | None = Field(None, description="amplitude along x, y, z")
    moment: MomentVector | None = Field(None, description="amplitude about x, y, z")
    point: Point | None = Field(None, description="where the force acts; default the centre "
                                "of gravity")
    at_speed: SpeedValue | None = Field(
        None, description="the speed at which the amplitudes are stated; default the "
        "maximum speed")
    scaling: Literal["speed-squared", "constant"] | None = Field(
        None, description="how the amplitude follows the speed: speed-squared (inertia "
        "forces, the default for an order) or constant (the default for a frequency)")

    @model_validator(mode="after")
    def _complete(self) -> "StatedLoad":
        if (self.order is None) == (self.frequency is None):
            raise PydanticCustomError(
                "load", "give exactly one of 'order' (a multiple of running speed, e.g. 1) or "
                "'frequency' (e.g. \"100 Hz\")")
        if self.force is None and self.moment is None:
            raise PydanticCustomError(
                "load", "give 'force' (e.g. { y = \"12 kN\" }) or 'moment' (e.g. "
                "{ x = \"1.5 kN*m\" }), or both")
        if self.frequency is not None and self.scaling == "speed-squared":
            raise PydanticCustomError("load", "a load at a fixed frequency does not follow "
                                      "the speed: leave out 'scaling' or give \"constant\"")
        return self

    @property
    def follows_speed_squared(self) -> bool:
        return self.order is not None and self.scaling != "constant"

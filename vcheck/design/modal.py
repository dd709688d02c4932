"""Models of what gives natural frequencies: mounts, beams, lumped models, mode files.

These tables may appear in a design file and in a structure file:

- ``[[mounting.mount]]`` with ``[mounting] centre-of-gravity`` and ``inertia`` (or
  ``envelope``): a rigid machine on resilient mounts, six modes;
- ``[[beam]]``: an Euler-Bernoulli beam (a frame member, a pipe span, a floor beam);
- ``[[lumped-model]]``: masses and springs between numbered nodes (0 is the ground);
- ``[[mode-file]]``: a CSV of modes from an FE model or an impact test.
"""

from typing import Literal

from pydantic import Field, model_validator
from pydantic_core import PydanticCustomError

from .fields import (
    Area,
    Coordinate,
    Density,
    DesignModel,
    InertiaProduct,
    Length,
    LinearDensity,
    Mass,
    SecondMoment,
    Stiffness,
    Stress,
    quantity,
)

__all__ = ["Beam", "Direction", "Envelope", "InertiaTensor", "LumpedModel", "ModeFile", "Mount",
           "Point", "Spring"]

Inertia = quantity("inertia")

EndCondition = Literal[
    "cantilever", "simply-supported", "fixed-fixed", "fixed-pinned", "free-free"
]


class Point(DesignModel):
    """A position in machine axes from a reference point: x along the shaft, y across
    it, z up. Missing coordinates are zero."""

    x: Coordinate = Field("0 m", description="along the shaft")
    y: Coordinate = Field("0 m", description="across the shaft, horizontal")
    z: Coordinate = Field("0 m", description="vertical, up")

    def as_tuple(self) -> tuple[float, float, float]:
        return (self.x.value, self.y.value, self.z.value)


class InertiaTensor(DesignModel):
    """Mass moments of inertia about the centre of gravity, machine axes.

    The products of inertia are signed, ``xy`` = integral of x y dm (the tensor holds
    -xy off the diagonal). A real body's tensor is positive definite and its principal
    moments obey the triangle inequality (each at most the sum of the other two); both
    are checked, so that a sign slip cannot give a body that cannot exist.
    """

    xx: Inertia
    yy: Inertia
    zz: Inertia
    xy: InertiaProduct | None = Field(None, description="product of inertia (signed), default 0")
    xz: InertiaProduct | None = Field(None, description="product of inertia (signed), default 0")
    yz: InertiaProduct | None = Field(None, description="product of inertia (signed), default 0")

    @model_validator(mode="after")
    def _physical(self) -> "InertiaTensor":
        import numpy as np

        matrix = np.array(self.as_matrix(), dtype=float)
        scale = float(np.max(np.abs(matrix)))
        if not np.all(np.isfinite(matrix)) or scale == 0.0:
            raise PydanticCustomError("inertia", "the inertia tensor must hold finite, "
                                      "non-zero moments")
        principal = np.linalg.eigvalsh(matrix / scale) * scale
        if principal[0] <= 1e-12 * scale:
            raise PydanticCustomError(
                "inertia", "the inertia tensor is not positive definite: its principal "
                "moments are {moments} kg*m^2; a product of inertia is too large for the "
                "moments, or has the wrong sign",
                {"moments": ", ".join(f"{m:.4g}" for m in principal)})
        low, mid, high = principal
        if high > (low + mid) * (1 + 1e-9):
            raise PydanticCustomError(
                "inertia", "the principal moments {moments} kg*m^2 break the triangle "
                "inequality (the largest, {high}, exceeds the sum of the other two): no "
                "rigid body has them",
                {"moments": ", ".join(f"{m:.4g}" for m in principal), "high": f"{high:.4g}"})
        return self

    def as_matrix(self) -> list[list[float]]:
        def v(a):
            return 0.0 if a is None else a.value

        return [[self.xx.value, -v(self.xy), -v(self.xz)],
                [-v(self.xy), self.yy.value, -v(self.yz)],
                [-v(self.xz), -v(self.yz), self.zz.value]]


class Envelope(DesignModel):
    """Overall size of the machine, to estimate its inertia as a uniform box."""

    x: Length = Field(description="length along the shaft")
    y: Length = Field(description="width across the shaft")
    z: Length = Field(description="height")


class Direction(DesignModel):
    """A direction in machine axes, as three numbers (their scale does not matter)."""

    x: float = 0.0
    y: float = 0.0
    z: float = 0.0

    @model_validator(mode="after")
    def _not_zero(self) -> "Direction":
        if self.x == 0 and self.y == 0 and self.z == 0:
            raise PydanticCustomError("direction", "a direction needs at least one non-zero "
                                      "component, e.g. { y = 0.5, z = 0.866 }")
        # only the direction matters: scale the largest component to 1, so that neither
        # 5e-324 nor 1e308 under- or overflows when the vector is normalised
        largest = max(abs(self.x), abs(self.y), abs(self.z))
        if largest != 1.0:
            for name in ("x", "y", "z"):
                object.__setattr__(self, name, getattr(self, name) / largest)
        return self

    def as_tuple(self) -> tuple[float, float, float]:
        return (self.x, self.y, self.z)


class Mount(DesignModel):
    """One resilient mount under a rigid machine: where it is, how stiff it is."""

    position: Point = Field(description="elastic centre of the mount")
    axis: Direction | None = Field(None, description="direction of the mount's axis "
                                   "(its axial stiffness) when it is inclined; default "
                                   "vertical, { z = 1 }")
    axial_stiffness: Stiffness = Field(description="stiffness along the mount's axis (vertical)")
    shear_stiffness: Stiffness = Field(description="stiffness across it (both horizontal "
                                       "directions)")
    support_stiffness: Stiffness | None = Field(
        None, description="vertical stiffness of the structure under the mount, in series")


MAX_POINT_MASS_RATIO = 1e6
"""Largest tip or central mass of a beam, as a multiple of the beam's own mass: beyond
it the beam is a spring under a rigid mass, and the frequency equation's roots come
closer to their bounds than floating point resolves."""


class Beam(DesignModel):
    """An Euler-Bernoulli beam with its section and end conditions."""

    name: str = Field(min_length=1, description="e.g. 'roof frame beam B4'")
    end_condition: EndCondition
    length: Length
    youngs_modulus: Stress = Field(description="e.g. \"210 GPa\" for steel")
    second_moment: SecondMoment = Field(description="second moment of area for the bending "
                                        "plane, e.g. \"1943 cm^4\"")
    mass_per_length: LinearDensity | None = Field(None, description="e.g. \"22.4 kg/m\"")
    density: Density | None = Field(None, description="with 'area', instead of mass-per-length")
    area: Area | None = Field(None, description="section area, with 'density'")
    tip_mass: Mass | None = Field(None, description="a mass at the free end of a cantilever")
    central_mass: Mass | None = Field(None, description="a mass at midspan of a simply "
                                      "supported beam")
    modes: int = Field(3, ge=1, le=10, description="how many modes to compute")
    source: str = ""

    @model_validator(mode="after")
    def _mass_given_once(self) -> "Beam":
        if (self.mass_per_length is None) == (self.density is None or self.area is None):
            raise PydanticCustomError(
                "beam", "give 'mass-per-length' (e.g. \"22.4 kg/m\"), or 'density' and "
                "'area' (e.g. \"7850 kg/m^3\" and \"28.5 cm^2\"), not both")
        if self.tip_mass is not None and self.end_condition != "cantilever":
            raise PydanticCustomError("beam", "'tip-mass' applies to a cantilever only")
        if self.central_mass is not None and self.end_condition != "simply-supported":
            raise PydanticCustomError("beam", "'central-mass' applies to a simply supported "
                                      "beam only")
        if self.tip_mass is not None and self.central_mass is not None:
            raise PydanticCustomError("beam", "give at most one of 'tip-mass' and "
                                      "'central-mass'")
        point = self.tip_mass or self.central_mass
        if point is not None:
            ratio = point.high / (self.mass_per_metre * self.length.value)
            if ratio > MAX_POINT_MASS_RATIO:
                which = "tip" if self.tip_mass is not None else "central"
                raise PydanticCustomError(
                    "beam", f"the {which} mass is {ratio:.3g} times the beam's own mass; a "
                    f"point mass is read up to {MAX_POINT_MASS_RATIO:g} times it (model a "
                    "heavier mass on the beam's stiffness as a lumped model)")
        return self

    @property
    def mass_per_metre(self) -> float:
        if self.mass_per_length is not None:
            return self.mass_per_length.value
        return self.density.value * self.area.value


class Spring(DesignModel):
    """A spring between two nodes of a lumped model; node 0 is the ground."""

    between: tuple[int, int] = Field(description="two node numbers, e.g. [0, 1]")
    stiffness: Stiffness


class LumpedModel(DesignModel):
    """Masses on numbered nodes (1, 2, ...) joined by springs; node 0 is the ground."""

    name: str = Field(min_length=1)
    masses: tuple[Mass, ...] = Field(min_length=1, max_length=300_000,
                                     description="mass of node 1, 2, ...")
    springs: tuple[Spring, ...] = Field(min_length=1)
    source: str = ""

    @model_validator(mode="after")
    def _nodes_exist(self) -> "LumpedModel":
        count = len(self.masses)
        for index, spring in enumerate(self.springs):
            a, b = spring.between
            for node in (a, b):
                if not 0 <= node <= count:
                    raise PydanticCustomError(
                        "lumped", f"spring {index + 1} joins node {node}, but the model has "
                        f"nodes 0 (ground) to {count}")
            if a == b:
                raise PydanticCustomError("lumped", f"spring {index + 1} joins node {a} "
                                          "to itself")
        return self


class ModeFile(DesignModel):
    """A CSV file of natural frequencies (header row: frequency, then optionally
    damping-ratio and description), relative to the project root."""

    path: str = Field(min_length=1, description="e.g. \"fe/deck-modes.csv\"")
    source: str = Field("", description="what produced it, e.g. 'FE model rev C'")
    frequency_unit: Literal["Hz", "rpm", "cpm", "rad/s"] = Field(
        "Hz", description="unit of the frequency column")

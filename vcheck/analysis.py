"""The computed dynamics of a design: its natural frequencies and excitation bands.

This is what vcheck believes about a design before any rule judges it. Rules (built-in
and plugins) read it through :func:`natural_frequencies` and :func:`excitation_bands`;
the physics itself lives in :mod:`vcheck.dynamics`.
"""

from __future__ import annotations

from dataclasses import dataclass

from .dynamics.excitations import order_band
from .dynamics.sdof import natural_frequency_spring_mass, natural_frequency_static_deflection

__all__ = ["ExcitationBand", "ModeBand", "excitation_bands", "natural_frequencies"]


@dataclass(frozen=True)
class ModeBand:
    """A natural frequency with the band its input tolerances allow [Hz]."""

    name: str
    nominal: float
    low: float
    high: float
    key_path: tuple
    origin: str
    assumptions: tuple[str, ...] = ()


@dataclass(frozen=True)
class ExcitationBand:
    """A forcing frequency band over the machine's speed range [Hz]."""

    name: str
    low: float
    high: float
    key_path: tuple


def natural_frequencies(design) -> list[ModeBand]:
    """Every natural frequency the design gives or implies, lowest first."""
    modes: list[ModeBand] = []
    mounting = design.mounting
    if mounting is not None and mounting.kind != "rigid":
        modes.append(_isolation_mode(design))
    for index, listed in enumerate(design.natural_frequency):
        frequency = listed.frequency
        origin = f"listed ({listed.source})" if listed.source else "listed"
        modes.append(ModeBand(
            name=listed.name,
            nominal=frequency.value,
            low=frequency.low,
            high=frequency.high,
            key_path=("natural-frequency", index, "frequency"),
            origin=origin,
        ))
    modes.sort(key=lambda mode: (mode.nominal, mode.name))
    return modes


def _isolation_mode(design) -> ModeBand:
    mounting = design.mounting
    machine = design.machine
    mass = machine.mass
    base = mounting.base_mass
    mass_low = mass.low + (base.low if base else 0.0)
    mass_nominal = mass.value + (base.value if base else 0.0)
    mass_high = mass.high + (base.high if base else 0.0)
    assumptions = [
        "the machine moves as a rigid body in vertical bounce on its isolators "
        "(one degree of freedom; rocking modes are not computed)",
    ]
    if mounting.stiffness is not None:
        count = mounting.isolators
        stiffness = mounting.stiffness
        nominal = float(natural_frequency_spring_mass(count * stiffness.value, mass_nominal))
        low = float(natural_frequency_spring_mass(count * stiffness.low, mass_high))
        high = float(natural_frequency_spring_mass(count * stiffness.high, mass_low))
        origin = f"{count} isolators of {stiffness.text} each carrying {mass_nominal:g} kg"
        path = ("mounting", "stiffness")
        if mounting.static_deflection is not None:
            assumptions.append("both stiffness and static deflection are given; "
                               "the stiffness is used")
        if mounting.kind == "rubber" or mounting.kind == "pad":
            assumptions.append("the stated stiffness is taken as the dynamic stiffness")
    else:
        deflection = mounting.static_deflection
        nominal = float(natural_frequency_static_deflection(deflection.value))
        low = float(natural_frequency_static_deflection(deflection.high))
        high = float(natural_frequency_static_deflection(deflection.low))
        origin = f"static deflection {deflection.text} (f = 15.76 / sqrt(deflection in mm))"
        path = ("mounting", "static-deflection")
        assumptions.append("linear isolators: natural frequency from the static deflection")
    if base is not None:
        assumptions.append(f"the base mass {base.text} moves with the machine")
    return ModeBand(
        name=f"isolation, vertical bounce ({mounting.kind})",
        nominal=nominal, low=low, high=high, key_path=path, origin=origin,
        assumptions=tuple(assumptions),
    )


def excitation_bands(design, orders: tuple[float, ...] = (1.0, 2.0)) -> list[ExcitationBand]:
    """Forcing bands from running-speed orders, vane and blade pass, and listed sources."""
    machine = design.machine
    speed = machine.speed
    bands: list[ExcitationBand] = []

    def add(name: str, order: float, path: tuple) -> None:
        low, high = order_band(order, speed.min.value, speed.max.value)
        bands.append(ExcitationBand(name, float(low), float(high), path))

    for order in orders:
        add(f"{order:g}x running speed", order, ("machine", "speed"))
    if machine.vanes:
        add(f"vane pass ({machine.vanes} vanes)", machine.vanes, ("machine", "vanes"))
    if machine.blades:
        add(f"blade pass ({machine.blades} blades)", machine.blades, ("machine", "blades"))
    for index, source in enumerate(machine.excitation):
        path = ("machine", "excitation", index)
        if source.order is not None:
            add(f"{source.name} ({source.order:g}x)", source.order, path)
        else:
            frequency = source.frequency
            bands.append(ExcitationBand(source.name, frequency.low, frequency.high, path))
    bands.sort(key=lambda band: (band.low, band.name))
    return bands

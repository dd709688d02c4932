"""The torsional dynamics of a design's shaft trains: modes and excitation bands.

What vcheck computes for each ``[[shaft-train]]``, once, for the rule
``torsional-separation`` and for ``vcheck dynamics``: the train referred to its
reference shaft (:func:`vcheck.design.shaft_trains.refer_train`), its elastic torsional
modes with the band the stiffness tolerances allow and the link that twists most in
each, and the excitation bands of every shaft over the machine's speed range. The
physics is in :mod:`vcheck.dynamics.torsion`.
"""

from __future__ import annotations

import numpy as np

from .design.problems import InputProblem, format_key_path
from .records import Record

__all__ = ["DEFAULT_MAX_ORDER", "TORSION_MACHINE_KINDS", "TorsionalBand", "TorsionalMode",
           "TrainAnalysis", "analyse_train", "torsion_problems", "torsionally_critical"]

DEFAULT_MAX_ORDER = 12.0
"""Highest order of shaft speed listed for engine and compressor torque [unitless]:
higher orders carry little torque (common practice)."""

TORSION_MACHINE_KINDS = ("engine", "generator-set", "reciprocating-compressor")
"""Machine kinds whose shaft train is torsionally critical (common practice)."""


class TorsionalMode(Record):
    """An elastic torsional mode of a train [Hz]."""

    train: str
    number: int
    nominal: float
    low: float
    high: float
    twist: str
    """The link with the largest share of the mode's strain energy."""
    twist_share: float
    key_path: tuple

    @property
    def name(self) -> str:
        return f"{self.train}, torsional mode {self.number}"


class TorsionalBand(Record):
    """A torsional excitation band over the speed range [Hz]."""

    name: str
    low: float
    high: float
    key_path: tuple
    kind: str
    major: bool = True
    """False for minor engine or compressor orders."""
    order: float | None = None
    """Order of the reference shaft's speed, or None for a fixed frequency [unitless]."""


class TrainAnalysis(Record):
    """One train's referred model, modes, excitations and missing inputs."""

    train: object
    index: int
    referred: object
    modes: tuple[TorsionalMode, ...]
    bands: tuple[TorsionalBand, ...]
    gaps: tuple[tuple[tuple, str, str], ...]
    """(key path, what is not considered, what to give)."""
    assumptions: tuple[str, ...]


def torsionally_critical(design) -> str:
    """Why the design's machine has a torsionally critical train, in words, or ""."""
    machine = design.machine
    driver = machine.driver
    if machine.kind in TORSION_MACHINE_KINDS:
        article = "an" if machine.kind[0] in "aeiou" else "a"
        return f"the machine is {article} {machine.kind}"
    if driver is not None and driver.kind == "engine":
        return "the machine is driven by an engine"
    if machine.cylinders:
        return f"the machine has {machine.cylinders} cylinders"
    if machine.gear:
        return "the machine has gears"
    if driver is not None and driver.speed_ratio is not None and driver.speed_ratio != 1 \
            and machine.belt is None:
        return "a gear sits between motor and machine (driver.speed-ratio)"
    if driver is not None and driver.supply == "drive":
        return "the motor is fed by a variable-frequency drive"
    return ""


def torsion_problems(design) -> list[InputProblem]:
    """Located problems of the design's shaft trains (empty when every train is sound)."""
    from .design.shaft_trains import train_problems

    problems = []
    for index, train in enumerate(design.shaft_train):
        for path, message in train_problems(train, ("shaft-train", index), design.machine):
            file, line, column = design.locate(path)
            problems.append(InputProblem(file, line, column, format_key_path(path), message))
    return problems


def _stiffness_set(referred, pick: int):
    return [(a, b, row[pick]) for a, b, *row in referred.links]


def train_modes(referred, pick: int = 1):
    """Torsional modes of a referred train with its low (0), nominal (1) or high (2)
    stiffnesses."""
    from .dynamics.torsion.modes import torsional_modes

    return torsional_modes(referred.inertias, _stiffness_set(referred, pick))


def _link_name(train, index: int) -> str:
    link = train.link[index]
    return link.name or f"{link.kind} {link.between[0]} - {link.between[1]}"


def analyse_train(design, index: int) -> TrainAnalysis:
    """Modes, excitation bands and missing inputs of one shaft train (sound input)."""
    from .design.shaft_trains import refer_train

    train = design.shaft_train[index]
    here = ("shaft-train", index)
    referred = refer_train(train)
    nominal, low, high = (train_modes(referred, pick) for pick in (1, 0, 2))
    modes = []
    for m, f in enumerate(nominal.frequencies):
        shares = nominal.energy_shares[:, m]
        top = int(np.argmax(shares)) if shares.size else 0
        modes.append(TorsionalMode(
            train.name, m + 1, float(f), float(low.frequencies[m]), float(high.frequencies[m]),
            _link_name(train, top) if train.link else "-",
            float(shares[top]) if shares.size else 0.0, here))
    bands, gaps, assumptions = _excitations(design, train, here, referred.ratios)
    if nominal.rigid_body_modes:
        assumptions.append(f"{train.name}: the train turns freely; its rigid-body mode "
                           "(0 Hz) is left out")
    if train.gear:
        assumptions.append(f"{train.name}: gear meshes taken as rigid; inertias and "
                           f"stiffnesses referred to shaft '{referred.reference}' by the "
                           "square of the speed ratio")
    for i, link in enumerate(train.link):
        path = here + ("link", i)
        if link.elastomeric and link.dynamic_ratio is None:
            gaps.append((path, f"the dynamic stiffness of elastomeric coupling "
                         f"'{_link_name(train, i)}' (no dynamic-ratio: its static stiffness "
                         "is used)", f"give dynamic-ratio for '{_link_name(train, i)}' from "
                         "the coupling maker (dynamic over static torsional stiffness)"))
        if link.elastomeric and link.dynamic_ratio is not None:
            assumptions.append(f"'{_link_name(train, i)}': dynamic stiffness "
                               f"{link.dynamic_ratio:g} x the stated static stiffness")
        if link.temperature:
            assumptions.append(f"'{_link_name(train, i)}': {link.temperature}")
    return TrainAnalysis(train, index, referred, tuple(modes), tuple(bands), tuple(gaps),
                         tuple(assumptions))


def _excitations(design, train, here, ratios):
    from .design.models import AC_MOTOR_KINDS
    from .design.shaft_trains import _disc_shafts
    from .dynamics.forcing.excitations import INVERTER_TORQUE_HARMONICS, twice_line_frequency
    from .dynamics.torsion.orders import (
        compressor_torque_orders,
        drive_torque_pulsations,
        engine_torque_orders,
    )

    machine = design.machine
    low_speed, high_speed = machine.speed.min.value, machine.speed.max.value
    bands: list[TorsionalBand] = []
    gaps: list[tuple] = []
    assumptions: list[str] = []

    def order(name, value, ratio, path, kind, major=True):
        bands.append(TorsionalBand(name, value * ratio * low_speed, value * ratio * high_speed,
                                   path, kind, major, value * ratio))

    kinds = {shaft.kind for shaft in train.shafts}
    for s, shaft in enumerate(train.shafts):
        path = here + ("shaft", s) if train.shaft else here
        r = ratios[shaft.name]
        for k in (1.0, 2.0):
            order(f"{k:g}x {shaft.name} speed", k, r, path, "running-speed")
        if shaft.kind == "engine":
            cylinders = shaft.cylinders or machine.cylinders
            strokes = shaft.strokes or machine.strokes
            found = engine_torque_orders(cylinders, strokes, DEFAULT_MAX_ORDER)
            for value in found.major:
                order(f"{shaft.name} firing order {value:g} (major, {cylinders} cylinders "
                      f"{strokes}-stroke)", value, r, path, "firing")
            for value in found.minor:
                if value not in (1.0, 2.0):  # 1x and 2x are judged as running speed
                    order(f"{shaft.name} order {value:g} (minor)", value, r, path, "firing",
                          False)
            assumptions.append(f"engine orders on '{shaft.name}' up to {DEFAULT_MAX_ORDER:g}; "
                               "major orders judged by the margins, minor orders by minor-margin")
        elif shaft.kind == "reciprocating-compressor":
            cylinders = shaft.cylinders or machine.cylinders
            found = compressor_torque_orders(cylinders, shaft.double_acting, DEFAULT_MAX_ORDER)
            for value in found.major:
                order(f"{shaft.name} compression order {value:g} (major)", value, r, path,
                      "compression")
            for value in found.minor:
                if value not in (1.0, 2.0):
                    order(f"{shaft.name} order {value:g} (minor)", value, r, path,
                          "compression", False)
        elif shaft.kind == "motor":
            driver = machine.driver
            if driver is None or driver.kind not in AC_MOTOR_KINDS:
                gaps.append((path, f"the electrical torque pulsations of motor shaft "
                             f"'{shaft.name}' (no AC motor in machine.driver)",
                             "give machine.driver with kind = \"induction-motor\" or "
                             "\"synchronous-motor\" and its supply"))
                continue
            drive = driver.supply == "drive" or (driver.supply is None
                                                 and machine.speed.is_range)
            line = driver.supply == "line" or not drive or (driver.supply is None)
            if drive and driver.poles is not None:
                pulsations = drive_torque_pulsations(driver.poles, (r * low_speed,
                                                                    r * high_speed))
                for harmonic, (lo, hi) in zip(INVERTER_TORQUE_HARMONICS, pulsations):
                    bands.append(TorsionalBand(
                        f"drive torque pulsation {harmonic}x output frequency "
                        f"({driver.poles} poles)", float(lo), float(hi),
                        ("machine", "driver"), "electrical", True,
                        harmonic * driver.poles / 2 * r))
                assumptions.append("drive torque pulsations at 6 and 12 times the output "
                                   "frequency (six-pulse inverter harmonics, from memory); "
                                   "the drive maker's data govern")
            elif drive:
                gaps.append((("machine", "driver"), "the drive's torque pulsations (no "
                             "driver.poles)", "give driver.poles, or driver.supply = \"line\""))
            frequency = shaft.line_frequency or driver.line_frequency
            if line and frequency is not None:
                bands.append(TorsionalBand(
                    f"twice line frequency ({frequency.text} supply)",
                    float(twice_line_frequency(frequency.low)),
                    float(twice_line_frequency(frequency.high)),
                    ("machine", "driver", "line-frequency"), "electrical"))
        elif shaft.kind == "generator":
            driver = machine.driver
            frequency = shaft.line_frequency or (driver.line_frequency if driver else None)
            if frequency is None:
                gaps.append((path, f"twice line frequency of generator shaft '{shaft.name}' "
                             "(its line frequency is not given)",
                             f"give line-frequency on shaft '{shaft.name}' (e.g. \"50 Hz\")"))
            else:
                bands.append(TorsionalBand(
                    f"twice line frequency ({frequency.text}, generator)",
                    float(twice_line_frequency(frequency.low)),
                    float(twice_line_frequency(frequency.high)), path, "electrical"))
    where = _disc_shafts(train)
    for g, gear in enumerate(train.gear):
        path = here + ("gear", g)
        label = gear.name or f"{gear.between[0]} / {gear.between[1]}"
        if gear.teeth is None:
            gaps.append((path, f"the mesh frequency of gear '{label}' (ratio given, no "
                         "teeth)", f"give teeth for gear '{label}'"))
            continue
        r = ratios[where[gear.between[0]]]
        order(f"gear mesh {label} ({gear.teeth[0]} teeth)", gear.teeth[0], r, path,
              "gear-mesh")
    if machine.kind in ("engine", "generator-set") and "engine" not in kinds:
        gaps.append((here, "the engine's firing orders (no shaft of kind = \"engine\")",
                     "mark the engine's shaft kind = \"engine\""))
    if machine.kind == "reciprocating-compressor" and "reciprocating-compressor" not in kinds:
        gaps.append((here, "the compressor's torque orders (no shaft of kind = "
                     "\"reciprocating-compressor\")",
                     "mark the compressor's shaft kind = \"reciprocating-compressor\""))
    driver = machine.driver
    if driver is not None and driver.supply == "drive" and "motor" not in kinds:
        gaps.append((here, "the drive's torque pulsations (no shaft of kind = \"motor\")",
                     "mark the motor's shaft kind = \"motor\""))
    bands.sort(key=lambda b: (b.low, b.name))
    return bands, gaps, assumptions

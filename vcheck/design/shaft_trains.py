"""The ``[[shaft-train]]`` tables of a design: inertias, shafts, couplings and gears.

A shaft train is the rotating chain of a machine for its torsional modes: discs
(lumped inertias) on shafts that turn at their own speeds, joined along a shaft by
links (shaft sections, from diameter, length and shear modulus or stated, and couplings
with their stiffness and its tolerance), and from one shaft to another by gear meshes
(taken as rigid). ``machine.speed`` is the speed of the reference shaft (``reference``,
by default the first shaft); every other shaft's speed follows from the gear ratios,
and every inertia and stiffness is referred to the reference shaft by the square of the
speed ratio (:func:`refer_train`).

Cross-references (a disc on a shaft that is not listed, a link to a missing disc, a
train that falls apart, shaft speeds that disagree with the gears) are checked by
:func:`train_problems`, each located at its own key.
"""


import math
import re
from typing import Annotated, Literal

from pydantic import Field, model_validator
from pydantic_core import PydanticCustomError

from ..records import Record
from .fields import DesignModel, Frequency, Inertia, Length, SpeedValue, Stress, read_by
from .units import Amount, UnitError, parse_amount

__all__ = ["GROUND_NAME", "Disc", "GearMesh", "Link", "ReferredTrain", "ShaftTrain",
           "TrainShaft", "TorsionalStiffness", "refer_train", "train_problems"]

GROUND_NAME = "ground"
"""The name a link uses for a fixed end (a brake, a locked rotor)."""

SPEED_AGREEMENT = 0.01
"""A shaft's stated speed may differ from the speed the gear ratios give by this
fraction (1%, the rounding of a nameplate speed) [unitless]."""

MAX_DISCS = 100
"""Most discs in one train: a lumped train, not a finite-element mesh."""

INERTIA_RANGE = (1e-9, 1e7)
"""Plausible disc inertias [kg m^2]: from a small coupling hub's thousandth to beyond the
largest turbine-generator rotor; outside, the unit is likely wrong (and the eigenproblem
loses its digits)."""

STIFFNESS_RANGE = (1e-3, 1e13)
"""Plausible torsional stiffnesses [N m/rad], for the same reasons."""

_PER_ANGLE = re.compile(r"/\s*(rad|radian|deg|degree)\b")
_STIFFNESS_EXAMPLES = ("2.4 MN*m/rad", "180 kN*m/rad +-15%", "1.5e6 lbf*in/rad")


def _torsional_stiffness(raw: object) -> Amount:
    example = f'"{_STIFFNESS_EXAMPLES[0]}" or "{_STIFFNESS_EXAMPLES[2]}"'
    if isinstance(raw, Amount):
        return raw
    if not isinstance(raw, str) or isinstance(raw, bool):
        raise PydanticCustomError(
            "unit", f"expected a torsional stiffness such as {example}, as a string with "
            "its unit")
    angles = set(_PER_ANGLE.findall(raw))
    if not angles:
        raise PydanticCustomError(
            "unit", f"'{raw.strip()}' is not a torsional stiffness: give a torque per angle, "
            f"such as {example}")
    if len(angles) > 1 or len(_PER_ANGLE.findall(raw)) > 2:
        raise PydanticCustomError("unit", f"cannot read '{raw.strip()}' as a torsional "
                                  f"stiffness such as {example}")
    per_radian = 180.0 / math.pi if next(iter(angles)) in ("deg", "degree") else 1.0
    try:
        torque = parse_amount(_PER_ANGLE.sub("", raw), "torque")
    except UnitError as exc:
        raise PydanticCustomError(
            "unit", f"cannot read '{raw.strip()}' as a torsional stiffness such as "
            f"{example}: {exc}") from None
    amount = Amount(torque.value * per_radian, torque.low * per_radian,
                    torque.high * per_radian, raw.strip())
    if not amount.low > 0:
        raise PydanticCustomError(
            "positive", f"a torsional stiffness must be greater than zero, got '{amount.text}'")
    return amount


TorsionalStiffness = Annotated[
    Amount, read_by(_torsional_stiffness,
                    {"type": "string", "description": "a torsional stiffness (torque per "
                     "radian or degree) with its unit, optionally with a tolerance (+-15%)",
                     "examples": list(_STIFFNESS_EXAMPLES), "pattern": r"^\s*[+-]?[0-9.]"}),
    Field(examples=[_STIFFNESS_EXAMPLES[0]])]
"""A torque per angle, read into N m/rad: "2.4 MN*m/rad", "18 kN*m/deg", "+-15%"."""

ShaftKind = Literal["engine", "reciprocating-compressor", "motor", "generator", "driven"]


class TrainShaft(DesignModel):
    """A shaft of the train: everything on it turns at one speed; shafts joined by a
    coupling turn at the same speed, shafts joined by a gear at the gear ratio."""

    name: str = Field(min_length=1, max_length=80, description="e.g. 'crankshaft'")
    kind: ShaftKind = Field(
        "driven", description="what turns it, for its torque excitation: engine (firing "
        "orders), reciprocating-compressor (compression orders), motor (electrical "
        "pulsations from machine.driver), generator (twice line frequency), driven "
        "(1x and 2x only)")
    speed: SpeedValue | None = Field(
        None, description="its speed at the machine's maximum speed, as a check of the "
        "gear ratios; default from the gears")
    cylinders: int | None = Field(None, ge=1, le=24, description="an engine's or "
                                  "compressor's cylinders; default machine.cylinders")
    strokes: Literal[2, 4] | None = Field(None, description="an engine's cycle; default "
                                          "machine.strokes")
    double_acting: bool = Field(False, description="compressor cylinders acting on both "
                                "sides of the piston")
    line_frequency: Frequency | None = Field(
        None, description="the supply frequency of a generator or motor, e.g. \"50 Hz\"; "
        "default machine.driver.line-frequency")


class Disc(DesignModel):
    """A lumped inertia: a rotor, a flywheel, a coupling hub, a gear, an impeller."""

    name: str = Field(min_length=1, max_length=80, description="e.g. 'flywheel'")
    shaft: str | None = Field(None, min_length=1, description="the shaft it sits on; "
                              "default the only shaft")
    inertia: Inertia = Field(description="polar mass moment of inertia, e.g. \"12.5 kg*m^2\"")


class Link(DesignModel):
    """A shaft section or a coupling between two discs on one shaft (or a disc and the
    ground)."""

    name: str = Field("", max_length=80, description="e.g. 'flexible coupling'")
    between: tuple[str, str] = Field(description="the two discs it joins, e.g. "
                                     "[\"flywheel\", \"alternator rotor\"]; \"ground\" for "
                                     "a fixed end")
    kind: Literal["shaft", "coupling"] = Field("shaft", description="a shaft section or a "
                                               "coupling")
    stiffness: TorsionalStiffness | None = Field(
        None, description="stated torsional stiffness, e.g. \"180 kN*m/rad +-15%\"; for "
        "an elastomeric coupling the maker's static (catalogue) value")
    diameter: Length | None = Field(None, description="outside diameter of a shaft section")
    bore: Length | None = Field(None, description="inside diameter of a hollow section")
    length: Length | None = Field(None, description="length of the section")
    shear_modulus: Stress | None = Field(None, description="e.g. \"80 GPa\" for steel")
    elastomeric: bool = Field(False, description="a rubber or elastomer coupling, whose "
                              "dynamic stiffness differs from its static one")
    dynamic_ratio: float | None = Field(
        None, gt=0, le=10, description="dynamic over static torsional stiffness of an "
        "elastomeric coupling (from the maker, e.g. 1.3 for natural rubber)")
    temperature: str = Field("", max_length=120, description="the temperature at which the "
                             "stiffness holds, a note, e.g. 'maker's data at 60 C'")

    @model_validator(mode="after")
    def _one_stiffness(self) -> "Link":
        geometry = (self.diameter, self.length, self.shear_modulus)
        if self.stiffness is not None and any(v is not None for v in geometry + (self.bore,)):
            raise PydanticCustomError(
                "link", "give 'stiffness' or the section's 'diameter', 'length' and "
                "'shear-modulus', not both")
        if self.stiffness is None and any(v is None for v in geometry):
            raise PydanticCustomError(
                "link", "give 'stiffness' (e.g. \"180 kN*m/rad\"), or 'diameter', 'length' "
                "and 'shear-modulus' (e.g. \"90 mm\", \"400 mm\", \"80 GPa\") of a shaft "
                "section")
        if self.bore is not None and not self.bore.high < self.diameter.low:
            raise PydanticCustomError(
                "link", f"the bore '{self.bore.text}' must be smaller than the diameter "
                f"'{self.diameter.text}'")
        if self.between[0] == self.between[1]:
            raise PydanticCustomError("link", f"a link joins '{self.between[0]}' to itself")
        if (self.elastomeric or self.dynamic_ratio is not None) and self.kind != "coupling":
            raise PydanticCustomError(
                "link", "'elastomeric' and 'dynamic-ratio' apply to kind = \"coupling\"")
        if self.dynamic_ratio is not None and not self.elastomeric:
            raise PydanticCustomError(
                "link", "'dynamic-ratio' applies to an elastomeric coupling: add "
                "elastomeric = true")
        return self

    def stiffness_band(self) -> tuple[float, float, float]:
        """(low, nominal, high) torsional stiffness in service [N m/rad]: the stated band
        (times the dynamic ratio of an elastomeric coupling), or G J_p / L."""
        if self.stiffness is not None:
            ratio = self.dynamic_ratio or 1.0
            s = self.stiffness
            return s.low * ratio, s.value * ratio, s.high * ratio
        from ..dynamics.torsion.stiffness import shaft_torsional_stiffness

        bore = self.bore.value if self.bore is not None else 0.0
        k = float(shaft_torsional_stiffness(self.diameter.value, self.length.value,
                                            self.shear_modulus.value, bore))
        low = float(shaft_torsional_stiffness(
            self.diameter.low, self.length.high, self.shear_modulus.low,
            self.bore.high if self.bore is not None else 0.0))
        high = float(shaft_torsional_stiffness(
            self.diameter.high, self.length.low, self.shear_modulus.high,
            self.bore.low if self.bore is not None else 0.0))
        return low, k, high


class GearMesh(DesignModel):
    """A gear pair joining a disc on one shaft to a disc on another (a rigid mesh)."""

    name: str = Field("", max_length=80, description="e.g. 'gearbox first stage'")
    between: tuple[str, str] = Field(description="the two gear discs, e.g. [\"pinion\", "
                                     "\"wheel\"]")
    teeth: tuple[int, int] | None = Field(None, description="teeth of the two gears, in the "
                                          "order of 'between', e.g. [23, 71]")
    ratio: float | None = Field(None, gt=0, le=1000, description="speed of the first gear "
                                "over speed of the second, instead of 'teeth'")

    @model_validator(mode="after")
    def _ratio(self) -> "GearMesh":
        if (self.teeth is None) == (self.ratio is None):
            raise PydanticCustomError(
                "gear", "give 'teeth' (e.g. [23, 71]) or 'ratio' (speed of the first gear "
                "over the second, e.g. 3.087), one of them")
        if self.teeth is not None and not all(5 <= z <= 1000 for z in self.teeth):
            raise PydanticCustomError("gear", f"gear teeth must be from 5 to 1000, got "
                                      f"{list(self.teeth)}")
        if self.between[0] == self.between[1]:
            raise PydanticCustomError("gear", f"a gear mesh joins '{self.between[0]}' to "
                                      "itself")
        return self

    @property
    def speed_ratio(self) -> float:
        """Speed of the first gear's shaft over the second's [unitless]."""
        if self.ratio is not None:
            return self.ratio
        return self.teeth[1] / self.teeth[0]


class ShaftTrain(DesignModel):
    """A train of discs, shafts, couplings and gears, for its torsional modes."""

    name: str = Field(min_length=1, max_length=80, description="e.g. 'engine to alternator'")
    reference: str | None = Field(None, min_length=1, description="the shaft that turns at "
                                  "machine.speed, to which everything is referred; default "
                                  "the first shaft")
    shaft: tuple[TrainShaft, ...] = Field((), max_length=MAX_DISCS,
                                          description="the shafts; one by default")
    disc: tuple[Disc, ...] = Field((), max_length=MAX_DISCS, description="the inertias")
    link: tuple[Link, ...] = Field((), max_length=4 * MAX_DISCS,
                                   description="shaft sections and couplings")
    gear: tuple[GearMesh, ...] = Field((), max_length=MAX_DISCS,
                                       description="gear meshes between shafts")

    @model_validator(mode="after")
    def _has_elements(self) -> "ShaftTrain":
        if not self.disc:
            raise PydanticCustomError(
                "shaft_train", "a shaft train needs its inertias: give [[shaft-train.disc]] "
                "tables, each with a name and an inertia (e.g. \"12.5 kg*m^2\")")
        if len(self.disc) > 1 and not self.link and not self.gear:
            raise PydanticCustomError(
                "shaft_train", "the discs are joined by nothing: give [[shaft-train.link]] "
                "tables (shaft sections and couplings between discs)")
        return self

    @property
    def shafts(self) -> tuple[TrainShaft, ...]:
        """The listed shafts, or one driven shaft named 'shaft' when none is listed."""
        return self.shaft or (TrainShaft(name="shaft"),)


# ------------------------------------------------------------------ cross-references


def _disc_shafts(train: ShaftTrain) -> dict[str, str]:
    only = train.shafts[0].name if len(train.shafts) == 1 else None
    return {disc.name: disc.shaft or only for disc in train.disc}


def _shaft_ratios(train: ShaftTrain) -> dict[str, float]:
    """Speed of each shaft over the reference shaft's, through the gears (those reached)."""
    where = _disc_shafts(train)
    reference = train.reference or train.shafts[0].name
    ratios = {reference: 1.0}
    joints = [(link.between, 1.0) for link in train.link if GROUND_NAME not in link.between]
    joints += [(gear.between, gear.speed_ratio) for gear in train.gear]
    for _ in range(len(train.shafts)):
        grown = False
        for between, ratio in joints:
            a, b = (where.get(name) for name in between)
            if a in ratios and b not in ratios and b is not None:
                ratios[b], grown = ratios[a] / ratio, True
            elif b in ratios and a not in ratios and a is not None:
                ratios[a], grown = ratios[b] * ratio, True
        if not grown:
            break
    return ratios


def train_problems(train: ShaftTrain, here: tuple, machine) -> list[tuple[tuple, str]]:
    """Everything that makes no train, each ``(key path, message)``; empty when sound.

    ``here`` is the train's key path, e.g. ``("shaft-train", 0)``; ``machine`` the
    design's machine (its speed and cylinders).
    """
    found: list[tuple[tuple, str]] = []
    shafts = [s.name for s in train.shafts]
    for index, shaft in enumerate(train.shaft):
        if shaft.name in shafts[:index]:
            found.append((here + ("shaft", index, "name"), f"shaft '{shaft.name}' is listed "
                          "twice"))
        if shaft.name == GROUND_NAME:
            found.append((here + ("shaft", index, "name"), f"'{GROUND_NAME}' is kept for a "
                          "fixed end; name the shaft otherwise"))
        if shaft.kind in ("engine", "reciprocating-compressor"):
            if (shaft.cylinders or machine.cylinders) is None:
                found.append((here + ("shaft", index, "kind"), f"an {shaft.kind} shaft needs "
                              "'cylinders' (here or in [machine])"))
            elif shaft.kind == "engine" and (shaft.strokes or machine.strokes) is None:
                found.append((here + ("shaft", index, "kind"), "an engine shaft needs "
                              "'strokes' (2 or 4, here or in [machine])"))
    if train.reference is not None and train.reference not in shafts:
        found.append((here + ("reference",), f"reference shaft '{train.reference}' is not "
                      f"among the shafts: {', '.join(shafts)}"))
        return found
    discs = [d.name for d in train.disc]
    for index, disc in enumerate(train.disc):
        path = here + ("disc", index)
        if disc.name in discs[:index]:
            found.append((path + ("name",), f"disc '{disc.name}' is listed twice"))
        if disc.name == GROUND_NAME:
            found.append((path + ("name",), f"'{GROUND_NAME}' is kept for a fixed end; name "
                          "the disc otherwise"))
        if disc.shaft is None and len(shafts) > 1:
            found.append((path, f"disc '{disc.name}' needs 'shaft' (one of: "
                          f"{', '.join(shafts)})"))
        elif disc.shaft is not None and disc.shaft not in shafts:
            found.append((path + ("shaft",), f"disc '{disc.name}' is on shaft "
                          f"'{disc.shaft}', which is not listed; shafts: {', '.join(shafts)}"))
        low, high = INERTIA_RANGE
        if not low <= disc.inertia.low <= disc.inertia.high <= high:
            found.append((path + ("inertia",), f"inertia '{disc.inertia.text}' is outside "
                          f"{low:g} to {high:g} kg*m^2, the range of machine rotors; check "
                          "the unit"))
    for index, link in enumerate(train.link):
        k_low, _, k_high = link.stiffness_band()
        low, high = STIFFNESS_RANGE
        if not low <= k_low <= k_high <= high:
            key = "stiffness" if link.stiffness is not None else "diameter"
            found.append((here + ("link", index, key), f"a torsional stiffness of {k_low:.3g} "
                          f"to {k_high:.3g} N*m/rad is outside {low:g} to {high:g} N*m/rad; "
                          "check the unit"))
    if found:
        return found
    where = _disc_shafts(train)
    for index, link in enumerate(train.link):
        path = here + ("link", index, "between")
        missing = [n for n in link.between if n != GROUND_NAME and n not in where]
        if missing:
            found.append((path, f"link joins '{missing[0]}', which is not a disc of this "
                          f"train; discs: {', '.join(discs)}"))
    for index, gear in enumerate(train.gear):
        path = here + ("gear", index, "between")
        missing = [n for n in gear.between if n not in where]
        if missing:
            found.append((path, f"gear joins '{missing[0]}', which is not a disc of this "
                          f"train; discs: {', '.join(discs)}"))
        elif where[gear.between[0]] == where[gear.between[1]]:
            found.append((path, f"gear joins '{gear.between[0]}' and '{gear.between[1]}' on "
                          f"the same shaft '{where[gear.between[0]]}': a gear mesh joins two "
                          "shafts"))
    if found:
        return found
    ratios = _shaft_ratios(train)
    for index, shaft in enumerate(train.shafts):
        if shaft.name not in ratios:
            found.append((here + ("shaft", index), f"shaft '{shaft.name}' is not reached "
                          "from the reference shaft through any link or gear"))
    for index, link in enumerate(train.link):
        a, b = (where.get(n) for n in link.between)
        if a in ratios and b in ratios and abs(ratios[a] / ratios[b] - 1) > 1e-6:
            found.append((here + ("link", index, "between"), f"link joins shaft '{a}' to "
                          f"shaft '{b}', which the gears make turn {ratios[a] / ratios[b]:.4g} "
                          "times as fast: shafts of different speeds meet through a "
                          "[[shaft-train.gear]]"))
    for index, gear in enumerate(train.gear):
        a, b = (where[n] for n in gear.between)
        if a in ratios and b in ratios:
            implied = ratios[a] / ratios[b]
            if abs(implied / gear.speed_ratio - 1) > 1e-6:
                found.append((here + ("gear", index), f"gear ratio {gear.speed_ratio:.4g} "
                              f"disagrees with the ratio {implied:.4g} the rest of the train gives "
                              f"between shafts '{a}' and '{b}'"))
    top = machine.speed.max.value
    for index, shaft in enumerate(train.shaft):
        if shaft.speed is not None and shaft.name in ratios:
            derived = top * ratios[shaft.name]
            if abs(shaft.speed.value / derived - 1) > SPEED_AGREEMENT:
                found.append((here + ("shaft", index, "speed"), f"shaft '{shaft.name}' is "
                              f"given {shaft.speed.text}, but machine.speed "
                              f"{machine.speed.max.text} and the gear ratios give "
                              f"{derived * 60:.1f} rpm"))
    if found:
        return found
    from ..dynamics.torsion.modes import free_parts

    index_of = {name: i for i, name in enumerate(discs)}
    pairs = [(index_of.get(a, -1), index_of.get(b, -1)) for a, b in
             (link.between for link in train.link)]
    pairs += [(index_of[a], index_of[b]) for a, b in (gear.between for gear in train.gear)]
    joined = [(a, b) for a, b in pairs]
    parts = free_parts(len(discs), joined)
    grounded = any(-1 in pair for pair in pairs)
    pieces = len(parts) + (1 if grounded else 0)
    if pieces > 1:
        parts_named = sorted(parts, key=len)
        loose = ", ".join(f"'{discs[i]}'" for i in parts_named[0])
        found.append((here, f"the train falls apart: {loose} not joined to the rest by any "
                      "link or gear"))
    return found


# ------------------------------------------------------------------------ referral


class ReferredTrain(Record):
    """A train referred to its reference shaft, in arrays for the dynamics [SI]."""

    name: str
    reference: str
    discs: tuple[str, ...]
    """Names of the degrees of freedom: discs, gear pairs merged as 'pinion + wheel'."""
    inertias: tuple[float, ...]
    """Referred inertia of each degree of freedom [kg m^2]."""
    links: tuple[tuple[int, int, float, float, float], ...]
    """(disc, disc or -1 for the ground, low, nominal, high referred stiffness) [N m/rad]."""
    link_index: tuple[int, ...]
    """Index in ``train.link`` of each link."""
    ratios: dict
    """Speed of each shaft over the reference shaft's [unitless]."""


def refer_train(train: ShaftTrain) -> ReferredTrain:
    """The train referred to its reference shaft (call after :func:`train_problems`).

    Inertias and stiffnesses on a shaft at speed ratio r = n / n_ref are multiplied by
    r^2 (:func:`vcheck.dynamics.torsion.stiffness.refer_to_shaft`); the two gears of a
    mesh, taken as rigid, become one degree of freedom with the sum of their referred
    inertias.
    """
    from ..dynamics.torsion.stiffness import refer_to_shaft

    where = _disc_shafts(train)
    ratios = _shaft_ratios(train)
    names = [d.name for d in train.disc]
    group = list(range(len(names)))

    def find(i: int) -> int:
        while group[i] != i:
            i = group[i]
        return i

    for gear in train.gear:
        a, b = names.index(gear.between[0]), names.index(gear.between[1])
        group[find(a)] = find(b)
    roots = sorted({find(i) for i in range(len(names))})
    dof = {root: n for n, root in enumerate(roots)}
    inertias = [0.0] * len(roots)
    labels: list[list[str]] = [[] for _ in roots]
    for i, disc in enumerate(train.disc):
        k = dof[find(i)]
        inertias[k] += float(refer_to_shaft(disc.inertia.value, ratios[where[disc.name]]))
        labels[k].append(disc.name)
    links = []
    for link in train.link:
        a, b = link.between
        shaft = where[b] if a == GROUND_NAME else where[a]
        r2 = ratios[shaft] ** 2
        low, nominal, high = (r2 * k for k in link.stiffness_band())
        ia = -1 if a == GROUND_NAME else dof[find(names.index(a))]
        ib = -1 if b == GROUND_NAME else dof[find(names.index(b))]
        links.append((ia, ib, low, nominal, high))
    reference = train.reference or train.shafts[0].name
    return ReferredTrain(train.name, reference, tuple(" + ".join(x) for x in labels),
                         tuple(inertias), tuple(links), tuple(range(len(train.link))),
                         dict(ratios))

"""Frequency separation: natural frequencies kept clear of forcing frequencies."""

from __future__ import annotations

from pydantic import Field, model_validator

from vcheck.analysis import (
    EXCITATION_KINDS,
    analyse,
    drive_inputs_missing,
    excitation_bands,
    natural_frequencies,
    rocking_sources,
)
from vcheck.design.fields import quantity
from vcheck.design.models import MachineKind, SupportKind
from vcheck.engine import Rule, RuleOptions
from vcheck.findings import Measure, Source, Status, computed
from vcheck.wording import apart as _apart

__all__ = ["ESTIMATE_SHEAR_RATIOS", "ROCKING_WORDS", "FrequencySeparation", "SeparationOptions",
           "rocking_estimate", "separation_margin", "unconsidered_inputs"]

_TOLERANCE = 1e-9
"""Relative slack when comparing a margin with its limit, so that a design placed
exactly on the limit (f_n = 0.8 f) is judged as on it despite rounding."""

ACI_351 = Source(
    "ACI 351.3R, Foundations for Dynamic Equipment: natural frequencies of a machine "
    "foundation at least 20% away from the operating frequency", "from memory")
SEPARATION_PRACTICE = Source(
    "avoid 0.8 <= natural frequency / forcing frequency <= 1.2", "common practice")
WIDER_PRACTICE = Source(
    "some practice asks for 30% separation (ACI 351.3R discussion)", "from memory")


SpanLimit = quantity("length", tolerance=False, positive=False)


class SeparationOptions(RuleOptions):
    """Policy of the frequency-separation rule."""

    required_margin: float = Field(
        0.20, ge=0, lt=1,
        description="Least separation between a natural frequency and a forcing band, as "
        "a fraction of the band edge; below it the rule fails. Default 0.20: ACI 351.3R "
        "(from memory) and common practice (0.8 to 1.2 avoided).",
    )
    warn_margin: float = Field(
        0.30, ge=0, lt=1,
        description="Separation below which the rule warns. Default 0.30: some practice "
        "asks for 30% (from memory).",
    )
    margin_by_machine: dict[MachineKind, float] = Field(
        {},
        description="Required separation by machine kind, e.g. { centrifugal-pump = 0.10 } "
        "for pump bearing-housing modes (API 610 asks 10% from 1x and 2x, from memory); the "
        "stricter of this and required-margin applies. Default: none.",
    )
    margin_by_support: dict[SupportKind, float] = Field(
        {},
        description="Required separation by support kind, e.g. { foundation-block = 0.20, "
        "steel-frame = 0.25 }; the stricter value applies. Default: none.",
    )
    ignore_forcing: tuple[str, ...] = Field(
        ("bearing-defect",),
        description="Kinds of forcing band not judged. Default: bearing defect frequencies, "
        "which only a damaged bearing excites (common practice); `vcheck dynamics` still "
        "shows them.",
    )
    flexible_supports: tuple[str, ...] = Field(
        ("suspended-floor", "roof", "steel-frame"),
        description="Support kinds whose own modes can sit in the machine's forcing bands: "
        "without their modes (listed, a beam, a lumped model, a mode file or a structure "
        "file) the rule warns at most, naming them. Default: suspended floors, roofs and "
        "steel frames (common practice).",
    )
    flexible_span: SpanLimit = Field(
        "0 m", validate_default=True,
        description="Span above which a support of a flexible-supports kind needs its "
        "modes, e.g. \"6 m\"; a support whose span is not given is taken as beyond it. "
        "Default 0 m: every "
        "such support (common practice: a 5 m concrete bay can have its first mode near "
        "13 Hz, inside the running speeds of many machines).",
    )
    running_speed_orders: tuple[float, ...] = Field(
        (1.0, 2.0), min_length=1,
        description="Orders of running speed checked as forcing: 1x (unbalance) and 2x "
        "(misalignment, looseness) by default (common practice).",
    )

    @model_validator(mode="after")
    def _ordered(self) -> SeparationOptions:
        if self.warn_margin < self.required_margin:
            raise ValueError(
                f"warn-margin ({self.warn_margin}) must not be below required-margin "
                f"({self.required_margin})")
        unknown = sorted(set(self.ignore_forcing) - set(EXCITATION_KINDS))
        if unknown:
            raise ValueError(f"ignore-forcing names unknown kinds {unknown}; known: "
                             f"{', '.join(EXCITATION_KINDS)}")
        known = getattr(SupportKind, "__args__", ())
        unknown = sorted(set(self.flexible_supports) - set(known))
        if unknown:
            raise ValueError(f"flexible-supports names unknown support kinds {unknown}; "
                             f"known: {', '.join(known)}")
        if any(order <= 0 for order in self.running_speed_orders):
            raise ValueError("running-speed-orders must all be positive")
        for key, table in (("margin-by-machine", self.margin_by_machine),
                           ("margin-by-support", self.margin_by_support)):
            for kind, margin in table.items():
                if not 0 <= margin < 1:
                    raise ValueError(f"{key}.{kind} must be from 0 to below 1, got {margin}")
                if margin > self.warn_margin:
                    raise ValueError(f"{key}.{kind} ({margin}) is above warn-margin "
                                     f"({self.warn_margin})")
        return self

    def required_for(self, design) -> tuple[float, str]:
        """The separation required for this design and what set it."""
        required, why = self.required_margin, "required-margin"
        by_machine = self.margin_by_machine.get(design.machine.kind)
        if by_machine is not None and by_machine > required:
            required, why = by_machine, f"margin-by-machine.{design.machine.kind}"
        support = design.support
        kinds = []
        if support is not None and support.kind:
            kinds.append(support.kind)
        if design.structure is not None:
            kinds.append(design.structure.structure.kind)
        for kind in kinds:
            value = self.margin_by_support.get(kind)
            if value is not None and value > required:
                required, why = value, f"margin-by-support.{kind}"
        return required, why


def separation_margin(mode_low: float, mode_high: float, band_low: float, band_high: float):
    """Separation of a natural-frequency band from a forcing band, as a fraction.

    Zero when the bands overlap; otherwise the gap divided by the nearest edge of the
    forcing band: (f_low - f_n)/f_low below the band, (f_n - f_high)/f_high above it.
    Returns ``(margin, side)`` with side "below", "above" or "inside".
    """
    if mode_high < band_low:
        return (band_low - mode_high) / band_low, "below"
    if mode_low > band_high:
        return (mode_low - band_high) / band_high, "above"
    return 0.0, "inside"


ROCKING_WORDS = ("rocking", "roll", "pitch")
"""A listed natural frequency whose name holds one of these words is taken as a rocking
mode of the machine on its isolators."""

ESTIMATE_SHEAR_RATIOS = (0.25, 1.0)
"""Shear-to-axial stiffness ratios of an isolator assumed for the rocking estimate from
``envelope`` [unitless]: a quarter for rubber in compression, about one for an open steel
spring (from memory; makers' data vary widely), so the estimate is given as a band."""

STANDARD_GRAVITY = 9.80665
"""[m/s^2], to turn a rated static deflection into a stiffness."""


def rocking_estimate(design, bands) -> str:
    """Words on the rocking modes estimated from ``mounting.envelope``, or "".

    The isolators are assumed at the corners of the envelope's footprint (two rows along
    x, evenly spaced), the centre of gravity at half its height above them, the inertia
    that of a uniform box, and each isolator's shear stiffness 0.25 to 1 times its axial
    stiffness (:data:`ESTIMATE_SHEAR_RATIOS`); the six rigid-body modes other than the
    bounce (the mode with most of its energy in vertical translation) are given as one
    band, with the forcing band nearest to it. An estimate stated as such, never a verdict.
    """
    import numpy as np

    from vcheck.dynamics.modes import rigid_mounts

    mounting = design.mounting
    box = mounting.envelope
    if box is None:
        return ""
    base = mounting.base_mass.value if mounting.base_mass is not None else 0.0
    mass = design.machine.mass.value + base
    count = mounting.isolators or 4
    if mounting.stiffness is not None:
        axial = mounting.stiffness.value
    else:
        axial = mass * STANDARD_GRAVITY / (count * mounting.static_deflection.value)
    if count < 3 or not axial > 0:
        return ""
    length, width, height = box.x.value, box.y.value, box.z.value
    rows = (count - count // 2, count // 2)
    positions = []
    for row, y in zip(rows, (width / 2, -width / 2)):
        xs = np.linspace(-length / 2, length / 2, row) if row > 1 else np.zeros(1)
        positions += [(float(x), y, 0.0) for x in xs]
    centre = (0.0, 0.0, height / 2)
    mass_matrix = rigid_mounts.rigid_body_mass_matrix(
        mass, rigid_mounts.uniform_box_inertia(mass, length, width, height))
    found = []
    for ratio in ESTIMATE_SHEAR_RATIOS:
        stiffness = np.array([[axial, ratio * axial, ratio * axial]] * count)
        try:
            modes = rigid_mounts.rigid_body_modes(
                mass_matrix, rigid_mounts.mount_stiffness_matrix(positions, stiffness, centre))
        except ValueError:
            return ""
        bounce = int(np.argmax(modes.energy_fractions[2]))
        found += [float(f) for j, f in enumerate(modes.frequencies) if j != bounce]
    low, high = min(found), max(found)
    nearest = min(((separation_margin(low, high, band.low, band.high), band.name,
                    _band(band.low, band.high)) for band in bands), default=None)
    words = (f"estimate only, with the {count} isolators assumed at the corners of the "
             f"envelope, the centre of gravity at half its height and shear stiffness "
             f"{ESTIMATE_SHEAR_RATIOS[0]:g} to {ESTIMATE_SHEAR_RATIOS[1]:g} times axial: the "
             f"other rigid-body modes, rocking among them, at {_band(low, high)}")
    if nearest is not None:
        (margin, side), name, where = nearest
        position = _apart(margin, side)
        words += f", {position} {name} {where}"
    return words


def unconsidered_inputs(design, options: SeparationOptions, modes) -> list[tuple]:
    """Modes and forcing the design leaves out, each ``(key path, what, what to give)``.

    ``modes`` are the design's natural frequencies (:class:`~vcheck.analysis.ModeBand`).
    """
    gaps: list[tuple] = []
    mounting = design.mounting
    if mounting is not None and mounting.kind != "rigid" and not mounting.mount:
        why = rocking_sources(design, analyse(design).loads)
        listed = any(word in mode.name.lower() for mode in modes if not mode.is_isolation
                     for word in ROCKING_WORDS)
        if why and not listed:
            given = ("count and stiffness" if mounting.stiffness is not None
                     else "static deflection")
            gaps.append((
                ("mounting",),
                f"rocking modes on the isolators ({'; '.join(why)}; the isolators are given "
                f"only by {given}, so only the vertical bounce is known)",
                "give [[mounting.mount]] tables (each mount's position and axial and shear "
                "stiffness) with centre-of-gravity and inertia or envelope, for the six "
                "rigid-body modes including rocking; or list the rocking modes the maker "
                "gives as [[natural-frequency]] entries named rocking, roll or pitch"))
    support = design.support
    if support is None:
        gaps.append((
            ("machine",), "what the machine stands on ([support] not given)",
            "give [support] with kind (e.g. \"slab-on-grade\" or \"suspended-floor\") and "
            "span, or structure (a structure file with the support's modes)"))
    else:
        structure = design.structure
        kind = structure.structure.kind if structure is not None else support.kind
        span = (structure.structure.span if structure is not None
                and structure.structure.span is not None else support.span)
        beyond = span is None or span.value > options.flexible_span.value
        own_modes = any(not mode.is_isolation for mode in modes)
        if kind in options.flexible_supports and beyond and not own_modes:
            size = f"{span.text} span" if span is not None else "its span not given"
            gaps.append((
                ("support",), f"the {kind}'s own modes (none given; {size})",
                f"give the {kind}'s natural frequencies: [[natural-frequency]] entries, a "
                "[[beam]], a [[lumped-model]] or a [[mode-file]], or support.structure (a "
                "structure file with them)"))
    missing = drive_inputs_missing(design)
    if missing is not None:
        path, words = missing
        what, _, give = words.partition(": ")
        gaps.append((path, what, give))
    return gaps


def _hz(value: float) -> str:
    return f"{value:.2f}" if value < 10 else f"{value:.1f}"


def _band(low: float, high: float) -> str:
    return f"{_hz(low)} Hz" if low == high else f"{_hz(low)}-{_hz(high)} Hz"


def _separation_quantities(modes, bands, pairs, required: float) -> list:
    """Every natural frequency (with its origin), every forcing band and the separation
    of every pair, closest first, at full precision [Hz, fraction]."""
    out = []
    for mode in modes:
        out.append(computed("natural frequency", mode.nominal, "Hz", mode=mode.name,
                            origin=mode.origin))
        if mode.low != mode.high:
            out.append(computed("natural frequency band", (mode.low, mode.high), "Hz",
                                mode=mode.name, origin=mode.origin))
    for band in bands:
        out.append(computed("forcing frequency band", (band.low, band.high), "Hz",
                            band=band.name, kind=band.kind))
    for margin, _, _, mode, band, side in pairs:
        out.append(computed("separation", margin, "fraction", mode=mode.name, band=band.name,
                            side=side))
    out.append(computed("required separation", required, "fraction"))
    return out


class FrequencySeparation(Rule):
    """Natural frequencies must stay clear of every forcing band over the speed range.

    Every natural frequency of the design (listed modes, and the bounce mode of the
    machine on its isolators) is compared with every forcing band: 1x and 2x running
    speed and vane or blade pass over the whole speed range, and the listed excitation
    sources. The separation is the gap between the two as a fraction of the nearest
    edge of the forcing band; a mode inside a band has none. Where an input carries a
    tolerance, the end of the mode's band nearest the forcing band is judged.

    An AC motor started across the line forces at twice line frequency; a motor fed by a
    variable-frequency drive (``driver.supply = "drive"``) forces at twice the drive's
    output frequency, poles x speed, over the speed range, with the drive's torque
    pulsations; at a speed range with no supply stated both are judged.

    Fails when the smallest separation is below ``required-margin`` (20% by default);
    warns when it is below ``warn-margin`` (30%); passes otherwise. A design from which
    no natural frequency can be derived is reported as not checked.

    A verdict never rests on a mode or a forcing the design leaves out: it is at most a
    warning, naming the missing input, when the machine excites rocking (an engine, a
    generator set, a reciprocating compressor, a torque reaction or a stated moment) and
    the isolators are given only by count and stiffness or static deflection (no mount
    positions, so no rocking modes); when it stands on a flexible support
    (``flexible-supports`` beyond ``flexible-span``) whose modes are not given; when the
    design has no ``[support]``; and when a motor's magnetic forcing cannot be placed.

    Limits of validity: without ``[[mounting.mount]]`` tables the isolation mode is a
    one-degree-of-freedom vertical bounce; the support's modes are those given.
    """

    id = "frequency-separation"
    title = "Natural frequencies clear of forcing frequencies"
    applies_to = "machine"
    sources = (ACI_351, SEPARATION_PRACTICE, WIDER_PRACTICE)
    Options = SeparationOptions

    def check(self, design, options: SeparationOptions):
        modes = natural_frequencies(design)
        if not modes:
            yield self.finding(
                design, ("machine",), Status.NOT_CHECKED,
                "no natural frequency is known: list [[natural-frequency]] entries, or give "
                "[mounting] isolator stiffness or static deflection",
            )
            return
        bands = [band for band in excitation_bands(design, tuple(options.running_speed_orders))
                 if band.kind not in options.ignore_forcing]
        gaps = unconsidered_inputs(design, options, modes)
        pairs = []
        for mode in modes:
            for band in bands:
                margin, side = separation_margin(mode.low, mode.high, band.low, band.high)
                pairs.append((margin, mode.nominal, band.low, mode, band, side))
        pairs.sort(key=lambda item: item[:3])
        margin, _, _, mode, band, side = pairs[0]
        required, set_by = options.required_for(design)
        warn = options.warn_margin
        if margin < required * (1 - _TOLERANCE):
            status = Status.FAIL
        elif margin < warn * (1 - _TOLERANCE):
            status = Status.WARN
        else:
            status = Status.PASS
        separated = status is Status.PASS
        if gaps and status is Status.PASS:
            status = Status.WARN
        where = {"inside": "lies inside", "below": f"is {margin:.1%} below",
                 "above": f"is {margin:.1%} above" if margin < 1
                 else f"is at {1 + margin:.3g} times the top of"}[side]
        span = "" if mode.low == mode.high else f" (band {_band(mode.low, mode.high)})"
        worst = " in the worst case within its tolerance" if mode.low != mode.high else ""
        message = (
            f"{mode.name} at {_hz(mode.nominal)} Hz{span} {where} {band.name} "
            f"{_band(band.low, band.high)}{worst}; separation needed {required:.0%}, "
            f"warn below {warn:.0%}"
        )
        if gaps:
            message += "; not considered: " + "; ".join(what for _, what, _ in gaps)
        if any(path == ("mounting",) for path, _, _ in gaps):
            estimate = rocking_estimate(design, bands)
            if estimate:
                message += f"; {estimate}"
        assumptions = list(mode.assumptions)
        for item in bands:
            assumptions += [a for a in item.assumptions if a not in assumptions]
        if set_by != "required-margin":
            assumptions.append(f"separation required by the policy's {set_by}")
        if design.machine.speed.is_range:
            assumptions.append("forcing bands cover the whole speed range "
                               f"{design.machine.speed.min.text} to {design.machine.speed.max.text}")
        advice = []
        if not separated:
            below = band.low * (1 - warn)
            above = band.high * (1 + warn)
            advice.append(
                f"to clear {band.name} with {warn:.0%} separation the mode must lie at or "
                f"below {_hz(below)} Hz or at or above {_hz(above)} Hz")
        advice += [give for _, _, give in gaps]
        table = [("natural frequency", "Hz", "forcing", "band Hz", "separation")]
        for item in pairs[:5]:
            m, _, _, md, bd, sd = item
            table.append((md.name, _band(md.low, md.high), bd.name, _band(bd.low, bd.high),
                          _apart(m, sd)))
        yield self.finding(
            design, mode.key_path, status, message,
            quantities=_separation_quantities(modes, bands, pairs, required),
            measured=Measure("separation", round(margin, 6), "fraction"),
            limit=Measure("required separation", required, "fraction"),
            margin=round(margin - required, 6),
            assumptions=assumptions,
            advice=advice,
            table=table,
            table_title="closest pairs",
        )

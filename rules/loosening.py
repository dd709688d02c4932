"""Bolted joints under vibration: slip (self-loosening), bolt fatigue, bolt yield.

A bolted joint that carries a vibrating part loosens by itself mainly when it slips
sideways: each slip lets the nut turn back a little (the transverse vibration test of
Junker, DIN 65151, ISO 16130). Its bolts break when their alternating stress exceeds the
endurance limit of the thread, and a torque that is too high yields them at assembly.
Three rules screen each ``[[joint]]`` of a design for these, with the relations of VDI
2230 Part 1 (:mod:`vcheck.dynamics.joints.preload`):

- ``joint-slip``: friction capacity of the least residual clamp load over the transverse
  vibration load, against the slip safety VDI 2230 asks for alternating transverse load;
- ``joint-bolt-fatigue``: stress amplitude in the bolt against the endurance limit of its
  thread;
- ``joint-bolt-yield``: equivalent stress at assembly against the minimum yield strength.

All three share one screening of the joint, :func:`screen_joint`, so that their numbers
agree. Every default a number relied on is listed with the finding as an assumption.
"""

from __future__ import annotations

import math

from pydantic import Field, model_validator

from vcheck.analysis import analyse, natural_frequencies, shared
from vcheck.design.units import in_units_of
from vcheck.engine import Rule, RuleOptions
from vcheck.findings import Measure, Source, Status, _finding_with, computed
from vcheck.records import Record

__all__ = [
    "ASSUMED_HEAD_FRICTION",
    "ASSUMED_INTERFACE_FRICTION",
    "ASSUMED_THREAD_FRICTION",
    "BoltFatigueOptions",
    "BoltYieldOptions",
    "JointBoltFatigue",
    "JointBoltYield",
    "JointScreening",
    "JointSlip",
    "SlipOptions",
    "VibrationLoad",
    "ZONE_STEP",
    "screen_joint",
    "vibration_load",
]

_TOLERANCE = 1e-9
"""Relative slack when comparing a number with its limit, so that a design placed
exactly on a limit is judged as on it despite rounding."""

# ------------------------------------------------------------ defaults of the design

ASSUMED_THREAD_FRICTION = 0.12
"""The middle of VDI 2230 friction class B, kept for plugins that imported it; the rules
take the whole class B band, 0.08 to 0.16, when a joint gives no friction
(:data:`vcheck.design.joints.DEFAULT_FRICTION_CLASS`) [unitless]."""

ASSUMED_HEAD_FRICTION = 0.12
"""Friction coefficient under the head or nut mu_K taken when a joint gives none
[unitless]; as :data:`ASSUMED_THREAD_FRICTION` (common practice)."""

ASSUMED_INTERFACE_FRICTION = 0.2
"""Friction coefficient between the clamped parts mu_T taken when a joint gives none
[unitless]: slip factor of class D, untreated surfaces, EN 1090-2 Table 18 (from
memory). Painted or oily faces can be lower: state the value."""

STEEL_MODULUS = 205e9
"""Young's modulus of steel bolts and steel clamped parts [Pa], the value of the VDI 2230
examples (from memory)."""

STAINLESS_MODULUS = 200e9
"""Young's modulus of austenitic stainless bolts (ISO 3506-1 A2, A4) [Pa] (common
practice)."""

ASSUMED_ROUGHNESS = 100e-6
"""Averaged roughness depth Rz taken when a joint gives none [m]: a value inside the
roughest class of the embedding guide values, 40 um <= Rz < 160 um (as-rolled or
flame-cut faces), the cautious class (VDI 2230 Part 1 Table 5, from memory)."""

ASSUMED_CONE_TANGENT = math.tan(math.radians(30.0))
"""Tangent of the pressure-cone half-angle in wide clamped parts when the design gives no
clamped width: 30 degrees (Budynas and Nisbett, Shigley's Mechanical Engineering
Design, 10th ed., section 8-5, from memory)."""

ASSUMED_STRUCTURE_DAMPING = 0.01
"""Damping ratio taken for a listed natural frequency without damping [unitless]: the low
end of bolted steel structures, 1 to 5 % (Harris' Shock and Vibration Handbook, 6th ed.,
from memory); low damping is the cautious side for amplification."""

ISOLATOR_DAMPING = {
    "spring": 0.005, "restrained-spring": 0.005, "air-spring": 0.005,
    "rubber": 0.05, "pad": 0.05,
}
"""Damping ratio taken for the isolation modes when the mounting gives none [unitless]:
steel springs about 0.005, natural rubber and neoprene about 0.05 (Harris' Shock and
Vibration Handbook, 6th ed., from memory; :mod:`vcheck.dynamics.isolation.damping`); air springs
get the steel-spring value, the lowest default, for want of one of their own."""

ASSUMED_MACHINE_GROUP = 1
"""ISO 10816-3 machine group taken when the design says none: group 1 (above 300 kW),
whose zone boundaries are the higher ones, so the cautious choice."""

RIGID_SUPPORT_RATIO = 1.25
"""A support is rigid in ISO 10816-3 when the lowest natural frequency of machine and
support is at least 25 % above the main excitation (running speed) (ISO 10816-3:2009,
clause 3.3, from memory); otherwise it is flexible."""

ZONE_STEP = 10 ** (1 / 5)
"""Ratio of successive ISO 10816-3 zone boundaries (2.8, 4.5, 7.1, 11 mm/s): the R5 series
of preferred numbers, 10^(1/5) = 1.585 (ISO 3; derived from the boundaries). The warn
bands below are the limit times this step: a joint in the band would fall below its limit
if the vibration rose by one zone, as a machine may for a limited time in zone C."""

_HIGH_STRENGTH = ("8.8", "9.8", "10.9", "12.9", "SAE J429 grade 5", "SAE J429 grade 8")
"""Bolt materials for which the VDI 2230 endurance limits are stated (quenched and
tempered steel, ISO 898-1 classes 8.8 to 12.9 and the SAE grades of the same kind)."""

_G = 9.80665  # standard gravity [m/s^2], exact (3rd CGPM, 1901)
_GRID = 241  # frequencies examined across a speed range, plus the peak of every mode

# ------------------------------------------------------------------------ sources

VDI_SLIP = Source(
    "VDI 2230 Part 1:2015, step R12: safety against slipping S_G = F_KRmin q_F mu_T / "
    "F_Qmax of at least 1.2 under static and 1.8 under alternating transverse load",
    "from memory")
VDI_PRELOAD = Source(
    "VDI 2230 Part 1:2015: preload from torque (R13), tightening factor alpha_A (Table A8), "
    "embedding (Table 5, R4), resilience of bolt and parts (section 5.1)", "from memory")
JUNKER = Source(
    "transverse vibration test (G. H. Junker, SAE 690055, 1969; DIN 65151; ISO 16130:2015): "
    "self-loosening starts when the joint slips, F_Q > mu_T F_K")
ISO_10816 = Source(
    "ISO 10816-3:2009 Annex A: upper boundary of zone B (unrestricted long-term "
    "operation), the vibration level taken when a joint gives none", "from memory")
ZONE_BAND = Source(
    "warn band: the limit times 1.585, one ISO 10816-3 zone step (R5 preferred numbers)",
    "derived")
VDI_FATIGUE = Source(
    "VDI 2230 Part 1:2015, step R9: endurance limit of the thread sigma_ASV = 0.85 (150/d + "
    "45) MPa rolled before heat treatment, sigma_ASG = (2 - F_Sm/F_0.2min) sigma_ASV rolled "
    "after, at 2e6 cycles (as reproduced in secondary sources)")
VDI_FATIGUE_SAFETY = Source(
    "VDI 2230 Part 1:2015, step R9: safety against fatigue S_D = sigma_AS / sigma_a of at "
    "least 1.2", "from memory")
VDI_ASSEMBLY = Source(
    "VDI 2230 Part 1:2015, step R7: von Mises stress at assembly from tension and thread "
    "torsion; its torque tables use 90 % of the minimum yield strength", "from memory")
ISO_898 = Source("ISO 898-1:2013 Table 3, SAE J429:2014 Table 1, ISO 3506-1: minimum yield "
                 "strength of the bolt")


# ---------------------------------------------------------------------- screening


class VibrationLoad(Record):
    """The peak acceleration a joint's clamped mass is given, and how it was found.

    ``acceleration`` [m/s^2] is the largest of base level times amplification over the
    excitation band, at ``frequency`` [Hz]; ``amplification`` [unitless] is the
    transmissibility of ``mode`` there (1 when no mode amplifies).
    """

    acceleration: float
    frequency: float
    base_acceleration: float
    amplification: float
    mode: str
    described: str
    assumptions: tuple[str, ...] = ()
    measurement: str = ""  # the [[measurement]] used, e.g. "measurement[3] 'motor feet'"


class JointScreening(Record):
    """Every number of one joint that the three fastener rules judge, SI units.

    Forces are per bolt unless named for the joint; ``assumptions`` are grouped by what
    they affect: "preload", "clamp", "load" and "fatigue".
    """

    index: int
    name: str
    label: str
    count: int
    method: str
    alpha: float
    preload_min: float
    preload_max: float
    preload_max_requested: float
    yield_preload: float
    utilisation: float
    yield_strength: float
    torsion_factor: float
    friction_thread: float
    friction_head: float
    thread_friction_band: tuple[float, float]
    head_friction_band: tuple[float, float]
    preload_min_by_alpha: float
    preload_min_by_friction: float
    friction_interface: float
    head_friction_diameter: float
    bolt_resilience: float
    part_resilience: float
    load_factor: float
    embedding: float
    embedding_loss: float
    axial_load: float
    residual_clamp: float
    shear_interfaces: int
    capacity: float
    load: VibrationLoad
    mass: float
    transverse_static: float
    transverse_load: float
    slip_safety: float
    force_amplitude: float
    stress_area: float
    stress_amplitude: float
    endurance_limit: float
    rolled: str
    fatigue_safety: float
    opens: bool
    unclamped: bool
    assumptions: dict[str, tuple[str, ...]]  # by group; built with the screening
    implausible: tuple[tuple[str, float], ...] = ()
    tightening: str = ""
    machine: JointMachineLoad | None = None


def _joint_quantities(joint: JointScreening, *groups: str) -> list:
    """The screening's numbers a rule's verdict rests on, SI units: ``groups`` of
    "preload", "slip", "fatigue" and "yield"."""
    per_bolt = {"joint": joint.label, "per": "bolt"}
    whole = {"joint": joint.label, "per": "joint"}
    out = [computed("least assembly preload", joint.preload_min, "N", **per_bolt),
           computed("largest assembly preload", joint.preload_max, "N", **per_bolt),
           computed("tightening factor", joint.alpha, "1", **per_bolt)]
    if "slip" in groups or "fatigue" in groups:
        load = joint.load
        out += [computed("preload lost to embedding", joint.embedding_loss, "N", **per_bolt),
                computed("residual clamp load", joint.residual_clamp, "N", **per_bolt),
                computed("load factor", joint.load_factor, "1", **per_bolt),
                computed("clamped mass", joint.mass, "kg", **whole),
                computed("peak acceleration", load.acceleration, "m/s^2", **whole),
                computed("frequency of the peak acceleration", load.frequency, "Hz", **whole),
                computed("base acceleration", load.base_acceleration, "m/s^2", **whole),
                computed("amplification", load.amplification, "1", **whole,
                         mode=load.mode or None)]
        if joint.axial_load:
            out.append(computed("static axial load", joint.axial_load, "N", **per_bolt))
    if "slip" in groups:
        out += [computed("friction at the interface", joint.friction_interface, "1", **whole),
                computed("slip resistance", joint.capacity, "N", **whole),
                computed("transverse load", joint.transverse_load, "N", **whole),
                computed("static transverse load", joint.transverse_static, "N", **whole),
                computed("slip safety", joint.slip_safety, "1", **whole)]
    if "fatigue" in groups:
        out += [computed("alternating bolt force", joint.force_amplitude, "N", **per_bolt),
                computed("tensile stress area", joint.stress_area, "m^2", **per_bolt),
                computed("bolt stress amplitude", joint.stress_amplitude, "Pa", **per_bolt),
                computed("endurance limit", joint.endurance_limit, "Pa", **per_bolt,
                         rolled=joint.rolled),
                computed("fatigue safety", joint.fatigue_safety, "1", **per_bolt)]
    if "yield" in groups:
        out += [computed("largest requested preload", joint.preload_max_requested, "N",
                         **per_bolt),
                computed("preload at yield", joint.yield_preload, "N", **per_bolt),
                computed("minimum yield strength", joint.yield_strength, "Pa", **per_bolt),
                computed("friction in the thread", joint.friction_thread, "1", **per_bolt),
                computed("yield utilisation at assembly", joint.utilisation, "fraction",
                         **per_bolt)]
    return out


def _kn(force: float) -> str:
    return "unbounded" if not math.isfinite(force) else f"{force / 1e3:.3g} kN"


def _num(value: float) -> str:
    return "unbounded" if not math.isfinite(value) else f"{value:.3g}"


def _safety(value: float) -> str:
    if not math.isfinite(value):
        return "unbounded"
    if value >= 1000:
        return f"{value:.0f}"
    return f"{value:.2f}" if value < 10 else f"{value:.3g}"


def _hz(value: float) -> str:
    return f"{value:.3g} Hz"


def _mode_damping(design, mode) -> tuple[float, str | None]:
    """Damping ratio of a mode and, when it was assumed, why."""
    if mode.damping_ratio is not None:
        return mode.damping_ratio, None
    if mode.is_isolation and design.mounting is not None:
        zeta = ISOLATOR_DAMPING.get(design.mounting.kind, min(ISOLATOR_DAMPING.values()))
        return zeta, (f"damping ratio {zeta:g} of {design.mounting.kind} isolators (Harris, "
                      "from memory)")
    return ASSUMED_STRUCTURE_DAMPING, (
        f"damping ratio {ASSUMED_STRUCTURE_DAMPING:g}, the low end of bolted steel (Harris, "
        "from memory)")


def _support_type(design, modes) -> tuple[str, str]:
    """ISO 10816-3 support type from the lowest natural frequency, and why."""
    top = design.machine.speed.max.value
    if not modes:
        return "flexible", "no natural frequency is known, so the support is taken as flexible"
    lowest = min(modes, key=lambda m: m.low)
    if lowest.low >= RIGID_SUPPORT_RATIO * top:
        return "rigid", (f"rigid: the lowest natural frequency, {lowest.name} at "
                         f"{_hz(lowest.low)}, is at least 25% above running speed")
    return "flexible", (f"flexible: the lowest natural frequency, {lowest.name} at "
                        f"{_hz(lowest.low)}, is not 25% above running speed {_hz(top)}")


def vibration_load(design, joint) -> VibrationLoad:
    """Peak acceleration of a joint's clamped mass, amplified near natural frequencies.

    The stated level (or the ISO 10816-3 zone B boundary) is turned into a peak
    acceleration at each frequency of the excitation band (the stated frequency, or the
    running speed over its range) and multiplied by the largest base-excitation
    transmissibility of the design's natural frequencies there, when above 1.
    """
    import numpy as np

    from vcheck.design.joints import Vibration
    from vcheck.dynamics.isolation.transmissibility import resonance_peak_viscous, transmissibility_viscous
    from vcheck.dynamics.vibration_level import harmonic_amplitude, zone_boundaries

    vibration = joint.vibration if joint.vibration is not None else Vibration()
    speed = design.machine.speed
    modes = natural_frequencies(design)
    assumptions: list[str] = []
    used = ""
    measured = measured_clamped_part(design, joint)
    if measured is not None:
        used, level, frequency, notes = measured
        replaced = (f"the joint's stated level '{vibration.level.text}'"
                    if vibration.level is not None else "the default level")
        assumptions.append(f"{used}, measured on the clamped part, replaces {replaced}: "
                           "taken as is, not amplified by the design's natural frequencies")
        assumptions.extend(notes)
        vibration = Vibration(level=level, frequency=frequency, measured_on="clamped-part")
    if vibration.level is not None:
        level = vibration.level
        quantity, reading = level.quantity, level.reading
        stated = level.amount.high
        shown = level.text
        if not level.reading_stated:
            assumptions.append(f"the level '{level.text}' is read as {reading.upper()} "
                               f"(not stated; the default for a {quantity})")
        if level.amount.has_tolerance:
            assumptions.append(f"the top of the level's band is used, {level.text}")
    else:
        group = vibration.machine_group or ASSUMED_MACHINE_GROUP
        if vibration.support_type is not None:
            support, why = vibration.support_type, "as stated"
        else:
            support, why = _support_type(design, modes)
        stated = zone_boundaries(group, support)[1]
        quantity, reading = "velocity", "rms"
        shown = f"{stated * 1e3:.2g} mm/s RMS"
        group_text = (f"group {group}" if vibration.machine_group else
                      f"group {group} (assumed: the higher boundaries; state 'machine-group')")
        assumptions.append(
            f"no vibration level is given: the upper boundary of zone B of ISO 10816-3, "
            f"{shown}, for {group_text} on a {support} support ({why}) is taken")
    peak = float(harmonic_amplitude(stated, reading, "peak"))
    if vibration.frequency is not None:
        low, high = vibration.frequency.low, vibration.frequency.high
        where = f"at {vibration.frequency.text}"
    else:
        low, high = speed.min.value, speed.max.value
        where = "at running speed"
    if low == high:
        frequencies = np.array([low])
    else:
        frequencies = np.geomspace(low, high, _GRID)
    if vibration.level is None:
        where_measured = "bearing-housing"
        assumptions.append(
            "the ISO 10816-3 zone boundary is a bearing-housing level of the machine as "
            "installed, with its response on its support in it: taken as the clamped part's "
            "level, not amplified again")
    elif vibration.measured_on is None:
        where_measured = "support"
    else:
        where_measured = vibration.measured_on
        if where_measured != "support" and not used:
            what = ("on the clamped part" if where_measured == "clamped-part" else
                    "on the machine's bearing housings, the machine's own response")
            assumptions.append(f"the level was measured {what}: taken as is, not amplified "
                               "by the design's natural frequencies")
    amplify = where_measured == "support"
    damped = [(mode, *_mode_damping(design, mode)) for mode in modes] if amplify else []
    extra = []
    for mode, zeta, _ in damped:
        r_peak = float(resonance_peak_viscous(zeta)[0])
        for fn in (mode.low, mode.high, mode.nominal):
            f_peak = r_peak * fn
            if low <= f_peak <= high:
                extra.append(f_peak)
    frequencies = np.sort(np.concatenate([frequencies, np.array(extra, dtype=float)]))
    frequencies = frequencies[np.concatenate(([True], np.diff(frequencies) != 0))]
    omega = 2 * np.pi * frequencies
    if quantity == "velocity":
        base = omega * peak
    elif quantity == "displacement":
        base = omega**2 * peak
    else:
        base = np.full_like(frequencies, peak)
    best_gain = np.ones_like(frequencies)
    best_mode = np.full(frequencies.shape, -1)
    for number, (mode, zeta, _) in enumerate(damped):
        r_peak = float(resonance_peak_viscous(zeta)[0])
        # The natural frequency inside its band that brings r closest to the peak.
        fn = np.clip(frequencies / r_peak, mode.low, mode.high)
        gain = transmissibility_viscous(frequencies / fn, zeta)
        better = gain > best_gain
        best_gain = np.where(better, gain, best_gain)
        best_mode = np.where(better, number, best_mode)
    design_level = base * best_gain
    pick = int(np.argmax(design_level))
    frequency = float(frequencies[pick])
    gain = float(best_gain[pick])
    if low != high and quantity != "acceleration":
        assumptions.append(f"the level holds over the whole band {_hz(low)} to {_hz(high)}; "
                           f"the largest load is at {_hz(frequency)}")
    mode_name = ""
    if best_mode[pick] >= 0:
        mode, zeta, why = damped[int(best_mode[pick])]
        mode_name = mode.name
        damping_text = why if why else f"damping ratio {zeta:g} as given"
        assumptions.append(
            f"the vibration is amplified x{_num(gain)} by {mode.name} ({_hz(mode.low)}"
            + ("" if mode.low == mode.high else f" to {_hz(mode.high)}")
            + f"; {damping_text}): one-degree-of-freedom base-excitation transmissibility")
    elif not modes and amplify:
        assumptions.append("no natural frequency of the design is known: the vibration is "
                           "taken as not amplified")
    if amplify and vibration.level is not None and vibration.measured_on is None:
        assumptions.append("where the level was measured is not stated: taken as on the "
                           "support under the joint and amplified by the design's natural "
                           "frequencies (the cautious side); state measured-on = "
                           "\"clamped-part\" if it was measured on the part the joint holds")
    if quantity == "acceleration" and vibration.frequency is None and gain <= 1:
        where = ""  # an acceleration needs no frequency unless a mode amplifies it
    described = (f"{shown} {where}" if vibration.level is None else f"'{shown}' {where}").strip()
    if used:
        described = f"{used}, {described}"
    return VibrationLoad(
        acceleration=float(design_level[pick]), frequency=frequency,
        base_acceleration=float(base[pick]), amplification=gain, mode=mode_name,
        described=described, assumptions=tuple(assumptions), measurement=used)


def measured_clamped_part(design, joint):
    """The [[measurement]] on this joint's clamped part, as a vibration level.

    Returns None when there is none, else ``(label, level, frequency, notes)``: the
    measurement's name for the finding, a
    :class:`~vcheck.design.joints.VibrationLevel`, its frequency (an Amount, or None for
    running speed) and the assumptions made in reading it. With several measurements on
    the same clamped part, the one with the largest peak acceleration at its frequency
    is taken (the cautious side). A spectrum becomes one sinusoid: the peak of its
    overall RMS acceleration (Parseval) at the frequency of its largest acceleration line.
    """
    import numpy as np

    from vcheck.design.joints import VibrationLevel
    from vcheck.design.measurements import joint_index, measurement_spectrum
    from vcheck.design.units import Amount
    from vcheck.dynamics.measured import band_rms_from_spectrum
    from vcheck.dynamics.vibration_level import (
        acceleration_from_displacement,
        acceleration_from_velocity,
        harmonic_amplitude,
    )

    try:
        number = design.joint.index(joint)
    except ValueError:
        return None
    candidates = []
    for index, measurement in enumerate(design.measurement):
        if measurement.location != "clamped-part" or \
                joint_index(design, measurement.joint) != number:
            continue
        label = measurement.label(index)
        quantity, reading = measurement.quantity, measurement.reading_used
        notes: list[str] = []
        if measurement.spectrum is None:
            amount = measurement.amount
            level = VibrationLevel(quantity, Amount(amount.value, amount.value, amount.value,
                                                    measurement.value.strip()),
                                   reading, True)
            frequency = measurement.frequency
            if measurement.reading is None:
                notes.append(f"{label} is read as {reading.upper()} (not stated; the default "
                             f"for a {quantity})")
            if measurement.band is not None:
                notes.append(f"{label} is a broadband reading over {measurement.band.min.text}"
                             f" to {measurement.band.max.text}, taken as one sinusoid at "
                             "running speed")
            hz = frequency.value if frequency is not None else design.machine.speed.max.value
        else:
            spectrum = measurement_spectrum(design, index)
            f = np.asarray(spectrum.frequency)
            keep = f > 0
            f, a = f[keep], harmonic_amplitude(np.asarray(spectrum.amplitude)[keep], reading,
                                               "peak")
            if quantity == "velocity":
                a = acceleration_from_velocity(a, f)
            elif quantity == "displacement":
                a = acceleration_from_displacement(a, f)
            rms = band_rms_from_spectrum(f, a, 0.0, float(f[-1]), reading="peak",
                                         window=measurement.spectrum.window)
            peak = float(harmonic_amplitude(rms, "rms", "peak"))
            hz = float(f[int(np.argmax(a))])
            text = f"{peak:.3g} m/s^2 peak"
            level = VibrationLevel("acceleration", Amount(peak, peak, peak, text), "peak", True)
            frequency = Amount(hz, hz, hz, f"{hz:g} Hz")
            notes.append(f"{label} is the spectrum {spectrum.file}: overall RMS acceleration "
                         f"{rms:.3g} m/s^2 over its lines (Parseval, "
                         f"{measurement.spectrum.window} window), taken as one sinusoid of "
                         f"peak {peak:.3g} m/s^2 at its largest line, {hz:g} Hz")
        value = float(harmonic_amplitude(level.amount.value, level.reading, "peak"))
        if level.quantity == "velocity":
            value = float(acceleration_from_velocity(value, hz))
        elif level.quantity == "displacement":
            value = float(acceleration_from_displacement(value, hz))
        candidates.append((value, index, label, level, frequency, notes))
    if not candidates:
        return None
    candidates.sort(key=lambda item: (-item[0], item[1]))
    _, _, label, level, frequency, notes = candidates[0]
    if len(candidates) > 1:
        notes = [*notes, f"{len(candidates)} measurements on this clamped part: the largest "
                 f"acceleration, {label}, is used"]
    return label, level, frequency, tuple(notes)


class JointMachineLoad(Record):
    """The machine's own forces and moments as one joint's bolts carry them, SI.

    ``transverse_*`` are joint totals that give the most loaded bolt's share when divided
    equally among the bolts [N]; ``axial_*`` are the largest tension of one bolt [N].
    ``alternating`` loads are amplitudes of the harmonic loads at their largest over the
    speed range, added over the sources; ``static`` loads are the steady ones.
    """

    transverse_alternating: float = 0.0
    transverse_static: float = 0.0
    axial_alternating: float = 0.0
    axial_static: float = 0.0
    carried: bool = False
    unshared: tuple[str, ...] = ()
    assumptions: tuple[str, ...] = ()
    described: str = ""
    missing: str = ""


def _peak_length(vector) -> float:
    from vcheck.dynamics.isolation.forced_response import peak_vector_magnitude

    return float(peak_vector_magnitude(vector))


def machine_load_at_joint(design, joint) -> JointMachineLoad:
    """Resolve the machine's loads into the joint plane and share them among the bolts.

    The joint plane is square to the bolt axis (vertical by default). A load's force
    across the plane is shared equally by the bolts; its moment about the bolt pattern's
    centroid is split into the part about the bolt axis (twisting, shared as transverse
    forces in proportion to each bolt's distance from the centroid) and the part in the
    plane (bending, shared as bolt tensions in proportion to the distance from the
    bending axis). Without ``bolt-positions`` a moment cannot be shared and is named.
    Harmonic loads are taken at their largest over the speed range; different sources
    are added as if in phase, the cautious side.
    """
    import numpy as np

    loads = analyse(design).loads
    if joint.machine_loads == "not-carried":
        return JointMachineLoad()
    missing = _missing_machine_loads(design, loads)
    if loads is None or not (loads.harmonic or loads.static):
        return JointMachineLoad(missing=missing)
    axis = np.array(joint.bolt_axis.as_tuple() if joint.bolt_axis is not None else
                    (0.0, 0.0, 1.0))
    axis = axis / np.linalg.norm(axis)
    n = joint.count
    positions = np.array([b.as_tuple() for b in joint.bolt_positions]) if \
        joint.bolt_positions else None
    centre = positions.mean(axis=0) if positions is not None else None
    speed = design.machine.speed
    totals = {"alternating": [0.0, 0.0], "static": [0.0, 0.0]}
    unshared: list[str] = []
    parts: list[str] = []
    for kind, group in (("alternating", loads.harmonic), ("static", loads.static)):
        for load in group:
            scale = 1.0
            if kind == "alternating" and load.exponent:
                scale = max(load.scale_at(speed.min.value), load.scale_at(speed.max.value))
            force = np.asarray(load.force, dtype=complex) * scale
            moment = np.asarray(load.moment, dtype=complex) * scale
            along = complex(force @ axis)
            across = force - axis * along
            transverse = _peak_length(across) / n  # the share of one bolt
            tension = abs(along) / n  # a force along the bolts, shared equally
            if centre is not None:
                arm = np.asarray(load.point, dtype=float) - centre
                moment = moment + np.cross(arm, force)
            twist = moment @ axis
            bend = moment - axis * twist
            twist_size = abs(complex(twist))
            bend_size = _peak_length(bend)
            if positions is not None:
                offsets = positions - centre
                offsets = offsets - np.outer(offsets @ axis, axis)
                radii = np.linalg.norm(offsets, axis=1)
                polar = float(radii @ radii)
                if twist_size > 0 and polar > 0:
                    transverse += twist_size * float(radii.max()) / polar
                elif twist_size > 0:
                    unshared.append(f"the twisting moment of {load.name} (the bolts stand "
                                    "on one point)")
                if bend_size > 0:
                    p_, q_ = np.real(bend), np.imag(bend)
                    worst = 0.0
                    for direction in (p_, q_, p_ + q_, p_ - q_):
                        size = np.linalg.norm(direction)
                        if size == 0:
                            continue
                        unit = direction / size
                        arms = np.cross(unit, offsets) @ axis
                        second = float(arms @ arms)
                        if second > 0:
                            worst = max(worst, float(np.abs(arms).max()) / second)
                        else:
                            worst = math.inf
                    tension += bend_size * worst
            elif twist_size > 0 or bend_size > 0:
                size = max(twist_size, bend_size)
                unshared.append(f"the moment of {load.name} ({size / 1000:.3g} kN*m)")
            totals[kind][0] += transverse * n
            totals[kind][1] += tension
            if transverse or tension:
                parts.append((load.name, transverse * n, tension))
    largest = max((max(a, t) for _, a, t in parts), default=0.0)
    small = [name for name, a, t in parts if max(a, t) < 0.01 * largest]
    parts = [f"{name} {_kn(a)} across" + (f", {_kn(t)} tension in the most loaded bolt"
                                          if t else "")
             for name, a, t in parts if max(a, t) >= 0.01 * largest]
    if small:
        parts.append(f"{', '.join(small)} below 1% of that (counted)")
    assumptions = []
    if joint.machine_loads is None:
        assumptions.append("the machine's own loads are taken to pass through this joint "
                           "(machine-loads not given; state machine-loads = \"not-carried\" "
                           "where they do not)")
    if parts:
        assumptions.append("machine loads at this joint: " + "; ".join(parts) + " (different "
                           "sources added as if in phase, each at its largest over the speed "
                           "range)")
    if positions is None:
        assumptions.append("the machine's forces across the joint are shared equally by the "
                           "bolts")
    else:
        assumptions.append("the machine's moments are shared by the bolt pattern about its "
                           "centroid: twisting in proportion to each bolt's distance, bending "
                           "as bolt tension in proportion to the distance from the bending "
                           "axis")
    described = "; ".join(parts)
    return JointMachineLoad(
        transverse_alternating=totals["alternating"][0], transverse_static=totals["static"][0],
        axial_alternating=totals["alternating"][1], axial_static=totals["static"][1],
        carried=True, unshared=tuple(unshared), assumptions=tuple(assumptions),
        described=described, missing=missing)


def _missing_machine_loads(design, loads) -> str:
    """Words for machine loads a joint must carry that the design does not give."""
    machine = design.machine
    if not machine.cylinders:
        return ""
    known = loads is not None and any(load.source in ("crank", "stated")
                                      for load in loads.harmonic)
    if known:
        return ""
    return ("the free forces and moments of this reciprocating machine are not known, so "
            "they are not in the transverse load: give [machine.crank] or the maker's "
            "[[machine.load]] tables, or machine-loads = \"not-carried\" for a joint they do "
            "not pass through")


def screen_joint(design, index: int) -> JointScreening:
    """Preload, clamp load, loads, slip, fatigue and yield of ``design.joint[index]``."""
    from vcheck.design.joints import TIGHTENING_METHODS, default_clamp_length, default_hole_diameter
    from vcheck.dynamics.joints import preload as vdi
    from vcheck.dynamics.joints.bolt_materials import yield_load

    joint = design.joint[index]
    thread, material = joint.thread, joint.material
    tightening = joint.tightening
    n = joint.count
    d, d3 = thread.nominal_diameter, thread.minor_diameter
    label = f"{joint.name}, {n} x {thread.designation} {material.name}"
    notes: dict[str, list[str]] = {"preload": [], "clamp": [], "load": [], "fatigue": []}
    implausible = []

    from vcheck.design.joints import DEFAULT_FRICTION_CLASS, friction_class_band

    def band(given, what, key):
        if given is not None:
            for value in {given.low, given.high}:
                if not vdi.friction_plausible(value):
                    implausible.append((key, value))
            return given, (f"{what} {given.shown()} as given" if given.is_band else
                           f"{what} {given.low:g} as given (one value: no band)")
        name = joint.friction_class or DEFAULT_FRICTION_CLASS
        chosen = friction_class_band(name)
        why = ("the joint's friction-class" if joint.friction_class else
               "not given; the default, from memory")
        return chosen, f"{what} {chosen.shown()}, VDI 2230 friction class {name} ({why})"

    method = tightening.method
    alpha = vdi.tightening_factor(TIGHTENING_METHODS[method], "high")
    torsion = 0.0 if method == "hydraulic-tensioner" else 1.0
    band_g, why_g = band(joint.thread_friction, "thread friction", "thread-friction")
    band_k, why_k = band(joint.head_friction, "head friction", "head-friction")
    if joint.interface_friction is None:
        mu_t = ASSUMED_INTERFACE_FRICTION
        notes["clamp"].append(f"interface friction {mu_t:g} (not given; EN 1090-2 class D, "
                              "untreated surfaces, from memory)")
    else:
        mu_t = joint.interface_friction
        if not vdi.friction_plausible(mu_t):
            implausible.append(("interface-friction", mu_t))
    hole = (joint.hole_diameter.value if joint.hole_diameter is not None
            else default_hole_diameter(thread))
    dw = thread.head_bearing_diameter
    dkm = float(vdi.head_friction_diameter(dw, hole))
    if thread.series in ("UNC", "UNF"):
        notes["clamp"].append("the bearing face of an inch hex head is taken as its width "
                              "across flats (an upper estimate)")
    if joint.hole_diameter is None:
        source = ("ISO 273 medium" if thread.clearance_hole_diameter is not None
                  else "1.1 d, the ratio of ISO 273 medium holes")
        notes["clamp"].append(f"clearance hole {hole * 1e3:.3g} mm ({source})")

    # -- preload: the low end of the friction band gives the largest preload of a torque
    # (the yield check), the high end the least (the slip and clamp checks)
    stress_diameter = thread.stress_diameter
    strength = material.yield_strength_min
    preload_by_alpha = preload_by_friction = math.nan
    if band_g == band_k and why_g.replace("thread friction", "") == \
            why_k.replace("head friction", ""):
        friction_note = why_g.replace("thread friction", "thread and head friction")
    else:
        friction_note = f"{why_g}; {why_k}"
    if tightening.torque is not None and tightening.nut_factor is None:
        torque = tightening.torque
        geometry = (thread.pitch, thread.pitch_diameter, dkm)
        top = float(vdi.preload_from_torque_vdi2230(torque.high, *geometry, band_g.low,
                                                    band_k.low))
        preload_by_alpha = float(vdi.preload_from_torque_vdi2230(
            torque.low, *geometry, band_g.low, band_k.low)) / alpha
        preload_by_friction = float(vdi.preload_from_torque_vdi2230(
            torque.low, *geometry, band_g.high, band_k.high))
        least = min(preload_by_alpha, preload_by_friction)
        if band_g.is_band or band_k.is_band:
            notes["preload"].append(
                f"{friction_note}: the low end sets the largest preload (yield), the high end "
                "the least (slip), VDI 2230 R13")
            which = ("the largest / alpha_A" if preload_by_alpha <= preload_by_friction
                     else "the preload at the top of the friction band")
            notes["preload"].append(
                f"least preload {_kn(least)}: the lower of the largest / alpha_A "
                f"({_kn(preload_by_alpha)}) and the preload at the top of the friction band "
                f"({_kn(preload_by_friction)}), here {which}")
        else:
            notes["preload"].append(f"{friction_note}, for both the largest and the least "
                                    "preload")
        governing_mu = band_g.low
        source = f"{torque.text}"
    elif tightening.torque is not None:
        torque, k = tightening.torque, tightening.nut_factor
        least = float(vdi.preload_bounds_from_mean(
            vdi.preload_from_torque_nut_factor(torque.low, d, k), alpha)[0])
        top = float(vdi.preload_bounds_from_mean(
            vdi.preload_from_torque_nut_factor(torque.high, d, k), alpha)[1])
        notes["preload"].append(f"T = K F d with nut factor {k:g} gives the mean preload "
                                "(Budynas-Nisbett, from memory)")
        notes["preload"].append(f"{why_g}; its high end {band_g.high:g} for the thread "
                                "torsion at assembly (the most torsion)")
        governing_mu = band_g.high
        source = f"{torque.text}, nut factor {k:g}"
    else:
        stated = tightening.preload
        least = float(vdi.preload_bounds_from_mean(stated.low, alpha)[0])
        top = float(vdi.preload_bounds_from_mean(stated.high, alpha)[1])
        if torsion:
            notes["preload"].append(f"{why_g}; its high end {band_g.high:g} for the thread "
                                    "torsion at assembly (the most torsion)")
        governing_mu = band_g.high
        source = f"a stated mean preload of {stated.text}"
    notes["preload"].append(
        f"tightening factor {alpha:g} for {method} (the high end of VDI 2230 Table A8, from "
        f"memory): least preload = largest / {alpha:g}"
        + (", or less at the top of the friction band" if not math.isnan(preload_by_friction)
           and (band_g.is_band or band_k.is_band) else ""))
    mu_g, mu_k = governing_mu, band_k.low
    requested_top = top
    if torsion:
        yield_preload = float(vdi.permissible_assembly_preload_vdi2230(
            thread.pitch, thread.pitch_diameter, stress_diameter, strength, mu_g, 1.0))
    else:
        yield_preload = math.pi / 4 * stress_diameter**2 * strength
    utilisation = float(vdi.assembly_stress_vdi2230(
        top, thread.pitch, thread.pitch_diameter, stress_diameter, mu_g,
        torsion_factor=torsion)) / strength
    if top > yield_preload:
        top = yield_preload
        least = min(least, yield_preload)
        for group in ("clamp", "fatigue"):
            notes[group].append(f"the tightening yields the bolt: the preload is taken as "
                                f"at most the yield preload {_kn(yield_preload)}")

    # -- resilience, load factor, embedding
    clamp = (joint.clamp_length.value if joint.clamp_length is not None
             else default_clamp_length(thread))
    if joint.clamp_length is None:
        notes["clamp"].append(f"clamp length 2 d = {clamp * 1e3:.3g} mm (not given; a short "
                              "grip loses the most preload to embedding)")
    shank = joint.shank_length.value if joint.shank_length is not None else clamp
    if joint.shank_length is None:
        notes["clamp"].append("plain shank through the whole clamp length (not given; the "
                              "stiffest bolt, the cautious side)")
    stainless = material.name.startswith(("A2", "A4"))
    bolt_modulus = STAINLESS_MODULUS if stainless else STEEL_MODULUS
    delta_s = float(vdi.bolt_resilience_vdi2230(
        clamp, shank, d, d3, bolt_modulus, head="hex-head", engagement=joint.engagement))
    part_modulus = (joint.clamped_modulus.value if joint.clamped_modulus is not None
                    else STEEL_MODULUS)
    if joint.clamped_modulus is None:
        notes["clamp"].append("clamped parts of steel, E = 205 GPa")
    kind = "through" if joint.engagement == "nut" else "tapped"
    if joint.clamped_width is not None:
        delta_p = float(vdi.clamped_part_resilience_vdi2230(
            clamp, dw, hole, joint.clamped_width.value, part_modulus, joint=kind))
    else:
        w = 1.0 if kind == "through" else 2.0
        outside = dw + w * clamp * ASSUMED_CONE_TANGENT
        delta_p = float(vdi.clamped_part_resilience_vdi2230(
            clamp, dw, hole, outside, part_modulus, joint=kind,
            cone_tangent=ASSUMED_CONE_TANGENT))
        notes["clamp"].append("wide clamped parts: a whole pressure cone of 30 degrees "
                              "half-angle (no clamped width given; Shigley, from memory)")
    phi = float(vdi.load_factor(delta_s, delta_p, 1.0))
    if joint.surface_roughness is not None:
        roughness = joint.surface_roughness.value
    else:
        roughness = ASSUMED_ROUGHNESS
        notes["clamp"].append("faces of roughness Rz 40 to 160 um for embedding (not given; "
                              "the roughest class of VDI 2230 Table 5)")
    faces = 2 if joint.engagement == "nut" else 1
    embedding = vdi.embedding_amount_vdi2230(
        roughness, faces, joint.clamped_parts - 1, load="transverse")
    embedding_loss = float(vdi.preload_loss_embedding(embedding, delta_s, delta_p))

    # -- slip
    machine = machine_load_at_joint(design, joint)
    axial = joint.axial_load.high / n if joint.axial_load is not None else 0.0
    axial += machine.axial_static
    if axial or machine.axial_alternating:
        notes["clamp"].append("the whole axial load relieves the interface (load factor "
                              "taken as 0 for the clamp load, the cautious side)")
    residual = float(vdi.residual_clamp_load(least, embedding_loss, 0.0,
                                             axial + machine.axial_alternating))
    q = joint.shear_interfaces
    capacity = max(residual, 0.0) * q * mu_t * n
    load = vibration_load(design, joint)
    mass = joint.clamps.high
    if joint.clamps.has_tolerance:
        notes["load"].append(f"the top of the mass band is used, {joint.clamps.text}")
    notes["load"].extend(load.assumptions)
    notes["load"].append("the whole vibration acts across the joint for slip and along the "
                         "bolts for fatigue, each the worst direction for its check")
    notes["load"].extend(machine.assumptions)
    static = joint.transverse_load.high if joint.transverse_load is not None else 0.0
    static += machine.transverse_static
    transverse = mass * load.acceleration + machine.transverse_alternating + static
    slip = float(vdi.slip_safety(residual, transverse, mu_t, q, n))

    # -- fatigue
    alternating = mass * load.acceleration / n + machine.axial_alternating
    open_clamp = least - embedding_loss - (1.0 - phi) * (axial + alternating)
    opens = open_clamp <= 0
    share = 1.0 if opens else phi
    force_amplitude = float(vdi.bolt_force_amplitude(share, axial + alternating,
                                                     axial - alternating))
    unclamped = least - embedding_loss - (1.0 - phi) * axial <= 0
    if opens and unclamped:
        notes["fatigue"].append("no clamp load is left after embedding (and any static "
                                "axial load): the bolt carries the whole alternating load")
    elif opens:
        notes["fatigue"].append("the joint opens under the axial vibration: the bolt "
                                "carries the whole alternating load")
    else:
        notes["fatigue"].append(f"load factor {phi:.3g} with the load brought in under head "
                                "and nut (n = 1, the largest share into the bolt)")
    area = thread.stress_area
    amplitude = float(vdi.bolt_stress_amplitude(force_amplitude, area))
    rolled = joint.thread_rolled or "before-heat-treatment"
    if joint.thread_rolled is None:
        notes["fatigue"].append("thread rolled before heat treatment (not given; the usual "
                                "bolt and the lower endurance limit)")
    limit = float(vdi.endurance_limit_rolled_before_heat_treatment(d))
    if rolled == "after-heat-treatment":
        mean = top + phi * axial
        f02 = float(yield_load(strength, area))
        if mean < f02:
            limit = float(vdi.endurance_limit_rolled_after_heat_treatment(d, mean, f02))
        else:
            notes["fatigue"].append("the mean bolt force reaches yield: the benefit of "
                                    "rolling after heat treatment is not counted")
    if material.name not in _HIGH_STRENGTH:
        notes["fatigue"].append(f"the VDI 2230 endurance limit, stated for high-strength "
                                f"steel bolts (8.8 to 12.9), is applied to {material.name}")
    fatigue = float(vdi.fatigue_safety(amplitude, limit))
    return JointScreening(
        index=index, name=joint.name, label=label, count=n, method=method, alpha=alpha,
        preload_min=least, preload_max=top, preload_max_requested=requested_top,
        yield_preload=yield_preload, utilisation=utilisation, yield_strength=strength,
        torsion_factor=torsion, friction_thread=mu_g, friction_head=mu_k,
        thread_friction_band=(band_g.low, band_g.high), head_friction_band=(band_k.low, band_k.high),
        preload_min_by_alpha=preload_by_alpha, preload_min_by_friction=preload_by_friction,
        friction_interface=mu_t, head_friction_diameter=dkm, bolt_resilience=delta_s,
        part_resilience=delta_p, load_factor=phi, embedding=embedding,
        embedding_loss=embedding_loss, axial_load=axial, residual_clamp=residual,
        shear_interfaces=q, capacity=capacity, load=load, mass=mass,
        transverse_static=static, transverse_load=transverse, slip_safety=slip,
        force_amplitude=force_amplitude, stress_area=area, stress_amplitude=amplitude,
        endurance_limit=limit, rolled=rolled, fatigue_safety=fatigue, opens=opens,
        unclamped=opens and unclamped,
        assumptions={key: tuple(value) for key, value in notes.items()},
        implausible=tuple(implausible), tightening=source, machine=machine,
    )


def _status(value: float, required: float, warn: float) -> Status:
    if value < required * (1 - _TOLERANCE):
        return Status.FAIL
    if value < warn * (1 - _TOLERANCE):
        return Status.WARN
    return Status.PASS


def _last_value_line(design):
    """The line of the design's last value, None for a design without positions."""
    positions = getattr(design, "_positions", None) or {}
    return max((p.value_line for p in positions.values()), default=None)


def _at_end(finding, design):
    """The finding placed on the last line of the design, where [[joint]] tables go."""
    last = shared(design, "last-value-line", _last_value_line)
    return _finding_with(finding, line=max(last, finding.line) if last is not None else finding.line,
                         column=1)


def _screenings(design):
    """Every joint of the design screened once, shared by the three fastener rules."""
    from vcheck.analysis import shared

    return shared(design, "joint-screenings", _screen_all)


def _screen_all(design) -> tuple[JointScreening, ...]:
    return tuple(screen_joint(design, index) for index in range(len(design.joint)))


def _all(joint: JointScreening, *groups: str) -> list[str]:
    out: list[str] = []
    for group in groups:
        out += [item for item in joint.assumptions.get(group, ()) if item not in out]
    return out


def _plural(number: int, noun: str) -> str:
    return f"{number} {noun}" + ("" if number == 1 else "s")


def _band_text(joint: JointScreening) -> str:
    """How a friction band set the least preload of a torque, "" without a band."""
    (g_low, g_high), (k_low, k_high) = joint.thread_friction_band, joint.head_friction_band
    if math.isnan(joint.preload_min_by_friction) or (g_low == g_high and k_low == k_high):
        return ""
    band = (f"{g_low:g} to {g_high:g}" if (g_low, g_high) == (k_low, k_high) else
            f"thread {g_low:g} to {g_high:g}, head {k_low:g} to {k_high:g}")
    return (f", friction {band}: the lower of the largest "
            f"{_kn(joint.preload_max_requested)} / {joint.alpha:g} and "
            f"{_kn(joint.preload_min_by_friction)} at the top of the band")


def _acceleration(load: VibrationLoad) -> str:
    text = f"{load.acceleration / _G:.3g} g peak" if math.isfinite(load.acceleration) \
        else "an unbounded acceleration"
    if load.amplification > 1:
        text += f", amplified x{_num(load.amplification)}"
    return text


# ---------------------------------------------------------------------- joint slip

FRICTION_RANGE = Source(
    "plausible friction coefficients 0.04 to 0.5: from the low end of VDI 2230 friction "
    "class A (from memory) to dry unlubricated stainless or galvanised parts (common "
    "practice)", "from memory")

SLIP_REMEDIES = (
    "more preload raises the friction capacity and stops the slip itself: a controlled "
    "method (torque wrench with the friction measured on the parts, tightening factor 1.4 "
    "to 1.6; hydraulic tensioner; ultrasonic elongation) raises the least preload by "
    "narrowing its scatter; more torque helps only up to the bolt's yield (VDI 2230 Part 1 "
    "Table A8, from memory)",
    "more or larger bolts, or a higher property class tightened to suit, add clamp load in "
    "proportion and stop the slip itself",
    "a higher-friction interface stops the slip itself: blasted faces or friction shims "
    "(EN 1090-2 slip classes A 0.5 to D 0.2, from memory); paint, oil and shim stacks lower "
    "the friction",
    "a shear feature (dowel pins, fitted bolts, a shear key or a stop) takes the transverse "
    "load by shape, so the joint cannot slip; the bolts then only clamp",
    "a locking element does not stop the slip: it acts on the nut's rotation. Adhesive "
    "thread locking and wedge-locking washers resist the turning back; a prevailing-torque "
    "nut (nylon insert or all-metal) keeps the nut on the bolt but not the preload; split "
    "spring washers and toothed washers give no security against self-loosening "
    "(transverse vibration tests after Junker, SAE 690055, 1969, DIN 65151 and ISO 16130; "
    "the findings on kinds of element from memory)",
)
"""What each remedy for a slipping joint does and does not do, with its source."""


class SlipOptions(RuleOptions):
    """Policy of the joint-slip rule."""

    required_slip_safety: float = Field(
        1.8, gt=0,
        description="Least safety against slipping, friction capacity over transverse load; "
        "below it the rule fails. Default 1.8: VDI 2230 Part 1 step R12 for alternating "
        "transverse load (from memory; 1.2 for static load).",
    )
    warn_slip_safety: float = Field(
        round(1.8 * ZONE_STEP, 2), gt=0,
        description="Slip safety below which the rule warns. Default 2.85 = 1.8 x 1.585: "
        "the joint still has 1.8 if the vibration rises by one ISO 10816-3 zone step (the "
        "boundaries follow the R5 preferred numbers, ratio 10^(1/5)); derived.",
    )

    @model_validator(mode="after")
    def _ordered(self) -> SlipOptions:
        if self.warn_slip_safety < self.required_slip_safety:
            raise ValueError(
                f"warn-slip-safety ({self.warn_slip_safety}) must not be below "
                f"required-slip-safety ({self.required_slip_safety})")
        return self


class JointSlip(Rule):
    """Bolted joints must not slip under the vibration, or they self-loosen.

    For every ``[[joint]]``: the least preload of the tightening method (torque or stated
    preload with the tightening factor of VDI 2230 Table A8, the high end), less the loss to
    embedding and any static axial load, is the least clamp load of each bolt. Its friction
    capacity, clamp load x interface friction x shear interfaces x bolts, is set against
    the transverse load: the clamped mass times the peak acceleration of the vibration
    level (stated, or the ISO 10816-3 zone B boundary), amplified where a natural
    frequency of the design is near the excitation, plus the machine's own forces and
    moments where the joint carries them (``machine-loads``; cautiously yes by default),
    shared by the bolts (equally for forces; by the bolt pattern about its centroid for
    moments, when ``bolt-positions`` are given), plus any static transverse load.

    Which reading it takes: the least preload is the largest (from the torque at the low
    end of the thread and head friction band; VDI 2230 class B, 0.08 to 0.16, when the
    joint gives none) divided by the tightening factor, or the preload the torque gives at
    the top of the band if that is lower. A vibration level ``measured-on`` the clamped
    part or the bearing housings is taken as is; on the support (the default for a stated
    level, the cautious side) it is amplified by the design's natural frequencies; the ISO
    10816-3 zone default is a bearing-housing level and is not amplified again.

    Fails when that slip safety is below ``required-slip-safety`` (1.8, VDI 2230 for
    alternating transverse load); warns below ``warn-slip-safety`` (2.85, one ISO 10816-3
    zone step above); passes otherwise. Warns also on a friction coefficient outside the
    plausible range 0.04 to 0.5, when a machine moment cannot be shared for want of
    bolt positions, and when a reciprocating machine's free forces are not given (no
    ``[machine.crank]`` or stated loads). Advice says what each remedy does and does not do. A
    design without ``[[joint]]`` tables is reported as not checked.

    Limits of validity: a concentric joint of equal bolts sharing the load equally, the
    vibration of one frequency at a time over the running speeds (start-up and run-down
    through the isolation resonance are for ``isolation-resonance-passage``), the
    amplification of a one-degree-of-freedom base-excited mode; bending of the joint and
    prying are not included.
    """

    id = "joint-slip"
    title = "Bolted joints hold against slip under vibration"
    applies_to = "joint"
    sources = (VDI_SLIP, JUNKER, VDI_PRELOAD, ISO_10816, ZONE_BAND, FRICTION_RANGE)
    Options = SlipOptions

    def check(self, design, options: SlipOptions):
        if not design.joint:
            yield _at_end(self.finding(
                design, ("joint",), Status.NOT_CHECKED,
                "no [[joint]] tables: bolted joints not screened",
                sources=(VDI_SLIP, JUNKER)), design)
            return
        required, warn = options.required_slip_safety, options.warn_slip_safety
        for joint in _screenings(design):
            yield self._slip(design, joint, required, warn)
            for key, value in joint.implausible:
                what = key.replace("-", " ")
                yield self.finding(
                    design, ("joint", joint.index, key), Status.WARN,
                    f"{joint.label}: {what} {value:g} is outside the plausible range 0.04 "
                    "to 0.5; check the value and where it comes from",
                    quantities=[computed(what, value, "1", joint=joint.label)],
                    measured=Measure(what, value, ""),
                    limit=Measure("plausible range top" if value > 0.5 else
                                  "plausible range bottom", 0.5 if value > 0.5 else 0.04, ""),
                    sources=(FRICTION_RANGE,))

    def _slip(self, design, joint: JointScreening, required: float, warn: float):
        safety = joint.slip_safety
        status = _status(safety, required, warn)
        load = joint.load
        static = (f" + {_kn(joint.transverse_static)} static" if joint.transverse_static
                  else "")
        axial = f" - {_kn(joint.axial_load)} axial load" if joint.axial_load else ""
        head = (f"{joint.label}: slip safety {_safety(safety)}, {required:g} needed under "
                f"alternating transverse load (warn below {warn:g}); ")
        machine = joint.machine or JointMachineLoad()
        own = (f" + {_kn(machine.transverse_alternating)} from the machine's own loads"
               if machine.transverse_alternating else "")
        clamped = in_units_of(design.joint[joint.index].clamps, joint.mass, "kg")
        across = (f"{_kn(joint.transverse_load)} across the joint ({clamped} at "
                  f"{_acceleration(load)}, from {load.described}{own}{static})")
        if joint.residual_clamp > 0:
            message = head + (
                f"friction {joint.friction_interface:g} x "
                f"{_plural(joint.shear_interfaces, 'interface')} x "
                f"{_plural(joint.count, 'bolt')} x least clamp load "
                f"{_kn(joint.residual_clamp)} a bolt (least preload {_kn(joint.preload_min)}"
                f"{_band_text(joint)} "
                f"- {_kn(joint.embedding_loss)} lost to embedding{axial}) = {_kn(joint.capacity)} "
                f"against {across}")
        else:
            message = head + (
                f"no clamp load is left: least preload {_kn(joint.preload_min)} - "
                f"{_kn(joint.embedding_loss)} lost to embedding{axial} a bolt, so friction holds "
                f"nothing against {across}")
        advice: list[str] = []
        if (machine.unshared or machine.missing) and status is Status.PASS:
            status = Status.WARN
        if machine.missing:
            message += "; " + machine.missing
        if machine.unshared:
            message += ("; not shared among the bolts for want of bolt-positions: "
                        + ", ".join(machine.unshared))
            advice.append("give the joint's bolt-positions (one { x, y, z } per bolt, machine "
                          "axes) so that the machine's moments are shared by the bolt pattern")
        if status is not Status.PASS and safety < warn * (1 - _TOLERANCE):
            need = warn * joint.transverse_load / (
                joint.shear_interfaces * joint.friction_interface * joint.count)
            first = (f"to reach a slip safety of {warn:g} each bolt needs a least clamp load "
                     f"of {_kn(need)} (now {_kn(max(joint.residual_clamp, 0.0))})")
            if joint.residual_clamp > 0 and math.isfinite(need):
                bolts = math.ceil(joint.count * need / joint.residual_clamp * (1 - 1e-12))
                mu = joint.friction_interface * need / joint.residual_clamp
                first += f", or {bolts} bolts of this kind"
                first += (f", or an interface friction of {mu:.2g}" if mu < 1 else
                          "; no interface friction can do it alone")
            advice += [first, *SLIP_REMEDIES]
        return self.finding(
            design, ("joint", joint.index), status, message,
            quantities=_joint_quantities(joint, "slip"),
            measured=Measure("slip safety", round(safety, 6), ""),
            limit=Measure("required slip safety", required, ""),
            margin=round(safety - required, 6),
            assumptions=_all(joint, "preload", "clamp", "load"),
            advice=advice,
            sources=(VDI_SLIP, JUNKER, VDI_PRELOAD)
            + ((ISO_10816,) if not load.measurement and (
                design.joint[joint.index].vibration is None
                or design.joint[joint.index].vibration.level is None) else ())
            + ((ZONE_BAND,) if status is not Status.PASS else ()),
        )


# -------------------------------------------------------------------- bolt fatigue

FATIGUE_REMEDIES = (
    "a more elastic bolt (a longer clamp length with a sleeve, a reduced shank) lowers the "
    "load factor and with it the stress amplitude (VDI 2230 Part 1, from memory)",
    "a thread rolled after heat treatment raises the endurance limit by up to 1.7 times "
    "(VDI 2230 Part 1, step R9)",
    "more or larger bolts share the alternating load; more preload keeps the joint closed "
    "but does not lower the amplitude while it stays closed",
    "less vibration at its source (balance, alignment, a resonance moved away) lowers the "
    "load itself",
)
"""What each remedy for bolt fatigue does."""


class BoltFatigueOptions(RuleOptions):
    """Policy of the joint-bolt-fatigue rule."""

    required_fatigue_safety: float = Field(
        1.2, gt=0,
        description="Least safety against bolt fatigue, endurance limit over stress "
        "amplitude; below it the rule fails. Default 1.2: VDI 2230 Part 1 step R9 (from "
        "memory).",
    )
    warn_fatigue_safety: float = Field(
        round(1.2 * ZONE_STEP, 2), gt=0,
        description="Fatigue safety below which the rule warns. Default 1.9 = 1.2 x 1.585: "
        "one ISO 10816-3 zone step of vibration above the limit; derived.",
    )

    @model_validator(mode="after")
    def _ordered(self) -> BoltFatigueOptions:
        if self.warn_fatigue_safety < self.required_fatigue_safety:
            raise ValueError(
                f"warn-fatigue-safety ({self.warn_fatigue_safety}) must not be below "
                f"required-fatigue-safety ({self.required_fatigue_safety})")
        return self


class JointBoltFatigue(Rule):
    """Bolts of a vibrating joint must stay below the endurance limit of their thread.

    For every ``[[joint]]``: the inertia force of the clamped mass (peak acceleration of
    the vibration level, amplified near natural frequencies, as for ``joint-slip``) is
    taken along the bolts and shared equally; the bolt takes the load-factor share of it
    (VDI 2230 resilience of bolt and clamped parts, load brought in under head and nut).
    Its stress amplitude on the stress area is set against the endurance limit of the
    thread, rolled before or after heat treatment (VDI 2230 step R9, 2 million cycles).

    The least preload and the vibration are read as for ``joint-slip`` (friction band,
    where the level was measured). The finding names why a joint carries the whole load:
    embedding (and any static axial load) taking the whole least preload, or the axial
    vibration opening the joint.

    Fails when the fatigue safety is below ``required-fatigue-safety`` (1.2) or when the
    joint is not held shut; warns below ``warn-fatigue-safety`` (1.9, one ISO
    10816-3 zone step above); passes otherwise. A design without joints gives no
    finding here (``joint-slip`` reports it as not checked).

    Limits of validity: a concentric joint, axial load only (no bending of the bolt), an
    endurance limit for high-strength steel bolts; cumulative damage of varying amplitudes
    is for the fatigue rules.
    """

    id = "joint-bolt-fatigue"
    title = "Bolts of vibrating joints below their endurance limit"
    applies_to = "joint"
    sources = (VDI_FATIGUE, VDI_FATIGUE_SAFETY, VDI_PRELOAD, ISO_10816, ZONE_BAND)
    Options = BoltFatigueOptions

    def check(self, design, options: BoltFatigueOptions):
        required, warn = options.required_fatigue_safety, options.warn_fatigue_safety
        for joint in _screenings(design):
            safety = joint.fatigue_safety
            status = Status.FAIL if joint.opens else _status(safety, required, warn)
            rolled = joint.rolled.replace("-", " ")
            share = "the whole" if joint.opens else f"load factor {joint.load_factor:.3g} x"
            own = joint.machine.axial_alternating if joint.machine is not None else 0.0
            message = (
                f"{joint.label}: bolt fatigue safety {_safety(safety)}, {required:g} needed "
                f"(warn below {warn:g}); stress amplitude "
                f"{joint.stress_amplitude / 1e6:.3g} MPa = {share} "
                f"{_kn(joint.mass * joint.load.acceleration / joint.count + own)} a bolt / "
                f"{joint.stress_area * 1e6:.3g} mm^2, against the endurance limit "
                f"{joint.endurance_limit / 1e6:.3g} MPa of a thread rolled {rolled} "
                f"({in_units_of(design.joint[joint.index].clamps, joint.mass, 'kg')} at "
                f"{_acceleration(joint.load)}, from "
                f"{joint.load.described}"
                + (f", + {_kn(own)} tension from the machine's own loads" if own else "")
                + ")")
            if joint.unclamped:
                lost = ("embedding takes the whole least preload" if not joint.axial_load
                        else "embedding and the static axial load take the whole least "
                        "preload")
                message = (f"{joint.label}: {lost} ({_kn(joint.preload_min)} - "
                           f"{_kn(joint.embedding_loss)} lost to embedding"
                           + (f" - {_kn(joint.axial_load)} axial" if joint.axial_load else "")
                           + "), so nothing clamps the joint; " + message.split(": ", 1)[1])
            elif joint.opens:
                message = f"{joint.label}: the axial vibration opens the joint; " + \
                    message.split(": ", 1)[1]
            yield self.finding(
                design, ("joint", joint.index, "fastener"), status, message,
                quantities=_joint_quantities(joint, "fatigue"),
                measured=Measure("fatigue safety", round(safety, 6), ""),
                limit=Measure("required fatigue safety", required, ""),
                margin=round(safety - required, 6),
                assumptions=_all(joint, "load", "clamp", "fatigue"),
                advice=FATIGUE_REMEDIES if status is not Status.PASS else (),
                sources=(VDI_FATIGUE, VDI_FATIGUE_SAFETY, VDI_PRELOAD)
                + ((ISO_10816,) if design.joint[joint.index].vibration is None
                   or design.joint[joint.index].vibration.level is None else ())
                + ((ZONE_BAND,) if status is not Status.PASS else ()),
            )


# ---------------------------------------------------------------------- bolt yield


class BoltYieldOptions(RuleOptions):
    """Policy of the joint-bolt-yield rule."""

    fail_utilisation: float = Field(
        1.0, gt=0, le=1.5,
        description="Largest share of the minimum yield strength that the equivalent stress "
        "at assembly may reach; above it the tightening yields the bolt and the rule fails. "
        "Default 1.0: the minimum yield strength of ISO 898-1 / SAE J429 / ISO 3506-1.",
    )
    warn_utilisation: float = Field(
        0.9, gt=0, le=1.5,
        description="Share above which the rule warns. Default 0.9: the utilisation VDI "
        "2230 Part 1 uses for its tables of permissible preload and torque (from memory). "
        "Not applied to yield- and angle-controlled tightening, which means to reach yield.",
    )

    @model_validator(mode="after")
    def _ordered(self) -> BoltYieldOptions:
        if self.warn_utilisation > self.fail_utilisation:
            raise ValueError(
                f"warn-utilisation ({self.warn_utilisation}) must not be above "
                f"fail-utilisation ({self.fail_utilisation})")
        return self


class JointBoltYield(Rule):
    """Tightening must not yield the bolts of a joint.

    For every ``[[joint]]``: the largest assembly preload (from the torque at the low end
    of the thread and head friction band, VDI 2230 class B 0.08 to 0.16 when none is
    given; or the stated preload with the scatter of its method, its thread torsion at the
    top of the band) gives the von Mises stress in the thread from tension and the thread
    torsion of tightening (VDI 2230 step R7; no torsion with a hydraulic tensioner). It is
    set against the minimum yield strength of the property class; the finding names the
    friction it used and the band.

    Fails when the utilisation is above ``fail-utilisation`` (100%: the torque yields the
    bolt); warns above ``warn-utilisation`` (90%, the VDI 2230 table value) except for
    yield- and angle-controlled tightening; passes otherwise. A design without joints
    gives no finding here (``joint-slip`` reports it as not checked).

    Limits of validity: bolts without reduced shank, the torsion of a plastic section as
    the VDI 2230 tables imply; no check of the nut or thread stripping.
    """

    id = "joint-bolt-yield"
    title = "Bolts not yielded by tightening"
    applies_to = "joint"
    sources = (VDI_ASSEMBLY, ISO_898, VDI_PRELOAD)
    Options = BoltYieldOptions

    def check(self, design, options: BoltYieldOptions):
        from vcheck.dynamics.joints import preload as vdi

        fail, warn = options.fail_utilisation, options.warn_utilisation
        for joint in _screenings(design):
            model = design.joint[joint.index]
            to_yield = joint.method in ("yield-controlled", "angle-controlled")
            used = joint.utilisation
            if used > fail * (1 + _TOLERANCE):
                status = Status.FAIL
            elif used > warn * (1 + _TOLERANCE) and not to_yield:
                status = Status.WARN
            else:
                status = Status.PASS
            low, high = joint.thread_friction_band
            end = "low" if joint.friction_thread == low else "high"
            friction = (f" with thread friction {joint.friction_thread:g}"
                        + (f" (the {end} end of the band {low:g} to {high:g})" if high > low
                           else "")
                        if joint.torsion_factor else " (no torsion)")
            head = ("the tightening yields the bolt: " if status is Status.FAIL else "")
            message = (
                f"{joint.label}: {head}the equivalent stress at assembly is {used:.1%} of "
                f"the minimum yield strength {joint.yield_strength / 1e6:.4g} MPa at the "
                f"largest preload {_kn(joint.preload_max_requested)} from "
                f"{joint.tightening}{friction}; yield begins at {_kn(joint.yield_preload)}; "
                f"fails above {fail:.0%}"
                + ("; tightening into yield is intended with this method" if to_yield
                   else f", warns above {warn:.0%}"))
            advice = []
            if status is not Status.PASS:
                target = min(warn, fail)
                thread = model.thread
                if joint.torsion_factor:
                    allowed = float(vdi.permissible_assembly_preload_vdi2230(
                        thread.pitch, thread.pitch_diameter, thread.stress_diameter,
                        joint.yield_strength, joint.friction_thread, target))
                else:
                    allowed = math.pi / 4 * thread.stress_diameter**2 * joint.yield_strength \
                        * target
                tightening = model.tightening
                mean = allowed * (1 + joint.alpha) / (2 * joint.alpha)
                if tightening.torque is not None and tightening.nut_factor is None:
                    torque = float(vdi.tightening_torque_vdi2230(
                        allowed, thread.pitch, thread.pitch_diameter,
                        joint.head_friction_diameter, joint.friction_thread,
                        joint.friction_head))
                    advice.append(
                        f"for {target:.0%} of the yield strength the torque may be at most "
                        f"{torque:.3g} N*m at these friction coefficients (VDI 2230 "
                        "torque with the lowest friction)")
                elif tightening.torque is not None:
                    torque = mean * tightening.nut_factor * thread.nominal_diameter
                    advice.append(
                        f"for {target:.0%} of the yield strength the torque may be at most "
                        f"{torque:.3g} N*m at nut factor {tightening.nut_factor:g}")
                else:
                    advice.append(
                        f"for {target:.0%} of the yield strength the stated preload may be "
                        f"at most {_kn(mean)} with the scatter of {joint.method}")
                advice.append("a higher property class or a larger bolt carries the same "
                              "preload further from yield; a lubricated thread (lower "
                              "friction) raises the preload of a given torque")
            yield self.finding(
                design, ("joint", joint.index, "tightening"), status, message,
                quantities=_joint_quantities(joint, "yield"),
                measured=Measure("yield utilisation at assembly", round(used, 6), "fraction"),
                limit=Measure("largest utilisation", fail, "fraction"),
                margin=round(fail - used, 6),
                assumptions=_all(joint, "preload"),
                advice=advice,
            )

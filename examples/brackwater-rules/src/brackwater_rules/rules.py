"""Three rules of the (invented) Brackwater design standard BE-VIB."""

from __future__ import annotations

from pydantic import Field

from vcheck.analysis import natural_frequencies
from vcheck.engine import Rule, RuleOptions
from vcheck.findings import Measure, Source, Status

STANDARD = "Brackwater Engineering design standard BE-VIB, rev 4 (example company policy)"


class RoofRestraint(Rule):
    """Machines on a roof sit on restrained isolators, never on free-standing springs.

    Wind and seismic loads push roof equipment sideways; a free-standing spring has no
    lateral restraint. Fails when the support is a roof and the mounting kind is
    "spring"; passes for restrained springs, rubber, pads, air springs and rigid
    mounting; not checked when the design does not say what it stands on.
    """

    id = "brackwater-roof-restraint"
    title = "Restrained isolators on roofs"
    applies_to = "mounting"
    sources = (Source(f"{STANDARD}, clause 3.2"),)

    def check(self, design, options):
        if design.support is None or design.mounting is None:
            yield self.finding(design, ("machine",), Status.NOT_CHECKED,
                               "the design gives no [support] or no [mounting]")
            return
        if design.support.kind != "roof":
            yield self.finding(design, ("support", "kind"), Status.PASS,
                               f"not on a roof (support is {design.support.kind})")
        elif design.mounting.kind == "spring":
            yield self.finding(
                design, ("mounting", "kind"), Status.FAIL,
                "free-standing springs on a roof: use restrained springs",
                advice=["change mounting kind to restrained-spring (housed springs with "
                        "lateral and uplift restraint)"])
        else:
            yield self.finding(design, ("mounting", "kind"), Status.PASS,
                               f"{design.mounting.kind} mounting is restrained on the roof")


class ElastomerOptions(RuleOptions):
    minimum_speed: float = Field(
        900.0, gt=0,
        description="Lowest running speed [rpm] accepted on rubber mounts or pads. Default "
        f"900 rpm: {STANDARD}, clause 3.5.")


class ElastomerLowSpeed(Rule):
    """Rubber mounts and pads only under machines that never run slower than 900 rpm.

    Elastomer mounts give natural frequencies of several hertz, too close to slow
    machines. Fails when the mounting is rubber or pad and the lowest running speed is
    below ``minimum-speed``; passes otherwise (and for every other mounting kind).
    """

    id = "brackwater-elastomer-low-speed"
    title = "No elastomer mounts under slow machines"
    applies_to = "mounting"
    sources = (Source(f"{STANDARD}, clause 3.5"),)
    Options = ElastomerOptions

    def check(self, design, options):
        mounting = design.mounting
        lowest = design.machine.speed.min.value * 60.0  # Hz -> rpm
        limit = Measure("lowest speed on elastomer", options.minimum_speed, "rpm")
        found = Measure("lowest running speed", round(lowest, 3), "rpm")
        if mounting is None or mounting.kind not in ("rubber", "pad"):
            kind = mounting.kind if mounting else "none given"
            yield self.finding(design, ("mounting",), Status.PASS,
                               f"mounting is not elastomeric ({kind})")
        elif lowest < options.minimum_speed:
            yield self.finding(
                design, ("machine", "speed"), Status.FAIL,
                f"{mounting.kind} mounts under a machine running down to {lowest:.0f} rpm; "
                f"elastomers need at least {options.minimum_speed:.0f} rpm",
                measured=found, limit=limit, margin=round(lowest - options.minimum_speed, 3))
        else:
            yield self.finding(
                design, ("machine", "speed"), Status.PASS,
                f"{mounting.kind} mounts; lowest speed {lowest:.0f} rpm is at least "
                f"{options.minimum_speed:.0f} rpm",
                measured=found, limit=limit, margin=round(lowest - options.minimum_speed, 3))


class FloorFrequencyOptions(RuleOptions):
    maximum_frequency: float = Field(
        5.0, gt=0,
        description="Highest isolation natural frequency [Hz] on a suspended floor. "
        f"Default 5 Hz: {STANDARD}, clause 4.1.")


class FloorIsolationFrequency(Rule):
    """On a suspended floor the isolation natural frequency must not exceed 5 Hz.

    Uses the bounce frequency vcheck computes from the isolators (the same analysis the
    built-in rules use). Fails above ``maximum-frequency``; passes at or below it; not
    checked on a suspended floor without isolators to compute from.
    """

    id = "brackwater-floor-isolation-frequency"
    title = "Soft isolation on suspended floors"
    applies_to = "mounting"
    sources = (Source(f"{STANDARD}, clause 4.1"),)
    Options = FloorFrequencyOptions

    def check(self, design, options):
        if design.support is None or design.support.kind != "suspended-floor":
            yield self.finding(design, ("support",), Status.PASS, "not on a suspended floor")
            return
        isolation = [m for m in natural_frequencies(design) if m.name.startswith("isolation")]
        if not isolation:
            yield self.finding(design, ("mounting",), Status.NOT_CHECKED,
                               "on a suspended floor, but no isolators to compute from")
            return
        mode = isolation[0]
        limit = Measure("highest isolation frequency", options.maximum_frequency, "Hz")
        found = Measure("isolation frequency", round(mode.high, 4), "Hz")
        status = Status.FAIL if mode.high > options.maximum_frequency else Status.PASS
        yield self.finding(
            design, mode.key_path, status,
            f"{mode.name} at up to {mode.high:.2f} Hz on a suspended floor; at most "
            f"{options.maximum_frequency:g} Hz allowed",
            measured=found, limit=limit, margin=round(options.maximum_frequency - mode.high, 4),
            assumptions=mode.assumptions)

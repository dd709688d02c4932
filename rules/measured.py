"""Measured vibration: bearing-housing severity, measured isolation, measured peaks."""

from __future__ import annotations

from pydantic import Field

from vcheck.analysis import excitation_bands, natural_frequencies
from vcheck.engine import Rule, RuleOptions
from vcheck.findings import Measure, Source, Status, computed

__all__ = ["MeasuredOptions", "MeasuredVibration", "STANDARD_BAND", "bearing_velocity",
           "zone_boundaries_for"]

ISO_ZONES = Source(
    "ISO 10816-3:2009 Annex A, Table A.1 (believed kept in ISO 20816-3:2022, not verified): "
    "zone boundaries of broadband RMS velocity on the bearing housings by machine group and "
    "support class",
    "from memory")
ISO_CLASS_I = Source(
    "ISO 10816-1:1995 Annex B, Table B.1: class I (machines up to 15 kW)", "published")
ISO_BAND = Source(
    "ISO 10816-3:2009 clause 3: broadband over 10 Hz to 1000 Hz for machines above "
    "600 r/min, 2 Hz to 1000 Hz from 120 to 600 r/min", "from memory")
ISO_SUPPORT = Source(
    "ISO 10816-3:2009 clause 5.2: a support is rigid when the lowest natural frequency of "
    "machine and support is at least 25% above the main excitation frequency", "from memory")
FIELD_ISOLATION = Source(
    "isolation measured as the ratio of the vibration below to above the isolators at one "
    "frequency (Harris' Shock and Vibration Handbook, 6th ed., ch. 30)", "from memory")
REQUIRED_BY_FLOOR = Source(
    "required isolation efficiency 80% on grade, 90% on suspended floors, 95% on long "
    "spans (the default of the isolation-efficiency rule's policy)", "common practice")
PREDICTION_FACTOR = Source(
    "measured transmissibility more than twice the predicted one: the isolators do less "
    "than designed (a judgement default of this rule, no published source)",
    "common practice")
PEAK_PRACTICE = Source(
    "a resonance shows as a spectral peak away from the forcing frequencies; its frequency "
    "confirms or corrects a computed natural frequency", "common practice")

STANDARD_BAND = ((10.0, 1000.0), (2.0, 1000.0))
"""Frequency bands of the broadband velocity of ISO 10816-3 [Hz]: 10 to 1000 Hz for
machines running above 600 r/min, 2 to 1000 Hz for 120 to 600 r/min (clause 3, from
memory)."""

_BAND_SPEED = 600.0 / 60.0  # Hz: 600 r/min
_GROUP_1_POWER = 300e3  # W, ISO 10816-3 clause 1 (from memory)
_SCOPE_POWER = 15e3  # W
_SCOPE_SPEEDS = (120.0 / 60.0, 15000.0 / 60.0)  # Hz
_RIGID_RATIO = 1.25  # ISO 10816-3 clause 5.2 (from memory)
_TOLERANCE = 1e-9


class MeasuredOptions(RuleOptions):
    """Policy of the measured-vibration rule."""

    required_efficiency: float | None = Field(
        None, ge=0, lt=1,
        description="Isolation efficiency (1 - T) a measured pair above and below the "
        "isolators must show; below it the rule fails. Default: the isolation policy's "
        "value by floor (80% on grade, 90% on floors spanning up to 20 ft, 95% beyond), "
        "common practice from memory.")
    prediction_factor: float = Field(
        2.0, gt=1,
        description="How many times the predicted transmissibility a measured one may be "
        "before the rule warns that the isolators do less than designed. Default 2: a "
        "judgement default (measurement scatter and a one-degree-of-freedom prediction), "
        "no published source.")
    same_frequency: float = Field(
        0.02, ge=0, lt=0.5,
        description="Largest relative difference of the frequencies of a reading above and "
        "one below the isolators for the two to be paired. Default 0.02: a judgement "
        "default (about one analyser line at running speed), no published source.")
    peak_window: float = Field(
        0.15, gt=0, lt=1,
        description="A spectral peak within this fraction of a computed natural frequency "
        "is reported against it. Default 0.15: a judgement default, no published source.")
    confirm_window: float = Field(
        0.05, ge=0, lt=1,
        description="A peak within this fraction of a natural frequency's band confirms it; "
        "further off it moves it (warn). Default 0.05: a judgement default, no published "
        "source.")
    forcing_window: float = Field(
        0.02, ge=0, lt=1,
        description="A peak within this fraction of a forcing band is the forcing, not a "
        "mode, and is not compared. Default 0.02: a judgement default, no published "
        "source.")


def _mm_s(value: float) -> str:
    return f"{value * 1e3:.3g} mm/s"


def _hz(value: float) -> str:
    return f"{value:.4g} Hz"


def zone_boundaries_for(design, measurement, speed: float):
    """The zone boundaries [m/s] for a bearing reading, the words that say why, and the
    sources: ISO 10816-3 by group and support class, or ISO 10816-1 class I below 15 kW.

    Where neither the measurement nor the design says, the lower boundaries are taken
    (group 2; a rigid support when no natural frequency is known), the cautious side.
    """
    from vcheck.dynamics.vibration_level import class_boundaries, zone_boundaries

    notes: list[str] = []
    power = design.machine.power
    group = measurement.machine_group
    if group is None and power is not None and power.value < _SCOPE_POWER:
        notes.append(f"machine power {power.text} is below the 15 kW of ISO 10816-3: the "
                     "class I boundaries of ISO 10816-1 (machines up to 15 kW) are used")
        return class_boundaries("I"), "class I of ISO 10816-1", notes, (ISO_CLASS_I,)
    if group is not None:
        group_words = f"group {group} as stated"
    elif power is not None:
        group = 1 if power.value > _GROUP_1_POWER else 2
        group_words = f"group {group} (machine power {power.text})"
    else:
        group = 2
        group_words = "group 2"
        notes.append("the machine group is not stated and machine.power is not given: group "
                     "2 is taken, the lower boundaries (state 'machine-group' or "
                     "machine.power)")
    support = measurement.support_class
    if support is not None:
        support_words = f"{support} support as stated"
    else:
        modes = natural_frequencies(design)
        if not modes:
            support = "rigid"
            support_words = "rigid support"
            notes.append("no natural frequency of the design is known: a rigid support is "
                         "taken, the lower boundaries (state 'support-class')")
        else:
            lowest = min(modes, key=lambda mode: mode.low)
            support = "rigid" if lowest.low >= _RIGID_RATIO * speed else "flexible"
            support_words = f"{support} support"
            notes.append(f"{support} support: the lowest natural frequency, {lowest.name} at "
                         f"{_hz(lowest.low)}, is {'' if support == 'rigid' else 'not '}25% "
                         f"above running speed {_hz(speed)}")
    return (zone_boundaries(group, support), f"{group_words}, {support_words}", notes,
            (ISO_ZONES, ISO_SUPPORT))


def bearing_velocity(design, index: int, band: tuple[float, float]):
    """RMS velocity of a bearing measurement over ``band`` [m/s], whether the reading
    covers the whole band (else the value is a lower bound), and notes; or None with the
    reason when the reading cannot give a broadband velocity."""
    import numpy as np

    from vcheck.design.measurements import measurement_spectrum
    from vcheck.dynamics.measured import band_rms_from_spectrum, velocity_spectrum
    from vcheck.dynamics.vibration_level import (
        harmonic_amplitude,
        velocity_from_acceleration,
        velocity_from_displacement,
    )

    measurement = design.measurement[index]
    quantity, reading = measurement.quantity, measurement.reading_used
    low, high = band
    notes: list[str] = []
    if measurement.reading is None:
        notes.append(f"the reading is taken as {reading.upper()} (not stated; the default "
                     f"for a {quantity})")
    if measurement.spectrum is not None:
        spectrum = measurement_spectrum(design, index)
        f = np.asarray(spectrum.frequency)
        keep = f > 0
        velocity = velocity_spectrum(f[keep], np.asarray(spectrum.amplitude)[keep], quantity)
        rms = band_rms_from_spectrum(f[keep], velocity, low, high, reading=reading,
                                     window=measurement.spectrum.window)
        covers = bool(f[0] <= low * (1 + _TOLERANCE) and f[-1] >= high * (1 - _TOLERANCE))
        notes.append(f"RMS velocity over {low:g} to {high:g} Hz from the spectrum "
                     f"{spectrum.file} by Parseval ({measurement.spectrum.window} window)")
        if not covers:
            notes.append(f"the spectrum covers {f[0]:g} to {f[-1]:g} Hz, not the whole band")
        return rms, covers, notes, ""
    amount = measurement.amount
    if measurement.band is not None:
        if quantity != "velocity":
            return None, False, notes, (
                f"a broadband {quantity} reading cannot be placed in the velocity zones; give "
                "a velocity reading over the band or a spectrum")
        rms = float(harmonic_amplitude(amount.value, reading, "rms"))
        if reading != "rms":
            notes.append(f"a broadband {reading} reading is restated as RMS by the factor of "
                         "a sinusoid")
        b = measurement.band
        covers = bool(b.min.value <= low * (1 + _TOLERANCE)
                      and b.max.value >= high * (1 - _TOLERANCE))
        if not covers:
            notes.append(f"the reading's band {b.min.text} to {b.max.text} does not cover "
                         f"{low:g} to {high:g} Hz")
        return rms, covers, notes, ""
    hz = measurement.frequency.value
    peak = float(harmonic_amplitude(amount.value, reading, "peak"))
    if quantity == "acceleration":
        peak = float(velocity_from_acceleration(peak, hz))
    elif quantity == "displacement":
        peak = float(velocity_from_displacement(peak, hz))
    notes.append(f"a filtered reading at {measurement.frequency.text}: the broadband level "
                 "is at least its RMS velocity")
    return float(harmonic_amplitude(peak, "peak", "rms")), False, notes, ""


class MeasuredVibration(Rule):
    """Measured vibration of the installation is acceptable and as designed.

    Reads the design's ``[[measurement]]`` tables; a design without them gets no finding.
    Bearing readings: the broadband RMS velocity (a velocity reading over the band of
    ISO 10816-3, 10-1000 Hz above 600 r/min, or a spectrum of any quantity by Parseval) is
    placed in the evaluation zones of ISO 10816-3 / ISO 20816-3 for the machine group
    (stated, from machine.power, or group 2) and support class (stated, or rigid when the
    lowest natural frequency is 25% above running speed). Readings above and below the
    isolators at the same frequency (two filtered readings, or a spectrum's line at the
    other's frequency, or two spectra at running speed) give the measured transmissibility
    T = below / above and efficiency 1 - T, set against the required efficiency and against the
    transmissibility predicted from the isolation natural frequency. A spectrum's peak
    near a natural frequency of the design (away from the forcing bands) is reported
    against it. Readings on a joint's clamped part are used by joint-slip and the other
    fastener rules instead of the joint's level.

    Fails when a bearing reading is in zone D, or the measured isolation efficiency is
    below ``required-efficiency``. Warns when a bearing reading is in zone C, when a zone
    A or B rests on a reading that does not cover the whole band (a filtered reading or a
    narrower band, a lower bound of the broadband level), when the measured
    transmissibility is more than ``prediction-factor`` times the predicted one, and when
    a spectral peak moves a natural frequency by more than ``confirm-window``. It passes a
    bearing reading in zone A or B over the whole band, a measured isolation that meets
    both, and a peak that confirms a natural frequency. A reading above or below the
    isolators without its partner, and a floor reading without a spectrum, are reported
    as not checked.

    Limits of validity: zone boundaries are for machines above 15 kW running 120 to
    15 000 r/min (ISO 10816-1 class I below 15 kW); the isolation comparison is for one
    frequency and one direction at a time; a peak is a local maximum three times the
    spectrum's median.
    """

    id = "measured-vibration"
    title = "Measured vibration is acceptable and as designed"
    applies_to = "measurement"
    sources = (ISO_ZONES, ISO_BAND, ISO_SUPPORT, FIELD_ISOLATION, PEAK_PRACTICE)
    Options = MeasuredOptions

    def check(self, design, options: MeasuredOptions):
        if not design.measurement:
            return
        paired: set[int] = set()
        for index, measurement in enumerate(design.measurement):
            if measurement.location == "bearing":
                yield self._bearing(design, index)
            if measurement.location == "frame-above-isolators":
                yield from self._isolation(design, index, options, paired)
        for index, measurement in enumerate(design.measurement):
            here = ("measurement", index)
            label = measurement.label(index)
            if measurement.location == "support-below-isolators" and index not in paired:
                yield self.finding(
                    design, here, Status.NOT_CHECKED,
                    f"{label}: no reading above the isolators at the same frequency and in "
                    "the same direction to set it against", sources=(FIELD_ISOLATION,))
            if measurement.location == "floor" and measurement.spectrum is None:
                yield self.finding(
                    design, here, Status.NOT_CHECKED,
                    f"{label}: vcheck has no criterion for a floor reading (building "
                    "vibration criteria are not built in); a floor spectrum is compared "
                    "with the natural frequencies", sources=(PEAK_PRACTICE,))
            if measurement.spectrum is not None:
                yield from self._peaks(design, index, options)

    # ---------------------------------------------------------------- bearings

    def _bearing(self, design, index: int):
        from vcheck.dynamics.vibration_level import severity_zone

        measurement = design.measurement[index]
        here = ("measurement", index)
        label = measurement.label(index)
        speed = (measurement.speed.value if measurement.speed is not None
                 else design.machine.speed.max.value)
        assumptions: list[str] = []
        if measurement.speed is None:
            assumptions.append(f"the survey speed is not stated: the machine's top speed "
                               f"{_hz(speed)} is taken (state 'speed')")
        if not _SCOPE_SPEEDS[0] <= speed <= _SCOPE_SPEEDS[1]:
            assumptions.append(f"running speed {speed * 60:g} r/min is outside the 120 to "
                               "15 000 r/min of ISO 10816-3")
        band = STANDARD_BAND[0] if speed > _BAND_SPEED else STANDARD_BAND[1]
        if measurement.direction == "axial":
            assumptions.append("an axial reading is judged with the zones of radial readings, "
                               "as ISO 10816-3 does on thrust bearings (from memory)")
        elif measurement.direction is None:
            assumptions.append("the direction is not stated: the reading is taken as radial")
        boundaries, basis, notes, sources = zone_boundaries_for(design, measurement, speed)
        assumptions += notes
        velocity, covers, notes, missing = bearing_velocity(design, index, band)
        assumptions += notes
        if velocity is None:
            return self.finding(design, here, Status.WARN, f"{label}: {missing}",
                                assumptions=assumptions, sources=sources + (ISO_BAND,))
        zone = severity_zone(velocity, boundaries)
        status = {"A": Status.PASS, "B": Status.PASS, "C": Status.WARN, "D": Status.FAIL}[zone]
        meaning = {"A": "newly commissioned", "B": "unrestricted long-term operation",
                   "C": "limited operation only", "D": "severe enough to cause damage"}[zone]
        lines = "/".join(f"{b * 1e3:.3g}" for b in boundaries)
        message = (f"{label}: {_mm_s(velocity)} RMS over {band[0]:g}-{band[1]:g} Hz, zone "
                   f"{zone} ({meaning}) for {basis} (boundaries A/B, B/C, C/D {lines} mm/s)")
        advice: tuple[str, ...] = ()
        if zone in ("A", "B") and not covers:
            status = Status.WARN
            message += ("; the reading does not cover the whole band, so the broadband level "
                        "may be higher: give a velocity reading over the band or a spectrum")
        if zone == "C":
            advice = ("zone C: plan the remedy (balance, alignment, supports) and keep the "
                      "machine under watch until it is made; ISO 10816-3 admits it for a "
                      "limited period only",)
        if zone == "D":
            advice = ("zone D: the vibration is severe enough to damage the machine; find "
                      "and remove the cause before running on",)
        return self.finding(
            design, here, status, message,
            quantities=[computed("RMS velocity", velocity, "m/s", measurement=label,
                                 band=f"{band[0]:g}-{band[1]:g} Hz", zone=zone),
                        computed("band of the RMS velocity", band, "Hz", measurement=label),
                        computed("zone boundaries", boundaries, "m/s", measurement=label,
                                 boundaries="A/B, B/C, C/D"),
                        computed("running speed", speed, "Hz", measurement=label)],
            measured=Measure("RMS velocity", round(velocity * 1e3, 6), "mm/s"),
            limit=Measure("zone B/C boundary", round(boundaries[1] * 1e3, 6), "mm/s"),
            margin=round(1.0 - velocity / boundaries[1], 6),
            assumptions=assumptions, advice=advice, sources=sources + (ISO_BAND,))

    # --------------------------------------------------------------- isolation

    def _isolation(self, design, index: int, options: MeasuredOptions, paired: set):
        above = design.measurement[index]
        here = ("measurement", index)
        label = above.label(index)
        found = None
        for other_index, other in enumerate(design.measurement):
            if (other.location != "support-below-isolators" or other_index in paired
                    or (other.direction is not None and above.direction is not None
                        and other.direction != above.direction)):
                continue
            frequency = _pair_frequency(design, above, other)
            if frequency is None:
                continue
            a = _peak_velocity_at(design, index, frequency, options.same_frequency)
            b = _peak_velocity_at(design, other_index, frequency, options.same_frequency)
            if a is not None and b is not None and a[0] > 0:
                found = other_index, frequency, a, b
                break
        if found is None:
            yield self.finding(
                design, here, Status.NOT_CHECKED,
                f"{label}: measured isolation not checked: no reading below the isolators "
                "at the same frequency and in the same direction (a broadband reading gives "
                "no one-frequency ratio; give filtered readings or spectra above and below)",
                sources=(FIELD_ISOLATION,))
            return
        partner, frequency, a, b = found
        paired.add(partner)
        yield self._pair(design, index, partner, frequency, a, b, options)

    def _pair(self, design, index: int, partner: int, frequency: float, a, b,
              options: MeasuredOptions):
        from vcheck.dynamics.measured import measured_transmissibility

        above, below = design.measurement[index], design.measurement[partner]
        here = ("measurement", index)
        measured = float(measured_transmissibility(a[0], b[0]))
        efficiency = 1.0 - measured
        assumptions: list[str] = [note for note in (a[1], b[1]) if note]
        for m, i in ((above, index), (below, partner)):
            if m.reading is None:
                assumptions.append(f"{m.label(i)} is read as {m.reading_used.upper()} (not "
                                   f"stated; the default for a {m.quantity})")
        predicted, mode_words, notes = _predicted_transmissibility(design, frequency)
        assumptions += notes
        required, required_words, notes, sources = _required(design, options)
        assumptions += notes
        pair = f"{above.label(index)} and {below.label(partner)}"
        message = (f"{pair} at {_hz(frequency)}: measured transmissibility "
                   f"{measured:.3g}, isolation efficiency {efficiency:.1%} ({required:.0%} "
                   f"{required_words}); predicted {predicted:.3g} from {mode_words}")
        advice: tuple[str, ...] = ()
        if efficiency < required - _TOLERANCE:
            status = Status.FAIL
            message += f"; the isolators keep out less than the {required:.0%} required"
        elif measured > options.prediction_factor * predicted * (1 + _TOLERANCE):
            status = Status.WARN
            message += (f"; more than {options.prediction_factor:g} times the predicted "
                        "transmissibility: the isolators do less than designed")
        else:
            status = Status.PASS
        if status is not Status.PASS:
            advice = ("look for what short-circuits the isolators (rigid pipe or conduit, a "
                      "snubber in contact, a spring at solid height, debris under the base), "
                      "and check the isolators fitted against the schedule",)
        where = {"above": above.label(index), "below": below.label(partner)}
        return self.finding(
            design, here, status, message,
            quantities=[computed("frequency", frequency, "Hz", **where),
                        computed("peak velocity above the isolators", a[0], "m/s", **where),
                        computed("peak velocity below the isolators", b[0], "m/s", **where),
                        computed("measured transmissibility", measured, "1", **where),
                        computed("measured isolation efficiency", efficiency, "fraction",
                                 **where),
                        computed("predicted transmissibility", predicted, "1", **where),
                        computed("required efficiency", required, "fraction")],
            measured=Measure("measured isolation efficiency", round(efficiency, 6), "fraction"),
            limit=Measure("required isolation efficiency", required, "fraction"),
            margin=round(efficiency - required, 6),
            assumptions=assumptions, advice=advice,
            sources=(FIELD_ISOLATION, *sources, PREDICTION_FACTOR))

    # ------------------------------------------------------------------- peaks

    def _peaks(self, design, index: int, options: MeasuredOptions):
        import numpy as np

        from vcheck.design.measurements import measurement_spectrum
        from vcheck.dynamics.measured import spectrum_peaks

        measurement = design.measurement[index]
        here = ("measurement", index)
        label = measurement.label(index)
        spectrum = measurement_spectrum(design, index)
        f = np.asarray(spectrum.frequency)
        peaks = [float(f[i]) for i in spectrum_peaks(f, spectrum.amplitude)]
        bands = excitation_bands(design)

        def forcing(hz: float):
            for band in bands:
                if band.low * (1 - options.forcing_window) <= hz <= \
                        band.high * (1 + options.forcing_window):
                    return band
            return None

        free = [hz for hz in peaks if forcing(hz) is None]
        rows: list[tuple[str, ...]] = []
        words: list[str] = []
        advice: list[str] = []
        worst = None  # (off, hz, mode) of the peak furthest from its mode
        quantities: list = []
        for mode in natural_frequencies(design):
            near = [hz for hz in free if abs(hz - mode.nominal) <= options.peak_window
                    * mode.nominal]
            if not near:
                continue
            hz = min(near, key=lambda value: abs(value - mode.nominal))
            off = max(mode.low - hz, hz - mode.high, 0.0) / mode.nominal
            band = (_hz(mode.nominal) if mode.low == mode.high
                    else f"{_hz(mode.nominal)} ({_hz(mode.low)} to {_hz(mode.high)})")
            shift = (hz - mode.nominal) / mode.nominal
            confirms = off <= options.confirm_window + _TOLERANCE
            rows.append((mode.name, band, _hz(hz), f"{shift:+.0%}",
                         "confirms" if confirms else "moves"))
            quantities += [
                computed("natural frequency", mode.nominal, "Hz", mode=mode.name,
                         origin=mode.origin),
                computed("peak frequency", hz, "Hz", mode=mode.name, measurement=label),
                computed("shift from the natural frequency", shift, "fraction", mode=mode.name,
                         verdict="confirms" if confirms else "moves")]
            if confirms:
                words.append(f"the peak at {_hz(hz)} confirms {mode.name}, {band} in the design")
            else:
                words.append(f"the peak at {_hz(hz)} moves {mode.name}, {band} in the design, "
                             f"by {shift:+.0%}")
                advice.append(f"if the peak at {_hz(hz)} is {mode.name}, correct the model or "
                              f"give it as a [[natural-frequency]] (source = \"{label}\") and "
                              "check again")
            if worst is None or off > worst[0]:
                worst = (off, hz, mode)
        if worst is None:
            return
        off, hz, mode = worst
        status = Status.PASS if off <= options.confirm_window + _TOLERANCE else Status.WARN
        message = f"{label}: " + "; ".join(words)
        if status is Status.WARN:
            message += "; the other rules still use the design's values"
        yield self.finding(
            design, here + ("spectrum",), status, message,
            quantities=quantities,
            measured=Measure("peak frequency", round(hz, 6), "Hz"),
            limit=Measure("natural frequency of the design", round(mode.nominal, 6), "Hz"),
            margin=round(options.confirm_window - off, 6),
            assumptions=(f"peaks are local maxima at least 3 times the median line of "
                         f"{spectrum.file}; peaks within {options.forcing_window:.0%} of a "
                         "forcing band are taken as the forcing and not compared",),
            advice=advice, sources=(PEAK_PRACTICE,),
            table=(("natural frequency", "in the design", "peak", "shift", ""), *rows)
            if len(rows) > 1 else (),
            table_title="spectral peaks near natural frequencies" if len(rows) > 1 else "")


def _survey_speed(design, measurement) -> float:
    return (measurement.speed.value if measurement.speed is not None
            else design.machine.speed.max.value)


def _pair_frequency(design, above, below) -> float | None:
    """The one frequency a reading above and one below are compared at [Hz]: that of a
    filtered reading, or running speed (the survey's) for two spectra; None for a
    broadband reading."""
    if above.band is not None or below.band is not None:
        return None
    if above.frequency is not None:
        return above.frequency.value
    if below.frequency is not None:
        return below.frequency.value
    return _survey_speed(design, above)


def _peak_velocity_at(design, index: int, frequency: float, tolerance: float):
    """Peak velocity of a measurement at ``frequency`` [m/s] and a note on how it was
    read, or None when the measurement has nothing within ``tolerance`` of it."""
    import numpy as np

    from vcheck.design.measurements import measurement_spectrum
    from vcheck.dynamics.measured import velocity_spectrum
    from vcheck.dynamics.vibration_level import harmonic_amplitude

    measurement = design.measurement[index]
    if measurement.spectrum is None:
        if measurement.frequency is None or abs(measurement.frequency.value - frequency) > \
                tolerance * frequency:
            return None
        return _peak_velocity(measurement, frequency), ""
    spectrum = measurement_spectrum(design, index)
    f = np.asarray(spectrum.frequency)
    line = int(np.argmin(np.abs(f - frequency)))
    if not f[line] > 0 or abs(f[line] - frequency) > tolerance * frequency:
        return None
    velocity = velocity_spectrum(f[line:line + 1], np.asarray(spectrum.amplitude)[line:line + 1],
                                 measurement.quantity)
    peak = float(harmonic_amplitude(float(velocity[0]), measurement.reading_used, "peak"))
    return peak, (f"{measurement.label(index)}: the line at {f[line]:g} Hz of "
                  f"{spectrum.file}")


def _peak_velocity(measurement, frequency: float) -> float:
    from vcheck.dynamics.vibration_level import (
        harmonic_amplitude,
        velocity_from_acceleration,
        velocity_from_displacement,
    )

    peak = float(harmonic_amplitude(measurement.amount.value, measurement.reading_used, "peak"))
    if measurement.quantity == "acceleration":
        return float(velocity_from_acceleration(peak, frequency))
    if measurement.quantity == "displacement":
        return float(velocity_from_displacement(peak, frequency))
    return peak


def _predicted_transmissibility(design, frequency: float):
    """Largest predicted transmissibility of the isolation modes at ``frequency`` over
    their tolerance bands, the words for the mode, and the assumptions."""
    from vcheck.dynamics.isolation import transmissibility as tr
    from vcheck.dynamics.isolation.damping import (
        ELASTOMER_DAMPING_RATIO,
        STEEL_SPRING_DAMPING_RATIO,
    )

    mounting = design.mounting
    notes: list[str] = []
    if mounting.loss_factor is not None:
        def curve(r):
            return tr.transmissibility_hysteretic(r, mounting.loss_factor)
        words = f"loss factor {mounting.loss_factor:g}"
    else:
        zeta = mounting.damping_ratio
        if zeta is None:
            zeta = (ELASTOMER_DAMPING_RATIO if mounting.kind in ("rubber", "pad")
                    else STEEL_SPRING_DAMPING_RATIO)
            notes.append(f"isolator damping ratio {zeta:g}, the default for {mounting.kind} "
                         "isolators (Harris' Shock and Vibration Handbook, from memory)")

        def curve(r):
            return tr.transmissibility_viscous(r, zeta)
        words = f"damping ratio {zeta:g}"
    best, best_words = 0.0, ""
    for mode in natural_frequencies(design):
        if not mode.is_isolation:
            continue
        for fn in (mode.low, mode.nominal, mode.high):
            value = float(curve(frequency / fn))
            if value > best:
                best, best_words = value, f"{mode.name} at {_hz(fn)}, {words}"
    if len(set(m.name for m in natural_frequencies(design) if m.is_isolation)) > 1:
        notes.append("the isolation mode and the end of its band that give the largest "
                     "predicted transmissibility are taken")
    return best, best_words, notes


def _required(design, options: MeasuredOptions):
    """The required efficiency, the words for it, assumptions and sources."""
    if options.required_efficiency is not None:
        return (options.required_efficiency, "required by the policy's required-efficiency",
                [], ())
    from .isolation_policy import FLOOR_SPAN_LIMITS, required_efficiency

    support = design.support
    structure = design.structure.structure if design.structure is not None else None
    kind = (support.kind if support is not None else None) or (
        structure.kind if structure is not None else None)
    span = support.span if support is not None and support.span is not None else (
        structure.span if structure is not None else None)
    notes: list[str] = []
    if kind in ("slab-on-grade", "foundation-block") and span is None:
        value, words = required_efficiency(None), "required on a slab on grade"
    elif span is None:
        value = required_efficiency(FLOOR_SPAN_LIMITS[-1])
        words = "required on the longest floor span class"
        notes.append("the floor span is not given: the longest span class is taken; give "
                     "support.span")
    elif span.value > FLOOR_SPAN_LIMITS[-1]:
        value = required_efficiency(FLOOR_SPAN_LIMITS[-1])
        words = f"required on a floor span of {span.text}"
        notes.append(f"the floor span {span.text} is beyond the 40 ft of the policy table: "
                     "the 30-40 ft value is used")
    else:
        value, words = required_efficiency(span.value), f"required on a floor span of {span.text}"
    return value, words, notes, (REQUIRED_BY_FLOOR,)

"""Measured vibration in a design: the ``[[measurement]]`` tables of a commissioning survey.

Each measurement is one reading or one spectrum file::

    [[measurement]]
    name = "pump drive-end bearing, horizontal"
    location = "bearing"                 # bearing, frame-above-isolators,
                                         # support-below-isolators, floor, clamped-part
    direction = "horizontal"             # vertical, horizontal or axial
    quantity = "velocity"                # velocity, acceleration or displacement
    reading = "rms"                      # rms, peak or peak-to-peak (default by quantity)
    value = "3.1 mm/s"
    band = { min = "10 Hz", max = "1000 Hz" }   # broadband reading over this band ...
    # frequency = "24.7 Hz"              # ... or a filtered reading at one frequency
    speed = "1480 rpm"                   # running speed during the survey
    date = 2026-11-14

    [[measurement]]
    location = "clamped-part"
    joint = "motor feet to base frame"   # the joint's name, or its number (1 = first)
    quantity = "acceleration"
    spectrum = { path = "data/motor-feet.csv", unit = "m/s^2", window = "hann" }

A spectrum file is a CSV of frequency [Hz] and amplitude (in ``spectrum.unit``), one line
a row, frequencies strictly increasing, an optional header row and ``#`` comments. The
file is read when the design is loaded with its project root (:func:`read_spectra`);
rules get the numbers from :func:`measurement_spectrum`.
"""


import datetime
import math
from pathlib import Path
from typing import Annotated, Literal

from pydantic import Field, model_validator
from pydantic_core import PydanticCustomError

from ..records import Record
from .fields import DesignModel, quantity, read_by
from .problems import InputError, InputProblem, format_key_path
from .units import QUANTITY_KINDS, Amount, UnitError, parse_amount

__all__ = [
    "LOCATIONS",
    "MAX_SPECTRUM_BYTES",
    "MAX_SPECTRUM_ROWS",
    "Band",
    "Measurement",
    "MeasuredSpectrum",
    "Spectrum",
    "joint_index",
    "location_problems",
    "measurement_spectrum",
    "read_spectra",
]

LOCATIONS = ("bearing", "frame-above-isolators", "support-below-isolators", "floor",
             "clamped-part")
"""Where on an installation a measurement may be taken."""

MAX_SPECTRUM_BYTES = 4 << 20
"""Largest spectrum file read, 4 MiB: an analyser's spectrum is a few thousand lines."""

MAX_SPECTRUM_ROWS = 100_000
"""Most lines read from one spectrum file."""

_MAX_BAD_ROWS = 20

DEFAULT_READINGS = {"velocity": "rms", "acceleration": "rms", "displacement": "peak"}
"""Reading taken when a measurement does not state one: RMS for velocity (the statement
of ISO 10816 / ISO 20816 severity, common practice) and for acceleration; peak for
displacement, the larger of the two usual statements, which errs to the cautious side
for a load (common practice)."""

_KIND = {"velocity": "velocity", "acceleration": "acceleration", "displacement": "length"}
_READ = "measurement"

ExactFrequency = quantity("frequency", tolerance=False)


def _unit(raw: object) -> str:
    if not isinstance(raw, str) or not raw.strip():
        raise PydanticCustomError(_READ, "a spectrum unit is text such as \"mm/s\", "
                                  "\"m/s^2\", \"g\" or \"um\"")
    return raw.strip()


SpectrumUnit = Annotated[
    str, read_by(_unit,
                 {"type": "string", "examples": ["mm/s", "m/s^2", "g", "um"],
                  "description": "unit of the spectrum's amplitude column"}),
]


def _date(raw: object) -> datetime.date:
    if isinstance(raw, datetime.datetime):
        return raw.date()
    if isinstance(raw, datetime.date):
        return raw
    if isinstance(raw, str):
        try:
            return datetime.date.fromisoformat(raw.strip())
        except ValueError:
            pass
    raise PydanticCustomError(_READ, f"a date is a TOML date such as 2026-11-14, got {raw!r}")


SurveyDate = Annotated[
    datetime.date, read_by(_date,
                           {"description": "date of the survey, a TOML date such as 2026-11-14"}),
]


def _joint_reference(raw: object) -> str | int:
    if isinstance(raw, str) and raw.strip():
        return raw
    if isinstance(raw, int) and not isinstance(raw, bool) and raw >= 1:
        return raw
    given = str(raw).lower() if isinstance(raw, bool) else repr(raw)
    raise PydanticCustomError(_READ, "'joint' names a [[joint]] by its name (text, e.g. "
                              f"\"motor feet\") or its number (1 for the first), got {given}")


JointReference = Annotated[
    object, read_by(_joint_reference,
                    {"anyOf": [{"type": "string", "minLength": 1},
                               {"type": "integer", "minimum": 1}],
                     "description": "a joint's name, or its number (1 for the first)"}),
]


class Band(DesignModel):
    """The frequency band of a broadband reading [Hz]."""

    min: ExactFrequency
    max: ExactFrequency

    @model_validator(mode="after")
    def _ordered(self) -> "Band":
        if not self.min.value < self.max.value:
            raise PydanticCustomError(
                _READ, f"the band's 'min' '{self.min.text}' must be below its 'max' "
                f"'{self.max.text}'")
        return self


class Spectrum(DesignModel):
    """An amplitude spectrum in a CSV file: frequency [Hz], amplitude [``unit``]."""

    path: str = Field(min_length=1, description="CSV file relative to the project root, "
                      "e.g. \"data/motor-feet.csv\"")
    unit: SpectrumUnit = Field(description="unit of the amplitudes, e.g. \"mm/s\"")
    window: Literal["uniform", "hann", "hamming", "flat-top"] = Field(
        description="analysis window of the spectrum, for its noise bandwidth (Parseval)")

    @model_validator(mode="after")
    def _csv(self) -> "Spectrum":
        if Path(self.path).suffix.lower() != ".csv":
            raise PydanticCustomError(_READ, f"a spectrum file is a .csv file, got "
                                      f"'{self.path}'")
        return self


class Measurement(DesignModel):
    """One measured reading or spectrum of a commissioning survey."""

    name: str = Field("", description="what was measured, e.g. 'pump drive-end bearing'")
    location: Literal["bearing", "frame-above-isolators", "support-below-isolators", "floor",
                      "clamped-part"] = Field(description="where the transducer sat")
    joint: JointReference | None = Field(
        None, description="with location = \"clamped-part\": the joint by name, or its "
        "number (1 for the first [[joint]])")
    direction: Literal["vertical", "horizontal", "axial"] | None = Field(
        None, description="direction of the transducer")
    quantity: Literal["velocity", "acceleration", "displacement"] | None = Field(
        None, description="what was measured")
    reading: Literal["rms", "peak", "peak-to-peak"] | None = Field(
        None, description="how the value (or each spectrum line) is stated; default RMS for "
        "velocity and acceleration, peak for displacement")
    value: str | None = Field(None, description="the reading with its unit, e.g. \"3.1 mm/s\"",
                              examples=["3.1 mm/s"])
    band: Band | None = Field(None, description="band of a broadband reading, e.g. "
                              "{ min = \"10 Hz\", max = \"1000 Hz\" }")
    frequency: ExactFrequency | None = Field(
        None, description="frequency of a filtered reading, e.g. \"24.7 Hz\"")
    spectrum: Spectrum | None = Field(None, description="a spectrum file instead of 'value'")
    speed: ExactFrequency | None = Field(None, description="running speed during the survey")
    date: SurveyDate | None = None
    machine_group: Literal[1, 2] | None = Field(
        None, description="ISO 10816-3 / ISO 20816-3 machine group for a bearing reading: "
        "1 above 300 kW or shaft height 315 mm and more, 2 from 15 to 300 kW or shaft "
        "height 160 to 315 mm; from machine.power otherwise")
    support_class: Literal["rigid", "flexible"] | None = Field(
        None, description="ISO 10816-3 support class for a bearing reading; from the "
        "natural frequencies otherwise")

    @model_validator(mode="after")
    def _complete(self) -> "Measurement":
        errors: list[tuple[tuple, str, object]] = []
        if self.quantity is None:
            errors.append((("quantity",), "a measurement needs 'quantity': velocity, "
                           "acceleration or displacement", None))
        if (self.value is None) == (self.spectrum is None):
            errors.append(((), "give 'value' (one reading, e.g. \"3.1 mm/s\") or 'spectrum' "
                           "(a CSV file), one of them", None))
        if self.value is not None:
            if self.band is None and self.frequency is None:
                errors.append(((), "a measured 'value' needs 'band' (the band of a broadband "
                               "reading, e.g. { min = \"10 Hz\", max = \"1000 Hz\" }) or "
                               "'frequency' (of a filtered reading, e.g. \"24.7 Hz\")", None))
            elif self.band is not None and self.frequency is not None:
                errors.append(((), "give 'band' (a broadband reading) or 'frequency' (a "
                               "filtered reading), not both", None))
            if self.quantity is not None:
                message = _value_problem(self.value, self.quantity)
                if message:
                    errors.append((("value",), message, self.value))
        if self.spectrum is not None and (self.band is not None or self.frequency is not None):
            errors.append(((), "a 'spectrum' covers its own frequencies: leave 'band' and "
                           "'frequency' out", None))
        if self.spectrum is not None and self.quantity is not None:
            try:
                _spectrum_factor(self.spectrum.unit, self.quantity)
            except ValueError as exc:
                errors.append((("spectrum", "unit"), str(exc), self.spectrum.unit))
        if self.location == "clamped-part" and self.joint is None:
            errors.append((("joint",), "a measurement on the 'clamped-part' names its joint: "
                           "joint = \"motor feet\" (the joint's name) or joint = 1", None))
        if self.location != "clamped-part" and self.joint is not None:
            errors.append((("joint",), "'joint' names the joint of a clamped-part "
                           "measurement; leave it out for location = "
                           f"\"{self.location}\"", self.joint))
        if self.location != "bearing" and (self.machine_group or self.support_class):
            errors.append(((), "'machine-group' and 'support-class' choose the zone "
                           "boundaries of a bearing reading; leave them out for location = "
                           f"\"{self.location}\"", None))
        if errors:
            from .fatigue_details import _located

            raise _located(errors)
        return self

    @property
    def amount(self) -> Amount | None:
        """The reading in SI units (None for a spectrum)."""
        if self.value is None or self.quantity is None:
            return None
        return parse_amount(self.value, _KIND[self.quantity], allow_tolerance=False)

    @property
    def reading_used(self) -> str:
        """The reading stated, or the default of the quantity."""
        return self.reading or DEFAULT_READINGS[self.quantity or "velocity"]

    def label(self, index: int) -> str:
        """How a finding names this measurement: "measurement[2] 'pump bearing'"."""
        return f"measurement[{index + 1}]" + (f" '{self.name}'" if self.name else "")


def _value_problem(value: str, quantity_name: str) -> str:
    kind = _KIND[quantity_name]
    try:
        amount = parse_amount(value, kind, allow_tolerance=False)
    except UnitError as exc:
        return str(exc)
    if amount.value < 0:
        return f"a measured value must not be negative, got '{value.strip()}'"
    if not amount.value > 0:
        return f"a measured value must be greater than zero, got '{value.strip()}'"
    return ""


def _spectrum_factor(unit: str, quantity_name: str) -> float:
    """SI factor of a spectrum's amplitude unit; ValueError naming what is accepted."""
    kind = _KIND[quantity_name]
    try:
        return parse_amount(f"1 {unit}", kind, allow_tolerance=False).value
    except UnitError:
        spec = QUANTITY_KINDS[kind]
        raise ValueError(f"'{unit}' is not a unit of {spec.name} (the measurement's "
                         f"quantity); units accepted: {', '.join(spec.accepted)}") from None


# ------------------------------------------------------------ checks on the design


def joint_index(design, reference: str | int) -> int | None:
    """Index of the joint a measurement names (by name, or 1-based number), or None."""
    joints = design.joint
    if isinstance(reference, int) and not isinstance(reference, bool):
        return reference - 1 if 1 <= reference <= len(joints) else None
    for index, joint in enumerate(joints):
        if joint.name == reference:
            return index
    return None


def location_problems(design) -> list[tuple[tuple, str, object]]:
    """Measurements at a location the design does not have, as (key path, message, given).

    Above or below the isolators needs a mounting on isolators; a clamped part needs the
    joint it names.
    """
    errors: list[tuple[tuple, str, object]] = []
    mounting = design.mounting
    isolated = mounting is not None and mounting.kind != "rigid"
    for index, measurement in enumerate(design.measurement):
        here = ("measurement", index)
        if measurement.location in ("frame-above-isolators", "support-below-isolators") \
                and not isolated:
            how = ("is rigidly mounted (mounting.kind = \"rigid\")" if mounting is not None
                   else "has no [mounting] on isolators")
            errors.append((here + ("location",), f"location \"{measurement.location}\": this "
                           f"machine {how}, so there is nothing above or below isolators to "
                           "measure on", measurement.location))
        if measurement.location == "clamped-part" and measurement.joint is not None \
                and joint_index(design, measurement.joint) is None:
            names = ", ".join(f"'{j.name}'" for j in design.joint) or "none"
            what = (f"joint {measurement.joint}" if isinstance(measurement.joint, int)
                    else f"joint '{measurement.joint}'")
            errors.append((here + ("joint",), f"{what} is not a [[joint]] of this design "
                           f"(its joints: {names})", measurement.joint))
        if measurement.speed is not None:
            speed = design.machine.speed
            if not (speed.min.value * (1 - 1e-9) <= measurement.speed.value
                    <= speed.max.value * (1 + 1e-9)):
                where = (f"outside the machine's speed range {speed.min.text} to "
                         f"{speed.max.text}" if speed.is_range
                         else f"not the machine's speed {speed.min.text}")
                errors.append((here + ("speed",), f"survey speed '{measurement.speed.text}' "
                               f"is {where}", measurement.speed.text))
    return errors


# ---------------------------------------------------------------- spectrum files


class MeasuredSpectrum(Record):
    """The lines of a measurement's spectrum file, SI: frequencies [Hz], amplitudes
    [m/s, m/s^2 or m] stated as the measurement's reading; ``file`` is the CSV read."""

    frequency: object
    amplitude: object
    file: str


def measurement_spectrum(design, index: int) -> MeasuredSpectrum:
    """The spectrum of measurement ``index``; LookupError if its file was not read (the
    design was loaded without its project root)."""
    stored = getattr(design, "_spectra", ()) or ()
    if index < len(stored) and stored[index] is not None:
        return stored[index]
    raise LookupError(f"the spectrum file of {design.measurement[index].label(index)} was "
                      "not read (the design was loaded without its project root)")


def read_spectra(design, root: Path) -> tuple:
    """Read every measurement's spectrum file; InputError with every problem at once.

    Returns one :class:`MeasuredSpectrum` a measurement (None for a single reading).
    """
    problems: list[InputProblem] = []
    spectra: list = []
    for index, measurement in enumerate(design.measurement):
        if measurement.spectrum is None:
            spectra.append(None)
            continue
        try:
            spectra.append(_read_spectrum(design, root, index, measurement))
        except InputError as exc:
            problems += exc.problems
            spectra.append(None)
    if problems:
        raise InputError(problems)
    return tuple(spectra)


def _problem(design, key: tuple, message: str) -> InputProblem:
    file, line, column = design.locate(key)
    return InputProblem(file, line, column, format_key_path(key), message)


def _column(line: str, index: int) -> int:
    cells = line.split(",")
    start = sum(len(cell) + 1 for cell in cells[:index])
    if index < len(cells):
        start += len(cells[index]) - len(cells[index].lstrip())
    return min(start, len(line)) + 1


def _number(cell: str) -> float | None:
    try:
        value = float(cell)
    except ValueError:
        return None
    return value if math.isfinite(value) else None


def _read_spectrum(design, root: Path, index: int, measurement: Measurement):
    import os

    from .files import file_identity, open_inside, read_once, read_open

    key = ("measurement", index, "spectrum", "path")
    # opened through every check of the guarded opener for each design that names it;
    # the lines parsed are shared by the designs that name the same unchanged file
    fd, path, _, name = open_inside(root, measurement.spectrum.path, what="spectrum file",
                                    limit=MAX_SPECTRUM_BYTES, where=_problem(design, key, ""))
    try:
        identity = file_identity(fd)
    except BaseException:
        os.close(fd)
        raise
    entry = ("spectrum", path, identity)
    opened = [fd]  # the descriptor until read_open has closed it

    def read():
        raw = read_open(opened.pop(), name, what="spectrum file", limit=MAX_SPECTRUM_BYTES)
        try:
            text = raw.decode("utf-8-sig")
        except UnicodeDecodeError:
            raise InputError([InputProblem(name, 1, 1, "", "spectrum file is not UTF-8 "
                                           "text")]) from None
        return _spectrum_lines(text, name)

    try:
        freqs, values = read_once(entry, read)
    finally:
        if opened:  # not read: the lines came from another design's reading
            os.close(opened.pop())
    factor = _spectrum_factor(measurement.spectrum.unit, measurement.quantity)
    # each design gets arrays of its own (the frequencies are not scaled, so copied)
    return MeasuredSpectrum(freqs.copy(), values * factor, name)


def _spectrum_lines(text: str, name: str):
    """The frequencies [Hz] and amplitudes (in the file's unit) of a spectrum file's
    text; InputError with every bad row located."""
    import numpy as np

    from .fatigue_details import _BLANK_OR_COMMENT, two_number_columns

    rows = [(number, line) for number, line in enumerate(text.splitlines(), start=1)
            if line and (line[0] not in _BLANK_OR_COMMENT
                         or line.strip()[:1] not in ("", "#"))]
    if rows and any(_number(c.strip()) is None for c in rows[0][1].split(",")[:2]):
        rows = rows[1:]  # a header row
    if len(rows) < 2:
        raise InputError([InputProblem(name, 1, 1, "", "a spectrum file needs at least two "
                                       "rows of frequency [Hz] and amplitude")])
    if len(rows) > MAX_SPECTRUM_ROWS:
        raise InputError([InputProblem(name, 1, 1, "", f"the spectrum file has more than "
                                       f"{MAX_SPECTRUM_ROWS} rows")])
    columns = two_number_columns([line for _, line in rows])
    if columns is not None:
        # the checks of the row-by-row reading below on the whole columns: when every
        # row passes, they are the numbers it keeps; a row that fails is read row by row
        f, a = columns
        if (np.isfinite(f).all() and np.isfinite(a).all() and (f >= 0).all()
                and (f[1:] > f[:-1]).all() and (a >= 0).all()):
            return f, a
    problems: list[InputProblem] = []
    bad = 0
    freqs: list[float] = []
    values: list[float] = []
    for number, line in rows:
        cells = line.split(",")  # only the first two cells are read (and echoed, stripped)
        message, column = "", 1
        if len(cells) < 2:
            message = "a row needs a frequency [Hz] and an amplitude"
        else:
            cells[0], cells[1] = cells[0].strip(), cells[1].strip()
            f, a = _number(cells[0]), _number(cells[1])
            if f is None:
                message, column = f"frequency '{cells[0]}' is not a finite number", \
                    _column(line, 0)
            elif a is None:
                message, column = f"amplitude '{cells[1]}' is not a finite number", \
                    _column(line, 1)
            elif f < 0:
                message, column = f"a frequency must not be negative, got {f:g} Hz", \
                    _column(line, 0)
            elif freqs and f <= freqs[-1]:
                message, column = (f"frequencies must be strictly increasing: {f:g} Hz "
                                   f"follows {freqs[-1]:g} Hz", _column(line, 0))
            elif a < 0:
                message, column = f"an amplitude must not be negative, got {a:g}", \
                    _column(line, 1)
            else:
                freqs.append(f)
                values.append(a)
        if message:
            bad += 1
            if len(problems) < _MAX_BAD_ROWS:
                problems.append(InputProblem(name, number, column, "", message))
    if problems:
        if bad > len(problems):
            problems.append(InputProblem(name, problems[-1].line, 1, "",
                                         f"{bad - len(problems)} more bad rows not listed"))
        raise InputError(problems)
    return np.asarray(freqs, dtype=float), np.asarray(values, dtype=float)

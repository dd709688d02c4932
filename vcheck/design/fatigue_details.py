"""Fatigue-critical details of a design: the ``[[fatigue]]`` tables.

A fatigue detail is a vibrating member, weld or small-bore connection whose stress
cycles over the design life are counted and judged against an S-N curve::

    [[fatigue]]
    name = "gauge tapping on the discharge"
    detail = "EN 1993-1-9:71"            # or "IIW:FAT90", "DNV-RP-C203:D", or a table
    life = { years = 25, hours-per-year = "6000 h" }

    [[fatigue.block]]                    # one source of cycles (see below)
    name = "full speed"
    stress-range = "14 MPa"
    order = "1x"                         # once a revolution; or frequency = "25 Hz"
    share = 0.7                          # of the operating hours

The detail names its S-N curve by a name of
:data:`vcheck.dynamics.fatigue.sn_curves.SN_CURVES` or a plugin's curve ("ACME:weld-7": a name
with a colon outside the three published families is looked up among the curves that
plugins contribute, when the rule runs), or gives its own curve as a table of points
``{ points = [[1e5, "180 MPa"], [2e6, "71 MPa"]] }`` (cycles, stress range).

Exactly one source of cycles is given:

- ``[[fatigue.block]]`` duty blocks: a stress range, or a response level with the stress
  range per unit of it, at a fixed frequency or an order of running speed, for a share
  of the operating hours; blocks may overlap in time (a 1x and a vane-pass component
  both run all the hours), each is counted on its own;
- ``history``: a measured or simulated record in a CSV or ``.npy`` file inside the
  project root, with its channel, the stress per unit of the recorded value and the time
  the record stands for; rainflow counted by the rule;
- ``psd``: a one-sided stress PSD, inline points or a CSV file, frequencies in Hz, with
  the unit of its values ("MPa^2/Hz") and the method (Dirlik, narrow band, three band);
- ``base-psd``: a base-acceleration PSD under a detail that responds as one lightly
  damped mode, with its natural frequency, Q (or damping ratio) and the stress per g of
  response (Miles' equation).

Files are read here, on the input side (:func:`read_fatigue_inputs`, called from
:func:`vcheck.design.loader.attach_references`); rules get the numbers through
:func:`fatigue_input`. Every problem is located: the key of the design, or the data
file's line.

Messages of errors that already quote the value are raised with the error types the
loader passes through unchanged ("unit", "positive"); see ``validation_problems`` in
:mod:`vcheck.design.loader`.
"""


import math
import re
from pathlib import Path
from typing import Annotated, Literal, Union

from pydantic import Field, field_validator, model_validator
from pydantic_core import PydanticCustomError

from ..records import Record
from .fields import DesignModel, Frequency, Length, SpeedValue, Stress, quantity, read_by
from .problems import InputError, InputProblem, format_key_path
from .units import Amount, UnitError, parse_amount

__all__ = [
    "BasePSD",
    "DesignLife",
    "DutyBlock",
    "FatigueDetail",
    "FatigueInput",
    "HOURS_IN_A_YEAR",
    "MAX_HISTORY_BYTES",
    "MAX_HISTORY_SAMPLES",
    "MAX_PSD_ROWS",
    "PUBLISHED_FAMILIES",
    "ResponseLevel",
    "SizeEffect",
    "ThicknessCorrection",
    "StressPSD",
    "StressPerResponse",
    "TimeHistory",
    "UserCurve",
    "fatigue_input",
    "read_fatigue_inputs",
    "read_psd_unit",
]

_READ = "unit"  # loader error type: the message is complete, the value cannot be used
_RANGE = "positive"  # loader error type: the message is complete, the value is out of range

MAX_HISTORY_BYTES = 64 << 20
"""Largest time-history file read, 64 MiB: about five million CSV rows or eight million
float64 samples, minutes of a record sampled at kilohertz rates."""

MAX_HISTORY_SAMPLES = 10_000_000
"""Most samples taken from one time-history channel."""

MAX_PSD_ROWS = 100_000
"""Most rows of a PSD file: a spectrum has hundreds to thousands of lines."""

HOURS_IN_A_YEAR = 8766.0
"""Hours in a year of 365.25 days, the most operating hours a year can hold [h]."""

PUBLISHED_FAMILIES = ("EN 1993-1-9", "IIW", "DNV-RP-C203")
"""Families of the published S-N curves; a curve name in one of them must be one of
:data:`vcheck.dynamics.fatigue.sn_curves.SN_CURVES`."""

_MAX_BAD_ROWS = 20

MIN_ORDER, MAX_ORDER = 1e-3, 1e3
"""Orders of running speed read (common practice: sub-synchronous whirl near 0.4x to
blade and gear-mesh orders in the hundreds)."""

MAX_DESIGN_SAMPLES = 2 * 10_000_000
"""Most time-history samples read for one design, all its details together (memory:
8 bytes a sample are kept until the rules have run)."""

MAX_REPEATS = 1e15
"""Most repetitions of a recorded history over the design life (a 1 ms record repeated
over 30 years is 1e12)."""

MIN_YEARS, MAX_YEARS = 1e-6, 1e3
"""Design lives read, in years."""

PSD_VALUE_RANGE = (1e-30, 1e20)
"""Magnitudes of a PSD value that is not zero, in the unit it is written in; values
beyond these would under- or overflow in the spectral moments."""

MAX_PSD_FREQUENCY = 1e6
"""Highest PSD frequency read [Hz]."""
"""Bad rows of a data file reported one by one before the rest are summed up."""

_G = 9.80665  # standard gravity [m/s^2], exact (3rd CGPM, 1901)

Time = quantity("time", tolerance=False)
ExactStress = quantity("stress", tolerance=False)
ExactFrequency = quantity("frequency", tolerance=False)
MeanStress = quantity("stress", tolerance=False, positive=None)


# ------------------------------------------------------------------------- helpers


def _located(errors: list[tuple[tuple, str, object]]):
    """A ValidationError with each message at its own key path below the field."""
    from pydantic import ValidationError
    from pydantic_core import InitErrorDetails

    return ValidationError.from_exception_data("fatigue", [
        InitErrorDetails(type=PydanticCustomError(_READ, message), loc=loc, input=value)
        for loc, message, value in errors])


def _number(value: object) -> float | None:
    """A TOML number as float, None for anything else (booleans included)."""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return None
    return float(value)


def _share(raw: object) -> float:
    value = _number(raw)
    if isinstance(raw, str) and raw.strip().endswith("%"):
        try:
            value = float(raw.strip()[:-1]) / 100.0
        except ValueError:
            value = None
    if value is None or not math.isfinite(value):
        raise PydanticCustomError(
            _READ, f"a share of the operating hours is a number from 0 to 1, such as 0.25 "
            f"or \"25%\", got {raw!r}")
    if not 0 < value <= 1:
        raise PydanticCustomError(
            _RANGE, f"a share of the operating hours must be above 0 and at most 1, got {raw!r}")
    return value


Share = Annotated[
    float,
    read_by(_share,
            {"anyOf": [{"type": "number", "exclusiveMinimum": 0, "maximum": 1},
                       {"type": "string", "pattern": r"^\s*[0-9.]+\s*%\s*$"}],
             "description": "share of the operating hours, 0 to 1 or a percentage",
             "examples": [0.25, "25%"]}),
]


def _stress_range(raw: object) -> Amount:
    try:
        amount = raw if isinstance(raw, Amount) else parse_amount(raw, "stress")
    except UnitError as exc:
        raise PydanticCustomError(_READ, str(exc).replace("a stress or pressure",
                                                          "a stress range")) from None
    if amount.low < 0:
        raise PydanticCustomError(
            _RANGE, f"a stress range must not be negative, got '{amount.text}'")
    return amount


StressRange = Annotated[
    Amount,
    read_by(_stress_range,
            {"type": "string", "examples": ["14 MPa", "2 ksi"],
             "description": "stress range, peak to valley, with its unit"}),
]


def read_psd_unit(raw: object, kind: str) -> tuple[float, str]:
    """The SI factor of a spectral-density unit such as "MPa^2/Hz" or "g^2/Hz".

    ``kind`` is "stress" (result in Pa^2/Hz) or "acceleration" ((m/s^2)^2/Hz). Raises
    ValueError with a message that shows what is expected.
    """
    examples = {"stress": '"MPa^2/Hz" or "ksi^2/Hz"',
                "acceleration": '"g^2/Hz" or "(m/s^2)^2/Hz"'}[kind]
    what = {"stress": "a stress", "acceleration": "an acceleration"}[kind]
    expected = f"write {what} unit squared per hertz, such as {examples}"
    if not isinstance(raw, str):
        raise ValueError(f"a spectral density unit is text: {expected}")
    text = raw.strip().replace("²", "^2")
    head, slash, tail = text.rpartition("/")
    head = head.strip()
    if not slash or tail.strip() != "Hz" or not head.endswith("^2"):
        raise ValueError(f"cannot read '{raw}' as a spectral density unit: {expected}")
    base = head[:-2].strip()
    if base.startswith("(") and base.endswith(")"):
        base = base[1:-1].strip()
    try:
        factor = parse_amount(f"1 {base}", kind, allow_tolerance=False).value
    except UnitError:
        raise ValueError(f"cannot read '{raw}' as a spectral density unit: {expected}") from None
    return factor * factor, raw.strip()


# ------------------------------------------------------------------------ S-N curve


def _check_curve_name(name: str) -> str:
    """A published curve name, or a plugin's name outside the published families."""
    from ..dynamics.fatigue.sn_curves import SN_CURVES, sn_curve

    if name in SN_CURVES:
        return name
    family = name.rpartition(":")[0]
    folded = "".join(family.lower().split())
    published = ["".join(f.lower().split()) for f in PUBLISHED_FAMILIES]
    if ":" in name and folded and not any(
            folded.startswith(p[:3]) or p.startswith(folded) for p in published):
        return name  # a plugin's curve: looked up in the catalog when the rule runs
    try:
        sn_curve(name)
    except ValueError as exc:
        raise PydanticCustomError(_READ, str(exc)) from None
    return name  # pragma: no cover - sn_curve accepts only the names above


def _curve_points(raw: object) -> tuple[tuple[float, Amount], ...]:
    example = 'points = [[1e5, "180 MPa"], [2e6, "71 MPa"], [1e8, "29 MPa"]]'
    if not isinstance(raw, (list, tuple)) or len(raw) < 2:
        raise PydanticCustomError(
            _READ, f"an S-N curve needs at least two points of cycles and stress range, "
            f"such as {example}")
    errors: list[tuple[tuple, str, object]] = []
    points: list[tuple[float, Amount]] = []
    for i, point in enumerate(raw):
        if not isinstance(point, (list, tuple)) or len(point) != 2:
            errors.append(((i,), f"a point is [cycles, stress range], such as "
                           f"[2e6, \"71 MPa\"], got {point!r}", point))
            continue
        cycles = _number(point[0])
        if cycles is None or not math.isfinite(cycles) or cycles <= 0:
            errors.append(((i, 0), f"cycles must be a number above zero, such as 2e6, got "
                           f"{point[0]!r}", point[0]))
            continue
        try:
            stress = parse_amount(point[1], "stress", allow_tolerance=False)
        except UnitError as exc:
            errors.append(((i, 1), str(exc), point[1]))
            continue
        if stress.value <= 0:
            errors.append(((i, 1), f"a stress range of a curve must be above zero, got "
                           f"'{stress.text}'", point[1]))
            continue
        if points and cycles <= points[-1][0]:
            errors.append(((i, 0), f"cycles must be strictly increasing: {cycles:g} follows "
                           f"{points[-1][0]:g}", point[0]))
        elif points and stress.value >= points[-1][1].value:
            errors.append(((i, 1), f"stress ranges must be strictly decreasing: "
                           f"'{stress.text}' follows '{points[-1][1].text}'", point[1]))
        points.append((cycles, stress))
    if errors:
        raise _located(errors)
    return tuple(points)


CurvePoints = Annotated[
    tuple,
    read_by(_curve_points,
            {"type": "array", "minItems": 2,
             "items": {"type": "array", "prefixItems": [{"type": "number"},
                                                        {"type": "string"}]},
             "description": "points [cycles, stress range], cycles increasing",
             "examples": [[[1e5, "180 MPa"], [2e6, "71 MPa"]]]}),
]


class UserCurve(DesignModel):
    """An S-N curve of the engineer's own: points joined by straight lines in log-log."""

    name: str = Field("user-defined", min_length=1, max_length=80,
                      description="a label for reports, e.g. 'bracket weld, test series 4'")
    points: CurvePoints = Field(description="[cycles, stress range] pairs, e.g. "
                                "[[1e5, \"180 MPa\"], [2e6, \"71 MPa\"]]")
    extend_below: bool = Field(
        False, description="continue the last segment below the last point; by default "
        "ranges below the last point do no damage")
    constant_amplitude_limit: ExactStress | None = Field(
        None, description="constant-amplitude fatigue limit, e.g. \"52 MPa\"")
    source: str = Field("", description="where the data come from, e.g. 'test report TR-118'")

    def sn_curve(self):
        """The curve as a :class:`vcheck.dynamics.fatigue.sn_curves.PiecewiseLogLogCurve`."""
        from ..dynamics.fatigue.sn_curves import PiecewiseLogLogCurve

        limit = self.constant_amplitude_limit
        return PiecewiseLogLogCurve(
            tuple(n for n, _ in self.points), tuple(s.value for _, s in self.points),
            extend_below=self.extend_below,
            constant_amplitude_limit=None if limit is None else limit.value,
            name=self.name)


def _detail(raw: object) -> str | UserCurve:
    if isinstance(raw, (str, UserCurve)):
        return _check_curve_name(raw.strip()) if isinstance(raw, str) else raw
    if isinstance(raw, dict):
        return UserCurve.model_validate(raw)
    raise PydanticCustomError(
        _READ, "a detail is the name of an S-N curve, such as \"EN 1993-1-9:71\", "
        "\"IIW:FAT90\" or \"DNV-RP-C203:D\", or a table of points, such as "
        "{ points = [[1e5, \"180 MPa\"], [2e6, \"71 MPa\"]] }")


DetailCurve = Annotated[
    Union[str, UserCurve],
    read_by(_detail,
            {"anyOf": [{"type": "string"}, {"type": "object"}],
             "description": "S-N curve: a published name or a table of points",
             "examples": ["EN 1993-1-9:71", "IIW:FAT90", "DNV-RP-C203:D"]}),
]


# ------------------------------------------------------------------------ duty blocks


class ResponseLevel(Record):
    """A response amplitude: "acceleration" [m/s^2], "velocity" [m/s] or "displacement"
    [m], as written."""

    quantity: str
    amount: Amount


_RESPONSE_KINDS = (("acceleration", "acceleration"), ("velocity", "velocity"),
                   ("displacement", "length"))


def _response(raw: object) -> ResponseLevel:
    if isinstance(raw, ResponseLevel):
        return raw
    if isinstance(raw, str):
        for name, kind in _RESPONSE_KINDS:
            try:
                amount = parse_amount(raw, kind)
            except UnitError:
                continue
            if amount.low <= 0:
                raise PydanticCustomError(
                    _RANGE, f"a response level must be greater than zero, got '{amount.text}'")
            return ResponseLevel(name, amount)
    raise PydanticCustomError(
        _READ, f"cannot read {raw!r} as a response level: write an acceleration, a velocity "
        "or a displacement with its unit, such as \"0.8 g\", \"4.5 mm/s\" or \"0.1 mm\"")


Response = Annotated[
    ResponseLevel,
    read_by(_response,
            {"type": "string", "examples": ["0.8 g", "4.5 mm/s", "0.1 mm"],
             "description": "response amplitude: acceleration, velocity or "
                            "displacement with its unit"}),
]


def _order(raw: object) -> float:
    value = _number(raw)
    if isinstance(raw, str):
        match = re.fullmatch(r"\s*([0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)\s*[xX×]\s*", raw)
        value = float(match[1]) if match else None
    if value is None or not math.isfinite(value):
        raise PydanticCustomError(
            _READ, f"an order of running speed is written \"1x\", \"2x\" or as a number, "
            f"got {raw!r}")
    if value <= 0:
        raise PydanticCustomError(
            _RANGE, f"an order of running speed must be greater than zero, got {raw!r}")
    if not MIN_ORDER <= value <= MAX_ORDER:
        raise PydanticCustomError(
            _RANGE, f"an order of running speed is read from {MIN_ORDER:g} to "
            f"{MAX_ORDER:g} times the speed, got {raw!r}")
    return value


Order = Annotated[
    float,
    read_by(_order,
            {"anyOf": [{"type": "string", "pattern": r"^\s*[0-9.]+\s*[xX]\s*$"},
                       {"type": "number", "exclusiveMinimum": 0}],
             "description": "multiple of running speed", "examples": ["1x", "2x", 0.38]}),
]


class StressPerResponse(DesignModel):
    """The stress range at the detail for a stated response: "9 MPa per 1 g"."""

    stress_range: StressRange = Field(description="stress range at the detail, e.g. \"9 MPa\"")
    per: Response = Field(description="the response that gives it, e.g. \"1 g\"")


class DutyBlock(DesignModel):
    """One operating condition: a stress range at a frequency for a share of the hours."""

    name: str | None = Field(None, min_length=1, max_length=120,
                             description="e.g. 'full speed'; 'block N' when left out")
    stress_range: StressRange | None = Field(
        None, description="stress range at the detail, peak to valley, e.g. \"14 MPa\"")
    response: Response | None = Field(
        None, description="response level instead of a stress range, e.g. \"0.8 g\"")
    stress_per_response: StressPerResponse | None = Field(
        None, description="with 'response': e.g. { stress-range = \"9 MPa\", per = \"1 g\" }")
    frequency: Frequency | None = Field(None, description="cycle frequency, e.g. \"25 Hz\"")
    order: Order | None = Field(None, description="cycles per revolution, e.g. \"1x\", \"2x\"")
    speed: SpeedValue | None = Field(
        None, description="with 'order': the running speed of this block, e.g. \"1200 rpm\"; "
        "the top of the machine's speed range when left out")
    share: Share = Field(1.0, description="share of the operating hours, e.g. 0.25")

    @model_validator(mode="after")
    def _consistent(self) -> "DutyBlock":
        if (self.stress_range is None) == (self.response is None):
            raise PydanticCustomError(
                "fatigue", "give the 'stress-range' of the block (e.g. \"14 MPa\"), or a "
                "'response' (e.g. \"0.8 g\") with 'stress-per-response', one of them")
        if self.response is not None:
            per = self.stress_per_response
            if per is None:
                raise PydanticCustomError(
                    "fatigue", "with a 'response', give 'stress-per-response', e.g. "
                    "{ stress-range = \"9 MPa\", per = \"1 g\" }")
            if per.per.quantity != self.response.quantity:
                raise PydanticCustomError(
                    "fatigue", f"the response is {_a(self.response.quantity)} "
                    f"('{self.response.amount.text}') but 'stress-per-response' is per "
                    f"{_a(per.per.quantity)} ('{per.per.amount.text}')")
        elif self.stress_per_response is not None:
            raise PydanticCustomError(
                "fatigue", "'stress-per-response' goes with a 'response'; with a "
                "'stress-range' leave it out")
        if (self.frequency is None) == (self.order is None):
            raise PydanticCustomError(
                "fatigue", "give the 'frequency' of the cycles (e.g. \"25 Hz\") or their "
                "'order' of running speed (e.g. \"1x\"), one of them")
        if self.speed is not None and self.order is None:
            raise PydanticCustomError("fatigue", "'speed' goes with an 'order'")
        return self

    @property
    def worst_stress_range(self) -> float:
        """The largest stress range within the stated tolerances [Pa]."""
        if self.stress_range is not None:
            return self.stress_range.high
        per = self.stress_per_response
        return self.response.amount.high * per.stress_range.high / per.per.amount.low

    @property
    def has_tolerance(self) -> bool:
        if self.stress_range is not None:
            return self.stress_range.has_tolerance
        per = self.stress_per_response
        return (self.response.amount.has_tolerance or per.stress_range.has_tolerance
                or per.per.amount.has_tolerance)


def _a(quantity_name: str) -> str:
    return ("an " if quantity_name[0] in "aeiou" else "a ") + quantity_name


# ------------------------------------------------------------------- time histories


def _channel(raw: object) -> str | int | None:
    if raw is None:
        return None
    if isinstance(raw, str) and raw.strip():
        return raw.strip()
    if isinstance(raw, int) and not isinstance(raw, bool) and raw >= 1:
        return raw
    raise PydanticCustomError(
        _READ, f"a channel is a column name, such as \"strain_2\", or a column number "
        f"counted from 1, got {raw!r}")


Channel = Annotated[
    Union[str, int, None],
    read_by(_channel,
            {"anyOf": [{"type": "string"}, {"type": "integer", "minimum": 1}],
             "description": "column name or number (from 1)",
             "examples": ["strain_2", 3]}),
]


class TimeHistory(DesignModel):
    """A recorded or simulated stress or strain history in a CSV or ``.npy`` file."""

    path: str = Field(min_length=1, description="relative to the project root, e.g. "
                      "\"data/branch-strain.csv\"")
    channel: Channel = Field(None, description="column name or number (from 1); may be "
                             "left out when the file has one column")
    scale: ExactStress = Field(description="stress per unit of the recorded value, e.g. "
                               "\"210 GPa\" for strain, \"1 MPa\" for a record in MPa")
    duration: Time | None = Field(
        None, description="operating time the record stands for, e.g. \"60 s\"; the record "
        "repeats over the operating hours (share x life / duration times)")
    repeats: float | None = Field(
        None, description="instead of 'duration': how many times the record repeats over "
        "the design life, 1 or more, e.g. 2.9e7; 1 for a record of the whole life")
    share: Share = Field(1.0, description="with 'duration': share of the operating hours "
                         "like the record")

    @field_validator("repeats", mode="before")
    @classmethod
    def _repeats(cls, value: object) -> object:
        number = _number(value)
        if value is not None and (number is None or not math.isfinite(number)):
            raise PydanticCustomError(
                _READ, f"'repeats' is a number of repetitions over the design life, 1 or "
                f"more, such as 2.9e7, got {value!r}")
        if number is not None and number < 1:
            raise PydanticCustomError(
                _RANGE, f"'repeats' must be at least 1 (a record that stands for more than "
                f"the life is given by its 'duration'), got {value!r}")
        if number is not None and number > MAX_REPEATS:
            raise PydanticCustomError(
                _RANGE, f"'repeats' is read up to {MAX_REPEATS:g}, got {value!r}")
        return number

    @model_validator(mode="after")
    def _duration_or_repeats(self) -> "TimeHistory":
        if (self.duration is None) == (self.repeats is None):
            raise PydanticCustomError(
                "fatigue", "give the 'duration' the record stands for (e.g. \"60 s\") or "
                "how many times it 'repeats' over the life (e.g. 2.9e7), one of them")
        if self.repeats is not None and self.share != 1.0:
            raise _located([(("share",), "'share' goes with 'duration'; 'repeats' counts the "
                             "repetitions over the whole life already", self.share)])
        return self

    @field_validator("path")
    @classmethod
    def _kind_of_file(cls, value: str) -> str:
        if Path(value).suffix.lower() not in (".csv", ".npy"):
            raise PydanticCustomError(
                _READ, f"a time history is a .csv or a .npy file, got '{value}'")
        return value


# ----------------------------------------------------------------------------- PSD


def _unit_of(kind: str):
    def read(raw: object) -> tuple[float, str]:
        if isinstance(raw, tuple):
            return raw
        try:
            return read_psd_unit(raw, kind)
        except ValueError as exc:
            raise PydanticCustomError(_READ, str(exc)) from None

    return read


def _psd_unit_type(kind: str, examples: list[str]):
    return Annotated[
        tuple,
        read_by(_unit_of(kind),
                {"type": "string", "examples": examples,
                 "description": f"{kind} spectral density unit"}),
    ]


StressPSDUnit = _psd_unit_type("stress", ["MPa^2/Hz", "ksi^2/Hz"])
AccelerationPSDUnit = _psd_unit_type("acceleration", ["g^2/Hz", "(m/s^2)^2/Hz"])


def check_psd_points(rows, where) -> tuple[list[float], list[float], list]:
    """Check PSD rows ``[(frequency, value), ...]``; returns frequencies, values and the
    problems as ``(where(i, column), message, given)``.

    Frequencies must be zero or above and strictly increasing, values zero or above.
    """
    freqs: list[float] = []
    values: list[float] = []
    problems: list = []
    for i, row in enumerate(rows):
        if not isinstance(row, (list, tuple)) or len(row) != 2:
            problems.append((where(i, None), f"a point is [frequency in Hz, PSD value], such "
                             f"as [20, 0.5], got {row!r}", row))
            continue
        f, g = _number(row[0]), _number(row[1])
        if f is None or not math.isfinite(f):
            problems.append((where(i, 0), f"a frequency must be a finite number in Hz, got "
                             f"{row[0]!r}", row[0]))
            continue
        if g is None or not math.isfinite(g):
            problems.append((where(i, 1), f"a PSD value must be a finite number, got "
                             f"{row[1]!r}", row[1]))
            continue
        if f < 0:
            problems.append((where(i, 0), f"a frequency must not be negative, got {f:g} Hz", f))
            continue
        if freqs and f <= freqs[-1]:
            problems.append((where(i, 0), f"frequencies must be strictly increasing: "
                             f"{f:g} Hz follows {freqs[-1]:g} Hz", row[0]))
            continue
        if g < 0:
            problems.append((where(i, 1), f"a PSD value must not be negative, got {g:g} at "
                             f"{f:g} Hz", row[1]))
            continue
        if f > MAX_PSD_FREQUENCY:
            problems.append((where(i, 0), f"a PSD frequency is read up to "
                             f"{MAX_PSD_FREQUENCY:g} Hz, got {f:g} Hz", row[0]))
            continue
        if g != 0 and not PSD_VALUE_RANGE[0] <= g <= PSD_VALUE_RANGE[1]:
            problems.append((where(i, 1), f"a PSD value is read from {PSD_VALUE_RANGE[0]:g} "
                             f"to {PSD_VALUE_RANGE[1]:g} in its unit (or zero), got {g:g} at "
                             f"{f:g} Hz", row[1]))
            continue
        freqs.append(f)
        values.append(g)
    return freqs, values, problems


def _psd_points(raw: object) -> tuple[tuple[float, float], ...]:
    if not isinstance(raw, (list, tuple)) or len(raw) < 2:
        raise PydanticCustomError(
            _READ, "a PSD table needs at least two points [frequency in Hz, PSD value], "
            "such as [[20, 0.5], [200, 0.5]]")
    freqs, values, problems = check_psd_points(
        raw, lambda i, column: (i,) if column is None else (i, column))
    if problems:
        raise _located(problems)
    return tuple(zip(freqs, values))


PSDPoints = Annotated[
    tuple,
    read_by(_psd_points,
            {"type": "array", "minItems": 2,
             "items": {"type": "array", "items": {"type": "number"},
                       "minItems": 2, "maxItems": 2},
             "description": "points [frequency in Hz, PSD value], frequencies "
                            "strictly increasing",
             "examples": [[[20, 0.5], [200, 0.5]]]}),
]


class StressPSD(DesignModel):
    """A one-sided stress PSD at the detail: inline points or a CSV file."""

    points: PSDPoints | None = Field(None, description="[frequency in Hz, PSD] pairs")
    path: str | None = Field(None, min_length=1, description="a CSV file of frequency [Hz] "
                             "and PSD columns, relative to the project root")
    unit: StressPSDUnit = Field(description="unit of the PSD values, e.g. \"MPa^2/Hz\"")
    method: Literal["dirlik", "narrow-band", "three-band"] = Field(
        "dirlik", description="how cycles are drawn from the spectrum")
    share: Share = Field(1.0, description="share of the operating hours with this spectrum")

    @model_validator(mode="after")
    def _one_table(self) -> "StressPSD":
        if (self.points is None) == (self.path is None):
            raise PydanticCustomError(
                "fatigue", "give the PSD as 'points' (e.g. [[20, 0.5], [200, 0.5]]) or as a "
                "CSV file 'path', one of them")
        if self.path is not None and Path(self.path).suffix.lower() != ".csv":
            raise _located([(("path",), f"a PSD file is a .csv file, got '{self.path}'",
                             self.path)])
        return self

    def inline_table(self) -> tuple[list[float], list[float]] | None:
        """Frequencies [Hz] and PSD [Pa^2/Hz] of inline points, None for a file."""
        if self.points is None:
            return None
        factor = self.unit[0]
        return [f for f, _ in self.points], [g * factor for _, g in self.points]


def _level(raw: object) -> tuple[float, str]:
    if isinstance(raw, tuple):
        return raw
    message = (f"cannot read {raw!r} as a spectral density level: write a number and an "
               "acceleration unit squared per hertz, such as \"0.04 g^2/Hz\"")
    if not isinstance(raw, str):
        raise PydanticCustomError(_READ, message)
    match = re.fullmatch(r"\s*([+-]?[0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)\s*(.+?)\s*", raw)
    if not match:
        raise PydanticCustomError(_READ, message)
    try:
        factor, _ = read_psd_unit(match[2], "acceleration")
    except ValueError:
        raise PydanticCustomError(_READ, message) from None
    value = float(match[1]) * factor
    if not (math.isfinite(value) and value > 0):
        raise PydanticCustomError(
            _RANGE, f"a spectral density level must be greater than zero, got '{raw.strip()}'")
    if not PSD_VALUE_RANGE[0] <= float(match[1]) <= PSD_VALUE_RANGE[1]:
        raise PydanticCustomError(
            _RANGE, f"a spectral density level is read from {PSD_VALUE_RANGE[0]:g} to "
            f"{PSD_VALUE_RANGE[1]:g} in its unit, got '{raw.strip()}'")
    return value, raw.strip()


PSDLevel = Annotated[
    tuple,
    read_by(_level,
            {"type": "string", "examples": ["0.04 g^2/Hz"],
             "description": "flat acceleration spectral density level"}),
]


class BasePSD(DesignModel):
    """Random base acceleration under a detail that responds as one lightly damped mode
    (Miles' equation)."""

    level: PSDLevel | None = Field(None, description="flat level at the natural frequency, "
                                   "e.g. \"0.04 g^2/Hz\"")
    points: PSDPoints | None = Field(None, description="instead of 'level': [frequency in "
                                     "Hz, PSD] pairs, read at the natural frequency")
    unit: AccelerationPSDUnit | None = Field(None, description="with 'points': unit of the "
                                             "PSD values, e.g. \"g^2/Hz\"")
    natural_frequency: ExactFrequency = Field(description="of the detail's mode, e.g. \"85 Hz\"")
    q: float | None = Field(None, description="amplification at resonance Q = 1/(2 zeta), "
                            "e.g. 10")
    damping_ratio: float | None = Field(None, description="instead of 'q': fraction of "
                                        "critical damping, e.g. 0.05")
    stress_per_g: Stress = Field(description="stress amplitude at the detail per 1 g of the "
                                 "mode's response acceleration, e.g. \"12 MPa\"")
    share: Share = Field(1.0, description="share of the operating hours with this input")

    @field_validator("q")
    @classmethod
    def _q(cls, value: float | None) -> float | None:
        if value is not None and not 0.5 < value <= 1000:
            raise PydanticCustomError(
                _RANGE, f"Q must be above 0.5 and at most 1000 (a lightly damped mode has "
                f"about 5 to 50), got {value:g}")
        return value

    @field_validator("damping_ratio")
    @classmethod
    def _damping(cls, value: float | None) -> float | None:
        if value is not None and not 0 < value < 1:
            raise PydanticCustomError(
                _RANGE, f"a damping ratio must be above 0 and below 1, got {value:g}")
        return value

    @model_validator(mode="after")
    def _consistent(self) -> "BasePSD":
        if (self.level is None) == (self.points is None):
            raise PydanticCustomError(
                "fatigue", "give the base PSD as a flat 'level' (e.g. \"0.04 g^2/Hz\") or as "
                "'points' with their 'unit', one of them")
        if self.points is not None and self.unit is None:
            raise PydanticCustomError(
                "fatigue", "with 'points', give the 'unit' of the PSD values (e.g. \"g^2/Hz\")")
        if self.points is None and self.unit is not None:
            raise PydanticCustomError("fatigue", "'unit' goes with 'points'")
        if (self.q is None) == (self.damping_ratio is None):
            raise PydanticCustomError(
                "fatigue", "give the mode's 'q' (e.g. 10) or its 'damping-ratio' (e.g. 0.05), "
                "one of them")
        if self.points is not None:
            low, high = self.points[0][0], self.points[-1][0]
            fn = self.natural_frequency.value
            if not low <= fn <= high:
                raise _located([(("natural-frequency",), f"the natural frequency "
                                 f"{fn:g} Hz is outside the base PSD table, {low:g} to "
                                 f"{high:g} Hz", self.natural_frequency.text)])
        return self

    @property
    def quality_factor(self) -> float:
        """Q = 1 / (2 zeta) [unitless]."""
        return self.q if self.q is not None else 1.0 / (2.0 * self.damping_ratio)

    @property
    def asd_at_natural_frequency(self) -> float:
        """Base-acceleration PSD at the natural frequency [(m/s^2)^2/Hz]: the flat level,
        or the table read with straight lines between its points in log-log axes (the
        way test specifications state slopes in dB per octave); linear where a point is
        zero."""
        if self.level is not None:
            return self.level[0]
        fn = self.natural_frequency.value
        factor = self.unit[0]
        pts = self.points
        for (f0, g0), (f1, g1) in zip(pts, pts[1:]):
            if f0 <= fn <= f1:
                if fn == f0:
                    return g0 * factor
                if fn == f1:
                    return g1 * factor
                if f0 > 0 and g0 > 0 and g1 > 0:
                    t = math.log(fn / f0) / math.log(f1 / f0)
                    return math.exp(math.log(g0) + t * math.log(g1 / g0)) * factor
                return (g0 + (g1 - g0) * (fn - f0) / (f1 - f0)) * factor
        raise ValueError("the natural frequency is outside the table")  # pragma: no cover

    @property
    def stress_per_acceleration(self) -> float:
        """Stress at the detail per m/s^2 of response [Pa/(m/s^2)]."""
        return self.stress_per_g.value / _G


# --------------------------------------------------------------------- design life


def _years(raw: object) -> float:
    value = _number(raw)
    if value is None or not math.isfinite(value):
        raise PydanticCustomError(
            _READ, f"the design life in years is a number, such as years = 25, got {raw!r}")
    if value <= 0:
        raise PydanticCustomError(
            _RANGE, f"a design life must be more than zero years, got {raw!r}")
    if not MIN_YEARS <= value <= MAX_YEARS:
        raise PydanticCustomError(
            _RANGE, f"a design life is read from {MIN_YEARS:g} to {MAX_YEARS:g} years, "
            f"got {raw!r}")
    return value


Years = Annotated[
    float,
    read_by(_years,
            {"type": "number", "exclusiveMinimum": 0, "examples": [25],
             "description": "design life in years"}),
]


class DesignLife(DesignModel):
    """How long the detail must last and how many hours a year it runs."""

    years: Years = Field(description="design life, e.g. 25")
    hours_per_year: Time | None = Field(
        None, description="operating hours a year, e.g. \"6000 h\"; all the year's "
        "8766 hours when left out")

    @field_validator("hours_per_year")
    @classmethod
    def _within_a_year(cls, value: Amount | None) -> Amount | None:
        if value is not None and value.value > HOURS_IN_A_YEAR * 3600.0 * (1 + 1e-12):
            raise PydanticCustomError(
                _RANGE, f"'{value.text}' is more than the {HOURS_IN_A_YEAR:g} hours of a "
                "year (365.25 days)")
        return value

    @property
    def operating_seconds_per_year(self) -> float:
        """[s]"""
        if self.hours_per_year is None:
            return HOURS_IN_A_YEAR * 3600.0
        return self.hours_per_year.value

    @property
    def operating_seconds(self) -> float:
        """Operating time over the design life [s]."""
        return self.years * self.operating_seconds_per_year


# ------------------------------------------------------------ size and thickness


class SizeEffect(DesignModel):
    """EN 1993-1-9 size effect: k_s on the detail category of a thick butt weld or a
    large bolt in tension."""

    kind: Literal["transverse-butt-weld", "bolt-in-tension"] = Field(
        description="\"transverse-butt-weld\" (Table 8.3, thickness) or \"bolt-in-tension\" "
        "(Table 8.1 category 50, diameter)")
    thickness: Length | None = Field(None, description="plate thickness, e.g. \"40 mm\"")
    diameter: Length | None = Field(None, description="bolt diameter, e.g. \"36 mm\"")

    @model_validator(mode="after")
    def _dimension(self) -> "SizeEffect":
        need = "thickness" if self.kind == "transverse-butt-weld" else "diameter"
        other = "diameter" if need == "thickness" else "thickness"
        if getattr(self, other) is not None:
            raise PydanticCustomError(
                "fatigue", f"the size effect of a {self.kind.replace('-', ' ')} is set by its "
                f"'{need}', not its '{other}'")
        if getattr(self, need) is None:
            example = "\"40 mm\"" if need == "thickness" else "\"36 mm\""
            raise PydanticCustomError(
                "fatigue", f"give the '{need}' of the {self.kind.replace('-', ' ')}, e.g. "
                f"{need} = {example}")
        return self

    @property
    def dimension(self) -> float:
        """[m]"""
        return (self.thickness or self.diameter).value


class ThicknessCorrection(DesignModel):
    """IIW thickness correction f(t) = (25 mm / t)^n of a FAT class."""

    kind: Literal["cruciform-or-t-joint", "cruciform-toe-ground", "transverse-butt-weld",
                  "butt-weld-ground-flush", "longitudinal-weld"] = Field(
        description="kind of joint, which sets the exponent n (0.3 to 0.1)")
    thickness: Length = Field(description="effective plate thickness at the crack, e.g. "
                              "\"40 mm\"")


# -------------------------------------------------------------------------- detail

_SOURCES = ("block", "history", "psd", "base-psd")


class FatigueDetail(DesignModel):
    """A vibrating member, weld or small-bore connection whose cycles are counted."""

    name: str = Field(min_length=1, max_length=120,
                      description="e.g. 'gauge tapping on the discharge'")
    detail: DetailCurve = Field(description="S-N curve: \"EN 1993-1-9:71\", \"IIW:FAT90\", "
                                "\"DNV-RP-C203:D\", a plugin's curve, or a table of points")
    thickness: Length | None = Field(
        None, description="plate thickness at the crack, for the thickness effect of the "
        "DNV-RP-C203 curves, e.g. \"40 mm\"")
    size_effect: SizeEffect | None = Field(
        None, description="EN 1993-1-9 size effect of a transverse butt weld (thickness) or "
        "a bolt in tension (diameter), e.g. { kind = \"transverse-butt-weld\", thickness = "
        "\"40 mm\" }")
    thickness_correction: ThicknessCorrection | None = Field(
        None, description="IIW thickness correction of a FAT class, e.g. { kind = "
        "\"cruciform-or-t-joint\", thickness = \"40 mm\" }")
    consequence: Literal["low", "high"] | None = Field(
        None, description="consequence of failure, for the partial factor gamma_Mf; the "
        "rule's default-consequence when left out")
    assessment: Literal["safe-life", "damage-tolerant"] | None = Field(
        None, description="assessment method, for the partial factor gamma_Mf; the rule's "
        "default-assessment when left out")
    partial_factor: float | None = Field(
        None, description="partial factor for fatigue strength gamma_Mf stated outright "
        "(e.g. from a National Annex), instead of 'consequence' and 'assessment'")
    welded: bool = Field(True, description="a welded detail is judged on the full stress "
                         "range, whatever its mean stress")
    mean_stress: MeanStress | None = Field(
        None, description="static stress the cycles ride on, tension positive, e.g. "
        "\"40 MPa\"; corrects the ranges of a detail that is not welded")
    mean_stress_correction: Literal["en-1993-1-9", "goodman", "gerber"] | None = Field(
        None, description="with 'mean-stress' on a detail that is not welded; "
        "\"en-1993-1-9\" when left out")
    ultimate_strength: Stress | None = Field(
        None, description="ultimate tensile strength, for the goodman and gerber "
        "corrections, e.g. \"490 MPa\"")
    life: DesignLife = Field(description="e.g. { years = 25, hours-per-year = \"6000 h\" }")
    allowed_damage: float | None = Field(
        None, description="Palmgren-Miner damage allowed over the design life, e.g. 0.5; "
        "the rule's allowed damage of the curve's family when left out (the smaller one "
        "applies)")
    loading: Literal["spectrum", "constant-amplitude"] | None = Field(
        None, description="how the duty blocks load the detail: \"spectrum\" (the default: "
        "machinery stress is seldom of one amplitude, starts, speed changes and process "
        "upsets add smaller and larger ranges) or \"constant-amplitude\" (stated by the "
        "engineer: the constant-amplitude fatigue limit then applies)")
    block: tuple[DutyBlock, ...] = Field((), description="duty blocks, [[fatigue.block]]")
    history: TimeHistory | None = Field(
        None, description="e.g. { path = \"data/strain.csv\", channel = \"strain_2\", "
        "scale = \"210 GPa\", duration = \"60 s\" }")
    psd: StressPSD | None = Field(
        None, description="e.g. { points = [[20, 0.5], [200, 0.5]], unit = \"MPa^2/Hz\" }")
    base_psd: BasePSD | None = Field(
        None, description="e.g. { level = \"0.04 g^2/Hz\", natural-frequency = \"85 Hz\", "
        "q = 10, stress-per-g = \"12 MPa\" }")

    @field_validator("partial_factor")
    @classmethod
    def _partial_factor(cls, value: float | None) -> float | None:
        if value is not None and not 1.0 <= value <= 2.0:
            raise PydanticCustomError(
                _RANGE, f"a partial factor for fatigue strength is from 1 to 2 (EN "
                f"1993-1-9 recommends 1.00 to 1.35), got {value:g}")
        return value

    @field_validator("allowed_damage")
    @classmethod
    def _allowed(cls, value: float | None) -> float | None:
        if value is not None and not 0 < value <= 1:
            raise PydanticCustomError(
                _RANGE, f"the allowed damage must be above 0 and at most 1, got {value:g}")
        return value

    @model_validator(mode="after")
    def _consistent(self) -> "FatigueDetail":
        given = [key for key, value in zip(_SOURCES, (self.block, self.history, self.psd,
                                                      self.base_psd)) if value]
        if len(given) != 1:
            which = ("none is given" if not given else
                     "got " + " and ".join(f"'{k}'" for k in given))
            raise PydanticCustomError(
                "fatigue", "give exactly one source of cycles: [[fatigue.block]] tables, "
                f"'history', 'psd' or 'base-psd'; {which}")
        if self.loading is not None and not self.block:
            raise _located([(("loading",), "'loading' says how duty blocks load the detail; "
                             "a record or a spectrum is counted as it is (valid with "
                             "[[fatigue.block]] tables only)", self.loading)])
        if self.loading == "constant-amplitude":
            ranges = sorted({block.worst_stress_range for block in self.block})
            if ranges and ranges[-1] > ranges[0] * (1 + 1e-9):
                raise _located([(("loading",), f"constant-amplitude loading has one stress "
                                 f"range, but the blocks give {ranges[0] / 1e6:.4g} to "
                                 f"{ranges[-1] / 1e6:.4g} MPa; leave 'loading' out (or set "
                                 "it to \"spectrum\") to read them as a spectrum",
                                 self.loading)])
        curve_name = self.detail if isinstance(self.detail, str) else ""
        if self.size_effect is not None:
            from ..dynamics.fatigue.sn_curves import EN_1993_1_9_DETAIL_CATEGORIES

            kind = self.size_effect.kind
            normal = [f"EN 1993-1-9:{c}" for c in EN_1993_1_9_DETAIL_CATEGORIES]
            valid = ("EN 1993-1-9:50" if kind == "bolt-in-tension" else
                     "an EN 1993-1-9 normal-stress category (" + ", ".join(
                         n.rpartition(":")[2] for n in normal) + ")")
            fits = (curve_name == "EN 1993-1-9:50" if kind == "bolt-in-tension"
                    else curve_name in normal)
            if not fits:
                raise _located([(("size-effect",), f"'{curve_name or 'points'}' has no EN "
                                 f"1993-1-9 size effect for a {kind.replace('-', ' ')}; "
                                 f"valid with {valid}"
                                 + ("; for an IIW class use 'thickness-correction'"
                                    if curve_name.startswith("IIW:") else ""), kind)])
        if self.thickness_correction is not None and not curve_name.startswith("IIW:"):
            raise _located([(("thickness-correction",), f"'{curve_name or 'points'}' has no "
                             "IIW thickness correction; valid with an IIW FAT class such as "
                             "\"IIW:FAT71\""
                             + ("; for EN 1993-1-9 use 'size-effect'"
                                if curve_name.startswith("EN") else ""),
                             self.thickness_correction.kind)])
        if self.thickness is not None and not (
                isinstance(self.detail, str) and self.detail.startswith("DNV-RP-C203:")):
            raise _located([(("thickness",), "'thickness' sets the thickness effect of a "
                             "DNV-RP-C203 curve; this detail uses another curve",
                             self.thickness.text)])
        if self.partial_factor is not None and (self.consequence or self.assessment):
            raise PydanticCustomError(
                "fatigue", "give 'partial-factor', or 'consequence' and 'assessment' to read "
                "it from EN 1993-1-9 Table 3.1, not both")
        correction = self.mean_stress_correction
        if correction is not None:
            if self.welded:
                raise _located([(("mean-stress-correction",), "a mean-stress correction is "
                                 "for details that are not welded (a welded detail is judged "
                                 "on the full stress range); set welded = false or leave it "
                                 "out", correction)])
            if self.mean_stress is None and self.history is None:
                raise _located([(("mean-stress-correction",), "a mean-stress correction needs "
                                 "the 'mean-stress'", correction)])
        if correction in ("goodman", "gerber") and self.ultimate_strength is None:
            raise _located([(("mean-stress-correction",), f"the {correction} correction needs "
                             "the 'ultimate-strength' (e.g. \"490 MPa\")", correction)])
        if self.ultimate_strength is not None and correction not in ("goodman", "gerber"):
            raise _located([(("ultimate-strength",), "'ultimate-strength' is used by the "
                             "goodman and gerber mean-stress corrections only",
                             self.ultimate_strength.text)])
        if self.mean_stress is not None and self.ultimate_strength is not None and \
                self.mean_stress.value >= self.ultimate_strength.value:
            raise _located([(("mean-stress",), f"the mean stress '{self.mean_stress.text}' "
                             f"is not below the ultimate strength "
                             f"'{self.ultimate_strength.text}'", self.mean_stress.text)])
        return self

    @property
    def source_kind(self) -> str:
        """"block", "history", "psd" or "base-psd": where the cycles come from."""
        for key, value in zip(_SOURCES, (self.block, self.history, self.psd, self.base_psd)):
            if value:
                return key
        raise AssertionError("validated detail without a source")  # pragma: no cover

    @property
    def corrects_mean_stress(self) -> bool:
        """True when a mean-stress correction applies: a detail that is not welded with a
        mean stress (or a record, whose cycles carry their own means)."""
        return not self.welded and (self.mean_stress is not None or self.history is not None)

    @property
    def correction(self) -> str:
        """The mean-stress correction that applies ("en-1993-1-9" by default)."""
        return self.mean_stress_correction or "en-1993-1-9"


# ------------------------------------------------------------------ data files


class FatigueInput(Record):
    """Numbers a fatigue detail's data files gave, SI units.

    ``history`` is the stress at the detail per sample [Pa] (the record times its
    scale), ``psd`` the frequencies [Hz] and PSD values [Pa^2/Hz] of a stress PSD;
    ``file`` names the data file (relative to the project root), "" for inline data.
    """

    history: object = None
    psd: tuple | None = None
    file: str = ""


def fatigue_input(design, index: int) -> FatigueInput:
    """The numbers of fatigue detail ``index`` of a design, read from its files.

    Inline PSD points are converted here; a detail whose cycles come from a file needs
    the design to have been loaded with its project root (its files are read then).
    Raises LookupError when the file was not read.
    """
    import numpy as np

    detail = design.fatigue[index]
    stored = getattr(design, "_fatigue_inputs", ()) or ()
    if index < len(stored) and stored[index] is not None:
        return stored[index]
    if detail.psd is not None and detail.psd.points is not None:
        f, g = detail.psd.inline_table()
        return FatigueInput(psd=(np.asarray(f, dtype=float), np.asarray(g, dtype=float)))
    if detail.history is not None or detail.psd is not None:
        raise LookupError(f"the data file of fatigue detail '{detail.name}' was not read "
                          "(the design was loaded without its project root)")
    return FatigueInput()


def read_fatigue_inputs(design, root: Path) -> tuple:
    """Read the data files of a design's fatigue details; raises InputError, all at once.

    Returns one :class:`FatigueInput` a detail (None for duty blocks and base PSDs).
    Also checks what needs the whole design: a block's speed must lie inside the
    machine's speed range.
    """
    problems: list[InputProblem] = []
    inputs: list = []
    samples_read = 0
    speed = design.machine.speed
    for index, detail in enumerate(design.fatigue):
        for number, block in enumerate(detail.block):
            if block.speed is not None and not (
                    speed.min.value * (1 - 1e-12) <= block.speed.value
                    <= speed.max.value * (1 + 1e-12)):
                key = ("fatigue", index, "block", number, "speed")
                where = (f"is outside the machine's speed range {speed.min.text} to "
                         f"{speed.max.text}" if speed.is_range
                         else f"is not the machine's speed {speed.min.text}")
                problems.append(_problem(design, key, f"block speed '{block.speed.text}' "
                                         f"{where}"))
        try:
            if detail.history is not None:
                if samples_read > MAX_DESIGN_SAMPLES:
                    raise InputError([_problem(
                        design, ("fatigue", index, "history"), f"the design's time "
                        f"histories hold more than {MAX_DESIGN_SAMPLES} samples together; "
                        "this one is not read")])
                inputs.append(_read_history(design, root, index, detail.history))
                samples_read += inputs[-1].history.shape[0]
            elif detail.psd is not None and detail.psd.path is not None:
                inputs.append(_read_psd_file(design, root, index, detail.psd))
            else:
                inputs.append(None)
        except InputError as exc:
            problems += exc.problems
            inputs.append(None)
    if problems:
        raise InputError(problems)
    return tuple(inputs)


def _problem(design, key: tuple, message: str) -> InputProblem:
    file, line, column = design.locate(key)
    return InputProblem(file, line, column, format_key_path(key), message)


def _data_file(design, root: Path, key: tuple, relative: str, what: str, limit: int):
    """The open descriptor and size, resolved path, display name and identity
    (:func:`~vcheck.design.files.file_identity`) of a data file, or InputError.

    Every check of the guarded opener runs here (inside the root with symlinks
    resolved, a regular file, within ``limit``). The first reading of the file reads
    this descriptor (so the identity is that of the bytes read) and closes it; the
    caller closes it when the file was parsed for another design of the same check
    (:func:`~vcheck.design.files.read_once`) or is read another way (``.npy``).
    """
    import os

    from .files import file_identity, open_inside

    fd, path, size, name = open_inside(root, relative, what=what, limit=limit,
                                       where=_problem(design, key, ""))
    try:
        identity = file_identity(fd)
    except BaseException:
        os.close(fd)
        raise
    return (fd, size), path, name, identity


def _close_unread(opened: list) -> None:
    """Close the descriptor of :func:`_data_file` if no reading took it."""
    import os

    if opened:
        os.close(opened.pop()[0])


def _csv_rows(path: Path, name: str, what: str, split: bool = True, limit: int = 4 << 20,
              opened: tuple | None = None):
    """(line number, cells, line) of the rows that are not blank or comments; with
    ``split`` False the cells are left for the caller to split (a long record's fast
    path never needs them). ``opened``: the ``(descriptor, size)`` of the file already
    opened through the guarded opener (closed here), else it is opened."""
    from .files import read_inside, read_open

    if opened is not None:
        raw = read_open(opened[0], name, what=what, limit=limit)
    else:
        raw, _ = read_inside(path.parent, path, what=what, limit=limit, label=name)
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        raise InputError([InputProblem(name, 1, 1, "", f"{what} is not UTF-8 text")]) from None
    del raw
    rows = []
    for number, line in enumerate(text.splitlines(), start=1):
        stripped = line.strip()
        if stripped and not stripped.startswith("#"):
            cells = [cell.strip() for cell in line.split(",")] if split else None
            rows.append((number, cells, line))
    return rows


def _cell_column(line: str, index: int) -> int:
    """1-based column of the ``index``-th comma-separated cell of a CSV line (its first
    character that is not a space, or where it would be)."""
    cells = line.split(",")
    start = sum(len(cell) + 1 for cell in cells[:index])
    if index < len(cells):
        cell = cells[index]
        start += len(cell) - len(cell.lstrip())
    return min(start, len(line)) + 1


def _is_header(cells: list[str]) -> bool:
    for cell in cells:
        try:
            float(cell)
        except ValueError:
            return True
    return False


def _too_many(problems: list[InputProblem], name: str, bad: int) -> list[InputProblem]:
    if bad > len(problems):
        problems.append(InputProblem(name, problems[-1].line, 1, "",
                                     f"{bad - len(problems)} more bad rows not listed"))
    return problems


def _read_history(design, root: Path, index: int, history: TimeHistory) -> FatigueInput:
    import numpy as np

    key = ("fatigue", index, "history", "path")
    from .files import read_once

    handle, path, name, identity = _data_file(design, root, key, history.path,
                                              "time-history file", MAX_HISTORY_BYTES)
    opened = [handle]  # until a reading takes it
    channel_key = ("fatigue", index, "history", "channel")
    channel = history.channel

    def read():
        if path.suffix.lower() == ".npy":
            return _npy_channel(design, path, name, channel_key, channel)
        return _csv_channel(design, path, name, channel_key, channel, opened=opened)

    # the samples are shared by the designs that read this channel of this file; they
    # are only read here (the stress below is a new array)
    try:
        samples = read_once(("history", path, identity, type(channel), channel), read)
    finally:
        _close_unread(opened)
    if samples.shape[0] < 2:
        raise InputError([InputProblem(name, 1, 1, "", "the time history has fewer than two "
                                       "samples")])
    if samples.shape[0] > MAX_HISTORY_SAMPLES:
        raise InputError([InputProblem(name, 1, 1, "", f"the time history has "
                                       f"{samples.shape[0]} samples; at most "
                                       f"{MAX_HISTORY_SAMPLES} are read")])
    stress = samples * history.scale.value
    if not np.isfinite(stress).all():
        bad = int(np.flatnonzero(~np.isfinite(stress))[0])
        raise InputError([InputProblem(name, 1, 1, "", f"sample {bad + 1} times the scale "
                                       f"'{history.scale.text}' is not a finite stress")])
    return FatigueInput(history=stress, file=name)


def _npy_channel(design, path: Path, name: str, channel_key: tuple, channel):
    import numpy as np

    from .files import read_npy_inside

    array, _ = read_npy_inside(path.parent, path, what="time-history file",
                               limit=MAX_HISTORY_BYTES, label=name)
    if isinstance(channel, str):
        raise InputError([_problem(design, channel_key, f"a .npy file has no column names; "
                                   f"give the channel as a column number, got '{channel}'")])
    if array.ndim == 1:
        if channel not in (None, 1):
            raise InputError([_problem(design, channel_key, f"'{name}' holds one channel; "
                                       f"channel {channel} does not exist")])
        samples = array
    elif array.ndim == 2:
        columns = array.shape[1]
        if channel is None and columns != 1:
            raise InputError([_problem(design, channel_key[:-1],
                                       f"'{name}' holds {columns} channels (columns); say "
                                       "which with 'channel' (a number from 1)")])
        column = (channel or 1) - 1
        if column >= columns:
            raise InputError([_problem(design, channel_key, f"'{name}' has {columns} "
                                       f"columns; channel {channel} does not exist")])
        samples = array[:, column]
    else:
        raise InputError([InputProblem(name, 1, 1, "", f"the .npy array must have one or two "
                                       f"dimensions (samples, channels), got {array.ndim}")])
    samples = np.asarray(samples, dtype=float)
    finite = np.isfinite(samples)
    if not finite.all():
        bad = int(np.flatnonzero(~finite)[0])
        raise InputError([InputProblem(name, 1, 1, "", f"sample {bad + 1} is {samples[bad]}, "
                                       "not a finite number")])
    return samples


def _fast_column(lines: list[str], column: int):
    """The column as floats by numpy's C parser, or None if any row needs the careful
    row-by-row reading (which locates each bad row by line and column)."""
    import numpy as np

    if not lines:
        return None
    try:
        values = np.loadtxt(lines, delimiter=",", usecols=column, ndmin=1, comments=None)
    except (ValueError, IndexError):
        return None
    if values.shape != (len(lines),) or not np.isfinite(values).all():
        return None
    return values


_CHUNK_LINES = 1 << 16
"""Lines of a time-history CSV parsed at a time: the file is streamed, never held whole."""


_BLANK_OR_COMMENT = frozenset(
    "#\t\n\v\f\r\x1c\x1d\x1e\x1f \x85\xa0\u1680\u2000\u2001\u2002\u2003\u2004\u2005"
    "\u2006\u2007\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000")
"""'#' and the characters ``str.isspace`` calls blank (a test holds the list): a line
that starts with none of them is a row without a closer look."""


def _stream_rows(path: Path, name: str, what: str, limit: int):
    """(line number, line) of the rows of a CSV that are not blank or comments, read
    from the file a chunk at a time through the guarded opener."""
    import codecs
    import os

    from .files import open_inside

    fd, _, _, _ = open_inside(path.parent, path, what=what, limit=limit, label=name)
    decoder = codecs.getincrementaldecoder("utf-8-sig")()
    number = 0
    pending = ""
    try:
        while True:
            chunk = os.read(fd, 1 << 20)
            try:
                text = decoder.decode(chunk, final=not chunk)
            except UnicodeDecodeError as exc:
                line = number + 1 + chunk[:max(exc.start, 0)].count(b"\n")
                raise InputError([InputProblem(name, line, 1, "",
                                               f"{what} is not UTF-8 text")]) from None
            text = pending + text
            lines = text.split("\n")
            pending = lines.pop() if chunk else ""
            if not chunk and pending:
                lines.append(pending)
            if "\r" in text:
                lines = [line.rstrip("\r") for line in lines]
            # a row is a line that is neither blank nor a comment (one pass per chunk)
            yield from [(at, line) for at, line in enumerate(lines, number + 1)
                        if line and (line[0] not in _BLANK_OR_COMMENT
                                     or line.strip()[:1] not in ("", "#"))]
            number += len(lines)
            if not chunk:
                return
    finally:
        os.close(fd)


def _careful_column(data, column: int, label: str, name: str, values, offset: int,
                    problems: list, bad: int) -> int:
    """Parse one chunk row by row into ``values[offset:]``, locating each bad row;
    returns the running count of bad rows."""
    for n, (line, raw) in enumerate(data):
        cells = [cell.strip() for cell in raw.split(",")]
        message = None
        if len(cells) <= column or not cells[column]:
            message = f"row has no value in {label}"
        else:
            try:
                value = float(cells[column])
            except ValueError:
                message = f"'{_cut(cells[column])}' in {label} is not a number"
            else:
                if math.isfinite(value):
                    values[offset + n] = value
                    continue
                message = f"'{_cut(cells[column])}' in {label} is not a finite number"
        bad += 1
        if len(problems) < _MAX_BAD_ROWS:
            problems.append(InputProblem(name, line, _cell_column(raw, column), "", message))
    return bad


def _cut(text: str, limit: int = 40) -> str:
    """A cell as echoed in a message: at most ``limit`` characters."""
    return text if len(text) <= limit else text[:limit - 3] + "..."


def _regular_rows(path: Path, name: str, what: str, limit: int, opened: list | None = None):
    """``(first row, other rows)`` of a small CSV whose rows after the first are all
    plain (no blank or comment line, no carriage return, none starting with a blank),
    read whole through the guarded opener: the rows :func:`_stream_rows` would give,
    without a tuple a row. None for any other file (the streamed reading then reads it
    and says what is wrong); the opener's refusals are raised as they are. ``opened``:
    a list that may hold the ``(descriptor, size)`` of the file already opened through
    the guarded opener, taken and closed here."""
    import os
    import re

    from .files import open_inside

    if opened:
        fd, size = opened.pop()
    else:
        fd, _, size, _ = open_inside(path.parent, path, what=what, limit=limit, label=name)
    try:
        if size > _WHOLE_CSV_BYTES:
            return None
        raw = os.read(fd, _WHOLE_CSV_BYTES + 1)
    finally:
        os.close(fd)
    if len(raw) != size or b"\r" in raw:  # changed while read, or not plain lines
        return None
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        return None
    lines = text.split("\n")
    if lines[-1] == "":
        lines.pop()  # the newline that ends the last line starts no row
    offset = 0
    for at in range(len(lines)):
        line = lines[at]
        if line and (line[0] not in _BLANK_OR_COMMENT or line.strip()[:1] not in ("", "#")):
            break
        offset += len(line) + 1
    else:
        return None
    rest = lines[at + 1:]
    if not rest:
        return None
    block = text[offset + len(lines[at]) + 1:]
    if block.endswith("\n"):
        block = block[:-1]
    # any line of the block that is empty or starts with a blank or '#' (\s is the set
    # str.isspace calls blank; a search for a newline first is many times faster than
    # one that also tries the start of the text at every character)
    if not block or re.match(r"[\s#]", block) or re.search(r"\n(?:\Z|[\s#])", block):
        return None
    return lines[at], rest


_WHOLE_CSV_BYTES = 4 << 20
"""Largest CSV read whole to be parsed in one go; a larger one is streamed."""


def _csv_channel(design, path: Path, name: str, channel_key: tuple, channel,
                 whole: bool = True, opened: list | None = None):
    import difflib
    import itertools

    import numpy as np

    regular = _regular_rows(path, name, "time-history file", MAX_HISTORY_BYTES, opened) \
        if whole else None
    if regular is not None:
        rows = None
        first_row = (0, regular[0])
    else:
        rows = _stream_rows(path, name, "time-history file", MAX_HISTORY_BYTES)
        first_row = next(rows, None)
    if first_row is None:
        raise InputError([InputProblem(name, 1, 1, "", "the time-history file holds no rows")])
    first = [_cut(cell.strip()) for cell in first_row[1].split(",")]
    header = first if _is_header(first) else None
    columns = len(first)
    if isinstance(channel, str):
        if header is None:
            raise InputError([_problem(design, channel_key, f"'{name}' has no header row to "
                                       f"find channel '{channel}' in; give a column number")])
        if channel not in header:
            close = difflib.get_close_matches(channel, header, n=1, cutoff=0.6)
            hint = f"; did you mean '{close[0]}'?" if close else ""
            shown = ", ".join(header[:50]) + (", ..." if len(header) > 50 else "")
            raise InputError([_problem(design, channel_key, f"no column '{channel}' in "
                                       f"'{name}' (columns: {shown}){hint}")])
        column = header.index(channel)
    elif channel is None:
        if columns != 1:
            raise InputError([_problem(design, channel_key[:-1], f"'{name}' has {columns} "
                                       "columns; say which with 'channel' (a name or a "
                                       "number from 1)")])
        column = 0
    else:
        if channel > columns:
            raise InputError([_problem(design, channel_key, f"'{name}' has {columns} "
                                       f"columns; channel {channel} does not exist")])
        column = channel - 1
    if regular is not None:
        data = regular[1] if header is not None else [regular[0]] + regular[1]
        fast = _fast_column(data, column) if len(data) <= _CHUNK_LINES else None
        if fast is not None:
            return fast
        # a row needs the careful reading, which locates it: read the file again,
        # streamed, as any other
        return _csv_channel(design, path, name, channel_key, channel, whole=False)
    if header is None:
        rows = itertools.chain([first_row], rows)
    label = f"column '{header[column]}'" if header is not None else f"column {column + 1}"
    parts: list = []
    problems: list[InputProblem] = []
    bad = 0
    count = 0
    while True:
        data = list(itertools.islice(rows, _CHUNK_LINES))
        if not data:
            break
        count += len(data)
        if count > MAX_HISTORY_SAMPLES:
            raise InputError([InputProblem(name, data[-1][0], 1, "", f"the time history has "
                                           f"more than {MAX_HISTORY_SAMPLES} samples; at most "
                                           f"{MAX_HISTORY_SAMPLES} are read")])
        fast = None if problems else _fast_column([raw for _, raw in data], column)
        if fast is None:
            fast = np.empty(len(data), dtype=float)
            bad = _careful_column(data, column, label, name, fast, 0, problems, bad)
        parts.append(fast)
    if problems:
        raise InputError(_too_many(problems, name, bad))
    if not parts:
        return np.empty(0, dtype=float)
    return np.concatenate(parts) if len(parts) > 1 else parts[0]


def two_number_columns(lines: list[str]):
    """The two columns of CSV rows that are each exactly two plain numbers, as float
    arrays parsed by ``float`` (so the same numbers as a row-by-row reading gives); None
    if any row is otherwise (another count of cells, a cell that is not a number), and
    the caller reads the rows one by one, locating what is wrong.

    Only rows as split by ``str.splitlines`` may be given (none holds a newline).
    """
    import re

    import numpy as np

    block = "\n".join(lines)
    if re.fullmatch(r"[^,\n]*,[^,\n]*(?:\n[^,\n]*,[^,\n]*)*", block) is None:
        return None
    cells = block.replace("\n", ",").split(",")
    try:
        first = np.array(list(map(float, cells[0::2])), dtype=float)
        second = np.array(list(map(float, cells[1::2])), dtype=float)
    except ValueError:
        return None
    return first, second


def _read_psd_file(design, root: Path, index: int, psd: StressPSD) -> FatigueInput:
    from .files import read_once

    key = ("fatigue", index, "psd", "path")
    handle, path, name, identity = _data_file(design, root, key, psd.path, "PSD file",
                                              4 << 20)
    opened = [handle]  # until the reading takes it
    try:
        f, g = read_once(("psd", path, identity),
                         lambda: _psd_columns(path, name, opened.pop()))
    finally:
        _close_unread(opened)
    # each design gets arrays of its own (the frequencies are not scaled, so copied)
    return FatigueInput(psd=(f.copy(), g * psd.unit[0]), file=name)


def _psd_columns(path: Path, name: str, opened: tuple | None = None):
    """The frequencies [Hz] and values (in the file's unit) of a PSD file; InputError
    with every bad row located."""
    import numpy as np

    rows = _csv_rows(path, name, "PSD file", split=False, opened=opened)
    if rows:
        first = [cell.strip() for cell in rows[0][2].split(",")]
        if _is_header(first) and not all(_is_float(c) for c in first[:2]):
            rows = rows[1:]
    if len(rows) < 2:
        raise InputError([InputProblem(name, 1, 1, "", "a PSD file needs at least two rows "
                                       "of frequency [Hz] and PSD value")])
    if len(rows) > MAX_PSD_ROWS:
        raise InputError([InputProblem(name, 1, 1, "", f"the PSD file has more than "
                                       f"{MAX_PSD_ROWS} rows")])
    columns = two_number_columns([raw for _, _, raw in rows])
    if columns is not None:
        # the checks of check_psd_points on the whole columns: when every row passes,
        # they are the numbers it keeps; a row that fails is read again row by row
        f, g = columns
        low, high = PSD_VALUE_RANGE
        if (np.isfinite(f).all() and np.isfinite(g).all() and (f >= 0).all()
                and (f[1:] > f[:-1]).all() and (g >= 0).all()
                and (f <= MAX_PSD_FREQUENCY).all()
                and ((g == 0) | ((g >= low) & (g <= high))).all()):
            return f, g
    rows = [(line, [cell.strip() for cell in raw.split(",")], raw) for line, _, raw in rows]
    parsed = []
    problems: list[InputProblem] = []
    kept = []
    for line, cells, raw in rows:
        if len(cells) < 2:
            problems.append(InputProblem(name, line, 1, "", "a row needs a frequency [Hz] and "
                                         "a PSD value"))
            continue
        bad = [i for i in (0, 1) if not _is_float(cells[i])]
        if bad:
            problems.append(InputProblem(name, line, _cell_column(raw, bad[0]), "",
                                         f"'{_cut(cells[bad[0]])}' is not a number"))
            continue
        parsed.append((float(cells[0]), float(cells[1])))
        kept.append((line, raw))
    freqs, values, wrong = check_psd_points(
        parsed, lambda i, column: (kept[i][0], _cell_column(kept[i][1], column or 0)))
    problems += [InputProblem(name, line, column, "", message)
                 for (line, column), message, _ in wrong]
    if problems:
        problems = sorted(problems)
        count = len(problems)
        raise InputError(_too_many(problems[:_MAX_BAD_ROWS], name, count))
    return np.asarray(freqs, dtype=float), np.asarray(values, dtype=float)


def _is_float(cell: str) -> bool:
    try:
        float(cell)
    except ValueError:
        return False
    return True

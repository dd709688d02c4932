"""Reading quantities with units from design files.

Every dimensional value in a design file is a string that carries its unit: "1480 rpm",
"420 kg", "180 kN/m +-15%". This module turns such a string into an :class:`Amount`
in SI units (revolutions per second for speeds and frequencies) and refuses anything
it cannot read with a message that says what was expected, with an example.

Units are read by pint with a registry built from ``units.txt`` beside this file (the
whole list of accepted units, SI and US customary). Two choices differ from pint's
defaults and are deliberate:

- ``g`` is standard gravity (9.80665 m/s^2, CGPM 1901), never the gram; grams are
  written ``gram``. An accelerometer reading of "2.5 g" means what an engineer means.
- A revolution is the reference of rotation, so "1480 rpm" is 24.667 Hz (not
  154.99 rad/s read as Hz), and "rad/s" converts to Hz through 2 pi.

The registry is built once, on the first quantity whose unit is not in
:data:`vcheck.design.unit_table.UNIT_FACTORS` (pint's factors for the usual units, written
down), so commands that read no design, and checks of designs in the usual units, do not
pay for importing pint.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from functools import lru_cache
from pathlib import Path

from ..records import Record
from .unit_table import UNIT_FACTORS

__all__ = ["Amount", "PLAUSIBLE_RANGES", "QUANTITY_KINDS", "QuantityKind", "UnitError", "UnitGrammarError",
           "check_unit_grammar", "parse_amount"]


@dataclass(frozen=True)
class Amount:
    """A value read from a design file, in SI units, with its tolerance band.

    ``value`` is the nominal value; ``low`` and ``high`` the ends of the stated
    tolerance band (both equal to ``value`` when no tolerance was given); ``text`` the
    string as written, for reports.
    """

    value: float
    low: float
    high: float
    text: str

    @property
    def has_tolerance(self) -> bool:
        return self.low != self.value or self.high != self.value


class QuantityKind(Record):
    """What a field measures: its name in messages, SI unit, examples, accepted units."""

    name: str
    si_unit: str
    examples: tuple[str, ...]
    accepted: tuple[str, ...]


QUANTITY_KINDS: dict[str, QuantityKind] = {
    "mass": QuantityKind("a mass", "kg", ("420 kg", "925 lb"), ("kg", "gram", "t", "lb")),
    "length": QuantityKind(
        "a length", "m", ("25 mm", "1.0 in"), ("mm", "cm", "m", "um", "in", "ft", "mil")
    ),
    "stiffness": QuantityKind(
        "a stiffness", "N/m", ("180 kN/m", "1000 lbf/in"), ("N/m", "kN/m", "N/mm", "lbf/in")
    ),
    "frequency": QuantityKind(
        "a frequency or speed", "Hz", ("1480 rpm", "24.7 Hz"), ("Hz", "rpm", "cpm", "rad/s")
    ),
    "velocity": QuantityKind(
        "a velocity", "m/s", ("4.5 mm/s", "0.2 in/s"), ("mm/s", "m/s", "in/s")
    ),
    "acceleration": QuantityKind(
        "an acceleration", "m/s^2", ("0.5 g", "2.5 m/s^2"), ("g", "mg", "m/s^2", "in/s^2")
    ),
    "force": QuantityKind("a force", "N", ("12 kN", "2700 lbf"), ("N", "kN", "lbf", "kip")),
    "stress": QuantityKind(
        "a stress or pressure", "Pa", ("14 MPa", "2 ksi"), ("Pa", "kPa", "MPa", "N/mm^2", "psi", "ksi")
    ),
    "torque": QuantityKind(
        "a torque", "N*m", ("190 N*m", "140 lbf*ft"), ("N*m", "kN*m", "lbf*ft", "lbf*in")
    ),
    "time": QuantityKind("a time", "s", ("6000 h", "30 s"), ("s", "min", "h", "day", "year")),
    "inertia": QuantityKind(
        "a mass moment of inertia", "kg*m^2", ("42 kg*m^2",), ("kg*m^2", "lb*in^2", "lb*ft^2")
    ),
    "area": QuantityKind("an area", "m^2", ("28.5 cm^2", "4.4 in^2"), ("mm^2", "cm^2", "m^2", "in^2")),
    "second-moment": QuantityKind(
        "a second moment of area", "m^4", ("1943 cm^4", "46.7 in^4"),
        ("mm^4", "cm^4", "m^4", "in^4"),
    ),
    "density": QuantityKind(
        "a density", "kg/m^3", ("7850 kg/m^3", "0.284 lb/in^3"), ("kg/m^3", "lb/in^3", "lb/ft^3")
    ),
    "linear-density": QuantityKind(
        "a mass per length", "kg/m", ("22.4 kg/m", "15 lb/ft"), ("kg/m", "lb/ft", "lb/in")
    ),
    "power": QuantityKind("a power", "W", ("55 kW", "75 hp"), ("W", "kW", "MW", "hp")),
}

# Dimensions of each kind in the registry's base units (exponents of m, s, kg).
_DIMENSIONS: dict[str, dict[str, float]] = {
    "mass": {"[mass]": 1},
    "length": {"[length]": 1},
    "stiffness": {"[mass]": 1, "[time]": -2},
    "frequency": {"[time]": -1},
    "velocity": {"[length]": 1, "[time]": -1},
    "acceleration": {"[length]": 1, "[time]": -2},
    "force": {"[mass]": 1, "[length]": 1, "[time]": -2},
    "stress": {"[mass]": 1, "[length]": -1, "[time]": -2},
    "torque": {"[mass]": 1, "[length]": 2, "[time]": -2},
    "time": {"[time]": 1},
    "inertia": {"[mass]": 1, "[length]": 2},
    "area": {"[length]": 2},
    "second-moment": {"[length]": 4},
    "density": {"[mass]": 1, "[length]": -3},
    "linear-density": {"[mass]": 1, "[length]": -1},
    "power": {"[mass]": 1, "[length]": 2, "[time]": -3},
}
# What vcheck reads as a plausible value of each kind, in SI units: the magnitude of a
# value that is not zero must lie within these bounds (common practice: many orders of
# magnitude beyond any machine, support or detail a design describes, so that no value
# reaching a rule can overflow or underflow in its arithmetic).
PLAUSIBLE_RANGES: dict[str, tuple[float, float]] = {
    "mass": (1e-6, 1e8),  # 1 mg to 100,000 t
    "length": (1e-9, 1e4),  # 1 nm to 10 km
    "stiffness": (1e-3, 1e13),  # N/m
    "frequency": (1e-6, 1e6),  # Hz (60,000,000 rpm)
    "velocity": (1e-12, 1e4),  # m/s
    "acceleration": (1e-12, 1e7),  # m/s^2
    "force": (1e-9, 1e12),  # N
    "stress": (1e-3, 1e13),  # Pa
    "torque": (1e-9, 1e12),  # N*m
    "time": (1e-9, 1e11),  # s (about 3,000 years)
    "inertia": (1e-12, 1e12),  # kg*m^2
    "area": (1e-15, 1e6),  # m^2
    "second-moment": (1e-24, 1e6),  # m^4
    "density": (1e-3, 1e6),  # kg/m^3
    "linear-density": (1e-9, 1e7),  # kg/m
    "power": (1e-6, 1e12),  # W
}

_KIND_BY_DIMENSION = {tuple(sorted(d.items())): k for k, d in _DIMENSIONS.items()}

_NUMBER = r"[+-]?(?:\d+(?:_\d+)*(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?"
_AMOUNT = re.compile(
    rf"^\s*(?P<number>{_NUMBER})\s*(?P<unit>[^+±]*?)\s*"
    rf"(?:(?:\+-|±|\+/-)\s*(?P<tol>{_NUMBER})\s*(?P<tolunit>[^\s].*?)?)?\s*$"
)
_DEFINITIONS = Path(__file__).with_name("units.txt")


def engineering_number(value: float) -> str:
    """A number as an engineer writes it: four significant figures, whole above 1000
    ("272.2", "10596", "0.8125")."""
    if abs(value) >= 1000:
        return f"{value:.0f}"
    return f"{value:.4g}"


def in_units_of(amount, si_value: float, si_unit: str) -> str:
    """``si_value`` [SI] written in the unit ``amount`` was written in ("600 lb"), so that
    a report echoes a design in its own units; the SI value when the unit cannot be read
    back from the text (an expression, a zero). The amount's own nominal value is shown as
    written."""
    match = _AMOUNT.match(amount.text) if len(amount.text) <= 80 else None
    if match is None or not match.group("unit"):
        return f"{engineering_number(si_value)} {si_unit}"
    number = float(match.group("number").replace("_", ""))
    if si_value == amount.value and not match.group("tol"):
        return f"{match.group('number')} {match.group('unit')}"
    if number == 0 or amount.value == 0:
        return f"{engineering_number(si_value)} {si_unit}"
    return f"{engineering_number(si_value * number / amount.value)} {match.group('unit')}"


class UnitError(ValueError):
    """A quantity string that cannot be read; the message says what is expected."""


class UnitGrammarError(UnitError):
    """A unit expression outside the grammar below; the message says where and why."""


MAX_QUANTITY_CHARS = 200
"""Longest quantity string read (number, unit and tolerance), in characters."""

MAX_UNIT_CHARS = 40
"""Longest unit expression read, in characters ("lbf*in/(in/s)" is 13)."""

MAX_NESTING = 2
"""Deepest parentheses in a unit expression ("(m/s^2)^2/Hz" is 1)."""

MAX_EXPONENT = 6
"""Largest exponent magnitude in a unit expression ("m^4" for a second moment of area,
"1/m^3" for a density); bounded so the unit library never computes a huge power."""

_TOKEN = re.compile(
    r"\s*(?:(?P<name>[A-Za-zµ_][A-Za-z0-9µ_]*)|(?P<number>\d+(?:\.\d+)?)"
    r"|(?P<power>\*\*|\^)|(?P<op>[*/])|(?P<minus>-)|(?P<open>\()|(?P<close>\))"
    r"|(?P<other>\S))"
)


def _tokens(text: str) -> list[tuple[str, str, int]]:
    out = []
    position = 0
    while position < len(text):
        found = _TOKEN.match(text, position)
        if found is None:  # only trailing spaces are left
            break
        kind = found.lastgroup
        out.append((kind, found[kind], found.start(kind) + 1))
        position = found.end()
    return out


class _UnitParser:
    """Recursive descent over the unit grammar; builds the text pint is given.

    unit     := product
    product  := factor (("*" | "/" | " ") factor)*
    factor   := base (("^" | "**") exponent)?
    base     := NAME | NUMBER (not zero) | "(" product ")"
    exponent := ["-"] INTEGER | "(" ["-"] INTEGER "/" INTEGER ")" | DECIMAL

    Exponents are small integers or simple fractions, never zero; parentheses nest at
    most :data:`MAX_NESTING` deep, so the depth of recursion is bounded by the grammar.
    """

    def __init__(self, text: str) -> None:
        self.text = text
        self.tokens = _tokens(text)
        self.k = 0

    def fail(self, message: str) -> UnitGrammarError:
        return UnitGrammarError(message)

    def peek(self):
        return self.tokens[self.k] if self.k < len(self.tokens) else ("end", "", len(self.text) + 1)

    def take(self):
        token = self.peek()
        self.k += 1
        return token

    def parse(self) -> str:
        for n, (kind, value, column) in enumerate(self.tokens):
            if kind == "minus" and (n == 0 or self.tokens[n - 1][0] != "power"):
                raise self.fail(f"a minus sign (at character {column} of the unit) belongs "
                                "only to an exponent, as in 's^-2'")
            if kind == "other":
                if value == "%":
                    raise self.fail("'%' is not a unit; a percentage is read only as a "
                                    "tolerance, as in \"+-10%\"")
                raise self.fail(f"the character '{value}' (at character {column} of the unit) "
                                "cannot be part of a unit")
        out = self.product(0)
        kind, value, column = self.peek()
        if kind == "close":
            raise self.fail(f"the ')' at character {column} of the unit has no '('")
        if kind != "end":  # pragma: no cover - product() consumes all but ')'
            raise self.fail(f"unexpected '{value}' at character {column} of the unit")
        return out

    def product(self, depth: int) -> str:
        parts = [self.factor(depth)]
        while True:
            kind, value, column = self.peek()
            if kind == "op":
                self.take()
                if self.peek()[0] in ("end", "close", "op", "power"):
                    raise self.fail(f"'{value}' at character {column} of the unit needs a unit "
                                    "after it")
                parts.append(value)
                parts.append(self.factor(depth, divisor=value == "/"))
            elif kind in ("name", "number", "open") and self.tokens[self.k - 1][0] != "power":
                parts.append("*")  # a space between units multiplies, as in "N m"
                parts.append(self.factor(depth))
            elif kind in ("name", "number", "open"):
                raise self.fail(f"'{value}' at character {column} of the unit follows an "
                                "exponent; write '*' between units")
            else:
                return " ".join(parts)

    def factor(self, depth: int, divisor: bool = False) -> str:
        kind, value, column = self.take()
        if kind == "name":
            base = value
        elif kind == "number":
            if float(value) == 0:
                raise self.fail("dividing by zero" if divisor else
                                "a factor of zero in a unit")
            base = value
        elif kind == "open":
            if depth >= MAX_NESTING:
                raise self.fail(f"parentheses nest more than {MAX_NESTING} deep")
            if self.peek()[0] == "close":
                raise self.fail("empty parentheses '()'")
            if self.peek()[0] == "end":
                raise self.fail(f"the '(' at character {column} of the unit is not closed")
            base = "(" + self.product(depth + 1) + ")"
            if self.take()[0] != "close":
                raise self.fail(f"the '(' at character {column} of the unit is not closed")
        elif kind == "end":
            raise self.fail("a unit is missing at the end")
        elif kind == "close":
            raise self.fail(f"the ')' at character {column} of the unit has no '('")
        else:
            raise self.fail(f"'{value}' at character {column} of the unit needs a unit "
                            "before it")
        if self.peek()[0] != "power":
            return base
        self.take()
        exponent = self.exponent()
        if self.peek()[0] == "power":
            raise self.fail("a power of a power is not read; write one exponent, as in 'm^2'")
        return f"{base}**{exponent}"

    def exponent(self) -> str:
        kind, value, column = self.take()
        if kind == "open":
            sign, numerator = self._signed_integer()
            if self.take()[1] != "/":
                raise self.fail("write a fractional exponent as '^(1/2)'")
            _, denominator = self._signed_integer(allow_sign=False)
            if self.take()[0] != "close":
                raise self.fail("write a fractional exponent as '^(1/2)'")
            if denominator == 0:
                raise self.fail("dividing by zero in an exponent")
            return self._checked(sign * numerator / denominator)
        self.k -= 1
        sign, number = self._signed_integer(decimal=True)
        return self._checked(sign * number)

    def _signed_integer(self, allow_sign: bool = True, decimal: bool = False):
        kind, value, column = self.take()
        sign = 1
        if allow_sign and kind == "minus":
            sign = -1
            kind, value, column = self.take()
        if kind != "number" or ("." in value and not decimal):
            shown = value or "nothing"
            raise self.fail(f"the exponent must be a small whole number or a simple fraction "
                            f"such as 2, -1 or (1/2), got {shown}")
        return sign, float(value)

    def _checked(self, exponent: float) -> str:
        if exponent == 0:
            raise self.fail("an exponent of 0 cancels the unit")
        if abs(exponent) > MAX_EXPONENT:
            shown = f"{exponent:g}"
            raise self.fail(f"the exponent {shown} is beyond +-{MAX_EXPONENT}")
        return f"{exponent:g}"


def check_unit_grammar(unit_text: str) -> str:
    """The unit expression rewritten for the unit library, or UnitGrammarError.

    Accepted: unit names, positive numbers, ``*``, ``/``, a space (multiplies),
    ``^`` or ``**`` with an integer exponent from -6 to 6 (not 0) or a simple fraction
    ``^(1/2)``, parentheses at most two deep, at most 40 characters.
    """
    text = unit_text.replace("·", "*").replace("²", "^2").replace("³", "^3")
    if len(text) > MAX_UNIT_CHARS:
        raise UnitGrammarError(f"the unit is {len(text)} characters long; units are at most "
                               f"{MAX_UNIT_CHARS}")
    return _UnitParser(text).parse()


@lru_cache(maxsize=1)
def _registry():
    import pint

    registry = pint.UnitRegistry(None, cache_folder=None)
    registry.load_definitions(str(_DEFINITIONS))
    return registry


@lru_cache(maxsize=512)
def _unit_factor(unit_text: str) -> tuple[float, tuple]:
    """SI factor and dimension key of a unit expression; raises UnitError if unknown.

    The units designs usually carry are answered from :data:`.unit_table.UNIT_FACTORS`,
    pint's own results written down (a test holds them equal), so a check of such designs
    never imports pint; any other unit goes to the registry."""
    text = check_unit_grammar(unit_text)
    known = UNIT_FACTORS.get(unit_text)
    if known is not None:
        return known
    return pint_unit_factor(unit_text, text)


def pint_unit_factor(unit_text: str, text: str | None = None) -> tuple[float, tuple]:
    """:func:`_unit_factor` through the pint registry alone (``text``: the unit after
    :func:`check_unit_grammar`); raises UnitError if unknown."""
    import pint

    if text is None:
        text = check_unit_grammar(unit_text)
    registry = _registry()
    try:
        unit = registry.parse_units(text)
    except (pint.errors.UndefinedUnitError, pint.errors.DefinitionSyntaxError,
            AttributeError, TypeError, ValueError, SyntaxError) as exc:
        raise UnitError(f"unknown unit '{unit_text}'") from exc
    quantity = registry.Quantity(1.0, unit).to_base_units()
    dims = tuple(sorted((str(k), float(v)) for k, v in quantity.dimensionality.items()))
    return float(quantity.magnitude), dims


def _describe(kind: QuantityKind) -> str:
    examples = " or ".join(f'"{e}"' for e in kind.examples)
    return f"{kind.name} such as {examples}"


_READ: dict = {}
"""Amounts already read, by (text, kind, tolerance allowed): the same strings ("25 mm",
"1480 rpm") recur across the designs of a project. An Amount is immutable, so one may
serve every field that wrote the same text."""

_READ_LIMIT = 4096
"""Most amounts kept in :data:`_READ`; it is emptied when full (memory stays bounded
whatever the designs hold)."""


def parse_amount(raw: object, kind: str, *, allow_tolerance: bool = True) -> Amount:
    """Read a quantity string into an :class:`Amount` in SI units (the same text of the
    same kind is read once: see :data:`_READ`).

    Parameters
    ----------
    raw : object
        The value from the design file; must be a string such as "420 kg".
    kind : str
        Key of :data:`QUANTITY_KINDS`: what the field measures.
    allow_tolerance : bool
        Whether a tolerance band ("+-10%" or "+-20 kN/m") is accepted.

    Raises
    ------
    UnitError
        With a message naming what was expected and an example.
    """
    if type(raw) is str:
        key = (raw, kind, allow_tolerance)
        found = _READ.get(key)
        if found is None:
            found = _read_amount(raw, kind, allow_tolerance)
            if len(_READ) >= _READ_LIMIT:
                _READ.clear()
            _READ[key] = found
        return found
    return _read_amount(raw, kind, allow_tolerance)


def _read_amount(raw: object, kind: str, allow_tolerance: bool) -> Amount:
    spec = QUANTITY_KINDS[kind]
    if isinstance(raw, bool) or not isinstance(raw, (str, int, float)):
        raise UnitError(f"expected {_describe(spec)}, as a string with its unit")
    if not isinstance(raw, str):
        raise UnitError(
            f"the number {raw!r} has no unit; write {_describe(spec)}"
            f' (in quotes: "{raw:g} {spec.si_unit}")'
        )
    if len(raw) > MAX_QUANTITY_CHARS:
        raise UnitError(f"the value is {len(raw)} characters long; a quantity is at most "
                        f"{MAX_QUANTITY_CHARS}, such as {_describe(spec)[len(spec.name) + 9:]}")
    match = _AMOUNT.match(raw)
    if match is None:
        if re.search(r"\b(nan|inf|infinity)\b", raw, re.IGNORECASE):
            raise UnitError(f"'{raw}' is not a finite number; write {_describe(spec)}")
        raise UnitError(f"cannot read '{raw}' as {_describe(spec)}")
    number = float(match["number"].replace("_", ""))
    unit_text = match["unit"].strip()
    if not unit_text:
        raise UnitError(f"'{raw}' has no unit; write {_describe(spec)}")
    factor = _checked_factor(unit_text, raw, kind, spec)
    value = number * factor
    if not math.isfinite(value):
        raise UnitError(f"'{raw}' is not a finite number; write {_describe(spec)}")
    _check_plausible(value, raw, kind, spec)
    low = high = value
    if match["tol"] is not None:
        if not allow_tolerance:
            raise UnitError(f"'{raw}': a tolerance is not accepted here; write {_describe(spec)}")
        tolerance = float(match["tol"].replace("_", ""))
        tol_unit = (match["tolunit"] or "").strip()
        if tolerance < 0:
            raise UnitError(f"'{raw}': the tolerance must not be negative")
        if tol_unit == "%":
            spread = abs(value) * tolerance / 100.0
        elif tol_unit:
            spread = tolerance * _checked_factor(tol_unit, raw, kind, spec)
        else:
            raise UnitError(
                f"'{raw}': give the tolerance in percent or with a unit, as in "
                f'"{spec.examples[0]} +-10%"'
            )
        if spread > abs(value) * 1e6 + PLAUSIBLE_RANGES[kind][0]:
            raise UnitError(f"'{raw}': the tolerance is more than a million times the value")
        low, high = value - spread, value + spread
    return Amount(value=value, low=low, high=high, text=raw.strip())


def _check_plausible(value: float, raw: str, kind: str, spec: QuantityKind) -> None:
    """UnitError when a value that is not zero lies outside :data:`PLAUSIBLE_RANGES`."""
    low, high = PLAUSIBLE_RANGES[kind]
    if value != 0 and not low <= abs(value) <= high:
        raise UnitError(f"'{raw}' is outside the range vcheck reads for {spec.name} "
                        f"({low:g} to {high:g} {spec.si_unit}); check the number and its unit")


def _checked_factor(unit_text: str, raw: str, kind: str, spec: QuantityKind) -> float:
    try:
        factor, dims = _unit_factor(unit_text)
    except UnitGrammarError as exc:
        raise UnitError(f"cannot read the unit '{unit_text}' in '{raw}': {exc}; write "
                        f"{_describe(spec)}") from None
    except UnitError:
        accepted = ", ".join(spec.accepted)
        hint = ""
        if unit_text in ("grams", "gm", "gr"):
            hint = " (grams are written 'gram'; 'g' is standard gravity)"
        raise UnitError(
            f"unknown unit '{unit_text}' in '{raw}'{hint}; units accepted for "
            f"{spec.name}: {accepted}"
        ) from None
    expected = tuple(sorted((k, float(v)) for k, v in _DIMENSIONS[kind].items()))
    if dims != expected:
        found = _KIND_BY_DIMENSION.get(tuple(sorted(dims)))
        what = QUANTITY_KINDS[found].name if found else f"a quantity in '{unit_text}'"
        hint = ""
        if kind == "mass" and found == "acceleration":
            hint = " ('g' is standard gravity in vcheck; grams are written 'gram')"
        raise UnitError(f"'{raw}' is {what}, but {_describe(spec)} is expected{hint}")
    return factor

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

The registry is built once, on the first quantity read, so commands that read no
design do not pay for importing pint.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from functools import lru_cache
from pathlib import Path

__all__ = ["Amount", "QUANTITY_KINDS", "QuantityKind", "UnitError", "parse_amount"]


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


@dataclass(frozen=True)
class QuantityKind:
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
_KIND_BY_DIMENSION = {tuple(sorted(d.items())): k for k, d in _DIMENSIONS.items()}

_NUMBER = r"[+-]?(?:\d+(?:_\d+)*(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?"
_AMOUNT = re.compile(
    rf"^\s*(?P<number>{_NUMBER})\s*(?P<unit>[^+±]*?)\s*"
    rf"(?:(?:\+-|±|\+/-)\s*(?P<tol>{_NUMBER})\s*(?P<tolunit>[^\s].*?)?)?\s*$"
)
_DEFINITIONS = Path(__file__).with_name("units.txt")


class UnitError(ValueError):
    """A quantity string that cannot be read; the message says what is expected."""


@lru_cache(maxsize=1)
def _registry():
    import pint

    registry = pint.UnitRegistry(None, cache_folder=None)
    registry.load_definitions(str(_DEFINITIONS))
    return registry


@lru_cache(maxsize=512)
def _unit_factor(unit_text: str) -> tuple[float, tuple]:
    """SI factor and dimension key of a unit expression; raises UnitError if unknown."""
    import pint

    registry = _registry()
    text = unit_text.replace("·", "*").replace("²", "^2").replace("³", "^3")
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


def parse_amount(raw: object, kind: str, *, allow_tolerance: bool = True) -> Amount:
    """Read a quantity string into an :class:`Amount` in SI units.

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
    spec = QUANTITY_KINDS[kind]
    if isinstance(raw, bool) or not isinstance(raw, (str, int, float)):
        raise UnitError(f"expected {_describe(spec)}, as a string with its unit")
    if not isinstance(raw, str):
        raise UnitError(
            f"the number {raw!r} has no unit; write {_describe(spec)}"
            f' (in quotes: "{raw:g} {spec.si_unit}")'
        )
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
        low, high = value - spread, value + spread
    return Amount(value=value, low=low, high=high, text=raw.strip())


def _checked_factor(unit_text: str, raw: str, kind: str, spec: QuantityKind) -> float:
    try:
        factor, dims = _unit_factor(unit_text)
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

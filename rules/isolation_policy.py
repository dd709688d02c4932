"""Default policy data for isolator selection: minimum static deflection, required efficiency.

This module holds tables, not physics: the minimum static deflection an isolator should
have by kind of equipment, running speed and the floor it stands on, and the isolation
efficiency required on each kind of floor. The deflections follow the pattern of
the selection guide for vibration isolation in the ASHRAE Handbook, HVAC Applications,
chapter "Noise and Vibration Control". That guide draws its deflections from the ladder
0.25 / 0.75 / 1.5 / 2.5 / 3.5 in and sorts floors into slab on grade and spans up to
20 ft, 20-30 ft and 30-40 ft.

Honest status: the ladder and the layout are from memory, and the value for each
equipment kind, speed band and floor in :data:`MINIMUM_STATIC_DEFLECTION_TABLE` is a
default policy written down from memory, not read from the Handbook. It is meant to be
overridden by a project's own table (pass ``table=``) and checked against the edition
and specification that govern the job. The required efficiencies by floor
(:data:`REQUIRED_EFFICIENCY_BY_FLOOR`) are common practice, recalled, not read from one
source.
"""

from __future__ import annotations

import math
from types import MappingProxyType
from typing import NamedTuple

from numpy.typing import ArrayLike

from vcheck.dynamics.isolation.damping import _checked  # the same range checks and messages as dynamics

__all__ = [
    "STATIC_DEFLECTION_LADDER",
    "FLOOR_SUPPORTS",
    "FLOOR_SPAN_LIMITS",
    "MinimumDeflectionRow",
    "MINIMUM_STATIC_DEFLECTION_TABLE",
    "SPECIAL_CONSIDERATION_SPEED",
    "FLOOR_DEFLECTION_FACTOR",
    "REQUIRED_EFFICIENCY_BY_FLOOR",
    "floor_support",
    "required_efficiency",
    "minimum_static_deflection",
    "needs_special_consideration",
    "minimum_isolator_deflection_for_floor",
    "RunTimes",
    "RUN_TIMES_BY_DRIVER",
    "default_run_times",
    "RUN_TIME_WORDS",
    "LARGEST_STATIC_DEFLECTION_BY_ISOLATOR",
    "LARGEST_BASE_MASS_RATIO",
]

_INCH = 0.0254  # m, exact (international inch)
_FOOT = 0.3048  # m, exact (international foot)

STATIC_DEFLECTION_LADDER: tuple[float, ...] = tuple(
    inches * _INCH for inches in (0.25, 0.75, 1.5, 2.5, 3.5)
)
"""Steps of minimum static deflection, smallest first [m].

0.25, 0.75, 1.5, 2.5 and 3.5 in (6.35, 19.05, 38.1, 63.5, 88.9 mm; the trade rounds
them to about 6, 19, 38, 64, 89 mm). Source: ASHRAE Handbook, HVAC Applications,
chapter "Noise and Vibration Control", selection guide for vibration isolation (from
memory).
"""

FLOOR_SUPPORTS: tuple[str, ...] = (
    "slab-on-grade",
    "span-up-to-20-ft",
    "span-20-to-30-ft",
    "span-30-to-40-ft",
)
"""Floor classes of the selection guide, stiffest first (from memory of the ASHRAE guide).

A span is the column spacing of the floor bay that carries the equipment.
"""

FLOOR_SPAN_LIMITS: tuple[float, ...] = (20 * _FOOT, 30 * _FOOT, 40 * _FOOT)
"""Longest span of each suspended-floor class in :data:`FLOOR_SUPPORTS` [m].

20, 30 and 40 ft (6.096, 9.144, 12.192 m); a span equal to a limit belongs to the
shorter class. Longer spans are outside the guide.
"""


class MinimumDeflectionRow(NamedTuple):
    """One row of a minimum static deflection table.

    Attributes
    ----------
    equipment_kind : str
        Kind of equipment, kebab-case, as in a design file [unitless].
    speed_above : float
        The row applies to running speeds above this [Hz].
    speed_up_to : float
        ... and up to and including this; ``inf`` for no upper limit [Hz].
    minimum_static_deflection : tuple of float
        Minimum static deflection for each floor class of :data:`FLOOR_SUPPORTS`, in
        that order [m].
    """

    equipment_kind: str
    speed_above: float
    speed_up_to: float
    minimum_static_deflection: tuple[float, float, float, float]


def _row(kind: str, rpm_above: float, rpm_up_to: float, inches: tuple) -> MinimumDeflectionRow:
    return MinimumDeflectionRow(
        kind, rpm_above / 60.0, rpm_up_to / 60.0, tuple(x * _INCH for x in inches)
    )


_ALL = (0.0, math.inf)
_SLOW = (0.0, 300.0)
_MEDIUM = (300.0, 500.0)
_FAST = (500.0, math.inf)

MINIMUM_STATIC_DEFLECTION_TABLE: tuple[MinimumDeflectionRow, ...] = (
    # kind, speed band [rpm], deflection [in] on slab / <=20 ft / 20-30 ft / 30-40 ft
    _row("centrifugal-pump", *_ALL, (0.75, 0.75, 1.5, 1.5)),
    _row("fan", *_SLOW, (2.5, 3.5, 3.5, 3.5)),
    _row("fan", *_MEDIUM, (1.5, 1.5, 2.5, 2.5)),
    _row("fan", *_FAST, (0.75, 0.75, 1.5, 1.5)),
    _row("chiller", *_ALL, (0.25, 0.75, 1.5, 1.5)),
    _row("reciprocating-compressor", *_ALL, (0.75, 1.5, 1.5, 2.5)),
    _row("cooling-tower", *_SLOW, (0.25, 3.5, 3.5, 3.5)),
    _row("cooling-tower", *_MEDIUM, (0.25, 1.5, 2.5, 2.5)),
    _row("cooling-tower", *_FAST, (0.25, 0.75, 0.75, 1.5)),
    _row("generator-set", *_ALL, (0.75, 1.5, 2.5, 3.5)),
    _row("air-handler", *_SLOW, (0.75, 3.5, 3.5, 3.5)),
    _row("air-handler", *_MEDIUM, (0.75, 1.5, 2.5, 2.5)),
    _row("air-handler", *_FAST, (0.75, 0.75, 1.5, 1.5)),
    # kinds the selection guide does not name as such (common practice, from memory):
    _row("compressor", *_ALL, (0.25, 0.75, 1.5, 1.5)),
    _row("motor", *_ALL, (0.75, 0.75, 1.5, 1.5)),
    _row("engine", *_ALL, (0.75, 1.5, 2.5, 3.5)),
    _row("other", *_SLOW, (2.5, 3.5, 3.5, 3.5)),
    _row("other", *_MEDIUM, (1.5, 1.5, 2.5, 2.5)),
    _row("other", *_FAST, (0.75, 0.75, 1.5, 1.5)),
)
"""Default minimum static deflection of isolators by equipment, speed and floor.

Speed bands up to 300 rpm, 300-500 rpm and above 500 rpm where the kind has them.
Every value is a step of :data:`STATIC_DEFLECTION_LADDER`; deflection grows with span and
falls with speed. Source: patterned on the ASHRAE Handbook, HVAC Applications, chapter
"Noise and Vibration Control", selection guide for vibration isolation; the values are a
default policy from memory, not read from the Handbook: override with the governing
specification. Kinds: centrifugal pumps (base-mounted), fans (centrifugal and axial),
chillers (packaged centrifugal and screw), reciprocating compressors, cooling towers,
engine-driven generator sets, air handlers. Rows for the other machine kinds of the
design format, marked common practice (from memory), so that no valid kind is left
unchecked: ``compressor`` (rotary: screw, scroll, centrifugal) takes the chiller row, the
guide's row for packaged rotary refrigeration machines; ``motor`` (a motor standing alone, or a motor
with a coupled load not named) the same; ``engine`` the generator-set row (the same
reciprocating forcing); ``other`` the fan rows by speed, the most demanding at low speed.
"""

SPECIAL_CONSIDERATION_SPEED: float = 250.0 / 60.0
"""Running speed below which isolation needs special consideration [Hz].

250 rpm. Below it the deflections of the selection guide no longer isolate reliably and
the installation needs its own analysis. Source: a published US guide specification for
the vibration isolation of building mechanical equipment (seen; document title not
recorded in the project's reference notes).
"""

FLOOR_DEFLECTION_FACTOR: float = 10.0
"""Least ratio of isolator static deflection to the floor's deflection under the load.

Isolators should deflect at least ten times as much as the supporting floor does under
the equipment, so that the floor's flexibility barely changes the isolation (common
practice; from memory, low confidence). Configurable.
"""

REQUIRED_EFFICIENCY_BY_FLOOR = MappingProxyType(
    {
        "slab-on-grade": 0.80,
        "span-up-to-20-ft": 0.90,
        "span-20-to-30-ft": 0.95,
        "span-30-to-40-ft": 0.95,
    }
)
"""Default required isolation efficiency E = 1 - T by floor class [unitless].

80 % for equipment on a slab on grade or in a basement, 90 % on suspended floors, 95 % on
long-span (flexible) floors, where the floor's own response multiplies what the isolators
let through. Common practice as stated in isolator makers' selection guidance and
acoustics texts, recalled (from memory), not read from one source; a project's
specification governs. The same value applies to every kind of equipment and speed; a
project sets its own by kind of equipment in its policy.
"""


def floor_support(floor_span: float | None = None) -> str:
    """Floor class of the selection guide for a floor span.

    Parameters
    ----------
    floor_span : float or None, optional
        Span of the floor bay carrying the equipment, positive; None for a slab on grade
        [m].

    Returns
    -------
    str
        One of :data:`FLOOR_SUPPORTS` [unitless].

    Raises
    ------
    ValueError
        If the span is not positive or is longer than 40 ft (12.192 m).

    Examples
    --------
    >>> floor_support(7.5)
    'span-20-to-30-ft'
    """
    if floor_span is None:
        return FLOOR_SUPPORTS[0]
    span = float(_checked(floor_span, "floor span", low=0.0, low_inclusive=False))
    for name, limit in zip(FLOOR_SUPPORTS[1:], FLOOR_SPAN_LIMITS):
        if span <= limit:
            return name
    raise ValueError(
        f"floor span {span:g} m is longer than the {FLOOR_SPAN_LIMITS[-1]:g} m (40 ft) the "
        "deflection table covers; such floors need their own analysis"
    )


def minimum_static_deflection(
    equipment_kind: str,
    speed: float,
    floor_span: float | None = None,
    table: tuple[MinimumDeflectionRow, ...] = MINIMUM_STATIC_DEFLECTION_TABLE,
) -> float:
    """Minimum isolator static deflection for a piece of equipment, from a policy table.

    Parameters
    ----------
    equipment_kind : str
        Kind of equipment as in the table, such as "fan" [unitless].
    speed : float
        Running speed of the equipment, positive; over a speed range, the lowest speed
        [Hz].
    floor_span : float or None, optional
        Span of the floor bay, at most 40 ft (12.192 m); None for a slab on grade [m].
    table : tuple of MinimumDeflectionRow, optional
        The policy table; :data:`MINIMUM_STATIC_DEFLECTION_TABLE` (from memory) by
        default [unitless].

    Returns
    -------
    float
        Minimum static deflection [m].

    Raises
    ------
    ValueError
        If the kind is not in the table (the message lists the kinds), no row covers the
        speed, or the span is outside the table.

    Notes
    -----
    A lookup, not a model. The deflection sets the isolator's natural frequency through
    f_n = sqrt(g / delta) / (2 pi)
    (:func:`vcheck.dynamics.isolation.transmissibility.natural_frequency_from_static_deflection`).
    Speeds below :data:`SPECIAL_CONSIDERATION_SPEED` get the slowest band's value and
    should also be flagged (:func:`needs_special_consideration`).

    References
    ----------
    .. [1] ASHRAE Handbook, HVAC Applications, chapter "Noise and Vibration Control",
       selection guide for vibration isolation (from memory; values are a default
       policy, not the Handbook's).

    Examples
    --------
    >>> print(f"{minimum_static_deflection('fan', 450 / 60, floor_span=8.0) * 1000:.1f}")
    63.5
    """
    rows = [row for row in table if row.equipment_kind == equipment_kind]
    if not rows:
        known = ", ".join(sorted({row.equipment_kind for row in table}))
        raise ValueError(
            f"unknown equipment kind {equipment_kind!r} for the deflection table; known "
            f"kinds are {known}"
        )
    n = float(_checked(speed, "speed", low=0.0, low_inclusive=False))
    support = FLOOR_SUPPORTS.index(floor_support(floor_span))
    for row in rows:
        if row.speed_above < n <= row.speed_up_to:
            return float(row.minimum_static_deflection[support])
    raise ValueError(
        f"no row of the deflection table covers {equipment_kind!r} at {n * 60.0:g} rpm"
    )


def needs_special_consideration(speed: ArrayLike):
    """Whether a running speed is below the speed that needs special consideration.

    Parameters
    ----------
    speed : array_like
        Running speed, at least 0 [Hz].

    Returns
    -------
    numpy.ndarray of bool
        True where the speed is below :data:`SPECIAL_CONSIDERATION_SPEED` (250 rpm)
        [unitless].

    References
    ----------
    .. [1] A published US guide specification for vibration isolation of building
       mechanical equipment (seen; title not recorded).

    Examples
    --------
    >>> bool(needs_special_consideration(200 / 60))
    True
    """
    return _checked(speed, "speed", low=0.0) < SPECIAL_CONSIDERATION_SPEED


def minimum_isolator_deflection_for_floor(
    floor_deflection: ArrayLike, factor: ArrayLike = FLOOR_DEFLECTION_FACTOR
):
    """Least isolator static deflection for a floor that deflects under the equipment.

    Parameters
    ----------
    floor_deflection : array_like
        Deflection of the floor at the equipment under the equipment's weight, at
        least 0 [m].
    factor : array_like, optional
        Required ratio of isolator to floor deflection, at least 1;
        :data:`FLOOR_DEFLECTION_FACTOR` (10, common practice, low confidence) by default
        [unitless].

    Returns
    -------
    numpy.ndarray
        Least isolator static deflection [m].

    Notes
    -----
    delta_isolator >= factor * delta_floor. With the floor taken as a massless spring in
    series, the natural frequency of the equipment falls to
    f_n / sqrt(1 + 1 / factor) of the isolator-alone value: 4.7 % lower at factor 10.

    References
    ----------
    .. [1] Common practice (from memory, low confidence).

    Examples
    --------
    >>> print(f"{minimum_isolator_deflection_for_floor(0.002) * 1000:.0f}")
    20
    """
    delta = _checked(floor_deflection, "floor deflection", low=0.0)
    ratio = _checked(factor, "floor deflection factor", low=1.0)
    return ratio * delta


def required_efficiency(
    floor_span: float | None = None, by_floor=REQUIRED_EFFICIENCY_BY_FLOOR
) -> float:
    """Required isolation efficiency for the floor a machine stands on, from a policy table.

    Parameters
    ----------
    floor_span : float or None, optional
        Span of the floor bay, at most 40 ft (12.192 m); None for a slab on grade [m].
    by_floor : mapping, optional
        Floor class of :data:`FLOOR_SUPPORTS` -> required efficiency;
        :data:`REQUIRED_EFFICIENCY_BY_FLOOR` (common practice, from memory) by default
        [unitless].

    Returns
    -------
    float
        Required efficiency E = 1 - T at the governing forcing frequency [unitless].

    Raises
    ------
    ValueError
        If the span is not positive or is longer than 40 ft, or the table has no value
        for the floor class.

    References
    ----------
    .. [1] Common practice (from memory): 80 % on grade, 90 % on suspended floors, 95 % on
       long spans.

    Examples
    --------
    >>> required_efficiency(8.0)
    0.95
    """
    support = floor_support(floor_span)
    try:
        return float(by_floor[support])
    except KeyError:
        raise ValueError(f"no required efficiency for the floor class {support!r}") from None


class RunTimes(NamedTuple):
    """Default start-up and shut-down times of a kind of driver [s], and why."""

    run_up: float
    run_down: float
    words: str


RUN_TIMES_BY_DRIVER = MappingProxyType({
    "line-started motor": RunTimes(
        5.0, 30.0, "a motor started across the line reaches speed in a few seconds (1-10 s "
        "for fans and pumps) and coasts down for tens of seconds; the longer coast-down "
        "governs (common practice, from memory)"),
    "drive-fed motor": RunTimes(
        10.0, 10.0, "a variable-frequency drive's acceleration and deceleration ramps, "
        "commonly set to 5-30 s (from memory); a drive set to coast to a stop takes longer"),
    "engine": RunTimes(
        10.0, 10.0, "an engine reaches rated speed in about 10 s (a standby generator set's "
        "start, from memory) and stops in seconds against its compression (common practice)"),
    "turbine": RunTimes(
        60.0, 120.0, "a turbine runs up over a minute or more and runs down for minutes "
        "(common practice, from memory)"),
    "other": RunTimes(
        10.0, 60.0, "no driver kind stated: a slow coast-down of a minute is assumed, the "
        "stricter case (common practice)"),
})
"""Default run-up and run-down times by kind of driver [s].

Used by the resonance passage rule where the design gives no ``machine.run-up`` or
``machine.run-down``: the longer time gives the slower passage and the higher peak. Every
value is common practice recalled (from memory), not read from one source; the maker's
start-up data or the drive's ramp settings govern.
"""


RUN_TIME_WORDS = MappingProxyType({
    "line-started motor": "a line-started motor",
    "drive-fed motor": "a drive-fed motor",
    "engine": "an engine",
    "turbine": "a turbine",
    "other": "a machine whose driver is not stated",
})
"""The rows of :data:`RUN_TIMES_BY_DRIVER` in words, for messages."""


def default_run_times(driver, machine_kind: str) -> tuple[str, RunTimes]:
    """The row of :data:`RUN_TIMES_BY_DRIVER` for a driver (a design's ``machine.driver``
    or None) and the machine's kind, with the row's name."""
    kind = driver.kind if driver is not None else None
    if kind in ("induction-motor", "synchronous-motor"):
        name = "drive-fed motor" if driver.supply == "drive" else "line-started motor"
    elif kind == "dc-motor":
        name = "drive-fed motor"
    elif kind == "engine" or (kind is None and machine_kind in ("engine", "generator-set")):
        name = "engine"
    elif kind == "turbine":
        name = "turbine"
    elif kind == "belt-drive":
        name = "line-started motor"
    else:
        name = "other"
    return name, RUN_TIMES_BY_DRIVER[name]


LARGEST_STATIC_DEFLECTION_BY_ISOLATOR = MappingProxyType({
    "spring": 4.0 * _INCH,
    "restrained-spring": 4.0 * _INCH,
    "rubber": 0.5 * _INCH,
    "pad": 0.25 * _INCH,
})
"""Largest static deflection a stock isolator of each kind offers [m].

Open and restrained steel springs up to about 4 in (102 mm); rubber (neoprene) mounts up
to about 0.5 in (12.7 mm); elastomer pads about 0.25 in (6.4 mm), stacked. Common
practice from isolator makers' ranges, recalled (from memory); air springs are not
limited by a static deflection (their natural frequency is set by their air volume, down
to about 1-3 Hz). A project sets its own with ``largest-static-deflection``.
"""

LARGEST_BASE_MASS_RATIO: float = 2.0
"""Largest inertia base mass as a multiple of the machine's mass [unitless].

Inertia bases are commonly 1 to 2 times the mass of the machine they carry (common
practice); a heavier base is rarely built. A project sets its own with
``largest-base-mass-ratio``.
"""

"""Checks of vcheck.rules.isolation_policy (policy tables, moved out of dynamics).

The deflection table is a default policy from memory (shared/REFERENCES.md tags the
ASHRAE ladder [M]), so these tests do not claim the values are the Handbook's. They check
what can be checked from outside: the ladder's unit conversion, that every value is a
ladder step, the orderings the guide's logic implies (common practice), that each
suspended-floor value actually isolates at the bottom of its speed band (closed-form
transmissibility), and the lookup's plumbing and messages.
"""

from __future__ import annotations

import doctest
import math
import re

import numpy as np
import pytest
from vcheck.rules import isolation_policy
from vcheck.rules.isolation_policy import (
    FLOOR_DEFLECTION_FACTOR,
    FLOOR_SPAN_LIMITS,
    FLOOR_SUPPORTS,
    MINIMUM_STATIC_DEFLECTION_TABLE,
    SPECIAL_CONSIDERATION_SPEED,
    STATIC_DEFLECTION_LADDER,
    MinimumDeflectionRow,
    floor_support,
    minimum_isolator_deflection_for_floor,
    minimum_static_deflection,
    needs_special_consideration,
)

from vcheck.dynamics.isolation.transmissibility import (
    frequency_ratio,
    natural_frequency_from_static_deflection,
)

INCH = 0.0254  # m, exact by the 1959 international yard and pound agreement
FOOT = 0.3048


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


def test_ladder_in_inches_and_millimetres():
    # ASHRAE Handbook, HVAC Applications, "Noise and Vibration Control", selection guide:
    # 0.25 / 0.75 / 1.5 / 2.5 / 3.5 in, about 6 / 19 / 38 / 64 / 89 mm (shared/
    # REFERENCES.md [M], from memory). Inches: exact conversion; millimetres: the
    # rounded figures, so half a millimetre.
    inches = (0.25, 0.75, 1.5, 2.5, 3.5)
    assert STATIC_DEFLECTION_LADDER == pytest.approx([x * INCH for x in inches], rel=1e-15)
    assert np.array(STATIC_DEFLECTION_LADDER) * 1000 == pytest.approx([6, 19, 38, 64, 89], abs=0.5)


def test_floor_span_limits_are_20_30_40_ft():
    # Selection guide floor classes (from memory): up to 20 ft, 20-30 ft, 30-40 ft.
    assert FLOOR_SPAN_LIMITS == pytest.approx([20 * FOOT, 30 * FOOT, 40 * FOOT], rel=1e-15)
    assert len(FLOOR_SUPPORTS) == 1 + len(FLOOR_SPAN_LIMITS)


def test_every_table_value_is_a_ladder_step():
    # The guide draws each minimum deflection from the ladder (from memory).
    for row in MINIMUM_STATIC_DEFLECTION_TABLE:
        assert len(row.minimum_static_deflection) == len(FLOOR_SUPPORTS)
        for value in row.minimum_static_deflection:
            assert any(
                math.isclose(value, step, rel_tol=1e-12) for step in STATIC_DEFLECTION_LADDER
            )


def test_deflection_grows_with_span():
    # Common practice: a longer span is a softer floor, which needs softer isolators.
    for row in MINIMUM_STATIC_DEFLECTION_TABLE:
        assert list(row.minimum_static_deflection) == sorted(row.minimum_static_deflection), row


def _rows_by_kind():
    kinds = {}
    for row in MINIMUM_STATIC_DEFLECTION_TABLE:
        kinds.setdefault(row.equipment_kind, []).append(row)
    return kinds


def test_speed_bands_cover_all_speeds_without_gaps_and_slower_needs_more():
    # Every kind's bands must tile (0, inf) so that a lookup never falls through, and a
    # slower band must need at least as much deflection (isolation needs f_n well below
    # the forcing frequency: Thomson & Dahleh, ch. 3, from memory).
    for kind, rows in _rows_by_kind().items():
        rows = sorted(rows, key=lambda row: row.speed_above)
        assert rows[0].speed_above == 0.0, kind
        assert rows[-1].speed_up_to == math.inf, kind
        for slower, faster in zip(rows, rows[1:]):
            assert slower.speed_up_to == faster.speed_above, kind
            assert all(a >= b for a, b in zip(slower.minimum_static_deflection,
                                              faster.minimum_static_deflection)), kind


def test_suspended_floor_values_isolate_at_the_bottom_of_their_band():
    # Closed form: T < 1 needs r = f / f_n > sqrt(2), f_n = sqrt(g / delta) / (2 pi)
    # (shared/REFERENCES.md [D]). For each kind with speed bands, every suspended-floor
    # value must give r > sqrt(2) at the slowest speed of its band (250 rpm for the lowest
    # band, below which the guide asks for special consideration [C]). Slab-on-grade
    # values are excluded: on grade the guide relies on the ground, not on isolation.
    banded = {kind: rows for kind, rows in _rows_by_kind().items() if len(rows) > 1}
    assert banded  # fans, cooling towers, air handlers
    for kind, rows in banded.items():
        for row in rows:
            slowest = max(row.speed_above, SPECIAL_CONSIDERATION_SPEED)
            for deflection in row.minimum_static_deflection[1:]:
                fn = natural_frequency_from_static_deflection(deflection)
                assert frequency_ratio(slowest, fn) > math.sqrt(2.0), (kind, row)


def test_table_covers_the_kinds_named_for_the_default_policy():
    # every machine kind of the design format has a row (none is left NOT CHECKED)
    from typing import get_args

    from vcheck.design.models import MachineKind

    kinds = set(_rows_by_kind())
    assert kinds == set(get_args(MachineKind))
    assert {"centrifugal-pump", "fan", "chiller", "reciprocating-compressor", "cooling-tower",
            "generator-set", "air-handler", "compressor", "motor", "engine", "other"} == kinds


@pytest.mark.parametrize(
    ("span", "expected"),
    [(None, "slab-on-grade"), (3.0, "span-up-to-20-ft"), (20 * FOOT, "span-up-to-20-ft"),
     (20 * FOOT + 1e-6, "span-20-to-30-ft"), (30 * FOOT, "span-20-to-30-ft"),
     (9.5, "span-30-to-40-ft"), (40 * FOOT, "span-30-to-40-ft")],
)
def test_floor_support_classes(span, expected):
    # Class edges: "up to 20 ft" includes 20 ft; the next class starts above it.
    assert floor_support(span) == expected


def test_lookup_reads_the_right_cell():
    # The lookup must return the table cell for the speed band and floor class.
    for row in MINIMUM_STATIC_DEFLECTION_TABLE:
        upper = row.speed_up_to if math.isfinite(row.speed_up_to) else 3600.0 / 60.0
        speeds = [upper, (max(row.speed_above, 1.0) + upper) / 2.0]
        for speed in speeds:
            for support, span in zip(range(4), (None, 5.0, 8.0, 11.0)):
                found = minimum_static_deflection(row.equipment_kind, speed, span)
                assert found == row.minimum_static_deflection[support]
    # band edges: 300 rpm belongs to "up to 300 rpm", just above it to the next band
    assert minimum_static_deflection("fan", 300 / 60, 5.0) == pytest.approx(3.5 * INCH)
    assert minimum_static_deflection("fan", 300.001 / 60, 5.0) == pytest.approx(1.5 * INCH)


def test_project_table_overrides_the_default():
    own = (MinimumDeflectionRow("boiler-feed-pump", 0.0, math.inf, (0.01, 0.02, 0.03, 0.04)),)
    assert minimum_static_deflection("boiler-feed-pump", 50.0, 8.0, table=own) == 0.03
    with pytest.raises(ValueError, match="known kinds are boiler-feed-pump$"):
        minimum_static_deflection("fan", 50.0, table=own)


def test_special_consideration_below_250_rpm():
    # A published US guide specification: equipment below 250 rpm needs special
    # consideration (shared/REFERENCES.md [C]).
    assert SPECIAL_CONSIDERATION_SPEED * 60.0 == pytest.approx(250.0, rel=1e-15)
    result = needs_special_consideration(np.array([100.0, 249.9, 250.0, 1800.0]) / 60.0)
    assert result.tolist() == [True, True, False, False]


def test_floor_deflection_rule_and_what_it_buys():
    # Common practice (from memory, low confidence): isolator deflection >= 10 x floor
    # deflection. Closed form check of what that buys: with the floor as a massless
    # spring in series, the static deflections add, so f_n drops by 1 / sqrt(1 + 1/10)
    # (4.7 %) against the isolator alone (shared/REFERENCES.md f = sqrt(g / delta) /
    # (2 pi) [D]). Tolerance: floating-point rounding.
    assert FLOOR_DEFLECTION_FACTOR == 10.0
    floor = 0.0025
    isolator = minimum_isolator_deflection_for_floor(floor)
    assert isolator == pytest.approx(0.025, rel=1e-15)
    alone = natural_frequency_from_static_deflection(isolator)
    combined = natural_frequency_from_static_deflection(isolator + floor)
    assert combined / alone == pytest.approx(1.0 / math.sqrt(1.1), rel=1e-14)
    assert minimum_isolator_deflection_for_floor([0.001, 0.002], 15.0) == pytest.approx(
        [0.015, 0.03], rel=1e-15
    )


@pytest.mark.parametrize(
    ("call", "message"),
    [
        (lambda: minimum_static_deflection("pile-driver", 10.0),
         "unknown equipment kind 'pile-driver' for the deflection table; known kinds are "
         "air-handler, centrifugal-pump, chiller, compressor, cooling-tower, engine, fan, "
         "generator-set, motor, other, reciprocating-compressor"),
        (lambda: minimum_static_deflection("fan", 0.0), "speed must be positive, got 0"),
        (lambda: minimum_static_deflection("fan", -5.0), "speed must be positive, got -5"),
        (lambda: minimum_static_deflection("fan", 10.0, 15.0),
         "floor span 15 m is longer than the 12.192 m (40 ft) the deflection table covers; "
         "such floors need their own analysis"),
        (lambda: floor_support(-2.0), "floor span must be positive, got -2"),
        (lambda: needs_special_consideration(-1.0), "speed must be at least 0, got -1"),
        (lambda: minimum_isolator_deflection_for_floor(-0.001),
         "floor deflection must be at least 0, got -0.001"),
        (lambda: minimum_isolator_deflection_for_floor(0.001, 0.5),
         "floor deflection factor must be at least 1, got 0.5"),
    ],
)
def test_bad_input_messages(call, message):
    with pytest.raises(ValueError, match=exactly(message)):
        call()


def test_gap_in_a_project_table_is_reported():
    own = (MinimumDeflectionRow("fan", 10.0, math.inf, (0.01, 0.02, 0.03, 0.04)),)
    with pytest.raises(ValueError, match=exactly(
        "no row of the deflection table covers 'fan' at 300 rpm"
    )):
        minimum_static_deflection("fan", 5.0, table=own)


def test_docstring_examples_run():
    failed, attempted = doctest.testmod(isolation_policy)
    assert attempted >= 4
    assert failed == 0

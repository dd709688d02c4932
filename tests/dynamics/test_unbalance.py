"""Checks of vcheck.dynamics.forcing.unbalance against outside references.

Each test names its reference beside the check and says why its tolerance is what it is.
Tags follow shared/REFERENCES.md: [C] seen in a published source, [D] derived by exact
arithmetic from the published formula, [M] from memory.
"""

from __future__ import annotations

import doctest
import re

import numpy as np
import pytest

from vcheck.dynamics.forcing import unbalance
from vcheck.dynamics.forcing.unbalance import (
    BALANCE_QUALITY_GRADES,
    TYPICAL_BALANCE_GRADES,
    balance_quality_from_grade,
    permissible_residual_unbalance,
    permissible_specific_unbalance,
    typical_balance_grade,
    unbalance_force,
)

G_MM = 1e-6  # 1 g mm in kg m


def rpm(n):
    """Angular speed [rad/s] of n revolutions per minute."""
    return np.asarray(n, dtype=float) * 2.0 * np.pi / 60.0


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


# ISO 21940-11:2016 (formerly ISO 1940-1), U_per = G m / Omega; worked values from
# shared/REFERENCES.md [D] (the grades themselves [M]). Tolerance: half a unit in the
# last printed digit of each value.
ISO_21940_11_CASES = [
    # grade, rotor mass [kg], speed [rpm], U_per [g mm], half unit [g mm]
    ("G6.3", 100.0, 3000.0, 2005.0, 0.5),
    ("G2.5", 50.0, 1500.0, 795.8, 0.05),
    ("G1", 10.0, 12000.0, 7.96, 0.005),
]


@pytest.mark.parametrize(("grade", "mass", "speed", "expected", "half_unit"), ISO_21940_11_CASES)
def test_permissible_residual_unbalance_iso_21940_11(grade, mass, speed, expected, half_unit):
    # ISO 21940-11:2016 U_per = e_per m, e_per = G / Omega; shared/REFERENCES.md [D].
    u_per = permissible_residual_unbalance(balance_quality_from_grade(grade), mass, rpm(speed))
    assert u_per / G_MM == pytest.approx(expected, abs=half_unit)


def test_trade_form_of_specific_unbalance():
    # shared/REFERENCES.md [D]: e_per [g mm / kg] = 1000 G / Omega = 9549.3 G / n [rpm]
    # (9549.3 = 60000 / (2 pi) rounded to 5 digits, so relative 1e-5 tolerance).
    grades = np.array([[0.4], [1.0], [2.5], [6.3], [16.0], [40.0]])  # mm/s
    n = np.array([300.0, 1480.0, 1780.0, 3000.0, 12000.0])
    e_per = permissible_specific_unbalance(grades / 1000.0, rpm(n))
    assert e_per.shape == (6, 5)
    assert e_per / G_MM == pytest.approx(9549.3 * grades / n, rel=1e-5)
    assert e_per / G_MM == pytest.approx(1000.0 * grades / rpm(n), rel=1e-14)


def test_force_at_permissible_unbalance_is_mass_times_grade_times_speed():
    # From the grade's definition G = e_per Omega and F = U Omega^2 = m e_per Omega^2:
    # F = m G Omega [D]. G6.3, 100 kg, 3000 rpm: 100 * 0.0063 * 314.159 = 197.92 N.
    # Tolerance: floating-point rounding; the printed 197.92 to half a unit in 0.01 N.
    g = balance_quality_from_grade("G6.3")
    omega = rpm(3000.0)
    force = unbalance_force(permissible_residual_unbalance(g, 100.0, omega), omega)
    assert force == pytest.approx(100.0 * g * omega, rel=1e-14)
    assert force == pytest.approx(197.92, abs=0.005)


def test_unbalance_force_against_centripetal_acceleration_of_a_point_mass():
    # Independent method: a point mass m_u at radius r_u on a shaft at Omega moves on
    # p(t) = r_u (cos Omega t, sin Omega t); its acceleration, taken numerically with
    # numpy.gradient (second-order central differences), has magnitude r_u Omega^2, and
    # m_u |p''| is the force. 10 g at 100 mm (U = 1000 g mm), 1500 rpm.
    # Tolerance 1e-5: the central-difference error (Omega h)^2 / 12 with 20000 steps
    # per revolution is about 8e-9 per differentiation; interior points only.
    m_u, r_u, omega = 0.010, 0.100, rpm(1500.0)
    t = np.linspace(0.0, 2.0 * np.pi / omega, 20001)
    position = r_u * np.vstack([np.cos(omega * t), np.sin(omega * t)])
    acceleration = np.gradient(np.gradient(position, t, axis=1), t, axis=1)[:, 2:-2]
    numerical = m_u * np.hypot(*acceleration)
    assert unbalance_force(m_u * r_u, omega) == pytest.approx(numerical, rel=1e-5)


def test_grades_step_by_about_two_and_a_half():
    # ISO 21940-11:2016: grades G4000 ... G0.4 in steps of about 2.5 (shared/REFERENCES.md
    # [M], from memory). The rounded grades (6.3, 16, 630, 1600) make the steps 2.5-2.54.
    values = np.array([balance_quality_from_grade(name) for name in BALANCE_QUALITY_GRADES])
    assert len(values) == 11
    assert values[0] == pytest.approx(4.0)  # G4000 = 4000 mm/s
    assert values[-1] == pytest.approx(0.0004)  # G0.4
    steps = values[:-1] / values[1:]
    assert np.all((steps >= 2.5 - 1e-12) & (steps <= 2.54 + 1e-12))


@pytest.mark.parametrize(
    ("text", "expected"),
    [("G6.3", 0.0063), ("g6.3", 0.0063), ("G 6.3", 0.0063), ("6.3", 0.0063), (6.3, 0.0063),
     ("G2.5", 0.0025), ("G1", 0.001), ("G1.0", 0.001), (1, 0.001), ("G0.4", 0.0004),
     ("G4000", 4.0)],
)
def test_grade_parsing(text, expected):
    # Grade names of ISO 21940-11:2016 (from memory): the number is mm/s; SI result m/s.
    assert balance_quality_from_grade(text) == pytest.approx(expected, rel=1e-15)


VALID = "G4000, G1600, G630, G250, G100, G40, G16, G6.3, G2.5, G1, G0.4"


@pytest.mark.parametrize(("text", "shown"), [("G5", "'G5'"), ("6.4", "'6.4'"), ("G", "'G'"),
                                            ("", "''"), (5.0, "5.0"), (None, "None")])
def test_unknown_grade_lists_the_valid_ones(text, shown):
    message = f"unknown balance quality grade {shown}; valid grades are {VALID}"
    with pytest.raises(ValueError, match=exactly(message)):
        balance_quality_from_grade(text)


def test_typical_grades_from_secondary_tables():
    # ISO 21940-11 examples as reproduced in secondary tables (shared/REFERENCES.md
    # [C via secondary tables]): G6.3 fans, pumps, flywheels, process machinery, general
    # electric armatures; G2.5 gas and steam turbines, turbo-compressors, machine-tool
    # drives; G1 grinding-machine drives; G16 crushers, cardan shafts.
    expected = {
        "G6.3": ["fan", "centrifugal-pump", "flywheel", "process-machinery",
                 "electric-armature"],
        "G2.5": ["gas-turbine", "steam-turbine", "turbo-compressor", "machine-tool-drive"],
        "G1": ["grinding-machine-drive"],
        "G16": ["crusher", "cardan-shaft"],
    }
    for grade, kinds in expected.items():
        for kind in kinds:
            assert typical_balance_grade(kind) == grade
    assert len(TYPICAL_BALANCE_GRADES) == sum(len(kinds) for kinds in expected.values())
    # every typical grade is a grade of the standard
    for grade in TYPICAL_BALANCE_GRADES.values():
        assert grade in BALANCE_QUALITY_GRADES


def test_unknown_machine_kind_lists_the_known_ones():
    known = ", ".join(sorted(TYPICAL_BALANCE_GRADES))
    message = f"no typical balance grade for machine kind 'blower'; known kinds are {known}"
    with pytest.raises(ValueError, match=exactly(message)):
        typical_balance_grade("blower")


@pytest.mark.parametrize(
    ("call", "message"),
    [
        (lambda: permissible_residual_unbalance(0.0063, -100.0, 314.0),
         "rotor mass must be positive, got -100"),
        (lambda: permissible_residual_unbalance(0.0063, 0.0, 314.0),
         "rotor mass must be positive, got 0"),
        (lambda: permissible_specific_unbalance(0.0063, 0.0),
         "angular speed must be positive, got 0"),
        (lambda: permissible_specific_unbalance(-0.0063, 314.0),
         "balance quality must be positive, got -0.0063"),
        (lambda: unbalance_force(-1e-3, 314.0), "unbalance must be at least 0, got -0.001"),
        (lambda: unbalance_force(1e-3, [100.0, -5.0]), "angular speed must be at least 0, got -5"),
    ],
)
def test_bad_input_messages(call, message):
    with pytest.raises(ValueError, match=exactly(message)):
        call()


def test_arrays_equal_scalars():
    g = np.array([0.0063, 0.0025, 0.001])
    m = np.array([100.0, 50.0, 10.0])
    omega = rpm([3000.0, 1500.0, 12000.0])
    array_result = permissible_residual_unbalance(g, m, omega)
    for i in range(3):
        expected = permissible_residual_unbalance(g[i], m[i], omega[i])
        assert array_result[i] == pytest.approx(expected, rel=1e-14)
    assert np.ndim(unbalance_force(1e-3, 100.0)) == 0


def test_docstring_examples_run():
    failed, attempted = doctest.testmod(unbalance)
    assert attempted >= 7
    assert failed == 0

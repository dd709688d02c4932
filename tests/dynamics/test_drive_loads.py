"""Checks of vcheck.dynamics.forcing.drive_loads against outside references.

Each test names its reference beside the check and says why its tolerance is what it is.
Tags follow shared/REFERENCES.md: [C] seen in a published source, [D] derived by exact
arithmetic from the published formula, [M] from memory.
"""

from __future__ import annotations

import doctest
import re

import numpy as np
import pytest
from scipy.integrate import solve_ivp

from vcheck.dynamics.forcing import drive_loads
from vcheck.dynamics.forcing.drive_loads import (
    BELT_TENSION_RATIOS,
    FIRING_TORQUE_FLUCTUATION,
    BeltTensions,
    FiringOrders,
    TorqueHarmonic,
    belt_effective_pull,
    belt_shaft_load,
    belt_tension_ratio,
    belt_tension_ratio_capstan,
    belt_tensions,
    firing_orders,
    firing_torque_fluctuation,
    mean_torque,
    torque_reaction,
)


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


def trapezoid(values, x):
    """Trapezoid rule along the last axis (written out: numpy renamed its own)."""
    return np.sum((values[..., 1:] + values[..., :-1]) * np.diff(x) / 2.0, axis=-1)


# --------------------------------------------------------------------------- torque


def test_mean_torque_against_power_equals_torque_times_angular_speed():
    # Mechanics (Meriam and Kraige, Engineering Mechanics: Dynamics, ch. 6 [M]):
    # P = T omega, omega = 2 pi f. Rounding tolerance.
    power = np.array([0.0, 750.0, 15e3, 75e3, 2.5e6])
    speed = np.array([24.75, 48.0, 24.33, 25.0, 8.33])
    torque = mean_torque(power, speed)
    assert torque * 2.0 * np.pi * speed == pytest.approx(power, rel=1e-14)


def test_mean_torque_trade_form():
    # Common practice: T [N m] = 9549 P [kW] / n [rpm] (9549.3 = 60000 / (2 pi) to five
    # digits, hence rel 1e-5). 75 kW at 1500 rpm: 9549.3 * 75 / 1500 = 477.465 N m [D].
    assert mean_torque(75e3, 1500 / 60) == pytest.approx(477.465, rel=1e-5)
    assert mean_torque(75e3, 1500 / 60) == pytest.approx(9549.3 * 75 / 1500, rel=1e-5)


@pytest.mark.parametrize(
    ("cylinders", "strokes", "major", "cycle"),
    [(1, 4, 0.5, 0.5), (4, 4, 2.0, 0.5), (6, 4, 3.0, 0.5), (12, 4, 6.0, 0.5),
     (20, 4, 10.0, 0.5), (1, 2, 1.0, 1.0), (3, 2, 3.0, 1.0), (6, 2, 6.0, 1.0)],
)
def test_firing_orders(cylinders, strokes, major, cycle):
    # shared/REFERENCES.md, common practice: firing frequency cylinders x rpm / 120 for a
    # four-stroke, cylinders x rpm / 60 for a two-stroke, i.e. order n/2 or n; the
    # working cycle spans two revolutions (order 0.5) or one (order 1).
    assert firing_orders(cylinders, strokes) == FiringOrders(major=major, cycle=cycle)


def test_fluctuation_table_covers_and_falls_with_order():
    # Screening table from memory (module docstring). Checked here for what physics
    # demands of it rather than its numbers: 1 to 20 cylinders for both cycles; positive;
    # not rising with cylinder count, since the major order rises and the harmonics of
    # one firing pulse fall with order (common practice); and a two-stroke with n
    # cylinders as the four-stroke with 2n (same pulse, same order: the mean and the
    # harmonic both double) [D], as far as the four-stroke table reaches.
    for strokes in (4, 2):
        values = np.array([firing_torque_fluctuation(n, strokes) for n in range(1, 21)])
        assert len(FIRING_TORQUE_FLUCTUATION[strokes]) == 20
        assert np.all(values > 0)
        assert np.all(np.diff(values) <= 0)
    for n in range(1, 11):
        assert firing_torque_fluctuation(n, 2) == firing_torque_fluctuation(2 * n, 4)


def test_torque_reaction_is_equal_and_opposite():
    # Newton's third law: the frame carries minus the torque on the rotor, at every
    # instant. Drive torque of an engine turning about -x (the crank module's sense):
    # T(t) = T_mean (1 + rho cos(k omega t)) about -x, i.e. -500 (1 + ...) about +x.
    # Rounding tolerance.
    t_mean, rho, k = -500.0, 0.8, 3.0
    static, harmonic = torque_reaction(t_mean, rho, k)
    assert isinstance(harmonic, TorqueHarmonic)
    assert harmonic.order == k and harmonic.moment.shape == (3,)
    omega_t = np.linspace(0.0, 2.0 * np.pi, 181)
    drive = t_mean * (1.0 + rho * np.cos(k * omega_t))
    reaction = static + np.real(harmonic.moment[0] * np.exp(1j * k * omega_t))
    assert reaction + drive == pytest.approx(np.zeros_like(omega_t), abs=1e-12)
    assert np.all(harmonic.moment[1:] == 0)
    assert static == 500.0


# --------------------------------------------------------------------------- belts


def test_effective_pull_by_hand():
    # Published relation F_e = P / v, v = pi D f (Budynas and Nisbett, Shigley's
    # Mechanical Engineering Design, 10th ed., ch. 17 [M]). By hand: 15 kW on a 200 mm
    # pulley at 1460 rpm: f = 24.3333 Hz, v = 0.628319 * 24.3333 = 15.2891 m/s,
    # F_e = 15000 / 15.2891 = 981.09 N. Tolerance half a unit in the last hand digit.
    assert belt_effective_pull(15e3, 0.2, 1460 / 60) == pytest.approx(981.09, abs=0.005)
    # the belt speed is the same at both pulleys: a 2:1 drive gives the same pull
    assert belt_effective_pull(15e3, 0.4, 1460 / 120) == pytest.approx(
        belt_effective_pull(15e3, 0.2, 1460 / 60), rel=1e-14)


@pytest.mark.parametrize(("mu", "theta"), [(0.0, 2.0), (0.25, np.pi), (0.3, 2.6), (0.5, 4.0),
                                           (0.15, 3 * 2 * np.pi)])
def test_capstan_against_numerical_integration_of_belt_element(mu, theta):
    # Independent numerical method: integrate the equilibrium of a belt element on the
    # point of slipping, radial dN = T d(theta), tangential dT = mu dN, from the slack
    # side T = 1 over the wrap with scipy's DOP853 at rtol 1e-12; the closed form
    # (Euler-Eytelwein, Euler 1762; Shigley ch. 17 [M]) must agree to the solver's
    # tolerance, so rel 1e-9.
    def element(_, state):
        tension, normal = state
        d_normal = tension
        return [mu * d_normal, d_normal]

    solution = solve_ivp(element, (0.0, theta), [1.0, 0.0], method="DOP853", rtol=1e-12,
                         atol=1e-14)
    assert belt_tension_ratio_capstan(mu, theta) == pytest.approx(solution.y[0, -1], rel=1e-9)


def test_capstan_hand_value():
    # Euler-Eytelwein by hand: mu = 0.3 and 180 degrees, e^(0.3 pi) = e^0.942478 = 2.5663
    # [D]; the flat-belt design ratio 2 to 3 [M] brackets it.
    assert belt_tension_ratio_capstan(0.3, np.pi) == pytest.approx(2.5663, abs=5e-5)
    assert 2.0 <= belt_tension_ratio("flat") <= 3.0


def test_tension_ratio_table():
    # Belt makers' typical design ratios (from memory, [M]): V-belt about 5 at 180
    # degrees, flat 2 to 3, synchronous about 8 or more, poly-V between flat and V.
    assert belt_tension_ratio("v-belt") == pytest.approx(5.0)
    assert belt_tension_ratio("synchronous") >= 8.0
    assert belt_tension_ratio("flat") < belt_tension_ratio("poly-v") <= belt_tension_ratio("v-belt")
    assert set(BELT_TENSION_RATIOS) == {"flat", "v-belt", "poly-v", "synchronous"}


def test_tensions_satisfy_their_definitions():
    # Definitions (Shigley ch. 17 [M]): T1 - T2 = F_e and T1 / T2 = R. By hand for
    # F_e = 1000 N, R = 5: T2 = 250 N, T1 = 1250 N, parallel spans 1500 N [D].
    for pull, ratio in [(1000.0, 5.0), (981.09, 2.5663), (37.0, 8.0), (0.0, 3.0)]:
        tensions = belt_tensions(pull, ratio)
        assert isinstance(tensions, BeltTensions)
        assert tensions.tight_side - tensions.slack_side == pytest.approx(pull, abs=1e-12)
        if pull:
            assert tensions.tight_side / tensions.slack_side == pytest.approx(ratio, rel=1e-14)
        assert belt_shaft_load(pull, ratio) == pytest.approx(sum(tensions))
    assert belt_tensions(1000.0, 5.0) == (1250.0, 250.0)
    assert belt_shaft_load(1000.0, 5.0) == 1500.0


@pytest.mark.parametrize("theta", [0.4, 2.2, np.pi, 3.9, 2 * np.pi])
def test_shaft_load_against_span_vectors_and_contact_pressure(theta):
    # Independent geometry: the spans leave a pulley of radius a, centred at the origin,
    # along the tangents at the two ends of the wrap (contact from angle 0 to theta);
    # the shaft load is the vector sum of T2 along -t(0) and T1 along t(theta). Second
    # independent check, by equilibrium of the wrapped belt: the resultant of the
    # contact pressure T / a and friction mu T / a over the wrap, with T = T2 e^(mu
    # phi) on the point of slip (mu chosen so that e^(mu theta) = R), integrated by the
    # trapezoid rule on 200001 points (error ~ 1e-10 relative), equals the same vector.
    pull, ratio = 800.0, 3.0
    load = belt_shaft_load(pull, ratio, wrap_angle=theta)
    tight, slack = belt_tensions(pull, ratio)

    def tangent(angle):  # unit tangent in the sense of increasing angle
        return np.array([-np.sin(angle), np.cos(angle)])

    spans = slack * -tangent(0.0) + tight * tangent(theta)
    assert load == pytest.approx(np.linalg.norm(spans), rel=1e-12)

    mu = np.log(ratio) / theta
    phi = np.linspace(0.0, theta, 200001)
    tension = slack * np.exp(mu * phi)
    inward = -np.vstack([np.cos(phi), np.sin(phi)])  # the belt presses the pulley inward
    # friction on the pulley acts towards the tight side (belt drags the pulley along)
    along = np.vstack([-np.sin(phi), np.cos(phi)])
    contact = trapezoid((1.0 * tension * inward + mu * tension * along), phi)
    assert np.linalg.norm(contact) == pytest.approx(load, rel=1e-8)
    assert contact == pytest.approx(spans, rel=1e-8, abs=1e-8 * load)


def test_wrap_of_half_a_turn_equals_parallel_spans():
    # Analytic limit: at 180 degrees the spans are parallel, load T1 + T2.
    assert belt_shaft_load(1000.0, 5.0, np.pi) == pytest.approx(belt_shaft_load(1000.0, 5.0))


# --------------------------------------------------------------------------- bad input


@pytest.mark.parametrize(
    ("call", "message"),
    [
        (lambda: mean_torque(-1.0, 25.0), "power must be at least 0, got -1"),
        (lambda: mean_torque(1e3, 0.0), "speed must be positive, got 0"),
        (lambda: firing_orders(0, 4), "cylinders must be a whole number from 1 to 20, got 0"),
        (lambda: firing_orders(21, 2), "cylinders must be a whole number from 1 to 20, got 21"),
        (lambda: firing_orders(4.5, 4), "cylinders must be a whole number from 1 to 20, got 4.5"),
        (lambda: firing_torque_fluctuation(6, 3), "strokes must be 2 or 4, got 3"),
        (lambda: torque_reaction(float("nan"), 1.0, 3.0), "mean torque must be a finite number, got nan"),
        (lambda: torque_reaction(100.0, -0.5, 3.0), "fluctuation ratio must be at least 0, got -0.5"),
        (lambda: torque_reaction(100.0, 0.5, 0.0), "order must be positive, got 0"),
        (lambda: belt_effective_pull(1e3, 0.0, 25.0), "pulley diameter must be positive, got 0"),
        (lambda: belt_effective_pull(1e3, 0.2, -25.0), "speed must be positive, got -25"),
        (lambda: belt_tension_ratio("round"),
         "unknown belt kind 'round'; known kinds are flat, poly-v, synchronous, v-belt"),
        (lambda: belt_tension_ratio_capstan(-0.1, 3.0), "friction coefficient must be at least 0, got -0.1"),
        (lambda: belt_tension_ratio_capstan(0.3, 0.0), "wrap angle must be positive, got 0"),
        (lambda: belt_shaft_load(1000.0, 1.0), "tension ratio must be above 1, got 1"),
        (lambda: belt_tensions(1000.0, 0.5), "tension ratio must be above 1, got 0.5"),
        (lambda: belt_shaft_load(-5.0, 3.0), "effective pull must be at least 0, got -5"),
        (lambda: belt_shaft_load(1000.0, 3.0, 7.0),
         "wrap angle must be above 0 and at most 2 pi rad, got 7"),
        (lambda: belt_shaft_load(1000.0, 3.0, 0.0),
         "wrap angle must be above 0 and at most 2 pi rad, got 0"),
    ],
)
def test_bad_input_messages(call, message):
    with pytest.raises(ValueError, match=exactly(message)):
        call()


def test_docstring_examples_run():
    failed, attempted = doctest.testmod(drive_loads)
    assert attempted >= 9
    assert failed == 0

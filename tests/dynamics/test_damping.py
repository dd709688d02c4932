"""Checks of vcheck.dynamics.isolation.damping against outside references.

Each test names its reference beside the check and says why its tolerance is what it is.
Tags follow shared/REFERENCES.md: [C] seen in a published source, [D] derived by exact
arithmetic, [M] from memory.
"""

from __future__ import annotations

import doctest
import re

import numpy as np
import pytest
from scipy import integrate, optimize

from vcheck.dynamics.isolation import damping
from vcheck.dynamics.isolation.damping import (
    ELASTOMER_DAMPING_RATIO,
    EN_1991_1_4_LOG_DECREMENTS,
    HIGH_DAMPING_ELASTOMER_DAMPING_RATIO_RANGE,
    STEEL_SPRING_DAMPING_RATIO,
    STRUCTURAL_DAMPING_RATIO_RANGES,
    damping_ratio_from_log_decrement,
    damping_ratio_from_loss_factor,
    damping_ratio_from_quality_factor,
    log_decrement_from_damping_ratio,
    loss_factor_from_damping_ratio,
    quality_factor_from_damping_ratio,
)


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


# EN 1991-1-4:2005, Annex F, Table F.2 (logarithmic decrement of structural damping,
# fundamental mode) with the damping ratios in per cent that shared/REFERENCES.md quotes
# next to them [C]: welded steel bridge 0.02 (0.32 %), HSFG bolts 0.03 (0.48 %), ordinary
# bolts 0.05 (0.80 %), steel buildings 0.05 (0.80 %), reinforced concrete buildings 0.10
# (1.59 %).
EN_1991_1_4_TABLE_F2 = {
    "steel-bridge-welded": (0.02, 0.32),
    "steel-bridge-high-strength-friction-grip-bolts": (0.03, 0.48),
    "steel-bridge-ordinary-bolts": (0.05, 0.80),
    "steel-building": (0.05, 0.80),
    "reinforced-concrete-building": (0.10, 1.59),
}


def test_en_1991_1_4_table_f2_constants_match_the_table():
    # EN 1991-1-4:2005 Table F.2 [C]: the module constant holds the table's decrements.
    assert dict(EN_1991_1_4_LOG_DECREMENTS) == {
        kind: decrement for kind, (decrement, _) in EN_1991_1_4_TABLE_F2.items()
    }


@pytest.mark.parametrize(("kind", "row"), EN_1991_1_4_TABLE_F2.items())
def test_en_1991_1_4_log_decrements_to_damping_ratio(kind, row):
    # EN 1991-1-4:2005 Table F.2 [C], zeta = delta / (2 pi) quoted to 0.01 %: tolerance is
    # half that unit, 0.005 % of critical. The exact form delta / sqrt(4 pi^2 + delta^2)
    # and the small-damping form delta / (2 pi) differ by about delta^2 / (8 pi^2)
    # relative (1.3e-4 at delta = 0.1), far inside it; the second check allows 2e-4.
    decrement, percent = row
    zeta = damping_ratio_from_log_decrement(EN_1991_1_4_LOG_DECREMENTS[kind])
    assert 100.0 * zeta == pytest.approx(percent, abs=0.005)
    assert zeta == pytest.approx(decrement / (2.0 * np.pi), rel=2e-4)


@pytest.mark.parametrize("zeta", [0.005, 0.05, 0.2, 0.5])
def test_log_decrement_against_free_decay_integration(zeta):
    # Independent method: integrate the free decay x'' + 2 zeta wn x' + wn^2 x = 0 with
    # scipy.integrate.solve_ivp (DOP853, rtol 1e-11), locate the maxima exactly as events
    # x' = 0 going downward, and take ln(x_n / x_{n+1}) (definition of the logarithmic
    # decrement; Thomson & Dahleh, Theory of Vibration with Applications, 5th ed., ch. 2,
    # from memory). At zeta = 0.2 the exact form 2 pi zeta / sqrt(1 - zeta^2) and the
    # small-damping form 2 pi zeta differ by 2 %, so the check tells them apart.
    # Tolerance 1e-7 relative: event location and integration error at rtol 1e-11.
    wn = 2.0 * np.pi

    def rhs(t, state):
        return [state[1], -2.0 * zeta * wn * state[1] - wn**2 * state[0]]

    def peak(t, state):
        return state[1]

    peak.direction = -1.0
    periods = 4.0 / np.sqrt(1.0 - zeta**2)
    solution = integrate.solve_ivp(
        rhs, (0.0, periods), [1.0, 0.0], method="DOP853", rtol=1e-11, atol=1e-14,
        events=peak,
    )
    maxima = solution.y_events[0][:, 0]
    maxima = maxima[maxima > 0.0]
    assert maxima.size >= 3
    measured = np.log(maxima[:-1] / maxima[1:])
    assert measured == pytest.approx(log_decrement_from_damping_ratio(zeta), rel=1e-7)
    assert damping_ratio_from_log_decrement(measured) == pytest.approx(zeta, rel=1e-7)


@pytest.mark.parametrize("zeta", [0.002, 0.005, 0.01, 0.02])
def test_quality_factor_against_half_power_bandwidth(zeta):
    # Independent method: find the half-power points of the displacement response
    # |X / X_static| = 1 / sqrt((1 - r^2)^2 + (2 zeta r)^2) numerically (brentq), and
    # compare r_peak / (r_2 - r_1) with Q = 1 / (2 zeta) (Harris' Shock and Vibration
    # Handbook, 6th ed., from memory; shared/REFERENCES.md "Damping").
    # Tolerance: Q = 1 / (2 zeta) is the light-damping form; the half-power estimate is
    # Q (1 - 2 zeta^2 + O(zeta^4)) (expanding the half-power roots), so 2.5 zeta^2 holds
    # the known term and fails on anything of order zeta.
    def response(r):
        return 1.0 / np.sqrt((1.0 - r**2) ** 2 + (2.0 * zeta * r) ** 2)

    r_peak = np.sqrt(1.0 - 2.0 * zeta**2)
    half_power = response(r_peak) / np.sqrt(2.0)
    r1 = optimize.brentq(lambda r: response(r) - half_power, 0.5, r_peak, xtol=1e-15)
    r2 = optimize.brentq(lambda r: response(r) - half_power, r_peak, 1.5, xtol=1e-15)
    measured = r_peak / (r2 - r1)
    assert quality_factor_from_damping_ratio(zeta) == pytest.approx(measured, rel=2.5 * zeta**2)
    assert damping_ratio_from_quality_factor(measured) == pytest.approx(zeta, rel=2.5 * zeta**2)


def test_loss_factor_against_energy_dissipated_per_cycle():
    # Independent method: integrate the dashpot force over one cycle of x = X sin(wn t)
    # with scipy.integrate.quad, W = oint c x' dx = pi c wn X^2, and compare with the
    # hysteretic loss per cycle pi eta k X^2 (Harris' Shock and Vibration Handbook, 6th
    # ed., damping measures, from memory). Equal at resonance for eta = 2 zeta.
    # Tolerance: quad's default accuracy (~1e-10 relative on a smooth integrand).
    m, k, zeta, amplitude = 12.0, 3.0e5, 0.04, 2.0e-3
    wn = np.sqrt(k / m)
    c = 2.0 * zeta * np.sqrt(k * m)
    period = 2.0 * np.pi / wn
    energy, _ = integrate.quad(
        lambda t: c * (amplitude * wn * np.cos(wn * t)) ** 2, 0.0, period, epsabs=0.0
    )
    eta = loss_factor_from_damping_ratio(zeta)
    assert energy == pytest.approx(np.pi * eta * k * amplitude**2, rel=1e-10)
    assert damping_ratio_from_loss_factor(eta) == pytest.approx(zeta, rel=1e-15)


def test_conversions_round_trip():
    # Closed forms and their inverses; tolerance: floating-point rounding.
    zeta = np.array([0.0, 0.003, 0.05, 0.2, 0.6, 0.95])
    assert damping_ratio_from_log_decrement(log_decrement_from_damping_ratio(zeta)) == (
        pytest.approx(zeta, rel=1e-14, abs=1e-300)
    )
    assert damping_ratio_from_loss_factor(loss_factor_from_damping_ratio(zeta)) == (
        pytest.approx(zeta, rel=1e-15)
    )
    assert damping_ratio_from_quality_factor(quality_factor_from_damping_ratio(zeta[1:])) == (
        pytest.approx(zeta[1:], rel=1e-15)
    )


def test_undamped_limits():
    # Limiting case zeta = 0: no decay, no loss, unbounded Q.
    assert log_decrement_from_damping_ratio(0.0) == 0.0
    assert loss_factor_from_damping_ratio(0.0) == 0.0
    assert quality_factor_from_damping_ratio(0.0) == np.inf
    assert damping_ratio_from_quality_factor(np.inf) == 0.0


def test_default_damping_values_are_valid_and_in_harris_order():
    # Harris' Shock and Vibration Handbook, 6th ed. (from memory; shared/REFERENCES.md):
    # steel springs ~0.005 < natural rubber / neoprene ~0.05 < high-damping elastomers
    # 0.1-0.2; structures: welded steel 0.2-1 %, bolted steel 1-5 %, concrete 2-5 %.
    # Every default must pass the damping-ratio check the rest of the package applies.
    low, high = HIGH_DAMPING_ELASTOMER_DAMPING_RATIO_RANGE
    assert STEEL_SPRING_DAMPING_RATIO < ELASTOMER_DAMPING_RATIO < low < high
    assert (low, high) == (0.1, 0.2)
    assert dict(STRUCTURAL_DAMPING_RATIO_RANGES) == {
        "welded-steel": pytest.approx((0.002, 0.01)),
        "bolted-steel": pytest.approx((0.01, 0.05)),
        "concrete": pytest.approx((0.02, 0.05)),
    }
    values = [STEEL_SPRING_DAMPING_RATIO, ELASTOMER_DAMPING_RATIO, low, high]
    values += [v for pair in STRUCTURAL_DAMPING_RATIO_RANGES.values() for v in pair]
    assert quality_factor_from_damping_ratio(values).shape == (len(values),)


def test_tables_are_read_only():
    with pytest.raises(TypeError):
        EN_1991_1_4_LOG_DECREMENTS["steel-building"] = 0.2  # type: ignore[index]


@pytest.mark.parametrize(
    ("call", "message"),
    [
        (lambda: log_decrement_from_damping_ratio(1.2),
         "damping ratio must be at least 0 and below 1, got 1.2"),
        (lambda: quality_factor_from_damping_ratio(-0.01),
         "damping ratio must be at least 0 and below 1, got -0.01"),
        (lambda: loss_factor_from_damping_ratio([0.01, 1.0]),
         "damping ratio must be at least 0 and below 1, got 1"),
        (lambda: damping_ratio_from_log_decrement(-0.05),
         "logarithmic decrement must be at least 0, got -0.05"),
        (lambda: damping_ratio_from_log_decrement(np.inf),
         "logarithmic decrement must be a finite number, got inf"),
        (lambda: damping_ratio_from_loss_factor(2.5),
         "loss factor must be at least 0 and below 2, got 2.5"),
        (lambda: damping_ratio_from_quality_factor(0.5),
         "quality factor must be above 0.5, got 0.5"),
        (lambda: damping_ratio_from_quality_factor(float("nan")),
         "quality factor must be above 0.5, got nan"),
    ],
)
def test_bad_input_messages(call, message):
    with pytest.raises(ValueError, match=exactly(message)):
        call()


def test_docstring_examples_run():
    failed, attempted = doctest.testmod(damping)
    assert attempted >= 6
    assert failed == 0

"""Palmgren-Miner sums against the EN 1993-1-9 worked values, fatpack's independent
Miner sum and closed forms."""

from __future__ import annotations

import doctest
import math

import fatpack
import numpy as np
import pytest

from vcheck.dynamics.fatigue import miner
from vcheck.dynamics.fatigue.miner import fatigue_life_years, miner_damage
from vcheck.dynamics.fatigue.rainflow import rainflow_cycles, turning_points
from vcheck.dynamics.fatigue.sn_curves import (
    PiecewiseLogLogCurve,
    partial_factor_fatigue_strength,
    sn_curve,
)

MPA = 1e6

# EN 1993-1-9:2005 category 71, variable amplitude ([D] in REFERENCES.md, derived from
# the standard's curve): 1e5 cycles at 100 MPa on the m = 3 branch -> 0.1397; 1e6 at
# 40 MPa on the m = 5 branch -> 0.0523; 1e7 at 20 MPa below delta_sigma_L = 28.7 MPa ->
# 0; total 0.1920. Printed to 4 decimals: tolerance half a unit, 5e-5.
EN_EXAMPLE_RANGES = np.array([100.0, 40.0, 20.0]) * MPA
EN_EXAMPLE_COUNTS = np.array([1e5, 1e6, 1e7])
EN_EXAMPLE_DAMAGE = (0.1397, 0.0523, 0.0)


def test_en1993_category_71_example():
    result = miner_damage(EN_EXAMPLE_RANGES, EN_EXAMPLE_COUNTS, sn_curve("EN 1993-1-9:71"))
    np.testing.assert_allclose(result.damage_per_bin, EN_EXAMPLE_DAMAGE, atol=5e-5)
    assert result.damage_per_bin[2] == 0.0
    assert result.damage == pytest.approx(0.1920, abs=5e-5)
    assert result.governing_bin == 0


def test_en1993_example_against_fatpack_miner_sum():
    # fatpack.TriLinearEnduranceCurve(71).find_miner_sum with (range, count) rows:
    # the same sum by independent code (same closed forms, 1e-12).
    reference = fatpack.TriLinearEnduranceCurve(71.0).find_miner_sum(
        np.column_stack((EN_EXAMPLE_RANGES / MPA, EN_EXAMPLE_COUNTS))
    )
    result = miner_damage(EN_EXAMPLE_RANGES, EN_EXAMPLE_COUNTS, sn_curve("EN 1993-1-9:71"))
    assert result.damage == pytest.approx(reference, rel=1e-12)


def test_rainflow_then_miner_against_fatpack_pipeline():
    # A random stress history counted and summed two ways: vcheck's rainflow and Miner
    # sum, and fatpack's four-point cycle finder (on the same turning points: its own
    # reversal search bins values into classes) with its own Eurocode-like curve and
    # Miner sum, residue as half cycles. Continuous values, so the cycle sets are the
    # same (see test_rainflow.py); the sums agree to rounding, 1e-12.
    rng = np.random.default_rng(44)
    x = 40.0 * rng.standard_normal(20_000) * MPA
    ranges, _, counts = rainflow_cycles(x)
    ours = miner_damage(ranges, counts, sn_curve("EN 1993-1-9:90")).damage

    _, reversals = turning_points(x / MPA)
    cycles, residue = fatpack.find_rainflow_cycles(reversals)
    full = np.abs(np.diff(np.asarray(cycles), axis=1)).ravel()
    half = np.abs(np.diff(residue))
    curve = fatpack.TriLinearEnduranceCurve(90.0)
    theirs = curve.find_miner_sum(
        np.concatenate(
            (
                np.column_stack((full, np.ones_like(full))),
                np.column_stack((half, 0.5 * np.ones_like(half))),
            )
        )
    )
    assert ours == pytest.approx(theirs, rel=1e-12)


def test_partial_factor_scales_the_m3_branch_by_its_cube():
    # On the m = 3 branch N ~ S^-3, so a factor gamma on the ranges multiplies the
    # damage by gamma^3 (closed form). gamma_Mf = 1.35 (safe life, high consequence,
    # EN 1993-1-9 Table 3.1, from memory).
    curve = sn_curve("EN 1993-1-9:71")
    gamma = partial_factor_fatigue_strength("safe life", "high")
    plain = miner_damage([100e6, 120e6], [1e4, 2e4], curve).damage
    factored = miner_damage([100e6, 120e6], [1e4, 2e4], curve, partial_factor=gamma).damage
    assert factored == pytest.approx(plain * gamma**3, rel=1e-12)


def test_constant_amplitude_below_the_fatigue_limit_does_no_damage():
    # EN 1993-1-9 7.1: 50 MPa is below delta_sigma_D = 52.3 MPa of category 71: no damage
    # at constant amplitude, N = 5e6 (52.31/50)^5 on the spectrum branch.
    curve = sn_curve("EN 1993-1-9:71")
    ca = miner_damage([50e6], [1e6], curve, constant_amplitude=True)
    assert ca.damage == 0.0 and ca.governing_bin is None
    va = miner_damage([50e6], [1e6], curve)
    d = curve.constant_amplitude_fatigue_limit
    assert va.damage == pytest.approx(1e6 / (5e6 * (d / 50e6) ** 5), rel=1e-12)


def test_one_slope_sum_closed_form():
    # N S^m = C: D = sum n S^m / C (Basquin with Miner), here m = 4 through (1e6, 100 MPa).
    curve = PiecewiseLogLogCurve(
        [1e6, 1e8], [100 * MPA, 100 * MPA * 100 ** (-1 / 4)], extend_below=True
    )
    s = np.array([10.0, 50.0, 150.0]) * MPA
    n = np.array([1e7, 2e5, 3e3])
    expected = np.sum(n * s**4) / (1e6 * (100 * MPA) ** 4)
    result = miner_damage(s, n, curve)
    assert result.damage == pytest.approx(expected, rel=1e-12)
    assert result.governing_bin == int(np.argmax(n * s**4))


def test_life_in_years():
    # L = T / D: 0.2 over a 25-year design life -> 125 years; 0.01 per year -> 100.
    assert fatigue_life_years(0.2, 25.0) == pytest.approx(125.0, rel=1e-15)
    assert fatigue_life_years(0.01) == pytest.approx(100.0, rel=1e-15)
    assert math.isinf(fatigue_life_years(0.0, 25.0))


# ------------------------------------------------------------------- bad input


def test_design_life_of_zero_is_rejected():
    with pytest.raises(ValueError, match=r"^design life must be positive, got 0 years$"):
        fatigue_life_years(0.1, 0.0)
    with pytest.raises(ValueError, match=r"^damage must be zero or positive, got -0.1$"):
        fatigue_life_years(-0.1, 25.0)


def test_negative_stress_range_and_count_are_rejected():
    curve = sn_curve("EN 1993-1-9:71")
    with pytest.raises(
        ValueError, match=r"^stress range must be zero or positive, got -1e\+07 Pa$"
    ):
        miner_damage([20e6, -10e6], [1.0, 1.0], curve)
    with pytest.raises(ValueError, match=r"^cycle counts must be zero or positive, got -1$"):
        miner_damage([20e6, 10e6], [1.0, -1.0], curve)
    with pytest.raises(
        ValueError,
        match=r"^stress ranges and counts must be one-dimensional arrays of the same length, "
        r"got shapes \(2,\) and \(3,\)$",
    ):
        miner_damage([20e6, 10e6], [1.0, 1.0, 1.0], curve)
    with pytest.raises(ValueError, match=r"^partial factor must be positive, got 0$"):
        miner_damage([20e6], [1.0], curve, partial_factor=0.0)


def test_docstring_examples_run():
    # The Examples sections of the module's docstrings are run, so they cannot drift.
    result = doctest.testmod(miner)
    assert result.failed == 0 and result.attempted >= 2

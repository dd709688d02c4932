"""SDOF natural frequencies against closed forms and the trade's rule of thumb."""

from __future__ import annotations

import math

import numpy as np
import pytest

from vcheck.dynamics.modes.sdof import (
    STANDARD_GRAVITY,
    natural_frequency_spring_mass,
    natural_frequency_static_deflection,
    static_deflection_for_frequency,
)


def test_spring_mass_reference_value():
    # Closed form f = sqrt(k/m)/(2 pi) (Thomson & Dahleh, Theory of Vibration with
    # Applications, 5th ed., sec. 2.1): m = 100 kg, k = 1.0e6 N/m -> 15.9155 Hz
    # (shared/REFERENCES.md, derived). Tolerance: the reference's 6 printed digits.
    assert float(natural_frequency_spring_mass(1.0e6, 100.0)) == pytest.approx(15.9155, abs=5e-5)


def test_static_deflection_rule_of_thumb():
    # f = sqrt(g/delta)/(2 pi) = 15.7609 / sqrt(delta in mm) (derived from the closed form,
    # g = 9.80665 m/s^2 per CGPM 1901); the trade rounds it to 15.76 (from memory).
    for delta_mm in (1.0, 6.0, 25.0, 50.0):
        f = float(natural_frequency_static_deflection(delta_mm / 1000))
        assert f == pytest.approx(15.7609 / math.sqrt(delta_mm), rel=1e-5)
        assert f == pytest.approx(15.76 / math.sqrt(delta_mm), rel=1e-4)
    # in inches: 3.12726 / sqrt(delta in) (derived; trade form 3.13, from memory)
    assert float(natural_frequency_static_deflection(0.0254)) == pytest.approx(3.12726, rel=1e-5)


def test_static_deflection_and_spring_mass_agree():
    # Same physics two ways: delta = m g / k, so both formulas must give one frequency.
    mass, stiffness = 640.0, 480e3
    delta = mass * STANDARD_GRAVITY / stiffness
    assert float(natural_frequency_static_deflection(delta)) == pytest.approx(
        float(natural_frequency_spring_mass(stiffness, mass)), rel=1e-13)
    # REFERENCES.md: delta = 0.980665 mm -> 15.9155 Hz (derived)
    assert float(natural_frequency_static_deflection(0.980665e-3)) == pytest.approx(15.9155, abs=5e-5)


def test_inverse_and_arrays():
    frequencies = np.array([2.0, 3.15, 10.0])
    deltas = static_deflection_for_frequency(frequencies)
    np.testing.assert_allclose(natural_frequency_static_deflection(deltas), frequencies, rtol=1e-14)
    assert natural_frequency_spring_mass([1e6, 4e6], 100.0).shape == (2,)


@pytest.mark.parametrize(
    ("call", "message"),
    [
        (lambda: natural_frequency_spring_mass(-1.0, 100.0), "stiffness must be positive, got -1 N/m"),
        (lambda: natural_frequency_spring_mass(1.0, 0.0), "mass must be positive, got 0 kg"),
        (lambda: natural_frequency_static_deflection(0.0), "static deflection must be positive, got 0 m"),
        (lambda: static_deflection_for_frequency(float("nan")), "frequency must be positive, got nan Hz"),
    ],
)
def test_bad_input(call, message):
    with pytest.raises(ValueError) as caught:
        call()
    assert str(caught.value) == message

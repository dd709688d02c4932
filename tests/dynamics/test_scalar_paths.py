"""The plain-float fast paths of the one-DOF formulas give, bit for bit, what their numpy
paths give for the same inputs as 0-d arrays, what scalar callers got before the fast paths
were added (a one-element array may differ from both in the last bit: numpy squares it by
another routine), and the closed forms they implement."""

from __future__ import annotations

import math

import numpy as np
import pytest

from vcheck.dynamics.isolation.passage import passage_peak_viscous
from vcheck.dynamics.isolation.transmissibility import transmissibility_viscous

RNG = np.random.default_rng(20261203)
RATIOS = np.concatenate([RNG.uniform(0.0, 5.0, 400), [0.0, 1.0, math.sqrt(2.0), 1e-8, 40.0]])
DAMPING = np.concatenate([RNG.uniform(0.001, 0.5, 400), [0.01, 0.05, 0.1, 0.2, 0.3]])


def test_transmissibility_float_path_equals_array_path_bit_for_bit():
    for r, zeta in zip(RATIOS, DAMPING):
        fast = transmissibility_viscous(float(r), float(zeta))
        general = transmissibility_viscous(np.array(r), np.array(zeta))  # 0-d: the numpy path
        assert float(fast).hex() == float(general).hex(), (r, zeta)


def test_transmissibility_float_path_is_the_closed_form():
    # T = sqrt((1 + (2 zeta r)^2) / ((1 - r^2)^2 + (2 zeta r)^2)): Harris' Shock and
    # Vibration Handbook, ch. 30 (from memory); at r = sqrt(2) T = 1 for any damping.
    for r, zeta in zip(RATIOS, DAMPING):
        two = (2.0 * zeta * r) ** 2
        expected = math.sqrt((1.0 + two) / ((1.0 - r * r) ** 2 + two))
        assert float(transmissibility_viscous(float(r), float(zeta))) == pytest.approx(
            expected, rel=1e-12)
    assert float(transmissibility_viscous(math.sqrt(2.0), 0.07)) == pytest.approx(1.0, rel=1e-12)


def test_passage_float_path_equals_array_path_bit_for_bit():
    etas = np.concatenate([10.0 ** RNG.uniform(-6, 1, 400), [1e-4, 1e-3, 0.01, 0.1, 1.0]])
    for eta, zeta in zip(etas, DAMPING):
        fast = passage_peak_viscous(float(eta), float(zeta))
        general = passage_peak_viscous(np.array(eta), np.array(zeta))  # 0-d: the numpy path
        assert float(fast).hex() == float(general).hex(), (eta, zeta)
        assert type(fast) is type(passage_peak_viscous(np.float64(eta), np.float64(zeta)))


def test_the_float_paths_refuse_what_the_array_paths_refuse():
    for call, bad in ((transmissibility_viscous, (-0.5, 0.05)),
                      (transmissibility_viscous, (1.0, -0.1)),
                      (passage_peak_viscous, (-0.01, 0.05)),
                      (passage_peak_viscous, (0.01, -0.05))):
        with pytest.raises(ValueError) as fast:
            call(*bad)
        with pytest.raises(ValueError) as general:
            call(*(np.array([v]) for v in bad))
        assert str(fast.value) == str(general.value)

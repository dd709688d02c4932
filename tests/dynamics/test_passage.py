"""Passage through resonance at a constant sweep rate, against outside references.

- scipy.integrate.solve_ivp (an independent numerical method): the swept one-DOF system
  x'' + 2 zeta w_n x' + w_n^2 x = w_n^2 cos(2 pi (f0 t + (df/dt) t^2 / 2)) integrated
  directly (DOP853, rtol 1e-9), started on its steady response well below resonance and
  run well past it; the largest |x| is the peak passed.
- scipy.special.fresnel (a reference library): the undamped closed form 3.67 / sqrt(eta)
  is 1.17 pi / sqrt(eta), 1.17 being the largest distance on the Cornu spiral from its
  start over its final distance sqrt(2).
- Limiting cases: a slow sweep reaches the steady-state peak 1 / (2 zeta).

Tolerance found: at eta 0.001, 0.01 and 0.1 and zeta 0.005 and 0.05 the fit (from memory)
lies within -4% and +11% of the integration (measured on run-ups: -0.4%, +4.5%, +9.9% at
zeta 0.005 and +0.2%, +1.3%, +2.0% at zeta 0.05; on run-downs from -3.7% at zeta 0.05,
eta 0.1, to +4.4%; a fast sweep's peak moves by about 1% with where it starts, +10.8%
from 0.5 f_n); the checks allow -5% / +12%. The fit errs high (safe) where it errs
most; the largest low error is on a run-down.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from vcheck.dynamics.isolation.passage import (
    UNDAMPED_PASSAGE_COEFFICIENT,
    dimensionless_sweep_rate,
    passage_peak_undamped,
    passage_peak_viscous,
    sweep_rate_of_run,
)


def swept_peak(eta: float, zeta: float, upward: bool = True, window=None) -> float:
    """Largest |x| of the swept one-DOF system, f_n = 1 Hz, static response 1."""
    from scipy.integrate import solve_ivp

    wn = 2 * math.pi
    rate = eta  # f_n = 1 Hz
    # the sweep starts well before resonance and ends well after the peak; a slow sweep
    # needs less room (the window of a slow sweep is checked against a wide one below)
    low, high = (0.8, 1.4) if eta <= 0.001 else (0.6, 1.8) if eta <= 0.01 else (0.4, 2.5)
    low, high = (low, high) if window is None else window
    f0, f1 = (low, high) if upward else (high, low)
    sign = 1.0 if upward else -1.0
    duration = abs(f1 - f0) / rate

    def rhs(t, y):
        phase = 2 * math.pi * (f0 * t + sign * 0.5 * rate * t * t)
        return [y[1], wn * wn * (math.cos(phase) - y[0]) - 2 * zeta * wn * y[1]]

    r = f0
    h = 1 / complex(1 - r * r, 2 * zeta * r)  # steady response at the start
    y0 = [h.real, -(h * 1j * 2 * math.pi * f0).real]
    # steps chosen by the integrator; |x| read on a grid of 200 points a cycle at the
    # highest frequency, so the sampled maximum is within 1 - cos(pi / 200) = 1.2e-4 of it
    grid = np.arange(0.0, duration, 0.005 / max(f0, f1))
    sol = solve_ivp(rhs, (0, duration), y0, method="DOP853", rtol=1e-9, atol=1e-11,
                    max_step=0.1 / max(f0, f1), t_eval=grid)
    return float(np.max(np.abs(sol.y[0])))


@pytest.mark.parametrize("zeta", [0.005, 0.05])
@pytest.mark.parametrize("eta", [0.001, 0.01, 0.1])
def test_fit_against_direct_time_integration(eta, zeta):
    # source: scipy.integrate.solve_ivp on the swept system (independent method)
    numeric = swept_peak(eta, zeta)
    fitted = float(passage_peak_viscous(eta, zeta))
    assert -0.05 <= fitted / numeric - 1 <= 0.12, (eta, zeta, numeric, fitted)


def test_the_narrow_window_of_a_slow_sweep_misses_no_peak():
    # the same slow sweep over 0.5-2.0 f_n gives the same peak (to 0.5%)
    assert swept_peak(0.001, 0.05) == pytest.approx(swept_peak(0.001, 0.05,
                                                               window=(0.5, 2.0)), rel=5e-3)


def test_run_down_is_within_the_same_band():
    # source: solve_ivp, downward sweep; the fit is a few per cent low here (stated)
    numeric = swept_peak(0.1, 0.05, upward=False)
    fitted = float(passage_peak_viscous(0.1, 0.05))
    assert -0.05 <= fitted / numeric - 1 <= 0.12


def test_undamped_coefficient_from_the_fresnel_integral():
    # source: scipy.special.fresnel; the envelope is a Fresnel integral (Lewis 1932,
    # from memory): largest distance from the spiral's start over the final sqrt(2)
    from scipy.special import fresnel

    s = np.linspace(0, 4, 400001)
    c, si = fresnel(s)
    distance = np.hypot(c + 0.5, si + 0.5)
    ratio = distance.max() / math.sqrt(2)
    assert ratio == pytest.approx(1.17, abs=0.005)
    assert math.pi * ratio == pytest.approx(UNDAMPED_PASSAGE_COEFFICIENT, abs=0.01)


def test_undamped_closed_form_against_time_integration():
    # source: solve_ivp with zeta = 0; a slow sweep, where the closed form holds (3%)
    numeric = swept_peak(0.01, 0.0)
    assert float(passage_peak_undamped(0.01)) == pytest.approx(numeric, rel=0.03)


def test_slow_sweep_reaches_the_steady_state_peak_and_is_capped_by_it():
    # limiting case: steady state, Q = 1 / (2 zeta) (Thomson & Dahleh ch. 3, from memory)
    assert float(passage_peak_viscous(1e-7, 0.05)) == pytest.approx(10.0, rel=1e-6)
    assert np.all(passage_peak_viscous(np.logspace(-6, 1, 50), 0.02) <= 25.0 + 1e-12)


def test_fast_sweep_of_light_damping_takes_the_undamped_bound():
    eta = 0.5
    assert float(passage_peak_viscous(eta, 0.001)) == pytest.approx(3.67 / math.sqrt(eta))
    assert float(passage_peak_viscous(eta, 0.0)) == pytest.approx(3.67 / math.sqrt(eta))


def test_peak_falls_with_sweep_rate_and_damping():
    etas = np.logspace(-4, 0, 30)
    light = passage_peak_viscous(etas, 0.005)
    heavy = passage_peak_viscous(etas, 0.05)
    assert np.all(np.diff(light) < 0) and np.all(heavy <= light + 1e-12)


def test_sweep_rate_of_a_run_and_eta_by_hand():
    # 1x of 1480 rpm reached in 5 s: 24.67 Hz / 5 s = 4.93 Hz/s; over 3 Hz^2: 0.548
    rate = float(sweep_rate_of_run(1480 / 60, 5.0))
    assert rate == pytest.approx(24.6667 / 5, rel=1e-4)
    assert float(dimensionless_sweep_rate(rate, 3.0)) == pytest.approx(rate / 9)


@pytest.mark.parametrize("call, message", [
    (lambda: sweep_rate_of_run(25.0, 0.0),
     "run-up or run-down time must be finite and greater than zero"),
    (lambda: sweep_rate_of_run(25.0, -3.0),
     "run-up or run-down time must be finite and greater than zero"),
    (lambda: dimensionless_sweep_rate(1.0, 0.0),
     "natural frequency must be finite and greater than zero"),
    (lambda: passage_peak_viscous(0.1, 1.0), "damping ratio must be from 0 to below 1"),
    (lambda: passage_peak_undamped(math.nan),
     "dimensionless sweep rate must be finite and greater than zero"),
])
def test_bad_input_messages(call, message):
    with pytest.raises(ValueError) as info:
        call()
    assert str(info.value) == message


def test_docstring_examples_run():
    import doctest

    from vcheck.dynamics.isolation import passage

    assert doctest.testmod(passage).failed == 0

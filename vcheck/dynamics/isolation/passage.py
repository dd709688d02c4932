"""Passage through resonance at a constant sweep rate: the peak a run-up or run-down reaches.

A machine on isolators passes the isolation frequency every time it starts and stops.
Held at resonance, a one-degree-of-freedom system under a harmonic force of constant
amplitude settles at the steady-state peak, about Q = 1 / (2 zeta) times the static
response; swept through it at a constant rate it has no time to build up and reaches
less. These are pure functions of the dimensionless sweep rate

    eta = (df/dt) / f_n^2

(sweep rate of the forcing frequency [Hz/s] over the square of the natural frequency
[Hz^2]) and the damping ratio.
"""

from __future__ import annotations

import math

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "UNDAMPED_PASSAGE_COEFFICIENT",
    "SWEEP_FIT_COEFFICIENT",
    "SWEEP_FIT_EXPONENT",
    "dimensionless_sweep_rate",
    "passage_peak_undamped",
    "passage_peak_viscous",
    "sweep_rate_of_run",
]

UNDAMPED_PASSAGE_COEFFICIENT: float = 3.67
"""Peak of an undamped system swept through resonance at a constant rate: 3.67 / sqrt(eta).

Closed form (Lewis, 1932, from memory): with phase 2 pi (f_n t + (df/dt) t^2 / 2) the
slowly varying envelope of x'' + w_n^2 x = w_n^2 cos(phase) is a Fresnel integral whose
final value is pi / sqrt(eta); its largest value, at the first maximum of the Cornu
spiral after resonance, is 1.17 times that: 1.17 pi / sqrt(eta) = 3.67 / sqrt(eta)
[unitless]. Derived here from the Fresnel
integral (max |C(s) + i S(s) + (1 + i) / 2| = 1.655 at s = 1.22, against sqrt(2) at
infinity) and checked against time integration in the tests.
"""

SWEEP_FIT_COEFFICIENT: float = 2.86
SWEEP_FIT_EXPONENT: float = 0.445
"""Fit of the damped peak (from memory; attributed in the vibration-testing literature to
Hawkes, 1964, and Cronin, 1965): A / (Q A_static) = 1 - exp(-2.86 (Q^2 eta)^-0.445)
[unitless]."""


def _all_positive(arr: np.ndarray) -> bool:
    """Whether every value is finite and greater than zero (a scalar without numpy)."""
    if arr.ndim == 0:
        return 0.0 < float(arr) < math.inf
    return bool(np.all(np.isfinite(arr)) and np.all(arr > 0))


def _damping_ratio_ok(arr: np.ndarray) -> bool:
    """Whether every value is finite, at least zero and less than one."""
    if arr.ndim == 0:
        return 0.0 <= float(arr) < 1.0
    return bool(np.all(np.isfinite(arr)) and np.all(arr >= 0) and np.all(arr < 1))


def dimensionless_sweep_rate(sweep_rate: ArrayLike, natural_frequency: ArrayLike):
    """Dimensionless sweep rate eta = (df/dt) / f_n^2.

    Parameters
    ----------
    sweep_rate : array_like
        Rate of change of the forcing frequency, its magnitude, positive [Hz/s].
    natural_frequency : array_like
        Natural frequency passed, positive [Hz].

    Returns
    -------
    numpy.ndarray
        eta [unitless].

    Examples
    --------
    >>> print(f"{float(dimensionless_sweep_rate(0.5, 3.0)):.4f}")
    0.0556
    """
    if type(sweep_rate) is float and type(natural_frequency) is float:
        found = _dimensionless_sweep_rate_float(sweep_rate, natural_frequency)
        if found is not None:
            return found
    rate = np.abs(np.asarray(sweep_rate, dtype=float))
    fn = np.asarray(natural_frequency, dtype=float)
    if not _all_positive(rate):
        raise ValueError("sweep rate must be finite and greater than zero")
    if not _all_positive(fn):
        raise ValueError("natural frequency must be finite and greater than zero")
    return rate / fn**2


def sweep_rate_of_run(forcing_frequency: ArrayLike, duration: ArrayLike):
    """Sweep rate of a forcing that rises from rest to ``forcing_frequency`` at constant
    acceleration in ``duration`` (or falls from it to rest).

    Parameters
    ----------
    forcing_frequency : array_like
        Forcing frequency at the end of the run-up (start of the run-down), positive [Hz].
    duration : array_like
        Time of the run-up or run-down, positive [s].

    Returns
    -------
    numpy.ndarray
        df/dt [Hz/s].

    Notes
    -----
    An order k of running speed N rising from rest to N_max in T: df/dt = k N_max / T.
    Constant acceleration is the simplest run-up; a line-started motor accelerates
    faster near its pull-out torque, a fan slower near full speed.
    """
    if type(forcing_frequency) is float and type(duration) is float:
        found = _sweep_rate_of_run_float(forcing_frequency, duration)
        if found is not None:
            return found
    f = np.asarray(forcing_frequency, dtype=float)
    t = np.asarray(duration, dtype=float)
    if not _all_positive(t):
        raise ValueError("run-up or run-down time must be finite and greater than zero")
    if not _all_positive(f):
        raise ValueError("forcing frequency must be finite and greater than zero")
    return f / t


def _dimensionless_sweep_rate_float(rate: float, fn: float):
    """:func:`dimensionless_sweep_rate` of two plain floats: the same checks and the same
    IEEE operations (numpy squares a 0-d array by one product) without building arrays;
    None where numpy would warn of an overflow or a division by zero, for its path."""
    rate = abs(rate)
    if not 0.0 < rate < math.inf:
        raise ValueError("sweep rate must be finite and greater than zero")
    if not 0.0 < fn < math.inf:
        raise ValueError("natural frequency must be finite and greater than zero")
    square = fn * fn
    if square == 0.0 or square == math.inf:
        return None
    eta = rate / square
    return None if eta == math.inf else np.float64(eta)


def _sweep_rate_of_run_float(f: float, t: float):
    """:func:`sweep_rate_of_run` of two plain floats, the same checks in the same order
    and the same division; None where numpy would warn of an overflow, for its path."""
    if not 0.0 < t < math.inf:
        raise ValueError("run-up or run-down time must be finite and greater than zero")
    if not 0.0 < f < math.inf:
        raise ValueError("forcing frequency must be finite and greater than zero")
    rate = f / t
    return None if rate == math.inf else np.float64(rate)


def passage_peak_undamped(eta: ArrayLike):
    """Peak amplification of an undamped one-DOF system swept through resonance.

    Parameters
    ----------
    eta : array_like
        Dimensionless sweep rate (df/dt) / f_n^2, positive [unitless].

    Returns
    -------
    numpy.ndarray
        Largest displacement over the static displacement under the same force amplitude
        [unitless].

    Notes
    -----
    A_max / A_static = 3.67 / sqrt(eta) (:data:`UNDAMPED_PASSAGE_COEFFICIENT`), valid
    for slow sweeps (eta below about 0.1); for faster sweeps it overstates the peak, so
    it is an upper bound.

    References
    ----------
    .. [1] F. M. Lewis, Vibration during acceleration through a critical speed, Trans.
       ASME 54, 1932 (from memory); the coefficient rederived from the Fresnel integral.

    Examples
    --------
    >>> print(f"{float(passage_peak_undamped(0.01)):.1f}")
    36.7
    """
    e = np.asarray(eta, dtype=float)
    if not _all_positive(e):
        raise ValueError("dimensionless sweep rate must be finite and greater than zero")
    return UNDAMPED_PASSAGE_COEFFICIENT / np.sqrt(e)


def passage_peak_viscous(eta: ArrayLike, damping_ratio: ArrayLike):
    """Peak amplification of a viscously damped one-DOF system swept through resonance.

    Parameters
    ----------
    eta : array_like
        Dimensionless sweep rate (df/dt) / f_n^2, positive [unitless].
    damping_ratio : array_like
        Viscous damping ratio zeta, from 0 to below 1 [unitless].

    Returns
    -------
    numpy.ndarray
        Largest displacement over the static displacement under the same force amplitude
        [unitless]; for light damping the force passed into the structure has nearly the
        same ratio.

    Notes
    -----
    With Q = 1 / (2 zeta):

        A_max / A_static = min( Q (1 - exp(-2.86 (Q^2 eta)^-0.445)),  3.67 / sqrt(eta),  Q )

    the damped fit (:data:`SWEEP_FIT_COEFFICIENT`, from memory), capped by the undamped
    closed form (:func:`passage_peak_undamped`, the better bound for fast sweeps of
    light damping) and by the steady-state peak (the limit of a slow sweep). Checked in
    the tests against scipy time integration of the swept system at eta 0.001, 0.01
    and 0.1, zeta 0.005 and 0.05: within -4% to +11% (the fit errs mostly on the high
    side; a run-down reaches a few per cent more than a run-up, and there the fit can be
    up to 4% low).

    References
    ----------
    .. [1] F. M. Lewis, Vibration during acceleration through a critical speed, Trans.
       ASME 54, 1932 (from memory).
    .. [2] The fit 1 - exp(-2.86 (Q^2 eta)^-0.445) as given in the vibration-testing
       literature on sweep rates (Hawkes 1964; Cronin 1965; from memory).

    Examples
    --------
    >>> print(f"{float(passage_peak_viscous(0.01, 0.005)):.1f}")
    30.8
    """
    if type(eta) is float and type(damping_ratio) is float:
        peak = _passage_peak_viscous_float(eta, damping_ratio)
        if peak is not None:
            return peak
    e = np.asarray(eta, dtype=float)
    zeta = np.asarray(damping_ratio, dtype=float)
    if not _all_positive(e):
        raise ValueError("dimensionless sweep rate must be finite and greater than zero")
    if not _damping_ratio_ok(zeta):
        raise ValueError("damping ratio must be from 0 to below 1")
    undamped = passage_peak_undamped(e)
    with np.errstate(divide="ignore", invalid="ignore"):
        q = np.where(zeta > 0, 0.5 / np.where(zeta > 0, zeta, 1.0), math.inf)
        fitted = np.where(
            zeta > 0,
            q * -np.expm1(-SWEEP_FIT_COEFFICIENT * (q * q * e) ** -SWEEP_FIT_EXPONENT),
            math.inf)
    return np.minimum(np.minimum(fitted, undamped), q)


def _passage_peak_viscous_float(eta: float, zeta: float):
    """:func:`passage_peak_viscous` of two plain floats, the same checks and the same
    operations (IEEE arithmetic, sqrt and pow of the C library, as numpy's scalar loops
    use, and numpy's expm1 on a numpy scalar) without building arrays; None where Python's floats would raise
    and numpy's give an infinity (a product that underflows to zero) or numpy warns of
    an overflow (a damping ratio below about 1e-154), for the array path to take."""
    if not 0.0 < eta < math.inf:
        raise ValueError("dimensionless sweep rate must be finite and greater than zero")
    if not 0.0 <= zeta < 1.0:
        raise ValueError("damping ratio must be from 0 to below 1")
    undamped = UNDAMPED_PASSAGE_COEFFICIENT / math.sqrt(eta)
    if zeta > 0:
        q = 0.5 / zeta
        base = q * q * eta
        if base == 0.0 or base == math.inf:  # numpy warns of the overflow: its path
            return None
        # numpy's own expm1 on a numpy scalar (its 0-d loop): numpy 2.4's differs from the
        # C library's in the last bit for about 1.5% of arguments
        fitted = q * -float(np.expm1(-SWEEP_FIT_COEFFICIENT * base ** -SWEEP_FIT_EXPONENT))
    else:
        q = fitted = math.inf
    return np.float64(min(min(fitted, undamped), q))

"""Transmissibility and isolation efficiency of a single-degree-of-freedom isolator.

The model is a rigid mass m on an isolator of stiffness k, excited harmonically at the
frequency f; the isolator has natural frequency f_n = sqrt(k / m) / (2 pi) and the
frequency ratio is r = f / f_n. Two damping models are covered:

- viscous damping, a dashpot c in parallel with k, measured by the damping ratio
  zeta = c / (2 sqrt(k m)); steel springs and dashpots;
- hysteretic (structural) damping, a complex stiffness k (1 + i eta) with loss factor
  eta, whose dissipation per cycle does not depend on frequency; elastomers and
  materials with internal friction.

For each model the same complex ratio gives both problems an engineer meets:

- force transmission: a machine force F acts on the mass; the force passed through the
  isolator into the floor is F_T, and T = |F_T / F|;
- base motion: the floor moves with displacement Y; the mass follows with displacement
  X, and T = |X / Y| (the absolute displacement, velocity and acceleration ratios are
  equal).

The relative (isolator stroke) displacement Z = X - Y under base motion has a different
ratio, given by the ``relative_transmissibility_*`` functions. The mass is rigid, the
isolator massless and linear, and motion is in one direction: wave effects in the
isolator and rocking modes are outside this model.
"""

from __future__ import annotations

import math

import numpy as np
from numpy.typing import ArrayLike

from ..modes.sdof import (
    STANDARD_GRAVITY,
    natural_frequency_static_deflection,
    static_deflection_for_frequency,
)
from .damping import _checked, _checked_damping_ratio

__all__ = [
    "STANDARD_GRAVITY",
    "frequency_ratio",
    "transmissibility_viscous",
    "transmissibility_viscous_phase",
    "transmissibility_hysteretic",
    "transmissibility_hysteretic_phase",
    "relative_transmissibility_viscous",
    "relative_transmissibility_hysteretic",
    "isolation_efficiency",
    "frequency_ratio_for_efficiency",
    "frequency_ratio_for_efficiency_hysteretic",
    "static_deflection_for_efficiency",
    "resonance_peak_viscous",
    "natural_frequency_from_static_deflection",
    "static_deflection_from_natural_frequency",
    "inertia_base_mass",
]

# Standard gravity has one home, vcheck.dynamics.modes.sdof (CGPM 1901); re-exported here.


def _ratio(frequency_ratio: ArrayLike) -> np.ndarray:
    return _checked(frequency_ratio, "frequency ratio", low=0.0)


def _loss_factor(loss_factor: ArrayLike) -> np.ndarray:
    return _checked(loss_factor, "loss factor", low=0.0)


def frequency_ratio(frequency: ArrayLike, natural_frequency: ArrayLike):
    """Ratio of a forcing frequency to the isolator's natural frequency.

    Parameters
    ----------
    frequency : array_like
        Forcing frequency f, at least 0 [Hz].
    natural_frequency : array_like
        Natural frequency f_n of the mass on its isolators, positive [Hz].

    Returns
    -------
    numpy.ndarray
        Frequency ratio r [unitless].

    Notes
    -----
    .. math:: r = f / f_n

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 3 (from memory).

    Examples
    --------
    >>> print(f"{frequency_ratio(24.7, 4.0):.3f}")
    6.175
    """
    f = _checked(frequency, "frequency", low=0.0)
    fn = _checked(natural_frequency, "natural frequency", low=0.0, low_inclusive=False)
    return f / fn


def transmissibility_viscous(frequency_ratio: ArrayLike, damping_ratio: ArrayLike):
    """Transmissibility of a viscously damped isolator (force or base motion).

    Parameters
    ----------
    frequency_ratio : array_like
        Frequency ratio r = f / f_n, at least 0 [unitless].
    damping_ratio : array_like
        Viscous damping ratio zeta, at least 0 and below 1 [unitless].

    Returns
    -------
    numpy.ndarray
        Transmissibility T: transmitted to applied force amplitude, or mass to base
        displacement amplitude; infinite at r = 1 for zeta = 0 [unitless].

    Notes
    -----
    The complex ratio of the mass-spring-dashpot system,

    .. math:: H(r) = \\frac{1 + i 2 \\zeta r}{1 - r^2 + i 2 \\zeta r}

    is F_T / F for a force on the mass and X / Y for motion of the base, so

    .. math:: T = \\sqrt{\\frac{1 + (2 \\zeta r)^2}{(1 - r^2)^2 + (2 \\zeta r)^2}}

    T = 1 at r = sqrt(2) for every zeta; isolation (T < 1) needs r > sqrt(2), where more
    damping raises T.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 3, vibration isolation (from memory).
    .. [2] C. E. Crede, J. E. Ruzicka, "Theory of vibration isolation", in Harris' Shock
       and Vibration Handbook (from memory).

    Examples
    --------
    >>> print(f"{transmissibility_viscous(3.0, 0.05):.5f}")
    0.13041
    """
    r = _ratio(frequency_ratio)
    zeta = _checked_damping_ratio(damping_ratio)
    if type(frequency_ratio) is float and type(damping_ratio) is float:
        value = _transmissibility_viscous_float(float(r), float(zeta))
        if value is not None:
            return value
    damping_term = (2.0 * zeta * r) ** 2
    with np.errstate(divide="ignore"):
        return np.sqrt((1.0 + damping_term) / ((1.0 - r**2) ** 2 + damping_term))


def _transmissibility_viscous_float(r: float, zeta: float):
    """:func:`transmissibility_viscous` of two checked plain floats, the operations of
    its numpy path on scalars: the numpy scalars' ``** 2`` is the C library's pow, the
    0-d array's ``r**2`` a product (numpy's square). None where Python would raise
    (a zero denominator, an overflow numpy warns of), for the numpy path to take."""
    if not r < 1e150:  # numpy would warn of an overflow in a product
        return None
    try:
        damping_term = (2.0 * zeta * r) ** 2
        denominator = (1.0 - r * r) ** 2 + damping_term
    except OverflowError:
        return None
    if denominator == 0.0:
        return None
    return np.float64(math.sqrt((1.0 + damping_term) / denominator))


def transmissibility_viscous_phase(frequency_ratio: ArrayLike, damping_ratio: ArrayLike):
    """Phase of the transmitted force (or mass motion) behind the excitation, viscous model.

    Parameters
    ----------
    frequency_ratio : array_like
        Frequency ratio r = f / f_n, at least 0 [unitless].
    damping_ratio : array_like
        Viscous damping ratio zeta, at least 0 and below 1 [unitless].

    Returns
    -------
    numpy.ndarray
        Phase angle of H(r), in (-pi, 0]; negative means the transmitted quantity lags
        the excitation [rad].

    Notes
    -----
    With H(r) as in :func:`transmissibility_viscous`,

    .. math:: \\phi = \\arctan(2 \\zeta r) - \\operatorname{atan2}(2 \\zeta r, 1 - r^2)

    which tends to -pi/2 at high r for zeta > 0 and is -pi above resonance for zeta = 0.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 3 (from memory).

    Examples
    --------
    >>> print(f"{transmissibility_viscous_phase(3.0, 0.05):.4f}")
    -2.8127
    """
    r = _ratio(frequency_ratio)
    zeta = _checked_damping_ratio(damping_ratio)
    damping_term = 2.0 * zeta * r
    return np.arctan(damping_term) - np.arctan2(damping_term, 1.0 - r**2)


def transmissibility_hysteretic(frequency_ratio: ArrayLike, loss_factor: ArrayLike):
    """Transmissibility of a hysteretically damped isolator (force or base motion).

    Parameters
    ----------
    frequency_ratio : array_like
        Frequency ratio r = f / f_n, at least 0 [unitless].
    loss_factor : array_like
        Loss factor eta of the complex stiffness k (1 + i eta), at least 0 [unitless].

    Returns
    -------
    numpy.ndarray
        Transmissibility T: transmitted to applied force amplitude, or mass to base
        displacement amplitude; infinite at r = 1 for eta = 0 [unitless].

    Notes
    -----
    With the isolator force k (1 + i eta) (x - y), the complex ratio F_T / F for a force
    on the mass and X / Y for base motion are both

    .. math:: H(r) = \\frac{1 + i \\eta}{1 - r^2 + i \\eta}, \\quad
              T = \\sqrt{\\frac{1 + \\eta^2}{(1 - r^2)^2 + \\eta^2}}

    T = 1 at r = sqrt(2) for every eta. Above it T falls as sqrt(1 + eta^2) / r^2,
    faster than the viscous model's 2 zeta / r. At one frequency the model equals a
    viscous one with zeta = eta / (2 r), and at resonance with zeta = eta / 2. The
    complex-stiffness model is a frequency-domain model for steady harmonic motion; it
    has no causal time-domain counterpart.

    References
    ----------
    .. [1] C. E. Crede, J. E. Ruzicka, "Theory of vibration isolation", in Harris' Shock
       and Vibration Handbook, structural damping (from memory).
    .. [2] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, structural damping (from memory).

    Examples
    --------
    >>> print(f"{transmissibility_hysteretic(3.0, 0.1):.5f}")
    0.12561
    """
    r = _ratio(frequency_ratio)
    eta = _loss_factor(loss_factor)
    with np.errstate(divide="ignore"):
        return np.sqrt((1.0 + eta**2) / ((1.0 - r**2) ** 2 + eta**2))


def transmissibility_hysteretic_phase(frequency_ratio: ArrayLike, loss_factor: ArrayLike):
    """Phase of the transmitted force (or mass motion) behind the excitation, hysteretic model.

    Parameters
    ----------
    frequency_ratio : array_like
        Frequency ratio r = f / f_n, at least 0 [unitless].
    loss_factor : array_like
        Loss factor eta, at least 0 [unitless].

    Returns
    -------
    numpy.ndarray
        Phase angle of H(r), in (-pi, 0]; negative means a lag [rad].

    Notes
    -----
    With H(r) as in :func:`transmissibility_hysteretic`,

    .. math:: \\phi = \\arctan(\\eta) - \\operatorname{atan2}(\\eta, 1 - r^2)

    It tends to arctan(eta) - pi at high r (not to -pi/2 as in the viscous model).

    References
    ----------
    .. [1] C. E. Crede, J. E. Ruzicka, "Theory of vibration isolation", in Harris' Shock
       and Vibration Handbook, structural damping (from memory).

    Examples
    --------
    >>> print(f"{transmissibility_hysteretic_phase(3.0, 0.1):.4f}")
    -3.0294
    """
    r = _ratio(frequency_ratio)
    eta = _loss_factor(loss_factor)
    return np.arctan(eta) - np.arctan2(eta, 1.0 - r**2)


def relative_transmissibility_viscous(frequency_ratio: ArrayLike, damping_ratio: ArrayLike):
    """Isolator stroke per unit base motion, viscous model.

    Parameters
    ----------
    frequency_ratio : array_like
        Frequency ratio r = f / f_n, at least 0 [unitless].
    damping_ratio : array_like
        Viscous damping ratio zeta, at least 0 and below 1 [unitless].

    Returns
    -------
    numpy.ndarray
        Amplitude ratio |Z / Y| of the relative displacement Z = X - Y across the
        isolator to the base displacement Y [unitless].

    Notes
    -----
    .. math:: \\left| \\frac{Z}{Y} \\right| =
              \\frac{r^2}{\\sqrt{(1 - r^2)^2 + (2 \\zeta r)^2}}

    It tends to 1 at high r: the mass stands still and the isolator takes all the base
    motion.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 3, support motion (from memory).

    Examples
    --------
    >>> print(f"{relative_transmissibility_viscous(3.0, 0.05):.5f}")
    1.12421
    """
    r = _ratio(frequency_ratio)
    zeta = _checked_damping_ratio(damping_ratio)
    with np.errstate(divide="ignore", invalid="ignore"):
        return r**2 / np.sqrt((1.0 - r**2) ** 2 + (2.0 * zeta * r) ** 2)


def relative_transmissibility_hysteretic(frequency_ratio: ArrayLike, loss_factor: ArrayLike):
    """Isolator stroke per unit base motion, hysteretic model.

    Parameters
    ----------
    frequency_ratio : array_like
        Frequency ratio r = f / f_n, at least 0 [unitless].
    loss_factor : array_like
        Loss factor eta, at least 0 [unitless].

    Returns
    -------
    numpy.ndarray
        Amplitude ratio |Z / Y| of the relative displacement across the isolator to the
        base displacement [unitless].

    Notes
    -----
    .. math:: \\left| \\frac{Z}{Y} \\right| = \\frac{r^2}{\\sqrt{(1 - r^2)^2 + \\eta^2}}

    References
    ----------
    .. [1] C. E. Crede, J. E. Ruzicka, "Theory of vibration isolation", in Harris' Shock
       and Vibration Handbook, structural damping (from memory).

    Examples
    --------
    >>> print(f"{relative_transmissibility_hysteretic(3.0, 0.1):.5f}")
    1.12491
    """
    r = _ratio(frequency_ratio)
    eta = _loss_factor(loss_factor)
    with np.errstate(divide="ignore", invalid="ignore"):
        return r**2 / np.sqrt((1.0 - r**2) ** 2 + eta**2)


def isolation_efficiency(transmissibility: ArrayLike):
    """Isolation efficiency: the share of the force (or motion) the isolator keeps out.

    Parameters
    ----------
    transmissibility : array_like
        Transmissibility T, at least 0 [unitless].

    Returns
    -------
    numpy.ndarray
        Isolation efficiency E; negative where T > 1 (amplification) [unitless].

    Notes
    -----
    .. math:: E = 1 - T

    Often quoted in per cent (100 E).

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 3, vibration isolation (from memory).

    Examples
    --------
    >>> print(f"{isolation_efficiency(0.125):.3f}")
    0.875
    """
    return 1.0 - _checked(transmissibility, "transmissibility", low=0.0)


def _efficiency(efficiency: ArrayLike) -> np.ndarray:
    return _checked(efficiency, "efficiency target", low=0.0, high=1.0)


def _ratio_for_transmissibility_viscous(target: float, zeta: float) -> float:
    """Root r > sqrt(2) of T(r, zeta) = target, for 0 < target <= 1."""
    from ..roots import brent_root

    low = math.sqrt(2.0)
    if target >= 1.0:
        return low
    # The damped curve lies above the undamped one for r > sqrt(2), so the root is at
    # or beyond the undamped root; expand from there until T falls below the target.
    high = math.sqrt(1.0 + 1.0 / target)
    log_target = math.log(target)
    damping = 4.0 * zeta * zeta

    def excess(r: float) -> float:
        # ln T(r, zeta) - ln target, in plain floats: inputs are already checked
        r2 = r * r
        return 0.5 * math.log((1.0 + damping * r2) / ((1.0 - r2) ** 2 + damping * r2)) - (
            log_target
        )

    while excess(high) > 0.0:
        low, high = high, 2.0 * high
    return brent_root(excess, low, high, xtol=1e-14)


def frequency_ratio_for_efficiency(efficiency: ArrayLike, damping_ratio: ArrayLike = 0.0):
    """Frequency ratio that gives a target isolation efficiency, viscous model.

    Parameters
    ----------
    efficiency : array_like
        Target isolation efficiency E = 1 - T, at least 0 and below 1 [unitless].
    damping_ratio : array_like, optional
        Viscous damping ratio zeta, at least 0 and below 1; 0 (undamped) by default
        [unitless].

    Returns
    -------
    numpy.ndarray
        Smallest frequency ratio r >= sqrt(2) with T(r, zeta) = 1 - E; any larger r
        isolates better [unitless].

    Notes
    -----
    Undamped, T = 1 / (r^2 - 1) above sqrt(2), so

    .. math:: r = \\sqrt{1 + 1 / T} = \\sqrt{(2 - E) / (1 - E)}

    Damped, r solves T(r, zeta) = 1 - E on r > sqrt(2), where T falls monotonically; it
    is found with Brent's method (:func:`vcheck.dynamics.roots.brent_root`) on ln T. Damping raises the
    needed r.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 3, vibration isolation (from memory).
    .. [2] R. P. Brent, Algorithms for Minimization without Derivatives, Prentice-Hall,
       1973, ch. 4.

    Examples
    --------
    >>> print(f"{frequency_ratio_for_efficiency(0.9):.4f}")
    3.3166
    >>> print(f"{frequency_ratio_for_efficiency(0.9, 0.05):.4f}")
    3.3995
    """
    e = _efficiency(efficiency)
    zeta = _checked_damping_ratio(damping_ratio)
    e, zeta = np.broadcast_arrays(e, zeta)
    target = 1.0 - e
    result = np.sqrt(1.0 + 1.0 / target)
    damped = np.flatnonzero(zeta.ravel() > 0.0)
    if damped.size:
        flat = result.ravel()
        for index in damped:
            flat[index] = _ratio_for_transmissibility_viscous(
                float(target.ravel()[index]), float(zeta.ravel()[index])
            )
        result = flat.reshape(result.shape)
    return result[()] if result.ndim == 0 else result


def frequency_ratio_for_efficiency_hysteretic(efficiency: ArrayLike, loss_factor: ArrayLike):
    """Frequency ratio that gives a target isolation efficiency, hysteretic model.

    Parameters
    ----------
    efficiency : array_like
        Target isolation efficiency E = 1 - T, at least 0 and below 1 [unitless].
    loss_factor : array_like
        Loss factor eta, at least 0 [unitless].

    Returns
    -------
    numpy.ndarray
        Smallest frequency ratio r >= sqrt(2) with T(r, eta) = 1 - E [unitless].

    Notes
    -----
    Solving T^2 = (1 + eta^2) / ((1 - r^2)^2 + eta^2) for r^2 > 2:

    .. math:: r = \\sqrt{1 + \\sqrt{(1 + \\eta^2) / T^2 - \\eta^2}}, \\quad T = 1 - E

    References
    ----------
    .. [1] C. E. Crede, J. E. Ruzicka, "Theory of vibration isolation", in Harris' Shock
       and Vibration Handbook, structural damping (from memory).

    Examples
    --------
    >>> print(f"{frequency_ratio_for_efficiency_hysteretic(0.9, 0.1):.4f}")
    3.3241
    """
    target = 1.0 - _efficiency(efficiency)
    eta = _loss_factor(loss_factor)
    return np.sqrt(1.0 + np.sqrt((1.0 + eta**2) / target**2 - eta**2))


def natural_frequency_from_static_deflection(static_deflection: ArrayLike):
    """Natural frequency of a mass on linear springs from their static deflection.

    Parameters
    ----------
    static_deflection : array_like
        Deflection delta of the isolators under the supported weight, positive [m].

    Returns
    -------
    numpy.ndarray
        Vertical natural frequency f_n [Hz].

    Notes
    -----
    With k delta = m g,

    .. math:: f_n = \\frac{1}{2 \\pi} \\sqrt{g / \\delta}

    g = 9.80665 m/s^2; in trade units f_n = 15.76 / sqrt(delta in mm) =
    3.13 / sqrt(delta in inches). Valid for linear isolators whose dynamic stiffness
    equals the static one (steel springs); elastomers are often stiffer dynamically, so
    the true f_n is higher.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 2, static deflection (from memory).

    Examples
    --------
    >>> print(f"{natural_frequency_from_static_deflection(0.025):.3f}")
    3.152
    """
    delta = _checked(static_deflection, "static deflection", low=0.0, low_inclusive=False)
    return natural_frequency_static_deflection(delta)


def static_deflection_from_natural_frequency(natural_frequency: ArrayLike):
    """Static deflection that linear springs need for a given natural frequency.

    Parameters
    ----------
    natural_frequency : array_like
        Vertical natural frequency f_n, positive [Hz].

    Returns
    -------
    numpy.ndarray
        Static deflection delta under the supported weight [m].

    Notes
    -----
    .. math:: \\delta = g / (2 \\pi f_n)^2

    Inverse of :func:`natural_frequency_from_static_deflection`.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 2, static deflection (from memory).

    Examples
    --------
    >>> print(f"{static_deflection_from_natural_frequency(3.0) * 1000:.2f}")
    27.60
    """
    fn = _checked(natural_frequency, "natural frequency", low=0.0, low_inclusive=False)
    return static_deflection_for_frequency(fn)


def static_deflection_for_efficiency(
    efficiency: ArrayLike, forcing_frequency: ArrayLike, damping_ratio: ArrayLike = 0.0
):
    """Least static deflection of linear isolators that gives a target efficiency.

    Parameters
    ----------
    efficiency : array_like
        Target isolation efficiency E = 1 - T at the forcing frequency, at least 0 and
        below 1 [unitless].
    forcing_frequency : array_like
        Lowest forcing frequency that must be isolated, positive [Hz].
    damping_ratio : array_like, optional
        Viscous damping ratio zeta, at least 0 and below 1; 0 by default [unitless].

    Returns
    -------
    numpy.ndarray
        Static deflection delta [m].

    Notes
    -----
    r from :func:`frequency_ratio_for_efficiency`, f_n = f / r, and
    delta = g / (2 pi f_n)^2 = g r^2 / (2 pi f)^2.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 3, vibration isolation (from memory).

    Examples
    --------
    >>> print(f"{static_deflection_for_efficiency(0.9, 1480 / 60) * 1000:.2f}")
    4.49
    """
    f = _checked(forcing_frequency, "forcing frequency", low=0.0, low_inclusive=False)
    r = frequency_ratio_for_efficiency(efficiency, damping_ratio)
    return STANDARD_GRAVITY * r**2 / (2.0 * np.pi * f) ** 2


def resonance_peak_viscous(damping_ratio: ArrayLike):
    """Frequency ratio and height of the transmissibility peak, viscous model.

    Parameters
    ----------
    damping_ratio : array_like
        Viscous damping ratio zeta, at least 0 and below 1 [unitless].

    Returns
    -------
    frequency_ratio : numpy.ndarray
        Frequency ratio r_peak of the maximum of T, at most 1 [unitless].
    transmissibility : numpy.ndarray
        Peak transmissibility T(r_peak); infinite for zeta = 0 [unitless].

    Notes
    -----
    Setting dT/dr = 0 gives

    .. math:: r_{peak} = \\frac{\\sqrt{\\sqrt{1 + 8 \\zeta^2} - 1}}{2 \\zeta}
              = \\sqrt{\\frac{2}{1 + \\sqrt{1 + 8 \\zeta^2}}}

    (the second form, used here, has no cancellation at small zeta and gives 1 at
    zeta = 0). For light damping the peak is close to Q = 1 / (2 zeta)
    (:func:`vcheck.dynamics.isolation.damping.quality_factor_from_damping_ratio`). A machine
    starting or stopping passes through this peak.

    References
    ----------
    .. [1] C. E. Crede, J. E. Ruzicka, "Theory of vibration isolation", in Harris' Shock
       and Vibration Handbook (from memory).

    Examples
    --------
    >>> r_peak, t_peak = resonance_peak_viscous(0.05)
    >>> print(f"{r_peak:.5f} {t_peak:.4f}")
    0.99752 10.0622
    """
    zeta = _checked_damping_ratio(damping_ratio)
    r_peak = np.sqrt(2.0 / (1.0 + np.sqrt(1.0 + 8.0 * zeta**2)))
    return r_peak, transmissibility_viscous(r_peak, zeta)


def inertia_base_mass(
    isolator_stiffness: ArrayLike, machine_mass: ArrayLike, target_natural_frequency: ArrayLike
):
    """Inertia-base mass that brings a machine on a given isolator set to a target frequency.

    Parameters
    ----------
    isolator_stiffness : array_like
        Total vertical stiffness of the isolator set (the sum of the isolators acting in
        parallel), positive [N/m].
    machine_mass : array_like
        Mass of the machine on the base, positive [kg].
    target_natural_frequency : array_like
        Highest acceptable vertical natural frequency, positive [Hz].

    Returns
    -------
    numpy.ndarray
        Mass of the inertia base to add; 0 where the machine alone is already at or below
        the target frequency [kg].

    Notes
    -----
    The total supported mass for f_n = f_target is k / (2 pi f_target)^2, so

    .. math:: m_{base} = \\max\\left(0, \\frac{k}{(2 \\pi f_{target})^2} - m\\right)

    The base is taken as rigid; its mass also lowers the centre of gravity and the
    machine's motion amplitude, which this function does not assess.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 2, spring-mass natural frequency (from memory).

    Examples
    --------
    >>> print(f"{inertia_base_mass(4 * 210e3, 640.0, 4.0):.1f}")
    689.8
    """
    k = _checked(isolator_stiffness, "isolator stiffness", low=0.0, low_inclusive=False)
    m = _checked(machine_mass, "machine mass", low=0.0, low_inclusive=False)
    f = _checked(
        target_natural_frequency, "target natural frequency", low=0.0, low_inclusive=False
    )
    return np.maximum(k / (2.0 * np.pi * f) ** 2 - m, 0.0)

"""Single-degree-of-freedom natural frequencies.

The isolated machine in its simplest form: a rigid mass on springs, moving vertically.
"""

from __future__ import annotations

import math

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "STANDARD_GRAVITY",
    "natural_frequency_spring_mass",
    "natural_frequency_static_deflection",
    "static_deflection_for_frequency",
]

STANDARD_GRAVITY = 9.80665
"""Standard acceleration of gravity [m/s^2], exact by definition (3rd CGPM, 1901;
NIST SP 811 (2008), Appendix B.8)."""


def natural_frequency_spring_mass(stiffness: ArrayLike, mass: ArrayLike) -> np.ndarray:
    """Undamped natural frequency of a mass on a spring.

    Parameters
    ----------
    stiffness : array_like
        Total spring stiffness acting on the mass [N/m]; positive.
    mass : array_like
        Mass carried by the spring [kg]; positive.

    Returns
    -------
    numpy.ndarray
        Natural frequency f_n [Hz].

    Notes
    -----
    f_n = sqrt(k / m) / (2 pi), the closed-form solution of m x'' + k x = 0 [1]_.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, sec. 2.1.

    Examples
    --------
    >>> float(natural_frequency_spring_mass(1.0e6, 100.0))
    15.915494309189533
    """
    if type(stiffness) is float and type(mass) is float:
        value = _spring_mass_float(stiffness, mass)
        if value is not None:
            return value
    stiffness = np.asarray(stiffness, dtype=float)
    mass = np.asarray(mass, dtype=float)
    if np.any(~(stiffness > 0)):
        raise ValueError(f"stiffness must be positive, got {stiffness.min():g} N/m")
    if np.any(~(mass > 0)):
        raise ValueError(f"mass must be positive, got {mass.min():g} kg")
    return np.sqrt(stiffness / mass) / (2.0 * np.pi)


def natural_frequency_static_deflection(deflection: ArrayLike) -> np.ndarray:
    """Natural frequency of a mass on linear springs from their static deflection.

    Parameters
    ----------
    deflection : array_like
        Static deflection of the springs under the supported weight [m]; positive.

    Returns
    -------
    numpy.ndarray
        Natural frequency f_n [Hz].

    Notes
    -----
    With k delta = m g, f_n = sqrt(g / delta) / (2 pi) [1]_; with delta in millimetres
    this is the trade's f_n = 15.76 / sqrt(delta) Hz. It holds for linear springs only:
    elastomers are stiffer dynamically than statically, so the formula underestimates
    their natural frequency.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 30 (from memory).

    Examples
    --------
    >>> round(float(natural_frequency_static_deflection(0.025)), 3)
    3.152
    """
    if type(deflection) is float:
        value = _static_deflection_float(deflection)
        if value is not None:
            return value
    deflection = np.asarray(deflection, dtype=float)
    if np.any(~(deflection > 0)):
        raise ValueError(f"static deflection must be positive, got {deflection.min():g} m")
    return np.sqrt(STANDARD_GRAVITY / deflection) / (2.0 * np.pi)


def static_deflection_for_frequency(frequency: ArrayLike) -> np.ndarray:
    """Static deflection of linear springs that gives a natural frequency.

    Parameters
    ----------
    frequency : array_like
        Natural frequency [Hz]; positive.

    Returns
    -------
    numpy.ndarray
        Static deflection delta = g / (2 pi f_n)^2 [m].

    Notes
    -----
    The inverse of :func:`natural_frequency_static_deflection`.
    """
    if type(frequency) is float:
        value = _deflection_for_frequency_float(frequency)
        if value is not None:
            return value
    frequency = np.asarray(frequency, dtype=float)
    if np.any(~(frequency > 0)):
        raise ValueError(f"frequency must be positive, got {frequency.min():g} Hz")
    return STANDARD_GRAVITY / (2.0 * np.pi * frequency) ** 2


# Plain-float paths: the numpy path's operations on two (or one) good plain floats, in
# its order, each correctly rounded as numpy's are; the result a numpy float64 as the
# numpy path gives for 0-d arrays. None where a value is not positive and finite or a
# step leaves the finite range (where numpy would warn): the numpy path then runs, with
# its checks, messages and warnings.


def _spring_mass_float(stiffness: float, mass: float):
    if not (0.0 < stiffness < math.inf and 0.0 < mass < math.inf):
        return None
    ratio = stiffness / mass
    if not 0.0 < ratio < math.inf:
        return None
    return np.float64(math.sqrt(ratio) / (2.0 * math.pi))


def _static_deflection_float(deflection: float):
    if not 0.0 < deflection < math.inf:
        return None
    ratio = STANDARD_GRAVITY / deflection
    if not ratio < math.inf:
        return None
    return np.float64(math.sqrt(ratio) / (2.0 * math.pi))


def _deflection_for_frequency_float(frequency: float):
    if not 1e-150 < frequency < 1e150:  # the square stays finite and above zero
        return None
    return np.float64(STANDARD_GRAVITY / (2.0 * math.pi * frequency) ** 2)

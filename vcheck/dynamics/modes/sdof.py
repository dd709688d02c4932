"""Single-degree-of-freedom natural frequencies.

The isolated machine in its simplest form: a rigid mass on springs, moving vertically.
"""

from __future__ import annotations

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
    frequency = np.asarray(frequency, dtype=float)
    if np.any(~(frequency > 0)):
        raise ValueError(f"frequency must be positive, got {frequency.min():g} Hz")
    return STANDARD_GRAVITY / (2.0 * np.pi * frequency) ** 2

"""Damping of isolators and structures: default values and conversions between measures.

Four measures of light damping are in use, and a design gives whichever it has:

- damping ratio zeta = c / c_crit [unitless], the viscous model's parameter;
- logarithmic decrement delta = ln(x_n / x_{n+1}) of a free decay [unitless];
- loss factor eta, the hysteretic (structural) model's parameter [unitless];
- quality factor Q, the amplification at resonance [unitless].

The defaults below are module-level constants with their source. Values recalled rather
than read from the source are marked "from memory".
"""

from __future__ import annotations

import math
from types import MappingProxyType

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "STEEL_SPRING_DAMPING_RATIO",
    "ELASTOMER_DAMPING_RATIO",
    "HIGH_DAMPING_ELASTOMER_DAMPING_RATIO_RANGE",
    "STRUCTURAL_DAMPING_RATIO_RANGES",
    "EN_1991_1_4_LOG_DECREMENTS",
    "damping_ratio_from_log_decrement",
    "log_decrement_from_damping_ratio",
    "damping_ratio_from_loss_factor",
    "loss_factor_from_damping_ratio",
    "damping_ratio_from_quality_factor",
    "quality_factor_from_damping_ratio",
]

STEEL_SPRING_DAMPING_RATIO: float = 0.005
"""Damping ratio of a steel coil-spring isolator without added damper [unitless].

About 0.005. Source: Harris' Shock and Vibration Handbook, 6th ed. (from memory).
"""

ELASTOMER_DAMPING_RATIO: float = 0.05
"""Damping ratio of a natural-rubber or neoprene isolator [unitless].

About 0.05. Source: Harris' Shock and Vibration Handbook, 6th ed. (from memory).
"""

HIGH_DAMPING_ELASTOMER_DAMPING_RATIO_RANGE: tuple[float, float] = (0.1, 0.2)
"""Range of damping ratio of high-damping elastomer isolators, (low, high) [unitless].

Source: Harris' Shock and Vibration Handbook, 6th ed. (from memory).
"""

STRUCTURAL_DAMPING_RATIO_RANGES = MappingProxyType(
    {
        "welded-steel": (0.002, 0.01),
        "bolted-steel": (0.01, 0.05),
        "concrete": (0.02, 0.05),
    }
)
"""Ranges of damping ratio of structures, kind -> (low, high) [unitless].

Welded steel 0.2-1 %, bolted steel 1-5 %, concrete 2-5 % of critical.
Source: Harris' Shock and Vibration Handbook, 6th ed. (from memory).
"""

EN_1991_1_4_LOG_DECREMENTS = MappingProxyType(
    {
        "steel-bridge-welded": 0.02,
        "steel-bridge-high-strength-friction-grip-bolts": 0.03,
        "steel-bridge-ordinary-bolts": 0.05,
        "steel-building": 0.05,
        "reinforced-concrete-building": 0.10,
    }
)
"""Logarithmic decrement of structural damping in the fundamental mode [unitless].

A selection of EN 1991-1-4:2005 (Eurocode 1, wind actions), Annex F, Table F.2
(approximate values of the logarithmic decrement of structural damping delta_s); the
bridge values apply to steel bridges and lattice steel towers. Convert with
:func:`damping_ratio_from_log_decrement`.
"""


def _format_number(x: float) -> str:
    text = f"{x:g}"
    if text in ("nan", "inf", "-inf") or float(text) == x:
        return text
    return repr(float(x))


def _checked(
    value: ArrayLike,
    name: str,
    *,
    low: float = 0.0,
    low_inclusive: bool = True,
    high: float | None = None,
    allow_infinite: bool = False,
) -> np.ndarray:
    """Return ``value`` as a float array, raising ValueError if any element is outside.

    The accepted set is ``[low, high)``, or ``(low, high)`` with ``low_inclusive=False``.
    Without ``high`` it is unbounded above and infinite values fail unless
    ``allow_infinite``. NaN always fails. The message names the quantity and the first
    offending value.
    """
    if type(value) is float or type(value) is int:  # the common scalar case, fast
        x = float(value)
        ok = (x >= low if low_inclusive else x > low) and (
            x < high if high is not None else (allow_infinite or math.isfinite(x)))
        if ok:
            return np.asarray(x)
    array = np.asarray(value, dtype=float)
    good = array >= low if low_inclusive else array > low
    if high is not None:
        good = good & (array < high)
    elif not allow_infinite:
        good = good & np.isfinite(array)
    if np.all(good):
        return array
    bad = float(array.ravel()[np.flatnonzero(~np.ravel(good))[0]])
    got = _format_number(bad)
    if high is None and bad == np.inf:
        raise ValueError(f"{name} must be a finite number, got {got}")
    if low_inclusive:
        lower = f"at least {_format_number(low)}"
    elif low == 0.0 and high is None:
        lower = "positive"
    else:
        lower = f"above {_format_number(low)}"
    if high is None:
        raise ValueError(f"{name} must be {lower}, got {got}")
    raise ValueError(f"{name} must be {lower} and below {_format_number(high)}, got {got}")


def _checked_damping_ratio(damping_ratio: ArrayLike) -> np.ndarray:
    """Damping ratio as an array, checked to be in [0, 1)."""
    return _checked(damping_ratio, "damping ratio", low=0.0, high=1.0)


def damping_ratio_from_log_decrement(log_decrement: ArrayLike):
    """Damping ratio of a viscously damped oscillator from its logarithmic decrement.

    Parameters
    ----------
    log_decrement : array_like
        Logarithmic decrement delta = ln(x_n / x_{n+1}) of successive peaks of the free
        decay, at least 0 [unitless].

    Returns
    -------
    numpy.ndarray
        Damping ratio zeta [unitless].

    Notes
    -----
    Exact inverse of delta = 2 pi zeta / sqrt(1 - zeta^2):

    .. math:: \\zeta = \\delta / \\sqrt{4 \\pi^2 + \\delta^2}

    For light damping zeta ~ delta / (2 pi), the form used with EN 1991-1-4 Table F.2;
    the two differ by about delta^2 / (8 pi^2) of zeta (0.013 % at delta = 0.1).

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 2, logarithmic decrement (from memory).
    .. [2] EN 1991-1-4:2005, Eurocode 1, Actions on structures, Part 1-4: Wind actions,
       Annex F, Table F.2.

    Examples
    --------
    >>> print(f"{damping_ratio_from_log_decrement(0.05):.5f}")
    0.00796
    """
    delta = _checked(log_decrement, "logarithmic decrement", low=0.0)
    return delta / np.sqrt(4.0 * np.pi**2 + delta**2)


def log_decrement_from_damping_ratio(damping_ratio: ArrayLike):
    """Logarithmic decrement of the free decay of a viscously damped oscillator.

    Parameters
    ----------
    damping_ratio : array_like
        Damping ratio zeta, at least 0 and below 1 [unitless].

    Returns
    -------
    numpy.ndarray
        Logarithmic decrement delta = ln(x_n / x_{n+1}) [unitless].

    Notes
    -----
    Successive maxima of the underdamped free response are one damped period
    T_d = 2 pi / (omega_n sqrt(1 - zeta^2)) apart and shrink by exp(zeta omega_n T_d):

    .. math:: \\delta = 2 \\pi \\zeta / \\sqrt{1 - \\zeta^2}

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 2, logarithmic decrement (from memory).

    Examples
    --------
    >>> print(f"{log_decrement_from_damping_ratio(0.05):.5f}")
    0.31455
    """
    zeta = _checked_damping_ratio(damping_ratio)
    return 2.0 * np.pi * zeta / np.sqrt(1.0 - zeta**2)


def loss_factor_from_damping_ratio(damping_ratio: ArrayLike):
    """Loss factor equivalent to a viscous damping ratio at resonance.

    Parameters
    ----------
    damping_ratio : array_like
        Damping ratio zeta, at least 0 and below 1 [unitless].

    Returns
    -------
    numpy.ndarray
        Loss factor eta [unitless].

    Notes
    -----
    A viscous damper c and a hysteretic stiffness k (1 + i eta) dissipate the same energy
    per cycle, pi c omega X^2 = pi eta k X^2, at omega = omega_n when

    .. math:: \\eta = 2 \\zeta

    Away from resonance the two models differ; the equivalence holds at resonance only.

    References
    ----------
    .. [1] Harris' Shock and Vibration Handbook, 6th ed., McGraw-Hill, 2010, damping
       measures and their relations (from memory).

    Examples
    --------
    >>> print(f"{loss_factor_from_damping_ratio(0.05):.2f}")
    0.10
    """
    return 2.0 * _checked_damping_ratio(damping_ratio)


def damping_ratio_from_loss_factor(loss_factor: ArrayLike):
    """Viscous damping ratio equivalent at resonance to a hysteretic loss factor.

    Parameters
    ----------
    loss_factor : array_like
        Loss factor eta, at least 0 and below 2 (so that zeta < 1) [unitless].

    Returns
    -------
    numpy.ndarray
        Damping ratio zeta [unitless].

    Notes
    -----
    .. math:: \\zeta = \\eta / 2

    See :func:`loss_factor_from_damping_ratio`.

    References
    ----------
    .. [1] Harris' Shock and Vibration Handbook, 6th ed., McGraw-Hill, 2010, damping
       measures and their relations (from memory).

    Examples
    --------
    >>> print(f"{damping_ratio_from_loss_factor(0.1):.2f}")
    0.05
    """
    return _checked(loss_factor, "loss factor", low=0.0, high=2.0) / 2.0


def quality_factor_from_damping_ratio(damping_ratio: ArrayLike):
    """Quality factor (resonant amplification) of a lightly damped oscillator.

    Parameters
    ----------
    damping_ratio : array_like
        Damping ratio zeta, at least 0 and below 1 [unitless].

    Returns
    -------
    numpy.ndarray
        Quality factor Q; infinite for zeta = 0 [unitless].

    Notes
    -----
    .. math:: Q = 1 / (2 \\zeta)

    For light damping Q is, to within terms of order zeta^2 relative: the displacement
    amplification at resonance; the peak of the transmissibility (which exceeds Q by
    about 2.5 zeta^2 relative); and f_n / Delta f, Delta f the half-power bandwidth
    (about 2 zeta^2 below Q).

    References
    ----------
    .. [1] Harris' Shock and Vibration Handbook, 6th ed., McGraw-Hill, 2010, damping
       measures and their relations (from memory).

    Examples
    --------
    >>> print(f"{quality_factor_from_damping_ratio(0.05):.1f}")
    10.0
    """
    zeta = _checked_damping_ratio(damping_ratio)
    with np.errstate(divide="ignore"):
        return 1.0 / (2.0 * zeta)


def damping_ratio_from_quality_factor(quality_factor: ArrayLike):
    """Damping ratio of a lightly damped oscillator from its quality factor.

    Parameters
    ----------
    quality_factor : array_like
        Quality factor Q, above 0.5 (so that zeta < 1); may be infinite [unitless].

    Returns
    -------
    numpy.ndarray
        Damping ratio zeta [unitless].

    Notes
    -----
    .. math:: \\zeta = 1 / (2 Q)

    References
    ----------
    .. [1] Harris' Shock and Vibration Handbook, 6th ed., McGraw-Hill, 2010, damping
       measures and their relations (from memory).

    Examples
    --------
    >>> print(f"{damping_ratio_from_quality_factor(10.0):.3f}")
    0.050
    """
    q = _checked(
        quality_factor, "quality factor", low=0.5, low_inclusive=False, allow_infinite=True
    )
    return 1.0 / (2.0 * q)

"""Rotor unbalance: permissible residual unbalance by balance quality grade, and its force.

A balance quality grade G names the product e_per * Omega of the permissible specific
unbalance (the mass-centre offset) and the maximum service angular speed, in mm/s
(ISO 21940-11:2016, formerly ISO 1940-1). The functions below work in SI: the grade as
a speed in m/s, unbalance in kg m, specific unbalance in m, angular speed in rad/s.
Trade units: 1 g mm = 1e-6 kg m; 1 g mm / kg = 1e-6 m.
"""

from __future__ import annotations

import re
from types import MappingProxyType

import numpy as np
from numpy.typing import ArrayLike

from ..isolation.damping import _checked

__all__ = [
    "BALANCE_QUALITY_GRADES",
    "TYPICAL_BALANCE_GRADES",
    "balance_quality_from_grade",
    "typical_balance_grade",
    "permissible_specific_unbalance",
    "permissible_residual_unbalance",
    "unbalance_force",
]

BALANCE_QUALITY_GRADES: tuple[str, ...] = (
    "G4000", "G1600", "G630", "G250", "G100", "G40", "G16", "G6.3", "G2.5", "G1", "G0.4",
)
"""Balance quality grades of rigid rotors, coarsest first.

The number is e_per * Omega in mm/s; neighbouring grades differ by a factor of about
2.5. Source: ISO 21940-11:2016, Mechanical vibration - Rotor balancing - Part 11:
Procedures and tolerances for rotors with rigid behaviour, table of balance quality
grades (formerly ISO 1940-1:2003) (from memory: the standard was not opened).
"""

TYPICAL_BALANCE_GRADES = MappingProxyType(
    {
        "fan": "G6.3",
        "centrifugal-pump": "G6.3",
        "flywheel": "G6.3",
        "process-machinery": "G6.3",
        "electric-armature": "G6.3",
        "gas-turbine": "G2.5",
        "steam-turbine": "G2.5",
        "turbo-compressor": "G2.5",
        "machine-tool-drive": "G2.5",
        "grinding-machine-drive": "G1",
        "crusher": "G16",
        "cardan-shaft": "G16",
    }
)
"""Typical balance quality grade by kind of rotor or machine, kind -> grade name.

G6.3 fans, pumps, flywheels, process machinery, general electric armatures; G2.5 gas and
steam turbines, turbo-compressors, machine-tool drives; G1 grinding-machine drives; G16
crushers, cardan shafts. Source: the examples table of ISO 21940-11:2016 (formerly
ISO 1940-1) as reproduced in secondary tables (seen in secondary sources, not in the
standard itself). A starting point when the purchase specification gives no grade.
"""

_GRADE_TEXT = re.compile(r"^\s*[Gg]?\s*(\d+(?:\.\d*)?|\.\d+)\s*$")
_GRADE_VALUES = {name: float(name[1:]) for name in BALANCE_QUALITY_GRADES}


def balance_quality_from_grade(grade: str | float) -> float:
    """The balance quality of a named ISO 21940-11 grade, in SI.

    Parameters
    ----------
    grade : str or float
        Grade as written in a specification: "G6.3", "g 6.3", "6.3", or the number
        6.3 (the grade number in mm/s) [unitless].

    Returns
    -------
    float
        Balance quality e_per * Omega of the grade [m/s].

    Raises
    ------
    ValueError
        If the grade is not one of :data:`BALANCE_QUALITY_GRADES`; the message lists them.

    Notes
    -----
    G6.3 means e_per * Omega = 6.3 mm/s = 0.0063 m/s.

    References
    ----------
    .. [1] ISO 21940-11:2016, Mechanical vibration - Rotor balancing - Part 11: Procedures
       and tolerances for rotors with rigid behaviour (from memory).

    Examples
    --------
    >>> print(balance_quality_from_grade("G6.3"))
    0.0063
    """
    if isinstance(grade, str):
        match = _GRADE_TEXT.match(grade)
        number = float(match.group(1)) if match else None
    elif isinstance(grade, (int, float, np.integer, np.floating)) and not isinstance(
        grade, bool
    ):
        number = float(grade)
    else:
        number = None
    for value in _GRADE_VALUES.values():
        # np.isclose(number, value, rtol=1e-9, atol=0) for one pair of floats
        if number is not None and abs(number - value) <= 1e-9 * abs(value):
            return value / 1000.0
    valid = ", ".join(BALANCE_QUALITY_GRADES)
    raise ValueError(f"unknown balance quality grade {grade!r}; valid grades are {valid}")


def typical_balance_grade(machine_kind: str) -> str:
    """Typical balance quality grade for a kind of rotor or machine.

    Parameters
    ----------
    machine_kind : str
        A key of :data:`TYPICAL_BALANCE_GRADES`, such as "fan" or "centrifugal-pump"
        [unitless].

    Returns
    -------
    str
        Grade name, such as "G6.3" [unitless].

    Raises
    ------
    ValueError
        If the kind is not in the table; the message lists the known kinds.

    References
    ----------
    .. [1] ISO 21940-11:2016 examples of rotor types by grade, as reproduced in secondary
       tables (not read in the standard itself).

    Examples
    --------
    >>> typical_balance_grade("fan")
    'G6.3'
    """
    try:
        return TYPICAL_BALANCE_GRADES[machine_kind]
    except (KeyError, TypeError):
        known = ", ".join(sorted(TYPICAL_BALANCE_GRADES))
        raise ValueError(
            f"no typical balance grade for machine kind {machine_kind!r}; known kinds are "
            f"{known}"
        ) from None


def permissible_specific_unbalance(balance_quality: ArrayLike, angular_speed: ArrayLike):
    """Permissible specific unbalance (mass-centre offset) for a balance quality grade.

    Parameters
    ----------
    balance_quality : array_like
        Balance quality e_per * Omega, positive; G6.3 is 0.0063 (see
        :func:`balance_quality_from_grade`) [m/s].
    angular_speed : array_like
        Maximum service angular speed Omega of the rotor, positive [rad/s].

    Returns
    -------
    numpy.ndarray
        Permissible specific unbalance e_per, residual unbalance per unit rotor mass
        [m] (1e-6 m = 1 g mm / kg).

    Notes
    -----
    .. math:: e_{per} = G / \\Omega

    In trade units e_per [g mm / kg] = 1000 G [mm/s] / Omega [rad/s]
    = 9549 G / n [rpm].

    References
    ----------
    .. [1] ISO 21940-11:2016, Mechanical vibration - Rotor balancing - Part 11: Procedures
       and tolerances for rotors with rigid behaviour (from memory).

    Examples
    --------
    >>> omega = 3000 * 2 * 3.141592653589793 / 60
    >>> print(f"{permissible_specific_unbalance(0.0063, omega) * 1e6:.2f}")
    20.05
    """
    g = _checked(balance_quality, "balance quality", low=0.0, low_inclusive=False)
    omega = _checked(angular_speed, "angular speed", low=0.0, low_inclusive=False)
    return g / omega


def permissible_residual_unbalance(
    balance_quality: ArrayLike, rotor_mass: ArrayLike, angular_speed: ArrayLike
):
    """Permissible residual unbalance of a rigid rotor for a balance quality grade.

    Parameters
    ----------
    balance_quality : array_like
        Balance quality e_per * Omega, positive; G6.3 is 0.0063 [m/s].
    rotor_mass : array_like
        Mass of the rotor, positive [kg].
    angular_speed : array_like
        Maximum service angular speed Omega, positive [rad/s].

    Returns
    -------
    numpy.ndarray
        Permissible residual unbalance U_per [kg m] (1e-6 kg m = 1 g mm).

    Notes
    -----
    .. math:: U_{per} = e_{per} \\, m = G \\, m / \\Omega

    In trade units U_per [g mm] = 9549 G [mm/s] m [kg] / n [rpm]. The tolerance is for the
    whole rotor; ISO 21940-11 allocates it to the correction planes.

    References
    ----------
    .. [1] ISO 21940-11:2016, Mechanical vibration - Rotor balancing - Part 11: Procedures
       and tolerances for rotors with rigid behaviour (from memory).

    Examples
    --------
    >>> omega = 3000 * 2 * 3.141592653589793 / 60
    >>> print(f"{permissible_residual_unbalance(0.0063, 100.0, omega) * 1e6:.0f}")
    2005
    """
    mass = _checked(rotor_mass, "rotor mass", low=0.0, low_inclusive=False)
    return permissible_specific_unbalance(balance_quality, angular_speed) * mass


def unbalance_force(unbalance: ArrayLike, angular_speed: ArrayLike):
    """Amplitude of the rotating force of an unbalance.

    Parameters
    ----------
    unbalance : array_like
        Unbalance U = m_u r_u, at least 0 [kg m].
    angular_speed : array_like
        Angular speed Omega, at least 0 [rad/s].

    Returns
    -------
    numpy.ndarray
        Amplitude of the force rotating with the shaft, at the running frequency [N].

    Notes
    -----
    .. math:: F = U \\Omega^2

    the centripetal force on the unbalance mass. At the permissible unbalance of a
    grade, F = m G Omega. This is the force on the bearings of a rigid rotor in rigid
    supports; what reaches the floor is F times the transmissibility of the mounts.

    References
    ----------
    .. [1] ISO 21940-11:2016 (definitions of unbalance) (from memory).
    .. [2] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 3, rotating unbalance (from memory).

    Examples
    --------
    >>> omega = 1480 * 2 * 3.141592653589793 / 60
    >>> print(f"{unbalance_force(1.5e-3, omega):.1f}")
    36.0
    """
    u = _checked(unbalance, "unbalance", low=0.0)
    omega = _checked(angular_speed, "angular speed", low=0.0)
    return u * omega**2

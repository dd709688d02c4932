"""Vibration amplitudes of harmonic motion, severity zones and inertia loads.

For a harmonic motion x(t) = X sin(2 pi f t) the velocity and acceleration amplitudes are
V = 2 pi f X and A = 2 pi f V, whichever way the amplitude is stated (peak, RMS or
peak-to-peak), as long as all three use the same statement. All values are SI: metres,
metres per second, metres per second squared, hertz, newtons.

The severity tables of ISO 10816-3 and ISO 10816-1 give broadband RMS velocity; a design
that states "4.5 mm/s" at running speed means RMS unless it says otherwise, and the
bolt-loosening check needs the peak acceleration that goes with it::

    >>> v_peak = harmonic_amplitude(4.5e-3, "rms", "peak")
    >>> round(float(acceleration_from_velocity(v_peak, 24.75)), 3)   # m/s^2 at 1485 rpm
    0.99
"""

from __future__ import annotations

import math

import numpy as np
from numpy.typing import ArrayLike

from .modes.sdof import STANDARD_GRAVITY

__all__ = [
    "STANDARD_GRAVITY",
    "AMPLITUDE_KINDS",
    "ZONE_BOUNDARIES_ISO_10816_3",
    "CLASS_BOUNDARIES_ISO_10816_1",
    "velocity_from_displacement",
    "acceleration_from_velocity",
    "acceleration_from_displacement",
    "displacement_from_velocity",
    "velocity_from_acceleration",
    "displacement_from_acceleration",
    "harmonic_amplitude",
    "zone_boundaries",
    "class_boundaries",
    "severity_zone",
    "inertia_force",
]

# Standard gravity has one home, vcheck.dynamics.modes.sdof (CGPM 1901); re-exported here.

AMPLITUDE_KINDS: dict[str, float] = {
    "peak": 1.0,
    "rms": 1.0 / math.sqrt(2.0),
    "peak-to-peak": 2.0,
}
"""Ratio of each statement of a harmonic amplitude to the peak (zero-to-peak)
amplitude [unitless]: RMS = peak / sqrt(2), peak-to-peak = 2 peak (exact for a single
sinusoid)."""

_MM_S = 1.0e-3
ZONE_BOUNDARIES_ISO_10816_3: dict[tuple[int, str], tuple[float, float, float]] = {
    (1, "rigid"): (2.3 * _MM_S, 4.5 * _MM_S, 7.1 * _MM_S),
    (1, "flexible"): (3.5 * _MM_S, 7.1 * _MM_S, 11.0 * _MM_S),
    (2, "rigid"): (1.4 * _MM_S, 2.8 * _MM_S, 4.5 * _MM_S),
    (2, "flexible"): (2.3 * _MM_S, 4.5 * _MM_S, 7.1 * _MM_S),
}
"""Zone boundaries A/B, B/C, C/D of broadband RMS vibration velocity [m/s] on the bearing
housings of industrial machines above 15 kW, 120 to 15 000 r/min, by machine group
(1: above 300 kW, or electrical machines with shaft height of 315 mm or more;
2: 15 kW to 300 kW, or shaft height 160 mm to 315 mm) and support (rigid or flexible),
ISO 10816-3:2009 Annex A, Table A.1 (from memory; ISO 20816-3:2022 is believed to keep
these values, not verified)."""

CLASS_BOUNDARIES_ISO_10816_1: dict[str, tuple[float, float, float]] = {
    "I": (0.71 * _MM_S, 1.8 * _MM_S, 4.5 * _MM_S),
    "II": (1.12 * _MM_S, 2.8 * _MM_S, 7.1 * _MM_S),
    "III": (1.8 * _MM_S, 4.5 * _MM_S, 11.2 * _MM_S),
    "IV": (2.8 * _MM_S, 7.1 * _MM_S, 18.0 * _MM_S),
}
"""Typical zone boundaries A/B, B/C, C/D of RMS vibration velocity [m/s] by machine class
(I: small machines up to 15 kW; II: medium machines 15 kW to 75 kW, or up to 300 kW on
special foundations; III: large machines on rigid foundations; IV: large machines on
soft foundations), ISO 10816-1:1995 Annex B, Table B.1."""


def _arr(value: ArrayLike) -> np.ndarray:
    return np.asarray(value, dtype=float)


def _first(arr: np.ndarray, mask: np.ndarray) -> str:
    return f"{np.atleast_1d(arr)[np.atleast_1d(mask)][0]:g}"


def _amplitude(value: ArrayLike, name: str, unit: str) -> np.ndarray:
    arr = _arr(value)
    bad = ~np.isfinite(arr)
    if np.any(bad):
        raise ValueError(f"{name} must be finite, got {_first(arr, bad)} {unit}")
    bad = arr < 0
    if np.any(bad):
        raise ValueError(f"{name} must be zero or positive, got {_first(arr, bad)} {unit}")
    return arr


def _frequency(value: ArrayLike) -> np.ndarray:
    arr = _arr(value)
    bad = ~np.isfinite(arr) | (arr <= 0)
    if np.any(bad):
        raise ValueError(f"frequency must be positive and finite, got {_first(arr, bad)} Hz")
    return arr


def velocity_from_displacement(displacement: ArrayLike, frequency: ArrayLike):
    """Velocity amplitude of a harmonic motion from its displacement amplitude.

    Parameters
    ----------
    displacement : array_like
        Displacement amplitude X (peak, RMS or peak-to-peak) [m].
    frequency : array_like
        Frequency of the motion f [Hz].

    Returns
    -------
    numpy.ndarray or float
        Velocity amplitude V = 2 pi f X, stated like X [m/s].

    Notes
    -----
    Differentiating x = X sin(omega t) gives v = omega X cos(omega t).

    References
    ----------
    .. [1] ISO 2041:2018, Mechanical vibration, shock and condition monitoring,
       vocabulary (harmonic motion) (from memory).
    .. [2] ISO 10816-1:1995, Annex A (relation of displacement, velocity and
       acceleration for single-frequency vibration) (from memory).
    """
    x = _amplitude(displacement, "displacement", "m")
    return 2 * np.pi * _frequency(frequency) * x


def acceleration_from_velocity(velocity: ArrayLike, frequency: ArrayLike):
    """Acceleration amplitude of a harmonic motion from its velocity amplitude.

    Parameters
    ----------
    velocity : array_like
        Velocity amplitude V [m/s].
    frequency : array_like
        Frequency f [Hz].

    Returns
    -------
    numpy.ndarray or float
        Acceleration amplitude A = 2 pi f V [m/s^2].

    References
    ----------
    .. [1] ISO 10816-1:1995, Annex A (from memory).
    """
    v = _amplitude(velocity, "velocity", "m/s")
    return 2 * np.pi * _frequency(frequency) * v


def acceleration_from_displacement(displacement: ArrayLike, frequency: ArrayLike):
    """Acceleration amplitude from displacement amplitude, A = (2 pi f)^2 X.

    Parameters
    ----------
    displacement : array_like
        Displacement amplitude X [m].
    frequency : array_like
        Frequency f [Hz].

    Returns
    -------
    numpy.ndarray or float
        Acceleration amplitude [m/s^2].

    References
    ----------
    .. [1] ISO 10816-1:1995, Annex A (from memory).
    """
    x = _amplitude(displacement, "displacement", "m")
    return (2 * np.pi * _frequency(frequency)) ** 2 * x


def displacement_from_velocity(velocity: ArrayLike, frequency: ArrayLike):
    """Displacement amplitude from velocity amplitude, X = V / (2 pi f).

    Parameters
    ----------
    velocity : array_like
        Velocity amplitude V [m/s].
    frequency : array_like
        Frequency f [Hz].

    Returns
    -------
    numpy.ndarray or float
        Displacement amplitude [m].

    References
    ----------
    .. [1] ISO 10816-1:1995, Annex A (from memory).
    """
    v = _amplitude(velocity, "velocity", "m/s")
    return v / (2 * np.pi * _frequency(frequency))


def velocity_from_acceleration(acceleration: ArrayLike, frequency: ArrayLike):
    """Velocity amplitude from acceleration amplitude, V = A / (2 pi f).

    Parameters
    ----------
    acceleration : array_like
        Acceleration amplitude A [m/s^2].
    frequency : array_like
        Frequency f [Hz].

    Returns
    -------
    numpy.ndarray or float
        Velocity amplitude [m/s].

    References
    ----------
    .. [1] ISO 10816-1:1995, Annex A (from memory).
    """
    a = _amplitude(acceleration, "acceleration", "m/s^2")
    return a / (2 * np.pi * _frequency(frequency))


def displacement_from_acceleration(acceleration: ArrayLike, frequency: ArrayLike):
    """Displacement amplitude from acceleration amplitude, X = A / (2 pi f)^2.

    Parameters
    ----------
    acceleration : array_like
        Acceleration amplitude A [m/s^2].
    frequency : array_like
        Frequency f [Hz].

    Returns
    -------
    numpy.ndarray or float
        Displacement amplitude [m].

    References
    ----------
    .. [1] ISO 10816-1:1995, Annex A (from memory).
    """
    a = _amplitude(acceleration, "acceleration", "m/s^2")
    return a / (2 * np.pi * _frequency(frequency)) ** 2


def harmonic_amplitude(value: ArrayLike, source: str, target: str):
    """Restate a harmonic amplitude as peak, RMS or peak-to-peak.

    Parameters
    ----------
    value : array_like
        Amplitude in the ``source`` statement, any unit [same unit as the result].
    source, target : {"peak", "rms", "peak-to-peak"}
        How the amplitude is stated now and how it is wanted [unitless].

    Returns
    -------
    numpy.ndarray or float
        The amplitude restated [same unit as ``value``].

    Notes
    -----
    For a single sinusoid RMS = peak / sqrt(2) and peak-to-peak = 2 peak. For broadband
    vibration these factors do not hold (the crest factor differs); the result is then
    the amplitude of the equivalent sinusoid.

    References
    ----------
    .. [1] ISO 2041:2018 (definitions of peak, peak-to-peak and RMS value)
       (from memory).

    Examples
    --------
    >>> round(float(harmonic_amplitude(1.0, "rms", "peak")), 6)
    1.414214
    """
    for kind in (source, target):
        if kind not in AMPLITUDE_KINDS:
            valid = ", ".join(AMPLITUDE_KINDS)
            raise ValueError(f"unknown amplitude kind {kind!r}: valid kinds are {valid}")
    v = _amplitude(value, "amplitude", "")
    return v * (AMPLITUDE_KINDS[target] / AMPLITUDE_KINDS[source])


def zone_boundaries(group: int, support: str) -> tuple[float, float, float]:
    """ISO 10816-3 zone boundaries for a machine group and support.

    Parameters
    ----------
    group : {1, 2}
        Machine group: 1 for large machines (above 300 kW), 2 for medium machines
        (15 kW to 300 kW) [unitless].
    support : {"rigid", "flexible"}
        Whether the lowest natural frequency of machine and support is well above the
        main excitation (rigid) or not (flexible) [unitless].

    Returns
    -------
    tuple of float
        A/B, B/C and C/D boundaries of broadband RMS velocity [m/s].

    References
    ----------
    .. [1] ISO 10816-3:2009, Annex A, Table A.1 (from memory).

    Examples
    --------
    >>> round(zone_boundaries(2, "rigid")[2] * 1e3, 2)
    4.5
    """
    if isinstance(group, bool) or group not in (1, 2):
        raise ValueError(f"unknown machine group {group!r}: valid groups are 1, 2")
    if support not in ("rigid", "flexible"):
        raise ValueError(f"unknown support {support!r}: valid supports are rigid, flexible")
    return ZONE_BOUNDARIES_ISO_10816_3[(int(group), support)]


def class_boundaries(machine_class: str) -> tuple[float, float, float]:
    """ISO 10816-1 typical zone boundaries for a machine class.

    Parameters
    ----------
    machine_class : {"I", "II", "III", "IV"}
        Machine class of ISO 10816-1 Annex B [unitless].

    Returns
    -------
    tuple of float
        A/B, B/C and C/D boundaries of RMS velocity [m/s].

    References
    ----------
    .. [1] ISO 10816-1:1995, Annex B, Table B.1.
    """
    key = machine_class.strip().upper() if isinstance(machine_class, str) else machine_class
    if key not in CLASS_BOUNDARIES_ISO_10816_1:
        valid = ", ".join(CLASS_BOUNDARIES_ISO_10816_1)
        raise ValueError(f"unknown machine class {machine_class!r}: valid classes are {valid}")
    return CLASS_BOUNDARIES_ISO_10816_1[key]


def severity_zone(velocity_rms: ArrayLike, boundaries: tuple[float, float, float]):
    """Evaluation zone A, B, C or D of a measured or expected vibration velocity.

    Parameters
    ----------
    velocity_rms : array_like
        Broadband RMS vibration velocity [m/s].
    boundaries : tuple of float
        A/B, B/C and C/D boundaries, from :func:`zone_boundaries` or
        :func:`class_boundaries` [m/s].

    Returns
    -------
    str or numpy.ndarray of str
        ``"A"`` (newly commissioned), ``"B"`` (unrestricted long-term operation),
        ``"C"`` (limited period only), ``"D"`` (severe enough to cause damage)
        [unitless].

    Notes
    -----
    A value equal to a boundary is placed in the lower (better) zone; the standard
    leaves this open (our choice).

    References
    ----------
    .. [1] ISO 10816-1:1995, clause 5.3.1 (zone descriptions) (from memory).
    """
    v = _amplitude(velocity_rms, "velocity", "m/s")
    b = np.asarray(boundaries, dtype=float)
    if b.shape != (3,) or np.any(np.diff(b) <= 0) or np.any(b <= 0):
        raise ValueError(
            f"boundaries must be three increasing positive velocities, got {boundaries!r}"
        )
    index = np.searchsorted(b, v, side="left")
    zones = np.array(["A", "B", "C", "D"])[index]
    return str(zones) if zones.ndim == 0 else zones


def inertia_force(mass: ArrayLike, acceleration: ArrayLike):
    """Inertia force of a rigid mass under an acceleration, F = m a.

    Parameters
    ----------
    mass : array_like
        Mass carried by the joint [kg].
    acceleration : array_like
        Acceleration amplitude of the mass (peak, for a force amplitude) [m/s^2].

    Returns
    -------
    numpy.ndarray or float
        Force amplitude F [N].

    Notes
    -----
    Newton's second law; an acceleration in multiples of standard gravity is
    a = n g_n with :data:`STANDARD_GRAVITY`.

    References
    ----------
    .. [1] ISO 80000-4:2019, item 4-9.1 (force) (from memory).

    Examples
    --------
    >>> round(float(inertia_force(100.0, 2 * STANDARD_GRAVITY)), 3)
    1961.33
    """
    m = _amplitude(mass, "mass", "kg")
    a = _amplitude(acceleration, "acceleration", "m/s^2")
    return m * a

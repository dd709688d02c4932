"""Forcing frequencies of machines, as single values or bands over a speed range.

All speeds and frequencies are in hertz (revolutions or cycles per second): 1480 rpm is
24.667 Hz. Frequencies that are a fixed multiple of shaft speed are also offered as
*orders* (events per revolution [unitless]), so that :func:`order_band` turns them into
a band over a variable-speed drive's range.
"""

from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "BearingDefectOrders",
    "EngineOrders",
    "bearing_defect_orders",
    "belt_pass_frequency",
    "blade_pass_frequency",
    "compressor_pulsation_frequency",
    "drive_fed_magnetic_frequency",
    "drive_output_frequency",
    "INVERTER_TORQUE_HARMONICS",
    "engine_excitation_orders",
    "firing_frequency",
    "gear_mesh_frequency",
    "order_band",
    "pole_pass_frequency",
    "slip_frequency",
    "synchronous_speed",
    "twice_line_frequency",
]


# --------------------------------------------------------------------------- checks


def _first_bad(arr: np.ndarray, bad: np.ndarray) -> float:
    return float(arr[bad].flat[0]) if arr.ndim else float(arr)


def _non_negative(name: str, value: ArrayLike, unit: str) -> np.ndarray:
    arr = np.asarray(value, dtype=float)
    if arr.ndim == 0 and 0.0 <= float(arr) < math.inf:  # a good scalar: no array checks
        return arr
    bad = ~(arr >= 0) | ~np.isfinite(arr)
    if np.any(bad):
        raise ValueError(f"{name} must not be negative, got {_first_bad(arr, bad):g} {unit}")
    return arr


def _positive(name: str, value: ArrayLike, unit: str) -> np.ndarray:
    arr = np.asarray(value, dtype=float)
    if arr.ndim == 0 and 0.0 < float(arr) < math.inf:  # a good scalar: no array checks
        return arr
    bad = ~(arr > 0) | ~np.isfinite(arr)
    if np.any(bad):
        suffix = f" {unit}" if unit else ""
        raise ValueError(f"{name} must be positive, got {_first_bad(arr, bad):g}{suffix}")
    return arr


def _count(name: str, value: ArrayLike) -> np.ndarray:
    """A positive whole number (or an array of them), returned as float."""
    arr = np.asarray(value, dtype=float)
    if arr.ndim == 0 and 1.0 <= float(arr) < math.inf and float(arr).is_integer():
        return arr  # a good scalar: no array checks
    bad = ~(arr >= 1) | ~np.isfinite(arr) | (arr != np.round(arr))
    if np.any(bad):
        raise ValueError(f"{name} must be a positive whole number, got {_first_bad(arr, bad):g}")
    return arr


# --------------------------------------------------------------------------- bands

_SCALARS = frozenset({float, int, np.float64})
"""Types of a plain number that the band functions take without array checks."""


def order_band(order: ArrayLike, speed_min: ArrayLike, speed_max: ArrayLike):
    """Frequency band of a running-speed order over a speed range.

    Parameters
    ----------
    order : array_like
        Order of the running speed, events per revolution (1 for unbalance, 2 for
        misalignment, the vane count for vane pass) [unitless]; not negative.
    speed_min, speed_max : array_like
        Lowest and highest running speed [Hz]; not negative, lowest first.

    Returns
    -------
    low, high : numpy.ndarray
        Band edges [Hz].

    Notes
    -----
    f = n * N, with n the order and N the shaft speed in revolutions per second. A vane
    or blade pass frequency is the vane count times shaft speed (common practice).

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 16 (machinery forcing frequencies) (from memory).
    """
    if type(order) in _SCALARS and type(speed_min) in _SCALARS and type(speed_max) in _SCALARS:
        o, lo, hi = float(order), float(speed_min), float(speed_max)
        if 0.0 <= o < math.inf and 0.0 <= lo <= hi < math.inf:
            # good scalars: the same products as the array path, without its checks
            return np.float64(o) * np.float64(lo), np.float64(o) * np.float64(hi)
    order = np.asarray(order, dtype=float)
    bad = ~(order >= 0) | ~np.isfinite(order)
    if np.any(bad):
        raise ValueError(f"order must not be negative, got {_first_bad(order, bad):g}")
    speed_min = _non_negative("minimum speed", speed_min, "Hz")
    speed_max = _non_negative("maximum speed", speed_max, "Hz")
    reversed_ = speed_min > speed_max
    if np.any(reversed_):
        lo = _first_bad(np.broadcast_to(speed_min, reversed_.shape), reversed_)
        hi = _first_bad(np.broadcast_to(speed_max, reversed_.shape), reversed_)
        raise ValueError(f"speed range is reversed: minimum {lo:g} Hz is above maximum {hi:g} Hz")
    low = order * speed_min
    high = order * speed_max
    return low, high


# ------------------------------------------------------------------ rolling bearings


class BearingDefectOrders(NamedTuple):
    """Rolling-bearing defect frequencies as orders of shaft speed [unitless]."""

    outer_race: np.ndarray
    """Ball pass frequency, outer race (BPFO) [unitless]."""
    inner_race: np.ndarray
    """Ball pass frequency, inner race (BPFI) [unitless]."""
    cage: np.ndarray
    """Fundamental train (cage) frequency (FTF) [unitless]."""
    ball_spin: np.ndarray
    """Ball spin frequency (BSF), one turn of a ball about its own axis [unitless]."""
    ball_defect: np.ndarray
    """Twice the ball spin frequency: a ball defect strikes both races every turn
    [unitless]."""


def bearing_defect_orders(
    ball_count: ArrayLike,
    ball_diameter: ArrayLike,
    pitch_diameter: ArrayLike,
    contact_angle: ArrayLike = 0.0,
) -> BearingDefectOrders:
    """Defect frequencies of a rolling-element bearing per shaft revolution.

    Parameters
    ----------
    ball_count : array_like
        Number of rolling elements in one row, n [unitless]; a positive whole number.
    ball_diameter : array_like
        Rolling-element diameter d [m]; positive, smaller than the pitch diameter.
    pitch_diameter : array_like
        Pitch (cage) diameter D through the element centres [m]; positive.
    contact_angle : array_like, default 0
        Contact angle phi between the load line and the radial plane [rad]; 0 for a
        radially loaded deep-groove bearing; from 0 up to (not including) pi/2.

    Returns
    -------
    BearingDefectOrders
        Orders of shaft speed (multiply by shaft speed in Hz for frequencies):
        ``outer_race`` (BPFO), ``inner_race`` (BPFI), ``cage`` (FTF), ``ball_spin``
        (BSF) and ``ball_defect`` (2 BSF) [unitless].

    Notes
    -----
    Inner race turning with the shaft, outer race fixed, pure rolling. With
    c = (d / D) cos phi [1]_:

    - FTF  = (1 - c) / 2
    - BPFO = n (1 - c) / 2
    - BPFI = n (1 + c) / 2
    - BSF  = D / (2 d) (1 - c^2)

    Real bearings slip: measured lines sit typically 1-2 % below these (common
    practice). Some tables list 2 BSF as the rolling-element frequency, since a ball
    defect strikes the inner and the outer race once each per ball revolution; both
    are returned.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 16 (from memory); the kinematic relations follow from
       rolling without slip of the elements between the races.

    Examples
    --------
    Deep-groove bearing 6205: 9 balls, d = 0.3126 in, D = 1.537 in:

    >>> o = bearing_defect_orders(9, 0.3126 * 0.0254, 1.537 * 0.0254)
    >>> [round(float(v), 4) for v in o]
    [3.5848, 5.4152, 0.3983, 2.3567, 4.7134]
    """
    n = _count("ball count", ball_count)
    d = _positive("ball diameter", ball_diameter, "m")
    pd = _positive("pitch diameter", pitch_diameter, "m")
    too_big = d >= pd
    if np.any(too_big):
        dd = _first_bad(np.broadcast_to(d, too_big.shape), too_big)
        pp = _first_bad(np.broadcast_to(pd, too_big.shape), too_big)
        raise ValueError(f"ball diameter {dd:g} m must be smaller than the pitch diameter {pp:g} m")
    phi = np.asarray(contact_angle, dtype=float)
    bad = ~((phi >= 0) & (phi < np.pi / 2))
    if np.any(bad):
        raise ValueError(
            f"contact angle must be from 0 up to pi/2 rad, got {_first_bad(phi, bad):g} rad"
        )
    c = d / pd * np.cos(phi)
    cage = 0.5 * (1.0 - c)
    bsf = pd / (2.0 * d) * (1.0 - c**2)
    return BearingDefectOrders(
        outer_race=n * cage,
        inner_race=0.5 * n * (1.0 + c),
        cage=cage,
        ball_spin=bsf,
        ball_defect=2.0 * bsf,
    )


# ------------------------------------------------------------- gears, blades, belts


def gear_mesh_frequency(teeth: ArrayLike, shaft_speed: ArrayLike) -> np.ndarray:
    """Gear mesh frequency.

    Parameters
    ----------
    teeth : array_like
        Number of teeth on the gear whose shaft speed is given [unitless].
    shaft_speed : array_like
        Speed of that gear's shaft [Hz]; not negative.

    Returns
    -------
    numpy.ndarray
        Tooth mesh frequency f = z N [Hz], the same for both gears of a pair.

    Notes
    -----
    f_mesh = z_1 N_1 = z_2 N_2 (common practice). Its order of shaft speed is the
    tooth count, so :func:`order_band` gives the band over a speed range.
    """
    return _count("tooth count", teeth) * _non_negative("shaft speed", shaft_speed, "Hz")


def blade_pass_frequency(count: ArrayLike, shaft_speed: ArrayLike) -> np.ndarray:
    """Blade or vane pass frequency of a fan, pump impeller or turbine stage.

    Parameters
    ----------
    count : array_like
        Number of blades or vanes [unitless].
    shaft_speed : array_like
        Shaft speed [Hz]; not negative.

    Returns
    -------
    numpy.ndarray
        f = count x shaft speed [Hz].

    Notes
    -----
    Each blade passes a fixed point (a cutwater, a strut) once a revolution (common
    practice).
    """
    return _count("blade count", count) * _non_negative("shaft speed", shaft_speed, "Hz")


def belt_pass_frequency(
    pulley_diameter: ArrayLike, pulley_speed: ArrayLike, belt_length: ArrayLike
) -> np.ndarray:
    """Belt pass frequency: how often one point of a belt goes round the drive.

    Parameters
    ----------
    pulley_diameter : array_like
        Pitch diameter of either pulley [m]; positive.
    pulley_speed : array_like
        Speed of that pulley [Hz]; not negative.
    belt_length : array_like
        Pitch length of the belt [m]; positive.

    Returns
    -------
    numpy.ndarray
        f = pi D N / L_belt [Hz], always below the speed of the smaller pulley.

    Notes
    -----
    Belt speed v = pi D N; a belt defect or joint comes round at v / L_belt. It passes
    each of the two pulleys once a circuit, so 2 f is usually present as well (common
    practice).
    """
    dp = _positive("pulley diameter", pulley_diameter, "m")
    n = _non_negative("pulley speed", pulley_speed, "Hz")
    lb = _positive("belt length", belt_length, "m")
    return np.pi * dp * n / lb


# ------------------------------------------------------------------ electric machines


def twice_line_frequency(line_frequency: ArrayLike) -> np.ndarray:
    """Magnetic forcing of an AC machine: twice the supply frequency.

    Parameters
    ----------
    line_frequency : array_like
        Supply (line) frequency, 50 or 60 Hz on public grids, the drive's output
        frequency on a variable-frequency drive [Hz]; positive.

    Returns
    -------
    numpy.ndarray
        2 f_line [Hz]: 100 Hz on 50 Hz, 120 Hz on 60 Hz supplies.

    Notes
    -----
    The magnetic pull between stator and rotor peaks twice per electrical cycle,
    whatever the number of poles (common practice).
    """
    return 2.0 * _positive("line frequency", line_frequency, "Hz")


def _poles(poles: ArrayLike) -> np.ndarray:
    p = _count("pole count", poles)
    odd = p % 2 != 0
    if np.any(odd):
        raise ValueError(f"pole count must be even, got {_first_bad(p, odd):g}")
    return p


def synchronous_speed(line_frequency: ArrayLike, poles: ArrayLike) -> np.ndarray:
    """Synchronous speed of an AC machine.

    Parameters
    ----------
    line_frequency : array_like
        Supply frequency [Hz]; positive.
    poles : array_like
        Number of magnetic poles (2, 4, 6, ...; twice the pole pairs) [unitless].

    Returns
    -------
    numpy.ndarray
        N_s = 2 f_line / p [Hz] (revolutions per second; 1500 rpm for 4 poles on 50 Hz).

    Notes
    -----
    The stator field turns one pole pair per electrical cycle [1]_.

    References
    ----------
    .. [1] IEC 60034-1, Rotating electrical machines - Part 1: Rating and performance
       (synchronous speed n_s = f / p, p pole pairs; clause from memory).
    """
    return 2.0 * _positive("line frequency", line_frequency, "Hz") / _poles(poles)


def slip_frequency(line_frequency: ArrayLike, poles: ArrayLike, shaft_speed: ArrayLike):
    """Slip frequency of an induction machine: synchronous minus shaft speed.

    Parameters
    ----------
    line_frequency : array_like
        Supply frequency [Hz]; positive.
    poles : array_like
        Number of poles [unitless].
    shaft_speed : array_like
        Actual shaft speed [Hz]; not negative.

    Returns
    -------
    numpy.ndarray
        |N_s - N| [Hz]; N above N_s (a generator) gives the same magnitude.

    Notes
    -----
    Slip s = (N_s - N) / N_s; the slip frequency in these units is s N_s (common
    practice; from memory).
    """
    ns = synchronous_speed(line_frequency, poles)
    n = _non_negative("shaft speed", shaft_speed, "Hz")
    return np.abs(ns - n)


def pole_pass_frequency(line_frequency: ArrayLike, poles: ArrayLike, shaft_speed: ArrayLike):
    """Pole pass frequency of an induction motor.

    Parameters
    ----------
    line_frequency : array_like
        Supply frequency [Hz]; positive.
    poles : array_like
        Number of poles [unitless].
    shaft_speed : array_like
        Actual shaft speed [Hz]; not negative.

    Returns
    -------
    numpy.ndarray
        f_p = p (N_s - N) [Hz], the pole count times the slip frequency.

    Notes
    -----
    Broken or cracked rotor bars and uneven air gaps modulate the running-speed line
    at the pole pass frequency, giving side bands at 1x +- f_p and a beat (common
    practice; from memory). The rotor-bar pass frequency is the bar count times shaft
    speed (:func:`blade_pass_frequency` computes the same product).
    """
    return _poles(poles) * slip_frequency(line_frequency, poles, shaft_speed)


def drive_output_frequency(poles: ArrayLike, shaft_speed: ArrayLike) -> np.ndarray:
    """Output frequency of a variable-frequency drive turning a motor at a speed.

    Parameters
    ----------
    poles : array_like
        Number of magnetic poles of the motor (2, 4, 6, ...) [unitless]; even.
    shaft_speed : array_like
        Motor shaft speed [Hz] (revolutions per second); not negative.

    Returns
    -------
    numpy.ndarray
        f_out = p N / 2 [Hz]: the supply frequency at which this speed is the
        synchronous speed (50 Hz for a 4-pole motor at 1500 rpm).

    Notes
    -----
    The inverse of :func:`synchronous_speed`, N_s = 2 f / p [1]_. An induction motor
    runs a few percent below synchronous speed (its slip), so the drive's output
    frequency is that much above p N / 2; the slip is neglected here (common practice
    for screening: it moves the forcing by the slip, 1-5 %, from memory).

    References
    ----------
    .. [1] IEC 60034-1, Rotating electrical machines - Part 1: Rating and performance
       (synchronous speed n_s = f / p, p pole pairs; clause from memory).
    """
    n = _non_negative("shaft speed", shaft_speed, "Hz")
    return _poles(poles) * n / 2.0


def drive_fed_magnetic_frequency(poles: ArrayLike, shaft_speed: ArrayLike) -> np.ndarray:
    """Magnetic forcing of a motor fed by a variable-frequency drive.

    Parameters
    ----------
    poles : array_like
        Number of magnetic poles of the motor [unitless]; even.
    shaft_speed : array_like
        Motor shaft speed [Hz]; not negative.

    Returns
    -------
    numpy.ndarray
        2 f_out = p N [Hz]: twice the drive's output frequency, which tracks the speed
        (60 to 98.7 Hz for a 4-pole motor from 900 to 1480 rpm).

    Notes
    -----
    The magnetic pull peaks twice per electrical cycle (:func:`twice_line_frequency`);
    on a drive the electrical cycle is the drive's output, f_out = p N / 2
    (:func:`drive_output_frequency`), so the forcing is p N, the pole count times the
    speed in revolutions per second. Slip neglected (see there).
    """
    return 2.0 * drive_output_frequency(poles, shaft_speed)


INVERTER_TORQUE_HARMONICS = (6, 12)
"""Torque pulsation of a motor on a six-pulse inverter, in multiples of the drive's output
frequency [unitless]: the 5th and 7th current harmonics give a 6th torque harmonic, the
11th and 13th a 12th (from memory: the classic result for six-step inverters, e.g.
B. K. Bose, Modern Power Electronics and AC Drives, Prentice Hall, 2002, ch. 5). Pulse-
width-modulated drives reduce these pulsations but do not remove them (from memory)."""


# ------------------------------------------------------- reciprocating machines


def _strokes(strokes) -> int:
    if strokes not in (2, 4):
        raise ValueError(f"strokes must be 2 or 4, got {strokes!r}")
    return int(strokes)


def firing_frequency(cylinders: ArrayLike, shaft_speed: ArrayLike, strokes: int = 4) -> np.ndarray:
    """Firing frequency of a reciprocating engine.

    Parameters
    ----------
    cylinders : array_like
        Number of cylinders [unitless].
    shaft_speed : array_like
        Crankshaft speed [Hz]; not negative.
    strokes : {4, 2}, default 4
        Four-stroke (one firing per cylinder every two revolutions) or two-stroke
        (one every revolution) [unitless].

    Returns
    -------
    numpy.ndarray
        Four-stroke: cylinders x N / 2 (cylinders x rpm / 120);
        two-stroke: cylinders x N (cylinders x rpm / 60) [Hz].

    Notes
    -----
    For evenly spaced firing (common practice). See
    :func:`engine_excitation_orders` for the other orders an engine excites.
    """
    z = _count("cylinder count", cylinders)
    n = _non_negative("shaft speed", shaft_speed, "Hz")
    return z * n * (2.0 / _strokes(strokes))


def compressor_pulsation_frequency(
    cylinders: ArrayLike, shaft_speed: ArrayLike, double_acting: bool = False
) -> np.ndarray:
    """Compression (gas pulse) frequency of a reciprocating compressor.

    Parameters
    ----------
    cylinders : array_like
        Number of cylinders [unitless].
    shaft_speed : array_like
        Crankshaft speed [Hz]; not negative.
    double_acting : bool, default False
        True if each cylinder compresses on both sides of its piston [-].

    Returns
    -------
    numpy.ndarray
        cylinders x N for single-acting, 2 x cylinders x N for double-acting cylinders
        [Hz].

    Notes
    -----
    A compressor cylinder completes its cycle in one revolution, so it pulses like a
    two-stroke engine; the crank-throw orders 1x and 2x (unbalanced reciprocating
    forces) come in addition (common practice).
    """
    z = _count("cylinder count", cylinders)
    n = _non_negative("shaft speed", shaft_speed, "Hz")
    return z * n * (2.0 if double_acting else 1.0)


class EngineOrders(NamedTuple):
    """Excitation orders of a reciprocating engine [unitless]."""

    orders: np.ndarray
    """Every order the engine can excite up to the limit: multiples of 1/2 for a
    four-stroke, of 1 for a two-stroke engine [unitless]."""
    firing_orders: np.ndarray
    """The firing order and its multiples: cylinders / 2 x k (four-stroke) or
    cylinders x k (two-stroke), the strongest gas-torque orders [unitless]."""


def engine_excitation_orders(
    cylinders: int, strokes: int = 4, max_order: float = 12.0
) -> EngineOrders:
    """Orders of crankshaft speed that a reciprocating engine excites.

    Parameters
    ----------
    cylinders : int
        Number of cylinders [unitless].
    strokes : {4, 2}, default 4
        Four-stroke or two-stroke cycle [unitless].
    max_order : float, default 12
        Highest order to list [unitless]; positive.

    Returns
    -------
    EngineOrders
        ``orders`` (all excited orders) and ``firing_orders`` (the firing order and
        its multiples), each ascending, up to ``max_order`` [unitless].

    Notes
    -----
    A four-stroke cycle spans two revolutions, so the gas torque of each cylinder
    repeats every two revolutions and contains all half orders 0.5, 1, 1.5, ...; with
    evenly spaced firing the cylinders' contributions add at the firing order
    cylinders / 2 and its multiples (the "major orders") and largely cancel elsewhere.
    A two-stroke cycle spans one revolution: integer orders, major orders at
    multiples of the cylinder count. (Common practice; from memory:
    C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
    McGraw-Hill, 2002, ch. 38.)

    Examples
    --------
    >>> engine_excitation_orders(6, 4, 9).firing_orders
    array([3., 6., 9.])
    """
    z = float(_count("cylinder count", cylinders))
    step = 2.0 / _strokes(strokes)  # 0.5 for four-stroke, 1 for two-stroke
    top = float(_positive("maximum order", max_order, ""))
    orders = step * np.arange(1, int(np.floor(top / step + 1e-9)) + 1)
    firing_step = z * step
    firing = firing_step * np.arange(1, int(np.floor(top / firing_step + 1e-9)) + 1)
    return EngineOrders(orders=orders, firing_orders=firing)

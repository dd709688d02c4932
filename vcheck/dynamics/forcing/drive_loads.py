"""Loads a drive puts on the frame of a machine: torque reaction and belt pull.

Torque reaction
---------------
A machine that turns a shaft carries, on its frame, the reaction of the torque its
internals put on the rotor: the stator of a motor, the block of an engine, the casing of
a pump. Its mean is the mean torque, set by power and speed (:func:`mean_torque`); a
reciprocating engine adds a fluctuation at its firing orders (:func:`firing_orders`,
:func:`firing_torque_fluctuation`). :func:`torque_reaction` gives both as a moment about
the shaft axis x.

Sign: torques are components about +x by the right-hand rule (machine axes of
:mod:`vcheck.dynamics.modes.rigid_mounts`). ``mean_torque`` is the torque the machine's
internals put on its rotor: for a driver it acts in the sense of rotation, for a driven
machine (a pump, a compressor) against it. The frame gets minus that. The crank
mechanisms of :mod:`.crank` turn clockwise seen from the +x end (angular velocity along
-x), so an engine of that module delivering 500 N m has ``mean_torque = -500`` and a
reaction of +500 N m about +x.

Belt pull
---------
A belt drive pulls the shafts of both pulleys towards each other with the sum (or, for
a wrap other than 180 degrees, the vector sum) of its tight- and slack-side tensions.
The tension difference is the effective pull that carries the power; the ratio of the
tensions is limited by friction (Euler-Eytelwein) or chosen by the belt maker's rules.
"""

from __future__ import annotations

import math
from types import MappingProxyType
from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

from ..isolation.damping import _checked, _format_number

__all__ = [
    "BELT_TENSION_RATIOS",
    "FIRING_TORQUE_FLUCTUATION",
    "BeltTensions",
    "FiringOrders",
    "TorqueHarmonic",
    "belt_effective_pull",
    "belt_shaft_load",
    "belt_tensions",
    "belt_tension_ratio",
    "belt_tension_ratio_capstan",
    "firing_orders",
    "firing_torque_fluctuation",
    "mean_torque",
    "torque_reaction",
]

FIRING_TORQUE_FLUCTUATION = MappingProxyType(
    {
        4: (2.0, 1.9, 1.7, 1.4, 1.2, 1.0, 0.8, 0.65, 0.5, 0.4,
            0.3, 0.25, 0.2, 0.15, 0.12, 0.1, 0.08, 0.06, 0.05, 0.04),
        2: (1.9, 1.4, 1.0, 0.65, 0.4, 0.25, 0.15, 0.1, 0.06, 0.04,
            0.03, 0.02, 0.02, 0.02, 0.02, 0.02, 0.02, 0.02, 0.02, 0.02),
    }
)
"""Gas-torque fluctuation at the major firing order over mean torque, strokes -> values
for 1 to 20 cylinders [unitless].

Amplitude of the torque harmonic at the major firing order (:func:`firing_orders`)
divided by the mean torque, for an evenly firing engine at full load. With even firing
every cylinder's harmonic at that order adds in phase, so the value is that of one
cylinder's gas torque at that order: it falls with cylinder count because the order
rises. A two-stroke with n cylinders is given the value of a four-stroke with 2n (the
same order of one firing pulse, the mean doubled with the harmonic); values are floored
at 0.02, where combustion roughness rather than the shape of the pressure curve governs.

Rough screening values from memory of the trade's tangential-pressure harmonic data,
not read from a published table; their fall with order was checked against a simple
single-zone cylinder-pressure model (compression ratio 16, Wiebe heat release), not
against measurements. Inertia torque (orders 1 to 4, growing with speed squared) is not
included. The engine maker's torque harmonics govern whenever they are available.
"""

BELT_TENSION_RATIOS = MappingProxyType(
    {
        "flat": 2.5,
        "v-belt": 5.0,
        "poly-v": 4.0,
        "synchronous": 8.0,
    }
)
"""Typical design ratio T1/T2 of tight- to slack-side tension at 180 degrees of wrap,
by belt kind [unitless].

Flat belts 2 to 3 (e^(mu theta) with mu about 0.3, 2.57 at 180 degrees); classical and
narrow V-belts about 5; ribbed (poly-V) belts about 4; synchronous (toothed) belts,
which do not rely on friction and run with little slack-side tension, about 8 or more.
From memory of belt makers' design manuals (not read); the belt maker's installation
tension governs when known.
"""


class FiringOrders(NamedTuple):
    """Torque orders of a reciprocating engine [unitless]."""

    major: float
    """Major firing order: cylinders / 2 (four-stroke) or cylinders (two-stroke)."""
    cycle: float
    """Order of one working cycle: 0.5 (four-stroke, the half order excited by
    differences between cylinders) or 1 (two-stroke)."""


class TorqueHarmonic(NamedTuple):
    """A harmonic of moment on the frame [N m]."""

    order: float
    """Order of shaft speed [unitless]."""
    moment: np.ndarray
    """Complex amplitude (about x, y, z), shape (3,) [N m]: the moment at shaft speed
    omega [rad/s] is Re(moment * exp(1j * order * omega * t))."""


class BeltTensions(NamedTuple):
    """Working tensions of a belt drive [N]."""

    tight_side: float
    """Tight-side tension T1 [N]."""
    slack_side: float
    """Slack-side tension T2 [N]."""


# --------------------------------------------------------------------------- checks


def _strokes(strokes) -> int:
    if isinstance(strokes, bool) or strokes not in (2, 4):
        raise ValueError(f"strokes must be 2 or 4, got {strokes!r}")
    return int(strokes)


def _cylinders(cylinders) -> int:
    ok = (
        not isinstance(cylinders, bool)
        and isinstance(cylinders, (int, float, np.number))
        and math.isfinite(cylinders)
        and cylinders == round(cylinders)
        and 1 <= cylinders <= 20
    )
    if not ok:
        raise ValueError(f"cylinders must be a whole number from 1 to 20, got {cylinders!r}")
    return int(cylinders)


# --------------------------------------------------------------------------- torque


def mean_torque(power: ArrayLike, speed: ArrayLike):
    """Mean shaft torque of a machine from its power and speed.

    Parameters
    ----------
    power : array_like
        Shaft power, at least 0 [W].
    speed : array_like
        Shaft speed f, positive [Hz] (revolutions per second; 1500 rpm is 25 Hz).

    Returns
    -------
    numpy.ndarray
        Mean torque T [N m].

    Notes
    -----
    .. math:: T = \\frac{P}{\\omega} = \\frac{P}{2 \\pi f}

    from P = T omega. In trade units T [N m] = 9549 P [kW] / n [rpm].

    References
    ----------
    .. [1] J. L. Meriam, L. G. Kraige, Engineering Mechanics: Dynamics, 7th ed., Wiley,
       2012, ch. 6, power of a couple, P = M omega (from memory).

    Examples
    --------
    >>> print(f"{mean_torque(75e3, 25.0):.2f}")
    477.46
    """
    p = _checked(power, "power", low=0.0)
    f = _checked(speed, "speed", low=0.0, low_inclusive=False)
    return p / (2.0 * np.pi * f)


def firing_orders(cylinders: int, strokes: int) -> FiringOrders:
    """Major firing order and cycle order of a reciprocating engine.

    Parameters
    ----------
    cylinders : int
        Number of cylinders, 1 to 20 [unitless].
    strokes : {4, 2}
        Four-stroke or two-stroke cycle [unitless].

    Returns
    -------
    FiringOrders
        ``major`` and ``cycle`` orders of crankshaft speed [unitless].

    Notes
    -----
    A four-stroke cylinder fires once every two revolutions, a two-stroke once a
    revolution; with n cylinders firing evenly the gas torque repeats n/2 or n times a
    revolution (common practice; firing frequency n rpm / 120 or n rpm / 60).

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 38 (from memory).

    Examples
    --------
    >>> firing_orders(6, 4)
    FiringOrders(major=3.0, cycle=0.5)
    """
    n = _cylinders(cylinders)
    stroke = _strokes(strokes)
    cycle = 2.0 / stroke
    return FiringOrders(major=n * cycle, cycle=cycle)


def firing_torque_fluctuation(cylinders: int, strokes: int) -> float:
    """Screening default for the firing-order torque fluctuation of an engine.

    Parameters
    ----------
    cylinders : int
        Number of cylinders, 1 to 20 [unitless].
    strokes : {4, 2}
        Four-stroke or two-stroke cycle [unitless].

    Returns
    -------
    float
        Amplitude of the torque harmonic at the major firing order over the mean
        torque [unitless], from :data:`FIRING_TORQUE_FLUCTUATION`.

    Notes
    -----
    A screening default only (from memory, rough): the engine maker's torque harmonics
    govern. The torque at the major order k is then
    T(t) = T_mean (1 + ratio cos(k omega t)) with an arbitrary phase.

    References
    ----------
    .. [1] See :data:`FIRING_TORQUE_FLUCTUATION` (from memory, not read from a table).

    Examples
    --------
    >>> firing_torque_fluctuation(6, 4)
    1.0
    """
    n = _cylinders(cylinders)
    return FIRING_TORQUE_FLUCTUATION[_strokes(strokes)][n - 1]


def torque_reaction(
    mean_torque: float, fluctuation_ratio: float, order: float
) -> tuple[float, TorqueHarmonic]:
    """Moment on a machine's frame from the torque it puts on its rotor.

    Parameters
    ----------
    mean_torque : float
        Mean torque the machine's internals put on its rotor, as a component about +x
        (right-hand rule); see the module docstring for the sign [N m].
    fluctuation_ratio : float
        Amplitude of the torque harmonic over the mean torque, at least 0 (for example
        :func:`firing_torque_fluctuation`; 0 for a smooth drive) [unitless].
    order : float
        Order of shaft speed of the harmonic, positive (for example the major firing
        order from :func:`firing_orders`) [unitless].

    Returns
    -------
    static_moment_x : float
        Steady moment on the frame about +x [N m]: minus ``mean_torque``.
    harmonic : TorqueHarmonic
        ``order`` and ``moment`` (3,) complex [N m]: (-mean_torque * fluctuation_ratio,
        0, 0), the harmonic of the reaction, with zero phase at t = 0.

    Notes
    -----
    The frame carries the opposite of the torque on the rotor (Newton's third law):

    .. math:: M_x(t) = -T(t) = -T_{mean} \\left(1 + \\rho \\cos(k \\omega t)\\right)

    The phase of the harmonic is set to zero: a single order's phase matters only when
    it is combined with other loads of known phase, for which the maker's harmonic
    data are needed.

    References
    ----------
    .. [1] J. P. Den Hartog, Mechanical Vibrations, 4th ed., McGraw-Hill, 1956 (Dover
       reprint 1985), ch. 5, torque reaction of engines on their foundations (from
       memory).

    Examples
    --------
    >>> static, harmonic = torque_reaction(-500.0, 1.0, 3.0)
    >>> print(static, harmonic.moment.real)
    500.0 [500.   0.   0.]
    """
    torque = float(mean_torque)
    if not math.isfinite(torque):
        raise ValueError(f"mean torque must be a finite number, got {_format_number(torque)}")
    ratio = float(_checked(fluctuation_ratio, "fluctuation ratio", low=0.0))
    k = float(_checked(order, "order", low=0.0, low_inclusive=False))
    moment = np.array([-torque * ratio, 0.0, 0.0], dtype=complex)
    return -torque + 0.0, TorqueHarmonic(order=k, moment=moment)


# --------------------------------------------------------------------------- belts


def belt_effective_pull(power: ArrayLike, pulley_diameter: ArrayLike, speed: ArrayLike):
    """Effective pull of a belt drive: the tension difference that carries the power.

    Parameters
    ----------
    power : array_like
        Power transmitted, at least 0 [W].
    pulley_diameter : array_like
        Pitch diameter of a pulley, positive [m].
    speed : array_like
        Speed of that pulley, positive [Hz].

    Returns
    -------
    numpy.ndarray
        Effective pull F_e = T1 - T2 [N].

    Notes
    -----
    .. math:: F_e = \\frac{P}{v}, \\qquad v = \\pi D f

    with v the belt speed; the same at either pulley.

    References
    ----------
    .. [1] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., McGraw-Hill, 2015, ch. 17, flexible mechanical elements (from memory).

    Examples
    --------
    >>> print(f"{belt_effective_pull(15e3, 0.2, 1460 / 60):.1f}")
    981.1
    """
    p = _checked(power, "power", low=0.0)
    d = _checked(pulley_diameter, "pulley diameter", low=0.0, low_inclusive=False)
    f = _checked(speed, "speed", low=0.0, low_inclusive=False)
    return p / (np.pi * d * f)


def belt_tension_ratio(kind: str) -> float:
    """Typical design tension ratio T1/T2 of a belt kind at 180 degrees of wrap.

    Parameters
    ----------
    kind : str
        A key of :data:`BELT_TENSION_RATIOS`: "flat", "v-belt", "poly-v" or
        "synchronous" [unitless].

    Returns
    -------
    float
        Tension ratio [unitless].

    References
    ----------
    .. [1] Belt makers' design manuals, as summarised in :data:`BELT_TENSION_RATIOS`
       (from memory).

    Examples
    --------
    >>> belt_tension_ratio("v-belt")
    5.0
    """
    try:
        return BELT_TENSION_RATIOS[kind]
    except (KeyError, TypeError):
        known = ", ".join(sorted(BELT_TENSION_RATIOS))
        raise ValueError(f"unknown belt kind {kind!r}; known kinds are {known}") from None


def belt_tension_ratio_capstan(friction: ArrayLike, wrap_angle: ArrayLike):
    """Limiting tension ratio of a belt on the point of slipping (Euler-Eytelwein).

    Parameters
    ----------
    friction : array_like
        Coefficient of friction mu between belt and pulley, at least 0; for a V-belt
        use the effective value mu / sin(groove angle / 2) [unitless].
    wrap_angle : array_like
        Angle of wrap theta of the belt on the pulley, positive [rad].

    Returns
    -------
    numpy.ndarray
        T1 / T2 at which the belt slips [unitless].

    Notes
    -----
    An element of belt d theta long, pressed on the pulley by the normal force
    dN = T d theta and about to slip, has dT = mu dN, so dT / d theta = mu T and

    .. math:: T_1 / T_2 = e^{\\mu \\theta}

    (centrifugal tension neglected, or subtracted from both tensions). A design ratio
    is below the limiting one, to keep a margin against slip.

    References
    ----------
    .. [1] L. Euler, Remarques sur l'effet du frottement dans l'equilibre, Memoires de
       l'Academie des Sciences de Berlin, 1762; the capstan equation as given in
       Budynas and Nisbett, Shigley's Mechanical Engineering Design, 10th ed., ch. 17
       (from memory).

    Examples
    --------
    >>> print(f"{belt_tension_ratio_capstan(0.3, 3.141592653589793):.3f}")
    2.566
    """
    mu = _checked(friction, "friction coefficient", low=0.0)
    theta = _checked(wrap_angle, "wrap angle", low=0.0, low_inclusive=False)
    return np.exp(mu * theta)


def belt_tensions(effective_pull: float, tension_ratio: float) -> BeltTensions:
    """Tight- and slack-side tensions of a belt from its effective pull and tension ratio.

    Parameters
    ----------
    effective_pull : float
        Effective pull F_e = T1 - T2, at least 0 (:func:`belt_effective_pull`) [N].
    tension_ratio : float
        T1 / T2, above 1 (:func:`belt_tension_ratio` or
        :func:`belt_tension_ratio_capstan`) [unitless].

    Returns
    -------
    BeltTensions
        ``tight_side`` T1 and ``slack_side`` T2 [N].

    Notes
    -----
    Solving T1 - T2 = F_e and T1 / T2 = R:

    .. math:: T_1 = F_e \\frac{R}{R - 1}, \\qquad T_2 = \\frac{F_e}{R - 1}

    These are the working tensions; centrifugal tension adds equally to both (it does
    not load the shaft, being balanced within the wrapped belt).

    References
    ----------
    .. [1] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., McGraw-Hill, 2015, ch. 17, flat- and V-belt forces (from memory).

    Examples
    --------
    >>> belt_tensions(1000.0, 5.0)
    BeltTensions(tight_side=1250.0, slack_side=250.0)
    """
    pull = float(_checked(effective_pull, "effective pull", low=0.0))
    ratio = float(tension_ratio)
    if not (math.isfinite(ratio) and ratio > 1.0):
        raise ValueError(f"tension ratio must be above 1, got {_format_number(ratio)}")
    return BeltTensions(tight_side=pull * ratio / (ratio - 1.0), slack_side=pull / (ratio - 1.0))


def belt_shaft_load(
    effective_pull: float, tension_ratio: float, wrap_angle: float | None = None
) -> float:
    """Load of a belt drive on a pulley's shaft, from its two span tensions.

    Parameters
    ----------
    effective_pull : float
        Effective pull F_e = T1 - T2, at least 0 (:func:`belt_effective_pull`) [N].
    tension_ratio : float
        T1 / T2, above 1 [unitless].
    wrap_angle : float, optional
        Wrap angle theta of the belt on this pulley, above 0 and at most 2 pi. Without
        it the two spans are taken as parallel (theta = pi), which gives the largest
        load, T1 + T2 [rad].

    Returns
    -------
    float
        Magnitude of the resultant of the two span tensions on the pulley, the load on
        its shaft [N].

    Notes
    -----
    With T1, T2 from :func:`belt_tensions`: the spans leave the pulley along the
    tangents at the two ends of the wrap, whose directions differ by pi - theta, so the
    shaft load is their vector sum

    .. math:: F_s = \\sqrt{T_1^2 + T_2^2 - 2 T_1 T_2 \\cos\\theta}

    which is T1 + T2 at theta = pi. It lies along the bisector of the spans, towards the
    other pulley for equal pulleys. Installation tension above the working T2 adds to
    both sides and is not included.

    References
    ----------
    .. [1] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., McGraw-Hill, 2015, ch. 17, flat- and V-belt forces (from memory).

    Examples
    --------
    >>> print(belt_shaft_load(1000.0, 5.0), f"{belt_shaft_load(1000.0, 5.0, 2.5):.1f}")
    1500.0 1458.0
    """
    tight, slack = belt_tensions(effective_pull, tension_ratio)
    if wrap_angle is None:
        return tight + slack
    theta = float(wrap_angle)
    if not (0.0 < theta <= 2.0 * np.pi):
        raise ValueError(
            f"wrap angle must be above 0 and at most 2 pi rad, got {_format_number(theta)}"
        )
    return math.sqrt(max(tight**2 + slack**2 - 2.0 * tight * slack * math.cos(theta), 0.0))

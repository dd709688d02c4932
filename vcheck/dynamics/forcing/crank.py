"""Free forces and moments of crank mechanisms (reciprocating engines and compressors).

The inertia of a crank mechanism's moving parts shakes its frame. This module gives the
shaking force and the shaking moment of a multi-cylinder machine, order by order of
crank speed, from its geometry and its reciprocating and rotating masses. Gas forces
are internal to the machine and do not appear here, except through the torque reaction
about the shaft (:mod:`.drive_loads`).

Axes, angles and phase
----------------------
Machine axes as in :mod:`vcheck.dynamics.modes.rigid_mounts`: x along the crankshaft,
y across it (horizontal), z vertical, up. The crankshaft axis is the x axis.

- Every angle is in radians and measured in the y-z plane **from +z towards +y**.
- A cylinder's *bank angle* beta is the direction of its cylinder line, from the
  crankshaft outwards to the cylinder head: an upright inline engine has beta = 0, a vee
  has banks at -vee/2 and +vee/2, an opposed (boxer) machine at -pi/2 and +pi/2.
- A throw's *crank angle* phi is the angle of its crankpin at the instant t = 0, at
  which the throw of cylinder 1 is at 0 (pointing along +z).
- The crankshaft turns in the same sense as the angles: from +z towards +y, which is
  clockwise when seen from the +x end (angular velocity along -x). The throw of a
  cylinder is at angle phi + omega t; its piston is at top dead centre when that equals
  the bank angle. For a machine that turns the other way, mirror it in the x-z plane:
  negate the bank and crank angles, then negate the y components of the forces and the
  z components of the moments returned.
- Complex amplitudes: a quantity of order k with coefficient c is
  Re(c omega^2 exp(1j k omega t)) at crank speed omega [rad/s].

Signs: the force and moment are those the moving parts' inertia puts on the frame,
minus the rate of change of their momentum (and of its moment). At top dead centre the
reciprocating parts pull the frame outwards along the cylinder line.
"""

from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

from ..isolation.damping import _checked, _format_number

__all__ = [
    "CrankHarmonic",
    "COVERED_CYLINDER_COUNTS",
    "INLINE_CRANK_ANGLES_DEGREES",
    "OPPOSED_PAIR_ANGLES_DEGREES",
    "VEE_THROW_ANGLES_DEGREES",
    "crank_free_loads",
    "slider_crank_harmonics",
    "standard_crank_angles",
]

INLINE_CRANK_ANGLES_DEGREES = {
    4: {
        1: (0.0,),
        2: (0.0, 0.0),
        3: (0.0, 240.0, 120.0),
        4: (0.0, 180.0, 180.0, 0.0),
        5: (0.0, 144.0, 288.0, 72.0, 216.0),
        6: (0.0, 120.0, 240.0, 240.0, 120.0, 0.0),
        8: (0.0, 180.0, 90.0, 270.0, 270.0, 90.0, 180.0, 0.0),
    },
    2: {n: tuple(360.0 * i / n for i in range(n)) for n in (1, 2, 3, 4, 5, 6, 8)},
}
"""Default crank angles of inline machines, strokes -> cylinders -> angles [degree].

Cylinders are numbered from the x = 0 end. Four-stroke: the single cylinder; the
parallel twin with both throws together (360-degree crank, even firing; 180- and
270-degree twins exist and must be given explicitly); the three with throws 120 degrees
apart; the flat-plane four (0, 180, 180, 0); the five with throws 72 degrees apart
(firing order 1-2-4-5-3); the mirror-symmetric six (0, 120, 240, 240, 120, 0); the
mirror-symmetric eight (0, 180, 90, 270, 270, 90, 180, 0). Two-stroke: throws evenly
spaced by 360/n degrees in cylinder order (real two-stroke crankshafts often order the
throws differently to reduce the rocking moments). Common practice, from memory; the
design's own crank angles win whenever they are stated.
"""

VEE_THROW_ANGLES_DEGREES = {
    4: {
        1: (0.0,),
        2: (0.0, 180.0),
        3: (0.0, 240.0, 120.0),
        4: (0.0, 90.0, 270.0, 180.0),
        5: (0.0, 144.0, 288.0, 72.0, 216.0),
        6: (0.0, 120.0, 240.0, 240.0, 120.0, 0.0),
        8: (0.0, 180.0, 90.0, 270.0, 270.0, 90.0, 180.0, 0.0),
    },
    2: {n: tuple(360.0 * i / n for i in range(n)) for n in (1, 2, 3, 4, 5, 6, 8)},
}
"""Default throw angles of vee machines, strokes -> throws -> angles [degree].

Each throw carries two cylinders, one per bank, side by side (connecting rods on a
shared crankpin). The vee twin has one throw; the four-stroke vee four two throws
180 degrees apart; the vee eight the cross-plane crankshaft (0, 90, 270, 180), the
common automotive layout; the vee six, ten, twelve and sixteen the throws of the inline
three, five, six and eight above. Two-stroke: throws evenly spaced by 360/throws
degrees. Common practice, from memory; split crankpins (as on many 60- and 90-degree
vee sixes) and flat-plane vee eights are not defaults: give their crank angles
explicitly.
"""

OPPOSED_PAIR_ANGLES_DEGREES = {
    4: {1: (0.0,), 2: (0.0, 180.0), 3: (0.0, 120.0, 240.0)},
    2: {n: tuple(360.0 * i / n for i in range(n)) for n in (1, 2, 3)},
}
"""Default throw angles of opposed (boxer) machines, strokes -> pairs -> angles [degree].

Each pair is two opposite cylinders, one per bank, on two throws 180 degrees apart:
the cylinder of the -90-degree bank on the throw listed, the one of the +90-degree bank
on the throw 180 degrees from it. The flat twin has one pair; the flat four two pairs
(crank throws 0, 180, 180, 0); the flat six three pairs 120 degrees apart; as
four-strokes all three fire evenly. Two-stroke: pairs evenly spaced by 360/pairs
degrees; the two pistons of a pair reach their outer dead centres together, so a
two-stroke pair fires at once. Common practice, from memory; the design's own crank
angles win whenever they are stated.
"""

COVERED_CYLINDER_COUNTS = {
    "inline": tuple(sorted(INLINE_CRANK_ANGLES_DEGREES[4])),
    "vee": tuple(2 * n for n in sorted(VEE_THROW_ANGLES_DEGREES[4])),
    "opposed": tuple(2 * n for n in sorted(OPPOSED_PAIR_ANGLES_DEGREES[4])),
}
"""Cylinder counts :func:`standard_crank_angles` covers, by arrangement [unitless]."""

_ZERO_SHARE = 1e-12  # a resultant below this share of the largest single term is zero
_MAX_SERIES_TERMS = 1_000_000


class CrankHarmonic(NamedTuple):
    """Free force and moment of a crank mechanism at one order of crank speed.

    Both are per unit crank speed squared: at crank speed omega [rad/s] the force is
    Re(force * omega**2 * exp(1j * order * omega * t)) in machine axes, and likewise
    the moment.
    """

    order: float
    """Order of crank speed, events per revolution [unitless]."""
    force: np.ndarray
    """Shaking force coefficient (x, y, z), shape (3,), complex [N s^2] = [kg m]."""
    moment: np.ndarray
    """Shaking moment coefficient (about x, y, z) about the reference point on the
    crankshaft axis, shape (3,), complex [N m s^2] = [kg m^2]; the x component (the
    torque about the shaft) is left out and is always 0."""


# --------------------------------------------------------------------------- checks


def _orders(orders) -> list[int]:
    values = np.atleast_1d(np.asarray(orders, dtype=float))
    if values.ndim != 1 or values.size == 0:
        raise ValueError("orders must be a list of whole numbers of at least 1, got none")
    for value in values:
        if not (np.isfinite(value) and value >= 1 and value == round(value)):
            raise ValueError(
                f"orders must be whole numbers of at least 1, got {_format_number(value)}"
            )
    return [int(v) for v in values]


def _per_cylinder(name: str, value: ArrayLike, unit: str) -> np.ndarray:
    arr = np.atleast_1d(np.asarray(value, dtype=float))
    if arr.ndim != 1 or arr.size == 0:
        raise ValueError(f"{name} must be a list with one value per cylinder [{unit}]")
    bad = ~np.isfinite(arr)
    if np.any(bad):
        got = _format_number(float(arr[bad][0]))
        raise ValueError(f"{name} must be finite numbers, got {got}")
    return arr


def _mass(name: str, value: ArrayLike, n: int) -> np.ndarray:
    arr = np.asarray(value, dtype=float)
    if arr.ndim > 1 or (arr.ndim == 1 and arr.size != n):
        raise ValueError(
            f"{name} must be one value or one value per cylinder ({n}), got {arr.size}"
        )
    arr = _checked(arr, name, low=0.0)
    return np.broadcast_to(arr, (n,)).astype(float)


# --------------------------------------------------------------------------- harmonics


def _log_gamma(values: np.ndarray) -> np.ndarray:
    """math.lgamma of each value, as a float array (what np.vectorize(math.lgamma) gives,
    without its per-call set-up)."""
    return np.array([math.lgamma(v) for v in values.tolist()], dtype=float)


def _series_coefficient(crank_ratio: float, order: int) -> float:
    """Exact Fourier coefficient A_k of an even order k >= 2, by the binomial series."""
    if crank_ratio == 0.0:
        return 0.0
    j = order // 2
    log_ratio = math.log(crank_ratio)
    # enough terms for the last to be e^-46 (~1e-20) of the first, allowing for the
    # 4^-j smallness of the first term relative to the later ones
    terms = j + math.ceil((46.0 + j * math.log(4.0)) / (-2.0 * log_ratio)) + 10
    last = min(terms, j + _MAX_SERIES_TERMS)
    n = np.arange(j, last + 1, dtype=float)
    log_2n_factorial = _log_gamma(2.0 * n + 1.0)
    log_c = log_2n_factorial - 2.0 * _log_gamma(n + 1.0) - np.log(2.0 * n - 1.0)
    log_d = (math.log(2.0) + log_2n_factorial - _log_gamma(n - j + 1.0)
             - _log_gamma(n + j + 1.0))
    log_terms = log_c + log_d - 4.0 * n * math.log(2.0) + (2.0 * n - 1.0) * log_ratio
    sign = -1.0 if j % 2 == 0 else 1.0  # (-1) from c_n times (-1)^j from sin^(2n)
    return sign * order * order * float(np.sum(np.exp(log_terms)))


def slider_crank_harmonics(crank_ratio: float, orders: ArrayLike = (1, 2, 4, 6, 8)) -> np.ndarray:
    """Fourier coefficients of the exact piston acceleration of a slider crank.

    Parameters
    ----------
    crank_ratio : float
        lambda = r / l, crank radius over connecting-rod length (centre to centre), at
        least 0 and below 1 [unitless].
    orders : sequence of int, default (1, 2, 4, 6, 8)
        Orders k of crank speed, whole numbers of at least 1 [unitless].

    Returns
    -------
    numpy.ndarray
        A_k for each order, float, same length as ``orders`` [unitless]: A_1 = 1, odd
        orders above 1 are 0.

    Notes
    -----
    With the piston pin on the cylinder axis, the piston's distance from the crankshaft
    axis along the cylinder line (positive outwards, towards the cylinder head) is

    .. math:: s(\\theta) = r \\cos\\theta + \\sqrt{l^2 - r^2 \\sin^2\\theta}

    with theta the crank angle from top dead centre. At constant speed omega its
    acceleration, positive outwards, is

    .. math:: \\ddot s = -r \\omega^2 \\sum_k A_k \\cos k\\theta

    The square root is expanded as the binomial series
    sqrt(1 - u) = 1 - sum_n C(2n, n) u^n / ((2n - 1) 4^n), u = lambda^2 sin^2 theta, and
    each sin^(2n) theta into cosines of even multiples,
    sin^(2n) theta = 4^-n [C(2n, n) + 2 sum_j (-1)^j C(2n, n - j) cos 2j theta]. Summing
    the series for cos 2j theta and differentiating twice gives, for k = 2j,

    .. math:: A_k = (-1)^{j+1} \\frac{k^2}{\\lambda} \\sum_{n \\ge j}
              \\frac{2 \\binom{2n}{n} \\binom{2n}{n-j}}{(2n-1)\\, 16^n} \\lambda^{2n}

    all terms of one sign, summed here until they fall below about 1e-20 of the first
    (tens of terms for lambda of 0.2 to 0.4; at most a million, reached only for lambda
    above about 0.9999, where the result is truncated). The leading terms are the
    published series A_2 = lambda + lambda^3/4 + 15 lambda^5/128, A_4 = -(lambda^3/4 +
    3 lambda^5/16), A_6 = 9 lambda^5/128, A_8 = -5 lambda^7/256. Odd orders above 1 are
    absent because s(theta) contains only cos theta and even harmonics.

    References
    ----------
    .. [1] C. F. Taylor, The Internal-Combustion Engine in Theory and Practice, vol. 2,
       revised ed., MIT Press, 1985, ch. 8, balance of engines: series for piston
       acceleration (from memory).
    .. [2] R. L. Norton, Design of Machinery, 5th ed., McGraw-Hill, 2012, ch. 13,
       engine dynamics: piston position and acceleration (from memory).

    Examples
    --------
    >>> print(np.round(slider_crank_harmonics(0.25, (1, 2, 3, 4)), 6))
    [ 1.        0.254025  0.       -0.004098]
    """
    ratio = float(_checked(crank_ratio, "crank ratio", low=0.0, high=1.0))
    values = []
    for k in _orders(orders):
        if k == 1:
            values.append(1.0)
        elif k % 2:
            values.append(0.0)
        else:
            values.append(_series_coefficient(ratio, k))
    return np.array(values, dtype=float)


# --------------------------------------------------------------------------- free loads


def crank_free_loads(
    crank_radius: float,
    rod_length: float,
    reciprocating_mass: ArrayLike,
    rotating_mass: ArrayLike,
    cylinder_x: ArrayLike,
    crank_angles: ArrayLike,
    bank_angles: ArrayLike,
    orders: ArrayLike = (1, 2, 4, 6),
    reference_x: float = 0.0,
) -> tuple[CrankHarmonic, ...]:
    """Free (shaking) forces and moments of a multi-cylinder crank mechanism by order.

    Parameters
    ----------
    crank_radius : float
        Crank radius r, half the stroke, positive [m].
    rod_length : float
        Connecting-rod length l, centre to centre, longer than the crank radius [m].
    reciprocating_mass : float or array_like
        Reciprocating mass per cylinder (piston, pin, rings and the small-end share of
        the connecting rod), at least 0; one value for every cylinder or one per
        cylinder [kg].
    rotating_mass : float or array_like
        Unbalanced rotating mass per cylinder at crank radius (crankpin, big-end share
        of the rod, net of counterweights), at least 0; one value or one per cylinder
        [kg].
    cylinder_x : array_like
        Axial position of each cylinder line along the crankshaft [m].
    crank_angles : array_like
        Crank angle phi of each cylinder's throw at t = 0, measured from +z towards +y
        (see the module docstring) [rad].
    bank_angles : array_like
        Bank angle beta of each cylinder line, from +z towards +y [rad].
    orders : sequence of int, default (1, 2, 4, 6)
        Orders of crank speed to return [unitless].
    reference_x : float, default 0
        Axial position of the point (reference_x, 0, 0) on the crankshaft axis about
        which moments are taken [m].

    Returns
    -------
    tuple of CrankHarmonic
        One per order, in the order asked: ``order`` [unitless], ``force`` (3,) complex
        [N s^2] and ``moment`` (3,) complex [N m s^2], per unit crank speed squared.
        The force at crank speed omega [rad/s] is
        Re(force * omega**2 * exp(1j * order * omega * t)) [N]. Components below 1e-12
        of the largest single-cylinder term are set to exactly 0; orders with no
        resultant are kept, with zero amplitude.

    Raises
    ------
    ValueError
        For a rod not longer than the crank, negative masses, non-finite values, or
        per-cylinder lists of unequal length.

    Notes
    -----
    Cylinder i has its line along the unit vector e_i = (0, sin beta_i, cos beta_i) and
    its throw at angle phi_i + omega t, so its piston's crank angle from top dead centre
    is theta_i = omega t + phi_i - beta_i. With A_k from
    :func:`slider_crank_harmonics`, the reciprocating mass puts on the frame

    .. math:: F_{rec,i} = m_{rec,i}\\, r \\omega^2 \\sum_k A_k \\cos(k\\theta_i)\\, e_i

    whose order-k coefficient is m_rec,i r A_k exp(1j k (phi_i - beta_i)) e_i. The
    rotating mass adds the centrifugal force m_rot,i r omega^2 (0, sin, cos)(phi_i +
    omega t), coefficient m_rot,i r exp(1j phi_i) (0, -1j, 1), at order 1. Each force
    acts on a line through the point (x_i, 0, 0) of the crankshaft axis, so about the
    reference point it gives the moment (x_i - x_ref) e_x x F_i = (x_i - x_ref)
    (0, -F_z, F_y). The resultants are the sums over the cylinders. The torque about
    the shaft axis (inertia torque and gas torque) is not included: see
    :mod:`.drive_loads`.

    The rod is treated as two point masses (reciprocating and rotating shares), the
    usual simplification; the rod's remaining moment of inertia adds a small torque
    about x only.

    References
    ----------
    .. [1] C. F. Taylor, The Internal-Combustion Engine in Theory and Practice, vol. 2,
       revised ed., MIT Press, 1985, ch. 8, balance of multi-cylinder engines (from
       memory).
    .. [2] R. L. Norton, Design of Machinery, 5th ed., McGraw-Hill, 2012, ch. 13 and 14,
       shaking forces and moments of single- and multi-cylinder engines (from memory).
    .. [3] J. P. Den Hartog, Mechanical Vibrations, 4th ed., McGraw-Hill, 1956
       (Dover reprint 1985), ch. 5, balance of reciprocating engines (from memory).

    Examples
    --------
    A single upright cylinder, 50 mm crank, 200 mm rod, 1 kg reciprocating:

    >>> primary, secondary = crank_free_loads(0.05, 0.2, 1.0, 0.0, [0.0], [0.0], [0.0],
    ...                                       orders=(1, 2))
    >>> print(primary.force.real, round(secondary.force.real[2], 6))
    [0.   0.   0.05] 0.012701
    """
    r = float(_checked(crank_radius, "crank radius", low=0.0, low_inclusive=False))
    length = float(_checked(rod_length, "connecting rod length", low=0.0, low_inclusive=False))
    if not length > r:
        raise ValueError(
            "connecting rod length must be longer than the crank radius, got rod length "
            f"{_format_number(length)} m and crank radius {_format_number(r)} m"
        )
    x = _per_cylinder("cylinder positions", cylinder_x, "m")
    phi = _per_cylinder("crank angles", crank_angles, "rad")
    beta = _per_cylinder("bank angles", bank_angles, "rad")
    n = x.size
    for name, arr in (("crank angles", phi), ("bank angles", beta)):
        if arr.size != n:
            raise ValueError(
                f"{name} must have one value per cylinder ({n} cylinder positions), "
                f"got {arr.size}"
            )
    m_rec = _mass("reciprocating mass", reciprocating_mass, n)
    m_rot = _mass("rotating mass", rotating_mass, n)
    x_ref = float(reference_x)
    if not np.isfinite(x_ref):
        raise ValueError(f"reference position must be a finite number, got {x_ref:g} m")
    wanted = _orders(orders)
    coefficients = slider_crank_harmonics(r / length, wanted)

    lines = np.stack([np.zeros(n), np.sin(beta), np.cos(beta)], axis=1)  # (n, 3)
    arm = x - x_ref
    results = []
    for k, a_k in zip(wanted, coefficients):
        per_cylinder = (m_rec * r * a_k * np.exp(1j * k * (phi - beta)))[:, None] * lines
        if k == 1:
            spin = np.array([0.0, -1j, 1.0])
            per_cylinder = per_cylinder + (m_rot * r * np.exp(1j * phi))[:, None] * spin
        moments = arm[:, None] * np.stack(
            [np.zeros(n, complex), -per_cylinder[:, 2], per_cylinder[:, 1]], axis=1
        )
        force = per_cylinder.sum(axis=0)
        moment = moments.sum(axis=0)
        largest = np.max(np.abs(per_cylinder), initial=0.0)
        results.append(
            CrankHarmonic(
                order=float(k),
                force=_clean(force, largest),
                moment=_clean(moment, largest * np.max(np.abs(arm), initial=0.0)),
            )
        )
    return tuple(results)


def _clean(vector: np.ndarray, scale: float) -> np.ndarray:
    """Set real and imaginary parts below _ZERO_SHARE * scale to exactly 0."""
    tol = _ZERO_SHARE * scale
    real = np.where(np.abs(vector.real) <= tol, 0.0, vector.real)
    imag = np.where(np.abs(vector.imag) <= tol, 0.0, vector.imag)
    return real + 1j * imag


# --------------------------------------------------------------------------- layouts


def standard_crank_angles(
    cylinders: int, strokes: int, arrangement: str, vee_angle: float | None = None
) -> tuple[np.ndarray, np.ndarray]:
    """Default crank and bank angles of common cylinder arrangements.

    Parameters
    ----------
    cylinders : int
        Number of cylinders; see :data:`COVERED_CYLINDER_COUNTS` [unitless].
    strokes : {4, 2}
        Four-stroke or two-stroke cycle [unitless].
    arrangement : {"inline", "vee", "opposed"}
        Upright inline (bank angle 0); vee (two banks at -vee/2 and +vee/2, two
        cylinders per throw); opposed (banks at -pi/2 and +pi/2, each opposite pair on
        throws 180 degrees apart, as a boxer) [unitless].
    vee_angle : float, optional
        Angle between the banks of a vee, above 0 and below pi; required for a vee
        [rad].

    Returns
    -------
    crank_angles, bank_angles : numpy.ndarray
        One value per cylinder [rad], in the conventions of :func:`crank_free_loads`.
        Inline: cylinders in order from one end. Vee and opposed: cylinders in pairs,
        first the cylinder of the negative bank, then that of the positive bank, pair by
        pair along the shaft (the two cylinders of a pair sit at nearly the same x).

    Raises
    ------
    ValueError
        For an unknown arrangement, a vee without a vee angle or with one outside
        (0, 180) degrees, an odd cylinder count for a vee or opposed machine, or a
        count not in the tables.

    Notes
    -----
    The tables are :data:`INLINE_CRANK_ANGLES_DEGREES`,
    :data:`VEE_THROW_ANGLES_DEGREES` and :data:`OPPOSED_PAIR_ANGLES_DEGREES`: layouts of
    common practice, from memory. The design's own crank angles win whenever stated.

    References
    ----------
    .. [1] C. F. Taylor, The Internal-Combustion Engine in Theory and Practice, vol. 2,
       revised ed., MIT Press, 1985, ch. 8, crank arrangements (from memory).

    Examples
    --------
    >>> crank, bank = standard_crank_angles(4, 4, "inline")
    >>> print(np.degrees(crank), np.degrees(bank))
    [  0. 180. 180.   0.] [0. 0. 0. 0.]
    """
    if arrangement not in COVERED_CYLINDER_COUNTS:
        raise ValueError(
            f"arrangement must be 'inline', 'vee' or 'opposed', got {arrangement!r}"
        )
    if strokes not in (2, 4):
        raise ValueError(f"strokes must be 2 or 4, got {strokes!r}")
    if isinstance(cylinders, bool) or not isinstance(cylinders, (int, float, np.number)) or not (
        np.isfinite(cylinders) and cylinders >= 1 and cylinders == round(cylinders)
    ):
        raise ValueError(f"cylinders must be a positive whole number, got {cylinders!r}")
    count = int(cylinders)
    covered = COVERED_CYLINDER_COUNTS[arrangement]
    listed = ", ".join(str(c) for c in covered)
    if arrangement != "inline" and count % 2:
        raise ValueError(
            f"{'an' if arrangement == 'opposed' else 'a'} {arrangement} arrangement needs an "
            f"even number of cylinders, got {count}"
        )
    if count not in covered:
        raise ValueError(
            f"no standard crank angles for {count} cylinders {arrangement}; "
            f"covered counts are {listed}"
        )
    if arrangement == "inline":
        crank = np.radians(INLINE_CRANK_ANGLES_DEGREES[strokes][count])
        return crank, np.zeros(count)
    if arrangement == "vee":
        if vee_angle is None:
            raise ValueError("a vee arrangement needs a vee angle")
        angle = float(vee_angle)
        if not (0.0 < angle < np.pi):
            raise ValueError(
                f"vee angle must be between 0 and 180 degrees, got {np.degrees(angle):g}"
            )
        throws = np.radians(VEE_THROW_ANGLES_DEGREES[strokes][count // 2])
        crank = np.repeat(throws, 2)
        bank = np.tile([-angle / 2.0, angle / 2.0], count // 2)
        return crank, bank
    pairs = np.radians(OPPOSED_PAIR_ANGLES_DEGREES[strokes][count // 2])
    crank = np.stack([pairs, pairs + np.pi], axis=1).ravel() % (2.0 * np.pi)
    bank = np.tile([-np.pi / 2.0, np.pi / 2.0], count // 2)
    return crank, bank

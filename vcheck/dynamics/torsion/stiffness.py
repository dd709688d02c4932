"""Torsional stiffness of shaft sections and the referral of a geared train to one shaft."""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike

__all__ = ["polar_moment_of_area", "refer_to_shaft", "shaft_torsional_stiffness"]


def _positive(name: str, value: ArrayLike, unit: str) -> np.ndarray:
    arr = np.asarray(value, dtype=float)
    bad = ~(arr > 0) | ~np.isfinite(arr)
    if np.any(bad):
        got = float(arr[bad].flat[0]) if arr.ndim else float(arr)
        raise ValueError(f"{name} must be positive, got {got:g} {unit}".rstrip())
    return arr


def polar_moment_of_area(diameter: ArrayLike, bore: ArrayLike = 0.0) -> np.ndarray:
    """Polar second moment of area of a solid or hollow circular shaft.

    Parameters
    ----------
    diameter : array_like
        Outside diameter D [m]; positive.
    bore : array_like, default 0
        Inside diameter d of a hollow shaft [m]; from 0 up to (not including) D.

    Returns
    -------
    numpy.ndarray
        J_p = pi (D^4 - d^4) / 32 [m^4].

    Notes
    -----
    The polar moment of a circular annulus about its centre [1]_.

    References
    ----------
    .. [1] W. C. Young, R. G. Budynas, Roark's Formulas for Stress and Strain, 7th ed.,
       McGraw-Hill, 2002, table 10.1, case 1 and 10 (solid and hollow circular
       sections; table number from memory).
    """
    outside = _positive("shaft diameter", diameter, "m")
    inside = np.asarray(bore, dtype=float)
    bad = ~(inside >= 0) | ~np.isfinite(inside) | ~(inside < outside)
    if np.any(bad):
        got = float(np.broadcast_to(inside, bad.shape)[bad].flat[0]) if bad.ndim else float(inside)
        raise ValueError(f"shaft bore must be from 0 up to the outside diameter, got {got:g} m")
    return np.pi * (outside**4 - inside**4) / 32.0


def shaft_torsional_stiffness(diameter: ArrayLike, length: ArrayLike, shear_modulus: ArrayLike,
                              bore: ArrayLike = 0.0) -> np.ndarray:
    """Torsional stiffness of a uniform circular shaft section.

    Parameters
    ----------
    diameter : array_like
        Outside diameter D [m]; positive.
    length : array_like
        Length L of the section between the inertias it joins [m]; positive.
    shear_modulus : array_like
        Shear modulus G of the material [Pa] (about 80 GPa for steel); positive.
    bore : array_like, default 0
        Inside diameter d of a hollow shaft [m].

    Returns
    -------
    numpy.ndarray
        k = G J_p / L = G pi (D^4 - d^4) / (32 L) [N m/rad].

    Notes
    -----
    Saint-Venant torsion of a circular shaft, twist theta = T L / (G J_p) [1]_.

    References
    ----------
    .. [1] W. C. Young, R. G. Budynas, Roark's Formulas for Stress and Strain, 7th ed.,
       McGraw-Hill, 2002, ch. 10, table 10.1 (K = J_p for circular sections; from
       memory).

    Examples
    --------
    >>> print(f"{float(shaft_torsional_stiffness(0.1, 1.0, 80e9)):.4g}")
    7.854e+05
    """
    polar = polar_moment_of_area(diameter, bore)
    return (_positive("shear modulus", shear_modulus, "Pa") * polar
            / _positive("shaft length", length, "m"))


def refer_to_shaft(value: ArrayLike, speed_ratio: ArrayLike) -> np.ndarray:
    """An inertia or stiffness on a shaft referred to the reference shaft.

    Parameters
    ----------
    value : array_like
        Inertia [kg m^2] or torsional stiffness [N m/rad] on its own shaft.
    speed_ratio : array_like
        Speed of its shaft over the speed of the reference shaft, n / n_ref
        [unitless]; positive.

    Returns
    -------
    numpy.ndarray
        value (n / n_ref)^2, in the same unit.

    Notes
    -----
    Kinetic and strain energy are kept when the angle of a shaft is written as the
    reference shaft's angle times n / n_ref: J' = J (n / n_ref)^2 and likewise
    k' = k (n / n_ref)^2 (common practice; e.g. W. T. Thomson, Theory of Vibration
    with Applications, ch. on torsional systems with gears, from memory).
    """
    return np.asarray(value, dtype=float) * _positive("speed ratio", speed_ratio, "") ** 2

"""Natural frequencies of uniform Euler-Bernoulli beams.

Bending frequencies of slender uniform beams (length much larger than depth, shear
deformation and rotary inertia neglected) for the classical end conditions, and of
the two beams with a concentrated mass that machine supports most often reduce to: a
cantilever carrying a tip mass and a simply supported span carrying a mass at midspan.

The eigenvalue constants beta_i L are roots of each end condition's characteristic
(frequency) equation. They are solved here with :func:`scipy.optimize.brentq`, each root
bracketed from the equation's asymptotic form, and cached per end condition; any number
of modes is available, not a short table.

End conditions are named by what holds each end, first end first:

==================  ==========================  ====================================
name                also accepted               characteristic equation (x = beta L)
==================  ==========================  ====================================
"cantilever"        "clamped-free"              cos x cosh x + 1 = 0
"simply-supported"  "pinned-pinned"             sin x = 0  (x = i pi)
"fixed-fixed"       "clamped-clamped"           cos x cosh x - 1 = 0
"fixed-pinned"      "clamped-pinned"            tan x - tanh x = 0
"free-free"         -                           cos x cosh x - 1 = 0 (elastic modes)
==================  ==========================  ====================================
"""

from __future__ import annotations

import functools
import math
from collections.abc import Callable

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "BEAM_END_CONDITIONS",
    "RAYLEIGH_MASS_FACTOR_CANTILEVER",
    "RAYLEIGH_MASS_FACTOR_SIMPLY_SUPPORTED",
    "beam_eigenvalue_constants",
    "beam_mass_per_length",
    "beam_natural_frequencies",
    "cantilever_tip_mass_exact",
    "cantilever_tip_mass_rayleigh",
    "simply_supported_central_mass_exact",
    "simply_supported_central_mass_rayleigh",
]

BEAM_END_CONDITIONS = {
    "cantilever": "cantilever",
    "clamped-free": "cantilever",
    "simply-supported": "simply-supported",
    "pinned-pinned": "simply-supported",
    "fixed-fixed": "fixed-fixed",
    "clamped-clamped": "fixed-fixed",
    "fixed-pinned": "fixed-pinned",
    "clamped-pinned": "fixed-pinned",
    "free-free": "free-free",
}
"""Accepted end-condition names (keys) and the model each one means (values)."""

RAYLEIGH_MASS_FACTOR_CANTILEVER = 33.0 / 140.0
"""Share of a cantilever's own mass that moves with its tip mass [unitless].

Rayleigh's method with the static deflection curve of an end-loaded cantilever as the
assumed mode: M_eff = M + (33/140) m_beam. W. T. Thomson, M. D. Dahleh, Theory of
Vibration with Applications, 5th ed., Prentice Hall, 1998, sec. 2.5 (from memory)."""

RAYLEIGH_MASS_FACTOR_SIMPLY_SUPPORTED = 17.0 / 35.0
"""Share of a simply supported beam's own mass that moves with a mass at midspan
[unitless].

Rayleigh's method with the static deflection curve of a centrally loaded simply
supported beam as the assumed mode: M_eff = M + (17/35) m_beam. W. T. Thomson,
M. D. Dahleh, Theory of Vibration with Applications, 5th ed., Prentice Hall, 1998,
sec. 2.5 (from memory); the factor follows from integrating the deflection curve."""


# --------------------------------------------------------------------------- helpers


def _positive(name: str, value: ArrayLike, unit: str) -> np.ndarray:
    """Return ``value`` as a float array, raising ValueError unless all finite > 0."""
    arr = np.asarray(value, dtype=float)
    bad = ~(arr > 0) | ~np.isfinite(arr)
    if np.any(bad):
        first = arr[bad].flat[0] if arr.ndim else float(arr)
        raise ValueError(f"{name} must be positive, got {first:g} {unit}")
    return arr


def _non_negative(name: str, value: ArrayLike, unit: str) -> np.ndarray:
    """Return ``value`` as a float array, raising ValueError unless all finite >= 0."""
    arr = np.asarray(value, dtype=float)
    bad = ~(arr >= 0) | ~np.isfinite(arr)
    if np.any(bad):
        first = arr[bad].flat[0] if arr.ndim else float(arr)
        raise ValueError(f"{name} must not be negative, got {first:g} {unit}")
    return arr


def _mode_count(n_modes: int) -> int:
    if isinstance(n_modes, bool) or not isinstance(n_modes, (int, np.integer)):
        raise ValueError(f"number of modes must be a whole number, got {n_modes!r}")
    if n_modes < 1:
        raise ValueError(f"number of modes must be at least 1, got {n_modes}")
    return int(n_modes)


def _end_condition(name: str) -> str:
    try:
        return BEAM_END_CONDITIONS[name]
    except (KeyError, TypeError):
        known = ", ".join(f'"{k}"' for k in BEAM_END_CONDITIONS)
        raise ValueError(f"unknown beam end condition {name!r}; expected one of {known}") from None


def _brentq(func: Callable[[float], float], low: float, high: float) -> float:
    from ..roots import brent_root

    return brent_root(func, low, high, xtol=1e-14, maxiter=200)


# Characteristic equations, each divided by cosh x so that no term overflows for high
# modes (cosh 710 overflows a double); the roots are unchanged.


def _cantilever_equation(x: float) -> float:
    # cos x cosh x + 1 = 0  <=>  cos x + sech x = 0
    return math.cos(x) + 1.0 / math.cosh(x) if x < 700.0 else math.cos(x)


def _fixed_fixed_equation(x: float) -> float:
    # cos x cosh x - 1 = 0  <=>  cos x - sech x = 0
    return math.cos(x) - 1.0 / math.cosh(x) if x < 700.0 else math.cos(x)


def _fixed_pinned_equation(x: float) -> float:
    # tan x = tanh x  <=>  sin x - cos x tanh x = 0 (no poles)
    return math.sin(x) - math.cos(x) * math.tanh(x)


@functools.lru_cache(maxsize=32)
def _roots(model: str, n_modes: int) -> tuple[float, ...]:
    """First ``n_modes`` roots beta_i L of an end condition, cached."""
    roots = []
    for i in range(1, n_modes + 1):
        if model == "simply-supported":
            roots.append(i * math.pi)
        elif model == "cantilever":
            # asymptote (2i - 1) pi / 2; cos changes sign once in the bracket
            mid = (2 * i - 1) * math.pi / 2.0
            roots.append(_brentq(_cantilever_equation, mid - math.pi / 2, mid + math.pi / 2))
        elif model in ("fixed-fixed", "free-free"):
            # asymptote (2i + 1) pi / 2; the zero root (rigid body of free-free) is skipped
            mid = (2 * i + 1) * math.pi / 2.0
            roots.append(_brentq(_fixed_fixed_equation, mid - math.pi / 2, mid + math.pi / 2))
        elif model == "fixed-pinned":
            # asymptote (4i + 1) pi / 4, inside (i pi, i pi + pi/2) where tan rises 0 -> inf
            roots.append(_brentq(_fixed_pinned_equation, i * math.pi, i * math.pi + math.pi / 2))
        else:  # pragma: no cover - guarded by _end_condition
            raise AssertionError(model)
    return tuple(roots)


# --------------------------------------------------------------------------- public API


def beam_eigenvalue_constants(end_condition: str, n_modes: int = 3) -> np.ndarray:
    """Eigenvalue constants beta_i L of a uniform Euler-Bernoulli beam.

    Parameters
    ----------
    end_condition : str
        One of the names in :data:`BEAM_END_CONDITIONS` [-].
    n_modes : int, default 3
        How many constants, lowest first [unitless].

    Returns
    -------
    numpy.ndarray
        beta_i L for i = 1 .. n_modes, shape (n_modes,) [unitless]. For "free-free" the
        two rigid-body modes (beta L = 0) are left out: the first entry is the first
        elastic mode.

    Notes
    -----
    Roots of the characteristic equations in the module table, solved with Brent's
    method to full double precision in brackets of half a period around the asymptotes
    x = (2i - 1) pi/2 (cantilever), (2i + 1) pi/2 (fixed-fixed, free-free) and
    (4i + 1) pi/4 (fixed-pinned). Simply supported roots are exactly i pi.

    References
    ----------
    .. [1] R. D. Blevins, Formulas for Natural Frequency and Mode Shape, Van Nostrand
       Reinhold, 1979 (reprinted Krieger, 2001), ch. 8, table of single-span beams
       (table number from memory).

    Examples
    --------
    >>> beam_eigenvalue_constants("cantilever", 3).round(6)
    array([1.875104, 4.694091, 7.854757])
    """
    model = _end_condition(end_condition)
    return np.array(_roots(model, _mode_count(n_modes)))


def beam_mass_per_length(density: ArrayLike, area: ArrayLike) -> np.ndarray:
    """Mass per unit length of a uniform beam from its density and cross-section.

    Parameters
    ----------
    density : array_like
        Material density [kg/m^3]; positive.
    area : array_like
        Cross-section area [m^2]; positive.

    Returns
    -------
    numpy.ndarray
        Mass per length rho A [kg/m].
    """
    density = _positive("density", density, "kg/m^3")
    area = _positive("cross-section area", area, "m^2")
    return density * area


def _stiffness_mass_length(youngs_modulus, second_moment, mass_per_length, length):
    e = _positive("Young's modulus", youngs_modulus, "Pa")
    i = _positive("second moment of area", second_moment, "m^4")
    mu = _positive("mass per length", mass_per_length, "kg/m")
    ell = _positive("beam length", length, "m")
    return e, i, mu, ell


def beam_natural_frequencies(
    end_condition: str,
    youngs_modulus: ArrayLike,
    second_moment: ArrayLike,
    mass_per_length: ArrayLike,
    length: ArrayLike,
    n_modes: int = 3,
) -> np.ndarray:
    """Bending natural frequencies of a uniform Euler-Bernoulli beam.

    Parameters
    ----------
    end_condition : str
        One of the names in :data:`BEAM_END_CONDITIONS` [-].
    youngs_modulus : array_like
        Young's modulus E [Pa]; positive.
    second_moment : array_like
        Second moment of area I of the section about the bending axis [m^4]; positive.
    mass_per_length : array_like
        Mass per unit length rho A, including any evenly spread added mass [kg/m];
        positive. See :func:`beam_mass_per_length`.
    length : array_like
        Span L [m]; positive.
    n_modes : int, default 3
        How many modes, lowest first [unitless].

    Returns
    -------
    numpy.ndarray
        Natural frequencies [Hz], shape ``broadcast(inputs).shape + (n_modes,)``. For
        "free-free" the elastic modes only (the two rigid-body modes are at 0 Hz).

    Notes
    -----
    f_i = (beta_i L)^2 / (2 pi L^2) * sqrt(E I / (rho A)) [1]_, with beta_i L from
    :func:`beam_eigenvalue_constants`. Slender-beam theory: shear deformation and rotary
    inertia are neglected, which overestimates frequencies once the wavelength nears
    the section depth (high modes of deep beams).

    References
    ----------
    .. [1] R. D. Blevins, Formulas for Natural Frequency and Mode Shape, Van Nostrand
       Reinhold, 1979, ch. 8 (table number from memory).

    Examples
    --------
    A steel cantilever, 1 m long, 50 mm x 50 mm solid section:

    >>> mu = beam_mass_per_length(7850.0, 0.05 * 0.05)
    >>> f = beam_natural_frequencies("cantilever", 210e9, 0.05**4 / 12, mu, 1.0, 1)
    >>> round(float(f[0]), 2)
    41.78
    """
    model = _end_condition(end_condition)
    lam = np.array(_roots(model, _mode_count(n_modes)))
    e, i, mu, ell = _stiffness_mass_length(youngs_modulus, second_moment, mass_per_length, length)
    scale = np.sqrt(e * i / mu) / (2.0 * np.pi * ell**2)
    return np.asarray(scale)[..., None] * lam**2


# ------------------------------------------------------------- beams with a point mass


def _tip_mass_equation(ratio: float) -> Callable[[float], float]:
    # 1 + cos x cosh x + R x (cos x sinh x - sin x cosh x) = 0, divided by cosh x
    def f(x: float) -> float:
        sech = 1.0 / math.cosh(x) if x < 700.0 else 0.0
        return sech + math.cos(x) + ratio * x * (math.cos(x) * math.tanh(x) - math.sin(x))

    return f


def _central_mass_equation(ratio: float) -> Callable[[float], float]:
    # symmetric modes: 4 cos(x/2) = R x (sin(x/2) - cos(x/2) tanh(x/2))
    def f(x: float) -> float:
        u = 0.5 * x
        return 4.0 * math.cos(u) - ratio * x * (math.sin(u) - math.cos(u) * math.tanh(u))

    return f


@functools.lru_cache(maxsize=256)
def _tip_mass_roots(ratio: float, n_modes: int) -> tuple[float, ...]:
    """Roots beta_i L of the cantilever with tip mass ratio R = M / m_beam."""
    if ratio == 0.0:
        return _roots("cantilever", n_modes)
    free = _roots("cantilever", n_modes)
    pinned = (0.0,) + _roots("fixed-pinned", n_modes)
    eq = _tip_mass_equation(ratio)
    # Adding tip mass lowers every frequency; an infinite tip mass pins the tip. The
    # i-th root therefore lies between the (i-1)-th fixed-pinned root and the i-th
    # cantilever root (interlacing under an added constraint).
    return tuple(_brentq(eq, pinned[i] + 1e-12, free[i]) for i in range(n_modes))


@functools.lru_cache(maxsize=256)
def _central_mass_roots(ratio: float, n_modes: int) -> tuple[float, ...]:
    """Roots beta_i L of the simply supported beam with a midspan mass, all modes."""
    n_sym = (n_modes + 1) // 2
    if ratio == 0.0:
        sym = [(2 * j - 1) * math.pi for j in range(1, n_sym + 1)]
    else:
        # the half span is pinned at the support and slides at midspan; an infinite
        # mass clamps midspan, so the j-th symmetric root lies between 2 x the
        # (j-1)-th fixed-pinned root and (2j - 1) pi
        pinned = (0.0,) + _roots("fixed-pinned", n_sym)
        eq = _central_mass_equation(ratio)
        sym = [
            _brentq(eq, 2.0 * pinned[j - 1] + 1e-12, (2 * j - 1) * math.pi)
            for j in range(1, n_sym + 1)
        ]
    anti = [2 * j * math.pi for j in range(1, n_modes // 2 + 1)]
    return tuple(sorted(sym + anti)[:n_modes])


def _roots_per_ratio(ratio: np.ndarray, n_modes: int, solver) -> np.ndarray:
    flat = ratio.reshape(-1)
    out = np.empty((flat.size, n_modes))
    for k, r in enumerate(flat):
        out[k] = solver(float(r), n_modes)
    return out.reshape(ratio.shape + (n_modes,))


def cantilever_tip_mass_exact(
    youngs_modulus: ArrayLike,
    second_moment: ArrayLike,
    mass_per_length: ArrayLike,
    length: ArrayLike,
    tip_mass: ArrayLike,
    n_modes: int = 1,
) -> np.ndarray:
    """Natural frequencies of a cantilever carrying a point mass at its free end (exact).

    The exact solution of Euler-Bernoulli beam theory: the frequency equation is solved
    numerically. For the one-line estimate see :func:`cantilever_tip_mass_rayleigh`.

    Parameters
    ----------
    youngs_modulus : array_like
        Young's modulus E [Pa]; positive.
    second_moment : array_like
        Second moment of area I [m^4]; positive.
    mass_per_length : array_like
        Mass per unit length of the beam rho A [kg/m]; positive.
    length : array_like
        Length L from the clamp to the mass [m]; positive.
    tip_mass : array_like
        Point mass M at the free end [kg]; zero or positive.
    n_modes : int, default 1
        How many modes, lowest first [unitless].

    Returns
    -------
    numpy.ndarray
        Natural frequencies [Hz], shape ``broadcast(inputs).shape + (n_modes,)``.

    Notes
    -----
    With x = beta L and R = M / (rho A L), the frequency equation is [1]_

        1 + cos x cosh x + R x (cos x sinh x - sin x cosh x) = 0,

    and f = x^2 / (2 pi L^2) sqrt(E I / (rho A)). The mass is a point: its rotary
    inertia and offset from the beam axis are neglected. R = 0 gives the cantilever.

    References
    ----------
    .. [1] R. D. Blevins, Formulas for Natural Frequency and Mode Shape, Van Nostrand
       Reinhold, 1979, ch. 8, beams with a concentrated end mass (from memory); the
       equation follows from the beam solution with the end shear equal to the mass's
       inertia force, which the test suite checks against a finite-element model.
    """
    e, i, mu, ell = _stiffness_mass_length(youngs_modulus, second_moment, mass_per_length, length)
    m = _non_negative("tip mass", tip_mass, "kg")
    n = _mode_count(n_modes)
    e, i, mu, ell, m = np.broadcast_arrays(e, i, mu, ell, m)
    lam = _roots_per_ratio(m / (mu * ell), n, _tip_mass_roots)
    scale = np.sqrt(e * i / mu) / (2.0 * np.pi * ell**2)
    return scale[..., None] * lam**2


def cantilever_tip_mass_rayleigh(
    youngs_modulus: ArrayLike,
    second_moment: ArrayLike,
    mass_per_length: ArrayLike,
    length: ArrayLike,
    tip_mass: ArrayLike,
) -> np.ndarray:
    """Fundamental frequency of a cantilever with a tip mass (Rayleigh estimate).

    An approximation from an assumed mode shape; the exact value is given by
    :func:`cantilever_tip_mass_exact`.

    Parameters
    ----------
    youngs_modulus : array_like
        Young's modulus E [Pa]; positive.
    second_moment : array_like
        Second moment of area I [m^4]; positive.
    mass_per_length : array_like
        Mass per unit length of the beam rho A [kg/m]; positive.
    length : array_like
        Length L [m]; positive.
    tip_mass : array_like
        Point mass M at the free end [kg]; zero or positive.

    Returns
    -------
    numpy.ndarray
        Fundamental frequency [Hz].

    Notes
    -----
    f = sqrt(k / (M + (33/140) rho A L)) / (2 pi), k = 3 E I / L^3 [1]_. An upper bound
    (Rayleigh's quotient): about 1.5 % high with no tip mass, exact as M / m_beam grows.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, sec. 2.5 (from memory).
    """
    e, i, mu, ell = _stiffness_mass_length(youngs_modulus, second_moment, mass_per_length, length)
    m = _non_negative("tip mass", tip_mass, "kg")
    k = 3.0 * e * i / ell**3
    return np.sqrt(k / (m + RAYLEIGH_MASS_FACTOR_CANTILEVER * mu * ell)) / (2.0 * np.pi)


def simply_supported_central_mass_exact(
    youngs_modulus: ArrayLike,
    second_moment: ArrayLike,
    mass_per_length: ArrayLike,
    length: ArrayLike,
    mass: ArrayLike,
    n_modes: int = 1,
) -> np.ndarray:
    """Natural frequencies of a simply supported beam with a point mass at midspan (exact).

    The exact solution of Euler-Bernoulli beam theory: the frequency equation of the
    symmetric modes is solved numerically. For the one-line estimate see
    :func:`simply_supported_central_mass_rayleigh`.

    Parameters
    ----------
    youngs_modulus : array_like
        Young's modulus E [Pa]; positive.
    second_moment : array_like
        Second moment of area I [m^4]; positive.
    mass_per_length : array_like
        Mass per unit length of the beam rho A [kg/m]; positive.
    length : array_like
        Span L between the supports [m]; positive.
    mass : array_like
        Point mass M at midspan [kg]; zero or positive.
    n_modes : int, default 1
        How many modes, lowest first, symmetric and antisymmetric together [unitless].

    Returns
    -------
    numpy.ndarray
        Natural frequencies [Hz], shape ``broadcast(inputs).shape + (n_modes,)``.

    Notes
    -----
    With x = beta L and R = M / (rho A L), the symmetric modes satisfy

        4 cos(x/2) = R x (sin(x/2) - cos(x/2) tanh(x/2)),

    from the half span (pinned at the support, zero slope at midspan) whose midspan
    shear carries half the mass's inertia force. The antisymmetric modes have a node at
    midspan and stay at x = 2 pi, 4 pi, ... (the mass's rotary inertia, which would
    lower them, is neglected). f = x^2 / (2 pi L^2) sqrt(E I / (rho A)).

    References
    ----------
    .. [1] R. D. Blevins, Formulas for Natural Frequency and Mode Shape, Van Nostrand
       Reinhold, 1979, ch. 8, beams with a concentrated mass (from memory); derived
       here from the beam solution and checked in the test suite against a
       finite-element model.
    """
    e, i, mu, ell = _stiffness_mass_length(youngs_modulus, second_moment, mass_per_length, length)
    m = _non_negative("central mass", mass, "kg")
    n = _mode_count(n_modes)
    e, i, mu, ell, m = np.broadcast_arrays(e, i, mu, ell, m)
    lam = _roots_per_ratio(m / (mu * ell), n, _central_mass_roots)
    scale = np.sqrt(e * i / mu) / (2.0 * np.pi * ell**2)
    return scale[..., None] * lam**2


def simply_supported_central_mass_rayleigh(
    youngs_modulus: ArrayLike,
    second_moment: ArrayLike,
    mass_per_length: ArrayLike,
    length: ArrayLike,
    mass: ArrayLike,
) -> np.ndarray:
    """Fundamental frequency of a simply supported beam with a midspan mass (Rayleigh).

    An approximation from an assumed mode shape; the exact value is given by
    :func:`simply_supported_central_mass_exact`.

    Parameters
    ----------
    youngs_modulus : array_like
        Young's modulus E [Pa]; positive.
    second_moment : array_like
        Second moment of area I [m^4]; positive.
    mass_per_length : array_like
        Mass per unit length of the beam rho A [kg/m]; positive.
    length : array_like
        Span L [m]; positive.
    mass : array_like
        Point mass M at midspan [kg]; zero or positive.

    Returns
    -------
    numpy.ndarray
        Fundamental frequency [Hz].

    Notes
    -----
    f = sqrt(k / (M + (17/35) rho A L)) / (2 pi), k = 48 E I / L^3 [1]_; an upper bound,
    about 0.7 % high with no mass and exact as M / m_beam grows.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, sec. 2.5 (from memory).
    """
    e, i, mu, ell = _stiffness_mass_length(youngs_modulus, second_moment, mass_per_length, length)
    m = _non_negative("central mass", mass, "kg")
    k = 48.0 * e * i / ell**3
    return np.sqrt(k / (m + RAYLEIGH_MASS_FACTOR_SIMPLY_SUPPORTED * mu * ell)) / (2.0 * np.pi)

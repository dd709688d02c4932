"""Fatigue damage of a stationary Gaussian stress from its power spectral density.

The stress is given as a one-sided PSD table: frequencies [Hz] and PSD values
[Pa^2/Hz], straight lines between the points (so moments are trapezoid sums over the
table). From it:

* spectral moments m0, m1, m2, m4, the rates of zero up-crossings and of peaks and the
  irregularity factor;
* damage over a duration by the narrow-band (Rayleigh) formula, by Dirlik's (1985)
  empirical range distribution, and by Steinberg's three-band method, each for a
  one-slope S-N curve N S^k = C in closed form and for any curve of
  :mod:`vcheck.dynamics.fatigue.sn_curves` by numerical integration of the range distribution;
* Miles' equation for the RMS response of a lightly damped single-degree-of-freedom
  system to a flat base-acceleration PSD.

S-N curves here are range based: N cycles of stress range S (peak to valley) with
N S^k = C, S in pascals. A curve written in amplitudes, N S_a^k = C_a, has
C = 2^k C_a.
"""

from __future__ import annotations

import functools
import itertools
import math

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "STEINBERG_THREE_BAND",
    "damage_dirlik",
    "damage_dirlik_curve",
    "damage_narrow_band",
    "damage_narrow_band_curve",
    "damage_three_band",
    "damage_three_band_curve",
    "dirlik_coefficients",
    "irregularity_factor",
    "miles_rms_response",
    "peak_rate",
    "range_pdf_dirlik",
    "range_pdf_rayleigh",
    "spectral_moment",
    "spectral_moments",
    "zero_upcrossing_rate",
]

STEINBERG_THREE_BAND = ((1.0, 0.683), (2.0, 0.271), (3.0, 0.0433))
"""Steinberg's three-band method: (stress amplitude in multiples of the RMS stress,
share of the cycles) [unitless].

D. S. Steinberg, Vibration Analysis for Electronic Equipment, 3rd ed., Wiley, 2000,
sec. 8.10 (section number from memory): 68.3 % of the cycles at 1 sigma, 27.1 % at
2 sigma and 4.33 % at 3 sigma, none above; the cycle rate is the zero up-crossing rate.
The exact Gaussian shares of the bands are 68.27, 27.18 and 4.28 %."""


# --------------------------------------------------------------------------- input


def _psd_table(frequency: ArrayLike, psd: ArrayLike):
    f = np.asarray(frequency, dtype=float)
    g = np.asarray(psd, dtype=float)
    if f.ndim != 1 or g.ndim != 1 or f.shape != g.shape or f.shape[0] < 2:
        raise ValueError(
            "a PSD table needs one-dimensional frequency and PSD arrays of equal length, "
            f"at least two points, got shapes {f.shape} and {g.shape}"
        )
    if not (np.isfinite(f).all() and np.isfinite(g).all()):
        raise ValueError("PSD table values must be finite numbers")
    if f[0] < 0:
        raise ValueError(f"frequencies must be zero or positive, got {f[0]:g} Hz")
    step = np.diff(f)
    if (step <= 0).any():
        i = int(np.flatnonzero(step <= 0)[0])
        raise ValueError(
            f"frequencies must be strictly increasing, got {f[i + 1]:g} Hz after {f[i]:g} Hz"
        )
    if (g < 0).any():
        i = int(np.flatnonzero(g < 0)[0])
        raise ValueError(
            f"PSD values must be zero or positive, got {g[i]:g} Pa^2/Hz at {f[i]:g} Hz"
        )
    return f, g


def _trapezoid(y: np.ndarray, x: np.ndarray) -> float:
    return float(0.5 * np.sum((y[1:] + y[:-1]) * np.diff(x)))


_KEEP_POWERS_FROM = 1024
"""Tables of at least this many points have their integrals of powers of f kept (see
:func:`_linear_moments`); shorter ones cost less to redo than to compare."""

_kept_powers: list = [(None, {})]  # [(the table's frequencies as bytes, {p: integrals})]


def _linear_moment(f: np.ndarray, g: np.ndarray, order: float) -> float:
    """Exact integral of f^n G(f) df with G linear between the table's points."""
    return _linear_moments(f, g, (order,))[0]


def _linear_moments(f: np.ndarray, g: np.ndarray, orders) -> tuple[float, ...]:
    """:func:`_linear_moment` of each order, the segments' slopes and each integral of a
    power of f worked out once for all of them (the same operations on the same
    numbers, so the same results)."""
    f1, f2, g1, g2 = f[:-1], f[1:], g[:-1], g[1:]
    slope = (g2 - g1) / (f2 - f1)
    intercept = g1 - slope * f1
    # the integrals of powers of f depend on the frequencies alone: those of the last
    # long table are kept, for the next PSD on the same frequencies (a damage and the
    # moments reported with it)
    key = f.tobytes() if f.size >= _KEEP_POWERS_FROM else None
    kept_key, powers = _kept_powers[0]
    if key is None or kept_key != key:
        powers = {}
        if key is not None:
            _kept_powers[0] = (key, powers)

    def power(p):  # integral of f^(p-1) from f1 to f2, p >= 1
        if p not in powers:
            # f2^p and f1^p are the same table's powers: each point's power once
            fp = f**p
            powers[p] = (fp[1:] - fp[:-1]) / p
        return powers[p]

    return tuple(float(np.sum(intercept * power(order + 1.0) + slope * power(order + 2.0)))
                 for order in orders)


def _non_negative(name: str, value, unit: str) -> float:
    v = float(value)
    if not (math.isfinite(v) and v >= 0):
        raise ValueError(f"{name} must be zero or positive, got {v:g} {unit}".rstrip())
    return v


def _positive(name: str, value, unit: str) -> float:
    v = float(value)
    if not (math.isfinite(v) and v > 0):
        raise ValueError(f"{name} must be positive, got {v:g} {unit}".rstrip())
    return v


def _moments_checked(frequency, psd):
    m0, m1, m2, m4 = spectral_moments(frequency, psd)
    if m0 == 0:
        return None
    if m2 == 0:
        raise ValueError("the PSD has all its area at 0 Hz: it has no up-crossings or peaks")
    return m0, m1, m2, m4


# ----------------------------------------------------------------------- moments


def spectral_moment(frequency: ArrayLike, psd: ArrayLike, order: float) -> float:
    """Spectral moment of a one-sided PSD table.

    Parameters
    ----------
    frequency : array_like
        Frequencies of the table, zero or positive, strictly increasing [Hz].
    psd : array_like
        One-sided PSD at those frequencies, zero or positive [Pa^2/Hz].
    order : float
        Order n of the moment [unitless].

    Returns
    -------
    float
        m_n = integral of f^n G(f) df, with G linear between the table's points,
        integrated exactly [Pa^2 Hz^n].

    Notes
    -----
    Moments are in cyclic frequency (Hz); in angular frequency they are (2 pi)^n
    larger. Rates and the irregularity factor below do not depend on the choice.

    References
    ----------
    .. [1] J. S. Bendat, A. G. Piersol, Random Data: Analysis and Measurement
       Procedures, 4th ed., Wiley, 2010, sec. 5.5 (from memory).

    Examples
    --------
    >>> spectral_moment([50.0, 100.0], [1.0, 1.0], 0)
    50.0
    """
    f, g = _psd_table(frequency, psd)
    if order < 0:
        raise ValueError(f"the order of a spectral moment must be zero or positive, got {order:g}")
    return _linear_moment(f, g, float(order))


def spectral_moments(frequency: ArrayLike, psd: ArrayLike):
    """Moments m0, m1, m2 and m4 of a one-sided PSD table.

    Parameters
    ----------
    frequency : array_like
        Frequencies of the table, zero or positive, strictly increasing [Hz].
    psd : array_like
        One-sided PSD at those frequencies, zero or positive [Pa^2/Hz].

    Returns
    -------
    m0, m1, m2, m4 : float
        Spectral moments, the PSD taken linear between the table's points and the
        integrals done exactly [Pa^2, Pa^2 Hz, Pa^2 Hz^2, Pa^2 Hz^4]. m0 is the
        variance of the stress.

    Examples
    --------
    Flat 1 Pa^2/Hz from 50 to 100 Hz, two points (exact: m2 = (100^3 - 50^3) / 3):

    >>> [float(f"{m:.5g}") for m in spectral_moments([50.0, 100.0], [1.0, 1.0])]
    [50.0, 3750.0, 291670.0, 1937500000.0]
    """
    f, g = _psd_table(frequency, psd)
    return _linear_moments(f, g, (0.0, 1.0, 2.0, 4.0))


def zero_upcrossing_rate(m0: float, m2: float) -> float:
    """Expected rate of zero up-crossings of a Gaussian process, nu_0+ (Rice).

    Parameters
    ----------
    m0 : float
        Zeroth spectral moment (variance) [Pa^2].
    m2 : float
        Second spectral moment [Pa^2 Hz^2].

    Returns
    -------
    float
        nu_0+ = sqrt(m2 / m0) [Hz].

    References
    ----------
    .. [1] S. O. Rice, Mathematical analysis of random noise, Bell System Technical
       Journal 23 (1944) 282-332 and 24 (1945) 46-156.
    """
    return math.sqrt(_non_negative("m2", m2, "Pa^2 Hz^2") / _positive("m0", m0, "Pa^2"))


def peak_rate(m2: float, m4: float) -> float:
    """Expected rate of peaks (local maxima) of a Gaussian process, nu_p (Rice).

    Parameters
    ----------
    m2 : float
        Second spectral moment [Pa^2 Hz^2].
    m4 : float
        Fourth spectral moment [Pa^2 Hz^4].

    Returns
    -------
    float
        nu_p = sqrt(m4 / m2) [Hz].

    References
    ----------
    .. [1] S. O. Rice, Bell System Technical Journal 24 (1945) 46-156.
    """
    return math.sqrt(_non_negative("m4", m4, "Pa^2 Hz^4") / _positive("m2", m2, "Pa^2 Hz^2"))


def irregularity_factor(m0: float, m2: float, m4: float) -> float:
    """Irregularity factor alpha_2 = nu_0+ / nu_p = m2 / sqrt(m0 m4).

    Parameters
    ----------
    m0, m2, m4 : float
        Spectral moments [Pa^2, Pa^2 Hz^2, Pa^2 Hz^4].

    Returns
    -------
    float
        alpha_2, 1 for a narrow-band process (one peak per up-crossing), towards 0 for
        a broad one [unitless].
    """
    m0 = _positive("m0", m0, "Pa^2")
    m4 = _positive("m4", m4, "Pa^2 Hz^4")
    return _non_negative("m2", m2, "Pa^2 Hz^2") / math.sqrt(m0 * m4)


# ------------------------------------------------------------- range densities


def range_pdf_rayleigh(stress_range: ArrayLike, m0: float):
    """Probability density of stress ranges of a narrow-band Gaussian process.

    Parameters
    ----------
    stress_range : array_like
        Stress range S, zero or positive [Pa].
    m0 : float
        Variance of the stress [Pa^2].

    Returns
    -------
    numpy.ndarray or numpy.float64
        p(S) = S / (4 m0) exp(-S^2 / (8 m0)) [1/Pa].

    Notes
    -----
    Amplitudes (half ranges) of a narrow-band Gaussian process are Rayleigh distributed
    with parameter sqrt(m0); the range is twice the amplitude.
    """
    s = np.asarray(stress_range, dtype=float)
    m0 = _positive("m0", m0, "Pa^2")
    return (s / (4.0 * m0) * np.exp(-(s**2) / (8.0 * m0)))[()]


def dirlik_coefficients(m0: float, m1: float, m2: float, m4: float):
    """Coefficients of Dirlik's range density.

    Parameters
    ----------
    m0, m1, m2, m4 : float
        Spectral moments [Pa^2, Pa^2 Hz, Pa^2 Hz^2, Pa^2 Hz^4].

    Returns
    -------
    d1, d2, d3, q, r : float
        Weights of the exponential, Rayleigh and unit-Rayleigh terms and their
        parameters Q and R [unitless].

    Notes
    -----
    With x_m = (m1 / m0) sqrt(m2 / m4) and gamma = alpha_2 = m2 / sqrt(m0 m4):
    D1 = 2 (x_m - gamma^2) / (1 + gamma^2),
    R = (gamma - x_m - D1^2) / (1 - gamma - D1 + D1^2),
    D2 = (1 - gamma - D1 + D1^2) / (1 - R), D3 = 1 - D1 - D2,
    Q = 1.25 (gamma - D3 - D2 R) / D1.

    References
    ----------
    .. [1] T. Dirlik, Application of computers in fatigue analysis, PhD thesis,
       University of Warwick, 1985.
    .. [2] N. W. M. Bishop, F. Sherratt, Finite Element Based Fatigue Calculations,
       NAFEMS, 2000, ch. 6 (from memory).
    """
    m0 = _positive("m0", m0, "Pa^2")
    m2 = _positive("m2", m2, "Pa^2 Hz^2")
    m4 = _positive("m4", m4, "Pa^2 Hz^4")
    m1 = _non_negative("m1", m1, "Pa^2 Hz")
    xm = m1 / m0 * math.sqrt(m2 / m4)
    gamma = m2 / math.sqrt(m0 * m4)
    d1 = 2.0 * (xm - gamma**2) / (1.0 + gamma**2)
    denominator = 1.0 - gamma - d1 + d1**2
    r = (gamma - xm - d1**2) / denominator
    d2 = denominator / (1.0 - r)
    d3 = 1.0 - d1 - d2
    q = 1.25 * (gamma - d3 - d2 * r) / d1
    return d1, d2, d3, q, r


def _usable_dirlik(m0, m1, m2, m4):
    """Dirlik coefficients, with the exponential term dropped in the narrow-band limit.

    As alpha_2 -> 1, D1 -> 0 and Q is 0/0: rounding can leave D1 or Q at or below zero
    (meaningless, and Q^k undefined for fractional k). The term's weight D1 is then
    zero to rounding, so it is left out (D1 = 0, Q = 1).
    """
    d1, d2, d3, q, r = dirlik_coefficients(m0, m1, m2, m4)
    if not (d1 > 0 and q > 0 and math.isfinite(q)):
        d1, q = 0.0, 1.0
    return d1, d2, d3, q, r


def _dirlik_pdf_z(z, d1, d2, d3, q, r):
    """Dirlik density in the normalised range Z = S / (2 sqrt(m0)) [unitless]."""
    return (
        d1 / q * np.exp(-z / q)
        + d2 * z / r**2 * np.exp(-(z**2) / (2.0 * r**2))
        + d3 * z * np.exp(-(z**2) / 2.0)
    )


def range_pdf_dirlik(stress_range: ArrayLike, m0: float, m1: float, m2: float, m4: float):
    """Dirlik's probability density of rainflow ranges of a Gaussian process.

    Parameters
    ----------
    stress_range : array_like
        Stress range S, zero or positive [Pa].
    m0, m1, m2, m4 : float
        Spectral moments [Pa^2, Pa^2 Hz, Pa^2 Hz^2, Pa^2 Hz^4].

    Returns
    -------
    numpy.ndarray or numpy.float64
        p(S) [1/Pa].

    Notes
    -----
    With Z = S / (2 sqrt(m0)) and the coefficients of :func:`dirlik_coefficients`:
    p(S) = [D1/Q exp(-Z/Q) + D2 Z/R^2 exp(-Z^2/(2 R^2)) + D3 Z exp(-Z^2/2)] / (2 sqrt(m0)).

    References
    ----------
    .. [1] T. Dirlik, Application of computers in fatigue analysis, PhD thesis,
       University of Warwick, 1985.
    """
    coefficients = _usable_dirlik(m0, m1, m2, m4)
    scale = 2.0 * math.sqrt(m0)
    z = np.asarray(stress_range, dtype=float) / scale
    return (_dirlik_pdf_z(z, *coefficients) / scale)[()]


# --------------------------------------------------- damage, one-slope S-N curve


def _one_slope(slope, constant):
    k = _positive("S-N slope", slope, "")
    c = _positive("S-N constant", constant, "Pa^k")
    return k, c


def damage_narrow_band(
    frequency: ArrayLike, psd: ArrayLike, duration: float, slope: float, constant: float
) -> float:
    """Fatigue damage by the narrow-band (Rayleigh) formula, one-slope S-N curve.

    Parameters
    ----------
    frequency : array_like
        Frequencies of the PSD table, strictly increasing [Hz].
    psd : array_like
        One-sided stress PSD [Pa^2/Hz].
    duration : float
        Exposure time [s].
    slope : float
        Inverse slope k of the S-N curve N S^k = C [unitless].
    constant : float
        C of the S-N curve in stress ranges [Pa^k].

    Returns
    -------
    float
        Palmgren-Miner damage over the duration [unitless].

    Notes
    -----
    D = nu_0+ T (2 sqrt(2 m0))^k Gamma(1 + k/2) / C: every up-crossing one cycle with a
    Rayleigh-distributed amplitude. Exact for a narrow-band process, conservative for a
    broad one.

    References
    ----------
    .. [1] J. W. Miles, On structural fatigue under random loading, Journal of the
       Aeronautical Sciences 21 (1954) 753-762.
    .. [2] P. H. Wirsching, T. L. Paez, K. Ortiz, Random Vibrations: Theory and
       Practice, Wiley, 1995, ch. 10 (from memory).
    """
    t = _non_negative("duration", duration, "s")
    k, c = _one_slope(slope, constant)
    moments = _moments_checked(frequency, psd)
    if moments is None or t == 0:
        return 0.0
    m0, _, m2, _ = moments
    nu0 = math.sqrt(m2 / m0)
    log_d = (
        math.log(nu0 * t)
        + k * math.log(2.0 * math.sqrt(2.0 * m0))
        + math.lgamma(1 + k / 2)
        - math.log(c)
    )
    return math.exp(log_d)


def damage_dirlik(
    frequency: ArrayLike, psd: ArrayLike, duration: float, slope: float, constant: float
) -> float:
    """Fatigue damage by Dirlik's range density, one-slope S-N curve.

    Parameters
    ----------
    frequency : array_like
        Frequencies of the PSD table, strictly increasing [Hz].
    psd : array_like
        One-sided stress PSD [Pa^2/Hz].
    duration : float
        Exposure time [s].
    slope : float
        Inverse slope k of the S-N curve N S^k = C [unitless].
    constant : float
        C of the S-N curve in stress ranges [Pa^k].

    Returns
    -------
    float
        Palmgren-Miner damage over the duration [unitless].

    Notes
    -----
    D = nu_p T / C (2 sqrt(m0))^k [D1 Q^k Gamma(1 + k) + 2^(k/2) Gamma(1 + k/2)
    (D2 |R|^k + D3)], the integral of S^k p(S) for Dirlik's density with the peak rate
    nu_p as the cycle rate.

    References
    ----------
    .. [1] T. Dirlik, Application of computers in fatigue analysis, PhD thesis,
       University of Warwick, 1985.
    .. [2] N. W. M. Bishop, F. Sherratt, Finite Element Based Fatigue Calculations,
       NAFEMS, 2000, ch. 6 (from memory).
    """
    t = _non_negative("duration", duration, "s")
    k, c = _one_slope(slope, constant)
    moments = _moments_checked(frequency, psd)
    if moments is None or t == 0:
        return 0.0
    m0, m1, m2, m4 = moments
    d1, d2, d3, q, r = _usable_dirlik(m0, m1, m2, m4)
    nu_p = math.sqrt(m4 / m2)
    bracket = d1 * q**k * math.gamma(1 + k) + 2.0 ** (k / 2) * math.gamma(1 + k / 2) * (
        d2 * abs(r) ** k + d3
    )
    return nu_p * t / c * (2.0 * math.sqrt(m0)) ** k * bracket


def damage_three_band(
    frequency: ArrayLike, psd: ArrayLike, duration: float, slope: float, constant: float
) -> float:
    """Fatigue damage by Steinberg's three-band method, one-slope S-N curve.

    Parameters
    ----------
    frequency : array_like
        Frequencies of the PSD table, strictly increasing [Hz].
    psd : array_like
        One-sided stress PSD [Pa^2/Hz].
    duration : float
        Exposure time [s].
    slope : float
        Inverse slope k of the S-N curve N S^k = C [unitless].
    constant : float
        C of the S-N curve in stress ranges [Pa^k].

    Returns
    -------
    float
        Palmgren-Miner damage over the duration [unitless].

    Notes
    -----
    D = nu_0+ T sum_i p_i (2 i sigma)^k / C over the bands of
    :data:`STEINBERG_THREE_BAND` (amplitude i sigma, range 2 i sigma, share p_i),
    sigma = sqrt(m0).

    References
    ----------
    .. [1] D. S. Steinberg, Vibration Analysis for Electronic Equipment, 3rd ed.,
       Wiley, 2000, sec. 8.10 (section number from memory).
    """
    t = _non_negative("duration", duration, "s")
    k, c = _one_slope(slope, constant)
    moments = _moments_checked(frequency, psd)
    if moments is None or t == 0:
        return 0.0
    m0, _, m2, _ = moments
    sigma = math.sqrt(m0)
    nu0 = math.sqrt(m2 / m0)
    return nu0 * t * sum(p * (2.0 * level * sigma) ** k for level, p in STEINBERG_THREE_BAND) / c


# ------------------------------------------------------ damage, any S-N curve


_GAUSS_POINTS = 16
_PANELS = 256
"""Composite Gauss-Legendre rule of the curve integrals: 256 panels of 16 points on
each smooth piece between the curve's knees (the integrand is smooth there, so the
rule is accurate to about 1e-12; checked in the tests against an independent
fine-grid sum and against FLife)."""


def gauss_legendre(points: int) -> tuple[np.ndarray, np.ndarray]:
    """Nodes (ascending) and weights of the ``points``-point Gauss-Legendre rule on [-1, 1].

    Golub and Welsch (1969), "Calculation of Gauss quadrature rules", Math. Comp. 23: the
    nodes are the eigenvalues of the symmetric tridiagonal Jacobi matrix of the Legendre
    recurrence, off-diagonal k / sqrt(4 k^2 - 1) for k = 1 .. n-1, and each weight is 2
    times the squared first component of its normalised eigenvector. Dimensionless.
    """
    k = np.arange(1, points, dtype=float)
    off = k / np.sqrt(4.0 * k * k - 1.0)
    jacobi = np.diag(off, 1) + np.diag(off, -1)
    nodes, vectors = np.linalg.eigh(jacobi)
    weights = 2.0 * vectors[0, :] ** 2
    # the rule is symmetric: mirror the halves so that it is exactly so
    nodes = 0.5 * (nodes - nodes[::-1])
    weights = 0.5 * (weights + weights[::-1])
    return nodes, weights


@functools.lru_cache(maxsize=4)
def _gauss_rule(points: int) -> tuple[np.ndarray, np.ndarray]:
    """:func:`gauss_legendre`, worked out once (read-only arrays)."""
    nodes, weights = gauss_legendre(points)
    nodes.flags.writeable = weights.flags.writeable = False
    return nodes, weights


def _integrate_against_curve(pdf_z, scale, curve, upper_z):
    """Integral of p(Z) / N(scale Z) dZ from 0 to upper_z, split at the curve's knees.

    Composite Gauss-Legendre quadrature (nodes and weights of :func:`gauss_legendre`),
    vectorised, so that the checking path imports neither scipy.integrate nor
    numpy.polynomial.
    """
    nodes, weights = _gauss_rule(_GAUSS_POINTS)
    knees = sorted(k / scale for k in curve.knee_stress_ranges if 0 < k / scale < upper_z)
    edges = [0.0, *knees, upper_z]
    total = 0.0
    for low, high in itertools.pairwise(edges):
        if high <= low:
            continue
        panel = np.linspace(low, high, _PANELS + 1)
        half = 0.5 * np.diff(panel)
        middle = 0.5 * (panel[1:] + panel[:-1])
        z = (middle[:, None] + half[:, None] * nodes[None, :]).ravel()
        w = (half[:, None] * weights[None, :]).ravel()
        n = np.asarray(curve.cycles_variable_amplitude(scale * z), dtype=float)
        inverse = np.where(np.isinf(n), 0.0, 1.0 / np.where(np.isinf(n), 1.0, n))
        total += float(np.sum(w * np.asarray(pdf_z(z), dtype=float) * inverse))
    return total


def _upper_z(curve, *scales):
    """A normalised range beyond which every term's contribution is negligible."""
    m = max(curve.slopes)
    tail = math.sqrt(m + 1.0) + 12.0  # Gaussian terms: z^(m+1) exp(-z^2/2)
    bound = max(tail * s for s in scales if s > 0)
    return bound


def damage_narrow_band_curve(frequency: ArrayLike, psd: ArrayLike, duration: float, curve) -> float:
    """Fatigue damage of the Rayleigh range density against any S-N curve.

    Parameters
    ----------
    frequency : array_like
        Frequencies of the PSD table, strictly increasing [Hz].
    psd : array_like
        One-sided stress PSD [Pa^2/Hz].
    duration : float
        Exposure time [s].
    curve : vcheck.dynamics.fatigue.sn_curves.SNCurve
        S-N curve; its variable-amplitude branches are used [-].

    Returns
    -------
    float
        Palmgren-Miner damage over the duration [unitless].

    Notes
    -----
    D = nu_0+ T integral p(S) / N(S) dS with the Rayleigh range density of
    :func:`range_pdf_rayleigh`, integrated numerically (scipy.integrate.quad, split at
    the curve's knees). For a one-slope curve it equals :func:`damage_narrow_band`.
    """
    t = _non_negative("duration", duration, "s")
    moments = _moments_checked(frequency, psd)
    if moments is None or t == 0:
        return 0.0
    m0, _, m2, _ = moments
    scale = 2.0 * math.sqrt(m0)

    def pdf_z(z):
        return z * np.exp(-z * z / 2.0)

    integral = _integrate_against_curve(pdf_z, scale, curve, _upper_z(curve, 1.0))
    return math.sqrt(m2 / m0) * t * integral


def damage_dirlik_curve(frequency: ArrayLike, psd: ArrayLike, duration: float, curve) -> float:
    """Fatigue damage of Dirlik's range density against any S-N curve.

    Parameters
    ----------
    frequency : array_like
        Frequencies of the PSD table, strictly increasing [Hz].
    psd : array_like
        One-sided stress PSD [Pa^2/Hz].
    duration : float
        Exposure time [s].
    curve : vcheck.dynamics.fatigue.sn_curves.SNCurve
        S-N curve; its variable-amplitude branches are used [-].

    Returns
    -------
    float
        Palmgren-Miner damage over the duration [unitless].

    Notes
    -----
    D = nu_p T integral p(S) / N(S) dS with Dirlik's density
    (:func:`range_pdf_dirlik`), integrated numerically (scipy.integrate.quad, split at
    the curve's knees). For a one-slope curve it equals :func:`damage_dirlik`.

    References
    ----------
    .. [1] T. Dirlik, Application of computers in fatigue analysis, PhD thesis,
       University of Warwick, 1985.
    """
    t = _non_negative("duration", duration, "s")
    moments = _moments_checked(frequency, psd)
    if moments is None or t == 0:
        return 0.0
    m0, m1, m2, m4 = moments
    d1, d2, d3, q, r = _usable_dirlik(m0, m1, m2, m4)
    scale = 2.0 * math.sqrt(m0)

    def pdf_z(z):
        return _dirlik_pdf_z(z, d1, d2, d3, q, r)

    m = max(curve.slopes)
    upper = max(
        _upper_z(curve, 1.0, abs(r)),
        q * ((m + 1.0) + 15.0 * math.sqrt(m + 1.0) + 30.0) if d1 > 0 else 0.0,
    )
    integral = _integrate_against_curve(pdf_z, scale, curve, upper)
    return math.sqrt(m4 / m2) * t * integral


def damage_three_band_curve(frequency: ArrayLike, psd: ArrayLike, duration: float, curve) -> float:
    """Fatigue damage by Steinberg's three-band method against any S-N curve.

    Parameters
    ----------
    frequency : array_like
        Frequencies of the PSD table, strictly increasing [Hz].
    psd : array_like
        One-sided stress PSD [Pa^2/Hz].
    duration : float
        Exposure time [s].
    curve : vcheck.dynamics.fatigue.sn_curves.SNCurve
        S-N curve; its variable-amplitude branches are used [-].

    Returns
    -------
    float
        Palmgren-Miner damage over the duration [unitless].

    Notes
    -----
    D = sum_i nu_0+ T p_i / N(2 i sigma) over the bands of :data:`STEINBERG_THREE_BAND`.

    References
    ----------
    .. [1] D. S. Steinberg, Vibration Analysis for Electronic Equipment, 3rd ed.,
       Wiley, 2000, sec. 8.10 (section number from memory).
    """
    t = _non_negative("duration", duration, "s")
    moments = _moments_checked(frequency, psd)
    if moments is None or t == 0:
        return 0.0
    m0, _, m2, _ = moments
    sigma = math.sqrt(m0)
    cycles = math.sqrt(m2 / m0) * t
    ranges = np.array([2.0 * level * sigma for level, _ in STEINBERG_THREE_BAND])
    shares = np.array([p for _, p in STEINBERG_THREE_BAND])
    return float(np.sum(cycles * shares / curve.cycles_variable_amplitude(ranges)))


# ----------------------------------------------------------------------- Miles


def miles_rms_response(natural_frequency: ArrayLike, quality_factor: ArrayLike, asd: ArrayLike):
    """RMS acceleration of a lightly damped SDOF system on a flat random base input.

    Parameters
    ----------
    natural_frequency : array_like
        Natural frequency f_n of the system [Hz].
    quality_factor : array_like
        Q = 1 / (2 zeta) at resonance [unitless].
    asd : array_like
        One-sided base-acceleration spectral density, flat around f_n [(m/s^2)^2/Hz].

    Returns
    -------
    numpy.ndarray or numpy.float64
        RMS response acceleration [m/s^2].

    Notes
    -----
    Miles' equation, G_rms = sqrt(pi/2 f_n Q ASD): the integral over all frequencies
    of 1 / ((1 - r^2)^2 + (2 zeta r)^2) is pi / (4 zeta) times f_n. It takes the
    input as flat over the resonance and the response as the relative motion times
    omega_n^2; the absolute acceleration's integral is larger by (1 + 4 zeta^2), a
    0.5 % larger RMS at Q = 10.

    References
    ----------
    .. [1] J. W. Miles, On structural fatigue under random loading, Journal of the
       Aeronautical Sciences 21 (1954) 753-762.

    Examples
    --------
    100 Hz, Q = 10, 0.04 g^2/Hz gives about 7.93 g:

    >>> g = 9.80665
    >>> round(float(miles_rms_response(100.0, 10.0, 0.04 * g**2)) / g, 3)
    7.927
    """
    fn = np.asarray(natural_frequency, dtype=float)
    q = np.asarray(quality_factor, dtype=float)
    a = np.asarray(asd, dtype=float)
    for name, value, unit in (
        ("natural frequency", fn, "Hz"),
        ("quality factor", q, ""),
    ):
        if value.size and not (np.isfinite(value) & (value > 0)).all():
            bad = value[~(np.isfinite(value) & (value > 0))].flat[0]
            raise ValueError(f"{name} must be positive, got {bad:g} {unit}".rstrip())
    if a.size and not (np.isfinite(a) & (a >= 0)).all():
        bad = a[~(np.isfinite(a) & (a >= 0))].flat[0]
        raise ValueError(
            f"acceleration spectral density must be zero or positive, got {bad:g} (m/s^2)^2/Hz"
        )
    return np.sqrt(np.pi / 2.0 * fn * q * a)[()]

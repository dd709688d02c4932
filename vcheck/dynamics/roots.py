"""A bracketed root finder for scalar equations, so that the checking path does not
pay for importing scipy.optimize (about 0.3 s here) to solve a few characteristic
equations.
"""

from __future__ import annotations

import math
from collections.abc import Callable

__all__ = ["brent_root", "maximum_on_interval"]


def brent_root(func: Callable[[float], float], low: float, high: float,
               xtol: float = 1e-14, maxiter: int = 200) -> float:
    """Root of ``func`` in [low, high], where ``func`` changes sign, by Brent's method.

    Parameters
    ----------
    func : callable
        A continuous function of one float.
    low, high : float
        A bracket: func(low) and func(high) have opposite signs (or one is zero).
    xtol : float
        Absolute tolerance on the root, combined with 4 machine epsilons relative.
    maxiter : int
        Most iterations.

    Returns
    -------
    float
        The root.

    Notes
    -----
    Inverse quadratic interpolation and the secant step where they stay inside the
    bracket and converge, bisection otherwise: converges whenever bisection does, and
    superlinearly near a simple root [1]_.

    References
    ----------
    .. [1] R. P. Brent, Algorithms for Minimization without Derivatives, Prentice-Hall,
       1973, ch. 4.
    """
    a, b = float(low), float(high)
    fa, fb = func(a), func(b)
    if fa == 0.0:
        return a
    if fb == 0.0:
        return b
    if (fa > 0) == (fb > 0):
        raise ValueError(f"the bracket [{a:g}, {b:g}] does not change sign")
    c, fc = a, fa
    d = e = b - a
    for _ in range(maxiter):
        if (fb > 0) == (fc > 0):
            c, fc = a, fa
            d = e = b - a
        if abs(fc) < abs(fb):
            a, b, c = b, c, b
            fa, fb, fc = fb, fc, fb
        tol = 2.0 * 2.220446049250313e-16 * abs(b) + 0.5 * xtol
        half = 0.5 * (c - b)
        if abs(half) <= tol or fb == 0.0:
            return b
        if abs(e) >= tol and abs(fa) > abs(fb):
            s = fb / fa
            if a == c:  # secant
                p, q = 2.0 * half * s, 1.0 - s
            else:  # inverse quadratic interpolation
                q, r = fa / fc, fb / fc
                p = s * (2.0 * half * q * (q - r) - (b - a) * (r - 1.0))
                q = (q - 1.0) * (r - 1.0) * (s - 1.0)
            if p > 0:
                q = -q
            p = abs(p)
            if 2.0 * p < min(3.0 * half * q - abs(tol * q), abs(e * q)):
                e, d = d, p / q
            else:
                d = e = half
        else:
            d = e = half
        a, fa = b, fb
        b += d if abs(d) > tol else math.copysign(tol, half)
        fb = func(b)
    raise ValueError(f"no convergence in {maxiter} iterations in [{low:g}, {high:g}]")


_INVERSE_GOLDEN = (math.sqrt(5.0) - 1.0) / 2.0


def maximum_on_interval(func: Callable[[float], float], low: float, high: float,
                        seeds: tuple[float, ...] = (), samples: int = 64,
                        rtol: float = 1e-10) -> tuple[float, float]:
    """Largest value of a continuous function on [low, high], and where it is.

    Parameters
    ----------
    func : callable
        A continuous function of one float; ``inf`` is allowed and wins at once.
    low, high : float
        The interval; ``low == high`` evaluates the one point.
    seeds : tuple of float
        Points where a sharp peak may sit (resonances); those inside the interval are
        evaluated, with their neighbours, beside a geometric sample.
    samples : int
        Points of the geometric (linear where ``low`` is not positive) sample.
    rtol : float
        Relative tolerance on the abscissa of the refined maximum.

    Returns
    -------
    tuple of float
        ``(value, x)``.

    Notes
    -----
    The sample and the seeds bracket every local maximum that is wider than the sample
    spacing or sits at a seed; each of the best few is refined by golden-section search
    between its neighbours [1]_, which converges to the maximum of a unimodal bracket.
    A peak that is both narrower than the spacing and away from every seed could be
    missed: callers seed every resonance.

    References
    ----------
    .. [1] J. Kiefer, Sequential minimax search for a maximum, Proceedings of the
       American Mathematical Society 4(3), 1953, 502-506 (from memory).
    """
    if high < low:
        raise ValueError(f"the interval [{low:g}, {high:g}] is reversed")
    if high == low:
        return float(func(low)), float(low)
    if low > 0:
        ratio = (high / low) ** (1.0 / (samples - 1))
        grid = [low * ratio**i for i in range(samples)]
    else:
        grid = [low + (high - low) * i / (samples - 1) for i in range(samples)]
    grid[0], grid[-1] = low, high
    for seed in seeds:
        if low < seed < high:
            grid.append(seed)
    grid = sorted(set(grid))
    values = [float(func(x)) for x in grid]
    best = max(range(len(grid)), key=lambda i: values[i])
    if math.isinf(values[best]):
        return values[best], grid[best]
    # refine the best local maxima (a seed's peak and its neighbours may compete)
    peaks = [i for i in range(len(grid)) if (i == 0 or values[i] >= values[i - 1])
             and (i == len(grid) - 1 or values[i] >= values[i + 1])]
    peaks = sorted(peaks, key=lambda i: -values[i])[:4]
    found_value, found_x = values[best], grid[best]
    for i in peaks:
        a = grid[max(i - 1, 0)]
        b = grid[min(i + 1, len(grid) - 1)]
        value, x = _golden(func, a, b, rtol)
        if value > found_value:
            found_value, found_x = value, x
    return found_value, found_x


def _golden(func, a: float, b: float, rtol: float) -> tuple[float, float]:
    c = b - _INVERSE_GOLDEN * (b - a)
    d = a + _INVERSE_GOLDEN * (b - a)
    fc, fd = float(func(c)), float(func(d))
    best = max((fc, c), (fd, d))
    for _ in range(200):
        if abs(b - a) <= rtol * max(abs(a), abs(b), 1e-300):
            break
        if fc > fd:
            b, d, fd = d, c, fc
            c = b - _INVERSE_GOLDEN * (b - a)
            fc = float(func(c))
        else:
            a, c, fc = c, d, fd
            d = a + _INVERSE_GOLDEN * (b - a)
            fd = float(func(d))
        best = max(best, (fc, c), (fd, d))
    return best

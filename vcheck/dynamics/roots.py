"""A bracketed root finder for scalar equations, so that the checking path does not
pay for importing scipy.optimize (about 0.3 s here) to solve a few characteristic
equations.
"""

from __future__ import annotations

import math
from collections.abc import Callable

__all__ = ["brent_root"]


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

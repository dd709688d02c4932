"""The bracketed root finder against scipy.optimize.brentq (an independent
implementation of the same method) and closed-form roots."""

from __future__ import annotations

import math

import pytest
from scipy.optimize import brentq

from vcheck.dynamics.roots import brent_root

# (function, bracket, agreement): both solvers stop within xtol of a simple root, so
# they agree to ~1e-13.
CASES = [
    (lambda x: x * x - 2.0, 0.0, 2.0, 1e-13),                        # sqrt(2)
    (lambda x: math.cos(x) * math.cosh(x) + 1.0, 1.0, 3.0, 1e-13),    # cantilever beta L
    (lambda x: math.tan(x) - math.tanh(x), 3.5, 4.5, 1e-13),          # clamped-pinned
    (lambda x: math.exp(x) - 10.0, -5.0, 5.0, 1e-13),                 # ln 10
    (lambda x: x ** 3 - x - 2.0, 1.0, 2.0, 1e-13),                    # a cubic
    (lambda x: math.atan(x - 0.3) * 1e-12, -10.0, 10.0, 1e-13),       # tiny values
]


@pytest.mark.parametrize(("func", "low", "high", "agreement"), CASES)
def test_agrees_with_scipy_brentq(func, low, high, agreement):
    ours = brent_root(func, low, high, xtol=1e-14)
    theirs = brentq(func, low, high, xtol=1e-14)
    assert ours == pytest.approx(theirs, abs=agreement)


def test_closed_form_roots():
    assert brent_root(lambda x: x * x - 2.0, 0.0, 2.0) == pytest.approx(math.sqrt(2.0), abs=1e-14)
    # cantilever first root 1.875104069 (Blevins, beam table; REFERENCES.md)
    root = brent_root(lambda x: math.cos(x) * math.cosh(x) + 1.0, 1.0, 3.0)
    assert root == pytest.approx(1.8751040687, abs=1e-9)


def test_triple_root_converges():
    # f = (x - 1)^3 is zero to rounding over about 1e-5 around the root, so that is the
    # accuracy any solver has there; ours must still stop (scipy's brentq reports no
    # convergence with xtol 1e-14 on it).
    assert brent_root(lambda x: (x - 1.0) ** 3, 0.0, 3.0) == pytest.approx(1.0, abs=1e-5)


def test_end_points_and_bad_bracket():
    assert brent_root(lambda x: x, 0.0, 1.0) == 0.0
    assert brent_root(lambda x: x - 1.0, 0.0, 1.0) == 1.0
    with pytest.raises(ValueError, match=r"the bracket \[2, 3\] does not change sign"):
        brent_root(lambda x: x * x - 2.0, 2.0, 3.0)


def test_maximum_on_interval_against_a_dense_sweep():
    # Independent numerical method: a dense sweep of 10^5 points. The function is the
    # one-degree-of-freedom unbalance response r^2 T(r) of a lightly damped isolator
    # (zeta 0.01; T from the closed form in shared/REFERENCES.md), whose peak near r = 1
    # is far narrower than the 64-point sample: the seed at r = 1 must find it.
    import numpy as np

    from vcheck.dynamics.roots import maximum_on_interval

    zeta = 0.01

    def response(r):
        return r * r * math.sqrt((1 + (2 * zeta * r) ** 2) / ((1 - r * r) ** 2 + (2 * zeta * r) ** 2))

    value, where = maximum_on_interval(response, 0.2, 3.0, seeds=(1.0,))
    r = np.linspace(0.2, 3.0, 100_001)
    dense = r * r * np.sqrt((1 + (2 * zeta * r) ** 2) / ((1 - r * r) ** 2 + (2 * zeta * r) ** 2))
    assert value >= dense.max() * (1 - 1e-12)  # the sweep can only be lower
    assert value == pytest.approx(dense.max(), rel=1e-4)  # the sweep's spacing 2.8e-5
    assert where == pytest.approx(r[np.argmax(dense)], abs=1e-4)
    # above resonance r^2 T dips and then grows again (the damper's force): on [3, 40]
    # the largest value is the upper end, found as such
    top, at = maximum_on_interval(response, 3.0, 40.0, seeds=(1.0,))
    assert at == 40.0 and top == pytest.approx(response(40.0), rel=1e-15)


def test_maximum_on_interval_end_point_and_one_point():
    from vcheck.dynamics.roots import maximum_on_interval

    assert maximum_on_interval(lambda x: x, 1.0, 2.0) == (2.0, 2.0)
    assert maximum_on_interval(lambda x: -x, 1.0, 1.0) == (-1.0, 1.0)
    value, where = maximum_on_interval(lambda x: -(x - 0.3) ** 2, 0.0, 1.0)
    assert where == pytest.approx(0.3, abs=1e-8) and value == pytest.approx(0.0, abs=1e-15)
    with pytest.raises(ValueError, match=r"^the interval \[2, 1\] is reversed$"):
        maximum_on_interval(lambda x: x, 2.0, 1.0)

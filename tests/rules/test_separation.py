"""The frequency-separation rule: its margin arithmetic against hand calculation."""

from __future__ import annotations

import pytest
from vcheck.rules.separation import SeparationOptions, separation_margin


def test_margin_arithmetic_by_hand():
    # Hand calculation of the definition (common practice: 0.8 <= f_n / f <= 1.2 avoided).
    assert separation_margin(20.0, 20.0, 25.0, 30.0) == pytest.approx((0.2, "below"))
    assert separation_margin(36.0, 36.0, 25.0, 30.0) == pytest.approx((0.2, "above"))
    assert separation_margin(24.0, 26.0, 25.0, 30.0) == (0.0, "inside")
    # a band that touches is inside
    assert separation_margin(20.0, 25.0, 25.0, 30.0) == (0.0, "inside")


def test_options_must_be_ordered():
    with pytest.raises(ValueError, match=r"warn-margin \(0.1\) must not be below required-margin \(0.2\)"):
        SeparationOptions(required_margin=0.2, warn_margin=0.1)

"""Large ratios and echoed masses said as an engineer writes them (the text report)."""

from __future__ import annotations

import pytest

from vcheck.design.units import engineering_number, in_units_of, parse_amount


def test_a_mass_is_echoed_in_the_unit_the_design_used():
    pounds = parse_amount("600 lb", "mass")
    # the international pound is 0.45359237 kg exactly (1959 agreement)
    assert pounds.value == pytest.approx(600 * 0.45359237, rel=1e-12)
    assert in_units_of(pounds, pounds.value, "kg") == "600 lb"
    assert in_units_of(pounds, 1.5 * pounds.value, "kg") == "900 lb"
    banded = parse_amount("310 kg +-5%", "mass")
    assert in_units_of(banded, banded.high, "kg") == "325.5 kg"
    assert in_units_of(parse_amount("420 kg", "mass"), 620.0, "kg") == "620 kg"


def test_engineering_numbers():
    assert engineering_number(272.155422) == "272.2"
    assert engineering_number(10596.4) == "10596"
    assert engineering_number(0.81249) == "0.8125"


@pytest.mark.parametrize("module", ["vcheck.rules.separation", "vcheck.rules.torsional",
                                    "vcheck.report.dynamics_view",
                                    "vcheck.report.torsional_view"])
def test_a_separation_over_100_percent_is_a_multiple(module):
    import importlib

    apart = importlib.import_module(module)._apart
    # a mode at 80 Hz over a band topping at 24.67 Hz: (80 - 24.67) / 24.67 = 224.3%
    assert apart((80 - 24.666667) / 24.666667, "above") == "x3.24 above"
    assert apart(0.999, "above") == "99.9% above"
    assert apart(0.238, "below") == "23.8% below"
    assert apart(0.0, "inside") == "inside"


def test_a_negative_efficiency_is_said_as_amplification():
    from vcheck.rules.isolation import _percent

    # T = 4.7 at a frequency ratio near 1: E = 1 - T = -3.7, "amplifies x4.7"
    assert _percent(1 - 4.7) == "none (amplifies x4.7)"
    assert _percent(0.968) == "96.8%"


def test_a_damage_over_twice_the_allowed_is_a_multiple():
    from vcheck.rules.fatigue import _share

    assert _share(3.677) == "3.68 times"
    assert _share(0.761) == "76.1% of"

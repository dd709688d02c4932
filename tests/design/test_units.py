"""Units: conversions against NIST SP 811 (2008) Appendix B, and exact refusals."""

from __future__ import annotations

import math

import pytest

from vcheck.design.units import UnitError, parse_amount

# NIST Special Publication 811 (2008), Appendix B.8 and B.9: exact definitions.
INCH = 0.0254  # m, exact
POUND_FORCE = 4.4482216152605  # N, exact (lbm x standard gravity)
STANDARD_GRAVITY = 9.80665  # m/s^2, exact (3rd CGPM, 1901)
POUND = 0.45359237  # kg, exact


@pytest.mark.parametrize(
    ("text", "kind", "si"),
    [
        ("1 in", "length", INCH),
        ("25.4 mm", "length", INCH),
        ("1 ft", "length", 12 * INCH),
        ("1 lbf", "force", POUND_FORCE),
        ("1 kip", "force", 1000 * POUND_FORCE),
        ("1 lb", "mass", POUND),
        ("2.5 g", "acceleration", 2.5 * STANDARD_GRAVITY),  # g is standard gravity
        ("500 mg", "acceleration", 0.5 * STANDARD_GRAVITY),  # milli-g, as accelerometers read
        ("1 lbf/in", "stiffness", POUND_FORCE / INCH),
        ("0.5 in/s", "velocity", 0.5 * INCH),
        ("1 psi", "stress", POUND_FORCE / INCH**2),
        ("14 N/mm^2", "stress", 14e6),
        ("30 lbf*ft", "torque", 30 * POUND_FORCE * 12 * INCH),
        ("1 kg*m^2", "inertia", 1.0),
        ("6000 h", "time", 6000 * 3600.0),
    ],
)
def test_conversion_matches_nist_exact_factor(text, kind, si):
    # The factors are exact by definition, so only float rounding separates them.
    assert parse_amount(text, kind).value == pytest.approx(si, rel=1e-12)


def test_rpm_is_one_sixtieth_of_a_hertz():
    # 1 rpm = 1 revolution per minute = 1/60 Hz (definition). pint's own registry would
    # give 154.99 for "1480 rpm" in Hz, counting radians; ours must give 24.667.
    assert parse_amount("1480 rpm", "frequency").value == pytest.approx(1480 / 60, rel=1e-14)
    assert parse_amount("60 cpm", "frequency").value == pytest.approx(1.0, rel=1e-14)


def test_radian_per_second_converts_through_two_pi():
    # omega = 2 pi f (definition of angular frequency)
    assert parse_amount("100 rad/s", "frequency").value == pytest.approx(100 / (2 * math.pi))


def test_tolerance_band_percent_and_absolute():
    amount = parse_amount("210 kN/m +-10%", "stiffness")
    assert (amount.low, amount.value, amount.high) == pytest.approx((189e3, 210e3, 231e3))
    amount = parse_amount("420 kg ± 20 kg", "mass")
    assert (amount.low, amount.high) == pytest.approx((400.0, 440.0))
    assert not parse_amount("420 kg", "mass").has_tolerance


@pytest.mark.parametrize(
    ("raw", "kind", "message"),
    [
        (250, "mass",
         'the number 250 has no unit; write a mass such as "420 kg" or "925 lb" '
         '(in quotes: "250 kg")'),
        ("250", "mass", "'250' has no unit; write a mass such as \"420 kg\" or \"925 lb\""),
        ("2 g", "mass",
         "'2 g' is an acceleration, but a mass such as \"420 kg\" or \"925 lb\" is expected "
         "('g' is standard gravity in vcheck; grams are written 'gram')"),
        ("180 kg", "stiffness",
         "'180 kg' is a mass, but a stiffness such as \"180 kN/m\" or \"1000 lbf/in\" is "
         "expected"),
        ("1480 rmp", "frequency",
         "unknown unit 'rmp' in '1480 rmp'; units accepted for a frequency or speed: "
         "Hz, rpm, cpm, rad/s"),
        ("nan kg", "mass",
         "'nan kg' is not a finite number; write a mass such as \"420 kg\" or \"925 lb\""),
        ("1e400 kg", "mass",
         "'1e400 kg' is not a finite number; write a mass such as \"420 kg\" or \"925 lb\""),
        ("5 kg +-3", "mass",
         "'5 kg +-3': give the tolerance in percent or with a unit, as in \"420 kg +-10%\""),
    ],
)
def test_refusals_say_what_is_expected(raw, kind, message):
    with pytest.raises(UnitError) as caught:
        parse_amount(raw, kind)
    assert str(caught.value) == message


def test_tolerance_refused_where_not_accepted():
    with pytest.raises(UnitError, match="a tolerance is not accepted here"):
        parse_amount("1480 rpm +-5%", "frequency", allow_tolerance=False)


def test_an_amount_read_twice_is_the_same_and_the_store_stays_bounded(monkeypatch):
    # Reference: the first reading of each text (the store only repeats it): 25 mm is
    # 0.025 m exactly by the SI prefix; the store never holds more than its limit.
    from vcheck.design import units

    monkeypatch.setattr(units, "_READ", {})
    monkeypatch.setattr(units, "_READ_LIMIT", 8)
    first = units.parse_amount("25 mm +-10%", "length")
    assert units.parse_amount("25 mm +-10%", "length") == first
    assert first.value == 0.025 and abs(first.high - 0.0275) < 1e-15
    with pytest.raises(units.UnitError, match="a tolerance is not accepted here"):
        units.parse_amount("25 mm +-10%", "length", allow_tolerance=False)
    for _ in range(2):  # an error is never stored: it is raised each time
        with pytest.raises(units.UnitError, match="'25 kg' is a mass, but a length"):
            units.parse_amount("25 kg", "length")
    assert ("25 kg", "length", True) not in units._READ
    for n in range(40):
        assert units.parse_amount(f"{n + 1} mm", "length").value == pytest.approx((n + 1) / 1000, rel=1e-15)
        assert len(units._READ) <= 8

"""The measured-vibration rule and measured levels in joint-slip, against outside values.

Zone boundaries: ISO 10816-3:2009 Annex A, Table A.1, mm/s RMS (from memory; ISO
20816-3:2022 is believed to keep them), and ISO 10816-1:1995 Annex B, Table B.1 class I.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest
from vcheck.rules.loosening import vibration_load
from vcheck.rules.measured import MeasuredOptions, MeasuredVibration

from vcheck.design.loader import attach_references, design_from_document, parse_toml_text
from vcheck.findings import Status

# ISO 10816-3:2009 Table A.1 (from memory), A/B, B/C, C/D in mm/s RMS, kept here apart
# from the code's own table.
TABLE_A1 = {
    (1, "rigid"): (2.3, 4.5, 7.1),
    (1, "flexible"): (3.5, 7.1, 11.0),
    (2, "rigid"): (1.4, 2.8, 4.5),
    (2, "flexible"): (2.3, 4.5, 7.1),
}
CLASS_I = (0.71, 1.8, 4.5)  # ISO 10816-1:1995 Table B.1, class I

DESIGN = """format = 1

[machine]
tag = "T-1"
kind = "centrifugal-pump"
mass = "420 kg"
speed = "{speed}"
{power}

[mounting]
kind = "rigid"

[support]
kind = "slab-on-grade"

[[natural-frequency]]
name = "base"
frequency = "{mode}"
"""

READING = """
[[measurement]]
location = "bearing"
quantity = "velocity"
reading = "rms"
value = "{value} mm/s"
band = {{ min = "{low} Hz", max = "1000 Hz" }}
{extra}
"""


def _design(text: str, root: Path | None = None):
    design = design_from_document(parse_toml_text(text, "t.toml"))
    if root is not None:
        attach_references(design, root, {})
    return design


def _check(design, **options):
    return list(MeasuredVibration().check(design, MeasuredOptions(**options)))


def _bearing(value: float, *, speed="1480 rpm", power="", mode="80 Hz", low=10, extra=""):
    text = DESIGN.format(speed=speed, power=power, mode=mode) + READING.format(
        value=value, low=low, extra=extra)
    return _check(_design(text))


@pytest.mark.parametrize(("key", "row"), sorted(TABLE_A1.items()))
def test_zones_follow_table_a1(key, row):
    group, support = key
    extra = f'machine-group = {group}\nsupport-class = "{support}"'
    zones = []
    for value in (0.98 * row[0], 1.02 * row[0], 0.98 * row[1], 1.02 * row[1],
                  0.98 * row[2], 1.02 * row[2]):
        (finding,) = _bearing(round(value, 4), extra=extra)
        zones.append((finding.message.split(", zone ")[1][0], finding.status))
    assert zones == [("A", Status.PASS), ("B", Status.PASS), ("B", Status.PASS),
                     ("C", Status.WARN), ("C", Status.WARN), ("D", Status.FAIL)]


def test_group_from_power_and_support_from_the_modes():
    # 350 kW > 300 kW: group 1; lowest mode 40 Hz >= 1.25 x 24.67 Hz: rigid -> 2.3/4.5/7.1
    (finding,) = _bearing(4.0, power='power = "350 kW"', mode="40 Hz")
    assert "zone B" in finding.message and "group 1 (machine power 350 kW), rigid" in \
        finding.message
    # 28 Hz < 1.25 x 24.67 = 30.8 Hz: flexible -> 3.5/7.1/11, 7.0 mm/s still zone B
    (finding,) = _bearing(7.0, power='power = "350 kW"', mode="28 Hz")
    assert "zone B" in finding.message and "flexible support" in finding.message
    assert finding.limit.value == pytest.approx(TABLE_A1[(1, "flexible")][1])


def test_below_15_kw_takes_iso_10816_1_class_i():
    # 11 kW is below the scope of ISO 10816-3: class I, 0.71 / 1.8 / 4.5 mm/s
    (finding,) = _bearing(2.0, power='power = "11 kW"')
    assert "zone C" in finding.message and "class I of ISO 10816-1" in finding.message
    assert finding.limit.value == pytest.approx(CLASS_I[1])


def test_without_group_or_power_the_lower_boundaries_are_taken():
    (finding,) = _bearing(3.0)  # group 2 rigid: B/C 2.8 -> zone C
    assert finding.status is Status.WARN and "zone C" in finding.message
    assert any("group 2 is taken, the lower boundaries" in a for a in finding.assumptions)


def test_slow_machine_band_starts_at_2_hz():
    # ISO 10816-3 clause 3 (from memory): 2-1000 Hz at 120 to 600 r/min. A reading over
    # 10-1000 Hz then misses part of the band: zone A, but only a lower bound -> warn.
    (finding,) = _bearing(1.0, speed="450 rpm", mode="30 Hz")
    assert "over 2-1000 Hz" in finding.message and finding.status is Status.WARN
    (finding,) = _bearing(1.0, speed="450 rpm", mode="30 Hz", low=2)
    assert finding.status is Status.PASS


def test_no_measurement_no_finding():
    text = DESIGN.format(speed="1480 rpm", power="", mode="80 Hz")
    assert _check(_design(text)) == []


def test_broadband_acceleration_cannot_be_zoned():
    text = DESIGN.format(speed="1480 rpm", power="", mode="80 Hz") + """
[[measurement]]
location = "bearing"
quantity = "acceleration"
value = "2 m/s^2"
band = { min = "10 Hz", max = "1000 Hz" }
"""
    (finding,) = _check(_design(text))
    assert finding.status is Status.WARN
    assert "a broadband acceleration reading cannot be placed in the velocity zones" in \
        finding.message


JOINT = """format = 1

[machine]
tag = "T-2"
kind = "centrifugal-pump"
mass = "480 kg"
speed = "1780 rpm"

[[natural-frequency]]
name = "motor bracket"
frequency = "30 Hz"

[[joint]]
name = "motor feet"
fastener = "M16"
property-class = "8.8"
count = 4
tightening = { method = "torque-wrench", torque = "190 N*m" }
clamps = "310 kg"
vibration = "4.5 mm/s rms"
"""


def test_clamped_part_reading_replaces_the_level_and_is_not_amplified():
    design = _design(JOINT)
    amplified = vibration_load(design, design.joint[0])
    assert amplified.amplification > 1  # the bracket mode near 29.67 Hz amplifies it
    measured = _design(JOINT + """
[[measurement]]
name = "motor foot"
location = "clamped-part"
joint = 1
quantity = "velocity"
reading = "rms"
value = "4.5 mm/s"
frequency = "29.67 Hz"
""")
    load = vibration_load(measured, measured.joint[0])
    # closed form for a sinusoid: a = 2 pi f v sqrt(2), not amplified again
    assert load.acceleration == pytest.approx(2 * math.pi * 29.67 * 4.5e-3 * math.sqrt(2),
                                              rel=1e-12)
    assert load.amplification == 1.0
    assert load.measurement == "measurement[1] 'motor foot'"
    assert any("replaces the joint's stated level '4.5 mm/s rms'" in a
               for a in load.assumptions)


def test_clamped_part_spectrum_by_parseval(tmp_path):
    # an acceleration spectrum of two lines, 3 and 4 m/s^2 RMS, uniform window: overall
    # RMS 5 m/s^2 (Parseval), one sinusoid of peak 5 sqrt(2) at the larger line, 120 Hz
    (tmp_path / "s.csv").write_text("frequency,amplitude\n60,3\n120,4\n")
    design = _design(JOINT + """
[[measurement]]
location = "clamped-part"
joint = "motor feet"
quantity = "acceleration"
reading = "rms"
spectrum = { path = "s.csv", unit = "m/s^2", window = "uniform" }
""", tmp_path)
    load = vibration_load(design, design.joint[0])
    assert load.acceleration == pytest.approx(5 * math.sqrt(2), rel=1e-12)
    assert load.frequency == pytest.approx(120.0)
    assert load.amplification == 1.0

"""Bad [[measurement]] input: located messages, exit status 2, every problem at once."""

from __future__ import annotations

import pytest

HEAD = """format = 1

[machine]
tag = "M-1"
kind = "centrifugal-pump"
mass = "400 kg"
speed = "1480 rpm"

[mounting]
kind = "{mounting}"
isolators = 4
stiffness = "120 kN/m"

[support]
kind = "slab-on-grade"

[[joint]]
name = "motor feet"
fastener = "M16"
property-class = "8.8"
count = 4
tightening = {{ method = "torque-wrench", torque = "190 N*m" }}
clamps = "180 kg"
"""

CASES = {
    "no-quantity": ("spring", """
[[measurement]]
location = "bearing"
value = "2 mm/s"
band = { min = "10 Hz", max = "1000 Hz" }
""", ["d.toml:25:1: measurement[1].quantity: a measurement needs 'quantity': velocity, "
      "acceleration or displacement"]),
    "no-band": ("spring", """
[[measurement]]
location = "bearing"
quantity = "velocity"
value = "2 mm/s"
""", ["d.toml:25:1: measurement[1]: a measured 'value' needs 'band' (the band of a broadband "
      "reading, e.g. { min = \"10 Hz\", max = \"1000 Hz\" }) or 'frequency' (of a filtered "
      "reading, e.g. \"24.7 Hz\")"]),
    "negative-value": ("spring", """
[[measurement]]
location = "bearing"
quantity = "velocity"
value = "-2 mm/s"
band = { min = "10 Hz", max = "1000 Hz" }
""", ["d.toml:28:9: measurement[1].value: a measured value must not be negative, got "
      "'-2 mm/s'"]),
    "wrong-unit": ("spring", """
[[measurement]]
location = "bearing"
quantity = "velocity"
value = "2 g"
band = { min = "10 Hz", max = "1000 Hz" }
""", ["d.toml:28:9: measurement[1].value: '2 g' is an acceleration, but a velocity such as "
      "\"4.5 mm/s\" or \"0.2 in/s\" is expected"]),
    "rigid-above-isolators": ("rigid", """
[[measurement]]
location = "frame-above-isolators"
quantity = "velocity"
value = "2 mm/s"
frequency = "24.7 Hz"
""", ["d.toml:24:12: measurement[1].location: location \"frame-above-isolators\": this "
      "machine is rigidly mounted (mounting.kind = \"rigid\"), so there is nothing above or "
      "below isolators to measure on"]),
    "unknown-joint": ("spring", """
[[measurement]]
location = "clamped-part"
joint = "pump feet"
quantity = "velocity"
value = "2 mm/s"
frequency = "24.7 Hz"

[[measurement]]
location = "clamped-part"
joint = 3
quantity = "velocity"
value = "2 mm/s"
frequency = "24.7 Hz"
""", ["d.toml:27:9: measurement[1].joint: joint 'pump feet' is not a [[joint]] of this design "
      "(its joints: 'motor feet')",
      "d.toml:34:9: measurement[2].joint: joint 3 is not a [[joint]] of this design (its "
      "joints: 'motor feet')"]),
    "joint-not-a-name-or-number": ("spring", """
[[measurement]]
location = "clamped-part"
joint = true
quantity = "velocity"
value = "2 mm/s"
frequency = "24.7 Hz"
""", ["d.toml:27:9: measurement[1].joint: 'joint' names a [[joint]] by its name (text, e.g. "
      "\"motor feet\") or its number (1 for the first), got true"]),
    "clamped-part-without-joint": ("spring", """
[[measurement]]
location = "clamped-part"
quantity = "velocity"
value = "2 mm/s"
frequency = "24.7 Hz"
""", ["d.toml:25:1: measurement[1].joint: a measurement on the 'clamped-part' names its "
      "joint: joint = \"motor feet\" (the joint's name) or joint = 1"]),
    "speed-outside-range": ("spring", """
[[measurement]]
location = "bearing"
quantity = "velocity"
value = "2 mm/s"
band = { min = "10 Hz", max = "1000 Hz" }
speed = "1780 rpm"
""", ["d.toml:30:9: measurement[1].speed: survey speed '1780 rpm' is not the machine's "
      "speed 1480 rpm"]),
}


def _design(mounting: str, tail: str) -> str:
    head = HEAD.format(mounting=mounting)
    if mounting == "rigid":
        head = head.replace('isolators = 4\nstiffness = "120 kN/m"\n', "")
    return head + tail


@pytest.mark.parametrize("name", sorted(CASES))
def test_bad_measurement_gives_its_message(run_cli, tmp_path, name):
    mounting, tail, expected = CASES[name]
    (tmp_path / "d.toml").write_text(_design(mounting, tail))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == expected
    assert "Traceback" not in ran.err + ran.out


SPECTRUM = """
[[measurement]]
location = "bearing"
quantity = "acceleration"
spectrum = { path = "data/s.csv", unit = "g", window = "hann" }
"""


def test_spectrum_with_non_increasing_frequencies(run_cli, tmp_path):
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "s.csv").write_text(
        "frequency,amplitude\n10,0.1\n20,0.2\n20,0.3\n15, 0.1\n30,-0.2\n40,x\n")
    (tmp_path / "d.toml").write_text(_design("spring", SPECTRUM))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == [
        "data/s.csv:4:1: frequencies must be strictly increasing: 20 Hz follows 20 Hz",
        "data/s.csv:5:1: frequencies must be strictly increasing: 15 Hz follows 20 Hz",
        "data/s.csv:6:4: an amplitude must not be negative, got -0.2",
        "data/s.csv:7:4: amplitude 'x' is not a finite number",
    ]


def test_spectrum_rows_after_blanks_comments_and_extra_columns(run_cli, tmp_path):
    # lines that are blank (spaces, a tab, an ideographic space U+3000, which
    # str.isspace calls blank) or comments are not rows; a third column is ignored; a bad
    # cell is echoed without its spaces and located at its first character
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "s.csv").write_text(
        "# survey\n  \n\t# indented comment\nfrequency,amplitude\n10, 0.1,x\n\u3000\n"
        "20 ,0.2\n30,  y  ,z\n", encoding="utf-8")
    (tmp_path / "d.toml").write_text(_design("spring", SPECTRUM))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == ["data/s.csv:8:6: amplitude 'y' is not a finite number"]


def test_spectrum_file_outside_the_root_missing_or_wrong_unit(run_cli, tmp_path):
    outside = SPECTRUM.replace("data/s.csv", "../s.csv")
    (tmp_path / "d.toml").write_text(_design("spring", outside))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == ("d.toml:28:14: measurement[1].spectrum.path: '../s.csv' is "
                               "outside the project root")
    (tmp_path / "d.toml").write_text(_design("spring", SPECTRUM))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    # the guarded opener says where it looked
    assert ran.err.strip() == ("d.toml:28:14: measurement[1].spectrum.path: spectrum file "
                               f"'data/s.csv' not found (looked for "
                               f"{(tmp_path / 'data' / 's.csv').resolve().as_posix()})")
    (tmp_path / "d.toml").write_text(_design("spring", SPECTRUM.replace('"g"', '"mm/s"')))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    # the missing file is reported in the same run as the wrong unit
    assert ran.err.splitlines() == [
        "d.toml:28:21: measurement[1].spectrum.path: referenced file 'data/s.csv' not found "
        f"(looked for {(tmp_path / 'data' / 's.csv').resolve().as_posix()})",
        "d.toml:28:42: measurement[1].spectrum.unit: 'mm/s' is not a unit of an acceleration "
        "(the measurement's quantity); units accepted: g, mg, m/s^2, in/s^2"]


def test_design_without_measurements_gets_no_measured_finding(run_cli, tmp_path):
    import json

    (tmp_path / "d.toml").write_text(_design("spring", ""))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status in (0, 1)
    report = json.loads(ran.out)
    rules = {finding["rule"] for finding in report["findings"]}
    assert "joint-slip" in rules  # the other rules did run
    assert "measured-vibration" not in rules

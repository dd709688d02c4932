"""A motor's magnetic forcing from how it is fed, and what excites rocking, through designs.

Closed forms named beside each check: synchronous speed n_s = f / (pole pairs) (IEC 60034-1,
from memory), so a drive-fed p-pole motor at N rev/s forces at 2 f = p N; a motor started
across the line at 2 f_line (common practice).
"""

from __future__ import annotations

import textwrap

import pytest

from vcheck.analysis import (
    analyse,
    drive_inputs_missing,
    excitation_bands,
    excites_rocking,
    rocking_sources,
)
from vcheck.checking import load_designs
from vcheck.config import load_policy

HEAD = '''
format = 1

[machine]
tag = "M-1"
kind = "{kind}"
mass = "300 kg"
speed = {speed}
{extra}
'''

RANGE = '{ min = "900 rpm", max = "1480 rpm" }'


def _design(tmp_path, kind="fan", speed=RANGE, extra="", tail=""):
    (tmp_path / "vcheck.toml").write_text("")
    text = HEAD.format(kind=kind, speed=speed, extra=extra) + textwrap.dedent(tail)
    (tmp_path / "d.toml").write_text(text)
    designs, problems = load_designs(load_policy(tmp_path), ["d.toml"], tmp_path)
    assert not problems, [p.render() for p in problems]
    return designs[0]


def _electrical(design):
    return {band.name: (band.low, band.high) for band in excitation_bands(design)
            if band.kind == "electrical"}


def test_drive_fed_motor_tracks_the_speed(tmp_path):
    design = _design(tmp_path, extra='driver = { kind = "induction-motor", supply = "drive", '
                     'poles = 4, line-frequency = "50 Hz" }')
    bands = _electrical(design)
    # 2 f = p N: 4 x 900/60 = 60.0 Hz to 4 x 1480/60 = 98.67 Hz; no fixed 100 Hz band
    assert bands["twice drive output frequency (4 poles)"] == pytest.approx(
        (60.0, 4 * 1480 / 60), rel=1e-12)
    assert not any(name.startswith("twice line frequency") for name in bands)
    # torque pulsation at 6 and 12 f_out, f_out = p N / 2 = 30.0-49.33 Hz (from memory)
    assert bands["drive torque pulsation (6x output frequency)"] == pytest.approx(
        (180.0, 6 * 2 * 1480 / 60), rel=1e-12)
    assert bands["drive torque pulsation (12x output frequency)"] == pytest.approx(
        (360.0, 12 * 2 * 1480 / 60), rel=1e-12)
    assert drive_inputs_missing(design) is None


def test_motor_across_the_line_stays_at_twice_line_frequency(tmp_path):
    design = _design(tmp_path, speed='"1480 rpm"', extra='driver = { kind = "induction-motor", '
                     'supply = "line", poles = 4, line-frequency = "60 Hz" }')
    assert _electrical(design) == {"twice line frequency (60 Hz supply)": (120.0, 120.0)}


def test_speed_range_without_a_stated_supply_judges_both(tmp_path):
    design = _design(tmp_path, extra='driver = { kind = "induction-motor", poles = 6, '
                     'line-frequency = "50 Hz" }')
    bands = _electrical(design)
    assert bands["twice line frequency (50 Hz supply)"] == (100.0, 100.0)
    # 6 poles: 6 x 15 = 90 Hz to 6 x 24.67 = 148 Hz
    assert bands["twice drive output frequency (6 poles)"] == pytest.approx((90.0, 148.0),
                                                                             rel=1e-12)
    assert drive_inputs_missing(design) is None


def test_speed_range_without_supply_or_poles_is_named(tmp_path):
    design = _design(tmp_path, extra='driver = { kind = "induction-motor", '
                     'line-frequency = "50 Hz" }')
    assert _electrical(design) == {"twice line frequency (50 Hz supply)": (100.0, 100.0)}
    assert drive_inputs_missing(design) == (("machine", "driver"), (
        "the motor's magnetic forcing on a variable-frequency drive (speed range, no "
        "driver.supply or driver.poles): give driver.supply = \"drive\" with driver.poles, "
        "or supply = \"line\""))


def test_belt_between_motor_and_machine(tmp_path):
    belt = 'belt = { pulley-diameter = "400 mm", length = "2.4 m" }'
    driver = 'driver = { kind = "induction-motor", supply = "drive", poles = 4RATIO }'
    design = _design(tmp_path, extra=belt + "\n" + driver.replace("RATIO", ""))
    assert _electrical(design) == {}
    path, words = drive_inputs_missing(design)
    assert words.endswith("give driver.speed-ratio, motor speed / machine speed")
    # a fan at 900-1480 rpm behind a 1.5 : 1 belt: the motor turns at 1350-2220 rpm,
    # 2 f = 4 x 22.5 = 90 Hz to 4 x 37 = 148 Hz
    design = _design(tmp_path, extra=belt + "\n" + driver.replace("RATIO", ", speed-ratio = 1.5"))
    assert _electrical(design)["twice drive output frequency (4 poles)"] == pytest.approx(
        (90.0, 148.0), rel=1e-12)
    assert drive_inputs_missing(design) is None


@pytest.mark.parametrize(("kind", "extra", "expected"), [
    ("generator-set", 'cylinders = 2\nstrokes = 4\ndriver = { kind = "engine" }',
     ("the machine is a generator-set",)),
    ("engine", "cylinders = 6\nstrokes = 4", ("the machine is an engine",)),
    ("reciprocating-compressor", "cylinders = 2", ("the machine is a reciprocating-compressor",)),
    ("other", "cylinders = 1\nstrokes = 2", ("the machine has 1 cylinder",)),
    ("fan", 'driver = { kind = "engine" }', ("the machine is driven by an engine",)),
    ("motor", 'power = "55 kW"\n[machine.torque]\nfluctuation = 0.1\norder = 2',
     ("a torque reaction is stated ([machine.torque])",)),
    ("fan", '[[machine.load]]\nname = "maker\'s rocking couple"\norder = 1\n'
     'moment = { x = "200 N*m" }', ("the stated load 'maker's rocking couple' has a moment",)),
    ("fan", 'rotor = { mass = "40 kg", balance-grade = "G6.3" }', ()),
    ("centrifugal-pump", "vanes = 6", ()),
])
def test_what_excites_rocking(tmp_path, kind, extra, expected):
    design = _design(tmp_path, kind=kind, speed='"1500 rpm"', extra=extra)
    loads = analyse(design).loads
    assert rocking_sources(design, loads) == expected
    assert excites_rocking(design, loads) is bool(expected)


BAD = HEAD.format(kind="fan", speed=RANGE, extra="{driver}")

BAD_CASES = {
    "odd poles on a drive": (
        'driver = { kind = "induction-motor", supply = "drive", poles = 5 }',
        ["d.toml:9:64: machine.driver.poles: 'poles' must be even (north and south poles "
         "come in pairs), got 5; e.g. 2, 4 or 6"]),
    "odd poles across the line": (
        'driver = { kind = "synchronous-motor", poles = 3, line-frequency = "50 Hz" }',
        ["d.toml:9:48: machine.driver.poles: 'poles' must be even (north and south poles "
         "come in pairs), got 3; e.g. 2, 4 or 6"]),
    "drive without poles": (
        'driver = { kind = "induction-motor", supply = "drive", line-frequency = "50 Hz" }',
        ["d.toml:9:10: machine.driver: a motor fed by a drive needs 'poles' (e.g. 4): its "
         "magnetic forcing is poles x speed"]),
    "supply on an engine": (
        'driver = { kind = "engine", supply = "drive", poles = 4 }',
        ["d.toml:9:10: machine.driver: 'supply' applies to an induction or synchronous "
         "motor, not to kind = \"engine\""]),
    "unknown supply": (
        'driver = { kind = "induction-motor", supply = "inverter", poles = 4 }',
        ["d.toml:9:47: machine.driver.supply: 'inverter' is not one of: line, drive"]),
    "zero speed ratio": (
        'driver = { kind = "induction-motor", supply = "drive", poles = 4, speed-ratio = 0 }',
        ["d.toml:9:81: machine.driver.speed-ratio: should be greater than 0, got 0"]),
}


# line 9 is the driver line of the design (the text starts with a blank line); columns
# counted by hand from its start to the value or table at fault.
@pytest.mark.parametrize("name", sorted(BAD_CASES))
def test_bad_driver_input_is_located(run_cli, tmp_path, name):
    driver, expected = BAD_CASES[name]
    (tmp_path / "d.toml").write_text(BAD.replace("{driver}", driver))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2, ran.out
    assert ran.err.strip().splitlines() == expected
    assert "Traceback" not in ran.err + ran.out

"""Bad design input: every problem of a file at once, located, exit status 2."""

from __future__ import annotations

import pytest
from support import BROKEN

EXPECTED = {
    "typo-in-key.toml":
        "typo-in-key.toml:9:1: machine.vanse: unknown key 'vanse'; did you mean 'vanes'?",
    "missing-unit.toml":
        'missing-unit.toml:7:8: machine.mass: the number 250 has no unit; write a mass such '
        'as "420 kg" or "925 lb" (in quotes: "250 kg")',
    "wrong-kind-of-unit.toml":
        "wrong-kind-of-unit.toml:13:13: mounting.stiffness: '180 kg' is a mass, but a "
        'stiffness such as "180 kN/m" or "1000 lbf/in" is expected',
    "negative-mass.toml":
        "negative-mass.toml:6:8: machine.mass: a mass must be greater than zero, got '-180 kg'",
    "not-a-number.toml":
        "not-a-number.toml:13:17: mounting.damping-ratio: should be a finite number, got nan",
    "speed-range-reversed.toml":
        "speed-range-reversed.toml:7:9: machine.speed: the speed range is reversed: "
        "min '1450 rpm' is above max '300 rpm'",
    "unknown-format.toml":
        "unknown-format.toml:1:10: format: unknown format version 7; this vcheck reads format 1",
    # 4 x 200 kN/m under 420 kg: 420 * 9.80665 / 800e3 = 5.15 mm (hand calculation)
    "stiffness-and-deflection-disagree.toml":
        "stiffness-and-deflection-disagree.toml:15:21: mounting.static-deflection: '25 mm' "
        "disagrees with the stiffness: 4 isolators of '200 kN/m' under 420 kg (the machine) "
        "deflect 5.15 mm; give one of 'stiffness' and 'static-deflection', or make them agree "
        "within 10%",
    "run-up-zero.toml":
        "run-up-zero.toml:9:10: machine.run-up: a time must be greater than zero, got '0 s'",
    "run-down-negative.toml":
        "run-down-negative.toml:9:12: machine.run-down: a time must be greater than zero, "
        "got '-20 s'",
    "stiffness-ratio-below-one.toml":
        "stiffness-ratio-below-one.toml:13:27: mounting.dynamic-stiffness-ratio: the "
        "dynamic-to-static stiffness ratio must be at least 1 (isolators are no softer under "
        "vibration than under their weight), got 0.8; e.g. 1.4 for rubber",
    "malformed-toml.toml":
        "malformed-toml.toml:6:6: TOML syntax error: Expected '=' after a key in a key/value pair",
}


@pytest.mark.parametrize("name", sorted(EXPECTED))
def test_each_broken_design_gives_its_message(run_cli, name):
    ran = run_cli("check", name, "--format", "json", cwd=BROKEN)
    assert ran.status == 2
    assert ran.err.strip() == EXPECTED[name]
    assert "Traceback" not in ran.err + ran.out


def test_all_errors_of_a_file_at_once(run_cli):
    ran = run_cli("check", "several-errors.toml", "--format", "json", cwd=BROKEN)
    assert ran.status == 2
    assert ran.err.splitlines() == [
        "several-errors.toml:6:8: machine.kind: 'chiler' is not one of: centrifugal-pump, fan, "
        "compressor, reciprocating-compressor, motor, engine, generator-set, chiller, "
        "cooling-tower, air-handler, other; did you mean 'chiller'?",
        "several-errors.toml:7:8: machine.mass: '2 g' is an acceleration, but a mass such as "
        "\"420 kg\" or \"925 lb\" is expected ('g' is standard gravity in vcheck; grams are "
        "written 'gram')",
        "several-errors.toml:8:9: machine.speed: unknown unit 'rmp' in '1480 rmp'; units "
        "accepted for a frequency or speed: Hz, rpm, cpm, rad/s",
        "several-errors.toml:10:1: mounting: with 'stiffness' of each isolator, give "
        "'isolators' (a count)",
    ]


def test_text_report_lists_input_errors_and_never_passes_them(run_cli):
    ran = run_cli("check", ".", cwd=BROKEN)
    assert ran.status == 2
    assert "Input errors: these files were not checked" in ran.out
    assert "PASS" not in ran.out
    assert "result    INPUT-ERROR (exit status 2)" in ran.out


def test_empty_folder(run_cli, tmp_path):
    (tmp_path / "empty").mkdir()
    ran = run_cli("check", "empty", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == "empty:1:1: no design files (*.toml) in folder 'empty'"


def test_missing_path(run_cli, tmp_path):
    ran = run_cli("check", "nowhere.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == "nowhere.toml:1:1: no such file or folder: 'nowhere.toml'"


def test_path_outside_the_project_root(run_cli, tmp_path):
    project = tmp_path / "project"
    project.mkdir()
    (project / "vcheck.toml").write_text("paths = []\n")
    (tmp_path / "outside.toml").write_text((BROKEN / "negative-mass.toml").read_text())
    ran = run_cli("check", "../outside.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert "'../outside.toml' is outside the project root" in ran.err


def test_missing_machine_table(run_cli, tmp_path):
    (tmp_path / "d.toml").write_text("format = 1\n")
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == "d.toml:1:1: missing key 'machine'"


def test_zero_mass_and_unknown_mounting_key(run_cli, tmp_path):
    (tmp_path / "d.toml").write_text(
        'format = 1\n[machine]\ntag = "A"\nkind = "fan"\nmass = "0 kg"\nspeed = "900 rpm"\n'
        '[mounting]\nkind = "spring"\nisolators = 4\nstifness = "1 kN/m"\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == [
        "d.toml:5:8: machine.mass: a mass must be greater than zero, got '0 kg'",
        "d.toml:10:1: mounting.stifness: unknown key 'stifness'; did you mean 'stiffness'?",
    ]
    # With the typo mended, the table-level check speaks.
    (tmp_path / "d.toml").write_text(
        'format = 1\n[machine]\ntag = "A"\nkind = "fan"\nmass = "10 kg"\nspeed = "900 rpm"\n'
        '[mounting]\nkind = "spring"\nisolators = 4\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.err.splitlines() == [
        "d.toml:7:1: mounting: isolators need 'stiffness' (each, e.g. \"180 kN/m\") or "
        "'static-deflection' (e.g. \"25 mm\")",
    ]


def test_file_too_large(run_cli, tmp_path):
    (tmp_path / "big.toml").write_text("# " + "x" * (1 << 20) + "\n")
    ran = run_cli("check", "big.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert "input files are limited to 1048576 bytes (1 MiB)" in ran.err


def test_hostile_nesting_is_an_input_error_not_a_traceback(run_cli, tmp_path):
    (tmp_path / "deep.toml").write_text("format = 1\nx = " + "[" * 5000 + "]" * 5000 + "\n")
    ran = run_cli("check", "deep.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == "deep.toml:1:1: arrays or tables nest too deeply to be a design file"


def test_a_flood_of_mistakes_is_capped(run_cli, tmp_path):
    (tmp_path / "keys.toml").write_text(
        "format = 1\n" + "".join(f"k{i} = {i}\n" for i in range(2000)))
    ran = run_cli("check", "keys.toml", "--format", "json", cwd=tmp_path)
    lines = ran.err.splitlines()
    assert ran.status == 2
    assert lines[0] == "keys.toml:1:1: 2001 problems in this file; the first 50 are listed"
    assert len(lines) == 51


def test_deep_json_base_report(run_cli, tmp_path):
    (tmp_path / "base.json").write_text("[" * 100000 + "]" * 100000)
    ran = run_cli("merge", "base.json", cwd=tmp_path)
    assert ran.status == 2
    assert "not a vcheck JSON report" in ran.err


def test_stiffness_and_deflection_that_agree_are_accepted(run_cli, tmp_path):
    # 4 x 200 kN/m under 420 kg deflect 5.15 mm: a stated 5 mm agrees (within 10%)
    text = (BROKEN / "stiffness-and-deflection-disagree.toml").read_text()
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "f.toml").write_text(text.replace('"25 mm"', '"5 mm"'))
    ran = run_cli("check", "f.toml", "--format", "json", cwd=tmp_path)
    assert ran.status in (0, 1), ran.err


def test_file_references_are_reported_with_the_value_errors(run_cli, tmp_path):
    # a reversed speed range used to hide a reference outside the root until it was fixed
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "d.toml").write_text(
        'format = 1\n\n[machine]\ntag = "F-1"\nkind = "fan"\nmass = "420 kg"\n'
        'speed = { min = "1450 rpm", max = "300 rpm" }\n\n[[mode-file]]\n'
        'path = "../outside.csv"\n\n[[mode-file]]\npath = "fe/missing.csv"\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == [
        "d.toml:7:9: machine.speed: the speed range is reversed: min '1450 rpm' is above "
        "max '300 rpm'",
        "d.toml:10:8: mode-file[1].path: '../outside.csv' is outside the project root",
        "d.toml:13:8: mode-file[2].path: referenced file 'fe/missing.csv' not found (looked "
        f"for {(tmp_path / 'fe' / 'missing.csv').resolve().as_posix()})",
    ]

"""Values no machine has: located errors before any rule sees them, never a crash.

Every quantity is finite and, where it is not zero, within a plausible range for its
kind (vcheck.design.units.PLAUSIBLE_RANGES, common practice: orders of magnitude beyond
any real machine). Numbers without units have their own bounds: orders of running
speed, design lives, PSD values, directions (scaled, since only the direction counts)
and the point mass on a beam relative to the beam.
"""

from __future__ import annotations

import json

import pytest

BASE = """\
format = 1

[machine]
tag = "T-1"
kind = "centrifugal-pump"
mass = "300 kg"
speed = "1480 rpm"
"""

MOUNTS = """
[mounting]
kind = "spring"
damping-ratio = 0.01
centre-of-gravity = { x = "0 mm", y = "0 mm", z = "420 mm" }
envelope = { x = "2.4 m", y = "1.2 m", z = "0.9 m" }
""" + "".join(f"""
[[mounting.mount]]
position = {{ x = "{sx}@X@", y = "{sy}500 mm", z = "0 mm" }}
axial-stiffness = "160 kN/m"
shear-stiffness = "120 kN/m"
@AXIS@
""" for sx, sy in (("-", "-"), ("", "-"), ("-", ""), ("", "")))


def mounts(x: str = "1000 mm", axis: str = "") -> str:
    return MOUNTS.replace("@X@", x).replace("@AXIS@", axis)


def _run(run_cli, tmp_path, text):
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "d.toml").write_text(text)
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert "Traceback" not in ran.err + ran.out
    return ran


FATIGUE = '\n[[fatigue]]\nname = "b"\ndetail = "EN 1993-1-9:71"\n'

CASES = {
    "stiffness 5e-324 N/m": (
        BASE + '\n[mounting]\nkind = "spring"\nisolators = 4\nstiffness = "5e-324 N/m"\n',
        "d.toml:12:13: mounting.stiffness: '5e-324 N/m' is outside the range vcheck reads for "
        "a stiffness (0.001 to 1e+13 N/m); check the number and its unit"),
    "order 1e308": (
        BASE + '\n[[machine.excitation]]\nname = "x"\norder = 1e308\n',
        "d.toml:11:9: machine.excitation[1].order: should be less than or equal to 1000, "
        "got 1e+308"),
    "fatigue order 1e308": (
        BASE + FATIGUE + 'life = { years = 20 }\n\n[[fatigue.block]]\nname = "c"\n'
        'stress-range = "10 MPa"\norder = "1e308x"\n',
        "d.toml:17:9: fatigue[1].block[1].order: an order of running speed is read from "
        "0.001 to 1000 times the speed, got '1e308x'"),
    "PSD values of 1e300": (
        BASE + FATIGUE + 'life = { years = 20 }\npsd = { points = [[10, 1e300], [100, 1]], '
        'unit = "MPa^2/Hz" }\n',
        "d.toml:13:24: fatigue[1].psd.points[1][2]: a PSD value is read from 1e-30 to 1e+20 in "
        "its unit (or zero), got 1e+300 at 10 Hz"),
    "PSD values of 5e-324": (
        BASE + FATIGUE + 'life = { years = 20 }\npsd = { points = [[10, 0.5], [100, 5e-324]], '
        'unit = "MPa^2/Hz" }\n',
        "d.toml:13:36: fatigue[1].psd.points[2][2]: a PSD value is read from 1e-30 to 1e+20 in "
        "its unit (or zero), got 4.94066e-324 at 100 Hz"),
    "base PSD level of 1e300": (
        BASE + FATIGUE + 'life = { years = 20 }\nbase-psd = { level = "1e300 g^2/Hz", '
        'natural-frequency = "62 Hz", q = 12, stress-per-g = "1.5 MPa" }\n',
        "d.toml:13:22: fatigue[1].base-psd.level: a spectral density level is read from 1e-30 "
        "to 1e+20 in its unit, got '1e300 g^2/Hz'"),
    "a life of 1e308 years": (
        BASE + FATIGUE + 'life = { years = 1e308 }\n\n[[fatigue.block]]\nname = "c"\n'
        'stress-range = "10 MPa"\norder = "1x"\n',
        "d.toml:12:18: fatigue[1].life.years: a design life is read from 1e-06 to 1000 years, "
        "got 1e+308"),
    "mounts at 1e300 mm": (
        BASE + mounts(x="1e300 mm"),
        "d.toml:16:18: mounting.mount[1].position.x: '-1e300 mm' is outside the range vcheck "
        "reads for a length (1e-09 to 10000 m); check the number and its unit"),
    "a tip mass 2.5e16 times the beam": (
        BASE + '\n[[beam]]\nname = "b"\nend-condition = "cantilever"\nlength = "4 m"\n'
        'youngs-modulus = "210 GPa"\nsecond-moment = "1943 cm^4"\nmass-per-length = '
        '"1e-9 kg/m"\ntip-mass = "1e8 kg"\n',
        "d.toml:9:1: beam[1]: the tip mass is 2.5e+16 times the beam's own mass; a point mass "
        "is read up to 1e+06 times it (model a heavier mass on the beam's stiffness as a "
        "lumped model)"),
    "a mass of 1e300 kg": (
        BASE.replace('"300 kg"', '"1e300 kg"'),
        "d.toml:6:8: machine.mass: '1e300 kg' is outside the range vcheck reads for a mass "
        "(1e-06 to 1e+08 kg); check the number and its unit"),
    "a bearing ball of 1e300 mm": (
        BASE + '\n[[machine.bearing]]\nname = "b"\nballs = 8\nball-diameter = "1e300 mm"\n'
        'pitch-diameter = "72.5 mm"\n',
        "d.toml:12:17: machine.bearing[1].ball-diameter: '1e300 mm' is outside the range "
        "vcheck reads for a length (1e-09 to 10000 m); check the number and its unit"),
    "lumped masses and springs out of range": (
        BASE + '\n[[lumped-model]]\nname = "x"\nmasses = ["1e300 kg"]\n'
        'springs = [{ between = [0, 1], stiffness = "5e-300 N/m" }]\n',
        "d.toml:11:11: lumped-model[1].masses[1]: '1e300 kg' is outside the range vcheck reads "
        "for a mass (1e-06 to 1e+08 kg); check the number and its unit\n"
        "d.toml:12:44: lumped-model[1].springs[1].stiffness: '5e-300 N/m' is outside the range "
        "vcheck reads for a stiffness (0.001 to 1e+13 N/m); check the number and its unit"),
}


@pytest.mark.parametrize("name", sorted(CASES))
def test_each_impossible_value_is_a_located_error(run_cli, tmp_path, name):
    text, expected = CASES[name]
    ran = _run(run_cli, tmp_path, text)
    assert ran.status == 2
    assert ran.err.strip().splitlines()[:expected.count("\n") + 1] == expected.splitlines()


@pytest.mark.parametrize("axis", ["{ z = 5e-324 }", "{ z = 1e308 }", "{ x = 1e-300, z = 1e308 }"])
def test_a_mount_axis_of_any_scale_is_the_same_direction(run_cli, tmp_path, axis):
    # only the direction of an axis counts (vcheck.design.modal.Direction); a vertical
    # axis written with a tiny or huge number gives the verdicts of axis = { z = 1 }
    reference = _run(run_cli, tmp_path, BASE + mounts(axis="axis = { z = 1 }"))
    scaled = _run(run_cli, tmp_path, BASE + mounts(axis=f"axis = {axis}"))
    assert reference.status in (0, 1) and scaled.status == reference.status
    assert json.loads(scaled.out)["findings"] == json.loads(reference.out)["findings"]

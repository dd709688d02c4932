"""Bad [[shaft-train]] input: located errors, exit status 2, the exact message."""

from __future__ import annotations

import pytest
from support import BROKEN

EXPECTED = {
    "train-zero-inertia.toml":
        "train-zero-inertia.toml:17:11: shaft-train[1].disc[1].inertia: a mass moment of "
        "inertia must be greater than zero, got '0 kg*m^2'",
    "train-gear-ratio-zero.toml":
        "train-gear-ratio-zero.toml:33:9: shaft-train[1].gear[1].ratio: should be greater "
        "than 0, got 0",
    "train-branch-missing-shaft.toml":
        "train-branch-missing-shaft.toml:25:1: shaft-train[1].disc[2].shaft: disc 'pump "
        "rotor' is on shaft 'auxiliary shaft', which is not listed; shafts: crankshaft",
    "train-no-elements.toml":
        "train-no-elements.toml:12:1: shaft-train[1]: a shaft train needs its inertias: give "
        "[[shaft-train.disc]] tables, each with a name and an inertia (e.g. \"12.5 kg*m^2\")",
    "train-speed-disagrees-with-gears.toml":
        "train-speed-disagrees-with-gears.toml:20:1: shaft-train[1].shaft[2].speed: shaft "
        "'output' is given 750 rpm, but machine.speed 1500 rpm and the gear ratios give "
        "500.0 rpm",
    "train-stiffness-without-angle.toml":
        "train-stiffness-without-angle.toml:25:13: shaft-train[1].link[1].stiffness: '200 "
        "kN*m' is not a torsional stiffness: give a torque per angle, such as \"2.4 "
        "MN*m/rad\" or \"1.5e6 lbf*in/rad\"",
}


@pytest.mark.parametrize("name", sorted(EXPECTED))
def test_each_broken_train_gives_its_message(run_cli, name):
    ran = run_cli("check", name, "--format", "json", cwd=BROKEN)
    assert ran.status == 2
    assert ran.err.strip() == EXPECTED[name]
    assert "Traceback" not in ran.err + ran.out


TRAIN = """format = 1

[machine]
tag = "T-1"
kind = "motor"
mass = "100 kg"
speed = "1500 rpm"

[[shaft-train]]
name = "train"
{extra}
"""

DISCS = """
[[shaft-train.disc]]
name = "a"
inertia = "1 kg*m^2"

[[shaft-train.disc]]
name = "b"
inertia = "1 kg*m^2"
"""


def _problems(tmp_path, text: str) -> list[str]:
    from vcheck.analysis import analyse
    from vcheck.design.loader import design_from_document, parse_toml_text
    from vcheck.design.problems import InputError

    try:
        analyse(design_from_document(parse_toml_text(text, "t.toml")))
    except InputError as exc:
        return [p.render() for p in exc.problems]
    return []


@pytest.mark.parametrize(("extra", "expected"), [
    (DISCS + '[[shaft-train.link]]\nbetween = ["a", "b"]\nstiffness = "-20 kN*m/rad"\n',
     "t.toml:21:13: shaft-train[1].link[1].stiffness: a torsional stiffness must be greater "
     "than zero, got '-20 kN*m/rad'"),
    (DISCS + '[[shaft-train.link]]\nbetween = ["a", "c"]\nstiffness = "20 kN*m/rad"\n',
     "t.toml:20:1: shaft-train[1].link[1].between: link joins 'c', which is not a disc of "
     "this train; discs: a, b"),
    (DISCS + '[[shaft-train.disc]]\nname = "loose"\ninertia = "1 kg*m^2"\n'
     '[[shaft-train.link]]\nbetween = ["a", "b"]\nstiffness = "20 kN*m/rad"\n',
     "t.toml:9:1: shaft-train[1]: the train falls apart: 'loose' not joined to the rest by "
     "any link or gear"),
    (DISCS + '[[shaft-train.link]]\nbetween = ["a", "b"]\nstiffness = "1e-5 N*m/rad"\n',
     "t.toml:21:1: shaft-train[1].link[1].stiffness: a torsional stiffness of 1e-05 to "
     "1e-05 N*m/rad is outside 0.001 to 1e+13 N*m/rad; check the unit"),
    (DISCS.replace('inertia = "1 kg*m^2"', 'inertia = "1e9 kg*m^2"', 1)
     + '[[shaft-train.link]]\nbetween = ["a", "b"]\nstiffness = "1 N*m/rad"\n',
     "t.toml:14:1: shaft-train[1].disc[1].inertia: inertia '1e9 kg*m^2' is outside 1e-09 "
     "to 1e+07 kg*m^2, the range of machine rotors; check the unit"),
    # beyond the range read for any quantity of the kind (vcheck.design.units)
    (DISCS.replace('inertia = "1 kg*m^2"', 'inertia = "1e300 kg*m^2"', 1)
     + '[[shaft-train.link]]\nbetween = ["a", "b"]\nstiffness = "1 N*m/rad"\n',
     "t.toml:14:11: shaft-train[1].disc[1].inertia: '1e300 kg*m^2' is outside the range "
     "vcheck reads for a mass moment of inertia (1e-12 to 1e+12 kg*m^2); check the number "
     "and its unit"),
    (DISCS, "t.toml:9:1: shaft-train[1]: the discs are joined by nothing: give "
     "[[shaft-train.link]] tables (shaft sections and couplings between discs)"),
    (DISCS + '[[shaft-train.link]]\nbetween = ["a", "b"]\ndiameter = "50 mm"\n'
     'length = "1 m"\n',
     "t.toml:19:1: shaft-train[1].link[1]: give 'stiffness' (e.g. \"180 kN*m/rad\"), or "
     "'diameter', 'length' and 'shear-modulus' (e.g. \"90 mm\", \"400 mm\", \"80 GPa\") of "
     "a shaft section"),
])
def test_train_problems_are_located(tmp_path, extra, expected):
    assert _problems(tmp_path, TRAIN.format(extra=extra)) == [expected]


def test_stiffness_per_degree_is_read_per_radian():
    from vcheck.design.shaft_trains import _torsional_stiffness

    # 1 N*m/deg = 180/pi N*m/rad (NIST SP 811: 1 degree = pi/180 rad)
    amount = _torsional_stiffness("1 N*m/deg +-10%")
    assert amount.value == pytest.approx(57.29577951308232, rel=1e-12)
    assert amount.low == pytest.approx(0.9 * 57.29577951308232, rel=1e-12)
    # 1 lbf*in = 0.112984829 N*m (NIST SP 811, Appendix B)
    assert _torsional_stiffness("1e6 lbf*in/rad").value == pytest.approx(112984.829, rel=1e-8)

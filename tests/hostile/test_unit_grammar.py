"""Unit strings outside the grammar: each a located message with a valid example, exit 2.

The grammar (vcheck.design.units.check_unit_grammar) runs before the unit library sees
the text, so a huge power is never computed and a stray character is never read as a
unit or ignored. Valid forms are checked against SI values by hand (BIPM SI Brochure,
9th ed., 2019: prefixes and derived units).
"""

from __future__ import annotations

import pytest

from vcheck.design.units import UnitError, check_unit_grammar, parse_amount

MASS = 'a mass such as "420 kg" or "925 lb"'

CASES = {
    "1 kg**9**9**9": "the exponent 9 is beyond +-6",
    "1 kg(": "the '(' at character 3 of the unit is not closed",
    "420 kg}": "the character '}' (at character 3 of the unit) cannot be part of a unit",
    "1 kg**0": "an exponent of 0 cancels the unit",
    "1 (((kg)))": "parentheses nest more than 2 deep",
    "420 kg %": "'%' is not a unit; a percentage is read only as a tolerance, as in \"+-10%\"",
    "420 kg/%": "'%' is not a unit; a percentage is read only as a tolerance, as in \"+-10%\"",
    "420 kg!": "the character '!' (at character 3 of the unit) cannot be part of a unit",
    "420 kg;": "the character ';' (at character 3 of the unit) cannot be part of a unit",
    "420 kg?": "the character '?' (at character 3 of the unit) cannot be part of a unit",
    "1 ()": "empty parentheses '()'",
    "1 kg^2^2": "a power of a power is not read; write one exponent, as in 'm^2'",
    "1 kg)": "the ')' at character 3 of the unit has no '('",
    "1 kg*": "'*' at character 3 of the unit needs a unit after it",
    "1 kg-": "a minus sign (at character 3 of the unit) belongs only to an exponent, as in 's^-2'",
    "1 kg^x": "the exponent must be a small whole number or a simple fraction such as 2, -1 or "
              "(1/2), got x",
}


def _design(mass: str) -> str:
    return (f'format = 1\n\n[machine]\ntag = "T-1"\nkind = "fan"\nmass = "{mass}"\n'
            'speed = "1480 rpm"\n')


@pytest.mark.parametrize("raw", sorted(CASES))
def test_each_bad_unit_is_located_with_an_example(run_cli, tmp_path, raw):
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "d.toml").write_text(_design(raw))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    unit = raw.split(" ", 1)[1]
    assert ran.err.strip() == (f"d.toml:6:8: machine.mass: cannot read the unit '{unit}' in "
                               f"'{raw}': {CASES[raw]}; write {MASS}")


def test_huge_power_of_a_length(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "d.toml").write_text(_design("300 kg") + '\n[support]\nkind = "roof"\n'
                                     'span = "1 km**1000"\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == ("d.toml:11:8: support.span: cannot read the unit 'km**1000' in "
                               "'1 km**1000': the exponent 1000 is beyond +-6; write a length "
                               'such as "25 mm" or "1.0 in"')


def test_division_by_zero(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "d.toml").write_text(_design("300 kg").replace("1480 rpm", "1 Hz/0"))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == ("d.toml:7:9: machine.speed: cannot read the unit 'Hz/0' in "
                               "'1 Hz/0': dividing by zero; write a frequency or speed such as "
                               '"1480 rpm" or "24.7 Hz"')


def test_deep_nesting_is_refused_without_recursion():
    deep = "(" * 5000 + "kg" + ")" * 5000
    with pytest.raises(UnitError, match="the unit is 10002 characters long; units are at most 40"):
        check_unit_grammar(deep)
    with pytest.raises(UnitError, match="a quantity is at most 200"):
        parse_amount("1 " + deep, "mass")


@pytest.mark.parametrize(("raw", "kind", "si"), [
    # SI Brochure 9th ed.: k = 1e3, m = 1e-3; 1 N = 1 kg m s^-2; 1 lbf = 4.4482216152605 N
    # (NIST SP 811, 2008, B.8) and 1 ft = 0.3048 m (international yard and pound, 1959)
    ("180 kN/m", "stiffness", 180e3),
    ("42 kg*m^2", "inertia", 42.0),
    ("2.5 m*s^-2", "acceleration", 2.5),
    ("2.5 m*s**-2", "acceleration", 2.5),
    ("2.5 m/s**2", "acceleration", 2.5),
    ("7850 kg/m^3", "density", 7850.0),
    ("2 N/mm²", "stress", 2e6),
    ("3 N·m", "torque", 3.0),
    ("3 N m", "torque", 3.0),
    ("10 1/s", "frequency", 10.0),
    ("1 (m/s^2)", "acceleration", 1.0),
    ("140 lbf*ft", "torque", 140 * 4.4482216152605 * 0.3048),
])
def test_valid_forms_still_read(raw, kind, si):
    assert parse_amount(raw, kind).value == pytest.approx(si, rel=1e-12)


def test_fraction_exponent_is_read():
    # m^(1/2) * m^(1/2) = m; a simple fraction exponent passes the grammar
    assert parse_amount("25 m^(1/2)*m^(1/2)", "length").value == pytest.approx(25.0)

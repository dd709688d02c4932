"""Bad machine-load input: located errors, exit status 2, saying what is valid."""

from __future__ import annotations

import pytest

HEAD = """format = 1

[machine]
tag = "RC-X"
kind = "reciprocating-compressor"
mass = "900 kg"
speed = "1480 rpm"
"""

CASES = {
    "vee angle and short rod": (
        HEAD + 'cylinders = 2\n\n[machine.crank]\narrangement = "vee"\nvee-angle = 200\n'
        'stroke = "120 mm"\nconnecting-rod = "50 mm"\nreciprocating-mass = "8 kg"\n',
        ["d.toml:10:1: machine.crank: 'vee-angle' must be between 0 and 180 degrees, got "
         "200; the connecting rod '50 mm' must be longer than the crank radius, half the "
         "stroke '120 mm'"]),
    "arrangement against cylinder count": (
        HEAD + 'cylinders = 3\n\n[machine.crank]\narrangement = "vee"\nvee-angle = 90\n'
        'stroke = "120 mm"\nconnecting-rod = "240 mm"\nreciprocating-mass = "8 kg"\n'
        'cylinder-spacing = "200 mm"\n',
        ["d.toml:3:1: machine: a vee arrangement needs an even number of cylinders (two "
         "banks), got cylinders = 3; valid arrangements for an odd count: inline"]),
    "unknown arrangement": (
        HEAD + 'cylinders = 2\n\n[machine.crank]\narrangement = "radial"\n'
        'stroke = "120 mm"\nconnecting-rod = "240 mm"\nreciprocating-mass = "8 kg"\n',
        ["d.toml:11:15: machine.crank.arrangement: 'radial' is not one of: inline, vee, "
         "opposed"]),
    "stated load without a frequency or an order": (
        HEAD + '\n[[machine.load]]\nname = "maker\'s primary"\nforce = { y = "2 kN" }\n',
        ["d.toml:9:1: machine.load[1]: give exactly one of 'order' (a multiple of running "
         "speed, e.g. 1) or 'frequency' (e.g. \"100 Hz\")"]),
    "stated load with neither force nor moment": (
        HEAD + '\n[[machine.load]]\nname = "empty"\norder = 1\n',
        ["d.toml:9:1: machine.load[1]: give 'force' (e.g. { y = \"12 kN\" }) or 'moment' "
         "(e.g. { x = \"1.5 kN*m\" }), or both"]),
    "torque reaction without power": (
        HEAD + 'cylinders = 2\n\n[machine.torque]\nfluctuation = 0.5\n',
        ["d.toml:3:1: machine: with [machine.torque], give machine 'power' (e.g. \"55 kW\") "
         "or torque 'mean-torque'"]),
    "power in the wrong unit": (
        HEAD + 'power = "55 N*m"\n',
        ["d.toml:8:9: machine.power: '55 N*m' is a torque, but a power such as \"55 kW\" or "
         "\"75 hp\" is expected"]),
    "crank angles against cylinders": (
        HEAD + 'cylinders = 2\n\n[machine.crank]\narrangement = "inline"\n'
        'stroke = "120 mm"\nconnecting-rod = "240 mm"\nreciprocating-mass = "8 kg"\n'
        'cylinder-spacing = "200 mm"\ncrank-angles = [0, 90, 180]\n',
        ["d.toml:3:1: machine: 'crank.crank-angles' gives 3 angles for 2 cylinders: give "
         "one per cylinder"]),
    "bolt positions against count": (
        HEAD + '\n[mounting]\nkind = "rigid"\n\n[[joint]]\nname = "feet"\nfastener = "M16"\n'
        'property-class = "8.8"\ncount = 4\n'
        'tightening = { method = "torque-wrench", torque = "200 N*m" }\nclamps = "900 kg"\n'
        'bolt-positions = [{ x = "0 m" }, { x = "1 m" }]\n',
        ["d.toml:12:1: joint[1]: 'bolt-positions' gives 2 positions for count = 4 bolts: "
         "give one per bolt"]),
}


@pytest.mark.parametrize("name", sorted(CASES))
def test_bad_load_input_is_located(run_cli, tmp_path, name):
    text, expected = CASES[name]
    (tmp_path / "d.toml").write_text(text)
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2, ran.out
    assert ran.err.strip().splitlines() == expected
    assert "Traceback" not in ran.err + ran.out

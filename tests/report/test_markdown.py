"""Markdown summary: verdict, counts, findings table, sources, caution; escaping.

Outside reference: the summary is parsed with ``markdown-it-py`` (test-only), a
CommonMark parser with the GFM table and strike-through rules enabled, which is how a
pull-request comment or job summary is read: the tables must have the right rows and
cells, and text from designs and rules must come out literally (plain text tokens only:
no emphasis, code, link, strike-through or HTML).
"""

from __future__ import annotations

import copy
import json

import pytest
from support import EXAMPLE

from vcheck.design.problems import InputProblem
from vcheck.findings import Finding, Measure, Source, Status
from vcheck.report import markdown as markdown_writer
from vcheck.report import render
from vcheck.report.markdown import escape_markdown, render_markdown
from vcheck.results import CAUTION, CheckedDesign, RuleInfo, RunResult

markdown_it = pytest.importorskip("markdown_it", reason="markdown-it-py is the test-only "
                                  "CommonMark parser")

HOSTILE = ('quote " tag [x] [link](http://example.invalid) <script>x</script> &amp; 100% '
           "done\r\nnext | pipe `code` *em* **strong** _u_ ~~gone~~ \\back # head "
           "Kühlturm µm — 5\x07bell")
MARKUP = {"em_open", "strong_open", "code_inline", "link_open", "html_inline", "s_open",
          "image", "html_block"}


def _flat(text: str) -> str:
    return " ".join("".join(" " if ord(c) < 0x20 else c for c in text).split())


def every_status_result() -> RunResult:
    sources = (Source("EN 0000-0 Table 1: a *limit* | <x>", "from memory"),
               Source("keep 20% clear", "common practice"))
    common = dict(sources=sources, limit=Measure("required separation", 0.2, "fraction"))
    findings = [
        Finding("demo-rule", Status.PASS, "clear", "roof/a.toml", 4, 1, "A-1", "m", **common),
        Finding("demo-rule", Status.WARN, "close", "roof/b.toml", 7, 3, "B|2", "k", **common),
        Finding("demo-rule", Status.FAIL, HOSTILE, "roof/c.toml", 24, 5, "C*3", "k", **common),
        Finding("demo-rule", Status.WAIVED, "accepted by J. Doe", "roof/d.toml", 9, 1, "D-4",
                "m", **common),
        Finding("other-rule", Status.ERROR, "could not run", "roof/e.toml", 1, 1, "E-5", "",
                sources=sources[1:]),
        Finding("other-rule", Status.NOT_CHECKED, "lacks modes", "roof/f.toml", 2, 1, "F-6",
                "machine", sources=sources[1:]),
    ]
    problems = [InputProblem("roof/bad.toml", 3, 5, "machine.mass", "mass <0> | bad")]
    rules = [RuleInfo("demo-rule", "Demo", "built-in", sources),
             RuleInfo("other-rule", "Other", "built-in", sources[1:])]
    designs = [CheckedDesign(f.file, f.target, "fan") for f in findings]
    return RunResult("9.9.9", "vcheck.toml", designs, findings, problems, rules)


def _tables(text: str) -> list[list[list[tuple[str, list[str]]]]]:
    """Each table as rows of cells; a cell is (its text, its inline token types)."""
    parser = markdown_it.MarkdownIt("commonmark").enable(["table", "strikethrough"])
    tables, row, in_cell = [], None, False
    for token in parser.parse(text):
        if token.type == "table_open":
            tables.append([])
        elif token.type == "tr_open":
            row = []
            tables[-1].append(row)
        elif token.type in ("td_open", "th_open"):
            in_cell = True
        elif token.type in ("td_close", "th_close"):
            in_cell = False
        elif token.type == "inline" and in_cell:
            children = token.children or []
            row.append(("".join(c.content for c in children if c.type == "text"),
                        [c.type for c in children]))
    return tables


def test_example_summary(run_cli):
    ran = run_cli("check", str(EXAMPLE), "--format", "markdown", "--uri-prefix", "")
    assert ran.status == 1
    report = json.loads(run_cli("check", str(EXAMPLE), "--format", "json").out)
    text = ran.out
    assert text.startswith(f"## vcheck: FAIL\n\n**Result: FAIL** (exit status 1). "
                           f"{len(report['designs'])} designs checked, 0 with input errors;")
    counts, findings, unjudged = _tables(text)
    header = [cell for cell, _ in counts[0]]
    values = dict(zip(header, (int(cell) for cell, _ in counts[1])))
    assert values == report["result"]["counts"]
    assert [cell for cell, _ in findings[0]] == ["status", "design file", "target", "rule",
                                                 "finding", "limit", "sources"]
    order = ["fail", "error", "warn", "waived"]
    expected = sorted((f for f in report["findings"]
                       if f["status"] not in ("pass", "not-checked")),
                      key=lambda f: order.index(f["status"]))  # stable: file order within
    rows = findings[1:]
    assert [r[0][0] for r in rows] == [f["status"].upper().replace("-", " ") for f in expected]
    assert [r[1][0] for r in rows] == [f"{f['file']}:{f['line']}" for f in expected]
    assert [r[2][0] for r in rows] == [f["target"] for f in expected]
    assert [r[4][0] for r in rows] == [" ".join(f["message"].split()) for f in expected]
    # not-checked findings: one row per design, every one of them named there
    folded = {f["file"]: [] for f in report["findings"] if f["status"] == "not-checked"}
    for f in report["findings"]:
        if f["status"] == "not-checked":
            folded[f["file"]].append(f["rule"])
    assert [r[0][0] for r in unjudged[1:]] == sorted(folded)
    for row in unjudged[1:]:
        assert all(f"{rule} (" in row[1][0] for rule in folded[row[0][0]])
    ef = next(r for r in rows if r[2][0] == "EF-R1")
    assert ef[5][0] == "required separation 20.0%"
    assert "### Sources of the limits" in text and "\\[from memory\\]" in text
    assert text.rstrip().endswith(escape_markdown(CAUTION))
    assert run_cli("check", str(EXAMPLE), "--format", "markdown", "--uri-prefix", "").out == text


def test_every_status_and_hostile_text_render_literally():
    text = render_markdown(every_status_result(), uri_prefix="site")
    counts, problems, findings, unjudged = _tables(text)
    assert [cell for cell, _ in problems[1]] == ["site/roof/bad.toml:3:5", "machine.mass",
                                                 "mass <0> | bad"]
    rows = findings[1:]
    assert [r[0][0] for r in rows] == ["FAIL", "ERROR", "WARN", "WAIVED"]
    assert len(unjudged) == 2 and len(unjudged[1]) == 2
    for row in findings:
        assert len(row) == 7  # no pipe in user text split a cell
        for cell, kinds in row:
            assert not MARKUP & set(kinds), (cell, kinds)
    fail = rows[0]
    assert fail[2][0] == "C*3" and fail[1][0] == "site/roof/c.toml:24"
    # literal, but the bare link made inert by a zero-width space after its scheme
    assert fail[4][0] == _flat(HOSTILE).replace("http:", "http:\u200b")
    assert rows[2][2][0] == "B|2"
    assert rows[3][4][0] == "waived: accepted by J. Doe"
    # the sources list is numbered in order of first use and escaped too
    assert "1. EN 0000-0 Table 1: a \\*limit\\* \\| &lt;x&gt; \\[from memory\\]" in text
    assert "2. keep 20% clear \\[common practice\\]" in text
    assert rows[1][6][0] == "[2]"


def test_escape_markdown_is_needed():
    # Without the escaping, the same text would be read as markup and split the table.
    parser = markdown_it.MarkdownIt("commonmark").enable(["table", "strikethrough"])
    raw = f"| a |\n| --- |\n| {HOSTILE.replace(chr(13), '').replace(chr(10), ' ')} |\n"
    kinds = {c.type for t in parser.parse(raw) if t.type == "inline" for c in t.children or []}
    assert kinds & MARKUP
    assert escape_markdown("a|b\n<c>&") == "a\\|b &lt;c&gt;&amp;"


def test_long_runs_are_cut_with_a_note(monkeypatch):
    monkeypatch.setattr(markdown_writer, "MAX_ROWS", 2)
    text = render_markdown(every_status_result())
    findings = _tables(text)[2]
    assert len(findings) == 1 + 2
    assert "... and 2 more findings that need attention, left out here" in text


def test_nothing_to_report():
    result = every_status_result()
    result.findings = [f for f in result.findings if f.status is Status.PASS]
    result.problems = []
    text = render(result, "markdown")
    assert "**Result: PASS** (exit status 0)" in text
    assert "No finding needs attention." in text and "Sources of the limits" not in text


def test_same_input_same_bytes_and_the_input_is_not_changed():
    result = every_status_result()
    before = copy.deepcopy(result)
    assert render_markdown(result) == render_markdown(result)
    assert result == before

"""Every report format is safe to show: design text cannot put control characters on a
terminal or in a CI log, cannot mention people or link pages in Markdown, and cannot make
a report huge.

Outside references: the C0 and C1 control sets and ESC / CSI are those of ECMA-48 (5th
edition, 1991, clauses 5 and 8.3); the bidirectional overrides and isolates
(U+202A-U+202E, U+2066-U+2069) are those of Unicode Standard Annex #9, whose misuse in
source text is CVE-2021-42574. Markdown is parsed with markdown-it-py (CommonMark), with
its linkify rule where linkify-it-py is installed; GitHub's autolinks for ``www.`` and
``scheme://`` and its ``@name`` mentions are from the GitHub Flavored Markdown
specification (0.29-gfm, "Autolinks (extension)"), mentions from memory of GitHub's
documentation.
"""

from __future__ import annotations

import json
import re
import shutil

import pytest
from support import EXAMPLE

from vcheck.design.problems import InputProblem
from vcheck.findings import Finding, Measure, Source, Status, WaiverNote
from vcheck.report import render
from vcheck.report.common import (
    CUT_MARKER,
    ECHO_LIMIT,
    bounded,
    clean_lines,
    clean_text,
    escape_markdown,
    neutralise_markdown,
)
from vcheck.results import CheckedDesign, RuleInfo, RunResult

# every C0 control but tab and LF, DEL, every C1 control, the bidi and zero-width marks
UNSAFE = re.compile("[\x00-\x08\x0b-\x1f\x7f-\x9f\u200b-\u200f\u2028-\u202e\u2060-\u2069\ufeff]")
NASTY = ("a\x1b[2J\x1b]0;title\x07b\r\nc\x00d\x9b31me\u202eevil\u2066f\ufeffg\x7fh\x08i\x0cj "
         "@kestrel-team see https://evil.invalid/x, www.evil.invalid and ops@kestrel.invalid")
SOURCE = Source("EN 0000 Table 1", "from memory")


def _hostile_result(text: str = NASTY) -> RunResult:
    common = dict(measured=Measure("f" + text[:5], 1.0, "Hz"), limit=Measure("g", 2.0, "Hz"),
                  margin=-0.1, assumptions=(text,), advice=(text,), sources=(SOURCE,),
                  table=(("mode " + text, "x"), ("b", text)), table_title="pairs " + text)
    findings = [
        Finding("demo-rule", status, text, f"roof/{text[:12]}.toml", 4, 2, "CT" + text[:8],
                "k" + text[:6], fingerprint=f"f{n}", **common)
        for n, status in enumerate((Status.FAIL, Status.WARN, Status.ERROR, Status.NOT_CHECKED,
                                    Status.PASS))
    ]
    findings.append(Finding("demo-rule", Status.WAIVED, text, "roof/w.toml", 5, 1, "W", "k",
                            waiver=WaiverNote(text, "J. Doe " + text[:9], "2030-01-01",
                                              Status.FAIL), fingerprint="fw", **common))
    return RunResult(
        version="0.1.0", policy="vcheck.toml",
        designs=[CheckedDesign(f"roof/{text[:12]}.toml", "CT" + text[:8], "fan")],
        findings=findings,
        problems=[InputProblem("roof/bad.toml", 3, 5, "machine." + text[:7], text)],
        rules=[RuleInfo("demo-rule", "Demo " + text[:4], "package demo 1", (SOURCE,))],
    )


@pytest.mark.parametrize("fmt", ["text", "github", "markdown", "gitlab", "sarif", "junit", "json"])
def test_no_control_character_reaches_any_format(fmt):
    out = render(_hostile_result(), fmt)
    assert not UNSAFE.search(out), UNSAFE.search(out)
    assert "\x1b" not in out and "\r" not in out


@pytest.mark.parametrize("fmt", ["text", "github"])
def test_controls_are_shown_not_dropped(fmt):
    # the reader sees that the design holds an escape sequence (ECMA-48 ESC, CSI, BEL)
    out = render(_hostile_result(), fmt)
    assert "a\\e[2J\\e]0;title\\x07b" in out
    assert "\\x9b31m" in out and "\\u202eevil\\u2066f\\ufeffg\\x7fh\\x08i\\fj" in out
    assert "\\r" in out and "c\\0d" in out


def test_the_helpers_exactly():
    assert clean_text("x\x1b[1my\r\n\tz\x00\x85\u202e") == "x\\e[1my\\r  z\\0\\x85\\u202e"
    assert clean_lines("a\x1b\nb\r\n") == "a\\e\nb\\r\n"
    assert clean_text("plain Kühlturm — 7.1 mm/s ±15 % µm") == "plain Kühlturm — 7.1 mm/s ±15 % µm"
    assert bounded("x" * 10, 4) == "xxxx" + CUT_MARKER.format(count=6)
    assert bounded("x" * 4, 4) == "xxxx"
    assert clean_text("\x1b" * 3000).count("\\e") == ECHO_LIMIT
    assert neutralise_markdown("@a b@c x@ @ www.q http://h ftp://g WWW.z") == (
        "@&#8203;a b@&#8203;c x@ @ www&#8203;.q http:&#8203;//h ftp:&#8203;//g WWW&#8203;.z")


def test_github_annotations_keep_line_feeds_escaped_and_nothing_else():
    out = render(_hostile_result(), "github")
    annotation = next(line for line in out.splitlines() if line.startswith("::error file=roof/bad"))
    # the runner's escapes for LF (%0A); CR shown as \r, so no %0D at all
    assert "%0A" in annotation and "%0D" not in out
    assert annotation.endswith("%0ANothing in this file was checked.")


# -- Markdown: no mention, no live link, no markup ---------------------------------------

def _inline_tokens(markdown: str):
    from markdown_it import MarkdownIt

    try:
        import linkify_it  # noqa: F401
        parser = MarkdownIt("gfm-like")
    except ImportError:
        parser = MarkdownIt("commonmark").enable("table")
    for block in parser.parse(markdown):
        for child in block.children or ():
            yield child


def _markup(markdown: str) -> list[str]:
    return sorted(child.type for token in _inline_tokens(markdown)
                  for child in (token, *(token.children or ()))
                  if child.type not in ("text", "softbreak"))


def test_markdown_has_no_live_link_or_mention():
    out = render(_hostile_result(), "markdown")
    # the same markup as a report of harmless text: the summary's own bold, nothing else
    assert _markup(out) == _markup(render(_hostile_result("harmless words here"), "markdown"))
    assert not set(_markup(out)) & {"link_open", "image", "html_inline", "code_inline",
                                    "em_open", "s_open"}
    text = "".join(t.content for t in _inline_tokens(out) if t.type == "text")
    # what a page shows: the text reads the same, but a zero-width space breaks each
    # mention and autolink (GFM autolinks need "www." or "scheme://" unbroken)
    assert "@\u200bkestrel-team" in text and "ops@\u200bkestrel.invalid" in text
    assert "https:\u200b//evil.invalid/x" in text and "www\u200b.evil.invalid" in text
    assert not re.search(r"@[A-Za-z0-9]", text)
    assert "://" not in text and "www." not in text


def test_markdown_rows_are_bounded():
    out = render(_hostile_result("y" * 50_000), "markdown")
    assert len(out) < 60_000
    # the marker's brackets backslash-escaped, as all Markdown text is
    assert "... \\[48000 more characters not shown\\]" in out


def test_escape_markdown_keeps_ordinary_text():
    assert escape_markdown("separation 12.5% below the vane pass, margin 20%") == (
        "separation 12.5% below the vane pass, margin 20%")


# -- long values: every format bounded ---------------------------------------------------

@pytest.mark.parametrize("fmt", ["text", "github", "markdown", "gitlab", "sarif", "junit", "json"])
def test_a_huge_value_is_cut_in_every_format(fmt):
    size = 3_000_000
    out = render(_hostile_result("z" * size), fmt)
    # the hostile result echoes the text in ~20 places; uncut that is 60 MB
    assert len(out) < 400_000, len(out)
    assert ("more characters not shown\\]" if fmt == "markdown"
            else "more characters not shown]") in out


# -- end to end, from design files -----------------------------------------------------

def _project(tmp_path, name: str, frequency: str = "24.7 Hz"):
    project = tmp_path / "p"
    project.mkdir()
    design = (EXAMPLE / "plant" / "level-3" / "sf-3d.toml").read_text(encoding="utf-8")
    design = design.replace('name = "motor pedestal, sideways"', f'name = "{name}"')
    design = design.replace('frequency = "34 Hz"', f'frequency = "{frequency}"')
    (project / "d.toml").write_text(design, encoding="utf-8")
    data = EXAMPLE / "plant" / "level-3" / "data"  # the design's measured spectrum file
    if data.is_dir():
        import shutil

        shutil.copytree(data, project / "plant" / "level-3" / "data")
    return project


TOML_NASTY = ("pedestal \\u001b[2J\\u001b[31m\\r\\u0000\\u009b1m @kestrel-team see "
              "https://evil.invalid/x \\u202eevil")


@pytest.mark.parametrize("fmt", ["text", "github", "markdown"])
def test_a_design_name_with_escapes(run_cli, tmp_path, fmt):
    project = _project(tmp_path, TOML_NASTY)
    ran = run_cli("check", "d.toml", "--format", fmt, cwd=project)
    assert ran.status == 1  # the pedestal mode sits on the running speed
    assert "pedestal" in ran.out
    assert not UNSAFE.search(ran.out)
    if fmt == "markdown":
        assert "@&#8203;kestrel-team" in ran.out and "https:&#8203;//evil" in ran.out
    else:
        assert "pedestal \\e[2J\\e[31m\\r\\0\\x9b1m" in ran.out


def test_an_unknown_key_with_an_escape(run_cli, tmp_path):
    project = _project(tmp_path, "pedestal")
    path = project / "d.toml"
    path.write_text('"mass\\u001b[2Jx" = 1\n' + path.read_text(encoding="utf-8"), encoding="utf-8")
    for fmt in ("text", "github", "markdown"):
        ran = run_cli("check", "d.toml", "--format", fmt, cwd=project)
        assert ran.status == 2
        assert "\x1b" not in ran.out and "\x1b" not in ran.err
        if fmt != "text":  # the other formats repeat input problems on stderr
            assert "unknown key 'mass\\e[2Jx'" in ran.err
        # text and annotations show the escape; Markdown makes every control a space
        shown = "mass \\[2Jx" if fmt == "markdown" else "mass\\e[2Jx"
        assert f"unknown key '{shown}'" in ran.out


def test_a_huge_csv_cell_is_cut(run_cli, tmp_path):
    # a 100 kB damping-ratio cell in a mode file is echoed in the problem's message
    project = tmp_path / "site"
    shutil.copytree(EXAMPLE, project)
    modes = project / "structures" / "deck-3-bay-c-modes.csv"
    cell = "9" * 100_000
    modes.write_text("frequency,damping-ratio,description\n9.8,0.02,first bending\n",
                     encoding="utf-8")
    sizes = {fmt: len(run_cli("check", "--format", fmt, cwd=project).out)
             for fmt in ("text", "json", "markdown", "github", "sarif", "junit", "gitlab")}
    modes.write_text("frequency,damping-ratio,description\n9.8," + cell + ",first bending\n",
                     encoding="utf-8")
    for fmt, size in sizes.items():
        ran = run_cli("check", "--format", fmt, cwd=project)
        assert ran.status == 2, ran.err[:300]
        # no bigger than the same project with a sound mode file, give or take its findings
        assert len(ran.out) < size + 30_000, (fmt, len(ran.out), size)
        # the cell is cut where it is read (40 characters and "...") or where it is
        # echoed (ECHO_LIMIT and a marker): never shown whole
        assert "9" * 2_001 not in ran.out
        if fmt == "json":
            problems = json.loads(ran.out)["input-problems"]
            assert any("damping ratio" in p["message"] and len(p["message"]) < 2_100
                       for p in problems)


def test_a_csv_cell_over_the_csv_limit_is_a_located_error(run_cli, tmp_path):
    # Python's csv module refuses a field over 131,072 characters (csv.field_size_limit)
    project = tmp_path / "site"
    shutil.copytree(EXAMPLE, project)
    modes = project / "structures" / "deck-3-bay-c-modes.csv"
    modes.write_text("frequency,damping-ratio,description\n9.8," + "9" * (3 << 20) + ",x\n")
    ran = run_cli("check", cwd=project)
    assert ran.status == 2
    assert ("structures/deck-3-bay-c-modes.csv:1:1: mode file is not readable CSV: field larger "
            "than field limit (131072) (write one row a line: frequency, damping-ratio, "
            "description)") in " ".join(ran.out.split())  # the text report wraps lines


def test_the_dynamics_view_shows_escapes(run_cli, tmp_path):
    project = _project(tmp_path, TOML_NASTY)
    ran = run_cli("dynamics", "d.toml", cwd=project)
    assert ran.status == 0
    assert not UNSAFE.search(ran.out)
    assert "pedestal \\e[2J\\e[31m\\r\\0\\x9b1m" in ran.out


def test_the_dynamics_json_keeps_escapes_and_bounds(run_cli, tmp_path):
    project = _project(tmp_path, TOML_NASTY + "y" * 20_000)
    ran = run_cli("dynamics", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 0, ran.err
    assert not UNSAFE.search(ran.out)  # JSON escapes every control: the text stays whole
    data = json.loads(ran.out)
    names = [m["name"] for m in data["designs"][0]["natural-frequencies"]]
    assert any(name.startswith("pedestal \x1b[2J\x1b[31m\r\x00\x9b1m") for name in names)
    assert any(name.endswith("more characters not shown]") and len(name) < ECHO_LIMIT + 100
               for name in names)

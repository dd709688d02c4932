"""The README's sample report is a slice of the bundled example's real report.

The sample under "Reading the report" shows one design's findings (up to SAMPLE_FINDINGS)
and the summary. Both are cut from tests/golden/check.txt (which test_golden_example.py holds
against a real run), so the README cannot drift from what the tool prints. A change that
alters the example's report regenerates both:

    VCHECK_UPDATE_GOLDEN=1 .venv/bin/python -m pytest tests/test_golden_example.py tests/test_readme_sample.py
"""

from __future__ import annotations

import os
import re

from support import REPO

README = REPO / "README.md"
GOLDEN_TEXT = REPO / "tests" / "golden" / "check.txt"
SAMPLE_DESIGN = "basement/cmp-b1.toml  CMP-B1 (compressor)"
SAMPLE_FINDINGS = 20  # the whole design: a failure, its passes, its not-checked paragraph
_INTRO = "From the bundled example (`vcheck check\nexamples/kestrel-yard`):\n\n```\n"
_STATUS_LINE = re.compile(r"^  (FAIL|WARN|PASS|ERROR|NOT CHECKED|WAIVED)[ :]")


def _sample_from(report: str, design: str = SAMPLE_DESIGN, most: int = SAMPLE_FINDINGS) -> str:
    """The README sample cut from a text report: the design's header line, its first
    findings (at most ``most``), an ellipsis line, then the summary block."""
    lines = report.splitlines()
    start = lines.index(design)
    body = [lines[start]]
    findings = 0
    for line in lines[start + 1:]:
        if _STATUS_LINE.match(line):
            findings += 1
            if findings > most:
                break
        if not line.strip():
            break
        body.append(line)
    summary_at = lines.index("Summary")
    summary = []
    for line in lines[summary_at:]:
        if not line.strip():
            break
        summary.append(line)
    return "\n".join([*body, "  ...", "", *summary]) + "\n"


def _readme_parts() -> tuple[str, str, str]:
    text = README.read_text(encoding="utf-8")
    assert _INTRO in text, "the README lost the introduction of its sample report"
    before, rest = text.split(_INTRO, 1)
    sample, after = rest.split("```\n", 1)
    return before + _INTRO, sample, "```\n" + after


def test_readme_sample_is_cut_from_the_real_report():
    expected = _sample_from(GOLDEN_TEXT.read_text(encoding="utf-8"))
    before, sample, after = _readme_parts()
    if os.environ.get("VCHECK_UPDATE_GOLDEN") == "1":
        README.write_text(before + expected + after, encoding="utf-8")
        sample = expected
    assert sample == expected, (
        "the README's sample report differs from tests/golden/check.txt; regenerate with "
        "VCHECK_UPDATE_GOLDEN=1")


def test_sample_cut_keeps_the_findings_and_summary():
    """The cutter itself, on a small report: two findings kept, the third left out."""
    report = "\n".join([
        "a.toml  A (fan)", "  FAIL  r1 (line 3): y", "    x",
        "  WARN  r2 (line 4): z", "  PASS  r3 (line 5): w", "", "other.toml  B (fan)",
        "  PASS  r1 (line 1): v",
        "", "Summary", "  designs   2 checked", "  result    FAIL", "", "Sources", "  [1] s"])
    cut = _sample_from(report, "a.toml  A (fan)", most=2)
    assert cut == ("a.toml  A (fan)\n  FAIL  r1 (line 3): y\n    x\n  WARN  r2 (line 4): z\n"
                   "  ...\n\nSummary\n  designs   2 checked\n  result    FAIL\n")


ERROR_COMMAND = "vcheck check examples/broken-designs/several-errors.toml --format json > /dev/null"


def test_readme_error_sample_is_what_the_tool_prints(run_cli):
    # The README's error sample: the command line after "$ " and the stderr lines after
    # it, exactly as the tool prints them, run from the repository root.
    text = README.read_text(encoding="utf-8")
    lines = text.splitlines()
    start = lines.index(f"    $ {ERROR_COMMAND}")
    shown = []
    for line in lines[start + 1:]:
        if not line.startswith("    "):
            break
        shown.append(line[4:])
    ran = run_cli("check", "examples/broken-designs/several-errors.toml", "--format", "json",
                  cwd=REPO)
    assert ran.status == 2
    assert shown == ran.err.splitlines()

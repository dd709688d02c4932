"""A short Markdown summary for a pull-request comment or the CI job summary.

A verdict line, the counts, a table of the input errors, a table of the findings that
need attention (every status but pass, most severe first), the sources of their limits
and the caution. Passing findings are only counted: the full record is the text or JSON
report. Tables stop after :data:`MAX_ROWS` rows and say how many were left out (a
pull-request comment holds about 65,000 characters; from memory).

Text that comes from design files, rules or policy is escaped, so it cannot break a
table or turn into markup: pipes, backslashes, emphasis, code, link and strike-through
characters are backslash-escaped, ``<``, ``>`` and ``&`` become character references,
and line breaks become spaces.
"""

from __future__ import annotations

from ..findings import STATUS_ORDER, Finding, Status
from ..results import CAUTION, RunResult
from .common import escape_markdown, measure_text, repository_path, waiver_reason

__all__ = ["MAX_ROWS", "escape_markdown", "render_markdown"]

MAX_ROWS = 100
"""Rows at most in each table of the summary."""


def _row(cells) -> str:
    return "| " + " | ".join(cells) + " |"


def _left_out(total: int, what: str) -> list[str]:
    if total <= MAX_ROWS:
        return []
    return ["", f"... and {total - MAX_ROWS} more {what}, left out here: the text or JSON "
            "report of the run has them all."]


def _finding_text(finding: Finding) -> str:
    if finding.status is Status.WAIVED:
        return "waived: " + waiver_reason(finding)
    return finding.message


def render_markdown(result: RunResult, uri_prefix: str = "") -> str:
    """The Markdown summary of a run; ``uri_prefix`` is the project root in the repository."""
    counts = result.counts()
    verdict = result.verdict.upper()
    out = [f"## vcheck: {verdict}", ""]
    readable = len(result.designs)
    broken = len({p.file for p in result.problems})
    out.append(f"**Result: {verdict}** (exit status {int(result.exit_status)}). "
               f"{readable} design{'s' if readable != 1 else ''} checked, "
               f"{broken} with input errors; policy {escape_markdown(result.policy)}; "
               f"vcheck {escape_markdown(result.version)}"
               f"{'; warnings fail the run' if result.fail_on_warn else ''}.")
    out += ["", _row(status.value for status in STATUS_ORDER),
            _row("---:" for _ in STATUS_ORDER),
            _row(str(counts[status.value]) for status in STATUS_ORDER)]

    if result.problems:
        out += ["", "### Input errors: nothing in these files was checked", "",
                _row(("design file", "key", "problem")), _row(("---",) * 3)]
        rows = [_row((escape_markdown(f"{repository_path(p.file, uri_prefix)}:{p.line}:"
                                      f"{p.column}"),
                      escape_markdown(p.key), escape_markdown(p.message)))
                for p in result.problems]
        out += rows[:MAX_ROWS] + _left_out(len(rows), "input errors")

    rank = {status: n for n, status in enumerate(STATUS_ORDER)}
    attention = sorted((f for f in result.findings if f.status is not Status.PASS),
                       key=lambda f: (rank[f.status], f.sort_key))
    sources: dict[str, int] = {}
    out.append("")
    if attention:
        out += ["### Findings that need attention", "",
                _row(("status", "design file", "target", "rule", "finding", "limit",
                      "sources")),
                _row(("---",) * 7)]
        shown = attention[:MAX_ROWS]
        for finding in shown:
            refs = []
            for source in finding.sources:
                number = sources.setdefault(source.render(), len(sources) + 1)
                refs.append(f"\\[{number}\\]")
            place = f"{repository_path(finding.file, uri_prefix)}:{finding.line}"
            out.append(_row((
                finding.status.label,
                escape_markdown(place),
                escape_markdown(finding.target),
                escape_markdown(finding.rule_id),
                escape_markdown(_finding_text(finding)),
                escape_markdown(measure_text(finding.limit)) if finding.limit else "",
                " ".join(refs),
            )))
        out += _left_out(len(attention), "findings that need attention")
    elif result.problems:
        out.append("No finding of the files that were read needs attention.")
    else:
        out.append("No finding needs attention.")

    if sources:
        out += ["", "### Sources of the limits", ""]
        for citation, number in sorted(sources.items(), key=lambda item: item[1]):
            out.append(f"{number}. {escape_markdown(citation)}")
    out += ["", f"> **Caution:** {escape_markdown(CAUTION)}"]
    return "\n".join(out) + "\n"

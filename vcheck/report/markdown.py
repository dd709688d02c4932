"""A short Markdown summary for a pull-request comment or the CI job summary.

A verdict line, the counts, a table of the input errors, a table of the findings that
need attention (fail, error, warn and waived, most severe first), one row per design of
the rules that had nothing to judge in it (not checked), the sources of their limits
and the caution. Passing findings are only counted: the full record is the text or JSON
report. Tables stop after :data:`MAX_ROWS` rows, and the whole summary stays under
:data:`MAX_CHARS` characters (a pull-request comment on GitHub takes at most 65,536):
rows of the findings table are left out from the least severe end until it fits, and a
line says how many and where to find them.

A run compared with a base (``--base-report`` or ``--base-revision``) says the gate, the
base and what is new, fixed, worse and better right under the verdict, so that a PASS
under ``--gate new`` is never read as "nothing fails".

Text that comes from design files, rules or policy is escaped, so it cannot break a
table or turn into markup: pipes, backslashes, emphasis, code, link and strike-through
characters are backslash-escaped, ``<``, ``>`` and ``&`` become character references,
and line breaks become spaces.
"""

from __future__ import annotations

from ..findings import STATUS_ORDER, Finding, Status
from ..results import CAUTION, RunResult
from .common import (
    escape_markdown,
    gate_items,
    gate_sentences,
    measure_text,
    repository_path,
    waiver_reason,
)

__all__ = ["MAX_CELL", "MAX_CHARS", "MAX_ROWS", "escape_markdown", "render_markdown"]

MAX_ROWS = 100
"""Rows at most in each table of the summary."""

MAX_CHARS = 60_000
"""Characters at most in the summary: under the 65,536 of a GitHub pull-request comment,
with room for a heading a workflow adds."""

MAX_CELL = 1_000
"""Characters at most of the text in one table cell; a longer text ends in "..."."""


def _row(cells) -> str:
    return "| " + " | ".join(cells) + " |"


def _left_out(total: int, what: str, limit: int = MAX_ROWS) -> list[str]:
    if total <= limit:
        return []
    why = ("" if limit == MAX_ROWS else
           f" to keep this summary under {MAX_CHARS:,} characters")
    return ["", f"... and {total - limit} more {what}, left out here{why}: the text or JSON "
            "report of the run has them all."]


def _cell(text: str) -> str:
    text = escape_markdown(text)
    return text if len(text) <= MAX_CELL else text[:MAX_CELL - 3].rstrip("\\") + "..."


def _finding_text(finding: Finding) -> str:
    if finding.status is Status.WAIVED:
        return "waived: " + waiver_reason(finding)
    return finding.message


def render_markdown(result: RunResult, uri_prefix: str = "") -> str:
    """The Markdown summary of a run; ``uri_prefix`` is the project root in the repository."""
    limit = MAX_ROWS
    text = _render(result, uri_prefix, limit)
    while len(text) > MAX_CHARS and limit > 0:
        limit = min(limit - 1, int(limit * MAX_CHARS / len(text)))
        text = _render(result, uri_prefix, max(limit, 0))
    return text


def _render(result: RunResult, uri_prefix: str, limit: int) -> str:
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
    for note in result.notes:
        out += ["", f"**Warning:** {escape_markdown(note)}"]
    gate = gate_sentences(result)
    if gate:
        out += ["", " ".join(escape_markdown(sentence) for sentence in gate)]
    out += ["", _row(status.value for status in STATUS_ORDER),
            _row("---:" for _ in STATUS_ORDER),
            _row(str(counts[status.value]) for status in STATUS_ORDER)]
    changes = gate_items(result)
    if changes:
        out += ["", f"### Changes against {escape_markdown(result.comparison.base)}", "",
                _row(("change", "status", "design file", "target", "rule")),
                _row(("---",) * 5)]
        rows = [_row((what, finding.status.label,
                      _cell(f"{repository_path(finding.file, uri_prefix)}:{finding.line}"),
                      _cell(finding.target), _cell(finding.rule_id)))
                for what, finding in changes]
        out += rows[:min(limit, MAX_ROWS)] + _left_out(len(rows), "changes",
                                                        min(limit, MAX_ROWS))

    if result.problems:
        out += ["", "### Input errors: nothing in these files was checked", "",
                _row(("design file", "key", "problem")), _row(("---",) * 3)]
        rows = [_row((escape_markdown(f"{repository_path(p.file, uri_prefix)}:{p.line}:"
                                      f"{p.column}"),
                      escape_markdown(p.key), escape_markdown(p.message)))
                for p in result.problems]
        out += rows[:max(limit, 1)] + _left_out(len(rows), "input errors", max(limit, 1))

    rank = {status: n for n, status in enumerate(STATUS_ORDER)}
    attention = sorted((f for f in result.findings
                        if f.status not in (Status.PASS, Status.NOT_CHECKED)),
                       key=lambda f: (rank[f.status], f.sort_key))
    sources: dict[str, int] = {}
    out.append("")
    if attention:
        out += ["### Findings that need attention", "",
                _row(("status", "design file", "target", "rule", "finding", "limit",
                      "sources")),
                _row(("---",) * 7)]
        shown = attention[:limit]
        for finding in shown:
            refs = []
            for source in finding.sources:
                number = sources.setdefault(source.render(), len(sources) + 1)
                refs.append(f"\\[{number}\\]")
            place = f"{repository_path(finding.file, uri_prefix)}:{finding.line}"
            out.append(_row((
                finding.status.label,
                _cell(place),
                _cell(finding.target),
                _cell(finding.rule_id),
                _cell(_finding_text(finding)),
                _cell(measure_text(finding.limit)) if finding.limit else "",
                " ".join(refs),
            )))
        out += _left_out(len(attention), "findings that need attention", limit)
    elif result.problems:
        out.append("No finding of the files that were read needs attention.")
    else:
        out.append("No finding needs attention.")

    unjudged: dict[str, list[Finding]] = {}
    for finding in result.findings:
        if finding.status is Status.NOT_CHECKED:
            unjudged.setdefault(finding.file, []).append(finding)
    if unjudged:
        out += ["", "### Not checked: rules with nothing to judge in a design", "",
                _row(("design file", "rules")), _row(("---",) * 2)]
        rows = [_row((_cell(repository_path(file, uri_prefix)), _cell("; ".join(
                    f"{f.rule_id} ({f.message.strip().rstrip('.;')})"
                    for f in sorted(findings, key=lambda f: f.sort_key)))))
                for file, findings in sorted(unjudged.items())]
        out += rows[:max(limit, 1)] + _left_out(len(rows), "designs", max(limit, 1))
    if sources:
        out += ["", "### Sources of the limits", ""]
        for citation, number in sorted(sources.items(), key=lambda item: item[1]):
            out.append(f"{number}. {escape_markdown(citation)}")
    out += ["", f"> **Caution:** {escape_markdown(CAUTION)}"]
    return "\n".join(out) + "\n"

"""The plain-text report: fixed width, status in words, the same bytes every run.

Meaning is never carried by colour; the report has no colour codes and does not depend
on the terminal. Text from design files is printed through
:func:`vcheck.report.common.clean_text`: control characters (terminal escapes, carriage
returns, NUL) become visible escapes and long texts are cut with a marker; the finished
report is passed through :func:`~vcheck.report.common.clean_lines` as well.

Findings are grouped by design file, most severe first within a file;
passing findings take one line, the others show numbers, limit, sources, assumptions,
advice and the closest pairs. Sources are numbered once, at the end.
"""

from __future__ import annotations

from ..findings import STATUS_ORDER, Finding, Measure, Status
from ..results import CAUTION, RunResult
from .common import bounded, clean_lines, clean_text

__all__ = ["WIDTH", "render_text"]

WIDTH = 96
"""Characters per line, whatever the terminal."""

_INDENT = " " * 15


def _number(measure: Measure) -> str:
    if measure.unit == "fraction":
        return f"{measure.value:.1%}"
    return f"{measure.value:.4g} {measure.unit}".strip()


def _wrap(text: str, first: str, rest: str = _INDENT) -> list[str]:
    """Greedy word wrap to WIDTH: the result of textwrap.wrap with long words and
    hyphens left unbroken, several times faster (a large run wraps thousands of lines)."""
    words = clean_text(text, limit=None).split()
    if not words:
        return [first.rstrip()]
    lines: list[str] = []
    line = first + words[0]
    for word in words[1:]:
        if len(line) + 1 + len(word) <= WIDTH:
            line += " " + word
        else:
            lines.append(line)
            line = rest + word
    lines.append(line)
    return lines


def _table(rows: tuple[tuple[str, ...], ...]) -> list[str]:
    if not rows:
        return []
    rows = tuple(tuple(clean_text(cell) for cell in row) for row in rows)
    columns = max(len(row) for row in rows)  # rows may differ in length (a plugin's table)
    widths = [max((len(row[i]) for row in rows if i < len(row)), default=0)
              for i in range(columns)]
    lines = []
    for row in rows:
        cells = [cell.ljust(widths[i]) for i, cell in enumerate(row)]
        lines.append((_INDENT + "  " + "  ".join(cells)).rstrip())
    return lines


def render_text(result: RunResult, hide_passing: bool = False) -> str:
    """The text report of a run, ending with the caution.

    With ``hide_passing`` passing findings are left out (the summary still counts them),
    so that a large project's log shows what needs attention.
    """
    sources: dict[str, int] = {}
    out: list[str] = [f"vcheck {result.version}: vibration design check", ""]
    out += _wrap(
        f"policy: {result.policy}; designs read: {len(result.designs)}; "
        f"rules: {', '.join(rule.id for rule in result.rules) or 'none'}", "", "  ")
    if result.problems:
        out += ["", "Input errors: these files were not checked"]
        for problem in result.problems:
            out += _wrap(bounded(problem.render()), "  ", "    ")
    by_file: dict[str, list[Finding]] = {}
    for finding in result.findings:
        by_file.setdefault(finding.file, []).append(finding)
    kinds = {design.file: design for design in result.designs}
    rank = {status: n for n, status in enumerate(STATUS_ORDER)}
    for file in sorted(by_file):
        shown = [f for f in by_file[file] if not (hide_passing and f.status is Status.PASS)]
        if not shown:
            continue
        design = kinds.get(file)
        heading = f"{file}  {design.tag} ({design.kind})" if design else file
        out += ["", clean_text(heading)]
        for finding in sorted(shown, key=lambda f: (rank[f.status], f.sort_key)):
            out += _finding(finding, sources, result.policy)
    if result.comparison is not None:
        out += _comparison(result.comparison)
    counts = result.counts()
    out += ["", "Summary"]
    out.append(f"  designs   {len(result.designs)} checked, "
               f"{len({p.file for p in result.problems})} with input errors")
    out.append("  findings  " + ", ".join(
        f"{counts[status.value]} {status.value}" for status in STATUS_ORDER))
    out.append(f"  result    {result.verdict.upper()} (exit status {int(result.exit_status)})")
    if sources:
        out += ["", "Sources of the limits"]
        for citation, number in sorted(sources.items(), key=lambda item: item[1]):
            out += _wrap(citation, f"  [{number}] ", "      ")
    out += [""] + _wrap("Caution: " + CAUTION, "", "")
    return clean_lines("\n".join(out)) + "\n"


def _finding(finding: Finding, sources: dict[str, int], policy: str) -> list[str]:
    label = finding.status.label.ljust(13)
    place = f"line {finding.line}"
    if finding.key_path:
        place += f" ({finding.key_path})"
    lines = [clean_text(f"  {label}{finding.rule_id}  {place}")]
    lines += _wrap(bounded(finding.message), _INDENT)
    numbers = []
    if finding.measured is not None:
        numbers.append(f"found: {finding.measured.name} {_number(finding.measured)}")
    if finding.limit is not None:
        numbers.append(f"limit: {finding.limit.name} {_number(finding.limit)}")
    refs = []
    for source in finding.sources:
        text = source.render()
        refs.append(f"[{sources.setdefault(text, len(sources) + 1)}]")
    if refs:
        numbers.append("sources: " + " ".join(refs))
    if finding.policy not in ("default", policy):
        numbers.append(f"policy: {finding.policy}")
    if numbers:
        lines += _wrap("; ".join(numbers), _INDENT)
    if finding.waiver is not None:
        note = finding.waiver
        lines += _wrap(f"waived: {bounded(note.reason)} (approved by {note.approved_by}, until "
                       f"{note.expires}; was {note.original_status.label})", _INDENT,
                       _INDENT + "  ")
    if finding.status is Status.PASS:
        return lines
    for assumption in finding.assumptions:
        lines += _wrap("assumes: " + bounded(assumption), _INDENT, _INDENT + "  ")
    for advice in finding.advice:
        lines += _wrap("advice: " + bounded(advice), _INDENT, _INDENT + "  ")
    if finding.table:
        lines.append(_INDENT + clean_text(finding.table_title or "details") + ":")
        lines += _table(finding.table)
    return lines


def _change(change) -> str:
    unit = change.current.measured.unit if change.current.measured else ""
    if unit == "fraction":
        return f"{change.change * 100:+.1f} points (margin {change.base_margin:.1%} -> " \
               f"{change.current.margin:.1%})"
    return f"{change.change:+.4g} {unit} (margin {change.base_margin:.4g} -> " \
           f"{change.current.margin:.4g})".replace("  ", " ")


def _comparison(comparison) -> list[str]:
    out = ["", f"Changes against {comparison.base}"]

    def listed(title, findings):
        lines = [f"  {title}: {len(findings)}"]
        for finding in findings:
            lines += _wrap(f"{finding.status.label} {finding.rule_id} {finding.target} "
                           f"({finding.file}, {finding.key_path or 'design'})", "    ",
                           "      ")
        return lines

    out += listed("new failures", comparison.new_failures)
    out += listed("new warnings", comparison.new_warnings)
    out += listed("fixed", comparison.fixed)
    for title, changes in (("margins worse", comparison.worse),
                           ("margins better", comparison.better)):
        out.append(f"  {title}: {len(changes)}")
        for change in changes:
            finding = change.current
            out += _wrap(f"{finding.rule_id} {finding.target} ({finding.file}): "
                         f"{_change(change)}", "    ", "      ")
    return out

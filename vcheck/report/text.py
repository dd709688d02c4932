"""The plain-text report: fixed width, status in words, the same bytes every run.

Meaning is never carried by colour; the report has no colour codes and does not depend
on the terminal. Text from design files is printed through
:func:`vcheck.report.common.clean_text`: control characters (terminal escapes, carriage
returns, NUL) become visible escapes and long texts are cut with a marker; the finished
report is passed through :func:`~vcheck.report.common.clean_lines` as well.

Findings are grouped by design file, most severe first within a file. A failure, an
error, a warning or a waived finding shows its message, the number found and its limit,
the sources, the assumptions, the advice and the first rows of its table (the closest
pairs, say); a passing finding takes one line (two when its sources are many): the number
found against the limit, and the sources. ``detail="full"`` prints passing findings with
their message and every table in full. A design's not-checked findings (a rule with
nothing to judge in it: no joints, no fatigue details) are folded into one entry, a line
per rule, after its other findings; they are still counted. Sources are numbered once,
then the caution, and the summary comes last, so the tail of a CI log shows the verdict.
The JSON report carries every number at full precision; this report rounds.
"""

from __future__ import annotations

from ..findings import STATUS_ORDER, Finding, Measure, Status
from ..results import CAUTION, RunResult
from .common import _UNSAFE, ECHO_LIMIT, bounded, clean_lines, clean_text, gate_sentences

__all__ = ["DETAILS", "TABLE_ROWS", "WIDTH", "render_text"]

WIDTH = 96
"""Characters per line, whatever the terminal."""

DETAILS = ("brief", "full")
"""How much the report prints: passing findings in one line and tables cut to
:data:`TABLE_ROWS` rows ("brief", the default), or everything ("full")."""

TABLE_ROWS = 3
"""Rows of a finding's table under its heading in a brief report."""

_INDENT = " " * 4

_LABELS = {status: status.label + "  " for status in Status}
"""Each status in words and two spaces, whichever it is, as a finding's line starts."""


def _number(measure: Measure) -> str:
    if measure.unit == "fraction":
        return f"{measure.value:.1%}"
    return f"{measure.value:.4g} {measure.unit}".strip()


def _wrap(text: str, first: str, rest: str = _INDENT) -> list[str]:
    """The lines of :func:`_wrap_now`, remembered: a report wraps the same texts again and
    again (a rule's assumptions, its advice and its sources, for every design that meets
    them), so a text is cleaned, split and wrapped once a run. A new list each call."""
    key = (text, first, rest)
    lines = _WRAPPED.get(key)
    if lines is None:
        lines = tuple(_wrap_now(text, first, rest))
        if len(_WRAPPED) >= _WRAPPED_KEPT:
            _WRAPPED.clear()
        _WRAPPED[key] = lines
    return list(lines)


_WRAPPED: dict[tuple[str, str, str], tuple[str, ...]] = {}
_WRAPPED_KEPT = 8192
"""Wrapped texts remembered at most; emptied when full, so that memory stays bounded."""


def _wrap_now(text: str, first: str, rest: str = _INDENT) -> list[str]:
    """Greedy word wrap to WIDTH: the result of textwrap.wrap with long words and
    hyphens left unbroken, several times faster (a large run wraps thousands of lines).

    The words are joined by single spaces once; each line then takes the words up to
    the last space that still fits (or its first word alone, when even that does not),
    found with one search instead of a test per word."""
    words = clean_text(text, limit=None).split()
    if not words:
        return [first.rstrip()]
    joined = " ".join(words)
    end = len(joined)
    lines: list[str] = []
    prefix, start = first, 0
    while True:
        limit = start + WIDTH - len(prefix)  # the last place a line's space may be
        if end <= limit:
            lines.append(prefix + joined[start:])
            return lines
        cut = joined.rfind(" ", start, limit + 1) if limit > start else -1
        if cut < 0:  # a first word longer than the line: it stands alone
            cut = joined.find(" ", start)
            if cut < 0:
                lines.append(prefix + joined[start:])
                return lines
        lines.append(prefix + joined[start:cut])
        prefix, start = rest, cut + 1


def _table(rows: tuple[tuple[str, ...], ...]) -> list[str]:
    if not rows:
        return []
    rows = tuple(tuple(str(cell) for cell in row) for row in rows)
    # clean_text cell by cell only when some cell needs it (most tables: none)
    if (any(len(cell) > ECHO_LIMIT for row in rows for cell in row)
            or _UNSAFE.search("".join("".join(row) for row in rows))):
        rows = tuple(tuple(clean_text(cell) for cell in row) for row in rows)
    columns = max(len(row) for row in rows)  # rows may differ in length (a plugin's table)
    widths = [max((len(row[i]) for row in rows if i < len(row)), default=0)
              for i in range(columns)]
    lines = []
    for row in rows:
        cells = [cell.ljust(widths[i]) for i, cell in enumerate(row)]
        lines.append((_INDENT + "  " + "  ".join(cells)).rstrip())
    return lines


def render_text(result: RunResult, hide_passing: bool = False, detail: str = "brief") -> str:
    """The text report of a run, ending with the summary.

    With ``hide_passing`` passing findings are left out (the summary still counts them),
    so that a large project's log shows what needs attention. ``detail`` is one of
    :data:`DETAILS`.
    """
    if detail not in DETAILS:
        raise ValueError(f"unknown text detail {detail!r}; known: {', '.join(DETAILS)}")
    full = detail == "full"
    sources: dict[str, int] = {}
    kept: dict = {}  # the reference numbers of each tuple of sources met (_source_numbers)
    out: list[str] = [f"vcheck {result.version}: vibration design check", ""]
    out += _wrap(
        f"policy: {result.policy}; designs read: {len(result.designs)}; "
        f"rules: {', '.join(rule.id for rule in result.rules) or 'none'}", "", "  ")
    for note in result.notes:
        out += _wrap("warning: " + note, "", "  ")
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
        out += ["", heading]
        judged = [f for f in shown if f.status is not Status.NOT_CHECKED]
        said: dict[str, str] = {}  # an assumption or advice of this design -> where first said
        for finding in sorted(judged, key=lambda f: (rank[f.status], f.sort_key)):
            out += _finding(finding, sources, result.policy, full, said, kept)
        out += _not_checked([f for f in shown if f.status is Status.NOT_CHECKED])
    if result.comparison is not None:
        out += _comparison(result)
    if sources:
        out += ["", "Sources of the limits"]
        for citation, number in sorted(sources.items(), key=lambda item: item[1]):
            out += _wrap(citation, f"  [{number}] ", "      ")
    out += [""] + _wrap("Caution: " + CAUTION, "", "")
    counts = result.counts()
    out += ["", "Summary"]
    problems, broken = len(result.problems), len({p.file for p in result.problems})
    out.append(f"  designs   {len(result.designs)} checked; {problems} input "
               f"error{'' if problems == 1 else 's'}"
               + (f" in {broken} file{'' if broken == 1 else 's'}" if problems else ""))
    out.append("  findings  " + ", ".join(
        f"{counts[status.value]} {status.value}" for status in STATUS_ORDER))
    out.append(f"  result    {result.verdict.upper()} (exit status {int(result.exit_status)})")
    comparison = result.comparison
    if comparison is not None:
        if comparison.error:
            out.append(f"  gate      comparison with {comparison.base} failed")
        else:
            out.append(f"  gate      {'new failures only' if result.gate == 'new' else 'every failure'}"
                       f", against {comparison.base}: {len(comparison.new_failures)} new "
                       f"failure{'' if len(comparison.new_failures) == 1 else 's'}, "
                       f"{len(comparison.fixed)} fixed")
    report = "\n".join(out)
    # clean_lines line by line only when some character needs it (most reports: none)
    if _UNSAFE.search(report.replace("\n", " ")):
        report = clean_lines(report)
    return report + "\n"


def _not_checked(findings: list[Finding]) -> list[str]:
    """One entry for a design's not-checked findings: each rule with its line and reason."""
    if not findings:
        return []
    reasons = [f"{finding.rule_id} (line {finding.line}): "
               f"{bounded(finding.message).strip().rstrip('.;')}"
               for finding in sorted(findings, key=lambda f: f.sort_key)]
    return _wrap(f"{Status.NOT_CHECKED.label}: " + "; ".join(reasons), "  ", _INDENT)


def _finding(finding: Finding, sources: dict[str, int], policy: str,
             full: bool = False, said: dict[str, str] | None = None,
             kept: dict | None = None) -> list[str]:
    label = _LABELS[finding.status]
    refs = _source_numbers(finding.sources, sources, {} if kept is None else kept)
    policy_note = f"policy: {finding.policy}" if finding.policy not in ("default", policy) \
        else ""
    if finding.status is Status.PASS and not full:
        return _passing(finding, label, refs, policy_note)
    numbers = []
    if finding.measured is not None:
        numbers.append(f"found: {finding.measured.name} {_number(finding.measured)}")
    if finding.limit is not None:
        numbers.append(f"limit: {finding.limit.name} {_number(finding.limit)}")
    place = f"line {finding.line}" + (f", {finding.key_path}" if finding.key_path else "")
    lines = _wrap(f"{finding.rule_id} ({place}): {bounded(finding.message)}", "  " + label,
                  _INDENT)
    if refs:
        numbers.append("sources: " + refs)
    if policy_note:
        numbers.append(policy_note)
    if numbers:
        lines += _wrap("; ".join(numbers), _INDENT)
    if finding.waiver is not None:
        note = finding.waiver
        lines += _wrap(f"waived: {bounded(note.reason)} (approved by {note.approved_by}, until "
                       f"{note.expires}; was {note.original_status.label})", _INDENT,
                       _INDENT + "  ")
    if finding.status is Status.PASS:
        return lines
    said = {} if said is None else said
    for heading, texts in (("assumes: ", finding.assumptions), ("advice: ", finding.advice)):
        for text in texts:
            text = heading + bounded(text)
            lines += _wrap(_once(text, said, f"{finding.rule_id} (line {finding.line})"),
                           _INDENT, _INDENT + "  ")
    if finding.table:
        rows = finding.table
        title = clean_text(finding.table_title or "details")
        if not full and len(rows) > TABLE_ROWS + 1:  # the first row is the heading
            title += f" (first {TABLE_ROWS} of {len(rows) - 1} rows; --detail full lists all)"
            rows = rows[:TABLE_ROWS + 1]
        lines += _wrap(title + ":", _INDENT, _INDENT + "  ")
        lines += _table(rows)
    return lines


def _source_numbers(cited: tuple, sources: dict[str, int], kept: dict) -> str:
    """The reference numbers of ``cited``, each source numbered in ``sources`` when first
    met.

    A rule's findings share one tuple of sources (eighteen for fatigue): once a tuple's
    sources all have numbers, which never change, its text is kept in ``kept`` (one
    report's) under the tuple's identity, the tuple itself beside it so that the identity
    stays its own, and read back rather than numbered and joined again for every finding."""
    known = kept.get(id(cited))
    if known is not None and known[0] is cited:
        return known[1]
    text = _references([sources.setdefault(source.render(), len(sources) + 1)
                        for source in cited])
    kept[id(cited)] = (cited, text)
    return text


def _once(text: str, said: dict[str, str], here: str) -> str:
    """``text``, or a pointer to where the design's report said it already (when shorter)."""
    first = said.setdefault(text, here)
    if first == here:
        return text
    heading = text.split(":", 1)[0]
    pointer = f"{heading}: as for {first} above"
    return pointer if len(pointer) < len(text) else text


def _references(numbers: list[int]) -> str:
    """Source numbers in order, runs of three or more joined: 1, 3, 4, 5 -> "[1] [3-5]"."""
    runs: list[list[int]] = []
    for number in sorted(set(numbers)):
        if runs and number == runs[-1][-1] + 1:
            runs[-1].append(number)
        else:
            runs.append([number])
    return " ".join(f"[{run[0]}-{run[-1]}]" if len(run) > 2 else
                    " ".join(f"[{n}]" for n in run) for run in runs)


def _passing(finding: Finding, label: str, refs: str, policy_note: str) -> list[str]:
    """A passing finding in one line: the number found against its limit, the sources."""
    if finding.measured is not None:
        said = f"{finding.measured.name} {_number(finding.measured)}"
        if finding.limit is not None:
            said += f" ({finding.limit.name} {_number(finding.limit)})"
    else:
        said = bounded(finding.message).strip().rstrip(".;")
    parts = [said] + [part for part in (policy_note,) if part]
    text = f"{finding.rule_id} (line {finding.line}): " + "; ".join(parts)
    if refs:
        text += "  " + refs
    return _wrap(text, "  " + label, _INDENT + "  ")


def _change(change) -> str:
    unit = change.current.measured.unit if change.current.measured else ""
    if unit == "fraction":
        return f"{change.change * 100:+.1f} points (margin {change.base_margin:.1%} -> " \
               f"{change.current.margin:.1%})"
    return f"{change.change:+.4g} {unit} (margin {change.base_margin:.4g} -> " \
           f"{change.current.margin:.4g})".replace("  ", " ")


def _comparison(result) -> list[str]:
    comparison = result.comparison
    out = ["", f"Changes against {comparison.base}"]
    for sentence in gate_sentences(result):
        out += _wrap(sentence, "  ", "    ")
    if comparison.error:
        return out

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

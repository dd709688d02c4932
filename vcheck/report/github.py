"""GitHub Actions workflow commands: annotations on the design files, then the full list.

Printed on stdout in a workflow step, each line below becomes an annotation on the
TOML line of the pull request's diff:

    ::error file=roof/ct-r1.toml,line=24,col=1,title=FAIL frequency-separation%3A CT-R1::...

input problems, fails and rule errors are ``::error``, warnings ``::warning``,
not-checked findings ``::notice`` when ``show_not_checked`` is set (they are only
counted otherwise); waived and passing findings get no annotation.
Messages escape ``%``, CR and LF; properties escape ``:`` and ``,`` as well (the
runner splits the properties at ``,`` and the command at ``::``). Text from design
files goes through :func:`vcheck.report.common.clean_text` first: terminal escapes and
other control characters become visible escapes (``\\e[2J``), so a design cannot recolour
or clear the CI log, and long texts are cut with a marker.

GitHub shows at most 10 error and 10 warning annotations a step and drops the rest
without a word, so after the annotations come plain lines: the verdict and counts, every
finding that needs attention (waived ones too) one a line, and a pointer to the
Markdown summary; a run compared with a base says the gate, the base and the new,
fixed, worse and better findings first. Those lines carry text from design files, so they are fenced by a
``::stop-commands::`` token and its closing line (the runner's documented way to print
untrusted text): a design that says ``::add-mask::`` or ``##[set-output]`` in a name
cannot issue a command. The token is a digest of the lines it fences, so the output
stays the same for the same input and no text can know its own token.

Paths are relative to the repository root: the design file's path relative to the
project root after ``uri_prefix``.
"""

from __future__ import annotations

import hashlib

from ..findings import STATUS_ORDER, Status
from ..results import RunResult
from .common import (
    bounded,
    clean_lines,
    clean_text,
    finding_details,
    gate_items,
    gate_sentences,
    repository_path,
    waiver_reason,
)

__all__ = ["ANNOTATIONS_SHOWN", "escape_data", "escape_property", "render_github"]

ANNOTATIONS_SHOWN = 10
"""Error annotations, and warning annotations, that GitHub shows at most per step."""

_COMMAND = {
    Status.FAIL: "error",
    Status.ERROR: "error",
    Status.WARN: "warning",
    Status.NOT_CHECKED: "notice",
}


def escape_data(text: str) -> str:
    """A command's message: ``%``, CR and LF percent-encoded."""
    return text.replace("%", "%25").replace("\r", "%0D").replace("\n", "%0A")


def escape_property(text: str) -> str:
    """A command's property value: as :func:`escape_data`, and ``:`` and ``,`` too."""
    return escape_data(text).replace(":", "%3A").replace(",", "%2C")


def _command(kind: str, file: str, line: int, column: int, title: str,
             message: str | tuple[str, ...]) -> str:
    """One annotation; ``message`` (or each of its parts, bounded already) is cleaned
    (line feeds kept: the runner shows them), then escaped."""
    lines = (message,) if isinstance(message, str) else message
    properties = ",".join((
        f"file={escape_property(clean_text(file))}",
        f"line={max(1, int(line))}",
        f"col={max(1, int(column))}",
        f"title={escape_property(clean_text(title, limit=200))}",
    ))
    return f"::{kind} {properties}::" + "%0A".join(escape_data(clean_lines(part)) for part in lines)


def _flat(text: str) -> str:
    """One line of plain text: line breaks spaces, control characters visible escapes,
    cut to the echo limit."""
    return " ".join(clean_text(text).split())


def render_github(result: RunResult, uri_prefix: str = "", show_not_checked: bool = False) -> str:
    """Workflow-command lines for a run; ``uri_prefix`` is the project root in the repository."""
    rank = {status: n for n, status in enumerate(STATUS_ORDER)}
    left_out = () if show_not_checked else (Status.NOT_CHECKED,)
    attention = sorted((f for f in result.findings
                        if f.status is not Status.PASS and f.status not in left_out),
                       key=lambda f: (rank[f.status], f.sort_key))
    annotations = []
    for problem in result.problems:
        annotations.append(("error", _command(
            "error", repository_path(problem.file, uri_prefix), problem.line, problem.column,
            "vcheck input error" + (f": {problem.key}" if problem.key else ""),
            (bounded(problem.message), "Nothing in this file was checked."))))
    for finding in attention:
        kind = _COMMAND.get(finding.status)
        if kind is None:
            continue
        annotations.append((kind, _command(
            kind, repository_path(finding.file, uri_prefix), finding.line, finding.column,
            _flat(f"{finding.status.label} {finding.rule_id}: {finding.target}"),
            finding_details(finding))))
    for note in result.notes:
        annotations.append(("warning", f"::warning title=vcheck run::{escape_data(_flat(note))}"))
    order = {"error": 0, "warning": 1, "notice": 2}
    out = [line for _, line in sorted(annotations, key=lambda item: order[item[0]])]

    counts = result.counts()
    errors = sum(1 for kind, _ in annotations if kind == "error")
    warnings = sum(1 for kind, _ in annotations if kind == "warning")
    out.append(f"vcheck: {result.verdict.upper()} (exit status {int(result.exit_status)}): "
               + ", ".join(f"{counts[s.value]} {s.value}" for s in STATUS_ORDER)
               + f"; {len(result.problems)} input error"
               + ("" if len(result.problems) == 1 else "s"))
    listed = [f"  {_flat(sentence)}" for sentence in gate_sentences(result)]
    preamble = len(listed) + len(gate_items(result))
    for what, finding in gate_items(result):
        where = f"{repository_path(finding.file, uri_prefix)}:{finding.line}:{finding.column}"
        listed.append(f"  {what.upper():<11}  {_flat(where)}  {_flat(finding.target)}  "
                      f"{_flat(finding.rule_id)} ({finding.status.value})")
    for problem in result.problems:
        where = f"{repository_path(problem.file, uri_prefix)}:{problem.line}:{problem.column}"
        key = f"{problem.key}: " if problem.key else ""
        listed.append(f"  INPUT ERROR  {_flat(where)}  {_flat(key + problem.message)}")
    for finding in attention:
        where = f"{repository_path(finding.file, uri_prefix)}:{finding.line}:{finding.column}"
        text = (f"waived: {waiver_reason(finding)}" if finding.status is Status.WAIVED
                else finding.message)
        listed.append(f"  {finding.status.label:<11}  {_flat(where)}  {_flat(finding.target)}  "
                      f"{_flat(finding.rule_id)}: {_flat(text)}")
    if listed:
        hidden = max(0, errors - ANNOTATIONS_SHOWN) + max(0, warnings - ANNOTATIONS_SHOWN)
        note = (f"; {hidden} of the annotations above are not shown by GitHub"
                if hidden else "")
        out.append(f"vcheck: GitHub shows at most {ANNOTATIONS_SHOWN} error and "
                   f"{ANNOTATIONS_SHOWN} warning annotations a step{note}. Everything "
                   f"that needs attention ({len(listed) - preamble})"
                   + (", after the comparison with the base" if preamble else "") + ":")
        token = "vcheck-" + hashlib.sha256("\n".join(listed).encode("utf-8")).hexdigest()[:32]
        out.append(f"::stop-commands::{token}")
        out += listed
        out.append(f"::{token}::")
    else:
        out.append("vcheck: no finding needs attention.")
    out.append("vcheck: the job summary (vcheck check --format markdown, appended to "
               "$GITHUB_STEP_SUMMARY) and the text and JSON reports give every finding "
               "with its numbers and sources.")
    return "\n".join(out) + "\n"

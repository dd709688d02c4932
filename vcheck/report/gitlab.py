"""GitLab code quality: a JSON array of issues, shown on the merge request's diff.

Each finding that needs attention, and each input problem, is one issue with the
fields GitLab reads: ``description``, ``check_name`` (the rule id), ``fingerprint``,
``severity`` and ``location`` (``path`` relative to the repository root, through
``uri_prefix``, and ``lines.begin``). GitLab compares fingerprints between the merge
request and its base to tell new issues from fixed ones, so the fingerprint is the
finding's own (rule, file, target, key path), stable when lines move; GitLab keeps one
issue per fingerprint, so a repeated one gets ``-2``, ``-3`` appended.

=================  ==========  ===============================================
vcheck             severity    why
=================  ==========  ===============================================
input problem      blocker     nothing in the file was checked
fail               critical    a limit is not met
error              major       the rule could not run: the result is unknown
warn               minor       within the limit, inside the warning band
not-checked        info        the design lacks what the rule needs
waived, pass       (none)      code quality lists open issues only
=================  ==========  ===============================================
"""

from __future__ import annotations

from ..findings import STATUS_ORDER, Status
from ..results import RunResult
from .common import (
    INPUT_RULE_ID,
    bounded,
    finding_details,
    json_indented,
    json_safe,
    problem_fingerprint,
    repository_path,
    unique_fingerprints,
)

__all__ = ["SEVERITY", "render_gitlab"]

SEVERITY = {
    Status.FAIL: "critical",
    Status.ERROR: "major",
    Status.WARN: "minor",
    Status.NOT_CHECKED: "info",
}
"""GitLab severity of each status that is reported."""


def _issue(description: str, check: str, fingerprint: str, severity: str, path: str,
           line: int) -> dict:
    return {
        "type": "issue",
        "description": description,
        "check_name": check,
        "fingerprint": fingerprint,
        "severity": severity,
        "location": {"path": path, "lines": {"begin": max(1, int(line))}},
    }


def render_gitlab(result: RunResult, uri_prefix: str = "", show_not_checked: bool = False) -> str:
    """The GitLab code-quality report of a run; ``uri_prefix`` is the project root.

    Not-checked findings (a rule with nothing to judge in a design) are left out unless
    ``show_not_checked``.
    """
    rank = {status: n for n, status in enumerate(STATUS_ORDER)}
    reported = [f for f in sorted(result.findings, key=lambda f: (rank[f.status], f.sort_key))
                if f.status in SEVERITY
                and (show_not_checked or f.status is not Status.NOT_CHECKED)]
    fingerprints = unique_fingerprints([problem_fingerprint(p) for p in result.problems]
                                       + [f.fingerprint for f in reported])
    issues = []
    for problem, fingerprint in zip(result.problems, fingerprints):
        issues.append(_issue(
            bounded(problem.render()) + " Nothing in this file was checked.", INPUT_RULE_ID,
            fingerprint, "blocker", repository_path(problem.file, uri_prefix), problem.line))
    for finding, fingerprint in zip(reported, fingerprints[len(result.problems):]):
        issues.append(_issue(
            f"{finding.status.label} {finding.target}: {finding_details(finding)}",
            finding.rule_id, fingerprint, SEVERITY[finding.status],
            repository_path(finding.file, uri_prefix), finding.line))
    return json_safe(json_indented(issues)) + "\n"

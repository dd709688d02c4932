"""Accepted deviations: waivers from the project policy applied to findings.

A waiver names a rule, a target (machine tag), optionally a key path or file, a reason,
who approved it and an expiry date. A matching fail, warn or not-checked finding is
reported as waived, with the reason. An expired waiver fails the run (the finding it
covered counts again); a waiver that matches nothing is a warning: it has gone stale.
"""

from __future__ import annotations

import os
from dataclasses import replace
from datetime import date

from .config import Policy
from .findings import Finding, Source, Status, WaiverNote

__all__ = ["WAIVER_RULE_ID", "apply_waivers", "today"]

WAIVER_RULE_ID = "policy-waiver"
"""Rule id of the findings about waivers themselves (expired, stale)."""

_WAIVABLE = (Status.FAIL, Status.WARN, Status.NOT_CHECKED)
_SOURCE = Source("the project policy's [[waiver]] table", "common practice")


def today() -> date:
    """The date waivers are judged on: ``VCHECK_TODAY`` (ISO date) if set, else today.

    Setting it makes a run reproducible from one day to the next.
    """
    text = os.environ.get("VCHECK_TODAY", "").strip()
    return date.fromisoformat(text) if text else date.today()


def apply_waivers(findings: list[Finding], policy: Policy, on: date,
                  checked_targets: set[str] | None = None, complete: bool = True) -> list[Finding]:
    """Findings with the policy's waivers applied, plus findings about the waivers.

    A waiver that matches nothing is stale only if its target was checked in this run,
    or if the run checked the whole project (``complete``): a run of one folder or one
    shard cannot tell whether a waiver for another machine still matches.
    """
    if not policy.waivers:
        return findings
    used = set()
    out = []
    for finding in findings:
        waiver = next((w for w in policy.waivers if w.matches(finding)), None)
        if waiver is not None:
            used.add(waiver.index)
        if waiver is not None and finding.status in _WAIVABLE and waiver.expires >= on:
            note = WaiverNote(waiver.reason, waiver.approved_by, waiver.expires.isoformat(),
                              finding.status)
            finding = replace(finding, status=Status.WAIVED, waiver=note)
        out.append(finding)
    for waiver in policy.waivers:
        problem = policy.problem(("waiver", waiver.index), "", value=False)
        common = dict(rule_id=WAIVER_RULE_ID, file=problem.file, line=problem.line,
                      column=problem.column, target=waiver.target,
                      key_path=f"waiver[{waiver.index + 1}]", sources=(_SOURCE,),
                      policy=policy.name)
        if waiver.expires < on:
            out.append(Finding(
                status=Status.FAIL,
                message=f"the waiver of {waiver.rule} on {waiver.target} expired on "
                f"{waiver.expires.isoformat()}; the finding it covered counts again "
                f"(reason given: {waiver.reason})",
                advice=("renew the waiver with a new expiry date, approved again, or mend "
                        "the design",), **common))
        elif waiver.index not in used and (
                complete or checked_targets is None or waiver.target in checked_targets):
            out.append(Finding(
                status=Status.WARN,
                message=f"the waiver of {waiver.rule} on {waiver.target} matches no finding; "
                "it has gone stale: remove it",
                **common))
    out.sort(key=lambda f: f.sort_key)
    return out

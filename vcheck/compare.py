"""What changed between a base run and this one: new and fixed findings, margins moved.

Findings are paired by their fingerprint (rule, file, target, key path), so a finding
keeps its identity when its numbers or message change.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from .findings import Finding, Status
from .results import RunResult

__all__ = ["Comparison", "MarginChange", "baseline_state", "compare"]

_BAD = (Status.FAIL, Status.ERROR)


@dataclass(frozen=True)
class MarginChange:
    current: Finding
    base_margin: float
    change: float


@dataclass
class Comparison:
    """The differences of a run against its base."""

    base: str
    error: str | None = None
    """Why the base could not be checked or read; the lists are then empty."""
    new_failures: list[Finding] = field(default_factory=list)
    new_warnings: list[Finding] = field(default_factory=list)
    fixed: list[Finding] = field(default_factory=list)
    worse: list[MarginChange] = field(default_factory=list)
    better: list[MarginChange] = field(default_factory=list)
    base_status: dict[str, Status] = field(default_factory=dict)
    """The status each fingerprint had in the base (absent: the base had no such finding)."""
    moved: set[str] = field(default_factory=set)
    """Fingerprints of the findings whose margin moved (those of ``worse`` and ``better``)."""

    @property
    def has_new_failures(self) -> bool:
        return bool(self.new_failures)


def baseline_state(comparison: Comparison, finding: Finding) -> str:
    """SARIF's ``baselineState`` of a current finding: ``new``, ``unchanged`` or ``updated``.

    ``new`` when the base had no such finding or passed it (a passing finding is no
    result in a review format), ``unchanged`` when its status and margin are the same,
    ``updated`` otherwise.
    """
    old = comparison.base_status.get(finding.fingerprint)
    if old is None or old is Status.PASS:
        return "new"
    if old is not finding.status:
        return "updated"
    return "updated" if finding.fingerprint in comparison.moved else "unchanged"


def compare(current: RunResult, base: RunResult, label: str) -> Comparison:
    """Compare ``current`` with ``base`` (named ``label`` in reports)."""
    before = {f.fingerprint: f for f in base.findings}
    now = {f.fingerprint: f for f in current.findings}
    result = Comparison(base=label, base_status={k: f.status for k, f in before.items()})
    for key in sorted(now, key=lambda k: now[k].sort_key):
        finding = now[key]
        old = before.get(key)
        if finding.status in _BAD and (old is None or old.status not in _BAD):
            result.new_failures.append(finding)
        elif finding.status is Status.WARN and (old is None or old.status not in
                                                (Status.WARN,) + _BAD):
            result.new_warnings.append(finding)
        if old is not None and finding.margin is not None and old.margin is not None \
                and (finding.measured is None or old.measured is None
                     or finding.measured.unit == old.measured.unit):
            change = finding.margin - old.margin
            if change < -1e-9:
                result.worse.append(MarginChange(finding, old.margin, change))
                result.moved.add(key)
            elif change > 1e-9:
                result.better.append(MarginChange(finding, old.margin, change))
                result.moved.add(key)
    for key in sorted(before, key=lambda k: before[k].sort_key):
        old = before[key]
        if old.status in _BAD + (Status.WARN,):
            finding = now.get(key)
            if finding is None or finding.status not in _BAD + (Status.WARN,):
                result.fixed.append(old)
    return result

"""The outcome of a run: findings, input problems, and the exit status they give."""

from __future__ import annotations

from collections import Counter
from dataclasses import dataclass, field
from enum import IntEnum
from operator import attrgetter

from .design.problems import InputProblem
from .findings import Finding, Status

__all__ = ["CAUTION", "CheckedDesign", "ExitStatus", "RunResult", "RuleInfo"]

CAUTION = (
    "vcheck screens design data against the limits it cites; it is not a design. "
    "Vibration, fatigue and loosening failures hurt people: local codes, the project "
    "specification and the engineer of record decide."
)


_STATUS_VALUE = attrgetter("status._value_")


class ExitStatus(IntEnum):
    """Exit statuses of the command line, one per outcome."""

    OK = 0
    """Nothing failed (warnings too, unless fail-on-warn)."""
    FAILED = 1
    """A rule failed, or warned with fail-on-warn."""
    INPUT_ERROR = 2
    """Bad input, policy or usage: something could not be read."""
    RULE_ERROR = 3
    """A rule could not run."""


@dataclass(frozen=True)
class CheckedDesign:
    file: str
    tag: str
    kind: str


@dataclass(frozen=True)
class RuleInfo:
    id: str
    title: str
    origin: str
    sources: tuple


@dataclass
class RunResult:
    """Everything a writer needs; writers read it and never change it."""

    version: str
    policy: str
    designs: list[CheckedDesign] = field(default_factory=list)
    findings: list[Finding] = field(default_factory=list)
    problems: list[InputProblem] = field(default_factory=list)
    rules: list[RuleInfo] = field(default_factory=list)
    fail_on_warn: bool = False
    comparison: object = None  # vcheck.compare.Comparison when a base was given
    gate: str = "all"
    """"all": any failure fails the run; "new": only failures the base did not have."""
    notes: list[str] = field(default_factory=list)
    """Warnings about the run itself (not about a design), said in every review format."""
    project: str = ""
    """The project root folder's name (merging refuses shards of two projects)."""
    policy_fingerprint: str = ""
    """Digest of the policy's settings as read (merging refuses two policies)."""
    shard: tuple[int, int] | None = None
    """(k, n) when the run checked shard k of n of the design files."""

    def counts(self) -> dict[str, int]:
        # tallied in C (a Status member's value and its text's cached hash), not through
        # the enum's value property per finding: a report asks three times, over
        # thousands of findings
        tally = Counter(map(_STATUS_VALUE, self.findings))
        return {status.value: tally[status.value] for status in Status}

    @property
    def exit_status(self) -> ExitStatus:
        counts = self.counts()
        if self.problems or (self.comparison is not None
                             and getattr(self.comparison, "error", None)):
            return ExitStatus.INPUT_ERROR
        if counts["error"]:
            return ExitStatus.RULE_ERROR
        if self.gate == "new" and self.comparison is not None:
            new = self.comparison.new_failures + (
                self.comparison.new_warnings if self.fail_on_warn else [])
            return ExitStatus.FAILED if new else ExitStatus.OK
        if counts["fail"] or (self.fail_on_warn and counts["warn"]):
            return ExitStatus.FAILED
        return ExitStatus.OK

    @property
    def verdict(self) -> str:
        return {
            ExitStatus.OK: "pass",
            ExitStatus.FAILED: "fail",
            ExitStatus.INPUT_ERROR: "input-error",
            ExitStatus.RULE_ERROR: "rule-error",
        }[self.exit_status]

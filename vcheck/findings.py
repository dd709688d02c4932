"""What a rule returns: plain, immutable records that writers only read."""

from __future__ import annotations

import hashlib
from dataclasses import dataclass, field
from enum import Enum

__all__ = ["Finding", "Measure", "Source", "Status", "STATUS_ORDER", "WaiverNote"]


class Status(str, Enum):
    """Outcome of one rule on one target."""

    PASS = "pass"
    WARN = "warn"
    FAIL = "fail"
    WAIVED = "waived"
    ERROR = "error"
    NOT_CHECKED = "not-checked"

    @property
    def label(self) -> str:
        """The status in words, as the text report prints it."""
        return self.value.upper().replace("-", " ")


STATUS_ORDER = (
    Status.FAIL, Status.ERROR, Status.WARN, Status.NOT_CHECKED, Status.WAIVED, Status.PASS
)
"""Statuses from the most to the least severe."""


@dataclass(frozen=True)
class Source:
    """Where a limit comes from.

    ``basis`` says how sure the project is of it: "published" (read in the cited
    document or a faithful reproduction), "from memory" (recalled, not confirmed against
    the document), "common practice" (the trade's habit with no single source) or
    "derived" (worked out here from the cited formula).
    """

    citation: str
    basis: str = "published"

    def __post_init__(self) -> None:
        if self.basis not in ("published", "from memory", "common practice", "derived"):
            raise ValueError(f"unknown basis of a source: {self.basis!r}")

    def render(self) -> str:
        return self.citation if self.basis == "published" else f"{self.citation} [{self.basis}]"


@dataclass(frozen=True)
class Measure:
    """A named number with its unit, as shown to the reader."""

    name: str
    value: float
    unit: str = ""


@dataclass(frozen=True)
class WaiverNote:
    """Why a finding is waived: the accepted deviation from the project policy."""

    reason: str
    approved_by: str
    expires: str
    original_status: Status


@dataclass(frozen=True)
class Finding:
    """The verdict of one rule on one target of one design."""

    rule_id: str
    status: Status
    message: str
    file: str
    line: int
    column: int
    target: str
    key_path: str = ""
    measured: Measure | None = None
    limit: Measure | None = None
    margin: float | None = None
    assumptions: tuple[str, ...] = ()
    advice: tuple[str, ...] = ()
    sources: tuple[Source, ...] = ()
    table: tuple[tuple[str, ...], ...] = ()
    table_title: str = ""
    policy: str = "default"
    waiver: WaiverNote | None = None
    fingerprint: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        if not self.fingerprint:
            key = "\x1f".join((self.rule_id, self.file, self.target, self.key_path))
            digest = hashlib.sha256(key.encode("utf-8")).hexdigest()[:16]
            object.__setattr__(self, "fingerprint", digest)

    @property
    def sort_key(self) -> tuple:
        return (self.file, self.target, self.line, self.column, self.rule_id, self.key_path)

"""What a rule returns: plain, immutable records that writers only read."""

from __future__ import annotations

import hashlib
import math
from dataclasses import dataclass, field
from enum import Enum

__all__ = ["Finding", "Measure", "Quantity", "Source", "Status", "STATUS_ORDER", "WaiverNote",
           "computed"]


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


def _plain(value):
    """A float, or None where the number is not finite (an infinite life, say)."""
    number = float(value)
    return number if math.isfinite(number) else None


@dataclass(frozen=True)
class Quantity:
    """One computed number of a finding, at full precision, for programs to read.

    ``name`` is the quantity's name from ``docs/glossary.md`` where it has one ("natural
    frequency", "transmissibility", "slip safety"); ``value`` is a number, or a tuple of
    numbers (a band's ends, a value per mount), in SI units (``unit`` "Hz", "N", "Pa",
    "m", "s", "fraction" for a share of a whole, "1" for any other ratio); a value that
    is not finite (the life at zero damage) is ``None``. ``context`` names what the
    number belongs to, as sorted (key, text) pairs: ``(("band", "1x running speed"),
    ("mode", "bounce"))``. Make one with :func:`computed`.
    """

    name: str
    value: float | None | tuple[float | None, ...]
    unit: str = ""
    context: tuple[tuple[str, str], ...] = ()

    def context_of(self, key: str, default: str = "") -> str:
        return dict(self.context).get(key, default)


def computed(name: str, value, unit: str = "1", **context) -> Quantity:
    """A :class:`Quantity` from a number or a sequence of numbers (numpy ones too), its
    SI unit and keyword context (underscores in keys become hyphens; None values are
    left out): ``computed("natural frequency", 8.1, "Hz", mode="bounce")``."""
    if type(value) is float:  # the usual case, as _plain would give it
        plain = value if math.isfinite(value) else None
    elif isinstance(value, (list, tuple)) or hasattr(value, "__len__"):
        plain = tuple(_plain(v) for v in value)
    else:
        plain = _plain(value)
    if not context:
        return Quantity(name, plain, unit, ())
    pairs = []
    for key, text in context.items():  # about 85 quantities a design: kept lean
        if text is not None:
            hyphenated = _HYPHENATED.get(key)
            if hyphenated is None:
                hyphenated = _HYPHENATED[key] = key.replace("_", "-")
            pairs.append((hyphenated, text if type(text) is str else str(text)))
    if len(pairs) > 1:
        pairs.sort()
    return Quantity(name, plain, unit, tuple(pairs))


_HYPHENATED: dict[str, str] = {}
"""Context keys as :func:`computed` writes them ("load_shape" -> "load-shape"): a run
uses a handful of keys tens of thousands of times."""


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
    quantities: tuple[Quantity, ...] = ()
    fingerprint: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        if not self.fingerprint:
            key = "\x1f".join((self.rule_id, self.file, self.target, self.key_path))
            digest = hashlib.sha256(key.encode("utf-8")).hexdigest()[:16]
            object.__setattr__(self, "fingerprint", digest)

    @property
    def sort_key(self) -> tuple:
        return (self.file, self.target, self.line, self.column, self.rule_id, self.key_path)

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
        isfinite = math.isfinite  # a band's ends, a value per mount: floats mostly
        plain = tuple([v if type(v) is float and isfinite(v) else _plain(v) for v in value])
    else:
        plain = _plain(value)
    if context:
        # keyed on the values and their types: a str subclass equal to a remembered text
        # (a str-valued Enum member) may print otherwise
        key = (tuple(context.items()), tuple(map(type, context.values())))
        try:
            pairs = _CONTEXTS.get(key)
        except TypeError:  # a value that cannot be hashed (a list): its text, not remembered
            pairs = _context_pairs(context, None)
        if pairs is None:
            pairs = _context_pairs(context, key)
    else:
        pairs = ()
    # Quantity(name, plain, unit, pairs), its fields set straight into the instance
    # dictionary in field order, as the generated __init__ sets them, less its four
    # frozen-attribute calls; Quantity has no __post_init__ to run. About 85 quantities
    # a design. tests/test_findings_fast.py holds the two equal.
    quantity = _new(Quantity)
    fields = quantity.__dict__
    fields["name"] = name
    fields["value"] = plain
    fields["unit"] = unit
    fields["context"] = pairs
    return quantity


def _context_pairs(context: dict, key: tuple) -> tuple[tuple[str, str], ...]:
    """The sorted (hyphenated key, text) pairs of a context, remembered when every value
    is a str or None: a key of other values could equal one whose texts differ (1, 1.0
    and True are equal; their texts are not), a key of str and None values cannot."""
    pairs = []
    plain_texts = True
    for name, text in context.items():
        if text is not None:
            hyphenated = _HYPHENATED.get(name)
            if hyphenated is None:
                hyphenated = _HYPHENATED[name] = name.replace("_", "-")
            if type(text) is not str:
                plain_texts = False
                text = str(text)
            pairs.append((hyphenated, text))
    if len(pairs) > 1:
        pairs.sort()
    result = tuple(pairs)
    if plain_texts and key is not None:
        if len(_CONTEXTS) >= _CONTEXTS_KEPT:
            _CONTEXTS.clear()
        _CONTEXTS[key] = result
    return result


_new = object.__new__

_HYPHENATED: dict[str, str] = {}
"""Context keys as :func:`computed` writes them ("load_shape" -> "load-shape"): a run
uses a handful of keys tens of thousands of times."""

_CONTEXTS: dict[tuple, tuple[tuple[str, str], ...]] = {}
"""The pairs of the contexts met so far, by the context's items and their values' types:
a finding's quantities mostly share one context (a detail and a bin, a joint, a band and a
mode)."""

_CONTEXTS_KEPT = 4096
"""Contexts remembered at most; the memory is emptied when full, so it stays bounded."""


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


def _finding_with(finding: Finding, **changes) -> Finding:
    """``dataclasses.replace(finding, **changes)`` for a :class:`Finding` itself: the same
    fields, ``changes`` set, its fingerprint kept (``replace`` passes it on, so
    ``__post_init__`` has nothing to do), without the generated ``__init__``'s twenty
    frozen-attribute calls. A subclass of Finding goes through ``replace``."""
    if type(finding) is not Finding:
        from dataclasses import replace

        return replace(finding, **changes)
    changed = object.__new__(Finding)
    fields = changed.__dict__
    fields.update(finding.__dict__)
    for name, value in changes.items():
        if name not in fields:
            raise TypeError(f"Finding has no field {name!r}")
        fields[name] = value
    return changed

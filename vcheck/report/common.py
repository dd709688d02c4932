"""Helpers shared by the machine-readable writers, so that every format says a finding,
its numbers and its paths the same way."""

from __future__ import annotations

import hashlib
import math
from urllib.parse import quote

# -- helpers shared by the writers -----------------------------------------------------

INPUT_RULE_ID = "input-error"
"""The rule id under which the machine formats report input problems."""


def _clean_prefix(uri_prefix: str) -> str:
    prefix = uri_prefix.replace("\\", "/")
    parts = [part for part in prefix.split("/") if part not in ("", ".")]
    if prefix.startswith("/") or (prefix[1:2] == ":" and prefix[:1].isalpha()) or ".." in parts:
        raise ValueError(f"uri_prefix must be a path inside the repository, relative to its "
                         f"root, such as 'plant/north'; got {uri_prefix!r}")
    return "/".join(parts)


def repository_path(file: str, uri_prefix: str = "") -> str:
    """``file`` (relative to the project root) as a path relative to the repository root.

    An absolute path (a file named outside the project root) is returned as it is.
    Raises ValueError when ``uri_prefix`` is absolute or climbs out with ``..``.
    """
    prefix = _clean_prefix(uri_prefix)
    file = file.replace("\\", "/")
    if file.startswith("/"):
        return file
    while file.startswith("./"):
        file = file[2:]
    if not prefix:
        return file or "."
    return prefix if file in ("", ".") else f"{prefix}/{file}"


def repository_uri(file: str, uri_prefix: str = "") -> tuple[str, bool]:
    """The path of :func:`repository_path` as a URI reference, and whether it is relative.

    Characters that may not stand in a URI (spaces, ``%``, ``#``, non-ASCII...) are
    percent-encoded as UTF-8; an absolute path becomes a ``file://`` URI.
    """
    path = repository_path(file, uri_prefix)
    encoded = quote(path, safe="/-._~!$&'()*+,;=@")
    if path.startswith("/"):
        return "file://" + encoded, False
    return encoded, True


def number_or_none(value):
    """``value`` as a float fit for JSON (None when it is None, NaN or infinite)."""
    if value is None:
        return None
    value = float(value)
    return value if math.isfinite(value) else None


_BACKSLASHED = frozenset("\\`*_[]|~#!{}")
_REFERENCES = {"&": "&amp;", "<": "&lt;", ">": "&gt;"}


def escape_markdown(text: str) -> str:
    """``text`` as literal Markdown on one line, fit for a table cell.

    Pipes, backslashes and the characters of emphasis, code, links, strike-through and
    headings are backslash-escaped; ``&``, ``<`` and ``>`` become character references
    (so no HTML gets through); line breaks and other control characters become spaces.
    """
    out = []
    for char in text:
        if char in _BACKSLASHED:
            out.append("\\" + char)
        elif char in _REFERENCES:
            out.append(_REFERENCES[char])
        elif ord(char) < 0x20 or ord(char) == 0x7f:
            out.append(" ")
        else:
            out.append(char)
    return " ".join("".join(out).split())


def measure_text(measure) -> str:
    """A measure as the text report writes it: ``"separation 2.3%"``, ``"f 7.90 Hz"``."""
    if measure.unit == "fraction":
        number = f"{measure.value:.1%}"
    else:
        number = f"{measure.value:.4g} {measure.unit}".strip()
    return f"{measure.name} {number}".strip()


def finding_details(finding, *, sources: bool = True, advice: bool = True) -> str:
    """One paragraph on a finding: its message, found and limit, advice, sources.

    The parts are joined by spaces, never by line breaks, so a writer can put the whole
    in one annotation or table cell; the finding's own text is left as it is (writers
    escape it for their format).
    """
    text = finding.message.strip()
    if text and text[-1] not in ".!?":
        text += "."
    numbers = []
    if finding.measured is not None:
        numbers.append("found: " + measure_text(finding.measured))
    if finding.limit is not None:
        numbers.append("limit: " + measure_text(finding.limit))
    if numbers:
        joined = "; ".join(numbers)
        text += " " + joined[0].upper() + joined[1:] + "."
    if advice and finding.advice:
        text += " Advice: " + " ".join(_sentence(item) for item in finding.advice)
    if sources and finding.sources:
        text += " Sources: " + "; ".join(source.render() for source in finding.sources) + "."
    return text


def _sentence(text: str) -> str:
    text = text.strip()
    return text if not text or text[-1] in ".!?" else text + "."


def problem_fingerprint(problem) -> str:
    """A fingerprint of an input problem, stable while lines move: file, key and message."""
    key = "\x1f".join((INPUT_RULE_ID, problem.file, problem.key, problem.message))
    return hashlib.sha256(key.encode("utf-8")).hexdigest()[:16]


def unique_fingerprints(fingerprints) -> list[str]:
    """The fingerprints, the second and later copies of one made distinct (``-2``, ``-3``).

    Code-review services keep one issue per fingerprint; two findings of a rule on the
    same target and key path would otherwise hide one another.
    """
    seen: dict[str, int] = {}
    out = []
    for fingerprint in fingerprints:
        seen[fingerprint] = seen.get(fingerprint, 0) + 1
        out.append(fingerprint if seen[fingerprint] == 1 else f"{fingerprint}-{seen[fingerprint]}")
    return out


def waiver_reason(finding) -> str:
    """Why a waived finding was accepted: the waiver's reason, approver and expiry."""
    note = finding.waiver
    if note is None:
        return finding.message.strip()
    return (f"{note.reason} (approved by {note.approved_by}, until {note.expires}; "
            f"was {note.original_status.value})")


def gate_sentences(result) -> list[str]:
    """What a review reader must know of the comparison: the base, the gate, what changed.

    Empty when the run was not compared. Every review format (Markdown, GitHub lines,
    SARIF, JUnit, text) says these sentences, so that a PASS under ``--gate new`` is never
    read as "nothing fails".
    """
    comparison = result.comparison
    if comparison is None:
        return []
    if comparison.error:
        return [f"The comparison with {comparison.base} failed: {comparison.error}. "
                "The findings below are this run's alone; the exit status is 2."]
    fails = result.counts()["fail"] + result.counts()["error"]
    if result.gate == "new":
        gate = (f"Gate: only failures new against {comparison.base} fail the run "
                "(--gate new)")
    else:
        gate = f"Gate: every failure fails the run; compared with {comparison.base}"
    changes = (f"{_count(comparison.new_failures, 'new failure')}, "
               f"{_count(comparison.new_warnings, 'new warning')}, "
               f"{len(comparison.fixed)} fixed, "
               f"{_count(comparison.worse, 'margin')} worse, "
               f"{_count(comparison.better, 'margin')} better")
    sentences = [f"{gate}: {changes}."]
    if result.gate == "new" and fails and not comparison.new_failures:
        verb = "fails" if fails == 1 else "fail"
        sentences.append(f"The run passes the gate although {_count(range(fails), 'finding')} "
                         f"{verb}: the base failed {'it' if fails == 1 else 'them'} too.")
    return sentences


def _count(items, word: str) -> str:
    n = len(items)
    return f"{n} {word}{'' if n == 1 else 's'}"


def gate_items(result) -> list[tuple[str, object]]:
    """The comparison's findings for a review list: ("new failure", finding), ..."""
    comparison = result.comparison
    if comparison is None or comparison.error:
        return []
    return ([("new failure", f) for f in comparison.new_failures]
            + [("new warning", f) for f in comparison.new_warnings]
            + [("fixed", f) for f in comparison.fixed])

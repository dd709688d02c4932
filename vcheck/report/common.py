"""Helpers shared by the machine-readable writers, so that every format says a finding,
its numbers and its paths the same way."""

from __future__ import annotations

import hashlib
import json
import math
import re
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


# -- text from design files: control characters, length, mentions and links -----------

ECHO_LIMIT = 2000
"""Characters at most of one piece of text echoed into a report (a message, a cell, a
reason); the rest is cut and :data:`CUT_MARKER` says how much. A design's 30 MiB CSV cell
or description then costs a report 2 kB, not 30 MiB."""

CUT_MARKER = "... [{count} more characters not shown]"
"""What replaces the end of a cut text; ``count`` is the number of characters cut."""

_LAYOUT = frozenset("\t\n")
_NAMED = {"\r": "\\r", "\x0b": "\\v", "\x0c": "\\f", "\x00": "\\0", "\x1b": "\\e"}
# C0 and C1 controls, DEL, and the invisible characters that reorder or hide text on a
# screen (bidirectional overrides and isolates, zero-width marks, the byte-order mark)
_UNSAFE = re.compile("[\x00-\x1f\x7f-\x9f\u200b-\u200f\u2028-\u202e\u2060-\u2069\ufeff]")


def _visible(match: re.Match) -> str:
    char = match.group()
    if char in _LAYOUT:
        return " "
    named = _NAMED.get(char)
    if named is not None:
        return named
    code = ord(char)
    return f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}"


def bounded(text: str, limit: int = ECHO_LIMIT) -> str:
    """``text`` cut to ``limit`` characters with :data:`CUT_MARKER` when it is longer."""
    text = str(text)
    if len(text) <= limit:
        return text
    return text[:limit] + CUT_MARKER.format(count=len(text) - limit)


def clean_text(text: str, limit: int | None = ECHO_LIMIT) -> str:
    """``text`` safe to print on a terminal or in a CI log, cut to ``limit`` characters.

    Tab and line feed become spaces (writers lay out their own lines); every other
    control character, and the invisible characters that reorder or hide text (bidi
    overrides, zero-width marks), become a visible escape: ``\\r``, ``\\e`` (ESC, the
    start of a terminal escape sequence), ``\\0``, ``\\x07``, ``\\u202e``. So a design
    that says ``"\\u001b[2J"`` in a description cannot clear a screen or recolour a log.
    ``limit`` None leaves the length alone (the text was bounded before).
    """
    text = str(text)
    if limit is not None:
        text = bounded(text, limit)
    return _UNSAFE.sub(_visible, text)


_INVISIBLE = re.compile("[\x7f-\x9f\u200b-\u200f\u2028-\u202e\u2060-\u2069\ufeff]")


def json_safe(text: str) -> str:
    """JSON text (``json.dumps(..., ensure_ascii=False)``) with DEL, the C1 controls and
    the invisible reordering marks written as ``\\uXXXX`` escapes.

    Lossless: those characters can only stand inside JSON strings, where the escape means
    the same character; but a log or terminal that shows the file shows no live control
    (JSON already escapes the C0 controls). Other non-ASCII text stays readable.
    """
    return _INVISIBLE.sub(lambda m: f"\\u{ord(m.group()):04x}", text)


# -- JSON text with an indent of two --------------------------------------------------

class _Unusual(Exception):
    """A value :func:`json_indented` leaves to the standard library's encoder."""


_ENCODE_STRING = json.encoder.encode_basestring  # the C function where there is one
_INFINITIES = (math.inf, -math.inf)
_DEPTH = 64
_NEWLINES = ["\n" + "  " * level for level in range(_DEPTH + 2)]


def json_indented(data, bound_strings: bool = False) -> str:
    """``json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False)``, the same text.

    With ``indent`` the standard library encodes in Python, one generator per container,
    and a report of 500 designs is 20 MB of it; this writes the plain types the reports
    hold (dicts with text keys, lists, tuples, text, exact ints, floats and their
    subclasses such as numpy's float64, booleans, None) into one list of pieces. Anything
    else (a text or int subclass, a non-text key, a float that is not finite, nesting
    deeper than 64, as a cycle would be) is handed to ``json.dumps``, so its text or its
    error is the standard library's own.
    tests/report/test_json_indented.py holds the two equal.

    ``bound_strings`` cuts every string value reached through dicts and lists (not keys,
    not inside tuples) with :func:`bounded` first, as the JSON report does.
    """
    out: list[str] = []
    try:
        _json_value(data, out, 0, bound_strings)
    except _Unusual:
        if bound_strings:
            data = _bounded_strings(data)
        return json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False)
    return "".join(out)


def _bounded_strings(data):
    """``data`` with every string reached through dicts and lists cut to the echo limit."""
    if isinstance(data, str):
        return bounded(data)
    if isinstance(data, dict):
        return {key: _bounded_strings(value) for key, value in data.items()}
    if isinstance(data, list):
        return [_bounded_strings(item) for item in data]
    return data


def _json_value(value, out: list, level: int, bound: bool) -> None:
    kind = type(value)
    if kind is str:
        out.append(_ENCODE_STRING(bounded(value) if bound else value))
    elif value is None:
        out.append("null")
    elif value is True:
        out.append("true")
    elif value is False:
        out.append("false")
    elif kind is int:
        out.append(int.__repr__(value))
    elif kind is float or (kind is not int and isinstance(value, float)):
        # a float subclass (numpy's float64) is written as json writes it, float.__repr__
        if value != value or value in _INFINITIES:
            raise _Unusual
        out.append(float.__repr__(value))
    elif kind is dict or kind is list or kind is tuple:
        if not value:
            out.append("{}" if kind is dict else "[]")
            return
        if level >= _DEPTH:
            raise _Unusual
        inner = _NEWLINES[level + 1]
        if kind is dict:
            _json_dict(value, out, level, inner, bound)
        else:
            # the report's bounding walks lists, not tuples
            _json_list(value, out, level, inner, bound and kind is list)
        out.append(_NEWLINES[level])
        out.append("}" if kind is dict else "]")
    else:
        raise _Unusual


def _json_dict(value: dict, out: list, level: int, inner: str, bound: bool) -> None:
    # the commonest values (text, floats) written here rather than one call each
    separator = "{" + inner
    following = "," + inner
    for key, item in value.items():
        if type(key) is not str:
            raise _Unusual
        kind = type(item)
        if kind is str:
            if bound and len(item) > ECHO_LIMIT:
                item = bounded(item)
            out.append(f"{separator}{_ENCODE_STRING(key)}: {_ENCODE_STRING(item)}")
        elif kind is float and item == item and item not in _INFINITIES:
            out.append(f"{separator}{_ENCODE_STRING(key)}: {float.__repr__(item)}")
        else:
            out.append(f"{separator}{_ENCODE_STRING(key)}: ")
            _json_value(item, out, level + 1, bound)
        separator = following


def _json_list(value, out: list, level: int, inner: str, bound: bool) -> None:
    separator = "[" + inner
    following = "," + inner
    for item in value:
        kind = type(item)
        if kind is str:
            if bound and len(item) > ECHO_LIMIT:
                item = bounded(item)
            out.append(separator + _ENCODE_STRING(item))
        elif kind is float and item == item and item not in _INFINITIES:
            out.append(separator + float.__repr__(item))
        else:
            out.append(separator)
            _json_value(item, out, level + 1, bound)
        separator = following


def xml_safe(text: str) -> str:
    """XML text with the characters of :func:`json_safe` as character references
    (``&#x9b;``): lossless, and nothing live on a terminal."""
    return _INVISIBLE.sub(lambda m: f"&#x{ord(m.group()):x};", text)


def clean_lines(text: str) -> str:
    """A whole report made safe line by line: as :func:`clean_text` without a length
    limit, but line feeds kept. The text writer runs it over its output last, so no
    field it forgets can carry a control character through."""
    return "\n".join(_UNSAFE.sub(_visible, line) for line in text.split("\n"))


_MENTION = re.compile(r"@(?=[A-Za-z0-9_])")
_SCHEME = re.compile(r"(?i)\b([a-z][a-z0-9+.-]{1,20}):(?=//)")
_WWW = re.compile(r"(?i)\bwww\.")
_ZERO_WIDTH = "&#8203;"


def neutralise_markdown(text: str) -> str:
    """Escaped Markdown text (:func:`escape_markdown`) with mentions and links made inert.

    A code-review page turns ``@name`` into a notification and ``https://...`` or
    ``www.`` into a live link even when no Markdown syntax asks for it. A zero-width space
    (written ``&#8203;``, so it survives any editor) goes after ``@``, after a URL scheme's
    colon and after ``www``: the text reads the same and neither notifies nor links. E-mail
    addresses are caught by the ``@`` rule.
    """
    text = _MENTION.sub("@" + _ZERO_WIDTH, text)
    text = _SCHEME.sub(lambda m: m.group(1) + ":" + _ZERO_WIDTH, text)
    return _WWW.sub(lambda m: m.group()[:3] + _ZERO_WIDTH + ".", text)


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
    Text longer than :data:`ECHO_LIMIT` is cut with a marker, and mentions and bare links
    are made inert (:func:`neutralise_markdown`).
    """
    out = []
    for char in bounded(text):
        if char in _BACKSLASHED:
            out.append("\\" + char)
        elif char in _REFERENCES:
            out.append(_REFERENCES[char])
        elif ord(char) < 0x20 or ord(char) == 0x7f:
            out.append(" ")
        else:
            out.append(char)
    return neutralise_markdown(" ".join(clean_text("".join(out), limit=None).split()))


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
    in one annotation or table cell; the finding's own text is only cut to
    :data:`ECHO_LIMIT` (writers escape it for their format).
    """
    text = bounded(finding.message).strip()
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
        text += " Advice: " + " ".join(_sentence(bounded(item)) for item in finding.advice)
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
        return bounded(finding.message).strip()
    return (f"{bounded(note.reason)} (approved by {note.approved_by}, until {note.expires}; "
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

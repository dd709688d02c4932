"""Where each key and value of a TOML document stands in its source text.

The standard library's TOML parser returns plain values with no line or column, so
vcheck first lets ``tomllib`` (or ``tomli``) parse and validate the document, then runs
this small scanner over the same, already valid, text to record the position of every
key path: table headers, arrays of tables, dotted keys, inline tables and arrays.

A key path is a tuple of keys and array indices, ``("joint", 1, "fastener")`` for the
``fastener`` key of the second ``[[joint]]`` table.
"""

from __future__ import annotations

import re
from typing import NamedTuple

__all__ = ["Position", "KeyPath", "scan_positions"]

KeyPath = tuple  # of str and int


class Position(NamedTuple):
    """1-based line and column of a key, and of its value where it has one (a named
    tuple: thousands are made per file, and a tuple is the cheapest record)."""

    line: int
    column: int
    value_line: int
    value_column: int


_BARE_KEY = re.compile(r"[A-Za-z0-9_-]*")
_SCALAR = re.compile(r"[^,\]}\n#\r]*")
# Blanks and comments: a comment runs to the end of its line, so only a newline can
# follow it (blanks first, then comments each with the blanks after it: the same text
# as any mix of the two, matched without trying each blank two ways).
_BLANK = re.compile(r"[ \t\r]*(?:#[^\n]*)?")
_BLANK_LINES = re.compile(r"[ \t\r\n]*(?:#[^\n]*[ \t\r\n]*)*")
# The usual line of a design file, ``key = value  # comment``: one bare key, and a
# one-line scalar or a string without escapes; when only blanks and a comment follow it
# on its line, the general scanner would give the same positions, and the line is read
# in one match. No part of the pattern can match the same text two ways (no
# backtracking on long lines).
_SIMPLE_PAIR = re.compile(
    r"[A-Za-z0-9_-]+(?P<eq>[ \t]*=[ \t]*)"
    r"(?:\"[^\"\\\n]*\"|'[^'\n]*'|[^\s\"'\[\]{},#=][^,\]}\n#\r]*)")


# The same line read to its end: the pair, the blanks and comment after it, and its
# newline. A value cannot end in a blank, '#' or CR, so giving characters back to the
# tail never makes a match the two-step reading would not: it matches where that reading
# found only blanks and a comment after the pair, and nowhere else.
_SIMPLE_LINE = re.compile(_SIMPLE_PAIR.pattern + r"[ \t\r]*(?:#[^\n]*)?(?:\n|\Z)")
# A table header of bare keys without blanks, ``[a.b]`` or ``[[a.b]]``, to its line end.
_SIMPLE_HEADER = re.compile(
    r"(?P<open>\[\[?)(?P<keys>[A-Za-z0-9_-]+(?:\.[A-Za-z0-9_-]+)*)(?P<close>\]\]?)"
    r"[ \t\r]*(?:#[^\n]*)?(?:\n|\Z)")

# A bare key, its '=' and the blanks after it, before a value of any other kind (the
# general reader locates a bare key so: at the key, and at what follows the blanks).
_KEY_EQUALS = re.compile(r"[A-Za-z0-9_-]+(?P<eq>[ \t]*=[ \t]*)(?=[^\s#])")

_new_tuple = tuple.__new__  # Position(...) without the Python-level __new__ of a named tuple

# One key = value pair of a flat inline table on one line, and one scalar or plain string
# of an array on one line, each up to the comma or bracket that follows it (a scalar
# holds its trailing blanks, so no text can match two ways).
_INLINE_PAIR = re.compile(
    r"[ \t]*(?P<key>[A-Za-z0-9_-]+)[ \t]*=[ \t]*(?P<value>\"[^\"\\\n]*\"[ \t]*|'[^'\n]*'[ \t]*"
    r"|[^\s\"'\[\]{},#=][^,\]}\n#\r]*)(?P<end>[,}])")
_ARRAY_ITEM = re.compile(
    r"[ \t]*(?P<value>\"[^\"\\\n]*\"[ \t]*|'[^'\n]*'[ \t]*"
    r"|[^\s\"'\[\]{},#=][^,\]}\n#\r]*)(?P<end>[,\]])[ \t]*(?P<close>\]?)")


class _Scanner:
    def __init__(self, text: str) -> None:
        self.text = text
        self.i = 0
        self.line = 1
        self.line_start = 0
        self.positions: dict[KeyPath, Position] = {}
        self.array_counts: dict[KeyPath, int] = {}

    # -- low-level movement -------------------------------------------------------
    def here(self) -> tuple[int, int]:
        return self.line, self.i - self.line_start + 1

    def peek(self, k: int = 0) -> str:
        j = self.i + k
        return self.text[j] if j < len(self.text) else ""

    def advance(self, n: int = 1) -> None:
        end = min(self.i + n, len(self.text))
        newlines = self.text.count("\n", self.i, end)
        if newlines:
            self.line += newlines
            self.line_start = self.text.rfind("\n", self.i, end) + 1
        self.i = end

    def skip_blank(self, newlines: bool) -> None:
        """Skip spaces, tabs, comments and (if asked) newlines."""
        if not newlines:  # spaces, tabs and a comment hold no newline: no line to count
            self.i = _BLANK.match(self.text, self.i).end()
            return
        found = _BLANK_LINES.match(self.text, self.i)
        if found.end() > self.i:
            self.advance(found.end() - self.i)

    # -- keys and strings ---------------------------------------------------------
    def read_string(self) -> str:
        text = self.text
        quote = text[self.i]
        if text.startswith(quote * 3, self.i):
            end = self._triple_end(quote, self.i + 3)
            for _ in range(2):  # up to two quotes may end the body
                if text.startswith(quote, end + 3):
                    end += 1
            body = text[self.i + 3:end]
            self.advance(end + 3 - self.i)
            return body
        j = self.i + 1
        end = text.find(quote, j)
        if end >= 0 and (quote == "'" or text.find("\\", j, end) < 0):
            # no escape before the closing quote: the body is the text between the quotes
            self.advance(end + 1 - self.i)
            return text[j:end]
        out = []
        while j < len(text) and text[j] != quote:
            if quote == '"' and text[j] == "\\":
                out.append(text[j:j + 2])
                j += 2
                continue
            out.append(text[j])
            j += 1
        self.advance(j + 1 - self.i)
        raw = "".join(out)
        if quote == '"' and "\\" in raw:
            import json

            try:
                return json.loads(f'"{raw}"')
            except ValueError:
                return raw
        return raw

    def _triple_end(self, quote: str, start: int) -> int:
        """Index of the closing triple quote of a multi-line string whose body starts at
        ``start`` (the end of the text if it has none). In a basic string (") a
        backslash escapes the next character, so a backslash before three quotes does not
        close it. Each character is looked at a bounded number of times: linear in the
        length of the text."""
        text = self.text
        closing = quote * 3
        if quote == "'":
            end = text.find(closing, start)
            return len(text) if end < 0 else end
        end = text.find(closing, start)
        j = start
        while end >= 0:
            escape = text.find("\\", j, end)
            if escape < 0:
                return end
            j = escape + 2  # skip the backslash and the character it escapes
            if j > end:
                end = text.find(closing, j)
        return len(text)

    def read_key(self) -> list[str]:
        keys = []
        while True:
            self.skip_blank(newlines=False)
            c = self.peek()
            if c in "\"'":
                keys.append(self.read_string())
            else:
                found = _BARE_KEY.match(self.text, self.i)
                keys.append(found.group())
                self.i = found.end()  # a bare key holds no newline
            self.skip_blank(newlines=False)
            if self.peek() == ".":
                self.advance()
                continue
            return keys

    # -- values -------------------------------------------------------------------
    def read_value(self, path: KeyPath) -> None:
        c = self.peek()
        if c in "\"'":
            self.read_string()
        elif c == "[":
            if self._flat_array(path):
                return
            self.advance()
            index = 0
            while True:
                self.skip_blank(newlines=True)
                if self.peek() in ("]", ""):
                    self.advance()
                    return
                line, column = self.here()
                self.positions[path + (index,)] = _new_tuple(Position,
                                                             (line, column, line, column))
                self.read_value(path + (index,))
                index += 1
                self.skip_blank(newlines=True)
                if self.peek() == ",":
                    self.advance()
        elif c == "{":
            if self._flat_inline_table(path):
                return
            self.advance()
            while True:
                self.skip_blank(newlines=False)
                if self.peek() in ("}", ""):
                    self.advance()
                    return
                self.read_pair(path)
                self.skip_blank(newlines=False)
                if self.peek() == ",":
                    self.advance()
        else:
            end = _SCALAR.match(self.text, self.i).end()  # a scalar holds no newline
            self.i = max(end, min(self.i + 1, len(self.text)))  # always move on

    def _flat_inline_table(self, path: KeyPath) -> bool:
        """``{ a = 1, b = "x" }`` on one line, of bare keys and scalars or plain strings:
        its pairs located as read_pair would locate them; False (nothing read) for any
        other inline table."""
        text, j, found = self.text, self.i + 1, []
        while True:
            pair = _INLINE_PAIR.match(text, j)
            if pair is None:
                return False
            found.append((pair.start("key"), pair["key"], pair.start("value")))
            j = pair.end()
            if pair["end"] == "}":
                break
        start = self.line_start
        for key_at, key, value_at in found:
            self.positions[path + (key,)] = _new_tuple(
                Position, (self.line, key_at - start + 1, self.line, value_at - start + 1))
        self.i = j
        return True

    def _flat_array(self, path: KeyPath) -> bool:
        """``[1, 2, "x"]`` on one line, of scalars and plain strings (a trailing comma
        allowed): its items located as the general loop would; False (nothing read) for
        any other array."""
        text, j, found = self.text, self.i + 1, []
        if _BLANK.match(text, j).end() < len(text) and text[_BLANK.match(text, j).end()] == "]":
            return False  # an empty array: the general loop
        while True:
            item = _ARRAY_ITEM.match(text, j)
            if item is None:
                return False
            found.append(item.start("value"))
            j = item.end()
            if item["end"] == "]" or item["close"]:
                break
        start = self.line_start
        for index, value_at in enumerate(found):
            column = value_at - start + 1
            self.positions[path + (index,)] = _new_tuple(
                Position, (self.line, column, self.line, column))
        self.i = j
        return True

    def read_pair(self, table: KeyPath) -> None:
        line, column = self.here()
        keys = self.read_key()
        self.skip_blank(newlines=False)
        if self.peek() == "=":
            self.advance()
        self.skip_blank(newlines=False)
        vline, vcolumn = self.here()
        for depth in range(1, len(keys)):
            prefix = table + tuple(keys[:depth])
            self.positions.setdefault(prefix, Position(line, column, vline, vcolumn))
        path = table + tuple(keys)
        self.positions[path] = Position(line, column, vline, vcolumn)
        self.read_value(path)

    def read_header(self) -> KeyPath:
        line, column = self.here()
        is_array = self.text.startswith("[[", self.i)
        self.advance(2 if is_array else 1)
        keys = self.read_key()
        self.advance(2 if is_array else 1)
        return self._table(keys, is_array, line, column)

    def _table(self, keys: list, is_array: bool, line: int, column: int) -> KeyPath:
        """The key path of a table header's keys, recording the header's position."""
        positions, counts = self.positions, self.array_counts
        here = _new_tuple(Position, (line, column, line, column))  # shared: a tuple
        resolved: list = []
        last = len(keys) - 1
        for n, key in enumerate(keys):
            resolved.append(key)
            prefix = tuple(resolved)
            if n == last and is_array:
                count = counts.get(prefix, 0)
                counts[prefix] = count + 1
                positions.setdefault(prefix, here)
                resolved.append(count)
            else:
                count = counts.get(prefix)  # at least 1 where present
                if count is not None:
                    resolved.append(count - 1)
                else:
                    positions.setdefault(prefix, here)
        path = tuple(resolved)
        positions[path] = here
        return path

    def _line_read(self, end: int) -> None:
        """Move to ``end``, the end of a line read whole (after its newline, if any)."""
        self.i = end
        if self.text[end - 1] == "\n":
            self.line += 1
            self.line_start = end

    def run(self) -> dict[KeyPath, Position]:
        table: KeyPath = ()
        text, positions = self.text, self.positions
        size = len(text)
        simple_line, simple_header, key_equals = (_SIMPLE_LINE.match, _SIMPLE_HEADER.match,
                                                  _KEY_EQUALS.match)
        blank_lines, count, rfind = _BLANK_LINES.match, text.count, text.rfind
        # the place, line and line start live in locals while the lines are read whole,
        # and are handed to the general reader (self.i, ...) and back around its calls
        i, line, line_start = self.i, self.line, self.line_start
        while True:
            # as skip_blank(True); a line that starts with a key has nothing to skip
            if i < size and text[i] in " \t\r\n#":
                blank_end = blank_lines(text, i).end()
                newlines = count("\n", i, blank_end)
                if newlines:
                    line += newlines
                    line_start = rfind("\n", i, blank_end) + 1
                i = blank_end
            if i >= size:
                return positions
            before = i
            if text[before] == "[":
                header = simple_header(text, before)
                # a header reads as one only if its brackets pair: "[a]]" or "[[a]" are
                # left to the general reader
                if header is not None and len(header["open"]) == len(header["close"]):
                    table = self._table(header["keys"].split("."), len(header["open"]) == 2,
                                        line, before - line_start + 1)
                    i = header.end()
                    if text[i - 1] == "\n":  # as _line_read
                        line += 1
                        line_start = i
                else:
                    self.i, self.line, self.line_start = i, line, line_start
                    table = self.read_header()
                    i, line, line_start = self.i, self.line, self.line_start
            else:
                simple = simple_line(text, before)
                if simple is not None:
                    column = before - line_start + 1
                    positions[table + (text[before:simple.start("eq")],)] = _new_tuple(
                        Position, (line, column, line, column + simple.end("eq") - before))
                    i = simple.end()
                    if text[i - 1] == "\n":  # as _line_read
                        line += 1
                        line_start = i
                else:
                    pair = key_equals(text, before)
                    self.line, self.line_start = line, line_start
                    if pair is not None:
                        # "key = " and another value (an inline table, an array, a string
                        # with escapes...): located as read_pair locates a bare key, its
                        # value read by read_value
                        column = before - line_start + 1
                        path = table + (text[before:pair.start("eq")],)
                        positions[path] = _new_tuple(
                            Position, (line, column, line, column + pair.end() - before))
                        self.i = pair.end()
                        self.read_value(path)
                    else:
                        self.i = i
                        self.read_pair(table)
                    i, line, line_start = self.i, self.line, self.line_start
            if i <= before:  # never stand still: the scan is linear in the text
                self.i, self.line, self.line_start = i, line, line_start
                self.advance(1)
                i, line, line_start = self.i, self.line, self.line_start


def scan_positions(text: str) -> dict[KeyPath, Position]:
    """Map every key path of a valid TOML document to its :class:`Position`.

    The text must already have been accepted by a TOML parser; the scanner does not
    validate, it only locates. It always ends, in time linear in the text; should it
    lose its way in a construct it does not know, the keys found so far are returned
    and the rest are located at the start of the file.
    """
    scanner = _Scanner(text)
    try:
        return scanner.run()
    except (IndexError, ValueError, AttributeError, RecursionError):
        return scanner.positions

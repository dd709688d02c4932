"""The position scanner, checked against the text itself: at each reported line and
column the source must show the key (or the value) that the path names."""

from __future__ import annotations

import sys

import pytest

from vcheck.design.positions import scan_positions

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

DOCUMENT = '''\
format = 1 # comment with = and [brackets]
[machine]
tag = "P-1"
speed = { min = "900 rpm", max = "1780 rpm" }
rotor."balance grade" = 'G6.3'
description = """a multi-line string
[not-a-table]
x = "not a key"
"""
orders = [1, 2,
  # a comment inside an array
  { name = "belt", order = 0.38 }]

[[joint]]
name = "feet"

[[joint]]
name = "base"

[[joint.bolt]]
size = "M16"

[[joint.bolt]]
size = "M20"

[joint.note]
text = "about the second joint"
'''


def _at(text: str, line: int, column: int) -> str:
    return text.splitlines()[line - 1][column - 1:]


@pytest.fixture(scope="module")
def positions():
    tomllib.loads(DOCUMENT)  # the scanner is only ever run on valid TOML
    return scan_positions(DOCUMENT)


@pytest.mark.parametrize(
    ("path", "key_text", "value_text"),
    [
        (("format",), "format", "1"),
        (("machine", "tag"), "tag", '"P-1"'),
        (("machine", "speed", "min"), "min", '"900 rpm"'),
        (("machine", "speed", "max"), "max", '"1780 rpm"'),
        (("machine", "rotor", "balance grade"), "rotor.", "'G6.3'"),
        (("machine", "description"), "description", '"""'),
        (("machine", "orders", 2, "order"), "order", "0.38"),
        (("joint", 0, "name"), "name", '"feet"'),
        (("joint", 1, "name"), "name", '"base"'),
        (("joint", 1, "bolt", 0, "size"), "size", '"M16"'),
        (("joint", 1, "bolt", 1, "size"), "size", '"M20"'),
        (("joint", 1, "note", "text"), "text", '"about the second'),
    ],
)
def test_positions_point_at_key_and_value(positions, path, key_text, value_text):
    found = positions[path]
    assert _at(DOCUMENT, found.line, found.column).startswith(key_text)
    assert _at(DOCUMENT, found.value_line, found.value_column).startswith(value_text)


def test_multiline_string_hides_its_brackets_and_keys(positions):
    assert ("not-a-table",) not in positions
    assert ("machine", "x") not in positions


def test_array_of_tables_headers(positions):
    assert positions[("joint", 0)].line == 14
    assert positions[("joint", 1)].line == 17
    assert positions[("joint", 1, "bolt", 1)].line == 23


def test_strings_with_and_without_escapes_keep_the_positions_after_them():
    # Checked against the text itself (a closed count of characters): each key after a
    # string with an escaped quote, a literal string with a backslash, a quoted key with
    # a unicode escape, and a double quote inside a literal string.
    text = ('a = "x\\"y" # a quote escaped\n'
            "b = 'p\\q'\n"
            '"k\\u00e9y" = "plain"\n'
            "c = ['it\"s', \"\\\\\"]\n"
            "d = 2\n")
    data = tomllib.loads(text)
    assert data["a"] == 'x"y' and data["b"] == "p\\q" and "k\u00e9y" in data
    found = scan_positions(text)
    assert (found[("a",)].line, found[("a",)].value_column) == (1, 5)
    assert (found[("b",)].line, found[("b",)].column) == (2, 1)
    assert (found[("k\u00e9y",)].line, found[("k\u00e9y",)].value_column) == (3, 14)
    assert (found[("c", 1)].line, found[("c", 1)].column) == (4, 14)
    assert (found[("d",)].line, found[("d",)].column) == (5, 1)

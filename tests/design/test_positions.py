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


def _general_scan(text: str, monkeypatch) -> dict:
    """The positions as the general scanner alone finds them: every fast path of the
    main loop (a simple pair or header read as one line, a bare key before another
    value) switched off by a pattern that never matches."""
    import re

    from vcheck.design import positions as module

    never = re.compile(r"(?!)(?P<eq>)")
    with monkeypatch.context() as patch:
        for name in ("_SIMPLE_LINE", "_SIMPLE_HEADER", "_KEY_EQUALS"):
            assert hasattr(module, name), name  # a renamed pattern would leave it on
            patch.setattr(module, name, never)
        return module.scan_positions(text)


def test_the_general_scan_is_the_general_reader_alone(monkeypatch):
    # the reference must not itself take a fast path: with them off, the bare-key lines
    # are read by read_pair, one call each
    from vcheck.design import positions as module

    calls = []
    read_pair = module._Scanner.read_pair
    monkeypatch.setattr(module._Scanner, "read_pair",
                        lambda self, table: (calls.append(table), read_pair(self, table)))
    _general_scan('a = 1\n[t]\nb = "x"\nc = { d = 2 }\n', monkeypatch)
    assert calls == [(), ("t",), ("t",)]


def _repository_toml_files():
    from pathlib import Path

    root = Path(__file__).resolve().parents[2]
    return sorted(p for p in root.rglob("*.toml")
                  if not any(part.startswith(".") for part in p.relative_to(root).parts))


FAST_PATH_CASES = {
    "the module's document": DOCUMENT,
    "blanks, tabs and comments around simple pairs": (
        "a=1\nb =\t'x'   # c\n  c = \"y\"\t\nd = 2026-03-01 07:30:00Z # when\n"
        "e = -1.5e3\r\nf = true\n[t]\ng = 'h' #\nh = \"\"\n"),
    "strings the fast path leaves to the general scanner": (
        'a = "x\\"y"\nb = """m\nn"""\nc = \'\'\'p\'\'\'\nd = "q" # "\ne = 1\n'),
    "dotted, quoted and inline keys next to simple ones": (
        'a.b = 1\n"c d" = 2\ne = { f = 3 }\ng = [1,\n 2]\nh = 4\n[[i]]\nj = 5\n[[i]]\nj = 6\n'),
    "the last line without a newline": 'a = 1\nb = "end"',
    "flat inline tables and arrays on one line": (
        'a = { x = 1, y = "two" , z = \'3\' }\nb = [1, 2 ,3]\nc = [ "p", \'q\', ]\n'
        'd = {x=1}\ne = [4]\nf = [ 2026-03-01 07:30:00Z , 5.5e3 ]\n[t]\ng = { h = -1 }\n'),
    "inline tables and arrays left to the general scanner": (
        'a = {}\nb = []\nc = [ ]\nd = { x = { y = 1 } }\ne = [[1, 2], [3]]\n'
        'f = [1,\n  2, # c\n  3]\ng = { "q k" = 1, r.s = 2 }\nh = ["x\\"y", 2]\n'
        'i = [{ j = 1 }, { j = 2 }]\n'),
}


@pytest.mark.parametrize("name", sorted(FAST_PATH_CASES))
def test_the_one_line_fast_path_gives_the_general_scanners_positions(name, monkeypatch):
    # Reference: the general scanner of the same module (checked against the text by
    # the tests above) on the same text; tomllib accepts each text first.
    text = FAST_PATH_CASES[name]
    tomllib.loads(text)
    assert scan_positions(text) == _general_scan(text, monkeypatch)


def test_the_fast_path_agrees_on_every_toml_file_of_the_repository(monkeypatch):
    checked = 0
    for path in _repository_toml_files():
        text = path.read_text(encoding="utf-8")
        try:
            tomllib.loads(text)
        except tomllib.TOMLDecodeError:
            continue  # the broken examples: the scanner only runs on valid TOML
        assert scan_positions(text) == _general_scan(text, monkeypatch), path
        checked += 1
    assert checked > 40

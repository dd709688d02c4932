"""The streamed reading of a time-history CSV (``_stream_rows``): which lines are rows
and their line numbers.

Reference: a plain line-by-line reading written here from the definition the module
states (a row is a line that is neither blank nor a comment starting with '#', after
the line end and a UTF-8 byte-order mark are taken off; str.strip's whitespace counts
as blank), applied to the same bytes.
"""

from __future__ import annotations

import pytest

from vcheck.design import fatigue_details


def _reference(data: bytes) -> list[tuple[int, str]]:
    text = data.decode("utf-8-sig")
    rows = []
    for number, line in enumerate(text.split("\n"), start=1):
        line = line.rstrip("\r")
        stripped = line.strip()
        if stripped and not stripped.startswith("#"):
            rows.append((number, line))
    return rows


CASES = {
    "plain rows": b"t,x\n0,1\n0.1,2\n",
    "no final newline": b"0,1\n0.1,2",
    "blank lines and comments": b"# a comment\n\n0,1\n   \n  # indented comment\n\t\n0.1,2\n",
    "windows line ends": b"t,x\r\n0,1\r\n\r\n0.1,2\r\n",
    "a byte-order mark": b"\xef\xbb\xbft,x\n0,1\n",
    "unicode blanks": "0,1\n\u3000\n\u2003# c\n\x0b\n\x1c\n1,2\n".encode(),
    "rows that start with a blank": b" 0,1\n\t1,2\n",
    "only blanks": b"\n\n  \n",
    "empty": b"",
}


@pytest.mark.parametrize("name", sorted(CASES))
def test_rows_and_line_numbers_are_those_of_a_line_by_line_reading(name, tmp_path):
    path = tmp_path / "h.csv"
    path.write_bytes(CASES[name])
    found = list(fatigue_details._stream_rows(path, "h.csv", "time-history file", 1 << 20))
    assert found == _reference(CASES[name])


def test_rows_across_chunks_keep_their_numbers(tmp_path):
    # lines longer than the 1 MiB read size cross chunk boundaries
    data = b"".join(b"%d,%s\n" % (n, b"7" * 300_000) for n in range(8)) + b"\n# end\n9,9"
    path = tmp_path / "h.csv"
    path.write_bytes(data)
    found = list(fatigue_details._stream_rows(path, "h.csv", "time-history file", 8 << 20))
    assert found == _reference(data)


def test_the_first_characters_that_need_a_closer_look_are_python_s_blanks_and_the_hash():
    # Reference: str.isspace over every code point (the Python definition of blank that
    # str.strip uses), and '#', which starts a comment
    blanks = {chr(c) for c in range(0x110000) if chr(c).isspace()}
    assert fatigue_details._BLANK_OR_COMMENT == blanks | {"#"}


# The whole-file reading of a small CSV (``_regular_rows``) must give the rows of the
# line-by-line reading above, or None (and the file is streamed); whatever it gives, the
# first row and the rows after it are those of the reference.
@pytest.mark.parametrize("name", sorted(CASES))
def test_whole_file_rows_are_those_of_a_line_by_line_reading_or_none(name, tmp_path):
    path = tmp_path / "h.csv"
    path.write_bytes(CASES[name])
    found = fatigue_details._regular_rows(path, "h.csv", "time-history file", 1 << 20)
    if found is not None:
        assert [found[0]] + found[1] == [line for _, line in _reference(CASES[name])]


def test_whole_file_rows_take_plain_files_and_leave_irregular_ones():
    # the plain cases must take the fast reading (else it would never be used), the
    # others must not (their rows need the careful filter)
    import tempfile
    from pathlib import Path

    taken = {}
    with tempfile.TemporaryDirectory() as folder:
        for name, data in CASES.items():
            path = Path(folder) / "h.csv"
            path.write_bytes(data)
            taken[name] = fatigue_details._regular_rows(
                path, "h.csv", "time-history file", 1 << 20) is not None
    assert taken == {name: name in ("plain rows", "no final newline", "a byte-order mark")
                     for name in CASES}


# ``two_number_columns`` against float() applied row by row to the first two cells
# (Python's float is the reference the row-by-row readers use).
COLUMN_CASES = {
    "plain": (["1,2", "3.5,4e-3", " 5 , 6 "], True),
    "underscores and unicode digits": (["1_0,2", "\u0661\u0662,3"], True),
    "a third cell": (["1,2,3", "4,5"], False),
    "one cell": (["1", "2,3"], False),
    "not a number": (["1,x", "2,3"], False),
    "empty cell": (["1,", "2,3"], False),
    "no rows": ([], False),
}


@pytest.mark.parametrize("name", sorted(COLUMN_CASES))
def test_two_number_columns_are_float_of_each_cell(name):
    import numpy as np

    lines, expected = COLUMN_CASES[name]
    found = fatigue_details.two_number_columns(lines)
    assert (found is not None) == expected
    if found is not None:
        cells = [line.split(",") for line in lines]
        first = np.array([float(c[0].strip()) for c in cells])
        second = np.array([float(c[1].strip()) for c in cells])
        assert found[0].tobytes() == first.tobytes()
        assert found[1].tobytes() == second.tobytes()

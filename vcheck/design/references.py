"""Files a design refers to: CSV mode lists and shared structure files.

Every referenced path is relative to the project root and must stay inside it; every
problem is located (the CSV's file:line, or the key of the design that names a file).
"""

from __future__ import annotations

import csv
import io
from pathlib import Path

from ..records import Record
from .problems import InputError, InputProblem
from .units import Amount, UnitError, parse_amount

__all__ = ["MAX_MODE_ROWS", "ImportedMode", "read_mode_file", "resolve_inside"]

MAX_MODE_FILE_BYTES = 4 << 20
"""Largest mode file read, 4 MiB."""

MAX_MODE_ROWS = 10_000
"""Most rows read from one mode file: an FE run has tens to hundreds of modes."""

_FREQUENCY = ("frequency", "frequency-hz", "freq", "f")
_DAMPING = ("damping-ratio", "damping", "zeta")
_DESCRIPTION = ("description", "name", "mode")


class ImportedMode(Record):
    """One row of a mode file: a natural frequency [Hz] and what it is."""

    name: str
    frequency: Amount
    damping_ratio: float | None
    file: str
    line: int
    key_path: tuple


def resolve_inside(root: Path, relative: str) -> Path | None:
    """The absolute path of ``relative`` under ``root``, or None if it leaves the root.

    Only for paths that are not read (reading goes through :mod:`vcheck.design.files`).
    """
    candidate = (root / relative).resolve()
    try:
        candidate.relative_to(root.resolve())
    except ValueError:
        return None
    return candidate


def _cut(text: str, limit: int = 40) -> str:
    """A cell as echoed in a message: at most ``limit`` characters."""
    return text if len(text) <= limit else text[:limit - 3] + "..."


def _header_index(header: list[str], names: tuple[str, ...]) -> int | None:
    cleaned = [h.strip().lower().replace(" ", "-").replace("_", "-") for h in header]
    for name in names:
        if name in cleaned:
            return cleaned.index(name)
    return None


def read_mode_file(root: Path, entry, key_path: tuple, where: InputProblem) -> list[ImportedMode]:
    """Read the CSV named by a ``[[mode-file]]`` entry; raises InputError, all at once.

    ``where`` is a problem located at the entry's ``path`` key, used for problems with
    the reference itself (outside the root, missing file).
    """
    from .files import read_inside

    raw, name = read_inside(root, entry.path, what="mode file", limit=MAX_MODE_FILE_BYTES,
                            where=where)
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        raise InputError([InputProblem(name, 1, 1, "", "mode file is not UTF-8 text")]) from None
    try:
        rows = list(csv.reader(io.StringIO(text)))
    except csv.Error as exc:  # a cell over the csv module's limit (128 KiB), a stray NUL
        raise InputError([InputProblem(name, 1, 1, "", f"mode file is not readable CSV: {exc} "
                                       f"(write one row a line: frequency, damping-ratio, "
                                       f"description)")]) from None
    numbered = [(n + 1, row) for n, row in enumerate(rows) if row and not row[0].lstrip().startswith("#")]
    if not numbered:
        raise InputError([InputProblem(name, 1, 1, "", "mode file is empty; expected a header "
                                       "row: frequency, damping-ratio, description")])
    header_line, header = numbered[0]
    column = _header_index(header, _FREQUENCY)
    if column is None:
        raise InputError([InputProblem(
            name, header_line, 1, "", "the header row has no 'frequency' column (expected "
            "columns: frequency, damping-ratio, description)")])
    damping_column = _header_index(header, _DAMPING)
    description_column = _header_index(header, _DESCRIPTION)
    if len(numbered) - 1 > MAX_MODE_ROWS:
        raise InputError([InputProblem(name, 1, 1, "", f"mode file has more than {MAX_MODE_ROWS} "
                                       "rows")])
    problems: list[InputProblem] = []
    modes: list[ImportedMode] = []
    for line, row in numbered[1:]:
        if len(row) <= column or not row[column].strip():
            problems.append(InputProblem(name, line, 1, "", "row has no frequency"))
            continue
        raw = row[column].strip()
        try:
            frequency = parse_amount(f"{raw} {entry.frequency_unit}", "frequency")
        except UnitError:
            problems.append(InputProblem(name, line, 1, "",
                                         f"frequency '{_cut(raw)}' is not a number"))
            continue
        if not frequency.value > 0:
            problems.append(InputProblem(name, line, 1, "",
                                         f"frequency must be greater than zero, got '{raw}'"))
            continue
        damping = None
        if damping_column is not None and len(row) > damping_column and row[damping_column].strip():
            text_value = row[damping_column].strip()
            try:
                damping = float(text_value)
            except ValueError:
                damping = -1.0
            if not 0 <= damping < 1:
                problems.append(InputProblem(name, line, 1, "", f"damping ratio '{_cut(text_value)}' "
                                             "must be a number from 0 to below 1"))
                continue
        label = f"mode {len(modes) + 1}"
        if description_column is not None and len(row) > description_column:
            label = row[description_column].strip() or label
        modes.append(ImportedMode(label, frequency, damping, name, line, key_path))
    if problems:
        raise InputError(problems)
    return modes

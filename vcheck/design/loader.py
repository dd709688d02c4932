"""Reading design files: TOML text -> positioned tables -> validated models.

Every problem of a file is collected and raised at once as an
:class:`~vcheck.design.problems.InputError`, each with file, line, column, key path
and a message that says what is expected.
"""

from __future__ import annotations

import difflib
import re
import sys
from dataclasses import dataclass
from pathlib import Path

from .positions import Position, scan_positions
from .problems import InputError, InputProblem, format_key_path

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover - exercised on Python 3.10 only
    import tomli as tomllib

__all__ = [
    "MAX_FILE_BYTES",
    "TomlDocument",
    "design_from_document",
    "load_design",
    "parse_toml_text",
    "read_toml",
    "validation_problems",
]

MAX_FILE_BYTES = 1 << 20
"""Largest input file read, 1 MiB: a design is a page of text, not a data dump."""

_TOML_ERROR_AT = re.compile(r"\(at line (\d+), column (\d+)\)")


@dataclass(frozen=True)
class TomlDocument:
    """A parsed TOML file with the position of every key path."""

    name: str
    data: dict
    positions: dict[tuple, Position]

    def where(self, path: tuple, *, value: bool = False) -> tuple[int, int]:
        probe = tuple(path)
        while probe:
            found = self.positions.get(probe)
            if found is not None:
                return (found.value_line, found.value_column) if value else (found.line, found.column)
            probe = probe[:-1]
        return 1, 1

    def problem(self, path: tuple, message: str, *, value: bool = False) -> InputProblem:
        line, column = self.where(path, value=value)
        return InputProblem(self.name, line, column, format_key_path(path), message)


def read_toml(path: Path, name: str) -> TomlDocument:
    """Read and parse one TOML file; ``name`` is how messages refer to it."""
    try:
        size = path.stat().st_size
        if size > MAX_FILE_BYTES:
            raise InputError([InputProblem(
                name, 1, 1, "", f"file is {size} bytes; input files are limited to "
                f"{MAX_FILE_BYTES} bytes (1 MiB)")])
        raw = path.read_bytes()
    except OSError as exc:
        raise InputError([InputProblem(name, 1, 1, "", f"cannot read file: {exc.strerror}")]) from None
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = raw[: exc.start].count(b"\n") + 1
        column = exc.start - (raw.rfind(b"\n", 0, exc.start) + 1) + 1
        raise InputError([InputProblem(name, line, column, "", "file is not valid UTF-8 text")]) from None
    return parse_toml_text(text, name)


def load_design(path: Path, name: str):
    """Load and validate one design file into a :class:`~vcheck.design.models.Design`."""
    return design_from_document(read_toml(path, name))


def design_from_document(document: TomlDocument):
    """Validate a parsed TOML document as a design; raises InputError, all at once."""
    from pydantic import ValidationError

    from .models import Design

    try:
        design = Design.model_validate(document.data)
    except ValidationError as exc:
        raise InputError(validation_problems(exc, document, Design)) from None
    design._file = document.name
    design._positions = document.positions
    return design


def parse_toml_text(text: str, name: str) -> TomlDocument:
    """Parse TOML text (already in memory) into a positioned document."""
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError([_syntax_problem(exc, name)]) from None
    return TomlDocument(name=name, data=data, positions=scan_positions(text))


def _syntax_problem(exc, name: str) -> InputProblem:
    message = str(exc)
    found = _TOML_ERROR_AT.search(message)
    line, column = (int(found[1]), int(found[2])) if found else (1, 1)
    message = _TOML_ERROR_AT.sub("", message).strip().rstrip(".")
    return InputProblem(name, line, column, "", f"TOML syntax error: {message}")


def validation_problems(exc, document: TomlDocument, model: type) -> list[InputProblem]:
    """Turn pydantic's errors into located problems with plain messages."""
    problems = []
    for error in exc.errors(include_url=False):
        path = tuple(error["loc"])
        kind = error["type"]
        if kind == "extra_forbidden":
            known = _known_keys(model, path[:-1])
            message = f"unknown key '{path[-1]}'"
            close = difflib.get_close_matches(str(path[-1]), known, n=1, cutoff=0.6)
            if close:
                message += f"; did you mean '{close[0]}'?"
            elif known:
                message += "; known keys here: " + ", ".join(known)
            problems.append(document.problem(path, message))
        elif kind == "missing":
            problems.append(document.problem(
                path[:-1], f"missing key '{path[-1]}'" + _field_hint(model, path)))
        elif kind == "literal_error":
            expected = error.get("ctx", {}).get("expected", "")
            choices = re.findall(r"'([^']*)'", expected)
            given = error.get("input")
            message = f"'{given}' is not one of: {', '.join(choices)}"
            close = difflib.get_close_matches(str(given), choices, n=1, cutoff=0.6)
            if close:
                message += f"; did you mean '{close[0]}'?"
            problems.append(document.problem(path, message, value=True))
        else:
            message = error["msg"]
            if kind not in ("unit", "positive", "speed_range", "excitation", "mounting",
                            "format_version"):
                message = _plain(message, error.get("input"))
            problems.append(document.problem(path, message, value=True))
    return problems


def _plain(message: str, given: object) -> str:
    message = message[0].lower() + message[1:] if message else message
    message = message.replace("input should be", "should be")
    if isinstance(given, (str, int, float, bool)) and not isinstance(given, dict):
        return f"{message}, got {given!r}"
    return message


def _model_at(model: type, path: tuple):
    """The pydantic model class that owns the keys at ``path`` (None if not a model)."""
    import typing

    current = model
    for part in path:
        if isinstance(part, int):
            continue
        fields = {f.alias or n: f for n, f in current.model_fields.items()}
        field = fields.get(part)
        if field is None:
            return None
        current = _model_in(field.annotation, typing)
        if current is None:
            return None
    return current


def _model_in(annotation, typing):
    from pydantic import BaseModel

    if isinstance(annotation, type) and issubclass(annotation, BaseModel):
        return annotation
    for arg in typing.get_args(annotation):
        found = _model_in(arg, typing)
        if found is not None:
            return found
    return None


def _known_keys(model: type, path: tuple) -> list[str]:
    owner = _model_at(model, path)
    if owner is None:
        return []
    return sorted(f.alias or n for n, f in owner.model_fields.items())


def _field_hint(model: type, path: tuple) -> str:
    owner = _model_at(model, path[:-1])
    if owner is None:
        return ""
    for name, field in owner.model_fields.items():
        if (field.alias or name) == path[-1]:
            if field.examples:
                return f", e.g. {path[-1]} = \"{field.examples[0]}\""
            if field.description:
                return f" ({field.description})"
    return ""

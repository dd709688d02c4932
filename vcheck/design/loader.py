"""Reading design files: TOML text -> positioned tables -> validated models.

Every problem of a file is collected and raised at once as an
:class:`~vcheck.design.problems.InputError`, each with file, line, column, key path
and a message that says what is expected.
"""

from __future__ import annotations

import difflib
import re
import sys
from pathlib import Path

from ..records import Record
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
    "load_structure",
    "parse_toml_text",
    "read_toml",
    "validation_problems",
]

MAX_FILE_BYTES = 1 << 20
"""Largest input file read, 1 MiB: a design is a page of text, not a data dump."""

_TOML_ERROR_AT = re.compile(r"\(at line (\d+), column (\d+)\)")


class TomlDocument(Record):
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


def read_toml(path: Path, name: str, root: Path | None = None,
              where: InputProblem | None = None) -> TomlDocument:
    """Read and parse one TOML file; ``name`` is how messages refer to it.

    The file is read through the guarded opener (:mod:`vcheck.design.files`): it must
    be a regular file inside ``root`` (its own folder when no root is given), with every
    symlink resolved, and at most :data:`MAX_FILE_BYTES` long.
    """
    from .files import read_inside

    base = Path(path).absolute().parent if root is None else Path(root)
    raw, _ = read_inside(base, Path(path).absolute(), what="input file", limit=MAX_FILE_BYTES,
                         where=where, label=name)
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = raw[: exc.start].count(b"\n") + 1
        column = exc.start - (raw.rfind(b"\n", 0, exc.start) + 1) + 1
        raise InputError([InputProblem(name, line, column, "", "file is not valid UTF-8 text")]) from None
    return parse_toml_text(text, name)


def load_design(path: Path, name: str, root: Path | None = None,
                structures: dict | None = None):
    """Load and validate one design file into a :class:`~vcheck.design.models.Design`.

    With ``root`` (the project root), the files the design refers to are read too: its
    mode files and its shared structure (cached in ``structures`` across designs).
    """
    design = design_from_document(read_toml(path, name))
    if root is not None:
        attach_references(design, root, {} if structures is None else structures)
    return design


def attach_references(design, root: Path, structures: dict) -> None:
    """Read the mode files and the structure file a design names; InputError if bad."""
    from .files import resolve_checked

    problems: list[InputProblem] = []
    try:
        design._imported_modes = _mode_files(design, root)
    except InputError as exc:
        problems += exc.problems
    if design.fatigue:  # time histories and PSD files of the fatigue details
        from .fatigue_details import read_fatigue_inputs

        try:
            design._fatigue_inputs = read_fatigue_inputs(design, root)
        except InputError as exc:
            problems += exc.problems
    if design.measurement:  # spectrum files of the measurements
        from .measurements import read_spectra

        try:
            design._spectra = read_spectra(design, root)
        except InputError as exc:
            problems += exc.problems
    support = design.support
    if support is not None and support.structure is not None:
        key = ("support", "structure")
        here = _problem_at(design, key, "")
        try:
            target, _ = resolve_checked(root, support.structure, what="structure file",
                                        where=here)
        except InputError as exc:
            problems += exc.problems
        else:
            if target not in structures:
                structures[target] = load_structure(target, root)
            loaded = structures[target]
            if isinstance(loaded, InputError):
                problems += loaded.problems
                problems.append(_replace(here, f"structure file '{support.structure}' has "
                                         "errors; this design is not checked"))
            else:
                design._structure = loaded
    if problems:
        raise InputError(problems)


def _replace(problem: InputProblem, message: str) -> InputProblem:
    from dataclasses import replace

    return replace(problem, message=message)


def _problem_at(model, path: tuple, message: str) -> InputProblem:
    file, line, column = model.locate(path)
    return InputProblem(file, line, column, format_key_path(path), message)


def _mode_files(model, root: Path) -> tuple:
    from .references import read_mode_file

    modes: list = []
    problems: list[InputProblem] = []
    for index, entry in enumerate(model.mode_file):
        key = ("mode-file", index, "path")
        try:
            modes += read_mode_file(root, entry, key, _problem_at(model, key, ""))
        except InputError as exc:
            problems += exc.problems
    if problems:
        raise InputError(problems)
    return tuple(modes)


def load_structure(path: Path, root: Path, document: TomlDocument | None = None):
    """A validated structure file, or the InputError that says what is wrong with it.

    ``document``: the file already read and parsed by :func:`read_toml` (as the check
    reads every file it finds, under the same name), so that it is not parsed twice.
    """
    from pydantic import ValidationError

    from .models import StructureFile

    name = path.relative_to(root.resolve()).as_posix()
    try:
        if document is None:
            document = read_toml(path, name, root)
        try:
            structure = StructureFile.model_validate(document.data)
        except ValidationError as exc:
            raise InputError(validation_problems(exc, document, StructureFile)) from None
        structure._file = name
        structure._positions = document.positions
        structure._imported_modes = _mode_files(structure, root)
    except InputError as exc:
        return exc
    return structure


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
    problems = redundant_input_problems(design, document)
    if problems:
        raise InputError(problems)
    return design


REDUNDANT_AGREEMENT = 0.10
"""How far two inputs that say the same thing may disagree (a fraction, beyond their
stated tolerances) before the design is refused: common practice for catalogue data."""

_GRAVITY = 9.80665  # m/s^2, standard gravity (ISO 80000-3)


def redundant_input_problems(design, document: TomlDocument) -> list[InputProblem]:
    """Inputs given twice must agree: isolator stiffness and rated static deflection.

    With ``stiffness`` of each of ``isolators`` and ``static-deflection`` both given, the
    deflection under the machine and its base, delta = (m + m_base) g / (n k), must match
    the stated one within :data:`REDUNDANT_AGREEMENT` beyond their tolerances; otherwise
    one of them is wrong and no verdict should rest on either silently.
    """
    mounting = design.mounting
    if (mounting is None or mounting.stiffness is None or mounting.static_deflection is None
            or not mounting.isolators or mounting.mount):
        return []
    mass = design.machine.mass.value + (mounting.base_mass.value if mounting.base_mass else 0.0)
    k, stated = mounting.stiffness, mounting.static_deflection
    computed_low = mass * _GRAVITY / (mounting.isolators * k.high)
    computed_high = mass * _GRAVITY / (mounting.isolators * k.low)
    slack = 1.0 + REDUNDANT_AGREEMENT
    if computed_high * slack >= stated.low and computed_low / slack <= stated.high:
        return []
    computed = mass * _GRAVITY / (mounting.isolators * k.value)
    what = "machine and base" if mounting.base_mass else "the machine"
    return [document.problem(("mounting", "static-deflection"), (
        f"'{stated.text}' disagrees with the stiffness: {mounting.isolators} isolators of "
        f"'{k.text}' under {mass:g} kg ({what}) deflect {computed * 1e3:.3g} mm; give one of "
        f"'stiffness' and 'static-deflection', or make them agree within "
        f"{REDUNDANT_AGREEMENT:.0%}"), value=True)]


def parse_toml_text(text: str, name: str) -> TomlDocument:
    """Parse TOML text (already in memory) into a positioned document."""
    try:
        data = tomllib.loads(text)
        positions = scan_positions(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError([_syntax_problem(exc, name)]) from None
    except RecursionError:
        raise InputError([InputProblem(
            name, 1, 1, "", "arrays or tables nest too deeply to be a design file")]) from None
    return TomlDocument(name=name, data=data, positions=positions)


def _syntax_problem(exc, name: str) -> InputProblem:
    message = str(exc)
    found = _TOML_ERROR_AT.search(message)
    line, column = (int(found[1]), int(found[2])) if found else (1, 1)
    message = _TOML_ERROR_AT.sub("", message).strip().rstrip(".")
    return InputProblem(name, line, column, "", f"TOML syntax error: {message}")


MAX_PROBLEMS_PER_FILE = 50
"""Most problems reported for one file; the rest are counted in one more line."""


def validation_problems(exc, document: TomlDocument, model: type) -> list[InputProblem]:
    """Turn pydantic's errors into located problems with plain messages."""
    problems = []
    errors = exc.errors(include_url=False)
    # a list whose items failed is also "too short" once they are dropped: say only
    # what is wrong with the items
    item_parents = {tuple(e["loc"][:n]) for e in errors for n in range(1, len(e["loc"]))
                    if isinstance(e["loc"][n], int)}
    errors = [e for e in errors if not (e["type"] == "too_short"
                                        and tuple(e["loc"]) in item_parents)]
    if len(errors) > MAX_PROBLEMS_PER_FILE:
        problems.append(InputProblem(
            document.name, 1, 1, "", f"{len(errors)} problems in this file; the first "
            f"{MAX_PROBLEMS_PER_FILE} are listed"))
        errors = errors[:MAX_PROBLEMS_PER_FILE]
    for error in errors:
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
            # vcheck's own messages (PydanticCustomError) are written in lower case and
            # say what was given; pydantic's built-in ones start "Input should ..." and
            # get the value appended.
            if message[:1].isupper():
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

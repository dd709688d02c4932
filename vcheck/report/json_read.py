"""Reading a JSON report back into a RunResult: for merging shards and comparing runs.

A report is input like any other: it is read only if it is a regular file under
:data:`MAX_REPORT_BYTES`, and every field is checked for its type as it is read, so a
file of the wrong shape gives one located message (the file and the field's path,
``findings[3].line``) instead of an error deep in a writer.

Reports of version 1 (before ``project`` and ``shard``) and 2 (before ``quantities``)
are still read, for comparing with an old base report; ``vcheck merge`` needs shards
with a project and policy fingerprint (version 2 or later; shards of one run are of one
version anyway, since merge refuses two vcheck versions).
"""

from __future__ import annotations

import json
import math
import stat
from pathlib import Path

from ..design.problems import InputError, InputProblem
from ..findings import Finding, Measure, Quantity, Source, Status, WaiverNote
from ..results import CheckedDesign, RuleInfo, RunResult
from .json_report import REPORT_VERSION

__all__ = ["MAX_REPORT_BYTES", "READABLE_VERSIONS", "read_report", "result_from_data"]

MAX_REPORT_BYTES = 256 * 1024 * 1024
"""Largest JSON report read (a report of 10,000 designs is about 100 MiB)."""

READABLE_VERSIONS = (1, 2, REPORT_VERSION)
"""Report versions this vcheck reads."""


class _Shape(ValueError):
    """A field of the wrong type or value; the message starts with the field's path."""


def _field(data, key: str, where: str):
    if not isinstance(data, dict):
        raise _Shape(f"{where or 'the report'}: expected an object, got {_kind(data)}")
    if key not in data:
        raise _Shape(f"{_join(where, key)}: missing")
    return data[key]


def _join(where: str, key) -> str:
    if isinstance(key, int):
        return f"{where}[{key + 1}]"
    return f"{where}.{key}" if where else key


def _kind(value) -> str:
    return {dict: "an object", list: "an array", str: "a string", bool: "true or false",
            type(None): "null"}.get(type(value), "a number")


def _str(data, key: str, where: str) -> str:
    value = _field(data, key, where)
    if not isinstance(value, str):
        raise _Shape(f"{_join(where, key)}: expected a string, got {_kind(value)}")
    return value


def _int(data, key: str, where: str, low: int = 1) -> int:
    value = _field(data, key, where)
    if isinstance(value, bool) or not isinstance(value, int) or value < low:
        raise _Shape(f"{_join(where, key)}: expected a whole number from {low} up")
    return value


def _bool(data, key: str, where: str) -> bool:
    value = _field(data, key, where)
    if not isinstance(value, bool):
        raise _Shape(f"{_join(where, key)}: expected true or false, got {_kind(value)}")
    return value


def _number(data, key: str, where: str, *, optional: bool = False):
    value = _field(data, key, where)
    if value is None and optional:
        return None
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise _Shape(f"{_join(where, key)}: expected a finite number, got {_kind(value)}")
    return float(value)


def _list(data, key: str, where: str) -> list:
    value = _field(data, key, where)
    if not isinstance(value, list):
        raise _Shape(f"{_join(where, key)}: expected an array, got {_kind(value)}")
    return value


def _strings(data, key: str, where: str) -> tuple[str, ...]:
    items = _list(data, key, where)
    for n, item in enumerate(items):
        if not isinstance(item, str):
            raise _Shape(f"{_join(_join(where, key), n)}: expected a string, got {_kind(item)}")
    return tuple(items)


def _status(data, key: str, where: str) -> Status:
    value = _str(data, key, where)
    try:
        return Status(value)
    except ValueError:
        known = ", ".join(s.value for s in Status)
        raise _Shape(f"{_join(where, key)}: unknown status {value[:40]!r}; known: {known}") from None


def _measure(data, key: str, where: str):
    value = _field(data, key, where)
    if value is None:
        return None
    here = _join(where, key)
    return Measure(_str(value, "name", here), _number(value, "value", here), _str(value, "unit", here))


def _sources(data, key: str, where: str) -> tuple[Source, ...]:
    here = _join(where, key)
    return tuple(Source(_str(s, "citation", _join(here, n)), _str(s, "basis", _join(here, n)))
                 for n, s in enumerate(_list(data, key, where)))


def _quantity_value(value, here: str):
    if value is None:
        return None
    if isinstance(value, list):
        return tuple(_quantity_value(item, _join(here, n)) if not isinstance(item, list)
                     else _bad_value(_join(here, n)) for n, item in enumerate(value))
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise _Shape(f"{here}: expected a finite number, null or an array of them, got "
                     f"{_kind(value)}")
    return float(value)


def _bad_value(here: str):
    raise _Shape(f"{here}: expected a finite number or null, got an array")


def _quantities(data, where: str) -> tuple[Quantity, ...]:
    if not isinstance(data, dict) or "quantities" not in data:
        return ()  # a report of version 1 or 2
    out = []
    for n, item in enumerate(_list(data, "quantities", where)):
        here = _join(_join(where, "quantities"), n)
        context = _field(item, "context", here)
        if not isinstance(context, dict) or not all(isinstance(v, str) for v in context.values()):
            raise _Shape(f"{_join(here, 'context')}: expected an object of strings")
        out.append(Quantity(_str(item, "name", here),
                            _quantity_value(_field(item, "value", here), _join(here, "value")),
                            _str(item, "unit", here), tuple(sorted(context.items()))))
    return tuple(out)


def _table(data, where: str) -> tuple:
    rows = _list(data, "table", where)
    out = []
    for n, row in enumerate(rows):
        if not isinstance(row, list) or not all(isinstance(cell, str) for cell in row):
            raise _Shape(f"{_join(_join(where, 'table'), n)}: expected an array of strings")
        out.append(tuple(row))
    return tuple(out)


def _finding(data, where: str) -> Finding:
    waiver = _field(data, "waiver", where) if isinstance(data, dict) and "waiver" in data else None
    note = None
    if waiver is not None:
        here = _join(where, "waiver")
        note = WaiverNote(_str(waiver, "reason", here), _str(waiver, "approved-by", here),
                          _str(waiver, "expires", here), _status(waiver, "original-status", here))
    title = data.get("table-title", "") if isinstance(data, dict) else ""
    if not isinstance(title, str):
        raise _Shape(f"{_join(where, 'table-title')}: expected a string, got {_kind(title)}")
    return Finding(
        rule_id=_str(data, "rule", where), status=_status(data, "status", where),
        message=_str(data, "message", where), file=_str(data, "file", where),
        line=_int(data, "line", where), column=_int(data, "column", where),
        target=_str(data, "target", where), key_path=_str(data, "key-path", where),
        measured=_measure(data, "measured", where), limit=_measure(data, "limit", where),
        margin=_number(data, "margin", where, optional=True),
        assumptions=_strings(data, "assumptions", where), advice=_strings(data, "advice", where),
        sources=_sources(data, "sources", where), table=_table(data, where), table_title=title,
        policy=_str(data, "policy", where), waiver=note,
        quantities=_quantities(data, where),
        fingerprint=_str(data, "fingerprint", where),
    )


def _shard(data) -> tuple[int, int] | None:
    value = data.get("shard")
    if value is None:
        return None
    index, count = _int(value, "index", "shard"), _int(value, "count", "shard")
    if index > count:
        raise _Shape(f"shard: index {index} is more than the count {count}")
    return index, count


def result_from_data(data) -> RunResult:
    """A RunResult from the data of a JSON report of a version this vcheck reads.

    Raises ValueError naming the field (``findings[3].line: missing``) when the data is
    not such a report.
    """
    if not isinstance(data, dict) or data.get("report") != "vcheck":
        raise _Shape("not a vcheck JSON report (no \"report\": \"vcheck\" at the top); write "
                     "one with `vcheck check --format json`")
    version = data.get("report-version")
    if isinstance(version, bool) or version not in READABLE_VERSIONS:
        raise _Shape(f"a vcheck JSON report of version {str(version)[:20]}; this vcheck reads "
                     f"versions {', '.join(map(str, READABLE_VERSIONS))}")
    try:
        return _result(data, version)
    except _Shape as exc:
        raise _Shape(f"not a vcheck JSON report of version {version}: {exc}") from None


def _result(data: dict, version: int) -> RunResult:
    project, fingerprint, shard = "", "", None
    if version >= 2:
        project = _str(_field(data, "project", ""), "name", "project")
        fingerprint = _str(data["project"], "policy-fingerprint", "project")
        shard = _shard(data)
    result = _field(data, "result", "")
    gate = result.get("gate", "all") if isinstance(result, dict) else "all"
    if gate not in ("all", "new"):
        raise _Shape("result.gate: expected \"all\" or \"new\"")
    return RunResult(
        version=_str(_field(data, "tool", ""), "version", "tool"),
        policy=_str(data, "policy", ""),
        designs=[CheckedDesign(_str(d, "file", _join("designs", n)), _str(d, "tag", _join("designs", n)),
                               _str(d, "kind", _join("designs", n)))
                 for n, d in enumerate(_list(data, "designs", ""))],
        findings=[_finding(f, _join("findings", n))
                  for n, f in enumerate(_list(data, "findings", ""))],
        problems=[InputProblem(_str(p, "file", w), _int(p, "line", w), _int(p, "column", w),
                               _str(p, "key-path", w), _str(p, "message", w))
                  for n, p in enumerate(_list(data, "input-problems", ""))
                  for w in (_join("input-problems", n),)],
        rules=[RuleInfo(_str(r, "id", w), _str(r, "title", w), _str(r, "origin", w),
                        _sources(r, "sources", w))
               for n, r in enumerate(_list(data, "rules", "")) for w in (_join("rules", n),)],
        fail_on_warn=_bool(result, "fail-on-warn", "result"),
        gate=gate,
        project=project,
        policy_fingerprint=fingerprint,
        shard=shard,
        notes=[note for note in (data.get("notes") or []) if isinstance(note, str)],
    )


def _read_bytes(path: Path) -> bytes:
    """The file's bytes: a regular file only, at most MAX_REPORT_BYTES."""
    info = path.stat()
    if not stat.S_ISREG(info.st_mode):
        raise _Shape("cannot read report: not a regular file (a folder, device or FIFO); "
                     "name a JSON report file")
    if info.st_size > MAX_REPORT_BYTES:
        raise _Shape(f"cannot read report: larger than {MAX_REPORT_BYTES // (1024 * 1024)} MiB")
    with open(path, "rb") as stream:
        data = stream.read(MAX_REPORT_BYTES + 1)
    if len(data) > MAX_REPORT_BYTES:
        raise _Shape(f"cannot read report: larger than {MAX_REPORT_BYTES // (1024 * 1024)} MiB")
    return data


def read_report(path: Path, name: str | None = None) -> RunResult:
    """Read a JSON report file; raises InputError naming the file when it is not one."""
    name = name or str(path)
    try:
        data = json.loads(_read_bytes(path).decode("utf-8"))
        return result_from_data(data)
    except FileNotFoundError:
        message = "report file not found"
    except _Shape as exc:
        message = str(exc)
    except json.JSONDecodeError as exc:
        raise InputError([InputProblem(name, max(1, exc.lineno), max(1, exc.colno), "",
                                       f"not JSON: {exc.msg}")]) from None
    except UnicodeDecodeError as exc:
        message = f"not UTF-8 text (byte {exc.start + 1}); a JSON report is UTF-8"
    except OSError as exc:
        message = f"cannot read report: {exc.strerror or exc}"
    except RecursionError:
        message = "not a vcheck JSON report: it nests too deeply"
    except ValueError as exc:  # e.g. a number too long for int()
        message = f"not a vcheck JSON report (version {REPORT_VERSION}): {exc}"
    raise InputError([InputProblem(name, 1, 1, "", message)])

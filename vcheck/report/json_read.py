"""Reading a JSON report back into a RunResult: for merging shards and comparing runs."""

from __future__ import annotations

import json
from pathlib import Path

from ..design.problems import InputError, InputProblem
from ..findings import Finding, Measure, Source, Status, WaiverNote
from ..results import CheckedDesign, RuleInfo, RunResult
from .json_report import REPORT_VERSION

__all__ = ["read_report", "result_from_data"]


def _measure(data):
    return None if data is None else Measure(data["name"], data["value"], data["unit"])


def _finding(data: dict) -> Finding:
    waiver = data.get("waiver")
    return Finding(
        rule_id=data["rule"], status=Status(data["status"]), message=data["message"],
        file=data["file"], line=data["line"], column=data["column"], target=data["target"],
        key_path=data["key-path"], measured=_measure(data["measured"]),
        limit=_measure(data["limit"]), margin=data["margin"],
        assumptions=tuple(data["assumptions"]), advice=tuple(data["advice"]),
        sources=tuple(Source(s["citation"], s["basis"]) for s in data["sources"]),
        table=tuple(tuple(row) for row in data["table"]),
        table_title=data.get("table-title", ""), policy=data["policy"],
        waiver=None if waiver is None else WaiverNote(
            waiver["reason"], waiver["approved-by"], waiver["expires"],
            Status(waiver["original-status"])),
        fingerprint=data["fingerprint"],
    )


def result_from_data(data: dict) -> RunResult:
    """A RunResult from the data of a JSON report of this report version."""
    if data.get("report") != "vcheck" or data.get("report-version") != REPORT_VERSION:
        raise ValueError(f"not a vcheck report of version {REPORT_VERSION}")
    return RunResult(
        version=data["tool"]["version"],
        policy=data["policy"],
        designs=[CheckedDesign(d["file"], d["tag"], d["kind"]) for d in data["designs"]],
        findings=[_finding(f) for f in data["findings"]],
        problems=[InputProblem(p["file"], p["line"], p["column"], p["key-path"], p["message"])
                  for p in data["input-problems"]],
        rules=[RuleInfo(r["id"], r["title"], r["origin"],
                        tuple(Source(s["citation"], s["basis"]) for s in r["sources"]))
               for r in data["rules"]],
        fail_on_warn=data["result"]["fail-on-warn"],
        gate=data["result"].get("gate", "all"),
        notes=list(data.get("notes", [])),
    )


def read_report(path: Path, name: str | None = None) -> RunResult:
    """Read a JSON report file; raises InputError naming the file when it is not one."""
    name = name or str(path)
    try:
        data = json.loads(path.read_text(encoding="utf-8"))
        return result_from_data(data)
    except FileNotFoundError:
        message = "report file not found"
    except (OSError, UnicodeDecodeError) as exc:
        message = f"cannot read report: {exc}"
    except json.JSONDecodeError as exc:
        raise InputError([InputProblem(name, exc.lineno, exc.colno, "",
                                       f"not JSON: {exc.msg}")]) from None
    except (KeyError, TypeError, ValueError) as exc:
        message = f"not a vcheck JSON report (version {REPORT_VERSION}): {exc}"
    except RecursionError:
        message = "not a vcheck JSON report: it nests too deeply"
    raise InputError([InputProblem(name, 1, 1, "", message)])

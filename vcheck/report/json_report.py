"""The JSON report: every field of every finding, versioned, with a JSON Schema.

The schema is ``report.schema.json`` beside this module, installed with the package
(``importlib.resources.files("vcheck.report") / "report.schema.json"``). ``report-version`` changes
when a field is added, removed or changes meaning, and the schema with it:

1. the first version;
2. added ``project`` (the root folder's name and the policy's fingerprint) and ``shard``,
   which ``vcheck merge`` checks before pooling shards; ``notes`` (warnings about the
   run itself) and the comparison's ``failed``;
3. added ``quantities`` to every finding: the numbers the rule computed, each a name (from
   ``docs/glossary.md``), a value at full precision (a number, an array of numbers, or
   null where not finite), an SI unit and a context (the mode, band, mount, bolt or bin
   it belongs to). The text report rounds; these never do. Empty for a rule that gives
   none (a plugin written before version 3).

Text that came from design files is written whole here (JSON escapes every control
character), but bounded: strings longer than :data:`vcheck.report.common.ECHO_LIMIT`
characters are cut with a marker, as in every other format.
"""

from __future__ import annotations

from ..findings import Finding, Measure, Quantity
from ..results import CAUTION, RunResult
from .common import bounded, json_indented, json_safe

__all__ = ["REPORT_VERSION", "render_json", "report_data"]

REPORT_VERSION = 3


def _measure(measure: Measure | None):
    if measure is None:
        return None
    return {"name": measure.name, "value": measure.value, "unit": measure.unit}


def _quantity(item: Quantity) -> dict:
    value = list(item.value) if isinstance(item.value, tuple) else item.value
    return {"name": item.name, "value": value, "unit": item.unit,
            "context": dict(item.context)}


def _finding(finding: Finding) -> dict:
    return {
        "rule": finding.rule_id,
        "status": finding.status.value,
        "target": finding.target,
        "file": finding.file,
        "line": finding.line,
        "column": finding.column,
        "key-path": finding.key_path,
        "message": bounded(finding.message),
        "measured": _measure(finding.measured),
        "limit": _measure(finding.limit),
        "margin": finding.margin,
        "assumptions": [bounded(item) for item in finding.assumptions],
        "advice": [bounded(item) for item in finding.advice],
        "sources": [{"citation": s.citation, "basis": s.basis} for s in finding.sources],
        "table": [[bounded(cell) for cell in row] for row in finding.table],
        "table-title": finding.table_title,
        "policy": finding.policy,
        "waiver": None if finding.waiver is None else {
            "reason": bounded(finding.waiver.reason),
            "approved-by": finding.waiver.approved_by,
            "expires": finding.waiver.expires,
            "original-status": finding.waiver.original_status.value,
        },
        "quantities": [_quantity(item) for item in finding.quantities],
        "fingerprint": finding.fingerprint,
    }


def report_data(result: RunResult) -> dict:
    """The report as plain data, in the order it is written."""
    return {
        "report": "vcheck",
        "report-version": REPORT_VERSION,
        "tool": {"name": "vcheck", "version": result.version},
        "project": {"name": result.project, "policy-fingerprint": result.policy_fingerprint},
        "policy": result.policy,
        "shard": None if result.shard is None else {"index": result.shard[0],
                                                     "count": result.shard[1]},
        "result": {
            "verdict": result.verdict,
            "exit-status": int(result.exit_status),
            "fail-on-warn": result.fail_on_warn,
            "gate": result.gate,
            "counts": result.counts(),
        },
        "rules": [
            {"id": r.id, "title": r.title, "origin": r.origin,
             "sources": [{"citation": s.citation, "basis": s.basis} for s in r.sources]}
            for r in result.rules
        ],
        "designs": [{"file": d.file, "tag": d.tag, "kind": d.kind} for d in result.designs],
        "input-problems": [
            {"file": p.file, "line": p.line, "column": p.column, "key-path": p.key,
             "message": bounded(p.message)}
            for p in result.problems
        ],
        "findings": [_finding(f) for f in result.findings],
        "comparison": _comparison(result.comparison),
        "notes": list(result.notes),
        "caution": CAUTION,
    }


def _comparison(comparison):
    if comparison is None:
        return None

    def ref(finding):
        return {"rule": finding.rule_id, "target": finding.target, "file": finding.file,
                "key-path": finding.key_path, "status": finding.status.value,
                "fingerprint": finding.fingerprint}

    def moved(change):
        return {**ref(change.current), "margin": change.current.margin,
                "base-margin": change.base_margin, "change": change.change,
                "unit": change.current.measured.unit if change.current.measured else ""}

    return {
        "base": comparison.base,
        "failed": comparison.error,
        "new-failures": [ref(f) for f in comparison.new_failures],
        "new-warnings": [ref(f) for f in comparison.new_warnings],
        "fixed": [ref(f) for f in comparison.fixed],
        "worse": [moved(c) for c in comparison.worse],
        "better": [moved(c) for c in comparison.better],
    }


def render_json(result: RunResult) -> str:
    # every string cut to the echo limit (the fields above are cut already; this catches
    # the rest: a table title, a target, a file name)
    return json_safe(json_indented(report_data(result), bound_strings=True)) + "\n"

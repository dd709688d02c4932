"""SARIF 2.1.0: findings for code review, shown on the TOML line they concern.

One run, tool ``vcheck``. Each rule of the run is a rule descriptor (id, name, short
description = the rule's title, full description, help text and Markdown with the
sources of its limits and their basis); input problems have a descriptor of their own,
``input-error``, so a design file that could not be read shows on the offending line.

Results: every finding that did not pass, and every input problem.

========================  =========  ===============================================
vcheck                    level      notes
========================  =========  ===============================================
input problem             error      rule ``input-error``
fail                      error
error (rule could not     error      the rule's own id
run)
warn                      warning
not-checked               note       the rule has nothing to judge in the design;
                                     left out unless ``show_not_checked``
                                     (``--show-not-checked``), counted in
                                     ``run.properties``
waived                    note       with a ``suppressions`` entry, kind "external",
                                     status "accepted", the reason as justification
                                     (GitHub code scanning does not act on
                                     suppressions by itself and may list the result
                                     as an open alert)
pass                      (none)     a code-review service shows every result as an
                                     alert, so passing findings are left out
========================  =========  ===============================================

Locations: ``artifactLocation.uri`` is the design file's path relative to the
repository root with ``uriBaseId`` ``%SRCROOT%``. vcheck knows paths relative to the
project root (the folder of ``vcheck.toml``) only, and takes the project root as the
repository root unless ``uri_prefix`` (the project root's path inside the repository)
is given. Columns count Unicode code points (``columnKind``).

Comparison: when the run was compared with a base, each result carries
``baselineState`` (``new``, ``unchanged`` or ``updated``), each finding the base had and
this run fixed is a result of kind ``pass`` with ``baselineState`` ``absent``, and
``run.properties.comparison`` names the base and the gate.

Tracking: ``partialFingerprints["vcheckFingerprint/v1"]`` is the finding's fingerprint
(rule, file, target, key path), stable when lines move (a second finding with the same
fingerprint gets ``-2`` appended, and so on); ``primaryLocationLineHash`` is
left to the upload step. Each result's ``properties`` carry status, target, key path,
measured value, limit, margin, policy, assumptions and advice.

At most :data:`MAX_RESULTS` results are written (the limit of a run that GitHub code
scanning accepts), most severe first; when there are more, ``run.properties`` says how
many were left out.
"""

from __future__ import annotations

from ..findings import STATUS_ORDER, Finding, Measure, Status
from ..results import CAUTION, RunResult
from .common import (
    INPUT_RULE_ID,
    bounded,
    escape_markdown,
    finding_details,
    gate_sentences,
    json_indented,
    json_safe,
    number_or_none,
    problem_fingerprint,
    repository_uri,
    unique_fingerprints,
    waiver_reason,
)

__all__ = ["FINGERPRINT_KEY", "INFORMATION_URI", "MAX_RESULTS", "RULES_HELP_URI", "SARIF_SCHEMA", "render_sarif", "sarif_log"]

SARIF_SCHEMA = (
    "https://raw.githubusercontent.com/oasis-tcs/sarif-spec/master/Schemata/"
    "sarif-schema-2.1.0.json"
)
"""The ``$id`` of the OASIS SARIF 2.1.0 JSON schema, written as the log's ``$schema``."""

INFORMATION_URI = "https://pypi.org/project/vcheck-vibration/"
"""The tool's ``informationUri``: the package index page, whose text is the README."""

RULES_HELP_URI = INFORMATION_URI + "#what-it-checks-today"
"""``helpUri`` of the built-in rules: the README's table of rules."""

FINGERPRINT_KEY = "vcheckFingerprint/v1"
"""Key of vcheck's own fingerprint in ``partialFingerprints``."""

MAX_RESULTS = 25_000
"""Results written at most in one run: GitHub code scanning's limit per run."""

_LEVEL = {
    Status.FAIL: "error",
    Status.ERROR: "error",
    Status.WARN: "warning",
    Status.NOT_CHECKED: "note",
    Status.WAIVED: "note",
}

_INPUT_RULE_TEXT = (
    "A design file, or a value in it, could not be read. Nothing in that file was "
    "checked, so no rule passed it: correct the file at the line shown."
)


def _pascal(slug: str) -> str:
    return "".join(part[:1].upper() + part[1:] for part in slug.split("-"))


def _descriptor(rule_id: str, title: str, origin: str, sources) -> dict:
    full = f"{title}. Rule '{rule_id}' ({origin})."
    text_lines = [f"{title}.", "", f"Origin: {origin}."]
    md_lines = [f"**{escape_markdown(title)}**", "", f"Origin: {escape_markdown(origin)}."]
    if sources:
        text_lines += ["", "Sources of the limits:"]
        md_lines += ["", "Sources of the limits:", ""]
        for source in sources:
            text_lines.append(f"- {source.citation} ({source.basis})")
            md_lines.append(f"- {escape_markdown(source.citation)} "
                            f"*({escape_markdown(source.basis)})*")
    text_lines += ["", CAUTION]
    md_lines += ["", "> " + escape_markdown(CAUTION)]
    descriptor = {
        "id": rule_id,
        "name": _pascal(rule_id),
        "shortDescription": {"text": title},
        "fullDescription": {"text": full},
        "help": {"text": "\n".join(text_lines), "markdown": "\n".join(md_lines)},
        "properties": {
            "origin": origin,
            "sources": [{"citation": s.citation, "basis": s.basis} for s in sources],
            "tags": ["vibration", "vcheck"],
        },
    }
    if origin == "built-in":
        descriptor["helpUri"] = RULES_HELP_URI
    return descriptor


def _location(file: str, line: int, column: int, uri_prefix: str) -> dict:
    uri, relative = repository_uri(file, uri_prefix)
    artifact = {"uri": uri, "uriBaseId": "%SRCROOT%"} if relative else {"uri": uri}
    return {
        "physicalLocation": {
            "artifactLocation": artifact,
            "region": {"startLine": max(1, int(line)), "startColumn": max(1, int(column))},
        }
    }


def _measure(measure: Measure | None):
    if measure is None:
        return None
    return {"name": measure.name, "value": number_or_none(measure.value), "unit": measure.unit}


def _result(finding: Finding, fingerprint: str, index: dict[str, int], uri_prefix: str,
            comparison=None) -> dict:
    entry = {
        "ruleId": finding.rule_id,
        "ruleIndex": index[finding.rule_id],
        "level": _LEVEL[finding.status],
        "message": {"text": f"{finding.target}: {finding_details(finding)}"},
        "locations": [_location(finding.file, finding.line, finding.column, uri_prefix)],
        "partialFingerprints": {FINGERPRINT_KEY: fingerprint},
    }
    if comparison is not None and not comparison.error:
        from ..compare import baseline_state

        entry["baselineState"] = baseline_state(comparison, finding)
    if finding.status is Status.WAIVED:
        entry["suppressions"] = [{"kind": "external", "status": "accepted",
                                  "justification": waiver_reason(finding)}]
    entry["properties"] = {
        "status": finding.status.value,
        "target": finding.target,
        "keyPath": finding.key_path,
        "measured": _measure(finding.measured),
        "limit": _measure(finding.limit),
        "margin": number_or_none(finding.margin),
        "policy": finding.policy,
        "assumptions": [bounded(item) for item in finding.assumptions],
        "advice": [bounded(item) for item in finding.advice],
    }
    return entry


def _problem_result(problem, fingerprint: str, index: dict[str, int], uri_prefix: str) -> dict:
    return {
        "ruleId": INPUT_RULE_ID,
        "ruleIndex": index[INPUT_RULE_ID],
        "level": "error",
        "message": {"text": bounded(problem.render())},
        "locations": [_location(problem.file, problem.line, problem.column, uri_prefix)],
        "partialFingerprints": {FINGERPRINT_KEY: fingerprint},
        "properties": {"status": "input-error", "keyPath": problem.key},
    }


def sarif_log(result: RunResult, uri_prefix: str = "", show_not_checked: bool = False) -> dict:
    """The SARIF log of a run as plain data, in the order it is written."""
    rules = []
    index: dict[str, int] = {}
    for info in result.rules:
        if info.id not in index:
            index[info.id] = len(rules)
            rules.append(_descriptor(info.id, info.title, info.origin, info.sources))
    for finding in result.findings:  # a finding of a rule the run does not list
        if finding.rule_id not in index and finding.status is not Status.PASS:
            index[finding.rule_id] = len(rules)
            rules.append(_descriptor(finding.rule_id, finding.rule_id, "unknown", ()))
    index[INPUT_RULE_ID] = len(rules)
    input_rule = _descriptor(INPUT_RULE_ID, "Design file could not be read", "vcheck", ())
    input_rule["fullDescription"] = {"text": _INPUT_RULE_TEXT}
    input_rule["help"] = {"text": _INPUT_RULE_TEXT,
                          "markdown": escape_markdown(_INPUT_RULE_TEXT)}
    rules.append(input_rule)

    rank = {status: n for n, status in enumerate(STATUS_ORDER)}
    left_out = () if show_not_checked else (Status.NOT_CHECKED,)
    reported = sorted((f for f in result.findings
                       if f.status is not Status.PASS and f.status not in left_out),
                      key=lambda f: (rank[f.status], f.sort_key))
    fingerprints = unique_fingerprints([problem_fingerprint(p) for p in result.problems]
                                       + [f.fingerprint for f in reported])
    results = [_problem_result(p, fp, index, uri_prefix)
               for p, fp in zip(result.problems, fingerprints)]
    comparison = result.comparison
    results += [_result(f, fp, index, uri_prefix, comparison)
                for f, fp in zip(reported, fingerprints[len(result.problems):])]
    if comparison is not None and not comparison.error:
        for old in comparison.fixed:  # in the base, not among this run's results
            if old.rule_id not in index:
                index[old.rule_id] = len(rules)
                rules.append(_descriptor(old.rule_id, old.rule_id, "unknown", ()))
            entry = _result(old, old.fingerprint, index, uri_prefix)
            entry.update(kind="pass", level="none", baselineState="absent")
            entry["message"] = {"text": f"{old.target}: fixed since the base "
                                        f"({old.status.value} there): {old.message}"}
            results.append(entry)
    properties = {
        "verdict": result.verdict,
        "exitStatus": int(result.exit_status),
        "failOnWarn": result.fail_on_warn,
        "policy": result.policy,
        "counts": result.counts(),
        "inputProblems": len(result.problems),
        "designs": len(result.designs),
        "caution": CAUTION,
    }
    if comparison is not None:
        properties["comparison"] = {"base": comparison.base, "gate": result.gate,
                                    "failed": comparison.error,
                                    "summary": " ".join(gate_sentences(result))}
    if len(results) > MAX_RESULTS:
        properties["truncated"] = {
            "results": len(results),
            "written": MAX_RESULTS,
            "note": f"{len(results) - MAX_RESULTS} of {len(results)} results (the least "
                    f"severe) are left out: a run holds at most {MAX_RESULTS}; the JSON "
                    "report has them all",
        }
        results = results[:MAX_RESULTS]
    run = {
        "tool": {"driver": {
            "name": "vcheck",
            "version": result.version,
            "informationUri": INFORMATION_URI,
            "rules": rules,
        }},
        "invocations": [{
            "executionSuccessful": int(result.exit_status) in (0, 1),
            "exitCode": int(result.exit_status),
            **({"toolExecutionNotifications": [
                {"level": "warning", "message": {"text": note}} for note in result.notes]}
               if result.notes else {}),
        }],
        "originalUriBaseIds": {"%SRCROOT%": {"description": {
            "text": "The repository root. Design files are given relative to it: their path "
                    "relative to the project root, after the prefix the run was given."}}},
        "columnKind": "unicodeCodePoints",
        "results": results,
        "properties": properties,
    }
    return {"$schema": SARIF_SCHEMA, "version": "2.1.0", "runs": [run]}


def render_sarif(result: RunResult, uri_prefix: str = "", show_not_checked: bool = False) -> str:
    """The SARIF 2.1.0 log of a run; ``uri_prefix`` is the project root in the repository."""
    return json_safe(json_indented(sarif_log(result, uri_prefix, show_not_checked))) + "\n"

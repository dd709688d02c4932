"""JUnit XML: findings as test cases, for the test dashboards of CI services.

Layout: ``<testsuites name="vcheck">`` holds one ``<testsuite>`` per rule, named by the
rule id, and, when some design file could not be read, a testsuite ``input``. A suite
per rule rather than per design file, because the dashboards group by the case's
``classname`` and split it at dots into package and class (Jenkins does; from memory):
a rule id has no dots, a file name always has one (``.toml``). The classname is
``vcheck.<rule-id>``; the design file stands in the case's ``file`` attribute (GitLab's
test report shows it; from memory) and its line in ``line``.

One ``<testcase>`` per finding, named ``<rule-id> <target> <key path>``. A name that
would occur twice in a suite (two files with the same machine tag) gets the file added
in brackets, and, should that still repeat, a running number: dashboards track a case's
history by its name, so names stay as they are unless they collide.

===============  ==============================================================
finding          test case
===============  ==============================================================
pass             passes
warn             passes; the warning and its numbers in ``<system-out>`` (JUnit
                 has no warning state)
waived           passes; ``WAIVED`` and the reason in ``<system-out>``
fail             ``<failure message=... type="fail">`` with the details
error            ``<error message=... type="rule-error">``: the rule could not run
not-checked      ``<skipped message=...>``: the design lacks what the rule needs
input problem    a case of suite ``input`` with ``<error type="input-error">``
===============  ==============================================================

Counts (tests, failures, errors, skipped) stand on every suite and on the root. Every
suite carries ``<properties>``: version, policy, verdict, exit status and caution, and
for a compared run the gate, the base and the counts of new failures, new warnings and
fixed findings (a dashboard shows a suite's properties; the root has none in the
common schemas).

Schema choice: ``file`` and ``line`` on ``<testcase>`` and ``skipped`` on
``<testsuites>`` are outside the strict Jenkins/ant JUnit XSD but are read by GitLab's
test report and by junitparser; they are kept because they put a failing case on its
design line. A consumer that validates against the strict XSD should drop them (and
``skipped`` on the root) first; without them the report is valid against it (a test
holds this with the strict XSD from pytest's source distribution).
``time="0"`` throughout, so that the same input gives the same bytes. Characters XML
1.0 cannot hold (control characters other than tab and line breaks, lone surrogates,
U+FFFE and U+FFFF) are dropped from every text; the rest is escaped by ElementTree.
Line breaks in element text are written as LF, which is how an XML parser reads them.
"""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET

from ..findings import Finding, Status
from ..results import CAUTION, RunResult
from .common import (
    bounded,
    finding_details,
    gate_sentences,
    repository_path,
    waiver_reason,
    xml_safe,
)

__all__ = ["INPUT_SUITE", "render_junit", "xml_text"]

INPUT_SUITE = "input"
"""Name of the testsuite holding the input problems."""

_NOT_XML = re.compile("[^\t\n\r\x20-\ud7ff\ue000-\ufffd\U00010000-\U0010ffff]")


def xml_text(text: str) -> str:
    """``text`` without the characters XML 1.0 cannot hold."""
    return _NOT_XML.sub("", text)


def _body(text: str) -> str:
    """Element text: as :func:`xml_text`, line breaks as LF (a parser reads CR as LF)."""
    return xml_text(text).replace("\r\n", "\n").replace("\r", "\n")


def _element(parent, tag: str, **attributes) -> ET.Element:
    element = ET.SubElement(parent, tag)
    for name, value in attributes.items():
        element.set(name.rstrip("_"), xml_text(str(value)))
    return element


class _Names:
    """Unique test-case names within a suite, decided before any is written.

    A name shared by cases of different files gets the file in brackets; a name still
    shared (the same place twice) gets a running number from the second case on.
    """

    def __init__(self, entries: list[tuple[str, str]]) -> None:
        files: dict[str, set[str]] = {}
        for base, file in entries:
            files.setdefault(base, set()).add(file)
        seen: dict[str, int] = {}
        self.names = []
        for base, file in entries:
            name = base if len(files[base]) == 1 else f"{base} [{file}]"
            seen[name] = seen.get(name, 0) + 1
            if seen[name] > 1:
                name = f"{name} #{seen[name]}"
            self.names.append(name)


def _case_name(finding: Finding) -> str:
    return " ".join(part for part in (finding.rule_id, finding.target, finding.key_path)
                    if part)


def _counts(cases: list[str]) -> dict[str, str]:
    return {
        "tests": str(len(cases)),
        "failures": str(cases.count("failure")),
        "errors": str(cases.count("error")),
        "skipped": str(cases.count("skipped")),
    }


def _suite_attributes(element: ET.Element, name: str, outcomes: list[str]) -> None:
    element.set("name", xml_text(name))
    for key, value in _counts(outcomes).items():
        element.set(key, value)
    element.set("time", "0")


def _finding_case(suite: ET.Element, finding: Finding, name: str, uri_prefix: str) -> str:
    path = repository_path(finding.file, uri_prefix)
    case = _element(suite, "testcase", name=name, classname=f"vcheck.{finding.rule_id}",
                    file=path, line=finding.line, time="0")
    where = f"{path}:{finding.line}:{finding.column}"
    details = f"{finding.target} ({where}): {finding_details(finding)}"
    extra = "".join(f"\nassumes: {bounded(item)}" for item in finding.assumptions)
    status = finding.status
    if status is Status.FAIL:
        failure = _element(case, "failure", message=bounded(finding.message), type_="fail")
        failure.text = _body(details + extra)
        return "failure"
    if status is Status.ERROR:
        error = _element(case, "error", message=bounded(finding.message), type_="rule-error")
        error.text = _body(details + extra)
        return "error"
    if status is Status.NOT_CHECKED:
        _element(case, "skipped", message=f"not checked: {bounded(finding.message)}")
        return "skipped"
    out = ET.SubElement(case, "system-out")
    if status is Status.WARN:
        out.text = _body(f"WARN {details}{extra}")
    elif status is Status.WAIVED:
        out.text = _body(f"WAIVED {finding.target} ({where}): {waiver_reason(finding)}")
    else:
        out.text = _body(f"PASS {finding.target} ({where}): "
                            f"{finding_details(finding, sources=False, advice=False)}")
    return "passed"


def render_junit(result: RunResult, uri_prefix: str = "") -> str:
    """The JUnit XML report of a run; ``uri_prefix`` is the project root in the repository."""
    root = ET.Element("testsuites")
    all_outcomes: list[str] = []

    if result.problems:
        suite = ET.SubElement(root, "testsuite")
        names = _Names([(f"{p.file}:{p.line}:{p.column}" + (f" {p.key}" if p.key else ""),
                         p.file) for p in result.problems]).names
        outcomes = []
        for problem, name in zip(result.problems, names):
            path = repository_path(problem.file, uri_prefix)
            case = _element(suite, "testcase", name=name, classname=f"vcheck.{INPUT_SUITE}",
                            file=path, line=problem.line, time="0")
            error = _element(case, "error", message=bounded(problem.message), type_="input-error")
            error.text = _body(bounded(problem.render()) + "\nNothing in this file was checked.")
            outcomes.append("error")
        _suite_attributes(suite, INPUT_SUITE, outcomes)
        all_outcomes += outcomes

    by_rule: dict[str, list[Finding]] = {}
    for info in result.rules:
        by_rule.setdefault(info.id, [])
    for finding in result.findings:
        by_rule.setdefault(finding.rule_id, []).append(finding)
    for rule_id, findings in by_rule.items():
        if not findings:
            continue
        findings = sorted(findings, key=lambda f: f.sort_key)
        suite = ET.SubElement(root, "testsuite")
        names = _Names([(_case_name(f), f.file) for f in findings]).names
        outcomes = [_finding_case(suite, f, n, uri_prefix) for f, n in zip(findings, names)]
        _suite_attributes(suite, rule_id, outcomes)
        all_outcomes += outcomes

    root.set("name", "vcheck")
    for key, value in _counts(all_outcomes).items():
        root.set(key, value)
    root.set("time", "0")
    properties = ET.Element("properties")
    for name, value in (("vcheck.version", result.version), ("vcheck.policy", result.policy),
                        ("vcheck.verdict", result.verdict),
                        ("vcheck.exit-status", str(int(result.exit_status))),
                        ("vcheck.caution", CAUTION)):
        _element(properties, "property", name=name, value=value)
    for note in result.notes:
        _element(properties, "property", name="vcheck.warning", value=note)
    if result.comparison is not None:
        comparison = result.comparison
        for name, value in (("vcheck.gate", result.gate), ("vcheck.base", comparison.base),
                            ("vcheck.comparison", " ".join(gate_sentences(result)))):
            _element(properties, "property", name=name, value=value)
        if not comparison.error:
            for name, items in (("vcheck.new-failures", comparison.new_failures),
                                ("vcheck.new-warnings", comparison.new_warnings),
                                ("vcheck.fixed", comparison.fixed)):
                _element(properties, "property", name=name, value=str(len(items)))
    for suite in root.findall("testsuite"):
        suite.insert(0, _copy(properties))
    ET.indent(root, space="  ")
    body = ET.tostring(root, encoding="unicode")
    return '<?xml version="1.0" encoding="UTF-8"?>\n' + xml_safe(body) + "\n"


def _copy(element: ET.Element) -> ET.Element:
    clone = ET.Element(element.tag, dict(element.attrib))
    for child in element:
        clone.append(_copy(child))
    return clone

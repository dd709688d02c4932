"""Merging the results of shards (parallel CI jobs) into one result."""

from __future__ import annotations

from .results import RunResult

__all__ = ["merge_results"]


def merge_results(results: list[RunResult]) -> RunResult:
    """One result from the results of several shards of the same project.

    Designs, findings and input problems are pooled and sorted as one run sorts them;
    the verdict and counts follow. Shards must come from the same vcheck version.
    """
    if not results:
        raise ValueError("nothing to merge")
    versions = sorted({r.version for r in results})
    if len(versions) > 1:
        raise ValueError(f"reports from different vcheck versions: {', '.join(versions)}")
    rules = {rule.id: rule for r in results for rule in r.rules}
    designs = {d.file: d for r in results for d in r.designs}
    findings = {}
    for r in results:
        for finding in r.findings:
            findings[(finding.fingerprint, finding.rule_id, finding.file, finding.key_path,
                      finding.message)] = finding
    return RunResult(
        version=versions[0],
        policy=results[0].policy,
        designs=[designs[k] for k in sorted(designs)],
        findings=sorted(findings.values(), key=lambda f: f.sort_key),
        problems=sorted({p for r in results for p in r.problems}),
        rules=[rules[k] for k in sorted(rules)],
        fail_on_warn=any(r.fail_on_warn for r in results),
        notes=sorted({note for r in results for note in r.notes}),
    )

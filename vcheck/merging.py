"""Merging the results of shards (parallel CI jobs) into one result.

Shards are pooled only when they are parts of one run: the same vcheck version, the same
project, the same policy (by fingerprint), the same rules and fail-on-warn setting, and,
when they were sharded,
every shard of one split exactly once. Anything else is refused with a message naming
the reports, because a merged PASS would rest on designs judged differently, or not at
all.
"""

from __future__ import annotations

from .design.problems import InputError, InputProblem
from .results import RunResult

__all__ = ["merge_results"]


def _refuse(names: list[str], message: str) -> InputError:
    return InputError([InputProblem(names[0] if names else "merge", 1, 1, "", message)])


def _differ(results, names, label: str, key) -> str | None:
    values: dict = {}
    for result, name in zip(results, names):
        values.setdefault(key(result), []).append(name)
    if len(values) < 2:
        return None
    parts = [f"{value or 'none'} ({', '.join(files[:3])}{', ...' if len(files) > 3 else ''})"
             for value, files in sorted(values.items(), key=lambda item: str(item[0]))]
    return f"the reports come from different {label}: " + "; ".join(parts)


def _check_parts(results: list[RunResult], names: list[str]) -> None:
    old = [name for result, name in zip(results, names) if not result.policy_fingerprint]
    if old:
        raise _refuse(old, "a report of version 1 has no project or policy fingerprint to "
                      "check; write the shards again with this vcheck")
    for label, key in (("vcheck versions", lambda r: r.version),
                       ("projects", lambda r: r.project),
                       ("policies (policy fingerprints)", lambda r: r.policy_fingerprint),
                       ("rule sets", lambda r: ", ".join(f"{i.id}" for i in r.rules)),
                       ("fail-on-warn settings",
                        lambda r: "fail-on-warn" if r.fail_on_warn else "warnings pass")):
        message = _differ(results, names, label, key)
        if message is not None:
            raise _refuse(names, message + "; merge only the shards of one run")
    shards = [result.shard for result in results]
    if all(shard is None for shard in shards):
        return
    if any(shard is None for shard in shards):
        whole = [name for shard, name in zip(shards, names) if shard is None]
        raise _refuse(whole, "a report of a whole run cannot be merged with shards: "
                      + ", ".join(whole) + " checked every design file")
    counts = sorted({shard[1] for shard in shards})
    if len(counts) > 1:
        raise _refuse(names, "the shards come from different splits: "
                      + ", ".join(f"K/{n}" for n in counts))
    count = counts[0]
    seen: dict[int, str] = {}
    for (index, _), name in zip(shards, names):
        if index in seen:
            raise _refuse([name], f"shard {index}/{count} is given twice ({seen[index]}, {name})")
        seen[index] = name
    missing = [f"{k}/{count}" for k in range(1, count + 1) if k not in seen]
    if missing:
        raise _refuse(names, f"shard{'s' if len(missing) > 1 else ''} {', '.join(missing)} "
                      "missing: their design files would go unchecked in the merged verdict")


def merge_results(results: list[RunResult], names: list[str] | None = None) -> RunResult:
    """One result from the results of several shards of the same project.

    Designs, findings and input problems are pooled and sorted as one run sorts them;
    the verdict and counts follow. ``names`` (the report files, for messages) default to
    ``shard 1``, ``shard 2`` ... Raises InputError when the results are not the parts
    of one run (see the module's docstring).
    """
    if not results:
        raise _refuse([], "nothing to merge")
    names = names or [f"report {n}" for n in range(1, len(results) + 1)]
    _check_parts(results, names)
    rules = {rule.id: rule for r in results for rule in r.rules}
    designs = {d.file: d for r in results for d in r.designs}
    findings = {}
    for r in results:
        for finding in r.findings:
            findings[(finding.fingerprint, finding.rule_id, finding.file, finding.key_path,
                      finding.message)] = finding
    return RunResult(
        version=results[0].version,
        policy=results[0].policy,
        designs=[designs[k] for k in sorted(designs)],
        findings=sorted(findings.values(), key=lambda f: f.sort_key),
        problems=sorted({p for r in results for p in r.problems}),
        rules=[rules[k] for k in sorted(rules)],
        fail_on_warn=any(r.fail_on_warn for r in results),
        notes=sorted({note for r in results for note in r.notes}),
        project=results[0].project,
        policy_fingerprint=results[0].policy_fingerprint,
        shard=None,
    )

"""A whole check: find the design files, load them, run the rules, collect results."""

from __future__ import annotations

import gc
from pathlib import Path

from . import __version__
from .config import Policy, resolve_rule_options
from .design.problems import InputError, InputProblem
from .engine import Registry, run_rules
from .results import CheckedDesign, RuleInfo, RunResult

__all__ = ["collect_design_files", "load_designs", "run_check"]

_NOT_DESIGNS = frozenset({"vcheck.toml", "pyproject.toml"})


def _display(root: Path, path: Path) -> str:
    try:
        return path.resolve().relative_to(root.resolve()).as_posix()
    except ValueError:
        return path.as_posix()


def collect_design_files(policy: Policy, arguments: list[str], cwd: Path):
    """Design files named on the command line or in the policy, sorted, deduplicated.

    Returns ``(files, problems)``: files as (absolute path, name relative to the root).
    """
    root = policy.root.resolve()
    problems: list[InputProblem] = []
    if arguments:
        requested = [(cwd / arg, arg) for arg in arguments]
    elif policy.paths:
        requested = [(root / item, item) for item in policy.paths]
    else:
        requested = [(cwd, ".")]
    excluded = [(root / item).resolve() for item in policy.exclude]
    found: dict[str, Path] = {}
    for path, label in requested:
        resolved = path.resolve()
        if not _is_inside(resolved, root):
            problems.append(InputProblem(label, 1, 1, "", f"'{label}' is outside the project "
                                         f"root {root.as_posix()}"))
            continue
        if resolved.is_file():
            found[_display(root, resolved)] = resolved
        elif resolved.is_dir():
            files = [
                item for item in sorted(resolved.rglob("*.toml"))
                if item.name not in _NOT_DESIGNS
                and not any(part.startswith(".") for part in item.relative_to(resolved).parts)
                and not any(_is_inside(item.resolve(), ex) for ex in excluded
                            if not _is_inside(resolved, ex))
            ]
            if not files:
                problems.append(InputProblem(label, 1, 1, "", f"no design files (*.toml) in "
                                             f"folder '{label}'"))
            for item in files:
                found[_display(root, item)] = item.resolve()
        else:
            problems.append(InputProblem(label, 1, 1, "", f"no such file or folder: '{label}'"))
    return [(found[name], name) for name in sorted(found)], problems


def _is_inside(path: Path, folder: Path) -> bool:
    return path == folder or folder in path.parents


def load_designs(policy: Policy, arguments: list[str], cwd: Path):
    """Load, validate and analyse every design named; returns (designs, problems)."""
    from .analysis import analyse
    from .design.loader import attach_references, design_from_document, load_structure, read_toml

    files, problems = collect_design_files(policy, arguments, cwd)
    designs = []
    structures: dict = {}
    root = policy.root.resolve()
    gc_was_enabled = gc.isenabled()
    gc.disable()  # validation makes many small objects and no cycles worth collecting
    try:
        for path, name in files:
            try:
                document = read_toml(path, name)
                if "structure" in document.data and "machine" not in document.data:
                    # a shared structure file: checked with the machines that stand on it
                    if path not in structures:
                        structures[path] = load_structure(path, root)
                    if isinstance(structures[path], InputError):
                        problems.extend(structures[path].problems)
                    continue
                design = design_from_document(document)
                attach_references(design, root, structures)
                analyse(design)
                designs.append(design)
            except InputError as exc:
                problems.extend(exc.problems)
    finally:
        if gc_was_enabled:
            gc.enable()
    return designs, sorted(set(problems))


def run_check(policy: Policy, registry: Registry, arguments: list[str], cwd: Path,
              *, fail_on_warn: bool | None = None) -> RunResult:
    """Check the design files named by ``arguments`` (or the policy) with every rule."""
    chosen = resolve_rule_options(policy, registry)
    designs, problems = load_designs(policy, arguments, cwd)

    from .waivers import apply_waivers, today

    findings = apply_waivers(run_rules(designs, registry, chosen), policy, today())
    return RunResult(
        version=__version__,
        policy=policy.name,
        designs=[CheckedDesign(d.file, d.machine.tag, d.machine.kind) for d in designs],
        findings=findings,
        problems=problems,
        rules=[RuleInfo(e.rule.id, e.rule.title, e.origin, e.rule.sources) for e in registry
               if chosen.enabled_anywhere(e.rule.id)],
        fail_on_warn=policy.fail_on_warn if fail_on_warn is None else fail_on_warn,
    )

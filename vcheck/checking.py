"""A whole check: find the design files, load them, run the rules, collect results."""

from __future__ import annotations

import gc
import hashlib
import os
from pathlib import Path

from . import __version__
from .config import Policy, resolve_rule_options
from .design.files import check_name, inside_root, relative_name, without_symlinks
from .design.problems import InputError, InputProblem
from .engine import Registry, run_rules
from .findings import Status
from .results import CheckedDesign, RuleInfo, RunResult

__all__ = ["collect_design_files", "load_designs", "paused_gc", "policy_fingerprint", "run_check",
           "shard_of", "unknown_curve_problems"]

_NOT_DESIGNS = frozenset({"vcheck.toml", "pyproject.toml"})


class paused_gc:
    """The cyclic garbage collector paused for a block, and restored as it was after it.

    A check makes many small objects (tables, models, findings) and no cycles worth
    collecting while it runs; the collector's passes over every design already loaded
    cost about a tenth of the time per design. Memory stays bounded: reference counting
    frees everything that is not in a cycle, and the collector runs again afterwards.
    """

    def __enter__(self):
        self._was_enabled = gc.isenabled()
        gc.disable()
        return self

    def __exit__(self, *exc) -> None:
        if self._was_enabled:
            gc.enable()


def _display(root: Path, path: Path) -> str:
    try:
        return path.resolve().relative_to(root.resolve()).as_posix()
    except ValueError:
        return path.as_posix()


def shard_of(name: str, count: int) -> int:
    """The shard (1 to ``count``) a design file belongs to: stable, by its path alone."""
    digest = hashlib.sha256(name.encode("utf-8")).digest()
    return int.from_bytes(digest[:8], "big") % count + 1


def collect_design_files(policy: Policy, arguments: list[str], cwd: Path,
                         shard: tuple[int, int] | None = None):
    """Design files named on the command line or in the policy, sorted, deduplicated.

    Returns ``(files, problems)``: files as (absolute path, name relative to the root).
    With ``shard = (k, n)`` only the files of shard k of n are returned.
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
        refused = check_name(label)
        if refused is not None:
            problems.append(InputProblem(_shown(label), 1, 1, "", refused))
            continue
        try:
            resolved = path.resolve()
        except (RuntimeError, OSError):
            problems.append(InputProblem(label, 1, 1, "", f"'{label}' is a symlink loop"))
            continue
        if not _is_inside(resolved, root):
            problems.append(InputProblem(label, 1, 1, "", f"'{label}' is outside the project "
                                         f"root {root.as_posix()}"))
            continue
        if resolved.is_dir():
            files, before = [], len(problems)
            below = len(resolved.parts)
            # where the names below the folder start in each path rglob gives
            folder_end = len(os.fspath(resolved).rstrip("/"))
            for item in sorted(resolved.rglob("*.toml")):
                # the parts of item.relative_to(resolved): rglob joins names to the folder
                if item.name in _NOT_DESIGNS or any(part.startswith(".")
                                                    for part in item.parts[below:]):
                    continue
                named = relative_name(root, item)
                shown = _shown(named)
                refused = check_name(named)
                if refused is not None:
                    problems.append(InputProblem(shown, 1, 1, "", refused))
                    continue
                # the folder was resolved just now: with no symlink below it, the item
                # is its own resolved path (the guarded opener checks every part again
                # when the file is read)
                if without_symlinks(os.fspath(item), below=folder_end):
                    target = item
                else:
                    try:
                        target = item.resolve()
                    except (RuntimeError, OSError):
                        problems.append(InputProblem(shown, 1, 1, "", f"'{shown}' is a "
                                                     "symlink loop; it is not read"))
                        continue
                if not _is_inside(target, root):
                    problems.append(InputProblem(shown, 1, 1, "", f"'{shown}' is a symlink to "
                                                 "a file outside the project root; it is not "
                                                 "read"))
                    continue
                if not any(_is_inside(target, ex) for ex in excluded
                           if not _is_inside(resolved, ex)):
                    files.append(target)
            if not files and len(problems) == before:
                problems.append(InputProblem(label, 1, 1, "", f"no design files (*.toml) in "
                                             f"folder '{label}'"))
            for target in files:  # resolved, inside the root: as _display would name it
                found[relative_name(root, target)] = target
        elif resolved.exists() or path.is_symlink():
            # a regular file, or a device, FIFO or socket the guarded opener refuses
            found[_display(root, resolved)] = resolved
        else:
            problems.append(InputProblem(label, 1, 1, "", f"no such file or folder: '{label}'"))
    names = sorted(found)
    if shard is not None:
        names = [name for name in names if shard_of(name, shard[1]) == shard[0]]
    return [(found[name], name) for name in names], problems


def policy_fingerprint(policy: Policy) -> str:
    """A digest of the policy's settings as read: its table (``vcheck.toml``, or
    ``[tool.vcheck]``) written canonically, so comments and layout do not count. 16 hex
    digits; the defaults (no policy file) have one too. Shards whose fingerprints differ
    were judged by different policies and are not merged."""
    import json

    data: object = {}
    if policy.document is not None:
        data = policy.document.data
        for key in policy.prefix:
            data = data.get(key, {}) if isinstance(data, dict) else {}
    text = json.dumps(data, sort_keys=True, ensure_ascii=True, default=str)
    return hashlib.sha256(text.encode("utf-8")).hexdigest()[:16]


def _shown(text: str) -> str:
    """A file name as shown in messages: bytes that are not UTF-8 escaped."""
    return text.encode("utf-8", "backslashreplace").decode("utf-8")


def _is_inside(path: Path, folder: Path) -> bool:
    return inside_root(folder, path)


def load_designs(policy: Policy, arguments: list[str], cwd: Path,
                 shard: tuple[int, int] | None = None, files=None, progress=None):
    """Load, validate and analyse every design named; returns (designs, problems).

    ``progress(done, total)``, when given, is called after each file.
    """
    from .analysis import analyse
    from .design.files import check_scope
    from .design.loader import attach_references, design_from_document, load_structure, read_toml

    problems: list[InputProblem] = []
    if files is None:
        files, problems = collect_design_files(policy, arguments, cwd, shard)
    designs = []
    structures: dict = {}
    root = policy.root.resolve()
    with paused_gc(), check_scope():
        for count, (path, name) in enumerate(files, 1):
            if progress is not None:
                progress(count, len(files))
            try:
                known = structures.get(path)
                if known is not None and not isinstance(known, InputError):
                    continue  # a structure a design stands on: read and checked with it
                document = read_toml(path, name, root)
                if "structure" in document.data and "machine" not in document.data:
                    # a shared structure file: checked with the machines that stand on it
                    if path not in structures:  # the file as just read, not read again
                        structures[path] = load_structure(path, root, document)
                    if isinstance(structures[path], InputError):
                        problems.extend(structures[path].problems)
                    continue
                try:
                    design = design_from_document(document)
                except InputError as exc:
                    # the file references are checked too, so that one run reports them
                    # with the value errors (a path outside the root, a missing file)
                    raise InputError(exc.problems + reference_problems(document, root)) \
                        from None
                if policy.require_support and design.support is None:
                    file, line, column = design.locate(("machine",))
                    raise InputError([InputProblem(
                        file, line, column, "machine",
                        "no [support]: the project policy requires one (require-support = "
                        "true); give [support] with kind (e.g. \"slab-on-grade\" or "
                        "\"suspended-floor\") and span, or support.structure")])
                attach_references(design, root, structures)
                analyse(design)
                designs.append(design)
            except InputError as exc:
                problems.extend(exc.problems)
    return designs, sorted(set(problems))


_REFERENCE_KEYS = ("path", "structure")


def reference_problems(document, root: Path) -> list[InputProblem]:
    """Problems of the file references in a design's raw data (every string under a key
    ``path``, and ``support.structure``): outside the root, missing, or a bad name.
    Nothing is opened; used when the design did not validate, so that those problems are
    reported in the same run as the others."""
    from .design.files import resolve_checked

    problems: list[InputProblem] = []

    def walk(node, here: tuple) -> None:
        if isinstance(node, dict):
            for key, value in node.items():
                if key in _REFERENCE_KEYS and isinstance(value, str) and value:
                    if key == "structure" and here[-1:] != ("support",):
                        continue
                    where = document.problem(here + (key,), "", value=True)
                    try:
                        resolve_checked(root, value, what="referenced file", where=where)
                    except InputError as exc:
                        problems.extend(exc.problems)
                else:
                    walk(value, here + (key,))
        elif isinstance(node, list):
            for index, item in enumerate(node[:1000]):
                walk(item, here + (index,))

    walk(document.data, ())
    return problems


def unknown_curve_problems(design, catalog) -> list[InputProblem]:
    """Located problems for fatigue details that name an S-N curve neither published nor
    contributed by a plugin (only the catalog of the run's plugins can tell)."""
    import difflib

    from .design.problems import format_key_path
    from .dynamics.fatigue.sn_curves import SN_CURVES

    problems = []
    contributed = catalog.names("sn-curve") if catalog is not None else []
    for index, detail in enumerate(design.fatigue):
        name = detail.detail
        if not isinstance(name, str) or name in SN_CURVES or name in contributed:
            continue
        key = ("fatigue", index, "detail")
        file, line, column = design.locate(key)
        close = difflib.get_close_matches(name, [*contributed, *SN_CURVES], n=1, cutoff=0.6)
        hint = f"; did you mean '{close[0]}'?" if close else ""
        listed = ", ".join(contributed) if contributed else "none"
        problems.append(InputProblem(
            file, line, column, format_key_path(key),
            f"S-N curve '{name}' is not a published curve and no plugin contributes it"
            f"{hint} (curves from plugins: {listed}; published names look like "
            "'EN 1993-1-9:71', 'IIW:FAT90', 'DNV-RP-C203:D')"))
    return problems


def _check_files(policy: Policy, registry: Registry, chosen, files, progress=None):
    with paused_gc():
        return _check_files_now(policy, registry, chosen, files, progress)


def _check_files_now(policy: Policy, registry: Registry, chosen, files, progress=None):
    designs, problems = load_designs(policy, [], policy.root, files=files, progress=progress)
    kept = []
    for design in designs:
        found = unknown_curve_problems(design, registry.catalog)
        if found:
            problems = sorted(set(problems) | set(found))
        else:
            kept.append(design)
    designs = kept
    findings = run_rules(designs, registry, chosen)
    silenced = getattr(chosen, "silent", None)
    if silenced is not None:
        by_file = {d.file: d for d in designs}
        findings = [f for f in findings if not (
            f.status is Status.NOT_CHECKED and f.file in by_file
            and silenced(f.rule_id, by_file[f.file]))]
    checked = [CheckedDesign(d.file, d.machine.tag, d.machine.kind) for d in designs]
    return checked, findings, problems


def run_check(policy: Policy, registry: Registry, arguments: list[str], cwd: Path,
              *, fail_on_warn: bool | None = None, shard: tuple[int, int] | None = None,
              jobs: int | None = 1, progress=None, only=None, collected=None,
              crew=None) -> RunResult:
    """Check the design files named by ``arguments`` (or the policy) with every rule.

    ``shard = (k, n)`` checks only shard k of n of the files; ``jobs`` > 1 checks them
    in that many processes (this one and worker processes, which build their registry
    from the policy as the command line does); ``jobs=None`` is one process for each
    :data:`vcheck.parallel.AUTO_FROM` files, at most one a core. The result is the same,
    byte for byte, either way. ``collected`` is what :func:`collect_design_files` gave
    for these arguments, when the caller has it; ``crew`` a
    :class:`vcheck.parallel.Crew` the caller started early, used and stopped here.
    """
    from .waivers import apply_waivers, today

    try:
        chosen = resolve_rule_options(policy, registry, only)
        files, problems = (collected if collected is not None
                           else collect_design_files(policy, arguments, cwd, shard))
        parts = None
        if jobs is None or jobs > 1:
            from .parallel import CHUNK, check_in_processes, processes_for, usable_cores

            jobs = processes_for(jobs, len(files), usable_cores())
            if jobs > 1 and len(files) > CHUNK:  # one chunk or less: nothing to share
                parts = check_in_processes(policy, registry, chosen, only, files, jobs,
                                           progress, crew=crew)
    finally:
        if crew is not None:
            crew.stop()
    if parts is None:
        parts = [_check_files(policy, registry, chosen, files, progress)]
    checked = sorted((d for part in parts for d in part[0]), key=lambda d: d.file)
    findings = sorted((f for part in parts for f in part[1]), key=lambda f: f.sort_key)
    problems = sorted(set(problems).union(*(part[2] for part in parts)))
    complete = not arguments and shard is None
    findings = apply_waivers(findings, policy, today(), {d.tag for d in checked}, complete)
    return RunResult(
        version=__version__,
        policy=policy.name,
        designs=checked,
        findings=findings,
        problems=problems,
        rules=[RuleInfo(e.rule.id, e.rule.title, e.origin, e.rule.sources) for e in registry
               if chosen.enabled_anywhere(e.rule.id)],
        fail_on_warn=policy.fail_on_warn if fail_on_warn is None else fail_on_warn,
        project=policy.root.resolve().name,
        policy_fingerprint=policy_fingerprint(policy),
        shard=shard,
    )

"""The base of a comparison: a previous JSON report, or a git revision checked out to a
temporary worktree and checked with the same rules and policy."""

from __future__ import annotations

import copy
import shutil
import subprocess
import tempfile
from pathlib import Path

from .design.problems import InputError, InputProblem

__all__ = ["check_revision"]


def _git(args: list[str], cwd: Path) -> subprocess.CompletedProcess:
    try:
        return subprocess.run(["git", *args], cwd=cwd, capture_output=True, text=True,
                              timeout=120)
    except FileNotFoundError:
        raise InputError([InputProblem("--base-revision", 1, 1, "",
                                       "git is not installed")]) from None


def check_revision(revision: str, policy, registry, arguments: list[str], cwd: Path, **kwargs):
    """Run the same check on the designs as they were at ``revision``.

    The current rules and policy judge the old designs, so the comparison shows what
    the design change did, not what a policy change did.
    """
    from .checking import run_check

    def problem(message: str) -> InputError:
        return InputError([InputProblem("--base-revision", 1, 1, "", message)])

    root = policy.root.resolve()
    top = _git(["rev-parse", "--show-toplevel"], root)
    if top.returncode != 0:
        raise problem(f"the project root {root.as_posix()} is not in a git repository")
    top_path = Path(top.stdout.strip()).resolve()
    known = _git(["rev-parse", "--verify", "--quiet", f"{revision}^{{commit}}"], top_path)
    if known.returncode != 0:
        shallow = _git(["rev-parse", "--is-shallow-repository"], top_path)
        if shallow.returncode == 0 and shallow.stdout.strip() == "true":
            raise problem(
                f"base revision '{revision}' is not in this clone, which is shallow (it holds "
                "only the newest commits): fetch the history first, e.g. `git fetch "
                "--deepen=50` or `git fetch origin <base branch>`, or set `fetch-depth: 0` "
                "on actions/checkout")
        raise problem(f"base revision '{revision}' does not exist")
    scratch = Path(tempfile.mkdtemp(prefix="vcheck-base-"))
    worktree = scratch / "tree"
    try:
        added = _git(["worktree", "add", "--detach", "--quiet", str(worktree),
                      known.stdout.strip()], top_path)
        if added.returncode != 0:
            raise problem(f"cannot check out '{revision}': {added.stderr.strip()}")
        base_root = worktree / root.relative_to(top_path)
        base_policy = copy.copy(policy)
        base_policy.root = base_root
        mapped = []
        for argument in arguments:
            absolute = (cwd / argument).resolve()
            try:
                mapped.append(str(base_root / absolute.relative_to(root)))
            except ValueError:
                mapped.append(argument)
        return run_check(base_policy, registry, mapped, base_root, **kwargs)
    finally:
        _git(["worktree", "remove", "--force", str(worktree)], top_path)
        shutil.rmtree(scratch, ignore_errors=True)

"""The layering of the design (DESIGN.md), held by import-linter contracts in
pyproject.toml: dynamics imports nothing of ours; the engine imports neither rules nor
writers; nothing imports the command line. The rules folder is mapped to vcheck.rules
at install time, so a direct check here makes sure no module of vcheck imports it."""

from __future__ import annotations

import ast
import os
import shutil
import subprocess
import sys
from pathlib import Path

from support import REPO


def _lint_imports(config: Path, cwd: Path) -> subprocess.CompletedProcess:
    script = shutil.which("lint-imports", path=str(Path(sys.executable).parent))
    command = [script] if script else [sys.executable, "-m", "importlinter.cli"]
    env = dict(os.environ, PYTHONPATH=str(cwd))
    # --config works in every import-linter release (newer ones only warn that it is
    # deprecated in favour of a positional argument, which older ones refuse).
    return subprocess.run(command + ["--config", str(config)], cwd=cwd, capture_output=True,
                          text=True, env=env)


def test_import_contracts_hold():
    result = _lint_imports(REPO / "pyproject.toml", REPO)
    assert result.returncode == 0, result.stdout + result.stderr
    assert "Contracts: 3 kept, 0 broken." in result.stdout


def test_contracts_can_break(tmp_path):
    # A contract that cannot fail proves nothing: break one on purpose in a copy.
    shutil.copytree(REPO / "vcheck", tmp_path / "vcheck")
    shutil.copytree(REPO / "rules", tmp_path / "rules")
    (tmp_path / "vcheck" / "dynamics" / "leak.py").write_text("from vcheck import engine\n")
    shutil.copy(REPO / "pyproject.toml", tmp_path / "pyproject.toml")
    result = _lint_imports(tmp_path / "pyproject.toml", tmp_path)
    assert result.returncode != 0
    assert "vcheck.dynamics.leak -> vcheck.engine" in result.stdout


def _imports(path: Path) -> list[str]:
    tree = ast.parse(path.read_text(encoding="utf-8"))
    package = ".".join(path.relative_to(REPO).with_suffix("").parts[:-1])
    names = []
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            names += [alias.name for alias in node.names]
        elif isinstance(node, ast.ImportFrom):
            base = node.module or ""
            if node.level:
                parent = package.split(".")[: len(package.split(".")) - node.level + 1]
                base = ".".join(parent + ([base] if base else []))
            names.append(base)
            names += [f"{base}.{alias.name}" for alias in node.names]
    return names


def test_no_vcheck_module_imports_the_rules():
    offenders = [
        (path.relative_to(REPO).as_posix(), name)
        for path in sorted((REPO / "vcheck").rglob("*.py"))
        for name in _imports(path)
        if name == "vcheck.rules" or name.startswith("vcheck.rules.")
    ]
    assert offenders == []


def test_dynamics_imports_only_numpy_scipy_and_the_standard_library():
    allowed_roots = {"numpy", "scipy", "vcheck"} | set(sys.stdlib_module_names) | {"__future__"}
    offenders = []
    for path in sorted((REPO / "vcheck" / "dynamics").rglob("*.py")):
        for name in _imports(path):
            root = name.split(".")[0]
            if root not in allowed_roots or (root == "vcheck" and not name.startswith("vcheck.dynamics")):
                offenders.append((path.name, name))
    assert offenders == []

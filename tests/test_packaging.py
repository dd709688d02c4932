"""The built-in rules ship inside the wheel, mapped under vcheck's own namespace, and
work from a non-editable install (the editable install is what the suite runs on)."""

from __future__ import annotations

import os
import subprocess
import sys
import zipfile

import pytest
from support import EXAMPLE, REPO


@pytest.fixture(scope="module")
def wheel(tmp_path_factory):
    out = tmp_path_factory.mktemp("wheel")
    subprocess.run(
        [sys.executable, "-m", "pip", "wheel", "--no-deps", "--no-build-isolation", "-q",
         "-w", str(out), str(REPO)],
        check=True, capture_output=True, text=True,
    )
    (path,) = out.glob("vcheck_vibration-*.whl")
    return path


def test_wheel_contents(wheel):
    names = set(zipfile.ZipFile(wheel).namelist())
    for required in ("vcheck/rules/__init__.py", "vcheck/rules/separation.py",
                     "vcheck/design/units.txt", "vcheck/report/report.schema.json",
                     "vcheck/py.typed"):
        assert required in names, required
    assert not any(name.startswith("rules/") for name in names), "no top-level 'rules' package"
    entry_points = next(n for n in names if n.endswith("entry_points.txt"))
    text = zipfile.ZipFile(wheel).read(entry_points).decode()
    assert "[vcheck.rules]" in text and "builtin = vcheck.rules:register" in text


def test_non_editable_install_runs_the_example(wheel, tmp_path):
    target = tmp_path / "site"
    subprocess.run([sys.executable, "-m", "pip", "install", "--no-deps", "-q", "--target",
                    str(target), str(wheel)], check=True, capture_output=True, text=True)
    code = (
        "import vcheck, vcheck.rules, sys; "
        "print(vcheck.__file__); print(vcheck.rules.__file__); "
        "from vcheck.cli import main; sys.exit(main(['check', sys.argv[1]]))"
    )
    env = dict(os.environ, PYTHONPATH=str(target))
    result = subprocess.run([sys.executable, "-c", code, str(EXAMPLE)], cwd=tmp_path,
                            capture_output=True, text=True, env=env)
    lines = result.stdout.splitlines()
    assert lines[0].startswith(str(target)) and lines[1].startswith(str(target))
    assert result.returncode == 1, result.stderr
    assert "FAIL" in result.stdout and "PASS" in result.stdout

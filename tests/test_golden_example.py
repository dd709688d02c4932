"""The bundled example's reports, byte for byte, against the copies kept in tests/golden/.

These hold the output steady across refactoring (the grouping of vcheck.dynamics into
topic subpackages was checked this way: every format byte-identical before and after).
A change that means to alter a report regenerates the copies and shows the difference in
review:

    VCHECK_UPDATE_GOLDEN=1 .venv/bin/python -m pytest tests/test_golden_example.py
"""

from __future__ import annotations

import importlib
import os
import warnings

import pytest
from support import EXAMPLE, REPO

GOLDEN = REPO / "tests" / "golden"
TODAY = "2026-12-02"  # waivers are judged on this date, so expiries do not move the output


@pytest.mark.parametrize("name, args", [
    ("check.txt", ("check", "--format", "text")),
    ("check.json", ("check", "--format", "json")),
    ("check.md", ("check", "--format", "markdown")),
    ("dynamics.txt", ("dynamics",)),
])
def test_example_reports_are_unchanged(run_cli, monkeypatch, name, args):
    monkeypatch.setenv("VCHECK_TODAY", TODAY)
    extra = ("--uri-prefix", "examples/kestrel-yard") if args[0] == "check" else ()
    ran = run_cli(*args, *extra, str(EXAMPLE), cwd=REPO)
    assert ran.status == (1 if args[0] == "check" else 0), ran.err
    path = GOLDEN / name
    if os.environ.get("VCHECK_UPDATE_GOLDEN") == "1":
        path.write_text(ran.out, encoding="utf-8")
    expected = path.read_text(encoding="utf-8")
    assert ran.out == expected, (
        f"the example's {name} changed; if meant, regenerate with VCHECK_UPDATE_GOLDEN=1")


def test_moved_dynamics_modules_are_the_same_objects(monkeypatch):
    import sys

    from vcheck.dynamics import MOVED_MODULES

    for old, group in MOVED_MODULES.items():
        new = importlib.import_module(f"vcheck.dynamics.{group}.{old}")
        monkeypatch.delitem(sys.modules, f"vcheck.dynamics.{old}", raising=False)
        with warnings.catch_warnings(record=True) as caught:
            warnings.simplefilter("always")
            legacy = importlib.import_module(f"vcheck.dynamics.{old}")
        assert legacy is new
        assert [str(w.message) for w in caught if w.category is DeprecationWarning] == [
            f"vcheck.dynamics.{old} is now vcheck.dynamics.{group}.{old}"]

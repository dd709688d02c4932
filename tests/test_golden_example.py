"""The bundled example's reports, byte for byte, against the copies kept in tests/golden/.

These hold the output steady across refactoring (the grouping of vcheck.dynamics into
topic subpackages was checked this way: every format byte-identical before and after).
A change that means to alter a report regenerates the copies and shows the difference in
review:

    VCHECK_UPDATE_GOLDEN=1 .venv/bin/python -m pytest tests/test_golden_example.py
"""

from __future__ import annotations

import importlib
import json
import math
import os
import warnings

import pytest
from support import EXAMPLE, REPO

GOLDEN = REPO / "tests" / "golden"
FLOAT_REL = 1e-12
"""How close a full-precision number of the JSON report must be to its golden copy. The
last bits of a float move with the machine's BLAS kernels (OpenBLAS picks them by CPU) and
numpy's build, not with vcheck: 6.669777469718224 on one machine is 6.669777469718223 on
another. Twelve significant digits is far tighter than any printed number (the text and
Markdown reports, compared byte for byte, print four or fewer)."""
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
    if name.endswith(".json") and ran.out != expected:
        difference = _json_difference(json.loads(expected), json.loads(ran.out), "$")
        assert difference is None, (
            f"the example's {name} changed at {difference}; if meant, regenerate with "
            "VCHECK_UPDATE_GOLDEN=1")
        return
    assert ran.out == expected, (
        f"the example's {name} changed; if meant, regenerate with VCHECK_UPDATE_GOLDEN=1")


def _json_difference(expected, got, where: str) -> str | None:
    """Where two JSON documents differ (keys in the same order, every string, integer,
    boolean and null equal, floats to FLOAT_REL), or None if they do not."""
    if isinstance(expected, dict) and isinstance(got, dict):
        if list(expected) != list(got):
            return f"{where}: keys {list(expected)} != {list(got)}"
        for key in expected:
            found = _json_difference(expected[key], got[key], f"{where}.{key}")
            if found:
                return found
        return None
    if isinstance(expected, list) and isinstance(got, list):
        if len(expected) != len(got):
            return f"{where}: {len(expected)} items != {len(got)}"
        for index, (a, b) in enumerate(zip(expected, got)):
            found = _json_difference(a, b, f"{where}[{index}]")
            if found:
                return found
        return None
    if type(expected) is float and type(got) is float:
        return None if math.isclose(expected, got, rel_tol=FLOAT_REL, abs_tol=0.0) else (
            f"{where}: {expected!r} != {got!r}")
    if type(expected) is not type(got) or expected != got:
        return f"{where}: {expected!r} != {got!r}"
    return None


def test_json_comparison_catches_a_change_beyond_the_last_bits():
    golden = {"a": [1, 6.669777469718224, "x"], "b": None}
    assert _json_difference(golden, {"a": [1, 6.669777469718223, "x"], "b": None}, "$") is None
    assert _json_difference(golden, {"a": [1, 6.6697774697, "x"], "b": None}, "$") == (
        "$.a[1]: 6.669777469718224 != 6.6697774697")
    assert _json_difference(golden, {"b": None, "a": [1, 6.669777469718224, "x"]}, "$") == (
        "$: keys ['a', 'b'] != ['b', 'a']")
    assert _json_difference(golden, {"a": [1, 6.669777469718224, "y"], "b": None}, "$") == (
        "$.a[2]: 'x' != 'y'")
    assert _json_difference({"n": 1}, {"n": 1.0}, "$") == "$.n: 1 != 1.0"


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

"""The position scanner on text tomllib accepts: it always ends, never raises, and the
keys after a tricky string are still located on their own lines.

Reference: the TOML 1.0.0 specification (toml.io), "Multi-line basic strings": a
backslash escapes the next character, so a backslash before three quotes does not end
the string; one or two quotes may stand right before the closing delimiter. Python's
``tomllib`` is the reference parser each text is checked with first.
"""

from __future__ import annotations

import subprocess
import sys

import pytest
import tomllib

from vcheck.design.positions import scan_positions

CASES = {
    "escaped quotes then a bracket": ('description = """\\"""]"""\nx = 1\n', {("x",): 2}),
    "escaped triple quote over lines": ('d = """a\\"""\nb = 1\n"""\nx = 1\n', {("x",): 4}),
    "escaped backslash before the end": ('a = """x\\\\"""\nb = 2\n', {("b",): 2}),
    "literal string keeps its backslash": ("a = '''x\\'''\nb = 2\n", {("b",): 2}),
    "a quote before the closing quotes": ('a = """ab""""\nb = 2\n', {("b",): 2}),
    "two quotes before the closing quotes": ('a = """ab"""""\n[t]\nb = 2\n',
                                             {("t",): 2, ("t", "b"): 3}),
    "escaped quote then escaped backslash": ('a = """\\\\\\""""\nb = 3\n', {("b",): 2}),
    "table header after a tricky string": ('a = """\\""""\n\n[machine]\ntag = "x"\n',
                                           {("machine",): 3, ("machine", "tag"): 4}),
    "array of strings with escapes": ('a = ["\\"]", """\\"""]"""]\nb = 1\n', {("b",): 2}),
}


@pytest.mark.parametrize("name", sorted(CASES))
def test_keys_after_tricky_strings_are_located(name):
    text, lines = CASES[name]
    data = tomllib.loads(text)  # the reference parser accepts it
    positions = scan_positions(text)
    for key in data:
        assert (key,) in positions
    for path, line in lines.items():
        assert positions[path].line == line, path


def test_a_pathological_run_of_backslashes_ends():
    # 20,000 escaped quotes inside one multi-line string: linear, not quadratic
    text = 'a = """' + '\\"' * 20_000 + '"""\nb = 1\n'
    assert tomllib.loads(text)["b"] == 1
    assert scan_positions(text)[("b",)].line == 2


HANG = 'description = """\\"""]"""\n'


def _run_in_a_subprocess(tmp_path, design: str, policy: str):
    (tmp_path / "vcheck.toml").write_text(policy)
    (tmp_path / "d.toml").write_text(design)
    # a separate process with a timeout: a hang fails the test instead of the suite
    return subprocess.run([sys.executable, "-m", "vcheck", "check", "d.toml", "--format",
                           "json"], cwd=tmp_path, capture_output=True, text=True, timeout=120)


def test_the_hanging_design_text_is_read(tmp_path):
    ran = _run_in_a_subprocess(tmp_path, HANG + 'format = 7\n', "")
    assert ran.returncode == 2
    assert ran.stderr.strip().splitlines()[-1] == (
        "d.toml:2:10: format: unknown format version 7; this vcheck reads format 1")


def test_the_hanging_text_in_the_policy_is_located(tmp_path):
    ran = _run_in_a_subprocess(tmp_path, "format = 1\n", HANG + "fail-on-worn = true\n")
    assert ran.returncode == 2
    assert ran.stderr.strip().splitlines() == [
        "vcheck.toml:1:1: description: unknown key 'description'; known keys: exclude, "
        "fail-on-warn, folder, local-rules, paths, require-support, rules, show-not-checked, "
        "waiver",
        "vcheck.toml:2:1: fail-on-worn: unknown key 'fail-on-worn'; did you mean "
        "'fail-on-warn'?"]


def test_the_index_error_text_is_located(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "d.toml").write_text('d = """a\\"""\nb = 1\n"""\nformat = 7\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines()[-1] == ("d.toml:4:10: format: unknown format version 7; this "
                                        "vcheck reads format 1")


def test_a_long_line_that_is_not_a_simple_pair_ends():
    # the one-line fast path gives up on 200,000 blanks before a comma without trying
    # them two ways (a pattern that backtracked would take hours here)
    text = "a = [1" + " " * 200_000 + ", 2]\nb = 'x" + "\t" * 100_000 + "'\nc = 3\n"
    assert tomllib.loads(text)["c"] == 3
    found = scan_positions(text)
    assert (found[("a", 1)].line, found[("b",)].line, found[("c",)].line) == (1, 2, 3)

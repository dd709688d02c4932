"""Every review format says the gate, the base and what changed; paths that are a guess
are said; a failed comparison still writes the run's reports; the Markdown summary fits a
pull-request comment.

Outside references: the OASIS SARIF 2.1.0 schema (``baselineState`` values "new",
"unchanged", "updated", "absent"; SARIF 2.1.0 section 3.27.24), junitparser for the JUnit
properties, markdown-it-py for the Markdown, GitHub's documented pull-request comment
limit of 65,536 characters (from memory).
"""

from __future__ import annotations

import json
import shutil
import subprocess

import pytest
from markdown_it import MarkdownIt
from support import EXAMPLE, oasis_sarif_schema

from vcheck.report.markdown import MAX_CHARS


def _design(folder, frequency: str, tag: str = "AHU-R2", name: str = "ahu-r2.toml"):
    text = (EXAMPLE / "roof" / "ahu-r2.toml").read_text().replace('"25.2 Hz"', f'"{frequency}"')
    text = text.replace('"AHU-R2"', f'"{tag}"')
    (folder / "roof").mkdir(exist_ok=True)
    (folder / "roof" / name).write_text(text)


@pytest.fixture
def compared(run_cli, tmp_path):
    """A project whose base has CT-R1 failing and AHU-R2 passing; now AHU-R2 fails too."""
    (tmp_path / "vcheck.toml").write_text('paths = ["roof"]\n')
    (tmp_path / "roof").mkdir()
    shutil.copy(EXAMPLE / "roof" / "ct-r1.toml", tmp_path / "roof" / "ct-r1.toml")
    _design(tmp_path, "27.0 Hz")  # 31.4% from 2x: pass
    base = tmp_path / "base.json"
    run_cli("check", "--format", "json", "--output", str(base), cwd=tmp_path)
    _design(tmp_path, "21.0 Hz")  # 6.8% from 1x: fail
    return tmp_path, base


def _run(run_cli, folder, base, *extra):
    return run_cli("check", "--base-report", str(base), "--gate", "new", "--uri-prefix", "",
                   *extra, cwd=folder)


def test_markdown_says_the_gate_base_and_new_failures(run_cli, compared):
    folder, base = compared
    ran = _run(run_cli, folder, base, "--format", "markdown")
    assert ran.status == 1
    assert "Gate: only failures new against base report " in ran.out
    assert "fail the run (--gate new): 1 new failure," in ran.out
    assert "### Changes against base report" in ran.out
    tokens = MarkdownIt().enable("table").parse(ran.out)
    cells = [t.content for t in tokens if t.type == "inline"]
    assert "new failure" in cells and "AHU-R2" in cells


def test_a_gate_pass_with_old_failures_says_so(run_cli, compared):
    folder, base = compared
    _design(folder, "27.0 Hz")  # back to the base: only CT-R1's old failures remain
    ran = _run(run_cli, folder, base, "--format", "markdown")
    assert ran.status == 0
    assert "**Result: PASS**" in ran.out
    assert "0 new failures" in ran.out
    assert "The run passes the gate although" in ran.out and "the base failed them too" in ran.out
    text = _run(run_cli, folder, base).out
    assert f"  gate      new failures only, against base report {base}: 0 new failures" in text


def test_github_lines_say_the_gate_inside_the_fence(run_cli, compared):
    folder, base = compared
    out = _run(run_cli, folder, base, "--format", "github").out
    start = out.index("::stop-commands::")
    assert out.index("Gate: only failures new against") > start
    assert "NEW FAILURE" in out and "AHU-R2" in out


@pytest.fixture(scope="module")
def oasis_schema():
    return oasis_sarif_schema()


def test_sarif_results_carry_baseline_state(run_cli, compared, oasis_schema):
    import jsonschema

    folder, base = compared
    log = json.loads(_run(run_cli, folder, base, "--format", "sarif").out)
    jsonschema.validate(log, oasis_schema, cls=jsonschema.Draft7Validator)
    run = log["runs"][0]
    states = {(r["properties"]["target"], r["properties"]["keyPath"]): r["baselineState"]
              for r in run["results"] if "target" in r["properties"]}
    allowed = {"new", "unchanged", "updated", "absent"}  # SARIF 2.1.0 section 3.27.24
    assert set(states.values()) <= allowed
    ahu = [state for (target, _), state in states.items() if target == "AHU-R2"]
    assert "new" in ahu
    ct = [state for (target, _), state in states.items() if target == "CT-R1"]
    assert ct and set(ct) <= {"unchanged", "updated"}
    assert run["properties"]["comparison"]["gate"] == "new"
    assert run["tool"]["driver"]["informationUri"].startswith("https://")
    assert all(rule.get("helpUri", "https://").startswith("https://")
               for rule in run["tool"]["driver"]["rules"])


def test_sarif_fixed_findings_are_absent_results(run_cli, compared, oasis_schema):
    import jsonschema

    folder, base = compared
    # the base of this test is the failing state; back to passing, AHU-R2's failure is fixed
    now_failing = folder / "now.json"
    run_cli("check", "--format", "json", "--output", str(now_failing), cwd=folder)
    _design(folder, "27.0 Hz")
    log = json.loads(_run(run_cli, folder, now_failing, "--format", "sarif").out)
    jsonschema.validate(log, oasis_schema, cls=jsonschema.Draft7Validator)
    absent = [r for r in log["runs"][0]["results"] if r.get("baselineState") == "absent"]
    assert absent and all(r["kind"] == "pass" and r["level"] == "none" for r in absent)
    assert any("AHU-R2: fixed since the base (fail there)" in r["message"]["text"]
               for r in absent)


def test_junit_suites_carry_the_gate(run_cli, compared, tmp_path):
    from junitparser import JUnitXml

    folder, base = compared
    target = tmp_path / "junit.xml"
    _run(run_cli, folder, base, "--report", f"junit={target}")
    xml = JUnitXml.fromfile(str(target))
    suite = next(iter(xml))
    properties = {p.name: p.value for p in suite.properties()}
    assert properties["vcheck.gate"] == "new"
    assert properties["vcheck.new-failures"] == "1"
    assert properties["vcheck.base"] == f"base report {base}"


def test_a_failed_comparison_still_writes_the_reports(run_cli, compared, tmp_path):
    folder, _ = compared
    missing = tmp_path / "no-such-base.json"
    sarif, md = tmp_path / "out.sarif", tmp_path / "out.md"
    ran = run_cli("check", "--base-report", str(missing), "--gate", "new", "--uri-prefix", "",
                  "--report", f"sarif={sarif}", "--report", f"markdown={md}", cwd=folder)
    assert ran.status == 2
    assert sarif.exists() and md.exists()
    assert "The comparison with base report" in md.read_text() and "failed" in md.read_text()
    log = json.loads(sarif.read_text())
    assert log["runs"][0]["properties"]["comparison"]["failed"]
    assert "comparison with base report" in ran.out and "failed" in ran.out


def _git(*args, cwd):
    return subprocess.run(["git", *args], cwd=cwd, capture_output=True, text=True,
                          env={"GIT_AUTHOR_NAME": "t", "GIT_AUTHOR_EMAIL": "t@example.invalid",
                               "GIT_COMMITTER_NAME": "t",
                               "GIT_COMMITTER_EMAIL": "t@example.invalid",
                               "PATH": "/usr/bin:/bin:/usr/local/bin"})


def test_a_shallow_clone_says_how_to_fetch_the_base(run_cli, tmp_path):
    if shutil.which("git") is None:
        pytest.skip("git is not installed")
    origin = tmp_path / "origin"
    origin.mkdir()
    (origin / "vcheck.toml").write_text('paths = ["roof"]\n')
    _design(origin, "27.0 Hz")
    _git("init", "-q", cwd=origin)
    for n in (1, 2):
        (origin / f"note-{n}.txt").write_text(str(n))
        _git("add", ".", cwd=origin)
        assert _git("commit", "-q", "-m", f"c{n}", cwd=origin).returncode == 0
    clone = tmp_path / "clone"
    done = _git("clone", "-q", "--depth", "1", f"file://{origin}", str(clone), cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    ran = run_cli("check", "--base-revision", "HEAD~1", cwd=clone)
    assert ran.status == 2
    assert ("base revision 'HEAD~1' is not in this clone, which is shallow" in ran.err
            and "git fetch --deepen=50" in ran.err)


def test_repository_paths_that_are_a_guess_are_said(run_cli, tmp_path, monkeypatch):
    (tmp_path / "vcheck.toml").write_text('paths = ["roof"]\n')
    _design(tmp_path, "27.0 Hz")
    monkeypatch.setenv("PATH", str(tmp_path / "no-bin"))  # no git on the PATH
    ran = run_cli("check", "--format", "sarif", cwd=tmp_path)
    assert "vcheck: warning: repository paths are a guess: git is not installed" in ran.err
    assert "--uri-prefix PATH" in ran.err
    notes = json.loads(ran.out)["runs"][0]["invocations"][0]["toolExecutionNotifications"]
    assert "repository paths are a guess" in notes[0]["message"]["text"]
    md = run_cli("check", "--format", "markdown", cwd=tmp_path).out
    assert "**Warning:** repository paths are a guess" in md
    strict = run_cli("check", "--format", "sarif", "--require-repository-paths", cwd=tmp_path)
    assert strict.status == 2 and "vcheck: error: repository paths are a guess" in strict.err
    given = run_cli("check", "--format", "sarif", "--uri-prefix", "designs", cwd=tmp_path)
    assert "warning" not in given.err


def test_markdown_is_capped_by_characters(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text('paths = ["basement"]\n')
    (tmp_path / "basement").mkdir()
    source = (EXAMPLE / "basement" / "gen-b8.toml").read_text()
    data = EXAMPLE / "basement" / "data"
    if data.exists():
        shutil.copytree(data, tmp_path / "basement" / "data")
    for n in range(150):
        (tmp_path / "basement" / f"gen-b8-{n:03d}.toml").write_text(
            source.replace('"GEN-B8"', f'"GEN-B8-{n:03d}"'))
    ran = run_cli("check", "--format", "markdown", "--uri-prefix", "", cwd=tmp_path)
    assert ran.status == 1
    assert len(ran.out) <= MAX_CHARS < 65_536
    assert "to keep this summary under 60,000 characters" in ran.out
    assert "**Caution:**" in ran.out

"""What a pipeline needs beyond one report: several formats in one run, shards and
their merge, parallel checking, comparison with a base, and the input format as JSON
Schema for editors."""

from __future__ import annotations

import json
import shutil
import subprocess
import sys

import jsonschema
import pytest
from support import EXAMPLE, REPO, children

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib


def test_several_formats_in_one_run(run_cli, tmp_path):
    sarif, junit = tmp_path / "v.sarif", tmp_path / "junit.xml"
    ran = run_cli("check", str(EXAMPLE), "--report", f"sarif={sarif}", "--report",
                  f"junit={junit}", "--uri-prefix", "examples/kestrel-yard")
    assert ran.status == 1
    assert ran.out.startswith("vcheck ")  # the text report stays on stdout
    log = json.loads(sarif.read_text())
    uris = {r["locations"][0]["physicalLocation"]["artifactLocation"]["uri"]
            for r in log["runs"][0]["results"]}
    assert "examples/kestrel-yard/roof/ef-r1.toml" in uris
    assert junit.read_text().startswith("<?xml")


def test_report_option_errors(run_cli, tmp_path):
    ran = run_cli("check", str(EXAMPLE), "--report", "pdf=x.pdf")
    assert ran.status == 2 and "unknown format 'pdf'" in ran.err
    ran = run_cli("check", str(EXAMPLE), "--report", f"sarif={tmp_path / 'no' / 'v.sarif'}")
    assert ran.status == 2 and "does not exist" in ran.err


def test_uri_prefix_found_with_git(run_cli, tmp_path):
    if shutil.which("git") is None:
        pytest.skip("git is not installed")
    repo = tmp_path / "repo"
    shutil.copytree(EXAMPLE, repo / "plant-designs")
    subprocess.run(["git", "init", "-q", str(repo)], check=True)
    ran = run_cli("check", "--format", "sarif", cwd=repo / "plant-designs")
    uris = {r["locations"][0]["physicalLocation"]["artifactLocation"]["uri"]
            for r in json.loads(ran.out)["runs"][0]["results"]}
    assert "plant-designs/roof/ef-r1.toml" in uris


def test_shards_partition_the_files_and_merge_to_the_whole(run_cli, tmp_path):
    whole = run_cli("check", str(EXAMPLE), "--format", "json").out
    names = []
    for k in (1, 2, 3):
        out = tmp_path / f"shard-{k}.json"
        run_cli("check", str(EXAMPLE), "--shard", f"{k}/3", "--format", "json", "--output",
                str(out))
        names.append(str(out))
    files = [set(d["file"] for d in json.loads((tmp_path / f"shard-{k}.json").read_text())
                 ["designs"]) for k in (1, 2, 3)]
    assert not (files[0] & files[1] or files[1] & files[2] or files[0] & files[2])
    merged = run_cli("merge", *names, "--format", "json")
    assert merged.status == 1
    assert merged.out == whole  # byte-identical to the unsharded run
    text = run_cli("merge", *names)
    assert text.out == run_cli("check", str(EXAMPLE)).out


def test_shard_option_is_checked(run_cli):
    ran = run_cli("check", str(EXAMPLE), "--shard", "4/3")
    assert ran.status == 2 and "K must be from 1 to N" in ran.err


def test_merge_refuses_a_file_that_is_not_a_report(run_cli, tmp_path):
    bad = tmp_path / "bad.json"
    bad.write_text('{"report": "other"}')
    ran = run_cli("merge", str(bad))
    assert ran.status == 2
    assert ran.err.strip() == (f"{bad}:1:1: not a vcheck JSON report (no \"report\": "
                               "\"vcheck\" at the top); write one with `vcheck check --format "
                               "json`")


def test_parallel_jobs_give_identical_output(run_cli):
    serial = run_cli("check", str(EXAMPLE), "--format", "json").out
    parallel = run_cli("check", str(EXAMPLE), "--format", "json", "--jobs", "2").out
    assert parallel == serial


@pytest.mark.skipif(not sys.platform.startswith("linux"), reason="reads /proc")
def test_parallel_jobs_leave_no_process_behind(run_cli, monkeypatch):
    # After a --jobs 2 run the process that ran it has no child left: the worker (here
    # stopped while it still starts, as the example's 24 files are done first) is reaped.
    import vcheck.cli
    from vcheck import parallel

    monkeypatch.setattr(vcheck.cli, "_cores", lambda: 2)  # two even on a one-core machine
    started = []

    class Counted(parallel.Crew):
        def __init__(self, *args):
            super().__init__(*args)
            started.extend(worker.process.pid for worker in self.workers)

    monkeypatch.setattr(parallel, "Crew", Counted)
    assert children() == []
    ran = run_cli("check", str(EXAMPLE), "--jobs", "2")
    assert ran.status == 1 and len(started) == 1
    assert children() == []


def _design(tmp_path, frequency: str):
    text = (EXAMPLE / "roof" / "ahu-r2.toml").read_text().replace('"25.2 Hz"', f'"{frequency}"')
    (tmp_path / "roof").mkdir(exist_ok=True)
    (tmp_path / "roof" / "ahu-r2.toml").write_text(text)


def test_comparison_with_a_base_report(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text('paths = ["roof"]\n')
    _design(tmp_path, "27.0 Hz")  # 37.3% separation from 1x (19.67 Hz): pass
    base = tmp_path / "base.json"
    run_cli("check", "--format", "json", "--output", str(base), cwd=tmp_path)
    _design(tmp_path, "25.2 Hz")  # 28.1%: warn
    ran = run_cli("check", "--format", "json", "--base-report", str(base), cwd=tmp_path)
    comparison = json.loads(ran.out)["comparison"]
    assert [f["target"] for f in comparison["new-warnings"]] == ["AHU-R2"]
    (worse,) = [c for c in comparison["worse"] if c["rule"] == "frequency-separation"]
    # hand calculation: 1x = 1180 rpm = 19.667 Hz, 2x = 39.333 Hz. At the base the
    # 27.0 Hz mode is nearest 2x, (39.333 - 27.0) / 39.333 = 31.4%; now 25.2 Hz is
    # nearest 1x, (25.2 - 19.667) / 19.667 = 28.1%.
    one, two = 1180 / 60, 2 * 1180 / 60
    assert worse["change"] == pytest.approx((25.2 - one) / one - (two - 27.0) / two, abs=1e-6)
    text = run_cli("check", "--base-report", str(base), cwd=tmp_path).out
    assert f"Changes against base report {base}" in text
    assert "margins worse: 1" in text


def _git(*args, cwd):
    subprocess.run(["git", *args], cwd=cwd, check=True, capture_output=True,
                   env={"GIT_AUTHOR_NAME": "t", "GIT_AUTHOR_EMAIL": "t@example.invalid",
                        "GIT_COMMITTER_NAME": "t", "GIT_COMMITTER_EMAIL": "t@example.invalid",
                        "PATH": "/usr/bin:/bin:/usr/local/bin"})


def test_comparison_with_a_git_revision_and_the_new_failures_gate(run_cli, tmp_path):
    if shutil.which("git") is None:
        pytest.skip("git is not installed")
    project = tmp_path / "repo" / "designs"
    project.mkdir(parents=True)
    (project / "vcheck.toml").write_text('paths = ["roof"]\n')
    _design(project, "25.2 Hz")  # warn at the base
    (project / "roof" / "ct-r1.toml").write_text((EXAMPLE / "roof" / "ct-r1.toml").read_text())
    _git("init", "-q", cwd=tmp_path / "repo")
    _git("add", ".", cwd=tmp_path / "repo")
    _git("commit", "-q", "-m", "base", cwd=tmp_path / "repo")
    _design(project, "21.0 Hz")  # 6.8% separation: now a failure
    ran = run_cli("check", "--format", "json", "--base-revision", "HEAD", cwd=project)
    report = json.loads(ran.out)
    assert [f["target"] for f in report["comparison"]["new-failures"]] == ["AHU-R2"]
    assert report["comparison"]["base"] == "revision HEAD"
    assert ran.status == 1
    # CT-R1 failed at the base as it does now: with --gate new only AHU-R2 counts
    _design(project, "25.2 Hz")
    ran = run_cli("check", "--base-revision", "HEAD", "--gate", "new", cwd=project)
    assert ran.status == 0  # CT-R1 still fails, but it is not new
    assert "new failures: 0" in ran.out
    worktrees = subprocess.run(["git", "worktree", "list"], cwd=tmp_path / "repo",
                               capture_output=True, text=True).stdout
    assert worktrees.count("\n") == 1  # the temporary worktree is gone


def test_unknown_base_revision(run_cli, tmp_path):
    if shutil.which("git") is None:
        pytest.skip("git is not installed")
    (tmp_path / "vcheck.toml").write_text('paths = ["roof"]\n')
    _design(tmp_path, "25.2 Hz")
    _git("init", "-q", cwd=tmp_path)
    ran = run_cli("check", "--base-revision", "no-such-branch", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == "--base-revision:1:1: base revision 'no-such-branch' does not exist"


def test_gate_new_needs_a_base(run_cli):
    ran = run_cli("check", str(EXAMPLE), "--gate", "new")
    assert ran.status == 2 and "--gate new needs --base-report or --base-revision" in ran.err


@pytest.fixture(scope="module")
def schema():
    out = subprocess.run([sys.executable, "-m", "vcheck", "schema"], capture_output=True,
                         text=True, check=True, cwd=REPO)
    return json.loads(out.stdout)


def test_schema_accepts_every_example_design_and_structure(schema):
    # jsonschema is an independent validator of the exported schema (test-only package)
    validator = jsonschema.Draft202012Validator(schema)
    files = sorted(p for p in EXAMPLE.rglob("*.toml") if p.name != "vcheck.toml")
    assert len(files) >= 9
    for path in files:
        data = tomllib.loads(path.read_text())
        errors = list(validator.iter_errors(data))
        assert not errors, (path, errors[0].message)


def test_schema_rejects_a_typo_and_a_bare_number(schema):
    validator = jsonschema.Draft202012Validator(schema)
    data = tomllib.loads((EXAMPLE / "roof" / "ef-r1.toml").read_text())
    data["machine"]["blaeds"] = data["machine"].pop("blades")
    assert not validator.is_valid(data)
    data = tomllib.loads((EXAMPLE / "roof" / "ef-r1.toml").read_text())
    data["machine"]["mass"] = 420
    assert not validator.is_valid(data)


def test_schema_has_the_measurement_table(schema):
    # the [[measurement]] tables of the example's survey validate; a location typo does not
    validator = jsonschema.Draft202012Validator(schema)
    data = tomllib.loads((EXAMPLE / "plant" / "level-3" / "sf-3d.toml").read_text())
    assert data["measurement"] and validator.is_valid(data)
    data["measurement"][0]["location"] = "bearings"
    assert not validator.is_valid(data)


def test_the_collector_is_paused_for_a_check_and_restored_after_it(run_cli):
    # the check runs with the cyclic collector paused (checking.paused_gc) and leaves it
    # as it found it: on after a run that started with it on, off after one that
    # started with it off; nested pauses restore only at the outermost
    import gc

    from vcheck.checking import paused_gc

    assert gc.isenabled()
    with paused_gc():
        assert not gc.isenabled()
        with paused_gc():
            assert not gc.isenabled()
        assert not gc.isenabled()
    assert gc.isenabled()
    assert run_cli("check", str(EXAMPLE)).status == 1
    assert gc.isenabled()
    gc.disable()
    try:
        assert run_cli("check", str(EXAMPLE)).status == 1
        assert not gc.isenabled()
    finally:
        gc.enable()

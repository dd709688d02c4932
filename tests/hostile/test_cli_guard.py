"""The command line's one guard: known failures exit 2 with where they are, anything
unexpected exits 3 with a short message and a request to report it, never a traceback
and never 1 (which CI reads as "a rule failed").

Outside reference: the exit statuses are the project's documented contract (README,
``vcheck --help``); the errno texts are the C library's (``strerror``), as Python gives
them.
"""

from __future__ import annotations

import json
import os
import pickle
import shutil
from pathlib import Path

import pytest
from support import EXAMPLE

import vcheck
from vcheck.cli import ISSUES_HINT, UsageError, _write_file
from vcheck.design.problems import InputError, InputProblem

DESIGN = EXAMPLE / "roof" / "ef-r1.toml"


def _no_traceback(ran) -> None:
    assert "Traceback" not in ran.err and "Traceback" not in ran.out


# -- anything unexpected: exit 3, short, with the hint ---------------------------------

@pytest.mark.parametrize("raised", [RuntimeError("boom"), MemoryError(), RecursionError("deep"),
                                    KeyError("x"), ZeroDivisionError("division by zero")])
def test_an_unexpected_exception_exits_3_with_a_hint(run_cli, monkeypatch, raised):
    import vcheck.checking

    def broken(*args, **kwargs):
        raise raised

    monkeypatch.setattr(vcheck.checking, "run_check", broken)
    monkeypatch.delenv("VCHECK_TRACEBACK", raising=False)
    ran = run_cli("check", str(DESIGN))
    assert ran.status == 3
    _no_traceback(ran)
    lines = ran.err.splitlines()
    detail = f": {raised}" if str(raised) else ""
    assert lines == [f"vcheck: internal error: {type(raised).__name__}{detail}",
                     f"vcheck: {ISSUES_HINT} (vcheck {vcheck.__version__})"]


def test_the_traceback_only_when_asked(run_cli, monkeypatch):
    import vcheck.checking

    monkeypatch.setattr(vcheck.checking, "run_check", lambda *a, **k: 1 / 0)
    monkeypatch.setenv("VCHECK_TRACEBACK", "1")
    ran = run_cli("check", str(DESIGN))
    assert ran.status == 3
    assert "Traceback (most recent call last)" in ran.err
    assert ran.err.rstrip().endswith("ZeroDivisionError: division by zero")


def test_an_internal_error_message_is_cleaned_and_short(run_cli, monkeypatch):
    import vcheck.checking

    def broken(*args, **kwargs):
        raise ValueError("\x1b[2J" + "x" * 5000)

    monkeypatch.setattr(vcheck.checking, "run_check", broken)
    ran = run_cli("check", str(DESIGN))
    assert ran.status == 3
    first = ran.err.splitlines()[0]
    assert "\x1b" not in ran.err and first.startswith("vcheck: internal error: ValueError: \\e[2J")
    assert len(first) < 400 and first.endswith("more characters not shown]")


# -- output files that cannot be written: exit 2 naming the option ---------------------

def test_output_to_a_folder(run_cli, tmp_path):
    ran = run_cli("check", str(DESIGN), "--format", "json", "--output", str(tmp_path))
    assert ran.status == 2
    assert ran.err == (f"vcheck: error: --output {tmp_path}: is a folder; name a file in it, "
                       f"e.g. {tmp_path}/vcheck-report\n")


def test_report_to_a_folder(run_cli, tmp_path):
    ran = run_cli("check", str(DESIGN), "--report", f"sarif={tmp_path}")
    assert ran.status == 2
    assert ran.err == (f"vcheck: error: --report sarif={tmp_path}: is a folder; name a file "
                       f"in it, e.g. {tmp_path}/vcheck-report\n")
    assert ran.out == ""  # refused before any work


@pytest.mark.skipif(not Path("/dev/full").exists(), reason="no /dev/full here")
@pytest.mark.parametrize("option", ["--output", "--report"])
def test_output_to_dev_full(run_cli, option):
    value = "/dev/full" if option == "--output" else "junit=/dev/full"
    ran = run_cli("check", str(DESIGN), option, value)
    assert ran.status == 2
    assert ran.err == (f"vcheck: error: {option} {value}: is not a regular file (a device, "
                       "FIFO or socket); name a file\n")


@pytest.mark.skipif(not Path("/dev/full").exists(), reason="no /dev/full here")
def test_a_write_that_fails_is_a_usage_error():
    # what happens when the disk fills between the check and the write
    with pytest.raises(UsageError) as caught:
        _write_file("--output /dev/full", Path("/dev/full"), "x" * 100_000)
    assert str(caught.value) == "--output /dev/full: cannot write the report: No space left on device"


@pytest.mark.skipif(not Path("/proc/version").exists(), reason="no /proc here")
@pytest.mark.parametrize("target", ["/proc/version", "/proc/vcheck-report.json"])
def test_output_to_proc(run_cli, target):
    ran = run_cli("check", str(DESIGN), "--output", target)
    assert ran.status == 2
    assert ran.err.startswith(f"vcheck: error: --output {target}: cannot be written (a system ")


@pytest.mark.skipif(os.geteuid() == 0, reason="root writes read-only files")
def test_output_to_a_read_only_file(run_cli, tmp_path):
    target = tmp_path / "locked.json"
    target.write_text("{}")
    target.chmod(0o444)
    ran = run_cli("check", str(DESIGN), "--output", str(target))
    assert ran.status == 2
    assert ran.err == (f"vcheck: error: --output {target}: cannot be written (a system file, "
                       "or no write permission)\n")


def test_output_in_a_missing_folder(run_cli, tmp_path):
    target = tmp_path / "no" / "r.json"
    ran = run_cli("merge", str(tmp_path / "x.json"), "--output", str(target))
    assert ran.status == 2
    assert ran.err == f"vcheck: error: --output {target}: the folder of the output file does not exist\n"


def test_schema_output_to_a_folder(run_cli, tmp_path):
    ran = run_cli("schema", "--output", str(tmp_path))
    assert ran.status == 2 and "is a folder" in ran.err


def test_dev_null_is_a_fine_output(run_cli):
    ran = run_cli("check", str(DESIGN), "--format", "json", "--output", "/dev/null")
    assert ran.status in (0, 1) and ran.out.startswith("vcheck ")


# -- the environment -------------------------------------------------------------------

@pytest.mark.parametrize("value", ["garbage", "2026-13-01", "\x1b[31m"])
def test_vcheck_today_garbage(run_cli, monkeypatch, value):
    monkeypatch.setenv("VCHECK_TODAY", value)
    ran = run_cli("check", str(DESIGN))
    assert ran.status == 2
    _no_traceback(ran)
    shown = value.replace("\x1b", "\\e")
    assert ran.err == (f"vcheck: error: VCHECK_TODAY={shown!r} is not a date; write it as "
                       "YYYY-MM-DD, e.g. VCHECK_TODAY=2026-03-01\n")


# -- --jobs ----------------------------------------------------------------------------

def test_jobs_capped_at_the_cores_with_a_note(run_cli, monkeypatch):
    import vcheck.cli

    monkeypatch.setattr(vcheck.cli, "_cores", lambda: 1)
    one = run_cli("check", str(EXAMPLE / "roof"))
    many = run_cli("check", str(EXAMPLE / "roof"), "--jobs", "60")
    assert many.err == "vcheck: note: --jobs 60 is more than the 1 core here; using 1\n"
    assert (many.status, many.out) == (one.status, one.out)


def test_jobs_within_the_cores_say_nothing(monkeypatch, capsys):
    import vcheck.cli

    monkeypatch.setattr(vcheck.cli, "_cores", lambda: 8)
    assert vcheck.cli._jobs(8) == 8 and vcheck.cli._jobs(0) == 8 and vcheck.cli._jobs(3) == 3
    assert capsys.readouterr().err == ""
    assert vcheck.cli._jobs(60) == 8


def test_negative_jobs(run_cli):
    ran = run_cli("check", str(DESIGN), "--jobs", "-2")
    assert ran.status == 2
    assert ran.err == ("vcheck: error: --jobs -2: give a number of processes from 1 up, or 0 "
                       "for one a core\n")


# -- an InputError from inside the engine ------------------------------------------------

RAISING_RULE = '''
from vcheck.design.problems import InputError, InputProblem
from vcheck.engine import Rule
from vcheck.findings import Source


class NamesACurve(Rule):
    """Reads a curve name the design gives; fails when ...; passes when ...."""

    id = "site-names-a-curve"
    title = "Names a curve"
    applies_to = "machine"
    sources = (Source("site note 1 (example)"),)

    def check(self, design, options):
        raise InputError([InputProblem(design.file, 4, 9, "machine.kind",
                                       "no S-N curve named 'BW:weld-9'; known: BW:weld-7")])
        yield


def register(registry):
    registry.add_rule(NamesACurve)
'''


def test_an_input_error_raised_in_a_rule_exits_2_located(run_cli, tmp_path):
    project = tmp_path / "site"
    (project / "my-rules").mkdir(parents=True)
    (project / "my-rules" / "curves.py").write_text(RAISING_RULE)
    (project / "vcheck.toml").write_text('local-rules = ["my-rules"]\n')
    shutil.copy(DESIGN, project / "ef-r1.toml")
    ran = run_cli("check", "ef-r1.toml", cwd=project)
    assert ran.status == 2
    _no_traceback(ran)
    assert ran.err == ("ef-r1.toml:4:9: machine.kind: no S-N curve named 'BW:weld-9'; "
                       "known: BW:weld-7\n")


def test_an_input_error_crosses_from_a_worker_process():
    error = InputError([InputProblem("a.toml", 2, 3, "k", "bad"),
                        InputProblem("a.toml", 1, 1, "", "worse")])
    copy = pickle.loads(pickle.dumps(error))
    assert copy.problems == error.problems and str(copy) == str(error)


# -- JSON of the wrong shape -------------------------------------------------------------

def _report(run_cli, tmp_path, *args, name="r.json") -> Path:
    path = tmp_path / name
    ran = run_cli("check", str(DESIGN), "--format", "json", "--output", str(path), *args)
    assert ran.status in (0, 1), ran.err
    return path


WRONG_SHAPES = [
    ("[]", "not a vcheck JSON report (no \"report\": \"vcheck\" at the top); write one with "
           "`vcheck check --format json`"),
    ('"vcheck"', "not a vcheck JSON report (no \"report\": \"vcheck\" at the top); write one "
                 "with `vcheck check --format json`"),
    ('{"report": "vcheck", "report-version": 9}',
     "a vcheck JSON report of version 9; this vcheck reads versions 1, 2, 3"),
    ('{"report": "vcheck", "report-version": true}',
     "a vcheck JSON report of version True; this vcheck reads versions 1, 2, 3"),
    ('{"report": "vcheck", "report-version": 2}',
     "not a vcheck JSON report of version 2: project: missing"),
    ('{"report": "vcheck", "report-version": 3}',
     "not a vcheck JSON report of version 3: project: missing"),
]


@pytest.mark.parametrize("command", ["merge", "base"])
@pytest.mark.parametrize("text,message", WRONG_SHAPES)
def test_json_of_the_wrong_shape(run_cli, tmp_path, command, text, message):
    bad = tmp_path / "bad.json"
    bad.write_text(text)
    args = (["merge", str(bad)] if command == "merge"
            else ["check", str(DESIGN), "--base-report", str(bad)])
    ran = run_cli(*args)
    assert ran.status == 2
    _no_traceback(ran)
    assert ran.err == f"{bad}:1:1: {message}\n"


@pytest.mark.parametrize("edit,message", [
    (lambda d: d["findings"][0].update(line="7"), "findings[1].line: expected a whole number from 1 up"),
    (lambda d: d["findings"][0].update(line=0), "findings[1].line: expected a whole number from 1 up"),
    (lambda d: d["findings"][0].pop("rule"), "findings[1].rule: missing"),
    (lambda d: d["findings"][0].update(status="great"),
     "findings[1].status: unknown status 'great'; known: pass, warn, fail, waived, error, "
     "not-checked"),
    (lambda d: d["findings"].__setitem__(0, "x"), "findings[1]: expected an object, got a string"),
    (lambda d: d.update(findings={}), "findings: expected an array, got an object"),
    (lambda d: d["findings"][0].update(measured={"name": "f", "value": "1", "unit": "Hz"}),
     "findings[1].measured.value: expected a finite number, got a string"),
    (lambda d: d["findings"][0].update(assumptions=[1]),
     "findings[1].assumptions[1]: expected a string, got a number"),
    (lambda d: d["rules"][0]["sources"].__setitem__(0, None),
     "rules[1].sources[1]: expected an object, got null"),
    (lambda d: d["result"].update({"fail-on-warn": "no"}),
     "result.fail-on-warn: expected true or false, got a string"),
    (lambda d: d.update(shard={"index": 3, "count": 2}), "shard: index 3 is more than the count 2"),
    (lambda d: d["input-problems"].append({"file": "a"}), "input-problems[1].line: missing"),
])
def test_a_report_with_one_bad_field_names_it(run_cli, tmp_path, edit, message):
    path = _report(run_cli, tmp_path)
    data = json.loads(path.read_text())
    edit(data)
    path.write_text(json.dumps(data))
    for args in (["merge", str(path)], ["check", str(DESIGN), "--base-report", str(path)]):
        ran = run_cli(*args)
        assert ran.status == 2
        assert ran.err == f"{path}:1:1: not a vcheck JSON report of version 3: {message}\n"


def test_a_report_that_is_not_a_file_or_too_deep(run_cli, tmp_path):
    ran = run_cli("merge", str(tmp_path))
    assert ran.status == 2
    assert ran.err == (f"{tmp_path}:1:1: cannot read report: not a regular file (a folder, "
                       "device or FIFO); name a JSON report file\n")
    deep = tmp_path / "deep.json"
    deep.write_text("[" * 100_000 + "]" * 100_000)
    ran = run_cli("merge", str(deep))
    assert ran.status == 2 and ran.err == f"{deep}:1:1: not a vcheck JSON report: it nests too deeply\n"
    huge = tmp_path / "int.json"
    huge.write_text('{"report": "vcheck", "report-version": ' + "9" * 10_000 + "}")
    ran = run_cli("merge", str(huge))
    assert ran.status == 2 and ran.err.startswith(f"{huge}:1:1: ")
    _no_traceback(ran)


def test_a_version_1_base_report_is_still_read(run_cli, tmp_path):
    path = _report(run_cli, tmp_path)
    data = json.loads(path.read_text())
    data["report-version"] = 1
    del data["project"], data["shard"]
    path.write_text(json.dumps(data))
    ran = run_cli("check", str(DESIGN), "--base-report", str(path))
    assert ran.status in (0, 1) and "Changes against base report" in ran.out


# -- merge: only the shards of one run ---------------------------------------------------

def _shards(run_cli, tmp_path, project: Path, count: int = 2, prefix: str = "s") -> list[Path]:
    paths = []
    for k in range(1, count + 1):
        path = tmp_path / f"{prefix}{k}.json"
        ran = run_cli("check", "--shard", f"{k}/{count}", "--format", "json", "--output",
                      str(path), cwd=project)
        assert ran.status in (0, 1, 2), ran.err
        paths.append(path)
    return paths


def _edit(path: Path, change) -> None:
    data = json.loads(path.read_text())
    change(data)
    path.write_text(json.dumps(data))


def test_shards_record_project_policy_and_shard(run_cli, tmp_path):
    one, two = _shards(run_cli, tmp_path, EXAMPLE)
    first, second = json.loads(one.read_text()), json.loads(two.read_text())
    assert first["report-version"] == 3
    assert first["project"]["name"] == "kestrel-yard"
    assert first["project"] == second["project"]
    assert len(first["project"]["policy-fingerprint"]) == 16
    assert (first["shard"], second["shard"]) == ({"index": 1, "count": 2},
                                                 {"index": 2, "count": 2})


def test_merge_refuses_two_versions(run_cli, tmp_path):
    one, two = _shards(run_cli, tmp_path, EXAMPLE)
    _edit(two, lambda d: d["tool"].update(version="0.0.1"))
    ran = run_cli("merge", str(one), str(two))
    assert ran.status == 2
    _no_traceback(ran)
    assert ran.err == (f"{one}:1:1: the reports come from different vcheck versions: 0.0.1 "
                       f"({two}); {vcheck.__version__} ({one}); merge only the shards of one run\n")


def test_merge_refuses_two_projects(run_cli, tmp_path):
    one, two = _shards(run_cli, tmp_path, EXAMPLE)
    _edit(two, lambda d: d["project"].update(name="other-yard"))
    ran = run_cli("merge", str(one), str(two))
    assert ran.status == 2
    assert ran.err == (f"{one}:1:1: the reports come from different projects: kestrel-yard "
                       f"({one}); other-yard ({two}); merge only the shards of one run\n")


def test_merge_refuses_two_policies(run_cli, tmp_path):
    # a real second policy: the same project folder name, one margin changed
    copy = tmp_path / "elsewhere" / "kestrel-yard"
    shutil.copytree(EXAMPLE, copy)
    policy = copy / "vcheck.toml"
    policy.write_text(policy.read_text().replace("required-margin = 0.20", "required-margin = 0.25"))
    one = _shards(run_cli, tmp_path, EXAMPLE, prefix="a")[0]
    two = _shards(run_cli, tmp_path, copy, prefix="b")[1]
    fingerprints = [json.loads(p.read_text())["project"]["policy-fingerprint"] for p in (one, two)]
    assert fingerprints[0] != fingerprints[1]
    ran = run_cli("merge", str(one), str(two))
    assert ran.status == 2
    assert ran.err.startswith(f"{one}:1:1: the reports come from different policies (policy "
                              "fingerprints): ")
    assert ran.err.endswith("; merge only the shards of one run\n")


def test_the_fingerprint_ignores_comments_and_layout(run_cli, tmp_path):
    copy = tmp_path / "kestrel-yard"
    shutil.copytree(EXAMPLE, copy)
    policy = copy / "vcheck.toml"
    policy.write_text("# reformatted\n\n" + policy.read_text().replace(" = ", "="))
    assert (json.loads(_shards(run_cli, tmp_path, copy, prefix="c")[0].read_text())["project"]
            == json.loads(_shards(run_cli, tmp_path, EXAMPLE, prefix="d")[0].read_text())["project"])


def test_merge_refuses_a_missing_or_repeated_shard(run_cli, tmp_path):
    one, two, three = _shards(run_cli, tmp_path, EXAMPLE, count=3)
    ran = run_cli("merge", str(one), str(three))
    assert ran.status == 2
    assert ran.err == (f"{one}:1:1: shard 2/3 missing: their design files would go unchecked "
                       "in the merged verdict\n")
    ran = run_cli("merge", str(one), str(two), str(three), str(two))
    assert ran.status == 2
    assert ran.err == f"{two}:1:1: shard 2/3 is given twice ({two}, {two})\n"


def test_merge_refuses_two_splits_or_a_whole_run(run_cli, tmp_path):
    half = _shards(run_cli, tmp_path, EXAMPLE, count=2, prefix="h")
    third = _shards(run_cli, tmp_path, EXAMPLE, count=3, prefix="t")
    ran = run_cli("merge", str(half[0]), str(third[1]))
    assert ran.status == 2
    assert ran.err == f"{half[0]}:1:1: the shards come from different splits: K/2, K/3\n"
    whole = tmp_path / "whole.json"
    run_cli("check", "--format", "json", "--output", str(whole), cwd=EXAMPLE)
    ran = run_cli("merge", str(whole), *map(str, half))
    assert ran.status == 2
    assert ran.err == (f"{whole}:1:1: a report of a whole run cannot be merged with shards: "
                       f"{whole} checked every design file\n")


def test_merge_refuses_version_1_shards(run_cli, tmp_path):
    one, two = _shards(run_cli, tmp_path, EXAMPLE)
    for path in (one, two):
        _edit(path, lambda d: (d.update({"report-version": 1}), d.pop("project"), d.pop("shard")))
    ran = run_cli("merge", str(one), str(two))
    assert ran.status == 2
    assert ran.err == (f"{one}:1:1: a report of version 1 has no project or policy fingerprint "
                       "to check; write the shards again with this vcheck\n")


def test_merge_refuses_shards_that_ran_other_rules(run_cli, tmp_path):
    one = _shards(run_cli, tmp_path, EXAMPLE, prefix="x")[0]
    two = tmp_path / "only.json"
    run_cli("check", "--shard", "2/2", "--only", "isolation-efficiency", "--format", "json",
            "--output", str(two), cwd=EXAMPLE)
    ran = run_cli("merge", str(one), str(two))
    assert ran.status == 2
    assert "the reports come from different rule sets: " in ran.err


# -- stdout and --uri-prefix -------------------------------------------------------------

@pytest.mark.skipif(not Path("/dev/full").exists(), reason="no /dev/full here")
def test_a_full_stdout_exits_2():
    import subprocess
    import sys

    with open("/dev/full", "w") as full:
        ran = subprocess.run([sys.executable, "-m", "vcheck", "check", str(DESIGN)],
                             stdout=full, stderr=subprocess.PIPE, text=True, timeout=120)
    assert ran.returncode == 2
    assert "Traceback" not in ran.stderr
    assert ran.stderr.startswith("vcheck: error: standard output: cannot write the report: "
                                 "No space left on device")


def test_a_uri_prefix_that_climbs_out(run_cli):
    ran = run_cli("check", str(DESIGN), "--format", "sarif", "--uri-prefix", "a/../../x")
    assert ran.status == 2
    assert ran.err == ("vcheck: error: --uri-prefix a/../../x: uri_prefix must be a path inside "
                       "the repository, relative to its root, such as 'plant/north'; got "
                       "'a/../../x'\n")


def test_shard_and_merged_reports_follow_the_schema(run_cli, tmp_path):
    from importlib.resources import files

    import jsonschema

    schema = json.loads(files("vcheck.report").joinpath("report.schema.json").read_text())
    from vcheck.report.json_report import REPORT_VERSION

    assert schema["properties"]["report-version"]["const"] == REPORT_VERSION
    assert schema["$id"].endswith(f"report-{REPORT_VERSION}.json")
    one, two = _shards(run_cli, tmp_path, EXAMPLE)
    for path in (one, two):
        jsonschema.validate(json.loads(path.read_text()), schema)
    merged = run_cli("merge", str(one), str(two), "--format", "json")
    data = json.loads(merged.out)
    jsonschema.validate(data, schema)
    assert data["shard"] is None and data["project"] == json.loads(one.read_text())["project"]


def test_merge_refuses_shards_with_two_fail_on_warn_settings(run_cli, tmp_path):
    one = _shards(run_cli, tmp_path, EXAMPLE, prefix="y")[0]
    two = tmp_path / "strict.json"
    run_cli("check", "--shard", "2/2", "--fail-on-warn", "--format", "json", "--output",
            str(two), cwd=EXAMPLE)
    ran = run_cli("merge", str(one), str(two))
    assert ran.status == 2
    assert ran.err == (f"{one}:1:1: the reports come from different fail-on-warn settings: "
                       f"fail-on-warn ({two}); warnings pass ({one}); merge only the shards "
                       "of one run\n")

"""The command line end to end on the bundled example: statuses, formats, determinism."""

from __future__ import annotations

import json
import math
import re
import subprocess
import sys
from importlib.resources import files

import jsonschema
import pytest
from support import EXAMPLE, REPO

import vcheck


def test_version(run_cli):
    ran = run_cli("--version")
    assert ran.status == 0
    assert ran.out.strip() == f"vcheck {vcheck.__version__}"


def test_version_imports_nothing_heavy():
    # `vcheck --version` must not pay for numpy, pydantic or pint (start-up budget).
    code = ("import sys; from vcheck.cli import main\n"
            "try:\n    main(['--version'])\nexcept SystemExit:\n    pass\n"
            "heavy = [m for m in ('numpy', 'pydantic', 'pint', 'scipy', 'rich') if m in sys.modules]\n"
            "print(heavy)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip().endswith("[]")


def test_version_command_imports_the_standard_library_alone():
    # The `vcheck` command's entry (vcheck.__main__:run) answers --version before the
    # command line module, argparse or anything outside the standard library is imported.
    code = ("import sys\nbefore = set(sys.modules)\nsys.argv = ['vcheck', '--version']\n"
            "import vcheck.__main__ as entry\nstatus = entry.run()\n"
            "new = sorted(set(sys.modules) - before)\n"
            "foreign = [m for m in new if m.split('.')[0] not in sys.stdlib_module_names\n"
            "           and m not in ('vcheck', 'vcheck.__main__')]\n"
            "print(status, foreign, 'argparse' in new, 'vcheck.cli' in new)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True)
    assert out.stdout.splitlines() == [f"vcheck {vcheck.__version__}", "0 [] False False"]


def test_version_command_entry_point_is_the_fast_path():
    # The console script is the fast path, and it hands every other command to the CLI.
    try:
        import tomllib
    except ModuleNotFoundError:  # Python 3.10
        import tomli as tomllib

    scripts = tomllib.loads((REPO / "pyproject.toml").read_text())["project"]["scripts"]
    assert scripts["vcheck"] == "vcheck.__main__:run"
    out = subprocess.run([sys.executable, "-c", "import sys; sys.argv = ['vcheck', 'bogus']\n"
                          "from vcheck.__main__ import run; sys.exit(run())"],
                         capture_output=True, text=True)
    assert out.returncode == 2 and "invalid choice: 'bogus'" in out.stderr


def test_example_shows_pass_warn_fail_with_numbers_limits_and_sources(run_cli):
    ran = run_cli("check", str(EXAMPLE))
    assert ran.status == 1  # two designs fail on purpose
    out = ran.out
    flat = " ".join(out.split())
    for status in ("PASS", "WARN", "FAIL"):
        assert re.search(rf"^  {status}  frequency-separation \(line \d+", out, re.M), status
    # a design's not-checked findings are one paragraph: "NOT CHECKED: rule (line N): why; ..."
    folded = re.findall(r"^  NOT CHECKED: .*(?:\n    .*)*", out, re.M)
    assert any("frequency-separation (line" in " ".join(p.split()) for p in folded)
    assert "roof/ef-r1.toml  EF-R1 (fan)" in out
    assert "is 11.3% below 1x running speed 4.50-19.2 Hz" in flat
    assert "limit: required separation 20.0%" in flat
    assert "Sources of the limits" in out and "[from memory]" in out
    assert "result    FAIL (exit status 1)" in out
    assert "engineer of record decide" in flat
    assert "\x1b[" not in out  # no colour codes, ever
    # every line within the width but a table's rows (cells joined by two spaces)
    assert max(len(line) for line in out.splitlines()
               if not (line.startswith(" " * 6) and "  " in line.strip())) <= 96


def test_report_is_byte_identical_across_runs(run_cli):
    first = run_cli("check", str(EXAMPLE)).out
    second = run_cli("check", str(EXAMPLE)).out
    assert first == second
    assert run_cli("check", str(EXAMPLE), "--format", "json").out == \
        run_cli("check", str(EXAMPLE), "--format", "json").out


def test_json_on_stdout_validates_against_its_schema(run_cli):
    ran = run_cli("check", str(EXAMPLE), "--format", "json")
    assert ran.status == 1
    report = json.loads(ran.out)
    schema = json.loads(files("vcheck.report").joinpath("report.schema.json").read_text())
    jsonschema.validate(report, schema, cls=jsonschema.Draft202012Validator)
    assert report["result"]["counts"] == {
        "pass": 64, "warn": 35, "fail": 25, "waived": 0, "error": 0, "not-checked": 66}
    failing = {(f["target"], f["rule"]) for f in report["findings"] if f["status"] == "fail"}
    # The example fails on purpose, each for a reason its design file explains.
    assert failing == {
        ("AHU-R2", "isolation-efficiency"), ("AHU-R2", "isolator-static-deflection"),
        ("BP-B11", "frequency-separation"),  # a motor-frame mode in its drive's forcing
        ("CHWP-3A", "isolator-static-deflection"), ("CHWP-3B", "isolator-static-deflection"),
        # 6 mm pads under a rotary compressor, below the 0.25 in (6.35 mm) of the table's row
        ("CMP-B1", "isolator-static-deflection"), ("CMP-B7", "isolator-static-deflection"),
        ("CT-R1", "frequency-separation"),
        ("EF-R1", "frequency-separation"), ("EF-R1", "isolation-efficiency"),
        ("EF-R1", "isolator-static-deflection"),
        ("EF-R1", "isolation-resonance-passage"),  # its drive can run 11% above the bounce
        ("EF-R1", "kestrel-roof-steel-modes"),  # the site's local rule
        ("GEN-B8", "fatigue-damage"),
        ("GEN-B11", "torsional-separation"),  # its coupling puts mode 1 on firing order 3
        ("RC-B4", "joint-bolt-yield"),  # frame bolts (slip now warns) and guard brackets
        ("RC-B9", "joint-slip"),  # the crank primary force across the hold-downs
        # table torques read at the low end of the default friction band (VDI 2230 class B)
        ("RC-B9", "joint-bolt-yield"), ("SF-3D", "joint-bolt-yield"),
        ("SF-R3", "frequency-separation"), ("SF-R3", "isolation-efficiency"),
        ("SF-R3", "isolator-static-deflection"), ("SF-R3", "kestrel-roof-steel-modes"),
        ("SF-R3", "isolation-resonance-passage"),  # its drive can run 9% above the bounce
    }
    ef = next(f for f in report["findings"]
              if f["target"] == "EF-R1" and f["rule"] == "frequency-separation")
    assert ef["file"] == "roof/ef-r1.toml" and ef["line"] == 15 and ef["key-path"] == "mounting.stiffness"
    # Hand calculation: stiffest isolators (60 kN/m +10%, four of them) under 420 kg give
    # f = sqrt(4 * 66e3 / 420) / (2 pi) = 3.990 Hz against 270 rpm = 4.5 Hz.
    f_high = math.sqrt(4 * 66e3 / 420) / (2 * math.pi)
    assert ef["measured"]["value"] == pytest.approx((4.5 - f_high) / 4.5, abs=1e-6)
    assert len({f["fingerprint"] for f in report["findings"]}) == len(report["findings"])


def test_margins_say_clear_or_beyond_as_the_schema_defines(run_cli):
    # report.schema.json: "margin" is the distance from the limit, positive when clear of
    # it, negative when beyond it. A pass beyond its own limit, or a failure clear of it,
    # would mean the finding cites a limit its verdict did not rest on (a baseline
    # comparison would also call a better margin worse).
    report = json.loads(run_cli("check", str(EXAMPLE), "--format", "json").out)
    judged = [f for f in report["findings"] if f.get("margin") is not None]
    assert len(judged) > 80
    wrong = [(f["target"], f["rule"], f["margin"]) for f in judged
             if (f["status"] == "pass" and f["margin"] < 0)
             or (f["status"] == "fail" and f["margin"] > 0)]
    assert wrong == []


def test_schema_rejects_a_broken_report(run_cli):
    # The schema must be able to fail: drop a required field of a finding.
    report = json.loads(run_cli("check", str(EXAMPLE), "--format", "json").out)
    del report["findings"][0]["sources"]
    schema = json.loads(files("vcheck.report").joinpath("report.schema.json").read_text())
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate(report, schema, cls=jsonschema.Draft202012Validator)


def test_output_file_and_text_on_stdout(run_cli, tmp_path):
    target = tmp_path / "report.json"
    ran = run_cli("check", str(EXAMPLE), "--format", "json", "--output", str(target))
    assert ran.status == 1
    assert json.loads(target.read_text())["report"] == "vcheck"
    assert ran.out.startswith("vcheck ")


def test_output_in_missing_folder(run_cli, tmp_path):
    ran = run_cli("check", str(EXAMPLE), "--output", str(tmp_path / "no" / "r.json"))
    assert ran.status == 2
    assert "the folder of the output file" in ran.err and "does not exist" in ran.err


def test_fail_on_warn(run_cli):
    design = str(EXAMPLE / "roof" / "ahu-r2.toml")
    ran = run_cli("check", design, "--only", "frequency-separation")
    assert ran.status == 0 and "WARN" in ran.out
    ran = run_cli("check", design, "--only", "frequency-separation", "--fail-on-warn")
    assert ran.status == 1


def test_only_runs_the_named_rules(run_cli):
    report = json.loads(run_cli("check", str(EXAMPLE), "--only", "frequency-separation",
                                "--format", "json").out)
    assert {f["rule"] for f in report["findings"]} == {"frequency-separation"}
    ran = run_cli("check", str(EXAMPLE), "--only", "frequency-separaton")
    assert ran.status == 2
    assert ran.err.strip() == ("--only:1:1: unknown rule 'frequency-separaton'; did you mean "
                               "'frequency-separation'?")


def test_default_paths_from_policy(run_cli):
    ran = run_cli("check", cwd=EXAMPLE)
    assert ran.status == 1
    assert "designs read: 24" in ran.out  # every design file, not the structure file


def test_rules_listing(run_cli):
    ran = run_cli("rules")
    assert ran.status == 0
    assert "\nfrequency-separation  Natural frequencies clear of forcing frequencies\n" in ran.out
    assert "origin: built-in" in ran.out and "required-margin = 0.2" in ran.out


def test_usage_error_exits_2(run_cli):
    ran = run_cli("check", "--format", "pdf")
    assert ran.status == 2
    assert "invalid choice: 'pdf'" in ran.err


def test_policy_errors_are_located(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text(
        'pahts = ["a"]\n[rules.frequency-separaton]\nrequired-margin = 0.2\n'
        '[rules.frequency-separation]\nrequired-margin = 1.5\nwarn-margn = 0.3\n')
    (tmp_path / "d.toml").write_text((EXAMPLE / "roof" / "ahu-r2.toml").read_text())
    ran = run_cli("check", "d.toml", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == [
        "vcheck.toml:1:1: pahts: unknown key 'pahts'; did you mean 'paths'?",
    ]
    (tmp_path / "vcheck.toml").write_text(
        '[rules.frequency-separaton]\nrequired-margin = 0.2\n'
        '[rules.frequency-separation]\nrequired-margin = 1.5\nwarn-margn = 0.3\n')
    ran = run_cli("check", "d.toml", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == [
        "vcheck.toml:1:1: rules.frequency-separaton: unknown rule 'frequency-separaton'; "
        "did you mean 'frequency-separation'?",
        "vcheck.toml:4:19: rules.frequency-separation.required-margin: should be less than 1, got 1.5",
        "vcheck.toml:5:1: rules.frequency-separation.warn-margn: unknown option 'warn-margn'; "
        "did you mean 'warn-margin'?",
    ]


def test_policy_in_pyproject(run_cli, tmp_path):
    (tmp_path / "pyproject.toml").write_text(
        '[project]\nname = "plant"\n[tool.vcheck.rules.frequency-separation]\n'
        'required-margin = 0.3\nwarn-margin = 0.4\n')
    (tmp_path / "d.toml").write_text((EXAMPLE / "roof" / "ahu-r2.toml").read_text())
    ran = run_cli("check", "d.toml", cwd=tmp_path)
    assert ran.status == 1  # 28.1% separation fails a 30% requirement
    assert "policy: pyproject.toml" in ran.out


def test_disabled_rule_runs_nothing(run_cli, tmp_path):
    (tmp_path / "d.toml").write_text((EXAMPLE / "roof" / "ef-r1.toml").read_text())
    (tmp_path / "vcheck.toml").write_text("")
    report = json.loads(run_cli("check", "d.toml", "--format", "json", cwd=tmp_path).out)
    assert any(f["rule"] == "frequency-separation" and f["status"] == "fail"
               for f in report["findings"])
    (tmp_path / "vcheck.toml").write_text('[rules.frequency-separation]\nenabled = false\n')
    report = json.loads(run_cli("check", "d.toml", "--format", "json", cwd=tmp_path).out)
    assert "frequency-separation" not in {rule["id"] for rule in report["rules"]}
    assert all(f["rule"] != "frequency-separation" for f in report["findings"])


def test_module_entry_point_runs():
    out = subprocess.run([sys.executable, "-m", "vcheck", "--version"], capture_output=True,
                         text=True, cwd=REPO, check=True)
    assert out.stdout.strip() == f"vcheck {vcheck.__version__}"


def test_dynamics_command_shows_modes_without_verdict(run_cli):
    ran = run_cli("dynamics", str(EXAMPLE / "plant"))
    assert ran.status == 0
    assert "plant/level-3/chwp-3b.toml  CHWP-3B (centrifugal-pump), running 1480 rpm" in ran.out
    assert "isolation mode 3, bounce" in ran.out
    assert "deck 3 bay C: deck bay C torsion" in ran.out  # the shared structure's CSV mode
    assert "bearing pump drive end, cage" in ran.out  # shown here, though not judged
    assert "PASS" not in ran.out and "FAIL" not in ran.out
    assert ran.out.rstrip().endswith("judges these numbers against the rules.")


def test_shared_structure_modes_are_judged_for_each_machine(run_cli):
    report = json.loads(run_cli("check", str(EXAMPLE / "plant"), "--format", "json").out)
    by_tag = {f["target"]: f for f in report["findings"] if f["rule"] == "frequency-separation"}
    # deck torsion at 10.9 Hz: 27.3% below CHWP-3A's lowest 1x (900 rpm = 15 Hz) -> warn
    assert by_tag["CHWP-3A"]["status"] == "warn"
    assert by_tag["CHWP-3A"]["message"].startswith("deck 3 bay C: deck bay C torsion at 10.9 Hz")
    assert by_tag["CHWP-3A"]["key-path"] == "support.structure"
    assert by_tag["CHWP-3B"]["status"] == "pass"


def test_hide_passing_keeps_the_counts(run_cli):
    full = run_cli("check", str(EXAMPLE)).out
    brief = run_cli("check", str(EXAMPLE), "--hide-passing").out
    assert "  PASS " in full and "  PASS " not in brief
    summary = [line for line in full.splitlines() if line.startswith("  findings")]
    assert summary == [line for line in brief.splitlines() if line.startswith("  findings")]
    assert "FAIL" in brief and len(brief) < len(full)


def test_checking_the_example_does_not_import_slow_scipy_parts():
    # Start-up budget (benchmarks/bench_startup.py): scipy.optimize and scipy.integrate
    # cost 0.3-0.45 s to import here, more than the whole check; the checking path uses
    # vcheck.dynamics.roots and numpy quadrature instead. numpy.ma (which np.unique pulls
    # in) and numpy.polynomial (leggauss) are kept off it too.
    code = ("import sys, io, contextlib; from vcheck.cli import main\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            f"    main(['check', {str(EXAMPLE)!r}])\n"
            "print(sorted(m for m in ('scipy.optimize', 'scipy.integrate', 'scipy.signal',"
            " 'numpy.ma', 'numpy.polynomial') if m in sys.modules))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         cwd=REPO, check=True)
    assert out.stdout.strip().endswith("[]")


def test_lumped_model_in_the_example_against_its_closed_form(run_cli):
    # AHU-R4's roof bay (8000 kg on 60 MN/m) and platform (1000 kg on 160 MN/m): the 2x2
    # eigenproblem has the closed form omega^2 = (b -+ sqrt(b^2 - 4 c)) / 2 with
    # b = (k1 + k2)/m1 + k2/m2 and c = k1 k2 / (m1 m2).
    m1, k1, m2, k2 = 8000.0, 60e6, 1000.0, 160e6
    b, c = (k1 + k2) / m1 + k2 / m2, k1 * k2 / (m1 * m2)
    expected = [math.sqrt((b + s * math.sqrt(b * b - 4 * c)) / 2) / (2 * math.pi) for s in (-1, 1)]
    ran = run_cli("dynamics", str(EXAMPLE / "roof" / "ahu-r4.toml"))
    for n, frequency in enumerate(expected, 1):
        (line,) = [x for x in ran.out.splitlines()
                   if f"AHU platform, mode {n} " in x and x.endswith("lumped model of 2 masses")]
        assert float(line.split()[0]) == pytest.approx(frequency, abs=0.05)  # printed to 0.1 Hz

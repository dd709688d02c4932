"""Accepted deviations (waivers) and per-folder policy, end to end through the CLI."""

from __future__ import annotations

import json

import pytest
from support import EXAMPLE

WAIVER = '''
[[waiver]]
rule = "frequency-separation"
target = "CT-R1"
reason = "frame stiffening under design, structural change note SCN-14"
approved-by = "engineer of record, Kestrel Yard"
expires = {expires}
'''


def _project(tmp_path, policy: str):
    (tmp_path / "vcheck.toml").write_text(policy)
    (tmp_path / "roof").mkdir()
    for name in ("ct-r1.toml", "ahu-r2.toml"):
        (tmp_path / "roof" / name).write_text((EXAMPLE / "roof" / name).read_text())
    return tmp_path


@pytest.fixture(autouse=True)
def fixed_day(monkeypatch):
    monkeypatch.setenv("VCHECK_TODAY", "2027-01-15")


def _findings(ran):
    return {(f["rule"], f["target"]): f for f in json.loads(ran.out)["findings"]}


def test_waiver_turns_a_failure_into_waived(run_cli, tmp_path):
    project = _project(tmp_path, WAIVER.format(expires="2027-06-30"))
    ran = run_cli("check", "roof", "--format", "json", "--only", "frequency-separation",
                  cwd=project)
    assert ran.status == 0  # the only separation failure is waived; AHU-R2 only warns
    waived = _findings(ran)[("frequency-separation", "CT-R1")]
    assert waived["status"] == "waived"
    assert waived["waiver"] == {
        "reason": "frame stiffening under design, structural change note SCN-14",
        "approved-by": "engineer of record, Kestrel Yard",
        "expires": "2027-06-30", "original-status": "fail"}
    text = run_cli("check", "roof", cwd=project).out
    assert "WAIVED" in text and "waived: frame stiffening under design" in " ".join(text.split())


def test_expired_waiver_fails(run_cli, tmp_path):
    project = _project(tmp_path, WAIVER.format(expires="2027-01-14"))
    ran = run_cli("check", "roof", "--format", "json", cwd=project)
    assert ran.status == 1
    found = _findings(ran)
    assert found[("frequency-separation", "CT-R1")]["status"] == "fail"
    expired = found[("policy-waiver", "CT-R1")]
    assert expired["status"] == "fail"
    assert expired["file"] == "vcheck.toml" and expired["line"] == 2
    assert expired["message"].startswith("the waiver of frequency-separation on CT-R1 expired "
                                         "on 2027-01-14")


def test_waiver_on_its_last_day_still_holds(run_cli, tmp_path):
    project = _project(tmp_path, WAIVER.format(expires="2027-01-15"))
    ran = run_cli("check", "roof", "--format", "json", cwd=project)
    assert _findings(ran)[("frequency-separation", "CT-R1")]["status"] == "waived"


def test_stale_waiver_warns(run_cli, tmp_path):
    project = _project(tmp_path, WAIVER.format(expires="2027-06-30").replace("CT-R1", "CT-R9"))
    ran = run_cli("check", "--format", "json", cwd=project)  # the whole project
    stale = _findings(ran)[("policy-waiver", "CT-R9")]
    assert stale["status"] == "warn"
    assert "matches no finding; it has gone stale" in stale["message"]
    # A run of one folder cannot tell whether a waiver for a machine elsewhere is stale.
    ran = run_cli("check", "roof", "--format", "json", cwd=project)
    assert ("policy-waiver", "CT-R9") not in _findings(ran)


@pytest.mark.parametrize(
    ("policy", "message"),
    [
        ('[[waiver]]\nrule = "frequency-separation"\ntarget = "CT-R1"\n'
         'approved-by = "x"\nexpires = 2027-06-30\n',
         "vcheck.toml:1:1: waiver[1]: a waiver needs 'reason' (why the deviation is accepted)"),
        ('[[waiver]]\nrule = "frequency-separation"\ntarget = "CT-R1"\nreason = "r"\n'
         'approved-by = "x"\n',
         "vcheck.toml:1:1: waiver[1]: a waiver needs 'expires' (a date such as 2027-03-31, "
         "without quotes)"),
        ('[[waiver]]\nrule = "frequency-separation"\ntarget = "CT-R1"\nreason = "r"\n'
         'approved-by = "x"\nexpires = "30/06/2027"\n',
         "vcheck.toml:6:11: waiver[1].expires: expires = '30/06/2027' is not a date; write a "
         "TOML date such as 2027-03-31 (no quotes, no time)"),
        ('[[waiver]]\nrule = "frequency-separaton"\ntarget = "CT-R1"\nreason = "r"\n'
         'approved-by = "x"\nexpires = 2027-06-30\n',
         "vcheck.toml:2:8: waiver[1].rule: unknown rule 'frequency-separaton'; did you mean "
         "'frequency-separation'?"),
        ('[[waiver]]\nrule = "frequency-separation"\ntarget = "CT-R1"\nreason = "r"\n'
         'approved-by = "x"\nexpires = 2027-13-30\n',
         "vcheck.toml:6:"),
    ],
)
def test_bad_waivers_are_located(run_cli, tmp_path, policy, message):
    project = _project(tmp_path, policy)
    ran = run_cli("check", "roof", cwd=project)
    assert ran.status == 2
    assert ran.err.strip().startswith(message), ran.err


FOLDER = '''
[rules.frequency-separation]
required-margin = 0.20

[[folder]]
path = "roof"

[folder.rules.frequency-separation]
required-margin = 0.29      # the roof steel is lively: the client asks for more
'''


def test_folder_policy_tightens_and_is_named(run_cli, tmp_path):
    project = _project(tmp_path, FOLDER)
    (project / "basement").mkdir()
    (project / "basement" / "ahu-r2.toml").write_text(
        (EXAMPLE / "roof" / "ahu-r2.toml").read_text().replace("AHU-R2", "AHU-B2"))
    ran = run_cli("check", ".", "--format", "json", cwd=project)
    found = _findings(ran)
    # AHU-R2 has 28.1% separation: a warning under 20%, a failure under the roof's 29%.
    assert found[("frequency-separation", "AHU-R2")]["status"] == "fail"
    assert found[("frequency-separation", "AHU-R2")]["policy"] == "vcheck.toml [[folder]] roof"
    assert found[("frequency-separation", "AHU-B2")]["status"] == "warn"
    assert found[("frequency-separation", "AHU-B2")]["policy"] == "vcheck.toml"
    text = run_cli("check", ".", cwd=project).out
    assert "policy: vcheck.toml [[folder]] roof" in " ".join(text.split())


def test_folder_policy_errors_are_located(run_cli, tmp_path):
    project = _project(tmp_path, FOLDER.replace("required-margin = 0.29", "required-margn = 0.29"))
    ran = run_cli("check", "roof", cwd=project)
    assert ran.status == 2
    assert ran.err.strip() == ("vcheck.toml:9:1: folder[1].rules.frequency-separation."
                               "required-margn: unknown option 'required-margn'; did you mean "
                               "'required-margin'?")


def test_not_applicable_silent_leaves_out_a_rules_not_checked_findings(run_cli, tmp_path):
    import shutil

    shutil.copytree(EXAMPLE / "roof", tmp_path / "roof")
    shutil.copytree(EXAMPLE / "structures", tmp_path / "structures")
    (tmp_path / "vcheck.toml").write_text('paths = ["roof"]\n')
    loud = json.loads(run_cli("check", "--format", "json", cwd=tmp_path).out)
    slip = [f for f in loud["findings"] if f["rule"] == "joint-slip" and f["status"] == "not-checked"]
    assert slip  # the roof designs have no joints
    (tmp_path / "vcheck.toml").write_text(
        'paths = ["roof"]\n[rules.joint-slip]\nnot-applicable = "silent"\n')
    quiet = json.loads(run_cli("check", "--format", "json", cwd=tmp_path).out)
    assert not [f for f in quiet["findings"]
                if f["rule"] == "joint-slip" and f["status"] == "not-checked"]
    others = [f for f in quiet["findings"] if f["rule"] != "joint-slip"]
    assert len(others) == len([f for f in loud["findings"] if f["rule"] != "joint-slip"])


def test_not_applicable_takes_report_or_silent(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text('[rules.joint-slip]\nnot-applicable = "quiet"\n')
    ran = run_cli("check", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == ("vcheck.toml:2:18: rules.joint-slip.not-applicable: "
                               "'not-applicable' must be \"report\" or \"silent\", got 'quiet'")


def test_a_policy_can_make_a_missing_support_an_input_error(run_cli, tmp_path):
    # without the policy key, a design without [support] warns (the rules ask for it);
    # with require-support = true it is a located input error, exit 2
    (tmp_path / "p.toml").write_text(
        'format = 1\n[machine]\ntag = "P-7"\nkind = "centrifugal-pump"\nmass = "310 kg"\n'
        'speed = "1475 rpm"\n[mounting]\nkind = "spring"\nisolators = 4\n'
        'stiffness = "90 kN/m +-10%"\n')
    (tmp_path / "vcheck.toml").write_text("")
    ran = run_cli("check", "p.toml", "--format", "json", cwd=tmp_path)
    assert ran.status in (0, 1)
    assert any(f["status"] == "warn" and "[support] not given" in f["message"]
               for f in json.loads(ran.out)["findings"])
    (tmp_path / "vcheck.toml").write_text("require-support = true\n")
    ran = run_cli("check", "p.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == (
        'p.toml:2:1: machine: no [support]: the project policy requires one (require-support '
        '= true); give [support] with kind (e.g. "slab-on-grade" or "suspended-floor") and '
        'span, or support.structure')

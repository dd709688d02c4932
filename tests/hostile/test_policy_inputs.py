"""Policy and reference inputs that used to be ignored or crash: each a located error.

Tables keyed by machine or support kind are checked like every other enumeration
(vcheck.design.models.MachineKind and SupportKind), with a did-you-mean; an S-N curve
name that no published family and no plugin knows is a design error (exit 2), not a
rule that broke (exit 3).
"""

from __future__ import annotations

from support import EXAMPLE

MACHINES = ("centrifugal-pump, fan, compressor, reciprocating-compressor, motor, engine, "
            "generator-set, chiller, cooling-tower, air-handler, other")
SUPPORTS = "slab-on-grade, suspended-floor, roof, steel-frame, skid, foundation-block"

DESIGN = """\
format = 1

[machine]
tag = "T-1"
kind = "fan"
mass = "300 kg"
speed = "1480 rpm"
"""


def _project(tmp_path, policy: str, design: str = DESIGN):
    (tmp_path / "vcheck.toml").write_text(policy)
    (tmp_path / "d.toml").write_text(design)
    return tmp_path


def test_margin_by_machine_key_is_checked(run_cli, tmp_path):
    project = _project(tmp_path, "[rules.frequency-separation]\n"
                       "margin-by-machine = { centrifugal_pump = 0.25 }\n")
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert ran.err.strip() == (
        "vcheck.toml:2:23: rules.frequency-separation.margin-by-machine.centrifugal_pump: "
        "unknown key 'centrifugal_pump'; did you mean 'centrifugal-pump'? (known: "
        f"{MACHINES})")


def test_margin_by_support_key_is_checked(run_cli, tmp_path):
    project = _project(tmp_path, "[rules.frequency-separation]\n"
                       "margin-by-support = { rooof = 0.25 }\n")
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert ran.err.strip() == (
        "vcheck.toml:2:23: rules.frequency-separation.margin-by-support.rooof: unknown key "
        f"'rooof'; did you mean 'roof'? (known: {SUPPORTS})")


def test_a_folder_policy_table_by_kind_is_checked_too(run_cli, tmp_path):
    project = _project(tmp_path, '[[folder]]\npath = "."\n\n'
                       "[folder.rules.frequency-separation]\n"
                       "margin-by-support = { steel_frame = 0.25 }\n")
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert ran.err.strip() == (
        "vcheck.toml:5:23: folder[1].rules.frequency-separation.margin-by-support.steel_frame: "
        f"unknown key 'steel_frame'; did you mean 'steel-frame'? (known: {SUPPORTS})")


def test_a_valid_table_by_kind_still_applies(run_cli, tmp_path):
    # the stricter margin of the table is the one the finding names
    project = _project(tmp_path, "[rules.frequency-separation]\n"
                       "margin-by-machine = { fan = 0.25 }\nwarn-margin = 0.3\n",
                       DESIGN + '\n[[natural-frequency]]\nname = "frame"\n'
                       'frequency = "29 Hz"\n')
    ran = run_cli("check", "d.toml", cwd=project)
    assert ran.status in (0, 1), ran.err
    assert "margin-by-machine.fan" in ran.out


def test_unknown_plugin_style_curve_is_a_located_design_error(run_cli, tmp_path):
    project = _project(tmp_path, "", DESIGN + '\n[[fatigue]]\nname = "bracket"\n'
                       'detail = "ACME:weld-7"\nlife = { years = 20 }\n\n'
                       '[[fatigue.block]]\nname = "run"\nstress-range = "10 MPa"\n'
                       'order = "1x"\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert ran.err.strip() == (
        "d.toml:11:1: fatigue[1].detail: S-N curve 'ACME:weld-7' is not a published curve and "
        "no plugin contributes it (curves from plugins: none; published names look like "
        "'EN 1993-1-9:71', 'IIW:FAT90', 'DNV-RP-C203:D')")


def test_missing_local_rules_folder_is_located(run_cli, tmp_path):
    project = _project(tmp_path, 'paths = ["."]\nlocal-rules = ["rules-here"]\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert ran.err.strip() == (
        "vcheck.toml:2:16: local-rules[1]: local rules folder 'rules-here' does not exist "
        f"(looked for {project.resolve().as_posix()}/rules-here)")


def test_rules_listing_shows_real_defaults(run_cli):
    ran = run_cli("rules", cwd=EXAMPLE)
    assert ran.status == 0
    assert "PydanticUndefined" not in ran.out
    assert "margin-by-machine = {}: Required separation by machine kind" in ran.out

"""Company rules as plugins: an installed package through its entry point, and a local
folder named in the project policy; and every way a plugin can be broken."""

from __future__ import annotations

import json
import os
import subprocess
import sys
import textwrap

import pytest
from support import EXAMPLE, REPO

PLUGIN = REPO / "examples" / "brackwater-rules"


@pytest.fixture(scope="module")
def plugin_site(tmp_path_factory):
    """The example plugin installed (not editable) into a folder of its own."""
    target = tmp_path_factory.mktemp("plugin-site")
    subprocess.run(
        [sys.executable, "-m", "pip", "install", "-q", "--no-deps", "--no-build-isolation",
         "--target", str(target), str(PLUGIN)],
        check=True, capture_output=True, text=True)
    return target


def _vcheck(args, site=None, cwd=REPO):
    env = dict(os.environ)
    if site is not None:
        env["PYTHONPATH"] = str(site)
    return subprocess.run([sys.executable, "-m", "vcheck", *args], cwd=cwd, env=env,
                          capture_output=True, text=True)


def test_installed_plugin_is_listed_with_its_origin(plugin_site):
    ran = _vcheck(["rules"], plugin_site)
    assert ran.returncode == 0, ran.stderr
    assert "brackwater-roof-restraint  Restrained isolators on roofs" in ran.stdout
    assert "origin: package brackwater-vcheck-rules 1.0.0" in ran.stdout
    assert "frequency-separation  Natural frequencies clear" in ran.stdout


def test_installed_plugin_judges_the_example(plugin_site):
    ran = _vcheck(["check", str(EXAMPLE), "--format", "json"], plugin_site)
    report = json.loads(ran.stdout)
    by = {(f["rule"], f["target"]): f for f in report["findings"]}
    # EF-R1 stands on free-standing springs on the roof: the company rule fails it.
    assert by[("brackwater-roof-restraint", "EF-R1")]["status"] == "fail"
    # CMP-B1 is on pads and runs at 2980 rpm: accepted.
    assert by[("brackwater-elastomer-low-speed", "CMP-B1")]["status"] == "pass"
    # CHWP-3A on a suspended floor: 4 x 120 kN/m +10% under 1540 kg -> 2.95 Hz <= 5 Hz
    assert by[("brackwater-floor-isolation-frequency", "CHWP-3A")]["status"] == "pass"


def test_plugin_own_tests_pass_with_the_shipped_harness(plugin_site):
    env = dict(os.environ, PYTHONPATH=str(plugin_site))
    ran = subprocess.run([sys.executable, "-m", "pytest", "-q", "-p", "no:cacheprovider",
                          str(PLUGIN / "tests")], cwd=PLUGIN, env=env,
                         capture_output=True, text=True)
    assert ran.returncode == 0, ran.stdout + ran.stderr
    assert "8 passed" in ran.stdout


def test_explain_prints_a_plugin_rule(plugin_site):
    ran = _vcheck(["explain", "brackwater-elastomer-low-speed"], plugin_site)
    assert ran.returncode == 0
    assert "origin: package brackwater-vcheck-rules 1.0.0" in ran.stdout
    assert "minimum-speed = 900" in ran.stdout


LOCAL_RULE = '''
from vcheck.engine import Rule
from vcheck.findings import Source, Status


class TagPrefix(Rule):
    """Equipment tags start with the site's prefix.

    Fails when the tag does not start with "KY-"; passes when it does.
    """

    id = "site-tag-prefix"
    title = "Site tag prefix"
    applies_to = "machine"
    sources = (Source("site tagging convention (example)", "common practice"),)

    def check(self, design, options):
        ok = design.machine.tag.startswith("KY-")
        yield self.finding(design, ("machine", "tag"), Status.PASS if ok else Status.FAIL,
                           f"tag {design.machine.tag!r}")


def register(registry):
    registry.add_rule(TagPrefix)
'''


def _project(tmp_path, module_text, folder="site-rules"):
    (tmp_path / "vcheck.toml").write_text(f'local-rules = ["{folder}"]\n')
    if module_text is not None:
        (tmp_path / folder).mkdir()
        (tmp_path / folder / "site.py").write_text(textwrap.dedent(module_text))
    (tmp_path / "d.toml").write_text((EXAMPLE / "roof" / "ahu-r2.toml").read_text())
    return tmp_path


def test_local_folder_rules_run(run_cli, tmp_path):
    project = _project(tmp_path, LOCAL_RULE)
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    report = json.loads(ran.out)
    statuses = {f["rule"]: f["status"] for f in report["findings"]}
    assert statuses["site-tag-prefix"] == "fail"  # AHU-R2 lacks the prefix
    assert ran.status == 1
    listing = run_cli("rules", cwd=project)
    assert "origin: local folder site-rules (site.py)" in listing.out


def test_local_folder_missing(run_cli, tmp_path):
    project = _project(tmp_path, None)
    ran = run_cli("check", "d.toml", cwd=project)
    assert ran.status == 2
    assert ran.err.strip() == (
        "vcheck.toml:1:16: local-rules[1]: local rules folder 'site-rules' does not exist "
        f"(looked for {project.resolve().as_posix()}/site-rules)")


def test_local_module_with_a_syntax_error(run_cli, tmp_path):
    project = _project(tmp_path, "def register(registry)\n    pass\n")
    ran = run_cli("check", "d.toml", cwd=project)
    assert ran.status == 2
    assert ran.err.strip().startswith(
        "vcheck: plugin error: local folder site-rules: site-rules/site.py failed to import: "
        "SyntaxError at site.py:1:")


def test_local_rule_with_a_bad_id(run_cli, tmp_path):
    project = _project(tmp_path, LOCAL_RULE.replace('"site-tag-prefix"', '"Site_Tag"'))
    ran = run_cli("check", "d.toml", cwd=project)
    assert ran.status == 2
    assert "local folder site-rules (site.py): " in ran.err
    assert "rule id 'Site_Tag' is not a slug" in ran.err


def test_local_rule_colliding_with_a_built_in(run_cli, tmp_path):
    project = _project(tmp_path, LOCAL_RULE.replace('"site-tag-prefix"', '"frequency-separation"'))
    ran = run_cli("check", "d.toml", cwd=project)
    assert ran.status == 2
    assert ("rule id 'frequency-separation' is registered twice: by built-in "
            "(vcheck.rules.separation) and by local folder site-rules (site.py)") in ran.err


def test_local_rule_returning_junk_is_an_error_finding(run_cli, tmp_path):
    junk = LOCAL_RULE.replace(
        "    def check(self, design, options):\n",
        "    def check(self, design, options):\n        return [42]\n\n    def unused(self, design):\n")
    project = _project(tmp_path, junk)
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 3
    report = json.loads(ran.out)
    (finding,) = [f for f in report["findings"] if f["rule"] == "site-tag-prefix"]
    assert finding["status"] == "error"
    assert "check() returned int, not a Finding" in finding["message"]
    assert "(rule from local folder site-rules (site.py))" in finding["message"]
    # the built-in rule still ran
    assert any(f["rule"] == "frequency-separation" for f in report["findings"])


def test_local_folder_outside_the_root(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text('local-rules = ["../elsewhere"]\n')
    (tmp_path / "d.toml").write_text((EXAMPLE / "roof" / "ahu-r2.toml").read_text())
    ran = run_cli("check", "d.toml", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == "vcheck.toml:1:16: local-rules[1]: '../elsewhere' is outside the project root"


CATALOG_PLUGIN = '''
from vcheck.engine import Rule
from vcheck.findings import Source, Status


class UsesCurve(Rule):
    """Reads a curve that a plugin contributed.

    Fails when the curve is missing; passes when the rule finds it in the catalog.
    """

    id = "site-uses-curve"
    title = "Reads the catalog"
    applies_to = "machine"
    sources = (Source("test", "common practice"),)

    def check(self, design, options):
        curve = self.catalog.get("sn-curve", "SITE:weld-7")
        status = Status.PASS if curve == {"m": 3, "fat": 71e6} else Status.FAIL
        yield self.finding(design, ("machine",), status, f"curve {curve}")


def register(registry):
    registry.add_data("sn-curve", "SITE:weld-7", {"m": 3, "fat": 71e6})
    registry.add_rule(UsesCurve)
'''


def test_plugins_contribute_data_through_the_registry(run_cli, tmp_path):
    project = _project(tmp_path, CATALOG_PLUGIN)
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    (finding,) = [f for f in json.loads(ran.out)["findings"] if f["rule"] == "site-uses-curve"]
    assert finding["status"] == "pass"


def test_duplicate_data_names_both_origins(run_cli, tmp_path):
    project = _project(tmp_path, CATALOG_PLUGIN)
    (project / "site-rules" / "again.py").write_text(
        "def register(registry):\n    registry.add_data('sn-curve', 'SITE:weld-7', None)\n")
    ran = run_cli("check", "d.toml", cwd=project)
    assert ran.status == 2
    assert ran.err.strip() == ("vcheck: plugin error: sn-curve 'SITE:weld-7' is registered "
                               "twice: by local folder site-rules (again.py) and by local folder site-rules "
                               "(site.py)")


def test_unknown_kind_of_data(run_cli, tmp_path):
    project = _project(tmp_path, "def register(registry):\n    registry.add_data('colour', 'x', 1)\n")
    ran = run_cli("check", "d.toml", cwd=project)
    assert ran.status == 2
    assert "unknown kind of data 'colour'; known: sn-curve, thread, bolt-material" in ran.err


def test_the_plugin_wheel_resolves_to_our_distribution_in_a_fresh_environment(tmp_path):
    # The plugin requires `vcheck-vibration>=0.1`. In a fresh virtual environment whose
    # only source of vcheck is a wheel built from this checkout (--no-index), pip must
    # resolve that requirement to it (never to the index's unrelated `vcheck`), and the
    # plugin's rules must run. The third-party dependencies come from the package index
    # (or pip's cache) first, so that the resolution of ours is the only thing tested.
    import venv

    wheels = tmp_path / "wheels"
    subprocess.run([sys.executable, "-m", "pip", "wheel", "-q", "--no-deps",
                    "--no-build-isolation", "-w", str(wheels), str(REPO), str(PLUGIN)],
                   check=True, capture_output=True, text=True)
    env_dir = tmp_path / "env"
    venv.EnvBuilder(with_pip=True).create(env_dir)
    python = env_dir / "bin" / "python"
    deps = subprocess.run([str(python), "-m", "pip", "install", "-q", "numpy>=1.24",
                           "scipy>=1.10", "pydantic>=2.5,<3", "pint>=0.23", "rich>=13"],
                          capture_output=True, text=True)
    if deps.returncode != 0:
        pytest.skip(f"the package index is out of reach: {deps.stderr[-300:]}")
    ours = subprocess.run([str(python), "-m", "pip", "install", "--no-index", "--find-links",
                           str(wheels), "brackwater-vcheck-rules"],
                          capture_output=True, text=True)
    assert ours.returncode == 0, ours.stdout + ours.stderr
    shown = subprocess.run([str(python), "-m", "pip", "show", "vcheck-vibration"],
                           capture_output=True, text=True)
    assert "Name: vcheck-vibration" in shown.stdout
    listed = subprocess.run([str(python), "-m", "pip", "list", "--format", "freeze"],
                            capture_output=True, text=True).stdout.lower().splitlines()
    assert not any(line.startswith("vcheck==") for line in listed)  # not the unrelated one
    ran = subprocess.run([str(python), "-m", "vcheck", "rules"], capture_output=True,
                         text=True, cwd=tmp_path)
    assert ran.returncode == 0, ran.stderr
    assert "origin: package brackwater-vcheck-rules 1.0.0" in ran.stdout


def _site_rule_project(tmp_path, design_text):
    (tmp_path / "vcheck.toml").write_text('local-rules = ["vcheck-rules"]\n')
    (tmp_path / "vcheck-rules").mkdir()
    (tmp_path / "vcheck-rules" / "site_rules.py").write_text(
        (EXAMPLE / "vcheck-rules" / "site_rules.py").read_text())
    (tmp_path / "d.toml").write_text(design_text)
    return tmp_path


def test_the_example_site_rule_never_passes_a_design_it_did_not_judge(run_cli, tmp_path):
    # A pass must rest on a mode of the roof steel; a machine elsewhere is not checked, and
    # one without [support] may stand on the roof: a warning naming the input.
    text = (EXAMPLE / "basement" / "cmp-b1.toml").read_text()
    assert '[support]\nkind = "slab-on-grade"' in text
    project = _site_rule_project(tmp_path, text)
    elsewhere = json.loads(run_cli("check", "d.toml", "--format", "json", cwd=project).out)
    site = [f for f in elsewhere["findings"] if f["rule"] == "kestrel-roof-steel-modes"]
    assert [(f["status"], f["message"]) for f in site] == [
        ("not-checked", "not on the roof steel (slab-on-grade)")]
    bare = text.replace('[support]\nkind = "slab-on-grade"', "")
    (project / "d.toml").write_text(bare)
    unknown = json.loads(run_cli("check", "d.toml", "--format", "json", cwd=project).out)
    site = [f for f in unknown["findings"] if f["rule"] == "kestrel-roof-steel-modes"]
    assert [(f["status"], f["message"], f["advice"]) for f in site] == [
        ("warn", "no [support] is given, so it is not known whether the machine stands on "
                 "the roof steel", ["give [support] with its kind"])]

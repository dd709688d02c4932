"""The ready-made CI integration in examples/ci and the pre-commit manifest: they parse,
and every vcheck command line in them is one the command line accepts."""

from __future__ import annotations

import re
import shlex

import pytest
from support import REPO

yaml = pytest.importorskip("yaml", reason="PyYAML reads the workflow files")

FILES = [REPO / "examples" / "ci" / "github-workflow.yml", REPO / "examples" / "ci" / "gitlab-ci.yml"]


def _commands(node):
    if isinstance(node, dict):
        for key, value in node.items():
            if key in ("run", "script") or (key == "entry"):
                yield from ([value] if isinstance(value, str) else value)
            else:
                yield from _commands(value)
    elif isinstance(node, list):
        for item in node:
            yield from _commands(item)


@pytest.mark.parametrize("path", FILES, ids=lambda p: p.name)
def test_vcheck_command_lines_parse(path):
    from vcheck.cli import _parser

    document = yaml.safe_load(path.read_text())
    lines = [" ".join(line.split()) for text in _commands(document)
             for line in text.splitlines() if line.strip().startswith("vcheck ")]
    assert lines
    for line in lines:
        line = re.sub(r"\$\{\{[^}]*\}\}", "1", line)
        line = line.replace('"${CI_NODE_INDEX}/${CI_NODE_TOTAL}"', "1/3")
        line = line.split(">>")[0]
        words = [w.replace("*", "1") for w in shlex.split(line)[1:]]
        _parser().parse_args(words)  # raises SystemExit(2) on a bad option


def test_pre_commit_manifest():
    (hook,) = yaml.safe_load((REPO / ".pre-commit-hooks.yaml").read_text())
    assert hook["id"] == "vcheck" and hook["entry"] == "vcheck check"
    assert hook["pass_filenames"] is False


def test_pre_commit_manifest_passes_pre_commits_own_validation():
    # pre-commit's manifest schema (pre_commit.clientlib, test-only dependency) raises
    # InvalidManifestError on a manifest pre-commit would refuse.
    clientlib = pytest.importorskip("pre_commit.clientlib")
    (hook,) = clientlib.load_manifest(str(REPO / ".pre-commit-hooks.yaml"))
    assert hook["language"] == "python" and hook["id"] == "vcheck"


def test_every_install_line_names_our_distribution_not_the_unrelated_vcheck():
    # The package index holds an unrelated `vcheck` (a version checker for Python modules):
    # everything that installs or depends on this tool must name `vcheck-vibration`.
    import re

    from support import REPO

    from vcheck.engine import DISTRIBUTION

    assert DISTRIBUTION == "vcheck-vibration"
    assert f'name = "{DISTRIBUTION}"' in (REPO / "pyproject.toml").read_text()
    texts = {path: path.read_text() for path in [
        REPO / "examples" / "ci" / "github-workflow.yml", REPO / "examples" / "ci" / "gitlab-ci.yml",
        REPO / "examples" / "brackwater-rules" / "pyproject.toml", REPO / "README.md"]}
    for path, text in texts.items():
        assert not re.search(r"pip install\s+[\"']?vcheck(?![-\w])", text), path
        assert not re.search(r"[\"']vcheck\s*[<>=]", text), path
    installs = sum(len(re.findall(r"pip install \"vcheck-vibration==0\.1\.\*\"", t))
                   for t in texts.values())
    assert installs >= 3  # both CI examples (GitHub twice, GitLab once) pin it


# -- the CI files validate against independent schemas ---------------------------------
# check-jsonschema (test-only) vendors SchemaStore's schemas for GitHub workflows, GitHub
# Actions metadata (action.yml) and GitLab CI; its command line validates offline.

@pytest.mark.parametrize("path, schema", [
    (REPO / "action.yml", "vendor.github-actions"),
    (REPO / "examples" / "ci" / "github-workflow.yml", "vendor.github-workflows"),
    (REPO / "examples" / "ci" / "gitlab-ci.yml", "vendor.gitlab-ci"),
], ids=["action.yml", "github-workflow.yml", "gitlab-ci.yml"])
def test_ci_files_validate_against_their_schemas(path, schema):
    import subprocess
    import sys

    pytest.importorskip("check_jsonschema", reason="check-jsonschema validates the CI files")
    ran = subprocess.run([sys.executable, "-m", "check_jsonschema", "--builtin-schema", schema,
                          str(path)], capture_output=True, text=True)
    assert ran.returncode == 0, ran.stdout + ran.stderr


def test_action_installs_our_distribution_and_runs_every_review_format():
    action = yaml.safe_load((REPO / "action.yml").read_text())
    steps = action["runs"]["steps"]
    assert action["runs"]["using"] == "composite"
    install = next(s for s in steps if "pip install" in s.get("run", ""))
    assert '"vcheck-vibration${VCHECK_VERSION}"' in install["run"]
    check = next(s for s in steps if s.get("id") == "check")
    for fmt in ("sarif=", "junit=", "json=", "markdown=", "html="):
        assert fmt in check["run"]
    # the HTML report needs the plots extra, installed when it is asked for
    assert '"vcheck-vibration[plots]${VCHECK_VERSION}"' in install["run"]
    assert action["inputs"]["html-report"]["default"] == "true"
    # inputs reach the script through the environment, never pasted into it
    assert "${{" not in check["run"]
    assert any("upload-sarif" in s.get("uses", "") for s in steps)


def test_workflow_uploads_the_html_report_as_an_artifact():
    workflow = yaml.safe_load((REPO / "examples" / "ci" / "github-workflow.yml").read_text())
    steps = workflow["jobs"]["check"]["steps"]
    uploads = [s["with"]["path"] for s in steps if "upload-artifact" in s.get("uses", "")]
    assert "vcheck-${{ matrix.shard }}.html" in uploads


def test_dockerfile_is_slim_python_with_git_and_the_pinned_tool():
    text = (REPO / "examples" / "ci" / "Dockerfile").read_text()
    assert re.search(r"^FROM python:3\.\d+-slim$", text, re.M)
    assert "install -y --no-install-recommends git" in text
    assert '"vcheck-vibration${VCHECK_VERSION}"' in text
    assert 'ENTRYPOINT ["vcheck"]' in text

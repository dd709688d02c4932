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

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

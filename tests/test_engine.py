"""The rule contract: registration checks, discovery, and a rule that raises."""

from __future__ import annotations

import json

import pytest
from support import EXAMPLE

from vcheck.engine import PluginError, Registry, Rule, RuleOptions, discover, run_rules
from vcheck.findings import Finding, Source, Status


class _Good(Rule):
    """A rule for tests."""

    id = "test-good"
    title = "Test rule"
    applies_to = "machine"
    sources = (Source("test source", "common practice"),)

    def check(self, design, options):
        yield self.finding(design, ("machine", "mass"), Status.PASS, "ok")


def test_built_in_rules_come_through_the_entry_point():
    registry = discover()
    entry = registry.get("frequency-separation")
    assert entry is not None and entry.origin == "built-in"


@pytest.mark.parametrize(
    ("change", "message"),
    [
        ({"id": "Bad_Id"}, "rule id 'Bad_Id' is not a slug (lower-case words joined by '-')"),
        ({"sources": ()}, "the rule does not declare 'sources'"),
        ({"sources": ("a string",)}, "'sources' must be vcheck.findings.Source records"),
        ({"__doc__": None}, "the rule has no docstring to explain it"),
        ({"Options": dict}, "'Options' must derive from vcheck.engine.RuleOptions"),
        ({"id": "policy-waiver", "__doc__": "Takes a reserved id."},
         "rule id 'policy-waiver' is reserved by vcheck"),
    ],
)
def test_malformed_rules_are_refused(change, message):
    broken = type("Broken", (_Good,), dict(change))
    with pytest.raises(PluginError) as caught:
        Registry().add_rule(broken)
    assert str(caught.value).endswith(message)


def test_duplicate_id_names_both_origins():
    registry = Registry()
    registry.add_rule(_Good)
    registry.origin = "package acme-rules 1.0"
    clone = type("Clone", (_Good,), {"__doc__": "Same id."})
    with pytest.raises(PluginError, match="rule id 'test-good' is registered twice: by "
                       "built-in .* and by package acme-rules 1.0"):
        registry.add_rule(clone)


def test_a_rule_that_raises_becomes_an_error_and_the_rest_run():
    from vcheck.design.loader import load_design

    class Exploding(_Good):
        """Raises."""

        id = "test-exploding"

        def check(self, design, options):
            raise ZeroDivisionError("boom")

    class NotAFinding(_Good):
        """Returns junk."""

        id = "test-junk"

        def check(self, design, options):
            return ["not a finding"]

    registry = Registry()
    for rule in (_Good, Exploding, NotAFinding):
        registry.add_rule(rule)
    design = load_design(EXAMPLE / "roof" / "ef-r1.toml", "roof/ef-r1.toml")
    findings = run_rules([design], registry, lambda rule_id, d: (RuleOptions(), "default"))
    by_rule = {f.rule_id: f for f in findings}
    assert by_rule["test-good"].status is Status.PASS
    assert by_rule["test-exploding"].status is Status.ERROR
    assert "the rule could not run: ZeroDivisionError: boom" in by_rule["test-exploding"].message
    assert by_rule["test-junk"].status is Status.ERROR
    assert "check() returned str, not a Finding" in by_rule["test-junk"].message


def test_error_finding_gives_exit_status_3(run_cli, monkeypatch):
    import vcheck.rules.separation as separation

    def explode(*args, **kwargs):
        raise RuntimeError("model blew up")

    monkeypatch.setattr(separation, "natural_frequencies", explode)
    ran = run_cli("check", str(EXAMPLE), "--format", "json")
    assert ran.status == 3
    report = json.loads(ran.out)
    assert report["result"]["verdict"] == "rule-error"
    separation = [f for f in report["findings"] if f["rule"] == "frequency-separation"]
    assert separation and all(f["status"] == "error" for f in separation)


def test_fingerprint_is_stable_and_ignores_the_message():
    a = Finding("r", Status.PASS, "one", "f.toml", 1, 1, "T", "machine")
    b = Finding("r", Status.FAIL, "two", "f.toml", 9, 9, "T", "machine")
    c = Finding("r", Status.PASS, "one", "f.toml", 1, 1, "T", "mounting")
    assert a.fingerprint == b.fingerprint != c.fingerprint
    assert len(a.fingerprint) == 16

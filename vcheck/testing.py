"""Rule cases as data: the harness that built-in rules and plugins share.

A rule case is a small design file with one extra table, ``[case]``, that says what a
rule must conclude about it::

    [case]
    rule = "frequency-separation"     # the rule under test
    status = "fail"                   # pass, warn, fail, not-checked, error
    message-contains = ["inside"]     # optional: words the message must contain
    options = { required-margin = 0.25 }   # optional: policy overrides for this case

    format = 1 ... the rest of the design as usual ...

Use it from pytest in a plugin's own tests::

    import pytest
    from vcheck.testing import load_cases, check_case

    CASES = load_cases("tests/cases")

    @pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
    def test_rule_case(case):
        check_case(case)
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

from .design.loader import design_from_document, parse_toml_text

__all__ = ["RuleCase", "check_case", "load_cases", "run_case"]


@dataclass(frozen=True)
class RuleCase:
    """One case: a design, the rule to run on it, and the expected verdict."""

    name: str
    path: Path
    rule: str
    status: str
    options: dict = field(default_factory=dict)
    message_contains: tuple[str, ...] = ()


def load_cases(folder: str | Path) -> list[RuleCase]:
    """Every ``*.toml`` case below ``folder``, sorted by path."""
    import sys

    if sys.version_info >= (3, 11):
        import tomllib
    else:  # pragma: no cover
        import tomli as tomllib

    folder = Path(folder)
    cases = []
    for path in sorted(folder.rglob("*.toml")):
        data = tomllib.loads(_read_case(folder, path))
        spec = data.get("case")
        if not isinstance(spec, dict) or "rule" not in spec or "status" not in spec:
            raise ValueError(f"{path}: a rule case needs a [case] table with 'rule' and 'status'")
        contains = spec.get("message-contains", ())
        cases.append(RuleCase(
            name=path.relative_to(folder).with_suffix("").as_posix(),
            path=path,
            rule=spec["rule"],
            status=spec["status"],
            options=dict(spec.get("options", {})),
            message_contains=tuple([contains] if isinstance(contains, str) else contains),
        ))
    return cases


def _read_case(folder: Path, path: Path) -> str:
    """A case file's text through the guarded opener: a regular file inside the case
    folder, symlinks resolved, at most the design file limit."""
    from .design.files import read_inside
    from .design.loader import MAX_FILE_BYTES

    raw, _ = read_inside(folder, path.absolute(), what="rule case", limit=MAX_FILE_BYTES,
                         label=path.name)
    return raw.decode("utf-8")


def run_case(case: RuleCase, registry=None):
    """Load the case's design, run its rule with its options, return the findings."""
    from .analysis import analyse
    from .design.loader import attach_references
    from .engine import discover

    registry = discover() if registry is None else registry
    entry = registry.get(case.rule)
    if entry is None:
        raise LookupError(f"{case.path}: no rule '{case.rule}' is registered")
    document = parse_toml_text(_read_case(case.path.parent, case.path), case.path.name)
    data = {key: value for key, value in document.data.items() if key != "case"}
    document = type(document)(document.name, data, document.positions)
    design = design_from_document(document)
    attach_references(design, case.path.parent, {})
    analyse(design)
    options = entry.rule.Options.model_validate(case.options)
    rule = entry.rule()
    rule.catalog = registry.catalog
    return list(rule.check(design, options))


def check_case(case: RuleCase, registry=None) -> None:
    """Assert that the case's rule reaches the expected status (and message words)."""
    findings = run_case(case, registry)
    statuses = sorted({finding.status.value for finding in findings})
    assert findings, f"{case.name}: rule '{case.rule}' returned no finding"
    assert statuses == [case.status], (
        f"{case.name}: expected {case.status}, got {statuses}: "
        + " | ".join(finding.message for finding in findings)
    )
    for words in case.message_contains:
        assert any(words in finding.message for finding in findings), (
            f"{case.name}: no message contains {words!r}: "
            + " | ".join(finding.message for finding in findings)
        )

"""Every rule case under tests/rules/cases, run through the shipped harness."""

from __future__ import annotations

from pathlib import Path

import pytest

from vcheck.testing import check_case, load_cases

CASES = load_cases(Path(__file__).parent / "cases")


@pytest.mark.parametrize("case", CASES, ids=[case.name for case in CASES])
def test_rule_case(case):
    check_case(case)


def test_harness_catches_a_wrong_expectation(tmp_path):
    # The harness must be able to fail: a case that expects the wrong status.
    source = Path(__file__).parent / "cases" / "frequency-separation" / "inside-band-fails.toml"
    wrong = tmp_path / "wrong.toml"
    wrong.write_text(source.read_text().replace('status = "fail"', 'status = "pass"'))
    (case,) = load_cases(tmp_path)
    with pytest.raises(AssertionError, match="expected pass, got \\['fail'\\]"):
        check_case(case)

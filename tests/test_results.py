"""RunResult.counts(): one entry per status, in Status order, each finding counted once
(checked against a plain count by hand of each list, common practice)."""

from __future__ import annotations

from vcheck.findings import Finding, Status
from vcheck.results import RunResult


def _finding(status: Status, n: int) -> Finding:
    return Finding("r", status, "m", f"d{n}.toml", 1, 1, "T")


def test_counts_every_status_in_status_order():
    statuses = [Status.PASS] * 3 + [Status.FAIL, Status.WARN, Status.WARN, Status.NOT_CHECKED,
                                    Status.WAIVED, Status.ERROR, Status.PASS]
    result = RunResult("0", "default", findings=[_finding(s, n) for n, s in
                                                 enumerate(statuses)])
    counts = result.counts()
    assert list(counts) == [s.value for s in Status]
    assert counts == {"pass": 4, "warn": 2, "fail": 1, "waived": 1, "error": 1,
                      "not-checked": 1}


def test_counts_of_no_findings_are_zero():
    assert RunResult("0", "default").counts() == {s.value: 0 for s in Status}

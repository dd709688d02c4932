"""Survey of hostile inputs: how many of each strategy break the input contract, and how.

Run on demand (never in the test suite):

    python benchmarks/hostile_survey.py [--examples 300] [--seed-free]

Uses the strategies of ``tests/hostile/test_properties.py`` (schema-generated designs,
mutated example designs, raw bytes; mutated JSON reports for ``vcheck merge``), runs
each input through the command line in-process exactly as the tests do, but never
stops at a failure: it counts the inputs tried and the inputs that broke the contract
(exit status 3, a traceback, a hang, exit 2 without a location), and groups the broken
ones by the first line of stderr. The property tests stop at the first failure; this
gives the count for the issue's note.
Deterministic (``derandomize``) unless ``--seed-free``.
"""

from __future__ import annotations

import argparse
import collections
import re
import sys
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
sys.path[:0] = [str(REPO / "tests"), str(REPO / "tests" / "hostile")]

import test_properties as hostile  # noqa: E402
from hypothesis import given, settings  # noqa: E402


def _cause(outcome) -> str:
    if outcome.hung:
        return "hang"
    first = next((line for line in outcome.err.splitlines() if line.strip()), "")
    crash = re.search(r"the rule could not run: (\w+)", outcome.out)
    if outcome.status == 3 and crash:  # a rule raised: an ERROR finding
        return f"a rule raised {crash.group(1)}"
    if outcome.status == 3 and first:
        return re.sub(r"'[^']*'|\d+", "_", first)[:100]
    return f"exit status {outcome.status}: " + "; ".join(outcome.problems())[:100]


def survey(name: str, strategy, examples: int, derandomize: bool, show: bool = False):
    causes: collections.Counter = collections.Counter()
    counts = [0, 0]

    @settings(hostile.PROFILE, max_examples=examples, derandomize=derandomize, deadline=None)
    @given(strategy, hostile.formats)
    def run(data, fmt):
        if name == "mutated-reports":
            with tempfile.TemporaryDirectory(prefix="vcheck-survey-") as folder:
                Path(folder, "shard.json").write_bytes(data)
                outcome = hostile.run_in_process(["merge", "shard.json", "--format", fmt],
                                                 Path(folder))
        else:
            outcome = hostile.check_design_bytes(data, fmt)
        counts[0] += 1
        if outcome.problems():
            counts[1] += 1
            causes[_cause(outcome)] += 1
            if show:
                crash = re.search(r"the rule could not run: [^\n]*(\n {15}[^\n]*){0,2}",
                                  outcome.out)
                print(f"--- {name} ({fmt}): {crash.group() if crash else outcome.err[:300]}")

    start = time.perf_counter()
    run()
    return counts, causes, time.perf_counter() - start


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--examples", type=int, default=300)
    parser.add_argument("--seed-free", action="store_true")
    parser.add_argument("--show", action="store_true", help="print each broken input's error")
    args = parser.parse_args()
    total = [0, 0]
    for name, strategy in (("schema-designs", hostile.schema_designs()),
                           ("mutated-examples", hostile.mutated_examples()),
                           ("raw-bytes", hostile.raw_bytes),
                           ("mutated-reports", hostile.mutated_reports())):
        (tried, broken), causes, seconds = survey(name, strategy, args.examples,
                                                  not args.seed_free, args.show)
        total[0] += tried
        total[1] += broken
        print(f"{name}: {tried} tried, {broken} broke the contract ({seconds:.1f} s, "
              f"{1000 * seconds / max(tried, 1):.0f} ms an input)")
        for cause, count in causes.most_common():
            print(f"  {count:5d}  {cause}")
    print(f"all: {total[0]} tried, {total[1]} broke the contract")
    return 0


if __name__ == "__main__":
    sys.exit(main())

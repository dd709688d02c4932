"""Time and peak memory of a design whose lumped model is a long chain of masses.

Run on demand (never from the test suite):

    PYTHONPATH=. python benchmarks/bench_lumped_chain.py [N ...]

For each N (default 2,000 and 20,000) writes a design with a chain of N masses of
100 kg joined by springs of 1e9 N/m (``--k=1e5N/m`` for another stiffness), the first
tied to the ground, and in a fresh
process loads, analyses and checks it with every rule (what `vcheck check` does),
printing the seconds of each step and the process's peak resident memory.
"""

from __future__ import annotations

import subprocess
import sys
import tempfile
import textwrap
from pathlib import Path

CHILD = textwrap.dedent("""
    import resource, sys, time
    from pathlib import Path
    root = Path(sys.argv[1])
    t0 = time.perf_counter()
    from vcheck.design.loader import load_design
    from vcheck.analysis import analyse
    from vcheck.config import load_policy
    from vcheck.checking import run_check
    from vcheck.engine import discover
    t1 = time.perf_counter()
    design = load_design(root / "d.toml", "d.toml", root)
    t2 = time.perf_counter()
    analyse(design)
    t3 = time.perf_counter()
    policy = load_policy(root)
    result = run_check(policy, discover(), ["d.toml"], root)
    t4 = time.perf_counter()
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    problems = len(result.problems)
    print(f"import {t1 - t0:.2f} s, load {t2 - t1:.2f} s, analyse {t3 - t2:.2f} s, "
          f"whole check {t4 - t3:.2f} s, peak RSS {peak:.0f} MiB, "
          f"{len(result.findings)} findings, {problems} problems")
""")


def design(n: int) -> str:
    # written compactly, so that 20,000 masses stay under the 1 MiB file limit
    masses = ",".join(['"100kg"'] * n)
    springs = ",\n".join(f'{{between=[{i},{i + 1}],stiffness="@K@"}}' for i in range(n))
    return (f'format = 1\n\n[machine]\ntag = "CHAIN-{n}"\nkind = "fan"\nmass = "300 kg"\n'
            f'speed = "1480 rpm"\n\n[[lumped-model]]\nname = "chain"\nmasses = [{masses}]\n'
            f"springs = [\n{springs}\n]\n")


def main() -> None:
    args = [a for a in sys.argv[1:] if not a.startswith("--k=")]
    stiffness = next((a[4:] for a in sys.argv[1:] if a.startswith("--k=")), "1e9N/m")
    sizes = [int(a) for a in args] or [2_000, 20_000]
    for n in sizes:
        with tempfile.TemporaryDirectory() as folder:
            root = Path(folder)
            (root / "vcheck.toml").write_text("")
            text = design(n).replace("@K@", stiffness)
            (root / "d.toml").write_text(text)
            ran = subprocess.run([sys.executable, "-c", CHILD, str(root)], capture_output=True,
                                 text=True, timeout=900)
            out = ran.stdout.strip() or ran.stderr.strip().splitlines()[-1]
            print(f"{n:>6} masses ({len(text) / 1024:.0f} KiB): {out}")


if __name__ == "__main__":
    main()

"""Peak memory of reading a long CSV time history (10^7 samples).

Run on demand (never from the test suite):

    PYTHONPATH=. python benchmarks/bench_history_memory.py [--samples N]

Writes a one-column CSV of N samples (default 10^7, about 60 MB, under the 64 MiB
limit) in a temporary project, then in a fresh process loads a design whose fatigue
detail reads it, and prints that process's peak resident memory (ru_maxrss) and the
time taken, next to the peak of a process that only imports the loader (the baseline).
"""

from __future__ import annotations

import argparse
import subprocess
import sys
import tempfile
import textwrap
from pathlib import Path

DESIGN = """\
format = 1

[machine]
tag = "BENCH-1"
kind = "compressor"
mass = "400 kg"
speed = "2950 rpm"

[[fatigue]]
name = "branch"
detail = "EN 1993-1-9:71"
life = { years = 20 }
history = { path = "h.csv", channel = 1, scale = "1 MPa", duration = "600 s" }
"""

CHILD = textwrap.dedent("""
    import resource, sys, time
    from pathlib import Path
    from vcheck.design.loader import load_design
    root = Path(sys.argv[1])
    started = time.perf_counter()
    if sys.argv[2] == "load":
        design = load_design(root / "d.toml", "d.toml", root)
        samples = design._fatigue_inputs[0].history.shape[0]
    else:
        samples = 0
    took = time.perf_counter() - started
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    print(f"{samples} {took:.2f} {peak:.0f}")
""")


def main() -> None:
    parser = argparse.ArgumentParser()
    parser.add_argument("--samples", type=int, default=10_000_000)
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        root = Path(folder)
        (root / "vcheck.toml").write_text("")
        (root / "d.toml").write_text(DESIGN)
        with open(root / "h.csv", "w") as out:
            out.write("stress\n")
            block = "".join(f"{(i % 97) / 9.7:.3f}\n" for i in range(100_000))
            for _ in range(args.samples // 100_000):
                out.write(block)
        size = (root / "h.csv").stat().st_size
        print(f"CSV: {args.samples} samples, {size / 1e6:.1f} MB")
        for mode in ("baseline", "load"):
            ran = subprocess.run([sys.executable, "-c", CHILD, str(root), mode],
                                 capture_output=True, text=True, check=True)
            samples, took, peak = ran.stdout.split()
            print(f"{mode:>8}: {int(samples):>9} samples read in {took} s, peak RSS "
                  f"{peak} MiB")


if __name__ == "__main__":
    main()

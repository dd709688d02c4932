"""Start-up and throughput of the command line, against references in the same run.

Run on demand (never in the test suite):

    python benchmarks/bench_startup.py [--runs 7]

Prints medians of repeated runs and their ratios against:
- bare ``python -c pass`` for ``vcheck --version`` (target: within 2x);
- ``python -c "import numpy, scipy.linalg, pydantic"``, the floor of the core
  dependencies, for ``vcheck check`` on the bundled example (target: within 2x);
- the marginal cost per design from generated repositories of 10 and 1,000 designs
  (target: at most 2 ms per design, under 5 s in all).
"""

from __future__ import annotations

import argparse
import os
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
EXAMPLE = REPO / "examples" / "kestrel-yard"
VCHECK = [sys.executable, "-m", "vcheck"]
if shutil.which("vcheck", path=str(Path(sys.executable).parent)):
    VCHECK = [shutil.which("vcheck", path=str(Path(sys.executable).parent))]

DESIGN = """format = 1

[machine]
tag = "GEN-{n:04d}"
kind = "fan"
mass = "{mass} kg"
speed = {{ min = "{low} rpm", max = "{high} rpm" }}
blades = {blades}

[mounting]
kind = "spring"
isolators = 4
stiffness = "{k} kN/m +-10%"
damping-ratio = 0.02

[[natural-frequency]]
name = "support frame, first vertical"
frequency = "{f} Hz"
source = "generated for the benchmark"
"""


# Users run vcheck with compiled bytecode (pip writes it at install); some machines set
# PYTHONDONTWRITEBYTECODE, which would make every run of an editable checkout compile
# vcheck from source while the reference libraries keep their bytecode. So the runs
# here allow bytecode, and one untimed warm-up run writes it first.
ENV = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}


def timed(command: list[str], runs: int, cwd: Path = REPO) -> float:
    subprocess.run(command, cwd=cwd, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
                   env=ENV)
    samples = []
    for _ in range(runs):
        start = time.perf_counter()
        subprocess.run(command, cwd=cwd, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
                       env=ENV)
        samples.append(time.perf_counter() - start)
    return statistics.median(samples)


def generate(folder: Path, count: int) -> None:
    folder.mkdir(parents=True)
    for n in range(count):
        text = DESIGN.format(n=n, mass=300 + n % 500, low=400 + n % 300, high=1200 + n % 600,
                             blades=6 + n % 7, k=40 + n % 90, f=f"{18 + (n % 40) * 0.7:.1f}")
        (folder / f"design-{n:04d}.toml").write_text(text)


def main() -> None:
    parser = argparse.ArgumentParser()
    parser.add_argument("--runs", type=int, default=7)
    args = parser.parse_args()
    runs = args.runs

    bare = timed([sys.executable, "-c", "pass"], runs)
    version = timed(VCHECK + ["--version"], runs)
    floor = timed([sys.executable, "-c", "import numpy, scipy.linalg, pydantic"], runs)
    example = timed(VCHECK + ["check", str(EXAMPLE)], runs)
    with tempfile.TemporaryDirectory() as tmp:
        small, large = Path(tmp) / "small", Path(tmp) / "large"
        generate(small, 10)
        generate(large, 1000)
        t_small = timed(VCHECK + ["check", "."], max(3, runs // 2), cwd=small)
        t_large = timed(VCHECK + ["check", "."], max(3, runs // 2), cwd=large)
    marginal = (t_large - t_small) / 990

    print(f"{'measurement':48s} {'median':>10s} {'reference':>10s} {'ratio':>7s}")
    print(f"{'vcheck --version vs python -c pass':48s} {version*1e3:8.1f} ms {bare*1e3:8.1f} ms "
          f"{version/bare:7.2f}")
    print(f"{'vcheck check example vs import numpy,scipy.linalg,pydantic':48s} "
          f"{example*1e3:8.1f} ms {floor*1e3:8.1f} ms {example/floor:7.2f}")
    print(f"{'vcheck check, 10 generated designs':48s} {t_small*1e3:8.1f} ms")
    print(f"{'vcheck check, 1000 generated designs':48s} {t_large*1e3:8.1f} ms")
    print(f"{'marginal cost per design':48s} {marginal*1e3:8.3f} ms")


if __name__ == "__main__":
    main()

"""Cost of the HTML report on top of the check, for the bundled example.

Run on demand (never in the test suite):

    python benchmarks/bench_html.py [--runs 5]

Prints the median wall time of ``vcheck check`` (text report) and of ``vcheck check
--report html=FILE`` on ``examples/kestrel-yard``, each a fresh process, and their
difference: the cost of importing matplotlib and drawing every plot (target: under 3 s),
with the page's size and number of plots. Also ``vcheck dynamics --format html``.
"""

from __future__ import annotations

import argparse
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
EXAMPLE = REPO / "examples" / "kestrel-yard"
TARGET_S = 3.0


def timed(args: list[str], runs: int) -> float:
    times = []
    for _ in range(runs):
        start = time.perf_counter()
        subprocess.run([sys.executable, "-m", "vcheck", *args], cwd=EXAMPLE,
                       stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        times.append(time.perf_counter() - start)
    return statistics.median(times)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=5)
    runs = parser.parse_args().runs
    with tempfile.TemporaryDirectory() as folder:
        page = Path(folder) / "report.html"
        text = timed(["check"], runs)
        html = timed(["check", "--report", f"html={page}"], runs)
        dynamics = timed(["dynamics", "--format", "html"], runs)
        size = page.stat().st_size
        plots = page.read_text(encoding="utf-8").count("<figure")
    extra = html - text
    print(f"check, text report:          {text:6.2f} s (median of {runs})")
    print(f"check with --report html:    {html:6.2f} s ({plots} plots, {size / 1e6:.2f} MB)")
    print(f"html on top of the check:    {extra:6.2f} s (target under {TARGET_S:.0f} s: "
          f"{'met' if extra < TARGET_S else 'NOT met'})")
    print(f"dynamics --format html:      {dynamics:6.2f} s")


if __name__ == "__main__":
    main()

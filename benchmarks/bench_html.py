"""Cost of the HTML report on top of the check, for the bundled example.

Run on demand (never in the test suite):

    python benchmarks/bench_html.py [--runs 5]

Prints the median wall time of ``vcheck check`` (text report) and of ``vcheck check
--report html=FILE`` on ``examples/kestrel-yard``, each a fresh process, and their
difference: the cost of importing matplotlib and drawing every plot (target: under 3 s),
with the page's size and number of plots. Also ``vcheck dynamics --format html``.

``--profile N`` instead runs the check once in this process and profiles only the HTML
writer (cProfile), printing its N most costly calls by cumulative time.
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


def profile(top: int) -> None:
    """cProfile of :func:`vcheck.report.html.render_html` on the example's run."""
    import contextlib
    import cProfile
    import io
    import os
    import pstats

    import vcheck.report as report
    from vcheck.cli import main as vcheck_main

    results = []
    render = report.render

    def keep(result, fmt, **options):
        if fmt == "html":
            results.append(result)
            return ""
        return render(result, fmt, **options)

    os.chdir(EXAMPLE)
    report.render = keep
    with tempfile.TemporaryDirectory() as folder, contextlib.redirect_stdout(io.StringIO()):
        vcheck_main(["check", "--report", f"html={Path(folder) / 'report.html'}"])
    report.render = render
    from vcheck.report.html import render_html

    profiler = cProfile.Profile()
    start = time.perf_counter()
    profiler.enable()
    page = render_html(results[0])
    profiler.disable()
    print(f"render_html: {time.perf_counter() - start:.2f} s under the profiler, "
          f"{page.count('<figure')} plots")
    pstats.Stats(profiler).sort_stats("cumulative").print_stats(top)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=5)
    parser.add_argument("--profile", type=int, metavar="N",
                        help="profile the HTML writer in this process instead")
    args = parser.parse_args()
    if args.profile:
        profile(args.profile)
        return
    runs = args.runs
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

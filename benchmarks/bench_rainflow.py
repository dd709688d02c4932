"""Speed and memory of vcheck's rainflow count beside two reference libraries.

Run on demand (never part of the test suite):

    PYTHONPATH=. python benchmarks/bench_rainflow.py [--sizes 1e5 1e6 1e7] [--repeat 5]

For white noise and for a narrow-band signal (white noise through a second-order
Butterworth band-pass around a twentieth of the sampling rate) of each size it times, in
the same process:

* ``numpy tp``  - numpy alone extracting the turning points (difference, drop the flat
  steps, keep the sign changes, first and last sample): the floor any count stands on;
* ``vcheck``    - :func:`vcheck.dynamics.fatigue.rainflow.rainflow_cycles`;
* ``fatpack``   - ``fatpack.find_reversals`` + ``find_rainflow_cycles``, residue counted
  as half cycles (fatpack's own reversal search, which bins the signal in 64 classes);
* ``rainflow``  - PyPI ``rainflow.extract_cycles`` (pure Python; at the largest size it
  runs once, or is skipped with --skip-slow).

Times are medians of --repeat runs (the slow references fewer, see the table). Peak
memory is the largest traced allocation during one vcheck count (tracemalloc, which
numpy reports its buffers to), as a multiple of the input array's size.
"""

from __future__ import annotations

import argparse
import statistics
import sys
import time
import tracemalloc

import numpy as np


def numpy_turning_points(x):
    d = np.diff(x)
    moving = np.flatnonzero(d)
    rising = d[moving] > 0
    turn = moving[np.flatnonzero(rising[1:] != rising[:-1]) + 1]
    index = np.concatenate(([0], turn, [x.shape[0] - 1]))
    return index, x[index]


def fatpack_count(x):
    import fatpack

    reversals, _ = fatpack.find_reversals(x)
    cycles, residue = fatpack.find_rainflow_cycles(reversals)
    half = np.abs(np.diff(residue))
    return cycles, half


def rainflow_count(x):
    import rainflow

    return list(rainflow.extract_cycles(x))


def timed(func, x, repeat):
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        func(x)
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def peak_memory(func, x):
    tracemalloc.start()
    tracemalloc.reset_peak()
    func(x)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    return peak


def signals(n, seed=2024):
    from scipy import signal

    rng = np.random.default_rng(seed)
    white = rng.standard_normal(n)
    b, a = signal.butter(2, [0.09, 0.11], btype="bandpass")
    narrow = signal.lfilter(b, a, rng.standard_normal(n))
    return {"white": white, "narrow-band": narrow}


def main(argv=None):
    from vcheck.dynamics.fatigue.rainflow import rainflow_cycles

    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", nargs="+", type=float, default=[1e5, 1e6, 1e7])
    parser.add_argument("--repeat", type=int, default=5)
    parser.add_argument("--skip-slow", action="store_true", help="skip rainflow at 1e7")
    args = parser.parse_args(argv)

    header = (
        f"{'samples':>9} {'signal':<12} {'numpy tp':>9} {'vcheck':>9} {'/tp':>5} "
        f"{'fatpack':>9} {'x':>6} {'rainflow':>9} {'x':>6} {'peak mem':>9}"
    )
    print(header)
    print("-" * len(header))
    for size in args.sizes:
        n = int(size)
        for name, x in signals(n).items():
            t_tp = timed(numpy_turning_points, x, args.repeat)
            t_vc = timed(rainflow_cycles, x, args.repeat)
            slow_repeat = 1 if n >= 10**7 else max(1, args.repeat // 2)
            t_fp = timed(fatpack_count, x, slow_repeat)
            if n >= 10**7 and args.skip_slow:
                t_rf = float("nan")
            else:
                t_rf = timed(rainflow_count, x, 1 if n >= 10**6 else slow_repeat)
            peak = peak_memory(rainflow_cycles, x) / x.nbytes
            print(
                f"{n:>9.0e} {name:<12} {t_tp:>8.3f}s {t_vc:>8.3f}s {t_vc / t_tp:>5.2f} "
                f"{t_fp:>8.3f}s {t_fp / t_vc:>6.1f} {t_rf:>8.3f}s {t_rf / t_vc:>6.1f} "
                f"{peak:>8.2f}x",
                flush=True,
            )
    print()
    print("/tp: vcheck time over numpy turning points; x: reference time over vcheck time;")
    print("peak mem: largest traced allocation during one vcheck count over the input size.")
    return 0


if __name__ == "__main__":
    sys.exit(main())

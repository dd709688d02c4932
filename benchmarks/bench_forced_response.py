"""Benchmark of the mount-force peak search over a speed range.

Run on demand (never from the test suite):

    PYTHONPATH=. python benchmarks/bench_forced_response.py [--quick]

Prints medians of several runs, per call, and ratios against references measured in
the same process:

1. :func:`vcheck.dynamics.isolation.forced_response.mount_force_peaks` on a six-mount
   layout with inclined mounts and the CG above the mounts, a band crossing three
   rigid-body modes, light modal damping; once with a fixed-amplitude roll moment and
   off-centre force, once with an inertial load growing with speed squared (target:
   at most 2 ms per call);
2. the reference: one bare
   :func:`vcheck.dynamics.modes.rigid_mounts.mount_forced_response` call over 25
   frequencies, what a fixed-grid search did per band (and cannot find a peak with);
3. the accuracy of the search against a dense sweep of 10^5 frequencies of the same
   response (the sweep can only be lower);
4. per design, what the isolation rule runs for one mount model: 30 peak searches, 10
   bands (5 speed ranges, 5 single frequencies) times 3 unit load shapes at the CG
   (force along y, force along z, moment about x). The new path builds one
   :class:`vcheck.dynamics.isolation.forced_response.MountForceModel` and calls its
   ``peaks`` 30 times; the old path makes 30
   :func:`vcheck.dynamics.isolation.forced_response.mount_force_peaks` calls, each
   validating the layout and solving the modes again. Both are timed in the same run
   (ratio old / new), with the costs of their parts per call, and their results are
   checked to be the same to the last bit.
"""

from __future__ import annotations

import os

# One BLAS thread unless the caller says otherwise (as in bench_modes.py): the matrices
# are tiny and a second thread only adds noise on a shared machine.
for _var in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

import argparse  # noqa: E402
import math  # noqa: E402
import statistics  # noqa: E402
import time  # noqa: E402

import numpy as np  # noqa: E402

from vcheck.dynamics.isolation import forced_response  # noqa: E402
from vcheck.dynamics.modes import rigid_mounts  # noqa: E402


def median_time(fn, repeat: int, number: int = 1) -> float:
    """Median wall time of one call [s], over ``repeat`` batches of ``number`` calls."""
    times = []
    for _ in range(repeat):
        start = time.perf_counter()
        for _ in range(number):
            fn()
        times.append((time.perf_counter() - start) / number)
    return statistics.median(times)


def six_mount_design():
    """A 900 kg genset-like skid on six mounts, three a side, leaning inward 15 deg."""
    mass = rigid_mounts.rigid_body_mass_matrix(900.0, rigid_mounts.uniform_box_inertia(
        900.0, 2.2, 0.9, 1.1))
    positions = np.array(
        [[0.9, 0.4, 0.0], [0.0, 0.42, 0.0], [-0.9, 0.4, 0.0],
         [0.9, -0.4, 0.0], [0.0, -0.42, 0.0], [-0.9, -0.4, 0.0]]
    )
    cg = np.array([0.08, 0.02, 0.45])
    stiffness = np.tile([350e3, 110e3, 110e3], (6, 1))
    tilt = math.radians(15)
    lean = np.array([[0, -math.sin(tilt), math.cos(tilt)]] * 3 + [[0, math.sin(tilt), math.cos(tilt)]] * 3)
    orientations = rigid_mounts.mount_axes(lean)
    return mass, positions, cg, stiffness, orientations


def bench(repeat: int, number: int) -> None:
    mass, positions, cg, stiffness, orient = six_mount_design()
    modes = rigid_mounts.rigid_body_modes(
        mass, rigid_mounts.mount_stiffness_matrix(positions, stiffness, cg, orientations=orient)
    )
    f = modes.frequencies
    band = (0.5 * (f[1] + f[2]), 0.5 * (f[4] + f[5]))  # crosses modes 3, 4 and 5
    couple = np.array([0, 0, 0, 400.0, 0, 0])  # roll moment, torque reaction [N m]
    offset = rigid_mounts.load_at_point([0, 250.0, 600.0j], [0.7, 0.1, 0.6], cg)
    fixed = couple + offset
    unbalance = rigid_mounts.load_at_point([0, 300.0, 300.0j], [0.6, 0.0, 0.55], cg)
    zeta = 0.02
    common = dict(centre_of_gravity=cg, orientations=orient, damping_ratio=zeta)

    print("six-mount layout, inclined mounts, CG 0.45 m above them")
    print("  natural frequencies [Hz]: " + ", ".join(f"{v:.3f}" for v in f))
    print("  modes: " + ", ".join(modes.descriptions))
    print(f"  band {band[0]:.3f} to {band[1]:.3f} Hz, modal damping {zeta}")

    cases = {
        "fixed load (roll moment + force)": lambda: forced_response.mount_force_peaks(
            mass, positions, stiffness, fixed, band, **common),
        "inertial load, exponent 2": lambda: forced_response.mount_force_peaks(
            mass, positions, stiffness, unbalance, band, amplitude_exponent=2.0,
            reference_frequency=band[1], **common),
    }
    grid = np.linspace(band[0], band[1], 25)
    t_ref = median_time(
        lambda: rigid_mounts.mount_forced_response(mass, positions, stiffness, fixed, grid, **common),
        repeat, number,
    )
    print(f"  reference: mount_forced_response over 25 frequencies  median {t_ref * 1e3:7.3f} ms")
    for name, call in cases.items():
        t = median_time(call, repeat, number)
        print(f"  {name:34s} median {t * 1e3:7.3f} ms per call     ratio to reference {t / t_ref:5.2f}")

    # accuracy: the same response on a dense sweep with the existing direct function
    sweep = np.linspace(band[0], band[1], 100_001)
    for name, load, extra in (
        ("fixed load", fixed, {}),
        ("inertial load", unbalance, dict(amplitude_exponent=2.0, reference_frequency=band[1])),
    ):
        got = forced_response.mount_force_peaks(mass, positions, stiffness, load, band, **common, **extra)
        scale = (sweep / band[1]) ** extra.get("amplitude_exponent", 0.0)
        res = rigid_mounts.mount_forced_response(mass, positions, stiffness, load, sweep, **common)
        dense = (forced_response.peak_vector_magnitude(res.mount_forces) * scale[:, None]).max(axis=0)
        excess = (got.mount_peak - dense) / dense
        print(
            f"  {name}: peak search - dense sweep of 1e5, relative, per mount: "
            f"min {excess.min():+.2e}, max {excess.max():+.2e}; worst ratio {got.worst_ratio:.4f} "
            f"at {got.worst_ratio_frequency:.4f} Hz"
        )

    per_design(mass, positions, stiffness, common, repeat, max(1, number // 20))


def design_searches():
    """The rule's searches for one design: 10 bands, half of them single frequencies
    (a 1500 rpm set: run-up, speed ranges around the orders, the orders themselves),
    times 3 unit load shapes at the CG."""
    bands = [(0.0, 25.0), (3.0, 9.5), (20.0, 26.0), (40.0, 52.0), (4.85, 8.29),
             (12.5, 12.5), (25.0, 25.0), (50.0, 50.0), (75.0, 75.0), (100.0, 100.0)]
    shapes = [(0, 1.0, 0, 0, 0, 0), (0, 0, 1.0, 0, 0, 0), (0, 0, 0, 1.0, 0, 0)]
    return [(shape, band) for band in bands for shape in shapes]


def per_design(mass, positions, stiffness, common, repeat: int, number: int) -> None:
    searches = design_searches()

    def old():
        return [forced_response.mount_force_peaks(mass, positions, stiffness, shape, band, **common)
                for shape, band in searches]

    def new():
        model = forced_response.MountForceModel(mass, positions, stiffness, **common)
        return [model.peaks(shape, band) for shape, band in searches]

    same = all(
        all(np.array_equal(a, b, equal_nan=True) for a, b in zip(one, two))
        for one, two in zip(old(), new())
    )
    # alternate the two paths so that drift in the machine's load hits both alike
    t_old, t_new = [], []
    for _ in range(repeat):
        t_old.append(median_time(old, 1, number))
        t_new.append(median_time(new, 1, number))
    t_old, t_new = statistics.median(t_old), statistics.median(t_new)
    print(f"per design: {len(searches)} searches (10 bands, 5 of them single frequencies, "
          "x 3 unit load shapes), one model")
    print(f"  old: {len(searches)} x mount_force_peaks        median {t_old * 1e3:7.3f} ms per design")
    print(f"  new: MountForceModel + {len(searches)} x peaks      median {t_new * 1e3:7.3f} ms per design"
          f"   ratio old / new {t_old / t_new:5.2f}")
    print(f"  results the same to the last bit: {'yes' if same else 'NO'}")

    model = forced_response.MountForceModel(mass, positions, stiffness, **common)
    parts = {
        "model (validation, modes)": lambda: forced_response.MountForceModel(
            mass, positions, stiffness, **common),
        "peaks, speed range (4.85-8.29 Hz)": lambda: model.peaks(searches[12][0], (4.85, 8.29)),
        "peaks, single frequency (25 Hz)": lambda: model.peaks(searches[18][0], (25.0, 25.0)),
        "mount_force_peaks, speed range": lambda: forced_response.mount_force_peaks(
            mass, positions, stiffness, searches[12][0], (4.85, 8.29), **common),
        "mount_force_peaks, single frequency": lambda: forced_response.mount_force_peaks(
            mass, positions, stiffness, searches[18][0], (25.0, 25.0), **common),
    }
    for name, call in parts.items():
        t = median_time(call, repeat, 20 * number)
        print(f"  per call: {name:36s} median {t * 1e3:7.3f} ms")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="fewer runs")
    args = parser.parse_args()
    repeat, number = (3, 50) if args.quick else (7, 200)
    print(
        f"BLAS threads: OPENBLAS_NUM_THREADS={os.environ['OPENBLAS_NUM_THREADS']}, "
        f"cores: {os.cpu_count()}, load average: {os.getloadavg()[0]:.2f}; "
        f"medians of {repeat} x {number} calls"
    )
    bench(repeat, number)


if __name__ == "__main__":
    main()

"""Benchmark of the modal numerics: six-DOF mount analysis and lumped band searches.

Run on demand (never from the test suite):

    PYTHONPATH=. python benchmarks/bench_modes.py [--quick]

Prints medians of several runs and ratios against references measured in the same
process:

1. six-DOF rigid machine on four inclined mounts: mass matrix, stiffness matrix, six
   modes with energy fractions and descriptions, per design (target: well under 1 ms);
2. band search on uniform fixed-free spring-mass chains of 3e3, 3e4 and 3e5 degrees of
   freedom for the six modes nearest 50 Hz, assembly included, against the bare
   ``scipy.sparse.linalg.eigsh`` shift-invert call on prebuilt matrices (target: within
   1.5x at 3e5) and against dense ``eigh`` where feasible;
3. the same band search on square 2-D grids of masses (each joined to its four
   neighbours, one edge tied to the ground) of 3e3, 3e4 and 3e5 degrees of freedom, where
   the fill of the sparse factorisation depends on its ordering (target: within 1.5x of
   the bare ``eigsh`` at 3e5), checked against the grid's closed form;
4. the dense / sparse crossover of :func:`vcheck.dynamics.modes.lumped.lumped_modes`.

``--grid-only`` runs item 3 alone; ``--sizes`` sets its sizes and the chains'.
"""

from __future__ import annotations

import os

# One BLAS thread unless the caller says otherwise: on a small shared machine a second
# BLAS thread fighting other processes makes ARPACK's medians swing by 5-10x.
for _var in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

import argparse  # noqa: E402
import math  # noqa: E402
import statistics  # noqa: E402
import time  # noqa: E402

import numpy as np  # noqa: E402

from vcheck.dynamics.modes import lumped, rigid_mounts  # noqa: E402

K_CHAIN = 1.0e6  # N/m per spring
M_CHAIN = 1.0  # kg per node
TARGET_HZ = 50.0


def median_time(fn, repeat: int, number: int = 1) -> float:
    """Median wall time of one call [s], over ``repeat`` batches of ``number`` calls."""
    times = []
    for _ in range(repeat):
        start = time.perf_counter()
        for _ in range(number):
            fn()
        times.append((time.perf_counter() - start) / number)
    return statistics.median(times)


# ------------------------------------------------------------------- six DOF


def six_dof_design():
    mass = 640.0
    box = (1.6, 0.8, 0.9)
    positions = np.array(
        [[0.7, 0.35, 0.0], [0.7, -0.35, 0.0], [-0.7, 0.35, 0.0], [-0.7, -0.35, 0.0]]
    )
    cg = np.array([0.05, 0.0, 0.42])
    stiffness = np.tile([210e3, 70e3, 70e3], (4, 1))
    tilt = math.radians(20)
    axial = np.array(
        [[0, -math.sin(tilt), math.cos(tilt)], [0, math.sin(tilt), math.cos(tilt)]] * 2
    )
    return mass, box, positions, cg, stiffness, axial


def six_dof_analysis(mass, box, positions, cg, stiffness, axial):
    inertia = rigid_mounts.uniform_box_inertia(mass, *box)
    m = rigid_mounts.rigid_body_mass_matrix(mass, inertia)
    orient = rigid_mounts.mount_axes(axial)
    k = rigid_mounts.mount_stiffness_matrix(positions, stiffness, cg, orientations=orient)
    return rigid_mounts.rigid_body_modes(m, k)


def bench_six_dof(repeat: int) -> None:
    design = six_dof_design()
    modes = six_dof_analysis(*design)
    t = median_time(lambda: six_dof_analysis(*design), repeat=repeat, number=200)
    m = rigid_mounts.rigid_body_mass_matrix(
        design[0], rigid_mounts.uniform_box_inertia(design[0], *design[1])
    )
    k = rigid_mounts.mount_stiffness_matrix(
        design[2], design[4], design[3], orientations=rigid_mounts.mount_axes(design[5])
    )
    t_modes = median_time(lambda: rigid_mounts.rigid_body_modes(m, k), repeat=repeat, number=200)
    t_eig = median_time(lambda: np.linalg.eigh(k), repeat=repeat, number=200)
    print("six-DOF mount analysis (4 inclined mounts)")
    print("  frequencies [Hz]: " + ", ".join(f"{f:.3f}" for f in modes.frequencies))
    print("  modes: " + ", ".join(modes.descriptions))
    print(f"  whole analysis per design   median {t * 1e6:8.1f} us")
    print(f"  modes only (6x6 matrices)   median {t_modes * 1e6:8.1f} us")
    print(
        f"  bare numpy eigh of 6x6      median {t_eig * 1e6:8.1f} us   "
        f"(analysis / eigh = {t / t_eig:.1f})"
    )


# ------------------------------------------------------------------- chains


def chain_springs(n: int) -> np.ndarray:
    """Ground - k - node 0 - k - node 1 ... node n-1 (free end), as an (n, 3) table."""
    a = np.arange(-1, n - 1, dtype=float)
    b = np.arange(0, n, dtype=float)
    return np.column_stack([a, b, np.full(n, K_CHAIN)])


def chain_frequencies(n: int) -> np.ndarray:
    """Closed form of the uniform fixed-free chain [Hz]:
    omega_j = 2 sqrt(k/m) sin((2j - 1) pi / (2 (2n + 1)))."""
    j = np.arange(1, n + 1)
    return (
        2
        * math.sqrt(K_CHAIN / M_CHAIN)
        * np.sin((2 * j - 1) * math.pi / (2 * (2 * n + 1)))
        / (2 * math.pi)
    )


def six_mode_band(n: int, count: int = 6):
    """Band edges holding exactly the ``count`` modes nearest TARGET_HZ, halfway to the
    next ones."""
    f = chain_frequencies(n)
    nearest = np.sort(np.argsort(np.abs(f - TARGET_HZ))[:count])
    lo, hi = nearest[0], nearest[-1]
    low = 0.5 * (f[lo - 1] + f[lo]) if lo > 0 else 0.5 * f[lo]
    high = 0.5 * (f[hi] + f[hi + 1]) if hi + 1 < n else f[hi] * 1.001
    return low, high, f[nearest]


def band_search(n: int, f_lo: float, f_hi: float):
    m, k = lumped.lumped_matrices(np.full(n, M_CHAIN), chain_springs(n), sparse=True)
    return lumped.lumped_modes_band(m, k, f_lo, f_hi)


def bench_chains(sizes, repeat: int, dense_max: int) -> None:
    from scipy.linalg import eigh
    from scipy.sparse.linalg import eigsh

    sigma = (2 * math.pi * TARGET_HZ) ** 2
    print("\nband search, uniform fixed-free chain, six modes nearest 50 Hz")
    print(
        f"  {'DOF':>7}  {'bare eigsh':>11}  {'band search':>11}  {'ratio':>6}  "
        f"{'assembly':>9}  {'dense band':>11}  {'dense all':>10}  max |df| [Hz]"
    )
    for n in sizes:
        f_lo, f_hi, want = six_mode_band(n)
        m, k = lumped.lumped_matrices(np.full(n, M_CHAIN), chain_springs(n), sparse=True)
        mc, kc = m.tocsc(), k.tocsc()
        reps = repeat if n <= 30_000 else max(3, repeat // 2)
        t_bare = median_time(lambda: eigsh(kc, k=6, M=mc, sigma=sigma, which="LM"), reps)
        t_ours = median_time(lambda: band_search(n, f_lo, f_hi), reps)
        t_asm = median_time(
            lambda: lumped.lumped_matrices(np.full(n, M_CHAIN), chain_springs(n), sparse=True), reps
        )
        got = band_search(n, f_lo, f_hi).frequencies
        err = float(np.max(np.abs(got - want))) if got.size == 6 else float("nan")
        dense_band = dense_all = "-"
        if n <= dense_max:
            md, kd = m.toarray(), k.toarray()
            t_dense = median_time(lambda: lumped.lumped_modes_dense(md, kd, f_lo, f_hi), 3)
            dense_band = f"{t_dense * 1e3:9.1f}ms"
            dense_all = f"{median_time(lambda: eigh(kd, md), 1) * 1e3:8.0f}ms"
        print(
            f"  {n:>7}  {t_bare * 1e3:9.1f}ms  {t_ours * 1e3:9.1f}ms  {t_ours / t_bare:6.2f}  "
            f"{t_asm * 1e3:7.1f}ms  {dense_band:>11}  {dense_all:>10}  {err:.2e}  "
            f"({got.size} modes)"
        )


# ------------------------------------------------------------------- 2-D grids


def grid_springs(side: int) -> np.ndarray:
    """A side x side grid of nodes, each joined to its four neighbours by k, the nodes of
    column 0 tied to the ground by k, as a (links, 3) table."""
    index = np.arange(side * side).reshape(side, side)
    pairs = [np.column_stack([index[:, :-1].ravel(), index[:, 1:].ravel()]),
             np.column_stack([index[:-1, :].ravel(), index[1:, :].ravel()]),
             np.column_stack([np.full(side, -1), index[:, 0]])]
    table = np.vstack(pairs).astype(float)
    return np.column_stack([table, np.full(len(table), K_CHAIN)])


def grid_frequencies(side: int) -> np.ndarray:
    """Closed form of the grid [Hz], sorted: K is the Kronecker sum of a fixed-free chain
    along the rows and a free-free chain along the columns, so
    omega^2 = (k/m) (4 sin^2((2i - 1) pi / (2 (2n + 1))) + 4 sin^2(j pi / (2 n))),
    i = 1..n, j = 0..n-1 (derived: eigenvalues of a Kronecker sum are the sums of the
    factors' eigenvalues; the chains' closed forms as in :func:`chain_frequencies`)."""
    i = np.arange(1, side + 1)
    j = np.arange(side)
    fixed = 4 * np.sin((2 * i - 1) * math.pi / (2 * (2 * side + 1))) ** 2
    free = 4 * np.sin(j * math.pi / (2 * side)) ** 2
    omega2 = (K_CHAIN / M_CHAIN) * (fixed[:, None] + free[None, :]).ravel()
    return np.sort(np.sqrt(omega2)) / (2 * math.pi)


def six_mode_band_of(f: np.ndarray, count: int = 6):
    """Band edges holding the ``count`` modes nearest TARGET_HZ of sorted ``f`` [Hz]."""
    nearest = np.sort(np.argsort(np.abs(f - TARGET_HZ))[:count])
    lo, hi = nearest[0], nearest[-1]
    low = 0.5 * (f[lo - 1] + f[lo]) if lo > 0 else 0.5 * f[lo]
    high = 0.5 * (f[hi] + f[hi + 1]) if hi + 1 < f.size else f[hi] * 1.001
    return low, high, f[nearest]


def bench_grids(sides, repeat: int) -> None:
    from scipy.sparse.linalg import eigsh, splu

    sigma = (2 * math.pi * TARGET_HZ) ** 2
    print("\nband search, 2-D grid (four neighbours, one edge grounded), six modes nearest 50 Hz")
    print(f"  {'DOF':>7}  {'bare eigsh':>11}  {'band search':>11}  {'ratio':>6}  "
          f"{'assembly':>9}  {'LU nnz COLAMD':>14}  {'LU nnz MMD(A+At)':>17}  max |df| [Hz]")
    for side in sides:
        n = side * side
        f_lo, f_hi, want = six_mode_band_of(grid_frequencies(side))
        masses, springs = np.full(n, M_CHAIN), grid_springs(side)
        m, k = lumped.lumped_matrices(masses, springs, sparse=True)
        mc, kc = m.tocsc(), k.tocsc()
        reps = repeat if n <= 30_000 else max(3, repeat // 2)

        def ours():
            mm, kk = lumped.lumped_matrices(masses, springs, sparse=True)
            return lumped.lumped_modes_band(mm, kk, f_lo, f_hi)

        t_bare = median_time(lambda: eigsh(kc, k=6, M=mc, sigma=sigma, which="LM"), reps)
        t_ours = median_time(ours, reps)
        t_asm = median_time(lambda: lumped.lumped_matrices(masses, springs, sparse=True), reps)
        got = ours().frequencies
        err = float(np.max(np.abs(got - want))) if got.size == 6 else float("nan")
        shifted = (kc - sigma * mc).tocsc()
        colamd = splu(shifted)
        fill = f"{colamd.L.nnz + colamd.U.nnz:,}"
        del colamd
        mmd = "-"
        if n <= 100_000:  # at 3e5 the old ordering takes minutes and ~3 GB
            lu = splu(shifted, permc_spec="MMD_AT_PLUS_A", options={"SymmetricMode": True})
            mmd = f"{lu.L.nnz + lu.U.nnz:,}"
            del lu
        print(f"  {n:>7}  {t_bare * 1e3:9.1f}ms  {t_ours * 1e3:9.1f}ms  {t_ours / t_bare:6.2f}  "
              f"{t_asm * 1e3:7.1f}ms  {fill:>14}  {mmd:>17}  {err:.2e}  ({got.size} modes)")


def bench_crossover(sizes, repeat: int) -> None:
    print("\ndense vs sparse crossover (band near 50 Hz, matrices prebuilt)")
    print(f"  {'DOF':>6}  {'modes':>5}  {'dense band':>11}  {'sparse band':>11}  dense/sparse")
    for count in (6, 30):
        for n in sizes:
            f_lo, f_hi, _ = six_mode_band(n, count)
            ms, ks = lumped.lumped_matrices(np.full(n, M_CHAIN), chain_springs(n), sparse=True)
            md, kd = ms.toarray(), ks.toarray()
            t_d = median_time(lambda: lumped.lumped_modes_dense(md, kd, f_lo, f_hi), repeat)
            t_s = median_time(lambda: lumped.lumped_modes_band(ms, ks, f_lo, f_hi), repeat)
            print(f"  {n:>6}  {count:>5}  {t_d * 1e3:9.2f}ms  {t_s * 1e3:9.2f}ms  {t_d / t_s:8.2f}")
    print(
        "  lumped_modes() switches to the sparse search above "
        f"DENSE_MAX_DOF = {lumped.DENSE_MAX_DOF}"
    )


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="fewer runs, no 3e5 models")
    parser.add_argument("--grid-only", action="store_true", help="the 2-D grids alone")
    parser.add_argument("--sizes", type=int, nargs="+", metavar="DOF",
                        help="degrees of freedom of the chains and grids (a grid's side is "
                        "the nearest whole square root)")
    args = parser.parse_args()
    repeat = 3 if args.quick else 7
    print(
        f"BLAS threads: OPENBLAS_NUM_THREADS={os.environ['OPENBLAS_NUM_THREADS']}, "
        f"cores: {os.cpu_count()}, load average: {os.getloadavg()[0]:.2f}"
    )
    sizes = args.sizes or ([3_000, 30_000] if args.quick else [3_000, 30_000, 300_000])
    sides = [round(math.sqrt(n)) for n in sizes]
    if not args.grid_only:
        bench_six_dof(repeat)
        bench_chains(sizes, repeat, dense_max=3_000)
    bench_grids(sides, repeat)
    if not args.grid_only:
        bench_crossover([100, 200, 300, 400, 500, 700, 1000], repeat)


if __name__ == "__main__":
    main()

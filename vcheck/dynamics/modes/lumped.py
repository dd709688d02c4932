"""Lumped mass-spring models: matrices, natural frequencies, modes and participation.

A lumped model is a set of point masses, each free to move along one coordinate (one
degree of freedom, "node" below), joined to each other and to ground by linear
springs. It is the generalised symmetric eigenproblem

    K phi = omega^2 M phi,

with M the (diagonal) mass matrix and K the stiffness matrix. Small models are solved
densely for every mode; large ones are searched for the modes inside a frequency band
only, by shift-invert Lanczos iteration on sparse matrices. :func:`lumped_modes` picks
between the two by model size (crossover :data:`DENSE_MAX_DOF`).

Nodes are numbered 0 .. n-1; ground is -1 (or None). A model in two or three
directions numbers its coordinates node-major (node i, direction c -> i * d + c) and
uses :func:`translation_influence` for participation in a direction.

Rigid-body (zero-frequency) modes of a model that is not tied to ground are reported
as 0 Hz and counted in :attr:`LumpedModes.rigid_body_modes`.
"""

from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "ALL_MODES_MAX_DOF",
    "DENSE_MAX_DOF",
    "RIGID_BODY_TOLERANCE",
    "LumpedModes",
    "lumped_matrices",
    "lumped_modes",
    "lumped_modes_band",
    "lumped_modes_dense",
    "lumped_frequencies",
    "TooManyModes",
    "modal_participation",
    "translation_influence",
]

DENSE_MAX_DOF = 500
"""Largest model [degrees of freedom] whose band :func:`lumped_modes` solves densely.

Measured with ``benchmarks/bench_modes.py`` (uniform chains, one BLAS thread, 2-core
machine): the dense band solve (standard-form ``eigh`` with ``subset_by_value``) and
the sparse shift-invert search cost the same at about 250 degrees of freedom for a
band holding 6 modes and about 600 for 30 modes; at 500 the slower choice costs under
25 ms either way. Above 1000 the sparse search is 3 to 10 times faster, and the dense
cost grows as n^3."""

ALL_MODES_MAX_DOF = 2000
"""Largest model [degrees of freedom] for which :func:`lumped_modes` computes every
mode when no band is given (a dense solve of about a second at this size)."""

RIGID_BODY_TOLERANCE = 1e-12
"""Eigenvalues omega^2 below this fraction of max(K_ii / M_ii) are rigid-body modes
(0 Hz) [unitless]. Round-off in omega^2 is about 1e-16 of that scale; the lowest
elastic mode of a free chain of N equal masses is (pi / N)^2 / 2 of it, 5e-11 at
N = 3e5, so the tolerance separates the two for any model of practical size."""


class LumpedModes(NamedTuple):
    """Natural frequencies and mode shapes of a lumped model."""

    frequencies: np.ndarray
    """Natural frequencies, ascending, shape (n_modes,) [Hz]; rigid-body modes are 0."""
    shapes: np.ndarray
    """Mode shapes as columns, shape (n_dof, n_modes), mass-normalised
    (phi^T M phi = 1) [1/sqrt(kg)]; the largest entry of each column is positive."""
    rigid_body_modes: int
    """How many of the returned modes are rigid-body modes at 0 Hz [unitless]."""


# --------------------------------------------------------------------------- assembly


def _parse_springs(springs, n_nodes: int):
    """Spring table -> (node_a, node_b, stiffness) arrays, ground as -1, validated."""
    if isinstance(springs, np.ndarray) and springs.dtype != object:
        table = np.asarray(springs, dtype=float)
        if table.ndim != 2 or table.shape[1] != 3:
            if table.size == 0:
                table = table.reshape(0, 3)
            else:
                raise ValueError(
                    f"springs must be rows of (node a, node b, stiffness), got shape {table.shape}"
                )
        raw_a, raw_b, stiffness = table[:, 0], table[:, 1], table[:, 2]
    else:
        rows = list(springs)
        for index, row in enumerate(rows):
            if len(row) != 3:
                raise ValueError(
                    f"spring {index} must be (node a, node b, stiffness), got {tuple(row)!r}"
                )
        raw_a = np.array([-1 if r[0] is None else r[0] for r in rows], dtype=float)
        raw_b = np.array([-1 if r[1] is None else r[1] for r in rows], dtype=float)
        stiffness = np.array([r[2] for r in rows], dtype=float)
    for raw in (raw_a, raw_b):
        bad = (raw != np.round(raw)) | (raw < -1) | (raw >= n_nodes) | ~np.isfinite(raw)
        if np.any(bad):
            index = int(np.flatnonzero(bad)[0])
            raise ValueError(
                f"spring {index} connects node {raw[index]:g}, but the model has nodes "
                f"0 to {n_nodes - 1} (and -1 for ground)"
            )
    a = raw_a.astype(np.intp)
    b = raw_b.astype(np.intp)
    same = a == b
    if np.any(same):
        index = int(np.flatnonzero(same)[0])
        what = "ground to ground" if a[index] < 0 else f"node {a[index]} to itself"
        raise ValueError(f"spring {index} connects {what}")
    bad = ~(stiffness > 0) | ~np.isfinite(stiffness)
    if np.any(bad):
        index = int(np.flatnonzero(bad)[0])
        raise ValueError(
            f"stiffness of spring {index} must be positive, got {stiffness[index]:g} N/m"
        )
    return a, b, stiffness


def lumped_matrices(masses: ArrayLike, springs, *, sparse: bool | None = None):
    """Mass and stiffness matrices of a lumped mass-spring model.

    Parameters
    ----------
    masses : array_like
        Mass of each node, shape (n,) [kg]; positive (a massless junction between two
        springs is one spring of the series stiffness).
    springs : sequence of (node_a, node_b, stiffness) or numpy.ndarray of shape (m, 3)
        Linear springs: the two nodes they join (-1 or None for ground) [unitless] and
        the stiffness [N/m]; positive. An array is the fast form for large models.
    sparse : bool, optional
        Return ``scipy.sparse`` CSR matrices (True) or dense arrays (False); by default
        sparse above :data:`DENSE_MAX_DOF` nodes [-].

    Returns
    -------
    mass_matrix, stiffness_matrix : numpy.ndarray or scipy.sparse.csr_array
        M (diagonal) [kg] and K [N/m], both (n, n), symmetric.

    Notes
    -----
    K = sum over springs of k (e_a - e_b)(e_a - e_b)^T, with e_ground = 0 [1]_.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. 6 (from memory).

    Examples
    --------
    Ground - k - m - k - m:

    >>> m, k = lumped_matrices([1.0, 1.0], [(None, 0, 1000.0), (0, 1, 1000.0)])
    >>> k
    array([[ 2000., -1000.],
           [-1000.,  1000.]])
    """
    masses = np.asarray(masses, dtype=float)
    if masses.ndim != 1 or masses.size == 0:
        raise ValueError(
            f"masses must be a non-empty list of node masses, got shape {masses.shape}"
        )
    bad = ~(masses > 0) | ~np.isfinite(masses)
    if np.any(bad):
        index = int(np.flatnonzero(bad)[0])
        raise ValueError(f"mass at node {index} must be positive, got {masses[index]:g} kg")
    n = masses.size
    a, b, k = _parse_springs(springs, n)
    if sparse is None:
        sparse = n > DENSE_MAX_DOF

    # diagonal terms +k at every non-ground end, off-diagonal -k between two nodes
    ends = np.concatenate([a, b])
    kk = np.concatenate([k, k])
    on_node = ends >= 0
    diag = np.bincount(ends[on_node], weights=kk[on_node], minlength=n)
    between = (a >= 0) & (b >= 0)
    ia, ib, kab = a[between], b[between], k[between]
    if not sparse:
        stiffness = np.diag(diag)
        np.add.at(stiffness, (ia, ib), -kab)
        np.add.at(stiffness, (ib, ia), -kab)
        return np.diag(masses), stiffness

    from scipy.sparse import coo_array

    rows = np.concatenate([np.arange(n), ia, ib])
    cols = np.concatenate([np.arange(n), ib, ia])
    data = np.concatenate([diag, -kab, -kab])
    stiffness = coo_array((data, (rows, cols)), shape=(n, n)).tocsr()  # sums duplicates
    idx = np.arange(n)
    mass = coo_array((masses, (idx, idx)), shape=(n, n)).tocsr()
    return mass, stiffness


# --------------------------------------------------------------------------- helpers


def _is_sparse(a) -> bool:
    # duck-typed, so that dense models never import scipy.sparse (start-up time)
    return hasattr(a, "tocoo") and hasattr(a, "nnz")


def _check_pair(mass_matrix, stiffness_matrix):
    if _is_sparse(mass_matrix) or _is_sparse(stiffness_matrix):
        m_shape, k_shape = mass_matrix.shape, stiffness_matrix.shape
    else:
        m_shape, k_shape = np.shape(mass_matrix), np.shape(stiffness_matrix)
    if len(m_shape) != 2 or m_shape[0] != m_shape[1] or m_shape != k_shape:
        raise ValueError(
            f"mass and stiffness matrices must be square and of one size, got {m_shape} "
            f"and {k_shape}"
        )
    return m_shape[0]


def _diagonal(a) -> np.ndarray:
    return np.asarray(a.diagonal() if _is_sparse(a) else np.diagonal(a), dtype=float)


def _is_diagonal(a) -> bool:
    if _is_sparse(a):
        coo = a.tocoo()
        return bool(np.all((coo.row == coo.col) | (coo.data == 0)))
    arr = np.asarray(a)
    return not np.any(arr - np.diag(np.diagonal(arr)))


def _asymmetry(a) -> float:
    """max |A - A^T| / max |A|, 0 for a symmetric matrix."""
    if _is_sparse(a):
        diff = abs(a - a.T)
        top = abs(a).max()
        return float(diff.max() / top) if top else 0.0
    arr = np.asarray(a, dtype=float)
    top = np.abs(arr).max()
    return float(np.abs(arr - arr.T).max() / top) if top else 0.0


def _check_symmetric(mass_matrix, stiffness_matrix) -> None:
    for name, a in (("mass", mass_matrix), ("stiffness", stiffness_matrix)):
        if _asymmetry(a) > 1e-12:
            raise ValueError(f"{name} matrix must be symmetric")


def _scale(mass_matrix, stiffness_matrix) -> float:
    """max K_ii / M_ii [1/s^2], the eigenvalue scale of the model."""
    km = _diagonal(stiffness_matrix)
    mm = _diagonal(mass_matrix)
    if np.any(~(mm > 0)):
        index = int(np.flatnonzero(~(mm > 0))[0])
        raise ValueError(f"mass at node {index} must be positive, got {mm[index]:g} kg")
    return float(np.max(km / mm)) if km.size else 0.0


def _band_eigenvalues(f_low, f_high):
    lo = _frequency("lower band edge", f_low)
    hi = _frequency("upper band edge", f_high)
    if lo > hi:
        raise ValueError(f"frequency band is reversed: {lo:g} Hz is above {hi:g} Hz")
    return (2 * np.pi * lo) ** 2, (2 * np.pi * hi) ** 2


def _frequency(name, value) -> float:
    v = float(value)
    if not (v >= 0) or not np.isfinite(v):
        raise ValueError(f"{name} must not be negative, got {v:g} Hz")
    return v


def _finish(eigenvalues, shapes, mass_matrix, scale) -> LumpedModes:
    """Sort, clip rigid-body modes to 0 Hz, mass-normalise and fix signs."""
    tol = RIGID_BODY_TOLERANCE * scale
    if np.any(eigenvalues < -tol):
        worst = float(eigenvalues.min())
        raise ValueError(
            f"stiffness matrix must not be negative definite in any mode, got omega^2 = "
            f"{worst:g} 1/s^2"
        )
    order = np.argsort(eigenvalues, kind="stable")
    eigenvalues = eigenvalues[order]
    shapes = np.array(shapes[:, order], dtype=float)
    rigid = eigenvalues <= tol
    eigenvalues = np.where(rigid, 0.0, eigenvalues)
    norms = np.sqrt(np.einsum("ij,ij->j", shapes, mass_matrix @ shapes))
    shapes /= norms
    if shapes.size:
        peak = np.argmax(np.abs(shapes), axis=0)
        signs = np.sign(shapes[peak, np.arange(shapes.shape[1])])
        shapes *= np.where(signs == 0, 1.0, signs)
    return LumpedModes(np.sqrt(eigenvalues) / (2 * np.pi), shapes, int(rigid.sum()))


# --------------------------------------------------------------------------- solvers


def lumped_modes_dense(mass_matrix, stiffness_matrix, f_low=None, f_high=None) -> LumpedModes:
    """Natural frequencies and modes of a lumped model by a dense eigensolution.

    Parameters
    ----------
    mass_matrix : array_like or scipy.sparse matrix
        Mass matrix M, (n, n), symmetric positive definite [kg].
    stiffness_matrix : array_like or scipy.sparse matrix
        Stiffness matrix K, (n, n), symmetric positive semi-definite [N/m].
    f_low, f_high : float, optional
        Return only the modes with f_low <= f <= f_high [Hz]; by default every mode.

    Returns
    -------
    LumpedModes
        Frequencies [Hz], mass-normalised shapes [1/sqrt(kg)] and the count of
        rigid-body modes [unitless].

    Notes
    -----
    Solves K phi = omega^2 M phi with LAPACK. A diagonal M (point masses) is folded into
    the standard symmetric problem (M^-1/2 K M^-1/2) y = omega^2 y, phi = M^-1/2 y,
    solved by :func:`numpy.linalg.eigh`, the band selected afterwards; a full M goes to
    :func:`scipy.linalg.eigh` (only the eigenvalues inside a band are computed). Cost
    grows as n^3: see :data:`DENSE_MAX_DOF`.

    References
    ----------
    .. [1] E. Anderson et al., LAPACK Users' Guide, 3rd ed., SIAM, 1999, sec. 2.3.4
       (symmetric and generalised symmetric eigenproblems).
    """
    n = _check_pair(mass_matrix, stiffness_matrix)
    m = mass_matrix.toarray() if _is_sparse(mass_matrix) else np.asarray(mass_matrix, float)
    k = (
        stiffness_matrix.toarray()
        if _is_sparse(stiffness_matrix)
        else np.asarray(stiffness_matrix, float)
    )
    _check_symmetric(m, k)
    scale = _scale(m, k)
    subset = None
    if f_low is not None or f_high is not None:
        lam_lo, lam_hi = _band_eigenvalues(
            0.0 if f_low is None else f_low, np.inf if f_high is None else f_high
        )
        pad = RIGID_BODY_TOLERANCE * scale
        subset = (lam_lo - pad if lam_lo > 0 else -np.inf, lam_hi + pad)
        if not np.isfinite(subset[1]):
            subset = (subset[0], np.finfo(float).max)
    if n == 0:
        return LumpedModes(np.zeros(0), np.zeros((0, 0)), 0)
    try:
        if _is_diagonal(m):
            diagonal = np.diagonal(m)
            if np.any(~(diagonal > 0)):
                raise np.linalg.LinAlgError("a diagonal mass is not positive")
            d = 1.0 / np.sqrt(diagonal)
            a = k * d[:, None] * d[None, :]
            # numpy's LAPACK driver: the common lumped case never imports scipy.linalg
            lam, y = np.linalg.eigh(a)
            if subset is not None:
                keep = (lam >= subset[0]) & (lam <= subset[1])
                lam, y = lam[keep], y[:, keep]
            vecs = y * d[:, None]
        else:
            from scipy.linalg import eigh

            if subset is None:
                lam, vecs = eigh(k, m)
            else:
                lam, vecs = eigh(k, m, subset_by_value=subset)
    except np.linalg.LinAlgError as exc:
        raise ValueError(f"mass matrix must be positive definite ({exc})") from None
    return _finish(np.asarray(lam, float), vecs, m, scale)


def lumped_modes_band(
    mass_matrix, stiffness_matrix, f_low: float, f_high: float, *, initial_count: int = 7,
    max_count: int | None = None,
) -> LumpedModes:
    """Modes of a large lumped model inside a frequency band, by sparse shift-invert.

    Parameters
    ----------
    mass_matrix : scipy.sparse matrix or array_like
        Mass matrix M, (n, n), symmetric positive definite [kg].
    stiffness_matrix : scipy.sparse matrix or array_like
        Stiffness matrix K, (n, n), symmetric positive semi-definite [N/m].
    f_low, f_high : float
        Band edges [Hz]; every mode with f_low <= f <= f_high is returned.
    initial_count : int, default 7
        Modes asked for in the first Lanczos run; raised automatically until the band
        is covered [unitless]. One more than the modes expected in the band is enough
        to prove it covered; every extra one costs iterations (ARPACK keeps 20 Lanczos
        vectors up to 9 modes, so fewer spare ones converge more slowly).
    max_count : int, optional
        Most modes the band may hold; :class:`TooManyModes` is raised (before the cost
        of a larger search is paid) when the search needs more [unitless].

    Returns
    -------
    LumpedModes
        Frequencies [Hz], mass-normalised shapes [1/sqrt(kg)] and the count of
        rigid-body modes [unitless].

    Notes
    -----
    K - sigma M is factorised once (sparse LU, :func:`scipy.sparse.linalg.splu`) at
    the band centre sigma = (omega_lo^2 + omega_hi^2) / 2, with SuperLU's default column
    ordering (COLAMD) and partial pivoting, as ``eigsh`` itself factorises: on a chain any
    ordering keeps the factors banded, and on a 2-D mesh COLAMD's factors are several
    times sparser than the minimum degree ordering of K + K^T (about 10 against 23
    million nonzeros at 1e5 degrees of freedom, 5x faster; ``benchmarks/bench_modes.py``
    measures both structures). ARPACK's shift-invert
    Lanczos method (:func:`scipy.sparse.linalg.eigsh`, mode 3) returns the k
    eigenvalues nearest sigma [1]_. If the farthest of them lies farther from sigma
    than both band edges, no eigenvalue inside the band can be missing (they are all
    nearer); otherwise k is raised, from the density of the eigenvalues found, and the
    same factorisation is used again. A band holding zero (a free model) is handled
    like any other: sigma is moved off an exact eigenvalue if the factorisation is
    singular.

    A Lanczos method can return an exactly repeated eigenvalue (a model with
    symmetry) fewer times than its multiplicity; the dense solve has no such limit.

    References
    ----------
    .. [1] R. B. Lehoucq, D. C. Sorensen, C. Yang, ARPACK Users' Guide, SIAM, 1998,
       sec. 3.2 (shift-invert spectral transformation).
    """
    from scipy.sparse import csc_array
    from scipy.sparse.linalg import LinearOperator, eigsh, splu

    n = _check_pair(mass_matrix, stiffness_matrix)
    m = csc_array(mass_matrix)
    k = csc_array(stiffness_matrix)
    _check_symmetric(m, k)
    scale = _scale(m, k)
    lam_lo, lam_hi = _band_eigenvalues(f_low, f_high)
    pad = RIGID_BODY_TOLERANCE * scale
    lam_lo = lam_lo - pad if lam_lo > 0 else -pad
    lam_hi = lam_hi + pad
    if n <= 2 * initial_count + 2:
        return lumped_modes_dense(m, k, f_low, f_high)

    sigma = 0.5 * (lam_lo + lam_hi)
    lu = None
    for attempt in range(6):
        try:
            lu = splu(k - sigma * m)  # COLAMD ordering, partial pivoting: see Notes
            break
        except RuntimeError:  # exactly singular: sigma is an eigenvalue
            sigma -= (10.0**attempt) * 1e-9 * max(scale, 1.0)
    if lu is None:
        raise ValueError("could not factorise K - sigma M near the band")
    opinv = LinearOperator((n, n), matvec=lu.solve, dtype=float)
    half = max(sigma - lam_lo, lam_hi - sigma)
    v0 = np.random.default_rng(20240601).standard_normal(n)  # reproducible start

    count = max(1, int(initial_count))
    while True:
        count = min(count, n - 1)
        if max_count is not None and count > max_count + 1:
            raise TooManyModes(max_count, f_high)
        lam, vecs = eigsh(k, k=count, M=m, sigma=sigma, which="LM", OPinv=opinv, v0=v0)
        reach = float(np.max(np.abs(lam - sigma)))
        if reach > half or count >= n - 1:
            break
        if count > n // 3 and n <= 4 * DENSE_MAX_DOF:
            # the band holds a large share of a mid-size model: dense is cheaper
            return lumped_modes_dense(m, k, f_low, f_high)
        count = max(2 * count, int(np.ceil(1.3 * count * half / reach)) + 3)
    inside = (lam >= lam_lo) & (lam <= lam_hi)
    return _finish(lam[inside], vecs[:, inside], m, scale)


class TooManyModes(ValueError):
    """More modes lie in the band than the caller bounded the search to."""

    def __init__(self, limit: int, f_high: float) -> None:
        self.limit, self.f_high = limit, f_high
        super().__init__(f"more than {limit} modes lie at or below {f_high:.4g} Hz")


BANDED_MAX_BANDWIDTH = 8
"""Widest band (after reordering) solved by the banded LAPACK path of
:func:`lumped_frequencies`; wider sparse models use the shift-invert search."""


def _bandwidth(a) -> int:
    coo = a.tocoo()
    return int(np.max(np.abs(coo.row - coo.col))) if coo.nnz else 0


def lumped_frequencies(mass_matrix, stiffness_matrix, f_high: float, max_modes: int):
    """Natural frequencies of a lumped model from 0 up to ``f_high``, without shapes.

    Parameters
    ----------
    mass_matrix, stiffness_matrix : array_like or scipy.sparse matrix
        M [kg] and K [N/m], as from :func:`lumped_matrices`.
    f_high : float
        Upper edge of the search [Hz].
    max_modes : int
        Most modes returned; :class:`TooManyModes` when more lie at or below
        ``f_high`` [unitless]. It bounds the cost, which grows with n times the modes
        found.

    Returns
    -------
    tuple of (numpy.ndarray, int)
        Frequencies ascending, rigid-body modes as 0 [Hz], and the rigid-body count.

    Notes
    -----
    Up to :data:`DENSE_MAX_DOF` degrees of freedom the dense solve of
    :func:`lumped_modes_dense`. Above it, with point masses (diagonal M), the standard
    form A = M^-1/2 K M^-1/2 keeps the sparsity of K; reordered by reverse
    Cuthill-McKee to a narrow band, a chain is tridiagonal and a model of a few
    parallel chains is banded. For those the (max_modes + 1)-th eigenvalue alone is
    found first by bisection on Sturm counts, in time linear in n (LAPACK ``stebz``,
    or ``sbevx`` for a band) [1]_: if it lies inside the search, the model has too many
    modes and nothing more is computed; otherwise the eigenvalues in [0, omega_high^2]
    follow, at most ``max_modes`` of them. Other models go to the sparse shift-invert
    search of :func:`lumped_modes_band`, bounded the same way.

    References
    ----------
    .. [1] E. Anderson et al., LAPACK Users' Guide, 3rd ed., SIAM, 1999, sec. 2.3.4
       (symmetric tridiagonal and band eigenproblems: bisection, ``xSTEBZ``,
       ``xSBEVX``).
    """
    n = _check_pair(mass_matrix, stiffness_matrix)
    lam_hi = (2 * np.pi * _frequency("upper band edge", f_high)) ** 2
    if n <= DENSE_MAX_DOF:
        found = lumped_modes_dense(mass_matrix, stiffness_matrix, 0.0, f_high)
        if found.frequencies.size > max_modes:
            raise TooManyModes(max_modes, f_high)
        return found.frequencies, found.rigid_body_modes
    from scipy.sparse import csr_array, diags_array

    m = csr_array(mass_matrix)
    k = csr_array(stiffness_matrix)
    _check_symmetric(m, k)
    scale = _scale(m, k)
    pad = RIGID_BODY_TOLERANCE * scale
    if _is_diagonal(m):
        d = 1.0 / np.sqrt(_diagonal(m))
        a = csr_array(diags_array(d) @ k @ diags_array(d))
        width = _bandwidth(a)
        if width > 1:
            from scipy.sparse.csgraph import reverse_cuthill_mckee

            order = reverse_cuthill_mckee(a, symmetric_mode=True)
            a = csr_array(a[order][:, order])
            width = _bandwidth(a)
        if width <= BANDED_MAX_BANDWIDTH:
            lam = _banded_eigenvalues(a, width, lam_hi + pad, max_modes)
            return _frequencies_only(lam, scale)
    found = lumped_modes_band(m, k, 0.0, f_high, max_count=max_modes)
    if found.frequencies.size > max_modes:
        raise TooManyModes(max_modes, f_high)
    return found.frequencies, found.rigid_body_modes


def _banded_eigenvalues(a, width: int, upper: float, max_modes: int) -> np.ndarray:
    """Eigenvalues of the symmetric band matrix ``a`` from below zero up to ``upper``,
    at most ``max_modes`` of them (TooManyModes otherwise)."""
    from scipy.linalg import eigvals_banded, eigvalsh_tridiagonal

    n = a.shape[0]
    if width <= 1:
        diagonal = a.diagonal().astype(float)
        off = a.diagonal(-1).astype(float) if n > 1 else np.zeros(0)

        def solve(select, bounds):
            return eigvalsh_tridiagonal(diagonal, off, select=select, select_range=bounds,
                                        lapack_driver="stebz")
    else:
        band = np.zeros((width + 1, n))
        for j in range(width + 1):
            band[j, : n - j] = a.diagonal(-j)

        def solve(select, bounds):
            return eigvals_banded(band, lower=True, select=select, select_range=bounds)
    if n > max_modes:
        beyond = solve("i", (max_modes, max_modes))
        if beyond.size and beyond[0] <= upper:
            raise TooManyModes(max_modes, math.sqrt(max(upper, 0.0)) / (2 * math.pi))
    low = -1.0 - abs(upper)  # below zero: a negative eigenvalue is reported, not missed
    return np.asarray(solve("v", (low, upper)), dtype=float)


def _frequencies_only(lam: np.ndarray, scale: float):
    tol = RIGID_BODY_TOLERANCE * scale
    if lam.size and lam.min() < -tol:
        raise ValueError(
            f"stiffness matrix must not be negative definite in any mode, got omega^2 = "
            f"{float(lam.min()):g} 1/s^2")
    lam = np.sort(lam)
    rigid = lam <= tol
    lam = np.where(rigid, 0.0, lam)
    return np.sqrt(lam) / (2 * np.pi), int(rigid.sum())


def lumped_modes(mass_matrix, stiffness_matrix, f_low=None, f_high=None) -> LumpedModes:
    """Modes of a lumped model, dense or sparse by model size.

    Parameters
    ----------
    mass_matrix, stiffness_matrix : array_like or scipy.sparse matrix
        M [kg] and K [N/m], as from :func:`lumped_matrices`.
    f_low, f_high : float, optional
        Frequency band [Hz]. Without it every mode is returned, for models of up to
        :data:`ALL_MODES_MAX_DOF` degrees of freedom.

    Returns
    -------
    LumpedModes
        Frequencies [Hz], mass-normalised shapes [1/sqrt(kg)], rigid-body count
        [unitless].

    Notes
    -----
    With a band: up to :data:`DENSE_MAX_DOF` degrees of freedom
    :func:`lumped_modes_dense`, above it :func:`lumped_modes_band`; both give the
    same modes (tested on a 1000-DOF model).
    """
    n = _check_pair(mass_matrix, stiffness_matrix)
    if f_low is None and f_high is None:
        if n > ALL_MODES_MAX_DOF:
            raise ValueError(
                f"a model of {n} degrees of freedom needs a frequency band (f_low, f_high); "
                f"every mode is only computed up to {ALL_MODES_MAX_DOF}"
            )
        return lumped_modes_dense(mass_matrix, stiffness_matrix)
    f_low = 0.0 if f_low is None else f_low
    if f_high is None:
        raise ValueError("a frequency band needs its upper edge f_high")
    if n <= DENSE_MAX_DOF:
        return lumped_modes_dense(mass_matrix, stiffness_matrix, f_low, f_high)
    return lumped_modes_band(mass_matrix, stiffness_matrix, f_low, f_high)


# ----------------------------------------------------------------- participation


def translation_influence(n_nodes: int, direction: ArrayLike) -> np.ndarray:
    """Influence vector of a rigid translation for a node-major multi-direction model.

    Parameters
    ----------
    n_nodes : int
        Number of nodes [unitless].
    direction : array_like
        Direction of the translation, one entry per coordinate of a node (length 1, 2
        or 3: x, y, z) [unitless]; normalised to unit length here.

    Returns
    -------
    numpy.ndarray
        r, shape (n_nodes * len(direction),): the displacement of every coordinate for
        a unit translation along ``direction`` [unitless].
    """
    direction = np.asarray(direction, dtype=float).reshape(-1)
    length = float(np.linalg.norm(direction))
    if not (length > 0) or not np.isfinite(length):
        raise ValueError("direction must be a non-zero vector")
    if int(n_nodes) < 1:
        raise ValueError(f"number of nodes must be at least 1, got {n_nodes}")
    return np.tile(direction / length, int(n_nodes))


def modal_participation(shapes: ArrayLike, mass_matrix, influence: ArrayLike | None = None):
    """Participation factors and modal effective masses for a direction of excitation.

    Parameters
    ----------
    shapes : array_like
        Mode shapes as columns, (n_dof, n_modes) [1/sqrt(kg) if mass-normalised].
    mass_matrix : array_like or scipy.sparse matrix
        Mass matrix M, (n_dof, n_dof) [kg].
    influence : array_like, optional
        Influence vector r: each coordinate's displacement under a unit rigid motion
        of the base in the chosen direction, (n_dof,) [unitless]. By default all ones
        (every coordinate along the excitation); see :func:`translation_influence`.

    Returns
    -------
    factors : numpy.ndarray
        Gamma_j = phi_j^T M r / (phi_j^T M phi_j), (n_modes,) [sqrt(kg) for
        mass-normalised shapes].
    effective_masses : numpy.ndarray
        m_eff,j = (phi_j^T M r)^2 / (phi_j^T M phi_j), (n_modes,) [kg]; over all modes
        they add up to r^T M r (the total mass for a rigid translation).

    Notes
    -----
    The definitions of base-excited modal analysis [1]_; independent of how the shapes
    are normalised except for Gamma's scale.

    References
    ----------
    .. [1] A. K. Chopra, Dynamics of Structures, 4th ed., Prentice Hall, 2012,
       sec. 13.2 (from memory).
    """
    phi = np.asarray(shapes, dtype=float)
    if phi.ndim == 1:
        phi = phi[:, None]
    n = phi.shape[0]
    r = np.ones(n) if influence is None else np.asarray(influence, dtype=float).reshape(-1)
    if r.size != n:
        raise ValueError(f"influence vector must have {n} entries, got {r.size}")
    if not _is_sparse(mass_matrix):
        mass_matrix = np.asarray(mass_matrix, dtype=float)
    m_phi = mass_matrix @ phi
    modal_mass = np.einsum("ij,ij->j", phi, m_phi)
    excitation = m_phi.T @ r
    return excitation / modal_mass, excitation**2 / modal_mass

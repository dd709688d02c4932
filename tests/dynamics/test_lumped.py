"""Lumped mass-spring models against closed-form chain solutions and a dense solve."""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.sparse import issparse

from vcheck.dynamics.modes import lumped

TWO_PI = 2 * math.pi


def chain_springs(n, k, ground_left=True, ground_right=False):
    """Springs of a chain of n nodes, optionally tied to ground at either end."""
    rows = [(i, i + 1, k) for i in range(n - 1)]
    if ground_left:
        rows.insert(0, (None, 0, k))
    if ground_right:
        rows.append((n - 1, -1, k))
    return rows


# ------------------------------------------------------------- closed-form chains


def test_two_mass_chain_from_ground():
    # REFERENCES.md [D]: ground-k-m-k-m, omega = 0.618034 and 1.618034 sqrt(k/m)
    # (the golden-ratio pair (sqrt(5) -+ 1)/2); k = 1000 N/m, m = 1 kg -> 3.1105 and
    # 8.1434 Hz. Quoted to 4 decimals: tolerance 5e-5 Hz; the factors to 1e-6.
    m, k = lumped.lumped_matrices([1.0, 1.0], chain_springs(2, 1000.0))
    modes = lumped.lumped_modes(m, k)
    np.testing.assert_allclose(modes.frequencies, [3.1105, 8.1434], atol=5e-5)
    np.testing.assert_allclose(
        modes.frequencies * TWO_PI / math.sqrt(1000.0), [0.618034, 1.618034], atol=1e-6
    )
    assert modes.rigid_body_modes == 0
    # mass-normalised: Phi^T M Phi = I
    np.testing.assert_allclose(modes.shapes.T @ m @ modes.shapes, np.eye(2), atol=1e-14)


def test_two_mass_chain_between_walls():
    # REFERENCES.md [D]: fixed-k-m-k-m-k-fixed, omega = sqrt(k/m) and sqrt(3k/m).
    k_, m_ = 2500.0, 4.0
    m, k = lumped.lumped_matrices([m_, m_], chain_springs(2, k_, ground_right=True))
    f = lumped.lumped_modes_dense(m, k).frequencies
    np.testing.assert_allclose(f * TWO_PI, [math.sqrt(k_ / m_), math.sqrt(3 * k_ / m_)], rtol=1e-13)


def test_n_mass_chain_between_walls_matches_closed_form():
    # Closed form of the uniform fixed-fixed chain (a standard result, e.g. Thomson &
    # Dahleh, Theory of Vibration with Applications, 5th ed., sec. 6.x, from memory):
    # omega_j = 2 sqrt(k/m) sin(j pi / (2(N+1))), shape_j(i) ~ sin(i j pi / (N+1)).
    # Round-off only: tolerance 1e-11.
    n, k_, m_ = 40, 1.0e5, 2.0
    m, k = lumped.lumped_matrices(np.full(n, m_), chain_springs(n, k_, ground_right=True))
    modes = lumped.lumped_modes(m, k)
    j = np.arange(1, n + 1)
    omega = 2 * math.sqrt(k_ / m_) * np.sin(j * math.pi / (2 * (n + 1)))
    np.testing.assert_allclose(modes.frequencies * TWO_PI, omega, rtol=1e-11)
    i = np.arange(1, n + 1)
    for mode in (0, 7, 39):
        want = np.sin(i * (mode + 1) * math.pi / (n + 1))
        want /= math.sqrt(m_ * want @ want)
        got = modes.shapes[:, mode]
        np.testing.assert_allclose(abs(got @ want) * m_, 1.0, atol=1e-10)


def test_effective_masses_of_the_two_mass_chain():
    # [D] from the closed-form shapes x2/x1 = 2 - lambda, lambda = (3 -+ sqrt 5)/2:
    # m_eff = m (x1 + x2)^2 / (x1^2 + x2^2) = 1.894427 and 0.105573 kg; they sum to the
    # total mass (completeness of the modes).
    m, k = lumped.lumped_matrices([1.0, 1.0], chain_springs(2, 1000.0))
    modes = lumped.lumped_modes(m, k)
    factors, masses = lumped.modal_participation(modes.shapes, m)
    np.testing.assert_allclose(masses, [1.894427, 0.105573], atol=1e-6)
    assert masses.sum() == pytest.approx(2.0, rel=1e-14)
    # Gamma for mass-normalised shapes: phi^T M r
    np.testing.assert_allclose(factors**2, masses, rtol=1e-14)


# --------------------------------------------------------------- free models


def test_free_chain_reports_one_rigid_body_mode():
    # A chain not tied to ground has one rigid-body mode at 0 Hz whose effective mass
    # is the whole mass, and the free-free chain's elastic modes follow
    # omega_j = 2 sqrt(k/m) sin(j pi / (2N)) (closed form, from memory; verified to
    # round-off here), with zero effective mass in a uniform translation.
    n, k_, m_ = 30, 1.0e4, 1.5
    m, k = lumped.lumped_matrices(np.full(n, m_), chain_springs(n, k_, ground_left=False))
    modes = lumped.lumped_modes(m, k)
    assert modes.rigid_body_modes == 1
    assert modes.frequencies[0] == 0.0
    j = np.arange(1, n)
    np.testing.assert_allclose(
        modes.frequencies[1:] * TWO_PI,
        2 * math.sqrt(k_ / m_) * np.sin(j * math.pi / (2 * n)),
        rtol=1e-11,
    )
    _, masses = lumped.modal_participation(modes.shapes, m)
    assert masses[0] == pytest.approx(n * m_, rel=1e-12)
    assert np.all(masses[1:] < 1e-9 * n * m_)


def test_free_model_rigid_modes_found_by_the_sparse_search_too():
    # Two separate free chains: two rigid-body modes. A band starting at 0 Hz must
    # report both at 0 Hz from the sparse search, as the dense solve does.
    n = 300
    springs = [(i, i + 1, 1e6) for i in range(n // 2 - 1)]
    springs += [(i, i + 1, 2e6) for i in range(n // 2, n - 1)]
    m, k = lumped.lumped_matrices(np.ones(n), springs, sparse=True)
    dense = lumped.lumped_modes_dense(m, k, 0.0, 30.0)
    band = lumped.lumped_modes_band(m, k, 0.0, 30.0)
    assert dense.rigid_body_modes == band.rigid_body_modes == 2
    np.testing.assert_array_equal(band.frequencies[:2], [0.0, 0.0])
    np.testing.assert_allclose(band.frequencies, dense.frequencies, rtol=1e-9, atol=1e-9)


# ------------------------------------------------------------ sparse vs dense


def random_model(n, seed):
    """A chain with random masses and springs plus random cross springs and ties to
    ground: no symmetry, so no repeated frequencies."""
    rng = np.random.default_rng(seed)
    masses = rng.uniform(0.5, 5.0, n)
    rows = [(i, i + 1, rng.uniform(1e5, 1e6)) for i in range(n - 1)]
    for _ in range(n // 5):
        a, b = rng.integers(0, n, 2)
        if a != b:
            rows.append((int(a), int(b), rng.uniform(1e3, 1e5)))
    for node in rng.integers(0, n, 5):
        rows.append((-1, int(node), rng.uniform(1e4, 1e5)))
    return lumped.lumped_matrices(masses, np.array(rows, dtype=float), sparse=True)


@pytest.mark.parametrize("band", [(40.0, 40.8), (40.0, 45.0), (80.0, 110.0)])
def test_sparse_band_search_matches_dense_solve(band):
    # Independent method: LAPACK dense solve of the same 1000-DOF model. Frequencies
    # to 1e-9 relative (both converge to round-off; ARPACK's default tolerance is
    # machine precision) and shapes equal up to sign: |phi_s^T M phi_d| = 1 to 1e-7.
    # The wide band holds more modes than the first Lanczos run asks for, so the
    # search must grow its count to cover it.
    m, k = random_model(1000, seed=7)
    dense = lumped.lumped_modes_dense(m, k, *band)
    sparse = lumped.lumped_modes_band(m, k, *band)
    assert len(dense.frequencies) >= 3
    assert len(sparse.frequencies) == len(dense.frequencies)
    np.testing.assert_allclose(sparse.frequencies, dense.frequencies, rtol=1e-9)
    overlap = np.abs(np.einsum("ij,ij->j", sparse.shapes, m @ dense.shapes))
    np.testing.assert_allclose(overlap, 1.0, atol=1e-7)
    assert np.all((dense.frequencies >= band[0]) & (dense.frequencies <= band[1]))
    # and the dense band is exactly the in-band part of the full solution
    full = lumped.lumped_modes_dense(m, k).frequencies
    inside = full[(full >= band[0]) & (full <= band[1])]
    np.testing.assert_allclose(dense.frequencies, inside, rtol=1e-12)


def test_chooser_goes_sparse_above_the_crossover(monkeypatch):
    calls = []
    band_search = lumped.lumped_modes_band

    def spy(*args, **kwargs):
        calls.append(args[0].shape[0])
        return band_search(*args, **kwargs)

    monkeypatch.setattr(lumped, "lumped_modes_band", spy)
    small = random_model(lumped.DENSE_MAX_DOF, seed=3)
    lumped.lumped_modes(*small, 60.0, 70.0)
    assert calls == []
    n = lumped.DENSE_MAX_DOF + 200
    m, k = random_model(n, seed=3)
    picked = lumped.lumped_modes(m, k, 60.0, 70.0)
    assert calls == [n]
    dense = lumped.lumped_modes_dense(m, k, 60.0, 70.0)
    np.testing.assert_allclose(picked.frequencies, dense.frequencies, rtol=1e-9)


def test_chooser_needs_a_band_for_a_large_model():
    n = lumped.ALL_MODES_MAX_DOF + 1
    m, k = lumped.lumped_matrices(np.ones(n), chain_springs(n, 1.0))
    with pytest.raises(
        ValueError,
        match=rf"^a model of {n} degrees of freedom needs a frequency band \(f_low, f_high\); "
        rf"every mode is only computed up to {lumped.ALL_MODES_MAX_DOF}$",
    ):
        lumped.lumped_modes(m, k)


def test_sparse_and_dense_assembly_agree():
    springs = [(None, 0, 5.0), (0, 1, 3.0), (1, 2, 2.0), (0, 2, 1.0), (2, -1, 4.0), (0, 1, 1.0)]
    md, kd = lumped.lumped_matrices([1.0, 2.0, 3.0], springs)
    ms, ks = lumped.lumped_matrices([1.0, 2.0, 3.0], springs, sparse=True)
    assert issparse(ks) and not issparse(kd)
    np.testing.assert_array_equal(ks.toarray(), kd)
    np.testing.assert_array_equal(ms.toarray(), md)
    # by hand: K = sum k (e_a - e_b)(e_a - e_b)^T; parallel springs 0-1 add
    want = np.array([[5 + 4 + 1, -4, -1], [-4, 4 + 2, -2], [-1, -2, 2 + 1 + 4]], float)
    np.testing.assert_array_equal(kd, want)


# ------------------------------------------------------------- directions


def test_participation_in_a_direction_of_a_two_direction_model():
    # Two nodes, each with x and y coordinates (node-major), tied to ground in x by
    # k_x and in y by k_y and to each other only in x. The y modes are single-mass
    # oscillators; excitation at 30 degrees puts sin^2(30) of each node's mass into
    # the y modes and cos^2(30) into the x modes [D].
    kx, ky, m_ = 1000.0, 4000.0, 2.0
    springs = [(-1, 0, kx), (0, 2, kx), (-1, 1, ky), (-1, 3, ky)]
    m, k = lumped.lumped_matrices(np.full(4, m_), springs)
    modes = lumped.lumped_modes(m, k)
    r = lumped.translation_influence(2, [math.cos(math.radians(30)), math.sin(math.radians(30))])
    _, masses = lumped.modal_participation(modes.shapes, m, r)
    y_modes = np.isclose(modes.frequencies, math.sqrt(ky / m_) / TWO_PI)
    assert y_modes.sum() == 2
    assert masses[y_modes].sum() == pytest.approx(2 * m_ * 0.25, rel=1e-12)
    assert masses[~y_modes].sum() == pytest.approx(2 * m_ * 0.75, rel=1e-12)


# ------------------------------------------------------------- bad input


def test_negative_and_zero_masses_are_rejected():
    with pytest.raises(ValueError, match=r"^mass at node 1 must be positive, got -2 kg$"):
        lumped.lumped_matrices([1.0, -2.0], [(None, 0, 1.0)])
    with pytest.raises(ValueError, match=r"^mass at node 0 must be positive, got 0 kg$"):
        lumped.lumped_matrices([0.0, 1.0], [(None, 0, 1.0)])


@pytest.mark.parametrize(
    "springs, message",
    [
        (
            [(0, 5, 1.0)],
            r"^spring 0 connects node 5, but the model has nodes 0 to 1 \(and -1 for ground\)$",
        ),
        ([(0, 1, 1.0), (1, 1, 2.0)], r"^spring 1 connects node 1 to itself$"),
        ([(None, -1, 1.0)], r"^spring 0 connects ground to ground$"),
        ([(0, 1, -3.0)], r"^stiffness of spring 0 must be positive, got -3 N/m$"),
        ([(0, 1)], r"^spring 0 must be \(node a, node b, stiffness\), got \(0, 1\)$"),
    ],
)
def test_bad_springs_are_rejected(springs, message):
    with pytest.raises(ValueError, match=message):
        lumped.lumped_matrices([1.0, 1.0], springs)


def test_bad_bands_and_matrices_are_rejected():
    m, k = lumped.lumped_matrices([1.0, 1.0], chain_springs(2, 1.0))
    with pytest.raises(ValueError, match=r"^frequency band is reversed: 5 Hz is above 2 Hz$"):
        lumped.lumped_modes_dense(m, k, 5.0, 2.0)
    with pytest.raises(ValueError, match=r"^lower band edge must not be negative, got -1 Hz$"):
        lumped.lumped_modes_dense(m, k, -1.0, 2.0)
    with pytest.raises(ValueError, match=r"^stiffness matrix must be symmetric$"):
        lumped.lumped_modes_dense(m, np.array([[2.0, -1.0], [0.0, 1.0]]))
    with pytest.raises(
        ValueError, match=r"^mass and stiffness matrices must be square and of one size"
    ):
        lumped.lumped_modes_dense(m, np.eye(3))

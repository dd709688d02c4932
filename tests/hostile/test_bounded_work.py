"""Bounded work on large lumped models: frequencies only, a bounded count of modes.

References named beside each check:

* Closed form of a uniform fixed-free chain of N masses m and N springs k (the first to
  ground): omega_j^2 = 4 (k/m) sin^2((2j - 1) pi / (2 (2N + 1))), j = 1..N (the
  standard result for a discrete string, e.g. L. Meirovitch, Elements of Vibration
  Analysis, 2nd ed., 1986, from memory).
* scipy.linalg.eigh on the dense matrices: an independent numerical method.
"""

from __future__ import annotations

import numpy as np
import pytest
import scipy.linalg

from vcheck.dynamics.modes import lumped


def _chain(n: int, m: float, k: float, ground: bool = True):
    springs = [(i - 1 if i else (-1 if ground else 0), i, k) for i in range(0 if ground else 1, n)]
    return lumped.lumped_matrices(np.full(n, m), springs, sparse=True)


def _dense_band(mass, stiffness, f_high):
    lam = scipy.linalg.eigh(stiffness.toarray(), mass.toarray(), eigvals_only=True)
    f = np.sqrt(np.clip(lam, 0, None)) / (2 * np.pi)
    return f[f <= f_high]


def test_a_chain_matches_its_closed_form():
    n, m, k = 3000, 100.0, 1e12
    mass, stiffness = _chain(n, m, k)
    f_high = 200.0
    found, rigid = lumped.lumped_frequencies(mass, stiffness, f_high, 200)
    j = np.arange(1, n + 1)
    exact = 2 * np.sqrt(k / m) * np.sin((2 * j - 1) * np.pi / (2 * (2 * n + 1))) / (2 * np.pi)
    exact = exact[exact <= f_high]
    assert rigid == 0 and found.size == exact.size > 5
    # bisection converges to a few ulps of the largest eigenvalue: relative 1e-9 is ample
    np.testing.assert_allclose(found, exact, rtol=1e-9)


def test_a_banded_model_matches_a_dense_solve():
    # two chains of 400 masses side by side, joined node by node: bandwidth 2 after the
    # reverse Cuthill-McKee reordering, solved by the banded LAPACK path
    n = 400
    masses = np.concatenate([np.full(n, 50.0), np.full(n, 80.0)])
    springs = [(i - 1 if i else -1, i, 4e9) for i in range(n)]
    springs += [(n + i - 1 if i else -1, n + i, 6e9) for i in range(n)]
    springs += [(i, n + i, 1e8) for i in range(n)]
    mass, stiffness = lumped.lumped_matrices(masses, springs, sparse=True)
    found, _ = lumped.lumped_frequencies(mass, stiffness, 300.0, 200)
    np.testing.assert_allclose(found, _dense_band(mass, stiffness, 300.0), rtol=1e-8)


def test_too_many_modes_are_refused_before_they_are_computed():
    mass, stiffness = _chain(3000, 100.0, 1e7)
    with pytest.raises(lumped.TooManyModes, match="more than 200 modes lie at or below 98"):
        lumped.lumped_frequencies(mass, stiffness, 98.67, 200)


def test_a_free_chain_counts_its_rigid_body_mode():
    mass, stiffness = _chain(1000, 10.0, 1e12, ground=False)
    found, rigid = lumped.lumped_frequencies(mass, stiffness, 50.0, 200)
    assert rigid == 1 and found[0] == 0.0


def test_a_soft_long_chain_is_a_located_error(run_cli, tmp_path):
    n = 2000
    masses = ",".join(['"100kg"'] * n)
    springs = ",\n".join(f'{{between=[{i},{i + 1}],stiffness="1e7N/m"}}' for i in range(n))
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "d.toml").write_text(
        'format = 1\n\n[machine]\ntag = "CHAIN"\nkind = "fan"\nmass = "300 kg"\n'
        f'speed = "1480 rpm"\n\n[[lumped-model]]\nname = "chain"\nmasses = [{masses}]\n'
        f"springs = [\n{springs}\n]\n")
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == (
        "d.toml:9:1: lumped-model[1]: lumped model 'chain' has more than 200 modes at or "
        "below 98.67 Hz (the search ceiling, 2 x the highest forcing frequency); vcheck "
        "judges at most 200 modes of one model: give fewer nodes, or the modes themselves "
        "as [[natural-frequency]] or a [[mode-file]]")

"""Natural frequencies and mode shapes of torsional trains of discs and shafts."""

from __future__ import annotations

from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "GROUND", "TorsionalModes", "free_parts", "torsional_frequencies",
    "torsional_frequencies_varied", "torsional_modes",
]

GROUND = -1
"""Index that stands for the ground (a fixed end) in a link."""


class TorsionalModes(NamedTuple):
    """Elastic torsional modes of a train, lowest first."""

    frequencies: np.ndarray
    """Natural frequencies of the elastic modes, shape (m,) [Hz]."""
    shapes: np.ndarray
    """Mode shapes, one column a mode, shape (n, m), scaled so the largest angle of each
    is +1 [unitless]."""
    energy_shares: np.ndarray
    """Share of each link in each mode's strain energy, shape (links, m); each column
    sums to 1 [unitless]."""
    rigid_body_modes: int
    """Rigid-body (zero-frequency) modes left out: one for each part of the train not
    tied to the ground [unitless]."""


def _links(links, count: int):
    rows = list(links)
    first = np.array([int(r[0]) for r in rows], dtype=int)
    second = np.array([int(r[1]) for r in rows], dtype=int)
    stiffness = np.array([float(r[2]) for r in rows], dtype=float)
    for a, b in zip(first, second):
        for node in (a, b):
            if not (node == GROUND or 0 <= node < count):
                raise ValueError(f"a link joins disc {node}, but the train has discs 0 to "
                                 f"{count - 1} (and the ground, {GROUND})")
        if a == b:
            raise ValueError(f"a link joins disc {a} to itself")
    bad = ~(stiffness > 0) | ~np.isfinite(stiffness)
    if np.any(bad):
        raise ValueError(f"link stiffness must be positive, got {stiffness[bad][0]:g} N m/rad")
    return first, second, stiffness


def free_parts(count: int, links) -> list[list[int]]:
    """Parts of a train that turn freely: the connected sets of discs not tied to the
    ground, each a sorted list of disc indices (union-find over the links)."""
    parent = list(range(count + 1))  # the last is the ground

    def find(i: int) -> int:
        while parent[i] != i:
            parent[i] = parent[parent[i]]
            i = parent[i]
        return i

    for a, b, *_ in links:
        a = count if a == GROUND else int(a)
        b = count if b == GROUND else int(b)
        parent[find(a)] = find(b)
    ground = find(count)
    parts: dict[int, list[int]] = {}
    for i in range(count):
        root = find(i)
        if root != ground:
            parts.setdefault(root, []).append(i)
    return sorted(parts.values())


def _assemble(inertias: ArrayLike, links):
    inertia = np.atleast_1d(np.asarray(inertias, dtype=float))
    if inertia.ndim != 1 or inertia.size == 0:
        raise ValueError("a train needs at least one disc")
    bad = ~(inertia > 0) | ~np.isfinite(inertia)
    if np.any(bad):
        raise ValueError(f"disc inertia must be positive, got {inertia[bad][0]:g} kg m^2")
    n = inertia.size
    first, second, stiffness = _links(links, n)
    matrix = np.zeros((n, n))
    inner = (first != GROUND) & (second != GROUND)
    np.add.at(matrix, (first[first != GROUND], first[first != GROUND]),
              stiffness[first != GROUND])
    np.add.at(matrix, (second[second != GROUND], second[second != GROUND]),
              stiffness[second != GROUND])
    np.add.at(matrix, (first[inner], second[inner]), -stiffness[inner])
    np.add.at(matrix, (second[inner], first[inner]), -stiffness[inner])
    rigid = len(free_parts(n, zip(first, second)))
    return inertia, first, second, stiffness, matrix, rigid


def _diagonal_mass_eigh(matrix, inertia, stiffness, vectors: bool = True):
    """Eigenvalues omega^2 [rad^2/s^2] (ascending) and vectors phi of K phi = omega^2 J phi
    for a diagonal J, through the symmetric form J^-1/2 K J^-1/2 (scaled for
    conditioning whatever the units of the train)."""
    scale_k = float(np.max(stiffness)) if stiffness.size else 1.0
    scale_j = float(np.max(inertia))
    root = 1.0 / np.sqrt(inertia / scale_j)
    symmetric = (matrix / scale_k) * root[:, None] * root[None, :]
    if not vectors:
        return np.linalg.eigvalsh(symmetric) * (scale_k / scale_j), None
    values, y = np.linalg.eigh(symmetric)
    return values * (scale_k / scale_j), y * root[:, None]


def torsional_frequencies(inertias: ArrayLike, links) -> np.ndarray:
    """The elastic natural frequencies alone of :func:`torsional_modes` [Hz] (eigenvalues
    only: faster, for searches over a stiffness)."""
    inertia, _, _, stiffness, matrix, rigid = _assemble(inertias, links)
    values, _ = _diagonal_mass_eigh(matrix, inertia, stiffness, vectors=False)
    values = values[rigid:]
    return np.sqrt(np.clip(values, 0.0, None)) / (2.0 * np.pi)


def torsional_frequencies_varied(inertias: ArrayLike, links, index: int,
                                 stiffnesses: ArrayLike) -> np.ndarray:
    """:func:`torsional_frequencies` for many trial stiffnesses of one link at once [Hz].

    Parameters
    ----------
    inertias : array_like
        Polar mass moment of inertia of each disc, shape (n,) [kg m^2].
    links : sequence of (int, int, float)
        The train's links as in :func:`torsional_modes` [N m/rad].
    index : int
        Which link's stiffness is varied [unitless].
    stiffnesses : array_like
        Trial stiffnesses of that link, shape (t,) [N m/rad]; positive.

    Returns
    -------
    numpy.ndarray
        Elastic natural frequencies, shape (t, m), row r those of the train with link
        ``index`` at ``stiffnesses[r]`` [Hz].

    Notes
    -----
    The same assembly, scaling and symmetric eigenvalue problem as
    :func:`torsional_frequencies`, done for every trial as one stacked array: each trial's
    matrix is summed in the same order as a single call, so each row equals that call's
    result exactly. The rigid-body count depends on which discs the links join, not on
    their stiffness, so it is the same for every trial.
    """
    inertia, first, second, stiffness, _, rigid = _assemble(inertias, links)
    trial = np.atleast_1d(np.asarray(stiffnesses, dtype=float))
    if trial.ndim != 1:
        raise ValueError("trial stiffnesses must be one-dimensional")
    bad = ~(trial > 0) | ~np.isfinite(trial)
    if np.any(bad):
        raise ValueError(f"link stiffness must be positive, got {trial[bad][0]:g} N m/rad")
    if not 0 <= index < stiffness.size:
        raise ValueError(f"link {index} is not in the train (links 0 to {stiffness.size - 1})")
    n, t = inertia.size, trial.size
    varied = np.repeat(stiffness[None, :], t, axis=0)
    varied[:, index] = trial
    matrix = np.zeros((t, n, n))
    rows = np.arange(t)[:, None]
    for ends, keep in ((first, first != GROUND), (second, second != GROUND)):
        at = ends[keep][None, :]
        np.add.at(matrix, (rows, at, at), varied[:, keep])
    inner = (first != GROUND) & (second != GROUND)
    one, two = first[inner][None, :], second[inner][None, :]
    np.add.at(matrix, (rows, one, two), -varied[:, inner])
    np.add.at(matrix, (rows, two, one), -varied[:, inner])
    scale_k = np.max(varied, axis=1)
    scale_j = float(np.max(inertia))
    root = 1.0 / np.sqrt(inertia / scale_j)
    symmetric = (matrix / scale_k[:, None, None]) * root[None, :, None] * root[None, None, :]
    values = np.linalg.eigvalsh(symmetric) * (scale_k / scale_j)[:, None]
    values = values[:, rigid:]
    return np.sqrt(np.clip(values, 0.0, None)) / (2.0 * np.pi)


def torsional_modes(inertias: ArrayLike, links) -> TorsionalModes:
    """Torsional natural frequencies and mode shapes of discs joined by shafts.

    Parameters
    ----------
    inertias : array_like
        Polar mass moment of inertia of each disc, J_i, shape (n,) [kg m^2]; positive.
        In a geared train, referred to one shaft (:func:`.stiffness.refer_to_shaft`).
    links : sequence of (int, int, float)
        Each shaft section or coupling: the two discs it joins (``GROUND`` for a fixed
        end) and its torsional stiffness k [N m/rad], likewise referred.

    Returns
    -------
    TorsionalModes
        The elastic modes; the rigid-body modes (zero frequency, one per part of the
        train free of the ground) are left out and counted.

    Notes
    -----
    The undamped equations of motion J theta'' + K theta = 0, with J diagonal and K
    assembled from the links (k on the two diagonal terms and -k off the diagonal),
    give the generalised symmetric eigenproblem K phi = omega^2 J phi; with J diagonal it
    is the standard problem J^-1/2 K J^-1/2 y = omega^2 y, phi = J^-1/2 y, solved by
    ``numpy.linalg.eigh`` (no scipy import on the checking path); f = omega / (2 pi) [1]_.
    The strain energy of link (a, b) in
    a mode is k (phi_a - phi_b)^2 / 2: its share shows which shaft or coupling twists
    most, where the alternating torque and stress are.

    References
    ----------
    .. [1] W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed.,
       Prentice Hall, 1998, ch. on multi-degree-of-freedom systems and torsional
       systems (from memory).
    """
    inertia, first, second, stiffness, matrix, rigid = _assemble(inertias, links)
    values, vectors = _diagonal_mass_eigh(matrix, inertia, stiffness)
    values = values[rigid:]
    vectors = vectors[:, rigid:]
    omega = np.sqrt(np.clip(values, 0.0, None))
    peak = vectors[np.argmax(np.abs(vectors), axis=0), np.arange(vectors.shape[1])]
    shapes = vectors / np.where(peak == 0, 1.0, peak)
    end_a = np.where(first[:, None] == GROUND, 0.0, shapes[np.maximum(first, 0)])
    end_b = np.where(second[:, None] == GROUND, 0.0, shapes[np.maximum(second, 0)])
    energy = stiffness[:, None] * (end_a - end_b) ** 2
    total = energy.sum(axis=0)
    shares = energy / np.where(total > 0, total, 1.0)
    return TorsionalModes(omega / (2.0 * np.pi), shapes, shares, rigid)

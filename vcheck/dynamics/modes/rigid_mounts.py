"""A rigid machine on resilient mounts: six rigid-body modes and forced response.

Axes and motions
----------------
Machine axes, right-handed, fixed to the machine at rest:

- x along the shaft; translation along x is **surge**, rotation about x is **roll**;
- y across the shaft, horizontal; translation is **sway**, rotation is **pitch**
  (about y);
- z vertical, up; translation is **bounce**, rotation is **yaw** (about z).

The six coordinates are q = (x, y, z, theta_x, theta_y, theta_z) of the centre of
gravity (CG), in m and rad; small motions. Positions of the CG and of the mounts are
given relative to one reference point of the designer's choice (a datum on the base
frame, say), in machine axes [m].

Each mount is a linear spring with three stiffnesses along its own axes: *axial* (its
line of action, vertical for a mount under the machine) and two *shear* directions at
right angles to it. A mount's orientation is a rotation matrix whose columns are the
axial, first-shear and second-shear directions in machine axes; without one a mount
is upright: axial along z, first shear along x, second shear along y. Where the
structure under a mount is itself flexible, its stiffness can be put in series with
the mount's, direction by direction in the mount's axes.

Functions
---------
:func:`uniform_box_inertia` estimates the inertia tensor from the machine's envelope;
:func:`rigid_body_mass_matrix` and :func:`mount_stiffness_matrix` build the 6 x 6
matrices; :func:`rigid_body_modes` gives the six natural frequencies, mass-normalised
mode shapes, kinetic-energy fractions and a description of each mode in words
(:func:`describe_motion`); :func:`mount_forced_response` gives the steady response to
a harmonic force and moment and the dynamic force in every mount.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "DOF_NAMES",
    "DOF_PHRASES",
    "MODE_DOMINANCE",
    "MountModes",
    "MountResponse",
    "describe_motion",
    "kinetic_energy_fractions",
    "load_at_point",
    "mount_axes",
    "mount_forced_response",
    "mount_stiffness_matrix",
    "rigid_body_frequencies",
    "rigid_body_mass_matrix",
    "rigid_body_modes",
    "uniform_box_inertia",
]

DOF_NAMES = ("surge", "sway", "bounce", "roll", "pitch", "yaw")
"""Names of the six rigid-body coordinates, in the order of q: translations along x,
y, z, rotations about x, y, z (the convention of this module's docstring)."""

DOF_PHRASES = {
    "surge": "surge along x",
    "sway": "sway along y",
    "bounce": "bounce along z",
    "roll": "roll about x",
    "pitch": "pitch about y",
    "yaw": "yaw about z",
}
"""Each motion with its axis, as used in messages."""

MODE_DOMINANCE = 0.8
"""Kinetic-energy share above which a mode is named after a single motion [unitless].

Mount layouts are commonly judged "decoupled" when each mode puts 80 to 90 % of its
kinetic energy into one coordinate (common practice); below the share the mode is
described as coupled, naming the motions that together reach it."""

_UPRIGHT = np.array([[0.0, 1.0, 0.0], [0.0, 0.0, 1.0], [1.0, 0.0, 0.0]])
# columns: axial = z, first shear = x, second shear = y

_NULL_TOLERANCE = 1e-10  # omega^2 below this share of the largest is "unrestrained"


# --------------------------------------------------------------------------- checks


def _vector3(name: str, value: ArrayLike) -> np.ndarray:
    arr = np.asarray(value, dtype=float)
    if arr.shape != (3,) or not np.all(np.isfinite(arr)):
        raise ValueError(f"{name} must be three finite coordinates (x, y, z) in m")
    return arr


def _mount_table(name: str, value: ArrayLike, n: int | None, unit: str) -> np.ndarray:
    arr = np.asarray(value, dtype=float)
    if arr.ndim == 1 and arr.shape == (3,) and n in (None, 1):
        arr = arr[None, :]
    if arr.ndim != 2 or arr.shape[1] != 3 or (n is not None and arr.shape[0] != n):
        want = "(n, 3)" if n is None else f"({n}, 3)"
        raise ValueError(f"{name} must have shape {want}, one row per mount, got {arr.shape}")
    if arr.shape[0] == 0:
        raise ValueError("a mount layout needs at least one mount")
    return arr


def _positive_scalar(name: str, value, unit: str) -> float:
    v = float(value)
    if not (v > 0) or not np.isfinite(v):
        raise ValueError(f"{name} must be positive, got {v:g} {unit}")
    return v


# --------------------------------------------------------------------------- inertia


def uniform_box_inertia(
    mass: float, length_x: float, length_y: float, length_z: float
) -> np.ndarray:
    """Inertia tensor of a uniform solid box about its centre, in its edge axes.

    An estimate for a machine known only by its mass and envelope.

    Parameters
    ----------
    mass : float
        Mass [kg]; positive.
    length_x, length_y, length_z : float
        Edge lengths along x, y and z [m]; positive.

    Returns
    -------
    numpy.ndarray
        Diagonal 3 x 3 tensor [kg m^2]: I_xx = m (b^2 + c^2) / 12 and so on.

    Notes
    -----
    Real machines concentrate mass near the shaft and base; the envelope box tends to
    overestimate the moments of an open frame and underestimate those of a machine
    with heavy overhung parts. Use the maker's values where given.

    References
    ----------
    .. [1] J. L. Meriam, L. G. Kraige, Engineering Mechanics: Dynamics, 7th ed., Wiley,
       2012, appendix B, table of mass moments of inertia (from memory).
    """
    m = _positive_scalar("machine mass", mass, "kg")
    a = _positive_scalar("box length along x", length_x, "m")
    b = _positive_scalar("box length along y", length_y, "m")
    c = _positive_scalar("box length along z", length_z, "m")
    return (m / 12.0) * np.diag([b * b + c * c, a * a + c * c, a * a + b * b])


def _check_inertia(inertia: ArrayLike) -> np.ndarray:
    j = np.asarray(inertia, dtype=float)
    if j.shape != (3, 3) or not np.all(np.isfinite(j)):
        raise ValueError("inertia tensor must be a finite 3 x 3 matrix in kg m^2")
    top = float(np.abs(j).max())
    if np.abs(j - j.T).max() > 1e-9 * max(top, 1e-300):
        raise ValueError("inertia tensor must be symmetric")
    principal = np.linalg.eigvalsh(j)
    text = ", ".join(f"{p:.6g}" for p in principal)
    if not principal[0] > 0:
        raise ValueError(
            "inertia tensor about the centre of gravity must be positive definite, "
            f"got principal moments {text} kg m^2"
        )
    if principal[0] + principal[1] < principal[2] * (1.0 - 1e-9):
        raise ValueError(
            "inertia tensor is not that of a real body: principal moments "
            f"{text} kg m^2 break I1 + I2 >= I3"
        )
    return j


def rigid_body_mass_matrix(mass: float, inertia: ArrayLike) -> np.ndarray:
    """6 x 6 mass matrix of a rigid body in coordinates of its centre of gravity.

    Parameters
    ----------
    mass : float
        Machine mass, with everything that moves with it (base frame, inertia block)
        [kg]; positive.
    inertia : array_like
        Inertia tensor about the centre of gravity in machine axes, 3 x 3, symmetric
        positive definite [kg m^2]; products of inertia enter as I_xy = -integral x y dm
        (the tensor's off-diagonal entries). See :func:`uniform_box_inertia`.

    Returns
    -------
    numpy.ndarray
        M = diag(m, m, m, J) [kg, kg m^2].

    Notes
    -----
    In coordinates of the CG the translational and rotational parts do not couple [1]_.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 3, "Vibration of a resiliently supported rigid body"
       (from memory).
    """
    m = _positive_scalar("machine mass", mass, "kg")
    out = np.zeros((6, 6))
    out[0, 0] = out[1, 1] = out[2, 2] = m
    out[3:, 3:] = _check_inertia(inertia)
    return out


def load_at_point(force: ArrayLike, point: ArrayLike, centre_of_gravity: ArrayLike):
    """Force applied at a point, as a force and moment about the centre of gravity.

    Parameters
    ----------
    force : array_like
        Force vector in machine axes (complex amplitudes allowed) [N].
    point : array_like
        Where it acts, from the reference point [m].
    centre_of_gravity : array_like
        Centre of gravity, from the reference point [m].

    Returns
    -------
    numpy.ndarray
        Load vector (F_x, F_y, F_z, M_x, M_y, M_z) about the CG [N, N m]; M = r x F.
    """
    f = np.asarray(force)
    if f.shape != (3,):
        raise ValueError("force must have three components (x, y, z) in N")
    r = _vector3("load point", point) - _vector3("centre of gravity", centre_of_gravity)
    return np.concatenate([f, np.cross(r, f)])


# --------------------------------------------------------------------------- mounts


def mount_axes(axial: ArrayLike, shear: ArrayLike | None = None) -> np.ndarray:
    """Rotation matrices of mounts from their axial and first shear directions.

    Parameters
    ----------
    axial : array_like
        Axial direction of each mount in machine axes, (n, 3) or (3,) [unitless].
    shear : array_like, optional
        First shear direction of each mount, (n, 3) or (3,) [unitless]; the part
        along the axial direction is removed. By default x projected off the axial
        direction (y where the axis is along x).

    Returns
    -------
    numpy.ndarray
        (n, 3, 3): columns axial, first shear, second shear = axial x first shear,
        unit vectors in machine axes [unitless].
    """
    a = np.atleast_2d(np.asarray(axial, dtype=float))
    if a.shape[-1] != 3:
        raise ValueError("axial directions must have three components")
    norm = np.linalg.norm(a, axis=1)
    if np.any(~(norm > 0)):
        raise ValueError("axial directions must be non-zero vectors")
    a = a / norm[:, None]
    if shear is None:
        s = np.tile([1.0, 0.0, 0.0], (a.shape[0], 1))
        along_x = np.abs(a[:, 0]) > 0.9
        s[along_x] = [0.0, 1.0, 0.0]
    else:
        s = np.broadcast_to(np.atleast_2d(np.asarray(shear, dtype=float)), a.shape).copy()
    s = s - np.einsum("ij,ij->i", s, a)[:, None] * a
    norm = np.linalg.norm(s, axis=1)
    if np.any(~(norm > 1e-9)):
        raise ValueError("shear direction must not be parallel to the axial direction")
    s = s / norm[:, None]
    out = np.empty((a.shape[0], 3, 3))
    out[:, :, 0] = a
    out[:, :, 1] = s
    out[:, 0, 2] = a[:, 1] * s[:, 2] - a[:, 2] * s[:, 1]  # a x s, written out (fast)
    out[:, 1, 2] = a[:, 2] * s[:, 0] - a[:, 0] * s[:, 2]
    out[:, 2, 2] = a[:, 0] * s[:, 1] - a[:, 1] * s[:, 0]
    return out


def _skew(r: np.ndarray) -> np.ndarray:
    """[r]x for each row of r: [r]x v = r x v; shape (n, 3, 3)."""
    out = np.zeros((r.shape[0], 3, 3))
    out[:, 0, 1], out[:, 0, 2] = -r[:, 2], r[:, 1]
    out[:, 1, 0], out[:, 1, 2] = r[:, 2], -r[:, 0]
    out[:, 2, 0], out[:, 2, 1] = -r[:, 1], r[:, 0]
    return out


def _layout(positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses):
    """Validated layout: T (n,3,6), R (n,3,3), k_mount (n,3), k_support (n,3)."""
    p = _mount_table("mount positions", positions, None, "m")
    if not np.all(np.isfinite(p)):
        raise ValueError("mount positions must be finite, in m")
    n = p.shape[0]
    k = _mount_table("mount stiffnesses", stiffnesses, n, "N/m")
    bad = ~(k >= 0) | ~np.isfinite(k)
    if np.any(bad):
        i, j = np.argwhere(bad)[0]
        raise ValueError(f"stiffness of mount {i} must not be negative, got {k[i, j]:g} N/m")
    if support_stiffnesses is None:
        ks = np.full((n, 3), np.inf)
    else:
        ks = _mount_table("support stiffnesses", support_stiffnesses, n, "N/m")
        bad = ~(ks > 0)
        if np.any(bad):
            i, j = np.argwhere(bad)[0]
            raise ValueError(
                f"support stiffness under mount {i} must be positive, got {ks[i, j]:g} N/m"
            )
    if orientations is None:
        rot = np.broadcast_to(_UPRIGHT, (n, 3, 3))
    else:
        rot = np.asarray(orientations, dtype=float)
        if rot.shape == (3, 3):
            rot = np.broadcast_to(rot, (n, 3, 3))
        if rot.shape != (n, 3, 3):
            raise ValueError(f"mount orientations must have shape ({n}, 3, 3), got {rot.shape}")
        gram = np.einsum("nki,nkj->nij", rot, rot)
        off = np.abs(gram - np.eye(3)).max(axis=(1, 2))
        if np.any(~(off < 1e-6)):
            i = int(np.flatnonzero(~(off < 1e-6))[0])
            raise ValueError(
                f"orientation of mount {i} must be a rotation matrix (orthonormal columns: "
                "axial, first shear, second shear)"
            )
    r = p - _vector3("centre of gravity", centre_of_gravity)
    t = np.concatenate([np.broadcast_to(np.eye(3), (n, 3, 3)), -_skew(r)], axis=2)
    return t, rot, k, ks


def _series(k_mount: np.ndarray, k_support: np.ndarray) -> np.ndarray:
    """k_m k_s / (k_m + k_s), written to take k_s = inf and k_m = 0 (also complex)."""
    return k_mount / (1.0 + k_mount / k_support)


def _assemble(t: np.ndarray, rot: np.ndarray, k_dir: np.ndarray) -> np.ndarray:
    """sum_i T_i^T R_i diag(k_i) R_i^T T_i, k_dir (n, 3) real or complex."""
    k_global = np.einsum("nij,nj,nkj->nik", rot, k_dir, rot)
    return np.einsum("nai,nab,nbj->ij", t, k_global, t)


def mount_stiffness_matrix(
    positions: ArrayLike,
    stiffnesses: ArrayLike,
    centre_of_gravity: ArrayLike = (0.0, 0.0, 0.0),
    orientations: ArrayLike | None = None,
    support_stiffnesses: ArrayLike | None = None,
) -> np.ndarray:
    """6 x 6 stiffness matrix of a mount layout about the centre of gravity.

    Parameters
    ----------
    positions : array_like
        Elastic centre of each mount, (n, 3), from the reference point, machine axes
        [m].
    stiffnesses : array_like
        Each mount's stiffness along its axial, first-shear and second-shear axes,
        (n, 3) [N/m]; zero or positive.
    centre_of_gravity : array_like, default (0, 0, 0)
        Machine CG from the reference point [m].
    orientations : array_like, optional
        Each mount's rotation matrix, (n, 3, 3) or one (3, 3) for all, columns axial,
        first shear, second shear in machine axes [unitless] (see :func:`mount_axes`);
        by default upright (axial z, shear x and y).
    support_stiffnesses : array_like, optional
        Stiffness of the structure under each mount along the mount's three axes,
        (n, 3), in series with the mount [N/m]; positive, ``inf`` for rigid. Default
        rigid.

    Returns
    -------
    numpy.ndarray
        K, 6 x 6 symmetric, in the coordinates (x, y, z, theta_x, theta_y, theta_z) of
        the CG [N/m, N/rad, N m/rad].

    Notes
    -----
    A mount at r (from the CG) moves by u = x + theta x r = T q with T = [I, -[r]x].
    Its stiffness in machine axes is R diag(k) R^T, so K = sum T^T R diag(k) R^T T
    [1]_. With support stiffness in series each direction has
    k_eff = k_m k_s / (k_m + k_s).

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 3 (from memory); the transformation is the rigid-body
       kinematics of small rotations.
    """
    t, rot, k, ks = _layout(
        positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
    )
    return _assemble(t, rot, _series(k, ks))


# --------------------------------------------------------------------------- modes


def kinetic_energy_fractions(mass_matrix: ArrayLike, shapes: ArrayLike) -> np.ndarray:
    """Share of each mode's kinetic energy in each coordinate.

    Parameters
    ----------
    mass_matrix : array_like
        6 x 6 mass matrix [kg, kg m^2].
    shapes : array_like
        Mode shapes as columns, (6, n_modes) [any normalisation].

    Returns
    -------
    numpy.ndarray
        E[k, j] = phi_kj (M phi_j)_k / (phi_j^T M phi_j), (6, n_modes) [unitless];
        each column sums to 1.

    Notes
    -----
    The kinetic-energy distribution used to judge mount decoupling [1]_. With products
    of inertia an entry can be slightly negative (the cross terms are shared between
    the two rotations they couple).

    References
    ----------
    .. [1] J. S. Tao, G. R. Liu, K. Y. Lam, Design optimization of marine engine-mount
       system, Journal of Sound and Vibration 235(3), 2000, 477-494 (from memory).
    """
    phi = np.asarray(shapes, dtype=float)
    m = np.asarray(mass_matrix, dtype=float)
    weighted = phi * (m @ phi)
    return weighted / weighted.sum(axis=0)


def describe_motion(fractions: ArrayLike, dominance: float = MODE_DOMINANCE) -> str:
    """Name the motion of a mode from its kinetic-energy fractions.

    Parameters
    ----------
    fractions : array_like
        Kinetic-energy share of each coordinate (surge, sway, bounce, roll, pitch,
        yaw), (6,) [unitless].
    dominance : float, default :data:`MODE_DOMINANCE`
        Share at or above which one coordinate names the mode [unitless].

    Returns
    -------
    str
        "bounce", "roll", ... when one coordinate holds at least ``dominance`` of the
        energy; otherwise "coupled a-b[-c...]": the coordinates, largest share first,
        that together reach ``dominance``.

    Examples
    --------
    >>> describe_motion([0.0, 0.55, 0.0, 0.45, 0.0, 0.0])
    'coupled sway-roll'
    """
    e = np.clip(np.asarray(fractions, dtype=float).reshape(6), 0.0, None)
    total = e.sum()
    e = e / total if total > 0 else e
    order = np.argsort(-e, kind="stable")
    if e[order[0]] >= dominance:
        return DOF_NAMES[order[0]]
    names, acc = [], 0.0
    for idx in order:
        names.append(DOF_NAMES[idx])
        acc += e[idx]
        if acc >= dominance - 1e-12:
            break
    return "coupled " + "-".join(names)


class MountModes(NamedTuple):
    """The six rigid-body modes of a machine on mounts."""

    frequencies: np.ndarray
    """Natural frequencies, ascending, (6,) [Hz]."""
    shapes: np.ndarray
    """Mode shapes as columns, (6, 6), mass-normalised (Phi^T M Phi = I), coordinates
    of the CG (x, y, z [m], theta_x, theta_y, theta_z [rad]) per sqrt of modal mass;
    the largest energy entry of each column is positive."""
    energy_fractions: np.ndarray
    """Kinetic-energy share of each coordinate (rows) in each mode (columns), (6, 6)
    [unitless]; columns sum to 1."""
    descriptions: tuple
    """Each mode in words: "bounce", "coupled sway-roll", ... (see
    :func:`describe_motion`)."""


def _cholesky(mass_matrix: np.ndarray) -> np.ndarray:
    try:
        return np.linalg.cholesky(mass_matrix)
    except np.linalg.LinAlgError:
        raise ValueError("mass matrix must be positive definite") from None


def _null_space_names(m: np.ndarray, lower: np.ndarray, basis: np.ndarray) -> list[str]:
    """Words for the unrestrained motions spanned by ``basis`` (mass-scaled columns)."""
    q = np.linalg.solve(lower.T, basis)  # back to physical coordinates
    # reduced row-echelon form of q^T, pivoting in coordinate order, so that a pure
    # motion that is free comes out pure
    rows = q.T.copy()
    rows /= np.abs(rows).max(axis=1, keepdims=True)
    pivot_row = 0
    for col in range(6):
        if pivot_row == rows.shape[0]:
            break
        best = pivot_row + int(np.argmax(np.abs(rows[pivot_row:, col])))
        if abs(rows[best, col]) < 1e-8:
            continue
        rows[[pivot_row, best]] = rows[[best, pivot_row]]
        rows[pivot_row] /= rows[pivot_row, col]
        for other in range(rows.shape[0]):
            if other != pivot_row:
                rows[other] -= rows[other, col] * rows[pivot_row]
        pivot_row += 1
    rows[np.abs(rows) < 1e-9] = 0.0
    names = []
    for v in rows:
        energy = v * (m @ v)
        energy = np.clip(energy, 0.0, None) / max(energy.sum(), 1e-300)
        involved = [DOF_NAMES[i] for i in np.argsort(-energy, kind="stable") if energy[i] >= 0.05]
        if len(involved) == 1:
            names.append(DOF_PHRASES[involved[0]])
        else:
            names.append("coupled " + "-".join(involved))
    return names


def _join(words: list[str]) -> str:
    if len(words) == 1:
        return words[0]
    return ", ".join(words[:-1]) + " and " + words[-1]


def _solve_modes(mass_matrix: ArrayLike, stiffness_matrix: ArrayLike):
    m = np.asarray(mass_matrix, dtype=float)
    k = np.asarray(stiffness_matrix, dtype=float)
    if m.shape != (6, 6) or k.shape != (6, 6):
        raise ValueError(f"mass and stiffness matrices must be 6 x 6, got {m.shape} and {k.shape}")
    lower = _cholesky(m)
    # standard symmetric problem A y = omega^2 y with A = L^-1 K L^-T, phi = L^-T y
    a = np.linalg.solve(lower, np.linalg.solve(lower, k).T)
    a = 0.5 * (a + a.T)
    lam, y = np.linalg.eigh(a)
    top = max(float(lam[-1]), 0.0)
    free = lam <= _NULL_TOLERANCE * top if top > 0 else np.ones(6, bool)
    if np.any(free):
        words = _null_space_names(m, lower, y[:, free])
        raise ValueError(f"mount layout leaves {_join(words)} unrestrained")
    phi = np.linalg.solve(lower.T, y)
    return m, lam, phi


def rigid_body_modes(
    mass_matrix: ArrayLike, stiffness_matrix: ArrayLike, dominance: float = MODE_DOMINANCE
) -> MountModes:
    """Six natural frequencies and modes of a rigid body on mounts.

    Parameters
    ----------
    mass_matrix : array_like
        6 x 6 mass matrix about the CG, from :func:`rigid_body_mass_matrix`
        [kg, kg m^2].
    stiffness_matrix : array_like
        6 x 6 stiffness matrix about the CG, from :func:`mount_stiffness_matrix`
        [N/m, N/rad, N m/rad].
    dominance : float, default :data:`MODE_DOMINANCE`
        Kinetic-energy share that names a mode after one motion [unitless].

    Returns
    -------
    MountModes
        Frequencies [Hz], mass-normalised shapes, energy fractions [unitless] and
        descriptions.

    Raises
    ------
    ValueError
        If the layout leaves a motion unrestrained (a zero-frequency mode); the
        message names the free motion(s), e.g. "mount layout leaves roll about x
        unrestrained".

    Notes
    -----
    K phi = omega^2 M phi, solved as a standard symmetric problem after a Cholesky
    factorisation M = L L^T [1]_.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 3 (from memory).
    """
    m, lam, phi = _solve_modes(mass_matrix, stiffness_matrix)
    energy = kinetic_energy_fractions(m, phi)
    peak = np.argmax(np.abs(energy), axis=0)
    signs = np.sign(phi[peak, np.arange(6)])
    phi = phi * np.where(signs == 0, 1.0, signs)
    words = tuple(describe_motion(energy[:, j], dominance) for j in range(6))
    return MountModes(np.sqrt(lam) / (2.0 * np.pi), phi, energy, words)


def rigid_body_frequencies(mass_matrix: ArrayLike, stiffness_matrix: ArrayLike) -> np.ndarray:
    """The six natural frequencies of a rigid body on mounts, without the mode shapes.

    Parameters
    ----------
    mass_matrix : array_like
        6 x 6 mass matrix about the CG, from :func:`rigid_body_mass_matrix`
        [kg, kg m^2].
    stiffness_matrix : array_like
        6 x 6 stiffness matrix about the CG, from :func:`mount_stiffness_matrix`
        [N/m, N/rad, N m/rad].

    Returns
    -------
    numpy.ndarray
        Natural frequencies, ascending, (6,) [Hz]: ``rigid_body_modes(...).frequencies``
        to the last bit, by the same solve.

    Raises
    ------
    ValueError
        As :func:`rigid_body_modes`, with the same messages.

    Notes
    -----
    For the ends of a tolerance band, where only the frequencies are wanted: the
    kinetic-energy fractions and the words of :func:`rigid_body_modes` are not worked
    out. The eigenproblem is that of :func:`rigid_body_modes` [1]_.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 3 (from memory).
    """
    _, lam, _ = _solve_modes(mass_matrix, stiffness_matrix)
    return np.sqrt(lam) / (2.0 * np.pi)


# ------------------------------------------------------------------ forced response


class MountResponse(NamedTuple):
    """Steady harmonic response of a machine on mounts (complex amplitudes)."""

    displacement: np.ndarray
    """Motion of the CG (x, y, z [m], theta_x, theta_y, theta_z [rad]),
    shape ``frequency.shape + (6,)``, complex."""
    mount_displacements: np.ndarray
    """Motion of each mount's top in machine axes [m], ``frequency.shape + (n, 3)``,
    complex."""
    mount_forces: np.ndarray
    """Dynamic force each mount passes to the structure under it, machine axes [N],
    ``frequency.shape + (n, 3)``, complex; their sum is the total force into the
    structure."""
    mount_forces_local: np.ndarray
    """The same forces along each mount's axial, first-shear and second-shear axes
    [N], ``frequency.shape + (n, 3)``, complex."""


def mount_forced_response(
    mass_matrix: ArrayLike,
    positions: ArrayLike,
    stiffnesses: ArrayLike,
    load: ArrayLike,
    frequency: ArrayLike,
    *,
    centre_of_gravity: ArrayLike = (0.0, 0.0, 0.0),
    orientations: ArrayLike | None = None,
    support_stiffnesses: ArrayLike | None = None,
    damping_ratio: ArrayLike | None = None,
    mount_damping: ArrayLike | None = None,
) -> MountResponse:
    """Steady-state response to a harmonic force and moment, and the mount forces.

    Parameters
    ----------
    mass_matrix : array_like
        6 x 6 mass matrix about the CG [kg, kg m^2].
    positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
        The mount layout, as for :func:`mount_stiffness_matrix` [m, N/m, m, unitless,
        N/m].
    load : array_like
        Complex amplitudes (F_x, F_y, F_z, M_x, M_y, M_z) of the harmonic load about
        the CG [N, N m]; see :func:`load_at_point`. The load is Re(F e^{i omega t}).
    frequency : array_like
        Forcing frequency [Hz]; zero (static) or positive; an array gives a sweep.
    damping_ratio : array_like, optional
        Modal viscous damping ratio, one for all modes or one per mode in ascending
        frequency order, (6,) [unitless].
    mount_damping : array_like, optional
        Viscous damping coefficient of each mount along its three axes, (n, 3),
        in parallel with the mount's spring [N s/m]. Give at most one of the two; with
        neither the model is undamped.

    Returns
    -------
    MountResponse
        Complex amplitudes of the CG motion [m, rad], mount motion [m] and mount
        forces [N].

    Notes
    -----
    Solves (K + i omega C - omega^2 M) X = F for each frequency [1]_.

    *Modal damping*: X = sum_j phi_j phi_j^T F / (omega_j^2 - omega^2 +
    2 i zeta_j omega_j omega). The damping is taken to sit in the mounts in proportion
    to their stiffness, mode by mode (C phi_j = (2 zeta_j / omega_j) K phi_j holds
    exactly for modal damping), so a mount's force is
    f_i = K_i T_i sum_j (1 + 2 i zeta_j omega / omega_j) phi_j eta_j. Summed over the
    mounts these forces balance the load and the inertia force exactly. For a single
    degree of freedom the force ratio is the classical transmissibility.

    *Mount damping*: each mount direction has the dynamic stiffness
    z = k + i omega c, in series with the support: z_eff = z k_s / (z + k_s), and
    f_i = R_i diag(z_eff) R_i^T T_i X.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, chs. 2, 3 and 30 (from memory).
    """
    m = np.asarray(mass_matrix, dtype=float)
    t, rot, k, ks = _layout(
        positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
    )
    n = t.shape[0]
    f = np.asarray(load, dtype=complex)
    if f.shape != (6,):
        raise ValueError(f"load must have six components (3 forces, 3 moments), got {f.shape}")
    freq = np.asarray(frequency, dtype=float)
    bad = ~(freq >= 0) | ~np.isfinite(freq)
    if np.any(bad):
        v = float(freq[bad].flat[0]) if freq.ndim else float(freq)
        raise ValueError(f"forcing frequency must not be negative, got {v:g} Hz")
    if damping_ratio is not None and mount_damping is not None:
        raise ValueError("give either a modal damping ratio or mount damping, not both")
    omega = 2.0 * np.pi * freq.reshape(-1)
    k_eff = _series(k, ks)
    stiffness = _assemble(t, rot, k_eff)
    _, lam, phi = _solve_modes(m, stiffness)  # raises on an unrestrained layout

    if mount_damping is None:
        zeta = np.zeros(6) if damping_ratio is None else np.asarray(damping_ratio, float)
        zeta = np.broadcast_to(zeta, (6,)) if zeta.ndim == 0 else zeta
        if zeta.shape != (6,) or np.any(~(zeta >= 0)):
            raise ValueError("damping ratio must be one value or six, none negative")
        omega_n = np.sqrt(lam)
        gap = np.abs(omega_n - omega[:, None]) <= 1e-12 * omega_n
        if np.any(gap & (zeta == 0)):
            hit = float(freq.reshape(-1)[np.argwhere(gap & (zeta == 0))[0][0]])
            raise ValueError(
                f"forcing frequency {hit:g} Hz is a natural frequency of the undamped "
                "model: give a damping ratio"
            )
        eta = (phi.T @ f)[None, :] / (
            omega_n**2 - omega[:, None] ** 2 + 2j * zeta * omega_n * omega[:, None]
        )  # (nf, 6) modal amplitudes
        x = eta @ phi.T  # (nf, 6)
        elastic = (eta * (1.0 + 2j * zeta * omega[:, None] / omega_n)) @ phi.T
        u = np.einsum("nij,fj->fni", t, x)
        u_el = np.einsum("nij,fj->fni", t, elastic)
        k_global = np.einsum("nij,nj,nkj->nik", rot, k_eff, rot)
        forces = np.einsum("nij,fnj->fni", k_global, u_el)
    else:
        c = _mount_table("mount damping", mount_damping, n, "N s/m")
        if np.any(~(c >= 0) | ~np.isfinite(c)):
            raise ValueError("mount damping must not be negative, in N s/m")
        x = np.empty((omega.size, 6), complex)
        forces = np.empty((omega.size, n, 3), complex)
        u = np.empty((omega.size, n, 3), complex)
        for idx, w in enumerate(omega):
            z = _series(k + 1j * w * c, ks)
            z_global = np.einsum("nij,nj,nkj->nik", rot, z, rot)
            dyn = np.einsum("nai,nab,nbj->ij", t, z_global, t) - w * w * m
            x[idx] = np.linalg.solve(dyn, f)
            u[idx] = np.einsum("nij,j->ni", t, x[idx])
            forces[idx] = np.einsum("nij,nj->ni", z_global, u[idx])
    local = np.einsum("nji,fnj->fni", rot, forces)
    shape = freq.shape
    return MountResponse(
        x.reshape(shape + (6,)),
        u.reshape(shape + (n, 3)),
        forces.reshape(shape + (n, 3)),
        local.reshape(shape + (n, 3)),
    )

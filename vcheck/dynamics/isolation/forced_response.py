"""Worst mount force of a machine on mounts under a harmonic force and moment, over a
speed range.

The machine is the six-degree-of-freedom rigid body of
:mod:`vcheck.dynamics.modes.rigid_mounts` (its axes, mount layout and modal damping);
this module judges what that model gives. The load is a real harmonic force and moment
about the centre of gravity, Re(L e^{i omega t}), so that a couple (the roll moment of
a torque reaction, the pitching moment of a crank mechanism) is seen as well as a force.
Its amplitude may grow with speed, L (f / f_ref)^p: p = 2 for inertial loads
(unbalance, crank forces), p = 0 for a fixed amplitude.

Over a band of forcing frequencies [f_low, f_high] (a speed range), :func:`mount_force_peaks`
finds, for every mount, the largest force it passes to the structure, the frequency at
which that happens, the largest of each force component, the largest total force into
the structure, and the mount-force transmissibility: the worst mount's dynamic force over
the worst mount's force under the same load applied statically
(:func:`static_mount_forces`). The peaks are searched for, not read off a grid: the
search starts from the band ends and from points packed around every natural frequency
near the band, and refines each local maximum by Newton's method on the derivative,
safeguarded by bisection, to a relative tolerance on the peak value.

A design judges one machine under many loads and over many bands: :class:`MountForceModel`
checks the layout and solves the modes once, and its :meth:`MountForceModel.peaks` then
searches one load over one band, with the same result as :func:`mount_force_peaks`.

A mount's force is a 3-vector whose components are out of phase in general; its size
over a cycle is the major semi-axis of the ellipse its tip traces
(:func:`peak_vector_magnitude`).
"""

from __future__ import annotations

import functools
import math
from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

from ..modes import rigid_mounts as _rm

__all__ = [
    "MountForceModel",
    "MountForcePeaks",
    "mount_force_peaks",
    "peak_vector_magnitude",
    "static_mount_forces",
]

_TWO_PI = 2.0 * math.pi

_UNEXCITED = 1e-9
"""Modal force |phi_j^T L| at or below this share of sqrt(sum_j |phi_j^T L|^2) (the load's
size in the inverse-mass norm, L^H M^-1 L) counts as not exciting mode j [unitless]; the
same share of the largest modal mount-force coefficient counts as a mount (or the total)
not feeling an undamped mode. Round-off of an orthogonal load is about 1e-16."""

_TOUCH = 1e-12
"""Relative distance within which a band end counts as touching a natural frequency."""

_SEED_OFFSETS = np.array([-4.0, -2.5, -1.5, -1.0, -0.5, 0.0, 0.5, 1.0, 1.5, 2.5, 4.0])
"""Seeds of the peak search around each natural frequency f_j: f_j (1 + c zeta_j) for
these c [unitless]; half a damping ratio apart near the resonance, where a lightly damped
peak is about 2 zeta_j f_j wide at half power."""

_SEED_DAMPING = (1e-3, 0.3)
"""Range to which zeta_j is clipped when placing seeds [unitless]: undamped modes still
get a small cloud, heavily damped ones do not spread it past zero frequency."""

_COARSE_SEEDS = 16
"""Seeds spread evenly (geometrically when f_low > 0) over the band, for maxima away
from resonances (a load growing with speed, interference between modes)."""

_PRUNE = 0.25
"""A bracketed maximum whose seeds are both lower than this share of the best seed of
the same quantity is not refined [unitless]: near a resonance the seeds sit within a
quarter of a damping ratio of its peak, where it is still above 0.97 of its height, so
such a maximum cannot be the largest."""

_KEPT_LOADS = 32
"""Loads a :class:`MountForceModel` keeps the load-only part of a peak search for (a
design asks for a handful: the unit shapes of the bands and its machine loads)."""

_MAX_ITERATIONS = 200
"""Most Newton or bisection steps per bracket (bisection alone reaches the round-off
floor of the bracket in about 50)."""


# --------------------------------------------------------------------------- ellipse


def peak_vector_magnitude(amplitudes: ArrayLike) -> np.ndarray:
    """Largest length over a cycle of a harmonic vector given by complex amplitudes.

    Parameters
    ----------
    amplitudes : array_like
        Complex amplitudes a of the vector Re(a e^{i omega t}), shape (..., 3) (any
        last-axis length works) [any unit, N for a force].

    Returns
    -------
    numpy.ndarray
        Shape (...): the major semi-axis of the ellipse traced by the vector's tip
        [unit of ``amplitudes``]; |a| for a real (in-phase) vector,
        |a| / sqrt(2) for a circularly polarised one.

    Notes
    -----
    With p = Re a and q = Im a the vector is p cos(omega t) - q sin(omega t), whose
    squared length is (P + Q)/2 + (P - Q)/2 cos 2 omega t - (p.q) sin 2 omega t with
    P = p.p, Q = q.q. Its largest value over a cycle is

        |v|max = sqrt((P + Q)/2 + sqrt(((P - Q)/2)^2 + (p.q)^2)),

    the largest singular value of the matrix [p, q] [1]_.

    References
    ----------
    .. [1] M. Born, E. Wolf, Principles of Optics, 7th ed., Cambridge University Press,
       1999, sec. 1.4.2, the polarisation ellipse of a harmonic vector (from memory);
       the formula is re-derived above.
    """
    a = np.asarray(amplitudes)
    if a.ndim == 0:
        raise ValueError("amplitudes must have a last axis of vector components")
    return _major_axis(a)


def _major_axis(a: np.ndarray) -> np.ndarray:
    # (P + Q) + |(P - Q) + 2 i p.q| = |a|^2 + |a.a|
    return np.sqrt(0.5 * ((a.real**2 + a.imag**2).sum(-1) + np.abs((a * a).sum(-1))))


# --------------------------------------------------------------------------- checks


def _load6(load: ArrayLike, allow_zero: bool = False) -> np.ndarray:
    if type(load) is tuple and len(load) == 6 and all(type(x) is float for x in load):
        # the rules' unit shapes: the checks below on plain floats, same order and words
        if not all(map(math.isfinite, load)):
            raise ValueError("load must be finite, in N and N m")
        if not allow_zero and not any(load):
            raise ValueError("load must not be zero")
        return np.array(load, dtype=complex)
    f = np.asarray(load, dtype=complex)
    if f.shape != (6,):
        raise ValueError(f"load must have six components (3 forces, 3 moments), got {f.shape}")
    if not np.isfinite(f).all():
        raise ValueError("load must be finite, in N and N m")
    if not allow_zero and not f.any():
        raise ValueError("load must not be zero")
    return f


def _mount_stiffness_tensors(rot: np.ndarray, k_eff: np.ndarray) -> np.ndarray:
    """K_i = R_i diag(k_i) R_i^T, (n, 3, 3)."""
    return (rot * k_eff[:, None, :]) @ rot.transpose(0, 2, 1)


# --------------------------------------------------------------------------- statics


def static_mount_forces(
    positions: ArrayLike,
    stiffnesses: ArrayLike,
    load: ArrayLike,
    *,
    centre_of_gravity: ArrayLike = (0.0, 0.0, 0.0),
    orientations: ArrayLike | None = None,
    support_stiffnesses: ArrayLike | None = None,
) -> np.ndarray:
    """Force in each mount when a load is carried statically, without dynamic amplification.

    The rigid-mounting reference: how the mounts share the load when it is applied so
    slowly that no inertia and no damping act.

    Parameters
    ----------
    positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
        The mount layout, as for
        :func:`vcheck.dynamics.modes.rigid_mounts.mount_stiffness_matrix`
        [m, N/m, m, unitless, N/m].
    load : array_like
        (F_x, F_y, F_z, M_x, M_y, M_z) about the CG, complex amplitudes allowed, (6,)
        [N, N m].

    Returns
    -------
    numpy.ndarray
        (n, 3) complex: the force each mount passes to the structure under it, machine
        axes [N].

    Raises
    ------
    ValueError
        If the layout leaves a motion unrestrained (no static equilibrium), naming it.

    Notes
    -----
    The CG moves by X = K^-1 L and mount i carries f_i = R_i diag(k_i) R_i^T T_i X,
    with T_i = [I, -[r_i]x] and k_i the mount's stiffnesses in series with its support
    [1]_: the omega -> 0 limit of
    :func:`vcheck.dynamics.modes.rigid_mounts.mount_forced_response`. The forces
    balance the load: sum_i T_i^T f_i = L.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 3 (from memory).
    """
    t, rot, k, ks = _rm._layout(
        positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
    )
    f = _load6(load, allow_zero=True)
    k_eff = _rm._series(k, ks)
    stiffness = _rm._assemble(t, rot, k_eff)
    _check_restrained(stiffness)
    x = np.linalg.solve(stiffness, f)
    return np.einsum("nij,nj->ni", _mount_stiffness_tensors(rot, k_eff), np.einsum("nij,j->ni", t, x))


def _check_restrained(stiffness: np.ndarray) -> None:
    """Raise, naming the free motion, if K is singular (after Jacobi scaling, so that
    the units of the rows do not matter)."""
    d = np.diag(stiffness).copy()
    scale = np.where(d > 0, 1.0 / np.sqrt(np.where(d > 0, d, 1.0)), 0.0)
    scaled = stiffness * scale[:, None] * scale[None, :]
    lam, y = np.linalg.eigh(0.5 * (scaled + scaled.T))
    free = lam <= _rm._NULL_TOLERANCE * max(float(lam[-1]), 1e-300)
    if np.any(d <= 0) or np.any(free):
        basis = np.eye(6)[:, d <= 0] if np.any(d <= 0) else y[:, free] * scale[:, None]
        words = _rm._null_space_names(np.eye(6), np.eye(6), basis)
        raise ValueError(f"mount layout leaves {_rm._join(words)} unrestrained")


# --------------------------------------------------------------------------- result


class MountForcePeaks(NamedTuple):
    """Largest mount forces of a machine on mounts over a band of forcing frequencies."""

    mount_peak: np.ndarray
    """For each mount, the largest over the band of its force's size over a cycle
    (:func:`peak_vector_magnitude`), (n,) [N]; ``inf`` where an undamped excited mode in
    the band loads the mount."""
    mount_peak_frequency: np.ndarray
    """Forcing frequency of each ``mount_peak``, (n,) [Hz]."""
    mount_peak_components: np.ndarray
    """For each mount, the largest amplitude over the band of each force component along
    the machine axes x, y, z, (n, 3) [N]."""
    total_peak: float
    """Largest size over the band of the summed mount forces, the force into the
    structure [N]."""
    total_peak_frequency: float
    """Forcing frequency of ``total_peak`` [Hz]."""
    worst_ratio: float
    """Mount-force transmissibility: the largest over the band of
    max_i |f_i(f)| / max_i |f_i,static| at the same load amplitude [unitless]."""
    worst_ratio_frequency: float
    """Forcing frequency of ``worst_ratio`` [Hz]."""
    worst_ratio_mount: int
    """Index of the mount that is the worst one at ``worst_ratio_frequency``."""
    static_mount: np.ndarray
    """Size of each mount's force under the load (at its reference amplitude) applied
    statically, (n,) [N]; its largest entry is the denominator of ``worst_ratio``."""
    natural_frequencies: np.ndarray
    """The six natural frequencies of the model, ascending, (6,) [Hz]."""
    unbounded: bool
    """True when the band contains or touches the natural frequency of an undamped mode
    that the load excites: the peaks it feeds are infinite."""
    unbounded_modes: tuple
    """Indices (into ``natural_frequencies``) of those modes; empty when bounded."""
    static_mount_components: np.ndarray = np.zeros((0, 3))
    """Amplitude of each component of each mount's force along the machine axes x, y, z
    under the load applied statically, (n, 3) [N]: the rigid-mounting counterpart of
    ``mount_peak_components``."""


# --------------------------------------------------------------------------- model


class _ModalFactors:
    """The load-free part of the modal form: the frequency-response factors of the six
    modes and their derivatives in f.

    H_j = (1 + i b_j omega) / (omega_j^2 - omega^2 + 2 i zeta_j omega_j omega),
    omega = 2 pi f, b_j = 2 zeta_j / omega_j. Unless a mode is within about 1e-4 of
    critical damping, H_j is split into partial fractions over its two poles
    omega = omega_j (i zeta_j +- sqrt(1 - zeta_j^2)): H_j = sum R / (f - sigma) with
    sigma the pole over 2 pi, so that H, -H' and H''/2 are sums of R g, R g^2 and R g^3
    with g = 1 / (f - sigma), the residues R folded into the coefficient table. The
    factors are kept as (H, -H', H''/2) in either form; the formulas that use them undo
    the signs and halves.
    """

    def __init__(self, omega_n: np.ndarray, zeta: np.ndarray):
        self.undamped = bool((zeta == 0).any())
        self.poles = bool((np.abs(1.0 - zeta * zeta) >= 1e-4).all())
        if self.poles:
            root = omega_n * np.sqrt(1.0 - zeta * zeta + 0j)
            shift = 1j * zeta * omega_n
            s1, s2 = shift + root, shift - root
            b = 2j * zeta / omega_n
            sep = _TWO_PI * (s1 - s2)  # R = -num(s1) / (s1 - s2), num(s2) / (s1 - s2)
            residues = np.empty((1, 12), complex)
            np.divide(-(1.0 + b * s1), sep, out=residues[0, :6])
            np.divide(1.0 + b * s2, sep, out=residues[0, 6:])
            self.residues = residues
            pole = np.empty((12, 1), complex)  # [Hz]
            np.divide(s1, _TWO_PI, out=pole[:6, 0])
            np.divide(s2, _TWO_PI, out=pole[6:, 0])
            self.pole = pole
            self.mode_of = _POLE_MODES
        else:
            self.omega_n2 = (omega_n**2)[:, None]
            self.c_den = (2j * zeta * omega_n)[:, None]  # den = omega_j^2 - omega^2 + c_den omega
            self.c_num = (2j * zeta / omega_n)[:, None]  # num = 1 + c_num omega
        self.width = 12 if self.poles else 6

    def table(self, coeff: np.ndarray) -> np.ndarray:
        """(w + 1, width) complex: ``coeff`` (w, 6), the coefficient of each mode in
        each of w force components [N], per pole (width 12, times the residue) or per
        mode (width 6), and a zero row."""
        w = coeff.shape[0]
        out = np.zeros((w + 1, self.width), complex)
        if self.poles:
            np.multiply(coeff[:, self.mode_of], self.residues, out=out[:w])
        else:
            out[:w] = coeff
        return out

    def forces(self, coeff: np.ndarray) -> np.ndarray:
        """:meth:`table` without its zero row, (w, width)."""
        if self.poles:  # C order, as the table: the product's layout decides the BLAS call
            out = np.empty((coeff.shape[0], self.width), complex)
            return np.multiply(coeff[:, self.mode_of], self.residues, out=out)
        return coeff

    def __call__(self, f: np.ndarray, order: int) -> np.ndarray:
        """(H, -H', H''/2) per pole or mode, derivatives in f, the first ``order`` + 1
        of them, (order + 1, width, m)."""
        if self.poles:
            out = np.empty((order + 1, self.width, f.size), complex)
            g = out[0]
            np.subtract(f, self.pole, out=g)
            if self.undamped:
                g[g == 0] = np.inf  # an undamped mode hit exactly: its coefficients
                # are zero in every quantity searched (see mount_force_peaks)
            np.reciprocal(g, out=g)
            if order > 0:
                np.multiply(g, g, out=out[1])
                if order > 1:
                    np.multiply(out[1], g, out=out[2])
            return out
        w = _TWO_PI * f
        den = (self.omega_n2 - w * w) + self.c_den * w
        num = 1.0 + self.c_num * w
        if self.undamped:
            hit = den == 0
            if hit.any():
                den = np.where(hit, 1.0, den)
                num = np.where(hit, 0.0, num)
        out = np.empty((order + 1, 6, f.size), complex)
        inv = 1.0 / den
        h = out[0]
        np.multiply(num, inv, out=h)
        if order > 0:
            d_den = self.c_den - 2.0 * w  # den' in omega; den'' = -2
            h1 = out[1]  # -dH/domega = (H den' - num') / den
            np.multiply(h * d_den - self.c_num, inv, out=h1)
            if order > 1:  # d2H/domega2 / 2 = (H + H' den') / den, as (H den)'' = 0
                np.multiply(h + h1 * d_den, inv, out=out[2])
                out[2] *= _TWO_PI**2
            h1 *= _TWO_PI
        return out


class _ModalForces:
    """Mount forces of one load from the modal form, evaluated cheaply at many
    frequencies at once.

    The force components, unit amplitude, are u(f) = sum_j C_j H_j(omega) (see
    :class:`_ModalFactors`), held component-major: row c N + i is component c of
    vector i, the n mounts and then their sum (i = n), N = n + 1; frequencies run
    along the last axis of every array. The searched quantities are, in this order:
    the size (major semi-axis, sqrt(lambda)) of each vector (N: the mounts, then the
    total), the amplitude of each component of each vector (3 N, in the row order;
    those of the total are not wanted and not searched), all scaled by
    s(f) = (f / f_ref)^p; and, when p is not zero, the unscaled size of each mount's
    force (n), for the transmissibility ratio. The search works on
    ell = log(sqrt(lambda) s), whose derivatives in f are returned too.

    With S = sum_c |u_c|^2 and Z = sum_c u_c^2, lambda = (S + |Z|) / 2
    (:func:`peak_vector_magnitude`); a component's lambda is |u_c|^2.
    """

    def __init__(self, factors: _ModalFactors, coeff: np.ndarray, n: int, exponent, reference):
        self.n = n
        self.size = n + 1
        self.factors = factors
        self.flat = factors.table(coeff)  # (3 N + 1, width)
        self.forces = self.flat[: 3 * self.size]
        extra = n if exponent != 0.0 else 0
        self.count = 4 * self.size + extra
        self.exponent = exponent
        self.reference = reference
        self.gather = _gather_rows(n, extra)
        if exponent != 0.0:
            self.powers = np.concatenate([np.full(4 * self.size, exponent), np.zeros(extra)])

    def _finish(self, lam, lam1, lam2, freq, powers):
        """Values, d ell / d f [1/Hz] and d^2 ell / d f^2 [1/Hz^2] from lambda and its
        derivatives in f (``lam1``, ``lam2`` may be None), inside an errstate that
        ignores 0/0. ``powers`` None: every quantity at every frequency ``freq``,
        (count, m); else the quantity of each column, with its power, (m,)."""
        value = np.sqrt(lam)
        if lam1 is None:
            ell1 = ell2 = None
        else:
            r1 = lam1 / lam
            ell1 = 0.5 * r1
            ell2 = None if lam2 is None else 0.5 * (lam2 / lam - r1 * r1)
        if self.exponent == 0.0:
            return value, ell1, ell2
        if powers is None:  # the first 4 N rows scale with p
            p, k = self.exponent, 4 * self.size
            value[:k] *= (freq / self.reference) ** p
            if ell1 is not None:
                ell1[:k] += p / freq
            return value, ell1, ell2
        value *= (freq / self.reference) ** powers
        if ell1 is not None:
            ell1 += powers / freq
            if ell2 is not None:
                ell2 -= powers / (freq * freq)
        return value, ell1, ell2

    def evaluate_all(self, freq: np.ndarray, order: int = 1):
        """Every quantity at every frequency: values [N or unitless] and, for order 1,
        d ell / d f [1/Hz], each (count, m)."""
        n, big_n, m = self.n, self.size, freq.size
        us = self.forces @ self.factors(freq, order)  # (order + 1, 3 N, m)
        u = us[0]
        ur, ui = u.real, u.imag
        lam = np.empty((self.count, m))
        comp = lam[big_n : 4 * big_n]
        np.multiply(ur, ur, out=comp)
        comp += ui * ui
        s = comp[:big_n] + comp[big_n : 2 * big_n]
        s += comp[2 * big_n :]
        uu = u * u
        z = uu[:big_n] + uu[big_n : 2 * big_n]
        z += uu[2 * big_n :]
        abs_z = np.abs(z)
        size = lam[:big_n]
        np.add(s, abs_z, out=size)
        size *= 0.5
        if self.count > 4 * big_n:
            lam[4 * big_n :] = size[:n]
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            if not order:
                return self._finish(lam, None, None, freq, None)[:2]
            v = us[1]  # -u'
            # lambda' of a component: 2 Re(conj(u) u') = -2 Re(conj(u) v)
            lam1 = np.empty((self.count, m))
            comp1 = lam1[big_n : 4 * big_n]
            np.multiply(ur, v.real, out=comp1)
            comp1 += ui * v.imag
            s1 = comp1[:big_n] + comp1[big_n : 2 * big_n]  # -S' / 2
            s1 += comp1[2 * big_n :]
            comp1 *= -2.0
            uv = u * v
            zv = uv[:big_n] + uv[big_n : 2 * big_n]  # -Z' / 2
            zv += uv[2 * big_n :]
            # lambda' = (S' + |Z|') / 2 with |Z|' = Re(conj(Z) Z') / |Z|
            size1 = z.real * zv.real
            size1 += z.imag * zv.imag
            size1 /= abs_z
            size1 += s1
            np.negative(size1, out=lam1[:big_n])
            if self.count > 4 * big_n:
                lam1[4 * big_n :] = lam1[:n]
            return self._finish(lam, lam1, None, freq, None)[:2]

    def evaluate(self, freq: np.ndarray, which: np.ndarray):
        """Quantity which[k] at freq[k]: value and the two derivatives of ell in f
        [1/Hz, 1/Hz^2], each (m,)."""
        m = freq.size
        us = (self.flat @ self.factors(freq, 2)).reshape(-1, m)  # u, -u', u''/2 rows
        pairs = us[self.gather[which].T, np.arange(m)].reshape(2, 3, 4, m)
        left = np.concatenate([pairs[:1].conj(), pairs[:1]])  # (2, 3 components, 4, m)
        # pairs (u, u), (u, -u'), (-u', -u'), (u, u''/2), summed over the components,
        # Hermitian and plain: A, A', A'' (real parts) and Y, Y', Y''
        herm, sym = _PAIRS_TO_TERMS @ (left * pairs[1]).sum(axis=1)
        herm = herm.real
        # lambda = A + |Y| with A = S / 2, Y = Z / 2
        y0, y1 = sym[0], sym[1]
        proj = (y0.conj() * sym[1:]).real  # Re(conj(Y) Y'), Re(conj(Y) Y'')
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            root = np.abs(y0)
            root1 = proj[0] / root
            root2 = (y1.real * y1.real + y1.imag * y1.imag + proj[1] - root1 * root1) / root
            return self._finish(
                herm[0] + root, herm[1] + root1, herm[2] + root2, freq,
                self.powers[which] if self.exponent else None,
            )


_PAIRS_TO_TERMS = np.array([[0.5, 0.0, 0.0, 0.0], [0.0, -1.0, 0.0, 0.0], [0.0, 0.0, 1.0, 2.0]])
"""From the sums over the components of (u u, u (-u'), (-u')(-u'), u u''/2) (or their
Hermitian forms, real part) to (X/2, X'/2, X''/2), X = sum_c u_c u_c (or |u_c|^2)."""


@functools.lru_cache(maxsize=64)
def _gather_rows(n: int, extra: int) -> np.ndarray:
    """(count, 2 factors x 3 components x 4 pairs): for each quantity, the row of the
    (u, -u', u''/2) table, stacked to 3 (3 N + 1) rows, that holds the left and the
    right factor of each pair; a component's quantity uses the zero row for the other
    two components."""
    big_n = n + 1
    w = 3 * big_n
    vectors = np.arange(w).reshape(3, big_n).T  # (N, 3): rows of vector i
    comps = np.full((w, 3), w)
    comps[np.arange(w), np.repeat(np.arange(3), big_n)] = np.arange(w)
    rows = np.concatenate([vectors, comps, vectors[:extra]]).T  # (3, count)
    orders = np.array([[0, 0, 1, 0], [0, 1, 1, 2]]) * (w + 1)  # (2, 4)
    out = (orders[:, None, :, None] + rows[None, :, None, :]).reshape(24, -1).T.copy()
    out.flags.writeable = False
    return out


_UNIT_STEPS = np.linspace(0.0, 1.0, _COARSE_SEEDS)
_POLE_MODES = np.concatenate([np.arange(6), np.arange(6)])  # the mode of each pole


# --------------------------------------------------------------------------- search


def _seeds(band, cloud) -> np.ndarray:
    """Seeds of the search over the band: its ends, the coarse spread and the sorted
    ``cloud`` around the natural frequencies inside it [Hz]."""
    lo, hi = band
    coarse = lo * (hi / lo) ** _UNIT_STEPS if lo > 0 else lo + (hi - lo) * _UNIT_STEPS
    inside = cloud[np.searchsorted(cloud, lo, "right") : np.searchsorted(cloud, hi, "left")]
    x = np.concatenate([coarse, inside])
    x.sort()
    x[0], x[-1] = lo, hi
    keep = np.empty(x.size, bool)
    keep[0] = True
    np.greater(x[1:], x[:-1], out=keep[1:])
    return x[keep]


def _newton_refine(model, a, b, ell_a, ell_b, d_a, d_b, which, rtol):
    """Maximise quantity ``which[k]`` in [a[k], b[k]] (frequencies [Hz]), where
    ell = log(value) has the values ell_a, ell_b and derivatives d_a > 0 >= d_b [1/Hz]
    at the ends, for all k at once.

    Starts from the maximum of the cubic through the end values and slopes, then takes
    Newton steps on d ell / d f = 0, bisecting the bracket when a step would leave it
    or the quantity is not concave there. Returns the value at the last point of each
    bracket and that point [Hz].
    """
    # cubic interpolation of -ell (J. Nocedal, S. J. Wright, Numerical Optimization,
    # 2nd ed., Springer, 2006, eq. 3.59, from memory)
    d1 = 3.0 * (ell_b - ell_a) / (b - a) - d_a - d_b
    d2 = np.sqrt(np.maximum(d1 * d1 - d_a * d_b, 0.0))
    with np.errstate(divide="ignore", invalid="ignore"):
        x = b - (b - a) * (d2 - d1 - d_b) / (d_a - d_b + 2.0 * d2)
    x = np.where((x > a) & (x < b), x, 0.5 * (a + b))  # (also where x is nan)
    value = np.empty(a.size)
    place = np.empty(a.size)
    active = None  # all
    tol = -2.0 * rtol
    for _ in range(_MAX_ITERATIONS):
        v, e1, e2 = model.evaluate(x, which)
        if active is None:
            value[:], place[:] = v, x
        else:
            value[active] = v
            place[active] = x
        # quadratic model of ell: its maximum is e1^2 / (2 |e2|) above the current value
        done = e1 * e1 <= tol * e2
        done |= e1 == 0
        rising = e1 > 0
        np.copyto(a, x, where=rising)
        np.copyto(b, x, where=~rising)
        done |= b - a <= 4e-16 * b
        if done.all():
            break
        step = x - e1 / e2
        ok = e2 < 0
        ok &= step > a
        ok &= step < b
        x = np.where(ok, step, 0.5 * (a + b))
        if done.any():
            keep = np.flatnonzero(~done)
            active = keep if active is None else active[keep]
            x, a, b, which = x[keep], a[keep], b[keep], which[keep]
    return value, place


def _search(model, band, cloud, searched, rtol):
    """Largest value and its frequency of every searched quantity over the band;
    ``searched`` is None for all."""
    lo, hi = band
    if lo == hi:
        v = model.evaluate_all(np.array([lo]), order=0)[0][:, 0]
        if searched is not None:
            v[~searched] = -np.inf
        return v, np.full(v.size, lo)
    x = _seeds(band, cloud)
    v, e1 = model.evaluate_all(x)  # (count, seeds)
    big_n = model.size
    v[big_n + model.n : 4 * big_n : big_n] = -np.inf  # the total's components
    if searched is not None:
        v[~searched] = -np.inf
    seed_best = v.argmax(axis=1)
    best = v.max(axis=1)
    where = x[seed_best]
    # a local maximum lies where d ell / d f changes from rising to falling
    bracket = e1[:, :-1] > 0
    bracket &= e1[:, 1:] <= 0
    bracket &= np.maximum(v[:, :-1], v[:, 1:]) >= _PRUNE * best[:, None]
    bracket &= (best > 0)[:, None]
    qs, ks = np.nonzero(bracket)
    if ks.size:
        nxt = ks + 1
        with np.errstate(divide="ignore"):
            ell_a, ell_b = np.log(v[qs, ks]), np.log(v[qs, nxt])
        val, at = _newton_refine(
            model, x[ks], x[nxt], ell_a, ell_b, e1[qs, ks], e1[qs, nxt], qs, rtol
        )
        top = np.full(best.size, -np.inf)
        np.maximum.at(top, qs, val)
        better = val >= top[qs]
        better &= val > best[qs]
        best[qs[better]] = val[better]
        where[qs[better]] = at[better]
    return best, where


# --------------------------------------------------------------------------- main


class MountForceModel:
    """A machine on mounts, validated and solved once, for peak mount-force searches
    under many loads and over many bands.

    Holds what :func:`mount_force_peaks` derives from the machine alone: the checked
    layout and its stiffness matrix, the natural frequencies, mass-normalised mode
    shapes and damping ratios, the force of every mode in every mount and in their sum
    (K_i T_i phi_j), the static flexibility in modal form (1 / omega_j^2) and the seeds
    of the search around the natural frequencies, so that each :meth:`peaks` call only
    projects its load on the modes and searches its band.

    Parameters
    ----------
    mass_matrix : array_like
        6 x 6 mass matrix about the CG, from
        :func:`vcheck.dynamics.modes.rigid_mounts.rigid_body_mass_matrix` [kg, kg m^2].
    positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
        The mount layout, as for
        :func:`vcheck.dynamics.modes.rigid_mounts.mount_stiffness_matrix`
        [m, N/m, m, unitless, N/m].
    damping_ratio : array_like, optional
        Modal viscous damping ratio, one for all modes or six in ascending frequency
        order [unitless]; zero or positive. Default undamped.

    Raises
    ------
    ValueError
        On a bad layout (with the messages of
        :func:`vcheck.dynamics.modes.rigid_mounts.mount_stiffness_matrix`), an
        unrestrained layout (naming the free motion), a bad mass matrix, or a negative
        damping ratio.

    Notes
    -----
    ``MountForceModel(...).peaks(load, band, ...)`` gives the same result, to the last
    bit, as ``mount_force_peaks(..., load, band, ...)`` with the same arguments: the
    function builds this model and calls :meth:`peaks`. The model is not changed by
    :meth:`peaks`, so one model may serve any number of loads and bands.
    """

    def __init__(
        self,
        mass_matrix: ArrayLike,
        positions: ArrayLike,
        stiffnesses: ArrayLike,
        *,
        centre_of_gravity: ArrayLike = (0.0, 0.0, 0.0),
        orientations: ArrayLike | None = None,
        support_stiffnesses: ArrayLike | None = None,
        damping_ratio: ArrayLike | None = None,
    ):
        t, rot, k, ks = _rm._layout(
            positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
        )
        kt = _mount_stiffness_tensors(rot, _rm._series(k, ks)) @ t  # K_i T_i, (n, 3, 6)
        stiffness = (t.transpose(0, 2, 1) @ kt).sum(axis=0)  # sum T_i^T K_i T_i
        _, lam, phi = _rm._solve_modes(mass_matrix, stiffness)  # raises on a free layout
        zeta = _damping(damping_ratio).copy()  # (never the caller's array: made read-only)
        omega_n = np.sqrt(lam)
        n = t.shape[0]
        kt_phi = kt @ phi  # K_i T_i phi_j, (n, 3, 6)
        # mode j's force per unit modal force in component c of mount i in row
        # c (n + 1) + i, and of the mounts' sum in row c (n + 1) + n, (3 (n + 1), 6)
        table = np.concatenate([kt_phi, kt_phi.sum(axis=0)[None]]).transpose(1, 0, 2)
        self._n = n
        self._phi = phi
        self._modal_forces = table.reshape(3 * (n + 1), 6)
        self._inv_lam = 1.0 / lam  # the static flexibility in modal form, 1/omega_j^2 [s^2]
        self._zeta = zeta
        self._undamped = zeta == 0
        self._fn = omega_n / _TWO_PI
        self._factors = _ModalFactors(omega_n, zeta)
        z = np.minimum(np.maximum(zeta, _SEED_DAMPING[0]), _SEED_DAMPING[1])
        self._cloud = np.sort((self._fn[:, None] * (1.0 + z[:, None] * _SEED_OFFSETS)).ravel())
        for a in (phi, zeta, self._fn):
            a.flags.writeable = False
        self._loads: dict = {}  # see _load_part
        self._at = (math.nan, None)  # the factors at the last single frequency, see _peak_at

    @property
    def natural_frequencies(self) -> np.ndarray:
        """The six natural frequencies, ascending, (6,) [Hz] (read-only)."""
        return self._fn

    @property
    def mode_shapes(self) -> np.ndarray:
        """Mass-normalised mode shapes phi_j as columns, phi^T M phi = I, (6, 6)
        [1/sqrt(kg), 1/(sqrt(kg) m)], signs arbitrary (read-only)."""
        return self._phi

    @property
    def damping_ratios(self) -> np.ndarray:
        """Modal damping ratio of each mode, (6,) [unitless] (read-only)."""
        return self._zeta

    @property
    def mount_count(self) -> int:
        """Number of mounts n."""
        return self._n

    def peaks(
        self,
        load: ArrayLike,
        band: ArrayLike,
        *,
        amplitude_exponent: float = 0.0,
        reference_frequency: float | None = None,
        rtol: float = 1e-9,
    ) -> MountForcePeaks:
        """Largest mount forces and mount-force transmissibility of this model over a
        band of forcing frequencies.

        Parameters
        ----------
        load : array_like
            Complex amplitudes (F_x, F_y, F_z, M_x, M_y, M_z) of the harmonic load about
            the CG at the reference frequency, (6,) [N, N m]. Not all zero.
        band : array_like
            (f_low, f_high), the forcing frequencies to cover, 0 <= f_low <= f_high
            [Hz]; equal ends give one frequency.
        amplitude_exponent : float, default 0
            p in the load amplitude L (f / f_ref)^p [unitless]; zero or positive.
        reference_frequency : float, optional
            f_ref, the frequency at which the load has the amplitude ``load`` [Hz];
            positive; needed when ``amplitude_exponent`` is not zero.
        rtol : float, default 1e-9
            Relative tolerance of the peak values [unitless]; 0 < rtol < 1.

        Returns
        -------
        MountForcePeaks
            As :func:`mount_force_peaks` [N, Hz, unitless].

        Raises
        ------
        ValueError
            On a band, load, exponent, reference frequency or rtol that
            :func:`mount_force_peaks` rejects, with the same messages.

        Notes
        -----
        The search and its tolerances are those described in :func:`mount_force_peaks`.
        """
        return self._peaks(
            *_call_arguments(load, band, amplitude_exponent, reference_frequency, rtol)
        )

    def transmissibility(self, load: ArrayLike, band: ArrayLike, *, rtol: float = 1e-9) -> float:
        """Mount-force transmissibility of a load of fixed amplitude over a band: the
        ``worst_ratio`` of :meth:`peaks`, ``inf`` where it is ``unbounded``.

        Parameters
        ----------
        load : array_like
            Complex amplitudes (F_x, F_y, F_z, M_x, M_y, M_z) of the harmonic load about
            the CG, (6,) [N, N m]. Not all zero.
        band : array_like
            (f_low, f_high), the forcing frequencies to cover, 0 <= f_low <= f_high
            [Hz].
        rtol : float, default 1e-9
            Relative tolerance of the peak values [unitless]; 0 < rtol < 1.

        Returns
        -------
        float
            max_i |f_i(f)| / max_i |f_i,static| at its largest over the band [unitless],
            the same bits as ``peaks(load, band).worst_ratio``.

        Raises
        ------
        ValueError
            As :meth:`peaks`, with the same messages.

        Notes
        -----
        For a band of one frequency with every mode damped it evaluates the mount
        forces alone, by the arithmetic :meth:`peaks` uses there, without the rest of
        :class:`MountForcePeaks` (the components, the total, copies of the static
        forces): a rule judging many bands asks for this number only.
        """
        f, (lo, hi), p, f_ref, tol = _call_arguments(load, band, 0.0, None, rtol)
        if lo == hi and not self._factors.undamped:
            kept = self._load_part(f)
            sizes = self._sizes_at(kept[5], lo)[1]
            unscaled = sizes[: self._n]
            return float(unscaled[int(unscaled.argmax())] / kept[6])
        found = self._peaks(f, (lo, hi), p, f_ref, tol)
        return math.inf if found.unbounded else found.worst_ratio

    def _peaks(self, f, band, p, f_ref, tol) -> MountForcePeaks:
        lo, hi = band
        n, fn, undamped = self._n, self._fn, self._undamped
        big_n = n + 1

        has_undamped = self._factors.undamped
        coeff, static_vectors, static, components, unexcited, forces, static_max = (
            self._load_part(f))

        # undamped excited modes in the band, and the quantities each one feeds
        blown = ()
        searched = None
        if has_undamped:
            blown = np.flatnonzero(
                undamped & ~unexcited & (fn >= lo * (1 - _TOUCH)) & (fn <= hi * (1 + _TOUCH))
            )
        if lo == hi and not has_undamped:
            return self._peak_at(forces, lo, p, f_ref, static, components, static_max)
        model = _ModalForces(self._factors, coeff, n, p, f_ref)
        if len(blown):
            infinite = np.zeros(model.count, bool)
            infinite_at = np.full(model.count, np.nan)
            for j in blown[::-1]:  # lowest mode last, so that its frequency is reported
                feeds_comp = coeff[:, j] != 0  # component c of vector i at c (n + 1) + i
                feeds_size = feeds_comp.reshape(3, big_n).any(axis=0)
                feeds = np.concatenate([feeds_size, feeds_comp, feeds_size[:n]])[: model.count]
                infinite |= feeds
                infinite_at[feeds] = fn[j]
            searched = ~infinite

        best, where = _search(model, (lo, hi), self._cloud, searched, tol)
        if searched is not None:
            best = np.where(searched, best, np.inf)
            where = np.where(searched, where, infinite_at)

        unscaled = slice(4 * big_n, 4 * big_n + n) if p != 0.0 else slice(0, n)
        worst_mount = int(best[unscaled].argmax())
        return MountForcePeaks(
            mount_peak=best[:n],
            mount_peak_frequency=where[:n],
            mount_peak_components=best[big_n : 4 * big_n].reshape(3, big_n)[:, :n].T.copy(),
            total_peak=float(best[n]),
            total_peak_frequency=float(where[n]),
            worst_ratio=float(best[unscaled][worst_mount] / static.max()),
            worst_ratio_frequency=float(where[unscaled][worst_mount]),
            worst_ratio_mount=worst_mount,
            static_mount=static.copy(),
            natural_frequencies=fn.copy(),
            unbounded=bool(len(blown)),
            unbounded_modes=tuple(int(j) for j in blown),
            static_mount_components=components.copy(),
        )


    def _load_part(self, f):
        """What :meth:`_peaks` derives from the load alone: the modal coefficients, the
        static mount forces, their sizes and components and the modes the load leaves
        alone (undamped models). A design asks for the same few load shapes in band after
        band, so they are kept, keyed by the load's bytes; the arrays kept are never
        written to and never handed out."""
        key = f.tobytes()
        kept = self._loads.get(key)
        if kept is not None:
            return kept
        n, undamped = self._n, self._undamped
        big_n = n + 1
        # modal coefficients (K_i T_i phi_j)_c phi_j^T L, (3 (n + 1), 6)
        modal_force = self._phi.T @ f
        unexcited = None
        if self._factors.undamped:
            size = math.sqrt(float(np.vdot(modal_force, modal_force).real))
            unexcited = np.abs(modal_force) <= _UNEXCITED * size
            modal_force = np.where(unexcited & undamped, 0.0, modal_force)
        coeff = self._modal_forces * modal_force
        # K_i T_i K^-1 L, (n, 3), and its size over a cycle, (n,)
        static_vectors = (coeff @ self._inv_lam).reshape(3, big_n)[:, :n].T
        static = _major_axis(static_vectors)
        if self._factors.undamped:
            scale = float(np.abs(coeff.reshape(3, big_n, 6)[:, :n]).max())
            # a quantity that does not feel an undamped mode must not see its round-off
            # blow up next to the resonance
            coeff = np.where(
                (np.abs(coeff) <= _UNEXCITED * scale) & undamped, 0.0, coeff
            )
        kept = (coeff, static_vectors, static, np.abs(static_vectors), unexcited,
                self._factors.forces(coeff), static.max())
        for a in kept[:4] + kept[5:6]:
            a.flags.writeable = False
        if len(self._loads) >= _KEPT_LOADS:
            self._loads.clear()
        self._loads[key] = kept
        return kept

    def _peak_at(self, forces, f, p, f_ref, static, components, static_max) -> MountForcePeaks:
        """:meth:`_peaks` of a band of one frequency ``f`` [Hz] when every mode is damped:
        the same operations on the same numbers as the search's one evaluation of every
        quantity (:meth:`_ModalForces.evaluate_all` at order 0), without its tables."""
        n = self._n
        big_n = n + 1
        comp, sizes = self._sizes_at(forces, f)
        freq = np.array([f])
        comps = np.sqrt(comp)
        if p != 0.0:
            unscaled = sizes[:n]
            with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
                scale = (freq / f_ref) ** p
                sizes = sizes * scale
                comps *= scale
        else:
            unscaled = sizes[:n]
        worst_mount = int(unscaled.argmax())
        return MountForcePeaks(
            mount_peak=sizes[:n],
            mount_peak_frequency=np.full(n, f),
            mount_peak_components=comps.reshape(3, big_n)[:, :n].T.copy(),
            total_peak=float(sizes[n]),
            total_peak_frequency=f,
            worst_ratio=float(unscaled[worst_mount] / static_max),
            worst_ratio_frequency=f,
            worst_ratio_mount=worst_mount,
            static_mount=static.copy(),
            natural_frequencies=self._fn.copy(),
            unbounded=False,
            unbounded_modes=(),
            static_mount_components=components.copy(),
        )

    def _sizes_at(self, forces, f):
        """The squared components and the sizes of every force vector at one frequency
        ``f`` [Hz], every mode damped: (3 N,) [N^2] and (N,) [N], the arithmetic of
        :meth:`_peak_at`, shared by :meth:`transmissibility` so that both give the same
        bits."""
        big_n = self._n + 1
        if self._at[0] != f:  # the bands' load shapes come one after another
            h = self._factors(np.array([f]), 0)
            h.flags.writeable = False
            self._at = (f, h)
        u = (forces @ self._at[1])[0, :, 0]  # (3 N,)
        ur, ui = u.real, u.imag
        comp = ur * ur
        comp += ui * ui
        s = comp[:big_n] + comp[big_n : 2 * big_n]
        s += comp[2 * big_n :]
        uu = u * u
        z = uu[:big_n] + uu[big_n : 2 * big_n]
        z += uu[2 * big_n :]
        size = s + np.abs(z)
        size *= 0.5
        return comp, np.sqrt(size)  # lambda >= 0 or nan: no warning to silence


def mount_force_peaks(
    mass_matrix: ArrayLike,
    positions: ArrayLike,
    stiffnesses: ArrayLike,
    load: ArrayLike,
    band: ArrayLike,
    *,
    centre_of_gravity: ArrayLike = (0.0, 0.0, 0.0),
    orientations: ArrayLike | None = None,
    support_stiffnesses: ArrayLike | None = None,
    damping_ratio: ArrayLike | None = None,
    amplitude_exponent: float = 0.0,
    reference_frequency: float | None = None,
    rtol: float = 1e-9,
) -> MountForcePeaks:
    """Largest mount forces and mount-force transmissibility over a band of forcing
    frequencies.

    Parameters
    ----------
    mass_matrix : array_like
        6 x 6 mass matrix about the CG, from
        :func:`vcheck.dynamics.modes.rigid_mounts.rigid_body_mass_matrix` [kg, kg m^2].
    positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
        The mount layout, as for
        :func:`vcheck.dynamics.modes.rigid_mounts.mount_stiffness_matrix`
        [m, N/m, m, unitless, N/m].
    load : array_like
        Complex amplitudes (F_x, F_y, F_z, M_x, M_y, M_z) of the harmonic load about the
        CG at the reference frequency, (6,) [N, N m]; see
        :func:`vcheck.dynamics.modes.rigid_mounts.load_at_point`. Not all zero.
    band : array_like
        (f_low, f_high), the forcing frequencies to cover, 0 <= f_low <= f_high [Hz];
        equal ends give one frequency.
    damping_ratio : array_like, optional
        Modal viscous damping ratio, one for all modes or six in ascending frequency
        order [unitless]; zero or positive. Default undamped.
    amplitude_exponent : float, default 0
        p in the load amplitude L (f / f_ref)^p [unitless]; 2 for inertial loads
        (unbalance, crank forces), 0 for a fixed amplitude; zero or positive.
    reference_frequency : float, optional
        f_ref, the frequency at which the load has the amplitude ``load`` [Hz];
        positive; needed when ``amplitude_exponent`` is not zero.
    rtol : float, default 1e-9
        Relative tolerance of the peak values [unitless]; 0 < rtol < 1. The peak
        frequencies are then known to about sqrt(rtol) times the peak's width.

    Returns
    -------
    MountForcePeaks
        Peak mount forces [N] and their frequencies [Hz], component peaks [N], total
        force peak [N], mount-force transmissibility [unitless] with its frequency [Hz]
        and mount, the static reference forces [N], the natural frequencies [Hz] and
        whether the band meets an undamped excited mode.

    Raises
    ------
    ValueError
        On a band that is negative, reversed or not two finite values; a load that is
        not six finite values or is zero; a negative damping ratio or exponent; an
        exponent without a reference frequency; an unrestrained layout.

    See Also
    --------
    MountForceModel : the same search for many loads and bands of one machine, with the
        layout checked and the modes solved once.

    Notes
    -----
    With mass-normalised modes phi_j, natural frequencies omega_j and damping ratios
    zeta_j (the modal formulation of
    :func:`vcheck.dynamics.modes.rigid_mounts.mount_forced_response`), the force of
    mount i at omega = 2 pi f is [1]_

        f_i = s(f) K_i T_i sum_j phi_j (phi_j^T L) (1 + 2 i zeta_j omega / omega_j)
              / (omega_j^2 - omega^2 + 2 i zeta_j omega_j omega),

    with K_i = R_i diag(k_i) R_i^T, T_i = [I, -[r_i]x] and s(f) = (f / f_ref)^p: the
    damping sits in the mounts in proportion to their stiffness, mode by mode. The
    coefficients are computed once, so each frequency costs a 6 x 3n product. The
    static reference is f_i,static = K_i T_i K^-1 L (omega = 0, s = 1); the
    transmissibility ratio is max_i |f_i(f)| / (s(f) max_i |f_i,static|), which for a
    single decoupled mode is the classical T = sqrt((1 + (2 zeta r)^2) / ((1 - r^2)^2 +
    (2 zeta r)^2)).

    The peak search works on ell = log(quantity) for every quantity (each mount's
    size, each component, the total, each mount's unscaled size for the ratio), with
    its derivatives in omega in closed form (those of H_j and of the major semi-axis).
    It evaluates them at seeds: the band ends, 16 points spread over the band, and
    f_j (1 + c zeta_j) for c from -4 to 4, half a damping ratio apart near f_j, around
    every natural frequency (zeta_j clipped to [0.001, 0.3] for the spacing). Wherever
    d ell / d omega changes from rising to falling between two neighbouring seeds (and
    the larger of the two is at least a quarter of the quantity's best seed) a local
    maximum is bracketed. It is refined from the maximum of the cubic through the two
    ends' values and slopes [2]_ by Newton's method on d ell / d omega = 0, bisecting
    whenever a step leaves the bracket or ell is not concave, until the quadratic
    model puts the maximum less than rtol (relative) above the current value
    (e1^2 / (2 |e2|) <= rtol). Band ends are seeds, so a maximum at an end is taken as
    it is. Only a peak narrower than the seed spacing, or two maxima between
    neighbouring seeds, could be missed.

    An undamped mode (zeta_j = 0) whose natural frequency lies in the band (within
    1e-12 relative of its ends) and that the load excites makes every quantity it feeds
    infinite; those are returned as ``inf`` at f_j. A mode that the load leaves alone
    (|phi_j^T L| below 1e-9 of the load's size) does not.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, chs. 2, 3 and 30 (from memory).
    .. [2] J. Nocedal, S. J. Wright, Numerical Optimization, 2nd ed., Springer, 2006,
       sec. 3.5, cubic interpolation from two values and two slopes (from memory).
    """
    call = _call_arguments(load, band, amplitude_exponent, reference_frequency, rtol)
    model = MountForceModel(
        mass_matrix, positions, stiffnesses, centre_of_gravity=centre_of_gravity,
        orientations=orientations, support_stiffnesses=support_stiffnesses,
        damping_ratio=damping_ratio,
    )
    return model._peaks(*call)


def _call_arguments(load, band, amplitude_exponent, reference_frequency, rtol):
    """Validated (load, (f_low, f_high), p, f_ref or None, rtol) of one peak search, in
    the order the errors are reported."""
    lo, hi = _band(band)
    f = _load6(load)
    p = float(amplitude_exponent)
    if not (p >= 0) or not math.isfinite(p):
        raise ValueError(f"amplitude exponent must be zero or positive, got {p:g}")
    f_ref = None
    if p != 0.0:
        if reference_frequency is None:
            raise ValueError(
                "reference frequency is needed when the amplitude exponent is not zero"
            )
        f_ref = float(reference_frequency)
        if not (f_ref > 0) or not math.isfinite(f_ref):
            raise ValueError(f"reference frequency must be positive, got {f_ref:g} Hz")
    tol = float(rtol)
    if not (0 < tol < 1):
        raise ValueError(f"rtol must be between 0 and 1, got {tol:g}")
    return f, (lo, hi), p, f_ref, tol


def _damping(damping_ratio) -> np.ndarray:
    if damping_ratio is None:
        return np.zeros(6)
    zeta = np.asarray(damping_ratio, dtype=float)
    if zeta.ndim == 0:
        zeta = np.full(6, float(zeta))
    if zeta.shape != (6,) or not ((zeta >= 0) & (zeta < np.inf)).all():
        raise ValueError("damping ratio must be one value or six, none negative")
    return zeta


def _band(band: ArrayLike) -> tuple[float, float]:
    if type(band) is tuple and len(band) == 2 and type(band[0]) is type(band[1]) is float:
        lo, hi = band
    else:
        b = np.asarray(band, dtype=float)
        if b.shape != (2,):
            raise ValueError("forcing band must be two finite frequencies (low, high) in Hz")
        lo, hi = float(b[0]), float(b[1])
    if not (math.isfinite(lo) and math.isfinite(hi)):
        raise ValueError("forcing band must be two finite frequencies (low, high) in Hz")
    if lo < 0 or hi < 0:
        raise ValueError(f"forcing band must not be negative, got {lo:g} to {hi:g} Hz")
    if lo > hi:
        raise ValueError(f"forcing band must run from low to high, got {lo:g} to {hi:g} Hz")
    return lo, hi

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
near the band, and refines each local maximum by golden-section search to a relative
tolerance on the peak value.

A mount's force is a 3-vector whose components are out of phase in general; its size
over a cycle is the major semi-axis of the ellipse its tip traces
(:func:`peak_vector_magnitude`).
"""

from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

from ..modes import rigid_mounts as _rm

__all__ = [
    "MountForcePeaks",
    "mount_force_peaks",
    "peak_vector_magnitude",
    "static_mount_forces",
]

_TWO_PI = 2.0 * math.pi
_GOLDEN = (math.sqrt(5.0) - 1.0) / 2.0  # 0.618...

_UNEXCITED = 1e-9
"""Modal force |phi_j^T L| at or below this share of sqrt(sum_j |phi_j^T L|^2) (the load's
size in the inverse-mass norm, L^H M^-1 L) counts as not exciting mode j [unitless]; the
same share of the largest modal mount-force coefficient counts as a mount (or the total)
not feeling an undamped mode. Round-off of an orthogonal load is about 1e-16."""

_TOUCH = 1e-12
"""Relative distance within which a band end counts as touching a natural frequency."""

_SEED_OFFSETS = np.array(
    [-7.0, -4.5, -3.0, -2.0, -1.5, -1.0, -0.5, 0.0, 0.5, 1.0, 1.5, 2.0, 3.0, 4.5, 7.0]
)
"""Seeds of the peak search around each natural frequency f_j: f_j (1 + c zeta_j) for
these c [unitless]; half a damping ratio apart near the resonance, where a lightly damped
peak is about 2 zeta_j f_j wide at half power."""

_SEED_DAMPING = (1e-3, 0.3)
"""Range to which zeta_j is clipped when placing seeds [unitless]: undamped modes still
get a small cloud, heavily damped ones do not spread it past zero frequency."""

_COARSE_SEEDS = 24
"""Seeds spread evenly (geometrically when f_low > 0) over the band, for maxima away
from resonances (a load growing with speed, interference between modes)."""

_PRUNE = 0.25
"""A local maximum among the seeds lower than this share of the best seed of the same
quantity is not refined [unitless]: near a peak the seeds sit within half a damping ratio
of it, where a resonance is still above 0.97 of its height."""

_MAX_ITERATIONS = 200


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
    p, q = a.real, a.imag
    big_p = np.einsum("...k,...k->...", p, p)
    big_q = np.einsum("...k,...k->...", q, q) if np.iscomplexobj(a) else np.zeros_like(big_p)
    pq = np.einsum("...k,...k->...", p, q) if np.iscomplexobj(a) else np.zeros_like(big_p)
    return np.sqrt(0.5 * (big_p + big_q) + np.hypot(0.5 * (big_p - big_q), pq))


# --------------------------------------------------------------------------- checks


def _load6(load: ArrayLike) -> np.ndarray:
    f = np.asarray(load, dtype=complex)
    if f.shape != (6,):
        raise ValueError(f"load must have six components (3 forces, 3 moments), got {f.shape}")
    if not np.all(np.isfinite(f)):
        raise ValueError("load must be finite, in N and N m")
    if not np.any(f != 0):
        raise ValueError("load must not be zero")
    return f


def _mount_stiffness_tensors(rot: np.ndarray, k_eff: np.ndarray) -> np.ndarray:
    """K_i = R_i diag(k_i) R_i^T, (n, 3, 3)."""
    return np.einsum("nij,nj,nkj->nik", rot, k_eff, rot)


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
    f = _load6(load) if np.any(np.asarray(load) != 0) or np.shape(load) != (6,) else np.zeros(6, complex)
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
    free = (lam <= _rm._NULL_TOLERANCE * max(float(lam[-1]), 0.0)) | (d <= 0)[: lam.size].any()
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


# --------------------------------------------------------------------------- model


class _ModalForces:
    """Mount forces f_i(omega) = s(f) sum_j G_ij H_j(omega), the modal form evaluated
    cheaply at many frequencies at once."""

    def __init__(self, coeff, coeff_total, omega_n, zeta, exponent, reference):
        n = coeff.shape[0]
        self.n = n
        self.bm = coeff.reshape(3 * n, 6).T.copy()  # (6, 3n)
        self.bt = coeff_total.T.copy()  # (6, 3)
        self.omega_n = omega_n
        self.omega_n2 = omega_n**2
        self.zeta = zeta
        self.two_zeta_wn = 2.0 * zeta * omega_n
        self.two_zeta_over_wn = 2.0 * zeta / omega_n
        self.undamped = bool(np.any(zeta == 0))
        self.exponent = exponent
        self.reference = reference
        self.static_major = None  # set by the caller

    def modal_factors(self, freq: np.ndarray) -> np.ndarray:
        """H_j = (1 + 2 i zeta_j omega / omega_j) / (omega_j^2 - omega^2 + 2 i zeta_j
        omega_j omega), (m, 6); 0 where an undamped mode is hit exactly (its
        coefficients are then zero for every quantity that is searched)."""
        w = _TWO_PI * freq[:, None]
        den = (self.omega_n2 - w * w) + 1j * (self.two_zeta_wn * w)
        num = 1.0 + 1j * (self.two_zeta_over_wn * w)
        if self.undamped:
            hit = den == 0
            if np.any(hit):
                den = np.where(hit, 1.0, den)
                num = np.where(hit, 0.0, num)
        return num / den

    def scale(self, freq: np.ndarray):
        if self.exponent == 0.0:
            return None
        return (freq / self.reference) ** self.exponent

    def forces(self, freq: np.ndarray):
        """Unit-amplitude mount forces (m, n, 3) and their sum (m, 3), complex."""
        h = self.modal_factors(freq)
        return (h @ self.bm).reshape(-1, self.n, 3), h @ self.bt

    def quantities(self, freq: np.ndarray) -> np.ndarray:
        """All searched quantities at each frequency, (m, 4 n + 2): mount sizes (n),
        components (3 n), total size, worst-mount ratio."""
        u, ut = self.forces(freq)
        major = _major_axis(u)  # (m, n)
        comp = np.abs(u).reshape(-1, 3 * self.n)
        total = _major_axis(ut)[:, None]
        ratio = major.max(axis=1, keepdims=True) / self.static_major
        s = self.scale(freq)
        if s is not None:
            s = s[:, None]
            major, comp, total = major * s, comp * s, total * s
        return np.concatenate([major, comp, total, ratio], axis=1)


# --------------------------------------------------------------------------- search


def _seeds(band, omega_n, zeta) -> np.ndarray:
    lo, hi = band
    if lo > 0:
        coarse = np.geomspace(lo, hi, _COARSE_SEEDS)
    else:
        coarse = np.linspace(lo, hi, _COARSE_SEEDS)
    fn = omega_n / _TWO_PI
    z = np.clip(zeta, *_SEED_DAMPING)
    cloud = (fn[:, None] * (1.0 + z[:, None] * _SEED_OFFSETS[None, :])).ravel()
    cloud = cloud[(cloud > lo) & (cloud < hi)]
    return np.unique(np.concatenate([coarse, cloud, [lo, hi]]))


def _golden_refine(model, a, b, fa, fb, which, rtol):
    """Maximise quantity ``which[k]`` on [a[k], b[k]] for all k at once by golden-section
    search; returns the best value found in each bracket and its frequency."""
    width = b - a
    c = b - _GOLDEN * width
    d = a + _GOLDEN * width
    idx = np.arange(a.size)
    both = model.quantities(np.concatenate([c, d]))
    fc = both[idx, which]
    fd = both[a.size + idx, which]
    active = np.ones(a.size, bool)
    for _ in range(_MAX_ITERATIONS):
        top = np.maximum(fc, fd)
        done = (top - np.minimum(fa, fb) <= 0.5 * rtol * top) | (b - a <= 4e-16 * b)
        active &= ~done
        act = np.flatnonzero(active)
        if act.size == 0:
            break
        left = fc[act] >= fd[act]  # the maximum is in [a, d]
        aa, bb, cc, dd = a[act], b[act], c[act], d[act]
        fa_, fb_, fc_, fd_ = fa[act], fb[act], fc[act], fd[act]
        new_b = np.where(left, dd, bb)
        new_fb = np.where(left, fd_, fb_)
        new_a = np.where(left, aa, cc)
        new_fa = np.where(left, fa_, fc_)
        w = new_b - new_a
        new_c = np.where(left, new_b - _GOLDEN * w, dd)
        new_d = np.where(left, cc, new_a + _GOLDEN * w)
        x_new = np.where(left, new_c, new_d)
        f_new = model.quantities(x_new)[np.arange(act.size), which[act]]
        a[act], b[act], fa[act], fb[act] = new_a, new_b, new_fa, new_fb
        c[act], d[act] = new_c, new_d
        fc[act] = np.where(left, f_new, fd_ * 0 + fc_)
        fd[act] = np.where(left, fc_, f_new)
    values = np.stack([fa, fc, fd, fb])
    places = np.stack([a, c, d, b])
    pick = np.argmax(values, axis=0)
    return values[pick, idx], places[pick, idx]


def _search(model, band, omega_n, zeta, searched, rtol):
    """Largest value and its frequency of every searched quantity over the band."""
    lo, hi = band
    n_q = searched.size
    best = np.full(n_q, -np.inf)
    where = np.full(n_q, lo)
    if lo == hi:
        v = model.quantities(np.array([lo]))[0]
        return np.where(searched, v, -np.inf), where
    x = _seeds(band, omega_n, zeta)
    v = model.quantities(x)  # (m, n_q)
    v[:, ~searched] = -np.inf
    m = x.size
    seed_best = np.argmax(v, axis=0)
    best = v[seed_best, np.arange(n_q)]
    where = x[seed_best]
    floor = _PRUNE * best
    worth = searched & (best > 0)

    # interior local maxima among the seeds: bracket [x_{k-1}, x_{k+1}]
    mid = v[1:-1]
    peak = (mid > v[:-2]) & (mid >= v[2:]) & (mid >= floor) & worth
    ks, qs = np.nonzero(peak)
    ks = ks + 1
    lows, highs, flows, fhighs, whiches = [x[ks - 1]], [x[ks + 1]], [v[ks - 1, qs]], [v[ks + 1, qs]], [qs]

    # band ends that are local maxima among the seeds: is the end itself the maximum,
    # or does the quantity rise inward first?
    end_lo = worth & (v[0] >= v[1]) & (v[0] >= floor)
    end_hi = worth & (v[-1] > v[-2]) & (v[-1] >= floor)
    if np.any(end_lo) or np.any(end_hi):
        step_lo = 1e-4 * (x[1] - x[0])
        step_hi = 1e-4 * (x[-1] - x[-2])
        probe = model.quantities(np.array([x[0] + step_lo, x[-1] - step_hi]))
        inward_lo = np.flatnonzero(end_lo & (probe[0] > v[0]))
        inward_hi = np.flatnonzero(end_hi & (probe[1] > v[-1]))
        lows += [np.full(inward_lo.size, x[0]), np.full(inward_hi.size, x[-2])]
        highs += [np.full(inward_lo.size, x[1]), np.full(inward_hi.size, x[-1])]
        flows += [v[0, inward_lo], v[-2, inward_hi]]
        fhighs += [v[1, inward_lo], v[-1, inward_hi]]
        whiches += [inward_lo, inward_hi]
    which = np.concatenate(whiches).astype(int)
    if which.size:
        val, at = _golden_refine(
            model,
            np.concatenate(lows).astype(float),
            np.concatenate(highs).astype(float),
            np.concatenate(flows).astype(float),
            np.concatenate(fhighs).astype(float),
            which,
            rtol,
        )
        order = np.lexsort((-val, which))
        first = np.ones(order.size, bool)
        first[1:] = which[order][1:] != which[order][:-1]
        q, val_q, at_q = which[order][first], val[order][first], at[order][first]
        better = val_q > best[q]
        best[q[better]] = val_q[better]
        where[q[better]] = at_q[better]
    del m
    return best, where


# --------------------------------------------------------------------------- main


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

    The peak search evaluates every quantity (each mount's size, each component, the
    total, the ratio) at seeds: the band ends, points spread over the band, and
    f_j (1 + c zeta_j) for c from -7 to 7 around every natural frequency. Each local
    maximum among the seeds (within a quarter of the best seed of its quantity) is
    bracketed by its neighbours and refined by golden-section search [2]_ until the
    values across the bracket differ by less than rtol / 2; a band end that is a local
    maximum is accepted when the quantity falls inward from it. Only a peak narrower
    than the seed spacing (about half a damping ratio near a resonance) could be
    missed.

    An undamped mode (zeta_j = 0) whose natural frequency lies in the band (within
    1e-12 relative of its ends) and that the load excites makes every quantity it feeds
    infinite; those are returned as ``inf`` at f_j. A mode that the load leaves alone
    (|phi_j^T L| below 1e-9 of the load's size) does not.

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, chs. 2, 3 and 30 (from memory).
    .. [2] J. Kiefer, Sequential minimax search for a maximum, Proceedings of the
       American Mathematical Society 4, 1953, 502-506 (from memory).
    """
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

    t, rot, k, ks = _rm._layout(
        positions, stiffnesses, centre_of_gravity, orientations, support_stiffnesses
    )
    n = t.shape[0]
    k_eff = _rm._series(k, ks)
    stiffness = _rm._assemble(t, rot, k_eff)
    _, lam, phi = _rm._solve_modes(mass_matrix, stiffness)  # raises on a free layout
    zeta = np.zeros(6) if damping_ratio is None else np.asarray(damping_ratio, float)
    zeta = np.broadcast_to(zeta, (6,)) if zeta.ndim == 0 else zeta
    if zeta.shape != (6,) or np.any(~(zeta >= 0)) or not np.all(np.isfinite(zeta)):
        raise ValueError("damping ratio must be one value or six, none negative")
    omega_n = np.sqrt(lam)
    fn = omega_n / _TWO_PI

    # modal coefficients G_ij = K_i T_i phi_j (phi_j^T L), (n, 3, 6)
    modal_force = phi.T @ f
    size = math.sqrt(float(np.sum(np.abs(modal_force) ** 2)))
    unexcited = np.abs(modal_force) <= _UNEXCITED * size
    undamped = zeta == 0
    modal_force = np.where(unexcited & undamped, 0.0, modal_force)
    shapes_at_mounts = np.einsum("nik,nkl,lj->nij", _mount_stiffness_tensors(rot, k_eff), t, phi)
    coeff = shapes_at_mounts * modal_force[None, None, :]
    coeff_total = coeff.sum(axis=0)  # (3, 6)
    scale = float(np.abs(coeff).max())
    if np.any(undamped):
        # a quantity that does not feel an undamped mode must not see its round-off
        # blow up next to the resonance
        tiny_m = (np.abs(coeff) <= _UNEXCITED * scale) & undamped[None, None, :]
        coeff = np.where(tiny_m, 0.0, coeff)
        tiny_t = (np.abs(coeff_total) <= _UNEXCITED * scale) & undamped[None, :]
        coeff_total = np.where(tiny_t, 0.0, coeff_total)
    model = _ModalForces(coeff, coeff_total, omega_n, zeta, p, f_ref)

    static = (coeff / lam[None, None, :]).sum(axis=2)  # K_i T_i K^-1 L, (n, 3)
    static_major = _major_axis(static)
    model.static_major = float(static_major.max())

    # undamped excited modes in the band, and the quantities each one feeds
    in_band = (fn >= lo * (1 - _TOUCH)) & (fn <= hi * (1 + _TOUCH))
    blown = np.flatnonzero(undamped & ~unexcited & in_band)
    n_q = 4 * n + 2
    infinite = np.zeros(n_q, bool)
    infinite_at = np.full(n_q, np.nan)
    for j in blown[::-1]:  # lowest mode last, so its frequency is reported
        feeds_comp = (coeff[:, :, j] != 0).reshape(3 * n)
        feeds_mount = feeds_comp.reshape(n, 3).any(axis=1)
        feeds = np.concatenate([feeds_mount, feeds_comp, [np.any(coeff_total[:, j] != 0)],
                                [feeds_mount.any()]])
        infinite |= feeds
        infinite_at[feeds] = fn[j]

    best, where = _search(model, (lo, hi), omega_n, zeta, ~infinite, tol)
    best = np.where(infinite, np.inf, best)
    where = np.where(infinite, infinite_at, where)

    ratio_at = float(where[-1])
    if infinite[-1]:
        worst_mount = int(np.flatnonzero(infinite[:n])[0])
    else:
        u, _ = model.forces(np.array([ratio_at]))
        worst_mount = int(np.argmax(_major_axis(u[0])))
    return MountForcePeaks(
        mount_peak=best[:n],
        mount_peak_frequency=where[:n],
        mount_peak_components=best[n : 4 * n].reshape(n, 3),
        total_peak=float(best[4 * n]),
        total_peak_frequency=float(where[4 * n]),
        worst_ratio=float(best[-1]),
        worst_ratio_frequency=ratio_at,
        worst_ratio_mount=worst_mount,
        static_mount=static_major,
        natural_frequencies=fn,
        unbounded=bool(blown.size),
        unbounded_modes=tuple(int(j) for j in blown),
    )


def _band(band: ArrayLike) -> tuple[float, float]:
    b = np.asarray(band, dtype=float)
    if b.shape != (2,) or not np.all(np.isfinite(b)):
        raise ValueError("forcing band must be two finite frequencies (low, high) in Hz")
    lo, hi = float(b[0]), float(b[1])
    if lo < 0 or hi < 0:
        raise ValueError(f"forcing band must not be negative, got {lo:g} to {hi:g} Hz")
    if lo > hi:
        raise ValueError(f"forcing band must run from low to high, got {lo:g} to {hi:g} Hz")
    return lo, hi

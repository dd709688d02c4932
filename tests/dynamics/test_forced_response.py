"""Mount-force peaks of a machine on mounts against outside references.

References used here, each named beside its check: a direct complex solve of the
equations of motion assembled in this file from rigid-body kinematics; time integration
with scipy.integrate.solve_ivp; a dense sweep of the existing, separately tested
``mount_forced_response``; the closed-form one-degree-of-freedom transmissibility and
its peak (shared/REFERENCES.md, tag [D]: derived by exact arithmetic from the published
formula); brute-force sampling over a cycle; singular values from numpy's SVD.
"""

from __future__ import annotations

import math
import re

import numpy as np
import pytest
from scipy import linalg

from vcheck.dynamics.isolation import forced_response as fr
from vcheck.dynamics.modes import rigid_mounts as rm

TWO_PI = 2 * math.pi


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


def symmetric_layout(a=0.5, b=0.3, z=0.0):
    """Four mounts at (+-a, +-b, z) around the reference point."""
    return np.array([[a, b, z], [a, -b, z], [-a, b, z], [-a, -b, z]], float)


def transmissibility(r, zeta):
    """One-DOF force transmissibility, REFERENCES.md [D]:
    T = sqrt((1 + (2 zeta r)^2) / ((1 - r^2)^2 + (2 zeta r)^2))."""
    return math.sqrt((1 + (2 * zeta * r) ** 2) / ((1 - r * r) ** 2 + (2 * zeta * r) ** 2))


def transmissibility_peak_ratio(zeta):
    """Where T peaks: d(T^2)/d(r^2) = 0 gives r^2 = (sqrt(1 + 8 zeta^2) - 1) / (4 zeta^2)
    (derived here from the formula above [D]; zeta 0.05 -> 0.99752, REFERENCES.md)."""
    return math.sqrt(math.sqrt(1 + 8 * zeta * zeta) - 1) / (2 * zeta)


def major_axis_svd(amplitudes):
    """Largest length over a cycle of Re(a e^{i w t}) = [Re a, -Im a] (cos, sin)^T: the
    largest singular value of the 3 x 2 matrix [Re a, Im a] (independent of the
    closed form in the module)."""
    a = np.asarray(amplitudes)
    mat = np.stack([a.real, a.imag], axis=-1)
    return np.linalg.svd(mat, compute_uv=False)[..., 0]


def irregular_case():
    """Five mounts, none alike, inclined, CG off-centre and above them; products of
    inertia."""
    m = 760.0
    inertia = np.array([[110.0, -7.0, 4.0], [-7.0, 240.0, 10.0], [4.0, 10.0, 280.0]])
    cg = np.array([0.12, -0.04, 0.38])
    positions = np.array(
        [(0.72, 0.41, 0.0), (0.66, -0.44, 0.03), (-0.05, 0.47, -0.02),
         (-0.61, 0.39, -0.03), (-0.70, -0.40, 0.01)]
    )
    k = np.array(
        [[3.0e5, 1.0e5, 0.8e5], [2.6e5, 0.9e5, 1.1e5], [1.8e5, 0.7e5, 0.6e5],
         [3.3e5, 1.2e5, 1.0e5], [2.8e5, 1.0e5, 0.9e5]]
    )
    tilts = [(0.25, 0.0, 1.0), (0.0, -0.3, 1.0), (0.1, 0.2, 1.0), (-0.15, 0.25, 1.0), (0, 0, 1)]
    axes = []
    for tilt in tilts:
        a = np.array(tilt, float) / np.linalg.norm(tilt)
        s = np.array([1.0, 0, 0]) - a[0] * a
        s /= np.linalg.norm(s)
        axes.append(np.column_stack([a, s, np.cross(a, s)]))
    return m, inertia, cg, positions, k, np.array(axes)


def kinematics(positions, cg):
    """T_i (3 x 6) from rigid-body kinematics: a unit translation moves the mount by
    e_j, a unit small rotation about e_j by e_j x r (numpy's cross product)."""
    r = positions - cg
    t = np.zeros((len(r), 3, 6))
    for j, e in enumerate(np.eye(3)):
        t[:, :, j] = e
        t[:, :, 3 + j] = np.cross(e, r)
    return t


def direct_model(m, inertia, cg, positions, k, axes, support=None):
    """M, K and per-mount stiffness tensors assembled here, independently of the
    library: K = sum T_i^T A_i diag(k_i) A_i^T T_i, springs in series with supports."""
    mass = np.zeros((6, 6))
    mass[:3, :3] = m * np.eye(3)
    mass[3:, 3:] = inertia
    k_eff = k if support is None else 1.0 / (1.0 / k + 1.0 / support)
    k_mount = np.array([a @ np.diag(kk) @ a.T for a, kk in zip(axes, k_eff)])
    t = kinematics(positions, cg)
    stiff = sum(ti.T @ ki @ ti for ti, ki in zip(t, k_mount))
    return mass, stiff, k_mount, t


def direct_forces(mass, stiff, k_mount, t, load, freq, beta):
    """Direct complex solve with a viscous damper c = beta k in parallel with every
    mount spring (stiffness-proportional damping, C = beta K):
    ((1 + i w beta) K - w^2 M) X = L, f_i = (1 + i w beta) K_i T_i X."""
    w = TWO_PI * freq
    x = np.linalg.solve((1 + 1j * w * beta) * stiff - w * w * mass, load)
    return (1 + 1j * w * beta) * np.einsum("nij,njk,k->ni", k_mount, t, x)


def proportional_damping_ratios(mass, stiff, beta):
    """C = beta K is modal with zeta_j = beta omega_j / 2 (Rayleigh damping; Harris'
    Shock and Vibration Handbook, 5th ed., ch. 2, from memory); omega_j from scipy's
    generalised symmetric eigensolver, ascending like the library's."""
    omega = np.sqrt(linalg.eigh(stiff, mass, eigvals_only=True))
    return beta * omega / 2, omega / TWO_PI


# ------------------------------------------------------------------ the ellipse


def test_peak_vector_magnitude_matches_sampling_over_a_cycle():
    # Brute force: |Re(a e^{i theta})| on 20,000 phases. The squared length is
    # A + D cos 2(theta - theta0), so a sampled maximum falls short by at most
    # (dtheta)^2 / 4 relative (2.5e-8 here); it can never exceed the true maximum.
    rng = np.random.default_rng(7)
    a = rng.normal(size=(200, 3)) + 1j * rng.normal(size=(200, 3))
    a[0] = [1.0, 1j, 0.0]  # circular: length 1 at every phase
    a[1] = [3.0, -4.0, 0.0]  # in phase: |a| = 5
    a[2] = [2.0 + 2j, 1.0 + 1j, 0.0]  # one common phase: |a|
    theta = np.linspace(0.0, TWO_PI, 20_000, endpoint=False)
    sampled = np.abs(
        np.linalg.norm((a[:, None, :] * np.exp(1j * theta)[None, :, None]).real, axis=2)
    ).max(axis=1)
    got = fr.peak_vector_magnitude(a)
    step = theta[1]
    assert np.all(sampled <= got * (1 + 1e-12))
    assert np.all(sampled >= got * (1 - step * step / 4 - 1e-12))
    np.testing.assert_allclose(got[:3], [1.0, 5.0, math.sqrt(10.0)], rtol=1e-14)
    # the largest singular value of [Re a, Im a] (numpy's SVD): the same quantity
    np.testing.assert_allclose(got, major_axis_svd(a), rtol=1e-12)
    # shapes: (..., 3) -> (...)
    assert fr.peak_vector_magnitude(a.reshape(20, 10, 3)).shape == (20, 10)


# ------------------------------------------------------------------ statics


def test_static_mount_forces_are_the_zero_frequency_limit_and_balance_the_load():
    # (1) Equal to mount_forced_response at 0 Hz, for modal and for mount damping
    # (the omega -> 0 limit; round-off tolerance). (2) Statics of the rigid body,
    # checked with numpy's cross product: sum f_i = F and sum r_i x f_i = M.
    m, inertia, cg, positions, k, axes = irregular_case()
    mass = rm.rigid_body_mass_matrix(m, inertia)
    load = rm.load_at_point([300.0, -200j, 500.0], [0.9, 0.1, 0.6], cg) + [0, 0, 0, 150, 0, 0]
    support = np.full((5, 3), 4e6)
    got = fr.static_mount_forces(
        positions, k, load, centre_of_gravity=cg, orientations=axes, support_stiffnesses=support
    )
    assert got.shape == (5, 3) and got.dtype == complex
    for extra in (dict(damping_ratio=0.05), dict(mount_damping=np.full((5, 3), 900.0))):
        res = rm.mount_forced_response(
            mass, positions, k, load, 0.0, centre_of_gravity=cg, orientations=axes,
            support_stiffnesses=support, **extra,
        )
        np.testing.assert_allclose(got, res.mount_forces, rtol=1e-10, atol=1e-10)
    r = positions - cg
    np.testing.assert_allclose(got.sum(axis=0), load[:3], atol=1e-9)
    np.testing.assert_allclose(np.cross(r, got).sum(axis=0), load[3:], atol=1e-9)
    # the same reference inside mount_force_peaks, and a band at 0 Hz is static
    peaks = fr.mount_force_peaks(
        mass, positions, k, load, (0.0, 0.0), centre_of_gravity=cg, orientations=axes,
        support_stiffnesses=support, damping_ratio=0.05,
    )
    np.testing.assert_allclose(peaks.static_mount, major_axis_svd(got), rtol=1e-10)
    np.testing.assert_allclose(peaks.mount_peak, major_axis_svd(got), rtol=1e-10)
    # each component of the rigid-mounting forces: the modal path against the direct solve
    np.testing.assert_allclose(peaks.static_mount_components, np.abs(got), rtol=1e-10,
                               atol=1e-9)
    assert peaks.worst_ratio == pytest.approx(1.0, rel=1e-12)


def test_static_mount_forces_name_an_unrestrained_motion():
    with pytest.raises(ValueError, match=exactly("mount layout leaves roll about x unrestrained")):
        fr.static_mount_forces(
            [[0.5, 0, 0], [-0.5, 0, 0]], np.tile([2e5, 1e5, 1e5], (2, 1)), [0, 0, 1, 0, 0, 0]
        )


# ------------------------------------------------- single frequencies, direct solve


@pytest.mark.parametrize("exponent", [0.0, 2.0])
def test_mount_forces_at_single_frequencies_match_a_direct_complex_solve(exponent):
    # Reference: the complex system assembled and solved in this file (direct_forces):
    # stiffness-proportional dampers in every mount, which is modal damping with
    # zeta_j = beta omega_j / 2, so the library's modal form must agree exactly.
    # Asymmetric layout, inclined mounts, flexible supports, a roll moment plus a force
    # out of phase at a point off the CG. A one-frequency band gives the force sizes
    # at that frequency: each mount's major semi-axis (SVD, independent), component
    # amplitudes, the total, and the worst-mount ratio against the static solve
    # K X = L. Tolerance 1e-9: round-off of 6 x 6 solves with condition < 1e6.
    m, inertia, cg, positions, k, axes = irregular_case()
    support = np.tile([3e6, 2e6, 2e6], (5, 1))
    mass, stiff, k_mount, t = direct_model(m, inertia, cg, positions, k, axes, support)
    beta = 2.5e-3
    zeta, f_n = proportional_damping_ratios(mass, stiff, beta)
    arm = np.array([0.85, -0.3, 0.7]) - cg
    force = np.array([120.0, 400.0j, -250.0 + 90j])
    load = np.concatenate([force, np.cross(arm, force) + [600.0, 0, 0]])
    static = np.einsum("nij,njk,k->ni", k_mount, t, np.linalg.solve(stiff, load))
    f_ref = 9.0
    for freq in [0.7, f_n[1] * 0.999, 0.5 * (f_n[2] + f_n[3]), f_n[5], 14.0]:
        want = direct_forces(mass, stiff, k_mount, t, load, freq, beta)
        scale = (freq / f_ref) ** exponent
        got = fr.mount_force_peaks(
            rm.rigid_body_mass_matrix(m, inertia), positions, k, load, (freq, freq),
            centre_of_gravity=cg, orientations=axes, support_stiffnesses=support,
            damping_ratio=zeta, amplitude_exponent=exponent,
            reference_frequency=f_ref if exponent else None,
        )
        np.testing.assert_allclose(got.mount_peak, scale * major_axis_svd(want), rtol=1e-9)
        np.testing.assert_allclose(got.mount_peak_components, scale * np.abs(want), rtol=1e-9,
                                   atol=1e-9 * np.abs(want).max())
        assert got.total_peak == pytest.approx(scale * major_axis_svd(want.sum(axis=0)), rel=1e-9)
        ratio = major_axis_svd(want).max() / major_axis_svd(static).max()
        assert got.worst_ratio == pytest.approx(ratio, rel=1e-9)  # same amplitude: no scale
        assert got.worst_ratio_mount == int(np.argmax(major_axis_svd(want)))
        np.testing.assert_allclose(got.mount_peak_frequency, freq)
        np.testing.assert_allclose(got.natural_frequencies, f_n, rtol=1e-10)
        assert not got.unbounded and got.unbounded_modes == ()


@pytest.mark.parametrize(
    "zeta",
    [
        [0.02, 0.5, 1.5, 2.0, 0.99, 0.1],  # heavy and overdamped modes
        [0.02, 1.0, 0.3, 1.0 - 1e-6, 0.05, 0.2],  # critically damped modes
    ],
)
def test_heavy_and_critical_modal_damping_match_a_direct_complex_solve(zeta):
    # Reference: the damping matrix C = M Phi diag(2 zeta_j omega_j) Phi^T M built in
    # this file from scipy's eigenvectors (Phi^T M Phi = I), the system
    # (K + i w C - w^2 M) X = L solved directly, and the mount forces
    # f_i = K_i T_i (X + i w K^-1 C X): the damping in each mode carried by the mounts
    # in proportion to their stiffness (C phi_j = (2 zeta_j / omega_j) K phi_j), as in
    # mount_forced_response. Damping ratios up to 2 and exactly 1 (a double pole)
    # exercise both ways the library evaluates the modal factors. Tolerance 1e-9:
    # round-off of 6 x 6 solves.
    m, inertia, cg, positions, k, axes = irregular_case()
    mass, stiff, k_mount, t = direct_model(m, inertia, cg, positions, k, axes)
    lam, phi = linalg.eigh(stiff, mass)
    zeta = np.array(zeta)
    damping = mass @ phi @ np.diag(2 * zeta * np.sqrt(lam)) @ phi.T @ mass
    load = np.array([0.0, 300.0, 100j, 250.0, -40.0, 0.0])
    for freq in [0.3, 2.9, 4.4, 7.5, 20.0]:
        w = TWO_PI * freq
        x = np.linalg.solve(stiff + 1j * w * damping - w * w * mass, load)
        elastic = x + 1j * w * np.linalg.solve(stiff, damping @ x)
        want = np.einsum("nij,njk,k->ni", k_mount, t, elastic)
        got = fr.mount_force_peaks(
            rm.rigid_body_mass_matrix(m, inertia), positions, k, load, (freq, freq),
            centre_of_gravity=cg, orientations=axes, damping_ratio=zeta,
        )
        np.testing.assert_allclose(got.mount_peak, major_axis_svd(want), rtol=1e-9)
        np.testing.assert_allclose(got.mount_peak_components, np.abs(want), rtol=1e-9,
                                   atol=1e-9 * np.abs(want).max())
    # and the band search is not below a sweep of the library's direct function
    band = (0.5, 12.0)
    got = fr.mount_force_peaks(rm.rigid_body_mass_matrix(m, inertia), positions, k, load, band,
                               centre_of_gravity=cg, orientations=axes, damping_ratio=zeta)
    sweep = rm.mount_forced_response(rm.rigid_body_mass_matrix(m, inertia), positions, k, load,
                                     np.linspace(*band, 20_001), centre_of_gravity=cg,
                                     orientations=axes, damping_ratio=zeta)
    dense = major_axis_svd(sweep.mount_forces).max(axis=0)
    assert np.all(got.mount_peak >= dense * (1 - 1e-9 - 1e-11))
    assert np.all(got.mount_peak <= dense * (1 + 1e-4))  # resolution of 20,001 points


# ------------------------------------------------------------ time integration


def test_steady_mount_forces_match_time_integration():
    # Reference: the 12-state equations M q'' + beta K q' + K q = Re(L e^{i w t}),
    # assembled here (direct_model), integrated from rest with scipy's DOP853
    # (rtol 1e-10) for 24 s; the slowest decay is that of the lowest mode,
    # exp(-zeta_1 omega_1 t) with zeta_1 omega_1 = 1.14 /s, so in the fitted window
    # (t > 23 s) the transient left is below 1e-11 of the response.
    # Mount force f_i(t) = K_i T_i (q + beta q'); its steady amplitudes are fitted by
    # least squares to cos and sin over the last 3 periods. Load: a harmonic roll
    # moment plus a force at a point off the CG, out of phase. Tolerance 1e-6 relative
    # to the largest force: integration error plus the fit's sampling, with margin.
    from scipy.integrate import solve_ivp

    m, inertia, cg, positions, k, axes = irregular_case()
    mass, stiff, k_mount, t_kin = direct_model(m, inertia, cg, positions, k, axes)
    omega_1 = math.sqrt(linalg.eigh(stiff, mass, eigvals_only=True)[0])
    beta = 2 * 0.06 / omega_1  # zeta 0.06 on the lowest mode
    zeta, f_n = proportional_damping_ratios(mass, stiff, beta)
    arm = np.array([-0.4, 0.5, 0.8]) - cg
    force = np.array([0.0, 350.0, 200.0j])
    load = np.concatenate([force, np.cross(arm, force) + [500.0, 0, 0]])
    freq = 0.5 * (f_n[2] + f_n[3])
    w = TWO_PI * freq
    inv_mass = np.linalg.inv(mass)
    a = np.zeros((12, 12))
    a[:6, 6:] = np.eye(6)
    a[6:, :6] = -inv_mass @ stiff
    a[6:, 6:] = -beta * inv_mass @ stiff
    drive_re, drive_im = inv_mass @ load.real, inv_mass @ load.imag

    def rhs(time, state):
        out = a @ state
        out[6:] += drive_re * math.cos(w * time) - drive_im * math.sin(w * time)
        return out

    period = 1 / freq
    end = 24.0
    times = np.linspace(end - 3 * period, end, 600)
    sol = solve_ivp(rhs, (0.0, end), np.zeros(12), method="DOP853", rtol=1e-10, atol=1e-14,
                    t_eval=times)
    assert sol.success
    elastic = sol.y[:6] + beta * sol.y[6:]  # q + beta q'
    forces = np.einsum("nij,njk,kt->nit", k_mount, t_kin, elastic)  # (n, 3, time)
    basis = np.column_stack([np.cos(w * times), np.sin(w * times)])
    coef, *_ = np.linalg.lstsq(basis, forces.reshape(-1, times.size).T, rcond=None)
    fitted = (coef[0] - 1j * coef[1]).reshape(5, 3)  # a cos + b sin = Re((a - i b) e^{iwt})
    got = fr.mount_force_peaks(
        rm.rigid_body_mass_matrix(m, inertia), positions, k, load, (freq, freq),
        centre_of_gravity=cg, orientations=axes, damping_ratio=zeta,
    )
    top = np.abs(fitted).max()
    np.testing.assert_allclose(got.mount_peak, major_axis_svd(fitted), atol=1e-6 * top)
    np.testing.assert_allclose(got.mount_peak_components, np.abs(fitted), atol=1e-6 * top)
    assert got.total_peak == pytest.approx(major_axis_svd(fitted.sum(axis=0)), abs=1e-6 * top)


# ------------------------------------------------------- peak search, dense sweep


@pytest.mark.parametrize("rtol", [1e-9, 1e-12])
@pytest.mark.parametrize("exponent", [0.0, 2.0])
def test_peak_search_is_not_below_a_dense_sweep(exponent, rtol):
    # Reference: the existing mount_forced_response (tested on its own against time
    # integration and closed forms) on 10^5 frequencies over a band crossing at least
    # three rigid-body modes, damping 0.005 to 0.02; sizes by SVD. The sweep can only
    # be lower than the true peaks, and the search promises each peak to rtol: it must
    # be at least the sweep's maximum less rtol + 1e-11 (round-off between two code
    # paths), and above it by no more than the sweep's resolution: a grid step h
    # misses a resonance of half-width zeta f by at most (h / (2 zeta f))^2 / 2 = 8e-6
    # here; allowance 2e-5.
    m, inertia, cg, positions, k, axes = irregular_case()
    mass = rm.rigid_body_mass_matrix(m, inertia)
    zeta = np.array([0.005, 0.008, 0.01, 0.012, 0.015, 0.02])
    common = dict(centre_of_gravity=cg, orientations=axes, damping_ratio=zeta)
    f_n = fr.mount_force_peaks(mass, positions, k, [0, 0, 1.0, 0, 0, 0], (1, 1), **common
                               ).natural_frequencies
    band = (0.8 * f_n[1], 1.05 * f_n[4])
    crossed = np.sum((f_n > band[0]) & (f_n < band[1]))
    assert crossed >= 3
    f_ref = band[1]
    load = rm.load_at_point([150.0, 0.0, 300.0j], [0.8, 0.35, 0.6], cg) + [0, 0, 0, 0, -60j, 400.0]
    got = fr.mount_force_peaks(mass, positions, k, load, band, amplitude_exponent=exponent,
                               reference_frequency=f_ref, rtol=rtol, **common)
    sweep = np.linspace(band[0], band[1], 100_000)
    res = rm.mount_forced_response(mass, positions, k, load, sweep, **common)
    scale = (sweep / f_ref) ** exponent
    sizes = major_axis_svd(res.mount_forces)  # (f, n)
    static = rm.mount_forced_response(mass, positions, k, load, 0.0, **common).mount_forces
    dense = {
        "mount": (sizes * scale[:, None]).max(axis=0),
        "components": (np.abs(res.mount_forces) * scale[:, None, None]).max(axis=0),
        "total": (major_axis_svd(res.mount_forces.sum(axis=1)) * scale).max(),
        "ratio": sizes.max(axis=1).max() / major_axis_svd(static).max(),
    }
    found = {
        "mount": got.mount_peak,
        "components": got.mount_peak_components,
        "total": got.total_peak,
        "ratio": got.worst_ratio,
    }
    h = sweep[1] - sweep[0]
    allowance = 2e-5
    assert (h / (2 * zeta[0] * f_n[0])) ** 2 / 2 < allowance / 2
    for name, want in dense.items():
        have = np.asarray(found[name])
        assert np.all(have >= np.asarray(want) * (1 - rtol - 1e-11)), name
        assert np.all(have <= np.asarray(want) * (1 + allowance)), name
    # the reported frequencies carry the reported values (one more direct evaluation)
    at = rm.mount_forced_response(mass, positions, k, load, got.mount_peak_frequency, **common)
    here = major_axis_svd(at.mount_forces[np.arange(5), np.arange(5)])
    np.testing.assert_allclose(
        here * (got.mount_peak_frequency / f_ref) ** exponent, got.mount_peak, rtol=1e-10
    )
    at = rm.mount_forced_response(mass, positions, k, load, got.worst_ratio_frequency, **common)
    assert major_axis_svd(at.mount_forces).max() / major_axis_svd(static).max() == pytest.approx(
        got.worst_ratio, rel=1e-10
    )
    assert got.worst_ratio_mount == int(np.argmax(major_axis_svd(at.mount_forces)))


# -------------------------------------------------------- one-DOF closed forms


@pytest.mark.parametrize(
    "ratio, zeta, want",
    [
        # REFERENCES.md [D], quoted to 5 digits: tolerance 5e-5 relative
        (3.0, 0.05, 0.13041),
        (2.0, 0.05, 0.33918),
        (math.sqrt(2.0), 0.05, 1.0000),
        (4.0, 0.05, 0.07178),
    ],
)
def test_bounce_of_a_symmetric_layout_is_the_one_dof_transmissibility(ratio, zeta, want):
    # A vertical force at the CG of a doubly symmetric layout with the CG in the mount
    # plane excites bounce alone: each mount carries a quarter of the force, and the
    # worst-mount ratio dynamic / static is the classical transmissibility.
    m, kz = 500.0, 2.0e5
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, np.diag([40.0, 75.0, 95.0]))
    f_n = math.sqrt(4 * kz / m) / TWO_PI
    f = ratio * f_n
    got = fr.mount_force_peaks(mass, symmetric_layout(), k, [0, 0, 1000.0, 0, 0, 0], (f, f),
                               damping_ratio=zeta)
    assert got.worst_ratio == pytest.approx(want, rel=5e-5)
    assert got.worst_ratio == pytest.approx(transmissibility(ratio, zeta), rel=1e-12)
    np.testing.assert_allclose(got.mount_peak, 250.0 * transmissibility(ratio, zeta), rtol=1e-12)
    np.testing.assert_allclose(got.static_mount, 250.0, rtol=1e-12)
    assert got.total_peak == pytest.approx(1000.0 * transmissibility(ratio, zeta), rel=1e-12)


def test_bounce_peak_over_a_band_is_the_closed_form_resonance_peak():
    # REFERENCES.md [D]: for zeta 0.05 the transmissibility peaks at r = 0.99752 with
    # T = 10.0622 (quoted to 5 and 6 digits: tolerances 1e-5 in r and 1e-5 relative in
    # T); and at the exact r of transmissibility_peak_ratio, to the search's rtol.
    m, kz = 500.0, 2.0e5
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, np.diag([40.0, 75.0, 95.0]))
    f_n = math.sqrt(4 * kz / m) / TWO_PI
    for zeta in (0.05, 0.01):
        got = fr.mount_force_peaks(mass, symmetric_layout(), k, [0, 0, 1000.0, 0, 0, 0],
                                   (0.5 * f_n, 1.5 * f_n), damping_ratio=zeta)
        r_peak = transmissibility_peak_ratio(zeta)
        if zeta == 0.05:
            assert got.worst_ratio == pytest.approx(10.0622, rel=1e-5)
            assert got.worst_ratio_frequency / f_n == pytest.approx(0.99752, abs=1e-5)
        # the value to rtol (1e-9) and, as the peak is flat, the place to about
        # sqrt(rtol) zeta = 3e-7 relative
        assert got.worst_ratio == pytest.approx(transmissibility(r_peak, zeta), rel=2e-9)
        assert got.worst_ratio_frequency / f_n == pytest.approx(r_peak, rel=5e-6)
        np.testing.assert_allclose(got.mount_peak, 250 * transmissibility(r_peak, zeta), rtol=2e-9)


def test_pure_roll_moment_on_a_symmetric_layout_is_the_roll_mode_transmissibility():
    # Closed form: with the CG in the mount plane of a doubly symmetric layout, roll is
    # a mode of its own, omega_roll = sqrt(4 kz b^2 / Ixx) (Harris' Shock and Vibration
    # Handbook, 5th ed., ch. 3, from memory; re-derived in test_rigid_mounts.py). A
    # moment M_x is carried by vertical forces +-M_x / (4 b) statically, and
    # dynamically by T(r, zeta_roll) times that; the total force is zero. Damping
    # differs by mode to show the roll mode's own ratio is used. REFERENCES.md [D]
    # peak for zeta 0.05: r = 0.99752, T = 10.0622 (tolerances as above).
    m, b, kz = 500.0, 0.3, 2.0e5
    inertia = np.diag([40.0, 75.0, 95.0])
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, inertia)
    f_roll = math.sqrt(4 * kz * b * b / inertia[0, 0]) / TWO_PI
    f_n = fr.mount_force_peaks(mass, symmetric_layout(b=b), k, [0, 0, 1.0, 0, 0, 0], (1, 1)
                               ).natural_frequencies
    roll = int(np.argmin(np.abs(f_n - f_roll)))
    assert f_n[roll] == pytest.approx(f_roll, rel=1e-12)
    zeta = np.full(6, 0.02)
    zeta[roll] = 0.05
    band = (0.6 * f_roll, 1.3 * f_roll)
    moment = 800.0
    got = fr.mount_force_peaks(mass, symmetric_layout(b=b), k, [0, 0, 0, moment, 0, 0], band,
                               damping_ratio=zeta)
    np.testing.assert_allclose(got.static_mount, moment / (4 * b), rtol=1e-12)
    assert got.worst_ratio == pytest.approx(10.0622, rel=1e-5)
    assert got.worst_ratio_frequency / f_roll == pytest.approx(0.99752, abs=1e-5)
    r_peak = transmissibility_peak_ratio(0.05)
    assert got.worst_ratio == pytest.approx(transmissibility(r_peak, 0.05), rel=2e-9)
    np.testing.assert_allclose(
        got.mount_peak, moment / (4 * b) * transmissibility(r_peak, 0.05), rtol=2e-9
    )
    # vertical forces only, and they cancel in the total
    np.testing.assert_allclose(got.mount_peak_components[:, :2], 0.0, atol=1e-9)
    assert got.total_peak <= 1e-9 * got.mount_peak.max()


# ------------------------------------------------------------- zero damping


def test_undamped_band_across_an_excited_mode_is_unbounded_not_an_error():
    # Without damping the response at an excited natural frequency is infinite
    # (one-DOF: T = 1 / |1 - r^2|, REFERENCES.md [D] at zeta 0). The band containing
    # the bounce frequency, or ending on it, reports inf there instead of raising.
    m, kz = 500.0, 2.0e5
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, np.diag([40.0, 75.0, 95.0]))
    f_b = math.sqrt(4 * kz / m) / TWO_PI
    load = [0, 0, 1000.0, 0, 0, 0]
    for band in [(0.5 * f_b, 2 * f_b), (f_b, 2 * f_b), (0.5 * f_b, f_b), (f_b, f_b)]:
        got = fr.mount_force_peaks(mass, symmetric_layout(), k, load, band)
        bounce = int(np.argmin(np.abs(got.natural_frequencies - f_b)))
        assert got.unbounded and got.unbounded_modes == (bounce,)
        assert np.all(np.isinf(got.mount_peak))
        np.testing.assert_allclose(got.mount_peak_frequency, f_b, rtol=1e-12)
        assert np.all(np.isinf(got.mount_peak_components[:, 2]))
        np.testing.assert_allclose(got.mount_peak_components[:, :2], 0.0, atol=1e-9)
        assert math.isinf(got.total_peak) and math.isinf(got.worst_ratio)


def test_undamped_band_across_an_unexcited_mode_stays_finite():
    # The same vertical force at the CG leaves roll, pitch and yaw alone (orthogonal
    # modes): a band across the roll mode (just above bounce here) is finite, and
    # equals the undamped one-DOF closed form F/4 / |1 - r^2| at the band end nearest
    # bounce (REFERENCES.md [D], zeta 0: r = 3 gives 0.12500). Round-off tolerance.
    m, b, kz = 500.0, 0.3, 2.0e5
    inertia = np.diag([40.0, 75.0, 95.0])
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, inertia)
    f_b = math.sqrt(4 * kz / m) / TWO_PI
    f_roll = math.sqrt(4 * kz * b * b / inertia[0, 0]) / TWO_PI
    band = (0.97 * f_roll, 1.1 * f_roll)
    assert f_b < band[0]
    got = fr.mount_force_peaks(mass, symmetric_layout(b=b), k, [0, 0, 1000.0, 0, 0, 0], band)
    roll = int(np.argmin(np.abs(got.natural_frequencies - f_roll)))
    assert band[0] < got.natural_frequencies[roll] < band[1]
    assert not got.unbounded and got.unbounded_modes == ()
    r = band[0] / f_b
    np.testing.assert_allclose(got.mount_peak, 250.0 / abs(1 - r * r), rtol=1e-12)
    np.testing.assert_allclose(got.mount_peak_frequency, band[0], rtol=1e-12)
    # r = 3 (above bounce) : 0.12500
    got = fr.mount_force_peaks(mass, symmetric_layout(b=b), k, [0, 0, 1000.0, 0, 0, 0],
                               (3 * f_b, 3 * f_b))
    assert got.worst_ratio == pytest.approx(0.125, rel=1e-12)


def test_undamped_roll_moment_blows_up_the_mounts_but_not_the_total():
    # A pure roll moment at resonance: the mounts' vertical forces grow without bound
    # but cancel in pairs, so the total force into the structure stays zero (closed
    # form of the symmetric layout, as above).
    m, b, kz = 500.0, 0.3, 2.0e5
    inertia = np.diag([40.0, 75.0, 95.0])
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, inertia)
    f_roll = math.sqrt(4 * kz * b * b / inertia[0, 0]) / TWO_PI
    got = fr.mount_force_peaks(mass, symmetric_layout(b=b), k, [0, 0, 0, 800.0, 0, 0],
                               (0.9 * f_roll, 1.1 * f_roll))
    assert got.unbounded and len(got.unbounded_modes) == 1
    assert got.natural_frequencies[got.unbounded_modes[0]] == pytest.approx(f_roll, rel=1e-12)
    assert np.all(np.isinf(got.mount_peak))
    assert got.total_peak == 0.0 and math.isinf(got.worst_ratio)


# --------------------------------------------------------------------- input


def test_bad_input_is_rejected_with_plain_messages():
    mass = rm.rigid_body_mass_matrix(500.0, np.diag([40.0, 75.0, 95.0]))
    k = np.tile([2e5, 5e4, 5e4], (4, 1))
    pos = symmetric_layout()
    load = [0, 0, 1000.0, 0, 0, 0]

    def call(band=(2.0, 10.0), load=load, **kw):
        return fr.mount_force_peaks(mass, pos, k, load, band, damping_ratio=0.05, **kw)

    cases = [
        (dict(band=(-1.0, 10.0)), "forcing band must not be negative, got -1 to 10 Hz"),
        (dict(band=(12.0, 10.0)), "forcing band must run from low to high, got 12 to 10 Hz"),
        (dict(band=(2.0, 5.0, 8.0)), "forcing band must be two finite frequencies (low, high) in Hz"),
        (dict(band=(2.0, math.inf)), "forcing band must be two finite frequencies (low, high) in Hz"),
        (dict(amplitude_exponent=2.0),
         "reference frequency is needed when the amplitude exponent is not zero"),
        (dict(amplitude_exponent=-1.0), "amplitude exponent must be zero or positive, got -1"),
        (dict(amplitude_exponent=2.0, reference_frequency=0.0),
         "reference frequency must be positive, got 0 Hz"),
        (dict(load=[0, 0, 1000.0, 0, 0]), "load must have six components (3 forces, 3 moments), got (5,)"),
        (dict(load=np.zeros((2, 6))), "load must have six components (3 forces, 3 moments), got (2, 6)"),
        (dict(load=np.zeros(6)), "load must not be zero"),
        (dict(load=[0, 0, math.nan, 0, 0, 0]), "load must be finite, in N and N m"),
        (dict(rtol=0.0), "rtol must be between 0 and 1, got 0"),
    ]
    for kwargs, message in cases:
        with pytest.raises(ValueError, match=exactly(message)):
            call(**kwargs)
    with pytest.raises(ValueError, match=exactly("damping ratio must be one value or six, none negative")):
        fr.mount_force_peaks(mass, pos, k, load, (2.0, 10.0), damping_ratio=[0.05, -0.01] * 3)
    with pytest.raises(ValueError, match=exactly("mount layout leaves roll about x unrestrained")):
        fr.mount_force_peaks(mass, [[0.5, 0, 0], [-0.5, 0, 0]], np.tile([2e5, 1e5, 1e5], (2, 1)),
                             load, (2.0, 10.0), damping_ratio=0.05)
    with pytest.raises(ValueError, match=exactly("amplitudes must have a last axis of vector components")):
        fr.peak_vector_magnitude(1.0 + 2j)


# ------------------------------------------------- one model, many searches


def assert_same_peaks(got, want):
    """Every field of two MountForcePeaks equal to the last bit (NaN equal to NaN)."""
    assert got._fields == want._fields
    for name, a, b in zip(got._fields, got, want):
        if isinstance(a, np.ndarray):
            assert a.shape == np.shape(b), name
            np.testing.assert_array_equal(a, b, err_msg=name, strict=True)
        else:
            assert type(a) is type(b) and (a == b or (a != a and b != b)), name


def test_model_peaks_equal_mount_force_peaks_on_one_model_for_many_searches():
    # The contract: MountForceModel(...).peaks(load, band, ...) is mount_force_peaks with
    # the same arguments, bit for bit, for any sequence of loads and bands on one model
    # (run here twice, the second time in reverse order, so that no search depends on
    # the one before). Loads: the rule's unit shapes (force y, force z, moment about x)
    # and a real force at a point off the CG plus a roll moment, out of phase; bands:
    # single frequencies, one at a natural frequency and one at 0 Hz, bands across
    # modes and from 0 Hz; exponents 0 and 2; two tolerances.
    # Outside references for the same results: the model's natural frequencies against
    # scipy's generalised eigensolver on K and M assembled in this file, and at every
    # single frequency the mount forces against the direct complex solve of this file
    # (stiffness-proportional dampers, beta = 2.5e-3, which is modal damping with
    # zeta_j = beta omega_j / 2; tolerance 1e-9 as in the single-frequency test above).
    m, inertia, cg, positions, k, axes = irregular_case()
    support = np.tile([3e6, 2e6, 2e6], (5, 1))
    mass, stiff, k_mount, t = direct_model(m, inertia, cg, positions, k, axes, support)
    beta = 2.5e-3
    zeta, f_n = proportional_damping_ratios(mass, stiff, beta)
    layout = dict(centre_of_gravity=cg, orientations=axes, support_stiffnesses=support,
                  damping_ratio=zeta)
    mass_matrix = rm.rigid_body_mass_matrix(m, inertia)
    model = fr.MountForceModel(mass_matrix, positions, k, **layout)
    np.testing.assert_allclose(model.natural_frequencies, f_n, rtol=1e-10)
    assert model.mount_count == 5
    np.testing.assert_array_equal(model.damping_ratios, zeta)

    arm = np.array([0.85, -0.3, 0.7]) - cg
    force = np.array([120.0, 400.0j, -250.0 + 90j])
    loads = [np.eye(6)[1], np.eye(6)[2], np.eye(6)[3],
             np.concatenate([force, np.cross(arm, force) + [600.0, 0, 0]])]
    bands = [(0.7, 0.7), (f_n[2], f_n[2]), (0.5 * (f_n[3] + f_n[4]),) * 2, (0.0, 0.0),
             (0.8 * f_n[1], 1.05 * f_n[4]), (0.0, 2.0 * f_n[5]), (0.95 * f_n[5], 14.0)]
    options = [dict(), dict(amplitude_exponent=2.0, reference_frequency=9.0),
               dict(rtol=1e-12)]
    cases = [(load, band, opt) for load in loads for band in bands for opt in options]
    for load, band, opt in cases + cases[::-1]:
        got = model.peaks(load, band, **opt)
        assert_same_peaks(got, fr.mount_force_peaks(mass_matrix, positions, k, load, band,
                                                     **layout, **opt))
        assert not got.unbounded
        if band[0] == band[1]:
            want = direct_forces(mass, stiff, k_mount, t, load, band[0], beta)
            scale = (band[0] / 9.0) ** opt.get("amplitude_exponent", 0.0)
            np.testing.assert_allclose(got.mount_peak, scale * major_axis_svd(want), rtol=1e-9)
            assert got.total_peak == pytest.approx(
                scale * major_axis_svd(want.sum(axis=0)), rel=1e-9, abs=1e-9 * got.mount_peak.max()
            )


def test_model_peaks_equal_mount_force_peaks_across_an_undamped_excited_mode():
    # An undamped model: a band across the bounce mode is unbounded for a vertical force
    # and a band across the roll mode only is finite, equal to the undamped one-DOF
    # closed form F/4 / |1 - r^2| at the band end nearest bounce (REFERENCES.md [D],
    # zeta 0; round-off tolerance); a roll moment across the roll mode blows up the
    # mounts but not the total (the pairs cancel: closed form of the symmetric layout).
    # model.peaks equals mount_force_peaks bit for bit in every case, inf and all.
    m, b, kz = 500.0, 0.3, 2.0e5
    inertia = np.diag([40.0, 75.0, 95.0])
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, inertia)
    layout = symmetric_layout(b=b)
    model = fr.MountForceModel(mass, layout, k)
    f_b = math.sqrt(4 * kz / m) / TWO_PI
    f_roll = math.sqrt(4 * kz * b * b / inertia[0, 0]) / TWO_PI
    vertical, roll = [0, 0, 1000.0, 0, 0, 0], [0, 0, 0, 800.0, 0, 0]
    searches = [(vertical, (0.5 * f_b, 2 * f_b)), (vertical, (f_b, f_b)),
                (vertical, (0.97 * f_roll, 1.1 * f_roll)), (roll, (0.9 * f_roll, 1.1 * f_roll)),
                (vertical, (0.5 * f_b, 2 * f_b))]
    got = []
    for load, band in searches:
        for opt in (dict(), dict(amplitude_exponent=2.0, reference_frequency=f_b)):
            one = model.peaks(load, band, **opt)
            assert_same_peaks(one, fr.mount_force_peaks(mass, layout, k, load, band, **opt))
            got.append(one)
    bounce = int(np.argmin(np.abs(model.natural_frequencies - f_b)))
    for one in got[:4]:
        assert one.unbounded and one.unbounded_modes == (bounce,)
        assert np.all(np.isinf(one.mount_peak)) and math.isinf(one.worst_ratio)
        np.testing.assert_allclose(one.mount_peak_frequency, f_b, rtol=1e-12)
    finite = got[4]
    r = 0.97 * f_roll / f_b
    assert not finite.unbounded
    np.testing.assert_allclose(finite.mount_peak, 250.0 / abs(1 - r * r), rtol=1e-12)
    for one in got[6:8]:
        assert one.unbounded and np.all(np.isinf(one.mount_peak)) and one.total_peak == 0.0
    assert_same_peaks(got[8], got[0])  # the model is not changed by the searches between


def test_model_rejects_what_mount_force_peaks_rejects_with_the_same_messages():
    mass = rm.rigid_body_mass_matrix(500.0, np.diag([40.0, 75.0, 95.0]))
    k = np.tile([2e5, 5e4, 5e4], (4, 1))
    pos = symmetric_layout()
    load = [0, 0, 1000.0, 0, 0, 0]
    model = fr.MountForceModel(mass, pos, k, damping_ratio=0.05)
    cases = [
        (dict(band=(-1.0, 10.0)), "forcing band must not be negative, got -1 to 10 Hz"),
        (dict(band=(12.0, 10.0)), "forcing band must run from low to high, got 12 to 10 Hz"),
        (dict(band=(2.0, math.nan)), "forcing band must be two finite frequencies (low, high) in Hz"),
        (dict(amplitude_exponent=2.0),
         "reference frequency is needed when the amplitude exponent is not zero"),
        (dict(amplitude_exponent=math.inf), "amplitude exponent must be zero or positive, got inf"),
        (dict(amplitude_exponent=1.0, reference_frequency=-2.0),
         "reference frequency must be positive, got -2 Hz"),
        (dict(load=np.zeros(6)), "load must not be zero"),
        (dict(load=[1.0] * 7), "load must have six components (3 forces, 3 moments), got (7,)"),
        (dict(rtol=1.0), "rtol must be between 0 and 1, got 1"),
    ]
    for kwargs, message in cases:
        args = dict(load=load, band=(2.0, 10.0)) | kwargs
        with pytest.raises(ValueError, match=exactly(message)):
            model.peaks(args.pop("load"), args.pop("band"), **args)
        args = dict(load=load, band=(2.0, 10.0)) | kwargs
        with pytest.raises(ValueError, match=exactly(message)):
            fr.mount_force_peaks(mass, pos, k, args.pop("load"), args.pop("band"),
                                 damping_ratio=0.05, **args)
    free = ([[0.5, 0, 0], [-0.5, 0, 0]], np.tile([2e5, 1e5, 1e5], (2, 1)))
    with pytest.raises(ValueError, match=exactly("mount layout leaves roll about x unrestrained")):
        fr.MountForceModel(mass, *free, damping_ratio=0.05)
    with pytest.raises(ValueError, match=exactly("damping ratio must be one value or six, none negative")):
        fr.MountForceModel(mass, pos, k, damping_ratio=-0.01)
    # mount_force_peaks still checks the search's arguments before the layout
    with pytest.raises(ValueError, match=exactly("load must not be zero")):
        fr.mount_force_peaks(mass, *free, np.zeros(6), (2.0, 10.0))


def test_model_keeps_its_own_read_only_copy_of_what_it_was_given():
    # The caller's damping array stays writeable and the model does not see later
    # changes to it; the model's arrays cannot be changed through its properties.
    # Reference for the frequencies: the one-DOF bounce closed form
    # f = sqrt(4 kz / m) / (2 pi) of the doubly symmetric layout (REFERENCES.md [D]).
    m, kz = 500.0, 2.0e5
    mass = rm.rigid_body_mass_matrix(m, np.diag([40.0, 75.0, 95.0]))
    zeta = np.full(6, 0.05)
    model = fr.MountForceModel(mass, symmetric_layout(), np.tile([kz, 5e4, 7e4], (4, 1)),
                               damping_ratio=zeta)
    zeta[:] = 0.5
    np.testing.assert_array_equal(model.damping_ratios, 0.05)
    for array in (model.natural_frequencies, model.mode_shapes, model.damping_ratios):
        with pytest.raises(ValueError, match="read-only"):
            array[0] = 0.0
    f_b = math.sqrt(4 * kz / m) / TWO_PI
    assert np.min(np.abs(model.natural_frequencies - f_b)) <= 1e-12 * f_b
    # the mode shapes are mass-normalised: Phi^T M Phi = I (numpy products)
    phi = model.mode_shapes
    np.testing.assert_allclose(phi.T @ mass @ phi, np.eye(6), atol=1e-12)
    # a result's arrays are its own: changing one leaves the model and a new search alone
    first = model.peaks([0, 0, 1000.0, 0, 0, 0], (0.5 * f_b, 1.5 * f_b))
    first.natural_frequencies[:] = 0.0
    first.mount_peak[:] = 0.0
    again = model.peaks([0, 0, 1000.0, 0, 0, 0], (0.5 * f_b, 1.5 * f_b))
    assert np.all(again.mount_peak > 0) and np.all(model.natural_frequencies > 0)


def test_model_transmissibility_is_the_worst_ratio_of_its_peaks_bit_for_bit():
    # MountForceModel.transmissibility(load, band) is peaks(load, band).worst_ratio to the
    # last bit (inf where peaks is unbounded), for the rule's unit shapes (plain-float
    # tuples) and an array load, on single frequencies (its own path, the mount sizes
    # alone) and bands (the search), in any order of calls; the single-frequency ratio is
    # also checked against the direct complex solve of this file (stiffness-proportional
    # dampers, beta = 2.5e-3; tolerance 1e-9 as in the single-frequency test above).
    m, inertia, cg, positions, k, axes = irregular_case()
    mass, stiff, k_mount, t = direct_model(m, inertia, cg, positions, k, axes)
    beta = 2.5e-3
    zeta, f_n = proportional_damping_ratios(mass, stiff, beta)
    mass_matrix = rm.rigid_body_mass_matrix(m, inertia)
    model = fr.MountForceModel(mass_matrix, positions, k, centre_of_gravity=cg,
                               orientations=axes, damping_ratio=zeta)
    loads = [(0.0, 1.0, 0.0, 0.0, 0.0, 0.0), (0.0, 0.0, 1.0, 0.0, 0.0, 0.0),
             (0.0, 0.0, 0.0, 1.0, 0.0, 0.0), np.array([120.0, 400.0j, -250.0, 30.0, 0, 5.0])]
    bands = [(0.7, 0.7), (f_n[2], f_n[2]), (14.0, 14.0), (0.0, 0.0),
             (0.8 * f_n[1], 1.05 * f_n[4]), (0.95 * f_n[5], 14.0)]
    cases = [(load, band) for band in bands for load in loads]
    for load, band in cases + cases[::-1]:
        got = model.transmissibility(load, band)
        want = fr.MountForceModel(mass_matrix, positions, k, centre_of_gravity=cg,
                                  orientations=axes, damping_ratio=zeta).peaks(load, band)
        assert type(got) is float and got.hex() == want.worst_ratio.hex(), (load, band)
        if band[0] == band[1]:
            forces = np.abs(major_axis_svd(direct_forces(mass, stiff, k_mount, t, load,
                                                         band[0], beta)))
            static = major_axis_svd(fr.static_mount_forces(
                positions, k, load, centre_of_gravity=cg, orientations=axes))
            assert got == pytest.approx(forces.max() / static.max(), rel=1e-9)


def test_model_transmissibility_of_an_undamped_model_and_its_refusals():
    # Undamped: a band across the bounce mode is unbounded (inf), one clear of it is the
    # undamped one-DOF closed form 1 / |1 - r^2| of the doubly symmetric layout
    # (REFERENCES.md [D], zeta 0; round-off tolerance) and peaks' worst_ratio bit for
    # bit. Bad arguments are refused with the messages of peaks.
    m, kz = 500.0, 2.0e5
    mass = rm.rigid_body_mass_matrix(m, np.diag([40.0, 75.0, 95.0]))
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    model = fr.MountForceModel(mass, symmetric_layout(), k)
    f_b = math.sqrt(4 * kz / m) / TWO_PI
    vertical = (0.0, 0.0, 1.0, 0.0, 0.0, 0.0)
    assert model.transmissibility(vertical, (0.5 * f_b, 2 * f_b)) == math.inf
    assert model.transmissibility(vertical, (f_b, f_b)) == math.inf
    for band in ((0.3 * f_b, 0.3 * f_b), (2.5 * f_b, 2.5 * f_b)):
        got = model.transmissibility(vertical, band)
        assert got.hex() == model.peaks(vertical, band).worst_ratio.hex()
        r = band[0] / f_b
        assert got == pytest.approx(1.0 / abs(1.0 - r * r), rel=1e-12)
    damped = fr.MountForceModel(mass, symmetric_layout(), k, damping_ratio=0.05)
    cases = [((-1.0, 10.0), vertical, "forcing band must not be negative, got -1 to 10 Hz"),
             ((12.0, 10.0), vertical, "forcing band must run from low to high, got 12 to 10 Hz"),
             ((2.0, 2.0), (0.0,) * 6, "load must not be zero"),
             ((2.0, 2.0), (1.0,) * 7,
              "load must have six components (3 forces, 3 moments), got (7,)")]
    for band, load, message in cases:
        for call in (damped.transmissibility, damped.peaks):
            with pytest.raises(ValueError, match=exactly(message)):
                call(load, band)
    with pytest.raises(ValueError, match=exactly("rtol must be between 0 and 1, got 1")):
        damped.transmissibility(vertical, (2.0, 2.0), rtol=1.0)

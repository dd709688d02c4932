"""Rigid machine on mounts against closed forms, time integration and transmissibility."""

from __future__ import annotations

import math

import numpy as np
import pytest

from vcheck.dynamics.modes import rigid_mounts as rm

TWO_PI = 2 * math.pi


def symmetric_layout(a=0.5, b=0.3, z=0.0):
    """Four mounts at (+-a, +-b, z) around the reference point."""
    return np.array([[a, b, z], [a, -b, z], [-a, b, z], [-a, -b, z]], float)


# ---------------------------------------------------------------- inertia


def test_uniform_box_inertia_matches_numerical_integration():
    # Closed form m (b^2 + c^2) / 12 (Meriam & Kraige, Engineering Mechanics: Dynamics,
    # 7th ed., appendix B, from memory) against a midpoint-rule integral over 60^3
    # cells, whose relative error is 1/(60^2) of the x^2 term = 2.8e-4: tolerance 5e-4.
    m, a, b, c = 640.0, 1.4, 0.7, 0.9
    n = 60
    xs = (np.arange(n) + 0.5) / n - 0.5
    x, y, z = np.meshgrid(xs * a, xs * b, xs * c, indexing="ij")
    dm = m / n**3
    numeric = dm * np.array(
        [
            [np.sum(y**2 + z**2), -np.sum(x * y), -np.sum(x * z)],
            [-np.sum(x * y), np.sum(x**2 + z**2), -np.sum(y * z)],
            [-np.sum(x * z), -np.sum(y * z), np.sum(x**2 + y**2)],
        ]
    )
    got = rm.uniform_box_inertia(m, a, b, c)
    np.testing.assert_allclose(np.diag(got), np.diag(numeric), rtol=5e-4)
    assert np.all(got - np.diag(np.diag(got)) == 0)


# ----------------------------------------------------- symmetric closed forms


def test_symmetric_layout_with_cg_in_mount_plane_decouples_into_closed_forms():
    # Closed forms of a rigid body on a doubly symmetric layout whose CG lies in the
    # mount plane (Harris' Shock and Vibration Handbook, 5th ed., ch. 3, from memory;
    # re-derived here [D]): each coordinate is its own mode,
    #   bounce sqrt(sum kz / m), surge sqrt(sum kx / m), sway sqrt(sum ky / m),
    #   roll sqrt(sum kz y^2 / Ixx), pitch sqrt(sum kz x^2 / Iyy),
    #   yaw sqrt(sum (kx y^2 + ky x^2) / Izz), all / (2 pi).
    # Exact arithmetic: tolerance 1e-12.
    m, a, b = 500.0, 0.5, 0.3
    inertia = np.diag([40.0, 75.0, 95.0])
    kz, kx, ky = 2.0e5, 5.0e4, 8.0e4
    mounts = symmetric_layout(a, b)
    # mount axes: axial z, first shear x, second shear y (the default, upright)
    k = np.tile([kz, kx, ky], (4, 1))
    modes = rm.rigid_body_modes(
        rm.rigid_body_mass_matrix(m, inertia), rm.mount_stiffness_matrix(mounts, k)
    )
    want = {
        "bounce": math.sqrt(4 * kz / m),
        "surge": math.sqrt(4 * kx / m),
        "sway": math.sqrt(4 * ky / m),
        "roll": math.sqrt(4 * kz * b * b / inertia[0, 0]),
        "pitch": math.sqrt(4 * kz * a * a / inertia[1, 1]),
        "yaw": math.sqrt(4 * (kx * b * b + ky * a * a) / inertia[2, 2]),
    }
    got = dict(zip(modes.descriptions, modes.frequencies * TWO_PI, strict=True))
    assert set(got) == set(want)
    for name, omega in want.items():
        assert got[name] == pytest.approx(omega, rel=1e-12), name
    # pure modes: all kinetic energy in one coordinate
    np.testing.assert_allclose(np.sort(modes.energy_fractions, axis=0)[-1], 1.0, atol=1e-12)
    # mass-normalised shapes
    mass = rm.rigid_body_mass_matrix(m, inertia)
    np.testing.assert_allclose(modes.shapes.T @ mass @ modes.shapes, np.eye(6), atol=1e-12)


def test_cg_above_the_mounts_couples_sway_with_roll_as_the_closed_form():
    # With the CG a height h above the mount plane, sway and roll couple through the
    # shear springs: K = sum [[ky, ky h], [ky h, ky h^2 + kz y^2]], M = diag(m, Ixx)
    # (Harris' Shock and Vibration Handbook, 5th ed., ch. 3, from memory; derived here
    # [D]); the two roots of det(K - w^2 M) = 0 by the quadratic formula. Surge and
    # pitch couple in the same way. Tolerance 1e-10 (round-off of the quadratic).
    m, a, b, h = 500.0, 0.5, 0.15, 0.45  # narrow track: strong coupling
    ixx, iyy, izz = 40.0, 75.0, 95.0
    kz, kx, ky = 2.0e5, 5.0e4, 8.0e4
    mounts = symmetric_layout(a, b, z=0.0)
    k = np.tile([kz, kx, ky], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, np.diag([ixx, iyy, izz]))
    stiff = rm.mount_stiffness_matrix(mounts, k, centre_of_gravity=(0.0, 0.0, h))
    modes = rm.rigid_body_modes(mass, stiff)

    def pair(k_shear, k_rot, inertia):
        kk = np.array([[k_shear, k_shear * h], [k_shear * h, k_shear * h * h + k_rot]])
        # det(kk - w2 diag(m, I)) = 0 -> m I w2^2 - (k11 I + k22 m) w2 + det(kk) = 0
        p, q, r = m * inertia, -(kk[0, 0] * inertia + kk[1, 1] * m), np.linalg.det(kk)
        disc = math.sqrt(q * q - 4 * p * r)
        return sorted([math.sqrt((-q - disc) / (2 * p)), math.sqrt((-q + disc) / (2 * p))])

    sway_roll = pair(4 * ky, 4 * kz * b * b, ixx)
    surge_pitch = pair(4 * kx, 4 * kz * a * a, iyy)
    want = sorted(
        sway_roll
        + surge_pitch
        + [math.sqrt(4 * kz / m), math.sqrt(4 * (kx * b * b + ky * a * a) / izz)]
    )
    np.testing.assert_allclose(modes.frequencies * TWO_PI, want, rtol=1e-10)
    # the sway-roll pair is coupled in words too, and holds all its energy in the two
    omega = modes.frequencies * TWO_PI
    words = [modes.descriptions[int(np.argmin(abs(omega - v)))] for v in sway_roll]
    assert words == ["coupled sway-roll", "coupled roll-sway"]
    for j, w in enumerate(modes.frequencies * TWO_PI):
        if any(math.isclose(w, v, rel_tol=1e-9) for v in sway_roll):
            fr = modes.energy_fractions[:, j]
            assert fr[1] + fr[3] == pytest.approx(1.0, abs=1e-12)
            assert min(fr[1], fr[3]) > 0.2


def test_inclined_mounts_add_axial_and_shear_stiffness_by_cos_squared():
    # A pair of V-mounts inclined +-theta in the y-z plane, CG in the mount plane:
    # vertical stiffness per mount ka cos^2 + ks2 sin^2 (stiffness transformation
    # R diag(k) R^T; closed form [D]), bounce stays a pure mode.
    m, theta = 300.0, math.radians(35)
    ka, ks1, ks2 = 3.0e5, 6.0e4, 4.0e4
    mounts = symmetric_layout(0.4, 0.25)
    axial = np.array(
        [[0, -math.sin(theta), math.cos(theta)], [0, math.sin(theta), math.cos(theta)]] * 2
    )
    axial = axial[[0, 1, 0, 1]]  # +y mounts lean one way, -y mounts the other
    orient = rm.mount_axes(axial)  # first shear along x
    np.testing.assert_allclose(orient[:, :, 1], np.tile([1.0, 0, 0], (4, 1)), atol=1e-15)
    stiff = rm.mount_stiffness_matrix(mounts, np.tile([ka, ks1, ks2], (4, 1)), orientations=orient)
    kz = 4 * (ka * math.cos(theta) ** 2 + ks2 * math.sin(theta) ** 2)
    assert stiff[2, 2] == pytest.approx(kz, rel=1e-13)
    modes = rm.rigid_body_modes(rm.rigid_body_mass_matrix(m, np.diag([20.0, 30.0, 40.0])), stiff)
    j = modes.descriptions.index("bounce")
    assert modes.frequencies[j] * TWO_PI == pytest.approx(math.sqrt(kz / m), rel=1e-12)


def test_support_stiffness_acts_in_series():
    # k_eff = k_m k_s / (k_m + k_s) per direction (springs in series, closed form);
    # an infinite support gives back the mount.
    m = 500.0
    kz, ks = 2.0e5, 6.0e5
    k = np.tile([kz, 5e4, 5e4], (4, 1))
    support = np.tile([ks, np.inf, np.inf], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, np.diag([40.0, 75.0, 95.0]))
    soft = rm.rigid_body_modes(
        mass, rm.mount_stiffness_matrix(symmetric_layout(), k, support_stiffnesses=support)
    )
    f = soft.frequencies[soft.descriptions.index("bounce")]
    assert f * TWO_PI == pytest.approx(math.sqrt(4 * kz * ks / (kz + ks) / m), rel=1e-12)
    rigid = rm.mount_stiffness_matrix(
        symmetric_layout(), k, support_stiffnesses=np.full((4, 3), np.inf)
    )
    np.testing.assert_array_equal(rigid, rm.mount_stiffness_matrix(symmetric_layout(), k))


# ------------------------------------------- non-symmetric layout, time integration


def irregular_case():
    m = 800.0
    inertia = np.array([[120.0, -8.0, 5.0], [-8.0, 260.0, 12.0], [5.0, 12.0, 300.0]])
    cg = np.array([0.1, -0.05, 0.35])
    positions = np.array(
        [(0.7, 0.4, 0.0), (0.65, -0.45, 0.02), (-0.6, 0.42, -0.03), (-0.72, -0.38, 0.0)]
    )
    k = np.array(
        [[3e5, 1e5, 0.8e5], [2.5e5, 0.9e5, 1.1e5], [3.2e5, 1.2e5, 1e5], [2.8e5, 1e5, 0.9e5]]
    )
    axes = []
    for tilt in [(0.2, 0, 1), (0, -0.3, 1), (-0.1, 0.25, 1), (0, 0, 1)]:
        a = np.array(tilt, float) / np.linalg.norm(tilt)
        s = np.array([1.0, 0, 0]) - a[0] * a
        s /= np.linalg.norm(s)
        axes.append(np.column_stack([a, s, np.cross(a, s)]))
    return m, inertia, cg, positions, k, np.array(axes)


def test_irregular_layout_eigenfrequencies_match_time_integration():
    # Independent check: the equations of motion are rebuilt here from Newton-Euler
    # kinematics (mount motion x + theta x r with numpy's cross product, force along
    # each mount axis, moment r x f), integrated freely with scipy's DOP853 (rtol 1e-10)
    # for 20 s from a random initial displacement, and the six peaks of the windowed,
    # zero-padded spectrum compared with the eigen-solution within the FFT's
    # resolution 1/T = 0.05 Hz.
    from scipy.integrate import solve_ivp
    from scipy.signal import find_peaks

    m, inertia, cg, positions, k, axes = irregular_case()
    modes = rm.rigid_body_modes(
        rm.rigid_body_mass_matrix(m, inertia),
        rm.mount_stiffness_matrix(positions, k, cg, orientations=axes),
    )
    r = positions - cg

    def generalised_force(q):
        u = q[:3] + np.cross(q[3:], r)
        along = np.einsum("nkc,nk->nc", axes, u)  # component on each mount axis
        f = -np.einsum("nc,nkc->nk", k * along, axes)
        return np.concatenate([f.sum(axis=0), np.cross(r, f).sum(axis=0)])

    g = np.column_stack([generalised_force(e) for e in np.eye(6)])  # linear: exact
    inv_mass = np.zeros((6, 6))
    inv_mass[:3, :3] = np.eye(3) / m
    inv_mass[3:, 3:] = np.linalg.inv(inertia)
    a = np.zeros((12, 12))
    a[:6, 6:] = np.eye(6)
    a[6:, :6] = inv_mass @ g

    duration, rate = 20.0, 100.0
    t = np.arange(0.0, duration, 1.0 / rate)
    rng = np.random.default_rng(1)
    start = np.concatenate([rng.uniform(-1, 1, 6) * 1e-3, np.zeros(6)])
    sol = solve_ivp(
        lambda _, s: a @ s, (0, duration), start, method="DOP853", rtol=1e-10, atol=1e-14, t_eval=t
    )
    assert sol.success
    window = np.hanning(t.size)
    n_fft = 2**17
    spectrum = np.zeros(n_fft // 2 + 1)
    for row in sol.y[:6]:
        p = np.abs(np.fft.rfft((row - row.mean()) * window, n_fft)) ** 2
        spectrum += p / p.max()
    freqs = np.fft.rfftfreq(n_fft, 1.0 / rate)
    peaks, _ = find_peaks(spectrum)
    top = np.sort(freqs[peaks[np.argsort(spectrum[peaks])[-6:]]])
    assert np.min(np.diff(modes.frequencies)) > 3 / duration  # resolvable
    np.testing.assert_allclose(top, modes.frequencies, atol=1.0 / duration)
    # the layout is really coupled: some mode is not pure
    assert np.sort(modes.energy_fractions, axis=0)[-1].min() < 0.95


# --------------------------------------------------------------- forced response


@pytest.mark.parametrize(
    "ratio, zeta, transmissibility",
    [
        # REFERENCES.md [D]: T = sqrt((1 + (2 zeta r)^2) / ((1 - r^2)^2 + (2 zeta r)^2));
        # r = 3, zeta 0.05 also confirmed there by scipy.signal.freqs and solve_ivp
        # (0.130412). Quoted to 5 digits: tolerance 5e-5 relative.
        (3.0, 0.05, 0.13041),
        (3.0, 0.10, 0.14537),
        (2.0, 0.05, 0.33918),
        (4.0, 0.05, 0.07178),
        (1.0, 0.05, 10.050),
        (1.0, 0.10, 5.0990),
        (math.sqrt(2.0), 0.05, 1.0000),
    ],
)
@pytest.mark.parametrize("damping", ["modal", "mounts"])
def test_force_transmitted_by_a_bouncing_machine_is_the_transmissibility(
    ratio, zeta, transmissibility, damping
):
    # A vertical harmonic force at the CG of a symmetric layout excites bounce only;
    # the sum of the mount forces over the applied force is the SDOF force
    # transmissibility, whether the damping is modal or a viscous damper in each mount.
    m, kz = 500.0, 2.0e5
    k = np.tile([kz, 5e4, 7e4], (4, 1))
    mass = rm.rigid_body_mass_matrix(m, np.diag([40.0, 75.0, 95.0]))
    omega_n = math.sqrt(4 * kz / m)
    freq = ratio * omega_n / TWO_PI
    load = np.array([0, 0, 1000.0, 0, 0, 0])
    if damping == "modal":
        res = rm.mount_forced_response(mass, symmetric_layout(), k, load, freq, damping_ratio=zeta)
    else:
        c = 2 * zeta * math.sqrt(4 * kz * m) / 4  # per mount, axial
        res = rm.mount_forced_response(
            mass, symmetric_layout(), k, load, freq, mount_damping=np.tile([c, 0, 0], (4, 1))
        )
    total = res.mount_forces.sum(axis=0)
    assert abs(total[2]) / 1000.0 == pytest.approx(transmissibility, rel=5e-5)
    np.testing.assert_allclose(np.abs(total[:2]), 0.0, atol=1e-9)
    # the axial force in each (upright) mount is the vertical one
    np.testing.assert_allclose(res.mount_forces_local[:, 0], res.mount_forces[:, 2], rtol=1e-14)


def test_mount_damping_with_flexible_support_matches_a_two_mass_model():
    # Independent model: machine - (4k || 4c) - support node of negligible mass
    # (1e-9 of the machine's) - 4 k_s - ground, solved as a 2 x 2 complex system. The
    # force into the ground is 4 k_s X_node. The node's inertia changes the answer by
    # omega^2 eps / k_s ~ 1e-13: tolerance 1e-9.
    m, kz, c, ks, freq = 500.0, 2.0e5, 800.0, 5.0e5, 7.3
    w = TWO_PI * freq
    z = 4 * (kz + 1j * w * c)
    eps = 1e-9 * m
    dyn = np.array([[-w * w * m + z, -z], [-z, -w * w * eps + z + 4 * ks]])
    x = np.linalg.solve(dyn, [1000.0, 0.0])
    ground = 4 * ks * x[1]
    res = rm.mount_forced_response(
        rm.rigid_body_mass_matrix(m, np.diag([40.0, 75.0, 95.0])),
        symmetric_layout(),
        np.tile([kz, 5e4, 5e4], (4, 1)),
        [0, 0, 1000.0, 0, 0, 0],
        freq,
        support_stiffnesses=np.tile([ks, 1e7, 1e7], (4, 1)),
        mount_damping=np.tile([c, 0, 0], (4, 1)),
    )
    assert res.mount_forces[:, 2].sum() == pytest.approx(ground, rel=1e-9)
    assert res.displacement[2] == pytest.approx(x[0], rel=1e-9)


@pytest.mark.parametrize("damping", ["modal", "mounts"])
def test_mount_forces_balance_the_load_on_an_irregular_layout(damping):
    # d'Alembert equilibrium of the rigid body [D]: load = -w^2 M X + sum T_i^T f_i,
    # with f_i the force the mount passes on (and so applies back on the machine
    # reversed). Checked for forces and moments over a sweep; round-off tolerance.
    m, inertia, cg, positions, k, axes = irregular_case()
    mass = rm.rigid_body_mass_matrix(m, inertia)
    load = rm.load_at_point([300.0, -200j, 500.0], [0.9, 0.1, 0.6], cg)
    freq = np.array([0.0, 2.0, 5.0, 11.0])
    extra = (
        dict(damping_ratio=0.04)
        if damping == "modal"
        else dict(mount_damping=np.full((4, 3), 600.0))
    )
    res = rm.mount_forced_response(
        mass, positions, k, load, freq, centre_of_gravity=cg, orientations=axes, **extra
    )
    assert res.displacement.shape == (4, 6) and res.mount_forces.shape == (4, 4, 3)
    r = positions - cg
    for i, f in enumerate(freq):
        w = TWO_PI * f
        fm = res.mount_forces[i]
        generalised = np.concatenate([fm.sum(axis=0), np.cross(r, fm).sum(axis=0)])
        np.testing.assert_allclose(
            generalised - w * w * (mass @ res.displacement[i]), load, atol=1e-9 * np.abs(load).max()
        )
    # the static response (0 Hz) is K^-1 F whatever the damping
    stiff = rm.mount_stiffness_matrix(positions, k, cg, orientations=axes)
    np.testing.assert_allclose(res.displacement[0], np.linalg.solve(stiff, load), rtol=1e-10)


def test_undamped_resonance_is_reported():
    mass = rm.rigid_body_mass_matrix(500.0, np.diag([40.0, 75.0, 95.0]))
    k = np.tile([2e5, 5e4, 5e4], (4, 1))
    f_bounce = math.sqrt(8e5 / 500.0) / TWO_PI
    with pytest.raises(
        ValueError, match=r"is a natural frequency of the undamped model: give a damping ratio$"
    ):
        rm.mount_forced_response(mass, symmetric_layout(), k, [0, 0, 1, 0, 0, 0], f_bounce)


# --------------------------------------------------------------- words and input


def test_describe_motion_names_dominant_and_coupled_motions():
    # threshold MODE_DOMINANCE = 0.8, "common practice" for decoupling targets
    assert rm.describe_motion([0, 0, 0.97, 0.01, 0.02, 0]) == "bounce"
    assert rm.describe_motion([0, 0.55, 0, 0.45, 0, 0]) == "coupled sway-roll"
    assert rm.describe_motion([0.5, 0, 0.1, 0, 0.4, 0]) == "coupled surge-pitch"
    assert rm.describe_motion([0.4, 0, 0.3, 0, 0.3, 0]) == "coupled surge-bounce-pitch"


def test_unrestrained_layouts_name_the_free_motion():
    mass = rm.rigid_body_mass_matrix(500.0, np.diag([40.0, 75.0, 95.0]))
    # two mounts on the x axis: nothing resists roll about x
    line = rm.mount_stiffness_matrix([[0.5, 0, 0], [-0.5, 0, 0]], np.tile([2e5, 1e5, 1e5], (2, 1)))
    with pytest.raises(ValueError, match=r"^mount layout leaves roll about x unrestrained$"):
        rm.rigid_body_modes(mass, line)
    # vertical springs only: surge, sway and yaw are free
    vertical = rm.mount_stiffness_matrix(symmetric_layout(), np.tile([2e5, 0, 0], (4, 1)))
    with pytest.raises(
        ValueError,
        match=r"^mount layout leaves surge along x, sway along y and yaw about z unrestrained$",
    ):
        rm.rigid_body_modes(mass, vertical)
    with pytest.raises(ValueError, match=r"^mount layout leaves roll about x unrestrained$"):
        rm.mount_forced_response(
            mass,
            [[0.5, 0, 0], [-0.5, 0, 0]],
            np.tile([2e5, 1e5, 1e5], (2, 1)),
            [0, 0, 1, 0, 0, 0],
            5.0,
            damping_ratio=0.05,
        )


def test_bad_inertia_and_mass_are_rejected():
    with pytest.raises(
        ValueError,
        match=r"^inertia tensor about the centre of gravity must be positive definite, "
        r"got principal moments -5, 20, 30 kg m\^2$",
    ):
        rm.rigid_body_mass_matrix(100.0, np.diag([20.0, -5.0, 30.0]))
    with pytest.raises(
        ValueError,
        match=r"^inertia tensor is not that of a real body: principal moments 1, 2, 5 kg m\^2 "
        r"break I1 \+ I2 >= I3$",
    ):
        rm.rigid_body_mass_matrix(100.0, np.diag([1.0, 2.0, 5.0]))
    with pytest.raises(ValueError, match=r"^inertia tensor must be symmetric$"):
        rm.rigid_body_mass_matrix(100.0, [[10.0, 1.0, 0], [0, 10.0, 0], [0, 0, 10.0]])
    with pytest.raises(ValueError, match=r"^machine mass must be positive, got -5 kg$"):
        rm.rigid_body_mass_matrix(-5.0, np.eye(3))
    with pytest.raises(ValueError, match=r"^machine mass must be positive, got 0 kg$"):
        rm.uniform_box_inertia(0.0, 1.0, 1.0, 1.0)


def test_bad_mounts_are_rejected():
    pos = symmetric_layout()
    with pytest.raises(
        ValueError, match=r"^stiffness of mount 2 must not be negative, got -1 N/m$"
    ):
        rm.mount_stiffness_matrix(pos, [[1, 1, 1], [1, 1, 1], [1, -1, 1], [1, 1, 1]])
    with pytest.raises(
        ValueError,
        match=r"^mount stiffnesses must have shape \(4, 3\), one row per mount, got \(3, 3\)$",
    ):
        rm.mount_stiffness_matrix(pos, np.ones((3, 3)))
    with pytest.raises(
        ValueError, match=r"^support stiffness under mount 0 must be positive, got 0 N/m$"
    ):
        rm.mount_stiffness_matrix(pos, np.ones((4, 3)), support_stiffnesses=np.zeros((4, 3)))
    with pytest.raises(ValueError, match=r"^orientation of mount 0 must be a rotation matrix"):
        rm.mount_stiffness_matrix(pos, np.ones((4, 3)), orientations=2 * np.eye(3))
    with pytest.raises(
        ValueError, match=r"^give either a modal damping ratio or mount damping, not both$"
    ):
        rm.mount_forced_response(
            rm.rigid_body_mass_matrix(1.0, np.eye(3)),
            pos,
            np.ones((4, 3)),
            np.zeros(6),
            1.0,
            damping_ratio=0.1,
            mount_damping=np.ones((4, 3)),
        )


def test_rigid_body_frequencies_are_those_of_rigid_body_modes_bit_for_bit():
    # The frequencies-only solve is rigid_body_modes(...).frequencies to the last bit, on
    # the irregular inclined layout above (products of inertia) and on the doubly
    # symmetric one, whose bounce frequency is also the closed form sqrt(4 kz / m) / 2 pi
    # (Harris' Shock and Vibration Handbook, ch. 3, from memory; round-off tolerance).
    m, inertia, cg, positions, k, axes = irregular_case()
    mass = rm.rigid_body_mass_matrix(m, inertia)
    for scale in (0.9, 1.0, 1.1):
        stiffness = rm.mount_stiffness_matrix(positions, k * scale, cg, orientations=axes)
        got = rm.rigid_body_frequencies(mass, stiffness)
        want = rm.rigid_body_modes(mass, stiffness).frequencies
        assert got.shape == (6,) and got.dtype == want.dtype
        assert [v.hex() for v in got.tolist()] == [v.hex() for v in want.tolist()]
    kz = 2.0e5
    mass = rm.rigid_body_mass_matrix(500.0, np.diag([40.0, 75.0, 95.0]))
    stiffness = rm.mount_stiffness_matrix(symmetric_layout(), np.tile([kz, 5e4, 7e4], (4, 1)))
    got = rm.rigid_body_frequencies(mass, stiffness)
    np.testing.assert_array_equal(got, rm.rigid_body_modes(mass, stiffness).frequencies)
    f_b = math.sqrt(4 * kz / 500.0) / (2 * math.pi)
    assert np.min(np.abs(got - f_b)) <= 1e-12 * f_b


def test_rigid_body_frequencies_refuse_what_rigid_body_modes_refuses():
    mass = rm.rigid_body_mass_matrix(500.0, np.diag([40.0, 75.0, 95.0]))
    line = rm.mount_stiffness_matrix([[0.5, 0, 0], [-0.5, 0, 0]], np.tile([2e5, 1e5, 1e5], (2, 1)))
    vertical = rm.mount_stiffness_matrix(symmetric_layout(), np.tile([2e5, 0, 0], (4, 1)))
    for m, k in ((mass, line), (mass, vertical), (mass, np.eye(5)), (-mass, line)):
        with pytest.raises(ValueError) as want:
            rm.rigid_body_modes(m, k)
        with pytest.raises(ValueError) as got:
            rm.rigid_body_frequencies(m, k)
        assert str(got.value) == str(want.value)

"""Checks of vcheck.dynamics.forcing.crank against outside references.

Each test names its reference beside the check and says why its tolerance is what it is.
Tags follow shared/REFERENCES.md: [C] seen in a published source, [D] derived by exact
arithmetic from the published formula, [M] from memory.

The independent numerical model used below knows nothing of the series in the module:
it places every piston by the exact slider-crank geometry, differentiates the sampled
positions twice by periodic central differences, sums the inertia forces and their
moments over the cylinders, and resolves the result into orders with numpy.fft.
"""

from __future__ import annotations

import doctest
import re

import numpy as np
import pytest

from vcheck.dynamics.forcing import crank
from vcheck.dynamics.forcing.crank import (
    COVERED_CYLINDER_COUNTS,
    CrankHarmonic,
    crank_free_loads,
    slider_crank_harmonics,
    standard_crank_angles,
)

DEG = np.pi / 180.0


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


# --------------------------------------------------------------------------- model

SAMPLES = 2**14  # per revolution


def numerical_free_loads(r, l, m_rec, m_rot, x, phi, beta, x_ref, max_order=12):
    """Shaking force and moment coefficients by exact geometry, finite differences, FFT.

    Crank speed omega = 1 rad/s, so time equals crank angle and the coefficients are
    per unit speed squared. Returns {order: (force (3,), moment (3,))} in the
    convention Re(c exp(1j k t)).
    """
    n = len(x)
    m_rec = np.broadcast_to(np.asarray(m_rec, float), (n,))
    m_rot = np.broadcast_to(np.asarray(m_rot, float), (n,))
    h = 2.0 * np.pi / SAMPLES
    t = h * np.arange(SAMPLES)

    def second_difference(signal):
        return (np.roll(signal, -1, axis=-1) - 2.0 * signal + np.roll(signal, 1, axis=-1)) / h**2

    force = np.zeros((3, SAMPLES))
    moment = np.zeros((3, SAMPLES))
    for i in range(n):
        line = np.array([0.0, np.sin(beta[i]), np.cos(beta[i])])
        theta = t + phi[i] - beta[i]  # crank angle from this cylinder's top dead centre
        s = r * np.cos(theta) + np.sqrt(l**2 - (r * np.sin(theta)) ** 2)
        piston = np.outer(line, s) + np.array([[x[i]], [0.0], [0.0]])
        pin = np.vstack([np.full(SAMPLES, x[i]), r * np.sin(t + phi[i]), r * np.cos(t + phi[i])])
        # inertia force of each part on the frame, and its moment about (x_ref, 0, 0)
        # taken at the part's own position
        for position, mass in ((piston, m_rec[i]), (pin, m_rot[i])):
            part = -mass * second_difference(position)
            force += part
            arm = position - np.array([[x_ref], [0.0], [0.0]])
            moment += np.cross(arm, part, axis=0)
    spectrum_f = 2.0 * np.fft.fft(force, axis=1) / SAMPLES
    spectrum_m = 2.0 * np.fft.fft(moment, axis=1) / SAMPLES
    return {k: (spectrum_f[:, k], spectrum_m[:, k]) for k in range(1, max_order + 1)}


LAYOUTS = {
    # asymmetric inline three, uneven spacing and throws, unequal masses, rotating masses
    "irregular-inline-3": dict(
        r=0.045, l=0.16, m_rec=[1.2, 0.9, 1.5], m_rot=[0.4, 0.0, 0.7],
        x=[0.0, 0.13, 0.31], phi=np.array([0.0, 100.0, 230.0]) * DEG,
        beta=np.zeros(3), x_ref=0.1,
    ),
    # 60-degree vee four on two throws 75 degrees apart, cylinders offset along x
    "vee-4-60": dict(
        r=0.04, l=0.14, m_rec=0.8, m_rot=[0.3, 0.3, 0.5, 0.5],
        x=[0.0, 0.025, 0.11, 0.135], phi=np.array([0.0, 0.0, 75.0, 75.0]) * DEG,
        beta=np.array([-30.0, 30.0, -30.0, 30.0]) * DEG, x_ref=0.06,
    ),
    # flat four from the default table, opposite cylinders offset along x
    "opposed-4": dict(
        r=0.035, l=0.12, m_rec=0.6, m_rot=0.2, x=[0.0, 0.04, 0.12, 0.16],
        phi=standard_crank_angles(4, 4, "opposed")[0],
        beta=standard_crank_angles(4, 4, "opposed")[1], x_ref=0.0,
    ),
    # five cylinders round one throw (radial-like), long crank: lambda = 0.35
    "five-round-one-throw": dict(
        r=0.07, l=0.2, m_rec=1.1, m_rot=0.9, x=np.zeros(5), phi=np.zeros(5),
        beta=np.arange(5) * 72.0 * DEG, x_ref=-0.05,
    ),
    # arbitrary banks and throws
    "arbitrary-6": dict(
        r=0.05, l=0.18, m_rec=[1.0, 1.3, 0.7, 0.9, 1.1, 1.2], m_rot=[0.0, 0.2, 0.4, 0.1, 0.0, 0.3],
        x=[-0.2, -0.1, 0.05, 0.12, 0.2, 0.33], phi=np.array([0, 37, 154, 201, 288, 333]) * DEG,
        beta=np.array([-80, -15, 10, 45, 95, 170]) * DEG, x_ref=0.07,
    ),
}


@pytest.mark.parametrize("name", sorted(LAYOUTS))
def test_free_loads_against_exact_geometry_and_fft(name):
    # Independent numerical model (module docstring of this file). Tolerance: the
    # periodic second difference returns harmonic k scaled by sinc^2(k h / 2), a
    # relative error of (k h)^2 / 12 = 2e-7 for k = 6 with 16384 samples per
    # revolution; rounding adds about 1e-9. So 2e-6 of the largest single-cylinder
    # term, which also sets the module's own zero threshold far below it.
    p = LAYOUTS[name]
    orders = (1, 2, 3, 4, 5, 6)
    got = crank_free_loads(p["r"], p["l"], p["m_rec"], p["m_rot"], p["x"], p["phi"],
                           p["beta"], orders=orders, reference_x=p["x_ref"])
    model = numerical_free_loads(p["r"], p["l"], p["m_rec"], p["m_rot"], p["x"], p["phi"],
                                 p["beta"], p["x_ref"])
    largest = p["r"] * max(np.max(p["m_rec"]), np.max(p["m_rot"]))
    arm = np.max(np.abs(np.asarray(p["x"]) - p["x_ref"])) + p["r"] + p["l"]
    assert [h.order for h in got] == [float(k) for k in orders]
    for harmonic in got:
        k = int(harmonic.order)
        force, moment = model[k]
        assert harmonic.force.shape == (3,) and harmonic.moment.shape == (3,)
        assert np.max(np.abs(harmonic.force - force)) <= 2e-6 * largest, k
        assert np.max(np.abs(harmonic.moment - moment)) <= 2e-6 * largest * arm, k
        assert harmonic.moment[0] == 0  # torque about the shaft axis is left out


def test_returned_orders_rebuild_the_whole_shaking_force():
    # Completeness against the same model: orders 1..12 returned by the module, summed
    # in the time domain, give the finite-difference force over the whole revolution.
    # Orders above 12 are below lambda^13 ~ 1e-7 for lambda = 0.28; the difference
    # error is (h/2)^2 / 12 relative. Tolerance 1e-6 of m r.
    p = LAYOUTS["irregular-inline-3"]
    got = crank_free_loads(p["r"], p["l"], p["m_rec"], p["m_rot"], p["x"], p["phi"],
                           p["beta"], orders=range(1, 13), reference_x=p["x_ref"])
    t = np.linspace(0.0, 2.0 * np.pi, 721)
    rebuilt = sum(np.real(np.outer(h.force, np.exp(1j * h.order * t))) for h in got)
    model = numerical_free_loads(p["r"], p["l"], p["m_rec"], p["m_rot"], p["x"], p["phi"],
                                 p["beta"], p["x_ref"], max_order=40)
    direct = sum(np.real(np.outer(f, np.exp(1j * k * t))) for k, (f, _) in model.items())
    assert np.max(np.abs(rebuilt - direct)) <= 1e-6 * p["r"] * 1.5


# --------------------------------------------------------------------------- harmonics


@pytest.mark.parametrize("ratio", [0.0, 0.15, 0.25, 0.35, 0.5, 0.7])
def test_harmonics_against_fft_of_the_exact_acceleration(ratio):
    # Independent: the exact acceleration in closed form, differentiating
    # s = r cos(theta) + sqrt(l^2 - r^2 sin^2 theta) twice by hand,
    # s'' = -r cos(theta) - r^2 cos(2 theta) / f - r^4 sin^2(2 theta) / (4 f^3),
    # f = sqrt(l^2 - r^2 sin^2 theta) (r = lambda, l = 1), resolved by numpy.fft. The
    # samples are of an analytic periodic function, so the FFT coefficients are exact
    # to rounding: tolerance 1e-13 absolute on coefficients of order 1.
    n = 4096
    theta = 2.0 * np.pi * np.arange(n) / n
    f = np.sqrt(1.0 - (ratio * np.sin(theta)) ** 2)
    accel = -(ratio * np.cos(theta) + ratio**2 * np.cos(2 * theta) / f
              + ratio**4 * np.sin(2 * theta) ** 2 / (4 * f**3))
    fourier = -2.0 * np.fft.rfft(accel).real / n / ratio if ratio else None
    orders = list(range(1, 17))
    got = slider_crank_harmonics(ratio, orders)
    if ratio == 0.0:  # analytic limit: pure harmonic motion
        assert np.array_equal(got, [1.0] + [0.0] * 15)
        return
    assert got == pytest.approx(fourier[1:17], abs=1e-13)


def test_published_series_for_the_harmonics():
    # Published series (from memory, [M]: C. F. Taylor, The Internal-Combustion Engine
    # in Theory and Practice, vol. 2, ch. 8; R. L. Norton, Design of Machinery, ch. 13):
    # A2 = l + l^3/4 + 15 l^5/128, A4 = -(l^3/4 + 3 l^5/16), A6 = 9 l^5/128,
    # A8 = -5 l^7/256. Tolerance: the series stop before the l^7 terms (l^9 for A8),
    # whose coefficients are below 0.5 in magnitude.
    for lam in (0.1, 0.2, 0.25, 0.3):
        a1, a2, a4, a6, a8 = slider_crank_harmonics(lam, (1, 2, 4, 6, 8))
        assert a1 == 1.0
        assert a2 == pytest.approx(lam + lam**3 / 4 + 15 * lam**5 / 128, abs=0.5 * lam**7)
        assert a4 == pytest.approx(-(lam**3 / 4 + 3 * lam**5 / 16), abs=0.5 * lam**7)
        assert a6 == pytest.approx(9 * lam**5 / 128, abs=0.5 * lam**7)
        assert a8 == pytest.approx(-5 * lam**7 / 256, abs=0.5 * lam**9)


def test_odd_harmonics_above_the_first_vanish():
    # Analytic: s(theta) holds cos(theta) and even harmonics only (pin on the axis).
    assert np.all(slider_crank_harmonics(0.3, (3, 5, 7, 9, 11)) == 0.0)


# --------------------------------------------------------------------------- balance

R, L, M = 0.05, 0.2, 1.0  # lambda = 0.25
LAM = R / L


def loads(x, phi, beta, m_rec=M, m_rot=0.0, orders=(1, 2, 4, 6), reference_x=0.0):
    return {h.order: h for h in crank_free_loads(R, L, m_rec, m_rot, x, phi, beta, orders,
                                                reference_x)}


def published_a2(lam):
    # A2 from the published series, see test_published_series_for_the_harmonics [M]
    return lam + lam**3 / 4 + 15 * lam**5 / 128


@pytest.mark.parametrize("bank", [0.0, 30 * DEG, -90 * DEG, 150 * DEG])
def test_single_cylinder(bank):
    # Machine-design handbook fact ([M], e.g. Norton, Design of Machinery, ch. 13): a
    # single cylinder shakes its frame along the cylinder line with a primary force
    # m_rec r w^2 and a secondary force about lambda times that (exactly A2 times).
    # Tolerance: rounding for the primary; the published series' l^7 remainder (6e-5)
    # for the secondary.
    h = loads([0.0], [bank], [bank])  # throw at top dead centre at t = 0
    line = np.array([0.0, np.sin(bank), np.cos(bank)])
    assert h[1.0].force == pytest.approx(M * R * line, abs=1e-15)
    assert h[2.0].force == pytest.approx(M * R * published_a2(LAM) * line, abs=M * R * LAM**7)
    assert np.linalg.norm(h[2.0].force) / (M * R) == pytest.approx(LAM, rel=LAM**2 / 4 * 1.05)


def test_inline_four_four_stroke():
    # Handbook fact ([M], Taylor vol. 2 ch. 8; Norton ch. 14): the flat-plane inline four
    # has no free primary force or moment, no secondary moment about its centre, and a
    # free secondary force 4 m_rec r w^2 lambda along the cylinder line (vertical here).
    # Tolerance: the published series' remainder 4 l^7 m r for the secondary.
    crank_angles, bank = standard_crank_angles(4, 4, "inline")
    x = 0.1 * np.arange(4)
    h = loads(x, crank_angles, bank, reference_x=0.15)
    assert np.all(h[1.0].force == 0) and np.all(h[1.0].moment == 0)
    assert h[2.0].force == pytest.approx([0, 0, 4 * M * R * published_a2(LAM)], abs=4 * M * R * LAM**7)
    assert np.all(h[2.0].moment == 0)
    assert abs(h[2.0].force[2]) / (4 * M * R * LAM) == pytest.approx(1.0, rel=LAM**2 / 4 * 1.05)


def test_inline_six_is_balanced_in_primary_and_secondary():
    # Handbook fact ([M], Taylor vol. 2 ch. 8; Den Hartog, Mechanical Vibrations, ch. 5):
    # the inline six has no free primary or secondary forces or moments, whatever the
    # rotating masses. The module zeroes resultants below 1e-12 of a single term.
    crank_angles, bank = standard_crank_angles(6, 4, "inline")
    h = loads(0.12 * np.arange(6), crank_angles, bank, m_rot=0.4, reference_x=-0.3)
    for order in (1.0, 2.0, 4.0):
        assert np.all(h[order].force == 0) and np.all(h[order].moment == 0)
    assert np.abs(h[6.0].force[2]) > 0  # the sixth order adds up: 6 m r A6


def test_ninety_degree_vee_twin_primary_is_a_constant_rotating_vector():
    # Handbook fact ([M], Taylor vol. 2 ch. 8; Norton ch. 14): with both rods on one
    # throw and banks 90 degrees apart, the reciprocating primary force is a vector of
    # constant length m_rec r w^2 turning with the crank (so a counterweight cancels
    # it); the secondary is sqrt(2) lambda m_rec r w^2, horizontal. Checked over the
    # cycle from the returned coefficients; tolerance rounding, and the published
    # series' remainder for the secondary. The FFT model covers the same layout below.
    crank_angles, bank = standard_crank_angles(2, 4, "vee", 90 * DEG)
    h = loads([0.0, 0.0], crank_angles, bank)
    t = np.linspace(0.0, 2.0 * np.pi, 361)
    primary = np.real(np.outer(h[1.0].force, np.exp(1j * t)))
    assert np.linalg.norm(primary, axis=0) == pytest.approx(M * R, rel=1e-14)
    crankpin = np.vstack([np.zeros_like(t), np.sin(t), np.cos(t)])  # throw direction
    assert primary == pytest.approx(M * R * crankpin, abs=1e-15)
    secondary = h[2.0].force
    assert secondary[2] == 0 and secondary[0] == 0
    assert abs(secondary[1]) == pytest.approx(np.sqrt(2) * M * R * published_a2(LAM),
                                              abs=2 * M * R * LAM**7)
    model = numerical_free_loads(R, L, M, 0.0, [0.0, 0.0], crank_angles, bank, 0.0)
    assert np.max(np.abs(model[2][0] - secondary)) <= 2e-6 * M * R


def test_inline_twin_with_throws_180_degrees_apart():
    # Handbook fact ([M], Norton ch. 14; Den Hartog ch. 5): the primary forces of a
    # 180-degree twin cancel and leave a primary rocking moment m_rec r w^2 a about the
    # transverse axis (pitch, about y), a the cylinder spacing. Rounding tolerance.
    a = 0.09
    h = loads([0.0, a], [0.0, np.pi], [0.0, 0.0], reference_x=a / 2)
    assert np.all(h[1.0].force == 0)
    assert np.abs(h[1.0].moment) == pytest.approx([0.0, M * R * a, 0.0], abs=1e-16)
    # the secondaries add: 2 A2 m r, no secondary moment about the centre
    assert h[2.0].force[2] == pytest.approx(2 * M * R * published_a2(LAM), abs=2 * M * R * LAM**7)
    assert np.all(h[2.0].moment == 0)


def test_cross_plane_vee_eight():
    # Handbook fact ([M], Taylor vol. 2 ch. 8): the 90-degree cross-plane vee eight has
    # no free primary or secondary force and no secondary moment; its primary moment is
    # a couple of constant magnitude turning with the crank, cancelled by crankshaft
    # counterweights. Its size for throws 0, 90, 270, 180 at spacing a is
    # |sum x_i exp(1j phi_i)| m r = |0 + 1j - 2j - 3| m r a = sqrt(10) m r a [D], the
    # same about any point since the primary force is zero. Rounding tolerance.
    a = 0.11
    crank_angles, bank = standard_crank_angles(8, 4, "vee", 90 * DEG)
    x = a * np.repeat(np.arange(4), 2)
    h = loads(x, crank_angles, bank, reference_x=1.5 * a)
    assert np.all(h[1.0].force == 0) and np.all(h[2.0].force == 0)
    assert np.all(h[2.0].moment == 0)
    t = np.linspace(0.0, 2.0 * np.pi, 361)
    couple = np.real(np.outer(h[1.0].moment, np.exp(1j * t)))
    assert np.linalg.norm(couple, axis=0) == pytest.approx(np.sqrt(10) * M * R * a, rel=1e-13)


def test_opposed_twin_leaves_rocking_couples_from_the_cylinder_offset():
    # Handbook fact ([M], Norton ch. 14): in an opposed (boxer) twin the primary and
    # secondary forces cancel; the offset a between the opposite cylinders leaves a
    # primary couple m r a and a secondary couple about lambda m r a, both about the
    # vertical axis (yaw, about z). Tolerance as for the single cylinder.
    a = 0.05
    crank_angles, bank = standard_crank_angles(2, 4, "opposed")
    h = loads([0.0, a], crank_angles, bank)
    for order in (1.0, 2.0, 4.0):
        assert np.all(h[order].force == 0)
    assert np.abs(h[1.0].moment) == pytest.approx([0.0, 0.0, M * R * a], abs=1e-16)
    assert np.abs(h[2.0].moment) == pytest.approx([0.0, 0.0, M * R * a * published_a2(LAM)],
                                                  abs=M * R * a * LAM**7)


def test_rotating_mass_is_an_order_one_rotating_force():
    # Closed form: a point mass m at radius r on a shaft turning at w pulls its bearing
    # with m r w^2 towards itself (as for unbalance, Thomson, Theory of Vibration, ch. 3
    # [M]); here the crank turns from +z to +y. Rounding tolerance.
    h = loads([0.2], [40 * DEG], [0.0], m_rec=0.0, m_rot=2.0, orders=(1, 2))
    t = np.linspace(0.0, 2.0 * np.pi, 73)
    force = np.real(np.outer(h[1.0].force, np.exp(1j * t)))
    pin = np.vstack([np.zeros_like(t), np.sin(t + 40 * DEG), np.cos(t + 40 * DEG)])
    assert force == pytest.approx(2.0 * R * pin, abs=1e-15)
    assert np.all(h[2.0].force == 0)
    assert h[1.0].moment == pytest.approx(0.2 * np.array([0.0, -h[1.0].force[2], h[1.0].force[1]]))


def test_scalar_masses_equal_per_cylinder_masses():
    # Array equals scalar: one mass for every cylinder is the same as a list of it.
    p = LAYOUTS["arbitrary-6"]
    scalar = crank_free_loads(p["r"], p["l"], 0.9, 0.3, p["x"], p["phi"], p["beta"])
    listed = crank_free_loads(p["r"], p["l"], [0.9] * 6, [0.3] * 6, p["x"], p["phi"], p["beta"])
    for a, b in zip(scalar, listed):
        assert isinstance(a, CrankHarmonic)
        assert np.array_equal(a.force, b.force) and np.array_equal(a.moment, b.moment)


# --------------------------------------------------------------------------- layouts


def tdc_angles(crank_angles, bank):
    """Crankshaft rotation from t = 0 at which each piston reaches top dead centre [deg]."""
    return np.sort(np.round(np.degrees(bank - crank_angles), 9) % 360.0)


@pytest.mark.parametrize(
    ("cylinders", "strokes", "arrangement", "vee"),
    [(n, 4, "inline", None) for n in COVERED_CYLINDER_COUNTS["inline"]]
    + [(n, 2, "inline", None) for n in COVERED_CYLINDER_COUNTS["inline"]]
    + [(n, 4, "opposed", None) for n in COVERED_CYLINDER_COUNTS["opposed"]]
    + [(n, 2, "opposed", None) for n in COVERED_CYLINDER_COUNTS["opposed"]]
    + [(8, 4, "vee", 90 * DEG), (12, 4, "vee", 60 * DEG), (4, 2, "vee", 90 * DEG)],
)
def test_default_layouts_fire_evenly(cylinders, strokes, arrangement, vee):
    # Common practice: these layouts fire evenly, every 720/n crank degrees for a
    # four-stroke (each piston passes top dead centre twice per cycle and fires on one
    # of them), 360/n for a two-stroke; the 90-degree cross-plane vee eight and the
    # 60-degree vee twelve likewise (from memory). So the top-dead-centre angles, taken
    # mod 360, must be the even firing angles mod 360, shifted by a constant. The two
    # pistons of an opposed pair reach their outer dead centres together (geometry), so
    # a two-stroke opposed machine fires its pairs evenly, both cylinders at once.
    crank_angles, bank = standard_crank_angles(cylinders, strokes, arrangement, vee)
    assert crank_angles.shape == bank.shape == (cylinders,)
    tdc = tdc_angles(crank_angles, bank)
    events = np.arange(cylinders)
    if strokes == 2 and arrangement == "opposed":
        events = events // 2 * 2
    interval = (720.0 if strokes == 4 else 360.0) / cylinders
    even = np.sort(np.round(interval * events, 9) % 360.0)
    assert np.sort((tdc - tdc[0]) % 360.0) == pytest.approx(even, abs=1e-9)


def test_layout_conventions():
    # The documented conventions (common practice, from memory): inline banks upright;
    # vee banks at -vee/2, +vee/2 with both cylinders of a pair on one throw; opposed
    # banks at -90, +90 degrees with each pair's throws 180 degrees apart.
    crank_angles, bank = standard_crank_angles(6, 4, "inline")
    assert np.degrees(crank_angles) == pytest.approx([0, 120, 240, 240, 120, 0])
    assert np.all(bank == 0)
    crank_angles, bank = standard_crank_angles(2, 4, "vee", 90 * DEG)
    assert crank_angles[0] == crank_angles[1]
    assert np.degrees(bank) == pytest.approx([-45, 45])
    crank_angles, bank = standard_crank_angles(6, 4, "opposed")
    assert np.degrees(bank) == pytest.approx([-90, 90] * 3)
    gaps = (np.degrees(crank_angles[1::2] - crank_angles[0::2])) % 360.0
    assert gaps == pytest.approx([180.0] * 3)


# --------------------------------------------------------------------------- bad input

GOOD = dict(crank_radius=0.05, rod_length=0.2, reciprocating_mass=1.0, rotating_mass=0.5,
            cylinder_x=[0.0, 0.1, 0.2], crank_angles=[0.0, 2.0, 4.0], bank_angles=[0.0] * 3)


@pytest.mark.parametrize(
    ("change", "message"),
    [
        (dict(rod_length=0.05, crank_radius=0.06),
         "connecting rod length must be longer than the crank radius, got rod length 0.05 m "
         "and crank radius 0.06 m"),
        (dict(rod_length=0.05),
         "connecting rod length must be longer than the crank radius, got rod length 0.05 m "
         "and crank radius 0.05 m"),
        (dict(crank_radius=0.0), "crank radius must be positive, got 0"),
        (dict(crank_radius=np.inf), "crank radius must be a finite number, got inf"),
        (dict(reciprocating_mass=-1.0), "reciprocating mass must be at least 0, got -1"),
        (dict(rotating_mass=[0.1, -0.2, 0.1]), "rotating mass must be at least 0, got -0.2"),
        (dict(rotating_mass=[0.1, 0.2]),
         "rotating mass must be one value or one value per cylinder (3), got 2"),
        (dict(crank_angles=[0.0, 1.0]),
         "crank angles must have one value per cylinder (3 cylinder positions), got 2"),
        (dict(bank_angles=[0.0] * 4),
         "bank angles must have one value per cylinder (3 cylinder positions), got 4"),
        (dict(cylinder_x=[0.0, np.nan, 0.2]), "cylinder positions must be finite numbers, got nan"),
        (dict(crank_angles=[0.0, np.inf, 1.0]), "crank angles must be finite numbers, got inf"),
        (dict(orders=(1, 1.5)), "orders must be whole numbers of at least 1, got 1.5"),
        (dict(orders=(0, 2)), "orders must be whole numbers of at least 1, got 0"),
        (dict(reference_x=np.nan), "reference position must be a finite number, got nan m"),
    ],
)
def test_bad_free_load_input(change, message):
    with pytest.raises(ValueError, match=exactly(message)):
        crank_free_loads(**{**GOOD, **change})


@pytest.mark.parametrize(
    ("args", "message"),
    [
        ((4, 4, "radial"), "arrangement must be 'inline', 'vee' or 'opposed', got 'radial'"),
        ((4, 4, "vee"), "a vee arrangement needs a vee angle"),
        ((4, 4, "vee", 200 * DEG), "vee angle must be between 0 and 180 degrees, got 200"),
        ((4, 4, "vee", 0.0), "vee angle must be between 0 and 180 degrees, got 0"),
        ((5, 4, "vee", 1.0), "a vee arrangement needs an even number of cylinders, got 5"),
        ((3, 2, "opposed"), "an opposed arrangement needs an even number of cylinders, got 3"),
        ((7, 4, "inline"),
         "no standard crank angles for 7 cylinders inline; covered counts are 1, 2, 3, 4, 5, 6, 8"),
        ((14, 4, "vee", 1.0),
         "no standard crank angles for 14 cylinders vee; covered counts are 2, 4, 6, 8, 10, 12, 16"),
        ((8, 4, "opposed"),
         "no standard crank angles for 8 cylinders opposed; covered counts are 2, 4, 6"),
        ((4, 3, "inline"), "strokes must be 2 or 4, got 3"),
        ((0, 4, "inline"), "cylinders must be a positive whole number, got 0"),
        ((2.5, 4, "inline"), "cylinders must be a positive whole number, got 2.5"),
    ],
)
def test_bad_layout_input(args, message):
    with pytest.raises(ValueError, match=exactly(message)):
        standard_crank_angles(*args)


@pytest.mark.parametrize(
    ("ratio", "orders", "message"),
    [
        (1.0, (1, 2), "crank ratio must be at least 0 and below 1, got 1"),
        (-0.1, (1, 2), "crank ratio must be at least 0 and below 1, got -0.1"),
        (0.3, (2, 2.5), "orders must be whole numbers of at least 1, got 2.5"),
        (0.3, (), "orders must be a list of whole numbers of at least 1, got none"),
    ],
)
def test_bad_harmonic_input(ratio, orders, message):
    with pytest.raises(ValueError, match=exactly(message)):
        slider_crank_harmonics(ratio, orders)


def test_docstring_examples_run():
    failed, attempted = doctest.testmod(crank)
    assert attempted >= 5
    assert failed == 0


def test_series_log_gamma_is_that_of_np_vectorize_bit_for_bit():
    # The series' lgamma of an array is math.lgamma element by element, as
    # np.vectorize(math.lgamma) gave it before (the same function on the same floats),
    # on the arguments the series uses (2n + 1, n + 1, n - j + 1, n + j + 1) and others;
    # lgamma(n + 1) is also log(n!) (exact factorials from math.factorial, round-off).
    import math

    from vcheck.dynamics.forcing import crank

    vectorized = np.vectorize(math.lgamma, otypes=[float])
    rng = np.random.default_rng(20261203)
    for _ in range(50):
        j = int(rng.integers(1, 6))
        n = np.arange(j, j + int(rng.integers(1, 400)), dtype=float)
        for values in (2.0 * n + 1.0, n + 1.0, n - j + 1.0, n + j + 1.0, n * 0.37 + 0.5):
            got = crank._log_gamma(values)
            assert got.dtype == np.float64 and got.shape == values.shape
            assert got.tobytes() == vectorized(values).tobytes()
    for k in (1, 5, 20, 150):
        assert crank._log_gamma(np.array([k + 1.0]))[0] == pytest.approx(
            math.log(math.factorial(k)), rel=1e-13)

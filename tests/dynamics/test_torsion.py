"""Torsional trains against outside references: closed forms, Holzer's method, a
continuous shaft, a numerical integral and the constraint form of a geared system."""

from __future__ import annotations

import math

import numpy as np
import pytest

from vcheck.dynamics.torsion.interference import band_separation, link_stiffness_for_frequency
from vcheck.dynamics.torsion.modes import (
    GROUND,
    torsional_frequencies,
    torsional_frequencies_varied,
    torsional_modes,
)
from vcheck.dynamics.torsion.orders import (
    compressor_torque_orders,
    drive_torque_pulsations,
    engine_torque_orders,
)
from vcheck.dynamics.torsion.stiffness import (
    polar_moment_of_area,
    refer_to_shaft,
    shaft_torsional_stiffness,
)

# ---------------------------------------------------------------- closed forms


def test_two_inertia_free_train_closed_form():
    # Closed form of the free two-disc rotor, f = (1/2pi) sqrt(k (J1 + J2) / (J1 J2))
    # (W. T. Thomson, Theory of Vibration with Applications, two-disc torsional system;
    # from memory, and derived from the equations of motion). Tolerance: round-off.
    j1, j2, k = 3.0, 7.5, 2.4e5
    found = torsional_modes([j1, j2], [(0, 1, k)])
    assert found.rigid_body_modes == 1
    assert found.frequencies.size == 1
    expected = math.sqrt(k * (j1 + j2) / (j1 * j2)) / (2 * math.pi)
    assert found.frequencies[0] == pytest.approx(expected, rel=1e-12)
    # the node divides the shaft so that the amplitudes are in the ratio -J2 / J1
    shape = found.shapes[:, 0]
    assert shape[1] / shape[0] == pytest.approx(-j1 / j2, rel=1e-10)
    assert found.energy_shares[0, 0] == pytest.approx(1.0)


def test_three_inertia_chain_closed_form():
    # Free chain J1 -k1- J2 -k2- J3: the frequency equation (derived from the 3x3
    # determinant; Thomson, three-disc torsional system, from memory) is quadratic in
    # w^2:  J1 J2 J3 w^4 - [k1 J3 (J1 + J2) + k2 J1 (J2 + J3)] w^2 + k1 k2 (J1+J2+J3) = 0
    j1, j2, j3, k1, k2 = 2.0, 5.0, 6.0, 4.0e6, 7.0e5
    a = j1 * j2 * j3
    b = -(k1 * j3 * (j1 + j2) + k2 * j1 * (j2 + j3))
    c = k1 * k2 * (j1 + j2 + j3)
    roots = np.sort(np.roots([a, b, c]))
    expected = np.sqrt(roots) / (2 * math.pi)
    found = torsional_modes([j1, j2, j3], [(0, 1, k1), (1, 2, k2)])
    np.testing.assert_allclose(found.frequencies, expected, rtol=1e-10)


def test_grounded_chains_closed_form():
    # One disc on a shaft fixed at the far end: f = sqrt(k / J) / (2 pi) (closed form).
    one = torsional_modes([2.0], [(0, GROUND, 8.0e4)])
    assert one.rigid_body_modes == 0
    assert one.frequencies[0] == pytest.approx(math.sqrt(4.0e4) / (2 * math.pi), rel=1e-12)
    # ground-k-J-k-J: w = 0.618034 and 1.618034 sqrt(k/J); k = 1000, J = 1 gives 3.1105 Hz
    # and 8.1434 Hz (the two-DOF chain of REFERENCES.md, [D]: the same equations as the
    # translational chain). Tolerance: the 5 digits printed.
    two = torsional_modes([1.0, 1.0], [(GROUND, 0, 1000.0), (0, 1, 1000.0)])
    np.testing.assert_allclose(two.frequencies, [3.1105, 8.1434], rtol=2e-5)


# ---------------------------------------------------------------- Holzer's method


def _holzer_residual(omega: float, inertias, stiffnesses) -> float:
    """Torque left at the free far end of a free-free chain (Holzer's tabulation: unit
    twist at disc 1, each disc adds J w^2 theta to the torque, each shaft takes
    torque / k from the twist). H. Holzer, Die Berechnung der Drehschwingungen,
    Springer, 1921 (method as given in vibration texts; from memory)."""
    theta, torque = 1.0, 0.0
    for i, j in enumerate(inertias):
        torque += j * omega**2 * theta
        if i < len(stiffnesses):
            theta -= torque / stiffnesses[i]
    return torque


def test_eigen_solution_against_holzer_residual_torque():
    inertias = [3.0, 5.0, 0.8, 6.0, 1.2]
    stiff = [1.2e7, 7.0e5, 2.0e6, 4.0e5]
    found = torsional_modes(inertias, [(i, i + 1, k) for i, k in enumerate(stiff)])
    # Holzer: scan the residual for sign changes and bisect each (independent of the
    # eigen solver)
    omegas = np.linspace(1.0, 2 * math.pi * 3000, 60001)
    residual = np.array([_holzer_residual(w, inertias, stiff) for w in omegas])
    roots = []
    for lo, hi, rl, rh in zip(omegas[:-1], omegas[1:], residual[:-1], residual[1:]):
        if rl * rh < 0:
            for _ in range(200):
                mid = 0.5 * (lo + hi)
                if _holzer_residual(lo, inertias, stiff) * _holzer_residual(mid, inertias,
                                                                           stiff) <= 0:
                    hi = mid
                else:
                    lo = mid
            roots.append(0.5 * (lo + hi) / (2 * math.pi))
    assert len(roots) == 4
    np.testing.assert_allclose(found.frequencies, roots, rtol=1e-9)


# ------------------------------------------------------------- continuous shaft


def test_fine_lumped_shaft_against_uniform_free_free_shaft():
    # Uniform free-free shaft: f_n = n c / (2 L), c = sqrt(G / rho) (wave equation for
    # torsion of a circular shaft; Thomson, torsional vibration of rods, from memory).
    # Steel G = 80 GPa, rho = 7850 kg/m^3, L = 2 m, D = 100 mm, lumped into 400 elements
    # (half discs at the ends). Lumping error ~ (n pi / N)^2 / 24: 1.1e-5 for n = 2, so
    # 1e-4 covers it.
    g, rho, length, d, n = 80e9, 7850.0, 2.0, 0.1, 400
    polar = math.pi * d**4 / 32
    inertia = rho * polar * length / n
    inertias = np.full(n + 1, inertia)
    inertias[[0, -1]] *= 0.5
    k = float(shaft_torsional_stiffness(d, length / n, g))
    found = torsional_modes(inertias, [(i, i + 1, k) for i in range(n)])
    c = math.sqrt(g / rho)
    np.testing.assert_allclose(found.frequencies[:2], [c / (2 * length), c / length],
                               rtol=1e-4)


# --------------------------------------------------------------------- stiffness


def test_hollow_shaft_stiffness_against_handbook_and_integral():
    # Roark's Formulas for Stress and Strain, 7th ed., table 10.1 (hollow circular
    # section, K = pi (D^4 - d^4) / 32; from memory), and independently the polar moment
    # as the integral of r^2 dA over the annulus (scipy quad).
    from scipy.integrate import quad

    outer, inner, length, g = 0.100, 0.060, 1.2, 79.3e9
    integral, _ = quad(lambda r: r**2 * 2 * math.pi * r, inner / 2, outer / 2)
    assert float(polar_moment_of_area(outer, inner)) == pytest.approx(integral, rel=1e-12)
    handbook = g * math.pi * (outer**4 - inner**4) / (32 * length)
    assert float(shaft_torsional_stiffness(outer, length, g, inner)) == pytest.approx(
        handbook, rel=1e-14)
    # solid: 100 mm, 1 m, 80 GPa -> 785.4 kN*m/rad (derived from the same formula)
    assert float(shaft_torsional_stiffness(0.1, 1.0, 80e9)) == pytest.approx(785398.16, rel=1e-8)


@pytest.mark.parametrize(("args", "message"), [
    ((0.0, 1.0, 80e9), "shaft diameter must be positive, got 0 m"),
    ((0.1, -1.0, 80e9), "shaft length must be positive, got -1 m"),
    ((0.1, 1.0, 80e9, 0.1), "shaft bore must be from 0 up to the outside diameter, got 0.1 m"),
])
def test_stiffness_refuses_bad_geometry(args, message):
    with pytest.raises(ValueError) as caught:
        shaft_torsional_stiffness(*args)
    assert str(caught.value) == message


def test_modes_refuse_bad_inertia():
    with pytest.raises(ValueError) as caught:
        torsional_modes([1.0, 0.0], [(0, 1, 10.0)])
    assert str(caught.value) == "disc inertia must be positive, got 0 kg m^2"


# -------------------------------------------------------------------------- gears


def test_geared_train_equals_its_referred_single_shaft_system():
    # Motor J_m on a coupling k_c to a pinion J_p; wheel J_w (n = z_w / z_p = 3, the pump
    # shaft turns 1/3 as fast) on a pump shaft k_s to an impeller J_i. In physical
    # coordinates with the rigid mesh as a constraint theta_w = -theta_p / n, eliminate
    # theta_w by T (common practice: the constraint form; it is what the squared speed
    # ratio of the referral encodes).
    jm, jp, jw, ji, kc, ks, n = 0.5, 0.01, 0.09, 4.5, 3.0e4, 2.0e5, 3.0
    k_full = np.zeros((4, 4))
    m_full = np.diag([jm, jp, jw, ji])
    for a, b, k in ((0, 1, kc), (2, 3, ks)):
        k_full[[a, b], [a, b]] += k
        k_full[a, b] -= k
        k_full[b, a] -= k
    t = np.array([[1, 0, 0], [0, 1, 0], [0, -1 / n, 0], [0, 0, 1]], dtype=float)
    from scipy.linalg import eigh

    w2 = eigh(t.T @ k_full @ t, t.T @ m_full @ t, eigvals_only=True)
    constraint = np.sqrt(np.clip(w2[1:], 0, None)) / (2 * math.pi)
    # referred to the pump shaft (ratio of the motor shaft n): J' = J n^2, k' = k n^2
    r = refer_to_shaft
    inertias = [float(r(jm, n)), float(r(jp, n)) + jw, ji]
    found = torsional_modes(inertias, [(0, 1, float(r(kc, n))), (1, 2, ks)])
    np.testing.assert_allclose(found.frequencies, constraint, rtol=1e-9)


def test_design_referral_matches_hand_referral():
    from support import REPO

    from vcheck.design.loader import design_from_document, parse_toml_text
    from vcheck.design.shaft_trains import refer_train

    path = REPO / "tests/rules/cases/torsional-separation/geared-drive-fed-pump-near-pulsation-fails.toml"
    text = path.read_text().split("[case]")[0]
    design = design_from_document(parse_toml_text(text, "case.toml"))
    referred = refer_train(design.shaft_train[0])
    # pump shaft is the reference; the motor shaft turns 60 / 20 = 3 times as fast
    assert referred.ratios == {"pump shaft": 1.0, "motor shaft": 3.0}
    np.testing.assert_allclose(referred.inertias, [0.5 * 9, 0.01 * 9 + 0.09, 4.5])
    assert referred.discs == ("motor rotor", "pinion + wheel", "impeller")
    k_shaft = 80e9 * math.pi * 0.08**4 / 32 / 0.6
    np.testing.assert_allclose([row[3] for row in referred.links], [3.0e4 * 9, k_shaft])


# ------------------------------------------------------------ stiffness to clear


def test_stiffness_for_a_target_frequency_inverts_the_closed_form():
    # two discs: k = w^2 J1 J2 / (J1 + J2) (the closed form above, inverted)
    j1, j2 = 8.0, 6.0
    target = 40.0
    k = link_stiffness_for_frequency([j1, j2], [(0, 1, 1.0e5)], 0, 0, target)
    expected = (2 * math.pi * target) ** 2 * j1 * j2 / (j1 + j2)
    assert k == pytest.approx(expected, rel=1e-8)
    # a mode bounded by the rest of the train cannot be moved past its bound: the second
    # mode of a three-disc chain as k2 grows tends to that of J1 on k1 against (J2 + J3)
    assert link_stiffness_for_frequency([1.0, 1.0, 1.0], [(0, 1, 1e4), (1, 2, 1e4)], 1, 1,
                                        1e4) is None


def test_band_separation():
    # the definition of separation used by API 684 (from memory): gap / excitation
    assert band_separation(90.0, 90.0, 100.0, 120.0) == (pytest.approx(0.1), "below")
    assert band_separation(132.0, 140.0, 100.0, 120.0) == (pytest.approx(0.1), "above")
    assert band_separation(95.0, 105.0, 100.0, 120.0) == (0.0, "inside")


# ------------------------------------------------------------------------ orders


def test_engine_orders_major_and_minor():
    # four-stroke: firing frequency = cylinders x rpm / 120 (REFERENCES.md, common
    # practice): six cylinders at 1500 rpm fire at 75 Hz, order 3 of 25 Hz
    found = engine_torque_orders(6, 4, 12)
    np.testing.assert_array_equal(found.major, [3, 6, 9, 12])
    assert 0.5 in found.minor and 1.5 in found.minor and 3.0 not in found.minor
    assert found.minor.size + found.major.size == 24  # every half order up to 12
    # two-stroke: cylinders x rpm / 60 -> order = cylinders
    two = engine_torque_orders(4, 2, 12)
    np.testing.assert_array_equal(two.major, [4, 8, 12])
    np.testing.assert_array_equal(two.minor, [1, 2, 3, 5, 6, 7, 9, 10, 11])


def test_compressor_orders():
    # a single-acting compressor cylinder pulses once a revolution (common practice)
    found = compressor_torque_orders(2, False, 6)
    np.testing.assert_array_equal(found.major, [2, 4, 6])
    np.testing.assert_array_equal(found.minor, [1, 3, 5])
    np.testing.assert_array_equal(compressor_torque_orders(2, True, 8).major, [4, 8])


def test_drive_torque_pulsations():
    # output frequency p N / 2 (IEC 60034-1 synchronous speed, from memory): 4 poles at
    # 1500 rpm = 50 Hz output; 6x and 12x = 300 and 600 Hz
    np.testing.assert_allclose(drive_torque_pulsations(4, 25.0), [300.0, 600.0])


def test_equal_three_disc_chain_limiting_case():
    # Three equal discs on two equal shafts, free: w^2 = k/J and 3 k/J (the quadratic of
    # the three-disc closed form above with J1 = J2 = J3, k1 = k2; derived)
    found = torsional_modes([1.0, 1.0, 1.0], [(0, 1, 1.0), (1, 2, 1.0)])
    np.testing.assert_allclose(found.frequencies * 2 * math.pi, [1.0, math.sqrt(3.0)],
                               rtol=1e-12)
    # the first mode has its node at the middle disc, which does not move
    assert abs(found.shapes[1, 0]) < 1e-9


BRANCHED = """format = 1

[machine]
tag = "B-1"
kind = "compressor"
mass = "900 kg"
speed = "3000 rpm"

[[shaft-train]]
name = "branched"

[[shaft-train.shaft]]
name = "input"

[[shaft-train.shaft]]
name = "first output"

[[shaft-train.shaft]]
name = "second output"

[[shaft-train.disc]]
name = "motor"
shaft = "input"
inertia = "2.0 kg*m^2"

[[shaft-train.disc]]
name = "bull gear"
shaft = "input"
inertia = "0.8 kg*m^2"

[[shaft-train.disc]]
name = "pinion 1"
shaft = "first output"
inertia = "0.01 kg*m^2"

[[shaft-train.disc]]
name = "impeller 1"
shaft = "first output"
inertia = "0.05 kg*m^2"

[[shaft-train.disc]]
name = "pinion 2"
shaft = "second output"
inertia = "0.008 kg*m^2"

[[shaft-train.disc]]
name = "impeller 2"
shaft = "second output"
inertia = "0.03 kg*m^2"

[[shaft-train.link]]
between = ["motor", "bull gear"]
kind = "coupling"
stiffness = "150 kN*m/rad"

[[shaft-train.link]]
between = ["pinion 1", "impeller 1"]
stiffness = "20 kN*m/rad"

[[shaft-train.link]]
between = ["pinion 2", "impeller 2"]
stiffness = "12 kN*m/rad"

[[shaft-train.gear]]
between = ["bull gear", "pinion 1"]
teeth = [120, 30]

[[shaft-train.gear]]
between = ["bull gear", "pinion 2"]
teeth = [120, 24]
"""


def test_branched_geared_train_against_the_constraint_form():
    # A bull gear driving two pinions (a branched train): the design's referral against
    # the physical equations with both rigid meshes as constraints, theta_p1 = -4
    # theta_bull and theta_p2 = -5 theta_bull, eliminated by T (common practice: the
    # constraint form, independent of the squared-ratio code).
    from scipy.linalg import eigh

    from vcheck.design.loader import design_from_document, parse_toml_text
    from vcheck.design.shaft_trains import refer_train, train_problems

    design = design_from_document(parse_toml_text(BRANCHED, "b.toml"))
    train = design.shaft_train[0]
    assert train_problems(train, ("shaft-train", 0), design.machine) == []
    referred = refer_train(train)
    assert referred.ratios == {"input": 1.0, "first output": 4.0, "second output": 5.0}
    found = torsional_modes(referred.inertias, [(a, b, k) for a, b, _, k, _ in referred.links])
    # physical: motor, bull, pinion 1, impeller 1, pinion 2, impeller 2
    j = np.diag([2.0, 0.8, 0.01, 0.05, 0.008, 0.03])
    k = np.zeros((6, 6))
    for a, b, s in ((0, 1, 150e3), (2, 3, 20e3), (4, 5, 12e3)):
        k[[a, b], [a, b]] += s
        k[a, b] -= s
        k[b, a] -= s
    # generalised coordinates: motor, bull, impeller 1, impeller 2
    t = np.zeros((6, 4))
    t[0, 0] = t[1, 1] = t[3, 2] = t[5, 3] = 1.0
    t[2, 1], t[4, 1] = -4.0, -5.0
    w2 = eigh(t.T @ k @ t, t.T @ j @ t, eigvals_only=True)
    expected = np.sqrt(w2[1:]) / (2 * math.pi)
    np.testing.assert_allclose(found.frequencies, expected, rtol=1e-9)
    assert found.rigid_body_modes == 1


# ---------------------------------------------------------------- stacked trials


def test_varied_link_frequencies_against_closed_form_and_single_solves():
    # The stacked solve for many trial stiffnesses of one link: each row against the
    # two-disc closed form f = (1/2pi) sqrt(k (J1 + J2) / (J1 J2)) (W. T. Thomson, Theory
    # of Vibration with Applications, two-disc torsional system; from memory, and derived
    # from the equations of motion; tolerance: round-off), and, for a grounded branched
    # train, each row equal to the one-at-a-time solve exactly (the same sums in the same
    # order: the coupling-stiffness advice relies on that to keep reports unchanged).
    j1, j2 = 2.0, 0.5
    trials = np.logspace(3, 7, 41)
    found = torsional_frequencies_varied([j1, j2], [(0, 1, 1e5)], 0, trials)
    closed = np.sqrt(trials * (j1 + j2) / (j1 * j2)) / (2 * math.pi)
    np.testing.assert_allclose(found[:, 0], closed, rtol=1e-12)

    inertias = [3.0, 0.2, 1.5, 0.05, 0.8]
    links = [(GROUND, 0, 4e6), (0, 1, 2.5e5), (1, 2, 7e4), (1, 3, 1.2e4), (3, 4, 9e5)]
    trials = 2.5e5 * np.logspace(-2, 2, 97)
    found = torsional_frequencies_varied(inertias, links, 1, trials)
    for row, k in zip(found, trials):
        trial = list(links)
        trial[1] = (0, 1, k)
        assert np.array_equal(row, torsional_frequencies(inertias, trial))


@pytest.mark.parametrize(("index", "trials", "message"), [
    (0, [1e4, 0.0], "link stiffness must be positive, got 0 N m/rad"),
    (3, [1e4], "link 3 is not in the train (links 0 to 0)"),
])
def test_varied_link_frequencies_refuse_bad_trials(index, trials, message):
    with pytest.raises(ValueError) as caught:
        torsional_frequencies_varied([1.0, 1.0], [(0, 1, 1e5)], index, trials)
    assert str(caught.value) == message

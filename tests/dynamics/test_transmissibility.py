"""Checks of vcheck.dynamics.isolation.transmissibility against outside references.

Each test names its reference beside the check and says why its tolerance is what it is.
Tags follow shared/REFERENCES.md: [D] derived by exact arithmetic from the published
formula, [C] seen in a published source, [M] from memory.
"""

from __future__ import annotations

import doctest
import re

import numpy as np
import pytest
from scipy import integrate, optimize, signal

from vcheck.dynamics.isolation import transmissibility as tr
from vcheck.dynamics.isolation.transmissibility import (
    STANDARD_GRAVITY,
    frequency_ratio,
    frequency_ratio_for_efficiency,
    frequency_ratio_for_efficiency_hysteretic,
    inertia_base_mass,
    isolation_efficiency,
    natural_frequency_from_static_deflection,
    relative_transmissibility_hysteretic,
    relative_transmissibility_viscous,
    resonance_peak_viscous,
    static_deflection_for_efficiency,
    static_deflection_from_natural_frequency,
    transmissibility_hysteretic,
    transmissibility_hysteretic_phase,
    transmissibility_viscous,
    transmissibility_viscous_phase,
)


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


# --------------------------------------------------------------------------------------
# Closed-form values of the viscous SDOF transmissibility
# T = sqrt((1 + (2 zeta r)^2) / ((1 - r^2)^2 + (2 zeta r)^2)).
# Source: shared/REFERENCES.md, "Transmissibility and isolation" [D]; the formula as in
# Thomson & Dahleh, Theory of Vibration with Applications, 5th ed., ch. 3 (from memory).
# Each value is printed to 5 significant figures, so the tolerance is half a unit in the
# last printed digit.
REFERENCES_TRANSMISSIBILITY = [
    # r, zeta, T, half unit of the last printed digit
    (3.0, 0.0, 0.12500, 5e-6),
    (3.0, 0.05, 0.13041, 5e-6),
    (3.0, 0.10, 0.14537, 5e-6),
    (2.0, 0.05, 0.33918, 5e-6),
    (4.0, 0.05, 0.07178, 5e-6),
    (1.0, 0.05, 10.050, 5e-4),
    (1.0, 0.10, 5.0990, 5e-5),
]


@pytest.mark.parametrize(("r", "zeta", "expected", "half_unit"), REFERENCES_TRANSMISSIBILITY)
def test_viscous_transmissibility_matches_reference_values(r, zeta, expected, half_unit):
    # shared/REFERENCES.md [D], rounded to the printed digits.
    assert transmissibility_viscous(r, zeta) == pytest.approx(expected, abs=half_unit)


@pytest.mark.parametrize("zeta", [0.0, 0.005, 0.05, 0.1, 0.3, 0.7, 0.99])
def test_crossover_at_root_two_for_every_damping_ratio(zeta):
    # Closed form: at r^2 = 2 numerator and denominator are both 1 + 8 zeta^2
    # (Thomson & Dahleh, ch. 3, from memory; shared/REFERENCES.md [D]).
    # Tolerance: a few ulps of floating-point rounding in r^2 = 2.
    assert transmissibility_viscous(np.sqrt(2.0), zeta) == pytest.approx(1.0, abs=1e-14)
    assert transmissibility_hysteretic(np.sqrt(2.0), 2.0 * zeta) == pytest.approx(
        1.0, abs=1e-14
    )


def test_undamped_limit_is_one_over_r_squared_minus_one():
    # Analytic limiting case zeta = 0: T = 1 / |1 - r^2| (Thomson & Dahleh, ch. 3, from
    # memory). Tolerance: floating-point rounding only.
    r = np.array([0.0, 0.5, 2.0, 3.0, 10.0])
    assert transmissibility_viscous(r, 0.0) == pytest.approx(1.0 / np.abs(1.0 - r**2), rel=1e-14)
    assert transmissibility_viscous(1.0, 0.0) == np.inf


# --------------------------------------------------------------------------------------
# Independent numerical methods


@pytest.mark.parametrize("zeta", [0.0, 0.01, 0.05, 0.2, 0.6])
def test_against_scipy_signal_freqs(zeta):
    # Independent method: scipy.signal.freqs evaluates the Laplace transfer function
    # (2 zeta wn s + wn^2) / (s^2 + 2 zeta wn s + wn^2) of the mass-spring-dashpot
    # (force transmitted / force, or mass / base motion) on the imaginary axis.
    # Relative displacement across the isolator: s^2 / (s^2 + 2 zeta wn s + wn^2).
    # Tolerance 1e-11: both sides are double-precision evaluations of the same rational
    # function, in different algebraic forms; r = 1 is avoided for zeta = 0.
    wn = 2.0 * np.pi * 7.3
    r = np.concatenate([np.linspace(0.0, 0.95, 40), np.linspace(1.05, 12.0, 60)])
    denominator = [1.0, 2.0 * zeta * wn, wn**2]
    _, h = signal.freqs([2.0 * zeta * wn, wn**2], denominator, worN=r * wn)
    assert transmissibility_viscous(r, zeta) == pytest.approx(np.abs(h), rel=1e-11)
    assert transmissibility_viscous_phase(r, zeta) == pytest.approx(np.angle(h), abs=1e-11)
    _, h_rel = signal.freqs([1.0, 0.0, 0.0], denominator, worN=r * wn)
    assert relative_transmissibility_viscous(r, zeta) == pytest.approx(np.abs(h_rel), rel=1e-11)


def _steady_state_amplitude(t, x, omega):
    """Amplitude and phase of x(t) ~ a sin(omega t) + b cos(omega t) + c, least squares."""
    basis = np.column_stack([np.sin(omega * t), np.cos(omega * t), np.ones_like(t)])
    (a, b, _), *_ = np.linalg.lstsq(basis, x, rcond=None)
    return np.hypot(a, b), np.arctan2(b, a)


def test_against_time_integration_to_steady_state():
    # Independent method: integrate the equations of motion from rest with
    # scipy.integrate.solve_ivp (DOP853, rtol 1e-10) until the start-up transient has
    # decayed, then fit the steady harmonic over the last five forcing periods.
    #   base motion:  m x'' + c (x' - y') + k (x - y) = 0,  y = sin(omega t)
    #   force:        m x'' + c x' + k x = sin(omega t),   F_T = c x' + k x
    # r = 3, zeta = 0.05: shared/REFERENCES.md gives 0.130412 from the same two methods.
    # Settling: 25 / (zeta wn) leaves exp(-25) ~ 1e-11 of the transient. Tolerance 1e-7
    # relative: integrator error (rtol 1e-10 over ~240 periods) plus that residue, with
    # margin; the REFERENCES value is printed to 6 digits (half unit 5e-7).
    zeta, fn, r = 0.05, 1.0, 3.0
    wn = 2.0 * np.pi * fn
    omega = r * wn

    def rhs(t, state):
        xb, vb, xf, vf = state
        y, dy = np.sin(omega * t), omega * np.cos(omega * t)
        ab = -2.0 * zeta * wn * (vb - dy) - wn**2 * (xb - y)
        af = np.sin(omega * t) - 2.0 * zeta * wn * vf - wn**2 * xf
        return [vb, ab, vf, af]

    t_end = 25.0 / (zeta * wn)
    t_fit = np.linspace(t_end - 5.0 * 2.0 * np.pi / omega, t_end, 400)
    solution = integrate.solve_ivp(
        rhs, (0.0, t_end), [0.0, 0.0, 0.0, 0.0], method="DOP853",
        rtol=1e-10, atol=1e-13, t_eval=t_fit,
    )
    assert solution.success
    xb, _, xf, vf = solution.y
    base_amplitude, base_phase = _steady_state_amplitude(t_fit, xb, omega)
    stroke_amplitude, _ = _steady_state_amplitude(t_fit, xb - np.sin(omega * t_fit), omega)
    # F_T / m = 2 zeta wn x' + wn^2 x for a unit force per unit mass
    force_amplitude, force_phase = _steady_state_amplitude(
        t_fit, 2.0 * zeta * wn * vf + wn**2 * xf, omega
    )

    expected = transmissibility_viscous(r, zeta)
    assert base_amplitude == pytest.approx(expected, rel=1e-7)
    assert force_amplitude == pytest.approx(expected, rel=1e-7)
    assert expected == pytest.approx(0.130412, abs=5e-7)
    assert base_phase == pytest.approx(transmissibility_viscous_phase(r, zeta), abs=1e-6)
    assert force_phase == pytest.approx(transmissibility_viscous_phase(r, zeta), abs=1e-6)
    assert stroke_amplitude == pytest.approx(relative_transmissibility_viscous(r, zeta), rel=1e-7)


# --------------------------------------------------------------------------------------
# Hysteretic (structural) damping


@pytest.mark.parametrize("eta", [0.0, 0.02, 0.1, 0.3, 1.0])
def test_hysteretic_against_complex_transfer_function(eta):
    # Closed form of the complex-stiffness model k (1 + i eta): H = (1 + i eta) /
    # (1 - r^2 + i eta) (Crede & Ruzicka, "Theory of vibration isolation", Harris' Shock
    # and Vibration Handbook, from memory). The implementation uses real square roots
    # and arctangents; here numpy complex arithmetic builds H directly.
    # Tolerance: floating-point rounding only.
    r = np.concatenate([np.linspace(0.0, 0.9, 30), np.linspace(1.1, 20.0, 70)])
    h = (1.0 + 1j * eta) / (1.0 - r**2 + 1j * eta)
    assert transmissibility_hysteretic(r, eta) == pytest.approx(np.abs(h), rel=1e-12)
    assert transmissibility_hysteretic_phase(r, eta) == pytest.approx(np.angle(h), abs=1e-12)
    h_rel = h - 1.0  # Z / Y = X / Y - 1
    assert relative_transmissibility_hysteretic(r, eta) == pytest.approx(
        np.abs(h_rel), rel=1e-12
    )


def test_hysteretic_equals_viscous_with_frequency_dependent_damping_ratio():
    # At one frequency, c = eta k / omega makes the dashpot force equal to the imaginary
    # part of the complex stiffness, i.e. zeta_equivalent = eta / (2 r) (Thomson & Dahleh,
    # structural damping, from memory). At resonance this is the eta = 2 zeta rule.
    # Tolerance: floating-point rounding only.
    eta = 0.15
    r = np.linspace(0.2, 8.0, 50)
    assert transmissibility_hysteretic(r, eta) == pytest.approx(
        transmissibility_viscous(r, eta / (2.0 * r)), rel=1e-12
    )
    assert transmissibility_hysteretic_phase(r, eta) == pytest.approx(
        transmissibility_viscous_phase(r, eta / (2.0 * r)), abs=1e-12
    )


def test_hysteretic_high_frequency_roll_off():
    # Limiting case r -> infinity: T ~ sqrt(1 + eta^2) / r^2 for hysteretic damping, but
    # T ~ 2 zeta / r for viscous damping (Crede & Ruzicka, from memory).
    # Tolerance: the next relative term of the expansion is 1 / r^2 for the hysteretic
    # form (1e-6 at r = 1e3) and 1 / (8 zeta^2 r^2) + 1 / r^2 for the viscous one
    # (1.3e-7 at r = 1e4, zeta = 0.1); the limits allow about twice that.
    r = 1.0e3
    assert transmissibility_hysteretic(r, 0.1) == pytest.approx(np.sqrt(1.01) / r**2, rel=2e-6)
    r = 1.0e4
    assert transmissibility_viscous(r, 0.1) == pytest.approx(0.2 / r, rel=3e-7)


# --------------------------------------------------------------------------------------
# Resonance


def test_resonance_peak_reference_value():
    # shared/REFERENCES.md [D]: zeta = 0.05 peaks at r = 0.99752 with T = 10.0622.
    # Tolerance: half a unit in the last printed digit.
    r_peak, t_peak = resonance_peak_viscous(0.05)
    assert r_peak == pytest.approx(0.99752, abs=5e-6)
    assert t_peak == pytest.approx(10.0622, abs=5e-5)


@pytest.mark.parametrize("zeta", [0.005, 0.05, 0.2, 0.5, 0.9])
def test_resonance_peak_against_numerical_maximum(zeta):
    # Independent method: maximise T(r) numerically (scipy.optimize.minimize_scalar,
    # bounded). The maximum is flat, so r is only good to about sqrt(tolerance) of the
    # optimiser: 1e-6 on r; the peak height is insensitive to that error: 1e-9 relative.
    found = optimize.minimize_scalar(
        lambda r: -transmissibility_viscous(r, zeta), bounds=(0.0, 1.2), method="bounded",
        options={"xatol": 1e-12},
    )
    r_peak, t_peak = resonance_peak_viscous(zeta)
    assert r_peak == pytest.approx(found.x, abs=1e-6)
    assert t_peak == pytest.approx(-found.fun, rel=1e-9)
    # the textbook form sqrt(sqrt(1 + 8 zeta^2) - 1) / (2 zeta) (Crede & Ruzicka, from
    # memory); equal to the cancellation-free form used in the code up to rounding.
    assert r_peak == pytest.approx(np.sqrt(np.sqrt(1.0 + 8.0 * zeta**2) - 1.0) / (2.0 * zeta),
                                   rel=1e-12)


@pytest.mark.parametrize("zeta", [0.002, 0.005, 0.01, 0.02])
def test_peak_close_to_quality_factor_for_light_damping(zeta):
    # Q = 1 / (2 zeta) (Harris' Shock and Vibration Handbook, 6th ed., from memory;
    # shared/REFERENCES.md "Damping"). Light damping: T_peak / Q = 1 + (5/2) zeta^2 +
    # O(zeta^4) (expanding T at r_peak), so the tolerance 3 zeta^2 holds that term with
    # margin and fails if the peak is off by more.
    _, t_peak = resonance_peak_viscous(zeta)
    assert t_peak == pytest.approx(1.0 / (2.0 * zeta), rel=3.0 * zeta**2)
    assert t_peak > 1.0 / (2.0 * zeta)


def test_undamped_resonance_peak():
    # Limiting case zeta = 0: the peak is at r = 1 and unbounded.
    r_peak, t_peak = resonance_peak_viscous(0.0)
    assert r_peak == 1.0
    assert t_peak == np.inf


# --------------------------------------------------------------------------------------
# Efficiency and the frequency ratio needed for it


def test_efficiency_is_one_minus_transmissibility():
    # Definition (Thomson & Dahleh, ch. 3, from memory); shared/REFERENCES.md r = 3,
    # zeta = 0: T = 0.125 [D]. Exact in binary floating point.
    assert isolation_efficiency(transmissibility_viscous(3.0, 0.0)) == pytest.approx(0.875)
    assert isolation_efficiency(2.0) == -1.0


def test_undamped_ratio_for_ninety_percent():
    # Closed form T = 1 / (r^2 - 1): 90 % needs r = sqrt(11) = 3.3166 (Thomson & Dahleh,
    # ch. 3, from memory). Tolerance: floating-point rounding.
    assert frequency_ratio_for_efficiency(0.9) == pytest.approx(np.sqrt(11.0), rel=1e-14)
    assert frequency_ratio_for_efficiency(0.0) == pytest.approx(np.sqrt(2.0), rel=1e-15)


def _ratio_from_quadratic(efficiency, zeta):
    """Independent closed form: with s = r^2, a = 4 zeta^2 and T = 1 - E,
    T^2 ((1 - s)^2 + a s) = 1 + a s  ->  T^2 s^2 + (T^2 (a - 2) - a) s + T^2 - 1 = 0,
    whose larger root is the branch above sqrt(2)."""
    t2 = (1.0 - efficiency) ** 2
    a = 4.0 * zeta**2
    b = t2 * (a - 2.0) - a
    s = (-b + np.sqrt(b**2 - 4.0 * t2 * (t2 - 1.0))) / (2.0 * t2)
    return np.sqrt(s)


def test_damped_ratio_for_efficiency_against_quadratic_closed_form():
    # Independent method: the quadratic in r^2 above (derived from the transmissibility
    # formula of shared/REFERENCES.md) against the code's brentq root.
    # Tolerance 1e-11 relative: brentq is run to ~1e-14 in r; the quadratic loses a few
    # digits to cancellation at E near 0.
    efficiency = np.array([[0.0], [0.5], [0.8], [0.9], [0.95], [0.99], [0.999]])
    zeta = np.array([0.005, 0.05, 0.1, 0.3, 0.9])
    found = frequency_ratio_for_efficiency(efficiency, zeta)
    assert found.shape == (7, 5)
    assert found == pytest.approx(_ratio_from_quadratic(efficiency, zeta), rel=1e-11)
    # and it is a root: T at that ratio is the target
    assert transmissibility_viscous(found, zeta) == pytest.approx(
        np.broadcast_to(1.0 - efficiency, found.shape), rel=1e-11
    )


def test_damped_ratio_round_trip_at_reference_point():
    # shared/REFERENCES.md [D]: r = 3, zeta = 0.05 -> T = 0.13041, so E = 0.86959 needs
    # r = 3. Tolerance: from 5 printed digits of T, dr = dT / |dT/dr| ~ 5e-6 / 0.09.
    assert frequency_ratio_for_efficiency(1.0 - 0.13041, 0.05) == pytest.approx(3.0, abs=1e-4)


def test_damping_raises_the_ratio_needed():
    # Above sqrt(2) damping raises T (Thomson & Dahleh, ch. 3, from memory), so a
    # damped isolator needs a larger ratio for the same efficiency.
    r = frequency_ratio_for_efficiency(0.9, np.array([0.0, 0.05, 0.1, 0.2]))
    assert np.all(np.diff(r) > 0.0)


def test_hysteretic_ratio_for_efficiency_against_brentq():
    # Independent method: root of T_hysteretic(r) = 1 - E by scipy.optimize.brentq on
    # (sqrt 2, 1000); the code uses the closed form. Tolerance: brentq xtol 1e-13.
    for efficiency, eta in [(0.5, 0.1), (0.9, 0.1), (0.95, 0.3), (0.99, 1.0), (0.0, 0.2)]:
        if efficiency == 0.0:
            expected = np.sqrt(2.0)
        else:
            expected = optimize.brentq(
                lambda r: transmissibility_hysteretic(r, eta) - (1.0 - efficiency),
                np.sqrt(2.0), 1000.0, xtol=1e-13,
            )
        assert frequency_ratio_for_efficiency_hysteretic(efficiency, eta) == pytest.approx(
            expected, rel=1e-11
        )


# --------------------------------------------------------------------------------------
# Static deflection and natural frequency


def test_static_deflection_reference_point():
    # shared/REFERENCES.md [D]: delta = 0.980665 mm -> 15.9155 Hz (= sqrt(10^4) / (2 pi)
    # with g = 9.80665 m/s^2). Tolerance: half a unit in the last printed digit.
    assert natural_frequency_from_static_deflection(0.980665e-3) == pytest.approx(
        15.9155, abs=5e-5
    )


def test_static_deflection_trade_forms():
    # shared/REFERENCES.md [D]: f = 15.7609 / sqrt(delta in mm) = 3.12726 / sqrt(delta in
    # inches); the trade's rounded forms 15.76 and 3.13 [M]. Tolerance: the coefficients
    # are printed to 6 significant figures, so relative 5e-6 (3.12726: 2e-6).
    delta_mm = np.array([1.0, 6.35, 19.05, 25.0, 38.1, 88.9])
    assert natural_frequency_from_static_deflection(delta_mm / 1000.0) == pytest.approx(
        15.7609 / np.sqrt(delta_mm), rel=5e-6
    )
    delta_in = np.array([0.25, 0.75, 1.0, 1.5, 2.5, 3.5])
    assert natural_frequency_from_static_deflection(delta_in * 0.0254) == pytest.approx(
        3.12726 / np.sqrt(delta_in), rel=2e-6
    )
    # trade rounding (from memory): within the rounding of 15.76 and 3.13
    assert natural_frequency_from_static_deflection(1e-3) == pytest.approx(15.76, abs=0.005)
    assert natural_frequency_from_static_deflection(0.0254) == pytest.approx(3.13, abs=0.005)


def test_static_deflection_inverse_and_sdof_consistency():
    # delta = m g / k and f = sqrt(k / m) / (2 pi) (shared/REFERENCES.md [D]: m = 100 kg,
    # k = 1e6 N/m -> 15.9155 Hz). Tolerance: floating-point rounding.
    m, k = 100.0, 1.0e6
    delta = m * STANDARD_GRAVITY / k
    assert natural_frequency_from_static_deflection(delta) == pytest.approx(
        np.sqrt(k / m) / (2.0 * np.pi), rel=1e-14
    )
    fn = np.array([1.5, 3.0, 15.9155, 40.0])
    assert natural_frequency_from_static_deflection(
        static_deflection_from_natural_frequency(fn)
    ) == pytest.approx(fn, rel=1e-14)


def test_static_deflection_for_efficiency_gives_that_efficiency():
    # Chain of the closed forms: the returned deflection, turned back into a natural
    # frequency, must give T = 1 - E at the forcing frequency. 1480 rpm, 90 %, undamped:
    # r = sqrt(11) (Thomson & Dahleh, from memory), delta = g r^2 / (2 pi f)^2 = 4.49 mm.
    # Tolerance: floating-point rounding; brentq tolerance for the damped case.
    f = 1480.0 / 60.0
    for zeta in (0.0, 0.05):
        delta = static_deflection_for_efficiency(0.9, f, zeta)
        r = frequency_ratio(f, natural_frequency_from_static_deflection(delta))
        assert isolation_efficiency(transmissibility_viscous(r, zeta)) == pytest.approx(
            0.9, rel=1e-10
        )
    assert static_deflection_for_efficiency(0.9, f) == pytest.approx(
        STANDARD_GRAVITY * 11.0 / (2.0 * np.pi * f) ** 2, rel=1e-13
    )


def test_inertia_base_mass_for_target_frequency():
    # shared/REFERENCES.md [D]: m = 100 kg on k = 1e6 N/m has 15.9155 Hz, so a 40 kg
    # machine needs a 60 kg base for that frequency. Tolerance: the reference frequency is
    # printed to 6 digits (relative 3.1e-6); the total mass goes as 1 / f^2, so 6.3e-6 of
    # 100 kg, about 6e-4 kg.
    assert inertia_base_mass(1.0e6, 40.0, 15.9155) == pytest.approx(60.0, abs=1e-3)
    # the result really gives the target: f = sqrt(k / (m + m_base)) / (2 pi)
    k, m, f = 4 * 210e3, 640.0, 3.5
    total = m + inertia_base_mass(k, m, f)
    assert np.sqrt(k / total) / (2.0 * np.pi) == pytest.approx(f, rel=1e-14)
    # machine alone already low enough: no base
    assert inertia_base_mass(1.0e6, 200.0, 15.9155) == 0.0


# --------------------------------------------------------------------------------------
# Arrays and scalars


def test_arrays_equal_scalars():
    # Array evaluation must equal element-by-element scalar evaluation.
    r = np.array([0.3, 1.0, 1.7, 3.0])
    zeta = np.array([0.01, 0.05, 0.1, 0.2])
    functions = [
        transmissibility_viscous, transmissibility_viscous_phase,
        transmissibility_hysteretic, transmissibility_hysteretic_phase,
        relative_transmissibility_viscous, relative_transmissibility_hysteretic,
    ]
    for function in functions:
        array_result = function(r, zeta)
        assert array_result.shape == (4,)
        for i in range(4):
            # a few ulps allowed: numpy may take SIMD paths for arrays and not scalars
            assert array_result[i] == pytest.approx(function(r[i], zeta[i]), rel=1e-14)
    assert np.ndim(transmissibility_viscous(3.0, 0.05)) == 0
    assert np.ndim(frequency_ratio_for_efficiency(0.9, 0.05)) == 0


# --------------------------------------------------------------------------------------
# Bad input: exact messages


@pytest.mark.parametrize(
    ("zeta", "message"),
    [
        (1.2, "damping ratio must be at least 0 and below 1, got 1.2"),
        (1.0, "damping ratio must be at least 0 and below 1, got 1"),
        (-0.05, "damping ratio must be at least 0 and below 1, got -0.05"),
        (float("nan"), "damping ratio must be at least 0 and below 1, got nan"),
        ([0.05, 0.1, 3.0], "damping ratio must be at least 0 and below 1, got 3"),
    ],
)
def test_bad_damping_ratio(zeta, message):
    with pytest.raises(ValueError, match=exactly(message)):
        transmissibility_viscous(3.0, zeta)
    with pytest.raises(ValueError, match=exactly(message)):
        resonance_peak_viscous(zeta)
    with pytest.raises(ValueError, match=exactly(message)):
        frequency_ratio_for_efficiency(0.9, zeta)


@pytest.mark.parametrize(
    ("efficiency", "message"),
    [
        (1.5, "efficiency target must be at least 0 and below 1, got 1.5"),
        (1.0, "efficiency target must be at least 0 and below 1, got 1"),
        (-0.2, "efficiency target must be at least 0 and below 1, got -0.2"),
    ],
)
def test_bad_efficiency_target(efficiency, message):
    with pytest.raises(ValueError, match=exactly(message)):
        frequency_ratio_for_efficiency(efficiency)
    with pytest.raises(ValueError, match=exactly(message)):
        frequency_ratio_for_efficiency_hysteretic(efficiency, 0.1)
    with pytest.raises(ValueError, match=exactly(message)):
        static_deflection_for_efficiency(efficiency, 25.0)


@pytest.mark.parametrize(
    ("call", "message"),
    [
        (lambda: transmissibility_viscous(-1.0, 0.05),
         "frequency ratio must be at least 0, got -1"),
        (lambda: transmissibility_viscous(np.inf, 0.05),
         "frequency ratio must be a finite number, got inf"),
        (lambda: transmissibility_hysteretic(2.0, -0.1),
         "loss factor must be at least 0, got -0.1"),
        (lambda: frequency_ratio(10.0, 0.0), "natural frequency must be positive, got 0"),
        (lambda: frequency_ratio(-10.0, 2.0), "frequency must be at least 0, got -10"),
        (lambda: natural_frequency_from_static_deflection(-0.002),
         "static deflection must be positive, got -0.002"),
        (lambda: static_deflection_from_natural_frequency(0.0),
         "natural frequency must be positive, got 0"),
        (lambda: static_deflection_for_efficiency(0.9, -25.0),
         "forcing frequency must be positive, got -25"),
        (lambda: isolation_efficiency(-0.1), "transmissibility must be at least 0, got -0.1"),
        (lambda: inertia_base_mass(-2.0e5, 640.0, 3.0),
         "isolator stiffness must be positive, got -200000"),
        (lambda: inertia_base_mass(2.0e5, -640.0, 3.0), "machine mass must be positive, got -640"),
        (lambda: inertia_base_mass(2.0e5, 640.0, 0.0),
         "target natural frequency must be positive, got 0"),
    ],
)
def test_bad_input_messages(call, message):
    with pytest.raises(ValueError, match=exactly(message)):
        call()


def test_docstring_examples_run():
    # The Examples sections print numbers; they must be what the code gives.
    failed, attempted = doctest.testmod(tr, optionflags=doctest.ELLIPSIS)
    assert attempted >= 15
    assert failed == 0

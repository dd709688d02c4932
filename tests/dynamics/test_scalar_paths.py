"""The plain-float fast paths of the one-DOF formulas give, bit for bit, what their numpy
paths give for the same inputs as 0-d arrays, what scalar callers got before the fast paths
were added (a one-element array may differ from both in the last bit: numpy squares it by
another routine), and the closed forms they implement."""

from __future__ import annotations

import math

import numpy as np
import pytest

from vcheck.dynamics.isolation.passage import (
    dimensionless_sweep_rate,
    passage_peak_viscous,
    sweep_rate_of_run,
)
from vcheck.dynamics.isolation.transmissibility import transmissibility_viscous

RNG = np.random.default_rng(20261203)
RATIOS = np.concatenate([RNG.uniform(0.0, 5.0, 400), [0.0, 1.0, math.sqrt(2.0), 1e-8, 40.0]])
DAMPING = np.concatenate([RNG.uniform(0.001, 0.5, 400), [0.01, 0.05, 0.1, 0.2, 0.3]])


def test_transmissibility_float_path_equals_array_path_bit_for_bit():
    for r, zeta in zip(RATIOS, DAMPING):
        fast = transmissibility_viscous(float(r), float(zeta))
        general = transmissibility_viscous(np.array(r), np.array(zeta))  # 0-d: the numpy path
        assert float(fast).hex() == float(general).hex(), (r, zeta)


def test_transmissibility_float_path_is_the_closed_form():
    # T = sqrt((1 + (2 zeta r)^2) / ((1 - r^2)^2 + (2 zeta r)^2)): Harris' Shock and
    # Vibration Handbook, ch. 30 (from memory); at r = sqrt(2) T = 1 for any damping.
    for r, zeta in zip(RATIOS, DAMPING):
        two = (2.0 * zeta * r) ** 2
        expected = math.sqrt((1.0 + two) / ((1.0 - r * r) ** 2 + two))
        assert float(transmissibility_viscous(float(r), float(zeta))) == pytest.approx(
            expected, rel=1e-12)
    assert float(transmissibility_viscous(math.sqrt(2.0), 0.07)) == pytest.approx(1.0, rel=1e-12)


def test_passage_float_path_equals_array_path_bit_for_bit():
    etas = np.concatenate([10.0 ** RNG.uniform(-6, 1, 400), [1e-4, 1e-3, 0.01, 0.1, 1.0]])
    for eta, zeta in zip(etas, DAMPING):
        fast = passage_peak_viscous(float(eta), float(zeta))
        general = passage_peak_viscous(np.array(eta), np.array(zeta))  # 0-d: the numpy path
        assert float(fast).hex() == float(general).hex(), (eta, zeta)
        assert type(fast) is type(passage_peak_viscous(np.float64(eta), np.float64(zeta)))


def test_sweep_rate_float_paths_equal_array_paths_bit_for_bit():
    # eta = (df/dt) / f_n^2 and df/dt = f / T (the definitions in passage.py); the float
    # paths must give the 0-d numpy results to the last bit, and the same type
    rates = np.concatenate([10.0 ** RNG.uniform(-3, 3, 300), [1e-300, 1e300, 0.5]])
    freqs = np.concatenate([10.0 ** RNG.uniform(-1, 3, 300), [1e-160, 1e160, 3.0]])
    for rate, fn in zip(rates, freqs):
        for call in (dimensionless_sweep_rate, sweep_rate_of_run):
            with np.errstate(all="ignore"):  # 1e160 squared: both paths give inf
                fast = call(float(rate), float(fn))
                general = call(np.array(rate), np.array(fn))
            assert float(fast).hex() == float(general).hex(), (call.__name__, rate, fn)
            assert type(fast) is type(general)
    assert float(dimensionless_sweep_rate(0.5, 3.0)) == 0.5 / 9.0
    assert float(sweep_rate_of_run(25.0, 10.0)) == 2.5


def test_the_float_paths_refuse_what_the_array_paths_refuse():
    for call, bad in ((transmissibility_viscous, (-0.5, 0.05)),
                      (transmissibility_viscous, (1.0, -0.1)),
                      (passage_peak_viscous, (-0.01, 0.05)),
                      (passage_peak_viscous, (0.01, -0.05)),
                      (dimensionless_sweep_rate, (0.0, 3.0)),
                      (dimensionless_sweep_rate, (0.5, math.inf)),
                      (sweep_rate_of_run, (-1.0, 10.0)),
                      (sweep_rate_of_run, (25.0, math.nan)),
                      (sweep_rate_of_run, (math.nan, math.nan))):
        with pytest.raises(ValueError) as fast:
            call(*bad)
        with pytest.raises(ValueError) as general:
            call(*(np.array([v]) for v in bad))
        assert str(fast.value) == str(general.value)


# ------------------------------------------------ one-DOF natural frequency (sdof)

STIFFNESS = np.concatenate([10.0 ** RNG.uniform(2, 9, 300), [1.0, 4.0e5, 1e-300, 1e300]])
MASS = np.concatenate([10.0 ** RNG.uniform(-1, 5, 300), [1.0, 250.0, 1e300, 1e-300]])
DEFLECTION = np.concatenate([10.0 ** RNG.uniform(-5, 0, 300), [0.025, 1e-320, 1e300]])
FREQUENCY = np.concatenate([10.0 ** RNG.uniform(-2, 3, 300), [1e-151, 1e-149, 1e149, 1e151]])


def test_sdof_float_paths_equal_array_paths_bit_for_bit():
    import warnings

    from vcheck.dynamics.modes import sdof

    cases = [(sdof.natural_frequency_spring_mass, (k, m)) for k, m in zip(STIFFNESS, MASS)]
    cases += [(sdof.natural_frequency_static_deflection, (d,)) for d in DEFLECTION]
    cases += [(sdof.static_deflection_for_frequency, (f,)) for f in FREQUENCY]
    for call, args in cases:
        with warnings.catch_warnings(record=True) as fast_warnings:
            warnings.simplefilter("always")
            fast = call(*(float(v) for v in args))
        with warnings.catch_warnings(record=True) as general_warnings:
            warnings.simplefilter("always")
            general = call(*(np.array(v) for v in args))  # 0-d: the numpy path
        assert type(fast) is type(general) is np.float64, (call, args)
        assert float(fast).hex() == float(general).hex(), (call, args)
        assert [str(w.message) for w in fast_warnings] == [
            str(w.message) for w in general_warnings], (call, args)


def test_sdof_float_paths_are_the_closed_forms():
    # f_n = sqrt(k / m) / (2 pi) (Thomson and Dahleh, Theory of Vibration with
    # Applications, 5th ed., sec. 2.1) and f_n = sqrt(g / delta) / (2 pi) with delta =
    # g / (2 pi f_n)^2 its inverse (Harris' Shock and Vibration Handbook, ch. 30, from
    # memory); the trade's 15.76 / sqrt(delta in mm) at 25 mm is 3.152 Hz. Round-off
    # tolerance.
    from vcheck.dynamics.modes import sdof

    g = 9.80665
    for k, m in zip(STIFFNESS[:300], MASS[:300]):
        assert float(sdof.natural_frequency_spring_mass(float(k), float(m))) == pytest.approx(
            math.sqrt(k / m) / (2 * math.pi), rel=1e-14)
    for f in FREQUENCY[:300]:
        delta = float(sdof.static_deflection_for_frequency(float(f)))
        assert delta == pytest.approx(g / (2 * math.pi * f) ** 2, rel=1e-14)
        assert float(sdof.natural_frequency_static_deflection(delta)) == pytest.approx(f, rel=1e-13)
    assert float(sdof.natural_frequency_static_deflection(0.025)) == pytest.approx(
        15.76 / math.sqrt(25.0), rel=1e-3)


def test_sdof_float_paths_refuse_what_the_array_paths_refuse():
    from vcheck.dynamics.modes import sdof

    for call, bad in ((sdof.natural_frequency_spring_mass, (-1.0, 10.0)),
                      (sdof.natural_frequency_spring_mass, (1.0e5, 0.0)),
                      (sdof.natural_frequency_spring_mass, (math.nan, 10.0)),
                      (sdof.natural_frequency_static_deflection, (0.0,)),
                      (sdof.natural_frequency_static_deflection, (-0.01,)),
                      (sdof.static_deflection_for_frequency, (-2.0,)),
                      (sdof.static_deflection_for_frequency, (math.nan,))):
        with pytest.raises(ValueError) as fast:
            call(*bad)
        with pytest.raises(ValueError) as general:
            call(*(np.array([v]) for v in bad))
        assert str(fast.value) == str(general.value)


# ------------------------------------------------ VDI 2230 bolted joints (preload)

from vcheck.dynamics.joints import preload as vdi  # noqa: E402

N_JOINT = 300
JOINT_RNG = np.random.default_rng(20261204)  # its own: the draws above stay as they were


def _spread(low, high, extra=()):
    """Log-uniform draws between low and high and a few edge values."""
    return np.concatenate([10.0 ** JOINT_RNG.uniform(math.log10(low), math.log10(high), N_JOINT),
                           extra])[:N_JOINT]


# (function, argument draws): the argument ranges each check allows, edges included
JOINT_CASES = {
    "friction_plausible": (vdi.friction_plausible, [JOINT_RNG.uniform(0.0, 1.0, N_JOINT)]),
    "preload_from_torque_vdi2230": (vdi.preload_from_torque_vdi2230, [
        _spread(0.1, 5e3, [0.0]), _spread(2e-4, 6e-3), _spread(2e-3, 0.1),
        _spread(3e-3, 0.15), JOINT_RNG.uniform(0.01, 0.99, N_JOINT), JOINT_RNG.uniform(0.01, 0.99, N_JOINT)]),
    "load_factor": (vdi.load_factor, [_spread(1e-10, 1e-6), _spread(1e-11, 1e-6, [0.0]),
                                      JOINT_RNG.uniform(0.05, 1.0, N_JOINT - 1).tolist() + [1.0]]),
    "preload_loss_embedding": (vdi.preload_loss_embedding, [
        _spread(1e-7, 1e-4, [0.0]), _spread(1e-10, 1e-6), _spread(1e-11, 1e-6, [0.0])]),
    "residual_clamp_load": (vdi.residual_clamp_load, [
        _spread(1e2, 1e6, [0.0]), _spread(1.0, 1e5, [0.0]), JOINT_RNG.uniform(0.0, 1.0, N_JOINT),
        JOINT_RNG.uniform(-1e5, 1e5, N_JOINT)]),
    "bolt_force_amplitude": (vdi.bolt_force_amplitude, [
        JOINT_RNG.uniform(0.0, 1.0, N_JOINT), JOINT_RNG.uniform(-1e5, 1e5, N_JOINT),
        JOINT_RNG.uniform(-1e5, 1e5, N_JOINT)]),
    "bolt_stress_amplitude": (vdi.bolt_stress_amplitude, [
        _spread(1.0, 1e5, [0.0]), _spread(1e-6, 1e-3)]),
    "fatigue_safety": (vdi.fatigue_safety, [_spread(1e3, 1e9, [0.0]), _spread(1e7, 1e8)]),
}


@pytest.mark.parametrize("name", sorted(JOINT_CASES))
def test_joint_float_paths_equal_array_paths_bit_for_bit(name):
    call, draws = JOINT_CASES[name]
    for args in zip(*draws):
        fast = call(*(float(a) for a in args))
        general = call(*(np.float64(a) for a in args))  # numpy scalars: the array path
        if name == "friction_plausible":
            assert fast is general, args
        else:
            assert isinstance(fast, float)
            assert float(fast).hex() == float(general).hex(), args


def test_slip_safety_float_path_equals_array_path_bit_for_bit():
    residual = np.concatenate([JOINT_RNG.uniform(-1e4, 1e6, N_JOINT), [0.0, -0.0, -1.0]])
    load = np.concatenate([_spread(1.0, 1e6), [0.0, 0.0, 0.0]])
    friction = JOINT_RNG.uniform(0.01, 0.99, len(residual))
    counts = JOINT_RNG.integers(1, 40, size=(len(residual), 2))
    for fkr, fq, mu, (q, n) in zip(residual, load, friction, counts):
        fast = vdi.slip_safety(float(fkr), float(fq), float(mu), int(q), int(n))
        general = vdi.slip_safety(np.float64(fkr), np.float64(fq), np.float64(mu),
                                  np.int64(q), np.int64(n))
        assert float(fast).hex() == float(general).hex(), (fkr, fq, mu, q, n)


def test_joint_float_paths_are_the_closed_forms():
    # VDI 2230 Part 1:2015 (from memory): F_M = M_A / (0.16 P + 0.58 d2 mu_G + D_Km/2 mu_K)
    # (R13/1), Phi = n delta_P / (delta_S + delta_P), F_Z = f_Z / (delta_S + delta_P),
    # S_G = F_KR q mu n / F_Q (R12), S_D = sigma_ASV / sigma_a (R9/4); an M12 joint.
    torque, pitch, d2, dkm, mu_g, mu_k = 80.0, 1.75e-3, 10.863e-3, 16.6e-3, 0.12, 0.10
    assert vdi.preload_from_torque_vdi2230(torque, pitch, d2, dkm, mu_g, mu_k) == \
        pytest.approx(torque / (0.16 * pitch + 0.58 * d2 * mu_g + dkm / 2 * mu_k), rel=1e-15)
    assert vdi.load_factor(2e-9, 5e-10, 1.0) == pytest.approx(5e-10 / 2.5e-9, rel=1e-15)
    assert vdi.preload_loss_embedding(1.1e-5, 2e-9, 5e-10) == pytest.approx(4400.0, rel=1e-12)
    assert vdi.slip_safety(20e3, 10e3, 0.2, 1, 4) == pytest.approx(1.6, rel=1e-15)
    assert vdi.slip_safety(-5.0, 10e3, 0.2, 1, 4) == 0.0
    assert vdi.slip_safety(20e3, 0.0, 0.2, 1, 4) == math.inf
    assert vdi.fatigue_safety(25e6, 50e6) == pytest.approx(2.0, rel=1e-15)
    assert vdi.fatigue_safety(0.0, 50e6) == math.inf
    assert vdi.bolt_force_amplitude(0.2, 3e3, -1e3) == pytest.approx(400.0, rel=1e-15)


@pytest.mark.parametrize("call, bad", [
    (vdi.preload_from_torque_vdi2230, (-1.0, 1.75e-3, 10.863e-3, 16.6e-3, 0.12, 0.1)),
    (vdi.preload_from_torque_vdi2230, (80.0, 0.0, 10.863e-3, 16.6e-3, 0.12, 0.1)),
    (vdi.preload_from_torque_vdi2230, (80.0, 1.75e-3, 10.863e-3, 16.6e-3, 1.0, 0.1)),
    (vdi.preload_from_torque_vdi2230, (80.0, 1.75e-3, math.nan, 16.6e-3, 0.12, 0.1)),
    (vdi.load_factor, (2e-9, 5e-10, 1.5)),
    (vdi.load_factor, (0.0, 5e-10, 1.0)),
    (vdi.preload_loss_embedding, (-1e-6, 2e-9, 5e-10)),
    (vdi.residual_clamp_load, (1e4, 1e3, 0.2, math.inf)),
    (vdi.residual_clamp_load, (1e4, -1.0, 0.2, 0.0)),
    (vdi.slip_safety, (1e4, 1e3, 0.2, 0, 4)),
    (vdi.slip_safety, (1e4, 1e3, 0.2, 1, True)),
    (vdi.slip_safety, (1e4, 1e3, 0.0, 1, 4)),
    (vdi.slip_safety, (math.nan, 1e3, 0.2, 1, 4)),
    (vdi.bolt_force_amplitude, (-0.1, 1.0, 0.0)),
    (vdi.bolt_stress_amplitude, (1e3, 0.0)),
    (vdi.fatigue_safety, (-1.0, 5e7)),
    (vdi.fatigue_safety, (1e6, math.inf)),
])
def test_joint_float_paths_refuse_what_the_array_paths_refuse(call, bad):
    with pytest.raises(ValueError) as fast:
        call(*bad)
    with pytest.raises(ValueError) as general:
        call(*(np.array([v]) for v in bad))
    assert str(fast.value) == str(general.value)

"""Checks of vcheck.dynamics.vibration_level against outside references.

Each test names its reference beside the check and says why its tolerance is what it is.
Tags follow shared/REFERENCES.md: [C] seen in a published source, [D] derived by exact
arithmetic, [M] from memory.
"""

from __future__ import annotations

import doctest
import math
import re

import numpy as np
import pytest
from scipy import integrate

from vcheck.dynamics import vibration_level
from vcheck.dynamics.vibration_level import (
    CLASS_BOUNDARIES_ISO_10816_1,
    STANDARD_GRAVITY,
    ZONE_BOUNDARIES_ISO_10816_3,
    acceleration_from_displacement,
    acceleration_from_velocity,
    class_boundaries,
    displacement_from_acceleration,
    displacement_from_velocity,
    harmonic_amplitude,
    inertia_force,
    severity_zone,
    velocity_from_acceleration,
    velocity_from_displacement,
    zone_boundaries,
)

MM_S = 1.0e-3
INCH = 0.0254


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


@pytest.mark.parametrize("f", [2.0, 24.75, 120.0])
def test_harmonic_conversions_against_numerical_differentiation(f):
    # Independent numerical method: sample x(t) = X sin(2 pi f t) finely over one period,
    # differentiate twice with numpy.gradient (second-order central differences), and
    # read the peak velocity and acceleration. With 20 000 points a period the
    # differencing error is about (2 pi / 20 000)^2 / 6 = 1.6e-8 relative per derivative;
    # 1e-6 covers that and the sampling of the peak.
    x_peak = 50e-6
    t = np.linspace(0.0, 1.0 / f, 20_001)
    x = x_peak * np.sin(2 * np.pi * f * t)
    v = np.gradient(x, t, edge_order=2)
    a = np.gradient(v, t, edge_order=2)
    assert velocity_from_displacement(x_peak, f) == pytest.approx(np.max(np.abs(v)), rel=1e-6)
    assert acceleration_from_displacement(x_peak, f) == pytest.approx(
        np.max(np.abs(a[5:-5])), rel=1e-6
    )


def test_conversions_are_mutual_inverses_and_take_arrays():
    # Closed forms V = 2 pi f X, A = 2 pi f V; round trips exact to rounding.
    f = np.array([5.0, 25.0, 100.0])
    v = np.array([2.8e-3, 4.5e-3, 7.1e-3])
    a = acceleration_from_velocity(v, f)
    assert a == pytest.approx(2 * np.pi * f * v, rel=1e-15)
    assert velocity_from_acceleration(a, f) == pytest.approx(v, rel=1e-14)
    x = displacement_from_velocity(v, f)
    assert displacement_from_acceleration(a, f) == pytest.approx(x, rel=1e-14)
    assert velocity_from_displacement(x, f) == pytest.approx(v, rel=1e-14)
    # Array equals scalar, element by element.
    assert acceleration_from_velocity(v[1], f[1]) == pytest.approx(a[1], rel=1e-15)


def test_one_g_at_100_hz():
    # [D] with g_n = 9.80665 m/s^2 exactly (3rd CGPM 1901): X = g / (2 pi 100)^2
    # = 24.8406 um, V = g / (2 pi 100) = 15.6078 mm/s. Printed to six figures: 1e-5.
    assert displacement_from_acceleration(STANDARD_GRAVITY, 100.0) * 1e6 == pytest.approx(
        24.8406, rel=1e-5
    )
    assert velocity_from_acceleration(STANDARD_GRAVITY, 100.0) * 1e3 == pytest.approx(
        15.6078, rel=1e-5
    )
    assert STANDARD_GRAVITY == 9.80665


def test_inch_per_second_screening_value():
    # 0.5 in/s zero-to-peak is the piping screening velocity of ASME OM-3 (value from
    # memory) [M]; 1 in = 25.4 mm exactly gives 12.7 mm/s [D]; restated as RMS for a
    # single sinusoid 8.98 mm/s. Exact arithmetic, 1e-12.
    peak = 0.5 * INCH
    assert peak == pytest.approx(12.7e-3, rel=1e-12)
    assert harmonic_amplitude(peak, "peak", "rms") == pytest.approx(12.7e-3 / math.sqrt(2))


def test_rms_and_peak_to_peak_against_quadrature():
    # Independent: RMS by definition, sqrt(1/T int x^2 dt), by scipy.integrate.quad over
    # a period of a unit sinusoid; peak-to-peak is max - min. quad reaches 1e-12 here.
    f = 7.0
    mean_square, _ = integrate.quad(lambda t: math.sin(2 * math.pi * f * t) ** 2, 0, 1 / f,
                                    epsabs=0, epsrel=1e-13)
    rms = math.sqrt(mean_square * f)
    assert harmonic_amplitude(1.0, "peak", "rms") == pytest.approx(rms, rel=1e-12)
    assert harmonic_amplitude(1.0, "peak", "peak-to-peak") == 2.0
    assert harmonic_amplitude(2.0, "peak-to-peak", "rms") == pytest.approx(rms, rel=1e-12)
    assert harmonic_amplitude([1.0, 3.0], "rms", "rms") == pytest.approx([1.0, 3.0])


# ISO 10816-3:2009 Annex A Table A.1, mm/s RMS, A/B, B/C, C/D (from memory; as collected
# in shared/REFERENCES.md, which notes a public page wrongly gives 7.1 for group 2 rigid
# C/D) [M]. Exact table values.
ISO_10816_3_TABLE_A1 = {
    (1, "rigid"): (2.3, 4.5, 7.1),
    (1, "flexible"): (3.5, 7.1, 11.0),
    (2, "rigid"): (1.4, 2.8, 4.5),
    (2, "flexible"): (2.3, 4.5, 7.1),
}


@pytest.mark.parametrize(("key", "row"), ISO_10816_3_TABLE_A1.items())
def test_iso_10816_3_zone_boundaries(key, row):
    # ISO 10816-3:2009 Table A.1 (from memory) [M]; exact table values.
    assert zone_boundaries(*key) == pytest.approx(tuple(v * MM_S for v in row), rel=1e-12)
    assert set(ZONE_BOUNDARIES_ISO_10816_3) == set(ISO_10816_3_TABLE_A1)


def test_group_2_rigid_c_d_boundary_is_4_5_mm_s():
    # shared/REFERENCES.md: group 2 rigid C/D is 4.5 mm/s, not 7.1 (a public page is
    # wrong) [M]; the value a bolt-loosening rule most often meets.
    assert zone_boundaries(2, "rigid")[2] == pytest.approx(4.5e-3, rel=1e-12)


# ISO 10816-1:1995 Annex B Table B.1, mm/s RMS [C].
ISO_10816_1_TABLE_B1 = {
    "I": (0.71, 1.8, 4.5),
    "II": (1.12, 2.8, 7.1),
    "III": (1.8, 4.5, 11.2),
    "IV": (2.8, 7.1, 18.0),
}


@pytest.mark.parametrize(("cls", "row"), ISO_10816_1_TABLE_B1.items())
def test_iso_10816_1_class_boundaries(cls, row):
    # ISO 10816-1:1995 Table B.1 [C]; exact table values.
    assert class_boundaries(cls) == pytest.approx(tuple(v * MM_S for v in row), rel=1e-12)
    assert class_boundaries(cls.lower()) == class_boundaries(cls)


def test_iso_10816_1_boundaries_step_by_a_renard_ratio():
    # Structure of the table: its velocities are every fourth number of the R20 series
    # of ISO 3:1973 (ratio 10^(4/20) = 1.585), rounded to the series' preferred values
    # (0.71, 1.12, 1.8, 2.8, 4.5, 7.1, 11.2, 18) [C for the values]. A typo in the constant
    # breaks the ratio; the rounding of preferred numbers moves it by at most 2 %.
    values = sorted({v / MM_S for row in CLASS_BOUNDARIES_ISO_10816_1.values() for v in row})
    ratios = np.array(values[1:]) / np.array(values[:-1])
    assert ratios == pytest.approx(np.full(len(ratios), 10 ** 0.2), rel=0.02)


def test_severity_zone():
    # Zones A-D from the boundaries (ISO 10816-1 clause 5.3.1, from memory) [M]; a value
    # on a boundary goes to the better zone (documented choice).
    b = zone_boundaries(2, "rigid")
    assert severity_zone(1.0e-3, b) == "A"
    assert severity_zone(1.4e-3, b) == "A"
    assert severity_zone(2.0e-3, b) == "B"
    assert severity_zone(4.5e-3, b) == "C"
    assert severity_zone(4.6e-3, b) == "D"
    assert severity_zone([1e-3, 3e-3, 9e-3], b).tolist() == ["A", "C", "D"]


def test_inertia_force():
    # Newton's second law, F = m a; 2.5 g on 310 kg = 7600.15 N [D].
    assert inertia_force(310.0, 2.5 * STANDARD_GRAVITY) == pytest.approx(7600.15375, rel=1e-12)
    assert inertia_force([1.0, 2.0], 3.0) == pytest.approx([3.0, 6.0])


@pytest.mark.parametrize(
    ("call", "message"),
    [
        (lambda: zone_boundaries(3, "rigid"), "unknown machine group 3: valid groups are 1, 2"),
        (lambda: zone_boundaries(2, "stiff"),
         "unknown support 'stiff': valid supports are rigid, flexible"),
        (lambda: class_boundaries("V"), "unknown machine class 'V': valid classes are I, II, "
                                        "III, IV"),
        (lambda: harmonic_amplitude(1.0, "rms", "average"),
         "unknown amplitude kind 'average': valid kinds are peak, rms, peak-to-peak"),
        (lambda: velocity_from_displacement(1e-5, 0.0),
         "frequency must be positive and finite, got 0 Hz"),
        (lambda: acceleration_from_velocity(-1e-3, 25.0),
         "velocity must be zero or positive, got -0.001 m/s"),
        (lambda: inertia_force(-5.0, 1.0), "mass must be zero or positive, got -5 kg"),
        (lambda: inertia_force(5.0, math.nan), "acceleration must be finite, got nan m/s^2"),
        (lambda: severity_zone(1e-3, (4.5e-3, 2.8e-3, 1.4e-3)),
         "boundaries must be three increasing positive velocities, got (0.0045, 0.0028, 0.0014)"),
    ],
)
def test_bad_input_has_exact_messages(call, message):
    with pytest.raises(ValueError, match=exactly(message)):
        call()


def test_docstring_examples_run():
    result = doctest.testmod(vibration_level)
    assert result.failed == 0 and result.attempted >= 4

"""S-N curves against EN 1993-1-9, DNV-RP-C203 (2016), the IIW recommendations,
fatpack's independent curves and closed forms."""

from __future__ import annotations

import doctest
import math

import fatpack
import numpy as np
import pytest

from vcheck.dynamics.fatigue import sn_curves
from vcheck.dynamics.fatigue.sn_curves import (
    DNV_RP_C203_2016_CURVES_IN_AIR,
    EN_1993_1_9_DETAIL_CATEGORIES,
    SN_CURVES,
    DNVCurveInAir,
    EN1993DetailCurve,
    IIWFatClassCurve,
    PiecewiseLogLogCurve,
    mean_stress_en1993_compression,
    mean_stress_gerber,
    mean_stress_goodman,
    partial_factor_fatigue_strength,
    sn_curve,
)

MPA = 1e6

# ------------------------------------------------------------------ EN 1993-1-9

# EN 1993-1-9:2005, 7.1 and Fig. 7.1: delta_sigma_D = (2/5)^(1/3) delta_sigma_C and
# delta_sigma_L = (5/100)^(1/5) delta_sigma_D. Values (category: D, L) in MPa are [D] in
# REFERENCES.md, derived from the published formulas; Fig. 7.1 prints them rounded, so
# the tolerance against them is 1 MPa (the brief's and the figure's rounding).
EN_LIMITS_MPA = {
    160: (117.9, 64.8),
    112: (82.5, 45.3),
    90: (66.3, 36.4),
    71: (52.3, 28.7),
    36: (26.5, 14.6),
}


@pytest.mark.parametrize("category", sorted(EN_LIMITS_MPA))
def test_en1993_fatigue_limit_and_cut_off(category):
    curve = sn_curve(f"EN 1993-1-9:{category}")
    d, l = EN_LIMITS_MPA[category]
    assert curve.constant_amplitude_fatigue_limit / MPA == pytest.approx(d, abs=1.0)
    assert curve.cut_off_limit / MPA == pytest.approx(l, abs=1.0)
    # and to the last digit of the derived values (rounded to 0.1 MPa: 0.05)
    assert curve.constant_amplitude_fatigue_limit / MPA == pytest.approx(d, abs=0.05)
    assert curve.cut_off_limit / MPA == pytest.approx(l, abs=0.05)


def test_en1993_ratios_of_the_standard():
    # (2/5)^(1/3) = 0.7368 and (5/100)^(1/5) = 0.5493 (EN 1993-1-9 7.1, [C]); exact
    # formulas, so only rounding of the 4-digit figures: 5e-5.
    for c in EN_1993_1_9_DETAIL_CATEGORIES:
        curve = EN1993DetailCurve(c * MPA)
        assert curve.constant_amplitude_fatigue_limit / curve.detail_category == pytest.approx(
            0.7368, abs=5e-5
        )
        assert curve.cut_off_limit / curve.constant_amplitude_fatigue_limit == pytest.approx(
            0.5493, abs=5e-5
        )
        # the curve passes through (2e6, delta_sigma_C), (5e6, D) and (1e8, L)
        assert curve.cycles_variable_amplitude(curve.detail_category) == pytest.approx(
            2e6, rel=1e-12
        )
        assert curve.cycles_variable_amplitude(
            curve.constant_amplitude_fatigue_limit
        ) == pytest.approx(5e6, rel=1e-12)
        assert curve.cycles_variable_amplitude(curve.cut_off_limit) == pytest.approx(1e8, rel=1e-12)


@pytest.mark.parametrize("category", EN_1993_1_9_DETAIL_CATEGORIES)
def test_en1993_against_fatpack_trilinear_curve(category):
    # fatpack.TriLinearEnduranceCurve (fatpack 0.7) defaults: Nc = 2e6, Nd = 5e6,
    # Nl = 1e8, m1 = 3, m2 = 5, nothing below Sl: the EN 1993-1-9 variable-amplitude
    # curve in an independent implementation. Same closed forms, so 1e-12 relative.
    reference = fatpack.TriLinearEnduranceCurve(float(category))
    curve = sn_curve(f"EN 1993-1-9:{category}")
    s_mpa = np.geomspace(0.3 * category, 3.0 * category, 401)
    expected = reference.get_endurance(s_mpa)
    got = curve.cycles_variable_amplitude(s_mpa * MPA)
    finite = np.isfinite(expected)
    assert np.array_equal(finite, np.isfinite(got))
    np.testing.assert_allclose(got[finite], expected[finite], rtol=1e-12)
    n = np.geomspace(1e4, 1e8, 201)
    np.testing.assert_allclose(curve.stress_range_at(n) / MPA, reference.get_stress(n), rtol=1e-12)


def test_en1993_constant_and_variable_amplitude_below_the_fatigue_limit():
    # EN 1993-1-9 7.1 / Fig. 7.1: constant-amplitude ranges below delta_sigma_D do no
    # damage; in a spectrum the m = 5 branch applies down to delta_sigma_L.
    curve = sn_curve("EN 1993-1-9:71")
    d = curve.constant_amplitude_fatigue_limit
    below, above = 0.99 * d, 1.01 * d
    assert math.isinf(curve.cycles_constant_amplitude(below))
    assert curve.cycles_variable_amplitude(below) == pytest.approx(
        5e6 * (d / below) ** 5, rel=1e-12
    )
    assert curve.cycles_constant_amplitude(above) == pytest.approx(
        2e6 * (71 * MPA / above) ** 3, rel=1e-12
    )
    assert math.isinf(curve.cycles_variable_amplitude(0.99 * curve.cut_off_limit))
    assert math.isinf(curve.cycles_variable_amplitude(0.0))
    # beyond the cut-off the allowed stress range stays at delta_sigma_L
    assert curve.stress_range_at(1e9) == pytest.approx(curve.cut_off_limit, rel=1e-12)


def test_unknown_detail_category_lists_the_valid_ones():
    valid = "160, 140, 125, 112, 100, 90, 80, 71, 63, 56, 50, 45, 40, 36"
    with pytest.raises(
        ValueError,
        match=rf"^unknown EN 1993-1-9 detail category 70 MPa; valid categories \(MPa\): {valid}$",
    ):
        EN1993DetailCurve(70e6)


# ------------------------------------------------------------------- DNV-RP-C203

# DNVGL-RP-C203 (April 2016), Table 2-1, "fatigue limit at 1e7 cycles" column, MPa:
# B1, C, D, E, F are [C] in REFERENCES.md. The column does not follow exactly from the
# printed log a1 (D: 10^(5.164/3) = 52.64, printed 52.63): log a1 is rounded to 3
# decimals, half a unit moves S(1e7) by 10^(5e-4/m1) - 1 = 3.8e-4 relative at m1 = 3,
# so that is the tolerance.
DNV_FATIGUE_LIMITS_MPA = {"B1": 106.97, "C": 73.10, "D": 52.63, "E": 46.78, "F": 41.52}


@pytest.mark.parametrize("name", sorted(DNV_FATIGUE_LIMITS_MPA))
def test_dnv_fatigue_limit_column(name):
    curve = sn_curve(f"DNV-RP-C203:{name}")
    assert curve.fatigue_limit / MPA == pytest.approx(DNV_FATIGUE_LIMITS_MPA[name], rel=3.9e-4)
    assert curve.cycles_variable_amplitude(curve.fatigue_limit) == pytest.approx(1e7, rel=1e-12)


def test_dnv_d_curve_at_two_million_cycles():
    # log N = 12.164 - 3 log S: S(2e6) = 10^((12.164 - log10 2e6)/3) = 90.0 MPa [D];
    # 0.05 MPa is the rounding of the figure.
    assert sn_curve("DNV-RP-C203:D").stress_range_at(2e6) / MPA == pytest.approx(90.0, abs=0.05)


@pytest.mark.parametrize("name", list(DNV_RP_C203_2016_CURVES_IN_AIR))
def test_dnv_branches_meet_at_ten_million_cycles(name):
    # Table 2-1 gives log a2 separately; it must put the second branch through the
    # first branch's value at 1e7 cycles. log a1 and log a2 are printed to 3 decimals:
    # half a unit (5e-4) in log a2 plus m2/m1 times that from log a1, at most 1.4e-3.
    m1, log_a1, m2, log_a2, _ = DNV_RP_C203_2016_CURVES_IN_AIR[name]
    log_s = (log_a1 - 7.0) / m1
    assert log_a2 - m2 * log_s == pytest.approx(7.0, abs=1.4e-3)


@pytest.mark.parametrize("name", list(DNV_RP_C203_2016_CURVES_IN_AIR))
def test_dnv_against_fatpack_bilinear_curve(name):
    # fatpack's own example for this edition builds the curves as
    # BiLinearEnduranceCurve(1.0) with Nc = 10^log a1, Nd = 1e7, m1, m2: independent
    # code. fatpack continues the second branch from the knee instead of using the
    # printed log a2, so below the knee N may differ by the 3-decimal rounding of
    # log a2 (at most 10^1.4e-3 - 1 = 0.33 %); above it the first branch is identical.
    m1, log_a1, m2, _, _ = DNV_RP_C203_2016_CURVES_IN_AIR[name]
    reference = fatpack.BiLinearEnduranceCurve(1.0)
    reference.Nc = 10.0**log_a1
    reference.m1, reference.m2, reference.Nd = m1, m2, 1e7
    curve = sn_curve(f"DNV-RP-C203:{name}")
    s = np.geomspace(10.0, 400.0, 300)
    got = curve.cycles_variable_amplitude(s * MPA)
    expected = reference.get_endurance(s)
    upper = s > curve.fatigue_limit / MPA
    np.testing.assert_allclose(got[upper], expected[upper], rtol=1e-12)
    np.testing.assert_allclose(got[~upper], expected[~upper], rtol=3.3e-3)


def test_dnv_thickness_effect():
    # DNVGL-RP-C203 (2016) 2.4.3: stress ranges times (t / 25 mm)^k above 25 mm (t_ref
    # and the clause from memory); D curve k = 0.20 (Table 2-1). At 50 mm the range for
    # 2e6 cycles falls by 2^0.2 (closed
    # form of the same equation, so 1e-12).
    base = sn_curve("DNV-RP-C203:D").stress_range_at(2e6)
    thick = DNVCurveInAir("D", thickness=0.050).stress_range_at(2e6)
    assert thick == pytest.approx(base / 2**0.2, rel=1e-12)
    assert DNVCurveInAir("D", thickness=0.016).stress_range_at(2e6) == pytest.approx(
        base, rel=1e-15
    )


def test_dnv_unknown_curve():
    with pytest.raises(
        ValueError, match=r"^unknown DNV-RP-C203 curve in air 'F2'; valid curves: B1, B2, C"
    ):
        DNVCurveInAir("F2")


# ------------------------------------------------------------------------- IIW


def test_iiw_fat90_knee_and_slope():
    # IIW recommendations (Hobbacher 2016), from memory ([M] in REFERENCES.md): FAT is
    # the range at 2e6 cycles, m = 3 to the knee at 1e7, m = 22 beyond. Closed forms of
    # those statements, so 1e-12.
    curve = sn_curve("IIW:FAT90")
    knee = 90 * MPA * (2e6 / 1e7) ** (1 / 3)
    assert curve.stress_range_at(2e6) == pytest.approx(90 * MPA, rel=1e-12)
    assert curve.stress_range_at(1e7) == pytest.approx(knee, rel=1e-12)
    assert curve.stress_range_at(1e8) == pytest.approx(knee * 10 ** (-1 / 22), rel=1e-12)
    # m = 22 is "about 10 % per decade": 10^(-1/22) = 0.9006
    assert curve.stress_range_at(1e9) / curve.stress_range_at(1e8) == pytest.approx(
        0.9006, abs=1e-4
    )
    # no constant-amplitude limit is assumed (the conservative reading, from memory)
    assert curve.cycles_constant_amplitude(0.5 * knee) == curve.cycles_variable_amplitude(
        0.5 * knee
    )
    assert np.isfinite(curve.cycles_constant_amplitude(0.5 * knee))


def test_iiw_unknown_fat_class():
    with pytest.raises(
        ValueError, match=r"^unknown IIW FAT class 95 MPa; valid classes \(MPa\): 160, 140"
    ):
        IIWFatClassCurve(95e6)


# ------------------------------------------------------------------ user curves


def test_user_curve_through_the_en1993_points_is_the_en1993_curve():
    # The three corner points of EN 1993-1-9 category 71 (2e6, 5e6, 1e8 cycles) as user
    # points give the same curve (the same straight lines in log-log axes).
    en = sn_curve("EN 1993-1-9:71")
    user = PiecewiseLogLogCurve(
        [2e6, 5e6, 1e8], [71 * MPA, en.constant_amplitude_fatigue_limit, en.cut_off_limit]
    )
    s = np.geomspace(10 * MPA, 300 * MPA, 500)
    expected = en.cycles_variable_amplitude(s)
    got = user.cycles_variable_amplitude(s)
    finite = np.isfinite(expected)
    assert np.array_equal(finite, np.isfinite(got))
    np.testing.assert_allclose(got[finite], expected[finite], rtol=1e-11)


def test_user_one_slope_curve_is_basquin():
    # N S^m = C through two points (closed form): m = 3, C = 1e4 * 400^3 (MPa).
    curve = PiecewiseLogLogCurve([1e4, 1e7], [400 * MPA, 40 * MPA], extend_below=True)
    s = np.array([5, 40, 100, 400, 800]) * MPA
    np.testing.assert_allclose(
        curve.cycles_variable_amplitude(s), 1e4 * (400 * MPA / s) ** 3, rtol=1e-12
    )
    cut = PiecewiseLogLogCurve([1e4, 1e7], [400 * MPA, 40 * MPA])
    assert math.isinf(cut.cycles_variable_amplitude(39 * MPA))
    limited = PiecewiseLogLogCurve(
        [1e4, 1e7], [400 * MPA, 40 * MPA], extend_below=True, constant_amplitude_limit=100 * MPA
    )
    assert math.isinf(limited.cycles_constant_amplitude(99 * MPA))
    assert limited.cycles_constant_amplitude(101 * MPA) == pytest.approx(
        1e4 * (400 / 101) ** 3, rel=1e-12
    )
    assert np.isfinite(limited.cycles_variable_amplitude(99 * MPA))


def test_user_curve_bad_points():
    with pytest.raises(ValueError, match=r"^S-N curve stress ranges must be strictly decreasing$"):
        PiecewiseLogLogCurve([1e4, 1e7], [40e6, 400e6])
    with pytest.raises(ValueError, match=r"^S-N curve cycles must be strictly increasing$"):
        PiecewiseLogLogCurve([1e7, 1e4], [400e6, 40e6])
    with pytest.raises(ValueError, match=r"^an S-N curve needs at least two points"):
        PiecewiseLogLogCurve([1e4], [400e6])


# ------------------------------------------------------------------- registry


def test_registry_names_round_trip():
    assert len(SN_CURVES) == 14 + 2 + 14 + 14  # EN normal and shear, IIW, DNV
    for name, curve in SN_CURVES.items():
        assert curve.name == name
        assert sn_curve(name) is curve
        assert curve.source


def test_unknown_curve_name_gives_closest_match_and_the_list():
    valid = ", ".join(SN_CURVES)
    with pytest.raises(ValueError) as info:
        sn_curve("EN 1993-1-9:70")
    assert str(info.value) == (
        "unknown S-N curve 'EN 1993-1-9:70' (closest match: 'EN 1993-1-9:71'); "
        f"valid names: {valid}"
    )
    with pytest.raises(
        ValueError, match=r"^unknown S-N curve 'dnv-rp-c203:d' \(closest match: 'DNV-RP-C203:D'\)"
    ):
        sn_curve("dnv-rp-c203:d")
    with pytest.raises(
        ValueError, match=r"^unknown S-N curve 'xyz'; valid names: EN 1993-1-9:160, "
    ):
        sn_curve("xyz")


# ------------------------------------------------------------------- bad input


def test_negative_stress_range_is_rejected():
    curve = sn_curve("EN 1993-1-9:71")
    with pytest.raises(
        ValueError, match=r"^stress range must be zero or positive, got -5e\+06 Pa$"
    ):
        curve.cycles_variable_amplitude([10e6, -5e6])
    with pytest.raises(ValueError, match=r"^stress range must be a finite number, got nan Pa$"):
        curve.cycles_constant_amplitude(np.nan)
    with pytest.raises(ValueError, match=r"^number of cycles must be positive and finite, got 0$"):
        curve.stress_range_at(0)


def test_scalar_and_array_evaluation_agree():
    curve = sn_curve("DNV-RP-C203:F")
    s = np.array([20.0, 41.0, 42.0, 150.0]) * MPA
    arr = curve.cycles_variable_amplitude(s)
    for value, expected in zip(s, arr):
        assert curve.cycles_variable_amplitude(float(value)) == expected
    assert np.ndim(curve.cycles_variable_amplitude(50e6)) == 0


# --------------------------------------------------------------- partial factor


def test_partial_factors_en1993_table_3_1():
    # EN 1993-1-9:2005 Table 3.1 recommended gamma_Mf, from memory ([M] in
    # REFERENCES.md): damage tolerant 1.00 / 1.15, safe life 1.15 / 1.35.
    assert partial_factor_fatigue_strength("damage tolerant", "low") == 1.00
    assert partial_factor_fatigue_strength("damage tolerant", "high") == 1.15
    assert partial_factor_fatigue_strength("safe life", "low") == 1.15
    assert partial_factor_fatigue_strength("safe life", "high") == 1.35
    with pytest.raises(
        ValueError, match=r"^unknown assessment 'safe' with consequence 'low'; valid: "
    ):
        partial_factor_fatigue_strength("safe", "low")


# ---------------------------------------------------------------- mean stress


def test_goodman_against_fatpack():
    # fatpack.find_goodman_equivalent_stress: S / (1 - Sm / su), an independent
    # implementation of the Goodman line (tensile means; same arithmetic, 1e-14).
    rng = np.random.default_rng(8)
    s = rng.uniform(1, 300, 50) * MPA
    sm = rng.uniform(0.01, 400, 50) * MPA
    np.testing.assert_allclose(
        mean_stress_goodman(s, sm, 500 * MPA),
        fatpack.find_goodman_equivalent_stress(s, sm, 500 * MPA),
        rtol=1e-14,
    )


def test_gerber_and_goodman_closed_forms():
    # Shigley (10th ed.) sec. 6-12 forms (section from memory): Goodman S/(1 - Sm/Su),
    # Gerber S/(1 - (Sm/Su)^2):
    # Sm = Su/2 gives 2 S and 4/3 S. No credit for compressive means (common practice).
    assert mean_stress_goodman(100e6, 250e6, 500e6) == pytest.approx(200e6, rel=1e-15)
    assert mean_stress_gerber(100e6, 250e6, 500e6) == pytest.approx(100e6 / 0.75, rel=1e-15)
    assert mean_stress_goodman(100e6, -250e6, 500e6) == 100e6
    assert mean_stress_gerber(100e6, -250e6, 500e6) == 100e6
    with pytest.raises(
        ValueError,
        match=r"^mean stress must be below the ultimate strength 5e\+08 Pa, got 6e\+08 Pa$",
    ):
        mean_stress_goodman(100e6, 600e6, 500e6)


def test_en1993_sixty_percent_of_compression():
    # EN 1993-1-9 7.2.1 (from memory): tension part in full, 60 % of the compression
    # part, for non-welded or stress-relieved details. Three closed-form cases.
    s = 100e6
    assert mean_stress_en1993_compression(s, 50e6) == pytest.approx(100e6)  # all tension
    assert mean_stress_en1993_compression(s, -50e6) == pytest.approx(60e6)  # all compression
    assert mean_stress_en1993_compression(s, 0.0) == pytest.approx(80e6)  # R = -1


def test_docstring_examples_run():
    # The Examples sections of the module's docstrings are run, so they cannot drift.
    result = doctest.testmod(sn_curves)
    assert result.failed == 0 and result.attempted >= 5


# ------------------------------------------------- shear curves, size and thickness


@pytest.mark.parametrize("category", [100, 80])
def test_shear_curves_against_fatpack_linear_curve_and_the_closed_form(category):
    # EN 1993-1-9:2005 Fig. 7.2 (from memory): delta_tau^5 N = delta_tau_C^5 2e6 down to
    # the cut-off delta_tau_L = (2/100)^(1/5) delta_tau_C at 1e8. fatpack's
    # LinearEnduranceCurve (slope 5 through Sc at 2e6 by default) is the same straight
    # line, written independently: equal to 1e-12 above the cut-off.
    from vcheck.dynamics.fatigue.sn_curves import EN1993ShearCurve

    curve = sn_curve(f"EN 1993-1-9:shear-{category}")
    assert isinstance(curve, EN1993ShearCurve)
    reference = fatpack.LinearEnduranceCurve(float(category))
    assert reference.m == 5.0 and reference.Nc == 2e6
    cut_off = (2 / 100) ** 0.2 * category
    assert curve.cut_off_limit / MPA == pytest.approx(cut_off, rel=1e-12)
    for s in (1.5 * category, category, 0.7 * category, 1.001 * cut_off):
        assert curve.cycles_variable_amplitude(s * MPA) == pytest.approx(
            reference.get_endurance(s), rel=1e-12)
        assert curve.cycles_constant_amplitude(s * MPA) == curve.cycles_variable_amplitude(s * MPA)
    assert math.isinf(curve.cycles_variable_amplitude(0.999 * cut_off * MPA))
    assert curve.cycles_variable_amplitude(cut_off * 1.0000001 * MPA) == pytest.approx(1e8, rel=1e-5)


def test_size_reduction_and_thickness_correction_by_hand():
    # EN 1993-1-9:2005 Table 8.3 / 8.1 (from memory): k_s = (25/t)^0.2 for t > 25 mm,
    # (30/d)^0.25 for d > 30 mm; IIW (Hobbacher 2016, from memory): f(t) = (25/t)^n.
    from vcheck.dynamics.fatigue.sn_curves import (
        ScaledCurve,
        size_reduction_en1993,
        thickness_correction_iiw,
    )

    assert size_reduction_en1993("transverse-butt-weld", 0.040) == pytest.approx((25 / 40) ** 0.2)
    assert size_reduction_en1993("transverse-butt-weld", 0.020) == 1.0
    assert size_reduction_en1993("bolt-in-tension", 0.036) == pytest.approx((30 / 36) ** 0.25)
    assert thickness_correction_iiw(0.050, 0.3) == pytest.approx(0.5**0.3)
    assert thickness_correction_iiw(0.020, 0.3) == 1.0
    with pytest.raises(ValueError, match="^the thickness exponent must be from 0 to 1, got 2$"):
        thickness_correction_iiw(0.05, 2)
    # the scaled curve is the base curve at ranges divided by the factor (every branch
    # scales: EN 1993-1-9 writes delta_sigma_C,red = k_s delta_sigma_C)
    base = sn_curve("EN 1993-1-9:71")
    k = (25 / 40) ** 0.2
    scaled = ScaledCurve(base, k, "k_s")
    s = np.array([100.0, 60.0, 40.0, 30.0, 20.0]) * MPA
    assert np.allclose(scaled.cycles_variable_amplitude(s), base.cycles_variable_amplitude(s / k),
                       rtol=1e-12)
    assert np.allclose(scaled.cycles_constant_amplitude(s), base.cycles_constant_amplitude(s / k),
                       rtol=1e-12)
    assert scaled.constant_amplitude_fatigue_limit == pytest.approx(
        k * base.constant_amplitude_fatigue_limit)

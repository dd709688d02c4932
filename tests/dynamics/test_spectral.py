"""Spectral fatigue against PyPI FLife, closed forms, time-domain rainflow counts of
simulated Gaussian histories, and numerical integration (Miles' equation)."""

from __future__ import annotations

import doctest
import math

import fatpack
import FLife
import numpy as np
import pytest
from scipy.integrate import quad

from vcheck.dynamics.fatigue import spectral as sp
from vcheck.dynamics.fatigue.rainflow import rainflow_cycles
from vcheck.dynamics.fatigue.sn_curves import PiecewiseLogLogCurve, sn_curve

MPA = 1e6
G0 = 9.80665  # standard gravity [m/s^2] (CGPM 1901)

# Category 71 as a one-slope range curve: N S^3 = C with C = 2e6 * (71 MPa)^3 = 7.158e29
# Pa^3 (EN 1993-1-9 m = 3 branch; REFERENCES.md [D] uses it for the narrow-band check).
K = 3.0
C71 = 2e6 * (71 * MPA) ** 3


def flat_band(f_lo, f_hi, level=1.0 * MPA**2, points=5001):
    f = np.linspace(f_lo, f_hi, points)
    return f, np.full_like(f, level)


def bimodal_table():
    # Two flat bands on a 0.5 Hz grid from 0 to 300 Hz (20-60 Hz at 0.125 and 100-120 Hz
    # at 0.1 MPa^2/Hz): a broad-band, two-peaked stress.
    f = np.arange(0.0, 300.5, 0.5)
    g = np.where((f >= 20) & (f <= 60), 0.125, 0.0) + np.where((f >= 100) & (f <= 120), 0.1, 0.0)
    return f, g * MPA**2


def flife_data(f, g, points_per_step=40):
    """FLife's view of the same PSD. vcheck integrates the table exactly with G linear
    between its points; FLife applies the trapezoid rule to the points it is given. So
    FLife gets the table resampled 40 times finer (linear interpolation, the same G):
    its trapezoid error is then about (1/40)^2 / 12 of a step's curvature term, which is
    why the comparisons below allow 1e-6 where the arithmetic alone would give 1e-12."""
    fine = np.concatenate([np.linspace(a, b, points_per_step, endpoint=False)
                           for a, b in zip(f[:-1], f[1:])] + [f[-1:]])
    return FLife.SpectralData(input={"PSD": np.interp(fine, f, g), "f": fine})


# ------------------------------------------------------------------ moments


def test_flat_band_moments_and_irregularity():
    # Flat 1 MPa^2/Hz from 50 to 100 Hz ([D] in REFERENCES.md): m0 = 50, m2 = 2.9167e5,
    # m4 = 1.9375e9, alpha_2 = 0.9371. Figures printed to 5 and 4 digits: rel 2e-5 and
    # abs 5e-5; the trapezoid error on the 0.01 Hz table is below 1e-8 relative.
    f, g = flat_band(50.0, 100.0)
    m0, m1, m2, m4 = sp.spectral_moments(f, g)
    assert m0 / MPA**2 == pytest.approx(50.0, rel=1e-12)
    assert m1 / MPA**2 == pytest.approx((100**2 - 50**2) / 2, rel=1e-12)
    assert m2 / MPA**2 == pytest.approx(2.9167e5, rel=2e-5)
    assert m4 / MPA**2 == pytest.approx(1.9375e9, rel=2e-5)
    assert sp.irregularity_factor(m0, m2, m4) == pytest.approx(0.9371, abs=5e-5)


def test_moments_and_rates_against_flife():
    # FLife integrates (2 pi f)^n G with the trapezoid rule (on the finely resampled
    # table, see flife_data): its moments are ours times (2 pi)^n; the rates are in Hz
    # in both. Tolerance 1e-6 from the resampling.
    f, g = bimodal_table()
    data = flife_data(f, g)
    m0, m1, m2, m4 = sp.spectral_moments(f, g)
    for ours, n in ((m0, 0), (m1, 1), (m2, 2), (m4, 4)):
        assert ours * (2 * math.pi) ** n == pytest.approx(data.moments[n], rel=1e-6)
    assert sp.zero_upcrossing_rate(m0, m2) == pytest.approx(data.nu, rel=1e-6)
    assert sp.peak_rate(m2, m4) == pytest.approx(data.m_p, rel=1e-6)
    assert sp.irregularity_factor(m0, m2, m4) == pytest.approx(data.alpha2, rel=1e-6)


# ----------------------------------------------------------------- narrow band


def test_narrow_band_reference_value():
    # [D] in REFERENCES.md: sigma = 10 MPa RMS, nu_0+ = 100 Hz, T = 3600 s, k = 3,
    # C = 2e6 * 71^3 -> D = 0.01513. A flat band 100 +- 0.001 Hz has m0 = 100 MPa^2 and
    # nu_0+ = 100 Hz to 3e-11 (m2/m0 = 100^2 + a^2/3). Tolerance: half a unit of the
    # printed 4th significant digit.
    a = 1e-3
    f = np.array([100.0 - a, 100.0 + a])
    g = np.full(2, 100.0 * MPA**2 / (2 * a))
    assert sp.damage_narrow_band(f, g, 3600.0, K, C71) == pytest.approx(0.01513, abs=5e-6)


def test_narrow_band_equals_a_sine_for_slope_two():
    # Closed form: for k = 2 the narrow-band formula gives nu T (2 sqrt(2 m0))^2 / C,
    # the damage of a sine of amplitude A = sqrt(2 m0) at the same frequency, since a
    # Rayleigh amplitude has E[a^2] = 2 m0 = A^2. Sine: f T (2 A)^2 / C.
    amplitude, f0, t = 30 * MPA, 50.0, 600.0
    a = 1e-4
    f = np.array([f0 - a, f0 + a])
    g = np.full(2, amplitude**2 / 2 / (2 * a))
    c2 = 1e20
    sine = f0 * t * (2 * amplitude) ** 2 / c2
    assert sp.damage_narrow_band(f, g, t, 2.0, c2) == pytest.approx(sine, rel=1e-9)


@pytest.mark.parametrize("k", [3.0, 5.0])
def test_narrow_band_and_dirlik_against_flife(k):
    # FLife.Narrowband and FLife.Dirlik (closed forms, integrate_pdf=False) with FLife's
    # amplitude-based constant C_a = C / 2^k; life in seconds, damage = T / life. Same
    # formulas on moments that agree to the resampling (flife_data): 1e-6.
    f, g = bimodal_table()
    data = flife_data(f, g)
    t = 3600.0
    c_range = 1e31 if k == 3.0 else 1e47
    c_amplitude = c_range / 2**k
    nb = t / FLife.Narrowband(data).get_life(c_amplitude, k)
    dk = t / FLife.Dirlik(data).get_life(c_amplitude, k)
    assert sp.damage_narrow_band(f, g, t, k, c_range) == pytest.approx(nb, rel=1e-6)
    assert sp.damage_dirlik(f, g, t, k, c_range) == pytest.approx(dk, rel=1e-6)


def test_dirlik_range_density_against_flife():
    # FLife's Dirlik density is in amplitudes s = S / 2: p_S(S) = p_a(S / 2) / 2.
    f, g = bimodal_table()
    data = flife_data(f, g)
    m0, m1, m2, m4 = sp.spectral_moments(f, g)
    s = np.linspace(0.0, 12 * math.sqrt(m0), 200)
    np.testing.assert_allclose(
        sp.range_pdf_dirlik(s, m0, m1, m2, m4), FLife.Dirlik(data).get_PDF(s / 2) / 2, rtol=1e-7
    )
    # a density: unit area (Dirlik's weights sum to 1), to quadrature accuracy
    area, _ = quad(
        lambda x: sp.range_pdf_dirlik(x, m0, m1, m2, m4), 0, 40 * math.sqrt(m0), limit=200
    )
    assert area == pytest.approx(1.0, abs=1e-8)


def test_dirlik_over_narrow_band_for_the_flat_band():
    # [D] in REFERENCES.md: flat 50-100 Hz, k = 3: Dirlik / narrow band = 0.970
    # (3 decimals: 5e-4).
    f, g = flat_band(50.0, 100.0)
    ratio = sp.damage_dirlik(f, g, 1.0, K, C71) / sp.damage_narrow_band(f, g, 1.0, K, C71)
    assert ratio == pytest.approx(0.970, abs=5e-4)


def test_dirlik_tends_to_narrow_band_for_a_spectral_line():
    # Limiting case: as the band narrows, alpha_2 -> 1, D1 -> 0, D3 -> 1 and Dirlik's
    # density becomes the Rayleigh one (Dirlik 1985). 100 Hz +- 1e-4 Hz: 1 - alpha_2 is
    # 2e-12, and rounding leaves Q < 0 (the exponential term is dropped); both the
    # closed form with a fractional slope and the curve integration equal the
    # narrow-band result to 1e-9.
    a = 1e-4
    f = np.array([100.0 - a, 100.0 + a])
    g = np.full(2, (30 * MPA) ** 2 / (2 * a))
    assert sp.damage_dirlik(f, g, 3600.0, 3.5, 1e30) == pytest.approx(
        sp.damage_narrow_band(f, g, 3600.0, 3.5, 1e30), rel=1e-9
    )
    curve = sn_curve("EN 1993-1-9:71")
    assert sp.damage_dirlik_curve(f, g, 3600.0, curve) == pytest.approx(
        sp.damage_narrow_band_curve(f, g, 3600.0, curve), rel=1e-9
    )


# ------------------------------------------------------------ time-domain check


def gaussian_history(f_lo, f_hi, level, fs, n, seed):
    """A stationary Gaussian history with a flat one-sided PSD on [f_lo, f_hi]: a sum of
    cosines at the FFT bin frequencies, amplitude sqrt(2 G df), random phases."""
    rng = np.random.default_rng(seed)
    f = np.fft.rfftfreq(n, 1.0 / fs)
    g = np.where((f >= f_lo) & (f <= f_hi), level, 0.0)
    amplitude = np.sqrt(2.0 * g * f[1])
    spectrum = n * amplitude / 2.0 * np.exp(2j * np.pi * rng.random(f.size))
    return np.fft.irfft(spectrum, n=n)


@pytest.mark.parametrize(
    ("band", "method"),
    [((50.0, 100.0), sp.damage_dirlik), ((95.0, 105.0), sp.damage_narrow_band)],
)
def test_spectral_damage_against_rainflow_of_a_simulated_history(band, method):
    # Independent check of the whole chain: 512 s of a Gaussian history sampled at
    # 8192 Hz (peaks of a 100 Hz wave caught to 0.07 %), rainflow counted (ASTM E1049)
    # and summed with N S^3 = C. Dirlik's density was fitted to such rainflow counts
    # (Dirlik 1985) and the Rayleigh formula is exact for a narrow band. Over four seeds
    # the ratio stayed within 1 % of 1 here; 3 % leaves room for the seed and for
    # Dirlik's fit error.
    level = 1.0 * MPA**2
    fs, n = 8192.0, 2**22
    x = gaussian_history(*band, level, fs, n, seed=2)
    ranges, _, counts = rainflow_cycles(x)
    time_domain = float(np.sum(counts * ranges**K)) / C71
    f, g = flat_band(*band, level=level, points=2001)
    assert method(f, g, n / fs, K, C71) == pytest.approx(time_domain, rel=0.03)


# ---------------------------------------------------------------- three bands


def test_three_band_shares_are_gaussian_band_probabilities():
    # Steinberg (3rd ed.): 68.3 / 27.1 / 4.33 % ([C]); exact Gaussian shares of
    # |x| < 1, 1-2, 2-3 sigma are 68.27 / 27.18 / 4.28 % ([D]); the rounded shares are
    # within 0.1 percentage point of them and add up to P(|x| < 3) = 99.73 %.
    shares = [p for _, p in sp.STEINBERG_THREE_BAND]
    gauss = [
        math.erf(1 / math.sqrt(2)),
        math.erf(2 / math.sqrt(2)) - math.erf(1 / math.sqrt(2)),
        math.erf(3 / math.sqrt(2)) - math.erf(2 / math.sqrt(2)),
    ]
    assert shares == [0.683, 0.271, 0.0433]
    np.testing.assert_allclose(shares, gauss, atol=1e-3)
    assert sum(shares) == pytest.approx(math.erf(3 / math.sqrt(2)), abs=1e-4)


def test_three_band_scaling_and_curve_form():
    # D = nu_0+ T sum p_i (2 i sigma)^k / C: doubling sigma multiplies D by 2^k; the
    # curve version with the same one-slope curve gives the same number.
    f, g = flat_band(50.0, 100.0)
    d1 = sp.damage_three_band(f, g, 3600.0, K, C71)
    d2 = sp.damage_three_band(f, 4 * g, 3600.0, K, C71)
    assert d2 == pytest.approx(2**K * d1, rel=1e-12)
    one_slope = PiecewiseLogLogCurve(
        [2e6, 2e7], [71 * MPA, 71 * MPA * 10 ** (-1 / 3)], extend_below=True
    )
    assert sp.damage_three_band_curve(f, g, 3600.0, one_slope) == pytest.approx(d1, rel=1e-12)


# ---------------------------------------------------- integration against curves


def test_curve_integration_equals_closed_forms_for_one_slope():
    # With a one-slope curve the numerical integration of the density must reproduce
    # the closed forms (quad at relative accuracy 1e-10).
    f, g = bimodal_table()
    one_slope = PiecewiseLogLogCurve(
        [2e6, 2e7], [71 * MPA, 71 * MPA * 10 ** (-1 / 3)], extend_below=True
    )
    assert sp.damage_narrow_band_curve(f, g, 3600.0, one_slope) == pytest.approx(
        sp.damage_narrow_band(f, g, 3600.0, K, C71), rel=1e-8
    )
    assert sp.damage_dirlik_curve(f, g, 3600.0, one_slope) == pytest.approx(
        sp.damage_dirlik(f, g, 3600.0, K, C71), rel=1e-8
    )


def test_dirlik_against_en1993_curve_by_independent_quadrature():
    # Independent route: FLife's Dirlik density (amplitudes) on a fine grid, fatpack's
    # Eurocode-like TriLinearEnduranceCurve(71) for N, trapezoid sum, times the peak rate
    # from FLife. 400 000 grid steps up to 16 standard deviations of range; the
    # integrand jumps at the cut-off, so the grid error is about one step of the
    # integrand there: 1e-5 relative.
    f, g = bimodal_table()
    g = g * 10.0  # sigma = 8.4 MPa: most damage from ranges near the knees (52, 29 MPa)
    data = flife_data(f, g)
    sigma = math.sqrt(data.moments[0])
    s = np.linspace(1e-9, 16 * 2 * sigma, 400_001)  # ranges [Pa]
    pdf = FLife.Dirlik(data).get_PDF(s / 2) / 2
    n = fatpack.TriLinearEnduranceCurve(71.0).get_endurance(s / MPA)
    integrand = np.where(np.isinf(n), 0.0, pdf / n)
    expected = data.m_p * 3600.0 * float(np.sum((integrand[1:] + integrand[:-1]) * np.diff(s)) / 2)
    got = sp.damage_dirlik_curve(f, g, 3600.0, sn_curve("EN 1993-1-9:71"))
    assert got == pytest.approx(expected, rel=1e-5)
    # the m = 5 branch and the cut-off matter here: the m = 3 line alone gives more
    assert got < 0.5 * sp.damage_dirlik(f, g, 3600.0, K, C71)


def test_low_stress_below_cut_off_does_no_damage_on_a_curve():
    # sigma = 0.1 MPa: ranges of more than 16 sigma have probability e^-32; everything
    # below delta_sigma_L = 28.7 MPa of category 71 -> zero damage (EN 1993-1-9 7.1).
    f, g = flat_band(50.0, 100.0, level=0.0002 * MPA**2)
    curve = sn_curve("EN 1993-1-9:71")
    assert sp.damage_narrow_band_curve(f, g, 3600.0, curve) == 0.0
    assert sp.damage_dirlik_curve(f, g, 3600.0, curve) == 0.0
    assert sp.damage_three_band_curve(f, g, 3600.0, curve) == 0.0


def test_zero_psd_and_zero_duration_give_zero_damage():
    f = np.array([10.0, 20.0])
    assert sp.damage_dirlik(f, np.zeros(2), 3600.0, K, C71) == 0.0
    fb, gb = flat_band(50.0, 100.0)
    assert sp.damage_narrow_band(fb, gb, 0.0, K, C71) == 0.0


# ----------------------------------------------------------------------- Miles


def test_miles_reference_value():
    # [D] in REFERENCES.md: fn = 100 Hz, Q = 10, 0.04 g^2/Hz -> 7.927 g (3 decimals).
    grms = sp.miles_rms_response(100.0, 10.0, 0.04 * G0**2) / G0
    assert grms == pytest.approx(7.927, abs=5e-4)


def test_miles_against_numerical_integration():
    # Miles (1954): G_rms^2 = integral |H|^2 ASD df over all f for a flat ASD, with
    # |H|^2 = 1/((1 - r^2)^2 + (2 zeta r)^2). Integrated here with scipy quad (split at
    # resonance; 1e-9). The absolute acceleration's |H|^2 has (1 + (2 zeta r)^2) on top:
    # its integral is larger by exactly (1 + 4 zeta^2) (closed form), 1.01 at Q = 10.
    fn, q, asd = 100.0, 10.0, 0.04 * G0**2
    zeta = 1.0 / (2.0 * q)

    def relative(f):
        r = f / fn
        return asd / ((1 - r * r) ** 2 + (2 * zeta * r) ** 2)

    def absolute(f):
        r = f / fn
        return relative(f) * (1 + (2 * zeta * r) ** 2)

    def integrate(func):
        parts = [(0.0, 0.8 * fn), (0.8 * fn, 1.2 * fn), (1.2 * fn, 10 * fn), (10 * fn, np.inf)]
        return sum(quad(func, a, b, epsabs=0, epsrel=1e-12, limit=500)[0] for a, b in parts)

    miles = sp.miles_rms_response(fn, q, asd)
    assert math.sqrt(integrate(relative)) == pytest.approx(miles, rel=1e-9)
    assert math.sqrt(integrate(absolute)) == pytest.approx(
        miles * math.sqrt(1 + 4 * zeta**2), rel=1e-9
    )


def test_miles_vectorised():
    fn = np.array([50.0, 100.0, 200.0])
    out = sp.miles_rms_response(fn, 10.0, 1.0)
    np.testing.assert_allclose(out, np.sqrt(np.pi / 2 * fn * 10.0), rtol=1e-15)
    with pytest.raises(ValueError, match=r"^quality factor must be positive, got 0$"):
        sp.miles_rms_response(100.0, 0.0, 1.0)


# ------------------------------------------------------------------- bad input


def test_psd_with_non_increasing_frequencies_is_rejected():
    with pytest.raises(
        ValueError, match=r"^frequencies must be strictly increasing, got 50 Hz after 50 Hz$"
    ):
        sp.spectral_moments([10.0, 50.0, 50.0, 80.0], [1.0, 1.0, 1.0, 1.0])
    with pytest.raises(
        ValueError, match=r"^frequencies must be strictly increasing, got 40 Hz after 50 Hz$"
    ):
        sp.damage_dirlik([10.0, 50.0, 40.0], [1.0, 1.0, 1.0], 1.0, K, C71)


def test_negative_psd_values_are_rejected():
    with pytest.raises(
        ValueError, match=r"^PSD values must be zero or positive, got -1 Pa\^2/Hz at 60 Hz$"
    ):
        sp.damage_narrow_band([50.0, 60.0, 70.0], [1.0, -1.0, 1.0], 1.0, K, C71)


def test_other_bad_tables_and_arguments():
    with pytest.raises(
        ValueError,
        match=r"^a PSD table needs one-dimensional frequency and PSD arrays of equal length, "
        r"at least two points, got shapes \(3,\) and \(2,\)$",
    ):
        sp.spectral_moments([1.0, 2.0, 3.0], [1.0, 1.0])
    with pytest.raises(ValueError, match=r"^frequencies must be zero or positive, got -1 Hz$"):
        sp.spectral_moments([-1.0, 2.0], [1.0, 1.0])
    with pytest.raises(ValueError, match=r"^duration must be zero or positive, got -1 s$"):
        sp.damage_dirlik([1.0, 2.0], [1.0, 1.0], -1.0, K, C71)
    with pytest.raises(ValueError, match=r"^S-N slope must be positive, got 0$"):
        sp.damage_narrow_band([1.0, 2.0], [1.0, 1.0], 1.0, 0.0, C71)


def test_docstring_examples_run():
    # The Examples sections of the module's docstrings are run, so they cannot drift.
    result = doctest.testmod(sp)
    assert result.failed == 0 and result.attempted >= 3


def test_moments_are_exact_for_a_linear_table():
    # A PSD given by breakpoints is linear between them; its moments are exact
    # polynomial integrals (closed form): G = (f - 10) / 10 on 10..20 Hz gives
    # m0 = 5, m1 = (1/10)[f^3/3 - 5 f^2] = 83.333, m2 = (1/10)[f^4/4 - 10 f^3/3] = 1416.667.
    m0, m1, m2, _ = sp.spectral_moments([10.0, 20.0], [0.0, 1.0])
    assert (m0, m1, m2) == pytest.approx((5.0, 250.0 / 3.0, 4250.0 / 3.0), rel=1e-13)
    with pytest.raises(ValueError, match="the order of a spectral moment must be zero or "
                                         "positive, got -1"):
        sp.spectral_moment([10.0, 20.0], [0.0, 1.0], -1)


@pytest.mark.parametrize("points", [1, 2, 5, 16, 40])
def test_gauss_legendre_rule_against_numpy(points):
    # Reference: numpy.polynomial.legendre.leggauss (an independent implementation).
    from vcheck.dynamics.fatigue.spectral import gauss_legendre

    nodes, weights = gauss_legendre(points)
    ref_nodes, ref_weights = np.polynomial.legendre.leggauss(points)
    np.testing.assert_allclose(nodes, ref_nodes, rtol=0, atol=1e-14)
    np.testing.assert_allclose(weights, ref_weights, rtol=0, atol=1e-14)


def test_the_four_moments_together_are_each_moment_alone_bit_for_bit():
    # Reference: spectral_moment, one order at a time, and the closed form of a flat
    # PSD (m_n = G (f2^(n+1) - f1^(n+1)) / (n + 1)); together the slopes and the
    # integrals of powers of f are worked out once, which must not change a bit.
    rng = np.random.default_rng(20)
    f = np.cumsum(rng.uniform(0.1, 3.0, 400))
    g = rng.uniform(0.0, 2e12, 400)
    together = sp.spectral_moments(f, g)
    assert together == tuple(sp.spectral_moment(f, g, n) for n in (0, 1, 2, 4))
    flat = sp.spectral_moments([50.0, 100.0], [1.0, 1.0])
    assert flat == pytest.approx([50.0, (100**2 - 50**2) / 2, (100**3 - 50**3) / 3,
                                  (100**5 - 50**5) / 5], rel=1e-14)

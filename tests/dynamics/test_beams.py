"""Euler-Bernoulli beam frequencies against handbook constants, closed forms and an
independent finite-element model."""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.linalg import eigh

from vcheck.dynamics.modes import beams

# Blevins, Formulas for Natural Frequency and Mode Shape (Van Nostrand Reinhold 1979,
# Krieger reprint 2001), ch. 8, single-span beam table (table number from memory).
# Printed to six decimals, so the tolerance is half a unit in the last place.
BLEVINS_BETA_L = {
    "cantilever": (1.875104, 4.694091, 7.854757),
    "simply-supported": (math.pi, 2 * math.pi, 3 * math.pi),
    "fixed-fixed": (4.730041, 7.853205, 10.995608),
    "free-free": (4.730041, 7.853205, 10.995608),
    "fixed-pinned": (3.926602, 7.068583, 10.210176),
}

STEEL = dict(youngs_modulus=210e9, density=7850.0)


# ---------------------------------------------------------- independent FE model
# Cubic Hermite beam elements with consistent mass (the standard displacement-based
# element, e.g. Cook, Malkus, Plesha, Concepts and Applications of Finite Element
# Analysis, 4th ed., sec. 11.3). Built here only for the tests; it shares no code with
# vcheck.dynamics.modes.beams. Its frequency error falls as (beta h)^4, below 1e-6 for the
# first three modes with 60 elements.


def fe_beam_frequencies(end_condition, e, i, mu, length, n_modes, n_el=60, point_masses=()):
    h = length / n_el
    k_el = (e * i / h**3) * np.array(
        [
            [12, 6 * h, -12, 6 * h],
            [6 * h, 4 * h * h, -6 * h, 2 * h * h],
            [-12, -6 * h, 12, -6 * h],
            [6 * h, 2 * h * h, -6 * h, 4 * h * h],
        ]
    )
    m_el = (mu * h / 420.0) * np.array(
        [
            [156, 22 * h, 54, -13 * h],
            [22 * h, 4 * h * h, 13 * h, -3 * h * h],
            [54, 13 * h, 156, -22 * h],
            [-13 * h, -3 * h * h, -22 * h, 4 * h * h],
        ]
    )
    n_dof = 2 * (n_el + 1)
    k = np.zeros((n_dof, n_dof))
    m = np.zeros((n_dof, n_dof))
    for el in range(n_el):
        s = slice(2 * el, 2 * el + 4)
        k[s, s] += k_el
        m[s, s] += m_el
    for node, mass in point_masses:  # translational DOF of a node
        m[2 * node, 2 * node] += mass
    last = 2 * n_el
    fixed = {
        "cantilever": [0, 1],
        "simply-supported": [0, last],
        "fixed-fixed": [0, 1, last, last + 1],
        "fixed-pinned": [0, 1, last],
        "free-free": [],
    }[end_condition]
    keep = [d for d in range(n_dof) if d not in fixed]
    w2 = eigh(k[np.ix_(keep, keep)], m[np.ix_(keep, keep)], eigvals_only=True)
    f = np.sqrt(np.clip(w2, 0, None)) / (2 * np.pi)
    if end_condition == "free-free":
        f = f[2:]  # two rigid-body modes
    return f[:n_modes]


# ---------------------------------------------------------------- constants


@pytest.mark.parametrize("end_condition", sorted(BLEVINS_BETA_L))
def test_eigenvalue_constants_match_blevins_table(end_condition):
    # Blevins (1979) ch. 8 beam table, six decimals -> tolerance 5e-7.
    got = beams.beam_eigenvalue_constants(end_condition, 3)
    np.testing.assert_allclose(got, BLEVINS_BETA_L[end_condition], rtol=0, atol=5e-7)


@pytest.mark.parametrize(
    "end_condition, asymptote",
    [
        ("cantilever", lambda i: (2 * i - 1) * math.pi / 2),
        ("fixed-fixed", lambda i: (2 * i + 1) * math.pi / 2),
        ("free-free", lambda i: (2 * i + 1) * math.pi / 2),
        ("fixed-pinned", lambda i: (4 * i + 1) * math.pi / 4),
    ],
)
def test_high_mode_constants_approach_asymptotic_form(end_condition, asymptote):
    # Closed-form asymptotes of the characteristic equations (Blevins 1979 ch. 8 gives
    # them for i > 3); the gap shrinks like exp(-x), so at mode 20 and beyond only
    # round-off remains (tolerance 1e-12 relative).
    got = beams.beam_eigenvalue_constants(end_condition, 200)
    i = np.arange(1, 201)
    want = asymptote(i)
    np.testing.assert_allclose(got[19:], want[19:], rtol=1e-12)
    # and the constants are not merely the asymptotes for the first mode
    assert abs(got[0] - want[0]) > 1e-4


def test_constants_are_cached_and_not_aliased():
    a = beams.beam_eigenvalue_constants("cantilever", 4)
    a[0] = -1.0  # a caller's edit must not corrupt the cache
    b = beams.beam_eigenvalue_constants("cantilever", 4)
    assert b[0] == pytest.approx(1.875104, abs=5e-7)


# ---------------------------------------------------------------- frequencies


def test_steel_cantilever_fundamental():
    # REFERENCES.md [D]: L = 1 m, 50 x 50 mm, E = 210 GPa, rho = 7850 -> 41.77 Hz
    # (exact arithmetic gives 41.776 Hz; 0.01 Hz covers the rounding of the quoted
    # figure). A public page quoting ~209 Hz is wrong.
    mu = beams.beam_mass_per_length(STEEL["density"], 0.05 * 0.05)
    f = beams.beam_natural_frequencies("cantilever", 210e9, 0.05**4 / 12, mu, 1.0, 1)
    assert f.shape == (1,)
    assert f[0] == pytest.approx(41.77, abs=0.01)


@pytest.mark.parametrize("end_condition", sorted(BLEVINS_BETA_L))
def test_frequencies_match_finite_element_model(end_condition):
    # Independent numerical method: 60 Hermite elements (error < 1e-6 for 3 modes);
    # tolerance 1e-5 relative.
    e, i, mu, length = 200e9, 8.0e-6, 30.0, 2.5
    got = beams.beam_natural_frequencies(end_condition, e, i, mu, length, 3)
    want = fe_beam_frequencies(end_condition, e, i, mu, length, 3)
    np.testing.assert_allclose(got, want, rtol=1e-5)


def test_aliases_mean_the_same_model():
    args = (210e9, 1e-6, 10.0, 1.2, 4)
    for alias, name in [
        ("clamped-free", "cantilever"),
        ("pinned-pinned", "simply-supported"),
        ("clamped-clamped", "fixed-fixed"),
        ("clamped-pinned", "fixed-pinned"),
    ]:
        np.testing.assert_array_equal(
            beams.beam_natural_frequencies(alias, *args),
            beams.beam_natural_frequencies(name, *args),
        )


def test_arrays_broadcast_and_equal_scalar_calls():
    lengths = np.array([0.5, 1.0, 2.0])
    got = beams.beam_natural_frequencies("fixed-fixed", 70e9, 2e-7, 5.4, lengths, 2)
    assert got.shape == (3, 2)
    for k, ell in enumerate(lengths):
        np.testing.assert_allclose(
            got[k], beams.beam_natural_frequencies("fixed-fixed", 70e9, 2e-7, 5.4, ell, 2)
        )
    # f scales as 1 / L^2 (closed form)
    np.testing.assert_allclose(got[0] / got[1], 4.0)


# ---------------------------------------------------------- cantilever + tip mass


def _cantilever_case():
    mu = beams.beam_mass_per_length(STEEL["density"], 0.05 * 0.05)
    return dict(youngs_modulus=210e9, second_moment=0.05**4 / 12, mass_per_length=mu, length=1.0)


def test_tip_mass_exact_with_no_mass_is_the_cantilever():
    c = _cantilever_case()
    got = beams.cantilever_tip_mass_exact(**c, tip_mass=0.0, n_modes=3)
    want = beams.beam_natural_frequencies("cantilever", *c.values(), n_modes=3)
    np.testing.assert_allclose(got, want, rtol=1e-14)


def test_tip_mass_rayleigh_with_no_mass_overestimates_by_one_and_a_half_percent():
    # REFERENCES.md [D], Rayleigh with 33/140 of the beam mass (Thomson & Dahleh,
    # Theory of Vibration with Applications, 5th ed., sec. 2.5, from memory):
    # sqrt(420/33) / 1.875104^2 - 1 = 1.464 %. The bound is one-sided (Rayleigh's
    # quotient is an upper bound), so the window is narrow: 1.4 % .. 1.5 %.
    c = _cantilever_case()
    ratio = (
        beams.cantilever_tip_mass_rayleigh(**c, tip_mass=0.0)
        / (beams.cantilever_tip_mass_exact(**c, tip_mass=0.0)[0])
    )
    assert 1.014 < ratio < 1.015


def test_tip_mass_rayleigh_and_exact_converge_for_a_heavy_mass():
    # As M / m_beam grows the beam acts as a massless spring 3EI/L^3 and Rayleigh's
    # estimate becomes exact (Thomson & Dahleh sec. 2.5, from memory). The gap must
    # shrink steadily and be below 1e-4 at M = 100 m_beam.
    c = _cantilever_case()
    m_beam = c["mass_per_length"] * c["length"]
    ratios = np.array([0.1, 1.0, 10.0, 100.0, 1000.0])
    exact = beams.cantilever_tip_mass_exact(**c, tip_mass=ratios * m_beam)[:, 0]
    rayleigh = beams.cantilever_tip_mass_rayleigh(**c, tip_mass=ratios * m_beam)
    gap = rayleigh / exact - 1.0
    assert np.all(gap > 0)  # upper bound
    assert np.all(np.diff(gap) < 0)
    assert gap[3] < 1e-4
    # and the heavy-mass limit is the massless-spring frequency itself
    k = 3 * c["youngs_modulus"] * c["second_moment"] / c["length"] ** 3
    assert exact[-1] == pytest.approx(math.sqrt(k / (1000 * m_beam)) / (2 * math.pi), rel=2e-4)


@pytest.mark.parametrize("mass_ratio", [0.2, 1.0, 5.0])
def test_tip_mass_exact_matches_finite_element_model(mass_ratio):
    # Independent numerical method: the FE beam above with the point mass added to the
    # tip's translational DOF; tolerance 1e-5 as for the plain beams.
    c = _cantilever_case()
    m = mass_ratio * c["mass_per_length"] * c["length"]
    got = beams.cantilever_tip_mass_exact(**c, tip_mass=m, n_modes=3)
    want = fe_beam_frequencies("cantilever", *c.values(), 3, point_masses=[(60, m)])
    np.testing.assert_allclose(got, want, rtol=1e-5)


# ------------------------------------------------ simply supported + central mass


def test_central_mass_exact_with_no_mass_is_the_simply_supported_beam():
    c = _cantilever_case()
    got = beams.simply_supported_central_mass_exact(**c, mass=0.0, n_modes=4)
    want = beams.beam_natural_frequencies("simply-supported", *c.values(), n_modes=4)
    np.testing.assert_allclose(got, want, rtol=1e-14)


@pytest.mark.parametrize("mass_ratio", [0.3, 2.0, 8.0])
def test_central_mass_exact_matches_finite_element_model(mass_ratio):
    # Independent numerical method: FE beam (60 elements, node 30 at midspan) with the
    # point mass on the midspan translational DOF; tolerance 1e-5.
    c = _cantilever_case()
    m = mass_ratio * c["mass_per_length"] * c["length"]
    got = beams.simply_supported_central_mass_exact(**c, mass=m, n_modes=4)
    want = fe_beam_frequencies("simply-supported", *c.values(), 4, point_masses=[(30, m)])
    np.testing.assert_allclose(got, want, rtol=1e-5)


def test_central_mass_rayleigh_bounds_and_converges():
    # Rayleigh with 17/35 of the beam mass (Thomson & Dahleh sec. 2.5, from memory):
    # with no mass sqrt(48 * 35/17) / pi^2 - 1 = 0.723 % high [D]; exact in the limit
    # of a heavy mass (massless spring 48 EI / L^3).
    c = _cantilever_case()
    m_beam = c["mass_per_length"] * c["length"]
    ratios = np.array([0.0, 1.0, 10.0, 100.0])
    exact = beams.simply_supported_central_mass_exact(**c, mass=ratios * m_beam)[:, 0]
    rayleigh = beams.simply_supported_central_mass_rayleigh(**c, mass=ratios * m_beam)
    gap = rayleigh / exact - 1.0
    assert gap[0] == pytest.approx(math.sqrt(48 * 35 / 17) / math.pi**2 - 1, abs=1e-9)
    assert np.all(np.diff(gap) < 0) and gap[-1] < 1e-4 and np.all(gap > 0)


# ---------------------------------------------------------------- bad input


def test_zero_length_is_rejected_with_exact_message():
    with pytest.raises(ValueError, match=r"^beam length must be positive, got 0 m$"):
        beams.beam_natural_frequencies("cantilever", 210e9, 1e-6, 10.0, 0.0)


@pytest.mark.parametrize(
    "kwargs, message",
    [
        (dict(youngs_modulus=-1.0), r"^Young's modulus must be positive, got -1 Pa$"),
        (dict(second_moment=0.0), r"^second moment of area must be positive, got 0 m\^4$"),
        (dict(mass_per_length=float("nan")), r"^mass per length must be positive, got nan kg/m$"),
        (dict(length=[1.0, -2.0]), r"^beam length must be positive, got -2 m$"),
    ],
)
def test_bad_beam_properties_are_rejected(kwargs, message):
    args = dict(youngs_modulus=210e9, second_moment=1e-6, mass_per_length=10.0, length=1.0)
    args.update(kwargs)
    with pytest.raises(ValueError, match=message):
        beams.beam_natural_frequencies("fixed-fixed", **args)


def test_negative_point_masses_are_rejected():
    c = dict(youngs_modulus=210e9, second_moment=1e-6, mass_per_length=10.0, length=1.0)
    with pytest.raises(ValueError, match=r"^tip mass must not be negative, got -3 kg$"):
        beams.cantilever_tip_mass_exact(**c, tip_mass=-3.0)
    with pytest.raises(ValueError, match=r"^tip mass must not be negative, got -3 kg$"):
        beams.cantilever_tip_mass_rayleigh(**c, tip_mass=-3.0)
    with pytest.raises(ValueError, match=r"^central mass must not be negative, got -1 kg$"):
        beams.simply_supported_central_mass_exact(**c, mass=-1.0)
    with pytest.raises(ValueError, match=r"^density must be positive, got -7850 kg/m\^3$"):
        beams.beam_mass_per_length(-7850.0, 1e-3)


def test_unknown_end_condition_and_mode_count_are_rejected():
    with pytest.raises(
        ValueError, match=r'^unknown beam end condition \'hinged\'; expected one of "cantilever"'
    ):
        beams.beam_eigenvalue_constants("hinged")
    with pytest.raises(ValueError, match=r"^number of modes must be at least 1, got 0$"):
        beams.beam_eigenvalue_constants("cantilever", 0)
    with pytest.raises(ValueError, match=r"^number of modes must be a whole number, got 2.5$"):
        beams.beam_eigenvalue_constants("cantilever", 2.5)

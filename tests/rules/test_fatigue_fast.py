"""The fatigue rule's bin sums done for every bin at once give, bit for bit, what the sums
bin by bin gave (the same trapezoids, summed by numpy's pairwise sum row by row as it sums
a bin's own array), and the trapezoid rule they implement (common practice: on a density
of closed-form integral the bins add up to it)."""

from __future__ import annotations

import math

import numpy as np
import pytest
from vcheck.rules import fatigue

from vcheck.dynamics.fatigue import spectral
from vcheck.dynamics.fatigue.sn_curves import SN_CURVES


def _reference_reconciled(label, upper, cycles, damage, gamma, curve):
    """fatigue._reconciled as written when each bin read the curve on its own."""
    if damage > 0 and cycles > 0:
        allowed = cycles / damage
        try:
            equivalent = float(curve.stress_range_at(allowed)) / gamma
        except (AttributeError, ValueError):
            equivalent = upper
        if not (math.isfinite(equivalent) and 0 < equivalent <= upper * (1 + 1e-9)):
            equivalent = upper
        return fatigue.Contribution(label, equivalent, cycles, allowed, damage, "")
    return fatigue.Contribution(label, upper, cycles, math.inf, 0.0, "")


def bin_by_bin(pdf, rate, duration, curve, gamma, top, bins, label):
    """_spectral_contributions as it was written before: a numpy sum for each bin."""
    points = 64 * bins + 1
    s = np.linspace(0.0, top, points)
    n = np.asarray(curve.cycles_variable_amplitude(gamma * s), dtype=float)
    p = np.asarray(pdf(s), dtype=float)
    density = np.where(np.isinf(n), 0.0, p / np.where(np.isinf(n), 1.0, n))
    out = []
    step = top / bins
    for i in range(bins):
        window = slice(i * 64, (i + 1) * 64 + 1)
        x = s[window]
        damage = rate * duration * float(np.sum((density[window][1:] + density[window][:-1])
                                                * np.diff(x)) / 2.0)
        share = float(np.sum((p[window][1:] + p[window][:-1]) * np.diff(x)) / 2.0)
        upper = (i + 1) * step
        out.append(_reference_reconciled(label(i * step, upper), upper,
                                         rate * duration * share, damage, gamma, curve))
    return out


RNG = np.random.default_rng(20261203)
CURVES = sorted(SN_CURVES)


def _cases():
    for number in range(60):
        curve = SN_CURVES[CURVES[number % len(CURVES)]]
        rms = 10.0 ** RNG.uniform(6.5, 8.0)  # 3 to 100 MPa RMS
        yield (curve, rms, float(RNG.uniform(1.0, 1.5)), int(RNG.integers(2, 201)),
               float(RNG.uniform(4.0, 40.0)))


@pytest.mark.parametrize("case", list(_cases()), ids=lambda case: case[0].name)
def test_bins_at_once_equal_bin_by_bin_bit_for_bit(case):
    curve, rms, gamma, bins, spread = case
    top = 2.0 * rms * spread
    # the moments of a flat band from 20 to 200 Hz, scaled to the RMS
    moments = spectral.spectral_moments(np.linspace(20.0, 200.0, 50), np.ones(50))
    m0, m1, m2, m4 = (m * rms**2 / moments[0] for m in moments)
    for pdf in (lambda s: spectral.range_pdf_rayleigh(s, m0),
                lambda s: spectral.range_pdf_dirlik(s, m0, m1, m2, m4)):
        fast = fatigue._spectral_contributions(pdf, 35.0, 3.0e7, curve, gamma, top, bins,
                                               fatigue._range_label)
        slow = bin_by_bin(pdf, 35.0, 3.0e7, curve, gamma, top, bins, fatigue._range_label)
        assert len(fast) == len(slow) == bins
        assert any(c.damage > 0 for c in slow)  # the damage sums are not all of zeros
        for a, b in zip(fast, slow):
            assert a.label == b.label and a.note == b.note
            for x, y in ((a.stress_range, b.stress_range), (a.cycles, b.cycles),
                         (a.allowed, b.allowed), (a.damage, b.damage)):
                assert type(x) is type(y) is float
                assert x.hex() == y.hex(), (a, b)


def test_the_bins_add_up_to_the_rayleigh_density():
    # the Rayleigh range density p(S) = S / (4 s^2) exp(-S^2 / (8 s^2)) integrates to 1
    # (Bendat and Piersol, Random Data, 4th ed., the Rayleigh distribution); 16 s is its
    # whole support to 1e-14, and 64 trapezoids a bin err by less than 1e-5
    rms = 2.0e7
    bins = fatigue._spectral_contributions(
        lambda s: spectral.range_pdf_rayleigh(s, rms**2), 1.0, 1.0, SN_CURVES[CURVES[0]],
        1.0, 16.0 * rms, 20, fatigue._range_label)
    assert math.fsum(c.cycles for c in bins) == pytest.approx(1.0, abs=1e-5)


class _ScalarOnlyCurve:
    """A plugin's curve whose inverse takes one number at a time."""

    def __init__(self, curve):
        self.curve = curve

    def stress_range_at(self, cycles):
        return self.curve.stress_range_at(float(cycles))


@pytest.mark.parametrize("case", list(_cases())[:20], ids=lambda case: case[0].name)
def test_rows_read_at_once_equal_rows_read_one_by_one(case):
    curve, rms, gamma, bins, _ = case
    # rows as the histogram bins of a rainflow count give them: some empty, some without
    # damage, one whose allowed cycles overflow (refused by the curve: its upper edge)
    rows = []
    for i in range(bins):
        upper = (i + 1) * 4.0 * rms / bins
        cycles = float(RNG.choice([0.0, 1.0, 10.0 ** RNG.uniform(0, 9)]))
        damage = float(RNG.choice([0.0, 10.0 ** RNG.uniform(-12, 0)]))
        rows.append((f"bin {i}", upper, cycles, damage))
    for curve_used, rows_used in ((curve, rows), (_ScalarOnlyCurve(curve), rows),
                                  (curve, rows + [("huge", 1e9, 1e300, 1e-300)])):
        fast = fatigue._reconciled_rows(rows_used, gamma, curve_used)
        slow = [_reference_reconciled(*row, gamma, curve_used) for row in rows_used]
        assert len(fast) == len(slow)
        for a, b in zip(fast, slow):
            assert a.label == b.label and a.note == b.note
            for x, y in ((a.stress_range, b.stress_range), (a.cycles, b.cycles),
                         (a.allowed, b.allowed), (a.damage, b.damage)):
                assert type(x) is type(y) is float
                assert x.hex() == y.hex(), (a, b)

"""Rainflow counting against ASTM E1049-85 and two independent implementations.

References used here:

* ASTM E1049-85 (Reapproved 2017), Standard Practices for Cycle Counting in Fatigue
  Analysis, sec. 5.4.4 and its Fig. 6 worked example (history -2, 1, -3, 5, -1, 3, -4,
  4, -2); the counts are listed in REFERENCES.md as [C].
* PyPI ``rainflow`` 3.2 (``rainflow.extract_cycles``): a sequential, line-by-line
  implementation of the standard's section 5.4.4 in pure Python (test-only).
* PyPI ``fatpack`` 0.7 (``find_rainflow_cycles``): the four-point rainflow method
  (Amzallag et al., Int. J. Fatigue 16 (1994) 287-293) in its own code (test-only).

The counts are compared exactly (``np.array_equal``), not within a tolerance: every
range and mean is made by the same floating-point operations (one subtraction, one sum
halved), so any difference would be a different cycle, not rounding.
"""

from __future__ import annotations

import doctest

import fatpack
import numpy as np
import pytest
import rainflow as pypi_rainflow

from vcheck.dynamics.fatigue import rainflow as rf
from vcheck.dynamics.fatigue.rainflow import rainflow_cycles, range_histogram, turning_points

# ------------------------------------------------------------------------ helpers


def _sorted_rows(*columns):
    rows = np.column_stack([np.asarray(c, dtype=float) for c in columns])
    if rows.shape[0] == 0:
        return rows
    return rows[np.lexsort(rows.T[::-1])]


def reference_cycles(x):
    """Cycles of PyPI rainflow as rows (range, mean, count, start, end), sorted."""
    cycles = list(pypi_rainflow.extract_cycles(list(x)))
    return _sorted_rows(*zip(*cycles)) if cycles else np.zeros((0, 5))


def vcheck_cycles(x):
    return _sorted_rows(*rainflow_cycles(np.asarray(x), return_index=True))


def random_histories(seed, count):
    """Histories of several kinds: continuous values, and integer values full of
    equal ranges and flat stretches (where the standard's tie rules matter)."""
    rng = np.random.default_rng(seed)
    for trial in range(count):
        n = int(rng.integers(3, 400))
        kind = trial % 5
        if kind == 0:
            yield rng.standard_normal(n)
        elif kind == 1:
            yield rng.integers(-3, 4, n).astype(float)  # many ties and plateaus
        elif kind == 2:
            yield np.cumsum(rng.integers(-2, 3, n)).astype(float)  # random walk
        elif kind == 3:
            t = np.arange(n)
            yield np.round(3 * np.sin(0.7 * t) * (1 + 0.5 * np.sin(0.02 * t)), 1)
        else:
            yield np.repeat(rng.standard_normal(n // 3 + 2), rng.integers(1, 4))


# ------------------------------------------------------------ the standard's example

# ASTM E1049-85 (2017), sec. 5.4.4, Fig. 6: the example history and its counts
# (range: cycles), [C] in REFERENCES.md. 4.0 cycles in all.
ASTM_HISTORY = [-2, 1, -3, 5, -1, 3, -4, 4, -2]
ASTM_COUNTS = {3: 0.5, 4: 1.5, 6: 0.5, 8: 1.0, 9: 0.5}


def test_astm_e1049_example_counts():
    ranges, _, counts = rainflow_cycles(ASTM_HISTORY)
    got = {}
    for r, c in zip(ranges.tolist(), counts.tolist()):
        got[r] = got.get(r, 0.0) + c
    assert got == ASTM_COUNTS
    assert counts.sum() == 4.0
    assert set(counts.tolist()) == {0.5, 1.0}


def test_astm_e1049_example_single_full_cycle_is_minus_one_to_three():
    # Fig. 6: the one full cycle counted is the range -1 .. 3 (samples 4 and 5).
    ranges, means, counts, start, end = rainflow_cycles(ASTM_HISTORY, return_index=True)
    full = counts == 1.0
    assert ranges[full].tolist() == [4.0]
    assert means[full].tolist() == [1.0]
    assert (start[full].tolist(), end[full].tolist()) == ([4], [5])


def test_astm_e1049_example_histogram_unit_bins():
    # The same counts binned 0.5 .. 9.5 by 1: each whole-number range in its own bin.
    ranges, _, counts = rainflow_cycles(ASTM_HISTORY)
    bin_counts, edges = range_histogram(ranges, counts, np.arange(0.5, 10.0, 1.0))
    expected = [ASTM_COUNTS.get(r, 0.0) for r in range(1, 10)]
    assert bin_counts.tolist() == expected
    assert edges.tolist() == list(np.arange(0.5, 10.0, 1.0))


# ------------------------------------------------------- against PyPI rainflow


def test_turning_points_match_pypi_rainflow_reversals():
    # Conventions shared with rainflow.reversals: first and last sample kept; a flat
    # peak or valley reported at its last sample.
    for x in random_histories(seed=11, count=300):
        ref = list(pypi_rainflow.reversals(list(x)))
        index, value = turning_points(x)
        if np.all(x == x[0]):
            # constant history: rainflow reports both ends (equal values), vcheck only
            # the first, so that no zero-range half cycle appears
            assert index.tolist() == [0]
            continue
        assert index.tolist() == [i for i, _ in ref]
        assert value.tolist() == [v for _, v in ref]


def test_cycles_identical_to_pypi_rainflow_random_histories():
    # Every cycle (range, mean, count, start and end sample) equal to the sequential
    # implementation, for continuous values and for tie-heavy integer histories.
    # Alignment: PyPI rainflow counts a constant history as one zero-range half cycle
    # (it yields both end points); vcheck yields none. Such histories are skipped here
    # and checked on their own below.
    for x in random_histories(seed=5, count=400):
        if np.all(x == x[0]):
            continue
        np.testing.assert_array_equal(vcheck_cycles(x), reference_cycles(x))


@pytest.mark.parametrize(
    ("block", "batch", "dense", "few"),
    [
        (2, 1, 16, 48),  # every sample its own block, counted at once
        (3, 5, 1, 0),  # linked-list passes right after the first pass
        (7, 2, 10**9, 0),  # only full-array passes
        (5, 3, 2, 10**9),  # one-by-one closing as soon as passes thin out
    ],
)
def test_cycles_do_not_depend_on_blocking(monkeypatch, block, batch, dense, few):
    # The count is streamed in blocks and switches between three ways of closing
    # ranges; by the confluence argument in the module notes none of that may change a
    # single cycle. Checked against the sequential reference.
    monkeypatch.setattr(rf, "_BLOCK", block)
    monkeypatch.setattr(rf, "_COUNT_BATCH", batch)
    monkeypatch.setattr(rf, "_DENSE_FRACTION", dense)
    monkeypatch.setattr(rf, "_FEW_CANDIDATES", few)
    for x in random_histories(seed=17, count=120):
        if np.all(x == x[0]):
            continue
        np.testing.assert_array_equal(vcheck_cycles(x), reference_cycles(x))


def test_long_record_across_blocks_matches_pypi_rainflow():
    # 300 000 samples: several sample blocks and counting batches with the default
    # settings, plus flat stretches from rounding.
    rng = np.random.default_rng(3)
    x = np.round(rng.standard_normal(300_000), 2)
    np.testing.assert_array_equal(vcheck_cycles(x), reference_cycles(x))


def test_slowly_shrinking_then_growing_amplitude_matches_pypi_rainflow():
    # A sine whose amplitude falls to zero and grows again over hundreds of cycles:
    # each range closes only after its inner neighbour, a long chain of closures (the
    # case the one-by-one stage is for).
    t = np.arange(40_000)
    x = np.sin(2 * np.pi * t / 20) * np.cos(2 * np.pi * t / 40_000 * 1.5)
    np.testing.assert_array_equal(vcheck_cycles(x), reference_cycles(x))


def test_constant_and_tiny_histories():
    # rainflow yields a zero-range half cycle for a constant history; vcheck none (no
    # reversal, no cycle). Two samples: one half cycle (rainflow 3.2 drops the last
    # point of a two-sample series, a quirk of its reversal reader, so it is not used
    # as the reference here: the standard counts the one range as a half cycle).
    for x in ([], [1.0], [2.0, 2.0, 2.0]):
        ranges, means, counts = rainflow_cycles(x)
        assert ranges.size == means.size == counts.size == 0
    ranges, means, counts = rainflow_cycles([1.0, 4.0])
    assert (ranges.tolist(), means.tolist(), counts.tolist()) == ([3.0], [2.5], [0.5])


# ------------------------------------------------------------- against fatpack


def test_cycles_identical_to_fatpack_four_point_method():
    # fatpack.find_rainflow_cycles returns the closed cycles as (first, second)
    # reversal values and the residue; the residue's ranges are counted here as half
    # cycles, as ASTM E1049-85 5.4.4 step 6 does.
    # Alignment: fatpack.find_reversals first sorts the signal into load classes
    # (64 by default), which moves every value; fatpack is therefore fed vcheck's
    # turning points, so both count the same reversal sequence. Its four-point test
    # closes a range when it is <= both neighbours, where the standard needs strictly
    # smaller than the older one: that only matters for exactly equal ranges, so the
    # histories here are continuous random values (no ties with probability one).
    rng = np.random.default_rng(23)
    for trial in range(60):
        n = int(rng.integers(10, 5000))
        if trial % 2:
            x = rng.standard_normal(n)
        else:
            x = np.cumsum(rng.standard_normal(n))
        _, reversals = turning_points(x)
        fp_cycles, fp_residue = fatpack.find_rainflow_cycles(reversals)
        fp_cycles = np.asarray(fp_cycles).reshape(-1, 2)
        fp_full = _sorted_rows(
            np.abs(fp_cycles[:, 1] - fp_cycles[:, 0]), 0.5 * (fp_cycles[:, 0] + fp_cycles[:, 1])
        )
        fp_half = _sorted_rows(
            np.abs(np.diff(fp_residue)), 0.5 * (fp_residue[:-1] + fp_residue[1:])
        )
        ranges, means, counts = rainflow_cycles(x)
        full = counts == 1.0
        np.testing.assert_array_equal(_sorted_rows(ranges[full], means[full]), fp_full)
        np.testing.assert_array_equal(_sorted_rows(ranges[~full], means[~full]), fp_half)


# --------------------------------------------------- properties of the procedure


def test_total_cycles_from_turning_point_count():
    # Each full cycle takes two turning points, each half cycle is one range of the
    # residue, so the counts add up to (turning points - 1) / 2 (a consequence of
    # ASTM E1049-85 5.4.4, independent of which cycles are formed).
    for x in random_histories(seed=29, count=100):
        index, _ = turning_points(x)
        _, _, counts = rainflow_cycles(x)
        assert counts.sum() == pytest.approx(max(index.size - 1, 0) / 2, abs=0)


def test_sign_reversal_mirrors_the_count():
    # The procedure compares only absolute ranges, so the history upside down gives
    # the same ranges and counts with means of opposite sign (exact: negation is).
    for x in random_histories(seed=31, count=100):
        ranges, means, counts = rainflow_cycles(x)
        ranges_m, means_m, counts_m = rainflow_cycles(-np.asarray(x))
        np.testing.assert_array_equal(
            _sorted_rows(ranges_m, -means_m, counts_m), _sorted_rows(ranges, means, counts)
        )


def test_integer_histories_are_counted_in_float64():
    x = np.array(ASTM_HISTORY, dtype=np.int16)
    ranges, _, _ = rainflow_cycles(x)
    assert ranges.dtype == np.float64
    assert sorted(ranges.tolist()) == sorted(
        rainflow_cycles(np.array(ASTM_HISTORY, float))[0].tolist()
    )


# ------------------------------------------------------------------- bad input


def test_rejects_two_dimensional_history():
    with pytest.raises(
        ValueError, match=r"^the history must be a one-dimensional array, got 2 dimensions$"
    ):
        rainflow_cycles(np.zeros((3, 3)))


def test_rejects_nan_with_its_position():
    x = np.zeros(10)
    x[7] = np.nan
    with pytest.raises(ValueError, match=r"^the history must be finite, got nan at sample 7$"):
        rainflow_cycles(x)
    with pytest.raises(ValueError, match=r"^the history must be finite, got inf at sample 7$"):
        turning_points(np.where(np.isnan(x), np.inf, x))


def test_rejects_non_numeric_history():
    with pytest.raises(ValueError, match=r"^the history must hold real numbers, got dtype <U1$"):
        rainflow_cycles(np.array(["a", "b"]))


def test_histogram_rejects_negative_range():
    with pytest.raises(ValueError, match=r"^ranges must be zero or positive, got -2$"):
        range_histogram([1.0, -2.0], [1.0, 1.0], 4)


def test_histogram_rejects_mismatched_lengths_and_bad_bins():
    with pytest.raises(
        ValueError,
        match=r"^ranges and counts must be one-dimensional arrays of the same length, "
        r"got shapes \(2,\) and \(3,\)$",
    ):
        range_histogram([1.0, 2.0], [1.0, 1.0, 1.0], 4)
    with pytest.raises(
        ValueError, match=r"^bin edges must be a one-dimensional, strictly increasing array$"
    ):
        range_histogram([1.0], [1.0], [0.0, 2.0, 1.0])
    with pytest.raises(
        ValueError, match=r"^bins must be a positive whole number or an array of edges, got 0$"
    ):
        range_histogram([1.0], [1.0], 0)


def test_histogram_equal_bins_from_zero_to_largest_range():
    # Half-open bins [a, b), the last one closed (the numpy.histogram convention).
    bin_counts, edges = range_histogram([0.0, 1.0, 2.0, 4.0], [1.0, 0.5, 0.5, 1.0], 4)
    assert edges.tolist() == [0.0, 1.0, 2.0, 3.0, 4.0]
    assert bin_counts.tolist() == [1.0, 0.5, 0.5, 1.0]


def test_docstring_examples_run():
    # The Examples sections of the module's docstrings are run, so they cannot drift.
    result = doctest.testmod(rf)
    assert result.failed == 0 and result.attempted >= 3


# ------------------------------------------------------------- repeating histories


def _interior_repetition(x):
    """Cycles (range -> count) that one interior repetition adds to a record repeated
    end to start: PyPI rainflow on the record three times over, less the record twice
    over (the issue's reference for a repeating history)."""
    from collections import Counter

    def count(a):
        out = Counter()
        for r, _, c, _, _ in pypi_rainflow.extract_cycles(list(a)):
            out[round(r, 9)] += c
        return out

    x = np.asarray(x, dtype=float)
    thrice, twice = count(np.concatenate([x, x, x])), count(np.concatenate([x, x]))
    keys = set(thrice) | set(twice)
    return {k: thrice[k] - twice[k] for k in keys if thrice[k] != twice[k]}


def _as_counter(ranges, counts):
    from collections import Counter

    out = Counter()
    for r, c in zip(ranges, counts):
        out[round(float(r), 9)] += float(c)
    return dict(out)


def test_repeating_astm_example_closes_its_residue():
    # ASTM E1049-85 Fig. 6 history, repeated: every range closes, 3, 4, 7 and 9 once
    # each (against PyPI rainflow on the record concatenated with itself, exact).
    x = [-2, 1, -3, 5, -1, 3, -4, 4, -2]
    ranges, means, counts = rf.rainflow_cycles_repeating(x)
    assert sorted(ranges.tolist()) == [3.0, 4.0, 7.0, 9.0]
    assert counts.tolist() == [1.0] * 4
    assert _as_counter(ranges, counts) == _interior_repetition(x)


@pytest.mark.parametrize("seed", range(8))
def test_repeating_history_equals_an_interior_repetition_of_pypi_rainflow(seed):
    # Random walks with an offset (the junction from the last sample back to the first
    # is a jump, as in a repeated record): the steady-state cycles of one repetition
    # equal those an interior repetition adds in PyPI rainflow's count, exactly.
    rng = np.random.default_rng(seed)
    x = np.cumsum(rng.standard_normal(500)) + 5 * rng.standard_normal()
    ranges, _, counts = rf.rainflow_cycles_repeating(x)
    assert (counts == 1.0).all()
    assert _as_counter(ranges, counts) == _interior_repetition(x)
    # a single pass has fewer, smaller cycles: the residue's half cycles
    _, _, single = rainflow_cycles(x)
    assert (single == 0.5).any() and counts.sum() > single.sum() - 0.5 * (single == 0.5).sum()


def test_repeating_history_bad_input():
    with pytest.raises(ValueError, match="^a repeating history needs at least two samples$"):
        rf.rainflow_cycles_repeating([1.0])
    with pytest.raises(ValueError, match="^the history must be finite, got nan at sample 1$"):
        rf.rainflow_cycles_repeating([1.0, float("nan"), 2.0])
    ranges, _, counts = rf.rainflow_cycles_repeating([3.0, 3.0, 3.0])
    assert ranges.size == 0 and counts.size == 0


@pytest.mark.parametrize("seed", range(4))
def test_repeating_history_against_fatpack_residue_closure(seed):
    # fatpack 0.7: the cycles of the record (closed onto its first sample, as a
    # repetition joins), plus those found in its residue concatenated with itself
    # (fatpack.concatenate_reversals), are one repetition's cycles. fatpack puts the
    # signal on k levels before it finds reversals: with k = 2^20 the ranges agree to
    # two of those steps; the count exactly.
    rng = np.random.default_rng(seed)
    x = np.cumsum(rng.standard_normal(500)) + 3
    reversals, _ = fatpack.find_reversals(np.append(x, x[0]), k=2**20)
    cycles, residue = fatpack.find_rainflow_cycles(reversals)
    closed, _ = fatpack.find_rainflow_cycles(fatpack.concatenate_reversals(residue, residue))
    both = np.concatenate([cycles, closed])
    reference = np.sort(np.abs(both[:, 1] - both[:, 0]))
    ranges, _, counts = rf.rainflow_cycles_repeating(x)
    assert counts.sum() == reference.shape[0]
    step = (x.max() - x.min()) / 2**20
    assert np.abs(np.sort(ranges) - reference).max() <= 2 * step


def test_sorted_unique_matches_numpy_unique():
    # Reference: numpy.unique (the helper only avoids its import of numpy.ma).
    from vcheck.dynamics.fatigue.rainflow import _sorted_unique

    rng = np.random.default_rng(7)
    for size in (0, 1, 2, 17, 1000):
        values = rng.integers(-20, 20, size)
        np.testing.assert_array_equal(_sorted_unique(values), np.unique(values))

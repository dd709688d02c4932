"""Rainflow cycle counting of load or stress histories (ASTM E1049-85, sec. 5.4.4).

The count is the one of ASTM E1049-85 (reapproved 2017), section 5.4.4 "Rainflow
Counting": a full cycle is counted for every range closed by a later, larger range, the
ranges that are never closed (the residue) are counted as half cycles. It is computed
here without a Python loop per sample, so that records of tens of millions of samples
count in well under a second.

How it works
------------
The standard's procedure reads one reversal at a time and compares the two most recent
ranges X (newest) and Y (the one before): if X >= Y and Y does not contain the starting
point, Y is a full cycle and its two points are discarded. Written in terms of the
whole sequence of reversals, a range r_i (between reversal i and i + 1) is closed as a
full cycle exactly when

    r_(i-1) > r_i <= r_(i+1)                                             (1)

in the current sequence: strictly smaller than the range before it (the standard keeps
the stack of open ranges strictly decreasing, so the older neighbour of Y is always
strictly larger), and not larger than the range after it (X >= Y). Removing the two
reversals of r_i merges r_(i-1), r_i and r_(i+1) into one range that is at least as
large as r_(i-1) and r_(i+1). Two consequences make a parallel count exact:

* two ranges that satisfy (1) are never neighbours (r_i <= r_(i+1) and
  r_i > r_(i+1) cannot both hold), so every such pair can be removed at once;
* a removal only enlarges the neighbours of other ranges, so a range that satisfies (1)
  keeps satisfying it until it is removed itself.

So the removals commute, every order of removal ends in the same final sequence with
the same set of closed pairs (Newman's lemma for a terminating, locally confluent
rewriting), and the sequential procedure of the standard is one such order. The
standard's half-cycle step 5 (discard the starting point when X >= Y) corresponds to
reversals at the start of the sequence that no range can ever close: they stay in the
final sequence, which is the residue, and each of its ranges is one half cycle.

The count therefore proceeds in passes: each pass evaluates (1) for all ranges with
numpy, records the closed ranges as full cycles and removes their reversals. While
passes remove many reversals the array is compacted; once they remove few, only the
neighbourhoods of the last removals are re-examined, on a linked list held in numpy
index arrays, so a pass costs in proportion to what it changes. When only a few dozen
candidates are left (typically the last few closures of a block, or a long chain such
as an amplitude that shrinks and grows again over thousands of cycles, where each
range closes only after its inner neighbour), they are worked off one at a time on the
same linked list, at a small fixed cost per closure instead of one numpy pass each.
The record is processed in blocks of samples; a block's leftover sequence is carried
into the next block, which by the same confluence argument gives the same cycles as one
pass over the whole record, while keeping temporary memory small.

Cost: one pass over the samples for the turning points, then work in proportion to
the number of reversals for the count; about the time numpy alone takes to find the
turning points (benchmarks/bench_rainflow.py). Extra memory is the cycle arrays
returned plus small per-block buffers.

Cycles equal those of a sequential implementation of the standard, down to ties
between equal ranges; only the order in which they are listed differs.
"""

from __future__ import annotations

import math

import numpy as np
from numpy.typing import ArrayLike

__all__ = ["rainflow_cycles", "rainflow_cycles_repeating", "range_histogram", "turning_points"]

_BLOCK = 1 << 16
"""Samples per block of the record processed at once (memory and cache friendly)."""

_COUNT_BATCH = 1 << 17
"""Turning points gathered before a counting step (fewer, larger numpy passes)."""

_DENSE_FRACTION = 16

_FEW_CANDIDATES = 48
"""Below this many candidate ranges a pass costs more in numpy overhead than checking
the candidates one by one."""
"""Switch from full-array passes to neighbourhood passes once a pass removes fewer
than 1/_DENSE_FRACTION of the reversals."""


# --------------------------------------------------------------------------- input


def _as_record(x: ArrayLike) -> np.ndarray:
    arr = np.asarray(x)
    if arr.ndim != 1:
        raise ValueError(f"the history must be a one-dimensional array, got {arr.ndim} dimensions")
    if arr.dtype.kind not in "biuf":
        raise ValueError(f"the history must hold real numbers, got dtype {arr.dtype}")
    return arr


def _block_as_float(arr: np.ndarray, start: int, stop: int) -> np.ndarray:
    """Samples ``arr[start:stop]`` as float64, raising ValueError on NaN or infinity."""
    block = arr[start:stop]
    if block.dtype != np.float64:
        block = block.astype(np.float64)
    # A NaN or an infinity makes the sum non-finite; only then look closer (a sum can
    # also overflow on huge finite values).
    if arr.dtype.kind == "f" and not math.isfinite(block.sum()) and not np.isfinite(block).all():
        bad = start + int(np.flatnonzero(~np.isfinite(block))[0])
        raise ValueError(f"the history must be finite, got {arr[bad]} at sample {bad}")
    return block


# ----------------------------------------------------------------- turning points


def _turning_point_blocks(arr: np.ndarray):
    """Yield (sample indices, values) of the turning points, block by block.

    The first sample is always a turning point; the last sample is one unless the
    whole history is constant. A flat stretch at a peak or valley counts once, at its
    last sample (the convention of the ASTM procedure's reading of reversals).
    """
    n = arr.shape[0]
    if n == 0:
        return
    first = _block_as_float(arr, 0, 1)
    yield np.zeros(1, dtype=np.intp), first
    if n == 1:
        return
    last_rising = None  # direction of the last non-zero difference seen so far
    for start in range(0, n - 1, _BLOCK):
        stop = min(start + _BLOCK, n - 1)  # differences start .. stop-1
        block = _block_as_float(arr, start, stop + 1)
        diff = block[1:] - block[:-1]
        rising = diff > 0
        if np.count_nonzero(diff) == diff.shape[0]:
            # no flat stretches: a turning point wherever the direction changes
            del diff
            first_rising, final_rising = bool(rising[0]), bool(rising[-1])
            changes = rising[1:] != rising[:-1]
            del rising
            local = np.flatnonzero(changes)
            del changes
            local += 1
            first_at = 0
        else:
            moving = np.flatnonzero(diff)
            del diff
            if moving.shape[0] == 0:
                continue
            direction = rising[moving]
            del rising
            local = moving[np.flatnonzero(direction[1:] != direction[:-1]) + 1]
            first_rising, final_rising = bool(direction[0]), bool(direction[-1])
            first_at = int(moving[0])
            del moving, direction
        if last_rising is not None and last_rising != first_rising:
            local = np.concatenate((np.array([first_at], dtype=local.dtype), local))
        last_rising = final_rising
        if local.shape[0]:
            yield local + start, block[local]
    if last_rising is not None:
        yield np.array([n - 1], dtype=np.intp), _block_as_float(arr, n - 1, n)


def turning_points(x: ArrayLike):
    """Turning points (peaks and valleys) of a sampled history.

    Parameters
    ----------
    x : array_like
        Sampled history, one-dimensional, finite (stress [Pa], or any other quantity).

    Returns
    -------
    index : numpy.ndarray of int
        Sample numbers of the turning points [unitless].
    value : numpy.ndarray of float
        Values at the turning points [same unit as ``x``].

    Notes
    -----
    A sample is a turning point where the sign of the first difference changes, with
    zero differences (flat stretches) skipped; a flat peak or valley counts once, at its
    last sample. The first and the last sample are kept as turning points, as ASTM
    E1049-85 does for the ends of a history; a constant history has only its first
    sample. Consecutive turning points therefore alternate strictly between peaks and
    valleys.

    References
    ----------
    .. [1] ASTM E1049-85 (Reapproved 2017), Standard Practices for Cycle Counting in
       Fatigue Analysis, ASTM International, sec. 3.1.5 (reversal) and 5.4.4.

    Examples
    --------
    >>> index, value = turning_points([0.0, 1.0, 1.0, 0.5, 2.0, 2.0])
    >>> index.tolist(), value.tolist()
    ([0, 2, 3, 5], [0.0, 1.0, 0.5, 2.0])
    """
    arr = _as_record(x)
    pieces = list(_turning_point_blocks(arr))
    if not pieces:
        return np.zeros(0, dtype=np.intp), np.zeros(0)
    return (
        np.concatenate([p[0] for p in pieces]).astype(np.intp, copy=False),
        np.concatenate([p[1] for p in pieces]),
    )


# ------------------------------------------------------------------- cycle removal


class _Cycles:
    """Collects closed cycles as lists of array pieces."""

    def __init__(self, with_index: bool):
        self.ranges: list[np.ndarray] = []
        self.means: list[np.ndarray] = []
        self.starts: list[np.ndarray] | None = [] if with_index else None
        self.ends: list[np.ndarray] | None = [] if with_index else None

    def add(self, rng, first, second, start=None, end=None):
        self.ranges.append(rng)
        first += second  # ``first`` is always a fresh copy: reuse it for the mean
        first *= 0.5
        self.means.append(first)
        if self.starts is not None:
            self.starts.append(start)
            self.ends.append(end)


def _close_cycles(value: np.ndarray, index: np.ndarray | None, first_new: int, out: _Cycles):
    """Remove every range closed by criterion (1) from the reversal sequence.

    ``value`` (and ``index``, the sample numbers, when wanted) hold a reversal sequence
    whose part before ``first_new`` is already free of closed ranges. Returns the
    remaining sequence (the residue so far).
    """
    m = value.shape[0]
    if m < 4:
        return value, index
    # Full-array passes while they remove much; the first one may skip the old part.
    lo = max(first_new - 3, 0)
    while True:
        m = value.shape[0]
        if m - lo < 4:
            return value, index
        seg = value[lo:]
        r = seg[1:] - seg[:-1]
        np.abs(r, out=r)
        closed = r[:-2] > r[1:-1]
        closed &= r[1:-1] <= r[2:]
        k = np.flatnonzero(closed)
        if k.shape[0] == 0:
            return value, index
        k += 1  # position in ``seg`` of the first reversal of each closed range
        rk = r[k]
        del r
        k += lo  # position in ``value``
        out.add(
            rk,
            value[k],
            value[k + 1],
            None if index is None else index[k],
            None if index is None else index[k + 1],
        )
        del rk
        np.logical_not(closed, out=closed)  # now: range not closed
        keep = np.ones(m, dtype=bool)
        keep[lo + 1 : m - 2] = closed
        keep[lo + 2 : m - 1] &= closed
        del closed
        value = np.compress(keep, value)
        if index is not None:
            index = np.compress(keep, index)
        del keep
        if k.shape[0] * 2 * _DENSE_FRACTION < m - lo:
            break
        lo = max(int(k[0]) - 3, 0)
    # Neighbourhood passes on a linked list over the compacted sequence.
    m = value.shape[0]
    # Where the predecessor of each removed pair now sits in the compacted array.
    pred = k - 1 - 2 * np.arange(k.shape[0])
    cand = _sorted_unique(np.concatenate((pred - 1, pred, pred + 1)))
    cand = cand[(cand >= 0) & (cand < m)]
    return _close_cycles_linked(value, index, cand, out)


def _sorted_unique(values: np.ndarray) -> np.ndarray:
    """The distinct values, ascending: ``np.unique`` without its import of numpy.ma."""
    ordered = np.sort(values, kind="stable")
    if ordered.shape[0] < 2:
        return ordered
    keep = np.empty(ordered.shape[0], dtype=bool)
    keep[0] = True
    np.not_equal(ordered[1:], ordered[:-1], out=keep[1:])
    return ordered[keep]


def _close_cycles_linked(value, index, cand, out: _Cycles):
    m = value.shape[0]
    v = np.empty(m + 1)
    v[:m] = value
    v[m] = np.nan  # sentinel node m: every comparison with it is False
    nxt = np.arange(1, m + 2, dtype=np.intp)
    nxt[m] = m
    prv = np.arange(-1, m, dtype=np.intp)
    prv[0] = m
    dead = np.zeros(m + 1, dtype=bool)
    pair_of = np.zeros(m + 1, dtype=np.intp)
    while cand.shape[0]:
        if cand.shape[0] <= _FEW_CANDIDATES:
            _close_cycles_one_by_one(v, nxt, prv, dead, index, cand, out)
            break
        a = cand
        p = prv[a]
        b = nxt[a]
        c = nxt[b]
        va = v[a]
        vb = v[b]
        r = np.abs(vb - va)
        closed = (np.abs(va - v[p]) > r) & (r <= np.abs(v[c] - vb))
        sel = np.flatnonzero(closed)
        if sel.shape[0] == 0:
            break
        a, b, p, c = a[sel], b[sel], p[sel], c[sel]
        out.add(
            r[sel],
            va[sel],
            vb[sel],
            None if index is None else index[a],
            None if index is None else index[b],
        )
        dead[a] = True
        dead[b] = True
        # Neighbouring closed pairs form chains (.. p [a b] [a' b'] .. c'): link each
        # chain's living predecessor to its living successor.
        head = np.flatnonzero(~dead[p])
        pair_of[a] = np.arange(a.shape[0])
        ph = p[head]
        cf = c[head]
        while True:
            inside = np.flatnonzero(dead[cf])
            if inside.shape[0] == 0:
                break
            cf[inside] = c[pair_of[cf[inside]]]
        nxt[ph] = cf
        prv[cf] = ph
        cand = _sorted_unique(np.concatenate((prv[ph], ph, cf)))
        if cand.shape[0] and cand[-1] == m:
            cand = cand[:-1]
    alive = ~dead[:m]
    return np.compress(alive, value), None if index is None else np.compress(alive, index)


def _close_cycles_one_by_one(v, nxt, prv, dead, index, cand, out: _Cycles):
    """Finish a count whose remaining work is a few long chains of closures.

    Long chains (an amplitude that shrinks and then grows again over many cycles closes
    one range after the other, each one only once its neighbour has gone) would take
    one numpy pass per closure; here they are worked off one candidate at a time, the
    same criterion (1) on the same linked list, at a small fixed cost per closure.
    """
    vm = memoryview(v)
    nm = memoryview(nxt)
    pm = memoryview(prv)
    dm = memoryview(dead)
    rng: list[float] = []
    first: list[float] = []
    second: list[float] = []
    a_list: list[int] = []
    b_list: list[int] = []
    todo = cand.tolist()
    pop, push = todo.pop, todo.append
    while todo:
        a = pop()
        if dm[a]:
            continue
        p = pm[a]
        b = nm[a]
        c = nm[b]
        va = vm[a]
        vb = vm[b]
        r = abs(vb - va)
        if abs(va - vm[p]) > r and r <= abs(vm[c] - vb):
            rng.append(r)
            first.append(va)
            second.append(vb)
            a_list.append(a)
            b_list.append(b)
            dm[a] = True
            dm[b] = True
            nm[p] = c
            pm[c] = p
            push(c)
            push(pm[p])
            push(p)
    if rng:
        a_arr = np.array(a_list, dtype=np.intp)
        b_arr = np.array(b_list, dtype=np.intp)
        out.add(
            np.array(rng),
            np.array(first),
            np.array(second),
            None if index is None else index[a_arr],
            None if index is None else index[b_arr],
        )


def rainflow_cycles(x: ArrayLike, *, return_index: bool = False):
    """Rainflow-counted cycles of a sampled history (ASTM E1049-85, 5.4.4).

    Parameters
    ----------
    x : array_like
        Sampled history, one-dimensional, finite (stress [Pa], or any other quantity).
    return_index : bool, optional
        Also return the sample numbers where each cycle starts and ends.

    Returns
    -------
    ranges : numpy.ndarray
        Range of each cycle, peak minus valley [same unit as ``x``].
    means : numpy.ndarray
        Mean of each cycle, (peak + valley) / 2 [same unit as ``x``].
    counts : numpy.ndarray
        1.0 for a full cycle, 0.5 for a half cycle of the residue [unitless].
    start, end : numpy.ndarray of int
        Only with ``return_index``: sample numbers of the cycle's first and second
        turning point [unitless].

    Notes
    -----
    Equivalent to the procedure of ASTM E1049-85, sec. 5.4.4: with X the most recent
    range and Y the one before, Y is counted as one cycle when X >= Y and Y does not
    contain the starting point, as a half cycle (the starting point moving on) when it
    does; the ranges left at the end are half cycles. Here a range r_i of the reversal
    sequence is closed as a full cycle when r_(i-1) > r_i <= r_(i+1); see the module
    notes for why removing all such ranges in parallel passes gives exactly the
    standard's cycles. The full cycles come first, in the order the passes close them,
    then the half cycles of the residue in the order of the history.

    Turning points follow :func:`turning_points`. The history is counted once, as
    recorded: the residue is not repeated or closed (for a repeating block of service,
    count the history followed by itself, or close the residue separately).

    References
    ----------
    .. [1] ASTM E1049-85 (Reapproved 2017), Standard Practices for Cycle Counting in
       Fatigue Analysis, ASTM International, sec. 5.4.4 and Fig. 6.

    Examples
    --------
    The example history of ASTM E1049-85, Fig. 6:

    >>> ranges, means, counts = rainflow_cycles([-2, 1, -3, 5, -1, 3, -4, 4, -2])
    >>> sorted(zip(ranges.tolist(), counts.tolist()))
    [(3.0, 0.5), (4.0, 0.5), (4.0, 1.0), (6.0, 0.5), (8.0, 0.5), (8.0, 0.5), (9.0, 0.5)]
    """
    arr = _as_record(x)
    out = _Cycles(return_index)
    res_v = np.zeros(0)
    res_i = np.zeros(0, dtype=np.intp) if return_index else None
    pending_v: list[np.ndarray] = []
    pending_i: list[np.ndarray] = []
    n_pending = 0
    blocks = _turning_point_blocks(arr)
    while True:
        block = next(blocks, None)
        if block is not None:
            if return_index:
                pending_i.append(block[0])
            pending_v.append(block[1])
            n_pending += block[1].shape[0]
            if n_pending < _COUNT_BATCH:
                continue
        if n_pending:
            first_new = res_v.shape[0]
            res_v = np.concatenate([res_v, *pending_v])
            if return_index:
                res_i = np.concatenate([res_i, *pending_i])
            pending_v.clear()
            pending_i.clear()
            n_pending = 0
            res_v, res_i = _close_cycles(res_v, res_i, first_new, out)
        if block is None:
            break
    n_full = sum(p.shape[0] for p in out.ranges)
    # half cycles of the residue
    out.ranges.append(np.abs(res_v[1:] - res_v[:-1]))
    out.means.append(0.5 * (res_v[:-1] + res_v[1:]))
    ranges = np.concatenate(out.ranges)
    out.ranges.clear()
    means = np.concatenate(out.means)
    out.means.clear()
    counts = np.full(ranges.shape[0], 0.5)
    counts[:n_full] = 1.0
    if not return_index:
        return ranges, means, counts
    out.starts.append(res_i[:-1])
    out.ends.append(res_i[1:])
    start = np.concatenate(out.starts).astype(np.intp, copy=False)
    end = np.concatenate(out.ends).astype(np.intp, copy=False)
    return ranges, means, counts, start, end


def rainflow_cycles_repeating(x: ArrayLike):
    """Rainflow cycles of one repetition of a history that repeats end to start.

    Parameters
    ----------
    x : array_like
        One repetition of the history, one-dimensional, finite, at least two samples
        [stress Pa, or any other quantity]. Its last sample is followed by its first.

    Returns
    -------
    ranges : numpy.ndarray
        Range of each cycle [same unit as ``x``].
    means : numpy.ndarray
        Mean of each cycle [same unit as ``x``].
    counts : numpy.ndarray
        1.0 for every cycle: in the steady state of a repeating history every range
        closes [unitless].

    Notes
    -----
    The history is rearranged to start (and end) at a global peak or valley (the one
    farther from the middle of its range), and counted as in :func:`rainflow_cycles`; the
    residue of such a sequence closes, its two equal half cycles (the largest range, out
    and back) making one cycle. This is the simplified rainflow count for repeating
    histories of ASTM E1049-85 (sec. 5.4.4 as recalled; sec. 5.4.3 is the general count,
    from memory). It equals the cycles that one interior repetition adds to a record
    concatenated with itself many times (checked against PyPI ``rainflow`` in the
    tests), and it is what a record repeated over a life gives once per repetition; the
    half cycles of a single pass would leave out the larger cycles that close across
    the joins.

    References
    ----------
    .. [1] ASTM E1049-85 (Reapproved 2017), Standard Practices for Cycle Counting in
       Fatigue Analysis, ASTM International, sec. 5.4.4 (as recalled, from memory).

    Examples
    --------
    The example history of ASTM E1049-85, Fig. 6, repeated:

    >>> ranges, means, counts = rainflow_cycles_repeating([-2, 1, -3, 5, -1, 3, -4, 4, -2])
    >>> sorted(zip(ranges.tolist(), counts.tolist()))
    [(3.0, 1.0), (4.0, 1.0), (7.0, 1.0), (9.0, 1.0)]
    """
    arr = _as_record(x)
    if arr.shape[0] < 2:
        raise ValueError("a repeating history needs at least two samples")
    values = np.asarray(arr, dtype=float)
    if not np.isfinite(values).all():
        bad = int(np.flatnonzero(~np.isfinite(values))[0])
        raise ValueError(f"the history must be finite, got {values[bad]} at sample {bad}")
    k = int(np.argmax(np.abs(values - 0.5 * (values.max() + values.min()))))
    loop = np.concatenate([values[k:], values[:k + 1]])
    ranges, means, counts = rainflow_cycles(loop)
    full = counts == 1.0
    half_r, half_m = ranges[~full], means[~full]
    order = np.lexsort((half_m, half_r))
    half_r, half_m = half_r[order], half_m[order]
    paired_r, paired_m, single_r, single_m = [], [], [], []
    i = 0
    while i < half_r.shape[0]:
        if i + 1 < half_r.shape[0] and half_r[i + 1] == half_r[i]:
            paired_r.append(half_r[i])
            paired_m.append(0.5 * (half_m[i] + half_m[i + 1]))
            i += 2
        else:  # pragma: no cover - the residue of a loop from its extreme pairs up
            single_r.append(half_r[i])
            single_m.append(half_m[i])
            i += 1
    ranges = np.concatenate([ranges[full], paired_r, single_r]).astype(float)
    means = np.concatenate([means[full], paired_m, single_m]).astype(float)
    counts = np.concatenate([np.ones(int(full.sum()) + len(paired_r)),
                             np.full(len(single_r), 0.5)])
    keep = ranges > 0
    return ranges[keep], means[keep], counts[keep]


# ----------------------------------------------------------------------- histogram


def range_histogram(ranges: ArrayLike, counts: ArrayLike, bins=10):
    """Cycle counts binned by range.

    Parameters
    ----------
    ranges : array_like
        Cycle ranges, zero or positive [Pa, or the unit of the counted history].
    counts : array_like
        Cycles per range, e.g. 1.0 and 0.5 from :func:`rainflow_cycles` [unitless].
    bins : int or array_like, optional
        Number of equal-width bins from zero to the largest range, or the bin edges in
        increasing order [same unit as ``ranges``].

    Returns
    -------
    bin_counts : numpy.ndarray
        Sum of the counts in each bin [unitless].
    edges : numpy.ndarray
        Bin edges, one more than bins [same unit as ``ranges``].

    Notes
    -----
    Each bin holds the ranges edges[i] <= range < edges[i + 1], the last bin also its
    upper edge (numpy.histogram). For a damage sum from the histogram, taking each
    bin's upper edge as its range is conservative (common practice).

    Examples
    --------
    >>> bin_counts, edges = range_histogram([3, 4, 4, 6, 8, 9], [0.5, 0.5, 1, 0.5, 1, 0.5], 3)
    >>> bin_counts.tolist(), edges.tolist()
    ([0.0, 2.0, 2.0], [0.0, 3.0, 6.0, 9.0])
    """
    r = np.asarray(ranges, dtype=float)
    c = np.asarray(counts, dtype=float)
    if r.ndim != 1 or c.ndim != 1 or r.shape != c.shape:
        raise ValueError(
            f"ranges and counts must be one-dimensional arrays of the same length, "
            f"got shapes {r.shape} and {c.shape}"
        )
    if not (np.isfinite(r).all() and np.isfinite(c).all()):
        raise ValueError("ranges and counts must be finite")
    if r.shape[0] and r.min() < 0:
        raise ValueError(f"ranges must be zero or positive, got {r.min():g}")
    if c.shape[0] and c.min() < 0:
        raise ValueError(f"counts must be zero or positive, got {c.min():g}")
    if np.ndim(bins) == 0:
        if isinstance(bins, bool) or not isinstance(bins, (int, np.integer)) or bins < 1:
            raise ValueError(
                f"bins must be a positive whole number or an array of edges, got {bins!r}"
            )
        top = float(r.max()) if r.shape[0] else 1.0
        edges = np.linspace(0.0, top if top > 0 else 1.0, int(bins) + 1)
    else:
        edges = np.asarray(bins, dtype=float)
        if edges.ndim != 1 or edges.shape[0] < 2 or not np.all(np.diff(edges) > 0):
            raise ValueError("bin edges must be a one-dimensional, strictly increasing array")
    bin_counts, edges = np.histogram(r, bins=edges, weights=c)
    return bin_counts, edges

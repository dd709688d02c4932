"""Palmgren-Miner cumulative damage and fatigue life.

A stress-range histogram (ranges and the cycles counted at each, e.g. from
:func:`vcheck.dynamics.fatigue.rainflow.rainflow_cycles` or from duty blocks) is summed against
an S-N curve of :mod:`vcheck.dynamics.fatigue.sn_curves`: D = sum n_i / N_i. The bin that
contributes most is reported as the governing one. Life follows from the damage of a
known exposure.
"""

from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike

__all__ = ["MinerSum", "fatigue_life_years", "miner_damage"]


class MinerSum(NamedTuple):
    """Result of :func:`miner_damage`."""

    damage: float
    """Total damage D = sum n_i / N_i [unitless]; failure is predicted at D = 1."""
    damage_per_bin: np.ndarray
    """n_i / N_i of each bin, in the order given [unitless]."""
    governing_bin: int | None
    """Index of the bin with the largest damage, ``None`` when no bin does damage."""


def miner_damage(
    stress_ranges: ArrayLike,
    counts: ArrayLike,
    curve,
    *,
    constant_amplitude: bool = False,
    partial_factor: float = 1.0,
) -> MinerSum:
    """Palmgren-Miner damage sum of a stress-range histogram.

    Parameters
    ----------
    stress_ranges : array_like
        Stress range of each bin, zero or positive [Pa].
    counts : array_like
        Cycles in each bin, zero or positive (half cycles as 0.5) [cycles].
    curve : vcheck.dynamics.fatigue.sn_curves.SNCurve
        S-N curve [-].
    constant_amplitude : bool, optional
        Read the curve's constant-amplitude cycles (a single range repeated, where a
        constant-amplitude fatigue limit applies). Default ``False``: the
        variable-amplitude curve of a spectrum (lower branch and cut-off).
    partial_factor : float, optional
        Factor on every stress range before the curve is read: the product of the
        partial factors for loads and for fatigue strength, gamma_Ff gamma_Mf
        (EN 1993-1-9:2005, sec. 8, from memory; gamma_Mf from
        :func:`vcheck.dynamics.fatigue.sn_curves.partial_factor_fatigue_strength`). Default 1
        [unitless].

    Returns
    -------
    MinerSum
        Total damage, damage of each bin and the governing bin [unitless].

    Notes
    -----
    D = sum_i n_i / N(gamma S_i), with N from the curve and gamma the partial factor;
    ranges the curve lets through without damage (below a fatigue limit or cut-off, and
    zero ranges) add nothing. Linear damage accumulation takes no account of load
    sequence.

    References
    ----------
    .. [1] A. Palmgren, Die Lebensdauer von Kugellagern, Zeitschrift des Vereines
       Deutscher Ingenieure 68 (1924) 339-341.
    .. [2] M. A. Miner, Cumulative damage in fatigue, Journal of Applied Mechanics 12
       (1945) A159-A164.
    .. [3] EN 1993-1-9:2005, Annex A, A.5 (damage sum D_d = sum n_Ei / N_Ri) (from
       memory).

    Examples
    --------
    EN 1993-1-9 detail category 71: 1e5 cycles at 100 MPa, 1e6 at 40 MPa, 1e7 at
    20 MPa:

    >>> from vcheck.dynamics.fatigue.sn_curves import sn_curve
    >>> result = miner_damage([100e6, 40e6, 20e6], [1e5, 1e6, 1e7], sn_curve("EN 1993-1-9:71"))
    >>> round(result.damage, 4), result.governing_bin
    (0.192, 0)
    """
    s = np.asarray(stress_ranges, dtype=float)
    n = np.asarray(counts, dtype=float)
    if s.ndim > 1 or n.ndim > 1 or s.shape != n.shape:
        raise ValueError(
            "stress ranges and counts must be one-dimensional arrays of the same length, "
            f"got shapes {s.shape} and {n.shape}"
        )
    s = np.atleast_1d(s)
    n = np.atleast_1d(n)
    if n.size and not (np.isfinite(n) & (n >= 0)).all():
        bad = n[~(np.isfinite(n) & (n >= 0))][0]
        raise ValueError(f"cycle counts must be zero or positive, got {bad:g}")
    gamma = float(partial_factor)
    if not (math.isfinite(gamma) and gamma > 0):
        raise ValueError(f"partial factor must be positive, got {gamma:g}")
    if s.size and (s < 0).any():
        # report the range as given, before the partial factor
        raise ValueError(f"stress range must be zero or positive, got {s[s < 0][0]:g} Pa")
    if constant_amplitude:
        allowed = np.asarray(curve.cycles_constant_amplitude(gamma * s), dtype=float)
    else:
        allowed = np.asarray(curve.cycles_variable_amplitude(gamma * s), dtype=float)
    per_bin = np.where(np.isinf(allowed), 0.0, n / allowed)
    total = float(per_bin.sum())
    governing = int(np.argmax(per_bin)) if total > 0 else None
    return MinerSum(total, per_bin, governing)


def fatigue_life_years(damage: float, design_life_years: float = 1.0) -> float:
    """Fatigue life from the damage accumulated over a known time.

    Parameters
    ----------
    damage : float
        Palmgren-Miner damage accumulated over ``design_life_years``, zero or positive
        [unitless].
    design_life_years : float, optional
        The time that damage was accumulated over, positive; 1 (the default) when
        ``damage`` is the damage per year [year].

    Returns
    -------
    float
        Predicted life, the time to D = 1 at the same rate; ``inf`` for no damage
        [year].

    Notes
    -----
    L = T / D (linear accumulation at a steady rate).

    Examples
    --------
    >>> fatigue_life_years(0.2, 25.0)
    125.0
    """
    d = float(damage)
    if not (math.isfinite(d) and d >= 0):
        raise ValueError(f"damage must be zero or positive, got {d:g}")
    t = float(design_life_years)
    if not (math.isfinite(t) and t > 0):
        raise ValueError(f"design life must be positive, got {t:g} years")
    return math.inf if d == 0 else t / d

"""Torsional modes against excitation bands: separation and the stiffness that clears."""

from __future__ import annotations

import math

import numpy as np

from ..roots import brent_root
from .modes import torsional_frequencies

__all__ = ["band_separation", "link_stiffness_for_frequency"]


def band_separation(mode_low: float, mode_high: float, band_low: float,
                    band_high: float) -> tuple[float, str]:
    """Separation of a natural-frequency band from an excitation band, as a fraction.

    Parameters
    ----------
    mode_low, mode_high : float
        The natural frequency's band (its tolerance) [Hz].
    band_low, band_high : float
        The excitation band over the speed range [Hz]; positive.

    Returns
    -------
    (float, str)
        The gap over the nearest band edge [unitless] ((f_low - f_n) / f_low below,
        (f_n - f_high) / f_high above; 0 when the bands overlap) and "below", "above"
        or "inside".

    Notes
    -----
    The separation margin of API 684 and API 617 for torsional natural frequencies is
    stated this way, as a percentage of the excitation frequency (from memory).
    """
    if mode_high < band_low:
        return (band_low - mode_high) / band_low, "below"
    if mode_low > band_high:
        return (mode_low - band_high) / band_high, "above"
    return 0.0, "inside"


def link_stiffness_for_frequency(inertias, links, link: int, mode: int, target: float,
                                 span: float = 1e4) -> float | None:
    """Stiffness of one link that puts one elastic mode at a target frequency.

    Parameters
    ----------
    inertias : array_like
        Disc inertias [kg m^2] (see :func:`.modes.torsional_modes`).
    links : sequence of (int, int, float)
        The train's links, stiffness [N m/rad].
    link : int
        Index of the link whose stiffness changes (a coupling, usually).
    mode : int
        Index of the elastic mode, 0 the lowest [unitless].
    target : float
        Wanted natural frequency of that mode [Hz]; positive.
    span : float, default 1e4
        Search from the link's stiffness divided by ``span`` to times ``span``.

    Returns
    -------
    float or None
        The stiffness [N m/rad], or None when no stiffness within the span reaches the
        target (the mode is bounded by the rest of the train).

    Notes
    -----
    Every natural frequency rises with any stiffness (Rayleigh's quotient; the
    interlacing of eigenvalues under a rank-one change of K), so the root in log k is
    bracketed and unique; found by Brent's method on log k.
    """
    rows = [tuple(r) for r in links]
    base = float(rows[link][2])

    def frequency(log_k: float) -> float:
        trial = list(rows)
        a, b, _ = trial[link]
        trial[link] = (a, b, math.exp(log_k))
        found = torsional_frequencies(inertias, trial)
        return float(found[mode]) if mode < found.size else float("inf")

    low, high = math.log(base / span), math.log(base * span)
    f_low, f_high = frequency(low) - target, frequency(high) - target
    if not (np.isfinite(f_low) and np.isfinite(f_high)) or f_low * f_high > 0:
        return None
    return math.exp(brent_root(lambda x: frequency(x) - target, low, high, xtol=1e-10))

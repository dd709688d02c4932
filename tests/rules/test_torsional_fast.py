"""The torsional rule's advice search judges each trial stiffness in one comparison of
every band against its own margin; it must give, trial by trial, what the pair status of
the rule gives pair by pair (a trial clears when every pair passes) and what the two
selections of major and minor bands gave before."""

from __future__ import annotations

import numpy as np
from vcheck.rules.torsional import Status, TorsionalOptions, _clears_each, pair_status


class _Band:
    def __init__(self, major: bool) -> None:
        self.major = major


def _two_selections(frequencies, lows, highs, major, options):
    """_clears_each as written before: the major and the minor bands selected apart."""
    f = np.asarray(frequencies)[:, :, None]
    margin = np.where(f < lows, (lows - f) / lows, np.where(f > highs, (f - highs) / highs, 0.0))
    slack = 1 - 1e-9
    fails_major = np.any(margin[:, :, major] < options.warn_margin * slack, axis=(1, 2))
    fails_minor = np.any(margin[:, :, ~major] < options.minor_margin * slack, axis=(1, 2))
    return ~(fails_major | fails_minor)


def test_each_trial_clears_as_its_pairs_pass():
    rng = np.random.default_rng(20261203)
    options = TorsionalOptions()
    seen = set()
    for _ in range(200):
        bands = int(rng.integers(1, 7))
        lows = np.sort(rng.uniform(5.0, 200.0, bands))
        highs = lows * rng.uniform(1.0, 1.3, bands)
        major = rng.random(bands) < 0.5
        frequencies = rng.uniform(1.0, 300.0, (int(rng.integers(1, 40)), int(rng.integers(1, 5))))
        fast = _clears_each(frequencies, lows, highs, major, options)
        seen.update(fast.tolist())
        assert fast.tolist() == _two_selections(frequencies, lows, highs, major, options).tolist()
        for trial, clears in zip(frequencies, fast):
            statuses = []
            for f in trial:
                for low, high, is_major in zip(lows, highs, major):
                    margin = (low - f) / low if f < low else (f - high) / high if f > high else 0.0
                    statuses.append(pair_status(margin, _Band(bool(is_major)), options))
            assert bool(clears) == all(s is Status.PASS for s in statuses)
    assert seen == {True, False}  # trials that clear and trials that do not

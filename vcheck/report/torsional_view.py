"""The torsional modes and interference of a design's shaft trains, shown unjudged.

Part of ``vcheck dynamics``: for each ``[[shaft-train]]``, the train referred to its
reference shaft, each elastic torsional mode with its band and the link that twists
most, the excitation bands of every shaft, and the nearest excitation of each mode.
Designs without a shaft train add nothing.
"""

from __future__ import annotations

from ..wording import apart as _apart

__all__ = ["torsional_lines"]


def _hz(value: float) -> str:
    return f"{value:.2f}" if value < 10 else f"{value:.1f}"


def _band(low: float, high: float) -> str:
    return _hz(low) if low == high else f"{_hz(low)}-{_hz(high)}"


def _columns(rows, indent: str = "    ") -> list[str]:
    widths = [max(len(row[i]) for row in rows) for i in range(len(rows[0]))]
    return [(indent + "  ".join(c.ljust(widths[i]) for i, c in enumerate(row))).rstrip()
            for row in rows]


def _gap(mode, band) -> tuple[float, str]:
    from ..dynamics.torsion.interference import band_separation

    return band_separation(mode.low, mode.high, band.low, band.high)


CROSSING_REACH = 0.2
"""Crossings of an order line with a mode are listed from this fraction below the lowest
speed to this fraction above the highest (the warn margin of the rule, by default)."""


def _crossings(design, result) -> list[str]:
    """The interference diagram in words: the reference-shaft speed at which each order
    line crosses each torsional mode (f_n / order), for crossings near the speed range."""
    speed = design.machine.speed
    low, high = speed.min.value, speed.max.value
    rows = [("mode", "excitation", "crosses at [rpm]", "speed range")]
    for mode in result.modes:
        for band in result.bands:
            if not band.order:
                continue
            at = mode.nominal / band.order
            if not (1 - CROSSING_REACH) * low <= at <= (1 + CROSSING_REACH) * high:
                continue
            where = ("inside" if low <= at <= high else
                     f"{(low - at) / low:.1%} below" if at < low else
                     f"{(at - high) / high:.1%} above")
            rows.append((str(mode.number), band.name, f"{at * 60:.0f}", where))
    running = (speed.min.text if not speed.is_range
               else f"{speed.min.text} to {speed.max.text}")
    head = (f"    interference diagram: order lines crossing a torsional mode within "
            f"{CROSSING_REACH:.0%} of the running speed ({running})")
    return [head] + (_columns(rows, "      ") if len(rows) > 1 else ["      none"])


def torsional_lines(design) -> list[str]:
    """Lines of the dynamics view for the design's shaft trains (none without one)."""
    from ..torsional_analysis import analyse_train

    out: list[str] = []
    for index in range(len(design.shaft_train)):
        result = analyse_train(design, index)
        referred = result.referred
        out.append(f"  shaft train '{result.train.name}', referred to shaft "
                   f"'{referred.reference}'")
        rows = [("disc", "referred inertia [kg*m^2]")]
        rows += [(name, f"{j:.4g}") for name, j in zip(referred.discs, referred.inertias)]
        out += _columns(rows)
        out.append("    torsional modes [Hz] (the rigid-body mode of a free train left out)")
        rows = [("mode", "nominal", "band", "twists most", "share of strain energy")]
        for mode in result.modes:
            rows.append((str(mode.number), _hz(mode.nominal), _band(mode.low, mode.high),
                         mode.twist, f"{mode.twist_share:.0%}"))
        out += _columns(rows, "      ") if result.modes else ["      none"]
        out.append("    torsional excitation bands [Hz]")
        rows = [("band", "source")]
        rows += [(_band(b.low, b.high), b.name) for b in result.bands]
        out += _columns(rows, "      ")
        if result.modes:
            out.append("    nearest excitation of each torsional mode")
            rows = [("mode", "excitation", "separation")]
            for mode in result.modes:
                margin, side, band = min(((*_gap(mode, b), b) for b in result.bands),
                                         key=lambda item: (item[0], item[2].low))
                rows.append((str(mode.number), band.name,
                             _apart(margin, side)))
            out += _columns(rows, "      ")
        out += _crossings(design, result)
        for _, what, _ in result.gaps:
            out.append(f"    not considered: {what}")
    return out

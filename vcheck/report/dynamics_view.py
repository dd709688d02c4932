"""The computed dynamics of designs, shown without judging: what vcheck believes.

For each design: every natural frequency with its band and origin, every forcing band,
and the separation of each mode from its nearest forcing band. No verdict, no limit.
"""

from __future__ import annotations

from ..wording import apart as _apart
from .common import clean_lines, clean_text

__all__ = ["render_dynamics"]


def _hz(value: float) -> str:
    return f"{value:.2f}" if value < 10 else f"{value:.1f}"


def _band(low: float, high: float) -> str:
    return _hz(low) if low == high else f"{_hz(low)}-{_hz(high)}"


def _columns(rows: list[tuple[str, ...]], indent: str = "    ") -> list[str]:
    rows = [tuple(clean_text(cell) for cell in row) for row in rows]
    widths = [max(len(row[i]) for row in rows) for i in range(len(rows[0]))]
    return [(indent + "  ".join(c.ljust(widths[i]) for i, c in enumerate(row))).rstrip()
            for row in rows]


def _gap(mode_low, mode_high, band_low, band_high) -> tuple[float, str]:
    if mode_high < band_low:
        return (band_low - mode_high) / band_low, "below"
    if mode_low > band_high:
        return (mode_low - band_high) / band_high, "above"
    return 0.0, "inside"


def _amount(value: float, unit: str) -> str:
    if value == 0:
        return "0"
    return f"{value / 1000:.3g} k{unit}" if abs(value) >= 1000 else f"{value:.3g} {unit}"


def _components(vector, unit: str) -> str:
    parts = [f"{axis} {_amount(abs(complex(v)), unit)}" for axis, v in zip("xyz", vector)
             if abs(complex(v)) > 0]
    return ", ".join(parts) if parts else "-"


def _loads(loads, speed) -> list[str]:
    """The machine's loads by source, order and direction, at the maximum speed."""
    if loads is None or not (loads.harmonic or loads.static):
        return ["  machine loads: none known (give rotor, crank, torque, belt with power, or "
                "[[machine.load]])"]
    out = [f"  machine loads (amplitudes at {speed.max.text} unless stated)"]
    rows = [("load", "Hz", "force", "moment", "at [m]")]
    for load in loads.harmonic:
        low, high = load.band(speed)
        scale = load.scale_at(speed.max.value)
        force = [complex(v) * scale for v in load.force]
        moment = [complex(v) * scale for v in load.moment]
        where = ", ".join(f"{c:.3g}" for c in load.point) if any(force) else "-"
        rows.append((load.name, _band(low, high), _components(force, "N"),
                     _components(moment, "N*m"), where))
    for load in loads.static:
        where = ", ".join(f"{c:.3g}" for c in load.point) if any(load.force) else "-"
        rows.append((load.name, "static", _components(load.force, "N"),
                     _components(load.moment, "N*m"), where))
    out += _columns(rows)
    for _, note in loads.notes:
        out.append(f"    note: {note}")
    return out


def render_dynamics(designs, problems) -> str:
    out: list[str] = []
    for problem in problems:
        out.append(problem.render())
    if problems:
        out.append("")
    for design in designs:
        analysis = design._analysis
        machine = design.machine
        speed = machine.speed
        running = (f"{speed.min.text}" if not speed.is_range
                   else f"{speed.min.text} to {speed.max.text}")
        out.append(f"{design.file}  {machine.tag} ({machine.kind}), running {running}")
        out.append("  natural frequencies [Hz]")
        rows = [("nominal", "band", "mode", "from")]
        for mode in analysis.modes:
            rows.append((_hz(mode.nominal), _band(mode.low, mode.high), mode.name, mode.origin))
        out += _columns(rows) if analysis.modes else ["    none known"]
        out.append("  forcing bands [Hz]")
        rows = [("band", "source")]
        for band in analysis.bands:
            rows.append((_band(band.low, band.high), band.name))
        out += _columns(rows)
        out += _loads(analysis.loads, speed)
        if analysis.modes:
            out.append("  nearest forcing band of each mode")
            rows = [("mode", "forcing", "separation")]
            for mode in analysis.modes:
                margin, side, band = min(
                    (_gap(mode.low, mode.high, b.low, b.high) + (b,) for b in analysis.bands),
                    key=lambda item: (item[0], item[2].low))
                rows.append((mode.name, band.name,
                             _apart(margin, side)))
            out += _columns(rows)
        if design.shaft_train:
            from .torsional_view import torsional_lines

            out += torsional_lines(design)
        out.append("")
    out.append("No verdict here: `vcheck check` judges these numbers against the rules.")
    # names and descriptions come from design and mode files: cleaned like the text report
    return clean_lines("\n".join(out)) + "\n"

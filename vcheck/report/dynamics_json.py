"""The computed dynamics of designs as JSON (``vcheck dynamics --format json``), unjudged.

Everything the dynamics view shows, at full precision and in SI units (Hz, N, N*m, m,
kg*m^2, N*m/rad), with nothing cut to a table's rows: for each design every natural
frequency with its band and origin, the rigid-body modes on mounts with their energy
shares, every forcing band, every machine load (harmonic and static), the separation of
every mode from every forcing band, and each shaft train's referred model, torsional
modes, excitation bands and separations. Its schema is ``dynamics.schema.json`` beside
this module; ``dynamics-version`` changes when a field is added, removed or changes
meaning:

1. the first version.

Text from design files is written whole but bounded, as in the JSON report.
"""

from __future__ import annotations

import math

from .. import __version__
from ..design.problems import format_key_path
from .common import bounded, json_indented, json_safe

__all__ = ["DYNAMICS_VERSION", "dynamics_data", "render_dynamics_json"]

DYNAMICS_VERSION = 1

_COORDINATES = ("x", "y", "z", "theta-x", "theta-y", "theta-z")


def _number(value) -> float | None:
    number = float(value)
    return number if math.isfinite(number) else None


def _vector(values) -> list:
    return [_number(v) for v in values]


def _complex(values) -> list:
    """Complex amplitudes as [real, imaginary] pairs."""
    return [[_number(complex(v).real), _number(complex(v).imag)] for v in values]


def _gap(mode_low, mode_high, band_low, band_high) -> tuple[float, str]:
    if mode_high < band_low:
        return (band_low - mode_high) / band_low, "below"
    if mode_low > band_high:
        return (mode_low - band_high) / band_high, "above"
    return 0.0, "inside"


def _mode(mode) -> dict:
    return {"name": bounded(mode.name), "nominal": _number(mode.nominal),
            "low": _number(mode.low), "high": _number(mode.high),
            "origin": bounded(mode.origin), "key-path": format_key_path(mode.key_path),
            "damping-ratio": None if mode.damping_ratio is None else _number(mode.damping_ratio),
            "isolation": bool(mode.is_isolation)}


def _band(band) -> dict:
    return {"name": bounded(band.name), "kind": band.kind, "low": _number(band.low),
            "high": _number(band.high), "key-path": format_key_path(band.key_path)}


def _rigid_body(modes) -> list:
    if modes is None:
        return []
    return [{"frequency": _number(f), "motion": bounded(str(words)),
             "energy-shares": dict(zip(_COORDINATES, _vector(modes.energy_fractions[:, j]))),
             "shape": _vector(modes.shapes[:, j])}
            for j, (f, words) in enumerate(zip(modes.frequencies, modes.descriptions))]


def _loads(loads, speed) -> dict:
    if loads is None:
        return {"harmonic": [], "static": [], "notes": []}
    harmonic = []
    for load in loads.harmonic:
        low, high = load.band(speed)
        harmonic.append({
            "name": bounded(load.name), "source": load.source,
            "low": _number(low), "high": _number(high),
            "order": None if load.order is None else _number(load.order),
            "force": _complex(load.force), "moment": _complex(load.moment),
            "point": _vector(load.point), "reference-speed": _number(load.reference_speed),
            "speed-exponent": _number(load.exponent),
            "key-path": format_key_path(load.key_path)})
    static = [{"name": bounded(load.name), "source": load.source,
               "force": _vector(load.force), "moment": _vector(load.moment),
               "point": _vector(load.point), "key-path": format_key_path(load.key_path)}
              for load in loads.static]
    notes = [{"key-path": format_key_path(path), "note": bounded(words)}
             for path, words in loads.notes]
    return {"harmonic": harmonic, "static": static, "notes": notes}


def _trains(design) -> list:
    from ..dynamics.torsion.interference import band_separation
    from ..torsional_analysis import analyse_train

    out = []
    for index in range(len(design.shaft_train or ())):
        result = analyse_train(design, index)
        referred = result.referred
        separations = []
        for mode in result.modes:
            for band in result.bands:
                margin, side = band_separation(mode.low, mode.high, band.low, band.high)
                separations.append({"mode": mode.number, "band": bounded(band.name),
                                    "separation": _number(margin), "side": side})
        out.append({
            "name": bounded(result.train.name), "reference-shaft": bounded(referred.reference),
            "discs": [{"name": bounded(name), "referred-inertia": _number(j)}
                      for name, j in zip(referred.discs, referred.inertias)],
            "links": [{"from": bounded(referred.discs[a]),
                       "to": None if b < 0 else bounded(referred.discs[b]),
                       "referred-stiffness": [_number(low), _number(nominal), _number(high)]}
                      for a, b, low, nominal, high in referred.links],
            "modes": [{"number": mode.number, "nominal": _number(mode.nominal),
                       "low": _number(mode.low), "high": _number(mode.high),
                       "twists-most": bounded(mode.twist),
                       "strain-energy-share": _number(mode.twist_share)}
                      for mode in result.modes],
            "excitation-bands": [{"name": bounded(b.name), "kind": b.kind,
                                  "low": _number(b.low), "high": _number(b.high),
                                  "order": None if b.order is None else _number(b.order),
                                  "major": bool(b.major)} for b in result.bands],
            "separations": separations,
            "not-considered": [bounded(what) for _, what, _ in result.gaps],
        })
    return out


def _design(design) -> dict:
    analysis = design._analysis
    machine = design.machine
    speed = machine.speed
    separations = [{"mode": bounded(mode.name), "band": bounded(band.name),
                    "separation": _number(margin), "side": side}
                   for mode in analysis.modes for band in analysis.bands
                   for margin, side in (_gap(mode.low, mode.high, band.low, band.high),)]
    return {
        "file": design.file, "tag": bounded(machine.tag), "kind": machine.kind,
        "speed": {"min": _number(speed.min.value), "max": _number(speed.max.value)},
        "natural-frequencies": [_mode(mode) for mode in analysis.modes],
        "rigid-body-modes": _rigid_body(analysis.rigid_body),
        "forcing-bands": [_band(band) for band in analysis.bands],
        "loads": _loads(analysis.loads, speed),
        "separations": separations,
        "shaft-trains": _trains(design),
    }


def dynamics_data(designs, problems) -> dict:
    """The dynamics of ``designs`` (loaded and analysed) as plain data."""
    return {
        "dynamics": "vcheck",
        "dynamics-version": DYNAMICS_VERSION,
        "tool": {"name": "vcheck", "version": __version__},
        "units": {"frequency": "Hz", "force": "N", "moment": "N*m", "length": "m",
                  "inertia": "kg*m^2", "torsional-stiffness": "N*m/rad",
                  "separation": "fraction"},
        "designs": [_design(design) for design in designs],
        "input-problems": [
            {"file": p.file, "line": p.line, "column": p.column, "key-path": p.key,
             "message": bounded(p.message)} for p in problems],
        "note": "No verdict here: `vcheck check` judges these numbers against the rules.",
    }


def render_dynamics_json(designs, problems) -> str:
    text = json_indented(dynamics_data(designs, problems))
    return json_safe(text) + "\n"

"""Screw-thread tables and basic dimensions: ISO metric and unified inch threads.

Every dimension returned is in SI: metres and square metres. The tables below hold the
published designations (diameter and pitch, or diameter and threads per inch) and the
head and hole sizes an engineer needs for a bolted-joint check; the thread diameters and
the tensile stress area are computed from the basic profile with the formulas the
standards give, so they carry no table rounding.

Look a thread up by its usual name with :func:`thread_by_name`::

    >>> t = thread_by_name("M12")
    >>> round(t.stress_area * 1e6, 1)        # mm^2, ISO 898-1 tabulates 84.3
    84.3
    >>> round(thread_by_name("3/8-16").stress_area / 0.0254**2, 4)   # in^2
    0.0775
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

__all__ = [
    "ThreadSize",
    "METRIC_COARSE_PITCH",
    "METRIC_FINE_PITCHES",
    "HEX_HEAD_ISO_4014",
    "CLEARANCE_HOLE_ISO_273_MEDIUM",
    "UNIFIED_COARSE_TPI",
    "UNIFIED_FINE_TPI",
    "HEX_HEAD_ASME_B18_2_1",
    "thread_by_name",
    "all_thread_designations",
]

_MM = 1.0e-3
_INCH = 0.0254  # exact, by definition of the international inch (1959)

# Basic-profile factors, ISO 68-1 / ISO 724 (fundamental triangle height H = 0.866025 P).
_PITCH_DIAMETER_FACTOR = 0.649519  # d2 = d - 0.649519 P   (= 3/4 H * 2 / P)
_METRIC_MINOR_FACTOR = 1.226869  # d3 = d - 1.226869 P   (external thread, root H/6)
_UNIFIED_STRESS_FACTOR = 0.9743  # As = 0.7854 (D - 0.9743/n)^2, ASME B1.1
_UNIFIED_MINOR_FACTOR = 2 * _UNIFIED_STRESS_FACTOR - _PITCH_DIAMETER_FACTOR  # 1.299081

METRIC_COARSE_PITCH: dict[float, float] = {
    3: 0.5, 3.5: 0.6, 4: 0.7, 5: 0.8, 6: 1.0, 8: 1.25, 10: 1.5, 12: 1.75, 14: 2.0,
    16: 2.0, 18: 2.5, 20: 2.5, 22: 2.5, 24: 3.0, 27: 3.0, 30: 3.5, 33: 3.5, 36: 4.0,
    39: 4.0, 42: 4.5, 45: 4.5, 48: 5.0, 52: 5.0, 56: 5.5, 60: 5.5, 64: 6.0,
}
"""ISO metric coarse pitch P [mm] by nominal diameter d [mm], first and second choice
sizes M3 to M64 (ISO 261:1998, Table 1; ISO 262:1998 selection) (from memory; the
stress areas these give match ISO 898-1:2013 Table 4 for M6 to M30, see the tests)."""

METRIC_FINE_PITCHES: dict[float, tuple[float, ...]] = {
    8: (1.0,), 10: (1.25, 1.0), 12: (1.5, 1.25), 14: (1.5,), 16: (1.5,), 18: (1.5, 2.0),
    20: (1.5, 2.0), 22: (1.5,), 24: (2.0,), 27: (2.0,), 30: (2.0,), 33: (2.0,),
    36: (3.0,), 39: (3.0,), 42: (3.0,), 45: (3.0,), 48: (3.0,), 52: (4.0,), 56: (4.0,),
    60: (4.0,), 64: (4.0,),
}
"""ISO metric fine pitches P [mm] by nominal diameter d [mm] for bolts, screws and nuts
(ISO 262:1998 selection, first and second choice) (from memory)."""

HEX_HEAD_ISO_4014: dict[float, tuple[float, float]] = {
    3: (5.5, 4.57), 3.5: (6.0, 5.07), 4: (7.0, 5.88), 5: (8.0, 6.88), 6: (10.0, 8.88),
    8: (13.0, 11.63), 10: (16.0, 14.63), 12: (18.0, 16.63), 14: (21.0, 19.64),
    16: (24.0, 22.49), 18: (27.0, 25.34), 20: (30.0, 28.19), 22: (34.0, 31.71),
    24: (36.0, 33.61), 27: (41.0, 38.0), 30: (46.0, 42.75), 33: (50.0, 46.55),
    36: (55.0, 51.11), 39: (60.0, 55.86), 42: (65.0, 59.95), 45: (70.0, 64.7),
    48: (75.0, 69.45), 52: (80.0, 74.2), 56: (85.0, 78.66), 60: (90.0, 83.41),
    64: (95.0, 88.16),
}
"""Hexagon head bolts and screws, ISO 4014:2011 / ISO 4017:2014: (width across flats s,
minimum bearing-face diameter d_w,min) [mm] by nominal diameter d [mm]; product grade A
to M24, grade B above (from memory). The d_w values for M8 to M24, with the ISO 273
medium holes below, reproduce the tightening torques of the VDI 2230 Part 1 guideline
table for fine threads to within 1.2 % (see the tests); the other sizes are unconfirmed.
ISO 4032 nuts have the same s."""

CLEARANCE_HOLE_ISO_273_MEDIUM: dict[float, float] = {
    3: 3.4, 3.5: 3.9, 4: 4.5, 5: 5.5, 6: 6.6, 8: 9.0, 10: 11.0, 12: 13.5, 14: 15.5,
    16: 17.5, 18: 20.0, 20: 22.0, 22: 24.0, 24: 26.0, 27: 30.0, 30: 33.0, 33: 36.0,
    36: 39.0, 39: 42.0, 42: 45.0, 45: 48.0, 48: 52.0, 52: 56.0, 56: 62.0, 60: 66.0,
    64: 70.0,
}
"""Clearance hole diameter D_h [mm] for bolts, medium series, by nominal diameter d [mm]
(ISO 273:1979) (from memory; M8 to M24 confirmed as above)."""

# Unified sizes: designation of the diameter -> basic major diameter [in].
_UNIFIED_DIAMETERS: dict[str, float] = {
    "#0": 0.060, "#1": 0.073, "#2": 0.086, "#3": 0.099, "#4": 0.112, "#5": 0.125,
    "#6": 0.138, "#8": 0.164, "#10": 0.190, "#12": 0.216,
    "1/4": 0.25, "5/16": 0.3125, "3/8": 0.375, "7/16": 0.4375, "1/2": 0.5,
    "9/16": 0.5625, "5/8": 0.625, "3/4": 0.75, "7/8": 0.875, "1": 1.0,
    "1-1/8": 1.125, "1-1/4": 1.25, "1-3/8": 1.375, "1-1/2": 1.5,
}

UNIFIED_COARSE_TPI: dict[str, int] = {
    "#1": 64, "#2": 56, "#3": 48, "#4": 40, "#5": 40, "#6": 32, "#8": 32, "#10": 24,
    "#12": 24, "1/4": 20, "5/16": 18, "3/8": 16, "7/16": 14, "1/2": 13, "9/16": 12,
    "5/8": 11, "3/4": 10, "7/8": 9, "1": 8, "1-1/8": 7, "1-1/4": 7, "1-3/8": 6,
    "1-1/2": 6,
}
"""Unified coarse (UNC) threads per inch by size, #1 to 1-1/2 in (ASME B1.1-2003,
Table 1) (from memory). Numbered sizes have the basic major diameter
D = 0.060 + 0.013 N in."""

UNIFIED_FINE_TPI: dict[str, int] = {
    "#0": 80, "#1": 72, "#2": 64, "#3": 56, "#4": 48, "#5": 44, "#6": 40, "#8": 36,
    "#10": 32, "#12": 28, "1/4": 28, "5/16": 24, "3/8": 24, "7/16": 20, "1/2": 20,
    "9/16": 18, "5/8": 18, "3/4": 16, "7/8": 14, "1": 12, "1-1/8": 12, "1-1/4": 12,
    "1-3/8": 12, "1-1/2": 12,
}
"""Unified fine (UNF) threads per inch by size, #0 to 1-1/2 in (ASME B1.1-2003,
Table 1) (from memory)."""

HEX_HEAD_ASME_B18_2_1: dict[str, float] = {
    "1/4": 7 / 16, "5/16": 1 / 2, "3/8": 9 / 16, "7/16": 5 / 8, "1/2": 3 / 4,
    "9/16": 13 / 16, "5/8": 15 / 16, "3/4": 9 / 8, "7/8": 21 / 16, "1": 3 / 2,
    "1-1/8": 27 / 16, "1-1/4": 15 / 8, "1-3/8": 33 / 16, "1-1/2": 9 / 4,
}
"""Hex cap screws, basic width across flats F [in] by size (ASME B18.2.1-2012)
(from memory). Numbered sizes have no hex cap screw and no entry."""


@dataclass(frozen=True)
class ThreadSize:
    """Basic dimensions of one external screw thread, in SI units.

    Attributes
    ----------
    designation : str
        Canonical name: ``"M16"``, ``"M12x1.5"``, ``"3/8-16 UNC"``, ``"#10-24 UNC"``.
    series : str
        ``"metric coarse"``, ``"metric fine"``, ``"UNC"`` or ``"UNF"``.
    nominal_diameter : float
        Basic major diameter d [m].
    pitch : float
        Thread pitch P [m] (1/n for unified threads with n threads per inch).
    pitch_diameter : float
        Basic pitch diameter d2 = d - 0.649519 P [m].
    minor_diameter : float
        Minor diameter d3 used for the stress area [m]: d - 1.226869 P for metric
        threads (ISO 724 external thread); d - 1.299081 P for unified threads, the value
        that with d2 reproduces ASME B1.1's stress-area formula.
    stress_area : float
        Tensile stress area A_s = pi/4 ((d2 + d3)/2)^2 [m^2].
    width_across_flats : float or None
        Hexagon head width across flats s [m] (ISO 4014 / ASME B18.2.1), if tabulated.
    head_bearing_diameter : float or None
        Outside diameter of the head's bearing face d_W [m]: d_w,min of ISO 4014 for
        metric threads; for unified threads the width across flats F, an upper estimate
        (the real bearing face is somewhat smaller).
    clearance_hole_diameter : float or None
        Medium-series clearance hole D_h [m] (ISO 273), metric threads only.
    threads_per_inch : float or None
        n for unified threads, None for metric threads.
    """

    designation: str
    series: str
    nominal_diameter: float
    pitch: float
    pitch_diameter: float
    minor_diameter: float
    stress_area: float
    width_across_flats: float | None
    head_bearing_diameter: float | None
    clearance_hole_diameter: float | None
    threads_per_inch: float | None = None

    @property
    def stress_diameter(self) -> float:
        """Diameter of the stress area, d_S = (d2 + d3)/2 [m]."""
        return 0.5 * (self.pitch_diameter + self.minor_diameter)


def _fmt(x: float) -> str:
    return f"{x:g}"


def _metric(d_mm: float, p_mm: float, coarse: bool) -> ThreadSize:
    d = d_mm * _MM
    p = p_mm * _MM
    d2 = d - _PITCH_DIAMETER_FACTOR * p
    d3 = d - _METRIC_MINOR_FACTOR * p
    head = HEX_HEAD_ISO_4014.get(d_mm)
    hole = CLEARANCE_HOLE_ISO_273_MEDIUM.get(d_mm)
    name = f"M{_fmt(d_mm)}" if coarse else f"M{_fmt(d_mm)}x{_fmt(p_mm)}"
    return ThreadSize(
        designation=name,
        series="metric coarse" if coarse else "metric fine",
        nominal_diameter=d,
        pitch=p,
        pitch_diameter=d2,
        minor_diameter=d3,
        stress_area=math.pi / 4 * (0.5 * (d2 + d3)) ** 2,
        width_across_flats=None if head is None else head[0] * _MM,
        head_bearing_diameter=None if head is None else head[1] * _MM,
        clearance_hole_diameter=None if hole is None else hole * _MM,
    )


def _unified(size: str, tpi: int, series: str) -> ThreadSize:
    d_in = _UNIFIED_DIAMETERS[size]
    p_in = 1.0 / tpi
    d2_in = d_in - _PITCH_DIAMETER_FACTOR * p_in
    d3_in = d_in - _UNIFIED_MINOR_FACTOR * p_in
    flats = HEX_HEAD_ASME_B18_2_1.get(size)
    return ThreadSize(
        designation=f"{size}-{tpi} {series}",
        series=series,
        nominal_diameter=d_in * _INCH,
        pitch=p_in * _INCH,
        pitch_diameter=d2_in * _INCH,
        minor_diameter=d3_in * _INCH,
        # ASME B1.1: As = 0.7854 (D - 0.9743/n)^2; 0.7854 is pi/4 to four places and
        # (D - 0.9743/n) is exactly (d2 + d3)/2 here, so pi/4 is used.
        stress_area=math.pi / 4 * ((d_in - _UNIFIED_STRESS_FACTOR * p_in) * _INCH) ** 2,
        width_across_flats=None if flats is None else flats * _INCH,
        head_bearing_diameter=None if flats is None else flats * _INCH,
        clearance_hole_diameter=None,
        threads_per_inch=float(tpi),
    )


def _build_tables() -> dict[str, ThreadSize]:
    table: dict[str, ThreadSize] = {}
    for d, p in METRIC_COARSE_PITCH.items():
        t = _metric(d, p, coarse=True)
        table[t.designation] = t
    for d, pitches in METRIC_FINE_PITCHES.items():
        for p in pitches:
            t = _metric(d, p, coarse=False)
            table[t.designation] = t
    for size, tpi in UNIFIED_COARSE_TPI.items():
        t = _unified(size, tpi, "UNC")
        table[t.designation] = t
    for size, tpi in UNIFIED_FINE_TPI.items():
        t = _unified(size, tpi, "UNF")
        table[t.designation] = t
    return table


_THREADS = _build_tables()

_EXAMPLES = "M16, M12x1.5, 3/8-16, 1/2-13 UNC, #10-24"
_METRIC_RE = re.compile(
    r"^M\s*(?P<d>\d+(?:\.\d+)?)\s*(?:[x\u00d7*]\s*(?P<p>\d+(?:\.\d+)?))?$", re.IGNORECASE
)
_UNIFIED_RE = re.compile(
    r"^(?P<size>\#\s*\d+|\d+\s*-\s*\d+/\d+|\d+\s+\d+/\d+|\d+/\d+|\d+)"
    r"\s*-\s*(?P<tpi>\d+(?:\.\d+)?)"
    r"(?:\s*(?P<series>UNRC|UNRF|UNC|UNF))?$",
    re.IGNORECASE,
)


def all_thread_designations() -> tuple[str, ...]:
    """Every designation :func:`thread_by_name` knows, in table order.

    Returns
    -------
    tuple of str
        Canonical designations [unitless].
    """
    return tuple(_THREADS)


def _suggestion_error(text: str, suggestions: list[str]) -> ValueError:
    if len(suggestions) == 1:
        tail = f"nearest valid designation is {suggestions[0]}"
    else:
        tail = "nearest valid designations are " + ", ".join(suggestions)
    return ValueError(f"unknown thread {text!r}: {tail}")


def _closest(values, target):
    """Entries of values at the smallest distance from target (ties kept, in order)."""
    best = min(abs(v - target) for v in values)
    return [v for v in values if math.isclose(abs(v - target), best, rel_tol=1e-9)]


def _metric_lookup(text: str, d_mm: float, p_mm: float | None) -> ThreadSize:
    if d_mm in METRIC_COARSE_PITCH:
        coarse = METRIC_COARSE_PITCH[d_mm]
        if p_mm is None or math.isclose(p_mm, coarse):
            return _THREADS[f"M{_fmt(d_mm)}"]
        fine = METRIC_FINE_PITCHES.get(d_mm, ())
        for p in fine:
            if math.isclose(p_mm, p):
                return _THREADS[f"M{_fmt(d_mm)}x{_fmt(p)}"]
        options = sorted([coarse, *fine])
        picks = _closest(options, p_mm)
        names = [
            f"M{_fmt(d_mm)}" if p == coarse else f"M{_fmt(d_mm)}x{_fmt(p)}" for p in picks
        ]
        raise _suggestion_error(text, names)
    # Unknown diameter: the next smaller and next larger size of the same kind.
    sizes = sorted(METRIC_COARSE_PITCH)
    if p_mm is not None:
        with_pitch = sorted(
            d for d in sizes
            if any(math.isclose(p_mm, p) for p in METRIC_FINE_PITCHES.get(d, ()))
            or math.isclose(p_mm, METRIC_COARSE_PITCH[d])
        )
        sizes = with_pitch or sizes
    lower = [d for d in sizes if d < d_mm]
    upper = [d for d in sizes if d > d_mm]
    neighbours = ([lower[-1]] if lower else []) + ([upper[0]] if upper else [])
    names = []
    for d in neighbours:
        pitches = [METRIC_COARSE_PITCH[d], *METRIC_FINE_PITCHES.get(d, ())]
        p = METRIC_COARSE_PITCH[d] if p_mm is None else _closest(pitches, p_mm)[0]
        names.append(f"M{_fmt(d)}" if p == METRIC_COARSE_PITCH[d] else f"M{_fmt(d)}x{_fmt(p)}")
    raise _suggestion_error(text, names)


def _normalise_size(raw: str) -> str:
    s = re.sub(r"\s+", " ", raw.strip())
    if s.startswith("#"):
        return "#" + s[1:].strip()
    s = re.sub(r"\s*-\s*", "-", s)
    return s.replace(" ", "-")  # "1 1/8" -> "1-1/8"


def _size_value(size: str) -> float | None:
    """Basic major diameter [in] of a written size, known to the table or not."""
    if size in _UNIFIED_DIAMETERS:
        return _UNIFIED_DIAMETERS[size]
    if size.startswith("#"):
        return 0.060 + 0.013 * int(size[1:])
    whole, _, frac = size.rpartition("-") if "/" in size and "-" in size else ("", "", size)
    value = float(whole) if whole else 0.0
    if "/" in frac:
        num, den = frac.split("/")
        if int(den) == 0:
            return None
        value += int(num) / int(den)
    else:
        value += float(frac)
    return value


def _unified_lookup(text: str, size: str, tpi: float, series: str | None) -> ThreadSize:
    series = None if series is None else series.upper().replace("UNR", "UN")
    known = {"UNC": UNIFIED_COARSE_TPI, "UNF": UNIFIED_FINE_TPI}
    if size in _UNIFIED_DIAMETERS:
        for name, table in known.items():
            if size in table and math.isclose(tpi, table[size]):
                if series is not None and series != name:
                    raise ValueError(
                        f"thread {text!r} is not {series}: "
                        f"{size}-{table[size]} is a {name} thread"
                    )
                return _THREADS[f"{size}-{table[size]} {name}"]
        options = [
            (table[size], name) for name, table in known.items()
            if size in table and (series is None or series == name)
        ]
        if not options:
            options = [(table[size], name) for name, table in known.items() if size in table]
        best = _closest([n for n, _ in options], tpi)
        names = [f"{size}-{n}" for n, _ in options if n in best]
        raise _suggestion_error(text, names)
    value = _size_value(size)
    if value is None:
        raise ValueError(
            f"cannot read thread designation {text!r}: expected a name such as {_EXAMPLES}"
        )
    ordered = sorted(_UNIFIED_DIAMETERS.items(), key=lambda kv: kv[1])
    lower = [k for k, v in ordered if v < value - 1e-12]
    upper = [k for k, v in ordered if v > value + 1e-12]
    neighbours = ([lower[-1]] if lower else []) + ([upper[0]] if upper else [])
    names = []
    for s in neighbours:
        options = [
            table[s] for name, table in known.items()
            if s in table and (series is None or series == name)
        ] or [table[s] for table in known.values() if s in table]
        names.append(f"{s}-{_closest(options, tpi)[0]}")
    raise _suggestion_error(text, names)


def thread_by_name(name: str) -> ThreadSize:
    """Look up a screw thread by its usual designation.

    Parameters
    ----------
    name : str
        ISO metric ``"M16"`` (coarse pitch), ``"M12x1.5"`` (``x``, ``X`` or ``×``,
        spaces allowed; the coarse pitch written out, ``"M16x2"``, gives the coarse
        thread); unified ``"3/8-16"``, ``"1/2-13 UNC"``, ``"1-1/8-7"``, ``"#10-24"``
        (numbered sizes need the ``#``; an optional series UNC, UNF, UNRC or UNRF must
        agree with the pitch) [unitless].

    Returns
    -------
    ThreadSize
        Basic dimensions in metres and square metres.

    Raises
    ------
    ValueError
        For a designation not in the tables, naming the nearest valid ones:
        ``unknown thread 'M15': nearest valid designations are M14, M16``.

    Notes
    -----
    Metric: d2 = d - 0.649519 P, d3 = d - 1.226869 P, A_s = pi/4 ((d2 + d3)/2)^2
    (ISO 724, ISO 898-1:2013 clause 9.1.6.1). Unified: A_s = 0.7854 (D - 0.9743/n)^2
    (ASME B1.1-2003, section 10.1, for steel of up to 180 ksi).

    References
    ----------
    .. [1] ISO 261:1998, ISO metric screw threads for general purposes, general plan.
    .. [2] ISO 724:1993, ISO general-purpose metric screw threads, basic dimensions.
    .. [3] ISO 898-1:2013, Mechanical properties of fasteners made of carbon steel and
       alloy steel, Part 1: bolts, screws and studs.
    .. [4] ASME B1.1-2003, Unified inch screw threads (UN and UNR thread form).

    Examples
    --------
    >>> round(thread_by_name("M12x1.5").stress_area * 1e6, 1)
    88.1
    """
    if not isinstance(name, str):
        raise ValueError(f"thread designation must be text such as {_EXAMPLES}, got {name!r}")
    text = name.strip()
    metric = _METRIC_RE.match(text)
    if metric:
        d_mm = float(metric.group("d"))
        p_mm = None if metric.group("p") is None else float(metric.group("p"))
        if d_mm <= 0 or (p_mm is not None and p_mm <= 0):
            raise ValueError(
                f"thread {text!r} has a zero diameter or pitch: "
                f"expected a name such as {_EXAMPLES}"
            )
        return _metric_lookup(text, d_mm, p_mm)
    unified = _UNIFIED_RE.match(text)
    if unified:
        size = _normalise_size(unified.group("size"))
        tpi = float(unified.group("tpi"))
        if tpi <= 0:
            raise ValueError(
                f"thread {text!r} has zero threads per inch: "
                f"expected a name such as {_EXAMPLES}"
            )
        return _unified_lookup(text, size, tpi, unified.group("series"))
    raise ValueError(
        f"cannot read thread designation {text!r}: expected a name such as {_EXAMPLES}"
    )

"""The HTML report: one self-contained file to look at (verdict, findings, plots).

The page is XHTML-compatible HTML (every element closed, every attribute quoted), so an
XML parser reads it strictly; it has no script, no style sheet or image from elsewhere,
and its plots are inline SVG drawn with matplotlib (the optional extra ``[plots]``,
imported only here). Every plot is drawn from the findings' ``quantities``, the very
numbers the JSON report carries, never recomputed: each ``<figure>`` carries the plotted
numbers in its ``data-plotted`` attribute (JSON) and says them in its caption, and each
SVG has a ``<title>`` and ``<desc>``.

Colour-neutral: every series is black or grey, told apart by line style, marker, hatch and
label, so the page reads the same in greyscale.

Text from design files is bounded (:func:`vcheck.report.common.clean_text`) and escaped
with :func:`html.escape`, so it cannot become markup.
"""

from __future__ import annotations

import html
import io
import json
import math
import re
from collections import defaultdict

from ..findings import STATUS_ORDER, Finding
from ..results import CAUTION, RunResult
from .common import clean_text, measure_text

__all__ = ["PLOTS_HINT", "PlotsUnavailable", "render_dynamics_html", "render_html"]

PLOTS_HINT = 'the HTML report needs matplotlib: pip install "vcheck-vibration[plots]"'


class PlotsUnavailable(Exception):
    """matplotlib is not installed; the message says what to install."""


def _esc(text) -> str:
    return html.escape(clean_text(str(text)), quote=True)


def _matplotlib():
    try:
        import matplotlib
        from matplotlib.figure import Figure
    except ImportError:
        raise PlotsUnavailable(PLOTS_HINT) from None
    return matplotlib, Figure


_STYLES = ("-", "--", "-.", ":")
_MARKERS = ("o", "s", "^", "v", "D", "x", "P", "*")
_RC = {"svg.fonttype": "none", "svg.hashsalt": "vcheck", "font.size": 8,
       "text.parse_math": False}
"""Text as SVG text (small, searchable), stable ids, and no mathtext: a ``$`` in a design's
name is a dollar sign, not a formula to parse."""


def _svg_renderer():
    """matplotlib's SVG renderer, measuring each text once for the whole page.

    Every text's size is asked of the font (FreeType) when it is laid out, and matplotlib
    keeps the answers per renderer, that is per figure; the same tick labels, axis labels
    and keys recur on every plot of a kind, so the answers are kept here for the page."""
    from matplotlib.backends.backend_svg import RendererSVG

    class Renderer(RendererSVG):
        sizes: dict = {}

        def get_text_width_height_descent(self, s, prop, ismath):
            key = (s, tuple(prop.get_family()), prop.get_style(), prop.get_variant(),
                   prop.get_weight(), prop.get_stretch(), prop.get_size_in_points(),
                   prop.get_file(), prop.get_math_fontfamily(), ismath)
            size = self.sizes.get(key)
            if size is None:
                size = self.sizes[key] = super().get_text_width_height_descent(s, prop, ismath)
            return size

    return Renderer


def _svg(fig, title: str, desc: str, renderer=None) -> str:
    """The figure as an inline ``<svg>`` element with a title and description: drawn
    straight on matplotlib's SVG renderer at 72 dpi, as ``savefig(format="svg")`` does for
    a figure with nothing rasterized and no layout engine, without its metadata."""
    buffer = io.StringIO()
    Renderer = renderer or _svg_renderer()
    width, height = fig.get_size_inches()
    drawer = Renderer(width * 72, height * 72, buffer, image_dpi=72,
                      metadata={"Date": None, "Creator": None})
    fig.draw(drawer)
    drawer.finalize()
    text = buffer.getvalue()
    start = text.index("<svg")
    text = text[start:]
    text = re.sub(r"<metadata>.*?</metadata>", "", text, count=1, flags=re.S)
    head_end = text.index(">") + 1
    return (text[:head_end].replace("<svg", '<svg role="img"', 1)
            + f"<title>{_esc(title)}</title><desc>{_esc(desc)}</desc>" + text[head_end:])


def _figure(kind: str, svg: str, caption: str, plotted: dict) -> str:
    data = html.escape(json.dumps(plotted, allow_nan=False), quote=True)
    heading = svg[svg.index("<title>") + 7:svg.index("</title>")]
    return (f'<figure class="plot" data-plot="{kind}" data-plotted="{data}">'
            f"<h3>{heading}</h3>{svg}"
            f"<figcaption>{_esc(caption)}</figcaption></figure>")


def _band(value) -> tuple[float, float] | None:
    if isinstance(value, list):
        if len(value) != 2 or any(v is None for v in value):
            return None
        return float(value[0]), float(value[1])
    if value is None:
        return None
    return float(value), float(value)


def _q(finding_or_list):
    items = finding_or_list.quantities if isinstance(finding_or_list, Finding) else finding_or_list
    for item in items:
        value = list(item.value) if isinstance(item.value, tuple) else item.value
        yield item.name, value, item.unit, {k: clean_text(v, 200) for k, v in item.context}


def _hz(x: float) -> str:
    return f"{x:.4g} Hz"


def _log_axes(ax, which: str = "xy") -> None:
    """Log scales with plain tick labels ("100", "0.01"): no minor ticks and no mathtext,
    which cost most of a plot's drawing time."""
    from matplotlib.ticker import FuncFormatter, LogLocator

    for axis, scale in ((ax.xaxis, ax.set_xscale), (ax.yaxis, ax.set_yscale)):
        if axis.axis_name not in which:
            continue
        scale("log")
        axis.set_major_locator(LogLocator(base=10, numticks=6))
        axis.set_major_formatter(FuncFormatter(lambda v, _pos: f"{v:g}"))
    ax.minorticks_off()


_XLABEL_BELOW = 20.0
"""Distance of the x-axis label below the axes [pt]: below the ticks and tick labels."""
_YLABEL_LEFT = 33.0
"""Distance of the y-axis label left of the axes [pt]: left of tick labels of up to five
characters ("0.001")."""


def _fixed_axes(ax, log: str) -> None:
    """Ticks and axis labels set once for a plot kind: about six major ticks a linear axis
    (``log`` names the axes on a log scale, :func:`_log_axes`), and the axis labels at a
    fixed distance from the axes (matplotlib otherwise measures every tick label again to
    place them, on every plot)."""
    from matplotlib.ticker import MaxNLocator

    if log:
        _log_axes(ax, log)
    for axis in (ax.xaxis, ax.yaxis):
        if axis.axis_name not in log:
            axis.set_major_locator(MaxNLocator(6, steps=[1, 2, 2.5, 5, 10]))
    fig = ax.figure
    box = ax.get_position()
    ax.xaxis.set_label_coords(0.5, -_XLABEL_BELOW / (box.height * fig.get_figheight() * 72))
    ax.yaxis.set_label_coords(-_YLABEL_LEFT / (box.width * fig.get_figwidth() * 72), 0.5)


class _Canvas:
    """One matplotlib Figure and Axes per plot kind, made at the first plot of that kind
    on the page and reused for the others: a new Axes costs its ticks, spines and
    scales, which took a third of the drawing time. Before each plot the previous one's
    artists and legend are removed; every plot sets its own limits and locators, so no
    plot depends on the one before (the page is the same whichever order)."""

    def __init__(self, Figure):
        self._Figure = Figure
        self._axes: dict[str, object] = {}
        self._renderer = _svg_renderer()

    def svg(self, fig, title: str, desc: str) -> str:
        return _svg(fig, title, desc, self._renderer)

    def axes(self, kind: str, size: tuple[float, float], adjust: dict, log: str = ""):
        ax = self._axes.get(kind)
        if ax is None:
            fig = self._Figure(figsize=size, dpi=72)
            ax = fig.add_subplot()
            fig.subplots_adjust(**adjust)
            _fixed_axes(ax, log)
            self._axes[kind] = ax
            return ax
        if ax.legend_ is not None:
            ax.legend_.remove()
        for artist in [*ax.lines, *ax.patches, *ax.collections, *ax.texts]:
            artist.remove()
        ax.containers.clear()
        return ax


_ROW = 9.0
"""Height of a row of a plot's key [pt] (its labels are 6 pt)."""
_SWATCH = 16.0
"""Width of the sample of line, marker or hatch before each label of a plot's key [pt]."""


def _legend(ax, handles=None) -> None:
    """The key to a plot's series, right of its axes: a sample and the label of each
    series, one row each from the top, placed at fixed offsets. (matplotlib's Legend lays
    itself out in nested boxes that measure every label several times: half of what the
    plots cost to draw.) The samples are added as plain artists, outside the data limits.
    Rows that would fall below the figure are summed up in one."""
    from matplotlib.container import Container
    from matplotlib.lines import Line2D
    from matplotlib.patches import Rectangle

    if handles is None:
        handles = ax.get_legend_handles_labels()[0]
    fig = ax.figure
    box = ax.get_position()
    dx = 1 / (box.width * fig.get_figwidth() * 72)  # one point, in axes fractions
    dy = 1 / (box.height * fig.get_figheight() * 72)
    rows = max(int((box.y1 * fig.get_figheight() * 72 - 4) // _ROW), 1)
    shown = handles if len(handles) <= rows else handles[:rows - 1]
    left, right = 1 + 7 * dx, 1 + (7 + _SWATCH) * dx
    # the characters of a label that fit between its sample and the figure's edge, at
    # 6 pt and about 0.5 em a character (the caption names every series in full)
    room = (1 - box.x1) * fig.get_figwidth() * 72 - (7 + _SWATCH + 5) - 4
    fits = max(int(room / (0.5 * 6)), 8)
    for i, handle in enumerate(shown):
        y = 1 - (i + 0.5) * _ROW * dy
        label = handle.get_label()
        if len(label) > fits:
            label = label[:fits - 3].rstrip() + "..."
        if isinstance(handle, Container):
            handle = handle[0]
        if isinstance(handle, Line2D):
            ax.add_artist(Line2D(
                [left, (left + right) / 2, right], [y, y, y], transform=ax.transAxes,
                clip_on=False, color=handle.get_color(), linestyle=handle.get_linestyle(),
                linewidth=handle.get_linewidth(), solid_capstyle=handle.get_solid_capstyle(),
                marker=handle.get_marker(), markevery=[1], markersize=handle.get_markersize(),
                markerfacecolor=handle.get_markerfacecolor(),
                markeredgecolor=handle.get_markeredgecolor(),
                markeredgewidth=handle.get_markeredgewidth()))
        else:
            ax.add_artist(Rectangle(
                (left, y - 3.5 * dy), right - left, 7 * dy, transform=ax.transAxes,
                clip_on=False, facecolor=handle.get_facecolor(),
                edgecolor=handle.get_edgecolor(), hatch=handle.get_hatch(),
                linewidth=handle.get_linewidth()))
        ax.text(right + 5 * dx, y, label, transform=ax.transAxes, fontsize=6, ha="left",
                va="center", clip_on=False)
    if len(shown) < len(handles):
        ax.text(left, 1 - (len(shown) + 0.5) * _ROW * dy,
                f"and {len(handles) - len(shown)} more series (named in the caption)",
                transform=ax.transAxes, fontsize=6, ha="left", va="center", clip_on=False)


# -- interference diagram --------------------------------------------------------------

def interference_data(quantities, natural: str, forcing: str, group: str | None = None) -> list[dict]:
    """The numbers of an interference diagram, per group (a shaft train) or one for all:
    natural frequency bands per mode, forcing bands, required separation and the closest
    pair (least separation)."""
    groups: dict[str, dict] = {}

    def slot(context):
        key = context.get(group, "") if group else ""
        return groups.setdefault(key, {"group": key, "modes": {}, "bands": {}, "required": None,
                                       "closest": None})

    for name, value, _unit, context in _q(quantities):
        if name == natural + " band" or (name == natural and context.get("mode") is not None):
            band = _band(value)
            if band is None:
                continue
            mode = context.get("mode", "")
            modes = slot(context)["modes"]
            if name.endswith(" band") or mode not in modes:
                modes[mode] = list(band)
        elif name == forcing:
            band = _band(value)
            if band is not None:
                slot(context)["bands"][context.get("band", "")] = {
                    "range": list(band), "kind": context.get("kind", "")}
        elif name == "required separation" and isinstance(value, (int, float)):
            for g in groups.values() or [slot(context)]:
                g["required"] = float(value)
        elif name == "separation" and isinstance(value, (int, float)):
            g = slot(context)
            if g["closest"] is None or value < g["closest"]["separation"]:
                g["closest"] = {"mode": context.get("mode", ""), "band": context.get("band", ""),
                                "separation": float(value)}
    required = next((g["required"] for g in groups.values() if g["required"] is not None), None)
    out = []
    for g in groups.values():
        if g["modes"] and g["bands"]:
            g["required"] = g["required"] if g["required"] is not None else required
            out.append(g)
    return out


def _speed_range(bands: dict) -> tuple[float, float] | None:
    for name, band in bands.items():
        if band["kind"] == "running-speed" and name.startswith("1x"):
            return tuple(band["range"])
    return None


def _interference_plot(canvas: _Canvas, data: dict, what: str):
    speed = data.get("speed") or _speed_range(data["bands"])
    lo_s, hi_s = speed if speed else (0.0, 1.0)
    ax = canvas.axes("interference", (7.0, 4.2), dict(left=0.09, right=0.6, bottom=0.12))
    xs = (lo_s, hi_s) if hi_s > lo_s else (lo_s * 0.95, lo_s * 1.05)
    ratio = hi_s / lo_s if speed and lo_s > 0 else None
    required = data["required"] or 0.0
    top = 0.0
    for i, (mode, (f_lo, f_hi)) in enumerate(data["modes"].items()):
        mode = mode if not data["group"] else f"mode {mode}"
        if required and required < 1:
            ax.axhspan(f_lo / (1 + required), f_hi / (1 - required), facecolor="none",
                       edgecolor="0.55", hatch="-----", linewidth=0,
                       label="separation margin" if i == 0 else None)
        if f_hi - f_lo > 0.01 * max(abs(f_hi), 1e-9):
            ax.axhspan(f_lo, f_hi, facecolor="0.75", edgecolor="black", hatch="//",
                       linewidth=0.6, label=f"natural frequency band: {mode}")
        else:  # one number: a thick grey line, visible where a band would be a hairline
            ax.axhline(f_lo, color="0.45", linewidth=3, solid_capstyle="butt",
                       label=f"natural frequency: {mode}")
        top = max(top, f_hi / (1 - required) if 0 < required < 1 else f_hi)
    for i, (name, band) in enumerate(data["bands"].items()):
        b_lo, b_hi = band["range"]
        style, marker = _STYLES[i % len(_STYLES)], _MARKERS[i % len(_MARKERS)]
        scales = ratio is not None and b_lo > 0 and math.isclose(b_hi / b_lo, ratio, rel_tol=1e-6)
        if scales or (speed is None and b_hi != b_lo):
            ax.plot(xs, (b_lo, b_hi), color="black", linestyle=style, marker=marker,
                    markersize=4, linewidth=0.9, label=f"order line: {name}")
        elif b_hi > b_lo:
            ax.axhspan(b_lo, b_hi, facecolor="none", edgecolor="black", hatch="xx",
                       linewidth=0.4, label=f"fixed band: {name}")
        else:
            ax.plot(xs, (b_lo, b_lo), color="0.35", linestyle=style, marker=marker,
                    markersize=4, linewidth=0.9, label=f"fixed: {name}")
        top = max(top, b_lo)
    closest = data["closest"]
    if closest and closest["band"] in data["bands"] and closest["mode"] in data["modes"]:
        b_lo, b_hi = data["bands"][closest["band"]]["range"]
        f_lo, f_hi = data["modes"][closest["mode"]]
        centre = (f_lo + f_hi) / 2
        # the speed where the band comes nearest the mode (it moves linearly with speed)
        t = 0.5 if b_hi == b_lo else min(max((centre - b_lo) / (b_hi - b_lo), 0.0), 1.0)
        x = xs[0] + t * (xs[1] - xs[0])
        y = b_lo + t * (b_hi - b_lo)
        ax.plot([x], [y], linestyle="none", marker="X", markersize=11, markerfacecolor="white",
                markeredgecolor="black", label=f"closest pair: separation {closest['separation']:.1%}")
    ax.set_ylim(0, top * 1.15 if top > 0 else 1)
    ax.set_xlim(*xs)
    ax.set_xlabel("running speed (Hz)" if speed else "position in the speed range (0 = lowest)")
    ax.set_ylabel("frequency (Hz)")
    _legend(ax)
    return ax.figure


def _interference_figure(canvas: _Canvas, data: dict, what: str) -> str:
    fig = _interference_plot(canvas, data, what)
    modes = "; ".join(f"{m}: {_hz(a)} to {_hz(b)}" for m, (a, b) in data["modes"].items())
    bands = "; ".join(f"{n}: {_hz(b['range'][0])} to {_hz(b['range'][1])}"
                      for n, b in data["bands"].items())
    closest = data["closest"]
    near = (f" Closest pair: {closest['mode']} and {closest['band']}, separation "
            f"{closest['separation']:.1%}." if closest else "")
    req = f" Required separation {data['required']:.0%}." if data["required"] else ""
    text = f"{what}. Natural frequencies: {modes}. Forcing: {bands}.{req}{near}"
    return _figure("interference", canvas.svg(fig, what, text), text, data)


# -- transmissibility ------------------------------------------------------------------

def transmissibility_data(quantities) -> dict | None:
    bands: dict[str, dict] = {}
    required = None
    for name, value, _unit, context in _q(quantities):
        band = context.get("band")
        if name == "frequency ratio" and band is not None:
            r = _band(value)
            if r is not None:
                bands.setdefault(band, {})["ratio"] = list(r)
        elif name == "transmissibility" and band is not None and isinstance(value, (int, float)):
            bands.setdefault(band, {})["transmissibility"] = float(value)
        elif name == "required efficiency" and isinstance(value, (int, float)):
            required = float(value)
    bands = {k: v for k, v in bands.items() if "ratio" in v and "transmissibility" in v}
    if not bands:
        return None
    return {"bands": bands, "required efficiency": required}


def _transmissibility_figure(canvas: _Canvas, data: dict) -> str:
    import numpy as np

    ax = canvas.axes("transmissibility", (7.0, 4.0), dict(left=0.09, right=0.6, bottom=0.13),
                     log="xy")
    highest = max(max(b["ratio"]) for b in data["bands"].values())
    lowest = min(min(b["ratio"]) for b in data["bands"].values())
    r = np.geomspace(max(min(lowest, 0.3) / 2, 1e-3), max(highest, 2.0) * 1.5, 400)
    with np.errstate(divide="ignore"):
        reference = 1 / np.abs(1 - r ** 2)
    reference = np.minimum(reference, 100)
    ax.plot(r, reference, color="0.5", linestyle=":", linewidth=1,
            label="undamped single-mass reference 1/|1 - r²| (shape only)")
    ax.axvspan(r[0], math.sqrt(2), facecolor="none", edgecolor="0.5", hatch="\\\\", linewidth=0,
               label="amplification zone (r < √2)")
    if data["required efficiency"] is not None:
        ax.axhline(1 - data["required efficiency"], color="black", linestyle="--", linewidth=0.8,
                   label=f"largest transmissibility for {data['required efficiency']:.0%} efficiency")
    for i, (name, band) in enumerate(data["bands"].items()):
        a, b = band["ratio"]
        t = band["transmissibility"]
        marker = _MARKERS[i % len(_MARKERS)]
        ax.plot([a, b], [t, t], color="black", linestyle=_STYLES[i % len(_STYLES)], marker=marker,
                markersize=5, linewidth=1.6, label=f"{name}: T = {t:.3g}")
    shown = [reference.min(), *(b["transmissibility"] for b in data["bands"].values())]
    if data["required efficiency"] is not None:
        shown.append(1 - data["required efficiency"])
    shown = [v for v in shown if v > 0 and math.isfinite(v)]
    ax.set_xlim(r[0], r[-1])
    ax.set_ylim(min(shown, default=1e-3) / 1.5, max([*shown, 100.0]) * 1.5)
    ax.set_xlabel("frequency ratio r = forcing / natural frequency")
    ax.set_ylabel("transmissibility")
    _legend(ax)
    fig = ax.figure
    text = ("Transmissibility against frequency ratio. " + "; ".join(
        f"{n}: ratio {b['ratio'][0]:.3g} to {b['ratio'][1]:.3g}, transmissibility "
        f"{b['transmissibility']:.3g}" for n, b in data["bands"].items()) + ".")
    return _figure("transmissibility", canvas.svg(fig, "Transmissibility", text), text, data)


# -- S-N curve -------------------------------------------------------------------------

def fatigue_data(quantities) -> list[dict]:
    details: dict[str, dict] = {}
    for name, value, _unit, context in _q(quantities):
        detail, bin_ = context.get("detail"), context.get("bin")
        if detail is None or bin_ is None or name not in ("stress range", "cycles",
                                                          "allowed cycles", "damage"):
            continue
        details.setdefault(detail, {}).setdefault(bin_, {})[name] = value
    out = []
    for detail, bins in details.items():
        rows = [dict(bin=k, **v) for k, v in bins.items() if v.get("stress range") is not None]
        if rows:
            out.append({"detail": detail, "bins": rows})
    return out


def _fatigue_figure(canvas: _Canvas, data: dict) -> str:
    ax = canvas.axes("s-n", (7.0, 4.0), dict(left=0.1, right=0.6, bottom=0.13), log="xy")
    bins = data["bins"]
    curve = sorted((b["allowed cycles"], b["stress range"]) for b in bins
                   if isinstance(b.get("allowed cycles"), (int, float)) and b["allowed cycles"] > 0)
    if curve:
        ax.plot([n for n, _ in curve], [s / 1e6 for _, s in curve], color="black", linestyle="-",
                marker="o", markersize=3, linewidth=1.2, label="S-N curve (allowed cycles per bin)")
    loaded = [b for b in bins if isinstance(b.get("cycles"), (int, float)) and b["cycles"] > 0]
    if loaded:
        ax.plot([b["cycles"] for b in loaded], [b["stress range"] / 1e6 for b in loaded],
                color="0.4", linestyle="none", marker="s", markersize=4,
                label="bins: cycles in the design life")
    damaged = [b for b in bins if isinstance(b.get("damage"), (int, float))]
    governing = max(damaged, key=lambda b: b["damage"], default=None)
    if governing is not None and governing["damage"] > 0 and governing in loaded:
        ax.plot([governing["cycles"]], [governing["stress range"] / 1e6], linestyle="none",
                marker="X", markersize=11, markerfacecolor="white", markeredgecolor="black",
                label=f"governing bin: {governing['bin']}, damage {governing['damage']:.3g}")
    points = [*curve, *((b["cycles"], b["stress range"]) for b in loaded)]
    points = [(n, s) for n, s in points if n > 0 and s > 0 and math.isfinite(n * s)]
    if points:
        ax.set_xlim(min(n for n, _ in points) / 2, max(n for n, _ in points) * 2)
        ax.set_ylim(min(s for _, s in points) / 1.5e6, max(s for _, s in points) * 1.5 / 1e6)
    else:
        ax.set_xlim(1, 10)
        ax.set_ylim(1, 10)
    ax.set_xlabel("cycles")
    ax.set_ylabel("stress range (MPa)")
    _legend(ax)
    fig = ax.figure
    below = "" if curve else " Every bin is below the cut-off (no allowed number of cycles)."
    text = (f"S-N curve of {data['detail']} with {len(bins)} bins; " + "; ".join(
        f"{b['bin']}: {b.get('cycles'):.4g} cycles of {b['stress range'] / 1e6:.4g} MPa"
        for b in loaded[:20]) + "." + below)
    return _figure("s-n", canvas.svg(fig, f"S-N curve: {data['detail']}", text), text, data)


# -- mount forces ----------------------------------------------------------------------

def mount_force_data(quantities) -> list[dict]:
    """The numbers of a mount-force plot: for each machine load the six-DOF model judged,
    the largest force at each mount over its band, and the worst mount's force with rigid
    mounting (the load shared by the mounts without dynamic amplification) [N]."""
    loads: dict[str, dict] = {}
    for name, value, _unit, context in _q(quantities):
        load = context.get("load")
        if load is None:
            continue
        if name == "force at each mount" and isinstance(value, list):
            loads.setdefault(load, {})["mounts"] = value
        elif name == "rigid force at each mount" and isinstance(value, list):
            loads.setdefault(load, {})["rigid mounts"] = value
        elif name in ("force component at each mount", "rigid force component at each mount") \
                and isinstance(value, list) and context.get("direction") in _DIRECTIONS:
            key = "rigid components" if name.startswith("rigid") else "components"
            loads.setdefault(load, {}).setdefault(key, {})[context["direction"]] = value
        elif name in ("rigid mount force", "largest mount force") and context.get("mount"):
            key = "rigid" if name.startswith("rigid") else "largest"
            loads.setdefault(load, {})[key] = {"mount": context["mount"], "force": value}
    out = []
    for k, v in loads.items():
        if not v.get("mounts"):
            continue
        item = {"load": k, "mounts": v["mounts"], "rigid": v.get("rigid"),
                "largest": v.get("largest")}
        count = len(v["mounts"])
        parts = (v.get("components", {}), v.get("rigid components", {}))
        if all(len(part) == 3 and all(len(part[d]) == count for d in _DIRECTIONS)
               for part in parts) and len(v.get("rigid mounts", ())) == count:
            item["rigid mounts"] = v["rigid mounts"]
            item["components"] = {d: parts[0][d] for d in _DIRECTIONS}
            item["rigid components"] = {d: parts[1][d] for d in _DIRECTIONS}
        out.append(item)
    return out


_DIRECTIONS = ("x", "y", "z")
"""Machine axes of the force components: x along the shaft, y across it, z up."""
_DIRECTION_WORDS = {"x": "x (along the shaft)", "y": "y (across)", "z": "z (vertical)"}
_NEGLIGIBLE = 1e-6
"""A component below this fraction of the plot's largest force is left undrawn (said so)."""


def _mount_axes(ax, ylim: tuple[float, float], count: int, ylabel: str) -> None:
    """Limits, ticks and labels of a plot with a place per mount."""
    from matplotlib.ticker import FixedLocator, MaxNLocator

    ax.set_ylim(*ylim)
    ax.set_xlim(0.5, count + 0.5)
    ax.xaxis.set_major_locator(FixedLocator(range(1, count + 1)) if count <= 24
                               else MaxNLocator(12, integer=True))
    ax.set_xlabel("mount (in the order of [[mounting.mount]])")
    ax.set_ylabel(ylabel)


def _direction_figure(canvas: _Canvas, load: dict, what: str) -> str:
    """One machine load: at each mount, the largest amplitude over the band of each force
    component (x, y, z; hatched bars) on the isolators, against the same component with
    rigid mounting (open markers) [N]."""
    ax = canvas.axes("mount-directions", (7.0, 3.6), dict(left=0.1, right=0.6, bottom=0.14),
                     log="y")
    count = len(load["mounts"])
    series = [load["components"][d] for d in _DIRECTIONS]
    series += [load["rigid components"][d] for d in _DIRECTIONS]
    finite = [v for values in series for v in values if v is not None]
    top = max(finite, default=1.0) or 1.0
    low = max(min((v for v in finite if v > top * _NEGLIGIBLE), default=top), top * 1e-4) / 3
    width = 0.8 / 3
    handles = []
    for i, d in enumerate(_DIRECTIONS):
        offset = (i - 1) * width
        values = load["components"][d]
        kept = [(m, v) for m, v in enumerate(values) if v is not None and v > top * _NEGLIGIBLE]
        if kept:  # (a component that is nowhere drawn has no key row; the caption says it)
            handles.append(ax.bar([m + 1 + offset for m, _ in kept],
                                  [v - low for _, v in kept], width=width * 0.9, bottom=low,
                                  color=_FILLS[i], edgecolor="black", linewidth=0.6,
                                  hatch=_HATCHES[i], label=f"isolated, {_DIRECTION_WORDS[d]}"))
        rigid = [(m, v) for m, v in enumerate(load["rigid components"][d])
                 if v is not None and v > top * _NEGLIGIBLE]
        if rigid:
            handles += ax.plot([m + 1 + offset for m, _ in rigid], [v for _, v in rigid],
                               linestyle="none", marker=_MARKERS[i], markersize=6,
                               markerfacecolor="white", markeredgecolor="black",
                               markeredgewidth=1.1, label=f"rigid, {_DIRECTION_WORDS[d]}")
    _mount_axes(ax, (low, top * 3), count, "largest force component over the band (N)")
    _legend(ax, handles)

    def said(v) -> str:
        return "about 0 N" if v is not None and v <= top * _NEGLIGIBLE else _n(v)

    def listed(values) -> str:
        shown = ", ".join(f"mount {m + 1} {said(v)}" for m, v in enumerate(values[:48]))
        return shown + (f" and {len(values) - 48} more mounts" if len(values) > 48 else "")

    text = (f"{what}. The largest amplitude over the load's band of each "
            "force component at each mount (machine axes: x along the shaft, y across it, z "
            "vertical), on the isolators (bars) and with rigid mounting (open markers). "
            + "; ".join(f"{_DIRECTION_WORDS[d]} isolated: {listed(load['components'][d])}; "
                        f"rigid: {listed(load['rigid components'][d])}"
                        for d in _DIRECTIONS)
            + f". Components of at most {_NEGLIGIBLE:g} of the largest ({_n(top)}), said as "
            "about 0 N, are not drawn.")
    plotted = {key: load[key] for key in ("load", "components", "rigid components")}
    return _figure("mount-directions", canvas.svg(ax.figure, what, text), text, plotted)


_HATCHES = ("//", "\\\\", "xx", "--", "||", "++")
_FILLS = ("0.6", "0.85", "1.0", "0.75", "0.95", "0.5")


def _n(value) -> str:
    return "not finite" if value is None else f"{value:.4g} N"


def _mount_force_figure(canvas: _Canvas, loads: list[dict], what: str) -> str:
    ax = canvas.axes("mount-forces", (7.0, 3.6), dict(left=0.1, right=0.6, bottom=0.14), log="y")
    count = max(len(load["mounts"]) for load in loads)
    width = 0.8 / len(loads)
    shown = [v for load in loads for v in load["mounts"] if v is not None and v > 0]
    shown += [load["rigid"]["force"] for load in loads if load["rigid"]
              and load["rigid"]["force"] is not None and load["rigid"]["force"] > 0]
    low = min(shown, default=1.0) / 3
    handles = []
    for i, load in enumerate(loads):
        offset = (i - (len(loads) - 1) / 2) * width
        xs = [m + 1 + offset for m, v in enumerate(load["mounts"]) if v is not None and v > 0]
        heights = [v - low for v in load["mounts"] if v is not None and v > 0]
        handles.append(ax.bar(xs, heights, width=width * 0.9, bottom=low,
                              color=_FILLS[i % len(_FILLS)], edgecolor="black", linewidth=0.6,
                              hatch=_HATCHES[i % len(_HATCHES)],
                              label=f"isolated: {load['load']}"))
        rigid = load["rigid"]
        if rigid and rigid["force"] is not None and rigid["force"] > 0:
            try:
                at = int(rigid["mount"])
            except ValueError:
                continue
            handles += ax.plot([at + offset], [rigid["force"]], linestyle="none",
                               marker=_MARKERS[i % len(_MARKERS)], markersize=7,
                               markerfacecolor="white", markeredgecolor="black",
                               markeredgewidth=1.2, label=f"rigid, mount {at}: {load['load']}")
    _mount_axes(ax, (low, max(shown, default=1.0) * 3), count,
                "largest force over the band (N)")
    _legend(ax, handles)
    fig = ax.figure
    text = (f"{what}. Largest force at each mount over the load's band, on the isolators, "
            "against the worst mount's force with rigid mounting. " + "; ".join(
                f"{load['load']}: " + ", ".join(
                    f"mount {m + 1} {_n(v)}" for m, v in enumerate(load["mounts"][:48]))
                + (f" and {len(load['mounts']) - 48} more mounts" if len(load["mounts"]) > 48
                   else "")
                + (f"; rigid mounting, mount {load['rigid']['mount']} "
                   f"{_n(load['rigid']['force'])}" if load["rigid"] else "")
                for load in loads) + ".")
    return _figure("mount-forces", canvas.svg(fig, what, text), text, {"loads": loads})


# -- joints ----------------------------------------------------------------------------

_JOINT = ("least assembly preload", "largest assembly preload", "preload at yield",
          "residual clamp load", "slip resistance", "transverse load", "static transverse load")


def joint_data(quantities) -> list[dict]:
    joints: dict[str, dict] = {}
    for name, value, _unit, context in _q(quantities):
        joint = context.get("joint")
        if joint is None or name not in _JOINT or not isinstance(value, (int, float)):
            continue
        entry = joints.setdefault(joint, {})
        entry.setdefault(name, {"value": float(value), "per": context.get("per", "")})
    return [{"joint": j, "values": v} for j, v in joints.items()
            if "least assembly preload" in v and "largest assembly preload" in v]


def _joint_figure(canvas: _Canvas, data: dict) -> str:
    values = data["values"]
    ax = canvas.axes("joint", (7.0, 2.2), dict(left=0.04, right=0.6, bottom=0.25, top=0.82))
    lo, hi = values["least assembly preload"]["value"], values["largest assembly preload"]["value"]
    ax.barh([0], [(hi - lo) / 1e3], left=[lo / 1e3], height=0.4, color="0.85", edgecolor="black", hatch="//",
            label="assembly preload, least to largest (per bolt)")
    marks = [("residual clamp load", "o"), ("preload at yield", "|"),
             ("slip resistance", "s"), ("transverse load", "^")]
    for name, marker in marks:
        if name in values:
            v = values[name]
            ax.plot([v["value"] / 1e3], [0], linestyle="none", marker=marker, markersize=9,
                    markerfacecolor="white" if marker not in "|" else "black",
                    markeredgecolor="black", markeredgewidth=1.5,
                    label=f"{name} (per {v['per']}): {v['value'] / 1e3:.4g} kN")
    ax.set_yticks([])
    ax.set_ylim(-0.5, 0.5)
    largest = max([hi, *(v["value"] for v in values.values())])
    ax.set_xlim(0, largest * 1.12 / 1e3 if largest > 0 and math.isfinite(largest) else 1)
    ax.set_xlabel("force (kN)")
    _legend(ax)
    fig = ax.figure
    text = (f"Joint {data['joint']}: " + "; ".join(
        f"{n} {v['value'] / 1e3:.4g} kN per {v['per']}" for n, v in values.items()) + ".")
    return _figure("joint", canvas.svg(fig, f"Joint: {data['joint']}", text), text, data)


# -- the page --------------------------------------------------------------------------

def design_plots(canvas: _Canvas, findings: list[Finding]) -> list[str]:
    """The figures of one design's findings, in a fixed order."""
    out = []
    for finding in findings:
        if finding.rule_id == "frequency-separation":
            for data in interference_data(finding.quantities, "natural frequency",
                                          "forcing frequency band"):
                out.append(_interference_figure(
                    canvas, data, f"Interference diagram: {clean_text(finding.target, 90)}"[:90]))
    for finding in findings:
        if finding.rule_id == "isolation-efficiency":
            data = transmissibility_data(finding.quantities)
            if data is not None:
                out.append(_transmissibility_figure(canvas, data))
    for finding in findings:
        if finding.rule_id == "isolation-efficiency":
            loads = mount_force_data(finding.quantities)
            if loads:
                target = clean_text(finding.target, 90)
                out.append(_mount_force_figure(canvas, loads, f"Mount forces: {target}"[:90]))
                out.extend(_direction_figure(
                    canvas, load, f"Mount forces by direction: {target}, "
                    f"{clean_text(load['load'], 60)}"[:120])
                    for load in loads if "components" in load)
    for finding in findings:
        if finding.rule_id == "fatigue-damage":
            out.extend(_fatigue_figure(canvas, data) for data in fatigue_data(finding.quantities))
    for finding in findings:
        if finding.rule_id == "torsional-separation":
            for data in interference_data(finding.quantities, "torsional natural frequency",
                                          "excitation band", group="train"):
                out.append(_interference_figure(
                    canvas, data, f"Torsional interference: {data['group']}"[:90]))
    joint_q = [q for f in findings if f.rule_id.startswith("joint-") for q in f.quantities]
    out.extend(_joint_figure(canvas, data) for data in joint_data(joint_q))
    return out


_CSS = """
body{font-family:sans-serif;max-width:70em;margin:1em auto;padding:0 1em;color:#000;background:#fff}
table{border-collapse:collapse;width:100%;font-size:0.85em}
td,th{border:1px solid #888;padding:2px 4px;text-align:left;vertical-align:top}
.status{font-weight:bold;white-space:nowrap}
figure{margin:1em 0}figure svg{max-width:100%;height:auto}
figcaption{font-size:0.8em}
.verdict{font-size:1.4em;font-weight:bold;border:3px double #000;padding:0.3em}
"""


def _findings_table(findings: list[Finding]) -> str:
    rows = []
    order = {status: i for i, status in enumerate(STATUS_ORDER)}
    for f in sorted(findings, key=lambda f: (order[f.status], f.rule_id, f.target)):
        found = measure_text(f.measured) if f.measured is not None else ""
        limit = measure_text(f.limit) if f.limit is not None else ""
        rows.append(f'<tr data-status="{f.status.value}"><td class="status">{_esc(f.status.label)}'
                    f"</td><td>{_esc(f.rule_id)}</td><td>{_esc(f.target)}</td>"
                    f"<td>{_esc(f.message)}</td><td>{_esc(found)}</td><td>{_esc(limit)}</td></tr>")
    head = ("<tr><th>status</th><th>rule</th><th>target</th><th>finding</th><th>found</th>"
            "<th>limit</th></tr>")
    return f"<table>{head}{''.join(rows)}</table>"


def page(title: str, body: list[str]) -> str:
    return ("<!DOCTYPE html>\n"
            '<html xmlns="http://www.w3.org/1999/xhtml" lang="en"><head><meta charset="utf-8"/>'
            f"<title>{_esc(title)}</title><style>{_CSS}</style></head><body>"
            + "\n".join(body) + "</body></html>\n")


def render_html(result: RunResult) -> str:
    matplotlib, Figure = _matplotlib()
    counts = result.counts()
    body = [f"<h1>vcheck report: {_esc(result.project or 'project')}</h1>",
            f'<p class="verdict" id="verdict">Verdict: {_esc(result.verdict.upper())}</p>',
            "<p>" + ", ".join(f"{_esc(k)} {v}" for k, v in counts.items()) + "</p>",
            f"<p>{_esc(CAUTION)}</p>"]
    for note in result.notes:
        body.append(f"<p>Note: {_esc(note)}</p>")
    if result.problems:
        body.append("<h2>Input problems</h2><ul>" + "".join(
            f"<li>{_esc(p.file)}:{p.line}:{p.column}: {_esc(p.message)}</li>"
            for p in result.problems) + "</ul>")
    by_file: dict[str, list[Finding]] = defaultdict(list)
    for finding in result.findings:
        by_file[finding.file].append(finding)
    import warnings

    with matplotlib.rc_context(_RC), warnings.catch_warnings():
        # a glyph the bundled font lacks is still written as text; no warning on stderr
        warnings.simplefilter("ignore", UserWarning)
        canvas = _Canvas(Figure)
        for design in result.designs:
            findings = by_file.get(design.file, [])
            body.append(f'<section class="design"><h2>{_esc(design.tag)} '
                        f"<small>({_esc(design.kind)}, {_esc(design.file)})</small></h2>")
            body.append(_findings_table(findings))
            body.extend(design_plots(canvas, findings))
            body.append("</section>")
    return page("vcheck report", body)


# -- the unjudged view: vcheck dynamics --format html ----------------------------------

def _dynamics_interference(modes, bands, separations, speed) -> dict:
    closest = min(separations, key=lambda s: s["separation"]
                  if s.get("separation") is not None else math.inf, default=None)
    data = {"group": "", "speed": speed,
            "modes": {str(m["name"]): [m["low"], m["high"]] for m in modes
                      if m.get("low") is not None and m.get("high") is not None},
            "bands": {str(b["name"]): {"range": [b["low"], b["high"]], "kind": b.get("kind", "")}
                      for b in bands if b.get("low") is not None and b.get("high") is not None},
            "required": None,
            "closest": None if closest is None or closest.get("separation") is None else
            {"mode": str(closest["mode"]), "band": str(closest["band"]),
             "separation": closest["separation"]}}
    return data


def render_dynamics_html(designs, problems) -> str:
    """The unjudged dynamics view (:func:`vcheck.report.dynamics_json.dynamics_data`, the
    numbers of ``vcheck dynamics --format json``) as one self-contained page."""
    matplotlib, Figure = _matplotlib()
    import warnings

    from .dynamics_json import dynamics_data

    data = dynamics_data(designs, problems)
    body = ["<h1>vcheck dynamics (unjudged)</h1>", f"<p>{_esc(data['note'])}</p>",
            f"<p>{_esc(CAUTION)}</p>"]
    if data["input-problems"]:
        body.append("<h2>Input problems</h2><ul>" + "".join(
            f"<li>{_esc(p['file'])}:{p['line']}:{p['column']}: {_esc(p['message'])}</li>"
            for p in data["input-problems"]) + "</ul>")
    with matplotlib.rc_context(_RC), warnings.catch_warnings():
        warnings.simplefilter("ignore", UserWarning)
        canvas = _Canvas(Figure)
        for design in data["designs"]:
            body.append(f'<section class="design"><h2>{_esc(design["tag"])} '
                        f"<small>({_esc(design['kind'])}, {_esc(design['file'])})</small></h2>")
            speed = design.get("speed") or {}
            span = ((speed["min"], speed["max"]) if speed.get("min") is not None
                    and speed.get("max") is not None else None)
            rows = "".join(f"<tr><td>{_esc(m['name'])}</td><td>{_esc(_num(m['low']))}</td>"
                           f"<td>{_esc(_num(m['high']))}</td><td>{_esc(m['origin'])}</td></tr>"
                           for m in design["natural-frequencies"])
            if rows:
                body.append("<table><tr><th>natural frequency</th><th>low (Hz)</th>"
                            f"<th>high (Hz)</th><th>origin</th></tr>{rows}</table>")
            plot = _dynamics_interference(design["natural-frequencies"], design["forcing-bands"],
                                          design["separations"], span)
            if plot["modes"] and plot["bands"]:
                body.append(_interference_figure(
                    canvas, plot, f"Interference diagram: {clean_text(design['tag'], 80)}"))
            for train in design["shaft-trains"]:
                plot = _dynamics_interference(
                    [{"name": str(m["number"]), "low": m["low"], "high": m["high"]}
                     for m in train["modes"]],
                    train["excitation-bands"], train["separations"], span)
                plot["group"] = clean_text(train["name"], 80)
                if plot["modes"] and plot["bands"]:
                    body.append(_interference_figure(
                        canvas, plot, f"Torsional interference: {plot['group']}"))
            body.append("</section>")
    return page("vcheck dynamics", body)


def _num(value) -> str:
    return "" if value is None else f"{value:.4g}"

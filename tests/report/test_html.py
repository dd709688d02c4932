"""The HTML report (``--format html``, ``--report html=FILE``).

Checks against the outside:

* well-formedness with the standard library's XML parser (``xml.etree.ElementTree``): it
  is strict (an unclosed or misnested element, a bare ``&`` or ``<`` is an error), where
  ``html.parser`` accepts any text and so could not fail; the page is written as
  XHTML-compatible HTML so that the strict parser applies;
* self-containment: no ``src``/``href`` to an ``http(s)://`` or ``//`` address, no
  ``<script>``, no ``<link>``, no ``url(`` or ``@import`` in the style sheet (the W3C
  HTML and SVG attributes that fetch);
* the plotted numbers against the JSON report's ``quantities`` of the same run, exactly;
* greyscale: every colour the SVG sets is a grey (red = green = blue).
"""

from __future__ import annotations

import json
import math
import re
import subprocess
import sys
import xml.etree.ElementTree as ET

import pytest
from support import EXAMPLE

pytest.importorskip("matplotlib")

from vcheck.findings import Finding, Status, computed  # noqa: E402
from vcheck.report.html import render_html  # noqa: E402
from vcheck.results import CheckedDesign, RunResult  # noqa: E402

REPO = EXAMPLE.parent.parent
NS = "{http://www.w3.org/1999/xhtml}"
SVG = "{http://www.w3.org/2000/svg}"


@pytest.fixture(scope="module")
def reports(tmp_path_factory):
    """The example's HTML and JSON reports from one run."""
    out = tmp_path_factory.mktemp("html")
    ran = subprocess.run([sys.executable, "-m", "vcheck", "check", "--format", "json",
                          "--output", str(out / "r.json"), "--report", f"html={out / 'r.html'}"],
                         cwd=EXAMPLE, capture_output=True, text=True)
    assert ran.returncode == 1, ran.stderr  # the example has failures by design
    text = (out / "r.html").read_text(encoding="utf-8")
    return text, json.loads((out / "r.json").read_text(encoding="utf-8"))


def _tree(text):
    return ET.fromstring(text)


def _figures(root, kind):
    return [f for f in root.iter(NS + "figure") if f.get("data-plot") == kind]


def _design_of(figure, root):
    for section in root.iter(NS + "section"):
        if any(f is figure for f in section.iter(NS + "figure")):
            return section
    raise AssertionError("figure outside a design")


def _quantities(data, file, rule):
    return [q for f in data["findings"] if f["file"] == file and f["rule"] == rule
            for q in f["quantities"]]


def _file_of(section):
    small = section.find(f"{NS}h2/{NS}small").text
    return small.rsplit(", ", 1)[1].rstrip(")")


def test_the_page_is_well_formed_and_says_the_verdict_first(reports):
    text, data = reports
    root = _tree(text)  # raises on any well-formedness error
    body = root.find(NS + "body")
    verdict = body.find(f"{NS}p[@id='verdict']")
    assert verdict.text == f"Verdict: {data['result']['verdict'].upper()}"
    first_section = list(body).index(body.find(NS + "section"))
    assert list(body).index(verdict) < first_section
    counts = data["result"]["counts"]
    assert ", ".join(f"{k} {v}" for k, v in counts.items()) in text
    assert "engineer of record" in text
    # every design of the run has its section
    assert len(list(root.iter(NS + "section"))) == len(data["designs"])


def test_the_page_is_self_contained(reports):
    text, _ = reports
    root = _tree(text)
    for element in root.iter():
        tag = element.tag.split("}")[-1]
        assert tag not in ("script", "link", "iframe", "object", "embed"), tag
        for name, value in element.attrib.items():
            if name.split("}")[-1] in ("src", "href"):
                assert not re.match(r"(?i)\s*(https?:)?//", value), (name, value)
    style = root.find(f"{NS}head/{NS}style").text
    assert "url(" not in style and "@import" not in style


def test_every_plot_kind_is_there_with_a_text_alternative(reports):
    root = _tree(reports[0])
    for kind in ("interference", "transmissibility", "mount-forces", "mount-directions", "s-n",
                 "joint"):
        assert _figures(root, kind), kind
    for figure in root.iter(NS + "figure"):
        svg = figure.find(SVG + "svg")
        assert svg is not None and svg.get("role") == "img"
        assert svg.find(SVG + "title").text and svg.find(SVG + "desc").text
        assert figure.find(NS + "figcaption").text == svg.find(SVG + "desc").text


def test_interference_diagrams_plot_the_json_natural_frequencies(reports):
    text, data = reports
    root = _tree(text)
    torsional = 0
    for figure in _figures(root, "interference"):
        plotted = json.loads(figure.get("data-plotted"))
        file = _file_of(_design_of(figure, root))
        if plotted["group"]:
            torsional += 1
            quantities = [q for q in _quantities(data, file, "torsional-separation")
                          if q["context"].get("train") == plotted["group"]]
            natural, forcing = "torsional natural frequency band", "excitation band"
        else:
            quantities = _quantities(data, file, "frequency-separation")
            natural, forcing = "natural frequency band", "forcing frequency band"
        bands = {q["context"]["mode"]: q["value"] for q in quantities if q["name"] == natural}
        for mode, band in plotted["modes"].items():
            if mode in bands:
                assert band == bands[mode]
            else:  # a mode given as one number
                (single,) = [q["value"] for q in quantities if q["name"] == natural[:-5]
                             and q["context"]["mode"] == mode]
                assert band == [single, single]
        expected = {q["context"]["band"]: q["value"] for q in quantities if q["name"] == forcing}
        assert {k: v["range"] for k, v in plotted["bands"].items()} == expected
        least = min(q["value"] for q in quantities if q["name"] == "separation")
        assert plotted["closest"]["separation"] == least
        # the caption says the numbers too (to 4 significant figures)
        caption = figure.find(NS + "figcaption").text
        for low, high in plotted["modes"].values():
            assert f"{low:.4g} Hz to {high:.4g} Hz" in caption
    assert torsional, "no torsional interference diagram in the example"


def test_transmissibility_plots_the_json_numbers(reports):
    text, data = reports
    root = _tree(text)
    for figure in _figures(root, "transmissibility"):
        plotted = json.loads(figure.get("data-plotted"))
        quantities = _quantities(data, _file_of(_design_of(figure, root)), "isolation-efficiency")
        for band, values in plotted["bands"].items():
            (ratio,) = [q["value"] for q in quantities if q["name"] == "frequency ratio"
                        and q["context"].get("band") == band]
            (t,) = [q["value"] for q in quantities if q["name"] == "transmissibility"
                    and q["context"].get("band") == band]
            assert values == {"ratio": ratio, "transmissibility": t}


def test_mount_force_plots_plot_the_json_forces_at_each_mount(reports):
    text, data = reports
    root = _tree(text)
    figures = _figures(root, "mount-forces")
    # every design whose findings give the force at each mount (six-DOF) has its plot
    six_dof = {f["file"] for f in data["findings"] if f["rule"] == "isolation-efficiency"
               and any(q["name"] == "force at each mount" for q in f["quantities"])}
    assert six_dof and {_file_of(_design_of(f, root)) for f in figures} == six_dof
    for figure in figures:
        plotted = json.loads(figure.get("data-plotted"))
        quantities = _quantities(data, _file_of(_design_of(figure, root)), "isolation-efficiency")
        each = {q["context"]["load"]: q["value"] for q in quantities
                if q["name"] == "force at each mount"}
        assert [load["load"] for load in plotted["loads"]] == list(each)
        caption = figure.find(NS + "figcaption").text
        for load in plotted["loads"]:
            assert load["mounts"] == each[load["load"]]
            (rigid,) = [q for q in quantities if q["name"] == "rigid mount force"
                        and q["context"]["load"] == load["load"]]
            assert load["rigid"] == {"mount": rigid["context"]["mount"], "force": rigid["value"]}
            (largest,) = [q for q in quantities if q["name"] == "largest mount force"
                          and q["context"]["load"] == load["load"]]
            assert largest["value"] == max(load["mounts"])
            assert f"mount {rigid['context']['mount']} {rigid['value']:.4g} N" in caption
            for m, value in enumerate(load["mounts"]):
                assert f"mount {m + 1} {value:.4g} N" in caption
        # the SVG draws one bar per mount and load (matplotlib writes each patch as a
        # <g id="patch_N">: the bars, plus the legend's swatch of each load and at most
        # the figure's and the axes' backgrounds and the axes' four spines)
        bars = sum(len(load["mounts"]) for load in plotted["loads"])
        patches = [g for g in figure.find(SVG + "svg").iter(SVG + "g")
                   if g.get("id", "").startswith("patch_")]
        assert bars + len(plotted["loads"]) <= len(patches) <= bars + len(plotted["loads"]) + 6


def test_mount_direction_plots_plot_the_json_components_and_rigid_mounting(reports):
    # One plot per machine load of a six-DOF isolation finding: at each mount, the largest
    # amplitude of each force component (x, y, z) on the isolators against the same
    # component with rigid mounting, exactly the JSON quantities.
    text, data = reports
    root = _tree(text)
    figures = _figures(root, "mount-directions")
    expected = []
    for finding in data["findings"]:
        if finding["rule"] != "isolation-efficiency":
            continue
        for q in finding["quantities"]:
            if q["name"] == "force component at each mount" and q["context"]["direction"] == "x":
                expected.append((finding["file"], q["context"]["load"]))
    assert len(expected) >= 2
    got = [(_file_of(_design_of(f, root)), json.loads(f.get("data-plotted"))["load"])
           for f in figures]
    assert got == expected
    for figure, (file, load) in zip(figures, expected):
        plotted = json.loads(figure.get("data-plotted"))
        quantities = [q for q in _quantities(data, file, "isolation-efficiency")
                      if q["context"].get("load") == load]
        caption = figure.find(NS + "figcaption").text
        largest = 0.0
        for key, name in (("components", "force component at each mount"),
                          ("rigid components", "rigid force component at each mount")):
            for direction in ("x", "y", "z"):
                (q,) = [q for q in quantities if q["name"] == name
                        and q["context"]["direction"] == direction]
                assert plotted[key][direction] == q["value"]
                largest = max(largest, *q["value"])
        sizes = {q["name"]: q["value"] for q in quantities
                 if q["name"] in ("force at each mount", "rigid force at each mount")}
        for key, size in (("components", "force at each mount"),
                          ("rigid components", "rigid force at each mount")):
            for m, total in enumerate(sizes[size]):
                parts = [plotted[key][d][m] for d in ("x", "y", "z")]
                # a vector's size over a cycle lies between its largest component amplitude
                # and the root sum of squares of the amplitudes (closed-form bounds)
                assert max(parts) <= total * (1 + 1e-9)
                assert total <= math.sqrt(sum(p * p for p in parts)) * (1 + 1e-9)
        drawn = 0
        for key in ("components", "rigid components"):
            for values in plotted[key].values():
                for m, value in enumerate(values):
                    if value > 1e-6 * largest:
                        drawn += key == "components"
                        assert f"mount {m + 1} {value:.4g} N" in caption
                    else:
                        assert f"mount {m + 1} about 0 N" in caption
        patches = [g for g in figure.find(SVG + "svg").iter(SVG + "g")
                   if g.get("id", "").startswith("patch_")]
        assert drawn <= len(patches) <= drawn + 3 + 6  # bars, key swatches, frame


def test_sn_plots_the_json_bins(reports):
    text, data = reports
    root = _tree(text)
    for figure in _figures(root, "s-n"):
        plotted = json.loads(figure.get("data-plotted"))
        quantities = [q for q in _quantities(data, _file_of(_design_of(figure, root)),
                                             "fatigue-damage")
                      if q["context"].get("detail") == plotted["detail"]]
        for row in plotted["bins"]:
            for name in ("stress range", "cycles", "allowed cycles", "damage"):
                (value,) = [q["value"] for q in quantities if q["name"] == name
                            and q["context"].get("bin") == row["bin"]]
                assert row[name] == value


def test_joint_bars_plot_the_json_forces(reports):
    text, data = reports
    root = _tree(text)
    for figure in _figures(root, "joint"):
        plotted = json.loads(figure.get("data-plotted"))
        file = _file_of(_design_of(figure, root))
        quantities = [q for f in data["findings"] if f["file"] == file
                      and f["rule"].startswith("joint-") for q in f["quantities"]
                      if q["context"].get("joint") == plotted["joint"]]
        for name, entry in plotted["values"].items():
            assert entry["value"] in [q["value"] for q in quantities if q["name"] == name]
        assert plotted["values"]["least assembly preload"]["value"] <= \
            plotted["values"]["largest assembly preload"]["value"]


def test_the_plots_are_greyscale(reports):
    colours = re.findall(r"#([0-9a-fA-F]{6})\b", reports[0])
    assert colours
    for colour in colours:
        r, g, b = colour[0:2], colour[2:4], colour[4:6]
        assert r.lower() == g.lower() == b.lower(), colour


def test_text_from_designs_is_escaped():
    hostile = '<script>alert("x")</script> & \x1b[2J \u202e $\\frac{ ' + "y" * 5000
    finding = Finding("frequency-separation", Status.FAIL, hostile, "a.toml", 1, 1, hostile,
                      quantities=(computed("natural frequency", 10.0, "Hz", mode=hostile),
                                  computed("forcing frequency band", (9.0, 11.0), "Hz",
                                           band="1x running speed", kind="running-speed"),
                                  computed("separation", float("nan"), "fraction",
                                           band="1x running speed", mode=hostile, side="inside"),
                                  computed("required separation", 0.2, "fraction")))
    result = RunResult(version="0", policy="default",
                       designs=[CheckedDesign("a.toml", hostile, "machine")], findings=[finding])
    text = render_html(result)
    root = ET.fromstring(text)
    assert not [e for e in root.iter() if e.tag.split("}")[-1] == "script"]
    assert "\x1b" not in text and "\u202e" not in text
    assert "more characters not shown" in text
    assert _figures(root, "interference")


def test_without_matplotlib_html_exits_2_saying_what_to_install():
    code = ("import sys; sys.modules['matplotlib'] = None\n"
            "from vcheck.cli import main\n"
            f"raise SystemExit(main(['check', {str(EXAMPLE)!r}, '--format', 'html']))")
    ran = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=REPO)
    assert ran.returncode == 2
    assert ran.stdout == ""
    assert ran.stderr.strip() == ('vcheck: error: --format html: the HTML report needs '
                                  'matplotlib: pip install "vcheck-vibration[plots]"')


@pytest.mark.parametrize("fmt", ["text", "json"])
def test_text_and_json_reports_do_not_import_matplotlib(fmt):
    code = ("import sys, io, contextlib; from vcheck.cli import main\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            f"    main(['check', {str(EXAMPLE)!r}, '--format', {fmt!r}])\n"
            "print(sorted(m for m in sys.modules if m.split('.')[0] == 'matplotlib'))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         cwd=REPO, check=True)
    assert out.stdout.strip().endswith("[]")


def test_the_dynamics_page_plots_the_dynamics_json_numbers():
    def run(fmt):
        ran = subprocess.run([sys.executable, "-m", "vcheck", "dynamics", "--format", fmt],
                             cwd=EXAMPLE, capture_output=True, text=True)
        assert ran.returncode == 0, ran.stderr
        return ran.stdout

    root = _tree(run("html"))
    data = json.loads(run("json"))
    assert not [e for e in root.iter() if e.tag.split("}")[-1] in ("script", "link")]
    by_file = {d["file"]: d for d in data["designs"]}
    figures = _figures(root, "interference")
    assert figures
    trains = 0
    for figure in figures:
        plotted = json.loads(figure.get("data-plotted"))
        design = by_file[_file_of(_design_of(figure, root))]
        assert plotted["speed"] == [design["speed"]["min"], design["speed"]["max"]]
        if plotted["group"]:
            trains += 1
            (train,) = [t for t in design["shaft-trains"] if t["name"] == plotted["group"]]
            modes = {str(m["number"]): [m["low"], m["high"]] for m in train["modes"]}
            bands, separations = train["excitation-bands"], train["separations"]
        else:
            modes = {m["name"]: [m["low"], m["high"]] for m in design["natural-frequencies"]}
            bands, separations = design["forcing-bands"], design["separations"]
        assert plotted["modes"] == modes
        assert {k: v["range"] for k, v in plotted["bands"].items()} == \
            {b["name"]: [b["low"], b["high"]] for b in bands}
        assert plotted["closest"]["separation"] == min(s["separation"] for s in separations)
    assert trains


def test_the_page_is_deterministic():
    # common practice for this project: every format is byte-for-byte repeatable
    finding = Finding("isolation-efficiency", Status.PASS, "ok", "b.toml", 1, 1, "B",
                      quantities=(computed("frequency ratio", (3.0, 4.0), "1", band="1x"),
                                  computed("transmissibility", 0.12, "1", band="1x"),
                                  computed("required efficiency", 0.8, "fraction")))
    result = RunResult(version="0", policy="default",
                       designs=[CheckedDesign("b.toml", "B", "fan")], findings=[finding])
    first = render_html(result)
    assert first == render_html(result)
    assert _figures(ET.fromstring(first), "transmissibility")


def test_a_mount_force_that_is_not_finite_is_said_not_drawn():
    # a value the findings carry as None (not finite) is named in the caption, no bar
    finding = Finding("isolation-efficiency", Status.FAIL, "x", "c.toml", 1, 1, "C",
                      quantities=(computed("force at each mount", [2.0, float("inf"), 0.5], "N",
                                           load="unbalance"),
                                  computed("rigid mount force", 40.0, "N", load="unbalance",
                                           mount="1"),
                                  computed("largest mount force", 2.0, "N", load="unbalance",
                                           mount="1")))
    result = RunResult(version="0", policy="default",
                       designs=[CheckedDesign("c.toml", "C", "fan")], findings=[finding])
    root = ET.fromstring(render_html(result))
    (figure,) = _figures(root, "mount-forces")
    assert json.loads(figure.get("data-plotted"))["loads"][0]["mounts"] == [2.0, None, 0.5]
    caption = figure.find(NS + "figcaption").text
    assert "mount 1 2 N, mount 2 not finite, mount 3 0.5 N; rigid mounting, mount 1 40 N" in caption


def test_a_long_series_name_is_cut_in_the_key_and_whole_in_the_caption():
    # the key sits right of the axes; a label is cut to what fits before the figure's edge
    long = "unbalance of the second stage impeller with its coupling hub and the key " * 2
    finding = Finding("isolation-efficiency", Status.FAIL, "x", "c.toml", 1, 1, "C",
                      quantities=(computed("force at each mount", [2.0, 1.0], "N", load=long),
                                  computed("rigid mount force", 40.0, "N", load=long,
                                           mount="1")))
    result = RunResult(version="0", policy="default",
                       designs=[CheckedDesign("c.toml", "C", "fan")], findings=[finding])
    root = ET.fromstring(render_html(result))
    (figure,) = _figures(root, "mount-forces")
    texts = ["".join(t.itertext()) for t in figure.find(SVG + "svg").iter(SVG + "text")]
    keys = [t for t in texts if t.startswith(("isolated:", "rigid, mount"))]
    assert len(keys) == 2 and all(t.endswith("...") for t in keys), keys
    # 7 in figure, axes to 0.6 of it: 201.6 pt, less the sample, 6 pt text at 3 pt a character
    assert all(len(t) <= (0.4 * 7 * 72 - 32) / 3 for t in keys), keys
    assert " ".join(long.split()) in " ".join(figure.find(NS + "figcaption").text.split())


def test_a_key_too_long_for_the_plot_sums_up_the_rest():
    # 60 forcing bands cannot each have a row of the key beside a 4.2 in plot
    bands = tuple(computed("forcing frequency band", (10.0 + i, 12.0 + i), "Hz",
                           band=f"band {i}", kind="stated") for i in range(60))
    finding = Finding("frequency-separation", Status.PASS, "ok", "d.toml", 1, 1, "D",
                      quantities=(computed("natural frequency", 100.0, "Hz", mode="bounce"),
                                  *bands, computed("required separation", 0.2, "fraction")))
    result = RunResult(version="0", policy="default",
                       designs=[CheckedDesign("d.toml", "D", "fan")], findings=[finding])
    (figure,) = _figures(ET.fromstring(render_html(result)), "interference")
    texts = [t.text for t in figure.iter(SVG + "text")]
    (more,) = [t for t in texts if t and t.endswith("more series (named in the caption)")]
    shown = int(more.split()[1])
    labels = [t for t in texts if t and t.startswith("order line: band ")]
    assert len(labels) + shown == 60 and shown > 0
    assert "band 59: 69 Hz to 71 Hz" in figure.find(NS + "figcaption").text


def _one_of_each(tag, scale):
    """A design's findings with an interference diagram, a transmissibility plot and a
    mount-force plot, their numbers scaled."""
    file = f"{tag.lower()}.toml"
    return CheckedDesign(file, tag, "fan"), [
        Finding("frequency-separation", Status.PASS, "ok", file, 1, 1, tag,
                quantities=(computed("natural frequency band", (8.0 * scale, 9.0 * scale), "Hz",
                                     mode="bounce"),
                            computed("forcing frequency band", (15.0 * scale, 25.0 * scale), "Hz",
                                     band="1x running speed", kind="running-speed"),
                            computed("separation", 0.4, "fraction", band="1x running speed",
                                     mode="bounce", side="below"),
                            computed("required separation", 0.2, "fraction"))),
        Finding("isolation-efficiency", Status.PASS, "ok", file, 1, 1, tag,
                quantities=(computed("frequency ratio", (3.0 * scale, 4.0 * scale), "1", band="1x"),
                            computed("transmissibility", 0.12 / scale, "1", band="1x"),
                            computed("required efficiency", 0.8, "fraction"),
                            computed("force at each mount", [1.0 * scale, 2.0, 3.0 / scale], "N",
                                     load="unbalance"),
                            computed("rigid mount force", 50.0 * scale, "N", load="unbalance",
                                     mount="3"))),
    ]


def test_a_plot_is_the_same_whatever_plot_of_its_kind_came_before():
    # the page reuses one matplotlib Axes per kind of plot: nothing of one plot may show
    # in the next (common practice for this project: a design's plots do not depend on
    # the order of the designs)
    (a, a_findings), (b, b_findings) = _one_of_each("A", 1.0), _one_of_each("B", 7.0)

    def figures(designs, findings):
        result = RunResult(version="0", policy="default", designs=designs, findings=findings)
        root = ET.fromstring(render_html(result))
        return {(_file_of(_design_of(f, root)), f.get("data-plot")):
                ET.tostring(f, encoding="unicode") for f in root.iter(NS + "figure")}

    alone = figures([a], a_findings)
    first = figures([a, b], a_findings + b_findings)
    second = figures([b, a], b_findings + a_findings)
    assert {kind for _, kind in alone} == {"interference", "transmissibility", "mount-forces"}
    for key, figure in alone.items():
        assert first[key] == figure == second[key], key
    assert first[("b.toml", "transmissibility")] != alone[("a.toml", "transmissibility")]

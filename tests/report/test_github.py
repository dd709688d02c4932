"""GitHub Actions workflow-command writer: annotations, escaping, the full list, fencing.

Outside reference: the lines are fed to a small re-implementation of how the GitHub
Actions runner reads a step's output, written from its source (actions/runner,
src/Runner.Common/ActionCommand.cs: ``TryParseV2`` for ``::cmd k=v,k=v::data`` at the
start of a trimmed line, ``TryParse`` for ``##[cmd k=v;]data`` anywhere in a line, and
their unescape tables; src/Runner.Worker/ActionCommandManager.cs: V2 is tried first, then
V1, and ``stop-commands`` suspends every command until its token comes back). The
escaping rules (``%``, CR, LF in messages; also ``:`` and ``,`` in properties) are those
of the runner's tables and of issue 7. The list of registered command names is from
memory of the runner's command extensions; the ones the tests rely on (error, warning,
notice, add-mask, set-output, stop-commands) are read in ActionCommandManager.cs or in
the workflow-command documentation.
"""

from __future__ import annotations

import copy
import json

import pytest
from support import EXAMPLE

from vcheck.design.problems import InputProblem
from vcheck.findings import Finding, Measure, Source, Status
from vcheck.report import finding_details, render
from vcheck.report.github import escape_data, escape_property, render_github
from vcheck.results import CheckedDesign, RuleInfo, RunResult

REGISTERED = {"error", "warning", "notice", "debug", "add-mask", "set-output", "set-env",
              "save-state", "add-path", "group", "endgroup", "echo", "add-matcher",
              "remove-matcher", "stop-commands"}

HOSTILE = ("100% sure: a,b\r\n::error::injected\n  ::add-mask::secret ##[set-output name=x]y "
           "<&> \"q\" Kühlturm — %0A literal %25 too")


# -- a runner, as its source reads ----------------------------------------------------

def _unescape(text: str, table) -> str:
    for token, replacement in table:
        text = text.replace(replacement, token)
    return text


_DATA = (("\r", "%0D"), ("\n", "%0A"), ("%", "%25"))
_PROPERTY = (("\r", "%0D"), ("\n", "%0A"), (":", "%3A"), (",", "%2C"), ("%", "%25"))
_V1 = ((";", "%3B"), ("\r", "%0D"), ("\n", "%0A"), ("]", "%5D"), ("%", "%25"))


def _parse_v2(line: str, registered):
    line = line.lstrip()
    if not line.startswith("::"):
        return None
    end = line.find("::", 2)
    if end < 0:
        return None
    info = line[2:end]
    name, _, props = info.partition(" ")
    if name not in registered:
        return None
    properties = {}
    for item in filter(None, props.strip().split(",")):
        key, sep, value = item.partition("=")
        if sep and key and value:
            properties[key] = _unescape(value, _PROPERTY)
    return name, properties, _unescape(line[end + 2:], _DATA)


def _parse_v1(line: str, registered):
    start = line.find("##[")
    if start < 0:
        return None
    close = line.find("]", start)
    if close < 0:
        return None
    info = line[start + 3:close]
    name, _, props = info.partition(" ")
    if name not in registered:
        return None
    properties = {}
    for item in filter(None, props.split(";")):
        key, sep, value = item.partition("=")
        if sep and key and value:
            properties[key] = _unescape(value, _V1)
    return name, properties, _unescape(line[close + 1:], _V1)


def run_step(output: str) -> list[tuple[str, dict, str]]:
    """The commands a runner carries out for a step that printed ``output``."""
    registered = set(REGISTERED)
    stopped_until = None
    done = []
    for line in output.split("\n"):
        command = _parse_v2(line, registered) or _parse_v1(line, registered)
        if command is None:
            continue
        name, _, data = command
        if stopped_until is not None:
            if name == stopped_until:
                registered.discard(stopped_until)
                stopped_until = None
                done.append(("resume", {}, name))
            continue
        if name == "stop-commands":
            stopped_until = data
            registered.add(data)
        done.append(command)
    return done


# -- fixtures ---------------------------------------------------------------------------

def every_status_result(fails: int = 1) -> RunResult:
    sources = (Source("EN 0000-0 Table 1", "from memory"),)
    common = dict(sources=sources, limit=Measure("required separation", 0.2, "fraction"))
    findings = [
        Finding("demo-rule", Status.PASS, "clear", "roof/a.toml", 4, 1, "A-1", "m", **common),
        Finding("demo-rule", Status.WARN, "close", "roof/b.toml", 7, 3, "B-2", "k", **common),
        Finding("demo-rule", Status.WAIVED, "accepted ::add-mask::w", "roof/d.toml", 9, 1,
                "D-4", "m", **common),
        Finding("other-rule", Status.ERROR, "could not run", "roof/e.toml", 1, 1, "E-5", ""),
        Finding("other-rule", Status.NOT_CHECKED, "lacks modes", "roof/f.toml", 2, 1, "F-6",
                "machine"),
    ]
    findings += [Finding("demo-rule", Status.FAIL, HOSTILE, f"roof/c,{n}:x.toml", 24, 5,
                         f"T:{n},x%", "k", **common) for n in range(fails)]
    problems = [InputProblem("roof/bad.toml", 3, 5, "machine.mass", "mass <0>\n::error::x")]
    rules = [RuleInfo("demo-rule", "Demo", "built-in", sources),
             RuleInfo("other-rule", "Other", "built-in", ())]
    designs = [CheckedDesign(f.file, f.target, "fan") for f in findings]
    return RunResult("9.9.9", "vcheck.toml", designs, findings, problems, rules)


# -- tests --------------------------------------------------------------------------------

def test_example_annotations_as_the_runner_reads_them(run_cli):
    ran = run_cli("check", str(EXAMPLE), "--format", "github", "--uri-prefix", "",
                  "--show-not-checked")
    assert ran.status == 1
    report = json.loads(run_cli("check", str(EXAMPLE), "--format", "json").out)
    counts = report["result"]["counts"]
    commands = run_step(ran.out)
    kinds = [name for name, _, _ in commands]
    annotated = counts["fail"] + counts["error"] + counts["warn"] + counts["not-checked"]
    assert kinds == (["error"] * (counts["fail"] + counts["error"])
                     + ["warning"] * counts["warn"] + ["notice"] * counts["not-checked"]
                     + ["stop-commands", "resume"])
    ef = next(f for f in report["findings"]
              if f["target"] == "EF-R1" and f["rule"] == "frequency-separation")
    name, properties, data = next(c for c in commands
                                  if c[1].get("title", "") == "FAIL frequency-separation: EF-R1")
    assert name == "error"
    assert properties == {"file": ef["file"], "line": str(ef["line"]),
                          "col": str(ef["column"]), "title": "FAIL frequency-separation: EF-R1"}
    assert data.startswith(ef["message"])
    assert "limit: required separation 20.0%" in data
    listed = [line for line in ran.out.splitlines() if line.startswith("  ")]
    assert len(listed) == annotated + counts["waived"]
    assert any("$GITHUB_STEP_SUMMARY" in line for line in ran.out.splitlines())
    assert run_cli("check", str(EXAMPLE), "--format", "github", "--uri-prefix", "",
                  "--show-not-checked").out == ran.out


def test_hostile_text_round_trips_and_issues_no_command():
    result = every_status_result()
    output = render_github(result, uri_prefix="site", show_not_checked=True)
    commands = run_step(output)
    names = [name for name, _, _ in commands]
    # one input error, one fail, one rule error, a warning, a notice, then the fence
    assert names == ["error", "error", "error", "warning", "notice", "stop-commands", "resume"]
    problem = commands[0]
    assert problem[1]["title"] == "vcheck input error: machine.mass"
    assert problem[2] == "mass <0>\n::error::x\nNothing in this file was checked."
    fail = next(c for c in commands if c[1].get("title", "").startswith("FAIL"))
    finding = next(f for f in result.findings if f.status is Status.FAIL)
    assert fail[1] == {"file": "site/roof/c,0:x.toml", "line": "24", "col": "5",
                       "title": "FAIL demo-rule: T:0,x%"}
    # line feeds survive (the runner shows them); the carriage return is shown as \r
    assert fail[2] == finding_details(finding).replace("\r", "\\r")
    assert "\r" not in output
    assert "add-mask" not in names and "set-output" not in names


def test_the_fence_is_needed():
    # The same listed lines without their fence would mask a secret and set an output.
    output = render_github(every_status_result(), show_not_checked=True)
    lines = output.splitlines()
    start = next(i for i, line in enumerate(lines) if line.startswith("::stop-commands::"))
    end = next(i for i, line in enumerate(lines) if i > start and line.startswith("::vcheck-"))
    unfenced = "\n".join(lines[start + 1:end])
    assert {name for name, _, _ in run_step(unfenced)} == {"set-output"}
    # ... and every line of the list is one finding or problem: no line break got through
    assert len(lines[start + 1:end]) == 1 + 5  # the problem and five non-passing findings
    assert all(line.startswith("  ") for line in lines[start + 1:end])
    assert lines[end] == lines[start].replace("stop-commands::", "") + "::"


def test_escaping_matches_the_runner_tables():
    assert escape_data("100%\r\n:,") == "100%25%0D%0A:,"
    assert escape_property("a:b,c%\r\n") == "a%3Ab%2Cc%25%0D%0A"
    for text in ("%0A", "%%0A%", "%25", "a%3Ab", "\r\n%\n", HOSTILE):
        assert _unescape(escape_data(text), _DATA) == text
        assert _unescape(escape_property(text), _PROPERTY) == text


def test_more_than_ten_errors_are_all_listed():
    result = every_status_result(fails=12)
    output = render_github(result, show_not_checked=True)
    errors = [c for c in run_step(output) if c[0] == "error"]
    assert len(errors) == 1 + 12 + 1  # input problem, fails, rule error
    assert "4 of the annotations above are not shown by GitHub" in output
    listed = [line for line in output.splitlines() if line.startswith("  FAIL ")]
    assert len(listed) == 12
    # 1 input problem + 12 fails + error + warn + not-checked + waived
    assert "Everything that needs attention (17):" in output


def test_waived_and_passing_findings_get_no_annotation():
    commands = run_step(render_github(every_status_result(), show_not_checked=True))
    titles = [c[1].get("title", "") for c in commands]
    assert not any("D-4" in t or "A-1" in t for t in titles)
    assert "  WAIVED       roof/d.toml:9:1  D-4  demo-rule: waived: accepted ::add-mask::w" in \
        render_github(every_status_result(), show_not_checked=True)


def test_nothing_to_report():
    result = every_status_result()
    result.findings = [f for f in result.findings if f.status is Status.PASS]
    result.problems = []
    output = render(result, "github")
    assert run_step(output) == []
    assert "vcheck: no finding needs attention." in output
    assert output.startswith("vcheck: PASS (exit status 0)")


def test_same_input_same_bytes_and_the_input_is_not_changed():
    result = every_status_result()
    before = copy.deepcopy(result)
    assert render_github(result) == render_github(result)
    assert result == before


@pytest.mark.parametrize("prefix", ["", "plant/north"])
def test_paths_are_relative_to_the_repository_root(prefix):
    commands = run_step(render_github(every_status_result(), uri_prefix=prefix, show_not_checked=True))
    files = [c[1]["file"] for c in commands if "file" in c[1]]
    expected = f"{prefix}/roof/bad.toml" if prefix else "roof/bad.toml"
    assert files[0] == expected


def test_not_checked_findings_are_only_counted_unless_asked():
    result = every_status_result()
    quiet = render_github(result)
    assert "notice" not in [name for name, _, _ in run_step(quiet)]
    assert "1 not-checked" in quiet  # still counted on the verdict line
    loud = render_github(result, show_not_checked=True)
    assert [name for name, _, _ in run_step(loud)].count("notice") == 1

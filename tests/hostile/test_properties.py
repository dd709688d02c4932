"""Hostile input, property by property: whatever a design file holds, vcheck answers.

For every input tried, run through the command line in-process (``vcheck.cli.main``):

- the exit status is 0, 1 or 2: never 3 (no rule is broken on purpose here) and never
  a traceback;
- exit status 2 comes with a location, ``file:line:col:``;
- it ends in bounded time: Hypothesis' deadline per input, and an alarm that stops a
  hang (a hang is a failure, not a wait);
- memory stays bounded: the test process's peak resident size grows by less than
  :data:`MEMORY_BUDGET` over the whole test.

Inputs come from three strategies (and a fourth for ``vcheck merge``: real JSON reports
with nodes replaced or removed): designs generated from the JSON Schema that
``vcheck schema`` prints (so from the pydantic models, whatever they become), the
bundled example designs mutated (characters cut, doubled, inserted; numbers made
extreme; units changed), and raw bytes. A corpus of minimal inputs from the issue that
found the first failures runs as well, in a subprocess with time and memory limits where
an input could hang the interpreter in C code or fill memory.

CI profile: a fixed number of examples a strategy, ``derandomize=True`` (the same
inputs every run, no example database), so the suite is deterministic and runs in well
under a minute. ``VCHECK_HOSTILE_EXAMPLES=N`` runs N examples a strategy instead, for a
longer local search.

Known failures of the input side, fixed on another branch, are named in
:data:`KNOWN_ELSEWHERE` with the reason and marked ``xfail(strict=False)``: once the
fixes are merged they pass, and the entry should go.
"""

from __future__ import annotations

import io
import json
import os
import re
import resource
import shutil
import signal
import subprocess
import sys
import tempfile
from contextlib import redirect_stderr, redirect_stdout
from dataclasses import dataclass
from datetime import timedelta
from pathlib import Path

import pytest
from hypothesis import HealthCheck, Phase, given, settings
from hypothesis import strategies as st
from support import EXAMPLE, REPO

from vcheck.report import FORMATS

# -- limits and profile ----------------------------------------------------------------

HANG_SECONDS = 5.0
"""An input still running after this long is a hang (the alarm stops it)."""

DEADLINE = timedelta(seconds=5)
"""Hypothesis' deadline per input (generous: two shared cores, a cold first import)."""

MEMORY_BUDGET = 768 * 1024 * 1024
"""Growth of the test process's peak resident size allowed over one test [bytes]."""

EXAMPLES = int(os.environ.get("VCHECK_HOSTILE_EXAMPLES", "150"))
"""Examples a strategy in the CI profile."""

settings.register_profile(
    "vcheck-hostile",
    max_examples=EXAMPLES,
    derandomize=True,
    database=None,
    deadline=DEADLINE,
    print_blob=False,
    # no shrinking in CI (a failure is shown as found); VCHECK_HOSTILE_SHRINK=1 shrinks
    phases=tuple(Phase) if os.environ.get("VCHECK_HOSTILE_SHRINK") else (
        Phase.explicit, Phase.reuse, Phase.generate),
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large,
                           HealthCheck.filter_too_much],
)
PROFILE = settings.get_profile("vcheck-hostile")

LOCATION = re.compile(r"(?m)(^|\s)[^\s:]+:\d+:\d+: \S")

KNOWN_ELSEWHERE: dict[str, str] = {}
"""Inputs known to break the contract, case id -> reason, marked xfail(strict=False):
none since the input-side fixes were merged. A new known failure goes here, with its
reason, until it is fixed."""


def known(case_id: str):
    """The xfail mark of a case in :data:`KNOWN_ELSEWHERE`, or no mark."""
    if case_id in KNOWN_ELSEWHERE:
        return [pytest.mark.xfail(reason=KNOWN_ELSEWHERE[case_id], strict=False)]
    return []


# -- running the command line ------------------------------------------------------------

class _Hang(BaseException):
    """Raised by the alarm inside a run that takes longer than HANG_SECONDS."""


@dataclass
class Outcome:
    status: int
    out: str
    err: str
    hung: bool = False

    def problems(self, location: bool = True) -> list[str]:
        """What breaks the contract, in words; empty when the run kept it. ``location``:
        exit status 2 must name a file:line:col (it is about a file)."""
        found = []
        if self.hung:
            found.append(f"still running after {HANG_SECONDS:.0f} s (a hang)")
        if self.status not in (0, 1, 2):
            found.append(f"exit status {self.status}")
        if "Traceback" in self.out or "Traceback" in self.err:
            found.append("a traceback")
        if location and self.status == 2 and not LOCATION.search(self.out + "\n" + self.err):
            found.append("exit status 2 without a file:line:col location")
        return found

    def describe(self) -> str:
        return (f"{'; '.join(self.problems())}\n--- stderr ---\n{self.err[-1500:]}"
                f"\n--- stdout (end) ---\n{self.out[-800:]}")


def run_in_process(args: list[str], cwd: Path, timeout: float = HANG_SECONDS) -> Outcome:
    """``vcheck ARGS`` in this process, in folder ``cwd``, stopped by an alarm after
    ``timeout`` seconds (the guard turns the alarm into exit 3; ``hung`` tells)."""
    from vcheck.cli import main

    hung: list[bool] = []

    def on_alarm(signum, frame):
        hung.append(True)
        raise _Hang()

    out, err = io.StringIO(), io.StringIO()
    previous_folder = os.getcwd()
    previous_handler = signal.signal(signal.SIGALRM, on_alarm)
    signal.setitimer(signal.ITIMER_REAL, timeout)
    try:
        os.chdir(cwd)
        with redirect_stdout(out), redirect_stderr(err):
            try:
                status = main(args)
            except SystemExit as exc:
                status = exc.code if isinstance(exc.code, int) else 0
            except _Hang:
                status = -1
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, previous_handler)
        os.chdir(previous_folder)
    return Outcome(status, out.getvalue(), err.getvalue(), bool(hung))


def run_in_subprocess(args: list[str], cwd: Path, timeout: float = 20.0,
                      memory: int = 1536 * 1024 * 1024) -> Outcome:
    """``vcheck ARGS`` in a child process limited to ``memory`` bytes of address space
    and ``timeout`` seconds: for inputs that could block in C code or fill memory."""
    def limit():  # pragma: no cover - runs in the child
        resource.setrlimit(resource.RLIMIT_AS, (memory, memory))

    env = {**os.environ, "PYTHONPATH": str(REPO), "OPENBLAS_NUM_THREADS": "1"}
    env.pop("VCHECK_TRACEBACK", None)
    try:
        ran = subprocess.run([sys.executable, "-m", "vcheck", *args], cwd=cwd, env=env,
                             capture_output=True, text=True, timeout=timeout, preexec_fn=limit)
    except subprocess.TimeoutExpired as exc:
        def text(value):
            return value.decode("utf-8", "replace") if isinstance(value, bytes) else value or ""
        return Outcome(-1, text(exc.stdout), text(exc.stderr), hung=True)
    return Outcome(ran.returncode, ran.stdout, ran.stderr)


class _Budget:
    """The peak resident size of this process, in bytes, against MEMORY_BUDGET."""

    def __init__(self) -> None:
        self.start = self.peak()

    @staticmethod
    def peak() -> int:
        return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss * 1024  # KiB on Linux

    def check(self) -> None:
        grown = self.peak() - self.start
        assert grown < MEMORY_BUDGET, f"peak memory grew by {grown / 2**20:.0f} MiB"


TALLY: dict[str, list[int]] = {}
"""Per strategy: [inputs tried, inputs that broke the contract] (for the survey)."""


def _count(strategy: str, broken: bool) -> None:
    tried = TALLY.setdefault(strategy, [0, 0])
    tried[0] += 1
    tried[1] += int(broken)


def check_design_bytes(data: bytes, fmt: str = "text", strategy: str = "") -> Outcome:
    """Write ``data`` as ``d.toml`` in a fresh project folder and check it."""
    with tempfile.TemporaryDirectory(prefix="vcheck-hostile-") as folder:
        Path(folder, "d.toml").write_bytes(data)
        outcome = run_in_process(["check", "d.toml", "--format", fmt], Path(folder))
    if strategy:
        _count(strategy, bool(outcome.problems()))
    return outcome


# -- TOML from plain data ----------------------------------------------------------------

_BARE = re.compile(r"^[A-Za-z0-9_-]+$")


def toml_key(key: str) -> str:
    return key if _BARE.match(key) else toml_string(key)


def toml_string(text: str) -> str:
    out = []
    for char in text:
        if char == '"':
            out.append('\\"')
        elif char == "\\":
            out.append("\\\\")
        elif ord(char) < 0x20 or ord(char) == 0x7f:
            out.append(f"\\u{ord(char):04x}")
        else:
            out.append(char)
    return '"' + "".join(out) + '"'


def toml_value(value) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int):
        return str(value)
    if isinstance(value, float):
        if value != value:
            return "nan"
        if value in (float("inf"), float("-inf")):
            return "inf" if value > 0 else "-inf"
        return repr(value)
    if isinstance(value, str):
        return toml_string(value)
    if isinstance(value, list):
        return "[" + ", ".join(toml_value(item) for item in value) + "]"
    if isinstance(value, dict):
        return "{ " + ", ".join(f"{toml_key(k)} = {toml_value(v)}" for k, v in value.items()) + " }"
    raise TypeError(type(value))


def toml_document(data: dict) -> str:
    """A TOML file of ``data``: scalars first, then a ``[table]`` per table and a
    ``[[table]]`` per entry of an array of tables (deeper levels inline), as people
    write design files."""
    lines = [f"{toml_key(k)} = {toml_value(v)}" for k, v in data.items()
             if not isinstance(v, dict) and not _tables(v)]
    for key, value in data.items():
        if isinstance(value, dict):
            lines += ["", f"[{toml_key(key)}]"]
            lines += [f"{toml_key(k)} = {toml_value(v)}" for k, v in value.items()]
        elif _tables(value):
            for item in value:
                lines += ["", f"[[{toml_key(key)}]]"]
                lines += [f"{toml_key(k)} = {toml_value(v)}" for k, v in item.items()]
    return "\n".join(lines) + "\n"


def _tables(value) -> bool:
    return isinstance(value, list) and bool(value) and all(isinstance(v, dict) for v in value)


# -- strategies from the design schema ---------------------------------------------------

_NUMBER = re.compile(r"^\s*[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?")
EXTREME_NUMBERS = [0.0, -0.0, -1.0, 5e-324, 1e-300, 1e300, 1e308, 1.7976931348623157e308,
                   float("inf"), float("-inf"), float("nan"), 2**63, -(2**63), 10**30]
HOSTILE_SUFFIXES = ["", " +-10%", " +-150%", "%", " %", "/%", "!", ";", "?", "(", ")", "}",
                    "**2", "^0.5", "^-1", "/0", " kg", " m", " Hz", " rpm", " s", "\x1b[2J",
                    " \u202e", "/s/s", "**1000", " per", "  "]


def _plausible_quantity(examples: list) -> st.SearchStrategy:
    """Strings like the examples, their number scaled by 0.5 to 2."""
    texts = [e for e in examples if isinstance(e, str) and _NUMBER.match(e)] or ["1 m"]

    def scaled(text: str, factor: float) -> str:
        match = _NUMBER.match(text)
        return f"{float(match.group()) * factor:.6g}{text[match.end():]}"

    return st.one_of(st.sampled_from(texts),
                     st.builds(scaled, st.sampled_from(texts), st.floats(0.5, 2.0)))


def _quantity(examples: list) -> st.SearchStrategy:
    """Strings like the examples: as given, with another number, with a hostile suffix,
    or anything at all."""
    texts = [e for e in examples if isinstance(e, str)] or ["1 m"]
    units = sorted({_NUMBER.sub("", e).strip() for e in texts} | {""})
    numbers = st.one_of(
        st.floats(allow_nan=False, allow_infinity=False, min_value=-1e6, max_value=1e6),
        st.sampled_from(EXTREME_NUMBERS), st.integers(-10, 10**6))
    rebuilt = st.builds(lambda n, u, s: f"{n} {u}{s}".strip(), numbers, st.sampled_from(units),
                        st.sampled_from(HOSTILE_SUFFIXES))
    return st.one_of(st.sampled_from(texts), rebuilt, rebuilt,
                     st.text(max_size=24), st.sampled_from(texts).map(lambda t: t + t))


def _plausible_number(schema: dict, integer: bool) -> st.SearchStrategy:
    """A number within the schema's bounds (exclusive bounds kept off)."""
    low = schema.get("minimum", schema.get("exclusiveMinimum"))
    high = schema.get("maximum", schema.get("exclusiveMaximum"))
    if integer:
        low = int(low) + (1 if "exclusiveMinimum" in schema else 0) if low is not None else 1
        high = int(high) - (1 if "exclusiveMaximum" in schema else 0) if high is not None else low + 20
        return st.integers(low, max(low, high))
    low = float(low) if low is not None else 0.0
    high = float(high) if high is not None else max(1.0, low + 1.0)
    span = high - low
    return st.floats(low + span * 1e-3, high - span * 1e-3)


def _number_strategy(schema: dict, integer: bool) -> st.SearchStrategy:
    low = schema.get("minimum", schema.get("exclusiveMinimum"))
    high = schema.get("maximum", schema.get("exclusiveMaximum"))
    if integer:
        inside = st.integers(int(low) if low is not None else -5,
                             int(high) if high is not None else max(50, int(low or 0) + 50))
        outside = st.sampled_from([0, -1, 10**6, 2**63 - 1, -(2**63)])
    else:
        inside = st.floats(min_value=float(low) if low is not None else -1e3,
                           max_value=float(high) if high is not None else 1e4,
                           allow_nan=False, allow_infinity=False)
        outside = st.sampled_from(EXTREME_NUMBERS)
    return st.one_of(inside, inside, inside, outside)


FILE_KEYS = frozenset({"mode-file", "structure", "history"})
"""Keys whose values name other files: left out of plausible designs (a generated path
names no file, so the design would stop at "not found")."""


class SchemaStrategies:
    """Hypothesis strategies for the values a JSON Schema (as ``vcheck schema`` prints
    it) describes.

    ``hostile=False``: plausible values (enumerations, the schema's examples scaled,
    numbers within the bounds, no unknown keys), so designs get through to the rules.
    ``hostile=True``: a share of the values are out of bounds, extreme, misspelt or
    anything at all.
    """

    def __init__(self, schema: dict, hostile: bool = True, max_depth: int = 8) -> None:
        self.schema = schema
        self.definitions = schema.get("$defs", {})
        self.hostile = hostile
        self.max_depth = max_depth

    def of(self, node: dict, depth: int = 0) -> st.SearchStrategy:
        if depth > self.max_depth:
            return st.none()
        if "$ref" in node:
            name = node["$ref"].rsplit("/", 1)[-1]
            return st.deferred(lambda: self.of(self.definitions[name], depth + 1))
        if "anyOf" in node or "oneOf" in node:
            options = [self.of(option, depth + 1) for option in node.get("anyOf", node.get("oneOf"))]
            return st.one_of(options)
        if "enum" in node and not self.hostile:
            return st.sampled_from(node["enum"])
        if "enum" in node:
            return st.one_of(st.sampled_from(node["enum"]), st.sampled_from(node["enum"]),
                             st.text(max_size=12))
        kind = node.get("type")
        if kind == "object" or "properties" in node:
            return self._object(node, depth)
        if kind == "array":
            return self._array(node, depth)
        if kind == "string":
            if ("examples" in node or "pattern" in node) and not self.hostile:
                return _plausible_quantity(node.get("examples", []))
            if "examples" in node or "pattern" in node:
                return _quantity(node.get("examples", []))
            low, high = node.get("minLength", 0), min(node.get("maxLength", 40), 40)
            if not self.hostile:
                return st.text(alphabet="abcdefghij -", min_size=max(1, low), max_size=high)
            low, high = node.get("minLength", 0), min(node.get("maxLength", 40), 40)
            return st.one_of(st.text(min_size=low, max_size=high),
                             st.text(min_size=low, max_size=high,
                                     alphabet=st.characters(codec="utf-8")))
        if kind in ("integer", "number") and not self.hostile:
            return _plausible_number(node, integer=kind == "integer")
        if kind == "integer":
            return _number_strategy(node, integer=True)
        if kind == "number":
            return st.one_of(_number_strategy(node, integer=False),
                             _number_strategy(node, integer=True))
        if kind == "boolean":
            return st.booleans()
        if kind == "null":
            return st.none()
        return st.one_of(st.none(), st.integers(), st.text(max_size=8))

    def _array(self, node: dict, depth: int) -> st.SearchStrategy:
        low = node.get("minItems", 0)
        high = min(node.get("maxItems", low + 3), low + 3)
        if "prefixItems" in node:
            parts = [self.of(item, depth + 1) for item in node["prefixItems"]]
            return st.tuples(*parts).map(list)
        item = self.of(node.get("items", {}), depth + 1)
        return st.lists(item, min_size=max(0, low - 1) if low else 0, max_size=high)

    def _object(self, node: dict, depth: int) -> st.SearchStrategy:
        properties = node.get("properties", {})
        required = set(node.get("required", ()))
        fixed = {key: self.of(value, depth + 1) for key, value in properties.items()
                 if key in required}
        if "format" in fixed and depth <= 1:
            fixed["format"] = st.just(1) if not self.hostile else st.one_of(
                st.just(1), st.just(1), fixed["format"])
        optional = {key: self.of(value, depth + 1) for key, value in properties.items()
                    if key not in required and (self.hostile or key not in FILE_KEYS)}
        base = st.fixed_dictionaries(fixed, optional=optional)
        if not self.hostile:
            return base.map(_without_none)
        typo = st.sampled_from(sorted(properties) or ["x"]).map(lambda k: k[:-1] + "z")
        return st.one_of(
            base, base, base,
            st.tuples(base, typo, st.integers(0, 3)).map(lambda t: {**t[0], t[1]: t[2]}),
        ).map(_without_none)


def _without_none(data: dict) -> dict:
    """TOML has no null: a None value means the key is left out."""
    return {key: value for key, value in data.items() if value is not None}


def _clean_nones(value):
    if isinstance(value, dict):
        return {k: _clean_nones(v) for k, v in value.items() if v is not None}
    if isinstance(value, list):
        return [_clean_nones(v) if v is not None else 0 for v in value]
    return value


def _design_schema() -> dict:
    from vcheck.design.schema import design_schema

    return design_schema()


def schema_designs() -> st.SearchStrategy:
    """Design (and structure) files generated from the exported JSON Schema, as TOML."""
    schema = _design_schema()
    hostile, plausible = SchemaStrategies(schema), SchemaStrategies(schema, hostile=False)
    design, structure = schema["$defs"]["Design"], schema["$defs"]["StructureFile"]
    documents = st.one_of(plausible.of(design), plausible.of(design), hostile.of(design),
                          hostile.of(structure), plausible.of(structure))
    return documents.map(_clean_nones).map(lambda d: toml_document(d).encode("utf-8"))


# -- mutated examples and raw bytes -------------------------------------------------------

EXAMPLE_DESIGNS = sorted(p for p in EXAMPLE.rglob("*.toml") if p.name != "vcheck.toml")
"""The bundled example designs, the seeds of the mutations."""

_INSERTS = ['"""', "'''", '\\"', "[", "]", "[[", "]]", "{", "}", "=", ".", "#", "\n", "\r",
            "\x00", "\x1b[2J", "\ufeff", "\u202e", "\\u0000", "nan", "inf", "1e308", "5e-324",
            "-", "**9", "%", "/0", " kg", "[machine]", "[[joint]]", "a.b.c = 1", "\t", "é"]


@st.composite
def mutated_examples(draw) -> bytes:
    """A bundled example design with a few edits: a cut, a copy, an insertion, a number
    made extreme, a line swapped or the file cut short."""
    text = draw(st.sampled_from(EXAMPLE_DESIGNS)).read_text(encoding="utf-8")
    for _ in range(draw(st.integers(1, 4))):
        if not text:
            break
        kind = draw(st.sampled_from(["cut", "copy", "insert", "number", "swap", "truncate"]))
        at = draw(st.integers(0, len(text) - 1))
        if kind == "cut":
            text = text[:at] + text[at + draw(st.integers(1, 40)):]
        elif kind == "copy":
            text = text[:at] + text[at:at + draw(st.integers(1, 80))] + text[at:]
        elif kind == "insert":
            text = text[:at] + draw(st.sampled_from(_INSERTS)) + text[at:]
        elif kind == "number":
            numbers = list(re.finditer(r"\d+(\.\d+)?", text))
            if numbers:
                match = draw(st.sampled_from(numbers))
                new = draw(st.sampled_from(["0", "-1", "1e308", "5e-324", "1e-30", "99999999",
                                            "0.0", "1" * 30, "nan", "inf"]))
                text = text[:match.start()] + new + text[match.end():]
        elif kind == "swap":
            lines = text.split("\n")
            i, j = draw(st.integers(0, len(lines) - 1)), draw(st.integers(0, len(lines) - 1))
            lines[i], lines[j] = lines[j], lines[i]
            text = "\n".join(lines)
        else:
            text = text[:at]
    encoding = draw(st.sampled_from(["utf-8", "utf-8", "utf-8", "utf-16", "latin-1"]))
    return text.encode(encoding, errors="replace")


raw_bytes = st.one_of(st.binary(max_size=600),
                      st.text(max_size=400).map(lambda t: t.encode("utf-8", "surrogatepass")))
"""Raw bytes and raw text as a design file."""

formats = st.sampled_from(FORMATS)


# -- the properties ------------------------------------------------------------------------

def _property(data: bytes, fmt: str, strategy: str, budget: _Budget) -> None:
    outcome = check_design_bytes(data, fmt, strategy)
    assert not outcome.problems(), outcome.describe()
    budget.check()


@pytest.mark.parametrize("strategy", [pytest.param("schema-designs", marks=known("schema-designs"))])
def test_schema_generated_designs(strategy):
    budget = _Budget()

    @PROFILE
    @given(schema_designs(), formats)
    def run(data, fmt):
        _property(data, fmt, strategy, budget)

    run()


@pytest.mark.parametrize("strategy",
                         [pytest.param("mutated-examples", marks=known("mutated-examples"))])
def test_mutated_example_designs(strategy):
    budget = _Budget()

    @PROFILE
    @given(mutated_examples(), formats)
    def run(data, fmt):
        _property(data, fmt, strategy, budget)

    run()


def test_raw_bytes():
    budget = _Budget()

    @PROFILE
    @given(raw_bytes, formats)
    def run(data, fmt):
        _property(data, fmt, "raw-bytes", budget)

    run()


def test_the_examples_themselves_keep_the_contract():
    # the seeds of the mutations: each checks with status 0, 1 or 2 on its own
    budget = _Budget()
    for path in EXAMPLE_DESIGNS:
        outcome = check_design_bytes(path.read_bytes())
        assert not outcome.problems(), (path, outcome.describe())
    budget.check()


def test_generated_designs_are_mostly_read():
    # The strategies must reach the rules, not only the parser: of the first examples
    # a share loads and is judged (exit 0 or 1). Without this the property could hold
    # only because every input is refused at the door.
    statuses = []

    @settings(PROFILE, max_examples=min(EXAMPLES, 40), deadline=None)
    @given(schema_designs())
    def run(data):
        statuses.append(check_design_bytes(data).status)

    run()
    judged = sum(1 for s in statuses if s in (0, 1))
    assert judged >= 2, statuses


def test_the_toml_writer_round_trips():
    # the serializer above is checked against the standard library's TOML reader
    if sys.version_info >= (3, 11):
        import tomllib
    else:  # pragma: no cover
        import tomli as tomllib
    data = {"format": 1, "a b": "q\"\\\x00\n\x1b", "machine": {"tag": "x", "n": [1, 2.5],
            "speed": {"min": "1 rpm"}}, "joint": [{"name": "j", "k": {"x": True}}, {"name": "k"}],
            "x": float("inf")}
    assert tomllib.loads(toml_document(data)) == data


# -- JSON reports of the wrong shape, for merge -------------------------------------------

_REPORT: list[dict] = []


def _a_real_report() -> dict:
    """A JSON report of one example design (made once)."""
    if not _REPORT:
        with tempfile.TemporaryDirectory(prefix="vcheck-hostile-") as folder:
            target = Path(folder, "r.json")
            outcome = run_in_process(["check", str(EXAMPLE / "roof" / "ct-r1.toml"), "--format",
                                      "json", "--output", str(target)], EXAMPLE)
            assert outcome.status in (0, 1), outcome.describe()
            _REPORT.append(json.loads(target.read_text(encoding="utf-8")))
    return _REPORT[0]


def _paths(data, prefix=()):
    yield prefix
    if isinstance(data, dict):
        for key, value in data.items():
            yield from _paths(value, prefix + (key,))
    elif isinstance(data, list):
        for n, value in enumerate(data):
            yield from _paths(value, prefix + (n,))


json_values = st.recursive(
    st.one_of(st.none(), st.booleans(), st.integers(-(2**70), 2**70),
              st.floats(allow_nan=False), st.text(max_size=12)),
    lambda inner: st.one_of(st.lists(inner, max_size=3),
                            st.dictionaries(st.text(max_size=8), inner, max_size=3)),
    max_leaves=6)


@st.composite
def mutated_reports(draw) -> bytes:
    """A real JSON report with one to three nodes replaced or removed."""
    import copy

    data = copy.deepcopy(_a_real_report())
    for _ in range(draw(st.integers(1, 3))):
        paths = [p for p in _paths(data) if p]
        if not paths:
            break
        path = draw(st.sampled_from(paths))
        parent = data
        for key in path[:-1]:
            parent = parent[key]
        if draw(st.booleans()) and isinstance(parent, dict):
            del parent[path[-1]]
        else:
            parent[path[-1]] = draw(json_values)
    return json.dumps(data).encode("utf-8")


def test_merge_of_mutated_reports():
    budget = _Budget()

    @PROFILE
    @given(mutated_reports(), formats)
    def run(data, fmt):
        with tempfile.TemporaryDirectory(prefix="vcheck-hostile-") as folder:
            Path(folder, "shard.json").write_bytes(data)
            outcome = run_in_process(["merge", "shard.json", "--format", fmt], Path(folder))
        _count("mutated-reports", bool(outcome.problems()))
        assert not outcome.problems(), outcome.describe()
        budget.check()

    run()


# -- the corpus: minimal inputs from the issue -------------------------------------------

DESIGN_TEXT = (EXAMPLE / "roof" / "ef-r1.toml").read_text(encoding="utf-8")


def _with(old: str, new: str) -> str:
    assert old in DESIGN_TEXT
    return DESIGN_TEXT.replace(old, new, 1)


def _mass(value: str) -> str:
    return _with('mass = "420 kg"', f"mass = {json.dumps(value)}")


CORPUS_DESIGNS = {
    # id: (design text, exit statuses the contract allows)
    "scanner-unclosed-multiline": (_with('description = "roof exhaust fan, belt drive, turned '
                                         'down to 270 rpm at night"',
                                         'description = """\\"""]"""'), {1}),  # valid TOML
    "scanner-index-error": ('description = """a\\"""\nb = 1\n"""\n' + DESIGN_TEXT, {2}),
    "unit-stray-parenthesis": (_mass("1 kg("), {2}),
    "unit-stray-brace": (_mass("420 kg}"), {2}),
    "unit-huge-exponent": (_mass("1 km**1000"), {2}),
    "unit-zero-exponent": (_mass("1 kg**0"), {2}),
    "unit-division-by-zero": (_mass("1 Hz/0"), {2}),
    "unit-deep-nesting": (_mass("1 " + "(" * 5000 + "kg" + ")" * 5000), {2}),
    "unit-percent-sign": (_mass("420 kg %"), {2}),
    "unit-per-percent": (_mass("420 kg/%"), {2}),
    "unit-trailing-punctuation": (_mass("420 kg!"), {2}),
    "range-tiny-stiffness": (_with('stiffness = "60 kN/m +-10%"', 'stiffness = "5e-324 N/m"'),
                             {1, 2}),
    "control-characters-in-text": (_with('tag = "EF-R1"', 'tag = "EF\\u001b[2J\\r\\u0000R1"'),
                                   {0, 1, 2}),
    "huge-description": (_with('description = "roof exhaust fan, belt drive, turned down to '
                               '270 rpm at night"', 'description = "' + "d" * 900_000 + '"'),
                         {0, 1, 2}),
    "nul-in-reference-path": (DESIGN_TEXT + '\n[[mode-file]]\npath = "a\\u0000b.csv"\n', {2}),
    "long-reference-path": (DESIGN_TEXT + f'\n[[mode-file]]\npath = "{"p" * 5000}.csv"\n', {2}),
    "reference-outside-root": (DESIGN_TEXT + '\n[[mode-file]]\npath = "../../../../etc/passwd"\n',
                               {2}),
    "not-utf8": ("format = 1\n[machine]\ntag = \"\udcff\"\n", {2}),
    "deeply-nested-arrays": ("format = 1\nx = " + "[" * 3000 + "]" * 3000 + "\n", {2}),
}


@pytest.mark.parametrize("case_id", [pytest.param(c, marks=known(c), id=c)
                                     for c in CORPUS_DESIGNS])
def test_corpus_design(case_id):
    text, allowed = CORPUS_DESIGNS[case_id]
    outcome = check_design_bytes(text.encode("utf-8", "surrogateescape"))
    assert not outcome.problems(), outcome.describe()
    assert outcome.status in allowed, outcome.describe()


def _tower(folder: Path) -> list[str]:
    (folder / "d.toml").write_text(_mass("1 kg**9**9**9"))
    return ["check", "d.toml"]


def _symlink_to_dev_zero(folder: Path) -> list[str]:
    (folder / "sub").mkdir()
    (folder / "sub" / "x.toml").symlink_to("/dev/zero")
    (folder / "d.toml").write_text(DESIGN_TEXT)
    return ["check", "."]


def _fifo(folder: Path) -> list[str]:
    os.mkfifo(folder / "pipe.toml")
    (folder / "d.toml").write_text(DESIGN_TEXT)
    return ["check", "."]


def _symlink_outside(folder: Path) -> list[str]:
    outside = folder.parent / f"{folder.name}-outside.toml"
    outside.write_text(_mass("SECRET-VALUE kg"))
    (folder / "vcheck.toml").write_text("")
    (folder / "x.toml").symlink_to(outside)
    return ["check", "."]


def _npy(folder: Path) -> list[str]:
    header = "{'descr': '<f8', 'fortran_order': False, 'shape': (10000000000,), }"
    header += " " * (118 - len(header)) + "\n"
    (folder / "h.npy").write_bytes(b"\x93NUMPY\x01\x00" + len(header).to_bytes(2, "little")
                                   + header.encode("latin-1"))
    stressed = (EXAMPLE / "basement" / "cmp-b7.toml").read_text(encoding="utf-8")
    stressed = stressed.replace('path = "basement/data/cmp-b7-branch-strain.csv"',
                                'path = "h.npy"')
    assert 'path = "h.npy"' in stressed
    (folder / "d.toml").write_text(stressed)
    return ["check", "d.toml"]


def _lumped(folder: Path) -> list[str]:
    count = 2000
    masses = ", ".join(['"100 kg"'] * count)
    springs = ", ".join(f'{{ between = [{i}, {i + 1}], stiffness = "1 MN/m" }}'
                        for i in range(1, count))
    (folder / "d.toml").write_text(DESIGN_TEXT + f'\n[[lumped-model]]\nname = "chain"\n'
                                   f"masses = [{masses}]\nsprings = [{springs}]\n")
    return ["check", "d.toml"]


def _policy_typo(folder: Path) -> list[str]:
    (folder / "vcheck.toml").write_text(
        "[rules.frequency-separation]\nmargin-by-machine = { centrifugal_pump = 0.25 }\n")
    (folder / "d.toml").write_text(DESIGN_TEXT)
    return ["check", "d.toml"]


def _tool_array(folder: Path) -> list[str]:
    (folder / "pyproject.toml").write_text("[[tool.vcheck]]\npaths = ['.']\n")
    (folder / "d.toml").write_text(DESIGN_TEXT)
    return ["check", "d.toml"]


CORPUS_FOLDERS = {
    # id: (builder, exit statuses the contract allows)
    "unit-tower-exponent": (_tower, {2}),
    "symlink-to-dev-zero": (_symlink_to_dev_zero, {2}),
    "fifo-design": (_fifo, {2}),
    "symlink-outside-root": (_symlink_outside, {2}),
    "npy-huge-header": (_npy, {2}),
    "lumped-chain-2000": (_lumped, {0, 1, 2}),
    "policy-typo-by-machine": (_policy_typo, {2}),
    "tool-vcheck-array": (_tool_array, {2}),
}


@pytest.mark.parametrize("case_id", [pytest.param(c, marks=known(c), id=c)
                                     for c in CORPUS_FOLDERS])
def test_corpus_folder(case_id, tmp_path):
    build, allowed = CORPUS_FOLDERS[case_id]
    folder = tmp_path / "project"
    folder.mkdir()
    args = build(folder)
    # in a child process: these inputs can block in C code or fill memory
    outcome = run_in_subprocess(args, folder, timeout=5.0)
    assert not outcome.problems(), outcome.describe()
    assert outcome.status in allowed, outcome.describe()
    assert "SECRET-VALUE" not in outcome.out + outcome.err


@pytest.mark.skipif(shutil.which("git") is None, reason="the base revision needs git")
def test_cli_options_corpus(tmp_path):
    # the command-line cases of the corpus, with the contract's property only (their
    # exact messages are in test_cli_guard.py)
    folder = tmp_path / "p"
    folder.mkdir()
    (folder / "d.toml").write_text(DESIGN_TEXT)
    bad = folder / "bad.json"
    bad.write_text("[1, 2")
    for args in (["check", "d.toml", "--output", str(folder)],
                 ["check", "d.toml", "--report", f"sarif={folder}"],
                 ["check", "d.toml", "--output", "/proc/version"],
                 ["check", "d.toml", "--base-report", str(bad)],
                 ["merge", str(bad)],
                 ["check", "d.toml", "--jobs", "-1"],
                 ["check", "d.toml", "--shard", "0/0"],
                 ["check", "d.toml", "--uri-prefix", "../../x", "--format", "sarif"],
                 ["explain", "\x1b[2J"],
                 ["check", "d.toml", "--only", "no-such-rule"],
                 ["dynamics", "d.toml"]):
        outcome = run_in_process(args, folder)
        # an option's error names the option, not a file:line:col
        assert not outcome.problems(location=False), (args, outcome.describe())

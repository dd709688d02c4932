"""Start-up and throughput of the command line from a non-editable install, against
references in the same run.

Run on demand (never in the test suite):

    python benchmarks/bench_startup.py [--runs 7] [--designs 1000]

The checkout is built into a wheel and installed, not in editable mode, into two fresh
virtual environments whose dependencies (numpy, scipy, pydantic, pint, ...) are those of
the running interpreter, reached through a folder of links (so nothing is downloaded):

- "bytecode": installed as pip does by default (vcheck compiled at install), run with
  bytecode allowed;
- "no bytecode": installed with ``--no-compile`` and run with
  ``PYTHONDONTWRITEBYTECODE=1``, so that every run compiles vcheck from source (as in a
  CI job that sets the variable); the dependencies keep their compiled files.

In each it prints medians of repeated runs and the ratios of the targets:

- ``vcheck --version`` against bare ``python -c pass`` (target: at most 2x), with the
  console-script launcher pip writes (it imports ``re`` first) beside it;
- ``vcheck check`` of the bundled example against
  ``python -c "import numpy, scipy.linalg, pydantic"``, the floor of the core dependencies
  (target: at most 1.5x);
- the marginal cost per design on a realistic mix: copies of every design of the bundled
  example (joints, six-DOF mounts, shaft trains, records, PSDs, measurements) in one
  project with the example's policy, one copy of each against ``--designs`` in all
  (target: at most 2 ms per design, judged with every copy naming data files of its own;
  the copies naming the example's own data files, read once a check, are printed too).
  The command line checks the large mix in one process for each
  ``vcheck.parallel.AUTO_FROM`` (200) files, at most one a core, as a user's run would;
  the same with ``--jobs 1`` is printed beside it, the single-process cost.

The commands of each comparison run in turn, round after round (a command and its
reference see the same load), and the medians are compared.

Wall time on a shared machine swings by a third from one minute to the next (the floor
was seen anywhere between 290 and 560 ms). ``--instructions`` adds the same ratios
counted in instructions under valgrind's callgrind (one run each, repeatable to about 1%
with PYTHONHASHSEED fixed, whatever else the machine is doing); instructions are not
time (an import that waits on the disk costs few), so the targets are judged on wall
time, and the counts say whether a change helped.
"""

from __future__ import annotations

import argparse
import os
import re
import shutil
import statistics
import subprocess
import sys
import sysconfig
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
EXAMPLE = REPO / "examples" / "kestrel-yard"
DESIGN_FOLDERS = ("plant", "roof", "basement")  # the example policy's `paths`

TARGETS = {"version": 2.0, "example": 1.5, "marginal_ms": 2.0}

LAUNCHER = "import re, sys; re.sub(r'(-script\\.pyw|\\.exe)?$', '', sys.argv[0])"
"""What the console script pip writes for ``vcheck`` runs before vcheck's own code: it
imports ``re`` (about 26 M of the 27 M instructions ``vcheck --version`` adds to bare
python in a non-editable install); printed beside --version for the reader, not a target."""


def timed_together(commands: dict, runs: int, env: dict) -> dict:
    """Median wall time [s] of each of ``commands`` (name: (command, folder)) over ``runs``
    rounds, each round running every command once in turn, after one untimed round (which
    writes bytecode where it is allowed). Interleaved so that a change in the machine's
    load from one minute to the next shifts a command and its reference alike."""
    samples = {name: [] for name in commands}
    for round_ in range(runs + 1):
        for name, (command, cwd) in commands.items():
            start = time.perf_counter()
            subprocess.run(command, cwd=cwd, stdout=subprocess.DEVNULL,
                           stderr=subprocess.DEVNULL, env=env)
            if round_:
                samples[name].append(time.perf_counter() - start)
    return {name: statistics.median(values) for name, values in samples.items()}


def instructions(command: list[str], env: dict, cwd: Path) -> int:
    """Instructions one run of ``command`` executes, counted by callgrind, after one run
    outside valgrind (which writes bytecode where it is allowed)."""
    subprocess.run(command, cwd=cwd, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
                   env=env)
    ran = subprocess.run(["valgrind", "--tool=callgrind", "--callgrind-out-file=/dev/null",
                          *command], cwd=cwd, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE,
                         text=True, env=dict(env, PYTHONHASHSEED="0"))
    for line in ran.stderr.splitlines():
        if "Collected :" in line:
            return int(line.rsplit(":", 1)[1])
    raise SystemExit(f"valgrind did not count {command}: {ran.stderr[-300:]}")


def count_instructions(bin_folder: Path, env: dict, small: Path, large: Path, sizes: tuple[int, int],
          work: Path) -> None:
    """The targets' ratios in instructions (see the module's docstring)."""
    python, vcheck = str(bin_folder / "python"), str(bin_folder / "vcheck")
    got = {
        "bare": instructions([python, "-c", "pass"], env, work),
        "version": instructions([vcheck, "--version"], env, work),
        "launcher": instructions([python, "-c", LAUNCHER], env, work),
        "floor": instructions([python, "-c", "import numpy, scipy.linalg, pydantic"], env, work),
        "example": instructions([vcheck, "check", str(EXAMPLE)], env, work),
        "small": instructions([vcheck, "check"], env, small),
    }
    print(f"  instructions (callgrind, one run each): --version {got['version']/1e6:,.0f} M vs "
          f"bare {got['bare']/1e6:,.0f} M = {got['version']/got['bare']:.2f}x (pip's launcher "
          f"alone {got['launcher']/1e6:,.0f} M); example "
          f"{got['example']/1e6:,.0f} M vs floor {got['floor']/1e6:,.0f} M = "
          f"{got['example']/got['floor']:.2f}x; mix of {sizes[0]} designs "
          f"{got['small']/1e6:,.0f} M")
    if sizes[1] <= 200:  # a larger mix takes minutes under valgrind
        # one process: valgrind counts this process, not the workers it would start
        got["large"] = instructions([vcheck, "check", "--jobs", "1"], env, large)
        print(f"  instructions per marginal design: "
              f"{(got['large'] - got['small']) / (sizes[1] - sizes[0]) / 1e6:,.1f} M")


def build_wheel(out: Path, source: Path = REPO) -> Path:
    subprocess.run([sys.executable, "-m", "pip", "wheel", "--no-deps", "--no-build-isolation",
                    "-q", "-w", str(out), str(source)], check=True, capture_output=True)
    (wheel,) = out.glob("vcheck_vibration-*.whl")
    return wheel


def dependency_links(folder: Path) -> Path:
    """A folder of links to the running interpreter's installed packages, less vcheck
    itself (its editable finder, its metadata) and the start-up hooks (``.pth``)."""
    folder.mkdir()
    site = Path(sysconfig.get_paths()["purelib"])
    for entry in site.iterdir():
        name = entry.name
        if name.startswith(("__editable__", "vcheck", "__pycache__")) or name.endswith(".pth"):
            continue
        (folder / name).symlink_to(entry)
    return folder


def install(where: Path, wheel: Path, deps: Path, compiled: bool) -> Path:
    """A fresh virtual environment with vcheck installed from the wheel; its bin folder."""
    subprocess.run([sys.executable, "-m", "venv", "--without-pip", str(where)], check=True)
    python = where / "bin" / "python"
    purelib = subprocess.run([str(python), "-c",
                              "import sysconfig; print(sysconfig.get_paths()['purelib'])"],
                             check=True, capture_output=True, text=True).stdout.strip()
    (Path(purelib) / "vcheck-bench-deps.pth").write_text(f"{deps}\n")
    command = [sys.executable, "-m", "pip", "--python", str(python), "install", "--no-deps",
               "-q", str(wheel)]
    if not compiled:
        command.insert(-1, "--no-compile")
    subprocess.run(command, check=True, capture_output=True)
    return where / "bin"


_DATA_FILE = re.compile(r'"((?:plant|roof|basement)/[^"]+\.csv)"')
"""A design's reference to a data file of its own (records, PSDs, spectra)."""


def realistic_mix(folder: Path, count: int, own_files: bool = False) -> Path:
    """A project holding the bundled example's files and policy, whose checked designs are
    ``count`` copies of its designs, each design in turn.

    The copies name the same data files as the designs they copy, which a check reads
    once (several designs of a project may well name one site spectrum); with
    ``own_files`` each copy names copies of its own, as distinct designs would."""
    shutil.copytree(EXAMPLE, folder)
    designs = sorted(p for name in DESIGN_FOLDERS for p in (folder / name).rglob("*.toml"))
    mix = folder / "mix"
    mix.mkdir()
    data = folder / "mix-data"
    data.mkdir()
    for n in range(count):
        design = designs[n % len(designs)]
        text = design.read_text()
        if own_files:
            def own(match, n=n):
                source = folder / match.group(1)
                copy = data / f"{n:05d}-{source.name}"
                shutil.copyfile(source, copy)
                return f'"{copy.relative_to(folder).as_posix()}"'
            text = _DATA_FILE.sub(own, text)
        (mix / f"{n:05d}-{design.name}").write_text(text)
    policy = folder / "vcheck.toml"
    text = policy.read_text()
    if 'paths = ["plant", "roof", "basement"]' not in text:
        raise SystemExit("the example policy's paths changed: update realistic_mix")
    policy.write_text(text.replace('paths = ["plant", "roof", "basement"]', 'paths = ["mix"]'))
    return folder


def measure(bin_folder: Path, env: dict, runs: int, small: Path, large: Path,
            sizes: tuple[int, int], work: Path, large_own: Path) -> dict:
    python, vcheck = str(bin_folder / "python"), str(bin_folder / "vcheck")
    out = timed_together({
        "bare": ([python, "-c", "pass"], work),
        "version": ([vcheck, "--version"], work),
        "launcher": ([python, "-c", LAUNCHER], work),
    }, runs, env)
    out.update(timed_together({
        "floor": ([python, "-c", "import numpy, scipy.linalg, pydantic"], work),
        "example": ([vcheck, "check", str(EXAMPLE)], work),
    }, runs, env))
    out.update(timed_together({
        "small": ([vcheck, "check"], small),
        "large": ([vcheck, "check"], large),
        "large_own": ([vcheck, "check"], large_own),
        "large_own_single": ([vcheck, "check", "--jobs", "1"], large_own),
    }, runs, env))
    out["cores"] = len(os.sched_getaffinity(0)) if hasattr(os, "sched_getaffinity") else (
        os.cpu_count() or 1)
    out["marginal"] = (out["large"] - out["small"]) / (sizes[1] - sizes[0])
    out["marginal_own"] = (out["large_own"] - out["small"]) / (sizes[1] - sizes[0])
    out["marginal_own_single"] = ((out["large_own_single"] - out["small"])
                                  / (sizes[1] - sizes[0]))
    return out


def report(name: str, m: dict, sizes: tuple[int, int]) -> None:
    def verdict(ok: bool) -> str:
        return "met" if ok else "NOT MET"

    version, example = m["version"] / m["bare"], m["example"] / m["floor"]
    marginal_ms = m["marginal"] * 1e3
    print(f"\n{name}")
    print(f"  {'measurement':58s} {'median':>10s} {'reference':>10s} {'ratio':>6s}  target")
    print(f"  {'vcheck --version vs python -c pass':58s} {m['version']*1e3:7.1f} ms "
          f"{m['bare']*1e3:7.1f} ms {version:6.2f}  <= {TARGETS['version']}x "
          f"{verdict(version <= TARGETS['version'])}")
    launcher = "  of which pip's console-script launcher (import re)"
    print(f"  {launcher:58s} "
          f"{m['launcher']*1e3:7.1f} ms {m['bare']*1e3:7.1f} ms {m['launcher'] / m['bare']:6.2f}")
    print(f"  {'vcheck check example vs import numpy, scipy.linalg, pydantic':58s} "
          f"{m['example']*1e3:7.1f} ms {m['floor']*1e3:7.1f} ms {example:6.2f}  "
          f"<= {TARGETS['example']}x {verdict(example <= TARGETS['example'])}")
    print(f"  {f'vcheck check, realistic mix of {sizes[0]} designs':58s} {m['small']*1e3:7.1f} ms")
    print(f"  {f'vcheck check, realistic mix of {sizes[1]} designs':58s} {m['large']*1e3:7.1f} ms")
    print(f"  {'  the same, each copy with data files of its own':58s} {m['large_own']*1e3:7.1f} ms")
    print(f"  {'  the same, in one process (--jobs 1)':58s} {m['large_own_single']*1e3:7.1f} ms")
    own_ms = m["marginal_own"] * 1e3
    print(f"  {'marginal cost per design, data files shared':58s} {marginal_ms:7.3f} ms")
    print(f"  {'marginal cost per design, data files of its own':58s} {own_ms:7.3f} ms {'':10s} "
          f"{'':6s}  <= {TARGETS['marginal_ms']} ms {verdict(own_ms <= TARGETS['marginal_ms'])}")
    single = f"  the same in one process (--jobs 1; above: up to {m['cores']} processes)"
    print(f"  {single:58s} {m['marginal_own_single'] * 1e3:7.3f} ms")


def main() -> None:
    parser = argparse.ArgumentParser()
    parser.add_argument("--runs", type=int, default=7)
    parser.add_argument("--designs", type=int, default=1000,
                        help="designs in the large realistic mix (default 1000)")
    parser.add_argument("--instructions", action="store_true",
                        help="also count instructions under valgrind (slow: about a minute "
                        "per install; the marginal count only with --designs 200 or fewer)")
    parser.add_argument("--source", type=Path, default=REPO,
                        help="the checkout to build and measure (default: this one), e.g. "
                        "an earlier revision unpacked with `git archive`, for a before and "
                        "after; the example and the mix come from this checkout")
    args = parser.parse_args()
    base = {k: v for k, v in os.environ.items()
            if k not in ("PYTHONDONTWRITEBYTECODE", "PYTHONPATH", "VIRTUAL_ENV")}
    with tempfile.TemporaryDirectory() as tmp:
        work = Path(tmp)
        wheel = build_wheel(work / "wheel", args.source)
        deps = dependency_links(work / "deps")
        count = len([p for name in DESIGN_FOLDERS for p in (EXAMPLE / name).rglob("*.toml")])
        sizes = (count, max(args.designs, 2 * count))
        small = realistic_mix(work / "mix-small", sizes[0])
        large = realistic_mix(work / "mix-large", sizes[1])
        large_own = realistic_mix(work / "mix-large-own", sizes[1], own_files=True)
        for name, compiled, env in (
                ("non-editable install, bytecode", True, base),
                ("non-editable install, no bytecode (--no-compile, PYTHONDONTWRITEBYTECODE=1)",
                 False, dict(base, PYTHONDONTWRITEBYTECODE="1"))):
            bin_folder = install(work / f"venv-{int(compiled)}", wheel, deps, compiled)
            report(name, measure(bin_folder, env, args.runs, small, large, sizes, work,
                                 large_own), sizes)
            if args.instructions:
                count_instructions(bin_folder, env, small, large, sizes, work)


if __name__ == "__main__":
    main()

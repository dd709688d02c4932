"""The ``vcheck`` command line: parse arguments, call the library, set the exit status.

No physics and no report layout here. Heavy imports (numpy, pydantic, pint) happen only
inside the commands that need them, so ``vcheck --version`` starts in milliseconds.

Exit statuses (:class:`vcheck.results.ExitStatus`): 0 nothing failed; 1 a rule failed
(or warned, with --fail-on-warn); 2 bad input, policy or usage; 3 a rule could not run.

One guard (:func:`main`) stands over every command: a known failure (an input problem,
an output file that cannot be written, a bad option or environment value) exits 2 with
where it is; anything unexpected exits 3 with a one-line message and a request to report
it, never a traceback and never 1, which CI would read as "a rule failed".
``VCHECK_TRACEBACK=1`` adds the traceback, for the report.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from . import __version__
from .report import FORMATS

__all__ = ["main"]

_INPUT_ERROR = 2
_INTERNAL_ERROR = 3

ISSUES_HINT = ("this is a fault in vcheck, not in your design: please report it with the "
               "command line and the input files (set VCHECK_TRACEBACK=1 for the details)")
"""What the guard asks for when something unexpected happens."""


class UsageError(Exception):
    """A known failure outside the design files: an option, an environment variable or an
    output file. Its message starts with where the problem is (``--output FILE``,
    ``VCHECK_TODAY``); the guard prints it and exits 2."""


class _Parser(argparse.ArgumentParser):
    def error(self, message: str):  # usage errors exit 2, like every bad input
        self.print_usage(sys.stderr)
        self.exit(_INPUT_ERROR, f"vcheck: error: {message}\n")


def _parser() -> argparse.ArgumentParser:
    parser = _Parser(
        prog="vcheck",
        description="Vibration-design rule checker: frequency separation, isolation, "
        "bolted joints and fatigue, from TOML design files.",
        epilog="Exit statuses: 0 nothing failed; 1 a rule failed (or warned with "
        "--fail-on-warn); 2 bad input, policy or usage; 3 a rule could not run (or a "
        "fault in vcheck: please report it).",
    )
    parser.add_argument("--version", action="version", version=f"vcheck {__version__}")
    commands = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)

    check = commands.add_parser("check", help="check design files and report pass / warn / fail",
                                description="Check design files (or folders of them) against "
                                "every enabled rule.")
    check.add_argument("paths", nargs="*", metavar="PATH",
                       help="design files or folders (default: 'paths' of the project policy, "
                       "else the current folder)")
    check.add_argument("--format", choices=FORMATS, default="text",
                       help="report format (default: text)")
    check.add_argument("--output", metavar="FILE", type=Path,
                       help="write the report to FILE; the text report then goes to stdout")
    check.add_argument("--fail-on-warn", action="store_true", default=None,
                       help="warnings fail the run (exit status 1)")
    check.add_argument("--policy", metavar="FILE", type=Path,
                       help="policy file (default: the vcheck.toml, or pyproject.toml with "
                       "[tool.vcheck], at or above the first PATH or the current folder)")
    _output_options(check)
    check.add_argument("--shard", metavar="K/N", type=_shard,
                       help="check only shard K of N of the design files (stable by path), "
                       "for parallel CI jobs; merge their JSON reports with `vcheck merge`")
    check.add_argument("--only", metavar="RULE", action="append", default=None,
                       help="run only this rule (repeatable)")
    check.add_argument("--jobs", metavar="N", type=int, default=None,
                       help="check files in N processes (0: one per core; default: one "
                       "for each 200 design files, at most one per core); same output")
    base = check.add_mutually_exclusive_group()
    base.add_argument("--base-report", metavar="FILE", type=Path,
                      help="compare with a previous JSON report: new, fixed, worse margins")
    base.add_argument("--base-revision", metavar="REV",
                      help="compare with the designs at git revision REV (checked out to a "
                      "temporary worktree, judged by the current rules and policy)")
    check.add_argument("--gate", choices=("all", "new"), default="all",
                       help="'new': only failures the base did not have fail the run "
                       "(needs --base-report or --base-revision)")

    rules = commands.add_parser("rules", help="list the rules with their limits and sources",
                                description="List every registered rule: id, title, origin, "
                                "options with their defaults, and sources.")
    rules.add_argument("--policy", metavar="FILE", type=Path, help="policy file (its "
                       "local-rules folders are listed too)")

    merge = commands.add_parser(
        "merge", help="merge the JSON reports of shards into one verdict and one report",
        description="Merge JSON reports (from `vcheck check --shard K/N --format json`) "
        "into one result, written in any format.")
    merge.add_argument("reports", nargs="+", metavar="REPORT", type=Path,
                       help="JSON reports to merge")
    merge.add_argument("--format", choices=FORMATS, default="text", help="report format")
    merge.add_argument("--output", metavar="FILE", type=Path,
                       help="write the report to FILE; the text report then goes to stdout")
    _output_options(merge)

    schema = commands.add_parser(
        "schema", help="print the JSON Schema of design files, for editors",
        description="Print the JSON Schema of design and structure files (for completion "
        "and checking in an editor's TOML language server).")
    schema.add_argument("--output", metavar="FILE", type=Path, help="write it to FILE")

    dynamics = commands.add_parser(
        "dynamics", help="show computed modes, forcing bands and separations, unjudged",
        description="Show what vcheck computes for each design (natural frequencies, "
        "forcing bands, the nearest band of each mode) without judging it.")
    dynamics.add_argument("paths", nargs="*", metavar="PATH",
                          help="design files or folders (default as for check)")
    dynamics.add_argument("--policy", metavar="FILE", type=Path, help="policy file")
    dynamics.add_argument("--format", choices=("text", "json", "html"), default="text",
                          help="text (default); json: every mode, forcing band, load and "
                          "separation at full precision, in SI units, with its own schema "
                          "(vcheck/report/dynamics.schema.json); html: the same numbers as "
                          "one page with interference diagrams (needs the [plots] extra)")

    explain = commands.add_parser("explain", help="print one rule's full text",
                                  description="Print what one rule judges, when it fails, "
                                  "its options with their defaults, and its sources.")
    explain.add_argument("rule_id", metavar="RULE", help="a rule id, as `vcheck rules` lists")
    explain.add_argument("--policy", metavar="FILE", type=Path, help="policy file")
    parser.set_defaults(_commands=commands.choices)
    return parser


def _shard(text: str) -> tuple[int, int]:
    try:
        k, n = (int(part) for part in text.split("/"))
    except ValueError:
        raise argparse.ArgumentTypeError(f"'{text}' is not K/N, e.g. 2/4") from None
    if not 1 <= k <= n:
        raise argparse.ArgumentTypeError(f"shard {text}: K must be from 1 to N")
    return k, n


def _report_target(text: str) -> tuple[str, Path]:
    fmt, sep, file = text.partition("=")
    if not sep or not file:
        raise argparse.ArgumentTypeError(f"'{text}' is not FORMAT=FILE, e.g. sarif=vcheck.sarif")
    if fmt not in FORMATS:
        raise argparse.ArgumentTypeError(f"unknown format '{fmt}'; known: {', '.join(FORMATS)}")
    return fmt, Path(file)


def _output_options(parser) -> None:
    parser.add_argument("--report", metavar="FORMAT=FILE", type=_report_target, action="append",
                        default=[], help="also write the report in FORMAT to FILE "
                        "(repeatable: --report sarif=vcheck.sarif --report junit=junit.xml)")
    parser.add_argument("--hide-passing", action="store_true",
                        help="leave passing findings out of the text report (still counted)")
    parser.add_argument("--detail", choices=("brief", "full"), default="brief",
                        help="text report: 'brief' (default) gives a passing finding one line "
                        "and a table its first rows; 'full' prints every message and row")
    parser.add_argument("--uri-prefix", metavar="PATH", default=None,
                        help="the project root's path inside the repository, for the paths "
                        "in SARIF, JUnit, GitHub, GitLab and Markdown (default: found with git)")
    parser.add_argument("--show-not-checked", action="store_true", default=None,
                        help="list not-checked findings in SARIF, GitHub and GitLab too "
                        "(default: only counted there; policy key show-not-checked)")
    parser.add_argument("--require-repository-paths", action="store_true",
                        help="exit 2 instead of warning when git cannot say where the project "
                        "root is in the repository and --uri-prefix is not given")


def main(argv: list[str] | None = None) -> int:
    """Run the command line; returns the exit status.

    Every command runs under one guard: :class:`UsageError` and input problems exit 2
    with their location, anything else exits 3 with a short message (see the module's
    docstring). argparse's own exits (``--version``, ``--help``, usage errors: 2) pass.
    """
    try:
        return _run(argv)
    except SystemExit:
        raise
    except KeyboardInterrupt:  # pragma: no cover - interactive only
        return 130
    except UsageError as exc:
        _say(f"vcheck: error: {exc}")
        return _INPUT_ERROR
    except BaseException as exc:  # noqa: BLE001 - the one guard of the command line
        from .design.problems import InputError

        if isinstance(exc, InputError) and exc.problems:
            _print_problems(exc)
            return _INPUT_ERROR
        engine = sys.modules.get("vcheck.engine")
        if engine is not None and isinstance(exc, engine.PluginError):
            _say(f"vcheck: plugin error: {exc}")
            return _INPUT_ERROR
        return _internal_error(exc)


def _say(text: str) -> None:
    """A line on stderr that cannot fail (a closed or full stderr is ignored). Text from
    inputs is in it, so control characters are shown as escapes and a long line is cut
    (:func:`vcheck.report.common.clean_lines`)."""
    from .report.common import bounded, clean_lines

    try:
        print(clean_lines(bounded(text, 20_000)), file=sys.stderr)
    except (OSError, ValueError):
        pass


def _internal_error(exc: BaseException) -> int:
    import os

    from .report.common import clean_text

    detail = clean_text(str(exc), limit=300)
    name = type(exc).__name__
    _say(f"vcheck: internal error: {name}{': ' + detail if detail else ''}")
    _say(f"vcheck: {ISSUES_HINT} (vcheck {__version__})")
    if os.environ.get("VCHECK_TRACEBACK", "").strip() not in ("", "0"):
        import traceback

        _say("".join(traceback.format_exception(type(exc), exc, exc.__traceback__)).rstrip())
    return _INTERNAL_ERROR


def _run(argv: list[str] | None) -> int:
    parser = _parser()
    args, unknown = parser.parse_known_args(argv)
    if unknown:
        # said by the subcommand's own parser, with its own usage line (an option of
        # another command, or a misspelt one, is the subcommand's error)
        owner = args._commands.get(args.command, parser) if args.command else parser
        owner.error(f"unrecognized arguments: {' '.join(unknown)}")
    if args.command is None:
        _parser().print_help(sys.stdout)
        return 0
    if args.command == "check":
        return _check(args)
    if args.command == "explain":
        return _explain(args)
    if args.command == "dynamics":
        return _dynamics(args)
    if args.command == "merge":
        return _merge(args)
    if args.command == "schema":
        return _schema(args)
    return _rules(args)


def _root_without_policy(paths: list[str]) -> Path:
    """The project root when no policy file is found: the current folder, unless a PATH
    lies outside it; then the deepest folder holding every PATH (so that a design
    elsewhere can be checked without a vcheck.toml beside it)."""
    import os

    cwd = Path.cwd().resolve()
    folders = []
    for text in paths:
        path = Path(text)
        if not path.exists():
            continue
        path = path.resolve()
        folders.append(path.parent if path.is_file() else path)
    if not folders or all(f == cwd or cwd in f.parents for f in folders):
        return cwd
    try:
        return Path(os.path.commonpath([str(f) for f in folders]))
    except ValueError:  # paths on different drives
        return cwd


def _policy(args):
    """The project policy for a command, searched from the first PATH (or the current
    folder); None after printing the problems."""
    from .config import load_policy
    from .design.problems import InputError

    paths = getattr(args, "paths", None) or []
    start = Path(paths[0]) if paths else Path.cwd()
    if paths and start.is_file():
        start = start.parent
    from .config import find_policy

    start = start if start.exists() else Path.cwd()
    if args.policy is None and find_policy(start)[1] is None:
        start = Path.cwd()  # no policy above the path: the one above the current folder
    try:
        return load_policy(start, args.policy, cwd=_root_without_policy(paths))
    except InputError as exc:
        _print_problems(exc)
        return None


def _load(args):
    """Policy and rule registry, or (None, None) after printing the problems."""
    policy = _policy(args)
    if policy is None:
        return None, None
    registry = _registry(policy)
    return (None, None) if registry is None else (policy, registry)


def _registry(policy):
    """The rule registry of a policy, or None after printing the plugin error."""
    from .engine import PluginError, discover

    try:
        return discover(policy.local_rule_folders())
    except PluginError as exc:
        _say(f"vcheck: plugin error: {exc}")
        return None


def _early_workers(policy, args, jobs):
    """The design files of the check, its number of processes, and, when that is more
    than one, its worker processes started now, before the rules are imported here, so
    that their start-up (about half a second) overlaps this process's own:
    ``(collected, processes, crew)``, crew None for a check in one process."""
    from .checking import collect_design_files
    from .parallel import CHUNK, Crew, processes_for

    collected = collect_design_files(policy, args.paths, Path.cwd(), args.shard)
    files = len(collected[0])
    processes = 1 if files <= CHUNK else processes_for(jobs, files, _cores())
    return collected, processes, (Crew(policy, args.only, processes - 1)
                                  if processes > 1 else None)


def _print_problems(exc) -> None:
    for problem in exc.problems:
        _say(_bounded_problem(problem))


def _bounded_problem(problem) -> str:
    from .report.common import bounded

    return bounded(problem.render())


def _check(args) -> int:
    from .checking import paused_gc

    with paused_gc():  # the reports too: the collector would walk every design again
        return _check_now(args)


def _check_now(args) -> int:
    from .checking import run_check
    from .design.problems import InputError

    _check_today()
    _check_outputs(args)
    if args.gate == "new" and args.base_report is None and args.base_revision is None:
        raise UsageError("--gate new needs --base-report or --base-revision")
    jobs = _jobs(args.jobs)
    policy = _policy(args)
    if policy is None:
        return _INPUT_ERROR
    collected, jobs, crew = _early_workers(policy, args, jobs)
    options = dict(fail_on_warn=args.fail_on_warn, shard=args.shard, only=args.only)
    try:
        registry = _registry(policy)
        if registry is None:
            return _INPUT_ERROR
        with _progress() as progress:
            result = run_check(policy, registry, args.paths, Path.cwd(), jobs=jobs,
                               progress=progress, collected=collected, crew=crew, **options)
    except InputError as exc:
        _print_problems(exc)
        return _INPUT_ERROR
    finally:
        if crew is not None:
            crew.stop()
    base, label = None, None
    try:
        if args.base_report is not None:
            from .report.json_read import read_report

            label = f"base report {args.base_report}"
            base = read_report(args.base_report)
        elif args.base_revision is not None:
            from .baseline import check_revision

            label = f"revision {args.base_revision}"
            base = check_revision(args.base_revision, policy, registry, args.paths,
                                  Path.cwd(), **options)
    except InputError as exc:
        # The reports of this run are still written (CI uploads them whatever the
        # outcome), with the comparison marked as failed; the exit status is 2.
        from .compare import Comparison

        _print_problems(exc)
        result.comparison = Comparison(base=label, error="; ".join(
            problem.message for problem in exc.problems))
        result.gate = args.gate
    if base is not None:
        from .compare import compare

        result.comparison = compare(result, base, label)
        result.gate = args.gate
    if args.show_not_checked is None:
        args.show_not_checked = policy.show_not_checked
    return _emit(result, args, policy.root)


class _progress:
    """Progress of a long run on stderr, only on an interactive terminal outside CI."""

    def __enter__(self):
        import os

        self._bar = None
        if not (sys.stderr.isatty() and not os.environ.get("CI")):
            return None
        return self._update

    def _update(self, done: int, total: int) -> None:
        if total < 50:
            return
        if self._bar is None:
            from rich.console import Console
            from rich.progress import Progress

            self._bar = Progress(console=Console(stderr=True), transient=True)
            self._bar.start()
            self._task = self._bar.add_task("checking designs", total=total)
        self._bar.update(self._task, completed=done)

    def __exit__(self, *exc) -> None:
        if self._bar is not None:
            self._bar.stop()


def _cores() -> int:
    from .parallel import usable_cores

    return usable_cores()


def _jobs(asked: int | None) -> int | None:
    """--jobs: 0 is one process a core; more than the cores is capped, with a note; not
    given (None) is left to the check, which takes one for each
    :data:`vcheck.parallel.AUTO_FROM` design files, at most one a core."""
    if asked is None:
        return None
    if asked < 0:
        raise UsageError(f"--jobs {asked}: give a number of processes from 1 up, or 0 for "
                         "one a core")
    cores = _cores()
    if asked == 0:
        return cores
    if asked > cores:
        _say(f"vcheck: note: --jobs {asked} is more than the {cores} "
             f"core{'s' if cores != 1 else ''} here; using {cores}")
        return cores
    return asked


def _check_today() -> None:
    """VCHECK_TODAY, when set, must be an ISO date (waivers are judged on it)."""
    import os
    from datetime import date

    text = os.environ.get("VCHECK_TODAY", "").strip()
    if not text:
        return
    try:
        date.fromisoformat(text)
    except ValueError:
        from .report.common import clean_text

        raise UsageError(f"VCHECK_TODAY={clean_text(text, limit=40)!r} is not a date; write "
                         "it as YYYY-MM-DD, e.g. VCHECK_TODAY=2026-03-01") from None


def _output_targets(args) -> list[tuple[str, Path]]:
    targets = [(f"--report {fmt}={path}", path) for fmt, path in args.report]
    if getattr(args, "output", None) is not None:
        targets.append((f"--output {args.output}", args.output))
    return targets


def _check_outputs(args) -> None:
    """Refuse, before any work, output files that cannot be written: a missing folder, a
    folder, something that is not a regular file (a device other than /dev/null or
    /dev/stdout, a FIFO), a file without write permission, a system file."""
    for option, path in _output_targets(args):
        _check_output(option, path)


_SPECIAL_OUTPUTS = frozenset({"/dev/null", "/dev/stdout", "/dev/stderr"})
_SYSTEM = ("/proc/", "/sys/", "/dev/")


def _check_output(option: str, path: Path) -> None:
    import os
    import stat

    try:
        folder = path.parent.resolve()
        if not folder.is_dir():
            raise UsageError(f"{option}: the folder of the output file does not exist")
        if path.as_posix() in _SPECIAL_OUTPUTS:
            return
        try:
            info = path.stat()
        except FileNotFoundError:
            if (folder.as_posix() + "/").startswith(_SYSTEM) or not os.access(folder, os.W_OK):
                raise UsageError(f"{option}: cannot be written (a system folder, or no write "
                                 "permission)") from None
            return
        if stat.S_ISDIR(info.st_mode):
            raise UsageError(f"{option}: is a folder; name a file in it, e.g. "
                             f"{(path / 'vcheck-report').as_posix()}")
        if not stat.S_ISREG(info.st_mode):
            raise UsageError(f"{option}: is not a regular file (a device, FIFO or socket); "
                             "name a file")
        resolved = path.resolve().as_posix()
        if resolved.startswith(_SYSTEM) or not os.access(path, os.W_OK):
            raise UsageError(f"{option}: cannot be written (a system file, or no write "
                             "permission)")
    except OSError as exc:
        raise UsageError(f"{option}: {exc.strerror or exc}") from None


def _write_file(option: str, path: Path, text: str) -> None:
    """Write one report file; a failure (a full disk, no permission) is a UsageError."""
    try:
        with open(path, "w", encoding="utf-8", newline="\n") as stream:
            stream.write(text)
    except OSError as exc:
        raise UsageError(f"{option}: cannot write the report: {exc.strerror or exc}") from None


def _uri_prefix(args, root: Path) -> tuple[str, str | None]:
    """The project root's path in its repository, and why it is a guess (or None).

    --uri-prefix when given, else asked of git. When git is missing or refuses the
    checkout (not a repository, "dubious ownership"), the project root is taken as the
    repository root and the reason is returned, for a warning: the paths in the review
    formats may then point at files that do not exist.
    """
    if args.uri_prefix is not None:
        return args.uri_prefix.strip("/"), None
    import subprocess

    try:
        top = subprocess.run(["git", "rev-parse", "--show-toplevel"], cwd=root,
                             capture_output=True, text=True, timeout=30)
    except FileNotFoundError:
        return "", "git is not installed"
    except (OSError, subprocess.SubprocessError) as exc:
        return "", f"git could not run ({exc.__class__.__name__})"
    if top.returncode != 0:
        said = " ".join(top.stderr.split())[:300] or f"exit status {top.returncode}"
        return "", f"git refused: {said}"
    try:
        relative = root.resolve().relative_to(Path(top.stdout.strip()).resolve())
    except ValueError:
        return "", "the project root is not inside the repository git names"
    return ("" if str(relative) == "." else relative.as_posix()), None


def _path_note(why: str) -> str:
    return (f"repository paths are a guess: {why}; design paths are given relative to the "
            "project root, which may not be the repository root. Give --uri-prefix PATH "
            "(the project root's path in the repository, '' for the root) to fix this, or "
            "--require-repository-paths to make it an error.")


def _render_all(render, result, args, options):
    """The --format report and each --report's; a writer that lacks its optional extra
    (matplotlib for html) is a UsageError naming what to install."""
    try:
        report = render(result, args.format, **options)
        extra = [(path, render(result, fmt, **options)) for fmt, path in args.report]
    except Exception as exc:
        if type(exc).__name__ != "PlotsUnavailable":
            raise
        option = "--format html" if args.format == "html" else "--report html"
        raise UsageError(f"{option}: {exc}") from None
    return report, extra


def _emit(result, args, root: Path) -> int:
    """Write the run's reports: --format to stdout or --output, each --report to its file."""
    from .report import render

    needs_prefix = args.format not in ("text", "json") or any(
        fmt not in ("text", "json") for fmt, _ in args.report)
    if args.uri_prefix is not None:
        from .report.common import repository_path

        try:
            repository_path("", args.uri_prefix.strip("/"))
        except ValueError as exc:
            raise UsageError(f"--uri-prefix {args.uri_prefix}: {exc}") from None
    prefix, why = _uri_prefix(args, root) if needs_prefix else ("", None)
    if why is not None:
        note = _path_note(why)
        if getattr(args, "require_repository_paths", False):
            print(f"vcheck: error: {note}", file=sys.stderr)
            return _INPUT_ERROR
        print(f"vcheck: warning: {note}", file=sys.stderr)
        result.notes.append(note)
    options = dict(uri_prefix=prefix, hide_passing=args.hide_passing, detail=args.detail,
                   show_not_checked=bool(args.show_not_checked))
    report, extra = _render_all(render, result, args, options)
    for (fmt, path), (_, text) in zip(args.report, extra):
        _write_file(f"--report {fmt}={path}", path, text)
    if args.output is not None:
        _write_file(f"--output {args.output}", args.output, report)
        if args.format != "text":
            _write_stdout(render(result, "text", hide_passing=args.hide_passing,
                                 detail=args.detail))
    else:
        _write_stdout(report)
    if result.problems and args.format != "text":
        for problem in result.problems:
            _say(_bounded_problem(problem))
    return int(result.exit_status)


def _merge(args) -> int:
    from .design.problems import InputError
    from .merging import merge_results
    from .report.json_read import read_report

    _check_outputs(args)
    try:
        results = [read_report(path) for path in args.reports]
        merged = merge_results(results, [str(path) for path in args.reports])
    except InputError as exc:
        _print_problems(exc)
        return _INPUT_ERROR
    return _emit(merged, args, Path.cwd())


def _schema(args) -> int:
    import json

    from .design.schema import design_schema

    text = json.dumps(design_schema(), indent=2, ensure_ascii=False, sort_keys=False) + "\n"
    if args.output is not None:
        option = f"--output {args.output}"
        _check_output(option, args.output)
        _write_file(option, args.output, text)
    else:
        _write_stdout(text)
    return 0


def _write_stdout(text: str) -> None:
    """The report on stdout, as UTF-8; a stdout that cannot take it (a full disk, a
    closed pipe) is a UsageError, not a traceback."""
    stream = sys.stdout
    try:
        try:
            stream.buffer.write(text.encode("utf-8"))
            stream.flush()
        except AttributeError:  # a replaced stdout without a buffer (tests, IDEs)
            stream.write(text)
    except OSError as exc:
        raise UsageError(f"standard output: cannot write the report: "
                         f"{exc.strerror or exc}") from None


def _rules(args) -> int:
    from .report.rules_listing import render_rules

    policy, registry = _load(args)
    if registry is None:
        return _INPUT_ERROR
    _write_stdout(render_rules(registry))
    return 0


def _dynamics(args) -> int:
    from .checking import load_designs
    from .report.dynamics_view import render_dynamics

    policy = _policy(args)
    if policy is None:
        return _INPUT_ERROR
    designs, problems = load_designs(policy, args.paths, Path.cwd())
    if args.format == "json":
        from .report.dynamics_json import render_dynamics_json

        _write_stdout(render_dynamics_json(designs, problems))
    elif args.format == "html":
        from .report.html import PlotsUnavailable, render_dynamics_html

        try:
            _write_stdout(render_dynamics_html(designs, problems))
        except PlotsUnavailable as exc:
            raise UsageError(f"--format html: {exc}") from None
    else:
        _write_stdout(render_dynamics(designs, []))
    for problem in problems:
        _say(_bounded_problem(problem))
    return _INPUT_ERROR if problems else 0


def _explain(args) -> int:
    import difflib

    from .report.rules_listing import render_rule_explanation

    policy, registry = _load(args)
    if registry is None:
        return _INPUT_ERROR
    entry = registry.get(args.rule_id)
    if entry is None:
        close = difflib.get_close_matches(args.rule_id, registry.ids(), n=1, cutoff=0.5)
        hint = f"; did you mean '{close[0]}'?" if close else "; see `vcheck rules`"
        raise UsageError(f"unknown rule '{args.rule_id}'{hint}")
    _write_stdout(render_rule_explanation(entry))
    return 0


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())

"""The ``vcheck`` command line: parse arguments, call the library, set the exit status.

No physics and no report layout here. Heavy imports (numpy, pydantic, pint) happen only
inside the commands that need them, so ``vcheck --version`` starts in milliseconds.

Exit statuses (:class:`vcheck.results.ExitStatus`): 0 nothing failed; 1 a rule failed
(or warned, with --fail-on-warn); 2 bad input, policy or usage; 3 a rule could not run.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from . import __version__
from .report import FORMATS

__all__ = ["main"]

_INPUT_ERROR = 2


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
        "--fail-on-warn); 2 bad input, policy or usage; 3 a rule could not run.",
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
    check.add_argument("--jobs", metavar="N", type=int, default=1,
                       help="check files in N processes (0: one per core); same output")
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

    explain = commands.add_parser("explain", help="print one rule's full text",
                                  description="Print what one rule judges, when it fails, "
                                  "its options with their defaults, and its sources.")
    explain.add_argument("rule_id", metavar="RULE", help="a rule id, as `vcheck rules` lists")
    explain.add_argument("--policy", metavar="FILE", type=Path, help="policy file")
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
    """Run the command line; returns the exit status."""
    args = _parser().parse_args(argv)
    if args.command is None:
        _parser().print_help(sys.stdout)
        return 0
    try:
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
    except KeyboardInterrupt:  # pragma: no cover - interactive only
        return 130


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
    from .engine import PluginError, discover

    policy = _policy(args)
    if policy is None:
        return None, None
    try:
        registry = discover(policy.local_rule_folders())
    except PluginError as exc:
        print(f"vcheck: plugin error: {exc}", file=sys.stderr)
        return None, None
    return policy, registry


def _print_problems(exc) -> None:
    for problem in exc.problems:
        print(problem.render(), file=sys.stderr)


def _check(args) -> int:
    import os

    from .checking import run_check
    from .design.problems import InputError

    policy, registry = _load(args)
    if policy is None:
        return _INPUT_ERROR
    if not _output_folders_exist(args):
        return _INPUT_ERROR
    if args.gate == "new" and args.base_report is None and args.base_revision is None:
        print("vcheck: error: --gate new needs --base-report or --base-revision",
              file=sys.stderr)
        return _INPUT_ERROR
    jobs = args.jobs if args.jobs > 0 else (os.cpu_count() or 1)
    options = dict(fail_on_warn=args.fail_on_warn, shard=args.shard, only=args.only)
    try:
        with _progress() as progress:
            result = run_check(policy, registry, args.paths, Path.cwd(), jobs=jobs,
                               progress=progress, **options)
    except InputError as exc:
        _print_problems(exc)
        return _INPUT_ERROR
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


def _output_folders_exist(args) -> bool:
    targets = [path for _, path in args.report]
    if getattr(args, "output", None) is not None:
        targets.append(args.output)
    for path in targets:
        if not path.parent.resolve().is_dir():
            print(f"vcheck: error: the folder of the output file {path} does not exist",
                  file=sys.stderr)
            return False
    return True


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


def _emit(result, args, root: Path) -> int:
    """Write the run's reports: --format to stdout or --output, each --report to its file."""
    from .report import render

    needs_prefix = args.format not in ("text", "json") or any(
        fmt not in ("text", "json") for fmt, _ in args.report)
    prefix, why = _uri_prefix(args, root) if needs_prefix else ("", None)
    if why is not None:
        note = _path_note(why)
        if getattr(args, "require_repository_paths", False):
            print(f"vcheck: error: {note}", file=sys.stderr)
            return _INPUT_ERROR
        print(f"vcheck: warning: {note}", file=sys.stderr)
        result.notes.append(note)
    options = dict(uri_prefix=prefix, hide_passing=args.hide_passing,
                   show_not_checked=bool(args.show_not_checked))
    try:
        report = render(result, args.format, **options)
        extra = [(path, render(result, fmt, **options)) for fmt, path in args.report]
    except ValueError as exc:
        print(f"vcheck: error: {exc}", file=sys.stderr)
        return _INPUT_ERROR
    for path, text in extra:
        path.write_text(text, encoding="utf-8", newline="\n")
    if args.output is not None:
        args.output.write_text(report, encoding="utf-8", newline="\n")
        if args.format != "text":
            _write_stdout(render(result, "text", hide_passing=args.hide_passing))
    else:
        _write_stdout(report)
    if result.problems and args.format != "text":
        for problem in result.problems:
            print(problem.render(), file=sys.stderr)
    return int(result.exit_status)


def _merge(args) -> int:
    from .design.problems import InputError
    from .merging import merge_results
    from .report.json_read import read_report

    if not _output_folders_exist(args):
        return _INPUT_ERROR
    try:
        results = [read_report(path) for path in args.reports]
    except InputError as exc:
        _print_problems(exc)
        return _INPUT_ERROR
    return _emit(merge_results(results), args, Path.cwd())


def _schema(args) -> int:
    import json

    from .design.schema import design_schema

    text = json.dumps(design_schema(), indent=2, ensure_ascii=False, sort_keys=False) + "\n"
    if args.output is not None:
        if not args.output.parent.resolve().is_dir():
            print(f"vcheck: error: the folder of the output file {args.output} does not exist",
                  file=sys.stderr)
            return _INPUT_ERROR
        args.output.write_text(text, encoding="utf-8", newline="\n")
    else:
        _write_stdout(text)
    return 0


def _write_stdout(text: str) -> None:
    stream = sys.stdout
    try:
        stream.buffer.write(text.encode("utf-8"))
        stream.flush()
    except AttributeError:  # a replaced stdout without a buffer (tests, IDEs)
        stream.write(text)


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
    _write_stdout(render_dynamics(designs, []))
    for problem in problems:
        print(problem.render(), file=sys.stderr)
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
        print(f"vcheck: error: unknown rule '{args.rule_id}'{hint}", file=sys.stderr)
        return _INPUT_ERROR
    _write_stdout(render_rule_explanation(entry))
    return 0


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())

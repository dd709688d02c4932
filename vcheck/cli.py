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

    rules = commands.add_parser("rules", help="list the rules with their limits and sources",
                                description="List every registered rule: id, title, origin, "
                                "options with their defaults, and sources.")
    rules.add_argument("--policy", metavar="FILE", type=Path, help="policy file (its "
                       "local-rules folders are listed too)")

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
        return _rules(args)
    except KeyboardInterrupt:  # pragma: no cover - interactive only
        return 130


def _policy(args):
    """The project policy for a command, searched from the first PATH (or the current
    folder); None after printing the problems."""
    from .config import load_policy
    from .design.problems import InputError

    paths = getattr(args, "paths", None) or []
    start = Path(paths[0]) if paths else Path.cwd()
    if paths and start.is_file():
        start = start.parent
    try:
        return load_policy(start if start.exists() else Path.cwd(), args.policy)
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
    from .checking import run_check
    from .design.problems import InputError
    from .report import render

    policy, registry = _load(args)
    if policy is None:
        return _INPUT_ERROR
    if args.output is not None and not args.output.parent.resolve().is_dir():
        print(f"vcheck: error: the folder of --output {args.output} does not exist",
              file=sys.stderr)
        return _INPUT_ERROR
    try:
        result = run_check(policy, registry, args.paths, Path.cwd(),
                           fail_on_warn=args.fail_on_warn)
    except InputError as exc:
        _print_problems(exc)
        return _INPUT_ERROR
    report = render(result, args.format)
    if args.output is not None:
        args.output.write_text(report, encoding="utf-8", newline="\n")
        if args.format != "text":
            _write_stdout(render(result, "text"))
    else:
        _write_stdout(report)
    if result.problems and args.format != "text":
        for problem in result.problems:
            print(problem.render(), file=sys.stderr)
    return int(result.exit_status)


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

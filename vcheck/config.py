"""Project policy: which files to check, which rules run, and with what limits.

The policy lives in ``vcheck.toml`` at the project root, or under ``[tool.vcheck]`` in
``pyproject.toml``. The nearest such file at or above the working directory is used;
its folder is the project root, and every path in the policy or in a design file is
relative to that root and must stay inside it.

    paths = ["plant"]                  # what `vcheck check` reads with no arguments
    exclude = ["plant/broken"]         # folders or files left out of folder scans
    local-rules = ["vcheck-rules"]     # folders of the project's own rule modules
    fail-on-warn = false               # warnings fail the run (exit 1) when true

    [rules.frequency-separation]       # [tool.vcheck.rules.*] in pyproject.toml
    required-margin = 0.25             # an option of the rule, see `vcheck rules`
    enabled = true
"""

from __future__ import annotations

import difflib
from dataclasses import dataclass, field
from pathlib import Path

from .design.loader import TomlDocument, read_toml
from .design.problems import InputError, InputProblem

__all__ = ["CONFIG_FILE", "Policy", "find_policy", "load_policy", "resolve_rule_options"]

CONFIG_FILE = "vcheck.toml"
_TOP_KEYS = ("exclude", "fail-on-warn", "local-rules", "paths", "rules")


@dataclass
class Policy:
    """The project's policy, read from its file (or the defaults when none exists)."""

    root: Path
    file: str = ""
    paths: tuple[str, ...] = ()
    exclude: tuple[str, ...] = ()
    local_rules: tuple[str, ...] = ()
    fail_on_warn: bool = False
    rules: dict[str, dict] = field(default_factory=dict)
    document: TomlDocument | None = None
    prefix: tuple = ()

    @property
    def name(self) -> str:
        return self.file or "defaults"

    def local_rule_folders(self) -> list[tuple[Path, str]]:
        """The policy's local rule folders as (absolute path, name as written)."""
        return [(self.root / name, name) for name in self.local_rules]

    def rule_table(self, rule_id: str) -> dict:
        return dict(self.rules.get(rule_id, {}))

    def problem(self, path: tuple, message: str, *, value: bool = True) -> InputProblem:
        if self.document is None:
            return InputProblem(self.name, 1, 1, "", message)
        return self.document.problem(self.prefix + path, message, value=value)


def find_policy(start: Path) -> tuple[Path, Path | None]:
    """The project root and its policy file, searching ``start`` and its parents.

    Returns ``(None, None)`` when there is no policy file.
    """
    start = start.resolve()
    for folder in (start, *start.parents):
        candidate = folder / CONFIG_FILE
        if candidate.is_file():
            return folder, candidate
        pyproject = folder / "pyproject.toml"
        if pyproject.is_file() and _has_tool_table(pyproject):
            return folder, pyproject
    return None, None


def _has_tool_table(pyproject: Path) -> bool:
    try:
        text = pyproject.read_text(encoding="utf-8", errors="replace")
    except OSError:
        return False
    return "[tool.vcheck" in text


def load_policy(start: Path, explicit: Path | None = None, cwd: Path | None = None) -> Policy:
    """Read the project policy; raises InputError with every problem located.

    Without a policy file the defaults apply and the project root is ``cwd`` (the
    current folder by default).
    """
    if explicit is not None:
        if not explicit.is_file():
            raise InputError([InputProblem(str(explicit), 1, 1, "", "policy file not found")])
        root, file = explicit.resolve().parent, explicit.resolve()
    else:
        root, file = find_policy(start)
    if file is None:
        return Policy(root=(cwd or Path.cwd()).resolve())
    name = file.name
    document = read_toml(file, name)
    data, prefix = document.data, ()
    if file.name == "pyproject.toml":
        data = document.data.get("tool", {}).get("vcheck", {})
        prefix = ("tool", "vcheck")
    policy = Policy(root=root, file=name, document=document, prefix=prefix)
    problems: list[InputProblem] = []
    for key in data:
        if key not in _TOP_KEYS:
            close = difflib.get_close_matches(key, _TOP_KEYS, n=1, cutoff=0.6)
            hint = f"; did you mean '{close[0]}'?" if close else "; known keys: " + ", ".join(_TOP_KEYS)
            problems.append(document.problem(prefix + (key,), f"unknown key '{key}'{hint}"))
    for key in ("paths", "exclude", "local-rules"):
        value = data.get(key, [])
        if not (isinstance(value, list) and all(isinstance(v, str) for v in value)):
            problems.append(policy.problem((key,), f"'{key}' must be a list of paths, e.g. [\"plant\"]"))
            continue
        for index, item in enumerate(value):
            if not _inside(root, root / item):
                problems.append(policy.problem((key, index), f"'{item}' is outside the project root"))
        setattr(policy, key.replace("-", "_"), tuple(value))
    fail_on_warn = data.get("fail-on-warn", False)
    if not isinstance(fail_on_warn, bool):
        problems.append(policy.problem(("fail-on-warn",), "'fail-on-warn' must be true or false"))
    else:
        policy.fail_on_warn = fail_on_warn
    rules = data.get("rules", {})
    if not isinstance(rules, dict) or not all(isinstance(v, dict) for v in rules.values()):
        problems.append(policy.problem(("rules",), "'rules' must hold one table per rule id"))
    else:
        policy.rules = rules
    if problems:
        raise InputError(problems)
    return policy


def _inside(root: Path, path: Path) -> bool:
    try:
        path.resolve().relative_to(root.resolve())
    except ValueError:
        return False
    return True


def resolve_rule_options(policy: Policy, registry) -> dict:
    """Validate every ``[rules.<id>]`` table against the registry.

    Returns ``{rule_id: (options or None when disabled, policy name)}`` and raises
    InputError for unknown rule ids and bad option values, located in the policy file.
    """
    from pydantic import ValidationError

    problems: list[InputProblem] = []
    for rule_id in policy.rules:
        if rule_id not in registry:
            close = difflib.get_close_matches(rule_id, registry.ids(), n=1, cutoff=0.6)
            hint = f"; did you mean '{close[0]}'?" if close else "; see `vcheck rules`"
            problems.append(policy.problem(("rules", rule_id), f"unknown rule '{rule_id}'{hint}",
                                           value=False))
    chosen: dict = {}
    for entry in registry:
        table = policy.rule_table(entry.rule.id)
        enabled = table.pop("enabled", True)
        if not isinstance(enabled, bool):
            problems.append(policy.problem(("rules", entry.rule.id, "enabled"),
                                           "'enabled' must be true or false"))
            continue
        try:
            options = entry.rule.Options.model_validate(table)
        except ValidationError as exc:
            for error in exc.errors(include_url=False):
                path = ("rules", entry.rule.id) + tuple(error["loc"])
                message = error["msg"]
                if error["type"] == "extra_forbidden":
                    known = sorted(f.alias or n for n, f in entry.rule.Options.model_fields.items())
                    close = difflib.get_close_matches(str(error["loc"][-1]), known, n=1, cutoff=0.6)
                    message = f"unknown option '{error['loc'][-1]}'" + (
                        f"; did you mean '{close[0]}'?" if close else
                        "; options of this rule: " + (", ".join(known) or "none"))
                else:
                    message = message[0].lower() + message[1:]
                    message = message.replace("input should be", "should be")
                    if "input" in error and not isinstance(error["input"], dict):
                        message += f", got {error['input']!r}"
                problems.append(policy.problem(
                    path, message, value=error["type"] != "extra_forbidden"))
            continue
        label = policy.name if table else "default"
        chosen[entry.rule.id] = (options if enabled else None, label)
    if problems:
        raise InputError(problems)
    return chosen


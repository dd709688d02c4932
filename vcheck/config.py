"""Project policy: which files to check, which rules run, and with what limits.

The policy lives in ``vcheck.toml`` at the project root, or under ``[tool.vcheck]`` in
``pyproject.toml``. The nearest such file at or above the working directory is used;
its folder is the project root, and every path in the policy or in a design file is
relative to that root and must stay inside it.

    paths = ["plant"]                  # what `vcheck check` reads with no arguments
    exclude = ["plant/broken"]         # folders or files left out of folder scans
    local-rules = ["vcheck-rules"]     # folders of the project's own rule modules
    fail-on-warn = false               # warnings fail the run (exit 1) when true
    show-not-checked = false           # list not-checked findings in SARIF, GitHub, GitLab
    require-support = false            # a design without [support] is an input error

    [rules.frequency-separation]       # [tool.vcheck.rules.*] in pyproject.toml
    required-margin = 0.25             # an option of the rule, see `vcheck rules`
    enabled = true

    [rules.joint-slip]
    not-applicable = "silent"          # no not-checked finding where a design has no joints
"""

from __future__ import annotations

import difflib
from dataclasses import dataclass, field
from datetime import date
from pathlib import Path

from .design.files import check_name
from .design.loader import TomlDocument, read_toml
from .design.problems import InputError, InputProblem
from .records import Record

__all__ = [
    "CONFIG_FILE",
    "FolderPolicy",
    "Policy",
    "RuleChoice",
    "Waiver",
    "find_policy",
    "load_policy",
    "resolve_rule_options",
]

CONFIG_FILE = "vcheck.toml"
_TOP_KEYS = ("exclude", "fail-on-warn", "folder", "local-rules", "paths", "require-support",
             "rules", "show-not-checked", "waiver")
_WAIVER_KEYS = ("approved-by", "expires", "file", "key-path", "reason", "rule", "target")
_FOLDER_KEYS = ("path", "rules")


class FolderPolicy(Record):
    """Rule options that tighten or relax the policy for one folder of designs."""

    path: str
    rules: dict
    index: int

    def covers(self, design_file: str) -> bool:
        prefix = self.path.strip("/")
        return prefix in ("", ".") or design_file == prefix or design_file.startswith(prefix + "/")


class Waiver(Record):
    """An accepted deviation: a finding of ``rule`` on ``target`` reported as waived."""

    rule: str
    target: str
    reason: str
    approved_by: str
    expires: date
    index: int
    key_path: str = ""
    file: str = ""

    def matches(self, finding) -> bool:
        return (finding.rule_id == self.rule and finding.target == self.target
                and (not self.key_path or finding.key_path == self.key_path)
                and (not self.file or finding.file == self.file))


@dataclass
class Policy:
    """The project's policy, read from its file (or the defaults when none exists)."""

    root: Path
    file: str = ""
    paths: tuple[str, ...] = ()
    exclude: tuple[str, ...] = ()
    local_rules: tuple[str, ...] = ()
    fail_on_warn: bool = False
    show_not_checked: bool = False
    require_support: bool = False
    rules: dict[str, dict] = field(default_factory=dict)
    folders: list[FolderPolicy] = field(default_factory=list)
    waivers: list[Waiver] = field(default_factory=list)
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
    """Whether a pyproject.toml names vcheck's table; one that cannot be read safely
    (a symlink out of its folder, a device, too large) counts, so that loading it
    reports why."""
    from .design.files import read_inside
    from .design.loader import MAX_FILE_BYTES

    try:
        raw, _ = read_inside(pyproject.absolute().parent, pyproject.absolute(),
                             what="policy file", limit=MAX_FILE_BYTES)
    except InputError:
        return True
    return b"[tool.vcheck" in raw or b"[[tool.vcheck" in raw


def load_policy(start: Path, explicit: Path | None = None, cwd: Path | None = None) -> Policy:
    """Read the project policy; raises InputError with every problem located.

    Without a policy file the defaults apply and the project root is ``cwd`` (the
    current folder by default).
    """
    if explicit is not None:
        if not (explicit.exists() or explicit.is_symlink()):
            raise InputError([InputProblem(str(explicit), 1, 1, "", "policy file not found")])
        # the root is the folder the policy is named in; a policy that is a symlink
        # elsewhere does not move the root, it is refused by the guarded opener
        root = explicit.absolute().parent.resolve()
        file = root / explicit.name
    else:
        root, file = find_policy(start)
    if file is None:
        return Policy(root=(cwd or Path.cwd()).resolve())
    name = file.name
    document = read_toml(file, name, root)
    data, prefix = document.data, ()
    if file.name == "pyproject.toml":
        prefix = ("tool", "vcheck")
        tool = document.data.get("tool", {})
        data = tool.get("vcheck", {}) if isinstance(tool, dict) else {}
        if not isinstance(data, dict):
            shape = "an array of tables [[tool.vcheck]]" if isinstance(data, list) else \
                f"a {type(data).__name__}"
            raise InputError([document.problem(prefix, f"'tool.vcheck' is {shape}; write one "
                                               "table, [tool.vcheck]", value=False)])
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
        bad = False
        for index, item in enumerate(value):
            refused = check_name(item)
            if refused is not None:
                problems.append(policy.problem((key, index), refused))
                bad = True
            elif not _inside(root, root / item):
                problems.append(policy.problem((key, index), f"'{item}' is outside the project root"))
                bad = True
            elif key == "local-rules":
                found = _local_rules_problem(root, item)
                if found is not None:
                    problems.append(policy.problem((key, index), found))
                    bad = True
        if not bad:
            setattr(policy, key.replace("-", "_"), tuple(value))
    fail_on_warn = data.get("fail-on-warn", False)
    if not isinstance(fail_on_warn, bool):
        problems.append(policy.problem(("fail-on-warn",), "'fail-on-warn' must be true or false"))
    else:
        policy.fail_on_warn = fail_on_warn
    show = data.get("show-not-checked", False)
    if not isinstance(show, bool):
        problems.append(policy.problem(("show-not-checked",),
                                       "'show-not-checked' must be true or false"))
    else:
        policy.show_not_checked = show
    require = data.get("require-support", False)
    if not isinstance(require, bool):
        problems.append(policy.problem(("require-support",),
                                       "'require-support' must be true or false"))
    else:
        policy.require_support = require
    rules = data.get("rules", {})
    if not isinstance(rules, dict) or not all(isinstance(v, dict) for v in rules.values()):
        problems.append(policy.problem(("rules",), "'rules' must hold one table per rule id"))
    else:
        policy.rules = rules
    problems += _read_folders(policy, data.get("folder", []))
    problems += _read_waivers(policy, data.get("waiver", []))
    if problems:
        raise InputError(problems)
    return policy


def _unknown_keys(policy: Policy, table: dict, known: tuple, where: tuple) -> list[InputProblem]:
    problems = []
    for key in table:
        if key not in known:
            close = difflib.get_close_matches(key, known, n=1, cutoff=0.6)
            hint = f"; did you mean '{close[0]}'?" if close else "; known keys: " + ", ".join(known)
            problems.append(policy.problem(where + (key,), f"unknown key '{key}'{hint}", value=False))
    return problems


def _read_folders(policy: Policy, folders) -> list[InputProblem]:
    if not isinstance(folders, list) or not all(isinstance(f, dict) for f in folders):
        return [policy.problem(("folder",), "write folder policies as [[folder]] tables")]
    problems: list[InputProblem] = []
    for index, table in enumerate(folders):
        where = ("folder", index)
        problems += _unknown_keys(policy, table, _FOLDER_KEYS, where)
        path = table.get("path")
        if not isinstance(path, str) or not path.strip():
            problems.append(policy.problem(where, "a [[folder]] needs 'path', e.g. \"roof\"",
                                           value=False))
            continue
        if not _inside(policy.root, policy.root / path):
            problems.append(policy.problem(where + ("path",), f"'{path}' is outside the project root"))
            continue
        rules = table.get("rules", {})
        if not isinstance(rules, dict) or not all(isinstance(v, dict) for v in rules.values()):
            problems.append(policy.problem(where + ("rules",), "'rules' must hold one table per "
                                           "rule id, e.g. [folder.rules.frequency-separation]"))
            continue
        policy.folders.append(FolderPolicy(path.strip().strip("/"), rules, index))
    return problems


def _read_waivers(policy: Policy, waivers) -> list[InputProblem]:
    if not isinstance(waivers, list) or not all(isinstance(w, dict) for w in waivers):
        return [policy.problem(("waiver",), "write waivers as [[waiver]] tables")]
    problems: list[InputProblem] = []
    for index, table in enumerate(waivers):
        where = ("waiver", index)
        problems += _unknown_keys(policy, table, _WAIVER_KEYS, where)
        missing = [key for key in ("rule", "target", "reason", "approved-by", "expires")
                   if key not in table]
        for key in missing:
            problems.append(policy.problem(where, f"a waiver needs '{key}'" + {
                "reason": " (why the deviation is accepted)",
                "approved-by": " (who accepted it)",
                "expires": " (a date such as 2027-03-31, without quotes)",
                "target": " (the machine tag)",
                "rule": " (a rule id)",
            }[key], value=False))
        texts = {}
        for key in ("rule", "target", "reason", "approved-by", "key-path", "file"):
            value = table.get(key, "")
            if not isinstance(value, str) or (key in table and not value.strip()):
                problems.append(policy.problem(where + (key,), f"'{key}' must be a non-empty string"))
            texts[key] = value.strip() if isinstance(value, str) else ""
        expires = table.get("expires")
        if "expires" in table and not (isinstance(expires, date) and type(expires) is date):
            shown = f"'{expires}'" if isinstance(expires, str) else repr(expires)
            problems.append(policy.problem(
                where + ("expires",), f"expires = {shown} is not a date; write a TOML date "
                "such as 2027-03-31 (no quotes, no time)"))
            continue
        if missing:
            continue
        policy.waivers.append(Waiver(
            rule=texts["rule"], target=texts["target"], reason=texts["reason"],
            approved_by=texts["approved-by"], expires=expires, index=index,
            key_path=texts["key-path"], file=texts["file"]))
    return problems


def _inside(root: Path, path: Path) -> bool:
    try:
        path.resolve().relative_to(root.resolve())
    except (ValueError, RuntimeError, OSError):  # outside, or a symlink loop
        return False
    return True


class _Silent(str):
    """A policy label whose rule leaves out its not-checked findings (not-applicable =
    "silent")."""


def _local_rules_problem(root: Path, item: str) -> str | None:
    """Why a ``local-rules`` folder cannot be loaded (missing, not a folder, or a module
    in it that is a symlink out of the project), or None."""
    folder = root / item
    if not folder.exists():
        return (f"local rules folder '{item}' does not exist (looked for "
                f"{folder.as_posix()})")
    if not folder.is_dir():
        return f"local rules folder '{item}' is not a folder"
    resolved_root = root.resolve()
    for module in sorted(folder.glob("*.py")):
        try:
            target = module.resolve()
            target.relative_to(resolved_root)
        except (ValueError, RuntimeError, OSError):
            return (f"'{item}/{module.name}' is a symlink to a file outside the project "
                    "root; it is not imported")
        if not target.is_file():
            return f"'{item}/{module.name}' is not a regular file; it is not imported"
    return None


class RuleChoice:
    """Which options each rule runs with for each design, and which policy set them."""

    def __init__(self, policy: Policy, base: dict, folders: list, only=None) -> None:
        self.policy = policy
        self._base = base  # rule id -> (options or None, label)
        self._folders = folders  # [(FolderPolicy, {rule id: (options or None, label)})]
        self.only = None if only is None else frozenset(only)

    def __call__(self, rule_id: str, design):
        if self.only is not None and rule_id not in self.only:
            return None
        chosen = self._base[rule_id]
        best = -1
        for folder, table in self._folders:
            if rule_id in table and folder.covers(design.file) and len(folder.path) > best:
                chosen, best = table[rule_id], len(folder.path)
        options, label = chosen
        return None if options is None else (options, label)

    def silent(self, rule_id: str, design) -> bool:
        """Whether the rule's not-checked findings on ``design`` are left out."""
        chosen = self(rule_id, design)
        return chosen is not None and isinstance(chosen[1], _Silent)

    def enabled_anywhere(self, rule_id: str) -> bool:
        if self.only is not None and rule_id not in self.only:
            return False
        return self._base[rule_id][0] is not None or any(
            table.get(rule_id, (None,))[0] is not None for _, table in self._folders)


def resolve_rule_options(policy: Policy, registry, only=None) -> RuleChoice:
    """Validate every ``[rules.<id>]`` table (and each folder's) against the registry.

    Returns a :class:`RuleChoice`; raises InputError for unknown rule ids and bad
    option values, located in the policy file. A folder's options apply on top of the
    project's, for the designs in that folder (the deepest folder wins). ``only``, when
    given, restricts the run to those rule ids.
    """
    problems: list[InputProblem] = []
    for rule_id in sorted(only or ()):
        if rule_id not in registry:
            close = difflib.get_close_matches(rule_id, registry.ids(), n=1, cutoff=0.6)
            hint = f"; did you mean '{close[0]}'?" if close else "; see `vcheck rules`"
            problems.append(InputProblem("--only", 1, 1, "", f"unknown rule '{rule_id}'{hint}"))
    problems += _unknown_rules(policy, policy.rules, ("rules",), registry)
    base: dict = {}
    for entry in registry:
        table = policy.rule_table(entry.rule.id)
        label = policy.name if table else "default"
        found = _validated(policy, entry, table, ("rules", entry.rule.id), label, problems)
        if found is not None:
            base[entry.rule.id] = found
    folders = []
    for folder in policy.folders:
        where = ("folder", folder.index, "rules")
        problems += _unknown_rules(policy, folder.rules, where, registry)
        chosen = {}
        for entry in registry:
            if entry.rule.id not in folder.rules:
                continue
            table = {**policy.rule_table(entry.rule.id), **folder.rules[entry.rule.id]}
            label = f"{policy.name} [[folder]] {folder.path}"
            found = _validated(policy, entry, table, where + (entry.rule.id,), label, problems)
            if found is not None:
                chosen[entry.rule.id] = found
        folders.append((folder, chosen))
    for waiver in policy.waivers:
        if waiver.rule not in registry:
            close = difflib.get_close_matches(waiver.rule, registry.ids(), n=1, cutoff=0.6)
            hint = f"; did you mean '{close[0]}'?" if close else "; see `vcheck rules`"
            problems.append(policy.problem(("waiver", waiver.index, "rule"),
                                           f"unknown rule '{waiver.rule}'{hint}"))
    if problems:
        raise InputError(problems)
    return RuleChoice(policy, base, folders, only)


def _unknown_rules(policy: Policy, rules: dict, where: tuple, registry) -> list[InputProblem]:
    problems = []
    for rule_id in rules:
        if rule_id not in registry:
            close = difflib.get_close_matches(rule_id, registry.ids(), n=1, cutoff=0.6)
            hint = f"; did you mean '{close[0]}'?" if close else "; see `vcheck rules`"
            problems.append(policy.problem(where + (rule_id,), f"unknown rule '{rule_id}'{hint}",
                                           value=False))
    return problems


def _validated(policy: Policy, entry, table: dict, where: tuple, label: str, problems: list):
    from pydantic import ValidationError

    table = dict(table)
    enabled = table.pop("enabled", True)
    if not isinstance(enabled, bool):
        problems.append(policy.problem(where + ("enabled",), "'enabled' must be true or false"))
        return None
    quiet = table.pop("not-applicable", "report")
    if quiet not in ("report", "silent"):
        problems.append(policy.problem(where + ("not-applicable",),
                                       "'not-applicable' must be \"report\" or \"silent\", "
                                       f"got {quiet!r}"))
        return None
    if quiet == "silent":
        label = _Silent(label)
    try:
        options = entry.rule.Options.model_validate(table)
    except ValidationError as exc:
        for error in exc.errors(include_url=False):
            loc = tuple(error["loc"])
            is_key = bool(loc) and loc[-1] == "[key]"  # a key of a table by kind
            if is_key:
                loc = loc[:-1]
            path = where + loc
            message = error["msg"]
            if error["type"] == "literal_error":
                import re

                choices = re.findall(r"'([^']*)'", error.get("ctx", {}).get("expected", ""))
                given = str(error.get("input"))
                close = difflib.get_close_matches(given, choices, n=1, cutoff=0.6)
                if is_key:
                    message = f"unknown key '{given}'" + (
                        f"; did you mean '{close[0]}'?" if close else "") + \
                        f" (known: {', '.join(choices)})"
                else:  # worded as the design loader words it
                    message = f"'{given}' is not one of: {', '.join(choices)}" + (
                        f"; did you mean '{close[0]}'?" if close else "")
                problems.append(policy.problem(path, message, value=not is_key))
                continue
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
            problems.append(policy.problem(path, message, value=error["type"] != "extra_forbidden"))
        return None
    return (options if enabled else None, label)

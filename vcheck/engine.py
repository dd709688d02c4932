"""The rule contract, rule discovery and the run of rules over designs.

A rule is a class deriving from :class:`Rule` that declares its id, title, the part of
a design it applies to, its sources and an options model, and whose :meth:`Rule.check`
turns one validated design into findings. Rules reach vcheck through the entry-point
group ``vcheck.rules``: each entry point names a ``register(registry)`` function. The
built-in rules are registered exactly like a company's plugin.
"""

from __future__ import annotations

import re
import traceback
from collections.abc import Iterable, Iterator
from dataclasses import dataclass
from pathlib import Path
from typing import Any, ClassVar

from pydantic import BaseModel, ConfigDict

from .design.problems import InputError, format_key_path
from .findings import Finding, Measure, Source, Status, _finding_with

__all__ = [
    "CATALOG_KINDS",
    "Catalog",
    "ENTRY_POINT_GROUP",
    "PluginError",
    "Registry",
    "RegisteredRule",
    "Rule",
    "RuleOptions",
    "RULE_API_VERSION",
    "discover",
    "rule_options",
    "run_rules",
]

DISTRIBUTION = "vcheck-vibration"
"""The name vcheck is installed under from the package index (the import package and the
command are ``vcheck``; the index's own ``vcheck`` is an unrelated project)."""

ENTRY_POINT_GROUP = "vcheck.rules"
RULE_API_VERSION = 1
"""Version of the rule contract; raised when a change would break existing plugins."""

_new = object.__new__

_SLUG = re.compile(r"^[a-z][a-z0-9]*(?:-[a-z0-9]+)*$")

RESERVED_IDS = frozenset({"input-error", "policy-waiver"})
"""Ids vcheck itself reports under (input problems, waivers); no rule may take them."""


class RuleOptions(BaseModel):
    """Base of every rule's options: the rule's policy, overridable per project.

    Field defaults are the default limits; each field's description names its source.
    Keys are kebab-case in the project policy file.
    """

    model_config = ConfigDict(
        alias_generator=lambda name: name.replace("_", "-"),
        populate_by_name=True,
        extra="forbid",
        frozen=True,
        allow_inf_nan=False,
        defer_build=True,
    )


class Rule:
    """Base class of a rule. Subclasses declare the class attributes below.

    The subclass docstring is the rule's explanation: its first line a summary, the
    rest when the rule fails, warns and passes, and the limits of its validity.
    """

    id: ClassVar[str]
    title: ClassVar[str]
    applies_to: ClassVar[str]
    sources: ClassVar[tuple[Source, ...]]
    Options: ClassVar[type[RuleOptions]] = RuleOptions
    catalog: Catalog | None = None
    """Plugin-contributed data, set by the engine before :meth:`check` runs."""

    def check(self, design: Any, options: RuleOptions) -> Iterable[Finding]:
        raise NotImplementedError

    # -- helpers for subclasses ---------------------------------------------------
    def finding(
        self,
        design: Any,
        path: tuple,
        status: Status,
        message: str,
        *,
        measured: Measure | None = None,
        limit: Measure | None = None,
        margin: float | None = None,
        assumptions: Iterable[str] = (),
        advice: Iterable[str] = (),
        sources: Iterable[Source] | None = None,
        table: Iterable[Iterable[str]] = (),
        table_title: str = "",
        quantities: Iterable = (),
    ) -> Finding:
        """A finding of this rule on ``design``, located at the key ``path``."""
        file, line, column = design.locate(path)
        # Finding(...) with these fields, set straight into the instance dictionary in
        # field order and then its __post_init__ (the fingerprint), as the generated
        # __init__ does, less its twenty frozen-attribute calls: thousands a large run.
        # tests/test_findings_fast.py holds the two equal.
        item = _new(Finding)
        item.__dict__.update(
            rule_id=self.id,
            status=status,
            message=message,
            file=file,
            line=line,
            column=column,
            target=design.machine.tag,
            key_path=format_key_path(path),
            measured=measured,
            limit=limit,
            margin=margin,
            assumptions=tuple(assumptions),
            advice=tuple(advice),
            sources=tuple(self.sources if sources is None else sources),
            table=tuple(tuple(row) for row in table),
            table_title=table_title,
            policy="default",
            waiver=None,
            quantities=tuple(quantities),
            fingerprint="",
        )
        item.__post_init__()
        return item

    @classmethod
    def summary(cls) -> str:
        doc = (cls.__doc__ or "").strip()
        return doc.splitlines()[0].strip() if doc else ""

    @classmethod
    def explanation(cls) -> str:
        import inspect

        return inspect.cleandoc(cls.__doc__ or "")


class PluginError(Exception):
    """A plugin or rule that cannot be loaded or registered; names its origin."""


@dataclass(frozen=True)
class RegisteredRule:
    rule: type[Rule]
    origin: str


CATALOG_KINDS = (
    "sn-curve", "thread", "bolt-material", "excitation-source", "policy-table",
)
"""Kinds of data a plugin may contribute besides rules."""


class Catalog:
    """Data contributed by plugins, by kind and name, with where each item came from.

    Rules read it as ``self.catalog``: for example an S-N curve a company has from its
    own tests, registered as ``registry.add_data("sn-curve", "ACME:weld-7", curve)``.
    Built-in tables stay in :mod:`vcheck.dynamics`; rules look there first and then here.
    """

    def __init__(self) -> None:
        self._items: dict[str, dict[str, tuple[object, str]]] = {k: {} for k in CATALOG_KINDS}

    def get(self, kind: str, name: str):
        """The item, or None when no plugin contributed it."""
        found = self._items[kind].get(name)
        return None if found is None else found[0]

    def names(self, kind: str) -> list[str]:
        return sorted(self._items[kind])

    def origin(self, kind: str, name: str) -> str | None:
        found = self._items[kind].get(name)
        return None if found is None else found[1]

    def _add(self, kind: str, name: str, value: object, origin: str) -> None:
        if kind not in self._items:
            raise PluginError(
                f"{origin}: unknown kind of data {kind!r}; known: {', '.join(CATALOG_KINDS)}")
        if not isinstance(name, str) or not name.strip():
            raise PluginError(f"{origin}: a {kind} needs a non-empty name")
        if name in self._items[kind]:
            raise PluginError(
                f"{kind} '{name}' is registered twice: by {self._items[kind][name][1]} "
                f"and by {origin}")
        self._items[kind][name] = (value, origin)


class Registry:
    """Every rule known to this run, by id, with where it came from, and the catalog
    of data that plugins contribute."""

    def __init__(self) -> None:
        self._rules: dict[str, RegisteredRule] = {}
        self.origin = "built-in"
        self.catalog = Catalog()

    def add_data(self, kind: str, name: str, value: object) -> None:
        """Contribute a named item of data (an S-N curve, a thread, a policy table...)."""
        self.catalog._add(kind, name, value, self.origin)

    def add_rule(self, rule: type[Rule]) -> None:
        """Register a rule class; refuses a malformed rule or a duplicate id."""
        where = f"{self.origin}: {getattr(rule, '__module__', '?')}.{getattr(rule, '__name__', rule)}"
        if not (isinstance(rule, type) and issubclass(rule, Rule)):
            raise PluginError(f"{where}: not a subclass of vcheck.engine.Rule")
        for attribute in ("id", "title", "applies_to", "sources"):
            if not getattr(rule, attribute, None):
                raise PluginError(f"{where}: the rule does not declare '{attribute}'")
        if not _SLUG.match(rule.id):
            raise PluginError(
                f"{where}: rule id {rule.id!r} is not a slug (lower-case words joined by '-')"
            )
        if not all(isinstance(source, Source) for source in rule.sources):
            raise PluginError(f"{where}: 'sources' must be vcheck.findings.Source records")
        if not (isinstance(rule.Options, type) and issubclass(rule.Options, RuleOptions)):
            raise PluginError(f"{where}: 'Options' must derive from vcheck.engine.RuleOptions")
        if not rule.summary():
            raise PluginError(f"{where}: the rule has no docstring to explain it")
        if rule.id in RESERVED_IDS:
            raise PluginError(f"{where}: rule id '{rule.id}' is reserved by vcheck")
        if rule.id in self._rules:
            other = self._rules[rule.id]
            raise PluginError(
                f"rule id '{rule.id}' is registered twice: by {other.origin} "
                f"({other.rule.__module__}) and by {self.origin} ({rule.__module__})"
            )
        self._rules[rule.id] = RegisteredRule(rule, self.origin)

    def __iter__(self) -> Iterator[RegisteredRule]:
        return iter(sorted(self._rules.values(), key=lambda entry: entry.rule.id))

    def __contains__(self, rule_id: str) -> bool:
        return rule_id in self._rules

    def __len__(self) -> int:
        return len(self._rules)

    def get(self, rule_id: str) -> RegisteredRule | None:
        return self._rules.get(rule_id)

    def ids(self) -> list[str]:
        return sorted(self._rules)


def discover(local_folders: Iterable[tuple[Path, str]] = ()) -> Registry:
    """Every rule: the ``vcheck.rules`` entry points, then the local rule folders.

    Entry points are loaded built-in first, then other packages by name. A local folder
    is ``(path, name)``: each ``*.py`` file directly inside it is a module whose
    ``register(registry)`` is called. Nothing else is ever imported; design files never
    cause code to run. A plugin that fails to load raises :class:`PluginError` naming it.
    """
    from importlib.metadata import entry_points

    registry = Registry()
    found = list(entry_points(group=ENTRY_POINT_GROUP))
    own = [ep for ep in found if ep.dist is not None
           and ep.dist.name.replace("_", "-").lower() == DISTRIBUTION]
    if not own:
        raise PluginError(
            "the built-in rules are not registered: vcheck must be installed "
            f"(pip install {DISTRIBUTION}, or pip install -e . in a checkout)"
        )
    others = sorted((ep for ep in found if ep not in own),
                    key=lambda ep: (ep.dist.name if ep.dist else "", ep.name))
    for entry_point in own + others:
        dist = entry_point.dist
        if entry_point in own:
            origin = "built-in"
        else:
            label = f"{dist.name} {dist.version}" if dist is not None else entry_point.value
            origin = f"package {label}"
        try:
            register = entry_point.load()
        except Exception as exc:  # a broken plugin must be named, not crash the run
            raise PluginError(
                f"{origin}: entry point '{entry_point.name} = {entry_point.value}' "
                f"failed to import: {_describe(exc)}"
            ) from None
        _call_register(registry, register, origin, entry_point.value)
    for folder, name in local_folders:
        _load_local_folder(registry, Path(folder), name)
    registry.origin = "built-in"
    return registry


def _describe(exc: BaseException) -> str:
    if isinstance(exc, SyntaxError):
        where = f"{Path(exc.filename or '?').name}:{exc.lineno}:{exc.offset or 1}"
        return f"SyntaxError at {where}: {exc.msg}"
    return f"{type(exc).__name__}: {exc}"


def _call_register(registry: Registry, register, origin: str, where: str) -> None:
    if not callable(register):
        raise PluginError(f"{origin}: '{where}' has no callable register(registry)")
    registry.origin = origin
    try:
        register(registry)
    except PluginError:
        raise
    except Exception as exc:
        raise PluginError(f"{origin}: register() in '{where}' failed: {_describe(exc)}") from None


def _load_local_folder(registry: Registry, folder: Path, name: str) -> None:
    import importlib.util
    import sys

    if not folder.is_dir():
        raise PluginError(f"local rules folder '{name}' does not exist")
    modules = sorted(folder.glob("*.py"))
    if not modules:
        raise PluginError(f"local rules folder '{name}' holds no *.py module")
    package = "vcheck_local_rules_" + "".join(c if c.isalnum() else "_" for c in name)
    for path in modules:
        if path.name.startswith("_"):
            continue
        display = f"{name.rstrip('/')}/{path.name}"
        origin = f"local folder {name.rstrip('/')} ({path.name})"
        module_name = f"{package}.{path.stem}"
        spec = importlib.util.spec_from_file_location(module_name, path)
        module = importlib.util.module_from_spec(spec)
        sys.modules[module_name] = module
        try:
            spec.loader.exec_module(module)
        except Exception as exc:
            del sys.modules[module_name]
            raise PluginError(f"local folder {name.rstrip('/')}: {display} failed to import: "
                              f"{_describe(exc)}") from None
        _call_register(registry, getattr(module, "register", None), origin, display)


def rule_options(entry: RegisteredRule, overrides: dict) -> RuleOptions:
    """Options of a rule with project overrides applied; raises ValidationError."""
    return entry.rule.Options.model_validate(overrides)


def run_rules(
    designs: Iterable[Any],
    registry: Registry,
    options_for,
) -> list[Finding]:
    """Run every enabled rule on every design; a rule that raises becomes an error.

    A rule that raises :class:`~vcheck.design.problems.InputError` (the design names
    something the rule cannot read, such as an S-N curve no one registered) stops the
    run as bad input: the error passes up, located, and the command exits 2.

    ``options_for(rule_id, design)`` returns ``(options, policy_name)`` for an enabled
    rule, or ``None`` to skip the rule for that design.
    """
    findings: list[Finding] = []
    entries = list(registry)  # sorted by id: once, not once a design
    for design in designs:
        for entry in entries:
            chosen = options_for(entry.rule.id, design)
            if chosen is None:
                continue
            options, policy_name = chosen
            rule = entry.rule()
            rule.catalog = registry.catalog
            try:
                produced = list(rule.check(design, options))
                for item in produced:
                    if not isinstance(item, Finding):
                        raise TypeError(
                            f"check() returned {type(item).__name__!s}, not a Finding"
                        )
            except InputError:
                raise  # the design could not be read as the rule needs: exit 2, located
            except Exception as exc:
                last = traceback.extract_tb(exc.__traceback__)[-1] if exc.__traceback__ else None
                where = f" at {last.filename.rsplit('/', 1)[-1]}:{last.lineno}" if last else ""
                produced = [rule.finding(
                    design, (), Status.ERROR,
                    f"the rule could not run: {type(exc).__name__}: {exc}{where} "
                    f"(rule from {entry.origin})",
                )]
            if policy_name == "default":
                findings.extend(produced)
                continue
            for item in produced:
                if item.policy == "default":
                    item = _with_policy(item, policy_name)
                findings.append(item)
    findings.sort(key=lambda f: f.sort_key)
    return findings


def _with_policy(item: Finding, policy: str) -> Finding:
    return _finding_with(item, policy=policy)


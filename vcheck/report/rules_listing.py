"""The listing of registered rules: id, title, origin, options and sources."""

from __future__ import annotations

import textwrap

from .common import clean_lines

__all__ = ["render_rule_explanation", "render_rules"]

_WIDTH = 96


def _default(value) -> str:
    if isinstance(value, tuple):
        return "[" + ", ".join(_default(v) for v in value) + "]"
    if value is None:
        return "(not set)"
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, str):
        return f'"{value}"'
    return f"{value:g}" if isinstance(value, float) else str(value)


def render_rules(registry) -> str:
    out: list[str] = []
    for entry in registry:
        rule = entry.rule
        out.append(f"{rule.id}  {rule.title}")
        out.append(f"    origin: {entry.origin}; applies to: {rule.applies_to}")
        out += textwrap.wrap(rule.summary(), _WIDTH, initial_indent="    ",
                             subsequent_indent="    ")
        fields = rule.Options.model_fields
        if fields:
            out.append("    options (policy key = default):")
            for name, field in fields.items():
                key = field.alias or name
                out += textwrap.wrap(
                    f"{key} = {_default(field.default)}: {field.description or ''}", _WIDTH,
                    initial_indent="      ", subsequent_indent="        ")
        out.append("    sources:")
        for source in rule.sources:
            out += textwrap.wrap(source.render(), _WIDTH, initial_indent="      - ",
                                 subsequent_indent="        ")
        out.append("")
    out.append(f"{len(registry)} rule(s)")
    return clean_lines("\n".join(out)) + "\n"  # plugin text: no control characters


def render_rule_explanation(entry) -> str:
    """The full text of one rule: what it judges, its options and its sources."""
    rule = entry.rule
    out = [f"{rule.id}: {rule.title}", "",
           f"origin: {entry.origin}", f"applies to: {rule.applies_to}", ""]
    for paragraph in rule.explanation().split("\n\n"):
        out += textwrap.wrap(" ".join(paragraph.split()), _WIDTH) + [""]
    fields = rule.Options.model_fields
    if fields:
        out.append(f"options ([rules.{rule.id}] in the project policy):")
        for name, field in fields.items():
            out += textwrap.wrap(
                f"{field.alias or name} = {_default(field.default)}: {field.description or ''}",
                _WIDTH, initial_indent="  ", subsequent_indent="    ")
        out.append("")
    out.append("sources:")
    for source in rule.sources:
        out += textwrap.wrap(source.render(), _WIDTH, initial_indent="  - ",
                             subsequent_indent="    ")
    return clean_lines("\n".join(out)) + "\n"  # plugin text: no control characters

"""The listing of registered rules: id, title, origin, options and sources."""

from __future__ import annotations

import textwrap

__all__ = ["render_rules"]

_WIDTH = 96


def _default(value) -> str:
    if isinstance(value, tuple):
        return "[" + ", ".join(_default(v) for v in value) + "]"
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
    return "\n".join(out) + "\n"

"""The design file format as JSON Schema, generated from the pydantic models.

Editors with a TOML language server read a ``#:schema path`` comment on the first line
of a TOML file and then complete keys and check values against the schema; the comment
never reaches the data. ``vcheck schema --output .vcheck/design.schema.json`` writes it.
"""

from __future__ import annotations

__all__ = ["SCHEMA_ID", "design_schema"]

SCHEMA_ID = "https://vcheck.invalid/schemas/design-1.json"


def design_schema() -> dict:
    """JSON Schema (draft 2020-12) accepting a design file or a structure file."""
    from pydantic.json_schema import models_json_schema

    from .models import Design, StructureFile

    keys, schema = models_json_schema(
        [(Design, "validation"), (StructureFile, "validation")], by_alias=True,
        ref_template="#/$defs/{model}")
    roots = [keys[(Design, "validation")], keys[(StructureFile, "validation")]]
    return {
        "$schema": "https://json-schema.org/draft/2020-12/schema",
        "$id": SCHEMA_ID,
        "title": "vcheck design or structure file, format 1",
        "description": "One installation (a machine, its mounting, support, modes, joints "
        "and fatigue details), or a structure shared by several machines. Dimensional "
        "values are strings with units, e.g. \"420 kg\", \"1480 rpm\", \"180 kN/m +-10%\".",
        "anyOf": roots,
        "$defs": _reachable(schema["$defs"], roots),
    }


def _reachable(definitions: dict, roots: list) -> dict:
    """Only the definitions the schema refers to (pydantic also lists the types behind
    fields whose schema is given by hand, such as the SI amounts)."""
    import json

    seen: set[str] = set()
    todo = [json.dumps(roots)]
    while todo:
        text = todo.pop()
        for name in definitions:
            if name not in seen and f'"#/$defs/{name}"' in text:
                seen.add(name)
                todo.append(json.dumps(definitions[name]))
    return {name: definitions[name] for name in definitions if name in seen}

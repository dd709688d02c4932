"""Writers: one module per output format. Each reads a RunResult and returns text.

:data:`WRITERS` maps a format name to the module and function that write it; a writer
module is imported only when its format is asked for.
"""

from __future__ import annotations

from importlib import import_module

__all__ = ["FORMATS", "WRITERS", "render"]

WRITERS: dict[str, tuple[str, str]] = {
    "text": ("vcheck.report.text", "render_text"),
    "json": ("vcheck.report.json_report", "render_json"),
}

FORMATS = tuple(WRITERS)


def render(result, fmt: str) -> str:
    """The report of ``result`` in format ``fmt`` (one of :data:`FORMATS`)."""
    try:
        module, function = WRITERS[fmt]
    except KeyError:
        raise ValueError(f"unknown report format {fmt!r}; known: {', '.join(FORMATS)}") from None
    return getattr(import_module(module), function)(result)

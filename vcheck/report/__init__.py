"""Writers: one module per output format. Each reads a RunResult and returns text."""

from __future__ import annotations

__all__ = ["FORMATS", "render"]

FORMATS = ("text", "json")


def render(result, fmt: str) -> str:
    """The report of ``result`` in format ``fmt`` (one of :data:`FORMATS`)."""
    if fmt == "text":
        from .text import render_text

        return render_text(result)
    if fmt == "json":
        from .json_report import render_json

        return render_json(result)
    raise ValueError(f"unknown report format {fmt!r}; known: {', '.join(FORMATS)}")

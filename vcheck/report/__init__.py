"""Writers: one module per output format. Each reads a RunResult and returns text.

:data:`WRITERS` maps a format name to the module and function that write it; a writer
module is imported only when its format is asked for.

Options: :func:`render` takes keyword options (``render(result, "sarif",
uri_prefix="plant")``). :data:`OPTIONS` names every option a writer may take and
:data:`WRITER_OPTIONS` which formats take it; an option a format has no use for is not
passed to it (the text report prints no repository paths, so it ignores ``uri_prefix``),
and an option no format knows is refused. So one set of options serves every format of
a run.

``uri_prefix``
    The project root's path relative to the repository root, ``/``-separated
    (``"plant/north"``; default ``""``: the project root is the repository root). The
    formats a CI service reads on the repository (SARIF, GitHub annotations, GitLab code
    quality, JUnit ``file`` attributes, the Markdown summary) put it before every design
    file's path, which vcheck otherwise gives relative to the project root.

The helpers shared by the machine-readable writers live in :mod:`vcheck.report.common`
(and are reachable from here too); this module stays light, because the command line
imports it for its list of formats even for ``vcheck --version``.
"""

from __future__ import annotations

from importlib import import_module

__all__ = [
    "FORMATS",
    "INPUT_RULE_ID",
    "OPTIONS",
    "WRITERS",
    "WRITER_OPTIONS",
    "escape_markdown",
    "finding_details",
    "measure_text",
    "unique_fingerprints",
    "number_or_none",
    "problem_fingerprint",
    "render",
    "repository_path",
    "repository_uri",
    "waiver_reason",
]

WRITERS: dict[str, tuple[str, str]] = {
    "text": ("vcheck.report.text", "render_text"),
    "json": ("vcheck.report.json_report", "render_json"),
    "sarif": ("vcheck.report.sarif", "render_sarif"),
    "junit": ("vcheck.report.junit", "render_junit"),
    "markdown": ("vcheck.report.markdown", "render_markdown"),
    "github": ("vcheck.report.github", "render_github"),
    "gitlab": ("vcheck.report.gitlab", "render_gitlab"),
    "html": ("vcheck.report.html", "render_html"),
}

FORMATS = tuple(WRITERS)

OPTIONS: dict[str, str] = {
    "uri_prefix": "path of the project root relative to the repository root, put before "
                  "every design file's path (default: none)",
    "hide_passing": "leave passing findings out of the text report (they are still "
                    "counted in its summary)",
    "detail": "text report: 'brief' gives a passing finding one line and a table its first "
              "rows, 'full' prints every message and row (default: brief)",
    "show_not_checked": "list not-checked findings (a rule with nothing to judge in a "
                        "design) as results and annotations too; by default they are only "
                        "counted there",
}
"""Every option :func:`render` accepts, with what it does."""

WRITER_OPTIONS: dict[str, frozenset[str]] = {
    "text": frozenset({"hide_passing", "detail"}),
    "json": frozenset(),
    "sarif": frozenset({"uri_prefix", "show_not_checked"}),
    "junit": frozenset({"uri_prefix"}),
    "markdown": frozenset({"uri_prefix"}),
    "github": frozenset({"uri_prefix", "show_not_checked"}),
    "gitlab": frozenset({"uri_prefix", "show_not_checked"}),
    "html": frozenset(),
}
"""The options of :data:`OPTIONS` that each format takes."""


def render(result, fmt: str, **options) -> str:
    """The report of ``result`` in format ``fmt`` (one of :data:`FORMATS`).

    ``options`` are those of :data:`OPTIONS`; each format receives the ones it takes
    (:data:`WRITER_OPTIONS`). Raises ValueError on an unknown format or option.
    """
    try:
        module, function = WRITERS[fmt]
    except KeyError:
        raise ValueError(f"unknown report format {fmt!r}; known: {', '.join(FORMATS)}") from None
    unknown = sorted(set(options) - set(OPTIONS))
    if unknown:
        raise ValueError(f"unknown report option {unknown[0]!r}; known: {', '.join(OPTIONS)}")
    taken = WRITER_OPTIONS.get(fmt, frozenset())
    passed = {name: value for name, value in options.items() if name in taken}
    return getattr(import_module(module), function)(result, **passed)


_COMMON = frozenset({
    "INPUT_RULE_ID", "escape_markdown", "finding_details", "measure_text",
    "unique_fingerprints", "number_or_none", "problem_fingerprint", "repository_path",
    "repository_uri", "waiver_reason",
})


def __getattr__(name: str):
    if name in _COMMON:
        from . import common

        return getattr(common, name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")

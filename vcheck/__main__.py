"""``python -m vcheck`` and the ``vcheck`` command.

``vcheck --version`` is answered here from the standard library alone, before the command
line (:mod:`vcheck.cli`, argparse and the writers' list) is imported: it is the start-up
floor a CI job pays on every change.
"""

import sys


def run() -> int:
    """The ``vcheck`` command: the exit status of :func:`vcheck.cli.main`."""
    if sys.argv[1:] == ["--version"]:
        from . import __version__

        try:  # a closed or full stdout is ignored, as argparse does
            sys.stdout.write(f"vcheck {__version__}\n")
            sys.stdout.flush()
        except (AttributeError, OSError, ValueError):
            pass
        return 0
    from .cli import main

    return main()


if __name__ == "__main__":
    sys.exit(run())

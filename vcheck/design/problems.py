"""Problems found in input files, each located at file, line and column."""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["InputProblem", "InputError", "format_key_path"]


@dataclass(frozen=True, order=True)
class InputProblem:
    """One thing wrong with an input file, where it is, and what to write instead."""

    file: str
    line: int
    column: int
    key: str
    message: str

    def render(self) -> str:
        where = f"{self.file}:{self.line}:{self.column}"
        return f"{where}: {self.key}: {self.message}" if self.key else f"{where}: {self.message}"


class InputError(Exception):
    """Raised with every problem of one or more input files at once."""

    def __init__(self, problems: list[InputProblem]) -> None:
        self.problems = sorted(problems)
        super().__init__("\n".join(p.render() for p in self.problems))

    def __reduce__(self):  # so it crosses from a worker process with its problems
        return (type(self), (self.problems,))


def format_key_path(path: tuple) -> str:
    """Write a key path as a reader finds it in the file: ``joint[2].fastener``.

    Array indices are shown 1-based, as an engineer counts tables in a file.
    """
    out = ""
    for part in path:
        if isinstance(part, int):
            out += f"[{part + 1}]"
        else:
            out += ("." if out else "") + str(part)
    return out

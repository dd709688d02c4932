"""One guarded way to read every file the loader reads.

Design files, shared structures, mode files, time histories (CSV and ``.npy``), PSD
files and policy files are all read through :func:`read_inside`. It refuses, before a
byte is read:

- a path with a NUL byte, a name longer than the file system allows, or a name that is
  not valid UTF-8;
- a path whose target, with every symlink resolved, is outside the project root (a
  symlink inside the project that points out is refused and its target never read);
- a symlink loop;
- anything that is not a regular file: devices (``/dev/zero`` reports size 0), FIFOs
  (opened non-blocking, so a FIFO never waits for a writer) and sockets;
- a file larger than the limit for its kind.

Each refusal is an :class:`~vcheck.design.problems.InputError` located at the key that
names the file (``where``) or at the file itself; "not found" says where it looked.
"""

from __future__ import annotations

import errno
import os
import stat
from dataclasses import replace
from pathlib import Path

from .problems import InputError, InputProblem

__all__ = [
    "MAX_NAME_CHARS",
    "MAX_PATH_CHARS",
    "check_name",
    "inside_root",
    "open_inside",
    "read_inside",
    "read_npy_inside",
    "relative_name",
    "resolve_checked",
    "without_symlinks",
]

MAX_NAME_CHARS = 255
"""Longest single file or folder name, in characters (the common NAME_MAX of POSIX file
systems, common practice)."""

MAX_PATH_CHARS = 1024
"""Longest relative path a design may name, in characters."""


def _refuse(where: InputProblem | None, fallback_name: str, message: str) -> InputError:
    if where is None:
        return InputError([InputProblem(fallback_name, 1, 1, "", message)])
    return InputError([replace(where, message=message)])


def _shown(text: str, limit: int = 60) -> str:
    """A path as shown in a message: undecodable bytes escaped, long names cut."""
    shown = text.encode("utf-8", "backslashreplace").decode("ascii", "backslashreplace")
    shown = shown.replace("\x00", "\\0")
    return shown if len(shown) <= limit else shown[: limit - 3] + "..."


def check_name(relative: str) -> str | None:
    """Why ``relative`` cannot name a file, or None if it can."""
    if "\x00" in relative:
        return f"the path '{_shown(relative)}' holds a NUL byte; write a plain relative path"
    try:
        relative.encode("utf-8")
    except UnicodeEncodeError:
        return f"the file name '{_shown(relative)}' is not valid UTF-8; rename the file"
    if len(relative) > MAX_PATH_CHARS:
        return (f"the path is {len(relative)} characters long; paths are limited to "
                f"{MAX_PATH_CHARS} characters")
    longest = max((len(part) for part in relative.replace("\\", "/").split("/")), default=0)
    if longest > MAX_NAME_CHARS:
        return (f"a name in the path is {longest} characters long; file names are limited "
                f"to {MAX_NAME_CHARS} characters")
    if not relative.strip():
        return "the path is empty; write a path relative to the project root"
    return None


_POSIX = os.name == "posix"


def inside_root(root: Path, path: Path) -> bool:
    """Whether ``path`` (already resolved) is ``root`` (resolved) or below it."""
    if _POSIX:  # parts compare exactly as POSIX paths do, without a Path a parent
        parts = root.parts
        return path.parts[:len(parts)] == parts
    return path == root or root in path.parents


_roots: dict | None = None
_reads: dict | None = None


class check_scope:
    """For a block (one check): each project root resolved once, and a data file that
    several designs name parsed once.

    Within the block a root's resolved path is taken from the first time it was
    resolved. That is never less strict: if a folder of the root path were replaced by
    a symlink while the check runs, the files below it would resolve outside the root
    remembered and be refused. A data file is still opened through every check of
    :func:`open_inside` for each design that names it; only what was parsed from it is
    reused, keyed on its resolved path and its identity (:func:`file_identity`), and
    only when the reading succeeded (a bad file is read again and reported again).
    Outside the block nothing is remembered.
    """

    def __enter__(self):
        global _roots, _reads
        self._saved = (_roots, _reads)
        if _roots is None:
            _roots, _reads = {}, {}
        return self

    def __exit__(self, *exc) -> None:
        global _roots, _reads
        _roots, _reads = self._saved


def file_identity(fd: int) -> tuple:
    """Device, inode, size and modification time of an open file: a file that changed
    in any of them is read again."""
    info = os.fstat(fd)
    return info.st_dev, info.st_ino, info.st_size, info.st_mtime_ns


def read_once(key: tuple, read):
    """``read()``, or inside a :class:`check_scope` what it returned for the same
    ``key`` before (exceptions are never remembered)."""
    reads = _reads
    if reads is None:
        return read()
    if key in reads:
        return reads[key]
    found = reads[key] = read()
    return found


def _resolved_root(root) -> Path:
    roots = _roots
    if roots is None:
        return Path(root).resolve()
    key = os.fspath(root)
    found = roots.get(key)
    if found is None:
        found = roots[key] = Path(root).resolve()
    return found


def relative_name(root: Path, path: Path) -> str:
    """``path.relative_to(root).as_posix()`` for a path inside ``root``."""
    if _POSIX:
        return "/".join(path.parts[len(root.parts):]) or "."
    return path.relative_to(root).as_posix()


def without_symlinks(path: str, last_checked: bool = False, below: int = 0) -> bool:
    """Whether ``path`` (absolute and normalised, as ``os.path.normpath`` gives it) names
    no symlink in any of its folders or itself, each looked at with ``lstat`` as
    ``os.path.realpath`` would; such a path is its own resolved path. False whenever
    in doubt (a part that is a symlink or cannot be looked at, a path that does not
    start with exactly one '/', another operating system): the caller resolves it then.

    With ``last_checked`` the caller has just looked at the last part itself (and found
    no symlink); only the folders are looked at. With ``below`` (the index of a '/' in
    ``path``) the folder the path names up to there is one the caller has just resolved
    (a folder being scanned); only the parts after it are looked at.
    """
    if not _POSIX or path[:1] != "/" or path[:2] == "//":
        return False
    stop = path.rfind("/") if last_checked else len(path)
    end = below
    try:
        while True:  # "/a", "/a/b", ... up to ``stop``
            end = path.find("/", end + 1)
            if end < 0:
                end = len(path)
            if end > stop:
                return True
            if stat.S_ISLNK(os.lstat(path[:end]).st_mode):
                return False
            if end == len(path):
                return True
    except (OSError, ValueError):
        return False


def _resolve(root: Path, candidate: Path, label: str, what: str,
             where: InputProblem | None, fallback: str, last_checked: bool = False) -> Path:
    if without_symlinks(os.fspath(candidate), last_checked):
        resolved = candidate  # what resolve() would give: no symlink to follow, no loop
    else:
        try:
            resolved = candidate.resolve(strict=False)
        except RuntimeError:  # Python before 3.13: a symlink loop
            raise _refuse(where, fallback, f"{what} '{label}' is a symlink loop") from None
        except OSError as exc:
            if exc.errno == errno.ELOOP:
                raise _refuse(where, fallback, f"{what} '{label}' is a symlink loop") \
                    from None
            if exc.errno == errno.ENAMETOOLONG:
                raise _refuse(where, fallback, f"the path of {what} '{label}' is too "
                              "long") from None
            raise _refuse(where, fallback, f"cannot read {what} '{label}': "
                          f"{exc.strerror or exc}") from None
    if not inside_root(root, resolved):
        raise _refuse(where, fallback, f"'{label}' is a symlink to a file outside the "
                      "project root; it is not read")
    return resolved


def resolve_checked(root: Path, target: str | Path, *, what: str,
                    where: InputProblem | None = None, label: str | None = None
                    ) -> tuple[Path, str]:
    """The resolved path of ``target`` and its name relative to ``root``, after the
    checks of its name, its existence and the root; nothing is opened.

    ``target`` is a path relative to ``root`` (as written in a design) or an absolute
    path found by a folder scan.
    """
    root = _resolved_root(root)
    text = os.fspath(target)
    label = _shown(label if label is not None else text)
    fallback = label
    problem = check_name(text)
    if problem is not None:
        raise _refuse(where, fallback, problem)
    given = Path(text)
    candidate = given if given.is_absolute() else root / text
    candidate_absolute = Path(os.path.normpath(candidate.absolute()))
    if not inside_root(root, candidate_absolute):
        raise _refuse(where, fallback, f"'{label}' is outside the project root")
    try:
        info = os.lstat(candidate_absolute)
    except FileNotFoundError:
        raise _refuse(where, fallback, f"{what} '{label}' not found (looked for "
                      f"{_shown(candidate_absolute.as_posix(), 200)})") from None
    except OSError as exc:
        if exc.errno == errno.ENAMETOOLONG:
            raise _refuse(where, fallback, f"the path of {what} '{label}' is too long") \
                from None
        if exc.errno == errno.ENOTDIR:
            raise _refuse(where, fallback, f"{what} '{label}' not found (a part of the "
                          "path is a file, not a folder)") from None
        raise _refuse(where, fallback, f"cannot read {what} '{label}': "
                      f"{exc.strerror or exc}") from None
    resolved = _resolve(root, candidate_absolute, label, what, where, fallback,
                        last_checked=not stat.S_ISLNK(info.st_mode))
    return resolved, relative_name(root, resolved)


def open_inside(root: Path, target: str | Path, *, what: str, limit: int,
                where: InputProblem | None = None, label: str | None = None):
    """Open a file for reading after every check; returns ``(fd, resolved, size, name)``.

    ``name`` is the resolved path relative to the root, for messages. The caller
    closes ``fd``.
    """
    resolved, name = resolve_checked(root, target, what=what, where=where, label=label)
    if label is not None:
        name = label
    label = _shown(label if label is not None else os.fspath(target))
    fallback = label
    flags = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_NOFOLLOW", 0) \
        | getattr(os, "O_CLOEXEC", 0) | getattr(os, "O_NOCTTY", 0)
    try:
        fd = os.open(resolved, flags)
    except FileNotFoundError:  # a dangling symlink
        raise _refuse(where, fallback, f"{what} '{label}' not found (a symlink to a "
                      "missing file)") from None
    except OSError as exc:
        if exc.errno == errno.ELOOP:
            raise _refuse(where, fallback, f"{what} '{label}' is a symlink loop") from None
        if exc.errno == errno.ENXIO:  # a socket
            raise _refuse(where, fallback, f"{what} '{label}' is a socket, not a regular "
                          "file; it is not read") from None
        raise _refuse(where, fallback, f"cannot read {what} '{label}': "
                      f"{exc.strerror or exc}") from None
    try:
        info = os.fstat(fd)
        if not stat.S_ISREG(info.st_mode):
            kind = ("a folder" if stat.S_ISDIR(info.st_mode)
                    else "a FIFO (named pipe)" if stat.S_ISFIFO(info.st_mode)
                    else "a device" if stat.S_ISCHR(info.st_mode) or stat.S_ISBLK(info.st_mode)
                    else "a socket" if stat.S_ISSOCK(info.st_mode)
                    else "not a regular file")
            raise _refuse(where, fallback, f"{what} '{label}' is {kind}, not a regular file; "
                          "it is not read")
        if info.st_size > limit:  # located at the file itself, which is inside the root
            raise _refuse(None, name, f"{what} is {info.st_size} bytes; {what}s are limited "
                          f"to {limit} bytes ({_mib(limit)})")
        if hasattr(os, "set_blocking"):
            os.set_blocking(fd, True)
    except BaseException:
        os.close(fd)
        raise
    return fd, resolved, info.st_size, name


def _mib(limit: int) -> str:
    return f"{limit / (1 << 20):g} MiB"


def read_inside(root: Path, target: str | Path, *, what: str, limit: int,
                where: InputProblem | None = None, label: str | None = None
                ) -> tuple[bytes, str]:
    """Read a whole file after every check of :func:`open_inside`; ``(bytes, name)``.

    At most ``limit`` bytes are read even if the file grows while it is read.
    """
    fd, _, _, name = open_inside(root, target, what=what, limit=limit, where=where,
                                 label=label)
    return read_open(fd, name, what=what, limit=limit), name


def read_open(fd: int, name: str, *, what: str, limit: int) -> bytes:
    """The bytes of a file opened by :func:`open_inside`, which is closed after; at most
    ``limit`` bytes are read even if the file grows while it is read."""
    try:
        chunks = []
        remaining = limit + 1
        while remaining > 0:
            chunk = os.read(fd, min(remaining, 1 << 20))
            if not chunk:
                break
            chunks.append(chunk)
            remaining -= len(chunk)
    except OSError as exc:
        raise InputError([InputProblem(name, 1, 1, "", f"cannot read file: "
                                       f"{exc.strerror or exc}")]) from None
    finally:
        os.close(fd)
    data = b"".join(chunks)
    if len(data) > limit:
        raise InputError([InputProblem(name, 1, 1, "", f"{what} grew beyond {limit} bytes "
                                       "while it was read")])
    return data


def read_npy_inside(root: Path, target: str | Path, *, what: str, limit: int,
                    where: InputProblem | None = None, label: str | None = None):
    """Read a ``.npy`` array after the checks of :func:`open_inside`; ``(array, name)``.

    The header is read and checked first: only plain integer or float arrays, and
    shape times item size must fit both the limit and the file, so a 100-byte file
    that claims 74 GiB is refused before any memory is allocated.
    """
    import numpy as np
    from numpy.lib import format as npy_format

    fd, _, size, name = open_inside(root, target, what=what, limit=limit, where=where,
                                    label=label)
    with os.fdopen(fd, "rb", closefd=True) as stream:
        try:
            version = npy_format.read_magic(stream)
            if version == (1, 0):
                shape, fortran, dtype = npy_format.read_array_header_1_0(stream)
            elif version in ((2, 0), (3, 0)):
                shape, fortran, dtype = npy_format.read_array_header_2_0(stream)
            else:
                raise ValueError(f"unsupported .npy version {version}")
        except (ValueError, OSError, SyntaxError, TypeError, OverflowError) as exc:
            raise InputError([InputProblem(name, 1, 1, "", f"not a readable .npy array: "
                                           f"{exc}")]) from None
        if dtype.hasobject or dtype.kind not in "iuf":
            raise InputError([InputProblem(name, 1, 1, "", "the .npy file must hold real "
                                           f"numbers, got dtype {dtype}")])
        count = 1
        for extent in shape:
            count *= int(extent)
        claimed = count * dtype.itemsize
        offset = stream.tell()
        if claimed > limit or claimed > size - offset:
            raise InputError([InputProblem(name, 1, 1, "", f"the .npy header claims "
                                           f"{claimed} bytes of data (shape {shape}) but "
                                           f"the file holds {max(size - offset, 0)}; .npy "
                                           f"files are limited to {limit} bytes")])
        data = stream.read(claimed)
    if len(data) != claimed:
        raise InputError([InputProblem(name, 1, 1, "", "the .npy file ended before its data")])
    array = np.frombuffer(data, dtype=dtype, count=count)
    array = array.reshape(shape, order="F" if fortran else "C")
    return array, name

"""Checking design files in several processes: this process and worker processes share
the files chunk by chunk, and the parts are put together in chunk order, so the result is
the one a single process gives, byte for byte.

This process starts on the files at once (a worker needs about half a second to import
vcheck, numpy and scipy before it can take any); each worker, once it says it is ready,
is handed chunks from the far end of the list, two ahead, so it never waits for this
process and this process waits at most for the chunks in flight at the end. A worker
that is not ready when the files run out is stopped: it costs a core for its start-up,
never the run's time. A worker that stops unexpectedly has its chunks checked again by
the others. No process of the run is left behind.

A worker is a fresh interpreter (``sys.executable``) started with :mod:`subprocess`,
not a :mod:`multiprocessing` one: nothing of the calling program's ``__main__`` is run
again in it, no resource-tracker process is started, and forking a process that holds
numpy's BLAS threads is avoided. Messages are pickles, each after its length in 8 bytes,
on the worker's standard input and output; whatever a plugin prints in a worker goes to
standard error.
"""

from __future__ import annotations

import pickle
import queue
import sys
from collections import deque

__all__ = ["AUTO_FROM", "CHUNK", "Crew", "check_in_processes", "processes_for", "quota_cpus",
           "usable_cores"]

CHUNK = 8
"""Design files a chunk: about 20 ms of work, so the last chunks in flight keep this
process waiting briefly, and the messages (a chunk's findings, pickled) stay small."""

AUTO_FROM = 200
"""Design files for each process the command line checks in unless told otherwise
(``--jobs``), at most one a core: 400 files take two. A worker's start-up (about half a
second of imports) is the work of about 200 files (2 to 3 ms each), so a worker with less
to do than that would mostly cost a core."""

_AHEAD = 2  # chunks handed to a ready worker ahead of its results
_POLL = 1.0  # seconds between looks at whether the workers are alive while waiting
_BOOT = ("import pickle, sys; i = sys.stdin.buffer; "
         "sys.path[:] = pickle.loads(i.read(int.from_bytes(i.read(8), 'big'))); "
         "from vcheck.parallel import _serve; _serve()")
"""A worker's first lines: the calling process's ``sys.path`` (its first message), so that
vcheck and the plugins import in the worker from where they came in this process."""


def usable_cores() -> int:
    """The cores this process may use: those it may run on (its affinity where the system
    tells it), fewer where a cgroup CPU quota (a container's CPU limit) allows fewer."""
    import os

    try:
        cores = max(1, len(os.sched_getaffinity(0)))
    except (AttributeError, OSError):
        cores = max(1, os.cpu_count() or 1)
    quota = quota_cpus()
    return cores if quota is None else max(1, min(cores, quota))


def quota_cpus(root=None) -> int | None:
    """The CPUs a cgroup CPU quota allows, rounded up, or None where there is none (or it
    cannot be read): ``cpu.max`` ("quota period" or "max period", cgroup v2) or
    ``cpu/cpu.cfs_quota_us`` over ``cpu/cpu.cfs_period_us`` (v1, -1 for none), at the
    top of ``root`` (``/sys/fs/cgroup``, the container's own group as it sees it)."""
    import math
    from pathlib import Path

    root = Path("/sys/fs/cgroup") if root is None else Path(root)
    try:
        quota, period = (root / "cpu.max").read_text().split()[:2]
    except (OSError, ValueError):
        try:
            quota = (root / "cpu" / "cpu.cfs_quota_us").read_text().strip()
            period = (root / "cpu" / "cpu.cfs_period_us").read_text().strip()
        except OSError:
            return None
    try:
        quota_us, period_us = float(quota), float(period)
    except ValueError:  # "max": no quota
        return None
    if not (quota_us > 0 and period_us > 0 and math.isfinite(quota_us / period_us)):
        return None
    return max(1, math.ceil(quota_us / period_us))


def processes_for(asked: int | None, files: int, cores: int) -> int:
    """Processes for a check of ``files`` design files: ``asked`` (already capped at the
    cores) when given, else one for each :data:`AUTO_FROM` files, at most one a core (a
    worker is only started where its share of the work outlasts its start-up)."""
    if asked is not None:
        return asked
    return max(1, min(cores, files // AUTO_FROM))


def _send(stream, message) -> None:
    data = pickle.dumps(message, protocol=pickle.HIGHEST_PROTOCOL)
    stream.write(len(data).to_bytes(8, "big"))
    stream.write(data)
    stream.flush()


def _receive(stream):
    """The next message on ``stream``, or None at its end (a short read is an end too)."""
    size = stream.read(8)
    if len(size) < 8:
        return None
    data = stream.read(int.from_bytes(size, "big"))
    return pickle.loads(data)


def _serve() -> None:
    """A worker's life: the policy and rule selection, the registry and rule options as
    the command line makes them, a "ready", then one chunk after another until its input
    ends. Every message out is (kind, chunk index, payload); an exception is sent as one,
    or as its text if it cannot be pickled (one in the start-up ends the worker)."""
    import os
    import signal

    # Ctrl-C is the main process's to handle (it stops the workers); a worker whose main
    # process is gone (its pipes closed) ends quietly
    signal.signal(signal.SIGINT, signal.SIG_IGN)
    inbox = sys.stdin.buffer
    outbox = os.fdopen(os.dup(sys.stdout.fileno()), "wb")
    os.dup2(sys.stderr.fileno(), sys.stdout.fileno())  # prints go to stderr, not the pipe
    sys.stdout = sys.stderr
    try:
        _serve_on(inbox, outbox)
    except OSError:  # a closed pipe: the main process has stopped or no longer listens
        pass


def _serve_on(inbox, outbox) -> None:
    try:
        from .checking import _check_files
        from .config import resolve_rule_options
        from .design.files import check_scope
        from .engine import discover

        received = _receive(inbox)
        if received is None:  # the main process ended before the worker was ready
            return
        policy, only = received
        registry = discover(policy.local_rule_folders())
        chosen = resolve_rule_options(policy, registry, only)
    except BaseException as exc:  # noqa: BLE001 - sent to the main process, raised there
        _send(outbox, ("failed", None, _sendable(exc)))
        return
    _send(outbox, ("ready", None, None))
    with check_scope():  # a data file several chunks' designs name is parsed once
        while True:
            task = _receive(inbox)
            if task is None:
                return
            index, chunk = task
            try:
                part = _check_files(policy, registry, chosen, chunk)
            except Exception as exc:  # noqa: BLE001 - as above
                _send(outbox, ("failed", index, _sendable(exc)))
            else:
                _send(outbox, ("done", index, part))


def _sendable(exc: BaseException) -> BaseException:
    try:
        pickle.dumps(exc)
    except Exception:  # noqa: BLE001 - any failure to pickle: its text goes instead
        return RuntimeError(f"{type(exc).__name__}: {exc}")
    return exc


_PIPE_BYTES = 1 << 20
"""The capacity asked for a worker's output pipe (Linux's default limit for an
unprivileged process, /proc/sys/fs/pipe-max-size): a chunk's pickled part (about 90 kB)
then never waits in the worker for this process's reading thread, which gets the GIL
only when the checking thread gives it up (every few milliseconds). Measured on 1,000
designs: a chunk's send took 6.5 ms with the default 64 kB pipe, 2.4 ms with this one,
of about 20 ms of checking."""


def _widen(stream) -> None:
    """Ask for a pipe of :data:`_PIPE_BYTES` where the system allows it (Linux); elsewhere,
    or if refused, the pipe stays as it is."""
    try:
        import fcntl

        fcntl.fcntl(stream.fileno(), fcntl.F_SETPIPE_SZ, _PIPE_BYTES)
    except (ImportError, AttributeError, OSError):
        pass


class _Worker:
    """One worker process, with a thread that reads its messages into ``inbox`` as
    (worker, message) pairs, and None as the message when its output ends."""

    def __init__(self, inbox: queue.Queue, policy, only) -> None:
        import subprocess
        import threading

        # the interpreter's own options (-W, -X, -O, -I ...) as multiprocessing passes them
        flags = getattr(subprocess, "_args_from_interpreter_flags", list)()
        self.process = subprocess.Popen([sys.executable, *flags, "-c", _BOOT],
                                        stdin=subprocess.PIPE, stdout=subprocess.PIPE)
        _widen(self.process.stdout)
        self.chunks: set[int] = set()  # handed over, not yet returned
        self.ready = self.lost = False
        self._reader = threading.Thread(target=self._read, args=(inbox,), daemon=True)
        self._reader.start()
        self.give(list(sys.path))
        self.give((policy, only))

    def _read(self, inbox: queue.Queue) -> None:
        stream = self.process.stdout
        while True:
            try:
                message = _receive(stream)
            except Exception:  # noqa: BLE001 - a torn or unreadable message: the worker is lost
                message = None
            inbox.put((self, message))
            if message is None:
                return

    def give(self, message) -> bool:
        """Send ``message``; False if the worker is gone."""
        if not self.lost:
            try:
                _send(self.process.stdin, message)
                return True
            except (BrokenPipeError, OSError, ValueError):
                self.lost = True
        return False

    def stop(self) -> None:
        """End the worker (at once: it holds nothing the run needs) and reap it."""
        if self.process.poll() is None:
            self.process.kill()
        self.process.wait()
        for stream in (self.process.stdin, self.process.stdout):
            try:
                stream.close()
            except OSError:
                pass
        self._reader.join()


class Crew:
    """Worker processes started ahead of a check: the command line starts them as soon
    as it knows how many design files there are, before it imports the rules, so that
    their start-up overlaps its own. Stopping is idempotent."""

    def __init__(self, policy, only, count: int) -> None:
        self.inbox: queue.Queue = queue.Queue()
        self.workers: list[_Worker] = []
        for _ in range(count if sys.executable else 0):
            try:
                self.workers.append(_Worker(self.inbox, policy, only))
            except OSError:  # no process could be started (a limit): fewer workers
                break

    def stop(self) -> None:
        """Stop every worker (idle, still starting, or after a failure) and reap it."""
        workers, self.workers = self.workers, []
        for worker in workers:
            worker.stop()


def check_in_processes(policy, registry, chosen, only, files: list, processes: int,
                       progress=None, *, main_works: bool = True, crew: Crew | None = None
                       ) -> list:
    """The parts (checked designs, findings, problems) of ``files`` in chunk order,
    checked by this process and ``processes - 1`` worker processes. A chunk whose check
    raises does not stop the others; the exception of the first such chunk in file
    order is raised at the end, the one a single process would have raised.

    ``crew`` holds workers started earlier for the same policy and rule selection (they
    are used in place of ``processes - 1`` new ones, and stopped at the end either way).
    ``main_works=False`` leaves every chunk to the workers (for tests of the workers'
    side; the command line never sets it)."""
    from .checking import _check_files
    from .design.files import check_scope

    chunks = [files[i:i + CHUNK] for i in range(0, len(files), CHUNK)]
    parts: list = [None] * len(chunks)
    pending = deque(range(len(chunks)))
    failures: dict = {}  # chunk index: the exception its check raised
    done = 0

    def counted(count: int, total: int) -> None:
        progress(done + count, len(files))

    scope = check_scope()  # a data file several chunks' designs name is parsed once
    scope.__enter__()
    try:
        if crew is None:
            crew = Crew(policy, only, processes - 1)
        inbox, workers = crew.inbox, crew.workers
        while pending or any(worker.chunks for worker in workers):
            waiting = not pending or not main_works
            try:
                worker, message = inbox.get(timeout=_POLL) if waiting else inbox.get_nowait()
            except queue.Empty:
                if not waiting:
                    index = pending.popleft()
                    try:
                        parts[index] = _check_files(policy, registry, chosen, chunks[index],
                                                    counted if progress is not None else None)
                    except Exception as exc:  # noqa: BLE001 - raised in file order below
                        failures[index] = exc
                    done += len(chunks[index])
                elif all(worker.lost for worker in workers):
                    raise RuntimeError("every worker process of the check stopped before "
                                       "its files were checked") from None
                continue
            if message is None:  # the worker stopped: its chunks go back to the others
                worker.lost = True
                pending.extend(sorted(worker.chunks))
                worker.chunks.clear()
                if not main_works and all(w.lost for w in workers):
                    raise RuntimeError("every worker process of the check stopped before "
                                       "its files were checked")
                continue
            kind, index, payload = message
            if kind == "failed" and index is None:  # its start-up failed: the others go on
                worker.lost = True
                continue
            if kind == "ready":
                worker.ready = True
            else:
                if kind == "failed":
                    failures[index] = payload
                else:
                    parts[index] = payload
                worker.chunks.discard(index)
                done += len(chunks[index])
                if progress is not None:
                    progress(done, len(files))
            while pending and len(worker.chunks) < _AHEAD and worker.ready and not worker.lost:
                index = pending.pop()
                if not worker.give((index, chunks[index])):
                    pending.append(index)
                    break
                worker.chunks.add(index)
    finally:
        scope.__exit__(None, None, None)
        if crew is not None:  # idle, still starting, or after a failure: none needed
            crew.stop()
    if failures:  # the one a single process would have met first
        raise failures[min(failures)]
    return parts

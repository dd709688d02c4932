"""Checking design files in several processes: this process and spawned workers share
the files chunk by chunk, and the parts are put together in file order, so the result is
the one a single process gives, byte for byte.

This process starts on the files at once (a spawned worker needs about half a second to
import vcheck, numpy and scipy before it can take any); each worker, once it says it is
ready, is handed chunks from the far end of the list, two at a time, so it never waits
for this process and this process waits at most for the chunks in flight at the end. A
worker that is not ready when the files run out is stopped: it costs a core for its
start-up, never the run's time. No process of the run is left behind.
"""

from __future__ import annotations

import pickle
import queue
from collections import deque

__all__ = ["AUTO_FROM", "CHUNK", "check_in_processes", "processes_for", "usable_cores"]

CHUNK = 8
"""Design files a chunk: about 20 ms of work, so the last chunks in flight keep this
process waiting briefly, and the messages (a chunk's findings, pickled) stay small."""

AUTO_FROM = 200
"""Design files from which the command line checks in one process a core unless told
otherwise (``--jobs``): below it the work (about 2 ms a file) is shorter than a worker's
start-up and a second process would only cost a core."""

_IN_FLIGHT = 2  # chunks handed to a ready worker ahead of its results
_POLL = 1.0  # seconds between looks at whether the workers are alive while waiting


def usable_cores() -> int:
    """The cores this process may run on (its affinity where the system tells it)."""
    import os

    try:
        return max(1, len(os.sched_getaffinity(0)))
    except (AttributeError, OSError):
        return max(1, os.cpu_count() or 1)


def processes_for(asked: int | None, files: int, cores: int) -> int:
    """Processes for a check of ``files`` design files: ``asked`` (already capped at the
    cores) when given, else one a core from :data:`AUTO_FROM` files, else one."""
    if asked is not None:
        return asked
    return cores if files >= AUTO_FROM else 1


def _worker(policy, only, tasks, results) -> None:
    """A worker: the registry and rule options as the command line makes them, then one
    chunk after another until told to stop (``None``). Every message is (kind, chunk
    index, payload); an exception is sent as one, or as its text if it cannot be pickled."""
    try:
        from .checking import _check_files
        from .config import resolve_rule_options
        from .engine import discover

        registry = discover(policy.local_rule_folders())
        chosen = resolve_rule_options(policy, registry, only)
    except BaseException as exc:  # noqa: BLE001 - sent to the main process, raised there
        results.put(("failed", None, _sendable(exc)))
        return
    results.put(("ready", None, None))
    while True:
        task = tasks.get()
        if task is None:
            return
        index, chunk = task
        try:
            part = _check_files(policy, registry, chosen, chunk)
        except BaseException as exc:  # noqa: BLE001 - as above
            results.put(("failed", index, _sendable(exc)))
            return
        results.put(("done", index, part))


def _sendable(exc: BaseException) -> BaseException:
    try:
        pickle.dumps(exc)
    except Exception:  # noqa: BLE001 - any failure to pickle: its text goes instead
        return RuntimeError(f"{type(exc).__name__}: {exc}")
    return exc


def check_in_processes(policy, registry, chosen, only, files: list, processes: int,
                       progress=None, *, main_works: bool = True) -> list:
    """The parts (checked designs, findings, problems) of ``files`` in chunk order,
    checked by this process and ``processes - 1`` spawned workers.

    ``main_works=False`` leaves every chunk to the workers (for tests of the workers'
    side; the command line never sets it)."""
    import multiprocessing

    from .checking import _check_files

    chunks = [files[i:i + CHUNK] for i in range(0, len(files), CHUNK)]
    parts: list = [None] * len(chunks)
    pending = deque(range(len(chunks)))
    done = 0

    def counted(count: int, total: int) -> None:
        progress(done + count, len(files))

    context = multiprocessing.get_context("spawn")
    tracker_was_running = _tracker_running()
    tasks, results = context.Queue(), context.Queue()
    workers = [context.Process(target=_worker, args=(policy, only, tasks, results),
                               daemon=True) for _ in range(processes - 1)]
    try:
        for worker in workers:
            worker.start()
        ready = in_flight = 0
        while pending or in_flight:
            waiting = not pending or not main_works
            try:
                kind, index, payload = (results.get(timeout=_POLL) if waiting
                                        else results.get_nowait())
            except queue.Empty:
                if not waiting:
                    index = pending.popleft()
                    parts[index] = _check_files(policy, registry, chosen, chunks[index],
                                                counted if progress is not None else None)
                    done += len(chunks[index])
                elif not any(worker.is_alive() for worker in workers):
                    raise RuntimeError("the worker processes of --jobs stopped before "
                                       "their files were checked") from None
                continue
            if kind == "failed":
                raise payload
            if kind == "ready":
                ready += 1
            else:
                parts[index] = payload
                in_flight -= 1
                done += len(chunks[index])
                if progress is not None:
                    progress(done, len(files))
            while pending and in_flight < _IN_FLIGHT * ready:
                index = pending.pop()
                tasks.put((index, chunks[index]))
                in_flight += 1
    finally:
        for worker in workers:  # idle, still starting, or after a failure: none needed
            worker.terminate()
        for worker in workers:
            worker.join()
        for channel in (tasks, results):
            channel.close()
            channel.cancel_join_thread()
        channel = tasks = results = workers = None
        if not tracker_was_running:
            _stop_tracker()
    return parts


def _tracker_running() -> bool:
    """Whether this process already has multiprocessing's resource tracker (a helper
    process that the queues' locks start, and that outlives them)."""
    from multiprocessing import resource_tracker

    return getattr(resource_tracker._resource_tracker, "_fd", None) is not None


def _stop_tracker() -> None:
    """Stop the resource tracker the run's queues started, once they are gone, so that no
    process of the run is left behind (in the command line's process or in a program that
    calls :func:`vcheck.checking.run_check`)."""
    import gc
    import os
    from multiprocessing import resource_tracker

    gc.collect()  # the queues and their locks unregister from the tracker now, not later
    tracker = resource_tracker._resource_tracker
    stop = getattr(tracker, "_stop", None)
    if stop is not None:
        stop()
    elif getattr(tracker, "_fd", None) is not None:  # pragma: no cover - Python 3.10
        os.close(tracker._fd)
        tracker._fd = None
        os.waitpid(tracker._pid, 0)
        tracker._pid = None

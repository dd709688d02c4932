"""Checking in several processes (vcheck/parallel.py): the parts the workers send back are
the ones this process would make, a worker's failure reaches the caller, and no process is
left behind. The reference is the single-process check of the same files."""

from __future__ import annotations

import sys
from pathlib import Path

import pytest
from support import EXAMPLE, children

from vcheck import cli, parallel
from vcheck.checking import _check_files, collect_design_files
from vcheck.config import load_policy, resolve_rule_options
from vcheck.engine import discover


@pytest.fixture(scope="module")
def example():
    policy = load_policy(EXAMPLE)
    registry = discover(policy.local_rule_folders())
    chosen = resolve_rule_options(policy, registry, None)
    files, problems = collect_design_files(policy, [], EXAMPLE)
    assert not problems and len(files) > 2 * parallel.CHUNK
    return policy, registry, chosen, files


def test_workers_alone_give_the_single_process_parts(example):
    # Every chunk checked by the two workers, none by this process: put together in
    # chunk order they equal the single-process check, finding for finding.
    policy, registry, chosen, files = example
    seen = []
    parts = parallel.check_in_processes(policy, registry, chosen, None, files, 3,
                                        lambda done, total: seen.append((done, total)),
                                        main_works=False)
    assert len(parts) == -(-len(files) // parallel.CHUNK)
    checked, findings, problems = _check_files(policy, registry, chosen, files)
    assert [d for part in parts for d in part[0]] == checked
    assert [f for part in parts for f in part[1]] == findings
    assert [p for part in parts for p in part[2]] == problems
    assert sorted(seen)[-1] == (len(files), len(files))
    assert children() == []


def test_a_failing_worker_reaches_the_caller(example):
    # A file entry the loader cannot take apart fails in the worker; the error is raised
    # here and the workers are stopped.
    policy, registry, chosen, _ = example
    bad = [("not", "a", "file entry")] * (parallel.CHUNK + 1)
    with pytest.raises(ValueError, match="too many values to unpack"):
        parallel.check_in_processes(policy, registry, chosen, None, bad, 2, main_works=False)
    assert children() == []


def test_a_data_file_is_parsed_once_across_chunks(example, monkeypatch):
    # Within one check a data file that designs of several chunks name is parsed once, as
    # in a single-process check (vcheck.design.files.check_scope spans the chunks).
    from vcheck.design import files as design_files

    policy, registry, chosen, files = example
    asked, parsed = {}, {}
    real = design_files.read_once

    def spied(key, read):
        asked[key] = asked.get(key, 0) + 1

        def counted():
            parsed[key] = parsed.get(key, 0) + 1
            return read()

        return real(key, counted)

    monkeypatch.setattr(design_files, "read_once", spied)
    twice = files + files  # every data file named in the first chunks and the last
    parallel.check_in_processes(policy, registry, chosen, None, twice, 1)
    assert asked and set(asked.values()) == {2}
    assert set(parsed.values()) == {1}


@pytest.mark.parametrize("main_works", [True, False])
def test_of_two_failing_chunks_the_first_in_file_order_is_raised(example, main_works):
    # As a single process would: it meets the second chunk's error before the third's,
    # whichever process finishes first.
    policy, registry, chosen, files = example
    first, second = [("short",)] * parallel.CHUNK, [("a", "b", "c")] * parallel.CHUNK
    entries = files[:parallel.CHUNK] + first + second
    with pytest.raises(ValueError, match=r"^not enough values to unpack"):
        parallel.check_in_processes(policy, registry, chosen, None, entries, 3,
                                    main_works=main_works)
    assert children() == []


def test_workers_that_die_leave_their_chunks_to_this_process(example, monkeypatch):
    # Workers that stop at once (as if killed): this process checks every chunk, and the
    # parts are the single-process ones.
    policy, registry, chosen, files = example
    monkeypatch.setattr(parallel, "_BOOT", "import sys; sys.exit(3)")
    parts = parallel.check_in_processes(policy, registry, chosen, None, files, 2)
    assert [f for part in parts for f in part[1]] == _check_files(policy, registry, chosen,
                                                                   files)[1]
    assert children() == []


def test_no_worker_can_start(example, monkeypatch):
    # A process limit (Popen fails): this process checks every chunk alone.
    import subprocess

    policy, registry, chosen, files = example

    def refused(*args, **kwargs):
        raise BlockingIOError(11, "Resource temporarily unavailable")

    monkeypatch.setattr(subprocess, "Popen", refused)
    parts = parallel.check_in_processes(policy, registry, chosen, None, files, 2)
    assert [f for part in parts for f in part[1]] == _check_files(policy, registry, chosen,
                                                                   files)[1]


def test_workers_that_die_with_nobody_else_to_check_are_an_error(example, monkeypatch):
    policy, registry, chosen, files = example
    monkeypatch.setattr(parallel, "_BOOT", "import sys; sys.exit(3)")
    with pytest.raises(RuntimeError, match="^every worker process of the check stopped "
                       "before its files were checked$"):
        parallel.check_in_processes(policy, registry, chosen, None, files, 3,
                                    main_works=False)
    assert children() == []


@pytest.mark.parametrize(("asked", "files", "cores", "expected"), [
    (None, 2 * parallel.AUTO_FROM - 1, 2, 1),
    (None, 2 * parallel.AUTO_FROM, 2, 2),
    (None, 5 * parallel.AUTO_FROM, 2, 2),
    (None, 5 * parallel.AUTO_FROM + 199, 8, 5),
    (None, 10_000, 1, 1),
    (None, 0, 4, 1),
    (1, 10_000, 4, 1),
    (3, 10, 4, 3),
])
def test_processes_for(asked, files, cores, expected):
    assert parallel.processes_for(asked, files, cores) == expected


@pytest.mark.parametrize(("files", "expected"), [
    ({"cpu.max": "max 100000\n"}, None),  # cgroup v2, no quota
    ({"cpu.max": "150000 100000\n"}, 2),  # 1.5 CPUs: a second process still helps
    ({"cpu.max": "100000 100000\n"}, 1),
    ({"cpu.max": "50000 100000\n"}, 1),
    ({"cpu.max": "garbage"}, None),
    ({"cpu/cpu.cfs_quota_us": "-1\n", "cpu/cpu.cfs_period_us": "100000\n"}, None),  # v1
    ({"cpu/cpu.cfs_quota_us": "300000\n", "cpu/cpu.cfs_period_us": "100000\n"}, 3),
    ({}, None),
])
def test_quota_cpus(tmp_path, files, expected):
    # The cgroup files as the kernel documents them (cgroup-v2.rst, "cpu.max": "$MAX
    # $PERIOD", "max" for none; sched-bwc.rst for v1's cfs_quota_us, -1 for none).
    for name, text in files.items():
        (tmp_path / name).parent.mkdir(exist_ok=True)
        (tmp_path / name).write_text(text)
    assert parallel.quota_cpus(tmp_path) == expected


def test_usable_cores_follow_a_quota(monkeypatch):
    monkeypatch.setattr(parallel, "quota_cpus", lambda: 1)
    assert parallel.usable_cores() == 1


def test_the_jobs_help_names_the_automatic_threshold(capsys):
    with pytest.raises(SystemExit):
        cli.main(["check", "--help"])
    help_text = " ".join(capsys.readouterr().out.split())
    assert (f"default: one for each {parallel.AUTO_FROM} design files, at most one per core"
            in help_text)


def test_usable_cores_is_at_least_one():
    assert parallel.usable_cores() >= 1 and isinstance(parallel.usable_cores(), int)


def _spy(monkeypatch, cores=2):
    calls = []
    real = parallel.check_in_processes

    def spied(*args, **kwargs):
        # the number of processes, and whether the command line started the workers early
        calls.append((args[5], kwargs.get("crew") is not None))
        return real(*args, **kwargs)

    monkeypatch.setattr(parallel, "check_in_processes", spied)
    monkeypatch.setattr(parallel, "usable_cores", lambda: cores)
    return calls


def test_a_project_below_the_threshold_stays_in_one_process(run_cli, monkeypatch):
    # The example's 24 files are fewer than two processes' worth: no worker.
    calls = _spy(monkeypatch)
    serial = run_cli("check", str(EXAMPLE), "--format", "json")
    assert serial.status == 1 and calls == []


def test_a_project_at_the_threshold_uses_a_process_a_core(run_cli, monkeypatch):
    # With the files a process lowered to half the example's 24, the default run shares
    # the files between two processes, and says the same as --jobs 1.
    serial = run_cli("check", str(EXAMPLE), "--format", "json", "--jobs", "1").out
    calls = _spy(monkeypatch)
    monkeypatch.setattr(parallel, "AUTO_FROM", 12)
    shared = run_cli("check", str(EXAMPLE), "--format", "json")
    assert calls == [(2, True)] and shared.out == serial
    assert children() == []


def test_a_worker_whose_main_process_is_gone_ends_quietly():
    # Its input ends before the policy comes (the main process was killed): exit 0,
    # nothing on stderr, no message out.
    import subprocess

    worker = subprocess.Popen([sys.executable, "-c", parallel._BOOT], stdin=subprocess.PIPE,
                              stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    parallel._send(worker.stdin, list(sys.path))
    out, err = worker.communicate(timeout=60)
    assert (worker.returncode, out, err) == (0, b"", b"")


def test_a_worker_checks_chunks_sent_by_hand(example):
    # The message protocol end to end: path, (policy, rule choice), a chunk; a "ready",
    # then the chunk's part, equal to this process's; the end of input ends the worker.
    import subprocess

    policy, registry, chosen, files = example
    worker = subprocess.Popen([sys.executable, "-c", parallel._BOOT], stdin=subprocess.PIPE,
                              stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    for message in (list(sys.path), (policy, None), (0, files[:3])):
        parallel._send(worker.stdin, message)
    worker.stdin.close()
    assert parallel._receive(worker.stdout) == ("ready", None, None)
    kind, index, part = parallel._receive(worker.stdout)
    assert (kind, index) == ("done", 0)
    assert part == _check_files(policy, registry, chosen, files[:3])
    assert parallel._receive(worker.stdout) is None
    assert worker.wait(timeout=60) == 0 and worker.stderr.read() == b""


@pytest.mark.skipif(not sys.platform.startswith("linux"), reason="F_GETPIPE_SZ is Linux's")
def test_a_worker_output_pipe_is_widened():
    import fcntl
    import subprocess

    limit = int(Path("/proc/sys/fs/pipe-max-size").read_text())
    with subprocess.Popen([sys.executable, "-c", "pass"], stdout=subprocess.PIPE) as child:
        parallel._widen(child.stdout)
        size = fcntl.fcntl(child.stdout.fileno(), fcntl.F_GETPIPE_SZ)
    assert size == min(parallel._PIPE_BYTES, limit) or (limit < parallel._PIPE_BYTES
                                                         and size == 65536)

"""Hostile files and paths: every file is read through one guarded opener.

Each case of issue 14 on the reading side is one test: devices, FIFOs, sockets,
symlinks out of the project, symlink loops, NUL bytes, over-long and non-UTF-8 names,
a .npy header claiming more memory than the file holds. Each asserts exit 2 and the
exact located message, and that nothing outside the project root is echoed.
"""

from __future__ import annotations

import os
import socket
import textwrap
from pathlib import Path

import numpy as np
import pytest

MACHINE = """\
format = 1

[machine]
tag = "T-1"
kind = "centrifugal-pump"
mass = "300 kg"
speed = "1500 rpm"
"""


def _project(tmp_path: Path, extra: str = "", name: str = "d.toml") -> Path:
    project = tmp_path / "project"
    project.mkdir(exist_ok=True)
    (project / "vcheck.toml").write_text("")
    (project / name).write_text(MACHINE + textwrap.dedent(extra))
    return project


def _bad(run_cli, cwd: Path, *args: str) -> list[str]:
    ran = run_cli("check", *args, "--format", "json", cwd=cwd)
    assert "Traceback" not in ran.err + ran.out
    assert ran.status == 2, ran.err
    return ran.err.strip().splitlines()


MODE_FILE = '\n[[mode-file]]\npath = "{path}"\n'


def test_scanned_symlink_to_dev_zero_is_refused_before_reading(run_cli, tmp_path):
    project = _project(tmp_path)
    (project / "sub").mkdir()
    (project / "sub" / "x.toml").symlink_to("/dev/zero")
    assert _bad(run_cli, project, ".") == [
        "sub/x.toml:1:1: 'sub/x.toml' is a symlink to a file outside the project root; "
        "it is not read"]


def test_a_device_inside_the_root_is_refused(run_cli, tmp_path):
    project = _project(tmp_path)
    try:
        os.mknod(project / "zero.toml", 0o600 | 0o020000, os.makedev(1, 5))
    except (PermissionError, OSError):
        pytest.skip("creating a device node needs privileges")
    assert _bad(run_cli, project, "zero.toml") == [
        "zero.toml:1:1: input file 'zero.toml' is a device, not a regular file; it is not read"]


def test_a_fifo_in_a_scanned_folder_does_not_block(run_cli, tmp_path):
    project = _project(tmp_path)
    os.mkfifo(project / "pipe.toml")
    assert _bad(run_cli, project, ".") == [
        "pipe.toml:1:1: input file 'pipe.toml' is a FIFO (named pipe), not a regular file; "
        "it is not read"]


def test_a_socket_named_as_a_mode_file_is_refused(run_cli, tmp_path, monkeypatch):
    project = _project(tmp_path, MODE_FILE.format(path="modes.csv"))
    server = socket.socket(socket.AF_UNIX)
    try:
        monkeypatch.chdir(project)  # a short relative name keeps under the socket path limit
        server.bind("modes.csv")
        assert _bad(run_cli, project, "d.toml") == [
            "d.toml:10:1: mode-file[1].path: mode file 'modes.csv' is a socket, not a regular "
            "file; it is not read"]
    finally:
        server.close()


def test_symlink_out_of_the_root_never_echoes_its_values(run_cli, tmp_path):
    secret = tmp_path / "secret.csv"
    secret.write_text("frequency\nTOPSECRET-4711\n")
    project = _project(tmp_path, MODE_FILE.format(path="modes.csv"))
    (project / "modes.csv").symlink_to(secret)
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert "TOPSECRET" not in ran.err + ran.out
    assert ran.err.strip() == (
        "d.toml:10:1: mode-file[1].path: 'modes.csv' is a symlink to a file outside the "
        "project root; it is not read")


def test_scanned_design_symlinked_out_is_not_read(run_cli, tmp_path):
    (tmp_path / "outside.toml").write_text(MACHINE.replace("T-1", "TOPSECRET-9"))
    project = _project(tmp_path)
    (project / "link.toml").symlink_to(tmp_path / "outside.toml")
    ran = run_cli("check", ".", "--format", "json", cwd=project)
    assert ran.status == 2
    assert "TOPSECRET" not in ran.err + ran.out
    assert ran.err.strip() == ("link.toml:1:1: 'link.toml' is a symlink to a file outside "
                               "the project root; it is not read")


def test_nul_byte_in_a_referenced_path(run_cli, tmp_path):
    project = _project(tmp_path, MODE_FILE.format(path="modes\\u0000.csv"))
    assert _bad(run_cli, project, "d.toml") == [
        "d.toml:10:1: mode-file[1].path: the path 'modes\\0.csv' holds a NUL byte; write a "
        "plain relative path"]


def test_five_thousand_character_name(run_cli, tmp_path):
    project = _project(tmp_path, MODE_FILE.format(path="m" * 5000 + ".csv"))
    assert _bad(run_cli, project, "d.toml") == [
        "d.toml:10:1: mode-file[1].path: the path is 5004 characters long; paths are limited "
        "to 1024 characters"]


def test_three_hundred_character_name(run_cli, tmp_path):
    project = _project(tmp_path, MODE_FILE.format(path="m" * 300 + ".csv"))
    assert _bad(run_cli, project, "d.toml") == [
        "d.toml:10:1: mode-file[1].path: a name in the path is 304 characters long; file "
        "names are limited to 255 characters"]


def test_symlink_loop(run_cli, tmp_path):
    project = _project(tmp_path, MODE_FILE.format(path="loop.csv"))
    (project / "loop.csv").symlink_to(project / "loop2.csv")
    (project / "loop2.csv").symlink_to(project / "loop.csv")
    assert _bad(run_cli, project, "d.toml") == [
        "d.toml:10:1: mode-file[1].path: mode file 'loop.csv' is a symlink loop"]


def test_scanned_symlink_loop(run_cli, tmp_path):
    project = _project(tmp_path)
    (project / "a.toml").symlink_to(project / "b.toml")
    (project / "b.toml").symlink_to(project / "a.toml")
    assert _bad(run_cli, project, ".") == [
        "a.toml:1:1: 'a.toml' is a symlink loop; it is not read",
        "b.toml:1:1: 'b.toml' is a symlink loop; it is not read"]


def test_non_utf8_file_name_in_a_scanned_folder(run_cli, tmp_path):
    project = _project(tmp_path)
    raw = os.fsencode(project) + b"/caf\xe9.toml"
    with open(raw, "wb") as handle:
        handle.write(MACHINE.encode())
    assert _bad(run_cli, project, ".") == [
        "caf\\udce9.toml:1:1: the file name 'caf\\udce9.toml' is not valid UTF-8; rename the file"]


def test_not_found_says_where_it_looked(run_cli, tmp_path):
    project = _project(tmp_path, MODE_FILE.format(path="fe/modes.csv"))
    assert _bad(run_cli, project, "d.toml") == [
        f"d.toml:10:1: mode-file[1].path: mode file 'fe/modes.csv' not found (looked for "
        f"{project.resolve().as_posix()}/fe/modes.csv)"]


def test_outside_the_root_is_distinct_from_not_found(run_cli, tmp_path):
    project = _project(tmp_path, MODE_FILE.format(path="../nowhere.csv"))
    assert _bad(run_cli, project, "d.toml") == [
        "d.toml:10:1: mode-file[1].path: '../nowhere.csv' is outside the project root"]


HISTORY = """
[[fatigue]]
name = "branch"
detail = "EN 1993-1-9:71"
life = { years = 25 }
history = { path = "h.npy", scale = "1 MPa", duration = "60 s" }
"""


def test_npy_header_claiming_74_gib_is_refused_before_allocation(run_cli, tmp_path):
    project = _project(tmp_path, HISTORY)
    header = b"{'descr': '<f8', 'fortran_order': False, 'shape': (10000000000,), }"
    header += b" " * (63 - len(header) % 64) + b"\n"
    data = b"\x93NUMPY\x01\x00" + len(header).to_bytes(2, "little") + header
    (project / "h.npy").write_bytes(data + b"\0" * 16)
    assert len(data) < 200
    assert _bad(run_cli, project, "d.toml") == [
        "h.npy:1:1: the .npy header claims 80000000000 bytes of data (shape (10000000000,)) "
        "but the file holds 16; .npy files are limited to 67108864 bytes"]


def test_npy_object_array_is_refused_without_unpickling(run_cli, tmp_path):
    project = _project(tmp_path, HISTORY)
    np.save(project / "h.npy", np.array([1, "x"], dtype=object), allow_pickle=True)
    assert _bad(run_cli, project, "d.toml") == [
        "h.npy:1:1: the .npy file must hold real numbers, got dtype object"]


def test_a_good_npy_still_reads(tmp_path):
    from vcheck.design.files import read_npy_inside

    np.save(tmp_path / "h.npy", np.arange(12.0).reshape(3, 4))
    array, name = read_npy_inside(tmp_path, "h.npy", what="time-history file", limit=1 << 20)
    assert name == "h.npy"
    np.testing.assert_array_equal(array, np.arange(12.0).reshape(3, 4))
    np.save(tmp_path / "f.npy", np.asfortranarray(np.arange(12.0).reshape(3, 4)))
    array, _ = read_npy_inside(tmp_path, "f.npy", what="time-history file", limit=1 << 20)
    np.testing.assert_array_equal(array, np.arange(12.0).reshape(3, 4))


def test_policy_file_that_is_a_symlink_out_is_not_read(run_cli, tmp_path):
    (tmp_path / "elsewhere.toml").write_text('paths = ["TOPSECRET"]\n')
    project = _project(tmp_path)
    (project / "vcheck.toml").unlink()
    (project / "vcheck.toml").symlink_to(tmp_path / "elsewhere.toml")
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert "TOPSECRET" not in ran.err + ran.out
    assert ran.err.strip() == ("vcheck.toml:1:1: 'vcheck.toml' is a symlink to a file "
                               "outside the project root; it is not read")


def test_explicit_policy_through_a_symlink_does_not_move_the_root(run_cli, tmp_path):
    other = tmp_path / "other"
    other.mkdir()
    (other / "vcheck.toml").write_text("")
    project = _project(tmp_path)
    (project / "linked.toml").symlink_to(other / "vcheck.toml")
    assert _bad(run_cli, project, "d.toml", "--policy", "linked.toml") == [
        "linked.toml:1:1: 'linked.toml' is a symlink to a file outside the project root; "
        "it is not read"]


def test_local_rules_module_symlinked_out_is_not_imported(run_cli, tmp_path):
    (tmp_path / "evil.py").write_text("raise SystemExit('imported from outside')\n")
    project = _project(tmp_path)
    (project / "site-rules").mkdir()
    (project / "site-rules" / "evil.py").symlink_to(tmp_path / "evil.py")
    (project / "vcheck.toml").write_text('local-rules = ["site-rules"]\n')
    assert _bad(run_cli, project, "d.toml") == [
        "vcheck.toml:1:16: local-rules[1]: 'site-rules/evil.py' is a symlink to a file "
        "outside the project root; it is not imported"]


def test_pyproject_array_of_vcheck_tables(run_cli, tmp_path):
    project = _project(tmp_path)
    (project / "vcheck.toml").unlink()
    (project / "pyproject.toml").write_text('[project]\nname = "x"\n\n[[tool.vcheck]]\n'
                                            'paths = ["."]\n')
    assert _bad(run_cli, project, "d.toml") == [
        "pyproject.toml:4:1: tool.vcheck: 'tool.vcheck' is an array of tables [[tool.vcheck]]; "
        "write one table, [tool.vcheck]"]


def test_pyproject_symlinked_out_is_not_read(run_cli, tmp_path):
    (tmp_path / "real.toml").write_text('[tool.vcheck]\npaths = ["TOPSECRET"]\n')
    project = _project(tmp_path)
    (project / "vcheck.toml").unlink()
    (project / "pyproject.toml").symlink_to(tmp_path / "real.toml")
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert "TOPSECRET" not in ran.err + ran.out
    assert ran.err.strip() == ("pyproject.toml:1:1: 'pyproject.toml' is a symlink to a file "
                               "outside the project root; it is not read")


def test_a_huge_csv_cell_is_not_echoed_whole(run_cli, tmp_path):
    project = _project(tmp_path, HISTORY.replace("h.npy", "h.csv"))
    (project / "h.csv").write_text("1.0\n" + "x" * 5_000_000 + "\n2.0\n")
    assert _bad(run_cli, project, "d.toml") == [
        "h.csv:2:1: '" + "x" * 37 + "...' in column 1 is not a number"]


def test_a_history_with_a_bad_byte_is_located(run_cli, tmp_path):
    project = _project(tmp_path, HISTORY.replace("h.npy", "h.csv"))
    (project / "h.csv").write_bytes(b"1.0\n2.0\n\xff\n")
    assert _bad(run_cli, project, "d.toml") == ["h.csv:3:1: time-history file is not UTF-8 text"]


def test_a_streamed_history_reads_every_sample(tmp_path):
    # the streamed reader against numpy's own reading of the same file
    from vcheck.design.loader import load_design

    project = _project(tmp_path, HISTORY.replace("h.npy", "h.csv"))
    values = np.sin(np.arange(200_003) * 0.01) * 50.0
    lines = ["# strain gauge 4", "stress"] + [f"{v:.6f}" for v in values]
    lines.insert(70_000, "")  # a blank line inside the second chunk
    (project / "h.csv").write_text("\r\n".join(lines) + "\r\n")
    design = load_design(project / "d.toml", "d.toml", project)
    reference = np.loadtxt(project / "h.csv", skiprows=2, comments="#") * 1e6
    np.testing.assert_array_equal(design._fatigue_inputs[0].history, reference)


def test_size_is_checked_before_reading(run_cli, tmp_path):
    project = _project(tmp_path, MODE_FILE.format(path="modes.csv"))
    with open(project / "modes.csv", "wb") as handle:  # sparse: 5 MiB of nothing
        handle.truncate(5 << 20)
    assert _bad(run_cli, project, "d.toml") == [
        "modes.csv:1:1: mode file is 5242880 bytes; mode files are limited to 4194304 bytes "
        "(4 MiB)"]


@pytest.mark.parametrize(("extra", "link", "expected"), [
    ('\n[support]\nstructure = "deck.toml"\n', "deck.toml",
     "d.toml:10:1: support.structure: 'deck.toml' is a symlink to a file outside the "
     "project root; it is not read"),
    (HISTORY.replace("h.npy", "h.csv"), "h.csv",
     "d.toml:13:13: fatigue[1].history.path: 'h.csv' is a symlink to a file outside the "
     "project root; it is not read"),
    (HISTORY.replace('history = { path = "h.npy", scale = "1 MPa", duration = "60 s" }',
                     'psd = { path = "p.csv", unit = "MPa^2/Hz" }'), "p.csv",
     "d.toml:13:9: fatigue[1].psd.path: 'p.csv' is a symlink to a file outside the project "
     "root; it is not read"),
])
def test_every_referenced_file_kind_refuses_a_symlink_out(run_cli, tmp_path, extra, link,
                                                          expected):
    secret = tmp_path / "secret.txt"
    secret.write_text("TOPSECRET,1\n")
    project = _project(tmp_path, extra)
    (project / link).symlink_to(secret)
    ran = run_cli("check", "d.toml", "--format", "json", cwd=project)
    assert ran.status == 2
    assert "TOPSECRET" not in ran.err + ran.out
    assert ran.err.strip() == expected


def test_a_policy_that_is_a_device_is_refused_unread(run_cli, tmp_path):
    project = _project(tmp_path)
    assert _bad(run_cli, project, "d.toml", "--policy", "/dev/zero") == [
        "zero:1:1: input file 'zero' is a device, not a regular file; it is not read"]

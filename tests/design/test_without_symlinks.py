"""The symlink-free shortcut of the guarded opener, checked against the standard
library's ``os.path.realpath`` (the reference: a path it says is free of symlinks must be
its own real path, and every path through a symlink must be refused the shortcut)."""

from __future__ import annotations

import os

import pytest

from vcheck.design.files import without_symlinks

pytestmark = pytest.mark.skipif(os.name != "posix", reason="POSIX paths and symlinks")


@pytest.fixture()
def tree(tmp_path):
    root = tmp_path.resolve()
    (root / "real").mkdir()
    (root / "real" / "a.toml").write_text("format = 1\n")
    (root / "linked").symlink_to(root / "real")
    (root / "real" / "b.toml").symlink_to(root / "real" / "a.toml")
    (root / "loop").symlink_to(root / "loop")
    (root / "dangling.toml").symlink_to(root / "missing.toml")
    return root


def _cases(root):
    return {
        "a plain file": (f"{root}/real/a.toml", True),
        "a plain folder": (f"{root}/real", True),
        "the file system root": ("/", True),
        "through a symlinked folder": (f"{root}/linked/a.toml", False),
        "a symlink to a file": (f"{root}/real/b.toml", False),
        "a symlink loop": (f"{root}/loop", False),
        "a dangling symlink": (f"{root}/dangling.toml", False),
        "a missing file": (f"{root}/real/none.toml", False),
        "a file taken for a folder": (f"{root}/real/a.toml/x.toml", False),
        "two leading slashes": (f"/{root}/real/a.toml", False),
        "a relative path": ("real/a.toml", False),
    }


@pytest.mark.parametrize("case", sorted(_cases("/r")))
def test_only_symlink_free_paths_take_the_shortcut(tree, case):
    path, expected = _cases(tree)[case]
    assert without_symlinks(path) is expected
    if expected:
        assert os.path.realpath(path) == path


def test_the_last_part_checked_by_the_caller_is_not_looked_at_again(tree):
    # the folders are still looked at: a symlinked folder is refused the shortcut
    assert without_symlinks(f"{tree}/real/b.toml", last_checked=True)
    assert not without_symlinks(f"{tree}/linked/a.toml", last_checked=True)


def test_below_a_folder_just_resolved_only_the_parts_after_it_are_looked_at(tree):
    folder = f"{tree}/real"
    assert without_symlinks(f"{folder}/a.toml", below=len(folder))
    assert not without_symlinks(f"{folder}/b.toml", below=len(folder))
    linked = f"{tree}/linked"
    # the caller vouches for the folder part: only a.toml itself is looked at
    assert without_symlinks(f"{linked}/a.toml", below=len(linked))
    assert not without_symlinks(f"{tree}/linked/a.toml", below=len(str(tree)))


def test_a_scanned_folder_names_each_file_by_its_real_path(tree):
    # the shortcut and the full resolution side by side in one scan; reference: the
    # names os.path.realpath gives the files the folder holds
    from pathlib import Path

    from vcheck.checking import collect_design_files
    from vcheck.config import Policy

    (tree / "deep" / "er").mkdir(parents=True)
    (tree / "deep" / "er" / "c.toml").write_text("format = 1\n")
    files, problems = collect_design_files(Policy(root=tree), ["."], tree)
    expected = {}
    for folder, _, names in os.walk(tree):  # does not enter symlinked folders either
        for name in names:
            if name.endswith(".toml"):
                real = os.path.realpath(os.path.join(folder, name))
                expected[os.path.relpath(real, tree)] = Path(real)
    assert problems == []
    assert files == [(expected[name], name) for name in sorted(expected)]
    assert [name for _, name in files] == ["deep/er/c.toml", "missing.toml", "real/a.toml"]

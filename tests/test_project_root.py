"""Where the project root is when no policy file says so."""

from __future__ import annotations

import shutil

from support import EXAMPLE


def test_a_design_outside_the_current_folder_is_checked_without_a_policy(run_cli, tmp_path):
    elsewhere = tmp_path / "elsewhere"
    here = tmp_path / "here"
    elsewhere.mkdir()
    here.mkdir()
    shutil.copy(EXAMPLE / "roof" / "ahu-r2.toml", elsewhere / "ahu-r2.toml")
    ran = run_cli("check", str(elsewhere / "ahu-r2.toml"), "--format", "json", cwd=here)
    assert ran.status in (0, 1), ran.err
    assert "outside the project root" not in ran.err


def test_without_a_policy_the_current_folder_stays_the_root_for_paths_inside_it(run_cli,
                                                                                 tmp_path):
    (tmp_path / "roof").mkdir()
    shutil.copy(EXAMPLE / "roof" / "ahu-r2.toml", tmp_path / "roof" / "ahu-r2.toml")
    ran = run_cli("check", "roof/ahu-r2.toml", "--format", "json", cwd=tmp_path)
    assert ran.status in (0, 1), ran.err
    assert '"file": "roof/ahu-r2.toml"' in ran.out

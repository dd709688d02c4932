"""Work several rules need is done once per design, whichever rules ask for it.

Counted, not timed: each joint of a design is screened once for the three fastener rules,
each six-DOF model of a machine on its mounts is solved for its forced response once for
the isolation rules, and the report is the same either way (the golden tests hold it
byte for byte)."""

from __future__ import annotations

import vcheck.rules.loosening as loosening
from support import EXAMPLE

import vcheck.dynamics.isolation.forced_response as forced_response


def test_each_joint_is_screened_once_for_the_three_fastener_rules(run_cli, monkeypatch):
    screened = []
    original = loosening.screen_joint

    def counting(design, index):
        screened.append((design.file, index))
        return original(design, index)

    monkeypatch.setattr(loosening, "screen_joint", counting)
    ran = run_cli("check", str(EXAMPLE / "basement" / "rc-b4.toml"), "--format", "json")
    assert ran.status in (0, 1), ran.err
    for rule in ("joint-slip", "joint-bolt-fatigue", "joint-bolt-yield"):
        assert f'"rule": "{rule}"' in ran.out
    # rc-b4 has three [[joint]] tables: three screenings, not nine
    assert sorted(index for _, index in screened) == [0, 1, 2]


def test_each_six_dof_model_is_solved_once_for_the_isolation_rules(run_cli, monkeypatch):
    built = []
    original = forced_response.MountForceModel.__init__

    def counting(self, mass_matrix, positions, stiffnesses, **kwargs):
        built.append((bytes(memoryview(mass_matrix)), bytes(memoryview(stiffnesses)),
                      kwargs.get("damping_ratio")))
        original(self, mass_matrix, positions, stiffnesses, **kwargs)

    monkeypatch.setattr(forced_response.MountForceModel, "__init__", counting)
    ran = run_cli("check", str(EXAMPLE / "basement" / "gen-b10.toml"), "--format", "json")
    assert ran.status in (0, 1), ran.err
    for rule in ("isolation-efficiency", "isolator-static-deflection",
                 "isolation-resonance-passage"):
        assert f'"rule": "{rule}"' in ran.out
    # at most three models (softest, nominal, stiffest), none built twice
    assert 1 <= len(built) <= 3
    assert len(set(built)) == len(built)


def test_the_mount_layout_and_each_mass_matrix_are_built_once_per_design(run_cli, monkeypatch):
    # gen-b10 gives six mounts with stiffness tolerances and one mass: the analysis and
    # the isolation rules need the layout and the mass matrices at the lightest, nominal
    # and heaviest mass; each is built once, shared, and the report holds all three rules.
    import vcheck.analysis as analysis
    import vcheck.dynamics.modes.rigid_mounts as rigid_mounts

    layouts, masses = [], []
    new_layout, new_mass = analysis._new_mount_layout, rigid_mounts.rigid_body_mass_matrix

    def counting_layout(design):
        layouts.append(design.file)
        return new_layout(design)

    def counting_mass(mass, inertia):
        masses.append(mass)
        return new_mass(mass, inertia)

    monkeypatch.setattr(analysis, "_new_mount_layout", counting_layout)
    monkeypatch.setattr(rigid_mounts, "rigid_body_mass_matrix", counting_mass)
    ran = run_cli("check", str(EXAMPLE / "basement" / "gen-b10.toml"), "--format", "json")
    assert ran.status in (0, 1), ran.err
    for rule in ("isolation-efficiency", "isolator-static-deflection",
                 "isolation-resonance-passage"):
        assert f'"rule": "{rule}"' in ran.out
    assert len(layouts) == 1
    assert 1 <= len(masses) <= 3 and len(set(masses)) == len(masses)


def test_the_floor_and_the_run_times_are_worked_out_once_per_design(run_cli, monkeypatch):
    # cmp-b1 stands on isolators without mounts: the three isolation rules (and the
    # efficiency rule's advice) all need the floor class, worked out once; the passage
    # rule reads the run-up and run-down times once.
    import vcheck.rules.isolation as isolation

    floors, runs = [], []
    new_floor, run_times = isolation._new_floor, isolation._run_times

    def counting_floor(design):
        floors.append(design.file)
        return new_floor(design)

    def counting_runs(design):
        runs.append(design.file)
        return run_times(design)

    monkeypatch.setattr(isolation, "_new_floor", counting_floor)
    monkeypatch.setattr(isolation, "_run_times", counting_runs)
    ran = run_cli("check", str(EXAMPLE / "basement" / "cmp-b1.toml"), "--format", "json")
    assert ran.status in (0, 1), ran.err
    for rule in ("isolation-efficiency", "isolator-static-deflection",
                 "isolation-resonance-passage"):
        assert f'"rule": "{rule}"' in ran.out
    assert len(floors) == 1
    assert len(runs) <= 1


def test_the_forcing_bands_are_worked_out_once_per_design_and_orders(run_cli, monkeypatch):
    # the analysis and the separation rule ask for the bands at the same orders (1x, 2x):
    # one working-out per design file, and the report holds both rules
    import vcheck.analysis as analysis

    worked = []
    new_bands = analysis._new_excitation_bands

    def counting(design, orders):
        worked.append((design.file, orders))
        return new_bands(design, orders)

    monkeypatch.setattr(analysis, "_new_excitation_bands", counting)
    ran = run_cli("check", str(EXAMPLE / "basement" / "gen-b10.toml"), "--format", "json")
    assert ran.status in (0, 1), ran.err
    assert '"rule": "frequency-separation"' in ran.out
    assert len(worked) == 1 and worked[0][1] == (1.0, 2.0)


def test_each_call_for_the_forcing_bands_gets_a_list_of_its_own(tmp_path):
    from vcheck.analysis import excitation_bands
    from vcheck.checking import load_designs
    from vcheck.config import load_policy

    (tmp_path / "vcheck.toml").write_text("")
    source = (EXAMPLE / "basement" / "gen-b10.toml").read_text()
    (tmp_path / "d.toml").write_text(source)
    designs, problems = load_designs(load_policy(tmp_path), ["d.toml"], tmp_path)
    if problems:  # a file the example names beside it: the test needs the design alone
        import pytest

        pytest.skip("gen-b10 needs files of the example folder")
    first = excitation_bands(designs[0])
    first.clear()
    again = excitation_bands(designs[0])
    assert again and again == excitation_bands(designs[0]) and again is not first
    assert len(excitation_bands(designs[0], (1.0, 2.0, 3.0))) == len(again) + 1

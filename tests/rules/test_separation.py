"""The frequency-separation rule: its margin arithmetic against hand calculation, and the
inputs it names rather than passing without them (the bundled example's designs)."""

from __future__ import annotations

from pathlib import Path

import pytest
from vcheck.rules.separation import FrequencySeparation, SeparationOptions, separation_margin

from vcheck.analysis import analyse
from vcheck.checking import load_designs
from vcheck.config import load_policy
from vcheck.findings import Status


def test_margin_arithmetic_by_hand():
    # Hand calculation of the definition (common practice: 0.8 <= f_n / f <= 1.2 avoided).
    assert separation_margin(20.0, 20.0, 25.0, 30.0) == pytest.approx((0.2, "below"))
    assert separation_margin(36.0, 36.0, 25.0, 30.0) == pytest.approx((0.2, "above"))
    assert separation_margin(24.0, 26.0, 25.0, 30.0) == (0.0, "inside")
    # a band that touches is inside
    assert separation_margin(20.0, 25.0, 25.0, 30.0) == (0.0, "inside")


def test_options_must_be_ordered():
    with pytest.raises(ValueError, match=r"warn-margin \(0.1\) must not be below required-margin \(0.2\)"):
        SeparationOptions(required_margin=0.2, warn_margin=0.1)


# ------------------------------------------------- verdicts that name what is missing

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "kestrel-yard"


def _example(relative: str):
    designs, problems = load_designs(load_policy(EXAMPLE), [relative], EXAMPLE)
    assert not problems
    return designs[0]


def _separation(design, **options):
    (finding,) = list(FrequencySeparation().check(design, SeparationOptions(**options)))
    return finding


def test_six_dof_genset_is_not_asked_for_its_rocking_modes():
    # GEN-B10 gives every mount: its six rigid-body modes (roll among them) are judged.
    finding = _separation(_example("basement/gen-b10.toml"))
    assert "rocking" not in finding.message
    assert "not considered" not in finding.message
    assert "roll" in finding.message


def test_one_dof_genset_warns_naming_the_mount_positions():
    # GEN-B2, a generator set on springs given by static deflection: bounce 3.15 Hz is
    # 74.8% below the half order, but its rocking modes are unknown.
    finding = _separation(_example("basement/gen-b2.toml"))
    assert finding.status is Status.WARN
    assert "not considered: rocking modes on the isolators (the machine is a " \
        "generator-set;" in finding.message
    assert any(a.startswith("give [[mounting.mount]] tables") for a in finding.advice)
    # the warning is not a separation problem: no advice to move the mode
    assert not any(a.startswith("to clear") for a in finding.advice)


def test_floor_modes_from_a_structure_file_count():
    # CHWP-3B stands on deck 3 bay C, whose structure file lists its modes.
    finding = _separation(_example("plant/level-3/chwp-3b.toml"))
    assert finding.status is Status.PASS
    assert "deck bay C" in finding.message


def test_hwp_3b_on_a_suspended_floor_without_its_modes_warns():
    finding = _separation(_example("plant/level-3/hwp-3b.toml"))
    assert finding.status is Status.WARN
    assert finding.message.endswith(
        "; not considered: the suspended-floor's own modes (none given; 9 m span)")
    # a policy that asks for floor modes only beyond 10 m lets the 9 m bay pass
    assert _separation(_example("plant/level-3/hwp-3b.toml"), flexible_span="10 m").status \
        is Status.PASS


def test_a_failure_stays_a_failure_and_still_names_the_gap():
    # SF-R3: the bounce is 9.3% below 1x at 300 rpm (a FAIL), on a roof with no modes given.
    finding = _separation(_example("roof/sf-r3.toml"))
    assert finding.status is Status.FAIL
    assert "not considered: the roof's own modes (none given; 7.2 m span)" in finding.message
    assert any(a.startswith("to clear 1x running speed") for a in finding.advice)
    # its drive-fed motor forces at 4 x 5.0-18.3 rev/s = 20.0-73.3 Hz, not at 100 Hz
    names = [row[2] for row in finding.table[1:]]
    assert "twice drive output frequency (4 poles)" in names
    assert not any(name.startswith("twice line frequency") for name in names)


def test_flexible_supports_must_be_support_kinds():
    with pytest.raises(ValueError, match=r"flexible-supports names unknown support kinds "
                       r"\['suspended-flor'\]; known: slab-on-grade, suspended-floor, roof, "
                       r"steel-frame, skid, foundation-block"):
        SeparationOptions(flexible_supports=("suspended-flor",))


GENSET = '''format = 1

[machine]
tag = "GEN-X"
kind = "generator-set"
mass = "1200 kg"
speed = "1500 rpm"
cylinders = 2
strokes = 4
driver = { kind = "engine" }

[support]
kind = "slab-on-grade"

[mounting]
kind = "rubber"
'''


def _design(tmp_path, text):
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "d.toml").write_text(text)
    designs, problems = load_designs(load_policy(tmp_path), ["d.toml"], tmp_path)
    assert not problems, [p.render() for p in problems]
    return designs[0]


def test_genset_reproduction_and_its_rocking_estimate(tmp_path):
    # The genset: four rubber mounts of 150.9 kN/m under 1200 kg, bounce
    # sqrt(4 x 150900 / 1200) / (2 pi) = 3.570 Hz [D], 71.4% below the half order 12.5 Hz.
    design = _design(tmp_path, GENSET + 'isolators = 4\nstiffness = "150.9 kN/m"\n'
                     'envelope = { x = "1.6 m", y = "0.8 m", z = "1.1 m" }\n')
    finding = _separation(design)
    assert finding.status is Status.WARN
    assert "3.57 Hz is 71.4% below half order" in finding.message
    words = finding.message.split("; estimate only, ")[1]
    band = words.split("rocking among them, at ")[1].split(" Hz")[0]
    low, high = (float(v) for v in band.split("-"))
    # Independent of the estimate's code path: the same layout written out as mounts
    # (corners of the 1.6 x 0.8 m footprint, CG 0.55 m above them, uniform-box inertia by
    # the loader's envelope) and solved by the six-DOF analysis, at both shear ratios.
    found = []
    for ratio in (0.25, 1.0):
        mounts = "".join(
            f'\n[[mounting.mount]]\nposition = {{ x = "{x} m", y = "{y} m", z = "0 m" }}\n'
            f'axial-stiffness = "150.9 kN/m"\nshear-stiffness = "{150.9 * ratio} kN/m"\n'
            for x, y in ((-0.8, 0.4), (0.8, 0.4), (-0.8, -0.4), (0.8, -0.4)))
        six = _design(tmp_path, GENSET + 'centre-of-gravity = { z = "0.55 m" }\n'
                      'envelope = { x = "1.6 m", y = "0.8 m", z = "1.1 m" }\n' + mounts)
        modes = [m for m in analyse(six).modes if m.is_isolation]
        found += [m.nominal for m in modes if "bounce" != m.name.split(", ")[-1]]
        # with every mount given, nothing is left out
        assert "not considered" not in _separation(six).message
    assert len(found) == 10
    # the estimate prints three significant figures
    assert low == pytest.approx(min(found), rel=5e-3)
    assert high == pytest.approx(max(found), rel=5e-3)


def test_flexible_span_in_the_policy_is_a_length(run_cli, tmp_path):
    (tmp_path / "vcheck.toml").write_text('[rules.frequency-separation]\nflexible-span = 6\n')
    (tmp_path / "d.toml").write_text(GENSET + 'isolators = 4\nstiffness = "150.9 kN/m"\n')
    ran = run_cli("check", "d.toml", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip().splitlines() == [
        "vcheck.toml:2:17: rules.frequency-separation.flexible-span: the number 6 has no unit; "
        "write a length such as \"25 mm\" or \"1.0 in\" (in quotes: \"6 m\"), got 6"]
    assert "Traceback" not in ran.err + ran.out

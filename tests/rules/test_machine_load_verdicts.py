"""Verdicts that rest on the machine's real loads, against independent calculations.

Each case is an invented design where the unit-force screen alone gave false comfort:

- a genset whose roll mode sits on the half order of its four-stroke cycle: a moment
  about the shaft (torque pulsation) at that band, judged by the worst mount force;
- a variable-speed fan whose unbalance sweeps a rigid-body mode: the peak found by the
  seeded search, against a dense sweep of 10^5 speeds of the same response;
- mounts with no damping across an excited mode: an unbounded response, a FAIL with the
  reason, never a crash;
- a rigidly mounted compressor whose data-sheet shaking force acts across its hold-down
  bolts: slip safety against hand arithmetic of VDI 2230's slip condition.

The independent calculations assemble the six-DOF matrices in the test and solve
(K (1 + 2 i zeta omega / omega_j) ... ) directly per frequency, or by hand formulas.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from vcheck.rules.isolation import IsolationEfficiency
from vcheck.rules.isolation_loads import load_results
from vcheck.rules.loosening import JointSlip, screen_joint

from vcheck.analysis import analyse
from vcheck.design.loader import attach_references, design_from_document, parse_toml_text
from vcheck.findings import Status


def design_of(text: str):
    design = design_from_document(parse_toml_text(text, "case.toml"))
    attach_references(design, ".", {})
    analyse(design)
    return design


def only(rule, design, **options):
    (finding,) = list(rule().check(design, rule.Options(**options)))
    return finding

def mounts(axial: str, shear: str) -> str:
    return "".join(
        f'\n[[mounting.mount]]\nposition = {{ x = "{x} mm", y = "{y} mm", z = "0 mm" }}\n'
        f'axial-stiffness = "{axial}"\nshear-stiffness = "{shear}"\n'
        for x in (-700, 0, 700) for y in (-380, 380))


def genset(damping="0.05", axial="420 kN/m", shear="252 kN/m", speed='"1500 rpm"'):
    return (
        'format = 1\n[machine]\ntag = "GEN-X"\nkind = "generator-set"\nmass = "1400 kg"\n'
        f'speed = {speed}\ncylinders = 2\nstrokes = 4\ndriver = {{ kind = "engine" }}\n'
        f'[mounting]\nkind = "rubber"\ndamping-ratio = {damping}\n'
        'centre-of-gravity = { x = "0 mm", y = "0 mm", z = "350 mm" }\n'
        'inertia = { xx = "95 kg*m^2", yy = "260 kg*m^2", zz = "240 kg*m^2" }\n'
        + mounts(axial, shear)
        + '[support]\nkind = "slab-on-grade"\n')


def direct_mount_forces(design, load6, frequency, zeta):
    """Mount forces by a direct complex solve written here: modal damping as the rule's
    model states it (C phi_j = 2 zeta / omega_j K phi_j), assembled from the mount list."""
    mounting = design.mounting
    cg = np.array(mounting.centre_of_gravity.as_tuple())
    m = design.machine.mass.value
    inertia = np.array(mounting.inertia.as_matrix())
    mass = np.zeros((6, 6))
    mass[:3, :3] = m * np.eye(3)
    mass[3:, 3:] = inertia
    blocks = []
    stiffness = np.zeros((6, 6))
    for mount in mounting.mount:
        r = np.array(mount.position.as_tuple()) - cg
        t = np.hstack([np.eye(3), -np.array([[0, -r[2], r[1]], [r[2], 0, -r[0]],
                                              [-r[1], r[0], 0]])])
        k = np.diag([mount.shear_stiffness.value, mount.shear_stiffness.value,
                     mount.axial_stiffness.value])  # upright: x, y shear; z axial
        blocks.append((t, k))
        stiffness += t.T @ k @ t
    lam, phi = np.linalg.eigh(np.linalg.solve(np.linalg.cholesky(mass), np.linalg.solve(
        np.linalg.cholesky(mass), stiffness).T))
    lower = np.linalg.cholesky(mass)
    phi = np.linalg.solve(lower.T, phi)
    omega_n = np.sqrt(lam)
    w = 2 * np.pi * frequency
    damping = phi @ np.diag(2 * zeta * omega_n) @ phi.T  # modal damping, mass-normalised
    damping = mass @ damping @ mass
    x = np.linalg.solve(stiffness + 1j * w * damping - w * w * mass, load6)
    forces = []
    for t, k in blocks:
        # the mount's share of the damping force, proportional to stiffness mode by mode
        share = sum(np.outer(k @ t @ phi[:, j], phi[:, j]) * (1 + 2j * zeta * w / omega_n[j])
                    for j in range(6)) @ mass
        forces.append(share @ x)
    return np.array(forces)


def ellipse(a):
    p, q = a.real, a.imag
    pp, qq, pq = p @ p, q @ q, p @ q
    return math.sqrt((pp + qq) / 2 + math.sqrt(((pp - qq) / 2) ** 2 + pq**2))


def test_roll_at_the_half_order_fails_with_the_worst_mount_force():
    design = design_of(genset())
    finding = only(IsolationEfficiency, design)
    assert finding.status is Status.FAIL
    # independent: a unit roll moment at 12.5 Hz by a direct solve; the worst mount's
    # force over the worst mount's force of the same moment applied statically
    roll = np.array([0, 0, 0, 1.0, 0, 0], complex)
    dynamic = direct_mount_forces(design, roll, 12.5, 0.05)
    static = direct_mount_forces(design, roll, 1e-9, 0.05)
    expected = max(ellipse(f) for f in dynamic) / max(ellipse(f) for f in static)
    row = next(r for r in finding.table if r[0] == "half order (four-stroke cycle)")
    # the band is one frequency, so the table's value is the ratio at 12.5 Hz (4 digits)
    assert float(row[3]) == pytest.approx(expected, rel=5e-4)
    assert expected > 5  # the roll resonance: far from the 0.15 a unit force reports
    assert f"is {float(row[3]):.2f} times what rigid mounting would pass" in finding.message


def test_undamped_mounts_across_an_excited_mode_fail_with_the_reason():
    # a drive range that sweeps the half order across the roll mode at 12.5 Hz
    design = design_of(genset(damping="0", speed='{ min = "1400 rpm", max = "1600 rpm" }'))
    finding = only(IsolationEfficiency, design)
    assert finding.status is Status.FAIL
    assert "unbounded" in " ".join(" ".join(r) for r in finding.table)


FAN = (
    'format = 1\n[machine]\ntag = "SF-X"\nkind = "fan"\nmass = "380 kg"\n'
    'speed = { min = "150 rpm", max = "1200 rpm" }\n'
    'rotor = { mass = "60 kg", balance-grade = "G6.3", position = { x = "350 mm", y = "0 mm", '
    'z = "600 mm" } }\n'
    '[mounting]\nkind = "spring"\ndamping-ratio = 0.02\n'
    'centre-of-gravity = { x = "0 mm", y = "0 mm", z = "450 mm" }\n'
    'envelope = { x = "1.4 m", y = "1.0 m", z = "1.1 m" }\n'
    + "".join(
        f'\n[[mounting.mount]]\nposition = {{ x = "{x} mm", y = "{y} mm", z = "0 mm" }}\n'
        'axial-stiffness = "90 kN/m"\nshear-stiffness = "60 kN/m"\n'
        for x in (-600, 600) for y in (-420, 420))
    + '[support]\nkind = "roof"\nspan = "6 m"\n')


def test_variable_speed_unbalance_peak_against_a_dense_sweep():
    from vcheck.dynamics.modes.rigid_mounts import mount_forced_response

    design = design_of(FAN)
    inst_finding = only(IsolationEfficiency, design)
    from vcheck.rules.isolation import _installation

    inst = _installation(design)
    (result,) = load_results(inst, analyse(design).loads, design.machine.speed)
    (load,) = analyse(design).loads.harmonic
    model = inst.models()[0]
    speeds = np.linspace(150 / 60, 1200 / 60, 100_001)
    response = mount_forced_response(
        model.mass_matrix, model.positions, model.stiffnesses,
        np.array(load.about(model.centre_of_gravity)), speeds,
        centre_of_gravity=model.centre_of_gravity, damping_ratio=0.02)
    scale = (speeds / (1200 / 60)) ** 2
    p, q = response.mount_forces.real, response.mount_forces.imag
    pp, qq, pq = (p * p).sum(-1), (q * q).sum(-1), (p * q).sum(-1)
    size = np.sqrt((pp + qq) / 2 + np.sqrt(((pp - qq) / 2) ** 2 + pq**2)) * scale[:, None]
    dense = size.max()
    assert result.mount_force >= dense * (1 - 1e-9)  # a sweep can only find less
    assert result.mount_force == pytest.approx(dense, rel=1e-4)
    # the peak is at a rigid-body mode low in the range, where a 49-point grid is coarse
    assert result.frequency < 0.3 * 1200 / 60
    assert f"at most {result.mount_force:.3g} N at mount" in inst_finding.message


RIGID = (
    'format = 1\n[machine]\ntag = "RC-X"\nkind = "reciprocating-compressor"\n'
    'mass = "1650 kg"\nspeed = "1480 rpm"\ncylinders = 2\n'
    '[[machine.load]]\nname = "primary shaking force, maker\'s data"\norder = 1\n'
    'force = {{ y = "{force}" }}\npoint = {{ x = "0 m", y = "0 m", z = "0 m" }}\n'
    '[mounting]\nkind = "rigid"\n[support]\nkind = "foundation-block"\n'
    '[[joint]]\nname = "skid hold-downs"\nfastener = "M16"\nproperty-class = "8.8"\n'
    'count = 4\ntightening = {{ method = "torque-wrench", torque = "206 N*m" }}\n'
    'clamp-length = "45 mm"\nclamps = "1650 kg"\nvibration = "3 mm/s"\n'
    'thread-friction = 0.12\nhead-friction = 0.12\n{extra}')


def test_a_shaking_force_across_the_hold_downs_makes_them_slip():
    quiet = design_of(RIGID.format(force="0.001 N", extra='machine-loads = "not-carried"\n'))
    loaded = design_of(RIGID.format(force="12 kN", extra=""))
    before = screen_joint(quiet, 0)
    after = screen_joint(loaded, 0)
    assert before.slip_safety > 10  # the inertial load alone: clamped mass x 3 mm/s
    # VDI 2230 slip condition by hand: capacity n q mu F_K over the transverse load
    capacity = 4 * 1 * after.friction_interface * after.residual_clamp
    transverse = 1650 * after.load.acceleration + 12000.0
    assert after.slip_safety == pytest.approx(capacity / transverse, rel=1e-9)
    assert after.slip_safety < 1.8  # VDI 2230: 1.8 under alternating transverse load
    finding = next(f for f in JointSlip().check(loaded, JointSlip.Options())
                   if f.key_path == "joint[1]")
    assert finding.status is Status.FAIL
    assert "+ 12 kN from the machine's own loads" in finding.message


ONE_DOF = (
    'format = 1\n[machine]\ntag = "F-1"\nkind = "fan"\nmass = "400 kg"\n'
    'speed = {speed}\n'
    '[[machine.load]]\nname = "roll pulse"\norder = 2\nmoment = {{ x = "100 N*m" }}\n'
    '[mounting]\nkind = "spring"\nisolators = 4\nstiffness = "80 kN/m +-10%"\n'
    'damping-ratio = {damping}\n[support]\nkind = "slab-on-grade"\n')


def test_a_moment_the_one_dof_model_cannot_take_is_named_and_never_passes():
    # 4 x 80 kN/m under 400 kg: f_n = 4.50 Hz; 1500 rpm: ratio 5.6, efficiency 97% by the
    # closed form, which would pass on its own
    design = design_of(ONE_DOF.format(speed='"1500 rpm"', damping="0.05"))
    finding = only(IsolationEfficiency, design)
    assert finding.status is Status.WARN
    assert ("not judged by the one-degree-of-freedom model: roll pulse (its moment of 100 "
            "N*m): give [[mounting.mount]] tables") in finding.message
    row = next(r for r in finding.table if r[0] == "load: roll pulse")
    assert row[3:] == ("not judged", "not judged", "no: a moment",
                       "a moment: needs the six-DOF model")


def test_undamped_one_dof_across_resonance_is_unbounded_not_a_crash():
    design = design_of(ONE_DOF.format(speed='{ min = "100 rpm", max = "1500 rpm" }',
                                      damping="0"))
    finding = only(IsolationEfficiency, design)
    assert finding.status is Status.FAIL
    assert "at that band has no bound without damping" in finding.message


def test_a_load_far_outside_the_machine_warns():
    text = FAN.replace('[support]', '[[machine.load]]\nname = "misplaced"\n'
                       'frequency = "30 Hz"\nforce = { z = "10 N" }\npoint = { x = "40 m" }\n'
                       '[support]')
    design = design_of(text)
    finding = only(IsolationEfficiency, design)
    assert finding.status in (Status.WARN, Status.FAIL)
    assert "misplaced acts at (40, 0, 0) m" in finding.message
    assert any("point of action" in a for a in finding.advice)


PATTERN = (
    'format = 1\n[machine]\ntag = "P-1"\nkind = "compressor"\nmass = "500 kg"\n'
    'speed = "1500 rpm"\n'
    '[[machine.load]]\nname = "stated"\norder = 1\n{load}\n'
    '[mounting]\nkind = "rigid"\n[support]\nkind = "foundation-block"\n'
    '[[joint]]\nname = "feet"\nfastener = "M16"\nproperty-class = "8.8"\ncount = 4\n'
    'tightening = {{ method = "torque-wrench", torque = "200 N*m" }}\nclamps = "500 kg"\n'
    'vibration = "1 mm/s"\nmachine-loads = "carried"\n{positions}\n')
BOLTS = ('bolt-positions = [{ x = "-400 mm", y = "-300 mm" }, { x = "400 mm", y = "-300 mm" }, '
         '{ x = "-400 mm", y = "300 mm" }, { x = "400 mm", y = "300 mm" }]')


@pytest.mark.parametrize("load, across, tension", [
    # a force across the plane, shared equally: 4 x F / 4 (statics)
    ('force = { y = "2 kN" }', 2000.0, 0.0),
    # a force along the bolts: F / 4 tension in each
    ('force = { z = "2 kN" }', 0.0, 500.0),
    # a twisting moment about the bolt axis on a 4-bolt rectangle: each bolt at r = 0.5 m
    # carries M r / sum r^2 = M / (4 r) across (elastic bolt-group method, common practice);
    # the joint total that gives that share is 4 x M / (4 r) = M / r
    ('moment = { z = "1 kN*m" }', 1000.0 / 0.5, 0.0),
    # a bending moment about x: bolts at y = +-0.3 m, tension M y / sum y^2 = M / (4 x 0.3)
    ('moment = { x = "1.2 kN*m" }', 0.0, 1200.0 / (4 * 0.3)),
    # a force across at height 0.5 m above the bolt plane: its overturning moment F h about
    # x is carried as bolt tension F h / (4 x 0.3), the force itself across
    ('force = { y = "1 kN" }\npoint = { z = "500 mm" }', 1000.0, 1000.0 * 0.5 / (4 * 0.3)),
])
def test_machine_loads_shared_by_the_bolt_pattern_by_hand(load, across, tension):
    from vcheck.rules.loosening import machine_load_at_joint

    design = design_of(PATTERN.format(load=load, positions=BOLTS))
    shared = machine_load_at_joint(design, design.joint[0])
    assert shared.transverse_alternating == pytest.approx(across, rel=1e-12, abs=1e-9)
    assert shared.axial_alternating == pytest.approx(tension, rel=1e-12, abs=1e-9)
    assert not shared.unshared


def test_a_moment_without_bolt_positions_is_named_and_never_passes():
    design = design_of(PATTERN.format(load='moment = { z = "10 N*m" }', positions=""))
    finding = next(f for f in JointSlip().check(design, JointSlip.Options())
                   if f.key_path == "joint[1]")
    assert finding.status is Status.WARN  # the slip safety alone would pass
    assert ("not shared among the bolts for want of bolt-positions: the moment of stated "
            "(0.01 kN*m)") in finding.message


def test_passage_fails_a_fixed_speed_just_off_a_rigid_body_mode():
    # The reproduction (invented): the two-cylinder genset with its mounts given;
    # its roll mode lies within a fraction of a per cent of the half order 12.5 Hz, which
    # used to pass as "not on" the mode. Within 20% of a rigid-body mode: FAIL (the
    # separation margin of ACI 351.3R, from memory).
    from vcheck.rules.isolation import ResonancePassage

    design = design_of(genset())
    roll = [m for m in analyse(design).modes if m.is_isolation and "roll" in m.name]
    nearest = min(roll, key=lambda m: abs(m.nominal - 12.5))
    assert abs(nearest.nominal - 12.5) / 12.5 < 0.2
    found = only(ResonancePassage, design)
    assert found.status is Status.FAIL
    assert "half order (four-stroke cycle) 12.5 Hz" in found.message

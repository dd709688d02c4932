"""The isolation rules: their arithmetic against independent hand calculation, and bad input.

The hand calculations are written out here in plain Python, not with vcheck's functions:

- viscous transmissibility T = sqrt((1 + (2 zeta r)^2) / ((1 - r^2)^2 + (2 zeta r)^2)) and
  hysteretic T = sqrt((1 + eta^2) / ((1 - r^2)^2 + eta^2)): W. T. Thomson, M. D. Dahleh,
  Theory of Vibration with Applications, 5th ed., 1998, ch. 3, and Crede & Ruzicka in
  Harris' Shock and Vibration Handbook (both from memory); check values in
  shared/REFERENCES.md are tagged [D];
- spring-mass natural frequency f_n = sqrt(k / m) / (2 pi) (Thomson & Dahleh sec. 2.1);
- permissible residual unbalance U = G m / Omega and its force F = U Omega^2, ISO 21940-11
  (from memory; shared/REFERENCES.md [D]: G6.3, 100 kg, 3000 rpm -> 2005 g mm).

Tolerances: where the rule rounds a measured value to 6 decimals the check allows 1e-6;
values printed in messages are checked at their printed precision. Closed forms against
closed forms are checked at 1e-9 relative (rounding only).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from vcheck.rules.isolation import (
    IsolationEfficiency,
    IsolationOptions,
    IsolatorDamping,
    IsolatorStaticDeflection,
    ResonancePassage,
    StaticDeflectionOptions,
    worst_transmissibility,
)

from vcheck.analysis import analyse
from vcheck.design.loader import attach_references, design_from_document, parse_toml_text
from vcheck.findings import Status

G = 9.80665  # standard gravity, m/s^2 (3rd CGPM, 1901)


def t_viscous(r: float, zeta: float) -> float:
    """Hand formula (Thomson & Dahleh ch. 3, from memory)."""
    d = (2 * zeta * r) ** 2
    return math.sqrt((1 + d) / ((1 - r * r) ** 2 + d))


def t_hysteretic(r: float, eta: float) -> float:
    """Hand formula (Crede & Ruzicka, structural damping, from memory)."""
    return math.sqrt((1 + eta * eta) / ((1 - r * r) ** 2 + eta * eta))


def fn_spring_mass(k: float, m: float) -> float:
    return math.sqrt(k / m) / (2 * math.pi)


def design_of(text: str, tmp_path=None):
    document = parse_toml_text(text, "case.toml")
    design = design_from_document(document)
    attach_references(design, tmp_path or ".", {})
    analyse(design)
    return design


def only(rule, design, **options):
    (finding,) = list(rule().check(design, rule.Options(**options)))
    return finding


def machine(kind="fan", mass="400 kg", speed='"1500 rpm"', extra=""):
    return (f'format = 1\n[machine]\ntag = "T-1"\nkind = "{kind}"\nmass = "{mass}"\n'
            f"speed = {speed}\n{extra}\n")


def springs(isolators=4, stiffness="80 kN/m", extra=""):
    return (f'[mounting]\nkind = "spring"\nisolators = {isolators}\n'
            f'stiffness = "{stiffness}"\n{extra}\n')


# ------------------------------------------------------------ transmissibility helpers


def test_worst_transmissibility_against_the_closed_form():
    # shared/REFERENCES.md [D]: r = 3 -> 0.13041 (zeta 0.05), r = 2 -> 0.33918, r = 1 ->
    # 10.050; peak for zeta 0.05 at r = 0.99752, T = 10.0622. Printed to 5 figures: 1e-4.
    damping = IsolatorDamping("viscous", 0.05, True)
    assert worst_transmissibility(3.0, 4.0, damping) == pytest.approx((0.13041, 3.0), rel=1e-4)
    assert worst_transmissibility(2.0, 3.0, damping)[0] == pytest.approx(0.33918, rel=1e-4)
    # the band starts above the peak: its lower end governs, here r = 1 -> 10.050
    assert worst_transmissibility(1.0, 1.5, damping)[0] == pytest.approx(10.050, rel=1e-4)
    # the band ends below the peak: its upper end governs
    assert worst_transmissibility(0.5, 0.9, damping)[0] == pytest.approx(t_viscous(0.9, 0.05),
                                                                         rel=1e-9)
    # the band holds the peak
    assert worst_transmissibility(0.9, 1.2, damping) == pytest.approx((10.0622, 0.99752),
                                                                       rel=1e-4)
    # and against the hand formula at a point, to rounding
    assert worst_transmissibility(2.7, 2.7, damping)[0] == pytest.approx(t_viscous(2.7, 0.05),
                                                                         rel=1e-9)


def test_hysteretic_damping_against_the_closed_form():
    damping = IsolatorDamping("hysteretic", 0.1, True)
    assert worst_transmissibility(3.0, 5.0, damping)[0] == pytest.approx(t_hysteretic(3, 0.1),
                                                                         rel=1e-9)
    # the hysteretic peak is at r = 1 exactly: sqrt(1 + eta^2) / eta
    assert damping.peak() == pytest.approx((1.0, math.sqrt(1.01) / 0.1), rel=1e-12)
    # the modal damping ratio equivalent at resonance is eta / 2 (Harris, from memory)
    assert damping.modal_damping_ratio == pytest.approx(0.05)


def test_unbalance_force_converts_speed_in_hz_to_angular_speed():
    # ISO 21940-11 (from memory), shared/REFERENCES.md [D]: G6.3, 100 kg, 3000 rpm ->
    # U = 9549 G m / n = 2005 g mm; F = U Omega^2 = m G Omega with Omega = 2 pi 50 rad/s
    # = 197.92 N. Treating 50 Hz as 50 rad/s would give 31.5 N.
    design = design_of(machine(speed='"3000 rpm"',
                               extra='rotor = { mass = "100 kg", balance-grade = "G6.3" }')
                       + springs())
    rotor, speed = design.machine.rotor, design.machine.speed
    assert speed.max.value == pytest.approx(50.0)  # rev/s
    omega = 2 * math.pi * 3000 / 60
    unbalance = 0.0063 * 100 / omega
    assert unbalance * 1e6 == pytest.approx(2005, abs=0.5)  # g mm
    # the rules read the unbalance from the design's machine loads (vcheck.machine_loads)
    (load,) = analyse(design).loads.harmonic
    assert load.reference_speed == speed.max.value and rotor.balance_grade == "G6.3"
    force = load.force_amplitude * load.scale_at(50.0)
    assert force == pytest.approx(unbalance * omega**2, rel=1e-12)
    assert force == pytest.approx(197.92, abs=0.01)
    assert force != pytest.approx(0.0063 * 100 * 50, rel=0.5)
    # the unbalance is fixed by the grade at the maximum speed; at half speed, F / 4
    assert load.force_amplitude * load.scale_at(25.0) == pytest.approx(force / 4, rel=1e-12)


def test_one_dof_transmitted_force_by_hand():
    # 4 x 80 kN/m under 400 kg: f_n = 4.5016 Hz; 1500 rpm = 25 Hz; zeta 0.05.
    design = design_of(
        machine(speed='"1500 rpm"', extra='rotor = { mass = "40 kg", balance-grade = "G6.3" }')
        + springs(extra="damping-ratio = 0.05") + '[support]\nkind = "slab-on-grade"\n')
    found = only(IsolationEfficiency, design)
    r = 25.0 / fn_spring_mass(320e3, 400.0)
    force = 40 * 0.0063 * 2 * math.pi * 25.0  # m G Omega at the maximum speed
    transmitted = t_viscous(r, 0.05) * force
    assert (f"unbalance (G6.3, 40 kg rotor): at most {transmitted:.3g} N through the "
            f"isolators (at 25.0 Hz) against {force:.3g} N with rigid mounting") in found.message
    assert found.table[-1][0] == "load: unbalance (G6.3, 40 kg rotor)"
    assert found.table[-1][-1] == f"{transmitted:.3g} N (rigid {force:.3g} N)"


# ---------------------------------------------------------------------- efficiency


def test_efficiency_and_ratio_of_one_dof_design_in_its_worst_case():
    # Stiffness 80 kN/m +-10% and mass 400 kg +-5%: the worst case for the ratio is the
    # stiffest isolators (88 kN/m) with the lightest mass (380 kg).
    design = design_of(machine(mass="400 kg +-5%", speed='"1500 rpm"')
                       + springs(stiffness="80 kN/m +-10%", extra="damping-ratio = 0.02")
                       + '[support]\nkind = "slab-on-grade"\n')
    found = only(IsolationEfficiency, design)
    fn_high = fn_spring_mass(4 * 88e3, 380.0)
    r = 25.0 / fn_high
    assert found.status is Status.PASS
    assert found.measured.value == pytest.approx(1 - t_viscous(r, 0.02), abs=1e-6)
    assert found.limit.value == 0.80  # slab on grade, common practice (from memory)
    assert f"frequency ratio {r:.2f} at 1x running speed 25.0 Hz" in found.message
    assert "at the stiffest within tolerance" in found.message


def test_loss_factor_uses_the_hysteretic_closed_form():
    # Elastomer pads with loss factor 0.15, rated 5 mm under the compressor:
    # f_n = sqrt(g / 0.005) / (2 pi) = 7.048 Hz; 2980 rpm = 49.67 Hz.
    design = design_of(machine(kind="compressor", mass="2100 kg", speed='"2980 rpm"')
                       + '[mounting]\nkind = "pad"\nisolators = 6\nstatic-deflection = "5 mm"\n'
                         'loss-factor = 0.15\n[support]\nkind = "slab-on-grade"\n')
    found = only(IsolationEfficiency, design)
    r = (2980 / 60) / (math.sqrt(G / 0.005) / (2 * math.pi))
    assert found.measured.value == pytest.approx(1 - t_hysteretic(r, 0.15), abs=1e-6)
    assert "isolator damping: loss factor 0.15 as stated" in found.assumptions
    peak = only(ResonancePassage, design).measured.value
    assert peak == pytest.approx(math.sqrt(1 + 0.15**2) / 0.15, abs=1e-6)


def test_governing_frequency_is_the_lowest_band_edge_over_the_speed_range():
    # A variable-speed fan: 1x from 600 rpm = 10 Hz is the lowest forcing; 2x starts at
    # 20 Hz and blade pass (6 blades) at 60 Hz. f_n = 4.5016 Hz -> r = 2.2214.
    design = design_of(machine(speed='{ min = "600 rpm", max = "1500 rpm" }', extra="blades = 6")
                       + springs(extra="damping-ratio = 0.0")
                       + '[support]\nkind = "slab-on-grade"\n')
    found = only(IsolationEfficiency, design, stiffness_allowance=0.0)
    fn = fn_spring_mass(320e3, 400.0)
    r = 10.0 / fn
    assert "frequency ratio 2.22 at 1x running speed 10.0 Hz at the bottom of the speed " \
           "range (the lowest forcing)" in found.message
    # every band is in the table, with its worst efficiency (undamped: 1 - 1 / (r^2 - 1))
    rows = {row[0]: row for row in found.table[1:]}
    assert set(rows) == {"1x running speed", "2x running speed", "blade pass (6 blades)"}
    assert rows["1x running speed"][4] == f"{1 - 1 / (r * r - 1):.1%}"
    assert rows["2x running speed"][4] == f"{1 - 1 / ((2 * r) ** 2 - 1):.1%}"
    assert rows["blade pass (6 blades)"][4] == f"{1 - 1 / ((6 * r) ** 2 - 1):.1%}"
    # judged: the worst, which is the governing band here: 1 - 1 / (r^2 - 1) = 74.7% < 80%
    assert found.status is Status.FAIL
    assert found.measured.value == pytest.approx(1 - 1 / (r * r - 1), abs=1e-6)


def test_half_order_of_a_four_stroke_engine_governs():
    # 1500 rpm, four-stroke: the half order 12.5 Hz is below 1x 25 Hz.
    design = design_of(machine(kind="generator-set", mass="5400 kg",
                               extra="cylinders = 12\nstrokes = 4")
                       + '[mounting]\nkind = "spring"\nisolators = 8\n'
                         'static-deflection = "25 mm"\n[support]\nkind = "slab-on-grade"\n')
    found = only(IsolationEfficiency, design)
    fn = math.sqrt(G / 0.025) / (2 * math.pi)  # 3.152 Hz from the static deflection
    assert f"frequency ratio {12.5 / fn:.2f} at half order (four-stroke cycle) 12.5 Hz" \
        in found.message


def test_advice_is_computed_from_the_requirement():
    # Undamped (zeta = 0 stated), 4 x 80 kN/m under 400 kg: f_n = 4.5016 Hz. Span 5 m:
    # 90% required. The closed form r = sqrt((2 - E) / (1 - E)) = sqrt(11) = 3.3166 for
    # E = 0.9 (above the 1.768 margin). Lowest forcing 1x at 400 rpm = 6.667 Hz.
    design = design_of(machine(speed='{ min = "400 rpm", max = "1500 rpm" }')
                       + springs(extra="damping-ratio = 0.0")
                       + '[support]\nkind = "suspended-floor"\nspan = "5 m"\n')
    found = only(IsolationEfficiency, design)
    fn = fn_spring_mass(320e3, 400.0)
    r_needed = math.sqrt(11.0)
    fn_target = (400 / 60) / r_needed
    k_each = (2 * math.pi * fn_target) ** 2 * 400 / 4
    deflection = G / (2 * math.pi * fn_target) ** 2
    base = 320e3 / (2 * math.pi * fn_target) ** 2 - 400
    speed_full = r_needed * fn * 60
    speed_clear = math.sqrt(2) * 1.25 * fn * 60
    assert found.status is Status.FAIL
    text = " | ".join(found.advice)
    assert f"at most {k_each / 1000:.3g} kN/m each" in text
    assert f"a static deflection of at least {deflection * 1000:.4g} mm" in text
    assert f"isolation frequency to {fn_target:.2f} Hz or below" in text
    assert f"an inertia base of at least {base:.0f} kg" in text
    assert f"{base / 400:.1f} times the machine's mass" in text
    assert f"minimum speed to at least {speed_full:.0f} rpm (now 400 rpm)" in text
    assert f"{speed_clear:.0f} rpm clears the amplification zone" in text


def test_six_dof_decoupled_layout_equals_the_one_dof_closed_form():
    # Four mounts at x = +-0.5 m, y = +-0.4 m, z = 0, with the centre of gravity in their
    # plane and the inertia principal: bounce, sway, roll, pitch and yaw decouple
    # (Harris ch. 3, from memory), so by hand:
    #   bounce f = sqrt(4 * 100e3 / 500) / 2 pi = 4.502 Hz, sway sqrt(4 * 50e3 / 500) /
    #   2 pi = 3.183 Hz, roll sqrt(4 * 100e3 * 0.4^2 / 50) / 2 pi = 5.694 Hz (the highest),
    #   pitch sqrt(4 * 100e3 * 0.5^2 / 80) / 2 pi = 5.627 Hz,
    #   yaw sqrt(4 * 50e3 * (0.5^2 + 0.4^2) / 100) / 2 pi = 4.557 Hz.
    # A unit force at the centre of gravity vertically is carried by bounce, across the
    # shaft by sway: T = max(T(f / f_bounce), T(f / f_sway)). A rotating unbalance
    # F (cos wt along y + sin wt along z) reaches the structure as F (H_sway y - i H_bounce z)
    # with the complex ratio H = (1 + 2 i zeta r) / (1 - r^2 + 2 i zeta r), and each mount
    # as a quarter of it; its largest length over a cycle is found here by sampling.
    mounts = "".join(
        f'[[mounting.mount]]\nposition = {{ x = "{x} mm", y = "{y} mm", z = "0 mm" }}\n'
        'axial-stiffness = "100 kN/m"\nshear-stiffness = "50 kN/m"\n'
        for x in (-500, 500) for y in (-400, 400))
    text = (machine(kind="centrifugal-pump", mass="500 kg", speed='"1480 rpm"',
                    extra='rotor = { mass = "60 kg", balance-grade = "G6.3" }')
            + '[mounting]\nkind = "spring"\ndamping-ratio = 0.05\n'
              'centre-of-gravity = { x = "0 mm", y = "0 mm", z = "0 mm" }\n'
              'inertia = { xx = "50 kg*m^2", yy = "80 kg*m^2", zz = "100 kg*m^2" }\n'
            + mounts + '[support]\nkind = "suspended-floor"\nspan = "5 m"\n')
    design = design_of(text)
    f = 1480 / 60
    f_bounce, f_sway = fn_spring_mass(400e3, 500), fn_spring_mass(200e3, 500)
    f_roll = math.sqrt(4 * 100e3 * 0.16 / 50) / (2 * math.pi)
    t = max(t_viscous(f / f_bounce, 0.05), t_viscous(f / f_sway, 0.05))
    found = only(IsolationEfficiency, design)
    assert f"frequency ratio {f / f_roll:.2f}" in found.message
    assert f"the highest rigid-body mode {f_roll:.2f} Hz" in found.message
    force = 60 * 0.0063 * 2 * math.pi * f

    def h(r, zeta=0.05):
        return (1 + 2j * zeta * r) / (1 - r * r + 2j * zeta * r)

    wt = np.linspace(0, 2 * np.pi, 100001)
    total = force * np.hypot(np.real(h(f / f_sway) * np.exp(1j * wt)),
                             np.real(-1j * h(f / f_bounce) * np.exp(1j * wt))).max()
    per_mount = total / 4
    # With rigid mounting each mount would carry a quarter of the rotating force, whose
    # length is the force itself at every instant: the unbalance's own transmissibility is
    # total / force, a little above max(T) because the two directions are out of phase.
    # The worst of the bands (unit forces) and the load is judged.
    assert found.measured.value == pytest.approx(1 - max(t, total / force), abs=1e-6)
    assert total / force > t
    assert (f"at most {per_mount:.3g} N at mount 1 (at {f:.1f} Hz; {total:.3g} N in all) "
            f"against {force / 4:.3g} N at the worst mount with rigid mounting") in found.message
    assert found.table[-1][-1] == f"{per_mount:.3g} N at mount 1 (rigid {force / 4:.3g} N)"


def test_stiffness_allowance_warns_and_zero_turns_it_off():
    # The warn case of the rule cases: E = 82.9% at the stated stiffness, 79.8% with 15%.
    design = design_of(machine(kind="centrifugal-pump", mass="200 kg")
                       + springs(stiffness="180 kN/m") + '[support]\nkind = "slab-on-grade"\n')
    r = 25.0 / fn_spring_mass(720e3, 200)
    assert only(IsolationEfficiency, design).status is Status.WARN
    assert 1 - t_viscous(r, 0.005) > 0.8 > 1 - t_viscous(r / math.sqrt(1.15), 0.005)
    assert only(IsolationEfficiency, design, stiffness_allowance=0.0).status is Status.PASS


def test_required_efficiency_precedence():
    design = design_of(machine(kind="centrifugal-pump", mass="500 kg", speed='"1800 rpm"')
                       + springs(stiffness="50 kN/m", extra="damping-ratio = 0.05")
                       + '[support]\nkind = "slab-on-grade"\n')

    def limit(**options):
        return only(IsolationEfficiency, design, **options).limit.value

    assert limit() == 0.80
    assert limit(required_efficiency_by_floor={"slab-on-grade": 0.85}) == 0.85
    assert limit(required_efficiency=0.7, required_efficiency_by_floor={"slab-on-grade": 0.85}) \
        == 0.7
    assert limit(required_efficiency=0.7,
                 required_efficiency_by_machine={"centrifugal-pump": 0.75}) == 0.75


def test_unknown_span_takes_the_longest_class_and_says_so():
    design = design_of(machine() + springs(extra="damping-ratio = 0.05")
                       + '[support]\nkind = "roof"\n')
    found = only(IsolationEfficiency, design)
    assert found.limit.value == 0.95
    assert any("the floor span is not given (support kind 'roof')" in a
               for a in found.assumptions)


def test_default_damping_is_an_assumption_with_its_source():
    design = design_of(machine() + '[mounting]\nkind = "rubber"\nisolators = 4\n'
                       'stiffness = "400 kN/m"\n[support]\nkind = "slab-on-grade"\n')
    found = only(IsolationEfficiency, design)
    assert ("isolator damping: damping ratio 0.05, the default for natural rubber or neoprene "
            "(Harris' Shock and Vibration Handbook, 6th ed., from memory)") in found.assumptions


# ------------------------------------------------------------------ static deflection


def test_static_deflection_by_hand_in_the_worst_case():
    # 4 isolators of 50 kN/m +-10% under 500 kg +-5% with a 100 kg base: the least
    # deflection is (475 + 100) kg * g / (4 * 55 kN/m) = 25.63 mm.
    design = design_of(machine(kind="centrifugal-pump", mass="500 kg +-5%")
                       + springs(stiffness="50 kN/m +-10%", extra='base-mass = "100 kg"')
                       + '[support]\nkind = "slab-on-grade"\n')
    found = only(IsolatorStaticDeflection, design)
    assert found.measured.value == pytest.approx(575 * G / 220e3 * 1000, abs=1e-6)
    assert found.limit.value == pytest.approx(0.75 * 25.4, abs=1e-9)  # 0.75 in, from memory


def test_six_dof_static_deflection_by_hand():
    # Four equal mounts, the centre of gravity over their centre: each deflects
    # W / (4 k) = 500 * g / 400e3 = 12.26 mm (the model's static solution at 0 Hz).
    mounts = "".join(
        f'[[mounting.mount]]\nposition = {{ x = "{x} mm", y = "{y} mm", z = "0 mm" }}\n'
        'axial-stiffness = "100 kN/m"\nshear-stiffness = "50 kN/m"\n'
        for x in (-500, 500) for y in (-400, 400))
    design = design_of(machine(kind="centrifugal-pump", mass="500 kg")
                       + '[mounting]\nkind = "spring"\n'
                         'centre-of-gravity = { x = "0 mm", y = "0 mm", z = "300 mm" }\n'
                         'envelope = { x = "1.2 m", y = "1 m", z = "0.8 m" }\n'
                       + mounts + '[support]\nkind = "slab-on-grade"\n')
    found = only(IsolatorStaticDeflection, design)
    assert found.measured.value == pytest.approx(500 * G / 400e3 * 1000, abs=1e-6)
    assert found.status is Status.FAIL  # 12.26 mm < 19.05 mm (pump on grade, from memory)


def test_floor_deflection_factor_is_an_option():
    design = design_of(machine(kind="centrifugal-pump", mass="500 kg")
                       + '[mounting]\nkind = "spring"\nisolators = 4\n'
                         'static-deflection = "25 mm"\n'
                         '[support]\nkind = "suspended-floor"\nspan = "5 m"\n'
                         'floor-deflection = "2 mm"\n')
    assert only(IsolatorStaticDeflection, design).status is Status.PASS  # 25 >= 10 x 2
    found = only(IsolatorStaticDeflection, design, floor_deflection_factor=15.0)
    assert found.status is Status.FAIL and found.limit.value == pytest.approx(30.0)


# ------------------------------------------------------------------ resonance passage


def test_resonance_peak_by_an_independent_search():
    # Independent numerical method: the largest T on a dense grid of r (step 1e-6 near 1)
    # from the hand formula; the grid's spacing limits the agreement to ~1e-9 relative.
    design = design_of(machine() + springs(extra="damping-ratio = 0.03")
                       + '[support]\nkind = "slab-on-grade"\n')
    found = only(ResonancePassage, design)
    r = np.arange(0.9, 1.1, 1e-6)
    d = (2 * 0.03 * r) ** 2
    peak = float(np.sqrt((1 + d) / ((1 - r * r) ** 2 + d)).max())
    assert found.measured.value == pytest.approx(peak, abs=1e-6)  # rounded to 6 decimals
    assert found.status is Status.WARN  # about 16.7 > 15


def test_motion_at_resonance_from_the_unbalance_by_hand():
    # At r = 1 the machine moves U / M / (2 zeta) (Thomson & Dahleh ch. 3, rotating
    # unbalance, from memory): G2.5, 30 kg rotor, 1500 rpm, 400 kg, zeta 0.05.
    design = design_of(machine(extra='rotor = { mass = "30 kg", balance-grade = "G2.5" }')
                       + springs(extra="damping-ratio = 0.05")
                       + '[support]\nkind = "slab-on-grade"\n')
    found = only(ResonancePassage, design)
    unbalance = 0.0025 * 30 / (2 * math.pi * 25.0)
    motion = unbalance / 400 / (2 * 0.05)
    assert f"({unbalance * 1e6:.0f} g mm) moves the machine about {motion * 1000:.2g} mm" \
        in found.message


def test_dwell_advice_locks_out_the_speeds_below_sqrt2_fn():
    design = design_of(machine(speed='{ min = "200 rpm", max = "1200 rpm" }')
                       + springs(extra="damping-ratio = 0.02")
                       + '[support]\nkind = "slab-on-grade"\n')
    found = only(ResonancePassage, design)
    assert found.status is Status.FAIL
    clear = math.sqrt(2) * fn_spring_mass(320e3, 400) * 60
    assert f"lock out speeds up to {clear:.0f} rpm" in found.advice[0]


def test_a_fixed_speed_at_resonance_fails_without_speed_advice():
    # 4 x 80 kN/m +-10% under 400 kg: f_n from 4.27 to 4.72 Hz holds 270 rpm = 4.5 Hz.
    design = design_of(machine(speed='"270 rpm"')
                       + springs(stiffness="80 kN/m +-10%", extra="damping-ratio = 0.05")
                       + '[support]\nkind = "slab-on-grade"\n')
    found = only(ResonancePassage, design)
    assert found.status is Status.FAIL
    assert "the machine runs at the isolation resonance" in found.message
    low, high = fn_spring_mass(288e3, 400), fn_spring_mass(352e3, 400)
    assert f"({low:.2f}-{high:.2f} Hz)" in found.message
    assert found.advice == (f"change the isolators so that the isolation frequency lies below "
                            f"{4.5 / math.sqrt(2):.2f} Hz",)


def test_machines_without_isolators_are_reported_once():
    design = design_of(machine() + '[mounting]\nkind = "rigid"\n')
    assert only(IsolationEfficiency, design).status is Status.NOT_CHECKED
    assert list(IsolatorStaticDeflection().check(design, StaticDeflectionOptions())) == []
    assert list(ResonancePassage().check(design, ResonancePassage.Options())) == []


# ------------------------------------------------------------------------ bad input


def _write(tmp_path, text, policy=None):
    (tmp_path / "d.toml").write_text(text)
    if policy is not None:
        (tmp_path / "vcheck.toml").write_text(policy)


BASE = machine() + springs()


@pytest.mark.parametrize(
    ("extra", "expected"),
    [
        ("damping-ratio = 1.0",
         "d.toml:12:17: mounting.damping-ratio: should be less than 1, got 1.0"),
        ("damping-ratio = -0.1",
         "d.toml:12:17: mounting.damping-ratio: should be greater than or equal to 0, got -0.1"),
        ("damping-ratio = 0.05\nloss-factor = 0.1",
         "d.toml:8:1: mounting: give 'damping-ratio' (viscous, e.g. 0.05) or 'loss-factor' "
         "(hysteretic, e.g. 0.1), not both"),
    ],
)
def test_bad_damping_is_located(run_cli, tmp_path, extra, expected):
    _write(tmp_path, machine() + springs(extra=extra))
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == expected
    assert "Traceback" not in ran.err


def test_unknown_balance_grade_lists_the_valid_ones(run_cli, tmp_path):
    _write(tmp_path, machine(extra='rotor = { mass = "40 kg", balance-grade = "G7" }')
           + springs())
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == (
        "d.toml:7:9: machine.rotor: unknown balance quality grade 'G7'; valid grades are "
        "G4000, G1600, G630, G250, G100, G40, G16, G6.3, G2.5, G1, G0.4")


def test_isolators_without_stiffness_or_deflection(run_cli, tmp_path):
    _write(tmp_path, machine() + '[mounting]\nkind = "spring"\nisolators = 4\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == ("d.toml:8:1: mounting: isolators need 'stiffness' (each, e.g. "
                               "\"180 kN/m\") or 'static-deflection' (e.g. \"25 mm\")")


def test_floor_deflection_and_stiffness_are_exclusive(run_cli, tmp_path):
    _write(tmp_path, BASE + '[support]\nkind = "roof"\nfloor-deflection = "1 mm"\n'
                            'floor-stiffness = "40000 kN/m"\n')
    ran = run_cli("check", "d.toml", "--format", "json", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.strip() == ("d.toml:13:1: support: give 'floor-deflection' (e.g. \"1.5 mm\") "
                               "or 'floor-stiffness' (e.g. \"40000 kN/m\"), not both")


def test_efficiency_target_outside_0_to_1_is_a_located_policy_error(run_cli, tmp_path):
    _write(tmp_path, BASE, "[rules.isolation-efficiency]\nrequired-efficiency = 1.5\n"
                           "required-efficiency-by-floor = { slab-on-grade = -0.2 }\n"
                           "required-efficiency-by-machine = { fan = 1.0 }\n")
    ran = run_cli("check", "d.toml", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == [
        "vcheck.toml:2:23: rules.isolation-efficiency.required-efficiency: should be less "
        "than 1, got 1.5",
        "vcheck.toml:3:50: rules.isolation-efficiency.required-efficiency-by-floor."
        "slab-on-grade: should be greater than or equal to 0, got -0.2",
        "vcheck.toml:4:42: rules.isolation-efficiency.required-efficiency-by-machine.fan: "
        "should be less than 1, got 1.0",
    ]


def test_other_policy_errors_are_located(run_cli, tmp_path):
    _write(tmp_path, BASE, "[rules.isolator-static-deflection]\n"
                           "minimum-static-deflection-by-machine = { compressor = [\"6 kg\", "
                           "\"19 mm\", \"38 mm\", \"38 mm\"] }\n"
                           "[rules.isolation-resonance-passage]\namplification-limit = 1\n"
                           "[rules.isolation-efficiency]\nignore-forcing = [\"bearing\"]\n")
    ran = run_cli("check", "d.toml", cwd=tmp_path)
    assert ran.status == 2
    assert ran.err.splitlines() == [
        "vcheck.toml:2:56: rules.isolator-static-deflection.minimum-static-deflection-by-"
        "machine.compressor[1]: '6 kg' is a mass, but a length such as \"25 mm\" or \"1.0 in\" "
        "is expected, got '6 kg'",
        "vcheck.toml:4:23: rules.isolation-resonance-passage.amplification-limit: should be "
        "greater than 1, got 1",
        "vcheck.toml:6:19: rules.isolation-efficiency.ignore-forcing[1]: 'bearing' is not one "
        "of: running-speed, vane-pass, blade-pass, firing, compression, gear-mesh, belt-pass, "
        "bearing-defect, electrical, listed; did you mean 'bearing-defect'?",
    ]


def test_options_defaults_are_the_documented_policy():
    options = IsolationOptions()
    assert options.frequency_ratio_margin == 0.25  # common practice
    assert options.stiffness_allowance == 0.15  # common practice, from memory
    assert StaticDeflectionOptions().special_consideration_speed.value * 60 == \
        pytest.approx(250.0)  # a published US guide specification
    assert StaticDeflectionOptions().floor_deflection_factor == 10.0  # common practice

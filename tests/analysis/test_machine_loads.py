"""The machine's loads read from a design, against hand calculation and closed forms.

- unbalance: ISO 21940-11 permissible residual unbalance U = G m / Omega at the maximum
  speed (from memory; shared/REFERENCES.md [D]: G6.3, 100 kg, 3000 rpm -> 2005 g mm) and
  its force U Omega^2, rotating across the shaft;
- a force at a point: its moment about the centre of gravity r x F (statics);
- a 90-degree vee twin on one throw: the primary force of its reciprocating masses is a
  vector of constant length m r omega^2 turning with the crank (a machine-design handbook
  fact, from memory; shown by the crank module's own tests against the slider-crank
  kinematics too);
- torque reaction: T = P / omega (the definition of power).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from vcheck.analysis import analyse
from vcheck.design.loader import attach_references, design_from_document, parse_toml_text

HEAD = ('format = 1\n[machine]\ntag = "M-1"\nkind = "{kind}"\nmass = "800 kg"\n'
        'speed = {speed}\n{extra}\n')


def loads_of(text: str):
    design = design_from_document(parse_toml_text(text, "case.toml"))
    attach_references(design, ".", {})
    return analyse(design).loads


def test_unbalance_from_the_balance_grade():
    loads = loads_of(HEAD.format(kind="fan", speed='"3000 rpm"',
                                 extra='rotor = { mass = "100 kg", balance-grade = "G6.3" }'))
    (load,) = loads.harmonic
    omega = 2 * math.pi * 50.0
    unbalance = 0.0063 * 100 / omega  # kg m
    assert unbalance * 1e6 == pytest.approx(2005, abs=1)  # g mm, REFERENCES.md
    force = unbalance * omega**2
    assert load.force == pytest.approx((0, force, -1j * force), rel=1e-12)
    assert load.force_amplitude == pytest.approx(force, rel=1e-12)  # a circle
    assert load.order == 1.0 and load.exponent == 2.0
    assert load.scale_at(25.0) == pytest.approx(0.25, rel=1e-15)


def test_a_stated_force_at_a_point_and_its_scaling():
    extra = ('[[machine.load]]\nname = "maker\'s primary"\norder = 1\nat-speed = "1000 rpm"\n'
             'force = { y = "1 kN" }\nmoment = { z = "50 N*m" }\n'
             'point = { x = "500 mm", z = "200 mm" }\n')
    (load,) = loads_of(HEAD.format(kind="compressor", speed='"1500 rpm"', extra=extra)).harmonic
    # r x F with r = (0.5, 0, 0.2) m, F = (0, 1000, 0) N: (-200, 0, 500) N m, plus 50 about z
    assert np.allclose(load.about((0.0, 0.0, 0.0)), (0, 1000, 0, -200, 0, 550), atol=1e-9)
    assert load.scale_at(1500 / 60) == pytest.approx(2.25, rel=1e-12)  # (1500 / 1000)^2


def test_a_vee_twin_primary_is_a_rotating_force_of_m_r_omega_squared():
    extra = ('cylinders = 2\n[machine.crank]\narrangement = "vee"\nvee-angle = 90\n'
             'stroke = "120 mm"\nconnecting-rod = "240 mm"\nreciprocating-mass = "8.3 kg"\n')
    loads = loads_of(HEAD.format(kind="reciprocating-compressor", speed='"1480 rpm"',
                                 extra=extra))
    primary = next(load for load in loads.harmonic if load.order == 1.0)
    omega = 2 * math.pi * 1480 / 60
    expected = 8.3 * 0.06 * omega**2
    f = np.array(primary.force)
    t = np.linspace(0, 2 * np.pi, 721)
    lengths = np.linalg.norm(np.real(f[None, :] * np.exp(1j * t)[:, None]), axis=1)
    assert lengths.max() == pytest.approx(expected, rel=1e-9)
    assert lengths.min() == pytest.approx(expected, rel=1e-9)  # constant length: rotating
    assert abs(f[0]) == 0  # nothing along the shaft


def test_torque_reaction_mean_and_fluctuation():
    extra = ('cylinders = 3\nstrokes = 4\npower = "36 kW"\n[machine.torque]\n'
             'fluctuation = 2.0\n')
    loads = loads_of(HEAD.format(kind="generator-set", speed='"1500 rpm"', extra=extra))
    mean = 36e3 / (2 * math.pi * 25.0)
    (steady,) = loads.static
    assert steady.moment == pytest.approx((-mean, 0, 0), rel=1e-12)
    (pulse,) = loads.harmonic
    assert pulse.order == 1.5  # 3 cylinders / 2 for four-stroke (common practice)
    assert abs(pulse.moment[0]) == pytest.approx(2.0 * mean, rel=1e-12)


def test_a_point_far_outside_the_machine_is_noted():
    extra = ('[[machine.load]]\nname = "misplaced"\nfrequency = "30 Hz"\n'
             'force = { z = "1 kN" }\npoint = { x = "40 m" }\n'
             '[mounting]\nkind = "spring"\ncentre-of-gravity = { z = "400 mm" }\n'
             'envelope = { x = "1.2 m", y = "0.8 m", z = "0.9 m" }\n'
             + "".join(f'[[mounting.mount]]\nposition = {{ x = "{x} mm", y = "{y} mm" }}\n'
                       'axial-stiffness = "100 kN/m"\nshear-stiffness = "80 kN/m"\n'
                       for x in (-500, 500) for y in (-350, 350)))
    loads = loads_of(HEAD.format(kind="fan", speed='"1500 rpm"', extra=extra))
    ((path, words),) = loads.notes
    assert path == ("machine", "load", 0)
    assert words == ("misplaced acts at (40, 0, 0) m, 39.4 m outside the machine (its size "
                     "is about 1.2 m): check the point of action")

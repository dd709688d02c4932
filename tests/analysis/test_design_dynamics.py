"""Designs through to their computed modes and forcing bands, against closed forms.

Each check writes a small design, loads it the way `vcheck check` does, and compares
what vcheck computes with a closed-form result named beside it.
"""

from __future__ import annotations

import math
import textwrap

import pytest

from vcheck.analysis import analyse, excitation_bands
from vcheck.checking import load_designs
from vcheck.config import load_policy

MACHINE = '''
format = 1

[machine]
tag = "T-1"
kind = "fan"
mass = "{mass}"
speed = "{speed}"
'''


def _load(tmp_path, text, name="d.toml", extra_files=None):
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / name).write_text(textwrap.dedent(text))
    for path, content in (extra_files or {}).items():
        (tmp_path / path).parent.mkdir(parents=True, exist_ok=True)
        (tmp_path / path).write_text(textwrap.dedent(content))
    policy = load_policy(tmp_path)
    designs, problems = load_designs(policy, [name], tmp_path)
    return designs, [p.render() for p in problems]


def _mounts(k_axial, k_shear, positions):
    return "".join(
        f'\n[[mounting.mount]]\nposition = {{ x = "{x} m", y = "{y} m", z = "0 m" }}\n'
        f'axial-stiffness = "{k_axial}"\nshear-stiffness = "{k_shear}"\n'
        for x, y in positions)


def test_six_dof_symmetric_layout_against_closed_forms(tmp_path):
    # Four mounts at (+-a, +-b) in the plane of the CG: bounce, roll and pitch decouple.
    # Closed forms (rigid body on springs, e.g. Harris' Shock and Vibration Handbook,
    # ch. 3, from memory; the same algebra as a two-mass rocking problem):
    #   bounce f = sqrt(4 k / m) / 2pi, roll f = sqrt(4 k b^2 / I_xx) / 2pi,
    #   pitch f = sqrt(4 k a^2 / I_yy) / 2pi.
    m, k, a, b, ixx, iyy, izz = 1000.0, 250e3, 0.8, 0.5, 120.0, 300.0, 380.0
    text = MACHINE.format(mass=f"{m} kg", speed="1480 rpm") + textwrap.dedent(f'''
        [mounting]
        kind = "spring"
        centre-of-gravity = {{ x = "0 m", y = "0 m", z = "0 m" }}
        inertia = {{ xx = "{ixx} kg*m^2", yy = "{iyy} kg*m^2", zz = "{izz} kg*m^2" }}
        ''') + _mounts("250 kN/m", "150 kN/m", [(a, b), (-a, b), (a, -b), (-a, -b)])
    (design,), problems = _load(tmp_path, text)
    assert problems == []
    modes = {mode.name.split(", ")[1]: mode.nominal for mode in analyse(design).modes}
    two_pi = 2 * math.pi
    assert modes["bounce"] == pytest.approx(math.sqrt(4 * k / m) / two_pi, rel=1e-10)
    assert modes["roll"] == pytest.approx(math.sqrt(4 * k * b * b / ixx) / two_pi, rel=1e-10)
    assert modes["pitch"] == pytest.approx(math.sqrt(4 * k * a * a / iyy) / two_pi, rel=1e-10)
    # horizontal translations on the shear stiffness alone: sqrt(4 k_s / m) / 2pi
    assert modes["surge"] == pytest.approx(math.sqrt(4 * 150e3 / m) / two_pi, rel=1e-10)


def test_simply_supported_beam_against_closed_form(tmp_path):
    # f_n = (n pi / L)^2 sqrt(E I / mu) / (2 pi) (Blevins, Formulas for Natural Frequency
    # and Mode Shape, simply supported beam; exact for Euler-Bernoulli).
    text = MACHINE.format(mass="100 kg", speed="1480 rpm") + textwrap.dedent('''
        [[beam]]
        name = "B1"
        end-condition = "simply-supported"
        length = "6 m"
        youngs-modulus = "210 GPa"
        second-moment = "8360 cm^4"
        mass-per-length = "42 kg/m"
        modes = 3
        ''')
    (design,), problems = _load(tmp_path, text)
    frequencies = [mode.nominal for mode in analyse(design).modes]
    root = math.sqrt(210e9 * 8360e-8 / 42)
    expected = [(n * math.pi / 6) ** 2 * root / (2 * math.pi) for n in (1, 2, 3)]
    assert frequencies == pytest.approx(expected, rel=1e-9)


def test_two_mass_chain_against_closed_form(tmp_path):
    # ground-k-m-k-m: omega = 0.618034 and 1.618034 sqrt(k/m) (closed form of the
    # 2x2 eigenproblem; shared/REFERENCES.md: k = 1000 N/m, m = 1 kg -> 3.1105, 8.1434 Hz).
    text = MACHINE.format(mass="1 kg", speed="600 rpm") + textwrap.dedent('''
        [[lumped-model]]
        name = "chain"
        masses = ["1 kg", "1 kg"]
        springs = [ { between = [0, 1], stiffness = "1000 N/m" },
                    { between = [1, 2], stiffness = "1000 N/m" } ]
        ''')
    (design,), problems = _load(tmp_path, text)
    frequencies = sorted(mode.nominal for mode in analyse(design).modes)
    assert frequencies == pytest.approx([3.1105, 8.1434], abs=5e-5)


def test_mode_file_and_shared_structure(tmp_path):
    structure = '''
        format = 1
        [structure]
        name = "bay A"
        kind = "suspended-floor"
        [[mode-file]]
        path = "fe/bay-a.csv"
        frequency-unit = "cpm"
        '''
    csv = "frequency,damping-ratio,description\n600,0.02,first bending\n1200,,torsion\n"
    text = MACHINE.format(mass="300 kg", speed="1480 rpm") + '\n[support]\nstructure = "s.toml"\n'
    designs, problems = _load(tmp_path, text, extra_files={"s.toml": structure,
                                                           "fe/bay-a.csv": csv})
    assert problems == []
    modes = analyse(designs[0]).modes
    assert [(m.name, m.nominal) for m in modes] == [("bay A: first bending", 10.0),
                                                    ("bay A: torsion", 20.0)]
    assert modes[0].damping_ratio == 0.02 and modes[1].damping_ratio is None
    assert modes[0].origin == "fe/bay-a.csv:2 in structure file s.toml"


def test_excitation_catalogue(tmp_path):
    # Firing order of a 12-cylinder four-stroke engine = 6 per revolution; twice line
    # frequency 2 x 50 Hz; gear mesh = teeth x shaft speed; belt pass = pi D N / L
    # (common practice, see vcheck.dynamics.forcing.excitations for sources).
    text = MACHINE.format(mass="300 kg", speed="1500 rpm") + textwrap.dedent('''
        cylinders = 12
        strokes = 4
        driver = { kind = "induction-motor", line-frequency = "50 Hz" }
        belt = { pulley-diameter = "200 mm", length = "2000 mm" }
        [[machine.gear]]
        name = "reducer"
        teeth = 31
        ''').replace("[machine.gear]]", "[machine.gear]]").replace(
        "format = 1", "format = 1")
    text = text.replace('speed = "1500 rpm"\n', 'speed = "1500 rpm"\n', 1)
    (design,), problems = _load(tmp_path, text)
    assert problems == []
    bands = {band.name: band.low for band in excitation_bands(design)}
    assert bands["firing order 6 (12 cylinders, 4-stroke)"] == pytest.approx(150.0)
    assert bands["half order (four-stroke cycle)"] == pytest.approx(12.5)
    assert bands["twice line frequency (50 Hz supply)"] == pytest.approx(100.0)
    assert bands["gear mesh, reducer (31 teeth)"] == pytest.approx(31 * 25.0)
    assert bands["belt pass"] == pytest.approx(math.pi * 0.2 * 25.0 / 2.0)


@pytest.mark.parametrize(
    ("addition", "message"),
    [
        # every mount at one point: rotations about x and y are free
        ('[mounting]\nkind = "spring"\ncentre-of-gravity = { z = "0 m" }\n'
         'inertia = { xx = "10 kg*m^2", yy = "10 kg*m^2", zz = "10 kg*m^2" }\n'
         + _mounts("100 kN/m", "100 kN/m", [(0, 0), (0, 0)]),
         "d.toml:15:1: mounting.mount: mount layout leaves roll about x, pitch about y and "
         "yaw about z unrestrained"),
        ('[mounting]\nkind = "spring"\ncentre-of-gravity = { z = "0 m" }\n'
         'inertia = { xx = "10 kg*m^2", yy = "10 kg*m^2", zz = "10 kg*m^2", xy = "20 kg*m^2" }\n'
         + _mounts("100 kN/m", "100 kN/m", [(1, 1), (-1, 1), (1, -1), (-1, -1)]),
         "d.toml:13:11: mounting.inertia: the inertia tensor is not positive definite: its "
         "principal moments are -10, 10, 30 kg*m^2; a product of inertia is too large for the "
         "moments, or has the wrong sign"),
        ('[[beam]]\nname = "B"\nend-condition = "cantilever"\nlength = "0 m"\n'
         'youngs-modulus = "210 GPa"\nsecond-moment = "100 cm^4"\nmass-per-length = "10 kg/m"\n',
         "d.toml:13:10: beam[1].length: a length must be greater than zero, got '0 m'"),
        ('[[machine.excitation]]\nname = "hum"\nfrequency = "5 Hz +-120%"\n',
         "d.toml:12:13: machine.excitation[1].frequency: a frequency or speed must be greater "
         "than zero, got '5 Hz +-120%'"),
        ('[[mode-file]]\npath = "../outside.csv"\n',
         "d.toml:11:1: mode-file[1].path: '../outside.csv' is outside the project root"),
        ('[[lumped-model]]\nname = "loose"\nmasses = ["1 kg", "1 kg"]\n'
         'springs = [ { between = [1, 2], stiffness = "1 kN/m" } ]\n',
         "d.toml:10:1: lumped-model[1]: lumped model 'loose' is not tied to the ground: 1 free "
         "motion(s); join a node to node 0"),
    ],
)
def test_bad_dynamics_input_is_located(tmp_path, addition, message):
    text = MACHINE.format(mass="100 kg", speed="1480 rpm") + "\n" + addition
    designs, problems = _load(tmp_path, text)
    assert designs == []
    assert problems[0].startswith(message), problems


def test_malformed_csv_row_points_at_the_csv_line(tmp_path):
    text = MACHINE.format(mass="100 kg", speed="1480 rpm") + '\n[[mode-file]]\npath = "m.csv"\n'
    csv = "frequency,description\n12.5,first\nabc,second\n14,third\n-3,fourth\n"
    designs, problems = _load(tmp_path, text, extra_files={"m.csv": csv})
    assert problems == ["m.csv:3:1: frequency 'abc' is not a number",
                        "m.csv:5:1: frequency must be greater than zero, got '-3'"]


def test_broken_structure_is_reported_in_its_own_file(tmp_path):
    text = MACHINE.format(mass="100 kg", speed="1480 rpm") + '\n[support]\nstructure = "s.toml"\n'
    structure = 'format = 1\n[structure]\nname = "x"\nkind = "roof"\nspan = "9"\n'
    designs, problems = _load(tmp_path, text, extra_files={"s.toml": structure})
    assert designs == []
    assert problems == [
        "d.toml:11:1: support.structure: structure file 's.toml' has errors; this design is "
        "not checked",
        "s.toml:5:8: structure.span: '9' has no unit; write a length such as \"25 mm\" or "
        "\"1.0 in\"",
    ]


def test_inclined_mounts_follow_the_cosine_rule(tmp_path):
    # Four mounts at (+-a, +-b) inclined by theta towards the machine's centre line, in
    # the y-z plane (a "V" layout), CG in the mount plane. By symmetry bounce is
    # uncoupled; each mount's vertical stiffness is k_a cos^2(theta) + k_s sin^2(theta)
    # (rotation of the mount's stiffness tensor, e.g. Harris' Shock and Vibration
    # Handbook, ch. 3, from memory), so f = sqrt(4 k_z / m) / (2 pi).
    m, ka, ks, theta = 800.0, 300e3, 100e3, math.radians(30.0)
    rows = ""
    for x, y in ((0.6, 0.4), (-0.6, 0.4), (0.6, -0.4), (-0.6, -0.4)):
        side = -1.0 if y > 0 else 1.0  # axis leans towards the centre line
        rows += (f'\n[[mounting.mount]]\nposition = {{ x = "{x} m", y = "{y} m" }}\n'
                 f'axis = {{ y = {side * math.sin(theta)!r}, z = {math.cos(theta)!r} }}\n'
                 f'axial-stiffness = "300 kN/m"\nshear-stiffness = "100 kN/m"\n')
    text = MACHINE.format(mass=f"{m} kg", speed="1480 rpm") + textwrap.dedent('''
        [mounting]
        kind = "rubber"
        centre-of-gravity = { z = "0 m" }
        inertia = { xx = "60 kg*m^2", yy = "120 kg*m^2", zz = "150 kg*m^2" }
        ''') + rows
    (design,), problems = _load(tmp_path, text)
    assert problems == []
    modes = {mode.name.split(", ")[1]: mode.nominal for mode in analyse(design).modes}
    k_vertical = ka * math.cos(theta) ** 2 + ks * math.sin(theta) ** 2
    assert modes["bounce"] == pytest.approx(math.sqrt(4 * k_vertical / m) / (2 * math.pi),
                                            rel=1e-10)
    assert any("inclined mounts" in a for mode in analyse(design).modes for a in mode.assumptions)


def test_a_zero_mount_axis_is_refused(tmp_path):
    text = MACHINE.format(mass="100 kg", speed="1480 rpm") + textwrap.dedent('''
        [mounting]
        kind = "rubber"
        centre-of-gravity = { z = "0 m" }
        inertia = { xx = "6 kg*m^2", yy = "12 kg*m^2", zz = "15 kg*m^2" }
        ''') + _mounts("300 kN/m", "100 kN/m", [(1, 1), (-1, 1), (1, -1)]) + (
        '\n[[mounting.mount]]\nposition = { x = "-1 m", y = "-1 m" }\naxis = { z = 0 }\n'
        'axial-stiffness = "300 kN/m"\nshear-stiffness = "100 kN/m"\n')
    designs, problems = _load(tmp_path, text)
    assert designs == []
    assert problems[0].endswith("mounting.mount[4].axis: a direction needs at least one "
                                "non-zero component, e.g. { y = 0.5, z = 0.866 }")

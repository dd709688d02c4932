"""Checks of vcheck.dynamics.joints.bolt_materials against outside references.

Each test names its reference beside the check and says why its tolerance is what it is.
Tags follow shared/REFERENCES.md: [C] seen in a published source, [D] derived by exact
arithmetic, [M] from memory.
"""

from __future__ import annotations

import dataclasses
import doctest
import re

import numpy as np
import pytest

from vcheck.dynamics.joints import bolt_materials
from vcheck.dynamics.joints.bolt_materials import (
    bolt_material,
    bolt_material_names,
    proof_load,
    yield_load,
)
from vcheck.dynamics.joints.threads import thread_by_name

MPA = 1.0e6
KSI = 1000 * 4.4482216152605 / 0.0254**2  # lbf and inch by definition (NIST SP 811)


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


# ISO 898-1:2013 Table 3 [C for the rows in shared/REFERENCES.md: 4.6, 5.8, 8.8 both
# sizes, 10.9, 12.9; M (from memory) for 4.8, 5.6, 6.8, 9.8]: (diameter [m],
# Rm nom, Rm min, yield nom, yield min, proof stress) in MPa. Exact table integers.
ISO_898_1_TABLE_3 = {
    "4.6": (0.012, 400, 400, 240, 240, 225),
    "4.8": (0.012, 400, 420, 320, 340, 310),
    "5.6": (0.012, 500, 500, 300, 300, 280),
    "5.8": (0.012, 500, 520, 400, 420, 380),
    "6.8": (0.012, 600, 600, 480, 480, 440),
    "8.8 d<=16": (0.016, 800, 800, 640, 640, 580),
    "8.8 d>16": (0.020, 800, 830, 640, 660, 600),
    "9.8": (0.010, 900, 900, 720, 720, 650),
    "10.9": (0.024, 1000, 1040, 900, 940, 830),
    "12.9": (0.030, 1200, 1220, 1080, 1100, 970),
}


@pytest.mark.parametrize(("row_name", "row"), ISO_898_1_TABLE_3.items())
def test_iso_898_1_table_3(row_name, row):
    # ISO 898-1:2013 Table 3 (tags in the fixture); integers of the table, so the only
    # tolerance is floating-point conversion to Pa.
    d, rm_nom, rm_min, y_nom, y_min, sp = row
    m = bolt_material(row_name.split()[0], diameter=d)
    assert m.tensile_strength_nominal == pytest.approx(rm_nom * MPA, rel=1e-12)
    assert m.tensile_strength_min == pytest.approx(rm_min * MPA, rel=1e-12)
    assert m.yield_strength_nominal == pytest.approx(y_nom * MPA, rel=1e-12)
    assert m.yield_strength_min == pytest.approx(y_min * MPA, rel=1e-12)
    assert m.proof_stress == pytest.approx(sp * MPA, rel=1e-12)


def test_proof_load_m12_8_8_against_iso_898_1_table_5():
    # ISO 898-1:2013 Table 5, M12 class 8.8: proof load 48 900 N [C]. The table is
    # A_s,nom x S_p rounded to three significant figures: half a unit is 50 N.
    t = thread_by_name("M12")
    m = bolt_material("8.8", diameter=t.nominal_diameter)
    assert proof_load(m.proof_stress, t.stress_area) == pytest.approx(48_900.0, abs=50.0)


# ISO 898-1:2013 Table 5, further proof loads in N (from memory) [M]. The table uses the
# three-figure A_s,nom of Table 4 (M16: 157 against 156.67 mm^2 exact), so allow 0.3 %.
ISO_898_1_TABLE_5 = [
    ("M8", "4.6", 8_240.0),
    ("M16", "8.8", 91_000.0),
    ("M20", "8.8", 147_000.0),
    ("M10", "10.9", 48_100.0),
    ("M24", "10.9", 293_000.0),
    ("M12", "12.9", 81_800.0),
]


@pytest.mark.parametrize(("size", "cls", "load"), ISO_898_1_TABLE_5)
def test_proof_loads_against_iso_898_1_table_5_from_memory(size, cls, load):
    # ISO 898-1:2013 Table 5 (from memory) [M]; 0.3 % for the table's rounded areas.
    t = thread_by_name(size)
    m = bolt_material(cls, diameter=t.nominal_diameter)
    assert proof_load(m.proof_stress, t.stress_area) == pytest.approx(load, rel=3e-3)


# SAE J429 Table 1 as republished by two fastener suppliers [C, secondary]: (diameter
# [in], proof, yield min, tensile min) in ksi. Integers of the table.
SAE_J429 = [
    ("grade 2", 0.25, 55, 57, 74),
    ("grade 2", 0.75, 55, 57, 74),
    ("grade 2", 0.875, 33, 36, 60),
    ("grade 5", 0.375, 85, 92, 120),
    ("grade 5", 1.0, 85, 92, 120),
    ("grade 5", 1.125, 74, 81, 105),
    ("grade 8", 1.5, 120, 130, 150),
]


@pytest.mark.parametrize(("grade", "d_in", "proof", "yld", "tensile"), SAE_J429)
def test_sae_j429_grades_by_diameter(grade, d_in, proof, yld, tensile):
    # SAE J429 Table 1 [C, secondary]; ksi converted with the exact lbf and inch.
    m = bolt_material(f"SAE J429 {grade}", diameter=d_in * 0.0254)
    assert m.proof_stress == pytest.approx(proof * KSI, rel=1e-12)
    assert m.yield_strength_min == pytest.approx(yld * KSI, rel=1e-12)
    assert m.tensile_strength_min == pytest.approx(tensile * KSI, rel=1e-12)
    assert m.tensile_strength_nominal is None


def test_ksi_to_pascal():
    # 1 ksi = 6.894757 MPa (NIST SP 811, 2008, Appendix B.9) [C]; tolerance its 7 digits.
    assert KSI == pytest.approx(6.894757e6, abs=0.5)
    assert bolt_material("grade 8", diameter=0.0127).tensile_strength_min / MPA == (
        pytest.approx(1034.2, abs=0.05)
    )


# ISO 3506-1 austenitic classes: (Rm min, Rp0.2 min) MPa; 70 and 80 as published by a
# fastener supplier [C, secondary], 50 from memory [M].
ISO_3506_1 = {
    "A2-50": (500, 210),
    "A2-70": (700, 450),
    "A2-80": (800, 600),
    "A4-50": (500, 210),
    "A4-70": (700, 450),
    "A4-80": (800, 600),
}


@pytest.mark.parametrize(("name", "row"), ISO_3506_1.items())
def test_iso_3506_1_stainless_classes(name, row):
    # ISO 3506-1 (tags in the fixture); integers of the table.
    m = bolt_material(name.lower(), diameter=0.016)
    assert m.name == name
    assert m.tensile_strength_min == pytest.approx(row[0] * MPA, rel=1e-12)
    assert m.yield_strength_min == pytest.approx(row[1] * MPA, rel=1e-12)
    assert m.proof_stress is None


def test_diameter_split_of_class_8_8_is_at_16_mm():
    # ISO 898-1:2013 Table 3 [C]: the d <= 16 mm column includes 16 mm itself.
    assert bolt_material("8.8", diameter=0.016).yield_strength_min == 640 * MPA
    assert bolt_material("8.8", diameter=0.018).yield_strength_min == 660 * MPA
    # Classes without a split need no diameter.
    assert bolt_material("10.9").proof_stress == 830 * MPA


def test_yield_load_is_strength_times_area():
    # VDI 2230 Part 1:2015, F_0.2min = R_p0.2min A_S (from memory) [M]; closed form, and
    # arrays give the same as scalars.
    areas = np.array([36.6e-6, 84.3e-6])
    out = yield_load(640e6, areas)
    assert out == pytest.approx(640e6 * areas, rel=1e-12)
    assert yield_load(640e6, areas[1]) == pytest.approx(out[1], rel=1e-15)


VALID = (
    "4.6, 4.8, 5.6, 5.8, 6.8, 8.8, 9.8, 10.9, 12.9, SAE J429 grade 2, SAE J429 grade 5, "
    "SAE J429 grade 8, A2-50, A2-70, A2-80, A4-50, A4-70, A4-80"
)


def test_names_listed_once_in_table_order():
    assert ", ".join(bolt_material_names()) == VALID


@pytest.mark.parametrize(
    ("name", "diameter", "message"),
    [
        ("8.9", None, f"unknown property class '8.9': valid names are {VALID}"),
        ("grade 3", None, f"unknown property class 'grade 3': valid names are {VALID}"),
        (
            "8.8",
            None,
            "property class 8.8 strength depends on the nominal diameter "
            "(d <= 16 mm or d > 16 mm): give the diameter",
        ),
        (
            "9.8",
            0.020,
            "property class 9.8 is defined for d <= 16 mm (ISO 898-1:2013); got d = 20 mm",
        ),
        (
            "10.9",
            0.048,
            "property class 10.9 is defined for d <= 39 mm (ISO 898-1:2013); got d = 48 mm",
        ),
        (
            "grade 5",
            None,
            "SAE J429 grade 5 strength depends on the nominal diameter "
            "(split at 1 in): give the diameter",
        ),
        (
            "SAE grade 5",
            2 * 0.0254,
            "SAE J429 grade 5 covers 1/4 in to 1-1/2 in (SAE J429); got d = 2 in",
        ),
        (
            "A4-70",
            0.042,
            "property class A4-70 is defined for d <= 39 mm (ISO 3506-1); got d = 42 mm",
        ),
        ("8.8", 0.0, "nominal diameter must be positive, got 0.0 m"),
    ],
)
def test_bad_names_and_diameters_have_exact_messages(name, diameter, message):
    with pytest.raises(ValueError, match=exactly(message)):
        bolt_material(name, diameter=diameter)


def test_proof_load_rejects_zero_area():
    with pytest.raises(ValueError, match=exactly("stress area must be positive, got 0 m^2")):
        proof_load(580e6, [84.3e-6, 0.0])


def test_material_is_frozen():
    with pytest.raises(dataclasses.FrozenInstanceError):
        bolt_material("12.9").name = "x"  # type: ignore[misc]


def test_docstring_examples_run():
    result = doctest.testmod(bolt_materials)
    assert result.failed == 0 and result.attempted >= 3

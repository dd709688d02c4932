"""Checks of vcheck.dynamics.joints.threads against outside references.

Each test names its reference beside the check and says why its tolerance is what it is.
Tags follow shared/REFERENCES.md: [C] seen in a published source, [D] derived by exact
arithmetic, [M] from memory.
"""

from __future__ import annotations

import dataclasses
import doctest
import math
import re

import pytest

from vcheck.dynamics.joints import threads
from vcheck.dynamics.joints.threads import (
    CLEARANCE_HOLE_ISO_273_MEDIUM,
    HEX_HEAD_ISO_4014,
    METRIC_COARSE_PITCH,
    ThreadSize,
    all_thread_designations,
    thread_by_name,
)

MM2 = 1.0e-6
IN2 = 0.0254**2  # 1 in = 25.4 mm exactly (international inch, 1959)


def exactly(message: str) -> str:
    """A pytest ``match`` pattern that accepts this message and nothing else."""
    return f"^{re.escape(message)}$"


# ISO 898-1:2013, Table 4 (nominal stress area A_s,nom of coarse threads) [C], in mm^2.
# The table prints three significant figures, so each value is good to half a unit of
# its last digit; that is the tolerance.
ISO_898_1_COARSE_STRESS_AREAS = {
    "M6": (20.1, 0.05),
    "M8": (36.6, 0.05),
    "M10": (58.0, 0.05),
    "M12": (84.3, 0.05),
    "M16": (157.0, 0.5),
    "M20": (245.0, 0.5),
    "M24": (353.0, 0.5),
    "M30": (561.0, 0.5),
}


@pytest.mark.parametrize(("name", "row"), ISO_898_1_COARSE_STRESS_AREAS.items())
def test_coarse_stress_areas_against_iso_898_1_table(name, row):
    # ISO 898-1:2013 Table 4 [C]; tolerance: half a unit of the table's last digit.
    tabulated, half_unit = row
    assert thread_by_name(name).stress_area / MM2 == pytest.approx(tabulated, abs=half_unit)


# ISO 898-1:2013 Table 4, fine threads, mm^2 (from memory) [M]; same rounding tolerance.
ISO_898_1_FINE_STRESS_AREAS = {
    "M8x1": (39.2, 0.05),
    "M10x1.25": (61.2, 0.05),
    "M10x1": (64.5, 0.05),
    "M12x1.5": (88.1, 0.05),
    "M12x1.25": (92.1, 0.05),
    "M16x1.5": (167.0, 0.5),
    "M20x1.5": (272.0, 0.5),
    "M24x2": (384.0, 0.5),
}


@pytest.mark.parametrize(("name", "row"), ISO_898_1_FINE_STRESS_AREAS.items())
def test_fine_stress_areas_against_iso_898_1_table_from_memory(name, row):
    # ISO 898-1:2013 Table 4, fine pitch (from memory) [M]; half a unit of the last digit.
    tabulated, half_unit = row
    assert thread_by_name(name).stress_area / MM2 == pytest.approx(tabulated, abs=half_unit)


# ASME B1.1-2003 stress areas, in^2: 1/4-20, 3/8-16, 1/2-13 as collected in
# shared/REFERENCES.md (1/2-13 [C], the others [D] from the formula
# As = 0.7854 (D - 0.9743/n)^2); the rest from the published UNC/UNF tables (from
# memory) [M]. Tables print four decimals (three significant figures from 0.1 in^2 up),
# so the tolerance is half a unit of the last printed digit.
ASME_B1_1_STRESS_AREAS = {
    "1/4-20": (0.0318, 0.00005),
    "3/8-16": (0.0775, 0.00005),
    "1/2-13": (0.1419, 0.00005),
    "#10-24": (0.0175, 0.00005),
    "#10-32": (0.0200, 0.00005),
    "1/4-28": (0.0364, 0.00005),
    "5/16-18": (0.0524, 0.00005),
    "3/8-24": (0.0878, 0.00005),
    "5/8-11": (0.226, 0.0005),
    "3/4-10": (0.334, 0.0005),
    "1-8": (0.606, 0.0005),
}


@pytest.mark.parametrize(("name", "row"), ASME_B1_1_STRESS_AREAS.items())
def test_unified_stress_areas_against_asme_b1_1(name, row):
    # ASME B1.1-2003 stress areas (see the fixture for each value's tag); tolerance: half
    # a unit of the printed last digit.
    tabulated, half_unit = row
    assert thread_by_name(name).stress_area / IN2 == pytest.approx(tabulated, abs=half_unit)


@pytest.mark.parametrize("name", ["M3", "M8", "M16", "M36", "M64", "M12x1.25", "M48x3"])
def test_metric_diameters_from_the_iso_68_1_basic_profile(name):
    # ISO 68-1:1998 basic profile: fundamental triangle H = sqrt(3)/2 P; the pitch line
    # lies 3/8 H below the crest on each side, d2 = d - 2 (3/8) H; the external-thread
    # root of ISO 724 (radius H/6) lies 17/24 H below it, d3 = d - 2 (17/24) H. The module
    # uses the six-digit factors 0.649519 and 1.226869; they differ from the exact ones by
    # 5e-8 P and 3.2e-7 P, hence the tolerance of 1e-6 P.
    t = thread_by_name(name)
    h = math.sqrt(3.0) / 2.0 * t.pitch
    tol = 1e-6 * t.pitch
    assert t.pitch_diameter == pytest.approx(t.nominal_diameter - 0.75 * h, abs=tol)
    assert t.minor_diameter == pytest.approx(t.nominal_diameter - 17.0 / 12.0 * h, abs=tol)
    assert t.stress_area == pytest.approx(math.pi / 4 * t.stress_diameter**2, rel=1e-12)


def test_unified_sizes_and_pitches_in_si():
    # 1 in = 25.4 mm exactly [definition]; numbered sizes D = 0.060 + 0.013 N in
    # (ASME B1.1-2003 Table 1, from memory) [M]. Exact arithmetic, tolerance 1e-12 m.
    one_inch = thread_by_name("1-8 UNC")
    assert one_inch.nominal_diameter == pytest.approx(0.0254, abs=1e-12)
    assert one_inch.pitch == pytest.approx(0.0254 / 8, abs=1e-12)
    assert one_inch.threads_per_inch == 8
    number_ten = thread_by_name("#10-24")
    assert number_ten.nominal_diameter == pytest.approx((0.060 + 0.013 * 10) * 0.0254, abs=1e-12)
    # (d2 + d3)/2 = D - 0.9743 P is the ASME stress-area diameter by construction.
    assert number_ten.stress_diameter == pytest.approx(
        number_ten.nominal_diameter - 0.9743 * number_ten.pitch, abs=1e-12
    )


def test_coarse_pitch_table_covers_m3_to_m64_first_and_second_choice():
    # ISO 261:1998 Table 1, coarse pitches (from memory) [M]: spot values and the range
    # the module promises.
    assert METRIC_COARSE_PITCH[3] == 0.5
    assert METRIC_COARSE_PITCH[12] == 1.75
    assert METRIC_COARSE_PITCH[24] == 3.0
    assert METRIC_COARSE_PITCH[64] == 6.0
    assert min(METRIC_COARSE_PITCH) == 3 and max(METRIC_COARSE_PITCH) == 64
    assert set(HEX_HEAD_ISO_4014) == set(METRIC_COARSE_PITCH)
    assert set(CLEARANCE_HOLE_ISO_273_MEDIUM) == set(METRIC_COARSE_PITCH)


def test_head_and_hole_dimensions_in_si():
    # ISO 4014 / ISO 273 values for M16 (from memory; confirmed through the VDI 2230
    # torque table in test_preload.py) [M]: s = 24 mm, d_w = 22.49 mm, D_h = 17.5 mm.
    t = thread_by_name("M16")
    assert t.width_across_flats == pytest.approx(0.024, abs=1e-12)
    assert t.head_bearing_diameter == pytest.approx(0.02249, abs=1e-12)
    assert t.clearance_hole_diameter == pytest.approx(0.0175, abs=1e-12)
    fine = thread_by_name("M16x1.5")
    assert fine.head_bearing_diameter == t.head_bearing_diameter  # same head as the coarse
    # ASME B18.2.1 hex cap screw 3/8 in: F = 9/16 in (from memory) [M].
    assert thread_by_name("3/8-16").width_across_flats == pytest.approx(9 / 16 * 0.0254)
    assert thread_by_name("#10-24").width_across_flats is None


@pytest.mark.parametrize(
    ("text", "designation"),
    [
        ("M16", "M16"),
        ("m16", "M16"),
        (" M 16 ", "M16"),
        ("M16x2", "M16"),
        ("M12x1.5", "M12x1.5"),
        ("M12 X 1.5", "M12x1.5"),
        ("M12\u00d71.5", "M12x1.5"),
        ("M12x1.50", "M12x1.5"),
        ("3/8-16", "3/8-16 UNC"),
        ("1/2-13 UNC", "1/2-13 UNC"),
        ("1/2-13 unrc", "1/2-13 UNC"),
        ("1/2-20", "1/2-20 UNF"),
        ("#10-24", "#10-24 UNC"),
        ("# 10-32 UNF", "#10-32 UNF"),
        ("1-8", "1-8 UNC"),
        ("1-1/8-7", "1-1/8-7 UNC"),
        ("1 1/8-12", "1-1/8-12 UNF"),
    ],
)
def test_designations_are_read_in_their_usual_spellings(text, designation):
    # Designation forms: ISO 965-1 ("M12x1.5"; coarse pitch may be omitted) and ASME B1.1
    # ("1/2-13 UNC", numbered sizes "#10-24") (common practice for the loose spellings).
    assert thread_by_name(text).designation == designation


def test_every_listed_designation_reads_back_to_itself():
    names = all_thread_designations()
    assert len(names) == len(set(names)) > 90
    for name in names:
        assert thread_by_name(name).designation == name


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ("M15", "unknown thread 'M15': nearest valid designations are M14, M16"),
        ("3/8-17", "unknown thread '3/8-17': nearest valid designation is 3/8-16"),
        ("M12x1.4", "unknown thread 'M12x1.4': nearest valid designation is M12x1.5"),
        ("M15x1.5", "unknown thread 'M15x1.5': nearest valid designations are M14x1.5, M16x1.5"),
        ("M70", "unknown thread 'M70': nearest valid designation is M64"),
        ("7/16-13", "unknown thread '7/16-13': nearest valid designation is 7/16-14"),
        ("11/16-12", "unknown thread '11/16-12': nearest valid designations are 5/8-11, 3/4-10"),
        ("#7-32", "unknown thread '#7-32': nearest valid designations are #6-32, #8-32"),
        ("3/8-16 UNF", "thread '3/8-16 UNF' is not UNF: 3/8-16 is a UNC thread"),
        (
            "bolt",
            "cannot read thread designation 'bolt': expected a name such as "
            "M16, M12x1.5, 3/8-16, 1/2-13 UNC, #10-24",
        ),
        (
            "M0",
            "thread 'M0' has a zero diameter or pitch: expected a name such as "
            "M16, M12x1.5, 3/8-16, 1/2-13 UNC, #10-24",
        ),
        (
            "M8x0",
            "thread 'M8x0' has a zero diameter or pitch: expected a name such as "
            "M16, M12x1.5, 3/8-16, 1/2-13 UNC, #10-24",
        ),
    ],
)
def test_unknown_threads_name_the_nearest_valid_ones(text, message):
    with pytest.raises(ValueError, match=exactly(message)):
        thread_by_name(text)


def test_thread_size_is_frozen():
    t = thread_by_name("M10")
    assert isinstance(t, ThreadSize)
    with pytest.raises(dataclasses.FrozenInstanceError):
        t.pitch = 0.002  # type: ignore[misc]


def test_docstring_examples_run():
    result = doctest.testmod(threads)
    assert result.failed == 0 and result.attempted >= 3

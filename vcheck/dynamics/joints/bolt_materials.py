"""Strength of bolt materials: ISO 898-1 property classes, SAE J429 grades, ISO 3506-1
stainless classes.

All strengths are in pascals and all diameters in metres. Look a material up with
:func:`bolt_material`, giving the bolt's nominal diameter where the standard splits the
values by size::

    >>> m = bolt_material("8.8", diameter=0.012)
    >>> m.proof_stress / 1e6
    580.0
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "BoltMaterial",
    "ISO_898_1_PROPERTY_CLASSES",
    "SAE_J429_GRADES",
    "ISO_3506_1_STAINLESS",
    "bolt_material",
    "bolt_material_names",
    "proof_load",
    "yield_load",
]

_MPA = 1.0e6
_KSI = 6.894757293168361e6  # 1000 lbf/in^2 in Pa (lbf = 4.4482216152605 N, in = 0.0254 m)
_MM = 1.0e-3
_INCH = 0.0254

# (name, d_min [mm], d_max [mm], Rm nominal, Rm min, ReL/Rp0.2 nominal, ReL/Rp0.2 min,
#  proof stress Sp nominal) [MPa]
_Iso898Row = tuple[str, float, float, float, float, float, float, float]
ISO_898_1_PROPERTY_CLASSES: tuple[_Iso898Row, ...] = (
    ("4.6", 0.0, 39.0, 400, 400, 240, 240, 225),
    ("4.8", 0.0, 39.0, 400, 420, 320, 340, 310),
    ("5.6", 0.0, 39.0, 500, 500, 300, 300, 280),
    ("5.8", 0.0, 39.0, 500, 520, 400, 420, 380),
    ("6.8", 0.0, 39.0, 600, 600, 480, 480, 440),
    ("8.8", 0.0, 16.0, 800, 800, 640, 640, 580),
    ("8.8", 16.0, 39.0, 800, 830, 640, 660, 600),
    ("9.8", 0.0, 16.0, 900, 900, 720, 720, 650),
    ("10.9", 0.0, 39.0, 1000, 1040, 900, 940, 830),
    ("12.9", 0.0, 39.0, 1200, 1220, 1080, 1100, 970),
)
"""ISO 898-1:2013 Table 3, bolts, screws and studs of carbon and alloy steel, M1.6 to
M39: tensile strength Rm, lower yield strength ReL (classes 4.6, 5.6) or 0.2 % proof
strength Rp0.2 (8.8 to 12.9) or stress at 0.0048 d non-proportional elongation Rpf
(4.8, 5.8, 6.8, full-size fasteners), and proof stress Sp, all nominal and minimum
[MPa]. A row holds d_min < d <= d_max [mm]. Classes 4.6, 5.8, 8.8, 10.9 and 12.9 as
collected from a faithful reproduction of the table; 4.8, 5.6, 6.8 and 9.8 from memory.
Class 9.8 exists only for d <= 16 mm."""

# (grade, d_min [in], d_max [in], proof, yield min, tensile min) [ksi]; d_min < d <= d_max,
# the first row of each grade also includes d = 1/4 in.
SAE_J429_GRADES: tuple[tuple[str, float, float, float, float, float], ...] = (
    ("2", 0.25, 0.75, 55, 57, 74),
    ("2", 0.75, 1.5, 33, 36, 60),
    ("5", 0.25, 1.0, 85, 92, 120),
    ("5", 1.0, 1.5, 74, 81, 105),
    ("8", 0.25, 1.5, 120, 130, 150),
)
"""SAE J429 (2014) mechanical requirements for inch bolts, screws and studs, 1/4 to
1-1/2 in: proof stress, minimum yield strength and minimum tensile strength [ksi], by
nominal size range [in] (as republished by fastener suppliers, checked against two such
tables; the standard itself not opened). Grade 2 above 3/4 in drops to grade 1 values."""

# (name, Rm min, Rp0.2 min) [MPa]
ISO_3506_1_STAINLESS: tuple[tuple[str, float, float], ...] = (
    ("A2-50", 500, 210), ("A2-70", 700, 450), ("A2-80", 800, 600),
    ("A4-50", 500, 210), ("A4-70", 700, 450), ("A4-80", 800, 600),
)
"""ISO 3506-1:2009 / 2020 austenitic stainless bolts, screws and studs, M1.6 to M39:
minimum tensile strength Rm and minimum stress at 0.2 % non-proportional elongation
Rp0.2 [MPa]. Classes 70 and 80 as published by a fastener supplier; class 50 from memory.
The standard sets no proof stress for these classes; the narrower size limits of the
2009 edition for classes 70 and 80 (M24) are not enforced here (from memory)."""


@dataclass(frozen=True)
class BoltMaterial:
    """Strength values of one bolt material at one nominal diameter.

    Attributes
    ----------
    name : str
        Canonical name: ``"8.8"``, ``"SAE J429 grade 5"``, ``"A2-70"``.
    standard : str
        The standard and table the values come from.
    tensile_strength_min : float
        Minimum tensile strength Rm,min [Pa].
    yield_strength_min : float
        Minimum lower yield strength, 0.2 % proof strength or Rpf [Pa]; the value VDI
        2230 writes R_p0.2min.
    proof_stress : float or None
        Proof stress S_p [Pa] (stress under the proof load on the stress area); None
        where the standard defines none (ISO 3506-1).
    tensile_strength_nominal : float or None
        Nominal tensile strength Rm,nom [Pa] (ISO 898-1 only).
    yield_strength_nominal : float or None
        Nominal yield strength [Pa] (ISO 898-1 only).
    diameter_range : tuple of float
        (d_min, d_max) [m] of the row used: d_min < d <= d_max.
    """

    name: str
    standard: str
    tensile_strength_min: float
    yield_strength_min: float
    proof_stress: float | None
    tensile_strength_nominal: float | None
    yield_strength_nominal: float | None
    diameter_range: tuple[float, float]


def bolt_material_names() -> tuple[str, ...]:
    """Every canonical name :func:`bolt_material` accepts.

    Returns
    -------
    tuple of str
        ISO 898-1 classes, then SAE J429 grades, then ISO 3506-1 classes [unitless].
    """
    iso = dict.fromkeys(row[0] for row in ISO_898_1_PROPERTY_CLASSES)
    sae = dict.fromkeys(f"SAE J429 grade {row[0]}" for row in SAE_J429_GRADES)
    stainless = tuple(row[0] for row in ISO_3506_1_STAINLESS)
    return (*iso, *sae, *stainless)


def _canonical(name: str) -> str | None:
    text = " ".join(name.strip().split())
    upper = text.upper()
    for row in ISO_898_1_PROPERTY_CLASSES:
        if upper == row[0]:
            return row[0]
    for prefix in ("SAE J429 GRADE ", "SAE GRADE ", "J429 GRADE ", "GRADE "):
        if upper.startswith(prefix):
            grade = upper[len(prefix):]
            if any(grade == row[0] for row in SAE_J429_GRADES):
                return f"SAE J429 grade {grade}"
    for row in ISO_3506_1_STAINLESS:
        if upper.replace(" ", "") == row[0]:
            return row[0]
    return None


def _diameter_text(d: float, inch: bool) -> str:
    return f"{d / _INCH:g} in" if inch else f"{d / _MM:g} mm"


def bolt_material(name: str, diameter: float | None = None) -> BoltMaterial:
    """Strength of a bolt material by property class or grade.

    Parameters
    ----------
    name : str
        ISO 898-1 class ``"4.6"`` ... ``"12.9"``; SAE J429 grade ``"SAE J429 grade 5"``
        (also ``"SAE grade 5"``, ``"grade 5"``); ISO 3506-1 class ``"A2-70"``. Case and
        spacing are ignored [unitless].
    diameter : float, optional
        Nominal diameter of the bolt [m]. Required for ISO 8.8 (values split at 16 mm)
        and SAE grades 2 and 5 (split at 3/4 in and 1 in); when given it is also checked
        against the size range the standard covers.

    Returns
    -------
    BoltMaterial
        Strengths in pascals.

    Raises
    ------
    ValueError
        For an unknown name (the message lists every valid name), a diameter needed but
        missing, or a diameter outside the standard's range.

    Notes
    -----
    Sizes inside a range are matched with a tolerance of 1 um so that a diameter
    converted from inches (3/4 in = 0.01905 m) falls in the range it names.

    References
    ----------
    .. [1] ISO 898-1:2013, Table 3.
    .. [2] SAE J429:2014, Mechanical and material requirements for externally threaded
       fasteners, Table 1.
    .. [3] ISO 3506-1:2020, Mechanical properties of corrosion-resistant stainless steel
       fasteners, Part 1.

    Examples
    --------
    >>> bolt_material("10.9").yield_strength_min / 1e6
    940.0
    """
    canonical = _canonical(name) if isinstance(name, str) else None
    if canonical is None:
        valid = ", ".join(bolt_material_names())
        raise ValueError(f"unknown property class {name!r}: valid names are {valid}")
    if diameter is not None:
        d = float(diameter)
        if not math.isfinite(d) or d <= 0:
            raise ValueError(f"nominal diameter must be positive, got {diameter!r} m")
    else:
        d = None
    eps = 1.0e-6  # [m]

    if canonical.startswith("SAE"):
        grade = canonical.rsplit(" ", 1)[1]
        rows = [r for r in SAE_J429_GRADES if r[0] == grade]
        lo_all, hi_all = rows[0][1] * _INCH, rows[-1][2] * _INCH
        if d is None:
            if len(rows) > 1:
                splits = " and ".join(f"{r[2]:g} in" for r in rows[:-1])
                raise ValueError(
                    f"{canonical} strength depends on the nominal diameter "
                    f"(split at {splits}): give the diameter"
                )
            row = rows[0]
        else:
            if d < lo_all - eps or d > hi_all + eps:
                raise ValueError(
                    f"{canonical} covers 1/4 in to 1-1/2 in (SAE J429); "
                    f"got d = {_diameter_text(d, True)}"
                )
            row = next(r for r in rows if d <= r[2] * _INCH + eps)
        return BoltMaterial(
            name=canonical,
            standard="SAE J429:2014 Table 1",
            tensile_strength_min=row[5] * _KSI,
            yield_strength_min=row[4] * _KSI,
            proof_stress=row[3] * _KSI,
            tensile_strength_nominal=None,
            yield_strength_nominal=None,
            diameter_range=(row[1] * _INCH, row[2] * _INCH),
        )

    if "-" in canonical:  # stainless
        row3 = next(r for r in ISO_3506_1_STAINLESS if r[0] == canonical)
        if d is not None and d > 39 * _MM + eps:
            raise ValueError(
                f"property class {canonical} is defined for d <= 39 mm (ISO 3506-1); "
                f"got d = {_diameter_text(d, False)}"
            )
        return BoltMaterial(
            name=canonical,
            standard="ISO 3506-1:2020 (class values as in the 2009 edition)",
            tensile_strength_min=row3[1] * _MPA,
            yield_strength_min=row3[2] * _MPA,
            proof_stress=None,
            tensile_strength_nominal=None,
            yield_strength_nominal=None,
            diameter_range=(0.0, 39 * _MM),
        )

    rows9 = [r for r in ISO_898_1_PROPERTY_CLASSES if r[0] == canonical]
    top = rows9[-1][2]
    if d is None:
        if len(rows9) > 1:
            raise ValueError(
                f"property class {canonical} strength depends on the nominal diameter "
                f"(d <= {rows9[0][2]:g} mm or d > {rows9[0][2]:g} mm): give the diameter"
            )
        row9 = rows9[0]
    else:
        if d > top * _MM + eps:
            raise ValueError(
                f"property class {canonical} is defined for d <= {top:g} mm "
                f"(ISO 898-1:2013); got d = {_diameter_text(d, False)}"
            )
        row9 = next(r for r in rows9 if d <= r[2] * _MM + eps)
    return BoltMaterial(
        name=canonical,
        standard="ISO 898-1:2013 Table 3",
        tensile_strength_min=row9[4] * _MPA,
        yield_strength_min=row9[6] * _MPA,
        proof_stress=row9[7] * _MPA,
        tensile_strength_nominal=row9[3] * _MPA,
        yield_strength_nominal=row9[5] * _MPA,
        diameter_range=(row9[1] * _MM, row9[2] * _MM),
    )


def proof_load(proof_stress: ArrayLike, stress_area: ArrayLike):
    """Proof load of a bolt, F_p = S_p A_s.

    Parameters
    ----------
    proof_stress : array_like
        Proof stress S_p [Pa].
    stress_area : array_like
        Tensile stress area A_s [m^2].

    Returns
    -------
    numpy.ndarray or float
        Proof load [N].

    Notes
    -----
    ISO 898-1:2013 clause 9.6 (proof load = A_s,nom S_p,nom, tabulated in Table 5);
    SAE J429 likewise multiplies the proof stress by the stress area.

    References
    ----------
    .. [1] ISO 898-1:2013, Table 5.

    Examples
    --------
    >>> round(float(proof_load(580e6, 84.3e-6)) / 1e3, 1)
    48.9
    """
    sp = np.asarray(proof_stress, dtype=float)
    area = np.asarray(stress_area, dtype=float)
    if np.any(~np.isfinite(sp)) or np.any(sp <= 0):
        raise ValueError(f"proof stress must be positive, got {_first_bad(sp)} Pa")
    if np.any(~np.isfinite(area)) or np.any(area <= 0):
        raise ValueError(f"stress area must be positive, got {_first_bad(area)} m^2")
    return sp * area


def yield_load(yield_strength: ArrayLike, stress_area: ArrayLike):
    """Bolt force at the minimum yield strength, F_0.2min = R_p0.2min A_s.

    Parameters
    ----------
    yield_strength : array_like
        Minimum yield or 0.2 % proof strength R_p0.2min [Pa].
    stress_area : array_like
        Tensile stress area A_s [m^2].

    Returns
    -------
    numpy.ndarray or float
        Yield load [N].

    Notes
    -----
    VDI 2230 Part 1:2015 writes F_0.2min = R_p0.2min A_S for bolts without a reduced
    shank (from memory).

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 5.5 (from memory).
    """
    rp = np.asarray(yield_strength, dtype=float)
    area = np.asarray(stress_area, dtype=float)
    if np.any(~np.isfinite(rp)) or np.any(rp <= 0):
        raise ValueError(f"yield strength must be positive, got {_first_bad(rp)} Pa")
    if np.any(~np.isfinite(area)) or np.any(area <= 0):
        raise ValueError(f"stress area must be positive, got {_first_bad(area)} m^2")
    return rp * area


def _first_bad(arr: np.ndarray) -> str:
    flat = np.atleast_1d(arr).ravel()
    bad = flat[~np.isfinite(flat) | (flat <= 0)]
    return f"{bad[0]:g}"

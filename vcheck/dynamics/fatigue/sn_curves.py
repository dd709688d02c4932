"""S-N curves: allowed cycles of a stress range, from published detail classes or user data.

Four kinds of curve, each a small frozen dataclass with the same methods:

=======================  =====================================================  ==========
class                    curve                                                  registry
=======================  =====================================================  ==========
EN1993DetailCurve        EN 1993-1-9:2005 normal-stress detail categories       "EN 1993-1-9:71"
IIWFatClassCurve         IIW recommendations (Hobbacher 2016), steel FAT class  "IIW:FAT90"
DNVCurveInAir            DNV-RP-C203 (April 2016) Table 2-1, curves in air      "DNV-RP-C203:D"
PiecewiseLogLogCurve     user points (N, S) joined by straight lines in log-log  -
=======================  =====================================================  ==========

Every curve gives

* ``cycles_constant_amplitude(stress_range)``: allowed cycles when every cycle has this
  range (a constant-amplitude fatigue limit applies where the source gives one);
* ``cycles_variable_amplitude(stress_range)``: allowed cycles of this range as one block
  of a spectrum, for a Palmgren-Miner sum (the curve's lower branch and cut-off);
* ``stress_range_at(cycles)``: the stress range allowed for a number of cycles on the
  variable-amplitude curve;

vectorised over numpy arrays, stress ranges in pascals, ``inf`` where a range does no
damage. :data:`SN_CURVES` holds the published curves by name and :func:`sn_curve` looks
one up. The partial factor for fatigue strength of EN 1993-1-9 and mean-stress
corrections for non-welded details complete the module.

Curves are characteristic (design) curves as published: the partial factor gamma_Mf is
applied by the caller, e.g. as a factor on the stress range in
:func:`vcheck.dynamics.fatigue.miner.miner_damage`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
from numpy.typing import ArrayLike

__all__ = [
    "DNV_RP_C203_2016_CURVES_IN_AIR",
    "DNV_RP_C203_REFERENCE_THICKNESS",
    "EN_1993_1_9_DETAIL_CATEGORIES",
    "GAMMA_MF_EN_1993_1_9",
    "IIW_FAT_CLASSES_STEEL",
    "SN_CURVES",
    "DNVCurveInAir",
    "EN1993DetailCurve",
    "EN1993ShearCurve",
    "EN_1993_1_9_SHEAR_CATEGORIES",
    "IIW_THICKNESS_EXPONENTS",
    "ScaledCurve",
    "size_reduction_en1993",
    "thickness_correction_iiw",
    "IIWFatClassCurve",
    "PiecewiseLogLogCurve",
    "SNCurve",
    "mean_stress_en1993_compression",
    "mean_stress_gerber",
    "mean_stress_goodman",
    "partial_factor_fatigue_strength",
    "sn_curve",
]

MPA = 1.0e6
"""Pascals in one megapascal; published curves are tabulated in MPa."""

# --------------------------------------------------------------------- published data

EN_1993_1_9_DETAIL_CATEGORIES = (160, 140, 125, 112, 100, 90, 80, 71, 63, 56, 50, 45, 40, 36)
"""Detail categories of EN 1993-1-9:2005 for normal stress ranges, delta_sigma_C [MPa].

The reference fatigue strength at 2 million cycles. EN 1993-1-9:2005 Eurocode 3: Design
of steel structures - Part 1-9: Fatigue, sec. 7.1, Fig. 7.1 and Tables 8.1 to 8.10."""

IIW_FAT_CLASSES_STEEL = (160, 140, 125, 112, 100, 90, 80, 71, 63, 56, 50, 45, 40, 36)
"""FAT classes of the IIW recommendations for steel, normal stress [MPa].

The characteristic stress range at 2 million cycles. A. Hobbacher, Recommendations for
Fatigue Design of Welded Joints and Components, IIW document IIW-2259-15, 2nd ed.,
Springer, 2016, sec. 3.2 (from memory: the ladder of classes is recalled, not read)."""

DNV_RP_C203_2016_CURVES_IN_AIR = {
    # name: (m1, log a1, m2, log a2, thickness exponent k); S in MPa, N = a S^-m,
    # m1 branch for N <= 1e7, m2 branch for N > 1e7.
    "B1": (4.0, 15.117, 5.0, 17.146, 0.00),
    "B2": (4.0, 14.885, 5.0, 16.856, 0.00),
    "C": (3.0, 12.592, 5.0, 16.320, 0.05),
    "C1": (3.0, 12.449, 5.0, 16.081, 0.10),
    "C2": (3.0, 12.301, 5.0, 15.835, 0.15),
    "D": (3.0, 12.164, 5.0, 15.606, 0.20),
    "E": (3.0, 12.010, 5.0, 15.350, 0.20),
    "F": (3.0, 11.855, 5.0, 15.091, 0.25),
    "F1": (3.0, 11.699, 5.0, 14.832, 0.25),
    "F3": (3.0, 11.546, 5.0, 14.576, 0.25),
    "G": (3.0, 11.398, 5.0, 14.330, 0.25),
    "W1": (3.0, 11.261, 5.0, 14.101, 0.25),
    "W2": (3.0, 11.107, 5.0, 13.845, 0.25),
    "W3": (3.0, 10.970, 5.0, 13.617, 0.25),
}
"""S-N curves in air of DNV-RP-C203 (edition April 2016), Table 2-1.

DNV GL, DNVGL-RP-C203 Fatigue design of offshore steel structures, April 2016, sec.
2.4.4, Table 2-1: log N = log a - m log(delta_sigma (t / t_ref)^k), S in MPa. Values of
B1, C, D, E and F as collected in the project's check values [C]; all fourteen rows agree
with a public reproduction of the table (fatpack's example notebook for this edition)
and with the two branches meeting at N = 1e7 to the rounding of log a2. The later
editions (2019 onward) change the upper curves; this is the 2016 table."""

DNV_RP_C203_REFERENCE_THICKNESS = 0.025
"""Reference thickness t_ref of the DNV-RP-C203 thickness effect for welded
connections other than tubular joints [m]. DNVGL-RP-C203 (2016) sec. 2.4.3 (from
memory)."""

GAMMA_MF_EN_1993_1_9 = {
    ("damage tolerant", "low"): 1.00,
    ("damage tolerant", "high"): 1.15,
    ("safe life", "low"): 1.15,
    ("safe life", "high"): 1.35,
}
"""Recommended partial factors for fatigue strength gamma_Mf of EN 1993-1-9:2005, Table
3.1, by assessment method and consequence of failure [unitless].

Keys: (assessment method, consequence): "damage tolerant" or "safe life", "low" or
"high" consequence. A National Annex may set other values. (From memory: the values
are recalled, not read from the standard.)"""

# ------------------------------------------------------------------------- helpers


def _stress_ranges(stress_range: ArrayLike) -> np.ndarray:
    s = np.asarray(stress_range, dtype=float)
    if s.size:
        bad = ~np.isfinite(s)
        if bad.any():
            raise ValueError(f"stress range must be a finite number, got {s[bad].flat[0]} Pa")
        if (s < 0).any():
            raise ValueError(f"stress range must be zero or positive, got {s[s < 0].flat[0]:g} Pa")
    return s


def _cycle_numbers(cycles: ArrayLike) -> np.ndarray:
    n = np.asarray(cycles, dtype=float)
    if n.size and not (np.isfinite(n) & (n > 0)).all():
        bad = n[~(np.isfinite(n) & (n > 0))].flat[0]
        raise ValueError(f"number of cycles must be positive and finite, got {bad:g}")
    return n


def _positive(name: str, value: float, unit: str) -> float:
    try:
        v = float(value)
    except (TypeError, ValueError):
        raise ValueError(f"{name} must be a number, got {value!r}") from None
    if not (math.isfinite(v) and v > 0):
        raise ValueError(f"{name} must be positive, got {v:g} {unit}")
    return v


def _branches_cycles(branches, s: np.ndarray) -> np.ndarray:
    """Allowed cycles from branches (s_low, m, s_ref, n_ref), highest stress first.

    Branch i holds for s_low_i <= S < s_low_(i-1); below the last s_low the range does
    no damage (N = inf). On a branch N = n_ref (s_ref / S)^m.
    """
    n = np.full(s.shape, np.inf)
    upper = np.inf
    for s_low, m, s_ref, n_ref in branches:
        on = (s >= s_low) & (s < upper) & (s > 0)
        if on.any():
            n[on] = n_ref * (s_ref / s[on]) ** m
        upper = s_low
    return n[()]


def _branches_stress(branches, n: np.ndarray) -> np.ndarray:
    """Inverse of :func:`_branches_cycles` on the branches; the last s_low beyond."""
    s = np.full(n.shape, float(branches[-1][0]))
    n_low = 0.0  # cycles at the upper end of the current branch
    for s_low, m, s_ref, n_ref in branches:
        n_high = n_ref * (s_ref / s_low) ** m if s_low > 0 else np.inf
        on = (n >= n_low) & (n <= n_high)
        if on.any():
            s[on] = s_ref * (n_ref / n[on]) ** (1.0 / m)
        n_low = n_high
    return s[()]


class SNCurve:
    """Common methods of the S-N curves; subclasses define the branches."""

    name: str
    source: str

    def _variable_amplitude_branches(self):  # pragma: no cover - abstract
        raise NotImplementedError

    def _constant_amplitude_branches(self):
        return self._variable_amplitude_branches()

    def cycles_constant_amplitude(self, stress_range: ArrayLike):
        """Allowed cycles at a constant stress range.

        Parameters
        ----------
        stress_range : array_like
            Stress range of every cycle, zero or positive [Pa].

        Returns
        -------
        numpy.ndarray or numpy.float64
            Allowed number of cycles, ``inf`` below the constant-amplitude fatigue
            limit (where the source gives one) and at zero range [cycles].
        """
        return _branches_cycles(self._constant_amplitude_branches(), _stress_ranges(stress_range))

    def cycles_variable_amplitude(self, stress_range: ArrayLike):
        """Allowed cycles of a stress range that is one block of a spectrum.

        Parameters
        ----------
        stress_range : array_like
            Stress range of the block, zero or positive [Pa].

        Returns
        -------
        numpy.ndarray or numpy.float64
            Allowed number of cycles for a Palmgren-Miner sum, ``inf`` below the
            cut-off limit (where the source gives one) and at zero range [cycles].
        """
        return _branches_cycles(self._variable_amplitude_branches(), _stress_ranges(stress_range))

    def stress_range_at(self, cycles: ArrayLike):
        """Stress range allowed for a number of cycles (variable-amplitude curve).

        Parameters
        ----------
        cycles : array_like
            Number of cycles, positive [cycles].

        Returns
        -------
        numpy.ndarray or numpy.float64
            Stress range [Pa]; beyond the cut-off the cut-off limit itself.
        """
        return _branches_stress(self._variable_amplitude_branches(), _cycle_numbers(cycles))

    @property
    def knee_stress_ranges(self) -> tuple[float, ...]:
        """Stress ranges where the curve changes slope or ends, highest first [Pa]."""
        knees = {b[0] for b in self._variable_amplitude_branches()} | {
            b[0] for b in self._constant_amplitude_branches()
        }
        return tuple(sorted((k for k in knees if k > 0), reverse=True))

    @property
    def slopes(self) -> tuple[float, ...]:
        """Inverse slopes m of the variable-amplitude branches, highest stress first
        [unitless]."""
        return tuple(b[1] for b in self._variable_amplitude_branches())


# ----------------------------------------------------------------- EN 1993-1-9


@dataclass(frozen=True)
class EN1993DetailCurve(SNCurve):
    """Fatigue strength curve of an EN 1993-1-9:2005 detail category, normal stress.

    Parameters
    ----------
    detail_category : float
        Reference fatigue strength delta_sigma_C at 2e6 cycles, one of
        :data:`EN_1993_1_9_DETAIL_CATEGORIES` [Pa] (71e6 for category 71).

    Notes
    -----
    EN 1993-1-9:2005, 7.1, eq. (7.1) and (7.2), Fig. 7.1:

    * delta_sigma_R^3 N_R = delta_sigma_C^3 2e6 for N <= 5e6 (m = 3);
    * delta_sigma_D = (2/5)^(1/3) delta_sigma_C = 0.737 delta_sigma_C, the
      constant-amplitude fatigue limit at N_D = 5e6;
    * delta_sigma_R^5 N_R = delta_sigma_D^5 5e6 for 5e6 <= N <= 1e8 (m = 5);
    * delta_sigma_L = (5/100)^(1/5) delta_sigma_D = 0.549 delta_sigma_D, the cut-off
      limit at N_L = 1e8.

    Constant amplitude: ranges below delta_sigma_D do no damage. Variable amplitude:
    the m = 5 branch applies down to delta_sigma_L, below which ranges do no damage.

    References
    ----------
    .. [1] EN 1993-1-9:2005, Eurocode 3: Design of steel structures - Part 1-9:
       Fatigue, CEN, 2005, sec. 7.1 and Fig. 7.1.

    Examples
    --------
    >>> curve = EN1993DetailCurve(71e6)
    >>> round(curve.constant_amplitude_fatigue_limit / 1e6, 1), round(curve.cut_off_limit / 1e6, 1)
    (52.3, 28.7)
    """

    detail_category: float
    name: str = field(init=False)
    source: str = field(init=False, default="EN 1993-1-9:2005, 7.1, Fig. 7.1")

    def __post_init__(self):
        value = _positive("detail category", self.detail_category, "Pa")
        match = [c for c in EN_1993_1_9_DETAIL_CATEGORIES if abs(value - c * MPA) <= 1e-6 * c * MPA]
        if not match:
            valid = ", ".join(str(c) for c in EN_1993_1_9_DETAIL_CATEGORIES)
            raise ValueError(
                f"unknown EN 1993-1-9 detail category {value / MPA:g} MPa; "
                f"valid categories (MPa): {valid}"
            )
        object.__setattr__(self, "detail_category", match[0] * MPA)
        object.__setattr__(self, "name", f"EN 1993-1-9:{match[0]}")

    @property
    def constant_amplitude_fatigue_limit(self) -> float:
        """delta_sigma_D = (2/5)^(1/3) delta_sigma_C, at N_D = 5e6 cycles [Pa]."""
        return (2.0 / 5.0) ** (1.0 / 3.0) * self.detail_category

    @property
    def cut_off_limit(self) -> float:
        """delta_sigma_L = (5/100)^(1/5) delta_sigma_D, at N_L = 1e8 cycles [Pa]."""
        return (5.0 / 100.0) ** (1.0 / 5.0) * self.constant_amplitude_fatigue_limit

    def _constant_amplitude_branches(self):
        return ((self.constant_amplitude_fatigue_limit, 3.0, self.detail_category, 2.0e6),)

    def _variable_amplitude_branches(self):
        d = self.constant_amplitude_fatigue_limit
        return (
            (d, 3.0, self.detail_category, 2.0e6),
            (self.cut_off_limit, 5.0, d, 5.0e6),
        )


EN_1993_1_9_SHEAR_CATEGORIES = (100, 80)
"""Detail categories for shear stress ranges of EN 1993-1-9:2005 [MPa]: 100 (bolts in
single or double shear, Table 8.1 details 15; shear on a fillet or partial-penetration
weld's throat, 80 in Table 8.5 detail 8 / 9 and the shear studs of Table 8.9); curves of
slope 5 (Fig. 7.2). The detail numbers are from memory; the shape is the one of 7.1."""


@dataclass(frozen=True)
class EN1993ShearCurve(SNCurve):
    """Fatigue strength curve of an EN 1993-1-9:2005 shear-stress detail category.

    Parameters
    ----------
    detail_category : float
        Reference fatigue strength delta_tau_C at 2e6 cycles, 100e6 or 80e6 [Pa].

    Notes
    -----
    EN 1993-1-9:2005, 7.1, eq. (7.3) and Fig. 7.2: delta_tau_R^5 N_R = delta_tau_C^5 2e6
    for N <= 1e8 (m = 5), with the cut-off limit delta_tau_L = (2/100)^(1/5) delta_tau_C
    = 0.457 delta_tau_C at N_L = 1e8; no constant-amplitude fatigue limit apart from the
    cut-off. The stress ranges given to it are shear stress ranges.

    References
    ----------
    .. [1] EN 1993-1-9:2005, 7.1 and Fig. 7.2 (from memory).

    Examples
    --------
    >>> curve = EN1993ShearCurve(100e6)
    >>> curve.name, round(curve.cut_off_limit / 1e6, 1)
    ('EN 1993-1-9:shear-100', 45.7)
    """

    detail_category: float
    name: str = field(init=False)
    source: str = field(init=False, default="EN 1993-1-9:2005, 7.1, Fig. 7.2")

    def __post_init__(self):
        value = _positive("detail category", self.detail_category, "Pa")
        match = [c for c in EN_1993_1_9_SHEAR_CATEGORIES if abs(value - c * MPA) <= 1e-6 * c * MPA]
        if not match:
            valid = ", ".join(str(c) for c in EN_1993_1_9_SHEAR_CATEGORIES)
            raise ValueError(f"unknown EN 1993-1-9 shear category {value / MPA:g} MPa; "
                             f"valid categories (MPa): {valid}")
        object.__setattr__(self, "detail_category", match[0] * MPA)
        object.__setattr__(self, "name", f"EN 1993-1-9:shear-{match[0]}")

    @property
    def cut_off_limit(self) -> float:
        """delta_tau_L = (2/100)^(1/5) delta_tau_C, at N_L = 1e8 cycles [Pa]."""
        return (2.0 / 100.0) ** (1.0 / 5.0) * self.detail_category

    def _variable_amplitude_branches(self):
        return ((self.cut_off_limit, 5.0, self.detail_category, 2.0e6),)


@dataclass(frozen=True)
class ScaledCurve(SNCurve):
    """A curve whose fatigue strength is multiplied by a factor at every number of cycles.

    Parameters
    ----------
    base : SNCurve
        A curve defined by branches (EN 1993-1-9, IIW, user points).
    factor : float
        Factor on the stress ranges of the curve, e.g. a size reduction k_s <= 1
        [unitless].
    label : str
        What the factor is, for the name, e.g. "k_s 0.956".

    Notes
    -----
    delta_sigma_R,red(N) = factor x delta_sigma_R(N): every branch's knee and reference
    range are scaled, the slopes and cycle numbers kept (EN 1993-1-9:2005 Table 8.1
    writes the size effect as delta_sigma_C,red = k_s delta_sigma_C; the IIW thickness
    correction multiplies the FAT class alike).
    """

    base: SNCurve
    factor: float
    label: str = ""
    name: str = field(init=False)
    source: str = field(init=False, default="")

    def __post_init__(self):
        _positive("factor", self.factor, "")
        object.__setattr__(self, "name", f"{self.base.name} x {self.label or self.factor}")
        object.__setattr__(self, "source", self.base.source)

    def _scaled(self, branches):
        k = self.factor
        return tuple((s_low * k, m, s_ref * k, n_ref) for s_low, m, s_ref, n_ref in branches)

    def _variable_amplitude_branches(self):
        return self._scaled(self.base._variable_amplitude_branches())

    def _constant_amplitude_branches(self):
        return self._scaled(self.base._constant_amplitude_branches())

    @property
    def constant_amplitude_fatigue_limit(self) -> float | None:
        limit = getattr(self.base, "constant_amplitude_fatigue_limit", None)
        return None if limit is None else limit * self.factor


def size_reduction_en1993(kind: str, dimension: float) -> float:
    """Size reduction factor k_s of EN 1993-1-9:2005 Table 8.1 and 8.3.

    Parameters
    ----------
    kind : str
        "transverse-butt-weld" (thickness t, reference 25 mm, exponent 0.2) or
        "bolt-in-tension" (nominal diameter d, reference 30 mm, exponent 0.25).
    dimension : float
        Plate thickness or bolt diameter [m].

    Returns
    -------
    float
        k_s = (reference / dimension)^exponent where the dimension exceeds the
        reference, 1 otherwise [unitless].

    References
    ----------
    .. [1] EN 1993-1-9:2005 Table 8.1 detail 14 (bolts, k_s = (30/d)^0.25) and Table 8.3
       (transverse butt welds, k_s = (25/t)^0.2) (from memory).

    Examples
    --------
    >>> round(size_reduction_en1993("transverse-butt-weld", 0.040), 4)
    0.9103
    """
    reference, exponent = {"transverse-butt-weld": (0.025, 0.2),
                           "bolt-in-tension": (0.030, 0.25)}[kind]
    size = _positive("dimension", dimension, "m")
    return 1.0 if size <= reference else (reference / size) ** exponent


IIW_THICKNESS_EXPONENTS = {
    "cruciform-or-t-joint": 0.3,
    "cruciform-toe-ground": 0.2,
    "transverse-butt-weld": 0.2,
    "butt-weld-ground-flush": 0.1,
    "longitudinal-weld": 0.1,
}
"""Exponent n of the IIW thickness correction by kind of joint [unitless]: cruciform
joints, transverse T-joints and plates with transverse attachments as welded 0.3, their
toes ground 0.2; transverse butt welds as welded 0.2; butt welds ground flush, base
material, longitudinal welds and attachments 0.1 (IIW recommendations, Hobbacher 2016,
thickness effect table, from memory)."""


def thickness_correction_iiw(thickness: float, exponent: float,
                             reference: float = 0.025) -> float:
    """IIW thickness correction f(t) = (t_ref / t_eff)^n on the FAT class.

    Parameters
    ----------
    thickness : float
        Effective plate thickness t_eff at the crack [m].
    exponent : float
        Thickness exponent n, see :data:`IIW_THICKNESS_EXPONENTS` [unitless].
    reference : float, optional
        Reference thickness t_ref, 25 mm [m].

    Returns
    -------
    float
        f(t), 1 where the thickness does not exceed the reference [unitless].

    References
    ----------
    .. [1] IIW recommendations for fatigue design of welded joints and components
       (Hobbacher, 2016), thickness and size effect (from memory).

    Examples
    --------
    >>> round(thickness_correction_iiw(0.050, 0.3), 4)
    0.8123
    """
    t = _positive("thickness", thickness, "m")
    t_ref = _positive("reference thickness", reference, "m")
    n = float(exponent)
    if not 0 <= n <= 1:
        raise ValueError(f"the thickness exponent must be from 0 to 1, got {n:g}")
    return 1.0 if t <= t_ref else (t_ref / t) ** n


# ------------------------------------------------------------------------ IIW


@dataclass(frozen=True)
class IIWFatClassCurve(SNCurve):
    """S-N curve of an IIW fatigue class (FAT), steel, normal stress.

    Parameters
    ----------
    fat : float
        Characteristic stress range at 2e6 cycles, one of
        :data:`IIW_FAT_CLASSES_STEEL` [Pa] (90e6 for FAT 90).

    Notes
    -----
    N = 2e6 (FAT / S)^3 down to the knee point at N = 1e7, where
    S_knee = FAT (2e6 / 1e7)^(1/3) = 0.585 FAT; beyond the knee the slope is m = 22
    (about 10 % less strength per decade of cycles), with no cut-off. The 2016
    recommendations no longer assume a true fatigue limit for welded joints, so the
    m = 22 branch is used for constant and for variable amplitude alike (from memory:
    the knee point, slope and this reading are recalled, not read from the document;
    taking no constant-amplitude limit is the conservative side of it).

    References
    ----------
    .. [1] A. Hobbacher, Recommendations for Fatigue Design of Welded Joints and
       Components, IIW document IIW-2259-15, 2nd ed., Springer, 2016, sec. 3.2,
       Fig. 3.1 (from memory).

    Examples
    --------
    >>> curve = IIWFatClassCurve(90e6)
    >>> round(curve.knee_stress_ranges[0] / 1e6, 2)
    52.63
    """

    fat: float
    name: str = field(init=False)
    source: str = field(init=False, default="IIW recommendations (Hobbacher, 2016), 3.2")

    def __post_init__(self):
        value = _positive("FAT class", self.fat, "Pa")
        match = [c for c in IIW_FAT_CLASSES_STEEL if abs(value - c * MPA) <= 1e-6 * c * MPA]
        if not match:
            valid = ", ".join(str(c) for c in IIW_FAT_CLASSES_STEEL)
            raise ValueError(
                f"unknown IIW FAT class {value / MPA:g} MPa; valid classes (MPa): {valid}"
            )
        object.__setattr__(self, "fat", match[0] * MPA)
        object.__setattr__(self, "name", f"IIW:FAT{match[0]}")

    def _variable_amplitude_branches(self):
        knee = self.fat * (2.0e6 / 1.0e7) ** (1.0 / 3.0)
        return ((knee, 3.0, self.fat, 2.0e6), (0.0, 22.0, knee, 1.0e7))


# ------------------------------------------------------------------------ DNV


@dataclass(frozen=True)
class DNVCurveInAir(SNCurve):
    """S-N curve in air of DNV-RP-C203 (April 2016), Table 2-1.

    Parameters
    ----------
    curve : str
        Curve name, a key of :data:`DNV_RP_C203_2016_CURVES_IN_AIR` ("D", "F1", ...).
    thickness : float, optional
        Plate thickness at the potential crack [m]; ranges are raised by
        (t / t_ref)^k for t above t_ref = 25 mm. ``None`` (default) or a thickness at
        or below 25 mm: no thickness effect.

    Notes
    -----
    log N = log a1 - m1 log(S (t/t_ref)^k) for N <= 1e7 and
    log N = log a2 - m2 log(S (t/t_ref)^k) for N > 1e7, S in MPa; the switch is at the
    stress range that gives N = 1e7 on the first branch (the "fatigue limit" column of
    the table). There is no cut-off. The same curve is used for constant amplitude:
    no constant-amplitude fatigue limit is relied on (conservative).

    References
    ----------
    .. [1] DNV GL, DNVGL-RP-C203 Fatigue design of offshore steel structures, edition
       April 2016, sec. 2.4.4, Table 2-1, and sec. 2.4.3 (thickness effect).

    Examples
    --------
    >>> round(float(DNVCurveInAir("D").stress_range_at(2e6)) / 1e6, 1)
    90.0
    """

    curve: str
    thickness: float | None = None
    name: str = field(init=False)
    source: str = field(init=False, default="DNVGL-RP-C203 (2016), Table 2-1")

    def __post_init__(self):
        if self.curve not in DNV_RP_C203_2016_CURVES_IN_AIR:
            valid = ", ".join(DNV_RP_C203_2016_CURVES_IN_AIR)
            raise ValueError(
                f"unknown DNV-RP-C203 curve in air {self.curve!r}; valid curves: {valid}"
            )
        if self.thickness is not None:
            _positive("thickness", self.thickness, "m")
        object.__setattr__(self, "name", f"DNV-RP-C203:{self.curve}")

    @property
    def thickness_factor(self) -> float:
        """(t / t_ref)^k for t > t_ref, else 1 [unitless]."""
        k = DNV_RP_C203_2016_CURVES_IN_AIR[self.curve][4]
        if self.thickness is None or self.thickness <= DNV_RP_C203_REFERENCE_THICKNESS:
            return 1.0
        return (self.thickness / DNV_RP_C203_REFERENCE_THICKNESS) ** k

    @property
    def fatigue_limit(self) -> float:
        """Stress range at 1e7 cycles, where the two branches meet [Pa]."""
        m1, log_a1 = DNV_RP_C203_2016_CURVES_IN_AIR[self.curve][:2]
        return 10.0 ** ((log_a1 - 7.0) / m1) * MPA / self.thickness_factor

    def _variable_amplitude_branches(self):
        m1, log_a1, m2, log_a2, _ = DNV_RP_C203_2016_CURVES_IN_AIR[self.curve]
        one_mpa = MPA / self.thickness_factor  # N = a (S f / 1 MPa)^-m
        return (
            (self.fatigue_limit, m1, one_mpa, 10.0**log_a1),
            (0.0, m2, one_mpa, 10.0**log_a2),
        )


# ------------------------------------------------------------------ user curves


@dataclass(frozen=True)
class PiecewiseLogLogCurve(SNCurve):
    """S-N curve through user points, straight lines between them in log-log axes.

    Parameters
    ----------
    cycles : sequence of float
        Cycles N_i of the points, strictly increasing, positive [cycles].
    stress_ranges : sequence of float
        Stress ranges S_i of the points, strictly decreasing, positive [Pa].
    extend_below : bool, optional
        Continue the last segment below the last point. Default ``False``: ranges
        below the last point do no damage (the last point is a cut-off).
    constant_amplitude_limit : float, optional
        Constant-amplitude fatigue limit: at constant amplitude, ranges below it do no
        damage [Pa]. Default: none (constant amplitude uses the same curve).
    name : str, optional
        A label for reports.

    Notes
    -----
    Between points i and i + 1: N = N_i (S_i / S)^m_i with
    m_i = log(N_(i+1) / N_i) / log(S_i / S_(i+1)). Above the first point the first
    segment continues. A single segment with ``extend_below=True`` is the one-slope
    curve N S^m = C.

    Examples
    --------
    >>> curve = PiecewiseLogLogCurve([1e4, 1e7], [400e6, 40e6], extend_below=True)
    >>> [round(m, 12) for m in curve.slopes]
    [3.0]
    """

    cycles: tuple[float, ...]
    stress_ranges: tuple[float, ...]
    extend_below: bool = False
    constant_amplitude_limit: float | None = None
    name: str = "user-defined"
    source: str = field(init=False, default="user-defined points")

    def __post_init__(self):
        n = np.asarray(self.cycles, dtype=float).ravel()
        s = np.asarray(self.stress_ranges, dtype=float).ravel()
        if n.shape != s.shape or n.size < 2:
            raise ValueError(
                "an S-N curve needs at least two points with as many cycle numbers as "
                f"stress ranges, got {n.size} and {s.size}"
            )
        if not (np.isfinite(n).all() and np.isfinite(s).all() and (n > 0).all() and (s > 0).all()):
            raise ValueError("S-N curve points must be positive, finite numbers")
        if not (np.diff(n) > 0).all():
            raise ValueError("S-N curve cycles must be strictly increasing")
        if not (np.diff(s) < 0).all():
            raise ValueError("S-N curve stress ranges must be strictly decreasing")
        if self.constant_amplitude_limit is not None:
            _positive("constant-amplitude limit", self.constant_amplitude_limit, "Pa")
        object.__setattr__(self, "cycles", tuple(n.tolist()))
        object.__setattr__(self, "stress_ranges", tuple(s.tolist()))

    def _variable_amplitude_branches(self):
        n, s = self.cycles, self.stress_ranges
        branches = []
        for i in range(len(n) - 1):
            m = math.log(n[i + 1] / n[i]) / math.log(s[i] / s[i + 1])
            branches.append((s[i + 1], m, s[i], n[i]))
        if self.extend_below:
            _, m, s_ref, n_ref = branches[-1]
            branches[-1] = (0.0, m, s_ref, n_ref)
        return tuple(branches)

    def _constant_amplitude_branches(self):
        branches = self._variable_amplitude_branches()
        limit = self.constant_amplitude_limit
        if limit is None:
            return branches
        kept = []
        for s_low, m, s_ref, n_ref in branches:
            if s_low >= limit:
                kept.append((s_low, m, s_ref, n_ref))
            else:
                kept.append((limit, m, s_ref, n_ref))
                break
        return tuple(kept)


# ---------------------------------------------------------------------- registry


def _registry() -> dict[str, SNCurve]:
    curves: dict[str, SNCurve] = {}
    for c in EN_1993_1_9_DETAIL_CATEGORIES:
        curve = EN1993DetailCurve(c * MPA)
        curves[curve.name] = curve
    for c in EN_1993_1_9_SHEAR_CATEGORIES:
        curve = EN1993ShearCurve(c * MPA)
        curves[curve.name] = curve
    for c in IIW_FAT_CLASSES_STEEL:
        curve = IIWFatClassCurve(c * MPA)
        curves[curve.name] = curve
    for name in DNV_RP_C203_2016_CURVES_IN_AIR:
        curve = DNVCurveInAir(name)
        curves[curve.name] = curve
    return curves


SN_CURVES: dict[str, SNCurve] = _registry()
"""The published curves by name: "EN 1993-1-9:<category>", "EN 1993-1-9:shear-<category>"
(shear stress ranges), "IIW:FAT<class>",
"DNV-RP-C203:<curve>" (curves in air, 2016 edition, no thickness effect)."""


def _closest_name(name: str) -> str | None:
    folded = {"".join(k.lower().split()): k for k in SN_CURVES}
    if "".join(name.lower().split()) in folded:
        return folded["".join(name.lower().split())]
    family, _, tail = name.rpartition(":")
    number = tail.upper().removeprefix("FAT").strip()
    try:
        wanted = float(number)
    except ValueError:
        wanted = None
    if wanted is not None:
        same_family = [
            k for k in SN_CURVES if k.rpartition(":")[0].lower() == family.strip().lower()
        ]
        numbered = []
        for k in same_family:
            try:
                numbered.append((abs(float(k.rpartition(":")[2].removeprefix("FAT")) - wanted), k))
            except ValueError:
                continue
        if numbered:
            return min(numbered)[1]
    import difflib  # only on the error path: keeps the import of this module light

    close = difflib.get_close_matches(name, list(SN_CURVES), n=1, cutoff=0.5)
    return close[0] if close else None


def sn_curve(name: str) -> SNCurve:
    """Published S-N curve by name.

    Parameters
    ----------
    name : str
        A key of :data:`SN_CURVES`, e.g. "EN 1993-1-9:71", "IIW:FAT90",
        "DNV-RP-C203:D".

    Returns
    -------
    SNCurve
        The curve.

    Raises
    ------
    ValueError
        For an unknown name, with the closest valid name and the list of valid names.

    Examples
    --------
    >>> sn_curve("EN 1993-1-9:71").name
    'EN 1993-1-9:71'
    """
    if isinstance(name, str) and name in SN_CURVES:
        return SN_CURVES[name]
    closest = _closest_name(name) if isinstance(name, str) else None
    hint = f" (closest match: {closest!r})" if closest else ""
    raise ValueError(f"unknown S-N curve {name!r}{hint}; valid names: {', '.join(SN_CURVES)}")


# ----------------------------------------------------------------- partial factor


def partial_factor_fatigue_strength(assessment: str, consequence: str) -> float:
    """Partial factor for fatigue strength gamma_Mf of EN 1993-1-9:2005, Table 3.1.

    Parameters
    ----------
    assessment : str
        "damage tolerant" or "safe life".
    consequence : str
        Consequence of failure, "low" or "high".

    Returns
    -------
    float
        gamma_Mf [unitless].

    Notes
    -----
    Recommended values: damage tolerant 1.00 (low consequence) and 1.15 (high); safe
    life 1.15 and 1.35. The fatigue strength is divided by gamma_Mf, which is the same
    as multiplying every stress range by it (from memory, see
    :data:`GAMMA_MF_EN_1993_1_9`).

    References
    ----------
    .. [1] EN 1993-1-9:2005, sec. 3, Table 3.1 (recommended values; a National Annex
       may set others).

    Examples
    --------
    >>> partial_factor_fatigue_strength("safe life", "high")
    1.35
    """
    key = (assessment, consequence)
    if key not in GAMMA_MF_EN_1993_1_9:
        valid = "; ".join(f"{a!r} with {c!r}" for a, c in GAMMA_MF_EN_1993_1_9)
        raise ValueError(
            f"unknown assessment {assessment!r} with consequence {consequence!r}; valid: {valid}"
        )
    return GAMMA_MF_EN_1993_1_9[key]


# ------------------------------------------------------------- mean-stress effect


def _mean_stress_inputs(stress_range, mean_stress, ultimate_strength):
    s = _stress_ranges(stress_range)
    sm = np.asarray(mean_stress, dtype=float)
    if sm.size and not np.isfinite(sm).all():
        raise ValueError("mean stress must be a finite number")
    su = _positive("ultimate strength", ultimate_strength, "Pa")
    if sm.size and (sm >= su).any():
        raise ValueError(
            f"mean stress must be below the ultimate strength {su:g} Pa, "
            f"got {sm[sm >= su].flat[0]:g} Pa"
        )
    return s, sm, su


def mean_stress_goodman(stress_range: ArrayLike, mean_stress: ArrayLike, ultimate_strength: float):
    """Equivalent zero-mean stress range by the Goodman line (non-welded details).

    Parameters
    ----------
    stress_range : array_like
        Stress range of the cycle [Pa].
    mean_stress : array_like
        Mean stress of the cycle, tension positive [Pa].
    ultimate_strength : float
        Ultimate tensile strength of the material [Pa].

    Returns
    -------
    numpy.ndarray or numpy.float64
        Fully reversed stress range of equal damage [Pa].

    Notes
    -----
    S_eq = S / (1 - S_m / S_u) for a tensile mean S_m > 0. A compressive mean is given
    no credit, S_eq = S (common practice). Welded details are assessed on the full
    range regardless of mean stress (their residual stresses reach yield), so this
    applies to plain and machined parts only.

    References
    ----------
    .. [1] J. Goodman, Mechanics Applied to Engineering, Longmans, Green and Co., 1899.
    .. [2] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., McGraw-Hill, 2015, sec. 6-12, modified Goodman line (from memory).
    """
    s, sm, su = _mean_stress_inputs(stress_range, mean_stress, ultimate_strength)
    factor = np.where(sm > 0, 1.0 - sm / su, 1.0)
    return (s / factor)[()]


def mean_stress_gerber(stress_range: ArrayLike, mean_stress: ArrayLike, ultimate_strength: float):
    """Equivalent zero-mean stress range by the Gerber parabola (non-welded details).

    Parameters
    ----------
    stress_range : array_like
        Stress range of the cycle [Pa].
    mean_stress : array_like
        Mean stress of the cycle, tension positive [Pa].
    ultimate_strength : float
        Ultimate tensile strength of the material [Pa].

    Returns
    -------
    numpy.ndarray or numpy.float64
        Fully reversed stress range of equal damage [Pa].

    Notes
    -----
    S_eq = S / (1 - (S_m / S_u)^2) for a tensile mean S_m > 0; no credit for a
    compressive mean, S_eq = S (common practice: the parabola is symmetric and would
    otherwise penalise compression).

    References
    ----------
    .. [1] W. Gerber, Bestimmung der zulässigen Spannungen in Eisenkonstructionen,
       Zeitschrift des Bayerischen Architekten- und Ingenieur-Vereins 6 (1874) 101-110
       (from memory).
    .. [2] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., McGraw-Hill, 2015, sec. 6-12, Gerber line (from memory).
    """
    s, sm, su = _mean_stress_inputs(stress_range, mean_stress, ultimate_strength)
    factor = np.where(sm > 0, 1.0 - (sm / su) ** 2, 1.0)
    return (s / factor)[()]


def mean_stress_en1993_compression(stress_range: ArrayLike, mean_stress: ArrayLike):
    """Reduced stress range of EN 1993-1-9 for non-welded or stress-relieved details.

    Parameters
    ----------
    stress_range : array_like
        Stress range of the cycle [Pa].
    mean_stress : array_like
        Mean stress of the cycle, tension positive [Pa].

    Returns
    -------
    numpy.ndarray or numpy.float64
        Effective stress range: the tensile part in full plus 60 % of the compressive
        part [Pa].

    Notes
    -----
    With sigma_max = S_m + S/2 and sigma_min = S_m - S/2, the effective range is
    max(sigma_max, 0) - max(sigma_min, 0) + 0.6 (max(-sigma_min, 0) - max(-sigma_max, 0)).
    Only for details that are not welded or whose welds are stress relieved.

    References
    ----------
    .. [1] EN 1993-1-9:2005, 7.2.1(1) and Fig. 7.2 (from memory).
    """
    s = _stress_ranges(stress_range)
    sm = np.asarray(mean_stress, dtype=float)
    if sm.size and not np.isfinite(sm).all():
        raise ValueError("mean stress must be a finite number")
    top = sm + 0.5 * s
    bottom = sm - 0.5 * s
    tension = np.maximum(top, 0.0) - np.maximum(bottom, 0.0)
    compression = np.maximum(-bottom, 0.0) - np.maximum(-top, 0.0)
    return (tension + 0.6 * compression)[()]

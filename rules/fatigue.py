"""Fatigue of vibrating details: Palmgren-Miner damage over the design life.

Every ``[[fatigue]]`` detail of a design is judged on its own: its stress cycles over the
design life (from duty blocks, a rainflow-counted time history, a stress PSD, or a
base-acceleration PSD through Miles' equation) are summed against its S-N curve with the
partial factors, D = sum n_i / N(gamma S_i), and the damage is compared with the damage
allowed. The numbers come from :mod:`vcheck.dynamics.fatigue.sn_curves`,
:mod:`vcheck.dynamics.fatigue.rainflow`, :mod:`vcheck.dynamics.fatigue.spectral` and
:mod:`vcheck.dynamics.fatigue.miner`; this module only puts them together, chooses the
constant- or variable-amplitude reading of the curve, and explains the result.

:func:`assess_detail` does the whole sum for one detail and returns a
:class:`DetailAssessment` with every number the finding shows, so that the arithmetic can
be checked apart from the report.
"""

from __future__ import annotations

import math
from typing import Literal

from pydantic import Field

from vcheck.analysis import shared
from vcheck.engine import Rule, RuleOptions
from vcheck.findings import Measure, Source, Status, _finding_with, computed
from vcheck.records import Record

__all__ = [
    "CurveNotFound",
    "DetailAssessment",
    "FatigueDamage",
    "FatigueOptions",
    "Contribution",
    "assess_detail",
    "block_cycles",
    "resolve_curve",
]

_TOLERANCE = 1e-9
"""Relative slack when comparing a utilisation with its limit, so that a design placed
exactly on a limit is judged as on it despite rounding."""

_G = 9.80665  # standard gravity [m/s^2], exact (3rd CGPM, 1901)
_MPA = 1e6
_THIN_BAND = 1e-6
"""Half width of the band, as a fraction of the natural frequency, that stands for the
single-mode response of Miles' equation in the narrow-band damage sum: its up-crossing
rate is f_n (1 + 3e-13), its variance exactly the RMS stress squared."""

_TABLE_ROWS = 6
"""Rows of the contributions table shown with a finding (the largest contributions)."""

# ------------------------------------------------------------------------ sources

EN_1993_CURVES = Source(
    "EN 1993-1-9:2005, 7.1 and Fig. 7.1: fatigue strength curves of the detail categories, "
    "slope 3 to the constant-amplitude fatigue limit at 5e6 cycles, slope 5 to the cut-off "
    "at 1e8")
EN_1993_SHEAR = Source(
    "EN 1993-1-9:2005, 7.1 and Fig. 7.2: fatigue strength curves for shear stress ranges, "
    "categories 100 and 80, slope 5 to the cut-off at 1e8", "from memory")
EN_1993_SIZE = Source(
    "EN 1993-1-9:2005 Table 8.1 and 8.3: size effect k_s = (25/t)^0.2 of transverse butt "
    "welds, (30/d)^0.25 of bolts in tension", "from memory")
IIW_THICKNESS = Source(
    "IIW recommendations (Hobbacher, 2016): thickness correction f(t) = (25 mm / t_eff)^n, "
    "n 0.3 to 0.1 by kind of joint", "from memory")
EN_1993_DAMAGE = Source(
    "EN 1993-1-9:2005, Annex A: damage sum D_d = sum n_Ei / N_Ri <= 1.0; constant "
    "amplitude ranges below the fatigue limit, spectrum ranges below the cut-off do no "
    "damage", "from memory")
EN_1993_FACTORS = Source(
    "EN 1993-1-9:2005, Table 3.1: partial factor for fatigue strength gamma_Mf, 1.00 / 1.15 "
    "damage tolerant, 1.15 / 1.35 safe life (low / high consequence); gamma_Ff = 1.0 "
    "recommended", "from memory")
IIW_CURVES = Source(
    "IIW recommendations for fatigue design of welded joints and components (A. Hobbacher, "
    "IIW-2259-15, 2016), 3.2: FAT classes at 2e6 cycles, slope 3 to 1e7, slope 22 beyond",
    "from memory")
DNV_CURVES = Source(
    "DNVGL-RP-C203 Fatigue design of offshore steel structures, edition April 2016, Table "
    "2-1: S-N curves in air, slope 3 to 1e7 cycles and 5 beyond")
IIW_DAMAGE = Source(
    "IIW recommendations for fatigue design of welded joints and components (Hobbacher, "
    "2016): allowed damage sum D = 0.5 for steel and aluminium under variable amplitude",
    "from memory")
DNV_DFF = Source(
    "DNVGL-OS-C101: design fatigue factors on the life (1, 2, 3 or 10), which DNV uses in "
    "place of a partial factor on the stress range", "from memory")
USER_CURVE = Source("S-N curve given as points in the design: the engineer's data",
                    "common practice")
PLUGIN_CURVE = Source("S-N curve contributed by a plugin: the company's data",
                      "common practice")
MINER = Source(
    "Palmgren-Miner linear damage rule (A. Palmgren, VDI-Z 68, 1924; M. A. Miner, J. Appl. "
    "Mech. 12, 1945)")
ASTM_RAINFLOW = Source(
    "ASTM E1049-85 (reapproved 2017), 5.4.3 (as recalled): rainflow counting of a single "
    "record, the residue counted as half cycles")
ASTM_REPEATING = Source(
    "ASTM E1049-85 (reapproved 2017), simplified rainflow counting for repeating histories "
    "(5.4.4 as recalled): the history started at its largest peak or valley, so that every "
    "range closes, counted once per repetition", "from memory")
DIRLIK = Source(
    "T. Dirlik, Application of computers in fatigue analysis, PhD thesis, University of "
    "Warwick, 1985: rainflow range density from the spectral moments")
NARROW_BAND = Source(
    "narrow-band (Rayleigh) damage, one cycle per zero up-crossing (J. W. Miles, J. "
    "Aeronautical Sciences 21, 1954)")
STEINBERG = Source(
    "D. S. Steinberg, Vibration Analysis for Electronic Equipment, 3rd ed., 2000: three-band "
    "method, 68.3 / 27.1 / 4.33 % of the cycles at 1, 2 and 3 sigma")
MILES = Source(
    "J. W. Miles, On structural fatigue under random loading, J. Aeronautical Sciences 21 "
    "(1954): G_rms = sqrt(pi/2 f_n Q ASD) for one lightly damped mode")
MEAN_EN = Source(
    "EN 1993-1-9:2005, 7.2.1 and Fig. 7.2: non-welded or stress-relieved details, 60 % of "
    "the compressive part of the range", "from memory")
MEAN_GOODMAN = Source(
    "Goodman line, S_eq = S / (1 - S_m / S_u) (Budynas and Nisbett, Shigley's Mechanical "
    "Engineering Design, 10th ed., 6-12)", "from memory")
MEAN_GERBER = Source(
    "Gerber parabola, S_eq = S / (1 - (S_m / S_u)^2) (Budynas and Nisbett, Shigley's "
    "Mechanical Engineering Design, 10th ed., 6-12)", "from memory")
WARN_BAND = Source(
    "warn band: half the allowed damage, a factor 2^(1/3) = 1.26 on the stress range on the "
    "slope-3 branch (1.15 on slope 5), about the uncertainty of a stress estimated from a "
    "vibration level", "common practice")


# ------------------------------------------------------------------------ options


class FatigueOptions(RuleOptions):
    """Policy of the fatigue-damage rule."""

    allowed_damage: float | None = Field(
        None, gt=0, le=1,
        description="Palmgren-Miner damage allowed over the design life for every S-N "
        "family, in place of the family defaults below; above it the rule fails. Not set by "
        "default. A detail may ask for less with its own 'allowed-damage' (the smaller "
        "applies).",
    )
    allowed_damage_en1993: float = Field(
        1.0, gt=0, le=1,
        description="Allowed damage on an EN 1993-1-9 curve. Default 1.0: EN 1993-1-9 Annex "
        "A, D_d <= 1.0 (from memory).",
    )
    allowed_damage_iiw: float = Field(
        0.5, gt=0, le=1,
        description="Allowed damage on an IIW curve under variable amplitude (duty blocks "
        "read as a spectrum, records, spectra). Default 0.5: the IIW recommendations "
        "(Hobbacher 2016) ask for D = 0.5 for steel and aluminium under variable amplitude "
        "(from memory; confirm against the edition used). Constant amplitude stated by the "
        "detail takes 1.0.",
    )
    dnv_design_fatigue_factor: float | None = Field(
        None, ge=1, le=10,
        description="Design fatigue factor DFF of a DNV-RP-C203 curve; allowed damage 1 / "
        "DFF. Not set by default: DFF 1 for low and 2 for high consequence, a part "
        "accessible for inspection and repair (DNVGL-OS-C101, from memory; 3 and 10 when it "
        "is not accessible).",
    )
    allowed_damage_other: float = Field(
        1.0, gt=0, le=1,
        description="Allowed damage on a curve given as points or contributed by a plugin. "
        "Default 1.0: Palmgren-Miner's D = 1 (common practice); the curve's own data may "
        "call for less.",
    )
    warn_utilisation: float = Field(
        0.5, gt=0, le=1,
        description="Share of the allowed damage above which the rule warns. Default 0.5: "
        "twice the damage is only 1.26 times the stress range on the slope-3 branch (1.15 on "
        "slope 5), about the uncertainty of a stress estimated from a vibration level or a "
        "single strain gauge (common practice).",
    )
    default_consequence: Literal["low", "high"] = Field(
        "high",
        description="Consequence of failure taken for the partial factor gamma_Mf when a "
        "detail does not say (EN 1993-1-9 Table 3.1). Default high, the cautious side: a "
        "cracked pipe branch releases what it carries.",
    )
    default_assessment: Literal["safe-life", "damage-tolerant"] = Field(
        "safe-life",
        description="Assessment method taken for gamma_Mf when a detail does not say (EN "
        "1993-1-9 Table 3.1). Default safe life: damage tolerant needs a planned inspection "
        "regime, which machine installations seldom have (common practice).",
    )
    load_partial_factor: float = Field(
        1.0, ge=1, le=2,
        description="Partial factor gamma_Ff on the stress ranges. Default 1.0, the "
        "recommended value of EN 1993-1-9 (from memory).",
    )
    near_limit_fraction: float = Field(
        0.79, gt=0, le=1,
        description="Under constant-amplitude loading (a detail that states it), a factored "
        "range above this share of the constant-amplitude fatigue limit warns, although it "
        "does no damage: a little more stress, or a few larger ranges, and the slope-5 "
        "branch applies. Default 0.79 = 2^(-1/3): the factor 1.26 on the stress range of "
        "the warn band (common practice).",
    )
    histogram_bins: int = Field(
        20, ge=2, le=200,
        description="Equal range bins, from zero to the largest range, in which the "
        "governing bin of a rainflow count or a spectrum is named. Default 20.",
    )


# -------------------------------------------------------------------- assessment


class CurveNotFound(LookupError):
    """A detail names an S-N curve that is neither published nor contributed."""


class Contribution(Record):
    """One row of the damage sum: a block, a range bin or a band of a spectrum.

    ``stress_range`` is the range before the partial factors [Pa] (for a bin of ranges,
    the damage-equivalent range of the bin: the one whose allowed cycles are
    ``allowed``); ``cycles`` over the design life; ``allowed`` cycles N at the factored
    range (inf when it does no damage); ``damage`` n / N, so that the columns reconcile.
    """

    label: str
    stress_range: float
    cycles: float
    allowed: float
    damage: float
    note: str = ""


class DetailAssessment(Record):
    """Every number of one detail's fatigue check, SI units."""

    index: int
    name: str
    source_kind: str
    curve_name: str
    curve_origin: str
    gamma_mf: float
    gamma_ff: float
    damage: float
    allowed_damage: float
    allowed_set_by: str
    years: float
    operating_hours_per_year: float
    case: str
    case_text: str
    governing: Contribution | None
    contributions: tuple[Contribution, ...]
    summary: str
    extra: dict  # the numbers a rule reports beyond these, by name; built with the assessment
    assumptions: tuple[str, ...] = ()
    sources: tuple[Source, ...] = ()
    advice: tuple[str, ...] = ()

    @property
    def gamma(self) -> float:
        """gamma_Ff gamma_Mf, the factor on every stress range [unitless]."""
        return self.gamma_ff * self.gamma_mf

    @property
    def utilisation(self) -> float:
        """D / D_allowed [unitless]."""
        return self.damage / self.allowed_damage

    @property
    def life_years(self) -> float:
        """Years to D = 1 at the same rate; inf without damage [year]."""
        from vcheck.dynamics.fatigue.miner import fatigue_life_years

        return fatigue_life_years(self.damage, self.years)

    @property
    def governing_share(self) -> float:
        """Share of the damage of the governing contribution [unitless]."""
        total = sum(c.damage for c in self.contributions)
        return self.governing.damage / total if self.governing and total > 0 else 0.0


def resolve_curve(detail, catalog=None):
    """The S-N curve of a detail and where it comes from, ``(curve, origin, source)``.

    A name is looked up first among the published curves
    (:data:`vcheck.dynamics.fatigue.sn_curves.SN_CURVES`), then among the curves plugins
    contributed (``catalog.get("sn-curve", name)``). Raises :class:`CurveNotFound`.
    """
    from vcheck.design.fatigue_details import UserCurve
    from vcheck.dynamics.fatigue import sn_curves as sn

    chosen = detail.detail
    if isinstance(chosen, UserCurve):
        origin = "user points in the design" + (f" ({chosen.source})" if chosen.source else "")
        return chosen.sn_curve(), origin, USER_CURVE
    if chosen in sn.SN_CURVES:
        curve = sn.SN_CURVES[chosen]
        if detail.thickness is not None and isinstance(curve, sn.DNVCurveInAir):
            curve = sn.DNVCurveInAir(curve.curve, thickness=detail.thickness.value)
        family = {sn.EN1993DetailCurve: EN_1993_CURVES, sn.EN1993ShearCurve: EN_1993_SHEAR,
                  sn.IIWFatClassCurve: IIW_CURVES, sn.DNVCurveInAir: DNV_CURVES}[type(curve)]
        return curve, "published", family
    item = catalog.get("sn-curve", chosen) if catalog is not None else None
    if item is None:
        contributed = catalog.names("sn-curve") if catalog is not None else []
        listed = ", ".join(contributed) if contributed else "none"
        raise CurveNotFound(
            f"S-N curve '{chosen}' is not a published curve and no plugin contributes it "
            f"(curves from plugins: {listed}); published names look like 'EN 1993-1-9:71', "
            "'IIW:FAT90', 'DNV-RP-C203:D'")
    needed = ("cycles_constant_amplitude", "cycles_variable_amplitude", "knee_stress_ranges",
              "slopes")
    missing = [name for name in needed if not hasattr(item, name)]
    if missing:
        raise CurveNotFound(
            f"the sn-curve '{chosen}' from {catalog.origin('sn-curve', chosen)} is not an "
            f"S-N curve: it lacks {', '.join(missing)} (build it with "
            "vcheck.dynamics.fatigue.sn_curves.PiecewiseLogLogCurve)")
    return item, f"from {catalog.origin('sn-curve', chosen)}", PLUGIN_CURVE


def block_cycles(block, design, operating_seconds: float) -> tuple[float, float, str]:
    """Cycle frequency [Hz], cycles over the design life and how the frequency was set.

    n = f x share x operating time; f is the block's frequency (the top of its tolerance
    band) or its order times the block's speed (the top of the machine's speed range when
    the block gives none).
    """
    if block.frequency is not None:
        frequency = block.frequency.high
        how = f"at {block.frequency.text}"
        if block.frequency.has_tolerance:
            how += " (top of the band)"
    else:
        speed = block.speed if block.speed is not None else design.machine.speed.max
        frequency = block.order * speed.value
        how = f"at {block.order:g}x {speed.text}"
        if block.speed is None and design.machine.speed.is_range:
            how += " (top of the speed range)"
    return frequency, frequency * block.share * operating_seconds, how


def _partial_factors(detail, curve, options: FatigueOptions, assumptions: list[str]):
    from vcheck.dynamics.fatigue.sn_curves import (
        DNVCurveInAir,
        EN1993DetailCurve,
        EN1993ShearCurve,
        IIWFatClassCurve,
        ScaledCurve,
        partial_factor_fatigue_strength,
    )

    if isinstance(curve, ScaledCurve):
        curve = curve.base

    if detail.partial_factor is not None:
        assumptions.append(f"partial factor for fatigue strength gamma_Mf = "
                           f"{detail.partial_factor:g}, as the design states")
        gamma_mf = detail.partial_factor
    elif isinstance(curve, DNVCurveInAir):
        gamma_mf = 1.0
        assumptions.append("no partial factor on the stress ranges of a DNV-RP-C203 curve: "
                           "its design fatigue factor on the life takes that place (the "
                           "allowed damage is 1 / DFF; DNVGL-OS-C101, from memory)")
    else:
        consequence = detail.consequence or options.default_consequence
        assessment = detail.assessment or options.default_assessment
        gamma_mf = partial_factor_fatigue_strength(assessment.replace("-", " "), consequence)
        defaulted = []
        if detail.consequence is None:
            defaulted.append(f"{consequence} consequence (the policy's default-consequence)")
        if detail.assessment is None:
            defaulted.append(f"{assessment.replace('-', ' ')} assessment (the policy's "
                             "default-assessment)")
        if defaulted:
            assumptions.append(f"gamma_Mf = {gamma_mf:g} of EN 1993-1-9 Table 3.1 for "
                               + " and ".join(defaulted))
        if isinstance(curve, IIWFatClassCurve):
            assumptions.append(f"IIW curve: its partial factor gamma_M taken as gamma_Mf "
                               f"{gamma_mf:g} of EN 1993-1-9 Table 3.1 (the IIW "
                               "recommendations leave the value to the application, from "
                               "memory); give partial-factor to state another")
        elif not isinstance(curve, (EN1993DetailCurve, EN1993ShearCurve)):
            assumptions.append(f"a curve of its own data: the partial factor gamma_Mf "
                               f"{gamma_mf:g} of EN 1993-1-9 Table 3.1 is applied to it")
    if options.load_partial_factor != 1.0:
        assumptions.append(f"partial factor on the stress ranges gamma_Ff = "
                           f"{options.load_partial_factor:g} (the policy's load-partial-factor)")
    return gamma_mf, options.load_partial_factor


def _mean_correct(detail, ranges, means, assumptions: list[str], sources: list[Source]):
    """Equivalent ranges of a detail that is not welded; the ranges as given otherwise."""
    import numpy as np

    from vcheck.dynamics.fatigue import sn_curves as sn

    ranges = np.asarray(ranges, dtype=float)
    if not detail.corrects_mean_stress:
        if detail.mean_stress is not None:
            assumptions.append(f"the mean stress '{detail.mean_stress.text}' is not used: a "
                               "welded detail is judged on the full stress range (its "
                               "residual stresses reach yield)")
        return ranges
    correction = detail.correction
    if correction == "en-1993-1-9":
        sources.append(MEAN_EN)
        out = sn.mean_stress_en1993_compression(ranges, means)
        assumptions.append("not welded: 60 % of the compressive part of each range counts "
                           "(EN 1993-1-9 7.2.1)" + ("" if detail.mean_stress_correction
                                                     else ", the default correction"))
    else:
        su = detail.ultimate_strength.value
        function = sn.mean_stress_goodman if correction == "goodman" else sn.mean_stress_gerber
        sources.append(MEAN_GOODMAN if correction == "goodman" else MEAN_GERBER)
        out = function(ranges, means, su)
        assumptions.append(f"not welded: {correction} correction for the mean stress with the "
                           f"ultimate strength '{detail.ultimate_strength.text}'; no credit for "
                           "a compressive mean")
    return np.atleast_1d(np.asarray(out, dtype=float))


def _spectral_mean_factor(detail, assumptions: list[str], sources: list[Source]) -> float:
    """Factor on every range of a spectrum for the mean stress of a detail not welded."""
    if detail.mean_stress is None or not detail.corrects_mean_stress:
        if detail.mean_stress is not None:
            assumptions.append(f"the mean stress '{detail.mean_stress.text}' is not used: a "
                               "welded detail is judged on the full stress range (its "
                               "residual stresses reach yield)")
        return 1.0
    sm = detail.mean_stress.value
    if detail.correction == "en-1993-1-9":
        assumptions.append("not welded, but the EN 1993-1-9 reduction of compressive ranges "
                           "is not applied to a spectrum: no credit taken")
        return 1.0
    su = detail.ultimate_strength.value
    if sm <= 0:
        assumptions.append(f"{detail.correction} correction: no credit for the compressive "
                           f"mean '{detail.mean_stress.text}'")
        return 1.0
    if detail.correction == "goodman":
        sources.append(MEAN_GOODMAN)
        factor = 1.0 / (1.0 - sm / su)
    else:
        sources.append(MEAN_GERBER)
        factor = 1.0 / (1.0 - (sm / su) ** 2)
    assumptions.append(f"not welded: {detail.correction} correction for the mean stress "
                       f"'{detail.mean_stress.text}' with the ultimate strength "
                       f"'{detail.ultimate_strength.text}': every range times {factor:.4g}")
    return factor


def _case_text(curve, case: str) -> str:
    from vcheck.dynamics.fatigue import sn_curves as sn

    factor, base = 1.0, curve
    if isinstance(curve, sn.ScaledCurve):
        factor, base = curve.factor, curve.base
    if isinstance(base, sn.EN1993ShearCurve):
        low = base.cut_off_limit * factor / _MPA
        return (f"{case}, shear stress ranges (EN 1993-1-9 Fig. 7.2): slope 5 down to the "
                f"cut-off delta_tau_L = {low:.1f} MPa, no other fatigue limit")
    if isinstance(base, sn.EN1993DetailCurve):
        d = base.constant_amplitude_fatigue_limit * factor / _MPA
        low = base.cut_off_limit * factor / _MPA
        if case == "constant amplitude":
            return (f"constant amplitude (EN 1993-1-9 7.1): ranges below the fatigue limit "
                    f"delta_sigma_D = {d:.1f} MPa do no damage")
        return (f"spectrum (EN 1993-1-9 Fig. 7.1 and Annex A): slope 5 below delta_sigma_D = "
                f"{d:.1f} MPa down to the cut-off delta_sigma_L = {low:.1f} MPa")
    if isinstance(base, sn.IIWFatClassCurve):
        knee = base.knee_stress_ranges[0] * factor / _MPA
        return (f"{case}: slope 3 to the knee at 1e7 cycles ({knee:.1f} MPa), slope 22 beyond; "
                "no fatigue limit relied on (IIW 2016)")
    if isinstance(curve, sn.DNVCurveInAir):
        return (f"{case}: slope {curve.slopes[0]:g} to 1e7 cycles ({curve.fatigue_limit / _MPA:.1f}"
                f" MPa), slope {curve.slopes[1]:g} beyond, no cut-off (DNV-RP-C203, 2016)")
    knees = getattr(curve, "knee_stress_ranges", ())
    if case == "constant amplitude" and getattr(curve, "constant_amplitude_limit", None):
        return (f"constant amplitude: ranges below the stated limit "
                f"{curve.constant_amplitude_limit / _MPA:.3g} MPa do no damage")
    if isinstance(curve, sn.PiecewiseLogLogCurve):
        slopes = ", ".join(f"{m:.3g}" for m in curve.slopes)
        below = ("the last slope continued below its last point" if curve.extend_below else
                 f"ranges below its last point ({curve.stress_ranges[-1] / _MPA:.3g} MPa) do "
                 "no damage")
        return f"{case}: the curve's {len(curve.cycles)} points, slope {slopes}; {below}"
    if knees:
        return f"{case}: the curve's branches, knees at " + ", ".join(
            f"{k / _MPA:.3g}" for k in knees) + " MPa"
    return f"{case}: the curve as its plugin defines it"


def _corrected(detail, curve, assumptions: list[str], sources: list[Source]):
    """The curve with the EN 1993-1-9 size effect or the IIW thickness correction."""
    from vcheck.dynamics.fatigue import sn_curves as sn

    if detail.size_effect is not None:
        effect = detail.size_effect
        k = sn.size_reduction_en1993(effect.kind, effect.dimension)
        size = (effect.thickness or effect.diameter).text
        sources.append(EN_1993_SIZE)
        if k < 1:
            assumptions.append(f"size effect of a {effect.kind.replace('-', ' ')} of {size}: "
                               f"k_s = {k:.4g} on the detail category (EN 1993-1-9, from "
                               "memory)")
            return sn.ScaledCurve(curve, k, f"k_s {k:.3g}")
        assumptions.append(f"size effect of a {effect.kind.replace('-', ' ')} of {size}: "
                           "none, not above the reference size (k_s = 1)")
    if detail.thickness_correction is not None:
        correction = detail.thickness_correction
        n = sn.IIW_THICKNESS_EXPONENTS[correction.kind]
        f = sn.thickness_correction_iiw(correction.thickness.value, n)
        sources.append(IIW_THICKNESS)
        if f < 1:
            assumptions.append(f"IIW thickness correction of a {correction.kind.replace('-', ' ')}"
                               f" of {correction.thickness.text}: f(t) = (25 mm / t)^{n:g} = "
                               f"{f:.4g} on the FAT class (from memory)")
            return sn.ScaledCurve(curve, f, f"f(t) {f:.3g}")
        assumptions.append(f"IIW thickness correction of {correction.thickness.text}: none, "
                           "not above 25 mm")
    return curve


def _family_allowed_damage(curve, case, detail, options: FatigueOptions, sources):
    """The allowed damage of a curve's family and what set it."""
    from vcheck.dynamics.fatigue import sn_curves as sn

    if options.allowed_damage is not None:
        return options.allowed_damage, "the policy's allowed-damage"
    if isinstance(curve, sn.ScaledCurve):
        curve = curve.base
    if isinstance(curve, (sn.EN1993DetailCurve, sn.EN1993ShearCurve)):
        return options.allowed_damage_en1993, "EN 1993-1-9 Annex A (from memory)"
    if isinstance(curve, sn.IIWFatClassCurve):
        sources.append(IIW_DAMAGE)
        if case == "constant amplitude":
            return 1.0, "the IIW recommendations at constant amplitude (from memory)"
        return options.allowed_damage_iiw, ("the IIW recommendations under variable amplitude "
                                            "(from memory)")
    if isinstance(curve, sn.DNVCurveInAir):
        dff = _design_fatigue_factor(detail, options)
        return 1.0 / dff, f"1 / design fatigue factor {dff:g} (DNVGL-OS-C101, from memory)"
    return options.allowed_damage_other, "Palmgren-Miner's D = 1 for a curve of its own data"


def _design_fatigue_factor(detail, options: FatigueOptions) -> float:
    if options.dnv_design_fatigue_factor is not None:
        return options.dnv_design_fatigue_factor
    consequence = detail.consequence or options.default_consequence
    return 2.0 if consequence == "high" else 1.0


def _reading_text(detail, case: str) -> str:
    """Why duty blocks were read as they were; "" for records and spectra."""
    if detail.source_kind != "block":
        return ""
    if case == "constant amplitude":
        return "; constant amplitude as the detail states (loading = \"constant-amplitude\")"
    if detail.loading == "spectrum":
        return "; the duty blocks read as a spectrum, as the detail states"
    return ("; the duty blocks read as a spectrum, the default (state loading = "
            "\"constant-amplitude\" to use the fatigue limit)")


def _binned(ranges, damage, cycles, bins: int, top: float, gamma: float, curve, label):
    """Contributions of the equal range bins from zero to ``top`` [Pa] that hold cycles."""
    import numpy as np

    edges = np.linspace(0.0, top if top > 0 else 1.0, bins + 1)
    per_bin, _ = np.histogram(ranges, bins=edges, weights=damage)
    count, _ = np.histogram(ranges, bins=edges, weights=cycles)
    rows = []
    for i in range(bins):
        if count[i] <= 0 and per_bin[i] <= 0:
            continue
        upper = float(edges[i + 1])
        rows.append((label(float(edges[i]), upper), upper, float(count[i]),
                     float(per_bin[i])))
    return _reconciled_rows(rows, gamma, curve)


def _reconciled(label: str, upper: float, cycles: float, damage: float, gamma: float, curve,
                note: str = "") -> Contribution:
    """A bin's row whose columns are one reading of the same numbers: allowed = cycles /
    damage, and the range the damage-equivalent one, the range whose allowed cycles those
    are (unfactored) [Pa]; a bin without damage shows its upper edge, no damage."""
    if damage > 0 and cycles > 0:
        allowed = cycles / damage
        try:
            equivalent = float(curve.stress_range_at(allowed)) / gamma
        except (AttributeError, ValueError):
            equivalent = upper
        if not (math.isfinite(equivalent) and 0 < equivalent <= upper * (1 + 1e-9)):
            equivalent = upper
        return Contribution(label, equivalent, cycles, allowed, damage, note)
    return Contribution(label, upper, cycles, math.inf, 0.0, note)


def _reconciled_rows(rows, gamma: float, curve) -> list:
    """:func:`_reconciled` of each ``(label, upper, cycles, damage)`` row, the curve read
    once for every bin that has damage (the same elementwise operations on the same
    numbers as one reading a bin: tests/rules/test_fatigue_fast.py). A curve with an
    inverse of its own, or one that refuses a number, is read bin by bin, as before."""
    import numpy as np

    from vcheck.dynamics.fatigue.sn_curves import SNCurve

    allowed = [cycles / damage for _, _, cycles, damage in rows if damage > 0 and cycles > 0]
    if not allowed or getattr(type(curve), "stress_range_at", None) is not \
            SNCurve.stress_range_at:  # another curve's inverse may take one number only
        return [_reconciled(label, upper, cycles, damage, gamma, curve)
                for label, upper, cycles, damage in rows]
    try:
        ranges = np.atleast_1d(curve.stress_range_at(np.array(allowed))).tolist()
    except (AttributeError, ValueError):
        return [_reconciled(label, upper, cycles, damage, gamma, curve)
                for label, upper, cycles, damage in rows]
    out = []
    read = iter(zip(allowed, ranges))
    for label, upper, cycles, damage in rows:
        if damage > 0 and cycles > 0:
            bin_allowed, stress_range = next(read)
            equivalent = float(stress_range) / gamma
            if not (math.isfinite(equivalent) and 0 < equivalent <= upper * (1 + 1e-9)):
                equivalent = upper
            out.append(Contribution(label, equivalent, cycles, bin_allowed, damage, ""))
        else:
            out.append(Contribution(label, upper, cycles, math.inf, 0.0, ""))
    return out


def _range_label(low: float, high: float) -> str:
    return f"ranges {low / _MPA:.3g}-{high / _MPA:.3g} MPa"


def assess_detail(design, index: int, options: FatigueOptions, catalog=None) -> DetailAssessment:
    """The Palmgren-Miner damage of fatigue detail ``index`` of a design.

    Raises :class:`CurveNotFound` for an unknown curve and LookupError when a data file
    of the detail was not read.
    """
    from vcheck.design.fatigue_details import fatigue_input

    detail = design.fatigue[index]
    curve, origin, curve_source = resolve_curve(detail, catalog)
    assumptions: list[str] = []
    sources: list[Source] = [curve_source, MINER]
    curve = _corrected(detail, curve, assumptions, sources)
    if curve_source is DNV_CURVES:
        sources.append(DNV_DFF)
    gamma_mf, gamma_ff = _partial_factors(detail, curve, options, assumptions)
    sources.append(EN_1993_FACTORS)
    gamma = gamma_mf * gamma_ff
    life = detail.life
    seconds = life.operating_seconds
    if life.hours_per_year is None:
        assumptions.append("runs all the 8766 hours of every year (no 'hours-per-year' given)")
    kind = detail.source_kind
    data = fatigue_input(design, index)
    extra: dict = {"curve": curve}
    if getattr(curve, "constant_amplitude_fatigue_limit", None):
        extra["constant_amplitude_limit"] = curve.constant_amplitude_fatigue_limit
    elif getattr(curve, "constant_amplitude_limit", None):
        extra["constant_amplitude_limit"] = curve.constant_amplitude_limit
    if kind == "block":
        case, contributions, summary = _blocks(design, detail, curve, gamma, seconds,
                                               assumptions, sources, extra)
    elif kind == "history":
        case, contributions, summary = _history(detail, data, curve, gamma, seconds, options,
                                                assumptions, sources, extra)
    elif kind == "psd":
        case, contributions, summary = _psd(detail, data, curve, gamma, seconds, options,
                                            assumptions, sources, extra)
    else:
        case, contributions, summary = _base_psd(detail, curve, gamma, seconds, options,
                                                 assumptions, sources, extra)
    if kind in ("block", "history"):
        damage = float(sum(c.damage for c in contributions))
    else:
        damage = extra["damage"]
    if curve_source is EN_1993_CURVES:
        sources.insert(1, EN_1993_DAMAGE)
    allowed, set_by = _family_allowed_damage(curve, case, detail, options, sources)
    if detail.allowed_damage is not None and detail.allowed_damage < allowed:
        allowed, set_by = detail.allowed_damage, "the detail's allowed-damage"
    governing = max(contributions, key=lambda c: c.damage) if damage > 0 else None
    return DetailAssessment(
        index=index, name=detail.name, source_kind=kind, curve_name=curve.name,
        curve_origin=origin, gamma_mf=gamma_mf, gamma_ff=gamma_ff, damage=damage,
        allowed_damage=allowed, allowed_set_by=set_by, years=life.years,
        operating_hours_per_year=life.operating_seconds_per_year / 3600.0, case=case,
        case_text=_case_text(curve, case) + _reading_text(detail, case), governing=governing,
        contributions=tuple(contributions), summary=summary,
        assumptions=tuple(dict.fromkeys(assumptions)), sources=tuple(dict.fromkeys(sources)),
        extra=extra)


def _blocks(design, detail, curve, gamma, seconds, assumptions, sources, extra):
    import numpy as np

    from vcheck.dynamics.fatigue.miner import miner_damage

    names, ranges, cycles, hows = [], [], [], []
    for number, block in enumerate(detail.block, start=1):
        frequency, n, how = block_cycles(block, design, seconds)
        names.append(f"block {number}" + (f" '{block.name}'" if block.name else ""))
        ranges.append(block.worst_stress_range)
        cycles.append(n)
        hows.append(how)
        if block.has_tolerance:
            assumptions.append(f"{names[-1]}: the top of the stated tolerance band of the "
                               "stress range")
        if block.response is not None:
            per = block.stress_per_response
            assumptions.append(f"{names[-1]}: stress range {per.stress_range.text} per "
                               f"{per.per.amount.text} of response, at a response of "
                               f"{block.response.amount.text}")
    total = sum(block.share for block in detail.block)
    if total > 1 + 1e-9:
        assumptions.append(
            f"the blocks overlap in time (their shares of the hours add up to {total:.4g}): "
            "each is counted on its own, so the larger cycles of their sum are not; give the "
            "range of the combined signal, or a time history, to count those")
    means = detail.mean_stress.value if detail.mean_stress is not None else 0.0
    effective = _mean_correct(detail, ranges, np.full(len(ranges), means), assumptions, sources)
    case = "constant amplitude" if detail.loading == "constant-amplitude" else "spectrum"
    if case == "constant amplitude":
        assumptions.append("constant-amplitude loading, as the detail states (loading = "
                           "\"constant-amplitude\"): ranges below the fatigue limit do no "
                           "damage")
    else:
        how = ("as the detail states" if detail.loading == "spectrum" else
               "the default: machinery stress is seldom of one amplitude (starts, speed "
               "changes, process upsets); state loading = \"constant-amplitude\" to use the "
               "fatigue limit")
        assumptions.append(f"the duty blocks are read as a spectrum ({how})")
    result = miner_damage(effective, cycles, curve, constant_amplitude=case == "constant amplitude",
                          partial_factor=gamma)
    if case == "constant amplitude":
        allowed = np.atleast_1d(curve.cycles_constant_amplitude(gamma * effective))
    else:
        allowed = np.atleast_1d(curve.cycles_variable_amplitude(gamma * effective))
    contributions = []
    for i, name in enumerate(names):
        contributions.append(Contribution(name, float(effective[i]), float(cycles[i]),
                                          float(allowed[i]), float(result.damage_per_bin[i]),
                                          hows[i]))
    summary = f"{len(names)} duty block" + ("s" if len(names) > 1 else "")
    return case, contributions, summary


def _history(detail, data, curve, gamma, seconds, options, assumptions, sources, extra):
    import numpy as np

    from vcheck.dynamics.fatigue.miner import miner_damage
    from vcheck.dynamics.fatigue.rainflow import rainflow_cycles, rainflow_cycles_repeating

    history = detail.history
    stress = data.history
    if history.repeats is not None:
        repeats = history.repeats
    else:
        repeats = history.share * seconds / history.duration.value
    repeating = repeats > 1 + 1e-9
    if repeating:
        ranges, means, counts = rainflow_cycles_repeating(stress)
    else:
        ranges, means, counts = rainflow_cycles(stress)
    if detail.mean_stress is not None:
        means = means + detail.mean_stress.value
    effective = _mean_correct(detail, ranges, means, assumptions, sources)
    life_counts = counts * repeats
    result = miner_damage(effective, life_counts, curve, partial_factor=gamma)
    sources.append(ASTM_REPEATING if repeating else ASTM_RAINFLOW)
    channel = "" if history.channel is None else (
        f", channel '{history.channel}'" if isinstance(history.channel, str)
        else f", column {history.channel}")
    samples = f"({stress.shape[0]} samples, scale {history.scale.text})"
    times = _times(repeats)
    if history.repeats is not None:
        assumptions.append(f"the record '{data.file}'{channel} {samples} repeats {times} "
                           "over the design life, as the detail states")
    else:
        assumptions.append(
            f"the record '{data.file}'{channel} {samples} stands for "
            f"{history.duration.text} of operation and repeats {times} over the design "
            "life" + (f" ({history.share:g} of the operating hours)"
                      if history.share != 1 else ""))
    if repeating:
        assumptions.append(
            "a repeating history: every range closes across the joins, the residue of the "
            "record closed once per repetition (rainflow counted from the record's largest "
            "peak or valley, as ASTM E1049-85 does for a repeating history), the steady "
            "state of the repeated record")
    else:
        half = int(np.count_nonzero(counts == 0.5))
        assumptions.append(
            f"a single record that does not repeat: its rainflow residue counted as half "
            f"cycles ({_count(half, 'half cycle')} among the {_count(counts.shape[0], 'range')} "
            "of the record), as ASTM E1049-85 does")
    top = float(effective.max()) if effective.shape[0] else 0.0
    contributions = _binned(effective, result.damage_per_bin, life_counts,
                            options.histogram_bins, top, gamma, curve, _range_label)
    extra.update(cycles_per_record=float(counts.sum()), repeats=repeats,
                 largest_range=top, samples=int(stress.shape[0]), repeating=repeating)
    how = "counted as a repeating history" if repeating else "residue as half cycles"
    rainflow = _cycles(float(counts.sum()), ".4g").replace(" cycle", " rainflow cycle")
    summary = (f"{rainflow} in the record '{data.file}' "
               f"({how}), largest range {top / _MPA:.3g} MPa")
    return "spectrum", contributions, summary


def _cycles(number: float, spec: str = ".3g") -> str:
    """'1 cycle', '0.5 cycles', '2.05e+05 cycles': singular only where the number shown is 1."""
    shown = format(number, spec)
    return f"{shown} cycle" + ("" if shown == "1" else "s")


def _times(repeats: float) -> str:
    return "once" if repeats == 1 else f"{repeats:.4g} times"


def _count(number: float, noun: str) -> str:
    """'1 cycle', '2 cycles', '1.5 cycles': singular only for exactly one."""
    text = f"{number:.4g}" if isinstance(number, float) else f"{number}"
    return f"{text} {noun}" + ("" if number == 1 else "s")


def _spectral_contributions(pdf, rate, duration, curve, gamma, top, bins, label):
    """Damage of equal range bins of a range density [Pa ranges, unfactored]."""
    import numpy as np

    points = 64 * bins + 1
    s = np.linspace(0.0, top, points)
    n = np.asarray(curve.cycles_variable_amplitude(gamma * s), dtype=float)
    p = np.asarray(pdf(s), dtype=float)
    density = np.where(np.isinf(n), 0.0, p / np.where(np.isinf(n), 1.0, n))
    # the trapezoids of every bin at once: bin i's 64 intervals are row i, each row summed
    # as np.sum sums the bin's own 64 (the same pairwise sum of the same products, bit for
    # bit: tests/rules/test_fatigue_fast.py)
    width = np.diff(s)
    damages = ((density[1:] + density[:-1]) * width).reshape(bins, 64).sum(axis=1).tolist()
    shares = ((p[1:] + p[:-1]) * width).reshape(bins, 64).sum(axis=1).tolist()
    rows = []
    step = top / bins
    for i in range(bins):
        damage = rate * duration * (damages[i] / 2.0)
        share = shares[i] / 2.0
        upper = (i + 1) * step
        rows.append((label(i * step, upper), upper, rate * duration * share, damage))
    return _reconciled_rows(rows, gamma, curve)


_POINTS_PER_SEGMENT = 64
"""Points a segment of a PSD table is divided into before its moments are summed."""


def _straight_lines(frequency, values):
    """The PSD table with each segment divided into :data:`_POINTS_PER_SEGMENT` parts.

    The table means straight lines between its points; the spectral moments are
    trapezoid sums over the points they are given, which on a coarse table misstate the
    moments of the straight lines (m2 of a flat band from 50 to 100 Hz by 7 % with its two
    end points alone). Divided, the sums are within 1e-4 of the straight lines' moments
    (2e-5 for m2, 9e-5 for m4 of a flat band). Tables of more than 4096 points are taken
    as dense already.
    """
    import numpy as np

    f = np.asarray(frequency, dtype=float)
    g = np.asarray(values, dtype=float)
    if f.shape[0] > 4096:
        return f, g
    t = np.arange(_POINTS_PER_SEGMENT) / _POINTS_PER_SEGMENT
    dense = (f[:-1, None] + np.diff(f)[:, None] * t).ravel()
    dense = np.append(dense, f[-1])
    return dense, np.interp(dense, f, g)


def _psd(detail, data, curve, gamma, seconds, options, assumptions, sources, extra):
    from vcheck.dynamics.fatigue import spectral as sp

    psd = detail.psd
    frequency, values = _straight_lines(*data.psd)
    factor = _spectral_mean_factor(detail, assumptions, sources)
    scaled = values * (gamma * factor) ** 2
    duration = psd.share * seconds
    method = psd.method
    damage_of = {"dirlik": sp.damage_dirlik_curve, "narrow-band": sp.damage_narrow_band_curve,
                 "three-band": sp.damage_three_band_curve}[method]
    damage = damage_of(frequency, scaled, duration, curve)
    sources.append({"dirlik": DIRLIK, "narrow-band": NARROW_BAND, "three-band": STEINBERG}[method])
    m0, m1, m2, m4 = sp.spectral_moments(frequency, values * factor**2)
    where = f"'{data.file}'" if data.file else "inline points"
    if m0 == 0:
        extra.update(damage=0.0, rms=0.0)
        return "spectrum", [], f"stress PSD ({where}) with no area: no stress"
    rms = math.sqrt(m0)
    nu0 = sp.zero_upcrossing_rate(m0, m2)
    nu_p = sp.peak_rate(m2, m4)
    alpha = sp.irregularity_factor(m0, m2, m4)
    bins = options.histogram_bins
    if method == "three-band":
        rate = nu0
        contributions = []
        for level, share in sp.STEINBERG_THREE_BAND:
            s = 2 * level * rms
            n_cycles = rate * duration * share
            allowed = float(curve.cycles_variable_amplitude(gamma * s))
            contributions.append(Contribution(
                f"{level:g} sigma band, range {s / _MPA:.3g} MPa", s, n_cycles, allowed,
                0.0 if math.isinf(allowed) else n_cycles / allowed))
    else:
        top = 2.0 * rms * 8.0
        if method == "dirlik":
            d1, _, _, q, _ = sp.dirlik_coefficients(m0, m1, m2, m4)
            if d1 > 0 and math.isfinite(q) and q > 0:
                top = 2.0 * rms * max(8.0, 40.0 * q)
            def pdf(s):
                return sp.range_pdf_dirlik(s, m0, m1, m2, m4)
            rate = nu_p
        else:
            def pdf(s):
                return sp.range_pdf_rayleigh(s, m0)
            rate = nu0
        contributions = _spectral_contributions(pdf, rate, duration, curve, gamma, top, bins,
                                                _range_label)
    name = {"dirlik": "Dirlik's range density", "narrow-band": "narrow-band (Rayleigh) ranges",
            "three-band": "Steinberg's three bands"}[method]
    assumptions.append(
        f"the stress at the detail is a stationary Gaussian process with this PSD ({where}) for "
        + (f"{psd.share:g} of " if psd.share != 1 else "all ")
        + f"the operating hours; cycles from {name}")
    extra.update(damage=damage, rms=rms, nu0=nu0, peak_rate=nu_p, irregularity=alpha)
    corrected = "" if factor == 1 else " after the mean-stress correction"
    summary = (f"stress PSD ({where}), RMS {rms / _MPA:.3g} MPa{corrected}, {nu0:.3g} "
               f"up-crossings and "
               f"{nu_p:.3g} peaks a second (irregularity {alpha:.3f}), {name}")
    return "spectrum", contributions, summary


def _base_psd(detail, curve, gamma, seconds, options, assumptions, sources, extra):
    import numpy as np

    from vcheck.dynamics.fatigue import spectral as sp

    base = detail.base_psd
    fn = base.natural_frequency.value
    q = base.quality_factor
    asd = base.asd_at_natural_frequency
    g_rms = float(sp.miles_rms_response(fn, q, asd))
    factor = _spectral_mean_factor(detail, assumptions, sources)
    rms = g_rms * base.stress_per_acceleration * factor
    duration = base.share * seconds
    band = np.array([fn * (1 - _THIN_BAND), fn * (1 + _THIN_BAND)])
    level = (gamma * rms) ** 2 / (band[1] - band[0])
    damage = sp.damage_narrow_band_curve(band, np.array([level, level]), duration, curve)
    sources += [MILES, NARROW_BAND]
    how = (f"Q = {q:g}" if base.q is not None
           else f"damping ratio {base.damping_ratio:g}, Q = {q:g}")
    input_text = (base.level[1] if base.level is not None
                  else f"{asd / _G**2:.4g} g^2/Hz read from the table")
    assumptions.append(
        f"Miles' equation: one lightly damped mode at {base.natural_frequency.text} ({how}) on a "
        f"base input flat at {input_text} around it; the response is narrow band, one cycle "
        "per up-crossing at the natural frequency with Rayleigh ranges")
    assumptions.append(f"stress {base.stress_per_g.text} per g of the mode's response")
    contributions = _spectral_contributions(
        lambda s: sp.range_pdf_rayleigh(s, rms**2), fn, duration, curve, gamma,
        16.0 * rms, options.histogram_bins, _range_label) if rms > 0 else []
    extra.update(damage=damage, rms=rms, g_rms=g_rms, quality_factor=q)
    summary = (f"Miles: {g_rms / _G:.3g} g RMS response at {base.natural_frequency.text} "
               f"({how}), RMS stress {rms / _MPA:.3g} MPa")
    return "spectrum", contributions, summary


# --------------------------------------------------------------------- the rule


def _share(used: float) -> str:
    if used >= 2:  # "3.68 times the allowed", not "367.7% of the allowed"
        return f"{used:.3g} times"
    if 0 < used < 0.001:
        return "less than 0.1% of"
    return f"{used:.1%} of"


def _years(value: float) -> str:
    if math.isinf(value):
        return "unlimited (no range does damage)"
    return f"{value:.3g} years"


def _last_value_line(design):
    """The line of the design's last value, None for a design without positions."""
    positions = getattr(design, "_positions", None) or {}
    return max((p.value_line for p in positions.values()), default=None)


def _at_end(finding, design):
    """The finding placed on the last line of the design, where [[fatigue]] tables go."""
    last = shared(design, "last-value-line", _last_value_line)
    return _finding_with(finding, line=max(last, finding.line) if last is not None else finding.line,
                         column=1)


class FatigueDamage(Rule):
    """Fatigue-critical details must survive their design life: Palmgren-Miner damage.

    Every ``[[fatigue]]`` detail's stress cycles over the design life are summed against
    its S-N curve, D = sum n_i / N(gamma S_i), with gamma = gamma_Ff gamma_Mf on every
    range. The cycles come from duty blocks (a stress range at a frequency or an order of
    running speed, for a share of the hours), from a time history counted by rainflow
    (ASTM E1049-85), from a stress PSD (Dirlik's range density by default, narrow band or
    Steinberg's three bands), or from a base-acceleration PSD under one lightly damped
    mode (Miles' equation, narrow-band damage).

    Which reading it takes. Duty blocks are a spectrum by default: the slope-5 branch applies down to the
    cut-off, because machinery stress is seldom of one amplitude (starts, speed
    changes, process upsets). Only a detail that states ``loading =
    "constant-amplitude"`` gets the constant-amplitude fatigue limit (ranges below it do
    no damage), and then a factored range above ``near-limit-fraction`` (79%) of that
    limit warns.

    A record that repeats over the life (its ``duration`` shorter than the operating
    time, or ``repeats`` above 1) is a repeating history: every range closes, the
    residue once per repetition (ASTM E1049-85, simplified counting for repeating
    histories). A record that does not repeat keeps its residue as half cycles.

    The allowed damage and the partial factor follow the curve's family: EN 1993-1-9
    (1.0; gamma_Mf of Table 3.1 by consequence and assessment method), IIW (0.5 under
    variable amplitude, 1.0 at a stated constant amplitude; gamma_M taken from EN's
    table and said so), DNV-RP-C203 (no factor on the stress; 1 / DFF, DFF 2 for high
    and 1 for low consequence); all from memory, overridable by policy and detail.

    EN 1993-1-9 shear curves (slope 5) take shear stress ranges; a detail's
    ``size-effect`` (EN 1993-1-9 k_s) or ``thickness-correction`` (IIW f(t)) scales its
    curve.

    The finding says which reading applied and why, the damage, its share of the
    allowed damage, the life in years and the block or range bin that governs; the table
    shows for each bin its damage-equivalent range, cycles, allowed cycles and damage,
    one reading of the same numbers.

    Fails when the damage exceeds the allowed damage (the family's, ``allowed-damage`` in
    policy, or less if the detail asks); warns above ``warn-utilisation`` (half) of it, or
    near the fatigue limit at a stated constant amplitude; passes otherwise. A
    design without ``[[fatigue]]`` tables is reported as not checked.

    Limits of validity: linear damage accumulation without sequence effects; nominal or
    hot-spot stresses as the curve requires (the engineer's choice); a PSD is taken as
    stationary and Gaussian; Miles' equation needs a flat input around one well-separated
    mode.
    """

    id = "fatigue-damage"
    title = "Fatigue damage of vibrating details over the design life"
    applies_to = "fatigue"
    sources = (EN_1993_CURVES, EN_1993_SHEAR, EN_1993_SIZE, EN_1993_DAMAGE, EN_1993_FACTORS,
               IIW_CURVES, IIW_DAMAGE, IIW_THICKNESS,
               DNV_CURVES, DNV_DFF,
               MINER, ASTM_RAINFLOW, ASTM_REPEATING, DIRLIK, NARROW_BAND, STEINBERG, MILES, WARN_BAND)
    Options = FatigueOptions

    def check(self, design, options: FatigueOptions):
        if not design.fatigue:
            yield _at_end(self.finding(
                design, ("fatigue",), Status.NOT_CHECKED,
                "no [[fatigue]] details: fatigue not screened",
                sources=(EN_1993_CURVES, MINER)), design)
            return
        for index, detail in enumerate(design.fatigue):
            try:
                result = assess_detail(design, index, options, self.catalog)
            except LookupError as exc:  # CurveNotFound, or a data file not read
                yield self.finding(design, ("fatigue", index, "detail"), Status.ERROR,
                                   f"{detail.name}: {exc}")
                continue
            yield self._finding(design, result, options)

    def _finding(self, design, result: DetailAssessment, options: FatigueOptions):
        used = result.utilisation
        warn = options.warn_utilisation
        if used > 1 + _TOLERANCE:
            status = Status.FAIL
        elif used > warn * (1 + _TOLERANCE):
            status = Status.WARN
        else:
            status = Status.PASS
        near = ""
        limit_ca = result.extra.get("constant_amplitude_limit")
        if result.case == "constant amplitude" and limit_ca and result.contributions:
            top = max(c.stress_range for c in result.contributions) * result.gamma
            fraction = options.near_limit_fraction
            if top >= fraction * limit_ca * (1 - _TOLERANCE) and top < limit_ca:
                if status is Status.PASS:
                    status = Status.WARN
                near = (f"; the factored range {top / _MPA:.3g} MPa is {top / limit_ca:.1%} of "
                        f"the constant-amplitude fatigue limit {limit_ca / _MPA:.3g} MPa (warns "
                        f"above {fraction:.0%} of it): any larger range in service would do "
                        "damage on the slope-5 branch")
        governing = ""
        if result.governing is not None:
            g = result.governing
            governing = f"; governed by {g.label}"
            if g.note:
                governing += f" {g.note}"
            governing += f": {result.governing_share:.0%} of the damage, {_cycles(g.cycles)}"
            if result.source_kind == "block":
                factored = "" if result.gamma == 1 else (
                    f" ({g.stress_range * result.gamma / _MPA:.3g} MPa with the factor "
                    f"{result.gamma:.3g})")
                governing += (f" of {g.stress_range / _MPA:.3g} MPa{factored} against "
                              f"{g.allowed:.3g} allowed")
        years = f"{result.years:g} year" + ("" if result.years == 1 else "s")
        message = (
            f"{result.name}: damage {result.damage:.3g} over {years} at "
            f"{result.operating_hours_per_year:g} h a year is {_share(used)} the allowed "
            f"{result.allowed_damage:g} (fails above it, warns above {warn:.0%} of it); fatigue "
            f"life {_years(result.life_years)}{governing}; {result.summary}; "
            f"{result.curve_name} ({result.curve_origin}), {_factor_name(result)}"
            + (f" and gamma_Ff {result.gamma_ff:g}" if result.gamma_ff != 1 else "")
            + f"; {result.case_text}{near}")
        assumptions = list(result.assumptions)
        if result.allowed_set_by != "the policy's allowed-damage":
            assumptions.append(f"allowed damage {result.allowed_damage:g} set by "
                               f"{result.allowed_set_by}")
        advice = []
        if near:
            advice.append("confirm that the loading is truly of one amplitude (no starts, "
                          "speed changes or process upsets), or read the blocks as a spectrum "
                          "(leave 'loading' out) with the smaller and larger ranges listed")
        if status is not Status.PASS and result.governing is not None:
            m = _local_slope(result)
            cut = 1 - (warn / used) ** (1 / m)
            advice.append(
                f"to bring the damage to {warn:.0%} of the allowed, the stress ranges must fall "
                f"by about {cut:.0%} (slope {m:.3g} of the curve where the damage is done): "
                "stiffen or detune the part, lower the vibration, or choose a better detail")
            limit = result.extra.get("constant_amplitude_limit")
            if result.case == "constant amplitude" and limit:
                below = limit / result.gamma / _MPA
                advice.append(f"at constant amplitude a range below {below:.3g} MPa (the "
                              f"fatigue limit {limit / _MPA:.3g} MPa / {result.gamma:.3g}) does "
                              "no damage")
        table = [("contribution", "range MPa", "cycles", "allowed", "damage")]
        if result.source_kind != "block":
            table[0] = ("contribution", "equivalent range MPa", "cycles", "allowed", "damage")
        damaging = sorted((c for c in result.contributions if c.damage > 0),
                          key=lambda c: -c.damage)
        shown = damaging[:_TABLE_ROWS]
        for c in shown:
            table.append((c.label, f"{c.stress_range / _MPA:.3g}", f"{c.cycles:.3g}",
                          f"{c.allowed:.3g}", f"{c.damage:.3g}"))
        shown = set(shown)  # equal records hash equal: the same test as the list's, once
        rest = [c for c in result.contributions if c not in shown]
        if rest:
            harmless = all(c.damage == 0 for c in rest)
            table.append(("the others" if len(rest) > 1 else rest[0].label,
                          f"up to {max(c.stress_range for c in rest) / _MPA:.3g}",
                          f"{sum(c.cycles for c in rest):.3g}",
                          "no damage" if harmless else "",
                          "0" if harmless else f"{sum(c.damage for c in rest):.3g}"))
        sources = list(result.sources)
        if status is not Status.PASS:
            sources.append(WARN_BAND)
        return self.finding(
            design, ("fatigue", result.index, "detail"), status, message,
            quantities=_fatigue_quantities(result),
            measured=Measure("damage", float(f"{result.damage:.10g}"), ""),
            limit=Measure("allowed damage", result.allowed_damage, ""),
            margin=float(f"{result.allowed_damage - result.damage:.10g}"),
            assumptions=assumptions, advice=advice, sources=tuple(dict.fromkeys(sources)),
            table=table if len(table) > 1 else ())


def _fatigue_quantities(result: DetailAssessment) -> list:
    """The damage sum by contribution (stress range before the partial factors [Pa],
    cycles over the design life, allowed cycles at the factored range, null where it does
    no damage, and damage), the total, the life and the factors. Lives are in calendar
    years (unit "year"), as the design's life is given."""
    detail = {"detail": result.name}
    out = []
    for c in result.contributions:
        where = {**detail, "bin": c.label}
        out += [computed("stress range", c.stress_range, "Pa", **where),
                computed("cycles", c.cycles, "1", **where),
                computed("allowed cycles", c.allowed, "1", **where),
                computed("damage", c.damage, "1", **where)]
    out += [computed("damage", result.damage, "1", **detail, bin="all"),
            computed("allowed damage", result.allowed_damage, "1", **detail),
            computed("damage utilisation", result.utilisation, "fraction", **detail),
            computed("total cycles", sum(c.cycles for c in result.contributions), "1",
                     **detail),
            computed("fatigue life", result.life_years, "year", **detail),
            computed("design life", result.years, "year", **detail),
            computed("operating time per year", result.operating_hours_per_year * 3600.0, "s",
                     **detail),
            computed("partial factor on fatigue strength", result.gamma_mf, "1", **detail),
            computed("partial factor on the load", result.gamma_ff, "1", **detail)]
    return out


def _factor_name(result: DetailAssessment) -> str:
    """The partial factor as its family names it."""
    if result.curve_name.startswith("DNV") and result.gamma_mf == 1.0:
        return f"no factor on the stress, allowed damage {result.allowed_damage:g} = 1 / DFF"
    if result.curve_name.startswith("IIW"):
        return f"gamma_M {result.gamma_mf:g}"
    return f"gamma_Mf {result.gamma_mf:g}"


def _local_slope(result: DetailAssessment) -> float:
    """Inverse slope m = -d log N / d log S of the curve at the governing range."""
    curve = result.extra["curve"]
    s = result.governing.stress_range * result.gamma
    n_low = float(curve.cycles_variable_amplitude(s * 0.999))
    n_high = float(curve.cycles_variable_amplitude(s * 1.001))
    if not (math.isfinite(n_low) and math.isfinite(n_high)) or n_low <= n_high:
        return 3.0
    return math.log(n_low / n_high) / math.log(1.001 / 0.999)

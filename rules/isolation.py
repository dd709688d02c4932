"""Isolation: do the isolators cut the force passed into the structure?

Three rules judge one machine on its isolators, each with its own number and limit:

- ``isolation-efficiency``: the frequency ratio at the governing (lowest) forcing
  frequency clears sqrt(2) with a margin, and the isolation efficiency at every forcing
  band reaches the efficiency required for the floor; the transmitted unbalance force is
  reported;
- ``isolator-static-deflection``: the isolators deflect at least the minimum of the
  policy table for the equipment, its speed and the floor span, and at least ten times
  as much as the floor does under the machine;
- ``isolation-resonance-passage``: the amplification passed at each rigid-body mode on
  run-up and run-down (from the sweep rate), and whether the machine can run at or near
  one.

The numbers are the closed-form transmissibility of a mass on isolators (one vertical
degree of freedom) or, where every mount is given, the forced response of the six-DOF
rigid-body model (:func:`vcheck.dynamics.modes.rigid_mounts.mount_forced_response`). A machine
with no isolators is reported once, as not checked, by ``isolation-efficiency``.
"""

from __future__ import annotations

import functools
import math
from typing import Annotated, Literal

from pydantic import Field, model_validator

from vcheck.analysis import (
    EXCITATION_KINDS,
    analyse,
    excites_rocking,
    isolator_stiffness_ratio,
    mount_layout,
    mount_mass_matrix,
    rocking_sources,
    shared,
)
from vcheck.design.fields import quantity
from vcheck.design.models import MachineKind
from vcheck.design.units import in_units_of
from vcheck.dynamics.isolation.damping import ELASTOMER_DAMPING_RATIO, STEEL_SPRING_DAMPING_RATIO
from vcheck.engine import Rule, RuleOptions
from vcheck.findings import Measure, Source, Status, computed
from vcheck.records import Record

from . import isolation_policy as policy

__all__ = [
    "IsolationEfficiency",
    "IsolationOptions",
    "IsolatorDamping",
    "IsolatorStaticDeflection",
    "ResonancePassage",
    "ResonancePassageOptions",
    "StaticDeflectionOptions",
    "isolator_damping",
    "worst_transmissibility",
]

SQRT2 = math.sqrt(2.0)
GRAVITY = 9.80665  # m/s^2, standard gravity (3rd CGPM, 1901)
_TOLERANCE = 1e-9
"""Relative slack when comparing with a limit, so that a design placed exactly on the
limit is judged as on it despite rounding."""

# ------------------------------------------------------------------------- sources

THOMSON = Source(
    "W. T. Thomson, M. D. Dahleh, Theory of Vibration with Applications, 5th ed., 1998, "
    "ch. 3: transmissibility T; isolation needs f / f_n above sqrt(2); E = 1 - T",
    "from memory")
CREDE = Source(
    "C. E. Crede, J. E. Ruzicka, Theory of vibration isolation, in Harris' Shock and "
    "Vibration Handbook: viscous and hysteretic transmissibility, resonance peak",
    "from memory")
RATIO_MARGIN = Source(
    "frequency ratio kept clear of sqrt(2) by a margin against stiffness uncertainty",
    "common practice")
EFFICIENCY_PRACTICE = Source(
    "required isolation efficiency 80% on grade, 90% on suspended floors, 95% on long "
    "spans", "common practice")
HARRIS_DAMPING = Source(
    "Harris' Shock and Vibration Handbook, 6th ed.: damping ratio of steel springs about "
    "0.005, of natural rubber and neoprene about 0.05", "from memory")
ISO_21940 = Source(
    "ISO 21940-11:2016 (formerly ISO 1940-1), balance quality grades: permissible residual "
    "unbalance U = G m / Omega at the maximum service speed", "from memory")
ASHRAE_GUIDE = Source(
    "ASHRAE Handbook, HVAC Applications, ch. Noise and Vibration Control, selection guide "
    "for vibration isolation: minimum static deflection by equipment, speed and floor span "
    "(the default table is written from memory, not read from the Handbook)", "from memory")
LOW_SPEED_GUIDE = Source(
    "a published US guide specification for the vibration isolation of building equipment: "
    "below 250 rpm isolation needs special consideration (title not recorded)", "published")
FLOOR_PRACTICE = Source(
    "isolator static deflection at least 10 times the floor's deflection under the load",
    "common practice")
LEWIS = Source(
    "F. M. Lewis, Vibration during acceleration through a critical speed, Trans. ASME 54, "
    "1932: undamped peak 3.67 / sqrt((df/dt) / f_n^2) on a constant-rate passage",
    "from memory")
SWEEP_FIT = Source(
    "damped peak on a constant-rate sweep, A / (Q A_static) = 1 - exp(-2.86 (Q^2 eta)^-0.445) "
    "(Hawkes 1964; Cronin 1965, as given in the vibration-testing literature)", "from memory")
SEPARATION_LIKE = Source(
    "a running speed kept 20% clear of a rigid-body mode, 30% to warn, as for frequency "
    "separation (ACI 351.3R discussion)", "from memory")
PASSAGE_PRACTICE = Source(
    "a resonance peak above about 15 on start-up and run-down calls for damping, restraints "
    "or a fast ramp; a drive must not dwell at the isolation resonance", "common practice")

FloorClass = Literal["slab-on-grade", "span-up-to-20-ft", "span-20-to-30-ft",
                     "span-30-to-40-ft"]
Fraction = Annotated[float, Field(ge=0, lt=1)]
ForcingKind = Literal[EXCITATION_KINDS]
Deflection = quantity("length", tolerance=False)
SpeedLimit = quantity("frequency", tolerance=False)

_FLOOR_WORDS = {
    "slab-on-grade": "a slab on grade",
    "span-up-to-20-ft": "a floor span up to 20 ft",
    "span-20-to-30-ft": "a floor span of 20-30 ft",
    "span-30-to-40-ft": "a floor span of 30-40 ft",
}
_GRADE_SUPPORTS = ("slab-on-grade", "foundation-block")


# -------------------------------------------------------------------------- damping


class IsolatorDamping(Record):
    """The damping of a set of isolators: stated, or the default for their kind.

    ``model`` is "viscous" (``value`` is the damping ratio zeta) or "hysteretic"
    (``value`` is the loss factor eta).
    """

    model: str
    value: float
    stated: bool
    basis: str = ""
    source: str = ""

    def transmissibility(self, frequency_ratio):
        from vcheck.dynamics.isolation import transmissibility as tr

        if self.model == "hysteretic":
            return tr.transmissibility_hysteretic(frequency_ratio, self.value)
        return tr.transmissibility_viscous(frequency_ratio, self.value)

    def peak(self) -> tuple[float, float]:
        """Frequency ratio and height of the transmissibility peak [unitless]."""
        return _damping_peak(self.model, self.value)

    def ratio_for_efficiency(self, efficiency: float) -> float:
        from vcheck.dynamics.isolation import transmissibility as tr

        if self.model == "hysteretic":
            return float(tr.frequency_ratio_for_efficiency_hysteretic(efficiency, self.value))
        return float(tr.frequency_ratio_for_efficiency(efficiency, self.value))

    @property
    def modal_damping_ratio(self) -> float:
        """The viscous damping ratio used in the six-DOF model (eta / 2 at resonance)."""
        return self.value / 2.0 if self.model == "hysteretic" else self.value

    @property
    def words(self) -> str:
        """Short words for a message: "damping ratio 0.02 as stated"."""
        name = "loss factor" if self.model == "hysteretic" else "damping ratio"
        if self.stated:
            return f"{name} {self.value:g} as stated"
        return f"{name} {self.value:g}, the default for {self.basis}"

    @property
    def assumption(self) -> str:
        """The same with its source, for the finding's assumptions."""
        text = f"isolator damping: {self.words}"
        return text if self.stated else f"{text} ({self.source})"


@functools.lru_cache(maxsize=64)
def _damping_peak(model: str, value: float) -> tuple[float, float]:
    """:meth:`IsolatorDamping.peak`, worked out once for each damping: the rules ask for
    it thousands of times a run, for a handful of damping values."""
    from vcheck.dynamics.isolation import transmissibility as tr

    if model == "hysteretic":
        return 1.0, float(tr.transmissibility_hysteretic(1.0, value))
    r_peak, t_peak = tr.resonance_peak_viscous(value)
    return float(r_peak), float(t_peak)


_HARRIS = "Harris' Shock and Vibration Handbook, 6th ed., from memory"


def isolator_damping(mounting) -> IsolatorDamping:
    """The damping of the isolators: ``damping-ratio`` or ``loss-factor`` as stated, or
    the default for the kind of isolator (Harris, from memory)."""
    if mounting.loss_factor is not None:
        return IsolatorDamping("hysteretic", float(mounting.loss_factor), True)
    if mounting.damping_ratio is not None:
        return IsolatorDamping("viscous", float(mounting.damping_ratio), True)
    if mounting.kind in ("rubber", "pad"):
        return IsolatorDamping("viscous", ELASTOMER_DAMPING_RATIO, False,
                               "natural rubber or neoprene", _HARRIS)
    if mounting.kind == "air-spring":
        return IsolatorDamping("viscous", STEEL_SPRING_DAMPING_RATIO, False,
                               "steel springs, taken for air springs", _HARRIS + "; no value "
                               "is recorded for air springs, and the lower one is the stricter "
                               "at resonance")
    return IsolatorDamping("viscous", STEEL_SPRING_DAMPING_RATIO, False,
                           "steel springs without dampers", _HARRIS)


def worst_transmissibility(ratio_low: float, ratio_high: float,
                           damping: IsolatorDamping) -> tuple[float, float]:
    """Largest transmissibility for frequency ratios in [ratio_low, ratio_high].

    T rises up to the peak ratio and falls after it, so the largest value is the peak
    when the range holds it, otherwise the end of the range nearest to it. Returns
    ``(T, r)`` with the ratio where it occurs [unitless].
    """
    r_peak, t_peak = damping.peak()
    if ratio_low <= r_peak <= ratio_high:
        return t_peak, r_peak
    ratio = ratio_high if ratio_high < r_peak else ratio_low
    # damping.transmissibility(ratio), the same function, without the method's import
    # of a package's module on each of the thousands of calls a run makes
    import vcheck.dynamics.isolation.transmissibility as tr

    if damping.model == "hysteretic":
        return float(tr.transmissibility_hysteretic(ratio, damping.value)), ratio
    return float(tr.transmissibility_viscous(ratio, damping.value)), ratio


# ------------------------------------------------------------------ the installation


class _Floor(Record, frozen=False):
    support: str
    span: float | None
    words: str
    assumptions: tuple[str, ...] = ()
    outside_table: bool = False
    missing: str = ""  # what the design leaves out, in words ("" when nothing)


_SUPPORT_ADVICE = ("give [support] with kind (e.g. \"slab-on-grade\" or \"suspended-floor\") "
                   "and span, or structure (a structure file)")


def _floor(design) -> _Floor:
    """What the machine stands on, as the policy tables class it; one per design, shared
    by the isolation rules (never changed by them)."""
    return shared(design, "isolation-floor", _new_floor)


def _new_floor(design) -> _Floor:
    support = design.support
    if support is None:
        longest = policy.FLOOR_SUPPORTS[-1]
        return _Floor(longest, None, "an unknown support (judged as a floor span of 30-40 ft)",
                      ("[support] is not given: judged as the strictest floor class of the "
                       "policy table, a floor span of 30-40 ft",),
                      missing="what the machine stands on ([support] not given; judged as "
                      "the strictest floor class, a span of 30-40 ft)")
    structure = design.structure.structure if design.structure is not None else None
    kind = (support.kind if support is not None else None) or (
        structure.kind if structure is not None else None)
    span = support.span if support is not None and support.span is not None else (
        structure.span if structure is not None else None)
    if kind in _GRADE_SUPPORTS and span is None:
        return _Floor("slab-on-grade", None, _FLOOR_WORDS["slab-on-grade"])
    longest = policy.FLOOR_SUPPORTS[-1]
    if span is None:
        what = f"the {kind}" if kind else "the support"
        return _Floor(longest, None, _FLOOR_WORDS[longest], (
            f"the span of {what} is not given: the longest span class of the policy table, "
            "30-40 ft, is assumed; give support.span",))
    try:
        support_class = policy.floor_support(span.value)
    except ValueError:
        return _Floor(longest, span.value, f"a floor span of {span.text}", (
            f"the floor span {span.text} is longer than the 40 ft the policy table covers: "
            "the 30-40 ft value is used; such floors need their own analysis",), True)
    return _Floor(support_class, span.value, f"{_FLOOR_WORDS[support_class]} ({span.text})")


def _span_for_table(floor: _Floor) -> float | None:
    """A span that the policy tables put in the floor's class [m] (None on grade)."""
    if floor.support == "slab-on-grade":
        return None
    if floor.span is not None and not floor.outside_table:
        return floor.span
    return policy.FLOOR_SPAN_LIMITS[policy.FLOOR_SUPPORTS.index(floor.support) - 1]


class _SixDofModel(Record, frozen=False):
    mass_matrix: object
    positions: object
    stiffnesses: object
    centre_of_gravity: tuple
    supports: object
    orientations: object = None
    solved: object = None  # (damping, MountForceModel), built on first use


class _Installation:
    """One machine on its isolators: masses, isolation frequencies, damping, models."""

    def __init__(self, design, modes) -> None:
        mounting = design.mounting
        self.design = design
        self.mounting = mounting
        base = mounting.base_mass
        machine = design.machine.mass
        self.mass_low = machine.low + (base.low if base else 0.0)
        self.mass = machine.value + (base.value if base else 0.0)
        self.mass_high = machine.high + (base.high if base else 0.0)
        self.modes = modes
        self.six_dof = bool(mounting.mount)
        self.fn_low = max(mode.low for mode in modes)
        self.fn = max(mode.nominal for mode in modes)
        self.fn_high = max(mode.high for mode in modes)
        self.key_path = modes[0].key_path
        self.damping = isolator_damping(mounting)
        self.stiffness_ratio = isolator_stiffness_ratio(mounting)
        self._models = None
        self._static_deflection = None

    @property
    def has_tolerance(self) -> bool:
        return self.fn_low != self.fn_high

    @property
    def dynamic_ratio(self) -> float:
        """Dynamic over static stiffness at its highest, where it applies [unitless]: to a
        rated static deflection always, to a stated stiffness only when the ratio is
        stated, never to six-DOF mount stiffnesses (taken as dynamic)."""
        ratio = self.stiffness_ratio
        if self.six_dof:
            return 1.0
        if self.mounting.stiffness is not None and not ratio.applies_to_stiffness:
            return 1.0
        return ratio.high

    @property
    def stiffness_has_tolerance(self) -> bool:
        """Whether the isolators' stiffness (or rated deflection) carries a tolerance."""
        mounting = self.mounting
        if self.six_dof:
            return any(m.axial_stiffness.has_tolerance or m.shear_stiffness.has_tolerance
                       for m in mounting.mount)
        if mounting.stiffness is not None:
            return mounting.stiffness.has_tolerance
        return mounting.static_deflection.has_tolerance

    @property
    def frequency_words(self) -> str:
        band = "" if not self.has_tolerance else f" ({_hz(self.fn_low)}-{_hz(self.fn_high)} Hz)"
        what = ("the highest rigid-body mode" if self.six_dof else "the isolation frequency")
        return f"{what} {_hz(self.fn)} Hz{band}"

    # -- six-DOF models at the ends of the tolerance bands --------------------------
    def models(self) -> list[_SixDofModel]:
        if self._models is None:
            self._models = _six_dof_models(self)
        return self._models

    def static_deflection(self) -> tuple[float, str]:
        """Smallest isolator static deflection under the carried weight, and how [m];
        worked out once (the rule and its advice both ask)."""
        if self._static_deflection is None:
            self._static_deflection = self._new_static_deflection()
        return self._static_deflection

    def _new_static_deflection(self) -> tuple[float, str]:
        mounting = self.mounting
        if self.six_dof:
            import numpy as np

            from vcheck.dynamics.modes.rigid_mounts import mount_forced_response

            stiff = self.models()[-1]
            weight = (0, 0, -self.mass_low * GRAVITY, 0, 0, 0)
            response = mount_forced_response(
                stiff.mass_matrix, stiff.positions, stiff.stiffnesses, weight, 0.0,
                centre_of_gravity=stiff.centre_of_gravity, orientations=stiff.orientations,
                support_stiffnesses=None)
            sag = -np.real(response.mount_displacements[..., 2])
            return float(sag.min()), (
                "least vertical deflection of any mount under the weight, six-DOF model "
                "at the stiffest mounts and lightest mass (the support's own deflection is "
                "not counted)")
        if mounting.stiffness is not None:
            k = mounting.stiffness
            deflection = self.mass_low * GRAVITY / (mounting.isolators * k.high)
            how = (f"weight of {_kg(self.design, self.mass_low)} on {mounting.isolators} "
                   "isolators of "
                   f"{_kn(k.high)} each")
            if k.has_tolerance or self.mass_low != self.mass:
                how += " (stiffest isolators, lightest mass)"
            return deflection, how
        deflection = mounting.static_deflection
        how = f"rated static deflection {deflection.text}"
        if deflection.has_tolerance:
            how += " at its smallest"
        return deflection.low, how

    def total_stiffness_high(self) -> float:
        """Vertical stiffness of the whole isolator set at its stiffest [N/m]."""
        mounting = self.mounting
        if self.six_dof:
            return float(sum(m.axial_stiffness.high for m in mounting.mount))
        if mounting.stiffness is not None:
            return mounting.isolators * mounting.stiffness.high
        return self.mass * GRAVITY / mounting.static_deflection.low * self.dynamic_ratio


def _six_dof_models(inst: _Installation) -> list[_SixDofModel]:
    layout = mount_layout(inst.design)
    mounts = inst.mounting.mount
    import numpy as np

    models, seen = [], []
    for pick, mass in ((lambda a: a.low, inst.mass_high), (lambda a: a.value, inst.mass),
                       (lambda a: a.high, inst.mass_low)):
        stiffnesses = layout.stiffnesses(mounts, pick)
        if any(mass == m and np.array_equal(stiffnesses, k) for m, k in seen):
            continue  # without tolerances the three models are one
        seen.append((mass, stiffnesses))
        models.append(_SixDofModel(
            mount_mass_matrix(inst.design, mass), layout.positions, stiffnesses,
            layout.centre_of_gravity, layout.supports, layout.orientations))
    return models


def _installation(design):
    """The machine on its isolators, or the reason there is none to judge (a string); one
    per design, shared by the isolation rules, so that each six-DOF model is solved once."""
    return shared(design, "isolation-installation", _new_installation)


def _new_installation(design):
    mounting = design.mounting
    if mounting is None:
        return ("the design has no [mounting] table: give the isolators (kind, count and "
                "stiffness or static deflection), or kind = \"rigid\"")
    if mounting.kind == "rigid":
        return ("the machine is mounted rigidly (mounting.kind = \"rigid\"): there are no "
                "isolators to judge, and the whole machine force reaches the structure")
    modes = [mode for mode in analyse(design).modes if mode.is_isolation]
    if not modes:  # pragma: no cover - the design model demands stiffness or deflection
        return "no isolation frequency could be derived from [mounting]"
    return _Installation(design, modes)


def _judged_bands(design, ignore) -> list:
    return [band for band in analyse(design).bands if band.kind not in ignore]


def _order_of(band, speed) -> float | None:
    """The band's multiple of running speed, or None for a fixed frequency."""
    order = band.low / speed.min.value
    if math.isclose(band.high, order * speed.max.value, rel_tol=1e-9):
        return order
    return None


# ---------------------------------------------------------------------- formatting


def _hz(value: float) -> str:
    return f"{value:.2f}" if value < 10 else f"{value:.1f}"


def _band_hz(low: float, high: float) -> str:
    return f"{_hz(low)} Hz" if low == high else f"{_hz(low)}-{_hz(high)} Hz"


def _rpm(speed: float) -> str:
    return f"{speed * 60:.0f} rpm"


def _kn(stiffness: float) -> str:
    return f"{stiffness / 1000:.3g} kN/m"


def _mm(length: float) -> str:
    return f"{length * 1000:.4g} mm"


def _kg(design, mass: float) -> str:
    """A mass of the machine (with its base) in the unit its mass was written in."""
    return in_units_of(design.machine.mass, mass, "kg")


def _a(kind: str) -> str:
    return ("an " if kind[:1] in "aeiou" else "a ") + kind


def _newton(force: float) -> str:
    return f"{force:.3g} N"


def _times(value: float) -> str:
    return "without limit" if math.isinf(value) else f"{value:.3g} times"


# ------------------------------------------------------------------------- options


class IsolationOptions(RuleOptions):
    """Policy of the isolation-efficiency rule."""

    frequency_ratio_margin: float = Field(
        0.25, ge=0, le=2,
        description="Margin by which the frequency ratio at the governing forcing frequency "
        "must clear sqrt(2): r >= sqrt(2) (1 + margin), 1.77 by default; below it the rule "
        "fails, and below sqrt(2) (amplification) it fails whatever the efficiency. Default "
        "0.25, which keeps the ratio above sqrt(2) for isolators up to 56% stiffer than "
        "judged (common practice).",
    )
    required_efficiency: float | None = Field(
        None, ge=0, lt=1,
        description="One required isolation efficiency (1 - T, from 0 to below 1) for every "
        "machine, replacing the by-floor values. Default: not set.",
    )
    required_efficiency_by_machine: dict[MachineKind, Fraction] = Field(
        {},
        description="Required efficiency by kind of machine, e.g. { generator-set = 0.9 }; "
        "it takes precedence over required-efficiency and the by-floor values. Default: "
        "none.",
    )
    required_efficiency_by_floor: dict[FloorClass, Fraction] = Field(
        {},
        description="Required efficiency by floor class (slab-on-grade, span-up-to-20-ft, "
        "span-20-to-30-ft, span-30-to-40-ft), replacing the policy table's value for that "
        "class. The table: 0.80 on grade, 0.90 up to 20 ft, 0.95 for 20-30 and 30-40 ft "
        "(common practice, from memory).",
    )
    stiffness_allowance: float = Field(
        0.15, ge=0, lt=1,
        description="When the isolators' stiffness or deflection is stated without a "
        "tolerance, the rule warns if isolators this much stiffer would fail. Default 0.15: "
        "isolator stiffness is commonly held to +-10-15% of the catalogue value (common "
        "practice, from memory); 0 turns the warning off.",
    )
    ignore_forcing: tuple[ForcingKind, ...] = Field(
        ("bearing-defect",),
        description="Kinds of forcing band not judged. Default: bearing defect frequencies, "
        "which only a damaged bearing excites (common practice).",
    )
    required_forcing: tuple[ForcingKind, ...] = Field(
        (),
        description="Kinds of forcing band the required efficiency applies to besides the "
        "machine's known loads, e.g. [\"running-speed\", \"blade-pass\"]; the other bands "
        "are reported. Default: none named, so the required efficiency applies where the "
        "machine's loads (unbalance, crank, torque, stated loads) put force, and to every "
        "band when no load is known.",
    )

    largest_static_deflection: dict[Literal["spring", "restrained-spring", "rubber", "pad"],
                                    Deflection] = Field(
        {},
        description="Largest static deflection a stock isolator of a kind offers, e.g. "
        "{ spring = \"125 mm\" }, replacing the default for that kind; advice never asks "
        "for more. Defaults: springs and restrained springs 4 in (102 mm), rubber 0.5 in "
        "(12.7 mm), pads 0.25 in (6.4 mm) (common practice, from memory).",
    )
    largest_base_mass_ratio: float = Field(
        policy.LARGEST_BASE_MASS_RATIO, gt=0, le=20,
        description="Largest inertia base the advice offers, as a multiple of the machine's "
        "mass. Default 2 (common practice).",
    )

    def largest_static_deflection_by_kind(self) -> dict[str, float]:
        table = dict(policy.LARGEST_STATIC_DEFLECTION_BY_ISOLATOR)
        table.update({kind: value.value for kind, value in
                      self.largest_static_deflection.items()})
        return table

    def required_for(self, design, floor: _Floor) -> tuple[float, str]:
        """The efficiency required of this design and what set it, in words."""
        kind = design.machine.kind
        if kind in self.required_efficiency_by_machine:
            return (self.required_efficiency_by_machine[kind],
                    f"required for {_a(kind)} by the policy's required-efficiency-by-machine")
        if self.required_efficiency is not None:
            return self.required_efficiency, "required by the policy's required-efficiency"
        if floor.support in self.required_efficiency_by_floor:
            return (self.required_efficiency_by_floor[floor.support],
                    f"required on {floor.words} by the policy's required-efficiency-by-floor")
        return (policy.required_efficiency(_span_for_table(floor)),
                f"required on {floor.words}")


# ---------------------------------------------------------------- the efficiency rule


class _BandResult(Record, frozen=False):
    band: object
    transmissibility: float
    ratio_low: float
    ratio_high: float
    judged: bool = True
    why: str = ""  # why the required efficiency applies here, or why not

    @property
    def efficiency(self) -> float:
        return 1.0 - self.transmissibility


def _eff(item) -> float:
    """The efficiency judged: a band's, or a machine load's where its force is passed."""
    return item.efficiency if isinstance(item, _BandResult) else item.force_efficiency


def _select_judged(results, loads, speed, required_forcing) -> str:
    """Mark the bands the required efficiency applies to; returns the reason in words.

    The bands that carry a machine load (whose load is judged in their place, with its
    force), the bands of the kinds the policy names in ``required-forcing``; every band
    when neither a load nor the policy says where the force is.
    """
    named = set(required_forcing or ())
    judged_loads = [item for item in loads if item.judged]
    if not named and not judged_loads:
        for item in results:
            item.judged, item.why = True, "yes: no machine load is known"
        return "no machine load is known, so every forcing band is judged"
    for item in results:
        carried = [load for load in judged_loads
                   if math.isclose(load.low, item.band.low, rel_tol=1e-9)
                   and math.isclose(load.high, item.band.high, rel_tol=1e-9)]
        if item.band.kind in named:
            item.judged, item.why = True, "yes: named by the policy"
        elif carried:
            item.judged = False
            item.why = f"by its load: {carried[0].load.name}"
        else:
            item.judged = False
            item.why = "no: no load known here"
    if named:
        return ("the required efficiency applies to the machine's loads and the forcing the "
                "policy names (required-forcing: " + ", ".join(sorted(named)) + ")")
    return ("the required efficiency applies where the machine's loads put force; a band "
            "without a known load is reported, not judged")


def _band_results(inst: _Installation, bands, stiffening: float = 1.0) -> list[_BandResult]:
    from .isolation_loads import band_transmissibility_six_dof

    scale = math.sqrt(stiffening)
    results = []
    for band in bands:
        if inst.six_dof:
            t, _ = band_transmissibility_six_dof(inst, band, stiffening)
        else:
            t = worst_transmissibility(band.low / (inst.fn_high * scale),
                                       band.high / (inst.fn_low * scale), inst.damping)[0]
        results.append(_BandResult(band, t, band.low / (inst.fn_high * scale),
                                   band.high / (inst.fn_low * scale)))
    return results


class _Verdict(Record, frozen=False):
    status: Status
    ratio: float
    worst: object  # _BandResult or isolation_loads.LoadResult
    reason: str  # "amplification", "margin", "efficiency" or ""
    loads: list
    judged_why: str = ""  # where the required efficiency applies, in words


def _judge(inst, bands, required, least_ratio, stiffening=1.0,
           required_forcing=None) -> tuple[_Verdict, list]:
    from .isolation_loads import load_results

    results = _band_results(inst, bands, stiffening)
    loads = load_results(inst, analyse(inst.design).loads, inst.design.machine.speed,
                         stiffening)
    why = _select_judged(results, loads, inst.design.machine.speed, required_forcing)
    governing = min(results, key=lambda item: (item.band.low, item.band.name))
    candidates = [(item.efficiency, item.band.low, 0, index, item)
                  for index, item in enumerate(results) if item.judged]
    candidates += [(item.force_efficiency, item.low, 1, index, item)
                   for index, item in enumerate(loads) if item.judged]
    if not candidates:  # the policy names kinds the machine has none of
        candidates = [(item.efficiency, item.band.low, 0, index, item)
                      for index, item in enumerate(results)]
    worst = min(candidates, key=lambda c: c[:4])[4]
    ratio = governing.ratio_low
    verdict = _Verdict(Status.PASS, ratio, worst, "", loads, why)
    if ratio < SQRT2 * (1 - _TOLERANCE):
        verdict.status, verdict.reason = Status.FAIL, "amplification"
    elif ratio < least_ratio * (1 - _TOLERANCE):
        verdict.status, verdict.reason = Status.FAIL, "margin"
    elif _eff(worst) < required - _TOLERANCE:
        verdict.status, verdict.reason = Status.FAIL, "efficiency"
    return verdict, results


def _what(item) -> tuple[str, str]:
    """Name and band of a judged band or load result."""
    if isinstance(item, _BandResult):
        return item.band.name, _band_hz(item.band.low, item.band.high)
    return item.load.name, _band_hz(item.low, item.high)


def _percent(efficiency: float) -> str:
    """An efficiency as the report says it; below zero the isolators amplify the force, and
    that is said as a multiple ("none (amplifies x4.65)"), not as "-364.5%"."""
    if math.isinf(efficiency):
        return "unbounded amplification"
    if efficiency < 0:
        return f"none (amplifies x{1 - efficiency:.3g})"
    return f"{efficiency:.1%}"


class IsolationEfficiency(Rule):
    """Isolators must cut the force passed into the structure at every forcing frequency.

    The governing forcing frequency is the lowest edge of any forcing band over the
    whole speed range (a variable-speed drive at its minimum speed, the half order of a
    four-stroke engine...). Its ratio to the isolation frequency, at the stiffest end of
    any stated tolerance, must clear sqrt(2) by ``frequency-ratio-margin``; below sqrt(2)
    the isolators amplify. The isolation efficiency E = 1 - T is computed for every
    forcing band, in its worst case within the band and the tolerances, and the worst
    one where force is transmitted is judged against the efficiency required for the floor
    the machine stands on (policy table by floor class, or the project's values by machine
    kind): every machine load, by its largest force passed over the largest force rigid
    mounting would pass in its band (a band carrying a load is judged by its load), and
    the bands of the kinds the policy names in ``required-forcing``; every band when no
    machine load is known. The other bands are reported in the table's "judged" column
    and named in the message where they fall short. With every
    mount given, T is the largest force at any mount over the same load shared by the
    mounts without dynamic amplification (rigid mounting), from the six-DOF model: each
    band with unit forces across the shaft and vertically at the centre of gravity (and
    a unit moment about the shaft for firing and compression), and every load the machine
    generates (unbalance of the rotor's balance grade, crank forces and moments, torque
    reaction, stated loads) with its own vectors at its point of action; peaks over the
    speed range are found by a search seeded at every rigid-body mode. Otherwise the
    closed form of one vertical degree of freedom, with each load along the bounce axis;
    a moment it cannot take is named and the rule then at best warns. Damping is as
    stated (``damping-ratio`` or ``loss-factor``) or the default for the kind of
    isolator, listed as an assumption. The load that puts the most force into the
    structure is reported with its mount force against rigid mounting.

    Fails when the governing frequency ratio is below sqrt(2) (1 + margin), or when the
    worst judged efficiency is below the required one; the advice then gives the isolator
    stiffness, the inertia base mass, or the minimum drive speed that would clear it,
    within what exists (``largest-static-deflection`` by isolator kind,
    ``largest-base-mass-ratio``), saying so when no stock isolator clears it. Warns when
    isolators stated without a tolerance would fail if they were ``stiffness-allowance``
    stiffer, when a load's point of action lies far outside the machine, when the
    one-degree-of-freedom model cannot judge a load's moment, when the machine excites
    rocking (:func:`vcheck.analysis.excites_rocking`) and the isolators are given without
    mount positions, or when the design has no ``[support]`` (judged at the strictest
    floor class; a shortfall that would pass on grade then warns); passes otherwise.
    Without damping a band across a rigid-body mode has no bound: FAIL. A machine mounted
    rigidly, or a design without [mounting], is reported as not checked.

    Limits of validity: rigid machine, massless linear isolators, steady harmonic
    forcing; standing waves in the isolators (surge of springs) and the response of the
    floor to what is transmitted are not computed.
    """

    id = "isolation-efficiency"
    title = "Isolators cut the force passed into the structure"
    applies_to = "mounting"
    sources = (THOMSON, CREDE, RATIO_MARGIN, EFFICIENCY_PRACTICE, HARRIS_DAMPING, ISO_21940)
    Options = IsolationOptions

    def check(self, design, options: IsolationOptions):
        inst = _installation(design)
        if isinstance(inst, str):
            yield self.finding(design, ("mounting",) if design.mounting else ("machine",),
                               Status.NOT_CHECKED, inst)
            return
        bands = _judged_bands(design, options.ignore_forcing)
        floor = _floor(design)
        required, required_words = options.required_for(design, floor)
        least_ratio = least_frequency_ratio(options.frequency_ratio_margin)
        verdict, results = _judge(inst, bands, required, least_ratio,
                                  required_forcing=options.required_forcing)
        status = verdict.status
        lenient_words = ""
        if floor.missing and verdict.reason == "efficiency":
            lenient, _ = options.required_for(design, _Floor("slab-on-grade", None,
                                                             _FLOOR_WORDS["slab-on-grade"]))
            if _eff(verdict.worst) >= lenient - _TOLERANCE:
                status = Status.WARN
                lenient_words = (f"; it meets the {lenient:.0%} required on a slab on grade, "
                                 "so the verdict waits on the support")
        stiffer = None
        if (status is Status.PASS and not inst.stiffness_has_tolerance
                and options.stiffness_allowance > 0):
            stiffer, _ = _judge(inst, bands, required, least_ratio,
                                1.0 + options.stiffness_allowance, options.required_forcing)
            if stiffer.status is Status.FAIL:
                status = Status.WARN
        governing = min(results, key=lambda item: (item.band.low, item.band.name))
        worst = verdict.worst
        worst_name, worst_band = _what(worst)
        speed = design.machine.speed
        at_low_speed = (" at the bottom of the speed range" if speed.is_range
                        and _order_of(governing.band, speed) is not None else "")
        ratio_text = (f"frequency ratio {verdict.ratio:.2f} at {governing.band.name} "
                      f"{_hz(governing.band.low)} Hz{at_low_speed} (the lowest forcing) "
                      f"against {inst.frequency_words}")
        if inst.has_tolerance:
            ratio_text += " at the stiffest within tolerance"
        what_is_t = "the worst mount's force" if inst.six_dof else "the force"
        if verdict.reason == "amplification":
            message = (f"{ratio_text} is inside the amplification zone (below sqrt(2) = 1.41): "
                       + (f"{what_is_t} at that band has no bound without damping"
                          if math.isinf(governing.transmissibility) else
                          f"{what_is_t} at that band is {governing.transmissibility:.2f} times "
                          "what rigid mounting would pass, instead of less")
                       + f", whatever the {required:.0%} efficiency target")
            measured = Measure("frequency ratio", round(verdict.ratio, 6))
            limit = Measure("least frequency ratio", round(least_ratio, 6))
        elif verdict.reason == "margin":
            message = (f"{ratio_text} does not clear sqrt(2) by the "
                       f"{options.frequency_ratio_margin:.0%} margin (at least "
                       f"{least_ratio:.2f}); efficiency there "
                       f"{_percent(governing.efficiency)}, {required:.0%} {required_words}")
            measured = Measure("frequency ratio", round(verdict.ratio, 6))
            limit = Measure("least frequency ratio", round(least_ratio, 6))
        else:
            word = ("is below" if status is Status.FAIL
                    or _eff(worst) < required - _TOLERANCE else "meets")
            where = (" (where it puts force into the structure: its largest force passed over "
                     "the largest rigid mounting would pass in the band)"
                     if not isinstance(worst, _BandResult) and worst.load.exponent else "")
            message = (f"worst isolation efficiency {_percent(_eff(worst))} at "
                       f"{worst_name} {worst_band}{where} {word} the {required:.0%} "
                       f"{required_words}; {verdict.judged_why}; {ratio_text}")
            reported = [item for item in results if not item.judged
                        and item.why.startswith("no:") and item.efficiency < required]
            if reported:
                message += ("; reported, not judged: " + ", ".join(
                    f"{item.band.name} {_percent(item.efficiency)}" for item in reported))
            if math.isinf(_eff(worst)):
                message += ("; with no damping the response at a rigid-body mode inside the "
                            "band has no bound: give the isolators' damping")
            if stiffer is not None and stiffer.status is Status.FAIL:
                message += (f"; isolators {options.stiffness_allowance:.0%} stiffer than "
                            f"stated would give {_percent(_eff(stiffer.worst))} "
                            f"(frequency ratio {stiffer.ratio:.2f})")
            value = _eff(worst) if math.isfinite(_eff(worst)) else None
            measured = (Measure("isolation efficiency", round(value, 6), "fraction")
                        if value is not None else None)
            limit = Measure("required efficiency", required, "fraction")
        loads = analyse(design).loads
        message += _load_sentence(verdict.loads, inst)
        unjudged = [f"{item.load.name} ({item.unjudged})" for item in verdict.loads
                    if item.unjudged]
        notes = list(loads.notes) if loads is not None else []
        rocking = _rocking_gap(design, inst)
        gaps = [text for text in (floor.missing, f"rocking on the isolators ({rocking})"
                                  if rocking else "") if text]
        if status is Status.PASS and (unjudged or notes or gaps):
            status = Status.WARN
        if unjudged:
            message += ("; not judged by the one-degree-of-freedom model: " + ", ".join(unjudged)
                        + ": give [[mounting.mount]] tables for the six rigid-body modes")
        for _, note in notes:
            message += f"; {note}"
        message += lenient_words
        if gaps:
            message += "; not considered: " + "; ".join(gaps)
        margin = (None if measured is None else round(measured.value - limit.value, 6))
        assumptions = _assumptions(design, inst, floor)
        if status is Status.WARN and stiffer is not None and stiffer.status is Status.FAIL:
            assumptions.append(
                f"the isolators' stiffness is stated without a tolerance: isolators "
                f"{options.stiffness_allowance:.0%} stiffer (the policy's stiffness-allowance) "
                "were also judged")
        for item in verdict.loads:
            assumptions += [a for a in item.load.assumptions if a not in assumptions]
        advice = []
        if verdict.status is not Status.PASS or (stiffer is not None
                                                 and stiffer.status is Status.FAIL):
            scale = 1.0 + options.stiffness_allowance if verdict.status is Status.PASS else 1.0
            advice = _efficiency_advice(design, inst, results, required, least_ratio, scale,
                                        options, verdict.loads)
        if notes:
            advice.append("check the point of action of each load named above: a point far "
                          "outside the machine gives moments that are not there")
        if floor.missing:
            advice.append(_SUPPORT_ADVICE)
        if rocking:
            advice.append(_ROCKING_ADVICE)
        table = [("forcing", "band Hz", "frequency ratio", "transmissibility", "efficiency",
                  "judged", "largest mount force")]
        for item in sorted(results, key=lambda r: (r.band.low, r.band.name)):
            ratio = (f"{item.ratio_low:.2f}" if math.isclose(item.ratio_low, item.ratio_high)
                     else f"{item.ratio_low:.2f}-{item.ratio_high:.2f}")
            table.append((item.band.name, _band_hz(item.band.low, item.band.high), ratio,
                          _t(item.transmissibility), _percent(item.efficiency), item.why, ""))
        table += _load_rows(verdict.loads, inst)
        if not verdict.loads:
            table = [row[:-1] for row in table]
        yield self.finding(
            design, inst.key_path, status, message, measured=measured, limit=limit,
            margin=margin, assumptions=assumptions, advice=advice, table=table,
            table_title="efficiency at every forcing band and machine load",
            quantities=_efficiency_quantities(inst, results, verdict, required, least_ratio))


def _isolation_mode_quantities(inst) -> list:
    """The isolation natural frequencies the isolation rules rest on [Hz]."""
    out = []
    for mode in inst.modes:
        out.append(computed("natural frequency", mode.nominal, "Hz", mode=mode.name,
                            origin=mode.origin))
        if mode.low != mode.high:
            out.append(computed("natural frequency band", (mode.low, mode.high), "Hz",
                                mode=mode.name, origin=mode.origin))
    return out


def _efficiency_quantities(inst, results, verdict, required, least_ratio) -> list:
    """Frequency ratios, transmissibilities and efficiencies of every band, and the
    transmissibility, efficiency and forces of every machine load [1, fraction, N, Hz]."""
    out = _isolation_mode_quantities(inst)
    for item in sorted(results, key=lambda r: (r.band.low, r.band.name)):
        band = item.band.name
        out += [computed("forcing frequency band", (item.band.low, item.band.high), "Hz",
                         band=band, kind=item.band.kind),
                computed("frequency ratio", (item.ratio_low, item.ratio_high), "1", band=band),
                computed("transmissibility", item.transmissibility, "1", band=band),
                computed("isolation efficiency", item.efficiency, "fraction", band=band,
                         judged="yes" if item.judged else "no")]
    for item in verdict.loads:
        if not item.judged:
            continue
        load = item.load.name
        mount = None if item.mount is None else str(item.mount + 1)
        out += [computed("forcing frequency band", (item.low, item.high), "Hz", load=load),
                computed("transmissibility", item.transmissibility, "1", load=load),
                computed("isolation efficiency", item.force_efficiency, "fraction", load=load),
                computed("largest mount force", item.mount_force, "N", load=load, mount=mount),
                computed("frequency of the largest mount force", item.frequency, "Hz",
                         load=load),
                computed("rigid mount force", item.rigid_force, "N", load=load, mount=mount),
                computed("total force into the structure", item.total_force, "N", load=load)]
        if item.mount_peaks:
            order = "in the order of [[mounting.mount]], from 1"
            out += [computed("force at each mount", list(item.mount_peaks), "N", load=load,
                             mounts=order),
                    computed("rigid force at each mount", list(item.rigid_mounts), "N",
                             load=load, mounts=order)]
            for axis, name in enumerate(("x", "y", "z")):
                out += [computed("force component at each mount",
                                 [row[axis] for row in item.mount_peak_components], "N",
                                 load=load, direction=name, mounts=order),
                        computed("rigid force component at each mount",
                                 [row[axis] for row in item.rigid_mount_components], "N",
                                 load=load, direction=name, mounts=order)]
    out += [computed("frequency ratio", verdict.ratio, "1", governing="lowest forcing"),
            computed("least frequency ratio", least_ratio, "1"),
            computed("required efficiency", required, "fraction")]
    return out


def _t(value: float) -> str:
    return "unbounded" if math.isinf(value) else f"{value:.4g}"


def _load_rows(results, inst) -> list[tuple[str, ...]]:
    rows = []
    for item in results:
        if not item.judged:
            rows.append((f"load: {item.load.name}", _band_hz(item.low, item.high), "",
                         "not judged", "not judged", "no: a moment",
                         "a moment: needs the six-DOF model"))
            continue
        where = f" at mount {item.mount + 1}" if item.mount is not None else ""
        force = ("unbounded" if math.isinf(item.mount_force) else
                 f"{_newton(item.mount_force)}{where} (rigid {_newton(item.rigid_force)})")
        judged = ("yes: force passed over rigid" if item.load.exponent
                  else "yes: a machine load")
        rows.append((f"load: {item.load.name}", _band_hz(item.low, item.high), "",
                     _t(item.transmissibility), _percent(item.force_efficiency), judged, force))
    return rows


def _load_sentence(results, inst) -> str:
    """The load that puts the most force into the structure, in words."""
    results = [item for item in results if item.judged]
    finite = [item for item in results if math.isfinite(item.mount_force)]
    if not results:
        return ""
    if len(finite) < len(results):
        names = ", ".join(item.load.name for item in results if item not in finite)
        return f"; {names}: no bound on the mount force without damping"
    top = max(finite, key=lambda item: (item.mount_force, item.low))
    if inst.six_dof:
        return (f"; the machine load that puts the most force into the structure is "
                f"{top.load.name}: at most {_newton(top.mount_force)} at mount {top.mount + 1} "
                f"(at {_hz(top.frequency)} Hz; {_newton(top.total_force)} in all) against "
                f"{_newton(top.rigid_force)} at the worst mount with rigid mounting at that "
                "speed")
    return (f"; the machine load that puts the most force into the structure is "
            f"{top.load.name}: at most {_newton(top.mount_force)} through the isolators (at "
            f"{_hz(top.frequency)} Hz) against {_newton(top.rigid_force)} with rigid mounting at "
            "that speed")


def _stiffness_words(inst: _Installation) -> list[str]:
    """The dynamic stiffening the isolation frequency rests on, as an assumption."""
    ratio = inst.stiffness_ratio
    if inst.six_dof or not (ratio.stated or ratio.value != 1.0):
        return []
    if inst.mounting.stiffness is not None and not ratio.applies_to_stiffness:
        return []
    return [f"isolator stiffness: {ratio.words}"]


def _assumptions(design, inst: _Installation, floor: _Floor) -> list[str]:
    out = [inst.damping.assumption] + _stiffness_words(inst)
    if inst.six_dof:
        out.append("six-DOF rigid-body model: transmissibility is the largest force at any "
                   "mount over the same load shared by the mounts without dynamic "
                   "amplification (rigid mounting); forcing bands are judged with unit "
                   "forces across the shaft and vertically at the centre of gravity, and a "
                   "unit moment about the shaft for firing and compression; machine loads "
                   "with their own forces and moments at their points of action; peaks over "
                   "each band found by a search seeded at every rigid-body mode")
        if inst.damping.model == "hysteretic":
            out.append("the loss factor enters the six-DOF model as a modal damping ratio "
                       "of half its value (equal at resonance)")
    else:
        out.append("one degree of freedom: the machine bounces vertically on its isolators, "
                   "and machine loads are taken along the bounce axis only (give "
                   "[[mounting.mount]] tables for the six rigid-body modes)")
    if inst.has_tolerance:
        out.append("worst case within the stated tolerances: stiffest isolators with the "
                   "lightest mass for the frequency ratio")
    if design.machine.speed.is_range:
        out.append(f"forcing bands cover the whole speed range {design.machine.speed.min.text} "
                   f"to {design.machine.speed.max.text}")
    out += floor.assumptions
    return out


def _efficiency_advice(design, inst, results, required, least_ratio, scale,
                       options=None, loads=()) -> list[str]:
    """Computed changes that would clear the rule, limited to what can be built: softer
    isolators up to the largest stock static deflection of their kind, an inertia base up
    to the policy's largest mass ratio, a higher minimum speed; when no stock isolator
    clears it, say so and name the remaining levers. ``scale`` is the stiffening the
    judgement allowed for."""
    from vcheck.dynamics.isolation.transmissibility import (
        inertia_base_mass,
        static_deflection_from_natural_frequency,
    )

    largest = (options.largest_static_deflection_by_kind() if options is not None
               else dict(policy.LARGEST_STATIC_DEFLECTION_BY_ISOLATOR))
    ratio_limit = (options.largest_base_mass_ratio if options is not None
                   else policy.LARGEST_BASE_MASS_RATIO)
    r_efficiency = inst.damping.ratio_for_efficiency(required)
    needed = max(least_ratio, r_efficiency)
    governing = min(results, key=lambda item: (item.band.low, item.band.name))
    # the highest isolation frequency that clears the margin at the lowest forcing and the
    # efficiency at every judged band
    targets = [(governing.band.low / least_ratio, governing.band, least_ratio)]
    targets += [(item.band.low / r_efficiency, item.band, r_efficiency)
                for item in results if item.judged and item.efficiency < required]
    targets += [(item.low / r_efficiency, item, r_efficiency) for item in loads
                if item.judged and item.force_efficiency < required]
    if len(targets) == 1:
        targets.append((governing.band.low / needed, governing.band, needed))
    fn_target, at, needed = min(targets, key=lambda item: item[0])
    at_name = at.name if hasattr(at, "name") else at.load.name
    at_low = at.low
    fn_now = inst.fn_high * math.sqrt(scale)
    mounting = inst.mounting
    advice = []
    if fn_target >= fn_now:  # pragma: no cover - judged failing means fn_now > fn_target
        return advice
    factor = (fn_target / fn_now) ** 2
    # the static deflection that gives fn_target with the isolators' dynamic stiffening
    deflection = float(static_deflection_from_natural_frequency(fn_target)) * inst.dynamic_ratio
    estimate = " (one-degree-of-freedom estimate)" if inst.six_dof else ""
    what = "the highest rigid-body mode" if inst.six_dof else "the isolation frequency"
    target = (f"that brings {what} to {_hz(fn_target)} Hz or below, a frequency ratio of "
              f"{needed:.2f} at {at_name} {_hz(at_low)} Hz{estimate}")
    table_minimum = _table_minimum(design)
    if table_minimum is not None and table_minimum > deflection * (1 + _TOLERANCE):
        target += (f"; the isolator-static-deflection table asks {_mm(table_minimum)} "
                   "for this machine and floor, the larger governs")
    stock = largest.get(mounting.kind)
    buildable = stock is None or deflection * scale <= stock * (1 + _TOLERANCE)
    if scale > 1:
        advice.append("state the isolators' stiffness tolerance from the maker's data, so "
                      "that the worst case is judged rather than allowed for")
    if not buildable:
        spring = largest.get("spring")
        spring_deflection = float(static_deflection_from_natural_frequency(fn_target))
        text = (f"no stock {mounting.kind} isolator clears it: it would take a static deflection "
                f"of {_mm(deflection * scale)}, beyond the about {_mm(stock)} the largest "
                f"{mounting.kind} isolators offer (policy largest-static-deflection); {target}")
        if (mounting.kind not in ("spring", "restrained-spring") and spring is not None
                and spring_deflection * scale <= spring * (1 + _TOLERANCE)):
            text += (f"; steel springs rated for {_mm(spring_deflection * scale)} would reach "
                     "it")
        else:
            text += ("; the remaining levers: a higher minimum speed, air springs (natural "
                     "frequencies down to about 1-3 Hz, common practice), or a stiffer "
                     "support under the isolators")
        advice.append(text)
    elif inst.six_dof:
        stiffest = max(m.axial_stiffness.high for m in mounting.mount) * factor
        advice.append(f"softer mounts: {factor:.2f} times the present stiffness in every "
                      f"direction (axial at most {_kn(stiffest)} at the stiffest mount), a "
                      f"static deflection of about {_mm(deflection)}: {target}")
    elif mounting.stiffness is not None:
        k = mounting.stiffness
        k_max = ((2 * math.pi * fn_target) ** 2 * inst.mass_low / mounting.isolators
                 / inst.dynamic_ratio)
        text = f"softer isolators: at most {_kn(k_max / scale)} each"
        if scale > 1:
            text += f" as stated ({_kn(k_max)} if {scale - 1:.0%} stiffer)"
        if k.has_tolerance:
            text += (f" at their stiffest ({_kn(k_max * k.value / k.high)} nominal with the "
                     "stated tolerance)")
        advice.append(f"{text}, a static deflection of at least {_mm(deflection)} under this "
                      f"machine: {target}")
    else:
        rated = mounting.static_deflection
        text = f"softer isolators rated for at least {_mm(deflection * scale)} static deflection"
        if rated.has_tolerance:
            text += (f" at the low end of their tolerance "
                     f"({_mm(deflection * rated.value / rated.low)} nominal)")
        advice.append(f"{text} under this machine: {target}")
    base_mass = float(inertia_base_mass(inst.total_stiffness_high() * scale, inst.mass_low,
                                        fn_target))
    machine = design.machine.mass.value
    if base_mass >= 0.1 * machine:  # a few kilograms more is not an inertia base
        present = mounting.base_mass.value if mounting.base_mass is not None else 0.0
        total = present + base_mass
        does = ("a base lowers the centre of gravity, cuts the machine's motion under the same "
                "forces and carries the machine as one rigid body; for the efficiency it acts "
                "only through the static deflection it adds, so it does not isolate better "
                "than softer isolators of the same deflection would")
        if total > ratio_limit * machine * (1 + _TOLERANCE):
            advice.append(f"an inertia base would have to weigh {total:.0f} kg, "
                          f"{total / machine:.1f} times the machine, beyond the "
                          f"{ratio_limit:g} times the policy allows (largest-base-mass-ratio): "
                          f"not offered; {does}")
        else:
            more = f" ({base_mass:.0f} kg more than the present base)" if present else ""
            rated = ("" if buildable else
                     f", which no stock {mounting.kind} isolator offers")
            advice.append(
                f"or an inertia base of at least {total:.0f} kg{more}, {total / machine:.1f} "
                f"times the machine's mass, on the present isolators{estimate} if they can "
                f"carry it: their static deflection grows to about {_mm(deflection)}{rated}; "
                f"{does}")
    speed = design.machine.speed
    if speed.is_range:
        clear = _speed_for_ratio(results, speed, least_ratio * fn_now)
        full = _speed_for_ratio(results, speed, needed * fn_now)
        if full is not None and full <= speed.max.value:
            text = (f"or raise the drive's minimum speed to at least {_rpm(full)} (now "
                    f"{speed.min.text}) with the present isolators")
            if clear is not None and needed > least_ratio and clear < full:
                text += (f"; {_rpm(clear)} clears the amplification zone with the margin "
                         f"(sqrt(2) x {least_ratio / SQRT2:.2f}, the threshold of every "
                         f"isolation rule), without reaching {required:.0%}")
            advice.append(text)
        elif full is not None:
            text = (f"no speed within the drive's range reaches {required:.0%}: it would take "
                    f"{_rpm(full)}, above the maximum {speed.max.text}")
            if clear is not None and clear <= speed.max.value:
                text += (f"; a minimum speed of {_rpm(clear)} at least clears the amplification "
                         "zone with the margin")
            advice.append(text)
    return advice


def _table_minimum(design) -> float | None:
    """The default deflection table's minimum for the design [m], or None."""
    try:
        floor = _floor(design)
        if floor.outside_table:
            return None
        return policy.minimum_static_deflection(design.machine.kind,
                                                design.machine.speed.min.value,
                                                _span_for_table(floor))
    except ValueError:
        return None


def _speed_for_ratio(results, speed, lowest_forcing: float) -> float | None:
    """Least minimum speed that puts every failing band at or above ``lowest_forcing`` [Hz],
    or None when a band below it does not move with speed."""
    needed = []
    for item in results:
        if item.band.low >= lowest_forcing * (1 - _TOLERANCE):
            continue
        order = _order_of(item.band, speed)
        if order is None:
            return None
        needed.append(lowest_forcing / order)
    return max(needed, default=speed.min.value)


# --------------------------------------------------------- the static deflection rule


class StaticDeflectionOptions(RuleOptions):
    """Policy of the isolator-static-deflection rule."""

    minimum_static_deflection_by_machine: dict[MachineKind, tuple[
            Deflection, Deflection, Deflection, Deflection]] = Field(
        {},
        description="Minimum static deflection by kind of machine for all speeds, one value "
        "per floor class (slab on grade, span up to 20 ft, 20-30 ft, 30-40 ft), e.g. "
        "{ compressor = [\"19 mm\", \"38 mm\", \"38 mm\", \"64 mm\"] }; replaces the policy "
        "table's rows for that kind. Default: none, the table applies (ASHRAE selection "
        "guide pattern, values from memory).",
    )
    floor_deflection_factor: float = Field(
        policy.FLOOR_DEFLECTION_FACTOR, ge=1,
        description="Least ratio of isolator static deflection to the floor's deflection "
        "under the machine, when the design gives support.floor-deflection or "
        "floor-stiffness. Default 10 (common practice, from memory, low confidence).",
    )
    special_consideration_speed: SpeedLimit = Field(
        "250 rpm", validate_default=True,
        description="Lowest speed below which the rule warns that the deflection table no "
        "longer holds and the installation needs its own analysis. Default 250 rpm (a "
        "published US guide specification).",
    )

    def table(self):
        own = self.minimum_static_deflection_by_machine
        rows = [row for row in policy.MINIMUM_STATIC_DEFLECTION_TABLE if row.equipment_kind
                not in own]
        rows += [policy.MinimumDeflectionRow(kind, 0.0, math.inf,
                                             tuple(value.value for value in values))
                 for kind, values in own.items()]
        return tuple(rows)


class IsolatorStaticDeflection(Rule):
    """Isolators must deflect at least the minimum for the equipment, speed and floor.

    The isolators' static deflection under the machine (the rated deflection, the weight
    over the stiffness at its stiffest, or with every mount given the least deflection of
    any mount in the six-DOF model) is compared with the minimum of the policy table by
    kind of equipment, its lowest running speed and the floor class (slab on grade,
    spans up to 20 ft, 20-30 ft and 30-40 ft; an unknown span is taken as the longest).
    When the design gives the floor's deflection or stiffness under the machine, the
    isolators must also deflect ``floor-deflection-factor`` times as much as the floor.

    Fails when the deflection is below either minimum; warns when the lowest speed is
    below ``special-consideration-speed`` (250 rpm), where the table no longer holds,
    when the design has no ``[support]`` (judged at the strictest floor class; a shortfall
    that would pass on grade then warns), or when a rocking machine stands on isolators
    given without mount positions; passes otherwise. The table has a row for every kind
    of machine; not checked when the span is longer than 40 ft. Machines without
    isolators are reported by isolation-efficiency.

    Limits of validity: the table is a default policy patterned on the ASHRAE selection
    guide and written from memory; the project specification governs.
    """

    id = "isolator-static-deflection"
    title = "Isolator static deflection for the equipment, speed and floor"
    applies_to = "mounting"
    sources = (ASHRAE_GUIDE, FLOOR_PRACTICE, LOW_SPEED_GUIDE)
    Options = StaticDeflectionOptions

    def check(self, design, options: StaticDeflectionOptions):
        inst = _installation(design)
        if isinstance(inst, str):
            return
        path = ("mounting", "static-deflection") if (
            inst.mounting.static_deflection is not None and inst.mounting.stiffness is None
            and not inst.six_dof) else inst.key_path
        floor = _floor(design)
        kind = design.machine.kind
        lowest = design.machine.speed.min.value
        if floor.outside_table:
            yield self.finding(design, ("support",), Status.NOT_CHECKED,
                               f"{floor.words} is longer than the 40 ft the minimum static "
                               "deflection table covers: such floors need their own analysis")
            return
        try:
            table_minimum = policy.minimum_static_deflection(kind, lowest, _span_for_table(floor),
                                                             options.table())
        except ValueError as exc:
            yield self.finding(design, ("machine", "kind"), Status.NOT_CHECKED,
                               f"{exc}: give [rules.{self.id}] "
                               "minimum-static-deflection-by-machine for it")
            return
        deflection, how = inst.static_deflection()
        assumptions = [f"static deflection from the {how}"] + list(floor.assumptions)
        required, required_words = table_minimum, (
            f"the table's minimum for {_a(kind)} at {_rpm(lowest)} on {floor.words}")
        floor_deflection, floor_words = _floor_deflection(design, inst)
        if floor_deflection is not None:
            need = float(policy.minimum_isolator_deflection_for_floor(
                floor_deflection, options.floor_deflection_factor))
            assumptions.append(f"the floor deflects {_mm(floor_deflection)} under the machine "
                               f"({floor_words})")
            if need > required:
                required = need
                required_words = (f"{options.floor_deflection_factor:g} times the floor's "
                                  f"{_mm(floor_deflection)} (the table asks "
                                  f"{_mm(table_minimum)})")
            else:
                required_words += (f"; {options.floor_deflection_factor:g} times the floor's "
                                   f"{_mm(floor_deflection)} is {_mm(need)}")
        if deflection < required * (1 - _TOLERANCE):
            status = Status.FAIL
        elif lowest < options.special_consideration_speed.value * (1 - _TOLERANCE):
            status = Status.WARN
        else:
            status = Status.PASS
        word = "is below" if status is Status.FAIL else "meets"
        message = (f"isolator static deflection {_mm(deflection)} {word} the {_mm(required)} "
                   f"required: {required_words}")
        advice = []
        if status is Status.WARN:
            message += (f"; the lowest speed {_rpm(lowest)} is below "
                        f"{options.special_consideration_speed.text}, where the table no "
                        "longer holds")
            advice.append("below that speed isolation needs its own analysis: check the "
                          "efficiency at the lowest forcing frequency and the resonance "
                          "passage, with the maker's isolator data")
        if status is Status.FAIL and floor.missing:
            lenient = policy.minimum_static_deflection(kind, lowest, None, options.table())
            if deflection >= lenient * (1 - _TOLERANCE):
                status = Status.WARN
                message += (f"; it meets the {_mm(lenient)} of a slab on grade, so the verdict "
                            "waits on the support")
        if status is Status.FAIL:
            advice.append(_deflection_advice(inst, required))
        rocking = _rocking_gap(design, inst)
        gaps = [text for text in (floor.missing, f"rocking on the isolators ({rocking}), "
                                  "which the table's vertical deflection does not cover"
                                  if rocking else "") if text]
        if gaps:
            if status is Status.PASS:
                status = Status.WARN
            message += "; not considered: " + "; ".join(gaps)
            if floor.missing:
                advice.append(_SUPPORT_ADVICE)
            if rocking:
                advice.append(_ROCKING_ADVICE)
        quantities = [computed("isolator static deflection", deflection, "m"),
                      computed("least static deflection", required, "m"),
                      computed("table minimum static deflection", table_minimum, "m")]
        if floor_deflection is not None:
            quantities.append(computed("floor deflection", floor_deflection, "m"))
        yield self.finding(
            design, path, status, message, quantities=quantities,
            measured=Measure("isolator static deflection", round(deflection * 1000, 6), "mm"),
            limit=Measure("least static deflection", round(required * 1000, 6), "mm"),
            margin=round((deflection - required) * 1000, 6),
            assumptions=assumptions, advice=advice)


def _floor_deflection(design, inst: _Installation) -> tuple[float | None, str]:
    support = design.support
    if support is None:
        return None, ""
    if support.floor_deflection is not None:
        given = support.floor_deflection
        return given.high, f"support.floor-deflection {given.text}"
    if support.floor_stiffness is not None:
        weight = inst.mass_high * GRAVITY
        return weight / support.floor_stiffness.low, (
            f"weight of {_kg(inst.design, inst.mass_high)} on support.floor-stiffness "
            f"{support.floor_stiffness.text}")
    return None, ""


def _deflection_advice(inst: _Installation, required: float) -> str:
    mounting = inst.mounting
    stock = policy.LARGEST_STATIC_DEFLECTION_BY_ISOLATOR.get(mounting.kind)
    if stock is not None and required > stock * (1 + _TOLERANCE):
        spring = policy.LARGEST_STATIC_DEFLECTION_BY_ISOLATOR["spring"]
        other = (f"steel springs (up to about {_mm(spring)}) can" if required <= spring
                 else "no stock isolator does: the remaining levers are air springs, a "
                 "stiffer support or the project's own minimum")
        return (f"no stock {mounting.kind} isolator deflects {_mm(required)} (the largest "
                f"offer about {_mm(stock)}, common practice): {other}")
    if inst.six_dof:
        deflection, _ = inst.static_deflection()
        factor = deflection / required
        return (f"softer mounts: about {factor:.2f} times the present axial stiffness, for a "
                f"static deflection of at least {_mm(required)} at every mount")
    if mounting.isolators:
        k_max = inst.mass_low * GRAVITY / (mounting.isolators * required)
        return (f"isolators rated for at least {_mm(required)} under this machine: at most "
                f"{_kn(k_max)} each at their stiffest ({mounting.isolators} isolators carrying "
                f"{_kg(inst.design, inst.mass_low)})")
    return f"isolators rated for at least {_mm(required)} static deflection under this machine"


# ------------------------------------------------------------ the resonance passage rule


class ResonancePassageOptions(RuleOptions):
    """Policy of the isolation-resonance-passage rule."""

    amplification_limit: float = Field(
        15.0, gt=1,
        description="Peak amplification passed at an isolation resonance above which the "
        "rule warns. Default 15: elastomer mounts (damping ratio about 0.05, steady peak "
        "about 10) pass whatever the run-up; steel springs without dampers pass when the "
        "run-up and run-down are quick enough (common practice).",
    )
    required_margin: float = Field(
        0.20, ge=0, lt=1,
        description="Least separation between a rigid-body mode and a forcing band in "
        "operation (a speed the machine can dwell at), as a fraction of the band edge; "
        "below it the rule fails. Default 0.20, as the frequency-separation rule (ACI "
        "351.3R, from memory; common practice).",
    )
    warn_margin: float = Field(
        0.30, ge=0, lt=1,
        description="Separation below which the rule warns. Default 0.30, as the "
        "frequency-separation rule (from memory).",
    )
    frequency_ratio_margin: float = Field(
        0.25, ge=0, le=2,
        description="Margin over sqrt(2) of the frequency ratio that a locked-out speed "
        "range must reach, the same threshold as isolation-efficiency's: r >= sqrt(2) (1 + "
        "margin), 1.77 by default (common practice).",
    )
    ignore_forcing: tuple[ForcingKind, ...] = Field(
        ("bearing-defect",),
        description="Kinds of forcing band not judged for dwelling at resonance. Default: "
        "bearing defect frequencies (common practice).",
    )

    @model_validator(mode="after")
    def _ordered_margins(self) -> ResonancePassageOptions:
        if self.warn_margin < self.required_margin:
            raise ValueError(f"warn-margin ({self.warn_margin}) must not be below "
                             f"required-margin ({self.required_margin})")
        return self


def least_frequency_ratio(margin: float) -> float:
    """The one threshold every isolation rule uses for a speed clear of the isolators'
    amplification: sqrt(2) (1 + margin) [unitless]."""
    return SQRT2 * (1.0 + margin)


class _Passage(Record, frozen=False):
    peak: float
    mode: object
    band: object
    order: float
    duration: float
    which: str  # "run-up" or "run-down"
    sweep_rate: float
    eta: float


def _sweeps(design, band) -> bool:
    """Whether a forcing band rises with the speed on a run-up: not twice line frequency
    of a motor started across the line, nor a listed source of fixed frequency."""
    path = band.key_path
    if path == ("machine", "driver", "line-frequency"):
        return False
    if len(path) == 3 and path[:2] == ("machine", "excitation"):
        return design.machine.excitation[path[2]].frequency is None
    return True


def _run_times(design) -> tuple[float, float, list[str]]:
    """Run-up and run-down times [s], longest within tolerance, with the assumptions."""
    machine = design.machine
    name, row = policy.default_run_times(machine.driver, machine.kind)
    out = []
    up = machine.run_up.high if machine.run_up is not None else None
    down = machine.run_down.high if machine.run_down is not None else None
    if up is None or down is None:
        missing = " and ".join(key for key, value in (("machine.run-up", up),
                                                        ("machine.run-down", down))
                               if value is None)
        out.append(f"{missing} not given: the default for {policy.RUN_TIME_WORDS[name]}, run-up "
                   f"{row.run_up:g} s and run-down {row.run_down:g} s ({row.words})")
    if machine.run_up is not None and machine.run_up.has_tolerance:
        out.append(f"run-up {machine.run_up.text} at its longest")
    if machine.run_down is not None and machine.run_down.has_tolerance:
        out.append(f"run-down {machine.run_down.text} at its longest")
    return (row.run_up if up is None else up), (row.run_down if down is None else down), out


def _passages(design, inst, bands, run_times=None) -> list[_Passage]:
    """The peak passed at every rigid-body mode on run-up and run-down, worst first;
    ``run_times`` is what :func:`_run_times` gives for the design (worked out when not
    given)."""
    from vcheck.dynamics.isolation.passage import (
        dimensionless_sweep_rate,
        passage_peak_viscous,
        sweep_rate_of_run,
    )

    speed = design.machine.speed
    up, down, _ = run_times if run_times is not None else _run_times(design)
    zeta = inst.damping.modal_damping_ratio
    found = []
    for mode in inst.modes:
        swept = [(order, band) for band in bands if _sweeps(design, band)
                 and (order := _order_of(band, speed)) is not None and order > 0
                 and band.high > mode.low]
        if not swept:
            continue
        order, band = min(swept, key=lambda item: (item[0], item[1].name))
        for which, duration in (("run-up", up), ("run-down", down)):
            rate = float(sweep_rate_of_run(order * speed.max.value, duration))
            eta = float(dimensionless_sweep_rate(rate, mode.high))
            peak = float(passage_peak_viscous(eta, zeta))
            found.append(_Passage(peak, mode, band, order, duration, which, rate, eta))
    found.sort(key=lambda p: (-p.peak, p.mode.nominal, p.which))
    return found


class ResonancePassage(Rule):
    """Passing the isolation resonance on start-up and run-down must stay tolerable.

    A machine on isolators passes each rigid-body mode every time it starts and stops.
    Swept through at a constant rate it reaches less than the steady-state peak
    1 / (2 zeta): the peak passed is computed from the dimensionless sweep rate
    (df/dt) / f_n^2 of the slowest forcing order that crosses the mode, over the longer
    of ``machine.run-up`` and ``machine.run-down`` (defaults by driver kind, listed as an
    assumption), by the relation of :mod:`vcheck.dynamics.isolation.passage` (Lewis's
    undamped closed form and the damped sweep fit, capped by the steady peak). Damping
    as stated or the default for the kind of isolator. With a ``rotor`` table the steady
    motion at resonance from the residual unbalance of its balance grade is reported.

    Fails when a forcing band in operation reaches a rigid-body mode (the drive can
    dwell at resonance; judged with the steady peak), or lies within ``required-margin``
    (20%) of one; warns within ``warn-margin`` (30%), when the peak passed exceeds
    ``amplification-limit`` (15), or when the machine excites rocking and the isolators
    are given without mount positions (its rocking modes, which it also passes, are not
    known); passes otherwise. Machines without isolators are reported by
    isolation-efficiency.

    Limits of validity: constant acceleration through resonance, a force of constant
    amplitude across the narrow resonance band, one mode at a time; a run that slows
    near the resonance (a fan near its load line, a motor near pull-out) reaches more.
    """

    id = "isolation-resonance-passage"
    title = "Isolation resonance passed on start-up and run-down"
    applies_to = "mounting"
    sources = (LEWIS, SWEEP_FIT, CREDE, HARRIS_DAMPING, PASSAGE_PRACTICE, SEPARATION_LIKE,
               ISO_21940)
    Options = ResonancePassageOptions

    def check(self, design, options: ResonancePassageOptions):
        from .separation import separation_margin

        inst = _installation(design)
        if isinstance(inst, str):
            return
        damping = inst.damping
        _, steady = damping.peak()
        speed = design.machine.speed
        assumptions = [damping.assumption] + _stiffness_words(inst)
        if inst.six_dof:
            assumptions.append("each rigid-body mode passed in turn, with the same damping")
        bands = _judged_bands(design, options.ignore_forcing)
        reached = [(band, mode) for band in bands
                   for mode in inst.modes if band.low <= mode.high and band.high >= mode.low]
        unbalance = _resonance_motion(design, inst)
        least_ratio = least_frequency_ratio(options.frequency_ratio_margin)
        advice = []
        measured = limit = None
        below_is_clear = False  # a measure that is clear of its limit when below it
        quantities = _isolation_mode_quantities(inst) + [
            computed("amplification at resonance", steady, "1")]
        if reached:
            band, mode = min(reached, key=lambda item: (item[0].low, item[1].nominal))
            status = Status.FAIL
            ratio = band.low / mode.high
            where = (f"{_hz(mode.nominal)} Hz" if mode.low == mode.high
                     else f"{_hz(mode.nominal)} Hz ({_hz(mode.low)}-{_hz(mode.high)} Hz)")
            who = "the drive can run" if band.high > band.low else "the machine runs"
            message = (f"{band.name} {_band_hz(band.low, band.high)} reaches {mode.name} at "
                       f"{where}: {who} at the isolation resonance, where the force into the "
                       f"structure is amplified {_times(steady)}, steady state "
                       f"({damping.words})")
            measured = Measure("lowest frequency ratio in operation", round(ratio, 6))
            limit = Measure("frequency ratio at resonance", 1.0)
            quantities.append(computed("frequency ratio", ratio, "1", band=band.name,
                                       mode=mode.name))
            advice += _lock_out_advice(band, speed, inst, least_ratio)
        else:
            pairs = sorted(
                ((*separation_margin(mode.low, mode.high, band.low, band.high), band, mode)
                 for band in bands for mode in inst.modes),
                key=lambda item: (item[0], item[2].low, item[3].nominal))
            margin, side, band, mode = pairs[0]
            run_times = _run_times(design)
            passages = _passages(design, inst, bands, run_times)
            run_words = run_times[2]
            if margin < options.warn_margin * (1 - _TOLERANCE):
                status = (Status.FAIL if margin < options.required_margin * (1 - _TOLERANCE)
                          else Status.WARN)
                near = min((band.low / mode.high, band.high / mode.low),
                           key=lambda r: abs(math.log(r)))
                amplification = float(damping.transmissibility(near))
                who = ("the machine runs" if band.low == band.high else
                       "the drive can run")
                message = (f"{mode.name} at {_band_hz(mode.low, mode.high)} is {margin:.1%} "
                           f"{side} {band.name} {_band_hz(band.low, band.high)}: {who} "
                           f"near the isolation resonance, where the force into the "
                           f"structure is amplified {_times(amplification)}, steady state "
                           f"({damping.words}); separation needed "
                           f"{options.required_margin:.0%}, warn below "
                           f"{options.warn_margin:.0%}")
                measured = Measure("separation from a rigid-body mode", round(margin, 6),
                                   "fraction")
                quantities += [
                    computed("separation", margin, "fraction", band=band.name, mode=mode.name,
                             side=side),
                    computed("required separation", options.required_margin, "fraction"),
                    computed("amplification near resonance", amplification, "1",
                             band=band.name, mode=mode.name)]
                limit = Measure("required separation", options.required_margin, "fraction")
                advice += _lock_out_advice(band, speed, inst, least_ratio)
            elif not passages:  # every mode above every forcing that rises with speed
                status = Status.PASS
                message = (f"no forcing that rises with speed reaches {inst.frequency_words}: "
                           "start-up and run-down do not pass it")
            else:
                worst = passages[0]
                status = (Status.WARN if worst.peak > options.amplification_limit
                          * (1 + _TOLERANCE) else Status.PASS)
                word = "above" if status is Status.WARN else "within"
                message = (f"{worst.which} in {worst.duration:g} s passes {worst.mode.name} at "
                           f"{_band_hz(worst.mode.low, worst.mode.high)} with "
                           f"{worst.band.name} sweeping at {worst.sweep_rate:.3g} Hz/s "
                           f"(dimensionless rate {worst.eta:.3g}): the force into the "
                           f"structure is amplified about {_times(worst.peak)} in passing "
                           f"({damping.words}; {_times(steady)} if it dwelt there), {word} "
                           f"the limit of {options.amplification_limit:g}")
                measured = Measure("amplification passed at resonance", round(worst.peak, 6))
                below_is_clear = True
                limit = Measure("amplification limit", options.amplification_limit)
                for item in passages:
                    where = {"band": item.band.name, "mode": item.mode.name,
                             "passage": item.which}
                    quantities += [
                        computed("amplification passed at resonance", item.peak, "1", **where),
                        computed("sweep rate", item.sweep_rate, "Hz/s", **where),
                        computed("dimensionless sweep rate", item.eta, "1", **where),
                        computed("passage time", item.duration, "s", **where)]
                quantities.append(computed("amplification limit", options.amplification_limit,
                                           "1"))
                assumptions += run_words
                assumptions.append("passage at constant acceleration, the force amplitude "
                                   "constant across the resonance (Lewis 1932 and the sweep "
                                   "fit, from memory)")
                if status is Status.WARN:
                    zeta = _damping_for_peak(options.amplification_limit)
                    quick = _duration_for_peak(worst, options.amplification_limit,
                                               damping.modal_damping_ratio, speed)
                    text = (f"isolators with at least {zeta:.3f} of critical damping (viscous "
                            f"dampers, or restrained springs with damped snubbers) keep even "
                            f"the steady peak to {options.amplification_limit:g}")
                    if quick is not None:
                        text += (f"; or a {worst.which} of at most {quick:.3g} s (a faster "
                                 "drive ramp or a brake) keeps the peak passed to it")
                    advice.append(text + "; and check the flexible connections for the "
                                  "motion")
        rocking = _rocking_gap(design, inst)
        if rocking and status is Status.PASS:
            status = Status.WARN
        if rocking:
            message += f"; not considered: the rocking modes it also passes ({rocking})"
            advice.append(_ROCKING_ADVICE)
        if unbalance is not None:
            message += "; " + unbalance
        # margin: positive when clear of the limit, as the report schema defines it
        margin_value = (None if measured is None else
                        round((limit.value - measured.value) if below_is_clear
                              else (measured.value - limit.value), 6))
        yield self.finding(design, inst.key_path, status, message, measured=measured,
                           limit=limit, margin=margin_value, assumptions=assumptions,
                           advice=advice, quantities=quantities)


_ROCKING_ADVICE = (
    "give [[mounting.mount]] tables (each mount's position and axial and shear stiffness) "
    "with centre-of-gravity and inertia or envelope, for the six rigid-body modes "
    "including rocking")


def _rocking_gap(design, inst) -> str:
    """Why rocking is missing from a one-DOF judgement, in words ("" when it is not):
    the machine excites rocking (:func:`vcheck.analysis.excites_rocking`) and the
    isolators are given without mount positions."""
    loads = analyse(design).loads
    if inst.six_dof or not excites_rocking(design, loads):
        return ""
    given = "count and stiffness" if inst.mounting.stiffness is not None else "static deflection"
    return ("; ".join(rocking_sources(design, loads)) + f"; the isolators are given only by "
            f"{given}, without mount positions, so only the vertical bounce is known")


def _lock_out_advice(band, speed, inst, least_ratio) -> list[str]:
    order = _order_of(band, speed)
    out = []
    if order is not None and speed.is_range:
        clear = least_ratio * inst.fn_high / order
        if clear <= speed.max.value:
            out.append(f"lock out speeds up to {_rpm(clear)} (raise the drive's minimum "
                       f"speed), so that {band.name} stays above {least_ratio:.2f} times "
                       "the isolation frequency (sqrt(2) with the isolation rules' margin)")
    out.append(f"{'or ' if out else ''}change the isolators so that the isolation "
               f"frequency lies below {_hz(band.low / least_ratio)} Hz")
    return out


def _duration_for_peak(passage: _Passage, limit: float, zeta: float, speed) -> float | None:
    """Longest run time whose peak passed stays at ``limit`` [s], by bisection on the
    monotonic peak; None when even a very fast run exceeds it."""
    from vcheck.dynamics.isolation.passage import passage_peak_viscous

    top = passage.order * speed.max.value
    fn = passage.mode.high

    def peak(duration: float) -> float:
        return float(passage_peak_viscous(top / duration / fn**2, zeta))

    low, high = 1e-3, passage.duration
    if peak(low) > limit:
        return None
    for _ in range(80):
        middle = 0.5 * (low + high)
        if peak(middle) > limit:
            high = middle
        else:
            low = middle
    return low


@functools.lru_cache(maxsize=64)
def _damping_for_peak(limit: float) -> float:
    """Damping ratio whose viscous transmissibility peak equals ``limit`` [unitless].

    The peak falls steadily as damping grows, so bisection finds it; plain floats, no
    scipy (start-up time), to 1e-12.
    """
    from vcheck.dynamics.isolation.transmissibility import resonance_peak_viscous

    low, high = 1e-9, 0.99
    while high - low > 1e-12:
        middle = 0.5 * (low + high)
        if float(resonance_peak_viscous(middle)[1]) > limit:
            low = middle
        else:
            high = middle
    return 0.5 * (low + high)


def _resonance_motion(design, inst: _Installation) -> str | None:
    """The steady motion at resonance from the rotor's residual unbalance, in words."""
    rotor = design.machine.rotor
    if rotor is None:
        return None
    from vcheck.dynamics.forcing.unbalance import permissible_residual_unbalance

    speed = design.machine.speed
    unbalance = float(permissible_residual_unbalance(
        rotor.balance_quality, rotor.mass.high, 2 * math.pi * speed.max.value))
    # at r = 1 the mass moves U / M times |H|: 1 / (2 zeta) viscous, 1 / eta hysteretic
    damping = inst.damping
    if damping.value == 0:
        return (f"with no damping the residual unbalance of {rotor.balance_grade} drives an "
                "unbounded motion at resonance")
    gain = 1.0 / (2.0 * damping.value) if damping.model == "viscous" else 1.0 / damping.value
    motion = unbalance / inst.mass_low * gain
    return (f"the residual unbalance of {rotor.balance_grade} ({unbalance * 1e6:.0f} g mm) moves "
            f"the machine about {motion * 1000:.2g} mm at resonance, steady state")

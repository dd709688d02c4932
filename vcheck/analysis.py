"""The computed dynamics of a design: its natural frequencies and forcing bands.

This is what vcheck believes about a design before any rule judges it. Rules (built-in
and plugins) read it through :func:`analyse` (or :func:`natural_frequencies` and
:func:`excitation_bands`); ``vcheck dynamics`` prints it. The physics itself lives in
:mod:`vcheck.dynamics`; this module only turns design models into its arguments and
names the results.

Natural frequencies come from: the machine on its isolators (one vertical bounce mode,
or the six rigid-body modes when every mount is given), listed values, CSV mode files,
beams, lumped mass-spring models, and the same sources in a shared structure file.
Forcing bands come from what the machine is: running-speed orders, vane and blade
pass, firing orders, gear mesh, belt pass, rolling-bearing defect orders, twice line
frequency of a motor started across the line, twice the output frequency (poles x
speed) and the torque pulsations of a motor fed by a variable-frequency drive, and listed
sources.
"""

from __future__ import annotations

from dataclasses import dataclass

from .design.problems import InputError, InputProblem, format_key_path
from .dynamics.forcing import excitations
from .dynamics.forcing.excitations import order_band
from .dynamics.modes.sdof import natural_frequency_spring_mass, natural_frequency_static_deflection
from .machine_loads import machine_loads
from .records import Record

__all__ = [
    "EXCITATION_KINDS",
    "Analysis",
    "ExcitationBand",
    "ModeBand",
    "MountLayout",
    "mount_layout",
    "mount_mass_matrix",
    "ROCKING_MACHINE_KINDS",
    "analyse",
    "drive_inputs_missing",
    "excitation_bands",
    "excites_rocking",
    "DYNAMIC_STIFFNESS_RATIO_BY_KIND",
    "IsolatorStiffnessRatio",
    "isolator_stiffness_ratio",
    "rocking_sources",
    "natural_frequencies",
]

LUMPED_SEARCH_FACTOR = 2.0
"""Lumped models are searched for modes up to this multiple of the highest forcing
frequency: a mode further up is clear of every band by more than any margin in use."""

MAX_LUMPED_MODES = 200
"""Most modes of one lumped model judged below the search ceiling. The cost of finding
them grows with the number of nodes times the modes found (bisection on Sturm counts
for a chain, shift-invert Lanczos otherwise); a model with more modes in the forcing
range is refused with a located message rather than searched for minutes."""


@dataclass(frozen=True)
class ModeBand:
    """A natural frequency with the band its input tolerances allow [Hz]."""

    name: str
    nominal: float
    low: float
    high: float
    key_path: tuple
    origin: str
    assumptions: tuple[str, ...] = ()
    damping_ratio: float | None = None
    is_isolation: bool = False


EXCITATION_KINDS = (
    "running-speed", "vane-pass", "blade-pass", "firing", "compression", "gear-mesh",
    "belt-pass", "bearing-defect", "electrical", "listed",
)
"""Kinds of forcing band, so that rules and policy can choose among them."""


@dataclass(frozen=True)
class ExcitationBand:
    """A forcing frequency band over the machine's speed range [Hz]."""

    name: str
    low: float
    high: float
    key_path: tuple
    kind: str = "listed"
    assumptions: tuple[str, ...] = ()


@dataclass(frozen=True)
class Analysis:
    """Everything computed for one design, computed once."""

    modes: tuple[ModeBand, ...]
    bands: tuple[ExcitationBand, ...]
    rigid_body: object = None  # vcheck.dynamics.modes.rigid_mounts.MountModes when mounts given
    loads: object = None  # vcheck.machine_loads.LoadSet: what the machine puts on its mounting


def analyse(design) -> Analysis:
    """The design's modes and forcing bands (1x and 2x orders), cached on the design.

    Raises InputError, located, where the numbers make no physical model (a mount
    layout that leaves a motion free, an inertia tensor that is not positive definite,
    a lumped model not tied to the ground).
    """
    cached = design._analysis
    if cached is not None:
        return cached
    bands = tuple(excitation_bands(design))
    ceiling = max((band.high for band in bands), default=0.0) * LUMPED_SEARCH_FACTOR
    problems: list[InputProblem] = []
    modes: list[ModeBand] = []
    rigid_body = None
    mounting = design.mounting
    try:
        if mounting is not None and mounting.kind != "rigid":
            if mounting.mount:
                found, rigid_body = _six_dof_modes(design)
                modes += found
            else:
                modes.append(_isolation_mode(design))
    except _Located as exc:
        problems.append(exc.problem(design))
    modes += _listed_modes(design, design, (), "")
    modes += _source_modes(design, design, (), "", ceiling, problems)
    structure = design.structure
    if structure is not None:
        prefix = f"{structure.structure.name}: "
        origin = f"structure file {structure.file}"
        here = ("support", "structure")
        modes += _listed_modes(structure, design, here, prefix, origin)
        modes += _source_modes(structure, design, here, prefix, ceiling, problems, origin)
    try:
        loads = machine_loads(design)
    except ValueError as exc:  # an input the load model cannot take, located
        problems.append(_Located(getattr(exc, "path", ("machine",)), str(exc)).problem(design))
        loads = None
    if design.shaft_train:  # cross-references of the shaft trains, each at its key
        from .torsional_analysis import torsion_problems

        problems += torsion_problems(design)
    if problems:
        raise InputError(problems)
    modes.sort(key=lambda mode: (mode.nominal, mode.name))
    result = Analysis(tuple(modes), bands, rigid_body, loads)
    design._analysis = result
    return result


def shared(design, key: str, compute):
    """``compute(design)``, worked out once per design for every rule that asks by ``key``.

    For results that depend on the design alone (a rule's options must not enter them):
    the isolation rules' machine on its isolators with its solved modal models, the
    fastener rules' joint screenings. A computation that raises is not kept, so each rule
    that asks meets the same exception.
    """
    store = design._shared
    if key not in store:
        store[key] = compute(design)
    return store[key]


def natural_frequencies(design) -> list[ModeBand]:
    """Every natural frequency the design gives or implies, lowest first."""
    return list(analyse(design).modes)


class _Located(Exception):
    def __init__(self, path: tuple, message: str, owner=None) -> None:
        super().__init__(message)
        self.path, self.message, self.owner = path, message, owner

    def problem(self, design) -> InputProblem:
        owner = self.owner if self.owner is not None else design
        file, line, column = owner.locate(self.path)
        return InputProblem(file, line, column, format_key_path(self.path), self.message)


# ---------------------------------------------------------------- isolation modes

DYNAMIC_STIFFNESS_RATIO_BY_KIND = {
    "rubber": 1.4, "pad": 1.4, "spring": 1.0, "restrained-spring": 1.0, "air-spring": 1.0,
}
"""Default dynamic-to-static stiffness ratio by kind of isolator [unitless].

Elastomers (natural rubber, neoprene, elastomer pads) are stiffer under small vibration
than under their static load: about 1.2 for soft compounds (40 shore A) to 2 or more for
hard ones (70 shore A and filled compounds); 1.4 is taken for a mid-hardness mount. Source:
Harris' Shock and Vibration Handbook, 6th ed., ch. on the application of rubber isolators
(dynamic-to-static ratio 1.2 to 2+, rising with hardness), from memory. Steel springs are
linear: 1.0 (common practice). Air springs: 1.0, their rated natural frequency being
dynamic already (common practice). A design states its own ratio with
``mounting.dynamic-stiffness-ratio``.
"""

_RATIO_SOURCE = ("Harris' Shock and Vibration Handbook, 6th ed., rubber isolators: 1.2 to 2 "
                 "and more with hardness; from memory")


class IsolatorStiffnessRatio(Record):
    """The dynamic-to-static stiffness ratio of a set of isolators, stated or by kind."""

    low: float
    value: float
    high: float
    stated: bool
    applies_to_stiffness: bool  # a stated ratio makes a stated stiffness static

    @property
    def has_band(self) -> bool:
        return self.low != self.high

    @property
    def band(self) -> str:
        return f"{self.value:g}" if self.low == self.high else f"{self.low:g}-{self.high:g}"

    @property
    def words(self) -> str:
        band = self.band
        if self.stated:
            return f"dynamic-to-static stiffness ratio {band} as stated"
        if self.value == 1.0:
            return "dynamic-to-static stiffness ratio 1 (linear isolators, common practice)"
        return (f"dynamic-to-static stiffness ratio {band}, the default for elastomer "
                f"isolators ({_RATIO_SOURCE})")


def isolator_stiffness_ratio(mounting) -> IsolatorStiffnessRatio:
    """The dynamic-to-static stiffness ratio of a mounting's isolators.

    ``mounting.dynamic-stiffness-ratio`` as stated (a value or a band), or the default
    for the kind of isolator (:data:`DYNAMIC_STIFFNESS_RATIO_BY_KIND`). The dynamic
    stiffness sets the natural frequency: f_n = sqrt(ratio g / delta) / (2 pi) from a
    static deflection delta.
    """
    stated = mounting.dynamic_stiffness_ratio
    if stated is not None:
        return IsolatorStiffnessRatio(stated.low, stated.value, stated.high, True, True)
    value = DYNAMIC_STIFFNESS_RATIO_BY_KIND.get(mounting.kind, 1.0)
    return IsolatorStiffnessRatio(value, value, value, False, False)



def _carried_mass(design) -> tuple[float, float, float]:
    mass = design.machine.mass
    base = design.mounting.base_mass
    extra = (base.low, base.value, base.high) if base else (0.0, 0.0, 0.0)
    return mass.low + extra[0], mass.value + extra[1], mass.high + extra[2]


def _isolation_mode(design) -> ModeBand:
    mounting = design.mounting
    mass_low, mass_nominal, mass_high = _carried_mass(design)
    assumptions = [
        "the machine moves as a rigid body in vertical bounce on its isolators "
        "(one degree of freedom; rocking modes are not computed: give [[mounting.mount]] "
        "tables for all six)",
    ]
    ratio = isolator_stiffness_ratio(mounting)
    if mounting.stiffness is not None:
        count = mounting.isolators
        stiffness = mounting.stiffness
        scale = ((ratio.low, ratio.value, ratio.high) if ratio.applies_to_stiffness
                 else (1.0, 1.0, 1.0))
        nominal = float(natural_frequency_spring_mass(count * stiffness.value * scale[1],
                                                      mass_nominal))
        low = float(natural_frequency_spring_mass(count * stiffness.low * scale[0], mass_high))
        high = float(natural_frequency_spring_mass(count * stiffness.high * scale[2], mass_low))
        origin = f"{count} isolators of {stiffness.text} each carrying {mass_nominal:g} kg"
        path = ("mounting", "stiffness")
        if mounting.static_deflection is not None:
            assumptions.append("both stiffness and static deflection are given; "
                               "the stiffness is used")
        if ratio.applies_to_stiffness:
            origin += f", times the {ratio.words}"
            assumptions.append(f"the stated stiffness is static; dynamic stiffness from the "
                               f"{ratio.words}")
        elif mounting.kind in ("rubber", "pad"):
            assumptions.append("the stated stiffness is taken as the dynamic stiffness (give "
                               "mounting.dynamic-stiffness-ratio if it is the static one)")
    else:
        deflection = mounting.static_deflection
        root = ratio.value ** 0.5
        nominal = float(natural_frequency_static_deflection(deflection.value)) * root
        low = float(natural_frequency_static_deflection(deflection.high)) * ratio.low ** 0.5
        high = float(natural_frequency_static_deflection(deflection.low)) * ratio.high ** 0.5
        if ratio.value == 1.0 and not ratio.has_band:
            origin = f"static deflection {deflection.text} (f = 15.76 / sqrt(deflection in mm))"
        else:
            origin = (f"static deflection {deflection.text} with a dynamic-to-static stiffness "
                      f"ratio of {ratio.band} (f = 15.76 / sqrt(deflection in mm) x "
                      "sqrt(ratio))")
        path = ("mounting", "static-deflection")
        assumptions.append("linear isolators: natural frequency from the static deflection")
        if ratio.stated or ratio.value != 1.0:
            assumptions.append(f"isolator stiffness: {ratio.words}")
    if mounting.base_mass is not None:
        assumptions.append(f"the base mass {mounting.base_mass.text} moves with the machine")
    return ModeBand(
        name=f"isolation, vertical bounce ({mounting.kind})",
        nominal=nominal, low=low, high=high, key_path=path, origin=origin,
        assumptions=tuple(assumptions), damping_ratio=mounting.damping_ratio,
        is_isolation=True,
    )


class MountLayout(Record):
    """The six-DOF model's inputs from a design, SI: what every rule that uses the
    rigid body on its mounts builds from (:func:`mount_layout`)."""

    mass_low: float
    mass: float
    mass_high: float
    inertia: object  # 3 x 3 about the CG at the nominal mass [kg m^2]
    positions: object  # (n, 3) [m]
    centre_of_gravity: tuple
    orientations: object  # (n, 3, 3) or None for upright mounts
    supports: object  # (n, 3) series support stiffness [N/m] or None
    assumptions: tuple[str, ...]
    inertia_path: tuple

    def stiffnesses(self, mounts, pick) -> object:
        """(n, 3) axial, shear, shear stiffness of each mount, each read by ``pick``."""
        import numpy as np

        return np.array([[pick(m.axial_stiffness), pick(m.shear_stiffness),
                          pick(m.shear_stiffness)] for m in mounts])

    def mass_matrix(self, mass: float) -> object:
        """6 x 6 mass matrix for a mass, the inertia scaled with it [kg, kg m^2]."""
        from .dynamics.modes import rigid_mounts

        return rigid_mounts.rigid_body_mass_matrix(mass, self.inertia * (mass / self.mass))


def mount_layout(design) -> MountLayout:
    """The inputs of the six-DOF model of a design that gives [[mounting.mount]] tables,
    built once per design (:func:`shared`) for the analysis and every rule; its arrays
    are read-only."""
    return shared(design, "mount-layout", _new_mount_layout)


def mount_mass_matrix(design, mass: float):
    """``mount_layout(design).mass_matrix(mass)``, built once per design and mass [kg]
    (the analysis and the isolation rules ask for the same three masses); read-only.
    Raises ValueError as :meth:`MountLayout.mass_matrix` does, each time it is asked."""
    store = shared(design, "mount-mass-matrices", _new_store)
    found = store.get(mass)
    if found is None:
        found = mount_layout(design).mass_matrix(mass)
        found.flags.writeable = False
        store[mass] = found
    return found


def _new_store(design) -> dict:
    return {}


def _new_mount_layout(design) -> MountLayout:
    import numpy as np

    from .dynamics.modes import rigid_mounts

    mounting = design.mounting
    mass_low, mass_nominal, mass_high = _carried_mass(design)
    assumptions = ["the machine and its base move as one rigid body on the mounts"]
    if mounting.inertia is not None:
        inertia = np.array(mounting.inertia.as_matrix())
        inertia_path = ("mounting", "inertia")
    else:
        box = mounting.envelope
        inertia = rigid_mounts.uniform_box_inertia(mass_nominal, box.x.value, box.y.value,
                                                   box.z.value)
        inertia_path = ("mounting", "envelope")
        assumptions.append(f"inertia estimated as a uniform solid box of {box.x.text} x "
                           f"{box.y.text} x {box.z.text}")
    orientations = None
    if any(m.axis is not None for m in mounting.mount):
        axes = [m.axis.as_tuple() if m.axis is not None else (0.0, 0.0, 1.0)
                for m in mounting.mount]
        orientations = rigid_mounts.mount_axes(np.array(axes))
        assumptions.append("inclined mounts: axial stiffness along each mount's axis, the "
                           "shear stiffness across it")
    supports = None
    if any(m.support_stiffness is not None for m in mounting.mount):
        supports = np.array([[m.support_stiffness.value if m.support_stiffness else np.inf,
                              np.inf, np.inf] for m in mounting.mount])
        assumptions.append("support stiffness acts along each mount's axis, in series with it")
    positions = np.array([m.position.as_tuple() for m in mounting.mount])
    for array in (inertia, positions, orientations, supports):
        if array is not None:  # shared by every rule: no one may change it for the others
            array.flags.writeable = False
    return MountLayout(
        mass_low=mass_low, mass=mass_nominal, mass_high=mass_high, inertia=inertia,
        positions=positions,
        centre_of_gravity=mounting.centre_of_gravity.as_tuple(), orientations=orientations,
        supports=supports, assumptions=tuple(assumptions), inertia_path=inertia_path)


def _six_dof_modes(design):
    import numpy as np

    from .dynamics.modes import rigid_mounts

    mounting = design.mounting
    layout = mount_layout(design)
    assumptions = list(layout.assumptions)

    def solve(k_pick, mass: float, solver=rigid_mounts.rigid_body_modes):
        try:
            mass_matrix = mount_mass_matrix(design, mass)
        except ValueError as exc:
            raise _Located(layout.inertia_path, str(exc)) from None
        try:
            k = rigid_mounts.mount_stiffness_matrix(
                layout.positions, layout.stiffnesses(mounting.mount, k_pick),
                layout.centre_of_gravity, orientations=layout.orientations,
                support_stiffnesses=layout.supports)
            return solver(mass_matrix, k)
        except ValueError as exc:
            raise _Located(("mounting", "mount"), str(exc)) from None

    nominal = solve(lambda a: a.value, layout.mass)
    # the band's ends need their frequencies only, not the shapes and words
    soft = solve(lambda a: a.low, layout.mass_high, rigid_mounts.rigid_body_frequencies)
    stiff = solve(lambda a: a.high, layout.mass_low, rigid_mounts.rigid_body_frequencies)
    tolerance = bool(np.any(soft != stiff))
    if tolerance:
        assumptions.append("tolerance bands from all mounts at their softest with the "
                           "heaviest mass, and at their stiffest with the lightest")
    modes = []
    for j in range(6):
        modes.append(ModeBand(
            name=f"isolation mode {j + 1}, {nominal.descriptions[j]}",
            nominal=float(nominal.frequencies[j]),
            low=float(min(soft[j], nominal.frequencies[j])),
            high=float(max(stiff[j], nominal.frequencies[j])),
            key_path=("mounting", "mount"),
            origin=f"six-degree-of-freedom model on {len(mounting.mount)} mounts",
            assumptions=tuple(assumptions),
            damping_ratio=mounting.damping_ratio,
            is_isolation=True,
        ))
    return modes, nominal


# ------------------------------------------------------------ listed and sources


def _listed_modes(owner, design, here: tuple, prefix: str, origin: str = "") -> list[ModeBand]:
    modes = []
    for index, listed in enumerate(owner.natural_frequency):
        frequency = listed.frequency
        where = origin or (f"listed ({listed.source})" if listed.source else "listed")
        if origin and listed.source:
            where += f", {listed.source}"
        modes.append(ModeBand(
            name=prefix + listed.name, nominal=frequency.value, low=frequency.low,
            high=frequency.high,
            key_path=here or ("natural-frequency", index, "frequency"), origin=where,
        ))
    for mode in owner.imported_modes:
        where = f"{mode.file}:{mode.line}" + (f" in {origin}" if origin else "")
        modes.append(ModeBand(
            name=f"{prefix}{mode.name}", nominal=mode.frequency.value,
            low=mode.frequency.low, high=mode.frequency.high,
            key_path=here or mode.key_path, origin=where, damping_ratio=mode.damping_ratio,
        ))
    return modes


def _source_modes(owner, design, here, prefix, ceiling, problems, origin="") -> list[ModeBand]:
    modes: list[ModeBand] = []
    for index, beam in enumerate(owner.beam):
        try:
            modes += _beam_modes(beam, here or ("beam", index), prefix, origin)
        except ValueError as exc:
            problems.append(_Located(("beam", index), str(exc), owner).problem(design))
    for index, model in enumerate(owner.lumped_model):
        try:
            modes += _lumped_modes(model, here or ("lumped-model", index), prefix, origin,
                                   ceiling)
        except _Located as exc:
            exc.path = ("lumped-model", index)
            exc.owner = owner
            problems.append(exc.problem(design))
    return modes


def _beam_modes(beam, path, prefix, origin) -> list[ModeBand]:
    from .dynamics.modes import beams

    def frequencies(pick_e, pick_i, pick_mu, pick_l, pick_m):
        e, i, length = pick_e(beam.youngs_modulus), pick_i(beam.second_moment), pick_l(beam.length)
        mu = beam.mass_per_metre * pick_mu
        if beam.tip_mass is not None:
            return beams.cantilever_tip_mass_exact(e, i, mu, length, pick_m(beam.tip_mass),
                                                   n_modes=beam.modes)
        if beam.central_mass is not None:
            return beams.simply_supported_central_mass_exact(
                e, i, mu, length, pick_m(beam.central_mass), n_modes=beam.modes)
        return beams.beam_natural_frequencies(beam.end_condition, e, i, mu, length,
                                              n_modes=beam.modes)

    def value(a):
        return a.value

    def low(a):
        return a.low

    def high(a):
        return a.high

    mu_source = beam.mass_per_length or beam.density
    mu_low = mu_source.low / mu_source.value
    mu_high = mu_source.high / mu_source.value
    nominal = frequencies(value, value, 1.0, value, value)
    lows = frequencies(low, low, mu_high, high, high)
    highs = frequencies(high, high, mu_low, low, low)
    extra = ""
    if beam.tip_mass is not None:
        extra = f" with {beam.tip_mass.text} at the tip"
    elif beam.central_mass is not None:
        extra = f" with {beam.central_mass.text} at midspan"
    where = origin or f"{beam.end_condition} beam, Euler-Bernoulli{extra}"
    return [
        ModeBand(name=f"{prefix}{beam.name}, bending mode {n + 1}", nominal=float(nominal[n]),
                 low=float(min(lows[n], nominal[n])), high=float(max(highs[n], nominal[n])),
                 key_path=path, origin=where,
                 assumptions=("Euler-Bernoulli beam: shear deformation and rotary inertia "
                              "neglected",))
        for n in range(len(nominal))
    ]


def _lumped_modes(model, path, prefix, origin, ceiling) -> list[ModeBand]:
    import numpy as np

    from .dynamics.modes import lumped

    masses = np.array([m.value for m in model.masses])
    springs = [(a - 1 if a else -1, b - 1 if b else -1, s.stiffness.value)
               for (a, b), s in ((spring.between, spring) for spring in model.springs)]
    try:
        mass_matrix, stiffness_matrix = lumped.lumped_matrices(masses, springs)
        top = ceiling if ceiling > 0 else None
        if len(masses) <= lumped.ALL_MODES_MAX_DOF and top is None:
            found = lumped.lumped_modes(mass_matrix, stiffness_matrix)
            frequencies, rigid = found.frequencies, found.rigid_body_modes
        elif top is None:
            found = lumped.lumped_modes(mass_matrix, stiffness_matrix, 0.0, top)
            frequencies, rigid = found.frequencies, found.rigid_body_modes
        else:
            frequencies, rigid = lumped.lumped_frequencies(
                mass_matrix, stiffness_matrix, top, MAX_LUMPED_MODES)
    except lumped.TooManyModes as exc:
        raise _Located(path, f"lumped model '{model.name}' has more than {exc.limit} modes "
                       f"at or below {exc.f_high:.4g} Hz (the search ceiling, "
                       f"{LUMPED_SEARCH_FACTOR:g} x the highest forcing frequency); vcheck "
                       f"judges at most {exc.limit} modes of one model: give fewer nodes, or "
                       "the modes themselves as [[natural-frequency]] or a [[mode-file]]") \
            from None
    except ValueError as exc:
        raise _Located(path, str(exc)) from None
    if rigid:
        raise _Located(path, f"lumped model '{model.name}' is not tied to the ground: "
                       f"{rigid} free motion(s); join a node to node 0")
    tolerance = any(m.has_tolerance for m in model.masses) or any(
        s.stiffness.has_tolerance for s in model.springs)
    assumptions = ("lumped model at nominal values" + (" (tolerances are not propagated "
                   "through lumped models)" if tolerance else ""),)
    where = origin or f"lumped model of {len(masses)} masses"
    return [
        ModeBand(name=f"{prefix}{model.name}, mode {n + 1}", nominal=float(f), low=float(f),
                 high=float(f), key_path=path, origin=where, assumptions=assumptions)
        for n, f in enumerate(frequencies) if f > 0
    ]


# ------------------------------------------------------------------ forcing bands


def excitation_bands(design, orders: tuple[float, ...] = (1.0, 2.0)) -> list[ExcitationBand]:
    """Forcing bands from what the machine is, over its whole speed range [Hz].

    Worked out once per design and tuple of orders (the analysis, the separation rule and
    the measured-vibration rule ask with the same orders); each call gets a list of its
    own of the same frozen bands."""
    store = shared(design, "excitation-bands", _new_store)
    key = tuple(orders)
    found = store.get(key)
    if found is None:
        found = tuple(_new_excitation_bands(design, key))
        store[key] = found
    return list(found)


def _new_excitation_bands(design, orders: tuple[float, ...]) -> list[ExcitationBand]:
    machine = design.machine
    speed = machine.speed
    bands: list[ExcitationBand] = []

    def add(name: str, order: float, path: tuple, kind: str) -> None:
        low, high = order_band(order, speed.min.value, speed.max.value)
        bands.append(ExcitationBand(name, float(low), float(high), path, kind))

    for order in orders:
        add(f"{order:g}x running speed", order, ("machine", "speed"), "running-speed")
    if machine.vanes:
        add(f"vane pass ({machine.vanes} vanes)", machine.vanes, ("machine", "vanes"),
            "vane-pass")
    if machine.blades:
        add(f"blade pass ({machine.blades} blades)", machine.blades, ("machine", "blades"),
            "blade-pass")
    if machine.cylinders:
        path = ("machine", "cylinders")
        if machine.kind == "reciprocating-compressor" and machine.strokes is None:
            order = float(excitations.compressor_pulsation_frequency(machine.cylinders, 1.0))
            add(f"compression pulses ({machine.cylinders} cylinders)", order, path,
                "compression")
        else:
            found = excitations.engine_excitation_orders(machine.cylinders, machine.strokes,
                                                         max_order=2 * machine.cylinders)
            for order in found.firing_orders[:2]:
                add(f"firing order {order:g} ({machine.cylinders} cylinders, "
                    f"{machine.strokes}-stroke)", float(order), path, "firing")
            if machine.strokes == 4:
                add("half order (four-stroke cycle)", 0.5, path, "firing")
    for index, gear in enumerate(machine.gear):
        add(f"gear mesh, {gear.name} ({gear.teeth} teeth)", gear.teeth * gear.shaft_ratio,
            ("machine", "gear", index), "gear-mesh")
    if machine.belt is not None:
        belt = machine.belt
        order = float(excitations.belt_pass_frequency(belt.pulley_diameter.value, 1.0,
                                                      belt.length.value))
        add("belt pass", order, ("machine", "belt"), "belt-pass")
    for index, bearing in enumerate(machine.bearing):
        found = excitations.bearing_defect_orders(
            bearing.balls, bearing.ball_diameter.value, bearing.pitch_diameter.value,
            bearing.contact_angle * 3.141592653589793 / 180.0)
        path = ("machine", "bearing", index)
        for label, order in (("outer race", found.outer_race), ("inner race", found.inner_race),
                             ("cage", found.cage), ("ball spin", found.ball_spin)):
            add(f"bearing {bearing.name}, {label}", float(order), path, "bearing-defect")
    if machine.driver is not None:
        bands += _electrical_bands(machine)
    for index, source in enumerate(machine.excitation):
        path = ("machine", "excitation", index)
        if source.order is not None:
            add(f"{source.name} ({source.order:g}x)", source.order, path, "listed")
        else:
            frequency = source.frequency
            bands.append(ExcitationBand(source.name, frequency.low, frequency.high, path,
                                        "listed"))
    bands.sort(key=lambda band: (band.low, band.name))
    return bands


# ------------------------------------------------------------ electric drivers


def _drive_fed(driver, speed) -> tuple[bool, bool]:
    """(line band, drive bands) judged for an AC motor: a stated supply gives one; a
    speed range without a stated supply gives both where the poles are known."""
    if driver.supply == "drive":
        return False, True
    if driver.supply == "line" or not speed.is_range:
        return True, False
    return True, driver.poles is not None


def _motor_speed_ratio(machine) -> float | None:
    """Motor speed / machine speed, or None where a belt or gear leaves it unknown."""
    driver = machine.driver
    if driver.speed_ratio is not None:
        return driver.speed_ratio
    if machine.belt is not None or driver.kind == "belt-drive":
        return None
    return 1.0


def _electrical_bands(machine) -> list[ExcitationBand]:
    from .design.models import AC_MOTOR_KINDS

    driver, speed = machine.driver, machine.speed
    bands: list[ExcitationBand] = []
    line_band, drive_bands = ((driver.line_frequency is not None, False)
                              if driver.kind not in AC_MOTOR_KINDS else _drive_fed(driver, speed))
    inferred = driver.supply is None and line_band and drive_bands
    if line_band and driver.line_frequency is not None:
        line = driver.line_frequency
        low = excitations.twice_line_frequency(line.low)
        high = excitations.twice_line_frequency(line.high)
        notes = ()
        if driver.kind in AC_MOTOR_KINDS:
            notes = (("the motor may be fed by a variable-frequency drive (speed range, "
                      "driver.supply not given): both twice line frequency and the drive's "
                      "forcing are judged",) if inferred else
                     ("the motor is started across the line: its magnetic forcing stays at "
                      "twice line frequency" + ("" if driver.supply == "line" else
                                                " (driver.supply not given)"),))
        bands.append(ExcitationBand(f"twice line frequency ({line.text} supply)", float(low),
                                    float(high), ("machine", "driver", "line-frequency"),
                                    "electrical", notes))
    ratio = _motor_speed_ratio(machine)
    if not drive_bands or ratio is None:
        return bands
    poles = driver.poles
    low_speed, high_speed = speed.min.value * ratio, speed.max.value * ratio
    low, high = (float(v) for v in excitations.drive_fed_magnetic_frequency(
        poles, (low_speed, high_speed)))
    out_low, out_high = (float(v) for v in excitations.drive_output_frequency(
        poles, (low_speed, high_speed)))
    across = "" if ratio == 1 else f" (the motor turns at {ratio:g} x machine speed)"
    bands.append(ExcitationBand(
        f"twice drive output frequency ({poles} poles)", low, high, ("machine", "driver"),
        "electrical",
        (f"drive-fed motor: magnetic forcing {_hz_text(low, high)} at twice the drive's "
         f"output frequency (output {_hz_text(out_low, out_high)}), poles x motor "
         f"speed{across}"
         + (", slip neglected" if driver.kind == "induction-motor" else "")
         + " (IEC 60034-1 synchronous speed, from memory)",)))
    for harmonic in excitations.INVERTER_TORQUE_HARMONICS:
        bands.append(ExcitationBand(
            f"drive torque pulsation ({harmonic}x output frequency)", harmonic * out_low,
            harmonic * out_high, ("machine", "driver"), "electrical",
            (f"drive torque pulsations at {_times(excitations.INVERTER_TORQUE_HARMONICS)} "
             "the output frequency, the six-pulse inverter's harmonics (from memory); the "
             "drive maker's data govern",)))
    return bands


def _times(harmonics) -> str:
    words = [str(h) for h in harmonics]
    joined = words[0] if len(words) == 1 else ", ".join(words[:-1]) + " and " + words[-1]
    return f"{joined} times"


def _hz_text(low: float, high: float) -> str:
    def one(value: float) -> str:
        return f"{value:.2f}" if value < 10 else f"{value:.1f}"

    return f"{one(low)} Hz" if low == high else f"{one(low)}-{one(high)} Hz"


def drive_inputs_missing(design) -> tuple[tuple, str] | None:
    """What a motor's magnetic forcing needs and the design does not give.

    Returns ``(key path, words)`` naming the missing input, or None: an AC motor on a
    speed range with neither ``supply`` nor ``poles`` (the drive's forcing cannot be
    placed), or a drive-fed motor behind a belt or gear without ``speed-ratio``.
    """
    from .design.models import AC_MOTOR_KINDS

    machine = design.machine
    driver = machine.driver
    if driver is None or driver.kind not in AC_MOTOR_KINDS:
        return None
    line_band, drive_bands = _drive_fed(driver, machine.speed)
    path = ("machine", "driver")
    if driver.supply is None and machine.speed.is_range and not drive_bands:
        return path, ("the motor's magnetic forcing on a variable-frequency drive (speed "
                      "range, no driver.supply or driver.poles): give driver.supply = "
                      "\"drive\" with driver.poles, or supply = \"line\"")
    if drive_bands and _motor_speed_ratio(machine) is None:
        return path, ("the drive-fed motor's magnetic forcing (a belt sits between motor and "
                      "machine): give driver.speed-ratio, motor speed / machine speed")
    return None


# ------------------------------------------------------------ rocking excitation

ROCKING_MACHINE_KINDS = ("engine", "generator-set", "reciprocating-compressor")
"""Machine kinds whose gas torque and crank mechanism rock the machine on its mounts
(common practice)."""


def rocking_sources(design, loads) -> tuple[str, ...]:
    """Why the design's machine excites rocking on its mounts, in words (empty: it does
    not, as far as the design says).

    A reciprocating machine (engine, generator set, reciprocating compressor, or any
    machine with cylinders or an engine driver), a torque reaction, a stated moment, or a
    free moment of the crank mechanism. ``loads`` is the design's
    :class:`~vcheck.machine_loads.LoadSet` or None.
    """
    machine = design.machine
    found: list[str] = []
    if machine.kind in ROCKING_MACHINE_KINDS:
        article = "an" if machine.kind[0] in "aeiou" else "a"
        found.append(f"the machine is {article} {machine.kind}")
    elif machine.cylinders:
        plural = "" if machine.cylinders == 1 else "s"
        found.append(f"the machine has {machine.cylinders} cylinder{plural}")
    elif machine.driver is not None and machine.driver.kind == "engine":
        found.append("the machine is driven by an engine")
    if machine.torque is not None:
        found.append("a torque reaction is stated ([machine.torque])")
    for stated in machine.load:
        if stated.moment is not None and any(stated.moment.as_tuple()):
            found.append(f"the stated load '{stated.name}' has a moment")
    if loads is not None and any(load.source == "crank" and load.moment_amplitude > 0
                                 for load in loads.harmonic):
        found.append("the crank mechanism has free moments")
    return tuple(found)


def excites_rocking(design, loads) -> bool:
    """Whether the design's machine excites rocking on its mounts (see
    :func:`rocking_sources`); a pure function of the design and its loads."""
    return bool(rocking_sources(design, loads))

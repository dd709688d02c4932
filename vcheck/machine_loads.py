"""The forces and moments a design's machine generates, where they act, SI units.

This is the load side of what vcheck believes about a design, computed once and shared
by every rule (:func:`machine_loads`, cached with :func:`vcheck.analysis.analyse`):

- rotating unbalance from the rotor's balance grade (ISO 21940-11), a rotating force at
  the rotor's centre, two components in quadrature across the shaft;
- the free forces and moments of a crank mechanism by order, from ``[machine.crank]``;
- the torque reaction on the frame, its mean from ``power`` and speed (a static moment)
  and its fluctuation at the firing order (a harmonic moment about the shaft);
- the belt pull from power, pulley and belt kind (a static force at the pulley);
- forces and moments stated in ``[[machine.load]]``, which replace the derived crank
  load of the same order.

A harmonic load is the complex amplitude of Re(F e^{i 2 pi f t}) in machine axes at its
reference speed; its amplitude at another speed follows (speed / reference) ** exponent
(2 for inertia forces, 0 for a fixed amplitude). The physics is in
:mod:`vcheck.dynamics.forcing`; this module only reads the design.
"""

from __future__ import annotations

import math

from .records import Record

__all__ = ["HarmonicLoad", "LoadSet", "StaticLoad", "machine_loads"]


class _LoadInputError(ValueError):
    """An input the load model cannot take, with the key path it concerns."""

    def __init__(self, path: tuple, message: str) -> None:
        super().__init__(message)
        self.path = path

_ZERO = (0j, 0j, 0j)


class HarmonicLoad(Record):
    """A harmonic force and moment the machine puts on its mounting.

    ``force`` [N] acts at ``point`` [m]; ``moment`` [N m] is a free moment. Both are
    complex amplitudes in machine axes at ``reference_speed`` [Hz]. The load's frequency
    is ``order`` times running speed, or the fixed ``frequency`` band [Hz].
    """

    name: str
    source: str
    force: tuple
    moment: tuple
    point: tuple
    reference_speed: float
    exponent: float
    key_path: tuple
    order: float | None = None
    frequency: tuple | None = None
    assumptions: tuple[str, ...] = ()

    def band(self, speed) -> tuple[float, float]:
        """Forcing frequencies over the speed range [Hz]."""
        if self.order is not None:
            return self.order * speed.min.value, self.order * speed.max.value
        return self.frequency

    def scale_at(self, speed: float) -> float:
        """Amplitude factor at a running speed [unitless]."""
        if self.exponent == 0:
            return 1.0
        return (speed / self.reference_speed) ** self.exponent

    def about(self, centre_of_gravity) -> tuple:
        """(Fx, Fy, Fz, Mx, My, Mz) about the centre of gravity [N, N m], complex."""
        r = [p - c for p, c in zip(self.point, centre_of_gravity)]
        f = self.force
        cross = (r[1] * f[2] - r[2] * f[1], r[2] * f[0] - r[0] * f[2], r[0] * f[1] - r[1] * f[0])
        return tuple(f) + tuple(m + c for m, c in zip(self.moment, cross))

    @property
    def force_amplitude(self) -> float:
        """Largest length of the force over a cycle at the reference speed [N]."""
        return _peak_length(self.force)

    @property
    def moment_amplitude(self) -> float:
        """Largest length of the free moment over a cycle at the reference speed [N m]."""
        return _peak_length(self.moment)


class StaticLoad(Record):
    """A steady force [N] at ``point`` [m] and free moment [N m] on the machine's mounting."""

    name: str
    source: str
    force: tuple
    moment: tuple
    point: tuple
    key_path: tuple
    assumptions: tuple[str, ...] = ()


class LoadSet(Record):
    """Every load of a design: harmonic, static, and remarks on what could not be derived."""

    harmonic: tuple[HarmonicLoad, ...] = ()
    static: tuple[StaticLoad, ...] = ()
    notes: tuple[tuple[tuple, str], ...] = ()
    """(key path, words) of inputs that look wrong, such as a point of action far from the
    machine; rules do not pass a design with such a note silently."""

    @property
    def beyond_unbalance(self) -> bool:
        """Whether any load other than the rotor's unbalance is known."""
        return bool(self.static) or any(load.source != "unbalance" for load in self.harmonic)


def _peak_length(vector) -> float:
    """Largest length of Re(v e^{i w t}) over a cycle [unit of v]."""
    from .dynamics.isolation.forced_response import peak_vector_magnitude

    return float(peak_vector_magnitude(list(vector)))


def _cg(design) -> tuple:
    mounting = design.mounting
    if mounting is not None and mounting.centre_of_gravity is not None:
        return mounting.centre_of_gravity.as_tuple()
    return (0.0, 0.0, 0.0)


def _point(point, design) -> tuple:
    return point.as_tuple() if point is not None else _cg(design)


def machine_loads(design) -> LoadSet:
    """The harmonic and static loads of the design's machine (see the module's doc)."""
    machine = design.machine
    speed = machine.speed
    top = speed.max.value
    harmonic: list[HarmonicLoad] = []
    static: list[StaticLoad] = []
    notes: list[tuple[tuple, str]] = []
    stated_orders = {load.order for load in machine.load if load.order is not None}

    rotor = machine.rotor
    if rotor is not None:
        from .dynamics.forcing.unbalance import permissible_residual_unbalance, unbalance_force

        omega = 2 * math.pi * top
        unbalance = float(permissible_residual_unbalance(rotor.balance_quality, rotor.mass.high,
                                                         omega))
        force = float(unbalance_force(unbalance, omega))
        where = "at the rotor's centre" if rotor.position is not None else (
            "at the centre of gravity (rotor.position not given)")
        harmonic.append(HarmonicLoad(
            name=f"unbalance ({rotor.balance_grade}, {rotor.mass.text} rotor)",
            source="unbalance", force=(0j, complex(force), complex(-1j * force)), moment=_ZERO,
            point=_point(rotor.position, design), reference_speed=top, exponent=2.0,
            key_path=("machine", "rotor"), order=1.0,
            assumptions=(
                f"unbalance: the permissible residual unbalance of {rotor.balance_grade} at "
                f"the maximum speed (ISO 21940-11, from memory), {unbalance * 1e6:.4g} g mm, "
                f"rotating once a revolution across the shaft {where}; its force grows with "
                "the square of speed",)))

    crank = machine.crank
    if crank is not None:
        harmonic += _crank_loads(design, crank, stated_orders)

    torque = machine.torque
    if torque is not None:
        found = _torque_loads(design, torque)
        static.append(found[0])
        if found[1] is not None:
            harmonic.append(found[1])

    belt = machine.belt
    if belt is not None and machine.power is not None:
        static.append(_belt_pull(design, belt))

    for index, stated in enumerate(machine.load):
        harmonic.append(_stated_load(design, index, stated))

    notes += _far_points(design, harmonic, static)
    return LoadSet(tuple(harmonic), tuple(static), tuple(notes))


def _crank_loads(design, crank, stated_orders) -> list[HarmonicLoad]:
    import numpy as np

    from .dynamics.forcing import crank as mechanism

    machine = design.machine
    n = machine.cylinders
    strokes = machine.strokes or 2
    vee = math.radians(crank.vee_angle) if crank.vee_angle is not None else None
    assumptions = []
    paired = crank.arrangement in ("vee", "opposed")
    if crank.crank_angles is not None:
        angles = np.radians(np.array(crank.crank_angles, dtype=float))
        # banks in the order of standard_crank_angles: pairs, the negative bank first
        if crank.arrangement == "inline":
            banks = np.zeros(n)
        else:
            half = vee / 2 if crank.arrangement == "vee" else math.pi / 2
            banks = np.tile([-half, half], n // 2)
    else:
        try:
            angles, banks = mechanism.standard_crank_angles(n, strokes, crank.arrangement, vee)
        except ValueError as exc:
            raise _LoadInputError(("machine", "crank"), f"{exc}: give crank.crank-angles, one "
                                  "per cylinder") from None
        degrees = ", ".join(f"{math.degrees(a) % 360:g}" for a in angles)
        cycle = f"{machine.strokes}-stroke" if machine.strokes else "one cycle a revolution"
        assumptions.append(f"crank angles {degrees} degrees, the usual phasing of {_a(n)}"
                           f"-cylinder {crank.arrangement} ({cycle}; common practice): give "
                           "crank.crank-angles where the crankshaft differs")
    throws = n // 2 if paired else n
    spacing = crank.cylinder_spacing.value if crank.cylinder_spacing is not None else 0.0
    throw_x = (np.arange(throws) - (throws - 1) / 2.0) * spacing
    # the two cylinders of a pair sit on one throw (their small offset is neglected)
    cylinder_x = np.repeat(throw_x, 2) if paired else throw_x
    centre = _point(crank.centre, design)
    top = machine.speed.max.value
    omega2 = (2 * math.pi * top) ** 2
    found = mechanism.crank_free_loads(
        crank.stroke.value / 2, crank.connecting_rod.value, crank.reciprocating_mass.high,
        crank.rotating_mass.high, cylinder_x, angles, banks)
    where = ("at the crankshaft centre" if crank.centre is not None else
             "at the centre of gravity (crank.centre not given)")
    assumptions.append(f"free forces and moments of the crank mechanism {where}, from the "
                       "slider-crank kinematics; they grow with the square of speed")
    out = []
    names = {1.0: "primary", 2.0: "secondary"}
    size = {float(h.order): max(_peak_length(h.force), _peak_length(h.moment) / _arm(crank))
            for h in found}
    largest = max(size.values(), default=0.0)
    small = [order for order, value in size.items() if value < 0.01 * largest]
    if small:
        words = ", ".join(f"{order:g}" for order in sorted(small))
        assumptions.append(f"crank orders {words} below 1% of the largest are left out")
    for harmonic in found:
        if float(harmonic.order) in small:
            continue
        order = float(harmonic.order)
        if order in stated_orders:
            continue
        force = tuple(complex(v) * omega2 for v in harmonic.force)
        moment = tuple(complex(v) * omega2 for v in harmonic.moment)
        word = names.get(order, f"order {order:g}")
        out.append(HarmonicLoad(
            name=f"crank {word} ({n} cylinders, {crank.arrangement})", source="crank",
            force=force, moment=moment, point=centre, reference_speed=top, exponent=2.0,
            key_path=("machine", "crank"), order=order, assumptions=tuple(assumptions)))
    return out


def _arm(crank) -> float:
    """A length that makes a free moment comparable with a force [m]."""
    spacing = crank.cylinder_spacing.value if crank.cylinder_spacing is not None else 0.0
    return max(spacing, crank.stroke.value)


def _a(n: int) -> str:
    return "an" if n in (8, 11, 18) else "a"


def _torque_loads(design, torque):
    from .dynamics.forcing import drive_loads

    machine = design.machine
    top = machine.speed.max.value
    assumptions = []
    if torque.mean_torque is not None:
        mean = torque.mean_torque.high
        how = f"mean torque {torque.mean_torque.text} as stated"
    else:
        mean = float(drive_loads.mean_torque(machine.power.high, top))
        how = (f"mean torque {mean:.4g} N*m from {machine.power.text} at "
               f"{top * 60:.0f} rpm, taken as constant over the speed range")
    assumptions.append(how)
    order = torque.order
    if order is None:
        order = float(drive_loads.firing_orders(machine.cylinders, machine.strokes or 2)[0])
        assumptions.append(f"torque fluctuation at the major firing order {order:g} "
                           "(cylinders / 2 for four-stroke, cylinders for two-stroke; common "
                           "practice)")
    ratio = torque.fluctuation
    if ratio is None:
        ratio = float(drive_loads.firing_torque_fluctuation(machine.cylinders,
                                                            machine.strokes or 2))
        assumptions.append(f"torque fluctuation {ratio:g} times the mean, a screening default "
                           f"for {machine.cylinders} cylinders (from memory): the maker's "
                           "torque harmonics govern")
    static = StaticLoad(
        name="torque reaction, mean", source="torque reaction",
        force=(0.0, 0.0, 0.0), moment=(-mean, 0.0, 0.0), point=_cg(design),
        key_path=("machine", "torque"), assumptions=tuple(assumptions))
    amplitude = ratio * mean
    if amplitude == 0:
        return static, None
    harmonic = HarmonicLoad(
        name=f"torque reaction at order {order:g}", source="torque reaction",
        force=_ZERO, moment=(complex(amplitude), 0j, 0j), point=_cg(design),
        reference_speed=top, exponent=0.0, key_path=("machine", "torque"), order=order,
        assumptions=tuple(assumptions) + (
            "the torque fluctuation acts on the frame as a moment about the shaft (x), of "
            "the same amplitude over the speed range",))
    return static, harmonic


def _belt_pull(design, belt) -> StaticLoad:
    from .dynamics.forcing import drive_loads

    machine = design.machine
    top = machine.speed.max.value
    kind = belt.kind or "v-belt"
    assumptions = []
    if belt.kind is None:
        assumptions.append("belt kind not given: a V-belt is assumed for the tension ratio")
    pull = float(drive_loads.belt_effective_pull(machine.power.high, belt.pulley_diameter.value,
                                                 top))
    ratio = float(drive_loads.belt_tension_ratio(kind))
    load = float(drive_loads.belt_shaft_load(pull, ratio))
    direction = belt.pull_direction.as_tuple() if belt.pull_direction is not None else (
        0.0, 1.0, 0.0)
    length = math.sqrt(sum(c * c for c in direction))
    unit = tuple(c / length for c in direction)
    if belt.pull_direction is None:
        assumptions.append("belt pull across the shaft, along +y (belt.pull-direction not "
                           "given)")
    assumptions.append(f"belt pull: effective pull {pull:.4g} N from {machine.power.text} at "
                       f"{top * 60:.0f} rpm on a {belt.pulley_diameter.text} pulley, tension "
                       f"ratio {ratio:g} for a {kind} (from memory), shaft load "
                       f"{load:.4g} N")
    return StaticLoad(
        name=f"belt pull ({kind})", source="belt pull",
        force=tuple(load * c for c in unit), moment=(0.0, 0.0, 0.0),
        point=_point(belt.position, design), key_path=("machine", "belt"),
        assumptions=tuple(assumptions))


def _stated_load(design, index, stated) -> HarmonicLoad:
    machine = design.machine
    force = stated.force.as_tuple() if stated.force is not None else (0.0, 0.0, 0.0)
    moment = stated.moment.as_tuple() if stated.moment is not None else (0.0, 0.0, 0.0)
    reference = stated.at_speed.value if stated.at_speed is not None else machine.speed.max.value
    exponent = 2.0 if stated.follows_speed_squared else 0.0
    assumptions = ["stated load: its components along x, y and z are taken in phase (the "
                   "cautious reading where no phase is given)"]
    if exponent:
        assumptions.append(f"the stated amplitudes hold at {reference * 60:.0f} rpm and grow "
                           "with the square of speed")
    frequency = None
    if stated.frequency is not None:
        frequency = (stated.frequency.low, stated.frequency.high)
    return HarmonicLoad(
        name=stated.name, source="stated", force=tuple(complex(v) for v in force),
        moment=tuple(complex(v) for v in moment), point=_point(stated.point, design),
        reference_speed=reference, exponent=exponent, key_path=("machine", "load", index),
        order=stated.order, frequency=frequency, assumptions=tuple(assumptions))


def _far_points(design, harmonic, static) -> list[tuple[tuple, str]]:
    """Points of action further from the machine than its own size."""
    mounting = design.mounting
    if mounting is None:
        return []
    cg = _cg(design)
    if mounting.envelope is not None:
        box = mounting.envelope
        half = (box.x.value / 2, box.y.value / 2, box.z.value / 2)
        low = tuple(c - h for c, h in zip(cg, half))
        high = tuple(c + h for c, h in zip(cg, half))
    elif mounting.mount:
        points = [m.position.as_tuple() for m in mounting.mount] + [cg]
        low = tuple(min(p[i] for p in points) for i in range(3))
        high = tuple(max(p[i] for p in points) for i in range(3))
    else:
        return []
    size = max(h - lo for h, lo in zip(high, low))
    if not size > 0:
        return []
    out = []
    for load in list(harmonic) + list(static):
        outside = max(max(lo - p, p - h, 0.0) for p, lo, h in zip(load.point, low, high))
        if outside > size:
            where = ", ".join(f"{c:.3g}" for c in load.point)
            out.append((load.key_path, (
                f"{load.name} acts at ({where}) m, {outside:.3g} m outside the machine "
                f"(its size is about {size:.3g} m): check the point of action")))
    return out

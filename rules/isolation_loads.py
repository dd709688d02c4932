"""What the isolators pass on of the machine's loads: mount forces over the speed range.

The isolation rule judges two kinds of forcing:

- every forcing band of the machine, by the worst-mount force transmissibility of load
  shapes applied at the centre of gravity (unit forces across the shaft and vertically,
  and a unit moment about the shaft for firing and compression bands, whose torque
  pulsates): a band that puts a rigid-body mode into resonance is seen whichever motion
  the mode is;
- every load the machine is known to generate (:mod:`vcheck.machine_loads`), at its point
  of action with its real force and moment vectors and its growth with speed: the force
  at every mount, the total into the structure, and the same load shared by the mounts
  without dynamic amplification (rigid mounting) for comparison.

With every mount given the six-DOF model is used
(:func:`vcheck.dynamics.isolation.forced_response.mount_force_peaks`), its peak over each
band found by a seeded search, never on a fixed grid. Without mounts the one-degree-of-
freedom closed form is used with the load along the bounce axis only, and moments are
named as not judged.
"""

from __future__ import annotations

import math

from vcheck.records import Record

__all__ = ["LoadResult", "band_transmissibility_six_dof", "load_results", "shapes_for_band"]

TORQUE_PULSE_KINDS = ("firing", "compression")
"""Forcing bands whose source also pulsates the torque: a moment about the shaft."""

_ACROSS = (0.0, 1.0, 0.0, 0.0, 0.0, 0.0)
_VERTICAL = (0.0, 0.0, 1.0, 0.0, 0.0, 0.0)
_ROLL = (0.0, 0.0, 0.0, 1.0, 0.0, 0.0)


def shapes_for_band(band) -> tuple[tuple[str, tuple], ...]:
    """Unit load shapes at the centre of gravity judged for a forcing band."""
    shapes = (("a force across the shaft", _ACROSS), ("a vertical force", _VERTICAL))
    if band.kind in TORQUE_PULSE_KINDS:
        shapes += (("a moment about the shaft", _ROLL),)
    return shapes


def _solved(model, damping):
    """The modal model of a six-DOF model at a damping, solved once per model."""
    solved = model.solved
    if solved is None or solved[0] != damping:
        from vcheck.dynamics.isolation.forced_response import MountForceModel

        solved = (damping, MountForceModel(
            model.mass_matrix, model.positions, model.stiffnesses,
            centre_of_gravity=model.centre_of_gravity, orientations=model.orientations,
            support_stiffnesses=model.supports, damping_ratio=damping))
        model.solved = solved
    return solved[1]


def _peaks(model, load, low, high, damping, exponent=0.0, reference=None):
    """Mount force peaks over [low, high] Hz; the modal model is solved once per model."""
    return _solved(model, damping).peaks(load, (low, high), amplitude_exponent=exponent,
                                         reference_frequency=reference)


def band_transmissibility_six_dof(inst, band, stiffening: float = 1.0) -> tuple[float, str]:
    """Worst-mount force transmissibility over a band, and the load shape that gives it.

    Stiffer isolators by a factor c scale every natural frequency by sqrt(c), so the
    response with c K at f is the response with K at f / sqrt(c).
    """
    scale = math.sqrt(stiffening)
    worst, words = 0.0, ""
    damping = inst.damping.modal_damping_ratio
    for model in inst.models():
        for name, shape in shapes_for_band(band):
            ratio = _solved(model, damping).transmissibility(
                shape, (band.low / scale, band.high / scale))
            if ratio > worst:
                worst, words = ratio, name
    return worst, words


class LoadResult(Record, frozen=False):
    """One machine load through the isolators."""

    load: object  # vcheck.machine_loads.HarmonicLoad
    low: float  # forcing band [Hz]
    high: float
    transmissibility: float  # worst-mount force over the same load shared statically
    mount_force: float  # largest force at any one mount over the band [N]
    mount: int | None  # which mount (0-based), None for the one-DOF model
    frequency: float  # where the largest mount force is [Hz]
    rigid_force: float  # the worst mount's share with rigid mounting, at full amplitude [N]
    total_force: float  # largest force into the structure in all [N]
    unjudged: str = ""  # what the model could not take (moments in the one-DOF model)
    judged: bool = True  # False for a pure moment in the one-DOF model
    rigid_peak: float = math.nan  # largest worst-mount share with rigid mounting over the band [N]
    mount_peaks: tuple = ()  # largest force at each mount over the band [N], six-DOF model
    # largest amplitude of each force component (machine axes x, y, z) at each mount over
    # the band [N], ((x, y, z) per mount), six-DOF model
    mount_peak_components: tuple = ()
    rigid_mounts: tuple = ()  # each mount's force with rigid mounting, the band's largest [N]
    rigid_mount_components: tuple = ()  # and its components, ((x, y, z) per mount) [N]

    @property
    def efficiency(self) -> float:
        return 1.0 - self.transmissibility

    @property
    def force_efficiency(self) -> float:
        """1 - (largest force passed over the band) / (largest force rigid mounting would
        pass over the band) [unitless]: where the force is transmitted. For a load of fixed
        amplitude this is the efficiency at the worst frequency; for one that grows with
        speed (unbalance, inertia forces) the little force passed at a low speed does not
        govern."""
        if self.load.exponent == 0 or not math.isfinite(self.mount_force):
            return self.efficiency
        if not self.rigid_peak > 0:  # pragma: no cover - a load of no force is not judged
            return self.efficiency
        return 1.0 - self.mount_force / self.rigid_peak


def load_results(inst, loads, speed, stiffening: float = 1.0) -> list[LoadResult]:
    """Each harmonic machine load through the isolators, worst case within tolerances."""
    if loads is None:
        return []
    out = []
    for load in loads.harmonic:
        low, high = load.band(speed)
        if inst.six_dof:
            out.append(_six_dof_load(inst, load, low, high, stiffening))
        else:
            out.append(_one_dof_load(inst, load, low, high, speed, stiffening))
    return out


def _reference_frequency(load) -> float:
    if load.order is not None:
        return load.order * load.reference_speed
    return load.frequency[1]


def _six_dof_load(inst, load, low, high, stiffening) -> LoadResult:
    import numpy as np

    scale = math.sqrt(stiffening)
    reference = _reference_frequency(load)
    exponent = load.exponent
    worst = None
    for model in inst.models():
        vector = np.array(load.about(model.centre_of_gravity), dtype=complex)
        # with stiffening, frequencies shift by sqrt(c) but the load's amplitude follows
        # the true forcing frequency: the reference moves with the band
        found = _peaks(model, vector, low / scale, high / scale,
                       inst.damping.modal_damping_ratio, exponent, reference / scale)
        if worst is None or _key(found) > _key(worst):
            worst = found
    found = worst
    if found.unbounded:
        return LoadResult(load, low, high, math.inf, math.inf, None, math.nan, math.nan,
                          math.inf)
    mount = int(np.argmax(found.mount_peak))
    frequency = float(found.mount_peak_frequency[mount]) * scale
    at = load.scale_at(frequency / load.order) if load.order is not None else 1.0
    rigid = float(np.max(found.static_mount)) * at
    top = load.scale_at(high / load.order) if load.order is not None else 1.0

    def rows(array) -> tuple:
        return tuple(map(tuple, np.asarray(array).tolist()))  # plain floats, as float(v)

    return LoadResult(load, low, high, float(found.worst_ratio), float(found.mount_peak[mount]),
                      mount, frequency, rigid, float(found.total_peak),
                      rigid_peak=float(np.max(found.static_mount)) * top,
                      mount_peaks=tuple(np.ravel(found.mount_peak).tolist()),
                      mount_peak_components=rows(found.mount_peak_components),
                      rigid_mounts=tuple(float(v) * top for v in np.ravel(found.static_mount)),
                      rigid_mount_components=rows(found.static_mount_components * top))


def _key(found) -> float:
    return math.inf if found.unbounded else float(found.worst_ratio)


def _one_dof_load(inst, load, low, high, speed, stiffening) -> LoadResult:
    from vcheck.dynamics.roots import maximum_on_interval

    from .isolation import worst_transmissibility

    scale = math.sqrt(stiffening)
    fn_low, fn_high = inst.fn_low * scale, inst.fn_high * scale
    force = load.force_amplitude
    ratio, _ = worst_transmissibility(low / fn_high, high / fn_low, inst.damping)

    def transmitted(frequency: float) -> float:
        t, _ = worst_transmissibility(frequency / fn_high, frequency / fn_low, inst.damping)
        amplitude = load.scale_at(frequency / load.order) if load.order is not None else 1.0
        return force * amplitude * t

    seeds = tuple(inst.damping.peak()[0] * fn for fn in (fn_low, inst.fn * scale, fn_high))
    peak, where = maximum_on_interval(transmitted, low, high, seeds=seeds)
    full = load.scale_at(high / load.order) if load.order is not None else 1.0
    at = load.scale_at(where / load.order) if load.order is not None else 1.0
    unjudged = ""
    if load.moment_amplitude > 0:
        unjudged = (f"its moment of {load.moment_amplitude * (full if load.exponent else 1.0):.3g}"
                    " N*m")
    return LoadResult(load, low, high, float(ratio), float(peak), None, float(where),
                      force * at, float(peak), unjudged, judged=force > 0,
                      rigid_peak=force * full)

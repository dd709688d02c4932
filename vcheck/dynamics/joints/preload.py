"""Preload, joint resilience, slip and fatigue of a single bolted joint.

The relations follow VDI 2230 Part 1:2015 (systematic calculation of highly stressed
bolted joints, joints with one cylindrical bolt) for a concentrically clamped and loaded
joint, and the short nut-factor form of Budynas and Nisbett (Shigley). All inputs and
outputs are SI: newtons, metres, newton metres, pascals, metres per newton.

Which preload does a torque give?
---------------------------------
A tightening torque does not fix the preload: friction scatters. Two conventions are in
use and both are offered here, each named for what it returns:

* VDI 2230 (step R13, from memory) sets the torque from the permissible preload with the
  *lowest* expected friction, so the preload computed from a torque with the lower-bound
  friction coefficients is the **largest** assembly preload F_Mmax. The smallest is
  F_Mmin = F_Mmax / alpha_A, with the tightening factor alpha_A of the tightening method
  (:data:`TIGHTENING_FACTORS_VDI_2230`). Use :func:`preload_from_torque_vdi2230` with
  the lower-bound friction and then :func:`preload_bounds_from_max`.
* The nut factor K of T = K F d is a **mean** found from torque-tension tests
  (Budynas-Nisbett, ch. 8), so T / (K d) is the mean preload F_Mm. With the same scatter
  convention alpha_A = F_Mmax / F_Mmin the bounds about that mean are
  F_Mmin = 2 F_Mm / (1 + alpha_A) and F_Mmax = alpha_A F_Mmin
  (:func:`preload_bounds_from_mean`).

For a slip check the smaller bound F_Mmin is what counts; for the bolt's strength the
larger.

Friction coefficients
---------------------
Any coefficient <= 0 or >= 1 is impossible for a lubricated or dry steel joint and
raises ValueError. Between those, :func:`friction_plausible` says whether the value lies
in :data:`FRICTION_PLAUSIBLE_RANGE` (0.04 to 0.5), for a rule to warn on.

VDI 2230 step numbers (R0 ... R13) and the tables marked "from memory" were not read
from the guideline during this work; see each docstring.
"""

from __future__ import annotations

import math

import numpy as np
from numpy.typing import ArrayLike

ISO_FLANK_ANGLE = math.radians(60.0)
"""Flank angle of ISO metric and unified threads, 60 degrees (ISO 68-1; ASME B1.1) [rad]."""

__all__ = [
    "FRICTION_PLAUSIBLE_RANGE",
    "FRICTION_CLASSES_VDI_2230",
    "TIGHTENING_FACTORS_VDI_2230",
    "NUT_FACTORS_SHIGLEY",
    "ASSEMBLY_UTILISATION_VDI_2230",
    "EMBEDDING_AMOUNTS_VDI_2230",
    "BOLT_RESILIENCE_LENGTHS_VDI_2230",
    "REQUIRED_SLIP_SAFETY_VDI_2230",
    "REQUIRED_FATIGUE_SAFETY_VDI_2230",
    "friction_plausible",
    "tightening_factor",
    "tightening_factor_from_scatter",
    "preload_bounds_from_max",
    "preload_bounds_from_mean",
    "head_friction_diameter",
    "thread_torque_vdi2230",
    "tightening_torque_vdi2230",
    "preload_from_torque_vdi2230",
    "tightening_torque_helix",
    "tightening_torque_nut_factor",
    "preload_from_torque_nut_factor",
    "assembly_stress_vdi2230",
    "permissible_assembly_preload_vdi2230",
    "bolt_resilience_vdi2230",
    "cone_angle_tangent_vdi2230",
    "clamped_part_resilience_vdi2230",
    "clamped_part_resilience_cylinder",
    "load_factor",
    "embedding_amount_vdi2230",
    "preload_loss_embedding",
    "bolt_additional_force",
    "residual_clamp_load",
    "slip_safety",
    "endurance_limit_rolled_before_heat_treatment",
    "endurance_limit_rolled_after_heat_treatment",
    "bolt_force_amplitude",
    "bolt_stress_amplitude",
    "fatigue_safety",
]

# --------------------------------------------------------------------------- tables

FRICTION_PLAUSIBLE_RANGE: tuple[float, float] = (0.04, 0.5)
"""Coefficients of friction (thread, head, interface) a design may carry without a
warning [unitless]: from the low end of VDI 2230 friction class A (0.04, from memory) to
0.5, a round upper figure for dry, unlubricated stainless or galvanised parts (common
practice)."""

FRICTION_CLASSES_VDI_2230: dict[str, tuple[float, float | None]] = {
    "A": (0.04, 0.10),
    "B": (0.08, 0.16),
    "C": (0.14, 0.24),
    "D": (0.20, 0.35),
    "E": (0.30, None),
}
"""Friction classes of VDI 2230 Part 1:2015 Table A5, ranges of mu_G and mu_K
[unitless]; class E has no upper bound (from memory)."""

TIGHTENING_FACTORS_VDI_2230: dict[str, tuple[float, float, str]] = {
    "ultrasonic-elongation": (1.05, 1.2, "elongation-controlled with ultrasound"),
    "mechanical-elongation": (1.1, 1.5, "elongation measured mechanically"),
    "hydraulic-tensioning": (1.2, 1.6, "hydraulic tensioning, no torsion"),
    "yield-controlled": (1.0, 1.0, "yield-point-controlled tightening"),
    "angle-controlled": (1.0, 1.0, "angle-of-turn-controlled tightening"),
    "torque-wrench-measured-friction": (
        1.4, 1.6,
        "torque wrench or precision nutrunner, torque set by tests on the original parts",
    ),
    "torque-wrench-estimated-friction": (
        1.6, 2.5, "torque wrench or nutrunner, friction coefficient estimated",
    ),
    "impact-wrench": (2.5, 4.0, "impact or impulse wrench, adjusted by retightening"),
}
"""Tightening factor alpha_A = F_Mmax / F_Mmin by tightening method, (low, high,
description) [unitless], VDI 2230 Part 1:2015 Table A8 (from memory; a supplier's
reproduction of the 1986 edition gives matching preload scatters, e.g. +-5 to +-12 %
for yield- and angle-controlled tightening and +-17 to +-23 % for a torque wrench). With
yield- or angle-controlled tightening the scatter is that of the bolt's yield point and
the bolt is sized for F_Mmin, hence 1.0."""

NUT_FACTORS_SHIGLEY: dict[str, float] = {
    "unspecified": 0.20,
    "non-plated-black": 0.30,
    "zinc-plated": 0.20,
    "lubricated": 0.18,
    "cadmium-plated": 0.16,
}
"""Nut factor K of T = K F d by bolt condition [unitless] (Budynas and Nisbett,
Shigley's Mechanical Engineering Design, 10th ed., Table 8-15, and K = 0.2 "when the
bolt condition is not stated", section 8-8) (from memory)."""

ASSEMBLY_UTILISATION_VDI_2230: float = 0.9
"""Utilisation nu of the minimum yield strength by the von Mises assembly stress that
VDI 2230 Part 1:2015 uses for its permissible preload tables (Table A1) [unitless]; the
same 90 % is stated by a supplier's reproduction of those tables."""

EMBEDDING_AMOUNTS_VDI_2230: dict[tuple[float, str], tuple[float, float, float]] = {
    (10e-6, "axial"): (3e-6, 2.5e-6, 1.5e-6),
    (10e-6, "transverse"): (3e-6, 3e-6, 2e-6),
    (40e-6, "axial"): (3e-6, 3e-6, 2e-6),
    (40e-6, "transverse"): (3e-6, 4.5e-6, 2.5e-6),
    (160e-6, "axial"): (3e-6, 4e-6, 3e-6),
    (160e-6, "transverse"): (3e-6, 6.5e-6, 3.5e-6),
}
"""Guide values for embedding of solid steel parts, VDI 2230 Part 1:2015 Table 5:
key (upper bound of the averaged surface roughness Rz [m], load direction); value
(in the thread, per head or nut bearing face, per inner interface) [m]. Rz classes are
Rz < 10 um, 10 um <= Rz < 40 um, 40 um <= Rz < 160 um (from memory)."""

BOLT_RESILIENCE_LENGTHS_VDI_2230: dict[str, float] = {
    "hex-head": 0.5,
    "socket-head": 0.4,
    "engaged-thread": 0.5,
    "nut": 0.4,
    "tapped-hole": 0.33,
}
"""Substitute deformation lengths as multiples of the nominal diameter d, VDI 2230
Part 1:2015 section 5.1.1 [unitless]: head l_SK (hexagon 0.5 d, socket head 0.4 d),
engaged thread l_G = 0.5 d, nut l_M = 0.4 d or tapped hole l_M = 0.33 d (from memory)."""

REQUIRED_SLIP_SAFETY_VDI_2230: dict[str, float] = {"static": 1.2, "alternating": 1.8}
"""Minimum safety against slipping S_G of VDI 2230 Part 1:2015 step R12 [unitless]: 1.2
for static transverse load, 1.8 for alternating transverse load (from memory)."""

REQUIRED_FATIGUE_SAFETY_VDI_2230: float = 1.2
"""Minimum safety against fatigue failure S_D = sigma_AS / sigma_a of VDI 2230 Part
1:2015 step R9 [unitless] (from memory)."""

# ------------------------------------------------------------------------ checks


def _arr(value: ArrayLike) -> np.ndarray:
    return np.asarray(value, dtype=float)


def _first(arr: np.ndarray, mask: np.ndarray) -> str:
    return f"{np.atleast_1d(arr)[np.atleast_1d(mask)][0]:g}"


def _unit(unit: str) -> str:
    return f" {unit}" if unit else ""


def _positive(value: ArrayLike, name: str, unit: str) -> np.ndarray:
    arr = _arr(value)
    if arr.ndim == 0 and 0.0 < float(arr) < math.inf:  # a good scalar: no array checks
        return arr
    bad = ~np.isfinite(arr)
    if np.any(bad):
        raise ValueError(f"{name} must be finite, got {_first(arr, bad)}{_unit(unit)}")
    bad = arr <= 0
    if np.any(bad):
        raise ValueError(f"{name} must be positive, got {_first(arr, bad)}{_unit(unit)}")
    return arr


def _nonnegative(value: ArrayLike, name: str, unit: str) -> np.ndarray:
    arr = _arr(value)
    if arr.ndim == 0 and 0.0 <= float(arr) < math.inf:  # a good scalar: no array checks
        return arr
    bad = ~np.isfinite(arr)
    if np.any(bad):
        raise ValueError(f"{name} must be finite, got {_first(arr, bad)}{_unit(unit)}")
    bad = arr < 0
    if np.any(bad):
        raise ValueError(
            f"{name} must be zero or positive, got {_first(arr, bad)}{_unit(unit)}"
        )
    return arr


def _finite(value: ArrayLike, name: str, unit: str) -> np.ndarray:
    arr = _arr(value)
    if arr.ndim == 0 and math.isfinite(float(arr)):  # a good scalar: no array checks
        return arr
    bad = ~np.isfinite(arr)
    if np.any(bad):
        raise ValueError(f"{name} must be finite, got {_first(arr, bad)}{_unit(unit)}")
    return arr


def _friction(value: ArrayLike, name: str) -> np.ndarray:
    arr = _arr(value)
    if arr.ndim == 0 and 0.0 < float(arr) < 1.0:  # a good scalar: no array checks
        return arr
    bad = ~np.isfinite(arr) | (arr <= 0) | (arr >= 1)
    if np.any(bad):
        raise ValueError(
            f"{name} must be greater than 0 and less than 1, got {_first(arr, bad)}"
        )
    return arr


def _count(value, name: str, minimum: int = 1) -> np.ndarray:
    arr = np.asarray(value)
    flat = np.atleast_1d(arr).ravel()
    for v in flat.tolist():
        ok = isinstance(v, int) or (isinstance(v, float) and math.isfinite(v) and v.is_integer())
        if isinstance(v, bool) or not ok or v < minimum:
            raise ValueError(f"{name} must be a whole number of at least {minimum}, got {v!r}")
    return arr.astype(float)


# Fast paths: the fastener screening calls these functions with plain floats, thousands of
# times a large run. Where every input is a float inside the range its check allows, the
# same operations in the same order are done on floats (IEEE arithmetic, bit for bit what
# numpy gives on 0-d arrays) and a float is returned; anything else takes the array path,
# which raises the checks' messages. tests/dynamics/test_scalar_paths.py holds both equal.

def _floats(*values) -> bool:
    """Whether every value is a plain float (not an int, a bool or a numpy scalar)."""
    for value in values:
        if type(value) is not float:
            return False
    return True


def _positive_float(x: float) -> bool:
    return 0.0 < x < math.inf


def _nonnegative_float(x: float) -> bool:
    return 0.0 <= x < math.inf


def _whole(value) -> bool:
    """A plain int of at least 1 that a float holds exactly, as _count accepts it."""
    return type(value) is int and 1 <= value < 2**53


# ------------------------------------------------------------------ friction


def friction_plausible(friction: ArrayLike):
    """Whether a coefficient of friction lies in the plausible band.

    Parameters
    ----------
    friction : array_like
        Coefficient of friction (thread, head or interface) [unitless].

    Returns
    -------
    bool or numpy.ndarray of bool
        True where FRICTION_PLAUSIBLE_RANGE[0] <= friction <= FRICTION_PLAUSIBLE_RANGE[1]
        [unitless]. NaN gives False.

    Notes
    -----
    This is advice for a rule's warning, not a validity check: a value outside the band
    is possible but should be justified by the design.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, Table A5, friction classes (from memory).

    Examples
    --------
    >>> bool(friction_plausible(0.12)), bool(friction_plausible(0.6))
    (True, False)
    """
    lo, hi = FRICTION_PLAUSIBLE_RANGE
    if type(friction) is float:  # fast path (see _floats); NaN gives False here too
        return lo <= friction <= hi
    mu = _arr(friction)
    out = (mu >= lo) & (mu <= hi)
    return bool(out) if out.ndim == 0 else out


# -------------------------------------------------------- tightening factor


def tightening_factor(method: str, bound: str = "high") -> float:
    """Tightening factor alpha_A of a tightening method.

    Parameters
    ----------
    method : str
        A key of :data:`TIGHTENING_FACTORS_VDI_2230` [unitless].
    bound : {"high", "low"}
        Which end of the published range; the high end is the cautious one for a slip
        check [unitless].

    Returns
    -------
    float
        alpha_A = F_Mmax / F_Mmin [unitless].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, Table A8 (from memory).

    Examples
    --------
    >>> tightening_factor("torque-wrench-measured-friction")
    1.6
    """
    if method not in TIGHTENING_FACTORS_VDI_2230:
        valid = ", ".join(TIGHTENING_FACTORS_VDI_2230)
        raise ValueError(f"unknown tightening method {method!r}: valid methods are {valid}")
    low, high, _ = TIGHTENING_FACTORS_VDI_2230[method]
    if bound == "high":
        return high
    if bound == "low":
        return low
    raise ValueError(f"unknown bound {bound!r}: valid bounds are high, low")


def tightening_factor_from_scatter(scatter: ArrayLike):
    """Tightening factor from a symmetric preload scatter +-D about the mean.

    Parameters
    ----------
    scatter : array_like
        Half-width of the preload scatter as a fraction of the mean, 0 <= D < 1
        [unitless].

    Returns
    -------
    numpy.ndarray or float
        alpha_A = (1 + D) / (1 - D) [unitless].

    Notes
    -----
    With F_Mmax = F_Mm (1 + D) and F_Mmin = F_Mm (1 - D), alpha_A = F_Mmax / F_Mmin.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 5.4.3 and Table A8 (from memory).

    Examples
    --------
    >>> round(float(tightening_factor_from_scatter(0.2)), 4)
    1.5
    """
    d = _nonnegative(scatter, "preload scatter", "")
    bad = d >= 1
    if np.any(bad):
        raise ValueError(f"preload scatter must be less than 1, got {_first(d, bad)}")
    return (1 + d) / (1 - d)


def preload_bounds_from_max(preload_max: ArrayLike, alpha: ArrayLike):
    """Smallest and largest assembly preload from the largest one (VDI 2230).

    Parameters
    ----------
    preload_max : array_like
        Largest assembly preload F_Mmax, e.g. from the torque with the lowest friction
        [N].
    alpha : array_like
        Tightening factor alpha_A >= 1 [unitless].

    Returns
    -------
    preload_min, preload_max : numpy.ndarray or float
        F_Mmin = F_Mmax / alpha_A and F_Mmax [N].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, steps R1 and R5 (from memory).
    """
    fmax = _positive(preload_max, "maximum preload", "N")
    a = _alpha(alpha)
    return fmax / a, fmax * np.ones_like(a)


def preload_bounds_from_mean(preload_mean: ArrayLike, alpha: ArrayLike):
    """Smallest and largest assembly preload about a mean preload.

    Parameters
    ----------
    preload_mean : array_like
        Mean assembly preload F_Mm, e.g. from a mean nut factor [N].
    alpha : array_like
        Tightening factor alpha_A = F_Mmax / F_Mmin >= 1 [unitless].

    Returns
    -------
    preload_min, preload_max : numpy.ndarray or float
        F_Mmin = 2 F_Mm / (1 + alpha_A), F_Mmax = alpha_A F_Mmin [N].

    Notes
    -----
    A symmetric scatter about the mean, (F_Mmax + F_Mmin)/2 = F_Mm.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 5.4.3 (alpha_A definition) (from memory).
    """
    fm = _positive(preload_mean, "mean preload", "N")
    a = _alpha(alpha)
    fmin = 2 * fm / (1 + a)
    return fmin, a * fmin


def _alpha(alpha: ArrayLike) -> np.ndarray:
    a = _finite(alpha, "tightening factor", "")
    bad = a < 1
    if np.any(bad):
        raise ValueError(f"tightening factor must be at least 1, got {_first(a, bad)}")
    return a


# ------------------------------------------------------------ torque / preload


def head_friction_diameter(bearing_diameter: ArrayLike, hole_diameter: ArrayLike):
    """Mean friction diameter under the head or nut, D_Km = (d_W + D_h)/2.

    Parameters
    ----------
    bearing_diameter : array_like
        Outside diameter of the bearing face d_W [m].
    hole_diameter : array_like
        Clearance hole diameter D_h (inside diameter of the bearing ring) [m].

    Returns
    -------
    numpy.ndarray or float
        D_Km [m].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. for D_Km in section 5.4.2 (from memory).
    """
    dw = _positive(bearing_diameter, "bearing diameter", "m")
    dh = _positive(hole_diameter, "hole diameter", "m")
    bad = dh >= dw
    if np.any(bad):
        raise ValueError(
            f"hole diameter must be smaller than the bearing diameter, got "
            f"{_first(np.broadcast_to(dh, bad.shape), bad)} m"
        )
    return 0.5 * (dw + dh)


def thread_torque_vdi2230(
    preload: ArrayLike, pitch: ArrayLike, pitch_diameter: ArrayLike, friction_thread: ArrayLike
):
    """Thread torque at assembly, M_G = F_M d2/2 (P/(pi d2) + 1.155 mu_G).

    Parameters
    ----------
    preload : array_like
        Assembly preload F_M [N].
    pitch : array_like
        Thread pitch P [m].
    pitch_diameter : array_like
        Pitch diameter d2 [m].
    friction_thread : array_like
        Thread friction coefficient mu_G, 0 < mu_G < 1 [unitless].

    Returns
    -------
    numpy.ndarray or float
        M_G [N m].

    Notes
    -----
    The exact form is M_G = F_M d2/2 tan(phi + rho') with tan(phi) = P/(pi d2) and
    tan(rho') = mu_G / cos(30 deg) = 1.155 mu_G; VDI 2230 replaces tan(phi + rho') by
    tan(phi) + tan(rho'), which is close for small angles.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 5.5.1, eq. (R7/3) form (from memory).
    """
    f = _nonnegative(preload, "preload", "N")
    p = _positive(pitch, "pitch", "m")
    d2 = _positive(pitch_diameter, "pitch diameter", "m")
    mu = _friction(friction_thread, "thread friction coefficient")
    return f * d2 / 2 * (p / (np.pi * d2) + 1.155 * mu)


def tightening_torque_vdi2230(
    preload: ArrayLike,
    pitch: ArrayLike,
    pitch_diameter: ArrayLike,
    head_friction_diameter: ArrayLike,
    friction_thread: ArrayLike,
    friction_head: ArrayLike,
):
    """Tightening torque for a preload, VDI 2230 form.

    Parameters
    ----------
    preload : array_like
        Assembly preload F_M [N].
    pitch : array_like
        Thread pitch P [m].
    pitch_diameter : array_like
        Pitch diameter d2 [m].
    head_friction_diameter : array_like
        Mean friction diameter under the head or nut D_Km [m]
        (see :func:`head_friction_diameter`).
    friction_thread : array_like
        Thread friction coefficient mu_G, 0 < mu_G < 1 [unitless].
    friction_head : array_like
        Head (or nut) bearing friction coefficient mu_K, 0 < mu_K < 1 [unitless].

    Returns
    -------
    numpy.ndarray or float
        Tightening torque M_A [N m].

    Notes
    -----
    M_A = F_M (0.16 P + 0.58 d2 mu_G + D_Km/2 mu_K): pitch term, thread friction and
    head friction. 0.16 = 1/(2 pi) and 0.58 = 1.155/2 rounded.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. (R13/1) (from memory; checked in the tests against
       a supplier's reproduction of the guideline's torque table for fine threads).

    Examples
    --------
    >>> round(float(tightening_torque_vdi2230(48.04e3, 1.25e-3, 11.188e-3, 15.065e-3,
    ...                                       0.12, 0.12)), 1)
    90.4
    """
    f = _nonnegative(preload, "preload", "N")
    return f * _torque_per_preload(
        pitch, pitch_diameter, head_friction_diameter, friction_thread, friction_head
    )


def _torque_per_preload(pitch, pitch_diameter, head_diameter, friction_thread, friction_head):
    if (_floats(pitch, pitch_diameter, head_diameter, friction_thread, friction_head)
            and _positive_float(pitch) and _positive_float(pitch_diameter)
            and _positive_float(head_diameter) and 0.0 < friction_thread < 1.0
            and 0.0 < friction_head < 1.0):  # fast path (see _floats)
        return (0.16 * pitch + 0.58 * pitch_diameter * friction_thread
                + head_diameter / 2 * friction_head)
    p = _positive(pitch, "pitch", "m")
    d2 = _positive(pitch_diameter, "pitch diameter", "m")
    dkm = _positive(head_diameter, "head friction diameter", "m")
    mu_g = _friction(friction_thread, "thread friction coefficient")
    mu_k = _friction(friction_head, "head friction coefficient")
    return 0.16 * p + 0.58 * d2 * mu_g + dkm / 2 * mu_k


def preload_from_torque_vdi2230(
    torque: ArrayLike,
    pitch: ArrayLike,
    pitch_diameter: ArrayLike,
    head_friction_diameter: ArrayLike,
    friction_thread: ArrayLike,
    friction_head: ArrayLike,
):
    """Assembly preload from a tightening torque, VDI 2230 form.

    Parameters
    ----------
    torque : array_like
        Tightening torque M_A [N m].
    pitch : array_like
        Thread pitch P [m].
    pitch_diameter : array_like
        Pitch diameter d2 [m].
    head_friction_diameter : array_like
        Mean friction diameter under the head or nut D_Km [m].
    friction_thread : array_like
        Thread friction coefficient mu_G, 0 < mu_G < 1 [unitless].
    friction_head : array_like
        Head bearing friction coefficient mu_K, 0 < mu_K < 1 [unitless].

    Returns
    -------
    numpy.ndarray or float
        Preload F_M [N]. With the lower-bound friction coefficients this is F_Mmax
        (see the module notes); follow with :func:`preload_bounds_from_max`.

    Notes
    -----
    F_M = M_A / (0.16 P + 0.58 d2 mu_G + D_Km/2 mu_K), the inverse of
    :func:`tightening_torque_vdi2230`.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. (R13/1) (from memory).
    """
    if type(torque) is float and _nonnegative_float(torque):  # fast path (see _floats)
        return torque / _torque_per_preload(
            pitch, pitch_diameter, head_friction_diameter, friction_thread, friction_head
        )
    m = _nonnegative(torque, "tightening torque", "N m")
    return m / _torque_per_preload(
        pitch, pitch_diameter, head_friction_diameter, friction_thread, friction_head
    )


def tightening_torque_helix(
    preload: ArrayLike,
    pitch: ArrayLike,
    pitch_diameter: ArrayLike,
    head_friction_diameter: ArrayLike,
    friction_thread: ArrayLike,
    friction_head: ArrayLike,
    flank_angle: ArrayLike = ISO_FLANK_ANGLE,
):
    """Tightening torque from the inclined-plane model of the thread (exact form).

    Parameters
    ----------
    preload : array_like
        Assembly preload F_M [N].
    pitch : array_like
        Thread pitch P [m].
    pitch_diameter : array_like
        Pitch diameter d2 [m].
    head_friction_diameter : array_like
        Mean friction diameter under the head or nut D_Km [m].
    friction_thread : array_like
        Thread friction coefficient mu_G, 0 < mu_G < 1 [unitless].
    friction_head : array_like
        Head bearing friction coefficient mu_K, 0 < mu_K < 1 [unitless].
    flank_angle : array_like, optional
        Included thread angle beta; 60 degrees for ISO metric and unified threads (a
        property of the thread form, ISO 68-1 / ASME B1.1) [rad].

    Returns
    -------
    numpy.ndarray or float
        Tightening torque [N m].

    Notes
    -----
    M = F_M (d2/2 tan(phi + rho') + mu_K D_Km/2) with the lead angle
    phi = arctan(P / (pi d2)) and the flank-corrected friction angle
    rho' = arctan(mu_G / cos(beta/2)). This is the screw-as-wedge derivation of the
    textbooks and serves as an independent check on the linearised VDI form.

    References
    ----------
    .. [1] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., McGraw-Hill, 2015, section 8-2 (power screws, thread angle correction)
       (from memory).
    """
    f = _nonnegative(preload, "preload", "N")
    p = _positive(pitch, "pitch", "m")
    d2 = _positive(pitch_diameter, "pitch diameter", "m")
    dkm = _positive(head_friction_diameter, "head friction diameter", "m")
    mu_g = _friction(friction_thread, "thread friction coefficient")
    mu_k = _friction(friction_head, "head friction coefficient")
    beta = _positive(flank_angle, "flank angle", "rad")
    phi = np.arctan(p / (np.pi * d2))
    rho = np.arctan(mu_g / np.cos(beta / 2))
    return f * (d2 / 2 * np.tan(phi + rho) + mu_k * dkm / 2)


def tightening_torque_nut_factor(
    preload: ArrayLike, nominal_diameter: ArrayLike, nut_factor: ArrayLike
):
    """Tightening torque from the nut factor, T = K F d.

    Parameters
    ----------
    preload : array_like
        Preload F (a mean preload, see the module notes) [N].
    nominal_diameter : array_like
        Nominal bolt diameter d [m].
    nut_factor : array_like
        Nut (torque) factor K, see :data:`NUT_FACTORS_SHIGLEY` [unitless].

    Returns
    -------
    numpy.ndarray or float
        Torque T [N m].

    References
    ----------
    .. [1] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., 2015, eq. (8-27) (from memory).

    Examples
    --------
    >>> round(float(tightening_torque_nut_factor(36.675e3, 0.012, 0.2)), 1)
    88.0
    """
    f = _nonnegative(preload, "preload", "N")
    d = _positive(nominal_diameter, "nominal diameter", "m")
    k = _positive(nut_factor, "nut factor", "")
    return k * f * d


def preload_from_torque_nut_factor(
    torque: ArrayLike, nominal_diameter: ArrayLike, nut_factor: ArrayLike
):
    """Mean preload from a torque with the nut factor, F = T / (K d).

    Parameters
    ----------
    torque : array_like
        Tightening torque T [N m].
    nominal_diameter : array_like
        Nominal bolt diameter d [m].
    nut_factor : array_like
        Nut factor K [unitless].

    Returns
    -------
    numpy.ndarray or float
        Mean preload F_Mm [N]; follow with :func:`preload_bounds_from_mean`.

    References
    ----------
    .. [1] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., 2015, eq. (8-27) (from memory).
    """
    t = _nonnegative(torque, "tightening torque", "N m")
    d = _positive(nominal_diameter, "nominal diameter", "m")
    k = _positive(nut_factor, "nut factor", "")
    return t / (k * d)


# --------------------------------------------------------------- assembly stress


def assembly_stress_vdi2230(
    preload: ArrayLike,
    pitch: ArrayLike,
    pitch_diameter: ArrayLike,
    stress_diameter: ArrayLike,
    friction_thread: ArrayLike,
    torsion_factor: ArrayLike = 1.0,
    torsion_modulus: str = "plastic",
):
    """Von Mises equivalent stress in the bolt thread from tension and thread torsion.

    Parameters
    ----------
    preload : array_like
        Bolt force F_M [N].
    pitch : array_like
        Thread pitch P [m].
    pitch_diameter : array_like
        Pitch diameter d2 [m].
    stress_diameter : array_like
        Diameter of the stressed cross-section d_0; the stress diameter
        d_S = (d2 + d3)/2 for a bolt without reduced shank [m].
    friction_thread : array_like
        Thread friction coefficient mu_G, 0 < mu_G < 1 [unitless].
    torsion_factor : array_like, optional
        Share k_tau of the assembly torsion still present: 1 at assembly (step R7),
        0.5 in service (step R8, where part of the torsion relaxes) [unitless].
    torsion_modulus : {"plastic", "elastic"}
        Torsional section modulus of the thread core: ``"plastic"``,
        W_P = pi d_0^3 / 12 (fully plastic section), the one the guideline's permissible
        preload F_Mzul and its Table A1 imply; ``"elastic"``, W_P = pi d_0^3 / 16, the
        one of the service state (step R8) [unitless].

    Returns
    -------
    numpy.ndarray or float
        sigma_red = sqrt(sigma_M^2 + 3 (k_tau tau_M)^2) [Pa]. Divide by R_p0.2min for
        the utilisation nu.

    Notes
    -----
    sigma_M = F_M / A_0 with A_0 = pi d_0^2 / 4; tau_M = M_G / W_P with
    M_G = F_M d2/2 (P/(pi d2) + 1.155 mu_G). With the plastic modulus
    tau_M / sigma_M = 3/2 d2/d_0 (P/(pi d2) + 1.155 mu_G), the factor 3/2 of eq. (R7/3),
    so that the stress at :func:`permissible_assembly_preload_vdi2230` is exactly
    nu R_p0.2min; with the elastic modulus the factor is 2, about 7 % more equivalent
    stress for a standard thread at mu_G = 0.12. In the guideline's numbering the
    assembly state is step R7 and the service state with k_tau step R8 (from memory; the
    plastic modulus is inferred from the guideline's tabulated preloads, which the
    3/2 form reproduces to 0.35 %, see the tests).

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, steps R7 (assembly stress) and R8 (working stress)
       (from memory).
    """
    f = _nonnegative(preload, "preload", "N")
    d0 = _positive(stress_diameter, "stress diameter", "m")
    k = _nonnegative(torsion_factor, "torsion factor", "")
    if torsion_modulus == "plastic":
        w_p = np.pi / 12 * d0**3
    elif torsion_modulus == "elastic":
        w_p = np.pi / 16 * d0**3
    else:
        raise ValueError(
            f"unknown torsion modulus {torsion_modulus!r}: valid moduli are plastic, elastic"
        )
    mg = thread_torque_vdi2230(f, pitch, pitch_diameter, friction_thread)
    sigma = f / (np.pi / 4 * d0**2)
    tau = mg / w_p
    return np.sqrt(sigma**2 + 3 * (k * tau) ** 2)


def permissible_assembly_preload_vdi2230(
    pitch: ArrayLike,
    pitch_diameter: ArrayLike,
    stress_diameter: ArrayLike,
    yield_strength: ArrayLike,
    friction_thread: ArrayLike,
    utilisation: ArrayLike = ASSEMBLY_UTILISATION_VDI_2230,
):
    """Preload at which the assembly stress uses a given share of the yield strength.

    Parameters
    ----------
    pitch : array_like
        Thread pitch P [m].
    pitch_diameter : array_like
        Pitch diameter d2 [m].
    stress_diameter : array_like
        d_0 = d_S for a bolt without reduced shank [m].
    yield_strength : array_like
        Minimum yield or 0.2 % proof strength R_p0.2min [Pa].
    friction_thread : array_like
        Thread friction coefficient mu_G (use the lowest expected) [unitless].
    utilisation : array_like, optional
        nu = sigma_red / R_p0.2min; 0.9 in the guideline's tables [unitless].

    Returns
    -------
    numpy.ndarray or float
        F_Mzul [N].

    Notes
    -----
    F_Mzul = A_0 nu R_p0.2min / sqrt(1 + 3 (3/2 d2/d_0 (P/(pi d2) + 1.155 mu_G))^2),
    the preload at which :func:`assembly_stress_vdi2230` equals nu R_p0.2min.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. (R7/1) and Table A1 (from memory; checked in the
       tests against a supplier's reproduction of the fine-thread table).
    """
    p = _positive(pitch, "pitch", "m")
    d2 = _positive(pitch_diameter, "pitch diameter", "m")
    d0 = _positive(stress_diameter, "stress diameter", "m")
    rp = _positive(yield_strength, "yield strength", "Pa")
    mu = _friction(friction_thread, "thread friction coefficient")
    nu = _positive(utilisation, "utilisation", "")
    term = 1.5 * d2 / d0 * (p / (np.pi * d2) + 1.155 * mu)
    return np.pi / 4 * d0**2 * nu * rp / np.sqrt(1 + 3 * term**2)


# --------------------------------------------------------------- resilience


def bolt_resilience_vdi2230(
    clamp_length: ArrayLike,
    shank_length: ArrayLike,
    nominal_diameter: ArrayLike,
    minor_diameter: ArrayLike,
    elastic_modulus: ArrayLike,
    head: str = "hex-head",
    engagement: str = "nut",
    shank_diameter: ArrayLike | None = None,
    nut_elastic_modulus: ArrayLike | None = None,
):
    """Axial resilience (compliance) of a bolt, head and nut included.

    Parameters
    ----------
    clamp_length : array_like
        Clamp length l_K, head bearing face to nut bearing face (or to the start of the
        tapped thread) [m].
    shank_length : array_like
        Length of the plain shank inside the clamp length, 0 <= l_1 <= l_K; the rest
        is free loaded thread [m].
    nominal_diameter : array_like
        Nominal diameter d [m].
    minor_diameter : array_like
        Thread minor diameter d3 [m].
    elastic_modulus : array_like
        Young's modulus of the bolt E_S [Pa].
    head : {"hex-head", "socket-head"}
        Head form, for its substitute length [unitless].
    engagement : {"nut", "tapped-hole"}
        Whether the bolt ends in a nut or in a tapped part [unitless].
    shank_diameter : array_like, optional
        Shank diameter if reduced; the nominal diameter otherwise [m].
    nut_elastic_modulus : array_like, optional
        Young's modulus of the nut or tapped part E_M; E_S otherwise [Pa].

    Returns
    -------
    numpy.ndarray or float
        delta_S [m/N].

    Notes
    -----
    Springs in series: delta_S = delta_SK + delta_1 + delta_Gew + delta_G + delta_M
    with delta_SK = l_SK/(E_S A_N), delta_1 = l_1/(E_S A_1),
    delta_Gew = (l_K - l_1)/(E_S A_d3), delta_G = 0.5 d/(E_S A_d3) and
    delta_M = l_M/(E_M A_N); A_N = pi d^2/4, A_d3 = pi d3^2/4, and the substitute
    lengths of :data:`BOLT_RESILIENCE_LENGTHS_VDI_2230`.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 5.1.1 (from memory).
    """
    lk = _positive(clamp_length, "clamp length", "m")
    l1 = _nonnegative(shank_length, "shank length", "m")
    d = _positive(nominal_diameter, "nominal diameter", "m")
    d3 = _positive(minor_diameter, "minor diameter", "m")
    es = _positive(elastic_modulus, "elastic modulus", "Pa")
    bad = l1 > lk
    if np.any(bad):
        raise ValueError(
            f"shank length must not exceed the clamp length, got "
            f"{_first(np.broadcast_to(l1, bad.shape), bad)} m"
        )
    if head not in ("hex-head", "socket-head"):
        raise ValueError(f"unknown head {head!r}: valid heads are hex-head, socket-head")
    if engagement not in ("nut", "tapped-hole"):
        raise ValueError(
            f"unknown engagement {engagement!r}: valid engagements are nut, tapped-hole"
        )
    ds = d if shank_diameter is None else _positive(shank_diameter, "shank diameter", "m")
    em = es if nut_elastic_modulus is None else _positive(
        nut_elastic_modulus, "nut elastic modulus", "Pa"
    )
    factors = BOLT_RESILIENCE_LENGTHS_VDI_2230
    a_n = np.pi / 4 * d**2
    a_1 = np.pi / 4 * ds**2
    a_3 = np.pi / 4 * d3**2
    head_part = factors[head] * d / (es * a_n)
    shank = l1 / (es * a_1)
    free_thread = (lk - l1) / (es * a_3)
    engaged = factors["engaged-thread"] * d / (es * a_3)
    nut = factors[engagement] * d / (em * a_n)
    return head_part + shank + free_thread + engaged + nut


def cone_angle_tangent_vdi2230(
    clamp_length: ArrayLike,
    bearing_diameter: ArrayLike,
    outside_diameter: ArrayLike,
    joint: str = "through",
):
    """Tangent of the pressure-cone angle in the clamped parts.

    Parameters
    ----------
    clamp_length : array_like
        Clamp length l_K [m].
    bearing_diameter : array_like
        Outside diameter of the head bearing face d_W [m].
    outside_diameter : array_like
        Substitute outside diameter of the clamped parts D'_A [m].
    joint : {"through", "tapped"}
        Through-bolted joint with nut, or tapped thread joint [unitless].

    Returns
    -------
    numpy.ndarray or float
        tan(phi) [unitless].

    Notes
    -----
    With beta_L = l_K / d_W and y = D'_A / d_W:
    through-bolted, tan(phi_D) = 0.362 + 0.032 ln(beta_L / 2) + 0.153 ln(y);
    tapped, tan(phi_E) = 0.348 + 0.013 ln(beta_L) + 0.193 ln(y).
    Older practice (Shigley, after Osgood) takes a fixed half-angle near 30 degrees,
    tan = 0.577.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 5.1.2.2, eqs. (5.1/23) and (5.1/24) (equation
       numbers and coefficients from memory).
    """
    lk = _positive(clamp_length, "clamp length", "m")
    dw = _positive(bearing_diameter, "bearing diameter", "m")
    da = _positive(outside_diameter, "outside diameter", "m")
    beta = lk / dw
    y = da / dw
    if joint == "through":
        return 0.362 + 0.032 * np.log(beta / 2) + 0.153 * np.log(y)
    if joint == "tapped":
        return 0.348 + 0.013 * np.log(beta) + 0.193 * np.log(y)
    raise ValueError(f"unknown joint {joint!r}: valid joints are through, tapped")


def clamped_part_resilience_vdi2230(
    clamp_length: ArrayLike,
    bearing_diameter: ArrayLike,
    hole_diameter: ArrayLike,
    outside_diameter: ArrayLike,
    elastic_modulus: ArrayLike,
    joint: str = "through",
    cone_tangent: ArrayLike | None = None,
):
    """Axial resilience of the clamped parts by the substitute deformation cone.

    Parameters
    ----------
    clamp_length : array_like
        Clamp length l_K [m].
    bearing_diameter : array_like
        Outside diameter of the head (and nut) bearing face d_W [m].
    hole_diameter : array_like
        Clearance hole diameter D_h, smaller than d_W [m].
    outside_diameter : array_like
        Outside diameter of the clamped parts around the bolt D_A (for a flange, the
        width available to the bolt) [m].
    elastic_modulus : array_like
        Young's modulus of the clamped parts E_P [Pa].
    joint : {"through", "tapped"}
        Through-bolted joint (two cones, w = 1) or tapped thread joint (one cone,
        w = 2) [unitless].
    cone_tangent : array_like, optional
        tan(phi) of the cone; by default :func:`cone_angle_tangent_vdi2230` with
        D'_A = D_A [unitless].

    Returns
    -------
    numpy.ndarray or float
        delta_P [m/N].

    Notes
    -----
    Limiting outside diameter D_A,Gr = d_W + w l_K tan(phi). If D_A >= D_A,Gr the
    cone is complete:

        delta_P = 2 ln[((d_W + D_h)(D_A,Gr - D_h)) / ((d_W - D_h)(D_A,Gr + D_h))]
                  / (w E_P pi D_h tan(phi))

    If d_W <= D_A < D_A,Gr the cone meets the outside and continues as a sleeve:

        delta_P = [2/(w D_h tan(phi)) ln(((d_W + D_h)(D_A - D_h)) /
                  ((d_W - D_h)(D_A + D_h))) + 4/(D_A^2 - D_h^2)
                  (l_K - (D_A - d_W)/(w tan(phi)))] / (E_P pi)

    If D_A < d_W the parts are a sleeve of diameter D_A
    (:func:`clamped_part_resilience_cylinder`). Each form is the integral of
    dx / (E_P A(x)) along the cone; with a 30 degree cone and d_W = 1.5 d it is the
    frustum stiffness of Shigley eq. (8-22).

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 5.1.2.2 (from memory).
    .. [2] R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th
       ed., 2015, section 8-5, eqs. (8-20) to (8-22) (from memory).
    """
    lk = _positive(clamp_length, "clamp length", "m")
    dw = _positive(bearing_diameter, "bearing diameter", "m")
    dh = _positive(hole_diameter, "hole diameter", "m")
    da = _positive(outside_diameter, "outside diameter", "m")
    ep = _positive(elastic_modulus, "elastic modulus", "Pa")
    if joint == "through":
        w = 1.0
    elif joint == "tapped":
        w = 2.0
    else:
        raise ValueError(f"unknown joint {joint!r}: valid joints are through, tapped")
    bad = dh >= np.minimum(dw, da)
    if np.any(bad):
        raise ValueError(
            "hole diameter must be smaller than the bearing and outside diameters, got "
            f"{_first(np.broadcast_to(dh, bad.shape), bad)} m"
        )
    if cone_tangent is None:
        tan_phi = cone_angle_tangent_vdi2230(lk, dw, np.maximum(da, dw), joint)
    else:
        tan_phi = _positive(cone_tangent, "cone tangent", "")
    lk, dw, dh, da, ep, tan_phi = np.broadcast_arrays(lk, dw, dh, da, ep, tan_phi)
    d_lim = dw + w * lk * tan_phi
    d_cone = np.clip(da, dw, d_lim)  # where the cone stops growing
    with np.errstate(divide="ignore", invalid="ignore"):
        cone = (
            2.0 / (w * dh * tan_phi)
            * np.log(((dw + dh) * (d_cone - dh)) / ((dw - dh) * (d_cone + dh)))
        )
    sleeve_length = lk - (d_cone - dw) / (w * tan_phi)
    sleeve = 4.0 / (d_cone**2 - dh**2) * sleeve_length
    out = (cone + sleeve) / (ep * np.pi)
    narrow = da < dw
    if np.any(narrow):
        out = np.where(narrow, 4.0 * lk / (ep * np.pi * (da**2 - dh**2)), out)
    return out if out.ndim else float(out)


def clamped_part_resilience_cylinder(
    clamp_length: ArrayLike,
    outside_diameter: ArrayLike,
    hole_diameter: ArrayLike,
    elastic_modulus: ArrayLike,
):
    """Axial resilience of a clamped sleeve (hollow cylinder), delta = l / (E A).

    Parameters
    ----------
    clamp_length : array_like
        Length of the sleeve l_K [m].
    outside_diameter : array_like
        Outside diameter D_A [m].
    hole_diameter : array_like
        Bore D_h < D_A [m].
    elastic_modulus : array_like
        Young's modulus E_P [Pa].

    Returns
    -------
    numpy.ndarray or float
        delta_P = 4 l_K / (E_P pi (D_A^2 - D_h^2)) [m/N].

    Notes
    -----
    Exact for a sleeve no wider than the bearing face (D_A <= d_W), where the whole
    section carries the load uniformly; for wider parts use the cone model, since this
    would overstate the stiffness.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 5.1.2 (sleeve case D_A <= d_W) (from memory).
    """
    lk = _positive(clamp_length, "clamp length", "m")
    da = _positive(outside_diameter, "outside diameter", "m")
    dh = _nonnegative(hole_diameter, "hole diameter", "m")
    ep = _positive(elastic_modulus, "elastic modulus", "Pa")
    bad = dh >= da
    if np.any(bad):
        raise ValueError(
            "hole diameter must be smaller than the outside diameter, got "
            f"{_first(np.broadcast_to(dh, bad.shape), bad)} m"
        )
    return 4.0 * lk / (ep * np.pi * (da**2 - dh**2))


def load_factor(
    bolt_resilience: ArrayLike, part_resilience: ArrayLike, load_introduction: ArrayLike = 1.0
):
    """Load factor of a concentric joint, Phi_n = n delta_P / (delta_S + delta_P).

    Parameters
    ----------
    bolt_resilience : array_like
        delta_S [m/N].
    part_resilience : array_like
        delta_P [m/N].
    load_introduction : array_like, optional
        Load introduction factor n, 0 < n <= 1; 1 when the axial load acts under the
        head and nut (the largest share into the bolt, the cautious choice) [unitless].

    Returns
    -------
    numpy.ndarray or float
        Phi_n, the share of an axial service load that goes into the bolt [unitless].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, step R3, eq. (R3/1) and section 5.2.2 (from memory).
    """
    if (_floats(bolt_resilience, part_resilience, load_introduction)
            and _positive_float(bolt_resilience) and _nonnegative_float(part_resilience)
            and 0.0 < load_introduction <= 1.0):  # fast path (see _floats)
        return load_introduction * part_resilience / (bolt_resilience + part_resilience)
    ds = _positive(bolt_resilience, "bolt resilience", "m/N")
    dp = _nonnegative(part_resilience, "part resilience", "m/N")
    n = _positive(load_introduction, "load introduction factor", "")
    bad = n > 1
    if np.any(bad):
        raise ValueError(
            f"load introduction factor must not exceed 1, got {_first(n, bad)}"
        )
    return n * dp / (ds + dp)


# ----------------------------------------------------------------- embedding


def embedding_amount_vdi2230(
    roughness: float,
    bearing_faces: int,
    inner_interfaces: int,
    load: str = "axial",
) -> float:
    """Total embedding f_Z of a joint of solid steel parts.

    Parameters
    ----------
    roughness : float
        Averaged surface roughness Rz of the contact faces, below 160 um [m].
    bearing_faces : int
        Head and nut bearing faces: 2 for a bolt with nut, 1 for a tapped joint
        [unitless].
    inner_interfaces : int
        Interfaces between clamped parts (parts minus one) [unitless].
    load : {"axial", "transverse"}
        Direction of the service load [unitless].

    Returns
    -------
    float
        f_Z = f_thread + bearing_faces f_face + inner_interfaces f_interface [m].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, Table 5 (from memory).

    Examples
    --------
    >>> round(embedding_amount_vdi2230(6.3e-6, 2, 1) * 1e6, 2)
    9.5
    """
    rz = float(roughness)
    if not math.isfinite(rz) or rz < 0:
        raise ValueError(f"roughness must be zero or positive, got {roughness!r} m")
    if load not in ("axial", "transverse"):
        raise ValueError(f"unknown load {load!r}: valid loads are axial, transverse")
    faces = int(_count(bearing_faces, "bearing face count"))
    interfaces = int(_count(inner_interfaces, "inner interface count", minimum=0))
    for bound in sorted({k[0] for k in EMBEDDING_AMOUNTS_VDI_2230}):
        if rz < bound:
            thread, face, interface = EMBEDDING_AMOUNTS_VDI_2230[(bound, load)]
            return thread + faces * face + interfaces * interface
    raise ValueError(
        f"roughness Rz must be below 160 um for the embedding table, got {rz * 1e6:g} um"
    )


def preload_loss_embedding(
    embedding: ArrayLike, bolt_resilience: ArrayLike, part_resilience: ArrayLike
):
    """Preload lost by embedding, F_Z = f_Z / (delta_S + delta_P).

    Parameters
    ----------
    embedding : array_like
        Total embedding f_Z [m].
    bolt_resilience : array_like
        delta_S [m/N].
    part_resilience : array_like
        delta_P [m/N].

    Returns
    -------
    numpy.ndarray or float
        F_Z [N].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, step R4, eq. (R4/1) (from memory).
    """
    if (_floats(embedding, bolt_resilience, part_resilience) and _nonnegative_float(embedding)
            and _positive_float(bolt_resilience)
            and _nonnegative_float(part_resilience)):  # fast path (see _floats)
        return embedding / (bolt_resilience + part_resilience)
    fz = _nonnegative(embedding, "embedding", "m")
    ds = _positive(bolt_resilience, "bolt resilience", "m/N")
    dp = _nonnegative(part_resilience, "part resilience", "m/N")
    return fz / (ds + dp)


# ------------------------------------------------------------ service forces


def bolt_additional_force(load_factor: ArrayLike, axial_load: ArrayLike):
    """Additional bolt force from an axial service load, F_SA = Phi F_A.

    Parameters
    ----------
    load_factor : array_like
        Phi_n [unitless].
    axial_load : array_like
        Axial service load per bolt F_A (positive in tension) [N].

    Returns
    -------
    numpy.ndarray or float
        F_SA [N].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, section 3.2 (from memory).
    """
    phi = _nonnegative(load_factor, "load factor", "")
    fa = _finite(axial_load, "axial load", "N")
    return phi * fa


def residual_clamp_load(
    min_preload: ArrayLike,
    embedding_loss: ArrayLike,
    load_factor: ArrayLike,
    axial_load: ArrayLike,
):
    """Residual clamp load in the interface, F_KR = F_Mmin - F_Z - (1 - Phi) F_A.

    Parameters
    ----------
    min_preload : array_like
        Smallest assembly preload F_Mmin [N].
    embedding_loss : array_like
        Preload lost by embedding F_Z [N].
    load_factor : array_like
        Phi_n [unitless].
    axial_load : array_like
        Axial service load per bolt F_A (tension positive) [N].

    Returns
    -------
    numpy.ndarray or float
        F_KR [N]; zero or negative means the joint opens.

    Notes
    -----
    Thermal preload change is not included (take it into F_Z if it matters).

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. (R12/1) form (from memory).
    """
    if (_floats(min_preload, embedding_loss, load_factor, axial_load)
            and _nonnegative_float(min_preload) and _nonnegative_float(embedding_loss)
            and _nonnegative_float(load_factor)
            and math.isfinite(axial_load)):  # fast path (see _floats)
        return min_preload - embedding_loss - (1 - load_factor) * axial_load
    fm = _nonnegative(min_preload, "minimum preload", "N")
    fz = _nonnegative(embedding_loss, "embedding loss", "N")
    phi = _nonnegative(load_factor, "load factor", "")
    fa = _finite(axial_load, "axial load", "N")
    return fm - fz - (1 - phi) * fa


def slip_safety(
    residual_clamp_load: ArrayLike,
    transverse_load: ArrayLike,
    interface_friction: ArrayLike,
    interfaces: ArrayLike = 1,
    bolts: ArrayLike = 1,
):
    """Safety against slipping of a joint under transverse load.

    Parameters
    ----------
    residual_clamp_load : array_like
        Residual clamp load per bolt F_KR [N].
    transverse_load : array_like
        Transverse force on the whole joint F_Q, shared equally by ``bolts`` [N].
    interface_friction : array_like
        Static friction coefficient in the interfaces mu_T, 0 < mu_T < 1 [unitless].
    interfaces : array_like, optional
        Number of force-transmitting interfaces q_F (1 for two plates) [unitless].
    bolts : array_like, optional
        Number of bolts sharing F_Q (whole number >= 1) [unitless].

    Returns
    -------
    numpy.ndarray or float
        S_G = F_KR q_F mu_T / (F_Q / bolts) [unitless]; infinite for no transverse load,
        zero when the clamp load is gone. Compare with
        :data:`REQUIRED_SLIP_SAFETY_VDI_2230`.

    Notes
    -----
    A joint that slips under alternating transverse load self-loosens (Junker, SAE
    690055, 1969; test method DIN 65151 / ISO 16130), hence the higher required safety
    for alternating load.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, step R12 (from memory).
    """
    if (_floats(residual_clamp_load, transverse_load, interface_friction)
            and math.isfinite(residual_clamp_load) and _nonnegative_float(transverse_load)
            and 0.0 < interface_friction < 1.0 and _whole(interfaces)
            and _whole(bolts)):  # fast path (see _floats); np.maximum's choice, in1 >= in2
        clamp = residual_clamp_load if residual_clamp_load >= 0.0 else 0.0
        capacity = clamp * float(interfaces) * interface_friction * float(bolts)
        return capacity / transverse_load if transverse_load > 0 else math.inf
    fkr = _finite(residual_clamp_load, "residual clamp load", "N")
    fq = _nonnegative(transverse_load, "transverse load", "N")
    mu = _friction(interface_friction, "interface friction coefficient")
    q = _count(interfaces, "interface count")
    n = _count(bolts, "bolt count")
    capacity = np.maximum(fkr, 0.0) * q * mu * n
    with np.errstate(divide="ignore", invalid="ignore"):
        out = np.where(fq > 0, capacity / np.where(fq > 0, fq, 1.0), np.inf)
    return out if out.ndim else float(out)


# ------------------------------------------------------------------- fatigue


def endurance_limit_rolled_before_heat_treatment(nominal_diameter: ArrayLike):
    """Endurance limit (stress amplitude) of a bolt rolled before heat treatment.

    Parameters
    ----------
    nominal_diameter : array_like
        Nominal diameter d [m].

    Returns
    -------
    numpy.ndarray or float
        sigma_ASV = 0.85 (150 / d + 45) MPa with d in mm, returned in [Pa].

    Notes
    -----
    Stress amplitude on the stress area for N_D = 2e6 cycles, independent of the mean
    stress (VDI 2230).

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. (R9/2) (relation as reproduced in secondary
       sources; the guideline itself was not opened).

    Examples
    --------
    >>> round(float(endurance_limit_rolled_before_heat_treatment(0.012)) / 1e6, 2)
    48.88
    """
    d_mm = _positive(nominal_diameter, "nominal diameter", "m") * 1.0e3
    return 0.85 * (150.0 / d_mm + 45.0) * 1.0e6


def endurance_limit_rolled_after_heat_treatment(
    nominal_diameter: ArrayLike, mean_bolt_force: ArrayLike, yield_load: ArrayLike
):
    """Endurance limit of a bolt rolled after heat treatment.

    Parameters
    ----------
    nominal_diameter : array_like
        Nominal diameter d [m].
    mean_bolt_force : array_like
        Mean bolt force in service F_Sm [N].
    yield_load : array_like
        Bolt force at minimum yield F_0.2min = R_p0.2min A_S [N].

    Returns
    -------
    numpy.ndarray or float
        sigma_ASG = (2 - F_Sm / F_0.2min) sigma_ASV [Pa].

    Notes
    -----
    The guideline states the relation for 0.3 <= F_Sm / F_0.2min < 1. Below 0.3 the
    factor is held at its value at 0.3 (1.7) rather than extrapolated (our choice, on
    the cautious side); a ratio of 1 or more (bolt yielded) raises ValueError.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. (R9/3) (relation as reproduced in secondary
       sources; the guideline itself was not opened).
    """
    asv = endurance_limit_rolled_before_heat_treatment(nominal_diameter)
    fsm = _nonnegative(mean_bolt_force, "mean bolt force", "N")
    f02 = _positive(yield_load, "yield load", "N")
    ratio = fsm / f02
    bad = ratio >= 1
    if np.any(bad):
        raise ValueError(
            "mean bolt force must be below the yield load for the endurance limit, got "
            f"F_Sm / F_0.2min = {_first(np.broadcast_to(ratio, bad.shape), bad)}"
        )
    return (2.0 - np.maximum(ratio, 0.3)) * asv


def bolt_force_amplitude(
    load_factor: ArrayLike, axial_load_max: ArrayLike, axial_load_min: ArrayLike
):
    """Amplitude of the additional bolt force, F_SAa = Phi (F_Amax - F_Amin) / 2.

    Parameters
    ----------
    load_factor : array_like
        Phi_n [unitless].
    axial_load_max, axial_load_min : array_like
        Largest and smallest axial service load per bolt [N].

    Returns
    -------
    numpy.ndarray or float
        F_SAa [N].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, step R9 (from memory).
    """
    if (_floats(load_factor, axial_load_max, axial_load_min)
            and _nonnegative_float(load_factor) and math.isfinite(axial_load_max)
            and math.isfinite(axial_load_min)):  # fast path (see _floats)
        return load_factor * abs(axial_load_max - axial_load_min) / 2
    phi = _nonnegative(load_factor, "load factor", "")
    fmax = _finite(axial_load_max, "maximum axial load", "N")
    fmin = _finite(axial_load_min, "minimum axial load", "N")
    return phi * np.abs(fmax - fmin) / 2


def bolt_stress_amplitude(force_amplitude: ArrayLike, stress_area: ArrayLike):
    """Alternating stress in the bolt, sigma_a = F_SAa / A_S.

    Parameters
    ----------
    force_amplitude : array_like
        Amplitude of the bolt force F_SAa [N].
    stress_area : array_like
        Tensile stress area A_S [m^2].

    Returns
    -------
    numpy.ndarray or float
        sigma_a [Pa].

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. (R9/1) (from memory).
    """
    if (_floats(force_amplitude, stress_area) and _nonnegative_float(force_amplitude)
            and _positive_float(stress_area)):  # fast path (see _floats)
        return force_amplitude / stress_area
    fa = _nonnegative(force_amplitude, "force amplitude", "N")
    area = _positive(stress_area, "stress area", "m^2")
    return fa / area


def fatigue_safety(stress_amplitude: ArrayLike, endurance_limit: ArrayLike):
    """Safety against bolt fatigue, S_D = sigma_AS / sigma_a.

    Parameters
    ----------
    stress_amplitude : array_like
        Alternating stress sigma_a [Pa].
    endurance_limit : array_like
        Endurance limit sigma_ASV or sigma_ASG [Pa].

    Returns
    -------
    numpy.ndarray or float
        S_D [unitless]; infinite for no alternating stress. Compare with
        :data:`REQUIRED_FATIGUE_SAFETY_VDI_2230`.

    References
    ----------
    .. [1] VDI 2230 Part 1:2015, eq. (R9/4) (from memory).
    """
    if (_floats(stress_amplitude, endurance_limit) and _nonnegative_float(stress_amplitude)
            and _positive_float(endurance_limit)):  # fast path (see _floats)
        return endurance_limit / stress_amplitude if stress_amplitude > 0 else math.inf
    sa = _nonnegative(stress_amplitude, "stress amplitude", "Pa")
    limit = _positive(endurance_limit, "endurance limit", "Pa")
    with np.errstate(divide="ignore", invalid="ignore"):
        out = np.where(sa > 0, limit / np.where(sa > 0, sa, 1.0), np.inf)
    return out if out.ndim else float(out)

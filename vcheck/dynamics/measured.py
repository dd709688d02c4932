"""Measured vibration: spectra to band-limited RMS, quantities restated, transmissibility.

A commissioning survey gives vibration as one reading (a broadband RMS over a band, or a
filtered reading at one frequency) or as an amplitude spectrum (one amplitude a line).
These functions turn such readings into the numbers the checks compare: the RMS
velocity over a band from a spectrum of velocity, acceleration or displacement
(Parseval's theorem, corrected for the window's noise bandwidth), and the
transmissibility and isolation efficiency measured above and below a set of isolators at
one frequency. Conversions of a single sinusoid between displacement, velocity and
acceleration are those of :mod:`vcheck.dynamics.vibration_level`. SI units throughout:
metres, metres per second, metres per second squared, hertz.
"""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike

from .isolation.transmissibility import isolation_efficiency
from .vibration_level import (
    harmonic_amplitude,
    velocity_from_acceleration,
    velocity_from_displacement,
)

__all__ = [
    "SPECTRUM_QUANTITIES",
    "WINDOW_NOISE_BANDWIDTH",
    "band_rms_from_spectrum",
    "measured_efficiency",
    "measured_transmissibility",
    "spectrum_peaks",
    "velocity_spectrum",
]

SPECTRUM_QUANTITIES = ("velocity", "acceleration", "displacement")
"""What an amplitude spectrum or a reading may measure."""

WINDOW_NOISE_BANDWIDTH: dict[str, float] = {
    "uniform": 1.0,
    "hann": 1.5,
    "hamming": 1.3628,
    "flat-top": 3.7702,
}
"""Normalised equivalent noise bandwidth of each analysis window [bins].

NENBW = N sum(w^2) / (sum w)^2: exactly 1 for the uniform (rectangular) window and 1.5
for the Hann window; 1.36 for Hamming (Harris, "On the use of windows for harmonic
analysis with the discrete Fourier transform", Proc. IEEE 66(1), 1978, Table 1, from
memory); 3.77 for the five-term flat-top window of scipy.signal.windows.flattop (computed
from its coefficients, checked in the tests against scipy). A spectrum corrected for
amplitude (a sinusoid shows its true amplitude on its line) overstates the power of
broadband content by this factor when its lines are summed."""


def _arr(value: ArrayLike) -> np.ndarray:
    return np.asarray(value, dtype=float)


def _spectrum(frequency: ArrayLike, amplitude: ArrayLike) -> tuple[np.ndarray, np.ndarray]:
    f = _arr(frequency)
    a = _arr(amplitude)
    if f.ndim != 1 or f.shape != a.shape or f.size == 0:
        raise ValueError("a spectrum is two one-dimensional arrays of the same length: "
                         "frequencies and amplitudes")
    if not (np.all(np.isfinite(f)) and np.all(np.isfinite(a))):
        raise ValueError("spectrum frequencies and amplitudes must be finite")
    if np.any(f < 0) or np.any(a < 0):
        raise ValueError("spectrum frequencies and amplitudes must not be negative")
    if np.any(np.diff(f) <= 0):
        raise ValueError("spectrum frequencies must be strictly increasing")
    return f, a


def velocity_spectrum(frequency: ArrayLike, amplitude: ArrayLike, quantity: str):
    """Restate an amplitude spectrum of any quantity as a velocity spectrum.

    Parameters
    ----------
    frequency : array_like
        Line frequencies, strictly increasing, positive [Hz].
    amplitude : array_like
        Amplitude of each line, in SI units of ``quantity`` (m, m/s or m/s^2), stated
        alike on every line (peak or RMS) [m, m/s or m/s^2].
    quantity : {"velocity", "acceleration", "displacement"}
        What the spectrum measures [unitless].

    Returns
    -------
    numpy.ndarray
        Velocity amplitude of each line, stated like ``amplitude`` [m/s].

    Notes
    -----
    Line by line, each line a sinusoid: V = A / (2 pi f), V = 2 pi f X
    (:func:`~vcheck.dynamics.vibration_level.velocity_from_acceleration`,
    :func:`~vcheck.dynamics.vibration_level.velocity_from_displacement`).

    References
    ----------
    .. [1] ISO 10816-1:1995, Annex A (relation of displacement, velocity and
       acceleration for single-frequency vibration) (from memory).
    """
    f, a = _spectrum(frequency, amplitude)
    if quantity == "velocity":
        return a
    if quantity == "acceleration":
        return velocity_from_acceleration(a, f)
    if quantity == "displacement":
        return velocity_from_displacement(a, f)
    raise ValueError(f"unknown quantity {quantity!r}: valid quantities are "
                     + ", ".join(SPECTRUM_QUANTITIES))


def band_rms_from_spectrum(frequency: ArrayLike, amplitude: ArrayLike, low: float,
                           high: float, *, reading: str = "rms", window: str = "uniform"):
    """RMS value over a frequency band from an amplitude spectrum (Parseval).

    Parameters
    ----------
    frequency : array_like
        Line frequencies, strictly increasing, zero or above [Hz].
    amplitude : array_like
        Amplitude of each line, corrected for amplitude (a pure tone on a line shows its
        amplitude) [any unit].
    low, high : float
        Band edges, ``low <= high``; lines with ``low <= f <= high`` count [Hz].
    reading : {"rms", "peak", "peak-to-peak"}, optional
        How each line's amplitude is stated [unitless].
    window : str, optional
        Analysis window of the spectrum, a key of :data:`WINDOW_NOISE_BANDWIDTH`
        [unitless].

    Returns
    -------
    float
        RMS value of the band-limited signal [unit of ``amplitude``].

    Notes
    -----
    Parseval's theorem: the mean square of a signal is the sum of the mean squares of its
    Fourier components, x_rms^2 = sum_k a_k,rms^2. A window spreads each component over
    several lines; with amplitude-corrected lines the sum over-counts the power of
    broadband content by the window's normalised noise bandwidth B, so
    x_rms = sqrt(sum_k a_k,rms^2 / B). For isolated tones that fall between lines the
    estimate errs by the window's scalloping; for broadband content it is exact in the
    mean.

    References
    ----------
    .. [1] Bendat and Piersol, Random Data: Analysis and Measurement Procedures, 4th ed.,
       Wiley 2010 (Parseval's theorem, mean square from a spectrum) (from memory).
    .. [2] Harris, On the use of windows for harmonic analysis with the discrete Fourier
       transform, Proc. IEEE 66(1), 1978 (equivalent noise bandwidth) (from memory).

    Examples
    --------
    >>> round(band_rms_from_spectrum([10.0, 20.0, 30.0], [3.0, 4.0, 9.0], 5.0, 25.0), 6)
    5.0
    """
    f, a = _spectrum(frequency, amplitude)
    if window not in WINDOW_NOISE_BANDWIDTH:
        raise ValueError(f"unknown window {window!r}: valid windows are "
                         + ", ".join(WINDOW_NOISE_BANDWIDTH))
    if not (np.isfinite(low) and np.isfinite(high)) or low < 0 or high < low:
        raise ValueError(f"the band must satisfy 0 <= low <= high, got {low:g} to {high:g} Hz")
    rms = harmonic_amplitude(a, reading, "rms")
    inside = (f >= low) & (f <= high)
    return float(np.sqrt(np.sum(np.atleast_1d(rms)[inside] ** 2)
                         / WINDOW_NOISE_BANDWIDTH[window]))


def spectrum_peaks(frequency: ArrayLike, amplitude: ArrayLike, *, prominence: float = 3.0):
    """Lines of a spectrum that stand out: local maxima well above the spectrum's median.

    Parameters
    ----------
    frequency, amplitude : array_like
        Line frequencies, strictly increasing [Hz], and amplitudes [any unit].
    prominence : float, optional
        Least ratio of a peak's amplitude to the median amplitude of the spectrum,
        above 1 [unitless].

    Returns
    -------
    numpy.ndarray of int
        Indices of the peaks, highest first.

    Notes
    -----
    A peak is a line higher than both neighbours (an end line than its one neighbour)
    and at least ``prominence`` times the median line. Common practice for picking
    spectral peaks by eye, made explicit; no published source.
    """
    f, a = _spectrum(frequency, amplitude)
    if not prominence > 1:
        raise ValueError(f"prominence must be above 1, got {prominence:g}")
    if a.size == 1:
        return np.array([0]) if a[0] > 0 else np.array([], dtype=int)
    left = np.concatenate(([-np.inf], a[:-1]))
    right = np.concatenate((a[1:], [-np.inf]))
    ordered = np.sort(a)  # the median, without np.median (it imports numpy.ma)
    half = a.size // 2
    floor = float(ordered[half] if a.size % 2 else (ordered[half - 1] + ordered[half]) / 2)
    peaks = np.flatnonzero((a > left) & (a >= right) & (a > 0) & (a >= prominence * floor))
    return peaks[np.argsort(-a[peaks], kind="stable")]


def measured_transmissibility(above: ArrayLike, below: ArrayLike):
    """Transmissibility measured across isolators at one frequency.

    Parameters
    ----------
    above : array_like
        Vibration amplitude on the machine or its frame above the isolators, positive
        [any unit, as ``below``].
    below : array_like
        Vibration amplitude on the support just below the isolators, at the same
        frequency, in the same direction, quantity and reading, zero or above [same unit].

    Returns
    -------
    numpy.ndarray or float
        T = below / above [unitless].

    Notes
    -----
    For a machine forcing its own isolators, the force passed into the support is
    k x_above when the support barely moves; the support's motion relative to the
    machine's is then the force transmissibility of the mounts with the support's own
    mobility in it, the measured form of the transmissibility the design predicts
    (common practice for checking isolators in the field).

    References
    ----------
    .. [1] Harris' Shock and Vibration Handbook, 6th ed., ch. 30 (isolator
       transmissibility; field measurement of isolation) (from memory).

    Examples
    --------
    >>> round(float(measured_transmissibility(4.0, 0.2)), 6)
    0.05
    """
    a = _arr(above)
    b = _arr(below)
    if np.any(~np.isfinite(a)) or np.any(a <= 0):
        raise ValueError("the amplitude above the isolators must be positive and finite")
    if np.any(~np.isfinite(b)) or np.any(b < 0):
        raise ValueError("the amplitude below the isolators must be zero or positive and finite")
    return b / a


def measured_efficiency(above: ArrayLike, below: ArrayLike):
    """Isolation efficiency measured across isolators, E = 1 - below / above.

    Parameters
    ----------
    above, below : array_like
        Amplitudes above and below the isolators at one frequency, as for
        :func:`measured_transmissibility` [same unit].

    Returns
    -------
    numpy.ndarray or float
        E = 1 - T; negative where the isolators amplify [unitless].

    References
    ----------
    .. [1] Harris' Shock and Vibration Handbook, 6th ed., ch. 30 (from memory).
    """
    return isolation_efficiency(measured_transmissibility(above, below))

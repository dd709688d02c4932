"""Measured vibration: spectra to band RMS, restated quantities, measured isolation.

Outside references: closed forms for a sinusoid, Parseval's theorem checked against
scipy.signal.welch (an independent PSD estimate) on a generated signal, the equivalent
noise bandwidth of scipy.signal's windows.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy import signal

from vcheck.dynamics.measured import (
    WINDOW_NOISE_BANDWIDTH,
    band_rms_from_spectrum,
    measured_efficiency,
    measured_transmissibility,
    spectrum_peaks,
    velocity_spectrum,
)

SCIPY_WINDOWS = {"uniform": "boxcar", "hann": "hann", "hamming": "hamming",
                 "flat-top": "flattop"}


@pytest.mark.parametrize("name", sorted(WINDOW_NOISE_BANDWIDTH))
def test_noise_bandwidth_against_scipy_windows(name):
    # NENBW = N sum(w^2) / (sum w)^2 of scipy.signal.get_window (periodic); the table
    # rounds to 4-5 digits, so 1e-4 relative.
    w = signal.get_window(SCIPY_WINDOWS[name], 8192)
    nenbw = w.size * np.sum(w**2) / np.sum(w) ** 2
    assert WINDOW_NOISE_BANDWIDTH[name] == pytest.approx(nenbw, rel=1e-4)


def test_sinusoid_conversions_closed_form():
    # x = X sin(2 pi f t): V = 2 pi f X, A = (2 pi f)^2 X (closed form), line by line.
    f = np.array([10.0, 24.75, 100.0])
    x = np.array([1e-4, 2e-5, 1e-6])
    v = velocity_spectrum(f, x, "displacement")
    np.testing.assert_allclose(v, 2 * np.pi * f * x, rtol=1e-14)
    a = (2 * np.pi * f) ** 2 * x
    np.testing.assert_allclose(velocity_spectrum(f, a, "acceleration"), v, rtol=1e-14)
    np.testing.assert_array_equal(velocity_spectrum(f, v, "velocity"), v)


def _signal(seed: int = 19):
    fs, seconds = 4096.0, 64.0
    t = np.arange(int(fs * seconds)) / fs
    rng = np.random.default_rng(seed)
    tones = (3.0e-3 * np.sin(2 * np.pi * 24.75 * t) + 1.0e-3 * np.sin(2 * np.pi * 49.5 * t + 1)
             + 2.0e-3 * np.sin(2 * np.pi * 5.0 * t))
    noise = rng.normal(0.0, 0.5e-3, t.size)
    return fs, tones + noise


def _amplitude_spectrum(x, fs, window: str, nperseg: int = 4096):
    """Averaged RMS amplitude per line, amplitude-corrected (a tone shows its RMS)."""
    w = signal.get_window(SCIPY_WINDOWS[window], nperseg)
    segments = x[: x.size // nperseg * nperseg].reshape(-1, nperseg)
    spectra = np.fft.rfft(segments * w, axis=1)
    power = np.mean(np.abs(spectra) ** 2, axis=0) * 2 / np.sum(w) ** 2  # peak^2 / 2 = rms^2
    power[0] /= 2
    return np.fft.rfftfreq(nperseg, 1 / fs), np.sqrt(power)


@pytest.mark.parametrize("window", ["hann", "hamming", "uniform"])
def test_band_rms_by_parseval_against_welch(window):
    # The band RMS of a spectrum summed by Parseval and corrected by the window's noise
    # bandwidth equals sqrt of the integral of scipy.signal.welch's PSD over the same band
    # (an independent estimate with its own density scaling). Both average the same
    # segments, so they agree to the rounding of the tabulated noise bandwidth (Hamming's
    # 1.3628 to 5 digits): 1e-4.
    fs, x = _signal()
    f, amplitude = _amplitude_spectrum(x, fs, window)
    low, high = 10.0, 1000.0
    ours = band_rms_from_spectrum(f, amplitude, low, high, window=window)
    fw, psd = signal.welch(x, fs, window=SCIPY_WINDOWS[window], nperseg=4096, noverlap=0,
                           detrend=False, scaling="density")
    inside = (fw >= low) & (fw <= high)
    welch_rms = math.sqrt(np.sum(psd[inside]) * (fw[1] - fw[0]))
    assert ours == pytest.approx(welch_rms, rel=1e-4)
    # and against the signal's content, closed form: tones 3 and 1 mm/s peak inside, the
    # 5 Hz tone outside, white noise of 0.5 mm/s RMS spread over 0 to 2048 Hz, so
    # (990 / 2048) of its power in band; 2% for the noise estimate of 64 averages.
    expected = math.sqrt(3.0e-3**2 / 2 + 1.0e-3**2 / 2 + 0.5e-3**2 * 990 / 2048)
    assert ours == pytest.approx(expected, rel=0.02)


def test_band_rms_of_a_pure_tone_on_a_line_is_its_rms():
    # one tone on a bin, uniform window: the line is the tone's RMS, closed form
    fs, n = 1024.0, 1024
    t = np.arange(n) / fs
    x = 2.0 * np.sin(2 * np.pi * 50.0 * t)
    f, amplitude = _amplitude_spectrum(x, fs, "uniform", nperseg=n)
    assert band_rms_from_spectrum(f, amplitude, 40.0, 60.0) == pytest.approx(2 / math.sqrt(2),
                                                                              rel=1e-12)


def test_band_rms_readings_and_band_edges():
    f = [10.0, 20.0, 30.0]
    # peak lines restated as RMS: peak / sqrt(2) (sinusoid)
    assert band_rms_from_spectrum(f, [3.0, 4.0, 9.0], 10.0, 20.0, reading="peak") == \
        pytest.approx(5.0 / math.sqrt(2), rel=1e-12)
    # the band is inclusive at both edges
    assert band_rms_from_spectrum(f, [3.0, 4.0, 9.0], 20.0, 30.0) == pytest.approx(
        math.sqrt(97.0), rel=1e-12)
    assert band_rms_from_spectrum(f, [3.0, 4.0, 9.0], 40.0, 50.0) == 0.0


@pytest.mark.parametrize(("frequency", "amplitude", "message"), [
    ([10.0, 10.0], [1.0, 1.0], "strictly increasing"),
    ([10.0, 5.0], [1.0, 1.0], "strictly increasing"),
    ([10.0, 20.0], [1.0, -1.0], "must not be negative"),
    ([10.0, 20.0], [1.0, math.nan], "must be finite"),
    ([10.0, 20.0], [1.0], "same length"),
])
def test_bad_spectra_are_refused(frequency, amplitude, message):
    with pytest.raises(ValueError, match=message):
        band_rms_from_spectrum(frequency, amplitude, 0.0, 100.0)


def test_unknown_window_and_reversed_band():
    with pytest.raises(ValueError, match="unknown window 'blackman'"):
        band_rms_from_spectrum([1.0, 2.0], [1.0, 1.0], 0.0, 3.0, window="blackman")
    with pytest.raises(ValueError, match="0 <= low <= high"):
        band_rms_from_spectrum([1.0, 2.0], [1.0, 1.0], 3.0, 1.0)


def test_measured_transmissibility_and_efficiency():
    # T = below / above, E = 1 - T (definition; Harris ch. 30, from memory)
    assert measured_transmissibility(2.5, 0.1) == pytest.approx(0.04, rel=1e-12)
    assert measured_efficiency(2.5, 0.1) == pytest.approx(0.96, rel=1e-12)
    assert measured_efficiency(1.0, 2.0) == pytest.approx(-1.0)  # amplification
    with pytest.raises(ValueError, match="above the isolators must be positive"):
        measured_transmissibility(0.0, 0.1)
    with pytest.raises(ValueError, match="below the isolators must be zero or positive"):
        measured_transmissibility(1.0, -0.1)


def test_spectrum_peaks_picks_prominent_local_maxima():
    f = np.arange(1.0, 101.0)
    a = np.full(f.shape, 0.1)
    a[65] = 1.0   # 66 Hz, ten times the median
    a[20] = 0.25  # 21 Hz, only 2.5 times the median: not a peak
    a[40] = 0.5   # 41 Hz
    assert list(f[spectrum_peaks(f, a)]) == [66.0, 41.0]
    assert list(spectrum_peaks(f, np.full(f.shape, 0.1))) == []


def test_acceleration_spectrum_to_band_velocity_against_time_integration():
    # Independent method: integrate a generated acceleration record in time with
    # scipy.integrate.cumulative_trapezoid and take the RMS of the velocity; the spectral
    # route (Hann lines restated line by line as velocity, summed by Parseval) must agree.
    # 0.25 Hz lines keep the 1/f change across a tone's leakage lines below 0.1%; 1% covers
    # that and the trapezoid rule at 40 samples a cycle of the highest tone.
    from scipy.integrate import cumulative_trapezoid

    fs, seconds = 2048.0, 64.0
    t = np.arange(int(fs * seconds)) / fs
    tones = ((24.75, 2.0), (49.5, 1.0), (50.3, 3.0))  # Hz, m/s^2 peak
    a = sum(amp * np.sin(2 * np.pi * f * t + f) for f, amp in tones)
    v = cumulative_trapezoid(a, t, initial=0.0)
    v -= np.mean(v)  # the constant of integration
    time_rms = math.sqrt(np.mean(v**2))
    closed = math.sqrt(sum((amp / (2 * np.pi * f)) ** 2 / 2 for f, amp in tones))
    assert time_rms == pytest.approx(closed, rel=0.01)
    f, lines = _amplitude_spectrum(a, fs, "hann", nperseg=8192)
    keep = f > 0
    velocity = velocity_spectrum(f[keep], lines[keep], "acceleration")
    ours = band_rms_from_spectrum(f[keep], velocity, 10.0, 1000.0, window="hann")
    assert ours == pytest.approx(time_rms, rel=0.01)

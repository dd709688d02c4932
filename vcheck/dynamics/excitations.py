"""Forcing frequencies of machines, as single values or bands over a speed range.

All speeds and frequencies are in hertz (revolutions or cycles per second).
"""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike

__all__ = ["order_band"]


def order_band(order: ArrayLike, speed_min: ArrayLike, speed_max: ArrayLike):
    """Frequency band of a running-speed order over a speed range.

    Parameters
    ----------
    order : array_like
        Order of the running speed, events per revolution (1 for unbalance, 2 for
        misalignment, the vane count for vane pass) [unitless].
    speed_min, speed_max : array_like
        Lowest and highest running speed [Hz].

    Returns
    -------
    low, high : numpy.ndarray
        Band edges [Hz].

    Notes
    -----
    f = n * N, with n the order and N the shaft speed in revolutions per second. A vane
    or blade pass frequency is the vane count times shaft speed (common practice).

    References
    ----------
    .. [1] C. M. Harris, A. G. Piersol, Harris' Shock and Vibration Handbook, 5th ed.,
       McGraw-Hill, 2002, ch. 16 (machinery forcing frequencies) (from memory).
    """
    order = np.asarray(order, dtype=float)
    low = order * np.asarray(speed_min, dtype=float)
    high = order * np.asarray(speed_max, dtype=float)
    return low, high

"""Torsional excitation of a shaft train: orders of shaft speed and fixed frequencies.

The catalogue of engine and compressor orders and of electrical frequencies is that of
:mod:`vcheck.dynamics.forcing.excitations`; this module only sorts it into the major
and minor torque orders a torsional check needs.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from ..forcing.excitations import (
    INVERTER_TORQUE_HARMONICS,
    compressor_pulsation_frequency,
    drive_output_frequency,
    engine_excitation_orders,
)

__all__ = ["TorqueOrders", "compressor_torque_orders", "drive_torque_pulsations",
           "engine_torque_orders"]


class TorqueOrders(NamedTuple):
    """Orders of shaft speed at which a machine's torque fluctuates [unitless]."""

    major: np.ndarray
    """The firing (or compression) order and its multiples, the strongest."""
    minor: np.ndarray
    """Every other order the cycle contains, weaker with even firing."""


def _split(orders: np.ndarray, major: np.ndarray) -> TorqueOrders:
    is_major = np.isin(np.round(orders * 2), np.round(major * 2))
    return TorqueOrders(major=np.asarray(major, dtype=float), minor=orders[~is_major])


def engine_torque_orders(cylinders: int, strokes: int = 4, max_order: float = 12.0) -> TorqueOrders:
    """Major and minor gas-torque orders of a reciprocating engine.

    Parameters
    ----------
    cylinders : int
        Number of cylinders [unitless].
    strokes : {4, 2}, default 4
        Four-stroke or two-stroke cycle [unitless].
    max_order : float, default 12
        Highest order listed [unitless].

    Returns
    -------
    TorqueOrders
        ``major``: cylinders / 2 x k (four-stroke) or cylinders x k (two-stroke);
        ``minor``: the other half orders (four-stroke) or whole orders (two-stroke).

    Notes
    -----
    From :func:`vcheck.dynamics.forcing.excitations.engine_excitation_orders`: with even
    firing the cylinders' torques add at the major orders; the minor orders are left by
    differences between cylinders and by the firing sequence (common practice; from
    memory: Harris' Shock and Vibration Handbook, 5th ed., ch. 38).

    Examples
    --------
    >>> engine_torque_orders(6, 4, 6).major
    array([3., 6.])
    """
    found = engine_excitation_orders(cylinders, strokes, max_order)
    return _split(found.orders, found.firing_orders)


def compressor_torque_orders(cylinders: int, double_acting: bool = False,
                             max_order: float = 12.0) -> TorqueOrders:
    """Major and minor torque orders of a reciprocating compressor.

    Parameters
    ----------
    cylinders : int
        Number of cylinders [unitless].
    double_acting : bool, default False
        Cylinders compressing on both sides of the piston [-].
    max_order : float, default 12
        Highest order listed [unitless].

    Returns
    -------
    TorqueOrders
        ``major``: the compression-pulse order (cylinders, or twice that double-acting)
        and its multiples; ``minor``: every other whole order.

    Notes
    -----
    A compressor cylinder completes its cycle in one revolution, so its torque holds
    every whole order; the pulses of evenly phased cylinders add at the pulse order
    :func:`~vcheck.dynamics.forcing.excitations.compressor_pulsation_frequency` per
    revolution (common practice).
    """
    pulse = float(compressor_pulsation_frequency(cylinders, 1.0, double_acting))
    top = int(np.floor(max_order + 1e-9))
    orders = np.arange(1, max(top, 1) + 1, dtype=float)
    major = pulse * np.arange(1, int(np.floor(max_order / pulse + 1e-9)) + 1)
    return _split(orders, major)


def drive_torque_pulsations(poles: int, motor_speed) -> np.ndarray:
    """Torque pulsation frequencies of a motor fed by a variable-frequency drive.

    Parameters
    ----------
    poles : int
        Number of poles of the motor [unitless]; even.
    motor_speed : array_like
        Motor shaft speed [Hz]; not negative.

    Returns
    -------
    numpy.ndarray
        Shape (harmonics, ...) : 6 and 12 times the drive's output frequency p N / 2 [Hz]
        (:data:`~vcheck.dynamics.forcing.excitations.INVERTER_TORQUE_HARMONICS`, from
        memory).
    """
    output = drive_output_frequency(poles, motor_speed)
    return np.array([h * output for h in INVERTER_TORQUE_HARMONICS])

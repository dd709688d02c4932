"""Forcing frequencies against published bearing data, closed forms and common practice."""

from __future__ import annotations

import math

import numpy as np
import pytest

from vcheck.dynamics.forcing import excitations as ex

INCH = 0.0254
RPM = 1.0 / 60.0

# Case Western Reserve University Bearing Data Center (open bearing-fault data set),
# bearing specification page: defect frequencies as multiples of running speed. Numbers
# from memory, confirmed against two public code repositories that reproduce them; the
# page itself was not opened. Geometry of the 6205 is also in REFERENCES.md; the 6203
# geometry (8 balls, d = 0.2656 in, D = 1.122 in) is from memory.
CWRU_DRIVE_END_6205 = dict(
    n=9, d=0.3126, D=1.537, inner=5.4152, outer=3.5848, cage=0.39828, rolling_element=4.7135
)
CWRU_FAN_END_6203 = dict(
    n=8, d=0.2656, D=1.122, inner=4.9469, outer=3.0530, cage=0.3817, rolling_element=3.9874
)


# ------------------------------------------------------------------ order bands


def test_order_band_is_order_times_speed_range():
    # closed form f = n N (common practice), arrays broadcast
    low, high = ex.order_band([1.0, 2.0, 7.0], 900 * RPM, 1780 * RPM)
    np.testing.assert_allclose(low, [15.0, 30.0, 105.0])
    np.testing.assert_allclose(high, np.array([1.0, 2.0, 7.0]) * 1780 / 60)


def test_order_band_of_plain_numbers_is_the_array_result_bit_for_bit():
    # closed form f = n N (common practice): the scalar path multiplies the same doubles
    for order, lo, hi in ((1, 900 * RPM, 1780 * RPM), (2.5, 0.0, 0.0), (np.float64(7), 10, 10.5)):
        low, high = ex.order_band(order, lo, hi)
        assert type(low) is np.float64 and type(high) is np.float64
        assert (low, high) == (float(order) * float(lo), float(order) * float(hi))
        arrays = ex.order_band(np.array([order], float), np.array([lo], float), hi)
        assert (low, high) == (arrays[0][0], arrays[1][0])
    with pytest.raises(ValueError, match=r"^order must not be negative, got inf$"):
        ex.order_band(math.inf, 10.0, 20.0)


def test_order_band_rejects_a_speed_range_making_the_band_negative():
    with pytest.raises(ValueError, match=r"^minimum speed must not be negative, got -10 Hz$"):
        ex.order_band(1.0, -10.0, 20.0)
    with pytest.raises(ValueError, match=r"^order must not be negative, got -2$"):
        ex.order_band(-2.0, 10.0, 20.0)
    with pytest.raises(
        ValueError, match=r"^speed range is reversed: minimum 30 Hz is above maximum 20 Hz$"
    ):
        ex.order_band(1.0, 30.0, 20.0)
    with pytest.raises(ValueError, match=r"^maximum speed must not be negative, got nan Hz$"):
        ex.order_band(1.0, 10.0, float("nan"))


# ------------------------------------------------------------------ bearings


def test_bearing_6205_matches_formula_values_and_open_data_set():
    # REFERENCES.md [D]: formula values 3.5848, 5.4152, 0.3983, 2.3567 (4 decimals:
    # tolerance 5e-5). The data set lists cage 0.39828 and "rolling element" 4.7135,
    # which is 2 x BSF (a ball defect strikes both races); its 4-digit figures come
    # from the same rounded inch dimensions, so agreement to 1e-4 is expected.
    b = CWRU_DRIVE_END_6205
    o = ex.bearing_defect_orders(b["n"], b["d"] * INCH, b["D"] * INCH)
    assert o.outer_race == pytest.approx(3.5848, abs=5e-5)
    assert o.inner_race == pytest.approx(5.4152, abs=5e-5)
    assert o.cage == pytest.approx(0.3983, abs=5e-5)
    assert o.ball_spin == pytest.approx(2.3567, abs=5e-5)
    assert o.outer_race == pytest.approx(b["outer"], abs=1e-4)
    assert o.inner_race == pytest.approx(b["inner"], abs=1e-4)
    assert o.cage == pytest.approx(b["cage"], abs=1e-4)
    assert o.ball_defect == pytest.approx(b["rolling_element"], abs=1e-4)


def test_bearing_6203_matches_open_data_set():
    # Same data set, fan-end bearing. The published figures carry the rounding of the
    # inch dimensions: half a unit in d (5e-5 in) moves BPFO and BPFI by
    # n/2 x 5e-5 / 1.122 = 1.8e-4, the cage by 2e-5 and 2 BSF = D/d - d/D by 8.4e-4.
    # Tolerances are set to those sensitivities.
    b = CWRU_FAN_END_6203
    o = ex.bearing_defect_orders(b["n"], b["d"] * INCH, b["D"] * INCH)
    assert o.outer_race == pytest.approx(b["outer"], abs=2e-4)
    assert o.inner_race == pytest.approx(b["inner"], abs=2e-4)
    assert o.cage == pytest.approx(b["cage"], abs=1e-4)
    assert o.ball_defect == pytest.approx(b["rolling_element"], abs=9e-4)


def test_bearing_contact_angle_acts_through_d_cos_phi():
    # [D] from the rolling kinematics: the race and cage frequencies depend on
    # d cos(phi) / D only, and BSF = D/(2d) (1 - (d cos phi / D)^2).
    n, d, pd, phi = 12, 0.012, 0.06, math.radians(40)
    tilted = ex.bearing_defect_orders(n, d, pd, phi)
    flat = ex.bearing_defect_orders(n, d * math.cos(phi), pd)
    assert tilted.outer_race == pytest.approx(flat.outer_race, rel=1e-14)
    assert tilted.inner_race == pytest.approx(flat.inner_race, rel=1e-14)
    assert tilted.cage == pytest.approx(flat.cage, rel=1e-14)
    c = d * math.cos(phi) / pd
    assert tilted.ball_spin == pytest.approx(pd / (2 * d) * (1 - c * c), rel=1e-14)
    # identities of the formulas: BPFO + BPFI = n, BPFO = n FTF
    assert tilted.outer_race + tilted.inner_race == pytest.approx(n, rel=1e-14)
    assert tilted.outer_race == pytest.approx(n * tilted.cage, rel=1e-14)


def test_bearing_orders_broadcast_over_arrays():
    o = ex.bearing_defect_orders([8, 9], 0.3126 * INCH, 1.537 * INCH)
    assert o.outer_race.shape == (2,)
    assert o.outer_race[1] == pytest.approx(3.5848, abs=5e-5)


@pytest.mark.parametrize(
    "args, message",
    [
        ((0, 0.01, 0.05), r"^ball count must be a positive whole number, got 0$"),
        ((8.5, 0.01, 0.05), r"^ball count must be a positive whole number, got 8.5$"),
        ((8, -0.01, 0.05), r"^ball diameter must be positive, got -0.01 m$"),
        ((8, 0.06, 0.05), r"^ball diameter 0.06 m must be smaller than the pitch diameter 0.05 m$"),
        ((8, 0.01, 0.05, 2.0), r"^contact angle must be from 0 up to pi/2 rad, got 2 rad$"),
    ],
)
def test_bad_bearing_geometry_is_rejected(args, message):
    with pytest.raises(ValueError, match=message):
        ex.bearing_defect_orders(*args)


# ------------------------------------------------------------ other sources


def test_gear_blade_and_belt_frequencies():
    # common practice: mesh = teeth x shaft speed; blade pass = blades x shaft speed;
    # belt = pi D N / L_belt (closed forms, exact arithmetic)
    assert ex.gear_mesh_frequency(23, 1480 * RPM) == pytest.approx(23 * 1480 / 60, rel=1e-15)
    assert ex.blade_pass_frequency(7, 1780 * RPM) == pytest.approx(207.6667, abs=1e-4)
    f = ex.belt_pass_frequency(0.2, 1480 * RPM, 1.6)
    assert f == pytest.approx(math.pi * 0.2 * 1480 / 60 / 1.6, rel=1e-15)
    assert f == pytest.approx(9.6866, abs=1e-4)
    # the same belt seen from the other pulley (0.4 m, half the speed) gives the same f
    assert ex.belt_pass_frequency(0.4, 740 * RPM, 1.6) == pytest.approx(f, rel=1e-14)
    with pytest.raises(ValueError, match=r"^tooth count must be a positive whole number, got 0$"):
        ex.gear_mesh_frequency(0, 10.0)
    with pytest.raises(ValueError, match=r"^shaft speed must not be negative, got -5 Hz$"):
        ex.blade_pass_frequency(5, -5.0)
    with pytest.raises(ValueError, match=r"^belt length must be positive, got 0 m$"):
        ex.belt_pass_frequency(0.2, 10.0, 0.0)


def test_electric_machine_frequencies():
    # twice line frequency, 100 / 120 Hz (common practice); synchronous speed
    # 2 f / p: 1500 rpm for 4 poles on 50 Hz, 3600 rpm for 2 poles on 60 Hz (IEC 60034-1,
    # from memory); slip and pole pass for a 4-pole 60 Hz motor at 1780 rpm:
    # slip 20 rpm = 1/3 Hz, pole pass 4/3 Hz [D].
    np.testing.assert_allclose(ex.twice_line_frequency([50.0, 60.0]), [100.0, 120.0])
    assert ex.synchronous_speed(50.0, 4) * 60 == pytest.approx(1500.0, rel=1e-15)
    assert ex.synchronous_speed(60.0, 2) * 60 == pytest.approx(3600.0, rel=1e-15)
    assert ex.slip_frequency(60.0, 4, 1780 * RPM) == pytest.approx(1 / 3, rel=1e-12)
    assert ex.pole_pass_frequency(60.0, 4, 1780 * RPM) == pytest.approx(4 / 3, rel=1e-12)
    with pytest.raises(ValueError, match=r"^pole count must be even, got 3$"):
        ex.synchronous_speed(50.0, 3)
    with pytest.raises(ValueError, match=r"^line frequency must be positive, got 0 Hz$"):
        ex.twice_line_frequency(0.0)


def test_drive_fed_motor_against_the_synchronous_speed_definition():
    # Definition (IEC 60034-1, from memory): synchronous speed n_s = f / (pole pairs), so a
    # drive that runs a p-pole motor at N rev/s outputs f = (p / 2) N, and the magnetic pull,
    # which peaks twice an electrical cycle, forces at 2 f = p N. Pole pairs written out
    # here independently of the code: 4 poles -> 2 pairs, 1500 rpm = 25 rev/s -> 50 Hz.
    for poles, rpm, output in ((2, 3600, 60.0), (4, 1500, 50.0), (6, 1000, 50.0),
                               (8, 900, 60.0), (4, 1800, 60.0)):
        pairs = poles // 2
        assert ex.drive_output_frequency(poles, rpm * RPM) == pytest.approx(output, rel=1e-14)
        assert ex.drive_output_frequency(poles, rpm * RPM) == pytest.approx(
            pairs * rpm / 60, rel=1e-14)
        # the inverse of synchronous_speed on every pole count
        assert ex.drive_output_frequency(poles, ex.synchronous_speed(output, poles)) == \
            pytest.approx(output, rel=1e-14)
    # the reproduction: a 4-pole motor from 900 to 1480 rpm -> 60.0-98.67 Hz [D]
    np.testing.assert_allclose(ex.drive_fed_magnetic_frequency(4, np.array([900, 1480]) * RPM),
                               [60.0, 4 * 1480 / 60], rtol=1e-14)
    # at base speed it meets twice line frequency: 4 poles at 1500 rpm on a 50 Hz drive
    assert ex.drive_fed_magnetic_frequency(4, 1500 * RPM) == pytest.approx(
        float(ex.twice_line_frequency(50.0)), rel=1e-14)
    with pytest.raises(ValueError, match=r"^pole count must be even, got 5$"):
        ex.drive_fed_magnetic_frequency(5, 10.0)
    with pytest.raises(ValueError, match=r"^shaft speed must not be negative, got -1 Hz$"):
        ex.drive_output_frequency(4, -1.0)


def test_drive_fed_magnetic_forcing_by_fft_of_the_air_gap_pull():
    # Independent numerical check: the radial magnetic pull at a point of the air gap goes
    # as B^2 (Maxwell stress, B^2 / (2 mu_0)), with the field a wave of p / 2 pole pairs
    # turning at the drive's output frequency, B = B0 cos((p / 2) theta - 2 pi f t). Its
    # spectrum at fixed theta has one line (besides the mean) at 2 f; it must sit at p N.
    poles, speed = 4, 1200 * RPM
    f_out = 0.5 * poles * speed  # the definition, n_s = f / pole pairs
    rate, seconds = 4096.0, 4.0
    t = np.arange(int(rate * seconds)) / rate
    pull = np.cos(0.3 * poles / 2 - 2 * np.pi * f_out * t) ** 2
    spectrum = np.abs(np.fft.rfft(pull - pull.mean()))
    peak = np.fft.rfftfreq(t.size, 1 / rate)[np.argmax(spectrum)]
    # bin width 0.25 Hz: the line lands on a bin, so the peak is exact to half a bin
    assert peak == pytest.approx(float(ex.drive_fed_magnetic_frequency(poles, speed)), abs=0.125)
    assert peak == pytest.approx(80.0, abs=0.125)


def test_inverter_torque_harmonics_from_the_six_pulse_current_harmonics():
    # From memory (six-step inverter theory, e.g. Bose, Modern Power Electronics and AC
    # Drives, ch. 5): a six-pulse bridge's output currents carry harmonics 6k -+ 1 (5, 7, 11,
    # 13, ...); the 6k - 1 harmonic turns backwards, the 6k + 1 forwards, and each beats
    # with the fundamental's field at 6k times the output frequency. Derived here from that
    # statement for k = 1, 2 and held against the constant the code uses.
    derived = []
    for k in (1, 2):
        backward, forward = 6 * k - 1, 6 * k + 1
        assert {backward + 1, forward - 1} == {6 * k}  # relative speed to the fundamental
        derived.append(6 * k)
    assert tuple(derived) == ex.INVERTER_TORQUE_HARMONICS


def test_reciprocating_machines():
    # common practice: four-stroke cylinders x rpm / 120, two-stroke cylinders x rpm / 60;
    # single-acting compressor cylinders x rpm / 60, double-acting twice that.
    assert ex.firing_frequency(6, 1800 * RPM) == pytest.approx(6 * 1800 / 120, rel=1e-15)
    assert ex.firing_frequency(2, 600 * RPM, strokes=2) == pytest.approx(20.0, rel=1e-15)
    assert ex.compressor_pulsation_frequency(3, 900 * RPM) == pytest.approx(45.0, rel=1e-15)
    assert ex.compressor_pulsation_frequency(3, 900 * RPM, double_acting=True) == pytest.approx(
        90.0
    )
    with pytest.raises(ValueError, match=r"^strokes must be 2 or 4, got 3$"):
        ex.firing_frequency(4, 10.0, strokes=3)


def test_engine_orders_half_orders_for_four_stroke():
    # common practice: four-stroke engines excite every half order, the firing order
    # is cylinders / 2 (a 6-cylinder four-stroke fires at 3x); two-stroke: integer
    # orders, firing order = cylinders.
    four = ex.engine_excitation_orders(6, 4, 9.0)
    np.testing.assert_allclose(four.orders, np.arange(1, 19) * 0.5)
    np.testing.assert_allclose(four.firing_orders, [3.0, 6.0, 9.0])
    # the firing frequency is the first firing order times shaft speed
    speed = 1500 * RPM
    assert four.firing_orders[0] * speed == pytest.approx(ex.firing_frequency(6, speed))
    two = ex.engine_excitation_orders(3, 2, 10.0)
    np.testing.assert_allclose(two.orders, np.arange(1, 11))
    np.testing.assert_allclose(two.firing_orders, [3.0, 6.0, 9.0])
    # a single-cylinder four-stroke fires at half order
    np.testing.assert_allclose(
        ex.engine_excitation_orders(1, 4, 1.5).firing_orders, [0.5, 1.0, 1.5]
    )

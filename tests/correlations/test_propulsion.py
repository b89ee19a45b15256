"""Self-propulsion formulas of the 1978 ITTC method, each against a hand calculation written out.

Procedures: ITTC 7.5-02-03-01.4 "1978 ITTC Performance Prediction Method" Rev 04 (2017) and
ITTC 7.5-02-03-01.1 "Propulsion/Bollard Pull Test" Rev 04 (2011). The procedures' own "Test
Example" (section 2.8/2.9 of 7.5-02-03-01.4) could not be read: the stored copies found by the
search tool give only the contents pages (pdfcoffee.com "ITTC1978 Speed Prediction", scribd
copies of Rev 00), so each formula is checked against a hand calculation instead, with the
numbers written out beside it.
"""

import math

import numpy as np
import pytest

from similitude.correlations.propulsion import (
    delivered_power,
    friction_correction_force,
    hull_efficiency,
    propeller_loading,
    resistance_at_test_temperature,
    thrust_coefficient,
    thrust_deduction,
    torque_coefficient,
    wake_fraction,
)
from similitude.errors import InputError


def test_revised_friction_correction_hand_value():
    # ITTC 7.5-02-03-01.4 Rev 04 (2017) / 7.5-02-03-01.1 Rev 04 (2011), revised form:
    # F_D = 0.5 rho V^2 S [(1+k) C_FM - ((1+k) C_FS + dC_F) - C_A - C_AAS]
    # = 0.5 * 998.2 * 2.0^2 * 3.0 * [1.15*3.2e-3 - (1.15*1.5e-3 + 0.12e-3) - 0.40e-3 - 0.10e-3]
    # = 5989.2 * [3.68e-3 - 1.845e-3 - 0.5e-3] = 5989.2 * 1.335e-3 = 7.995582 N
    f = friction_correction_force(998.2, 2.0, 3.0, 3.2e-3, 1.5e-3, 0.15, 0.12e-3, 0.40e-3,
                                  0.10e-3)
    assert f == pytest.approx(7.995582, rel=1e-12)


def test_1978_friction_correction_hand_value():
    # ITTC 7.5-02-03-01.4 Rev 00 (1999), original form: F_D = 0.5 rho V^2 S [(1+k)(C_FM - C_FS)
    # - dC_F] = 5989.2 * [1.15 * 1.7e-3 - 0.12e-3] = 5989.2 * 1.835e-3 = 10.990182 N
    # (C_A and C_AAS are not part of this form)
    f = friction_correction_force(998.2, 2.0, 3.0, 3.2e-3, 1.5e-3, 0.15, 0.12e-3, 0.40e-3,
                                  0.10e-3, form="1978")
    assert f == pytest.approx(10.990182, rel=1e-12)


def test_revised_friction_correction_is_the_model_minus_ship_coefficient():
    # F_D = 0.5 rho V^2 S (C_TM - C_TS) with C_TM = (1+k) C_FM + C_R and the revised C_TS with
    # bilge keels: ((S+S_BK)/S)((1+k) C_FS + dC_F) + C_A + C_R + C_AAS; C_R cancels.
    k, cfm, cfs, dcf, ca, caas, bk, cr = 0.2, 3.4e-3, 1.6e-3, 0.1e-3, 0.3e-3, 0.08e-3, 1.02, 1e-3
    ctm = (1 + k) * cfm + cr
    cts = bk * ((1 + k) * cfs + dcf) + ca + cr + caas
    f = friction_correction_force(1000.0, 1.5, 2.0, cfm, cfs, k, dcf, ca, caas, bk)
    assert f == pytest.approx(0.5 * 1000.0 * 1.5**2 * 2.0 * (ctm - cts), rel=1e-12)


def test_unknown_friction_correction_form_is_refused():
    with pytest.raises(InputError, match="revised, 1978"):
        friction_correction_force(1000.0, 1.0, 1.0, 3e-3, 1.5e-3, 0.1, 0.0, form="2011")


def test_resistance_at_the_self_propulsion_temperature_hand_value():
    # ITTC 7.5-02-03-01.4 Rev 04 (2017): R_C = R_TM [(1+k) C_FMC + C_R] / [(1+k) C_FM + C_R]
    # = 40 * (1.2*3.3e-3 + 1.0e-3)/(1.2*3.2e-3 + 1.0e-3) = 40 * 4.96e-3/4.84e-3 = 40.991736 N
    assert resistance_at_test_temperature(40.0, 3.2e-3, 3.3e-3, 1.0e-3, 0.2) == pytest.approx(
        40.0 * 4.96e-3 / 4.84e-3, rel=1e-12)


def test_thrust_and_torque_coefficients_hand_values():
    # ITTC Symbols (2017): K_T = T/(rho n^2 D^4) = 30/(1000 * 10^2 * 0.2^4) = 30/160 = 0.1875;
    # K_Q = Q/(rho n^2 D^5) = 1.2/(1000 * 100 * 0.00032) = 1.2/32 = 0.0375
    assert thrust_coefficient(30.0, 1000.0, 10.0, 0.2) == pytest.approx(0.1875, rel=1e-12)
    assert torque_coefficient(1.2, 1000.0, 10.0, 0.2) == pytest.approx(0.0375, rel=1e-12)


def test_wake_fraction_hand_value():
    # ITTC 7.5-02-03-01.4: w_TM = 1 - J n D / V = 1 - 0.6 * 10 * 0.2 / 1.6 = 1 - 0.75 = 0.25
    assert wake_fraction(0.6, 10.0, 0.2, 1.6) == pytest.approx(0.25, rel=1e-12)


def test_thrust_deduction_hand_value():
    # ITTC 7.5-02-03-01.4: t = (T_M + F_D - R_C)/T_M = (30 + 6 - 31)/30 = 1/6
    assert thrust_deduction(30.0, 6.0, 31.0) == pytest.approx(1.0 / 6.0, rel=1e-12)


def test_hull_efficiency_hand_value():
    # eta_H = (1 - t)/(1 - w) = 0.83/0.75 = 1.106667
    assert hull_efficiency(0.17, 0.25) == pytest.approx(0.83 / 0.75, rel=1e-12)


def test_propeller_loading_hand_value():
    # ITTC 7.5-02-03-01.4 Rev 04 (2017): K_T/J^2 = S C_TS / (2 D^2 (1-t)(1-w_TS)^2)
    # = 1450 * 2.8e-3 / (2 * 4.2^2 * 0.83 * 0.8^2) = 4.06 / (35.28 * 0.83 * 0.64) = 0.216638
    assert propeller_loading(1450.0, 4.2, 2.8e-3, 0.17, 0.2) == pytest.approx(
        4.06 / (35.28 * 0.83 * 0.64), rel=1e-12)


def test_twin_screw_loading_is_half_the_single_screw_loading():
    # each of two propellers carries half the thrust (ITTC 7.5-02-03-01.4, twin-screw extension)
    one = propeller_loading(1450.0, 4.2, 2.8e-3, 0.17, 0.2)
    assert propeller_loading(1450.0, 4.2, 2.8e-3, 0.17, 0.2, propellers=2) == pytest.approx(
        one / 2, rel=1e-12)


def test_delivered_power_hand_value():
    # ITTC 7.5-02-03-01.4: P_D = 2 pi rho D^5 n^3 K_Q / eta_R
    # = 2 pi * 1026 * 4.2^5 * 2.0^3 * 0.03 / 1.02 = 2 pi * 1026 * 1306.91232 * 8 * 0.03/1.02
    hand = 2 * math.pi * 1026.0 * 1306.91232 * 8.0 * 0.03 / 1.02
    assert delivered_power(1026.0, 4.2, 2.0, 0.03, 1.02) == pytest.approx(hand, rel=1e-12)
    assert delivered_power(1026.0, 4.2, 2.0, 0.03, 1.02, propellers=2) == pytest.approx(
        2 * hand, rel=1e-12)


def test_formulas_broadcast_over_samples_and_runs():
    # a (samples, runs) array in, the same shape out, each element as the scalar call
    t = np.array([[30.0, 20.0], [31.0, 21.0]])
    got = thrust_deduction(t, 6.0, np.array([31.0, 22.0]))
    assert got.shape == (2, 2)
    assert got[1, 0] == pytest.approx(thrust_deduction(31.0, 6.0, 31.0))

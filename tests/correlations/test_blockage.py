"""Blockage corrections: each against a hand calculation from its published form."""

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from similitude.correlations.blockage import (
    TANK_BLOCKAGE_METHODS,
    WIND_TUNNEL_METHODS,
    airfoil_blockage_2d,
    tank_speed_correction,
    wind_tunnel_blockage,
)
from similitude.errors import InputError


def test_method_names_are_published_methods():
    # ITTC 7.5-02-02-01 Rev 03 (2011) §3.6.3 lists Schuster and Tamura (among others)
    assert TANK_BLOCKAGE_METHODS == ("schuster", "tamura")
    assert WIND_TUNNEL_METHODS == ("thom_pope", "maskell")


def test_schuster_at_rest_is_the_continuity_increment():
    # Schuster (1955/56) at Fh = 0: m / (1 - m) = 0.01 / 0.99 = 0.01010101
    assert tank_speed_correction(0.01, 0.0) == pytest.approx(0.01010101, rel=1e-6)


def test_schuster_hand_value_with_wave_term():
    # Schuster (1955/56): 0.004 / (1 - 0.004 - 0.3^2) + (1 - 0.8)(2/3)0.3^10
    # = 0.004 / 0.906 + 0.2 * 0.6666667 * 5.9049e-6 = 4.415011e-3 + 7.8732e-7 = 4.415798e-3
    dv = tank_speed_correction(0.004, 0.3, viscous_fraction=0.8)
    assert dv == pytest.approx(4.415798e-3, rel=1e-6)


def test_schuster_without_viscous_fraction_takes_the_upper_bound():
    # Omitting R_V/R_T uses the wave term at (1 - 0) = 1: never below a given fraction
    assert tank_speed_correction(0.004, 0.7) > tank_speed_correction(0.004, 0.7,
                                                                     viscous_fraction=0.6)


def test_tamura_hand_value():
    # Tamura (1972): 0.67 * 0.01 * 6^0.75 / (1 - 0.4^2); 6^0.75 = 3.833659
    # -> 0.0256855 / 0.84 = 0.0305780
    dv = tank_speed_correction(0.01, 0.4, method="tamura", length_over_width=6.0)
    assert dv == pytest.approx(0.0305780, rel=1e-5)


def test_tank_correction_is_vectorised():
    dv = tank_speed_correction(np.array([0.002, 0.004]), np.array([0.1, 0.2]))
    assert dv.shape == (2,)
    # Schuster first element: 0.002/(1 - 0.002 - 0.01) + (2/3) 1e-10 = 2.0242915e-3
    assert dv[0] == pytest.approx(2.0242915e-3, rel=1e-6)


@given(st.floats(min_value=1e-4, max_value=0.05), st.floats(min_value=0.0, max_value=0.8),
       st.floats(min_value=1e-3, max_value=0.1))
def test_schuster_grows_with_depth_froude_number(m, fh, dfh):
    # Property of Schuster's form: both terms increase with Fh below critical flow
    assert tank_speed_correction(m, fh + dfh) > tank_speed_correction(m, fh)


def test_critical_flow_is_refused():
    # Schuster's denominator 1 - m - Fh^2 vanishes at critical flow
    with pytest.raises(InputError, match="depth_froude"):
        tank_speed_correction(0.01, 0.995)
    with pytest.raises(InputError, match="depth_froude"):
        tank_speed_correction(0.01, 1.0, method="tamura", length_over_width=6.0)


def test_tamura_needs_length_over_width():
    with pytest.raises(InputError, match="length_over_width"):
        tank_speed_correction(0.01, 0.3, method="tamura")


def test_bad_blockage_ratio_and_method_are_refused():
    with pytest.raises(InputError, match="blockage_ratio"):
        tank_speed_correction(1.2, 0.3)
    with pytest.raises(InputError, match="blockage_ratio"):
        tank_speed_correction(-0.1, 0.3)
    with pytest.raises(ValueError, match="schuster, tamura"):
        tank_speed_correction(0.01, 0.3, method="scott")


def test_thom_pope_hand_value():
    # Barlow, Rae & Pope (1999) ch. 10: eps_sb = K tau1 V / C^1.5, eps_wb = S/(4C) C_D
    # K tau1 = 0.96 * 0.86 = 0.8256; eps_sb = 0.8256 * 0.01 / 2^1.5 = 0.008256/2.828427
    # = 2.918937e-3; eps_wb = 0.05 / 8 * 0.3 = 1.875e-3; q ratio = (1.004793937)^2
    b = wind_tunnel_blockage(0.01, 0.05, 2.0, 0.3)
    assert b.solid == pytest.approx(2.918937e-3, rel=1e-6)
    assert b.wake == pytest.approx(1.875e-3, rel=1e-12)
    assert b.total == pytest.approx(4.793937e-3, rel=1e-6)
    assert b.dynamic_pressure_ratio == pytest.approx(1.004793937**2, rel=1e-9)


def test_thom_pope_uses_given_shape_factors():
    # Same formula with K = 1, tau1 = 1: 0.01 / 2.828427 = 3.535534e-3
    b = wind_tunnel_blockage(0.01, 0.05, 2.0, 0.0, shape_factor=1.0, tunnel_factor=1.0)
    assert b.solid == pytest.approx(3.535534e-3, rel=1e-6)
    assert b.wake == 0.0


def test_maskell_bluff_body_hand_value():
    # Maskell (1963): q_c/q_u = 1 + 2.5 * C_D * S / C = 1 + 2.5 * 1.0 * 0.025 = 1.0625
    b = wind_tunnel_blockage(0.01, 0.05, 2.0, 1.0, method="maskell")
    assert b.dynamic_pressure_ratio == pytest.approx(1.0625, rel=1e-12)
    assert b.total == pytest.approx(np.sqrt(1.0625) - 1.0, rel=1e-12)


def test_open_jet_is_refused_with_the_reason():
    # Barlow, Rae & Pope (1999) ch. 10: open-jet blockage is small and of opposite sign
    with pytest.raises(InputError, match="opposite sign"):
        wind_tunnel_blockage(0.01, 0.05, 2.0, 0.3, test_section="open")


def test_model_larger_than_the_test_section_is_refused():
    with pytest.raises(InputError, match="frontal_area"):
        wind_tunnel_blockage(0.01, 3.0, 2.0, 0.3)


def test_allen_vincenti_hand_values():
    # Allen & Vincenti (1944), NACA Rep. 782: sigma = (pi^2/48)(c/h)^2
    # c/h = 0.3: sigma = 0.2056167 * 0.09 = 0.01850551; eps_sb = 0.25 sigma = 4.626377e-3;
    # eps_wb = 0.3/2 * 0.01 = 1.5e-3; c_l factor = 1 - sigma - 2 eps = 0.9692417
    b = airfoil_blockage_2d(0.3, 1.0, 0.01, 0.25)
    assert b.sigma == pytest.approx(0.01850551, rel=1e-6)
    assert b.solid == pytest.approx(4.626377e-3, rel=1e-6)
    assert b.wake == pytest.approx(1.5e-3, rel=1e-12)
    assert b.lift_factor == pytest.approx(0.9692417, rel=1e-6)
    # c_d factor = 1 - 3 * 4.626377e-3 - 2 * 1.5e-3 = 0.9831209
    assert b.drag_factor == pytest.approx(0.9831209, rel=1e-6)

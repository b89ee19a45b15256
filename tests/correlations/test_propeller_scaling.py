"""ITTC-1978 propeller open-water scale correction (ITTC 7.5-02-03-01.4 Rev 04, 2017, §2.4):
hand calculations from the published forms, and signs."""

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from similitude.correlations.propeller_scaling import (
    DEFAULT_BLADE_ROUGHNESS,
    blade_drag_full_scale,
    blade_drag_model,
    chord_reynolds_075,
    open_water_efficiency,
    open_water_full_scale,
)
from similitude.errors import InputError


def test_model_blade_drag_hand_value():
    # C_DM = 2(1 + 2 t/c)[0.044 Re^-1/6 - 5 Re^-2/3], t/c = 0.04, Re_co = 5e5:
    # Re^(1/6) = 8.908987, Re^(2/3) = 6299.605 -> bracket 4.938833e-3 - 7.937005e-4
    # = 4.145132e-3; times 2 * 1.08 = 8.953486e-3
    assert blade_drag_model(0.04, 5e5) == pytest.approx(8.953486e-3, rel=1e-6)


def test_full_scale_blade_drag_hand_value():
    # C_DS = 2(1 + 2 t/c)(1.89 + 1.62 log10(c/k_p))^-2.5, c = 1.5 m, k_p = 30e-6 m:
    # log10(50000) = 4.698970 -> 1.89 + 7.612331 = 9.502331; ^-2.5 = 3.592730e-3
    # times 2.16 = 7.760297e-3
    assert DEFAULT_BLADE_ROUGHNESS == 30e-6
    assert blade_drag_full_scale(0.04, 1.5) == pytest.approx(7.760297e-3, rel=1e-6)


def test_open_water_correction_hand_value():
    # dC_D = 8.953486e-3 - 7.760297e-3 = 1.193189e-3; c Z / D = 0.35 * 4 = 1.4; P/D = 1.0
    # dK_T = -dC_D * 0.3 * 1.0 * 1.4 = -5.011394e-4 -> K_TS = 0.3 + 5.011394e-4
    # dK_Q =  dC_D * 0.25 * 1.4      =  4.176162e-4 -> K_QS = 0.04 - 4.176162e-4
    kts, kqs = open_water_full_scale(0.3, 0.3, 0.04, 1.0, 0.35, 4, 0.04, 5e5, chord_075=1.5)
    assert kts == pytest.approx(0.3 + 5.011394e-4, rel=1e-8)
    assert kqs == pytest.approx(0.04 - 4.176162e-4, rel=1e-7)


def test_smoother_full_scale_blades_raise_thrust_and_efficiency():
    # Sign of the ITTC-78 correction when C_DM > C_DS: K_T up, K_Q down, eta_0 up
    J = np.linspace(0.1, 0.8, 8)
    kt = 0.45 * (1 - J / 1.0)
    kq = 0.06 * (1 - J / 1.2)
    kts, kqs = open_water_full_scale(J, kt, kq, 1.0, 0.35, 4, 0.04, 5e5, chord_075=1.5)
    assert np.all(kts > kt) and np.all(kqs < kq)
    assert np.all(open_water_efficiency(J, kts, kqs) > open_water_efficiency(J, kt, kq))


def test_open_water_efficiency_hand_value():
    # eta_0 = J K_T / (2 pi K_Q) = 0.6 * 0.15 / (2 pi * 0.025) = 0.09 / 0.1570796 = 0.5729578
    assert open_water_efficiency(0.6, 0.15, 0.025) == pytest.approx(0.5729578, rel=1e-6)


@given(st.floats(min_value=2e5, max_value=5e6))
def test_model_blade_drag_falls_with_reynolds(re):
    # Turbulent part 0.044 Re^-1/6 dominates above 2e5: C_DM decreases with Re
    assert blade_drag_model(0.05, re * 1.1) < blade_drag_model(0.05, re)


def test_missing_full_scale_chord_is_refused():
    with pytest.raises(InputError, match="chord_075"):
        open_water_full_scale(0.3, 0.3, 0.04, 1.0, 0.35, 4, 0.04, 5e5)


def test_bad_inputs_name_the_field():
    with pytest.raises(InputError, match="reynolds_chord"):
        blade_drag_model(0.04, 0.0)
    with pytest.raises(InputError, match="KQ"):
        open_water_efficiency(0.5, 0.2, 0.0)


def test_chord_reynolds_hand_value():
    # Re_co = c sqrt(V_A^2 + (0.75 pi n D)^2) / nu, c = 0.06 m, V_A = 2 m/s, n = 15 /s,
    # D = 0.25 m: 0.75 pi 15 0.25 = 8.835729 m/s; sqrt(4 + 78.07011) = 9.059256 m/s
    # -> 0.06 * 9.059256 / 1.1386e-6 = 4.773892e5
    assert chord_reynolds_075(0.06, 2.0, 15.0, 0.25, 1.1386e-6) == pytest.approx(4.773892e5,
                                                                                 rel=1e-6)

"""ITTC-1978 performance prediction formulas (ITTC 7.5-02-03-01.4 Rev 04, 2017): each against a
hand calculation from the published form, the project digest's computed examples, and sign
and size checks."""

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st
from iapws import IAPWS95

from similitude.correlations.friction import friction_coefficient
from similitude.correlations.ittc78 import (
    AIR_DENSITY_15C,
    SEA_WATER_DENSITY_15C,
    FormFactorFit,
    air_resistance_coefficient,
    coefficient_from_resistance,
    correlation_allowance,
    effective_power,
    prohaska_fit,
    residuary_coefficient,
    resistance_from_coefficient,
    roughness_allowance,
    ship_total_resistance_coefficient,
    temperature_corrected_ctm,
    wake_fraction_full_scale,
)
from similitude.errors import InputError

# --- temperature correction -------------------------------------------------------------


def test_temperature_correction_hand_value():
    # ITTC 7.5-02-03-01.4: C_TM,15 = C_TM,t + (1+k)(C_FM,15 - C_FM,t)
    # = 4.0e-3 + 1.1 * (3.1e-3 - 3.2e-3) = 4.0e-3 - 0.11e-3 = 3.89e-3
    assert temperature_corrected_ctm(4.0e-3, 3.2e-3, 3.1e-3, 0.1) == pytest.approx(3.89e-3,
                                                                                  rel=1e-12)


def test_colder_tank_gives_lower_corrected_resistance_by_about_two_percent():
    # Oracle: IAPWS-95 (iapws) kinematic viscosity of water at 10 and 15 degC, 1 atm.
    # 5 m model at 2 m/s: Re_10 = 7.655e6, Re_15 = 8.783e6; ITTC-57 C_F 3.1442e-3 vs 3.0688e-3
    nu10 = IAPWS95(T=283.15, P=0.101325).nu
    nu15 = IAPWS95(T=288.15, P=0.101325).nu
    cfm10 = friction_coefficient(2.0 * 5.0 / nu10)
    cfm15 = friction_coefficient(2.0 * 5.0 / nu15)
    assert cfm10 > cfm15  # colder water: higher viscosity, lower Re, larger C_FM
    ctm_t = 1.15 * cfm10 + 0.5e-3
    ctm_15 = temperature_corrected_ctm(ctm_t, cfm10, cfm15, 0.15)
    assert ctm_15 < ctm_t
    # size (hand): 1.15 * (3.0688e-3 - 3.1442e-3) / 4.1159e-3 = -2.11 %
    assert (ctm_15 - ctm_t) / ctm_t == pytest.approx(-0.0211, abs=0.0003)


def test_froude_method_temperature_correction_uses_one():
    # k = 0 (Froude method): plain difference of C_F
    assert temperature_corrected_ctm(4e-3, 3.2e-3, 3.1e-3, 0.0) == pytest.approx(3.9e-3)


# --- roughness and correlation allowances ------------------------------------------------


def test_bowden_davison_digest_example():
    # 1978 ITTC (Bowden & Davison 1974): [105 (150e-6/200)^(1/3) - 0.64]e-3
    # (7.5e-7)^(1/3) = 9.085603e-3 -> 105 * 9.085603e-3 = 0.9539883 -> 0.3139883e-3
    # (digest example, computed there, gives 0.314e-3)
    assert roughness_allowance(200.0) == pytest.approx(0.3139883e-3, rel=1e-6)


def test_townsin_digest_example():
    # Townsin (1985), ITTC 1990: 0.044[(7.5e-7)^(1/3) - 10 (1.5e9)^(-1/3)] + 0.000125
    # (1.5e9)^(-1/3) = 8.735805e-4 -> 0.044 * (9.085603e-3 - 8.735805e-3) + 1.25e-4
    # = 0.044 * 3.49798e-4 + 1.25e-4 = 1.403911e-4 (digest: 0.140e-3)
    dcf = roughness_allowance(200.0, reynolds=1.5e9, method="townsin")
    assert dcf == pytest.approx(1.403911e-4, rel=1e-5)


def test_townsin_needs_reynolds():
    with pytest.raises(InputError, match="reynolds"):
        roughness_allowance(200.0, method="townsin")


def test_rougher_hull_has_larger_allowance():
    # Both forms grow with (k_S/L)^(1/3)
    for method in ("bowden_davison", "townsin"):
        lo = roughness_allowance(200.0, 1.5e9, roughness=100e-6, method=method)
        hi = roughness_allowance(200.0, 1.5e9, roughness=200e-6, method=method)
        assert hi > lo


def test_correlation_allowance_digest_example():
    # ITTC 7.5-02-03-01.4 Rev 04: (5.68 - 0.6 log10 1.5e9)e-3; log10 1.5e9 = 9.1760913
    # -> (5.68 - 5.5056548)e-3 = 0.1743452e-3 (digest: 0.174e-3)
    assert correlation_allowance(200.0, 1.5e9) == pytest.approx(0.1743452e-3, rel=1e-6)


def test_correlation_allowance_can_be_switched_off():
    assert correlation_allowance(200.0, 1.5e9, method="none") == 0.0
    assert correlation_allowance(200.0, np.array([1e9, 2e9]), method="none").shape == (2,)


def test_unknown_allowance_methods_are_refused():
    with pytest.raises(ValueError, match="bowden_davison, townsin"):
        roughness_allowance(200.0, method="grigson")
    with pytest.raises(ValueError, match="ittc2017, none"):
        correlation_allowance(200.0, 1e9, method="tank")


# --- air resistance ----------------------------------------------------------------------


def test_air_resistance_1978_hand_value():
    # 1978 ITTC: C_AAS = 0.001 A_T / S = 0.001 * 500 / 8000 = 6.25e-5
    assert air_resistance_coefficient(500.0, 8000.0, method="1978") == pytest.approx(6.25e-5)


def test_air_resistance_revised_hand_value():
    # ITTC 7.5-02-03-01.4 Rev 04: C_DA rho_A A_VS / (rho_S S)
    # = 0.8 * 1.225 * 500 / (1026.021 * 8000) = 490 / 8208168 = 5.969663e-5
    assert AIR_DENSITY_15C == 1.225 and SEA_WATER_DENSITY_15C == 1026.021
    assert air_resistance_coefficient(500.0, 8000.0) == pytest.approx(5.969663e-5, rel=1e-6)


# --- Prohaska form factor ----------------------------------------------------------------


def _synthetic_runs(k=0.12, y=0.9, exponent=4, n=12):
    # Invented runs: a 6 m model, Fn 0.08..0.30, C_TM built from the Prohaska model itself
    fn = np.linspace(0.08, 0.30, n)
    speed = fn * np.sqrt(9.80665 * 6.0)
    cfm = friction_coefficient(speed * 6.0 / 1.1386e-6)
    ctm = (1 + k) * cfm + y * fn**exponent
    return fn, ctm, cfm


def test_prohaska_recovers_a_known_form_factor_exactly():
    # Prohaska (1966): C_TM/C_FM = (1+k) + y Fn^4/C_FM is linear; noise-free data -> exact k
    fn, ctm, cfm = _synthetic_runs()
    fit = prohaska_fit(fn, ctm, cfm)
    assert isinstance(fit, FormFactorFit)
    assert fit.form_factor == pytest.approx(0.12, abs=1e-10)
    assert fit.slope == pytest.approx(0.9, rel=1e-8)
    assert fit.r_squared == pytest.approx(1.0, abs=1e-12)
    assert fit.froude_range == (0.1, 0.2)
    assert fit.n_points == int(np.sum((fn >= 0.1) & (fn <= 0.2)))
    assert fit.residuals.shape == (fit.n_points,)
    assert np.max(np.abs(fit.residuals)) < 1e-10


def test_prohaska_recovers_k_within_the_noise():
    # 0.3 % (1 sigma) Gaussian noise on C_TM, 40 runs in range: k within +-0.02 of 0.15
    rng = np.random.default_rng(20260101)
    fn = np.linspace(0.1, 0.2, 40)
    speed = fn * np.sqrt(9.80665 * 6.0)
    cfm = friction_coefficient(speed * 6.0 / 1.1386e-6)
    ctm = (1.15 * cfm + 0.7 * fn**4) * (1 + 0.003 * rng.standard_normal(fn.size))
    fit = prohaska_fit(fn, ctm, cfm)
    assert fit.form_factor == pytest.approx(0.15, abs=0.02)
    assert 0.0 < fit.r_squared < 1.0


def test_prohaska_other_exponent():
    # ITTC allows n = 4 to 6
    fn, ctm, cfm = _synthetic_runs(k=0.2, y=20.0, exponent=6)
    fit = prohaska_fit(fn, ctm, cfm, exponent=6, froude_range=(0.08, 0.25))
    assert fit.form_factor == pytest.approx(0.2, abs=1e-10)
    assert fit.exponent == 6


def test_prohaska_with_too_few_runs_names_the_range():
    fn, ctm, cfm = _synthetic_runs(n=4)  # Fn 0.08, 0.153, 0.227, 0.30: one run in range
    with pytest.raises(InputError, match=r"0.1 <= Fn <= 0.2"):
        prohaska_fit(fn, ctm, cfm)


def test_prohaska_refuses_arrays_of_different_length():
    with pytest.raises(InputError, match="lengths"):
        prohaska_fit([0.1, 0.15, 0.2], [4e-3, 4e-3], [3e-3, 3e-3, 3e-3])


# --- residuary and total coefficients ----------------------------------------------------


def test_residuary_coefficient_hand_value():
    # C_R = C_TM - (1+k) C_FM = 4.0e-3 - 1.12 * 3.0e-3 = 0.64e-3
    assert residuary_coefficient(4.0e-3, 3.0e-3, 0.12) == pytest.approx(0.64e-3, rel=1e-12)


def test_ship_total_coefficient_hand_value():
    # ITTC 7.5-02-03-01.4: C_TS = (1+k)C_FS + dC_F + C_A + C_R + C_AAS
    # = 1.12 * 1.5e-3 + 0.14e-3 + 0.17e-3 + 0.64e-3 + 0.06e-3 = 2.69e-3
    cts = ship_total_resistance_coefficient(1.5e-3, 0.12, 0.14e-3, 0.17e-3, 0.64e-3, 0.06e-3)
    assert cts == pytest.approx(2.69e-3, rel=1e-12)


def test_bilge_keels_scale_the_frictional_part_only():
    # (S + S_BK)/S = 8080/8000 = 1.01 on [(1+k)C_FS + dC_F] = 1.82e-3 -> +0.0182e-3
    cts = ship_total_resistance_coefficient(1.5e-3, 0.12, 0.14e-3, 0.17e-3, 0.64e-3, 0.06e-3,
                                            wetted_surface=8000.0, bilge_keel_area=80.0)
    assert cts == pytest.approx(2.69e-3 + 0.0182e-3, rel=1e-12)


@given(st.floats(min_value=0.0, max_value=0.5), st.floats(min_value=2e-3, max_value=8e-3),
       st.floats(min_value=1e-3, max_value=5e-3))
def test_ship_equal_to_model_returns_the_model_coefficient(k, ctm, cfm):
    # Identity of the method: with C_FS = C_FM and no allowances, C_TS = C_TM
    cr = residuary_coefficient(ctm, cfm, k)
    cts = ship_total_resistance_coefficient(cfm, k, 0.0, 0.0, cr, 0.0)
    assert cts == pytest.approx(ctm, rel=1e-12)


def test_froude_method_is_form_factor_zero():
    # Froude method: C_TS = C_FS + (C_TM - C_FM)
    cr = residuary_coefficient(4.0e-3, 3.0e-3, 0.0)
    assert ship_total_resistance_coefficient(1.5e-3, 0.0, 0, 0, cr, 0) == pytest.approx(2.5e-3)


# --- power, resistance, wake --------------------------------------------------------------


def test_effective_power_hand_value():
    # P_E = 0.5 rho S V^3 C_TS = 0.5 * 1026.021 * 8000 * 10^3 * 2e-3 = 8.208168e6 W
    assert effective_power(2e-3, 1026.021, 8000.0, 10.0) == pytest.approx(8.208168e6,
                                                                         rel=1e-12)


def test_resistance_and_coefficient_round_trip():
    # R = 0.5 * 1000 * 2 * 1.5^2 * 4e-3 = 9.0 N
    r = resistance_from_coefficient(4e-3, 1000.0, 2.0, 1.5)
    assert r == pytest.approx(9.0, rel=1e-12)
    assert coefficient_from_resistance(r, 1000.0, 2.0, 1.5) == pytest.approx(4e-3, rel=1e-12)


def test_arrays_broadcast():
    speeds = np.array([5.0, 7.5, 10.0])
    pe = effective_power(np.array([2.2e-3, 2.1e-3, 2.0e-3]), 1026.021, 8000.0, speeds)
    assert pe.shape == (3,)
    assert np.all(np.diff(pe) > 0)


def test_wake_scaling_hand_value():
    # ITTC 7.5-02-03-01.4: w_TS = (t+0.04) + (w_TM - t - 0.04)[(1+k)C_FS + dC_F]/[(1+k)C_FM]
    # ratio = (1.1 * 1.5e-3 + 0.3e-3) / (1.1 * 3e-3) = 1.95e-3 / 3.3e-3 = 0.5909091
    # w_TS = 0.24 + 0.06 * 0.5909091 = 0.2754545
    w = wake_fraction_full_scale(0.3, 0.2, 3e-3, 1.5e-3, 0.1, 0.3e-3)
    assert w == pytest.approx(0.2754545, rel=1e-6)


def test_full_scale_wake_is_smaller_than_model_wake():
    # Thinner relative boundary layer at ship scale (C_FS < C_FM): w_TS < w_TM
    assert wake_fraction_full_scale(0.3, 0.2, 3e-3, 1.5e-3, 0.1, 0.3e-3) < 0.3


def test_negative_speed_is_refused():
    with pytest.raises(InputError, match="speed: got -1"):
        effective_power(2e-3, 1026.0, 8000.0, -1.0)


def test_correlation_allowance_turns_negative_above_re_2_9e9_and_is_flagged():
    # C_A = (5.68 - 0.6 log10 Re) 1e-3 = 0 at log10 Re = 5.68/0.6 = 9.4667, Re = 2.93e9
    from similitude.correlations.ittc78 import NEGATIVE_CA_REYNOLDS, correlation_allowance_note

    assert NEGATIVE_CA_REYNOLDS == pytest.approx(2.9286e9, rel=1e-4)
    assert correlation_allowance(reynolds=NEGATIVE_CA_REYNOLDS) == pytest.approx(0, abs=1e-15)
    re = np.array([1e9, 5e9])
    note = correlation_allowance_note(correlation_allowance(reynolds=re), re)
    assert note is not None and "NEGATIVE CORRELATION ALLOWANCE" in note and "5.00e+09" in note
    assert correlation_allowance_note(correlation_allowance(reynolds=1e9), 1e9) is None

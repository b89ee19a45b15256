"""Air: CIPM-2007 moist-air density, real-gas dry air, viscosity, speed of sound, input handling."""

import importlib

import numpy as np
import pytest
from CoolProp.CoolProp import HAPropsSI, PropsSI
from hypothesis import given, settings
from hypothesis import strategies as st

import fluids_props as fp

air_mod = importlib.import_module("fluids_props.air")

# Dry-air grid of the acceptance range: 0.5-10 bar, 250-330 K.
GRID_T = np.linspace(250.0, 330.0, 9)
GRID_P = np.array([0.5e5, 1e5, 2e5, 5e5, 10e5])


def coolprop_air(output, T, p):
    # CoolProp 'Air' is the Lemmon et al. (2000) pseudo-pure equation of state and the
    # Lemmon & Jacobsen (2004) viscosity: the reference the module is checked against.
    return np.array([[PropsSI(output, "T", t, "P", q, "Air") for q in p] for t in T])


# -- CIPM-2007 ---------------------------------------------------------------------------

def test_moist_air_at_20_degC_50_percent_matches_cipm_2007():
    # 1.19931 kg/m^3: value of the CIPM-2007 equation (Picard et al. 2008, Metrologia 45:149)
    # at 20 degC, 101325 Pa, 50 % RH, x_CO2 = 0.0004, as quoted in the project digest; it was
    # recomputed here from the published equation, not read from the paper.
    assert fp.air("20 degC", "101325 Pa", "50 %").density_si == pytest.approx(1.19931, abs=5e-6)


def test_dry_air_at_15_degC_matches_cipm_2007():
    # 1.22552 kg/m^3: CIPM-2007 (Picard et al. 2008) for dry air at 15 degC, 101325 Pa, as
    # quoted in the project digest and recomputed from the published equation.
    assert fp.air("15 degC").density_si == pytest.approx(1.22552, abs=5e-6)


def test_inside_the_cipm_window_the_published_equation_is_reproduced_exactly():
    # Picard et al. (2008): the equation as published, on its own validity window.
    T = np.linspace(288.15, 300.15, 5)[:, None]
    p = np.linspace(6e4, 1.1e5, 4)[None, :]
    for h in (0.0, 0.3, 0.9):
        got = air_mod.air_si(T, p, h).density_si
        assert np.allclose(got, air_mod.cipm2007_density_si(T, p, h), rtol=1e-12, atol=0)


def test_saturation_vapour_pressure_at_20_degC_is_that_of_iapws_95():
    # IAPWS-95 saturation pressure at 293.15 K is 2339.2 Pa (Wagner & Pruss 2002, via CoolProp);
    # the CIPM-2007 formula (after Davis 1992) agrees to better than 0.05 %.
    ref = PropsSI("P", "T", 293.15, "Q", 0, "Water")
    assert air_mod.saturation_vapour_pressure_si(293.15) == pytest.approx(ref, rel=5e-4)


def test_moist_air_density_agrees_with_the_coolprop_humid_air_model():
    # CoolProp HAPropsSI: humid air after Herrmann, Kretzschmar & Gatley (2009), ASHRAE RP-1485;
    # density = 1 / Vha (volume per kg of humid air). Within 0.05 % from 5 to 60 degC, 0.8 to
    # 3 bar; measured < 4e-5.
    for T, p, h in [(283.15, 1e5, 0.8), (293.15, 101325, 0.5), (303.15, 1e5, 1.0),
                    (313.15, 101325, 0.5), (333.15, 3e5, 0.3), (278.15, 0.8e5, 0.6)]:
        ref = 1.0 / HAPropsSI("Vha", "T", T, "P", p, "R", h)
        assert air_mod.air_si(T, p, h).density_si == pytest.approx(ref, rel=5e-4), (T, p, h)


def test_moist_air_viscosity_agrees_with_the_coolprop_humid_air_model():
    # CoolProp HAPropsSI viscosity of humid air (Herrmann et al. 2009); Wilke mixing here.
    # Measured difference: -0.25 % at 20 degC 50 % RH, -0.8 % at 30 degC saturated.
    for T, p, h in [(293.15, 101325, 0.5), (303.15, 1e5, 1.0), (283.15, 2e5, 0.8)]:
        ref = HAPropsSI("mu", "T", T, "P", p, "R", h)
        assert air_mod.air_si(T, p, h).dynamic_viscosity_si == pytest.approx(ref, rel=0.015)


def test_humidity_lowers_density_at_fixed_temperature_and_pressure():
    # Picard et al. (2008): water vapour (M_v = 18.015 g/mol) displaces heavier dry air.
    dry = fp.air("25 degC", "1 atm", 0).density_si
    wet = fp.air("25 degC", "1 atm", 1).density_si
    assert wet < dry


# -- dry air against the reference equation of state ----------------------------------------

def test_dry_air_density_is_within_0_2_percent_of_the_reference_eos_from_0_5_to_10_bar():
    # Lemmon et al. (2000) via CoolProp 'Air'; acceptance 0.2 %, measured < 2e-5.
    T, p = GRID_T[:, None], GRID_P[None, :]
    got = air_mod.air_si(T, p).density_si
    assert np.max(np.abs(got / coolprop_air("D", GRID_T, GRID_P) - 1)) < 2e-3


def test_dry_air_density_follows_the_reference_eos_over_the_whole_range_to_1e_4():
    # Lemmon et al. (2000) via CoolProp, 200-400 K, 1 kPa-2 MPa (the module's stated range).
    T_all = np.linspace(200.0, 400.0, 9)
    p_all = np.array([1e3, 1e4, 1e5, 1e6, 2e6])
    got = air_mod.air_si(T_all[:, None], p_all[None, :]).density_si
    assert np.max(np.abs(got / coolprop_air("D", T_all, p_all) - 1)) < 1e-4


def test_dry_air_viscosity_is_within_2_percent_of_lemmon_and_jacobsen():
    # Lemmon & Jacobsen (2004) via CoolProp 'Air'; acceptance 2 %, measured < 1e-8 (same law).
    T, p = GRID_T[:, None], GRID_P[None, :]
    got = air_mod.air_si(T, p).dynamic_viscosity_si
    assert np.max(np.abs(got / coolprop_air("V", GRID_T, GRID_P) - 1)) < 0.02


def test_dry_air_viscosity_at_300_K_1_bar():
    # Lemmon & Jacobsen (2004), via CoolProp: 18.54 uPa s at 300 K, 0.1 MPa (rounded here).
    assert fp.air("300 K", "1 bar").dynamic_viscosity_si == pytest.approx(18.54e-6, rel=1e-3)


def test_dry_air_speed_of_sound_is_within_0_5_percent_of_the_reference_eos():
    # Lemmon et al. (2000) via CoolProp 'Air'; acceptance 0.5 %, measured < 1e-6.
    T, p = GRID_T[:, None], GRID_P[None, :]
    got = air_mod.air_si(T, p).speed_of_sound_si
    assert np.max(np.abs(got / coolprop_air("A", GRID_T, GRID_P) - 1)) < 5e-3


def test_ratio_of_specific_heats_is_that_of_the_reference_eos():
    # cp/cv of Lemmon et al. (2000) via CoolProp at 300 K, 10 bar.
    ref = PropsSI("Cpmass", "T", 300, "P", 1e6, "Air") / PropsSI("Cvmass", "T", 300, "P", 1e6,
                                                                "Air")
    got = fp.air("300 K", "10 bar").extra["ratio_of_specific_heats"]
    assert got == pytest.approx(ref, rel=1e-5)


def test_moist_air_ratio_of_specific_heats_agrees_with_the_coolprop_humid_air_model():
    # cp/cv of CoolProp HAPropsSI (Herrmann et al. 2009, ASHRAE RP-1485); measured < 1e-5.
    for T, p, h in [(293.15, 101325, 0.5), (303.15, 1e5, 1.0), (283.15, 2e5, 0.8)]:
        ref = HAPropsSI("Cha", "T", T, "P", p, "R", h) / HAPropsSI("CVha", "T", T, "P", p, "R", h)
        got = air_mod.air_si(T, p, h).extra["ratio_of_specific_heats"]
        assert got == pytest.approx(ref, rel=1e-4)


def test_speed_of_sound_rises_with_humidity_as_an_ideal_gas_mixture():
    # a^2 = gamma R T / M: the ratio wet/dry follows from gamma and the water mole fraction of
    # CoolProp's humid-air model (Herrmann et al. 2009) and the molar masses of CIPM-2007;
    # +0.18 % at 20 degC, 50 % RH.
    T, p, h = 293.15, 101325.0, 0.5
    g_wet = HAPropsSI("Cha", "T", T, "P", p, "R", h) / HAPropsSI("CVha", "T", T, "P", p, "R", h)
    g_dry = HAPropsSI("Cha", "T", T, "P", p, "R", 0) / HAPropsSI("CVha", "T", T, "P", p, "R", 0)
    x_v = HAPropsSI("Y", "T", T, "P", p, "R", h)
    m_dry, m_w = 28.96546e-3, 18.01528e-3
    expected = np.sqrt(g_wet / g_dry * m_dry / ((1 - x_v) * m_dry + x_v * m_w))
    got = air_mod.air_si(T, p, h).speed_of_sound_si / air_mod.air_si(T, p, 0).speed_of_sound_si
    assert got == pytest.approx(expected, rel=2e-5)


# -- ideal-gas limit and vectorisation (property tests) -------------------------------------

@settings(max_examples=40, deadline=None)
@given(T=st.floats(200.0, 400.0))
def test_at_low_pressure_dry_air_is_an_ideal_gas(T):
    # Perfect-gas limit: rho -> p M / (R T) as p -> 0 (any gas; M, R of CIPM-2007). At 1 kPa
    # the second-virial term |B| p / (R T) of air is below 3e-5 from 200 to 400 K.
    p = 1.0e3
    ideal = p * air_mod.molar_mass_dry_air() / (air_mod.R_CIPM * T)
    assert air_mod.air_si(T, p).density_si == pytest.approx(ideal, rel=5e-5)


@settings(max_examples=25, deadline=None)
@given(T=st.lists(st.floats(274.0, 340.0), min_size=1, max_size=6),
       p=st.floats(5e4, 1e6), h=st.floats(0.0, 1.0))
def test_array_evaluation_equals_pointwise_evaluation(T, p, h):
    # Vectorisation must not change the numbers (common practice).
    arr = air_mod.air_si(np.array(T), p, h)
    for i, t in enumerate(T):
        one = air_mod.air_si(t, p, h)
        assert arr.density_si[i] == pytest.approx(one.density_si, rel=1e-12)
        assert arr.speed_of_sound_si[i] == pytest.approx(one.speed_of_sound_si, rel=1e-12)
        assert arr.dynamic_viscosity_si[i] == pytest.approx(one.dynamic_viscosity_si, rel=1e-12)


# -- inputs and errors ----------------------------------------------------------------------

def test_fahrenheit_and_celsius_strings_give_the_same_state():
    # 59 degF = 15 degC exactly (unit definitions, pint).
    a = fp.air("59 degF", "1 atm")
    b = fp.air("15 degC", "101325 Pa")
    assert a.density_si == pytest.approx(b.density_si, rel=1e-12)


def test_bar_strings_are_read_as_pressure():
    # 2 bar = 200 000 Pa (definition of the bar).
    assert fp.air("20 degC", "2 bar").pressure_si == pytest.approx(2e5)


@pytest.mark.parametrize("humidity", ["50 %", "50 percent", 0.5, "0.5"])
def test_relative_humidity_may_be_a_fraction_or_a_percentage(humidity):
    # 50 % = 0.5 (definition of percent, pint).
    ref = air_mod.air_si(293.15, 101325.0, 0.5).density_si
    assert fp.air("20 degC", "101325 Pa", humidity).density_si == pytest.approx(ref, rel=1e-12)


def test_humidity_given_as_a_bare_50_is_refused_with_the_range():
    with pytest.raises(fp.OutOfRangeError, match=r"relative_humidity 50 - is outside .* 0 to 1"):
        fp.air("20 degC", "1 atm", 50)


def test_temperature_outside_the_range_names_quantity_value_and_range():
    with pytest.raises(fp.OutOfRangeError, match=r"temperature 226.85 degC is outside .*air"):
        fp.air("500 K")


def test_pressure_outside_the_range_names_quantity_value_and_range():
    with pytest.raises(fp.OutOfRangeError, match=r"pressure 3e\+06 Pa is outside .*1000 to 2e\+06"):
        fp.air("20 degC", "30 bar")


def test_humidity_below_freezing_is_refused_but_dry_air_is_not():
    # The CIPM-2007 saturation formula is over liquid water.
    assert fp.air("-20 degC").density_si > 0
    with pytest.raises(fp.OutOfRangeError, match="moist air"):
        fp.air("-20 degC", "1 atm", "50 %")


def test_extrapolate_evaluates_outside_the_range():
    assert fp.air("450 K", extrapolate=True).density_si > 0


def test_a_temperature_without_unit_is_refused():
    with pytest.raises(ValueError, match="temperature"):
        fp.air(20)


def test_catalogue_entry_states_ranges_and_evaluates_the_public_function():
    info = fp.get_fluid("air")
    assert info.kind == "gas" and info.evaluate_si is air_mod.air_si
    assert {r.quantity for r in info.ranges} >= {"temperature", "pressure", "relative_humidity"}
    assert info.range_of("temperature").low <= 250.0 and info.range_of("pressure").high >= 1e6


def test_state_carries_gamma_humidity_and_sources():
    s = fp.air("20 degC", "1 atm", "50 %")
    assert s.extra["relative_humidity"] == pytest.approx(0.5)
    assert s.extra["ratio_of_specific_heats"] == pytest.approx(1.40, abs=0.01)
    assert any("CIPM-2007" in src for src in s.sources)
    assert s.kinematic_viscosity_si == pytest.approx(s.dynamic_viscosity_si / s.density_si)

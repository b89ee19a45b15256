"""Test gases: built-in nitrogen against its reference equations, and the CoolProp back-end."""

import importlib
import subprocess
import sys

import numpy as np
import pytest
from CoolProp.CoolProp import PropsSI
from hypothesis import given, settings
from hypothesis import strategies as st

import fluids_props as fp

gases = importlib.import_module("fluids_props.gases")


def gas_grid():
    """Gas-phase states of the acceptance range, 90-320 K and 1-10 bar."""
    pts = []
    for T in np.linspace(90.0, 320.0, 24):
        for p in (1e5, 2e5, 4.5e5, 7e5, 10e5):
            if T < 126.192 and p >= PropsSI("P", "T", T, "Q", 1, "Nitrogen"):
                continue  # liquid: refused by the model, tested below
            pts.append((T, p))
    return np.array(pts).T


def coolprop_n2(output, T, p):
    # CoolProp 'Nitrogen': Span et al. (2000) equation of state, Lemmon & Jacobsen (2004)
    # viscosity, the references the module implements.
    pairs = zip(T, p, strict=True)
    return np.array([PropsSI(output, "T", t, "P", q, "Nitrogen") for t, q in pairs])


# -- nitrogen against the reference equation of state ----------------------------------------

@pytest.mark.parametrize("output, field", [("D", "density_si"),
                                           ("V", "dynamic_viscosity_si"),
                                           ("A", "speed_of_sound_si")])
def test_nitrogen_is_within_2_percent_of_the_reference_equations_from_90_to_320_K(output, field):
    # Acceptance 2 %; measured: density 1.1e-4, viscosity 1e-5, speed of sound 2e-5.
    T, p = gas_grid()
    got = getattr(gases.nitrogen_si(T, p), field)
    assert np.max(np.abs(got / coolprop_n2(output, T, p) - 1)) < 0.02


@pytest.mark.parametrize("output, field", [("D", "density_si"),
                                           ("V", "dynamic_viscosity_si"),
                                           ("A", "speed_of_sound_si")])
def test_nitrogen_follows_the_full_equation_to_3e_4_over_the_stated_range(output, field):
    # Span et al. (2000) / Lemmon & Jacobsen (2004) via CoolProp, 65-500 K, 1 kPa-1.2 MPa;
    # measured: density 1.1e-4, viscosity 1e-5, speed of sound 3e-5.
    pts = [(T, p) for T in np.linspace(65.0, 500.0, 30) for p in (1e3, 1e4, 1e5, 6e5, 1.2e6)
           if T > 126.192 or p < PropsSI("P", "T", T, "Q", 1, "Nitrogen")]
    T, p = np.array(pts).T
    got = getattr(gases.nitrogen_si(T, p), field)
    assert np.max(np.abs(got / coolprop_n2(output, T, p) - 1)) < 3e-4


def test_nitrogen_ratio_of_specific_heats_matches_the_reference_equation():
    # cp/cv of Span et al. (2000) via CoolProp at 110 K, 4.5 bar (ETW-like state).
    ref = PropsSI("Cpmass", "T", 110, "P", 4.5e5, "Nitrogen") / PropsSI("Cvmass", "T", 110, "P",
                                                                       4.5e5, "Nitrogen")
    got = fp.nitrogen("110 K", "4.5 bar").extra["ratio_of_specific_heats"]
    assert got == pytest.approx(ref, rel=1e-3)


def test_saturated_vapour_just_below_the_saturation_pressure_is_accepted():
    # 90 K: saturation pressure 3.605 bar (Span et al. 2000); 3.5 bar is vapour.
    s = fp.nitrogen("90 K", "3.5 bar")
    assert s.density_si == pytest.approx(PropsSI("D", "T", 90, "P", 3.5e5, "Nitrogen"), rel=1e-4)


# -- saturation and the liquid region ------------------------------------------------------

def test_nitrogen_at_90_K_and_10_bar_is_refused_as_liquid():
    # Span et al. (2000): p_sat(90 K) = 3.605 bar; T_sat(10 bar) = 103.7 K.
    with pytest.raises(fp.OutOfRangeError,
                       match=r"liquid \(saturation pressure 3.605 bar at 90 K; boiling point "
                             r"103.7 K at 10 bar\)"):
        fp.nitrogen("90 K", "10 bar")


def test_saturation_pressure_follows_the_reference_equation():
    # Span et al. (2000) vapour-pressure equation against the phase equilibrium of the full
    # equation of state (CoolProp): within 0.02 % from 64 to 126 K.
    T = np.linspace(64.0, 126.0, 32)
    ref = np.array([PropsSI("P", "T", t, "Q", 1, "Nitrogen") for t in T])
    assert np.max(np.abs(gases.nitrogen_saturation_pressure_si(T) / ref - 1)) < 2e-4


def test_normal_boiling_point_of_nitrogen_is_77_355_K():
    # Span et al. (2000): normal boiling point 77.355 K at 0.101325 MPa.
    assert gases.nitrogen_saturation_temperature_si(101325.0) == pytest.approx(77.355, abs=0.01)


def test_extrapolate_turns_liquid_points_of_a_grid_into_nan():
    s = gases.nitrogen_si(np.array([90.0, 200.0]), 10e5, extrapolate=True)
    assert np.isnan(s.density_si[0]) and s.density_si[1] > 0


def test_nitrogen_temperature_outside_the_range_names_quantity_value_and_range():
    with pytest.raises(fp.OutOfRangeError,
                       match=r"temperature -233.15 degC is outside .*nitrogen.*\(65 to 500 K\)"):
        fp.nitrogen("40 K")


# -- ideal-gas limit and vectorisation ------------------------------------------------------

@settings(max_examples=40, deadline=None)
@given(T=st.floats(150.0, 400.0))
def test_at_low_pressure_nitrogen_is_an_ideal_gas_with_gamma_7_5(T):
    # Perfect diatomic gas below vibrational excitation: Z -> 1, gamma -> 7/5, a -> sqrt(gamma
    # R T / M), with M = 28.01348 g/mol and R = 8.31451 J/(mol K) (Span et al. 2000). At 1 kPa
    # |B| p / (R T) < 6e-5 from 150 K up; vibration (theta_v = 3390 K) lowers gamma by < 0.2 %
    # at 400 K (textbook statistical mechanics).
    s = gases.nitrogen_si(T, 1.0e3)
    assert s.extra["compressibility"] == pytest.approx(1.0, abs=1e-4)
    assert s.extra["ratio_of_specific_heats"] == pytest.approx(1.4, abs=3e-3)
    a_ideal = np.sqrt(s.extra["ratio_of_specific_heats"] * 8.31451 * T / 0.02801348)
    assert s.speed_of_sound_si == pytest.approx(a_ideal, rel=1e-4)


@settings(max_examples=25, deadline=None)
@given(T=st.lists(st.floats(130.0, 320.0), min_size=1, max_size=6), p=st.floats(1e5, 1e6))
def test_nitrogen_array_evaluation_equals_pointwise_evaluation(T, p):
    # Vectorisation must not change the numbers (common practice).
    arr = gases.nitrogen_si(np.array(T), p)
    for i, t in enumerate(T):
        one = gases.nitrogen_si(t, p)
        assert arr.density_si[i] == pytest.approx(one.density_si, rel=1e-11)
        assert arr.speed_of_sound_si[i] == pytest.approx(one.speed_of_sound_si, rel=1e-11)


def test_large_grids_give_the_same_values_as_small_ones():
    # The evaluator works in blocks on large grids; blocks must not change the numbers.
    T = np.linspace(130.0, 320.0, 140_000)
    big = gases.nitrogen_si(T, 5e5).density_si
    assert big[-1] == pytest.approx(gases.nitrogen_si(T[-1], 5e5).density_si, rel=1e-12)


def test_nitrogen_catalogue_entry_covers_cryogenic_tunnel_states():
    info = fp.get_fluid("n2")
    assert info.name == "nitrogen" and info.kind == "gas"
    t, p = info.range_of("temperature"), info.range_of("pressure")
    assert t.low <= 90.0 and t.high >= 320.0 and p.low <= 1e5 and p.high >= 1e6
    assert info in gases.builtin_fluid_infos()


def test_nitrogen_state_carries_gamma_and_sources():
    s = fp.nitrogen("300 K", "1 bar")
    assert "ratio_of_specific_heats" in s.extra
    assert any("Span" in src for src in s.sources)


# -- optional CoolProp back-end -------------------------------------------------------------

def test_package_import_and_catalogue_listing_do_not_import_coolprop():
    code = ("import sys, fluids_props as fp; fp.list_fluids(); fp.nitrogen('100 K', '1 bar'); "
            "print('CoolProp' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "False"


def test_coolprop_test_gases_are_listed_when_coolprop_is_installed():
    names = {info.name for info in gases.optional_fluid_infos()}
    assert {"coolprop:sf6", "coolprop:r134a", "coolprop:helium", "coolprop:co2"} <= names


def test_coolprop_gases_are_found_by_the_catalogue_lookup():
    assert fp.get_fluid("coolprop:SF6").name == "coolprop:sf6"


def test_sf6_properties_are_those_of_coolprop():
    # CoolProp 'SF6' (Guder & Wagner 2009 equation of state); digest values at 20 degC, 1 atm:
    # rho 6.15 kg/m^3, a 134 m/s, gamma 1.10.
    s = gases.coolprop_fluid("SF6", "20 degC", "1 atm")
    assert s.density_si == pytest.approx(PropsSI("D", "T", 293.15, "P", 101325, "SF6"), rel=1e-9)
    assert s.density_si == pytest.approx(6.15, abs=0.01)
    assert s.speed_of_sound_si == pytest.approx(134.0, abs=0.5)
    assert s.extra["ratio_of_specific_heats"] == pytest.approx(1.10, abs=0.01)


def test_catalogue_evaluator_of_a_coolprop_gas_checks_its_ranges():
    info = fp.get_fluid("coolprop:r134a")
    s = info.evaluate_si(np.array([293.15, 313.15]), 1e5)
    assert s.density_si == pytest.approx(
        [PropsSI("D", "T", t, "P", 1e5, "R134a") for t in (293.15, 313.15)], rel=1e-9)
    with pytest.raises(fp.OutOfRangeError, match="temperature"):
        info.evaluate_si(100.0, 1e5)


def test_coolprop_liquid_state_is_refused():
    # R-134a at 20 degC: saturation pressure 5.72 bar (CoolProp, Tillner-Roth & Baehr 1994).
    with pytest.raises(fp.OutOfRangeError, match="R134a at 293.15 K and 10 bar is liquid"):
        gases.coolprop_fluid("R134a", "20 degC", "10 bar")


def test_unknown_coolprop_fluid_is_refused_with_examples():
    with pytest.raises(fp.OutOfRangeError, match="CoolProp does not know 'unobtainium'"):
        gases.coolprop_fluid("unobtainium", "20 degC")


def test_without_coolprop_the_optional_list_is_empty(monkeypatch):
    monkeypatch.setattr(gases, "coolprop_available", lambda: False)
    assert gases.optional_fluid_infos() == ()


def test_without_coolprop_a_coolprop_fluid_asks_for_the_extra(monkeypatch):
    # A None entry in sys.modules makes the import fail, as if CoolProp were not installed.
    monkeypatch.setitem(sys.modules, "CoolProp", None)
    with pytest.raises(fp.OutOfRangeError, match="optional 'coolprop' extra"):
        gases.coolprop_fluid("SF6", "20 degC")

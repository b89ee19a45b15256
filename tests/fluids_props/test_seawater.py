"""Sea water: TEOS-10 check values, the ITTC table, gsw and iapws as oracles."""

from __future__ import annotations

import math

import gsw
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from iapws.iapws08 import _Tension_SeaWater

from fluids_props import OutOfRangeError, sea_water
from fluids_props import seawater as sw
from fluids_props import water as w
from fluids_props.units import Q_

T_C = np.linspace(0.0, 40.0, 41)
SA_GKG = np.linspace(0.0, 42.0, 22)
TT, SS = np.meshgrid(T_C, SA_GKG)  # degC, g/kg


# -- ITTC 7.5-02-01-03 (Rev. 02, 2011) ---------------------------------------------------------

def test_kinematic_viscosity_at_15_degC_standard_salinity_matches_ittc():
    # ITTC 7.5-02-01-03 (2011), sea water 15 degC, S_A = 35.16504 g/kg: nu = 1.1892e-6 m^2/s
    nu = float(sea_water("15 degC").kinematic_viscosity_si)
    assert round(nu * 1e6, 4) == 1.1892


def test_kinematic_viscosity_at_20_degC_standard_salinity_matches_ittc():
    # ITTC 7.5-02-01-03 (2011) list, sea water 20 degC: nu = 1.0508e-6 m^2/s
    nu = float(sea_water("20 degC").kinematic_viscosity_si)
    assert round(nu * 1e6, 4) == 1.0508


# -- density: TEOS-10 ---------------------------------------------------------------------------

def test_density_reproduces_r13_08_check_value_at_0_degC_1_atm():
    # IAPWS R13-08 / Feistel (2008) check table, S_A = 35.16504 g/kg, 273.15 K, 101325 Pa:
    # rho = 1028.10720 kg/m^3 (the table uses IAPWS-95 for the pure-water part; SR7-09 differs
    # from it by ~2e-8 here)
    assert float(sea_water("0 degC").density_si) == pytest.approx(1028.10720, rel=1e-7)


def test_density_reproduces_r13_08_check_value_at_0_degC_100_MPa():
    # same table, 273.15 K, 100 MPa: rho = 1070.92645 kg/m^3
    s = sea_water("0 degC", pressure="100 MPa")
    assert float(s.density_si) == pytest.approx(1070.92645, rel=1e-7)


def test_density_at_1_atm_equals_gsw_rho_t_exact_on_a_grid():
    # gsw.rho_t_exact(SA [g/kg], t [degC], p_sea [dbar]) is the TEOS-10 Gibbs-function density
    rho = sw.sea_water_si(TT + 273.15, 101325.0, SS / 1e3).density_si
    assert np.max(np.abs(rho / gsw.rho_t_exact(SS, TT, 0.0) - 1)) < 1e-12


def test_density_at_1_atm_is_within_0_02_percent_of_gsw_rho_from_conservative_temperature():
    # gsw.rho(SA, CT, p) is the 75-term TEOS-10 polynomial; requirement 0.02 %
    rho = sw.sea_water_si(TT + 273.15, 101325.0, SS / 1e3).density_si
    ref = gsw.rho(SS, gsw.CT_from_t(SS, TT, 0.0), 0.0)
    assert np.max(np.abs(rho / ref - 1)) < 2e-4


@pytest.mark.parametrize("p_abs", [2e5, 5e6, 50e6, 100e6])
def test_density_under_pressure_equals_gsw_rho_t_exact(p_abs):
    rho = sw.sea_water_si(TT + 273.15, p_abs, SS / 1e3).density_si
    ref = gsw.rho_t_exact(SS, TT, (p_abs - 101325.0) / 1e4)
    assert np.max(np.abs(rho / ref - 1)) < 1e-12


def test_density_with_a_pressure_array_equals_gsw():
    rng = np.random.default_rng(1)
    p_abs = rng.uniform(1e4, 1e8, TT.shape)
    rho = sw.sea_water_si(TT + 273.15, p_abs, SS / 1e3).density_si
    ref = gsw.rho_t_exact(SS, TT, (p_abs - 101325.0) / 1e4)
    assert np.max(np.abs(rho / ref - 1)) < 1e-12


def test_zero_salinity_gives_fresh_water():
    # TEOS-10 at S_A = 0 reduces to its pure-water part (IOC et al. 2010); the Sharqawy,
    # Nayar and IAPWS G14-19 factors all equal 1 at S = 0
    s, f = sw.sea_water_si(T_C + 273.15, salinity=0.0), w.fresh_water_si(T_C + 273.15)
    for name in ("density_si", "dynamic_viscosity_si", "vapour_pressure_si",
                 "surface_tension_si"):
        np.testing.assert_allclose(getattr(s, name), getattr(f, name), rtol=1e-14)


def test_documented_one_atmosphere_density_formula_reproduces_the_function():
    # The module docstring's spreadsheet form, term by term from the public tuples, against
    # gsw for an outside anchor.
    t, sa = 17.3, 0.0333
    y, xi = t / 40.0, math.sqrt(sa / (0.03516504 * 40 / 35))
    den = sum(c * y**j for j, c in enumerate(w.DENSITY_COEFFS))
    den += sum(d * xi**i * y**j for i, j, d in sw.DENSITY_SALINE_COEFFS)
    rho = 1e8 / den
    assert float(sw.density(t + 273.15, sa)) == pytest.approx(rho, rel=1e-12)
    assert rho == pytest.approx(float(gsw.rho_t_exact(sa * 1e3, t, 0.0)), rel=1e-12)


# -- vapour pressure, surface tension, viscosity ----------------------------------------------

def test_vapour_pressure_agrees_with_teos10_raoult_form_within_0_1_percent():
    # TEOS-10: ln(p_sw/p_w) = [mu_W(S_A) - mu_W(0)] / (R_W T), ideal vapour, Poynting term
    # neglected; gsw.chem_potential_water_t_exact in J/g; R_W = R/M_W (CODATA R, IAPWS M_W)
    r_w = 8.314462618 / 0.018015268
    dmu = (gsw.chem_potential_water_t_exact(SS, TT, 0.0)
           - gsw.chem_potential_water_t_exact(0.0 * SS, TT, 0.0)) * 1e3
    ref = w.vapour_pressure(TT + 273.15) * np.exp(dmu / (r_w * (TT + 273.15)))
    pv = sw.sea_water_si(TT + 273.15, salinity=SS / 1e3).vapour_pressure_si
    assert np.max(np.abs(pv / ref - 1)) < 1e-3


def test_surface_tension_matches_iapws_package_seawater_guideline():
    # iapws.iapws08._Tension_SeaWater implements IAPWS G14-19 (valid above 1 degC to 131 g/kg)
    t = np.linspace(1.5, 40.0, 12)
    for sa in (0.0, 0.02, 0.035, 0.042):
        ref = np.array([_Tension_SeaWater(tk, sa) for tk in t + 273.15])
        got = sw.surface_tension(t + 273.15, sa)
        assert np.max(np.abs(got / ref - 1)) < 1e-12


def test_viscosity_factor_at_standard_salinity_15_degC():
    # Sharqawy et al. (2010) Eq. 22 by hand: A = 1.541 + 1.998e-2*15 - 9.52e-5*225 = 1.81928,
    # B = 7.974 - 7.561e-2*15 + 4.724e-4*225 = 6.94614; 1 + A S + B S^2 at S = 0.03516504
    s = 0.03516504
    expected = 1 + 1.81928 * s + 6.94614 * s**2
    assert float(sw.viscosity_salinity_factor(288.15, s)) == pytest.approx(expected, rel=1e-12)


# -- public edge, validity, NaN ---------------------------------------------------------------

def test_salinity_string_in_g_per_kg_is_stored_as_mass_fraction():
    s = sea_water("15 degC", salinity="35 g/kg")
    assert float(s.extra["salinity"]) == pytest.approx(0.035, rel=1e-15)


def test_salinity_quantity_and_bare_number_agree():
    a = sea_water("15 degC", salinity=Q_(35.0, "g/kg"))
    b = sea_water("15 degC", salinity=0.035)
    assert float(a.density_si) == pytest.approx(float(b.density_si), rel=1e-14)


def test_salinity_out_of_range_raises_naming_salinity_and_range():
    with pytest.raises(OutOfRangeError, match=r"salinity 45 g/kg .*0 to 42 g/kg"):
        sea_water("15 degC", salinity="45 g/kg")


def test_temperature_out_of_range_raises():
    with pytest.raises(OutOfRangeError, match="temperature"):
        sea_water("-2 degC")


def test_extrapolate_true_skips_the_check_and_still_matches_teos10():
    # TEOS-10 saline part holds to 120 g/kg at 1 atm (IAPWS R13-08); gsw evaluates it
    s = sea_water("20 degC", salinity="60 g/kg", extrapolate=True)
    assert float(s.density_si) == pytest.approx(float(gsw.rho_t_exact(60.0, 20.0, 0.0)),
                                                rel=1e-12)


def test_nan_salinity_propagates_without_error():
    s = sw.sea_water_si(np.array([288.15, 288.15]), salinity=np.array([0.035, np.nan]))
    assert np.isnan(s.density_si[1]) and np.isfinite(s.density_si[0])


def test_temperature_and_salinity_arrays_broadcast():
    s = sea_water(Q_(np.array([10.0, 20.0]), "degC"),
                  salinity=Q_(np.array([[30.0], [35.0], [40.0]]), "g/kg"))
    assert s.density_si.shape == (3, 2)
    assert s.extra["salinity"].shape == (3, 2)


def test_fluid_info_lists_temperature_and_salinity_ranges():
    info = sw.FLUID_INFO
    assert (info.name, info.kind) == ("sea_water", "liquid")
    assert info.range_of("salinity") == sw.S_RANGE
    assert info.range_of("temperature") == sw.T_RANGE
    assert info.evaluate_si is sw.sea_water_si


# -- properties (hypothesis) ------------------------------------------------------------------

temps = st.floats(min_value=273.15, max_value=313.15)
sals = st.floats(min_value=0.0, max_value=0.042)


@settings(max_examples=50, deadline=None)
@given(st.lists(st.tuples(temps, sals), min_size=1, max_size=8))
def test_array_call_equals_scalar_calls(pairs):
    T = np.array([p[0] for p in pairs])
    S = np.array([p[1] for p in pairs])
    arr = sw.sea_water_si(T, salinity=S)
    for n, (t, s) in enumerate(pairs):
        one = sw.sea_water_si(t, salinity=s)
        assert arr.density_si[n] == pytest.approx(float(one.density_si), rel=1e-14)
        assert arr.dynamic_viscosity_si[n] == pytest.approx(float(one.dynamic_viscosity_si),
                                                            rel=1e-14)


@settings(max_examples=50, deadline=None)
@given(temps, sals, sals)
def test_salt_raises_density_and_viscosity_and_lowers_vapour_pressure(t, a, b):
    lo, hi = sorted((a, b))
    if hi - lo > 1e-6:
        s_lo, s_hi = sw.sea_water_si(t, salinity=lo), sw.sea_water_si(t, salinity=hi)
        assert s_hi.density_si > s_lo.density_si
        assert s_hi.dynamic_viscosity_si > s_lo.dynamic_viscosity_si
        assert s_hi.vapour_pressure_si < s_lo.vapour_pressure_si

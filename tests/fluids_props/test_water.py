"""Fresh water: checks against IAPWS release tables, the ITTC table and reference libraries.

Oracles: iapws (IAPWS-95, IAPWS R12-08, R1-76), CoolProp (IAPWS-95 and the IAPWS 2008
viscosity with its critical enhancement), gsw (TEOS-10 pure-water part = IAPWS SR7-09).
"""

from __future__ import annotations

import math

import CoolProp.CoolProp as CP
import gsw
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from iapws import IAPWS95
from iapws._iapws import _Tension, _Viscosity

from fluids_props import OutOfRangeError, fresh_water
from fluids_props import water as w
from fluids_props.units import Q_, UnitInputError

T_GRID = np.linspace(273.16, 313.15, 41)  # 0.01-40 degC: IAPWS-95 liquid at 1 atm


def _coolprop(prop, T, p=101325.0):
    return np.array([CP.PropsSI(prop, "T", float(t), "P", p, "Water") for t in np.atleast_1d(T)])


# -- ITTC 7.5-02-01-03 (Rev. 02, 2011) table, fresh water at 0.101325 MPa ----------------------

def test_density_at_15_degC_matches_ittc_table():
    # ITTC 7.5-02-01-03 (2011), fresh water 15 degC: rho = 999.1026 kg/m^3
    assert round(float(fresh_water("15 degC").density_si), 4) == 999.1026


def test_kinematic_viscosity_at_15_degC_matches_ittc_table():
    # ITTC 7.5-02-01-03 (2011), fresh water 15 degC: nu = 1.1386e-6 m^2/s
    nu = float(fresh_water("15 degC").kinematic_viscosity_si)
    assert round(nu * 1e6, 4) == 1.1386


# -- IAPWS R12-08 (2008) viscosity, Table 4 (mu2 = 1) ----------------------------------------

@pytest.mark.parametrize(
    ("T", "rho", "mu_micro"),
    [
        # IAPWS R12-08 Table 4: T [K], rho [kg/m^3], mu [uPa s]
        (298.15, 998.0, 889.735100),
        (298.15, 1200.0, 1437.649467),
        (373.15, 1000.0, 307.883622),
        (433.15, 1.0, 14.538324),
        (433.15, 1000.0, 217.685358),
        (873.15, 1.0, 32.619287),
        (873.15, 100.0, 35.802262),
        (873.15, 600.0, 77.430195),
        (1173.15, 1.0, 44.217245),
        (1173.15, 100.0, 47.640433),
        (1173.15, 400.0, 64.154608),
    ],
)
def test_viscosity_reproduces_iapws_r12_08_table_4(T, rho, mu_micro):
    assert w.dynamic_viscosity(T, rho) * 1e6 == pytest.approx(mu_micro, abs=1.5e-6)


def test_viscosity_matches_iapws_package_on_a_grid():
    # iapws._Viscosity implements IAPWS R12-08 (mu2 = 1 without phase data)
    rho = w.density(T_GRID)
    ref = np.array([_Viscosity(r, t) for r, t in zip(rho, T_GRID, strict=True)])
    assert np.max(np.abs(w.dynamic_viscosity(T_GRID, rho) / ref - 1)) < 1e-12


def test_viscosity_at_1_atm_is_within_0_1_percent_of_coolprop_with_critical_enhancement():
    # CoolProp: IAPWS-95 density + IAPWS 2008 viscosity including mu2; this also shows that
    # setting mu2 = 1 costs nothing measurable in the liquid at 0-40 degC (< 1e-6 relative).
    mu = fresh_water_arrays().dynamic_viscosity_si
    assert np.max(np.abs(mu / _coolprop("V", T_GRID) - 1)) < 1e-6


def fresh_water_arrays():
    return w.fresh_water_si(T_GRID)


# -- density: IAPWS-95 and IAPWS SR7-09 -------------------------------------------------------

def test_density_at_1_atm_is_within_1_ppm_of_iapws95_coolprop():
    # requirement 0.01 %; CoolProp 'Water' is IAPWS-95 (Wagner & Pruss 2002)
    rho = fresh_water_arrays().density_si
    assert np.max(np.abs(rho / _coolprop("D", T_GRID) - 1)) < 1e-6


@pytest.mark.parametrize("t", [0.01, 4.0, 15.0, 25.0, 40.0])
def test_density_at_1_atm_is_within_1_ppm_of_iapws95_iapws_package(t):
    ref = IAPWS95(T=t + 273.15, P=0.101325).rho  # iapws: IAPWS-95, P in MPa
    assert float(w.density(t + 273.15)) == pytest.approx(ref, rel=1e-6)


def test_density_equals_teos10_pure_water_part():
    # gsw.rho_t_exact(SA=0, t, p_sea) evaluates the IAPWS SR7-09 Gibbs function (TEOS-10)
    t = T_GRID - 273.15
    for p_abs in (101325.0, 1e6, 20e6, 100e6):
        ref = gsw.rho_t_exact(0.0, t, (p_abs - 101325.0) / 1e4)
        assert np.max(np.abs(w.density(T_GRID, p_abs) / ref - 1)) < 1e-12


@pytest.mark.parametrize("p", [1e4, 1e6, 10e6, 50e6, 100e6])
def test_density_under_pressure_is_within_1e_5_of_iapws95(p):
    # IAPWS SR7-09 fits IAPWS-95 over the ocean range to 100 MPa (CoolProp = IAPWS-95);
    # 10 kPa is above the vapour pressure (7.4 kPa) at 40 degC, so CoolProp stays liquid
    rho = w.fresh_water_si(T_GRID, p).density_si
    assert np.max(np.abs(rho / _coolprop("D", T_GRID, p) - 1)) < 1e-5


def test_maximum_density_lies_near_3_98_degC():
    # Tanaka et al. (2001), Metrologia 38:301: maximum density of water at 3.983 degC
    t = np.linspace(3.0, 5.0, 2001)
    t_max = t[np.argmax(w.density(t + 273.15))]
    assert t_max == pytest.approx(3.983, abs=0.01)


# -- vapour pressure and surface tension ------------------------------------------------------

@pytest.mark.parametrize("t", [0.1, 10.0, 20.0, 30.0, 40.0])
def test_vapour_pressure_is_within_0_01_percent_of_iapws95_saturation(t):
    # requirement 0.1 %; iapws IAPWS95 saturated liquid, P in MPa
    ref = IAPWS95(T=t + 273.15, x=0).P * 1e6
    assert float(w.vapour_pressure(t + 273.15)) == pytest.approx(ref, rel=1e-4)


def test_vapour_pressure_at_20_degC():
    # Wagner & Pruss (1993) saturation equation at 293.15 K: 2339.2 Pa (published-facts digest
    # [C]); IAPWS-95 gives 2339.3 Pa (ITTC 7.5-02-01-03 table)
    assert float(w.vapour_pressure(293.15)) == pytest.approx(2339.2, abs=0.05)


@pytest.mark.parametrize(("t", "sigma_mN"), [(0.01, 75.65), (25.0, 71.97)])
def test_surface_tension_matches_iapws_r1_76_table(t, sigma_mN):
    # IAPWS R1-76(2014) Table 1 values, quoted from memory of the release to 0.01 mN/m
    assert float(w.surface_tension(t + 273.15)) * 1e3 == pytest.approx(sigma_mN, abs=0.005)


def test_surface_tension_matches_iapws_package_on_a_grid():
    # iapws._Tension implements IAPWS R1-76(2014)
    ref = np.array([_Tension(t) for t in T_GRID])
    assert np.max(np.abs(w.surface_tension(T_GRID) / ref - 1)) < 1e-12


# -- the spreadsheet formulas of the module docstring ----------------------------------------

def test_documented_closed_forms_reproduce_the_functions_at_1_atm():
    # Re-evaluate the docstring formulas term by term from the public coefficient tuples, as a
    # workbook writer would, and compare with CoolProp (IAPWS-95) for an outside anchor.
    T = 291.37
    y = (T - 273.15) / 40.0
    rho = 1e8 / sum(c * y**j for j, c in enumerate(w.DENSITY_COEFFS))
    tb, rb = T / 647.096, rho / 322.0
    mu0 = 100 * math.sqrt(tb) / sum(h / tb**i for i, h in enumerate(w.VISCOSITY_H0))
    mu1 = math.exp(rb * sum(h * (1 / tb - 1) ** i * (rb - 1) ** j for i, j, h in w.VISCOSITY_H1))
    mu = 1e-6 * mu0 * mu1
    tau = 1 - T / 647.096
    pv = 22.064e6 * math.exp(647.096 / T * sum(
        a * tau**e for a, e in zip(w.VAPOUR_PRESSURE_A, w.VAPOUR_PRESSURE_EXPONENTS, strict=True)))
    big_b, m, b = w.SURFACE_TENSION_COEFFS
    sigma = big_b * tau**m * (1 + b * tau)
    s = w.fresh_water_si(T)
    assert float(s.density_si) == pytest.approx(rho, rel=1e-12)
    assert float(s.dynamic_viscosity_si) == pytest.approx(mu, rel=1e-12)
    assert float(s.vapour_pressure_si) == pytest.approx(pv, rel=1e-12)
    assert float(s.surface_tension_si) == pytest.approx(sigma, rel=1e-12)
    assert rho == pytest.approx(CP.PropsSI("D", "T", T, "P", 101325, "Water"), rel=1e-6)


# -- public edge, validity, NaN ---------------------------------------------------------------

def test_fahrenheit_string_and_quantity_give_the_same_state_as_celsius():
    # 59 degF = 15 degC exactly (pint conversion)
    a = fresh_water("59 degF")
    b = fresh_water(Q_(15.0, "degC"))
    assert float(a.density_si) == pytest.approx(float(b.density_si), rel=1e-12)


def test_pressure_string_in_bar_is_accepted():
    # 2 bar = 200 kPa; CoolProp IAPWS-95 at 20 degC, 200 kPa
    s = fresh_water("20 degC", pressure="2 bar")
    assert float(s.pressure_si) == 2e5
    assert float(s.density_si) == pytest.approx(
        CP.PropsSI("D", "T", 293.15, "P", 2e5, "Water"), rel=1e-6)


def test_temperature_array_broadcasts_with_pressure_array():
    s = fresh_water(Q_(np.array([10.0, 20.0, 30.0]), "degC"),
                    pressure=Q_(np.array([1e5, 2e5, 3e5]), "Pa"))
    assert s.density_si.shape == (3,)
    assert s.density.units == Q_(1.0, "kg/m^3").units


def test_temperature_out_of_range_raises_naming_the_quantity_and_range():
    with pytest.raises(OutOfRangeError, match=r"temperature 45 degC .*0 to 40 degC"):
        fresh_water("45 degC")


def test_pressure_out_of_range_raises():
    with pytest.raises(OutOfRangeError, match="pressure"):
        fresh_water("20 degC", pressure="2000 bar")


def test_extrapolate_true_evaluates_outside_the_range():
    # CoolProp IAPWS-95 at 50 degC, 1 atm: SR7-09 continues smoothly (within 1e-4 here)
    s = fresh_water("50 degC", extrapolate=True)
    assert float(s.density_si) == pytest.approx(
        CP.PropsSI("D", "T", 323.15, "P", 101325, "Water"), rel=1e-4)


def test_nan_temperature_propagates_without_error():
    s = w.fresh_water_si(np.array([288.15, np.nan]))
    assert np.isnan(s.density_si[1]) and np.isnan(s.dynamic_viscosity_si[1])
    assert np.isfinite(s.density_si[0])


def test_dimensionless_temperature_is_refused():
    with pytest.raises(UnitInputError, match="temperature"):
        fresh_water(15.0)


def test_fluid_info_describes_a_liquid_with_temperature_range():
    info = w.FLUID_INFO
    assert (info.name, info.kind) == ("fresh_water", "liquid")
    assert info.range_of("temperature") == w.T_RANGE
    assert info.evaluate_si is w.fresh_water_si
    assert len(info.sources) == 4


def test_state_carries_one_source_per_property():
    assert len(fresh_water("15 degC").sources) == 4


# -- properties (hypothesis) ------------------------------------------------------------------

temps = st.floats(min_value=273.15, max_value=313.15, allow_nan=False)


@settings(max_examples=50, deadline=None)
@given(st.lists(temps, min_size=1, max_size=8))
def test_array_call_equals_scalar_calls(ts):
    arr = w.fresh_water_si(np.array(ts))
    for n, t in enumerate(ts):
        one = w.fresh_water_si(t)
        assert arr.density_si[n] == pytest.approx(float(one.density_si), rel=1e-14)
        assert arr.dynamic_viscosity_si[n] == pytest.approx(float(one.dynamic_viscosity_si),
                                                            rel=1e-14)


@settings(max_examples=50, deadline=None)
@given(st.floats(min_value=277.5, max_value=313.0), st.floats(min_value=0.01, max_value=5.0))
def test_density_decreases_with_temperature_above_4_degC(t, dt):
    # Water expands on heating above its density maximum near 3.98 degC (Tanaka et al. 2001)
    t2 = min(t + dt, 313.15)
    if t2 > t:
        assert w.density(t2) < w.density(t)


@settings(max_examples=50, deadline=None)
@given(temps, temps)
def test_viscosity_and_surface_tension_fall_and_vapour_pressure_rises_with_temperature(a, b):
    lo, hi = sorted((a, b))
    if hi - lo > 1e-6:
        s_lo, s_hi = w.fresh_water_si(lo), w.fresh_water_si(hi)
        assert s_hi.dynamic_viscosity_si < s_lo.dynamic_viscosity_si
        assert s_hi.surface_tension_si < s_lo.surface_tension_si
        assert s_hi.vapour_pressure_si > s_lo.vapour_pressure_si

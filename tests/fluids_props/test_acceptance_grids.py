"""The accuracy targets of the fluid-property library, each over a grid of its whole stated range.

Grids include the edges of each range (0 and 40 degC, 0 and 42 g/kg, 0.5 and 10 bar, 250 and
330 K, -2 and 20 km). Oracles, all outside the project:

* iapws (IAPWS-95 at 0.101325 MPa; IAPWS R12-08 viscosity ``_Viscosity``; R1-76 ``_Tension``;
  IAPWS-IF97 saturation line ``_PSat_T``, valid from 273.15 K; G14-19 ``_Tension_SeaWater``);
* gsw (TEOS-10: ``rho_t_exact``, ``chem_potential_water_t_exact``);
* CoolProp (``Air``: Lemmon et al. 2000 equation of state and Lemmon & Jacobsen 2004
  viscosity; ``Nitrogen``: Span et al. 2000; ``HAPropsSI``: moist air after Herrmann et al.);
* the ISO 2533:1975 equations written out in this file with the standard's constants;
* the Sharqawy et al. (2010) eq. (22) salinity factor written out in this file.
"""

from __future__ import annotations

import importlib

import CoolProp.CoolProp as CP
import gsw
import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Tension, _Viscosity
from iapws.iapws08 import _Tension_SeaWater
from iapws.iapws97 import _PSat_T

import fluids_props as fp
from fluids_props.units import Q_, UnitInputError

water = importlib.import_module("fluids_props.water")
seawater = importlib.import_module("fluids_props.seawater")
air_mod = importlib.import_module("fluids_props.air")
atmosphere = importlib.import_module("fluids_props.atmosphere")
gases = importlib.import_module("fluids_props.gases")

T_WATER = np.linspace(273.15, 313.15, 41)  # 0-40 degC in 1 K steps, both edges


def _rel(a, b):
    return np.max(np.abs(np.asarray(a, dtype=float) / np.asarray(b, dtype=float) - 1.0))


# --- fresh water at 0.101325 MPa, 0-40 degC ----------------------------------------------------


@pytest.fixture(scope="module")
def iapws95_1atm():
    # IAPWS-95 (Wagner & Pruss 2002) through the iapws package, liquid at 0.101325 MPa
    return np.array([IAPWS95(T=float(t), P=0.101325).rho for t in T_WATER])


def test_fresh_water_density_is_within_0_01_percent_of_iapws95_from_0_to_40_degC(iapws95_1atm):
    s = water.fresh_water_si(T_WATER)
    assert _rel(s.density_si, iapws95_1atm) < 1e-4


def test_fresh_water_viscosity_is_within_0_1_percent_of_iapws_2008_from_0_to_40_degC(
        iapws95_1atm):
    # IAPWS R12-08 (Huber et al. 2009) at the IAPWS-95 density, iapws._Viscosity
    ref = [_Viscosity(r, t) for r, t in zip(iapws95_1atm, T_WATER, strict=True)]
    assert _rel(water.fresh_water_si(T_WATER).dynamic_viscosity_si, ref) < 1e-3


def test_fresh_water_vapour_pressure_is_within_0_1_percent_from_0_to_40_degC():
    # IAPWS-IF97 saturation pressure (valid from 273.15 K) agrees with IAPWS-95 to ~1e-5
    ref = np.array([_PSat_T(float(t)) * 1e6 for t in T_WATER])
    assert _rel(water.fresh_water_si(T_WATER).vapour_pressure_si, ref) < 1e-3


def test_fresh_water_vapour_pressure_is_within_0_1_percent_of_iapws95_saturation():
    # IAPWS-95 saturated liquid (iapws, x = 0), from the triple point 273.16 K to 40 degC
    t = np.linspace(273.16, 313.15, 9)
    ref = np.array([IAPWS95(T=float(x), x=0).P * 1e6 for x in t])
    assert _rel(water.fresh_water_si(t).vapour_pressure_si, ref) < 1e-3


def test_fresh_water_surface_tension_is_within_0_5_percent_of_iapws_r1_76_from_0_to_40_degC():
    ref = [_Tension(float(t)) for t in T_WATER]
    assert _rel(water.fresh_water_si(T_WATER).surface_tension_si, ref) < 5e-3


def test_fresh_water_grid_has_no_nan_anywhere_in_its_range():
    s = water.fresh_water_si(T_WATER)
    for v in (s.density_si, s.dynamic_viscosity_si, s.vapour_pressure_si, s.surface_tension_si):
        assert np.all(np.isfinite(v))


# --- sea water, 0-42 g/kg, 0-40 degC ----------------------------------------------------------

T_SEA_C = np.linspace(0.0, 40.0, 21)
S_SEA_GKG = np.linspace(0.0, 42.0, 15)
TT, SS = np.meshgrid(T_SEA_C, S_SEA_GKG)  # degC, g/kg


def test_sea_water_density_is_within_0_02_percent_of_teos10_over_the_whole_grid():
    # TEOS-10 (gsw.rho_t_exact) at zero sea pressure (0.101325 MPa absolute)
    s = seawater.sea_water_si(TT + 273.15, 101325.0, SS / 1e3)
    assert _rel(s.density_si, gsw.rho_t_exact(SS, TT, 0.0)) < 2e-4


def test_sea_water_viscosity_is_sharqawy_on_the_iapws_2008_pure_water_base():
    # Sharqawy et al. (2010) eq. (22) with S in kg/kg, t in degC (the ITTC 7.5-02-01-03 approach)
    # times IAPWS R12-08 at the IAPWS-95 density (iapws package)
    S, t = SS / 1e3, TT
    a = 1.541 + 1.998e-2 * t - 9.52e-5 * t**2
    b = 7.974 - 7.561e-2 * t + 4.724e-4 * t**2
    mu_w = np.array([_Viscosity(IAPWS95(T=x + 273.15, P=0.101325).rho, x + 273.15)
                     for x in T_SEA_C])
    ref = mu_w[None, :] * (1.0 + a * S + b * S**2)
    got = seawater.sea_water_si(TT + 273.15, 101325.0, S).dynamic_viscosity_si
    assert _rel(got, ref) < 1e-3


def test_sea_water_vapour_pressure_agrees_with_teos10_over_the_whole_grid():
    # TEOS-10 Raoult form ln(p_sw/p_w) = [mu_W(S) - mu_W(0)]/(R_W T), R_W = R/M_W (CODATA R,
    # IAPWS M_W); p_w from IAPWS-IF97 (valid from 273.15 K)
    r_w = 8.314462618 / 0.018015268
    dmu = (gsw.chem_potential_water_t_exact(SS, TT, 0.0)
           - gsw.chem_potential_water_t_exact(0.0 * SS, TT, 0.0)) * 1e3
    p_w = np.array([_PSat_T(x + 273.15) * 1e6 for x in T_SEA_C])[None, :]
    ref = p_w * np.exp(dmu / (r_w * (TT + 273.15)))
    got = seawater.sea_water_si(TT + 273.15, 101325.0, SS / 1e3).vapour_pressure_si
    assert _rel(got, ref) < 1e-3


def test_sea_water_surface_tension_matches_iapws_g14_19_where_the_guideline_holds():
    # iapws _Tension_SeaWater implements IAPWS G14-19: above 1 degC up to 131 g/kg, and
    # below 1 degC up to 38 g/kg
    t = np.linspace(1.01, 40.0, 14) + 273.15
    for sa in S_SEA_GKG / 1e3:
        ref = [_Tension_SeaWater(float(x), float(sa)) for x in t]
        assert _rel(seawater.surface_tension(t, sa), ref) < 1e-9
    t_cold = np.array([273.15, 273.65, 274.1])
    for sa in (0.0, 0.02, 0.035, 0.038):
        ref = [_Tension_SeaWater(float(x), sa) for x in t_cold]
        assert _rel(seawater.surface_tension(t_cold, sa), ref) < 1e-9


def test_sea_water_grid_has_no_nan_anywhere_in_its_range():
    s = seawater.sea_water_si(TT + 273.15, 101325.0, SS / 1e3)
    for v in (s.density_si, s.dynamic_viscosity_si, s.vapour_pressure_si, s.surface_tension_si):
        assert np.all(np.isfinite(v))


# --- air: 0.5-10 bar, 250-330 K (dry), CIPM-2007 near 1 atm (moist) ----------------------------

T_AIR = np.linspace(250.0, 330.0, 17)
P_AIR = np.array([0.5e5, 0.75e5, 1.0e5, 1.01325e5, 2e5, 3e5, 5e5, 7.5e5, 10e5])
TA, PA = np.meshgrid(T_AIR, P_AIR)


def _coolprop_air(prop):
    return np.vectorize(lambda t, p: CP.PropsSI(prop, "T", t, "P", p, "Air"))(TA, PA)


@pytest.fixture(scope="module")
def dry_air():
    return air_mod.air_si(TA, PA)


def test_dry_air_density_is_within_0_2_percent_of_the_reference_eos_over_the_grid(dry_air):
    assert _rel(dry_air.density_si, _coolprop_air("D")) < 2e-3


def test_dry_air_viscosity_is_within_2_percent_over_the_grid(dry_air):
    assert _rel(dry_air.dynamic_viscosity_si, _coolprop_air("V")) < 2e-2


def test_dry_air_speed_of_sound_is_within_0_5_percent_over_the_grid(dry_air):
    assert _rel(dry_air.speed_of_sound_si, _coolprop_air("A")) < 5e-3


@pytest.mark.parametrize("rh", [0.0, 0.25, 0.5, 0.75, 1.0])
def test_moist_air_density_near_1_atm_agrees_with_coolprop_humid_air_from_0_to_40_degC(rh):
    # CoolProp HAPropsSI (Herrmann, Kretzschmar & Gatley 2009 humid-air model), per kg dry air;
    # CIPM-2007's stated uncertainty is 2.2e-5, the two models differ by a few 1e-5
    t = np.linspace(273.15, 313.15, 9)
    for p in (95e3, 101325.0, 105e3):
        ref = np.array([(1.0 + CP.HAPropsSI("W", "T", x, "P", p, "R", rh))
                        / CP.HAPropsSI("Vda", "T", x, "P", p, "R", rh) for x in t])
        assert _rel(air_mod.air_si(t, p, rh).density_si, ref) < 2e-4


def test_moist_air_density_inside_the_cipm_window_is_the_published_equation():
    # CIPM-2007 (Picard et al. 2008) as published, inside its 15-27 degC, 600-1100 hPa window
    t, p, h = np.meshgrid(np.linspace(288.15, 300.15, 5), np.linspace(6e4, 1.1e5, 5),
                          np.linspace(0.0, 1.0, 5))
    got = air_mod.air_si(t, p, h).density_si
    assert _rel(got, air_mod.cipm2007_density_si(t, p, h)) < 1e-12


def test_air_grid_has_no_nan_anywhere_in_its_range(dry_air):
    for v in (dry_air.density_si, dry_air.dynamic_viscosity_si, dry_air.speed_of_sound_si):
        assert np.all(np.isfinite(v))


# --- ISO 2533 standard atmosphere, geometric altitude -2 km to 20 km ---------------------------

Z = np.linspace(-2000.0, 20000.0, 221)


def _iso2533(z):
    # ISO 2533:1975 with r = 6 356 766 m, g0 = 9.80665 m/s^2, R = 287.05287 J/(kg K),
    # lapse -6.5 K/km to 11 km geopotential, isothermal 216.65 K to 20 km, Sutherland
    # beta_s = 1.458e-6 kg/(m s K^0.5), S = 110.4 K, kappa = 1.4
    r0, g0, R = 6356766.0, 9.80665, 287.05287
    H = r0 * z / (r0 + z)
    T = np.where(H <= 11000.0, 288.15 - 0.0065 * H, 216.65)
    p11 = 101325.0 * (216.65 / 288.15) ** (g0 / (R * 0.0065))
    p = np.where(H <= 11000.0, 101325.0 * (T / 288.15) ** (g0 / (R * 0.0065)),
                 p11 * np.exp(-g0 * (H - 11000.0) / (R * 216.65)))
    return T, p, p / (R * T), 1.458e-6 * T**1.5 / (T + 110.4), np.sqrt(1.4 * R * T)


def test_standard_atmosphere_t_p_rho_are_within_0_05_percent_of_iso_2533_from_minus_2_to_20_km():
    s = atmosphere.standard_atmosphere_si(Z)
    T, p, rho, _, _ = _iso2533(Z)
    assert _rel(s.temperature_si, T) < 5e-4
    assert _rel(s.pressure_si, p) < 5e-4
    assert _rel(s.density_si, rho) < 5e-4


def test_standard_atmosphere_viscosity_is_within_0_5_percent_of_iso_2533_over_the_range():
    _, _, _, mu, a = _iso2533(Z)
    s = atmosphere.standard_atmosphere_si(Z)
    assert _rel(s.dynamic_viscosity_si, mu) < 5e-3
    assert _rel(s.speed_of_sound_si, a) < 5e-4


@pytest.mark.parametrize(("h_km", "T", "p", "rho"), [
    # ISO 2533:1975 table values at geopotential altitude (ICAO Doc 7488 gives the same):
    # sea level and tropopause from the standard's defining constants, from memory to 5 digits
    (0.0, 288.15, 101325.0, 1.2250),
    (11.0, 216.65, 22632.0, 0.36392),
    (20.0, 216.65, 5474.9, 0.088035),
])
def test_standard_atmosphere_reproduces_iso_2533_table_values(h_km, T, p, rho):
    s = fp.standard_atmosphere(f"{h_km} km", geopotential=True)
    assert s.temperature.to("K").magnitude == pytest.approx(T, rel=1e-5)
    assert s.pressure.to("Pa").magnitude == pytest.approx(p, rel=5e-5)
    assert s.density.to("kg/m^3").magnitude == pytest.approx(rho, rel=5e-5)


def test_altitude_is_geometric_by_default():
    # 11 km geometric is 10.981 km geopotential (ISO 2533 H = r z/(r + z)): still in the troposphere
    s = fp.standard_atmosphere("11 km")
    assert s.temperature.to("K").magnitude == pytest.approx(
        288.15 - 0.0065 * 6356766.0 * 11000.0 / (6356766.0 + 11000.0), rel=1e-9)


# --- nitrogen test gas, 90-320 K, 1-10 bar (gas phase) -----------------------------------------


def test_nitrogen_is_within_2_percent_of_span_2000_over_90_to_320_K_and_1_to_10_bar():
    # CoolProp "Nitrogen" = Span et al. (2000) EOS, Lemmon & Jacobsen (2004) viscosity
    T, p = np.meshgrid(np.linspace(90.0, 320.0, 24), np.linspace(1e5, 10e5, 10))
    psat = np.nan_to_num(gases.nitrogen_saturation_pressure_si(T), nan=np.inf)
    gas = p < 0.995 * psat  # below the critical point the liquid side is refused (gas only)
    T, p = T[gas], p[gas]
    s = gases.nitrogen_si(T, p)
    for key, got in (("D", s.density_si), ("V", s.dynamic_viscosity_si),
                     ("A", s.speed_of_sound_si)):
        ref = np.array([CP.PropsSI(key, "T", a, "P", b, "Nitrogen") for a, b in zip(T, p,
                                                                                   strict=True)])
        assert _rel(got, ref) < 2e-2, key


def test_nitrogen_covers_the_corners_of_the_box_where_it_is_gas():
    # 90 K / 1 bar, 320 K / 1 bar, 320 K / 10 bar are gas; Span et al. (2000) via CoolProp
    for t, p in ((90.0, 1e5), (320.0, 1e5), (320.0, 10e5), (110.0, 10e5)):
        ref = CP.PropsSI("D", "T", t, "P", p, "Nitrogen")
        assert float(fp.nitrogen(f"{t} K", f"{p / 1e5} bar").density.to("kg/m^3").magnitude) \
            == pytest.approx(ref, rel=2e-2)


def test_nitrogen_refuses_the_liquid_corner_naming_the_saturation_pressure():
    # 90 K, 10 bar is compressed liquid: saturation pressure 3.6 bar at 90 K (Span et al. 2000)
    with pytest.raises(fp.OutOfRangeError, match=r"liquid \(saturation pressure 3\.6"):
        fp.nitrogen("90 K", "10 bar")


# --- fluid listing -------------------------------------------------------------------------------


def test_every_listed_fluid_states_its_validity_ranges_and_evaluates_inside_them():
    for info in fp.list_fluids():
        if info.name.startswith("coolprop:"):
            continue  # optional back-end, exercised in test_gases
        t = info.range_of("temperature")
        assert t is not None and t.low < t.high
        p = info.range_of("pressure")
        p_mid = 101325.0 if p is None or p.low <= 101325.0 <= p.high else 0.5 * (p.low + p.high)
        mid = 0.5 * (t.low + t.high)
        s = info.evaluate_si(np.array([mid]), p_mid)
        assert np.all(np.isfinite(s.density_si)) and np.all(s.density_si > 0), info.name


def test_listing_names_the_built_in_fluids():
    names = [f.name for f in fp.list_fluids()]
    assert names[:5] == ["fresh_water", "sea_water", "glycerol_water", "air", "nitrogen"]


# --- strings, units, errors ---------------------------------------------------------------------


@pytest.mark.parametrize("text", ["15 degC", "59 degF", "288.15 K"])
def test_the_three_temperature_spellings_give_the_same_state(text):
    # 59 degF = 15 degC = 288.15 K exactly (definition of the scales)
    for f in (fp.fresh_water, fp.air):
        assert f(text).temperature.to("K").magnitude == pytest.approx(288.15, abs=1e-9)
    assert fp.sea_water(text, "35 g/kg").temperature.to("K").magnitude == pytest.approx(288.15)


def test_salinity_and_pressure_strings_are_read_in_their_units():
    # 35 g/kg = 0.035 kg/kg, 2 bar = 2e5 Pa (SI definitions); TEOS-10 density at 2 bar
    s = fp.sea_water("15 degC", "35 g/kg", pressure="2 bar")
    assert s.pressure.to("Pa").magnitude == pytest.approx(2e5)
    assert s.density.to("kg/m^3").magnitude == pytest.approx(
        float(gsw.rho_t_exact(35.0, 15.0, (2e5 - 101325.0) / 1e4)), rel=1e-10)
    assert fp.air("15 degC", "2 bar").pressure.to("Pa").magnitude == pytest.approx(2e5)
    assert fp.nitrogen("15 degC", "2 bar").pressure.to("Pa").magnitude == pytest.approx(2e5)


@pytest.mark.parametrize(("call", "pattern"), [
    (lambda: fp.fresh_water("41 degC"), r"temperature 41 degC .*: 0 to 40 degC"),
    (lambda: fp.sea_water("15 degC", "43 g/kg"), r"salinity 43 g/kg .*: 0 to 42 g/kg"),
    (lambda: fp.sea_water("-1 degC", "35 g/kg"), r"temperature -1 degC .*: 0 to 40 degC"),
    (lambda: fp.air("15 degC", "30 bar"), r"pressure 3e\+06 Pa .*: 1000 to 2e\+06 Pa"),
    (lambda: fp.air("150 degC"), r"temperature 150 degC .*: -73.15 to 126.85 degC"),
    (lambda: fp.standard_atmosphere("-3 km"), r"altitude -3000 m .*"),
    (lambda: fp.nitrogen("600 K"), r"temperature .* nitrogen: .*65 to 500 K"),
    (lambda: fp.glycerol_water("20 degC", 1.5), r"mass_fraction 1500 g/kg .*: 0 to 1000 g/kg"),
])
def test_out_of_range_errors_name_the_quantity_the_value_and_the_range(call, pattern):
    with pytest.raises(fp.OutOfRangeError, match=pattern):
        call()


def test_out_of_range_error_is_a_value_error():
    assert issubclass(fp.OutOfRangeError, ValueError)


@pytest.mark.parametrize(("call", "expected"), [
    (lambda: fp.fresh_water("15 m"), r"temperature: .*expected \[temperature\]"),
    (lambda: fp.sea_water("15 degC", "35 m"), r"salinity: .*expected dimensionless"),
    (lambda: fp.air("15 degC", "2 m"), r"pressure: .*expected \[mass\] / \[length\]"),
    (lambda: fp.standard_atmosphere("3 s"), r"altitude: .*expected \[length\]"),
    (lambda: fp.nitrogen("100 Pa"), r"temperature: .*expected \[temperature\]"),
    (lambda: fp.fresh_water(15.0), r"temperature: 15.0 has dimension a bare number"),
])
def test_wrong_dimension_errors_name_the_expected_dimension(call, expected):
    with pytest.raises(UnitInputError, match=expected):
        call()


# --- NaN and broadcasting -------------------------------------------------------------------------


def test_nan_propagates_only_where_the_user_passed_nan():
    t = Q_(np.array([5.0, np.nan, 25.0]), "degC")
    for s in (fp.fresh_water(t), fp.sea_water(t, "35 g/kg"), fp.air(t)):
        rho = s.density.to("kg/m^3").magnitude
        assert np.isnan(rho[1]) and np.all(np.isfinite(rho[[0, 2]]))
    sal = Q_(np.array([0.0, np.nan, 42.0]), "g/kg")
    rho = fp.sea_water("10 degC", sal).density.to("kg/m^3").magnitude
    assert np.isnan(rho[1]) and np.all(np.isfinite(rho[[0, 2]]))
    z = Q_(np.array([0.0, np.nan, 20.0]), "km")
    rho = fp.standard_atmosphere(z).density.to("kg/m^3").magnitude
    assert np.isnan(rho[1]) and np.all(np.isfinite(rho[[0, 2]]))


def test_temperature_row_broadcasts_against_a_pressure_column():
    t = Q_(np.array([0.0, 20.0, 40.0]), "degC")
    p = Q_(np.array([[0.5], [2.0], [10.0]]), "bar")
    for f in (fp.fresh_water, fp.air):
        rho = f(t, p).density.to("kg/m^3").magnitude
        assert rho.shape == (3, 3)
        for i, pi in enumerate((0.5, 2.0, 10.0)):
            for j, tj in enumerate((0.0, 20.0, 40.0)):
                one = f(f"{tj} degC", f"{pi} bar").density.to("kg/m^3").magnitude
                assert rho[i, j] == pytest.approx(float(one), rel=1e-12)


def test_temperature_row_broadcasts_against_a_salinity_column():
    t = Q_(np.array([0.0, 20.0, 40.0]), "degC")
    sal = Q_(np.array([[0.0], [35.0], [42.0]]), "g/kg")
    rho = fp.sea_water(t, sal).density.to("kg/m^3").magnitude
    # TEOS-10 at zero sea pressure, broadcast by numpy in gsw
    ref = gsw.rho_t_exact(np.array([[0.0], [35.0], [42.0]]), np.array([0.0, 20.0, 40.0]), 0.0)
    assert rho.shape == (3, 3) and _rel(rho, ref) < 1e-12


def test_nitrogen_temperature_row_broadcasts_against_a_pressure_column():
    t = Q_(np.array([150.0, 250.0, 320.0]), "K")
    p = Q_(np.array([[1.0], [10.0]]), "bar")
    rho = fp.nitrogen(t, p).density.to("kg/m^3").magnitude
    ref = np.array([[CP.PropsSI("D", "T", a, "P", b * 1e5, "Nitrogen") for a in (150, 250, 320)]
                    for b in (1.0, 10.0)])
    assert rho.shape == (2, 3) and _rel(rho, ref) < 2e-2


@pytest.mark.parametrize("call", [
    lambda t, p: fp.fresh_water(t, p),
    lambda t, p: fp.air(t, p),
    lambda t, p: fp.sea_water(t, Q_(np.array([0.0, 35.0]), "g/kg")),
])
def test_shapes_that_do_not_broadcast_are_refused_naming_the_inputs(call):
    # numpy broadcasting rules: (3,) and (2,) do not broadcast
    t = Q_(np.array([0.0, 20.0, 40.0]), "degC")
    p = Q_(np.array([1.0, 2.0]), "bar")
    with pytest.raises(fp.ShapeMismatchError, match=r"temperature \(3,\)"):
        call(t, p)


def test_an_infinite_temperature_is_out_of_range_not_a_nan_result():
    # only a NaN passed by the user may come back as NaN; inf is outside every range
    with pytest.raises(fp.OutOfRangeError, match="temperature inf"):
        water.fresh_water_si(np.array([280.0, np.inf]))

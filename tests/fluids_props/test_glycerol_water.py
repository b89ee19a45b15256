"""Glycerol-water mixtures: handbook values and CoolProp's incompressible 'MGL' as oracles."""

from __future__ import annotations

import importlib

import CoolProp.CoolProp as CP
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import fluids_props as fp
from fluids_props import OutOfRangeError
from fluids_props import water as w

# The package exports the function glycerol_water, which shadows the module attribute.
gw = importlib.import_module("fluids_props.glycerol_water")


def _melinder(prop, t_c, c):
    # CoolProp INCOMP::MGL: aqueous glycerol, fit to Melinder (2010) tables, C_m <= 0.6
    return CP.PropsSI(prop, "T", t_c + 273.15, "P", 101325, f"INCOMP::MGL[{c}]")


@pytest.mark.parametrize(("c", "rho"), [(0.5, 1126.3), (0.8, 1208.5), (1.0, 1261.1)])
def test_density_at_20_degC_matches_handbook_values(c, rho):
    # Glycerol-water densities at 20 degC (Bosart & Snoddy 1928, as tabulated by the Glycerine
    # Producers' Association 1963); values quoted from memory to 0.1 kg/m^3
    assert float(gw.density(293.15, c)) == pytest.approx(rho, rel=5e-4)


@pytest.mark.parametrize(("c", "mu_mpas"), [(0.5, 6.00), (0.6, 10.8), (0.8, 60.1), (1.0, 1412)])
def test_viscosity_at_20_degC_matches_segur_oberstar_table(c, mu_mpas):
    # Segur & Oberstar (1951), Ind. Eng. Chem. 43:2117, 20 degC, mPa s; values quoted from
    # memory. Cheng (2008) fitted these data; allow 2 %.
    assert float(gw.dynamic_viscosity(293.15, c)) * 1e3 == pytest.approx(mu_mpas, rel=0.02)


def test_density_agrees_with_coolprop_mgl_within_0_1_percent():
    for t in (10.0, 20.0, 30.0, 40.0):
        for c in (0.1, 0.3, 0.5, 0.6):
            assert float(gw.density(t + 273.15, c)) == pytest.approx(_melinder("D", t, c),
                                                                     rel=1e-3)


def test_viscosity_agrees_with_coolprop_mgl_within_5_percent_at_20_to_40_degC():
    # two independent fits of the same kind of tabulated data (Cheng 2008 vs Melinder 2010)
    for t in (20.0, 30.0, 40.0):
        for c in (0.1, 0.3, 0.5, 0.6):
            got = float(gw.dynamic_viscosity(t + 273.15, c))
            assert got == pytest.approx(_melinder("V", t, c), rel=0.05)


def test_zero_glycerol_viscosity_is_close_to_iapws_water():
    # Cheng's water term (Eq. 21) against IAPWS R12-08 over 0-40 degC: within 2 %
    T = np.linspace(273.15, 313.15, 9)
    mu = gw.dynamic_viscosity(T, 0.0)
    ref = w.dynamic_viscosity(T, w.density(T))
    assert np.max(np.abs(mu / ref - 1)) < 0.02


def test_vapour_pressure_follows_raoult_law():
    # Raoult: p = x_w p_w; 50 wt% glycerol: x_w = (0.5/18.015268)/(0.5/18.015268 + 0.5/92.09)
    x_w = (0.5 / 18.015268) / (0.5 / 18.015268 + 0.5 / 92.09)
    expected = x_w * float(w.vapour_pressure(293.15))
    assert float(gw.vapour_pressure(293.15, 0.5)) == pytest.approx(expected, rel=1e-12)


def test_percent_string_is_read_as_mass_fraction():
    s = gw.glycerol_water("20 degC", "50 %")
    assert float(s.extra["mass_fraction"]) == pytest.approx(0.5)
    assert s.surface_tension_si is None


def test_mass_fraction_above_one_raises():
    with pytest.raises(OutOfRangeError, match="mass_fraction"):
        gw.glycerol_water("20 degC", 1.2)


def test_nan_mass_fraction_propagates():
    s = gw.glycerol_water_si(293.15, mass_fraction=np.array([0.3, np.nan]))
    assert np.isnan(s.density_si[1]) and np.isfinite(s.dynamic_viscosity_si[0])


def test_fluid_info_is_a_liquid_named_glycerol_water():
    assert (gw.FLUID_INFO.name, gw.FLUID_INFO.kind) == ("glycerol_water", "liquid")
    assert gw.FLUID_INFO.range_of("mass_fraction") == gw.W_RANGE


@settings(max_examples=50, deadline=None)
@given(st.floats(min_value=273.15, max_value=373.15), st.floats(0.0, 1.0), st.floats(0.0, 1.0))
def test_more_glycerol_means_denser_and_more_viscous(T, a, b):
    lo, hi = sorted((a, b))
    if hi - lo > 1e-3:
        assert gw.density(T, hi) > gw.density(T, lo)
        assert gw.dynamic_viscosity(T, hi) > gw.dynamic_viscosity(T, lo)


def test_package_exports_the_glycerol_water_function():
    # Same result through the package entry point as through the module (self-consistency).
    s = fp.glycerol_water("20 degC", 0.5)
    assert s.density.to("kg/m^3").magnitude == pytest.approx(float(gw.density(293.15, 0.5)),
                                                              rel=1e-12)


@pytest.mark.parametrize("spelling", ["glycerol_water", "glycerol-water", "Glycerol Water",
                                      "glycerol", "glycerine"])
def test_catalogue_finds_glycerol_water_by_its_usual_spellings(spelling):
    assert fp.get_fluid(spelling).name == "glycerol_water"


def test_catalogue_lists_glycerol_water_with_its_validity_ranges():
    info = next(f for f in fp.list_fluids() if f.name == "glycerol_water")
    # Cheng (2008) viscosity fit: 0-100 degC, 0-1 kg/kg glycerol
    t, c = info.range_of("temperature"), info.range_of("mass_fraction")
    assert (t.low, t.high, c.low, c.high) == (273.15, 373.15, 0.0, 1.0)


def test_catalogue_evaluation_takes_the_mass_fraction():
    info = fp.get_fluid("glycerol-water")
    s = info.evaluate_si(293.15, 101325.0, mass_fraction=0.6)
    # Segur & Oberstar (1951) 20 degC, 60 % glycerol: 10.8 mPa s (from memory, 2 %)
    assert float(s.dynamic_viscosity_si) * 1e3 == pytest.approx(10.8, rel=0.02)

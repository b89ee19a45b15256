"""The ISO 2533 / ICAO standard atmosphere against its tables and its defining equations."""

import importlib

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import fluids_props as fp

atm = importlib.import_module("fluids_props.atmosphere")


# -- ISO 2533 check values ------------------------------------------------------------------
# Table values of ISO 2533:1975 / ICAO Doc 7488 (the same as the U.S. Standard Atmosphere 1976
# below 32 km), quoted from memory; they follow from the standard's defining constants.

def test_sea_level_temperature_pressure_and_density():
    s = fp.standard_atmosphere("0 m")
    assert s.temperature_si == pytest.approx(288.15, abs=1e-9)  # ISO 2533 T0
    assert s.pressure_si == pytest.approx(101325.0, abs=1e-6)  # ISO 2533 p0
    assert s.density_si == pytest.approx(1.225, rel=1e-5)  # ISO 2533 rho0 = 1.225 kg/m^3


def test_sea_level_speed_of_sound_and_kinematic_viscosity():
    s = fp.standard_atmosphere("0 m")
    assert s.speed_of_sound_si == pytest.approx(340.294, abs=1e-3)  # ISO 2533 a0
    assert s.kinematic_viscosity_si == pytest.approx(1.4607e-5, rel=5e-5)  # ISO 2533 nu0


def test_sea_level_dynamic_viscosity_by_the_sutherland_law():
    # ISO 2533 / US Standard Atmosphere 1976: mu0 = 1.7894e-5 Pa s (beta 1.458e-6, S 110.4 K).
    assert fp.standard_atmosphere("0 m").dynamic_viscosity_si == pytest.approx(1.7894e-5,
                                                                               rel=5e-5)


def test_tropopause_at_11_km_geopotential():
    s = fp.standard_atmosphere("11 km", geopotential=True)
    assert s.temperature_si == pytest.approx(216.65, abs=1e-9)  # ISO 2533
    assert s.pressure_si == pytest.approx(22632.0, rel=5e-5)  # ISO 2533: 22 632 Pa


def test_top_of_the_isothermal_layer_at_20_km_geopotential():
    s = fp.standard_atmosphere("20 km", geopotential=True)
    assert s.temperature_si == pytest.approx(216.65, abs=1e-9)  # ISO 2533
    assert s.pressure_si == pytest.approx(5474.9, rel=2e-5)  # ISO 2533: 5474.9 Pa


def test_upper_layers_at_32_and_47_km_geopotential():
    # US Standard Atmosphere 1976 Table 4 (= ISO 2533 to 50 km), from memory: 868.02 Pa at
    # 32 km (228.65 K) and 110.91 Pa at 47 km (270.65 K).
    s32 = fp.standard_atmosphere("32 km", geopotential=True)
    s47 = fp.standard_atmosphere("47 km", geopotential=True)
    assert (s32.temperature_si, s47.temperature_si) == pytest.approx((228.65, 270.65))
    assert s32.pressure_si == pytest.approx(868.02, rel=1e-4)
    assert s47.pressure_si == pytest.approx(110.91, rel=1e-4)


def test_table_starts_at_minus_2_km_geopotential():
    # ISO 2533 table at -2000 m geopotential (from memory): 301.15 K, 127 774 Pa.
    s = fp.standard_atmosphere("-2 km", geopotential=True)
    assert s.temperature_si == pytest.approx(301.15, abs=1e-9)
    assert s.pressure_si == pytest.approx(127774.0, rel=1e-5)


def test_geometric_altitude_is_the_default():
    # U.S. Standard Atmosphere 1976 table at 11 000 m geometric (from memory): 216.774 K,
    # 2.2700e4 Pa; geopotential altitude 10 981 m with r0 = 6 356 766 m.
    s = fp.standard_atmosphere("11 km")
    assert s.temperature_si == pytest.approx(216.774, abs=1e-3)
    assert s.pressure_si == pytest.approx(22700.0, rel=1e-4)
    assert s.extra["geopotential_altitude"] == pytest.approx(10981.0, abs=0.1)


def test_feet_are_accepted():
    # 36 089.24 ft = 11 000 m (international foot, 0.3048 m): the tropopause.
    s = fp.standard_atmosphere("36089.24 ft", geopotential=True)
    assert s.temperature_si == pytest.approx(216.65, abs=1e-6)


def test_arrays_of_altitudes_broadcast():
    s = fp.standard_atmosphere(["0 km", "11 km", "20 km"], geopotential=True)
    assert np.allclose(s.temperature_si, [288.15, 216.65, 216.65])


# -- defining equations (property tests) ----------------------------------------------------

@settings(max_examples=60, deadline=None)
@given(h=st.floats(-1900.0, 79000.0))
def test_pressure_is_in_hydrostatic_balance_with_standard_gravity(h):
    # ISO 2533 definition: dp/dH = -rho g0 with H geopotential and g0 = 9.80665 m/s^2.
    d = 1.0
    lo = atm.standard_atmosphere_si(h - d, geopotential=True)
    hi = atm.standard_atmosphere_si(h + d, geopotential=True)
    mid = atm.standard_atmosphere_si(h, geopotential=True)
    dpdh = (hi.pressure_si - lo.pressure_si) / (2 * d)
    assert dpdh == pytest.approx(-mid.density_si * 9.80665, rel=1e-5)


@settings(max_examples=60, deadline=None)
@given(h=st.floats(-2000.0, 80000.0))
def test_air_is_a_perfect_gas_with_gamma_1_4(h):
    # ISO 2533: rho = p / (R T), a = sqrt(1.4 R T), R = 287.05287 J/(kg K).
    s = atm.standard_atmosphere_si(h, geopotential=True)
    assert s.density_si == pytest.approx(s.pressure_si / (287.05287 * s.temperature_si))
    assert s.speed_of_sound_si == pytest.approx(np.sqrt(1.4 * 287.05287 * s.temperature_si))
    assert s.extra["ratio_of_specific_heats"] == 1.4


@settings(max_examples=40, deadline=None)
@given(z=st.floats(-2000.0, 80000.0))
def test_geometric_and_geopotential_inputs_agree(z):
    # ISO 2533: H = r0 z / (r0 + z), r0 = 6 356 766 m.
    a = atm.standard_atmosphere_si(z)
    b = atm.standard_atmosphere_si(6356766.0 * z / (6356766.0 + z), geopotential=True)
    assert a.pressure_si == pytest.approx(b.pressure_si, rel=1e-12)


def test_array_and_scalar_evaluation_agree():
    z = np.linspace(-2000.0, 30000.0, 17)
    arr = atm.standard_atmosphere_si(z)
    for i, zi in enumerate(z):
        assert arr.density_si[i] == pytest.approx(atm.standard_atmosphere_si(zi).density_si,
                                                  rel=1e-13)


# -- errors -----------------------------------------------------------------------------------

def test_altitude_above_the_table_is_refused_with_the_range():
    with pytest.raises(fp.OutOfRangeError, match=r"altitude 100000 m is outside .*-2000 to"):
        fp.standard_atmosphere("100 km")


def test_altitude_below_minus_2_km_is_refused():
    with pytest.raises(fp.OutOfRangeError, match="altitude"):
        fp.standard_atmosphere("-3 km")


def test_a_bare_number_is_refused_as_altitude():
    with pytest.raises(ValueError, match="altitude"):
        fp.standard_atmosphere(1000)

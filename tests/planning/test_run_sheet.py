"""The operator's run sheet (similitude.planning.run_sheet): runs in the order run, loading
changes and wave calibrations between them, and what each kind of facility sets per run."""

from __future__ import annotations

from pathlib import Path

import CoolProp.CoolProp as CP
import numpy as np
import pytest
from iapws import IAPWS95

import similitude as sim
from similitude.planning.matrix import facility_time_hours
from similitude.planning.run_sheet import DISSOLVED_AIR_ADVICE, run_sheet

DEMO = Path(__file__).parents[2] / "demo_cases"


@pytest.fixture(scope="module")
def plans():
    return {name: sim.plan(sim.load_case(DEMO / f"{name}.toml"))
            for name in ("ferry_resistance", "offshore_seakeeping", "propeller_cavitation",
                         "wing_wind_tunnel")}


def test_the_run_sheet_lists_every_run_in_the_order_of_the_matrix(plans):
    plan = plans["ferry_resistance"]
    rs = run_sheet(plan)
    assert rs.frame["run"].tolist() == plan.matrix["run"].tolist()
    assert rs.frame["loading"].tolist() == plan.matrix["loading"].tolist()


def test_a_loading_change_comes_before_the_first_run_of_each_new_loading_with_its_ballast(
        plans):
    plan = plans["ferry_resistance"]
    rs = run_sheet(plan)
    loads = plan.matrix["loading"].tolist()
    firsts = [i for i in range(1, len(loads)) if loads[i] != loads[i - 1]]
    assert [pos for pos, _ in rs.events] == firsts
    text = rs.events[0][1]
    mass = plan.model_build.masses[loads[firsts[0]]]
    assert f"'{loads[firsts[0]]}'" in text and f"{mass:.1f} kg" in text and "(1 h)" in text


def test_each_wave_condition_is_calibrated_before_its_first_run(plans):
    plan = plans["offshore_seakeeping"]
    events = run_sheet(plan).events
    waves = plan.matrix["wave"].tolist()
    assert [pos for pos, _ in events] == [waves.index(w) for w in dict.fromkeys(waves)]
    assert all("without the model" in text for _, text in events)


def test_the_sheet_keeps_blank_columns_for_the_measured_value_and_remarks(plans):
    f = run_sheet(plans["ferry_resistance"]).frame
    assert (f["measured resistance [N]"] == "").all() and (f["remarks"] == "").all()


def test_rotation_rates_are_given_in_rps_and_rpm(plans):
    # 1 rpm = 1/60 revolution per second (definition of the minute, SI Brochure Table 8)
    f = run_sheet(plans["propeller_cavitation"]).frame
    np.testing.assert_allclose(f["model rotation rate [rpm]"],
                               60.0 * f["model rotation rate [rps]"], rtol=1e-15)
    np.testing.assert_allclose(f["model rotation rate [rps]"],
                               plans["propeller_cavitation"].matrix[
                                   "model rotation rate [1/s]"], rtol=1e-15)


def test_cavitation_number_of_each_run_is_on_the_rotation_speed_at_the_tunnel_pressure(plans):
    # sigma_n = (p - p_v)/(rho n^2 D^2 / 2) (ITTC Symbols and Terminology 2017); rho and p_v
    # of pure water at the planned temperature from IAPWS-95 (the iapws package), D = 4.2 m
    # / lambda from demo_cases/propeller_cavitation.toml
    plan = plans["propeller_cavitation"]
    f = run_sheet(plan).frame
    (label,) = [c for c in f.columns if c.startswith("static pressure")]
    p = f[label].iloc[0] * 1e3
    t = float(plan.model_fluid.temperature_si)
    water = IAPWS95(T=t, P=p / 1e6)
    pv = IAPWS95(T=t, x=0).P * 1e6
    n = f["model rotation rate [rps]"].to_numpy()
    d = 4.2 / plan.scale
    expected = (p - pv) / (0.5 * water.rho * n**2 * d**2)
    np.testing.assert_allclose(f["cavitation number sigma_n [-]"], expected, rtol=2e-5)


def test_a_cavitation_tunnel_sheet_carries_the_water_temperature_and_the_air_advice(plans):
    plan = plans["propeller_cavitation"]
    rs = run_sheet(plan)
    t = float(plan.model_fluid.temperature_si) - 273.15
    np.testing.assert_allclose(rs.frame["planned water temperature [degC]"], t)
    assert "dissolved air [% of saturation]" in rs.frame
    assert rs.notes == (DISSOLVED_AIR_ADVICE,)
    assert "ITTC 7.5-02-03-03.1" in DISSOLVED_AIR_ADVICE


def test_wind_tunnel_runs_carry_mach_number_and_dynamic_pressure(plans):
    # Ma = V/a, q = rho V^2/2; a and rho of air at the planned state from CoolProp
    # (PropsSI 'A' and 'D' for 'Air', a pseudo-pure fluid: dry air)
    plan = plans["wing_wind_tunnel"]
    f = run_sheet(plan).frame
    t, p = float(plan.model_fluid.temperature_si), float(plan.model_fluid.pressure_si)
    v = f["model speed [m/s]"].to_numpy()
    np.testing.assert_allclose(f["Mach number [-]"], v / CP.PropsSI("A", "T", t, "P", p, "Air"),
                               rtol=2e-3)
    np.testing.assert_allclose(f["dynamic pressure [Pa]"],
                               0.5 * CP.PropsSI("D", "T", t, "P", p, "Air") * v**2, rtol=2e-3)


def test_an_angle_sweep_runs_the_polar_at_each_speed(plans):
    # demo_cases/wing_wind_tunnel.toml: angles -4, 0, 4, 8, 12 deg at each of 2 speeds, twice
    f = run_sheet(plans["wing_wind_tunnel"]).frame
    assert f["angle of attack [deg]"].tolist()[:5] == [-4.0, 0.0, 4.0, 8.0, 12.0]
    assert len(f) == 2 * 2 * 5
    assert f["model speed [m/s]"].iloc[:5].nunique() == 1


def test_the_sheet_hours_are_the_plans_facility_hours(plans):
    plan = plans["offshore_seakeeping"]
    assert run_sheet(plan).total_hours == pytest.approx(facility_time_hours(plan.matrix))

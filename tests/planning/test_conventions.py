"""Conventions per kind of test: a propeller's one Reynolds number (blade section at 0.7 R)
and its two cavitation numbers told apart, the dynamometer named when it binds, the pressures
labelled; speeds in the unit the case wrote; no friction line, loading, heading or Froude
number where they mean nothing; cautions worded for tests in air.

Sources: Re_0.7R = c_0.7R sqrt(V_A^2 + (0.7 pi n D)^2)/nu (ITTC 7.5-02-03-02.1, open-water
test, Reynolds number at 0.7 R); ITTC-78 blade-section drag C_DM = 2(1 + 2t/c)(0.044 Re^-1/6 -
5 Re^-2/3) (ITTC 7.5-02-03-01.4); sigma_n = (p - p_v)/(rho n^2 D^2/2) and sigma_v = (p -
p_v)/(rho V_A^2/2), so sigma_v = sigma_n / J^2 with J = V_A/(nD) (ITTC Symbols and
Terminology 2017); 1 kn = 1852/3600 m/s, 1 km/h = 1/3.6 m/s (BIPM SI Brochure 2019, Table 8).
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest
from openpyxl import load_workbook
from scenarios import tank

from similitude.cli import main
from similitude.errors import InputError
from similitude.planning.case import Case, FluidSpec, MatchRequest, Prototype
from similitude.planning.facilities import Facility
from similitude.planning.planner import plan
from similitude.readers.case_file import load_case

DEMO = Path(__file__).parents[2] / "demo_cases"


@pytest.fixture(scope="module")
def propeller():
    return plan(load_case(DEMO / "propeller_cavitation.toml"))


@pytest.fixture(scope="module")
def wing():
    return plan(load_case(DEMO / "wing_wind_tunnel.toml"))


# -- propellers -----------------------------------------------------------------------------
def test_propeller_runs_carry_the_blade_section_reynolds_number_of_the_groups(propeller):
    p = propeller
    m = p.matrix
    assert "model Reynolds number [-]" not in m       # no V D / nu on a ship friction line
    design = m[m["prototype speed [m/s]"] == 6.5].iloc[0]
    g = p.groups[(p.groups["key"] == "reynolds") & (p.groups["prototype speed [m/s]"] == 6.5)]
    assert design["model Reynolds number Re_0.7R [-]"] == pytest.approx(
        g["model value"].iloc[0], rel=1e-12)
    # by hand: D_m = 0.25 m, c_m = 1.3/16.8 m, n_m from the matrix, nu of the model water
    nu = float(p.model_fluid.kinematic_viscosity_si)
    d_m, c_m = 0.25, 1.3 / 16.8
    vm, n = design["model speed [m/s]"], design["model rotation rate [1/s]"]
    assert design["model Reynolds number Re_0.7R [-]"] == pytest.approx(
        c_m * math.hypot(vm, 0.7 * math.pi * n * d_m) / nu, rel=1e-9)


def test_propeller_cavitation_numbers_are_labelled_apart_with_their_definitions(propeller):
    g = propeller.groups
    sn = g[g["symbol"] == "sigma_n"]
    sv = g[g["symbol"] == "sigma_v"]
    assert sn["group"].iloc[0].endswith("sigma_n = (p - p_v)/(rho n^2 D^2 / 2)")
    assert sv["group"].iloc[0].endswith("sigma_v = (p - p_v)/(rho V_A^2 / 2)")
    j = g[g["key"] == "advance_ratio"]["prototype value"].to_numpy()
    # sigma_v = sigma_n / J^2 at both speeds (J = 5.5/(1.75 x 4.2) = 0.7483 at the first)
    assert sv["prototype value"].to_numpy() == pytest.approx(
        sn["prototype value"].to_numpy() / j**2, rel=1e-9)
    assert j[0] == pytest.approx(5.5 / (1.75 * 4.2), rel=1e-12)


def test_propeller_workbook_uses_the_blade_drag_not_a_ship_friction_line(propeller, tmp_path):
    wb = load_workbook(propeller.to_excel(tmp_path / "p.xlsx"))
    ws = wb["Test day"]
    text = " ".join(str(c.value) for row in ws.iter_rows() for c in row if c.value)
    assert "ITTC-78 blade section drag C_D model [-]" in text
    assert "ITTC-1957" not in text
    charts = " ".join(str(c.value) for row in wb["Charts"].iter_rows() for c in row if c.value)
    assert "ITTC-1957" not in charts and "Re_0.7R" in charts


def test_binding_limit_names_the_dynamometer_when_it_binds():
    # Open-water propeller at Froude speed: n_m = n_p sqrt(lambda) <= 8 rps needs
    # lambda <= (8/2)^2 = 16; the smallest model sits there.
    proto = Prototype("propeller", 4.0, (6.0,), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 4.0, "blade_chord": 1.2}, rotation_rates=(2.0,))
    p = plan(Case(proto, tank(max_rotation_rate=8.0),
                  MatchRequest(exact=("advance_ratio", "froude"), report=("reynolds",),
                               objective="smallest_model")))
    assert p.scale == pytest.approx(16.0, rel=1e-6)
    assert p.binding_constraint.startswith("model rotation rate (dynamometer maximum)")


def test_tunnel_pressure_that_binds_is_named_with_the_existing_model(propeller):
    assert propeller.binding_constraint.startswith("existing model length (active limits: "
                                                   "static pressure at the facility maximum "
                                                   "200 kPa")


def test_depressurised_tank_shows_air_and_shaft_centre_pressures_labelled():
    # shaft-centre pressure = air pressure + rho_m g (immersion / lambda): 6 m at 1:16
    proto = Prototype("propeller", 4.0, (6.0,), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 4.0, "blade_chord": 1.2}, rotation_rates=(2.0,),
                      immersion=6.0)
    p = plan(Case(proto, tank(pressure_range=(2.5e3, 101325.0), max_rotation_rate=40.0),
                  MatchRequest(exact=("advance_ratio", "cavitation"), report=("reynolds",),
                               model_length=0.25)))
    pr = p.model_pressures
    air, shaft = pr["air pressure above the water"], pr["static pressure at the shaft centre"]
    rho = float(p.model_fluid.density_si)
    assert shaft == pytest.approx(air + rho * 9.80665 * 6.0 / 16.0, rel=1e-9)
    assert "air pressure above the water" in p.model_pressure_text()
    assert p.to_dict()["model_pressures [Pa]"]["static pressure at the shaft centre"] == shaft


# -- speeds in the user's unit --------------------------------------------------------------
def test_ferry_speeds_stay_in_knots(capsys):
    assert main(["plan", str(DEMO / "ferry_resistance.toml")]) == 0
    assert "14 kn -> 1.572 m/s" in capsys.readouterr().out


def test_wing_speeds_in_metres_per_second_are_not_turned_into_knots(wing, capsys):
    assert "prototype speed [kn]" not in wing.speeds and "prototype speed [kn]" not in wing.matrix
    assert main(["plan", str(DEMO / "wing_wind_tunnel.toml")]) == 0
    out = capsys.readouterr().out
    assert "45 m/s -> " in out and " kn" not in out


def test_speeds_written_in_km_per_h_are_shown_in_km_per_h(tmp_path, capsys):
    text = (DEMO / "wing_wind_tunnel.toml").read_text().replace(
        'speeds = ["45 m/s", "70 m/s"]', 'speeds = ["162 km/h", "252 km/h"]')
    (tmp_path / "facilities").mkdir()
    (tmp_path / "facilities" / "wind_tunnel_demo.toml").write_text(
        (DEMO / "facilities" / "wind_tunnel_demo.toml").read_text())
    path = tmp_path / "wing.toml"
    path.write_text(text)
    case = load_case(path)
    assert case.speed_unit == "km/h"
    p = plan(case)
    # 162 km/h = 45 m/s, shown back as 162
    assert p.speeds["prototype speed [km/h]"].to_numpy() == pytest.approx([162.0, 252.0])
    assert main(["plan", str(path)]) == 0
    assert "162 km/h -> " in capsys.readouterr().out


def test_an_unknown_speed_unit_is_refused():
    proto = Prototype("wing", 2.0, (40.0,), FluidSpec("air", 288.15))
    fac = Facility("wind_tunnel", "wt", 8.0, 2.5, 2.0, (5.0, 120.0), fluids=("air",))
    with pytest.raises(InputError, match="speed_unit: 'kg' is not a unit of speed"):
        Case(proto, fac, MatchRequest(exact=("mach",), scale=4.0), speed_unit="kg")


# -- columns and friction lines where they mean something ----------------------------------
def test_wind_tunnel_runs_have_no_loading_heading_or_froude_columns(wing):
    cols = set(wing.matrix.columns)
    assert not cols & {"loading", "heading [deg]", "Froude number [-]",
                       "prototype Froude number [-]"}
    assert "model Reynolds number [-]" in cols


def test_ship_runs_keep_loading_and_froude_columns():
    p = plan(load_case(DEMO / "ferry_resistance.toml"))
    assert {"loading", "Froude number [-]"} <= set(p.matrix.columns)
    assert "heading [deg]" not in p.matrix          # calm water, no headings given


def test_wing_workbook_has_no_friction_coefficients(wing, tmp_path):
    wb = load_workbook(wing.to_excel(tmp_path / "w.xlsx"))
    for sheet in ("Test day", "Charts"):
        text = " ".join(str(c.value) for row in wb[sheet].iter_rows() for c in row if c.value)
        assert "C_F" not in text and "ITTC-1957" not in text, sheet
    assert len(wb["Charts"]._charts) == 1      # Reynolds numbers only


def test_wing_plan_cautions_defer_to_wind_tunnel_practice(wing, tmp_path, capsys):
    assert "wind-tunnel" in wing.to_dict()["caution"] and "ITTC" not in wing.to_dict()[
        "caution"]
    assert "AGARD-AG-336" in repr(wing) and "AGARD-AG-336" in wing._repr_html_()

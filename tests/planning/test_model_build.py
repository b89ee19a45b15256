"""What the model shop builds (similitude.planning.model_build): mass per loading in the test
water, Froude-scaled lengths, radii of gyration and natural periods, turbulence stimulators.

Froude scaling (ITTC 7.5-02-07-02.1, 2014; ITTC 7.5-01-01-01, 2017): lengths 1/lambda, volumes
1/lambda^3, periods 1/sqrt(lambda); a model floating at the scaled draught displaces the scaled
volume of its test water, so its mass is that volume times the test water's density.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest
from iapws import IAPWS95

import similitude as sim
from fluids_props import fresh_water, sea_water
from similitude.planning.case import (
    Case,
    FluidSpec,
    LoadingCondition,
    MatchRequest,
    MatrixSpec,
    Prototype,
)
from similitude.planning.model_build import model_build
from tests.planning.scenarios import ship, tank

DEMO = Path(__file__).parents[2] / "demo_cases"


def test_ferry_model_mass_is_its_displacement_volume_times_the_test_water_density():
    # Expected value built here: V_m = V_p / lambda^3 (geometric similarity), rho of pure
    # water at the plan's temperature and 101.325 kPa from IAPWS-95 (the iapws package), the
    # ferry's design displacement 2650 m^3 from demo_cases/ferry_resistance.toml.
    plan = sim.plan(sim.load_case(DEMO / "ferry_resistance.toml"))
    t = float(plan.model_fluid.temperature_si)
    rho = IAPWS95(T=t, P=0.101325).rho
    expected = 2650.0 / plan.scale**3 * rho
    assert plan.model_build.masses["design"] == pytest.approx(expected, rel=1e-6)


def _case(loading, kind="surface_ship", dims=None, **kw) -> Case:
    proto = ship(kind=kind, dimensions=dims or {"beam": 24.0, "draught": 8.0,
                                                "displacement": 20000.0})
    return Case(prototype=proto, facility=tank(), request=MatchRequest(scale=25.0),
                matrix=MatrixSpec(loading=tuple(loading)), **kw)


def _build(case: Case, scale: float = 25.0):
    return model_build(case, scale, fresh_water("20 degC"), sea_water("15 degC"))


def test_lengths_scale_by_lambda_and_periods_by_its_square_root():
    # Froude scaling, hand values at lambda = 25: 1.5 m / 25 = 0.06 m; 10 s / 5 = 2 s
    ld = LoadingCondition("sea", draught=8.0, displacement=20000.0, lcg=70.0, vcg=9.0,
                          gm=1.5, roll_radius=9.0, pitch_radius=37.5, yaw_radius=37.5,
                          heave_period=8.0, roll_period=10.0, pitch_period=7.5)
    b = _build(_case([ld])).loadings[0]
    assert b.model["gm"] == pytest.approx(0.06)
    assert b.model["vcg"] == pytest.approx(0.36)
    assert b.model["lcg"] == pytest.approx(2.8)
    assert b.model["roll_radius"] == pytest.approx(0.36)
    assert b.model["pitch_radius"] == pytest.approx(1.5)
    assert b.model["roll_period"] == pytest.approx(2.0)
    assert b.model["heave_period"] == pytest.approx(1.6)
    assert b.model["pitch_period"] == pytest.approx(1.5)


def test_model_inertia_is_model_mass_times_the_scaled_radius_squared():
    # I = m k^2 (rigid-body definition of the radius of gyration)
    ld = LoadingCondition("sea", draught=8.0, displacement=20000.0, roll_radius=9.0)
    b = _build(_case([ld])).loadings[0]
    assert b.model_inertia["roll"] == pytest.approx(b.model_mass * (9.0 / 25.0) ** 2)


def test_prototype_mass_is_in_the_prototypes_water_and_model_mass_in_the_test_water():
    # m_p / m_m = lambda^3 rho_p / rho_m (Froude scaling of mass with two densities)
    b = _build(_case([LoadingCondition("sea", draught=8.0, displacement=20000.0)]))
    ld = b.loadings[0]
    assert ld.prototype_mass / ld.model_mass == pytest.approx(
        25.0**3 * b.prototype_density / b.model_density)


def test_a_loading_at_the_design_draught_takes_the_prototypes_displacement():
    b = _build(_case([LoadingCondition("design", draught=8.0)]))
    assert b.loadings[0].displacement_from == "prototype"
    assert b.loadings[0].model["displacement"] == pytest.approx(20000.0 / 25.0**3)


def test_a_loading_at_another_draught_without_displacement_has_no_mass_and_says_so():
    b = _build(_case([LoadingCondition("light", draught=6.0)]))
    assert b.loadings[0].model_mass is None
    assert "light" not in b.masses
    assert any("No displacement for loading 'light'" in n for n in b.notes)


def test_a_case_without_loadings_builds_the_design_condition_from_the_prototype():
    b = _build(_case([]))
    assert [ld.name for ld in b.loadings] == ["design"]
    assert b.loadings[0].model["draught"] == pytest.approx(8.0 / 25.0)


def test_stimulator_studs_sit_at_five_percent_of_the_model_length_aft_of_the_fp():
    # Hughes & Allan (1951), Trans. SNAME 59: studs 3.2 mm diameter, 2.5 mm high, 25 mm
    # pitch, at station 19 of 20 (5 % L_PP aft of the FP); sizes from memory of the paper
    b = _build(_case([]))
    studs = b.stimulators[0]
    assert studs.device == "studs"
    assert studs.position == pytest.approx(0.05 * 150.0 / 25.0)
    assert "3.2 mm" in studs.size and "2.5 mm" in studs.size and "25 mm" in studs.size
    assert "Hughes & Allan (1951)" in studs.source
    assert {s.device for s in b.stimulators} == {"studs", "trip wire", "sand strip"}


def test_a_propeller_model_gets_its_diameter_and_no_hull_rows():
    proto = Prototype(kind="propeller", length=5.0, speeds=(8.0,), rotation_rates=(2.0,),
                      fluid=FluidSpec("sea_water", 288.15))
    case = Case(prototype=proto, facility=tank(), request=MatchRequest(scale=20.0))
    b = _build(case, 20.0)
    assert b.propeller_diameter == pytest.approx(0.25)
    assert b.loadings == () and b.stimulators == ()
    assert any("stock propeller" in n for n in b.notes)


def test_a_gm_given_brings_the_ballasting_tolerance_with_its_source():
    b = _build(_case([LoadingCondition("sea", draught=8.0, gm=1.5)]))
    assert any("2 % or 1 mm" in n and "MSC.1/Circ.1200" in n for n in b.notes)


def test_the_table_lists_each_quantity_with_its_scaling():
    b = _build(_case([LoadingCondition("sea", draught=8.0, displacement=20000.0,
                                       roll_period=10.0)]))
    t = b.table()
    row = t[t["quantity"] == "natural period, roll"].iloc[0]
    assert (row["prototype"], row["model"]) == (10.0, pytest.approx(2.0))
    assert row["model / prototype"] == "1/sqrt(lambda)"
    assert math.isclose(t[t["quantity"] == "mass"]["model"].iloc[0], b.masses["sea"])


def test_a_bad_scale_is_an_input_error_naming_it():
    with pytest.raises(sim.InputError, match="scale"):
        _build(_case([]), 0.0)

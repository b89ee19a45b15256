"""Campaigns (planning.campaign, campaign_search, campaign_plan, booking) on invented scenarios,
with windows, binding limits and rankings derived by hand in each test.

Outside references:
* Froude scaling: V_m = V_p / sqrt(lambda), T_m = T_p / sqrt(lambda), H_m = H_p / lambda
  (ITTC Recommended Procedures 7.5-02-02-01, 2011, and 7.5-02-07-02.1, 2014).
* Most probable highest of N Rayleigh-distributed waves H_s sqrt(ln N / 2) (Longuet-Higgins
  1952), N = D / T_z; the ITTC (Bretschneider) spectrum has T_z / T_p = (4 / (5 pi))^(1/4)
  (ITTC 1978 two-parameter spectrum; its zeroth and second moments).
* Reynolds number Re = V L / nu (ITTC Symbols and Terminology, 2017); with Froude scaling the
  prototype/model ratio is (nu_m / nu_p) lambda^1.5. Water viscosities: IAPWS R12-08 through
  fluids_props (itself checked against IAPWS's tables in tests/fluids_props).
* Run time on a carriage: (L_T - L_m - V^2/2a - V^2/2d)/V plus V/a + V/d for accelerating and
  stopping (uniform acceleration, kinematics).
* Blockage limit 0.005 is the planner's (common practice).
"""

import math
import re
from dataclasses import replace

import numpy as np
import pytest
from scenarios import ship, tank

import fluids_props as fp
from similitude.errors import InfeasibleError, InputError
from similitude.planning.campaign import Campaign, CampaignModel, CampaignTest
from similitude.planning.campaign_plan import plan_campaign
from similitude.planning.case import Case, MatrixSpec, WaveCondition

# The ship of scenarios.py: L = 150 m, speeds 6, 8, 10 m/s, A_X = 190 m^2, B = 24 m, T = 8 m.
A_X = 190.0
# A 3 h ITTC sea of T_p = 11 s: T_z = 0.7104 x 11 = 7.815 s, N = 10800 / 7.815 = 1382 waves,
# H_max = H_s sqrt(ln 1382 / 2) = 1.9015 H_s
LARGEST_WAVE = math.sqrt(math.log(10800.0 / (11.0 * (4 / (5 * math.pi)) ** 0.25)) / 2.0)
SEA = WaveCondition("irregular", significant_height=6.0, peak_period=11.0, name="sea",
                    spectrum="ittc", duration=10800.0)


def _blockage_scale(width: float, depth: float) -> float:
    """lambda where A_X / lambda^2 / (B_T h) = 0.005."""
    return math.sqrt(A_X / (0.005 * width * depth))


def _basin(**kw):
    base = dict(kind="wave_basin", name="basin (invented)", length=100.0, width=40.0,
                depth=4.0, speed_range=(0.05, 6.0), wavemaker_period_range=(0.5, 3.0),
                wavemaker_max_height=0.25)
    base.update(kw)
    return tank(**base)


def _test(name, kind, facilities, models=("hull",), **matrix):
    case = Case(ship(), facilities[0], test=kind, matrix=MatrixSpec(**matrix))
    return CampaignTest(name, case, tuple(facilities), models=tuple(models))


def _hull_campaign(tank_facilities, basin_facilities, **kw):
    return Campaign((_test("resistance", "resistance", tank_facilities),
                     _test("seakeeping", "seakeeping", basin_facilities, waves=(SEA,))),
                    (CampaignModel("hull"),), **kw)


# -- a shared model bound by the basin ------------------------------------------------------
@pytest.fixture(scope="module")
def bound_by_basin():
    return plan_campaign(_hull_campaign([tank(name="tank A (invented)")], [_basin()]))


def test_shared_hull_is_bound_by_the_basins_highest_wave(bound_by_basin):
    comb = bound_by_basin.choices[0].chosen
    # tank alone: blockage lambda >= sqrt(190 / (0.005 x 8 x 4)) = 34.46
    # basin alone: 1.9015 x 6 m / lambda <= 0.25 m  ->  lambda >= 45.64, the larger: binding
    assert comb.candidates[0].low == pytest.approx(_blockage_scale(8.0, 4.0), rel=2e-6)
    assert comb.low == pytest.approx(LARGEST_WAVE * 6.0 / 0.25, rel=2e-6)
    assert comb.low_by.test.name == "seakeeping"
    assert "highest wave" in comb.low_by.window.low_limit


def test_shared_hull_is_built_to_the_next_convenient_scale_in_both_facilities(bound_by_basin):
    # 45.64 rounded up to the next whole number (common practice): 1:46, in both plans
    assert bound_by_basin.choices[0].chosen.scale == 46.0
    assert {p.scale for p in bound_by_basin.plans.values()} == {46.0}
    assert bound_by_basin.models.loc[0, "scale"] == "1:46"
    assert bound_by_basin.models.loc[0, "model length [m]"] == pytest.approx(150.0 / 46.0)


def test_reason_names_the_basin_and_its_limit(bound_by_basin):
    text = bound_by_basin.reasons[0]
    assert "basin (invented)" in text and "highest wave" in text and "1:46" in text


# -- a facility infeasible for one test but best for another --------------------------------
@pytest.fixture(scope="module")
def wave_tank_campaign():
    # Tank W: wide and deep, a wavemaker of 0.5-1.2 s, carriage from 0.9 m/s.
    tank_w = tank(name="tank W (invented)", length=300.0, width=12.0, depth=6.0,
                  speed_range=(0.9, 8.0), wavemaker_period_range=(0.5, 1.2),
                  wavemaker_max_height=0.5)
    tests = (_test("resistance", "resistance", [tank_w, tank(name="tank A (invented)")], ()),
             _test("seakeeping", "seakeeping", [tank_w, _basin()], (), waves=(SEA,)))
    return plan_campaign(Campaign(tests))


def test_wave_tank_is_best_for_resistance(wave_tank_campaign):
    r = wave_tank_campaign.rankings["resistance"]
    # tank W: sqrt(190/(0.005 x 12 x 6)) = 22.97 against tank A's 34.46: the larger model
    assert r.iloc[0]["facility"] == "tank W (invented)" and bool(r.iloc[0]["chosen"])
    assert r.iloc[0]["lambda, largest model [-]"] == pytest.approx(_blockage_scale(12.0, 6.0),
                                                                   rel=2e-6)
    assert r.iloc[1]["lambda, largest model [-]"] == pytest.approx(_blockage_scale(8.0, 4.0),
                                                                   rel=2e-6)


def test_wave_tank_cannot_take_the_seakeeping_test(wave_tank_campaign):
    r = wave_tank_campaign.rankings["seakeeping"]
    bad = r[r["facility"] == "tank W (invented)"].iloc[0]
    # T_p = 11 s needs 11/sqrt(lambda) <= 1.2 s: lambda >= 84.0; the carriage minimum 0.9 m/s
    # at 6 m/s needs lambda <= (6/0.9)^2 = 44.4: no model fits
    assert not bad["feasible"] and not bad["chosen"] and math.isnan(bad["rank"])
    assert "wavemaker" in bad["why not"] and "carriage" in bad["why not"]
    assert r.iloc[0]["facility"] == "basin (invented)" and bool(r.iloc[0]["chosen"])
    assert "cannot take it: tank W" in " ".join(wave_tank_campaign.reasons)


# -- windows that do not overlap -------------------------------------------------------------
def test_windows_that_do_not_overlap_are_refused_with_both_limits_named():
    narrow = tank(name="narrow tank (invented)", width=4.0, depth=3.0)
    slow = _basin(name="slow basin (invented)", speed_range=(1.0, 6.0),
                  wavemaker_max_height=0.5)
    # narrow tank: blockage lambda >= sqrt(190/(0.005 x 4 x 3)) = 56.27 (a model no larger);
    # slow basin: 1.9015 x 6/lambda <= 0.5 m -> lambda >= 22.8, and the carriage minimum
    # 6/sqrt(lambda) >= 1.0 m/s  ->  lambda <= 36 (a model no smaller)
    with pytest.raises(InfeasibleError) as err:
        plan_campaign(_hull_campaign([narrow], [slow]))
    lines = str(err.value).splitlines()
    assert "do not overlap" in lines[0]
    assert "narrow tank (invented)" in lines[1] and "blockage" in lines[1]
    assert "slow basin (invented)" in lines[1] and "carriage minimum" in lines[1]
    large, small = (float(x) for x in re.findall(r"as (?:large|small) as 1:([0-9.]+)", lines[1]))
    assert large == pytest.approx(_blockage_scale(4.0, 3.0), rel=2e-6)  # 6 digits shown
    assert small == pytest.approx(36.0, rel=1e-6)
    alone = [line for line in lines if line.startswith("    ")]
    assert len(alone) == 2 and all("largest model" in line for line in alone)


# -- the ranking follows the objective -------------------------------------------------------
COLD = dict(name="cold long tank (invented)", length=250.0, width=10.0, depth=5.0,
            speed_range=(0.1, 8.0), temperature_range=(281.15, 283.15))
WARM = dict(name="warm short tank (invented)", length=120.0, width=8.0, depth=4.0,
            speed_range=(0.1, 8.0), temperature_range=(301.15, 303.15))


def _ranked(objective: str):
    test = _test("resistance", "resistance", [tank(**COLD), tank(**WARM)], (),
                 waiting_time=600.0)
    return plan_campaign(Campaign((test,), objective=objective)).rankings["resistance"]


def _hand_hours(fac: dict, lam: float) -> float:
    """Facility hours of the three prototype speeds, one run each, 600 s waits."""
    a = 0.5  # the tank's acceleration and braking (scenarios.tank)
    lm = 150.0 / lam
    total = 0.0
    for vp in (6.0, 8.0, 10.0):
        v = vp / math.sqrt(lam)
        total += (fac["length"] - lm - v * v / a) / v + 2 * v / a + 600.0
    return total / 3600.0


def test_largest_model_ranks_the_cold_long_tank_first():
    r = _ranked("largest_model")
    # blockage: cold sqrt(190/(0.005 x 50)) = 27.57 < warm 34.46
    assert list(r["facility"]) == [COLD["name"], WARM["name"]]


def test_least_mismatch_ranks_the_warm_tank_first():
    r = _ranked("least_mismatch")
    nu_p = float(fp.sea_water("15 degC").kinematic_viscosity.to("m^2/s").magnitude)
    ratio = {}
    for fac in (COLD, WARM):
        lam = _blockage_scale(fac["width"], fac["depth"])
        t_warm_end = f"{fac['temperature_range'][1] - 273.15} degC"
        nu_m = float(fp.fresh_water(t_warm_end).kinematic_viscosity.to("m^2/s").magnitude)
        ratio[fac["name"]] = nu_m / nu_p * lam ** 1.5
    # cold: 1.31e-6 x 27.57^1.5, warm: 0.80e-6 x 34.46^1.5: the warm tank's model is nearer
    assert ratio[WARM["name"]] < ratio[COLD["name"]]
    assert list(r["facility"]) == [WARM["name"], COLD["name"]]
    got = dict(zip(r["facility"], r["Re prototype / Re model [-]"], strict=True))
    for name, value in ratio.items():
        assert got[name] == pytest.approx(value, rel=1e-6)


def test_fewest_hours_ranks_by_the_hand_computed_facility_time():
    r = _ranked("fewest_hours")
    hours = {fac["name"]: _hand_hours(fac, _blockage_scale(fac["width"], fac["depth"]))
             for fac in (COLD, WARM)}
    assert list(r["facility"]) == sorted(hours, key=hours.get)
    got = dict(zip(r["facility"], r["facility hours [h]"], strict=True))
    for name, value in hours.items():
        assert got[name] == pytest.approx(value, rel=1e-5)


def test_objective_changes_the_chosen_facility():
    chosen = {obj: _ranked(obj).query("chosen").iloc[0]["facility"]
              for obj in ("largest_model", "least_mismatch")}
    assert chosen == {"largest_model": COLD["name"], "least_mismatch": WARM["name"]}


# -- sharing rules and the booking -----------------------------------------------------------
def test_hull_model_in_a_cavitation_tunnel_is_refused():
    tunnel = tank(kind="cavitation_tunnel", name="tunnel (invented)", length=3.0, width=0.6,
                  depth=0.6, speed_range=(1.0, 12.0), pressure_range=(8e3, 2e5))
    tests = (_test("resistance", "resistance", [tank()]),
             CampaignTest("cavitation", Case(ship(), tunnel, test="cavitation"), (tunnel,),
                          models=("hull",)))
    with pytest.raises(InputError) as err:
        Campaign(tests, (CampaignModel("hull"),))
    text = "\n".join(err.value.problems)
    assert "test[1]" in text and "hull model" in text and "cavitation" in text


def test_booking_puts_the_tests_in_natural_order_with_changeovers():
    camp = _hull_campaign([tank(name="tank A (invented)")], [_basin()], changeover=7200.0,
                          working_day=8 * 3600.0)
    # listed seakeeping first: still booked after resistance
    camp = replace(camp, tests=camp.tests[::-1])
    cp = plan_campaign(camp)
    b = cp.bookings
    assert list(b["test"]) == ["resistance", "seakeeping"]
    assert list(b["changeover [h]"]) == [2.0, 2.0]
    assert np.allclose(b["booked hours [h]"], b["test hours [h]"] + 2.0)
    # the hull cannot be in the basin before it leaves the tank
    assert b["start [h]"].iloc[1] == pytest.approx(b["end [h]"].iloc[0])
    assert b["first day"].iloc[1] == int(b["end [h]"].iloc[0] // 8) + 1


def test_model_mass_is_displacement_times_test_water_density_over_lambda_cubed():
    test = _test("resistance", "resistance", [tank()], ())
    proto = replace(test.case.prototype, dimensions={**test.case.prototype.dimensions,
                                                      "displacement": 20000.0})
    test = replace(test, case=replace(test.case, prototype=proto))
    cp = plan_campaign(Campaign((test,)))
    plan = cp.plans["resistance"]
    rho = float(plan.model_fluid.density_si)
    assert cp.models.loc[0, "model mass, design [kg]"] == pytest.approx(
        rho * 20000.0 / plan.scale ** 3, rel=1e-12)


def test_every_output_of_a_campaign_carries_the_cautions(bound_by_basin):
    assert "ITTC" in bound_by_basin.caution and "estimates" in bound_by_basin.caution
    assert bound_by_basin.caution in bound_by_basin._repr_html_()
    assert bound_by_basin.to_dict()["caution"] == bound_by_basin.caution
    assert bound_by_basin.caution in repr(bound_by_basin)

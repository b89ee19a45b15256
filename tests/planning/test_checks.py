"""Facility checks: limits, their sources and what the plan reports about them.

Invented facilities and models; each limit is derived in the comment beside its check.
"""

from __future__ import annotations

import math

import pytest
from scenarios import ship, tank

from similitude.errors import InfeasibleError
from similitude.planning import candidates, checks, solver
from similitude.planning.case import (
    Case,
    FluidSpec,
    MatchRequest,
    MatrixSpec,
    Prototype,
    WaveCondition,
)
from similitude.planning.facilities import Facility
from similitude.planning.findings import Check

G = 9.80665  # standard gravity [m/s^2]


def checks_of(case):
    prob = candidates.build_problem(case)
    sol = solver.solve(case)
    return {c.name: c for c in checks.facility_checks(prob, candidates.candidate_at(prob, sol))}


def test_check_margin_is_positive_inside_and_negative_outside():
    inside = Check("x", 0.004, 0.005, "", "max", "ok", "common practice")
    outside = Check("x", 0.006, 0.005, "", "max", "fail", "common practice")
    assert inside.margin == pytest.approx(0.2)
    assert outside.margin == pytest.approx(-0.2)


def test_towing_tank_plan_reports_the_blockage_limit_at_its_value():
    # Blockage binds at the limiting scale (see test_solver): m = 0.005 exactly, margin 0,
    # which is "at limit" (met with equality), not "ok".
    c = checks_of(Case(ship(), tank(), MatchRequest(round_scale=False)))[
        "blockage ratio A_X/(B_T h)"]
    assert c.value == pytest.approx(0.005, rel=1e-9)
    assert c.limit == 0.005 and c.status == "at limit"
    assert c.margin == pytest.approx(0.0, abs=1e-9)
    assert c.source.startswith("common practice")


def test_blockage_margin_at_the_convenient_scale_is_one_minus_the_area_ratio():
    # At 1:35: m = 190/35^2/32 = 0.004847; margin (0.005 - m)/0.005 = 1 - (34.46/35)^2 = 3.06 %.
    c = checks_of(Case(ship(), tank()))["blockage ratio A_X/(B_T h)"]
    assert c.value == pytest.approx(190.0 / 35.0**2 / 32.0, rel=1e-12)
    assert c.margin == pytest.approx(1 - 190.0 / 0.16 / 35.0**2, rel=1e-9)


def test_kelvin_check_compares_model_length_with_tank_width_over_0_71():
    # L_m = 150/35 = 4.286 m (the convenient 1:35) against 8/0.7071 = 11.31 m.
    c = checks_of(Case(ship(), tank()))["model length vs tank width (Kelvin wedge)"]
    assert c.limit == pytest.approx(8.0 * math.sqrt(2), rel=1e-12)
    assert c.value == pytest.approx(150.0 / 35.0, rel=1e-12)


def test_depth_froude_check_uses_the_tank_depth():
    # V_m = 10/sqrt(35) = 1.690 m/s; Fh = 1.690/sqrt(g 4) = 0.270.
    c = checks_of(Case(ship(), tank()))["depth Froude number V_m/sqrt(g h)"]
    lam = 35.0
    assert c.value == pytest.approx(10.0 / math.sqrt(lam) / math.sqrt(G * 4.0), rel=1e-9)
    assert "7.5-04-01-01.1" in c.source


def test_low_model_reynolds_number_warns_with_stimulation_advice():
    # A 1.5 m model (lambda = 100) at 6/10 m/s: Re_m = 0.6 * 1.5 / 1.3e-6 = 7e5 < 2e6.
    found = checks_of(Case(ship(), tank(), MatchRequest(scale=100.0)))
    (c,) = [c for name, c in found.items()
            if name.startswith("model Reynolds number at the lowest speed")]
    assert c.status == "warning"
    assert "studs" in c.advice


def test_short_model_waves_fail_the_capillary_period_limit():
    # 4 s prototype waves at 1:200 -> T_m = 4/sqrt(200) = 0.28 s < 0.35 s (Hughes 1993).
    spec = MatrixSpec(waves=(WaveCondition("regular", period=4.0, height=1.0, name="short"),))
    case = Case(ship(), tank(width=20.0), MatchRequest(scale=200.0), spec)
    c = checks_of(case)["short: model wave period"]
    assert c.value == pytest.approx(4.0 / math.sqrt(200.0))
    assert c.status == "warning"


# The highest wave of an irregular sea: the most probable largest of N Rayleigh heights,
# H_s sqrt(ln N / 2) (Longuet-Higgins 1952), N = D/T_z. A 3 h JONSWAP sea (gamma 3.3, the
# default duration) of T_p = 12 s: T_z = T_p/1.285 (IMO MSC.141(76) Annex §4.1) = 9.339 s,
# N = 10800/9.339 = 1156.5, factor sqrt(ln 1156.5 / 2) = 1.8780.
N_3H_12S = 3 * 3600.0 / (12.0 / 1.285)
FACTOR_3H_12S = math.sqrt(math.log(N_3H_12S) / 2.0)


def test_wavemaker_height_of_an_irregular_sea_is_the_most_probable_highest_wave():
    # H_s = 6 m at 1:30 -> 0.2 m; 1.878 x 0.2 = 0.3756 m > 0.3 m wavemaker limit.
    # The wavemaker is a hard limit: a fixed 1:30 model is infeasible, by 0.3756/0.3 - 1 = 25 %.
    spec = MatrixSpec(waves=(WaveCondition("irregular", significant_height=6.0,
                                           peak_period=12.0, name="sea"),))
    fac = tank(width=20.0, wavemaker_max_height=0.3, wavemaker_period_range=(0.5, 4.0))
    with pytest.raises(InfeasibleError) as exc:
        solver.solve(Case(ship(), fac, MatchRequest(scale=30.0), spec))
    msg = str(exc.value)
    largest = 0.2 * FACTOR_3H_12S
    assert "sea: most probable highest model wave" in msg
    assert "wavemaker's highest wave 0.3 m" in msg
    assert "0.3756 m" in msg and round(largest, 4) == 0.3756
    assert "by 25.2 %" in msg and round((largest / 0.3 - 1) * 100, 1) == 25.2


def test_wavemaker_height_sets_the_largest_model_of_a_wave_test():
    # Kelvin width 20/0.707 = 28 m, depth Froude (lambda >= 7.0) and carriage allow large
    # models; H_s = 6 m needs 1.878 H_s / lambda <= 0.3 m -> lambda = 6 x 1.878 / 0.3 = 37.56;
    # T_m = 12/sqrt(37.56) = 1.96 s lies inside the 0.5-4 s wavemaker range.
    spec = MatrixSpec(waves=(WaveCondition("irregular", significant_height=6.0,
                                           peak_period=12.0, name="sea"),))
    fac = tank(width=20.0, wavemaker_max_height=0.3, wavemaker_period_range=(0.5, 4.0))
    case = Case(ship(dimensions={}), fac, MatchRequest(round_scale=False), spec)
    sol = solver.solve(case)
    # rel 1e-4: T_z/T_p of the program's spectrum integration against IMO's 1/1.285
    assert sol.scale == pytest.approx(6.0 * FACTOR_3H_12S / 0.3, rel=1e-4)
    assert "most probable highest model wave" in sol.binding


def test_wavemaker_period_range_is_reported_with_margins():
    # T_m = 12/sqrt(40) = 1.897 s against 0.5 s and 4 s: margins 1.897/0.5 - 1 and
    # 1 - 1.897/4.
    spec = MatrixSpec(waves=(WaveCondition("irregular", significant_height=6.0,
                                           peak_period=12.0, name="sea"),))
    fac = tank(width=20.0, wavemaker_max_height=0.3, wavemaker_period_range=(0.5, 4.0))
    found = checks_of(Case(ship(dimensions={}), fac, MatchRequest(scale=40.0), spec))
    tm = 12.0 / math.sqrt(40.0)
    lo = found["sea: model period vs wavemaker minimum"]
    hi = found["sea: model period vs wavemaker maximum"]
    assert lo.margin == pytest.approx(tm / 0.5 - 1, rel=1e-12) and lo.status == "ok"
    assert hi.margin == pytest.approx(1 - tm / 4.0, rel=1e-12) and hi.source == "facility data"


def test_stated_minimum_steady_time_sets_the_largest_model_in_a_short_tank():
    # 60 m tank, a = d = 0.25 m/s^2, 10 s steady: 60 - V^2/(2a) - V^2/(2d) - L_m >= 10 V with
    # V = 10 x and L_m = 150 x^2 (x = lambda^-0.5): 550 x^2 + 100 x - 60 = 0,
    # x = (-100 + sqrt(100^2 + 4 x 550 x 60)) / 1100 = 0.25166, lambda = 1/x^2 = 15.79
    # (kinematics of uniform acceleration; the Kelvin limit lambda >= 13.3 is then inactive).
    fac = tank(length=60.0, acceleration=0.25, min_steady_time=10.0)
    sol = solver.solve(Case(ship(dimensions={}), fac, MatchRequest(round_scale=False)))
    x = (-100.0 + math.sqrt(100.0**2 + 4 * 550.0 * 60.0)) / 1100.0
    assert sol.scale == pytest.approx(1.0 / x**2, rel=1e-9)
    assert "steady-run length" in sol.binding


def test_tank_depth_is_checked_against_three_root_beam_draught():
    # ITTC 7.5-04-01-01.1 / ISO 15016 deep-water criterion (from memory): h > 3 sqrt(B T);
    # at 1:40 B_m = 0.6 m, T_m = 0.2 m: 3 sqrt(0.12) = 1.039 m against h = 4 m.
    c = checks_of(Case(ship(), tank(), MatchRequest(scale=40.0)))[
        "tank depth needed 3 sqrt(B_m T_m)"]
    assert c.value == pytest.approx(3 * math.sqrt(0.6 * 0.2), rel=1e-12)
    assert c.limit == 4.0 and c.margin == pytest.approx(1 - c.value / 4.0, rel=1e-12)


def test_every_check_of_a_plan_carries_value_limit_margin_and_source():
    # Issue 4: each check is reported with value, limit, margin and source.
    for case in (Case(ship(), tank()), Case(ship(), tank(), MatchRequest(scale=100.0))):
        for c in checks_of(case).values():
            assert math.isfinite(c.value) and math.isfinite(c.limit), c.name
            assert math.isfinite(c.margin), c.name
            assert c.source.strip(), c.name
            assert (c.margin >= -1e-9) == (c.status == "ok"), c.name


def test_mach_check_warns_above_0_3_when_mach_is_not_matched():
    # Reynolds-only matching of a 1 m body at 50 m/s with a 1:4 model needs 200 m/s > Ma 0.3.
    proto = Prototype("bluff_body", 1.0, (50.0,), FluidSpec("air", 288.15))
    fac = Facility("wind_tunnel", "wt", 10.0, 4.0, 3.0, (5.0, 250.0), fluids=("air",),
                   temperature_range=(288.15, 288.15))
    found = checks_of(Case(proto, fac, MatchRequest(exact=("reynolds",), report=(),
                                                    scale=4.0)))
    c = found["model Mach number at the highest speed"]
    assert c.value > 0.3 and c.status == "warning"


def test_propeller_rotation_rate_limit_is_a_hard_limit():
    proto = Prototype("propeller", 6.0, (8.0,), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 6.0}, rotation_rates=(1.8,), immersion=8.0)
    fac = Facility("cavitation_tunnel", "cav", 3.0, 0.8, 0.8, (1.0, 12.0),
                   fluids=("fresh_water",), max_rotation_rate=20.0)
    case = Case(proto, fac, MatchRequest(exact=("froude", "advance_ratio"), report=(),
                                         scale=15.0))
    # Froude at 1:15: n_m = n_p sqrt(lambda) = 1.8 x 3.873 = 6.97 1/s (inside 20 1/s).
    found = checks_of(case)
    c = found["model rotation rate"]
    assert c.value == pytest.approx(1.8 * math.sqrt(15.0), rel=1e-9)
    assert c.status == "ok"


def test_slow_small_model_waves_warn_for_capillarity():
    # 1:400 model of 0.375 m at 6/sqrt(400) = 0.3 m/s: own wave length 2 pi 0.09/g = 5.8 cm;
    # (1.71 cm / 5.8 cm)^2 = 8.7 % > 1 % (capillary length 2 pi sqrt(sigma/(rho g)),
    # Lamb 1932 §267).
    found = checks_of(Case(ship(), tank(), MatchRequest(scale=400.0)))
    c = found["capillary share of the model's own waves at the lowest speed "
              "(lambda_c/lambda_w)^2"]
    lw = 2 * math.pi * (6.0 / 20.0) ** 2 / G
    assert c.value == pytest.approx((0.0171 / lw) ** 2, rel=0.03)
    assert c.status == "warning"


def test_cavitation_tunnel_pressure_is_checked_against_its_range():
    proto = Prototype("propeller", 6.0, (8.0,), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 6.0}, rotation_rates=(1.8,), immersion=8.0)
    fac = Facility("cavitation_tunnel", "cav", 3.0, 0.8, 0.8, (1.0, 12.0),
                   fluids=("fresh_water",), pressure_range=(5e3, 2e5))
    found = checks_of(Case(proto, fac, MatchRequest(exact=("advance_ratio", "cavitation"),
                                                    report=())))
    hi = found["static pressure at the shaft centre vs facility maximum"]
    lo = found["static pressure at the shaft centre vs facility minimum"]
    # The search keeps the pressure inside the range; an end it sits on shows "at limit".
    assert {hi.status, lo.status} <= {"ok", "at limit"}
    assert hi.limit == 2e5 and lo.limit == 5e3
    assert 5e3 * (1 - 1e-9) <= hi.value <= 2e5 * (1 + 1e-9)


def test_fixed_model_fluid_temperature_outside_the_facility_range_warns():
    # Facility range 10-25 degC (Facility default); a stated test-day 27 degC is outside it.
    req = MatchRequest(model_fluid=FluidSpec("fresh_water", 300.15))
    found = checks_of(Case(ship(), tank(), req))
    hi = found["fixed model fluid temperature vs facility maximum"]
    assert hi.value == pytest.approx(300.15) and hi.limit == pytest.approx(298.15)
    assert hi.status == "warning" and hi.margin < 0
    assert found["fixed model fluid temperature vs facility minimum"].status == "ok"

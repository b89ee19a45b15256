"""The solver: scale, speed and fluid state of worked scenarios, derived by hand in each test.

All scenarios are invented. Expected numbers come from the similitude relations (Froude scaling,
ITTC 7.5-02-02-01 Rev 03 2011), the geometric limits of the facility and the fluid properties;
each test says how the number follows.
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scenarios import ship, tank

from similitude.errors import InfeasibleError, InputError
from similitude.planning import candidates, solver
from similitude.planning.case import Case, FluidSpec, MatchRequest, Prototype
from similitude.planning.facilities import Facility

G = 9.80665  # standard gravity [m/s^2] (CGPM 1901)




# --- towing tank --------------------------------------------------------------------------
def test_towing_tank_scale_is_set_by_the_blockage_limit():
    # Limits by hand: Kelvin wedge L_m <= 8/0.7071 = 11.3 m (lambda >= 13.3); tank depth
    # 3 sqrt(24*8)/lambda <= 4 (lambda >= 10.4); depth Froude 10/sqrt(lambda) <= 0.603
    # sqrt(g 4) (lambda >= 7.0); carriage 10/sqrt(lambda) <= 6 (lambda >= 2.8); blockage
    # 190/lambda^2 / (8*4) <= 0.005 (common practice) -> lambda = sqrt(190/0.16) = 34.46.
    sol = solver.solve(Case(ship(), tank(), MatchRequest(round_scale=False)))
    assert sol.scale == pytest.approx(math.sqrt(190.0 / 0.16), rel=1e-9)
    assert "blockage" in sol.binding


def test_largest_model_is_rounded_up_to_a_convenient_scale_that_keeps_every_limit():
    # Limiting 1:34.46 (blockage, above) -> the convenient 1:35 (whole numbers for
    # lambda >= 10, common practice); blockage then 190/35^2/32 = 0.004847 < 0.005.
    sol = solver.solve(Case(ship(), tank()))
    assert sol.scale == 35.0
    assert sol.limiting_scale == pytest.approx(math.sqrt(190.0 / 0.16), rel=1e-9)
    assert "blockage" in sol.limiting_binding
    assert "rounded up" in sol.scale_rounding and "1:35" in sol.binding
    prob = candidates.build_problem(Case(ship(), tank()))
    _, vmat, _ = candidates.violations(prob, candidates.candidate_at(prob, sol))
    assert vmat.max() <= 0


def test_convenient_scale_rounds_up_and_down_by_the_size_of_lambda():
    # Common practice: whole numbers from 1:10, halves from 1:4, one decimal below.
    assert solver.convenient_scale(20.9956) == 21.0
    assert solver.convenient_scale(8.333) == 8.5
    assert solver.convenient_scale(3.27) == 3.3
    assert solver.convenient_scale(20.9956, "down") == 20.0
    assert solver.convenient_scale(9.8, "up", steps=1) == 11.0  # 10 then 11, not 10.5
    assert solver.convenient_scale(15.0 * (1 + 1e-12)) == 15.0  # already convenient


def test_rounded_froude_solution_stays_exact_to_1e_9():
    # Re-solved at the fixed convenient scale: V_m = V_p / sqrt(35) exactly.
    sol = solver.solve(Case(ship(), tank()))
    assert sol.velocity_ratio == pytest.approx(35.0 ** -0.5, rel=1e-12)


def test_scale_rounding_falls_back_to_the_next_convenient_value_or_keeps_the_limit():
    # Shortest model 4.286 m (150/35): 1:35 is the last admissible whole scale, 1:36 is not.
    # A facility whose shortest model is 4.3 m leaves 1:34.46..1:34.88: no whole number fits,
    # so the limiting scale is kept and the solution says why.
    sol = solver.solve(Case(ship(), tank(min_model_length=4.3)))
    assert sol.scale == pytest.approx(math.sqrt(190.0 / 0.16), rel=1e-9)
    assert sol.scale_rounding.startswith("not rounded")


def test_round_scale_false_keeps_the_limiting_scale():
    sol = solver.solve(Case(ship(), tank(), MatchRequest(round_scale=False)))
    assert sol.limiting_scale is None


def test_froude_scaling_gives_model_speed_prototype_speed_over_root_scale():
    # Froude similarity: V_m = V_p / sqrt(lambda) (ITTC 7.5-02-02-01 (2011)).
    sol = solver.solve(Case(ship(), tank()))
    assert sol.velocity_ratio == pytest.approx(sol.scale ** -0.5, rel=1e-12)


def test_largest_model_objective_picks_the_warmest_water_for_least_reynolds_mismatch():
    # Same scale at every temperature; nu falls with temperature, so the reported Reynolds
    # mismatch is least at the top of the facility's range, 25 degC.
    sol = solver.solve(Case(ship(), tank()))
    assert float(sol.model_fluid.temperature_si) == pytest.approx(298.15)


def test_fixed_scale_is_kept():
    sol = solver.solve(Case(ship(), tank(), MatchRequest(scale=40.0)))
    assert sol.scale == 40.0
    assert sol.velocity_ratio == pytest.approx(40.0 ** -0.5, rel=1e-12)


def test_existing_model_length_fixes_the_scale():
    sol = solver.solve(Case(ship(), tank(), MatchRequest(model_length=3.0)))
    assert sol.scale == pytest.approx(50.0, rel=1e-12)


def test_smallest_model_objective_is_bounded_by_the_facility_minimum_length():
    # lambda = 150 / 2 = 75 when the facility takes models of 2 m and more.
    case = Case(ship(), tank(min_model_length=2.0), MatchRequest(objective="smallest_model"))
    assert solver.solve(case).scale == pytest.approx(75.0, rel=1e-9)


def test_smallest_model_is_rounded_down_to_a_convenient_scale():
    # Shortest model 2.1 m: limiting lambda = 150/2.1 = 71.43; rounded down (a larger model)
    # to the whole 1:71, L_m = 2.113 m >= 2.1 m (common practice).
    case = Case(ship(), tank(min_model_length=2.1), MatchRequest(objective="smallest_model"))
    sol = solver.solve(case)
    assert sol.scale == 71.0
    assert sol.limiting_scale == pytest.approx(150.0 / 2.1, rel=1e-9)
    assert "rounded down" in sol.scale_rounding


def test_carriage_speed_binds_with_its_excess_in_the_message():
    # Smallest admissible model 6 m (lambda = 25): Froude speed 10/5 = 2 m/s against a 1 m/s
    # carriage, exceeded by 100 %.
    case = Case(ship(), tank(speed_range=(0.1, 1.0), min_model_length=6.0))
    with pytest.raises(InfeasibleError) as exc:
        solver.solve(case)
    msg = str(exc.value)
    assert "Froude speed" in msg and "carriage maximum 1 m/s" in msg
    assert "2 m/s" in msg and "by 100 %" in msg
    assert "smallest admissible model" in msg


def test_froude_and_reynolds_together_are_infeasible_in_a_water_tank():
    # Fr and Re together need nu_m/nu_p = lambda^-1.5; water at 10-25 degC has nu_m/nu_p of
    # about 0.75-1.1, so lambda is close to 1: a 120 m model in a 200 m x 8 m tank.
    case = Case(ship(), tank(), MatchRequest(exact=("froude", "reynolds"), relax=False))
    with pytest.raises(InfeasibleError) as exc:
        solver.solve(case)
    assert "lambda^-1.5" in str(exc.value)


def test_unattainable_lower_priority_group_is_relaxed_and_its_mismatch_minimised():
    # With relax = true Froude stays exact and the Reynolds mismatch is minimised: the
    # largest admissible model in the warmest water, the same as the Froude-only plan.
    relaxed = solver.solve(Case(ship(), tank(), MatchRequest(exact=("froude", "reynolds"),
                                                             relax=True)))
    froude_only = solver.solve(Case(ship(), tank(), MatchRequest(round_scale=False)))
    assert relaxed.exact == ("froude",)
    # Same model to the tolerance of the bounded mismatch minimisation (1e-6).
    assert relaxed.scale == pytest.approx(froude_only.scale, rel=1e-6)
    assert relaxed.relaxed[0][0] == "reynolds"
    assert "lambda^-1.5" in relaxed.relaxed[0][1]


def test_three_exact_groups_with_two_degrees_of_freedom_are_refused():
    # Fixed scale leaves speed and temperature: two degrees of freedom for three groups.
    req = MatchRequest(exact=("froude", "reynolds", "weber"), scale=20.0)
    with pytest.raises(InputError, match="3 groups .* 2 degree"):
        solver.solve(Case(ship(), tank(), req))


def test_empty_exact_request_is_refused():
    with pytest.raises(InputError, match="match.exact"):
        solver.solve(Case(ship(), tank(), MatchRequest(exact=())))


def test_unknown_facility_fluid_is_refused_naming_the_field():
    with pytest.raises(InputError, match="facility.fluids"):
        solver.solve(Case(ship(), tank(fluids=("mercury",))))


def test_depth_froude_and_froude_together_fix_the_scale_by_the_water_depth():
    # Fr and Fh both exact: V_m/sqrt(g L_m) = Fr_p and V_m/sqrt(g h_tank) = Fh_p give
    # h_tank/L_m = h_p/L_p, so lambda = h_p / h_tank = 60 m / 4 m = 15 (a 10 m model, inside
    # the Kelvin-wedge length 25/0.707 = 35 m of a 25 m wide tank).
    proto = ship(water_depth=60.0, dimensions={"beam": 24.0})
    case = Case(proto, tank(width=25.0), MatchRequest(exact=("froude", "depth_froude")))
    sol = solver.solve(case)
    assert sol.scale == pytest.approx(60.0 / 4.0, rel=1e-9)


# --- wind tunnel: Reynolds and Mach through pressure -----------------------------------------
def wing_case(round_scale=True, **fac_kw):
    proto = Prototype("wing", 3.0, (60.0, 100.0), FluidSpec("air", 288.15),
                      dimensions={"span": 20.0})
    fac = dict(kind="wind_tunnel", name="tunnel P", length=8.0, width=3.0, depth=2.5,
               speed_range=(10.0, 120.0), fluids=("air",), temperature_range=(288.15, 288.15),
               pressure_range=(1e5, 1e6))
    fac.update(fac_kw)
    return Case(proto, Facility(**fac), MatchRequest(exact=("mach", "reynolds"), report=(),
                                                     round_scale=round_scale))


def test_pressurised_tunnel_matches_reynolds_and_mach_through_pressure():
    # Span limit 0.8 x 3 m (Barlow, Rae & Pope 1999): 20/lambda = 2.4 -> lambda = 8.333.
    # Same gas and temperature: Ma equal needs V_m = V_p (a_m = a_p); Re equal then needs
    # rho_m = lambda rho_p, i.e. p_m = lambda x 101325 Pa = 844 kPa for an ideal gas
    # (viscosity independent of pressure); real-gas effects shift it by well under 1 %.
    sol = solver.solve(wing_case(round_scale=False))
    assert sol.scale == pytest.approx(20.0 / 2.4, rel=1e-9)
    assert sol.model_pressure == pytest.approx(101325.0 * 20.0 / 2.4, rel=0.01)
    assert sol.velocity_ratio == pytest.approx(1.0, rel=0.01)
    assert sol.solved_by == "pressure"


def test_pressurised_tunnel_at_the_convenient_scale_needs_lambda_atmospheres():
    # 1:8.333 rounds up to 1:8.5 (halves for 4 <= lambda < 10, common practice); the pressure
    # is re-solved there: p_m = 8.5 x 101325 Pa = 861 kPa (ideal gas, within 1 %).
    sol = solver.solve(wing_case())
    assert sol.scale == 8.5
    assert sol.model_pressure == pytest.approx(8.5 * 101325.0, rel=0.01)
    assert sol.velocity_ratio == pytest.approx(1.0, rel=0.01)
    assert sol.solved_by == "pressure"


def test_pressurised_tunnel_holds_both_groups_to_1e_9():
    sol = solver.solve(wing_case())
    mf, pf = sol.model_fluid, sol.prototype_fluid
    for vp in (60.0, 100.0):
        vm = vp * sol.velocity_ratio
        re_m = vm * (3.0 / sol.scale) / float(mf.kinematic_viscosity_si)
        re_p = vp * 3.0 / float(pf.kinematic_viscosity_si)
        ma_m = vm / float(mf.speed_of_sound_si)
        ma_p = vp / float(pf.speed_of_sound_si)
        assert re_m == pytest.approx(re_p, rel=1e-9)
        assert ma_m == pytest.approx(ma_p, rel=1e-9)


def test_tunnel_too_weak_in_pressure_reports_the_closest_reynolds_ratio():
    # Up to 2 bar only: with V_m = V_p (Mach), Re_m/Re_p = (p_m/p_p)/lambda <= 2/8.33 at the
    # largest model, and a smaller model only lowers it: nothing matches.
    case = wing_case(pressure_range=(1e5, 2e5))
    strict = Case(case.prototype, case.facility,
                  MatchRequest(exact=("mach", "reynolds"), report=(), relax=False))
    with pytest.raises(InfeasibleError, match="span"):
        solver.solve(strict)


def test_tunnel_too_weak_in_pressure_keeps_mach_and_minimises_the_reynolds_mismatch():
    # Relaxed: Mach exact; the Reynolds deficit is least at the highest pressure (2 bar) and
    # the largest model (span 0.8 x 3 m, lambda = 8.33).
    case = wing_case(pressure_range=(1e5, 2e5))
    sol = solver.solve(replace(case, request=replace(case.request, relax=True)))
    assert sol.exact == ("mach",)
    assert sol.model_pressure == pytest.approx(2e5, rel=1e-6)
    assert sol.scale == pytest.approx(20.0 / 2.4, rel=1e-6)


# --- cavitation tunnel: J through n, sigma_n through pressure --------------------------------
def propeller_case(**kw):
    proto = Prototype("propeller", 6.0, (7.0, 8.0), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 6.0, "blade_chord": 1.8},
                      rotation_rates=(1.6, 1.8), immersion=8.0)
    fac = dict(kind="cavitation_tunnel", name="cav", length=3.0, width=0.8, depth=0.8,
               speed_range=(1.0, 12.0), fluids=("fresh_water",),
               temperature_range=(293.15, 293.15), pressure_range=(5e3, 2e5),
               max_rotation_rate=50.0)
    fac.update(kw)
    return Case(proto, Facility(**fac),
                MatchRequest(exact=("advance_ratio", "cavitation"), report=("reynolds",)))


def test_cavitation_tunnel_propeller_by_hand():
    # Diameter limit 0.5 x 0.8 m (common practice): D_m = 0.4 m, lambda = 15. Highest tunnel
    # pressure (200 kPa) gives the highest rotation rate and so the least Reynolds mismatch:
    # sigma_n,p = (p_atm + rho_p g h - p_v,p) / (rho_p n_p^2 D_p^2 / 2) at n_p = 1.8 1/s;
    # n_m^2 = (p_m - p_v,m) / (rho_m sigma_n,p D_m^2 / 2); V_m = J n_m D_m.
    sol = solver.solve(propeller_case())
    assert sol.scale == pytest.approx(15.0, rel=1e-9)
    pf, mf = sol.prototype_fluid, sol.model_fluid
    rho_p, pv_p = float(pf.density_si), float(pf.vapour_pressure_si)
    rho_m, pv_m = float(mf.density_si), float(mf.vapour_pressure_si)
    sigma = (101325.0 + rho_p * G * 8.0 - pv_p) / (0.5 * rho_p * 1.8**2 * 6.0**2)
    n_m = math.sqrt((2e5 - pv_m) / (0.5 * rho_m * sigma * 0.4**2))
    assert sol.model_pressure == pytest.approx(2e5, rel=1e-9)
    assert sol.rotation_ratio * 1.8 == pytest.approx(n_m, rel=1e-9)
    j = 8.0 / (1.8 * 6.0)
    assert 8.0 * sol.velocity_ratio == pytest.approx(j * n_m * 0.4, rel=1e-9)


def test_cavitation_tunnel_minimum_pressure_binds_for_a_high_sigma_target():
    # Dynamometer limit 10 1/s caps n_m; the solver must still match sigma_n exactly.
    sol = solver.solve(propeller_case(max_rotation_rate=10.0))
    assert sol.rotation_ratio * 1.8 <= 10.0 * (1 + 1e-9)
    assert sol.model_pressure <= 2e5


# --- vectorised search ----------------------------------------------------------------------
def test_search_grid_evaluates_at_least_1e5_candidates_in_one_pass():
    res = solver.search_grid(Case(ship(), tank()), 100_000)
    assert res.count >= 0.95e5
    assert res.best is not None


def test_search_grid_best_candidate_is_admissible():
    res = solver.search_grid(Case(ship(), tank()), 20_000)
    i, j = res.best
    assert res.violation[i][j] <= 0
    assert np.all(np.isfinite(res.objective[i]))


# --- cryogenic nitrogen: Reynolds and Mach through temperature ------------------------------
def test_cryogenic_nitrogen_tunnel_matches_reynolds_and_mach_through_temperature():
    # Concept of the cryogenic tunnel (Kilgore et al. 1974, NASA TN D-7762): cold nitrogen
    # raises Re at fixed Mach. At 1 atm and fixed 1:3 scale, Ma and Re equal need
    # a_m/nu_m = Re_p / (Ma_p L_m) = a_p / nu_p x lambda. The test solves that for T with
    # CoolProp's nitrogen (Span et al. 2000 EOS, Lemmon & Jacobsen 2004 viscosity) as oracle.
    from CoolProp.CoolProp import PropsSI
    from scipy.optimize import brentq

    proto = Prototype("wing", 1.0, (100.0,), FluidSpec("air", 288.15))
    fac = Facility("wind_tunnel", "cryo", 5.0, 2.0, 2.0, (10.0, 150.0), fluids=("nitrogen",),
                   temperature_range=(100.0, 313.0))
    sol = solver.solve(Case(proto, fac, MatchRequest(exact=("mach", "reynolds"), report=(),
                                                     scale=3.0)))
    pf = sol.prototype_fluid
    target = float(pf.speed_of_sound_si) / float(pf.kinematic_viscosity_si) * 3.0

    def a_over_nu(t):
        rho = PropsSI("D", "T", t, "P", 101325.0, "Nitrogen")
        return PropsSI("A", "T", t, "P", 101325.0, "Nitrogen") * rho / PropsSI(
            "V", "T", t, "P", 101325.0, "Nitrogen")

    t_expected = brentq(lambda t: a_over_nu(t) / target - 1.0, 100.0, 300.0)
    assert float(sol.model_fluid.temperature_si) == pytest.approx(t_expected, rel=2e-3)
    assert sol.solved_by == "temperature"


def test_cryogenic_solution_holds_both_groups_to_1e_9():
    proto = Prototype("wing", 1.0, (100.0,), FluidSpec("air", 288.15))
    fac = Facility("wind_tunnel", "cryo", 5.0, 2.0, 2.0, (10.0, 150.0), fluids=("nitrogen",),
                   temperature_range=(100.0, 313.0))
    sol = solver.solve(Case(proto, fac, MatchRequest(exact=("mach", "reynolds"), report=(),
                                                     scale=3.0)))
    mf, pf = sol.model_fluid, sol.prototype_fluid
    vm = 100.0 * sol.velocity_ratio
    assert vm / float(mf.speed_of_sound_si) == pytest.approx(
        100.0 / float(pf.speed_of_sound_si), rel=1e-9)
    assert vm * (1 / 3) / float(mf.kinematic_viscosity_si) == pytest.approx(
        100.0 / float(pf.kinematic_viscosity_si), rel=1e-9)


# --- least mismatch --------------------------------------------------------------------------
def test_least_mismatch_finds_the_pressure_that_also_matches_mach():
    # Re exact at a fixed 1:4 scale and T = 15 degC: V_m = Re_p nu_m / L_m with nu_m ~ 1/p;
    # the reported Mach mismatch vanishes where V_m = V_p, i.e. rho_m = 4 rho_p, about
    # 4 x 101325 = 405 kPa (ideal gas; real-gas effects well under 1 %).
    proto = Prototype("wing", 1.0, (100.0,), FluidSpec("air", 288.15))
    fac = Facility("wind_tunnel", "P", 5.0, 2.0, 2.0, (10.0, 150.0), fluids=("air",),
                   temperature_range=(288.15, 288.15), pressure_range=(1e5, 1e6))
    req = MatchRequest(exact=("reynolds",), report=("mach",), scale=4.0,
                       objective="least_mismatch")
    sol = solver.solve(Case(proto, fac, req))
    assert sol.model_pressure == pytest.approx(4 * 101325.0, rel=0.01)
    ma_m = 100.0 * sol.velocity_ratio / float(sol.model_fluid.speed_of_sound_si)
    ma_p = 100.0 / float(sol.prototype_fluid.speed_of_sound_si)
    assert ma_m == pytest.approx(ma_p, rel=1e-4)


@settings(max_examples=25, deadline=None)
@given(length=st.floats(30.0, 300.0), speed=st.floats(2.0, 14.0),
       width=st.floats(3.0, 20.0), depth=st.floats(1.5, 8.0), vmax=st.floats(3.0, 12.0))
def test_largest_model_is_admissible_and_a_slightly_larger_one_is_not(length, speed, width,
                                                                     depth, vmax):
    # Property of the 'largest_model' objective: the chosen model satisfies every hard
    # limit, and the same model 1e-6 larger violates at least one (the boundary is found).
    proto = Prototype("surface_ship", length, (speed / 2, speed), FluidSpec("sea_water", 288.15),
                      dimensions={"beam": length / 6, "draught": length / 20,
                                  "midship_area": length**2 / 125})
    fac = Facility("towing_tank", "t", 30 * width, width, depth, (0.05, vmax))
    case = Case(proto, fac, MatchRequest(round_scale=False))
    prob = candidates.build_problem(case)
    sol = solver.solve(case, n_candidates=4000)
    c = candidates.candidate_at(prob, sol)
    _, vmat, _ = candidates.violations(prob, c)
    assert vmat.max() <= 1e-12
    bigger = candidates.evaluate(prob, prob.options[0], c.temperature, c.pressure,
                             c.scale * (1 - 1e-6))
    _, vmat2, _ = candidates.violations(prob, bigger)
    assert vmat2.max() > 0


# --- depressurised towing tank: Froude and cavitation number together -----------------------
def test_depressurised_tank_scales_the_surface_pressure_for_the_cavitation_number():
    # Blockage binds: lambda = sqrt(190 / (0.005 x 18 x 8)) = 16.24. Froude fixes V_m; the
    # cavitation number at the immersed point (6 m full scale) then needs the pressure over
    # the free surface p_0m = p_v,m + sigma_p rho_m V_m^2 / 2 - rho_m g h_p / lambda, with
    # sigma_p = (p_atm + rho_p g h_p - p_v,p) / (rho_p V_p^2 / 2).
    proto = ship(speeds=(8.0, 10.0), immersion=6.0)
    fac = tank(length=240.0, width=18.0, depth=8.0, speed_range=(0.1, 5.0),
               pressure_range=(2.5e3, 101325.0))
    sol = solver.solve(Case(proto, fac, MatchRequest(exact=("froude", "cavitation"),
                                                     report=("reynolds",), round_scale=False)))
    lam = math.sqrt(190.0 / (0.005 * 18.0 * 8.0))
    assert sol.scale == pytest.approx(lam, rel=1e-9)
    pf, mf = sol.prototype_fluid, sol.model_fluid
    rho_p, rho_m = float(pf.density_si), float(mf.density_si)
    sigma = (101325.0 + rho_p * G * 6.0 - float(pf.vapour_pressure_si)) / (
        0.5 * rho_p * 10.0**2)
    vm = 10.0 / math.sqrt(lam)
    p0 = float(mf.vapour_pressure_si) + sigma * 0.5 * rho_m * vm**2 - rho_m * G * 6.0 / lam
    assert sol.static_pressure == pytest.approx(p0, rel=1e-9)
    assert sol.model_pressure == pytest.approx(p0 + rho_m * G * 6.0 / lam, rel=1e-9)


def test_two_groups_through_the_fluid_state_relax_the_last_one():
    # J by n, Fr fixes the speed, sigma_n by the tunnel pressure; Re would need a second
    # fluid-state variable at once: it is dropped (relax) and reported, or refused (strict).
    base = propeller_case()
    exact = ("advance_ratio", "froude", "cavitation", "reynolds")
    sol = solver.solve(Case(base.prototype, base.facility, MatchRequest(exact=exact,
                                                                        relax=True)))
    assert sol.exact == exact[:3]
    assert sol.relaxed[0][0] == "reynolds"
    with pytest.raises(InputError, match="at most one"):
        solver.solve(Case(base.prototype, base.facility,
                          MatchRequest(exact=exact, relax=False)))


# --- glycerol-water: the mass fraction reaches the property model ---------------------------
def glycerol_case(model_fluid, fluids=("glycerol_water",)):
    # Invented: a 0.5 m body at 2 m/s in fresh water at 20 degC tested twice as large
    # (lambda = 0.5) in a glycerol-water tunnel; Reynolds matched.
    proto = Prototype("submerged_body", 0.5, (2.0,), FluidSpec("fresh_water", 293.15))
    fac = Facility("cavitation_tunnel", "glycerol loop", 3.0, 1.0, 1.0, (0.5, 12.0),
                   fluids=fluids, temperature_range=(288.15, 303.15))
    return Case(proto, fac, MatchRequest(exact=("reynolds",), report=(), scale=0.5,
                                         model_fluid=model_fluid))


def test_glycerol_mass_fraction_is_forwarded_to_the_property_model():
    # Re_m = Re_p: V_m = V_p (nu_m/nu_p) lambda. nu_m is the Cheng (2008) / Volk & Kaehler
    # (2018) value at 60 % by mass, 20 degC (fluids_props.glycerol_water.FLUID_INFO as the
    # oracle; its default would be 50 %, so a dropped mass fraction shows).
    import importlib

    gw = importlib.import_module("fluids_props.glycerol_water")
    sol = solver.solve(glycerol_case(FluidSpec("glycerol_water", 293.15, mass_fraction=0.6)))
    ref = gw.FLUID_INFO.evaluate_si(293.15, 101325.0, mass_fraction=0.6)
    assert float(sol.model_fluid.kinematic_viscosity_si) == pytest.approx(
        float(ref.kinematic_viscosity_si), rel=1e-12)
    nu_p = float(sol.prototype_fluid.kinematic_viscosity_si)
    assert sol.velocity_ratio == pytest.approx(
        float(ref.kinematic_viscosity_si) / nu_p * 0.5, rel=1e-9)
    # Handbook: 60 wt% glycerol at 20 degC, mu = 10.8 mPa s, rho = 1153.8 kg/m^3 (Segur &
    # Oberstar 1951 table as printed in the CRC Handbook; from memory, medium confidence).
    assert float(sol.model_fluid.dynamic_viscosity_si) == pytest.approx(10.8e-3, rel=0.03)
    assert float(sol.model_fluid.density_si) == pytest.approx(1153.8, rel=2e-3)


def test_glycerol_tunnel_without_a_stated_mass_fraction_is_refused():
    with pytest.raises(InputError, match="mass_fraction"):
        solver.solve(glycerol_case(None))
    with pytest.raises(InputError, match="match.model_fluid.mass_fraction: missing"):
        solver.solve(glycerol_case(FluidSpec("glycerol_water", 293.15)))


def test_mass_fraction_for_a_pure_fluid_is_refused():
    case = glycerol_case(FluidSpec("fresh_water", 293.15, mass_fraction=0.2),
                         fluids=("fresh_water",))
    with pytest.raises(InputError, match="not a mixture"):
        solver.solve(case)


# --- discrete fluid choice -------------------------------------------------------------------
def test_solver_picks_the_facility_fluid_with_the_least_reynolds_mismatch():
    # A tank that can hold fresh or sea water at 10-25 degC; at a Froude speed and fixed
    # scale the lower nu gives the smaller Reynolds mismatch: fresh water at 25 degC,
    # nu = 0.8927e-6 m^2/s (IAPWS-95 with the IAPWS 2008 viscosity; the iapws package as the
    # oracle) against about 0.94e-6 for sea water at 35 g/kg (ITTC 7.5-02-01-03, from memory).
    import iapws

    w = iapws.IAPWS95(T=298.15, P=0.101325)
    case = Case(ship(), tank(fluids=("sea_water", "fresh_water")), MatchRequest(scale=40.0))
    sol = solver.solve(case)
    assert sol.fluid_name == "fresh_water"
    assert float(sol.model_fluid.kinematic_viscosity_si) == pytest.approx(w.mu / w.rho,
                                                                          rel=1e-6)


# --- property: the solver meets Froude and Reynolds together where nu allows -------------------
@settings(max_examples=20, deadline=None)
@given(length=st.floats(20.0, 120.0), speed=st.floats(1.0, 8.0),
       t_m=st.floats(281.0, 310.0), t_p=st.floats(276.0, 300.0))
def test_solved_froude_and_reynolds_model_has_nu_ratio_lambda_to_minus_1_5(length, speed,
                                                                           t_m, t_p):
    # Fr and Re both exact need nu_m/nu_p = lambda^-1.5 (identity). Choose the scale that
    # water at t_m would need, lambda = (nu_p/nu_m(t_m))^(2/3), fix it, and let the solver find
    # the temperature through the Reynolds residual: it must return t_m and the identity.
    from fluids_props import fresh_water, sea_water

    nu_p = float(sea_water(f"{t_p} K").kinematic_viscosity.m_as("m^2/s"))
    nu_m = float(fresh_water(f"{t_m} K").kinematic_viscosity.m_as("m^2/s"))
    lam = (nu_p / nu_m) ** (2.0 / 3.0)
    proto = Prototype("surface_ship", length, (speed,), FluidSpec("sea_water", t_p))
    fac = Facility("towing_tank", "huge", 10000.0, 1000.0, 100.0, (0.01, 100.0),
                   temperature_range=(275.15, 313.15))
    req = MatchRequest(exact=("froude", "reynolds"), report=(), scale=lam, relax=False)
    sol = solver.solve(Case(proto, fac, req))
    ratio = float(sol.model_fluid.kinematic_viscosity_si) / float(
        sol.prototype_fluid.kinematic_viscosity_si)
    assert ratio == pytest.approx(lam**-1.5, rel=1e-9)
    assert float(sol.model_fluid.temperature_si) == pytest.approx(t_m, abs=1e-6)
    assert sol.solved_by == "temperature"

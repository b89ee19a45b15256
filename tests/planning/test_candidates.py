"""Candidate evaluation: fluid states and group values of the prototype and model sides.

Invented scenarios; each expected number is derived in the comment beside its check.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scenarios import ship, tank

from similitude.planning import candidates, solver
from similitude.planning.case import Case, FluidSpec, MatchRequest, Prototype
from similitude.planning.facilities import Facility

G = 9.80665  # standard gravity [m/s^2] (CGPM 1901)


def test_prototype_groups_follow_their_definitions():
    # ITTC Symbols and Terminology (2017): Fr = V/sqrt(g L), Re = V L / nu, at each speed of
    # the invented 150 m ship (scenarios.ship) in its sea water.
    prob = candidates.build_problem(Case(ship(), tank()))
    nu = float(prob.proto.state.kinematic_viscosity_si)
    speeds = np.asarray(ship().speeds)
    assert prob.proto_groups["froude"] == pytest.approx(speeds / math.sqrt(G * 150.0),
                                                        rel=1e-15)
    assert prob.proto_groups["reynolds"] == pytest.approx(speeds * 150.0 / nu, rel=1e-15)


def test_propeller_reynolds_number_uses_the_section_speed_at_0_7_r():
    # Re_0.7R = c sqrt(V_A^2 + (0.7 pi n D)^2) / nu (ITTC 7.5-02-03-02.1, from memory), with
    # the chord c = D when no blade chord is given: D = 6 m, V_A = 8 m/s, n = 1.8 1/s.
    proto = Prototype("propeller", 6.0, (8.0,), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 6.0}, rotation_rates=(1.8,), immersion=8.0)
    side = candidates.prototype_side(Case(proto, tank()))
    nu = float(side.state.kinematic_viscosity_si)
    expected = 6.0 * math.hypot(8.0, 0.7 * math.pi * 1.8 * 6.0) / nu
    assert candidates.group_value("reynolds", side, True)[0] == pytest.approx(expected,
                                                                                rel=1e-14)


@settings(max_examples=40, deadline=None)
@given(length=st.floats(20.0, 300.0), speed=st.floats(1.0, 15.0), lam=st.floats(5.0, 80.0),
       t_p=st.floats(275.0, 305.0))
def test_froude_scaled_reynolds_ratio_is_lambda_to_1_5_times_viscosity_ratio(length, speed,
                                                                             lam, t_p):
    # Re_p/Re_m = (V_p L_p / nu_p) / (V_p lambda^-0.5 L_p lambda^-1 / nu_m)
    #           = lambda^1.5 nu_m/nu_p, so Fr and Re together need nu_m/nu_p = lambda^-1.5.
    proto = Prototype("surface_ship", length, (speed,), FluidSpec("sea_water", t_p))
    fac = Facility("towing_tank", "big", 10000.0, 1000.0, 100.0, (0.01, 100.0))
    case = Case(proto, fac, MatchRequest(scale=lam))
    prob = candidates.build_problem(case)
    sol = solver.solve(case, n_candidates=64)
    c = candidates.candidate_at(prob, sol)
    re_m = float(candidates.model_groups(prob, c, 0, ("reynolds",))["reynolds"][0])
    re_p = float(prob.proto_groups["reynolds"][0])
    nu_ratio = float(sol.model_fluid.kinematic_viscosity_si) / float(
        sol.prototype_fluid.kinematic_viscosity_si)
    assert re_p / re_m == pytest.approx(lam**1.5 * nu_ratio, rel=1e-12)
    assert (re_p / re_m == pytest.approx(1.0, rel=1e-9)) == (
        nu_ratio == pytest.approx(lam**-1.5, rel=1e-9))


def test_fluid_states_outside_the_gas_phase_drop_out_of_the_search():
    # R-134a boils at about 247 K at 1 atm (ASHRAE Handbook, Fundamentals): at 230 K and
    # 1 bar the gas model refuses the state, which gets NaN properties, while 300 K is kept.
    from fluids_props import OutOfRangeError, get_fluid

    info = get_fluid("coolprop:r134a")
    st = candidates.model_state(info, np.array([230.0, 300.0]), np.array([1e5, 1e5]))
    assert np.isnan(st.density_si[0]) and np.isfinite(st.density_si[1])
    with pytest.raises(OutOfRangeError, match="liquid"):
        candidates.model_state(info, 230.0, 1e5)

"""Hard limits of the facility: their derivation and the values the solver searches with.

Invented facilities and models; each limit is derived in the comment beside its check.
"""

from __future__ import annotations

import math

import pytest
from scenarios import tank

from similitude.planning import candidates, limits, solver
from similitude.planning.case import Case, FluidSpec, MatchRequest, Prototype
from similitude.planning.facilities import Facility


def test_kelvin_width_ratio_is_twice_the_tangent_of_19_47_degrees():
    # Kelvin (1887): half-angle arcsin(1/3) = 19.47 deg; 2 tan(19.47 deg) = 1/sqrt(2) = 0.707.
    assert math.degrees(limits.KELVIN_HALF_ANGLE) == pytest.approx(19.47, abs=0.005)
    assert limits.KELVIN_WIDTH_RATIO == pytest.approx(1 / math.sqrt(2), rel=1e-12)


def test_deep_water_depth_froude_limit_follows_from_h_over_2_75_v2_over_g():
    # ITTC 7.5-04-01-01.1 / ISO 15016 (from memory): h > 2.75 V^2/g -> Fh < 0.603.
    assert limits.DEEP_WATER_DEPTH_FROUDE == pytest.approx(0.603, abs=5e-4)


def test_steady_run_length_subtracts_acceleration_stopping_and_model_length():
    # 200 m tank, 2 m/s, a = 0.5, d = 0.25 m/s^2: 200 - 4/1 - 4/0.5 - 5 = 183 m.
    fac = tank(deceleration=0.25)
    assert limits.steady_run_length(fac, 5.0, 2.0) == pytest.approx(183.0)


def test_wind_tunnel_ship_model_uses_the_imo_5_percent_blockage_limit():
    # IMO MSC.1/Circ.1200 §3.2.1: projected area < 5 % of the test section.
    proto = Prototype("surface_ship", 200.0, (15.0,), FluidSpec("air", 288.15),
                      dimensions={"lateral_area": 4000.0})
    fac = Facility("wind_tunnel", "wt", 10.0, 4.0, 3.0, (5.0, 40.0), fluids=("air",),
                   temperature_range=(288.15, 293.15))
    case = Case(proto, fac, MatchRequest(exact=("mach",), scale=100.0))
    prob = candidates.build_problem(case)
    sol = solver.solve(case)
    lims = {lim.name: lim for lim in limits.hard_limits(prob, candidates.candidate_at(prob, sol))}
    lim = lims["tunnel blockage (lateral area)/test section"]
    assert lim.limit == limits.IMO_TUNNEL_BLOCKAGE
    assert float(lim.value[0]) == pytest.approx(4000.0 / 100.0**2 / 12.0, rel=1e-12)


def test_wing_span_limit_is_0_8_of_the_tunnel_width():
    # Barlow, Rae & Pope (1999), from memory: span <= 0.8 B.
    assert limits.BARLOW_SPAN_RATIO == 0.8
    assert limits.BARLOW_TUNNEL_BLOCKAGE == 0.075

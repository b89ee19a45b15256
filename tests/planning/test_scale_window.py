"""The admissible scale window of a case (planning.scale_window), against windows derived by
hand from the limits' own formulas.

Outside references:
* Froude scaling: V_m = V_p / sqrt(lambda), T_m = T_p / sqrt(lambda), H_m = H_p / lambda
  (ITTC Recommended Procedure 7.5-02-02-01, 2011; 7.5-02-07-02.1, 2014).
* Most probable highest of N Rayleigh-distributed waves: H_s sqrt(ln N / 2) (Longuet-Higgins,
  J. Marine Research 11, 1952), N = D / T_z; T_z / T_p = (4 / (5 pi))^(1/4) for the ITTC
  two-parameter spectrum (ITTC 1978).
* Blockage A_X/(B_T h) <= 0.005 and the Kelvin-wedge width 2 tan(19.47 deg) = 0.7071 L are the
  planner's limits (common practice; Kelvin 1887).
"""

import math
from dataclasses import replace

import pytest
from scenarios import ship, tank

import similitude as sim
from similitude.planning.case import Case, MatchRequest, MatrixSpec, WaveCondition
from similitude.planning.scale_window import model_at_scale, scale_window

# The invented 150 m ship of scenarios.py: speeds 6, 8, 10 m/s, midship area 190 m^2,
# beam 24 m, draught 8 m; tank A: 200 m x 8 m x 4 m, carriage 0.1-6 m/s.
A_X, B_T, H_T = 190.0, 8.0, 4.0


def _case(**facility) -> Case:
    return Case(ship(), tank(**facility))


def test_largest_model_is_bound_by_the_blockage_limit_derived_by_hand():
    w = scale_window(_case())
    # A_X / lambda^2 / (B_T h) = 0.005  ->  lambda = sqrt(A_X / (0.005 B_T h)) = 34.46
    expected = math.sqrt(A_X / (0.005 * B_T * H_T))
    assert w.feasible
    assert w.low == pytest.approx(expected, rel=2e-6)
    assert w.low >= expected * (1 - 1e-12)  # the end returned is an admissible scale
    assert "blockage" in w.low_limit


def test_smallest_model_is_bound_by_the_carriage_minimum_derived_by_hand():
    w = scale_window(_case(speed_range=(0.5, 6.0)))
    # lowest prototype speed 6 m/s: 6 / sqrt(lambda) = 0.5  ->  lambda = 144
    assert w.high == pytest.approx((6.0 / 0.5) ** 2, rel=2e-6)
    assert "carriage minimum" in w.high_limit


def test_window_end_agrees_with_the_solvers_limiting_scale():
    case = _case()
    p = sim.plan(case)
    assert scale_window(case).low == pytest.approx(p.limiting_scale, rel=2e-6)


def test_model_just_larger_than_the_window_breaks_a_limit_and_the_end_does_not():
    case = _case()
    w = scale_window(case)
    assert model_at_scale(case, w.low).admissible
    assert not model_at_scale(case, w.low * (1 - 1e-4)).admissible


def test_largest_model_is_bound_by_the_wavemaker_in_a_basin():
    # 3 h ITTC sea, H_s = 6 m, T_p = 11 s: T_z = 7.815 s, N = 1382, H_max = 1.9015 H_s;
    # 1.9015 x 6 / lambda <= 0.25 m  ->  lambda >= 45.6, larger than the blockage limit of the
    # 40 m x 4 m basin (sqrt(190 / (0.005 x 160)) = 15.4).
    basin = tank(kind="wave_basin", name="basin B", width=40.0, wavemaker_period_range=(0.5, 3.0),
                 wavemaker_max_height=0.25)
    sea = WaveCondition("irregular", significant_height=6.0, peak_period=11.0, spectrum="ittc",
                        duration=10800.0)
    case = Case(ship(), basin, matrix=MatrixSpec(waves=(sea,)))
    w = scale_window(case)
    n = 10800.0 / (11.0 * (4 / (5 * math.pi)) ** 0.25)
    assert w.low == pytest.approx(math.sqrt(math.log(n) / 2) * 6.0 / 0.25, rel=2e-6)
    assert "highest wave" in w.low_limit


def test_longest_wave_period_binds_the_smallest_model_in_a_basin():
    # T_p / sqrt(lambda) >= 0.5 s for T_p = 11 s  ->  lambda <= 484
    basin = tank(kind="wave_basin", name="basin B", width=40.0, speed_range=(0.01, 6.0),
                 wavemaker_period_range=(0.5, 3.0))
    sea = WaveCondition("irregular", significant_height=6.0, peak_period=11.0)
    w = scale_window(Case(ship(), basin, matrix=MatrixSpec(waves=(sea,))))
    assert w.high == pytest.approx((11.0 / 0.5) ** 2, rel=2e-6)
    assert "wavemaker's shortest period" in w.high_limit


def test_facility_that_admits_no_scale_names_the_worst_limit_and_its_excess():
    # Carriage 1.0-1.2 m/s: the highest speed 10 m/s needs lambda >= 69.4, the lowest 6 m/s
    # lambda <= 36: no model fits.
    w = scale_window(_case(speed_range=(1.0, 1.2)))
    assert not w.feasible and math.isnan(w.low)
    assert "carriage" in w.reason and w.excess > 0
    # Least violating where both relative violations are equal (limits.Limit.violation):
    # 10/(1.2 s) - 1 = 1 - 6/s with s = sqrt(lambda)  ->  s = (10/1.2 + 6)/2 = 7.1667,
    # lambda = 51.36, excess 10/(1.2 s) - 1 = 16.3 %
    s = (10 / 1.2 + 6) / 2
    assert w.closest == pytest.approx(s * s, rel=1e-3)
    assert w.excess == pytest.approx(10 / 1.2 / s - 1, rel=1e-3)


def test_fixed_scale_gives_a_window_of_that_scale_or_none():
    inside = replace(_case(), request=MatchRequest(scale=40.0))
    # carriage maximum: 10 / sqrt(2) = 7.07 m/s > 6 m/s, a hard limit
    outside = replace(_case(), request=MatchRequest(scale=2.0))
    w = scale_window(inside)
    assert w.feasible and w.low == w.high == 40.0
    assert not scale_window(outside).feasible
    assert "carriage maximum" in scale_window(outside).reason


def test_existing_model_over_a_soft_limit_is_admitted():
    # 1:30: blockage 190/900/32 = 0.0066 > 0.005, a soft limit: an existing model gets a warning
    # with the correction, not a refusal (the planner's rule for fixed models)
    w = scale_window(replace(_case(), request=MatchRequest(scale=30.0)))
    assert w.feasible and w.low == 30.0
    blockage = next(c for c in w.largest.checks if c.name.startswith("blockage"))
    assert blockage.status == "warning"

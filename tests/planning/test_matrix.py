"""The run matrix (similitude.planning.matrix): runs, scaling to the model, run time and facility
time."""

import math

import numpy as np
import pandas as pd
import pytest

import fluids_props as fp
from similitude.planning.case import (
    Case,
    FluidSpec,
    LoadingCondition,
    MatrixSpec,
    Prototype,
    WaveCondition,
)
from similitude.planning.facilities import Facility
from similitude.planning.matrix import build_matrix, facility_time_hours, runs_needed, runs_text
from similitude.planning.solution import Solution

G = 9.80665
LAM = 25.0
KN = 1852 / 3600


def _case(spec=None, facility=None, length=100.0, speeds=(5.0, 7.0, 9.0)):
    spec = spec or MatrixSpec()
    fac = facility or Facility("towing_tank", "test tank", 200.0, 7.0, 4.0, (0.1, 8.0),
                               acceleration=0.5, deceleration=1.0)
    proto = Prototype("surface_ship", length, speeds, FluidSpec("sea_water", 288.15))
    return Case(proto, fac, matrix=spec)


def _solution(lam=LAM, t_model=288.15):
    ps = fp.get_fluid("sea_water").evaluate_si(288.15, 101325.0)
    ms = fp.get_fluid("fresh_water").evaluate_si(t_model, 101325.0)
    return Solution(lam, lam**-0.5, ps, ms, exact=("froude",))


CONTRACT_COLUMNS = ("run", "repeat", "loading", "heading [deg]", "prototype speed [m/s]",
                    "prototype speed [kn]", "model speed [m/s]", "Froude number [-]",
                    "model Reynolds number [-]", "prototype Reynolds number [-]",
                    "run time [s]", "run distance [m]", "waiting time [s]")
WAVE_COLUMNS = ("prototype wave period [s]", "model wave period [s]",
                "prototype wave height [m]", "model wave height [m]",
                "prototype significant wave height [m]", "model significant wave height [m]",
                "prototype peak period [s]", "model peak period [s]", "spectrum")


def test_one_row_per_speed_loading_heading_wave_and_repeat():
    spec = MatrixSpec(loading=(LoadingCondition("full"), LoadingCondition("ballast")),
                      headings=(180.0, 135.0, 90.0),
                      waves=(WaveCondition("regular", period=8.0, height=2.0),), repeats=2)
    m = build_matrix(_case(spec), _solution())
    assert len(m) == 3 * 2 * 3 * 1 * 2
    assert m["run"].tolist() == list(range(1, len(m) + 1))
    assert sorted(set(m["repeat"])) == [1, 2]


def test_contract_columns_are_present_and_carry_units():
    spec = MatrixSpec(waves=(WaveCondition("irregular", significant_height=3.0,
                                           peak_period=10.0),))
    m = build_matrix(_case(spec), _solution())
    for col in CONTRACT_COLUMNS + WAVE_COLUMNS:
        assert col in m.columns
    unitless = {"run", "repeat", "loading", "speed index", "spectrum", "wave", "wave kind",
                "run feasible"}
    for col in m.columns:
        assert col in unitless or (col.endswith("]") and "[" in col), col


def test_calm_water_matrix_has_no_wave_columns():
    m = build_matrix(_case(), _solution())
    assert "model wave period [s]" not in m.columns


def test_model_speed_follows_froude_scaling():
    # Froude similitude: V_m = V_p / sqrt(lambda), Fr_m = Fr_p (published facts, sec. 0).
    m = build_matrix(_case(), _solution())
    np.testing.assert_allclose(m["model speed [m/s]"], m["prototype speed [m/s]"] / 5.0)
    np.testing.assert_allclose(m["Froude number [-]"], m["prototype Froude number [-]"])
    # Fr = V / sqrt(g L) (ITTC Symbols 2017): 5 m/s on 100 m gives 0.15964
    assert m["prototype Froude number [-]"].iloc[0] == pytest.approx(5 / math.sqrt(G * 100))
    assert m["prototype speed [kn]"].iloc[0] == pytest.approx(5 / KN)


def test_model_reynolds_number_uses_the_model_water_viscosity():
    # Oracle: IAPWS-95 (iapws package) kinematic viscosity of water at 15 degC, 0.101325 MPa.
    from iapws import IAPWS95

    nu = IAPWS95(T=288.15, P=0.101325).nu
    m = build_matrix(_case(), _solution())
    re = m["model speed [m/s]"] * (100.0 / LAM) / nu
    np.testing.assert_allclose(m["model Reynolds number [-]"], re, rtol=1e-4)


def test_speeds_given_as_froude_numbers():
    spec = MatrixSpec(speeds=(0.2, 0.3), speed_basis="froude")
    m = build_matrix(_case(spec), _solution())
    # V = Fr sqrt(g L)
    np.testing.assert_allclose(m["prototype speed [m/s]"],
                               np.array([0.2, 0.3]) * math.sqrt(G * 100))
    np.testing.assert_allclose(m["Froude number [-]"], [0.2, 0.3])


def test_speeds_given_as_model_speeds():
    spec = MatrixSpec(speeds=(1.0, 1.5), speed_basis="model")
    m = build_matrix(_case(spec), _solution())
    np.testing.assert_allclose(m["model speed [m/s]"], [1.0, 1.5])
    np.testing.assert_allclose(m["prototype speed [m/s]"], [5.0, 7.5])


def test_loading_condition_is_scaled_to_the_model():
    spec = MatrixSpec(loading=(LoadingCondition("full", draught=5.0, trim=0.5,
                                                displacement=8000.0),))
    m = build_matrix(_case(spec), _solution())
    # lengths / lambda, volumes / lambda^3 (Froude scale factors)
    assert m["model draught [m]"].iloc[0] == pytest.approx(0.2)
    assert m["model trim [m]"].iloc[0] == pytest.approx(0.02)
    assert m["model displacement [m^3]"].iloc[0] == pytest.approx(8000 / LAM**3)


def test_regular_wave_given_by_period_and_steepness():
    spec = MatrixSpec(waves=(WaveCondition("regular", period=8.0, steepness=1 / 50),))
    m = build_matrix(_case(spec), _solution()).iloc[0]
    # deep water L = g T^2 / (2 pi) (Dean & Dalrymple 1991, eq. 3.21 deep-water limit)
    lw = G * 64 / (2 * math.pi)
    assert m["prototype wave length [m]"] == pytest.approx(lw)
    assert m["prototype wave height [m]"] == pytest.approx(lw / 50)
    # Froude: T_m = T_p / sqrt(lambda), H_m = H_p / lambda
    assert m["model wave period [s]"] == pytest.approx(8.0 / 5.0)
    assert m["model wave height [m]"] == pytest.approx(lw / 50 / LAM)


def test_regular_wave_given_by_length_ratio():
    spec = MatrixSpec(waves=(WaveCondition("regular", length_ratio=1.0, height=2.0),))
    m = build_matrix(_case(spec), _solution()).iloc[0]
    # deep water: T = sqrt(2 pi L / g) for L_w = L_pp = 100 m
    assert m["prototype wave period [s]"] == pytest.approx(math.sqrt(2 * math.pi * 100 / G))


def test_irregular_sea_is_scaled_and_split_into_runs():
    spec = MatrixSpec(speeds=(5.0,), waves=(WaveCondition("irregular", significant_height=4.0,
                                                          peak_period=10.0,
                                                          duration=3 * 3600.0),))
    m = build_matrix(_case(spec), _solution()).iloc[0]
    assert m["model significant wave height [m]"] == pytest.approx(4.0 / LAM)
    assert m["model peak period [s]"] == pytest.approx(2.0)
    # D_m = D_p / sqrt(lambda) = 10800 / 5 s
    assert m["model sea duration [s]"] == pytest.approx(2160.0)
    assert m["runs needed [-]"] == math.ceil(2160.0 / m["run time [s]"])


def test_steady_run_length_is_tank_length_minus_model_and_speed_changes():
    # x_run = L_tank - L_m - V^2/(2a) - V^2/(2d); hand computation for V_m = 1.8 m/s,
    # a = 0.5, d = 1.0 m/s^2, L_tank = 200 m, L_m = 4 m.
    m = build_matrix(_case(), _solution())
    row = m.iloc[2]
    v = 9.0 / 5.0
    x = 200.0 - 4.0 - v**2 / 1.0 - v**2 / 2.0
    assert row["run distance [m]"] == pytest.approx(x)
    assert row["run time [s]"] == pytest.approx(x / v)


def test_too_fast_a_run_for_the_tank_is_flagged_infeasible():
    fac = Facility("towing_tank", "short tank", 30.0, 4.0, 2.0, (0.1, 10.0), acceleration=0.3)
    spec = MatrixSpec(speeds=(2.0, 3.2), speed_basis="model")
    m = build_matrix(_case(spec, fac), _solution())
    # 3.2^2/0.6 * 2 = 34 m > 30 m - 4 m
    assert m["run feasible"].tolist() == [True, False]
    assert m["run distance [m]"].iloc[1] == 0.0


def test_run_shorter_than_the_facility_minimum_steady_time_is_infeasible():
    fac = Facility("towing_tank", "tank", 100.0, 4.0, 2.0, (0.1, 10.0), acceleration=1.0,
                   min_steady_time=20.0)
    spec = MatrixSpec(speeds=(2.0, 4.0), speed_basis="model")
    m = build_matrix(_case(spec, fac), _solution())
    # x_run = 100 - 4 - V^2/(2a) - V^2/(2d), a = d = 1 m/s^2: 92 m in 46 s at 2 m/s and
    # 80 m in 20 s at 4 m/s (on the limit, allowed); 78.4 m in 18.7 s at 4.2 m/s (too short)
    assert m["run time [s]"].tolist() == pytest.approx([46.0, 20.0])
    assert m["run feasible"].tolist() == [True, True]
    m = build_matrix(_case(MatrixSpec(speeds=(2.0, 4.2), speed_basis="model"), fac),
                     _solution())
    assert m["run feasible"].tolist() == [True, False]


def test_waiting_time_from_the_case_is_used():
    m = build_matrix(_case(MatrixSpec(waiting_time=600.0)), _solution())
    assert (m["waiting time [s]"] == 600.0).all()


def test_default_waiting_time_is_stated_as_common_practice():
    m = build_matrix(_case(), _solution())
    assert any("common practice" in n and "waiting" in n for n in m.attrs["notes"])


def test_facility_time_adds_runs_speed_changes_and_waiting():
    m = build_matrix(_case(MatrixSpec(waiting_time=600.0)), _solution())
    v = m["model speed [m/s]"]
    per_run = m["run time [s]"] + v / 0.5 + v / 1.0 + 600.0
    assert facility_time_hours(m) == pytest.approx(per_run.sum() / 3600.0)


def test_station_keeping_in_a_basin_runs_for_the_whole_sea_duration():
    fac = Facility("wave_basin", "basin", 80.0, 40.0, 3.0, (0.0, 4.0))
    spec = MatrixSpec(speeds=(0.0,), waves=(WaveCondition("irregular", significant_height=6.0,
                                                          peak_period=12.0),))
    m = build_matrix(_case(spec, fac), _solution(lam=36.0)).iloc[0]
    # default 3 h full scale (offshore common practice) -> 10800 / 6 = 1800 s model scale
    assert m["run time [s]"] == pytest.approx(1800.0)
    assert m["runs needed [-]"] == 1


def test_tunnel_runs_have_no_run_distance():
    fac = Facility("cavitation_tunnel", "tunnel", 2.0, 0.6, 0.6, (1.0, 12.0))
    m = build_matrix(_case(facility=fac), _solution())
    assert m["run distance [m]"].isna().all()
    assert (m["run time [s]"] > 0).all()


def test_ten_thousand_run_matrix_is_built():
    spec = MatrixSpec(speeds=tuple(np.linspace(0.5, 10, 100)),
                      loading=tuple(LoadingCondition(f"L{i}") for i in range(5)),
                      headings=(0.0, 45.0, 90.0, 135.0, 180.0),
                      waves=(WaveCondition("regular", period=8.0, height=2.0),
                             WaveCondition("irregular", significant_height=3.0,
                                           peak_period=10.0),
                             WaveCondition("regular", period=12.0, height=3.0),
                             WaveCondition("irregular", significant_height=5.0,
                                           peak_period=12.0, spectrum="ittc")))
    m = build_matrix(_case(spec), _solution())
    assert len(m) == 10_000
    assert np.isfinite(m["model Reynolds number [-]"]).all()


def test_the_planner_uses_this_matrix():
    import similitude as sim

    spec = MatrixSpec(waves=(WaveCondition("regular", period=8.0, height=2.0),), repeats=2)
    p = sim.plan(_case(spec))
    for col in CONTRACT_COLUMNS:
        assert col in p.matrix.columns
    assert len(p.matrix) == 3 * 2
    np.testing.assert_allclose(p.matrix["model speed [m/s]"],
                               p.matrix["prototype speed [m/s]"] / math.sqrt(p.scale))


def test_current_is_scaled_to_the_model_like_a_speed():
    # Froude similitude scales every velocity by 1/sqrt(lambda) (published facts, sec. 0):
    # a 0.5 m/s current at 1:25 is 0.1 m/s in the basin.
    m = build_matrix(_case(MatrixSpec(current=0.5)), _solution())
    np.testing.assert_allclose(m["prototype current [m/s]"], 0.5)
    np.testing.assert_allclose(m["model current [m/s]"], 0.5 / math.sqrt(LAM), rtol=1e-12)
    assert "model current [m/s]" not in build_matrix(_case(), _solution()).columns


def test_run_count_gives_conditions_and_runs_needed_apart():
    # An irregular sea of 3 h full scale at 1:30 lasts 10800/sqrt(30) = 1971.8 s in the model;
    # each row that cannot hold it in one run needs several: the runs to book are the sum of
    # the "runs needed" column, not the number of rows.
    m = pd.DataFrame({"runs needed [-]": [1, 3, 5]})
    assert runs_needed(m) == 9
    assert runs_text(m) == "3 conditions (run-matrix rows), 9 runs needed"
    assert runs_text(pd.DataFrame({"runs needed [-]": [1, 1]})) == "2 runs (one per condition)"


# -- run order, loading changes, wave calibration -----------------------------------------------
def _loaded(**kw):
    spec = dict(speeds=(9.0, 5.0, 7.0), repeats=2,
                loading=(LoadingCondition("full"), LoadingCondition("ballast"),
                         LoadingCondition("light")), waiting_time=600.0)
    spec.update(kw)
    return MatrixSpec(**spec)


def test_runs_are_grouped_by_loading_so_the_ballast_changes_once_per_condition():
    m = build_matrix(_case(_loaded()), _solution())
    loads = m["loading"].tolist()
    changes = sum(a != b for a, b in zip(loads, loads[1:], strict=False))
    assert changes == 2  # three loading conditions, each run as one block
    assert loads[:6] == ["full"] * 6


def test_within_a_group_speeds_ascend_and_each_repeat_runs_the_series_again():
    m = build_matrix(_case(_loaded()), _solution())
    first = m[m["loading"] == "full"]
    assert first["prototype speed [m/s]"].tolist() == [5.0, 7.0, 9.0, 5.0, 7.0, 9.0]
    assert first["repeat"].tolist() == [1, 1, 1, 2, 2, 2]
    # the speed index still names the speed as listed in the case (9, 5, 7 kn order)
    assert first["speed index"].tolist()[:3] == [2, 3, 1]


def test_waves_group_inside_a_loading_and_headings_inside_a_wave():
    spec = MatrixSpec(speeds=(5.0,), headings=(180.0, 90.0),
                      loading=(LoadingCondition("full"), LoadingCondition("ballast")),
                      waves=(WaveCondition("regular", period=8.0, height=2.0, name="A"),
                             WaveCondition("regular", period=10.0, height=2.0, name="B")))
    m = build_matrix(_case(spec), _solution())
    assert list(zip(m["loading"], m["wave"], m["heading [deg]"], strict=True)) == [
        ("full", "A", 180.0), ("full", "A", 90.0), ("full", "B", 180.0), ("full", "B", 90.0),
        ("ballast", "A", 180.0), ("ballast", "A", 90.0), ("ballast", "B", 180.0),
        ("ballast", "B", 90.0)]


def test_a_random_order_shuffles_only_within_each_group_and_repeats_with_its_seed():
    a = build_matrix(_case(_loaded(speed_order="random", seed=7)), _solution())
    b = build_matrix(_case(_loaded(speed_order="random", seed=7)), _solution())
    c = build_matrix(_case(_loaded(speed_order="random", seed=8)), _solution())
    speeds = a["prototype speed [m/s]"].tolist()
    assert speeds == b["prototype speed [m/s]"].tolist()
    assert speeds != c["prototype speed [m/s]"].tolist()
    assert a["loading"].tolist() == build_matrix(_case(_loaded()), _solution())[
        "loading"].tolist()
    for _, g in a.groupby("loading"):  # every speed and repeat once per group
        assert sorted(zip(g["prototype speed [m/s]"], g["repeat"], strict=True)) == sorted(
            (v, r) for v in (5.0, 7.0, 9.0) for r in (1, 2))
    assert any("random order (seed 7)" in n for n in a.attrs["notes"])


def test_each_change_of_loading_adds_the_changeover_to_the_facility_hours():
    # hand count: 3 loadings -> 2 changes at the common-practice 1 h each
    m = build_matrix(_case(_loaded()), _solution())
    v = m["model speed [m/s]"]
    runs = (m["run time [s]"] + v / 0.5 + v / 1.0 + 600.0).sum()
    assert facility_time_hours(m) == pytest.approx((runs + 2 * 3600.0) / 3600.0)
    assert m["loading change before the run [s]"].tolist()[6] == 3600.0
    assert any("loading changeover 1 h" in n and "common practice" in n
               for n in m.attrs["notes"])


def test_the_facility_changeover_time_replaces_the_default():
    fac = Facility("towing_tank", "test tank", 200.0, 7.0, 4.0, (0.1, 8.0),
                   acceleration=0.5, deceleration=1.0, loading_changeover=1800.0)
    m = build_matrix(_case(_loaded(), fac), _solution())
    assert m["loading change before the run [s]"].sum() == 2 * 1800.0


def test_one_loading_condition_needs_no_changeover():
    m = build_matrix(_case(_loaded(loading=(LoadingCondition("full"),))), _solution())
    assert (m["loading change before the run [s]"] == 0).all()


def test_each_wave_condition_is_calibrated_once_without_the_model_in_the_hours():
    # irregular sea: the whole model realisation D_p/sqrt(lambda) = 10800/5 s, then the wait;
    # regular wave: 20 periods of T_p/sqrt(lambda) = 8/5 s, then the wait
    spec = MatrixSpec(speeds=(5.0, 7.0), waiting_time=600.0,
                      loading=(LoadingCondition("full"), LoadingCondition("ballast")),
                      waves=(WaveCondition("irregular", significant_height=3.0,
                                           peak_period=10.0, duration=10800.0),
                             WaveCondition("regular", period=8.0, height=2.0)))
    m = build_matrix(_case(spec), _solution())
    cal = m["wave calibration before the run [s]"]
    assert sorted(cal[cal > 0].tolist()) == pytest.approx([20 * 8.0 / 5 + 600.0,
                                                          10800.0 / 5 + 600.0])
    assert cal.iloc[0] == pytest.approx(10800.0 / 5 + 600.0)  # before the first run in it
    total = (m["runs needed [-]"] * (m["run time [s]"] + m["model speed [m/s]"] / 0.5
                                     + m["model speed [m/s]"] / 1.0 + 600.0)).sum()
    assert facility_time_hours(m) * 3600.0 == pytest.approx(total + cal.sum() + 3600.0)


def test_wave_calibration_can_be_left_out():
    spec = MatrixSpec(speeds=(5.0,), wave_calibration=False,
                      waves=(WaveCondition("regular", period=8.0, height=2.0),))
    m = build_matrix(_case(spec), _solution())
    assert (m["wave calibration before the run [s]"] == 0).all()


@pytest.mark.parametrize("kw, field", [({"speed_order": "sorted"}, "speed_order"),
                                       ({"seed": -1}, "seed")])
def test_a_bad_order_or_seed_is_an_input_error_naming_the_field(kw, field):
    from similitude.errors import InputError

    with pytest.raises(InputError, match=field):
        MatrixSpec(**kw)

"""Reading measured runs: columns with units in the headers, and one clear line per problem."""

from __future__ import annotations

import numpy as np
import pandas as pd
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from similitude.errors import InputError
from similitude.readers.measured import (
    open_water_runs_from_frame,
    read_open_water_runs,
    read_resistance_runs,
    resistance_runs_from_frame,
    split_header,
)

# Exact conversion factors, from outside pint:
KNOT = 1852.0 / 3600.0  # m/s; BIPM SI Brochure 9th ed. (2019), Table 8 (1 nautical mile = 1852 m)
LBF = 4.4482216152605  # N; NIST SP 811 (2008), Appendix B.8 (pound-force)


def _csv(tmp_path, text, name="runs.csv"):
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return p


def test_header_splits_into_name_and_unit():
    assert split_header("Model Speed [m/s]") == ("model speed", "m/s")
    assert split_header("run") == ("run", None)


def test_si_file_reads_to_si_arrays(tmp_path):
    p = _csv(tmp_path, "run,model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "R1,1.2,20.5,15.0\nR2,1.5,31.0,15.2\n")
    runs = read_resistance_runs(p)
    assert runs.run == ("R1", "R2")
    np.testing.assert_allclose(runs.speed, [1.2, 1.5])
    np.testing.assert_allclose(runs.resistance, [20.5, 31.0])
    # 15 degC = 288.15 K by the definition of the Celsius scale (SI Brochure §2.3.1)
    np.testing.assert_allclose(runs.temperature, [288.15, 288.35])


def test_knots_pound_force_and_fahrenheit_convert_to_si(tmp_path):
    p = _csv(tmp_path, "model speed [kn],total resistance [lbf],water temperature [degF]\n"
                       "3.0,5.0,59.0\n")
    runs = read_resistance_runs(p)
    assert runs.speed[0] == pytest.approx(3.0 * KNOT, rel=1e-12)
    assert runs.resistance[0] == pytest.approx(5.0 * LBF, rel=1e-12)
    # T/K = (t/degF + 459.67) * 5/9 (NIST SP 811, B.8): 59 degF = 288.15 K
    assert runs.temperature[0] == pytest.approx((59.0 + 459.67) * 5 / 9, rel=1e-12)


def test_one_temperature_for_all_runs_is_accepted(tmp_path):
    p = _csv(tmp_path, "model speed [m/s],total resistance [N]\n1.0,10\n1.1,12\n")
    runs = read_resistance_runs(p, temperature="16.5 degC")
    np.testing.assert_allclose(runs.temperature, [289.65, 289.65])
    assert runs.run == ("1", "2")  # free rows are numbered


def test_temperature_given_twice_is_an_error(tmp_path):
    p = _csv(tmp_path, "model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "1.0,10,15\n")
    with pytest.raises(InputError, match="both as column"):
        read_resistance_runs(p, temperature="15 degC")


def test_xlsx_file_reads_like_csv(tmp_path):
    p = tmp_path / "runs.xlsx"
    pd.DataFrame({"model speed [m/s]": [1.0, 1.2], "total resistance [N]": [10.0, 14.0],
                  "water temperature [degC]": [15.0, 15.0]}).to_excel(p, index=False)
    runs = read_resistance_runs(p)
    np.testing.assert_allclose(runs.resistance, [10.0, 14.0])


def test_missing_column_is_named(tmp_path):
    p = _csv(tmp_path, "model speed [m/s],water temperature [degC]\n1.0,15\n")
    with pytest.raises(InputError, match=r"'total resistance \[N\]' missing"):
        read_resistance_runs(p)


def test_non_numeric_cell_names_row_and_column(tmp_path):
    p = _csv(tmp_path, "model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "1.0,10,15\n1.1,abc,15\n")
    with pytest.raises(InputError) as err:
        read_resistance_runs(p)
    # the header is row 1, so the second data row is row 3
    assert "row 3, column 'total resistance [N]': 'abc' is not a finite number" in str(err.value)


def test_empty_cell_is_reported(tmp_path):
    p = _csv(tmp_path, "model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "1.0,,15\n")
    with pytest.raises(InputError, match="row 2, column 'total resistance \\[N\\]': empty"):
        read_resistance_runs(p)


def test_negative_resistance_is_refused(tmp_path):
    p = _csv(tmp_path, "model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "1.0,-2,15\n")
    with pytest.raises(InputError, match="row 2, column 'total resistance'.*not positive"):
        read_resistance_runs(p)


def test_duplicate_run_ids_are_refused(tmp_path):
    p = _csv(tmp_path, "run,model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "7,1.0,10,15\n7,1.1,12,15\n")
    with pytest.raises(InputError, match="run id '7' repeats row 2"):
        read_resistance_runs(p)


def test_runs_outside_the_plan_are_refused(tmp_path):
    p = _csv(tmp_path, "run,model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "1,1.0,10,15\n99,1.1,12,15\n")
    with pytest.raises(InputError, match="run '99' is not in the plan"):
        read_resistance_runs(p, plan_runs=[1, 2, 3])


def test_integer_like_run_ids_match_the_plan(tmp_path):
    p = _csv(tmp_path, "run,model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "1.0,1.0,10,15\n2,1.1,12,15\n")
    runs = read_resistance_runs(p, plan_runs=[1, 2])
    assert runs.run == ("1", "2")


def test_runs_without_an_id_are_numbered_extra_runs_in_file_order(tmp_path):
    p = _csv(tmp_path, "run,model speed [m/s],total resistance [N],water temperature [degC]\n"
                       ",0.6,3,15\n1,1.0,10,15\n,0.7,4,15\n")
    runs = read_resistance_runs(p, plan_runs=[1, 2])
    assert runs.run == ("extra 1", "1", "extra 2")


def test_header_without_unit_is_refused(tmp_path):
    p = _csv(tmp_path, "model speed,total resistance [N],water temperature [degC]\n1,10,15\n")
    with pytest.raises(InputError, match="'model speed' has no unit in its header"):
        read_resistance_runs(p)


def test_unit_of_wrong_dimension_is_refused(tmp_path):
    p = _csv(tmp_path, "model speed [N],total resistance [N],water temperature [degC]\n"
                       "1,10,15\n")
    with pytest.raises(InputError, match=r"unit 'N' has dimension"):
        read_resistance_runs(p)


def test_unknown_unit_is_refused(tmp_path):
    p = _csv(tmp_path, "model speed [furlongs per fortnightz],total resistance [N],"
                       "water temperature [degC]\n1,10,15\n")
    with pytest.raises(InputError, match="is not a known unit"):
        read_resistance_runs(p)


def test_all_problems_are_reported_at_once(tmp_path):
    p = _csv(tmp_path, "model speed [m/s],total resistance [N],water temperature [degC]\n"
                       "x,10,15\n1.0,y,15\n")
    with pytest.raises(InputError) as err:
        read_resistance_runs(p)
    assert len(err.value.problems) == 2


def test_missing_file_is_an_input_error(tmp_path):
    with pytest.raises(InputError, match="not found"):
        read_resistance_runs(tmp_path / "nope.csv")


def test_optional_sinkage_trim_and_stimulator_columns(tmp_path):
    p = _csv(tmp_path, "model speed [m/s],total resistance [N],water temperature [degC],"
                       "sinkage [mm],trim [deg],stimulator drag [N]\n1.0,10,15,4,0.2,0.1\n")
    runs = read_resistance_runs(p)
    assert runs.sinkage[0] == pytest.approx(0.004)
    assert runs.trim[0] == pytest.approx(0.2)
    assert runs.stimulator_drag[0] == pytest.approx(0.1)


def test_open_water_measured_quantities_reduce_to_coefficients():
    # J = V_A/(nD), K_T = T/(rho n^2 D^4), K_Q = Q/(rho n^2 D^5): definitions of the ITTC
    # Symbols and Terminology List (2017). Hand values: D = 0.25 m, n = 12 1/s, rho = 999.
    frame = pd.DataFrame({"advance speed [m/s]": ["1.5"], "rotation rate [1/s]": ["12"],
                          "thrust [N]": ["150"], "torque [N m]": ["5"]})
    runs = open_water_runs_from_frame(frame, diameter=0.25, density=999.0)
    assert runs.advance_ratio[0] == pytest.approx(1.5 / (12 * 0.25))  # 0.5
    assert runs.thrust_coefficient[0] == pytest.approx(150 / (999 * 144 * 0.25**4))
    assert runs.torque_coefficient[0] == pytest.approx(5 / (999 * 144 * 0.25**5))


def test_open_water_file_of_coefficients(tmp_path):
    p = _csv(tmp_path, "advance ratio [-],thrust coefficient [-],torque coefficient [-]\n"
                       "0.5,0.3,0.04\n", "ow.csv")
    runs = read_open_water_runs(p)
    assert runs.thrust_coefficient[0] == 0.3


def test_open_water_thrust_without_diameter_is_refused():
    frame = pd.DataFrame({"advance ratio [-]": ["0.5"], "rotation rate [1/s]": ["12"],
                          "thrust [N]": ["150"], "torque coefficient [-]": ["0.04"]})
    with pytest.raises(InputError, match="propeller diameter: missing"):
        open_water_runs_from_frame(frame)


def test_empty_table_is_refused():
    with pytest.raises(InputError, match="no runs"):
        resistance_runs_from_frame(pd.DataFrame({"model speed [m/s]": []}))


def test_open_water_thrust_uses_fresh_water_at_the_run_temperature():
    # K_T = T/(rho n^2 D^4) with rho of fresh water at 15 degC, 999.1026 kg/m^3
    # (ITTC 7.5-02-01-03 Rev 02 2011 table); 1e-4 covers the property formulation.
    frame = pd.DataFrame({"advance ratio [-]": ["0.5"], "rotation rate [1/s]": ["12"],
                          "thrust [N]": ["150"], "torque coefficient [-]": ["0.04"],
                          "water temperature [degC]": ["15"]})
    runs = open_water_runs_from_frame(frame, diameter=0.25)
    assert runs.thrust_coefficient[0] == pytest.approx(150 / (999.1026 * 144 * 0.25**4),
                                                       rel=1e-4)


def test_open_water_rate_in_rpm_counts_revolutions():
    # 1 rpm = 1/60 revolution per second (BIPM SI Brochure, 9th ed. 2019, Table 8 lists the
    # minute as 60 s); n of J = V_A/(nD) counts revolutions (ITTC Symbols and Terminology
    # List, 2017), so 720 rpm is n = 12 1/s, not the 75.4 rad/s pint would give.
    frame = pd.DataFrame({"advance speed [m/s]": ["1.5"], "rotation rate [rpm]": ["720"],
                          "thrust coefficient [-]": ["0.3"], "torque coefficient [-]": ["0.04"]})
    runs = open_water_runs_from_frame(frame, diameter=0.25)
    assert runs.rotation_rate[0] == pytest.approx(12.0, rel=1e-12)
    assert runs.advance_ratio[0] == pytest.approx(1.5 / (12.0 * 0.25), rel=1e-12)  # 0.5


_GOOD_ROWS = ("run,model speed [m/s],total resistance [N],water temperature [degC]\n"
              "1,1.0,10.0,15.0\n2,1.2,14.0,15.1\n3,1.4,19.0,15.2\n")


def test_junk_cells_give_runs_or_one_input_error_per_problem():
    # Property-based (hypothesis): any cell replaced by junk text reads, or raises InputError
    # whose every line names a row or column; never another exception.
    junk = st.one_of(st.text(max_size=12), st.sampled_from(
        ["", "nan", "inf", "-1", "0", "1e400", "abc", "1,5", "R1", "2", "[m/s]", "speed"]))

    @settings(max_examples=300, deadline=None, suppress_health_check=list(HealthCheck))
    @given(cells=st.lists(st.tuples(st.integers(0, 3), st.integers(0, 3), junk), min_size=1,
                          max_size=3))
    def check(cells):
        rows = [line.split(",") for line in _GOOD_ROWS.splitlines()]
        for i, j, value in cells:
            rows[i][j] = value.replace(",", ";").replace("\n", " ").replace("\r", " ")
        frame = pd.DataFrame(rows[1:], columns=rows[0])
        try:
            runs = resistance_runs_from_frame(frame)
        except InputError as exc:
            assert exc.problems and all(("row" in p or "column" in p or "run" in p)
                                        for p in exc.problems)
        else:
            assert np.all(runs.resistance > 0) and np.all(np.isfinite(runs.speed))

    check()


@pytest.mark.parametrize("unit, value", [("rev/min", "720"), ("rev/s", "12"), ("Hz", "12")])
def test_open_water_rate_units_of_the_trade_count_revolutions(unit, value):
    # 720 rev/min = 12 rev/s = 12 Hz (1 min = 60 s, BIPM SI Brochure 2019, Table 8)
    frame = pd.DataFrame({"advance speed [m/s]": ["1.5"], f"rotation rate [{unit}]": [value],
                          "thrust coefficient [-]": ["0.3"], "torque coefficient [-]": ["0.04"]})
    runs = open_water_runs_from_frame(frame, diameter=0.25)
    assert runs.rotation_rate[0] == pytest.approx(12.0, rel=1e-12)

"""Reading measured self-propulsion runs: units in the headers, every problem named.

Unit definitions (exact): 1 kn = 1852/3600 m/s, 1 rpm = 1/60 s^-1 (BIPM SI Brochure 2019,
Table 8); 1 lbf = 4.4482216152605 N, 1 ft = 0.3048 m (NIST SP 811, 2008, B.8).
"""

from __future__ import annotations

import pytest

from similitude.errors import InputError
from similitude.readers.measured import read_self_propulsion_runs

HEADER = "run,model speed [kn],rotation rate [rpm],thrust [lbf],torque [lbf*ft],tow force [N]," \
         "water temperature [degF]\n"


def test_units_of_the_headers_are_converted_to_si(tmp_path):
    p = tmp_path / "sp.csv"
    p.write_text(HEADER + "7,3.5,600,5,0.8,2.5,62.6\n")
    r = read_self_propulsion_runs(p)
    assert r.run == ("7",)
    assert r.speed[0] == pytest.approx(3.5 * 1852 / 3600, rel=1e-12)
    assert r.rotation_rate[0] == pytest.approx(10.0, rel=1e-12)        # 600 rpm = 10 1/s
    assert r.thrust[0] == pytest.approx(5 * 4.4482216152605, rel=1e-12)
    assert r.torque[0] == pytest.approx(0.8 * 4.4482216152605 * 0.3048, rel=1e-12)
    assert r.tow_force[0] == pytest.approx(2.5)
    assert r.temperature[0] == pytest.approx(290.15, rel=1e-12)        # 62.6 degF = 17 degC


def test_one_temperature_for_all_runs_may_be_given(tmp_path):
    p = tmp_path / "sp.csv"
    p.write_text("model speed [m/s],rotation rate [Hz],thrust [N],torque [N m],tow force [N]\n"
                 "1.5,8,14,0.55,4.2\n1.8,9,19,0.75,5.8\n")
    r = read_self_propulsion_runs(p, temperature="17 degC")
    assert list(r.temperature) == pytest.approx([290.15, 290.15])
    assert r.run == ("1", "2")


def test_a_cell_that_is_no_number_names_row_and_column(tmp_path):
    p = tmp_path / "sp.csv"
    p.write_text(HEADER + "1,3.5,600,5,0.8,2.5,62.6\n2,3.6,abc,5,0.8,2.5,62.6\n")
    with pytest.raises(InputError, match="row 3, column 'rotation rate \\[rpm\\]'"):
        read_self_propulsion_runs(p)


def test_a_negative_thrust_and_a_cold_tank_are_both_reported(tmp_path):
    p = tmp_path / "sp.csv"
    p.write_text(HEADER + "1,3.5,600,-5,0.8,2.5,62.6\n2,3.6,610,5,0.8,2.5,20\n")
    with pytest.raises(InputError) as info:
        read_self_propulsion_runs(p)
    text = "\n".join(info.value.problems)
    assert "row 2, column 'thrust'" in text and "row 3, column 'water temperature'" in text


def test_missing_tow_force_column_is_named(tmp_path):
    p = tmp_path / "sp.csv"
    p.write_text("model speed [m/s],rotation rate [1/s],thrust [N],torque [N m],"
                 "water temperature [degC]\n1.5,8,14,0.55,17\n")
    with pytest.raises(InputError, match="tow force"):
        read_self_propulsion_runs(p)

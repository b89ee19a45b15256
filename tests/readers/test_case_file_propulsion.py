"""The [propulsion] table of a case file and the dynamometer keys of a facility.

Unit definitions used as outside references: 1 kn = 1852/3600 m/s (BIPM SI Brochure 2019,
Table 8); 1 lbf = 4.4482216152605 N (NIST SP 811, 2008, B.8).
"""

from __future__ import annotations

import copy
from pathlib import Path

import pytest

from similitude.readers.case_file import load_case, parse_case
from tests.readers.test_case_file import metric_case
from tests.readers.test_case_file import problems_of as _problems

DEMO = Path(__file__).parents[2] / "demo_cases"
KN = 1852.0 / 3600.0


def _with(propulsion: dict, **facility) -> dict:
    case = metric_case()
    case["test"] = "self_propulsion"
    case["propulsion"] = propulsion
    case["facility"].update(facility)
    return case


def test_propulsion_table_reads_in_si():
    case = parse_case(_with({
        "propeller_diameter": "13.78 ft", "propellers": 2,
        "thrust_polynomial": [0.46, -0.30, -0.13], "torque_polynomial": [0.062, -0.032, -0.012],
        "resistance_estimate": {"speeds": ["10 kn", "18 kn"],
                                "effective_power": ["400 kW", "2400 kW"]},
        "wake_fraction": 0.22, "thrust_deduction": "16 %", "tow_force_factors": [0, 1, 2],
        "friction_correction": "1978",
    }, largest_thrust="45 lbf", largest_torque="8 N*m"))
    p = case.propulsion
    assert p.propeller_diameter == pytest.approx(13.78 * 0.3048, rel=1e-12)
    assert p.propellers == 2 and p.friction_correction == "1978"
    assert p.thrust_deduction == pytest.approx(0.16)
    assert p.tow_force_factors == (0.0, 1.0, 2.0)
    # effective power is read as resistance R = P_E/V
    assert p.resistance_values[1] == pytest.approx(2400e3 / (18 * KN), rel=1e-12)
    assert case.facility.max_thrust == pytest.approx(45 * 4.4482216152605, rel=1e-12)
    assert case.facility.max_torque == pytest.approx(8.0)


def test_demo_case_reads_its_measured_files_relative_to_the_case():
    case = load_case(DEMO / "ferry_self_propulsion.toml")
    p = case.propulsion
    assert case.test == "self_propulsion"
    assert p.open_water is not None and len(p.open_water.advance_ratio) >= 4
    assert p.resistance_runs is not None and "SYNTHETIC" in p.resistance_runs.source


def test_problems_in_a_referenced_file_name_the_key(tmp_path):
    (tmp_path / "ow.csv").write_text("advance ratio [-],thrust coefficient [-]\n0.2,0.3\n")
    problems = _problems(_with({"open_water": "ow.csv"}), tmp_path)
    assert any(p.startswith("propulsion.open_water: ") for p in problems)


def test_missing_file_is_named(tmp_path):
    problems = _problems(_with({"resistance_test": "nowhere.csv"}), tmp_path)
    assert any("propulsion.resistance_test" in p and "not found" in p for p in problems)


def test_unknown_key_and_bad_values_are_all_reported():
    problems = _problems(_with({"wake": 0.2, "propellers": 7, "friction_correction": "new",
                                "rotative_efficiency": 2.0}))
    text = "\n".join(problems)
    assert "propulsion.wake: unknown key" in text and "wake_fraction" in text
    assert "propulsion.propellers" in text
    assert "propulsion.friction_correction" in text
    assert "propulsion.rotative_efficiency" in text


def test_resistance_estimate_needs_one_value_per_speed():
    problems = _problems(_with({"resistance_estimate": {
        "speeds": ["10 kn", "18 kn"], "total_resistance": ["100 kN"]}}))
    assert any("resistance_estimate" in p and "one value per speed" in p for p in problems)


def test_thrust_polynomial_without_torque_polynomial_is_refused():
    case = _with({"thrust_polynomial": [0.4, -0.3]})
    problems = _problems(copy.deepcopy(case))
    assert any("give both or neither" in p for p in problems)

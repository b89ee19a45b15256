"""``similitude extrapolate`` with the self-propulsion test: outputs, options, run ids, refusals.

Uses the SYNTHETIC demo data (demo_cases/measured, made by make_virtual_tank_data.py).
"""

from __future__ import annotations

import argparse
import dataclasses
import inspect
import json
import math
from pathlib import Path

import numpy as np
import pytest

from fluids_props.water import fresh_water_si
from similitude.cli import main
from similitude.commands import extrapolate as command

DEMO = Path(__file__).resolve().parents[2] / "demo_cases"
DATA = DEMO / "measured"
SP_CASE = DEMO / "ferry_self_propulsion.toml"
RES_CASE = DEMO / "ferry_resistance.toml"
PROPELLER = "diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.30; blades=4; thickness_ratio=0.04"
BASE = ["extrapolate", str(DATA / "ferry_resistance_runs_SYNTHETIC.csv"), "--case",
        str(SP_CASE), "--open-water", str(DATA / "ferry_open_water_SYNTHETIC.csv"),
        "--propeller", PROPELLER, "--self-propulsion",
        str(DATA / "ferry_self_propulsion_SYNTHETIC.csv")]


def test_every_api_option_has_a_command_line_option():
    # each field of the option and data classes, and each predict() argument, is set by a
    # command-line option (or the case file); each named option exists in the parser
    from similitude.prediction.extrapolation import ExtrapolationOptions, ShipParticulars
    from similitude.prediction.open_water import PropellerParticulars
    from similitude.prediction.predict import predict
    from similitude.prediction.self_propulsion import PropulsionOptions
    from similitude.prediction.uncertainty import MeasurementUncertainty
    from similitude.readers.measured import read_resistance_runs

    classes = {"ExtrapolationOptions": ExtrapolationOptions, "ShipParticulars": ShipParticulars,
               "PropellerParticulars": PropellerParticulars,
               "PropulsionOptions": PropulsionOptions,
               "MeasurementUncertainty": MeasurementUncertainty}
    for name, cls in classes.items():
        assert set(command.OPTION_FLAGS[name]) == {f.name for f in dataclasses.fields(cls)}, name
    for name, fn in (("predict", predict), ("read_resistance_runs", read_resistance_runs)):
        assert set(command.OPTION_FLAGS[name]) == set(inspect.signature(fn).parameters), name
    parser = argparse.ArgumentParser()
    command.add_parser(parser.add_subparsers())
    sub = parser._subparsers._group_actions[0].choices["extrapolate"]
    flags = {s for a in sub._actions for s in a.option_strings} | {"MEASURED.csv", "--case"}
    used = {flag for table in command.OPTION_FLAGS.values() for flag in table.values()}
    assert used <= flags, used - flags


def test_self_propulsion_prints_speed_power_rpm_and_the_contract_speed(capsys):
    assert main([*BASE, "--contract-speed", "16 kn"]) == 0
    out = capsys.readouterr().out
    assert "self-prop." in out and "thrust identity" in out
    assert "contract     16.00 kn" in out
    assert "P_D [kW]" in out and "n [rpm]" in out


def test_json_holds_the_propulsion_factors_and_the_full_scale_table(capsys):
    assert main([*BASE, "--json", "--identity", "torque", "--propellers", "1",
                 "--shaft-efficiency", "0.98", "--gearbox-efficiency", "0.97"]) == 0
    data = json.loads(capsys.readouterr().out)
    points = data["self_propulsion"]["points"]
    assert len(points) == 7 and "wake fraction w_QM [-]" in points[0]
    row = data["full_scale"]["table"][0]
    assert row["P_B [kW]"] == pytest.approx(row["trial P_DT [kW]"] / 0.98 / 0.97, rel=1e-12)
    # the contract speed defaults to the case's highest operating speed, 18 kn
    assert data["full_scale"]["contract_speed"]["ship speed [kn]"] == pytest.approx(18.0)


def test_monte_carlo_reports_both_methods(capsys):
    assert main([*BASE, "--json", "--thrust-uncertainty", "0.3 %", "--torque-uncertainty",
                 "0.3 %", "--speed-uncertainty", "1 mm/s", "--monte-carlo", "500",
                 "--seed", "5"]) == 0
    pu = json.loads(capsys.readouterr().out)["propulsion_uncertainty"]
    assert "500 samples (seed 5)" in pu["method"]
    assert all(r["u(P_DS) Monte Carlo [kW]"] > 0 for r in pu["table"])


def test_options_of_the_extrapolation_reach_it(capsys):
    assert main([*BASE, "--json", "--air-drag-coefficient", "0.6", "--air-density",
                 "1.2 kg/m^3", "--prohaska-exponent", "5", "--standard-temperature",
                 "16 degC"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["options"]["air_drag_coefficient"] == 0.6
    assert data["options"]["prohaska_exponent"] == 5.0
    assert data["options"]["standard_temperature"] == pytest.approx(289.15)
    assert data["ship"]["air_density"] == pytest.approx(1.2)


def test_self_propulsion_without_open_water_exits_two(capsys):
    code = main(["extrapolate", str(DATA / "ferry_resistance_runs_SYNTHETIC.csv"), "--case",
                 str(SP_CASE), "--self-propulsion",
                 str(DATA / "ferry_self_propulsion_SYNTHETIC.csv")])
    assert code == 2
    err = capsys.readouterr().err
    assert "--self-propulsion" in err and "--open-water" in err and "Traceback" not in err


def test_monte_carlo_without_uncertainties_exits_two(capsys):
    assert main([*BASE, "--monte-carlo", "1000"]) == 2
    assert "--monte-carlo" in capsys.readouterr().err


def _runs_file(tmp_path, ids, speeds):
    """Resistance runs of an invented hull (C_TM = 1.18 C_F57 + 0.05 Fn^4) at the ferry's
    1:21 scale, with the given run ids ('' for none, None for no run column)."""
    lm, sm = 78.0 / 21, 1450.0 / 441
    v = np.asarray(speeds, float)
    fn = v / math.sqrt(9.80665 * lm)
    s = fresh_water_si(np.full(v.size, 290.15))
    cf = 0.075 / (np.log10(v * lm / s.kinematic_viscosity_si) - 2) ** 2
    r = (1.18 * cf + 0.05 * fn**4) * 0.5 * s.density_si * sm * v**2
    head = ("" if ids is None else "run,") + "model speed [m/s],total resistance [N]," \
        "water temperature [degC]\n"
    rows = "".join(("" if ids is None else f"{i},") + f"{a},{b},17.0\n"
                   for i, a, b in zip(ids or [""] * v.size, v, r, strict=True))
    p = tmp_path / "runs.csv"
    p.write_text(head + rows)
    return p


LOW = [0.40, 0.48, 0.56, 0.64, 0.72]       # low-speed runs for Prohaska's fit (Fn 0.07-0.12)
PLANNED = [1.1226, 1.3471, 1.5717]          # 10, 12, 14 kn at 1:21


def test_facility_run_ids_are_refused_as_plan_ids_and_matched_by_speed(tmp_path, capsys):
    p = _runs_file(tmp_path, [f"R{100 + i}" for i in range(8)], LOW + PLANNED)
    assert main(["extrapolate", str(p), "--case", str(RES_CASE), "--form-factor", "0.18"]) == 2
    assert "not in the plan" in capsys.readouterr().err
    assert main(["extrapolate", str(p), "--case", str(RES_CASE), "--form-factor", "0.18",
                 "--run-ids", "facility", "--json"]) == 0
    notes = json.loads(capsys.readouterr().out)["plan_notes"]
    # the planned speeds match; the low-speed runs are beyond the plan, each named once
    assert len(notes) == 5 and all("facility id" in n for n in notes)
    assert "R100" in notes[0]


def test_free_run_ids_are_not_matched(tmp_path, capsys):
    p = _runs_file(tmp_path, [f"R{100 + i}" for i in range(8)], LOW + PLANNED)
    assert main(["extrapolate", str(p), "--case", str(RES_CASE), "--form-factor", "0.18",
                 "--run-ids", "free", "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["plan_notes"] == []


def test_rows_without_ids_are_never_compared_with_planned_runs(tmp_path, capsys):
    # a file without a run column: its rows numbered 1, 2 ... must not be read as the plan's
    # runs 1, 2 ... (they are low-speed runs far from the planned speeds)
    p = _runs_file(tmp_path, None, LOW + PLANNED)
    assert main(["extrapolate", str(p), "--case", str(RES_CASE), "--form-factor", "0.18",
                 "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["plan_notes"] == []


def test_one_command_writes_one_workbook_with_every_step(tmp_path, capsys):
    from openpyxl import load_workbook

    out = tmp_path / "power.xlsx"
    assert main([*BASE, "-o", str(out)]) == 0
    names = load_workbook(out).sheetnames
    for sheet in ("Read me", "Inputs", "Form factor", "Full scale", "Open water",
                  "Self-propulsion", "Propulsion factors", "Full-scale prediction",
                  "Speed-power-rpm", "Charts"):
        assert sheet in names
    assert f"wrote {out}" in capsys.readouterr().out

"""The self-propulsion sheets of the results workbook: every step present, the SYNTHETIC label,
the contract-speed figures on the Read me, and live audit formulas that LibreOffice recomputes
to Python's values (the formulas are written from ITTC 7.5-02-03-01.4 Rev 04 2017 by hand, in
spreadsheet syntax: K_T = T/(rho n^2 D^4), w = 1 - J n D/V, t = (N T + F - R_C)/(N T), the
full-scale wake, K_T/J^2, n_S and P_D).
"""

from __future__ import annotations

from pathlib import Path

import openpyxl
import pytest
from test_plan_workbook_recalc import _recalculate

from similitude.prediction.extrapolation import ShipParticulars
from similitude.prediction.open_water import PropellerParticulars
from similitude.prediction.predict import predict
from similitude.prediction.self_propulsion import PropulsionOptions
from similitude.prediction.uncertainty import MeasurementUncertainty
from similitude.readers.measured import (
    read_open_water_runs,
    read_resistance_runs,
    read_self_propulsion_runs,
)
from similitude.report.propulsion_sheets import SHEETS

DATA = Path(__file__).parents[2] / "demo_cases" / "measured"


@pytest.fixture(scope="module")
def written(tmp_path_factory):
    p = predict(read_resistance_runs(DATA / "ferry_resistance_runs_SYNTHETIC.csv"),
                ShipParticulars(78.0, 1450.0, 21.0, transverse_area=210.0),
                open_water_runs=read_open_water_runs(DATA / "ferry_open_water_SYNTHETIC.csv"),
                propeller=PropellerParticulars.from_text(
                    "diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.30; blades=4; "
                    "thickness_ratio=0.04", 21.0),
                self_propulsion_runs=read_self_propulsion_runs(
                    DATA / "ferry_self_propulsion_SYNTHETIC.csv"),
                propulsion=PropulsionOptions(contract_speed=16 * 1852 / 3600,
                                             shaft_efficiency=0.99),
                uncertainty=MeasurementUncertainty(thrust_relative=0.003, speed=0.001),
                monte_carlo=500)
    path = p.to_excel(tmp_path_factory.mktemp("w") / "power.xlsx")
    return p, path, openpyxl.load_workbook(path)


@pytest.fixture(scope="module")
def recalculated(written, tmp_path_factory):
    """The workbook as LibreOffice recalculates it (headless, a fresh profile)."""
    return _recalculate(written[1], tmp_path_factory.mktemp("lo"))


def _texts(ws) -> str:
    return " ".join(str(c.value) for row in ws.iter_rows() for c in row if c.value is not None)


def test_every_self_propulsion_sheet_is_written(written):
    _, _, wb = written
    for name in SHEETS:
        assert name in wb.sheetnames
    assert len(wb["Speed-power-rpm"]._charts) == 2
    assert len(wb["Propulsion factors"]._charts) == 1


def test_read_me_gives_the_contract_speed_figures_and_the_synthetic_label(written):
    p, _, wb = written
    text = _texts(wb["Read me"])
    assert "SYNTHETIC" in text and "ferry_self_propulsion_SYNTHETIC.csv" in text
    assert "contract speed [kn]" in text and "Monte Carlo" in text
    values = [c.value for row in wb["Read me"].iter_rows() for c in row]
    assert p.power.contract["P_D [kW]"] in values


def test_uncertainty_sheet_names_both_methods(written):
    _, _, wb = written
    text = _texts(wb["Propulsion uncertainty"])
    assert "First order" in text and "500 samples" in text
    assert "u(P_DS) from thrust [kW]" in text


def _column(ws, header):
    for row in ws.iter_rows(max_row=40):
        for c in row:
            if c.value == header:
                values = []
                for r in range(c.row + 1, ws.max_row + 1):
                    v = ws.cell(row=r, column=c.column).value
                    if not isinstance(v, (int, float)):
                        break
                    values.append(float(v))
                return values
    raise AssertionError(f"no column {header!r} in {ws.title}")


@pytest.mark.parametrize("sheet, formula, value", [
    ("Self-propulsion", "K_TM by formula [-]", "K_TM [-]"),
    ("Self-propulsion", "wake fraction w_TM by formula [-]", "wake fraction w_TM [-]"),
    ("Self-propulsion", "t by formula [-]", "thrust deduction t [-]"),
    ("Full-scale prediction", "w_TS by formula [-]", "full-scale wake w_TS [-]"),
    ("Full-scale prediction", "K_T/J^2 by formula [-]", "loading K_T/J^2 [-]"),
    ("Full-scale prediction", "n_S by formula [1/s]", "rate of revolution n_S [1/s]"),
    ("Full-scale prediction", "P_DS by formula [kW]", "P_DS [kW]"),
])
def test_audit_formulas_recalculate_to_the_python_values(written, recalculated, sheet,
                                                          formula, value):
    _, _, wb = written
    recalculated = recalculated[sheet]
    got, expected = _column(recalculated, formula), _column(wb[sheet], value)
    assert len(got) == len(expected) > 0
    assert got == pytest.approx(expected, rel=1e-9)

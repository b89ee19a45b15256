"""The campaign workbook (report.campaign_workbook): the summary a facility is chosen from,
the ranking, and each test's plan sheets, whose live test-day formulas still recompute.

The recalculation reference is fluids_props' fresh water (IAPWS R12-08 viscosity, IAPWS
SR7-09 density), as in test_plan_workbook_recalc.py whose LibreOffice helper is used.
"""

from pathlib import Path

import openpyxl
import pytest
from test_plan_workbook_recalc import REL, _recalculate

import fluids_props as fp
from similitude.planning.campaign_plan import plan_campaign
from similitude.readers.campaign_file import load_campaign
from similitude.report import campaign_workbook, plan_workbook

DEMO = Path(__file__).parents[2] / "demo_cases"


@pytest.fixture(scope="module")
def result():
    return plan_campaign(load_campaign(DEMO / "coastal_campaign.toml"))


@pytest.fixture(scope="module")
def written(result, tmp_path_factory):
    path = campaign_workbook.write_campaign(result, tmp_path_factory.mktemp("c") / "c.xlsx")
    return path, openpyxl.load_workbook(path)


def test_summary_sheet_opens_with_the_cautions(written, result):
    ws = written[1][campaign_workbook.SUMMARY_SHEET]
    assert ws["A2"].value == "cautions" and ws["A3"].value == result.caution


def test_each_test_label_links_to_its_overview_sheet(written):
    ws = written[1][campaign_workbook.SUMMARY_SHEET]
    links = {c.value: c.hyperlink.location or c.hyperlink.target
             for row in ws.iter_rows() for c in row if c.hyperlink is not None}
    assert links == {f"T{i}": f"'T{i} Overview'!A1" for i in range(1, 5)}


def test_summary_lists_the_models_to_build_with_their_mass(written):
    ws = written[1][campaign_workbook.SUMMARY_SHEET]
    values = [c.value for row in ws.iter_rows() for c in row]
    assert any(str(v).startswith("Models to build") for v in values)
    assert "model mass, design [kg]" in values


def test_chosen_candidate_of_each_test_is_green_in_the_ranking(written, result):
    ws = written[1][campaign_workbook.RANKING_SHEET]
    green = {ws.cell(row=c.row, column=2).value for row in ws.iter_rows() for c in row
             if c.column == 1 and c.fill is not None and c.fill.fgColor.rgb == "00C6EFCE"}
    chosen = set(result.candidates.query("chosen")["facility"])
    assert green == chosen


def test_test_day_sheet_of_a_campaign_test_recalculates(written, result, tmp_path):
    wb = _recalculate(written[0], tmp_path)
    plan = result.plans["resistance"]
    ws = wb["T1 " + plan_workbook.TEST_DAY_SHEET]
    t = ws[plan_workbook.TEMPERATURE_CELL].value
    assert t == pytest.approx(float(plan.model_fluid.temperature_si) - 273.15, abs=1e-6)
    state = fp.get_fluid("fresh_water").evaluate_si(t + 273.15)
    assert abs(ws[plan_workbook.DENSITY_CELL].value / float(state.density_si) - 1) <= REL
    assert abs(ws[plan_workbook.KINEMATIC_CELL].value /
               float(state.kinematic_viscosity_si) - 1) <= REL

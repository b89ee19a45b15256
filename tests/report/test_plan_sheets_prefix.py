"""Several plans in one workbook (report.plan_workbook.add_plan_sheets): each plan's sheets
carry their prefix, and the live test-day formulas point at their own plan's sheets."""

from pathlib import Path

import openpyxl
import pytest
from openpyxl import Workbook

import similitude as sim
from similitude.report import plan_workbook
from similitude.report.sheets import write_long_tables

DEMO = Path(__file__).parents[2] / "demo_cases"


@pytest.fixture(scope="module")
def two_plans():
    ferry = sim.plan(sim.load_case(DEMO / "ferry_resistance.toml"))
    wing = sim.plan(sim.load_case(DEMO / "wing_wind_tunnel.toml"))
    return ferry, wing


@pytest.fixture(scope="module")
def workbook(two_plans, tmp_path_factory):
    wb = Workbook()
    wb.active.title = "Summary"
    tables = plan_workbook.add_plan_sheets(wb, two_plans[0], "T1 ")
    tables += plan_workbook.add_plan_sheets(wb, two_plans[1], "T2 ")
    path = tmp_path_factory.mktemp("prefix") / "two.xlsx"
    wb.save(path)
    write_long_tables(path, wb, tables)
    return openpyxl.load_workbook(path)


def test_each_plans_sheets_follow_the_existing_ones_with_its_prefix(workbook):
    names = workbook.sheetnames
    assert names[0] == "Summary"
    for prefix in ("T1 ", "T2 "):
        for sheet in plan_workbook.SHEET_NAMES:
            assert prefix + sheet in names
    assert names.index("T1 Basis") < names.index("T2 Overview")


def test_each_plan_names_its_own_test_day_temperature_cell(workbook):
    for prefix in ("T1", "T2"):
        name = workbook.defined_names[f"{prefix}_TestDayTemperature"]
        assert name.attr_text == f"'{prefix} Test day'!$B$4"


def test_property_table_formulas_point_at_their_own_plans_table(workbook):
    # The wing is tested in air: its test-day density interpolates in its property table.
    formula = workbook["T2 Test day"][plan_workbook.DENSITY_CELL].value
    assert "'T2 Property table'!" in formula
    assert "'Property table'!" not in formula


def test_run_rows_are_written_into_each_plans_runs_sheet(workbook, two_plans):
    for prefix, plan in zip(("T1 ", "T2 "), two_plans, strict=True):
        ws = workbook[prefix + "Runs"]
        assert ws.max_row == len(plan.matrix) + 1

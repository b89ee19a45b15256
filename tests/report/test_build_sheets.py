"""The plan workbook's Run sheet and Model build sheet, read back with openpyxl."""

from __future__ import annotations

from pathlib import Path

import openpyxl
import pytest

import similitude as sim
from similitude.report import plan_workbook
from similitude.report.build_sheets import RUN_SHEET_HEADER_ROW

DEMO = Path(__file__).parents[2] / "demo_cases"


@pytest.fixture(scope="module")
def ferry(tmp_path_factory):
    plan = sim.plan(sim.load_case(DEMO / "ferry_resistance.toml"))
    path = plan_workbook.write_plan(plan, tmp_path_factory.mktemp("build") / "ferry.xlsx")
    return plan, openpyxl.load_workbook(path)


def _header(ws, row=RUN_SHEET_HEADER_ROW) -> list:
    return [c.value for c in ws[row] if c.value is not None]


def test_the_run_sheet_follows_the_overview(ferry):
    _, wb = ferry
    assert wb.sheetnames[:3] == ["Overview", "Run sheet", "Model build"]


def test_the_run_sheet_prints_one_page_wide_with_its_header_on_every_page(ferry):
    _, wb = ferry
    ws = wb["Run sheet"]
    assert ws.print_title_rows == f"${RUN_SHEET_HEADER_ROW}:${RUN_SHEET_HEADER_ROW}"
    assert ws.sheet_properties.pageSetUpPr.fitToPage and ws.page_setup.fitToWidth == 1


def test_the_run_sheet_has_a_row_per_run_and_one_per_loading_change(ferry):
    plan, wb = ferry
    ws = wb["Run sheet"]
    heads = _header(ws)
    assert heads[:2] == ["run", "loading"] and heads[-2:] == ["measured resistance [N]",
                                                             "remarks"]
    rows = list(ws.iter_rows(min_row=RUN_SHEET_HEADER_ROW + 1, max_col=2, values_only=True))
    runs = [r[0] for r in rows if isinstance(r[0], (int, float))]
    changes = [r[1] for r in rows if r[0] is None and r[1] and "change the loading" in r[1]]
    assert runs == plan.matrix["run"].tolist()
    assert len(changes) == plan.matrix["loading"].nunique() - 1


def test_loading_change_rows_span_the_table(ferry):
    _, wb = ferry
    ws = wb["Run sheet"]
    merged = [m for m in ws.merged_cells.ranges if m.min_row > RUN_SHEET_HEADER_ROW
              and ws.cell(row=m.min_row, column=2).value
              and "change the loading" in ws.cell(row=m.min_row, column=2).value]
    assert merged and all(m.min_col == 2 and m.max_col == len(_header(ws)) for m in merged)


def test_run_sheet_speeds_and_waits_have_one_format_per_column(ferry):
    _, wb = ferry
    ws = wb["Run sheet"]
    heads = [c.value for c in ws[RUN_SHEET_HEADER_ROW]]
    for name, fmt in (("prototype speed [kn]", "0.00"), ("wait after [min]", "0"),
                      ("model speed [m/s]", "0.000")):
        col = heads.index(name) + 1
        formats = {ws.cell(row=r, column=col).number_format
                   for r in range(RUN_SHEET_HEADER_ROW + 1, ws.max_row + 1)
                   if isinstance(ws.cell(row=r, column=col).value, (int, float))}
        assert formats == {fmt}, name


def test_model_build_sheet_gives_the_model_mass_of_each_loading_in_kg(ferry):
    # expected: V_p / lambda^3 x rho of the test water (the plan's model fluid state);
    # the design displacement 2650 m^3 of demo_cases/ferry_resistance.toml
    plan, wb = ferry
    ws = wb["Model build"]
    rho = float(plan.model_fluid.density_si)
    rows = list(ws.iter_rows(values_only=True))
    title = next(i for i, r in enumerate(rows) if r[0] == "Loading 'design': ballast the "
                 "model to these values")
    mass = next(r for r in rows[title:] if r[0] == "mass")
    assert mass[4] == "kg"
    assert mass[3] == pytest.approx(2650.0 / plan.scale**3 * rho, rel=1e-9)


def test_model_build_sheet_sizes_the_turbulence_studs(ferry):
    _, wb = ferry
    ws = wb["Model build"]
    texts = {r[0]: r[1] for r in ws.iter_rows(values_only=True) if r[0] in ("studs",
                                                                           "trip wire")}
    assert "3.2 mm diameter" in texts["studs"] and "Hughes & Allan (1951)" in texts["studs"]
    assert "common practice" in texts["trip wire"]

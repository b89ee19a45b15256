"""The test-plan workbook (.xlsx): what the facility executes and the client signs off.

Sheets (names of this project): Overview, Similarity, Facility checks, Runs, Scaling, Fluids,
Test day, Charts, Basis (and "Property table" for a model fluid without closed-form formulas).
The "Test day" sheet holds one input cell for the measured model-fluid temperature; density,
viscosity, the model Reynolds number of every run and its ITTC-1957 friction coefficient are
live formulas of it (:mod:`similitude.report.formulas`), so Excel or LibreOffice recompute them
on the test day. Fresh water uses the program's closed-form IAPWS correlations written out as
formulas; other fluids (air, sea water, nitrogen) interpolate linearly in a 0.05 K table of the
program's own values (error below 1e-7 relative).

The workbook is written with openpyxl; the long tables (the run matrix, the per-run test-day
table and the property table) are written as sheet XML into the saved package
(:func:`similitude.report.sheets.write_long_tables`). The whole file is written to a temporary
file and renamed onto the target (:mod:`similitude.report.atomic`).

openpyxl and pandas are imported at the top: only the writer loads this module, never
``import similitude``.
"""

from __future__ import annotations

import math
import pathlib
import re
from dataclasses import dataclass

import numpy as np
import pandas as pd
from openpyxl import Workbook
from openpyxl.styles import PatternFill
from openpyxl.utils import get_column_letter
from openpyxl.utils.cell import absolute_coordinate
from openpyxl.workbook.defined_name import DefinedName
from openpyxl.workbook.properties import CalcProperties

from fluids_props import FluidState, get_fluid
from similitude.cautions import plan_caution
from similitude.correlations.friction import friction_coefficient
from similitude.correlations.propeller_scaling import blade_drag_full_scale, blade_drag_model
from similitude.labels import human
from similitude.planning.case import body_class
from similitude.planning.findings import (
    STATUS_COLOURS,
    STATUS_MEANINGS,
    checks_summary,
    checks_table,
)
from similitude.planning.matrix import (
    SECTION_SPEED_COLUMN,
    facility_time_hours,
    reynolds_columns,
    runs_needed,
)
from similitude.planning.planner import Plan
from similitude.report import formulas
from similitude.report.atomic import OutputSet, check_target, signals_cleanup
from similitude.report.build_sheets import RUN_SHEET_HEADER_ROW, model_build_sheet, run_sheet_sheet
from similitude.report.page import PageSetup
from similitude.report.sheets import (
    BOLD,
    BOOLEAN_FORMAT,
    CENTER,
    INPUT_FILL,
    TITLE_FONT,
    TOP,
    WRAP,
    LongTable,
    add_series,
    cell_value,
    chart_below,
    fit_row_height,
    fit_widths,
    formula,
    header_row,
    label_row,
    long_table,
    merge_text,
    new_sheet,
    new_workbook,
    number_format,
    print_setup,
    save_workbook,
    scatter_chart,
    set_widths,
    table_range,
    value_format,
    widen,
    wrap_rows,
    write_frame,
)
from similitude.units import format_scale

SHEET_NAMES = ("Overview", "Run sheet", "Model build", "Similarity", "Facility checks", "Runs",
               "Scaling", "Fluids", "Test day", "Charts", "Basis")


#: Cells of the Test day sheet (fixed, so users and tests can find them).
TEST_DAY_SHEET = "Test day"
TEMPERATURE_CELL = "B4"
PRESSURE_CELL = "B6"
KELVIN_CELL = "B8"
DENSITY_CELL = "B9"
VISCOSITY_CELL = "B10"
KINEMATIC_CELL = "B11"
VAPOUR_PRESSURE_CELL = "B12"
SURFACE_TENSION_CELL = "B13"
LENGTH_CELL = "B14"
RANGE_CHECK_CELL = "B15"
TEST_DAY_HEADER_ROW = 18
#: Width [characters] of the Test day sheet's label column (the labels wrap in it).
TEST_DAY_LABEL_WIDTH = 30
#: Sheet with the tabulated properties of a model fluid without closed-form formulas.
PROPERTY_TABLE_SHEET = "Property table"
PROPERTY_TABLE_STEP = 0.05  # [K]
PROPERTY_TABLE_SPAN = 40.0  # [K] either side of the planned temperature
#: Per-run columns of the Test day sheet of a hull (ITTC-1957 friction line).
TEST_DAY_COLUMNS = ("run", "model speed [m/s]", "model Reynolds number [-]",
                    "ITTC-1957 C_F model [-]", "planned model Reynolds number [-]",
                    "planned ITTC-1957 C_F model [-]", "prototype Reynolds number [-]",
                    "ITTC-1957 C_F prototype [-]", "C_F model - C_F prototype [-]")
#: Per-run columns of a propeller: the blade-section Reynolds number at 0.7 R and the ITTC-78
#: blade-section drag, model (a live formula of Re) and full scale (blade roughness 30 um).
TEST_DAY_PROPELLER_COLUMNS = (
    "run", "model speed [m/s]", "model rotation rate [1/s]", SECTION_SPEED_COLUMN,
    "model Reynolds number Re_0.7R [-]", "ITTC-78 blade section drag C_D model [-]",
    "planned model Reynolds number Re_0.7R [-]", "planned ITTC-78 C_D model [-]",
    "prototype Reynolds number Re_0.7R [-]", "ITTC-78 blade section drag C_D full scale [-]",
    "C_D model - C_D full scale [-]")
#: Per-run columns of a wing, vehicle or bluff body: Reynolds numbers only (no friction line).
TEST_DAY_BODY_COLUMNS = ("run", "model speed [m/s]", "model Reynolds number [-]",
                         "planned model Reynolds number [-]", "prototype Reynolds number [-]",
                         "Re prototype / Re model [-]")
#: Cells of a propeller's Test day sheet: model blade chord at 0.7 R and its t/c.
CHORD_CELL = "B16"
THICKNESS_RATIO_CELL = "B17"

#: Labels (column A) and number formats of the property cells of the Test day sheet.
TEST_DAY_PROPERTY_CELLS = {
    KELVIN_CELL: ("temperature [K]", "0.00"),
    DENSITY_CELL: ("density [kg/m^3]", "0.0000"),
    VISCOSITY_CELL: ("dynamic viscosity [Pa s]", "0.00000E+00"),
    KINEMATIC_CELL: ("kinematic viscosity [m^2/s]", "0.00000E+00"),
    VAPOUR_PRESSURE_CELL: ("vapour pressure [Pa]", "0.0"),
    SURFACE_TENSION_CELL: ("surface tension [N/m]", "0.00000"),
    LENGTH_CELL: ("model length [m]", "0.000"),
}

#: Fill of the status cell of a facility check: the one colour per status of
#: :data:`similitude.planning.findings.STATUS_COLOURS` (the notebook view uses the same).
STATUS_FILLS = {status: PatternFill("solid", fgColor=colour)
                for status, colour in STATUS_COLOURS.items()}
#: Widths [characters] of the wrapped text columns of the Facility checks sheet: check, source
#: and advice (the sheet then prints one landscape page wide at a readable size).
CHECK_TEXT_WIDTHS = {"A": 22, "H": 24, "I": 38}
#: Header row repeated on every printed page, by sheet (the Overview has none).
PRINT_TITLE_ROWS = {"Run sheet": RUN_SHEET_HEADER_ROW, "Similarity": 1, "Facility checks": 1,
                    "Runs": 1, "Scaling": 1, "Fluids": 1, "Test day": TEST_DAY_HEADER_ROW,
                    "Charts": 1, "Basis": 1, PROPERTY_TABLE_SHEET: 1}


# -- the workbook ---------------------------------------------------------------------------
def build_workbook(plan: Plan, paper: str = "A4") -> tuple[Workbook, list[LongTable]]:
    """The openpyxl Workbook of a plan and its long tables (rows not yet written).

    ``paper`` is the paper size the sheets are set up to print on (``"A4"`` or ``"letter"``,
    :data:`similitude.report.sheets.PAPER_SIZES`).

    Returns
    -------
    tuple
        (workbook, list of pending long tables); :func:`write_plan` saves and completes it.
    """
    wb = new_workbook()
    tables = add_plan_sheets(wb, plan, paper=paper)
    # no cached values are stored: ask the application to calculate everything on load
    wb.calculation = CalcProperties(fullCalcOnLoad=True)
    return wb, tables


def add_plan_sheets(wb: Workbook, plan: Plan, prefix: str = "", paper: str = "A4"
                    ) -> list[LongTable]:
    """Build the sheets of a plan into ``wb``, after its existing sheets, each sheet name
    starting with ``prefix`` (a campaign workbook holds several plans: "T1 Overview", ...).

    The test-day temperature cell is named ``TestDayTemperature``, prefixed like the sheets
    (letters, digits and underscores of ``prefix``: "T1_TestDayTemperature"). ``paper`` is
    the paper size the sheets print on (``"A4"`` or ``"letter"``).

    Returns
    -------
    list of LongTable
        The long tables still to write (:func:`similitude.report.sheets.write_long_tables`,
        after the workbook is saved).
    """
    view = _PrefixedWorkbook(wb, prefix)
    first = len(wb.worksheets)
    _sheet_overview(view, plan)
    run_sheet_sheet(view.create_sheet(SHEET_NAMES[1]), plan)
    model_build_sheet(view.create_sheet(SHEET_NAMES[2]), plan)
    _sheet_similarity(view, plan)
    _sheet_checks(view, plan)
    tables = [_sheet_runs(view, plan)]
    _sheet_scaling(view, plan)
    _sheet_fluids(view, plan)
    tables += _sheet_test_day(view, plan)
    _sheet_charts(view, plan)
    _sheet_basis(view, plan)
    page = PageSetup(title=plan.case.name, paper=paper)
    for ws in wb.worksheets[first:]:
        print_setup(ws, page, PRINT_TITLE_ROWS.get(ws.title[len(prefix):]), "A:A")
    name = re.sub(r"\W", "_", prefix.strip()) + ("_" if prefix.strip() else "") + \
        "TestDayTemperature"
    ref = f"'{prefix}{TEST_DAY_SHEET}'!{absolute_coordinate(TEMPERATURE_CELL)}"
    wb.defined_names[name] = DefinedName(name, attr_text=ref)
    return tables


class _PrefixedWorkbook:
    """A workbook whose new sheets get a name prefix: the sheet builders only create sheets
    through ``create_sheet``, so one plan's builders can fill a workbook holding others."""

    def __init__(self, wb: Workbook, prefix: str) -> None:
        self.wb, self.prefix = wb, prefix

    def create_sheet(self, title: str):
        return new_sheet(self.wb, self.prefix + title)


def write_plan(plan: Plan, path, overwrite: bool = False, paper: str = "A4",
               outputs: OutputSet | None = None) -> pathlib.Path:
    """Write the test-plan workbook of ``plan`` to ``path`` (.xlsx), atomically.

    Parameters
    ----------
    plan : similitude.planning.planner.Plan
        The plan (case, solution, scale, fluids, groups, conflicts, checks, scale factors,
        run matrix, notes).
    path : str or path-like
        Target file; its directory must exist.
    overwrite : bool
        Replace an existing file. Without it an existing file is never touched.
    paper : str
        Paper size of the page setup: ``"A4"`` (default) or ``"letter"``.
    outputs : similitude.report.atomic.OutputSet, optional
        Write the workbook as one file of this set (published with the others, or not at
        all); ``overwrite`` is then the set's.

    Returns
    -------
    pathlib.Path
        The path written.

    Raises
    ------
    similitude.report.atomic.OutputExistsError
        (an InputError and FileExistsError) when the file exists and ``overwrite`` is False.
    """
    if outputs is not None:
        overwrite = outputs.overwrite
    target = check_target(path, overwrite)  # fail before the work
    wb, tables = build_workbook(plan, paper)
    if outputs is not None:
        return outputs.add(target, lambda tmp: save_workbook(wb, tmp, tables))
    with signals_cleanup(), OutputSet(overwrite) as out:
        out.add(target, lambda tmp: save_workbook(wb, tmp, tables))
    return target


# -- Overview -------------------------------------------------------------------------------
def _sheet_overview(wb, plan: Plan) -> None:
    ws = wb.create_sheet(SHEET_NAMES[0])
    ws.cell(row=1, column=1, value=f"Model-test plan: {plan.case.name}").font = TITLE_FONT
    set_widths(ws, {"A": 40, "B": 90})  # before the wrapped rows, whose heights follow them
    r = _overview_unmatched_rows(ws, plan, 2)
    r = _overview_case_rows(ws, plan, r + 1)
    r = _overview_design_rows(ws, plan, r)
    # long values wrap in their column instead of running on past the printed page
    wrap_rows(ws, [row for row in range(3, r) if isinstance(ws.cell(row=row, column=2).value,
                                                            str)], (1, 2))
    _overview_cautions(ws, plan_caution(plan.case.facility.kind), plan.notes, r + 1)
    ws.freeze_panes = "A2"


def _overview_unmatched_rows(ws, plan: Plan, r: int) -> int:
    """The "requested but not matched" lines at the top, filled in the colour of a failed
    check, one wrapped row each; returns the next row."""
    lines = plan.requested_not_matched_lines()
    for i, text in enumerate(lines):
        label = ws.cell(row=r + i, column=1, value="REQUESTED BUT NOT MATCHED")
        label.font = BOLD
        label.fill = STATUS_FILLS["fail"]
        ws.cell(row=r + i, column=2, value=text).fill = STATUS_FILLS["fail"]
    if lines:
        wrap_rows(ws, range(r, r + len(lines)), (2,))
    return r + len(lines)


def _overview_case_rows(ws, plan: Plan, r: int) -> int:
    """Metadata, prototype, facility, scale, fluids, runs; returns the next row."""
    case = plan.case
    for key, value in case.metadata.items():
        r = label_row(ws, r, str(key), str(value))
    proto, fac = case.prototype, case.facility
    r = label_row(ws, r, "prototype", f"{proto.name} ({human(proto.kind)})")
    r = label_row(ws, r, "prototype length [m]", proto.length, "0.000")
    r = label_row(ws, r, "facility", f"{fac.name} ({human(fac.kind)}, {fac.length:g} m x "
                  f"{fac.width:g} m x {fac.depth:g} m)")
    r = label_row(ws, r, "scale", format_scale(plan.scale))
    r = label_row(ws, r, "scale ratio lambda [-]", plan.scale, "0.000")
    r = label_row(ws, r, "model length [m]", plan.model_length, "0.000")
    for label, fs in (("prototype fluid", plan.prototype_fluid),
                      ("model fluid", plan.model_fluid)):
        t = float(np.asarray(fs.temperature_si)) - 273.15
        p = float(np.asarray(fs.pressure_si))
        r = label_row(ws, r, label, f"{human(fs.fluid)} at {t:.2f} degC, {p / 1e3:.4g} kPa")
    for label, pa in plan.model_pressures.items():
        r = label_row(ws, r, f"{label} [kPa]", pa / 1e3, "0.000")
    r = label_row(ws, r, "binding constraint", plan.binding_constraint)
    exact = plan.solution.exact or case.request.exact
    r = label_row(ws, r, "groups matched exactly", ", ".join(map(human, exact)))
    r = label_row(ws, r, "facility checks", checks_summary(plan.checks)
                  + " (see the Facility checks sheet)")
    r = label_row(ws, r, "test conditions (rows of the Runs sheet) [-]", len(plan.matrix), "0")
    r = label_row(ws, r, "runs needed [-]", runs_needed(plan.matrix), "0")
    return label_row(ws, r, "facility time [h]", facility_time_hours(plan.matrix), "0.0")


def _overview_design_rows(ws, plan: Plan, r: int) -> int:
    """Design (highest) speed and the model and prototype groups there; returns the next row."""
    if len(plan.speeds) == 0:
        return r
    d = plan.speeds.loc[plan.speeds["prototype speed [m/s]"].idxmax()]
    vp = float(d["prototype speed [m/s]"])
    case = plan.case
    r = label_row(ws, r, f"design speed, prototype [{case.speed_unit}]",
                  vp / case.speed_unit_factor, "0.00")
    r = label_row(ws, r, "design speed, model [m/s]", float(d["model speed [m/s]"]), "0.000")
    g = plan.groups
    first = r
    for _, row in g[np.isclose(g["prototype speed [m/s]"], vp)].iterrows():
        # the name without its definition (the Similarity sheet gives it), wrapped if long
        name = str(row["group"]).split(", ")[0]
        r = label_row(ws, r, f"{name} ({row['symbol']}), model / prototype [-]",
                      f"{row['model value']:.4g} / {row['prototype value']:.4g}"
                      + ("" if row["matched"] else "  (not matched)"))
    wrap_rows(ws, range(first, r), (1,))
    return r


def _overview_cautions(ws, caution: str, notes, r: int) -> None:
    """The caution and each planner note in a row of its own, as high as its wrapped text."""
    ws.cell(row=r, column=1, value="cautions").font = BOLD
    texts = [caution, *map(str, notes)]
    for i, text in enumerate(texts):
        ws.cell(row=r + i, column=2, value=text)
    wrap_rows(ws, range(r, r + len(texts)), (2,))


# -- Similarity -----------------------------------------------------------------------------
def _sheet_similarity(wb, plan: Plan) -> None:
    """Each group at each speed; under it each unmatched group, its values in the same
    columns and its consequence and figures in full-width rows (one layout, no gaps)."""
    ws = wb.create_sheet(SHEET_NAMES[3])
    g = _groups_frame(plan)
    _, last = write_frame(ws, g, 1, 1)
    _group_value_formats(ws, g, 1)
    if len(g):
        ws.auto_filter.ref = table_range(1, len(g.columns), last)
    ws.freeze_panes = "A2"
    set_widths(ws, {"A": 30})
    for r in range(2, last + 1):
        ws.cell(row=r, column=1).alignment = WRAP
    fit_widths(ws, rows=range(1, last + 1))
    set_widths(ws, {"A": min(ws.column_dimensions["A"].width, 30)})
    wrap_rows(ws, range(2, last + 1), (1,))
    fit_row_height(ws, 1)
    _similarity_conflicts(ws, plan, g, last + 2)


def _groups_frame(plan: Plan) -> pd.DataFrame:
    """The groups table as the sheet shows it: speeds in the user's unit, no internal key."""
    g = plan.groups.drop(columns=["key"])
    case = plan.case
    speed = g.pop("prototype speed [m/s]") / case.speed_unit_factor
    g.insert(2, case.speed_header, speed)
    return g


def _similarity_conflicts(ws, plan: Plan, groups, r: int) -> None:
    """The unmatched groups at the design speed: a row of values under the groups table's
    headers, then the consequence and the figures behind it over the table's width."""
    ncol = len(groups.columns)
    ws.cell(row=r, column=1, value="Unmatched groups at the design speed: what they cost"
            ).font = BOLD
    r += 1
    heads = list(groups.columns)
    design = plan.speeds["prototype speed [m/s]"].max() / plan.case.speed_unit_factor
    for c in plan.conflicts:
        row = plan.groups[(plan.groups["key"] == c.group)]
        name, symbol = (row["group"].iloc[0], row["symbol"].iloc[0]) if len(row) else (
            human(c.group), "")
        values = {"group": name, "symbol": symbol, heads[2]: design,
                  "prototype value": c.prototype_value, "model value": c.model_value,
                  "ratio": c.ratio, "matched": False}
        for j, h in enumerate(heads, 1):
            if h in values:
                cell = ws.cell(row=r, column=j, value=cell_value(values[h]))
                if isinstance(cell.value, bool):
                    cell.number_format, cell.alignment = BOOLEAN_FORMAT, CENTER
                elif isinstance(cell.value, float):
                    cell.number_format = (value_format(f"{c.group} number", cell.value)
                                          if h.endswith("value") else
                                          number_format(h, np.array([cell.value])))
        ws.cell(row=r, column=1).font = BOLD
        ws.cell(row=r, column=1).alignment = WRAP
        fit_row_height(ws, r)
        details = "; ".join(f"{k} = {_detail_text(v)}" for k, v in c.details.items())
        for label, text in (("consequence", c.consequence), ("figures", details)):
            if text:
                r += 1
                ws.cell(row=r, column=1, value=label).alignment = TOP
                ws.cell(row=r, column=2, value=text)
                merge_text(ws, r, 2, ncol)
        r += 2


def _detail_text(v) -> str:
    if isinstance(v, (float, np.floating)):
        return f"{float(v):.4g}"
    return str(v)


def _group_value_formats(ws, groups, header: int) -> None:
    """Format the value cells of each similarity group by its group and magnitude."""
    heads = list(groups.columns)
    cols = [heads.index(h) + 1 for h in ("prototype value", "model value")]
    for i, name in enumerate(groups["group"].tolist()):
        for col in cols:
            cell = ws.cell(row=header + 1 + i, column=col)
            if isinstance(cell.value, float):
                cell.number_format = value_format(str(name), cell.value)


# -- Facility checks, Runs, Scaling, Fluids -------------------------------------------------
def _sheet_checks(wb, plan: Plan) -> None:
    ws = wb.create_sheet(SHEET_NAMES[4])
    df = checks_table(plan.checks).rename(columns={"value": "model value", "kind": "limit kind"})
    df = df[["check", "model value", "limit", "unit", "limit kind", "margin [-]", "status",
             "source", "advice"]]
    _, last = write_frame(ws, df, 1, 1)
    for i, c in enumerate(plan.checks):
        if c.status in STATUS_FILLS:
            ws.cell(row=2 + i, column=7).fill = STATUS_FILLS[c.status]
        for col in (2, 3):
            cell = ws.cell(row=2 + i, column=col)
            if isinstance(cell.value, float):
                cell.number_format = value_format("", cell.value)
    ws.auto_filter.ref = f"A1:I{max(last, 1)}"
    ws.freeze_panes = "A2"
    fit_widths(ws, rows=range(1, last + 1))
    set_widths(ws, CHECK_TEXT_WIDTHS)
    wrap_rows(ws, range(2, last + 1), (1, 8, 9))
    fit_row_height(ws, 1)
    ws.cell(row=last + 2, column=1, value="margin = (limit - value)/|limit| for a maximum, "
            "(value - limit)/|limit| for a minimum; negative when violated")
    merge_text(ws, last + 2, 1, 9)
    _status_legend(ws, last + 4)


def _status_legend(ws, r: int) -> None:
    """Each status in its colour with what it means, from row ``r`` down (the meaning spread
    over the table's width)."""
    ws.cell(row=r, column=1, value="status").font = BOLD
    ws.cell(row=r, column=2, value="meaning").font = BOLD
    for i, (status, meaning) in enumerate(STATUS_MEANINGS.items(), start=1):
        c = ws.cell(row=r + i, column=1, value=status)
        c.fill, c.alignment = STATUS_FILLS[status], TOP
        ws.cell(row=r + i, column=2, value=meaning)
        merge_text(ws, r + i, 2, 9)


def _sheet_runs(wb, plan: Plan) -> LongTable:
    ws = wb.create_sheet(SHEET_NAMES[5])
    m = plan.matrix
    table = long_table(ws, m, 1)
    ws.freeze_panes = "B2"
    ws.auto_filter.ref = table_range(1, max(1, len(m.columns)), len(m) + 1)
    return table


def _sheet_scaling(wb, plan: Plan) -> None:
    ws = wb.create_sheet(SHEET_NAMES[6])
    sf = plan.scale_factors
    if len(sf) == 0:
        ws.cell(row=1, column=1, value="no scale factors")
        return
    first, last = write_frame(ws, sf, 1, 1)
    factor_col = next((j for j, c in enumerate(sf.columns, 1)
                       if "factor" in str(c).lower() and sf[c].dtype.kind == "f"), None)
    if factor_col is not None:
        _worked_example(ws, factor_col, len(sf.columns) + 1, first, last)
    ws.auto_filter.ref = table_range(1, len(sf.columns), last)
    ws.freeze_panes = "A2"
    fit_widths(ws, rows=range(1, last + 1))
    fit_row_height(ws, 1)
    if factor_col is not None:
        merge_text(ws, last + 2, 1, len(sf.columns) + 2)


def _worked_example(ws, factor_col: int, col: int, first: int, last: int) -> None:
    """Yellow input cells (a model value) and their full-scale value = factor x model value."""
    header_row(ws, 1, ["model value (enter)", "full-scale value (factor x model "
                       "value)"], col)
    factor, model = get_column_letter(factor_col), get_column_letter(col)
    for r in range(first, last + 1):
        ws.cell(row=r, column=col, value=1.0).fill = INPUT_FILL
        # the factor's own format: the full-scale value of a model value of 1 is the factor
        ws.cell(row=r, column=col + 1, value=formula(f"{factor}{r}*{model}{r}")
                ).number_format = ws.cell(row=r, column=factor_col).number_format
    ws.cell(row=last + 2, column=1, value="Enter a model measurement in the yellow cells "
            "(in the model unit of that row); the next column gives its full-scale value.")
    ws.cell(row=last + 2, column=1).alignment = WRAP


def _sheet_fluids(wb, plan: Plan) -> None:
    ws = wb.create_sheet(SHEET_NAMES[7])
    p, m = plan.prototype_fluid, plan.model_fluid
    header_row(ws, 1, ["property [unit]", f"prototype: {human(p.fluid)}",
                       f"model: {human(m.fluid)}"])
    dp, dm = p.as_dict(), m.as_dict()
    r = 2
    for k in dict.fromkeys([*dp, *dm]):
        ws.cell(row=r, column=1, value=k)
        for col, d in ((2, dp), (3, dm)):
            if d.get(k) is not None:
                v = float(np.asarray(d[k]))
                ws.cell(row=r, column=col, value=cell_value(v)).number_format = value_format(k, v)
        r += 1
    ws.cell(row=r, column=1, value="temperature [degC]")
    for col, fs in ((2, p), (3, m)):
        ws.cell(row=r, column=col, value=float(np.asarray(fs.temperature_si)) - 273.15
                ).number_format = "0.00"
    r += 2
    ws.cell(row=r, column=1, value="correlations used").font = BOLD
    r += 1
    for label, fs in (("prototype", p), ("model", m)):
        for s in fs.sources or ("(not stated by the fluid module)",):
            ws.cell(row=r, column=1, value=label)
            ws.cell(row=r, column=2, value=str(s))
            r += 1
    ws.freeze_panes = "A2"
    set_widths(ws, {"A": 32, "B": 30, "C": 30})


# -- Test day -------------------------------------------------------------------------------
@dataclass(frozen=True)
class _PropertyTable:
    """The tabulated model-fluid properties: where they are and what they cover."""

    ranges: dict  # "x" (temperature [K]), "density", "viscosity"[, "vapour", "surface"] -> range
    temperatures: tuple[float, float]  # [K] first and last of the grid
    rows: LongTable


def _sheet_test_day(wb, plan: Plan) -> list[LongTable]:
    """The live sheet: temperature input, property formulas, per-run Re and C_F formulas.

    Returns the long tables it leaves to write: the per-run table and, for a model fluid
    without closed-form formulas, the property table.
    """
    ws = wb.create_sheet(SHEET_NAMES[8])
    state = plan.model_fluid
    _test_day_inputs(ws, state, _TEST_DAY_WHAT[body_class(plan.case.prototype.kind)])
    valid, table = _test_day_properties(wb, ws, state)
    ws[LENGTH_CELL] = float(plan.model_length)
    if body_class(plan.case.prototype.kind) == "propeller":
        ws.cell(row=ws[CHORD_CELL].row, column=1, value="model blade chord at 0.7 R [m]")
        ws[CHORD_CELL] = _blade_chords(plan)[0]
        ws[CHORD_CELL].number_format = "0.0000"
        ws.cell(row=ws[THICKNESS_RATIO_CELL].row, column=1,
                value="blade thickness/chord t/c at 0.7 R [-]")
        ws[THICKNESS_RATIO_CELL] = BLADE_THICKNESS_RATIO
        ws.cell(row=ws[THICKNESS_RATIO_CELL].row, column=3,
                value="not given by the case: the ITTC-78 factor 2(1 + 2 t/c) is taken as 2")
    for ref, (_, fmt) in TEST_DAY_PROPERTY_CELLS.items():
        ws[ref].number_format = fmt
    if valid is not None:
        _test_day_range_check(ws, valid)
    ws.cell(row=TEST_DAY_HEADER_ROW - 1, column=1,
            value="Per run (the run numbers of the Runs sheet):").font = BOLD
    runs = _test_day_runs(ws, plan)
    return [runs] if table is None else [runs, table.rows]


#: What the per-run table of the Test day sheet recomputes, by body class.
_TEST_DAY_WHAT = {
    "hull": "the model Reynolds number of every run and its ITTC-1957 friction coefficient",
    "propeller": ("the blade-section Reynolds number Re_0.7R of every run and its ITTC-78 "
                  "blade-section drag coefficient"),
    "body": "the model Reynolds number of every run",
}


def _test_day_inputs(ws, state: FluidState, what: str) -> None:
    """Title, explanation, the temperature input cell, fluid, pressure and the cell labels."""
    fluid = state.fluid
    t_plan = float(np.asarray(state.temperature_si)) - 273.15
    ws.cell(row=1, column=1, value="Test day: enter the measured model-fluid temperature"
            ).font = TITLE_FONT
    ws.cell(row=2, column=1, value=(
        f"The yellow cell is the only input. Density, viscosity, {what} below are formulas "
        "of it"
        + (" (the program's closed-form correlation)." if formulas.supports(fluid) else
           f" ({fluid}: linear interpolation in the '{PROPERTY_TABLE_SHEET}' sheet, "
           "tabulated from the program's correlation every "
           f"{PROPERTY_TABLE_STEP:g} K; error below 1e-7).")))
    ws.cell(row=4, column=1, value="measured model-fluid temperature [degC]").font = BOLD
    c = ws[TEMPERATURE_CELL]
    c.value = round(t_plan, 6)
    c.fill = INPUT_FILL
    c.number_format = "0.00"
    ws.cell(row=4, column=3, value=f"planned: {t_plan:.2f} degC")
    ws.cell(row=5, column=1, value="model fluid")
    ws.cell(row=5, column=2, value=fluid)
    ws.cell(row=6, column=1, value="absolute pressure [Pa]")
    ws[PRESSURE_CELL] = float(np.asarray(state.pressure_si))
    ws[PRESSURE_CELL].number_format = "0"
    for ref, (label, _) in TEST_DAY_PROPERTY_CELLS.items():
        ws.cell(row=ws[ref].row, column=1, value=label)
    ws.cell(row=ws[RANGE_CHECK_CELL].row, column=1,
            value="temperature inside the correlation's validity range?")


def _test_day_properties(wb, ws, state: FluidState):
    """Fill the property cells: closed-form formulas (fresh water), interpolation in a property
    table (other fluids), or fixed values (a fluid that cannot be tabulated).

    Returns
    -------
    tuple
        (temperature range [K] the formulas are valid in, or None; the property table or None)
    """
    fluid = state.fluid
    ws[KELVIN_CELL] = formula(formulas.kelvin(TEMPERATURE_CELL))
    if formulas.supports(fluid):
        ws[DENSITY_CELL] = formula(formulas.density(fluid, KELVIN_CELL, PRESSURE_CELL))
        ws[VISCOSITY_CELL] = formula(formulas.dynamic_viscosity(fluid, KELVIN_CELL, DENSITY_CELL))
        ws[KINEMATIC_CELL] = formula(formulas.kinematic_viscosity(DENSITY_CELL, VISCOSITY_CELL))
        for ref, text in ((VAPOUR_PRESSURE_CELL, formulas.vapour_pressure(fluid, KELVIN_CELL)),
                          (SURFACE_TENSION_CELL, formulas.surface_tension(fluid, KELVIN_CELL))):
            ws[ref] = None if text is None else formula(text)
        return _temperature_range(fluid), None
    table = _property_table(wb, state)
    if table is None:
        ws[KELVIN_CELL] = float(np.asarray(state.temperature_si))
        ws[DENSITY_CELL] = float(np.asarray(state.density_si))
        ws[VISCOSITY_CELL] = float(np.asarray(state.dynamic_viscosity_si))
        ws[KINEMATIC_CELL] = float(np.asarray(state.kinematic_viscosity_si))
        for ref, v in ((VAPOUR_PRESSURE_CELL, state.vapour_pressure_si),
                       (SURFACE_TENSION_CELL, state.surface_tension_si)):
            ws[ref] = None if v is None else float(np.asarray(v))
        return None, None
    t_abs = absolute_coordinate(KELVIN_CELL)
    x = table.ranges["x"]
    for ref, key in ((DENSITY_CELL, "density"), (VISCOSITY_CELL, "viscosity"),
                     (VAPOUR_PRESSURE_CELL, "vapour"), (SURFACE_TENSION_CELL, "surface")):
        if key in table.ranges:
            ws[ref] = formula(formulas.interpolate(t_abs, x, table.ranges[key]))
    ws[KINEMATIC_CELL] = formula(formulas.kinematic_viscosity(DENSITY_CELL, VISCOSITY_CELL))
    ws.cell(row=6, column=3, value="fixed: the property table is at this pressure")
    return table.temperatures, table


def _test_day_range_check(ws, valid: tuple[float, float]) -> None:
    """A formula cell saying whether the measured temperature is inside ``valid`` [K]."""
    lo, hi = valid[0] - 273.15, valid[1] - 273.15
    ws[RANGE_CHECK_CELL] = formula(f'IF(AND({TEMPERATURE_CELL}>={lo!r},{TEMPERATURE_CELL}<='
                                   f'{hi!r}),"inside","OUTSIDE: results not valid")')
    ws.cell(row=ws[RANGE_CHECK_CELL].row, column=3, value=f"valid {lo:g} to {hi:g} degC")


def _test_day_runs(ws, plan: Plan) -> LongTable:
    """The per-run table: the model Reynolds number (and, where one applies, its friction or
    blade-drag coefficient) as formulas of the property cells, planned and prototype values
    beside them (:data:`TEST_DAY_COLUMNS`, :data:`TEST_DAY_PROPELLER_COLUMNS`,
    :data:`TEST_DAY_BODY_COLUMNS` by the body's class)."""
    matrix = plan.matrix
    kind = body_class(plan.case.prototype.kind)
    re_col, re_p_col = reynolds_columns(plan.case)
    vm = matrix["model speed [m/s]"].to_numpy(dtype=float)
    re_plan = matrix[re_col].to_numpy(dtype=float)
    re_p = matrix[re_p_col].to_numpy(dtype=float)
    kin = absolute_coordinate(KINEMATIC_CELL)
    run = matrix["run"].to_numpy()
    if kind == "propeller":
        tc = absolute_coordinate(THICKNESS_RATIO_CELL)
        chord = absolute_coordinate(CHORD_CELL)
        cd_plan = _cd_model(re_plan)
        cd_p = np.full(re_p.shape, _cd_full_scale(plan))
        values = (run, vm, matrix["model rotation rate [1/s]"].to_numpy(dtype=float),
                  matrix[SECTION_SPEED_COLUMN].to_numpy(dtype=float), re_plan, cd_plan,
                  re_plan, cd_plan, re_p, cd_p, cd_plan - cd_p)
        df = pd.DataFrame(dict(zip(TEST_DAY_PROPELLER_COLUMNS, values, strict=True)))
        table = long_table(ws, df, TEST_DAY_HEADER_ROW)
        # Re_0.7R = section speed x chord / nu; ITTC-78 C_DM = 2(1 + 2 t/c)(0.044 Re^-1/6 -
        # 5 Re^-2/3)
        table.set_formula(4, lambda r: f'IF(D{r}>0,D{r}*{chord}/{kin},"")')
        table.set_formula(5, lambda r: f'IF(E{r}>0,2*(1+2*{tc})*(0.044*E{r}^(-1/6)'
                          f'-5*E{r}^(-2/3)),"")')
        table.set_formula(10, lambda r: f'IF(E{r}>0,F{r}-J{r},"")')
    elif kind == "hull":
        cf_plan, cf_p = _cf(re_plan), _cf(re_p)
        values = (run, vm, re_plan, cf_plan, re_plan, cf_plan, re_p, cf_p, cf_plan - cf_p)
        df = pd.DataFrame(dict(zip(TEST_DAY_COLUMNS, values, strict=True)))
        table = long_table(ws, df, TEST_DAY_HEADER_ROW)
        length = absolute_coordinate(LENGTH_CELL)
        table.set_formula(2, lambda r: f'IF(B{r}>0,B{r}*{length}/{kin},"")')   # Re = V L / nu
        table.set_formula(3, lambda r: f'IF(B{r}>0,0.075/(LOG10(C{r})-2)^2,"")')  # ITTC-1957
        table.set_formula(8, lambda r: f'IF(B{r}>0,D{r}-H{r},"")')
    else:
        values = (run, vm, re_plan, re_plan, re_p, re_p / re_plan)
        df = pd.DataFrame(dict(zip(TEST_DAY_BODY_COLUMNS, values, strict=True)))
        table = long_table(ws, df, TEST_DAY_HEADER_ROW)
        length = absolute_coordinate(LENGTH_CELL)
        table.set_formula(2, lambda r: f'IF(B{r}>0,B{r}*{length}/{kin},"")')   # Re = V L / nu
        table.set_formula(5, lambda r: f'IF(C{r}>0,E{r}/C{r},"")')
    ws.freeze_panes = f"A{TEST_DAY_HEADER_ROW + 1}"
    ws.auto_filter.ref = table_range(TEST_DAY_HEADER_ROW, len(df.columns),
                                     TEST_DAY_HEADER_ROW + len(df))
    widen(ws, {"B": 16})
    set_widths(ws, {"A": TEST_DAY_LABEL_WIDTH})
    # the labels wrap in their narrower column
    wrap_rows(ws, [r for r in range(3, TEST_DAY_HEADER_ROW - 1)
                   if ws.cell(row=r, column=1).value is not None], (1,))
    merge_text(ws, 2, 1, len(df.columns))
    return table


def _blade_chords(plan: Plan) -> tuple[float, float]:
    """(model, full-scale) blade chord at 0.7 R [m] of a propeller: the one its groups use
    (``blade_chord``, else the diameter)."""
    proto = plan.case.prototype
    c_p = float(proto.dimension("blade_chord", proto.dimension("diameter", proto.length)))
    return c_p / plan.scale, c_p


#: Blade thickness over chord t/c used in the ITTC-78 section drag of the Test day sheet [-]
#: (the case gives no blade thickness; 0 leaves the factor 2(1 + 2 t/c) at 2).
BLADE_THICKNESS_RATIO = 0.0


def _cd_model(re_values):
    """ITTC-78 model blade-section drag C_DM [-] where Re > 100, NaN elsewhere."""
    out = np.full(np.shape(re_values), np.nan)
    ok = np.isfinite(re_values) & (re_values > 100)
    if ok.any():
        out[ok] = blade_drag_model(BLADE_THICKNESS_RATIO, re_values[ok])
    return out


def _cd_full_scale(plan: Plan) -> float:
    """ITTC-78 full-scale blade-section drag C_DS [-] (blade roughness 30 um)."""
    return float(blade_drag_full_scale(BLADE_THICKNESS_RATIO, _blade_chords(plan)[1]))


def _property_table(wb, state: FluidState) -> _PropertyTable | None:
    """Tabulate the model fluid's properties against temperature on their own sheet.

    Returns None when the fluid cannot be evaluated on a temperature grid.
    """
    grid = _property_grid(state)
    if grid is None:
        return None
    fs = _evaluate_on_grid(state, grid)
    if fs is None:
        return None
    cols = [("temperature [K]", grid, "x", "0.00"),
            ("density [kg/m^3]", fs.density_si, "density", "0.000000"),
            ("dynamic viscosity [Pa s]", fs.dynamic_viscosity_si, "viscosity", "0.000000E+00")]
    if fs.vapour_pressure_si is not None:
        cols.append(("vapour pressure [Pa]", fs.vapour_pressure_si, "vapour", "0.00"))
    if fs.surface_tension_si is not None:
        cols.append(("surface tension [N/m]", fs.surface_tension_si, "surface", "0.000000"))
    ws = wb.create_sheet(PROPERTY_TABLE_SHEET)
    frame = pd.DataFrame({h: np.broadcast_to(np.asarray(v, dtype=float), grid.shape)
                          for h, v, _, _ in cols})
    # 16 digits, as openpyxl writes numbers: the table as it was when written cell by cell
    rows = long_table(ws, frame, 1, formats={h: fmt for h, _, _, fmt in cols}, fit=False,
                      float_digits=16)
    ranges = {}
    for (_, _, key, _), (letter, *_) in zip(cols, rows.columns, strict=True):
        ranges[key] = f"'{ws.title}'!${letter}$2:${letter}${len(grid) + 1}"
        ws.column_dimensions[letter].width = 22
    p0 = float(np.asarray(state.pressure_si))
    ws.cell(row=1, column=len(cols) + 2, value=(
        f"{state.fluid} at {p0:g} Pa from fluids_props ({'; '.join(state.sources)}); "
        "the Test day sheet interpolates linearly in this table."))
    ws.freeze_panes = "A2"
    return _PropertyTable(ranges, (float(grid[0]), float(grid[-1])), rows)


def _property_grid(state: FluidState):
    """Temperatures [K] of the property table: +-PROPERTY_TABLE_SPAN around the planned one,
    inside the fluid's validity range, every PROPERTY_TABLE_STEP; None if too short."""
    try:
        info = get_fluid(state.fluid)
    except ValueError:
        return None
    t0 = float(np.asarray(state.temperature_si))
    lo, hi = t0 - PROPERTY_TABLE_SPAN, t0 + PROPERTY_TABLE_SPAN
    r = info.range_of("temperature")
    if r is not None:
        lo, hi = max(lo, r.low), min(hi, r.high)
    n = int(round((hi - lo) / PROPERTY_TABLE_STEP))
    if n < 2:
        return None
    return lo + PROPERTY_TABLE_STEP * np.arange(n + 1)


def _evaluate_on_grid(state: FluidState, grid) -> FluidState | None:
    """The fluid at the grid temperatures and its own pressure (and humidity or salinity)."""
    info = get_fluid(state.fluid)
    p0 = float(np.asarray(state.pressure_si))
    extra = {k: state.extra[k] for k in ("relative_humidity", "salinity") if k in state.extra}
    try:
        return info.evaluate_si(grid, p0, **extra)
    except (TypeError, ValueError):  # an evaluator without these keywords
        try:
            return info.evaluate_si(grid, p0)
        except ValueError:
            return None


def _cf(re_values):
    """ITTC-1957 C_F [-] where Re > 100, NaN elsewhere."""
    out = np.full(np.shape(re_values), np.nan)
    ok = np.isfinite(re_values) & (re_values > 100)
    if ok.any():
        out[ok] = friction_coefficient(re_values[ok], method="ittc1957")
    return out


def _temperature_range(fluid: str):
    try:
        r = get_fluid(fluid).range_of("temperature")
    except ValueError:
        return None
    return None if r is None else (r.low, r.high)


# -- Charts ---------------------------------------------------------------------------------
def _sheet_charts(wb, plan: Plan) -> None:
    """The speed table, the friction line under it (a hull: ITTC-1957; a propeller: the
    ITTC-78 blade-section drag; none for a wing or body), and the charts below both."""
    ws = wb.create_sheet(SHEET_NAMES[9])
    kind = body_class(plan.case.prototype.kind)
    n, re_m, re_p = _speed_table(ws, plan, kind)
    line_header = n + 4
    ng = _friction_line_table(ws, re_m, re_p, line_header, kind) if kind != "body" else 0
    ws.freeze_panes = "A2"
    fit_widths(ws, rows=range(1, line_header + ng + 1))
    fit_row_height(ws, 1)
    if ng:
        fit_row_height(ws, line_header)
    below = chart_below(ws, _reynolds_chart(ws, n, plan.case),
                        line_header + ng if ng else n + 2)
    if ng:
        chart_below(ws, _friction_chart(ws, n, ng, line_header, kind), below, gap=1)


#: Header of the model and full-scale coefficients of the Charts sheet, by body class.
_CHART_COEFFICIENTS = {
    "hull": ("ITTC-1957 C_F model [-]", "ITTC-1957 C_F prototype [-]"),
    "propeller": ("ITTC-78 blade section drag C_D model [-]",
                  "ITTC-78 blade section drag C_D full scale [-]"),
}


def _speed_table(ws, plan: Plan, kind: str):
    """One row per prototype speed in columns A-F (A-D for a body); returns (rows, model Re,
    prototype Re)."""
    matrix, case = plan.matrix, plan.case
    re_col, re_p_col = reynolds_columns(case)
    speed_col = case.speed_header if case.speed_header in matrix else "prototype speed [m/s]"
    by = matrix.groupby("prototype speed [m/s]", sort=True).first().reset_index()
    re_m = by[re_col].to_numpy(dtype=float)
    re_p = by[re_p_col].to_numpy(dtype=float)
    headers = [speed_col, "model speed [m/s]", re_col, re_p_col]
    cols = [by[speed_col].to_numpy(float), by["model speed [m/s]"].to_numpy(float), re_m, re_p]
    if kind == "hull":
        headers += list(_CHART_COEFFICIENTS[kind])
        cols += [_cf(re_m), _cf(re_p)]
    elif kind == "propeller":
        headers += list(_CHART_COEFFICIENTS[kind])
        cols += [_cd_model(re_m), np.full(re_p.shape, _cd_full_scale(plan))]
    header_row(ws, 1, headers)
    for j, (h, col) in enumerate(zip(headers, cols, strict=True), 1):
        fmt = number_format(h, col)
        for i, v in enumerate(col):
            ws.cell(row=2 + i, column=j, value=cell_value(v)).number_format = fmt
    return len(by), re_m, re_p


def _friction_line_table(ws, re_m, re_p, header: int, kind: str) -> int:
    """The ITTC-1957 line (a hull) or the ITTC-78 model blade-section drag (a propeller) over
    the Reynolds numbers of model and full scale, in columns A-B from row ``header``; returns
    its number of rows."""
    lo = math.floor(math.log10(max(np.nanmin(re_m[re_m > 0]) if (re_m > 0).any() else 1e5,
                                   1e4)))
    hi = math.ceil(math.log10(max(np.nanmax(re_p) if np.isfinite(re_p).any() else 1e9, 1e6)))
    grid = np.logspace(lo, hi, 8 * (hi - lo) + 1)
    if kind == "propeller":
        title, heads = ("ITTC-78 model blade-section drag",
                        ["Reynolds number Re_0.7R [-]", "ITTC-78 C_D model [-]"])
        line = _cd_model(grid)
    else:
        title, heads = "ITTC-1957 friction line", ["Reynolds number [-]", "ITTC-1957 C_F [-]"]
        line = friction_coefficient(grid)
    ws.cell(row=header - 1, column=1, value=title).font = BOLD
    header_row(ws, header, heads)
    for i, (rv, cv) in enumerate(zip(grid, line, strict=True)):
        ws.cell(row=header + 1 + i, column=1, value=float(rv)).number_format = "0.00E+00"
        ws.cell(row=header + 1 + i, column=2, value=cell_value(cv)).number_format = "0.00000"
    return len(grid)


def _reynolds_chart(ws, n: int, case):
    x_title = case.speed_header if case.speed_unit != "m/s" else "prototype speed [m/s]"
    ch = scatter_chart("Model and full-scale Reynolds numbers", x_title, "Reynolds number [-]")
    ch.y_axis.scaling.logBase = 10
    ch.y_axis.number_format = "0E+00"
    for col, name in ((3, "model"), (4, "prototype")):
        add_series(ch, ws, 1, col, 2, 1 + n, name, points=True)
    return ch


def _friction_chart(ws, n: int, ng: int, header: int, kind: str):
    if kind == "propeller":
        title = "ITTC-78 blade-section drag: model line, model and full-scale points"
        y_title, line_title, full = "C_D [-]", "ITTC-78 model C_D", "full scale"
    else:
        title = "ITTC-1957 friction line with model and ship points"
        y_title, line_title, full = "C_F [-]", "ITTC-1957 line", "ship"
    fc = scatter_chart(title, "Reynolds number [-]", y_title)
    fc.x_axis.scaling.logBase = 10
    fc.x_axis.number_format = "0E+00"
    add_series(fc, ws, 1, 2, header + 1, header + ng, line_title, colour="000000")
    for xcol, ycol, name, colour in ((3, 5, "model", "4472C4"), (4, 6, full, "C0504D")):
        add_series(fc, ws, xcol, ycol, 2, 1 + n, name, points=True, colour=colour)
    return fc


# -- Basis ----------------------------------------------------------------------------------
def _sheet_basis(wb, plan: Plan) -> None:
    ws = wb.create_sheet(SHEET_NAMES[10])
    header_row(ws, 1, ["topic", "text"])
    rows = _basis_rows(plan)
    set_widths(ws, {"A": 32, "B": 100})
    for i, (k, v) in enumerate(rows, start=2):
        ws.cell(row=i, column=1, value=k)
        ws.cell(row=i, column=2, value=v)
    wrap_rows(ws, range(2, len(rows) + 2), (1, 2))
    ws.auto_filter.ref = f"A1:B{len(rows) + 1}"
    ws.freeze_panes = "A2"


def _basis_rows(plan: Plan) -> list[tuple[str, str]]:
    """(topic, text): cautions, notes, assumptions, correlations, check sources, references."""
    rows = [("caution", plan_caution(plan.case.facility.kind))]
    rows += [("planner note", str(n)) for n in plan.notes]
    rows += [("run matrix assumption", str(n)) for n in plan.matrix.attrs.get("notes", ())]
    for label, fs in (("prototype fluid", plan.prototype_fluid),
                      ("model fluid", plan.model_fluid)):
        rows += [(f"{label} correlation", str(s)) for s in fs.sources]
    rows += [("binding constraint", str(plan.binding_constraint))]
    rows += [(f"check source: {c.name}", c.source) for c in plan.checks]
    return rows + [
        ("reference", "ITTC-1957 model-ship correlation line C_F = 0.075/(log10 Re - 2)^2: "
         "Proc. 8th ITTC, Madrid, 1957; ITTC Recommended Procedure 7.5-02-03-01.4 (2021)."),
        ("reference", "Resistance tests: ITTC Recommended Procedure 7.5-02-02-01 (2021)."),
        ("reference", "Seakeeping tests: ITTC Recommended Procedure 7.5-02-07-02.1 (2014); "
         "ITTC two-parameter spectrum: Proc. 15th ITTC, 1978; JONSWAP: Hasselmann et al., "
         "Dtsch. Hydrogr. Z. A8(12), 1973; DNV-RP-C205 (2010, 2021)."),
        ("reference", "Symbols and definitions of Fr, Re, We, Ma, sigma_v: ITTC Symbols and "
         "Terminology List, 2017."),
        ("test day", f"The temperature cell is '{TEST_DAY_SHEET}'!{TEMPERATURE_CELL} (named "
         "TestDayTemperature); the formulas reproduce the program's fluid correlation "
         "(closed form for fresh water; otherwise linear interpolation in the "
         f"'{PROPERTY_TABLE_SHEET}' sheet)."),
    ]

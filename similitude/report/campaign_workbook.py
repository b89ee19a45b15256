"""The campaign workbook (.xlsx): which facility to book for each test, the models to build, the
booking calendar, and each test's plan.

Sheets (names of this project): "Campaign" (cautions, the tests with links to their sheets,
models to build, booking calendar, hours per facility, why these facilities and scales),
"Facility ranking" (every candidate facility of every test, ranked by the objective, with its
window, binding limits, Reynolds number, key margins and hours; the chosen one green, those that
cannot take the test red), "Combinations" (the combinations of facilities of each group of
shared models, at their shared scale), then each test's plan sheets as a plan workbook has
them, prefixed by the test's label in booking order ("T1 Overview", "T1 Runs", ... "T2
Overview", ...), built by :func:`similitude.report.plan_workbook.add_plan_sheets`.

openpyxl and pandas are imported at the top: only the writer loads this module, never
``import similitude``.
"""

from __future__ import annotations

import pathlib

from openpyxl.styles import Alignment, Font
from openpyxl.utils import get_column_letter
from openpyxl.workbook.properties import CalcProperties
from openpyxl.worksheet.hyperlink import Hyperlink

from similitude.planning.campaign_plan import OBJECTIVE_WORDS, CampaignPlan
from similitude.report.atomic import OutputSet, check_target, signals_cleanup
from similitude.report.page import PageSetup
from similitude.report.plan_workbook import STATUS_FILLS, add_plan_sheets
from similitude.report.sheets import (
    BOLD,
    TITLE_FONT,
    WRAP,
    label_row,
    new_workbook,
    print_setup,
    save_workbook,
    set_widths,
    wrap_rows,
    wrapped_lines,
    write_frame,
)

SUMMARY_SHEET = "Campaign"
RANKING_SHEET = "Facility ranking"
COMBINATIONS_SHEET = "Combinations"
#: Columns of the ranking blocks, in order.
RANKING_COLUMNS = ("rank", "facility", "chosen", "largest model", "model length [m]",
                   "binding at the largest model", "smallest model",
                   "binding at the smallest model", "Re prototype / Re model [-]",
                   "facility hours [h]", "key margins", "why not")
#: Widths of the ranking sheet's columns (characters).
RANKING_WIDTHS = (6, 22, 7, 9, 8, 28, 9, 24, 9, 8, 30, 30)
#: Columns of the summary's table of tests.
TEST_COLUMNS = ("label", "test", "facility", "models", "scale", "runs [-]",
                "booked hours [h]", "first day", "last day", "first date", "last date")
#: Widths of the summary sheet's columns (characters), narrow enough to print one page wide
#: at a readable size; long texts span them all.
SUMMARY_WIDTHS = (24, 16, 28, 20, 8, 8, 9, 10, 10, 11, 11)
#: Columns of the summary's models table, in order (the masses per loading follow).
MODEL_COLUMNS = ("model", "represents", "tests", "role", "scale", "lambda [-]",
                 "model length [m]")
#: Widths of the combinations sheet's columns (characters).
COMBINATION_WIDTHS = (22, 6, 8, 46, 12, 42, 12, 40, 8, 10, 12, 12)
CENTER_TOP = Alignment(horizontal="center", vertical="top")
LINK_FONT = Font(color="0563C1", underline="single")


def build_workbook(result: CampaignPlan, paper: str = "A4"):
    """The openpyxl Workbook of a campaign and its long tables (rows not yet written);
    ``paper`` is the paper size its sheets are set up to print on ("A4" or "letter")."""
    wb = new_workbook()
    page = PageSetup(title=result.campaign.name, paper=paper)
    _summary_sheet(wb, result, page)
    _ranking_sheet(wb, result, page)
    _combinations_sheet(wb, result, page)
    tables = []
    for _, row in result.bookings.iterrows():
        tables += add_plan_sheets(wb, result.plans[row["test"]], f"{row['label']} ", paper)
    wb.calculation = CalcProperties(fullCalcOnLoad=True)
    return wb, tables


def write_campaign(result: CampaignPlan, path, overwrite: bool = False,
                   paper: str = "A4", outputs: OutputSet | None = None) -> pathlib.Path:
    """Write the campaign workbook of ``result`` to ``path`` (.xlsx), atomically.

    Parameters
    ----------
    result : CampaignPlan
    path : str or path-like
        Target file; its directory must exist.
    overwrite : bool
        Replace an existing file. Without it an existing file is never touched.
    paper : str
        Paper size the sheets are set up to print on ("A4" or "letter").
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
        When the file exists and ``overwrite`` is False.
    """
    if outputs is not None:
        overwrite = outputs.overwrite
    target = check_target(path, overwrite)  # fail before the work
    wb, tables = build_workbook(result, paper)
    if outputs is not None:
        return outputs.add(target, lambda tmp: save_workbook(wb, tmp, tables))
    with signals_cleanup(), OutputSet(overwrite) as out:
        out.add(target, lambda tmp: save_workbook(wb, tmp, tables))
    return target


# -- Campaign (summary) ---------------------------------------------------------------------
def _summary_sheet(wb, result: CampaignPlan, page: PageSetup) -> None:
    ws = wb.create_sheet(SUMMARY_SHEET)
    set_widths(ws, _lettered(SUMMARY_WIDTHS))
    c = result.campaign
    ws.cell(row=1, column=1, value=f"Model-test campaign: {c.name}").font = TITLE_FONT
    r = _long_text(ws, 2, "cautions", [result.caution])
    r += 1
    for key, value in c.metadata.items():
        r = label_row(ws, r, str(key), str(value))
    r = label_row(ws, r, "facilities chosen by", OBJECTIVE_WORDS[result.objective])
    total = float(result.facility_hours["booked hours [h]"].sum())
    days = int(result.bookings["last day"].max()) if len(result.bookings) else 0
    r = label_row(ws, r, "facility time booked",
                  f"{total:.1f} h in {len(result.facility_hours)} facilities, over {days} "
                  "working days")
    r = _table(ws, r + 1, "Tests in booking order (each test's plan follows on the sheets "
               "named by its label)", result.bookings[[k for k in TEST_COLUMNS
                                                       if k in result.bookings]])
    _links(ws, r, result)
    models = result.models
    r = _table(ws, r + 1, "Models to build (mass: ballasted in the water of the model's "
               "first test)", models[list(MODEL_COLUMNS) + [c for c in models
                                                           if c not in MODEL_COLUMNS]])
    r = _table(ws, r + 1, "Hours per facility (tests and changeovers)", result.facility_hours)
    r = _long_text(ws, r + 1, "why these facilities and scales", list(result.reasons))
    _long_text(ws, r + 1, "notes", list(result.notes))
    ws.freeze_panes = "A2"
    print_setup(ws, page)


def _table(ws, r: int, title: str, frame) -> int:
    """A titled table from row ``r``, long texts wrapped; returns the row after the blank
    row that follows it."""
    ws.cell(row=r, column=1, value=title).font = BOLD
    first, last = write_frame(ws, frame, r + 1, 1)
    _column_formats(ws, frame, first, last)
    wrap_rows(ws, range(r + 1, last + 1), range(1, len(frame.columns) + 1))
    for j, name in enumerate(frame.columns, 1):
        if str(name).endswith("day"):  # day numbers beside dates: centred, apart from them
            for row in range(first, last + 1):
                ws.cell(row=row, column=j).alignment = CENTER_TOP
    return last + 2


def _links(ws, after: int, result: CampaignPlan) -> None:
    """Link each test's label in the tests table to its Overview sheet."""
    n = len(result.bookings)
    for i in range(n):
        cell = ws.cell(row=after - 1 - n + i, column=1)
        cell.hyperlink = Hyperlink(ref=cell.coordinate, location=f"'{cell.value} Overview'!A1")
        cell.font = LINK_FONT


def _long_text(ws, r: int, label: str | None, texts: list[str],
               widths=SUMMARY_WIDTHS) -> int:
    """Texts in rows of their own (after a bold label, when given), merged across the columns
    of ``widths`` and as high as their wrapped lines; returns the next row."""
    if label is not None:
        ws.cell(row=r, column=1, value=label).font = BOLD
        r += 1
    width = sum(widths)
    last = len(widths)
    for i, text in enumerate(texts):
        row = r + i
        cell = ws.cell(row=row, column=1, value=text)
        cell.alignment = WRAP
        ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=last)
        ws.row_dimensions[row].height = 15.0 * wrapped_lines(text, width * 0.95)
    return r + len(texts)


def _lettered(widths) -> dict[str, float]:
    """Widths of the first columns, by letter."""
    return {get_column_letter(j): w for j, w in enumerate(widths, 1)}


def _column_formats(ws, frame, first: int, last: int) -> None:
    """Hours, working days and Reynolds-number ratios to one decimal."""
    for j, name in enumerate(frame.columns, 1):
        name = str(name)
        if name.endswith("[h]") or name.startswith(("working days", "Re prototype")):
            for r in range(first, last + 1):
                ws.cell(row=r, column=j).number_format = "0.0"


# -- Facility ranking, combinations ---------------------------------------------------------
def _ranking_sheet(wb, result: CampaignPlan, page: PageSetup) -> None:
    ws = wb.create_sheet(RANKING_SHEET)
    ws.cell(row=1, column=1, value="Candidate facilities of each test, ranked by "
            f"{OBJECTIVE_WORDS[result.objective]}").font = TITLE_FONT
    _long_text(ws, 2, None, ["Each candidate on its own: the scales it admits for the test "
                             "and what binds them, and its figures at the largest model it "
                             "admits. Green: chosen; red: cannot take the test. A shared model "
                             "is built to one scale for all its tests (sheet 'Campaign')."],
               RANKING_WIDTHS)
    r = 4
    rows: list[int] = []
    labels = result.labels
    for name, frame in result.rankings.items():
        kind = frame["kind"].iloc[0] if len(frame) else ""
        ws.cell(row=r, column=1, value=f"{labels[name]} {name} ({kind})").font = BOLD
        df = frame[list(RANKING_COLUMNS)]
        first, last = write_frame(ws, df, r + 1, 1)
        _column_formats(ws, df, first, last)
        rows += range(first - 1, last + 1)
        for i, (chosen, feasible) in enumerate(zip(frame["chosen"], frame["feasible"],
                                                   strict=True)):
            fill = STATUS_FILLS["ok"] if chosen else (None if feasible else STATUS_FILLS["fail"])
            if fill is not None:
                for j in range(1, len(RANKING_COLUMNS) + 1):
                    ws.cell(row=first + i, column=j).fill = fill
        r = last + 2
    set_widths(ws, _lettered(RANKING_WIDTHS))
    wrap_rows(ws, rows, range(1, len(RANKING_COLUMNS) + 1))
    ws.freeze_panes = "A4"
    print_setup(ws, page)


def _combinations_sheet(wb, result: CampaignPlan, page: PageSetup) -> None:
    ws = wb.create_sheet(COMBINATIONS_SHEET)
    ws.cell(row=1, column=1, value="Combinations of facilities for models built to one scale, "
            "at their shared scale (best first; the first is chosen)").font = TITLE_FONT
    df = result.combinations
    first, last = write_frame(ws, df, 3, 1)
    _column_formats(ws, df, first, last)
    for i, chosen in enumerate(df["chosen"].tolist()):
        if chosen:
            for j in range(1, len(df.columns) + 1):
                ws.cell(row=first + i, column=j).fill = STATUS_FILLS["ok"]
    set_widths(ws, _lettered(COMBINATION_WIDTHS))
    wrap_rows(ws, range(3, last + 1), range(1, len(df.columns) + 1))
    ws.freeze_panes = "A4"
    print_setup(ws, page, 3)


__all__ = ["COMBINATIONS_SHEET", "RANKING_SHEET", "SUMMARY_SHEET", "build_workbook",
           "write_campaign"]

"""The plan workbook's sheets for the test floor: the operator's run sheet and the model build.

``run_sheet_sheet`` writes :func:`similitude.planning.run_sheet.run_sheet` as a printable sheet:
the runs in the order run, a row before each loading change and wave calibration, blank columns
for the measured value and remarks, rows high enough to write in. ``model_build_sheet`` writes
:class:`similitude.planning.model_build.ModelBuild`: the model's dimensions, each loading's mass
in the test water with its draughts, centres, radii of gyration and natural periods, the
turbulence stimulators and the model propeller.

openpyxl and pandas are imported at the top: only the workbook writer loads this module.
"""

from __future__ import annotations

import math

import numpy as np
import pandas as pd
from openpyxl.styles import Border, Font, PatternFill, Side
from openpyxl.utils import get_column_letter

from similitude.labels import human
from similitude.planning.case import dimension_power
from similitude.planning.model_build import SCALED_QUANTITIES, scaling_law
from similitude.planning.run_sheet import run_sheet
from similitude.report.page import PageSetup
from similitude.report.sheets import (
    BOLD,
    CENTER,
    COLUMN_CHARACTER_PIXELS,
    DEFAULT_WIDTH,
    FONT_NAME,
    TITLE_FONT,
    TOP,
    fit_row_height,
    fit_widths,
    merge_text,
    printable_points,
    set_widths,
    value_format,
    write_frame,
)
from similitude.units import format_scale

#: Header row of the run sheet's table (repeated on every printed page).
RUN_SHEET_HEADER_ROW = 4
#: Height [pt] of a run row: room to write the measured value by hand.
WRITING_ROW_HEIGHT = 18.0
#: Grey of the rows that are not runs (loading changes, wave calibrations).
EVENT_FILL = PatternFill("solid", fgColor="EDEDED")
EVENT_FONT = Font(name=FONT_NAME, italic=True)
#: A hairline under each run: a ruled form to write on.
RULED = Border(bottom=Side(style="hair", color="808080"))
#: Widths [characters] of the columns written in by hand.
HAND_WIDTHS = {"remarks": 28.0}
HAND_MIN_WIDTH = 14.0


# -- run sheet --------------------------------------------------------------------------------
def run_sheet_sheet(ws, plan) -> int:
    """Write the operator's run sheet of ``plan`` into ``ws``; returns its header row."""
    rs = run_sheet(plan)
    case = plan.case
    mf = plan.model_fluid
    ws.cell(row=1, column=1, value=f"Run sheet: {case.name}").font = TITLE_FONT
    runs = len(rs.frame)
    t = float(np.asarray(mf.temperature_si)) - 273.15
    ws.cell(row=2, column=1, value=(
        f"Model {plan.model_length:.3f} m at {format_scale(plan.scale)} in {human(mf.fluid)} "
        f"at {t:.1f} degC planned; {runs} runs in this order, about {rs.total_hours:.1f} h "
        "with the waits, loading changes and wave calibrations. Write the measured value and "
        "remarks in the blank columns; the Runs sheet has every planned value of each run."))
    frame = _with_events(rs.frame, rs.events)
    hr = RUN_SHEET_HEADER_ROW
    _, last = write_frame(ws, frame, hr)
    ncol = len(frame.columns)
    hand = [j for j, c in enumerate(frame.columns, 1) if (frame[c].astype(str) == "").all()
            or c == "remarks"]
    runs_rows = [hr] + [hr + 1 + i for i, e in enumerate(frame["run"].isna()) if not e]
    fit_widths(ws, rows=runs_rows)
    for j in hand:
        letter = get_column_letter(j)
        name = frame.columns[j - 1]
        set_widths(ws, {letter: max(HAND_WIDTHS.get(name, HAND_MIN_WIDTH),
                                    ws.column_dimensions[letter].width or 0)})
    # the remarks column takes what is left of a landscape page, at least HAND_MIN_WIDTH
    remarks = get_column_letter(ncol)
    used = sum(ws.column_dimensions[get_column_letter(j)].width or DEFAULT_WIDTH
               for j in range(1, ncol))
    page = printable_points(PageSetup().paper, "landscape") / 0.75 / COLUMN_CHARACTER_PIXELS
    set_widths(ws, {remarks: max(HAND_MIN_WIDTH, min(HAND_WIDTHS["remarks"],
                                                     page - used - ncol))})
    fit_row_height(ws, hr)
    for i, is_event in enumerate(frame["run"].isna()):
        r = hr + 1 + i
        if is_event:
            _event_row(ws, r, ncol, str(frame.iloc[i, 1]))
        else:
            ws.row_dimensions[r].height = WRITING_ROW_HEIGHT
            ws.cell(row=r, column=1).alignment = CENTER
            for j in range(1, ncol + 1):
                ws.cell(row=r, column=j).border = RULED
    _caption(ws, 2, ncol)
    r = last + 2
    for note in rs.notes:
        ws.cell(row=r, column=1, value=note)
        _caption(ws, r, ncol)
        r += 1
    ws.freeze_panes = ws.cell(row=hr + 1, column=2)
    return hr


def _with_events(frame, events) -> pd.DataFrame:
    """The runs with a row before each event: no run number, the event's text in column 2."""
    if not events:
        return frame
    second = frame.columns[1]
    parts, start = [], 0
    for pos, text in events:
        parts.append(frame.iloc[start:pos])
        row = {c: (text if c == second else (np.nan if c == "run" else None))
               for c in frame.columns}
        parts.append(pd.DataFrame([row]))
        start = pos
    parts.append(frame.iloc[start:])
    out = pd.concat([p.astype(object) for p in parts if len(p)], ignore_index=True)
    for c in frame.columns:  # numbers stay numbers (the formats follow the column)
        if frame[c].dtype.kind in "fiu":
            out[c] = pd.to_numeric(out[c])
    return out


def _event_row(ws, r: int, ncol: int, text: str) -> None:
    """A grey row: the event's text over the whole width of the table."""
    ws.cell(row=r, column=2, value=text)
    for j in range(1, ncol + 1):
        c = ws.cell(row=r, column=j)
        c.fill = EVENT_FILL
        c.font = EVENT_FONT
    merge_text(ws, r, 2, ncol)


def _caption(ws, r: int, ncol: int) -> None:
    """A text in column A spread over the table's width, wrapped."""
    merge_text(ws, r, 1, max(ncol, 1))


# -- model build ----------------------------------------------------------------------------
#: Columns of every table of the Model build sheet (one layout, so the tables share widths).
BUILD_COLUMNS = ["quantity", "prototype", "unit", "model", "model unit", "scaled by"]


def model_build_sheet(ws, plan) -> None:
    """Write what the model shop builds: dimensions, loadings, stimulators, propeller."""
    b = plan.model_build
    case = plan.case
    ws.cell(row=1, column=1, value=f"Model build: {case.name}").font = TITLE_FONT
    t = float(np.asarray(plan.model_fluid.temperature_si)) - 273.15
    water = (f" Masses are in the test water, {human(b.model_water)} at {t:.1f} degC "
             f"({b.model_density:.1f} kg/m^3; prototype water {b.prototype_density:.1f} "
             "kg/m^3)." if b.loadings else "")
    ws.cell(row=2, column=1, value=(
        f"Scale {format_scale(b.scale)}: lengths 1/lambda, areas 1/lambda^2, volumes "
        f"1/lambda^3, periods 1/sqrt(lambda) (Froude).{water}"))
    tables = [("Model dimensions", _dimensions_frame(plan))]
    tables += [(f"Loading '{ld.name}': ballast the model to these values", _loading_frame(ld))
               for ld in b.loadings]
    if b.propeller_diameter is not None:
        tables.append(("Model propeller", pd.DataFrame(
            [("diameter", b.propeller_diameter * b.scale, "m", b.propeller_diameter, "m",
              "1/lambda")], columns=BUILD_COLUMNS)))
    r, rows, headers = 4, [], []
    for title, frame in tables:
        headers.append(r + 1)
        rows += range(r + 1, r + 2 + len(frame))
        r = _table(ws, r, title, frame)
    fit_widths(ws, rows=rows)
    for h in headers:
        fit_row_height(ws, h)
    ncol = len(BUILD_COLUMNS)
    _caption(ws, 2, ncol)
    if b.stimulators:
        ws.cell(row=r, column=1, value="Turbulence stimulation (one device; studs "
                "preferred)").font = BOLD
        r += 1
        for s in b.stimulators:
            label = ws.cell(row=r, column=1, value=s.device)
            label.font, label.alignment = BOLD, TOP
            ws.cell(row=r, column=2, value=(
                f"{s.size}; {s.position * 1e3:.0f} mm aft of the forward perpendicular "
                f"(source: {s.source})"))
            merge_text(ws, r, 2, ncol)
            r += 1
        r += 1
    for note in b.notes:
        ws.cell(row=r, column=1, value=note)
        _caption(ws, r, ncol)
        r += 1


def _table(ws, r: int, title: str, frame) -> int:
    """A bold title and a table under it, each number formatted by its own magnitude (a
    column holds several quantities); returns the row after it and a blank row."""
    ws.cell(row=r, column=1, value=title).font = BOLD
    _, last = write_frame(ws, frame, r + 1)
    for j, name in enumerate(frame.columns, 1):
        if name in ("prototype", "model"):
            for i in range(len(frame)):
                c = ws.cell(row=r + 2 + i, column=j)
                if isinstance(c.value, float):
                    c.number_format = value_format("", c.value)
    return last + 2


def _dimensions_frame(plan) -> pd.DataFrame:
    """Every prototype size and its model value, with its unit."""
    proto = plan.case.prototype
    rows = [("length", proto.length, "m", plan.model_length, "m", "1/lambda")]
    units = {1: "m", 2: "m^2", 3: "m^3"}
    for key, value in proto.dimensions.items():
        power = dimension_power(key)
        unit = units.get(power, "")
        rows.append((human(key), value, unit, value / plan.scale ** power, unit,
                     scaling_law(float(power))))
    return pd.DataFrame(rows, columns=BUILD_COLUMNS)


def _loading_frame(ld) -> pd.DataFrame:
    """One loading's values at both scales; the mass in t (prototype) and kg (model)."""
    rows = []
    for key, (power, unit, label) in SCALED_QUANTITIES.items():
        if key in ld.prototype:
            rows.append((label, ld.prototype[key], unit, ld.model[key], unit,
                         scaling_law(power)))
    if ld.model_mass is not None:
        rows.append(("mass", ld.prototype_mass / 1e3, "t", ld.model_mass, "kg",
                     "(rho_m/rho_p)/lambda^3"))
    for axis, value in ld.model_inertia.items():
        rows.append((f"moment of inertia, {axis}", math.nan, "", value, "kg m^2",
                     "model mass x k^2"))
    return pd.DataFrame(rows, columns=BUILD_COLUMNS)


__all__ = ["RUN_SHEET_HEADER_ROW", "model_build_sheet", "run_sheet_sheet"]

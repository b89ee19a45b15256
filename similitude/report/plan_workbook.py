"""The test-plan workbook (.xlsx): what the facility executes and the client signs off.

Sheets (names of this project): Overview, Similarity, Facility checks, Runs, Scaling, Fluids,
Test day, Charts, Basis (and "Property table" for a model fluid without closed-form formulas).
The "Test day" sheet holds one input cell for the measured model-fluid temperature; density,
viscosity, the model Reynolds number of every run and its ITTC-1957 friction coefficient are
live formulas of it (:mod:`similitude.report.formulas`), so Excel or LibreOffice recompute them
on the test day. Fresh water uses the program's closed-form IAPWS correlations written out as
formulas; other fluids (air, sea water, nitrogen) interpolate linearly in a 0.05 K table of the
program's own values (error below 1e-7 relative).

The workbook is written with openpyxl. The two long tables (the run matrix and the per-run
test-day table) have their rows written as sheet XML directly into the saved package, with the
cell styles openpyxl registered for them: openpyxl's own cell writer would take several seconds
for a 10^4-run matrix. The whole file is written to a temporary file and renamed onto the target
(:mod:`similitude.report.atomic`).
"""

from __future__ import annotations

import math
import pathlib
import re
import textwrap
import zipfile
from dataclasses import dataclass, field
from xml.sax.saxutils import escape

import numpy as np

from similitude.constants import KNOT
from similitude.planning.findings import checks_table
from similitude.report import formulas
from similitude.report.atomic import write_atomic
from similitude.units import format_scale

SHEET_NAMES = ("Overview", "Similarity", "Facility checks", "Runs", "Scaling", "Fluids",
               "Test day", "Charts", "Basis")

CAUTION = ("All figures are estimates for planning, valid only inside the stated validity "
           "ranges of the correlations used; defer to the ITTC Recommended Procedures, class "
           "rules, local codes and licensed practice.")

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
#: Sheet with the tabulated properties of a model fluid without closed-form formulas.
PROPERTY_TABLE_SHEET = "Property table"
PROPERTY_TABLE_STEP = 0.05  # [K]
PROPERTY_TABLE_SPAN = 40.0  # [K] either side of the planned temperature
TEST_DAY_COLUMNS = ("run", "model speed [m/s]", "model Reynolds number [-]",
                    "ITTC-1957 C_F model [-]", "planned model Reynolds number [-]",
                    "planned ITTC-1957 C_F model [-]", "prototype Reynolds number [-]",
                    "ITTC-1957 C_F prototype [-]", "C_F model - C_F prototype [-]")

_HEADER_FILL = "DDEBF7"
_INPUT_FILL = "FFF2CC"
_STATUS_FILL = {"ok": "C6EFCE", "warning": "FFEB9C", "fail": "FFC7CE", "info": "DDEBF7"}
_MAX_WIDTH = 48
#: Display format of boolean cells: "yes"/"no" where the application applies number formats
#: to booleans (LibreOffice), TRUE/FALSE otherwise (Excel); the cell value stays a boolean.
BOOLEAN_FORMAT = '"yes";"yes";"no"'
#: Height [pt] of one line of wrapped text in the default 11 pt font.
LINE_HEIGHT = 15.0
#: Header row repeated on every printed page, by sheet (the Overview has none).
PRINT_TITLE_ROWS = {"Similarity": 1, "Facility checks": 1, "Runs": 1, "Scaling": 1,
                    "Fluids": 1, "Test day": TEST_DAY_HEADER_ROW, "Charts": 1, "Basis": 1,
                    PROPERTY_TABLE_SHEET: 1}


# -- number formats -----------------------------------------------------------------------
def number_format(header: str, values=None) -> str:
    """Excel number format fitted to a column: by its quantity, then by its magnitude.

    Reynolds and Weber numbers and other wide-ranging values get scientific format, counts
    integers, knots two decimals, angles one, otherwise about four significant digits.
    """
    h = header.lower()
    if "reynolds" in h or "weber" in h or "c_f" in h or "[pa s]" in h or "[m^2/s]" in h:
        return "0.0000E+00"
    if h in ("run", "repeat", "speed index") or "runs needed" in h:
        return "0"
    if "[deg]" in h:
        return "0.0"
    if "[kn]" in h:
        return "0.00"
    if "margin" in h:
        return "0.0%"
    if values is None:
        return "General"
    arr = np.asarray(values)
    if arr.dtype.kind in "iu":
        return "0"
    if arr.dtype.kind != "f":
        return "General"
    a = np.abs(arr[np.isfinite(arr) & (arr != 0)])
    if a.size == 0:
        return "0.000"
    m = float(np.median(a))
    if m >= 1e6 or m < 1e-3:
        return "0.0000E+00"
    decimals = int(min(6, max(0, 3 - math.floor(math.log10(m)))))
    return "0" if decimals == 0 else "0." + "0" * decimals


def _spread(values) -> float:
    """Ratio of the largest to the smallest nonzero finite magnitude of a float column."""
    arr = np.asarray(values)
    if arr.dtype.kind != "f":
        return 1.0
    a = np.abs(arr[np.isfinite(arr) & (arr != 0)])
    return float(a.max() / a.min()) if a.size else 1.0


# -- row heights and printing ----------------------------------------------------------------
def wrapped_lines(text, width: float) -> int:
    """Lines a text takes when wrapped in a column ``width`` characters wide (an estimate).

    One character per unit of column width, words kept whole: a slight overestimate for
    proportional fonts, so the row is never too low.
    """
    per_line = max(1, int(width) - 1)
    return sum(max(1, len(textwrap.wrap(part, per_line, break_long_words=True)))
               for part in str(text).split("\n"))


def _fit_row_height(ws, row: int) -> None:
    """Set the height of ``row`` to hold its wrapped cells (only ever raised, never lowered)."""
    from openpyxl.utils import get_column_letter

    lines = 0
    for c in ws[row]:
        if c.value is None or not (c.alignment and c.alignment.wrap_text):
            continue
        width = ws.column_dimensions[get_column_letter(c.column)].width or 8.43
        lines = max(lines, wrapped_lines(c.value, width))
    if lines:
        height = ws.row_dimensions[row].height or 0
        ws.row_dimensions[row].height = max(height, lines * LINE_HEIGHT)


def _wrap_rows(ws, rows, columns, st) -> None:
    """Wrap the text of ``columns`` in ``rows`` and fit the row heights to it.

    The other cells of these rows are aligned to the top, level with the first text line.
    """
    from openpyxl.styles import Alignment

    top = Alignment(vertical="top")
    for r in rows:
        for c in ws[r]:
            if c.value is not None:
                c.alignment = st["wrap"] if c.column in columns else top
        _fit_row_height(ws, r)


def _print_setup(ws) -> None:
    """Landscape, one page wide (as many pages long as needed), header row on every page."""
    ws.page_setup.orientation = "landscape"
    ws.sheet_properties.pageSetUpPr.fitToPage = True
    ws.page_setup.fitToWidth = 1
    ws.page_setup.fitToHeight = 0
    title = PRINT_TITLE_ROWS.get(ws.title)
    if title is not None:
        ws.print_title_rows = f"{title}:{title}"


# -- long tables written as raw sheet XML --------------------------------------------------
@dataclass
class _LongTable:
    """Rows to inject into a sheet after openpyxl has saved the package."""

    sheet: object
    first_row: int
    columns: list = field(default_factory=list)  # (letter, kind, style_id, data)
    nrows: int = 0


def _cell_xml(letter: str, kind: str, style: int, data, rows: range) -> list[str]:
    s = f' s="{style}"' if style else ""
    if kind == "num":
        vals = np.asarray(data, dtype=float).tolist()
        return [f'<c r="{letter}{r}"{s}><v>{v!r}</v></c>' if math.isfinite(v) else ""
                for r, v in zip(rows, vals, strict=True)]
    if kind == "int":
        vals = np.asarray(data).astype(np.int64).tolist()
        return [f'<c r="{letter}{r}"{s}><v>{v}</v></c>' for r, v in zip(rows, vals, strict=True)]
    if kind == "bool":
        return [f'<c r="{letter}{r}"{s} t="b"><v>{int(bool(v))}</v></c>'
                for r, v in zip(rows, data, strict=True)]
    if kind == "formula":  # data: callable row -> formula text without '='
        return [f'<c r="{letter}{r}"{s}><f>{escape(data(r))}</f></c>' for r in rows]
    # strings, inline (valid SpreadsheetML; no shared-string table needed)
    out = []
    for r, v in zip(rows, data, strict=True):
        if v is None or (isinstance(v, float) and not math.isfinite(v)) or v == "":
            out.append("")
        else:
            out.append(f'<c r="{letter}{r}"{s} t="inlineStr"><is><t>{escape(str(v))}</t></is>'
                       "</c>")
    return out


def _rows_xml(table: _LongTable) -> str:
    rows = range(table.first_row, table.first_row + table.nrows)
    cols = [_cell_xml(letter, kind, style, data, rows)
            for letter, kind, style, data in table.columns]
    return "".join(f'<row r="{r}">' + "".join(cells) + "</row>"
                   for r, cells in zip(rows, zip(*cols, strict=True), strict=True))


def _inject(path: pathlib.Path, wb, tables: list[_LongTable]) -> None:
    """Replace the template rows of the long tables with all their rows, in the saved file."""
    from openpyxl.utils import get_column_letter

    by_part = {}
    for t in tables:
        idx = wb.worksheets.index(t.sheet) + 1
        by_part[f"xl/worksheets/sheet{idx}.xml"] = t
    tmp = path.with_name(path.name + ".inject")
    try:
        _rewrite(path, tmp, by_part, get_column_letter)
    except BaseException:
        tmp.unlink(missing_ok=True)
        raise
    tmp.replace(path)


def _rewrite(path, tmp, by_part, get_column_letter) -> None:
    with zipfile.ZipFile(path) as zin, zipfile.ZipFile(tmp, "w", zipfile.ZIP_DEFLATED,
                                                       compresslevel=1) as zout:
        for item in zin.infolist():
            data = zin.read(item.filename)
            t = by_part.get(item.filename)
            if t is not None:
                xml = data.decode("utf-8")
                start = xml.find(f'<row r="{t.first_row}"')
                end = xml.find("</sheetData>")
                if start < 0 or end < 0:
                    raise RuntimeError(f"workbook: template row {t.first_row} not found in "
                                       f"{item.filename}")
                xml = xml[:start] + _rows_xml(t) + xml[end:]
                last = get_column_letter(t.sheet.max_column)
                xml = re.sub(r'<dimension ref="[^"]*"\s*/>',
                             f'<dimension ref="A1:{last}{t.first_row + t.nrows - 1}"/>', xml,
                             count=1)
                data = xml.encode("utf-8")
            zout.writestr(item, data)


# -- small-table helpers --------------------------------------------------------------------
def _styles():
    from openpyxl.styles import Alignment, Border, Font, PatternFill, Side

    return {
        "header_font": Font(bold=True),
        "header_fill": PatternFill("solid", fgColor=_HEADER_FILL),
        "header_align": Alignment(wrap_text=True, vertical="top"),
        "border": Border(bottom=Side(style="thin")),
        "title_font": Font(bold=True, size=14),
        "bold": Font(bold=True),
        "wrap": Alignment(wrap_text=True, vertical="top"),
        "left": Alignment(horizontal="left"),
        "center": Alignment(horizontal="center"),
        "input_fill": PatternFill("solid", fgColor=_INPUT_FILL),
    }


def _header(ws, row: int, headers, col: int = 1, st=None) -> None:
    st = st or _styles()
    for j, h in enumerate(headers):
        c = ws.cell(row=row, column=col + j, value=str(h))
        c.font, c.fill, c.alignment, c.border = (st["header_font"], st["header_fill"],
                                                 st["header_align"], st["border"])


def _value(v):
    """A cell value from a Python/numpy scalar (NaN and inf become empty cells)."""
    if v is None:
        return None
    if isinstance(v, (bool, np.bool_)):
        return bool(v)
    if isinstance(v, (int, np.integer)):
        return int(v)
    if isinstance(v, (float, np.floating)):
        f = float(v)
        return f if math.isfinite(f) else None
    if isinstance(v, (str, int, float)):
        return v
    return str(v)


def _write_frame(ws, df, row: int = 1, col: int = 1, st=None) -> tuple[int, int]:
    """Write a small DataFrame with header, fitted number formats; returns (first, last) row."""
    st = st or _styles()
    _header(ws, row, list(df.columns), col, st)
    for j, name in enumerate(df.columns):
        values = df[name].to_numpy()
        fmt = number_format(str(name), values)
        # a column of mixed magnitudes (no format of its quantity): a format per value
        per_cell = number_format(str(name)) == "General" and _spread(values) > 100
        for i, v in enumerate(df[name].tolist()):
            c = ws.cell(row=row + 1 + i, column=col + j, value=_value(v))
            if isinstance(c.value, bool):
                c.number_format = BOOLEAN_FORMAT
                c.alignment = st["center"]
            elif isinstance(c.value, (int, float)):
                f = number_format(str(name), np.array([c.value])) if per_cell else fmt
                if f != "General":
                    c.number_format = f
    return row + 1, row + len(df)


def _fit_widths(ws, min_width: float = 8, max_width: float = _MAX_WIDTH, sample: int = 200):
    from openpyxl.utils import get_column_letter

    widths: dict[int, float] = {}
    for r, row in enumerate(ws.iter_rows()):
        if r > sample:
            break
        for c in row:
            if c.value is None:
                continue
            if isinstance(c.value, float):
                n = 11
            else:
                n = len(str(c.value)) + 2
            widths[c.column] = max(widths.get(c.column, 0), n)
    for j, w in widths.items():
        ws.column_dimensions[get_column_letter(j)].width = max(min_width, min(max_width, w))


def _kv(ws, row: int, key: str, value, fmt: str | None = None, st=None) -> int:
    st = st or _styles()
    ws.cell(row=row, column=1, value=key).font = st["bold"]
    c = ws.cell(row=row, column=2, value=_value(value))
    if isinstance(c.value, (int, float)):
        c.alignment = st["left"]  # next to its label, not at the far end of the wide column
        if fmt:
            c.number_format = fmt
    return row + 1


# -- the workbook ---------------------------------------------------------------------------
def _design_row(plan):
    """Prototype speed [m/s] of the design (highest) speed, or None."""
    speeds = getattr(plan, "speeds", None)
    if speeds is None or len(speeds) == 0 or "prototype speed [m/s]" not in speeds:
        return None
    return speeds.loc[speeds["prototype speed [m/s]"].idxmax()]


def _sheet_overview(wb, plan, st):
    from similitude.planning.matrix import facility_time_hours

    ws = wb.create_sheet(SHEET_NAMES[0])
    case = plan.case
    ws.cell(row=1, column=1, value=f"Model-test plan: {getattr(case, 'name', 'case')}").font = (
        st["title_font"])
    r = 3
    for key, value in (getattr(case, "metadata", {}) or {}).items():
        r = _kv(ws, r, str(key), str(value), st=st)
    proto, fac = case.prototype, case.facility
    r = _kv(ws, r, "prototype", f"{proto.name} ({proto.kind})", st=st)
    r = _kv(ws, r, "prototype length [m]", proto.length, "0.000", st)
    r = _kv(ws, r, "facility", f"{fac.name} ({fac.kind}, {fac.length:g} m x {fac.width:g} m x "
            f"{fac.depth:g} m)", st=st)
    r = _kv(ws, r, "scale", format_scale(plan.scale), st=st)
    r = _kv(ws, r, "scale ratio lambda [-]", plan.scale, "0.000", st)
    r = _kv(ws, r, "model length [m]", plan.model_length, "0.000", st)
    for label, fs in (("prototype fluid", plan.prototype_fluid),
                      ("model fluid", plan.model_fluid)):
        t = float(np.asarray(fs.temperature_si)) - 273.15
        p = float(np.asarray(fs.pressure_si))
        r = _kv(ws, r, label, f"{fs.fluid} at {t:.2f} degC, {p / 1e3:.4g} kPa", st=st)
    r = _kv(ws, r, "binding constraint", getattr(plan, "binding_constraint", ""), st=st)
    exact = getattr(plan.solution, "exact", ()) or getattr(plan.case.request, "exact", ())
    r = _kv(ws, r, "groups matched exactly", ", ".join(exact), st=st)
    m = plan.matrix
    r = _kv(ws, r, "runs [-]", len(m), "0", st)
    r = _kv(ws, r, "facility time [h]", facility_time_hours(m), "0.0", st)
    d = _design_row(plan)
    if d is not None:
        vp = float(d["prototype speed [m/s]"])
        r = _kv(ws, r, "design speed, prototype [kn]", vp / KNOT, "0.00", st)
        if "model speed [m/s]" in d:
            r = _kv(ws, r, "design speed, model [m/s]", float(d["model speed [m/s]"]),
                    "0.000", st)
        g = getattr(plan, "groups", None)
        if g is not None and len(g):
            at = g[np.isclose(g["prototype speed [m/s]"], vp)]
            for _, row in at.iterrows():
                r = _kv(ws, r, f"{row['group']} ({row['symbol']}), model / prototype [-]",
                        f"{row['model value']:.4g} / {row['prototype value']:.4g}"
                        + ("" if row["matched"] else "  (not matched)"), st=st)
    r += 1
    ws.column_dimensions["A"].width = 40
    ws.column_dimensions["B"].width = 90
    ws.cell(row=r, column=1, value="cautions").font = st["bold"]
    ws.cell(row=r, column=1).alignment = st["wrap"]
    first_note = r
    ws.cell(row=r, column=2, value=CAUTION)
    r += 1
    for note in getattr(plan, "notes", ()):  # one row each, as high as its wrapped text
        ws.cell(row=r, column=2, value=str(note))
        r += 1
    _wrap_rows(ws, range(first_note, r), (2,), st)
    ws.freeze_panes = "A2"


def _sheet_similarity(wb, plan, st):
    import pandas as pd

    ws = wb.create_sheet(SHEET_NAMES[1])
    g = plan.groups
    first, last = _write_frame(ws, g, 1, 1, st)
    _group_value_formats(ws, g, 1)
    if len(g):
        from openpyxl.utils import get_column_letter

        ws.auto_filter.ref = f"A1:{get_column_letter(len(g.columns))}{last}"
    ws.freeze_panes = "A2"
    r = last + 3
    ws.cell(row=r - 1, column=1, value="Unmatched groups at the design speed (conflicts)"
            ).font = st["bold"]
    rows = [{"group": c.group, "prototype value": c.prototype_value,
             "model value": c.model_value, "ratio prototype/model [-]": c.ratio,
             "consequence": c.consequence,
             "details": "; ".join(f"{k} = {_fmt(v)}" for k, v in (c.details or {}).items())}
            for c in getattr(plan, "conflicts", ())]
    cf = pd.DataFrame(rows, columns=["group", "prototype value", "model value",
                                     "ratio prototype/model [-]", "consequence", "details"])
    _, cl = _write_frame(ws, cf, r, 1, st)
    for i, c in enumerate(getattr(plan, "conflicts", ())):
        for col in (2, 3):
            cell = ws.cell(row=r + 1 + i, column=col)
            if isinstance(cell.value, float):
                cell.number_format = number_format(f"{c.group} number",
                                                   np.array([cell.value]))
    _fit_widths(ws)
    ws.column_dimensions["E"].width = 50
    ws.column_dimensions["F"].width = 45
    _wrap_rows(ws, range(r + 1, cl + 1), (5, 6), st)
    for header_row in (1, r):
        _fit_row_height(ws, header_row)


def _group_value_formats(ws, groups, header_row: int) -> None:
    """Format the value cells of each similarity group by its group and magnitude."""
    heads = list(groups.columns)
    cols = [heads.index(h) + 1 for h in ("prototype value", "model value") if h in heads]
    if "group" not in heads:
        return
    for i, name in enumerate(groups["group"].tolist()):
        for col in cols:
            cell = ws.cell(row=header_row + 1 + i, column=col)
            if isinstance(cell.value, float):
                cell.number_format = number_format(str(name), np.array([cell.value]))


def _fmt(v) -> str:
    if isinstance(v, (float, np.floating)):
        return f"{float(v):.4g}"
    return str(v)


def _sheet_checks(wb, plan, st):
    from openpyxl.styles import PatternFill

    ws = wb.create_sheet(SHEET_NAMES[2])
    df = checks_table(plan.checks).rename(columns={"value": "model value", "kind": "limit kind"})
    df = df[["check", "model value", "limit", "unit", "limit kind", "margin [-]", "status",
             "source", "advice"]]
    _, last = _write_frame(ws, df, 1, 1, st)
    for i, c in enumerate(plan.checks):
        fill = _STATUS_FILL.get(c.status)
        if fill:
            ws.cell(row=2 + i, column=7).fill = PatternFill("solid", fgColor=fill)
        for col in (2, 3):
            cell = ws.cell(row=2 + i, column=col)
            if isinstance(cell.value, float):
                cell.number_format = number_format("", np.array([cell.value]))
    ws.auto_filter.ref = f"A1:I{max(last, 1)}"
    ws.freeze_panes = "A2"
    _fit_widths(ws)
    ws.column_dimensions["I"].width = 70
    _wrap_rows(ws, range(2, last + 1), (1, 8, 9), st)
    _fit_row_height(ws, 1)
    ws.cell(row=last + 2, column=1, value="margin = (limit - value)/|limit| for a maximum, "
            "(value - limit)/|limit| for a minimum; negative when violated")


def _long_table(wb, ws, df, header_row: int, st, extra_formats=None) -> _LongTable:
    """Header via openpyxl, one template row for the styles, rows injected after saving."""
    from openpyxl.utils import get_column_letter

    _header(ws, header_row, list(df.columns), 1, st)
    table = _LongTable(ws, header_row + 1, nrows=len(df))
    for j, name in enumerate(df.columns, start=1):
        values = df[name].to_numpy()
        kind = values.dtype.kind
        if kind == "b":
            k, fmt = "bool", BOOLEAN_FORMAT
        elif kind in "iu":
            k, fmt = "int", "0"
        elif kind == "f":
            k, fmt = "num", number_format(str(name), values)
        else:
            k, fmt = "str", "General"
        if extra_formats and name in extra_formats:
            fmt = extra_formats[name]
        tmpl = ws.cell(row=header_row + 1, column=j, value=0)
        if fmt != "General":
            tmpl.number_format = fmt
        if k == "bool":
            tmpl.alignment = st["center"]
        table.columns.append((get_column_letter(j), k, tmpl.style_id, values))
        width = max(10, min(_MAX_WIDTH, len(str(name)) * 0.55 + 4))
        if k == "str":
            sample = [len(str(v)) for v in values[:200]]
            width = max(width, min(_MAX_WIDTH, (max(sample) if sample else 0) + 2))
        ws.column_dimensions[get_column_letter(j)].width = width
    ws.row_dimensions[header_row].height = 45
    return table


def _sheet_runs(wb, plan, st) -> _LongTable:
    from openpyxl.utils import get_column_letter

    ws = wb.create_sheet(SHEET_NAMES[3])
    m = plan.matrix
    table = _long_table(wb, ws, m, 1, st)
    ws.freeze_panes = "B2"
    ws.auto_filter.ref = f"A1:{get_column_letter(max(1, len(m.columns)))}{len(m) + 1}"
    return table


def _sheet_scaling(wb, plan, st):
    ws = wb.create_sheet(SHEET_NAMES[4])
    sf = getattr(plan, "scale_factors", None)
    if sf is None or len(sf) == 0:
        ws.cell(row=1, column=1, value="no scale factors")
        return
    first, last = _write_frame(ws, sf, 1, 1, st)
    factor_col = next((j for j, c in enumerate(sf.columns, 1)
                       if "factor" in str(c).lower() and sf[c].dtype.kind == "f"), None)
    if factor_col is not None:
        from openpyxl.utils import get_column_letter

        n = len(sf.columns)
        ex_in, ex_out = n + 1, n + 2
        _header(ws, 1, ["worked example: model value", "worked example: full-scale value "
                        "(= factor x model value)"], ex_in, st)
        fl = get_column_letter(factor_col)
        il = get_column_letter(ex_in)
        for r in range(first, last + 1):
            c = ws.cell(row=r, column=ex_in, value=1.0)
            c.fill = st["input_fill"]
            ws.cell(row=r, column=ex_out, value=f"={fl}{r}*{il}{r}").number_format = (
                "0.0000E+00")
        ws.cell(row=last + 2, column=1, value="Enter a model measurement in the yellow cells "
                "(in the model unit of that row); the next column gives its full-scale value.")
    from openpyxl.utils import get_column_letter

    ws.auto_filter.ref = f"A1:{get_column_letter(len(sf.columns))}{last}"
    ws.freeze_panes = "A2"
    _fit_widths(ws)
    _fit_row_height(ws, 1)


def _sheet_fluids(wb, plan, st):
    ws = wb.create_sheet(SHEET_NAMES[5])
    p, m = plan.prototype_fluid, plan.model_fluid
    _header(ws, 1, ["property [unit]", f"prototype: {p.fluid}", f"model: {m.fluid}"], 1, st)
    dp, dm = p.as_dict(), m.as_dict()
    keys = list(dict.fromkeys([*dp, *dm]))
    r = 2
    for k in keys:
        ws.cell(row=r, column=1, value=k)
        for col, d in ((2, dp), (3, dm)):
            v = d.get(k)
            if v is not None:
                c = ws.cell(row=r, column=col, value=_value(float(np.asarray(v))))
                c.number_format = number_format(k, np.array([float(np.asarray(v))]))
        r += 1
    ws.cell(row=r, column=1, value="temperature [degC]")
    for col, fs in ((2, p), (3, m)):
        ws.cell(row=r, column=col, value=float(np.asarray(fs.temperature_si)) - 273.15
                ).number_format = "0.00"
    r += 2
    ws.cell(row=r, column=1, value="correlations used").font = st["bold"]
    r += 1
    for label, fs in (("prototype", p), ("model", m)):
        for s in fs.sources or ("(not stated by the fluid module)",):
            ws.cell(row=r, column=1, value=label)
            ws.cell(row=r, column=2, value=str(s))
            r += 1
    ws.freeze_panes = "A2"
    ws.column_dimensions["A"].width = 32
    ws.column_dimensions["B"].width = 30
    ws.column_dimensions["C"].width = 30


def _model_fluid_pressure(plan) -> float:
    return float(np.asarray(plan.model_fluid.pressure_si))


def _sheet_test_day(wb, plan, st):
    """The live sheet: temperature input, property formulas, per-run Re and C_F formulas."""
    import pandas as pd

    from similitude.correlations.friction import friction_coefficient

    ws = wb.create_sheet(SHEET_NAMES[6])
    fluid = plan.model_fluid.fluid
    live = formulas.supports(fluid)
    t_plan = float(np.asarray(plan.model_fluid.temperature_si)) - 273.15
    ws.cell(row=1, column=1, value="Test day: enter the measured model-fluid temperature"
            ).font = st["title_font"]
    ws.cell(row=2, column=1, value=(
        "The yellow cell is the only input. Density, viscosity, the model Reynolds number of "
        "every run and its ITTC-1957 friction coefficient below are formulas of it"
        + (" (the program's closed-form correlation)." if live else
           f" ({fluid}: linear interpolation in the '{PROPERTY_TABLE_SHEET}' sheet, "
           "tabulated from the program's correlation every "
           f"{PROPERTY_TABLE_STEP:g} K; error below 1e-7).")))
    ws.cell(row=4, column=1, value="measured model-fluid temperature [degC]").font = st["bold"]
    c = ws[TEMPERATURE_CELL]
    c.value = round(t_plan, 6)
    c.fill = st["input_fill"]
    c.number_format = "0.00"
    ws.cell(row=4, column=3, value=f"planned: {t_plan:.2f} degC")
    ws.cell(row=5, column=1, value="model fluid")
    ws.cell(row=5, column=2, value=fluid)
    ws.cell(row=6, column=1, value="absolute pressure [Pa]")
    ws[PRESSURE_CELL] = _model_fluid_pressure(plan)
    ws[PRESSURE_CELL].number_format = "0"
    labels = {KELVIN_CELL: "temperature [K]", DENSITY_CELL: "density [kg/m^3]",
              VISCOSITY_CELL: "dynamic viscosity [Pa s]",
              KINEMATIC_CELL: "kinematic viscosity [m^2/s]",
              VAPOUR_PRESSURE_CELL: "vapour pressure [Pa]",
              SURFACE_TENSION_CELL: "surface tension [N/m]", LENGTH_CELL: "model length [m]",
              RANGE_CHECK_CELL: "temperature inside the correlation's validity range?"}
    for ref, text in labels.items():
        ws.cell(row=int(ref[1:]), column=1, value=text)
    ms = plan.model_fluid
    if live:
        ws[KELVIN_CELL] = "=" + formulas.kelvin(TEMPERATURE_CELL)
        ws[DENSITY_CELL] = formulas.density(fluid, KELVIN_CELL, PRESSURE_CELL)
        ws[VISCOSITY_CELL] = formulas.dynamic_viscosity(fluid, KELVIN_CELL, DENSITY_CELL)
        ws[KINEMATIC_CELL] = formulas.kinematic_viscosity(DENSITY_CELL, VISCOSITY_CELL)
        ws[VAPOUR_PRESSURE_CELL] = formulas.vapour_pressure(fluid, KELVIN_CELL)
        ws[SURFACE_TENSION_CELL] = formulas.surface_tension(fluid, KELVIN_CELL)
    else:
        ws[KELVIN_CELL] = "=" + formulas.kelvin(TEMPERATURE_CELL)
        tab = _property_table(wb, ms, st)
        if tab is not None:
            x = tab.pop("x")
            t_abs = _abs(KELVIN_CELL)
            for ref, key in ((DENSITY_CELL, "density"), (VISCOSITY_CELL, "viscosity"),
                             (VAPOUR_PRESSURE_CELL, "vapour"),
                             (SURFACE_TENSION_CELL, "surface")):
                if key in tab:
                    ws[ref] = formulas.interpolate(t_abs, x, tab[key])
            ws[KINEMATIC_CELL] = formulas.kinematic_viscosity(DENSITY_CELL, VISCOSITY_CELL)
            ws.cell(row=6, column=3, value="fixed: the property table is at this pressure")
            rng = tab["t_range"]
        else:
            ws[KELVIN_CELL] = float(np.asarray(ms.temperature_si))
            ws[DENSITY_CELL] = float(np.asarray(ms.density_si))
            ws[VISCOSITY_CELL] = float(np.asarray(ms.dynamic_viscosity_si))
            ws[KINEMATIC_CELL] = float(np.asarray(ms.kinematic_viscosity_si))
            for ref, v in ((VAPOUR_PRESSURE_CELL, ms.vapour_pressure_si),
                           (SURFACE_TENSION_CELL, ms.surface_tension_si)):
                ws[ref] = None if v is None else float(np.asarray(v))
    ws[LENGTH_CELL] = float(plan.model_length)
    for ref, fmt in ((KELVIN_CELL, "0.00"), (DENSITY_CELL, "0.0000"),
                     (VISCOSITY_CELL, "0.00000E+00"), (KINEMATIC_CELL, "0.00000E+00"),
                     (VAPOUR_PRESSURE_CELL, "0.0"), (SURFACE_TENSION_CELL, "0.00000"),
                     (LENGTH_CELL, "0.000")):
        ws[ref].number_format = fmt
    if live:
        rng = _temperature_range(fluid)
    elif tab is None:
        rng = None
    if rng is not None:
        lo, hi = rng[0] - 273.15, rng[1] - 273.15
        ws[RANGE_CHECK_CELL] = (f'=IF(AND({TEMPERATURE_CELL}>={lo!r},{TEMPERATURE_CELL}<='
                                f'{hi!r}),"inside","OUTSIDE: results not valid")')
        ws.cell(row=int(RANGE_CHECK_CELL[1:]), column=3, value=f"valid {lo:g} to {hi:g} degC")
    ws.cell(row=TEST_DAY_HEADER_ROW - 1, column=1,
            value="Per run (the run numbers of the Runs sheet):").font = st["bold"]

    m = plan.matrix
    vm = m["model speed [m/s]"].to_numpy(dtype=float)
    re_plan = m["model Reynolds number [-]"].to_numpy(dtype=float)
    re_p = m["prototype Reynolds number [-]"].to_numpy(dtype=float)
    cf_plan = _cf(re_plan, friction_coefficient)
    cf_p = _cf(re_p, friction_coefficient)
    df = pd.DataFrame({
        TEST_DAY_COLUMNS[0]: m["run"].to_numpy(),
        TEST_DAY_COLUMNS[1]: vm,
        TEST_DAY_COLUMNS[2]: re_plan,
        TEST_DAY_COLUMNS[3]: cf_plan,
        TEST_DAY_COLUMNS[4]: re_plan,
        TEST_DAY_COLUMNS[5]: cf_plan,
        TEST_DAY_COLUMNS[6]: re_p,
        TEST_DAY_COLUMNS[7]: cf_p,
        TEST_DAY_COLUMNS[8]: cf_plan - cf_p,
    })
    table = _long_table(wb, ws, df, TEST_DAY_HEADER_ROW, st)
    kin = _abs(KINEMATIC_CELL)
    length = _abs(LENGTH_CELL)

    def re_f(r):
        return f"IF(B{r}>0,B{r}*{length}/{kin},\"\")"

    def cf_f(r):
        return f"IF(B{r}>0,0.075/(LOG10(C{r})-2)^2,\"\")"

    def dcf_f(r):
        return f"IF(B{r}>0,D{r}-H{r},\"\")"

    cols = table.columns
    cols[2] = (cols[2][0], "formula", cols[2][2], re_f)
    cols[3] = (cols[3][0], "formula", cols[3][2], cf_f)
    cols[8] = (cols[8][0], "formula", cols[8][2], dcf_f)
    ws.freeze_panes = f"A{TEST_DAY_HEADER_ROW + 1}"
    ws.auto_filter.ref = f"A{TEST_DAY_HEADER_ROW}:I{TEST_DAY_HEADER_ROW + len(df)}"
    ws.column_dimensions["A"].width = max(ws.column_dimensions["A"].width or 0, 44)
    ws.column_dimensions["B"].width = max(ws.column_dimensions["B"].width or 0, 16)
    return table


def _property_table(wb, state, st):
    """Tabulate the model fluid's properties against temperature on their own sheet.

    Returns the absolute ranges {"x", "density", "viscosity", ["vapour", "surface"]} and the
    tabulated temperature range, or None when the fluid cannot be evaluated.
    """
    from fluids_props import get_fluid

    try:
        info = get_fluid(state.fluid)
    except ValueError:
        return None
    t0 = float(np.asarray(state.temperature_si))
    p0 = float(np.asarray(state.pressure_si))
    lo, hi = t0 - PROPERTY_TABLE_SPAN, t0 + PROPERTY_TABLE_SPAN
    r = info.range_of("temperature")
    if r is not None:
        lo, hi = max(lo, r.low), min(hi, r.high)
    n = int(round((hi - lo) / PROPERTY_TABLE_STEP))
    if n < 2:
        return None
    grid = lo + PROPERTY_TABLE_STEP * np.arange(n + 1)
    extra = {k: state.extra[k] for k in ("relative_humidity", "salinity")
             if k in (state.extra or {})}
    try:
        fs = info.evaluate_si(grid, p0, **extra)
    except (TypeError, ValueError):
        try:
            fs = info.evaluate_si(grid, p0)
        except ValueError:
            return None
    ws = wb.create_sheet(PROPERTY_TABLE_SHEET)
    cols = [("temperature [K]", grid, "x", "0.00"),
            ("density [kg/m^3]", fs.density_si, "density", "0.000000"),
            ("dynamic viscosity [Pa s]", fs.dynamic_viscosity_si, "viscosity", "0.000000E+00")]
    if fs.vapour_pressure_si is not None:
        cols.append(("vapour pressure [Pa]", fs.vapour_pressure_si, "vapour", "0.00"))
    if fs.surface_tension_si is not None:
        cols.append(("surface tension [N/m]", fs.surface_tension_si, "surface", "0.000000"))
    _header(ws, 1, [c[0] for c in cols], 1, st)
    from openpyxl.utils import get_column_letter

    out = {"t_range": (float(grid[0]), float(grid[-1]))}
    for j, (_, values, key, fmt) in enumerate(cols, start=1):
        v = np.broadcast_to(np.asarray(values, dtype=float), grid.shape)
        for i, val in enumerate(v.tolist()):
            ws.cell(row=2 + i, column=j, value=val).number_format = fmt
        letter = get_column_letter(j)
        out[key] = f"'{PROPERTY_TABLE_SHEET}'!${letter}$2:${letter}${n + 2}"
        ws.column_dimensions[letter].width = 22
    ws.cell(row=1, column=len(cols) + 2, value=(
        f"{state.fluid} at {p0:g} Pa from fluids_props ({'; '.join(state.sources or ())}); "
        "the Test day sheet interpolates linearly in this table."))
    ws.freeze_panes = "A2"
    return out


def _abs(ref: str) -> str:
    m = re.fullmatch(r"([A-Z]+)(\d+)", ref)
    return f"${m.group(1)}${m.group(2)}"


def _cf(re_values, friction_coefficient):
    out = np.full(np.shape(re_values), np.nan)
    ok = np.isfinite(re_values) & (re_values > 100)
    if ok.any():
        out[ok] = friction_coefficient(re_values[ok], method="ittc1957")
    return out


def _temperature_range(fluid: str):
    try:
        from fluids_props import get_fluid

        r = get_fluid(fluid).range_of("temperature")
    except ValueError:
        return None
    return None if r is None else (r.low, r.high)


def _sheet_charts(wb, plan, st):
    from openpyxl.chart import Reference, ScatterChart, Series
    from openpyxl.chart.shapes import GraphicalProperties

    from similitude.correlations.friction import friction_coefficient

    ws = wb.create_sheet(SHEET_NAMES[7])
    m = plan.matrix
    by = m.groupby("prototype speed [m/s]", sort=True).first().reset_index()
    headers = ["prototype speed [kn]", "model speed [m/s]", "model Reynolds number [-]",
               "prototype Reynolds number [-]", "ITTC-1957 C_F model [-]",
               "ITTC-1957 C_F prototype [-]"]
    _header(ws, 1, headers, 1, st)
    re_m = by["model Reynolds number [-]"].to_numpy(dtype=float)
    re_p = by["prototype Reynolds number [-]"].to_numpy(dtype=float)
    cfm, cfp = _cf(re_m, friction_coefficient), _cf(re_p, friction_coefficient)
    cols = [by["prototype speed [kn]"].to_numpy(float), by["model speed [m/s]"].to_numpy(float),
            re_m, re_p, cfm, cfp]
    for i in range(len(by)):
        for j, (h, col) in enumerate(zip(headers, cols, strict=True), 1):
            c = ws.cell(row=2 + i, column=j, value=_value(col[i]))
            c.number_format = number_format(h, col)
    n = len(by)
    # friction line table
    lo = math.floor(math.log10(max(np.nanmin(re_m[re_m > 0]) if (re_m > 0).any() else 1e5,
                                   1e4)))
    hi = math.ceil(math.log10(max(np.nanmax(re_p) if np.isfinite(re_p).any() else 1e9, 1e6)))
    grid = np.logspace(lo, hi, 8 * (hi - lo) + 1)
    _header(ws, 1, ["Reynolds number [-]", "ITTC-1957 C_F [-]"], 8, st)
    for i, (rv, cv) in enumerate(zip(grid, friction_coefficient(grid), strict=True)):
        ws.cell(row=2 + i, column=8, value=float(rv)).number_format = "0.00E+00"
        ws.cell(row=2 + i, column=9, value=float(cv)).number_format = "0.00000"
    ng = len(grid)

    ch = ScatterChart()
    ch.title = "Model and full-scale Reynolds numbers"
    ch.style = 13
    ch.x_axis.title = "prototype speed [kn]"
    ch.y_axis.title = "Reynolds number [-]"
    ch.y_axis.scaling.logBase = 10
    x = Reference(ws, min_col=1, min_row=2, max_row=1 + n)
    for col, name in ((3, "model"), (4, "prototype")):
        s = Series(Reference(ws, min_col=col, min_row=2, max_row=1 + n), x, title=name)
        s.marker.symbol = "circle"
        ch.series.append(s)
    ch.x_axis.delete = False
    ch.y_axis.delete = False
    ch.height, ch.width = 9, 16
    ws.add_chart(ch, "K2")

    fc = ScatterChart()
    fc.title = "ITTC-1957 friction line with model and ship points"
    fc.style = 13
    fc.x_axis.title = "Reynolds number [-]"
    fc.y_axis.title = "C_F [-]"
    fc.x_axis.scaling.logBase = 10
    line = Series(Reference(ws, min_col=9, min_row=2, max_row=1 + ng),
                  Reference(ws, min_col=8, min_row=2, max_row=1 + ng), title="ITTC-1957 line")
    line.marker.symbol = "none"
    fc.series.append(line)
    for xcol, ycol, name, colour in ((3, 5, "model", "4472C4"), (4, 6, "ship", "C0504D")):
        s = Series(Reference(ws, min_col=ycol, min_row=2, max_row=1 + n),
                   Reference(ws, min_col=xcol, min_row=2, max_row=1 + n), title=name)
        s.marker.symbol = "circle"
        s.marker.size = 7
        # points only: the markers need their own fill, or no line hides them as well
        s.marker.graphicalProperties = GraphicalProperties(solidFill=colour)
        s.marker.graphicalProperties.line.solidFill = colour
        s.graphicalProperties.line.noFill = True
        fc.series.append(s)
    fc.x_axis.delete = False
    fc.y_axis.delete = False
    fc.height, fc.width = 9, 16
    ws.add_chart(fc, "K22")
    ws.freeze_panes = "A2"
    _fit_widths(ws)


def _sheet_basis(wb, plan, st):
    ws = wb.create_sheet(SHEET_NAMES[8])
    _header(ws, 1, ["topic", "text"], 1, st)
    rows = [("caution", CAUTION)]
    rows += [("planner note", str(n)) for n in getattr(plan, "notes", ())]
    rows += [("run matrix assumption", str(n))
             for n in plan.matrix.attrs.get("notes", ())]
    for label, fs in (("prototype fluid", plan.prototype_fluid),
                      ("model fluid", plan.model_fluid)):
        rows += [(f"{label} correlation", str(s)) for s in (fs.sources or ())]
    rows += [("binding constraint", str(getattr(plan, "binding_constraint", "")))]
    rows += [(f"check source: {c.name}", c.source) for c in getattr(plan, "checks", ())]
    rows += [
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
    ws.column_dimensions["A"].width = 40
    ws.column_dimensions["B"].width = 110
    for i, (k, v) in enumerate(rows, start=2):
        ws.cell(row=i, column=1, value=k)
        ws.cell(row=i, column=2, value=v)
    _wrap_rows(ws, range(2, len(rows) + 2), (1, 2), st)
    ws.auto_filter.ref = f"A1:B{len(rows) + 1}"
    ws.freeze_panes = "A2"


def build_workbook(plan):
    """The openpyxl Workbook of a plan and its long tables (rows not yet written).

    Returns
    -------
    tuple
        (workbook, list of pending long tables); :func:`write_plan` saves and completes it.
    """
    from openpyxl import Workbook
    from openpyxl.workbook.defined_name import DefinedName
    from openpyxl.workbook.properties import CalcProperties

    st = _styles()
    wb = Workbook()
    wb.remove(wb.active)
    _sheet_overview(wb, plan, st)
    _sheet_similarity(wb, plan, st)
    _sheet_checks(wb, plan, st)
    runs = _sheet_runs(wb, plan, st)
    _sheet_scaling(wb, plan, st)
    _sheet_fluids(wb, plan, st)
    test_day = _sheet_test_day(wb, plan, st)
    _sheet_charts(wb, plan, st)
    _sheet_basis(wb, plan, st)
    for ws in wb.worksheets:
        _print_setup(ws)
    ref = f"'{TEST_DAY_SHEET}'!{_abs(TEMPERATURE_CELL)}"
    dn = DefinedName("TestDayTemperature", attr_text=ref)
    try:
        wb.defined_names["TestDayTemperature"] = dn
    except TypeError:  # older openpyxl API
        wb.defined_names.append(dn)
    # no cached values are stored: ask the application to calculate everything on load
    wb.calculation = CalcProperties(fullCalcOnLoad=True)
    return wb, [runs, test_day]


def write_plan(plan, path, overwrite: bool = False) -> pathlib.Path:
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

    Returns
    -------
    pathlib.Path
        The path written.

    Raises
    ------
    similitude.report.atomic.OutputExistsError
        (an InputError and FileExistsError) when the file exists and ``overwrite`` is False.
    """
    target = pathlib.Path(path).expanduser()
    from similitude.report.atomic import check_target

    check_target(target, overwrite)  # fail before the work
    wb, tables = build_workbook(plan)

    def writer(tmp: pathlib.Path) -> None:
        wb.save(tmp)
        _inject(tmp, wb, tables)

    return write_atomic(target, writer, overwrite=overwrite)

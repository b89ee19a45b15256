"""Sheet helpers shared by the workbook writers: styles, number formats, tables, column widths,
wrapped rows, printing, scatter charts, and long tables written as sheet XML.

Long tables: openpyxl's own cell writer takes several seconds for a 10^4-row table, so
:func:`long_table` writes the header and one template row (holding each column's style) with
openpyxl, and :func:`write_long_tables` replaces the template row with every row, as sheet XML,
in the saved package.

openpyxl is imported at the top: only the workbook writers load this module, never
``import similitude``.
"""

from __future__ import annotations

import html
import math
import pathlib
import re
import textwrap
import zipfile
from collections.abc import Callable, Iterable, Sequence
from dataclasses import dataclass, field

import numpy as np
from openpyxl.chart import ScatterChart
from openpyxl.styles import Alignment, Border, Font, PatternFill, Side
from openpyxl.utils import get_column_letter

# -- styles ---------------------------------------------------------------------------------
# openpyxl copies a style into the workbook's own table when a cell is given it; these objects
# are never changed, so every workbook can share them.
BOLD = Font(bold=True)
TITLE_FONT = Font(bold=True, size=14)
HEADER_FILL = PatternFill("solid", fgColor="DDEBF7")
HEADER_BORDER = Border(bottom=Side(style="thin"))
#: Yellow: a cell the user is meant to type into.
INPUT_FILL = PatternFill("solid", fgColor="FFF2CC")
WRAP = Alignment(wrap_text=True, vertical="top")
TOP = Alignment(vertical="top")
LEFT = Alignment(horizontal="left")
CENTER = Alignment(horizontal="center")

#: Widest column [characters] the width fitting gives.
MAX_WIDTH = 48
#: Display format of boolean cells: "yes"/"no" where the application applies number formats
#: to booleans (LibreOffice), TRUE/FALSE otherwise (Excel); the cell value stays a boolean.
BOOLEAN_FORMAT = '"yes";"yes";"no"'
#: Height [pt] of one line of wrapped text in the default 11 pt font.
LINE_HEIGHT = 15.0
#: Width [characters] of a column openpyxl has no width for (the application's default).
DEFAULT_WIDTH = 8.43


# -- number formats -----------------------------------------------------------------------
def number_format(header: str, values=None) -> str:
    """Excel number format fitted to a column: by its quantity, then by its magnitude.

    Reynolds and Weber numbers and other wide-ranging values get scientific format, counts
    integers, knots two decimals, angles one, otherwise about four significant digits (of the
    median magnitude of the nonzero finite values).
    """
    fmt = _quantity_format(header)
    if fmt is not None:
        return fmt
    if values is None:
        return "General"
    arr = np.asarray(values)
    if arr.dtype.kind in "iu":
        return "0"
    if arr.dtype.kind != "f":
        return "General"
    a = np.abs(arr[np.isfinite(arr) & (arr != 0)])
    return _magnitude_format(float(np.median(a))) if a.size else "0.000"


def value_format(header: str, value: float) -> str:
    """:func:`number_format` of one number on its own (a column of mixed magnitudes)."""
    fmt = _quantity_format(header)
    if fmt is not None:
        return fmt
    if isinstance(value, (int, np.integer)):
        return "0"
    m = abs(float(value))
    return _magnitude_format(m) if math.isfinite(m) and m != 0 else "0.000"


def _quantity_format(header: str) -> str | None:
    """The format a column header's quantity fixes, or None."""
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
    return None


def _magnitude_format(m: float) -> str:
    """About four significant digits for a magnitude ``m`` > 0; scientific when very large or
    small."""
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


def cell_value(v):
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
    if isinstance(v, str):
        return v
    return str(v)


# -- small tables ---------------------------------------------------------------------------
def header_row(ws, row: int, headers: Iterable, col: int = 1) -> None:
    """Bold, shaded, wrapped header cells from column ``col`` on."""
    for j, h in enumerate(headers):
        c = ws.cell(row=row, column=col + j, value=str(h))
        c.font, c.fill, c.alignment, c.border = BOLD, HEADER_FILL, WRAP, HEADER_BORDER


def write_frame(ws, frame, row: int = 1, col: int = 1) -> tuple[int, int]:
    """Write a small DataFrame with header, fitted number formats; returns (first, last) row."""
    header_row(ws, row, list(frame.columns), col)
    for j, name in enumerate(frame.columns):
        values = frame[name].to_numpy()
        fmt = number_format(str(name), values)
        # a column of mixed magnitudes (no format of its quantity): a format per value
        per_cell = number_format(str(name)) == "General" and _spread(values) > 100
        for i, v in enumerate(frame[name].tolist()):
            c = ws.cell(row=row + 1 + i, column=col + j, value=cell_value(v))
            if isinstance(c.value, bool):
                c.number_format = BOOLEAN_FORMAT
                c.alignment = CENTER
            elif isinstance(c.value, (int, float)):
                f = value_format(str(name), c.value) if per_cell else fmt
                if f != "General":
                    c.number_format = f
    return row + 1, row + len(frame)


def label_row(ws, row: int, label: str, value, fmt: str | None = None) -> int:
    """A bold label in column A and its value in B; returns the next row."""
    ws.cell(row=row, column=1, value=label).font = BOLD
    c = ws.cell(row=row, column=2, value=cell_value(value))
    if isinstance(c.value, (int, float)):
        c.alignment = LEFT  # next to its label, not at the far end of the wide column
        if fmt:
            c.number_format = fmt
    return row + 1


def table_range(first_row: int, columns: int, last_row: int) -> str:
    """The range ``A<first_row>:<last column><last_row>`` of a table (e.g. for a filter)."""
    return f"A{first_row}:{get_column_letter(columns)}{last_row}"


# -- widths, wrapped rows, printing ---------------------------------------------------------
def fit_widths(ws, min_width: float = 8, max_width: float = MAX_WIDTH,
               sample: int = 200) -> None:
    """Column widths from the text of the first ``sample`` rows, within the bounds."""
    widths: dict[int, float] = {}
    for r, row in enumerate(ws.iter_rows()):
        if r > sample:
            break
        for c in row:
            if c.value is None:
                continue
            n = 11 if isinstance(c.value, float) else len(str(c.value)) + 2
            widths[c.column] = max(widths.get(c.column, 0), n)
    for j, w in widths.items():
        ws.column_dimensions[get_column_letter(j)].width = max(min_width, min(max_width, w))


def widen(ws, widths: dict[str, float]) -> None:
    """Raise the widths of the lettered columns to at least the given ones."""
    for letter, width in widths.items():
        ws.column_dimensions[letter].width = max(ws.column_dimensions[letter].width or 0, width)


def set_widths(ws, widths: dict[str, float]) -> None:
    """Set the widths of the lettered columns."""
    for letter, width in widths.items():
        ws.column_dimensions[letter].width = width


def wrapped_lines(text, width: float) -> int:
    """Lines a text takes when wrapped in a column ``width`` characters wide (an estimate).

    One character per unit of column width, words kept whole: a slight overestimate for
    proportional fonts, so the row is never too low.
    """
    per_line = max(1, int(width) - 1)
    return sum(max(1, len(textwrap.wrap(part, per_line, break_long_words=True)))
               for part in str(text).split("\n"))


def fit_row_height(ws, row: int) -> None:
    """Set the height of ``row`` to hold its wrapped cells (only ever raised, never lowered)."""
    lines = 0
    for c in ws[row]:
        if c.value is None or not (c.alignment and c.alignment.wrap_text):
            continue
        width = ws.column_dimensions[get_column_letter(c.column)].width or DEFAULT_WIDTH
        lines = max(lines, wrapped_lines(c.value, width))
    if lines:
        height = ws.row_dimensions[row].height or 0
        ws.row_dimensions[row].height = max(height, lines * LINE_HEIGHT)


def wrap_rows(ws, rows: Iterable[int], columns: Sequence[int]) -> None:
    """Wrap the text of ``columns`` in ``rows`` and fit the row heights to it.

    The other cells of these rows are aligned to the top, level with the first text line.
    """
    for r in rows:
        for c in ws[r]:
            if c.value is not None:
                c.alignment = WRAP if c.column in columns else TOP
        fit_row_height(ws, r)


def print_setup(ws, title_row: int | None = None) -> None:
    """Landscape, one page wide (as many pages long as needed), ``title_row`` on every page."""
    ws.page_setup.orientation = "landscape"
    ws.sheet_properties.pageSetUpPr.fitToPage = True
    ws.page_setup.fitToWidth = 1
    ws.page_setup.fitToHeight = 0
    if title_row is not None:
        ws.print_title_rows = f"{title_row}:{title_row}"


# -- charts ---------------------------------------------------------------------------------
def scatter_chart(title: str, x_title: str, y_title: str) -> ScatterChart:
    """An empty scatter chart, 16 x 9 cm, with titled and visible axes."""
    chart = ScatterChart()
    chart.title = title
    chart.style = 13
    chart.x_axis.title = x_title
    chart.y_axis.title = y_title
    chart.height, chart.width = 9, 16
    # openpyxl hides axes by default in recent versions; show them.
    chart.x_axis.delete = False
    chart.y_axis.delete = False
    return chart


# -- long tables written as raw sheet XML --------------------------------------------------
@dataclass
class LongTable:
    """Rows to write into a sheet after openpyxl has saved the package.

    ``columns`` holds (column letter, kind, style id, data) per column; kind is "num", "int",
    "bool", "str", or "formula" (data: row -> formula text without "="). Floats are written
    exactly (``repr``), or with ``float_digits`` significant digits.
    """

    sheet: object
    first_row: int
    columns: list = field(default_factory=list)
    nrows: int = 0
    float_digits: int | None = None

    def set_formula(self, index: int, formula: Callable[[int], str]) -> None:
        """Write column ``index`` (0-based) as the formula ``formula(row)`` in every row."""
        letter, _, style, _ = self.columns[index]
        self.columns[index] = (letter, "formula", style, formula)


def long_table(ws, frame, header_row_number: int, formats: dict[str, str] | None = None,
               fit: bool = True, float_digits: int | None = None) -> LongTable:
    """Header via openpyxl, one template row for the styles; rows written by
    :func:`write_long_tables` after saving.

    ``formats`` overrides the fitted number format of the columns it names; ``fit`` sets the
    column widths from the headers and texts and a three-line header row; ``float_digits``
    (e.g. 16, as openpyxl writes numbers) rounds the floats written, which are otherwise exact.
    """
    header_row(ws, header_row_number, list(frame.columns))
    table = LongTable(ws, header_row_number + 1, nrows=len(frame), float_digits=float_digits)
    for j, name in enumerate(frame.columns, start=1):
        values = frame[name].to_numpy()
        kind, fmt = _column_kind(str(name), values)
        if formats and name in formats:
            fmt = formats[name]
        tmpl = ws.cell(row=header_row_number + 1, column=j, value=0)
        if fmt != "General":
            tmpl.number_format = fmt
        if kind == "bool":
            tmpl.alignment = CENTER
        table.columns.append((get_column_letter(j), kind, tmpl.style_id, values))
        if fit:
            ws.column_dimensions[get_column_letter(j)].width = _long_column_width(name, kind,
                                                                                  values)
    if fit:
        ws.row_dimensions[header_row_number].height = 45
    return table


def _column_kind(name: str, values) -> tuple[str, str]:
    """(kind, number format) of a long-table column from its data type."""
    kind = values.dtype.kind
    if kind == "b":
        return "bool", BOOLEAN_FORMAT
    if kind in "iu":
        return "int", "0"
    if kind == "f":
        return "num", number_format(name, values)
    return "str", "General"


def _long_column_width(name, kind: str, values) -> float:
    width = max(10, min(MAX_WIDTH, len(str(name)) * 0.55 + 4))
    if kind == "str":
        sample = [len(str(v)) for v in values[:200]]
        width = max(width, min(MAX_WIDTH, (max(sample) if sample else 0) + 2))
    return width


def write_long_tables(path: pathlib.Path, wb, tables: list[LongTable]) -> None:
    """Replace the template rows of the long tables with all their rows, in the saved file."""
    by_part = {f"xl/worksheets/sheet{wb.worksheets.index(t.sheet) + 1}.xml": t for t in tables}
    tmp = path.with_name(path.name + ".inject")
    try:
        _rewrite(path, tmp, by_part)
    except BaseException:
        tmp.unlink(missing_ok=True)
        raise
    tmp.replace(path)


def _rewrite(path: pathlib.Path, tmp: pathlib.Path, by_part: dict[str, LongTable]) -> None:
    with zipfile.ZipFile(path) as zin, zipfile.ZipFile(tmp, "w", zipfile.ZIP_DEFLATED,
                                                       compresslevel=1) as zout:
        for item in zin.infolist():
            data = zin.read(item.filename)
            t = by_part.get(item.filename)
            if t is not None:
                data = _with_rows(data.decode("utf-8"), t, item.filename).encode("utf-8")
            zout.writestr(item, data)


def _with_rows(xml: str, t: LongTable, part: str) -> str:
    """The sheet XML with the template row and what follows replaced by the table's rows."""
    start = xml.find(f'<row r="{t.first_row}"')
    end = xml.find("</sheetData>")
    if start < 0 or end < 0:
        raise RuntimeError(f"workbook: template row {t.first_row} not found in {part}")
    xml = xml[:start] + _rows_xml(t) + xml[end:]
    last = get_column_letter(t.sheet.max_column)
    return re.sub(r'<dimension ref="[^"]*"\s*/>',
                  f'<dimension ref="A1:{last}{t.first_row + t.nrows - 1}"/>', xml, count=1)


def _rows_xml(table: LongTable) -> str:
    rows = range(table.first_row, table.first_row + table.nrows)
    digits = table.float_digits
    float_text = repr if digits is None else (lambda v: f"{v:.{digits}g}")
    cols = [_cell_xml(letter, kind, style, data, rows, float_text)
            for letter, kind, style, data in table.columns]
    return "".join(f'<row r="{r}">' + "".join(cells) + "</row>"
                   for r, cells in zip(rows, zip(*cols, strict=True), strict=True))


def _cell_xml(letter: str, kind: str, style: int, data, rows: range,
              float_text: Callable[[float], str] = repr) -> list[str]:
    s = f' s="{style}"' if style else ""
    if kind == "num":
        vals = np.asarray(data, dtype=float).tolist()
        return [f'<c r="{letter}{r}"{s}><v>{float_text(v)}</v></c>' if math.isfinite(v) else ""
                for r, v in zip(rows, vals, strict=True)]
    if kind == "int":
        vals = np.asarray(data).astype(np.int64).tolist()
        return [f'<c r="{letter}{r}"{s}><v>{v}</v></c>' for r, v in zip(rows, vals, strict=True)]
    if kind == "bool":
        return [f'<c r="{letter}{r}"{s} t="b"><v>{int(bool(v))}</v></c>'
                for r, v in zip(rows, data, strict=True)]
    if kind == "formula":
        return [f'<c r="{letter}{r}"{s}><f>{_escape(data(r))}</f></c>' for r in rows]
    # strings, inline (valid SpreadsheetML; no shared-string table needed)
    out = []
    for r, v in zip(rows, data, strict=True):
        if v is None or (isinstance(v, float) and not math.isfinite(v)) or v == "":
            out.append("")
        else:
            out.append(f'<c r="{letter}{r}"{s} t="inlineStr"><is><t>{_escape(str(v))}</t></is>'
                       "</c>")
    return out


def _escape(text: str) -> str:
    """``&``, ``<`` and ``>`` as XML entities (quotes need none in element text)."""
    return html.escape(text, quote=False)

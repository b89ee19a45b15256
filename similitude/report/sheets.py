"""Sheet helpers shared by the workbook writers: text from users made safe, the workbook and
sheets every writer starts from, styles, number formats, tables, column widths, wrapped rows,
printing, scatter charts, and long tables written as sheet XML.

Text from users: every cell of a workbook made by :func:`new_workbook` or :func:`new_sheet`
passes its text through :func:`safe_text` when it is set, however it is set (``ws.cell``,
``ws["B4"] = ...``, the helpers below, the long tables), so a title, a name or a measured text
column can never become a live formula, an error value or a character the file format forbids.
Our own formulas stay live: they are written as :func:`formula` values. :func:`save_workbook`
refuses a sheet made any other way. The CSV outputs go through the same function
(:func:`csv_text`).

Long tables: openpyxl's own cell writer takes several seconds for a 10^4-row table, so
:func:`long_table` writes the header and one template row (holding each column's style) with
openpyxl, and :func:`write_long_tables` replaces the template row with every row, as sheet XML,
in the saved package.

openpyxl is imported at the top: only the workbook writers load this module, never
``import similitude``.
"""

from __future__ import annotations

import html
import io
import math
import pathlib
import re
import textwrap
import zipfile
from collections.abc import Callable, Iterable, Sequence
from dataclasses import dataclass, field

import numpy as np
from openpyxl import Workbook
from openpyxl.cell.cell import ERROR_CODES, Cell
from openpyxl.chart import Reference, ScatterChart, Series
from openpyxl.chart.shapes import GraphicalProperties
from openpyxl.styles import Alignment, Border, Font, PatternFill, Side
from openpyxl.utils import column_index_from_string, get_column_letter
from openpyxl.worksheet.pagebreak import Break
from openpyxl.worksheet.worksheet import Worksheet

from similitude.report.page import PAPER_SIZES, PageSetup

# -- text from users ------------------------------------------------------------------------
#: Most characters a cell holds (Excel specifications and limits: 32,767 characters per cell).
CELL_TEXT_LIMIT = 32767
#: First characters that make a spreadsheet read a cell as a formula: =, +, -, @, tab and
#: carriage return (OWASP, "CSV Injection", owasp.org/www-community/attacks/CSV_Injection;
#: OWASP ASVS 5.0 requirement 1.2.10). Such text gets a leading apostrophe.
FORMULA_STARTS = frozenset("=+-@\t\r")
#: Put before text a spreadsheet would evaluate: shown as written, read as text.
TEXT_MARK = "'"
#: Stands in for a character XML 1.0 does not allow in a document (section 2.2, Char).
REPLACEMENT_CHARACTER = "\ufffd"
_XML_FORBIDDEN = re.compile("[\x00-\x08\x0b\x0c\x0e-\x1f\ud800-\udfff\ufffe\uffff]")
_PLAIN_NUMBER = re.compile(r"[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?")


def safe_text(value, limit: int = CELL_TEXT_LIMIT) -> str:
    """Text from a user made safe for a spreadsheet cell or a CSV field.

    * Characters XML 1.0 forbids (control characters other than tab, line feed and carriage
      return, lone surrogates, U+FFFE and U+FFFF) become U+FFFD, the replacement character.
    * Text whose first character (after spaces and line feeds) is ``=``, ``+``, ``-``, ``@``,
      a tab or a carriage return, or which reads as a spreadsheet error value (``#N/A``...),
      gets a leading apostrophe, so no spreadsheet evaluates it (OWASP, "CSV Injection"); a
      plain number such as ``-1.5`` or ``+3e4`` is left as it is.
    * Text longer than ``limit`` characters (UTF-16 units, as a spreadsheet counts them) is
      cut, ending with a mark saying so and how long it was.

    Parameters
    ----------
    value : object
        The text (anything else is turned into text with ``str``).
    limit : int
        Longest text kept [characters]; the cell limit by default.

    Returns
    -------
    str
    """
    text = xml_text(value)
    head = text.lstrip(" \n")[:1]
    if (head in FORMULA_STARTS and not _PLAIN_NUMBER.fullmatch(text.strip())) \
            or text.strip() in ERROR_CODES:
        text = TEXT_MARK + text
    return _cut(text, limit)


def xml_text(value) -> str:
    """``str(value)`` with each character XML 1.0 forbids replaced by U+FFFD."""
    return _XML_FORBIDDEN.sub(REPLACEMENT_CHARACTER, str(value))


def _cut(text: str, limit: int) -> str:
    """``text`` within ``limit`` UTF-16 units, with a visible mark when it was cut."""
    units = len(text) + sum(1 for ch in text if ord(ch) > 0xFFFF) if len(text) > limit // 2 \
        else len(text)
    if units <= limit:
        return text
    mark = f" [... cut here: the text has {units:,} characters, a cell holds {limit:,}]"
    keep, used = [], len(mark)
    for ch in text:
        used += 2 if ord(ch) > 0xFFFF else 1
        if used > limit:
            break
        keep.append(ch)
    return "".join(keep) + mark


class Formula(str):
    """The text of a live formula the program writes (``"=A1*2"``); any other text set in a
    sheet of :func:`new_workbook` is written as text (:func:`safe_text`)."""


def formula(text: str) -> Formula:
    """Mark ``text`` (with or without its leading ``=``) as a live formula of ours."""
    text = str(text)
    return Formula(text if text.startswith("=") else "=" + text)


def cell_value(v):
    """A cell value from a Python/numpy scalar: NaN and inf become empty cells, text is made
    safe (:func:`safe_text`), our own :class:`Formula` values are kept."""
    if v is None or isinstance(v, Formula):
        return v
    if isinstance(v, (bool, np.bool_)):
        return bool(v)
    if isinstance(v, (int, np.integer)):
        return int(v)
    if isinstance(v, (float, np.floating)):
        f = float(v)
        return f if math.isfinite(f) else None
    return safe_text(v)


class _SafeCell(Cell):
    """A cell whose every value goes through :func:`cell_value`."""

    __slots__ = ()

    @property
    def value(self):
        return self._value

    @value.setter
    def value(self, value):
        Cell.value.fset(self, cell_value(value))


class SafeWorksheet(Worksheet):
    """A worksheet whose cells are :class:`_SafeCell`: text from users is never a formula.

    openpyxl makes every cell of a sheet in ``_get_cell`` (``ws.cell``, ``ws["A1"]``) or in
    ``append``; both are taken over here.
    """

    def _get_cell(self, row: int, column: int):
        if not 0 < row <= SHEET_ROWS:
            raise ValueError(f"row {row}: a sheet has rows 1 to {SHEET_ROWS}")
        key = (row, column)
        if key not in self._cells:
            self._add_cell(_SafeCell(self, row=row, column=column))
        return self._cells[key]

    def append(self, iterable) -> None:
        row = self._current_row + 1
        for col, value in enumerate(iterable, start=1):
            self.cell(row=row, column=col, value=value)
        self._current_row = row


class SafeWorkbook(Workbook):
    """A workbook whose sheets are :class:`SafeWorksheet` (the first one included)."""

    def __init__(self) -> None:
        super().__init__()
        self._sheets = [SafeWorksheet(self)]

    def create_sheet(self, title: str | None = None, index: int | None = None):
        return new_sheet(self, title, index)


#: Rows of a sheet (Excel and LibreOffice: 1,048,576).
SHEET_ROWS = 1_048_576


def new_workbook() -> SafeWorkbook:
    """An empty workbook (no sheet yet) whose sheets neutralise text from users."""
    wb = SafeWorkbook()
    wb.remove(wb.active)
    return wb


def new_sheet(wb: Workbook, title: str | None = None, index: int | None = None):
    """A new :class:`SafeWorksheet` in any workbook ``wb`` (at ``index``, default the end)."""
    ws = SafeWorksheet(parent=wb, title=title)
    wb._add_sheet(ws, index)
    return ws


def check_sheets(wb: Workbook) -> None:
    """Refuse a workbook with a sheet not made by :func:`new_sheet` (a writer's bug: its text
    from users would not be neutralised).

    Raises
    ------
    TypeError
    """
    plain = [ws.title for ws in wb.worksheets if not isinstance(ws, SafeWorksheet)]
    if plain:
        raise TypeError(f"workbook: sheets {plain!r} were not made by report.sheets.new_sheet "
                        "or new_workbook; their text would not be neutralised")


def csv_text(frame) -> str:
    """CSV text of a DataFrame with every text field made safe (:func:`safe_text`), numbers
    written as numbers and non-finite numbers as empty fields."""
    out = frame.copy()
    out.columns = [safe_text(c) for c in out.columns]
    for j in range(out.shape[1]):
        col = out.iloc[:, j]
        if col.dtype.kind == "f":
            out.iloc[:, j] = col.where(np.isfinite(col.to_numpy()))
        elif col.dtype.kind not in "biu":
            out.iloc[:, j] = [_csv_field(v) for v in col.tolist()]
    return out.to_csv(index=False)


def _csv_field(v):
    if isinstance(v, (bool, np.bool_)) or v is None:
        return v
    if isinstance(v, (int, float, np.number)):
        return v if math.isfinite(float(v)) else None
    return safe_text(v)

# -- styles ---------------------------------------------------------------------------------
# openpyxl copies a style into the workbook's own table when a cell is given it; these objects
# are never changed, so every workbook can share them.
#: The body font's family: set on bold and title cells too, or an application may render
#: them in its own default (a serif) beside the body text.
FONT_NAME = "Calibri"
BOLD = Font(name=FONT_NAME, bold=True)
TITLE_FONT = Font(name=FONT_NAME, bold=True, size=14)
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
    if "reynolds" in h or "weber" in h or "[pa s]" in h or "[m^2/s]" in h:
        return "0.0000E+00"
    if h in ("run", "repeat", "speed index") or "runs needed" in h:
        return "0"
    if "[deg]" in h:
        return "0.0"
    if "[kn]" in h:
        return "0.00"
    if "[min]" in h or "[rpm]" in h:
        return "0"
    if "[degc]" in h:
        return "0.0"
    if "margin" in h:
        return "0.0%"
    return None


def _magnitude_format(m: float) -> str:
    """About four significant digits for a magnitude ``m`` > 0: fixed decimals (a coefficient
    of 0.0003 as 0.0003000), thousands separated from 10^5 up, scientific only beyond
    (below 1e-5, from 1e9)."""
    if m >= 1e9 or m < 1e-5:
        return "0.0000E+00"
    if m >= 1e5:
        return "#,##0"
    decimals = int(min(8, max(0, 3 - math.floor(math.log10(m)))))
    return "0" if decimals == 0 else "0." + "0" * decimals


def _spread(values) -> float:
    """Ratio of the largest to the smallest nonzero finite magnitude of a float column."""
    arr = np.asarray(values)
    if arr.dtype.kind != "f":
        return 1.0
    a = np.abs(arr[np.isfinite(arr) & (arr != 0)])
    return float(a.max() / a.min()) if a.size else 1.0


# -- small tables ---------------------------------------------------------------------------
def header_row(ws, row: int, headers: Iterable, col: int = 1) -> None:
    """Bold, shaded, wrapped header cells from column ``col`` on."""
    for j, h in enumerate(headers):
        c = ws.cell(row=row, column=col + j, value=str(h))
        c.font, c.fill, c.alignment, c.border = BOLD, HEADER_FILL, WRAP, HEADER_BORDER


def write_frame(ws, frame, row: int = 1, col: int = 1) -> tuple[int, int]:
    """Write a DataFrame with header, fitted number formats; returns (first, last) row.

    A frame of more than :data:`LONG_FRAME_ROWS` rows is written as a long table
    (:func:`long_table`, one number format per column): openpyxl's cells would take minutes
    and gigabytes for 10^5 rows.
    """
    if len(frame) > LONG_FRAME_ROWS:
        long_table(ws, frame, row, fit=False, first_column=col)
        return row + 1, row + len(frame)
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


# -- widths and wrapped rows ---------------------------------------------------------------
def fit_widths(ws, min_width: float = 8, max_width: float = MAX_WIDTH,
               sample: int = 200, rows: Iterable[int] | None = None) -> None:
    """Column widths from what the first ``sample`` rows (or the given ``rows``) show, within
    the bounds; titles (a font above the body size) spill over and do not count.

    Numbers count as wide as their number format shows them; wrapped texts (headers) as their
    longest word or a third of their length, whichever is more, so a long header takes up to
    three lines instead of a wide column.
    """
    widths: dict[int, float] = {}
    wanted = set(range(1, min(ws.max_row, sample) + 1) if rows is None else rows)
    # the cells that exist (ws[r] would make every missing one, and scan the sheet per row)
    for (r, _), c in list(ws._cells.items()):
        if r in wanted and c.value is not None and not (
                c.font is not None and c.font.sz and c.font.sz > BODY_FONT_SIZE):
            widths[c.column] = max(widths.get(c.column, 0), shown_width(c))
    for j, w in widths.items():
        ws.column_dimensions[get_column_letter(j)].width = max(min_width, min(max_width, w))


def shown_width(cell) -> float:
    """Width [characters] a cell needs to show its value whole, padding included."""
    v = cell.value
    if isinstance(v, bool):
        return 5
    if isinstance(v, (int, float)):
        return _number_width(float(v), cell.number_format) + 2
    text = str(v)
    if text.startswith("="):  # a formula: as wide as a formatted number
        return _number_width(1.0, cell.number_format) + 2
    if cell.alignment is not None and cell.alignment.wrap_text:
        longest = max((len(w) for w in text.split()), default=0)
        return max(longest, math.ceil(len(text) / 3)) + 2
    return max(len(line) for line in text.split("\n")) + 2


def _number_width(v: float, fmt: str) -> int:
    """Characters the number format ``fmt`` shows ``v`` in (an estimate)."""
    if "E" in fmt:
        return len(fmt) + (v < 0)
    if fmt in ("General", ""):
        return min(len(repr(v)), 11)
    if "%" in fmt:
        v *= 100.0
    main = fmt.split(";")[0].strip('"')
    decimals = len(main.split(".")[1].rstrip("%")) if "." in main else 0
    whole = len(f"{abs(v):.0f}")
    if "," in main:
        whole += (whole - 1) // 3
    return whole + decimals + (decimals > 0) + (v < 0) + ("%" in fmt)


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


def merge_text(ws, row: int, first: int, last: int) -> None:
    """Spread the text of cell (``row``, ``first``) over the columns ``first``..``last``:
    merged, wrapped, aligned to the top, the row as high as the wrapped text."""
    if last > first:
        ws.merge_cells(start_row=row, start_column=first, end_row=row, end_column=last)
    c = ws.cell(row=row, column=first)
    c.alignment = WRAP
    width = sum(ws.column_dimensions[get_column_letter(j)].width or DEFAULT_WIDTH
                for j in range(first, last + 1))
    lines = wrapped_lines(c.value or "", width)
    ws.row_dimensions[row].height = max(ws.row_dimensions[row].height or 0,
                                        lines * LINE_HEIGHT)


def wrap_rows(ws, rows: Iterable[int], columns: Sequence[int]) -> None:
    """Wrap the text of ``columns`` in ``rows`` and fit the row heights to it.

    The other cells of these rows are aligned to the top, level with the first text line.
    """
    for r in rows:
        for c in ws[r]:
            if c.value is not None:
                keep = c.alignment.horizontal if c.alignment is not None else None
                c.alignment = Alignment(wrap_text=c.column in columns, vertical="top",
                                        horizontal=keep)
        fit_row_height(ws, r)


# -- printing -------------------------------------------------------------------------------
#: Body font of the sheets [pt] (the application's default) and the smallest size a printed
#: page may show it at [pt]: the print scale never goes below their ratio.
BODY_FONT_SIZE = 11.0
SMALLEST_PRINTED_FONT = 8.0
#: Lowest print scale [%]: 75 % of 11 pt prints at 8.25 pt.
SMALLEST_SCALE = math.ceil(100.0 * SMALLEST_PRINTED_FONT / BODY_FONT_SIZE / 5.0) * 5
#: Page margins [inch]: left/right, top/bottom, and the header and footer distances.
MARGIN_SIDE, MARGIN_END, MARGIN_HEADER = 0.4, 0.75, 0.3
_POINTS_PER_MM = 72.0 / 25.4


#: Longest user text in a page header [characters]: Excel keeps 255 for a whole header.
HEADER_TEXT_LIMIT = 120


def _header_text(text: str) -> str:
    """Text for a page header or footer: characters XML forbids replaced, cut to
    :data:`HEADER_TEXT_LIMIT`, and ``&`` (which starts a code there) doubled."""
    return _cut(xml_text(text), HEADER_TEXT_LIMIT).replace("&", "&&")


#: Pixels per character of column width [px at 96 per inch]: a column's width counts the
#: digits of the default font, 7 px in Calibri 11 pt (Excel), 9.33 px in DejaVu Sans 11 pt, which
#: LibreOffice prints instead where neither Calibri nor its metric twin Carlito is installed.
#: The wider one is used, so a sheet set up to print at a readable scale stays readable in both.
COLUMN_CHARACTER_PIXELS = 9.33


def column_points(width: float | None) -> float:
    """Printed width [pt] at 100 % of a column ``width`` characters wide (the default when
    None): :data:`COLUMN_CHARACTER_PIXELS` per character plus 5 px of padding, at 96 px per
    inch."""
    w = DEFAULT_WIDTH if width is None else float(width)
    return (COLUMN_CHARACTER_PIXELS * w + 5.0) * 0.75


#: Average width of a character of the 11 pt body font [pt] of mixed text, in the wider of
#: the fonts it may print in (DejaVu Sans; Calibri is narrower), so a long line is never
#: thought shorter than it prints.
CHARACTER_POINTS = 6.4


def content_points(ws) -> float:
    """Printed width [pt] at 100 % of the used columns of ``ws``, of its charts and of any
    text that runs on past its cell into empty cells to the right (an application prints
    that text too, and widens the printed range for it)."""
    lefts = [0.0]
    for j in range(1, ws.max_column + 1):
        lefts.append(lefts[-1] + column_points(ws.column_dimensions[get_column_letter(j)].width))

    def left_of(col: int) -> float:
        if col < len(lefts):
            return lefts[col - 1]
        return lefts[-1] + (col - len(lefts)) * column_points(None)

    width = lefts[-1]
    for row in ws.iter_rows(max_row=min(ws.max_row, 500)):
        for c in row:
            if not isinstance(c.value, str) or c.value.startswith("=") or (
                    c.alignment is not None and c.alignment.wrap_text):
                continue
            right = ws._cells.get((c.row, c.column + 1))  # without creating the cell
            if right is not None and right.value is not None:
                continue  # cut at the next cell, not printed beyond it
            size = (c.font.sz if c.font is not None and c.font.sz else BODY_FONT_SIZE)
            longest = max(len(line) for line in c.value.split("\n"))
            width = max(width, left_of(c.column) + longest * CHARACTER_POINTS * size
                        / BODY_FONT_SIZE)
    for chart in getattr(ws, "_charts", ()):
        anchor = chart.anchor if isinstance(chart.anchor, str) else None
        if anchor is not None:
            col = column_index_from_string(re.match(r"[A-Z]+", anchor).group(0))
            width = max(width, left_of(col) + chart.width * 10.0 * _POINTS_PER_MM)
    return width


def printable_points(paper: str, orientation: str) -> float:
    """Width [pt] between the side margins of a sheet of ``paper`` in ``orientation``."""
    _, short, long = PAPER_SIZES[paper]
    across = short if orientation == "portrait" else long
    return across * _POINTS_PER_MM - 2.0 * MARGIN_SIDE * 72.0


def printable_height(paper: str, orientation: str) -> float:
    """Height [pt] between the top and bottom margins of a sheet of ``paper``."""
    _, short, long = PAPER_SIZES[paper]
    along = long if orientation == "portrait" else short
    return along * _POINTS_PER_MM - 2.0 * MARGIN_END * 72.0


def _row_points(ws, row: int) -> float:
    """Height [pt] of a row: its own, or :data:`LINE_HEIGHT` (a little more than the
    applications' default, so a page is never thought longer than it is)."""
    return ws.row_dimensions[row].height or LINE_HEIGHT


def _keep_charts_whole(ws, page_height: float, titles: float) -> None:
    """Page breaks before the charts that would otherwise be cut by the end of a page.

    ``page_height``: printable height [pt] at 100 %; ``titles``: height of the rows repeated
    at the top of every page after the first [pt].
    """
    charts = sorted((int(re.search(r"\d+", c.anchor).group(0)), c.height * 10.0 *
                     _POINTS_PER_MM) for c in getattr(ws, "_charts", ())
                    if isinstance(c.anchor, str))
    if not charts:
        return
    page_top, y, row = 1, 0.0, 1  # first row of the page, height used on it so far
    for top, height in charts:
        while row < top:
            y += _row_points(ws, row)
            row += 1
            if y > page_height:  # the application starts a new page at this row
                page_top, y = row - 1, titles + _row_points(ws, row - 1)
        if y + height > page_height and top > page_top:
            ws.row_breaks.append(Break(id=top - 2))  # the blank row above the chart too
            page_top, y = top, titles


def content_height(ws) -> float:
    """Printed height [pt] at 100 % of the rows of ``ws`` and of its charts."""
    height = sum(_row_points(ws, r) for r in range(1, ws.max_row + 1))
    tops = [0.0]
    for r in range(1, ws.max_row + 1):
        tops.append(tops[-1] + _row_points(ws, r))
    for chart in getattr(ws, "_charts", ()):
        if isinstance(chart.anchor, str):
            row = int(re.search(r"\d+", chart.anchor).group(0))
            top = tops[row - 1] if row - 1 < len(tops) else tops[-1] + (row - len(tops)) * \
                LINE_HEIGHT
            height = max(height, top + chart.height * 10.0 * _POINTS_PER_MM)
    return height


def _pages_and_scale(paper: str, orientation: str, width: float, height: float):
    """(estimated pages, -scale) of a sheet printed in ``orientation``: the key that orders
    the orientations, fewest pages first, then the larger print."""
    across = printable_points(paper, orientation)
    fit = across / max(width, 1.0)
    scale = min(1.0, fit) if fit * 100.0 >= SMALLEST_SCALE else SMALLEST_SCALE / 100.0
    wide = 1 if fit * 100.0 >= SMALLEST_SCALE else math.ceil(width * scale / across)
    long = math.ceil(height * scale / printable_height(paper, orientation))
    return wide * long, -scale


def print_setup(ws, page: PageSetup | None = None, title_rows: int | tuple[int, int] | None
                = None, title_columns: str | None = None) -> None:
    """Page setup of one sheet: paper, orientation, scale, repeated titles, header and footer.

    One page wide when that keeps the body font at :data:`SMALLEST_PRINTED_FONT` or more,
    otherwise at :data:`SMALLEST_SCALE` and as many pages wide as needed (``title_columns``,
    e.g. ``"A:A"`` for the run number, then repeat on each of them); portrait when the sheet
    is one page wide that way and prints on no more pages (nor smaller) than in landscape,
    landscape otherwise. ``title_rows`` (a
    row, or the first and last row) repeat on every printed page. The page header names the
    case, the sheet and "page x of y"; the footer the program, its version and the date
    printed.
    """
    page = page or PageSetup()
    code, _, _ = PAPER_SIZES[page.paper]
    ws.page_setup.paperSize = code
    width = content_points(ws)
    height = content_height(ws)
    upright = _pages_and_scale(page.paper, "portrait", width, height)
    across = _pages_and_scale(page.paper, "landscape", width, height)
    one_wide = printable_points(page.paper, "portrait") / max(width, 1.0) * 100.0 \
        >= SMALLEST_SCALE
    ws.page_setup.orientation = "portrait" if one_wide and upright <= across else "landscape"
    fit = printable_points(page.paper, ws.page_setup.orientation) / max(width, 1.0)
    if fit * 100.0 >= SMALLEST_SCALE:
        ws.sheet_properties.pageSetUpPr.fitToPage = True
        ws.page_setup.fitToWidth = 1
        ws.page_setup.fitToHeight = 0
        scale = min(1.0, fit)
    else:
        scale = SMALLEST_SCALE / 100.0
        ws.sheet_properties.pageSetUpPr.fitToPage = False
        ws.page_setup.scale = SMALLEST_SCALE
        if title_columns:
            ws.print_title_cols = title_columns
    titles = 0.0
    if title_rows is not None:
        first, last = (title_rows, title_rows) if isinstance(title_rows, int) else title_rows
        ws.print_title_rows = f"{first}:{last}"
        titles = sum(_row_points(ws, r) for r in range(first, last + 1))
    _keep_charts_whole(ws, printable_height(page.paper, ws.page_setup.orientation) / scale,
                       titles)
    m = ws.page_margins
    m.left = m.right = MARGIN_SIDE
    m.top = m.bottom = MARGIN_END
    m.header = m.footer = MARGIN_HEADER
    ws.oddHeader.left.text = _header_text(page.title)
    ws.oddHeader.center.text = "&A"
    ws.oddHeader.right.text = "page &P of &N"
    ws.oddFooter.left.text = _header_text(page.program)
    ws.oddFooter.right.text = "printed &D"


# -- charts ---------------------------------------------------------------------------------
#: Colours of chart series in order (RGB hex): blue, red, green, purple, orange, teal.
SERIES_COLOURS = ("4472C4", "C0504D", "9BBB59", "8064A2", "F79646", "4BACC6")
#: Chart size [cm]: fits across a portrait A4 or letter page at the smallest print scale.
CHART_WIDTH, CHART_HEIGHT = 16.0, 9.0
#: Rows a chart of :data:`CHART_HEIGHT` covers at the default row height (15 pt), plus one.
CHART_ROWS = math.ceil(CHART_HEIGHT * 10.0 * 72.0 / 25.4 / LINE_HEIGHT) + 1


def scatter_chart(title: str, x_title: str, y_title: str) -> ScatterChart:
    """An empty scatter chart, :data:`CHART_WIDTH` x :data:`CHART_HEIGHT` cm, with titled and
    visible axes."""
    chart = ScatterChart()
    chart.title = title
    chart.style = 13
    chart.x_axis.title = x_title
    chart.y_axis.title = y_title
    chart.height, chart.width = CHART_HEIGHT, CHART_WIDTH
    chart.legend.position = "b"  # below the plot: the plot keeps the chart's whole width
    # openpyxl hides axes by default in recent versions; show them.
    chart.x_axis.delete = False
    chart.y_axis.delete = False
    return chart


def add_series(chart, ws, x_col: int, y_col: int, first: int, last: int,
               title: str | int | None = None, points: bool = False,
               colour: str | None = None) -> Series:
    """Add the series ``y_col`` against ``x_col`` (rows ``first``..``last``) to ``chart``.

    ``title``: the series name, or the row of the cell holding it (e.g. the header row).
    ``points``: measured points, drawn as filled circles without a line (a marker without its
    own fill shows nothing when the line is off); otherwise a line without markers.
    ``colour``: RGB hex; default the next of :data:`SERIES_COLOURS`.
    """
    if isinstance(title, int):
        title = str(ws.cell(row=title, column=y_col).value)
    s = Series(Reference(ws, min_col=y_col, min_row=first, max_row=last),
               Reference(ws, min_col=x_col, min_row=first, max_row=last), title=title)
    colour = colour or SERIES_COLOURS[len(chart.series) % len(SERIES_COLOURS)]
    if points:
        s.marker.symbol = "circle"
        s.marker.size = 7
        s.marker.graphicalProperties = GraphicalProperties(solidFill=colour)
        s.marker.graphicalProperties.line.solidFill = colour
        s.graphicalProperties.line.noFill = True
    else:
        s.marker.symbol = "none"
        s.graphicalProperties.line.solidFill = colour
        s.graphicalProperties.line.width = 22225  # 1.75 pt in EMU
    s.smooth = False
    chart.series.append(s)
    return s


def chart_below(ws, chart, last_row: int, gap: int = 2) -> int:
    """Anchor ``chart`` in column A, ``gap`` rows below ``last_row``; returns the first free
    row under it (charts sit below their tables, so a sheet prints at a readable width)."""
    top = last_row + gap
    ws.add_chart(chart, f"A{top}")
    return top + CHART_ROWS


# -- label-value pairs and audit formulas ---------------------------------------------------
def write_pairs(ws, pairs: Iterable[tuple[str, object]], row: int = 1,
                title: str | None = None) -> int:
    """Labels in column A (bold) and their values in B, under an optional bold ``title``;
    numbers formatted by their label's quantity and magnitude, lists joined with commas.

    Returns
    -------
    int
        The row after the block and one blank row.
    """
    if title:
        ws.cell(row=row, column=1, value=title).font = TITLE_FONT
        row += 1
    for label, value in pairs:
        if isinstance(value, (tuple, list)):
            value = ", ".join(f"{v:g}" if isinstance(v, float) else str(v) for v in value)
        ws.cell(row=row, column=1, value=str(label)).font = BOLD
        c = ws.cell(row=row, column=2, value=cell_value(value))
        if isinstance(c.value, bool):
            c.number_format = BOOLEAN_FORMAT
        elif isinstance(c.value, (int, float)):
            c.number_format = value_format(str(label), c.value)
        c.alignment = LEFT if not isinstance(c.value, str) else WRAP
        row += 1
    return row + 1


#: Widest [characters] a merged text of label-value rows spreads over the columns of a table
#: below it: less than a landscape page at the smallest print scale, so it prints whole.
PAIR_TEXT_WIDTH = 100


def fit_pairs(ws, first: int, last: int, last_column: int) -> None:
    """Fit label-value rows ``first``..``last`` above a wider table: column A as wide as the
    labels, column B as wide as the numbers, and each text value spread over columns B to
    ``last_column`` at most (merged, wrapped, the row as high as its text; no wider than
    :data:`PAIR_TEXT_WIDTH`) instead of widening column B for every row of the table."""
    label_cells = [ws.cell(row=r, column=1) for r in range(first, last + 1)]
    widen(ws, {"A": min(MAX_WIDTH, max((shown_width(c) for c in label_cells
                                        if c.value is not None and (c.font.sz or 0)
                                        <= BODY_FONT_SIZE), default=0))})
    numbers = [shown_width(ws.cell(row=r, column=2)) for r in range(first, last + 1)
               if isinstance(ws.cell(row=r, column=2).value, (int, float))]
    widen(ws, {"B": max(numbers, default=0)})
    end, span = 2, 0.0
    for j in range(2, last_column + 1):
        w = ws.column_dimensions[get_column_letter(j)].width or DEFAULT_WIDTH
        if j > 2 and span + w > PAIR_TEXT_WIDTH:
            break
        end, span = j, span + w
    for r in range(first, last + 1):
        c = ws.cell(row=r, column=2)
        if not isinstance(c.value, str) or (ws.cell(row=r, column=1).font.sz or 0
                                            ) > BODY_FONT_SIZE:
            continue
        if end > 2:
            ws.merge_cells(start_row=r, start_column=2, end_row=r, end_column=end)
        c.alignment = WRAP
        ws.cell(row=r, column=1).alignment = TOP
        lines = wrapped_lines(c.value, span)
        if lines > 1:
            ws.row_dimensions[r].height = lines * LINE_HEIGHT


def finish_table(ws, header: int, last: int, pairs: tuple[int, int] | None = None) -> None:
    """Column widths from a table (header row ``header`` to ``last``), its header row as high
    as its wrapped text, and the label-value rows ``pairs`` (first, last) above it fitted
    around the table's columns."""
    fit_widths(ws, rows=range(header, last + 1))
    fit_row_height(ws, header)
    if pairs is not None and pairs[1] >= pairs[0]:
        fit_pairs(ws, *pairs, ws.max_column)


def audit_formulas(ws, columns: Sequence[str], first: int, last: int,
                   formulas: Sequence[tuple[str, str]],
                   constants: Sequence[tuple[str, float]]) -> None:
    """Spreadsheet formulas beside a written table, so a reader can audit a step in place.

    Parameters
    ----------
    ws : worksheet
    columns : sequence of str
        Headers of the written table (column A onwards, header row ``first - 1``).
    first, last : int
        First and last data rows.
    formulas : sequence of (header, template)
        ``template`` uses ``{header}`` of a column of the same row, ``{$name}`` of a
        constant and ``{@header}`` of an earlier formula column of the same row; the formula
        columns take the number format of the table's last numeric column of the same name
        pattern (scientific for coefficients, by :func:`number_format`).
    constants : sequence of (name, value)
        Written in a small block to the right and referenced absolutely.
    """
    letters = {name: get_column_letter(j + 1) for j, name in enumerate(columns)}
    n = len(columns)
    c_const = n + len(formulas) + 2
    const_ref = {}
    for r, (name, value) in enumerate(constants, start=first):
        ws.cell(row=r, column=c_const, value=name).font = BOLD
        c = ws.cell(row=r, column=c_const + 1, value=cell_value(value))
        if isinstance(c.value, float):
            c.number_format = value_format(name, c.value)
        const_ref[name] = f"${get_column_letter(c_const + 1)}${r}"
    own = {}
    header_row(ws, first - 1, [h for h, _ in formulas], n + 1)
    for k, (header, _) in enumerate(formulas):
        own[header] = get_column_letter(n + 1 + k)
    pattern = re.compile(r"\{([$@]?)([^{}]+)\}")

    def text(template: str, r: int) -> str:
        def ref(m):
            kind, name = m.group(1), m.group(2)
            if kind == "$":
                return const_ref[name]
            if kind == "@":
                return f"{own[name]}{r}"
            return f"{letters[name]}{r}"

        return pattern.sub(ref, template)

    table = next((t for t in sheet_long_tables(ws)
                  if t.first_row == first and t.last_row == last), None)
    for k, (header, template) in enumerate(formulas):
        if table is not None:  # a long table: the formula column is written with its rows
            tmpl = ws.cell(row=first, column=n + 1 + k, value=0)
            tmpl.number_format = _formula_format(header)
            table.add_formula(n + 1 + k, tmpl.style_id,
                              lambda r, template=template: text(template, r))
            continue
        for r in range(first, last + 1):
            c = ws.cell(row=r, column=n + 1 + k, value=formula(text(template, r)))
            c.number_format = _formula_format(header)


def _formula_format(header: str) -> str:
    """Number format of an audit-formula column: by its quantity, else four significant
    digits of a coefficient (about 1e-3) or a power [kW] (about 1e3)."""
    fmt = _quantity_format(header)
    if fmt is not None:
        return fmt
    return "0.0" if "[kw]" in header.lower() else "0.000000"


# -- long tables written as raw sheet XML --------------------------------------------------
#: Frames longer than this [rows] are written by :func:`write_frame` as a long table.
LONG_FRAME_ROWS = 500
#: Rows of long tables generated and compressed at a time (bounds the memory of a write).
CHUNK_ROWS = 5000


@dataclass
class LongTable:
    """Rows to write into a sheet after openpyxl has saved the package.

    ``columns`` holds (column letter, kind, style id, data) per column; kind is "num", "int",
    "bool", "str", or "formula" (data: row -> formula text without "="). Floats are written
    exactly (``repr``), or with ``float_digits`` significant digits. A sheet may hold several
    long tables (side by side or one below another) and any cells openpyxl wrote in or below
    their rows: :func:`write_long_tables` merges them row by row.
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

    def add_formula(self, column: int, style: int, formula: Callable[[int], str]) -> None:
        """A further column (1-based ``column``) holding the formula ``formula(row)``."""
        self.columns.append((get_column_letter(column), "formula", style, formula))

    @property
    def last_row(self) -> int:
        return self.first_row + self.nrows - 1


def sheet_long_tables(ws) -> list[LongTable]:
    """The long tables registered on ``ws`` (written by :func:`save_workbook`)."""
    return ws.__dict__.setdefault("similitude_long_tables", [])


def long_table(ws, frame, header_row_number: int, formats: dict[str, str] | None = None,
               fit: bool = True, float_digits: int | None = None,
               first_column: int = 1) -> LongTable:
    """Header via openpyxl, one template row for the styles (holding the first row's values,
    so widths fit them); rows written by :func:`write_long_tables` after saving.

    ``formats`` overrides the fitted number format of the columns it names; ``fit`` sets the
    column widths from the headers and texts and a three-line header row; ``float_digits``
    (e.g. 16, as openpyxl writes numbers) rounds the floats written, which are otherwise exact;
    ``first_column`` (1-based) is where the table starts. The table is registered on the sheet
    (:func:`sheet_long_tables`) and returned.
    """
    header_row(ws, header_row_number, list(frame.columns), first_column)
    table = LongTable(ws, header_row_number + 1, nrows=len(frame), float_digits=float_digits)
    for j, name in enumerate(frame.columns, start=first_column):
        values = frame[name].to_numpy()
        kind, fmt = _column_kind(str(name), values)
        if formats and name in formats:
            fmt = formats[name]
        first = values[0] if len(values) and kind != "str" else 0
        tmpl = ws.cell(row=header_row_number + 1, column=j, value=cell_value(first))
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
    sheet_long_tables(ws).append(table)
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


def save_workbook(wb, path: pathlib.Path, tables: Sequence[LongTable] = ()) -> None:
    """Save ``wb`` to ``path`` and write the rows of its long tables into it (those given and
    those registered on its sheets).

    Every sheet must come from :func:`new_sheet` (:func:`check_sheets`). ``path`` is
    normally the temporary file of :mod:`similitude.report.atomic`; no other file is made.
    """
    check_sheets(wb)
    wb.save(path)
    write_long_tables(path, wb, list(tables))


def write_long_tables(path: pathlib.Path, wb, tables: list[LongTable]) -> None:
    """Write the rows of the long tables into the saved file (those given and those
    registered on the workbook's sheets), merged with the cells openpyxl wrote in their rows.

    The file is rewritten in place from a copy of its package in memory (small: the long
    tables hold one template row each until now), so no second file is made beside it; the
    rows are generated and compressed :data:`CHUNK_ROWS` at a time.
    """
    by_part: dict[str, list[LongTable]] = {}
    for t in [*tables, *(t for ws in wb.worksheets for t in sheet_long_tables(ws))]:
        part = f"xl/worksheets/sheet{wb.worksheets.index(t.sheet) + 1}.xml"
        if not any(t is other for other in by_part.get(part, ())):
            by_part.setdefault(part, []).append(t)
    if not by_part:
        return
    package = io.BytesIO(pathlib.Path(path).read_bytes())
    with zipfile.ZipFile(package) as zin, zipfile.ZipFile(path, "w", zipfile.ZIP_DEFLATED,
                                                          compresslevel=1) as zout:
        for item in zin.infolist():
            data = zin.read(item.filename)
            if item.filename not in by_part:
                zout.writestr(item, data)
                continue
            with zout.open(item.filename, "w") as out:
                for piece in _sheet_with_rows(data.decode("utf-8"), by_part[item.filename]):
                    out.write(piece.encode("utf-8"))


_ROW = re.compile(r'<row r="(\d+)"([^>]*?)(/>|>(.*?)</row>)', re.S)
_CELL = re.compile(r'<c r="([A-Z]+)\d+"[^>]*?(?:/>|>.*?</c>)', re.S)


def _sheet_with_rows(xml: str, tables: list[LongTable]):
    """Pieces of the sheet XML with the tables' rows merged in (a generator)."""
    start = xml.find("<sheetData")
    open_end = xml.index(">", start) + 1
    if xml[open_end - 2] == "/":  # <sheetData/>: openpyxl wrote no row
        head, body, tail = xml[:start] + "<sheetData>", "", "</sheetData>" + xml[open_end:]
    else:
        close = xml.index("</sheetData>", open_end)
        head, body, tail = xml[:open_end], xml[open_end:close], xml[close:]
    cut = min(t.first_row for t in tables)
    kept, extras, attrs = [], {}, {}
    for m in _ROW.finditer(body):
        r = int(m.group(1))
        if r < cut:
            kept.append(m.group(0))
            continue
        attrs[r] = m.group(2)
        extras[r] = {column_index_from_string(c.group(1)): c.group(0)
                     for c in _CELL.finditer(m.group(4) or "")}
    last = max([t.last_row for t in tables] + list(extras))
    width = max([column_index_from_string(c[0]) for t in tables for c in t.columns]
                + [max(cells) for cells in extras.values() if cells])
    yield _with_dimension(head, get_column_letter(width), last)
    yield "".join(kept)
    tables = sorted(tables, key=lambda t: column_index_from_string(t.columns[0][0]))
    spans = [(t, {column_index_from_string(c[0]) for c in t.columns}) for t in tables]
    for a in range(cut, last + 1, CHUNK_ROWS):
        b = min(a + CHUNK_ROWS, last + 1)
        yield _rows_between(a, b, spans, extras, attrs)
    yield tail


def _with_dimension(head: str, last_column: str, last_row: int) -> str:
    return re.sub(r'<dimension ref="[^"]*"\s*/>', f'<dimension ref="A1:{last_column}{last_row}"/>',
                  head, count=1)


def _rows_between(a: int, b: int, spans, extras: dict, attrs: dict) -> str:
    """The XML of rows a to b - 1: the tables' cells and the cells openpyxl wrote there."""
    parts: dict[int, list[str]] = {}
    covered: dict[int, set[int]] = {}
    for t, cols in spans:
        lo, hi = max(a, t.first_row), min(b, t.last_row + 1)
        if lo >= hi:
            continue
        rows = range(lo, hi)
        offset = lo - t.first_row
        digits = t.float_digits
        float_text = repr if digits is None else (lambda v, d=digits: f"{v:.{d}g}")
        cells = [_cell_xml(letter, kind, style,
                           data if kind == "formula" else data[offset:offset + len(rows)],
                           rows, float_text)
                 for letter, kind, style, data in t.columns]
        for r, row_cells in zip(rows, zip(*cells, strict=True), strict=True):
            parts.setdefault(r, []).append("".join(row_cells))
            covered.setdefault(r, set()).update(cols)
    out = []
    for r in range(a, b):
        own = extras.get(r)
        if r not in parts and own is None:
            continue
        text = "".join(parts.get(r, ()))
        if own:
            cover = covered.get(r, set())
            rest = {c: x for c, x in own.items() if c not in cover}
            if rest:
                text = _merge_cells(text, rest)
        out.append(f'<row r="{r}"{attrs.get(r, "")}>{text}</row>')
    return "".join(out)


def _merge_cells(table_text: str, rest: dict[int, str]) -> str:
    """The cells of a row in column order: a table's cells and the others of the row."""
    cells = {column_index_from_string(m.group(1)): m.group(0)
             for m in _CELL.finditer(table_text)}
    cells.update(rest)
    return "".join(cells[c] for c in sorted(cells))


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
            out.append(f'<c r="{letter}{r}"{s} t="inlineStr"><is><t xml:space="preserve">'
                       f"{_escape(safe_text(v))}</t></is></c>")
    return out


def _escape(text: str) -> str:
    """``&``, ``<`` and ``>`` as XML entities (quotes need none in element text)."""
    return html.escape(text, quote=False)

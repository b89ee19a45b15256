"""Sheet helpers shared by the workbook writers (similitude.report.sheets): number formats,
wrapped rows, small tables and long tables written as sheet XML.

The written workbooks are read back with openpyxl, the outside reader of the format here.
"""

import math

import numpy as np
import openpyxl
import openpyxl.utils
import pandas as pd
import pytest

from similitude.errors import InputError
from similitude.report import page, sheets


def test_number_format_follows_the_quantity():
    assert sheets.number_format("model Reynolds number [-]") == "0.0000E+00"
    assert sheets.number_format("run") == "0"
    assert sheets.number_format("prototype speed [kn]") == "0.00"
    assert sheets.number_format("model speed [m/s]", np.array([1.2, 3.4])) == "0.000"
    assert sheets.number_format("run distance [m]", np.array([150.0, 190.0])) == "0.0"


def test_weber_numbers_get_a_scientific_format():
    assert "E+" in sheets.number_format("model Weber number [-]")


def test_a_short_text_takes_one_line():
    assert sheets.wrapped_lines("short", 40) == 1


def test_a_long_text_takes_at_least_its_length_over_the_width_in_lines():
    text = "word " * 60  # 300 characters
    assert sheets.wrapped_lines(text, 50) >= 300 // 50


def test_each_line_break_starts_a_new_line():
    assert sheets.wrapped_lines("a\nb\nc", 40) == 3


@pytest.mark.parametrize("value, cell", [(np.float64(2.5), 2.5), (float("nan"), None),
                                         (math.inf, None), (np.int64(3), 3),
                                         (np.bool_(True), True), ("text", "text"),
                                         (None, None)])
def test_cell_values_are_plain_python_and_non_finite_numbers_are_empty(value, cell):
    got = sheets.cell_value(value)
    assert got == cell and type(got) is type(cell)


def _saved(wb, tables, path):
    wb.save(path)
    sheets.write_long_tables(path, wb, tables)
    return openpyxl.load_workbook(path)


def test_a_long_table_holds_every_row_with_its_column_format(tmp_path):
    wb = openpyxl.Workbook()
    ws = wb.active
    frame = pd.DataFrame({"run": np.arange(1, 1001),
                          "model speed [m/s]": np.linspace(0.5, 3.0, 1000),
                          "run feasible": np.arange(1000) % 2 == 0,
                          "wave": ["regular" if i % 3 else "" for i in range(1000)]})
    table = sheets.long_table(ws, frame, 1)
    back = _saved(wb, [table], tmp_path / "long.xlsx").active
    assert back.max_row == 1001
    assert [c.value for c in back[1]] == list(frame.columns)
    assert [c.value for c in back[501]] == [500, frame["model speed [m/s]"][499], False,
                                            "regular"]
    assert back["A2"].number_format == "0" and back["C2"].number_format == sheets.BOOLEAN_FORMAT
    assert back["D2"].value is None  # an empty text is an empty cell


def test_long_table_floats_are_exact_unless_digits_are_given(tmp_path):
    # 0.1 + 0.2 needs 17 significant digits to read back as the same double (IEEE 754)
    x = 0.1 + 0.2
    wb = openpyxl.Workbook()
    exact = sheets.long_table(wb.active, pd.DataFrame({"x": [x]}), 1)
    rounded = sheets.long_table(wb.create_sheet("rounded"), pd.DataFrame({"x": [x]}), 1,
                                float_digits=16)
    back = _saved(wb, [exact, rounded], tmp_path / "digits.xlsx")
    assert back.active["A2"].value == x
    assert back["rounded"]["A2"].value == 0.3


def test_a_long_table_column_can_be_a_formula_of_its_row(tmp_path):
    wb = openpyxl.Workbook()
    table = sheets.long_table(wb.active, pd.DataFrame({"a": [1.0, 2.0], "twice a": [0.0, 0.0]}),
                              1)
    table.set_formula(1, lambda r: f"2*A{r}")
    back = _saved(wb, [table], tmp_path / "formula.xlsx").active
    assert [back["B2"].value, back["B3"].value] == ["=2*A2", "=2*A3"]


def test_a_label_row_puts_the_label_in_a_and_the_value_beside_it():
    ws = openpyxl.Workbook().active
    assert sheets.label_row(ws, 3, "scale ratio lambda [-]", 25.0, "0.000") == 4
    assert ws["A3"].value == "scale ratio lambda [-]" and ws["A3"].font.bold
    assert ws["B3"].value == 25.0 and ws["B3"].number_format == "0.000"
    assert ws["B3"].alignment.horizontal == "left"


def test_wrapped_rows_are_high_enough_for_their_text():
    ws = openpyxl.Workbook().active
    ws.column_dimensions["B"].width = 30
    ws["A1"], ws["B1"] = "topic", "word " * 40
    sheets.wrap_rows(ws, [1], (2,))
    assert ws["B1"].alignment.wrap_text and ws["A1"].alignment.vertical == "top"
    assert ws.row_dimensions[1].height >= sheets.wrapped_lines(ws["B1"].value, 30) * \
        sheets.LINE_HEIGHT


# -- printing --------------------------------------------------------------------------------
def _sheet_with_columns(widths):
    wb = openpyxl.Workbook()
    ws = wb.active
    for j, w in enumerate(widths, start=1):
        ws.cell(row=1, column=j, value=f"column {j}")
        ws.column_dimensions[openpyxl.utils.get_column_letter(j)].width = w
    return ws


def test_a_narrow_sheet_prints_portrait_one_page_wide():
    ws = _sheet_with_columns([12, 12, 12])
    sheets.print_setup(ws, page.PageSetup("case"), 1)
    assert ws.page_setup.orientation == "portrait"
    assert ws.sheet_properties.pageSetUpPr.fitToPage
    assert (ws.page_setup.fitToWidth, ws.page_setup.fitToHeight) == (1, 0)
    assert ws.print_title_rows == "$1:$1"


def test_a_sheet_too_wide_for_one_readable_page_prints_at_the_smallest_readable_scale():
    # 8 pt / 11 pt = 73 %: a 11 pt body font printed at 75 % is 8.25 pt
    ws = _sheet_with_columns([20] * 30)
    sheets.print_setup(ws, page.PageSetup("case"), 1, "A:A")
    assert ws.page_setup.orientation == "landscape"
    assert not ws.sheet_properties.pageSetUpPr.fitToPage
    assert ws.page_setup.scale == 75 and 75 * 11 / 100 >= 8
    assert ws.print_title_cols == "$A:$A"  # the run number on every page across


def test_a_column_of_width_w_prints_as_w_digits_of_the_wider_font_plus_5_pixels():
    # Column width: characters of the maximum digit width of the default font plus 5 px
    # padding; 96 px per inch, 72 pt per inch (ECMA-376 Part 1, 18.3.1.13 col width; from
    # memory). The digit is 7 px in Calibri 11 pt and 9.33 px in DejaVu Sans 11 pt (advance
    # 0.636 em of 14.67 px = 9.33 px), the font LibreOffice prints without Calibri/Carlito.
    assert sheets.column_points(10) == pytest.approx((9.33 * 10 + 5) * 72 / 96)
    assert sheets.column_points(10) > (7 * 10 + 5) * 72 / 96


@pytest.mark.parametrize("paper, width_mm", [("A4", 297.0), ("letter", 279.4)])
def test_printable_width_is_the_paper_less_its_side_margins(paper, width_mm):
    # ISO 216 A4 210 x 297 mm; ANSI letter 8.5 x 11 in (215.9 x 279.4 mm)
    expected = width_mm / 25.4 * 72 - 2 * sheets.MARGIN_SIDE * 72
    assert sheets.printable_points(paper, "landscape") == pytest.approx(expected)


def test_the_page_header_escapes_an_ampersand_in_the_case_name():
    # '&' starts a code in a header ('&&' prints one '&'; ECMA-376 Part 1, 18.3.1.46)
    ws = _sheet_with_columns([10])
    sheets.print_setup(ws, page.PageSetup("Hull & propeller"))
    assert ws.oddHeader.left.text == "Hull && propeller"


def test_an_unknown_paper_size_is_an_input_error_naming_the_field():
    with pytest.raises(InputError, match=r"paper: 'A3' .*expected one of A4, letter"):
        page.PageSetup("case", paper="A3")


def test_paper_names_are_read_in_any_case():
    assert page.PageSetup("case", paper="LETTER").paper == "letter"
    assert page.PageSetup("case", paper="a4").paper == "A4"


# -- widths, pairs, series -------------------------------------------------------------------
def test_a_number_column_is_as_wide_as_its_format_shows_the_number():
    wb = openpyxl.Workbook()
    ws = wb.active
    c = ws.cell(row=1, column=1, value=1234.5678)
    c.number_format = "0.00"  # shows 1234.57: 7 characters
    sheets.fit_widths(ws, min_width=1)
    assert ws.column_dimensions["A"].width == 7 + 2


def test_a_wrapped_header_takes_up_to_three_lines_instead_of_a_wide_column():
    wb = openpyxl.Workbook()
    ws = wb.active
    sheets.header_row(ws, 1, ["blockage speed correction dV/V [-]"])  # 34 characters
    sheets.fit_widths(ws, min_width=1)
    assert ws.column_dimensions["A"].width == math.ceil(34 / 3) + 2


def test_label_value_pairs_format_numbers_by_their_label():
    wb = openpyxl.Workbook()
    ws = wb.active
    nxt = sheets.write_pairs(ws, [("ship speed [kn]", 10.0000016648444),
                                  ("form factor k [-]", 0.180355114250131),
                                  ("Froude range [-]", (0.1, 0.2))], 1, "Summary")
    assert nxt == 6
    assert ws["B2"].number_format == "0.00"
    assert ws["B3"].number_format == "0.0000"   # four significant digits
    assert ws["B4"].value == "0.1, 0.2"


def test_measured_points_are_filled_markers_without_a_line():
    wb = openpyxl.Workbook()
    ws = wb.active
    for r in range(1, 4):
        ws.append([r, r * r])
    ch = sheets.scatter_chart("t", "x", "y")
    s = sheets.add_series(ch, ws, 1, 2, 1, 3, "measured", points=True)
    assert s.marker.symbol == "circle"
    assert s.marker.graphicalProperties.solidFill is not None
    assert s.graphicalProperties.line.noFill
    line = sheets.add_series(ch, ws, 1, 2, 1, 3, "fit")
    assert line.marker.symbol is None and not line.graphicalProperties.line.noFill

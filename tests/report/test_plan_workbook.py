"""The test-plan workbook (similitude.report.plan_workbook): sheets, formats, safety of the
write."""

import re
import zipfile

import numpy as np
import openpyxl
import pytest

import similitude as sim
from similitude.cautions import plan_caution
from similitude.errors import InputError
from similitude.planning.case import (
    Case,
    FluidSpec,
    MatchRequest,
    MatrixSpec,
    Prototype,
    WaveCondition,
)
from similitude.planning.facilities import Facility
from similitude.report import plan_workbook, sheets


def _tank_case(**matrix):
    fac = Facility("towing_tank", "test tank (invented)", 200.0, 7.0, 4.0, (0.1, 8.0),
                   acceleration=0.5)
    proto = Prototype("surface_ship", 100.0, (5.0, 7.0, 9.0), FluidSpec("sea_water", 288.15),
                      dimensions={"midship_area": 60.0, "wetted_surface": 2500.0})
    spec = MatrixSpec(waves=(WaveCondition("regular", period=8.0, steepness=1 / 50),),
                      repeats=2, **matrix)
    return Case(proto, fac, request=MatchRequest(scale=25.0), matrix=spec,
                metadata={"project": "invented test case"}, name="tank case")


@pytest.fixture(scope="module")
def plan():
    return sim.plan(_tank_case())


@pytest.fixture(scope="module")
def written(plan, tmp_path_factory):
    path = tmp_path_factory.mktemp("wb") / "plan.xlsx"
    out = plan_workbook.write_plan(plan, path)
    return out, openpyxl.load_workbook(out)


def test_write_plan_returns_the_path_it_wrote(written, tmp_path_factory):
    path, _ = written
    assert path.name == "plan.xlsx" and path.is_file()


def test_workbook_has_all_sheets(written):
    _, wb = written
    for name in plan_workbook.SHEET_NAMES:
        assert name in wb.sheetnames


def test_overview_states_scale_binding_constraint_and_cautions(written, plan):
    _, wb = written
    ws = wb["Overview"]
    values = {ws.cell(row=r, column=1).value: ws.cell(row=r, column=2).value
              for r in range(1, ws.max_row + 1)}
    assert values["scale"] == "1:25"
    assert values["binding constraint"] == plan.binding_constraint
    assert values["test conditions (rows of the Runs sheet) [-]"] == len(plan.matrix)
    assert values["runs needed [-]"] == plan.matrix["runs needed [-]"].sum()
    caution = values["cautions"]
    for words in ("estimates", "validity ranges", "ITTC", "class rules", "local codes",
                  "licensed practice"):
        assert words in caution


def test_runs_sheet_holds_the_whole_matrix(written, plan):
    _, wb = written
    ws = wb["Runs"]
    m = plan.matrix
    assert [c.value for c in ws[1]] == list(m.columns)
    assert ws.max_row == len(m) + 1
    col = list(m.columns).index("model speed [m/s]") + 1
    got = [ws.cell(row=r, column=col).value for r in range(2, len(m) + 2)]
    np.testing.assert_allclose(got, m["model speed [m/s]"], rtol=1e-15)
    col = list(m.columns).index("loading") + 1
    assert ws.cell(row=2, column=col).value == m["loading"].iloc[0]


def test_runs_sheet_has_frozen_header_filter_and_fitted_formats(written, plan):
    _, wb = written
    ws = wb["Runs"]
    assert ws.freeze_panes == "B2"
    n = len(plan.matrix.columns)
    assert ws.auto_filter.ref == f"A1:{openpyxl.utils.get_column_letter(n)}{len(plan.matrix) + 1}"
    heads = [c.value for c in ws[1]]
    re_col = heads.index("model Reynolds number [-]") + 1
    assert "E+" in ws.cell(row=2, column=re_col).number_format
    kn_col = heads.index("prototype speed [kn]") + 1
    assert ws.cell(row=2, column=kn_col).number_format == "0.00"
    for j in range(1, n + 1):
        assert ws.column_dimensions[openpyxl.utils.get_column_letter(j)].width >= 10


def test_every_run_header_carries_a_unit(written):
    _, wb = written
    ids = {"run", "repeat", "loading", "speed index", "spectrum", "wave", "wave kind",
           "run feasible"}
    for h in (c.value for c in wb["Runs"][1]):
        assert h in ids or re.search(r"\[[^\]]*\]$", h), h


def test_similarity_sheet_lists_groups_and_conflicts(written, plan):
    _, wb = written
    ws = wb["Similarity"]
    assert [c.value for c in ws[1] if c.value] == [
        "group", "symbol", "prototype speed [kn]", "prototype value", "model value", "ratio",
        "matched", "requested"]  # speeds in the case's unit; no internal key column
    texts = [ws.cell(row=r, column=1).value for r in range(1, ws.max_row + 1)]
    assert "Unmatched groups at the design speed: what they cost" in texts
    names = dict(zip(plan.groups["key"], plan.groups["group"], strict=True))
    for c in plan.conflicts:
        assert names[c.group] in texts
        assert c.consequence in [ws.cell(row=r, column=2).value for r in range(1, ws.max_row + 1)]


def test_conflict_rows_share_the_columns_of_the_groups_table(written, plan):
    # one layout: the conflict's values sit under "prototype value", "model value", "ratio"
    _, wb = written
    ws = wb["Similarity"]
    heads = [c.value for c in ws[1]]
    c = plan.conflicts[0]
    name = plan.groups.loc[plan.groups["key"] == c.group, "group"].iloc[0]
    (r,) = [r for r in range(len(plan.groups) + 2, ws.max_row + 1)
            if ws.cell(row=r, column=1).value == name]
    assert ws.cell(row=r, column=heads.index("prototype value") + 1).value == pytest.approx(
        c.prototype_value)
    assert ws.cell(row=r, column=heads.index("ratio") + 1).value == pytest.approx(c.ratio)


def test_checks_sheet_shows_margins(written, plan):
    _, wb = written
    ws = wb["Facility checks"]
    heads = [c.value for c in ws[1]]
    mcol = heads.index("margin [-]") + 1
    for i, c in enumerate(plan.checks):
        got = ws.cell(row=2 + i, column=mcol).value
        if np.isfinite(c.margin):
            assert got == pytest.approx(c.margin)
    assert ws.cell(row=2, column=mcol).number_format == "0.0%"


def test_scaling_sheet_has_factors_and_a_live_worked_example(written, plan):
    _, wb = written
    ws = wb["Scaling"]
    heads = [c.value for c in ws[1]]
    fcol = heads.index("factor (prototype/model)") + 1
    ex = heads.index("model value (enter)") + 1
    # the length factor is lambda (Froude scale factors, published facts sec. 0)
    assert ws.cell(row=2, column=fcol).value == pytest.approx(25.0)
    formula = ws.cell(row=2, column=ex + 1).value
    assert formula.startswith("=") and "*" in formula


def test_fluids_sheet_lists_both_fluids(written, plan):
    _, wb = written
    ws = wb["Fluids"]
    assert ws.cell(row=1, column=2).value == "prototype: sea water"  # the human label
    rows = {ws.cell(row=r, column=1).value: ws.cell(row=r, column=3).value
            for r in range(2, ws.max_row + 1)}
    assert rows["density [kg/m^3]"] == pytest.approx(float(plan.model_fluid.density_si))


def test_test_day_sheet_has_one_input_and_live_formulas(written, plan):
    _, wb = written
    ws = wb[plan_workbook.TEST_DAY_SHEET]
    t = float(plan.model_fluid.temperature_si) - 273.15
    assert ws[plan_workbook.TEMPERATURE_CELL].value == pytest.approx(t)
    for ref in (plan_workbook.KELVIN_CELL, plan_workbook.DENSITY_CELL, plan_workbook.VISCOSITY_CELL,
                plan_workbook.KINEMATIC_CELL):
        assert str(ws[ref].value).startswith("=")
    first = plan_workbook.TEST_DAY_HEADER_ROW + 1
    assert str(ws[f"C{first}"].value).startswith("=")
    assert "LOG10" in str(ws[f"D{first}"].value)
    assert ws.freeze_panes == f"A{first}"
    assert "TestDayTemperature" in wb.defined_names


def test_workbook_contains_native_charts(written):
    path, _ = written
    with zipfile.ZipFile(path) as z:
        charts = [n for n in z.namelist() if n.startswith("xl/charts/chart")]
    assert len(charts) >= 1


def test_existing_file_is_not_overwritten(plan, tmp_path):
    path = tmp_path / "keep.xlsx"
    path.write_bytes(b"precious")
    with pytest.raises(InputError) as err:
        plan_workbook.write_plan(plan, path)
    assert isinstance(err.value, FileExistsError)
    assert str(path) in str(err.value) and "--force" in str(err.value)
    assert "\n" not in str(err.value)
    assert path.read_bytes() == b"precious"


def test_overwrite_replaces_an_existing_file(plan, tmp_path):
    path = tmp_path / "old.xlsx"
    path.write_bytes(b"old")
    plan_workbook.write_plan(plan, path, overwrite=True)
    assert zipfile.is_zipfile(path)


def test_plan_to_excel_uses_the_writer(plan, tmp_path):
    out = plan.to_excel(tmp_path / "via_plan.xlsx")
    assert openpyxl.load_workbook(out).sheetnames[:2] == ["Overview", "Run sheet"]


def test_interrupted_write_leaves_no_partial_file(plan, tmp_path, monkeypatch):
    # interrupted while openpyxl saves
    path = tmp_path / "interrupted.xlsx"

    def broken_save(self, filename):
        with open(filename, "wb") as fh:
            fh.write(b"PK\x03\x04 half a workbook")
        raise KeyboardInterrupt

    monkeypatch.setattr(openpyxl.Workbook, "save", broken_save)
    with pytest.raises(KeyboardInterrupt):
        plan_workbook.write_plan(plan, path)
    assert not path.exists()
    assert list(tmp_path.iterdir()) == []


def test_write_interrupted_while_completing_the_long_tables_leaves_no_file(plan, tmp_path,
                                                                           monkeypatch):
    path = tmp_path / "interrupted2.xlsx"

    def broken_rows(*args):
        raise KeyboardInterrupt

    monkeypatch.setattr(sheets, "_rows_between", broken_rows)
    with pytest.raises(KeyboardInterrupt):
        plan_workbook.write_plan(plan, path)
    assert list(tmp_path.iterdir()) == []


def test_missing_output_directory_is_an_input_error(plan, tmp_path):
    with pytest.raises(InputError, match="does not exist"):
        plan_workbook.write_plan(plan, tmp_path / "no" / "such" / "dir.xlsx")


def test_a_ten_thousand_run_matrix_is_written_completely(tmp_path):
    speeds = tuple(np.linspace(0.5, 8.0, 100))
    waves = tuple(WaveCondition("regular", period=p, height=1.0) for p in (6.0, 8.0, 10.0,
                                                                          12.0, 14.0))
    case = _tank_case(speeds=speeds, headings=(180.0, 150.0, 120.0, 90.0))
    case = Case(case.prototype, case.facility, case.request,
                MatrixSpec(speeds=speeds, headings=(180.0, 150.0, 120.0, 90.0, 0.0),
                           waves=waves, repeats=4), case.metadata, case.name)
    p = sim.plan(case)
    assert len(p.matrix) == 10_000
    out = plan_workbook.write_plan(p, tmp_path / "big.xlsx")
    with zipfile.ZipFile(out) as z:
        wb_xml = z.read("xl/workbook.xml").decode()
        names = re.findall(r'<sheet [^>]*name="([^"]+)"', wb_xml)
        runs = z.read(f"xl/worksheets/sheet{names.index('Runs') + 1}.xml").decode()
    assert runs.count("<row ") == 10_001
    assert re.search(r'<dimension ref="A1:[A-Z]+10001"/>', runs)


def test_basis_sheet_names_the_sources_and_assumptions(written):
    # The sources are the published ones the program uses: the ITTC-1957 line (8th ITTC,
    # 1957), IAPWS R12-08 viscosity and TEOS-10 / IAPWS R13-08 sea water.
    _, wb = written
    rows = list(wb["Basis"].iter_rows(values_only=True))
    assert rows[0] == ("topic", "text")
    topics = {r[0] for r in rows[1:]}
    assert {"caution", "prototype fluid correlation", "model fluid correlation",
            "reference", "test day"} <= topics
    text = " ".join(str(r[1]) for r in rows[1:])
    for source in ("IAPWS R12-08", "TEOS-10", "ITTC-1957", "8th ITTC"):
        assert source in text
    assert any(str(t).startswith("check source: ") for t in topics)


# -- presentation: number formats, booleans, wrapped text, printing -----------------------------
_INTEGER_FORMATS = ("0", "General", "#,##0")


def _rows_of(ws, column: int, value):
    return [r for r in range(1, ws.max_row + 1) if ws.cell(row=r, column=column).value == value]


def _value_formats_of_group(wb, group: str) -> list[str]:
    """Number formats of the prototype and model values of ``group`` on the Similarity sheet."""
    ws = wb["Similarity"]
    heads = [c.value for c in ws[1]]
    return [ws.cell(row=r, column=heads.index(name) + 1).number_format
            for r in _rows_of(ws, 1, group) for name in ("prototype value", "model value")]


def test_froude_number_cells_of_the_similarity_sheet_show_decimals(written):
    formats = _value_formats_of_group(written[1], "Froude number")
    assert formats
    for fmt in formats:
        assert fmt not in _INTEGER_FORMATS and re.fullmatch(r"0\.0{3,}", fmt), fmt


def test_reynolds_number_cells_of_the_similarity_sheet_are_scientific(written):
    formats = _value_formats_of_group(written[1], "Reynolds number")
    assert formats and all("E+" in fmt for fmt in formats)


def test_matched_cells_are_booleans_shown_as_yes_or_no(written, plan):
    _, wb = written
    ws = wb["Similarity"]
    col = [c.value for c in ws[1]].index("matched") + 1
    cells = [ws.cell(row=2 + i, column=col) for i in range(len(plan.groups))]
    assert [c.value for c in cells] == [bool(v) for v in plan.groups["matched"]]
    assert all(c.number_format == sheets.BOOLEAN_FORMAT for c in cells)
    assert sheets.BOOLEAN_FORMAT == '"yes";"yes";"no"'


def test_matched_cells_are_centred_apart_from_the_text_beside_them(written):
    _, wb = written
    ws = wb["Similarity"]
    col = [c.value for c in ws[1]].index("matched") + 1
    assert ws.cell(row=2, column=col).alignment.horizontal == "center"


def test_run_feasible_cells_of_the_runs_sheet_are_booleans_shown_as_yes_or_no(written):
    _, wb = written
    ws = wb["Runs"]
    col = [c.value for c in ws[1]].index("run feasible") + 1
    cell = ws.cell(row=2, column=col)
    assert isinstance(cell.value, bool)
    assert cell.number_format == sheets.BOOLEAN_FORMAT


def _assert_fits(ws, row: int, column: int):
    cell = ws.cell(row=row, column=column)
    assert cell.alignment.wrap_text
    width = ws.column_dimensions[openpyxl.utils.get_column_letter(column)].width
    lines = sheets.wrapped_lines(cell.value, width)
    assert ws.row_dimensions[row].height is not None
    assert ws.row_dimensions[row].height >= lines * sheets.LINE_HEIGHT


def test_overview_gives_the_caution_and_each_note_its_own_wrapped_row_of_fitting_height(
        written, plan):
    _, wb = written
    ws = wb["Overview"]
    texts = [plan_caution(plan.case.facility.kind), *map(str, plan.notes)]
    assert len(texts) > 1
    rows = [_rows_of(ws, 2, t) for t in texts]
    assert all(len(r) == 1 for r in rows)
    assert len({r[0] for r in rows}) == len(texts)
    for (r,) in rows:
        _assert_fits(ws, r, 2)


def test_the_long_caution_on_the_overview_is_more_than_one_line_high(written, plan):
    _, wb = written
    ws = wb["Overview"]
    (r,) = _rows_of(ws, 2, plan_caution(plan.case.facility.kind))
    assert ws.row_dimensions[r].height >= 2 * sheets.LINE_HEIGHT


def test_conflict_consequences_span_the_table_in_rows_of_fitting_height(written, plan):
    _, wb = written
    ws = wb["Similarity"]
    assert plan.conflicts
    spans = {m.min_row: m for m in ws.merged_cells.ranges}
    for c in plan.conflicts:
        (r,) = [r for r in range(1, ws.max_row + 1)
                if ws.cell(row=r, column=2).value == c.consequence]
        m = spans[r]
        width = sum(ws.column_dimensions[openpyxl.utils.get_column_letter(j)].width or 8.43
                    for j in range(m.min_col, m.max_col + 1))
        assert ws.cell(row=r, column=2).alignment.wrap_text
        assert ws.row_dimensions[r].height >= sheets.wrapped_lines(c.consequence, width) * \
            sheets.LINE_HEIGHT


def test_conflict_labels_align_with_the_first_line_of_their_text(written, plan):
    _, wb = written
    ws = wb["Similarity"]
    (r,) = [r for r in range(1, ws.max_row + 1)
            if ws.cell(row=r, column=2).value == plan.conflicts[0].consequence]
    assert ws.cell(row=r, column=1).alignment.vertical == "top"
    assert ws.cell(row=r, column=2).alignment.vertical == "top"


def test_facility_check_sources_wrap_in_rows_of_fitting_height(written, plan):
    _, wb = written
    ws = wb["Facility checks"]
    for i in range(len(plan.checks)):
        _assert_fits(ws, 2 + i, 8)


def test_basis_texts_wrap_in_rows_of_fitting_height(written):
    _, wb = written
    ws = wb["Basis"]
    for r in range(2, ws.max_row + 1):
        _assert_fits(ws, r, 2)


def test_every_sheet_prints_one_page_wide_or_at_a_readable_scale(written):
    # 8 pt is the smallest printed size the workbook allows for its 11 pt body text
    _, wb = written
    for ws in wb.worksheets:
        if ws.sheet_properties.pageSetUpPr.fitToPage:
            assert (ws.page_setup.fitToWidth, ws.page_setup.fitToHeight) == (1, 0), ws.title
            assert sheets.content_points(ws) * 0.75 <= sheets.printable_points(
                "A4", ws.page_setup.orientation), ws.title
        else:
            assert ws.page_setup.scale * 11 / 100 >= 8, ws.title


def test_every_sheet_is_set_up_for_a4_paper_by_default(written):
    # paper size code 9 = A4 (ECMA-376 Part 1, 18.3.1.63 pageSetup paperSize; from memory)
    _, wb = written
    assert {ws.page_setup.paperSize for ws in wb.worksheets} == {9}


def test_letter_paper_is_available(plan, tmp_path):
    # paper size code 1 = Letter (ECMA-376 Part 1, 18.3.1.63; from memory)
    path = plan_workbook.write_plan(plan, tmp_path / "letter.xlsx", paper="letter")
    wb = openpyxl.load_workbook(path)
    assert {ws.page_setup.paperSize for ws in wb.worksheets} == {1}


def test_every_printed_page_names_case_sheet_page_program_and_date(written, plan):
    # header/footer codes: &A sheet name, &P page, &N pages, &D date (ECMA-376 Part 1,
    # 18.3.1.46 headerFooter; from memory)
    _, wb = written
    for ws in wb.worksheets:
        assert ws.oddHeader.left.text == plan.case.name
        assert ws.oddHeader.center.text == "&A"
        assert ws.oddHeader.right.text == "page &P of &N"
        assert ws.oddFooter.left.text.startswith("similitude ")
        assert "&D" in ws.oddFooter.right.text


@pytest.mark.parametrize("sheet, row", [("Runs", 1), ("Similarity", 1), ("Facility checks", 1),
                                        ("Scaling", 1), ("Basis", 1),
                                        (plan_workbook.TEST_DAY_SHEET,
                                         plan_workbook.TEST_DAY_HEADER_ROW)])
def test_tables_repeat_their_header_row_on_every_printed_page(written, sheet, row):
    _, wb = written
    assert wb[sheet].print_title_rows == f"${row}:${row}"


def test_points_only_chart_series_have_filled_markers(written):
    # a series drawn without a line shows nothing unless its markers carry their own fill
    path, _ = written
    with zipfile.ZipFile(path) as z:
        xml = "".join(z.read(n).decode() for n in z.namelist()
                      if n.startswith("xl/charts/chart"))
    series = re.findall(r"<ser>.*?</ser>", xml, re.S)
    points_only = [s for s in series if re.match(r"(?s).*?</tx><spPr><a:ln><a:noFill", s)]
    assert points_only
    for s in points_only:
        marker = re.search(r"<marker>.*?</marker>", s, re.S)
        assert marker and "<a:solidFill>" in marker.group(0)


def test_overview_numbers_stand_next_to_their_labels(written):
    _, wb = written
    ws = wb["Overview"]
    (r,) = _rows_of(ws, 1, "runs needed [-]")
    assert ws.cell(row=r, column=2).alignment.horizontal == "left"

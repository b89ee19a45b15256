"""Large outputs: long tables are merged with the sheet's other cells row by row, long frames and
their audit formulas are written as long tables, and a run matrix too large for a sheet (or for
memory) is refused before it is built.

openpyxl reads the written files back (the outside reader of the format); the row limit of a
sheet, 1,048,576, is from the Excel specifications and limits. Speed and memory are measured in
benchmarks/bench_large_outputs.py, not here.
"""

from __future__ import annotations

import numpy as np
import openpyxl
import pandas as pd
import pytest

from similitude.errors import InputError
from similitude.planning.case import MAX_MATRIX_ROWS, matrix_rows
from similitude.planning.planner import plan as make_plan
from similitude.prediction.extrapolation import ShipParticulars, extrapolate
from similitude.prediction.runs import ResistanceRuns
from similitude.readers.case_file import parse_case
from similitude.report import sheets
from similitude.report.results_workbook import write_results
from tests.readers.test_case_file import metric_case


def _save(wb, tmp_path):
    path = tmp_path / "w.xlsx"
    sheets.save_workbook(wb, path)
    return openpyxl.load_workbook(path)


def test_a_long_table_beside_cells_and_above_others_keeps_them_all(tmp_path):
    wb = sheets.new_workbook()
    ws = sheets.new_sheet(wb, "S")
    ws["A1"] = "title above"
    n = 1200
    frame = pd.DataFrame({"x [m]": np.arange(n) * 0.5, "name": [f"r{i}" for i in range(n)]})
    sheets.write_frame(ws, frame, 3)  # long: rows 4 .. 1203
    sheets.write_frame(ws, pd.DataFrame({"y [m]": np.arange(n) * 2.0}), 3, 4)  # beside it
    ws["F5"] = "a note in the table's rows"
    ws[f"A{n + 6}"] = "below the table"
    back = _save(wb, tmp_path)["S"]
    assert back["A1"].value == "title above"
    assert [back.cell(row=3, column=c).value for c in (1, 2, 4)] == ["x [m]", "name", "y [m]"]
    assert back["A4"].value == 0.0 and back[f"A{n + 3}"].value == (n - 1) * 0.5
    assert back[f"B{n + 3}"].value == f"r{n - 1}" and back[f"D{n + 3}"].value == (n - 1) * 2.0
    assert back["F5"].value == "a note in the table's rows"
    assert back[f"A{n + 6}"].value == "below the table"


def test_a_long_frame_keeps_its_column_number_format(tmp_path):
    wb = sheets.new_workbook()
    ws = sheets.new_sheet(wb, "S")
    frame = pd.DataFrame({"model Reynolds number [-]": np.linspace(1e6, 2e6, 800)})
    sheets.write_frame(ws, frame)
    back = _save(wb, tmp_path)["S"]
    assert back["A2"].number_format == back["A801"].number_format == "0.0000E+00"


def test_audit_formulas_of_a_long_frame_are_live_in_every_row(tmp_path):
    wb = sheets.new_workbook()
    ws = sheets.new_sheet(wb, "S")
    n = 700
    frame = pd.DataFrame({"a [-]": np.arange(n, dtype=float)})
    first, last = sheets.write_frame(ws, frame)
    sheets.audit_formulas(ws, list(frame.columns), first, last,
                          [("twice a [-]", "2*{a [-]}*{$k}")], [("k", 1.5)])
    back = _save(wb, tmp_path)["S"]
    assert back["B1"].value == "twice a [-]"
    assert back["B2"].value == "=2*A2*$E$2" and back[f"B{n + 1}"].value == f"=2*A{n + 1}*$E$2"
    assert back["D2"].value == "k" and back["E2"].value == 1.5  # the constants block


def test_a_results_workbook_of_many_runs_holds_every_run_on_every_sheet(tmp_path):
    n = 2000
    fn = np.linspace(0.08, 0.40, n)
    ship = ShipParticulars(length=100.0, wetted_surface=2500.0, scale=25.0)
    v = fn * np.sqrt(9.80665 * ship.model_length)
    runs = ResistanceRuns(tuple(str(i + 1) for i in range(n)), v, 30 * v**2 * (1 + fn**4),
                          np.full(n, 288.15), source="many_runs_SYNTHETIC.csv")
    path = tmp_path / "results.xlsx"
    write_results(path, extrapolate(runs, ship))
    wb = openpyxl.load_workbook(path)
    for name in ("Tank corrections", "Model scale", "Full scale", "Results"):
        ws = wb[name]
        assert ws.max_row == n + 1, name
        assert ws.cell(row=n + 1, column=1).value is not None
    full = wb["Full scale"]
    formulas = [c.value for c in full[n + 1] if isinstance(c.value, str)
                and c.value.startswith("=")]
    assert len(formulas) == 2 and all(str(n + 1) in f for f in formulas)


def test_matrix_rows_are_counted_without_building_the_matrix():
    case = parse_case(metric_case())  # 1 speed, 1 loading, 2 repeats (see the case)
    assert matrix_rows(case.matrix, 1) == 2 == len(make_plan(case).matrix)


def test_a_run_matrix_over_the_limit_is_refused_with_the_limit_in_the_message():
    case = metric_case()
    case["runs"]["speeds"] = [f"{1 + i * 0.001:.3f} m/s" for i in range(1000)]
    case["runs"]["headings"] = list(range(0, 100))
    case["runs"]["repeats"] = 20  # 1000 x 100 x 20 = 2,000,000 rows
    with pytest.raises(InputError) as info:
        parse_case(case)
    (line,) = info.value.problems
    assert line.startswith("runs: 1000 speeds x 1 loading conditions")
    assert "2,000,000 run-matrix rows" in line and f"{MAX_MATRIX_ROWS:,}" in line


def test_the_row_limit_leaves_room_for_the_header_rows_of_a_sheet():
    assert MAX_MATRIX_ROWS <= 1_048_576 - 20  # a sheet's rows, less the Test day header

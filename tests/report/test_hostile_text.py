"""Every free-text field of a case and of measured data, filled with formula payloads and
control characters, ends in the workbooks and CSV files as text: no formula cell from user
text, every sheet well-formed, the command exits 0.

Outside references: OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection):
payloads starting with =, +, -, @ (e.g. =HYPERLINK(...), a DDE command string); XML 1.0
section 2.2 for the characters a sheet may hold. openpyxl and xml.dom.minidom read the files
back (outside readers of the format).
"""

from __future__ import annotations

import csv
import tomllib
import xml.dom.minidom
import zipfile
from pathlib import Path

import numpy as np
import openpyxl
import pytest

from similitude.cli import main
from similitude.planning.planner import plan as make_plan
from similitude.prediction.extrapolation import ShipParticulars, extrapolate
from similitude.prediction.runs import ResistanceRuns
from similitude.readers.case_file import parse_case
from similitude.report.plan_workbook import write_plan
from similitude.report.results_workbook import write_results

DEMO = Path(__file__).parents[2] / "demo_cases"
PAYLOADS = ["=1+1", '=HYPERLINK("http://example.invalid/x","click")', "@SUM(1)", "+1",
            "-1+1", "=cmd|' /C calc'!A0", "bell\x07 esc\x1b nul\x00 soh\x01", "\t=1+1"]


def _hostile_case(payload: str, second: str) -> dict:
    """The offshore demo case (loading and waves) with every free-text field set to text."""
    doc = tomllib.loads((DEMO / "offshore_seakeeping.toml").read_text())
    fac = tomllib.loads((DEMO / "facilities" / "wave_basin_demo.toml").read_text())
    doc["facility"] = fac
    doc["about"] = {k: payload for k in ("title", "project", "client", "author", "note")}
    doc["prototype"]["name"] = payload
    doc["facility"]["name"] = payload
    doc["runs"]["loading"][0]["name"] = payload
    for i, wave in enumerate(doc["runs"]["waves"]):
        wave["name"] = payload if i == 0 else second
    return doc


def _formula_cells(path: Path) -> set[tuple[str, str]]:
    wb = openpyxl.load_workbook(path)
    return {(ws.title, c.coordinate) for ws in wb.worksheets for row in ws.iter_rows()
            for c in row if c.data_type == "f"}


def _assert_well_formed(path: Path) -> None:
    with zipfile.ZipFile(path) as z:
        for name in z.namelist():
            if name.endswith(".xml"):
                xml.dom.minidom.parseString(z.read(name))  # raises if not well-formed


@pytest.fixture(scope="module")
def benign_formulas(tmp_path_factory) -> set[tuple[str, str]]:
    """Where our own formulas are in the plan workbook of ordinary text."""
    path = tmp_path_factory.mktemp("benign") / "plan.xlsx"
    write_plan(make_plan(parse_case(_hostile_case("ordinary", "other"))), path)
    return _formula_cells(path)


@pytest.mark.parametrize("payload", PAYLOADS)
def test_no_cell_of_the_plan_workbook_is_a_formula_from_user_text(payload, tmp_path,
                                                                   benign_formulas):
    path = tmp_path / "plan.xlsx"
    write_plan(make_plan(parse_case(_hostile_case(payload, "-" + payload))), path)
    _assert_well_formed(path)
    assert _formula_cells(path) == benign_formulas  # only our own formulas are formulas
    wb = openpyxl.load_workbook(path)
    texts = [c.value for ws in wb.worksheets for row in ws.iter_rows() for c in row
             if c.data_type == "s"]
    if payload[0] in "=+-@\t" and payload != "+1":
        assert "'" + payload in texts  # kept, readable, as text
    assert not any(t.startswith(("=", "@", "+", "-")) and not _is_number(t) for t in texts)


def _is_number(text: str) -> bool:
    try:
        float(text)
    except ValueError:
        return False
    return True


def test_the_csv_tables_hold_user_text_as_text(tmp_path, capsys):
    case = tmp_path / "hostile.toml"
    doc = _hostile_case("=HYPERLINK(\"http://example.invalid\")", "@SUM(1)")
    case.write_text(_toml(doc))
    assert main(["plan", str(case), "--csv", str(tmp_path / "csv")]) == 0
    for table in (tmp_path / "csv").iterdir():
        with table.open(newline="") as fh:
            for row in csv.reader(fh):
                for field in row:
                    assert field[:1] not in ("=", "@", "\t", "\r"), (table, field)
                    if field[:1] and field[:1] in "+-":
                        assert _is_number(field), (table, field)


def _toml(doc: dict) -> str:
    """A small TOML writer for the test's documents (strings, numbers, lists, tables)."""
    def value(v):
        if isinstance(v, str):
            return '"' + "".join(c if c.isprintable() and c not in '"\\' else f"\\u{ord(c):04x}"
                                 for c in v) + '"'
        if isinstance(v, bool):
            return "true" if v else "false"
        if isinstance(v, (int, float)):
            return repr(v)
        if isinstance(v, list):
            return "[" + ", ".join(value(x) for x in v) + "]"
        return str(v)

    lines: list[str] = []

    def table(name, t):
        scalars = {k: v for k, v in t.items() if not isinstance(v, dict) and not (
            isinstance(v, list) and v and isinstance(v[0], dict))}
        if name:
            lines.append(f"[{name}]")
        lines.extend(f"{k} = {value(v)}" for k, v in scalars.items())
        for k, v in t.items():
            sub = f"{name}.{k}" if name else k
            if isinstance(v, dict):
                table(sub, v)
            elif isinstance(v, list) and v and isinstance(v[0], dict):
                for item in v:
                    lines.append(f"[[{sub}]]")
                    lines.extend(f"{kk} = {value(vv)}" for kk, vv in item.items())

    table("", doc)
    return "\n".join(lines) + "\n"


@pytest.mark.parametrize("payload", ["=1+1", "@SUM(1)", "bell\x07", "-1+1"])
def test_the_plan_command_writes_hostile_text_as_text_and_exits_0(payload, tmp_path, capsys):
    case = tmp_path / "hostile.toml"
    case.write_text(_toml(_hostile_case(payload, "+1")))
    out = tmp_path / "plan.xlsx"
    assert main(["plan", str(case), "-o", str(out)]) == 0
    _assert_well_formed(out)
    wb = openpyxl.load_workbook(out)
    overview = wb["Overview"]
    user_cells = [c for row in overview.iter_rows() for c in row
                  if isinstance(c.value, str) and payload.replace("\x07", "\ufffd") in c.value]
    assert user_cells and all(c.data_type == "s" for c in user_cells)


def test_measured_text_and_names_in_the_results_workbook_are_text(tmp_path):
    fn = np.linspace(0.08, 0.30, 8)
    ship = ShipParticulars(length=100.0, wetted_surface=2500.0, scale=25.0,
                           name="=HYPERLINK(\"http://example.invalid\")")
    v = fn * np.sqrt(9.80665 * ship.model_length)
    ids = tuple(PAYLOADS[i % len(PAYLOADS)] + str(i) for i in range(fn.size))
    runs = ResistanceRuns(ids, v, 30.0 * v**2, np.full(fn.size, 288.15),
                          source="=cmd|' /C calc'!A0.csv")
    path = tmp_path / "results.xlsx"
    write_results(path, extrapolate(runs, ship))
    _assert_well_formed(path)
    wb = openpyxl.load_workbook(path)
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            for c in row:
                if c.data_type == "f":
                    # our audit formulas only: references and arithmetic, never user text
                    assert "HYPERLINK" not in c.value and "cmd" not in c.value
                    assert "SUM(" not in c.value
    texts = {c.value for ws in wb.worksheets for row in ws.iter_rows() for c in row}
    assert "'=HYPERLINK(\"http://example.invalid\")" in texts
    assert "'=1+10" in texts

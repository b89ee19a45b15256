"""``similitude plan``: summary, workbook, JSON, CSV and plots; bad input exits 2 and writes
nothing; an existing output is never replaced without --force.

The behaviours are the project's CLI contract (exit 0 / 2 / 1, one line per problem on stderr).
Outside reference for the scale notation: lambda written "1:25" (ITTC Symbols and Terminology
List, 2017, scale ratio lambda = L_S/L_M).
"""

from __future__ import annotations

import csv
import json
import sys
from pathlib import Path

import openpyxl
import pytest

from similitude.cli import main
from similitude.commands.common import CAUTION

DEMO = Path(__file__).parents[2] / "demo_cases"
FERRY = str(DEMO / "ferry_resistance.toml")


def _bad_case(tmp_path: Path) -> Path:
    text = (DEMO / "ferry_resistance.toml").read_text()
    text = text.replace('length = "78 m"', 'length = "-78 m"')        # problem 1
    text = text.replace('"18 kn"]', '"18 kg"]', 1)                      # problem 2
    text = text.replace('exact = ["froude"]', 'exact = ["frode"]')      # problem 3
    (tmp_path / "facilities").mkdir()
    (tmp_path / "facilities" / "towing_tank_demo.toml").write_text(
        (DEMO / "facilities" / "towing_tank_demo.toml").read_text())
    path = tmp_path / "bad.toml"
    path.write_text(text)
    return path


def test_summary_names_scale_fluid_speeds_groups_and_caution(capsys):
    assert main(["plan", FERRY]) == 0
    out = capsys.readouterr().out
    for words in ("scale", "1:", "model fluid", "fresh_water", "model speeds", "matched",
                  "Froude", "Reynolds", "binding", CAUTION):
        assert words in out


def test_without_output_option_no_workbook_is_written(tmp_path, monkeypatch, capsys):
    monkeypatch.chdir(tmp_path)
    assert main(["plan", FERRY]) == 0
    assert list(tmp_path.iterdir()) == []


def test_workbook_is_written_with_output_option(tmp_path, capsys):
    out = tmp_path / "plan.xlsx"
    assert main(["plan", FERRY, "-o", str(out)]) == 0
    assert out.read_bytes()[:2] == b"PK"   # xlsx is a zip container (ECMA-376 part 2)
    assert f"wrote {out}" in capsys.readouterr().out


def test_existing_workbook_is_kept_without_force(tmp_path, capsys):
    out = tmp_path / "plan.xlsx"
    out.write_bytes(b"keep me")
    assert main(["plan", FERRY, "-o", str(out)]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and "exists" in err[0] and "--force" in err[0]
    assert out.read_bytes() == b"keep me"


def test_force_replaces_an_existing_workbook(tmp_path, capsys):
    out = tmp_path / "plan.xlsx"
    out.write_bytes(b"old")
    assert main(["plan", FERRY, "-o", str(out), "--force"]) == 0
    assert out.read_bytes()[:2] == b"PK"


def test_paper_option_sets_up_the_workbook_for_letter_paper(tmp_path, capsys):
    # paper size code 1 = Letter (ECMA-376 Part 1, 18.3.1.63 pageSetup; from memory)
    out = tmp_path / "plan.xlsx"
    assert main(["plan", FERRY, "-o", str(out), "--paper", "letter"]) == 0
    wb = openpyxl.load_workbook(out)
    assert {ws.page_setup.paperSize for ws in wb.worksheets} == {1}


def test_an_unknown_paper_size_exits_2_naming_the_option_and_the_sizes(tmp_path, capsys):
    out = tmp_path / "plan.xlsx"
    assert main(["plan", FERRY, "-o", str(out), "--paper", "A3"]) == 2
    err = capsys.readouterr().err
    assert "--paper" in err and "'A3'" in err and "A4, letter" in err
    assert not out.exists()


def test_output_must_be_an_xlsx_path(tmp_path, capsys):
    assert main(["plan", FERRY, "-o", str(tmp_path / "plan.txt")]) == 2
    assert ".xlsx" in capsys.readouterr().err
    assert not (tmp_path / "plan.txt").exists()


def test_bad_case_gives_one_line_per_problem_and_no_output(tmp_path, capsys):
    bad = _bad_case(tmp_path)
    out, folder = tmp_path / "plan.xlsx", tmp_path / "tables"
    assert main(["plan", str(bad), "-o", str(out), "--csv", str(folder)]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 3 and all(line.startswith("error: ") for line in err)
    assert "Traceback" not in "\n".join(err)
    assert not out.exists() and not folder.exists()


@pytest.mark.parametrize("content", [b"", b"\x00\xffjunk", b"[prototype\n"])
def test_broken_case_file_exits_two_with_one_line(tmp_path, capsys, content):
    case = tmp_path / "case.toml"
    case.write_bytes(content)
    assert main(["plan", str(case), "-o", str(tmp_path / "p.xlsx")]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and not (tmp_path / "p.xlsx").exists()


def test_missing_case_file_exits_two(tmp_path, capsys):
    assert main(["plan", str(tmp_path / "none.toml")]) == 2
    assert "not found" in capsys.readouterr().err


def test_wrong_unit_exits_two_naming_the_key(tmp_path, capsys):
    bad = _bad_case(tmp_path)
    bad.write_text(bad.read_text().replace('"-78 m"', '"78 m"').replace('["frode"]',
                                                                        '["froude"]'))
    assert main(["plan", str(bad)]) == 2
    (line,) = capsys.readouterr().err.strip().splitlines()
    assert "prototype.speeds[2]" in line and "'18 kg'" in line


def test_json_output_is_the_plan_as_json(capsys):
    assert main(["plan", FERRY, "--json"]) == 0
    def refuse(name):  # strict JSON (RFC 8259) has no NaN or Infinity
        raise ValueError(name)

    data = json.loads(capsys.readouterr().out, parse_constant=refuse)
    assert data["scale"] > 1 and "groups" in data and "matrix" in data


def test_csv_tables_are_written_with_units_in_headers(tmp_path, capsys):
    folder = tmp_path / "tables"
    assert main(["plan", FERRY, "--csv", str(folder)]) == 0
    names = {p.name for p in folder.iterdir()}
    assert {"groups.csv", "checks.csv", "matrix.csv", "scale_factors.csv"} <= names
    with open(folder / "matrix.csv", newline="") as fh:
        header = next(csv.reader(fh))
    assert "model speed [m/s]" in header and "run time [s]" in header


def test_existing_csv_tables_are_kept_without_force(tmp_path, capsys):
    folder = tmp_path / "tables"
    folder.mkdir()
    (folder / "groups.csv").write_text("keep")
    out = tmp_path / "plan.xlsx"
    assert main(["plan", FERRY, "--csv", str(folder), "-o", str(out)]) == 2
    assert (folder / "groups.csv").read_text() == "keep" and not out.exists()


def test_plots_are_written_as_png(tmp_path, capsys):
    folder = tmp_path / "plots"
    assert main(["plan", FERRY, "--plots", str(folder)]) == 0
    pngs = sorted(folder.glob("*.png"))
    assert pngs and all(p.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" for p in pngs)  # PNG sig


def test_plots_without_matplotlib_say_so_and_write_nothing(tmp_path, monkeypatch, capsys):
    monkeypatch.setitem(sys.modules, "matplotlib", None)   # import matplotlib now fails
    out = tmp_path / "plan.xlsx"
    assert main(["plan", FERRY, "-o", str(out), "--plots", str(tmp_path / "p")]) == 1
    assert "matplotlib" in capsys.readouterr().err
    assert not out.exists() and not (tmp_path / "p").exists()


def test_help_lists_the_options(capsys):
    assert main(["plan", "--help"]) == 0
    out = capsys.readouterr().out
    for opt in ("--output", "--force", "--json", "--csv", "--plots"):
        assert opt in out

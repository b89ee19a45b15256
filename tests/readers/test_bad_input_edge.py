"""Bad input is refused at the edge: one line naming the key as the user wrote it, the value
(shortened) and what was expected; files that are not regular files or are too large are refused
before anything is read; broken workbooks, repeated columns and bad cells are named by row and
column.

The behaviours are the project's bad-input contract (DESIGN.md: exit 2, one clear line, never a
traceback). Outside references: POSIX file types (stat(2): S_ISREG, S_ISFIFO, S_ISCHR); the
xlsx container is a zip package (ECMA-376 Part 2, Open Packaging Conventions).
"""

from __future__ import annotations

import copy
import os
import zipfile

import openpyxl
import pytest

import fluids_props as fp
from fluids_props.units import UnitInputError
from similitude.cli import main
from similitude.errors import BAD_INPUT_ERRORS, InputError
from similitude.readers import input_files, measured
from similitude.readers.case_file import load_case, parse_case
from similitude.readers.measured import read_resistance_runs
from tests.readers.test_case_file import metric_case, problems_of

HEADER = "run,model speed [m/s],total resistance [N],water temperature [degC]\n"


# -- units -----------------------------------------------------------------------------------
@pytest.mark.parametrize("text", ["1 m/0", "(15 degC", "15 \u2103", "2**2**2**2**2**2 K",
                                  "15 K**(2)**99", "", "--15 degC", "15 degC + 3 m", "x" * 5000])
def test_a_unit_string_the_parser_cannot_read_is_a_named_unit_error(text):
    with pytest.raises(UnitInputError) as info:
        fp.fresh_water(text)
    message = str(info.value)
    assert message.startswith("temperature: ") and "\n" not in message
    for name in ("ZeroDivisionError", "TokenError", "AssertionError", "Traceback"):
        assert name not in message
    assert len(message) < 250  # the value is shortened


def test_the_degree_celsius_sign_says_what_to_write_instead():
    with pytest.raises(UnitInputError, match="write 'degC'"):
        fp.fresh_water("15 \u2103")


@pytest.mark.parametrize("value", [True, False])
def test_a_boolean_is_not_a_temperature(value):
    with pytest.raises(UnitInputError, match="temperature: .* is not a quantity"):
        fp.fresh_water(value)


def test_a_list_mixing_units_and_bare_numbers_is_refused_naming_the_first_with_a_unit():
    with pytest.raises(UnitInputError, match=r"mixes values with units \(temperature\[0\]"):
        fp.fresh_water(["15 degC", 288.15])


def test_a_list_of_two_kinds_of_quantity_is_refused():
    with pytest.raises(UnitInputError, match=r"temperature\[1\]: '2 m' has another dimension"):
        fp.sea_water(["15 degC", "2 m"])


def test_an_echo_of_a_huge_value_is_shortened_and_says_its_length():
    with pytest.raises(UnitInputError) as info:
        fp.air("9" * 100_000 + " degC")
    assert "100,005 characters" in str(info.value) and len(str(info.value)) < 250


# -- case files ------------------------------------------------------------------------------
@pytest.mark.parametrize("key", ["loading", "waves"])
def test_an_empty_list_of_run_tables_is_a_named_problem(key):
    case = metric_case()
    case["runs"][key] = []
    problems = problems_of(case)
    assert any(p.startswith(f"runs.{key}: empty list") for p in problems)


def test_a_heading_in_percent_is_not_an_angle():
    case = metric_case()
    case["runs"]["headings"] = ["50 %"]
    assert any(p.startswith("runs.headings[0]: '50 %' is not an angle")
               for p in problems_of(case))


@pytest.mark.parametrize("heading, degrees", [("180 deg", 180.0), ("0.5 turn", 180.0), (90, 90.0)])
def test_headings_read_in_units_of_angle_or_as_degrees(heading, degrees):
    case = metric_case()
    case["runs"]["headings"] = [heading]
    assert parse_case(case).matrix.headings == pytest.approx((degrees,))


def test_a_negative_current_names_the_key_the_user_wrote():
    case = metric_case()
    case["runs"]["current"] = "-1 m/s"
    problems = problems_of(case)
    assert problems[0].startswith("runs.current: ") and not any("matrix." in p
                                                                for p in problems)


def test_an_error_message_never_echoes_a_huge_value_whole():
    case = metric_case()
    case["prototype"]["length"] = "7" * 100_000 + " m"
    (line,) = problems_of(case)
    assert line.startswith("prototype.length: ") and len(line) < 250


def _case_file(tmp_path):
    return tmp_path / "case.toml"


def test_a_fifo_named_as_case_file_is_refused_without_waiting(tmp_path):
    fifo = tmp_path / "case.toml"
    os.mkfifo(fifo)
    with pytest.raises(InputError, match="is a FIFO"):
        load_case(fifo)


@pytest.mark.parametrize("device", ["/dev/zero", "/dev/urandom"])
def test_a_device_named_as_case_file_is_refused(device):
    with pytest.raises(InputError, match="is a device"):
        load_case(device)


def test_a_case_file_larger_than_the_limit_is_refused_before_reading(tmp_path):
    big = tmp_path / "big.toml"
    big.write_bytes(b"# " + b"x" * input_files.TEXT_FILE_LIMIT)
    with pytest.raises(InputError, match="expected a TOML text file of at most 1 MB"):
        load_case(big)


def test_a_fifo_named_as_facility_file_is_a_problem_of_the_facility_key(tmp_path):
    os.mkfifo(tmp_path / "tank.toml")
    case = metric_case()
    case["facility"] = "tank.toml"
    assert any(p.startswith("facility file ") and "tank.toml': is a FIFO" in p
               for p in problems_of(case, tmp_path))


# -- measured files --------------------------------------------------------------------------
def _write(tmp_path, text, name="runs.csv"):
    p = tmp_path / name
    p.write_text(text)
    return p


def test_a_fifo_named_as_measured_file_is_refused(tmp_path):
    os.mkfifo(tmp_path / "runs.csv")
    with pytest.raises(InputError, match="is a FIFO"):
        read_resistance_runs(tmp_path / "runs.csv")


def test_a_measured_file_larger_than_the_limit_is_refused(tmp_path, monkeypatch):
    monkeypatch.setattr(measured, "DATA_FILE_LIMIT", 1000)
    p = _write(tmp_path, HEADER + "R1,1.0,10,15\n" * 100)
    with pytest.raises(InputError, match="at most 1 kB"):
        read_resistance_runs(p)


@pytest.mark.parametrize("content", [os.urandom(2000), b"PK\x03\x04" + os.urandom(500), b""])
def test_random_bytes_named_xlsx_are_a_named_error(tmp_path, content):
    p = tmp_path / "runs.xlsx"
    p.write_bytes(content)
    with pytest.raises(InputError, match="runs.xlsx"):
        read_resistance_runs(p)


def _workbook(tmp_path, rows, name="runs.xlsx"):
    wb = openpyxl.Workbook()
    for row in rows:
        wb.active.append(row)
    path = tmp_path / name
    wb.save(path)
    return path


def test_a_truncated_xlsx_is_a_named_error(tmp_path):
    path = _workbook(tmp_path, [HEADER.strip().split(","), ["R1", 1.0, 10, 15]])
    data = path.read_bytes()
    path.write_bytes(data[: len(data) // 2])
    with pytest.raises(InputError, match="runs.xlsx.*expected an xlsx file"):
        read_resistance_runs(path)


def test_a_zip_that_unpacks_to_more_than_the_limit_is_refused(tmp_path, monkeypatch):
    monkeypatch.setattr(measured, "UNPACKED_LIMIT", 10_000)
    path = tmp_path / "runs.xlsx"
    with zipfile.ZipFile(path, "w", zipfile.ZIP_DEFLATED) as z:
        z.writestr("xl/worksheets/sheet1.xml", b" " * 1_000_000)  # compresses to ~1 kB
    with pytest.raises(InputError, match="unpacks to 1 MB"):
        read_resistance_runs(path)


def test_a_column_header_written_twice_is_refused(tmp_path):
    p = _write(tmp_path, "run,model speed [m/s],model speed [m/s],total resistance [N],"
                         "water temperature [degC]\nR1,1.0,1.1,10,15\n")
    with pytest.raises(InputError, match=r"columns 2 and 3 both have the header 'model speed"):
        read_resistance_runs(p)


def test_a_column_header_written_twice_in_a_workbook_is_refused(tmp_path):
    path = _workbook(tmp_path, [["model speed [m/s]", "total resistance [N]",
                                 "total resistance [N]", "water temperature [degC]"],
                                [1.0, 10, 11, 15]])
    with pytest.raises(InputError, match="columns 2 and 3 both have the header"):
        read_resistance_runs(path)


def test_bad_cells_are_named_by_the_row_a_spreadsheet_shows_and_their_column(tmp_path):
    # line 1 a comment, line 2 the header, line 3 a run, line 4 blank, line 5 the bad run
    p = _write(tmp_path, "# synthetic\n" + HEADER + "R1,1.0,10,15\n\nR2,1.1,lots,15\n")
    with pytest.raises(InputError) as info:
        read_resistance_runs(p)
    assert info.value.problems == ["runs.csv: row 5, column 'total resistance [N]': 'lots' "
                                   "is not a finite number; expected a number"]


def test_a_value_that_overflows_its_unit_conversion_is_named(tmp_path):
    p = _write(tmp_path, "model speed [km/s],total resistance [N],water temperature [degC]\n"
                         "1e306,10,15\n")
    with pytest.raises(InputError, match=r"row 2, column 'model speed \[km/s\]'.*not a finite"):
        read_resistance_runs(p)


def test_a_file_of_many_bad_rows_gives_a_bounded_number_of_lines(tmp_path):
    p = _write(tmp_path, HEADER + "".join(f"R{i},x,y,15\n" for i in range(5000)))
    with pytest.raises(InputError) as info:
        read_resistance_runs(p)
    problems = info.value.problems
    assert len(problems) <= measured.MAX_PROBLEMS + 1
    assert problems[-1].endswith("4980 more rows without a finite number; expected a number "
                                 "in every row")


def test_an_exponent_tower_in_a_header_unit_is_refused_quickly(tmp_path):
    p = _write(tmp_path, "model speed [m/s**2**2**2**2**2**2],total resistance [N],"
                         "water temperature [degC]\n1,10,15\n")
    with pytest.raises(InputError, match="is not a known unit"):
        read_resistance_runs(p)


# -- the command line ------------------------------------------------------------------------
CASE = str(__import__("pathlib").Path(__file__).parents[2] / "demo_cases" /
           "ferry_resistance.toml")


@pytest.mark.parametrize("path", ["/dev/zero", "/dev/urandom"])
def test_the_plan_command_refuses_a_device_with_exit_2(path, capsys):
    assert main(["plan", path]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "is a device" in err


def test_the_extrapolate_command_refuses_a_broken_workbook_with_exit_2(tmp_path, capsys):
    bad = tmp_path / "runs.xlsx"
    bad.write_bytes(os.urandom(3000))
    assert main(["extrapolate", str(bad), "--case", CASE]) == 2
    assert capsys.readouterr().err.count("\n") == 1


def test_every_bad_input_error_class_is_a_value_error():
    # callers may catch ValueError; the CLI catches BAD_INPUT_ERRORS for exit 2
    assert all(issubclass(e, ValueError) for e in BAD_INPUT_ERRORS)


def test_an_unchanged_case_still_reads():
    assert parse_case(copy.deepcopy(metric_case())).matrix.current > 0

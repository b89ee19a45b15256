"""``similitude extrapolate``: exit codes, outputs and refusals, through similitude.cli.main."""

from __future__ import annotations

import csv
import json
import math
import shutil
import subprocess
from pathlib import Path

import numpy as np
import pytest
from openpyxl import load_workbook

from fluids_props.water import fresh_water_si
from similitude.cli import main

CASE = Path(__file__).resolve().parents[2] / "demo_cases" / "ferry_resistance.toml"
G = 9.80665


@pytest.fixture
def measured(tmp_path):
    """Free-row runs of an invented hull, C_TM = 1.18 C_F57 + 0.05 Fn^4, ferry at 1:20."""
    lm, sm = 78.0 / 20, 1450.0 / 400
    fn = np.array([0.11, 0.13, 0.15, 0.17, 0.19, 0.23, 0.27, 0.31])
    v = fn * math.sqrt(G * lm)
    s = fresh_water_si(np.full(fn.size, 290.15))
    cf = 0.075 / (np.log10(v * lm / s.kinematic_viscosity_si) - 2) ** 2
    r = (1.18 * cf + 0.05 * fn**4) * 0.5 * s.density_si * sm * v**2
    p = tmp_path / "runs.csv"
    p.write_text("model speed [m/s],total resistance [N],water temperature [degC]\n" + "".join(
        f"{a},{b},17.0\n" for a, b in zip(v.tolist(), r.tolist(), strict=True)))
    return p


def test_writes_the_workbook_and_exits_zero(measured, tmp_path, capsys):
    out = tmp_path / "results.xlsx"
    code = main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "-o", str(out)])
    assert code == 0
    assert "k = 0.1800" in capsys.readouterr().out
    wb = load_workbook(out)
    for sheet in ("Read me", "Inputs", "Tank corrections", "Form factor", "Model scale",
                  "Full scale", "Results", "Charts"):
        assert sheet in wb.sheetnames
    assert len(wb["Charts"]._charts) == 2  # C_T and C_F lines against Fn; P_E against speed
    readme = " ".join(str(c.value) for row in wb["Read me"].iter_rows() for c in row if c.value)
    assert "ESTIMATES" in readme and "correlation practice" in readme


def test_existing_output_is_not_replaced_without_force(measured, tmp_path, capsys):
    out = tmp_path / "results.xlsx"
    out.write_bytes(b"keep me")
    code = main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "-o", str(out)])
    assert code == 2
    assert out.read_bytes() == b"keep me"
    assert "--force" in capsys.readouterr().err
    assert main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "-o", str(out), "--force"]) == 0
    assert out.read_bytes()[:2] == b"PK"  # a zip container: the xlsx


def test_json_output_holds_the_results(measured, capsys):
    code = main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "--json", "--form-factor", "0.1", "--roughness-method", "bowden_davison"])
    assert code == 0
    data = json.loads(capsys.readouterr().out)
    assert data["form_factor"]["form factor k [-]"] == 0.1
    assert data["options"]["roughness_method"] == "bowden_davison"
    assert len(data["results"]) == 8
    assert all(row["P_E [kW]"] > 0 for row in data["results"])


def test_uncertainty_options_add_the_propagated_uncertainty(measured, capsys):
    code = main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "--json", "--speed-uncertainty", "2 mm/s", "--resistance-uncertainty",
                 "0.5 %"])
    assert code == 0
    data = json.loads(capsys.readouterr().out)
    assert "GUM" in data["uncertainty"]["method"]
    assert all(r["u(P_E) combined [kW]"] > 0 for r in data["uncertainty"]["table"])


def test_bad_measured_file_exits_two_with_one_line_per_problem(tmp_path, capsys):
    p = tmp_path / "bad.csv"
    p.write_text("model speed [m/s],water temperature [degC]\n1.0,15\n")
    code = main(["extrapolate", str(p), "--case", str(CASE), "--scale", "1:20"])
    err = capsys.readouterr().err
    assert code == 2
    assert "total resistance [N]" in err and "Traceback" not in err


def test_missing_measured_file_exits_two(tmp_path, capsys):
    code = main(["extrapolate", str(tmp_path / "none.csv"), "--case", str(CASE),
                 "--scale", "1:20"])
    assert code == 2
    assert "not found" in capsys.readouterr().err


def test_run_outside_the_plan_exits_two(tmp_path, capsys):
    # the plan of the demo case numbers its runs 1, 2, ...; run 99999 is not among them
    p = tmp_path / "runs.csv"
    p.write_text("run,model speed [m/s],total resistance [N],water temperature [degC]\n"
                 "99999,1.2,10,15\n")
    code = main(["extrapolate", str(p), "--case", str(CASE), "--form-factor", "0.1"])
    assert code == 2
    assert "not in the plan" in capsys.readouterr().err


def test_output_must_be_a_workbook(measured, tmp_path, capsys):
    code = main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "-o", str(tmp_path / "out.txt")])
    assert code == 2


def test_unknown_roughness_method_is_a_usage_error(measured):
    assert main(["extrapolate", str(measured), "--case", str(CASE),
                 "--roughness-method", "polished"]) == 2


def test_synthetic_demo_data_run_with_the_demo_case(tmp_path, capsys):
    demo = CASE.parent / "measured" / "ferry_resistance_runs_SYNTHETIC.csv"
    code = main(["extrapolate", str(demo), "--case", str(CASE), "-o",
                 str(tmp_path / "demo.xlsx")])
    assert code == 0
    wb = load_workbook(tmp_path / "demo.xlsx")
    text = " ".join(str(c.value) for row in wb["Read me"].iter_rows() for c in row if c.value)
    assert "SYNTHETIC" in text


def test_open_water_runs_are_scaled_with_the_resistance(measured, tmp_path, capsys):
    ow = tmp_path / "ow.csv"
    ow.write_text("advance ratio [-],rotation rate [1/s],thrust coefficient [-],"
                  "torque coefficient [-],water temperature [degC]\n"
                  "0.4,20,0.32,0.047,17\n0.6,20,0.23,0.038,17\n")
    code = main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "--json", "--open-water", str(ow), "--propeller",
                 "diameter=4 m; pitch_ratio=1.0; chord_ratio=0.3; blades=4; "
                 "thickness_ratio=0.04"])
    assert code == 0
    rows = json.loads(capsys.readouterr().out)["open_water"]["table"]
    assert all(r["K_T ship [-]"] > r["K_T model [-]"] for r in rows)


def test_open_water_without_propeller_exits_two(measured, tmp_path):
    ow = tmp_path / "ow.csv"
    ow.write_text("advance ratio [-],thrust coefficient [-],torque coefficient [-]\n"
                  "0.4,0.32,0.047\n")
    assert main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "--open-water", str(ow)]) == 2


def _recalculated_sheet(soffice, book, sheet_name, tmp_path):
    """A sheet of ``book`` as LibreOffice recalculates it, as a list of dict rows."""
    index = load_workbook(book).sheetnames.index(sheet_name) + 1
    subprocess.run([soffice, f"-env:UserInstallation=file://{tmp_path}/lo", "--headless",
                    "--convert-to", "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,"
                    f"true,false,false,false,{index}", str(book), "--outdir", str(tmp_path)],
                   check=True, capture_output=True, timeout=300)
    with (tmp_path / f"{book.stem}-{sheet_name}.csv").open() as fh:
        return list(csv.DictReader(fh))


def test_audit_formulas_recalculate_to_the_written_values(measured, tmp_path):
    # LibreOffice (an outside spreadsheet engine) recalculates the workbook's formulas
    # C_TM = R/(0.5 rho S_M V^2), C_TM,15 = C_TM + (1+k)(C_FM,15 - C_FM),
    # C_TS = bk[(1+k) C_FS + dC_F] + C_A + C_R + C_AAS and P_E = 0.5 rho S V^3 C_TS;
    # they must reproduce the values the program wrote beside them.
    out = tmp_path / "results.xlsx"
    assert main(["extrapolate", str(measured), "--case", str(CASE), "--scale", "1:20",
                 "-o", str(out)]) == 0
    soffice = shutil.which("soffice") or shutil.which("libreoffice")
    assert soffice, "LibreOffice is needed for the formula check (.ci/run installs it)"
    pairs = {"Tank corrections": (("C_TM by formula [-]", "C_TM at test temperature [-]"),
                                  ("C_TM at 15 degC by formula [-]", "C_TM at 15 degC [-]")),
             "Full scale": (("C_TS by formula [-]", "C_TS [-]"),
                            ("P_E by formula [kW]", "P_E [kW]"))}
    for sheet, checks in pairs.items():
        rows = _recalculated_sheet(soffice, out, sheet, tmp_path)
        assert len(rows) == 8
        for row in rows:
            for formula, value in checks:
                assert float(row[formula]) == pytest.approx(float(row[value]), rel=1e-9)


def test_help_lists_the_options_and_exits_zero(capsys):
    assert main(["extrapolate", "--help"]) == 0
    out = capsys.readouterr().out
    for option in ("--case", "--force", "--json", "--form-factor", "--roughness-method",
                   "--blockage", "--open-water", "--speed-uncertainty"):
        assert option in out


@pytest.mark.parametrize("name", ["ferry_resistance_runs_SYNTHETIC.csv",
                                  "ferry_resistance_runs_SYNTHETIC_us_units.csv",
                                  "ferry_open_water_SYNTHETIC.csv"])
def test_demo_measured_files_say_synthetic_in_their_first_line(name):
    first = (CASE.parent / "measured" / name).read_text(encoding="utf-8").splitlines()[0]
    assert first.startswith("#") and "SYNTHETIC" in first and "not a measurement" in first


def test_demo_command_of_the_measured_readme_runs_end_to_end(tmp_path, capsys):
    # the command block of demo_cases/measured/README.md, with the output in tmp_path
    measured = CASE.parent / "measured"
    out = tmp_path / "ferry_results.xlsx"
    code = main(["extrapolate", str(measured / "ferry_resistance_runs_SYNTHETIC.csv"),
                 "--case", str(CASE), "-o", str(out),
                 "--speed-uncertainty", "2 mm/s", "--resistance-uncertainty", "0.3 %",
                 "--open-water", str(measured / "ferry_open_water_SYNTHETIC.csv"),
                 "--propeller", "diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.30; blades=4; "
                 "thickness_ratio=0.04"])
    assert code == 0
    text = capsys.readouterr().out
    assert "open water" in text and "u(P_E)" in text and f"wrote {out}" in text
    assert {"Uncertainty", "Open water"} <= set(load_workbook(out).sheetnames)


def test_us_unit_demo_file_gives_the_same_prediction_as_the_si_file(capsys):
    # same runs in kn, lbf and degF (exact definitions: BIPM SI Brochure 2019 Table 8,
    # NIST SP 811 B.8); the files round to 6-7 digits, and Prohaska's fit of k amplifies that
    # rounding about tenfold, hence 1e-4 (a unit slip would be off by a factor of 2 or more)
    measured = CASE.parent / "measured"
    results = []
    for name in ("ferry_resistance_runs_SYNTHETIC.csv",
                 "ferry_resistance_runs_SYNTHETIC_us_units.csv"):
        assert main(["extrapolate", str(measured / name), "--case", str(CASE), "--json"]) == 0
        results.append(json.loads(capsys.readouterr().out)["results"])
    pe = [[row["P_E [kW]"] for row in r] for r in results]
    np.testing.assert_allclose(pe[1], pe[0], rtol=1e-4)

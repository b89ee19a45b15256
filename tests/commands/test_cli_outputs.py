"""The outputs of one command are one set: a symbolic link at an output path needs --force, a
failing CSV or plot folder leaves no workbook behind, folders that cannot be made are a named
error (exit 2).

The behaviours are the project's CLI contract (exit 0 / 2 / 1, one line per problem, nothing
written on error).
"""

from __future__ import annotations

from pathlib import Path

from similitude.cli import main

DEMO = Path(__file__).parents[2] / "demo_cases"
FERRY = str(DEMO / "ferry_resistance.toml")
MEASURED = str(DEMO / "measured" / "ferry_resistance_runs_SYNTHETIC.csv")


def test_a_dangling_link_at_the_workbook_path_needs_force(tmp_path, capsys):
    out = tmp_path / "plan.xlsx"
    out.symlink_to(tmp_path / "elsewhere.xlsx")
    assert main(["plan", FERRY, "-o", str(out)]) == 2
    assert "symbolic link" in capsys.readouterr().err
    assert out.is_symlink() and not (tmp_path / "elsewhere.xlsx").exists()


def test_a_csv_folder_that_cannot_be_made_leaves_no_workbook(tmp_path, capsys):
    blocker = tmp_path / "a_file"
    blocker.write_text("not a folder")
    out = tmp_path / "plan.xlsx"
    code = main(["plan", FERRY, "-o", str(out), "--csv", str(blocker / "tables")])
    err = capsys.readouterr().err
    assert code == 2 and err.count("\n") == 1 and "tables" in err
    assert sorted(p.name for p in tmp_path.iterdir()) == ["a_file"]


def test_a_plot_folder_that_cannot_be_made_leaves_no_workbook_nor_csv(tmp_path, capsys):
    blocker = tmp_path / "a_file"
    blocker.write_text("not a folder")
    code = main(["plan", FERRY, "-o", str(tmp_path / "plan.xlsx"), "--csv",
                 str(tmp_path / "csv"), "--plots", str(blocker / "plots")])
    assert code == 2
    assert sorted(p.name for p in tmp_path.iterdir()) == ["a_file"]


def test_an_existing_link_at_the_results_path_needs_force(tmp_path, capsys):
    real = tmp_path / "real.xlsx"
    real.write_bytes(b"keep me")
    out = tmp_path / "results.xlsx"
    out.symlink_to(real)
    assert main(["extrapolate", MEASURED, "--case", FERRY, "-o", str(out)]) == 2
    assert real.read_bytes() == b"keep me"

"""The command-line frame: help, exit codes, no tracebacks."""

import subprocess
import sys
from pathlib import Path

import pytest

from similitude.cli import COMMANDS, commands_to_load, main


def test_help_exits_zero(capsys):
    assert main(["--help"]) == 0
    assert "similitude" in capsys.readouterr().out


def test_no_command_prints_help_and_exits_two(capsys):
    assert main([]) == 2


def test_unknown_command_exits_two(capsys):
    assert main(["fly-to-the-moon"]) == 2


def test_module_entry_point_runs():
    out = subprocess.run([sys.executable, "-m", "similitude", "--help"], capture_output=True,
                         text=True, timeout=60)
    assert out.returncode == 0 and "usage" in out.stdout.lower()


def test_module_entry_point_gives_the_exit_code_of_main(tmp_path):
    missing = str(tmp_path / "missing.toml")
    out = subprocess.run([sys.executable, "-m", "similitude", "plan", missing],
                         capture_output=True, text=True, timeout=60)
    assert out.returncode == main(["plan", missing]) == 2
    assert out.stderr.startswith("error: ") and "Traceback" not in out.stderr


def test_top_level_help_lists_every_command(capsys):
    assert main(["--help"]) == 0
    out = capsys.readouterr().out
    assert all(name in out for name in COMMANDS)


@pytest.mark.parametrize("argv, loaded", [
    (["plan", "case.toml"], ("plan",)),
    (["--debug", "props", "water"], ("props",)),
    (["--help"], COMMANDS),
    (["fly-to-the-moon"], COMMANDS),
    ([], COMMANDS),
])
def test_only_the_named_command_is_loaded(argv, loaded):
    assert commands_to_load(argv) == loaded


def test_a_plan_run_imports_no_other_command_and_not_the_after_test_stage():
    # what the plan command does not use stays out of its start-up (benchmarks/bench_cli_plan.py)
    case = Path(__file__).parents[2] / "demo_cases" / "ferry_resistance.toml"
    code = ("import sys; from similitude.cli import main; main(['plan', sys.argv[1]]); "
            "print(sorted(m for m in sys.modules if m.startswith('similitude.commands.') "
            "or m in ('similitude.prediction.extrapolation', 'scipy.optimize')), "
            "file=sys.stderr)")
    out = subprocess.run([sys.executable, "-c", code, str(case)], capture_output=True,
                         text=True, timeout=120)
    assert out.returncode == 0, out.stderr
    assert out.stderr.strip() == "['similitude.commands.common', 'similitude.commands.plan']"


def test_a_plan_run_without_a_workbook_does_not_load_the_workbook_library():
    case = Path(__file__).parents[2] / "demo_cases" / "ferry_resistance.toml"
    code = ("import sys; from similitude.cli import main; main(['plan', sys.argv[1], '--json']); "
            "print('openpyxl' in sys.modules, file=sys.stderr)")
    out = subprocess.run([sys.executable, "-c", code, str(case)], capture_output=True,
                         text=True, timeout=120)
    assert out.returncode == 0 and out.stderr.strip() == "False", out.stderr

"""The command-line frame: help, exit codes, no tracebacks."""

import subprocess
import sys

from similitude.cli import main


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

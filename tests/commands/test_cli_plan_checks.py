"""``similitude plan``: what the summary says about the checks and the runs.

The summary counts each status and lists every check that needs attention; it never says "all
passed" while a check is not checked, at limit or worse (this project's rule, see
planning/findings.py). Invented cases written into temporary files.
"""

from __future__ import annotations

from pathlib import Path

from similitude.cli import main

TANK = '''
[facility]
kind = "towing_tank"
name = "narrow tank (invented)"
length = "200 m"
width = "7 m"
depth = "3.5 m"
speed_limits = ["0.1 m/s", "8 m/s"]
acceleration = "0.5 m/s^2"
'''


def _case(tmp_path: Path, body: str) -> str:
    path = tmp_path / "case.toml"
    path.write_text(body)
    return str(path)


def test_ship_without_sizes_is_not_summarised_as_all_passed(tmp_path, capsys):
    # A 120 m ship with no beam, draught or midship area: the largest model fits the 7 m tank
    # by its length, but the blockage cannot be judged; the summary says so.
    case = _case(tmp_path, '''
[prototype]
kind = "surface_ship"
length = "120 m"
speeds = ["12 kn", "16 kn"]
[prototype.fluid]
name = "sea_water"
temperature = "15 degC"
''' + TANK)
    assert main(["plan", case]) == 0
    out = capsys.readouterr().out
    assert "passed" not in out
    assert "2 not checked" in out
    assert "NOT CHECKED blockage ratio A_X/(B_T h): give prototype.sizes.midship_area, or " \
        "beam and draught" in out


def test_summary_gives_conditions_and_runs_needed_apart(capsys):
    # The seakeeping demo: 2 speeds x 3 headings x 2 seas = 12 conditions; each 3 h sea at
    # 1:30 (1971.8 s model time) needs several runs of the basin's length: the runs to book
    # are the sum of the matrix's "runs needed" column.
    from similitude.planning.matrix import runs_needed
    from similitude.planning.planner import plan
    from similitude.readers.case_file import load_case

    demo = Path(__file__).parents[2] / "demo_cases" / "offshore_seakeeping.toml"
    p = plan(load_case(demo))
    assert main(["plan", str(demo)]) == 0
    out = capsys.readouterr().out
    assert len(p.matrix) == 12 and runs_needed(p.matrix) > 12
    assert f"12 conditions (run-matrix rows), {runs_needed(p.matrix)} runs needed" in out

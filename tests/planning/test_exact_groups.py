"""Requested exact groups are kept, or the plan says so loudly.

Default: a request whose exact groups cannot all be met is refused, naming the binding limit
and what relaxing would give. With relax = true the last exact group is dropped, its mismatch
minimised, and every output opens with a "requested but not matched" line.

Hand derivation used throughout: with Froude scaling V_m = V_p/sqrt(lambda), so
Re_p/Re_m = (V_p L_p/nu_p)/(V_m L_m/nu_m) = lambda^1.5 nu_m/nu_p (ITTC 7.5-02-02-01 (2011) on
Froude-scaled model tests; Reynolds number definition: ITTC Symbols and Terminology 2017).
Matching both would need nu_m/nu_p = lambda^-1.5, which no water in a tank gives.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest
from openpyxl import load_workbook
from scenarios import ship, tank

import fluids_props as fp
from similitude.cli import main
from similitude.errors import InfeasibleError
from similitude.planning.case import Case, MatchRequest
from similitude.planning.planner import plan

# The tank blockage limit binds: A_X/lambda^2 = 0.005 x 8 m x 4 m, lambda = sqrt(190/0.16).
LAMBDA_LIMIT = math.sqrt(190.0 / (0.005 * 8.0 * 4.0))   # 34.460


def test_froude_and_reynolds_exact_are_refused_by_default_with_what_relaxing_gives():
    case = Case(ship(), tank(), MatchRequest(exact=("froude", "reynolds")))
    with pytest.raises(InfeasibleError) as exc:
        plan(case)
    msg = str(exc.value)
    assert msg.startswith("matching.exact: 'froude' and 'reynolds' cannot all be matched")
    assert "lambda^-1.5" in msg                     # why: the binding requirement
    assert "blockage ratio" in msg                  # the binding limit, named
    assert "relaxing would keep froude exact and give reynolds a prototype/model ratio" in msg
    assert "relax = true under [matching]" in msg


def test_relaxed_plan_keeps_froude_and_minimises_reynolds_at_the_largest_model():
    p = plan(Case(ship(), tank(), MatchRequest(exact=("froude", "reynolds"), relax=True)))
    (d,) = p.requested_not_matched
    assert d["group"] == "reynolds"
    assert p.scale == pytest.approx(LAMBDA_LIMIT, rel=1e-6)
    # Re_p/Re_m = lambda^1.5 nu_m/nu_p, with the warmest water of the tank (25 degC, the
    # facility default) as the least mismatch.
    nu_m = float(fp.fresh_water("25 degC").kinematic_viscosity.magnitude)
    nu_p = float(fp.sea_water("15 degC").kinematic_viscosity.magnitude)
    assert d["ratio prototype/model"] == pytest.approx(LAMBDA_LIMIT**1.5 * nu_m / nu_p,
                                                       rel=1e-5)


def test_refusal_quotes_the_same_ratio_the_relaxed_plan_gives():
    relaxed = plan(Case(ship(), tank(), MatchRequest(exact=("froude", "reynolds"),
                                                     relax=True)))
    ratio = relaxed.requested_not_matched[0]["ratio prototype/model"]
    with pytest.raises(InfeasibleError) as exc:
        plan(Case(ship(), tank(), MatchRequest(exact=("froude", "reynolds"))))
    assert f"ratio of {ratio:.4g} at the design speed" in str(exc.value)


def test_relaxed_plan_says_the_scale_was_not_rounded_and_why():
    p = plan(Case(ship(), tank(), MatchRequest(exact=("froude", "reynolds"), relax=True)))
    lines = p.requested_not_matched_lines()
    assert lines[0].startswith("REQUESTED BUT NOT MATCHED: reynolds was requested exact")
    assert "not rounded" in lines[-1] and "mismatch of the relaxed group" in lines[-1]


def test_relaxed_plan_carries_the_line_in_repr_html_and_json():
    p = plan(Case(ship(), tank(), MatchRequest(exact=("froude", "reynolds"), relax=True)))
    first = p.requested_not_matched_lines()[0]
    assert repr(p).splitlines()[1].strip() == first
    assert p._repr_html_().startswith("<div><p style=")
    assert first in p._repr_html_()
    data = p.to_dict()
    assert data["requested_not_matched"][0]["group"] == "reynolds"
    assert data["requested_not_matched_lines"][0] == first
    assert data["requested_exact"] == ["froude", "reynolds"] and data["exact"] == ["froude"]


def test_plan_that_matches_every_requested_group_has_no_such_line():
    p = plan(Case(ship(), tank()))
    assert p.requested_not_matched == () and p.requested_not_matched_lines() == []


# -- command line and workbook ---------------------------------------------------------------
DEMO = Path(__file__).parents[2] / "demo_cases"


def _ferry_with(tmp_path: Path, matching: str) -> Path:
    text = (DEMO / "ferry_resistance.toml").read_text()
    text = text.replace('exact = ["froude"]\nreport = ["reynolds"]', matching)
    (tmp_path / "facilities").mkdir()
    (tmp_path / "facilities" / "towing_tank_demo.toml").write_text(
        (DEMO / "facilities" / "towing_tank_demo.toml").read_text())
    path = tmp_path / "ferry.toml"
    path.write_text(text)
    return path


def test_cli_refuses_unattainable_exact_groups_with_exit_two_and_one_line(tmp_path, capsys):
    case = _ferry_with(tmp_path, 'exact = ["froude", "reynolds"]')
    out = tmp_path / "plan.xlsx"
    assert main(["plan", str(case), "-o", str(out)]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and "relaxing would keep froude exact" in err[0]
    assert not out.exists()


def test_cli_relaxed_plan_puts_the_line_at_the_top_of_summary_overview_and_json(tmp_path,
                                                                             capsys):
    case = _ferry_with(tmp_path, 'exact = ["froude", "reynolds"]\nrelax = true')
    out = tmp_path / "plan.xlsx"
    assert main(["plan", str(case), "-o", str(out)]) == 0
    summary = capsys.readouterr().out.splitlines()
    assert summary[1].strip().startswith("REQUESTED BUT NOT MATCHED: reynolds")
    assert "not rounded" in summary[2]
    ws = load_workbook(out)["Overview"]
    assert ws["A2"].value == "REQUESTED BUT NOT MATCHED"
    assert ws["B2"].value.startswith("REQUESTED BUT NOT MATCHED: reynolds was requested exact")
    assert main(["plan", str(case), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["requested_not_matched"][0]["group"] == "reynolds"


def test_relax_must_be_true_or_false(tmp_path, capsys):
    case = _ferry_with(tmp_path, 'exact = ["froude"]\nrelax = "yes"')
    assert main(["plan", str(case)]) == 2
    assert "matching.relax" in capsys.readouterr().err


# -- report-only plans ----------------------------------------------------------------------
WING = '''
[prototype]
kind = "wing"
length = "2.4 m"
speeds = ["45 m/s", "70 m/s"]
[prototype.sizes]
thickness = "0.36 m"
[prototype.fluid]
name = "air"
temperature = "15 degC"
[facility]
kind = "wind_tunnel"
name = "tunnel (invented)"
length = "8 m"
width = "2.5 m"
height = "2 m"
speed_limits = ["5 m/s", "120 m/s"]
fluids = ["air"]
[matching]
exact = []
report = ["mach", "reynolds"]
'''


def test_report_only_plan_at_a_fixed_scale_matches_mach_in_the_same_air(tmp_path, capsys):
    # Fixed 1:6, no exact group; the model runs in air at the prototype's 15 degC, 1 atm, so
    # the least Mach mismatch is V_m = V_p (Ma = V/a, same a) and Re_p/Re_m = lambda = 6.
    path = tmp_path / "wing.toml"
    path.write_text(WING.replace('report = ["mach", "reynolds"]', 'report = ["mach"]')
                    + 'scale = "1:6"\n[matching.model_fluid]\nname = "air"\n'
                    'temperature = "15 degC"\n')
    assert main(["plan", str(path)]) == 0
    p = plan(Case(*_wing_parts(path)))
    g = p.groups.set_index(["key", "prototype speed [m/s]"])["ratio"]
    assert g[("mach", 70.0)] == pytest.approx(1.0, rel=1e-6)
    assert g[("reynolds", 70.0)] == pytest.approx(6.0, rel=1e-6)
    assert any(n.startswith("Report-only plan") for n in p.notes)


def _wing_parts(path):
    from similitude.readers.case_file import load_case

    c = load_case(path)
    return c.prototype, c.facility, c.request


def test_report_only_plan_needs_a_fixed_scale(tmp_path, capsys):
    path = tmp_path / "wing.toml"
    path.write_text(WING)
    assert main(["plan", str(path)]) == 2
    err = capsys.readouterr().err
    assert "match.exact: empty" in err and "fixed scale or model_length" in err

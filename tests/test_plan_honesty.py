"""A plan never claims more than it checked (acceptance tests of the checks and statuses).

For each demo case and for invented scenarios, the checks the case should have are listed here
by name (from the facility kind, the prototype kind and the inputs given) and each must appear,
run or "not checked"; no summary says "all passed" while a check is not checked, at limit or
worse; the notebook view, the workbook and the JSON carry the same statuses, coloured alike;
and no client document prints "from memory" (that mark belongs in code comments and tests).
"""

from __future__ import annotations

import json
import re
from pathlib import Path

import pytest
from openpyxl import load_workbook

from similitude.cli import main
from similitude.commands.plan import summary
from similitude.planning.case import (
    Case,
    FluidSpec,
    MatchRequest,
    MatrixSpec,
    Prototype,
    WaveCondition,
)
from similitude.planning.facilities import Facility
from similitude.planning.findings import STATUS_COLOURS, checks_summary
from similitude.planning.planner import plan
from similitude.readers.case_file import load_case

DEMO = Path(__file__).parents[1] / "demo_cases"
DEMOS = ("ferry_resistance", "offshore_seakeeping", "propeller_cavitation", "wing_wind_tunnel")

#: The checks of a hull with its sizes given in a tank with its carriage data (both demo ships).
HULL_IN_A_TANK = [
    "Froude speed at the highest prototype speed", "Froude speed at the lowest prototype speed",
    "model length vs facility maximum", "model length vs facility minimum",
    "model length vs tank width (Kelvin wedge)", "blockage ratio A_X/(B_T h)",
    "depth Froude number V_m/sqrt(g h)", "tank depth needed 3 sqrt(B_m T_m)",
    "model Reynolds number at the lowest speed...",
    "capillary share of the model's own waves at the lowest speed (lambda_c/lambda_w)^2",
    "steady-run time at the highest speed"]

#: The checks each demo case should have, by name (a name ending in "..." is a prefix).
EXPECTED_DEMO_CHECKS = {
    "ferry_resistance": HULL_IN_A_TANK,
    "offshore_seakeeping": [
        *HULL_IN_A_TANK,
        *[f"{sea}: {what}" for sea in ("moderate sea", "rough sea") for what in (
            "model period vs wavemaker minimum", "model period vs wavemaker maximum",
            "most probable highest model wave", "model wave period",
            "capillary share (lambda_c/lambda_w)^2",
            "basin depth over model wave length h/L (deep water)")]],
    "propeller_cavitation": [
        "Model speed (set by the cavitation number) at the highest prototype speed",
        "Model speed (set by the cavitation number) at the lowest prototype speed",
        "model length vs facility maximum", "model length vs facility minimum",
        "model rotation rate", "model length vs test-section length", "propeller diameter",
        "propeller Reynolds number Re_0.7R at the lowest speed...",
        "static pressure at the shaft centre vs facility minimum",
        "static pressure at the shaft centre vs facility maximum"],
    "wing_wind_tunnel": [
        "Model speed (set by the reynolds number) at the highest prototype speed",
        "Model speed (set by the reynolds number) at the lowest prototype speed",
        "model length vs facility maximum", "model length vs facility minimum",
        "model length vs test-section length", "tunnel blockage...",
        "test-section static pressure vs facility minimum",
        "test-section static pressure vs facility maximum",
        "model Mach number at the highest speed"],
}


def _tank():
    return Facility("towing_tank", "narrow tank (invented)", 200.0, 7.0, 3.5, (0.1, 8.0),
                    acceleration=0.5)


def _bare_ship(**kw):
    return Prototype("surface_ship", 120.0, (6.2, 8.2), FluidSpec("sea_water", 288.15), **kw)


#: Invented scenarios: (case, checks that must appear, the ones of them that cannot run).
SCENARIOS = {
    # A 120 m ship without beam, draught or midship area in a 7 m wide tank.
    "ship without sizes": (
        Case(_bare_ship(), _tank()),
        ["model length vs tank width (Kelvin wedge)", "blockage ratio A_X/(B_T h)",
         "depth Froude number V_m/sqrt(g h)", "tank depth needed 3 sqrt(B_m T_m)",
         "model Reynolds number at the lowest speed...", "steady-run time at the highest speed"],
        {"blockage ratio A_X/(B_T h)", "tank depth needed 3 sqrt(B_m T_m)"}),
    # Waves asked for in a tank without wavemaker data.
    "waves without wavemaker data": (
        Case(_bare_ship(dimensions={"midship_area": 50.0, "beam": 18.0, "draught": 4.0}),
             _tank(), matrix=MatrixSpec(waves=(WaveCondition(
                 "irregular", significant_height=3.0, peak_period=9.0, name="sea"),))),
        ["model wave periods vs wavemaker range",
         "model wave heights vs wavemaker's highest wave", "sea: model wave period",
         "sea: basin depth over model wave length h/L (deep water)"],
        {"model wave periods vs wavemaker range",
         "model wave heights vs wavemaker's highest wave"}),
    # A propeller in a depressurised tank without dynamometer data.
    "propeller without dynamometer data": (
        Case(Prototype("propeller", 4.0, (6.0,), FluidSpec("sea_water", 288.15),
                       dimensions={"diameter": 4.0, "blade_chord": 1.2},
                       rotation_rates=(2.0,), immersion=6.0),
             Facility("towing_tank", "depressurised tank (invented)", 200.0, 8.0, 4.0,
                      (0.1, 6.0), acceleration=0.5, pressure_range=(2.5e3, 101325.0)),
             MatchRequest(exact=("advance_ratio", "cavitation"), report=("reynolds",),
                          model_length=0.25)),
        ["model rotation rate", "air pressure above the water vs facility minimum",
         "air pressure above the water vs facility maximum",
         "propeller Reynolds number Re_0.7R at the lowest speed..."],
        {"model rotation rate"}),
}


def _find(checks, expected):
    if expected.endswith("..."):
        return [c for c in checks if c.name.startswith(expected[:-3])]
    return [c for c in checks if c.name == expected]


@pytest.fixture(scope="module")
def demo_plans():
    return {name: plan(load_case(DEMO / f"{name}.toml")) for name in DEMOS}


@pytest.mark.parametrize("name", DEMOS)
def test_every_check_a_demo_case_asks_for_appears(demo_plans, name):
    checks = demo_plans[name].checks
    for expected in EXPECTED_DEMO_CHECKS[name]:
        assert _find(checks, expected), f"{name}: {expected} missing"


@pytest.mark.parametrize("label", SCENARIOS)
def test_every_check_a_scenario_asks_for_appears_run_or_not_checked(label):
    case, expected, skipped = SCENARIOS[label]
    p = plan(case)
    for name in expected:
        found = _find(p.checks, name)
        assert found, f"{label}: {name} missing"
        want = "not checked" if name in skipped else None
        for c in found:
            if want:
                assert c.status == want and c.advice.startswith("give "), (label, c)
            else:
                assert c.status != "not checked", (label, c)


@pytest.mark.parametrize("label", SCENARIOS)
def test_no_summary_says_all_passed_while_a_check_was_skipped(label):
    p = plan(SCENARIOS[label][0])
    assert any(c.status == "not checked" for c in p.checks)
    for text in (summary(p), repr(p), p._repr_html_(), checks_summary(p.checks),
                 p.to_dict()["checks_summary"]):
        assert not re.search(r"all \d+ passed", text), label


@pytest.mark.parametrize("name", DEMOS)
def test_demo_summaries_say_all_passed_only_when_every_check_is_ok(demo_plans, name):
    p = demo_plans[name]
    says_all = bool(re.search(r"all \d+ passed", summary(p)))
    assert says_all == all(c.status in ("ok", "info") for c in p.checks)


@pytest.mark.parametrize("name", DEMOS)
def test_notebook_workbook_and_json_agree_on_statuses(demo_plans, name, tmp_path, capsys):
    p = demo_plans[name]
    statuses = [c.status for c in p.checks]
    # JSON
    assert main(["plan", str(DEMO / f"{name}.toml"), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert [c["status"] for c in data["checks"]] == statuses
    # workbook: the status column, filled with the shared colour
    ws = load_workbook(p.to_excel(tmp_path / "p.xlsx"))["Facility checks"]
    head = [c.value for c in ws[1]]
    col = head.index("status") + 1
    cells = [ws.cell(row=2 + i, column=col) for i in range(len(statuses))]
    assert [c.value for c in cells] == statuses
    for cell in cells:
        assert cell.fill.fgColor.rgb[-6:] == STATUS_COLOURS[cell.value]
    # notebook view: the status cells in order, in the same colours
    html = p._repr_html_()
    shown = re.findall(r'<td style="background-color:#([0-9A-F]{6});color:#000000">([^<]+)</td>',
                       html)
    assert [s for _, s in shown] == statuses
    assert all(STATUS_COLOURS[s] == colour for colour, s in shown)


@pytest.mark.parametrize("name", DEMOS)
def test_no_client_document_prints_from_memory(demo_plans, name, tmp_path, capsys):
    p = demo_plans[name]
    assert main(["plan", str(DEMO / f"{name}.toml"), "--json"]) == 0
    documents = [capsys.readouterr().out, summary(p), repr(p), p._repr_html_()]
    wb = load_workbook(p.to_excel(tmp_path / "p.xlsx"))
    documents += [str(c.value) for ws in wb.worksheets for row in ws.iter_rows()
                  for c in row if isinstance(c.value, str)]
    assert not [d for d in documents if "from memory" in d]

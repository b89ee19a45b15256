"""The test-day formulas recompute in LibreOffice and agree with the program (<= 1e-6).

Each test writes a workbook, sets a new measured temperature in the test-day input cell (an
edit of that one cell's value in the sheet XML, the rest of the file as written; the file holds
no cached formula values), lets LibreOffice headless load, recalculate and save it as .xlsx,
and reads the recalculated values back. The reference values come from fluids_props (the
oracle for the formulas: they must reproduce it) and from the ITTC-1957 line
C_F = 0.075/(log10 Re - 2)^2 (Proc. 8th ITTC, 1957) computed here directly.

LibreOffice must be installed (package libreoffice-calc-nogui; .ci/run installs it): the tests
fail without it.
"""

import math
import re
import shutil
import subprocess
import zipfile

import numpy as np
import openpyxl
import pytest

import fluids_props as fp
import similitude as sim
from similitude.planning.case import (
    Case,
    FluidSpec,
    MatchRequest,
    MatrixSpec,
    Prototype,
    WaveCondition,
)
from similitude.planning.facilities import Facility
from similitude.report import plan_workbook

REL = 1e-6

# LibreOffice profile setting: recalculate OOXML files on load always (0 = always,
# 1 = never, 2 = prompt). A fresh profile per run keeps other settings out.
_XCU = """<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry"
 xmlns:xs="http://www.w3.org/2001/XMLSchema"
 xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
<prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
<prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
"""


def _soffice() -> str:
    exe = shutil.which("soffice") or shutil.which("libreoffice")
    assert exe, "LibreOffice (soffice) is required for the recalculation tests"
    return exe


def _recalculate(path, tmp_path):
    profile = tmp_path / "lo_profile"
    (profile / "user").mkdir(parents=True)
    (profile / "user" / "registrymodifications.xcu").write_text(_XCU)
    out = tmp_path / "recalculated"
    out.mkdir()
    proc = subprocess.run(
        [_soffice(), f"-env:UserInstallation=file://{profile}", "--headless", "--norestore",
         "--convert-to", "xlsx", "--outdir", str(out), str(path)],
        capture_output=True, text=True, timeout=240)
    result = out / path.name
    assert result.is_file(), f"LibreOffice did not convert: {proc.stdout} {proc.stderr}"
    return openpyxl.load_workbook(result, data_only=True)


def _set_test_day_temperature(path, celsius: float) -> None:
    """Change the value of the input cell only, in place (no other byte of the sheet)."""
    with zipfile.ZipFile(path) as z:
        names = re.findall(r'<sheet [^>]*name="([^"]+)"', z.read("xl/workbook.xml").decode())
        part = f"xl/worksheets/sheet{names.index(plan_workbook.TEST_DAY_SHEET) + 1}.xml"
        items = {i.filename: z.read(i.filename) for i in z.infolist()}
    xml = items[part].decode()
    cell = plan_workbook.TEMPERATURE_CELL
    new, n = re.subn(rf'(<c r="{cell}"[^>]*>)<v>[^<]*</v>', rf"\g<1><v>{celsius!r}</v>", xml)
    assert n == 1
    items[part] = new.encode()
    tmp = path.with_suffix(".tmp")
    with zipfile.ZipFile(tmp, "w", zipfile.ZIP_DEFLATED) as z:
        for name, data in items.items():
            z.writestr(name, data)
    tmp.replace(path)


def _towing_tank_plan():
    fac = Facility("towing_tank", "test tank (invented)", 150.0, 6.0, 3.5, (0.1, 7.0))
    proto = Prototype("surface_ship", 120.0, (6.0, 8.0, 10.0), FluidSpec("sea_water", 288.15))
    spec = MatrixSpec(waves=(WaveCondition("regular", period=9.0, height=2.0),), repeats=2,
                      headings=(180.0, 135.0))
    return sim.plan(Case(proto, fac, request=MatchRequest(scale=30.0), matrix=spec))


def _wind_tunnel_plan():
    fac = Facility("wind_tunnel", "pressurised tunnel (invented)", 8.0, 2.5, 2.0, (5.0, 120.0),
                   fluids=("air",), temperature_range=(283.15, 313.15),
                   pressure_range=(8e4, 4e5), min_model_length=0.2, max_model_length=1.0)
    proto = Prototype("wing", 2.4, (45.0, 70.0), FluidSpec("air", 288.15, 101325.0))
    req = MatchRequest(exact=("reynolds",), report=("mach",), scale=6.0,
                       objective="least_mismatch")
    return sim.plan(Case(proto, fac, request=req, matrix=MatrixSpec(repeats=2)))


def _propeller_plan():
    fac = Facility("cavitation_tunnel", "tunnel (invented)", 2.6, 0.6, 0.6, (1.0, 12.0),
                   temperature_range=(285.15, 301.15), pressure_range=(8e3, 2e5),
                   max_rotation_rate=50.0)
    proto = Prototype("propeller", 4.2, (5.5, 6.5), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 4.2, "blade_chord": 1.3},
                      rotation_rates=(1.75, 2.0), immersion=5.2)
    req = MatchRequest(exact=("advance_ratio", "cavitation"), report=("reynolds",),
                       model_length=0.25)
    return sim.plan(Case(proto, fac, request=req))


def _rel(a, b):
    return abs(float(a) / float(b) - 1.0)


def _check_recalculated(wb, plan, celsius):
    ws = wb[plan_workbook.TEST_DAY_SHEET]
    T = celsius + 273.15
    state = fp.get_fluid(plan.model_fluid.fluid).evaluate_si(
        T, float(np.asarray(plan.model_fluid.pressure_si)),
        **{k: v for k, v in plan.model_fluid.extra.items() if k == "relative_humidity"})
    assert ws[plan_workbook.TEMPERATURE_CELL].value == pytest.approx(celsius, abs=1e-12)
    assert ws[plan_workbook.KELVIN_CELL].value == pytest.approx(T, rel=1e-15)
    assert _rel(ws[plan_workbook.DENSITY_CELL].value, state.density_si) <= REL
    assert _rel(ws[plan_workbook.VISCOSITY_CELL].value, state.dynamic_viscosity_si) <= REL
    nu = float(state.kinematic_viscosity_si)
    assert _rel(ws[plan_workbook.KINEMATIC_CELL].value, nu) <= REL
    if state.vapour_pressure_si is not None:
        assert _rel(ws[plan_workbook.VAPOUR_PRESSURE_CELL].value, state.vapour_pressure_si) <= REL
        assert _rel(ws[plan_workbook.SURFACE_TENSION_CELL].value, state.surface_tension_si) <= REL
    _check_runs(ws, plan, nu)


def _columns(ws):
    """Header -> 0-based column index of the per-run table."""
    head = next(ws.iter_rows(min_row=plan_workbook.TEST_DAY_HEADER_ROW,
                             max_row=plan_workbook.TEST_DAY_HEADER_ROW, values_only=True))
    return {h: j for j, h in enumerate(head) if h}


def _check_runs(ws, plan, nu):
    """Each run's live Reynolds number (and friction or blade-drag coefficient) against a
    hand calculation at the new viscosity."""
    m = plan.matrix
    col = _columns(ws)
    first = plan_workbook.TEST_DAY_HEADER_ROW + 1
    rows = list(ws.iter_rows(min_row=first, max_row=first + len(m) - 1, values_only=True))
    assert len(rows) == len(m)
    if plan.case.prototype.kind == "propeller":
        # Re_0.7R = c_m sqrt(V^2 + (0.7 pi n D_m)^2)/nu; ITTC-78 C_DM = 2(0.044 Re^-1/6 -
        # 5 Re^-2/3) with t/c = 0 (ITTC 7.5-02-03-01.4, blade-drag correction)
        proto = plan.case.prototype
        d_m = proto.dimension("diameter") / plan.scale
        c_m = proto.dimension("blade_chord") / plan.scale
        for row, vm, n in zip(rows, m["model speed [m/s]"], m["model rotation rate [1/s]"],
                              strict=True):
            re_m = c_m * math.hypot(vm, 0.7 * math.pi * n * d_m) / nu
            cd_m = 2 * (0.044 * re_m ** (-1 / 6) - 5 * re_m ** (-2 / 3))
            assert _rel(row[col["model Reynolds number Re_0.7R [-]"]], re_m) <= REL
            assert _rel(row[col["ITTC-78 blade section drag C_D model [-]"]], cd_m) <= REL
        return
    if "ITTC-1957 C_F model [-]" not in col:  # a wing or body: Reynolds numbers only
        for row, vm, re_p in zip(rows, m["model speed [m/s]"],
                                 m["prototype Reynolds number [-]"], strict=True):
            re_m = vm * plan.model_length / nu
            assert _rel(row[col["model Reynolds number [-]"]], re_m) <= REL
            assert _rel(row[col["Re prototype / Re model [-]"]], re_p / re_m) <= REL
        return
    for row, vm, re_p in zip(rows, m["model speed [m/s]"], m["prototype Reynolds number [-]"],
                             strict=True):
        re_m = vm * plan.model_length / nu
        cf_m = 0.075 / (math.log10(re_m) - 2) ** 2
        cf_p = 0.075 / (math.log10(re_p) - 2) ** 2
        assert _rel(row[2], re_m) <= REL
        assert _rel(row[3], cf_m) <= REL
        assert _rel(row[8], cf_m - cf_p) <= REL


def test_soffice_is_installed():
    assert _soffice()


def test_water_workbook_recalculates_at_a_new_test_day_temperature(tmp_path):
    plan = _towing_tank_plan()
    assert plan.model_fluid.fluid == "fresh_water"
    path = plan_workbook.write_plan(plan, tmp_path / "tank.xlsx")
    _set_test_day_temperature(path, 21.37)
    wb = _recalculate(path, tmp_path)
    _check_recalculated(wb, plan, 21.37)
    # the live Reynolds number moved off the planned one by the viscosity ratio
    first = plan_workbook.TEST_DAY_HEADER_ROW + 1
    ws = wb[plan_workbook.TEST_DAY_SHEET]
    nu_new = fp.get_fluid("fresh_water").evaluate_si(21.37 + 273.15).kinematic_viscosity_si
    ratio = float(plan.model_fluid.kinematic_viscosity_si) / float(nu_new)
    assert abs(ratio - 1) > 0.05
    assert _rel(ws[f"C{first}"].value / ws[f"E{first}"].value, ratio) <= REL


def test_water_workbook_as_written_recalculates_to_the_planned_values(tmp_path):
    plan = _towing_tank_plan()
    path = plan_workbook.write_plan(plan, tmp_path / "as_written.xlsx")
    wb = _recalculate(path, tmp_path)
    t = float(plan.model_fluid.temperature_si) - 273.15
    day = wb[plan_workbook.TEST_DAY_SHEET]
    _check_recalculated(wb, plan, day[plan_workbook.TEMPERATURE_CELL].value)
    ws = wb[plan_workbook.TEST_DAY_SHEET]
    assert ws[plan_workbook.TEMPERATURE_CELL].value == pytest.approx(t, abs=1e-6)
    first = plan_workbook.TEST_DAY_HEADER_ROW + 1
    assert _rel(ws[f"C{first}"].value, plan.matrix["model Reynolds number [-]"].iloc[0]) <= REL


def test_air_workbook_recalculates_at_a_new_test_day_temperature(tmp_path):
    # air has no closed form here: the sheet interpolates a 0.05 K table of the program's values
    plan = _wind_tunnel_plan()
    assert plan.model_fluid.fluid == "air"
    path = plan_workbook.write_plan(plan, tmp_path / "tunnel.xlsx")
    t = round(float(plan.model_fluid.temperature_si) - 273.15 + 7.318, 3)
    _set_test_day_temperature(path, t)
    wb = _recalculate(path, tmp_path)
    _check_recalculated(wb, plan, t)


def test_propeller_workbook_recalculates_blade_reynolds_and_blade_drag(tmp_path):
    plan = _propeller_plan()
    path = plan_workbook.write_plan(plan, tmp_path / "propeller.xlsx")
    _set_test_day_temperature(path, 17.5)
    wb = _recalculate(path, tmp_path)
    _check_recalculated(wb, plan, 17.5)


def test_temperature_outside_the_correlation_range_is_flagged(tmp_path):
    plan = _towing_tank_plan()
    path = plan_workbook.write_plan(plan, tmp_path / "hot.xlsx")
    _set_test_day_temperature(path, 45.0)  # fresh water correlation: 0-40 degC
    wb = _recalculate(path, tmp_path)
    day = wb[plan_workbook.TEST_DAY_SHEET]
    assert day[plan_workbook.RANGE_CHECK_CELL].value.startswith("OUTSIDE")

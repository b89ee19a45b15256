"""The demo cases: each reads, is labelled as invented, and plans end to end to a workbook.

Outside references:
* Froude scaling: velocity and time scale as lambda^0.5, lengths as lambda (Froude 1874; ITTC
  Recommended Procedure 7.5-02-02-01, Resistance Test, 2021, section on model speed).
* 1 kn = 1852/3600 m/s; 1 rpm = 1/60 revolutions per second (BIPM SI Brochure 2019, Table 8).
* Advance ratio J = V_A/(n D) and cavitation number (p - p_v)/(0.5 rho V^2) are the ITTC
  symbols (ITTC Symbols and Terminology List, 2017).
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from similitude.cli import main
from similitude.readers.case_file import load_case, load_facility

DEMO = Path(__file__).parents[1] / "demo_cases"
CASES = ("ferry_resistance", "ferry_self_propulsion", "offshore_seakeeping", "propeller_cavitation",
         "wing_wind_tunnel")
KN = 1852.0 / 3600.0


@pytest.fixture(scope="module")
def plans():
    from similitude.planning.planner import plan

    return {name: plan(load_case(DEMO / f"{name}.toml")) for name in CASES}


@pytest.mark.parametrize("name", CASES)
def test_demo_case_reads(name):
    case = load_case(DEMO / f"{name}.toml")
    assert case.prototype.speeds and case.facility.length > 0


@pytest.mark.parametrize("name", CASES)
def test_demo_case_is_labelled_invented_in_a_comment_and_in_the_metadata(name):
    text = (DEMO / f"{name}.toml").read_text()
    assert text.startswith("# INVENTED SCENARIO")
    meta = load_case(DEMO / f"{name}.toml").metadata
    assert "invented" in meta["project"].lower() and "invented" in meta["note"].lower()
    assert {"project", "client", "author", "date"} <= set(meta)


@pytest.mark.parametrize("path", sorted((DEMO / "facilities").glob("*.toml")))
def test_demo_facility_files_read_and_are_labelled_invented(path):
    assert path.read_text().startswith("# INVENTED")
    assert "invented" in load_facility(path).name


def test_ferry_case_is_sea_water_at_15_degc_in_a_fresh_water_tank():
    case = load_case(DEMO / "ferry_resistance.toml")
    assert case.prototype.fluid.name == "sea_water"
    assert case.prototype.fluid.temperature == pytest.approx(288.15)
    assert case.facility.fluids == ("fresh_water",)
    assert case.prototype.speeds[-1] == pytest.approx(18 * KN, rel=1e-12)
    assert len(case.matrix.loading) >= 3 and case.matrix.repeats >= 2


def test_seakeeping_case_has_jonswap_seas_for_three_hours_and_several_headings():
    case = load_case(DEMO / "offshore_seakeeping.toml")
    assert case.facility.kind == "wave_basin"
    assert all(w.kind == "irregular" and w.spectrum == "jonswap" for w in case.matrix.waves)
    assert all(w.duration == 3 * 3600.0 for w in case.matrix.waves)
    assert len(case.matrix.headings) >= 3


def test_propeller_case_matches_advance_ratio_and_cavitation_number():
    case = load_case(DEMO / "propeller_cavitation.toml")
    assert {"advance_ratio", "cavitation"} <= set(case.request.exact)
    assert case.prototype.rotation_rates == pytest.approx((105 / 60, 120 / 60), rel=1e-12)
    assert case.facility.pressure_range is not None


def test_wing_case_asks_reynolds_and_reports_mach_in_a_pressurised_tunnel():
    case = load_case(DEMO / "wing_wind_tunnel.toml")
    assert case.request.exact == ("reynolds",) and "mach" in case.request.report
    assert case.facility.pressure_range[1] > 101325.0


@pytest.mark.parametrize("name", CASES)
def test_demo_case_plans_end_to_end_to_a_workbook(name, tmp_path, capsys):
    out = tmp_path / f"{name}.xlsx"
    assert main(["plan", str(DEMO / f"{name}.toml"), "-o", str(out)]) == 0
    assert out.stat().st_size > 0
    assert "1:" in capsys.readouterr().out


def test_ferry_model_speed_follows_froude_scaling(plans):
    p = plans["ferry_resistance"]
    sp = p.speeds
    expected = sp["prototype speed [m/s]"] / math.sqrt(p.scale)   # V_m = V_s / sqrt(lambda)
    assert sp["model speed [m/s]"].to_numpy() == pytest.approx(expected.to_numpy(), rel=1e-9)


def test_seakeeping_model_peak_period_and_height_follow_froude_scaling(plans):
    p = plans["offshore_seakeeping"]
    m = p.matrix
    assert m["model peak period [s]"].to_numpy() == pytest.approx(
        (m["prototype peak period [s]"] / math.sqrt(30.0)).to_numpy(), rel=1e-9)
    assert m["model significant wave height [m]"].to_numpy() == pytest.approx(
        (m["prototype significant wave height [m]"] / 30.0).to_numpy(), rel=1e-9)


def test_propeller_model_keeps_the_advance_ratio(plans):
    p = plans["propeller_cavitation"]
    g = p.groups[p.groups["key"] == "advance_ratio"]
    assert g["ratio"].to_numpy() == pytest.approx(1.0, rel=1e-6)
    # J = V/(nD) at full scale: 5.5 m/s / (1.75 1/s * 4.2 m), computed by hand
    assert g["prototype value"].iloc[0] == pytest.approx(5.5 / (1.75 * 4.2), rel=1e-9)


def test_wing_model_matches_reynolds_and_misses_mach(plans):
    p = plans["wing_wind_tunnel"]
    g = p.groups
    assert g[g["key"] == "reynolds"]["matched"].all()
    mach = g[g["key"] == "mach"]
    assert not mach["matched"].any() and (mach["ratio"] < 1).all()

"""The Plan object: contract fields, tables, summaries, JSON and unit invariance.

Invented scenario: a 150 m ship at 6-10 m/s in sea water at 15 degC tested in a 200 m x 8 m x
4 m towing tank; the scale follows from the 0.5 % blockage limit (common practice),
lambda = sqrt(A_X / (0.005 B_T h)) = sqrt(190 / 0.16) = 34.46 (see test_solver), rounded up to
the convenient 1:35 (common practice: whole numbers for lambda >= 10).
"""

from __future__ import annotations

import json
import math
from dataclasses import fields

import pandas as pd
import pytest

import similitude as sim
from similitude.errors import InputError
from similitude.planning.case import Case, FluidSpec, MatchRequest, Prototype
from similitude.planning.facilities import Facility
from similitude.planning.planner import Plan, plan
from similitude.planning.solution import Solution
from similitude.units import to_si

KN = 1852.0 / 3600.0  # knot [m/s] (international nautical mile, 1929)
LIMITING = math.sqrt(190.0 / 0.16)
LAM = 35.0


def ship_case(speeds=(6.0, 8.0, 10.0), length=150.0, beam=24.0, draught=8.0, t=288.15,
              **req):
    proto = Prototype("surface_ship", length, speeds, FluidSpec("sea_water", t),
                      name="invented tanker",
                      dimensions={"beam": beam, "draught": draught, "midship_area": 190.0,
                                  "wetted_surface": 5000.0, "displacement": 24000.0})
    fac = Facility("towing_tank", "tank A", 200.0, 8.0, 4.0, (0.1, 6.0), acceleration=0.5)
    return Case(proto, fac, MatchRequest(**req), name="tanker resistance")


@pytest.fixture(scope="module")
def the_plan():
    return plan(ship_case())


def test_plan_is_callable_from_the_package(the_plan):
    p = sim.plan(ship_case())
    assert isinstance(p, Plan)
    assert p.scale == pytest.approx(the_plan.scale, rel=1e-12)


def test_plan_scale_and_model_length(the_plan):
    assert the_plan.scale == LAM
    assert the_plan.model_length == pytest.approx(150.0 / LAM, rel=1e-12)


def test_plan_notes_record_the_limiting_scale_before_rounding(the_plan):
    assert the_plan.solution.limiting_scale == pytest.approx(LIMITING, rel=1e-9)
    assert any("1:34.46" in n and "1:35" in n for n in the_plan.notes)


def test_model_dimensions_scale_as_length_area_and_volume(the_plan):
    # Geometric similarity: lengths / lambda, areas / lambda^2, volumes / lambda^3.
    d = the_plan.model_dimensions
    assert d["length"] == pytest.approx(150.0 / LAM, rel=1e-12)
    assert d["beam"] == pytest.approx(24.0 / LAM, rel=1e-12)
    assert d["wetted_surface"] == pytest.approx(5000.0 / LAM**2, rel=1e-12)
    assert d["displacement"] == pytest.approx(24000.0 / LAM**3, rel=1e-12)


def test_speeds_table_has_froude_scaled_model_speeds_and_knots(the_plan):
    s = the_plan.speeds
    assert list(s["prototype speed [m/s]"]) == [6.0, 8.0, 10.0]
    assert s["prototype speed [kn]"].iloc[2] == pytest.approx(10.0 / KN, rel=1e-12)
    assert s["model speed [m/s]"].iloc[2] == pytest.approx(10.0 / math.sqrt(LAM), rel=1e-9)


def test_groups_table_columns_and_froude_rows(the_plan):
    g = the_plan.groups
    assert list(g.columns) == ["group", "symbol", "key", "prototype speed [m/s]",
                               "prototype value", "model value", "ratio", "matched",
                               "requested"]
    fr = g[g["key"] == "froude"]
    assert len(fr) == 3 and fr["matched"].all() and (fr["requested"] == "exact").all()
    # Fr = V/sqrt(g L) at 10 m/s, 150 m: 10/sqrt(9.80665 x 150) = 0.2607.
    top = fr[fr["prototype speed [m/s]"] == 10.0].iloc[0]
    assert top["prototype value"] == pytest.approx(10 / math.sqrt(9.80665 * 150), rel=1e-12)
    assert top["model value"] == pytest.approx(top["prototype value"], rel=1e-9)


def test_reynolds_rows_are_unmatched_with_ratio_lambda_1_5_nu_ratio(the_plan):
    g = the_plan.groups
    re = g[g["key"] == "reynolds"]
    assert not re["matched"].any()
    nu_ratio = float(the_plan.model_fluid.kinematic_viscosity_si) / float(
        the_plan.prototype_fluid.kinematic_viscosity_si)
    assert re["ratio"].iloc[0] == pytest.approx(LAM**1.5 * nu_ratio, rel=1e-9)


def test_conflicts_are_at_the_design_speed(the_plan):
    cf = {c.group: c for c in the_plan.conflicts}
    top = the_plan.groups[(the_plan.groups["key"] == "reynolds")
                          & (the_plan.groups["prototype speed [m/s]"] == 10.0)].iloc[0]
    assert cf["reynolds"].prototype_value == pytest.approx(top["prototype value"], rel=1e-12)


def test_scale_factor_table_is_froude_with_density_ratio(the_plan):
    # Froude similarity (ITTC 7.5-02-02-01): velocity and time lambda^0.5, mass
    # lambda^3 rho_p/rho_m (sea-water ship, fresh-water model).
    sf = the_plan.scale_factors.set_index("quantity")["factor (prototype/model)"]
    rho = float(the_plan.prototype_fluid.density_si) / float(the_plan.model_fluid.density_si)
    assert sf["velocity"] == pytest.approx(LAM**0.5, rel=1e-12)
    assert sf["time"] == pytest.approx(LAM**0.5, rel=1e-12)
    assert sf["mass"] == pytest.approx(LAM**3 * rho, rel=1e-12)


def test_matrix_has_one_row_per_speed_by_default(the_plan):
    assert len(the_plan.matrix) == 3
    assert "model speed [m/s]" in the_plan.matrix.columns


def test_binding_constraint_and_notes(the_plan):
    assert "blockage" in the_plan.binding_constraint
    assert any("studs" in n for n in the_plan.notes)
    assert any("Schuster" in n for n in the_plan.notes)


def test_repr_and_html_summaries(the_plan):
    text = repr(the_plan)
    assert "1:35;" in text and "tank A" in text and "reynolds" in text
    h = the_plan._repr_html_()
    assert "<table" in h and "Conflicts" in h


def test_to_dict_is_json_ready(the_plan):
    d = json.loads(json.dumps(the_plan.to_dict()))
    assert d["scale"] == LAM
    assert d["scale_text"] == "1:35"
    assert len(d["speeds"]) == 3
    assert {c["name"] for c in d["checks"]} >= {"blockage ratio A_X/(B_T h)"}


def test_to_excel_refuses_to_overwrite(the_plan, tmp_path):
    target = tmp_path / "plan.xlsx"
    target.write_bytes(b"keep")
    with pytest.raises(InputError):
        the_plan.to_excel(target)
    assert target.read_bytes() == b"keep"
    assert isinstance(the_plan.to_excel(tmp_path / "new.xlsx"), type(target))


def test_same_case_in_other_units_gives_the_same_plan(the_plan):
    # Knots, feet and degrees Fahrenheit through the shared unit registry (pint).
    speeds = tuple(to_si(f"{v / KN!r} kn", "[velocity]", "speed") for v in (6.0, 8.0, 10.0))
    case = ship_case(speeds=speeds, length=to_si(f"{150 / 0.3048!r} ft", "[length]", "L"),
                     beam=to_si(f"{24 / 0.3048!r} ft", "[length]", "B"),
                     draught=to_si(f"{8 / 0.3048!r} ft", "[length]", "T"),
                     t=to_si("59 degF", "[temperature]", "T"))
    other = plan(case)
    assert other.scale == pytest.approx(the_plan.scale, rel=1e-9)
    assert other.model_length == pytest.approx(the_plan.model_length, rel=1e-9)
    pd.testing.assert_frame_equal(other.speeds, the_plan.speeds, rtol=1e-9)
    pd.testing.assert_frame_equal(other.groups, the_plan.groups, rtol=1e-9)


def test_plan_refuses_a_non_case():
    with pytest.raises(InputError, match="case"):
        plan({"prototype": 1})


# --- model fluid temperature -----------------------------------------------------------------
def test_free_tank_temperature_note_says_why_and_where_the_test_day_value_goes(the_plan):
    # Facility range 10-25 degC (Facility default); the warmest water has the lowest nu and so
    # the least Reynolds mismatch at a Froude speed.
    note = next(n for n in the_plan.notes if n.startswith("Model fluid temperature"))
    assert "25.00 degC is the warm end" in note and "10.0-25.0 degC" in note
    assert "Reynolds mismatch" in note and "'Test day' sheet" in note


def test_fixed_model_fluid_temperature_is_used_end_to_end():
    # Test-day water at 18 degC: the plan uses it, not the warmest water of the range.
    # nu of water at 18 degC, 0.101325 MPa from IAPWS-95 and the IAPWS 2008 viscosity (the
    # iapws package as the oracle).
    import iapws

    w = iapws.IAPWS95(T=291.15, P=0.101325)
    p = plan(ship_case(model_fluid=FluidSpec("fresh_water", 291.15)))
    assert float(p.model_fluid.temperature_si) == 291.15
    assert float(p.model_fluid.kinematic_viscosity_si) == pytest.approx(w.mu / w.rho, rel=1e-6)
    re = p.groups[(p.groups["key"] == "reynolds") & (p.groups["prototype speed [m/s]"] == 10.0)]
    vm = 10.0 / math.sqrt(LAM)
    assert re["model value"].iloc[0] == pytest.approx(vm * 150.0 / LAM * w.rho / w.mu, rel=1e-6)
    assert any("fixed by the case" in n and "'Test day' sheet" in n for n in p.notes)


def test_case_file_model_fluid_fixes_the_planned_temperature():
    import tomllib

    from similitude.readers.case_file import parse_case

    text = """
    [prototype]
    kind = "surface_ship"
    length = "150 m"
    speeds = ["10 m/s"]
    [prototype.sizes]
    midship_area = "190 m^2"
    [prototype.fluid]
    name = "sea_water"
    temperature = "15 degC"
    [facility]
    kind = "towing_tank"
    name = "tank A"
    length = "200 m"
    width = "8 m"
    depth = "4 m"
    speed_limits = ["0.1 m/s", "6 m/s"]
    fluids = ["fresh_water"]
    temperature_limits = ["10 degC", "25 degC"]
    [matching]
    exact = ["froude"]
    [matching.model_fluid]
    name = "fresh_water"
    temperature = "18 degC"
    """
    p = plan(parse_case(tomllib.loads(text)))
    assert float(p.model_fluid.temperature_si) == pytest.approx(291.15, rel=1e-12)


# --- propeller plan, summaries of other scenarios ----------------------------------------------
def propeller_case():
    # Invented: a 6 m propeller at 7 and 8 m/s, 1.6 and 1.8 1/s, tested in a cavitation tunnel
    # (see test_solver.test_cavitation_tunnel_propeller_by_hand for the scale 1:15).
    proto = Prototype("propeller", 6.0, (7.0, 8.0), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 6.0, "blade_chord": 1.8},
                      rotation_rates=(1.6, 1.8), immersion=8.0)
    fac = Facility("cavitation_tunnel", "cav", 3.0, 0.8, 0.8, (1.0, 12.0),
                   fluids=("fresh_water",), temperature_range=(293.15, 293.15),
                   pressure_range=(5e3, 2e5), max_rotation_rate=50.0)
    return Case(proto, fac, MatchRequest(exact=("advance_ratio", "cavitation"),
                                         report=("reynolds",)))


def test_propeller_plan_lists_model_rotation_rates_that_keep_the_advance_ratio():
    # J = V_A/(n D) (ITTC Symbols 2017) equal at both scales, speed by speed.
    p = plan(propeller_case())
    s = p.speeds
    assert p.scale == pytest.approx(15.0, rel=1e-9)
    for vp, n_p, vm, n_m in zip(s["prototype speed [m/s]"], s["prototype rotation rate [1/s]"],
                                s["model speed [m/s]"], s["model rotation rate [1/s]"],
                                strict=True):
        assert vm / (n_m * 6.0 / p.scale) == pytest.approx(vp / (n_p * 6.0), rel=1e-9)
    assert {c.group for c in p.conflicts} >= {"reynolds"}
    assert "ITTC-78" in next(c for c in p.conflicts if c.group == "reynolds").consequence


def test_html_summary_tables_checks_with_margin_and_source(the_plan):
    h = the_plan._repr_html_()
    assert "<th>margin</th>" in h and "<th>source</th>" in h
    assert "blockage ratio A_X/(B_T h)" in h and "Notes" in h


def test_relaxed_plan_says_which_group_was_dropped():
    p = plan(ship_case(exact=("froude", "reynolds"), relax=True))
    assert "REQUESTED BUT NOT MATCHED: reynolds" in repr(p)
    assert any("'reynolds' cannot be met" in n and "lambda^-1.5" in n for n in p.notes)


def test_repr_and_json_carry_the_limiting_scale(the_plan):
    assert "(limiting scale 1:34.4601)" in repr(the_plan)
    assert the_plan.to_dict()["limiting_scale"] == pytest.approx(LIMITING, rel=1e-9)


@pytest.mark.parametrize("result", [Plan, Solution])
def test_every_field_of_the_result_objects_is_documented(result):
    # A notebook user reads the result objects' fields from their docstrings (numpydoc
    # Attributes section), so a field without an entry there is undocumented.
    attributes = result.__doc__.split("Attributes\n    ----------\n", 1)[1]
    names = {n.strip() for line in attributes.splitlines() if line.startswith("    ")
             and not line.startswith("     ") for n in line.split(":")[0].split(",")}
    assert [f.name for f in fields(result) if f.name not in names] == []

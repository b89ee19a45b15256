"""Temperature honesty: a free model-fluid temperature is planned where the objective puts it
(the warm end of a tank's range, for the least Reynolds mismatch), the plan says which end,
and the Reynolds-dependent checks hold at the least favourable end of the range, because a
tank's water is at whatever temperature it has on the test day.

Hand calculation: Re_m = V_m L_m / nu(T), with nu of fresh water from IAPWS R12-08 and the
IAPWS density (through fluids_props, checked against IAPWS in its own tests); minimum model
Reynolds number 2e6 (common practice, from memory).
"""

from __future__ import annotations

import math

import pytest
from scenarios import ship, tank

import fluids_props as fp
from similitude.planning.case import Case, FluidSpec, MatchRequest
from similitude.planning.planner import plan


def _re_check(p):
    (c,) = [c for c in p.checks if c.name.startswith("model Reynolds number at the lowest")]
    return c


def test_reynolds_check_uses_the_cold_end_of_a_tanks_range():
    # Tank 8-24 degC; the plan runs at 24 degC (least Reynolds mismatch) at 1:35; the check
    # uses 8 degC: Re = (6/sqrt(35)) (150/35) / nu(8 degC).
    p = plan(Case(ship(), tank(temperature_range=(281.15, 297.15))))
    assert float(p.model_fluid.temperature_si) == pytest.approx(297.15)
    c = _re_check(p)
    nu8 = float(fp.fresh_water("8 degC").kinematic_viscosity.magnitude)
    assert c.value == pytest.approx(6.0 / math.sqrt(35.0) * (150.0 / 35.0) / nu8, rel=1e-9)
    assert "at 8.0 degC, the least favourable facility temperature" in c.name


def test_cold_end_reynolds_is_lower_than_at_the_planned_temperature():
    p = plan(Case(ship(), tank(temperature_range=(281.15, 297.15))))
    planned = p.matrix["model Reynolds number [-]"].min()
    assert _re_check(p).value < planned
    # ratio = nu(24 degC)/nu(8 degC), about 0.66
    nu8 = float(fp.fresh_water("8 degC").kinematic_viscosity.magnitude)
    nu24 = float(fp.fresh_water("24 degC").kinematic_viscosity.magnitude)
    assert _re_check(p).value / planned == pytest.approx(nu24 / nu8, rel=1e-9)


def test_note_says_which_end_was_planned_and_where_the_checks_hold():
    p = plan(Case(ship(), tank(temperature_range=(281.15, 297.15))))
    (note,) = [n for n in p.notes if n.startswith("Model fluid temperature")]
    assert "24.00 degC is the warm end of the facility range 8.0-24.0 degC" in note
    assert "least favourable end" in note and "8.0 degC" in note


def test_a_fixed_temperature_is_checked_where_it_is():
    # the case fixes 15 degC: no other temperature is assumed
    fixed = FluidSpec("fresh_water", 288.15)
    p = plan(Case(ship(), tank(), MatchRequest(model_fluid=fixed)))
    c = _re_check(p)
    assert c.name == "model Reynolds number at the lowest speed"
    nu15 = float(fp.fresh_water("15 degC").kinematic_viscosity.magnitude)
    assert c.value == pytest.approx(6.0 / math.sqrt(35.0) * (150.0 / 35.0) / nu15, rel=1e-9)

"""Every check a case asks for appears: it runs, or it is listed as "not checked" with the
input that would enable it; a fixed model over a soft limit is warned about with the
correction to apply, a hard limit still refuses.

Invented scenarios; each expected number is worked by hand beside its assertion. Sources:
Schuster's blockage correction dV/V = m/(1 - m - Fh^2) + (2/3) Fh^10 (upper bound of the wave
term), Schiffstechnik 3 (1955/56), listed in ITTC 7.5-02-02-01 (2011) §3.6.3.
"""

from __future__ import annotations

import math

import pytest
from scenarios import ship, tank

from similitude.errors import InfeasibleError
from similitude.planning.case import (
    Case,
    FluidSpec,
    MatchRequest,
    MatrixSpec,
    Prototype,
    WaveCondition,
)
from similitude.planning.facilities import Facility
from similitude.planning.findings import checks_summary
from similitude.planning.planner import plan

G = 9.80665  # standard gravity [m/s^2]


def by_name(p):
    return {c.name: c for c in p.checks}


# -- not checked ----------------------------------------------------------------------------
def test_ship_without_sizes_lists_blockage_and_depth_as_not_checked():
    p = plan(Case(ship(dimensions={}), tank()))
    found = by_name(p)
    blockage = found["blockage ratio A_X/(B_T h)"]
    assert blockage.status == "not checked"
    assert blockage.advice == "give prototype.sizes.midship_area, or beam and draught"
    assert found["tank depth needed 3 sqrt(B_m T_m)"].status == "not checked"
    assert "passed" not in checks_summary(p.checks)
    assert "2 not checked" in checks_summary(p.checks)


def test_beam_and_draught_alone_enable_the_blockage_check_as_an_upper_bound():
    # A_X ~ B T = 24 x 8 = 192 m^2 (midship coefficient 1): the check runs and says so.
    p = plan(Case(ship(dimensions={"beam": 24.0, "draught": 8.0}), tank()))
    c = by_name(p)["blockage ratio A_X/(B_T h)"]
    assert c.status in ("ok", "at limit") and "beam x draught" in c.source


def test_waves_in_a_tank_without_wavemaker_data_are_not_checked_against_it():
    sea = WaveCondition("irregular", significant_height=4.0, peak_period=10.0, name="sea")
    p = plan(Case(ship(), tank(), matrix=MatrixSpec(waves=(sea,))))
    found = by_name(p)
    assert found["model wave periods vs wavemaker range"].status == "not checked"
    assert "facility.wave_periods" in found["model wave periods vs wavemaker range"].advice
    assert found["model wave heights vs wavemaker's highest wave"].status == "not checked"
    assert "facility.highest_wave" in found["model wave heights vs wavemaker's highest wave"
                                            ].advice


def test_propeller_without_dynamometer_limit_lists_the_rotation_rate_as_not_checked():
    proto = Prototype("propeller", 4.0, (6.0,), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 4.0}, rotation_rates=(2.0,))
    p = plan(Case(proto, tank(), MatchRequest(exact=("advance_ratio", "froude"),
                                              model_length=0.25)))
    c = by_name(p)["model rotation rate"]
    assert c.status == "not checked" and "facility.fastest_rotation" in c.advice


def test_tank_without_acceleration_lists_the_steady_run_as_not_checked():
    p = plan(Case(ship(), tank(acceleration=None)))
    c = by_name(p)["steady-run time at the highest speed"]
    assert c.status == "not checked" and "facility.acceleration" in c.advice


def test_body_in_a_wind_tunnel_without_area_lists_the_blockage_as_not_checked():
    proto = Prototype("vehicle", 4.5, (30.0,), FluidSpec("air", 288.15))
    fac = Facility("wind_tunnel", "wt", 10.0, 4.0, 3.0, (5.0, 60.0), fluids=("air",))
    p = plan(Case(proto, fac, MatchRequest(exact=("mach",), report=("reynolds",),
                                           scale=4.0)))
    c = by_name(p)["tunnel blockage/test section"]
    assert c.status == "not checked" and "frontal_area" in c.advice


def test_two_dimensional_wing_section_blockage_is_thickness_over_height():
    # A section spanning the test section: area t_m W over W H = t_m/H = (0.36/6)/2 = 0.03.
    proto = Prototype("wing", 2.4, (45.0,), FluidSpec("air", 288.15),
                      dimensions={"thickness": 0.36})
    fac = Facility("wind_tunnel", "wt", 8.0, 2.5, 2.0, (5.0, 120.0), fluids=("air",),
                   temperature_range=(288.15, 288.15))
    p = plan(Case(proto, fac, MatchRequest(exact=("mach",), report=("reynolds",),
                                           scale=6.0)))
    c = next(c for c in p.checks if c.name.startswith("tunnel blockage"))
    assert c.value == pytest.approx(0.36 / 6.0 / 2.0, rel=1e-12)
    assert "2-D section" in c.name


# -- pressure ranges ------------------------------------------------------------------------
def test_pressurised_wind_tunnel_has_pressure_range_rows():
    proto = Prototype("wing", 2.4, (70.0,), FluidSpec("air", 288.15),
                      dimensions={"thickness": 0.36})
    fac = Facility("wind_tunnel", "wt", 8.0, 2.5, 2.0, (5.0, 120.0), fluids=("air",),
                   temperature_range=(288.15, 288.15), pressure_range=(0.8e5, 4e5))
    p = plan(Case(proto, fac, MatchRequest(exact=("reynolds",), report=("mach",),
                                           scale=6.0)))
    found = by_name(p)
    lo = found["test-section static pressure vs facility minimum"]
    hi = found["test-section static pressure vs facility maximum"]
    assert lo.limit == 0.8e5 and hi.limit == 4e5


def test_tunnel_pressure_exactly_at_the_facility_maximum_is_at_limit():
    # Re_m = Re_p at 1:6 needs rho_m/mu_m = 6 x 70/V_m x rho_p/mu_p; the least Mach mismatch
    # pushes the pressure to the 4 bar ceiling (the demo wing): value = limit, margin 0.
    proto = Prototype("wing", 2.4, (70.0,), FluidSpec("air", 288.15),
                      dimensions={"thickness": 0.36})
    fac = Facility("wind_tunnel", "wt", 8.0, 2.5, 2.0, (5.0, 120.0), fluids=("air",),
                   temperature_range=(288.15, 288.15), pressure_range=(0.8e5, 4e5))
    p = plan(Case(proto, fac, MatchRequest(exact=("reynolds",), report=("mach",),
                                           scale=6.0, objective="least_mismatch")))
    hi = by_name(p)["test-section static pressure vs facility maximum"]
    assert hi.value == pytest.approx(4e5, rel=1e-9)
    assert hi.status == "at limit"


def test_depressurised_tank_checks_the_air_pressure_above_the_water():
    proto = Prototype("propeller", 4.0, (6.0,), FluidSpec("sea_water", 288.15),
                      dimensions={"diameter": 4.0, "blade_chord": 1.2}, rotation_rates=(2.0,),
                      immersion=6.0)
    fac = tank(pressure_range=(2.5e3, 101325.0), max_rotation_rate=40.0)
    p = plan(Case(proto, fac, MatchRequest(exact=("advance_ratio", "cavitation"),
                                           report=("reynolds",), model_length=0.25)))
    found = by_name(p)
    assert found["air pressure above the water vs facility minimum"].limit == 2.5e3
    assert found["air pressure above the water vs facility maximum"].limit == 101325.0


# -- fixed models over soft limits ----------------------------------------------------------
def _existing_model_blockage(m, fh):
    # Schuster dV/V = m/(1 - m - Fh^2) + (2/3) Fh^10 (wave term at its upper bound)
    return m / (1 - m - fh**2) + 2.0 / 3.0 * fh**10


@pytest.mark.parametrize("request_", [MatchRequest(model_length=4.5),
                                      MatchRequest(scale=150.0 / 4.5)])
def test_fixed_model_over_the_blockage_limit_warns_with_schuster_correction(request_):
    # 4.5 m model of the 150 m ship: lambda = 33.33, A_X = 190/33.33^2 = 0.171 m^2,
    # m = 0.171/32 = 0.005344 > 0.005 (6.9 % over); V_m = 10/sqrt(33.33) = 1.732 m/s,
    # Fh = 1.732/sqrt(g 4) = 0.2765; Schuster dV/V = 0.005344/(1 - 0.005344 - 0.07648)
    # + (2/3) 0.2765^10 = 0.582 %.
    p = plan(Case(ship(), tank(), request_))
    c = by_name(p)["blockage ratio A_X/(B_T h)"]
    lam = 150.0 / 4.5
    m = 190.0 / lam**2 / 32.0
    fh = 10.0 / math.sqrt(lam) / math.sqrt(G * 4.0)
    assert c.value == pytest.approx(m, rel=1e-12)
    assert c.status == "warning"
    dv = _existing_model_blockage(m, fh)
    assert dv == pytest.approx(0.00582, abs=5e-6)
    assert f"dV/V = {dv * 100:.3g} %" in c.advice and "Schuster" in c.advice


def test_fixed_model_over_a_hard_limit_is_still_refused():
    # V_m = 10/sqrt(33.33) = 1.732 m/s > carriage maximum 1.5 m/s: 15.5 % over.
    with pytest.raises(InfeasibleError, match="carriage maximum"):
        plan(Case(ship(), tank(speed_range=(0.1, 1.5)), MatchRequest(model_length=4.5)))


def test_free_scale_keeps_the_blockage_limit_as_a_search_bound():
    # lambda at m = 0.005: sqrt(190/(0.005 x 32)) = 34.46, rounded up to 1:35.
    p = plan(Case(ship(), tank()))
    assert p.scale == 35.0
    assert by_name(p)["blockage ratio A_X/(B_T h)"].status == "ok"

"""The case model: validation of prototype, facility and request, with one-line errors.

Each bad input must raise a ValueError subclass naming the field, the value and what was
expected (project rule); nothing is clipped silently.
"""

from __future__ import annotations

import pytest

from fluids_props import OutOfRangeError
from similitude.errors import InputError
from similitude.planning import solver
from similitude.planning.case import (
    Case,
    FluidSpec,
    MatchRequest,
    MatrixSpec,
    Prototype,
    WaveCondition,
    dimension_power,
)
from similitude.planning.facilities import Facility


def proto(**kw):
    base = dict(kind="surface_ship", length=100.0, speeds=(5.0,),
                fluid=FluidSpec("sea_water", 288.15))
    base.update(kw)
    return Prototype(**base)


def tank(**kw):
    base = dict(kind="towing_tank", name="t", length=100.0, width=5.0, depth=3.0,
                speed_range=(0.1, 5.0))
    base.update(kw)
    return Facility(**base)


@pytest.mark.parametrize("length", [0.0, -3.0, float("nan"), float("inf")])
def test_non_positive_or_non_finite_length_is_refused(length):
    with pytest.raises(InputError, match="prototype.length"):
        proto(length=length)


def test_negative_speed_is_refused_naming_its_index():
    with pytest.raises(InputError, match=r"prototype.speeds\[1\]"):
        proto(speeds=(5.0, -1.0))


def test_unknown_prototype_kind_lists_the_kinds():
    with pytest.raises(InputError, match="surface_ship"):
        proto(kind="submarine")


def test_unknown_group_name_is_refused():
    with pytest.raises(InputError, match="match.exact: 'froud'"):
        MatchRequest(exact=("froud",))


def test_unknown_friction_line_is_refused():
    with pytest.raises(InputError, match="match.friction_line"):
        MatchRequest(friction_line="karman")


def test_form_factor_must_be_a_plausible_k():
    with pytest.raises(InputError, match="match.form_factor"):
        MatchRequest(form_factor=-0.1)


def test_scale_and_model_length_together_are_refused():
    with pytest.raises(InputError, match="both given"):
        MatchRequest(scale=20.0, model_length=5.0)


def test_facility_negative_acceleration_is_refused():
    with pytest.raises(InputError, match="facility.acceleration"):
        tank(acceleration=-0.5)


def test_facility_fluids_as_a_string_is_refused():
    with pytest.raises(InputError, match="facility.fluids"):
        tank(fluids="fresh_water")


def test_facility_min_steady_time_defaults_to_none():
    assert tank().min_steady_time is None
    assert tank(min_steady_time=8.0).min_steady_time == 8.0


def test_unknown_prototype_fluid_is_refused_by_the_planner():
    case = Case(proto(fluid=FluidSpec("molasses", 288.15)), tank())
    with pytest.raises(InputError, match="prototype.fluid.name"):
        solver.solve(case)


def test_prototype_temperature_outside_validity_is_refused():
    # Fresh and sea water correlations hold 0-40 degC (IAPWS/TEOS-10 ranges of the catalogue).
    case = Case(proto(fluid=FluidSpec("sea_water", 350.0)), tank())
    with pytest.raises(OutOfRangeError, match="prototype.fluid"):
        solver.solve(case)


def test_fixed_model_fluid_temperature_outside_validity_is_refused():
    case = Case(proto(), tank(), MatchRequest(model_fluid=FluidSpec("fresh_water", 360.0)))
    with pytest.raises(OutOfRangeError, match="match.model_fluid.temperature"):
        solver.solve(case)


def test_facility_smaller_than_any_sensible_model_is_infeasible():
    from similitude.errors import InfeasibleError

    # A 5 cm wide tank admits models up to 0.05/0.707 = 7 cm (Kelvin wedge), but a model
    # that small runs at 5 m/s x sqrt(0.07/100) = 0.13 m/s, below the 0.5 m/s carriage
    # minimum: no model satisfies both, and both limits are named.
    case = Case(proto(), tank(width=0.05, depth=0.05, speed_range=(0.5, 5.0)))
    with pytest.raises(InfeasibleError, match="Kelvin wedge"):
        solver.solve(case)


def test_propeller_needs_rotation_rates():
    p = proto(kind="propeller", dimensions={"diameter": 5.0})
    fac = Facility("cavitation_tunnel", "c", 3.0, 0.8, 0.8, (1.0, 10.0))
    with pytest.raises(InputError, match="prototype.rotation_rates"):
        solver.solve(Case(p, fac, MatchRequest(exact=("advance_ratio",))))


def test_mach_in_a_liquid_is_refused():
    with pytest.raises(InputError, match="'mach' has no value"):
        solver.solve(Case(proto(), tank(), MatchRequest(exact=("mach",))))


@pytest.mark.parametrize("key, power", [("beam", 1), ("wetted_surface", 2),
                                        ("midship_area", 2), ("frontal_area", 2),
                                        ("displacement", 3), ("hull_volume", 3),
                                        ("span", 1)])
def test_dimension_power_by_key(key, power):
    assert dimension_power(key) == power


def test_fixed_model_fluid_must_be_one_of_the_facility_fluids():
    case = Case(proto(), tank(), MatchRequest(model_fluid=FluidSpec("sea_water", 290.0)))
    with pytest.raises(InputError, match="match.model_fluid.name"):
        solver.solve(case)


@pytest.mark.parametrize("w", [-0.1, 1.5, float("nan")])
def test_mass_fraction_outside_0_to_1_is_refused(w):
    with pytest.raises(InputError, match="fluid.mass_fraction"):
        FluidSpec("glycerol_water", 293.15, mass_fraction=w)


def test_round_scale_must_be_a_boolean():
    with pytest.raises(InputError, match="match.round_scale"):
        MatchRequest(round_scale="yes")


@pytest.mark.parametrize("kw,field", [
    (dict(speed_basis="knots"), "matrix.speed_basis"),
    (dict(repeats=0), "matrix.repeats"),
    (dict(repeats=1.5), "matrix.repeats"),
    (dict(speeds=(-1.0,)), "matrix.speeds[0]"),
    (dict(current=-0.5), "matrix.current"),
    (dict(waiting_time=float("nan")), "matrix.waiting_time"),
    (dict(waves=(WaveCondition("irregular", peak_period=8.0),)), "matrix.waves[0]"),
    (dict(waves=(WaveCondition("regular", height=1.0),)), "matrix.waves[0].period"),
    (dict(waves=(WaveCondition("swell", period=8.0, height=1.0),)), "matrix.waves[0].kind"),
    (dict(waves=(WaveCondition("irregular", significant_height=3.0, peak_period=8.0,
                               spectrum="pm"),)), "matrix.waves[0].spectrum"),
])
def test_bad_matrix_specification_is_a_one_line_input_error(kw, field):
    with pytest.raises(InputError) as err:
        MatrixSpec(**kw)
    assert str(err.value).startswith(field)
    assert "\n" not in str(err.value)


# -- the kind of test (common practice: which facility runs which test) -----------------------

@pytest.mark.parametrize("proto_kind, facility_kind, expected", [
    ("surface_ship", "towing_tank", "resistance"),
    ("propeller", "towing_tank", "open_water"),
    ("offshore_structure", "wave_basin", "seakeeping"),
    ("propeller", "cavitation_tunnel", "cavitation"),
    ("wing", "wind_tunnel", "wind_tunnel"),
])
def test_test_kind_is_read_from_prototype_and_facility_when_not_given(proto_kind, facility_kind,
                                                                      expected):
    case = Case(proto(kind=proto_kind), tank(kind=facility_kind))
    assert case.test == expected


def test_self_propulsion_test_in_a_towing_tank_is_kept():
    assert Case(proto(), tank(), test="self_propulsion").test == "self_propulsion"


def test_test_kind_the_facility_cannot_run_is_refused_naming_both():
    with pytest.raises(InputError, match="test: a cavitation test cannot be run in a towing tank"):
        Case(proto(), tank(), test="cavitation")


def test_unknown_test_kind_is_refused_with_the_list():
    with pytest.raises(InputError, match="test: 'towing' is not a kind of test"):
        Case(proto(), tank(), test="towing")

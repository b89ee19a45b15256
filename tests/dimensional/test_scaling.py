"""Scale factors prototype/model from the dimensions of a quantity.

Outside references: the Froude-scaling table of ITTC 7.5-02-07-02.1 "Seakeeping Experiments"
(Rev 04, 2014) and of Hughes, *Physical Models and Laboratory Techniques in Coastal
Engineering* (1993) ch. 2 (from memory of both: time lambda^0.5, force lambda^3, power
lambda^3.5, moment lambda^4, S(omega) lambda^2.5 with equal density); pint for dimensions.
"""

import math

import pytest

from similitude.dimensional.scaling import scale_factor, scale_factor_table, scaling_ratios
from similitude.errors import InputError
from similitude.units import Q_

LAM = 25.0


def froude_row(table, quantity):
    return table.set_index("quantity").loc[quantity]


@pytest.fixture(scope="module")
def froude_table():
    return scale_factor_table(LAM)


@pytest.mark.parametrize("quantity,power", [
    # ITTC 7.5-02-07-02.1 / Hughes 1993 Froude table (same fluid), from memory
    ("length", 1), ("area", 2), ("volume", 3), ("time", 0.5), ("velocity", 0.5),
    ("acceleration", 0), ("frequency", -0.5), ("rotation rate", -0.5), ("mass", 3),
    ("force", 3), ("moment", 4), ("power", 3.5), ("pressure", 1), ("energy", 4),
    ("mass moment of inertia", 5), ("wave height", 1), ("wave period", 0.5),
    ("spectral density S(ω)", 2.5), ("kinematic viscosity needed", 1.5),
    ("linear stiffness", 2),
])
def test_froude_table_matches_published_powers(froude_table, quantity, power):
    assert froude_row(froude_table, quantity)["factor (prototype/model)"] == \
        pytest.approx(LAM**power, rel=1e-12)


def test_froude_force_carries_the_density_ratio():
    # ITTC 7.5-02-07-02.1: force lambda^3 rho_p/rho_m; sea water 1026.021 and fresh water
    # 999.1026 kg/m^3 at 15 degC (ITTC 7.5-02-01-03, 2011 table)
    r = 1026.021 / 999.1026
    t = scale_factor_table(LAM, density_ratio=r)
    row = froude_row(t, "force")
    assert row["factor (prototype/model)"] == pytest.approx(LAM**3 * r)
    assert row["expression"] == "λ^3·ρp/ρm"
    assert froude_row(t, "power")["expression"] == "λ^3.5·ρp/ρm"
    assert froude_row(t, "time")["expression"] == "λ^0.5"


def test_table_has_the_agreed_columns(froude_table):
    assert {"quantity", "dimension", "factor (prototype/model)", "expression"} <= \
        set(froude_table.columns)


def test_scale_factor_from_a_unit_uses_pint_dimensions():
    # N = kg m s^-2, so Froude force factor lambda^3 (pint gives the dimensions)
    assert scale_factor("N", LAM) == pytest.approx(LAM**3)
    assert scale_factor({"M": 1, "L": 2, "T": -3}, LAM) == pytest.approx(LAM**3.5)


def test_reynolds_scaling_force_is_independent_of_scale_in_the_same_fluid():
    # equal Re in the same fluid: V_m = lambda V_p, so F = rho V^2 L^2 is unchanged
    # (White 2011, sec. 5.5, from memory)
    t = scale_factor_table(10, law="reynolds")
    assert froude_row(t, "force")["factor (prototype/model)"] == pytest.approx(1.0)
    assert froude_row(t, "velocity")["factor (prototype/model)"] == pytest.approx(0.1)


def test_mach_scaling_keeps_velocity_for_equal_speed_of_sound():
    t = scale_factor_table(8, law="mach")
    assert froude_row(t, "velocity")["factor (prototype/model)"] == pytest.approx(1.0)
    assert froude_row(t, "time")["factor (prototype/model)"] == pytest.approx(8.0)


def test_general_law_uses_the_given_velocity_ratio():
    # hand: lambda 4, V ratio 2 -> time 4/2 = 2, force 2^2 * 4^2 = 64
    t = scale_factor_table(4, law="general", velocity_ratio=2)
    assert froude_row(t, "time")["factor (prototype/model)"] == pytest.approx(2.0)
    assert froude_row(t, "force")["factor (prototype/model)"] == pytest.approx(64.0)


def test_ratio_notation_of_the_trade_is_read():
    # "1:25" is lambda = 25
    assert scaling_ratios("froude", "1:25").velocity == pytest.approx(5.0)


def test_scaling_ratios_derive_time_and_mass():
    r = scaling_ratios("froude", 16, density_ratio=1.025)
    assert r.time == pytest.approx(4.0)
    assert r.mass == pytest.approx(1.025 * 16**3)


def test_unknown_law_is_refused_listing_laws():
    with pytest.raises(InputError, match="froude, reynolds, mach, general"):
        scale_factor_table(25, law="cauchy")


def test_general_law_needs_a_velocity_ratio():
    with pytest.raises(InputError, match="velocity_ratio"):
        scaling_ratios("general", 10)


@pytest.mark.parametrize("bad", [0, -5, "big", math.nan])
def test_bad_scale_is_refused(bad):
    with pytest.raises(InputError, match="scale"):
        scale_factor_table(bad)


def test_quantity_with_temperature_dimension_is_refused():
    with pytest.raises(InputError, match="temperature"):
        scale_factor("K", 10)


def test_factor_converts_a_measured_model_force_consistently_with_pint():
    # a 12.0 N model force at 1:25 in fresh water -> prototype 12.0 * 25^3 N = 187.5 kN
    f_p = Q_(12.0, "N") * scale_factor("N", 25)
    assert f_p.to("kN").magnitude == pytest.approx(187.5)

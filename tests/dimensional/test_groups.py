"""The catalogue of named groups: keys, trade names and symbols, dimensionless forms, lookup.

Outside references: ITTC Symbols and Terminology List (2017) for names and symbols; pint for
checking that every catalogued form is dimensionless; White, *Fluid Mechanics* (2011) ch. 5.
"""

from fractions import Fraction

import pytest

from similitude.dimensional import groups
from similitude.errors import InputError
from similitude.units import Q_

REQUIRED = ("froude", "reynolds", "mach", "weber", "cavitation", "advance_ratio", "strouhal",
            "euler", "depth_froude", "rossby", "richardson", "keulegan_carpenter", "cauchy",
            "force_coefficient", "thrust_coefficient", "torque_coefficient",
            "power_coefficient")


def test_catalogue_holds_the_required_keys():
    assert set(REQUIRED) <= set(groups.keys())


@pytest.mark.parametrize("key,name,symbol", [
    # ITTC Symbols and Terminology List 2017 / DESIGN.md conventions
    ("froude", "Froude number", "Fr"),
    ("reynolds", "Reynolds number", "Re"),
    ("weber", "Weber number", "We"),
    ("mach", "Mach number", "Ma"),
    ("strouhal", "Strouhal number", "St"),
    ("euler", "Euler number", "Eu"),
    ("advance_ratio", "advance ratio", "J"),
    ("thrust_coefficient", "thrust coefficient", "K_T"),
    ("torque_coefficient", "torque coefficient", "K_Q"),
    # heat transfer and rotating/stratified flow: Incropera & DeWitt (2007); Greenspan (1968);
    # Turner (1973); acoustics: Pierce (1989) (names and symbols from memory of the texts)
    ("nusselt", "Nusselt number", "Nu"),
    ("peclet", "Peclet number", "Pe"),
    ("rayleigh", "Rayleigh number", "Ra"),
    ("ekman", "Ekman number", "Ek"),
    ("densimetric_froude", "densimetric Froude number", "Fr_d"),
    ("helmholtz", "Helmholtz number", "He"),
])
def test_trade_names_and_symbols(key, name, symbol):
    g = groups.get(key)
    assert (g.name, g.symbol) == (name, symbol)


@pytest.mark.parametrize("group", groups.CATALOGUE, ids=lambda g: g.key)
def test_every_form_is_dimensionless_by_pint(group):
    # each role's unit from ROLES, combined by pint
    for form in group.forms:
        q = Q_(1.0, "dimensionless")
        for role, e in form:
            q = q * Q_(1.0, groups.ROLES[role][0]) ** float(e)
        assert q.dimensionless, group.key


@pytest.mark.parametrize("group", groups.CATALOGUE, ids=lambda g: g.key)
def test_every_group_states_meaning_and_regimes_with_a_source(group):
    assert group.meaning and group.regimes and group.definition
    # a source or "common practice" in the regimes text
    assert any(tag in group.regimes for tag in ("19", "20", "ITTC", "common practice", "limit"))


def test_cavitation_number_carries_the_half_of_the_dynamic_pressure():
    # sigma_v = (p - p_v) / (rho V^2 / 2)  (ITTC 2017 symbols; DESIGN.md)
    assert groups.get("cavitation").factors[0] == 2


def test_unknown_key_is_refused_listing_valid_keys():
    with pytest.raises(InputError, match="froude"):
        groups.get("frode")


def test_lookup_identifies_inverse_square_of_froude():
    # g L / V^2 = Fr^-2
    m = groups.lookup({"gravity": 1, "length": 1, "velocity": -2})
    assert m.group.key == "froude" and m.power == -2


def test_lookup_identifies_reynolds_from_dynamic_viscosity():
    m = groups.lookup({"density": 1, "velocity": 1, "length": 1, "dynamic_viscosity": -1})
    assert m.group.key == "reynolds" and m.power == 1


def test_lookup_generalises_thrust_to_force():
    # T / (rho V^2 L^2) with a thrust is still a force coefficient
    m = groups.lookup({"thrust": 1, "density": -1, "velocity": -2, "length": -2})
    assert m.group.key == "force_coefficient" and m.generalised


def test_lookup_prefers_keulegan_carpenter_over_inverse_strouhal():
    # U T / D is KC (Keulegan & Carpenter 1958); L / (U T) is St with f = 1/T
    assert groups.lookup({"velocity": 1, "period": 1, "length": -1}).group.key == \
        "keulegan_carpenter"
    assert groups.lookup({"velocity": -1, "period": -1, "length": 1}).group.key == "strouhal"


def test_lookup_returns_none_for_an_uncatalogued_product():
    assert groups.lookup({"length": 1, "area": Fraction(-1, 2), "velocity": 0}) is None


def test_catalogue_table_lists_every_group():
    table = groups.catalogue()
    assert list(table["key"]) == list(groups.keys())


def test_lookup_does_not_read_any_length_as_a_wave_height():
    # the wave steepness H/(g T^2) is specific to a wave height (Le Mehaute 1976, from memory)
    assert groups.lookup({"length": 1, "gravity": -1, "period": -2}) is None
    assert groups.lookup({"wave_height": 1, "gravity": -1, "period": -2}).group.key == \
        "wave_steepness"


def test_lookup_does_not_merge_a_width_and_a_depth_into_one_length():
    # Fh = Q/(b sqrt(g h^3)) needs both a width and a depth (Chow 1959 ch. 3)
    assert groups.lookup({"flow_rate": 1, "gravity": Fraction(-1, 2),
                          "length": Fraction(-5, 2)}) is None


def test_lookup_identifies_rayleigh_as_grashof_times_prandtl():
    # Ra = g beta dT L^3/(nu alpha) (Incropera & DeWitt 2007, from memory)
    m = groups.lookup({"gravity": 1, "thermal_expansion": 1, "temperature_difference": 1,
                       "length": 3, "kinematic_viscosity": -1, "thermal_diffusivity": -1})
    assert (m.group.key, m.power) == ("rayleigh", 1)

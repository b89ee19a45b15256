"""Buckingham Pi groups: count and span agree with pint, textbook sets give the textbook groups.

Outside references:
* pint.pi_theorem (pint 0.25), a general dimensional-analysis implementation;
* F. M. White, *Fluid Mechanics*, 7th ed., 2011, ch. 5 (sphere drag, pipe flow, Weber);
* J. N. Newman, *Marine Hydrodynamics*, 1977, sec. 2.7 (ship resistance: C = f(Re, Fr));
* J. S. Carlton, *Marine Propellers and Propulsion*, 2nd ed., 2007, ch. 6 (K_T, K_Q, J, sigma);
* ITTC Symbols and Terminology List, 2017 (symbols).
Where a textbook result is quoted from memory of the text, the comment says so.
"""

from fractions import Fraction

import pint
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from similitude.dimensional.dimensions import Variable, analyse, infer_role, pi_groups
from similitude.dimensional.rational_matrix import rank
from similitude.errors import InputError
from similitude.units import Q_, ureg

# --- helpers: checks done with pint, not with the code under test ---------------------------


def pint_dimensionless(variables, exponents):
    """True when prod(unit ** e) is dimensionless according to pint."""
    q = Q_(1.0, "dimensionless")
    for s, e in exponents.items():
        q = q * Q_(1.0, variables[s]) ** float(e)
    return q.dimensionless


def vectors(groups_exps, symbols):
    return [[Fraction(g.get(s, 0)).limit_denominator(1000) for s in symbols] for g in groups_exps]


def assert_same_span_as_pint(variables):
    ours = [g.exponents for g in pi_groups(variables)]
    theirs = pint.pi_theorem(variables, ureg)
    symbols = list(variables)
    assert len(ours) == len(theirs)
    a, b = vectors(ours, symbols), vectors(theirs, symbols)
    # same span: stacking pint's basis onto ours adds no rank
    assert rank(a) == len(ours)
    assert rank(a + b) == rank(a) == rank(b) if b else rank(a) == 0


def by_key(groups):
    return {g.key: g for g in groups}


SETS = [
    {"V": "m/s", "L": "m", "nu": "m^2/s", "g": "m/s^2"},
    {"F": "N", "rho": "kg/m^3", "V": "m/s", "D": "m", "mu": "Pa*s"},
    {"dp": "Pa", "rho": "kg/m^3", "V": "m/s", "D": "m", "mu": "Pa*s", "eps": "m", "L": "m"},
    {"R": "N", "rho": "kg/m^3", "V": "m/s", "L": "m", "nu": "m^2/s", "g": "m/s^2"},
    {"T": "N", "Q": "N*m", "rho": "kg/m^3", "n": "1/s", "D": "m", "V_A": "m/s",
     "p-p_v": "Pa", "g": "m/s^2", "nu": "m^2/s"},
    {"V": "m/s", "L": "m", "rho": "kg/m^3", "sigma": "N/m", "g": "m/s^2", "nu": "m^2/s"},
    {"f": "Hz", "D": "m", "V": "m/s", "nu": "m^2/s"},
    {"U": "m/s", "L": "m", "Omega": "rad/s", "nu": "m^2/s"},
    {"g": "m/s^2", "beta": "1/K", "dT": "K", "L": "m", "nu": "m^2/s", "alpha": "m^2/s"},
    {"P": "kW", "rho": "kg/m^3", "n": "rpm", "D": "ft", "V": "kn"},
    {"V": "m/s", "a": "m/s", "rho": "kg/m^3", "E": "GPa", "L": "m", "mu": "Pa*s"},
    {"x": "m", "t": "s", "m": "kg"},
    {"theta": "rad", "V": "m/s", "L": "m"},
]


@pytest.mark.parametrize("variables", SETS, ids=[",".join(s) for s in SETS])
def test_count_and_span_agree_with_pint(variables):
    # reference: pint.pi_theorem on the same variables
    assert_same_span_as_pint(variables)


@pytest.mark.parametrize("variables", SETS, ids=[",".join(s) for s in SETS])
def test_every_group_is_dimensionless_by_pint(variables):
    for g in pi_groups(variables):
        assert pint_dimensionless(variables, g.exponents), str(g)


_UNITS = ("kg", "m", "s", "K")


@st.composite
def dimension_sets(draw):
    n = draw(st.integers(min_value=1, max_value=7))
    variables = {}
    for i in range(n):
        exps = draw(st.lists(st.integers(-3, 3), min_size=4, max_size=4))
        if i == 0 and not any(exps):
            exps[1] = 1  # pint.pi_theorem fails on an all-dimensionless set
        unit = "*".join(f"{u}**{e}" for u, e in zip(_UNITS, exps, strict=True) if e)
        variables[f"x{i}"] = unit or "m/m"  # pint.pi_theorem cannot read "dimensionless"
    return variables


@settings(max_examples=150, deadline=None)
@given(dimension_sets())
def test_random_dimension_matrices_agree_with_pint(variables):
    # property: n - rank groups, each dimensionless (checked by pint), independent, exact
    groups = pi_groups(variables)
    theirs = pint.pi_theorem(variables, ureg)
    assert len(groups) == len(theirs)
    symbols = list(variables)
    ours = vectors([g.exponents for g in groups], symbols)
    assert rank(ours) == len(groups)
    if theirs:
        assert rank(ours + vectors(theirs, symbols)) == len(groups)
    for g in groups:
        assert pint_dimensionless(variables, g.exponents)
        assert all(isinstance(e, (int, Fraction)) and not isinstance(e, bool)
                   for e in g.exponents.values())


@settings(max_examples=60, deadline=None)
@given(dimension_sets(), st.data())
def test_any_valid_repeating_set_spans_the_same_groups(variables, data):
    # Buckingham (1914): any complete set of n - r groups spans the same space
    base = analyse(variables)
    if not base.repeating:
        return
    symbols = list(variables)
    perm = data.draw(st.permutations(symbols))
    # pick a different valid repeating set greedily in a random order
    chosen = []
    a = analyse(variables)
    for s in perm:
        cols = [[Fraction(x) for x in col] for col in zip(*a.matrix, strict=True)]
        trial = chosen + [s]
        sub = [cols[symbols.index(t)] for t in trial]
        if rank(sub) == len(trial) and len(trial) <= a.rank:
            chosen = trial
    other = analyse(variables, chosen)
    va = vectors([g.exponents for g in base.groups], symbols)
    vb = vectors([g.exponents for g in other.groups], symbols)
    assert rank(va + vb) == rank(va) == rank(vb) == len(va)


# --- textbook sets ---------------------------------------------------------------------------


def test_sphere_drag_gives_force_coefficient_and_reynolds():
    # White 2011, sec. 5.3 (from memory of the text): F/(rho V^2 D^2) = f(rho V D / mu)
    groups = pi_groups({"F": "N", "rho": "kg/m^3", "V": "m/s", "D": "m", "mu": "Pa*s"})
    g = by_key(groups)
    assert set(g) == {"force_coefficient", "reynolds"}
    assert g["force_coefficient"].exponents == {"F": 1, "rho": -1, "V": -2, "D": -2}
    assert g["reynolds"].exponents == {"rho": 1, "V": 1, "D": 1, "mu": -1}


def test_pipe_flow_gives_euler_reynolds_relative_roughness_and_length_ratio():
    # White 2011, sec. 5.3 and 6.6 (from memory): dp/(rho V^2) = f(Re_d, eps/d, L/d)
    groups = pi_groups({"dp": "Pa", "rho": "kg/m^3", "V": "m/s", "D": "m", "mu": "Pa*s",
                        "eps": "m", "L": "m"})
    g = by_key(groups)
    assert g["euler"].exponents == {"dp": 1, "rho": -1, "V": -2}
    assert g["reynolds"].exponents == {"rho": 1, "V": 1, "D": 1, "mu": -1}
    assert g["relative_roughness"].exponents == {"eps": 1, "D": -1}
    assert g[None].exponents == {"L": 1, "D": -1}
    assert len(groups) == 4


def test_ship_resistance_gives_resistance_coefficient_reynolds_and_froude():
    # Newman 1977, sec. 2.7 (from memory): R/(rho V^2 L^2) = f(VL/nu, V/sqrt(gL))
    groups = pi_groups({"R": "N", "rho": "kg/m^3", "V": "m/s", "L": "m", "nu": "m^2/s",
                        "g": "m/s^2"})
    assert [g.symbol for g in groups] == ["C_F", "Re", "Fr"]
    assert str(groups[2]) == "Fr = V/sqrt(g*L)  (Froude number)"


def test_froude_exponents_are_exact_halves():
    # DESIGN convention and ITTC 2017 symbols: Fr = V / sqrt(g L)
    fr = by_key(pi_groups({"V": "m/s", "L": "m", "g": "m/s^2"}))["froude"]
    assert fr.exponents == {"V": 1, "g": Fraction(-1, 2), "L": Fraction(-1, 2)}
    assert isinstance(fr.exponents["g"], Fraction)
    assert fr.expression == "V/sqrt(g*L)"


def test_propeller_set_gives_open_water_coefficients():
    # Carlton 2007, ch. 6: K_T = T/(rho n^2 D^4), K_Q = Q/(rho n^2 D^5), J = V_A/(n D);
    # cavitation number on n D (ITTC 7.5-02-03-03.1, from memory)
    groups = pi_groups({"T": "N", "Q": "N*m", "rho": "kg/m^3", "n": "1/s", "D": "m",
                        "V_A": "m/s", "p-p_v": "Pa", "g": "m/s^2", "nu": "m^2/s"})
    g = by_key(groups)
    assert g["thrust_coefficient"].exponents == {"T": 1, "rho": -1, "n": -2, "D": -4}
    assert g["torque_coefficient"].exponents == {"Q": 1, "rho": -1, "n": -2, "D": -5}
    assert g["advance_ratio"].exponents == {"V_A": 1, "n": -1, "D": -1}
    assert g["cavitation"].exponents == {"p-p_v": 1, "rho": -1, "n": -2, "D": -2}
    assert g["cavitation"].expression == "(p-p_v)/(0.5*rho*n**2*D**2)"
    assert {"rotational_froude", "rotational_reynolds"} <= set(g)
    assert len(groups) == 6
    assert [x.symbol for x in groups][:3] == ["K_T", "K_Q", "J"]


def test_free_surface_with_capillarity_gives_weber_froude_reynolds():
    # White 2011, sec. 5.2 (from memory): We = rho V^2 L / sigma joins Fr and Re
    g = by_key(pi_groups({"V": "m/s", "L": "m", "rho": "kg/m^3", "sigma": "N/m",
                          "g": "m/s^2", "nu": "m^2/s"}))
    assert set(g) == {"weber", "froude", "reynolds"}
    assert g["weber"].exponents == {"rho": 1, "V": 2, "L": 1, "sigma": -1}


def test_design_example_gives_reynolds_and_froude():
    # DESIGN.md public example; Re = VL/nu, Fr = V/sqrt(gL)
    groups = pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s", "g": "m/s^2"})
    assert [(g.name, g.expression) for g in groups] == [
        ("Reynolds number", "V*L/nu"), ("Froude number", "V/sqrt(g*L)")]


def test_mach_and_cauchy_from_speed_of_sound_and_modulus():
    # White 2011, sec. 5.2: Ma = V/a; Cauchy number rho V^2 / E (from memory)
    g = by_key(pi_groups({"V": "m/s", "a": "m/s", "rho": "kg/m^3", "E": "Pa", "L": "m"}))
    assert g["mach"].exponents == {"V": 1, "a": -1}
    assert g["cauchy"].exponents == {"rho": 1, "V": 2, "E": -1}


def test_strouhal_from_a_shedding_frequency():
    # White 2011, sec. 5.2: St = f L / V
    g = by_key(pi_groups({"f": "Hz", "D": "m", "V": "m/s"}))
    assert g["strouhal"].exponents == {"f": 1, "D": 1, "V": -1}


def test_rotation_rate_and_frequency_are_told_apart_by_role():
    # same dimension 1/s: a propeller's n gives J, a shedding frequency gives St
    n_groups = by_key(pi_groups({"V": "m/s", "D": "m", "n": "1/s"}))
    f_groups = by_key(pi_groups({"V": "m/s", "D": "m", "f": "1/s"}))
    assert "advance_ratio" in n_groups and "strouhal" in f_groups


def test_rossby_from_frame_rotation():
    # Pedlosky 1987, sec. 1.5: Ro = U / (f L) with the rotation of the frame
    g = by_key(pi_groups({"U": "m/s", "L": "m", "Omega": "rad/s"}))
    assert g["rossby"].exponents == {"U": 1, "Omega": -1, "L": -1}


def test_keulegan_carpenter_from_oscillation_period():
    # Keulegan & Carpenter 1958: KC = U_m T / D
    g = by_key(pi_groups({"F": "N", "rho": "kg/m^3", "U": "m/s", "T": "s", "D": "m"}))
    assert g["keulegan_carpenter"].exponents == {"U": 1, "T": 1, "D": -1}


def test_depth_froude_from_water_depth():
    # Newman 1977, sec. 6.9: Fh = V / sqrt(g h)
    g = by_key(pi_groups({"V": "m/s", "h": "m", "g": "m/s^2"}))
    assert g["depth_froude"].expression == "V/sqrt(g*h)"


def test_richardson_replaces_density_ratio():
    # bulk Richardson number g (drho/rho) L / U^2 (Miles 1961 uses the gradient form)
    g = by_key(pi_groups({"U": "m/s", "L": "m", "g": "m/s^2", "rho": "kg/m^3",
                          "drho": "kg/m^3"}))
    assert set(g) == {"froude", "richardson"}
    assert g["richardson"].exponents == {"g": 1, "drho": 1, "L": 1, "rho": -1, "U": -2}


def test_natural_convection_gives_grashof_and_prandtl():
    # Gr = g beta dT L^3 / nu^2, Pr = nu / alpha (Incropera & DeWitt, from memory)
    g = by_key(pi_groups({"g": "m/s^2", "beta": "1/K", "dT": "K", "L": "m", "nu": "m^2/s",
                          "alpha": "m^2/s"}))
    assert g["grashof"].exponents == {"g": 1, "beta": 1, "dT": 1, "L": 3, "nu": -2}
    assert g["prandtl"].exponents == {"nu": 1, "alpha": -1}


def test_power_coefficient_on_rotation_rate():
    # Carlton 2007, ch. 6 (from memory): K_P = P / (rho n^3 D^5)
    g = by_key(pi_groups({"P": "W", "rho": "kg/m^3", "n": "1/s", "D": "m"}))
    assert g["power_coefficient"].exponents == {"P": 1, "rho": -1, "n": -3, "D": -5}


def test_vapour_pressure_alone_gives_a_cavitation_type_group():
    # DESIGN convention sigma_v = (p - p_v) / (rho V^2 / 2); dimensional analysis gives the
    # Euler-type group of the pressure margin, with the factor 2 of the half dynamic pressure
    g = by_key(pi_groups({"p-p_v": "Pa", "rho": "kg/m^3", "V": "m/s"}))
    assert g["cavitation"].factor == 2
    assert g["cavitation"].expression == "(p-p_v)/(0.5*rho*V**2)"


# --- values, forms and roles ------------------------------------------------------------------


def test_values_are_computed_when_variables_carry_them():
    # hand arithmetic: Re = 2 * 3 / 1e-6 = 6e6; Fr = 2 / sqrt(9.81 * 3) = 0.368668...
    groups = by_key(pi_groups({"V": "2 m/s", "L": "3 m", "nu": "1e-6 m^2/s",
                               "g": Q_(9.81, "m/s^2")}))
    assert groups["reynolds"].value == pytest.approx(6e6)
    assert groups["froude"].value == pytest.approx(2 / (9.81 * 3) ** 0.5)


def test_values_are_independent_of_the_units_used():
    # 10 kn = 5.1444 m/s (1 kn = 1852/3600 m/s, exact by definition)
    a = by_key(pi_groups({"V": "10 kn", "L": "100 ft", "nu": "1.14 mm^2/s"}))
    b = by_key(pi_groups({"V": f"{10 * 1852 / 3600} m/s", "L": "30.48 m",
                          "nu": "1.14e-6 m^2/s"}))
    assert a["reynolds"].value == pytest.approx(b["reynolds"].value, rel=1e-12)


def test_cavitation_value_uses_the_half_dynamic_pressure():
    # hand arithmetic: (100000 Pa) / (0.5 * 1000 * 10**2) = 2.0
    g = by_key(pi_groups({"p-p_v": "100000 Pa", "rho": "1000 kg/m^3", "V": "10 m/s"}))
    assert g["cavitation"].value == pytest.approx(2.0)


def test_value_is_none_without_values():
    assert all(g.value is None for g in pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s"}))


def test_variable_and_dict_forms_carry_roles():
    # 'k' would read as a roughness; stated as a thermal diffusivity it gives a Prandtl number
    g = by_key(pi_groups({"nu": "m^2/s", "k": Variable(unit="m^2/s",
                                                         role="thermal_diffusivity")}))
    assert g["prandtl"].exponents == {"nu": 1, "k": -1}
    g2 = by_key(pi_groups({"nu": "m^2/s", "k": {"unit": "m^2/s",
                                                  "role": "thermal diffusivity"}}))
    assert "prandtl" in g2


def test_role_with_wrong_dimension_is_refused_naming_the_variable():
    with pytest.raises(InputError, match=r"variables\.nu\.role.*kinematic_viscosity"):
        pi_groups({"nu": Variable(unit="m/s", role="kinematic_viscosity"), "L": "m"})


def test_unknown_role_is_refused_listing_roles():
    with pytest.raises(InputError, match="not a known role"):
        pi_groups({"x": {"unit": "m", "role": "wibble"}, "V": "m/s"})


def test_unreadable_unit_names_the_variable():
    with pytest.raises(InputError, match=r"variables\.V.*'m/ss'"):
        pi_groups({"V": "m/ss", "L": "m"})


def test_empty_variables_are_refused():
    with pytest.raises(InputError, match="variables"):
        pi_groups({})


def test_symbol_conventions_follow_dimension():
    # c is a chord when it is a length and a speed of sound when it is a speed
    assert infer_role("c", Q_(1, "m").dimensionality) == "length"
    assert infer_role("c", Q_(1, "m/s").dimensionality) == "speed_of_sound"
    assert infer_role("T", Q_(1, "N").dimensionality) == "thrust"
    assert infer_role("T", Q_(1, "s").dimensionality) == "period"
    assert infer_role("V_A") == "velocity"
    assert infer_role("ρ") == "density"
    assert infer_role("p0 - p_v") == "cavitation_pressure"


def test_unknown_symbols_still_give_valid_unnamed_groups():
    groups = pi_groups({"alpha1": "m", "beta1": "m"})
    assert len(groups) == 1 and groups[0].name is None and groups[0].symbol == "Pi1"


def test_dimensionless_variable_is_its_own_group():
    # pint.pi_theorem also counts a dimensionless input as one group
    groups = pi_groups({"theta": "rad", "V": "m/s", "L": "m"})
    assert [g.exponents for g in groups] == [{"theta": 1}]


# --- repeating sets ---------------------------------------------------------------------------


def test_default_repeating_set_is_density_velocity_length():
    # White 2011, sec. 5.3: choose rho, V, L (geometry, kinematics, mass) as repeating variables
    a = analyse({"F": "N", "L": "m", "mu": "Pa*s", "V": "m/s", "rho": "kg/m^3"})
    assert a.repeating == ("rho", "V", "L")
    assert a.rank == 3


def test_user_repeating_set_still_yields_conventional_forms():
    # with g and L repeating, V's group is V/sqrt(gL) -- still Fr by catalogue normalisation
    groups = pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s", "g": "m/s^2"},
                       repeating=["g", "L"])
    assert {g.key for g in groups} == {"froude", "reynolds"}


def test_dependent_repeating_set_is_refused_with_the_reason():
    with pytest.raises(InputError, match="not independent.*'U'"):
        pi_groups({"V": "m/s", "U": "m/s", "L": "m", "nu": "m^2/s"}, repeating=["V", "U"])


def test_non_spanning_repeating_set_is_refused_with_the_missing_dimension():
    with pytest.raises(InputError, match=r"does not span.*\[mass\]"):
        pi_groups({"F": "N", "rho": "kg/m^3", "V": "m/s", "L": "m"}, repeating=["V", "L"])


def test_repeating_symbol_not_in_the_set_is_refused():
    with pytest.raises(InputError, match="'W' is not one of the variables"):
        pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s"}, repeating=["V", "W"])


def test_dimensionless_repeating_variable_is_refused():
    with pytest.raises(InputError, match="dimensionless"):
        pi_groups({"theta": "rad", "V": "m/s", "L": "m", "nu": "m^2/s"},
                  repeating=["theta", "V"])


def test_group_string_names_the_group():
    re_ = by_key(pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s"}))["reynolds"]
    assert str(re_) == "Re = V*L/nu  (Reynolds number)"


POOL = {
    "V": "m/s", "L": "m", "D": "m", "nu": "m^2/s", "mu": "Pa*s", "rho": "kg/m^3",
    "g": "m/s^2", "sigma": "N/m", "a": "m/s", "p": "Pa", "dp": "Pa", "p_v": "Pa",
    "f": "Hz", "n": "1/s", "Omega": "rad/s", "F": "N", "T": "N", "Q": "N*m", "P": "W",
    "E": "Pa", "h": "m", "eps": "m", "drho": "kg/m^3", "beta": "1/K", "dT": "K",
    "alpha": "m^2/s", "t": "s", "A": "m^2", "m": "kg", "k": "W/(m*K)", "cp": "J/(kg*K)",
    "h_c": "W/(m^2*K)", "g_r": "m/s^2", "N": "1/s", "b": "m", "H": "m", "T_w": "s",
    "q": "m^3/s",
}


@settings(max_examples=200, deadline=None)
@given(st.lists(st.sampled_from(sorted(POOL)), min_size=1, max_size=10, unique=True))
def test_random_engineering_sets_agree_with_pint(symbols):
    # property over sets of real variables, so catalogue naming and trading are exercised
    variables = {s: POOL[s] for s in symbols}
    groups = pi_groups(variables)
    theirs = pint.pi_theorem(variables, ureg)
    assert len(groups) == len(theirs)
    ours = vectors([g.exponents for g in groups], symbols)
    assert rank(ours) == len(groups)
    if theirs:
        assert rank(ours + vectors(theirs, symbols)) == len(groups)
    for g in groups:
        assert pint_dimensionless(variables, g.exponents), str(g)
    for g in groups:  # a named group is exactly (not a power of) a catalogued form
        if g.key:
            assert g.value is None and g.expression and g.symbol != ""


def test_package_level_entry_point_is_pi_groups():
    # DESIGN.md: sim.pi_groups({...}) -> groups with .exponents and .name
    import similitude as sim

    groups = sim.pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s", "g": "m/s^2"})
    assert [g.name for g in groups] == ["Reynolds number", "Froude number"]


def test_groups_are_hashable_and_compare_by_content():
    a = pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s"})
    b = pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s"})
    assert set(a) == set(b)


# --- further engineering sets: names, orientation and powers ---------------------------------
# Each set: the variables, then the groups as (symbol, exponents) an engineer writes them.
# Sources as cited per set; span and count are also checked against pint.pi_theorem.

FURTHER_SETS = {
    # drag with compressibility: C_F = f(Re, Ma) (Anderson 2003, Modern Compressible Flow, ch. 1;
    # White 2011 sec. 5.3)
    "compressible drag": (
        {"F": "N", "rho": "kg/m^3", "V": "m/s", "L": "m", "mu": "Pa*s", "a": "m/s"},
        [("C_F", {"F": 1, "rho": -1, "V": -2, "L": -2}),
         ("Re", {"rho": 1, "V": 1, "L": 1, "mu": -1}),
         ("Ma", {"V": 1, "a": -1})]),
    # wave loads on a pile: C_F = f(KC, Re, Fr, wave steepness) (Keulegan & Carpenter 1958;
    # Le Mehaute 1976 fig. 15.1 for H/(g T^2), from memory)
    "pile in waves": (
        {"F": "N", "rho": "kg/m^3", "U": "m/s", "D": "m", "T": "s", "H": "m", "g": "m/s^2",
         "nu": "m^2/s"},
        [("C_F", {"F": 1, "rho": -1, "U": -2, "D": -2}),
         ("KC", {"U": 1, "T": 1, "D": -1}),
         ("H/(g*T**2)", {"H": 1, "g": -1, "T": -2}),
         ("Fr", {"U": 1, "g": Fraction(-1, 2), "D": Fraction(-1, 2)}),
         ("Re", {"U": 1, "D": 1, "nu": -1})]),
    # propeller: K_T, K_Q = f(J, Re_n, Fr_n, sigma_n) (Carlton 2007 ch. 6; ITTC Symbols 2017)
    "propeller": (
        {"T": "N", "Q": "N*m", "n": "1/s", "D": "m", "V": "m/s", "rho": "kg/m^3",
         "mu": "Pa*s", "g": "m/s^2", "p-p_v": "Pa"},
        [("K_T", {"T": 1, "rho": -1, "n": -2, "D": -4}),
         ("K_Q", {"Q": 1, "rho": -1, "n": -2, "D": -5}),
         ("J", {"V": 1, "n": -1, "D": -1}),
         ("Re_n", {"rho": 1, "n": 1, "D": 2, "mu": -1}),
         ("Fr_n", {"n": 1, "D": Fraction(1, 2), "g": Fraction(-1, 2)}),
         ("sigma_v", {"p-p_v": 1, "rho": -1, "n": -2, "D": -2})]),
    # forced convection: Nu = f(Re, Pr) (Incropera & DeWitt 2007 ch. 6, from memory)
    "forced convection": (
        {"h": "W/(m^2*K)", "k": "W/(m*K)", "L": "m", "V": "m/s", "rho": "kg/m^3",
         "mu": "Pa*s", "cp": "J/(kg*K)"},
        [("Nu", {"h": 1, "L": 1, "k": -1}),
         ("Re", {"rho": 1, "V": 1, "L": 1, "mu": -1}),
         ("Pr", {"mu": 1, "cp": 1, "k": -1})]),
    # rotating frame: Ro and Re (Batchelor 1967 sec. 7.6)
    "rotating frame": (
        {"U": "m/s", "L": "m", "Omega": "rad/s", "nu": "m^2/s"},
        [("Ro", {"U": 1, "Omega": -1, "L": -1}), ("Re", {"U": 1, "L": 1, "nu": -1})]),
    # stratified flow: Ri on N and the densimetric Froude number on g' (Turner 1973, Buoyancy
    # Effects in Fluids, ch. 3, from memory)
    "stratified": (
        {"N": "1/s", "U": "m/s", "L": "m", "g'": "m/s^2"},
        [("Ri", {"N": 2, "L": 2, "U": -2}),
         ("Fr_d", {"U": 1, "g'": Fraction(-1, 2), "L": Fraction(-1, 2)})]),
    # vortex shedding: St = f(Re) (White 2011 sec. 5.2)
    "vortex shedding": (
        {"f": "Hz", "D": "m", "V": "m/s", "nu": "m^2/s"},
        [("St", {"f": 1, "D": 1, "V": -1}), ("Re", {"V": 1, "D": 1, "nu": -1})]),
    # open channel: Fr = V/sqrt(g h) with V = Q/(b h), and the aspect ratio h/b (Chow 1959,
    # Open-Channel Hydraulics, ch. 3)
    "open channel": (
        {"Q": "m^3/s", "g": "m/s^2", "b": "m", "h": "m"},
        [("Fh", {"Q": 1, "b": -1, "g": Fraction(-1, 2), "h": Fraction(-3, 2)}),
         ("Pi2", {"h": 1, "b": -1})]),
    # elasticity: Cauchy number rho V^2 / E (White 2011 sec. 5.2)
    "elasticity": (
        {"E": "Pa", "rho": "kg/m^3", "V": "m/s", "L": "m"},
        [("Ca", {"rho": 1, "V": 2, "E": -1})]),
    # deep/shallow-water waves: the two axes of Le Mehaute's chart, H/(g T^2) and h/(g T^2)
    # (Le Mehaute 1976 fig. 15.1, from memory)
    "regular waves": (
        {"H": "m", "T": "s", "g": "m/s^2", "h": "m"},
        [("H/(g*T**2)", {"H": 1, "g": -1, "T": -2}), ("h/(g*T**2)", {"h": 1, "g": -1, "T": -2})]),
    # pipe flow given by flow rate: Re on Q/D and the pressure-drop coefficient (White 2011
    # sec. 6.8, Re = 4 Q/(pi D nu) up to the constant)
    "pipe by flow rate": (
        {"Q": "m^3/s", "D": "m", "dp": "Pa", "rho": "kg/m^3", "mu": "Pa*s"},
        [("Eu", {"dp": 1, "D": 4, "rho": -1, "Q": -2}),
         ("Re", {"rho": 1, "Q": 1, "D": -1, "mu": -1})]),
    # natural convection with the heat-transfer coefficient: Nu = f(Gr, Pr) (Incropera &
    # DeWitt 2007 ch. 9, from memory); beta*dT is the Boussinesq parameter
    "natural convection": (
        {"h": "W/(m^2*K)", "k": "W/(m*K)", "L": "m", "g": "m/s^2", "beta": "1/K", "dT": "K",
         "nu": "m^2/s", "alpha": "m^2/s"},
        [("Nu", {"h": 1, "L": 1, "k": -1}),
         ("Gr", {"g": 1, "beta": 1, "dT": 1, "L": 3, "nu": -2}),
         ("Pi3", {"beta": 1, "dT": 1}),
         ("Pr", {"nu": 1, "alpha": -1})]),
    # acoustics: Helmholtz number f L / a (Pierce 1989, Acoustics, ch. 4, from memory)
    "acoustic source": (
        {"f": "Hz", "L": "m", "a": "m/s"},
        [("He", {"f": 1, "L": 1, "a": -1})]),
    # rotating tank without a mean flow: Ekman number (Greenspan 1968 ch. 1, from memory)
    "spin-up": (
        {"Omega": "rad/s", "L": "m", "nu": "m^2/s"},
        [("Ek", {"nu": 1, "Omega": -1, "L": -2})]),
    # heat transfer with a thermal diffusivity: Nu = f(Re, Pe) (Incropera & DeWitt 2007)
    "forced convection by diffusivities": (
        {"h": "W/(m^2*K)", "k": "W/(m*K)", "L": "m", "V": "m/s", "nu": "m^2/s",
         "alpha": "m^2/s"},
        [("Nu", {"h": 1, "L": 1, "k": -1}), ("Re", {"V": 1, "L": 1, "nu": -1}),
         ("Pe", {"V": 1, "L": 1, "alpha": -1})]),
}


@pytest.mark.parametrize("name", sorted(FURTHER_SETS))
def test_further_sets_give_the_groups_an_engineer_writes(name):
    variables, expected = FURTHER_SETS[name]
    got = [(g.symbol, g.exponents) for g in pi_groups(variables)]
    assert got == expected


@pytest.mark.parametrize("name", sorted(FURTHER_SETS))
def test_further_sets_agree_with_pint_in_count_and_span(name):
    # reference: pint.pi_theorem on the same variables
    variables, _ = FURTHER_SETS[name]
    assert_same_span_as_pint(variables)


@pytest.mark.parametrize("name", sorted(FURTHER_SETS))
def test_further_sets_groups_are_dimensionless_by_pint(name):
    variables, _ = FURTHER_SETS[name]
    for g in pi_groups(variables):
        assert pint_dimensionless(variables, g.exponents), str(g)


def test_open_channel_froude_reads_as_written():
    # Chow (1959) ch. 3: Fr = V/sqrt(g h), V = Q/(b h)
    g = pi_groups({"Q": "m^3/s", "g": "m/s^2", "b": "m", "h": "m"})[0]
    assert (g.name, g.expression) == ("depth Froude number", "Q/(b*h*sqrt(g*h))")


def test_open_channel_froude_value_is_the_mean_velocity_froude_number():
    # by hand: Q = 2 m^3/s, b = 2 m, h = 0.5 m -> V = 2 m/s, Fr = 2/sqrt(9.81*0.5) = 0.90317
    g = pi_groups({"Q": "2 m^3/s", "g": "9.81 m/s^2", "b": "2 m", "h": "0.5 m"})[0]
    assert g.value == pytest.approx(2.0 / (9.81 * 0.5) ** 0.5, rel=1e-12)


def test_a_pendulum_length_is_not_read_as_a_wave_height():
    # T, g, L: T*sqrt(g/L) is no wave steepness (that needs a wave height) -> unnamed
    (g,) = pi_groups({"T": "s", "g": "m/s^2", "L": "m"})
    assert g.name is None and g.exponents == {"T": 2, "g": 1, "L": -1}


def test_heat_transfer_coefficient_is_read_from_h_by_its_unit():
    # symbol convention: h with W/(m^2 K) is the film coefficient, with m the depth
    assert infer_role("h", Q_(1, "W/(m^2*K)").dimensionality) == "heat_transfer_coefficient"
    assert infer_role("h", Q_(1, "m").dimensionality) == "depth"


def test_reduced_gravity_symbols_are_recognised():
    for s in ("g'", "g_r", "gprime"):
        assert infer_role(s, Q_(1, "m/s^2").dimensionality) == "reduced_gravity"


def test_group_carries_exponents_name_symbol_expression_and_value():
    # Re by hand: 2 m/s * 0.5 m / 1e-6 m^2/s = 1e6
    g = pi_groups({"V": "2 m/s", "L": "0.5 m", "nu": "1e-6 m^2/s"})[0]
    assert (g.exponents, g.name, g.symbol, g.expression) == (
        {"V": 1, "L": 1, "nu": -1}, "Reynolds number", "Re", "V*L/nu")
    assert g.value == pytest.approx(1e6, rel=1e-12)


def test_discharge_per_unit_width_gives_the_channel_froude_and_reynolds_numbers():
    # Chow (1959) ch. 1-3: Fr = q/sqrt(g h^3) = V/sqrt(g h), Re = V h/nu = q/nu
    groups = pi_groups({"q": "m^2/s", "g": "m/s^2", "h": "m", "nu": "m^2/s"})
    assert [(g.symbol, g.exponents) for g in groups] == [
        ("Fh", {"q": 1, "g": Fraction(-1, 2), "h": Fraction(-3, 2)}),
        ("Re", {"q": 1, "nu": -1})]


def test_a_typographic_prime_reads_as_reduced_gravity():
    assert infer_role("g\u2032", Q_(1, "m/s^2").dimensionality) == "reduced_gravity"


def test_unicode_greek_symbols_give_the_same_groups():
    # same wave-load set as above with rho and nu written in Greek
    variables = {"F": "N", "ρ": "kg/m^3", "U": "m/s", "D": "m", "T": "s", "H": "m",
                 "g": "m/s^2", "ν": "m^2/s"}
    assert [g.symbol for g in pi_groups(variables)] == ["C_F", "KC", "H/(g*T**2)", "Fr", "Re"]
    assert_same_span_as_pint(variables)


def test_vapour_pressure_beside_a_static_pressure_is_not_called_the_cavitation_number():
    # sigma_v = (p - p_v)/(rho V^2/2) (ITTC Symbols 2017) is no power product of p and p_v:
    # with both given, the groups are Eu = p/(rho V^2) and an unnamed p_v group
    groups = pi_groups({"V": "m/s", "L": "m", "rho": "kg/m^3", "p": "Pa", "p_v": "Pa"})
    assert [g.key for g in groups] == ["euler", None]
    assert groups[1].exponents == {"p_v": 1, "V": -2, "rho": -1}
    assert_same_span_as_pint({"V": "m/s", "L": "m", "rho": "kg/m^3", "p": "Pa", "p_v": "Pa"})

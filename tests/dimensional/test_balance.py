"""Term-balance scaling of an equation for prototype and model.

Worked example (invented scenario): a 100 m hull at 8 m/s in sea water and a 1:400 model at
the Froude speed in fresh water; momentum-equation terms per unit mass [m/s^2]. Every number
below is worked by hand in the comments. The named ratios are the textbook identities
viscous/advective = 1/Re, gravity/advective = 1/Fr^2, capillary/advective = 1/We
(White, *Fluid Mechanics*, 7th ed., 2011, sec. 5.2) and Coriolis/advective = 1/Ro
(Pedlosky, *Geophysical Fluid Dynamics*, 1987, sec. 1.5).
"""

import math

import pytest

from similitude.dimensional.balance import parse_term, term_balance
from similitude.errors import InputError
from similitude.units import Q_

TERMS = {
    "advective": "U**2/L",
    "unsteady": "U/t",
    "pressure": "dp/(rho*L)",
    "gravity": "g",
    "viscous": "nu*U/L**2",
    "capillary": "sigma/(rho*L**2)",
}
PROTOTYPE = {"U": "8 m/s", "L": "100 m", "t": "50 s", "dp": "32800 Pa",
             "rho": "1025 kg/m^3", "g": "9.81 m/s^2", "nu": "1.19e-6 m^2/s",
             "sigma": "0.073 N/m"}
# Froude scaling at 1:400: U = 8/sqrt(400) = 0.4 m/s, L = 0.25 m, t = 50/20 = 2.5 s,
# dp = 32800/400 * 999/1025 = 79.9 Pa, rounded to 80 Pa; g is left out (same as prototype)
MODEL = {"U": "0.4 m/s", "L": "0.25 m", "t": "2.5 s", "dp": "80 Pa", "rho": "999 kg/m^3",
         "nu": "1.14e-6 m^2/s"}


@pytest.fixture(scope="module")
def hull():
    return term_balance(TERMS, PROTOTYPE, MODEL, threshold=1e-3)


def row(result, term):
    return result.table.set_index("term").loc[term]


def test_prototype_magnitudes_match_hand_calculation(hull):
    col = "prototype magnitude [m/s^2]"
    # U^2/L = 64/100 = 0.64; U/t = 8/50 = 0.16; dp/(rho L) = 32800/102500 = 0.32
    assert row(hull, "advective")[col] == pytest.approx(0.64)
    assert row(hull, "unsteady")[col] == pytest.approx(0.16)
    assert row(hull, "pressure")[col] == pytest.approx(0.32)
    # nu U / L^2 = 1.19e-6 * 8 / 1e4 = 9.52e-10; sigma/(rho L^2) = 0.073/1.025e7 = 7.1220e-9
    assert row(hull, "viscous")[col] == pytest.approx(9.52e-10)
    assert row(hull, "capillary")[col] == pytest.approx(7.1220e-9, rel=1e-4)


def test_ratios_are_the_inverse_groups(hull):
    r = "ratio to reference"
    # g L / U^2 = 981/64 = 15.328125 = 1/Fr^2 with Fr = 8/sqrt(981) = 0.25543
    assert row(hull, "gravity")[r] == pytest.approx(15.328125)
    # 1/Re = nu/(U L) = 1.19e-6/800 = 1.4875e-9
    assert row(hull, "viscous")[r] == pytest.approx(1.4875e-9)
    # 1/We = sigma/(rho U^2 L) = 0.073/(1025*64*100) = 1.11280e-8
    assert row(hull, "capillary")[r] == pytest.approx(1.11280e-8, rel=1e-4)


def test_ratios_are_named_from_the_catalogue(hull):
    assert row(hull, "gravity")["group"] == "Fr^-2 (Froude number)"
    assert row(hull, "viscous")["group"] == "Re^-1 (Reynolds number)"
    assert row(hull, "capillary")["group"] == "We^-1 (Weber number)"
    assert row(hull, "pressure")["group"] == "Eu (Euler number)"
    # L/(U t) = St with the frequency 1/t
    assert row(hull, "unsteady")["group"] == "St (Strouhal number)"


def test_model_magnitudes_match_hand_calculation(hull):
    col = "model magnitude [m/s^2]"
    # U^2/L = 0.16/0.25 = 0.64 (Froude scaling keeps accelerations)
    assert row(hull, "advective")[col] == pytest.approx(0.64)
    # g not given for the model: the prototype's 9.81 is used
    assert row(hull, "gravity")[col] == pytest.approx(9.81)
    # nu U/L^2 = 1.14e-6*0.4/0.0625 = 7.296e-6; sigma/(rho L^2) = 0.073/62.4375 = 1.16917e-3
    assert row(hull, "viscous")[col] == pytest.approx(7.296e-6)
    assert row(hull, "capillary")[col] == pytest.approx(1.16917e-3, rel=1e-4)
    # model 1/We = 1.16917e-3/0.64 = 1.8268e-3
    assert row(hull, "capillary")["model ratio"] == pytest.approx(1.8268e-3, rel=1e-4)


def test_capillarity_enters_the_small_model_balance(hull):
    # 1.1e-8 < 1e-3 at full scale, 1.8e-3 >= 1e-3 in the model
    assert row(hull, "capillary")["negligible at prototype"]
    assert not row(hull, "capillary")["negligible in model"]
    assert row(hull, "capillary")["regime change"]
    assert hull.dominant_prototype == ("advective", "unsteady", "pressure", "gravity")
    assert hull.dominant_model == ("advective", "unsteady", "pressure", "gravity", "capillary")
    assert len(hull.changes) == 1 and hull.changes[0].startswith("capillary: negligible")


def test_viscous_term_is_negligible_in_both(hull):
    # 1/Re: 1.5e-9 prototype, 1.14e-5 model, both < 1e-3
    assert row(hull, "viscous")["negligible at prototype"]
    assert row(hull, "viscous")["negligible in model"]
    assert not row(hull, "viscous")["regime change"]


def test_default_threshold_of_one_percent_sees_no_regime_change():
    result = term_balance(TERMS, PROTOTYPE, MODEL)
    assert result.threshold == 0.01 and result.changes == ()


def test_reference_term_can_be_chosen():
    # relative to gravity: advective = 0.64/9.81 = 0.065240 = Fr^2
    result = term_balance(TERMS, PROTOTYPE, reference="gravity")
    assert row(result, "advective")["ratio to reference"] == pytest.approx(0.64 / 9.81)
    assert row(result, "advective")["group"] == "Fr^2 (Froude number)"


def test_coriolis_ratio_is_the_inverse_rossby_number():
    # invented ocean eddy: U = 0.1 m/s, L = 100 km, Omega = 7.292e-5 rad/s (Earth, 2 pi/86164 s)
    # Coriolis/advective = Omega L / U = 72.92 = 1/Ro
    result = term_balance({"advective": "U**2/L", "coriolis": "Omega*U"},
                          {"U": "0.1 m/s", "L": "100 km", "Omega": "7.292e-5 rad/s"})
    assert row(result, "coriolis")["ratio to reference"] == pytest.approx(72.92)
    assert row(result, "coriolis")["group"] == "Ro^-1 (Rossby number)"


def test_inconsistent_term_is_refused_naming_both_dimensions():
    terms = dict(TERMS, odd="U/L")
    with pytest.raises(InputError, match=r"terms\.odd.*1 / \[time\].*advective.*"
                                         r"\[length\] / \[time\] \*\* 2"):
        term_balance(terms, PROTOTYPE)


def test_no_model_leaves_model_columns_empty():
    result = term_balance(TERMS, PROTOTYPE)
    assert math.isnan(row(result, "gravity")["model ratio"])
    assert result.dominant_model == ()


def test_sequence_of_terms_and_quantity_scales():
    result = term_balance(["U^2/L", "g"], {"U": Q_(2.0, "m/s"), "L": Q_(4.0, "m"),
                                           "g": Q_(9.81, "m/s^2")})
    # 2^2/4 = 1.0 m/s^2 against g = 9.81
    assert row(result, "g")["ratio to reference"] == pytest.approx(9.81)


@pytest.mark.parametrize("evil", [
    "__import__('os').system('echo hi')",
    "U.real",
    "(lambda: 1)()",
    "U[0]",
    "open('x')",
])
def test_terms_are_parsed_not_evaluated(evil):
    with pytest.raises(InputError, match="terms.x"):
        parse_term(evil, "terms.x")


def test_sums_are_refused_with_advice():
    with pytest.raises(InputError, match="sum"):
        parse_term("U**2/L + g", "terms.x")


def test_missing_scale_is_named():
    with pytest.raises(InputError, match="'sigma'"):
        term_balance({"a": "U**2/L", "b": "sigma/(rho*L**2)"}, {"U": "1 m/s", "L": "1 m",
                                                               "rho": "1000 kg/m^3"})


def test_unknown_reference_is_refused():
    with pytest.raises(InputError, match="reference"):
        term_balance(TERMS, PROTOTYPE, reference="nonsense")


def test_sqrt_and_fractional_powers_are_exact():
    m = parse_term("sqrt(g*h)*U/L", "t")
    assert m.exponents == {"g": 0.5, "h": 0.5, "U": 1, "L": -1}

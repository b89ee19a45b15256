"""The ``groups`` and ``balance`` commands, through ``similitude.cli.main``.

Expected groups: Re = VL/nu and Fr = V/sqrt(gL) (DESIGN.md; ITTC Symbols 2017). Exit codes:
0 success, 2 bad input with one ``error:`` line per problem (DESIGN.md).
"""

import json

import pytest

from similitude.cli import main

HULL_TOML = """
title = "invented 1:400 hull"
reference = "advective"
threshold = 0.001

[terms]
advective = "U**2/L"
gravity = "g"
capillary = "sigma/(rho*L**2)"

[prototype]
U = "8 m/s"
L = "100 m"
g = "9.81 m/s^2"
rho = "1025 kg/m^3"
sigma = "0.073 N/m"

[model]
U = "0.4 m/s"
L = "0.25 m"
rho = "999 kg/m^3"
"""


def test_groups_prints_named_groups(capsys):
    assert main(["groups", "V=m/s", "L=m", "nu=m^2/s", "g=m/s^2"]) == 0
    out = capsys.readouterr().out
    assert "Reynolds number" in out and "Froude number" in out
    assert "V/sqrt(g*L)" in out and "rank 2" in out


def test_groups_json_has_exact_exponents(capsys):
    assert main(["groups", "V=m/s", "L=m", "g=m/s^2", "--json"]) == 0
    doc = json.loads(capsys.readouterr().out)
    fr = doc["groups"][0]
    assert fr["key"] == "froude"
    # exact exponents as text: V/sqrt(gL)
    assert fr["exponents"] == {"V": "1", "g": "-1/2", "L": "-1/2"}


def test_groups_accepts_a_repeating_set(capsys):
    assert main(["groups", "V=m/s", "L=m", "nu=m^2/s", "g=m/s^2", "--repeating", "g,L",
                 "--json"]) == 0
    doc = json.loads(capsys.readouterr().out)
    assert doc["repeating"] == ["g", "L"]
    assert {g["key"] for g in doc["groups"]} == {"froude", "reynolds"}


def test_groups_accepts_roles_and_values(capsys):
    # hand: Pr = nu/alpha = 1.0e-6/1.43e-7 = 6.993
    assert main(["groups", "nu=1.0e-6 m^2/s", "k=1.43e-7 m^2/s:thermal_diffusivity",
                 "--json"]) == 0
    g = json.loads(capsys.readouterr().out)["groups"][0]
    assert g["key"] == "prandtl" and g["value"] == pytest.approx(6.993, rel=1e-3)


@pytest.mark.parametrize("argv,fragment", [
    (["groups", "V=m/ss", "L=m"], "variables.V"),
    (["groups", "Vms"], "SYMBOL=UNIT"),
    (["groups", "V=m/s", "L=m", "--repeating", "V,U"], "'U' is not one of the variables"),
    (["groups", "V=m/s", "U=m/s", "L=m", "--repeating", "V,U"], "not independent"),
])
def test_groups_bad_input_exits_two_with_one_line(capsys, argv, fragment):
    assert main(argv) == 2
    err = capsys.readouterr().err
    assert fragment in err and err.startswith("error:") and "Traceback" not in err


def test_balance_prints_regime_change(tmp_path, capsys):
    f = tmp_path / "hull.toml"
    f.write_text(HULL_TOML)
    assert main(["balance", str(f)]) == 0
    out = capsys.readouterr().out
    # model 1/We = 0.073/(999*0.16*0.25) = 1.827e-3 >= 1e-3; prototype 1.1e-8
    assert "capillary: negligible at full scale" in out
    assert "We^-1 (Weber number)" in out


def test_balance_json_and_threshold_override(tmp_path, capsys):
    f = tmp_path / "hull.toml"
    f.write_text(HULL_TOML)
    assert main(["balance", str(f), "--json", "--threshold", "0.01"]) == 0
    doc = json.loads(capsys.readouterr().out)
    assert doc["threshold"] == 0.01 and doc["changes"] == []
    assert doc["terms"][1]["group"] == "Fr^-2 (Froude number)"


def test_balance_demo_case_runs(capsys):
    assert main(["balance", "demo_cases/balance_hull.toml"]) == 0
    assert "regime changes" in capsys.readouterr().out


@pytest.mark.parametrize("text,fragment", [
    ("[terms]\na='U'\n", "[prototype] missing"),
    ("this is not toml", "not valid TOML"),
    ("[terms]\na='U**2/L'\nb='U/L'\n[prototype]\nU='1 m/s'\nL='1 m'\n", "terms.b"),
    ("colour='red'\n[terms]\na='U'\nb='U'\n[prototype]\nU='1 m/s'\n", "unknown key 'colour'"),
])
def test_balance_bad_file_exits_two(tmp_path, capsys, text, fragment):
    f = tmp_path / "bad.toml"
    f.write_text(text)
    assert main(["balance", str(f)]) == 2
    err = capsys.readouterr().err
    assert fragment in err and "Traceback" not in err


def test_balance_missing_file_exits_two(tmp_path, capsys):
    assert main(["balance", str(tmp_path / "none.toml")]) == 2
    assert "cannot read" in capsys.readouterr().err


def test_groups_names_heat_transfer_groups(capsys):
    # Nu = hL/k, Re = VL/nu, Pe = VL/alpha (Incropera & DeWitt 2007, from memory)
    argv = ["groups", "h=W/(m^2*K)", "k=W/(m*K)", "L=m", "V=m/s", "nu=m^2/s", "alpha=m^2/s"]
    assert main(argv) == 0
    out = capsys.readouterr().out
    for name in ("Nusselt number", "Reynolds number", "Peclet number"):
        assert name in out
    assert "h*L/k" in out


def test_groups_reads_a_reduced_gravity_and_names_the_densimetric_froude_number(capsys):
    # Fr_d = U/sqrt(g' L) (Turner 1973, from memory)
    assert main(["groups", "U=m/s", "L=m", "g'=m/s^2", "--json"]) == 0
    g = json.loads(capsys.readouterr().out)["groups"][0]
    assert (g["key"], g["exponents"]) == ("densimetric_froude",
                                         {"U": "1", "g'": "-1/2", "L": "-1/2"})


def test_groups_with_a_role_suffix_that_does_not_fit_the_unit_exits_two(capsys):
    assert main(["groups", "V=m/s:kinematic_viscosity", "L=m"]) == 2
    err = capsys.readouterr().err
    assert err.startswith("error:") and "needs dimension" in err


def test_balance_term_of_another_dimension_exits_two_naming_both(tmp_path, capsys):
    f = tmp_path / "bad.toml"
    f.write_text('[terms]\na = "U**2/L"\nb = "g*L"\n[prototype]\nU = "1 m/s"\nL = "1 m"\n'
                 'g = "9.81 m/s^2"\n')
    assert main(["balance", str(f)]) == 2
    err = capsys.readouterr().err
    assert err.startswith("error:") and "terms.b" in err and "[length] / [time] ** 2" in err


def test_groups_json_keeps_a_greek_symbol_as_written(capsys):
    # the user's own symbols come back unescaped (UTF-8 JSON, RFC 8259 §8.1)
    assert main(["groups", "ρ=kg/m^3", "V=m/s", "L=m", "μ=Pa*s", "--json"]) == 0
    out = capsys.readouterr().out
    assert '"ρ"' in out and json.loads(out)["variables"]["ρ"]["unit"] == "kg/m^3"

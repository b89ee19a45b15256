"""``similitude props``: property tables with units in the headers, from fluids_props.

Oracles (test-only reference libraries): iapws (IAPWS-95 formulation, IAPWS R6-95),
gsw (TEOS-10, IOC et al. 2010), CoolProp (Lemmon et al. 2000 air formulation). The CLI only
passes states through to fluids_props, so a loose 1e-4 relative tolerance checks the plumbing
(units, ranges, column order), not the correlations, which have their own tests.
"""

from __future__ import annotations

import csv
import io

import pytest

from similitude.cli import main


def table(capsys, *args) -> list[dict]:
    assert main(["props", *args, "--csv"]) == 0
    return list(csv.DictReader(io.StringIO(capsys.readouterr().out)))


def test_water_density_and_viscosity_at_20_degc_match_iapws95(capsys):
    import iapws

    (row,) = table(capsys, "water", "--temperature", "20 degC")
    ref = iapws.IAPWS95(T=293.15, P=0.101325)            # IAPWS-95 at 0.101325 MPa
    assert float(row["density [kg/m^3]"]) == pytest.approx(ref.rho, rel=1e-4)
    assert float(row["dynamic viscosity [Pa s]"]) == pytest.approx(ref.mu, rel=1e-3)


def test_temperature_range_lists_every_step(capsys):
    rows = table(capsys, "water", "--temperature", "10 degC..30 degC:5")
    assert [float(r["temperature [degC]"]) for r in rows] == pytest.approx([10, 15, 20, 25, 30])


def test_fahrenheit_and_celsius_give_the_same_row(capsys):
    # 68 degF = 20 degC (BIPM SI Brochure 2019: t/degF = 1.8 t/degC + 32)
    a, b = table(capsys, "water", "--temperature", "68 degF", "20 degC")
    assert float(a["density [kg/m^3]"]) == pytest.approx(float(b["density [kg/m^3]"]), rel=1e-12)


def test_sea_water_density_matches_teos10(capsys):
    import gsw

    (row,) = table(capsys, "sea-water", "--temperature", "15 degC", "--salinity",
                   "35.16504 g/kg")
    ref = gsw.rho(35.16504, gsw.CT_from_t(35.16504, 15.0, 0.0), 0.0)   # TEOS-10, p = 0 dbar
    assert float(row["density [kg/m^3]"]) == pytest.approx(ref, rel=1e-4)
    assert float(row["salinity [g/kg]"]) == pytest.approx(35.16504)


def test_air_at_4_bar_matches_coolprop(capsys):
    from CoolProp.CoolProp import PropsSI

    (row,) = table(capsys, "air", "--temperature", "15 degC", "--pressure", "4 bar")
    assert float(row["pressure [Pa]"]) == 4e5
    assert float(row["density [kg/m^3]"]) == pytest.approx(PropsSI("D", "T", 288.15, "P", 4e5,
                                                                   "Air"), rel=1e-3)


def test_states_combine_every_value(capsys):
    rows = table(capsys, "air", "--temperature", "10 degC", "20 degC", "--pressure", "1 bar",
                 "2 bar", "3 bar")
    assert len(rows) == 6


def test_standard_atmosphere_at_sea_level(capsys):
    (row,) = table(capsys, "atmosphere", "--altitude", "0 m")
    # ISO 2533:1975 sea-level values: 288.15 K, 101325 Pa, 1.225 kg/m^3
    assert float(row["temperature [K]"]) == pytest.approx(288.15, abs=1e-6)
    assert float(row["pressure [Pa]"]) == pytest.approx(101325.0, rel=1e-9)
    assert float(row["density [kg/m^3]"]) == pytest.approx(1.225, rel=1e-3)


def test_headers_carry_units(capsys):
    (row,) = table(capsys, "water", "--temperature", "15 degC")
    for col in ("temperature [degC]", "density [kg/m^3]", "kinematic viscosity [m^2/s]",
                "vapour pressure [Pa]", "surface tension [N/m]"):
        assert col in row


def test_plain_table_is_printed_without_csv(capsys):
    assert main(["props", "water", "--temperature", "15 degC"]) == 0
    out = capsys.readouterr().out
    assert "density [kg/m^3]" in out and "," not in out


def test_list_shows_the_catalogue_with_ranges(capsys):
    assert main(["props", "--list"]) == 0
    out = capsys.readouterr().out
    for name in ("water", "sea-water", "air", "atmosphere", "nitrogen"):
        assert name in out
    assert "degC" in out


def test_unknown_fluid_exits_two_with_a_hint(capsys):
    assert main(["props", "watr", "--temperature", "15 degC"]) == 2
    assert "did you mean 'water'" in capsys.readouterr().err


def test_wrong_unit_exits_two_naming_the_option(capsys):
    assert main(["props", "water", "--temperature", "15 kg"]) == 2
    (line,) = capsys.readouterr().err.strip().splitlines()
    assert "--temperature" in line and "'15 kg'" in line


def test_every_bad_value_is_reported(capsys):
    assert main(["props", "sea-water", "--temperature", "15 kg", "--salinity", "3 m",
                 "--humidity", "0.5"]) == 2
    assert len(capsys.readouterr().err.strip().splitlines()) == 3


def test_temperature_outside_the_validity_range_exits_two(capsys):
    assert main(["props", "water", "--temperature", "95 degC"]) == 2
    assert "validity range" in capsys.readouterr().err


def test_missing_temperature_exits_two(capsys):
    assert main(["props", "water"]) == 2
    assert "--temperature: missing" in capsys.readouterr().err


def test_bad_range_exits_two(capsys):
    assert main(["props", "water", "--temperature", "30 degC..10 degC:5"]) == 2
    assert "START" in capsys.readouterr().err


def test_nitrogen_at_3_bar_matches_coolprop(capsys):
    from CoolProp.CoolProp import PropsSI

    (row,) = table(capsys, "nitrogen", "--temperature", "15 degC", "--pressure", "3 bar")
    # Span et al. (2000) nitrogen formulation as implemented in CoolProp
    assert float(row["density [kg/m^3]"]) == pytest.approx(
        PropsSI("D", "T", 288.15, "P", 3e5, "Nitrogen"), rel=1e-3)


def test_any_catalogue_name_from_the_list_is_accepted(capsys):
    from CoolProp.CoolProp import PropsSI

    rows = table(capsys, "coolprop:sf6", "--temperature", "20 degC", "--pressure", "1 bar",
                 "3 bar")
    assert len(rows) == 2
    assert float(rows[1]["density [kg/m^3]"]) == pytest.approx(
        PropsSI("D", "T", 293.15, "P", 3e5, "SF6"), rel=1e-3)


def test_help_lists_the_options_and_exits_zero(capsys):
    assert main(["props", "--help"]) == 0
    out = capsys.readouterr().out
    for option in ("--temperature", "--pressure", "--salinity", "--csv", "--list"):
        assert option in out


def test_top_level_help_names_every_command(capsys):
    assert main(["--help"]) == 0
    out = capsys.readouterr().out
    for command in ("plan", "props", "groups", "extrapolate"):
        assert command in out

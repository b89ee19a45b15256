"""The fluid catalogue the planner searches: names, kinds and validity ranges."""

import pytest

import fluids_props as fp


def test_catalogue_lists_water_sea_water_and_air():
    names = {f.name for f in fp.list_fluids()}
    assert {"fresh_water", "sea_water", "air"} <= names


def test_every_fluid_states_a_temperature_range():
    for info in fp.list_fluids():
        rng = info.range_of("temperature")
        assert rng is not None and rng.low < rng.high, info.name


def test_lookup_accepts_the_command_line_spelling():
    assert fp.get_fluid("sea-water").name == "sea_water"


def test_unknown_fluid_lists_the_known_ones():
    with pytest.raises(ValueError, match="unknown fluid 'mercury'; expected one of: fresh_water"):
        fp.get_fluid("mercury")


def test_catalogue_evaluation_matches_the_public_function():
    info = fp.get_fluid("fresh_water")
    a = info.evaluate_si(293.15, 101325.0)
    b = fp.fresh_water("20 degC")
    assert a.density_si == pytest.approx(b.density.to("kg/m^3").magnitude, rel=1e-12)


def test_out_of_range_temperature_names_quantity_value_and_range():
    with pytest.raises(fp.OutOfRangeError, match=r"temperature -30 degC is outside"):
        fp.fresh_water("-30 degC")

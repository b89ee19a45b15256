"""Reading user quantities into SI: the shared registry and its string parsing.

Conversion factors are exact by definition: 1 kn = 1852/3600 m/s (international nautical mile,
BIPM SI Brochure 9th ed., Table 8), 1 ft = 0.3048 m (international yard and pound agreement,
1959), T[K] = t[degC] + 273.15 and t[degF] = 1.8 t[degC] + 32 (ITS-90 / BIPM SI Brochure).
"""

import numpy as np
import pint
import pytest

from fluids_props.units import UnitInputError, parse_quantity, to_si, ureg


def test_celsius_string_parses_to_kelvin():
    assert to_si("15 degC", "[temperature]") == pytest.approx(288.15, abs=1e-12)


def test_fahrenheit_string_parses_to_kelvin():
    # 59 degF = 15 degC exactly.
    assert to_si("59 degF", "[temperature]") == pytest.approx(288.15, abs=1e-9)


def test_kelvin_string_passes_unchanged():
    assert to_si("288.15 K", "[temperature]") == pytest.approx(288.15, abs=1e-12)


def test_grams_per_kilogram_is_a_mass_fraction():
    assert to_si("35 g/kg", "dimensionless") == pytest.approx(0.035, rel=1e-15)


def test_bar_string_parses_to_pascal():
    assert to_si("2 bar", "[pressure]") == pytest.approx(2e5, rel=1e-15)


def test_knots_parse_to_metres_per_second():
    assert to_si("18 kn", "[length] / [time]") == pytest.approx(18 * 1852 / 3600, rel=1e-14)


def test_list_of_strings_becomes_an_array_in_one_unit():
    out = to_si(["10 degC", "50 degF"], "[temperature]")
    np.testing.assert_allclose(out, [283.15, 283.15], rtol=1e-12)


def test_quantity_of_the_application_registry_is_accepted():
    q = pint.get_application_registry().Quantity(3.0, "ft")
    assert to_si(q, "[length]") == pytest.approx(0.9144, rel=1e-14)


def test_quantity_of_a_foreign_registry_is_accepted():
    other = pint.UnitRegistry()
    assert to_si(other.Quantity(3.0, "ft"), "[length]") == pytest.approx(0.9144, rel=1e-14)


def test_shared_registry_is_pints_application_registry():
    assert ureg is pint.get_application_registry()


def test_wrong_dimension_names_field_value_and_expectation():
    with pytest.raises(UnitInputError, match=r"speed: '15 kg' has dimension \[mass\]; expected"):
        to_si("15 kg", "[length] / [time]", "speed")


def test_bare_number_for_a_dimensional_field_is_refused():
    with pytest.raises(UnitInputError, match="bare number"):
        to_si(3.0, "[length]", "length")


def test_unknown_unit_gives_a_readable_error():
    with pytest.raises(UnitInputError, match="cannot read 'fast'"):
        parse_quantity("fast", "speed")


def test_array_quantity_keeps_its_shape():
    q = ureg.Quantity(np.array([[1.0, 2.0]]), "km")
    assert to_si(q, "[length]").shape == (1, 2)

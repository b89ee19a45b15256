"""Reading user quantities into SI: the shared registry and its string parsing.

Conversion factors are exact by definition: 1 kn = 1852/3600 m/s (international nautical mile,
BIPM SI Brochure 9th ed., Table 8), 1 ft = 0.3048 m (international yard and pound agreement,
1959), T[K] = t[degC] + 273.15 and t[degF] = 1.8 t[degC] + 32 (ITS-90 / BIPM SI Brochure).
"""

import inspect

import numpy as np
import pint
import pytest

import fluids_props as fp
from fluids_props.units import UnitInputError, parse_quantity, si_edge, to_si, ureg


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


# --- the public edge of the SI cores (si_edge) ---------------------------------------------------


def _speed_si(speed_m_s, length_m=1.0, extrapolate=False):
    return speed_m_s, length_m, extrapolate


@si_edge(_speed_si, speed="[length] / [time]", length="[length]")
def _speed(speed, length="1 m", extrapolate=False):
    """Speed and length in SI."""


def test_edge_converts_each_declared_argument_to_si_and_passes_the_rest():
    # 1 kn = 1852/3600 m/s, 1 ft = 0.3048 m (exact definitions, see the module docstring).
    speed, length, extrapolate = _speed("18 kn", "3 ft", extrapolate=True)
    assert speed == pytest.approx(18 * 1852 / 3600, rel=1e-14)
    assert length == pytest.approx(0.9144, rel=1e-14)
    assert extrapolate is True


def test_edge_converts_the_public_default_too():
    assert _speed("2 m/s")[1] == 1.0


def test_edge_refuses_a_wrong_unit_naming_the_argument_value_and_dimension():
    with pytest.raises(UnitInputError, match=r"length: '3 s' has dimension \[time\]; expected"):
        _speed("2 m/s", "3 s")


def test_edge_keeps_pythons_own_message_for_a_wrong_call():
    with pytest.raises(TypeError, match=r"_speed\(\) got an unexpected keyword argument 'x'"):
        _speed("2 m/s", x=1)


def test_edge_refuses_at_decoration_an_argument_the_core_does_not_take():
    with pytest.raises(TypeError, match="takes no width"):
        @si_edge(_speed_si, speed="[length] / [time]")
        def _bad(speed, width="1 m"):
            """Not a valid edge."""


@pytest.mark.parametrize("public", [fp.fresh_water, fp.sea_water, fp.glycerol_water, fp.air,
                                    fp.nitrogen, fp.standard_atmosphere])
def test_public_fluid_functions_keep_their_signature_and_numpydoc_docstring(public):
    parameters = inspect.signature(public).parameters
    assert "extrapolate" in parameters and parameters["extrapolate"].default is False
    assert "Parameters\n    ----------" in public.__doc__

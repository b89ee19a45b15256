"""Reading model scales: the trade writes lambda = L_prototype / L_model as "1:25"."""

import pytest

from similitude.units import UnitInputError, parse_scale


def test_ratio_notation_gives_lambda():
    assert parse_scale("1:25") == 25.0


def test_plain_number_is_lambda():
    assert parse_scale(36.5) == 36.5


def test_numeric_string_is_lambda():
    assert parse_scale("12.5") == 12.5


@pytest.mark.parametrize("bad", ["1:0", "0", "-3", "big", "25:"])
def test_invalid_scale_names_the_field(bad):
    with pytest.raises(UnitInputError, match="scale"):
        parse_scale(bad)


@pytest.mark.parametrize("text", ["120 rpm", "2 rps", "2 rev/s", "120 rev/min", "2 Hz",
                                  "12.566370614359172 rad/s"])
def test_rotation_rates_count_revolutions(text):
    # n of J = V/(nD) counts revolutions: 1 rev = 2 pi rad (SI Brochure, 9th ed., Table 4).
    from similitude.units import to_rotation_rate

    assert to_rotation_rate(text) == pytest.approx(2.0, rel=1e-12)


def test_rotation_rate_of_the_wrong_dimension_is_refused():
    from similitude.units import to_rotation_rate

    with pytest.raises(UnitInputError, match="n: '3 m' has dimension"):
        to_rotation_rate("3 m", "n")

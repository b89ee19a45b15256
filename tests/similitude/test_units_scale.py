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

"""Cautions are worded for the kind of test: water tests defer to the ITTC procedures, tests in
air to wind-tunnel correction practice; every wording names validity ranges and licensed
practice (project rule: outputs feed ship and structure design)."""

from __future__ import annotations

import pytest

from similitude.cautions import PREDICTION_CAUTIONS, caution_line, plan_caution

WATER = ("towing_tank", "wave_basin", "cavitation_tunnel")


@pytest.mark.parametrize("kind", WATER)
def test_water_test_cautions_defer_to_the_ittc_procedures_and_class_rules(kind):
    for text in (caution_line(kind), plan_caution(kind)):
        assert "ITTC" in text and "class rules" in text and "licensed practice" in text


def test_wind_tunnel_cautions_defer_to_wind_tunnel_practice_not_to_ship_rules():
    for text in (caution_line("wind_tunnel"), plan_caution("wind_tunnel")):
        assert "wind-tunnel" in text and "AGARD-AG-336" in text
        assert "ITTC" not in text and "class rules" not in text
        assert "licensed practice" in text


@pytest.mark.parametrize("kind", [*WATER, "wind_tunnel", None])
def test_every_caution_says_estimates_and_validity(kind):
    assert "Estimates only" in caution_line(kind) and "validity" in caution_line(kind)
    assert "estimates" in plan_caution(kind) and "validity ranges" in plan_caution(kind)


def test_prediction_cautions_name_the_performance_prediction_procedure():
    assert any("7.5-02-03-01.4" in c for c in PREDICTION_CAUTIONS)
    assert "ESTIMATES" in PREDICTION_CAUTIONS[0]

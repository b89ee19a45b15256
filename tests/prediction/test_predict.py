"""predict(): the after-test stage in one call, and its Prediction result."""

from __future__ import annotations

import json
import math

import numpy as np
import openpyxl
import pytest

from similitude.errors import InputError
from similitude.prediction.extrapolation import ExtrapolationOptions, ShipParticulars, extrapolate
from similitude.prediction.open_water import PropellerParticulars, scale_open_water
from similitude.prediction.predict import Prediction, predict
from similitude.prediction.runs import OpenWaterRuns, PlannedRuns, ResistanceRuns
from similitude.prediction.uncertainty import MeasurementUncertainty
from similitude.report.atomic import OutputExistsError

SHIP = ShipParticulars(length=100.0, wetted_surface=2500.0, scale=25.0, transverse_area=250.0)
PROP = PropellerParticulars(diameter=5.0, scale=25.0, pitch_diameter=1.0, chord_diameter=0.3,
                            blades=4, thickness_chord=0.04)
OPEN_WATER = OpenWaterRuns(("1", "2"), np.array([0.3, 0.6]), np.array([0.35, 0.22]),
                           np.array([0.05, 0.035]), temperature=np.array([291.15, 291.15]),
                           rotation_rate=np.array([15.0, 15.0]))
# Two runs with a given form factor: no Prohaska fit needed.
OPTIONS = ExtrapolationOptions(form_factor=0.15)
RUNS = ResistanceRuns(("1", "2"), np.array([1.2, 1.6]), np.array([20.0, 38.0]),
                      np.array([291.15, 291.15]))


def test_resistance_only_gives_the_extrapolation_and_nothing_else():
    p = predict(RUNS, SHIP, OPTIONS)
    assert isinstance(p, Prediction)
    assert p.uncertainty is None and p.open_water is None and p.plan_notes == ()
    assert p.results is p.extrapolation.results


def test_predict_chains_the_steps_without_changing_their_numbers():
    # The orchestrator adds no arithmetic: each table equals the step called on its own.
    p = predict(RUNS, SHIP, OPTIONS, open_water_runs=OPEN_WATER, propeller=PROP,
                uncertainty=MeasurementUncertainty(speed=0.002))
    alone = extrapolate(RUNS, SHIP, OPTIONS)
    np.testing.assert_array_equal(p.results["P_E [kW]"], alone.results["P_E [kW]"])
    np.testing.assert_array_equal(p.open_water.table["K_T ship [-]"],
                                  scale_open_water(OPEN_WATER, PROP).table["K_T ship [-]"])
    assert p.uncertainty.inputs.speed == 0.002
    assert list(p.uncertainty.table["run"]) == ["1", "2"]


def test_open_water_runs_without_the_propeller_are_refused():
    with pytest.raises(InputError, match="open_water_runs and propeller"):
        predict(RUNS, SHIP, open_water_runs=OPEN_WATER)
    with pytest.raises(InputError, match="open_water_runs and propeller"):
        predict(RUNS, SHIP, propeller=PROP)


def test_run_far_from_its_planned_speed_draws_a_plan_note():
    # Run 2 measured at 1.6 m/s against 1.28 m/s planned: +25.0 %, beyond the 2 % tolerance.
    planned = PlannedRuns((1, 2), [1.2, 1.28], SHIP.scale)
    p = predict(RUNS, SHIP, OPTIONS, planned=planned)
    assert len(p.plan_notes) == 1 and "run 2" in p.plan_notes[0]
    assert "+25.0 %" in p.plan_notes[0]


def test_a_scale_other_than_the_plans_is_named_beside_the_speed_note():
    planned = PlannedRuns(("1", "2"), [1.2, 1.28], 20.0)
    notes = predict(RUNS, SHIP, OPTIONS, planned=planned).plan_notes
    assert len(notes) == 2 and "1:25" in notes[1] and "1:20" in notes[1]


def test_runs_at_their_planned_speeds_draw_no_note():
    planned = PlannedRuns(("1", "2"), [1.2, 1.6], 20.0)
    assert predict(RUNS, SHIP, OPTIONS, planned=planned).plan_notes == ()


def test_planned_runs_need_one_speed_per_run():
    with pytest.raises(InputError, match="one speed per run"):
        PlannedRuns(("1", "2", "3"), [1.2, 1.6], 25.0)


def test_planned_runs_from_a_plan_read_its_matrix_and_scale():
    class FakePlan:  # the two attributes of a Plan that the after-test stage reads
        matrix = {"run": np.array([1, 2]), "model speed [m/s]": np.array([1.2, 1.6])}
        scale = np.float64(22.5)

    planned = PlannedRuns.from_plan(FakePlan())
    assert planned.run == ("1", "2") and planned.scale == 22.5
    np.testing.assert_array_equal(planned.model_speed, [1.2, 1.6])


def test_to_dict_is_strict_json_with_every_part():
    p = predict(RUNS, SHIP, OPTIONS, open_water_runs=OPEN_WATER, propeller=PROP,
                uncertainty=MeasurementUncertainty(speed=0.002))
    data = json.loads(json.dumps(p.to_dict(), allow_nan=False))
    for key in ("ship", "options", "method", "form_factor", "results", "notes", "uncertainty",
                "plan_notes", "open_water"):
        assert key in data
    assert math.isclose(data["results"][0]["P_E [kW]"], float(p.results["P_E [kW]"][0]))


def test_to_excel_writes_every_sheet_and_refuses_to_overwrite(tmp_path):
    p = predict(RUNS, SHIP, OPTIONS, open_water_runs=OPEN_WATER, propeller=PROP,
                uncertainty=MeasurementUncertainty(speed=0.002))
    target = p.to_excel(tmp_path / "r.xlsx")
    sheets = openpyxl.load_workbook(target).sheetnames
    assert "Uncertainty" in sheets and "Open water" in sheets and "Results" in sheets
    with pytest.raises(OutputExistsError):
        p.to_excel(target)

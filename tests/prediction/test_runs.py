"""Measured runs as data: run ids compared as text, and the note on a run far from the plan."""

from __future__ import annotations

import numpy as np

from similitude.prediction.runs import ResistanceRuns, planned_speed_notes, run_id


def test_measured_speed_far_from_the_planned_one_draws_a_note():
    runs = ResistanceRuns(("1", "2"), np.array([1.0, 1.5]), np.array([5.0, 9.0]),
                          np.array([290.0, 290.0]))
    notes = planned_speed_notes(runs, [1, 2], [1.0, 1.2])
    assert len(notes) == 1 and "run 2" in notes[0] and "+25.0 %" in notes[0]


def test_whole_number_run_ids_compare_as_the_same_text():
    # A spreadsheet cell 2.0, a plan's integer 2 and the text "2" name the same run.
    assert run_id(2.0) == run_id(2) == run_id(" 2 ") == run_id("2.0") == "2"
    assert run_id("R1") == "R1" and run_id(2.5) == "2.5"


def test_facility_ids_are_matched_by_the_nearest_planned_speed():
    # facility ids name no plan run: a run within 2 % of some planned speed draws no note
    runs = ResistanceRuns(("A7", "A8"), np.array([1.005, 1.5]), np.array([5.0, 9.0]),
                          np.array([290.0, 290.0]), id_kind="facility")
    notes = planned_speed_notes(runs, [1, 2], [1.0, 1.2])
    assert len(notes) == 1 and "A8" in notes[0] and "+25.0 %" in notes[0]


def test_free_and_numbered_runs_and_rows_without_id_are_never_compared():
    for kind in ("free", "numbered"):
        runs = ResistanceRuns(("1", "2"), np.array([0.3, 1.5]), np.array([5.0, 9.0]),
                              np.array([290.0, 290.0]), id_kind=kind)
        assert planned_speed_notes(runs, [1, 2], [1.0, 1.2]) == []
    extra = ResistanceRuns(("extra 1",), np.array([0.3]), np.array([5.0]), np.array([290.0]),
                           id_kind="facility")
    assert planned_speed_notes(extra, [1], [1.0]) == []

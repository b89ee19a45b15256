"""The after-test stage in one call: measured model data to a full-scale prediction.

:func:`predict` is the counterpart of :func:`similitude.planning.planner.plan`: it takes data
already read (resistance runs, the ship, the options, and optionally open-water runs with the
full-scale propeller, the measurement uncertainties and the runs of the test plan) and chains
the steps of this package:

1. the resistance extrapolation to full scale (:func:`~similitude.prediction.extrapolation.
   extrapolate`, ITTC 7.5-02-03-01.4);
2. notes where the measured model speeds or the scale disagree with the plan;
3. the open-water characteristics at full scale (:func:`~similitude.prediction.open_water.
   scale_open_water`, ITTC-1978 blade-drag correction);
4. the propagation of the measurement uncertainties (:func:`~similitude.prediction.uncertainty.
   propagate`, ISO GUM).

It reads no file and writes none: the readers (:mod:`similitude.readers.measured`) come before
it, the writers (:mod:`similitude.report.results_workbook`) after it.

Example (a notebook)::

    import similitude as sim

    case = sim.load_case("demo_cases/ferry_resistance.toml")
    plan = sim.plan(case)
    runs = sim.read_resistance_runs("runs.csv", plan_runs=plan.matrix["run"])
    ship = sim.ShipParticulars.from_case(case, plan.scale)
    p = sim.predict(runs, ship, planned=sim.PlannedRuns.from_plan(plan))
    p.results            # ship speed, C_TS, R_TS, P_E
    p.to_excel("results.xlsx")

Predictions are estimates: the facility's own correlation practice, the current ITTC
procedures and licensed practice prevail.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Any

from similitude.errors import InputError
from similitude.plain_data import plain
from similitude.prediction.extrapolation import (
    Extrapolation,
    ExtrapolationOptions,
    ShipParticulars,
    extrapolate,
)
from similitude.prediction.open_water import (
    OpenWaterScaling,
    PropellerParticulars,
    scale_open_water,
)
from similitude.prediction.runs import (
    OpenWaterRuns,
    PlannedRuns,
    ResistanceRuns,
    planned_speed_notes,
)
from similitude.prediction.uncertainty import MeasurementUncertainty, UncertaintyResult, propagate
from similitude.units import format_scale

SCALE_TOLERANCE = 1e-6
"""Relative difference between the scale used and the plan's that draws a note [-]."""


@dataclass(frozen=True, eq=False)
class Prediction:
    """The result of :func:`predict`: every step of the after-test analysis.

    Attributes
    ----------
    extrapolation : similitude.prediction.extrapolation.Extrapolation
        The resistance extrapolation: ship, options, measured runs, form factor and its fit,
        the model-scale and full-scale steps and the results (ship speed, C_TS, R_TS, P_E),
        with the method statement and cautions in its ``notes``.
    uncertainty : similitude.prediction.uncertainty.UncertaintyResult or None
        The propagated measurement uncertainties of C_TS and P_E per run; None when no
        measurement uncertainty was given.
    open_water : similitude.prediction.open_water.OpenWaterScaling or None
        The propeller's open-water characteristics, model and full scale, with their notes;
        None without open-water runs.
    plan_notes : tuple of str
        Where the measured runs disagree with the test plan: a measured model speed more than
        2 % from the planned one of the same run id, and then a scale other than the plan's.
        Empty without the planned runs. (The notes of each step are on that step's result.)
    """

    extrapolation: Extrapolation
    uncertainty: UncertaintyResult | None = None
    open_water: OpenWaterScaling | None = None
    plan_notes: tuple[str, ...] = ()

    @property
    def results(self):
        """The summary table of the extrapolation (ship speed, Fn, C_TS, R_TS, P_E), a
        DataFrame with units in the headers."""
        return self.extrapolation.results

    def to_dict(self) -> dict[str, Any]:
        """Plain data for JSON output: the extrapolation's, with the uncertainty table, the
        plan notes and the open-water table added."""
        data = self.extrapolation.to_dict()
        if self.uncertainty is not None:
            data["uncertainty"] = {"method": self.uncertainty.method,
                                   "table": self.uncertainty.table.to_dict(orient="records")}
        data["plan_notes"] = list(self.plan_notes)
        if self.open_water is not None:
            data["open_water"] = {"notes": list(self.open_water.notes),
                                  "table": self.open_water.table.to_dict(orient="records")}
        return plain(data)

    def to_excel(self, path: str | Path, overwrite: bool = False, paper: str = "A4") -> Path:
        """Write the results workbook (a notebook convenience for
        :func:`similitude.report.results_workbook.write_results`); returns the Path.

        An existing file is not replaced unless ``overwrite`` is True; ``paper`` is the paper
        size the sheets print on (``"A4"`` or ``"letter"``).
        """
        from similitude.report.results_workbook import write_results

        return write_results(path, self.extrapolation, uncertainty=self.uncertainty,
                             open_water=self.open_water, overwrite=overwrite, paper=paper)


def predict(runs: ResistanceRuns, ship: ShipParticulars,
            options: ExtrapolationOptions | None = None, *,
            open_water_runs: OpenWaterRuns | None = None,
            propeller: PropellerParticulars | None = None,
            uncertainty: MeasurementUncertainty | None = None,
            planned: PlannedRuns | None = None) -> Prediction:
    """Scale measured model data to the full-scale ship: the after-test stage in one call.

    Parameters
    ----------
    runs : ResistanceRuns
        Measured calm-water resistance runs (:func:`similitude.readers.measured.
        read_resistance_runs`, or built from arrays).
    ship : ShipParticulars
        The ship and the scale (:meth:`ShipParticulars.from_case` takes them from a case).
    options : ExtrapolationOptions, optional
        Choices of the extrapolation; default the ITTC-1978 method as revised (Rev 04, 2017),
        k by Prohaska's fit.
    open_water_runs : OpenWaterRuns, optional
        Measured propeller open-water runs; scaled to full scale with ``propeller``.
    propeller : PropellerParticulars, optional
        The full-scale propeller at 0.75 R; required with ``open_water_runs``.
    uncertainty : MeasurementUncertainty, optional
        Standard uncertainties of the measured inputs; propagated to C_TS and P_E.
    planned : PlannedRuns, optional
        The runs of the test plan (:meth:`PlannedRuns.from_plan`); measured model speeds far
        from the planned ones draw a note.

    Returns
    -------
    Prediction

    Raises
    ------
    InputError
        ``open_water_runs`` without ``propeller`` or the reverse, and every input error of the
        steps (one line naming the field, the value and what was expected).

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 "1978 ITTC Performance Prediction Method", Rev 04 (2017).
    .. [2] JCGM 100:2008 (ISO GUM), §5.1.2.
    """
    if (open_water_runs is None) != (propeller is None):
        raise InputError("open_water_runs and propeller: give both (the measured runs and the "
                         "full-scale propeller) or neither")
    extrapolation = extrapolate(runs, ship, options)
    plan_notes = () if planned is None else _plan_notes(runs, ship, planned)
    open_water = (None if open_water_runs is None
                  else scale_open_water(open_water_runs, propeller))
    propagated = None if uncertainty is None else propagate(extrapolation, uncertainty)
    return Prediction(extrapolation, propagated, open_water, plan_notes)


def _plan_notes(runs: ResistanceRuns, ship: ShipParticulars,
                planned: PlannedRuns) -> tuple[str, ...]:
    """Notes where measured and planned model speeds of the same run id disagree, and then
    whether the scale used is not the plan's (the likely cause)."""
    notes = planned_speed_notes(runs, planned.run, planned.model_speed)
    if notes and abs(ship.scale / planned.scale - 1.0) > SCALE_TOLERANCE:
        notes.append(f"the scale used ({format_scale(ship.scale)}) is not the plan's "
                     f"({format_scale(planned.scale)})")
    return tuple(notes)


__all__ = ["Prediction", "predict"]

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
4. with self-propulsion runs, the self-propulsion analysis (thrust or torque identity, w_TM, t,
   η_R, η_0, η_H, η_D; :mod:`~similitude.prediction.self_propulsion`) and the full-scale
   speed-power-rpm prediction (w_TS, K_T/J², J_TS, n_S, P_DS, trial figures, P_S, P_B;
   :mod:`~similitude.prediction.power`), through one chain of computations
   (:mod:`~similitude.prediction.chain`);
5. the propagation of the measurement uncertainties to P_E, and with self-propulsion runs to
   P_D and n_S, by first order and, when asked, Monte Carlo
   (:mod:`~similitude.prediction.uncertainty`, ISO GUM and JCGM 101).

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

    # with the propeller's open-water test and the self-propulsion test:
    p = sim.predict(runs, ship, open_water_runs=ow, propeller=prop,
                    self_propulsion_runs=sim.read_self_propulsion_runs("sp.csv"),
                    uncertainty=sim.MeasurementUncertainty.from_quantities(
                        speed="2 mm/s", resistance="0.3 %", thrust="0.5 %"),
                    monte_carlo=10_000)
    p.speed_power        # ship speed [kn], P_E, P_D, P_S, P_B [kW], rate [rpm]

Predictions are estimates: the facility's own correlation practice, the current ITTC
procedures and licensed practice prevail.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Any

import numpy as np

from similitude.errors import InputError
from similitude.plain_data import plain
from similitude.prediction.chain import ChainInputs, nominal_chain
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
from similitude.prediction.open_water_curve import PropellerCurves
from similitude.prediction.power import PowerPrediction, power_result
from similitude.prediction.propulsion_uncertainty import (
    PropulsionUncertainty,
    propulsion_uncertainty,
)
from similitude.prediction.runs import (
    OpenWaterRuns,
    PlannedRuns,
    ResistanceRuns,
    SelfPropulsionRuns,
    planned_speed_notes,
)
from similitude.prediction.self_propulsion import (
    PropulsionOptions,
    PropulsionSetup,
    SelfPropulsionAnalysis,
    analysis_result,
)
from similitude.prediction.uncertainty import (
    DEFAULT_SEED,
    MeasurementUncertainty,
    UncertaintyResult,
    propagate,
)
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
    self_propulsion : similitude.prediction.self_propulsion.SelfPropulsionAnalysis or None
        The analysed self-propulsion test: per run and per speed (the self-propulsion points)
        K_T, K_Q, J, w_TM, t, η_R, η_0, η_H, η_D; None without self-propulsion runs.
    power : similitude.prediction.power.PowerPrediction or None
        The full-scale prediction: per speed w_TS, K_T/J², J_TS, n_S, P_DS, the trial figures,
        P_S and P_B; the speed-power-rpm table and the contract-speed figures.
    propulsion_uncertainty : similitude.prediction.propulsion_uncertainty.
            PropulsionUncertainty or None
        Uncertainties of P_D and n_S (first order, and Monte Carlo when asked).
    chain : similitude.prediction.chain.ChainInputs or None
        The inputs of the chain behind the prediction (for further uncertainty estimates).
    """

    extrapolation: Extrapolation
    uncertainty: UncertaintyResult | None = None
    open_water: OpenWaterScaling | None = None
    plan_notes: tuple[str, ...] = ()
    self_propulsion: SelfPropulsionAnalysis | None = None
    power: PowerPrediction | None = None
    propulsion_uncertainty: PropulsionUncertainty | None = None
    chain: ChainInputs | None = None

    @property
    def results(self):
        """The summary table of the extrapolation (ship speed, Fn, C_TS, R_TS, P_E), a
        DataFrame with units in the headers."""
        return self.extrapolation.results

    @property
    def propulsion_factors(self):
        """The self-propulsion points: per speed J, w_TM, t, η_R, η_0, η_H, η_D (a DataFrame
        with units in the headers); None without self-propulsion runs."""
        return None if self.self_propulsion is None else self.self_propulsion.points

    @property
    def speed_power(self):
        """Ship speed [kn], P_E, P_D, P_S, P_B [kW] and rate of revolution [rpm] by speed (a
        DataFrame); None without self-propulsion runs."""
        return None if self.power is None else self.power.speed_power

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
        if self.self_propulsion is not None:
            sp = self.self_propulsion
            data["self_propulsion"] = {"notes": list(sp.notes),
                                       "runs": sp.table.to_dict(orient="records"),
                                       "points": sp.points.to_dict(orient="records")}
        if self.power is not None:
            data["full_scale"] = {"notes": list(self.power.notes),
                                  "table": self.power.table.to_dict(orient="records"),
                                  "speed_power": self.power.speed_power.to_dict(
                                      orient="records"),
                                  "contract_speed": self.power.contract}
        if self.propulsion_uncertainty is not None:
            pu = self.propulsion_uncertainty
            data["propulsion_uncertainty"] = {"method": pu.method,
                                              "table": pu.table.to_dict(orient="records")}
        return plain(data)

    def to_excel(self, path: str | Path, overwrite: bool = False, paper: str = "A4") -> Path:
        """Write the results workbook (a notebook convenience for
        :func:`similitude.report.results_workbook.write_results`); returns the Path.

        An existing file is not replaced unless ``overwrite`` is True; ``paper`` is the paper
        size the sheets print on (``"A4"`` or ``"letter"``).
        """
        from similitude.report.results_workbook import write_results

        return write_results(path, self.extrapolation, uncertainty=self.uncertainty,
                             open_water=self.open_water, overwrite=overwrite, paper=paper,
                             prediction=self)


def predict(runs: ResistanceRuns, ship: ShipParticulars,
            options: ExtrapolationOptions | None = None, *,
            open_water_runs: OpenWaterRuns | None = None,
            propeller: PropellerParticulars | None = None,
            uncertainty: MeasurementUncertainty | None = None,
            planned: PlannedRuns | None = None,
            self_propulsion_runs: SelfPropulsionRuns | None = None,
            propulsion: PropulsionOptions | None = None,
            stock_open_water_runs: OpenWaterRuns | None = None,
            stock_diameter: float | None = None,
            monte_carlo: int | None = None, seed: int = DEFAULT_SEED,
            reynolds_chord: float | None = None) -> Prediction:
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
        Measured open-water runs of the (design) model propeller; scaled to full scale with
        ``propeller``.
    propeller : PropellerParticulars, optional
        The full-scale propeller at 0.75 R; required with ``open_water_runs``.
    uncertainty : MeasurementUncertainty, optional
        Standard uncertainties of the measured inputs; propagated to C_TS and P_E, and with
        self-propulsion runs to P_D and n_S.
    planned : PlannedRuns, optional
        The runs of the test plan (:meth:`PlannedRuns.from_plan`); measured model speeds far
        from the planned ones draw a note (runs compared by their ``id_kind``: the plan's ids
        run by run, the facility's by speed, free or numbered runs not at all).
    self_propulsion_runs : SelfPropulsionRuns, optional
        Measured self-propulsion runs (:func:`similitude.readers.measured.
        read_self_propulsion_runs`); need ``open_water_runs`` and ``propeller``.
    propulsion : PropulsionOptions, optional
        Choices of the self-propulsion analysis and full-scale prediction (identity, rudder
        allowance, number of propellers, trial correction, efficiencies, contract speed).
    stock_open_water_runs : OpenWaterRuns, optional
        Open-water runs of a stock propeller used in the self-propulsion test instead of the
        design propeller (ITTC-1978 extension): the test is analysed on it, the full-scale
        prediction made with the design propeller.
    stock_diameter : float, optional
        The stock propeller's model diameter [m]; required with ``stock_open_water_runs``.
    monte_carlo : int, optional
        Also estimate the uncertainties (P_E, and P_D and n_S with self-propulsion runs) by
        Monte Carlo with this many samples (needs ``uncertainty``).
    seed : int
        Seed of the Monte Carlo samples.
    reynolds_chord : float, optional
        Model chord Reynolds number at 0.75 R for the open-water scale correction, one value
        for all runs (default: from each run's rate and temperature).

    Returns
    -------
    Prediction

    Raises
    ------
    InputError
        ``open_water_runs`` without ``propeller`` or the reverse, self-propulsion runs without
        them, a stock propeller without its diameter, Monte Carlo without uncertainties, and
        every input error of the steps (one line naming the field, the value and what was
        expected).

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 "1978 ITTC Performance Prediction Method", Rev 04 (2017).
    .. [2] JCGM 100:2008 (ISO GUM), §5.1.2; JCGM 101:2008 (Monte Carlo).
    """
    if (open_water_runs is None) != (propeller is None):
        raise InputError("open_water_runs and propeller: give both (the measured runs and the "
                         "full-scale propeller) or neither")
    if self_propulsion_runs is not None and open_water_runs is None:
        raise InputError("self_propulsion_runs: need open_water_runs and propeller (the "
                         "propeller's open-water test and its full-scale particulars)")
    if (stock_open_water_runs is None) != (stock_diameter is None):
        raise InputError("stock_open_water_runs and stock_diameter: give both (the stock "
                         "propeller's open-water runs and its model diameter) or neither")
    if monte_carlo is not None and uncertainty is None:
        raise InputError("monte_carlo: needs uncertainty (the measurement uncertainties)")
    extrapolation = extrapolate(runs, ship, options)
    plan_notes = () if planned is None else _plan_notes(
        [runs] + ([] if self_propulsion_runs is None else [self_propulsion_runs]), ship,
        planned)
    open_water = (None if open_water_runs is None
                  else scale_open_water(open_water_runs, propeller, reynolds_chord))
    propagated = None if uncertainty is None else propagate(extrapolation, uncertainty,
                                                            monte_carlo, seed)
    if self_propulsion_runs is None:
        return Prediction(extrapolation, propagated, open_water, plan_notes)
    chain = _chain_inputs(extrapolation, self_propulsion_runs, open_water_runs, open_water,
                          propeller, propulsion or PropulsionOptions(), stock_open_water_runs,
                          stock_diameter)
    result = nominal_chain(chain)
    test_curve, ship_curve = result["curves"]
    analysis = analysis_result(self_propulsion_runs, result["analysis"], test_curve,
                               chain.setup)
    power = power_result(result["power"], result["analysis"]["points"], ship_curve,
                         chain.setup)
    spread = None if uncertainty is None else propulsion_uncertainty(
        chain, uncertainty, monte_carlo, seed)
    return Prediction(extrapolation, propagated, open_water, plan_notes, analysis, power,
                      spread, chain)


def _chain_inputs(extrapolation: Extrapolation, sp: SelfPropulsionRuns, ow: OpenWaterRuns,
                  scaled: OpenWaterScaling, propeller: PropellerParticulars,
                  options: PropulsionOptions, stock: OpenWaterRuns | None,
                  stock_diameter: float | None) -> ChainInputs:
    """The chain's fixed parts: the open-water fits and the grouping of the runs."""
    t = scaled.table
    curves = PropellerCurves.build(
        ow.advance_ratio, ow.thrust_coefficient, ow.torque_coefficient,
        t["K_T ship [-]"].to_numpy(float), t["K_Q ship [-]"].to_numpy(float),
        options.open_water_degree, None if stock is None else stock.advance_ratio,
        ow.source or "open-water runs", "" if stock is None else (stock.source or
                                                                  "stock propeller"))
    d_model = propeller.model_diameter if stock is None else float(stock_diameter)
    setup = PropulsionSetup.build(sp, np.asarray(extrapolation.arrays["froude"]),
                                  extrapolation.ship, extrapolation.options, options, d_model,
                                  propeller.diameter)
    return ChainInputs(extrapolation, sp, ow, stock, curves, setup)


def _plan_notes(measured: list, ship: ShipParticulars,
                planned: PlannedRuns) -> tuple[str, ...]:
    """Notes where measured runs and the plan disagree (by run id, or by speed for facility
    ids; free and numbered runs are not compared), and then whether the scale used is not the
    plan's (the likely cause)."""
    notes = [n for runs in measured
             for n in planned_speed_notes(runs, planned.run, planned.model_speed)]
    if notes and abs(ship.scale / planned.scale - 1.0) > SCALE_TOLERANCE:
        notes.append(f"the scale used ({format_scale(ship.scale)}) is not the plan's "
                     f"({format_scale(planned.scale)})")
    return tuple(notes)


__all__ = ["Prediction", "predict"]

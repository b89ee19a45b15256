"""``similitude extrapolate MEASURED.csv --case CASE.toml``: measured model data to full scale.

Reads the measured resistance runs (CSV or xlsx, units in the headers), takes the ship from the
case file and the scale from the case or its plan, runs :func:`similitude.prediction.predict.
predict` (the ITTC-1978 extrapolation, as revised in ITTC 7.5-02-03-01.4 Rev 04, 2017, unless
told otherwise; open water, the self-propulsion analysis with the full-scale speed-power-rpm
prediction, and the uncertainties when asked), prints a summary or JSON and, with ``-o``,
writes the results workbook. Nothing is written when anything fails, and no existing file is
replaced without ``--force``.

Every option of the API's option classes has a command-line option (:data:`OPTION_FLAGS`).
"""

from __future__ import annotations

import argparse
from dataclasses import replace
from pathlib import Path

from similitude.commands.common import add_paper_option
from similitude.commands.prediction_summary import summary
from similitude.correlations.friction import FRICTION_LINES
from similitude.correlations.ittc78 import (
    AIR_RESISTANCE_METHODS,
    CORRELATION_METHODS,
    ROUGHNESS_METHODS,
)
from similitude.correlations.propulsion import FRICTION_CORRECTION_FORMS, IDENTITIES
from similitude.errors import InputError
from similitude.plain_data import to_json
from similitude.planning.case import Case
from similitude.planning.planner import plan as make_plan
from similitude.prediction.extrapolation import (
    METHODS,
    ExtrapolationOptions,
    ShipParticulars,
    TankParticulars,
    case_scale,
)
from similitude.prediction.open_water import PropellerParticulars
from similitude.prediction.predict import predict
from similitude.prediction.runs import RUN_ID_KINDS, OpenWaterRuns, PlannedRuns
from similitude.prediction.self_propulsion import (
    LOAD_VARYING_DEDUCTIONS,
    TRIAL_METHODS,
    PropulsionOptions,
)
from similitude.prediction.uncertainty import DEFAULT_SEED, MeasurementUncertainty
from similitude.readers.case_file import load_case
from similitude.readers.measured import (
    read_open_water_runs,
    read_resistance_runs,
    read_self_propulsion_runs,
)
from similitude.report.atomic import check_target
from similitude.report.results_workbook import write_results
from similitude.units import parse_scale, to_si

#: Each field of the API's option and data classes, and where the command line sets it (an
#: option, or ``--case`` for what the case file gives). ``tests/commands`` checks that every
#: field is listed and every option exists.
OPTION_FLAGS = {
    "ExtrapolationOptions": {
        "method": "--method", "form_factor": "--form-factor", "froude_range": "--froude-range",
        "prohaska_exponent": "--prohaska-exponent", "roughness_method": "--roughness-method",
        "correlation_method": "--correlation-method",
        "correlation_allowance": "--correlation-allowance", "air_method": "--air-method",
        "air_drag_coefficient": "--air-drag-coefficient", "friction_line": "--friction-line",
        "standard_temperature": "--standard-temperature", "blockage": "--blockage",
        "tank": "--blockage"},
    "ShipParticulars": {
        "length": "--case", "wetted_surface": "--case", "scale": "--scale",
        "transverse_area": "--case", "bilge_keel_area": "--case", "midship_area": "--case",
        "beam": "--case", "water_temperature": "--case", "salinity": "--case",
        "air_density": "--air-density", "hull_roughness": "--hull-roughness", "name": "--case"},
    "PropellerParticulars": {
        "diameter": "--propeller", "scale": "--scale", "pitch_diameter": "--propeller",
        "chord_diameter": "--propeller", "blades": "--propeller",
        "thickness_chord": "--propeller", "blade_roughness": "--propeller"},
    "PropulsionOptions": {
        "identity": "--identity", "propellers": "--propellers",
        "rudder_allowance": "--rudder-allowance", "trial_method": "--trial-method",
        "power_factor": "--cp", "rate_factor": "--cn", "friction_correction": "--dcfc",
        "wake_correction": "--dwc", "shaft_efficiency": "--shaft-efficiency",
        "gearbox_efficiency": "--gearbox-efficiency", "contract_speed": "--contract-speed",
        "friction_correction_form": "--friction-correction-form",
        "load_varying_deduction": "--load-varying-deduction",
        "speed_tolerance": "--speed-tolerance", "open_water_degree": "--open-water-degree"},
    "MeasurementUncertainty": {
        "speed": "--speed-uncertainty", "resistance": "--resistance-uncertainty",
        "resistance_relative": "--resistance-uncertainty",
        "temperature": "--temperature-uncertainty",
        "form_factor": "--form-factor-uncertainty",
        "rotation_rate": "--rotation-rate-uncertainty",
        "rotation_rate_relative": "--rotation-rate-uncertainty",
        "thrust": "--thrust-uncertainty", "thrust_relative": "--thrust-uncertainty",
        "torque": "--torque-uncertainty", "torque_relative": "--torque-uncertainty",
        "tow_force": "--tow-force-uncertainty",
        "open_water_thrust": "--open-water-thrust-uncertainty",
        "open_water_torque": "--open-water-torque-uncertainty"},
    "predict": {
        "runs": "MEASURED.csv", "ship": "--case", "options": "--method",
        "open_water_runs": "--open-water", "propeller": "--propeller",
        "uncertainty": "--speed-uncertainty", "planned": "--case",
        "self_propulsion_runs": "--self-propulsion", "propulsion": "--identity",
        "stock_open_water_runs": "--stock-open-water", "stock_diameter": "--stock-diameter",
        "monte_carlo": "--monte-carlo", "seed": "--seed", "reynolds_chord": "--reynolds-chord"},
    "read_resistance_runs": {"path": "MEASURED.csv", "temperature": "--temperature",
                             "plan_runs": "--case", "sheet": "MEASURED.csv",
                             "run_ids": "--run-ids"},
}


def add_parser(sub) -> argparse.ArgumentParser:
    """Register the ``extrapolate`` command."""
    p = sub.add_parser(
        "extrapolate",
        help="extrapolate measured model tests to full scale (resistance, self-propulsion)",
        description="Read measured model resistance runs (CSV or xlsx; units in the column "
        "headers, e.g. 'model speed [m/s]', 'total resistance [N]', 'water temperature "
        "[degC]'), extrapolate them to the ship of the case file with the ITTC-1978 method "
        "and print (or write) the full-scale resistance and effective power; with the "
        "propeller's open-water runs and a self-propulsion test, also the propulsion factors "
        "and the full-scale speed, power and rate of revolution. Estimates only: defer to the "
        "facility's correlation practice, the ITTC procedures and licensed practice.",
    )
    p.add_argument("measured", metavar="MEASURED.csv", help="measured resistance runs "
                   "(.csv or .xlsx)")
    p.add_argument("--case", required=True, metavar="CASE.toml", help="the case file")
    p.add_argument("-o", "--output", metavar="RESULTS.xlsx", help="write the workbook here")
    p.add_argument("--force", action="store_true", help="replace an existing output file")
    p.add_argument("--json", action="store_true", help="print the results as JSON")
    p.add_argument("--temperature", metavar="T",
                   help="one water temperature for all runs without a temperature column, "
                   "e.g. '15.4 degC'")
    p.add_argument("--run-ids", choices=RUN_ID_KINDS[:3], default="plan",
                   help="the run ids of the file of the case's test (the resistance runs of a "
                   "resistance case, the self-propulsion runs of a self-propulsion case): "
                   "plan (the plan's run numbers, checked; default), facility (the facility's "
                   "own numbers, matched to the plan by speed) or free (not matched); rows "
                   "without an id are never compared with the plan")
    _resistance_options(p.add_argument_group("resistance extrapolation"))
    _propulsion_options(p.add_argument_group("open water and self-propulsion"))
    _uncertainty_options(p.add_argument_group("measurement uncertainties (standard, k = 1)"))
    add_paper_option(p)
    p.set_defaults(func=run)
    return p


def _resistance_options(g) -> None:
    g.add_argument("--scale", metavar="LAMBDA",
                   help="model scale, e.g. '1:22' (default: the case's, else its plan's)")
    g.add_argument("--method", choices=METHODS, default="ittc1978",
                   help="ittc1978 (form factor) or froude (1+k = 1); default ittc1978")
    g.add_argument("--form-factor", type=float, metavar="K",
                   help="use this form factor k instead of Prohaska's fit")
    g.add_argument("--froude-range", nargs=2, type=float, metavar=("LOW", "HIGH"),
                   default=(0.1, 0.2), help="Froude range of Prohaska's fit (default 0.1 0.2)")
    g.add_argument("--prohaska-exponent", type=float, default=4.0, metavar="N",
                   help="exponent n on Fn in Prohaska's fit (default 4; 4 to 6 in use)")
    g.add_argument("--roughness-method", choices=ROUGHNESS_METHODS, default="townsin",
                   help="roughness allowance: bowden_davison (1978) or townsin (revised; "
                   "default)")
    g.add_argument("--correlation-method", choices=CORRELATION_METHODS,
                   help="correlation allowance (default: ittc2017 with townsin, none with "
                   "bowden_davison)")
    g.add_argument("--correlation-allowance", type=float, metavar="C_A",
                   help="the facility's own correlation allowance C_A")
    g.add_argument("--air-method", choices=AIR_RESISTANCE_METHODS, default="revised",
                   help="air resistance formula (default revised)")
    g.add_argument("--air-drag-coefficient", type=float, default=0.8, metavar="C_DA",
                   help="air drag coefficient of the revised formula (default 0.8; 0.5 to 1)")
    g.add_argument("--air-density", metavar="RHO_A",
                   help="air density for the air resistance, e.g. '1.2 kg/m^3' (default "
                   "1.225 kg/m^3)")
    g.add_argument("--friction-line", choices=FRICTION_LINES, default="ittc1957",
                   help="friction line (the ITTC method uses ittc1957, the default)")
    g.add_argument("--standard-temperature", metavar="T", default="15 degC",
                   help="temperature the model C_TM is corrected to (default 15 degC)")
    g.add_argument("--hull-roughness", metavar="K_S", help="hull roughness, default '150 um'")
    g.add_argument("--blockage", choices=("schuster", "tamura"),
                   help="correct the model speed for tank blockage (tank from the case)")


def _propulsion_options(g) -> None:
    g.add_argument("--open-water", metavar="OPEN_WATER.csv",
                   help="propeller open-water runs (J, K_T, K_Q or speed, rate, thrust, "
                   "torque), scaled with the ITTC-1978 blade-drag correction")
    g.add_argument("--propeller", metavar="PARTICULARS",
                   help="full-scale propeller for --open-water: 'diameter=4.2 m; "
                   "pitch_ratio=1.0; chord_ratio=0.3; blades=4; thickness_ratio=0.04' "
                   "(optional 'roughness=30 um')")
    g.add_argument("--reynolds-chord", type=float, metavar="RE",
                   help="model chord Reynolds number at 0.75 R for the open-water correction "
                   "(default: from each run's rate and temperature)")
    g.add_argument("--self-propulsion", metavar="SELF_PROPULSION.csv",
                   help="self-propulsion runs (model speed, rotation rate, thrust, torque, tow "
                   "force, water temperature); needs --open-water and --propeller")
    g.add_argument("--identity", choices=IDENTITIES, default="thrust",
                   help="thrust (default) or torque identity")
    g.add_argument("--propellers", type=int, default=1, metavar="N",
                   help="number of propellers (2: twin screw; thrust and torque in the file "
                   "are per propeller)")
    g.add_argument("--rudder-allowance", type=float, default=0.04, metavar="DW",
                   help="rudder allowance of the full-scale wake (default 0.04; 0 without a "
                   "rudder behind the propeller)")
    g.add_argument("--trial-method", choices=TRIAL_METHODS, default="cp_cn",
                   help="trial correction: cp_cn (P_DT = C_P P_DS, n_T = C_N n_S; default) "
                   "or dcfc_dwc (dC_FC and dw_C in the propeller loading)")
    g.add_argument("--cp", type=float, default=1.0, metavar="C_P",
                   help="power correlation factor C_P (default 1)")
    g.add_argument("--cn", type=float, default=1.0, metavar="C_N",
                   help="rate correlation factor C_N (default 1)")
    g.add_argument("--dcfc", type=float, default=0.0, metavar="DC_FC",
                   help="friction correction dC_FC of the dcfc_dwc method (default 0)")
    g.add_argument("--dwc", type=float, default=0.0, metavar="DW_C",
                   help="wake correction dw_C of the dcfc_dwc method (default 0)")
    g.add_argument("--shaft-efficiency", type=float, default=1.0, metavar="ETA_S",
                   help="shaft transmission efficiency P_D/P_S (default 1)")
    g.add_argument("--gearbox-efficiency", type=float, default=1.0, metavar="ETA_G",
                   help="gearbox efficiency P_S/P_B (default 1: direct drive)")
    g.add_argument("--contract-speed", metavar="V",
                   help="ship speed of the summary's contract figures, e.g. '16 kn' (default: "
                   "the case's highest operating speed)")
    g.add_argument("--friction-correction-form", choices=FRICTION_CORRECTION_FORMS,
                   default="revised", help="form of the ship-point F_D of load-varying "
                   "points (default revised)")
    g.add_argument("--load-varying-deduction", choices=LOAD_VARYING_DEDUCTIONS,
                   default="resistance", help="t at a load-varying point: from the "
                   "resistance (default) or from the slope dT/dF")
    g.add_argument("--speed-tolerance", type=float, default=0.005, metavar="FRACTION",
                   help="runs within this fraction in speed are one speed (default 0.005)")
    g.add_argument("--open-water-degree", type=int, default=3, metavar="DEGREE",
                   help="degree of the polynomials fairing the open-water points (default 3)")
    g.add_argument("--stock-open-water", metavar="STOCK.csv",
                   help="open-water runs of a stock propeller used in the self-propulsion "
                   "test (the prediction uses the design propeller of --open-water)")
    g.add_argument("--stock-diameter", metavar="D",
                   help="model diameter of the stock propeller, e.g. '0.19 m'")


def _uncertainty_options(g) -> None:
    for flag, example in (
        ("--speed-uncertainty", "'2 mm/s'"), ("--resistance-uncertainty", "'0.05 N' or "
                                              "'0.5 %%'"),
        ("--temperature-uncertainty", "'0.1 K'"),
        ("--form-factor-uncertainty", "'0.01' (default: k re-fitted from the runs)"),
        ("--rotation-rate-uncertainty", "'0.1 rpm' or '0.05 %%'"),
        ("--thrust-uncertainty", "'0.05 N' or '0.3 %%'"),
        ("--torque-uncertainty", "'0.002 N*m' or '0.3 %%'"),
        ("--tow-force-uncertainty", "'0.01 N'"),
        ("--open-water-thrust-uncertainty", "'0.5 %%' of K_T"),
        ("--open-water-torque-uncertainty", "'0.5 %%' of K_Q"),
    ):
        g.add_argument(flag, metavar="U", help=f"e.g. {example}")
    g.add_argument("--monte-carlo", type=int, metavar="SAMPLES",
                   help="also a Monte Carlo estimate with this many samples (e.g. 10000)")
    g.add_argument("--seed", type=int, default=DEFAULT_SEED,
                   help="seed of the Monte Carlo samples (default %(default)s)")


def run(args) -> int:
    """Run ``similitude extrapolate``; returns the exit code."""
    if args.output:
        if Path(args.output).suffix.lower() != ".xlsx":
            raise InputError(f"-o: {args.output!r} does not end in .xlsx; expected a workbook "
                             "path such as results.xlsx")
        check_target(args.output, args.force)
    case = load_case(args.case)
    given_scale = parse_scale(args.scale, "--scale") if args.scale else None
    plan = make_plan(case)
    planned = PlannedRuns.from_plan(plan)
    ship = _ship(args, case, given_scale, plan.scale)
    options = _options(args, case)
    # The runs of the case's own test are compared with its plan; the resistance runs of a
    # self-propulsion case come from an earlier test and are not.
    own = "plan" if case.test != "self_propulsion" else "free"
    runs = read_resistance_runs(args.measured, temperature=args.temperature,
                                plan_runs=planned.run,
                                run_ids=args.run_ids if own == "plan" else "free")
    propeller, open_water_runs = _open_water(args, ship.scale)
    prediction = predict(runs, ship, options, open_water_runs=open_water_runs,
                         propeller=propeller, uncertainty=_uncertainty(args), planned=planned,
                         **_self_propulsion(args, case, planned),
                         reynolds_chord=args.reynolds_chord)
    written = None
    if args.output:
        written = write_results(args.output, prediction.extrapolation,
                                uncertainty=prediction.uncertainty,
                                open_water=prediction.open_water, overwrite=args.force,
                                paper=args.paper, prediction=prediction)
    if args.json:
        data = prediction.to_dict()
        if written is not None:
            data["written"] = str(written)
        print(to_json(data))
    else:
        print(summary(prediction))
        if written is not None:
            print(f"wrote {written}")
    return 0


def _ship(args, case: Case, given_scale: float | None, plan_scale: float) -> ShipParticulars:
    """The ship of the case at the scale given, else the case's, else the plan's."""
    scale = given_scale
    if scale is None:
        fixed = case_scale(case)
        scale = fixed if fixed is not None else float(plan_scale)
    ship = ShipParticulars.from_case(case, scale)
    if args.hull_roughness:
        ship = replace(ship, hull_roughness=to_si(args.hull_roughness, "[length]",
                                                  "--hull-roughness"))
    if args.air_density:
        ship = replace(ship, air_density=to_si(args.air_density, "[mass] / [length] ** 3",
                                               "--air-density"))
    return ship


def _options(args, case: Case) -> ExtrapolationOptions:
    tank = None
    if args.blockage:
        tank = TankParticulars(case.facility.width, case.facility.depth)
    return ExtrapolationOptions(
        method=args.method, form_factor=args.form_factor,
        froude_range=tuple(args.froude_range), prohaska_exponent=args.prohaska_exponent,
        roughness_method=args.roughness_method, correlation_method=args.correlation_method,
        correlation_allowance=args.correlation_allowance, air_method=args.air_method,
        air_drag_coefficient=args.air_drag_coefficient, friction_line=args.friction_line,
        standard_temperature=to_si(args.standard_temperature, "[temperature]",
                                   "--standard-temperature"),
        blockage=args.blockage, tank=tank)


def _open_water(args, scale: float) -> tuple[PropellerParticulars | None, OpenWaterRuns | None]:
    """The full-scale propeller and the measured open-water runs, or (None, None) without
    --open-water."""
    if not args.open_water and not args.propeller:
        return None, None
    if not (args.open_water and args.propeller):
        raise InputError("--open-water and --propeller: give both (the runs and the full-scale "
                         "propeller) or neither")
    propeller = PropellerParticulars.from_text(args.propeller, scale)
    # Thrust and torque, if given, are reduced with fresh tank water at the run temperature
    # (from the file, or --temperature for all runs).
    runs = read_open_water_runs(args.open_water, diameter=propeller.model_diameter,
                                temperature=args.temperature)
    return propeller, runs


def _self_propulsion(args, case: Case, planned: PlannedRuns) -> dict:
    """predict()'s self-propulsion arguments from the command line (empty without
    --self-propulsion)."""
    if args.stock_open_water and not args.self_propulsion:
        raise InputError("--stock-open-water: given without --self-propulsion; expected it "
                         "only with a self-propulsion test")
    if not args.self_propulsion:
        return {}
    if not args.open_water:
        raise InputError("--self-propulsion: needs --open-water and --propeller (the "
                         "propeller's open-water runs and its full-scale particulars)")
    contract = (to_si(args.contract_speed, "[length] / [time]", "--contract-speed")
                if args.contract_speed else max(case.prototype.speeds))
    options = PropulsionOptions(
        identity=args.identity, propellers=args.propellers,
        rudder_allowance=args.rudder_allowance, trial_method=args.trial_method,
        power_factor=args.cp, rate_factor=args.cn, friction_correction=args.dcfc,
        wake_correction=args.dwc, shaft_efficiency=args.shaft_efficiency,
        gearbox_efficiency=args.gearbox_efficiency, contract_speed=contract,
        friction_correction_form=args.friction_correction_form,
        load_varying_deduction=args.load_varying_deduction,
        speed_tolerance=args.speed_tolerance, open_water_degree=args.open_water_degree)
    runs = read_self_propulsion_runs(
        args.self_propulsion, temperature=args.temperature, plan_runs=planned.run,
        run_ids=args.run_ids if case.test == "self_propulsion" else "free")
    out = {"self_propulsion_runs": runs,
           "propulsion": options, "monte_carlo": args.monte_carlo, "seed": args.seed}
    if args.stock_open_water or args.stock_diameter:
        if not (args.stock_open_water and args.stock_diameter):
            raise InputError("--stock-open-water and --stock-diameter: give both (the stock "
                             "propeller's runs and its model diameter) or neither")
        d = to_si(args.stock_diameter, "[length]", "--stock-diameter")
        out["stock_open_water_runs"] = read_open_water_runs(
            args.stock_open_water, diameter=d, temperature=args.temperature)
        out["stock_diameter"] = d
    return out


def _uncertainty(args) -> MeasurementUncertainty | None:
    """The standard uncertainties given on the command line, or None when none is."""
    given = {"speed": args.speed_uncertainty, "resistance": args.resistance_uncertainty,
             "temperature": args.temperature_uncertainty,
             "form_factor": args.form_factor_uncertainty,
             "rotation_rate": args.rotation_rate_uncertainty,
             "thrust": args.thrust_uncertainty, "torque": args.torque_uncertainty,
             "tow_force": args.tow_force_uncertainty,
             "open_water_thrust": args.open_water_thrust_uncertainty,
             "open_water_torque": args.open_water_torque_uncertainty}
    if all(g is None for g in given.values()):
        if args.monte_carlo is not None:
            raise InputError("--monte-carlo: needs the measurement uncertainties (e.g. "
                             "--speed-uncertainty, --thrust-uncertainty)")
        return None
    return MeasurementUncertainty.from_quantities(**given)

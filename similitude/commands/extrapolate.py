"""``similitude extrapolate MEASURED.csv --case CASE.toml``: measured model data to full scale.

Reads the measured resistance runs (CSV or xlsx, units in the headers), takes the ship from the
case file and the scale from the case or its plan, runs :func:`similitude.prediction.predict.
predict` (the ITTC-1978 extrapolation, as revised in ITTC 7.5-02-03-01.4 Rev 04, 2017, unless
told otherwise; open water and uncertainty when asked), prints a summary or JSON and, with
``-o``, writes the results workbook. Nothing is written when anything fails, and no existing
file is replaced without ``--force``.
"""

from __future__ import annotations

import argparse
from dataclasses import replace
from pathlib import Path

from similitude.commands.common import add_paper_option
from similitude.correlations.ittc78 import (
    AIR_RESISTANCE_METHODS,
    CORRELATION_METHODS,
    ROUGHNESS_METHODS,
)
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
from similitude.prediction.open_water import OpenWaterScaling, PropellerParticulars
from similitude.prediction.predict import Prediction, predict
from similitude.prediction.runs import OpenWaterRuns, PlannedRuns
from similitude.prediction.uncertainty import MeasurementUncertainty
from similitude.readers.case_file import load_case
from similitude.readers.measured import read_open_water_runs, read_resistance_runs
from similitude.report.atomic import check_target
from similitude.report.results_workbook import write_results
from similitude.units import format_scale, parse_scale, to_si


def add_parser(sub) -> argparse.ArgumentParser:
    """Register the ``extrapolate`` command."""
    p = sub.add_parser(
        "extrapolate",
        help="extrapolate measured model resistance to full scale",
        description="Read measured model resistance runs (CSV or xlsx; units in the column "
        "headers, e.g. 'model speed [m/s]', 'total resistance [N]', 'water temperature "
        "[degC]'), extrapolate them to the ship of the case file with the ITTC-1978 method "
        "and print (or write) the full-scale resistance and effective power. Estimates only: "
        "defer to the facility's correlation practice, the ITTC procedures and licensed "
        "practice.",
    )
    p.add_argument("measured", metavar="MEASURED.csv", help="measured runs (.csv or .xlsx)")
    p.add_argument("--case", required=True, metavar="CASE.toml", help="the case file")
    p.add_argument("-o", "--output", metavar="RESULTS.xlsx", help="write the workbook here")
    p.add_argument("--force", action="store_true", help="replace an existing output file")
    p.add_argument("--json", action="store_true", help="print the results as JSON")
    p.add_argument("--scale", metavar="LAMBDA",
                   help="model scale, e.g. '1:22' (default: the case's, else its plan's)")
    p.add_argument("--method", choices=METHODS, default="ittc1978",
                   help="ittc1978 (form factor) or froude (1+k = 1); default ittc1978")
    p.add_argument("--form-factor", type=float, metavar="K",
                   help="use this form factor k instead of Prohaska's fit")
    p.add_argument("--froude-range", nargs=2, type=float, metavar=("LOW", "HIGH"),
                   default=(0.1, 0.2), help="Froude range of Prohaska's fit (default 0.1 0.2)")
    p.add_argument("--roughness-method", choices=ROUGHNESS_METHODS, default="townsin",
                   help="roughness allowance: bowden_davison (1978) or townsin (revised; "
                   "default)")
    p.add_argument("--correlation-method", choices=CORRELATION_METHODS,
                   help="correlation allowance (default: ittc2017 with townsin, none with "
                   "bowden_davison)")
    p.add_argument("--correlation-allowance", type=float, metavar="C_A",
                   help="the facility's own correlation allowance C_A")
    p.add_argument("--air-method", choices=AIR_RESISTANCE_METHODS, default="revised",
                   help="air resistance formula (default revised)")
    p.add_argument("--hull-roughness", metavar="K_S", help="hull roughness, default '150 um'")
    p.add_argument("--blockage", choices=("schuster", "tamura"),
                   help="correct the model speed for tank blockage (tank from the case)")
    p.add_argument("--temperature", metavar="T",
                   help="one water temperature for all runs, e.g. '15.4 degC'")
    p.add_argument("--speed-uncertainty", metavar="U", help="standard uncertainty of the "
                   "model speed, e.g. '2 mm/s'")
    p.add_argument("--resistance-uncertainty", metavar="U", help="standard uncertainty of "
                   "the resistance, e.g. '0.05 N' or '0.5 %%'")
    p.add_argument("--temperature-uncertainty", metavar="U",
                   help="standard uncertainty of the water temperature, e.g. '0.1 K'")
    p.add_argument("--form-factor-uncertainty", metavar="U",
                   help="standard uncertainty of k (default: from Prohaska's fit)")
    p.add_argument("--open-water", metavar="OPEN_WATER.csv",
                   help="also scale propeller open-water runs (J, K_T, K_Q or speed, rate, "
                   "thrust, torque) with the ITTC-1978 blade-drag correction")
    p.add_argument("--propeller", metavar="PARTICULARS",
                   help="full-scale propeller for --open-water: 'diameter=4.2 m; "
                   "pitch_ratio=1.0; chord_ratio=0.3; blades=4; thickness_ratio=0.04'")
    add_paper_option(p)
    p.set_defaults(func=run)
    return p


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
    runs = read_resistance_runs(args.measured, temperature=args.temperature,
                                plan_runs=planned.run)
    propeller, open_water_runs = _open_water(args, ship.scale)
    prediction = predict(runs, ship, options, open_water_runs=open_water_runs,
                         propeller=propeller, uncertainty=_uncertainty(args), planned=planned)
    written = None
    if args.output:
        written = write_results(args.output, prediction.extrapolation,
                                uncertainty=prediction.uncertainty,
                                open_water=prediction.open_water, overwrite=args.force,
                                paper=args.paper)
    if args.json:
        data = prediction.to_dict()
        if written is not None:
            data["written"] = str(written)
        print(to_json(data))
    else:
        print(_summary(prediction))
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
    return ship


def _options(args, case: Case) -> ExtrapolationOptions:
    tank = None
    if args.blockage:
        tank = TankParticulars(case.facility.width, case.facility.depth)
    return ExtrapolationOptions(
        method=args.method, form_factor=args.form_factor,
        froude_range=tuple(args.froude_range), roughness_method=args.roughness_method,
        correlation_method=args.correlation_method,
        correlation_allowance=args.correlation_allowance, air_method=args.air_method,
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


def _uncertainty(args) -> MeasurementUncertainty | None:
    """The standard uncertainties given on the command line, or None when none is."""
    given = (args.speed_uncertainty, args.resistance_uncertainty, args.temperature_uncertainty,
             args.form_factor_uncertainty)
    if all(g is None for g in given):
        return None
    return MeasurementUncertainty.from_quantities(*given)


def _summary(prediction: Prediction) -> str:
    e, u = prediction.extrapolation, prediction.uncertainty
    lines = [f"{e.ship.name}: {len(e.runs)} runs from {e.runs.source or 'input'}, scale "
             f"{format_scale(e.ship.scale)}"]
    lines.append(f"  method       {e.options.revision_note}")
    fs = e.fit_summary()
    text = f"k = {e.form_factor:.4f} ({fs['source']}"
    if e.form_factor_fit is not None:
        text += (f", {fs['points used']} runs in Fn {fs['Froude range [-]']}, "
                 f"R^2 = {fs['R^2 [-]']:.4f}")
    lines.append(f"  form factor  {text})")
    lines.append("  ship speed [kn]   C_TS [-]     R_TS [kN]    P_E [kW]"
                 + ("    u(P_E) [kW]" if u is not None else ""))
    for i, row in e.results.iterrows():
        line = (f"  {row['ship speed [kn]']:15.2f}   {row['C_TS [-]']:.5f}   "
                f"{row['R_TS [kN]']:10.1f}   {row['P_E [kW]']:9.1f}")
        if u is not None:
            line += f"   {u.table['u(P_E) combined [kW]'].iloc[i]:10.1f}"
        lines.append(line)
    if u is not None:
        lines.append(f"  uncertainty  {u.method}")
    for note in (*e.notes[1:], *prediction.plan_notes):  # notes[0]: the method line above
        lines.append(f"  note: {note}")
    if prediction.open_water is not None:
        lines.append(_open_water_summary(prediction.open_water))
    return "\n".join(lines)


def _open_water_summary(ow: OpenWaterScaling) -> str:
    t = ow.table
    best = t["eta_0 ship [-]"].idxmax()
    j_best = t["advance ratio J [-]"][best]
    lines = [f"  open water   {len(t)} runs; ITTC-1978 blade-drag correction dC_D = "
             f"{t['dC_D [-]'].mean():.5f}; best eta_0 ship {t['eta_0 ship [-]'][best]:.3f} "
             f"(model {t['eta_0 model [-]'][best]:.3f}) at J = {j_best:.2f}"]
    lines.extend(f"  note: {n}" for n in ow.notes[1:])
    return "\n".join(lines)

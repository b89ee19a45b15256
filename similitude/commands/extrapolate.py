"""``similitude extrapolate MEASURED.csv --case CASE.toml``: measured model data to full scale.

Reads the measured resistance runs (CSV or xlsx, units in the headers), takes the ship from the
case file and the scale from the case or its plan, runs the ITTC-1978 extrapolation (as revised
in ITTC 7.5-02-03-01.4 Rev 04, 2017, unless told otherwise), prints a summary or JSON and, with
``-o``, writes the results workbook. Nothing is written when anything fails, and no existing
file is replaced without ``--force``.
"""

from __future__ import annotations

import argparse
from pathlib import Path
from typing import Any

from similitude.errors import InputError
from similitude.plain_data import to_json
from similitude.units import format_scale


def add_parser(sub) -> argparse.ArgumentParser:
    """Register the ``extrapolate`` command."""
    from similitude.correlations.ittc78 import (
        AIR_RESISTANCE_METHODS,
        CORRELATION_METHODS,
        ROUGHNESS_METHODS,
    )
    from similitude.prediction.extrapolation import METHODS

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
    p.set_defaults(func=run)
    return p


def _plan_or_none(case, need_scale: bool):
    """The plan of the case, or None when the planner is not available and not needed."""
    try:
        from similitude.planning.planner import plan as make_plan
    except ModuleNotFoundError as exc:
        if exc.name != "similitude.planning.planner":
            raise
        if need_scale:
            raise InputError("scale: the case fixes no scale and the planner is not "
                             "available; expected --scale such as '1:22'") from None
        return None
    return make_plan(case)


def _plan_runs(plan) -> list[Any] | None:
    if plan is None:
        return None
    matrix = getattr(plan, "matrix", None)
    if matrix is None or "run" not in getattr(matrix, "columns", ()):
        return None
    return list(matrix["run"])


def _summary(e, u=None) -> str:
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
    table = e.results
    for i, row in table.iterrows():
        line = (f"  {row['ship speed [kn]']:15.2f}   {row['C_TS [-]']:.5f}   "
                f"{row['R_TS [kN]']:10.1f}   {row['P_E [kW]']:9.1f}")
        if u is not None:
            line += f"   {u.table['u(P_E) combined [kW]'].iloc[i]:10.1f}"
        lines.append(line)
    if u is not None:
        lines.append(f"  uncertainty  {u.method}")
    for note in e.notes[1:]:  # the first is the method line above
        lines.append(f"  note: {note}")
    return "\n".join(lines)


def run(args) -> int:
    """Run ``similitude extrapolate``; returns the exit code."""
    from similitude.prediction.extrapolation import (
        ExtrapolationOptions,
        ShipParticulars,
        TankParticulars,
        extrapolate,
    )
    from similitude.prediction.uncertainty import MeasurementUncertainty, propagate
    from similitude.readers.case_file import load_case
    from similitude.readers.measured import read_resistance_runs
    from similitude.report.atomic import check_target
    from similitude.units import parse_scale, to_si

    if args.output:
        if Path(args.output).suffix.lower() != ".xlsx":
            raise InputError(f"-o: {args.output!r} does not end in .xlsx; expected a workbook "
                             "path such as results.xlsx")
        check_target(args.output, args.force)
    case = load_case(args.case)
    scale = parse_scale(args.scale, "--scale") if args.scale else None
    req = case.request
    case_scale = req.scale or (case.prototype.length / req.model_length
                               if req.model_length else None)
    plan = _plan_or_none(case, need_scale=scale is None and case_scale is None)
    if scale is None:
        scale = case_scale if case_scale is not None else float(plan.scale)
    ship = ShipParticulars.from_case(case, scale)
    if args.hull_roughness:
        from dataclasses import replace

        ship = replace(ship, hull_roughness=to_si(args.hull_roughness, "[length]",
                                                  "--hull-roughness"))
    tank = None
    if args.blockage:
        tank = TankParticulars(case.facility.width, case.facility.depth)
    options = ExtrapolationOptions(
        method=args.method, form_factor=args.form_factor,
        froude_range=tuple(args.froude_range), roughness_method=args.roughness_method,
        correlation_method=args.correlation_method,
        correlation_allowance=args.correlation_allowance, air_method=args.air_method,
        blockage=args.blockage, tank=tank)
    runs = read_resistance_runs(args.measured, temperature=args.temperature,
                                plan_runs=_plan_runs(plan))
    e = extrapolate(runs, ship, options)
    plan_notes = _plan_speed_notes(runs, plan, scale)
    ow = _open_water(args, ship.scale)
    u = None
    given = (args.speed_uncertainty, args.resistance_uncertainty, args.temperature_uncertainty,
             args.form_factor_uncertainty)
    if any(g is not None for g in given):
        u = propagate(e, MeasurementUncertainty.from_quantities(*given))
    written = None
    if args.output:
        written = e.to_excel(args.output, overwrite=args.force, uncertainty=u, open_water=ow)
    if args.json:
        data = e.to_dict()
        if u is not None:
            data["uncertainty"] = {"method": u.method,
                                   "table": u.table.to_dict(orient="records")}
        data["plan_notes"] = plan_notes
        if ow is not None:
            data["open_water"] = {"notes": list(ow.notes),
                                  "table": ow.table.to_dict(orient="records")}
        if written is not None:
            data["written"] = str(written)
        print(to_json(data))
    else:
        print(_summary(e, u))
        for note in plan_notes:
            print(f"  note: {note}")
        if ow is not None:
            print(_open_water_summary(ow))
        if written is not None:
            print(f"wrote {written}")
    return 0


def _plan_speed_notes(runs, plan, scale: float) -> list[str]:
    """Notes where measured and planned model speeds of the same run id disagree."""
    from similitude.prediction.runs import planned_speed_notes

    ids = _plan_runs(plan)
    matrix = getattr(plan, "matrix", None)
    if ids is None or "model speed [m/s]" not in matrix.columns:
        return []
    notes = planned_speed_notes(runs, ids, matrix["model speed [m/s]"])
    if notes and abs(scale / float(plan.scale) - 1.0) > 1e-6:
        notes.append(f"the scale used ({format_scale(scale)}) is not the plan's "
                     f"({format_scale(plan.scale)})")
    return notes


def _open_water(args, scale: float):
    """The scaled open-water characteristics, or None without --open-water."""
    if not args.open_water and not args.propeller:
        return None
    if not (args.open_water and args.propeller):
        raise InputError("--open-water and --propeller: give both (the runs and the full-scale "
                         "propeller) or neither")
    from fluids_props.water import fresh_water_si
    from similitude.prediction.open_water import PropellerParticulars, scale_open_water
    from similitude.readers.measured import read_open_water_runs

    prop = PropellerParticulars.from_text(args.propeller, scale)
    # Thrust and torque, if given, are reduced with the tank water at the stated temperature.
    rho = None
    if args.temperature:
        from similitude.units import to_si

        rho = float(fresh_water_si(to_si(args.temperature, "[temperature]",
                                         "--temperature")).density_si)
    runs = read_open_water_runs(args.open_water, diameter=prop.model_diameter, density=rho,
                                temperature=args.temperature)
    return scale_open_water(runs, prop)


def _open_water_summary(ow) -> str:
    t = ow.table
    best = t["eta_0 ship [-]"].idxmax()
    j_best = t["advance ratio J [-]"][best]
    lines = [f"  open water   {len(t)} runs; ITTC-1978 blade-drag correction dC_D = "
             f"{t['dC_D [-]'].mean():.5f}; best eta_0 ship {t['eta_0 ship [-]'][best]:.3f} "
             f"(model {t['eta_0 model [-]'][best]:.3f}) at J = {j_best:.2f}"]
    lines.extend(f"  note: {n}" for n in ow.notes[1:])
    return "\n".join(lines)

"""Workbook of an extrapolation to full scale: inputs, every correction step, results, charts.

Sheets: ``Read me`` (method, revision, cautions, the contract-speed figures), ``Inputs``
(ship, options, measured runs), ``Tank corrections`` (stimulator drag, blockage, temperature
correction), ``Form factor`` (Prohaska's fit and residuals), ``Model scale`` (C_TM, C_FM,
C_R), ``Full scale`` (allowances, C_TS, R_TS, P_E), ``Results``, ``Uncertainty`` and ``Open
water`` when given, the self-propulsion sheets of a self-propulsion test
(:mod:`similitude.report.propulsion_sheets`), and ``Charts`` (C_T and C_F against Froude
number; P_E against ship speed; K_T, K_Q, η_0 against J).

The file is written atomically and never overwrites an existing file unless asked
(:mod:`similitude.report.atomic`).

Every sheet prints with the shared page setup (:func:`similitude.report.sheets.print_setup`):
paper size, repeated header rows, and a page header and footer naming the ship, the sheet, the
page, the program and the date. Measured points are drawn as filled markers; fitted lines only
over the range they were fitted in.

openpyxl and pandas are imported at the top: only the extrapolate command and the notebook's
``to_excel`` load this module, never ``import similitude``.
"""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pandas as pd

from similitude.cautions import PREDICTION_CAUTIONS
from similitude.constants import KNOT
from similitude.report.atomic import OutputSet, check_target, signals_cleanup
from similitude.report.page import PageSetup
from similitude.report.propulsion_sheets import add_propulsion_sheets
from similitude.report.sheets import (
    BOLD,
    TITLE_FONT,
    SafeWorkbook,
    add_series,
    audit_formulas,
    chart_below,
    finish_table,
    fit_row_height,
    print_setup,
    save_workbook,
    scatter_chart,
    set_widths,
    wrap_rows,
    write_frame,
    write_pairs,
)

#: Width [characters] of the value column of the label-value sheets (Read me, Inputs).
TEXT_WIDTH = 90


def build_workbook(extrapolation, uncertainty=None, open_water=None, paper: str = "A4",
                   prediction=None):
    """Build the openpyxl Workbook (not saved).

    Parameters
    ----------
    extrapolation : similitude.prediction.extrapolation.Extrapolation
    uncertainty : similitude.prediction.uncertainty.UncertaintyResult, optional
    open_water : similitude.prediction.open_water.OpenWaterScaling, optional
    paper : str
        Paper size of the page setup: ``"A4"`` (default) or ``"letter"``.
    prediction : similitude.prediction.predict.Prediction, optional
        With a self-propulsion test: its sheets are added
        (:mod:`similitude.report.propulsion_sheets`) and the Read me gives the contract-speed
        figures.

    Returns
    -------
    openpyxl.Workbook
    """
    e = extrapolation
    propulsion = prediction if prediction is not None and prediction.power is not None else None
    page = PageSetup(title=f"Full-scale {'prediction' if propulsion else 'extrapolation'}: "
                     f"{e.ship.name}", paper=paper)
    wb = SafeWorkbook()
    titles = {}
    _readme_sheet(wb.active, e, propulsion)
    titles["Inputs"] = _inputs_sheet(wb.create_sheet("Inputs"), e)
    titles["Tank corrections"] = _table_sheet(wb.create_sheet("Tank corrections"),
                                              _tank_frame(e), _tank_formulas(e))
    titles["Form factor"] = _form_factor_sheet(wb.create_sheet("Form factor"), e)
    titles["Model scale"] = _table_sheet(wb.create_sheet("Model scale"), e.model[
        [c for c in _MODEL_COLUMNS if c in e.model.columns]])
    titles["Full scale"] = _table_sheet(wb.create_sheet("Full scale"), e.full_scale,
                                        _full_scale_formulas(e))
    titles["Results"] = _table_sheet(wb.create_sheet("Results"), e.results)
    if uncertainty is not None:
        titles["Uncertainty"] = _uncertainty_sheet(wb.create_sheet("Uncertainty"), uncertainty)
    if open_water is not None:
        titles["Open water"] = _open_water_sheet(wb.create_sheet("Open water"), open_water)
    if propulsion is not None:
        titles.update(add_propulsion_sheets(wb, propulsion, wb.create_sheet))
    titles["Charts"] = _charts_sheet(wb.create_sheet("Charts"), e)
    for ws in wb.worksheets:
        print_setup(ws, page, titles.get(ws.title), "A:A")
    return wb


def _table_sheet(ws, frame, formulas=None, row: int = 1) -> int:
    """A table (and its audit formulas) with fitted widths and a wrapped header; returns the
    header row (repeated on every printed page)."""
    first, last = write_frame(ws, frame, row)
    if formulas is not None:
        audit_formulas(ws, list(frame.columns), first, last, *formulas)
    ws.freeze_panes = ws.cell(row=first, column=2)
    finish_table(ws, row, last)
    return row


def _readme_sheet(ws, e, propulsion=None) -> None:
    """Method, revision, the data's source (labelled when synthetic), the contract-speed
    figures of a self-propulsion prediction, cautions and notes."""
    ws.title = "Read me"
    ws.cell(row=1, column=1, value="Full-scale prediction from model tests" if propulsion
            else "Full-scale extrapolation of measured model resistance").font = TITLE_FONT
    sources = [e.runs.source or "(built in Python)"]
    if propulsion is not None:
        sources.append(propulsion.self_propulsion.runs.source or "(built in Python)")
    synthetic = any("synthetic" in s.lower() for s in sources)
    pairs = [("ship", e.ship.name), ("measured data", ", ".join(sources)),
             ("method", e.options.revision_note), ("form factor k [-]", e.form_factor)]
    if propulsion is not None:
        pairs += _propulsion_summary(propulsion)
    if synthetic:
        pairs.append(("DATA", "SYNTHETIC: invented 'virtual tank' data, not a real test"))
    row = write_pairs(ws, pairs, 3, "Summary")
    row = write_pairs(ws, [(f"{i + 1}.", text) for i, text in enumerate(PREDICTION_CAUTIONS)],
                      row, "Cautions")
    notes = list(e.notes)
    if propulsion is not None:
        notes += [*propulsion.plan_notes, *propulsion.self_propulsion.notes,
                  *propulsion.power.notes]
    last = write_pairs(ws, [(f"note {i + 1}", n) for i, n in enumerate(notes)], row, "Notes")
    set_widths(ws, {"A": 24, "B": TEXT_WIDTH})
    wrap_rows(ws, range(4, last), (2,))


def _propulsion_summary(p) -> list[tuple[str, object]]:
    """The Read me's self-propulsion lines: method and the contract-speed figures, with the
    uncertainty of P_D and n_S there and the method that gave it."""
    out = [("propulsion method", p.self_propulsion.options.statement)]
    c = p.power.contract
    if c is None:
        return out
    out += [("contract speed [kn]", c["ship speed [kn]"]),
            ("  P_D, delivered [kW]", c["P_D [kW]"]),
            ("  P_B, brake [kW]", c["P_B [kW]"]),
            ("  n, rate [rpm]", c["rate of revolution [rpm]"]),
            ("  P_E, effective [kW]", c["P_E [kW]"])]
    pu = p.propulsion_uncertainty
    if pu is not None:
        t = pu.table
        i = int((t["ship speed [kn]"] - c["ship speed [kn]"]).abs().idxmin())
        which = "Monte Carlo" if pu.samples else "first order"
        col = "u(P_DS) Monte Carlo [kW]" if pu.samples else "u(P_DS) first order [kW]"
        out.append(("  u(P_D) [kW]",
                    f"{t[col].iloc[i]:.4g} at {t['ship speed [kn]'].iloc[i]:.2f} kn ({which}; "
                    "standard, k = 1; see the Propulsion uncertainty sheet)"))
    return out


def _inputs_sheet(ws, e) -> int:
    """The ship, the options and the measured runs; returns the runs' header row."""
    ship = e.ship
    row = write_pairs(ws, [
        ("waterline length L_WL [m]", ship.length),
        ("wetted surface S [m^2]", ship.wetted_surface),
        ("scale lambda [-]", ship.scale),
        ("model length [m]", ship.model_length),
        ("model wetted surface [m^2]", ship.model_wetted_surface),
        ("transverse area above water A_VS [m^2]", ship.transverse_area),
        ("bilge-keel area S_BK [m^2]", ship.bilge_keel_area),
        ("midship area A_X [m^2]", ship.midship_area),
        ("ship water temperature [degC]", ship.water_temperature - 273.15),
        ("ship water salinity [g/kg]", ship.salinity * 1e3),
        ("air density [kg/m^3]", ship.air_density),
        ("hull roughness k_S [um]", ship.hull_roughness * 1e6),
    ], 1, "Ship")
    opt = e.options
    row = write_pairs(ws, [
        ("method", opt.method),
        ("form factor given [-]", opt.form_factor if opt.form_factor is not None else "fitted"),
        ("Prohaska Froude range [-]", opt.froude_range),
        ("Prohaska exponent n [-]", opt.prohaska_exponent),
        ("roughness allowance", opt.roughness_method),
        ("correlation allowance", opt.correlation_allowance
         if opt.correlation_allowance is not None else opt.resolved_correlation_method),
        ("air resistance", opt.air_method),
        ("air drag coefficient C_DA [-]", opt.air_drag_coefficient),
        ("friction line", opt.friction_line),
        ("standard temperature [degC]", opt.standard_temperature - 273.15),
        ("blockage correction", opt.blockage or "none"),
        ("tank width [m]", None if opt.tank is None else opt.tank.width),
        ("tank depth [m]", None if opt.tank is None else opt.tank.depth),
    ], row, "Options")
    ws.cell(row=row, column=1, value="Measured runs").font = TITLE_FONT
    _, last = write_frame(ws, e.runs.to_frame(), row + 1)
    finish_table(ws, row + 1, last, (1, row - 1))
    return row + 1


_TANK_COLUMNS = ("run", "carriage speed [m/s]", "measured resistance [N]",
                 "stimulator drag [N]", "resistance used [N]", "blockage ratio m [-]",
                 "depth Froude number [-]", "blockage speed correction dV/V [-]",
                 "model speed [m/s]", "water temperature [degC]", "water density [kg/m^3]",
                 "C_TM at test temperature [-]",
                 "C_FM at test temperature [-]", "C_FM at 15 degC [-]", "C_TM at 15 degC [-]",
                 "R_TM at 15 degC [N]")

_MODEL_COLUMNS = ("run", "model speed [m/s]", "Froude number [-]", "model Reynolds number [-]",
                  "water density [kg/m^3]", "kinematic viscosity [m^2/s]",
                  "C_TM at test temperature [-]", "C_FM at test temperature [-]",
                  "C_TM at 15 degC [-]", "C_FM at 15 degC [-]", "C_R [-]", "sinkage [m]",
                  "trim [deg]")


def _tank_frame(e):
    return e.model[[c for c in _TANK_COLUMNS if c in e.model.columns]]


def _tank_formulas(e):
    """Audit formulas of the tank corrections and the constants they use."""
    # C_TM = R/(½ ρ S_M V²); C_TM,15 = C_TM + (1+k)(C_FM,15 − C_FM) (ITTC 7.5-02-03-01.4)
    return ((
        ("C_TM by formula [-]",
         "{resistance used [N]}/(0.5*{water density [kg/m^3]}*{$model wetted surface [m^2]}"
         "*{model speed [m/s]}^2)"),
        ("C_TM at 15 degC by formula [-]",
         "{@C_TM by formula [-]}+(1+{$form factor k [-]})*({C_FM at 15 degC [-]}"
         "-{C_FM at test temperature [-]})"),
    ), (("model wetted surface [m^2]", e.ship.model_wetted_surface),
        ("form factor k [-]", e.form_factor)))


def _form_factor_sheet(ws, e) -> int:
    """Prohaska's fit: its statistics, every point with its residual, the fitted line over
    the fitted range only, and the plot below; returns the points' header row."""
    row = write_pairs(ws, list(e.fit_summary().items()), 1, "Form factor")
    ws.cell(row=row, column=1, value="Prohaska plot: C_TM/C_FM = (1+k) + y Fn^n/C_FM"
            ).font = TITLE_FONT
    pro = e.prohaska_frame()
    first, last = write_frame(ws, pro, row + 1)
    finish_table(ws, row + 1, last, (1, row - 1))
    fit = e.form_factor_fit
    if fit is None:
        return row + 1
    # the line drawn only between the smallest and largest abscissa of the points fitted
    x_name = pro.columns[2]
    used = pro[pro["used in fit"].to_numpy(dtype=bool)]
    xs = [float(used[x_name].min()), float(used[x_name].max())]
    line = pd.DataFrame({x_name: xs, "fitted line [-]": [1.0 + e.form_factor + fit.slope * x
                                                         for x in xs]})
    lr = last + 2
    ws.cell(row=lr, column=1, value="Fitted line over the fitted Froude range "
            f"{fit.froude_range[0]:g} to {fit.froude_range[1]:g}").font = BOLD
    lf, ll = write_frame(ws, line, lr + 1, 3)
    fit_row_height(ws, lr + 1)
    ch = scatter_chart("Prohaska plot", x_name, "C_TM/C_FM [-]")
    add_series(ch, ws, 3, 4, first, last, "measured", points=True)
    add_series(ch, ws, 3, 4, lf, ll, f"fit: 1+k = {1 + e.form_factor:.4f}")
    chart_below(ws, ch, ll)
    return row + 1
def _full_scale_formulas(e):
    """Audit formulas of C_TS and P_E (ITTC 7.5-02-03-01.4) and the constants they use."""
    return ((
        ("C_TS by formula [-]",
         "{bilge-keel factor (S+S_BK)/S [-]}*({(1+k) C_FS [-]}+{roughness allowance dC_F [-]})"
         "+{correlation allowance C_A [-]}+{C_R [-]}+{air resistance C_AAS [-]}"),
        ("P_E by formula [kW]",
         "0.5*{$ship water density [kg/m^3]}*{$wetted surface S [m^2]}"
         "*{ship speed [m/s]}^3*{@C_TS by formula [-]}/1000"),
    ), (("wetted surface S [m^2]", e.ship.wetted_surface),
        ("ship water density [kg/m^3]", e.arrays["rho_s"])))


def _uncertainty_sheet(ws, uncertainty) -> int:
    u = uncertainty.inputs
    row = write_pairs(ws, [
        ("method", uncertainty.method),
        ("u(model speed) [m/s]", u.speed),
        ("u(resistance) [N]", u.resistance),
        ("u(resistance), relative [%]", 100 * u.resistance_relative),
        ("u(water temperature) [K]", u.temperature),
        ("u(form factor k) [-]", u.form_factor),
        ("standard error of Prohaska's intercept [-] (a check, not an input)",
         uncertainty.intercept_error),
    ], 1, "Standard uncertainties of the inputs")
    _, last = write_frame(ws, uncertainty.table, row)
    finish_table(ws, row, last, (1, row - 1))
    return row


def _open_water_sheet(ws, open_water) -> int:
    """The propeller, the model and ship characteristics, and their chart below them."""
    p = open_water.propeller
    row = write_pairs(ws, [
        ("ship propeller diameter [m]", p.diameter), ("scale [-]", p.scale),
        ("P/D at 0.75R [-]", p.pitch_diameter), ("c/D at 0.75R [-]", p.chord_diameter),
        ("blades Z", p.blades), ("t/c at 0.75R [-]", p.thickness_chord),
        ("blade roughness k_p [um]", p.blade_roughness * 1e6),
        *[(f"note {i + 1}", n) for i, n in enumerate(open_water.notes)],
    ], 1, "Propeller")
    ow = open_water.table.sort_values("advance ratio J [-]")
    ow = ow.assign(**{"10 K_Q model [-]": 10 * ow["K_Q model [-]"],
                      "10 K_Q ship [-]": 10 * ow["K_Q ship [-]"]})
    first, last = write_frame(ws, ow, row)
    finish_table(ws, row, last, (1, row - 1))
    heads = list(ow.columns)
    col = {h: heads.index(h) + 1 for h in heads}
    ch = scatter_chart("Open water: model (points) and ship (lines)", "J [-]",
                       "K_T, 10 K_Q, eta_0")
    x = col["advance ratio J [-]"]
    for k, name in enumerate(("K_T", "10 K_Q", "eta_0")):
        colour = ("4472C4", "C0504D", "9BBB59")[k]
        add_series(ch, ws, x, col[f"{name} model [-]"], first, last, f"{name} model",
                   points=True, colour=colour)
        add_series(ch, ws, x, col[f"{name} ship [-]"], first, last, f"{name} ship",
                   colour=colour)
    chart_below(ws, ch, last)
    return row


def _charts_sheet(ws, e) -> int:
    """C_T and C_F against Froude number; P_E against ship speed; the charts below their
    table."""
    a = e.arrays
    order = np.argsort(a["froude"])
    chart_data = pd.DataFrame({
        "Froude number [-]": a["froude"][order],
        "C_TM at 15 degC [-]": a["ctm15"][order],
        "C_FM ITTC-1957 [-]": a["cfm15"][order],
        "(1+k) C_FM [-]": (1 + e.form_factor) * a["cfm15"][order],
        "C_FS ITTC-1957 [-]": a["cfs"][order],
        "C_TS [-]": a["cts"][order],
        "ship speed [kn]": a["ship_speed"][order] / KNOT,
        "P_E [kW]": a["pe"][order] / 1e3,
    })
    first, last = write_frame(ws, chart_data, 1, 1)
    finish_table(ws, 1, last)
    ch = scatter_chart("Resistance coefficients against Froude number", "Froude number [-]",
                       "coefficient [-]")
    add_series(ch, ws, 1, 2, first, last, 1, points=True)
    for j in (3, 4, 5, 6):
        add_series(ch, ws, 1, j, first, last, 1)
    below = chart_below(ws, ch, last)
    ch = scatter_chart("Effective power against ship speed", "ship speed [kn]", "P_E [kW]")
    add_series(ch, ws, 7, 8, first, last, 1, points=True)
    add_series(ch, ws, 7, 8, first, last, "P_E")
    chart_below(ws, ch, below, gap=1)
    return 1


def write_results(path, extrapolation, uncertainty=None, open_water=None,
                  overwrite: bool = False, paper: str = "A4",
                  outputs: OutputSet | None = None, prediction=None) -> Path:
    """Write the results workbook atomically.

    Parameters
    ----------
    path : str or Path
        ``.xlsx`` file to write.
    extrapolation : similitude.prediction.extrapolation.Extrapolation
    uncertainty : similitude.prediction.uncertainty.UncertaintyResult, optional
    open_water : similitude.prediction.open_water.OpenWaterScaling, optional
    overwrite : bool
        Replace an existing file (otherwise
        :class:`similitude.report.atomic.OutputExistsError`).
    paper : str
        Paper size of the page setup: ``"A4"`` (default) or ``"letter"``.
    outputs : similitude.report.atomic.OutputSet, optional
        Write the workbook as one file of this set (published with the others, or not at
        all); ``overwrite`` is then the set's.
    prediction : similitude.prediction.predict.Prediction, optional
        The whole prediction: with a self-propulsion test, its sheets are added.

    Returns
    -------
    pathlib.Path
    """
    if outputs is not None:
        overwrite = outputs.overwrite
    target = check_target(path, overwrite)  # fail before the work
    wb = build_workbook(extrapolation, uncertainty, open_water, paper, prediction)
    if outputs is not None:
        return outputs.add(target, lambda p: save_workbook(wb, p))
    with signals_cleanup(), OutputSet(overwrite) as out:
        out.add(target, lambda p: save_workbook(wb, p))
    return target


__all__ = ["build_workbook", "write_results"]

"""The self-propulsion sheets of the results workbook: runs, propulsion factors, full-scale
prediction, speed-power-rpm, and the uncertainty of P_D and n_S.

Sheets (added by :func:`add_propulsion_sheets` after the open-water sheet):

* ``Self-propulsion`` — the measured runs and every analysis step per run (K_TM, K_QM, J, w,
  t, η_R, η_0, η_H, η_D), with live audit formulas of K_TM, w and t;
* ``Propulsion factors`` — the self-propulsion point of each speed and a chart of w_TM, t, η_R
  and η_D against speed;
* ``Full-scale prediction`` — per speed the ship coefficients, w_TS, K_T/J², J_TS, n_S, P_DS,
  the trial figures, P_S and P_B, with live audit formulas of w_TS, K_T/J², n_S and P_DS;
* ``Speed-power-rpm`` — the table, the contract-speed figures, and the power and rpm charts;
* ``Propulsion uncertainty`` — which method gave each figure, u(P_D) and u(n_S) by first order
  and Monte Carlo, and each input's first-order contribution.

The formulas follow ITTC 7.5-02-03-01.4 "1978 ITTC Performance Prediction Method", Rev 04
(2017). openpyxl and pandas are imported at the top: only the results writer loads this module.
"""

from __future__ import annotations

from dataclasses import fields

import pandas as pd

from similitude.report.sheets import (
    SERIES_COLOURS,
    TITLE_FONT,
    add_series,
    audit_formulas,
    chart_below,
    finish_table,
    fit_pairs,
    fit_row_height,
    fit_widths,
    scatter_chart,
    write_frame,
    write_pairs,
)

#: Sheet names, in workbook order.
SHEETS = ("Self-propulsion", "Propulsion factors", "Full-scale prediction", "Speed-power-rpm",
          "Propulsion uncertainty")


def add_propulsion_sheets(wb, prediction, new_sheet) -> dict[str, int]:
    """Add the self-propulsion sheets of ``prediction`` to ``wb``; returns each sheet's
    header row (repeated on printed pages).

    Parameters
    ----------
    wb : openpyxl.Workbook
    prediction : similitude.prediction.predict.Prediction
        With ``self_propulsion`` and ``power``.
    new_sheet : callable
        title -> a new worksheet of ``wb`` (the writer's, so text stays safe).
    """
    titles = {}
    titles[SHEETS[0]] = _runs_sheet(new_sheet(SHEETS[0]), prediction)
    titles[SHEETS[1]] = _factors_sheet(new_sheet(SHEETS[1]), prediction)
    titles[SHEETS[2]] = _full_scale_sheet(new_sheet(SHEETS[2]), prediction)
    titles[SHEETS[3]] = _speed_power_sheet(new_sheet(SHEETS[3]), prediction)
    if prediction.propulsion_uncertainty is not None:
        titles[SHEETS[4]] = _uncertainty_sheet(new_sheet(SHEETS[4]), prediction)
    return titles


def _runs_sheet(ws, p) -> int:
    sp = p.self_propulsion
    setup = p.chain.setup
    row = write_pairs(ws, [
        ("method", sp.options.statement),
        ("propeller in the test", "stock propeller" if p.chain.curves.stock
         else "design propeller"),
        ("model propeller diameter [m]", setup.model_diameter),
        ("number of propellers", setup.propulsion.propellers),
        ("open-water curve", sp.curve.source),
        *[(f"note {i + 1}", n) for i, n in enumerate(sp.notes)],
    ], 1, "Self-propulsion analysis (ITTC 7.5-02-03-01.4 Rev 04, 2017)")
    ws.cell(row=row, column=1, value="Measured runs and their analysis").font = TITLE_FONT
    table = sp.table
    first, last = write_frame(ws, table, row + 1)
    j = next(c for c in table.columns if c.startswith("advance ratio"))
    w = next(c for c in table.columns if c.startswith("wake fraction"))
    # K_TM = T/(rho n^2 D^4); w = 1 - J n D/V; t = (N T + F - R_C)/(N T)
    audit_formulas(ws, list(table.columns), first, last, (
        ("K_TM by formula [-]",
         "{thrust [N]}/({water density [kg/m^3]}*{rotation rate [1/s]}^2*{$D_M [m]}^4)"),
        (f"{w.split(' [')[0]} by formula [-]",
         f"1-{{{j}}}*{{rotation rate [1/s]}}*{{$D_M [m]}}/{{model speed [m/s]}}"),
        ("t by formula [-]",
         "({$N}*{thrust [N]}+{tow force [N]}-{resistance R_C [N]})/({$N}*{thrust [N]})"),
    ), (("D_M [m]", setup.model_diameter), ("N", setup.propulsion.propellers)))
    ws.freeze_panes = ws.cell(row=first, column=2)
    finish_table(ws, row + 1, last, (1, row - 1))
    return row + 1


def _factors_sheet(ws, p) -> int:
    pts = p.self_propulsion.points
    ws.cell(row=1, column=1, value="Self-propulsion point of each speed").font = TITLE_FONT
    first, last = write_frame(ws, pts, 2)
    finish_table(ws, 2, last)
    col = {c: i + 1 for i, c in enumerate(pts.columns)}
    w = next(c for c in pts.columns if c.startswith("wake fraction"))
    ch = scatter_chart("Propulsion factors against model speed", "model speed [m/s]",
                       "factor [-]")
    x = col["model speed [m/s]"]
    for name in (w, "thrust deduction t [-]", "relative rotative efficiency eta_R [-]",
                 "propulsive efficiency eta_D [-]"):
        add_series(ch, ws, x, col[name], first, last, name.split(" [")[0], points=True)
    chart_below(ws, ch, last)
    return 2


def _full_scale_sheet(ws, p) -> int:
    pw, setup = p.power, p.chain.setup
    row = write_pairs(ws, [(f"note {i + 1}", n) for i, n in enumerate(pw.notes)], 1,
                      "Full-scale prediction (ITTC 7.5-02-03-01.4 Rev 04, 2017)")
    t = pw.table
    first, last = write_frame(ws, t, row)
    opt = setup.propulsion
    audit_formulas(ws, list(t.columns), first, last, (
        ("w_TS by formula [-]",
         "({thrust deduction t [-]}+{$rudder allowance})+({model wake w_TM [-]}"
         "-{thrust deduction t [-]}-{$rudder allowance})*((1+{$k})*{C_FS [-]}"
         "+{roughness allowance dC_F [-]})/((1+{$k})*{C_FM [-]})"),
        ("K_T/J^2 by formula [-]",
         "{$S [m^2]}*{C_TS [-]}/(2*{$N}*{$D [m]}^2*(1-{thrust deduction t [-]})"
         "*(1-{@w_TS by formula [-]})^2)"),
        ("n_S by formula [1/s]",
         "(1-{full-scale wake w_TS [-]})*{ship speed [m/s]}/({advance ratio J_TS [-]}"
         "*{$D [m]})"),
        ("P_DS by formula [kW]",
         "2*PI()*{$rho_S [kg/m^3]}*{$D [m]}^5*{rate of revolution n_S [1/s]}^3*{K_QTS [-]}"
         "/{eta_R [-]}*{$N}/1000"),
    ), (("rudder allowance", opt.rudder_allowance), ("k", p.extrapolation.form_factor),
        ("S [m^2]", setup.ship.wetted_surface), ("N", opt.propellers),
        ("D [m]", setup.ship_diameter), ("rho_S [kg/m^3]", pw.arrays["rho_s"])))
    ws.freeze_panes = ws.cell(row=first, column=2)
    finish_table(ws, row, last, (1, row - 1))
    return row


def _speed_power_sheet(ws, p) -> int:
    pw = p.power
    ws.cell(row=1, column=1, value="Speed, power and rate of revolution (trial prediction; "
            "method: Read me)").font = TITLE_FONT
    row = 3
    if pw.contract is not None:
        ws.cell(row=row, column=1, value="At the contract speed (interpolated log-log)"
                ).font = TITLE_FONT
        _, last_c = write_frame(ws, pd.DataFrame([pw.contract]), row + 1)
        fit_row_height(ws, row + 1)
        row = last_c + 2
        ws.cell(row=row, column=1, value="At the self-propulsion speeds").font = TITLE_FONT
        row += 1
    sp = pw.speed_power
    first, last = write_frame(ws, sp, row)
    finish_table(ws, row, last)
    ch = scatter_chart("Power against ship speed", "ship speed [kn]", "power [kW]")
    names = ["P_E", "P_D"] + ([] if sp["P_B [kW]"].equals(sp["P_D [kW]"]) else ["P_B"])
    for name, colour in zip(names, SERIES_COLOURS, strict=False):
        y = sp.columns.get_loc(f"{name} [kW]") + 1
        add_series(ch, ws, 1, y, first, last, name, points=True, colour=colour)
        add_series(ch, ws, 1, y, first, last, f"{name} (line)", colour=colour)
    below = chart_below(ws, ch, last)
    ch = scatter_chart("Rate of revolution against ship speed", "ship speed [kn]",
                       "rate of revolution [rpm]")
    rpm = sp.columns.get_loc("rate of revolution [rpm]") + 1
    add_series(ch, ws, 1, rpm, first, last, "n", points=True)
    add_series(ch, ws, 1, rpm, first, last, "n (line)")
    chart_below(ws, ch, below, gap=1)
    return row


def _uncertainty_sheet(ws, p) -> int:
    pu = p.propulsion_uncertainty
    u = pu.inputs
    pairs = [("method", pu.method)]
    pairs += [(f"u({f.name.replace('_', ' ')}) [{_unit(f.name)}]", getattr(u, f.name))
              for f in fields(u) if getattr(u, f.name)]
    row = write_pairs(ws, pairs, 1, "Uncertainty of P_D and n_S (standard, k = 1)")
    first, last = write_frame(ws, pu.table, row)
    heads = [row]
    c = pd.DataFrame(pu.contributions)
    for what, col, unit in (("u(P_DS)", "u(P_DS) contribution [kW]", "kW"),
                            ("u(n_S)", "u(n_S) contribution [rpm]", "rpm")):
        wide = c.pivot_table(index="ship speed [kn]", columns="input", values=col,
                             sort=False).reset_index()
        wide.columns = ["ship speed [kn]", *(f"{what} from {name} [{unit}]"
                                             for name in wide.columns[1:])]
        r = last + 2
        ws.cell(row=r, column=1, value=f"First-order contribution of each measured input to "
                f"{what}").font = TITLE_FONT
        _, last = write_frame(ws, wide, r + 1)
        heads.append(r + 1)
    fit_widths(ws, rows=range(row, last + 1))
    for h in heads:
        fit_row_height(ws, h)
    fit_pairs(ws, 1, row - 1, ws.max_column)
    return row


_UNITS = {"speed": "m/s", "resistance": "N", "temperature": "K", "form_factor": "-",
          "rotation_rate": "1/s", "thrust": "N", "torque": "N m", "tow_force": "N"}


def _unit(name: str) -> str:
    """Unit of a MeasurementUncertainty field: relative ones are fractions."""
    if name.endswith("_relative") or name.startswith("open_water"):
        return "fraction"
    return _UNITS.get(name, "-")


__all__ = ["SHEETS", "add_propulsion_sheets"]

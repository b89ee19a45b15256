"""Workbook of an extrapolation to full scale: inputs, every correction step, results, charts.

Sheets: ``Read me`` (method, revision, cautions), ``Inputs`` (ship, options, measured runs),
``Tank corrections`` (stimulator drag, blockage, temperature correction), ``Form factor``
(Prohaska's fit and residuals), ``Model scale`` (C_TM, C_FM, C_R), ``Full scale`` (allowances,
C_TS, R_TS, P_E), ``Results``, ``Uncertainty`` and ``Open water`` when given, and ``Charts``
(C_T and C_F against Froude number; P_E against ship speed; K_T, K_Q, η_0 against J).

The file is written atomically and never overwrites an existing file unless asked
(:mod:`similitude.report.atomic`).

openpyxl and pandas are imported inside the functions: the command line builds every
command's parser at start (and so imports this module), and that start must not pay for them.
"""

from __future__ import annotations

import math
import re
from pathlib import Path
from typing import Any

import numpy as np

from similitude.cautions import PREDICTION_CAUTIONS
from similitude.constants import KNOT
from similitude.report.atomic import write_atomic
from similitude.report.sheets import scatter_chart

_HEADER_FONT = {"bold": True}


def _cell(value: Any) -> Any:
    if isinstance(value, (np.floating, float)):
        v = float(value)
        return v if math.isfinite(v) else None
    if isinstance(value, (np.integer,)):
        return int(value)
    if isinstance(value, (np.bool_,)):
        return bool(value)
    return value


def _write_frame(ws, frame, row: int = 1, col: int = 1) -> tuple[int, int]:
    """Write a DataFrame with a bold header; returns (first data row, last data row)."""
    from openpyxl.styles import Font

    for j, name in enumerate(frame.columns):
        c = ws.cell(row=row, column=col + j, value=str(name))
        c.font = Font(**_HEADER_FONT)
        ws.column_dimensions[c.column_letter].width = max(12, min(34, len(str(name)) + 2))
    for i, values in enumerate(frame.itertuples(index=False), start=1):
        for j, value in enumerate(values):
            ws.cell(row=row + i, column=col + j, value=_cell(value))
    return row + 1, row + len(frame)


def _write_pairs(ws, pairs, row: int = 1, title: str | None = None) -> int:
    from openpyxl.styles import Font

    if title:
        ws.cell(row=row, column=1, value=title).font = Font(bold=True)
        row += 1
    for key, value in pairs:
        ws.cell(row=row, column=1, value=str(key))
        ws.cell(row=row, column=2, value=_cell(value) if not isinstance(value, (tuple, list))
                else ", ".join(str(v) for v in value))
        row += 1
    ws.column_dimensions["A"].width = 44
    ws.column_dimensions["B"].width = 60
    return row + 1




def _add_series(chart, ws, x_col: int, y_col: int, first: int, last: int, title_row: int,
                marker_only: bool = False) -> None:
    from openpyxl.chart import Reference, Series

    xs = Reference(ws, min_col=x_col, min_row=first, max_row=last)
    ys = Reference(ws, min_col=y_col, min_row=title_row, max_row=last)
    s = Series(ys, xs, title_from_data=True)
    if marker_only:
        s.marker.symbol = "circle"
        s.graphicalProperties.line.noFill = True
    chart.series.append(s)


def _add_formulas(ws, columns, first: int, last: int, formulas, constants) -> None:
    """Write spreadsheet formulas beside the values so a reader can audit a step in place.

    Parameters
    ----------
    ws : worksheet
    columns : sequence of str
        Headers of the written frame (column A onwards).
    first, last : int
        First and last data rows.
    formulas : sequence of (header, template)
        ``template`` uses ``{header}`` of a column of the same row, ``{$name}`` of a
        constant and ``{@header}`` of an earlier formula column of the same row.
    constants : sequence of (name, value)
        Written in a small block to the right and referenced absolutely.
    """
    from openpyxl.styles import Font
    from openpyxl.utils import get_column_letter

    letters = {name: get_column_letter(j + 1) for j, name in enumerate(columns)}
    n = len(columns)
    c_const = n + len(formulas) + 2
    const_ref = {}
    for r, (name, value) in enumerate(constants, start=first):
        ws.cell(row=r, column=c_const, value=name)
        ws.cell(row=r, column=c_const + 1, value=_cell(value))
        const_ref[name] = f"${get_column_letter(c_const + 1)}${r}"
    ws.column_dimensions[get_column_letter(c_const)].width = 30
    own = {}
    for k, (header, _) in enumerate(formulas):
        col = n + 1 + k
        ws.cell(row=first - 1, column=col, value=header).font = Font(bold=True)
        own[header] = get_column_letter(col)
    pattern = re.compile(r"\{([$@]?)([^{}]+)\}")
    for r in range(first, last + 1):
        def ref(m, r=r):
            kind, name = m.group(1), m.group(2)
            if kind == "$":
                return const_ref[name]
            if kind == "@":
                return f"{own[name]}{r}"
            return f"{letters[name]}{r}"

        for k, (_, template) in enumerate(formulas):
            ws.cell(row=r, column=n + 1 + k, value="=" + pattern.sub(ref, template))


def build_workbook(extrapolation, uncertainty=None, open_water=None):
    """Build the openpyxl Workbook (not saved).

    Parameters
    ----------
    extrapolation : similitude.prediction.extrapolation.Extrapolation
    uncertainty : similitude.prediction.uncertainty.UncertaintyResult, optional
    open_water : similitude.prediction.open_water.OpenWaterScaling, optional

    Returns
    -------
    openpyxl.Workbook
    """
    from openpyxl import Workbook

    e = extrapolation
    wb = Workbook()
    _readme_sheet(wb.active, e)
    _inputs_sheet(wb.create_sheet("Inputs"), e)
    _tank_sheet(wb.create_sheet("Tank corrections"), e)
    _form_factor_sheet(wb.create_sheet("Form factor"), e)
    _model_sheet(wb.create_sheet("Model scale"), e)
    _full_scale_sheet(wb.create_sheet("Full scale"), e)
    _write_frame(wb.create_sheet("Results"), e.results)
    if uncertainty is not None:
        _uncertainty_sheet(wb.create_sheet("Uncertainty"), uncertainty)
    if open_water is not None:
        _open_water_sheet(wb.create_sheet("Open water"), open_water)
    _charts_sheet(wb.create_sheet("Charts"), e)
    return wb


def _readme_sheet(ws, e) -> None:
    """Method, revision, the data's source (labelled when synthetic), cautions and notes."""
    from openpyxl.styles import Font

    ws.title = "Read me"
    ws.cell(row=1, column=1, value="Full-scale extrapolation of measured model resistance"
            ).font = Font(bold=True, size=14)
    row = 3
    source = e.runs.source or "(built in Python)"
    synthetic = "synthetic" in source.lower()
    pairs = [("ship", e.ship.name), ("measured data", source),
             ("method", e.options.revision_note), ("form factor k [-]", e.form_factor)]
    if synthetic:
        pairs.append(("DATA", "SYNTHETIC: invented 'virtual tank' data, not a real test"))
    row = _write_pairs(ws, pairs, row, "Summary")
    row = _write_pairs(ws, [(f"{i + 1}.", text) for i, text in enumerate(PREDICTION_CAUTIONS)], row,
                       "Cautions")
    _write_pairs(ws, [(f"note {i + 1}", n) for i, n in enumerate(e.notes)], row, "Notes")


def _inputs_sheet(ws, e) -> None:
    """The ship, the options and the measured runs."""
    from openpyxl.styles import Font

    ship = e.ship
    row = _write_pairs(ws, [
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
    row = _write_pairs(ws, [
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
    ws.cell(row=row, column=1, value="Measured runs").font = Font(bold=True)
    _write_frame(ws, e.runs.to_frame(), row + 1)


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


def _tank_sheet(ws, e) -> None:
    """Stimulator drag, blockage and temperature correction, with audit formulas."""
    tank = e.model[[c for c in _TANK_COLUMNS if c in e.model.columns]]
    first, last = _write_frame(ws, tank)
    # C_TM = R/(½ ρ S_M V²); C_TM,15 = C_TM + (1+k)(C_FM,15 − C_FM) (ITTC 7.5-02-03-01.4)
    _add_formulas(ws, list(tank.columns), first, last, (
        ("C_TM by formula [-]",
         "{resistance used [N]}/(0.5*{water density [kg/m^3]}*{$model wetted surface [m^2]}"
         "*{model speed [m/s]}^2)"),
        ("C_TM at 15 degC by formula [-]",
         "{@C_TM by formula [-]}+(1+{$form factor k [-]})*({C_FM at 15 degC [-]}"
         "-{C_FM at test temperature [-]})"),
    ), (("model wetted surface [m^2]", e.ship.model_wetted_surface),
        ("form factor k [-]", e.form_factor)))


def _form_factor_sheet(ws, e) -> None:
    """Prohaska's fit: its statistics, every point with its residual, and the plot."""
    from openpyxl.styles import Font

    row = _write_pairs(ws, list(e.fit_summary().items()), 1, "Form factor")
    ws.cell(row=row, column=1, value="Prohaska plot: C_TM/C_FM = (1+k) + y Fn^n/C_FM").font = (
        Font(bold=True))
    pro = e.prohaska_frame()
    first, last = _write_frame(ws, pro, row + 1)
    if e.form_factor_fit is not None:
        ch = scatter_chart("Prohaska plot", pro.columns[2], "C_TM/C_FM [-]")
        _add_series(ch, ws, 3, 4, first, last, first - 1, marker_only=True)
        _add_series(ch, ws, 3, 6, first, last, first - 1)
        ws.add_chart(ch, f"J{row + 1}")


def _model_sheet(ws, e) -> None:
    _write_frame(ws, e.model[[c for c in _MODEL_COLUMNS if c in e.model.columns]])


def _full_scale_sheet(ws, e) -> None:
    """The ship-scale steps, with audit formulas for C_TS and P_E."""
    first, last = _write_frame(ws, e.full_scale)
    # C_TS and P_E by ITTC 7.5-02-03-01.4, from the cells of the row
    _add_formulas(ws, list(e.full_scale.columns), first, last, (
        ("C_TS by formula [-]",
         "{bilge-keel factor (S+S_BK)/S [-]}*({(1+k) C_FS [-]}+{roughness allowance dC_F [-]})"
         "+{correlation allowance C_A [-]}+{C_R [-]}+{air resistance C_AAS [-]}"),
        ("P_E by formula [kW]",
         "0.5*{$ship water density [kg/m^3]}*{$wetted surface S [m^2]}"
         "*{ship speed [m/s]}^3*{@C_TS by formula [-]}/1000"),
    ), (("wetted surface S [m^2]", e.ship.wetted_surface),
        ("ship water density [kg/m^3]", e.arrays["rho_s"])))


def _uncertainty_sheet(ws, uncertainty) -> None:
    u = uncertainty.inputs
    row = _write_pairs(ws, [
        ("method", uncertainty.method),
        ("u(model speed) [m/s]", u.speed),
        ("u(resistance) [N]", u.resistance),
        ("u(resistance), relative [%]", 100 * u.resistance_relative),
        ("u(water temperature) [K]", u.temperature),
        ("u(form factor k) [-]", u.form_factor),
    ], 1, "Standard uncertainties of the inputs")
    _write_frame(ws, uncertainty.table, row)


def _open_water_sheet(ws, open_water) -> None:
    """The propeller, the model and ship characteristics, and their chart."""
    p = open_water.propeller
    row = _write_pairs(ws, [
        ("ship propeller diameter [m]", p.diameter), ("scale [-]", p.scale),
        ("P/D at 0.75R [-]", p.pitch_diameter), ("c/D at 0.75R [-]", p.chord_diameter),
        ("blades Z", p.blades), ("t/c at 0.75R [-]", p.thickness_chord),
        ("blade roughness k_p [um]", p.blade_roughness * 1e6),
        *[(f"note {i + 1}", n) for i, n in enumerate(open_water.notes)],
    ], 1, "Propeller")
    ow = open_water.table.sort_values("advance ratio J [-]")
    ow_first, ow_last = _write_frame(ws, ow, row)
    ch = scatter_chart("Open water: model (points) and ship (lines)", "J [-]", "K_T, 10 K_Q, eta_0")
    ow10 = ow.assign(**{"10 K_Q model [-]": 10 * ow["K_Q model [-]"],
                        "10 K_Q ship [-]": 10 * ow["K_Q ship [-]"]})
    cols = ["advance ratio J [-]", "K_T model [-]", "10 K_Q model [-]", "eta_0 model [-]",
            "K_T ship [-]", "10 K_Q ship [-]", "eta_0 ship [-]"]
    c0 = len(ow.columns) + 2
    cf, cl = _write_frame(ws, ow10[cols], row, c0)
    for j in range(1, 7):
        _add_series(ch, ws, c0, c0 + j, cf, cl, cf - 1, marker_only=j <= 3)
    ws.add_chart(ch, f"A{ow_last + 3}")


def _charts_sheet(ws, e) -> None:
    """C_T and C_F against Froude number; P_E against ship speed."""
    import pandas as pd

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
    first, last = _write_frame(ws, chart_data, 1, 1)
    ch = scatter_chart("Resistance coefficients against Froude number", "Froude number [-]",
                  "coefficient [-]")
    _add_series(ch, ws, 1, 2, first, last, 1, marker_only=True)
    for j in (3, 4, 5, 6):
        _add_series(ch, ws, 1, j, first, last, 1)
    ws.add_chart(ch, "J2")
    ch = scatter_chart("Effective power against ship speed", "ship speed [kn]", "P_E [kW]")
    _add_series(ch, ws, 7, 8, first, last, 1)
    ws.add_chart(ch, "J22")


def write_results(path, extrapolation, uncertainty=None, open_water=None,
                  overwrite: bool = False) -> Path:
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

    Returns
    -------
    pathlib.Path
    """
    wb = build_workbook(extrapolation, uncertainty, open_water)
    return write_atomic(path, lambda p: wb.save(p), overwrite)


__all__ = ["build_workbook", "write_results"]

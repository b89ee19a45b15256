"""The operator's run sheet: what the carriage driver or tunnel operator sets for each run, in
the order run, with the loading changes and wave calibrations between them.

``run_sheet(plan)`` takes the plan's run matrix (in run order) and keeps what the operator
sets and reads: run number, condition (loading, wave, heading, angle), prototype speed in the
user's unit and model speed, and per kind of facility:

* towing tank and wave basin: Froude number, runs needed for a long sea, the wait after the
  run;
* every facility that sets a pressure: that pressure (tunnel static pressure at the shaft
  centre or model, air pressure over a depressurised tank);
* cavitation tunnel: the cavitation number of the run, the planned water temperature, and a
  column to record the dissolved-air content;
* wind tunnel: Mach number and dynamic pressure q = rho V^2 / 2 of the run;
* anything with a propeller: the model rotation rate in rps and rpm.

Blank columns take the measured value and remarks on the day. The full detail of every run
stays in the plan's matrix (the workbook's Runs sheet).

References
----------
.. [1] ITTC, Recommended Procedure 7.5-02-03-03.1, "Model-Scale Cavitation Test", 2017
       (cavitation number, tunnel pressure, water quality; the air content is measured and
       stated).
.. [2] ITTC, "ITTC Symbols and Terminology List", 2017 (sigma_n, sigma_v, Mach number,
       dynamic pressure).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from similitude.dimensional.numbers import cavitation_number, mach
from similitude.planning.case import SWEEPS, body_class

#: Header of the blank column the operator writes the measured value in, by kind of test.
MEASURED_HEADERS = {
    "resistance": "measured resistance [N]",
    "self_propulsion": "measured rotation rate [rps]",
    "open_water": "measured thrust [N]",
    "seakeeping": "record file",
    "cavitation": "cavitation seen",
    "wind_tunnel": "record file",
}
#: Advice printed with a cavitation tunnel's run sheet (common practice; ITTC 7.5-02-03-03.1
#: asks for the air content to be measured and stated).
DISSOLVED_AIR_ADVICE = (
    "Measure the dissolved-air (oxygen) content before each series and after long pauses, "
    "and record it per run: nuclei and air content change cavitation inception and its "
    "extent. Keep it at the level agreed for the test, low (deaerated water) for inception "
    "observations, and state it with the results (ITTC 7.5-02-03-03.1; the level is common "
    "practice of each facility)."
)


@dataclass(frozen=True)
class RunSheet:
    """The operator's run sheet of a plan.

    Attributes
    ----------
    frame : pandas.DataFrame
        One row per run in the order run: ``run`` and the columns the operator needs (units
        in the headers), the planned waiting time after the run [min], and blank
        ``measured`` (header by kind of test) and ``remarks`` columns.
    events : tuple of (int, str)
        (position, text): a loading change or wave calibration to do before the run at
        ``frame`` row ``position`` (0-based), with its time.
    notes : tuple of str
        Advice printed with the sheet (dissolved air in a cavitation tunnel, ...).
    total_hours : float
        Facility time of the whole sheet [h] (runs, waits, loading changes, calibrations).
    """

    frame: object
    events: tuple[tuple[int, str], ...]
    notes: tuple[str, ...]
    total_hours: float


def run_sheet(plan) -> RunSheet:
    """The operator's run sheet of ``plan`` (a :class:`similitude.planning.planner.Plan`).

    Returns
    -------
    RunSheet

    Notes
    -----
    Cavitation number of a run [2]_: on the rotation speed for a propeller,
    sigma_n = (p - p_v)/(rho n^2 D^2 / 2), otherwise on the flow speed,
    sigma_v = (p - p_v)/(rho V^2 / 2), with p the static pressure at the shaft centre or
    model the plan sets and p_v the vapour pressure at the planned water temperature. Mach
    number Ma = V/a; dynamic pressure q = rho V^2 / 2.

    References
    ----------
    .. [2] ITTC Symbols and Terminology List (2017).
    """
    # pandas on call only: the planner itself does not need it for this table
    import pandas as pd

    case, m = plan.case, plan.matrix
    fac = case.facility
    cols: dict[str, object] = {"run": m["run"].to_numpy()}
    for key in ("loading", "wave", "heading [deg]", *SWEEPS.values()):
        if key in m and (key != "loading" or len(case.matrix.loading) > 1):
            cols[key] = m[key].to_numpy()
    speed = case.speed_header if case.speed_header in m else "prototype speed [m/s]"
    cols[speed] = m[speed].to_numpy()
    vm = m["model speed [m/s]"].to_numpy(dtype=float)
    cols["model speed [m/s]"] = vm
    if "Froude number [-]" in m and fac.free_surface:
        cols["Froude number [-]"] = m["Froude number [-]"].to_numpy()
    if "model rotation rate [1/s]" in m:
        n = m["model rotation rate [1/s]"].to_numpy(dtype=float)
        cols["model rotation rate [rps]"] = n
        cols["model rotation rate [rpm]"] = 60.0 * n
    for label, pa in plan.model_pressures.items():  # what the facility is set to
        cols[f"{label} [kPa]"] = np.full(vm.size, pa / 1e3)
    notes: list[str] = []
    if fac.kind == "cavitation_tunnel":
        cols.update(_cavitation_columns(plan, vm, cols.get("model rotation rate [rps]")))
        notes.append(DISSOLVED_AIR_ADVICE)
    if fac.kind == "wind_tunnel":
        cols.update(_wind_tunnel_columns(plan, vm))
    if "runs needed [-]" in m and (m["runs needed [-]"] != 1).any():
        cols["runs needed [-]"] = m["runs needed [-]"].to_numpy()
    cols["wait after [min]"] = m["waiting time [s]"].to_numpy(dtype=float) / 60.0
    frame = pd.DataFrame(cols)
    frame[MEASURED_HEADERS.get(case.test, "measured")] = ""
    frame["remarks"] = ""
    hours = float(m["facility time [s]"].sum()) / 3600.0 if "facility time [s]" in m else \
        math.nan
    return RunSheet(frame=frame, events=_events(plan), notes=tuple(notes), total_hours=hours)


def _cavitation_columns(plan, vm, n_rps) -> dict:
    """Cavitation number and water temperature of each run (the pressure set: the plan's
    model pressures); a blank column for the measured dissolved-air content."""
    st = plan.model_fluid
    sol = plan.solution
    p = sol.model_pressure if sol.model_pressure is not None else float(
        np.asarray(st.pressure_si))
    rho = float(np.asarray(st.density_si))
    pv = st.vapour_pressure_si
    cols: dict[str, object] = {}
    if pv is not None:
        pv = float(np.asarray(pv))
        if n_rps is not None and body_class(plan.case.prototype.kind) == "propeller":
            d = float(plan.case.prototype.dimension("diameter", plan.case.prototype.length))
            cols["cavitation number sigma_n [-]"] = cavitation_number(
                p, pv, rho, n_rps * d / plan.scale)
        else:
            cols["cavitation number sigma_v [-]"] = cavitation_number(p, pv, rho, vm)
    t = float(np.asarray(st.temperature_si)) - 273.15
    cols["planned water temperature [degC]"] = np.full(vm.size, t)
    cols["dissolved air [% of saturation]"] = ""
    return cols


def _wind_tunnel_columns(plan, vm) -> dict:
    """Mach number and dynamic pressure of each run at the planned air state."""
    st = plan.model_fluid
    rho = float(np.asarray(st.density_si))
    cols: dict[str, object] = {}
    if st.speed_of_sound_si is not None:
        cols["Mach number [-]"] = mach(vm, float(np.asarray(st.speed_of_sound_si)))
    cols["dynamic pressure [Pa]"] = 0.5 * rho * vm**2
    return cols


def _events(plan) -> tuple[tuple[int, str], ...]:
    """Loading changes (with the model mass and draught to ballast to) and wave calibrations,
    before the runs they precede."""
    m = plan.matrix
    out = []
    builds = {b.name: b for b in plan.model_build.loadings} if "loading" in m else {}
    change = m.get("loading change before the run [s]")
    cal = m.get("wave calibration before the run [s]")
    for i in range(len(m)):
        if change is not None and change.iloc[i] > 0:
            name = m["loading"].iloc[i]
            out.append((i, f"change the loading to '{name}'{_ballast(builds.get(name))} "
                           f"({change.iloc[i] / 3600:.2g} h)"))
        if cal is not None and cal.iloc[i] > 0:
            out.append((i, f"calibrate the wave '{m['wave'].iloc[i]}' without the model "
                           f"({cal.iloc[i] / 60:.0f} min with the wait)"))
    return tuple(out)


def _ballast(build) -> str:
    """", ballast to 245.5 kg, draught 0.152 m" for a loading with those values."""
    if build is None:
        return ""
    parts = []
    if build.model_mass is not None:
        parts.append(f"model mass {build.model_mass:.1f} kg")
    if "draught" in build.model:
        parts.append(f"draught {build.model['draught'] * 1e3:.0f} mm")
    if "trim" in build.model:
        parts.append(f"trim {build.model['trim'] * 1e3:.0f} mm by the stern")
    return (": " + ", ".join(parts)) if parts else ""


__all__ = ["DISSOLVED_AIR_ADVICE", "MEASURED_HEADERS", "RunSheet", "run_sheet"]

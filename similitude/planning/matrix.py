"""The run matrix: every run the facility makes, with model and prototype values and timing.

``build_matrix(case, solution)`` crosses loading conditions x waves x headings x repeats x
speeds, in the order the facility runs them: grouped by loading condition (a change of ballast
takes time), then wave condition and heading, and within a group by ascending speed (each
repeat running the series again) or in a random order drawn with a seed. It scales each run to
the model with the solver's scale and speed ratio and estimates the run time, run distance and
waiting time of each run, the time to change the loading before the first run of each new
loading and to calibrate each wave condition without the model before its first run.
``facility_time_hours`` adds them up for booking the facility.

Timing model (towing tank, or wave basin with a moving model): the carriage accelerates at a,
runs at constant model speed V and brakes at d, so the steady (measuring) distance is
    x_run = L_facility - L_model - V^2/(2a) - V^2/(2d),
and the run time t_run = x_run / V. A model at zero speed in a basin (moored, station keeping)
runs for the model-scale duration of the sea (irregular) or a number of wave cycles (regular).
Tunnels run for a dwell time per point. Irregular seas: the model duration D_m = D_p/sqrt(lambda)
of the requested full-scale duration D_p is split into n = ceil(D_m / t_run) runs.

Defaults where the case is silent are common practice, stated from memory (no retrieved
procedure gives numbers): carriage acceleration and braking 0.5 m/s^2; waiting time for the
water to calm between runs 15 min in a towing tank (20 min with waves), 10 min in a wave
basin with absorbing beaches, 2 min in a tunnel for the flow to settle at a new point;
regular waves 20 encounter cycles per station-keeping run; a tunnel dwell of 60 s per point;
irregular seas 3 h full scale (offshore practice); 1 h to change the loading condition
(re-ballasting, checking draughts and trim, re-zeroing); a wave calibration records the whole
irregular sea, or 20 regular-wave periods, without the model, then waits as between runs.

References
----------
.. [1] ITTC, Recommended Procedure 7.5-02-02-01, "Resistance Test", Rev. 05, 2021
       (steady-speed runs; the water must be at rest before a run).
.. [2] ITTC, Recommended Procedure 7.5-02-07-02.1, "Seakeeping Experiments", Rev. 04, 2014.
.. [3] ITTC, "ITTC Symbols and Terminology List", 2017 (Froude number, heading convention).
"""

from __future__ import annotations

import math

import numpy as np
import pandas as pd

from similitude.constants import G0
from similitude.correlations import waves
from similitude.dimensional.numbers import blade_reynolds, blade_section_speed, froude, reynolds
from similitude.errors import InputError
from similitude.planning.case import SWEEPS, Case, body_class
from similitude.planning.solution import Solution

#: Defaults used where the case is silent (common practice, from memory; see module notes).
DEFAULT_ACCELERATION = 0.5  # [m/s^2]
DEFAULT_WAITING_TIME = {
    "towing_tank": 900.0,
    "towing_tank_waves": 1200.0,
    "wave_basin": 600.0,
    "cavitation_tunnel": 120.0,
    "wind_tunnel": 120.0,
}  # [s]
DEFAULT_REGULAR_CYCLES = 20  # [-]
DEFAULT_TUNNEL_DWELL = 60.0  # [s]
DEFAULT_SEA_DURATION = 3.0 * 3600.0  # [s] full scale
DEFAULT_LOADING_CHANGEOVER = 3600.0  # [s] per change of loading condition


def matrix_columns(case: Case, solution: Solution) -> tuple[dict, list[str]]:
    """The run matrix of a case for a solved scale and speed ratio, as columns.

    Parameters
    ----------
    case : Case
        The case; ``case.matrix`` (MatrixSpec, validated on construction) says what runs to
        make.
    solution : Solution
        Scale lambda [-], velocity ratio V_m/V_p [-], model and prototype fluid states.

    Returns
    -------
    tuple
        (columns, notes): the columns (header -> array, one row per run, in the order run:
        loading, wave, heading, repeat, speed, see the module notes) carry units in
        brackets: run identification, prototype and model speeds, Froude and Reynolds numbers,
        loading and wave values at both scales, encounter counts, run time, run distance,
        waiting time, the number of runs each row needs, the loading change and wave
        calibration before it, and its facility time; the notes list the defaults assumed.
        :func:`facility_time_hours` takes the columns as they are (the facility hours of a
        candidate model without building a table).

    Raises
    ------
    InputError
        For a solution scale that is not a positive number.

    Notes
    -----
    Model values: lengths / lambda, speeds x V_m/V_p, times / sqrt(lambda) (Froude scaling of
    waves, periods and durations [2]_). Froude number Fr = V/sqrt(gL), Reynolds number
    Re = VL/nu [3]_. See the module docstring for the timing model and its defaults.

    References
    ----------
    .. [2] ITTC 7.5-02-07-02.1 (2014).
    .. [3] ITTC Symbols and Terminology (2017).
    """
    spec = case.matrix
    scale = float(solution.scale)
    if not (math.isfinite(scale) and scale > 0):
        raise InputError(f"solution.scale: {scale!r} is not valid; expected a positive number")
    notes: list[str] = []
    vp_s, vm_s, np_s = _speeds(case, solution)
    loads = list(spec.loading) or [None]
    heads = list(spec.headings) or [math.nan]
    wave_rows = _wave_table(case)
    i_l, i_w, i_h, i_r, i_s, i_a = _run_order(spec, vp_s, len(loads), len(heads),
                                              len(wave_rows or [None]), notes)
    n = i_s.size

    cols: dict[str, object] = {}
    cols["run"] = np.arange(1, n + 1)
    cols["repeat"] = i_r + 1
    cols["speed index"] = i_s + 1
    if spec.loading or (case.facility.free_surface and body_class(case.prototype.kind) == "hull"):
        names = np.array([ld.name if ld is not None else "design" for ld in loads],
                         dtype=object)
        cols["loading"] = names[i_l]
    heading = np.asarray(heads, dtype=float)[i_h]
    if spec.headings or wave_rows:  # no heading column where nothing has a heading
        cols["heading [deg]"] = heading
    if spec.angles:
        cols[SWEEPS[spec.sweep]] = np.asarray(spec.angles, dtype=float)[i_a]
    cols.update(_speed_columns(case, solution, vp_s[i_s], vm_s[i_s],
                               None if np_s is None else np_s[i_s]))
    if spec.loading:
        cols.update(_loading_columns(loads, i_l, scale))
    lm = float(case.prototype.length) / scale
    if wave_rows:
        cols.update(_wave_columns(case, wave_rows, i_w, heading, vm_s[i_s],
                                  scale, lm, notes))
    timing, t_run, t_overhead, runs_needed = _timing_columns(case, vm_s[i_s], lm, scale, cols,
                                                             notes)
    cols.update(timing)
    if any(w.kind == "irregular" and w.duration is None for w in spec.waves):
        notes.append(f"irregular seas: {DEFAULT_SEA_DURATION / 3600:g} h full-scale duration "
                     "assumed (offshore common practice)")  # from memory
    wait = _waiting_time(case, bool(wave_rows), notes)
    cols["waiting time [s]"] = np.full(n, wait)
    cols["runs needed [-]"] = runs_needed
    changeover = _changeover_column(case, i_l, notes)
    calibration = _calibration_column(case, wave_rows, i_w, scale, wait, notes)
    cols["loading change before the run [s]"] = changeover
    cols["wave calibration before the run [s]"] = calibration
    cols["facility time [s]"] = runs_needed * (t_run + t_overhead + wait) + changeover + \
        calibration
    return cols, notes


def build_matrix(case: Case, solution: Solution) -> pd.DataFrame:
    """The run matrix of a case for a solved scale and speed ratio (:func:`matrix_columns`
    as a DataFrame).

    Returns
    -------
    pandas.DataFrame
        One row per run; ``DataFrame.attrs["notes"]`` lists the defaults assumed and
        ``attrs["scale"]`` holds lambda.
    """
    cols, notes = matrix_columns(case, solution)
    df = pd.DataFrame(cols)
    df.attrs["notes"] = tuple(notes)
    df.attrs["scale"] = float(solution.scale)
    return df


def _run_order(spec, vp, n_load: int, n_head: int, n_wave: int, notes: list[str]):
    """Indices (loading, wave, heading, repeat, speed, angle) of each run, in the order run.

    Runs are grouped by loading condition (a change of ballast takes time), then by wave
    condition and heading; within a group the speeds run in ascending order, each repeat
    running the series again (and the angles of a sweep at each speed), or in a random order
    of the group's runs drawn with the case's seed.
    """
    by_speed = np.argsort(np.asarray(vp, dtype=float), kind="stable")
    shape = (n_load, n_wave, n_head, int(spec.repeats), len(vp), max(1, len(spec.angles)))
    i_l, i_w, i_h, i_r, k, i_a = np.indices(shape).reshape(6, -1)
    i_s = by_speed[k]
    if spec.speed_order == "random":
        group = len(vp) * int(spec.repeats) * max(1, len(spec.angles))
        rng = np.random.default_rng(spec.seed)
        order = np.concatenate([g * group + rng.permutation(group)
                                for g in range(i_s.size // group)])
        i_r, i_s, i_a = i_r[order], i_s[order], i_a[order]
        notes.append(f"runs of each loading, wave and heading in a random order (seed "
                     f"{spec.seed})")
    return i_l, i_w, i_h, i_r, i_s, i_a


def _changeover_column(case: Case, i_l, notes: list[str]):
    """Time [s] to change the loading condition before each run (zero but at a change)."""
    out = np.zeros(i_l.size)
    change = np.flatnonzero(np.diff(i_l) != 0) + 1
    if change.size == 0:
        return out
    fac = case.facility
    t = fac.loading_changeover
    if t is None:
        t = DEFAULT_LOADING_CHANGEOVER
        # the default is from memory; the client-facing note says common practice
        notes.append(f"loading changeover {t / 3600:g} h per change of loading condition "
                     "(common practice: re-ballasting, checking draughts and trim, "
                     "re-zeroing the instruments; facility key loading_changeover)")
    out[change] = t
    return out


def _calibration_column(case: Case, wave_rows: list[dict], i_w, scale: float, wait: float,
                        notes: list[str]):
    """Time [s] to calibrate a wave condition without the model, before its first run.

    Irregular seas: the whole model-scale realisation; regular waves:
    :data:`DEFAULT_REGULAR_CYCLES` periods; each followed by the waiting time.
    """
    out = np.zeros(i_w.size)
    if not wave_rows or not case.matrix.wave_calibration:
        return out
    sqrt_l = math.sqrt(scale)
    for w, row in enumerate(wave_rows):
        first = np.flatnonzero(i_w == w)
        if first.size == 0:
            continue
        record = (row["duration"] / sqrt_l if row["kind"] == "irregular"
                  else DEFAULT_REGULAR_CYCLES * row["period"] / sqrt_l)
        out[first[0]] = record + wait
    notes.append("each wave condition calibrated once without the model before its first run "
                 "(the whole irregular sea, or 20 regular-wave periods, then the waiting time; "
                 "common practice, ITTC 7.5-02-07-02.1)")
    return out


def _speeds(case: Case, solution: Solution):
    """Prototype and model speed arrays [m/s] and the rotation rates [1/s] of the spec."""
    spec = case.matrix
    proto = case.prototype
    basis = spec.speed_basis if spec.speeds else "prototype"
    values = np.asarray(spec.speeds if spec.speeds else proto.speeds, dtype=float)
    vr = float(solution.velocity_ratio)
    if basis == "prototype":
        vp = values
    elif basis == "froude":
        vp = values * math.sqrt(G0 * proto.length)
    else:
        vp = values / vr
    vm = vp * vr
    n_p = None
    if proto.rotation_rates and len(proto.rotation_rates) == len(proto.speeds):
        # constant advance ratio between the given operating points
        order = np.argsort(proto.speeds)
        n_p = np.interp(vp, np.asarray(proto.speeds)[order],
                        np.asarray(proto.rotation_rates)[order])
    return vp, vm, n_p


def _wave_table(case: Case) -> list[dict]:
    """One row per wave condition (prototype SI values); calm water: an empty list."""
    rows = []
    proto = case.prototype
    for i, w in enumerate(case.matrix.waves):
        if w.kind == "regular":
            if w.period is not None:
                period = float(w.period)
                length = float(waves.wave_length(period, proto.water_depth))
            else:
                length = float(w.length_ratio) * proto.length
                period = float(waves.wave_period(length, proto.water_depth))
            height = float(w.height) if w.height is not None else float(w.steepness) * length
            rows.append(dict(name=w.name or f"regular {i + 1}", kind="regular", period=period,
                             length=length, height=height, hs=math.nan, tp=math.nan,
                             spectrum="", gamma=math.nan, duration=math.nan))
        else:
            tp = float(w.peak_period)
            duration = DEFAULT_SEA_DURATION if w.duration is None else float(w.duration)
            rows.append(dict(name=w.name or f"irregular {i + 1}", kind="irregular",
                             period=math.nan,
                             length=float(waves.wave_length(tp, proto.water_depth)),
                             height=math.nan, hs=float(w.significant_height), tp=tp,
                             spectrum=w.spectrum,
                             gamma=float(w.gamma) if w.spectrum == "jonswap" else math.nan,
                             duration=duration))
    return rows


def reynolds_columns(case: Case) -> tuple[str, str]:
    """Headers of the model and prototype Reynolds numbers of the run matrix: the blade-
    section Re_0.7R for a propeller (the number its groups and checks use), V L / nu
    otherwise."""
    if body_class(case.prototype.kind) == "propeller":
        return ("model Reynolds number Re_0.7R [-]", "prototype Reynolds number Re_0.7R [-]")
    return ("model Reynolds number [-]", "prototype Reynolds number [-]")


#: Header of the model blade-section inflow speed at 0.7 R of a propeller's runs.
SECTION_SPEED_COLUMN = "model blade section speed at 0.7 R [m/s]"


def shows_froude(case: Case) -> bool:
    """Whether the runs carry Froude numbers: with a free surface, or when the request names
    the Froude number (a wind-tunnel run has none that means anything)."""
    req = case.request
    return case.facility.free_surface or "froude" in req.exact or "froude" in req.report


def _speed_columns(case: Case, solution: Solution, vp, vm, n_p) -> dict:
    """Speeds (prototype speeds also in the user's unit), Froude numbers where they mean
    something, Reynolds numbers at both scales (a propeller's at its 0.7 R blade section),
    rotation rates and current, per run (``vp``, ``vm``, ``n_p``: prototype and model speeds,
    prototype rotation rates)."""
    fac, spec, proto = case.facility, case.matrix, case.prototype
    lp = float(proto.length)
    lm = lp / float(solution.scale)
    n = vp.size
    nu_p = float(np.asarray(solution.prototype_fluid.kinematic_viscosity_si))
    nu_m = float(np.asarray(solution.model_fluid.kinematic_viscosity_si))
    cols: dict[str, object] = {}
    cols["prototype speed [m/s]"] = vp
    if case.speed_unit != "m/s":
        cols[case.speed_header] = vp / case.speed_unit_factor
    cols["model speed [m/s]"] = vm
    if shows_froude(case):
        cols["Froude number [-]"] = froude(vm, lm)
        cols["prototype Froude number [-]"] = froude(vp, lp)
    re_model, re_proto = reynolds_columns(case)
    rr = solution.rotation_ratio
    n_m = None if n_p is None else (n_p * rr if rr is not None else np.full(n, math.nan))
    if body_class(proto.kind) == "propeller" and n_p is not None:
        d_p = float(proto.dimension("diameter", lp))
        c_p = float(proto.dimension("blade_chord", d_p))  # the groups' chord (D when absent)
        scale = float(solution.scale)
        cols[re_model] = blade_reynolds(vm, n_m, d_p / scale, c_p / scale, nu_m)
        cols[re_proto] = blade_reynolds(vp, n_p, d_p, c_p, nu_p)
        cols[SECTION_SPEED_COLUMN] = blade_section_speed(vm, n_m, d_p / scale)
    else:
        cols[re_model] = reynolds(vm, lm, nu_m)
        cols[re_proto] = reynolds(vp, lp, nu_p)
    if fac.free_surface:
        cols["model depth Froude number [-]"] = froude(vm, fac.depth)
    if n_p is not None:
        cols["prototype rotation rate [1/s]"] = n_p
        cols["model rotation rate [1/s]"] = n_m
    if spec.current:
        cols["prototype current [m/s]"] = np.full(n, spec.current)
        cols["model current [m/s]"] = np.full(n, spec.current * solution.velocity_ratio)
    return cols


def _loading_columns(loads: list, i_l, scale: float) -> dict:
    """Draught, trim and displacement of each run's loading condition at both scales."""
    def at_both_scales(attr, power):
        v = np.array([getattr(ld, attr) if getattr(ld, attr) is not None else math.nan
                      for ld in loads], dtype=float)[i_l]
        return v, v / scale**power

    d_p, d_m = at_both_scales("draught", 1)
    t_p, t_m = at_both_scales("trim", 1)
    disp_p, disp_m = at_both_scales("displacement", 3)
    return {
        "prototype draught [m]": d_p, "model draught [m]": d_m,
        "prototype trim [m]": t_p, "model trim [m]": t_m,
        "prototype displacement [m^3]": disp_p, "model displacement [m^3]": disp_m,
    }


def _wave_columns(case: Case, wave_rows: list[dict], i_w, heading, vm, scale: float,
                  lm: float, notes: list[str]) -> dict:
    """Wave values of each run at both scales, the model's wave length in the basin's depth,
    steepness and encounter period (head seas when no heading is given)."""
    fac = case.facility
    n = vm.size
    sqrt_l = math.sqrt(scale)
    model_depth = fac.depth if fac.free_surface else None

    def wcol(key):
        return np.array([r[key] for r in wave_rows], dtype=float)[i_w]

    cols: dict[str, object] = {}
    cols["wave"] = np.array([r["name"] for r in wave_rows], dtype=object)[i_w]
    cols["wave kind"] = np.array([r["kind"] for r in wave_rows], dtype=object)[i_w]
    cols["spectrum"] = np.array([r["spectrum"] for r in wave_rows], dtype=object)[i_w]
    per_p, h_p = wcol("period"), wcol("height")
    hs_p, tp_p = wcol("hs"), wcol("tp")
    cols["prototype wave period [s]"] = per_p
    cols["model wave period [s]"] = per_p / sqrt_l
    cols["prototype wave height [m]"] = h_p
    cols["model wave height [m]"] = h_p / scale
    cols["prototype significant wave height [m]"] = hs_p
    cols["model significant wave height [m]"] = hs_p / scale
    cols["prototype peak period [s]"] = tp_p
    cols["model peak period [s]"] = tp_p / sqrt_l
    cols["JONSWAP gamma [-]"] = wcol("gamma")
    cols["prototype wave length [m]"] = wcol("length")
    # the basin's own depth sets the model wave length at the scaled period
    t_char_m = np.where(np.isfinite(per_p), per_p, tp_p) / sqrt_l
    lw_m = waves.wave_length(t_char_m, model_depth)
    cols["model wave length [m]"] = lw_m
    cols["wave length / model length [-]"] = lw_m / lm
    cols["model wave steepness [-]"] = np.where(np.isfinite(h_p), h_p / scale, hs_p / scale
                                                ) / lw_m
    om_m = 2.0 * math.pi / t_char_m
    head_eff = np.where(np.isfinite(heading), heading, 180.0)
    om_e = waves.encounter_frequency(om_m, vm, head_eff, model_depth)
    cols["model encounter period [s]"] = np.divide(2.0 * math.pi, om_e,
                                                   out=np.full(n, math.inf),
                                                   where=om_e > 0)
    dur_p = wcol("duration")
    cols["prototype sea duration [s]"] = dur_p
    cols["model sea duration [s]"] = dur_p / sqrt_l
    if not np.isfinite(heading).any():
        notes.append("headings not given: encounter periods are for head seas (180 deg)")
    return cols


def _timing_columns(case: Case, vm, lm: float, scale: float, cols: dict, notes: list[str]):
    """Run distance and time of each run, its overhead (acceleration and braking) and the
    runs it needs: (columns, t_run [s], t_overhead [s], runs needed).

    ``cols``: the columns so far (the wave columns, when there are waves, set the
    station-keeping time and the encounters per run)."""
    fac = case.facility
    n = vm.size
    if not fac.free_surface:
        dwell = max(DEFAULT_TUNNEL_DWELL, fac.min_steady_time or 0.0)
        t_run = np.full(n, dwell)
        # the 60 s dwell is from memory
        notes.append(f"tunnel dwell {dwell:g} s per point (common practice, or "
                     "the facility's minimum steady time)")
        timing = {"run distance [m]": np.full(n, math.nan), "run time [s]": t_run,
                  "run feasible": np.ones(n, dtype=bool)}
        return timing, t_run, np.zeros(n), np.ones(n, dtype=int)
    acc = fac.acceleration if fac.acceleration else DEFAULT_ACCELERATION
    dec = fac.deceleration if fac.deceleration else acc
    if not fac.acceleration:
        notes.append(f"carriage acceleration and braking {acc:g} m/s^2 assumed "
                     "(common practice)")  # 0.5 m/s^2: from memory
    runs_needed = np.ones(n, dtype=int)
    moving = vm > 0
    x_acc = np.square(vm) / (2.0 * acc)
    x_dec = np.square(vm) / (2.0 * dec)
    x_run = np.where(moving, fac.length - lm - x_acc - x_dec, 0.0)
    feasible = ~moving | (x_run > 0)
    x_run = np.maximum(x_run, 0.0)
    with np.errstate(divide="ignore", invalid="ignore"):
        t_run = np.where(moving, x_run / np.where(moving, vm, 1.0), 0.0)
    t_overhead = np.where(moving, vm / acc + vm / dec, 0.0)
    if fac.min_steady_time:
        # the facility's shortest steady measuring time is a hard limit of a run
        feasible &= ~moving | (t_run >= fac.min_steady_time)
    timing: dict[str, object] = {}
    if "wave kind" in cols:
        regular = cols["wave kind"] == "regular"
        enc_t = cols["model encounter period [s]"]
        # station keeping: regular waves for N cycles, irregular for the whole sea
        t_station = np.where(regular, DEFAULT_REGULAR_CYCLES * enc_t,
                             cols["model sea duration [s]"])
        t_run = np.where(moving, t_run, t_station)
        with np.errstate(divide="ignore", invalid="ignore"):
            timing["wave encounters per run [-]"] = np.where(enc_t > 0, t_run / enc_t, 0.0)
        _, nr = waves.runs_for_duration(cols["prototype sea duration [s]"], scale, t_run)
        runs_needed = np.where(~regular & moving, nr, 1)
        runs_needed = np.where(feasible, runs_needed, 0)
        if (~moving & regular).any():
            notes.append(f"station-keeping runs in regular waves: {DEFAULT_REGULAR_CYCLES}"
                         " encounter cycles (common practice)")  # from memory
    timing["acceleration distance [m]"] = np.where(moving, x_acc, 0.0)
    timing["stopping distance [m]"] = np.where(moving, x_dec, 0.0)
    timing["run distance [m]"] = np.where(moving, x_run, 0.0)
    timing["run time [s]"] = t_run
    timing["run feasible"] = feasible
    return timing, t_run, t_overhead, runs_needed


def _waiting_time(case: Case, has_waves: bool, notes: list[str]) -> float:
    """Waiting time between runs [s]: the case's, or the facility kind's default."""
    spec, fac = case.matrix, case.facility
    if spec.waiting_time is not None:
        return float(spec.waiting_time)
    key = fac.kind + ("_waves" if fac.kind == "towing_tank" and has_waves else "")
    wait = DEFAULT_WAITING_TIME[key]
    # the default waiting times are from memory
    notes.append(f"waiting time between runs {wait / 60:g} min (common practice: water to "
                 "calm / flow to settle)")
    return wait


def runs_needed(matrix) -> int:
    """Runs the facility makes for a run matrix [-]: the sum of its "runs needed" column (an
    irregular sea longer than one run takes several), or one per row.

    A matrix row is a test condition; this is the count to book, which the summary and the
    Overview give beside the number of rows.
    """
    if "runs needed [-]" in matrix:
        return int(matrix["runs needed [-]"].sum())
    return len(matrix)


def runs_text(matrix) -> str:
    """The run counts in words: "42 runs (one per condition)" or "12 conditions, 110 runs"."""
    rows, runs = len(matrix), runs_needed(matrix)
    if rows == runs:
        return f"{runs} runs (one per condition)"
    return f"{rows} conditions (run-matrix rows), {runs} runs needed"


def facility_time_hours(matrix) -> float:
    """Total facility time [h] of a run matrix: runs x (run, acceleration, braking, waiting),
    the loading changes and the wave calibrations.

    Parameters
    ----------
    matrix : pandas.DataFrame or dict
        As returned by :func:`build_matrix`, or the columns of :func:`matrix_columns`.

    Returns
    -------
    float
        Hours of facility time (excluding the set-up before the first run).
    """
    if "facility time [s]" in matrix:
        return float(matrix["facility time [s]"].sum()) / 3600.0
    total = np.nansum(matrix["run time [s]"]) + np.nansum(matrix["waiting time [s]"])
    return float(total) / 3600.0

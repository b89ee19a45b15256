"""The run matrix: every run the facility makes, with model and prototype values and timing.

``build_matrix(case, solution)`` crosses speeds x loading conditions x headings x waves x
repeats, scales each to the model with the solver's scale and speed ratio, and estimates the
run time, run distance and waiting time of each run. ``facility_time_hours`` adds them up for
booking the facility.

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
irregular seas 3 h full scale (offshore practice).

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

from similitude.constants import G0, KNOT
from similitude.correlations import waves
from similitude.dimensional.numbers import froude, reynolds
from similitude.errors import InputError

SPEED_BASES = ("prototype", "froude", "model")
WAVE_KINDS = ("regular", "irregular")

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


def _speeds(case, solution):
    """Prototype and model speed arrays [m/s] and the rotation rates [1/s] of the spec."""
    spec = case.matrix
    proto = case.prototype
    basis = spec.speed_basis
    if basis not in SPEED_BASES:
        raise InputError(f"matrix.speed_basis: {basis!r} is unknown; expected one of "
                         + ", ".join(SPEED_BASES))
    values = np.asarray(spec.speeds if spec.speeds else proto.speeds, dtype=float)
    if not spec.speeds:
        basis = "prototype"
    bad = ~np.isfinite(values) | (values < 0)
    if bad.any():
        i = int(np.argmax(bad))
        raise InputError(f"matrix.speeds[{i}]: {values[i]!r} is not valid; expected a "
                         "finite speed >= 0")
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


def _wave_table(case, scale):
    """One row per wave condition (prototype SI values); calm water: an empty list."""
    rows = []
    proto = case.prototype
    for i, w in enumerate(case.matrix.waves):
        where = f"matrix.waves[{i}]"
        if w.kind not in WAVE_KINDS:
            raise InputError(f"{where}.kind: {w.kind!r} is unknown; expected one of "
                             + ", ".join(WAVE_KINDS))
        if w.kind == "regular":
            if w.period is None and w.length_ratio is None:
                raise InputError(f"{where}.period: missing; expected a period or a "
                                 "length_ratio")
            if w.height is None and w.steepness is None:
                raise InputError(f"{where}.height: missing; expected a height or a steepness")
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
            if w.significant_height is None or w.peak_period is None:
                raise InputError(f"{where}: irregular sea needs significant_height and "
                                 "peak_period")
            if w.spectrum not in waves.SPECTRA:
                raise InputError(f"{where}.spectrum: {w.spectrum!r} is unknown; expected "
                                 "one of " + ", ".join(waves.SPECTRA))
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


def build_matrix(case, solution):
    """The run matrix of a case for a solved scale and speed ratio.

    Parameters
    ----------
    case : similitude.planning.case.Case
        The case; ``case.matrix`` (MatrixSpec) says what runs to make.
    solution : similitude.planning.solution.Solution
        Scale lambda [-], velocity ratio V_m/V_p [-], model and prototype fluid states.

    Returns
    -------
    pandas.DataFrame
        One row per run (speeds x loading x headings x waves x repeats, in that nesting
        order, repeats innermost). Columns carry units in brackets: run identification,
        prototype and model speeds, Froude and Reynolds numbers, loading and wave values at
        both scales, encounter counts, run time, run distance, waiting time, the number of
        runs each row needs and its facility time. ``DataFrame.attrs["notes"]`` lists the
        defaults assumed.

    Raises
    ------
    InputError
        For an unknown speed basis or wave kind, a missing wave parameter, repeats < 1.

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
    proto = case.prototype
    fac = case.facility
    scale = float(solution.scale)
    if not (math.isfinite(scale) and scale > 0):
        raise InputError(f"solution.scale: {scale!r} is not valid; expected a positive number")
    repeats = int(spec.repeats)
    if repeats < 1 or repeats != spec.repeats:
        raise InputError(f"matrix.repeats: {spec.repeats!r} is not valid; expected an "
                         "integer >= 1")
    if not (math.isfinite(spec.current) and spec.current >= 0):
        raise InputError(f"matrix.current: {spec.current!r} is not valid; expected a speed "
                         ">= 0")
    if spec.waiting_time is not None and not (math.isfinite(spec.waiting_time)
                                              and spec.waiting_time >= 0):
        raise InputError(f"matrix.waiting_time: {spec.waiting_time!r} is not valid; "
                         "expected a time >= 0")
    notes = []

    lp = float(proto.length)
    lm = lp / scale
    sqrt_l = math.sqrt(scale)
    vp_s, vm_s, np_s = _speeds(case, solution)
    loads = list(spec.loading) or [None]
    heads = list(spec.headings) or [math.nan]
    wave_rows = _wave_table(case, scale)
    has_waves = bool(wave_rows)
    wlist = wave_rows or [None]

    ns, nl, nh, nw = len(vp_s), len(loads), len(heads), len(wlist)
    shape = (ns, nl, nh, nw, repeats)
    idx = np.indices(shape).reshape(5, -1)
    i_s, i_l, i_h, i_w, i_r = idx
    n = i_s.size

    vp = vp_s[i_s]
    vm = vm_s[i_s]
    nu_p = float(np.asarray(solution.prototype_fluid.kinematic_viscosity_si))
    nu_m = float(np.asarray(solution.model_fluid.kinematic_viscosity_si))

    cols: dict[str, object] = {}
    cols["run"] = np.arange(1, n + 1)
    cols["repeat"] = i_r + 1
    cols["speed index"] = i_s + 1
    names = np.array([ld.name if ld is not None else "design" for ld in loads], dtype=object)
    cols["loading"] = names[i_l]
    cols["heading [deg]"] = np.asarray(heads, dtype=float)[i_h]
    cols["prototype speed [m/s]"] = vp
    cols["prototype speed [kn]"] = vp / KNOT
    cols["model speed [m/s]"] = vm
    cols["Froude number [-]"] = froude(vm, lm)
    cols["prototype Froude number [-]"] = froude(vp, lp)
    cols["model Reynolds number [-]"] = reynolds(vm, lm, nu_m)
    cols["prototype Reynolds number [-]"] = reynolds(vp, lp, nu_p)
    if fac.free_surface:
        cols["model depth Froude number [-]"] = froude(vm, fac.depth)
    if np_s is not None:
        rr = solution.rotation_ratio
        cols["prototype rotation rate [1/s]"] = np_s[i_s]
        cols["model rotation rate [1/s]"] = (np_s[i_s] * rr if rr is not None
                                             else np.full(n, math.nan))
    if spec.current:
        cols["prototype current [m/s]"] = np.full(n, spec.current)
        cols["model current [m/s]"] = np.full(n, spec.current * solution.velocity_ratio)
    if spec.loading:
        def ld_arr(attr, power):
            v = np.array([getattr(ld, attr) if getattr(ld, attr) is not None else math.nan
                          for ld in loads], dtype=float)[i_l]
            return v, v / scale**power

        d_p, d_m = ld_arr("draught", 1)
        t_p, t_m = ld_arr("trim", 1)
        disp_p, disp_m = ld_arr("displacement", 3)
        cols["prototype draught [m]"], cols["model draught [m]"] = d_p, d_m
        cols["prototype trim [m]"], cols["model trim [m]"] = t_p, t_m
        cols["prototype displacement [m^3]"] = disp_p
        cols["model displacement [m^3]"] = disp_m

    # --- waves ---------------------------------------------------------------------------
    model_depth = fac.depth if fac.free_surface else None
    if has_waves:
        def wcol(key):
            return np.array([r[key] for r in wave_rows], dtype=float)[i_w]

        kinds = np.array([r["kind"] for r in wave_rows], dtype=object)[i_w]
        cols["wave"] = np.array([r["name"] for r in wave_rows], dtype=object)[i_w]
        cols["wave kind"] = kinds
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
        lw_p = wcol("length")
        cols["prototype wave length [m]"] = lw_p
        # the basin's own depth sets the model wave length at the scaled period
        t_char_m = np.where(np.isfinite(per_p), per_p, tp_p) / sqrt_l
        lw_m = waves.wave_length(t_char_m, model_depth)
        cols["model wave length [m]"] = lw_m
        cols["wave length / model length [-]"] = lw_m / lm
        cols["model wave steepness [-]"] = np.where(np.isfinite(h_p), h_p / scale, hs_p / scale
                                                    ) / lw_m
        om_m = 2.0 * math.pi / t_char_m
        head = cols["heading [deg]"]
        head_eff = np.where(np.isfinite(head), head, 180.0)
        om_e = waves.encounter_frequency(om_m, vm, head_eff, model_depth)
        cols["model encounter period [s]"] = np.divide(2.0 * math.pi, om_e,
                                                       out=np.full(n, math.inf),
                                                       where=om_e > 0)
        dur_p = wcol("duration")
        cols["prototype sea duration [s]"] = dur_p
        cols["model sea duration [s]"] = dur_p / sqrt_l
        if not np.isfinite(head).any():
            notes.append("headings not given: encounter periods are for head seas (180 deg)")

    # --- timing --------------------------------------------------------------------------
    acc = fac.acceleration if fac.acceleration else DEFAULT_ACCELERATION
    dec = fac.deceleration if fac.deceleration else acc
    if not fac.acceleration and fac.free_surface:
        notes.append(f"carriage acceleration and braking {acc:g} m/s^2 assumed "
                     "(common practice, from memory)")
    runs_needed = np.ones(n, dtype=int)
    if fac.free_surface:
        moving = vm > 0
        x_acc = np.square(vm) / (2.0 * acc)
        x_dec = np.square(vm) / (2.0 * dec)
        x_run = np.where(moving, fac.length - lm - x_acc - x_dec, 0.0)
        feasible = ~moving | (x_run > 0)
        x_run = np.maximum(x_run, 0.0)
        with np.errstate(divide="ignore", invalid="ignore"):
            t_run = np.where(moving, x_run / np.where(moving, vm, 1.0), 0.0)
        t_overhead = np.where(moving, vm / acc + vm / dec, 0.0)
        min_t = getattr(fac, "min_steady_time", None)
        if min_t:
            # the facility's shortest steady measuring time is a hard limit of a run
            feasible &= ~moving | (t_run >= min_t)
        if has_waves:
            regular = kinds == "regular"
            enc_t = cols["model encounter period [s]"]
            # station keeping: regular waves for N cycles, irregular for the whole sea
            t_station = np.where(regular, DEFAULT_REGULAR_CYCLES * enc_t,
                                 cols["model sea duration [s]"])
            t_run = np.where(moving, t_run, t_station)
            with np.errstate(divide="ignore", invalid="ignore"):
                cols["wave encounters per run [-]"] = np.where(enc_t > 0, t_run / enc_t, 0.0)
            irr = ~regular
            _, nr = waves.runs_for_duration(cols["prototype sea duration [s]"], scale, t_run)
            runs_needed = np.where(irr & moving, nr, 1)
            runs_needed = np.where(feasible, runs_needed, 0)
            if (~moving & regular).any():
                notes.append(f"station-keeping runs in regular waves: {DEFAULT_REGULAR_CYCLES}"
                             " encounter cycles (common practice, from memory)")
        cols["acceleration distance [m]"] = np.where(moving, x_acc, 0.0)
        cols["stopping distance [m]"] = np.where(moving, x_dec, 0.0)
        cols["run distance [m]"] = np.where(moving, x_run, 0.0)
        cols["run time [s]"] = t_run
        cols["run feasible"] = feasible
    else:
        dwell = max(DEFAULT_TUNNEL_DWELL, getattr(fac, "min_steady_time", None) or 0.0)
        t_run = np.full(n, dwell)
        t_overhead = np.zeros(n)
        cols["run distance [m]"] = np.full(n, math.nan)
        cols["run time [s]"] = t_run
        cols["run feasible"] = np.ones(n, dtype=bool)
        notes.append(f"tunnel dwell {dwell:g} s per point (common practice, from memory, or "
                     "the facility's minimum steady time)")
    if any(w.kind == "irregular" and w.duration is None for w in spec.waves):
        notes.append(f"irregular seas: {DEFAULT_SEA_DURATION / 3600:g} h full-scale duration "
                     "assumed (offshore common practice, from memory)")

    if spec.waiting_time is not None:
        wait = float(spec.waiting_time)
    else:
        key = fac.kind + ("_waves" if fac.kind == "towing_tank" and has_waves else "")
        wait = DEFAULT_WAITING_TIME[key]
        notes.append(f"waiting time between runs {wait / 60:g} min (common practice, from "
                     "memory: water to calm / flow to settle)")
    cols["waiting time [s]"] = np.full(n, wait)
    cols["runs needed [-]"] = runs_needed
    cols["facility time [s]"] = runs_needed * (t_run + t_overhead + wait)
    df = pd.DataFrame(cols)
    df.attrs["notes"] = tuple(notes)
    df.attrs["scale"] = scale
    return df


def facility_time_hours(matrix) -> float:
    """Total facility time [h] of a run matrix: runs x (run, acceleration, braking, waiting).

    Parameters
    ----------
    matrix : pandas.DataFrame
        As returned by :func:`build_matrix`.

    Returns
    -------
    float
        Hours of facility time (excluding set-up, calibration and model changes).
    """
    if "facility time [s]" in matrix:
        return float(matrix["facility time [s]"].sum()) / 3600.0
    total = matrix["run time [s]"].fillna(0).sum() + matrix["waiting time [s]"].fillna(0).sum()
    return float(total) / 3600.0

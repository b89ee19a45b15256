"""Planning a self-propulsion test: tow force, expected propeller loading, dynamometer checks.

For a case with ``test = "self_propulsion"`` the planner adds, per planned speed:

* the skin-friction correction force F_D at model scale (the tow force that puts the model
  propeller at the ship's loading; :func:`similitude.correlations.propulsion.
  friction_correction_force`, ITTC 7.5-02-03-01.4 Rev 04 2017 and 7.5-02-03-01.1 Rev 04 2011);
* when an open-water curve and a resistance estimate are available, the expected model
  propeller rate of revolution, thrust and torque at the ship self-propulsion point (and at
  every tow force of the load-varying method), from

      T_M (1 - t) = R_TM - F,   K_T/J² = T_M / (ρ_M D_M² V_M² (1 - w_TM)²),

  J read off the model open-water curve at that loading, n_M = V_M (1 - w_TM)/(J D_M) and
  Q_M = K_Q(J) ρ_M n_M² D_M⁵ / η_R;
* checks of those figures against the propeller dynamometer (rotation rate, thrust, torque);
* the run-sheet columns: F_D, the tow force to apply, the expected rotation rate (1/s and rpm),
  thrust and torque.

Where the case gives no propulsion factors they are estimated from the block coefficient:
Taylor's wake fraction w = 0.50 C_B - 0.05 (single screw) or 0.55 C_B - 0.20 (twin screw) [3]_,
the thrust deduction t = 0.6 w (t = k w with k = 0.5 to 0.7 for a streamlined rudder, after
Schoenherr [4]_) and η_R = 1 (common practice). Both are from memory of the textbooks (medium
confidence) and only size the dynamometer: the test measures the real values.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.1, "Propulsion/Bollard Pull
       Test", Rev 04, 2011 (skin friction correction force; load varying method).
.. [2] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 04, 2017.
.. [3] Taylor, D. W., "The Speed and Power of Ships", 1910 (2nd ed. 1933); the formulas as
       quoted by Harvald, S. A., "Resistance and Propulsion of Ships", Wiley, 1983, ch. 5.
.. [4] Lewis, E. V. (ed.), "Principles of Naval Architecture", 2nd rev., Vol. II, SNAME, 1988,
       ch. 6 (thrust deduction, Schoenherr's k factor).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np
import pandas as pd

from similitude.constants import G0, KNOT
from similitude.correlations import friction as _friction
from similitude.correlations.ittc78 import correlation_allowance_note
from similitude.correlations.propulsion import friction_correction_force
from similitude.errors import InputError
from similitude.planning.case import Case
from similitude.planning.findings import Check, judge
from similitude.planning.propulsion_spec import PropulsionSpec
from similitude.planning.solution import Solution
from similitude.prediction.extrapolation import (
    ExtrapolationOptions,
    ShipParticulars,
    extrapolate,
    ship_si,
)
from similitude.prediction.open_water_curve import OpenWaterCurve
from similitude.prediction.power import loglog_interp

#: Taylor's wake fraction w = a C_B + b by number of propellers (1 or 2) [3]_.
TAYLOR_WAKE = {1: (0.50, -0.05), 2: (0.55, -0.20)}

#: Thrust deduction over wake fraction, t = k w, when the case gives no t [4]_.
THRUST_DEDUCTION_RATIO = 0.6

#: η_R when the case gives none (common practice: 1.0 to 1.05 single screw, about 1 twin).
DEFAULT_ROTATIVE_EFFICIENCY = 1.0

FORM_STATEMENTS = {
    "revised": "F_D = 0.5 rho_M V_M^2 S_M [(1+k) C_FM - (S+S_BK)/S ((1+k) C_FS + dC_F) - C_A "
               "- C_AAS], i.e. 0.5 rho_M V_M^2 S_M (C_TM - C_TS): the revised ITTC-1978 method "
               "(ITTC 7.5-02-03-01.4 Rev 04, 2017; 7.5-02-03-01.1 Rev 04, 2011)",
    "1978": "F_D = 0.5 rho_M V_M^2 S_M [(1+k)(C_FM - C_FS) - dC_F]: the original 1978 form "
            "(ITTC 7.5-02-03-01.4 Rev 00, 1999)",
}

_SOURCE = "ITTC 7.5-02-03-01.1 (2011) / facility data"


@dataclass(frozen=True, eq=False)  # holds DataFrames
class SelfPropulsionPlan:
    """The self-propulsion part of a plan.

    Attributes
    ----------
    speeds : pandas.DataFrame
        One row per planned speed: prototype and model speed, model Froude number, C_FM, C_FS,
        ΔC_F, C_A, C_AAS, the skin-friction correction F_D [N], and when estimated the model
        resistance R_TM [N], advance ratio, rotation rate [1/s] and [rpm], thrust [N] and
        torque [N m] at the ship self-propulsion point.
    runs : pandas.DataFrame
        The run matrix with the self-propulsion columns (one row per tow force per run of the
        plain matrix when load-varying).
    form_factor : float
        k used for F_D [-].
    form_factor_source : str
    wake_fraction, thrust_deduction, rotative_efficiency : float or None
        The propulsion factors used for the expected figures (None: none estimated).
    factors_source : str
    friction_correction : str
        The form of F_D used, as an equation with its procedure and revision.
    checks : tuple of Check
        Dynamometer checks (rotation rate, thrust, torque).
    notes : tuple of str
    curve : OpenWaterCurve or None
        The model propeller's open-water curve used.
    """

    speeds: Any
    runs: Any
    form_factor: float
    form_factor_source: str
    wake_fraction: float | None
    thrust_deduction: float | None
    rotative_efficiency: float | None
    factors_source: str
    friction_correction: str
    checks: tuple[Check, ...]
    notes: tuple[str, ...]
    curve: OpenWaterCurve | None = None


# -- inputs -----------------------------------------------------------------------------------


def _ship(case: Case, scale: float) -> ShipParticulars:
    if "wetted_surface" not in case.prototype.dimensions:
        raise InputError("prototype.sizes.wetted_surface: missing; a self-propulsion test needs "
                         "the ship's wetted surface for the tow force F_D (e.g. "
                         "wetted_surface = '1450 m^2')")
    return ShipParticulars.from_case(case, scale)


def open_water_curve(spec: PropulsionSpec) -> OpenWaterCurve | None:
    """The model propeller's open-water curve of a spec: measured runs faired by a cubic (or
    lower, with few runs), or the polynomials given; None when the spec has neither."""
    if spec.open_water is not None:
        ow = spec.open_water
        distinct = np.unique(np.round(ow.advance_ratio, 9)).size
        return OpenWaterCurve.fit(ow.advance_ratio, ow.thrust_coefficient,
                                  ow.torque_coefficient, degree=max(1, min(3, distinct - 1)),
                                  source=ow.source or "open-water runs")
    if not spec.thrust_polynomial:
        return None
    roots = np.polynomial.polynomial.polyroots(np.asarray(spec.thrust_polynomial, float))
    zero = [float(r.real) for r in np.atleast_1d(roots) if abs(r.imag) < 1e-12 and r.real > 0]
    if not zero:
        raise InputError(f"propulsion.thrust_polynomial: {list(spec.thrust_polynomial)!r} "
                         "never reaches K_T = 0 at a positive J; expected K_T falling with J")
    return OpenWaterCurve(np.asarray(spec.thrust_polynomial, float),
                          np.asarray(spec.torque_polynomial, float), (0.0, min(zero)),
                          "polynomials given")


def _form_factor(case: Case, spec: PropulsionSpec, ship: ShipParticulars):
    """(k, source, resistance extrapolation or None)."""
    given = spec.form_factor if spec.form_factor is not None else case.request.form_factor
    source = ("propulsion.form_factor" if spec.form_factor is not None
              else "matching.form_factor" if given is not None else "")
    extrapolation = None
    if spec.resistance_runs is not None:
        extrapolation = extrapolate(spec.resistance_runs, ship,
                                    ExtrapolationOptions(form_factor=given))
        if given is None:
            given = extrapolation.form_factor
            source = "Prohaska's fit of the resistance test"
    if given is None:
        return 0.0, "none given: k = 0 (Froude's method) assumed", None
    return float(given), source, extrapolation


def _factors(case: Case, spec: PropulsionSpec) -> tuple[Any, Any, Any, str]:
    """(w_TM, t, η_R, source); w and t None when neither given nor estimable."""
    w, t, eta = spec.wake_fraction, spec.thrust_deduction, spec.rotative_efficiency
    parts = []
    if w is None:
        dims = case.prototype.dimensions
        if all(k in dims for k in ("displacement", "beam", "draught")):
            cb = dims["displacement"] / (case.prototype.length * dims["beam"] * dims["draught"])
            a, b = TAYLOR_WAKE[1 if spec.propellers == 1 else 2]
            w = max(0.0, a * cb + b)
            parts.append(f"w_TM = {a:g} C_B {b:+g} = {w:.3f} with C_B = {cb:.3f} (Taylor's "
                         "formula, an estimate)")
    else:
        parts.append(f"w_TM = {w:g} (given)")
    if t is None and w is not None:
        t = THRUST_DEDUCTION_RATIO * w
        parts.append(f"t = {THRUST_DEDUCTION_RATIO:g} w = {t:.3f} (Schoenherr's t = k w, an "
                     "estimate)")
    elif t is not None:
        parts.append(f"t = {t:g} (given)")
    if eta is None:
        eta = DEFAULT_ROTATIVE_EFFICIENCY
        parts.append(f"eta_R = {eta:g} (common practice)")
    else:
        parts.append(f"eta_R = {eta:g} (given)")
    return w, t, eta, "; ".join(parts)


def _mean_by_value(x: np.ndarray, y: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """x sorted and unique (to 1e-9 relative), with y averaged over equal x."""
    key = np.round(x / x.max(), 9)
    ux, inv = np.unique(key, return_inverse=True)
    counts = np.bincount(inv)
    return (np.bincount(inv, weights=x) / counts, np.bincount(inv, weights=y) / counts)


# -- the figures ------------------------------------------------------------------------------


def _resistance_cr(spec: PropulsionSpec, extrapolation, fn, v_m, k, ship, options,
                   notes: list[str]) -> np.ndarray | None:
    """C_R at the planned Froude numbers from the resistance source, or None."""
    if extrapolation is not None:
        a = extrapolation.arrays
        xs, ys = _mean_by_value(a["froude"], a["cr"])
        if np.any(fn < xs[0] * (1 - 1e-9)) or np.any(fn > xs[-1] * (1 + 1e-9)):
            notes.append(f"Some planned Froude numbers lie outside the resistance test's "
                         f"({xs[0]:.3f} to {xs[-1]:.3f}): C_R is taken at the nearest end.")
        notes.append(f"Resistance estimate: C_R of the resistance test "
                     f"({spec.resistance_runs.source or 'runs given'}, ITTC-1978 extrapolation) "
                     "interpolated in Froude number.")
        return np.interp(fn, xs, ys)
    if not spec.resistance_speeds:
        return None
    vs_given, r_given = _mean_by_value(np.asarray(spec.resistance_speeds, float),
                                       np.asarray(spec.resistance_values, float))
    v_s = v_m * np.sqrt(ship.scale)
    if np.any(v_s < vs_given[0] * (1 - 1e-9)) or np.any(v_s > vs_given[-1] * (1 + 1e-9)):
        notes.append("Some planned speeds lie outside the resistance estimate's: its "
                     "power law through the nearest two points is extended.")
    r_ts = loglog_interp(v_s, vs_given, r_given)
    s = ship_si(v_m, np.zeros_like(v_m), k, ship, options)
    cts = r_ts / (0.5 * s["rho_s"] * ship.wetted_surface * v_s**2)
    notes.append("Resistance estimate: the full-scale R_TS given (propulsion.resistance_"
                 "estimate), interpolated log-log in speed; C_R = C_TS - (1+k) C_FS - dC_F - "
                 "C_A - C_AAS.")
    return cts - s["cts"]


def operating_point(curve: OpenWaterCurve, resistance, tow_force, speed, density, diameter,
                    wake, thrust_deduction_fraction, eta_r) -> dict[str, np.ndarray]:
    """The model propeller's expected operating point at a tow force (SI arrays).

    T = (R_TM - F)/(1 - t); K_T/J² = T/(ρ D² V²(1 - w)²); J on the curve; n = V(1 - w)/(J D);
    Q = K_Q(J) ρ n² D⁵/η_R. Where T <= 0 or the loading is off the curve the values are NaN.

    Returns
    -------
    dict
        ``thrust`` [N], ``loading`` [-], ``advance_ratio`` [-], ``rotation_rate`` [1/s],
        ``torque`` [N m], ``on_curve`` (bool).
    """
    thrust = (np.asarray(resistance, float) - np.asarray(tow_force, float)) / (
        1.0 - thrust_deduction_fraction)
    va = np.asarray(speed, float) * (1.0 - wake)
    loaded = thrust > 0
    loading = np.where(loaded, thrust, np.nan) / (density * diameter**2 * va**2)
    j, inside = curve.advance_ratio_at_loading(np.where(loaded, loading, 1.0))
    ok = loaded & inside & (j > 0)
    j = np.where(ok, j, np.nan)
    n = va / (j * diameter)
    torque = curve.kq(j) * density * n**2 * diameter**5 / eta_r
    return {"thrust": np.where(loaded, thrust, np.nan), "loading": loading,
            "advance_ratio": j, "rotation_rate": n, "torque": torque, "on_curve": ok}


def plan_self_propulsion(case: Case, solution: Solution, matrix) -> SelfPropulsionPlan:
    """The self-propulsion part of a plan: F_D per speed, expected loading, checks, run columns.

    Parameters
    ----------
    case : Case
        With ``case.propulsion`` (a :class:`PropulsionSpec`; an empty one when None).
    solution : Solution
        The solved scale and model fluid.
    matrix : pandas.DataFrame
        The plain run matrix (:func:`similitude.planning.matrix.build_matrix`).

    Returns
    -------
    SelfPropulsionPlan

    Raises
    ------
    InputError
        The prototype lacks its wetted surface; inputs of the spec that do not fit together.
    """
    spec = case.propulsion or PropulsionSpec()
    scale = float(solution.scale)
    ship = _ship(case, scale)
    options = ExtrapolationOptions()
    notes: list[str] = [FORM_STATEMENTS[spec.friction_correction] + "."]
    k, k_source, extrapolation = _form_factor(case, spec, ship)
    notes.append(f"Form factor for F_D: k = {k:.4f} ({k_source}).")
    rho_m = float(np.asarray(solution.model_fluid.density_si))
    nu_m = float(np.asarray(solution.model_fluid.kinematic_viscosity_si))
    vp_rows = matrix["prototype speed [m/s]"].to_numpy(float)
    vp, row_speed = np.unique(vp_rows, return_inverse=True)
    v_m = vp * float(solution.velocity_ratio)
    if np.any(v_m <= 0):
        raise InputError("runs.speeds: a self-propulsion test needs model speeds > 0")
    lm, sm = ship.model_length, ship.model_wetted_surface
    fn = v_m / np.sqrt(G0 * lm)
    cfm = np.asarray(_friction.friction_coefficient(v_m * lm / nu_m, options.friction_line))
    s = ship_si(v_m, np.zeros_like(v_m), k, ship, options)
    f_d = np.asarray(friction_correction_force(
        rho_m, v_m, sm, cfm, s["cfs"], k, s["dcf"], s["ca"], s["caas"], s["bk_factor"],
        spec.friction_correction))
    speeds = pd.DataFrame({
        "prototype speed [m/s]": vp, "prototype speed [kn]": vp / KNOT,
        "model speed [m/s]": v_m, "Froude number [-]": fn, "C_FM [-]": cfm,
        "C_FS [-]": s["cfs"], "roughness allowance dC_F [-]": s["dcf"],
        "correlation allowance C_A [-]": s["ca"],
        "air resistance C_AAS [-]": np.full(vp.size, s["caas"]),
        "skin-friction correction F_D [N]": f_d,
    })
    negative = correlation_allowance_note(s["ca"], s["re_s"])
    if negative:
        notes.append(negative)
    curve = open_water_curve(spec)
    cr = _resistance_cr(spec, extrapolation, fn, v_m, k, ship, options, notes)
    w, t, eta, factors_source = _factors(case, spec)
    d_m = None if spec.propeller_diameter is None else spec.propeller_diameter / scale
    missing = _missing_inputs(spec, curve, cr, w, d_m)
    factors = np.asarray(spec.tow_force_factors, float)
    runs = _expand(matrix, factors)
    r_tm = None
    if cr is not None:
        r_tm = 0.5 * rho_m * v_m**2 * sm * ((1.0 + k) * cfm + cr)
        speeds["model resistance R_TM [N]"] = r_tm
    row_of_run = np.repeat(row_speed, factors.size)
    f_run = np.tile(factors, len(matrix)) * f_d[row_of_run]
    if spec.load_varying:
        runs.insert(list(runs.columns).index("speed index") + 1, "tow force factor [-]",
                    np.tile(factors, len(matrix)))
    runs["skin-friction correction F_D [N]"] = f_d[row_of_run]
    runs["tow force [N]"] = f_run
    if not missing:
        notes.append("Propulsion factors for the expected figures: " + factors_source + ".")
        point = operating_point(curve, r_tm, f_d, v_m, rho_m, d_m, w, t, eta)
        for key, col in (("advance_ratio", "expected advance ratio J [-]"),
                         ("rotation_rate", "expected rotation rate [1/s]"),
                         ("thrust", "expected thrust [N]"), ("torque", "expected torque [N m]")):
            speeds[col] = point[key]
        speeds.insert(list(speeds.columns).index("expected thrust [N]"),
                      "expected rotation rate [rpm]", point["rotation_rate"] * 60.0)
        at_run = operating_point(curve, r_tm[row_of_run], f_run, v_m[row_of_run], rho_m, d_m,
                                 w, t, eta)
        runs["expected rotation rate [1/s]"] = at_run["rotation_rate"]
        runs["expected rotation rate [rpm]"] = at_run["rotation_rate"] * 60.0
        runs["expected thrust [N]"] = at_run["thrust"]
        runs["expected torque [N m]"] = at_run["torque"]
        _point_notes(at_run, notes)
    else:
        notes.append("No expected rotation rate, thrust or torque: " + "; ".join(missing)
                     + ".")
    if spec.load_varying:
        notes.append("Load-varying method: " + ", ".join(f"{f:g}" for f in factors)
                     + " F_D at each speed (ITTC 7.5-02-03-01.1); the self-propulsion point "
                     "is interpolated at F_D in the analysis.")
    checks = _dynamometer_checks(case, runs, missing)
    runs.attrs = dict(matrix.attrs)
    return SelfPropulsionPlan(
        speeds=speeds, runs=runs, form_factor=k, form_factor_source=k_source,
        wake_fraction=None if missing else w, thrust_deduction=None if missing else t,
        rotative_efficiency=None if missing else eta, factors_source=factors_source,
        friction_correction=FORM_STATEMENTS[spec.friction_correction], checks=checks,
        notes=tuple(notes), curve=curve)


def _missing_inputs(spec, curve, cr, w, d_m) -> list[str]:
    missing = []
    if d_m is None:
        missing.append("give propulsion.propeller_diameter")
    if curve is None:
        missing.append("give propulsion.open_water (a file) or thrust_polynomial and "
                       "torque_polynomial")
    if cr is None:
        missing.append("give propulsion.resistance_test (a file) or resistance_estimate")
    if w is None:
        missing.append("give propulsion.wake_fraction (or prototype.sizes displacement, beam "
                       "and draught for Taylor's estimate)")
    return missing


def _expand(matrix, factors: np.ndarray):
    """The matrix with each row repeated once per tow force, runs renumbered."""
    runs = matrix.loc[matrix.index.repeat(factors.size)].reset_index(drop=True)
    runs["run"] = np.arange(1, len(runs) + 1)
    return runs


def _point_notes(point: dict, notes: list[str]) -> None:
    if np.any(~point["on_curve"]):
        notes.append("Some tow forces leave the propeller unloaded or off its open-water curve "
                     "(no expected figures there): check the tow forces and the curve's range.")


def _dynamometer_checks(case: Case, runs, missing: list[str]) -> tuple[Check, ...]:
    fac = case.facility
    out = []
    for name, column, limit, unit, key in (
        ("self-propulsion rotation rate (dynamometer)", "expected rotation rate [1/s]",
         fac.max_rotation_rate, "1/s", "fastest_rotation"),
        ("self-propulsion thrust (dynamometer)", "expected thrust [N]", fac.max_thrust, "N",
         "largest_thrust"),
        ("self-propulsion torque (dynamometer)", "expected torque [N m]", fac.max_torque,
         "N m", "largest_torque"),
    ):
        if missing:
            out.append(Check.not_checked(name, "; ".join(missing), _SOURCE, unit))
            continue
        if limit is None:
            out.append(Check.not_checked(name, f"give facility.{key} (the propeller "
                                         "dynamometer's range)", _SOURCE, unit))
            continue
        value = float(np.nanmax(runs[column].to_numpy(float)))
        status = judge(value, float(limit), "max", soft=False)
        advice = ("choose a larger model, a dynamometer with a larger range, or lower speeds"
                  if status == "fail" else "")
        out.append(Check(name, value, float(limit), unit, "max", status, _SOURCE, advice))
    return tuple(out)


__all__ = [
    "DEFAULT_ROTATIVE_EFFICIENCY",
    "FORM_STATEMENTS",
    "TAYLOR_WAKE",
    "THRUST_DEDUCTION_RATIO",
    "SelfPropulsionPlan",
    "open_water_curve",
    "operating_point",
    "plan_self_propulsion",
]

"""Full-scale speed, power and rate of revolution from the self-propulsion points (ITTC-1978).

At each self-propulsion point (SI arrays with a leading sample axis, as in
:mod:`similitude.prediction.self_propulsion`) [1]_:

1. the ship's C_TS at the point's Froude number (C_R of the resistance test, ΔC_F, C_A,
   C_AAS; :func:`similitude.prediction.extrapolation.ship_si`) and P_E;
2. the full-scale wake w_TS = (t + 0.04) + (w_TM - t - 0.04) [(1+k) C_FS + ΔC_F]/[(1+k) C_FM]
   (0.04: the rudder allowance, an option);
3. the propeller loading K_T/J² = S C_TS/(2 N D² (1 - t)(1 - w_TS)²) and the operating point
   J_TS on the scale-corrected (full-scale) open-water curve, K_QTS there;
4. n_S = (1 - w_TS) V_S/(J_TS D), P_DS = 2π ρ_S D⁵ n_S³ K_QTS/η_R · N, thrust and torque,
   η_0, η_H, η_D = P_E/P_DS;
5. the trial prediction: n_T = C_N n_S and P_DT = C_P P_DS, or with ΔC_FC and Δw_C in the
   loading, K_T/J² = S (C_TS + ΔC_FC)/(2 N D² (1 - t)(1 - w_TS + Δw_C)²), n_T =
   (1 - w_TS + Δw_C) V_S/(J_T D), P_DT = 2π ρ D⁵ n_T³ K_QT/η_R · N;
6. shaft power P_S = P_DT/η_S and brake power P_B = P_S/η_G.

The speed-power-rpm table sorts the points by speed; the figures at a contract speed are
interpolated between the two nearest points on log-log axes (power and rate of revolution
follow powers of speed locally; common practice).

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 04, 2017: full-scale wake and operating condition of the
       propeller, model-ship correlation factors. Text not at hand; formula shapes from memory
       (medium-high confidence; the Δw_C sign convention medium).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np

from similitude.constants import KNOT
from similitude.correlations import ittc78
from similitude.correlations import propulsion as _prop
from similitude.prediction.extrapolation import ship_si
from similitude.prediction.open_water_curve import OpenWaterCurve
from similitude.prediction.self_propulsion import PropulsionSetup


def loglog_interp(x, xp, yp):
    """Interpolate y(x) piecewise linearly on log-log axes through (xp, yp), xp ascending and
    positive; the end segments are extended beyond the data."""
    lx, lxp, lyp = np.log(np.asarray(x, float)), np.log(np.asarray(xp, float)), np.log(
        np.asarray(yp, float))
    if lxp.size == 1:
        return np.exp(np.full_like(lx, lyp[0]))
    i = np.clip(np.searchsorted(lxp, lx) - 1, 0, lxp.size - 2)
    return np.exp(lyp[i] + (lyp[i + 1] - lyp[i]) * (lx - lxp[i]) / (lxp[i + 1] - lxp[i]))


def _operating_point(curve: OpenWaterCurve, loading, diameter, wake_term, v_s):
    """(J, K_T, K_Q, n, inside) at a loading: J on the curve, n = (1 - w) V/(J D)."""
    j, inside = curve.advance_ratio_at_loading(loading)
    j = np.maximum(j, 1e-6)  # off the curve: flagged by ``inside``, kept finite
    return j, curve.kt(j), curve.kq(j), wake_term * v_s / (j * diameter), inside


def power_si(points: dict[str, np.ndarray], resistance: dict[str, Any], curve: OpenWaterCurve,
             setup: PropulsionSetup) -> dict[str, np.ndarray]:
    """The full-scale prediction at the self-propulsion points, SI arrays ``(N, g)``.

    Parameters
    ----------
    points : dict
        The ``points`` of :func:`similitude.prediction.self_propulsion.analysis_si`.
    resistance : dict
        The resistance extrapolation's arrays (for k).
    curve : OpenWaterCurve
        The design propeller's full-scale open-water curve.
    setup : PropulsionSetup

    Returns
    -------
    dict
        ``ship_speed`` [m/s], ``cts``, ``pe`` [W], ``wake_ship``, ``loading``,
        ``advance_ratio``, ``kt``, ``kq``, ``rate`` [1/s], ``power`` (P_DS) [W], ``thrust`` [N]
        and ``torque`` [N m] per propeller, ``eta_0``, ``eta_h``, ``eta_d``, ``trial_rate``,
        ``trial_power``, ``shaft_power``, ``brake_power`` [W], ``on_curve`` (bool), and the
        ship coefficients ``cfs``, ``dcf``, ``ca``, ``caas``, ``rho_s``.
    """
    ship, p = setup.ship, setup.propulsion
    k = resistance["k"] if np.ndim(resistance["k"]) == 0 else np.asarray(
        resistance["k"], float).reshape(-1, 1)
    s = ship_si(points["speed"], points["cr"], k, ship, setup.options)
    t, w_m, eta_r = points["thrust_deduction"], points["wake"], points["eta_r"]
    w_s = np.asarray(ittc78.wake_fraction_full_scale(w_m, t, points["cfm"], s["cfs"], k,
                                                     s["dcf"], p.rudder_allowance))
    d, n_p, v_s, rho = setup.ship_diameter, p.propellers, s["ship_speed"], s["rho_s"]
    loading = np.asarray(_prop.propeller_loading(ship.wetted_surface, d, s["cts"], t, w_s, n_p))
    j, kt, kq, n, inside = _operating_point(curve, loading, d, 1.0 - w_s, v_s)
    power = np.asarray(_prop.delivered_power(rho, d, n, kq, eta_r, n_p))
    if p.trial_method == "cp_cn":
        trial_rate, trial_power = p.rate_factor * n, p.power_factor * power
        trial_inside = inside
    else:
        w_t = w_s - p.wake_correction
        tau = np.asarray(_prop.propeller_loading(ship.wetted_surface, d,
                                                 s["cts"] + p.friction_correction, t, w_t, n_p))
        _, _, kq_t, trial_rate, trial_inside = _operating_point(curve, tau, d, 1.0 - w_t, v_s)
        trial_power = np.asarray(_prop.delivered_power(rho, d, trial_rate, kq_t, eta_r, n_p))
    shaft = trial_power / p.shaft_efficiency
    return {
        "ship_speed": v_s, "cts": s["cts"], "pe": s["pe"], "rho_s": rho, "cfs": s["cfs"],
        "dcf": s["dcf"], "ca": s["ca"], "caas": s["caas"], "wake_ship": w_s,
        "loading": loading, "advance_ratio": j, "kt": kt, "kq": kq, "rate": n, "power": power,
        "thrust": kt * rho * n**2 * d**4, "torque": kq / eta_r * rho * n**2 * d**5,
        "eta_0": j * kt / (2.0 * np.pi * kq),
        "eta_h": np.asarray(_prop.hull_efficiency(t, w_s)), "eta_d": s["pe"] / power,
        "trial_rate": trial_rate, "trial_power": trial_power, "shaft_power": shaft,
        "brake_power": shaft / p.gearbox_efficiency, "on_curve": inside & trial_inside,
    }


@dataclass(frozen=True, eq=False)  # holds DataFrames
class PowerPrediction:
    """The full-scale prediction: every step per speed, the speed-power-rpm table, the
    contract-speed figures.

    Attributes
    ----------
    table : pandas.DataFrame
        Per self-propulsion point: ship speed, C_TS, P_E, w_TS, K_T/J², J_TS, K_TS, K_QTS, n_S,
        P_DS, thrust, torque, η_0, η_H, η_R, η_D, the trial n_T and P_DT, P_S, P_B.
    speed_power : pandas.DataFrame
        Ship speed [kn], P_E, P_D (trial), P_S, P_B [kW] and rate of revolution [rpm], by speed.
    contract : dict or None
        The same figures at the contract speed (interpolated log-log), or None.
    curve : OpenWaterCurve
        The design propeller's full-scale open-water curve used.
    notes : tuple of str
    arrays : dict
        :func:`power_si`'s arrays, one sample.
    """

    table: Any
    speed_power: Any
    contract: dict | None
    curve: OpenWaterCurve
    notes: tuple[str, ...]
    arrays: dict


SPEED_POWER_COLUMNS = ("ship speed [kn]", "P_E [kW]", "P_D [kW]", "P_S [kW]", "P_B [kW]",
                       "rate of revolution [rpm]")


def power_result(arrays: dict[str, np.ndarray], points: dict[str, np.ndarray],
                 curve: OpenWaterCurve, setup: PropulsionSetup) -> PowerPrediction:
    """Tables, contract-speed figures and notes of a one-sample :func:`power_si` (``points``:
    the self-propulsion points it was computed from)."""
    import pandas as pd  # lazy: the command line builds its parsers without pandas

    a = {key: np.asarray(v)[0] if np.ndim(v) == 2 else v for key, v in arrays.items()}
    pt = {key: np.asarray(points[key])[0] for key in ("wake", "thrust_deduction", "cfm",
                                                       "eta_r")}
    p = setup.propulsion
    order = np.argsort(a["ship_speed"], kind="stable")
    table = pd.DataFrame({
        "ship speed [kn]": a["ship_speed"] / KNOT, "ship speed [m/s]": a["ship_speed"],
        "model wake w_TM [-]": pt["wake"], "thrust deduction t [-]": pt["thrust_deduction"],
        "C_FM [-]": pt["cfm"], "C_FS [-]": a["cfs"], "roughness allowance dC_F [-]": a["dcf"],
        "C_TS [-]": a["cts"], "P_E [kW]": a["pe"] / 1e3,
        "full-scale wake w_TS [-]": a["wake_ship"], "loading K_T/J^2 [-]": a["loading"],
        "advance ratio J_TS [-]": a["advance_ratio"], "K_TS [-]": a["kt"],
        "K_QTS [-]": a["kq"], "rate of revolution n_S [1/s]": a["rate"],
        "rate of revolution n_S [rpm]": a["rate"] * 60.0, "P_DS [kW]": a["power"] / 1e3,
        "thrust per propeller [kN]": a["thrust"] / 1e3,
        "torque per propeller [kN m]": a["torque"] / 1e3, "eta_0 [-]": a["eta_0"],
        "eta_H [-]": a["eta_h"], "eta_R [-]": pt["eta_r"],
        "eta_D [-]": a["eta_d"], "trial rate n_T [rpm]": a["trial_rate"] * 60.0,
        "trial P_DT [kW]": a["trial_power"] / 1e3, "P_S [kW]": a["shaft_power"] / 1e3,
        "P_B [kW]": a["brake_power"] / 1e3,
    }).iloc[order].reset_index(drop=True)
    speed_power = pd.DataFrame(dict(zip(SPEED_POWER_COLUMNS, (
        table["ship speed [kn]"], table["P_E [kW]"], table["trial P_DT [kW]"],
        table["P_S [kW]"], table["P_B [kW]"], table["trial rate n_T [rpm]"]), strict=True)))
    notes = ["Full-scale prediction: " + p.statement + "."]
    if not np.all(a["on_curve"]):
        notes.append("Some points load the propeller beyond its open-water curve's range: "
                     "their n and P_D are not reliable (shown as NaN).")
        bad = ~a["on_curve"][order]
        for col in table.columns[list(table.columns).index("full-scale wake w_TS [-]"):]:
            table.loc[bad, col] = np.nan
        speed_power.loc[bad, list(SPEED_POWER_COLUMNS[2:])] = np.nan
    contract = None
    if p.contract_speed is not None:
        contract = contract_figures(speed_power, p.contract_speed, notes)
    return PowerPrediction(table, speed_power, contract, curve, tuple(notes), arrays)


def contract_figures(speed_power, contract_speed: float, notes: list[str]) -> dict[str, float]:
    """The speed-power-rpm figures at ``contract_speed`` [m/s], interpolated log-log."""
    kn = contract_speed / KNOT
    v = speed_power["ship speed [kn]"].to_numpy(float)
    if not v[0] <= kn <= v[-1]:
        notes.append(f"The contract speed {kn:.2f} kn lies outside the tested speeds "
                     f"({v[0]:.2f} to {v[-1]:.2f} kn): its figures are extrapolated.")
    out = {"ship speed [kn]": kn}
    for col in SPEED_POWER_COLUMNS[1:]:
        out[col] = float(loglog_interp(kn, v, speed_power[col].to_numpy(float)))
    return out


__all__ = ["SPEED_POWER_COLUMNS", "PowerPrediction", "contract_figures", "loglog_interp",
           "power_result", "power_si"]

"""Analysis of a self-propulsion test: identity, w_TM, t, η_R, η_0, η_H, η_D per run and per speed.

The 1978 ITTC method [1]_, run by run (SI arrays; every step broadcasts over a leading sample
axis, so the uncertainty estimates of :mod:`similitude.prediction.propulsion_uncertainty` run
the same code on N perturbed copies at once):

1. water density and viscosity at the run's temperature (fresh tank water), Fn, C_FM;
2. C_R at the run's Froude number, interpolated in the resistance test's C_R (the residuary
   coefficient of the ITTC-1978 extrapolation), and the model resistance at the run's speed and
   temperature R_C = ½ρ_M V_M² S_M [(1+k) C_FM + C_R] (the procedure's
   R_C = R_TM [(1+k) C_FMC + C_R]/[(1+k) C_FM + C_R], taken at the run's own speed);
3. K_TM = T/(ρ n² D⁴), K_QM = Q/(ρ n² D⁵);
4. thrust identity: J_TM where the open-water K_T equals K_TM, η_R = K_Q(J_TM)/K_QM; or torque
   identity: J_QM where the open-water K_Q equals K_QM, η_R = K_TM/K_T(J_QM);
5. w_TM = 1 - J n D/V_M; t = (N T + F - R_C)/(N T) for N propellers; η_0 = J K_T/(2π K_Q) on the
   open-water curve; η_H = (1-t)/(1-w); η_D = η_0 η_H η_R.

The self-propulsion point of each speed: the run itself in the constant-loading method (one
run per speed, towed with the F_D the plan gave); in the load-varying method (several runs per
speed at different tow forces) thrust, torque and rate of revolution are fitted linearly
against the tow force and taken at the ship's F_D at that speed (ITTC 7.5-02-03-01.1 [2]_;
linear in F is common practice over the usual range). The slope gives t independently:
N T (1 - t) = R - F, so t = 1 + 1/(N dT/dF).

A test with a stock propeller (ITTC-1978 extension (5)) is analysed with that propeller's
open-water curve and diameter; the full-scale prediction then uses the design propeller's.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 04, 2017 (analysis of the model test results); the text of the
       procedure was not at hand, formula shapes from memory (medium-high confidence).
.. [2] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.1, "Propulsion/Bollard Pull
       Test", Rev 04, 2011 (load varying and constant loading methods).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from fluids_props.water import fresh_water_si
from similitude.constants import G0, ZERO_CELSIUS
from similitude.correlations import friction as _friction
from similitude.correlations import propulsion as _prop
from similitude.correlations.ittc78 import RUDDER_WAKE_ALLOWANCE
from similitude.errors import InputError
from similitude.prediction.extrapolation import ExtrapolationOptions, ShipParticulars, ship_si
from similitude.prediction.open_water_curve import DEFAULT_DEGREE, OpenWaterCurve
from similitude.prediction.runs import SelfPropulsionRuns

#: How the full-scale prediction is corrected to trial conditions [1]_: ``"cp_cn"``,
#: P_DT = C_P P_DS and n_T = C_N n_S; ``"dcfc_dwc"``, ΔC_FC added to C_TS and Δw_C to the wake
#: in the propeller loading.
TRIAL_METHODS = ("cp_cn", "dcfc_dwc")

#: Thrust deduction at a load-varying self-propulsion point: ``"resistance"``,
#: t = (N T + F_D - R_C)/(N T); ``"slope"``, t = 1 + 1/(N dT/dF).
LOAD_VARYING_DEDUCTIONS = ("resistance", "slope")


def _number(name: str, value: Any, low: float, high: float, allow_none: bool = False) -> None:
    if value is None and allow_none:
        return
    if not (isinstance(value, (int, float)) and not isinstance(value, bool)
            and math.isfinite(value) and low <= value <= high):
        raise InputError(f"{name}: {value!r} is not valid; expected a number from {low:g} to "
                         f"{high:g}")


@dataclass(frozen=True)
class PropulsionOptions:
    """Choices of the self-propulsion analysis and the full-scale prediction (defaults: ITTC
    7.5-02-03-01.4 Rev 04, 2017, without trial correlation factors).

    Attributes
    ----------
    identity : str
        ``"thrust"`` (default) or ``"torque"`` identity.
    propellers : int
        Number of propellers N (2 for a twin-screw ship); thrust and torque in the measured
        file are per propeller.
    rudder_allowance : float
        The 0.04 of the full-scale wake formula [-]; 0 without a rudder behind the propeller.
    trial_method : str
        One of :data:`TRIAL_METHODS`.
    power_factor, rate_factor : float
        C_P and C_N [-] (the facility's correlation factors; 1: none).
    friction_correction, wake_correction : float
        ΔC_FC and Δw_C [-] of the ``"dcfc_dwc"`` trial method.
    shaft_efficiency : float
        η_S = P_D/P_S [-] (shaft line and stern tube losses); 1: none.
    gearbox_efficiency : float
        η_G = P_S/P_B [-] (gearbox); 1: direct drive.
    contract_speed : float or None
        Ship speed whose figures the summary gives [m/s].
    friction_correction_form : str
        Form of F_D at the ship point (load-varying method), one of
        :data:`similitude.correlations.propulsion.FRICTION_CORRECTION_FORMS`.
    load_varying_deduction : str
        One of :data:`LOAD_VARYING_DEDUCTIONS`.
    speed_tolerance : float
        Runs whose speeds differ by less than this fraction belong to one speed [-].
    open_water_degree : int
        Degree of the polynomials fairing the open-water points.
    """

    identity: str = "thrust"
    propellers: int = 1
    rudder_allowance: float = RUDDER_WAKE_ALLOWANCE
    trial_method: str = "cp_cn"
    power_factor: float = 1.0
    rate_factor: float = 1.0
    friction_correction: float = 0.0
    wake_correction: float = 0.0
    shaft_efficiency: float = 1.0
    gearbox_efficiency: float = 1.0
    contract_speed: float | None = None
    friction_correction_form: str = "revised"
    load_varying_deduction: str = "resistance"
    speed_tolerance: float = 0.005
    open_water_degree: int = DEFAULT_DEGREE

    def __post_init__(self) -> None:
        for key, value, names in (
            ("identity", self.identity, _prop.IDENTITIES),
            ("trial_method", self.trial_method, TRIAL_METHODS),
            ("friction_correction_form", self.friction_correction_form,
             _prop.FRICTION_CORRECTION_FORMS),
            ("load_varying_deduction", self.load_varying_deduction, LOAD_VARYING_DEDUCTIONS),
        ):
            if value not in names:
                raise InputError(f"{key}: {value!r} is unknown; expected one of "
                                 + ", ".join(names))
        if not (isinstance(self.propellers, int) and 1 <= self.propellers <= 4):
            raise InputError(f"propellers: {self.propellers!r}; expected 1 to 4")
        _number("rudder_allowance", self.rudder_allowance, 0.0, 0.2)
        _number("power_factor", self.power_factor, 0.5, 2.0)
        _number("rate_factor", self.rate_factor, 0.5, 2.0)
        _number("friction_correction", self.friction_correction, -0.005, 0.005)
        _number("wake_correction", self.wake_correction, -0.3, 0.3)
        _number("shaft_efficiency", self.shaft_efficiency, 0.5, 1.0)
        _number("gearbox_efficiency", self.gearbox_efficiency, 0.5, 1.0)
        _number("contract_speed", self.contract_speed, 1e-3, 100.0, allow_none=True)
        _number("speed_tolerance", self.speed_tolerance, 0.0, 0.1)
        if not (isinstance(self.open_water_degree, int) and 1 <= self.open_water_degree <= 6):
            raise InputError(f"open_water_degree: {self.open_water_degree!r}; expected 1 to 6")

    @property
    def statement(self) -> str:
        """One line naming the identity, the trial correction and the efficiencies."""
        trial = (f"trial prediction n_T = C_N n_S, P_DT = C_P P_DS with C_P = "
                 f"{self.power_factor:g}, C_N = {self.rate_factor:g}"
                 if self.trial_method == "cp_cn" else
                 f"trial prediction with dC_FC = {self.friction_correction:g} and dw_C = "
                 f"{self.wake_correction:g} in the propeller loading")
        return (f"{self.identity} identity; full-scale wake with rudder allowance "
                f"{self.rudder_allowance:g}; {self.propellers} propeller(s); {trial}; "
                f"P_S = P_D/{self.shaft_efficiency:g}, P_B = P_S/{self.gearbox_efficiency:g} "
                "(ITTC 7.5-02-03-01.4 Rev 04, 2017)")


# -- the static part of the chain, from the nominal data --------------------------------------


def speed_groups(speed, tolerance: float) -> tuple[np.ndarray, ...]:
    """Indices of the runs at one speed each, by increasing speed: runs within ``tolerance``
    (relative) of their neighbour in speed belong together."""
    v = np.asarray(speed, dtype=float)
    order = np.argsort(v, kind="stable")
    groups, current = [], [order[0]]
    for a, b in zip(order[:-1], order[1:], strict=True):
        if v[b] - v[a] > tolerance * v[a]:
            groups.append(np.array(current))
            current = []
        current.append(b)
    groups.append(np.array(current))
    return tuple(groups)


def node_matrix(froude) -> tuple[np.ndarray, np.ndarray]:
    """(averaging matrix A (q, n), nodes (q,)): repeated runs at one Froude number (to 1e-6)
    are averaged into one interpolation node, nodes ascending."""
    fn = np.asarray(froude, dtype=float)
    keys, inverse = np.unique(np.round(fn / fn.max(), 6), return_inverse=True)
    a = np.zeros((keys.size, fn.size))
    a[inverse, np.arange(fn.size)] = 1.0
    a /= a.sum(axis=1, keepdims=True)
    return a, a @ fn


@dataclass(frozen=True, eq=False)  # holds arrays
class PropulsionSetup:
    """What the chain keeps fixed between samples: the ship, the choices, the propellers, the
    grouping of the runs by speed and of the resistance runs into interpolation nodes.

    Attributes
    ----------
    ship : ShipParticulars
    options : ExtrapolationOptions
    propulsion : PropulsionOptions
    model_diameter : float
        Diameter of the propeller in the self-propulsion test [m] (a stock propeller's, or
        the design propeller's D_S/λ).
    ship_diameter : float
        Diameter of the design propeller at full scale [m].
    groups : tuple of numpy.ndarray
        Self-propulsion runs by speed (indices).
    nodes : numpy.ndarray
        Averaging matrix of the resistance runs into C_R interpolation nodes ``(q, n)``.
    node_froude : numpy.ndarray
        Froude numbers of the nodes (nominal, ascending).
    """

    ship: ShipParticulars
    options: ExtrapolationOptions
    propulsion: PropulsionOptions
    model_diameter: float
    ship_diameter: float
    groups: tuple
    nodes: np.ndarray
    node_froude: np.ndarray = field(default_factory=lambda: np.zeros(0))

    @classmethod
    def build(cls, sp_runs: SelfPropulsionRuns, resistance_froude, ship: ShipParticulars,
              options: ExtrapolationOptions, propulsion: PropulsionOptions,
              model_diameter: float, ship_diameter: float) -> PropulsionSetup:
        """The setup from the nominal data.

        Raises
        ------
        InputError
            Fewer than two resistance runs at distinct speeds (no C_R to interpolate in).
        """
        nodes, node_fn = node_matrix(resistance_froude)
        if node_fn.size < 2:
            raise InputError("resistance runs: fewer than two distinct speeds; the "
                             "self-propulsion analysis interpolates C_R between them")
        return cls(ship, options, propulsion, float(model_diameter), float(ship_diameter),
                   speed_groups(sp_runs.speed, propulsion.speed_tolerance), nodes, node_fn)


# -- the chain on SI arrays -------------------------------------------------------------------


def cr_at(froude, resistance: dict[str, Any], setup: PropulsionSetup):
    """C_R at Froude numbers ``(N, p)``, interpolated linearly between the resistance runs'
    nodes of each sample (held at the end values outside them): (C_R, inside mask)."""
    fn = np.atleast_2d(froude)
    x = np.atleast_2d(resistance["froude"]) @ setup.nodes.T
    y = np.atleast_2d(resistance["cr"]) @ setup.nodes.T
    x, y = np.broadcast_to(x, (fn.shape[0], x.shape[1])), np.broadcast_to(
        y, (fn.shape[0], y.shape[1]))
    q = setup.node_froude.size
    i = np.clip(np.searchsorted(setup.node_froude, fn) - 1, 0, q - 2)
    x0, x1 = np.take_along_axis(x, i, 1), np.take_along_axis(x, i + 1, 1)
    y0, y1 = np.take_along_axis(y, i, 1), np.take_along_axis(y, i + 1, 1)
    s = np.clip((fn - x0) / (x1 - x0), 0.0, 1.0)
    tol = 1e-6 * setup.node_froude[-1]
    inside = (fn >= setup.node_froude[0] - tol) & (fn <= setup.node_froude[-1] + tol)
    return y0 + s * (y1 - y0), inside


def _k(resistance: dict[str, Any]):
    k = resistance["k"]
    return k if np.ndim(k) == 0 else np.asarray(k, float).reshape(-1, 1)


def ship_point_force(speed, temperature, k, setup: PropulsionSetup):
    """Skin-friction correction force F_D at the ship self-propulsion point [N], at model
    speeds and tank temperatures (arrays)."""
    ship, opt = setup.ship, setup.options
    state = fresh_water_si(temperature)
    rho = np.asarray(state.density_si, float)
    cfm = _friction.friction_coefficient(speed * ship.model_length
                                         / np.asarray(state.kinematic_viscosity_si, float),
                                         opt.friction_line)
    s = ship_si(speed, np.zeros_like(speed), k, ship, opt)
    return np.asarray(_prop.friction_correction_force(
        rho, speed, ship.model_wetted_surface, cfm, s["cfs"], k, s["dcf"], s["ca"],
        s["caas"], s["bk_factor"], setup.propulsion.friction_correction_form))


def factors_si(speed, rate, thrust, torque, tow, temperature, resistance: dict[str, Any],
               curve: OpenWaterCurve, setup: PropulsionSetup) -> dict[str, np.ndarray]:
    """Propulsion factors of runs (or self-propulsion points), arrays ``(N, m)``.

    Returns
    -------
    dict
        ``rho_m``, ``froude``, ``cfm``, ``cr``, ``resistance`` (R_C), ``kt``, ``kq``,
        ``advance_ratio``, ``wake``, ``thrust_deduction``, ``eta_r``, ``eta_0``, ``eta_h``,
        ``eta_d``, ``ship_force`` (F_D of the ship point at the run's speed), ``on_curve``
        and ``in_resistance_range`` (bool) and the inputs.
    """
    ship, opt, p = setup.ship, setup.options, setup.propulsion
    d = setup.model_diameter
    state = fresh_water_si(temperature)
    rho = np.asarray(state.density_si, float)
    nu = np.asarray(state.kinematic_viscosity_si, float)
    lm, sm = ship.model_length, ship.model_wetted_surface
    fn = speed / np.sqrt(G0 * lm)
    cfm = np.asarray(_friction.friction_coefficient(speed * lm / nu, opt.friction_line))
    cr, in_range = cr_at(fn, resistance, setup)
    k = _k(resistance)
    r_c = 0.5 * rho * speed**2 * sm * ((1.0 + k) * cfm + cr)
    kt = _prop.thrust_coefficient(thrust, rho, rate, d)
    kq = _prop.torque_coefficient(torque, rho, rate, d)
    if p.identity == "thrust":
        j, on_curve = curve.advance_ratio_at_thrust(kt)
        eta_r = curve.kq(j) / kq
    else:
        j, on_curve = curve.advance_ratio_at_torque(kq)
        eta_r = kt / curve.kt(j)
    wake = np.asarray(_prop.wake_fraction(j, rate, d, speed))
    t = np.asarray(_prop.thrust_deduction(p.propellers * thrust, tow, r_c))
    eta_0 = curve.efficiency(j)
    eta_h = np.asarray(_prop.hull_efficiency(t, wake))
    return {
        "speed": speed, "rate": rate, "thrust": thrust, "torque": torque, "tow": tow,
        "temperature": temperature, "rho_m": rho, "froude": fn, "cfm": cfm, "cr": cr,
        "resistance": r_c, "kt": kt, "kq": kq, "advance_ratio": j, "wake": wake,
        "thrust_deduction": t, "eta_r": eta_r, "eta_0": eta_0, "eta_h": eta_h,
        "eta_d": eta_0 * eta_h * eta_r,
        "ship_force": ship_point_force(speed, temperature, k, setup),
        "on_curve": on_curve, "in_resistance_range": in_range,
    }


def _points_si(sp: dict[str, np.ndarray], resistance, setup: PropulsionSetup):
    """The self-propulsion point of each speed group: (inputs dict ``(N, g)``, t from the
    slope ``(N, g)``, NaN for single-run groups)."""
    names = ("speed", "rate", "thrust", "torque", "tow", "temperature")
    n_samples = sp["speed"].shape[0]
    out = {key: np.empty((n_samples, len(setup.groups))) for key in names}
    t_slope = np.full((n_samples, len(setup.groups)), np.nan)
    k = _k(resistance)
    for g, idx in enumerate(setup.groups):
        if idx.size == 1:
            for key in names:
                out[key][:, g] = sp[key][:, idx[0]]
            continue
        v = sp["speed"][:, idx].mean(axis=1)
        temp = sp["temperature"][:, idx].mean(axis=1)
        kk = k if np.ndim(k) == 0 else k[:, 0]
        f_d = ship_point_force(v, temp, kk, setup)
        f = sp["tow"][:, idx]
        df = f - f.mean(axis=1, keepdims=True)
        sff = np.sum(df * df, axis=1)
        out["speed"][:, g], out["temperature"][:, g], out["tow"][:, g] = v, temp, f_d
        for key in ("rate", "thrust", "torque"):
            y = sp[key][:, idx]
            slope = np.sum(df * (y - y.mean(axis=1, keepdims=True)), axis=1) / sff
            out[key][:, g] = y.mean(axis=1) + slope * (f_d - f.mean(axis=1))
            if key == "thrust":
                t_slope[:, g] = 1.0 + 1.0 / (setup.propulsion.propellers * slope)
    return out, t_slope


def analysis_si(sp: dict[str, np.ndarray], resistance: dict[str, Any], curve: OpenWaterCurve,
                setup: PropulsionSetup) -> dict[str, dict[str, np.ndarray]]:
    """Runs and self-propulsion points of a self-propulsion test on SI arrays ``(N, m)``.

    Parameters
    ----------
    sp : dict
        ``speed`` [m/s], ``rate`` [1/s], ``thrust`` [N], ``torque`` [N m], ``tow`` [N],
        ``temperature`` [K] of the runs, each ``(N, m)``.
    resistance : dict
        The resistance extrapolation's arrays (``froude``, ``cr`` ``(N, r)`` and ``k``), from
        :func:`similitude.prediction.extrapolation.pipeline_si`.
    curve : OpenWaterCurve
        Open-water curve of the propeller in the test (coefficients ``(m,)`` or ``(N, m)``).
    setup : PropulsionSetup

    Returns
    -------
    dict
        ``runs`` and ``points``: dicts of :func:`factors_si`; ``points`` also holds
        ``thrust_deduction_slope`` and ``runs_per_point``.
    """
    runs = factors_si(sp["speed"], sp["rate"], sp["thrust"], sp["torque"], sp["tow"],
                      sp["temperature"], resistance, curve, setup)
    pin, t_slope = _points_si(sp, resistance, setup)
    points = factors_si(pin["speed"], pin["rate"], pin["thrust"], pin["torque"], pin["tow"],
                        pin["temperature"], resistance, curve, setup)
    if setup.propulsion.load_varying_deduction == "slope":
        use = np.isfinite(t_slope)
        points["thrust_deduction"] = np.where(use, t_slope, points["thrust_deduction"])
        points["eta_h"] = np.asarray(_prop.hull_efficiency(points["thrust_deduction"],
                                                           points["wake"]))
        points["eta_d"] = points["eta_0"] * points["eta_h"] * points["eta_r"]
    points["thrust_deduction_slope"] = t_slope
    points["runs_per_point"] = np.array([idx.size for idx in setup.groups])
    return {"runs": runs, "points": points}


def sp_arrays(runs: SelfPropulsionRuns) -> dict[str, np.ndarray]:
    """The measured runs as the chain's ``(1, m)`` arrays."""
    return {"speed": runs.speed[None, :], "rate": runs.rotation_rate[None, :],
            "thrust": runs.thrust[None, :], "torque": runs.torque[None, :],
            "tow": runs.tow_force[None, :], "temperature": runs.temperature[None, :]}


# -- the result, for one set of runs ----------------------------------------------------------


@dataclass(frozen=True, eq=False)  # holds DataFrames
class SelfPropulsionAnalysis:
    """The analysed self-propulsion test.

    Attributes
    ----------
    runs : SelfPropulsionRuns
        The measured input.
    options : PropulsionOptions
    curve : OpenWaterCurve
        The faired open-water curve of the propeller in the test.
    table : pandas.DataFrame
        Per run: measured values, K_TM, K_QM, J, w_TM, t, η_R, η_0, η_H, η_D, R_C and the
        ship-point F_D at the run's speed.
    points : pandas.DataFrame
        Per speed, the self-propulsion point and its propulsion factors.
    notes : tuple of str
    arrays : dict
        The chain's arrays (``runs``, ``points``), one sample.
    """

    runs: SelfPropulsionRuns
    options: PropulsionOptions
    curve: OpenWaterCurve
    table: Any
    points: Any
    notes: tuple[str, ...]
    arrays: dict


def _factor_columns(a: dict[str, np.ndarray], identity: str) -> dict[str, Any]:
    j = "J_TM" if identity == "thrust" else "J_QM"
    w = "w_TM" if identity == "thrust" else "w_QM"
    return {
        "model speed [m/s]": a["speed"][0], "rotation rate [1/s]": a["rate"][0],
        "thrust [N]": a["thrust"][0], "torque [N m]": a["torque"][0],
        "tow force [N]": a["tow"][0],
        "water temperature [degC]": a["temperature"][0] - ZERO_CELSIUS,
        "water density [kg/m^3]": a["rho_m"][0], "Froude number [-]": a["froude"][0],
        "C_FM [-]": a["cfm"][0], "C_R [-]": a["cr"][0],
        "resistance R_C [N]": a["resistance"][0], "K_TM [-]": a["kt"][0],
        "K_QM [-]": a["kq"][0], f"advance ratio {j} [-]": a["advance_ratio"][0],
        f"wake fraction {w} [-]": a["wake"][0],
        "thrust deduction t [-]": a["thrust_deduction"][0],
        "relative rotative efficiency eta_R [-]": a["eta_r"][0],
        "open-water efficiency eta_0 [-]": a["eta_0"][0],
        "hull efficiency eta_H [-]": a["eta_h"][0],
        "propulsive efficiency eta_D [-]": a["eta_d"][0],
    }


def analysis_result(runs: SelfPropulsionRuns, arrays: dict, curve: OpenWaterCurve,
                    setup: PropulsionSetup) -> SelfPropulsionAnalysis:
    """Tables and notes of a one-sample :func:`analysis_si`."""
    import pandas as pd  # lazy: the command line builds its parsers without pandas

    p = setup.propulsion
    r, pt = arrays["runs"], arrays["points"]
    table = pd.DataFrame({"run": list(runs.run), **_factor_columns(r, p.identity),
                          "ship-point F_D at this speed [N]": r["ship_force"][0]})
    points = pd.DataFrame({
        "runs at this speed": pt["runs_per_point"],
        "method": ["load varying" if n > 1 else "constant loading"
                   for n in pt["runs_per_point"]],
        **_factor_columns(pt, p.identity),
        "t from dT/dF [-]": pt["thrust_deduction_slope"][0],
    })
    notes = [f"Self-propulsion analysis: {p.identity} identity on the faired open-water "
             f"curve ({curve.source or 'given'}); t = (N T + F - R_C)/(N T) "
             + ("(at load-varying points t = 1 + 1/(N dT/dF))"
                if p.load_varying_deduction == "slope" else "")
             + " (ITTC 7.5-02-03-01.4 Rev 04, 2017)."]
    deviation = np.abs(r["tow"][0] - r["ship_force"][0]) / np.abs(r["ship_force"][0])
    single = np.zeros(len(runs), bool)
    for idx in setup.groups:
        if idx.size == 1:
            single[idx[0]] = True
    off = [rid for rid, s, d in zip(runs.run, single, deviation, strict=True) if s and d > 0.05]
    if off:
        notes.append("Runs towed more than 5 % away from the ship-point F_D (" + ", ".join(off)
                     + "): their factors are at another loading than the ship's.")
    if not np.all(r["on_curve"]):
        bad = [rid for rid, ok in zip(runs.run, r["on_curve"][0], strict=True) if not ok]
        notes.append(f"Runs off the open-water curve's range ({', '.join(bad)}): their "
                     "identity is read at the range end; check the open-water test.")
    if not np.all(r["in_resistance_range"]):
        notes.append("Some runs lie outside the resistance test's Froude range: C_R is taken "
                     "at the nearest end.")
    if np.any(pt["runs_per_point"] > 1):
        notes.append("Load-varying points: thrust, torque and rate fitted linearly against "
                     "the tow force and taken at the ship-point F_D (ITTC 7.5-02-03-01.1).")
    return SelfPropulsionAnalysis(runs, p, curve, table, points, tuple(notes), arrays)


__all__ = [
    "LOAD_VARYING_DEDUCTIONS",
    "TRIAL_METHODS",
    "PropulsionOptions",
    "PropulsionSetup",
    "SelfPropulsionAnalysis",
    "analysis_result",
    "analysis_si",
    "cr_at",
    "factors_si",
    "node_matrix",
    "ship_point_force",
    "sp_arrays",
    "speed_groups",
]

"""Make SYNTHETIC measured data for the ferry demo case from an invented "virtual tank".

Nothing here was measured. The "virtual tank" is a formula chosen so that the answer is known:

    C_TM = (1 + k) C_F,ITTC57(Re_M) + y Fn^4 + a exp(-b / Fn^2)

with k = 0.18, y = 0.05, a = 0.008, b = 0.45 (all invented), the model tested in fresh water at
about 16.8 degC, and seeded Gaussian noise of 0.2 % on each resistance reading and 0.05 K on
each temperature. The low-speed runs (Fn 0.105 to 0.195) serve Prohaska's form-factor fit; the
others are the ferry's planned speeds, 10 to 18 kn full scale.

The planned runs carry the run ids of the design loading (first repeat) of the plan made by
``similitude.planning.planner.plan`` for the ferry case, at the plan's scale; the low-speed runs
have a blank run id (runs beyond the plan). Rerun the script whenever the planner's choice of
scale changes.

Files written beside this script (overwritten on every run):

* ``ferry_resistance_runs_SYNTHETIC.csv``: SI units (m/s, N, degC);
* ``ferry_resistance_runs_SYNTHETIC_us_units.csv``: the same runs in kn, lbf and degF;
* ``ferry_open_water_SYNTHETIC.csv``: an invented open-water curve of a 4-bladed model
  propeller (K_T and K_Q polynomials in J plus noise), with rotation rate and temperature;
* ``ferry_self_propulsion_SYNTHETIC.csv``: a self-propulsion test of the same hull and
  propeller at the speeds of ``ferry_self_propulsion.toml`` (constant loading: one run per
  speed, towed with the ship-point F_D), made from known propulsion factors w_TM = 0.235,
  t = 0.165, eta_R = 1.015 (invented) and the noise-free open-water polynomials, with seeded
  noise (0.3 % on thrust and torque, 0.05 % on the rate, 0.005 N on the tow force, 0.05 K);
* ``ferry_self_propulsion_SYNTHETIC_us_units.csv``: the same runs in kn, rpm, lbf, lbf ft, degF;
* ``ferry_self_propulsion_load_varying_SYNTHETIC.csv``: the load-varying method, three tow
  forces (0.5, 1 and 1.5 F_D) per speed, the same factors and noise.

The self-propulsion runs follow the 1978 ITTC method backwards: T (1 - t) = R_TM - F, the
thrust identity on the open-water curve gives J and n, Q = K_Q(J) rho n^2 D^5/eta_R.

Use::

    python demo_cases/measured/make_virtual_tank_data.py
    similitude extrapolate demo_cases/measured/ferry_resistance_runs_SYNTHETIC.csv \
        --case demo_cases/ferry_resistance.toml -o ferry_results.xlsx \
        --open-water demo_cases/measured/ferry_open_water_SYNTHETIC.csv \
        --propeller "diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.30; blades=4; \
thickness_ratio=0.04"
"""

from __future__ import annotations

import csv
from pathlib import Path

import numpy as np

import similitude as sim
from fluids_props.water import fresh_water_si
from similitude.constants import G0 as G
from similitude.constants import KNOT
from similitude.correlations.friction import friction_coefficient
from similitude.correlations.propulsion import friction_correction_force
from similitude.prediction.extrapolation import ship_si

HERE = Path(__file__).resolve().parent
SEED = 20260302

# The ferry of demo_cases/ferry_resistance.toml (copied so this script runs on its own).
SHIP_LENGTH = 78.0  # m, waterline
SHIP_WETTED_SURFACE = 1450.0  # m^2
CASE = HERE.parent / "ferry_resistance.toml"
LOW_SPEED_FROUDE = (0.105, 0.12, 0.135, 0.15, 0.165, 0.18, 0.195)

# The invented "virtual tank" hull.
K_TRUE = 0.18
Y_TRUE = 0.05
WAVE_A, WAVE_B = 0.008, 0.45
TANK_TEMPERATURE = 289.95  # K, 16.8 degC
NOISE_RESISTANCE = 0.002  # relative, one standard deviation
NOISE_TEMPERATURE = 0.05  # K

# The invented propeller: 4.2 m full scale; at the plan's scale about 0.2 m in the tank.
PROPELLER = "diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.30; blades=4; thickness_ratio=0.04"
OPEN_WATER_RATE = 20.0  # 1/s
KT_POLY = (0.46, -0.30, -0.13)  # K_T = 0.46 - 0.30 J - 0.13 J^2 (invented)
KQ_POLY = (0.062, -0.032, -0.012)
PROPELLER_DIAMETER = 4.2  # m, full scale

# The invented self-propulsion test: the "true" propulsion factors of the virtual tank.
SP_CASE = HERE.parent / "ferry_self_propulsion.toml"
W_TRUE, T_TRUE, ETA_R_TRUE = 0.235, 0.165, 1.015
SP_TEMPERATURE = 290.45  # K, 17.3 degC
SP_NOISE = {"thrust": 0.003, "torque": 0.003, "rate": 0.0005, "tow": 0.005, "temp": 0.05}
LOAD_FACTORS = (0.5, 1.0, 1.5)

LBF = 4.4482216152605  # N, exact by definition (NIST SP 811, 2008, Appendix B.8)
LBF_FT = LBF * 0.3048  # N m, exact (NIST SP 811, 2008, B.8)


def virtual_tank_ctm(froude, reynolds):
    """C_TM of the invented hull: (1+k) C_F57 + y Fn^4 + a exp(-b/Fn^2)."""
    fn = np.asarray(froude, dtype=float)
    return ((1.0 + K_TRUE) * friction_coefficient(reynolds) + Y_TRUE * fn**4
            + WAVE_A * np.exp(-WAVE_B / fn**2))


def planned_runs():
    """(scale, run ids, full-scale speeds [m/s]) of the design loading, first repeat."""
    plan = sim.plan(sim.load_case(CASE))
    m = plan.matrix
    first = m[(m["repeat"] == 1) & (m["loading"] == m["loading"].iloc[0])]
    return float(plan.scale), [str(r) for r in first["run"]], first[
        "prototype speed [m/s]"].to_numpy(float)


def resistance_runs(rng: np.random.Generator, scale: float, ship_speeds):
    """Model speed [m/s], resistance [N], temperature [K] of the synthetic runs."""
    lm = SHIP_LENGTH / scale
    sm = SHIP_WETTED_SURFACE / scale**2
    v_low = np.array(LOW_SPEED_FROUDE) * np.sqrt(G * lm)
    v_plan = np.asarray(ship_speeds) / np.sqrt(scale)
    v = np.concatenate([v_low, v_plan])
    t = TANK_TEMPERATURE + rng.normal(0.0, NOISE_TEMPERATURE, v.size)
    state = fresh_water_si(t)
    fn = v / np.sqrt(G * lm)
    re = v * lm / state.kinematic_viscosity_si
    r = virtual_tank_ctm(fn, re) * 0.5 * state.density_si * sm * v**2
    r = r * (1.0 + rng.normal(0.0, NOISE_RESISTANCE, v.size))
    return v, r, t


def open_water_runs(rng: np.random.Generator):
    """Invented model open-water data: J, n [1/s], K_T, K_Q, temperature [K]."""
    j = np.round(np.arange(0.1, 1.01, 0.1), 3)
    kt = np.polynomial.polynomial.polyval(j, KT_POLY)
    kq = np.polynomial.polynomial.polyval(j, KQ_POLY)
    kt = kt * (1 + rng.normal(0, 0.004, j.size))
    kq = kq * (1 + rng.normal(0, 0.004, j.size))
    n = np.full(j.size, OPEN_WATER_RATE)
    t = TANK_TEMPERATURE + rng.normal(0.0, NOISE_TEMPERATURE, j.size)
    return j, n, kt, kq, t


def ship_point_force(v, temperature, scale: float):
    """F_D [N] of the virtual hull at model speeds v, revised ITTC-1978 form with k = K_TRUE
    (the package's own correlations: the tank applies what a plan would give it)."""
    ship = sim.ShipParticulars(SHIP_LENGTH, SHIP_WETTED_SURFACE, scale, transverse_area=210.0)
    options = sim.ExtrapolationOptions()
    s = ship_si(v, np.zeros_like(v), K_TRUE, ship, options)
    state = fresh_water_si(temperature)
    cfm = friction_coefficient(v * ship.model_length / state.kinematic_viscosity_si)
    return friction_correction_force(state.density_si, v, ship.model_wetted_surface, cfm,
                                     s["cfs"], K_TRUE, s["dcf"], s["ca"], s["caas"])


def self_propulsion_runs(rng: np.random.Generator, scale: float, ship_speeds, factors=(1.0,)):
    """Synthetic self-propulsion runs: speed, rate [1/s], thrust [N], torque [N m], tow force
    [N], temperature [K], one per speed and tow-force factor, from the true factors."""
    lm, sm, d = SHIP_LENGTH / scale, SHIP_WETTED_SURFACE / scale**2, PROPELLER_DIAMETER / scale
    v = np.repeat(np.asarray(ship_speeds) / np.sqrt(scale), len(factors))
    f = np.tile(factors, len(ship_speeds)) * ship_point_force(v, SP_TEMPERATURE, scale)
    state = fresh_water_si(np.full(v.size, SP_TEMPERATURE))
    rho = state.density_si
    fn = v / np.sqrt(G * lm)
    r_tm = virtual_tank_ctm(fn, v * lm / state.kinematic_viscosity_si) * 0.5 * rho * sm * v**2
    thrust = (r_tm - f) / (1.0 - T_TRUE)
    va = v * (1.0 - W_TRUE)
    tau = thrust / (rho * d**2 * va**2)
    a0, a1, a2 = KT_POLY  # K_T(J) = tau J^2: c J^2 - a1 J - a0 = 0 with c = tau - a2
    c = tau - a2
    j = (a1 + np.sqrt(a1**2 + 4.0 * c * a0)) / (2.0 * c)
    n = va / (j * d)
    torque = np.polynomial.polynomial.polyval(j, KQ_POLY) * rho * n**2 * d**5 / ETA_R_TRUE
    noise = SP_NOISE
    return (v, n * (1 + rng.normal(0, noise["rate"], v.size)),
            thrust * (1 + rng.normal(0, noise["thrust"], v.size)),
            torque * (1 + rng.normal(0, noise["torque"], v.size)),
            f + rng.normal(0, noise["tow"], v.size),
            SP_TEMPERATURE + rng.normal(0, noise["temp"], v.size))


def _note(scale: float) -> str:
    return ("# SYNTHETIC data from an invented 'virtual tank' (see make_virtual_tank_data.py): "
            f"not a measurement. Ferry demo case; scale 1:{scale:.6g}; form factor k = "
            f"{K_TRUE} built in. Blank run id = a run beyond the plan.")


def _write(path: Path, note: str, header: list[str], rows) -> None:
    with path.open("w", newline="", encoding="utf-8") as fh:
        fh.write(note + "\n")
        w = csv.writer(fh)
        w.writerow(header)
        w.writerows(rows)


def main() -> None:
    rng = np.random.default_rng(SEED)
    scale, ids, ship_speeds = planned_runs()
    v, r, t = resistance_runs(rng, scale, ship_speeds)
    run_ids = [""] * len(LOW_SPEED_FROUDE) + ids
    note = _note(scale)
    _write(HERE / "ferry_resistance_runs_SYNTHETIC.csv", note,
           ["run", "model speed [m/s]", "total resistance [N]", "water temperature [degC]"],
           [(i, f"{a:.5f}", f"{b:.4f}", f"{c - 273.15:.2f}")
            for i, a, b, c in zip(run_ids, v, r, t, strict=True)])
    _write(HERE / "ferry_resistance_runs_SYNTHETIC_us_units.csv", note,
           ["run", "model speed [kn]", "total resistance [lbf]", "water temperature [degF]"],
           [(i, f"{a / KNOT:.6f}", f"{b / LBF:.6f}", f"{(c - 273.15) * 1.8 + 32:.4f}")
            for i, a, b, c in zip(run_ids, v, r, t, strict=True)])
    j, n, kt, kq, tw = open_water_runs(rng)
    _write(HERE / "ferry_open_water_SYNTHETIC.csv",
           "# SYNTHETIC open-water data of an invented 4-bladed model propeller, not a "
           "measurement (see make_virtual_tank_data.py). Propeller: "
           + PROPELLER.replace(";", ",") + ".",
           ["advance ratio [-]", "rotation rate [1/s]", "thrust coefficient [-]",
            "torque coefficient [-]", "water temperature [degC]"],
           [(f"{a:.3f}", f"{b:.2f}", f"{c:.5f}", f"{d:.6f}", f"{e - 273.15:.2f}")
            for a, b, c, d, e in zip(j, n, kt, kq, tw, strict=True)])
    write_self_propulsion(rng)
    print(f"wrote SYNTHETIC data into {HERE} (scale 1:{scale:.6g})")


def write_self_propulsion(rng: np.random.Generator) -> None:
    """The self-propulsion files (constant loading, its US-unit twin, load varying)."""
    plan = sim.plan(sim.load_case(SP_CASE))
    speeds = plan.propulsion.speeds["prototype speed [m/s]"].to_numpy(float)
    scale = float(plan.scale)
    note = ("# SYNTHETIC self-propulsion data from an invented 'virtual tank' (see "
            f"make_virtual_tank_data.py): not a measurement. Scale 1:{scale:.6g}; true w_TM = "
            f"{W_TRUE}, t = {T_TRUE}, eta_R = {ETA_R_TRUE} built in.")
    v, n, t, q, f, temp = self_propulsion_runs(rng, scale, speeds)
    ids = [str(r) for r in plan.matrix["run"]]
    header = ["run", "model speed [m/s]", "rotation rate [1/s]", "thrust [N]", "torque [N m]",
              "tow force [N]", "water temperature [degC]"]
    _write(HERE / "ferry_self_propulsion_SYNTHETIC.csv", note, header,
           [(i, f"{a:.5f}", f"{b:.4f}", f"{c:.4f}", f"{d:.5f}", f"{e:.4f}",
             f"{g - 273.15:.2f}") for i, a, b, c, d, e, g in zip(ids, v, n, t, q, f, temp,
                                                                 strict=True)])
    _write(HERE / "ferry_self_propulsion_SYNTHETIC_us_units.csv", note,
           ["run", "model speed [kn]", "rotation rate [rpm]", "thrust [lbf]",
            "torque [lbf ft]", "tow force [lbf]", "water temperature [degF]"],
           [(i, f"{a / KNOT:.6f}", f"{b * 60:.4f}", f"{c / LBF:.6f}", f"{d / LBF_FT:.7f}",
             f"{e / LBF:.6f}", f"{(g - 273.15) * 1.8 + 32:.4f}")
            for i, a, b, c, d, e, g in zip(ids, v, n, t, q, f, temp, strict=True)])
    v, n, t, q, f, temp = self_propulsion_runs(rng, scale, speeds, LOAD_FACTORS)
    _write(HERE / "ferry_self_propulsion_load_varying_SYNTHETIC.csv",
           note + " Load-varying method: 0.5, 1 and 1.5 F_D at each speed.", header,
           [(str(k + 1), f"{a:.5f}", f"{b:.4f}", f"{c:.4f}", f"{d:.5f}", f"{e:.4f}",
             f"{g - 273.15:.2f}") for k, (a, b, c, d, e, g) in enumerate(
                 zip(v, n, t, q, f, temp, strict=True))])


if __name__ == "__main__":
    main()

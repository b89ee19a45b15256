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
  propeller (K_T and K_Q polynomials in J plus noise), with rotation rate and temperature.

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

LBF = 4.4482216152605  # N, exact by definition (NIST SP 811, 2008, Appendix B.8)


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
    kt = 0.46 - 0.30 * j - 0.13 * j**2
    kq = 0.062 - 0.032 * j - 0.012 * j**2
    kt = kt * (1 + rng.normal(0, 0.004, j.size))
    kq = kq * (1 + rng.normal(0, 0.004, j.size))
    n = np.full(j.size, OPEN_WATER_RATE)
    t = TANK_TEMPERATURE + rng.normal(0.0, NOISE_TEMPERATURE, j.size)
    return j, n, kt, kq, t


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
    print(f"wrote SYNTHETIC data into {HERE} (scale 1:{scale:.6g})")


if __name__ == "__main__":
    main()

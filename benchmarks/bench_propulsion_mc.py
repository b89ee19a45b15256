"""Benchmark (issue 12): Monte Carlo uncertainty of P_D and n_S against one prediction.

Run: ``python benchmarks/bench_propulsion_mc.py``. A 12-speed self-propulsion prediction of the
ferry demo, made from the SYNTHETIC virtual tank (demo_cases/measured/make_virtual_tank_data.py:
its resistance, open-water and self-propulsion generators, at 12 speeds from 8 to 19 kn),
timed as

* one deterministic ``predict()`` (resistance extrapolation, open-water scaling,
  self-propulsion analysis, full-scale prediction, tables);
* the Monte Carlo estimate with 10 000 samples of every measured value, the form factor
  re-fitted in each (``monte_carlo_si`` on the whole chain, vectorised over the samples);
* for context, the first-order estimate and the whole ``predict(..., monte_carlo=10000)``.

Target: Monte Carlo <= 50 x one deterministic prediction in the same run.
"""

from __future__ import annotations

import importlib.util
import os

for _var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

import numpy as np  # noqa: E402
from _bench import DEMO, best_of, ms, verdict  # noqa: E402

SAMPLES = 10_000
TARGET = 50.0
SPEEDS_KN = np.linspace(8.0, 19.0, 12)


def _virtual_tank():
    spec = importlib.util.spec_from_file_location(
        "virtual_tank", DEMO / "measured" / "make_virtual_tank_data.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def inputs():
    """(predict arguments, uncertainties) of the 12-speed SYNTHETIC prediction."""
    import similitude as sim
    from similitude.constants import KNOT
    from similitude.prediction.open_water import PropellerParticulars
    from similitude.prediction.runs import OpenWaterRuns, ResistanceRuns, SelfPropulsionRuns
    from similitude.prediction.uncertainty import MeasurementUncertainty

    vt = _virtual_tank()
    rng = np.random.default_rng(vt.SEED)
    scale = 21.0
    speeds = SPEEDS_KN * KNOT
    v, r, t = vt.resistance_runs(rng, scale, speeds)
    runs = ResistanceRuns(tuple(str(i + 1) for i in range(v.size)), v, r, t)
    j, n, kt, kq, tw = vt.open_water_runs(rng)
    ow = OpenWaterRuns(tuple(str(i) for i in range(j.size)), j, kt, kq, tw, n)
    sp = SelfPropulsionRuns(tuple(str(i + 1) for i in range(speeds.size)),
                            *vt.self_propulsion_runs(rng, scale, speeds))
    ship = sim.ShipParticulars(vt.SHIP_LENGTH, vt.SHIP_WETTED_SURFACE, scale,
                               transverse_area=210.0)
    prop = PropellerParticulars.from_text(vt.PROPELLER, scale)
    u = MeasurementUncertainty.from_quantities(
        speed="1 mm/s", resistance="0.2 %", temperature="0.05 K", rotation_rate="0.05 %",
        thrust="0.3 %", torque="0.3 %", tow_force="0.005 N", open_water_thrust="0.4 %",
        open_water_torque="0.4 %")
    return dict(runs=runs, ship=ship, open_water_runs=ow, propeller=prop,
                self_propulsion_runs=sp), u


def main() -> int:
    from similitude.prediction.predict import predict
    from similitude.prediction.propulsion_uncertainty import power_outputs
    from similitude.prediction.uncertainty import first_order_si, monte_carlo_si

    print("== Monte Carlo uncertainty of P_D and n_S (issue 12) ==")
    kw, u = inputs()
    p = predict(**kw)  # warm-up: imports, caches
    t_det = best_of(lambda: predict(**kw), repeat=7)
    chain = p.chain
    monte_carlo_si(chain, u, power_outputs, 200)  # warm-up
    t_mc = best_of(lambda: monte_carlo_si(chain, u, power_outputs, SAMPLES), repeat=3)
    t_fo = best_of(lambda: first_order_si(chain, u, power_outputs), repeat=3)
    t_all = best_of(lambda: predict(**kw, uncertainty=u, monte_carlo=SAMPLES), repeat=2)
    ratio = t_mc / t_det
    points = len(chain.setup.groups)
    print(f"  one deterministic predict() ({points} speeds): {ms(t_det)}")
    print(f"  Monte Carlo, {SAMPLES} samples x {points} speeds: {ms(t_mc)} -> "
          f"{ratio:.1f}x one prediction (target <= {TARGET:.0f}x) {verdict(ratio <= TARGET)}")
    print(f"  first order ({sum(len(v) for v in chain.nominal().values())} measured values, "
          f"each +/- u): {ms(t_fo)} -> {t_fo / t_det:.1f}x")
    print(f"  predict() with both estimates: {ms(t_all)} -> {t_all / t_det:.1f}x")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())

"""Benchmark: fluid properties on 1e5 points against CoolProp point-by-point calls.

Reports ratios measured in the same run (machines here are shared and noisy, so no absolute
targets are asserted). CoolProp is timed on a sample of points and its per-point time scaled to
the full count; the vectorised functions are timed on all points.
Target (issue 2): >= 100x faster than CoolProp point-by-point at the tested accuracy.
"""

from __future__ import annotations

import subprocess
import sys
import time

import numpy as np

N = 100_000
N_COOLPROP = 5_000


def _best_of(fn, repeat=5):
    best = float("inf")
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return best


def bench_liquids() -> list[str]:
    from fluids_props.seawater import sea_water_si
    from fluids_props.water import fresh_water_si

    rng = np.random.default_rng(1)
    T = rng.uniform(273.16, 313.15, N)
    S = rng.uniform(0.0, 0.042, N)
    t_fresh = _best_of(lambda: fresh_water_si(T))
    t_sea = _best_of(lambda: sea_water_si(T, 101325.0, S))

    lines = [f"fresh_water_si, {N} points: {t_fresh * 1e3:.2f} ms",
             f"sea_water_si,   {N} points: {t_sea * 1e3:.2f} ms"]
    try:
        from CoolProp.CoolProp import PropsSI
    except ImportError:  # pragma: no cover - CoolProp is a test extra
        lines.append("CoolProp not installed: no ratio")
        return lines

    sample = T[:N_COOLPROP]

    def coolprop_fresh():
        for t in sample:
            PropsSI("D", "T", t, "P", 101325.0, "Water")
            PropsSI("V", "T", t, "P", 101325.0, "Water")

    def coolprop_sea():
        for t, s in zip(sample, S[:N_COOLPROP]):
            fluid = f"INCOMP::MITSW[{s:.4f}]"
            PropsSI("D", "T", t, "P", 101325.0, fluid)
            PropsSI("V", "T", t, "P", 101325.0, fluid)

    t_cp_fresh = _best_of(coolprop_fresh, repeat=1) * N / N_COOLPROP
    t_cp_sea = _best_of(coolprop_sea, repeat=1) * N / N_COOLPROP
    lines += [
        f"CoolProp Water (density+viscosity), scaled to {N} points: {t_cp_fresh:.2f} s"
        f"  -> ratio {t_cp_fresh / t_fresh:,.0f}x (target >= 100x)",
        f"CoolProp INCOMP::MITSW (density+viscosity), scaled to {N} points: {t_cp_sea:.2f} s"
        f"  -> ratio {t_cp_sea / t_sea:,.0f}x (target >= 100x)",
    ]
    return lines


def bench_gases() -> list[str]:
    from fluids_props.air import air_si
    from fluids_props.gases import nitrogen_si

    rng = np.random.default_rng(2)
    T = rng.uniform(250.0, 320.0, N)
    p = rng.uniform(1e5, 1e6, N)
    t_air = _best_of(lambda: air_si(T, p))
    t_n2 = _best_of(lambda: nitrogen_si(T, p))
    return [f"air_si,         {N} points: {t_air * 1e3:.2f} ms",
            f"nitrogen_si,    {N} points: {t_n2 * 1e3:.2f} ms"]


def bench_import() -> list[str]:
    code = ("import time, sys; t=time.perf_counter(); import fluids_props; "
            "dt=time.perf_counter()-t; heavy=[m for m in ('scipy','pandas','matplotlib',"
            "'CoolProp') if m in sys.modules]; print(dt, ','.join(heavy) or '-')")
    base = ("import time; t=time.perf_counter(); import numpy, pint; "
            "print(time.perf_counter()-t)")
    runs, bases = [], []
    heavy = "-"
    for _ in range(3):
        out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                             check=True).stdout.split()
        runs.append(float(out[0]))
        heavy = out[1]
        bases.append(float(subprocess.run([sys.executable, "-c", base], capture_output=True,
                                          text=True, check=True).stdout))
    t, b = min(runs), min(bases)
    return [f"import fluids_props: {t * 1e3:.0f} ms; bare 'import numpy, pint': {b * 1e3:.0f} ms"
            f" -> ratio {t / b:.2f}; heavy modules loaded at import: {heavy}"]


def main() -> None:
    print("== fluids_props ==")
    for line in bench_liquids() + bench_gases() + bench_import():
        print("  " + line)


if __name__ == "__main__":
    main()

"""Benchmark (issue 4): ``plan()`` on each demo case and the vectorised candidate search.

Run: ``python benchmarks/bench_plan.py``. Prints, as text:

* per demo case, the time of ``similitude.load_case`` and of ``similitude.plan`` (warm: after
  one call, so the one-off imports of pandas and scipy.optimize are not counted here; the
  command-line benchmark covers the cold path);
* the time of ``similitude.planning.solver.search_grid(case, n_candidates=100_000)`` per case
    (target
  below 0.1 s on one core), against a same-run numpy baseline of the same size: Reynolds and
  Froude numbers on 1e5-element arrays, and ``fresh_water_si`` on 1e5 points;
* a cProfile summary of one ``solve`` of the wing case, to show where its time goes.
"""

from __future__ import annotations

import cProfile
import os
import pstats

# One core: fixed before numpy loads its thread pools.
for _var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

import numpy as np  # noqa: E402
from _bench import DEMO, DEMO_CASES, best_of, ms, verdict  # noqa: E402

N = 100_000
GRID_TARGET_S = 0.1


def numpy_baselines() -> dict[str, float]:
    """Same-size numpy work: the floor a 1e5-candidate search is compared with."""
    from fluids_props.water import fresh_water_si
    from similitude.dimensional.numbers import froude, reynolds

    rng = np.random.default_rng(4)
    V = rng.uniform(0.5, 10.0, N)
    L = rng.uniform(1.0, 10.0, N)
    nu = rng.uniform(0.9e-6, 1.8e-6, N)
    T = rng.uniform(278.15, 308.15, N)
    return {
        "Reynolds + Froude on 1e5 arrays": best_of(lambda: (reynolds(V, L, nu), froude(V, L)),
                                                   repeat=7),
        "fresh_water_si on 1e5 points": best_of(lambda: fresh_water_si(T), repeat=7),
    }


def bench_cases() -> tuple[list[str], dict[str, float]]:
    import similitude as sim
    from similitude.planning.solver import search_grid

    lines, grid_times = [], {}
    for name in DEMO_CASES:
        path = DEMO / f"{name}.toml"
        try:
            case = sim.load_case(path)
            sim.plan(case)  # warm-up: one-off imports and caches
        except Exception as exc:  # a demo case that no longer plans: report it, go on
            lines.append(f"{name:22s} FAILED: {exc.__class__.__name__}: {str(exc)[:160]}")
            continue
        t_load = best_of(lambda p=path: sim.load_case(p), repeat=3)
        t_plan = best_of(lambda c=case: sim.plan(c), repeat=3)
        result = search_grid(case, n_candidates=N)
        t_grid = best_of(lambda c=case: search_grid(c, n_candidates=N), repeat=3)
        grid_times[name] = t_grid
        lines.append(f"{name:22s} load {ms(t_load):>9s}  plan {ms(t_plan):>9s}  "
                     f"search_grid({result.count} candidates) {ms(t_grid):>9s} "
                     f"(target < {GRID_TARGET_S * 1e3:.0f} ms) {verdict(t_grid < GRID_TARGET_S)}")
    return lines, grid_times


def profile_wing(top: int = 8) -> list[str]:
    """Where one ``solve`` of the wing case spends its time (cumulative, own code first)."""
    import similitude as sim
    from similitude.planning.solver import solve

    case = sim.load_case(DEMO / "wing_wind_tunnel.toml")
    solve(case)  # warm-up
    t_solve = best_of(lambda: solve(case), repeat=3)
    prof = cProfile.Profile()
    prof.enable()
    solve(case)
    prof.disable()
    stats = pstats.Stats(prof)
    total = stats.total_tt
    rows = []
    for (file, _line, func), (_cc, nc, _tt, ct, _callers) in stats.stats.items():
        if "/similitude/" in file or "/fluids_props/" in file or "scipy/optimize" in file:
            short = file.split("/similitude/")[-1].split("/fluids_props/")[-1]
            pkg = "fluids_props" if "/fluids_props/" in file else (
                "scipy.optimize" if "scipy/optimize" in file else "similitude")
            rows.append((ct, nc, f"{pkg}/{short.rsplit('/', 1)[-1]}:{func}"))
    rows.sort(reverse=True)
    out = [f"wing_wind_tunnel solve(): {ms(t_solve)} (best of 3); cProfile of one call "
           f"({ms(total)} under the profiler), cumulative:"]
    skip = {"solve", "_solve_relaxing", "_solve_problem"}  # the call chain itself
    shown = 0
    for ct, nc, name in rows:
        if name.rsplit(":", 1)[-1] in skip:
            continue
        out.append(f"    {ct / total:5.0%}  {ms(ct):>9s}  {nc:5d} calls "
                   f"({ct / nc * 1e3:.2f} ms each)  {name}")
        shown += 1
        if shown == top:
            break
    return out


def main() -> int:
    print("== plan and candidate search (issue 4) ==")
    base = numpy_baselines()
    lines, grid = bench_cases()
    for line in lines:
        print("  " + line)
    worst = max(grid.values(), default=float("nan"))
    for label, t in base.items():
        print(f"  numpy baseline, {label}: {ms(t)} -> slowest search_grid / baseline "
              f"{worst / t:.1f}x")
    for line in profile_wing():
        print("  " + line)
    return 1 if any(" FAILED: " in line for line in lines) else 0


if __name__ == "__main__":
    raise SystemExit(main())

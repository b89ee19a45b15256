"""Benchmark: a 10^4-run matrix, built and written to .xlsx (target < 5 s; reported, not asserted).

Run: ``python benchmarks/bench_matrix_xlsx.py [--repeat N]``. Prints the time of planning,
of building the matrix alone, and of writing the workbook, as text.
"""

from __future__ import annotations

import argparse
import pathlib
import statistics
import tempfile
import time


def _case():
    import numpy as np

    from similitude.case import (
        Case,
        FluidSpec,
        LoadingCondition,
        MatchRequest,
        MatrixSpec,
        Prototype,
        WaveCondition,
    )
    from similitude.facilities import Facility

    fac = Facility("towing_tank", "benchmark tank (invented)", 200.0, 7.0, 4.0, (0.1, 8.0))
    proto = Prototype("surface_ship", 100.0, (5.0, 7.0, 9.0), FluidSpec("sea_water", 288.15))
    waves = (WaveCondition("regular", period=8.0, steepness=1 / 50),
             WaveCondition("regular", period=11.0, height=3.0),
             WaveCondition("irregular", significant_height=3.0, peak_period=10.0),
             WaveCondition("irregular", significant_height=5.0, peak_period=12.0,
                           spectrum="ittc"))
    spec = MatrixSpec(speeds=tuple(np.linspace(0.5, 9.0, 100)),
                      loading=tuple(LoadingCondition(f"condition {i}") for i in range(5)),
                      headings=(0.0, 45.0, 90.0, 135.0, 180.0), waves=waves)
    return Case(proto, fac, request=MatchRequest(scale=25.0), matrix=spec, name="benchmark")


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=3)
    args = ap.parse_args(argv)

    t0 = time.perf_counter()
    import similitude as sim
    from similitude.matrix import build_matrix
    from similitude.report.xlsx import write_plan

    t_import = time.perf_counter() - t0
    case = _case()
    t0 = time.perf_counter()
    plan = sim.plan(case)
    t_plan = time.perf_counter() - t0
    n = len(plan.matrix)

    matrix_times, write_times = [], []
    with tempfile.TemporaryDirectory() as d:
        for i in range(args.repeat):
            t0 = time.perf_counter()
            build_matrix(case, plan.solution)
            matrix_times.append(time.perf_counter() - t0)
            path = pathlib.Path(d) / f"bench{i}.xlsx"
            t0 = time.perf_counter()
            write_plan(plan, path)
            write_times.append(time.perf_counter() - t0)
            size = path.stat().st_size
    print(f"runs in matrix:            {n}")
    print(f"import similitude etc.:    {t_import:.3f} s")
    print(f"plan (incl. matrix):       {t_plan:.3f} s")
    print(f"build_matrix, median of {args.repeat}: {statistics.median(matrix_times):.3f} s")
    print(f"write_plan, median of {args.repeat}:   {statistics.median(write_times):.3f} s "
          f"(target < 5 s; {size / 1e6:.1f} MB)")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())

"""Benchmark: a 10^4-run matrix, built and written to .xlsx (target < 5 s; reported, not asserted).

Run: ``python benchmarks/bench_matrix_xlsx.py [--repeat N]``. Prints the time of planning,
of building the matrix alone, and of writing the workbook, as text; the workbook time is also
given as a ratio to a same-run baseline: the matrix table alone appended row by row to a
write-only openpyxl workbook (no formats, no other sheets).
"""

from __future__ import annotations

import argparse
import pathlib
import statistics
import sys
import tempfile
import time

# Run from a checkout without installing: the project root goes on the path.
sys.path.insert(0, str(pathlib.Path(__file__).resolve().parent.parent))


def _case():
    import numpy as np

    from similitude.planning.case import (
        Case,
        FluidSpec,
        LoadingCondition,
        MatchRequest,
        MatrixSpec,
        Prototype,
        WaveCondition,
    )
    from similitude.planning.facilities import Facility

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


def _bare_openpyxl(frame, path) -> None:
    """The matrix table alone in a write-only openpyxl workbook: the floor for the workbook."""
    from openpyxl import Workbook

    wb = Workbook(write_only=True)
    ws = wb.create_sheet("matrix")
    ws.append([str(c) for c in frame.columns])
    for row in frame.itertuples(index=False):
        ws.append([None if v != v else v for v in row])  # NaN -> empty cell
    wb.save(path)


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=2)
    args = ap.parse_args(argv)

    t0 = time.perf_counter()
    import similitude as sim
    from similitude.planning.matrix import build_matrix
    from similitude.report.plan_workbook import write_plan

    t_import = time.perf_counter() - t0
    case = _case()
    t0 = time.perf_counter()
    plan = sim.plan(case)
    t_plan = time.perf_counter() - t0
    n = len(plan.matrix)

    matrix_times, write_times, base_times = [], [], []
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
            if i == 0:  # the baseline is slow (~5x write_plan): once is enough for a ratio
                t0 = time.perf_counter()
                _bare_openpyxl(plan.matrix, pathlib.Path(d) / "base.xlsx")
                base_times.append(time.perf_counter() - t0)
    t_write = statistics.median(write_times)
    t_base = statistics.median(base_times)
    print("== 10^4-run matrix to .xlsx (issue 5) ==")
    print(f"  runs in matrix: {n}; imports (similitude, the writer, openpyxl) {t_import:.3f} s; "
          f"plan (incl. matrix) {t_plan:.3f} s; "
          f"build_matrix {statistics.median(matrix_times):.3f} s (median of {args.repeat})")
    print(f"  write_plan, median of {args.repeat}: {t_write:.3f} s ({size / 1e6:.1f} MB) "
          f"(target < 5 s) {'ok' if t_write < 5.0 else 'MISSED'}")
    print(f"  baseline, the matrix table alone in a write-only openpyxl workbook: "
          f"{t_base:.3f} s -> ratio {t_write / t_base:.2f}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())

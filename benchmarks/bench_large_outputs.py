"""Benchmark: large but legal outputs stay fast and small in memory (issue 14).

* a 10^5-row measured file (CSV, read by ``read_resistance_runs``) extrapolated and written to
  its results workbook (``write_results``);
* a 10^5-run matrix planned and written to the plan workbook (``write_plan``).

Each is compared with a same-size baseline measured in the same run: every long table of the
same workbook (the same rows and columns, formula columns as formula text) appended row by row
to a plain write-only openpyxl workbook, values only. Targets: our write at most 2x the
baseline's time, and the peak memory of the whole process (reading, planning or extrapolating,
and writing) at most 500 MB. Every figure comes from a fresh interpreter, so one measurement's
memory does not carry into the next.

Run: ``python benchmarks/bench_large_outputs.py [--rows N]``.
"""

from __future__ import annotations

import argparse
import json
import pathlib
import resource
import subprocess
import sys
import tempfile
import time

HERE = pathlib.Path(__file__).resolve().parent
sys.path.insert(0, str(HERE))

from _bench import env, verdict  # noqa: E402

TIME_RATIO_TARGET = 2.0
PEAK_MB_TARGET = 500.0


def _plan(rows: int):
    """A towing-tank plan of ``rows`` runs: 100 speeds x loadings x 10 repeats (invented)."""
    import numpy as np

    import similitude as sim
    from similitude.planning.case import (
        Case,
        FluidSpec,
        LoadingCondition,
        MatchRequest,
        MatrixSpec,
        Prototype,
    )
    from similitude.planning.facilities import Facility

    fac = Facility("towing_tank", "benchmark tank (invented)", 200.0, 7.0, 4.0, (0.1, 8.0))
    proto = Prototype("surface_ship", 100.0, (5.0, 7.0, 9.0), FluidSpec("sea_water", 288.15))
    spec = MatrixSpec(speeds=tuple(np.linspace(0.5, 9.0, 100)), repeats=10,
                      loading=tuple(LoadingCondition(f"condition {i}")
                                    for i in range(max(1, rows // 1000))))
    return sim.plan(Case(proto, fac, request=MatchRequest(scale=25.0), matrix=spec,
                         name="benchmark (invented)"))


def _measured_file(folder: pathlib.Path, rows: int) -> pathlib.Path:
    """A SYNTHETIC measured file of ``rows`` resistance runs of an invented 4 m model."""
    import numpy as np

    fn = np.linspace(0.08, 0.40, rows)
    v = fn * np.sqrt(9.80665 * 4.0)
    r = 30.0 * v**2 * (1 + 0.5 * fn**4)
    path = folder / f"runs_SYNTHETIC_{rows}.csv"
    with path.open("w") as fh:
        fh.write("model speed [m/s],total resistance [N],water temperature [degC]\n")
        fh.writelines(f"{a:.6f},{b:.6f},15.0\n" for a, b in zip(v, r, strict=True))
    return path


def _extrapolation(measured: pathlib.Path):
    from similitude.prediction.extrapolation import ShipParticulars, extrapolate
    from similitude.readers.measured import read_resistance_runs

    return extrapolate(read_resistance_runs(measured),
                       ShipParticulars(length=100.0, wetted_surface=2500.0, scale=25.0))


def _baseline(wb, path: pathlib.Path) -> float:
    """Seconds to write the long tables of ``wb`` with a plain write-only openpyxl workbook."""
    from openpyxl import Workbook

    from similitude.report.sheets import sheet_long_tables

    tables = [t for ws in wb.worksheets for t in sheet_long_tables(ws)]
    t0 = time.perf_counter()
    out = Workbook(write_only=True)
    for k, t in enumerate(tables):
        ws = out.create_sheet(f"table {k}")
        ws.append([letter for letter, *_ in t.columns])
        cols = []
        for _, kind, _, data in t.columns:
            if kind == "formula":
                cols.append(None)
            else:
                cols.append(data.tolist() if hasattr(data, "tolist") else list(data))
        for i in range(t.nrows):
            r = t.first_row + i
            ws.append([("=" + t.columns[j][3](r)) if c is None else
                       (None if c[i] != c[i] else c[i]) for j, c in enumerate(cols)])
    out.save(path)
    return time.perf_counter() - t0


def child(what: str, rows: int, folder: pathlib.Path) -> dict:
    """One measurement in this (fresh) interpreter: seconds of the write and peak memory."""
    path = folder / f"{what}.xlsx"
    if what.startswith("plan"):
        from similitude.report import plan_workbook

        plan = _plan(rows)
        if what == "plan":
            t0 = time.perf_counter()
            plan_workbook.write_plan(plan, path)
            seconds = time.perf_counter() - t0
        else:
            wb, _ = plan_workbook.build_workbook(plan)
            seconds = _baseline(wb, path)
    else:
        from similitude.report import results_workbook

        e = _extrapolation(_measured_file(folder, rows))
        if what == "results":
            t0 = time.perf_counter()
            results_workbook.write_results(path, e)
            seconds = time.perf_counter() - t0
        else:
            seconds = _baseline(results_workbook.build_workbook(e), path)
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024  # kB on Linux
    return {"seconds": seconds, "peak_mb": peak, "size_mb": path.stat().st_size / 1e6}


def _run_child(what: str, rows: int, folder: str) -> dict:
    done = subprocess.run([sys.executable, __file__, "--child", what, "--rows", str(rows),
                           "--folder", folder], capture_output=True, text=True, env=env())
    if done.returncode != 0:
        raise RuntimeError(f"{what}: {done.stderr.strip().splitlines()[-1:]}")
    return json.loads(done.stdout.strip().splitlines()[-1])


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--rows", type=int, default=100_000)
    ap.add_argument("--child")
    ap.add_argument("--folder")
    args = ap.parse_args(argv)
    if args.child:
        print(json.dumps(child(args.child, args.rows, pathlib.Path(args.folder))))
        return 0
    print(f"== large outputs: {args.rows:,} rows to a workbook (issue 14) ==")
    with tempfile.TemporaryDirectory() as d:
        for name, label in (("results", "measured file -> results workbook"),
                            ("plan", "run matrix -> plan workbook")):
            ours = _run_child(name, args.rows, d)
            base = _run_child(name + "-baseline", args.rows, d)
            ratio = ours["seconds"] / base["seconds"]
            print(f"  {label}: {ours['seconds']:.2f} s ({ours['size_mb']:.0f} MB file), "
                  f"baseline write-only openpyxl of the same tables {base['seconds']:.2f} s "
                  f"-> ratio {ratio:.2f} (target <= {TIME_RATIO_TARGET:g}) "
                  f"{verdict(ratio <= TIME_RATIO_TARGET)}")
            print(f"  {label}: peak memory {ours['peak_mb']:.0f} MB (baseline process "
                  f"{base['peak_mb']:.0f} MB; target <= {PEAK_MB_TARGET:g} MB) "
                  f"{verdict(ours['peak_mb'] <= PEAK_MB_TARGET)}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())

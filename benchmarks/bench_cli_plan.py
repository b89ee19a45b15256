"""Benchmark: ``similitude plan CASE -o x.xlsx`` end to end, per demo case (issues 5 and 9).

Run: ``python benchmarks/bench_cli_plan.py [--repeat N] [--from-source]``. Each command runs in a
fresh interpreter (``python -m similitude``) and is reported as a ratio to a bare
``python -c "import pandas, pint, openpyxl"`` timed in the same run: the best of N over the
best of N, and the median over the median. The runs go round by round (the baseline, then every
case), so a slow spell of the shared machine falls on all of them alike. Target <= 1.5x, aim
1.3x. One extra run under ``-X importtime`` lists which imports the command spends its start-up
on.

The children get a bytecode cache of their own (PYTHONPYCACHEPREFIX in a temporary folder,
filled by the warm-up round), as an installed package has: the baseline's packages carry the
bytecode pip compiled at install time, so comparing them with a checkout compiled from source on
every run (this sandbox sets PYTHONDONTWRITEBYTECODE) would time the compiler, not the command.
``--from-source`` runs the children in the environment as it is, to see that cost too.
"""

from __future__ import annotations

import argparse
import os
import pathlib
import re
import statistics
import subprocess
import sys
import tempfile
import time

from _bench import DEMO, DEMO_CASES, env, ms, verdict

TARGET_RATIO = 1.5
AIM_RATIO = 1.3
BASELINE = "import pandas, pint, openpyxl"


def _child_env(cache: str | None) -> dict[str, str]:
    e = env()
    if cache is not None:
        e.pop("PYTHONDONTWRITEBYTECODE", None)
        e["PYTHONPYCACHEPREFIX"] = cache
    return e


def _timed(args, cwd, child_env) -> float:
    """Wall time [s] of one child process; raises if it fails."""
    t0 = time.perf_counter()
    done = subprocess.run(args, capture_output=True, text=True, cwd=cwd, env=child_env)
    dt = time.perf_counter() - t0
    if done.returncode != 0:
        tail = (done.stderr or done.stdout).strip().splitlines()[-1:] or [""]
        raise RuntimeError(f"{' '.join(args[:4])} ... exited {done.returncode}: {tail[0]}")
    return dt


def import_breakdown(case_path, out_path, child_env, top: int = 6) -> list[str]:
    """Top-level packages by cumulative import time in one run of the command."""
    done = subprocess.run(
        [sys.executable, "-X", "importtime", "-m", "similitude", "plan", str(case_path),
         "-o", str(out_path), "--force"], capture_output=True, text=True, env=child_env)
    if done.returncode != 0:
        raise RuntimeError(f"similitude plan under -X importtime exited {done.returncode}")
    totals: dict[str, int] = {}
    row = re.compile(r"^import time:\s+\d+ \|\s+(\d+) \|( *)(\S+)$")
    for line in done.stderr.splitlines():
        m = row.match(line)
        if m and len(m.group(2)) == 1:  # a top-level import, not a nested one
            pkg = m.group(3)
            if pkg.startswith("scipy.") or pkg.startswith("similitude.") or "." not in pkg:
                totals[pkg] = totals.get(pkg, 0) + int(m.group(1))
    biggest = sorted(totals.items(), key=lambda kv: -kv[1])[:top]
    return ["  slowest imports, one run under -X importtime (cumulative ms): "
            + ", ".join(f"{name} {us / 1e3:.0f}" for name, us in biggest)]


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=5)
    ap.add_argument("--from-source", action="store_true",
                    help="no bytecode cache of their own for the children (compile the project "
                    "on each run when the environment says so)")
    args = ap.parse_args(argv)

    with tempfile.TemporaryDirectory() as d:
        cached = not args.from_source
        child_env = _child_env(os.path.join(d, "pycache") if cached else None)
        bytecode = ("own bytecode cache, as installed" if cached else
                    "project compiled from source on each run"
                    if child_env.get("PYTHONDONTWRITEBYTECODE") else "environment as it is")
        print(f"== similitude plan CASE -o x.xlsx, end to end ({bytecode}) ==")
        base_cmd = [sys.executable, "-c", BASELINE]
        cmds = {name: [sys.executable, "-m", "similitude", "plan", str(DEMO / f"{name}.toml"),
                       "-o", f"{name}.xlsx", "--force"] for name in DEMO_CASES}
        failed = set()
        times: dict[str, list[float]] = {"baseline": [], **{name: [] for name in cmds}}
        for round_ in range(args.repeat + 1):  # round 0 warms up (and fills a cache)
            t = _timed(base_cmd, d, child_env)
            if round_:
                times["baseline"].append(t)
            for name, cmd in cmds.items():
                if name in failed:
                    continue
                try:
                    t = _timed(cmd, d, child_env)
                except RuntimeError as exc:  # the command failed on a demo case: report, go on
                    failed.add(name)
                    print(f"  {name:22s} FAILED: {str(exc)[:200]}")
                    continue
                if round_:
                    times[name].append(t)
        b_best, b_med = min(times["baseline"]), statistics.median(times["baseline"])
        print(f"  baseline python -c \"{BASELINE}\": best {ms(b_best)}, median {ms(b_med)} "
              f"({args.repeat} rounds)")
        missed = []
        for name in cmds:
            if name in failed:
                continue
            best = min(times[name]) / b_best
            med = statistics.median(times[name]) / b_med
            print(f"  {name:22s} best {ms(min(times[name])):>9s} -> ratio {best:.2f}, median "
                  f"ratio {med:.2f} (target <= {TARGET_RATIO:g}x, aim {AIM_RATIO:g}x) "
                  f"{verdict(best <= TARGET_RATIO)}")
            if best > TARGET_RATIO:
                missed.append(name)
        for name in missed or DEMO_CASES[:1]:
            for line in import_breakdown(DEMO / f"{name}.toml", pathlib.Path(d) / "i.xlsx",
                                         child_env):
                print(line.replace("one run", f"one {name} run"))
    return 1 if failed else 0


if __name__ == "__main__":
    raise SystemExit(main())

"""Benchmark (issue 5): ``similitude plan CASE -o x.xlsx`` end to end, per demo case.

Run: ``python benchmarks/bench_cli_plan.py [--repeat N]``. Each command runs in a fresh
interpreter (``python -m similitude``), best of N, and is reported as a ratio to a bare
``python -c "import pandas, pint, openpyxl"`` timed in the same run (target <= 2x). One extra
run under ``-X importtime`` lists which imports the command spends its start-up on.
"""

from __future__ import annotations

import argparse
import pathlib
import re
import subprocess
import sys
import tempfile

from _bench import DEMO, DEMO_CASES, env, ms, run_wall, verdict

TARGET_RATIO = 2.0
BASELINE = "import pandas, pint, openpyxl"


def _best(args, repeat: int, cwd) -> float:
    return min(run_wall(args, cwd=cwd) for _ in range(repeat))


def import_breakdown(case_path, out_path, top: int = 6) -> list[str]:
    """Top-level packages by cumulative import time in one run of the command."""
    done = subprocess.run(
        [sys.executable, "-X", "importtime", "-m", "similitude", "plan", str(case_path),
         "-o", str(out_path), "--force"], capture_output=True, text=True, env=env())
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
    ap.add_argument("--repeat", type=int, default=3)
    args = ap.parse_args(argv)

    print("== similitude plan CASE -o x.xlsx, end to end (issue 5) ==")
    failed = 0
    with tempfile.TemporaryDirectory() as d:
        t_base = _best([sys.executable, "-c", BASELINE], args.repeat, d)
        print(f"  baseline python -c \"{BASELINE}\": {ms(t_base)} (best of {args.repeat})")
        missed = []
        for name in DEMO_CASES:
            cmd = [sys.executable, "-m", "similitude", "plan", str(DEMO / f"{name}.toml"),
                   "-o", f"{name}.xlsx", "--force"]
            try:
                t = _best(cmd, args.repeat, d)
            except RuntimeError as exc:  # the command failed on a demo case: report, go on
                failed += 1
                print(f"  {name:22s} FAILED: {str(exc)[:200]}")
                continue
            ratio = t / t_base
            print(f"  {name:22s} {ms(t):>9s} -> ratio {ratio:.2f} (target <= {TARGET_RATIO:g}x)"
                  f" {verdict(ratio <= TARGET_RATIO)}")
            if ratio > TARGET_RATIO:
                missed.append(name)
        # What the one-off import of scipy.optimize (the solver's root finder and scalar
        # minimiser) adds on top of the baseline's imports, measured the same way.
        t_opt = _best([sys.executable, "-c", BASELINE + ", scipy.optimize"], args.repeat, d)
        print(f"  scipy.optimize on top of the baseline imports: +{ms(t_opt - t_base)}")
        for name in missed or DEMO_CASES[:1]:
            for line in import_breakdown(DEMO / f"{name}.toml", pathlib.Path(d) / "i.xlsx"):
                print(line.replace("one run", f"one {name} run"))
    return 1 if failed else 0


if __name__ == "__main__":
    raise SystemExit(main())

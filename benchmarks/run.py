"""Run every benchmark in this folder and print its report (ratios against same-run baselines).

Usage: ``python benchmarks/run.py [NAME ...]`` from the project root (after
``pip install -e ".[test]"``); NAME picks scripts by part of their name, e.g. ``plan``.

Each ``bench_*.py`` runs in its own fresh interpreter, so import times are not hidden by an
earlier script. Figures with a target carry ``ok`` or ``MISSED``; a missed target is reported,
not failed: the exit status is 0 unless a benchmark crashes (then 1).
"""

from __future__ import annotations

import pathlib
import subprocess
import sys
import time

HERE = pathlib.Path(__file__).resolve().parent
sys.path.insert(0, str(HERE))

from _bench import env  # noqa: E402


def main(argv: list[str] | None = None) -> int:
    wanted = sys.argv[1:] if argv is None else argv
    scripts = [s for s in sorted(HERE.glob("bench_*.py"))
               if not wanted or any(w in s.stem for w in wanted)]
    failed, summary = [], []
    t_all = time.perf_counter()
    for script in scripts:
        t0 = time.perf_counter()
        done = subprocess.run([sys.executable, str(script)], capture_output=True, text=True,
                              cwd=HERE.parent, env=env())
        sys.stdout.write(done.stdout)
        dt = time.perf_counter() - t0
        if done.returncode != 0:
            failed.append(script.name)
            last = (done.stderr.strip().splitlines() or ["see FAILED lines above"])[-1]
            print(f"  {script.name} CRASHED (exit {done.returncode}): {last}")
        print(f"  ({script.name}: {dt:.1f} s)")
        summary += [line.strip() for line in done.stdout.splitlines()
                    if line.rstrip().endswith((" ok", " MISSED")) or " FAILED: " in line]
    missed = [line for line in summary if line.endswith("MISSED")]
    failures = [line for line in summary if " FAILED: " in line]
    summary = [line for line in summary if line not in failures]
    print(f"== summary: {len(summary) - len(missed)} targets met, {len(missed)} MISSED, "
          f"{len(failed)} crashed; {time.perf_counter() - t_all:.0f} s in all ==")
    for line in missed:
        print("  MISSED: " + line)
    for line in failures:
        print("  FAILED: " + line)
    for name in failed:
        print(f"  CRASHED: {name}")
    return 1 if failed else 0


if __name__ == "__main__":
    raise SystemExit(main())

"""Run every benchmark in this folder and print its report (ratios against same-run baselines).

Usage: ``python benchmarks/run.py`` (from the project root, after ``pip install -e ".[test]"``).
"""

from __future__ import annotations

import pathlib
import runpy
import sys


def main() -> int:
    here = pathlib.Path(__file__).resolve().parent
    sys.path.insert(0, str(here.parent))
    failed = 0
    for script in sorted(here.glob("bench_*.py")):
        try:
            runpy.run_path(str(script), run_name="__main__")
        except Exception as exc:  # report and go on with the others
            failed += 1
            print(f"  {script.name} failed: {exc.__class__.__name__}: {exc}")
    return 1 if failed else 0


if __name__ == "__main__":
    raise SystemExit(main())

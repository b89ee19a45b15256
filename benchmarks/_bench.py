"""Small helpers shared by the benchmark scripts (timing, fresh-interpreter runs, verdicts).

Every figure is reported as text, with a ratio against a baseline measured in the same run:
the machines are shared and noisy, so absolute numbers are only indicative.
"""

from __future__ import annotations

import os
import pathlib
import subprocess
import sys
import time
from collections.abc import Callable, Sequence

ROOT = pathlib.Path(__file__).resolve().parent.parent
DEMO = ROOT / "demo_cases"
DEMO_CASES = ("ferry_resistance", "offshore_seakeeping", "propeller_cavitation",
              "wing_wind_tunnel")

if str(ROOT) not in sys.path:  # run from a checkout without installing
    sys.path.insert(0, str(ROOT))


def best_of(fn: Callable[[], object], repeat: int = 5) -> float:
    """Shortest wall time [s] of ``repeat`` calls (the least disturbed one)."""
    best = float("inf")
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return best


def env() -> dict[str, str]:
    """Environment for child interpreters: the checkout on the path, one thread per pool."""
    e = dict(os.environ)
    e["PYTHONPATH"] = os.pathsep.join(filter(None, [str(ROOT), e.get("PYTHONPATH", "")]))
    for var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS"):
        e.setdefault(var, "1")
    return e


def run_wall(args: Sequence[str], cwd: str | os.PathLike | None = None) -> float:
    """Wall time [s] of one child process; raises if it fails."""
    t0 = time.perf_counter()
    done = subprocess.run(list(args), capture_output=True, text=True, cwd=cwd, env=env())
    dt = time.perf_counter() - t0
    if done.returncode != 0:
        tail = (done.stderr or done.stdout).strip().splitlines()[-1:] or [""]
        raise RuntimeError(f"{' '.join(args[:4])} ... exited {done.returncode}: {tail[0]}")
    return dt


def python_out(code: str) -> str:
    """Stdout of ``python -c code`` in a fresh interpreter; raises if it fails."""
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          env=env())
    if done.returncode != 0:
        raise RuntimeError(f"child failed: {done.stderr.strip().splitlines()[-1:]}")
    return done.stdout.strip()


def verdict(ok: bool) -> str:
    """The tag printed beside a figure that has a target."""
    return "ok" if ok else "MISSED"


def ms(seconds: float) -> str:
    """Milliseconds below one second, seconds above."""
    return f"{seconds * 1e3:.1f} ms" if seconds < 1 else f"{seconds:.2f} s"

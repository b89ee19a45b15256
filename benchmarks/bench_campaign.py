"""Benchmark (issue 13): a campaign of 5 tests x 20 candidate facilities, planned and ranked.

Run: ``python benchmarks/bench_campaign.py``. Generates 20 invented towing tanks and 20
invented wave basins as facility files (seeded), and a campaign of the demo coastal vessel with
five tests on one hull model and its stock propeller (resistance, open water and
self-propulsion with the 20 tanks as candidates, seakeeping in head seas and at zero speed with
the 20 basins): 100 (test, facility) pairs, each with its scale window and figures, the
combinations of facilities for the shared model searched, and the five chosen tests planned
and booked. The baseline, measured in the same run, is one single-test ``plan()`` of the
resistance test in the first tank; the target is a campaign in at most 20 of those (the work
shared across candidates, not 100 separate plans).
"""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

# One core: fixed before numpy loads its thread pools.
for _var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

import numpy as np  # noqa: E402
from _bench import DEMO, best_of, ms, verdict  # noqa: E402

CANDIDATES = 20
TARGET = 20.0
#: Interleaved rounds (the machine is shared: the best of each figure is kept).
ROUNDS = 6


def _tank(i: int, rng) -> str:
    return f"""# INVENTED facility generated for the campaign benchmark.
kind = "towing_tank"
name = "Generated tank {i:02d} (invented)"
length = "{rng.uniform(120, 320):.0f} m"
width = "{rng.uniform(4, 12):.1f} m"
depth = "{rng.uniform(2.5, 7):.1f} m"
speed_limits = ["{rng.uniform(0.1, 0.4):.2f} m/s", "{rng.uniform(4, 9):.1f} m/s"]
temperature_limits = ["{rng.uniform(8, 14):.0f} degC", "{rng.uniform(18, 26):.0f} degC"]
acceleration = "{rng.uniform(0.3, 1.0):.2f} m/s^2"
fastest_rotation = "{rng.uniform(25, 50):.0f} Hz"
"""


def _basin(i: int, rng) -> str:
    return f"""# INVENTED facility generated for the campaign benchmark.
kind = "wave_basin"
name = "Generated basin {i:02d} (invented)"
length = "{rng.uniform(40, 120):.0f} m"
width = "{rng.uniform(20, 60):.0f} m"
depth = "{rng.uniform(2, 6):.1f} m"
speed_limits = ["0.05 m/s", "{rng.uniform(1.5, 4):.1f} m/s"]
temperature_limits = ["12 degC", "20 degC"]
acceleration = "0.3 m/s^2"
wave_periods = ["{rng.uniform(0.4, 0.8):.2f} s", "{rng.uniform(2.5, 4.5):.1f} s"]
highest_wave = "{rng.uniform(0.2, 0.6):.2f} m"
shortest_model = "1 m"
longest_model = "{rng.uniform(3.5, 6):.1f} m"
"""


def write_campaign(folder: Path) -> Path:
    """The generated facility files and the campaign file; returns the campaign's path."""
    rng = np.random.default_rng(13)
    (folder / "facilities").mkdir()
    tanks, basins = [], []
    for i in range(CANDIDATES):
        (folder / "facilities" / f"tank_{i:02d}.toml").write_text(_tank(i, rng))
        (folder / "facilities" / f"basin_{i:02d}.toml").write_text(_basin(i, rng))
        tanks.append(f'"facilities/tank_{i:02d}.toml"')
        basins.append(f'"facilities/basin_{i:02d}.toml"')
    demo = (DEMO / "coastal_campaign.toml").read_text()
    head = demo.split("[[test]]")[0]
    tests = "[[test]]" + "[[test]]".join(demo.split("[[test]]")[1:])
    tests = tests.replace('facilities = ["facilities/north_towing_tank.toml", '
                          '"facilities/south_towing_tank.toml"]',
                          f"facilities = [{', '.join(tanks)}]")
    tests = tests.replace('facilities = ["facilities/west_seakeeping_basin.toml", '
                          '"facilities/east_offshore_basin.toml"]',
                          f"facilities = [{', '.join(basins)}]")
    zero_speed = tests.split("[[test]]")[-1].replace('name = "seakeeping"',
                                                     'name = "seakeeping at zero speed"')
    zero_speed = zero_speed.replace('speeds = ["6 kn", "10 kn"]', 'speeds = ["2 kn", "4 kn"]')
    path = folder / "campaign.toml"
    path.write_text(head + tests + "[[test]]" + zero_speed)
    return path


def main() -> int:
    import similitude as sim
    from similitude.planning.campaign_plan import plan_campaign
    from similitude.readers.campaign_file import load_campaign

    print("== campaign: 5 tests x 20 candidate facilities (issue 13) ==")
    with tempfile.TemporaryDirectory() as tmp:
        path = write_campaign(Path(tmp))
        t_load = best_of(lambda: load_campaign(path), repeat=3)
        campaign = load_campaign(path)
        first = campaign.tests[0]
        case = first.case_in(first.facilities[0])
        sim.plan(case)  # warm-up: one-off imports and caches
        result = plan_campaign(campaign)
        pairs = sum(len(t.facilities) for t in campaign.tests)
        feasible = int(result.candidates["feasible"].sum())
        searched = int(result.combinations["combinations searched"].iloc[0])
        # interleaved rounds, best of each: both figures see the same machine load
        t_plan, t_campaign = float("inf"), float("inf")
        for _ in range(ROUNDS):
            t_plan = min(t_plan, best_of(lambda: sim.plan(case), repeat=3))
            t_campaign = min(t_campaign, best_of(lambda: plan_campaign(campaign), repeat=1))
    ratio = t_campaign / t_plan
    print(f"  load_campaign (5 tests, 40 facility files): {ms(t_load)}")
    print(f"  one single-test plan() (resistance, first tank): {ms(t_plan)}")
    print(f"  plan_campaign: {pairs} (test, facility) pairs, {feasible} feasible, "
          f"{searched} combinations of facilities searched, 5 tests planned and booked: "
          f"{ms(t_campaign)}")
    print(f"  campaign / single plan: {ratio:.1f}x (target <= {TARGET:g}x) "
          f"{verdict(ratio <= TARGET)}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())

"""Wave-basin checks: basin depth against the model wave length, and the highest wave of an
irregular sea from the number of waves in its duration.

Sources: deep water from h/L = 1/2, USACE Coastal Engineering Manual EM 1110-2-1100 (2002)
Part II, Table II-5-1 (after Ippen 1966); linear dispersion omega^2 = g k tanh(k h) (Dean &
Dalrymple 1991, ch. 3), solved here independently by bracketing; most probable highest of N
Rayleigh heights H_s sqrt(ln N / 2) (Longuet-Higgins 1952, J. Marine Research 11); JONSWAP
gamma = 3.3: T_z = T_p/1.285 (IMO MSC.141(76) Annex §4.1).
"""

from __future__ import annotations

import math
import re

import pytest
from scenarios import ship
from scipy.optimize import brentq

from similitude.planning.case import Case, MatchRequest, MatrixSpec, WaveCondition
from similitude.planning.facilities import Facility
from similitude.planning.planner import plan

G = 9.80665  # standard gravity [m/s^2]


def basin(depth=1.0, **kw):
    base = dict(kind="wave_basin", name="basin (invented)", length=60.0, width=30.0,
                depth=depth, speed_range=(0.05, 3.0), acceleration=0.3,
                wavemaker_period_range=(0.5, 4.0), wavemaker_max_height=0.5)
    base.update(kw)
    return Facility(**base)


def local_wave_length(period, depth):
    """L from omega^2 = g k tanh(k h), by bracketing (independent of the program's solver)."""
    w = 2 * math.pi / period
    k = brentq(lambda k: w**2 - G * k * math.tanh(k * depth), 1e-6, 1e3)
    return 2 * math.pi / k


def checks(case):
    return {c.name: c for c in plan(case).checks}


def test_shallow_basin_warns_that_storm_waves_are_shorter_and_steeper():
    # T_p = 11 s at 1:40: T_m = 11/sqrt(40) = 1.739 s; deep-water L_0 = g T^2/(2 pi) = 4.72 m;
    # in 1.0 m of water L = 4.25 m (dispersion), h/L = 0.235 < 1/2: about 10 % shorter and
    # 11 % steeper than Froude-scaled.
    sea = WaveCondition("irregular", significant_height=6.0, peak_period=11.0, name="storm")
    case = Case(ship(), basin(), MatchRequest(scale=40.0), MatrixSpec(waves=(sea,)))
    c = checks(case)["storm: basin depth over model wave length h/L (deep water)"]
    tm = 11.0 / math.sqrt(40.0)
    l0 = G * tm**2 / (2 * math.pi)
    lb = local_wave_length(tm, 1.0)
    assert c.value == pytest.approx(1.0 / lb, rel=1e-9)
    assert c.value == pytest.approx(0.235, abs=0.001)
    assert c.limit == 0.5 and c.status == "warning"
    assert f"({(1 - lb / l0) * 100:.2g} % shorter)" in c.advice
    assert f"{(l0 / lb - 1) * 100:.2g} % steeper" in c.advice
    assert "EM 1110-2-1100" in c.source and "from memory" not in c.source


def test_deep_basin_passes_and_states_the_small_change():
    # 4 m of water, T_m = 1.739 s: h/L = 4/4.72 = 0.85 (L within 0.1 % of L_0).
    sea = WaveCondition("irregular", significant_height=6.0, peak_period=11.0, name="storm")
    case = Case(ship(), basin(depth=4.0), MatchRequest(scale=40.0), MatrixSpec(waves=(sea,)))
    c = checks(case)["storm: basin depth over model wave length h/L (deep water)"]
    assert c.status == "ok"
    assert c.value == pytest.approx(4.0 / local_wave_length(11.0 / math.sqrt(40.0), 4.0),
                                    rel=1e-9)
    assert "% shorter" in c.advice


def test_finite_depth_site_gets_the_basin_depth_that_scales_it():
    # A 20 m deep site with T = 11 s waves: L_p = 137 m, h/L = 0.146 < 1/2 (finite depth);
    # the basin should be 20/40 = 0.5 m deep.
    sea = WaveCondition("regular", period=11.0, height=3.0, name="swell")
    case = Case(ship(water_depth=20.0), basin(depth=1.0), MatchRequest(scale=40.0),
                MatrixSpec(waves=(sea,)))
    c = checks(case)["swell: basin depth for the site depth h_p/lambda"]
    assert c.status == "info" and c.value == pytest.approx(0.5)
    assert "0.5 m" in c.advice


@pytest.mark.parametrize("hours", [0.5, 3.0])
def test_highest_wave_counts_the_waves_in_the_requested_duration(hours):
    # N = D/T_z with T_z = 11/1.285 = 8.560 s: 30 min -> N = 210, factor sqrt(ln 210/2)
    # = 1.635; 3 h -> N = 1262, factor 1.889. H_s = 6 m at 1:40 -> 0.15 m.
    sea = WaveCondition("irregular", significant_height=6.0, peak_period=11.0,
                        duration=hours * 3600.0, name="storm")
    case = Case(ship(), basin(depth=4.0), MatchRequest(scale=40.0), MatrixSpec(waves=(sea,)))
    c = checks(case)["storm: most probable highest model wave"]
    n = hours * 3600.0 / (11.0 / 1.285)
    assert c.value == pytest.approx(0.15 * math.sqrt(math.log(n) / 2.0), rel=1e-4)
    # the program integrates the spectrum for T_z; IMO's 1/1.285 agrees to about 1e-3
    count = float(re.search(r"= (\d+) Rayleigh-distributed waves", c.source).group(1))
    assert count == pytest.approx(n, rel=2e-3)
    assert "Longuet-Higgins 1952" in c.source


def test_regular_wave_height_is_checked_as_it_is():
    sea = WaveCondition("regular", period=11.0, height=6.0, name="design wave")
    case = Case(ship(), basin(depth=4.0), MatchRequest(scale=40.0), MatrixSpec(waves=(sea,)))
    c = checks(case)["design wave: model wave height"]
    assert c.value == pytest.approx(6.0 / 40.0)

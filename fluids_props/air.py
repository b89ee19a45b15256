"""PLACEHOLDER (to be replaced by the air module): ideal dry air."""

from __future__ import annotations

import numpy as np

from .registry import FluidInfo
from .state import FluidState
from .units import to_si
from .validity import Range, check

T_RANGE = Range("temperature", 250.0, 330.0, "K")
P_RANGE = Range("pressure", 5e4, 1e6, "Pa")


def air_si(temperature, pressure=101325.0, relative_humidity=0.0, extrapolate=False):
    T, p = np.broadcast_arrays(np.asarray(temperature, float), np.asarray(pressure, float))
    check(T, T_RANGE, "air", extrapolate)
    rho = p / (287.05287 * T)
    mu = 1.458e-6 * T**1.5 / (T + 110.4)
    a = np.sqrt(1.4 * 287.05287 * T)
    return FluidState("air", T, p, rho, mu, speed_of_sound_si=a)


def air(temperature, pressure="101325 Pa", relative_humidity=0, extrapolate=False):
    return air_si(to_si(temperature, "[temperature]", "temperature"),
                  to_si(pressure, "[pressure]", "pressure"),
                  to_si(relative_humidity, "dimensionless", "relative_humidity"), extrapolate)


FLUID_INFO = FluidInfo("air", "gas", "air (placeholder)", (T_RANGE, P_RANGE), air_si)

"""PLACEHOLDER (to be replaced by the fresh-water module): rough fresh water at 1 atm."""

from __future__ import annotations

import numpy as np

from .registry import FluidInfo
from .state import FluidState
from .units import to_si
from .validity import Range, check

T_RANGE = Range("temperature", 273.15, 313.15, "K")


def fresh_water_si(temperature, pressure=101325.0, extrapolate=False):
    T = np.asarray(temperature, dtype=float)
    check(T, T_RANGE, "fresh_water", extrapolate)
    t = T - 273.15
    rho = 999.97495 * (1 - (t - 3.983035) ** 2 * (t + 301.797) / (522528.9 * (t + 69.34881)))
    mu = 2.414e-5 * 10 ** (247.8 / (T - 140.0))
    pv = 611.2 * np.exp(17.62 * t / (243.12 + t))
    tau = 1 - T / 647.096
    sigma = 0.2358 * tau**1.256 * (1 - 0.625 * tau)
    return FluidState("fresh_water", T, np.broadcast_to(pressure, T.shape) * 1.0, rho, mu, pv,
                      sigma)


def fresh_water(temperature, extrapolate=False):
    return fresh_water_si(to_si(temperature, "[temperature]", "temperature"),
                          extrapolate=extrapolate)


FLUID_INFO = FluidInfo("fresh_water", "liquid", "fresh water (placeholder)", (T_RANGE,),
                       fresh_water_si, fixed_pressure=True)

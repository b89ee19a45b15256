"""PLACEHOLDER (to be replaced by the sea-water module)."""

from __future__ import annotations

import numpy as np

from .registry import FluidInfo
from .units import to_si
from .validity import Range
from .water import T_RANGE, fresh_water_si

S_RANGE = Range("salinity", 0.0, 0.042, "kg/kg")


def sea_water_si(temperature, pressure=101325.0, salinity=0.03516504, extrapolate=False):
    s = fresh_water_si(temperature, pressure, extrapolate)
    S = np.asarray(salinity, dtype=float)
    from dataclasses import replace
    return replace(s, fluid="sea_water", density_si=s.density_si * (1 + 0.76 * S),
                   dynamic_viscosity_si=s.dynamic_viscosity_si * (1 + 1.54 * S + 7.97 * S**2),
                   extra={"salinity": S})


def sea_water(temperature, salinity="35.16504 g/kg", extrapolate=False):
    return sea_water_si(to_si(temperature, "[temperature]", "temperature"),
                        salinity=to_si(salinity, "dimensionless", "salinity"),
                        extrapolate=extrapolate)


FLUID_INFO = FluidInfo("sea_water", "liquid", "sea water (placeholder)", (T_RANGE, S_RANGE),
                       sea_water_si, fixed_pressure=True)

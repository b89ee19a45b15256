"""PLACEHOLDER (to be replaced by the test-gas module)."""

from __future__ import annotations

from dataclasses import replace

from .air import air_si
from .units import to_si


def nitrogen(temperature, pressure="101325 Pa", extrapolate=False):
    s = air_si(to_si(temperature, "[temperature]", "temperature"),
               to_si(pressure, "[pressure]", "pressure"), extrapolate=True)
    return replace(s, fluid="nitrogen")


def builtin_fluid_infos():
    return ()


def optional_fluid_infos():
    return ()

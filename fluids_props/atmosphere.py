"""PLACEHOLDER (to be replaced by the ISO 2533 module)."""

from __future__ import annotations

import numpy as np

from .air import air_si
from .units import to_si


def standard_atmosphere(altitude):
    z = np.asarray(to_si(altitude, "[length]", "altitude"))
    T = 288.15 - 0.0065 * z
    p = 101325.0 * (T / 288.15) ** 5.25588
    return air_si(T, p, extrapolate=True)

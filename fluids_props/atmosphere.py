r"""The ISO 2533 / ICAO standard atmosphere, -2 km to 80 km geopotential altitude.

The standard atmosphere is a defined model, not a measurement: air is a perfect gas with
R = 287.05287 J/(kg K) and gamma = 1.4, temperature is piecewise linear in geopotential altitude
H, and pressure follows from hydrostatic balance with constant g0 = 9.80665 m/s^2:

.. math::

    T = T_b + L_b (H - H_b), \qquad
    p = p_b \left(\frac{T}{T_b}\right)^{-g_0/(L_b R)} \ (L_b \ne 0), \qquad
    p = p_b \exp\left(-\frac{g_0 (H - H_b)}{R T_b}\right) \ (L_b = 0),

    \rho = \frac{p}{R T}, \qquad a = \sqrt{\gamma R T}, \qquad
    \mu = \frac{\beta_s T^{3/2}}{T + S}\ (\beta_s = 1.458 \times 10^{-6}\ kg/(m\,s\,K^{1/2}),
    \ S = 110.4\ K).

Layers (base geopotential altitude [km], lapse rate [K/km]): -2: -6.5 (the troposphere
continued below sea level, as the ISO 2533 tables start at -2 km), 11: 0, 20: +1.0, 32: +2.8,
47: 0, 51: -2.8, 71: -2.0, to 80 km. Sea level: 288.15 K, 101 325 Pa.

Geometric altitude z (the default input) is converted with the nominal Earth radius
r0 = 6 356 766 m: ``H = r0 z / (r0 + z)``; gravity at altitude is ``g = g0 (r0/(r0 + z))^2``.

The ISO 2533 check values used in the tests (sea level 1.225 kg/m^3, a = 340.294 m/s,
nu = 1.4607e-5 m^2/s; 22 632 Pa at 11 km and 5474.9 Pa at 20 km geopotential) are quoted from
memory of ISO 2533:1975 / ICAO Doc 7488 and the equivalent US Standard Atmosphere 1976; they
follow from the constants above.

References
----------
1. ISO 2533:1975. Standard Atmosphere. International Organization for Standardization, Geneva.
2. ICAO (1993). Manual of the ICAO Standard Atmosphere (extended to 80 kilometres), Doc 7488/3.
3. NOAA, NASA, USAF (1976). U.S. Standard Atmosphere, 1976. NOAA-S/T 76-1562, Washington DC.
"""

from __future__ import annotations

import numpy as np

from ._arrays import float_or_array as _out
from .state import FluidState
from .units import si_edge
from .validity import Range, check

#: Standard acceleration of gravity [m/s^2].
G0 = 9.80665
#: Specific gas constant of air in the standard atmosphere [J/(kg K)].
R_AIR = 287.05287
#: Ratio of specific heats [-].
GAMMA = 1.4
#: Nominal Earth radius for the geopotential conversion [m].
R_EARTH = 6356766.0
#: Sutherland constants of ISO 2533: beta_s [kg/(m s K^0.5)], S [K].
SUTHERLAND_BETA = 1.458e-6
SUTHERLAND_S = 110.4
#: Sea-level temperature [K] and pressure [Pa].
T0 = 288.15
P0 = 101325.0

#: Layer bases: geopotential altitude [m] and lapse rate [K/m].
_LAYER_H = np.array([-2000.0, 11000.0, 20000.0, 32000.0, 47000.0, 51000.0, 71000.0])
_LAYER_L = np.array([-6.5e-3, 0.0, 1.0e-3, 2.8e-3, 0.0, -2.8e-3, -2.0e-3])
H_TOP = 80000.0

# -2 km is accepted both as geometric and as geopotential altitude (they differ by 0.6 m there).
H_RANGE = Range("geopotential altitude", R_EARTH * -2000.0 / (R_EARTH - 2000.0), H_TOP, "m")
Z_RANGE = Range("altitude", -2000.0, R_EARTH * H_TOP / (R_EARTH - H_TOP), "m")

SOURCES = ("ISO 2533:1975 standard atmosphere (ICAO Doc 7488; US Standard Atmosphere 1976)",
           "viscosity: Sutherland law as in ISO 2533 (beta = 1.458e-6, S = 110.4 K)")


def _layer_bases():
    """Base temperature [K] and pressure [Pa] of each layer, integrated up from sea level."""
    t_b = np.empty_like(_LAYER_H)
    p_b = np.empty_like(_LAYER_H)
    # The first layer is defined by its sea-level point (H = 0), not by its base.
    t_b[0] = T0 + _LAYER_L[0] * (_LAYER_H[0] - 0.0)
    p_b[0] = P0 * (t_b[0] / T0) ** (-G0 / (_LAYER_L[0] * R_AIR))
    for i in range(1, _LAYER_H.size):
        dh = _LAYER_H[i] - _LAYER_H[i - 1]
        t_b[i] = t_b[i - 1] + _LAYER_L[i - 1] * dh
        p_b[i] = _pressure(p_b[i - 1], t_b[i - 1], _LAYER_L[i - 1], dh)
    return t_b, p_b


def _pressure(p_b, t_b, lapse, dh):
    lapse = np.asarray(lapse, dtype=float)
    safe = np.where(lapse == 0.0, 1.0, lapse)
    t = t_b + lapse * dh
    gradient = p_b * (t / t_b) ** (-G0 / (safe * R_AIR))
    isothermal = p_b * np.exp(-G0 * dh / (R_AIR * t_b))
    return np.where(lapse == 0.0, isothermal, gradient)


_T_BASE, _P_BASE = _layer_bases()


def geopotential_altitude(geometric_altitude_m):
    """Geopotential altitude [m] from geometric altitude [m]: ``H = r0 z / (r0 + z)``.

    References
    ----------
    1. ISO 2533:1975, with r0 = 6 356 766 m.
    """
    z = np.asarray(geometric_altitude_m, dtype=float)
    return R_EARTH * z / (R_EARTH + z)


def geometric_altitude(geopotential_altitude_m):
    """Geometric altitude [m] from geopotential altitude [m]: ``z = r0 H / (r0 - H)``."""
    h = np.asarray(geopotential_altitude_m, dtype=float)
    return R_EARTH * h / (R_EARTH - h)


def temperature_pressure_si(geopotential_altitude_m):
    """Standard temperature [K] and pressure [Pa] at a geopotential altitude [m].

    See the module notes for the equations; valid -2 km to 80 km.
    """
    h = np.asarray(geopotential_altitude_m, dtype=float)
    i = np.clip(np.searchsorted(_LAYER_H, h, side="right") - 1, 0, _LAYER_H.size - 1)
    dh = h - _LAYER_H[i]
    t = _T_BASE[i] + _LAYER_L[i] * dh
    p = _pressure(_P_BASE[i], _T_BASE[i], _LAYER_L[i], dh)
    return t, p


def sutherland_viscosity(temperature_K):
    r"""Dynamic viscosity of air [Pa s] by the Sutherland law of ISO 2533.

    .. math:: \mu = \frac{\beta_s T^{3/2}}{T + S}, \quad \beta_s = 1.458 \times 10^{-6},
              \ S = 110.4\ K

    References
    ----------
    1. ISO 2533:1975; U.S. Standard Atmosphere 1976, eq. (51).
    """
    T = np.asarray(temperature_K, dtype=float)
    return SUTHERLAND_BETA * T * np.sqrt(T) / (T + SUTHERLAND_S)


def standard_atmosphere_si(altitude_m, geopotential=False, extrapolate=False) -> FluidState:
    """The standard atmosphere at an altitude, SI in and out, vectorised.

    Parameters
    ----------
    altitude_m : float or array_like
        Altitude [m]: geometric above mean sea level, or geopotential if ``geopotential``.
        -2 km to 80 km geopotential (81.0 km geometric).
    geopotential : bool
        Read ``altitude_m`` as geopotential altitude.
    extrapolate : bool
        Continue the lowest and highest layers beyond the range instead of raising.

    Returns
    -------
    FluidState
        Fluid ``"standard_atmosphere"``: temperature, pressure, density, dynamic viscosity,
        speed of sound; ``extra`` holds ``ratio_of_specific_heats`` (1.4),
        ``geopotential_altitude`` [m], ``geometric_altitude`` [m] and ``gravity`` [m/s^2].

    Raises
    ------
    OutOfRangeError
        Outside -2 km to 80 km geopotential.

    References
    ----------
    1. ISO 2533:1975. 2. ICAO Doc 7488/3 (1993). 3. U.S. Standard Atmosphere 1976.
    """
    alt = np.asarray(altitude_m, dtype=float)
    if geopotential:
        check(alt, H_RANGE, "the ISO 2533 standard atmosphere", extrapolate)
        h, z = alt, geometric_altitude(alt)
    else:
        check(alt, Z_RANGE, "the ISO 2533 standard atmosphere", extrapolate)
        h, z = geopotential_altitude(alt), alt
    t, p = temperature_pressure_si(h)
    rho = p / (R_AIR * t)
    a = np.sqrt(GAMMA * R_AIR * t)
    mu = sutherland_viscosity(t)
    g = G0 * (R_EARTH / (R_EARTH + z)) ** 2
    return FluidState(
        "standard_atmosphere", _out(t), _out(p), _out(rho), _out(mu), speed_of_sound_si=_out(a),
        extra={"ratio_of_specific_heats": _out(np.full_like(t, GAMMA)),
               "geopotential_altitude": _out(h), "geometric_altitude": _out(z),
               "gravity": _out(g)},
        sources=SOURCES,
    )


@si_edge(standard_atmosphere_si, altitude="[length]")
def standard_atmosphere(altitude, geopotential: bool = False,
                        extrapolate: bool = False) -> FluidState:
    """The ISO 2533 / ICAO standard atmosphere at an altitude.

    Parameters
    ----------
    altitude : str, pint.Quantity or array
        Altitude, e.g. ``"11 km"`` or ``"36000 ft"``; geometric above mean sea level unless
        ``geopotential`` is True. -2 km to 80 km geopotential.
    geopotential : bool
        Read ``altitude`` as geopotential altitude (the argument of the ISO 2533 tables).
    extrapolate : bool
        Continue the lowest and highest layers beyond the range instead of raising.

    Returns
    -------
    FluidState
        See :func:`standard_atmosphere_si`.

    Examples
    --------
    >>> round(standard_atmosphere("11 km", geopotential=True).pressure_si)
    22632
    """

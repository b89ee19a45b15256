r"""Dry and moist air: density, viscosity, speed of sound and ratio of specific heats.

How the two published formulations are combined
------------------------------------------------
The CIPM-2007 equation (Picard et al. 2008) is the metrological reference for the density of
moist laboratory air, but its compressibility factor ``Z`` is fitted only over 600-1100 hPa and
15-27 degC. A wind tunnel may run from 0.5 to 10 bar and well below or above room temperature.
So density is computed here from the CIPM-2007 equation with its own molar masses, gas constant,
saturation vapour pressure, enhancement factor and mole fraction of water vapour, but with a
compressibility factor split in two:

.. math::

    Z(p, T, x_v) = Z_\mathrm{dry}(p, T)
                   + [Z_\mathrm{CIPM}(p, T, x_v) - Z_\mathrm{CIPM}(p, T, 0)]

where the bracket is the water-vapour part of the CIPM-2007 ``Z`` and ``Z_dry`` is the dry-air
part of the CIPM-2007 ``Z`` inside its window, and outside it the compressibility factor of the
reference equation of state for dry air (Lemmon et al. 2000; its virial series to the fifth
coefficient, see :mod:`fluids_props._helmholtz_gas`), joined by a smooth weight
(:func:`cipm_weight`). The two dry-air ``Z`` differ by about 2e-5 near 1 atm, within the
CIPM-2007 uncertainty; so the CIPM-2007 values are reproduced inside the window, and outside it
the dry-air non-ideality is that of the reference equation (tested against it from 200 to 400 K
and 1 kPa to 2 MPa), while the small water-vapour term is extrapolated (it is 2e-4 of density
at 30 degC saturation).

Viscosity is that of Lemmon & Jacobsen (2004) for dry air, mixed with the dilute-gas viscosity of
water vapour (IAPWS 2008, eq. 11) by Wilke's rule. Speed of sound and the ratio of specific heats
are those of the dry-air equation of state, corrected for humidity with the ideal-gas mixture of
dry air and water vapour (isobaric molar heat capacity of water vapour 33.59 J/(mol K), the
NIST-JANAF value at 298.15 K, quoted from memory; it varies by less than 1 % from 250 to 330 K and
enters only through the vapour mole fraction).

Validity: 200-400 K, 1 kPa-2 MPa for dry air; moist air (relative humidity > 0) 0-100 degC
with water-vapour partial pressure below the total pressure. Relative humidity is a fraction
(``0.5``, ``"50 %"`` or ``"50 percent"``) over liquid water.

References
----------
1. Picard, A., Davis, R. S., Glaeser, M. & Fujii, K. (2008). Revised formula for the density of
   moist air (CIPM-2007). Metrologia 45, 149-155.
2. Lemmon, E. W., Jacobsen, R. T, Penoncello, S. G. & Friend, D. G. (2000). Thermodynamic
   properties of air and mixtures of nitrogen, argon, and oxygen from 60 to 2000 K at pressures
   to 2000 MPa. J. Phys. Chem. Ref. Data 29(3), 331-385.
3. Lemmon, E. W. & Jacobsen, R. T (2004). Viscosity and thermal conductivity equations for
   nitrogen, oxygen, argon, and air. Int. J. Thermophys. 25(1), 21-69.
4. IAPWS (2008). Release on the IAPWS formulation 2008 for the viscosity of ordinary water
   substance (IAPWS R12-08); Huber, M. L. et al. (2009), J. Phys. Chem. Ref. Data 38(2), 101-125.
5. Wilke, C. R. (1950). A viscosity equation for gas mixtures. J. Chem. Phys. 18(4), 517-519.
6. Chase, M. W. (1998). NIST-JANAF Thermochemical Tables, 4th ed. J. Phys. Chem. Ref. Data
   Monograph 9.
"""

from __future__ import annotations

import numpy as np

from . import _helmholtz_gas as hg
from ._arrays import broadcast_float_arrays, check_ranges
from ._arrays import float_or_array as _out
from .registry import FluidInfo
from .state import FluidState
from .units import si_edge
from .validity import OutOfRangeError, Range, check

T_RANGE = Range("temperature", 200.0, 400.0, "K")
P_RANGE = Range("pressure", 1.0e3, 2.0e6, "Pa")
RH_RANGE = Range("relative_humidity", 0.0, 1.0, "-")
#: Temperature range over which humidity is accepted (CIPM-2007 saturation formula over water).
T_MOIST_RANGE = Range("temperature (moist air)", 273.15, 373.15, "K")

#: Molar gas constant of CIPM-2007 [J/(mol K)].
R_CIPM = 8.314472
#: Molar mass of water [kg/mol] (CIPM-2007).
M_WATER = 18.01528e-3
#: Mole fraction of CO2 assumed for laboratory air (CIPM-2007 reference value).
X_CO2 = 0.0004
#: Isobaric molar heat capacity of water vapour, ideal gas, 298.15 K [J/(mol K)] (NIST-JANAF).
CP_WATER_VAPOUR = 33.59

SOURCES = (
    "density: CIPM-2007 (Picard et al. 2008, Metrologia 45:149) with dry-air Z from "
    "Lemmon et al. 2000 (JPCRD 29:331)",
    "viscosity: Lemmon & Jacobsen 2004 (IJT 25:21); water vapour IAPWS 2008 dilute gas; "
    "Wilke 1950 mixing",
    "speed of sound: Lemmon et al. 2000 equation of state, ideal-gas humidity correction",
)


def molar_mass_dry_air(x_co2: float = X_CO2) -> float:
    r"""Molar mass of dry air [kg/mol], CIPM-2007 eq. (A1.3).

    .. math:: M_a = [28.96546 + 12.011 (x_{CO_2} - 0.0004)] \times 10^{-3}

    Parameters
    ----------
    x_co2 : float
        Mole fraction of carbon dioxide [-].

    References
    ----------
    1. Picard et al. (2008), Metrologia 45, 149-155.
    """
    return (28.96546 + 12.011 * (x_co2 - 0.0004)) * 1e-3


def saturation_vapour_pressure_si(temperature_K):
    r"""Saturation vapour pressure of water over liquid water [Pa], CIPM-2007.

    .. math:: p_{sv} = \exp(A T^2 + B T + C + D/T)

    with A = 1.2378847e-5 K^-2, B = -1.9121316e-2 K^-1, C = 33.93711047, D = -6.3431645e3 K.

    Parameters
    ----------
    temperature_K : float or ndarray
        Temperature [K].

    References
    ----------
    1. Picard et al. (2008), Metrologia 45, 149-155, eq. (A1.5) (after Davis 1992).
    """
    T = np.asarray(temperature_K, dtype=float)
    return np.exp(1.2378847e-5 * T**2 - 1.9121316e-2 * T + 33.93711047 - 6.3431645e3 / T)


def enhancement_factor(temperature_K, pressure_Pa):
    r"""Enhancement factor of water vapour in air [-], CIPM-2007.

    .. math:: f = 1.00062 + 3.14 \times 10^{-8} p + 5.6 \times 10^{-7} t^2

    with p in Pa and t in degC.

    References
    ----------
    1. Picard et al. (2008), Metrologia 45, 149-155, eq. (A1.4).
    """
    t = np.asarray(temperature_K, dtype=float) - 273.15
    return 1.00062 + 3.14e-8 * np.asarray(pressure_Pa, dtype=float) + 5.6e-7 * t**2


def water_vapour_mole_fraction(temperature_K, pressure_Pa, relative_humidity):
    r"""Mole fraction of water vapour [-] from relative humidity, CIPM-2007.

    .. math:: x_v = h f(p, t) p_{sv}(T) / p

    References
    ----------
    1. Picard et al. (2008), Metrologia 45, 149-155.
    """
    p = np.asarray(pressure_Pa, dtype=float)
    h = np.asarray(relative_humidity, dtype=float)
    return h * enhancement_factor(temperature_K, p) * saturation_vapour_pressure_si(
        temperature_K) / p


def compressibility_cipm(temperature_K, pressure_Pa, x_v):
    r"""Compressibility factor of moist air [-], CIPM-2007 eq. (A1.6).

    .. math::

        Z = 1 - \frac{p}{T}[a_0 + a_1 t + a_2 t^2 + (b_0 + b_1 t) x_v + (c_0 + c_1 t) x_v^2]
            + \frac{p^2}{T^2}(d + e x_v^2)

    Fitted for 600-1100 hPa and 15-27 degC.

    References
    ----------
    1. Picard et al. (2008), Metrologia 45, 149-155.
    """
    T = np.asarray(temperature_K, dtype=float)
    p = np.asarray(pressure_Pa, dtype=float)
    x = np.asarray(x_v, dtype=float)
    t = T - 273.15
    a = 1.58123e-6 - 2.9331e-8 * t + 1.1043e-10 * t**2
    b = (5.707e-6 - 2.051e-8 * t) * x
    c = (1.9898e-4 - 2.376e-6 * t) * x**2
    return 1.0 - p / T * (a + b + c) + (p / T) ** 2 * (1.83e-11 - 0.765e-8 * x**2)


def cipm2007_density_si(temperature_K, pressure_Pa, relative_humidity=0.0, x_co2=X_CO2):
    r"""Density of moist air [kg/m^3] by the CIPM-2007 equation as published.

    .. math:: \rho = \frac{p M_a}{Z R T}\left[1 - x_v\left(1 - \frac{M_v}{M_a}\right)\right]

    Valid 600-1100 hPa, 15-27 degC (relative uncertainty 22e-6 there). :func:`air_si` uses
    the wide-range variant described in the module notes.

    References
    ----------
    1. Picard et al. (2008), Metrologia 45, 149-155.
    """
    T = np.asarray(temperature_K, dtype=float)
    p = np.asarray(pressure_Pa, dtype=float)
    x = water_vapour_mole_fraction(T, p, relative_humidity)
    ma = molar_mass_dry_air(x_co2)
    z = compressibility_cipm(T, p, x)
    return p * ma / (z * R_CIPM * T) * (1.0 - x * (1.0 - M_WATER / ma))


def water_vapour_viscosity_si(temperature_K):
    r"""Dilute-gas viscosity of water vapour [Pa s], IAPWS 2008 eq. (11).

    .. math:: \mu_0 = \frac{100 \sqrt{\bar T}}{\sum_{i=0}^{3} H_i / \bar T^i}\ \mu Pa\,s,
              \quad \bar T = T / 647.096\ K

    with H = (1.67752, 2.20462, 0.6366564, -0.241605).

    References
    ----------
    1. IAPWS R12-08 (2008); Huber et al. (2009), J. Phys. Chem. Ref. Data 38, 101-125.
    """
    tb = np.asarray(temperature_K, dtype=float) / 647.096
    denom = 1.67752 + 2.20462 / tb + 0.6366564 / tb**2 - 0.241605 / tb**3
    return 100.0 * np.sqrt(tb) / denom * 1e-6


def wilke_viscosity(mu_1, mu_2, m_1, m_2, x_2):
    r"""Viscosity of a binary gas mixture [Pa s] by Wilke's rule.

    .. math::

        \mu = \sum_i \frac{x_i \mu_i}{\sum_j x_j \phi_{ij}}, \quad
        \phi_{ij} = \frac{[1 + (\mu_i/\mu_j)^{1/2} (M_j/M_i)^{1/4}]^2}{[8 (1 + M_i/M_j)]^{1/2}}

    References
    ----------
    1. Wilke, C. R. (1950), J. Chem. Phys. 18, 517-519.
    """
    x_1 = 1.0 - x_2

    def phi(mi, mj, wi, wj):
        return (1.0 + np.sqrt(mi / mj) * (wj / wi) ** 0.25) ** 2 / np.sqrt(8.0 * (1.0 + wi / wj))

    return (x_1 * mu_1 / (x_1 + x_2 * phi(mu_1, mu_2, m_1, m_2))
            + x_2 * mu_2 / (x_2 + x_1 * phi(mu_2, mu_1, m_2, m_1)))


#: CIPM-2007 window [K] and [Pa], and the widths of the blend to the equation of state outside it.
CIPM_T_WINDOW = (288.15, 300.15, 10.0)
CIPM_P_WINDOW = (6.0e4, 1.1e5, 4.0e4)


def _ramp(x, low, high, width):
    """1 inside [low, high], falling to 0 over ``width`` outside it (smoothstep, C1)."""
    s = np.minimum(np.maximum(np.maximum(low - x, x - high), 0.0) / width, 1.0)
    return 1.0 - s * s * (3.0 - 2.0 * s)


def cipm_weight(temperature_K, pressure_Pa):
    """Weight [-] of the CIPM-2007 dry-air compressibility against the equation of state.

    1 inside the CIPM-2007 window (15-27 degC, 600-1100 hPa), where the published equation is
    reproduced exactly; falls smoothly (smoothstep over 10 K and 40 kPa) to 0 outside it, where
    the dry-air non-ideality is that of Lemmon et al. (2000). The two differ by about 2e-5 of
    density near 1 atm, within the CIPM-2007 uncertainty (22e-6), so the blend only avoids a
    step.
    """
    return (_ramp(np.asarray(temperature_K, float), *CIPM_T_WINDOW)
            * _ramp(np.asarray(pressure_Pa, float), *CIPM_P_WINDOW))


def _check_inputs(T, p, h, extrapolate):
    check_ranges("air", extrapolate, (T, T_RANGE), (p, P_RANGE), (h, RH_RANGE))
    moist = h > 0
    if np.any(moist):
        check(T[moist], T_MOIST_RANGE, "moist air (CIPM-2007 saturation over water)",
              extrapolate)


def air_si(temperature_K, pressure_Pa=101325.0, relative_humidity=0.0, extrapolate=False, **_):
    r"""Properties of dry or moist air, SI in and out, vectorised.

    Parameters
    ----------
    temperature_K : float or array_like
        Temperature [K], 200-400 K (moist air 273.15-373.15 K).
    pressure_Pa : float or array_like
        Absolute pressure [Pa], 1 kPa-2 MPa.
    relative_humidity : float or array_like
        Relative humidity over liquid water as a fraction [-], 0-1.
    extrapolate : bool
        Evaluate outside the validity ranges instead of raising.

    Returns
    -------
    FluidState
        Density, dynamic viscosity, speed of sound; ``extra`` holds
        ``ratio_of_specific_heats`` [-], ``relative_humidity`` [-],
        ``water_vapour_mole_fraction`` [-], ``compressibility`` [-] and ``isobaric_heat_capacity``
        [J/(kg K)] (of dry air).

    Raises
    ------
    OutOfRangeError
        Outside the ranges, or when the water-vapour partial pressure would exceed the total
        pressure.

    Notes
    -----
    See the module notes for how CIPM-2007 and the reference equation of state for dry air are
    combined.

    References
    ----------
    1. Picard et al. (2008), Metrologia 45, 149-155.
    2. Lemmon et al. (2000), J. Phys. Chem. Ref. Data 29, 331-385.
    3. Lemmon & Jacobsen (2004), Int. J. Thermophys. 25, 21-69.
    """
    T, p, h = broadcast_float_arrays("air", temperature=temperature_K, pressure=pressure_Pa,
                                     relative_humidity=relative_humidity)
    _check_inputs(T, p, h, extrapolate)
    x_v = water_vapour_mole_fraction(T, p, h)
    if np.any(x_v >= 1.0):
        first = float(np.asarray(T)[x_v >= 1.0].flat[0])
        raise OutOfRangeError(
            f"relative_humidity: at {first - 273.15:g} degC the water-vapour partial pressure "
            "would exceed the total pressure; expected a lower humidity or temperature"
        )
    dry = hg.gas_state(hg.AIR, T, p)
    m_a = molar_mass_dry_air()
    z_cipm_dry = compressibility_cipm(T, p, 0.0)
    w = cipm_weight(T, p)
    z = w * z_cipm_dry + (1.0 - w) * dry["compressibility"]
    mu, gamma, a = dry["viscosity"], dry["gamma"], dry["speed_of_sound"]
    if np.any(h > 0):  # the planner's dry-air grids skip the humidity terms
        z = z + compressibility_cipm(T, p, x_v) - z_cipm_dry
        mu = wilke_viscosity(mu, water_vapour_viscosity_si(T), m_a, M_WATER, x_v)
        # Humidity correction of gamma and sound speed: ideal-gas mixing of heat capacities.
        cv_a0 = dry["cv0"] * hg.AIR.molar_mass  # ideal-gas molar heat capacities [J/(mol K)]
        cp_a0 = cv_a0 + hg.AIR.gas_constant
        cp_m0 = (1.0 - x_v) * cp_a0 + x_v * CP_WATER_VAPOUR
        cv_m0 = cp_m0 - hg.AIR.gas_constant
        m_m = (1.0 - x_v) * m_a + x_v * M_WATER
        ratio = (cp_m0 / cv_m0) / (cp_a0 / cv_a0)
        gamma = gamma * ratio
        a = a * np.sqrt(ratio * m_a / m_m)
    rho = p * m_a / (z * R_CIPM * T) * (1.0 - x_v * (1.0 - M_WATER / m_a))
    return FluidState(
        "air", _out(T), _out(p), _out(rho), _out(mu), speed_of_sound_si=_out(a),
        extra={"ratio_of_specific_heats": _out(gamma), "relative_humidity": _out(h),
               "water_vapour_mole_fraction": _out(x_v), "compressibility": _out(z),
               "isobaric_heat_capacity": _out(dry["cp"])},
        sources=SOURCES,
    )


@si_edge(air_si, temperature="[temperature]", pressure="[pressure]",
         relative_humidity="dimensionless")
def air(temperature, pressure="101325 Pa", relative_humidity=0, extrapolate=False) -> FluidState:
    r"""Properties of dry or moist air.

    Parameters
    ----------
    temperature : str, pint.Quantity or array
        Temperature, e.g. ``"15 degC"`` or ``"59 degF"`` (200-400 K).
    pressure : str, pint.Quantity or array
        Absolute pressure, e.g. ``"2 bar"`` (1 kPa-2 MPa).
    relative_humidity : str, number or array
        Fraction ``0.5``, or ``"50 %"``, ``"50 percent"``.
    extrapolate : bool
        Evaluate outside the validity ranges instead of raising.

    Returns
    -------
    FluidState
        See :func:`air_si`.

    Examples
    --------
    >>> round(air("20 degC", "101325 Pa", "50 %").density_si, 5)
    1.19931
    """


def air_density_si(temperature_K, pressure_Pa=101325.0, relative_humidity=0.0):
    r"""Density of air [kg/m^3]; see :func:`air_si`."""
    return air_si(temperature_K, pressure_Pa, relative_humidity).density_si


def air_viscosity_si(temperature_K, pressure_Pa=101325.0, relative_humidity=0.0):
    r"""Dynamic viscosity of air [Pa s]; see :func:`air_si`."""
    return air_si(temperature_K, pressure_Pa, relative_humidity).dynamic_viscosity_si


def air_speed_of_sound_si(temperature_K, pressure_Pa=101325.0, relative_humidity=0.0):
    r"""Speed of sound in air [m/s]; see :func:`air_si`."""
    return air_si(temperature_K, pressure_Pa, relative_humidity).speed_of_sound_si


FLUID_INFO = FluidInfo(
    "air", "gas",
    "dry or moist air, 200-400 K, 1 kPa-2 MPa (CIPM-2007 + Lemmon 2000 + Lemmon & Jacobsen 2004)",
    (T_RANGE, P_RANGE, RH_RANGE), air_si, sources=SOURCES,
    options={"relative_humidity": 0.0},
)

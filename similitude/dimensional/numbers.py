"""The named dimensionless numbers as plain functions of SI floats or arrays.

Definitions follow the conventions of the trade (ITTC Symbols and Terminology, 2017 [1]):
Fr = V/sqrt(gL), Re = VL/nu, We = rho V^2 L/sigma, Ma = V/a, sigma_v = (p - p_v)/(rho V^2/2),
St = fL/V, Eu = dp/(rho V^2), J = V_A/(nD).

References
----------
.. [1] ITTC, "ITTC Symbols and Terminology List", version 2017.
"""

from __future__ import annotations

import numpy as np

from similitude.constants import G0


def froude(speed, length, g=G0):
    """Froude number Fr = V / sqrt(g L) [-].

    Parameters
    ----------
    speed : numeric
        Speed [m/s].
    length : numeric
        Reference length [m] (waterline length for ships; water depth for the depth Froude
        number).
    g : numeric
        Acceleration of gravity [m/s^2].
    """
    return np.divide(speed, np.sqrt(np.multiply(g, length)))


def reynolds(speed, length, kinematic_viscosity):
    """Reynolds number Re = V L / nu [-]; speed [m/s], length [m], nu [m^2/s]."""
    return np.divide(np.multiply(speed, length), kinematic_viscosity)


def weber(density, speed, length, surface_tension):
    """Weber number We = rho V^2 L / sigma [-]; rho [kg/m^3], V [m/s], L [m], sigma [N/m]."""
    return np.divide(np.multiply(density, np.square(speed)) * length, surface_tension)


def mach(speed, speed_of_sound):
    """Mach number Ma = V / a [-]; V and a [m/s]."""
    return np.divide(speed, speed_of_sound)


def cavitation_number(pressure, vapour_pressure, density, speed):
    """Cavitation number sigma_v = (p - p_v) / (rho V^2 / 2) [-].

    Parameters
    ----------
    pressure : numeric
        Absolute static pressure at the reference point [Pa].
    vapour_pressure : numeric
        Vapour pressure of the liquid [Pa].
    density : numeric
        Liquid density [kg/m^3].
    speed : numeric
        Reference speed [m/s] (for a propeller, the section speed or n D).
    """
    return np.divide(np.subtract(pressure, vapour_pressure),
                     0.5 * np.multiply(density, np.square(speed)))


def strouhal(frequency, length, speed):
    """Strouhal number St = f L / V [-]; f [1/s], L [m], V [m/s]."""
    return np.divide(np.multiply(frequency, length), speed)


def euler(pressure_difference, density, speed):
    """Euler number Eu = dp / (rho V^2) [-]; dp [Pa], rho [kg/m^3], V [m/s]."""
    return np.divide(pressure_difference, np.multiply(density, np.square(speed)))


def advance_ratio(advance_speed, rotation_rate, diameter):
    """Advance ratio J = V_A / (n D) [-]; V_A [m/s], n [1/s], D [m]."""
    return np.divide(advance_speed, np.multiply(rotation_rate, diameter))


#: Radius fraction r/R of the blade section whose Reynolds number a plan reports [-].
BLADE_SECTION_RADIUS = 0.7


def blade_section_speed(advance_speed, rotation_rate, diameter,
                        radius_fraction=BLADE_SECTION_RADIUS):
    """Inflow speed of a propeller blade section, sqrt(V_A^2 + (x pi n D)^2) [m/s]; V_A [m/s],
    n [1/s], D [m], x = r/R [-] (0.7 by default)."""
    return np.hypot(advance_speed, radius_fraction * np.pi * np.multiply(rotation_rate, diameter))


def blade_reynolds(advance_speed, rotation_rate, diameter, chord, kinematic_viscosity,
                   radius_fraction=BLADE_SECTION_RADIUS):
    """Blade-section Reynolds number Re_0.7R = c sqrt(V_A^2 + (0.7 pi n D)^2) / nu [-].

    The chord c [m] is that of the section at ``radius_fraction`` (0.7 R by default); the
    ITTC open-water procedure reports the propeller Reynolds number at 0.7 R (ITTC
    7.5-02-03-02.1).
    """
    return reynolds(blade_section_speed(advance_speed, rotation_rate, diameter, radius_fraction),
                    chord, kinematic_viscosity)

"""Glycerol-water mixtures at 0.101325 MPa: Cheng (2008) viscosity, Volk & Kaehler (2018) density.

A test fluid for raising viscosity (lowering Reynolds number) at a given temperature. The
glycerol content is the MASS fraction ``C_m`` [kg/kg]; ``t`` is in degC. Closed forms::

    rho_w = 1000 (1 - |(t - 3.98)/615|^1.71)                 [kg/m^3]  (Volk & Kaehler [2])
    rho_g = 1273.3 - 0.6121 t                                [kg/m^3]
    1/rho_ideal = C_m/rho_g + (1 - C_m)/rho_w                 (ideal mixing of volumes)
    rho = rho_ideal * (1 + k sin(C_m^1.31 pi)^0.81),  k = 1.78e-6 t^2 - 1.82e-4 t + 1.41e-2

    mu_w = 1.790e-3 exp[(-1230 - t) t / (36100 + 360 t)]     [Pa s]   (Cheng [1] Eq. 21)
    mu_g = 12.100 exp[(-1233 + t) t / (9900 + 70 t)]         [Pa s]   (Cheng [1] Eq. 22)
    a = 0.705 - 0.0017 t,  b = (4.9 + 0.036 t) a^2.5
    alpha = 1 - C_m + a b C_m (1 - C_m) / (a C_m + b (1 - C_m))
    mu = mu_w^alpha mu_g^(1 - alpha)                                    (Cheng [1] Eq. 6)

Vapour pressure: Raoult's law on the water mole fraction with the pure-water value of
Wagner & Pruss (:func:`fluids_props.water.vapour_pressure`); glycerol itself is practically
involatile (its own vapour pressure is of order 0.01 Pa at room temperature). Raoult's law
treats the solution as ideal, a textbook approximation [3]_ that is close for dilute solutions
and overestimates the water activity somewhat at high glycerol content. Surface tension: no
correlation is implemented (``None``).

Validity: 0-100 degC, C_m 0-1 (Cheng [1]); Volk & Kaehler give < 0.07 % for the density at
15-30 degC and a good approximation over 0-100 degC [2]_. Pressure is recorded but the
properties are those at 0.101325 MPa (the pressure effect on a liquid's density is about
0.005 % per bar).

References
----------
.. [1] N.-S. Cheng, "Formula for the Viscosity of a Glycerol-Water Mixture", Ind. Eng. Chem.
   Res. 47 (2008) 3285-3288, doi:10.1021/ie071349z.
.. [2] A. Volk and C. J. Kaehler, "Density model for aqueous glycerol solutions", Exp. Fluids
   59 (2018) 75, doi:10.1007/s00348-018-2527-y. The pure-glycerol and pure-water fits and the
   contraction coefficients were read from the authors' public implementation, not re-read in
   the paper.
.. [3] Raoult's law for ideal solutions, e.g. P. Atkins and J. de Paula, Physical Chemistry,
   Oxford University Press (common textbook practice).
"""

from __future__ import annotations

import numpy as np

from . import water
from ._arrays import broadcast_copy, check_ranges, float_arrays, numpy_scalar
from .registry import FluidInfo
from .state import FluidState
from .units import si_edge
from .validity import Range

T_RANGE = Range("temperature", 273.15, 373.15, "K")
W_RANGE = Range("mass_fraction", 0.0, 1.0, "kg/kg")

#: Molar masses [kg/mol] of water (IAPWS) and glycerol C3H8O3 (IUPAC atomic weights).
M_WATER = 0.018015268
M_GLYCEROL = 0.09209

#: Volk & Kaehler (2018): rho_g = G0 + G1 t [kg/m^3]; rho_w = 1000 (1 - |(t - W0)/W1|^W2).
DENSITY_GLYCEROL: tuple[float, float] = (1273.3, -0.6121)
DENSITY_WATER: tuple[float, float, float] = (3.98, 615.0, 1.71)
#: Volk & Kaehler (2018) contraction: k = K0 + K1 t + K2 t^2, exponents (1.31, 0.81).
CONTRACTION_K: tuple[float, float, float] = (1.41e-2, -1.82e-4, 1.78e-6)
CONTRACTION_EXPONENTS: tuple[float, float] = (1.31, 0.81)

SOURCES: tuple[str, ...] = (
    "density: Volk & Kaehler (2018), Exp. Fluids 59:75",
    "viscosity: Cheng (2008), Ind. Eng. Chem. Res. 47:3285",
    "vapour pressure: Raoult's law (ideal solution) with Wagner & Pruss (1993) water",
    "surface tension: not implemented",
)


def density(temperature, mass_fraction):
    """Density of a glycerol-water mixture, Volk & Kaehler (2018).

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].
    mass_fraction : float or array_like
        Glycerol mass fraction C_m [kg/kg].

    Returns
    -------
    float or ndarray
        Density [kg/m^3].

    Notes
    -----
    ``rho = rho_ideal (1 + k sin(C_m^1.31 pi)^0.81)``, ``1/rho_ideal = C_m/rho_g +
    (1 - C_m)/rho_w``, ``rho_g = 1273.3 - 0.6121 t``, ``rho_w = 1000(1 - |(t - 3.98)/615|^1.71)``,
    ``k = 1.78e-6 t^2 - 1.82e-4 t + 1.41e-2`` (t in degC) [1]_.

    References
    ----------
    .. [1] A. Volk and C. J. Kaehler, Exp. Fluids 59 (2018) 75.
    """
    t = np.asarray(temperature, dtype=float) - 273.15
    c = np.asarray(mass_fraction, dtype=float)
    w0, w1, w2 = DENSITY_WATER
    rho_w = 1000.0 * (1.0 - np.abs((t - w0) / w1) ** w2)
    rho_g = DENSITY_GLYCEROL[0] + DENSITY_GLYCEROL[1] * t
    rho_ideal = 1.0 / (c / rho_g + (1.0 - c) / rho_w)
    k0, k1, k2 = CONTRACTION_K
    e1, e2 = CONTRACTION_EXPONENTS
    k = k0 + t * (k1 + t * k2)
    # clip guards the tiny negative sine that rounding gives at C_m = 1 (sin(pi) ~ 1e-16)
    sine = np.clip(np.sin(c**e1 * np.pi), 0.0, None)
    return numpy_scalar(rho_ideal * (1.0 + k * sine**e2))


def dynamic_viscosity(temperature, mass_fraction):
    """Dynamic viscosity of a glycerol-water mixture, Cheng (2008).

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].
    mass_fraction : float or array_like
        Glycerol mass fraction C_m [kg/kg].

    Returns
    -------
    float or ndarray
        Dynamic viscosity [Pa s].

    Notes
    -----
    ``mu = mu_w^alpha mu_g^(1-alpha)`` with ``alpha = 1 - C_m + a b C_m (1 - C_m) /
    (a C_m + b (1 - C_m))``, ``a = 0.705 - 0.0017 t``, ``b = (4.9 + 0.036 t) a^2.5``,
    ``mu_w = 1.790 exp[(-1230 - t) t/(36100 + 360 t)]`` mPa s and
    ``mu_g = 12100 exp[(-1233 + t) t/(9900 + 70 t)]`` mPa s, t in degC [1]_ (Eqs. 6, 11-13,
    21, 22). Valid 0-100 degC, 0-100 % glycerol.

    References
    ----------
    .. [1] N.-S. Cheng, Ind. Eng. Chem. Res. 47 (2008) 3285-3288.
    """
    t = np.asarray(temperature, dtype=float) - 273.15
    c = np.asarray(mass_fraction, dtype=float)
    mu_w = 1.790e-3 * np.exp((-1230.0 - t) * t / (36100.0 + 360.0 * t))
    mu_g = 12.100 * np.exp((-1233.0 + t) * t / (9900.0 + 70.0 * t))
    a = 0.705 - 0.0017 * t
    b = (4.9 + 0.036 * t) * a**2.5
    alpha = 1.0 - c + a * b * c * (1.0 - c) / (a * c + b * (1.0 - c))
    return numpy_scalar(mu_g * (mu_w / mu_g) ** alpha)


def vapour_pressure(temperature, mass_fraction):
    """Water vapour pressure over a glycerol-water mixture by Raoult's law.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].
    mass_fraction : float or array_like
        Glycerol mass fraction C_m [kg/kg].

    Returns
    -------
    float or ndarray
        Vapour pressure [Pa]: ``x_w p_v,w(T)``, ``x_w`` the water mole fraction.

    Notes
    -----
    Ideal-solution approximation (common textbook practice); glycerol's own partial
    pressure is neglected.
    """
    c = np.asarray(mass_fraction, dtype=float)
    n_w = (1.0 - c) / M_WATER
    n_g = c / M_GLYCEROL
    return numpy_scalar(water.vapour_pressure(temperature) * n_w / (n_w + n_g))


def glycerol_water_si(temperature_K, pressure_Pa=water.P0, mass_fraction=0.5,
                      extrapolate=False, **_) -> FluidState:
    """Properties of a glycerol-water mixture in SI, vectorised.

    Parameters
    ----------
    temperature_K : float or array_like
        Temperature [K].
    pressure_Pa : float or array_like
        Absolute pressure [Pa], recorded only (properties are the 0.101325 MPa values).
    mass_fraction : float or array_like
        Glycerol mass fraction [kg/kg].
    extrapolate : bool
        If True, no validity check is made (0-100 degC, 0-1 kg/kg).

    Returns
    -------
    FluidState
        ``extra["mass_fraction"]`` carries the glycerol mass fraction; surface tension is None.
    """
    (T, p, c), shape = float_arrays("glycerol_water", temperature=temperature_K,
                                    pressure=pressure_Pa, mass_fraction=mass_fraction)
    check_ranges("glycerol_water", extrapolate, (T, T_RANGE), (c, W_RANGE))
    T_b, c_b = np.broadcast_to(T, shape), np.broadcast_to(c, shape)
    return FluidState(
        fluid="glycerol_water",
        temperature_si=broadcast_copy(T_b, shape),
        pressure_si=broadcast_copy(p, shape),
        density_si=density(T_b, c_b),
        dynamic_viscosity_si=dynamic_viscosity(T_b, c_b),
        vapour_pressure_si=vapour_pressure(T_b, c_b),
        surface_tension_si=None,
        extra={"mass_fraction": broadcast_copy(c_b, shape)},
        sources=SOURCES,
    )


@si_edge(glycerol_water_si, temperature="[temperature]", mass_fraction="dimensionless",
         pressure="[pressure]")
def glycerol_water(temperature, mass_fraction, pressure="101325 Pa",
                   extrapolate: bool = False) -> FluidState:
    """Properties of a glycerol-water mixture.

    Parameters
    ----------
    temperature : str, pint.Quantity or array of them
        Temperature, e.g. ``"20 degC"``.
    mass_fraction : str, pint.Quantity or number
        Glycerol mass fraction, e.g. ``0.5``, ``"50 %"`` or ``"500 g/kg"``.
    pressure : str or pint.Quantity
        Absolute pressure, recorded only; default ``"101325 Pa"``.
    extrapolate : bool
        If True, evaluate outside the validity ranges without error.

    Returns
    -------
    FluidState
        See :func:`glycerol_water_si`.
    """


FLUID_INFO = FluidInfo(
    name="glycerol_water",
    kind="liquid",
    description="glycerol-water mixture, Cheng (2008) viscosity, Volk & Kaehler (2018) density",
    ranges=(T_RANGE, W_RANGE),
    evaluate_si=glycerol_water_si,
    sources=SOURCES,
    fixed_pressure=True,
    options={"mass_fraction": 0.5},
)

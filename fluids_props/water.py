"""Fresh (pure, air-free) liquid water from the IAPWS formulations, 0-40 degC.

Every property is a closed-form expression in temperature (and pressure), with no iteration,
so each one can be written as a spreadsheet formula. At ``p = 0.101325 MPa`` the four formulas
reduce to the following; the coefficients are the public tuples of this module.

Density [kg/m^3] (IAPWS SR7-09 Gibbs function [1]_, pressure derivative at ``p0``)::

    y   = (T - 273.15 K) / 40 K
    rho = 1e8 / (c0 + c1*y + c2*y^2 + ... + c7*y^7)         c_j = DENSITY_COEFFS[j]  [J/kg]

At another pressure ``p`` the full Gibbs function is used, with ``z = (p - 101325 Pa) / 1e8 Pa``
and ``(j, k, g_jk) = GIBBS_COEFFS``::

    rho = 1e8 / sum_{k >= 1} k * g_jk * y^j * z^(k-1)

Dynamic viscosity [Pa s] (IAPWS R12-08 [2]_, critical enhancement set to 1)::

    Tb = T / 647.096 K,  rb = rho / 322 kg/m^3
    mu0 = 100 * sqrt(Tb) / (H0 + H1/Tb + H2/Tb^2 + H3/Tb^3)          H_i = VISCOSITY_H0[i]
    mu1 = exp(rb * sum_(i, j, Hij) Hij * (1/Tb - 1)^i * (rb - 1)^j)  (i, j, Hij) in VISCOSITY_H1
    mu  = 1e-6 * mu0 * mu1

Vapour pressure [Pa] (Wagner & Pruss saturation equation [3]_, [4]_)::

    tau = 1 - T / 647.096 K
    p_v = 22.064e6 * exp(647.096/T * (a1*tau + a2*tau^1.5 + a3*tau^3 + a4*tau^3.5
                                      + a5*tau^4 + a6*tau^7.5))      a_n = VAPOUR_PRESSURE_A

Surface tension against air [N/m] (IAPWS R1-76(2014) [5]_)::

    sigma = B * tau^mu * (1 + b * tau)                      (B, mu, b) = SURFACE_TENSION_COEFFS

Why these formulations
----------------------
* Density: IAPWS SR7-09 is IAPWS's own closed-form Gibbs function for liquid water, fitted to
  IAPWS-95 and valid to 313.15 K and 100 MPa [1]_; it is also the pure-water part of TEOS-10,
  so fresh and sea water (``seawater.py``) share one density base. Its deviation from IAPWS-95
  over 0-40 degC at 0.101325 MPa is a few parts per million (see the tests), far inside the
  required 0.01 %.
* Viscosity: IAPWS R12-08 [2]_ with the critical-enhancement factor ``mu2 = 1``. The release
  recommends ``mu2 = 1`` for industrial use because the enhancement is significant only in a
  small region around the critical point (647 K, 322 kg/m^3); for liquid water at 0-40 degC the
  factor differs from 1 by far less than 1e-6 (tests compare with CoolProp, which includes it).
* Pressure: supported from the triple-point pressure (611.657 Pa) to 100 MPa through the
  SR7-09 Gibbs function; viscosity follows through the density. Below the vapour pressure the
  liquid is metastable; there the formula is a smooth continuation (the density differs from
  its 1-atm value by less than 6e-5 relative). Vapour pressure and surface tension depend on
  temperature only.

Validity: 0-40 degC (273.15-313.15 K), limited by SR7-09; ``extrapolate=True`` evaluates
outside. NaN input propagates to NaN output.

References
----------
.. [1] IAPWS SR7-09, "Supplementary Release on a Computationally Efficient Thermodynamic
   Formulation for Liquid Water for Oceanographic Use", International Association for the
   Properties of Water and Steam, 2009 (coefficients in its Table 2).
.. [2] IAPWS R12-08, "Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary Water
   Substance", 2008; M. L. Huber et al., "New International Formulation for the Viscosity of
   H2O", J. Phys. Chem. Ref. Data 38 (2009) 101-125.
.. [3] W. Wagner and A. Pruss, "International Equations for the Saturation Properties of
   Ordinary Water Substance. Revised According to the International Temperature Scale of 1990",
   J. Phys. Chem. Ref. Data 22 (1993) 783-787.
.. [4] W. Wagner and A. Pruss, "The IAPWS Formulation 1995 for the Thermodynamic Properties of
   Ordinary Water Substance for General and Scientific Use", J. Phys. Chem. Ref. Data 31 (2002)
   387-535, Eq. 2.5.
.. [5] IAPWS R1-76(2014), "Revised Release on Surface Tension of Ordinary Water Substance", 2014.
"""

from __future__ import annotations

import numpy as np

from ._arrays import check_ranges, float_arrays, horner, is_uniform, numpy_scalar
from .registry import FluidInfo
from .state import FluidState
from .units import si_edge
from .validity import Range

#: Temperature range of the fluid [K] (IAPWS SR7-09 holds to 313.15 K).
T_RANGE = Range("temperature", 273.15, 313.15, "K")
#: Absolute pressure range [Pa]: triple-point pressure to 100 MPa (IAPWS SR7-09).
P_RANGE = Range("pressure", 611.657, 100e6, "Pa")

#: Reference pressure of the Gibbs function [Pa] and its scale [Pa], IAPWS SR7-09.
P0 = 101325.0
P_SCALE = 1e8
#: Temperature offset [K] and scale [K] of the reduced temperature y, IAPWS SR7-09.
T0 = 273.15
T_SCALE = 40.0

#: IAPWS SR7-09 Table 2: (j, k, g_jk [J/kg]) of g = sum g_jk y^j z^k.
GIBBS_COEFFS: tuple[tuple[int, int, float], ...] = (
    (0, 0, 0.101342743139674e3), (0, 1, 0.100015695367145e6), (0, 2, -0.254457654203630e4),
    (0, 3, 0.284517778446287e3), (0, 4, -0.333146754253611e2), (0, 5, 0.420263108803084e1),
    (0, 6, -0.546428511471039), (1, 0, 0.590578347909402e1), (1, 1, -0.270983805184062e3),
    (1, 2, 0.776153611613101e3), (1, 3, -0.196512550881220e3), (1, 4, 0.289796526294175e2),
    (1, 5, -0.213290083518327e1), (2, 0, -0.123577859330390e5), (2, 1, 0.145503645404680e4),
    (2, 2, -0.756558385769359e3), (2, 3, 0.273479662323528e3), (2, 4, -0.555604063817218e2),
    (2, 5, 0.434420671917197e1), (3, 0, 0.736741204151612e3), (3, 1, -0.672507783145070e3),
    (3, 2, 0.499360390819152e3), (3, 3, -0.239545330654412e3), (3, 4, 0.488012518593872e2),
    (3, 5, -0.166307106208905e1), (4, 0, -0.148185936433658e3), (4, 1, 0.397968445406972e3),
    (4, 2, -0.301815380621876e3), (4, 3, 0.152196371733841e3), (4, 4, -0.263748377232802e2),
    (5, 0, 0.580259125842571e2), (5, 1, -0.194618310617595e3), (5, 2, 0.120520654902025e3),
    (5, 3, -0.552723052340152e2), (5, 4, 0.648190668077221e1), (6, 0, -0.189843846514172e2),
    (6, 1, 0.635113936641785e2), (6, 2, -0.222897317140459e2), (6, 3, 0.817060541818112e1),
    (7, 0, 0.305081646487967e1), (7, 1, -0.963108119393062e1),
)

#: Density at 0.101325 MPa: c_j = g_j1 [J/kg], rho = 1e8 / sum_j c_j y^j [kg/m^3].
DENSITY_COEFFS: tuple[float, ...] = tuple(g for j, k, g in GIBBS_COEFFS if k == 1)

#: IAPWS R12-08 reference values: T* [K], rho* [kg/m^3], mu* [Pa s].
T_CRIT = 647.096
RHO_STAR = 322.0
MU_STAR = 1e-6
#: IAPWS R12-08 Table 1, coefficients H_i of the dilute-gas term mu0.
VISCOSITY_H0: tuple[float, ...] = (1.67752, 2.20462, 0.6366564, -0.241605)
#: IAPWS R12-08 Table 2, nonzero (i, j, H_ij) of the residual term mu1.
VISCOSITY_H1: tuple[tuple[int, int, float], ...] = (
    (0, 0, 5.20094e-1), (1, 0, 8.50895e-2), (2, 0, -1.08374), (3, 0, -2.89555e-1),
    (0, 1, 2.22531e-1), (1, 1, 9.99115e-1), (2, 1, 1.88797), (3, 1, 1.26613),
    (5, 1, 1.20573e-1), (0, 2, -2.81378e-1), (1, 2, -9.06851e-1), (2, 2, -7.72479e-1),
    (3, 2, -4.89837e-1), (4, 2, -2.57040e-1), (0, 3, 1.61913e-1), (1, 3, 2.57399e-1),
    (0, 4, -3.25372e-2), (3, 4, 6.98452e-2), (4, 5, 8.72102e-3), (3, 6, -4.35673e-3),
    (5, 6, -5.93264e-4),
)

#: Critical pressure [Pa] of the saturation equation (IAPWS-95 value).
P_CRIT = 22.064e6
#: Wagner & Pruss (1993) a_1..a_6 of ln(p_v/p_c) = (T_c/T) sum a_n tau^e_n.
VAPOUR_PRESSURE_A: tuple[float, ...] = (
    -7.85951783, 1.84408259, -11.7866497, 22.6807411, -15.9618719, 1.80122502,
)
#: Exponents e_n of tau belonging to VAPOUR_PRESSURE_A.
VAPOUR_PRESSURE_EXPONENTS: tuple[float, ...] = (1.0, 1.5, 3.0, 3.5, 4.0, 7.5)

#: IAPWS R1-76(2014): B [N/m], mu [-], b [-] of sigma = B tau^mu (1 + b tau).
SURFACE_TENSION_COEFFS: tuple[float, float, float] = (235.8e-3, 1.256, -0.625)

SOURCES: tuple[str, ...] = (
    "density: IAPWS SR7-09 (2009) Gibbs function for liquid water",
    "viscosity: IAPWS R12-08 (Huber et al. 2009, JPCRD 38:101), mu2 = 1",
    "vapour pressure: Wagner & Pruss (1993, JPCRD 22:783) saturation equation",
    "surface tension: IAPWS R1-76(2014)",
)


def _gibbs_pressure_polys() -> tuple[tuple[float, ...], ...]:
    """For each k >= 1, the coefficients in y of k * g_jk (rising j), for the p-derivative."""
    kmax = max(k for _, k, _ in GIBBS_COEFFS)
    jmax = max(j for j, _, _ in GIBBS_COEFFS)
    table = np.zeros((kmax + 1, jmax + 1))
    for j, k, g in GIBBS_COEFFS:
        table[k, j] = k * g
    return tuple(tuple(row) for row in table[1:])


_GP_POLYS = _gibbs_pressure_polys()


def _h1_by_j() -> tuple[tuple[float, ...], ...]:
    """VISCOSITY_H1 regrouped: for each j, the coefficients H_ij in rising i."""
    table = np.zeros((7, 6))
    for i, j, h in VISCOSITY_H1:
        table[j, i] = h
    return tuple(tuple(np.trim_zeros(row, "b")) for row in table)


_H1_BY_J = _h1_by_j()


def specific_volume(temperature, pressure=P0):
    """Specific volume of liquid water, the pressure derivative of the IAPWS SR7-09 Gibbs function.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K] (ITS-90).
    pressure : float or array_like
        Absolute pressure [Pa].

    Returns
    -------
    float or ndarray
        Specific volume ``v = (dg/dp)_T`` [m^3/kg].

    Notes
    -----
    ``v = (1/p_u) sum_{j,k>=1} k g_jk y^j z^(k-1)`` with ``y = (T - 273.15 K)/40 K``,
    ``z = (p - 101325 Pa)/p_u``, ``p_u = 1e8 Pa``, ``g_jk`` in J/kg (``GIBBS_COEFFS``) [1]_.
    Valid 273.15-313.15 K (including the metastable liquid below freezing), up to 100 MPa.

    References
    ----------
    .. [1] IAPWS SR7-09 (2009), Supplementary Release on a Computationally Efficient
       Thermodynamic Formulation for Liquid Water for Oceanographic Use, Table 2.
    """
    T = np.asarray(temperature, dtype=float)
    p = np.asarray(pressure, dtype=float)
    y = (T - T0) / T_SCALE
    if p.ndim == 0 and p == P0:
        # At the reference pressure only the k = 1 terms remain: the spreadsheet form.
        return numpy_scalar(horner(DENSITY_COEFFS, y) / P_SCALE)
    if is_uniform(p):
        # One pressure for the whole grid: fold the z-polynomial into the y-coefficients.
        z0 = (float(p.flat[0]) - P0) / P_SCALE
        coeffs = np.zeros(len(_GP_POLYS[0]))
        for poly in reversed(_GP_POLYS):
            coeffs = coeffs * z0 + np.asarray(poly)
        return numpy_scalar(horner(tuple(coeffs), y) / P_SCALE + np.zeros(p.shape))
    z = (p - P0) / P_SCALE
    y, z = np.broadcast_arrays(y, z)
    gp = np.zeros(y.shape)
    for poly in reversed(_GP_POLYS):
        gp = gp * z + horner(poly, y)
    return numpy_scalar(gp / P_SCALE)


def density(temperature, pressure=P0):
    """Density of liquid water from the IAPWS SR7-09 Gibbs function.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K] (ITS-90).
    pressure : float or array_like
        Absolute pressure [Pa]; default 0.101325 MPa.

    Returns
    -------
    float or ndarray
        Density [kg/m^3].

    Notes
    -----
    ``rho = 1 / (dg/dp)_T`` (see :func:`specific_volume`). At 0.101325 MPa this is
    ``rho = 1e8 / sum_j c_j y^j`` with ``c_j = DENSITY_COEFFS[j]``. Agrees with IAPWS-95 to a
    few ppm over 0-40 degC at 0.101325 MPa [1]_.

    References
    ----------
    .. [1] IAPWS SR7-09 (2009), Supplementary Release on a Computationally Efficient
       Thermodynamic Formulation for Liquid Water for Oceanographic Use.
    """
    return 1.0 / specific_volume(temperature, pressure)


def dynamic_viscosity(temperature, density):
    """Dynamic viscosity of water, IAPWS 2008 formulation without critical enhancement.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].
    density : float or array_like
        Density [kg/m^3].

    Returns
    -------
    float or ndarray
        Dynamic viscosity [Pa s].

    Notes
    -----
    ``mu = mu* mu0(Tb) mu1(Tb, rb)`` with ``Tb = T/647.096 K``, ``rb = rho/322 kg/m^3``,
    ``mu* = 1e-6 Pa s``,
    ``mu0 = 100 sqrt(Tb) / sum_{i=0}^{3} H_i / Tb^i`` and
    ``mu1 = exp(rb sum_{i,j} H_ij (1/Tb - 1)^i (rb - 1)^j)`` [1]_ (Eqs. 10-12). The critical
    enhancement factor mu2 is set to 1, as the release recommends for industrial use; it
    matters only close to the critical point. The formulation holds from the melting line to
    1173 K and 1 GPa.

    References
    ----------
    .. [1] IAPWS R12-08 (2008), Release on the IAPWS Formulation 2008 for the Viscosity of
       Ordinary Water Substance; Huber et al., J. Phys. Chem. Ref. Data 38 (2009) 101-125.
    """
    T = np.asarray(temperature, dtype=float)
    rho = np.asarray(density, dtype=float)
    tb = T / T_CRIT
    rb = rho / RHO_STAR
    mu0 = 100.0 * np.sqrt(tb) / horner(VISCOSITY_H0, 1.0 / tb)
    x = 1.0 / tb - 1.0
    d = rb - 1.0
    # Nested Horner: inner polynomials in x for each power of (rb - 1), then in (rb - 1).
    s = 0.0
    for col in reversed(_H1_BY_J):
        s = s * d + horner(col, x)
    return numpy_scalar(MU_STAR * mu0 * np.exp(rb * s))


def vapour_pressure(temperature):
    """Saturation vapour pressure of water over liquid, Wagner & Pruss equation.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].

    Returns
    -------
    float or ndarray
        Vapour pressure [Pa].

    Notes
    -----
    ``ln(p_v/p_c) = (T_c/T)(a1 tau + a2 tau^1.5 + a3 tau^3 + a4 tau^3.5 + a5 tau^4 + a6 tau^7.5)``
    with ``tau = 1 - T/T_c``, ``T_c = 647.096 K``, ``p_c = 22.064 MPa`` [1]_, [2]_. Valid from
    the triple point (273.16 K) to the critical point; consistent with IAPWS-95 to well within
    0.01 % at ambient temperatures. At 273.15 K it is continued 0.01 K into the metastable
    liquid.

    References
    ----------
    .. [1] W. Wagner and A. Pruss, J. Phys. Chem. Ref. Data 22 (1993) 783-787.
    .. [2] W. Wagner and A. Pruss, J. Phys. Chem. Ref. Data 31 (2002) 387-535, Eq. 2.5.
    """
    T = np.asarray(temperature, dtype=float)
    tau = 1.0 - T / T_CRIT
    # The half-integer powers share one square root (much faster than float powers).
    a1, a2, a3, a4, a5, a6 = VAPOUR_PRESSURE_A
    rt = np.sqrt(tau)
    t3 = tau * tau * tau
    s = tau * (a1 + a2 * rt) + t3 * (a3 + a4 * rt + tau * (a5 + a6 * t3 * rt))
    return numpy_scalar(P_CRIT * np.exp(T_CRIT / T * s))


def surface_tension(temperature):
    """Surface tension of water against its vapour (or air), IAPWS R1-76(2014).

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].

    Returns
    -------
    float or ndarray
        Surface tension [N/m].

    Notes
    -----
    ``sigma = B tau^mu (1 + b tau)``, ``tau = 1 - T/T_c``, ``T_c = 647.096 K``,
    ``B = 235.8 mN/m``, ``b = -0.625``, ``mu = 1.256`` [1]_. Valid from the triple point to the
    critical point; the release states it extrapolates well into the supercooled liquid.

    References
    ----------
    .. [1] IAPWS R1-76(2014), Revised Release on Surface Tension of Ordinary Water Substance.
    """
    T = np.asarray(temperature, dtype=float)
    big_b, mu, b = SURFACE_TENSION_COEFFS
    tau = 1.0 - T / T_CRIT
    return numpy_scalar(big_b * tau**mu * (1.0 + b * tau))


def fresh_water_si(temperature_K, pressure_Pa=P0, extrapolate=False, **_) -> FluidState:
    """Properties of fresh water in SI, vectorised (the planner's entry point).

    Parameters
    ----------
    temperature_K : float or array_like
        Temperature [K].
    pressure_Pa : float or array_like
        Absolute pressure [Pa]; default 0.101325 MPa. Broadcasts with temperature.
    extrapolate : bool
        If True, no validity check is made (0-40 degC, 611.657 Pa to 100 MPa).
    **_ :
        Other state variables are ignored (the catalogue passes a common set).

    Returns
    -------
    FluidState
        Density, dynamic viscosity, vapour pressure and surface tension, with sources.

    Raises
    ------
    OutOfRangeError
        If a finite temperature or pressure lies outside its range and ``extrapolate`` is False.
    """
    (T, p), _ = float_arrays("fresh_water", temperature=temperature_K, pressure=pressure_Pa)
    check_ranges("fresh_water", extrapolate, (T, T_RANGE), (p, P_RANGE))
    if p.ndim == 0:
        p_arg = float(p)
        p_out = np.broadcast_to(p, T.shape).copy() if T.ndim else p_arg
        T_b = T
    else:
        T_b, p_b = np.broadcast_arrays(T, p)
        T_b, p_arg, p_out = np.array(T_b), np.array(p_b), np.array(p_b)
    rho = density(T_b, p_arg)
    return FluidState(
        fluid="fresh_water",
        temperature_si=numpy_scalar(np.asarray(T_b)),
        pressure_si=numpy_scalar(np.asarray(p_out)),
        density_si=rho,
        dynamic_viscosity_si=dynamic_viscosity(T_b, rho),
        vapour_pressure_si=vapour_pressure(T_b),
        surface_tension_si=surface_tension(T_b),
        sources=SOURCES,
    )


@si_edge(fresh_water_si, temperature="[temperature]", pressure="[pressure]")
def fresh_water(temperature, pressure="101325 Pa", extrapolate: bool = False) -> FluidState:
    """Properties of fresh water at a temperature and pressure.

    Parameters
    ----------
    temperature : str, pint.Quantity or array of them
        Temperature, e.g. ``"15 degC"``; arrays broadcast with pressure.
    pressure : str or pint.Quantity
        Absolute pressure; default ``"101325 Pa"``.
    extrapolate : bool
        If True, evaluate outside the validity range (0-40 degC) without error.

    Returns
    -------
    FluidState
        See :func:`fresh_water_si`.

    Examples
    --------
    >>> round(float(fresh_water("15 degC").density_si), 4)
    999.1026
    """


FLUID_INFO = FluidInfo(
    name="fresh_water",
    kind="liquid",
    description="fresh water, IAPWS (SR7-09 density, R12-08 viscosity), 0-40 degC",
    ranges=(T_RANGE, P_RANGE),
    evaluate_si=fresh_water_si,
    sources=SOURCES,
    fixed_pressure=False,
)

"""Sea water of standard (reference) composition: TEOS-10 density and published correlations.

Salinity is the ABSOLUTE salinity ``S_A`` in kg/kg inside this module (``"35.16504 g/kg"`` at
the public edge). All properties are closed-form in temperature, salinity and pressure, with
no iteration; at ``p = 0.101325 MPa`` they are (``t`` in degC, ``T`` in K)::

    y   = (T - 273.15 K) / 40 K,    xi = sqrt(S_A / S_u),   S_u = 0.03516504 * 40/35 kg/kg
    rho = 1e8 / ( sum_j c_j y^j  +  sum_(i, j, d) d * xi^i * y^j )
          c_j = water.DENSITY_COEFFS[j],  (i, j, d) in DENSITY_SALINE_COEFFS        [kg/m^3]
    mu  = mu_w(T) * (1 + A*S_A + B*S_A^2)                                           [Pa s]
          A = A0 + A1 t + A2 t^2,  B = B0 + B1 t + B2 t^2   (VISCOSITY_A, VISCOSITY_B)
          mu_w = water.dynamic_viscosity(T, water.density(T))
    p_v = p_v,w(T) * exp(b1 S + b2 S^2),   S = 1000 S_A [g/kg]  (VAPOUR_PRESSURE_B)  [Pa]
    sigma = sigma_w(T) * (1 + s1 S + s2 S t),  S in g/kg   (SURFACE_TENSION_S)     [N/m]

At other pressures the density uses the full Gibbs functions, ``z = (p - 101325 Pa)/1e8 Pa``:
``rho = 1e8 / sum_k k z^(k-1) [sum g^W_jk y^j + sum g^S_ijk xi^i y^j]`` (k >= 1).

Choice of formulation
---------------------
* Density: the TEOS-10 / IAPWS-08 Gibbs function itself [1]_, [2]_ (pure-water part IAPWS
  SR7-09 [3]_ plus the saline part of R13-08), rather than a one-atmosphere fit. It is the
  standard the ITTC water-property procedure [7]_ refers to, is explicit in (S_A, T, p) so it
  stays closed-form, and reproduces ``gsw.rho_t_exact`` to rounding error. The density needs
  only the pressure derivative of the saline part, which has no logarithmic term.
* Viscosity: the pure-water IAPWS 2008 viscosity [4]_ times the salinity factor of Sharqawy,
  Lienhard & Zubair (2010) [5]_ (their Eq. 22, S in kg/kg, t in degC, stated accuracy 1.5 %,
  0-180 degC, 0-0.15 kg/kg), the approach of ITTC 7.5-02-01-03 [7]_. The factor was fitted at
  0.1 MPa and is applied unchanged at other pressures (the pure-water viscosity follows the
  pressure through its density).
* Vapour pressure: Nayar, Sharqawy, Banchik & Lienhard (2016) [6]_,
  ``p_v = p_v,w exp(-4.5818e-4 S - 2.0443e-6 S^2)`` with S in g/kg and the pure-water value
  from Wagner & Pruss; it agrees with the TEOS-10 chemical potential of water (Raoult form)
  within 0.05 % over this range (see the tests).
* Surface tension: IAPWS G14-19 [8]_ (Nayar et al. 2014 [9]_),
  ``sigma = sigma_w (1 + 3.766e-4 S + 2.347e-6 S t)``, S in g/kg, t in degC, sigma_w from
  IAPWS R1-76(2014). The guideline covers 0-131 g/kg above 1 degC and 0-38 g/kg below; the
  slice 38-42 g/kg between 0 and 1 degC is a smooth extrapolation of a linear formula.

Validity: 0-40 degC, 0-42 g/kg (the TEOS-10 range at all pressures), 611.657 Pa to 100 MPa.

References
----------
.. [1] IAPWS R13-08, "Release on the IAPWS Formulation 2008 for the Thermodynamic Properties of
   Seawater", 2008; R. Feistel, "A Gibbs function for seawater thermodynamics for -6 to 80 degC
   and salinity up to 120 g/kg", Deep-Sea Res. I 55 (2008) 1639-1671.
.. [2] IOC, SCOR and IAPSO, "The international thermodynamic equation of seawater - 2010:
   Calculation and use of thermodynamic properties", Intergovernmental Oceanographic
   Commission, Manuals and Guides No. 56, UNESCO, 2010.
.. [3] IAPWS SR7-09, "Supplementary Release on a Computationally Efficient Thermodynamic
   Formulation for Liquid Water for Oceanographic Use", 2009.
.. [4] IAPWS R12-08 (2008); M. L. Huber et al., J. Phys. Chem. Ref. Data 38 (2009) 101-125.
.. [5] M. H. Sharqawy, J. H. Lienhard V and S. M. Zubair, "Thermophysical properties of
   seawater: a review of existing correlations and data", Desalination and Water Treatment 16
   (2010) 354-380, Eq. 22.
.. [6] K. G. Nayar, M. H. Sharqawy, L. D. Banchik and J. H. Lienhard V, "Thermophysical
   properties of seawater: A review and new correlations that include pressure dependence",
   Desalination 390 (2016) 1-24.
.. [7] ITTC Recommended Procedure 7.5-02-01-03, "Fresh Water and Seawater Properties",
   Rev. 02, 2011.
.. [8] IAPWS G14-19, "Guideline on the Surface Tension of Seawater", 2019.
.. [9] K. G. Nayar, D. Panchanathan, G. H. McKinley and J. H. Lienhard V, "Surface Tension of
   Seawater", J. Phys. Chem. Ref. Data 43 (2014) 043103.
"""

from __future__ import annotations

import numpy as np

from . import water
from ._arrays import broadcast_copy, check_ranges, float_arrays, horner, is_uniform, numpy_scalar
from .registry import FluidInfo
from .state import FluidState
from .units import si_edge
from .validity import Range

#: Temperature range [K], set by the pure-water part (IAPWS SR7-09).
T_RANGE = Range("temperature", 273.15, 313.15, "K")
#: Absolute-salinity range [kg/kg]: TEOS-10 holds 0-42 g/kg at all pressures.
S_RANGE = Range("salinity", 0.0, 0.042, "kg/kg")
#: Absolute pressure range [Pa], as for fresh water.
P_RANGE = Range("pressure", 611.657, 100e6, "Pa")

#: Standard-ocean reference salinity [kg/kg] (IOC et al. 2010) and the scale S_u of xi [kg/kg].
S_REFERENCE = 0.03516504
S_SCALE = S_REFERENCE * 40.0 / 35.0

#: IAPWS R13-08 Table 2, saline part: (i, j, k, g_ijk [J/kg]) of
#: g_S = sum_jk [g_1jk xi^2 ln(xi) + sum_{i>=2} g_ijk xi^i] y^j z^k.
SALINE_GIBBS_COEFFS: tuple[tuple[int, int, int, float], ...] = (
    (1, 0, 0, 5812.81456626732), (2, 0, 0, 1416.27648484197), (3, 0, 0, -2432.14662381794),
    (4, 0, 0, 2025.80115603697), (5, 0, 0, -1091.66841042967), (6, 0, 0, 374.60123787784),
    (7, 0, 0, -48.5891069025409), (1, 1, 0, 851.226734946706), (2, 1, 0, 168.072408311545),
    (3, 1, 0, -493.407510141682), (4, 1, 0, 543.835333000098), (5, 1, 0, -196.028306689776),
    (6, 1, 0, 36.7571622995805), (2, 2, 0, 880.031352997204), (3, 2, 0, -43.0664675978042),
    (4, 2, 0, -68.5572509204491), (2, 3, 0, -225.267649263401), (3, 3, 0, -10.0227370861875),
    (4, 3, 0, 49.3667694856254), (2, 4, 0, 91.4260447751259), (3, 4, 0, 0.875600661808945),
    (4, 4, 0, -17.1397577419788), (2, 5, 0, -21.6603240875311), (4, 5, 0, 2.49697009569508),
    (2, 6, 0, 2.13016970847183), (2, 0, 1, -3310.49154044839), (3, 0, 1, 199.459603073901),
    (4, 0, 1, -54.7919133532887), (5, 0, 1, 36.0284195611086), (2, 1, 1, 729.116529735046),
    (3, 1, 1, -175.292041186547), (4, 1, 1, -22.6683558512829), (2, 2, 1, -860.764303783977),
    (3, 2, 1, 383.058066002476), (2, 3, 1, 694.244814133268), (3, 3, 1, -460.319931801257),
    (2, 4, 1, -297.728741987187), (3, 4, 1, 234.565187611355), (2, 0, 2, 384.794152978599),
    (3, 0, 2, -52.2940909281335), (4, 0, 2, -4.08193978912261), (2, 1, 2, -343.956902961561),
    (3, 1, 2, 83.1923927801819), (2, 2, 2, 337.409530269367), (3, 2, 2, -54.1917262517112),
    (2, 3, 2, -204.889641964903), (2, 4, 2, 74.726141138756), (2, 0, 3, -96.5324320107458),
    (3, 0, 3, 68.0444942726459), (4, 0, 3, -30.1755111971161), (2, 1, 3, 124.687671116248),
    (3, 1, 3, -29.483064349429), (2, 2, 3, -178.314556207638), (3, 2, 3, 25.6398487389914),
    (2, 3, 3, 113.561697840594), (2, 4, 3, -36.4872919001588), (2, 0, 4, 15.8408172766824),
    (3, 0, 4, -3.41251932441282), (2, 1, 4, -31.656964386073), (2, 2, 4, 44.2040358308),
    (2, 3, 4, -11.1282734326413), (2, 0, 5, -2.62480156590992), (2, 1, 5, 7.04658803315449),
    (2, 2, 5, -7.92001547211682),
)

#: Density at 0.101325 MPa, saline part: (i, j, g_ij1 [J/kg]) (see the module docstring).
DENSITY_SALINE_COEFFS: tuple[tuple[int, int, float], ...] = tuple(
    (i, j, g) for i, j, k, g in SALINE_GIBBS_COEFFS if k == 1
)

#: Sharqawy et al. (2010) Eq. 22: A = A0 + A1 t + A2 t^2 [1/(kg/kg)], t in degC.
VISCOSITY_A: tuple[float, float, float] = (1.541, 1.998e-2, -9.52e-5)
#: Sharqawy et al. (2010) Eq. 22: B = B0 + B1 t + B2 t^2 [1/(kg/kg)^2], t in degC.
VISCOSITY_B: tuple[float, float, float] = (7.974, -7.561e-2, 4.724e-4)
#: Nayar et al. (2016): b1 [1/(g/kg)], b2 [1/(g/kg)^2] of p_v = p_v,w exp(b1 S + b2 S^2).
VAPOUR_PRESSURE_B: tuple[float, float] = (-4.5818e-4, -2.0443e-6)
#: IAPWS G14-19: s1 [1/(g/kg)], s2 [1/(g/kg degC)] of sigma = sigma_w (1 + s1 S + s2 S t).
SURFACE_TENSION_S: tuple[float, float] = (3.766e-4, 2.347e-6)

SOURCES: tuple[str, ...] = (
    "density: TEOS-10 / IAPWS R13-08 (2008) Gibbs function with IAPWS SR7-09 pure water",
    "viscosity: IAPWS R12-08 pure water x Sharqawy, Lienhard & Zubair (2010) Eq. 22",
    "vapour pressure: Nayar, Sharqawy, Banchik & Lienhard (2016), Desalination 390:1",
    "surface tension: IAPWS G14-19 (Nayar et al. 2014, JPCRD 43:043103)",
)


def _saline_pressure_tables() -> tuple[tuple[tuple[float, ...], ...], ...]:
    """For each k >= 1, rows i = 0..7 of the coefficients k * g_ijk in rising j."""
    kmax = max(k for *_, k, _ in SALINE_GIBBS_COEFFS)
    tables = np.zeros((kmax, 8, 7))
    for i, j, k, g in SALINE_GIBBS_COEFFS:
        if k >= 1:
            tables[k - 1, i, j] = k * g
    return tuple(tuple(tuple(np.trim_zeros(row, "b")) for row in t) for t in tables)


_GSP_TABLES = _saline_pressure_tables()


def _poly2(rows, xi, y):
    """sum_{i,j} rows[i][j] xi^i y^j by nested Horner (inner in y, outer in xi)."""
    out = 0.0
    for row in rows[::-1]:
        out = out * xi + (horner(row, y) if row else 0.0)
    return out


def saline_specific_volume(salinity, temperature, pressure=water.P0):
    """Saline part of the specific volume of sea water, TEOS-10 / IAPWS R13-08.

    Parameters
    ----------
    salinity : float or array_like
        Absolute salinity S_A [kg/kg].
    temperature : float or array_like
        Temperature [K].
    pressure : float or array_like
        Absolute pressure [Pa].

    Returns
    -------
    float or ndarray
        ``(dg_S/dp)_{S,T}`` [m^3/kg]; negative (salt contracts the water).

    Notes
    -----
    ``v_S = (1/p_u) sum_{i>=2} sum_j sum_{k>=1} k g_ijk xi^i y^j z^(k-1)``, with
    ``xi = sqrt(S_A/S_u)``, ``S_u = 40.188617 g/kg``, ``y = (T - 273.15 K)/40 K``,
    ``z = (p - 101325 Pa)/1e8 Pa`` and ``g_ijk`` of ``SALINE_GIBBS_COEFFS`` [1]_.

    References
    ----------
    .. [1] IAPWS R13-08 (2008), Release on the IAPWS Formulation 2008 for the Thermodynamic
       Properties of Seawater, Eq. 4 and Table 2.
    """
    S = np.asarray(salinity, dtype=float)
    T = np.asarray(temperature, dtype=float)
    p = np.asarray(pressure, dtype=float)
    xi = np.sqrt(S / S_SCALE)
    y = (T - water.T0) / water.T_SCALE
    if p.ndim == 0 and p == water.P0:
        out = _poly2(_GSP_TABLES[0], xi, y) + np.zeros(np.broadcast_shapes(S.shape, T.shape))
        return numpy_scalar(out / water.P_SCALE)
    if is_uniform(p):
        # One pressure for the whole grid: fold the z-polynomial into the (i, j) table.
        z0 = (float(p.flat[0]) - water.P0) / water.P_SCALE
        table = np.zeros((8, 7))
        for rows in reversed(_GSP_TABLES):
            table = table * z0 + np.array([list(r) + [0.0] * (7 - len(r)) for r in rows])
        rows = tuple(tuple(np.trim_zeros(r, "b")) for r in table)
        out = _poly2(rows, xi, y) + np.zeros(np.broadcast_shapes(S.shape, T.shape, p.shape))
        return numpy_scalar(out / water.P_SCALE)
    z = (p - water.P0) / water.P_SCALE
    xi, y, z = np.broadcast_arrays(xi, y, z)
    out = np.zeros(xi.shape)
    for table in reversed(_GSP_TABLES):
        out = out * z + _poly2(table, xi, y)
    return numpy_scalar(out / water.P_SCALE)


def density(temperature, salinity=S_REFERENCE, pressure=water.P0):
    """Density of sea water from the TEOS-10 Gibbs function.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K] (ITS-90).
    salinity : float or array_like
        Absolute salinity S_A [kg/kg].
    pressure : float or array_like
        Absolute pressure [Pa].

    Returns
    -------
    float or ndarray
        Density [kg/m^3].

    Notes
    -----
    ``rho = 1 / (v_W + v_S)``: pure-water specific volume of IAPWS SR7-09
    (:func:`fluids_props.water.specific_volume`) plus the saline part
    (:func:`saline_specific_volume`) [1]_, [2]_. Valid 0-42 g/kg, 0-40 degC, to 100 MPa.

    References
    ----------
    .. [1] IAPWS R13-08 (2008), Release on the IAPWS Formulation 2008 for the Thermodynamic
       Properties of Seawater.
    .. [2] IOC, SCOR and IAPSO (2010), TEOS-10 manual, IOC Manuals and Guides No. 56.
    """
    return 1.0 / (water.specific_volume(temperature, pressure)
                  + saline_specific_volume(salinity, temperature, pressure))


def viscosity_salinity_factor(temperature, salinity):
    """Ratio of sea-water to pure-water dynamic viscosity, Sharqawy et al. (2010) Eq. 22.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].
    salinity : float or array_like
        Salinity [kg/kg].

    Returns
    -------
    float or ndarray
        ``mu_sw / mu_w = 1 + A S + B S^2`` [-], with ``A = 1.541 + 1.998e-2 t - 9.52e-5 t^2``
        and ``B = 7.974 - 7.561e-2 t + 4.724e-4 t^2``, t in degC [1]_. Valid 0-180 degC,
        0-0.15 kg/kg, accuracy 1.5 %.

    References
    ----------
    .. [1] M. H. Sharqawy, J. H. Lienhard V and S. M. Zubair, Desalination and Water
       Treatment 16 (2010) 354-380, Eq. 22.
    """
    t = np.asarray(temperature, dtype=float) - 273.15
    S = np.asarray(salinity, dtype=float)
    a = horner(VISCOSITY_A, t)
    b = horner(VISCOSITY_B, t)
    return numpy_scalar(1.0 + a * S + b * S * S)


def dynamic_viscosity(temperature, salinity=S_REFERENCE, pressure=water.P0):
    """Dynamic viscosity of sea water: IAPWS 2008 pure water times the Sharqawy factor.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].
    salinity : float or array_like
        Absolute salinity [kg/kg].
    pressure : float or array_like
        Absolute pressure [Pa] (enters through the pure-water density).

    Returns
    -------
    float or ndarray
        Dynamic viscosity [Pa s].

    Notes
    -----
    ``mu_sw = mu_w(T, rho_w(T, p)) (1 + A S + B S^2)`` [1]_, [2]_; the ITTC 7.5-02-01-03 approach.

    References
    ----------
    .. [1] IAPWS R12-08 (2008), Huber et al., J. Phys. Chem. Ref. Data 38 (2009) 101-125.
    .. [2] Sharqawy, Lienhard & Zubair, Desalination and Water Treatment 16 (2010) 354-380.
    """
    mu_w = water.dynamic_viscosity(temperature, water.density(temperature, pressure))
    return mu_w * viscosity_salinity_factor(temperature, salinity)


def vapour_pressure(temperature, salinity=S_REFERENCE):
    """Vapour pressure of sea water, Nayar et al. (2016).

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].
    salinity : float or array_like
        Salinity [kg/kg].

    Returns
    -------
    float or ndarray
        Vapour pressure [Pa].

    Notes
    -----
    ``p_v = p_v,w(T) exp(-4.5818e-4 S - 2.0443e-6 S^2)`` with S in g/kg [1]_ and ``p_v,w`` of
    Wagner & Pruss (:func:`fluids_props.water.vapour_pressure`).

    References
    ----------
    .. [1] K. G. Nayar, M. H. Sharqawy, L. D. Banchik and J. H. Lienhard V, Desalination 390
       (2016) 1-24.
    """
    s_g = 1e3 * np.asarray(salinity, dtype=float)
    b1, b2 = VAPOUR_PRESSURE_B
    return water.vapour_pressure(temperature) * np.exp(b1 * s_g + b2 * s_g * s_g)


def surface_tension(temperature, salinity=S_REFERENCE):
    """Surface tension of sea water against air, IAPWS G14-19.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K].
    salinity : float or array_like
        Salinity [kg/kg].

    Returns
    -------
    float or ndarray
        Surface tension [N/m].

    Notes
    -----
    ``sigma = sigma_w(T) (1 + 3.766e-4 S + 2.347e-6 S t)``, S in g/kg, t in degC, with
    ``sigma_w`` of IAPWS R1-76(2014) [1]_, [2]_. Valid 1-92 degC for 0-131 g/kg and
    -25-1 degC for 0-38 g/kg.

    References
    ----------
    .. [1] IAPWS G14-19 (2019), Guideline on the Surface Tension of Seawater.
    .. [2] K. G. Nayar, D. Panchanathan, G. H. McKinley and J. H. Lienhard V, J. Phys. Chem.
       Ref. Data 43 (2014) 043103.
    """
    T = np.asarray(temperature, dtype=float)
    s_g = 1e3 * np.asarray(salinity, dtype=float)
    s1, s2 = SURFACE_TENSION_S
    return water.surface_tension(T) * (1.0 + s1 * s_g + s2 * s_g * (T - 273.15))


def sea_water_si(temperature_K, pressure_Pa=water.P0, salinity=S_REFERENCE, extrapolate=False,
                 **_) -> FluidState:
    """Properties of sea water in SI, vectorised (the planner's entry point).

    Parameters
    ----------
    temperature_K : float or array_like
        Temperature [K].
    pressure_Pa : float or array_like
        Absolute pressure [Pa]; default 0.101325 MPa.
    salinity : float or array_like
        Absolute salinity S_A [kg/kg]; default the standard ocean, 0.03516504.
    extrapolate : bool
        If True, no validity check is made (0-40 degC, 0-42 g/kg, 611.657 Pa to 100 MPa).
    **_ :
        Other state variables are ignored.

    Returns
    -------
    FluidState
        Density, dynamic viscosity, vapour pressure, surface tension; ``extra["salinity"]``.

    Raises
    ------
    OutOfRangeError
        If a finite input lies outside its range and ``extrapolate`` is False.
    """
    (T, p, S), shape = float_arrays("sea_water", temperature=temperature_K, pressure=pressure_Pa,
                                    salinity=salinity)
    check_ranges("sea_water", extrapolate, (T, T_RANGE), (S, S_RANGE), (p, P_RANGE))
    T_b = np.broadcast_to(T, shape)
    S_b = np.broadcast_to(S, shape)
    # A scalar pressure stays scalar so that the 1-atm polynomial path is taken.
    p_arg = float(p) if p.ndim == 0 else np.broadcast_to(p, shape)
    # The pure-water state is computed once and shared by density and viscosity.
    v_w = water.specific_volume(T_b, p_arg)
    mu_w = water.dynamic_viscosity(T_b, 1.0 / v_w)
    return FluidState(
        fluid="sea_water",
        temperature_si=broadcast_copy(T_b, shape),
        pressure_si=broadcast_copy(p, shape),
        density_si=1.0 / (v_w + saline_specific_volume(S_b, T_b, p_arg)),
        dynamic_viscosity_si=mu_w * viscosity_salinity_factor(T_b, S_b),
        vapour_pressure_si=numpy_scalar(vapour_pressure(T_b, S_b)),
        surface_tension_si=numpy_scalar(surface_tension(T_b, S_b)),
        extra={"salinity": broadcast_copy(S_b, shape)},
        sources=SOURCES,
    )


@si_edge(sea_water_si, temperature="[temperature]", salinity="dimensionless",
         pressure="[pressure]")
def sea_water(temperature, salinity="35.16504 g/kg", pressure="101325 Pa",
              extrapolate: bool = False) -> FluidState:
    """Properties of sea water at a temperature, absolute salinity and pressure.

    Parameters
    ----------
    temperature : str, pint.Quantity or array of them
        Temperature, e.g. ``"15 degC"``.
    salinity : str, pint.Quantity or number
        Absolute salinity, e.g. ``"35.16504 g/kg"`` (a bare number is read as kg/kg).
    pressure : str or pint.Quantity
        Absolute pressure; default ``"101325 Pa"``.
    extrapolate : bool
        If True, evaluate outside the validity ranges without error.

    Returns
    -------
    FluidState
        See :func:`sea_water_si`.

    Examples
    --------
    >>> round(float(sea_water("15 degC").kinematic_viscosity_si) * 1e6, 4)
    1.1892
    """


FLUID_INFO = FluidInfo(
    name="sea_water",
    kind="liquid",
    description="sea water, TEOS-10 density, IAPWS x Sharqawy viscosity, 0-40 degC, 0-42 g/kg",
    ranges=(T_RANGE, S_RANGE, P_RANGE),
    evaluate_si=sea_water_si,
    sources=SOURCES,
    fixed_pressure=False,
    options={"salinity": S_REFERENCE},
)

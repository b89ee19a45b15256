"""Formulas of the 1978 ITTC performance prediction method, resistance and wake parts.

Pure functions over SI floats or numpy arrays: temperature correction of the model resistance
coefficient, roughness, correlation and air-resistance allowances, Prohaska's form-factor fit,
the residuary and full-scale total resistance coefficients, effective power and the full-scale
wake fraction. The extrapolation (``similitude.prediction.extrapolation``) chains them; setting the
form factor k = 0 everywhere gives the Froude (1+k = 1) method.

Revision followed: ITTC Recommended Procedure 7.5-02-03-01.4 "1978 ITTC Performance Prediction
Method", Rev 04 (2017) [1]_, which restates the 1978 method of the 15th ITTC [2]_ with the
later Townsin roughness allowance, the correlation allowance C_A = (5.68 - 0.6 log10 Re)e-3 and
the revised air-resistance coefficient. Where the 1978 original differs (roughness allowance of
Bowden & Davison, air resistance 0.001 A_T/S) the original form is offered under a ``method``
name. Formula shapes are from memory of the procedure and checked in the tests against the
values they must give; confidence medium-high.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 04, 2017 (effective revision; Rev 05 of 2021 keeps these forms).
.. [2] ITTC, "Report of the Performance Committee", Proc. 15th ITTC, The Hague, 1978.
.. [3] Bowden, B. S. and Davison, N. J., "Resistance increments due to hull roughness
       associated with form factor extrapolation methods", NPL Ship Report TM 380, 1974.
.. [4] Townsin, R. L., "The ITTC line — its genesis and correlation allowance",
       Naval Architect, Sept. 1985, E359-E362; adopted by the 19th ITTC (1990).
.. [5] Prohaska, C. W., "A simple method for the evaluation of the form factor and the low
       speed wave resistance", Proc. 11th ITTC, Tokyo, 1966, 65-66.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from similitude.constants import AIR_DENSITY
from similitude.correlations.inputs import as_array as _arr
from similitude.correlations.inputs import check_method as _check_method
from similitude.correlations.inputs import scalar_or_array as _out
from similitude.errors import InputError

#: Names accepted by ``roughness_allowance(method=...)``.
ROUGHNESS_METHODS = ("bowden_davison", "townsin")

#: Names accepted by ``correlation_allowance(method=...)``.
CORRELATION_METHODS = ("ittc2017", "none")

#: Names accepted by ``air_resistance_coefficient(method=...)``.
AIR_RESISTANCE_METHODS = ("revised", "1978")

#: Hull roughness k_S when not measured [m] (ITTC 7.5-02-03-01.4 [1]).
DEFAULT_HULL_ROUGHNESS = 150e-6

#: Rudder allowance of the wake scaling [-] (ITTC 7.5-02-03-01.4 [1]).
RUDDER_WAKE_ALLOWANCE = 0.04

#: Air drag coefficient of the above-water hull and superstructure, default of the revised
#: method (range 0.5 to 1.0) [-] (ITTC 7.5-02-03-01.4 [1]).
DEFAULT_AIR_DRAG_COEFFICIENT = 0.8

#: Density of air [kg/m^3], ISO 2533 standard atmosphere at sea level (15 degC).
AIR_DENSITY_15C = AIR_DENSITY

#: Density of standard sea water at 15 degC and 35.16504 g/kg [kg/m^3] (ITTC 7.5-02-01-03,
#: Rev 02 2011, table).
SEA_WATER_DENSITY_15C = 1026.021





def temperature_corrected_ctm(ctm, cfm_test, cfm_standard, form_factor):
    r"""Model total resistance coefficient corrected to the standard tank temperature [-].

    .. math:: C_{TM,15} = C_{TM,t} + (1 + k)(C_{FM,15} - C_{FM,t})

    Parameters
    ----------
    ctm : numeric
        C_TM at the test temperature t [-].
    cfm_test : numeric
        Model frictional coefficient at the test temperature's Reynolds number [-].
    cfm_standard : numeric
        Model frictional coefficient at the standard temperature (15 degC) Reynolds number [-].
    form_factor : numeric
        k [-] (0 for the Froude method).

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), §2.2 (temperature correction; with 7.5-02-02-01
           "Resistance Test").
    """
    ctm = _arr(ctm, "ctm")
    k = _arr(form_factor, "form_factor")
    return _out(ctm + (1.0 + k) * (_arr(cfm_standard, "cfm_standard")
                                   - _arr(cfm_test, "cfm_test")))


def roughness_allowance(length, reynolds=None, roughness: float = DEFAULT_HULL_ROUGHNESS,
                        method: str = "bowden_davison"):
    r"""Hull roughness allowance ΔC_F [-].

    Parameters
    ----------
    length : numeric
        Waterline length L_WL of the ship [m].
    reynolds : numeric, optional
        Ship Reynolds number on L_WL [-]; required by ``"townsin"``.
    roughness : numeric
        Hull roughness k_S [m]; 150e-6 when not measured [1]_.
    method : str
        ``"bowden_davison"`` (1978 method [3]_) or ``"townsin"`` (revised method [4]_).

    Notes
    -----
    Bowden & Davison (1978 method):

    .. math:: \Delta C_F = \left[105 (k_S/L)^{1/3} - 0.64\right] \times 10^{-3}

    Townsin (recommended by the 19th ITTC, 1990):

    .. math:: \Delta C_F = 0.044\left[(k_S/L)^{1/3} - 10\,Re^{-1/3}\right] + 0.000125

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017).
    .. [3] Bowden & Davison, NPL TM 380 (1974).
    .. [4] Townsin, Naval Architect (1985).
    """
    _check_method(method, ROUGHNESS_METHODS)
    L = _arr(length, "length", positive=True)
    ks = _arr(roughness, "roughness", nonnegative=True)
    ratio = np.cbrt(ks / L)
    if method == "bowden_davison":
        return _out((105.0 * ratio - 0.64) * 1e-3)
    if reynolds is None:
        raise InputError("reynolds: missing; the Townsin roughness allowance needs the ship "
                         "Reynolds number")
    re = _arr(reynolds, "reynolds", positive=True)
    return _out(0.044 * (ratio - 10.0 * re ** (-1.0 / 3.0)) + 0.000125)


def correlation_allowance(length=None, reynolds=None, method: str = "ittc2017"):
    r"""Correlation allowance C_A [-].

    Parameters
    ----------
    length : numeric, optional
        Ship waterline length [m] (kept for methods that use it; not used by ``"ittc2017"``).
    reynolds : numeric, optional
        Ship Reynolds number on L_WL [-]; required by ``"ittc2017"``.
    method : str
        ``"ittc2017"``: C_A = (5.68 - 0.6 log10 Re) x 10^-3, the revised procedure [1]_
        (form from memory, medium confidence; digest example Re = 1.5e9 gives 0.174e-3).
        ``"none"``: 0, for a facility that applies its own correlation afterwards.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017).
    """
    _check_method(method, CORRELATION_METHODS)
    if length is not None:
        _arr(length, "length", positive=True)
    if method == "none":
        shape = np.shape(reynolds) if reynolds is not None else np.shape(length)
        return _out(np.zeros(shape))
    if reynolds is None:
        raise InputError("reynolds: missing; the ITTC correlation allowance needs the ship "
                         "Reynolds number")
    re = _arr(reynolds, "reynolds", positive=True)
    return _out((5.68 - 0.6 * np.log10(re)) * 1e-3)


#: Ship Reynolds number above which C_A = (5.68 - 0.6 log10 Re) 1e-3 is negative:
#: 10^(5.68/0.6), about 2.9e9 [-].
NEGATIVE_CA_REYNOLDS = 10.0 ** (5.68 / 0.6)


def correlation_allowance_note(ca, reynolds) -> str | None:
    """A warning when a correlation allowance is negative, else None.

    The revised C_A = (5.68 - 0.6 log10 Re) 1e-3 turns negative above Re = 10^(5.68/0.6),
    about 2.9e9 (long, fast ships): it then lowers the predicted resistance, outside the data
    the formula was derived from.

    Parameters
    ----------
    ca, reynolds : array_like
        C_A [-] and the ship Reynolds numbers they belong to [-].
    """
    ca = np.atleast_1d(np.asarray(ca, dtype=float))
    if not np.any(ca < 0):
        return None
    re = np.atleast_1d(np.asarray(reynolds, dtype=float)) * np.ones_like(ca)
    return (f"NEGATIVE CORRELATION ALLOWANCE: C_A is {ca.min():.2e} at a ship Reynolds number "
            f"of {re[np.argmin(ca)]:.2e}; the revised C_A = (5.68 - 0.6 log10 Re) 1e-3 is "
            f"negative above Re = {NEGATIVE_CA_REYNOLDS:.2e}, beyond the ships it was derived "
            "from: use the facility's own correlation allowance (--correlation-allowance).")


def air_resistance_coefficient(transverse_area, wetted_surface,
                               air_density: float = AIR_DENSITY_15C,
                               water_density: float = SEA_WATER_DENSITY_15C,
                               drag_coefficient: float = DEFAULT_AIR_DRAG_COEFFICIENT,
                               method: str = "revised"):
    r"""Air resistance coefficient C_AAS of the ship, on the wetted surface [-].

    Parameters
    ----------
    transverse_area : numeric
        Projected transverse area above the waterline A_VS (A_T) [m^2].
    wetted_surface : numeric
        Wetted surface of the bare hull S [m^2].
    air_density, water_density : float
        ρ_A and ρ_S [kg/m^3] (defaults: ISO 2533 sea-level air; ITTC sea water at 15 degC).
    drag_coefficient : float
        Air drag coefficient C_DA [-], default 0.8 (range 0.5 to 1.0) [1]_.
    method : str
        ``"revised"``: C_AAS = C_DA ρ_A A_VS / (ρ_S S) [1]_;
        ``"1978"``: C_AAS = 0.001 A_T / S [2]_.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017).
    .. [2] ITTC, Proc. 15th ITTC (1978), Performance Committee.
    """
    _check_method(method, AIR_RESISTANCE_METHODS)
    a = _arr(transverse_area, "transverse_area", nonnegative=True)
    s = _arr(wetted_surface, "wetted_surface", positive=True)
    if method == "1978":
        return _out(0.001 * a / s)
    rho_a = _arr(air_density, "air_density", positive=True)
    rho_s = _arr(water_density, "water_density", positive=True)
    cda = _arr(drag_coefficient, "drag_coefficient", nonnegative=True)
    return _out(cda * rho_a * a / (rho_s * s))


@dataclass(frozen=True, eq=False)  # holds arrays: compare fields, not fits
class FormFactorFit:
    """Result of Prohaska's form-factor fit.

    Attributes
    ----------
    form_factor : float
        k [-], the fitted intercept minus one.
    slope : float
        y [-], the slope on Fn^n / C_FM.
    r_squared : float
        Coefficient of determination of the straight-line fit [-].
    residuals : numpy.ndarray
        C_TM/C_FM minus the fitted line at the points used [-].
    froude_range : tuple of float
        Froude-number range of the points used.
    n_points : int
        Number of points used.
    exponent : float
        The exponent n on the Froude number.
    used : numpy.ndarray of bool
        Which input points lie in ``froude_range`` and were used.
    """

    form_factor: float
    slope: float
    r_squared: float
    residuals: np.ndarray
    froude_range: tuple[float, float]
    n_points: int
    exponent: float
    used: np.ndarray | None = None


def prohaska_fit(froude_number, ctm, cfm, exponent: float = 4,
                 froude_range: tuple[float, float] = (0.1, 0.2)) -> FormFactorFit:
    r"""Form factor by Prohaska's method: a least-squares line through low-speed runs.

    .. math:: \frac{C_{TM}}{C_{FM}} = (1 + k) + y\,\frac{Fn^n}{C_{FM}}

    fitted to the runs with ``froude_range[0] <= Fn <= froude_range[1]`` [1]_ [2]_.

    Parameters
    ----------
    froude_number : array_like
        Model Froude numbers on L_WL [-].
    ctm : array_like
        Model total resistance coefficients (temperature-corrected) [-].
    cfm : array_like
        Model frictional coefficients, ITTC-1957 line [-].
    exponent : float
        n, 4 by default; 4 to 6 are in use [1]_.
    froude_range : (float, float)
        Froude range of the fit; about 0.1 to 0.2 [1]_.

    Returns
    -------
    FormFactorFit

    Raises
    ------
    InputError
        Fewer than three runs in ``froude_range``, or arrays of different length.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), form factor.
    .. [2] Prohaska, C. W., Proc. 11th ITTC (1966) 65-66.
    """
    fn = np.atleast_1d(_arr(froude_number, "froude_number", nonnegative=True)).ravel()
    ct = np.atleast_1d(_arr(ctm, "ctm", positive=True)).ravel()
    cf = np.atleast_1d(_arr(cfm, "cfm", positive=True)).ravel()
    if not (fn.size == ct.size == cf.size):
        raise InputError(f"prohaska_fit: froude_number, ctm and cfm have lengths {fn.size}, "
                         f"{ct.size}, {cf.size}; expected equal lengths")
    lo, hi = (float(froude_range[0]), float(froude_range[1]))
    if not lo < hi:
        raise InputError(f"froude_range: got ({lo:g}, {hi:g}); expected low < high")
    used = (fn >= lo) & (fn <= hi)
    n = int(used.sum())
    if n < 3:
        raise InputError(f"froude_range: only {n} run(s) with {lo:g} <= Fn <= {hi:g}; "
                         "Prohaska's fit needs at least 3")
    x = fn[used] ** exponent / cf[used]
    yv = ct[used] / cf[used]
    design = np.column_stack([np.ones(n), x])
    coef, *_ = np.linalg.lstsq(design, yv, rcond=None)
    fitted = design @ coef
    resid = yv - fitted
    ss_tot = float(np.sum((yv - yv.mean()) ** 2))
    r2 = 1.0 - float(np.sum(resid**2)) / ss_tot if ss_tot > 0 else 1.0
    return FormFactorFit(float(coef[0] - 1.0), float(coef[1]), r2, resid, (lo, hi), n,
                         float(exponent), used)


def prohaska_fit_many(froude_number, ctm, cfm, used, exponent: float = 4):
    r"""Prohaska's fit of many sets of runs at once (one per row): (k, slope y), each ``(N,)``.

    The same straight line as :func:`prohaska_fit`,
    :math:`C_{TM}/C_{FM} = (1 + k) + y\,Fn^n/C_{FM}`, fitted by least squares in closed form
    to the runs marked in ``used`` of every row (the Monte Carlo samples of an uncertainty
    estimate re-fit k this way in one pass).

    Parameters
    ----------
    froude_number, ctm, cfm : array_like
        ``(N, n)``: N sets of n runs [-].
    used : array_like of bool
        ``(n,)``: the runs of the fit (the same for every set), at least three.
    exponent : float
        n on the Froude number [-].

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), form factor; Prohaska, Proc. 11th ITTC (1966).
    """
    used = np.asarray(used, dtype=bool)
    if used.sum() < 3:
        raise InputError(f"froude_range: only {int(used.sum())} run(s) in the fit; Prohaska's "
                         "fit needs at least 3")
    cf = np.atleast_2d(np.asarray(cfm, dtype=float))[:, used]
    x = np.atleast_2d(np.asarray(froude_number, dtype=float))[:, used] ** exponent / cf
    y = np.atleast_2d(np.asarray(ctm, dtype=float))[:, used] / cf
    dx = x - x.mean(axis=1, keepdims=True)
    slope = np.sum(dx * (y - y.mean(axis=1, keepdims=True)), axis=1) / np.sum(dx * dx, axis=1)
    intercept = y.mean(axis=1) - slope * x.mean(axis=1)
    return intercept - 1.0, slope


def residuary_coefficient(ctm, cfm, form_factor):
    """Residuary resistance coefficient C_R = C_TM - (1 + k) C_FM [-], the same at model and
    full scale at equal Froude number (ITTC 7.5-02-03-01.4 Rev 04 2017).

    Parameters
    ----------
    ctm, cfm : numeric
        Model total (temperature-corrected) and frictional coefficients [-].
    form_factor : numeric
        k [-] (0 for the Froude method).
    """
    return _out(_arr(ctm, "ctm") - (1.0 + _arr(form_factor, "form_factor"))
                * _arr(cfm, "cfm"))


def ship_total_resistance_coefficient(cfs, form_factor, delta_cf, ca, cr, caas,
                                      wetted_surface=1.0, bilge_keel_area=0.0):
    r"""Full-scale total resistance coefficient C_TS [-].

    .. math:: C_{TS} = \frac{S + S_{BK}}{S}\left[(1 + k) C_{FS} + \Delta C_F\right]
              + C_A + C_R + C_{AAS}

    Parameters
    ----------
    cfs : numeric
        Ship frictional coefficient, ITTC-1957 line at the ship Reynolds number [-].
    form_factor : numeric
        k [-].
    delta_cf, ca, cr, caas : numeric
        Roughness, correlation, residuary and air-resistance coefficients [-].
    wetted_surface : numeric
        Bare-hull wetted surface S [m^2] (only the ratio to ``bilge_keel_area`` matters).
    bilge_keel_area : numeric
        Wetted area of the bilge keels S_BK [m^2].

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), total resistance of the ship.
    """
    s = _arr(wetted_surface, "wetted_surface", positive=True)
    sbk = _arr(bilge_keel_area, "bilge_keel_area", nonnegative=True)
    k = _arr(form_factor, "form_factor")
    viscous = (1.0 + k) * _arr(cfs, "cfs", positive=True) + _arr(delta_cf, "delta_cf")
    return _out((s + sbk) / s * viscous + _arr(ca, "ca") + _arr(cr, "cr")
                + _arr(caas, "caas"))


def resistance_from_coefficient(coefficient, density, wetted_surface, speed):
    """Resistance R = ½ ρ S V² C [N]; C [-], ρ [kg/m^3], S [m^2], V [m/s]."""
    return _out(0.5 * _arr(density, "density", positive=True)
                * _arr(wetted_surface, "wetted_surface", positive=True)
                * _arr(speed, "speed", nonnegative=True) ** 2 * _arr(coefficient, "coefficient"))


def coefficient_from_resistance(resistance, density, wetted_surface, speed):
    """Resistance coefficient C = R / (½ ρ S V²) [-]; R [N], ρ [kg/m^3], S [m^2], V [m/s] > 0."""
    return _out(_arr(resistance, "resistance")
                / (0.5 * _arr(density, "density", positive=True)
                   * _arr(wetted_surface, "wetted_surface", positive=True)
                   * _arr(speed, "speed", positive=True) ** 2))


def effective_power(cts, density, wetted_surface, speed):
    """Effective power P_E = R_TS V = ½ ρ S V³ C_TS [W].

    Parameters
    ----------
    cts : numeric
        Ship total resistance coefficient [-].
    density : numeric
        Sea-water density [kg/m^3].
    wetted_surface : numeric
        Wetted surface S [m^2] (including bilge keels if C_TS was built with them on S).
    speed : numeric
        Ship speed [m/s].

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017).
    """
    v = _arr(speed, "speed", nonnegative=True)
    return _out(np.asarray(resistance_from_coefficient(cts, density, wetted_surface, v)) * v)


def wake_fraction_full_scale(wtm, thrust_deduction, cfm, cfs, form_factor, delta_cf,
                             rudder_allowance: float = RUDDER_WAKE_ALLOWANCE):
    r"""Full-scale effective wake fraction w_TS [-].

    .. math:: w_{TS} = (t + 0.04) + (w_{TM} - t - 0.04)
              \frac{(1 + k) C_{FS} + \Delta C_F}{(1 + k) C_{FM}}

    The 0.04 stands for the rudder's effect on the wake [1]_.

    Parameters
    ----------
    wtm : numeric
        Model (Taylor) wake fraction from thrust identity [-].
    thrust_deduction : numeric
        Thrust deduction fraction t [-].
    cfm, cfs : numeric
        Model and ship frictional coefficients [-].
    form_factor : numeric
        k [-].
    delta_cf : numeric
        Roughness allowance [-].
    rudder_allowance : float
        0.04 [1]_; 0 for ships without a rudder behind the propeller.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), wake scaling.
    """
    t = _arr(thrust_deduction, "thrust_deduction")
    k = _arr(form_factor, "form_factor")
    ratio = ((1.0 + k) * _arr(cfs, "cfs", positive=True) + _arr(delta_cf, "delta_cf")) / (
        (1.0 + k) * _arr(cfm, "cfm", positive=True))
    base = t + rudder_allowance
    return _out(base + (_arr(wtm, "wtm") - base) * ratio)


__all__ = [
    "AIR_DENSITY_15C",
    "AIR_RESISTANCE_METHODS",
    "CORRELATION_METHODS",
    "DEFAULT_AIR_DRAG_COEFFICIENT",
    "DEFAULT_HULL_ROUGHNESS",
    "NEGATIVE_CA_REYNOLDS",
    "ROUGHNESS_METHODS",
    "RUDDER_WAKE_ALLOWANCE",
    "SEA_WATER_DENSITY_15C",
    "FormFactorFit",
    "air_resistance_coefficient",
    "coefficient_from_resistance",
    "correlation_allowance",
    "correlation_allowance_note",
    "effective_power",
    "prohaska_fit",
    "prohaska_fit_many",
    "residuary_coefficient",
    "resistance_from_coefficient",
    "roughness_allowance",
    "ship_total_resistance_coefficient",
    "temperature_corrected_ctm",
    "wake_fraction_full_scale",
]

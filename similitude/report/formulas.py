"""Spreadsheet formula text for the test-day cells: fluid properties, Reynolds number, C_F.

Each function returns an Excel/LibreOffice formula string (starting with ``=``) for given cell
references. The property formulas are the same closed-form correlations that
:mod:`fluids_props` evaluates in Python, built from that module's public coefficient tuples, so
the workbook and the program agree to rounding. tests/report/test_xlsx_recalc.py recalculates a
written workbook in LibreOffice and compares.

Temperature references point at a cell holding the temperature in kelvin; pressure references
at a cell with the absolute pressure in pascal.

Spreadsheet syntax notes: negative constants are parenthesised because a leading unary minus
binds tighter than ``^`` in Excel (``-2^2`` is 4); numbers are written with ``repr`` so they read
back to the same double.

References
----------
.. [1] IAPWS SR7-09 (2009), liquid-water Gibbs function (density).
.. [2] IAPWS R12-08 (2008), viscosity of ordinary water substance.
.. [3] Wagner, W. and Pruss, A., J. Phys. Chem. Ref. Data 22 (1993) 783-787 (vapour pressure).
.. [4] IAPWS R1-76(2014), surface tension of ordinary water substance.
.. [5] ITTC, Proc. 8th ITTC, Madrid, 1957 (model-ship correlation line); ITTC Recommended
       Procedure 7.5-02-03-01.4 (2021).
"""

from __future__ import annotations

from fluids_props import water
from similitude.errors import InputError

#: Model fluids whose properties are written as closed-form live formulas. Other fluids (air,
#: sea water, nitrogen: equations of state solved iteratively in Python) are tabulated from the
#: program's own correlation on a fine temperature grid and interpolated linearly in the sheet
#: (:func:`interpolate`).
LIVE_FLUIDS = ("fresh_water",)


def _num(x: float) -> str:
    s = repr(float(x))
    return f"({s})" if s.startswith("-") else s


def _horner(coeffs, x: str) -> str:
    """Formula text of sum c_n x^n (rising order) in Horner form."""
    cs = list(coeffs)
    while len(cs) > 1 and cs[-1] == 0:
        cs.pop()
    s = _num(cs[-1])
    for c in reversed(cs[:-1]):
        s = f"{_num(c)}+{x}*({s})"
    return s


def supports(fluid: str) -> bool:
    """True when the property formulas exist for ``fluid``."""
    return fluid in LIVE_FLUIDS


def _unsupported(fluid: str) -> InputError:
    return InputError(f"model fluid: {fluid!r} has no spreadsheet formula; expected one of "
                      + ", ".join(LIVE_FLUIDS))


def kelvin(celsius_ref: str) -> str:
    """Formula body T [K] = t [degC] + 273.15 of a Celsius cell."""
    return f"{celsius_ref}+273.15"


# -- fresh water (fluids_props.water) --------------------------------------------------------
def _water_density(t_ref: str, p_ref: str | None) -> str:
    y = f"(({t_ref}-{_num(water.T0)})/{_num(water.T_SCALE)})"
    if p_ref is None:
        return f"{_num(water.P_SCALE)}/({_horner(water.DENSITY_COEFFS, y)})"
    # rho = p_u / sum_{k>=1} k g_jk y^j z^(k-1), z = (p - p0)/p_u  (SR7-09 pressure derivative)
    kmax = max(k for _, k, _ in water.GIBBS_COEFFS)
    jmax = max(j for j, _, _ in water.GIBBS_COEFFS)
    polys = []
    for k in range(1, kmax + 1):
        c = [0.0] * (jmax + 1)
        for j, kk, g in water.GIBBS_COEFFS:
            if kk == k:
                c[j] = k * g
        polys.append(_horner(c, y))
    z = f"(({p_ref}-{_num(water.P0)})/{_num(water.P_SCALE)})"
    s = f"({polys[-1]})"
    for poly in reversed(polys[:-1]):
        s = f"({poly})+{z}*({s})"
    return f"{_num(water.P_SCALE)}/({s})"


def _water_viscosity(t_ref: str, rho_ref: str) -> str:
    inv_tb = f"({_num(water.T_CRIT)}/{t_ref})"
    rb = f"({rho_ref}/{_num(water.RHO_STAR)})"
    mu0 = f"100*SQRT({t_ref}/{_num(water.T_CRIT)})/({_horner(water.VISCOSITY_H0, inv_tb)})"
    x = f"({inv_tb}-1)"
    d = f"({rb}-1)"
    jmax = max(j for _, j, _ in water.VISCOSITY_H1)
    imax = max(i for i, _, _ in water.VISCOSITY_H1)
    by_j = []
    for j in range(jmax + 1):
        c = [0.0] * (imax + 1)
        for i, jj, h in water.VISCOSITY_H1:
            if jj == j:
                c[i] = h
        by_j.append(_horner(c, x))
    s = f"({by_j[-1]})"
    for poly in reversed(by_j[:-1]):
        s = f"({poly})+{d}*({s})"
    return f"{_num(water.MU_STAR)}*{mu0}*EXP({rb}*({s}))"


def _water_vapour_pressure(t_ref: str) -> str:
    tau = f"(1-{t_ref}/{_num(water.T_CRIT)})"
    terms = "+".join(f"{_num(a)}*{tau}^{_num(e)}"
                     for a, e in zip(water.VAPOUR_PRESSURE_A, water.VAPOUR_PRESSURE_EXPONENTS,
                                     strict=True))
    return f"{_num(water.P_CRIT)}*EXP({_num(water.T_CRIT)}/{t_ref}*({terms}))"


def _water_surface_tension(t_ref: str) -> str:
    big_b, mu, b = water.SURFACE_TENSION_COEFFS
    tau = f"(1-{t_ref}/{_num(water.T_CRIT)})"
    return f"{_num(big_b)}*{tau}^{_num(mu)}*(1+{_num(b)}*{tau})"


def interpolate(t_ref: str, x_range: str, y_range: str) -> str:
    """Formula of linear interpolation of a tabulated property at the temperature in ``t_ref``.

    Parameters
    ----------
    t_ref : str
        Cell holding the temperature [K].
    x_range, y_range : str
        Absolute ranges of the increasing temperature grid [K] and of the property values,
        e.g. ``"'Property table'!$A$2:$A$1602"``.

    Notes
    -----
    i = MATCH(T, x, 1) (last grid point <= T, kept one short of the end), then
    y = y_i + (T - x_i) (y_(i+1) - y_i) / (x_(i+1) - x_i). With a grid step h the error is about
    h^2 |y''| / 8; for h = 0.05 K it is below 1e-7 relative for density and viscosity of gases
    and liquids (|y''/y| < 1e-4 K^-2).
    """
    i = f"MIN(MATCH({t_ref},{x_range},1),ROWS({x_range})-1)"
    xi, xj = f"INDEX({x_range},{i})", f"INDEX({x_range},{i}+1)"
    yi, yj = f"INDEX({y_range},{i})", f"INDEX({y_range},{i}+1)"
    return f"={yi}+({t_ref}-{xi})*({yj}-{yi})/({xj}-{xi})"


# -- public --------------------------------------------------------------------------------------
def density(fluid: str, t_ref: str, p_ref: str | None = None) -> str:
    """Formula for the density [kg/m^3] of ``fluid`` (closed form; see :data:`LIVE_FLUIDS`).

    Parameters
    ----------
    fluid : str
        ``"fresh_water"``.
    t_ref : str
        Cell holding the temperature [K].
    p_ref : str or None
        Cell holding the absolute pressure [Pa]; None gives the 0.101325 MPa form
        rho = 1e8 / sum c_j y^j of fluids_props.water.
    """
    if fluid == "fresh_water":
        return "=" + _water_density(t_ref, p_ref)
    raise _unsupported(fluid)


def dynamic_viscosity(fluid: str, t_ref: str, rho_ref: str | None = None) -> str:
    """Formula for the dynamic viscosity [Pa s]; water needs the density cell ``rho_ref``."""
    if fluid == "fresh_water":
        if rho_ref is None:
            raise InputError("rho_ref: missing; expected a density cell for water viscosity")
        return "=" + _water_viscosity(t_ref, rho_ref)
    raise _unsupported(fluid)


def vapour_pressure(fluid: str, t_ref: str) -> str | None:
    """Formula for the saturation vapour pressure [Pa] (liquids), else None."""
    return "=" + _water_vapour_pressure(t_ref) if fluid == "fresh_water" else None


def surface_tension(fluid: str, t_ref: str) -> str | None:
    """Formula for the surface tension [N/m] (liquids), else None."""
    return "=" + _water_surface_tension(t_ref) if fluid == "fresh_water" else None


def kinematic_viscosity(rho_ref: str, mu_ref: str) -> str:
    """Formula nu = mu / rho [m^2/s] from a density and a dynamic-viscosity cell."""
    return f"={mu_ref}/{rho_ref}"


def reynolds_number(speed_ref: str, length_ref: str, nu_ref: str) -> str:
    """Formula Re = V L / nu [-] (speed [m/s], length [m], nu [m^2/s] cells)."""
    return f"={speed_ref}*{length_ref}/{nu_ref}"


def ittc1957(re_ref: str) -> str:
    """Formula of the ITTC-1957 model-ship correlation line C_F = 0.075/(log10 Re - 2)^2 [5]_."""
    return f"=0.075/(LOG10({re_ref})-2)^2"

"""Scale factors between prototype and model for any quantity, from its dimensions.

A similitude choice fixes three base ratios, prototype over model: length lambda = L_p/L_m,
velocity v = V_p/V_m and density r = rho_p/rho_m. Time then scales as lambda/v and mass as
r*lambda^3, so a quantity of dimension [M]^a [L]^b [T]^c scales as

    X_p / X_m = r^a * lambda^(3a + b + c) * v^(-c).

The laws fix v:

* ``"froude"``  -- equal Fr = V/sqrt(gL) with equal g: v = lambda^(1/2). Gives the familiar
  table: time lambda^0.5, force lambda^3 r, power lambda^3.5 r, moment lambda^4 r, wave
  spectrum ordinate S(omega) lambda^2.5 [1]_ [2]_ [3]_.
* ``"reynolds"`` -- equal Re = VL/nu: v = (nu_p/nu_m)/lambda (``viscosity_ratio`` = nu_p/nu_m).
* ``"mach"``     -- equal Ma = V/a: v = a_p/a_m (``velocity_ratio``, default 1).
* ``"general"``  -- ``velocity_ratio`` given directly.

References
----------
.. [1] ITTC, "Seakeeping Experiments", Recommended Procedure 7.5-02-07-02.1, Rev 04, 2014
   (Froude scaling of motions, waves and loads).
.. [2] J. N. Newman, *Marine Hydrodynamics*, MIT Press, 1977, sec. 2.7 (model testing).
.. [3] S. A. Hughes, *Physical Models and Laboratory Techniques in Coastal Engineering*,
   World Scientific, 1993, ch. 2 (Froude scale ratios).
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from fractions import Fraction

from similitude.errors import InputError

__all__ = [
    "LAWS",
    "QUANTITIES",
    "ScalingRatios",
    "scale_factor",
    "scale_factor_table",
    "scale_factors",
    "scaling_ratios",
]

LAWS = ("froude", "reynolds", "mach", "general")

#: (quantity, [M, L, T] exponents, SI unit, example) rows of the scale-factor table.
QUANTITIES: tuple[tuple[str, tuple[Fraction, Fraction, Fraction], str, str], ...] = tuple(
    (name, tuple(Fraction(x) for x in mlt), unit, example)
    for name, mlt, unit, example in (
        ("length", (0, 1, 0), "m", "hull length, draught, motion amplitude"),
        ("area", (0, 2, 0), "m^2", "wetted surface"),
        ("volume", (0, 3, 0), "m^3", "displacement volume"),
        ("time", (0, 0, 1), "s", "run duration"),
        ("velocity", (0, 1, -1), "m/s", "ship speed, current"),
        ("acceleration", (0, 1, -2), "m/s^2", "vertical acceleration (g itself: 1)"),
        ("frequency", (0, 0, -1), "1/s", "encounter frequency"),
        ("rotation rate", (0, 0, -1), "1/s", "propeller rate of revolution"),
        ("angular velocity", (0, 0, -1), "rad/s", "roll rate"),
        ("mass", (1, 0, 0), "kg", "displacement mass"),
        ("density", (1, -3, 0), "kg/m^3", "fluid density"),
        ("force", (1, 1, -2), "N", "resistance, thrust, mooring load"),
        ("moment", (1, 2, -2), "N*m", "torque, bending moment"),
        ("power", (1, 2, -3), "W", "delivered power"),
        ("pressure", (1, -1, -2), "Pa", "slamming pressure, stress"),
        ("energy", (1, 2, -2), "J", "work, wave energy"),
        ("mass moment of inertia", (1, 2, 0), "kg*m^2", "roll inertia"),
        ("wave height", (0, 1, 0), "m", "H_s"),
        ("wave period", (0, 0, 1), "s", "T_p"),
        ("wave frequency", (0, 0, -1), "rad/s", "omega_p"),
        ("spectral density S(ω)", (0, 2, 1), "m^2*s", "wave spectrum ordinate"),
        ("kinematic viscosity needed", (0, 2, -1), "m^2/s", "nu for equal Re"),
        ("dynamic viscosity", (1, -1, -1), "Pa*s", "mu"),
        ("surface tension needed", (1, 0, -2), "N/m", "sigma for equal We"),
        ("linear stiffness", (1, 0, -2), "N/m", "mooring spring"),
        ("rotational stiffness", (1, 2, -2), "N*m/rad", "restoring moment per radian"),
        ("linear damping", (1, 0, -1), "N*s/m", "damper coefficient"),
        ("flow rate", (0, 3, -1), "m^3/s", "volume flow"),
        ("angle", (0, 0, 0), "rad", "trim, roll angle"),
    )
)


@dataclass(frozen=True)
class ScalingRatios:
    """Base ratios prototype/model fixed by a similitude law.

    Attributes
    ----------
    law : str
    length : float
        lambda = L_p / L_m.
    velocity : float
        V_p / V_m.
    density : float
        rho_p / rho_m.
    """

    law: str
    length: float
    velocity: float
    density: float

    @property
    def time(self) -> float:
        """T_p / T_m = lambda / v."""
        return self.length / self.velocity

    @property
    def mass(self) -> float:
        """M_p / M_m = r lambda^3."""
        return self.density * self.length**3


def _positive(name: str, value, default=None) -> float:
    if value is None:
        if default is None:
            raise InputError(f"{name}: missing; expected a positive number")
        return default
    try:
        x = float(value)
    except (TypeError, ValueError):
        x = float("nan")
    if not (math.isfinite(x) and x > 0):
        raise InputError(f"{name}: {value!r} is not valid; expected a positive finite number")
    return x


def scaling_ratios(law: str = "froude", scale: float = 1.0, density_ratio: float = 1.0,
                   velocity_ratio: float | None = None,
                   viscosity_ratio: float | None = None) -> ScalingRatios:
    """The base ratios (length, velocity, density) of a similitude law.

    Parameters
    ----------
    law : {"froude", "reynolds", "mach", "general"}
    scale : float or str
        lambda = L_p / L_m [-]; ``"1:25"`` is read as 25.
    density_ratio : float
        rho_p / rho_m [-].
    velocity_ratio : float, optional
        V_p / V_m [-]; required for ``"general"``; for ``"mach"`` the ratio a_p/a_m of the
        speeds of sound (default 1).
    viscosity_ratio : float, optional
        nu_p / nu_m [-] for ``"reynolds"`` (default 1).

    Returns
    -------
    ScalingRatios
    """
    from similitude.units import UnitInputError, parse_scale

    if law not in LAWS:
        raise InputError(f"law: {law!r} is not a scaling law; expected one of {', '.join(LAWS)}")
    try:
        lam = parse_scale(scale)
    except UnitInputError as exc:
        raise InputError(str(exc)) from None
    r = _positive("density_ratio", density_ratio, 1.0)
    if law == "froude":
        v = math.sqrt(lam)
    elif law == "reynolds":
        v = _positive("viscosity_ratio", viscosity_ratio, 1.0) / lam
    elif law == "mach":
        v = _positive("velocity_ratio", velocity_ratio, 1.0)
    else:
        v = _positive("velocity_ratio", velocity_ratio)
    return ScalingRatios(law, lam, v, r)


def _mlt(dimension_exponents) -> tuple[Fraction, Fraction, Fraction]:
    if isinstance(dimension_exponents, Mapping):
        aliases = {"M": "M", "[mass]": "M", "mass": "M", "L": "L", "[length]": "L",
                   "length": "L", "T": "T", "[time]": "T", "time": "T"}
        out = {"M": Fraction(0), "L": Fraction(0), "T": Fraction(0)}
        for k, e in dimension_exponents.items():
            if k not in aliases:
                raise InputError(
                    f"dimension_exponents: {k!r} is not a base dimension; expected M, L or T"
                )
            out[aliases[k]] += Fraction(e)
        return out["M"], out["L"], out["T"]
    if isinstance(dimension_exponents, str):
        from similitude.units import Q_

        try:
            dim = Q_(1.0, dimension_exponents).dimensionality
        except Exception:
            raise InputError(
                f"dimension_exponents: cannot read {dimension_exponents!r} as a unit"
            ) from None
        extra = set(dim) - {"[mass]", "[length]", "[time]"}
        if extra:
            raise InputError(
                f"dimension_exponents: {dimension_exponents!r} has dimensions {sorted(extra)}; "
                "only [mass], [length], [time] scale with lambda, V and rho"
            )
        return _mlt(dict(dim))
    if isinstance(dimension_exponents, Sequence) and len(dimension_exponents) == 3:
        return tuple(Fraction(e) for e in dimension_exponents)  # type: ignore[return-value]
    raise InputError(
        f"dimension_exponents: {dimension_exponents!r} is not valid; expected (M, L, T) "
        "exponents, a mapping {'M': a, 'L': b, 'T': c} or a unit such as 'N'"
    )


def scale_factor(dimension_exponents, scale: float, velocity_ratio: float | None = None,
                 density_ratio: float = 1.0) -> float:
    """Prototype/model factor of a quantity of dimension [M]^a [L]^b [T]^c.

    Parameters
    ----------
    dimension_exponents : tuple (a, b, c), mapping or unit string
        ``(1, 1, -2)`` or ``{"M": 1, "L": 1, "T": -2}`` or ``"N"`` for a force.
    scale : float
        lambda = L_p / L_m [-].
    velocity_ratio : float, optional
        V_p / V_m [-]; Froude scaling (lambda^0.5) when omitted.
    density_ratio : float
        rho_p / rho_m [-].

    Returns
    -------
    float
        X_p / X_m = r^a lambda^(3a+b+c) v^(-c).

    Examples
    --------
    >>> round(scale_factor((1, 2, -3), 25.0), 1)  # power, Froude, same water: 25**3.5
    78125.0
    """
    a, b, c = _mlt(dimension_exponents)
    lam = _positive("scale", scale)
    v = math.sqrt(lam) if velocity_ratio is None else _positive("velocity_ratio", velocity_ratio)
    r = _positive("density_ratio", density_ratio, 1.0)
    return r ** float(a) * lam ** float(3 * a + b + c) * v ** float(-c)


def _num(e: Fraction) -> str:
    return str(e.numerator) if e.denominator == 1 else f"{float(e):g}"


def _powered(base: str, e: Fraction, wrap: bool = False) -> str:
    if e == 0:
        return ""
    if e == 1:
        return base
    return f"({base})^{_num(e)}" if wrap else f"{base}^{_num(e)}"


def _expression(law: str, a: Fraction, b: Fraction, c: Fraction) -> str:
    if law == "froude":
        parts = [_powered("λ", 3 * a + b + c / 2)]
        ratio_part = ""
    elif law == "reynolds":
        parts = [_powered("λ", 3 * a + b + 2 * c)]
        ratio_part = _powered("νp/νm", -c, wrap=True)
    else:
        parts = [_powered("λ", 3 * a + b + c)]
        name = "ap/am" if law == "mach" else "Vp/Vm"
        ratio_part = _powered(name, -c, wrap=True)
    parts.append(ratio_part)
    parts.append(_powered("ρp/ρm", a, wrap=True))
    text = "·".join(p for p in parts if p)
    return text or "1"


def scale_factor_table(scale, law: str = "froude", density_ratio: float = 1.0,
                       velocity_ratio: float | None = None,
                       viscosity_ratio: float | None = None):
    """Scale factors prototype/model of the usual quantities, as a DataFrame.

    Parameters
    ----------
    scale : float or str
        lambda = L_p / L_m (``"1:25"`` or 25).
    law : {"froude", "reynolds", "mach", "general"}
    density_ratio : float
        rho_p / rho_m (e.g. 1026.02/999.10 for sea water at full scale, fresh water in the
        tank at 15 degC, ITTC 7.5-02-01-03).
    velocity_ratio, viscosity_ratio : float, optional
        See :func:`scaling_ratios`.

    Returns
    -------
    pandas.DataFrame
        Columns ``quantity``, ``dimension`` ("M^a L^b T^c"), ``factor (prototype/model)``,
        ``expression`` (e.g. ``"λ^3.5·ρp/ρm"``), ``unit``, ``example``.
    """
    import pandas as pd

    ratios = scaling_ratios(law, scale, density_ratio, velocity_ratio, viscosity_ratio)
    rows = []
    for name, (a, b, c), unit, example in QUANTITIES:
        dim = " ".join(f"{s}^{_num(e)}" if e != 1 else s
                       for s, e in (("M", a), ("L", b), ("T", c)) if e != 0) or "1"
        rows.append({
            "quantity": name,
            "dimension": dim,
            "factor (prototype/model)": scale_factor(
                (a, b, c), ratios.length, ratios.velocity, ratios.density),
            "expression": _expression(law, a, b, c),
            "unit": unit,
            "example": example,
        })
    return pd.DataFrame(rows)


#: Alias under the package-level name (``similitude.scale_factors``).
scale_factors = scale_factor_table

"""The catalogue of named dimensionless groups, expressed in physical roles.

Dimensions alone cannot tell a kinematic viscosity from a thermal diffusivity, or a propeller's
rate of turning from a wave frequency, so every catalogued group is written in *roles*: the
Reynolds number is ``velocity^1 length^1 kinematic_viscosity^-1`` (or, with a dynamic viscosity,
``density^1 velocity^1 length^1 dynamic_viscosity^-1``). :func:`lookup` identifies a group from
the role exponents of a product of variables, including any rational power of a catalogued form
(``g L / V^2`` is ``Fr^-2``).

Definitions and symbols follow the ITTC Symbols and Terminology List [1]_ where it has them, and
the standard fluid-mechanics texts otherwise [2]_ [3]_ [4]_. Numerical values of the main groups
are computed by :mod:`similitude.dimensional.numbers`.

Roles
-----
Each role has a dimension (used to check a user's declared role) and optionally a *parent* role:
``thrust`` is a kind of ``force``, ``depth`` a kind of ``length``. A group that matches no form
with its specific roles is tried again with each role replaced by its parent.

References
----------
.. [1] ITTC, "ITTC Symbols and Terminology List", version 2017, International Towing Tank
   Conference.
.. [2] F. M. White, *Fluid Mechanics*, 7th ed., McGraw-Hill, 2011, ch. 5.
.. [3] J. N. Newman, *Marine Hydrodynamics*, MIT Press, 1977, ch. 2 and 6.
.. [4] G. K. Batchelor, *An Introduction to Fluid Dynamics*, Cambridge University Press, 1967.
.. [5] J. S. Carlton, *Marine Propellers and Propulsion*, 2nd ed., Butterworth-Heinemann,
   2007, ch. 6 (propeller coefficients K_T, K_Q, J).
.. [6] H. Schlichting and K. Gersten, *Boundary-Layer Theory*, 8th ed., Springer, 2000.
.. [7] G. H. Keulegan and L. H. Carpenter, "Forces on cylinders and plates in an oscillating
   fluid", J. Res. Natl. Bur. Stand. 60(5), 1958, 423-440.
.. [8] J. D. Anderson, *Modern Compressible Flow*, 3rd ed., McGraw-Hill, 2003 (isentropic
   relations).
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from fractions import Fraction
from types import MappingProxyType

from similitude.errors import InputError

__all__ = [
    "CATALOGUE",
    "GroupMatch",
    "NamedGroup",
    "ROLES",
    "catalogue",
    "get",
    "keys",
    "lookup",
    "role_parent",
]

#: role -> (SI unit giving its dimension, parent role or None).
ROLES: Mapping[str, tuple[str, str | None]] = MappingProxyType({
    "velocity": ("m/s", None),
    "speed_of_sound": ("m/s", None),
    "length": ("m", None),
    "depth": ("m", "length"),
    "roughness": ("m", "length"),
    "wave_height": ("m", "length"),
    "amplitude": ("m", "length"),
    "area": ("m^2", None),
    "volume": ("m^3", None),
    "time": ("s", None),
    "period": ("s", "time"),
    "frequency": ("1/s", None),
    "rotation_rate": ("1/s", None),
    "angular_velocity": ("1/s", "rotation_rate"),
    "buoyancy_frequency": ("1/s", None),
    "density": ("kg/m^3", None),
    "density_difference": ("kg/m^3", "density"),
    "kinematic_viscosity": ("m^2/s", None),
    "thermal_diffusivity": ("m^2/s", None),
    "dynamic_viscosity": ("Pa*s", None),
    "gravity": ("m/s^2", None),
    "reduced_gravity": ("m/s^2", None),
    "acceleration": ("m/s^2", None),
    "surface_tension": ("N/m", None),
    "pressure": ("Pa", None),
    "pressure_difference": ("Pa", "pressure"),
    "cavitation_pressure": ("Pa", None),
    "vapour_pressure": ("Pa", "cavitation_pressure"),
    "elastic_modulus": ("Pa", None),
    "bulk_modulus": ("Pa", "elastic_modulus"),
    "force": ("N", None),
    "thrust": ("N", "force"),
    "torque": ("N*m", None),
    "power": ("W", None),
    "energy": ("J", None),
    "mass": ("kg", None),
    "flow_rate": ("m^3/s", None),
    "unit_discharge": ("m^2/s", None),
    "temperature": ("K", None),
    "temperature_difference": ("K", None),
    "thermal_expansion": ("1/K", None),
    "thermal_conductivity": ("W/(m*K)", None),
    "heat_transfer_coefficient": ("W/(m^2*K)", None),
    "specific_heat": ("J/(kg*K)", None),
    "angle": ("rad", None),
})


def role_parent(role: str) -> str:
    """The parent of a role (itself when it has none); unknown roles map to themselves."""
    entry = ROLES.get(role)
    return entry[1] if entry and entry[1] else role


Form = tuple[tuple[str, Fraction], ...]


def _form(text: str) -> Form:
    """Read ``"velocity 1, gravity -1/2"`` into ((role, Fraction), ...), order kept."""
    out = []
    for part in text.split(","):
        role, exp = part.split()
        if role not in ROLES:
            raise ValueError(f"catalogue: unknown role {role!r}")  # programming error
        out.append((role, Fraction(exp)))
    return tuple(out)


@dataclass(frozen=True)
class NamedGroup:
    """A named dimensionless group of the catalogue.

    Attributes
    ----------
    key : str
        Stable identifier (``"froude"``).
    name : str
        Trade name (``"Froude number"``).
    symbol : str
        Usual symbol (``"Fr"``; ITTC writes ``Fn`` for ships).
    definition : str
        The defining formula, e.g. ``"V/sqrt(g*L)"``.
    forms : tuple
        Equivalent role forms, each a tuple of (role, exponent) in conventional order; the first
        is the primary definition.
    factors : tuple of Fraction
        Numerical factor of each form (2 for the cavitation number, whose denominator is
        rho V^2 / 2).
    meaning : str
        The ratio of effects the group measures.
    regimes : str
        Regime thresholds in use, each with its source and confidence.
    specific : bool
        True when the group is matched only with its own roles, never their parents (the
        wave steepness needs a wave height, not any length).
    """

    key: str
    name: str
    symbol: str
    definition: str
    forms: tuple[Form, ...]
    factors: tuple[Fraction, ...]
    meaning: str
    regimes: str
    specific: bool = False

    @property
    def roles(self) -> dict[str, Fraction]:
        """Role exponents of the primary form."""
        return dict(self.forms[0])


def _g(key, name, symbol, definition, forms, meaning, regimes, factors=None,
       specific=False) -> NamedGroup:
    parsed = tuple(_form(f) for f in forms)
    fac = tuple(Fraction(f) for f in (factors or [1] * len(parsed)))
    return NamedGroup(key, name, symbol, definition, parsed, fac, meaning, regimes, specific)


CATALOGUE: tuple[NamedGroup, ...] = (
    _g("froude", "Froude number", "Fr", "V/sqrt(g*L)",
       ["velocity 1, gravity -1/2, length -1/2"],
       "inertia / gravity; governs free-surface waves and wave resistance",
       "Ship wave resistance rises steeply near Fn = 0.4-0.5 (hull-speed hump) [common practice; "
       "Newman 1977 ch. 6]. Matched in all towing-tank and wave-basin tests (ITTC 7.5-02-02-01)."),
    _g("depth_froude", "depth Froude number", "Fh", "V/sqrt(g*h)",
       ["velocity 1, gravity -1/2, depth -1/2",
        "flow_rate 1, length -1, gravity -1/2, depth -3/2",
        "unit_discharge 1, gravity -1/2, depth -3/2"],
       "speed / shallow-water wave speed sqrt(g h)",
       "Critical at Fh = 1 (shallow-water wave speed; Newman 1977 sec. 6.9); deep-water speed "
       "trials require Fh < ~0.6 (ITTC 7.5-04-01-01.1, from memory). In an open channel of "
       "width b the flow rate Q gives V = Q/(b h), Fh = Q/(b*sqrt(g*h**3)), and the discharge "
       "per unit width q gives Fh = q/sqrt(g*h**3) (Chow 1959, Open-Channel Hydraulics, ch. 3)."),
    _g("densimetric_froude", "densimetric Froude number", "Fr_d", "U/sqrt(g'*L)",
       ["velocity 1, reduced_gravity -1/2, length -1/2"],
       "inertia / buoyancy with the reduced gravity g' = g*drho/rho of a density interface",
       "Internal hydraulic jump and control at Fr_d = 1 (Turner 1973, Buoyancy Effects in "
       "Fluids, ch. 3, from memory); equals Ri**(-1/2) of the bulk Richardson number."),
    _g("rotational_froude", "rotational Froude number", "Fr_n", "n*sqrt(D/g)",
       ["rotation_rate 1, length 1/2, gravity -1/2"],
       "rotational inertia / gravity for a propeller or rotor",
       "Matched in cavitation tests only when the hydrostatic gradient of sigma over the disk "
       "matters (ITTC 7.5-02-03-03.1, from memory)."),
    _g("reynolds", "Reynolds number", "Re", "V*L/nu",
       ["velocity 1, length 1, kinematic_viscosity -1",
        "density 1, velocity 1, length 1, dynamic_viscosity -1",
        "velocity 1, area 1/2, kinematic_viscosity -1",
        "density 1, velocity 1, area 1/2, dynamic_viscosity -1",
        "flow_rate 1, length -1, kinematic_viscosity -1",
        "density 1, flow_rate 1, length -1, dynamic_viscosity -1",
        "unit_discharge 1, kinematic_viscosity -1"],
       "inertia / viscous forces (with an area, on its square root; with a pipe flow rate Q, "
       "Q/(D*nu), which is pi/4 times V*D/nu on the mean velocity 4Q/(pi D^2); in an open "
       "channel q/nu = V*h/nu)",
       "Pipe flow laminar below about 2300 (White 2011 sec. 6.1); flat-plate transition "
       "Re_x ~ 5e5-5e6 (Schlichting & Gersten 2000); ship models kept above ~2-3e6 with "
       "turbulence stimulation [common practice]; sphere drag crisis near Re ~ 3e5 "
       "(White 2011 fig. 7.16, from memory)."),
    _g("rotational_reynolds", "rotational Reynolds number", "Re_n", "n*D**2/nu",
       ["rotation_rate 1, length 2, kinematic_viscosity -1",
        "density 1, rotation_rate 1, length 2, dynamic_viscosity -1"],
       "rotational inertia / viscous forces (propeller, rotor)",
       "ITTC uses the chord Reynolds number at 0.75R instead; open-water tests above "
       "~2e5 there (from memory, ITTC 7.5-02-03-02.1)."),
    _g("mach", "Mach number", "Ma", "V/a",
       ["velocity 1, speed_of_sound -1"],
       "flow speed / speed of sound; compressibility",
       "Density change below 5 % for Ma < 0.3 (isentropic relation, Anderson 2003); "
       "transonic from about 0.8, sonic at 1."),
    _g("helmholtz", "Helmholtz number", "He", "f*L/a",
       ["frequency 1, length 1, speed_of_sound -1"],
       "body size / acoustic wave length (times 2 pi: k L)",
       "Acoustically compact source for He << 1 (Pierce 1989, Acoustics, ch. 4, from memory)."),
    _g("weber", "Weber number", "We", "rho*V**2*L/sigma",
       ["density 1, velocity 2, length 1, surface_tension -1"],
       "inertia / surface tension",
       "No ITTC threshold found; capillary effects on waves negligible for wave periods above "
       "~0.35 s (Hughes 1993, after Le Mehaute 1976, from memory)."),
    _g("cavitation", "cavitation number", "sigma_v", "(p - p_v)/(0.5*rho*V**2)",
       ["cavitation_pressure 1, density -1, velocity -2",
        "cavitation_pressure 1, density -1, rotation_rate -2, length -2"],
       "margin of static pressure above vapour pressure / dynamic pressure",
       "Cavitation inception where sigma_v falls below -Cp_min of the body (Carlton 2007 "
       "ch. 9, from memory); propeller tests match sigma at a reference point "
       "(ITTC 7.5-02-03-03.1).",
       factors=[2, 2]),
    _g("euler", "Euler number", "Eu", "dp/(rho*V**2)",
       ["pressure_difference 1, density -1, velocity -2",
        "pressure_difference 1, length 4, density -1, flow_rate -2"],
       "pressure difference / dynamic pressure (twice the pressure coefficient; with a flow "
       "rate Q through a diameter D, dp*D**4/(rho*Q**2))",
       "Depends on geometry and Re only, when cavitation and free surface are absent "
       "(White 2011 sec. 5.2)."),
    _g("strouhal", "Strouhal number", "St", "f*L/V",
       ["frequency 1, length 1, velocity -1",
        "period -1, length 1, velocity -1"],
       "unsteady / convective time scales",
       "Circular-cylinder vortex shedding St ~ 0.2 over 300 < Re < 2e5 (White 2011 fig. 5.2, "
       "from memory)."),
    _g("keulegan_carpenter", "Keulegan-Carpenter number", "KC", "U*T/D",
       ["velocity 1, period 1, length -1"],
       "amplitude of oscillatory flow / body size",
       "Drag dominated for KC > ~25, inertia dominated for KC < ~5 [common practice; after "
       "Keulegan & Carpenter 1958, from memory]."),
    _g("wave_steepness", "wave steepness", "H/(g*T**2)", "H/(g*T**2)",
       ["wave_height 1, gravity -1, period -2"],
       "wave height / deep-water wave length scale g T^2 (2 pi H/(g T^2) = H/L_0)",
       "Deep-water waves break near H/L_0 = 1/7, i.e. H/(g T^2) = 0.027 (Michell 1893 limit, "
       "as charted by Le Mehaute 1976, An Introduction to Hydrodynamics and Water Waves, "
       "fig. 15.1, from memory).",
       specific=True),
    _g("relative_depth", "relative water depth", "h/(g*T**2)", "h/(g*T**2)",
       ["depth 1, gravity -1, period -2"],
       "water depth / deep-water wave length scale g T^2",
       "Deep water for h/(g T^2) > 0.08 (h/L_0 > 1/2), shallow water below 0.0025 "
       "(h/L_0 < 1/20, approximately) (Le Mehaute 1976 fig. 15.1, from memory).",
       specific=True),
    _g("advance_ratio", "advance ratio", "J", "V/(n*D)",
       ["velocity 1, rotation_rate -1, length -1"],
       "advance per revolution / diameter",
       "Bollard pull at J = 0; open-water efficiency peaks near zero thrust (Carlton 2007 "
       "ch. 6)."),
    _g("rossby", "Rossby number", "Ro", "U/(Omega*L)",
       ["velocity 1, angular_velocity -1, length -1"],
       "inertia / Coriolis force",
       "Rotation dominant for Ro << 1 (Batchelor 1967 sec. 7.6)."),
    _g("ekman", "Ekman number", "Ek", "nu/(Omega*L**2)",
       ["kinematic_viscosity 1, angular_velocity -1, length -2",
        "dynamic_viscosity 1, density -1, angular_velocity -1, length -2"],
       "viscous / Coriolis forces (Ro/Re)",
       "Ekman-layer thickness ~ L*Ek**(1/2); rotating-tank models need Ek << 1 (Greenspan "
       "1968, The Theory of Rotating Fluids, ch. 1, from memory)."),
    _g("richardson", "Richardson number", "Ri", "g*drho*L/(rho*U**2)",
       ["gravity 1, density_difference 1, length 1, density -1, velocity -2",
        "buoyancy_frequency 2, length 2, velocity -2"],
       "buoyancy (stratification) / inertia (shear)",
       "Stratified shear flow linearly stable where the gradient Ri > 1/4 everywhere "
       "(Miles-Howard criterion; Miles 1961, J. Fluid Mech. 10:496). With the buoyancy "
       "frequency, U/(N*L) = Ri**(-1/2) is the internal Froude number of stratified flow past "
       "an obstacle (Turner 1973, from memory)."),
    _g("cauchy", "Cauchy number", "Ca", "rho*V**2/E",
       ["density 1, velocity 2, elastic_modulus -1"],
       "inertia / elastic forces (equal to Ma^2 for a fluid's bulk modulus)",
       "Must be matched in hydroelastic models (common practice)."),
    _g("force_coefficient", "force coefficient", "C_F", "F/(rho*V**2*L**2)",
       ["force 1, density -1, velocity -2, length -2",
        "force 1, density -1, velocity -2, area -1"],
       "force / (dynamic pressure x area); defined here without the factor 1/2",
       "A function of Re, Fr and geometry (White 2011 sec. 5.2)."),
    _g("thrust_coefficient", "thrust coefficient", "K_T", "T/(rho*n**2*D**4)",
       ["thrust 1, density -1, rotation_rate -2, length -4",
        "force 1, density -1, rotation_rate -2, length -4"],
       "propeller thrust made dimensionless with rotation rate and diameter",
       "Open-water characteristics K_T(J) (ITTC 7.5-02-03-02.1; Carlton 2007 ch. 6)."),
    _g("torque_coefficient", "torque coefficient", "K_Q", "Q/(rho*n**2*D**5)",
       ["torque 1, density -1, rotation_rate -2, length -5"],
       "propeller torque made dimensionless with rotation rate and diameter",
       "Open-water characteristics K_Q(J) (ITTC 7.5-02-03-02.1; Carlton 2007 ch. 6)."),
    _g("moment_coefficient", "moment coefficient", "C_M", "M/(rho*V**2*L**3)",
       ["torque 1, density -1, velocity -2, length -3"],
       "moment / (dynamic pressure x area x length); without the factor 1/2",
       "A function of Re, Fr and geometry (White 2011 sec. 5.2)."),
    _g("power_coefficient", "power coefficient", "C_P", "P/(rho*n**3*D**5)",
       ["power 1, density -1, rotation_rate -3, length -5",
        "power 1, density -1, velocity -3, length -2"],
       "power / (density x speed^3 x area); with n and D the rotor form, with V and L the "
       "through-flow form",
       "Wind turbines: C_P based on rho V^3 A / 2 cannot exceed 16/27 (Betz limit)."),
    _g("flow_coefficient", "flow coefficient", "phi", "Q/(n*D**3)",
       ["flow_rate 1, rotation_rate -1, length -3"],
       "volume flow / (rotation rate x diameter^3) of a pump or fan",
       "Similar pumps run at equal phi (affinity laws; White 2011 sec. 11.4)."),
    _g("prandtl", "Prandtl number", "Pr", "nu/alpha",
       ["kinematic_viscosity 1, thermal_diffusivity -1",
        "dynamic_viscosity 1, specific_heat 1, thermal_conductivity -1"],
       "momentum diffusivity / thermal diffusivity",
       "About 0.7 for air and 7 for water at 20 degC (White 2011 table A.1-A.2, from memory)."),
    _g("nusselt", "Nusselt number", "Nu", "h*L/k",
       ["heat_transfer_coefficient 1, length 1, thermal_conductivity -1"],
       "convective / conductive heat transfer across the fluid layer",
       "Nu = 1 for pure conduction; laminar flat plate Nu_x = 0.332 Re_x^(1/2) Pr^(1/3) "
       "(Incropera & DeWitt 2007, Fundamentals of Heat and Mass Transfer, ch. 7, from memory)."),
    _g("peclet", "Peclet number", "Pe", "V*L/alpha",
       ["velocity 1, length 1, thermal_diffusivity -1"],
       "advective / diffusive heat transport (Re*Pr)",
       "Conduction along the flow negligible for Pe >> 1 (Incropera & DeWitt 2007, from "
       "memory)."),
    _g("grashof", "Grashof number", "Gr", "g*beta*dT*L**3/nu**2",
       ["gravity 1, thermal_expansion 1, temperature_difference 1, length 3, "
        "kinematic_viscosity -2"],
       "buoyancy / viscous forces in natural convection",
       "Vertical-plate laminar-turbulent transition near Gr Pr ~ 1e9 (Incropera & DeWitt 2007, "
       "Fundamentals of Heat and Mass Transfer, from memory)."),
    _g("rayleigh", "Rayleigh number", "Ra", "g*beta*dT*L**3/(nu*alpha)",
       ["gravity 1, thermal_expansion 1, temperature_difference 1, length 3, "
        "kinematic_viscosity -1, thermal_diffusivity -1"],
       "buoyancy / (viscous x thermal diffusion) in natural convection (Gr*Pr)",
       "Rayleigh-Benard convection sets in at Ra = 1708 between rigid plates (Chandrasekhar "
       "1961, Hydrodynamic and Hydromagnetic Stability, ch. 2, from memory)."),
    _g("relative_roughness", "relative roughness", "eps/D", "eps/D",
       ["roughness 1, length -1"],
       "roughness height / reference length",
       "Hydraulically smooth while k_s u_tau / nu < ~5 (Schlichting & Gersten 2000)."),
)

_BY_KEY = MappingProxyType({g.key: g for g in CATALOGUE})


def keys() -> tuple[str, ...]:
    """Keys of the catalogue, in catalogue order."""
    return tuple(_BY_KEY)


def get(key: str) -> NamedGroup:
    """The catalogued group of this key (``"reynolds"``...).

    Raises
    ------
    InputError
        If the key is not catalogued; the message lists the valid keys.
    """
    try:
        return _BY_KEY[key]
    except (KeyError, TypeError):
        raise InputError(
            f"group: {key!r} is not a catalogued group; expected one of {', '.join(_BY_KEY)}"
        ) from None


@dataclass(frozen=True)
class GroupMatch:
    """A group identified in the catalogue: ``product = factor-free form ** power``.

    Attributes
    ----------
    group : NamedGroup
    form : int
        Index of the matching form in ``group.forms``.
    power : Fraction
        The product equals the form raised to this power (``g L / V^2`` is Fr**-2).
    generalised : bool
        True when the match needed roles replaced by their parents.
    """

    group: NamedGroup
    form: int
    power: Fraction
    generalised: bool


def _proportional(vec: dict[str, Fraction], form: Form) -> Fraction | None:
    fd = dict(form)
    if set(vec) != set(fd):
        return None
    role0 = next(iter(fd))
    k = vec[role0] / fd[role0]
    if all(vec[r] == k * fd[r] for r in fd):
        return k
    return None


def _clean(vec: Mapping[str, Fraction | int]) -> dict[str, Fraction]:
    return {r: Fraction(e) for r, e in vec.items() if e != 0}


def _generalise(form: Form) -> Form:
    """The form with each role replaced by its parent (like roles merged, zeros dropped)."""
    out: dict[str, Fraction] = {}
    for role, e in form:
        parent = role_parent(role)
        out[parent] = out.get(parent, Fraction(0)) + e
    return tuple((r, e) for r, e in out.items() if e != 0)


def lookup(role_exponents: Mapping[str, Fraction | int]) -> GroupMatch | None:
    """Identify a product of roles as a rational power of a catalogued group.

    Parameters
    ----------
    role_exponents : mapping
        role -> exponent, e.g. ``{"gravity": 1, "length": 1, "velocity": -2}``.

    Returns
    -------
    GroupMatch or None
        The best match: exact roles before parent roles, then power 1, then a positive power,
        then the smallest power, then catalogue order. None when nothing matches.

    Examples
    --------
    >>> lookup({"gravity": 1, "length": 1, "velocity": -2}).power
    Fraction(-2, 1)
    """
    exact = _clean(role_exponents)
    if not exact:
        return None
    general = _generalise(tuple(exact.items()))
    best = None
    for generalised, vec in ((False, exact), (True, dict(general))):
        if generalised and not vec:
            continue
        for order, group in enumerate(CATALOGUE):
            for i, form in enumerate(group.forms):
                target = _generalise(form) if generalised else form
                # A form naming two roles of one parent (a width and a depth) is not matched by
                # parent roles: the merged form would name a group on the wrong length.
                if generalised and (group.specific or len(target) < len(form)):
                    continue
                k = _proportional(vec, target)
                if k is None:
                    continue
                rank = (generalised, k != 1, k < 0, abs(k), order, i)
                if best is None or rank < best[0]:
                    best = (rank, GroupMatch(group, i, k, generalised))
        if best is not None:
            return best[1]
    return None


def catalogue():
    """The catalogue as a pandas DataFrame (key, name, symbol, definition, meaning, regimes)."""
    import pandas as pd

    return pd.DataFrame(
        [
            {"key": g.key, "name": g.name, "symbol": g.symbol, "definition": g.definition,
             "meaning": g.meaning, "regimes": g.regimes}
            for g in CATALOGUE
        ]
    )

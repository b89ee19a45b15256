"""Buckingham Pi analysis with the groups an engineer writes down, named.

Given n variables whose dimension matrix has rank r, the Pi theorem gives n - r independent
dimensionless groups [1]_ [2]_. :func:`pi_groups` forms them by the method of repeating
variables in exact rational arithmetic (:mod:`fractions`), then turns each into its
conventional form: it identifies the group in the catalogue of :mod:`similitude.dimensional.groups`
through the physical *roles* of its variables and raises it to the power that gives the published
definition (``g L / V^2`` becomes Fr = V/sqrt(g L), exponent 1/2 on g and L). Where an
unnamed group can be traded for a catalogued one without losing independence (the Grashof
number out of ``g L^3/nu^2`` and ``beta dT``; the Richardson number out of ``drho/rho`` and Fr)
the trade is made.

Variables
---------
``variables`` maps a symbol to

* a unit: a string (``"m/s"``, ``"m^2/s"``, ``"kg/m^3"``), a pint Unit, or a pint Quantity
  (whose magnitude is then taken as the variable's value); a string with a leading number and
  a space (``"2.5 m/s"``) is a value too;
* a :class:`Variable` ``(unit=..., role=..., value=...)``, or a dict with the same keys.

Roles (symbol conventions)
--------------------------
Dimensions alone cannot tell a viscosity from a diffusivity or a wave frequency from a rate of
revolution, so each variable has a role (see :data:`similitude.dimensional.groups.ROLES`). When
none is given
it is read from the symbol: the whole symbol first, then the part before the first underscore
(``V_A`` -> ``V``, ``rho_m`` -> ``rho``), then the symbol without trailing digits (``p0`` ->
``p``). Where a symbol has several readings, the first whose dimension fits is taken; a symbol
with no fitting reading has no role and its groups stay unnamed.

==================================  ================================================
symbol                              role (first reading whose dimension fits)
==================================  ================================================
V, U, v, u, W, Vs                   velocity
L, D, d, l, B, b, x, y, z, r, R     length (D, L also force: drag, lift; R resistance)
c                                   length (chord), else speed of sound
h, H (with a length dimension)      depth (h); wave height (H, H_s, Hs)
h, h_c, alpha_h (W/(m^2 K))         heat-transfer coefficient
A                                   area, else amplitude
a, c_s, cs, a0, c0                  speed of sound (a: else amplitude)
eps, epsilon, k_s, ks, e, k         roughness (k: else thermal conductivity)
t, tau                              time
T                                   thrust, else period, else temperature
f, omega                            frequency (omega: angular frequency of waves)
n, N_rps                            rotation rate (revolutions per unit time)
Omega                               angular velocity of a rotating frame (Rossby)
N                                   buoyancy frequency, else force
rho                                 density;  drho, delta_rho: density difference
nu                                  kinematic viscosity
mu, eta                             dynamic viscosity
alpha, kappa                        thermal diffusivity (alpha: else angle)
g                                   gravity
g', g_r, g_red, gprime              reduced gravity g*drho/rho (densimetric Froude)
sigma, gamma                        surface tension
p, p0, p_inf                        pressure
dp, delta_p, Dp                     pressure difference
p_v, pv, p_vap                      vapour pressure
p-p_v (any ``p... - p_v...``)       cavitation pressure p - p_v
E, Y                                elastic modulus (E: else energy)
K                                   bulk modulus
F, X, Fx, Fy, Fz, R_T, Rt, Fd       force
Q                                   torque, else flow rate
q                                   discharge per unit width (open channels)
M                                   torque (moment), else mass
m                                   mass
P                                   power, else pressure
beta                                thermal expansion coefficient
dT, delta_T                         temperature difference
cp, c_p                             specific heat
==================================  ================================================

Greek letters may be written as Unicode (``ρ``, ``ν``, ``μ``, ``σ``, ``Ω``, ``ω``, ``Δp``).

Default repeating variables
---------------------------
As an engineer chooses them: a density, then a rotation rate when there is one (propeller
coefficients K_T, K_Q, J are based on n and D [4]_) or else a velocity (a flow rate when there
is no velocity: pipe and open-channel flow), then the principal
length (D before L, so pipe flow gives Re on the diameter [2]_), then material and field
properties, and only as a last resort the dependent quantities (force, torque, power,
pressure). Each chosen variable must add to the rank of the set.

References
----------
.. [1] E. Buckingham, "On physically similar systems; illustrations of the use of dimensional
   equations", Physical Review 4(4), 1914, 345-376.
.. [2] F. M. White, *Fluid Mechanics*, 7th ed., McGraw-Hill, 2011, ch. 5 (the method of
   repeating variables).
.. [3] J. N. Newman, *Marine Hydrodynamics*, MIT Press, 1977, ch. 2 (model testing).
.. [4] J. S. Carlton, *Marine Propellers and Propulsion*, 2nd ed., Butterworth-Heinemann,
   2007, ch. 6.
"""

from __future__ import annotations

import math
import re
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from fractions import Fraction
from typing import Any

import pint

from similitude.dimensional import groups as _catalogue
from similitude.dimensional.rational_matrix import rank as _rank
from similitude.dimensional.rational_matrix import solve as _solve
from similitude.dimensional.rational_matrix import transpose as _transpose
from similitude.errors import InputError
from similitude.units import Q_

__all__ = [
    "DimensionalAnalysis",
    "Group",
    "Variable",
    "analyse",
    "infer_role",
    "pi_groups",
]

Exponent = int | Fraction

# --- symbol conventions -------------------------------------------------------------------

_SYMBOL_ROLES: dict[str, tuple[str, ...]] = {}


def _add(symbols: str, roles: str) -> None:
    for s in symbols.split():
        _SYMBOL_ROLES[s] = tuple(roles.split())


_add("V U v u W Vs V_A VA U_inf", "velocity")
_add("L D", "length force")
_add("d l B b x y z r", "length")
_add("R", "force length")
_add("c", "length speed_of_sound")
_add("h", "depth heat_transfer_coefficient")
_add("h_c hc alpha_h", "heat_transfer_coefficient")
_add("H H_s Hs", "wave_height")
_add("A", "area amplitude")
_add("a", "speed_of_sound amplitude")
_add("c_s cs a0 c0 a_0 c_0", "speed_of_sound")
_add("eps epsilon k_s ks e", "roughness")
_add("k", "roughness thermal_conductivity")
_add("t tau", "time")
_add("T", "thrust period temperature")
_add("f omega", "frequency")
_add("n N_rps rps", "rotation_rate")
_add("Omega", "angular_velocity")
_add("N", "buoyancy_frequency force")
_add("rho", "density")
_add("drho delta_rho Drho", "density_difference")
_add("nu", "kinematic_viscosity")
_add("mu eta", "dynamic_viscosity")
_add("alpha", "thermal_diffusivity angle")
_add("kappa", "thermal_diffusivity")
_add("g", "gravity")
_add("g' g_r gr g_red gprime g_prime g_reduced", "reduced_gravity")
_add("sigma gamma", "surface_tension")
_add("p p0 p_0 p_inf p_a", "pressure")
_add("dp delta_p Dp deltap", "pressure_difference")
_add("p_v pv p_vap pvap", "vapour_pressure")
_add("E", "elastic_modulus energy")
_add("Y", "elastic_modulus")
_add("K", "bulk_modulus")
_add("F X Fx Fy Fz R_T Rt RT Fd F_D", "force")
_add("Q", "torque flow_rate")
_add("M", "torque mass")
_add("m", "mass")
_add("q", "unit_discharge")
_add("P", "power pressure")
_add("beta", "thermal_expansion")
_add("dT delta_T DT", "temperature_difference")
_add("cp c_p", "specific_heat")

_GREEK = {
    "ρ": "rho", "ν": "nu", "μ": "mu", "σ": "sigma", "Ω": "Omega", "ω": "omega", "ε": "eps",
    "β": "beta", "α": "alpha", "κ": "kappa", "η": "eta", "τ": "tau", "γ": "gamma",
    "Δp": "dp", "ΔT": "dT", "Δρ": "drho",
}

_CAVITATION_SYMBOL = re.compile(r"^\(?\s*p\w*\s*-\s*p_?v\w*\s*\)?$")
_CAVITATION_NAMES = {"p_minus_pv", "p_minus_p_v", "dp_v", "dpv", "p_pv"}

_ROLE_ALIASES = {
    "cavitation": "cavitation_pressure", "speed": "velocity", "flow_speed": "velocity",
    "diameter": "length", "chord": "length", "span": "length", "draught": "length",
    "draft": "length", "water_depth": "depth", "gravitational_acceleration": "gravity",
    "revolutions": "rotation_rate", "rotational_speed": "rotation_rate",
    "vapor_pressure": "vapour_pressure", "pressure_drop": "pressure_difference",
    "drag": "force", "lift": "force", "resistance": "force", "moment": "torque",
    "wave_period": "period", "coriolis_parameter": "angular_velocity",
    "sound_speed": "speed_of_sound", "viscosity": "dynamic_viscosity",
    "heat_transfer": "heat_transfer_coefficient", "film_coefficient": "heat_transfer_coefficient",
    "buoyancy": "reduced_gravity", "wave_frequency": "frequency",
}


def _role_dimensionality(role: str):
    return Q_(1.0, _catalogue.ROLES[role][0]).dimensionality


def _symbol_readings(symbol: str) -> tuple[str, ...]:
    text = symbol.strip().replace("\u2032", "'")  # a typographic prime reads as g'
    for uni, ascii_name in _GREEK.items():
        text = text.replace(uni, ascii_name)
    if _CAVITATION_SYMBOL.match(text) or text.lower() in _CAVITATION_NAMES:
        return ("cavitation_pressure",)
    for candidate in (text, text.split("_")[0], text.rstrip("0123456789")):
        if candidate in _SYMBOL_ROLES:
            return _SYMBOL_ROLES[candidate]
    return ()


def infer_role(symbol: str, dimensionality=None) -> str | None:
    """The role implied by a symbol (module docstring table), or None.

    Parameters
    ----------
    symbol : str
        The variable's symbol, e.g. ``"nu"``, ``"V_A"``, ``"p-p_v"``.
    dimensionality : pint dimensionality, optional
        When given, the first reading whose dimension fits is returned.
    """
    for role in _symbol_readings(symbol):
        if dimensionality is None or _role_dimensionality(role) == dimensionality:
            return role
    return None


# --- variables ----------------------------------------------------------------------------


@dataclass(frozen=True)
class Variable:
    """A variable of a dimensional analysis.

    Attributes
    ----------
    unit : str, pint Unit or Quantity, optional
        Its unit (any unit of the right dimension). May be omitted when ``value`` carries one.
    role : str, optional
        Physical role (a key of :data:`similitude.dimensional.groups.ROLES`); read from the symbol
        when omitted.
    value : str, Quantity or number, optional
        Its value; a bare number is in ``unit``.
    """

    unit: Any = None
    role: str | None = None
    value: Any = None


@dataclass(frozen=True)
class _Var:
    symbol: str
    dims: dict[str, Fraction]
    dimensionality: Any
    role: str | None
    value: Any  # SI magnitude or None


_VALUE_TEXT = re.compile(r"^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s+\S")


def _quantity(spec: Any, field_name: str) -> pint.Quantity:
    try:
        if isinstance(spec, pint.Quantity):
            return Q_(spec.magnitude, str(spec.units))
        if isinstance(spec, pint.Unit):
            return Q_(1.0, str(spec))
        if isinstance(spec, str):
            text = spec.strip() or "dimensionless"
            if _VALUE_TEXT.match(text):
                num, unit = text.split(None, 1)
                return Q_(float(num), unit)
            return Q_(1.0, text)
        if isinstance(spec, (int, float)):
            return Q_(float(spec), "dimensionless")
    except (pint.errors.PintError, AttributeError, TypeError, ValueError, SyntaxError,
            AssertionError) as exc:
        raise InputError(
            f"{field_name}: cannot read {spec!r} as a unit ({exc.__class__.__name__}); "
            "expected a unit such as 'm/s', 'm^2/s' or 'kg/m^3'"
        ) from None
    raise InputError(
        f"{field_name}: {spec!r} (type {type(spec).__name__}) is not a unit; expected a string "
        "such as 'm/s', a pint Unit or Quantity, or a Variable"
    )


def _si_value(q: pint.Quantity) -> Any:
    mag = q.to_base_units().magnitude
    try:
        return float(mag)
    except TypeError:
        return mag


def _parse_variable(symbol: Any, spec: Any) -> _Var:
    if not isinstance(symbol, str) or not symbol.strip():
        raise InputError(f"variables: {symbol!r} is not a valid symbol; expected a non-empty str")
    where = f"variables.{symbol}"
    role = None
    value = None
    has_value = False
    if isinstance(spec, Mapping):
        unknown = set(spec) - {"unit", "role", "value"}
        if unknown:
            raise InputError(
                f"{where}: unknown keys {sorted(unknown)}; expected 'unit', 'role', 'value'"
            )
        spec = Variable(spec.get("unit"), spec.get("role"), spec.get("value"))
    if isinstance(spec, Variable):
        role = spec.role
        if spec.value is not None:
            if isinstance(spec.value, (str, pint.Quantity)):
                vq = _quantity(spec.value, f"{where}.value")
                if isinstance(spec.value, str) and not _VALUE_TEXT.match(spec.value) and \
                        spec.unit is not None:
                    raise InputError(f"{where}.value: {spec.value!r} has no number")
            else:
                if spec.unit is None:
                    raise InputError(f"{where}: value {spec.value!r} has no unit; give 'unit'")
                uq = _quantity(spec.unit, f"{where}.unit")
                vq = Q_(spec.value, uq.units)
            if spec.unit is not None:
                uq = _quantity(spec.unit, f"{where}.unit")
                if uq.dimensionality != vq.dimensionality:
                    raise InputError(
                        f"{where}: value {spec.value!r} has dimension {vq.dimensionality}, "
                        f"unit {spec.unit!r} has {uq.dimensionality}"
                    )
            q = vq
            has_value = True
        elif spec.unit is None:
            raise InputError(f"{where}: no unit; expected a unit such as 'm/s'")
        else:
            q = _quantity(spec.unit, f"{where}.unit")
            has_value = isinstance(spec.unit, pint.Quantity) or (
                isinstance(spec.unit, str) and bool(_VALUE_TEXT.match(spec.unit)))
    else:
        q = _quantity(spec, where)
        has_value = isinstance(spec, (pint.Quantity, int, float)) or (
            isinstance(spec, str) and bool(_VALUE_TEXT.match(spec)))
    if has_value:
        value = _si_value(q)
    dimensionality = q.dimensionality
    dims = {d: Fraction(e).limit_denominator(1000) for d, e in dimensionality.items() if e}
    if role is not None:
        role_key = str(role).strip().lower().replace(" ", "_").replace("-", "_")
        role_key = _ROLE_ALIASES.get(role_key, role_key)
        if role_key not in _catalogue.ROLES:
            raise InputError(
                f"{where}.role: {role!r} is not a known role; expected one of "
                f"{', '.join(_catalogue.ROLES)}"
            )
        expected = _role_dimensionality(role_key)
        if expected != dimensionality:
            raise InputError(
                f"{where}.role: role {role_key} needs dimension {expected or 'dimensionless'}, "
                f"but the unit gives {dimensionality or 'dimensionless'}"
            )
        role = role_key
    else:
        role = infer_role(symbol, dimensionality)
    return _Var(symbol, dims, dimensionality, role, value)


# --- groups -------------------------------------------------------------------------------


@dataclass(frozen=True)
class Group:
    """A dimensionless group: a product of powers of the variables.

    Attributes
    ----------
    exponents : dict
        symbol -> exponent (int, or Fraction when not whole), exact; zero exponents left out.
    name : str or None
        Trade name (``"Reynolds number"``) when catalogued, else None.
    symbol : str
        Usual symbol (``"Re"``), or ``"Pi<k>"`` for an unnamed group.
    key : str or None
        Catalogue key (``"reynolds"``) or None.
    expression : str
        The group as a formula in the variables' symbols, e.g. ``"V/sqrt(g*L)"``.
    value : float or None
        Its value when all its variables carry values, else None.
    factor : Fraction
        Numerical factor of the definition (2 for the cavitation number, written with
        ``0.5*rho*V**2``); 1 otherwise.
    """

    exponents: dict[str, Exponent]
    name: str | None
    symbol: str
    key: str | None
    expression: str
    value: float | None = None
    factor: Fraction = field(default=Fraction(1))

    def __hash__(self) -> int:
        return hash((tuple(self.exponents.items()), self.key, self.symbol))

    def __str__(self) -> str:
        text = f"{self.symbol} = {self.expression}"
        if self.name:
            text += f"  ({self.name})"
        if self.value is not None:
            text += f"  = {self.value:.6g}"
        return text


@dataclass(frozen=True)
class DimensionalAnalysis:
    """Result of :func:`analyse`: the dimension matrix, its rank, the repeating set, the groups.

    Attributes
    ----------
    variables : tuple of str
        Symbols in input order.
    dimensions : tuple of str
        Base dimensions (rows of the matrix), e.g. ``("[mass]", "[length]", "[time]")``.
    matrix : tuple of tuple of Fraction
        Dimension matrix, one row per base dimension, one column per variable.
    rank : int
    repeating : tuple of str
    roles : dict
        symbol -> role or None.
    groups : tuple of Group
        n - rank groups.
    """

    variables: tuple[str, ...]
    dimensions: tuple[str, ...]
    matrix: tuple[tuple[Fraction, ...], ...]
    rank: int
    repeating: tuple[str, ...]
    roles: dict[str, str | None]
    groups: tuple[Group, ...]


_BASE_ORDER = ("[mass]", "[length]", "[time]", "[temperature]", "[substance]", "[current]",
               "[luminosity]")

# Priority of roles for the default repeating set (lower first); unknown roles sit at 50.
_REPEAT_PRIORITY = {
    "density": 0, "rotation_rate": 10, "velocity": 11,
    "length": 20, "depth": 21, "area": 22, "wave_height": 23, "amplitude": 24,
    "dynamic_viscosity": 30, "kinematic_viscosity": 31, "gravity": 32, "reduced_gravity": 32,
    "surface_tension": 33,
    "speed_of_sound": 34, "elastic_modulus": 35, "bulk_modulus": 36, "frequency": 37,
    "period": 38, "angular_velocity": 39, "buoyancy_frequency": 40, "temperature_difference": 41,
    "temperature": 42, "thermal_conductivity": 43, "specific_heat": 44,
    "thermal_diffusivity": 45, "thermal_expansion": 46, "acceleration": 47, "time": 48,
    "density_difference": 49,
    "roughness": 60, "volume": 62, "mass": 70, "flow_rate": 71, "unit_discharge": 71,
    "pressure": 72,
    "pressure_difference": 73, "cavitation_pressure": 74, "vapour_pressure": 75, "energy": 76,
    "power": 77, "torque": 78, "thrust": 79, "force": 80, "heat_transfer_coefficient": 81,
}
_LENGTH_SYMBOL_ORDER = ("D", "d", "L", "l", "c")


def _repeat_key(var: _Var, index: int, has_rotation: bool, has_velocity: bool = True) -> tuple:
    prio = _REPEAT_PRIORITY.get(var.role, 50) if var.role else 50
    if var.role == "velocity" and has_rotation:
        prio = 25  # propeller practice: n and D repeat, V_A enters through J
    if var.role in ("flow_rate", "unit_discharge") and not has_velocity and not has_rotation:
        prio = 12  # pipe and channel flow: the flow rate stands for the velocity
    sub = 9
    if var.role == "length":
        base = var.symbol.split("_")[0]
        sub = _LENGTH_SYMBOL_ORDER.index(base) if base in _LENGTH_SYMBOL_ORDER else 9
    return (prio, sub, index)


def _columns(vars_: Sequence[_Var], dims: Sequence[str]) -> list[list[Fraction]]:
    return [[v.dims.get(d, Fraction(0)) for d in dims] for v in vars_]


def _dim_text(var: _Var) -> str:
    return str(var.dimensionality) if var.dims else "dimensionless"


def _check_repeating(repeating, vars_: list[_Var], dims, full_rank) -> list[int]:
    if isinstance(repeating, str):
        repeating = [s.strip() for s in repeating.split(",") if s.strip()]
    symbols = [v.symbol for v in vars_]
    chosen: list[int] = []
    for s in repeating:
        if s not in symbols:
            raise InputError(
                f"repeating: {s!r} is not one of the variables ({', '.join(symbols)})"
            )
        i = symbols.index(s)
        if i in chosen:
            raise InputError(f"repeating: {s!r} is listed twice")
        if not vars_[i].dims:
            raise InputError(
                f"repeating: {s!r} is dimensionless; a repeating variable must carry dimensions"
            )
        cols = _columns([vars_[j] for j in chosen], dims)
        if chosen and _rank(_transpose(cols + _columns([vars_[i]], dims))) == len(chosen):
            coeff = _solve(_transpose(cols), _columns([vars_[i]], dims)[0])
            combo = "*".join(
                _power_text(symbols[j], c) for j, c in zip(chosen, coeff, strict=True) if c
            )
            raise InputError(
                f"repeating: the set {', '.join(repeating)} is not independent: the dimension of "
                f"{s!r} ({_dim_text(vars_[i])}) equals that of {combo}; choose variables no "
                "product of which is dimensionless"
            )
        chosen.append(i)
    if len(chosen) < full_rank:
        carried = {d for j in chosen for d in vars_[j].dims}
        missing = [d for d in dims if d not in carried]
        rep_cols = _transpose(_columns([vars_[j] for j in chosen], dims)) if chosen else None
        lost = next(
            v for k, v in enumerate(vars_)
            if k not in chosen and v.dims and (
                rep_cols is None or _solve(rep_cols, [v.dims.get(d, Fraction(0)) for d in dims])
                is None)
        )
        hint = f"; none of them carries {', '.join(missing)}" if missing else ""
        raise InputError(
            f"repeating: the set {', '.join(repeating) or '(none)'} does not span the dimensions"
            f" of the variables (rank {full_rank}, {len(chosen)} given): {lost.symbol!r} "
            f"({_dim_text(lost)}) cannot be made dimensionless with them{hint}; give "
            f"{full_rank} independent variables"
        )
    return chosen


def _default_repeating(vars_: list[_Var], dims, full_rank) -> list[int]:
    has_rotation = any(v.role == "rotation_rate" for v in vars_)
    has_velocity = any(v.role == "velocity" for v in vars_)
    order = sorted(
        (i for i, v in enumerate(vars_) if v.dims),
        key=lambda i: _repeat_key(vars_[i], i, has_rotation, has_velocity),
    )
    chosen: list[int] = []
    for i in order:
        if len(chosen) == full_rank:
            break
        trial = chosen + [i]
        if _rank(_transpose(_columns([vars_[j] for j in trial], dims))) == len(trial):
            chosen = trial
    return chosen


def _power_text(symbol: str, e: Fraction) -> str:
    s = symbol if symbol.isidentifier() else f"({symbol})"
    if e == 1:
        return s
    if e.denominator == 1:
        return f"{s}**{e.numerator}"
    return f"{s}**({e.numerator}/{e.denominator})"


def _side(factors: list[tuple[str, Fraction]]) -> tuple[list[str], list[str]]:
    plain, roots = [], []
    for s, e in factors:
        if e == Fraction(1, 2):
            roots.append(s if s.isidentifier() else f"({s})")
        elif e.denominator == 2 and e > 1:
            plain.append(_power_text(s, Fraction(e.numerator // 2)))
            roots.append(s if s.isidentifier() else f"({s})")
        else:
            plain.append(_power_text(s, e))
    return plain, roots


def _expression(ordered: list[tuple[str, Fraction]], factor: Fraction) -> str:
    num_plain, num_root = _side([(s, e) for s, e in ordered if e > 0])
    den_plain, den_root = _side([(s, -e) for s, e in ordered if e < 0])
    if num_root and den_root:
        num_plain.append(f"sqrt({'*'.join(num_root)}/{'*'.join(den_root)})")
    elif num_root:
        num_plain.append(f"sqrt({'*'.join(num_root)})")
    elif den_root:
        den_plain.append(f"sqrt({'*'.join(den_root)})")
    if factor != 1:
        inv = 1 / factor
        if inv.denominator == 1 or inv in (Fraction(1, 2), Fraction(1, 4)):
            den_plain.insert(0, f"{float(inv):g}")
        else:
            num_plain.insert(0, f"{float(factor):g}")
    num = "*".join(num_plain) or "1"
    if not den_plain:
        return num
    den = den_plain[0] if len(den_plain) == 1 else f"({'*'.join(den_plain)})"
    return f"{num}/{den}"


def _value(exps: dict[str, Fraction], vars_by_symbol: dict[str, _Var], factor: Fraction):
    result = float(factor)
    for s, e in exps.items():
        v = vars_by_symbol[s].value
        if v is None:
            return None
        result = result * v ** float(e)
    try:
        return float(result)
    except TypeError:
        return result


def _exact(e: Fraction) -> Exponent:
    return e.numerator if e.denominator == 1 else e


def _role_vector(exps: dict[str, Fraction], vars_by_symbol) -> dict[str, Fraction]:
    out: dict[str, Fraction] = {}
    for s, e in exps.items():
        role = vars_by_symbol[s].role or f"?{s}"
        out[role] = out.get(role, Fraction(0)) + e
    return {r: e for r, e in out.items() if e != 0}


def _build_group(exps: dict[str, Fraction], vars_: list[_Var], index: int) -> Group:
    by_symbol = {v.symbol: v for v in vars_}
    exps = {s: Fraction(e) for s, e in exps.items() if e != 0}
    order = [v.symbol for v in vars_]
    match = _catalogue.lookup(_role_vector(exps, by_symbol))
    if match is not None and match.group.key == "cavitation" and match.generalised and any(
            v.role in ("pressure", "pressure_difference") for v in vars_):
        # With the static pressure p a separate variable, p_v/(rho V^2/2) is not the
        # cavitation number (p - p_v)/(rho V^2/2), which is no power product of the variables.
        match = None
    if match is not None:
        exps = {s: e / match.power for s, e in exps.items()}
        form = match.group.forms[match.form]
        role_rank = {r: k for k, (r, _) in enumerate(form)}
        if match.generalised:
            role_rank = {_catalogue.role_parent(r): k for k, (r, _) in enumerate(form)}

        def rank_of(s: str) -> tuple:
            role = by_symbol[s].role
            k = role_rank.get(role, role_rank.get(_catalogue.role_parent(role or ""), 99))
            return (k, order.index(s))

        ordered = sorted(exps.items(), key=lambda kv: rank_of(kv[0]))
        factor = match.group.factors[match.form]
        g = match.group
        return Group(
            {s: _exact(e) for s, e in ordered}, g.name, g.symbol, g.key,
            _expression(ordered, factor), _value(exps, by_symbol, factor), factor,
        )
    # Unnamed: whole exponents with the smallest common multiplier, first variable positive.
    lcm = 1
    for e in exps.values():
        lcm = lcm * e.denominator // math.gcd(lcm, e.denominator)
    exps = {s: e * lcm for s, e in exps.items()}
    ordered = sorted(exps.items(), key=lambda kv: order.index(kv[0]))
    return Group(
        {s: _exact(e) for s, e in ordered}, None, f"Pi{index + 1}", None,
        _expression(ordered, Fraction(1)), _value(exps, by_symbol, Fraction(1)),
    )


def _vector(g_exps: Mapping[str, Exponent], symbols: list[str]) -> list[Fraction]:
    return [Fraction(g_exps.get(s, 0)) for s in symbols]


def _recombine(groups: list[Group], vars_: list[_Var], repeating: list[int]) -> list[Group]:
    """Trade unnamed groups for catalogued ones that lie in the span of the set."""
    symbols = [v.symbol for v in vars_]
    by_role: dict[str, list[int]] = {}
    for i, v in enumerate(vars_):
        if v.role:
            by_role.setdefault(v.role, []).append(i)
    for role in by_role:  # repeating variables first, then input order
        by_role[role].sort(key=lambda i: (i not in repeating, i))
    for named in _catalogue.CATALOGUE:
        if not any(g.name is None for g in groups):
            break
        if any(g.key == named.key for g in groups):
            continue
        for form in named.forms:
            if not all(role in by_role for role, _ in form):
                continue
            cand = {symbols[by_role[role][0]]: e for role, e in form}
            target = _vector(cand, symbols)
            basis = [_vector(g.exponents, symbols) for g in groups]
            coeff = _solve(_transpose(basis), target) if basis else None
            if coeff is None:
                continue
            slot = next((k for k, g in enumerate(groups) if g.name is None and coeff[k] != 0),
                        None)
            if slot is None:
                continue
            groups[slot] = _build_group(cand, vars_, slot)
            break
    return groups


def analyse(variables: Mapping[str, Any], repeating: Sequence[str] | str | None = None
            ) -> DimensionalAnalysis:
    """Buckingham Pi analysis: dimension matrix, rank, repeating set and named groups.

    Parameters
    ----------
    variables : mapping
        symbol -> unit, Quantity, :class:`Variable` or dict (see the module docstring).
    repeating : sequence of str or comma-separated str, optional
        The repeating variables; as many as the rank, independent, and spanning the dimensions
        of the set. Chosen as an engineer would when omitted.

    Returns
    -------
    DimensionalAnalysis

    Raises
    ------
    InputError
        For an unreadable unit, an unknown or ill-fitting role, or an invalid repeating set
        (the message says why: not independent, or not spanning).

    Notes
    -----
    With dimension matrix D (rows: base dimensions, columns: variables) of rank r and repeating
    columns D_R, each other variable x_j gives the group x_j * prod R_i^a_i with D_R a = -d_j,
    solved exactly over the rationals [1]_ [2]_. The groups are then identified and normalised
    with :func:`similitude.dimensional.groups.lookup`.
    """
    if not isinstance(variables, Mapping) or not variables:
        raise InputError(
            f"variables: {variables!r} is not valid; expected a non-empty mapping symbol -> unit"
        )
    vars_ = [_parse_variable(s, spec) for s, spec in variables.items()]
    present = {d for v in vars_ for d in v.dims}
    dims = [d for d in _BASE_ORDER if d in present] + sorted(present - set(_BASE_ORDER))
    matrix = _transpose(_columns(vars_, dims)) if dims else []
    full_rank = _rank(matrix) if dims else 0
    if repeating is None:
        chosen = _default_repeating(vars_, dims, full_rank)
    else:
        chosen = _check_repeating(repeating, vars_, dims, full_rank)
    rep_cols = _transpose(_columns([vars_[j] for j in chosen], dims)) if chosen else []
    groups: list[Group] = []
    for j, v in enumerate(vars_):
        if j in chosen:
            continue
        exps = {v.symbol: Fraction(1)}
        if v.dims:
            a = _solve(rep_cols, [-v.dims.get(d, Fraction(0)) for d in dims])
            if a is None:  # cannot happen once the set spans; kept as a guard
                raise InputError(f"repeating: {v.symbol!r} cannot be made dimensionless")
            for jj, aj in zip(chosen, a, strict=True):
                if aj:
                    exps[vars_[jj].symbol] = aj
        groups.append(_build_group(exps, vars_, len(groups)))
    groups = _recombine(groups, vars_, chosen)
    # Unnamed groups are numbered in their final order.
    groups = [
        g if g.name else Group(g.exponents, None, f"Pi{k + 1}", None, g.expression, g.value)
        for k, g in enumerate(groups)
    ]
    return DimensionalAnalysis(
        variables=tuple(v.symbol for v in vars_),
        dimensions=tuple(dims),
        matrix=tuple(tuple(row) for row in matrix),
        rank=full_rank,
        repeating=tuple(vars_[j].symbol for j in chosen),
        roles={v.symbol: v.role for v in vars_},
        groups=tuple(groups),
    )


def pi_groups(variables: Mapping[str, Any], repeating: Sequence[str] | str | None = None
              ) -> list[Group]:
    """The n - rank dimensionless groups of a set of variables, named and in conventional form.

    Parameters
    ----------
    variables : mapping
        symbol -> unit (``"m/s"``, pint Unit or Quantity), :class:`Variable` or dict with keys
        ``unit``, ``role``, ``value``.
    repeating : sequence of str, optional
        Repeating variables (see :func:`analyse`).

    Returns
    -------
    list of Group

    Examples
    --------
    >>> [g.symbol for g in pi_groups({"V": "m/s", "L": "m", "nu": "m^2/s", "g": "m/s^2"})]
    ['Re', 'Fr']

    References
    ----------
    .. [1] E. Buckingham, Physical Review 4(4), 1914, 345-376.
    .. [2] F. M. White, *Fluid Mechanics*, 7th ed., McGraw-Hill, 2011, sec. 5.3.
    """
    return list(analyse(variables, repeating).groups)



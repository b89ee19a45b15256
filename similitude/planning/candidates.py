"""Candidate models and what they give: fluid states, both sides' groups, and the limits.

A candidate is one admissible model fluid at a temperature T [K] and static pressure p [Pa]
with a length scale lambda = L_p / L_m [-] and a velocity ratio V_m / V_p [-] (and, for a
propeller, the rotation rate n_m, which keeps the advance ratio J = V_A / (n D) of the
prototype). :func:`build_problem` turns a :class:`~similitude.planning.case.Case` into these
terms (the admissible fluids and the search axes of each, the prototype's groups, which exact
group fixes the speed and which are residuals); :func:`evaluate` gives the candidates at arrays
of (T, p, lambda[, V]) in one vectorised pass, and :func:`residuals`, :func:`mismatch` and
:func:`violations` say how far each is from the exact groups, how far the reported groups are
off, and which facility limits (:mod:`similitude.planning.limits`) it breaks. The search over
these candidates is :mod:`similitude.planning.solver`.

Each dimensionless group G of :data:`similitude.planning.case.MATCHABLE_GROUPS` varies as a
power of the model speed once the rest of the state is fixed (Fr, Re, Ma, Fh as V; We as V^2;
the cavitation number as V^-2; J not at all, because n follows V). The first exact group with a
speed exponent therefore fixes the velocity ratio in closed form,
``V_m = V_0 (G_p / G_m(V_0))^(1/e)``; Froude similitude gives V_m = V_p / sqrt(lambda) [1]_.
The group values are those of :mod:`similitude.dimensional.numbers` [2]_.

References
----------
.. [1] ITTC, "Recommended Procedures and Guidelines 7.5-02-02-01, Resistance Test", Rev 03,
       2011 (model tests at corresponding Froude number).
.. [2] ITTC, "ITTC Symbols and Terminology List", version 2017.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np

from fluids_props import FluidState, get_fluid
from fluids_props.validity import OutOfRangeError
from similitude.constants import G0, P_ATM
from similitude.dimensional import groups as group_catalogue
from similitude.dimensional.numbers import (
    advance_ratio,
    blade_reynolds,
    cavitation_number,
    froude,
    mach,
    reynolds,
    strouhal,
    weber,
)
from similitude.errors import InputError
from similitude.planning.case import Case, FluidSpec
from similitude.planning.limits import applies_to_search, hard_limits
from similitude.planning.solution import Solution

#: Exponent e of the model speed in each group at fixed scale and fluid state (G ~ V^e); a
#: propeller's rotation rate follows V (J kept), so J has exponent 0.
SPEED_EXPONENT = {
    "froude": 1.0,
    "reynolds": 1.0,
    "mach": 1.0,
    "weber": 2.0,
    "cavitation": -2.0,
    "depth_froude": 1.0,
    "advance_ratio": 0.0,
    "strouhal": 0.0,
}

#: Groups matched by construction through a free variable of the test (the rotation rate keeps
#: J; the excitation frequency keeps St), so they use none of the solver's degrees of freedom.
FREE_GROUPS = ("advance_ratio", "strouhal")

#: The continuous variables of a candidate, in grid order: temperature, pressure, scale, speed.
AXES = ("T", "p", "lam", "V")
#: The variables in words, for messages and the solution.
AXIS_WORDS = {"T": "temperature", "p": "pressure", "lam": "scale", "V": "model speed"}
#: The property fields of a FluidState (besides temperature and pressure).
_PROPERTY_FIELDS = ("density_si", "dynamic_viscosity_si", "vapour_pressure_si",
                    "surface_tension_si", "speed_of_sound_si")


# --------------------------------------------------------------------------------------------
# Fluid states
# --------------------------------------------------------------------------------------------
def fluid_info(name: str, field_name: str):
    """Catalogue entry of a fluid, or an InputError naming the field."""
    try:
        return get_fluid(name)
    except ValueError as exc:
        raise InputError(f"{field_name}: {exc}") from None


def _extra_kwargs(info, spec: FluidSpec | None) -> dict:
    if spec is None:
        return {}
    out = {}
    if spec.salinity is not None and info.range_of("salinity") is not None:
        out["salinity"] = spec.salinity
    if spec.relative_humidity and info.kind == "gas" and info.name == "air":
        out["relative_humidity"] = spec.relative_humidity
    if spec.mass_fraction is not None and info.range_of("mass_fraction") is not None:
        out["mass_fraction"] = spec.mass_fraction
    return out


def _check_composition(info, spec: FluidSpec | None, field_name: str) -> None:
    """A mixture needs its mass fraction; a pure fluid must not be given one."""
    takes = info.range_of("mass_fraction") is not None
    given = spec is not None and spec.mass_fraction is not None
    if takes and not given:
        raise InputError(
            f"{field_name}.mass_fraction: missing for {info.name}; expected the solute mass "
            "fraction [kg/kg] (e.g. 0.5 for a 50 % glycerol solution)"
        )
    if given and not takes:
        raise InputError(
            f"{field_name}.mass_fraction: {spec.mass_fraction!r} given, but {info.name} is not "
            "a mixture; expected no mass fraction"
        )


def prototype_state(case: Case) -> FluidState:
    """Scalar fluid state of the prototype (its FluidSpec) [SI]."""
    spec = case.prototype.fluid
    info = fluid_info(spec.name, "prototype.fluid.name")
    _check_composition(info, spec, "prototype.fluid")
    p = spec.pressure if spec.pressure is not None else P_ATM
    try:
        return info.evaluate_si(float(spec.temperature), float(p), **_extra_kwargs(info, spec))
    except OutOfRangeError as exc:
        raise OutOfRangeError(f"prototype.fluid: {exc}") from None


def _property_pressure(info, p):
    """Pressure at which to evaluate properties: fixed-pressure correlations take 1 atm."""
    if info.fixed_pressure or info.range_of("pressure") is None:
        return np.full(np.shape(p), P_ATM) if np.ndim(p) else P_ATM
    return p


def model_state(info, temperature, pressure, spec: FluidSpec | None = None,
                extrapolate: bool = False, strict: bool = False) -> FluidState:
    """Fluid state of the model fluid at arrays of temperature [K] and static pressure [Pa].

    A gas model may refuse part of a rectangular (T, p) grid (e.g. where the gas would be
    liquid); unless ``strict``, those points get NaN properties and drop out of the search."""
    kw = _extra_kwargs(info, spec)
    pe = _property_pressure(info, pressure)
    try:
        return info.evaluate_si(temperature, pe, extrapolate=extrapolate, **kw)
    except OutOfRangeError:
        if strict or np.ndim(temperature) == 0 and np.ndim(pe) == 0:
            raise
    T, P = np.broadcast_arrays(np.asarray(temperature, float), np.asarray(pe, float))
    T, P = T.ravel(), P.ravel()
    keys, inverse = np.unique(np.stack([T, P]), axis=1, return_inverse=True)
    inverse = np.ravel(inverse)
    fields = _PROPERTY_FIELDS
    vals = {f: np.full(keys.shape[1], np.nan) for f in fields}
    present = set()
    template = None
    for j in range(keys.shape[1]):
        try:
            st = info.evaluate_si(float(keys[0, j]), float(keys[1, j]),
                                  extrapolate=extrapolate, **kw)
        except OutOfRangeError:
            continue
        template = st
        for f in fields:
            v = getattr(st, f)
            if v is not None:
                present.add(f)
                vals[f][j] = float(v)
    if template is None:
        raise OutOfRangeError(f"{info.name}: no state of the search lies inside its validity "
                              "range")
    out = {f: (vals[f][inverse] if f in present else None) for f in fields}
    return FluidState(fluid=template.fluid, temperature_si=T, pressure_si=P,
                      extra=template.extra, sources=template.sources, **out)


# --------------------------------------------------------------------------------------------
# Groups on either side
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class SideState:
    """Everything the groups need on one side (prototype or model), SI, arrays broadcast.

    Attributes
    ----------
    length : reference length [m]; diameter : propeller diameter [m] or None;
    chord : blade chord at 0.7R [m] or None; speed : speed [m/s]; rotation : [1/s] or None;
    state : FluidState; reference_pressure : static pressure at the reference point [Pa];
    depth : water depth [m] or None; frequency : excitation frequency [1/s] or None.
    """

    length: object
    speed: object
    state: FluidState
    reference_pressure: object
    diameter: object = None
    chord: object = None
    rotation: object = None
    depth: object = None
    frequency: object = None


def group_value(key: str, s: SideState, propeller: bool):
    """Value of group ``key`` on one side; NaN where it does not apply.

    Definitions (ITTC Symbols and Terminology 2017 [2]_), through the named numbers of
    :mod:`similitude.dimensional.numbers`: Fr = V/sqrt(gL), Re = VL/nu (a propeller:
    Re_0.7R = c_0.7R sqrt(V_A^2 + (0.7 pi n D)^2)/nu, with c = D when no chord is given),
    Ma = V/a, We = rho V^2 L/sigma, sigma_v = (p - p_v)/(rho V^2/2) (a propeller:
    sigma_n = (p - p_v)/(rho n^2 D^2/2)), J = V_A/(nD), St = f L/V, Fh = V/sqrt(g h).
    """
    st = s.state
    v = np.asarray(s.speed, dtype=float)
    nan = np.full(np.broadcast(v, np.asarray(s.length)).shape, np.nan)
    if key == "froude":
        return froude(v, np.asarray(s.length))
    if key == "reynolds":
        if propeller and s.rotation is not None:
            c = s.chord if s.chord is not None else s.diameter
            return blade_reynolds(v, s.rotation, s.diameter, c, st.kinematic_viscosity_si)
        return reynolds(v, s.length, st.kinematic_viscosity_si)
    if key == "mach":
        if st.speed_of_sound_si is None:
            return nan
        return mach(v, st.speed_of_sound_si)
    if key == "weber":
        if st.surface_tension_si is None:
            return nan
        return weber(st.density_si, v, s.length, st.surface_tension_si)
    if key == "cavitation":
        if st.vapour_pressure_si is None:
            return nan
        ref = s.rotation * s.diameter if (propeller and s.rotation is not None) else v
        return cavitation_number(s.reference_pressure, st.vapour_pressure_si, st.density_si,
                                 ref)
    if key == "advance_ratio":
        if s.rotation is None:
            return nan
        return advance_ratio(v, s.rotation, s.diameter)
    if key == "strouhal":
        f = s.frequency if s.frequency is not None else s.rotation
        if f is None:
            return nan
        return strouhal(f, s.length, v)
    if key == "depth_froude":
        if s.depth is None:
            return nan
        return froude(v, np.asarray(s.depth))
    raise InputError(f"group: {key!r} is unknown")


#: Names and symbols of the two cavitation numbers of a propeller, with their definitions:
#: the one on rotation speed (the group a propeller plan matches) and the one on advance
#: speed (for cavitation charts drawn on it); sigma_v = sigma_n / J^2.
CAVITATION_ON_ROTATION = ("cavitation number on rotation speed, sigma_n = (p - p_v)/"
                          "(rho n^2 D^2 / 2)", "sigma_n")
CAVITATION_ON_ADVANCE = ("cavitation number on advance speed, sigma_v = (p - p_v)/"
                         "(rho V_A^2 / 2)", "sigma_v")
#: Name and symbol of a propeller's Reynolds number (blade section at 0.7 R).
BLADE_REYNOLDS_LABEL = ("Reynolds number of the blade section at 0.7 R, Re_0.7R = c_0.7R "
                        "sqrt(V_A^2 + (0.7 pi n D)^2)/nu", "Re_0.7R")


def group_label(key: str, propeller: bool) -> tuple[str, str]:
    """(name, symbol) of a group as a plan shows it: the catalogue's, except a propeller's
    cavitation number (on rotation speed, sigma_n) and Reynolds number (blade section at
    0.7 R), which are named with their definitions so they are not read as the others."""
    if propeller and key == "cavitation":
        return CAVITATION_ON_ROTATION
    if propeller and key == "reynolds":
        return BLADE_REYNOLDS_LABEL
    g = group_catalogue.get(key)
    return g.name, g.symbol


def _propeller_diameter(case: Case) -> float:
    p = case.prototype
    return float(p.dimension("diameter", p.length))


def prototype_side(case: Case, pstate: FluidState | None = None) -> SideState:
    """Prototype side at all its operating speeds (arrays over speeds)."""
    p = case.prototype
    st = prototype_state(case) if pstate is None else pstate
    speeds = np.asarray(p.speeds, dtype=float)
    if st.vapour_pressure_si is not None:  # liquid: ambient plus hydrostatic head
        ref = p.ambient_pressure + st.density_si * G0 * (p.immersion or 0.0)
    else:
        ref = float(st.pressure_si)
    rot = np.asarray(p.rotation_rates, dtype=float) if p.rotation_rates else None
    return SideState(
        length=p.length, speed=speeds, state=st, reference_pressure=ref,
        diameter=_propeller_diameter(case), chord=p.dimension("blade_chord"),
        rotation=rot, depth=p.water_depth,
    )


# --------------------------------------------------------------------------------------------
# The problem
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class Axis:
    """One continuous variable of the search.

    Attributes
    ----------
    name : str
        One of :data:`AXES`.
    low, high : float
        Bounds (SI: K, Pa, -, m/s); equal bounds fix the variable.
    log : bool
        Grid points spaced evenly in log (pressure, scale, speed) rather than linearly.
    """

    name: str
    low: float
    high: float
    log: bool

    @property
    def free(self) -> bool:
        """True when the bounds leave a range to search."""
        return self.high > self.low * (1 + 1e-12)

    def grid(self, n: int) -> np.ndarray:
        """``n`` points from low to high (one point when the variable is fixed)."""
        if not self.free:
            return np.array([self.low])
        if self.log:
            return np.geomspace(self.low, self.high, n)
        return np.linspace(self.low, self.high, n)


@dataclass(frozen=True)
class FluidOption:
    """An admissible model fluid with the axes of its search.

    Attributes
    ----------
    name : str
        Catalogue name of the fluid.
    info : fluids_props.registry.FluidInfo
        Its catalogue entry (validity ranges, property function).
    axes : dict of str to Axis
        The search axes by the names of :data:`AXES`.
    spec : FluidSpec or None
        The fixed model fluid of the request (``match.model_fluid``), if any.
    """

    name: str
    info: object
    axes: dict
    spec: FluidSpec | None = None


@dataclass(frozen=True)
class Problem:
    """A case turned into the solver's terms.

    Attributes
    ----------
    case : Case
    propeller : bool
        The prototype is a propeller (section Reynolds and cavitation numbers on n D).
    proto : SideState
        The prototype side at all its speeds.
    proto_groups : dict of str to ndarray
        Prototype value of each requested group (and Fr, Re) per speed [-].
    design, lowest : int
        Indices of the highest and lowest prototype speeds.
    exact : tuple of str
        The exact groups, in priority order.
    speed_group : str or None
        The exact group that fixes the model speed in closed form (None: the speed is a
        search variable).
    residual_groups : tuple of str
        Further exact groups, solved through the fluid state or the scale.
    report_groups : tuple of str
        Groups only reported (their log-mismatch is the ``least_mismatch`` objective).
    options : tuple of FluidOption
        The admissible model fluids.
    """

    case: Case
    propeller: bool
    proto: SideState
    proto_groups: dict
    design: int
    lowest: int
    exact: tuple
    speed_group: str | None
    residual_groups: tuple
    report_groups: tuple
    options: tuple


def _uses_pressure(case: Case) -> bool:
    keys = set(case.request.exact) | set(case.request.report)
    return "cavitation" in keys


def pressure_set_by_facility(prob: Problem) -> bool:
    """Whether the plan sets the facility's pressure: the facility has a pressure range and
    the model fluid is a gas, the request uses the pressure (a cavitation number), or the
    case fixes the model fluid's pressure (then checked against the range)."""
    case = prob.case
    if case.facility.pressure_range is None:
        return False
    spec = case.request.model_fluid
    if spec is not None and spec.pressure is not None:
        return True
    return _uses_pressure(case) or any(o.info.kind == "gas" for o in prob.options)


def pressure_labels(case: Case, gas: bool) -> tuple[str, str]:
    """(what the facility's pressure range sets, what the model's reference point feels), in
    words: the air pressure above the water of a depressurised tank and the static pressure
    at the shaft centre (a propeller) or the model below it; in a tunnel both are the static
    pressure at the shaft centre or model, or the test-section static pressure of a gas."""
    where = ("static pressure at the shaft centre" if case.prototype.kind == "propeller"
             else "static pressure at the model")
    if case.facility.free_surface:
        return "air pressure above the water", where
    if gas:
        return "test-section static pressure", "test-section static pressure"
    return where, where


def scale_bounds(case: Case) -> tuple[float, float]:
    req, fac, proto = case.request, case.facility, case.prototype
    if req.scale is not None:
        return req.scale, req.scale
    if req.model_length is not None:
        lam = proto.length / req.model_length
        return lam, lam
    lmax = fac.length if fac.free_surface else max(fac.width, fac.depth, fac.length)
    if fac.max_model_length is not None:
        lmax = min(lmax, fac.max_model_length)
    lmin = fac.min_model_length if fac.min_model_length is not None else lmax / 1000.0
    if lmin >= lmax:
        raise InputError(
            f"facility.min_model_length: {lmin:g} m is not below the largest model the "
            f"facility takes ({lmax:g} m); expected min_model_length < max_model_length"
        )
    return proto.length / lmax, proto.length / lmin


def _fluid_options(case: Case) -> tuple[FluidOption, ...]:
    """The admissible model fluids with their search axes; InputError when none is left."""
    fac, req = case.facility, case.request
    lam_lo, lam_hi = scale_bounds(case)
    lam_axis = Axis("lam", lam_lo, lam_hi, True)
    vmax = fac.speed_range[1]
    vmin = max(fac.speed_range[0], vmax / 100.0)
    v_axis = Axis("V", vmin, vmax, True)
    if req.model_fluid is not None:
        names: tuple[str, ...] = (req.model_fluid.name,)
    else:
        names = fac.fluids
    options = []
    reasons = []
    for name in names:
        info = fluid_info(name, "facility.fluids" if req.model_fluid is None
                          else "match.model_fluid.name")
        spec = req.model_fluid
        if spec is None and info.range_of("mass_fraction") is not None:
            # A mixture's composition is the case's to state, not the solver's to guess.
            reasons.append(f"{info.name}: needs match.model_fluid with its mass_fraction")
            continue
        if spec is not None:
            _check_fixed_fluid(case, info, spec)
        temperatures = _temperature_bounds(case, info, spec)
        if isinstance(temperatures, str):
            reasons.append(temperatures)
            continue
        pressures = _pressure_bounds(case, info, spec)
        if isinstance(pressures, str):
            reasons.append(pressures)
            continue
        axes = {
            "T": Axis("T", *temperatures, False),
            "p": Axis("p", *pressures, True),
            "lam": lam_axis,
            "V": v_axis,
        }
        options.append(FluidOption(info.name, info, axes, spec))
    if not options:
        raise InputError("facility.fluids: no admissible fluid; " + "; ".join(reasons))
    return tuple(options)


def _check_fixed_fluid(case: Case, info, spec: FluidSpec) -> None:
    """The fixed model fluid of the request: its composition, a fluid of the facility, at a
    temperature inside its validity range."""
    _check_composition(info, spec, "match.model_fluid")
    allowed = {fluid_info(n, "facility.fluids").name for n in case.facility.fluids}
    if info.name not in allowed:
        raise InputError(
            f"match.model_fluid.name: {spec.name!r} is not a fluid of the facility; "
            f"expected one of {', '.join(sorted(allowed))}"
        )
    t = float(spec.temperature)
    tr = info.range_of("temperature")
    if tr is not None and not (tr.low <= t <= tr.high):
        raise OutOfRangeError(
            f"match.model_fluid.temperature: {tr.value_text(t)} is outside the "
            f"validity range of {info.name}: {tr.text()}"
        )


def _temperature_bounds(case: Case, info, spec: FluidSpec | None) -> tuple[float, float] | str:
    """Temperature range [K] of the search: the fixed fluid's, or the facility's range inside
    the fluid's validity; a reason in words when nothing is left."""
    if spec is not None:
        return float(spec.temperature), float(spec.temperature)
    fac = case.facility
    t_lo, t_hi = fac.temperature_range
    tr = info.range_of("temperature")
    if tr is not None:
        t_lo, t_hi = max(t_lo, tr.low), min(t_hi, tr.high)
    if t_lo > t_hi:
        return (f"{info.name}: facility.temperature_range {fac.temperature_range[0]:g}-"
                f"{fac.temperature_range[1]:g} K lies outside its validity "
                f"{tr.text() if tr else ''}")
    return t_lo, t_hi


def _pressure_bounds(case: Case, info, spec: FluidSpec | None) -> tuple[float, float] | str:
    """Static pressure range [Pa] of the search: the fixed fluid's pressure, the facility's
    range where it sets the pressure (a gas, or a request that uses it), else 1 atm; a
    reason in words when nothing is left."""
    fac = case.facility
    if spec is not None and spec.pressure is not None:
        return float(spec.pressure), float(spec.pressure)
    if fac.pressure_range is not None and (info.kind == "gas" or _uses_pressure(case)):
        p_lo, p_hi = fac.pressure_range
        pr = info.range_of("pressure")
        if pr is not None and info.kind == "gas":
            p_lo, p_hi = max(p_lo, pr.low), min(p_hi, pr.high)
        p_lo = max(p_lo, 1.0)
        if p_lo > p_hi:
            return f"{info.name}: facility.pressure_range outside its validity"
        return p_lo, p_hi
    return P_ATM, P_ATM


class TooManyResiduals(InputError):
    """More exact groups to solve through the fluid state than the solver handles (one)."""


def build_problem(case: Case, prototype_fluid: FluidState | None = None) -> Problem:
    """Check the request against the degrees of freedom and set up the search.

    ``prototype_fluid``: the prototype's fluid state (:func:`prototype_state`) when the caller
    has it already (one prototype in many candidate facilities of a campaign)."""
    req, proto = case.request, case.prototype
    _check_request(case)
    propeller = proto.kind == "propeller"
    options = _fluid_options(case)
    pside = prototype_side(case, prototype_fluid)
    pgroups = {}
    for key in set(req.exact) | set(req.report) | {"froude", "reynolds"}:
        pgroups[key] = np.asarray(group_value(key, pside, propeller), dtype=float)
    for g in req.exact:
        if not np.all(np.isfinite(pgroups[g])):
            raise InputError(
                f"match.exact: {g!r} has no value for the prototype in "
                f"{proto.fluid.name} (e.g. a Mach number in a liquid, a cavitation number in "
                "a gas); expected groups that apply to the prototype"
            )
    speeds = np.asarray(proto.speeds)
    design, lowest = int(np.argmax(speeds)), int(np.argmin(speeds))
    speed_group = next((g for g in req.exact if SPEED_EXPONENT[g] != 0.0), None)
    if speed_group == "cavitation" and propeller:
        speed_group = next((g for g in req.exact if SPEED_EXPONENT[g] != 0.0
                            and g != "cavitation"), "cavitation")
    residual = tuple(g for g in req.exact if g != speed_group and g not in FREE_GROUPS)
    _check_degrees_of_freedom(req.exact, options, speed_group, residual)
    report = tuple(g for g in dict.fromkeys(req.report) if g not in req.exact)
    return Problem(case, propeller, pside, pgroups, design, lowest, tuple(req.exact),
                   speed_group, residual, report, options)


def _check_request(case: Case) -> None:
    """The exact groups the request asks for have what they need in the case."""
    req, proto = case.request, case.prototype
    if not req.exact and req.scale is None and req.model_length is None:
        raise InputError("match.exact: empty; expected at least one group to match exactly "
                         "(e.g. 'froude' for a free-surface test), or a fixed scale or "
                         "model_length for a report-only plan")
    if proto.kind == "propeller" and not proto.rotation_rates:
        raise InputError("prototype.rotation_rates: empty for a propeller; expected one "
                         "rotation rate [1/s] per speed")
    if proto.rotation_rates and len(proto.rotation_rates) != len(proto.speeds):
        raise InputError(
            f"prototype.rotation_rates: {len(proto.rotation_rates)} values for "
            f"{len(proto.speeds)} speeds; expected one per speed"
        )
    for g in req.exact:
        if g == "depth_froude" and proto.water_depth is None:
            raise InputError("match.exact: 'depth_froude' needs prototype.water_depth; "
                             "expected a water depth [m]")
        if g == "advance_ratio" and not proto.rotation_rates:
            raise InputError("match.exact: 'advance_ratio' needs prototype.rotation_rates")
        if g == "depth_froude" and not case.facility.free_surface:
            raise InputError("match.exact: 'depth_froude' needs a free-surface facility "
                             f"(towing tank or wave basin), not {case.facility.kind!r}")


def _check_degrees_of_freedom(exact: tuple[str, ...], options: tuple[FluidOption, ...],
                              speed_group: str | None, residual: tuple[str, ...]) -> None:
    """No more exact groups than degrees of freedom: the speed (always) plus each axis with a
    range in some fluid; and at most one residual group (what the search solves)."""
    free_axes = set()
    for o in options:
        free_axes |= {k for k, a in o.axes.items() if a.free and k != "V"}
    dof = 1 + len(free_axes)
    needed = len(residual) + (1 if speed_group else 0)
    if needed > dof:
        words = ", ".join(AXIS_WORDS[a] for a in sorted(free_axes)) or "none"
        raise InputError(
            f"match.exact: {list(exact)!r} asks {needed} groups to be exact but the case "
            f"leaves {dof} degree(s) of freedom (model speed; free: {words}); expected at most "
            f"{dof} exact groups besides {', '.join(FREE_GROUPS)}, or free the scale, "
            "temperature or pressure"
        )
    if len(residual) > 1:
        raise TooManyResiduals(
            f"match.exact: {list(exact)!r} needs {len(residual)} groups solved together "
            "through the fluid state; this planner solves at most one beyond the group that "
            "fixes the speed; expected fewer exact groups (report the others)"
        )


# --------------------------------------------------------------------------------------------
# Candidates: vectorised evaluation
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class Candidates:
    """Model states (arrays of one shape) for one fluid, with their velocity ratio.

    Attributes
    ----------
    fluid : str
    temperature, pressure, scale, velocity_ratio : ndarray
        T [K], static pressure at the model [Pa], lambda [-], V_m/V_p [-].
    state : FluidState
        Model fluid properties (arrays).
    reference_pressure : ndarray
        Static pressure at the model reference point [Pa] (adds the scaled hydrostatic head
        in a free-surface facility).
    """

    fluid: str
    temperature: np.ndarray
    pressure: np.ndarray
    scale: np.ndarray
    velocity_ratio: np.ndarray
    state: FluidState
    reference_pressure: np.ndarray

    @property
    def size(self) -> int:
        return int(np.size(self.scale))


def _broadcast_state(st: FluidState, shape) -> FluidState:
    def b(a):
        return None if a is None else np.broadcast_to(np.asarray(a, dtype=float), shape).ravel()
    return map_state(st, b, temperature_si=b(st.temperature_si))


def map_state(st: FluidState, f, temperature_si) -> FluidState:
    """``st`` with ``f`` applied to its pressure and property arrays (None stays None)."""
    return replace(st, temperature_si=temperature_si, pressure_si=f(st.pressure_si),
                   **{k: f(getattr(st, k)) for k in _PROPERTY_FIELDS})


def model_side(prob: Problem, c: Candidates, speed_index) -> SideState:
    """Model side of candidates at prototype speed index ``speed_index``."""
    case = prob.case
    proto = prob.proto
    vr = c.velocity_ratio
    vp = np.asarray(proto.speed)[speed_index]
    rot = None
    if proto.rotation is not None:
        rot = np.asarray(proto.rotation)[speed_index] * vr * c.scale
    depth = case.facility.depth if case.facility.free_surface else None
    chord = None if proto.chord is None else proto.chord / c.scale
    return SideState(
        length=case.prototype.length / c.scale, speed=vp * vr, state=c.state,
        reference_pressure=c.reference_pressure, diameter=proto.diameter / c.scale,
        chord=chord, rotation=rot, depth=depth,
    )


def model_groups(prob: Problem, c: Candidates, speed_index, keys) -> dict:
    """Model values of ``keys`` at one prototype speed index."""
    side = model_side(prob, c, speed_index)
    return {k: np.asarray(group_value(k, side, prob.propeller), dtype=float) for k in keys}


def evaluate(prob: Problem, opt: FluidOption, T, p, lam, V=None,
             extrapolate: bool = False, state: FluidState | None = None) -> Candidates:
    """Candidates at arrays T [K], p [Pa], lam [-] (broadcast), with V_m at the design speed
    [m/s] when no exact group fixes the speed. ``state``: the fluid state at (T, p) already
    evaluated, of the broadcast shape (the grid search evaluates properties once per
    (T, p) pair and repeats them over the scale and speed axes)."""
    case = prob.case
    arrays = [np.asarray(T, float), np.asarray(p, float), np.asarray(lam, float)]
    if V is not None:
        arrays.append(np.asarray(V, float))
    arrays = [a.ravel() if a.ndim else a for a in np.broadcast_arrays(*arrays)]
    T, p, lam = arrays[:3]
    shape = T.shape
    if state is None:
        state = model_state(opt.info, T, p, opt.spec, extrapolate=extrapolate)
    st = _broadcast_state(state, shape)
    if case.facility.free_surface:
        surface = p if case.facility.pressure_range is not None else np.full(shape, P_ATM)
        head = st.density_si * G0 * ((case.prototype.immersion or 0.0) / lam)
        ref = surface + (head if st.vapour_pressure_si is not None else 0.0)
    else:
        ref = p
    vp_design = float(np.asarray(prob.proto.speed)[prob.design])
    c = Candidates(opt.name, T, p, lam, np.ones(shape), st, ref)
    if prob.speed_group is None:
        vr = arrays[3] / vp_design
    else:
        g = prob.speed_group
        e = SPEED_EXPONENT[g]
        gm0 = model_groups(prob, c, prob.design, (g,))[g]
        gp = prob.proto_groups[g][prob.design]
        with np.errstate(divide="ignore", invalid="ignore"):
            vr = (gp / gm0) ** (1.0 / e)
    return Candidates(opt.name, T, p, lam, vr, st, ref)


def residuals(prob: Problem, c: Candidates) -> np.ndarray:
    """ln(G_m/G_p) of the residual exact groups at the design speed, shape (k, n)."""
    if not prob.residual_groups:
        return np.zeros((0, c.size))
    gm = model_groups(prob, c, prob.design, prob.residual_groups)
    rows = []
    with np.errstate(divide="ignore", invalid="ignore"):
        for g in prob.residual_groups:
            rows.append(np.log(gm[g] / prob.proto_groups[g][prob.design]))
    return np.array(rows)


def mismatch(prob: Problem, c: Candidates) -> np.ndarray:
    """Sum of squared log-mismatch of the reported (not exact) groups at the design speed."""
    keys = prob.report_groups
    total = np.zeros(c.size)
    if not keys:
        return total
    gm = model_groups(prob, c, prob.design, keys)
    with np.errstate(divide="ignore", invalid="ignore"):
        for g in keys:
            r = np.log(gm[g] / prob.proto_groups[g][prob.design])
            total += np.where(np.isfinite(r), r * r, 0.0)
    return total


def violations(prob: Problem, c: Candidates):
    """(names, matrix of relative violations (m, n), limits) of the facility limits that bound
    the search (:func:`similitude.planning.limits.applies_to_search`)."""
    lims = [lim for lim in hard_limits(prob, c) if applies_to_search(lim, prob.case)]
    if not lims:
        return (), np.zeros((0, c.size)), ()
    mat = np.array([np.broadcast_to(lim.violation(), (c.size,)) for lim in lims])
    return tuple(lim.name for lim in lims), mat, tuple(lims)


def candidate_at(prob: Problem, solution: Solution) -> Candidates:
    """The solution as a single :class:`Candidates` (for checks and conflicts)."""
    name = solution.fluid_name or solution.model_fluid.fluid
    opt = next((o for o in prob.options if o.name == name), prob.options[0])
    T = float(solution.model_fluid.temperature_si)
    p = float(solution.static_pressure if solution.static_pressure is not None
              else solution.model_fluid.pressure_si)
    V = None
    if prob.speed_group is None:
        V = solution.velocity_ratio * float(np.asarray(prob.proto.speed)[prob.design])
    return evaluate(prob, opt, np.array([T]), np.array([p]), np.array([solution.scale]),
                    None if V is None else np.array([V]))


__all__ = [
    "AXES",
    "BLADE_REYNOLDS_LABEL",
    "CAVITATION_ON_ADVANCE",
    "CAVITATION_ON_ROTATION",
    "AXIS_WORDS",
    "FREE_GROUPS",
    "SPEED_EXPONENT",
    "Axis",
    "Candidates",
    "FluidOption",
    "Problem",
    "SideState",
    "TooManyResiduals",
    "build_problem",
    "candidate_at",
    "evaluate",
    "fluid_info",
    "group_label",
    "group_value",
    "map_state",
    "mismatch",
    "model_groups",
    "model_side",
    "model_state",
    "prototype_side",
    "pressure_labels",
    "pressure_set_by_facility",
    "prototype_state",
    "residuals",
    "scale_bounds",
    "violations",
]

"""The similitude solver: model scale, speed and fluid state for a case, inside the facility.

The solver works in four continuous variables and one discrete one:

* the fluid (one of the facility's admissible fluids, ``fluids_props`` catalogue),
* its temperature T [K] and the static pressure p [Pa] at the model (where the facility sets
  them: pressurised or cryogenic tunnels, cavitation tunnels),
* the length scale lambda = L_p / L_m [-],
* the velocity ratio V_m / V_p [-] (and, for a propeller, the rotation rate n_m, which keeps the
  advance ratio J = V_A / (n D) of the prototype).

Each dimensionless group G of :data:`similitude.planning.case.MATCHABLE_GROUPS` varies as a power
of the
model speed once the rest of the state is fixed (Fr, Re, Ma, Fh as V; We as V^2; the cavitation
number as V^-2; J not at all, because n follows V). The first exact group with a speed exponent
therefore fixes the velocity ratio in closed form,
``V_m = V_0 (G_p / G_m(V_0))^(1/e)``; Froude similarity gives V_m = V_p / sqrt(lambda) [1]_.
Every further exact group is a residual ``r = ln(G_m / G_p)`` that must vanish; it is solved for
one continuous variable (pressure first, then temperature, then scale, then speed) by a
vectorised bracket search over a grid and bisection to machine precision, so exact groups hold to
better than 1e-9 relative. Among the exact solutions the facility limits of
:mod:`similitude.planning.checks` select the admissible ones, and the objective picks one: the
largest model (default; least Reynolds mismatch in free-surface tests), the smallest, or the least
log-mismatch of the groups only reported. Fine line searches along each free variable repair
the grid's resolution; the admissible boundary in scale and interior optima of the mismatch are
then found by batched bracket narrowing (one array evaluation of 32 points a round).

Practitioners build models to round scales, so for the largest- and smallest-model
objectives the limiting scale is then replaced by the nearest convenient one that still
satisfies every limit (:func:`convenient_scale`, rounded towards a smaller model for
``largest_model``; common practice) and the case is re-solved at that fixed scale, so the exact
groups stay exact to 1e-9; the limiting scale is kept in ``Solution.extra``
(``MatchRequest.round_scale`` switches this off).

When the exact groups cannot all be met inside the facility and the request allows it
(``MatchRequest.relax``, default), the lowest-priority exact group is dropped, the others stay
exact and its log-mismatch is minimised; the Solution records why (``extra["relaxed"]``).
Otherwise :class:`~similitude.errors.InfeasibleError` names the binding limit and its excess.

Matching Froude and Reynolds numbers together needs nu_m / nu_p = lambda^-1.5 [2]_; the solver
finds that no facility liquid gives it and reports the binding limit.

Function to time for the benchmark: :func:`search_grid` (one vectorised evaluation of groups,
residuals, facility limits and objective over ``n_candidates`` grid points).

References
----------
.. [1] ITTC, "Recommended Procedures and Guidelines 7.5-02-02-01, Resistance Test", Rev 03,
       2011 (model tests at corresponding Froude number).
.. [2] ITTC, "Recommended Procedures and Guidelines 7.5-02-03-01.4, 1978 ITTC Performance
       Prediction Method", Rev 05, 2021 (viscous part extrapolated with the ITTC-1957 line
       because Re cannot be matched together with Fr).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

import numpy as np

from fluids_props import FluidState, get_fluid
from fluids_props.validity import OutOfRangeError
from similitude.constants import G0, P_ATM
from similitude.errors import InfeasibleError, InputError
from similitude.planning.case import Case, FluidSpec
from similitude.planning.solution import Solution
from similitude.units import format_scale

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

#: Default number of grid candidates of :func:`solve`.
DEFAULT_CANDIDATES = 20000

#: Standard atmospheric pressure [Pa] (ISO 2533).

_AXES = ("T", "p", "lam", "V")
_SOLVE_PREFERENCE = ("p", "T", "lam", "V")
_AXIS_WORDS = {"T": "temperature", "p": "pressure", "lam": "scale", "V": "model speed"}
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

    Definitions (ITTC Symbols and Terminology 2017): Fr = V/sqrt(gL), Re = VL/nu (a propeller:
    Re_0.7R = c_0.7R sqrt(V_A^2 + (0.7 pi n D)^2)/nu, with c = D when no chord is given),
    Ma = V/a, We = rho V^2 L/sigma, sigma_v = (p - p_v)/(rho V^2/2) (a propeller:
    sigma_n = (p - p_v)/(rho n^2 D^2/2)), J = V_A/(nD), St = f L/V, Fh = V/sqrt(g h).
    """
    st = s.state
    v = np.asarray(s.speed, dtype=float)
    nan = np.full(np.broadcast(v, np.asarray(s.length)).shape, np.nan)
    if key == "froude":
        return v / np.sqrt(G0 * np.asarray(s.length))
    if key == "reynolds":
        if propeller and s.rotation is not None:
            d = s.diameter
            c = s.chord if s.chord is not None else d
            return c * np.sqrt(v**2 + (0.7 * math.pi * s.rotation * d) ** 2) \
                / st.kinematic_viscosity_si
        return v * s.length / st.kinematic_viscosity_si
    if key == "mach":
        if st.speed_of_sound_si is None:
            return nan
        return v / st.speed_of_sound_si
    if key == "weber":
        if st.surface_tension_si is None:
            return nan
        return st.density_si * v**2 * s.length / st.surface_tension_si
    if key == "cavitation":
        if st.vapour_pressure_si is None:
            return nan
        ref = s.rotation * s.diameter if (propeller and s.rotation is not None) else v
        return (s.reference_pressure - st.vapour_pressure_si) / (0.5 * st.density_si * ref**2)
    if key == "advance_ratio":
        if s.rotation is None:
            return nan
        return v / (s.rotation * s.diameter)
    if key == "strouhal":
        f = s.frequency if s.frequency is not None else s.rotation
        if f is None:
            return nan
        return f * s.length / v
    if key == "depth_froude":
        if s.depth is None:
            return nan
        return v / np.sqrt(G0 * np.asarray(s.depth))
    raise InputError(f"group: {key!r} is unknown")


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
    """One continuous variable of the search: name, bounds (SI) and whether log-spaced."""

    name: str
    low: float
    high: float
    log: bool

    @property
    def free(self) -> bool:
        return self.high > self.low * (1 + 1e-12)

    def grid(self, n: int) -> np.ndarray:
        if not self.free:
            return np.array([self.low])
        if self.log:
            return np.geomspace(self.low, self.high, n)
        return np.linspace(self.low, self.high, n)


@dataclass(frozen=True)
class FluidOption:
    """An admissible model fluid with the axes of its search."""

    name: str
    info: object
    axes: dict
    spec: FluidSpec | None = None


@dataclass(frozen=True)
class Problem:
    """A case turned into the solver's terms."""

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
    notes: tuple = ()


def _uses_pressure(case: Case) -> bool:
    keys = set(case.request.exact) | set(case.request.report)
    return "cavitation" in keys


def _scale_bounds(case: Case) -> tuple[float, float]:
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
    fac, req = case.facility, case.request
    lam_lo, lam_hi = _scale_bounds(case)
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
            _check_composition(info, spec, "match.model_fluid")
            allowed = {fluid_info(n, "facility.fluids").name for n in fac.fluids}
            if info.name not in allowed:
                raise InputError(
                    f"match.model_fluid.name: {spec.name!r} is not a fluid of the facility; "
                    f"expected one of {', '.join(sorted(allowed))}"
                )
            t_lo = t_hi = float(spec.temperature)
            tr = info.range_of("temperature")
            if tr is not None and not (tr.low <= t_lo <= tr.high):
                raise OutOfRangeError(
                    f"match.model_fluid.temperature: {tr.value_text(t_lo)} is outside the "
                    f"validity range of {info.name}: {tr.text()}"
                )
        else:
            t_lo, t_hi = fac.temperature_range
            tr = info.range_of("temperature")
            if tr is not None:
                t_lo, t_hi = max(t_lo, tr.low), min(t_hi, tr.high)
            if t_lo > t_hi:
                reasons.append(
                    f"{info.name}: facility.temperature_range {fac.temperature_range[0]:g}-"
                    f"{fac.temperature_range[1]:g} K lies outside its validity "
                    f"{tr.text() if tr else ''}"
                )
                continue
        if spec is not None and spec.pressure is not None:
            p_lo = p_hi = float(spec.pressure)
        elif fac.pressure_range is not None and (info.kind == "gas" or _uses_pressure(case)):
            p_lo, p_hi = fac.pressure_range
            pr = info.range_of("pressure")
            if pr is not None and info.kind == "gas":
                p_lo, p_hi = max(p_lo, pr.low), min(p_hi, pr.high)
            p_lo = max(p_lo, 1.0)
            if p_lo > p_hi:
                reasons.append(f"{info.name}: facility.pressure_range outside its validity")
                continue
        else:
            p_lo = p_hi = P_ATM
        axes = {
            "T": Axis("T", t_lo, t_hi, False),
            "p": Axis("p", p_lo, p_hi, True),
            "lam": lam_axis,
            "V": v_axis,
        }
        options.append(FluidOption(info.name, info, axes, spec))
    if not options:
        raise InputError("facility.fluids: no admissible fluid; " + "; ".join(reasons))
    return tuple(options)


class _TooManyResiduals(InputError):
    """More exact groups to solve through the fluid state than the solver handles (one)."""


def build_problem(case: Case) -> Problem:
    """Check the request against the degrees of freedom and set up the search."""
    req, proto = case.request, case.prototype
    if not req.exact:
        raise InputError("match.exact: empty; expected at least one group to match exactly "
                         "(e.g. 'froude' for a free-surface test)")
    propeller = proto.kind == "propeller"
    if propeller and not proto.rotation_rates:
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
    options = _fluid_options(case)
    pside = prototype_side(case)
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
    # Degrees of freedom: the speed (always) plus each axis with a range in some fluid.
    free_axes = set()
    for o in options:
        free_axes |= {k for k, a in o.axes.items() if a.free and k != "V"}
    dof = 1 + len(free_axes)
    needed = len(residual) + (1 if speed_group else 0)
    if needed > dof:
        words = ", ".join(_AXIS_WORDS[a] for a in sorted(free_axes)) or "none"
        raise InputError(
            f"match.exact: {list(req.exact)!r} asks {needed} groups to be exact but the case "
            f"leaves {dof} degree(s) of freedom (model speed; free: {words}); expected at most "
            f"{dof} exact groups besides {', '.join(FREE_GROUPS)}, or free the scale, "
            "temperature or pressure"
        )
    if len(residual) > 1:
        raise _TooManyResiduals(
            f"match.exact: {list(req.exact)!r} needs {len(residual)} groups solved together "
            "through the fluid state; this planner solves at most one beyond the group that "
            "fixes the speed; expected fewer exact groups (report the others)"
        )
    report = tuple(g for g in dict.fromkeys(req.report) if g not in req.exact)
    return Problem(case, propeller, pside, pgroups, design, lowest, tuple(req.exact),
                   speed_group, residual, report, options)


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
    extra: dict = field(default_factory=dict)

    @property
    def size(self) -> int:
        return int(np.size(self.scale))


def _broadcast_state(st: FluidState, shape) -> FluidState:
    def b(a):
        return None if a is None else np.broadcast_to(np.asarray(a, dtype=float), shape).ravel()
    return _map_state(st, b, temperature_si=b(st.temperature_si))


def _map_state(st: FluidState, f, temperature_si) -> FluidState:
    """``st`` with ``f`` applied to its pressure and property arrays (None stays None)."""
    return replace(st, temperature_si=temperature_si, pressure_si=f(st.pressure_si),
                   **{k: f(getattr(st, k)) for k in _PROPERTY_FIELDS})


def model_side(prob: Problem, c: Candidates, speed_index, vratio=None) -> SideState:
    """Model side of candidates at prototype speed index ``speed_index``."""
    case = prob.case
    proto = prob.proto
    vr = c.velocity_ratio if vratio is None else vratio
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
    extra = {"prototype_length": case.prototype.length}
    vp_design = float(np.asarray(prob.proto.speed)[prob.design])
    c = Candidates(opt.name, T, p, lam, np.ones(shape), st, ref, extra)
    if prob.speed_group is None:
        vr = arrays[3] / vp_design
    else:
        g = prob.speed_group
        e = SPEED_EXPONENT[g]
        gm0 = model_groups(prob, c, prob.design, (g,))[g]
        gp = prob.proto_groups[g][prob.design]
        with np.errstate(divide="ignore", invalid="ignore"):
            vr = (gp / gm0) ** (1.0 / e)
    return Candidates(opt.name, T, p, lam, vr, st, ref, extra)


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
    """(names, matrix of relative violations (m, n), limits) of the facility's hard limits."""
    from similitude.planning.checks import hard_limits

    lims = hard_limits(prob, c)
    if not lims:
        return (), np.zeros((0, c.size)), ()
    mat = np.array([np.broadcast_to(lim.violation(), (c.size,)) for lim in lims])
    return tuple(lim.name for lim in lims), mat, tuple(lims)


# --------------------------------------------------------------------------------------------
# Grid search
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class GridResult:
    """A vectorised evaluation over a grid of candidates (the benchmark's unit of work)."""

    candidates: tuple
    residuals: tuple
    violation: tuple
    objective: tuple
    count: int
    best: tuple | None


def _grid_sizes(opt: FluidOption, n: int, prob: Problem, skip: str | None = None) -> dict:
    free = [k for k in _AXES if k != skip and opt.axes[k].free
            and (k != "V" or prob.speed_group is None)]
    sizes = {k: 1 for k in _AXES}
    if not free:
        return sizes
    per = max(2, int(round(n ** (1.0 / len(free)))))
    for k in free:
        sizes[k] = per
    # Put what the grid can spare into the scale axis, which the objective follows.
    prod = per ** len(free)
    if "lam" in free:
        sizes["lam"] = max(per, int(per * n / prod))
    return sizes


def _grid_arrays(opt: FluidOption, sizes: dict, prob: Problem):
    axes = []
    for k in _AXES:
        if k == "V" and prob.speed_group is not None:
            axes.append(np.array([np.nan]))
        else:
            axes.append(opt.axes[k].grid(sizes[k]))
    mesh = np.meshgrid(*axes, indexing="ij")
    return [m.ravel() for m in mesh], [len(a) for a in axes]


def _grid_state(opt: FluidOption, sizes: list, T, p) -> FluidState:
    """Fluid state of an ij-ordered (T, p, lam, V) grid, evaluated once per (T, p) pair."""
    rep = sizes[2] * sizes[3]
    Tp, pp = T[::rep], p[::rep]
    st = model_state(opt.info, Tp, pp, opt.spec)

    def r(a):
        if a is None:
            return None
        return np.repeat(np.broadcast_to(np.asarray(a, dtype=float), Tp.shape), rep)

    return _map_state(st, r, temperature_si=T)


def _objective(prob: Problem, c: Candidates) -> np.ndarray:
    obj = prob.case.request.objective
    if obj == "least_mismatch":
        return mismatch(prob, c)
    sign = 1.0 if obj == "largest_model" else -1.0
    # Lexicographic: the scale first, then the reported mismatch as a small tie-breaker.
    return sign * np.log(c.scale) + 1e-9 * mismatch(prob, c)


def search_grid(case_or_problem, n_candidates: int = 100_000) -> GridResult:
    """Evaluate about ``n_candidates`` (fluid, T, p, lambda[, V]) candidates in one vectorised
    pass: velocity ratio from the speed group, residuals of the other exact groups, relative
    violations of the facility limits and the objective.

    This is the function the benchmark times (target below 0.1 s for 1e5 candidates).

    Parameters
    ----------
    case_or_problem : Case or Problem
    n_candidates : int
        Total number of grid points, shared among the admissible fluids.

    Returns
    -------
    GridResult
        Per fluid: the Candidates, residuals (k, n), worst relative violation (n,) and
        objective (n,); ``count`` is the number evaluated; ``best`` is (fluid index, flat index)
        of the best admissible candidate whose residuals are within 1 % (None if none).
    """
    prob = case_or_problem if isinstance(case_or_problem, Problem) else build_problem(
        case_or_problem)
    n_each = max(8, n_candidates // len(prob.options))
    cands, res, vio, objs = [], [], [], []
    count = 0
    best, best_val = None, np.inf
    for i, opt in enumerate(prob.options):
        sizes = _grid_sizes(opt, n_each, prob)
        (T, p, lam, V), shape = _grid_arrays(opt, sizes, prob)
        c = evaluate(prob, opt, T, p, lam, None if prob.speed_group else V,
                     state=_grid_state(opt, shape, T, p))
        r = residuals(prob, c)
        _, vmat, _ = violations(prob, c)
        worst = vmat.max(axis=0) if vmat.size else np.zeros(c.size)
        o = _objective(prob, c)
        cands.append(c)
        res.append(r)
        vio.append(worst)
        objs.append(o)
        count += c.size
        ok = (worst <= 0) & np.all(np.abs(r) < 0.01, axis=0) & np.isfinite(o)
        if np.any(ok):
            j = int(np.argmin(np.where(ok, o, np.inf)))
            if o[j] < best_val:
                best, best_val = (i, j), o[j]
    return GridResult(tuple(cands), tuple(res), tuple(vio), tuple(objs), count, best)


# --------------------------------------------------------------------------------------------
# Root finding along one axis (vectorised bisection)
# --------------------------------------------------------------------------------------------
def _values_with(base: dict, axis: str, values: np.ndarray) -> dict:
    out = dict(base)
    out[axis] = values
    return out


def _eval_point_dict(prob, opt, d):
    return evaluate(prob, opt, d["T"], d["p"], d["lam"], None if prob.speed_group else d["V"])


def _eval_at(prob, opt, point: dict) -> Candidates:
    """Candidates of the single point ``point`` (a dict of floats T, p, lam, V)."""
    return _eval_point_dict(prob, opt, {k: np.array([v]) for k, v in point.items()})


def _bisect(prob, opt, base: dict, axis: str, lo, hi, r_lo, iters: int = 100):
    """Vectorised bracketed root of the single residual along ``axis`` between lo and hi.

    Regula falsi with the Illinois modification (in ln of the variable for log axes): the
    bracket is kept and convergence is superlinear. Only unconverged brackets are evaluated;
    each stops when its bracket is below 1e-15 relative or its residual (ln of the group
    ratio) below 1e-15."""
    log = opt.axes[axis].log
    fwd = np.log if log else (lambda x: x)
    inv = np.exp if log else (lambda x: x)
    a, b = fwd(np.array(lo, float)), fwd(np.array(hi, float))
    fa = np.array(r_lo, float)
    base = {k: np.asarray(v, float) for k, v in base.items()}

    def resid(idx, x):
        sub = {k: v[idx] for k, v in base.items()}
        c = _eval_point_dict(prob, opt, _values_with(sub, axis, inv(x)))
        return residuals(prob, c)[0]

    fb = resid(np.arange(a.size), b)
    last = np.zeros(a.shape, dtype=int)  # +1: b was kept last time, -1: a was kept
    x = 0.5 * (a + b)
    active = np.ones(a.shape, dtype=bool)
    for _ in range(iters):
        idx = np.nonzero(active)[0]
        if idx.size == 0:
            break
        ai, bi, fai, fbi = a[idx], b[idx], fa[idx], fb[idx]
        denom = fbi - fai
        with np.errstate(divide="ignore", invalid="ignore"):
            xi = (ai * fbi - bi * fai) / denom
        bad = ~np.isfinite(xi) | (xi <= np.minimum(ai, bi)) | (xi >= np.maximum(ai, bi))
        xi = np.where(bad, 0.5 * (ai + bi), xi)
        fx = resid(idx, xi)
        x[idx] = xi
        keep_a = np.sign(fx) == np.sign(fbi)  # root between a and x: x replaces b
        li = last[idx]
        fa_new = np.where(keep_a, np.where(li == -1, 0.5 * fai, fai), fx)
        a_new = np.where(keep_a, ai, xi)
        fb_new = np.where(keep_a, fx, np.where(li == 1, 0.5 * fbi, fbi))
        b_new = np.where(keep_a, xi, bi)
        a[idx], fa[idx], b[idx], fb[idx] = a_new, fa_new, b_new, fb_new
        last[idx] = np.where(keep_a, -1, 1)
        width = np.abs(b_new - a_new) / (np.maximum(np.abs(xi), 1.0) if not log else 1.0)
        done = (np.abs(fx) <= 1e-15) | (width <= 1e-15) | ~np.isfinite(fx)
        active[idx[done]] = False
    return inv(x)


def _roots_along(prob, opt, axis: str, n_axis: int, base_grid: dict):
    """Solve the residual along ``axis`` for every grid point of the other axes.

    Returns (points, r): a dict of flat arrays (T, p, lam, V) at the roots, or None when no
    line changes sign, and the residuals r (m, n_axis) on the grid."""
    ax = opt.axes[axis]
    line = ax.grid(n_axis)
    # base_grid: flat arrays of the other axes (m,); build (m, n_axis)
    m = np.size(next(iter(base_grid.values())))
    full = {k: np.repeat(np.asarray(v, float)[:, None], n_axis, axis=1)
            for k, v in base_grid.items()}
    full[axis] = np.broadcast_to(line, (m, n_axis)).copy()
    flat = {k: v.ravel() for k, v in full.items()}
    c = _eval_point_dict(prob, opt, flat)
    r = residuals(prob, c)[0].reshape(m, n_axis)
    with np.errstate(invalid="ignore"):
        sgn = np.sign(r)
        change = (sgn[:, :-1] * sgn[:, 1:] <= 0) & np.isfinite(r[:, :-1]) & np.isfinite(r[:, 1:])
    rows, cols = np.nonzero(change)
    if rows.size == 0:
        return None, r
    base = {k: np.asarray(v, float)[rows] for k, v in base_grid.items()}
    lo_v, hi_v = line[cols], line[cols + 1]
    root = _bisect(prob, opt, _values_with(base, axis, lo_v), axis, lo_v, hi_v,
                   r[rows, cols])
    base[axis] = root
    return base, r


# --------------------------------------------------------------------------------------------
# The solve
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class _Pick:
    option: FluidOption
    point: dict
    objective: float
    worst: float
    worst_name: str
    solve_axis: str | None


def _pick_best(prob, opt, pts: dict, solve_axis, state=None):
    c = evaluate(prob, opt, pts["T"], pts["p"], pts["lam"],
                 None if prob.speed_group else pts["V"], state=state)
    names, vmat, _ = violations(prob, c)
    worst = vmat.max(axis=0) if vmat.size else np.zeros(c.size)
    obj = _objective(prob, c)
    ok_vr = np.isfinite(c.velocity_ratio) & (c.velocity_ratio > 0) & np.isfinite(
        c.state.density_si) & np.isfinite(c.state.dynamic_viscosity_si)
    feas = (worst <= 0) & ok_vr & np.isfinite(obj)
    if np.any(feas):
        j = int(np.argmin(np.where(feas, obj, np.inf)))
        return True, _Pick(opt, {k: float(v[j]) for k, v in pts.items()}, float(obj[j]),
                           float(worst[j]), "", solve_axis)
    w = np.where(ok_vr, worst, np.inf)
    j = int(np.argmin(w))
    name = names[int(np.argmax(vmat[:, j]))] if vmat.size else ""
    return False, _Pick(opt, {k: float(v[j]) for k, v in pts.items()}, float(obj[j]),
                        float(worst[j]), name, solve_axis)


def _other_grid(prob, opt, skip: str, n: int) -> dict:
    """Flat grid of the axes other than ``skip`` (the solve axis), about ``n`` points."""
    arrays, _ = _grid_arrays(opt, _grid_sizes(opt, n, prob, skip), prob)
    return {k: a for k, a in zip(_AXES, arrays, strict=True) if k != skip}


def _solve_point(prob, opt, point: dict, axis: str, n_axis: int = 64):
    """Re-solve the residual along ``axis`` at one point; the root nearest the old value."""
    base = {k: np.array([v]) for k, v in point.items() if k != axis}
    pts, _ = _roots_along(prob, opt, axis, n_axis, base)
    if pts is None:
        return None
    vals = pts[axis]
    j = int(np.argmin(np.abs(np.log(vals / point[axis])))) if opt.axes[axis].log else int(
        np.argmin(np.abs(vals - point[axis])))
    return {k: float(v[j]) for k, v in pts.items()}


def _refine_scale(prob, pick: _Pick, n_line: int):
    """Narrow the admissible boundary in scale from a feasible pick (largest/smallest model).

    The neighbour one line step further (towards a larger model for ``largest_model``) is
    tried; if it is admissible it is taken, else the log-scale bracket between the two is
    narrowed to 1e-14, re-solving the solve axis at each point."""
    opt = pick.option
    obj = prob.case.request.objective
    if obj == "least_mismatch" or pick.solve_axis == "lam" or not opt.axes["lam"].free:
        return pick.point
    ax = opt.axes["lam"]
    step = (ax.high / ax.low) ** (1.0 / max(1, n_line - 1))
    good = dict(pick.point)
    direction = 1.0 / step if obj == "largest_model" else step
    trial = min(max(good["lam"] * direction, ax.low), ax.high)
    if trial == good["lam"]:
        return good
    worst, _, pts = _evaluate_line(prob, opt, good, "lam", np.array([trial]), pick.solve_axis)
    if worst[0] <= 0:
        return pts[0]  # the line search left a better point; accept it without narrowing
    # The admissible boundary lies between ``good`` (admissible) and ``trial`` (not). Narrow the
    # log-scale bracket with batched evaluations, one array call of 32 points a round, so the
    # fluid correlations run vectorised (and no root finder is imported on the CLI path).
    a, b = math.log(good["lam"]), math.log(trial)
    best_pt = good
    for _ in range(12):
        xs = np.linspace(a, b, _NARROW_POINTS + 1)[1:]
        worst, _, pts = _evaluate_line(prob, opt, good, "lam", np.exp(xs), pick.solve_axis)
        bad = np.flatnonzero(~(worst <= 0))
        i = int(bad[0]) if bad.size else xs.size
        if i > 0:
            a, best_pt = xs[i - 1], pts[i - 1]
        if i == xs.size or abs(xs[i] - a) <= 1e-14:
            break
        b = xs[i]
    return best_pt


def _describe_infeasible(prob, pick: _Pick) -> str:
    opt = pick.option
    c = _eval_at(prob, opt, pick.point)
    _, vmat, lims = violations(prob, c)
    order = np.argsort(-vmat[:, 0])
    lam = float(c.scale[0])
    lam_ax = opt.axes["lam"]
    if not lam_ax.free:
        which = "the fixed model"
    elif prob.residual_groups:
        which = "the least-violating model that matches " + " and ".join(prob.exact)
    elif abs(lam - lam_ax.high) <= 1e-9 * lam:
        which = "the smallest admissible model"
    elif abs(lam - lam_ax.low) <= 1e-9 * lam:
        which = "the largest admissible model"
    else:
        which = "the least-violating model"
    where = (f"at {which} ({format_scale(lam)}, L_m = {prob.case.prototype.length / lam:.4g} m, "
             f"{opt.name} at {float(c.temperature[0]):.5g} K, {float(c.pressure[0]):.6g} Pa)")
    msg = lims[order[0]].describe(0, where)
    others = [lims[j].name for j in order[1:] if vmat[j, 0] > 1e-9]
    if others:
        msg += "; also violated there: " + ", ".join(dict.fromkeys(others))
    if "reynolds" in prob.residual_groups and prob.speed_group == "froude":
        nu_p = float(prob.proto.state.kinematic_viscosity_si)
        nu_m = float(np.ravel(c.state.kinematic_viscosity_si)[0])
        msg += (f"; Froude and Reynolds together need nu_m/nu_p = lambda^-1.5 "
                f"(nu_m/nu_p = {nu_m / nu_p:.4g} here), which fixes the scale at "
                f"{format_scale(lam)}")
    return msg


def _no_root_message(prob, r_by_opt) -> str:
    g = prob.residual_groups[0]
    parts = []
    for opt, r, best in r_by_opt:
        if r is None:
            continue
        fin = np.isfinite(r)
        if not np.any(fin):
            parts.append(f"{opt.name}: the group is undefined")
            continue
        k = np.unravel_index(np.argmin(np.where(fin, np.abs(r), np.inf)), r.shape)
        ratio = math.exp(float(r[k]))
        parts.append(f"{opt.name}: closest model/prototype ratio {ratio:.4g}" + best)
    free = sorted({k for o in prob.options for k, a in o.axes.items()
                   if a.free and k != "V"})
    rng = ", ".join(_AXIS_WORDS[k] for k in free) or "no free variable"
    msg = (f"{g} number cannot be matched exactly together with {prob.speed_group} inside "
           f"the facility (searched {rng}): " + "; ".join(parts))
    if g == "reynolds" and prob.speed_group == "froude":
        nu_p = float(prob.proto.state.kinematic_viscosity_si)
        lam = prob.options[0].axes["lam"].low
        msg += (f"; Froude and Reynolds together need nu_m/nu_p = lambda^-1.5, i.e. "
                f"nu_m = {nu_p * lam ** -1.5:.3g} m^2/s at the largest model ({format_scale(lam)})")
    return msg


def convenient_scale(scale: float, direction: str = "up", steps: int = 0) -> float:
    """The convenient scale next to ``scale`` in ``direction`` (``"up"`` or ``"down"``).

    Model makers build to round scales: whole numbers for lambda >= 10 (1:21, 1:35), halves
    for 4 <= lambda < 10 (1:8.5), and two significant figures below 4 (1:3.3, 1:1.3; one
    decimal for 1 <= lambda < 4). This rule is common practice, not a published standard.

    Parameters
    ----------
    scale : float
        lambda = L_p / L_m [-], > 0.
    direction : str
        ``"up"``: the smallest convenient lambda >= scale (a model no larger than the limiting
        one); ``"down"``: the largest convenient lambda <= scale.
    steps : int
        Further convenient values to step past (0: the nearest).

    Returns
    -------
    float
        The convenient lambda [-]; ``scale`` itself when it is already convenient (to 1e-9
        relative).
    """
    if not (math.isfinite(scale) and scale > 0):
        raise InputError(f"scale: {scale!r} is not valid; expected a positive finite number")
    if direction not in ("up", "down"):
        raise InputError(f"direction: {direction!r} is unknown; expected 'up' or 'down'")
    if scale >= 10.0:
        step = 1.0
    elif scale >= 4.0:
        step = 0.5
    else:
        step = 10.0 ** (math.floor(math.log10(scale)) - 1)
    q = scale / step
    k = round(q)
    if abs(q - k) > 1e-9 * q:  # not already on a convenient value
        k = math.ceil(q) if direction == "up" else math.floor(q)
    if k <= 0:
        return float("nan")
    # Round the product so 13 x 0.1 prints as 1.3, not 1.3000000000000003.
    out = float(round(k * step, 12))
    if steps > 0:  # step past this value (the step size may change on the way)
        nudge = 1 + 1e-6 if direction == "up" else 1 - 1e-6
        return convenient_scale(out * nudge, direction, steps - 1)
    return out


#: Convenient scales tried after the nearest one before the limiting scale is kept.
_ROUNDING_TRIES = 3


def _round_scale(case: Case, sol: Solution, n_candidates: int) -> Solution:
    """Replace the limiting scale of a largest/smallest-model solution by a convenient one
    that satisfies every limit, re-solved at that fixed scale (exact groups to 1e-9)."""
    req = case.request
    solved = sol.extra.get("request", req)
    if (not req.round_scale or req.scale is not None or req.model_length is not None
            or solved.objective not in ("largest_model", "smallest_model")
            or sol.extra.get("solved_by") == _AXIS_WORDS["lam"]):
        return sol
    direction = "up" if solved.objective == "largest_model" else "down"
    lam_lo, lam_hi = _scale_bounds(case)
    lam0 = sol.scale
    searched = sol.candidates_searched
    tried = []
    for i in range(_ROUNDING_TRIES):
        lam = convenient_scale(lam0, direction, i)
        if not (math.isfinite(lam) and lam_lo * (1 - 1e-12) <= lam <= lam_hi * (1 + 1e-12)):
            break
        if lam == lam0:
            return replace(sol, extra={**sol.extra, "limiting_scale": lam0,
                                       "limiting_binding": sol.binding})
        fixed = replace(case, request=replace(solved, scale=lam, round_scale=False,
                                              relax=False))
        try:
            new = _solve_relaxing(fixed, n_candidates)
        except (InfeasibleError, InputError) as exc:
            tried.append(f"{format_scale(lam, 6)} ({exc})")
            continue
        extra = {**new.extra, "limiting_scale": lam0, "limiting_binding": sol.binding,
                 "scale_rounding": f"rounded {direction} from the limiting "
                                   f"{format_scale(lam0, 6)} to the convenient "
                                   f"{format_scale(lam, 6)}"}
        for key in ("relaxed", "request"):
            if key in sol.extra:
                extra[key] = sol.extra[key]
        return replace(new, extra=extra, objective=sol.objective,
                       binding=f"{sol.binding}; scale rounded {direction} to the convenient "
                               f"{format_scale(lam, 6)} (limiting {format_scale(lam0, 6)})",
                       candidates_searched=searched + new.candidates_searched)
    why = "; ".join(tried) if tried else "no convenient scale inside the search range"
    return replace(sol, extra={**sol.extra, "limiting_scale": lam0,
                               "limiting_binding": sol.binding,
                               "scale_rounding": f"not rounded: {why}"})


def solve(case: Case, n_candidates: int = DEFAULT_CANDIDATES) -> Solution:
    """Choose the model scale, speed ratio, fluid and state for a case.

    For the largest- and smallest-model objectives the limiting scale found by the search is
    then replaced by the nearest convenient scale that still satisfies every limit
    (:func:`convenient_scale`; ``MatchRequest.round_scale``), re-solved at that fixed scale;
    ``extra["limiting_scale"]`` keeps the unrounded value and ``extra["scale_rounding"]``
    says what was done.

    Parameters
    ----------
    case : Case
    n_candidates : int
        Size of the search grid before refinement.

    Returns
    -------
    Solution

    Raises
    ------
    InputError
        Contradictory or incomplete requests (more exact groups than degrees of freedom).
    InfeasibleError
        No model satisfies the facility limits; the message names the binding limit and by
        how much it is exceeded at the least-violating candidate.
    """
    return _round_scale(case, _solve_relaxing(case, n_candidates), n_candidates)


def _solve_relaxing(case: Case, n_candidates: int) -> Solution:
    """The solve at the limiting scale, dropping the last exact group when allowed."""
    try:
        prob = build_problem(case)
        return _solve_problem(prob, n_candidates)
    except (InfeasibleError, _TooManyResiduals) as exc:
        req = case.request
        hard = [g for g in req.exact if g not in FREE_GROUPS]
        if not req.relax or len(hard) < 2:
            raise
        # Keep the higher-priority groups exact; minimise the mismatch of the dropped one.
        dropped = hard[-1]
        relaxed = replace(req, exact=tuple(g for g in req.exact if g != dropped),
                          report=(dropped,), objective="least_mismatch")
        sol = _solve_relaxing(replace(case, request=relaxed), n_candidates)
        extra = dict(sol.extra)
        extra["relaxed"] = tuple(extra.get("relaxed", ())) + ((dropped, str(exc)),)
        extra["request"] = extra.get("request", relaxed)
        return replace(sol, extra=extra)


def _solve_problem(prob: Problem, n_candidates: int) -> Solution:
    n_each = max(64, n_candidates // len(prob.options))
    feasible, infeasible, no_root = [], [], []
    searched = 0
    for opt in prob.options:
        if not prob.residual_groups:
            sizes = _grid_sizes(opt, n_each, prob)
            (T, p, lam, V), shape = _grid_arrays(opt, sizes, prob)
            pts = {"T": T, "p": p, "lam": lam, "V": V}
            searched += T.size
            ok, pick = _pick_best(prob, opt, pts, None, _grid_state(opt, shape, T, p))
            ok, pick = _line_polish(prob, pick, ok)
            (feasible if ok else infeasible).append(pick)
            continue
        any_free = False
        for axis in _SOLVE_PREFERENCE:
            if not opt.axes[axis].free or (axis == "V" and prob.speed_group is not None):
                continue
            any_free = True
            n_axis = 32
            base = _other_grid(prob, opt, axis, max(8, n_each // n_axis))
            pts, r = _roots_along(prob, opt, axis, n_axis, base)
            searched += np.size(r)
            if pts is None:
                no_root.append((opt, r, f" (solving by {_AXIS_WORDS[axis]})"))
                continue
            ok, pick = _pick_best(prob, opt, pts, axis)
            ok, pick = _line_polish(prob, pick, ok)
            (feasible if ok else infeasible).append(pick)
            if ok and prob.case.request.objective != "least_mismatch":
                # The exact-solution manifold is the same whichever variable parametrises
                # it; a second parametrisation only changes the resolution.
                break
        if not any_free:
            no_root.append((opt, None, ""))
    if not feasible:
        if infeasible:
            pick = min(infeasible, key=lambda t: t.worst)
            raise InfeasibleError(_describe_infeasible(prob, pick))
        raise InfeasibleError(_no_root_message(prob, no_root))
    refined = []
    for pick in feasible:
        point = _refine_scale(prob, pick, _LINE_POINTS)
        c = _eval_at(prob, pick.option, point)
        refined.append((float(_objective(prob, c)[0]), pick, point))
    _, pick, point = min(refined, key=lambda t: t[0])
    return _make_solution(prob, pick.option, point, pick.solve_axis, searched)


_LINE_POINTS = 128
#: Points per round of the batched bracket narrowing.
_NARROW_POINTS = 32


def _line_polish(prob, pick: _Pick, ok: bool, sweeps: int = 2):
    """Improve a grid pick by fine 1-D searches along each free grid axis in turn.

    Along each line the solve axis is re-solved; the best admissible point by the objective
    is kept (or, while none is admissible, the least-violating one). This repairs the grid's
    coarse resolution near the admissible boundary and refines interior optima."""
    opt = pick.option
    axes = [k for k in _AXES if k != pick.solve_axis and opt.axes[k].free
            and (k != "V" or prob.speed_group is None)]
    best = pick
    for _ in range(sweeps):
        improved = False
        for ax in axes:
            line = opt.axes[ax].grid(_LINE_POINTS)
            base = {k: np.full(line.size, v) for k, v in best.point.items()
                    if k != pick.solve_axis}
            base[ax] = line
            if pick.solve_axis is None:
                pts = base
            else:
                pts, _ = _roots_along(prob, opt, pick.solve_axis, 32, base)
                if pts is None:
                    continue
            ok2, cand = _pick_best(prob, opt, pts, pick.solve_axis)
            if ok2 and (not ok or cand.objective < best.objective - 1e-15 * abs(
                    best.objective)):
                best, ok, improved = cand, True, True
            elif not ok and not ok2 and cand.worst < best.worst:
                best, improved = cand, True
        if not improved:
            break
    if ok and prob.case.request.objective == "least_mismatch":
        best = _scalar_refine(prob, best, axes)
    return ok, best


def _scalar_refine(prob, pick: _Pick, axes) -> _Pick:
    """Minimise the mismatch along each axis within one line step of the pick (interior optima
    of ``least_mismatch``) by batched grid narrowing: 33 points a round in one array call, then
    the bracket around the best admissible point, to 1e-10 relative."""
    opt = pick.option
    best = pick
    for ax in axes:
        a = opt.axes[ax]
        step = (a.high / a.low) ** (1.0 / (_LINE_POINTS - 1)) if a.log else \
            (a.high - a.low) / (_LINE_POINTS - 1)
        x0 = best.point[ax]
        lo, hi = ((max(a.low, x0 / step), min(a.high, x0 * step)) if a.log
                  else (max(a.low, x0 - step), min(a.high, x0 + step)))
        for _ in range(40):
            if not hi > lo or hi - lo <= 1e-10 * abs(x0):
                break
            xs = (np.geomspace(lo, hi, _NARROW_POINTS + 1) if a.log
                  else np.linspace(lo, hi, _NARROW_POINTS + 1))
            worst, obj, pts = _evaluate_line(prob, opt, best.point, ax, xs, pick.solve_axis)
            obj = np.where(worst <= 0, obj, np.inf)
            j = int(np.argmin(obj))
            if not np.isfinite(obj[j]):
                break
            if obj[j] < best.objective:
                best = _Pick(opt, pts[j], float(obj[j]), best.worst, "", pick.solve_axis)
            lo, hi = xs[max(j - 1, 0)], xs[min(j + 1, xs.size - 1)]
    return best


def _evaluate_line(prob, opt, base: dict, axis: str, xs: np.ndarray, solve_axis):
    """Worst hard-limit violation, objective and point of each of ``base`` moved to ``xs``
    along ``axis``; one array evaluation unless a solve axis must be re-solved per point."""
    if solve_axis is None:
        pts = [dict(base, **{axis: float(x)}) for x in xs]
        c = _eval_point_dict(prob, opt, {k: np.array([pt[k] for pt in pts]) for k in base})
        _, vmat, _ = violations(prob, c)
        worst = vmat.max(axis=0) if vmat.size else np.full(xs.size, -1.0)
        worst = np.where(np.isfinite(c.velocity_ratio), worst, np.inf)
        return worst, np.asarray(_objective(prob, c), dtype=float), pts
    worst = np.full(xs.size, np.inf)
    obj = np.full(xs.size, np.inf)
    pts = []
    for n, x in enumerate(xs):
        pt = _solve_point(prob, opt, dict(base, **{axis: float(x)}), solve_axis)
        pts.append(pt)
        if pt is None:
            continue
        c = _eval_at(prob, opt, pt)
        _, vmat, _ = violations(prob, c)
        if np.isfinite(c.velocity_ratio[0]):
            worst[n] = float(vmat.max()) if vmat.size else -1.0
            obj[n] = float(_objective(prob, c)[0])
    return worst, obj, pts


def _binding_text(prob, opt, point) -> str:
    """The active facility limits at the solution (within 1e-7 relative), in words."""
    c = _eval_at(prob, opt, point)
    _, vmat, lims = violations(prob, c)
    fixed = ""
    if not opt.axes["lam"].free:
        fixed = "fixed scale" if prob.case.request.scale is not None else \
            "existing model length"
    active = [lims[j].name for j in np.argsort(-vmat[:, 0]) if vmat[j, 0] > -1e-7] \
        if vmat.size else []
    active = list(dict.fromkeys(active))
    if fixed:
        return fixed + (" (active limits: " + "; ".join(active) + ")" if active else "")
    if not active:
        return "scale range of the search (no facility limit active)"
    return "; ".join(active)


def _make_solution(prob, opt, point, solve_axis, searched) -> Solution:
    case = prob.case
    c = _eval_at(prob, opt, point)
    lam = float(c.scale[0])
    vr = float(c.velocity_ratio[0])
    T, p = float(c.temperature[0]), float(c.pressure[0])
    mstate = model_state(opt.info, T, p, opt.spec, strict=True)
    rot = vr * lam if prob.proto.rotation is not None else None
    exact = tuple(prob.exact)
    # Verify: the exact groups hold to 1e-9 relative at every speed.
    for i in range(len(case.prototype.speeds)):
        gm = model_groups(prob, c, i, exact)
        for g in exact:
            gp = prob.proto_groups[g][i] if g in prob.proto_groups else np.nan
            if g == "strouhal" and not np.isfinite(gp):
                continue
            if not (abs(float(gm[g][0]) / float(gp) - 1.0) <= 1e-9):
                raise InfeasibleError(
                    f"{g} number could not be matched to 1e-9 (model/prototype = "
                    f"{float(gm[g][0]) / float(gp):.12g}); expected an exact solution"
                )
    model_pressure = float(c.reference_pressure[0]) if not case.facility.free_surface or \
        case.facility.pressure_range is not None else None
    return Solution(
        scale=lam, velocity_ratio=vr, prototype_fluid=prob.proto.state, model_fluid=mstate,
        rotation_ratio=rot, model_pressure=model_pressure, exact=exact,
        binding=_binding_text(prob, opt, point), objective=case.request.objective,
        candidates_searched=int(searched),
        extra={"solved_by": _AXIS_WORDS.get(solve_axis, "") if solve_axis else "",
               "static_pressure": p, "fluid": opt.name},
    )


def candidate_at(prob: Problem, solution: Solution) -> Candidates:
    """The solution as a single :class:`Candidates` (for checks and conflicts)."""
    name = solution.extra.get("fluid", solution.model_fluid.fluid)
    opt = next((o for o in prob.options if o.name == name), prob.options[0])
    T = float(solution.model_fluid.temperature_si)
    p = float(solution.extra.get("static_pressure", solution.model_fluid.pressure_si))
    V = None
    if prob.speed_group is None:
        V = solution.velocity_ratio * float(np.asarray(prob.proto.speed)[prob.design])
    return evaluate(prob, opt, np.array([T]), np.array([p]), np.array([solution.scale]),
                    None if V is None else np.array([V]))


__all__ = [
    "DEFAULT_CANDIDATES",
    "candidate_at",
    "convenient_scale",
    "FREE_GROUPS",
    "SPEED_EXPONENT",
    "Candidates",
    "GridResult",
    "Problem",
    "SideState",
    "build_problem",
    "evaluate",
    "group_value",
    "model_groups",
    "prototype_side",
    "prototype_state",
    "search_grid",
    "solve",
]

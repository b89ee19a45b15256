"""The admissible scale window of a case: every model scale the facility's hard limits allow.

:func:`scale_window` evaluates the hard limits of :mod:`similitude.planning.limits` over the
whole scale axis at once: a log-spaced grid of scales lambda = L_p / L_m [-], each crossed with
the model-fluid states the facility can set (fluid, temperature, pressure; a further exact group
solved through the fluid state as the solver does), in one vectorised evaluation per fluid. A
scale is admissible when some state meets every limit. The first and last admissible grid
scales are then narrowed: :data:`NARROW_POINTS` scales between each and its inadmissible
neighbour (both ends in one array evaluation), then the crossing of the worst violation is
interpolated in log(lambda) (the limits are smooth in the scale): the largest-model end is
checked to be admissible, both are within about 1e-6 of the limit. The result names the limit
that binds at each end: the one violated just beyond it. A case whose facility admits no scale
gets the least-violating scale and its worst limit with the excess instead.

For Froude-scaled models every hard limit is monotonic in the scale (speeds go as
lambda^-1/2, lengths as lambda^-1, areas as lambda^-2, wave periods as lambda^-1/2 [1]_), so
the admissible scales form one interval: larger models are bound by speed maxima, model-size,
blockage, wall and depth limits, smaller ones by speed minima, model-size minima and the
wavemaker's longest period. A campaign intersects the windows of the facilities a shared model
visits (:mod:`similitude.planning.campaign`).

:func:`model_at_scale` gives the model at one scale: the admissible fluid state with the least
mismatch of the reported groups (the solver's tie-break), as a
:class:`~similitude.planning.solution.Solution` with its facility checks, so run matrices and
facility hours can be built for it without a search. ``ScaleWindow.largest`` is that model at
the window's largest-model end.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-02-01, "Resistance Test", Rev 03,
       2011 (model tests at corresponding Froude number).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from similitude.errors import InfeasibleError
from similitude.planning.candidates import (
    Candidates,
    FluidOption,
    Problem,
    build_problem,
    evaluate,
    map_state,
    mismatch,
    model_state,
    residuals,
    scale_bounds,
    violations,
)
from similitude.planning.case import Case
from similitude.planning.findings import Check
from similitude.planning.limits import hard_limits
from similitude.planning.solution import Solution
from similitude.planning.solver import _roots_along
from similitude.units import format_scale

#: Scales of the first grid over the search range (log-spaced).
GRID_SCALES = 64
#: Points per axis of the fluid state (temperature, pressure, free model speed) at each scale:
#: the ends of the facility's ranges, where the limits and the mismatch are extreme when they
#: are monotonic in the state (viscosity in temperature, density in pressure).
STATE_POINTS = 2
#: Scales per bracket when the window's ends are narrowed (one round, then interpolation).
NARROW_POINTS = 64
#: The interpolated ends are moved this far (relative) towards the admissible side [-]: more
#: than the interpolation error; an end whose model then breaks a limit falls back to the
#: last admissible scale of the narrowing (within 1e-3).
END_TOLERANCE = 1e-7
#: A limit within this relative violation of zero is active (binding) [-].
ACTIVE = 1e-7
#: Largest scale searched when the facility states no smallest model [-]: the solver's range
#: ends at 1/1000 of the facility length, which cuts off small models of small prototypes
#: (a propeller in a long tank); the window looks on to this plausibility limit of a scale.
SMALLEST_MODEL_SCALE = 1000.0


# --------------------------------------------------------------------------------------------
# Results
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class ScalePoint:
    """The model at one scale: its best fluid state, as a solution, with its checks.

    Attributes
    ----------
    solution : Solution or None
        Scale, velocity (and rotation) ratio, fluids and pressure of the model (None when
        only its admissibility was asked for).
    checks : tuple of Check
        The facility's hard limits at this model as checks (value, limit, margin, status;
        :meth:`similitude.planning.limits.Limit.check`); the regime checks of a full plan
        (:func:`similitude.planning.checks.facility_checks`) are left to the plan.
    admissible : bool
        Every hard limit holds.
    mismatch : float
        Squared log-mismatch of the reported groups at the design speed [-].
    candidate : Candidates
        The model as a single candidate (for group values).
    problem : Problem
        The case in the solver's terms.
    """

    solution: Solution
    checks: tuple[Check, ...]
    admissible: bool
    mismatch: float
    candidate: Candidates
    problem: Problem


@dataclass(frozen=True)
class ScaleWindow:
    """The scales a facility admits for a case (lambda = L_p / L_m).

    Attributes
    ----------
    case : Case
        The case the window is for (its facility, prototype, request and runs).
    feasible : bool
        Some scale meets every hard limit.
    low, high : float
        Smallest and largest admissible lambda [-]: the largest and the smallest model; NaN
        when not feasible.
    low_limit, high_limit : str
        The limit that binds at each end, in words with its value (what a larger model than
        at ``low``, or a smaller one than at ``high``, would break); the edge of the search
        range when no limit binds there.
    search : tuple of float
        (lowest, highest) lambda searched: the solver's range
        (:func:`similitude.planning.candidates.scale_bounds`: the facility's model-size
        limits, or its length), on to :data:`SMALLEST_MODEL_SCALE` when the facility states
        no smallest model.
    closest : float
        Feasible: ``low``. Not feasible: the least-violating lambda [-].
    excess : float
        Relative violation of the worst limit at ``closest`` [-] (0 when feasible).
    reason : str
        Not feasible: the worst limit at the least-violating model and by how much it is
        exceeded, with the other limits violated there; "" when feasible.
    largest : ScalePoint or None
        The model at ``low`` (None when not feasible).
    scales, worst, mismatch : ndarray
        The grid: lambda [-], the smallest worst relative violation of any state at each scale
        (<= 0 admissible) and the least squared log-mismatch of the reported groups among the
        admissible states there (NaN where none is admissible).
    """

    case: Case
    feasible: bool
    low: float
    high: float
    low_limit: str
    high_limit: str
    search: tuple[float, float]
    closest: float
    excess: float
    reason: str
    largest: ScalePoint | None
    scales: np.ndarray
    worst: np.ndarray
    mismatch: np.ndarray

    def contains(self, scale: float, rel: float = 1e-9) -> bool:
        """True when ``scale`` lies inside the window (to ``rel`` relative)."""
        return self.feasible and self.low * (1 - rel) <= scale <= self.high * (1 + rel)

    def mismatch_at(self, scale) -> np.ndarray:
        """Least squared log-mismatch of the reported groups at ``scale`` [-] inside the
        window, interpolated in log(lambda) over the admissible grid scales (the largest
        model's own value at ``low``; the nearest grid value between the last grid scale and
        an end); NaN when not feasible."""
        ok = np.isfinite(self.mismatch)
        if not self.feasible:
            return np.full(np.shape(scale), np.nan)
        x, y = np.log(self.scales[ok]), self.mismatch[ok]
        if self.largest is not None:
            x, y = np.append(np.log(self.low), x), np.append(self.largest.mismatch, y)
        order = np.argsort(x)
        return np.interp(np.log(scale), x[order], y[order])

    def text(self) -> str:
        """The window in the trade's notation with its binding limits, in one line."""
        if not self.feasible:
            return f"no admissible scale: {self.reason}"
        if self.high <= self.low * (1 + END_TOLERANCE):
            return f"{format_scale(self.low)} only ({self.low_limit})"
        return (f"{format_scale(self.low)} (largest model; {self.low_limit}) to "
                f"{format_scale(self.high)} (smallest model; {self.high_limit})")


# --------------------------------------------------------------------------------------------
# The window
# --------------------------------------------------------------------------------------------
def scale_window(case: Case, problem: Problem | None = None, n_scales: int = GRID_SCALES,
                 states=None) -> ScaleWindow:
    """The admissible scale window of ``case`` in its facility, with the binding limits.

    Parameters
    ----------
    case : Case
        The case; a fixed scale or model length (``case.request``) gives a window of that one
        scale, or none.
    problem : Problem, optional
        ``build_problem(case)`` when the caller has it.
    n_scales : int
        Scales of the first grid.
    states : optional
        The problem's fluid-state grid from :func:`state_grids` (evaluated together with
        other problems'); None: evaluated here.

    Returns
    -------
    ScaleWindow

    Raises
    ------
    InputError
        A request the facility cannot plan at all (from
        :func:`similitude.planning.candidates.build_problem`).
    """
    prob = problem if problem is not None else build_problem(case)
    states = _fluid_states(prob) if states is None else states
    lo, hi = _search_range(case)
    grid = np.geomspace(lo, hi, n_scales) if hi > lo * (1 + 1e-12) else np.array([lo])
    sweep = _sweep(prob, states, grid)
    if not (sweep.worst <= 0).any() and grid.size > 1:
        sweep = _zoom(prob, states, sweep)
    ok = sweep.worst <= 0
    if not ok.any():
        return _infeasible(prob, states, sweep, (lo, hi))
    idx = np.flatnonzero(ok)
    first, last = int(idx[0]), int(idx[-1])
    brackets, ends = {}, {}
    for key, inside, outside in (("low", first, first - 1), ("high", last, last + 1)):
        if 0 <= outside < grid.size:
            brackets[key] = _Bracket((sweep, inside), float(sweep.scales[outside]),
                                     float(sweep.worst[outside]), str(sweep.limit[outside]),
                                     str(sweep.kind[outside]))
        else:
            ends[key] = _Bracket((sweep, inside), math.nan, math.nan,
                                 _edge_words(prob, sweep, inside, key), "max")
    ends.update(_narrow(prob, states, brackets))
    low, high = ends["low"], ends["high"]
    lam_low, largest = low.scale, None
    if low.end is not None:  # the interpolated end, kept when its model meets every limit
        largest = _point(prob, states, *low.good, scale=low.end)
        lam_low = low.end if largest.admissible else lam_low
    if largest is None or not largest.admissible:
        largest = _point(prob, states, *low.good)
    # the smallest-model end is kept as interpolated (within about 1e-7; the campaign checks
    # the scale it chooses against every limit)
    lam_high = high.scale if high.end is None else high.end
    return ScaleWindow(case, True, lam_low, lam_high, low.words, high.words, (lo, hi),
                       lam_low, 0.0, "", largest, sweep.scales, sweep.worst, sweep.mismatch)


def _search_range(case: Case) -> tuple[float, float]:
    """The scales searched: the solver's range, on to SMALLEST_MODEL_SCALE when neither the
    case nor the facility fixes the smallest model."""
    lo, hi = scale_bounds(case)
    req = case.request
    if (case.facility.min_model_length is None and req.scale is None
            and req.model_length is None):
        hi = max(hi, SMALLEST_MODEL_SCALE)
    return lo, hi


def model_at_scale(case: Case, scale: float, problem: Problem | None = None) -> ScalePoint:
    """The model of ``case`` at the scale ``scale`` [-]: the admissible fluid state with the
    least mismatch of the reported groups (or the least-violating state when none is
    admissible), with its facility checks.

    Raises
    ------
    InfeasibleError
        When no fluid state of the facility meets the exact groups at this scale.
    """
    prob = problem if problem is not None else build_problem(case)
    states = _fluid_states(prob)
    sweep = _sweep(prob, states, np.array([float(scale)]))
    if sweep.option[0] < 0:
        raise InfeasibleError(f"{case.facility.name}: no fluid state meets the exact groups "
                              f"({', '.join(prob.exact)}) at {format_scale(scale)}")
    return _point(prob, states, sweep, 0)


# --------------------------------------------------------------------------------------------
# Evaluating every fluid state at each of an array of scales
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class _States:
    """The fluid states searched at every scale for one fluid option: a grid of the free
    variables (T, p and, when no exact group fixes it, V), with their properties evaluated
    once; ``state`` is None when a residual exact group is solved through the state at each
    scale instead (along ``solve_axis``)."""

    option: FluidOption
    T: np.ndarray
    p: np.ndarray
    V: np.ndarray
    state: object
    solve_axis: str | None


@dataclass(frozen=True)
class _Sweep:
    """Per scale: the smallest worst violation over the fluid states and the limit broken most
    there (in words), and the least mismatch among the admissible states; the state (fluid
    option index, -1 for none; T, p, V) of the admissible state with the least mismatch, or of
    the least-violating one where none is admissible."""

    scales: np.ndarray
    worst: np.ndarray
    limit: np.ndarray  # object array of str
    kind: np.ndarray  # object array: "max" or "min", the kind of that limit
    mismatch: np.ndarray
    option: np.ndarray
    T: np.ndarray
    p: np.ndarray
    V: np.ndarray
    row: np.ndarray  # the state's row in its _States grid (-1: solved, not on the grid)


#: The fields of a _Sweep, in order.
_SWEEP_FIELDS = ("scales", "worst", "limit", "kind", "mismatch", "option", "T", "p", "V",
                 "row")


def _solve_axis(prob: Problem, opt: FluidOption) -> str | None:
    """The variable the residual exact group is solved through, as the solver prefers it
    (pressure, temperature, model speed); None without a residual group, "lam" when only the
    scale is left."""
    if not prob.residual_groups:
        return None
    for k in ("p", "T", "V"):
        if opt.axes[k].free and not (k == "V" and prob.speed_group is not None):
            return k
    return "lam"


def _fluid_states(prob: Problem) -> tuple[_States, ...]:
    """The state grid of every admissible fluid, with properties where they do not depend on
    the scale (no residual group to solve through the state)."""
    return state_grids([prob])[0]


def state_grids(problems) -> list[tuple]:
    """The fluid-state grids of several problems (the same test in several facilities), the
    properties of each fluid evaluated in one array call for all of them; pass each to
    :func:`scale_window` as ``states``."""
    grids, wanted = [], {}
    for prob in problems:
        row = []
        for opt in prob.options:
            axes = [opt.axes[k].grid(STATE_POINTS) for k in ("T", "p")]
            axes.append(np.array([np.nan]) if prob.speed_group is not None
                        else opt.axes["V"].grid(STATE_POINTS))
            T, p, V = (m.ravel() for m in np.meshgrid(*axes, indexing="ij"))
            axis = _solve_axis(prob, opt)
            row.append([opt, T, p, V, None, axis])
            if axis is None:
                wanted.setdefault((opt.name, opt.spec), []).append(row[-1])
        grids.append(row)
    for entries in wanted.values():
        opt = entries[0][0]
        T = np.concatenate([e[1] for e in entries])
        p = np.concatenate([e[2] for e in entries])
        state = model_state(opt.info, T, p, opt.spec)
        at = 0
        for e in entries:
            e[4] = map_state(state, _part(slice(at, at + e[1].size), T.size), e[1])
            at += e[1].size
    return [tuple(_States(*e) for e in row) for row in grids]


def _part(part: slice, n: int):
    """A function taking ``part`` of an array of n values (a scalar broadcast first)."""
    def take(a):
        return None if a is None else np.broadcast_to(np.asarray(a, dtype=float), (n,))[part]
    return take


def _candidates(prob: Problem, st: _States, scales: np.ndarray):
    """(candidates, row of each candidate's scale, model speeds, row of its state in the
    grid) of every state at every scale; the residual exact group solved through its axis
    (all None: no root)."""
    n, ns = scales.size, st.T.size
    if st.solve_axis is None:
        def rep(a):
            if a is None:
                return None
            return np.repeat(np.broadcast_to(np.asarray(a, dtype=float), (ns,)), n)

        state = map_state(st.state, rep, rep(st.state.temperature_si))
        V = None if prob.speed_group is not None else rep(st.V)
        c = evaluate(prob, st.option, rep(st.T), rep(st.p), np.tile(scales, ns), V,
                     state=state)
        return c, np.tile(np.arange(n), ns), rep(st.V), np.repeat(np.arange(ns), n)
    base = {"T": np.repeat(st.T, n), "p": np.repeat(st.p, n), "V": np.repeat(st.V, n),
            "lam": np.tile(scales, ns)}
    base.pop(st.solve_axis)
    pts, _ = _roots_along(prob, st.option, st.solve_axis, 32, base)
    if pts is None:
        return None, None, None, None
    V = None if prob.speed_group is not None else pts["V"]
    c = evaluate(prob, st.option, pts["T"], pts["p"], pts["lam"], V)
    rows = np.clip(np.searchsorted(scales, pts["lam"]), 0, n - 1)
    return (c, rows, np.broadcast_to(np.asarray(pts["V"], dtype=float), rows.shape),
            np.full(rows.shape, -1))


def _worst(prob: Problem, c: Candidates):
    """(worst relative violation per candidate, inf where the candidate is no model;
    violation matrix; limits)."""
    _, vmat, lims = violations(prob, c)
    w = vmat.max(axis=0) if vmat.size else np.full(c.size, -1.0)
    good = np.isfinite(c.velocity_ratio) & (c.velocity_ratio > 0)
    if prob.residual_groups:
        good &= np.all(np.abs(residuals(prob, c)) < 1e-6, axis=0)
    return np.where(good, w, np.inf), vmat, lims


def _sweep(prob: Problem, states: tuple[_States, ...], scales: np.ndarray) -> _Sweep:
    """Evaluate every fluid state at each scale (one array call per fluid) and keep, per
    scale, the least violation with its limit and the best state (see :class:`_Sweep`)."""
    n = scales.size
    out = {"scales": scales, "worst": np.full(n, np.inf), "limit": np.full(n, "", object),
           "kind": np.full(n, "max", object), "mismatch": np.full(n, np.inf),
           "option": np.full(n, -1),
           "T": np.full(n, np.nan), "p": np.full(n, np.nan), "V": np.full(n, np.nan),
           "row": np.full(n, -1)}
    rank = (np.full(n, 2), np.full(n, np.inf))  # (0 admissible / 1 not, mismatch / violation)
    for i, st in enumerate(states):
        c, rows, v, state_rows = _candidates(prob, st, scales)
        if c is None:
            continue
        w, vmat, lims = _worst(prob, c)
        j = _argmin_by(rows, w)  # the least-violating state of each scale
        s = rows[j]
        better = w[j] < out["worst"][s]
        s, j = s[better], j[better]
        out["worst"][s] = w[j]
        if vmat.size and j.size:
            words = np.array([_limit_words(lim) for lim in lims], dtype=object)
            kinds = np.array([lim.kind for lim in lims], dtype=object)
            most = np.argmax(vmat[:, j], axis=0)
            out["limit"][s], out["kind"][s] = words[most], kinds[most]
        m = mismatch(prob, c)
        adm = w <= 0
        r1, r2 = np.where(adm, 0, 1), np.where(adm, m, w)
        j = _argmin_by(rows, r2, r1)  # the best state of each scale
        s = rows[j]
        better = (r1[j] < rank[0][s]) | ((r1[j] == rank[0][s]) & (r2[j] < rank[1][s]))
        s, j = s[better], j[better]
        rank[0][s], rank[1][s] = r1[j], r2[j]
        out["option"][s] = i
        out["T"][s], out["p"][s], out["V"][s] = c.temperature[j], c.pressure[j], v[j]
        out["row"][s] = state_rows[j]
        out["mismatch"][s] = np.where(adm[j], m[j], np.inf)
    out["mismatch"][~np.isfinite(out["mismatch"])] = np.nan
    return _Sweep(**out)


def _argmin_by(groups: np.ndarray, values: np.ndarray, first_key=None) -> np.ndarray:
    """Index of the smallest value of each group present (by ``first_key``, then ``values``,
    when a first key is given)."""
    keys = (values, groups) if first_key is None else (values, first_key, groups)
    order = np.lexsort(keys)
    g = groups[order]
    first = np.ones(g.size, dtype=bool)
    first[1:] = g[1:] != g[:-1]
    return order[first]


def _merge(a: _Sweep, b: _Sweep) -> _Sweep:
    order = np.argsort(np.concatenate([a.scales, b.scales]), kind="stable")
    return _Sweep(*(np.concatenate([getattr(a, f), getattr(b, f)])[order]
                    for f in _SWEEP_FIELDS))


def _evaluate_at(prob: Problem, states, sweep: _Sweep, i: int,
                 scale: float | None = None) -> Candidates:
    """The state kept at scale ``i`` of a sweep (at ``scale`` when given) as a single
    candidate; its fluid properties from the state grid when it lies on it."""
    st = states[int(sweep.option[i])]
    lam = float(sweep.scales[i] if scale is None else scale)
    one = lambda a: np.array([float(a[i])])  # noqa: E731
    return evaluate(prob, st.option, one(sweep.T), one(sweep.p), np.array([lam]),
                    None if prob.speed_group is not None else one(sweep.V),
                    state=_state_row(st, int(sweep.row[i]), np.array))


def _state_row(st: _States, row: int, kind=float):
    """One row of a state grid (``kind``: float for a scalar state, np.array for an array of
    one); None when the state is not on the grid."""
    if row < 0 or st.state is None:
        return None
    def pick(a):
        if a is None:
            return None
        v = float(np.broadcast_to(np.asarray(a, dtype=float), st.T.shape)[row])
        return kind([v]) if kind is np.array else v
    return map_state(st.state, pick, pick(st.state.temperature_si))


def _point(prob: Problem, states, sweep: _Sweep, i: int, scale: float | None = None,
           checks: bool = True) -> ScalePoint:
    """The state kept at scale ``i`` of a sweep as a ScalePoint, at ``scale`` instead of that
    scale when given; ``checks=False`` leaves out the facility checks (admissibility only)."""
    st = states[int(sweep.option[i])]
    c = _evaluate_at(prob, states, sweep, i, scale)
    w, _, _ = _worst(prob, c)
    admissible = bool(w[0] <= 0)
    if not checks:
        return ScalePoint(None, (), admissible, math.nan, c, prob)
    lam, vr = float(c.scale[0]), float(c.velocity_ratio[0])
    T, p = float(c.temperature[0]), float(c.pressure[0])
    fac = prob.case.facility
    fluid = _state_row(st, int(sweep.row[i]))
    if fluid is None:
        fluid = model_state(st.option.info, T, p, st.option.spec, strict=True)
    sol = Solution(
        scale=lam, velocity_ratio=vr, prototype_fluid=prob.proto.state, model_fluid=fluid,
        rotation_ratio=vr * lam if prob.proto.rotation is not None else None,
        model_pressure=(float(c.reference_pressure[0]) if not fac.free_surface
                        or fac.pressure_range is not None else None),
        exact=tuple(prob.exact), binding="the scale window of the facility",
        objective=prob.case.request.objective, fluid_name=st.option.name, static_pressure=p)
    # every limit, a soft one over its value at a fixed scale as a warning (Limit.check)
    return ScalePoint(sol, tuple(lim.check(0) for lim in hard_limits(prob, c)), admissible,
                      float(mismatch(prob, c)[0]), c, prob)


# --------------------------------------------------------------------------------------------
# The ends of the window, and the least-violating model when there is none
# --------------------------------------------------------------------------------------------
@dataclass
class _Bracket:
    """One end of the window while it is narrowed: the admissible side (sweep, index), the
    inadmissible scale beyond it with its worst violation and the limit broken there, and the
    interpolated end (None until interpolated, or when it cannot be)."""

    good: tuple
    bad: float
    bad_worst: float
    words: str
    kind: str
    end: float | None = None

    @property
    def scale(self) -> float:
        """The admissible scale [-]."""
        sweep, i = self.good
        return float(sweep.scales[i])

    def interpolate(self) -> None:
        """The crossing of the worst violation between the admissible and the inadmissible
        scale, END_TOLERANCE inside."""
        sweep, i = self.good
        wg, wb = float(sweep.worst[i]), self.bad_worst
        if not (math.isfinite(wb) and wb > 0 >= wg and wg > -1 and wb < 1):
            return
        # ln(value/limit) is linear in ln(lambda) for a power law: 1 + w for a maximum,
        # 1 - w for a minimum (limits.Limit.violation)
        yg, yb = ((math.log1p(wg), math.log1p(wb)) if self.kind == "max"
                  else (-math.log1p(-wg), -math.log1p(-wb)))
        xg, xb = math.log(self.scale), math.log(self.bad)
        x = xg + (xb - xg) * (-yg) / (yb - yg)
        x -= math.copysign(END_TOLERANCE, xb - xg)
        lo, hi = sorted((xg, xb))
        self.end = math.exp(min(max(x, lo), hi))


def _limit_words(lim) -> str:
    """A limit in words with its value, e.g. "blockage ratio A_X/(B_T h) (usual uncorrected
    limit 0.005)"; without the value when it differs between models (a steady-run distance)."""
    if np.ndim(lim.limit):
        return f"{lim.name} ({lim.limit_words})"
    unit = f" {lim.unit}" if lim.unit else ""
    return f"{lim.name} ({lim.limit_words} {float(lim.limit):.4g}{unit})"


def _edge_words(prob: Problem, sweep: _Sweep, i: int, side: str) -> str:
    """What binds at the edge of the search range: a limit active there (the tightest limit of
    the least-violating state, within ACTIVE of its value), else the range itself."""
    if sweep.worst[i] > -ACTIVE and sweep.limit[i]:
        return str(sweep.limit[i])
    fac, req = prob.case.facility, prob.case.request
    if req.scale is not None or req.model_length is not None:
        return "fixed scale of the case"
    if side == "low":
        return ("facility's largest model" if fac.max_model_length is not None else
                "largest model searched (as long as the facility)")
    return ("facility's smallest model" if fac.min_model_length is not None else
            f"smallest model searched ({format_scale(SMALLEST_MODEL_SCALE)})")


def _narrow(prob: Problem, states, brackets: dict) -> dict:
    """Narrow the ends of the window: NARROW_POINTS scales in each bracket between its
    admissible and inadmissible scale, both ends in one array evaluation; then the crossing of
    the worst violation, interpolated linearly in log(lambda) between the last admissible and
    the first inadmissible scale and moved END_TOLERANCE towards the admissible side
    (``_Bracket.end``; the limits are smooth in the scale, so the interpolation error is of
    the order of the bracket's width squared). Returns {end: _Bracket}."""
    if not brackets:
        return {}
    grids = []
    for b in brackets.values():
        a, z = sorted((b.scale, b.bad))
        grids.append(np.geomspace(a, z, NARROW_POINTS + 2)[1:-1])
    sub = _sweep(prob, states, np.concatenate(grids))
    at = 0
    for key, xs in zip(list(brackets), grids, strict=True):
        ok = sub.worst[at:at + xs.size] <= 0
        b = brackets[key]
        if key == "low":  # inadmissible below the first admissible scale
            k = int(np.argmax(ok)) if ok.any() else xs.size
            bad, good = k - 1, k
        else:  # admissible up to the first inadmissible scale
            k = int(np.argmin(ok)) if not ok.all() else xs.size
            bad, good = k, k - 1
        if 0 <= good < xs.size:
            b.good = (sub, at + good)
        if 0 <= bad < xs.size:
            b.bad, b.bad_worst, b.words, b.kind = (
                float(xs[bad]), float(sub.worst[at + bad]), str(sub.limit[at + bad]),
                str(sub.kind[at + bad]))
        at += xs.size
        b.words = b.words or "no fluid state of the facility meets the exact groups"
        b.interpolate()
    return brackets


def _zoom(prob: Problem, states, sweep: _Sweep, rounds: int = 3) -> _Sweep:
    """No admissible grid scale: look between the neighbours of the least-violating one, finer
    each round (a window narrower than the grid spacing, or the least-violating model)."""
    for _ in range(rounds):
        i = int(np.argmin(sweep.worst))
        a = sweep.scales[max(i - 1, 0)]
        b = sweep.scales[min(i + 1, sweep.scales.size - 1)]
        if not b > a:
            break
        sweep = _merge(sweep, _sweep(prob, states,
                                     np.geomspace(a, b, NARROW_POINTS + 2)[1:-1]))
        if (sweep.worst <= 0).any():
            break
    return sweep


def _infeasible(prob: Problem, states, sweep: _Sweep, search) -> ScaleWindow:
    i = int(np.argmin(sweep.worst))
    lam = float(sweep.scales[i])
    nan = float("nan")
    if sweep.option[i] < 0 or not np.isfinite(sweep.worst[i]):
        reason = ("no fluid state of the facility gives a model that meets the exact groups "
                  f"({', '.join(prob.exact)})")
        return ScaleWindow(prob.case, False, nan, nan, "", "", search, lam, math.inf, reason,
                           None, sweep.scales, sweep.worst, sweep.mismatch)
    _, vmat, lims = violations(prob, _evaluate_at(prob, states, sweep, i))
    order = np.argsort(-vmat[:, 0])
    where = (f"at the least-violating model ({format_scale(lam)}, L_m = "
             f"{prob.case.prototype.length / lam:.4g} m)")
    reason = lims[order[0]].describe(0, where)
    others = [_limit_words(lims[j]) for j in order[1:] if vmat[j, 0] > 1e-9]
    if others:
        reason += "; also violated there: " + ", ".join(dict.fromkeys(others))
    return ScaleWindow(prob.case, False, nan, nan, "", "", search, lam,
                       float(sweep.worst[i]), reason, None, sweep.scales, sweep.worst,
                       sweep.mismatch)


__all__ = ["END_TOLERANCE", "ScalePoint", "ScaleWindow", "model_at_scale", "scale_window",
           "state_grids"]

"""The search: model scale, speed and fluid state for a case, inside the facility.

The solver works in four continuous variables and one discrete one (the candidates of
:mod:`similitude.planning.candidates`):

* the fluid (one of the facility's admissible fluids, ``fluids_props`` catalogue),
* its temperature T [K] and the static pressure p [Pa] at the model (where the facility sets
  them: pressurised or cryogenic tunnels, cavitation tunnels),
* the length scale lambda = L_p / L_m [-],
* the velocity ratio V_m / V_p [-] (and, for a propeller, the rotation rate n_m, which keeps the
  advance ratio J = V_A / (n D) of the prototype).

The first exact group with a speed exponent fixes the velocity ratio in closed form
(:func:`similitude.planning.candidates.evaluate`); Froude similitude gives
V_m = V_p / sqrt(lambda) [1]_. Every further exact group is a residual ``r = ln(G_m / G_p)``
that must vanish; it is solved for one continuous variable (pressure first, then temperature,
then scale, then speed) by a vectorised bracket search over a grid and bisection to machine
precision, so exact groups hold to better than 1e-9 relative. Among the exact solutions the
facility limits of :mod:`similitude.planning.limits` select the admissible ones, and the
objective picks one: the largest model (default; least Reynolds mismatch in free-surface
tests), the smallest, or the least log-mismatch of the groups only reported. Fine line
searches along each free variable repair the grid's resolution; the admissible boundary in
scale and interior optima of the mismatch are then found by batched bracket narrowing (one
array evaluation of 32 points a round).

Practitioners build models to round scales, so for the largest- and smallest-model
objectives the limiting scale is then replaced by the nearest convenient one that still
satisfies every limit (:func:`convenient_scale`, rounded towards a smaller model for
``largest_model``; common practice) and the case is re-solved at that fixed scale, so the exact
groups stay exact to 1e-9; the limiting scale is kept in ``Solution.limiting_scale``
(``MatchRequest.round_scale`` switches this off).

When the exact groups cannot all be met inside the facility the request is refused by
default: :class:`~similitude.errors.InfeasibleError` names the binding limit and its excess
and what relaxing would give (the dropped group and its mismatch ratio). When the request
allows it (``MatchRequest.relax``, case-file key ``matching.relax``), the lowest-priority
exact group is dropped instead, the others stay exact and its log-mismatch is minimised; the
Solution records why (``Solution.relaxed``) and the plan says so loudly.

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
from dataclasses import dataclass, replace

import numpy as np

from fluids_props import FluidState
from similitude.errors import InfeasibleError, InputError
from similitude.planning.candidates import (
    AXES,
    AXIS_WORDS,
    FREE_GROUPS,
    Candidates,
    FluidOption,
    Problem,
    TooManyResiduals,
    build_problem,
    candidate_at,
    evaluate,
    group_value,
    map_state,
    mismatch,
    model_groups,
    model_state,
    residuals,
    scale_bounds,
    violations,
)
from similitude.planning.case import Case
from similitude.planning.solution import Solution
from similitude.units import format_scale

#: Default number of grid candidates of :func:`solve`.
DEFAULT_CANDIDATES = 20000

#: The order in which the free variables are tried to solve a residual exact group.
_SOLVE_PREFERENCE = ("p", "T", "lam", "V")


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
    free = [k for k in AXES if k != skip and opt.axes[k].free
            and (k != "V" or prob.speed_group is None)]
    sizes = {k: 1 for k in AXES}
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
    for k in AXES:
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

    return map_state(st, r, temperature_si=T)


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
    return {k: a for k, a in zip(AXES, arrays, strict=True) if k != skip}


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
    rng = ", ".join(AXIS_WORDS[k] for k in free) or "no free variable"
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
    solved = sol.solved_request if sol.solved_request is not None else req
    if not req.round_scale or req.scale is not None or req.model_length is not None:
        return sol
    if sol.relaxed and solved.objective == "least_mismatch":
        groups = ", ".join(g for g, _ in sol.relaxed)
        return replace(sol, limiting_scale=sol.scale, limiting_binding=sol.binding,
                       scale_rounding=f"not rounded: the scale minimises the mismatch of the "
                                      f"relaxed group ({groups}), which a rounded scale "
                                      "would raise")
    if (solved.objective not in ("largest_model", "smallest_model")
            or sol.solved_by == AXIS_WORDS["lam"]):
        return sol
    direction = "up" if solved.objective == "largest_model" else "down"
    lam_lo, lam_hi = scale_bounds(case)
    lam0 = sol.scale
    searched = sol.candidates_searched
    tried = []
    for i in range(_ROUNDING_TRIES):
        lam = convenient_scale(lam0, direction, i)
        if not (math.isfinite(lam) and lam_lo * (1 - 1e-12) <= lam <= lam_hi * (1 + 1e-12)):
            break
        if abs(lam - lam0) <= 1e-7 * lam0:  # already convenient to the solver's precision
            return replace(sol, limiting_scale=lam0, limiting_binding=sol.binding)
        fixed = replace(case, request=replace(solved, scale=lam, round_scale=False,
                                              relax=False))
        try:
            new = _solve_relaxing(fixed, n_candidates)
        except (InfeasibleError, InputError) as exc:
            tried.append(f"{format_scale(lam, 6)} ({exc})")
            continue
        return replace(new, limiting_scale=lam0, limiting_binding=sol.binding,
                       scale_rounding=f"rounded {direction} from the limiting "
                                      f"{format_scale(lam0, 6)} to the convenient "
                                      f"{format_scale(lam, 6)}",
                       # The relaxation happened at the limiting scale: it stays on record.
                       relaxed=sol.relaxed or new.relaxed,
                       solved_request=(sol.solved_request if sol.solved_request is not None
                                       else new.solved_request),
                       objective=sol.objective,
                       binding=f"{sol.binding}; scale rounded {direction} to the convenient "
                               f"{format_scale(lam, 6)} (limiting {format_scale(lam0, 6)})",
                       candidates_searched=searched + new.candidates_searched)
    why = "; ".join(tried) if tried else "no convenient scale inside the search range"
    return replace(sol, limiting_scale=lam0, limiting_binding=sol.binding,
                   scale_rounding=f"not rounded: {why}")


def solve(case: Case, n_candidates: int = DEFAULT_CANDIDATES) -> Solution:
    """Choose the model scale, speed ratio, fluid and state for a case.

    For the largest- and smallest-model objectives the limiting scale found by the search is
    then replaced by the nearest convenient scale that still satisfies every limit
    (:func:`convenient_scale`; ``MatchRequest.round_scale``), re-solved at that fixed scale;
    ``Solution.limiting_scale`` keeps the unrounded value and ``Solution.scale_rounding``
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
    if not case.request.exact:
        # A report-only plan (fixed scale, no exact group): the model speed is free and is
        # chosen to minimise the mismatch of the reported groups.
        case = replace(case, request=replace(case.request, objective="least_mismatch"))
    return _round_scale(case, _solve_relaxing(case, n_candidates), n_candidates)


def _solve_relaxing(case: Case, n_candidates: int) -> Solution:
    """The solve at the limiting scale; when the exact groups cannot all be met, drop the
    last one if the request allows it (``relax``), or refuse naming what dropping would
    give."""
    try:
        prob = build_problem(case)
        return _solve_problem(prob, n_candidates)
    except (InfeasibleError, TooManyResiduals) as exc:
        req = case.request
        hard = [g for g in req.exact if g not in FREE_GROUPS]
        if len(hard) < 2:
            raise
        # Keep the higher-priority groups exact; minimise the mismatch of the dropped one.
        dropped = hard[-1]
        relaxed = replace(req, exact=tuple(g for g in req.exact if g != dropped),
                          report=(dropped,), objective="least_mismatch")
        if not req.relax:
            raise type(exc)(_refusal(case, relaxed, dropped, exc, n_candidates)) from None
        sol = _solve_relaxing(replace(case, request=relaxed), n_candidates)
        return replace(sol, relaxed=sol.relaxed + ((dropped, str(exc)),),
                       solved_request=(sol.solved_request if sol.solved_request is not None
                                       else relaxed))


def dropped_group_ratio(case: Case, sol: Solution, group: str) -> float:
    """Prototype over model value of ``group`` at the design speed for a solution of
    ``case`` (the request actually solved), e.g. the mismatch of a relaxed group [-]."""
    prob = build_problem(case)
    c = candidate_at(prob, sol)
    gm = float(model_groups(prob, c, prob.design, (group,))[group][0])
    gp = float(np.ravel(group_value(group, prob.proto, prob.propeller))[prob.design])
    return gp / gm if gm else float("inf")


def _refusal(case: Case, relaxed, dropped: str, exc: Exception, n_candidates: int) -> str:
    """The refusal of a request whose exact groups cannot all be met: the binding reason and
    what relaxing would give (the dropped group's mismatch at the design speed)."""
    names = [repr(g) for g in case.request.exact]
    groups = ", ".join(names[:-1]) + " and " + names[-1]
    kept = ", ".join(relaxed.exact)
    head = (f"matching.exact: {groups} cannot all be matched exactly in "
            f"{case.facility.name}: {str(exc).removeprefix('match.exact: ')}")
    try:
        sol = _solve_relaxing(replace(case, request=relaxed), n_candidates)
        ratio = dropped_group_ratio(replace(case, request=sol.solved_request or relaxed), sol,
                                    dropped)
        would = (f"relaxing would keep {kept} exact and give {dropped} a prototype/model "
                 f"ratio of {ratio:.4g} at the design speed ({format_scale(sol.scale, 6)})")
    except (InfeasibleError, InputError) as second:
        would = f"relaxing would not help either: with {kept} alone, {second}"
    return (f"{head}; {would}; set relax = true under [matching] to plan with {dropped} "
            "minimised instead, or remove it from exact")


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
                no_root.append((opt, r, f" (solving by {AXIS_WORDS[axis]})"))
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
    axes = [k for k in AXES if k != pick.solve_axis and opt.axes[k].free
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
    """The active facility limits at the solution (within 1e-7 relative), in words, with the
    limit each one meets (e.g. "model rotation rate (dynamometer maximum)"), and the facility
    temperature or pressure where the solution sits at an end of its range."""
    c = _eval_at(prob, opt, point)
    _, vmat, lims = violations(prob, c)
    fixed = ""
    if not opt.axes["lam"].free:
        fixed = "fixed scale" if prob.case.request.scale is not None else \
            "existing model length"
    active = [f"{lims[j].name} ({lims[j].limit_words})" for j in np.argsort(-vmat[:, 0])
              if vmat[j, 0] > -1e-7] if vmat.size else []
    active += _axis_ends(prob, opt, point)
    active = list(dict.fromkeys(active))
    if fixed:
        return fixed + (" (active limits: " + "; ".join(active) + ")" if active else "")
    if not active:
        return "scale range of the search (no facility limit active)"
    return "; ".join(active)


def _axis_ends(prob, opt, point) -> list[str]:
    """The facility's temperature or pressure at an end of its range at ``point``, in words
    (a tunnel run at its highest pressure sets the speed the exact groups allow)."""
    fac = prob.case.facility
    out = []
    if not any(g in ("reynolds", "mach", "weber", "cavitation") for g in prob.exact):
        return out  # no exact group depends on the fluid state: its end binds nothing
    for axis, what, unit, scale in (("p", "static pressure", "kPa", 1e-3),
                                    ("T", "fluid temperature", "degC", None)):
        ax = opt.axes[axis]
        if not ax.free:
            continue
        v = point[axis]
        for end, word in ((ax.high, "maximum"), (ax.low, "minimum")):
            if abs(v - end) <= 1e-7 * abs(end):
                shown = f"{v * scale:.4g} {unit}" if scale else f"{v - 273.15:.4g} {unit}"
                where = "air pressure above the water" if axis == "p" and fac.free_surface \
                    else what
                out.append(f"{where} at the facility {word} {shown}")
    return out


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
        solved_by=AXIS_WORDS.get(solve_axis, "") if solve_axis else "",
        static_pressure=p, fluid_name=opt.name,
    )


__all__ = [
    "DEFAULT_CANDIDATES",
    "GridResult",
    "convenient_scale",
    "dropped_group_ratio",
    "search_grid",
    "solve",
]

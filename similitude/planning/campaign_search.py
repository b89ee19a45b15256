"""Choosing the facilities of a campaign: every candidate's scale window, the scale groups of
shared models, and the best combination of facilities by the campaign's objective.

:func:`evaluate_candidates` gives each candidate facility of a test its admissible scale window
(:func:`similitude.planning.scale_window.scale_window`) and its figures at the largest model it
admits: model Reynolds number and its ratio to full scale, the tightest margins of its checks
and the facility hours of the run matrix. The work shared across candidates is done once: the
test's case is read once and only its facility changes; each window is one vectorised sweep
of the scale axis and two rounds of batched narrowing, not a search per scale.

A model shared by several tests must fit every facility it visits, so its admissible scales
are the intersection of the windows [max of the smallest admissible scales, min of the
largest]. Models used together in one test (a hull and the propeller fitted to it) are built
to one scale and form one *scale group*. :func:`choose_facilities` searches the combinations of
candidates of a group's tests exhaustively (one numpy evaluation over all of them, up to
:data:`MAX_COMBINATIONS`; beyond that the best candidates of each test by its own figures are
kept), ranks them by the objective on the candidates' own figures (ties: fewer facilities,
then the other figures), then re-evaluates the best
:data:`EXACT_COMBINATIONS` at their shared, rounded scale (model at that scale, hours of its run
matrix) and picks the best of those. When no combination gives a common scale the campaign is
refused with the two limits that conflict and what each facility alone admits.

The shared scale is the largest model all chosen facilities admit, rounded to a convenient
scale inside the shared window (:func:`similitude.planning.solver.convenient_scale`, common
practice), and checked against every hard limit of every test.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from similitude.errors import InfeasibleError, InputError, OutOfRangeError
from similitude.planning.campaign import Campaign, CampaignTest
from similitude.planning.candidates import build_problem, model_groups, prototype_state
from similitude.planning.facilities import Facility
from similitude.planning.matrix import facility_time_hours, matrix_columns
from similitude.planning.scale_window import (
    ScalePoint,
    ScaleWindow,
    model_at_scale,
    scale_window,
    state_grids,
)
from similitude.planning.solver import convenient_scale
from similitude.units import format_scale

#: Largest number of facility combinations of one scale group searched exhaustively.
MAX_COMBINATIONS = 20_000
#: Combinations re-evaluated exactly at their shared, rounded scale before the choice.
EXACT_COMBINATIONS = 6
#: Convenient scales tried above the limiting one before it is kept as it is.
ROUNDING_TRIES = 3
#: Checks listed as a candidate's key margins (the tightest ones).
KEY_MARGINS = 3


# --------------------------------------------------------------------------------------------
# One test in one candidate facility
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class CandidateFacility:
    """One candidate facility of one test, with its window and its figures at the largest
    model it admits.

    Attributes
    ----------
    test : CampaignTest
    index : int
        Position in ``test.facilities``.
    facility : Facility
    file : str
        The facility file as written (or the facility's name).
    window : ScaleWindow or None
        None when the test cannot be planned in this facility at all (``refused``).
    refused : str
        Why the test cannot be planned here at all ("" otherwise).
    hours : float
        Facility time of the run matrix at the largest model [h] (NaN when not feasible).
    reynolds_model, reynolds_ratio : float
        Model Reynolds number at the design speed and prototype/model ratio [-] at the
        largest model (NaN when not feasible).
    margins : tuple of (str, float)
        The tightest hard limits at the largest model: (limit, relative margin [-]).
    """

    test: CampaignTest
    index: int
    facility: Facility
    file: str
    window: ScaleWindow | None
    refused: str = ""
    hours: float = math.nan
    reynolds_model: float = math.nan
    reynolds_ratio: float = math.nan
    margins: tuple[tuple[str, float], ...] = ()

    @property
    def feasible(self) -> bool:
        """The facility admits some model for this test."""
        return self.window is not None and self.window.feasible

    @property
    def low(self) -> float:
        """Smallest admissible scale (largest model) [-]; NaN when not feasible."""
        return self.window.low if self.feasible else math.nan

    @property
    def high(self) -> float:
        """Largest admissible scale (smallest model) [-]; NaN when not feasible."""
        return self.window.high if self.feasible else math.nan

    @property
    def mismatch(self) -> float:
        """Squared log-mismatch of the reported groups at the largest model [-]."""
        return self.window.largest.mismatch if self.feasible else math.nan

    @property
    def why_not(self) -> str:
        """Not feasible: why, in words ("" when feasible)."""
        if self.refused:
            return self.refused
        return "" if self.feasible else self.window.reason

    def label(self) -> str:
        """The facility's name, and its file when that differs."""
        name = self.facility.name
        return name if self.file in ("", name) else f"{name} ({self.file})"


def evaluate_candidates(test: CampaignTest) -> tuple[CandidateFacility, ...]:
    """Every candidate facility of ``test`` with its window and figures (see
    :class:`CandidateFacility`).

    Raises
    ------
    InputError
        When the test cannot be planned in any of its candidates for the same reason (a
        problem of the test itself, not of a facility).
    """
    errors = []
    try:  # one prototype in every candidate facility: its fluid state once
        state = prototype_state(test.case)
    except (InputError, OutOfRangeError):
        state = None  # the problem is reported by each candidate below
    problems: list = []
    for fac in test.facilities:
        try:
            problems.append(build_problem(test.case_in(fac), state))
        except (InputError, OutOfRangeError) as exc:
            errors.append(exc)
            problems.append(exc)
    # the model-fluid properties of every candidate's state grid in one call per fluid
    grids = iter(state_grids([p for p in problems if not isinstance(p, Exception)]))
    out = []
    for k, (fac, file, prob) in enumerate(zip(test.facilities, test.facility_files, problems,
                                              strict=True)):
        if isinstance(prob, Exception):
            out.append(CandidateFacility(test, k, fac, file, None, refused=_text(prob)))
            continue
        try:
            window = scale_window(prob.case, prob, states=next(grids))
        except (InputError, OutOfRangeError) as exc:
            errors.append(exc)
            out.append(CandidateFacility(test, k, fac, file, None, refused=_text(exc)))
            continue
        out.append(_with_figures(CandidateFacility(test, k, fac, file, window), window))
    if errors and len(errors) == len(out):
        lines = [_text(e) for e in errors]
        if len(set(lines)) == 1:  # the same problem in every facility: the test's own
            raise InputError([f"test {test.name!r}: {line}" for line in
                              (errors[0].problems if isinstance(errors[0], InputError)
                               else lines[:1])])
    return tuple(out)


def _text(exc: Exception) -> str:
    return "; ".join(exc.problems) if isinstance(exc, InputError) else str(exc)


def _with_figures(cand: CandidateFacility, window: ScaleWindow) -> CandidateFacility:
    if not window.feasible:
        return cand
    pt = window.largest
    re_m, re_ratio = reynolds_figures(pt)
    return replace(cand, hours=hours_at(window.case, pt), reynolds_model=re_m,
                   reynolds_ratio=re_ratio, margins=key_margins(pt))


def hours_at(case, point: ScalePoint) -> float:
    """Facility time [h] of the run matrix of ``case`` for the model ``point``."""
    try:
        return facility_time_hours(matrix_columns(case, point.solution)[0])
    except InputError:  # a matrix the facility cannot run (too many rows): no figure
        return math.nan


def reynolds_figures(point: ScalePoint) -> tuple[float, float]:
    """(model Reynolds number, prototype/model ratio) at the design speed [-]."""
    prob = point.problem
    re_m = float(model_groups(prob, point.candidate, prob.design, ("reynolds",))
                 ["reynolds"][0])
    re_p = float(np.ravel(prob.proto_groups["reynolds"])[prob.design])
    return re_m, (re_p / re_m if re_m > 0 else math.nan)


def key_margins(point: ScalePoint) -> tuple[tuple[str, float], ...]:
    """The tightest hard limits of a model: (limit, margin [-]), smallest margin first."""
    rows = [(c.name, c.margin) for c in point.checks if math.isfinite(c.margin)]
    rows.sort(key=lambda r: r[1])
    return tuple(rows[:KEY_MARGINS])


# --------------------------------------------------------------------------------------------
# Scale groups
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class ScaleGroup:
    """Models built to one scale and the tests that use them.

    Attributes
    ----------
    models : tuple of str
        The models (a test's own model is named after the test).
    tests : tuple of CampaignTest
        Every test using one of the models, in campaign order.
    fixed_scale : float or None
        The scale of an existing model in the group [-], if any.
    shared : bool
        More than one test uses the group's models.
    """

    models: tuple[str, ...]
    tests: tuple[CampaignTest, ...]
    fixed_scale: float | None = None

    @property
    def shared(self) -> bool:
        return len(self.tests) > 1

    def label(self) -> str:
        return " + ".join(repr(m) for m in self.models)


def scale_groups(campaign: Campaign) -> tuple[ScaleGroup, ...]:
    """The scale groups of a campaign: models joined when one test uses them together.

    Raises
    ------
    InputError
        Two existing models of one group with different scales; a model length for a model
        no test uses as its main model (its scale is then unknown).
    """
    parent: dict[str, str] = {}

    def root(a: str) -> str:
        while parent.setdefault(a, a) != a:
            a = parent[a]
        return a

    for t in campaign.tests:
        names = t.model_names()
        for other in names[1:]:
            parent[root(other)] = root(names[0])
    members: dict[str, list[str]] = {}
    for t in campaign.tests:
        for name in t.model_names():
            members.setdefault(root(name), [])
            if name not in members[root(name)]:
                members[root(name)].append(name)
    groups = []
    for key, models in members.items():
        tests = tuple(t for t in campaign.tests if root(t.model_names()[0]) == key)
        groups.append(ScaleGroup(tuple(models), tests, _fixed_scale(campaign, models)))
    return tuple(groups)


def _fixed_scale(campaign: Campaign, models: list[str]) -> float | None:
    scales = []
    for name in models:
        m = campaign.model(name)
        if m is None:
            continue
        i = campaign.models.index(m)
        if m.scale is not None:
            scales.append((m.scale, f"model[{i}].scale"))
        elif m.model_length is not None:
            main = next((t for t in campaign.tests if t.models and t.models[0] == name), None)
            if main is None:
                raise InputError(f"model[{i}].length: no test uses {name!r} as its main model, "
                                 "so its prototype length is unknown; expected its scale "
                                 "instead")
            scales.append((main.case.prototype.length / m.model_length, f"model[{i}].length"))
    for lam, where in scales[1:]:
        if abs(lam / scales[0][0] - 1) > 1e-9:
            raise InputError(f"{where}: gives {format_scale(lam)}, but {scales[0][1]} gives "
                             f"{format_scale(scales[0][0])} for models built to one scale; "
                             "expected one scale")
    return scales[0][0] if scales else None


def with_fixed_scale(test: CampaignTest, scale: float) -> CampaignTest:
    """The test with its model's scale fixed (an existing model)."""
    req = replace(test.case.request, scale=scale, model_length=None)
    return replace(test, case=replace(test.case, request=req))


# --------------------------------------------------------------------------------------------
# Combinations of facilities
# --------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class Combination:
    """One facility for each test of a scale group, and the scale they share.

    Attributes
    ----------
    candidates : tuple of CandidateFacility
        One per test of the group, in the group's test order.
    low, high : float
        The shared window [-]: the largest of the tests' smallest admissible scales and the
        smallest of their largest ones.
    low_by, high_by : CandidateFacility
        The test and facility that bind each end of the shared window.
    scale : float
        The scale chosen: the largest shared model, rounded to a convenient scale inside the
        window when one fits every test (or the existing model's scale) [-].
    points : tuple of ScalePoint
        Each test's model at ``scale``.
    hours : tuple of float
        Facility time of each test's run matrix at ``scale`` [h].
    mismatch : float
        Sum over the tests of the squared log-mismatch of the reported groups [-].
    """

    candidates: tuple[CandidateFacility, ...]
    low: float
    high: float
    low_by: CandidateFacility
    high_by: CandidateFacility
    scale: float
    points: tuple[ScalePoint, ...]
    hours: tuple[float, ...]
    mismatch: float

    @property
    def total_hours(self) -> float:
        """Facility time of the tests' run matrices at the shared scale [h]."""
        return float(sum(self.hours))

    @property
    def facility_count(self) -> int:
        """Number of different facilities the combination books."""
        return len(set(c.facility for c in self.candidates))

    def key(self, objective: str) -> tuple:
        """Sort key: the objective first, then fewer facilities (one booking, the model moved
        less), then the other two figures."""
        size, hours, mis = _round(math.log(self.scale)), _round(self.total_hours), \
            _round(self.mismatch)
        n = self.facility_count
        return {"largest_model": (size, n, hours, mis), "least_mismatch": (mis, n, size, hours),
                "fewest_hours": (hours, n, size, mis)}[objective]


def _round(x: float) -> float:
    """Ties within 1e-9 relative count as equal."""
    return float(f"{x:.9e}") if math.isfinite(x) else math.inf


@dataclass(frozen=True)
class GroupChoice:
    """The facilities chosen for one scale group, with the runners-up.

    Attributes
    ----------
    group : ScaleGroup
    chosen : Combination
    ranked : tuple of Combination
        The combinations evaluated exactly, best first (``chosen`` first).
    searched : int
        Combinations of facilities searched.
    """

    group: ScaleGroup
    chosen: Combination
    ranked: tuple[Combination, ...]
    searched: int


def choose_facilities(group: ScaleGroup, candidates: dict[str, tuple[CandidateFacility, ...]],
                      objective: str) -> GroupChoice:
    """The best combination of candidate facilities for the tests of ``group``.

    Parameters
    ----------
    group : ScaleGroup
    candidates : dict
        Test name -> its candidate facilities (:func:`evaluate_candidates`).
    objective : str
        One of :data:`similitude.planning.campaign.CAMPAIGN_OBJECTIVES`.

    Raises
    ------
    InfeasibleError
        A test no candidate admits, or windows that overlap in no combination (one line per
        reason, with what each facility alone admits).
    """
    lists = []
    for t in group.tests:
        ok = [c for c in candidates[t.name] if c.feasible]
        if not ok:
            raise InfeasibleError("\n".join(_no_facility_lines(group, t, candidates[t.name])))
        lists.append(ok)
    lists = _pruned(lists, objective)
    sizes = [len(c) for c in lists]
    idx = np.indices(sizes).reshape(len(sizes), -1)
    low_m = np.stack([np.array([c.low for c in cands])[i] for cands, i in
                      zip(lists, idx, strict=True)])
    high_m = np.stack([np.array([c.high for c in cands])[i] for cands, i in
                       zip(lists, idx, strict=True)])
    low, high = low_m.max(axis=0), high_m.min(axis=0)
    ok = low <= high * (1 + 1e-9)
    if not ok.any():
        raise InfeasibleError("\n".join(_no_overlap_lines(group, lists, idx, low_m, high_m)))
    hours = sum(np.array([c.hours for c in cands])[i] for cands, i in zip(lists, idx,
                                                                           strict=True))
    # the shared scales are the tests' own largest-model ends: few distinct values
    shared, where = np.unique(low, return_inverse=True)
    mis = np.zeros(low.size)
    for cands, i in zip(lists, idx, strict=True):
        table = np.array([c.window.mismatch_at(shared) for c in cands])
        mis += table[i, np.ravel(where)]
    ids: dict[Facility, int] = {}
    fac = np.stack([np.array([ids.setdefault(c.facility, len(ids)) for c in cands])[i]
                    for cands, i in zip(lists, idx, strict=True)])
    fac = np.sort(fac, axis=0)
    count = 1 + (np.diff(fac, axis=0) != 0).sum(axis=0)
    # np.lexsort sorts by the last key first: the objective, then fewer facilities, ...
    keys = {"largest_model": (mis, hours, count, np.log(low)),
            "least_mismatch": (hours, np.log(low), count, mis),
            "fewest_hours": (mis, np.log(low), count, hours)}[objective]
    keys = tuple(np.where(ok, k, np.inf) for k in keys)
    # only the best few are needed: sort the combinations whose primary figure is within
    # the EXACT_COMBINATIONS best (ties included), not all of them
    primary = keys[-1]
    if primary.size > EXACT_COMBINATIONS:
        cut = np.partition(primary, EXACT_COMBINATIONS - 1)[EXACT_COMBINATIONS - 1]
        near = np.flatnonzero(primary <= cut)
    else:
        near = np.arange(primary.size)
    order = near[np.lexsort(tuple(k[near] for k in keys))]
    order = order[ok[order]][:EXACT_COMBINATIONS]
    memo: dict = {}  # (test, facility, scale) -> (model, hours): combinations share tests
    exact = [_exact(group, [lists[t][idx[t, j]] for t in range(len(lists))],
                    low_m[:, j], high_m[:, j], memo) for j in order]
    exact = [e for e in exact if e is not None]
    if not exact:
        raise InfeasibleError(f"models {group.label()}: no combination of facilities gives a "
                              "scale that meets every limit of every test")
    exact.sort(key=lambda e: e.key(objective))
    return GroupChoice(group, exact[0], tuple(exact), int(low.size))


def _pruned(lists, objective: str):
    """Keep the best candidates of each test by its own figures while the combinations are
    more than MAX_COMBINATIONS (the exhaustive search stays bounded)."""
    lists = [list(c) for c in lists]
    key = {"largest_model": lambda c: c.low, "least_mismatch": lambda c: c.mismatch,
           "fewest_hours": lambda c: c.hours}[objective]
    for cands in lists:
        cands.sort(key=lambda c: (key(c), c.low))
    while math.prod(len(c) for c in lists) > MAX_COMBINATIONS:
        longest = max(lists, key=len)
        longest.pop()
    return lists


def _exact(group: ScaleGroup, cands, lows, highs, memo: dict) -> Combination | None:
    """A combination evaluated at its shared, rounded scale; None when no scale of the shared
    window meets every limit of every test (a window that is not one interval)."""
    low, high = float(lows.max()), float(highs.min())
    low_by, high_by = cands[int(np.argmax(lows))], cands[int(np.argmin(highs))]
    tries = [group.fixed_scale] if group.fixed_scale is not None else \
        [convenient_scale(low, "up", i) for i in range(ROUNDING_TRIES)] + [low]
    for lam in tries:
        if not (math.isfinite(lam) and low * (1 - 1e-12) <= lam <= high * (1 + 1e-9)):
            continue
        done = []
        for c in cands:
            key = (c.test.name, c.index, lam)
            if key not in memo:
                pt = model_at_scale(c.window.case, lam, c.window.largest.problem)
                memo[key] = (pt, hours_at(c.window.case, pt) if pt.admissible else math.nan)
            if not memo[key][0].admissible:
                break
            done.append(memo[key])
        else:
            points = tuple(pt for pt, _ in done)
            return Combination(tuple(cands), low, high, low_by, high_by, lam, points,
                               tuple(h for _, h in done),
                               float(sum(pt.mismatch for pt in points)))
    return None


# --------------------------------------------------------------------------------------------
# Refusals
# --------------------------------------------------------------------------------------------
def _no_facility_lines(group: ScaleGroup, test: CampaignTest, cands) -> list[str]:
    what = "no candidate facility can take it"
    if group.fixed_scale is not None:
        what = f"the existing model ({format_scale(group.fixed_scale, 6)}) fits no candidate"
    lines = [f"test {test.name!r} ({test.kind.replace('_', '-')}): {what}"]
    lines += [f"  {c.label()}: {c.why_not}" for c in cands]
    return lines


def _no_overlap_lines(group: ScaleGroup, lists, idx, low_m, high_m) -> list[str]:
    """The closest combination's conflict (the two limits, by test and facility) and what
    each candidate alone admits."""
    gap = np.log(low_m.max(axis=0)) - np.log(high_m.min(axis=0))
    j = int(np.argmin(gap))
    t_lo, t_hi = int(np.argmax(low_m[:, j])), int(np.argmin(high_m[:, j]))
    a, b = lists[t_lo][idx[t_lo, j]], lists[t_hi][idx[t_hi, j]]
    what = "an existing model" if group.fixed_scale is not None else "one model"
    lines = [
        f"models {group.label()}: the scale windows of the facilities do not overlap, so "
        f"{what} cannot serve every test",
        f"  {a.test.name!r} in {a.label()} takes models as large as "
        f"{format_scale(a.low, 6)} at most (a larger one breaks the {a.window.low_limit}), "
        f"but {b.test.name!r} in {b.label()} takes models as small as "
        f"{format_scale(b.high, 6)} at least (a smaller one breaks the "
        f"{b.window.high_limit})",
    ]
    if group.fixed_scale is not None:
        lines[1] = (f"  the existing model is {format_scale(group.fixed_scale, 6)}; " +
                    lines[1].strip())
    lines.append("  what each facility alone admits:")
    for cands in lists:
        for c in cands:
            lines.append(f"    {c.test.name!r} in {c.label()}: {c.window.text()}")
    return lines


__all__ = [
    "EXACT_COMBINATIONS",
    "MAX_COMBINATIONS",
    "CandidateFacility",
    "Combination",
    "GroupChoice",
    "ScaleGroup",
    "choose_facilities",
    "evaluate_candidates",
    "hours_at",
    "key_margins",
    "reynolds_figures",
    "scale_groups",
    "with_fixed_scale",
]

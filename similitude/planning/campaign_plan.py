"""Planning a campaign: facilities chosen, shared model scales, each test's plan and the booking.

``plan_campaign(campaign)`` evaluates every candidate facility of every test
(:mod:`similitude.planning.campaign_search`: scale window, largest model, Reynolds number,
margins, hours), chooses the facilities of each scale group by the campaign's objective,
plans each test (:func:`similitude.planning.planner.plan`) at its group's shared scale (a test
with a model of its own is planned as a case on its own) and books them
(:mod:`similitude.planning.booking`). It returns a frozen :class:`CampaignPlan` with tables
(pandas DataFrames, units in the column headers) for the notebook, the workbook writer and the
command line.

Example
-------
>>> import similitude as sim                                         # doctest: +SKIP
>>> cp = sim.plan_campaign(sim.load_campaign("demo_cases/coastal_campaign.toml"))
>>> cp.rankings["seakeeping"]                                        # doctest: +SKIP
"""

from __future__ import annotations

import html
import math
from dataclasses import dataclass, replace

import pandas as pd

from similitude.cautions import plan_caution
from similitude.errors import InputError
from similitude.plain_data import plain
from similitude.planning.booking import Booking, book, booking_order
from similitude.planning.campaign import Campaign
from similitude.planning.campaign_search import (
    CandidateFacility,
    Combination,
    GroupChoice,
    choose_facilities,
    evaluate_candidates,
    scale_groups,
    with_fixed_scale,
)
from similitude.planning.planner import Plan, plan
from similitude.units import format_scale

#: What each objective ranks by, in words.
OBJECTIVE_WORDS = {
    "largest_model": "the largest admissible model",
    "least_mismatch": "the least mismatch of the reported groups (the Reynolds number)",
    "fewest_hours": "the fewest facility hours",
}

#: Columns of the candidate and ranking tables, in order.
CANDIDATE_COLUMNS = (
    "test", "kind", "rank", "facility", "file", "feasible", "chosen", "largest model",
    "lambda, largest model [-]", "model length [m]", "binding at the largest model",
    "smallest model", "lambda, smallest model [-]", "binding at the smallest model",
    "model Reynolds number [-]", "Re prototype / Re model [-]", "key margins",
    "facility hours [h]", "why not", "excess of the worst limit [-]",
)


@dataclass(frozen=True)
class CampaignPlan:
    """A planned campaign: the result of :func:`plan_campaign`.

    Attributes
    ----------
    campaign : Campaign
        The campaign as given.
    candidates : pandas.DataFrame
        One row per test and candidate facility (:data:`CANDIDATE_COLUMNS`): feasible or not
        (why, and the excess of the worst limit), the largest and smallest models it admits
        with the limit binding each, model Reynolds number and its ratio to full scale, the
        tightest margins and the facility hours at the largest model, its rank by the
        objective and whether it was chosen.
    rankings : dict of str to pandas.DataFrame
        By test name: its candidates ordered by the objective (feasible first, best first).
    combinations : pandas.DataFrame
        One row per combination of facilities evaluated at its shared scale, for each group of
        models built to one scale: the facilities, the shared window and what binds each end,
        the scale, hours and mismatch; the chosen one first.
    choices : tuple of GroupChoice
        The chosen combination of each scale group, with the runners-up.
    plans : dict of str to Plan
        Each test's plan in its chosen facility, at its group's scale.
    labels : dict of str to str
        Each test's label in booking order ("T1", "T2", ...).
    booking : Booking
        Tests in booking order with hours and working days, hours per facility, models to
        build.
    reasons : tuple of str
        Why each facility and scale was chosen, in words.
    notes : tuple of str
        What the campaign assumed.
    caution : str
        The cautions every output of the campaign carries.
    """

    campaign: Campaign
    candidates: object
    rankings: dict
    combinations: object
    choices: tuple[GroupChoice, ...]
    plans: dict
    labels: dict
    booking: Booking
    reasons: tuple[str, ...]
    notes: tuple[str, ...]
    caution: str

    @property
    def objective(self) -> str:
        """How the facilities were chosen (``Campaign.objective``)."""
        return self.campaign.objective

    @property
    def bookings(self):
        """Tests in booking order (``booking.tests``)."""
        return self.booking.tests

    @property
    def facility_hours(self):
        """Hours per facility with the changeovers (``booking.facilities``)."""
        return self.booking.facilities

    @property
    def models(self):
        """Models to build, one row each (``booking.models``)."""
        return self.booking.models

    def to_excel(self, path, overwrite: bool = False):
        """Write the campaign workbook (``similitude.report.campaign_workbook``); returns the
        Path. Refuses to overwrite an existing file unless ``overwrite=True``."""
        # A notebook convenience only: the report stage sits above planning, so it is imported
        # on call (the command calls the writer directly).
        from similitude.report.campaign_workbook import write_campaign

        return write_campaign(self, path, overwrite=overwrite)

    def to_dict(self) -> dict:
        """The campaign as JSON-ready plain data (SI values, unit-bearing keys)."""
        def frame(df):
            return [{str(k): plain(v) for k, v in row.items()}
                    for row in df.to_dict(orient="records")]

        return {
            "campaign": self.campaign.name,
            "objective": self.objective,
            "caution": self.caution,
            "reasons": list(self.reasons),
            "models": frame(self.models),
            "bookings": frame(self.bookings),
            "facility_hours": frame(self.facility_hours),
            "candidates": frame(self.candidates),
            "combinations": frame(self.combinations),
            "notes": list(self.notes),
            "plans": {self.labels[name]: p.to_dict() for name, p in self.plans.items()},
        }

    def summary_lines(self) -> list[str]:
        """A few lines for a person: models, chosen facilities, hours and the reasons."""
        c = self.campaign
        lines = [f"{c.name}: {len(c.tests)} tests, facilities chosen by "
                 f"{OBJECTIVE_WORDS[self.objective]}"]
        for _, m in self.models.iterrows():
            lines.append(f"  model {m['model']!r:<18} {m['scale']:<8} "
                         f"{m['model length [m]']:.4g} m ({m['role']}; {m['tests']})")
        for _, b in self.bookings.iterrows():
            lines.append(f"  {b['label']:<3} {b['test']:<18} {b['facility']:<34} "
                         f"{b['booked hours [h]']:6.1f} h  days {b['first day']}-{b['last day']}")
        total = float(self.facility_hours["booked hours [h]"].sum())
        last = int(self.bookings["last day"].max()) if len(self.bookings) else 0
        lines.append(f"  booked          {total:.1f} h in {len(self.facility_hours)} "
                     f"facilities, {last} working days")
        lines += ["  " + r for r in self.reasons]
        return lines

    def __repr__(self) -> str:
        return "\n".join(self.summary_lines() + [self.caution])

    def _repr_html_(self) -> str:
        def table(df, cols=None):
            return (df if cols is None else df[[c for c in cols if c in df]]).to_html(
                index=False, float_format=lambda v: f"{v:.4g}", na_rep="")

        ranks = "".join(
            f"<h4>Candidates for {html.escape(name)}</h4>"
            + table(df, ("rank", "facility", "feasible", "chosen", "largest model",
                         "model length [m]", "binding at the largest model",
                         "Re prototype / Re model [-]", "key margins",
                         "facility hours [h]", "why not"))
            for name, df in self.rankings.items())
        reasons = "".join(f"<li>{html.escape(r)}</li>" for r in self.reasons)
        return (f"<div><p><b>{html.escape(self.campaign.name)}</b>: facilities chosen by "
                f"{html.escape(OBJECTIVE_WORDS[self.objective])}</p>"
                f"<p><i>{html.escape(self.caution)}</i></p>"
                f"<h4>Models to build</h4>{table(self.models)}"
                f"<h4>Booking</h4>{table(self.bookings)}"
                f"<h4>Hours per facility</h4>{table(self.facility_hours)}"
                f"<h4>Why</h4><ul>{reasons}</ul>{ranks}</div>")


def plan_campaign(campaign: Campaign) -> CampaignPlan:
    """Choose the facilities of a campaign, the shared model scales, plan and book every test.

    Parameters
    ----------
    campaign : Campaign

    Returns
    -------
    CampaignPlan

    Raises
    ------
    InputError
        A test that cannot be planned in any facility for a reason of its own, or two
        existing models of one scale group with different scales.
    InfeasibleError
        A test no candidate facility admits, or shared models whose facilities' scale windows
        do not overlap in any combination: one line per reason, naming the two limits that
        conflict (by test and facility) and what each facility alone admits.
    """
    if not isinstance(campaign, Campaign):
        raise InputError(f"campaign: got {type(campaign).__name__}; expected a similitude "
                         "Campaign")
    groups = scale_groups(campaign)
    cands: dict[str, tuple[CandidateFacility, ...]] = {}
    choices = []
    for g in groups:
        tests = [t if g.fixed_scale is None else with_fixed_scale(t, g.fixed_scale)
                 for t in g.tests]
        g = replace(g, tests=tuple(tests))
        for t in tests:
            cands[t.name] = evaluate_candidates(t)
        choices.append(choose_facilities(g, cands, campaign.objective))
    order = booking_order(campaign.tests)
    labels = {t.name: f"T{i}" for i, t in enumerate(order, 1)}
    plans = _plans(choices)
    booking = book(campaign, order, plans, labels)
    chosen = {c.test.name: c for ch in choices for c in ch.chosen.candidates}
    rankings = {t.name: _ranking(cands[t.name], chosen[t.name], campaign.objective)
                for t in order}
    table = pd.concat(list(rankings.values()), ignore_index=True)
    reasons = tuple(r for ch in choices for r in _reasons(ch, rankings, cands,
                                                            campaign.objective, plans))
    kinds = sorted({p.case.facility.kind for p in plans.values()})
    caution = " ".join(dict.fromkeys(plan_caution(k) for k in kinds))
    notes = list(booking.notes) + [
        "a shared model is built as large as every chosen facility admits, rounded to a "
        "convenient scale inside the shared window (common practice); a test with a "
        "model of its own is planned as a case on its own",
        f"combinations of facilities are ranked by {OBJECTIVE_WORDS[campaign.objective]} on "
        "each candidate's own figures; the best are planned at their shared scale and ranked "
        "again"]
    return CampaignPlan(campaign, table, rankings, _combinations(choices, labels), tuple(choices),
                        plans, labels, booking, reasons, tuple(notes), caution)


def _plans(choices) -> dict[str, Plan]:
    """Each test's plan in its chosen facility: at the shared (or existing) scale of its group,
    or as a case of its own."""
    out = {}
    for ch in choices:
        fixed = ch.group.shared or ch.group.fixed_scale is not None
        for cand in ch.chosen.candidates:
            case = cand.test.case_in(cand.facility)
            if fixed:
                req = replace(case.request, scale=ch.chosen.scale, model_length=None,
                              round_scale=False)
                case = replace(case, request=req)
            out[cand.test.name] = plan(case)
    return out


# --------------------------------------------------------------------------------------------
# Tables
# --------------------------------------------------------------------------------------------
def _candidate_row(c: CandidateFacility, chosen: CandidateFacility) -> dict:
    w = c.window
    feasible = c.feasible
    length = c.test.case.prototype.length
    return {
        "test": c.test.name, "kind": c.test.kind.replace("_", " "), "rank": None,
        "facility": c.facility.name, "file": c.file, "feasible": feasible,
        "chosen": c is chosen,
        "largest model": format_scale(w.low, 5) if feasible else "",
        "lambda, largest model [-]": w.low if feasible else math.nan,
        "model length [m]": length / w.low if feasible else math.nan,
        "binding at the largest model": w.low_limit if feasible else "",
        "smallest model": format_scale(w.high, 5) if feasible else "",
        "lambda, smallest model [-]": w.high if feasible else math.nan,
        "binding at the smallest model": w.high_limit if feasible else "",
        "model Reynolds number [-]": c.reynolds_model,
        "Re prototype / Re model [-]": c.reynolds_ratio,
        "key margins": "; ".join(f"{name} {m:.1%}" for name, m in c.margins),
        "facility hours [h]": c.hours,
        "why not": c.why_not,
        "excess of the worst limit [-]": (w.excess if w is not None and not feasible
                                          else math.nan),
    }


def _own_key(c: CandidateFacility, objective: str) -> tuple:
    """A candidate's place in its test's ranking: feasible ones by the objective (ties by the
    other figures), then the others by the excess of their worst limit."""
    if not c.feasible:
        excess = c.window.excess if c.window is not None else math.inf
        return (1, excess, 0.0, 0.0)
    size, hours, mis = math.log(c.low), c.hours, c.mismatch
    key = {"largest_model": (size, hours, mis), "least_mismatch": (mis, size, hours),
           "fewest_hours": (hours, size, mis)}[objective]
    return (0, *(k if math.isfinite(k) else math.inf for k in key))


def _ranking(cands, chosen: CandidateFacility, objective: str) -> pd.DataFrame:
    ordered = sorted(cands, key=lambda c: _own_key(c, objective))
    rows = [_candidate_row(c, chosen) for c in ordered]
    for i, row in enumerate(rows, 1):
        row["rank"] = i if row["feasible"] else None
    return pd.DataFrame(rows, columns=list(CANDIDATE_COLUMNS))


def _combinations(choices, labels) -> pd.DataFrame:
    rows = []
    for ch in choices:
        for rank, comb in enumerate(ch.ranked, 1):
            rows.append({
                "models": " + ".join(ch.group.models), "rank": rank,
                "chosen": rank == 1,
                "facilities": "; ".join(f"{labels[c.test.name]} {c.test.name}: "
                                        f"{c.facility.name}" for c in comb.candidates),
                "shared largest model": format_scale(comb.low, 6),
                "bound by": _by(comb.low_by, comb.low_by.window.low_limit),
                "shared smallest model": format_scale(comb.high, 6),
                "bound by (smallest)": _by(comb.high_by, comb.high_by.window.high_limit),
                "scale": format_scale(comb.scale),
                "facility hours [h]": comb.total_hours,
                "reported-group mismatch, sum of ln(ratio)^2 [-]": comb.mismatch,
                "combinations searched": ch.searched,
            })
    return pd.DataFrame(rows)


def _by(c: CandidateFacility, limit: str) -> str:
    return f"{c.test.name} in {c.facility.name}: {limit}"


# --------------------------------------------------------------------------------------------
# Reasons in words
# --------------------------------------------------------------------------------------------
def _figure(c: CandidateFacility, objective: str) -> str:
    if objective == "largest_model":
        return (f"{format_scale(c.low, 5)} ({c.test.case.prototype.length / c.low:.3g} m)")
    if objective == "least_mismatch":
        return f"Reynolds ratio {c.reynolds_ratio:.3g}"
    return f"{c.hours:.1f} h"


def _reasons(ch: GroupChoice, rankings, cands, objective: str, plans) -> list[str]:
    """Why the scale and each facility of a scale group were chosen, in words."""
    comb: Combination = ch.chosen
    g = ch.group
    out = []
    lam = plans[comb.candidates[0].test.name].scale
    shared = g.shared or g.fixed_scale is not None
    if shared:
        length = comb.candidates[0].test.case.prototype.length / lam
        if g.fixed_scale is not None:
            how = "the scale of the existing model"
        else:
            how = (f"the largest model every chosen facility admits is "
                   f"{format_scale(comb.low, 6)}, bound by "
                   f"{_by(comb.low_by, comb.low_by.window.low_limit)}")
            if abs(lam / comb.low - 1) > 1e-9:
                how += f"; rounded to the convenient {format_scale(lam)}"
        out.append(f"Models {g.label()} ({len(g.tests)} tests) are built to "
                   f"{format_scale(lam)} ({length:.4g} m): {how}. The smallest model they "
                   f"admit is {format_scale(comb.high, 6)}, bound by "
                   f"{_by(comb.high_by, comb.high_by.window.high_limit)}.")
    for c in comb.candidates:
        text = f"{c.test.name}: {c.facility.name}"
        others = [a for a in cands[c.test.name] if a.feasible and a.facility != c.facility]
        if not others:
            text += " is the only candidate that admits it"
        elif not shared:
            alt = min(others, key=lambda a: _own_key(a, objective))
            text += (f" offers {OBJECTIVE_WORDS[objective]}: {_figure(c, objective)}, against "
                     f"{_figure(alt, objective)} in {alt.facility.name}")
        else:
            text += _shared_reason(ch, c, objective)
        bad = [a for a in cands[c.test.name] if not a.feasible]
        if bad:
            text += "; cannot take it: " + "; ".join(f"{a.facility.name} ({a.why_not})"
                                                     for a in bad)
        out.append(text + ".")
    return out


def _shared_reason(ch: GroupChoice, c: CandidateFacility, objective: str) -> str:
    """Why ``c`` in a shared group: what the best combination with another facility for this
    test would give instead."""
    comb = ch.chosen
    length = c.test.case.prototype.length / c.low
    alone = (f" (alone it would take a model as large as {format_scale(c.low, 5)}, "
             f"{length:.3g} m, bound by the {c.window.low_limit})")
    alt = next((a for a in ch.ranked[1:] if any(
        x.test.name == c.test.name and x.facility != c.facility for x in a.candidates)), None)
    if alt is None:
        return alone + "; every combination evaluated uses it"
    other = next(x for x in alt.candidates if x.test.name == c.test.name)
    diff = []
    if abs(alt.scale / comb.scale - 1) > 1e-9:
        diff.append(f"a shared model of {format_scale(alt.scale)} instead of "
                    f"{format_scale(comb.scale)}")
    if alt.facility_count != comb.facility_count:
        diff.append(f"{alt.facility_count} facilities to book instead of "
                    f"{comb.facility_count}")
    if f"{alt.total_hours:.1f}" != f"{comb.total_hours:.1f}":
        diff.append(f"{alt.total_hours:.1f} h of tests instead of {comb.total_hours:.1f} h")
    if abs(alt.mismatch - comb.mismatch) > 1e-6 * max(1.0, comb.mismatch) and \
            objective == "least_mismatch":
        diff.append(f"a summed squared log-mismatch of {alt.mismatch:.4g} instead of "
                    f"{comb.mismatch:.4g}")
    return (alone + f"; with {other.facility.name} instead the best combination gives "
            + (", ".join(diff) if diff else "the same figures"))


__all__ = ["CANDIDATE_COLUMNS", "OBJECTIVE_WORDS", "CampaignPlan", "plan_campaign"]

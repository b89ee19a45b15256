"""The booking plan of a campaign: tests in their natural order, hours per facility with the
changeovers, a simple working-day calendar and the models to build.

Each test is booked for the facility time of its run matrix
(:func:`similitude.planning.matrix.facility_time_hours`) plus one changeover before it
(rigging the model, instrumentation, calibration; ``Campaign.changeover``). Tests are taken in
the natural order of :data:`similitude.planning.campaign.NATURAL_ORDER` (resistance, open
water, self-propulsion, seakeeping, cavitation, wind tunnel; the campaign's own order within a
kind). A test starts when its facility is free and its model is back from the test before
(one model cannot be in two facilities at once); facilities work in parallel otherwise. Hours
become working days of ``Campaign.working_day`` hours; with a start date, days become dates
on weekdays (numpy's business-day calendar, Monday to Friday; public holidays are not known).

Models to build: one row per model with its scale, length and, for hull models, the mass to
ballast to for each loading condition, m = rho_m V_p / lambda^3 in the water of the first test
that uses the model (:func:`similitude.planning.model_build.model_build`).
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import pandas as pd

from similitude.planning.campaign import MODEL_ROLES, NATURAL_ORDER, Campaign, CampaignTest
from similitude.planning.matrix import facility_time_hours
from similitude.planning.planner import Plan
from similitude.units import format_scale


@dataclass(frozen=True)
class Booking:
    """The booking plan as tables (hours in h, days counted from 1).

    Attributes
    ----------
    tests : pandas.DataFrame
        One row per test in booking order: label, test, kind, facility, models, scale, runs,
        test hours, changeover, booked hours, first and last working day (and dates).
    facilities : pandas.DataFrame
        One row per facility booked: the tests, their hours, the changeovers, the booked hours,
        working days and the first and last day.
    models : pandas.DataFrame
        One row per model to build: role, what it represents, the tests that use it, scale,
        lambda, model length and, for hull models, the mass per loading condition.
    notes : tuple of str
        What the tables assume.
    """

    tests: object
    facilities: object
    models: object
    notes: tuple[str, ...]


def booking_order(tests: Sequence[CampaignTest]) -> list[CampaignTest]:
    """The tests in their natural order (stable: the campaign's order within a kind)."""
    return sorted(tests, key=lambda t: NATURAL_ORDER.index(t.kind))


def book(campaign: Campaign, order: Sequence[CampaignTest], plans: dict[str, Plan],
         labels: dict[str, str]) -> Booking:
    """The booking plan of the planned tests (``plans`` by test name), in ``order``."""
    day = campaign.working_day / 3600.0
    change = campaign.changeover / 3600.0
    facility_free: dict[str, float] = {}
    model_free: dict[str, float] = {}
    rows = []
    for t in order:
        plan = plans[t.name]
        fac = plan.case.facility.name
        hours = facility_time_hours(plan.matrix)
        models = t.model_names()
        start = max([facility_free.get(fac, 0.0)] + [model_free.get(m, 0.0) for m in models])
        end = start + change + hours
        facility_free[fac] = end
        for m in models:
            model_free[m] = end
        rows.append({
            "label": labels[t.name], "test": t.name, "kind": t.kind.replace("_", " "),
            "facility": fac, "models": ", ".join(models), "scale": format_scale(plan.scale),
            "runs [-]": len(plan.matrix), "test hours [h]": hours,
            "changeover [h]": change, "booked hours [h]": change + hours,
            "start [h]": start, "end [h]": end,
            "first day": int(start // day) + 1,
            "last day": max(int(math.ceil(end / day - 1e-9)), int(start // day) + 1),
        })
    tests = pd.DataFrame(rows)
    notes = [f"each test is preceded by a changeover of {change:g} h (model rigging, "
             "instrumentation, calibration; common practice)",
             f"{day:g} h of facility time per working day",
             "a test starts when its facility is free and its model is back from the test "
             "before it; facilities work in parallel otherwise"]
    if campaign.start and len(tests):
        tests["first date"] = _dates(campaign.start, tests["first day"])
        tests["last date"] = _dates(campaign.start, tests["last day"])
        notes.append(f"day 1 is {campaign.start}; working days are Monday to Friday (public "
                     "holidays not known)")
    return Booking(tests, _facility_table(tests, day), model_table(campaign, order, plans),
                   tuple(notes))


def _dates(start: str, days) -> list[str]:
    first = np.busday_offset(np.datetime64(start, "D"), 0, roll="forward")
    return [str(d) for d in np.busday_offset(first, np.asarray(days, dtype=int) - 1)]


def _facility_table(tests: pd.DataFrame, day: float) -> pd.DataFrame:
    rows = []
    for fac, g in tests.groupby("facility", sort=False):
        booked = float(g["booked hours [h]"].sum())
        rows.append({"facility": fac, "tests": ", ".join(g["label"] + " " + g["test"]),
                     "test hours [h]": float(g["test hours [h]"].sum()),
                     "changeovers [h]": float(g["changeover [h]"].sum()),
                     "booked hours [h]": booked, "working days [-]": booked / day,
                     "first day": int(g["first day"].min()),
                     "last day": int(g["last day"].max())})
    return pd.DataFrame(rows, columns=["facility", "tests", "test hours [h]", "changeovers [h]",
                                       "booked hours [h]", "working days [-]", "first day",
                                       "last day"])


def model_table(campaign: Campaign, order: Sequence[CampaignTest],
                plans: dict[str, Plan]) -> pd.DataFrame:
    """One row per model, in the order the booking first uses them: role, what it represents,
    tests, scale, lambda, model length [m] and, for hull models, the model mass [kg] of each
    loading condition in the water of the model's first test."""
    rows: dict[str, dict] = {}
    for t in order:
        plan = plans[t.name]
        for k, name in enumerate(t.model_names()):
            role = MODEL_ROLES[t.kind] if k == 0 else "propeller"
            row = rows.get(name)
            if row is None:
                row = rows[name] = {
                    "model": name, "role": role, "represents": "", "tests": t.name,
                    "scale": format_scale(plan.scale), "lambda [-]": plan.scale,
                    "model length [m]": math.nan}
            elif t.name not in row["tests"].split(", "):
                row["tests"] += f", {t.name}"
            if k == 0 and not row["represents"]:
                proto = plan.case.prototype
                row["represents"] = f"{proto.name} ({proto.length:g} m)"
                row["model length [m]"] = plan.model_length
            if k == 0 and role == "hull":
                for loading, kg in plan.model_build.masses.items():
                    row.setdefault(f"model mass, {loading} [kg]", kg)
    return pd.DataFrame(list(rows.values()))


__all__ = ["Booking", "book", "booking_order", "model_table"]

"""A campaign: several model tests of one ship, the models they share and the candidate
facilities of each test (SI inside).

A ship's model-test campaign is a resistance test, a propeller open-water test, a
self-propulsion test and often seakeeping in waves; one hull model usually serves the tank and
the basin tests, and the stock propeller of the self-propulsion test is the one tested in open
water [1]_ [2]_. A :class:`Campaign` holds the tests (each a :class:`CampaignTest`: a
:class:`~similitude.planning.case.Case` of its kind, the models it uses and its candidate
facilities) and the named models (:class:`CampaignModel`). It is read from a TOML campaign file
(:mod:`similitude.readers.campaign_file`) or built in Python, and planned by
:func:`similitude.planning.campaign_plan.plan_campaign`.

Models are shared by test kind: a hull model serves resistance, self-propulsion and
seakeeping tests, a propeller model open-water and cavitation tests, a model of the body above
water wind-tunnel tests (:data:`MODEL_ROLES`). A self-propulsion test uses a hull model and may
name the propeller model fitted to it; models used together in one test are built to one scale.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.1, "Propulsion/Bollard Pull
       Test", Rev 04, 2017 (the self-propulsion test uses the stock propeller whose open-water
       characteristics are measured).
.. [2] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 05, 2021 (resistance, open-water and self-propulsion tests
       together give the power prediction).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

from similitude.errors import InputError
from similitude.planning.case import TEST_FACILITIES, Case
from similitude.planning.facilities import Facility

#: How facilities are chosen: the largest shared model, the least mismatch of the reported
#: groups (Reynolds number in ship tests), or the fewest facility hours.
CAMPAIGN_OBJECTIVES = ("largest_model", "least_mismatch", "fewest_hours")

#: The order tests are booked in (common practice: resistance before self-propulsion, open
#: water before the propulsion analysis that needs it [2]_, calm water before waves,
#: cavitation with the wake known, wind-tunnel tests independent of the others).
NATURAL_ORDER = ("resistance", "open_water", "self_propulsion", "seakeeping", "cavitation",
                 "wind_tunnel")

#: What kind of model each kind of test uses; only tests of one role share a model.
MODEL_ROLES = {
    "resistance": "hull",
    "self_propulsion": "hull",
    "seakeeping": "hull",
    "open_water": "propeller",
    "cavitation": "propeller",
    "wind_tunnel": "above-water body",
}

#: Prototype kinds each model role may represent.
ROLE_PROTOTYPES = {
    "hull": ("surface_ship", "submerged_body", "offshore_structure"),
    "propeller": ("propeller",),
    "above-water body": ("surface_ship", "offshore_structure", "bluff_body", "vehicle",
                         "wing", "submerged_body"),
}

#: Time booked before each test for rigging the model, instrumentation and calibration [s]
#: (common practice, from memory: half a working day).
DEFAULT_CHANGEOVER = 4.0 * 3600.0
#: Facility hours booked per working day [s] (one shift; common practice).
DEFAULT_WORKING_DAY = 8.0 * 3600.0


@dataclass(frozen=True)
class CampaignModel:
    """A named model that several tests may share.

    Attributes
    ----------
    name : str
    scale : float or None
        Fixed scale lambda [-] (an existing model); None: chosen by the campaign.
    model_length : float or None
        Length of an existing model [m] (its prototype's reference length over lambda).
    """

    name: str
    scale: float | None = None
    model_length: float | None = None


@dataclass(frozen=True)
class CampaignTest:
    """One test of a campaign.

    Attributes
    ----------
    name : str
        Unique within the campaign.
    case : Case
        The test as a case: its kind (``case.test``), the prototype its model represents, what
        to match and the runs; ``case.facility`` is its first candidate facility.
    facilities : tuple of Facility
        The candidate facilities (one when the facility is given).
    facility_files : tuple of str
        Where each candidate came from (the file as written), or its name.
    models : tuple of str
        Names of the campaign models the test uses (a self-propulsion test: the hull model,
        then the propeller fitted to it); empty: a model of its own.
    """

    name: str
    case: Case
    facilities: tuple[Facility, ...]
    facility_files: tuple[str, ...] = ()
    models: tuple[str, ...] = ()

    def __post_init__(self) -> None:
        if not self.facility_files:
            object.__setattr__(self, "facility_files", tuple(f.name for f in self.facilities))

    @property
    def kind(self) -> str:
        """The kind of test (one of :data:`similitude.planning.case.TEST_KINDS`)."""
        return self.case.test

    def case_in(self, facility: Facility) -> Case:
        """The test's case in ``facility``."""
        return replace(self.case, facility=facility)

    def model_names(self) -> tuple[str, ...]:
        """The models the test uses; its own model is named after the test."""
        return self.models or (f"{self.name} (own model)",)


@dataclass(frozen=True)
class Campaign:
    """Several tests, the models they share and their candidate facilities.

    Attributes
    ----------
    tests : tuple of CampaignTest
    models : tuple of CampaignModel
        The named models the tests may share.
    objective : str
        How facilities are chosen, one of :data:`CAMPAIGN_OBJECTIVES`.
    changeover : float
        Time booked before each test (rigging, instrumentation, calibration) [s].
    working_day : float
        Facility time booked per working day [s].
    start : str or None
        First working day of the campaign (ISO date), or None: day numbers only.
    metadata : dict
        Project, client, author, date ... (text).
    name : str

    Raises
    ------
    InputError
        One line per problem: names used twice, a test naming an unknown model, a model used
        by tests that cannot share it, a candidate facility of the wrong kind for its test.
    """

    tests: tuple[CampaignTest, ...]
    models: tuple[CampaignModel, ...] = ()
    objective: str = "largest_model"
    changeover: float = DEFAULT_CHANGEOVER
    working_day: float = DEFAULT_WORKING_DAY
    start: str | None = None
    metadata: dict = field(default_factory=dict)
    name: str = "campaign"

    def __post_init__(self) -> None:
        problems = campaign_problems(self)
        if problems:
            raise InputError(problems)

    def test(self, name: str) -> CampaignTest:
        """The test named ``name``."""
        for t in self.tests:
            if t.name == name:
                return t
        raise InputError(f"test: {name!r} is not a test of the campaign; expected one of "
                         + ", ".join(repr(t.name) for t in self.tests))

    def model(self, name: str) -> CampaignModel | None:
        """The named model ``name`` (None for a test's own model)."""
        return next((m for m in self.models if m.name == name), None)


def campaign_problems(c: Campaign) -> list[str]:
    """Every problem of a campaign, one line each, naming the entry as the campaign file
    does (``test[2].model``); empty when it is consistent."""
    out: list[str] = []
    if c.objective not in CAMPAIGN_OBJECTIVES:
        out.append(f"campaign.choose: {c.objective!r} is unknown; expected one of "
                   + ", ".join(CAMPAIGN_OBJECTIVES))
    for key in ("changeover", "working_day"):
        v = getattr(c, key)
        low_ok = v > 0 if key == "working_day" else v >= 0
        if not (isinstance(v, (int, float)) and math.isfinite(v) and low_ok):
            out.append(f"campaign.{key}: {v!r} is not valid; expected a time "
                       + ("> 0" if key == "working_day" else ">= 0"))
    if not c.tests:
        out.append("test: none given; expected at least one [[test]]")
    for i, m in enumerate(c.models):
        if m.scale is not None and m.model_length is not None:
            out.append(f"model[{i}]: scale and length both given; expected one of them")
    out += naming_problems([(t.name, t.kind, t.models) for t in c.tests],
                           [m.name for m in c.models])
    for i, t in enumerate(c.tests):
        out += _test_problems(i, t)
    out += _length_problems(c)
    return out


def naming_problems(tests, models) -> list[str]:
    """Problems of the names alone: names used twice, unknown models, more models than the
    test's kind uses, models shared by tests of other roles.

    Parameters
    ----------
    tests : sequence of (name, kind, model names)
        Each test as written (an entry may be None where the test could not be read, so the
        others keep their positions).
    models : sequence of str
        The names of the named models.
    """
    out = _duplicates("model", list(models))
    out += _duplicates("test", [t[0] if t else None for t in tests])
    known = {m for m in models if m is not None}
    roles: dict[str, tuple[str, str]] = {}
    for i, entry in enumerate(tests):
        if not entry or entry[1] not in MODEL_ROLES:
            continue
        name, kind, names = entry
        out += _model_count_problem(i, kind, names)
        for k, model in enumerate(names):
            if model not in known:
                out.append(f"test[{i}].model: {model!r} is not a model of the campaign; "
                           "expected " + ("one of " + ", ".join(sorted(map(repr, known)))
                                          if known else "a [[model]] of that name"))
                continue
            role = MODEL_ROLES[kind] if k == 0 else "propeller"
            first_role, first_test = roles.setdefault(model, (role, name))
            if role != first_role:
                out.append(
                    f"test[{i}].model: {model!r} is a {first_role} model (used by test "
                    f"{first_test!r}); a {kind.replace('_', '-')} test "
                    + (f"needs a {role} model" if k == 0 else
                       "names the propeller fitted to the hull second")
                    + "; expected a model of its own or another named model")
    return out


def _duplicates(what: str, names: list) -> list[str]:
    seen, out = set(), []
    for i, name in enumerate(names):
        if name is not None and name in seen:
            out.append(f"{what}[{i}].name: {name!r} is used twice; expected each {what} to "
                       "have its own name")
        seen.add(name)
    return out


def _model_count_problem(i: int, kind: str, names) -> list[str]:
    roles = 2 if kind == "self_propulsion" else 1
    if len(names) <= roles:
        return []
    return [f"test[{i}].model: {list(names)!r} names {len(names)} models; a "
            f"{kind.replace('_', '-')} test uses "
            + ("a hull model and the propeller fitted to it" if roles == 2 else "one model")]


def _test_problems(i: int, t: CampaignTest) -> list[str]:
    """The test's facilities and prototype against its kind."""
    out = []
    if not t.facilities:
        out.append(f"test[{i}].facility: none given; expected a facility file or a list of "
                   "candidate facilities")
    for k, (fac, label) in enumerate(zip(t.facilities, t.facility_files, strict=False)):
        wrong = facility_kind_problem(t.kind, fac.kind, label)
        if wrong:
            out.append(f"test[{i}].facilities[{k}]: {wrong}")
    role = MODEL_ROLES[t.kind]
    kind = t.case.prototype.kind
    if kind not in ROLE_PROTOTYPES[role]:
        out.append(f"test[{i}].prototype.kind: a {t.kind.replace('_', '-')} test uses a "
                   f"{role} model, which cannot represent a {kind.replace('_', ' ')}; expected "
                   f"a prototype of kind {' or '.join(ROLE_PROTOTYPES[role])}")
    return out


def facility_kind_problem(test_kind: str, facility_kind: str, label: str) -> str:
    """Why a facility of ``facility_kind`` cannot run a test of ``test_kind`` ("" when it
    can), naming the facility by ``label``."""
    allowed = TEST_FACILITIES[test_kind]
    if facility_kind in allowed:
        return ""
    return (f"{label!r} is a {facility_kind.replace('_', ' ')}; a "
            f"{test_kind.replace('_', '-')} test needs a "
            f"{' or a '.join(a.replace('_', ' ') for a in allowed)}")


def _length_problems(c: Campaign) -> list[str]:
    """The tests whose main model is one named model describe one prototype length."""
    out = []
    lengths: dict[str, tuple[float, str]] = {}
    for i, t in enumerate(c.tests):
        if not t.models:
            continue
        name, length = t.models[0], t.case.prototype.length
        seen = lengths.setdefault(name, (length, t.name))
        if abs(seen[0] - length) > 1e-9 * seen[0]:
            out.append(f"test[{i}].prototype.length: {length:g} m, but test {seen[1]!r} uses "
                       f"model {name!r} for a {seen[0]:g} m prototype; expected the tests "
                       "sharing a model to describe the same prototype length")
    return out


__all__ = [
    "CAMPAIGN_OBJECTIVES",
    "DEFAULT_CHANGEOVER",
    "DEFAULT_WORKING_DAY",
    "MODEL_ROLES",
    "NATURAL_ORDER",
    "ROLE_PROTOTYPES",
    "Campaign",
    "CampaignModel",
    "CampaignTest",
    "campaign_problems",
    "facility_kind_problem",
    "naming_problems",
]

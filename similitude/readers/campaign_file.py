"""Campaign files: several model tests of one ship, written in TOML, read into a
:class:`similitude.planning.campaign.Campaign`.

A campaign file has these tables (the key names are this project's own; the README's
"Campaign files" section is the full reference with a commented example)::

    [about]        title, project, client, author, date, note (as in a case file)
    [campaign]     choose, changeover, working_day, start
    [prototype]    the ship, as in a case file
    [[model]]      name, scale, length, [model.prototype]
    [[test]]       name, kind, model, facility or facilities, [test.prototype],
                   and the case tables of the test: [test.matching], [test.runs], ...

Each test is read as a case (:func:`similitude.readers.case_file.parse_case`) of its kind whose
prototype is the campaign's ``[prototype]`` changed by the keys of its model's
``[model.prototype]`` and its own ``[test.prototype]`` (a table of another kind, such as a
propeller, replaces the ship and keeps only its fluid and air pressure), with the test's own
case tables; so every key of a case file means the same in a campaign. Facility files are read
once each, relative to the campaign file, and shared by the tests that name them.

Reading never stops at the first problem: every problem is reported at once, one line each,
naming the key path as written (``test[2].model``), the value and what was expected, with a
"did you mean" hint for unknown keys; unknown models and facility files, models shared by tests
that cannot share them, and names used twice are problems too.
"""

from __future__ import annotations

import copy
from collections.abc import Mapping
from pathlib import Path
from typing import Any

import numpy as np

from similitude.errors import InputError
from similitude.planning.campaign import (
    CAMPAIGN_OBJECTIVES,
    DEFAULT_CHANGEOVER,
    DEFAULT_WORKING_DAY,
    Campaign,
    CampaignModel,
    CampaignTest,
    facility_kind_problem,
    naming_problems,
)
from similitude.planning.case import TEST_KINDS
from similitude.planning.facilities import Facility
from similitude.readers.case_file import (
    ABOUT_KEYS,
    CASE_KEYS,
    load_facility,
    parse_case,
)

# The case reader's TOML file reading (size, encoding, syntax errors as named problems).
from similitude.readers.case_file import _read_toml as read_toml
from similitude.readers.fields import LENGTH, MISSING, TIME, FieldReader, show
from similitude.units import UnitInputError, parse_scale

#: Case tables a test may hold besides its prototype (read by the case reader).
TEST_CASE_TABLES = tuple(k for k in CASE_KEYS[""] if k not in ("about", "test", "prototype",
                                                                 "facility"))
CAMPAIGN_TOP_KEYS = ("about", "campaign", "prototype", "model", "test")
SETTINGS_KEYS = ("choose", "changeover", "working_day", "start")
MODEL_KEYS = ("name", "scale", "length", "prototype")
TEST_KEYS = ("name", "kind", "model", "facility", "facilities", "prototype", *TEST_CASE_TABLES)

#: Every key of a campaign file by table, for documentation and "did you mean" hints.
CAMPAIGN_KEYS: dict[str, tuple[str, ...]] = {
    "": CAMPAIGN_TOP_KEYS, "about": ABOUT_KEYS, "campaign": SETTINGS_KEYS,
    "model": MODEL_KEYS, "test": TEST_KEYS,
}

#: Keys of the prototype a table of another kind keeps from the campaign's prototype.
_KEPT_FOR_ANOTHER_KIND = ("fluid", "air_pressure")
#: Plausibility limits of the campaign settings [s] (common practice: a typing slip beyond).
_CHANGEOVER = (0.0, 7 * 86400.0)
_WORKING_DAY = (0.0, 86400.0)
_SCALE = (0.01, 1000.0)


def load_campaign(path: str | Path) -> Campaign:
    """Read a TOML campaign file into a :class:`Campaign` (SI inside).

    Parameters
    ----------
    path : str or Path
        The campaign file; facility files named in it are read relative to its folder.

    Returns
    -------
    Campaign

    Raises
    ------
    InputError
        For a missing, empty or broken file and for every problem in its content (one line
        each: key path, value, what was expected).
    """
    p = Path(path)
    try:
        doc = read_toml(p, "campaign")
    except InputError as exc:  # the case reader words an empty file for facility files
        raise InputError([line.replace("the keys of a facility", "a TOML campaign with "
                                       "[prototype] and [[test]] tables")
                          for line in exc.problems]) from None
    return parse_campaign(doc, base_dir=p.parent, name=p.stem)


def parse_campaign(mapping: Any, base_dir: str | Path = ".", name: str = "campaign") -> Campaign:
    """Read a campaign mapping (a parsed TOML document) into a :class:`Campaign`.

    Parameters
    ----------
    mapping : mapping
        The document as read by :func:`tomllib.loads`.
    base_dir : str or Path
        Folder against which facility files are read.
    name : str
        Campaign name used when ``[about] title`` is absent.

    Raises
    ------
    InputError
        With every problem found, one line each.
    """
    if not isinstance(mapping, Mapping):
        raise InputError(f"campaign: {show(mapping)} is not a table; expected a TOML document")
    r = FieldReader(top_keys=CAMPAIGN_TOP_KEYS)
    doc = r.table(mapping, "", CAMPAIGN_TOP_KEYS, required=("prototype", "test"))
    about = _read_about(r, doc.get("about", {}))
    settings = _read_settings(r, doc.get("campaign", {}))
    base = doc.get("prototype", {})
    if "prototype" in doc and not isinstance(base, Mapping):
        r.problem("prototype", f"{show(base)} is not a table; expected a [prototype] table")
        base = {}
    models, model_protos = _read_models(r, doc.get("model", []))
    facilities = _FacilityFiles(r, Path(base_dir))
    tests, names = [], []
    for i, raw in enumerate(r.tables(doc.get("test", []), "test")):
        name, t = _read_test(r, raw, i, base, model_protos, facilities, Path(base_dir), about)
        names.append(name)
        if t is not None:
            tests.append(t)
    # names, models and sharing of every test, also of those that did not read
    r.problems.extend(naming_problems(names, [m.name for m in models]))
    r.finish()
    try:
        return Campaign(tuple(tests), tuple(models), name=about.get("title", name),
                        metadata=about, **settings)
    except InputError as exc:
        raise InputError(_as_written(exc.problems, doc.get("test", []))) from None


def _read_about(r: FieldReader, data: Any) -> dict:
    t = r.table(data, "about", ABOUT_KEYS)
    return {k: v for k in ABOUT_KEYS if (v := r.text(t, k, "about")) is not None}


def _read_settings(r: FieldReader, data: Any) -> dict:
    t = r.table(data, "campaign", SETTINGS_KEYS)
    out: dict[str, Any] = {"objective": r.choice(t, "choose", "campaign", CAMPAIGN_OBJECTIVES,
                                                 "largest_model") or "largest_model"}
    change = r.field(t, "changeover", "campaign", TIME, _CHANGEOVER, strict_low=False)
    out["changeover"] = DEFAULT_CHANGEOVER if change is None else change
    day = r.field(t, "working_day", "campaign", TIME, _WORKING_DAY)
    out["working_day"] = DEFAULT_WORKING_DAY if day is None else day
    start = t.get("start", MISSING)
    if start is not MISSING:
        text = r.text(t, "start", "campaign")
        if text is not None:
            try:
                np.datetime64(text[:10], "D")
                out["start"] = text[:10]
            except ValueError:
                r.problem("campaign.start", f"{show(start)} is not a date; expected a TOML "
                          "date such as 2026-09-07")
    return out


def _read_models(r: FieldReader, data: Any) -> tuple[list[CampaignModel], dict]:
    models, protos = [], {}
    for i, raw in enumerate(r.tables(data, "model") if data != [] else []):
        path = f"model[{i}]"
        t = r.table(raw, path, MODEL_KEYS, required=("name",))
        name = r.text(t, "name", path)
        scale = None
        if "scale" in t:
            try:
                scale = parse_scale(t["scale"], f"{path}.scale") if not isinstance(
                    t["scale"], bool) else None
            except (UnitInputError, TypeError, ValueError, OverflowError):
                scale = None
            if scale is None or not _SCALE[0] <= scale <= _SCALE[1]:
                r.problem(f"{path}.scale", f"{show(t['scale'])} is not valid; expected a scale "
                          f"such as '1:25' (prototype/model from {_SCALE[0]:g} to "
                          f"{_SCALE[1]:g})")
                scale = None
        length = r.field(t, "length", path, LENGTH, (1e-3, 100.0))
        proto = t.get("prototype", {})
        if not isinstance(proto, Mapping):
            r.problem(f"{path}.prototype", f"{show(proto)} is not a table; expected "
                      f"[{path}.prototype] with the keys that differ from [prototype]")
            proto = {}
        if name is not None:
            models.append(CampaignModel(name, scale, length))
            protos[name] = (i, proto)
    return models, protos


class _FacilityFiles:
    """Facility files read once each (relative to the campaign file), shared by the tests."""

    def __init__(self, r: FieldReader, base: Path) -> None:
        self.r, self.base, self.read = r, base, {}

    def get(self, rel: Any, path: str) -> Facility | None:
        if not isinstance(rel, str) or not rel.strip():
            self.r.problem(path, f"{show(rel)} is not valid; expected the path of a facility "
                           "file such as 'facilities/tank.toml'")
            return None
        file = self.base / rel if not Path(rel).is_absolute() else Path(rel)
        key = str(file.resolve())
        if key not in self.read:
            try:
                self.read[key] = load_facility(file)
            except InputError as exc:
                self.read[key] = None
                for line in exc.problems:
                    # named as written in the campaign file, not by its full path
                    rest = line.split("': ", 1)[1] if line.startswith("facility file '") \
                        else line
                    self.r.problem(path, f"facility file {rel!r}: {rest}")
        return self.read[key]


def _read_test(r: FieldReader, raw: Any, i: int, base: Mapping, model_protos: dict,
               facilities: _FacilityFiles, base_dir: Path, about: dict):
    """((name, kind, models) as written or None, the test or None when it has a problem)."""
    path = f"test[{i}]"
    t = r.table(raw, path, TEST_KEYS, required=("name", "kind"))
    name = r.text(t, "name", path)
    kind = r.choice(t, "kind", path, TEST_KINDS)
    models = _model_names(r, t, path)
    files = _facility_paths(r, t, path)
    loaded = [(rel, facilities.get(rel, where)) for rel, where in files]
    override = t.get("prototype", {})
    if not isinstance(override, Mapping):
        r.problem(f"{path}.prototype", f"{show(override)} is not a table; expected "
                  f"[{path}.prototype] with the keys that differ from [prototype]")
        override = {}
    spec = (name, kind, models) if name is not None and kind is not None else None
    if spec is None or not loaded or any(f is None for _, f in loaded):
        return spec, None
    usable = [(rel, f) for rel, f in loaded if not facility_kind_problem(kind, f.kind, rel)]
    if not usable:
        for (rel, f), (_, where) in zip(loaded, files, strict=True):
            r.problem(where, facility_kind_problem(kind, f.kind, rel))
        return spec, None
    model_i, model_over = model_protos.get(models[0], (None, {})) if models else (None, {})
    proto = _merged(_merged(base, model_over), override)
    doc = {"test": kind, "prototype": proto, "facility": usable[0][0],
           **{k: t[k] for k in TEST_CASE_TABLES if k in t}}
    doc["about"] = {**about, "title": name}
    try:
        case = parse_case(doc, base_dir=base_dir, name=name)
    except InputError as exc:
        for line in exc.problems:
            line = _attributed(line, path, override, model_i, model_over)
            if line not in r.problems:
                r.problems.append(line)
        return spec, None
    return spec, CampaignTest(name, case, tuple(f for _, f in loaded),
                              tuple(rel for rel, _ in loaded), models)


def _model_names(r: FieldReader, t: Mapping, path: str) -> tuple[str, ...]:
    raw = t.get("model", MISSING)
    if raw is MISSING:
        return ()
    items = raw if isinstance(raw, list) else [raw]
    if not items or not all(isinstance(x, str) and x for x in items):
        r.problem(f"{path}.model", f"{show(raw)} is not valid; expected the name of a "
                  "[[model]], or a list of names (a hull model and its propeller)")
        return ()
    return tuple(items)


def _facility_paths(r: FieldReader, t: Mapping, path: str) -> list[tuple[Any, str]]:
    """(path as written, key path) of each candidate facility file."""
    if "facility" in t and "facilities" in t:
        r.problem(f"{path}.facilities", "given with facility; expected facility = 'file' for "
                  "one facility or facilities = [...] for candidates, not both")
        return []
    if "facility" in t:
        return [(t["facility"], f"{path}.facility")]
    if "facilities" in t:
        raw = t["facilities"]
        items = raw if isinstance(raw, list) else [raw]
        if not items:
            r.problem(f"{path}.facilities", "empty list; expected at least one facility file")
        return [(x, f"{path}.facilities[{k}]") for k, x in enumerate(items)]
    r.problem(f"{path}.facility", "missing; expected facility = 'file' or facilities = "
              "['file', ...] (candidates to rank)")
    return []


def _merged(base: Mapping, override: Mapping) -> dict:
    """``base`` changed by the keys of ``override``; its ``sizes`` key by key. A table of
    another kind replaces the base, keeping its fluid and air pressure."""
    if not override:
        return copy.deepcopy(dict(base))
    if "kind" in override and override.get("kind") != base.get("kind"):
        out = {k: copy.deepcopy(base[k]) for k in _KEPT_FOR_ANOTHER_KIND if k in base}
        out.update(copy.deepcopy(dict(override)))
        return out
    out = copy.deepcopy(dict(base))
    for k, v in override.items():
        if k == "sizes" and isinstance(v, Mapping) and isinstance(out.get(k), Mapping):
            out[k] = {**out[k], **v}
        else:
            out[k] = copy.deepcopy(v)
    return out


def _attributed(line: str, path: str, override: Mapping, model_i, model_over: Mapping) -> str:
    """A problem of a test's case, named where the user wrote the key: the test's own tables,
    its [test.prototype], its model's [model.prototype] or the campaign's [prototype]."""
    if line.startswith("facility file "):
        return line
    if line.startswith("test: "):
        return f"{path}.kind: {line[6:]}"
    if line.startswith("prototype"):
        rest = line[len("prototype"):]
        key = rest.lstrip(".").split(":")[0].split(".")[0].split("[")[0]
        sub = rest.lstrip(".").split(":")[0].split(".")[1:2]
        for where, over in ((path, override), (f"model[{model_i}]", model_over)):
            if key in over and (key != "sizes" or not sub or
                                (isinstance(over["sizes"], Mapping) and sub[0] in over["sizes"])):
                return f"{where}.prototype{rest}"
        return line
    return f"{path}.{line}"


def _as_written(problems: list[str], tests: Any) -> list[str]:
    """Campaign problems with ``test[i].facilities[0]`` named ``test[i].facility`` where the
    file gave one facility."""
    out = []
    for line in problems:
        if line.startswith("test[") and ".facilities[0]:" in line:
            i = int(line[5:line.index("]")])
            raw = tests[i] if isinstance(tests, list) and i < len(tests) else {}
            if isinstance(raw, Mapping) and "facility" in raw:
                line = line.replace(".facilities[0]:", ".facility:", 1)
        out.append(line)
    return out


__all__ = ["CAMPAIGN_KEYS", "load_campaign", "parse_campaign"]

"""Malformed case files never give a traceback: only InputError (and exit 2 on the CLI).

Property-based: hypothesis mutates a valid case (keys renamed, deleted or added; values replaced
by junk of every TOML type, wrong units, absurd numbers, binary text) and checks that reading
either succeeds or raises InputError with at least one non-empty line; demo cases with odd
magnitudes go on through the planner, which plans or refuses with one clear error. The requirement
comes from the project's issue on case files (bad input: clear messages, never a traceback).
"""

from __future__ import annotations

import copy
import datetime as dt
import re
import tomllib
from pathlib import Path

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from similitude.cli import main
from similitude.errors import InputError
from similitude.planning.case import Case
from similitude.readers.case_file import parse_case

DEMO = Path(__file__).parents[2] / "demo_cases"
BASE = tomllib.loads((DEMO / "ferry_resistance.toml").read_text())
BASE["facility"] = tomllib.loads((DEMO / "facilities" / "towing_tank_demo.toml").read_text())

UNITS = ["m", "kn", "kg", "degC", "degF", "K", "Pa", "bar", "m/s", "s", "h", "rpm", "Hz",
         "m^2", "m^3", "g/kg", "%", "deg", "ft", "furlong", "", "m/s^2", "parsec", "1/s"]

junk_text = st.one_of(
    st.text(max_size=20),
    st.binary(max_size=20).map(lambda b: b.decode("latin-1")),
    st.builds(lambda x, u: f"{x} {u}", st.floats(allow_nan=True, allow_infinity=True),
              st.sampled_from(UNITS)),
    st.builds(lambda a, b: f"{a}:{b}", st.integers(-5, 100), st.integers(-5, 100)),
    st.sampled_from(["", ".", "/", "a\x00b", "x" * 300, "facilities", "../", "~"]),
    st.sampled_from(["1e999 m", "nan m/s", "-0 m", "1:0", "0:1", "1::2", "(", "**", "m m",
                     "1e-320 m", "18 kn kn", "15 degC/degC", "3 h + 2", "surface_ship"]),
)
scalars = st.one_of(
    junk_text, st.integers(-(10**20), 10**20), st.floats(), st.booleans(),
    st.dates(), st.datetimes(), st.times(),
)
values = st.recursive(
    scalars,
    lambda inner: st.one_of(st.lists(inner, max_size=4),
                            st.dictionaries(st.text(max_size=8), inner, max_size=3)),
    max_leaves=8,
)


def _paths(node, prefix=()):
    """All key paths of a nested mapping/list document."""
    out = [prefix]
    if isinstance(node, dict):
        for k, v in node.items():
            out.extend(_paths(v, (*prefix, k)))
    elif isinstance(node, list):
        for i, v in enumerate(node):
            out.extend(_paths(v, (*prefix, i)))
    return out


ALL_PATHS = [p for p in _paths(BASE) if p]


def _parent(doc, path):
    node = doc
    for k in path[:-1]:
        node = node[k]
    return node


@st.composite
def mutated_cases(draw):
    doc = copy.deepcopy(BASE)
    for _ in range(draw(st.integers(1, 4))):
        path = draw(st.sampled_from(ALL_PATHS))
        try:
            parent = _parent(doc, path)
            key = path[-1]
            parent[key]  # noqa: B018 - the path may be gone after an earlier mutation
        except (KeyError, IndexError, TypeError):
            continue
        if not isinstance(parent, (dict, list)):
            continue  # an earlier mutation turned the container into text
        action = draw(st.sampled_from(["replace", "delete", "rename", "add"]))
        if action == "replace":
            parent[key] = draw(values)
        elif action == "delete":
            del parent[key]
        elif action == "rename" and isinstance(parent, dict):
            new = draw(st.text(min_size=1, max_size=10))
            parent[new] = parent.pop(key)
        elif isinstance(parent, dict):
            parent[draw(st.text(max_size=10))] = draw(values)
        else:
            parent.append(draw(values))
    return doc


@settings(max_examples=1000, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(mutated_cases())
def test_mutated_cases_give_a_case_or_an_input_error(doc):
    try:
        case = parse_case(doc, base_dir=DEMO)
    except InputError as exc:
        assert exc.problems and all(isinstance(p, str) and p.strip() for p in exc.problems)
    else:
        assert isinstance(case, Case)


@settings(max_examples=1000, deadline=None)
@given(values)
def test_any_document_value_gives_a_case_or_an_input_error(doc):
    try:
        parse_case(doc if isinstance(doc, dict) else {"prototype": doc}, base_dir=DEMO)
    except InputError as exc:
        assert exc.problems


def _toml_value(v) -> str:
    """Write a value as TOML (enough for the junk drawn below)."""
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, (int, float)):
        return repr(v) if v == v and abs(v) != float("inf") else '"nan"'
    if isinstance(v, (dt.date, dt.datetime, dt.time)):
        return v.isoformat()
    return '"' + str(v).encode("unicode_escape").decode("ascii").replace('"', '\\"') + '"'


@settings(max_examples=60, deadline=None,
          suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(content=st.one_of(
    st.binary(max_size=200),
    st.text(max_size=200),
    st.builds(lambda k, v: f"[prototype]\n{k} = {_toml_value(v)}\nfacility = 3\n",
              st.sampled_from(["kind", "length", "speeds", "lenght", "fluid"]), scalars),
))
def test_cli_gives_exit_two_and_no_traceback_for_junk_files(tmp_path_factory, content, capsys):
    folder = tmp_path_factory.mktemp("fuzz")
    case = folder / "case.toml"
    if isinstance(content, bytes):
        case.write_bytes(content)
    else:
        case.write_text(content, encoding="utf-8", errors="surrogatepass")
    out = folder / "plan.xlsx"
    code = main(["plan", str(case), "-o", str(out)])
    err = capsys.readouterr().err
    assert code == 2
    assert "Traceback" not in err and err.startswith("error: ")
    assert not out.exists()


# -- well-formed but odd cases, through the planner ----------------------------------------

DEMO_DOCS = {name: tomllib.loads((DEMO / f"{name}.toml").read_text())
             for name in ("ferry_resistance", "offshore_seakeeping", "propeller_cavitation",
                          "wing_wind_tunnel")}
_NUMBER = re.compile(r"^\s*([-+]?[0-9]+\.?[0-9]*(?:[eE][-+]?[0-9]+)?)\s*(.*)$")


def _quantity_paths(node, prefix=()):
    """Key paths of the quantity strings ("18 kn") of a document."""
    if isinstance(node, dict):
        for k, v in node.items():
            yield from _quantity_paths(v, (*prefix, k))
    elif isinstance(node, list):
        for i, v in enumerate(node):
            yield from _quantity_paths(v, (*prefix, i))
    elif isinstance(node, str) and _NUMBER.match(node):
        yield prefix


@st.composite
def rescaled_demo_cases(draw):
    """A demo case with 1 to 3 quantities scaled by 10^-2 .. 10^2, units kept."""
    doc = copy.deepcopy(DEMO_DOCS[draw(st.sampled_from(sorted(DEMO_DOCS)))])
    paths = list(_quantity_paths(doc))
    for _ in range(draw(st.integers(1, 3))):
        path = draw(st.sampled_from(paths))
        parent = _parent(doc, path)
        m = _NUMBER.match(parent[path[-1]])
        factor = 10.0 ** draw(st.floats(-2.0, 2.0))
        parent[path[-1]] = f"{float(m.group(1)) * factor:.6g} {m.group(2)}".strip()
    return doc


@settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(rescaled_demo_cases())
def test_rescaled_demo_cases_plan_or_give_one_clear_error(doc):
    # Readable cases with odd magnitudes reach the planner; it must give a plan with its run
    # matrix, or refuse with InputError / InfeasibleError (exit 2 on the CLI), never crash.
    from similitude.errors import InfeasibleError
    from similitude.planning.planner import plan

    try:
        case = parse_case(doc, base_dir=DEMO)
    except InputError as exc:
        assert exc.problems
        return
    try:
        p = plan(case)
    except (InputError, InfeasibleError) as exc:
        assert str(exc).strip()
    else:
        assert len(p.matrix) > 0 and p.scale > 0

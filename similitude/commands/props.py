"""``similitude props FLUID --temperature ...``: a property table of a fluid at given states.

Each state option takes one or more values, or a range ``START..STOP:STEP`` (the step a number
in the unit of START, e.g. ``"10 degC..30 degC:5"``); the table holds every combination.
``similitude props --list`` lists the catalogue with the validity ranges. Properties come from
:mod:`fluids_props` only.
"""

from __future__ import annotations

import argparse
import difflib
import itertools
import math
import re
import sys

import numpy as np
import pandas as pd

import fluids_props as fp
from fluids_props import atmosphere
from fluids_props.units import UnitInputError, parse_quantity, si_quantity, to_si
from similitude.constants import P_ATM
from similitude.errors import InputError

#: Names on the command line -> the fluid they select.
FLUIDS = {
    "water": "fresh_water", "fresh-water": "fresh_water", "sea-water": "sea_water",
    "air": "air", "atmosphere": "atmosphere", "nitrogen": "nitrogen",
}
#: State options each fluid takes (the first is required).
OPTIONS = {
    "fresh_water": ("temperature", "pressure"),
    "sea_water": ("temperature", "salinity", "pressure"),
    "air": ("temperature", "pressure", "humidity"),
    "nitrogen": ("temperature", "pressure"),
    "atmosphere": ("altitude",),
}
_DIMS = {
    "temperature": "[temperature]", "pressure": "[mass] / [length] / [time] ** 2",
    "salinity": "dimensionless", "humidity": "dimensionless", "altitude": "[length]",
}
_EXAMPLE = {"temperature": "'15 degC'", "pressure": "'2 bar'", "salinity": "'35 g/kg'",
            "humidity": "'50 %'", "altitude": "'1000 m'"}
_RANGE = re.compile(r"^\s*(?P<a>.+?)\s*\.\.\s*(?P<b>.+?)\s*:\s*(?P<step>[-+0-9.eE]+)\s*$")
MAX_STATES = 100_000


def add_parser(sub) -> argparse.ArgumentParser:
    """Register the ``props`` command."""
    p = sub.add_parser(
        "props",
        help="fluid property table at one or more states",
        description="Density, viscosity, vapour pressure, surface tension and speed of sound of "
        "a fluid at the given states. Each state option takes values or a range "
        "START..STOP:STEP (step in the unit of START); every combination is listed.",
        epilog="examples: similitude props water --temperature '10 degC..30 degC:5'   "
        "similitude props sea-water --temperature '15 degC' --salinity '35 g/kg'   "
        "similitude props --list",
    )
    p.add_argument("fluid", nargs="?", metavar="FLUID",
                   help="one of: " + ", ".join(FLUIDS) + ", or any name of --list")
    p.add_argument("--temperature", nargs="+", metavar="T", help="e.g. '15 degC' '59 degF'")
    p.add_argument("--pressure", nargs="+", metavar="P", help="absolute, e.g. '2 bar'")
    p.add_argument("--salinity", nargs="+", metavar="S", help="sea water, e.g. '35 g/kg'")
    p.add_argument("--humidity", nargs="+", metavar="RH", help="air, e.g. '50 %%' or 0.5")
    p.add_argument("--altitude", nargs="+", metavar="Z", help="atmosphere, e.g. '1500 m'")
    p.add_argument("--csv", action="store_true", help="print CSV instead of a table")
    p.add_argument("--extrapolate", action="store_true",
                   help="evaluate outside the validity ranges (results flagged nowhere else)")
    p.add_argument("--list", action="store_true", help="list the fluids and validity ranges")
    p.set_defaults(func=run)
    return p


def _fluid_key(name: str) -> str:
    key = name.strip().lower().replace("_", "-").replace(" ", "-")
    if key in FLUIDS:
        return FLUIDS[key]
    if key.replace("-", "_") in OPTIONS:
        return key.replace("-", "_")
    try:  # any other fluid of the catalogue (optional back-ends such as coolprop:sf6)
        return fp.get_fluid(name).name
    except ValueError:
        pass
    close = difflib.get_close_matches(key, list(FLUIDS), n=1, cutoff=0.6)
    hint = f" (did you mean {close[0]!r}?)" if close else ""
    raise InputError(f"FLUID: {name!r} is unknown{hint}; expected one of " + ", ".join(FLUIDS))


def expand_values(option: str, items: list[str]) -> list[float]:
    """SI values of one state option: plain values and START..STOP:STEP ranges.

    Raises
    ------
    InputError
        One line per unreadable item, naming the option and the value.
    """
    dim = _DIMS[option]
    out: list[float] = []
    problems: list[str] = []
    name = f"--{option}"
    for item in items:
        m = _RANGE.match(item)
        try:
            if not m:
                out.append(float(to_si(item, dim, name)))
                continue
            start = parse_quantity(m.group("a"), name)
            stop = parse_quantity(m.group("b"), name)
            step = float(m.group("step"))
            a = float(to_si(m.group("a"), dim, name))
            to_si(m.group("b"), dim, name)
            b_in_a = float(stop.to(start.units).magnitude)
            if not (math.isfinite(step) and step > 0):
                raise UnitInputError(f"{name}: step {m.group('step')!r} in {item!r} is not "
                                     "valid; expected a positive number")
            count = math.floor((b_in_a - float(start.magnitude)) / step + 1e-9) + 1
            if count < 1 or count > MAX_STATES:
                raise UnitInputError(f"{name}: {item!r} gives {count} values; expected "
                                     f"STOP >= START and at most {MAX_STATES} values")
            for i in range(count):
                v = float(start.magnitude) + i * step
                out.append(float(to_si(f"{v!r} {start.units}", dim, name)) if i else a)
        except UnitInputError as exc:
            problems.append(str(exc))
        except Exception as exc:  # pint raises many kinds for odd text
            problems.append(f"{name}: cannot read {item!r} ({exc.__class__.__name__}); "
                            f"expected a value such as {_EXAMPLE[option]} or a range "
                            "START..STOP:STEP")
    if problems:
        raise InputError(problems)
    return out


def property_table(fluid: str, states: dict[str, list[float]], extrapolate: bool = False):
    """Properties of ``fluid`` at every combination of the SI ``states`` (a DataFrame).

    Columns carry their units: ``temperature [degC]``, ``density [kg/m^3]`` ...
    """
    names = [k for k in OPTIONS.get(fluid, ("temperature", "pressure")) if k in states]
    grid = list(itertools.product(*(states[k] for k in names)))
    if len(grid) > MAX_STATES:
        raise InputError(f"states: {len(grid)} combinations; expected at most {MAX_STATES}")
    cols = {k: np.array([g[i] for g in grid], dtype=float) for i, k in enumerate(names)}
    q = {
        "temperature": lambda v: si_quantity(v, "K"),
        "pressure": lambda v: si_quantity(v, "Pa"),
        "salinity": lambda v: si_quantity(v, "dimensionless"),
        "humidity": lambda v: si_quantity(v, "dimensionless"),
        "altitude": lambda v: si_quantity(v, "m"),
    }
    kw = {k: q[k](v) for k, v in cols.items()}
    if fluid == "atmosphere":
        state = fp.standard_atmosphere(kw["altitude"])
    elif fluid == "fresh_water":
        state = fp.fresh_water(kw["temperature"], **_opt(kw, "pressure"),
                               extrapolate=extrapolate)
    elif fluid == "sea_water":
        state = fp.sea_water(kw["temperature"], **_opt(kw, "salinity", "pressure"),
                             extrapolate=extrapolate)
    elif fluid == "air":
        extra = _opt(kw, "pressure")
        if "humidity" in kw:
            extra["relative_humidity"] = kw["humidity"]
        state = fp.air(kw["temperature"], **extra, extrapolate=extrapolate)
    elif fluid == "nitrogen":
        state = fp.nitrogen(kw["temperature"], **_opt(kw, "pressure"), extrapolate=extrapolate)
    else:  # a catalogue fluid through its SI evaluator
        p = cols.get("pressure", np.full(len(grid), P_ATM))
        state = fp.get_fluid(fluid).evaluate_si(cols["temperature"], p, extrapolate=extrapolate)
    n = len(grid)
    table: dict[str, object] = {}
    if "altitude" in cols:
        table["altitude [m]"] = cols["altitude"]
    table["temperature [degC]"] = np.broadcast_to(state.temperature_si, (n,)) - 273.15
    for key, value in state.as_dict().items():
        table[key] = np.broadcast_to(np.asarray(value, dtype=float), (n,))
    extra = state.extra
    if "salinity" in extra:
        table["salinity [g/kg]"] = np.broadcast_to(np.asarray(extra["salinity"]) * 1e3, (n,))
    if "relative_humidity" in extra:
        table["relative humidity [-]"] = np.broadcast_to(
            np.asarray(extra["relative_humidity"], dtype=float), (n,))
    elif "humidity" in cols:
        table["relative humidity [-]"] = cols["humidity"]
    return pd.DataFrame(table)


def _opt(kw: dict, *keys: str) -> dict:
    return {k: kw[k] for k in keys if k in kw}


def catalogue_table():
    """The fluids with kind, validity ranges and sources (a DataFrame)."""
    rows = []
    cli_names = {v: k for k, v in reversed(list(FLUIDS.items()))}
    for info in fp.list_fluids():
        rows.append({
            "fluid": cli_names.get(info.name, info.name.replace("_", "-")),
            "kind": info.kind,
            "validity": "; ".join(f"{r.quantity} {r.text()}" for r in info.ranges)
            + ("; pressure 0.101325 MPa only" if info.fixed_pressure else ""),
            "description": info.description,
        })
    ranges = [v for v in vars(atmosphere).values() if isinstance(v, fp.Range)]
    rows.append({"fluid": "atmosphere", "kind": "gas",
                 "validity": "; ".join(f"{r.quantity} {r.text()}" for r in ranges),
                 "description": "ISO 2533 standard atmosphere (air by altitude)"})
    return pd.DataFrame(rows)


def run(args) -> int:
    """Run ``similitude props``; returns the exit code."""
    if args.list:
        table = catalogue_table()
        print(table.to_csv(index=False) if args.csv else table.to_string(index=False))
        return 0
    if not args.fluid:
        raise InputError("FLUID: missing; expected one of " + ", ".join(FLUIDS)
                         + " (or --list)")
    fluid = _fluid_key(args.fluid)
    allowed = OPTIONS.get(fluid, ("temperature", "pressure"))
    problems: list[str] = []
    states: dict[str, list[float]] = {}
    for option in _DIMS:
        items = getattr(args, option)
        if items is None:
            continue
        if option not in allowed:
            problems.append(f"--{option}: not a state of {args.fluid}; expected only "
                            + ", ".join(f"--{o}" for o in allowed))
            continue
        try:
            states[option] = expand_values(option, items)
        except InputError as exc:
            problems.extend(exc.problems)
    first = allowed[0]
    if first not in states and not any(p.startswith(f"--{first}") for p in problems):
        problems.append(f"--{first}: missing; expected one or more values such as "
                        f"{_EXAMPLE[first]} for {args.fluid}")
    if problems:
        raise InputError(problems)
    table = property_table(fluid, states, extrapolate=args.extrapolate)
    if args.csv:
        sys.stdout.write(table.to_csv(index=False))
    else:
        print(table.to_string(index=False, float_format=lambda v: f"{v:.6g}"))
    return 0

"""``similitude groups SYMBOL=UNIT ...``: the Buckingham Pi groups of a variable set, named.

Each argument is ``SYMBOL=UNIT``, ``SYMBOL=VALUE UNIT`` (quote it: ``"V=2.5 m/s"``) or either
followed by ``:ROLE`` to state the physical role (``k=m^2/s:thermal_diffusivity``). Roles not
given are read from the symbols (see :mod:`similitude.dimensional.dimensions`).

Examples::

    similitude groups V=m/s L=m nu=m^2/s g=m/s^2
    similitude groups T=N Q=N*m rho=kg/m^3 n=1/s D=m V_A=m/s --repeating rho,n,D --json
"""

from __future__ import annotations

import argparse
from fractions import Fraction

from similitude.commands.common import json_text
from similitude.dimensional.dimensions import analyse
from similitude.errors import InputError


def add_parser(sub) -> argparse.ArgumentParser:
    """Register the ``groups`` command."""
    p = sub.add_parser(
        "groups",
        help="dimensionless groups of a set of variables (Buckingham Pi), with their names",
        description="Form the n - rank dimensionless groups of the variables by the method of "
        "repeating variables, in exact arithmetic, and name them (Reynolds, Froude, Weber...). "
        "Each variable is SYMBOL=UNIT, optionally SYMBOL=VALUE UNIT and a suffix :ROLE.",
        epilog="example: similitude groups V=m/s L=m nu=m^2/s g=m/s^2 --repeating V,L",
    )
    p.add_argument("variables", nargs="+", metavar="SYMBOL=UNIT",
                   help="e.g. V=m/s L=m nu=m^2/s g=m/s^2; add :ROLE to state a role")
    p.add_argument("--repeating", metavar="A,B,C",
                   help="comma-separated repeating variables (default: chosen as an engineer "
                   "would: density, velocity or rotation rate, length...)")
    p.add_argument("--json", action="store_true", help="print JSON instead of a table")
    p.set_defaults(func=run)
    return p


def parse_variable_args(items: list[str]) -> dict[str, dict]:
    """Read ``SYMBOL=UNIT[:ROLE]`` arguments into the dict form of ``pi_groups``."""
    out: dict[str, dict] = {}
    problems = []
    for item in items:
        symbol, sep, rest = item.partition("=")
        symbol = symbol.strip()
        if not sep or not symbol or not rest.strip():
            problems.append(f"variable {item!r}: expected SYMBOL=UNIT such as V=m/s")
            continue
        unit, _, role = rest.partition(":")
        if symbol in out:
            problems.append(f"variable {symbol!r}: given twice")
            continue
        out[symbol] = {"unit": unit.strip(), "role": role.strip() or None}
    if problems:
        raise InputError(problems)
    return out


def _exp_text(e) -> str:
    return str(Fraction(e))


def run(args) -> int:
    """Run ``similitude groups``; returns the exit code."""
    variables = parse_variable_args(args.variables)
    repeating = None
    if args.repeating is not None:
        repeating = [s.strip() for s in args.repeating.split(",") if s.strip()]
    result = analyse(variables, repeating)
    if args.json:
        doc = {
            "variables": {s: {"unit": variables[s]["unit"], "role": result.roles[s]}
                          for s in result.variables},
            "dimensions": list(result.dimensions),
            "rank": result.rank,
            "repeating": list(result.repeating),
            "groups": [
                {"symbol": g.symbol, "name": g.name, "key": g.key, "expression": g.expression,
                 "exponents": {s: _exp_text(e) for s, e in g.exponents.items()},
                 "factor": _exp_text(g.factor), "value": g.value}
                for g in result.groups
            ],
        }
        print(json_text(doc, keep_unicode=True))
        return 0
    n = len(result.variables)
    print(f"{n} variables, dimension-matrix rank {result.rank}: {n - result.rank} groups; "
          f"repeating {', '.join(result.repeating) or '(none)'}")
    if not result.groups:
        print("(no dimensionless group: the variables are dimensionally independent)")
        return 0
    width = max(len(g.symbol) for g in result.groups)
    ewidth = max(len(g.expression) for g in result.groups)
    for g in result.groups:
        line = f"  {g.symbol:<{width}} = {g.expression:<{ewidth}}  {g.name or '(unnamed)'}"
        if g.value is not None:
            line += f"  value {g.value:.6g}"
        print(line)
    return 0

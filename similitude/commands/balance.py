"""``similitude balance TERMS.toml``: term-balance scaling of an equation, prototype and model.

The TOML file holds::

    title = "hull in a towing tank (invented)"   # optional, printed
    reference = "advective"                      # optional: name of the reference term
    threshold = 0.01                             # optional: negligible below this ratio

    [terms]                                      # name = product of scales
    advective = "U**2/L"
    gravity = "g"
    viscous = "nu*U/L**2"

    [prototype]                                  # symbol = value with unit
    U = "8 m/s"
    L = "100 m"
    g = "9.81 m/s^2"
    nu = "1.19e-6 m^2/s"

    [model]                                      # optional; symbols left out keep the
    U = "0.8 m/s"                                # prototype value (g, usually)
    L = "1 m"
    nu = "1.14e-6 m^2/s"

``--threshold`` on the command line overrides the file. ``--json`` prints the table as JSON
records with the dominant balances and the regime changes.
"""

from __future__ import annotations

import argparse
import tomllib
from pathlib import Path

from similitude.commands.common import json_text
from similitude.dimensional.balance import term_balance
from similitude.errors import InputError

KEYS = ("title", "reference", "threshold", "terms", "prototype", "model")


def add_parser(sub) -> argparse.ArgumentParser:
    """Register the ``balance`` command."""
    p = sub.add_parser(
        "balance",
        help="term-balance scaling of an equation for prototype and model",
        description="Estimate each term of an equation from characteristic scales, its ratio to "
        "a reference term and the dimensionless group that ratio is; mark negligible terms and "
        "where the model's balance differs from the prototype's.",
        epilog="example: similitude balance demo_cases/balance_hull.toml --threshold 0.001",
    )
    p.add_argument("file", metavar="TERMS.toml", help="terms and scales (see the docs)")
    p.add_argument("--threshold", type=float, default=None,
                   help="ratio below which a term is negligible (default: file, else 0.01)")
    p.add_argument("--json", action="store_true", help="print JSON instead of a table")
    p.set_defaults(func=run)
    return p


def read_balance_file(path: str | Path) -> dict:
    """Read and check the TOML file; returns its tables (see the module docstring)."""
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8")
    except OSError as exc:
        raise InputError(f"{path}: cannot read the file ({exc.strerror or exc})") from None
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError(f"{path}: not valid TOML ({exc})") from None
    problems = [f"{path}: unknown key {k!r}; expected one of {', '.join(KEYS)}"
                for k in doc if k not in KEYS]
    for table in ("terms", "prototype"):
        if not isinstance(doc.get(table), dict) or not doc.get(table):
            problems.append(f"{path}: [{table}] missing or empty; expected a table of "
                            + ("name = 'U**2/L' entries" if table == "terms"
                               else "symbol = '8 m/s' entries"))
    if "model" in doc and not isinstance(doc["model"], dict):
        problems.append(f"{path}: model must be a table of symbol = value entries")
    if problems:
        raise InputError(problems)
    return doc


def run(args) -> int:
    """Run ``similitude balance``; returns the exit code."""
    doc = read_balance_file(args.file)
    threshold = args.threshold if args.threshold is not None else doc.get("threshold", 0.01)
    result = term_balance(doc["terms"], doc["prototype"], doc.get("model"),
                          reference=doc.get("reference"), threshold=threshold)
    table = result.table
    if args.json:
        print(json_text({
            "title": doc.get("title"), "reference": result.reference, "unit": result.unit,
            "threshold": result.threshold, "terms": table.to_dict(orient="records"),
            "dominant_prototype": result.dominant_prototype,
            "dominant_model": result.dominant_model, "changes": result.changes,
        }, keep_unicode=True))
        return 0
    if doc.get("title"):
        print(doc["title"])
    if "model" not in doc:
        table = table.drop(columns=[c for c in table.columns
                                    if c.startswith("model") or c in ("negligible in model",
                                                                      "regime change")])
    print(table.to_string(index=False, float_format=lambda v: f"{v:.4g}"))
    print(f"dominant balance, prototype: {', '.join(result.dominant_prototype)}")
    if "model" in doc:
        print(f"dominant balance, model: {', '.join(result.dominant_model)}")
        if result.changes:
            print(f"regime changes (threshold {result.threshold:g}):")
            for line in result.changes:
                print(f"  {line}")
        else:
            print(f"no regime change at threshold {result.threshold:g}")
    return 0

"""similitude: plan scale-model tests and scale their results to full size.

Public entry points (see the README)::

    sim.pi_groups(variables)      # Buckingham Pi groups with their trade names
    sim.load_case(path)           # read a TOML case file into a Case
    sim.plan(case)                # model scale, speed, fluid state, groups, conflicts, matrix
"""

from __future__ import annotations

import importlib

from similitude.units import Q_, parse_scale, ureg

# Heavier parts load on first use, so `import similitude` stays quick for the command line.
_LAZY = {
    "pi_groups": "similitude.dimensional.dimensions",
    "Group": "similitude.dimensional.dimensions",
    "catalogue": "similitude.dimensional.groups",
    "term_balance": "similitude.dimensional.balance",
    "scale_factors": "similitude.dimensional.scaling",
    "load_case": "similitude.readers.case_file",
    "plan": "similitude.planning.planner",
    "Plan": "similitude.planning.planner",
    "Case": "similitude.planning.case",
    "Prototype": "similitude.planning.case",
    "Facility": "similitude.planning.facilities",
    "MatchRequest": "similitude.planning.case",
    "extrapolate": "similitude.prediction.extrapolation",
}

__all__ = ["Q_", "parse_scale", "ureg", *_LAZY]


def __getattr__(name: str):
    if name in _LAZY:
        return getattr(importlib.import_module(_LAZY[name]), name)
    raise AttributeError(f"module 'similitude' has no attribute {name!r}")


def __dir__():
    return sorted(__all__)

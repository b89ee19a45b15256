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
    "pi_groups": "similitude.dimensions",
    "Group": "similitude.dimensions",
    "catalogue": "similitude.groups",
    "term_balance": "similitude.balance",
    "scale_factors": "similitude.scaling",
    "load_case": "similitude.case_file",
    "plan": "similitude.planner",
    "Plan": "similitude.planner",
    "Case": "similitude.case",
    "Prototype": "similitude.case",
    "Facility": "similitude.facilities",
    "MatchRequest": "similitude.case",
    "extrapolate": "similitude.extrapolation",
}

__all__ = ["Q_", "parse_scale", "ureg", *_LAZY]


def __getattr__(name: str):
    if name in _LAZY:
        return getattr(importlib.import_module(_LAZY[name]), name)
    raise AttributeError(f"module 'similitude' has no attribute {name!r}")


def __dir__():
    return sorted(__all__)

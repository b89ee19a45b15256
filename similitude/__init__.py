"""similitude: plan scale-model tests and scale their results to full size.

Public entry points (the full list, with one line each, is ``docs/api.md``)::

    sim.pi_groups(variables)      # Buckingham Pi groups with their trade names
    sim.load_case(path)           # read a TOML case file into a Case
    sim.plan(case)                # model scale, speed, fluid state, groups, conflicts, matrix
    sim.predict(runs, ship, ...)  # after the test: measured model data to full scale

Every name below is importable from the top level; old module paths may move, these names stay.
"""

from __future__ import annotations

import importlib

from similitude.errors import BAD_INPUT_ERRORS, InfeasibleError, InputError
from similitude.units import Q_, format_scale, parse_scale, ureg

# Name -> module. The stages load on first use, so `import similitude` stays light for the
# command line (no pandas, openpyxl or matplotlib until a name that needs them is used).
_LAZY = {
    # dimensional analysis
    "pi_groups": "similitude.dimensional.dimensions",
    "Group": "similitude.dimensional.dimensions",
    "catalogue": "similitude.dimensional.groups",
    "term_balance": "similitude.dimensional.balance",
    "scale_factors": "similitude.dimensional.scaling",
    # trade formulas
    "friction_coefficient": "similitude.correlations.friction",
    # planning: the case and its parts, the plan
    "Case": "similitude.planning.case",
    "Prototype": "similitude.planning.case",
    "FluidSpec": "similitude.planning.case",
    "MatchRequest": "similitude.planning.case",
    "MatrixSpec": "similitude.planning.case",
    "LoadingCondition": "similitude.planning.case",
    "WaveCondition": "similitude.planning.case",
    "Facility": "similitude.planning.facilities",
    "plan": "similitude.planning.planner",
    "Plan": "similitude.planning.planner",
    "Check": "similitude.planning.findings",
    "Conflict": "similitude.planning.findings",
    # readers
    "load_case": "similitude.readers.case_file",
    "load_facility": "similitude.readers.case_file",
    "read_resistance_runs": "similitude.readers.measured",
    "read_open_water_runs": "similitude.readers.measured",
    # after the test
    "predict": "similitude.prediction.predict",
    "Prediction": "similitude.prediction.predict",
    "extrapolate": "similitude.prediction.extrapolation",
    "Extrapolation": "similitude.prediction.extrapolation",
    "ShipParticulars": "similitude.prediction.extrapolation",
    "TankParticulars": "similitude.prediction.extrapolation",
    "ExtrapolationOptions": "similitude.prediction.extrapolation",
    "ResistanceRuns": "similitude.prediction.runs",
    "OpenWaterRuns": "similitude.prediction.runs",
    "PlannedRuns": "similitude.prediction.runs",
    "PropellerParticulars": "similitude.prediction.open_water",
    "OpenWaterScaling": "similitude.prediction.open_water",
    "scale_open_water": "similitude.prediction.open_water",
    "MeasurementUncertainty": "similitude.prediction.uncertainty",
    "UncertaintyResult": "similitude.prediction.uncertainty",
    "propagate": "similitude.prediction.uncertainty",
}

__all__ = ["BAD_INPUT_ERRORS", "InfeasibleError", "InputError", "Q_", "format_scale",
           "parse_scale", "ureg", *_LAZY]


def __getattr__(name: str):
    if name in _LAZY:
        return getattr(importlib.import_module(_LAZY[name]), name)
    raise AttributeError(f"module 'similitude' has no attribute {name!r}")


def __dir__():
    return sorted(__all__)

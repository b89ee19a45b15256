"""Measured model runs, SI: calm-water resistance runs and propeller open-water runs.

The data the after-test stage works on, whatever file they came from: the readers
(:mod:`similitude.readers.measured`) build these from CSV or xlsx files, a notebook may build
them directly from arrays. Also here: the runs of the test plan (:class:`PlannedRuns`) and the
note drawn when a measured model speed strays from the planned one.

pandas is imported inside the frame builder only: the command line builds every command's parser at
start, and the measured-data classes must not make that start pay for pandas.
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from dataclasses import dataclass
from typing import Any

import numpy as np

from similitude.errors import InputError


def run_id(value: Any) -> str:
    """A run id as text: whole numbers lose their decimal point (``2.0`` and ``"2"`` -> ``"2"``).

    Spreadsheets store run numbers as floats and plans as integers; the same run must compare
    equal whichever way it was written.
    """
    if isinstance(value, float) and math.isfinite(value) and value.is_integer():
        return str(int(value))
    text = str(value).strip()
    try:
        number = float(text)
    except ValueError:
        return text
    return str(int(number)) if math.isfinite(number) and number.is_integer() else text


def _frame(columns: dict[str, Any]):
    """A DataFrame of the columns that are not None."""
    import pandas as pd

    return pd.DataFrame({name: values for name, values in columns.items() if values is not None})


@dataclass(frozen=True, eq=False)
class ResistanceRuns:
    """Measured calm-water resistance runs of a model, SI.

    Attributes
    ----------
    run : tuple of str
        Run ids (the plan's, or ``"1"``, ``"2"``... for free rows).
    speed : ndarray
        Model speed [m/s].
    resistance : ndarray
        Measured total resistance [N] (stimulator drag not yet removed).
    temperature : ndarray
        Tank water temperature [K].
    sinkage, trim, stimulator_drag : ndarray or None
        Sinkage [m], trim [deg] and the parasitic drag of the turbulence stimulators [N].
    source : str
        Where the data came from (file name).
    """

    run: tuple[str, ...]
    speed: np.ndarray
    resistance: np.ndarray
    temperature: np.ndarray
    sinkage: np.ndarray | None = None
    trim: np.ndarray | None = None
    stimulator_drag: np.ndarray | None = None
    source: str = ""

    def __len__(self) -> int:
        return len(self.run)

    def to_frame(self):
        """The runs as a DataFrame with units in the headers (unmeasured columns left out)."""
        return _frame({
            "run": list(self.run),
            "model speed [m/s]": self.speed,
            "total resistance [N]": self.resistance,
            "water temperature [degC]": self.temperature - 273.15,
            "sinkage [m]": self.sinkage,
            "trim [deg]": self.trim,
            "stimulator drag [N]": self.stimulator_drag,
        })


@dataclass(frozen=True, eq=False)
class OpenWaterRuns:
    """Measured propeller open-water runs, SI.

    Attributes
    ----------
    run : tuple of str
    advance_ratio : ndarray
        J = V_A/(n D) [-].
    thrust_coefficient : ndarray
        K_T = T/(rho n^2 D^4) [-].
    torque_coefficient : ndarray
        K_Q = Q/(rho n^2 D^5) [-].
    temperature : ndarray or None
        Water temperature [K].
    rotation_rate : ndarray or None
        n [1/s] when measured (gives the model chord Reynolds number).
    advance_speed : ndarray or None
        V_A [m/s] when measured.
    source : str
    """

    run: tuple[str, ...]
    advance_ratio: np.ndarray
    thrust_coefficient: np.ndarray
    torque_coefficient: np.ndarray
    temperature: np.ndarray | None = None
    rotation_rate: np.ndarray | None = None
    advance_speed: np.ndarray | None = None
    source: str = ""

    def to_frame(self):
        """The runs as a DataFrame with units in the headers (unmeasured columns left out)."""
        return _frame({
            "run": list(self.run),
            "advance ratio J [-]": self.advance_ratio,
            "K_T model [-]": self.thrust_coefficient,
            "K_Q model [-]": self.torque_coefficient,
            "rotation rate [1/s]": self.rotation_rate,
            "advance speed [m/s]": self.advance_speed,
            "water temperature [degC]": (None if self.temperature is None
                                         else self.temperature - 273.15),
        })


@dataclass(frozen=True, eq=False)
class PlannedRuns:
    """The runs of the test plan, as the after-test stage compares them with the measured ones.

    Attributes
    ----------
    run : tuple of str
        Run ids of the plan's matrix (as text, see :func:`run_id`).
    model_speed : ndarray
        The planned model speed of each run [m/s].
    scale : float
        λ of the plan [-].
    """

    run: tuple[str, ...]
    model_speed: np.ndarray
    scale: float

    def __post_init__(self) -> None:
        object.__setattr__(self, "run", tuple(run_id(r) for r in self.run))
        object.__setattr__(self, "model_speed", np.asarray(self.model_speed, dtype=float))
        object.__setattr__(self, "scale", float(self.scale))
        if len(self.run) != len(self.model_speed):
            raise InputError(f"planned runs: {len(self.run)} run ids and "
                             f"{len(self.model_speed)} model speeds; expected one speed per run")

    @classmethod
    def from_plan(cls, plan) -> PlannedRuns:
        """The runs of a :class:`similitude.planning.planner.Plan`: its matrix's ``run`` and
        ``model speed [m/s]`` columns and its scale."""
        matrix = plan.matrix
        return cls(tuple(matrix["run"]), matrix["model speed [m/s]"], plan.scale)


def planned_speed_notes(runs: ResistanceRuns, plan_runs: Iterable[Any],
                        planned_speeds: Iterable[float], tolerance: float = 0.02) -> list[str]:
    """Notes on runs whose measured model speed differs from the plan's by more than
    ``tolerance`` (relative): a hint that the file and the plan (or its scale) disagree.

    Parameters
    ----------
    runs : ResistanceRuns
    plan_runs : iterable
        Run ids of the plan's matrix.
    planned_speeds : iterable of float
        The plan's model speeds [m/s], paired with ``plan_runs``.
    tolerance : float
        Relative difference that draws a note [-].
    """
    planned = {run_id(r): float(v) for r, v in zip(plan_runs, planned_speeds, strict=True)}
    notes = []
    for rid, v in zip(runs.run, runs.speed, strict=True):
        if rid in planned and abs(v / planned[rid] - 1.0) > tolerance:
            notes.append(f"run {rid}: measured model speed {v:.4g} m/s differs from the "
                         f"planned {planned[rid]:.4g} m/s by {100 * (v / planned[rid] - 1):+.1f} "
                         "%; check the run ids and the scale")
    return notes


__all__ = [
    "OpenWaterRuns",
    "PlannedRuns",
    "ResistanceRuns",
    "planned_speed_notes",
    "run_id",
]

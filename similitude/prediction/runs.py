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

#: What the run ids of a measured file are:
#: ``"plan"``, the plan's run numbers (checked against the plan, compared run by run);
#: ``"facility"``, the facility's own numbers (kept; each run matched to the planned run of the
#: nearest model speed); ``"free"``, kept and not matched to the plan at all;
#: ``"numbered"``, no ids in the file: the rows are numbered and never compared with the plan.
RUN_ID_KINDS = ("plan", "facility", "free", "numbered")

#: Id prefix of a row whose run cell is blank (a run beyond the plan, numbered in file order);
#: such rows are never compared with planned runs.
EXTRA_RUN_PREFIX = "extra "


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


def _check_kind(kind: str) -> None:
    if kind not in RUN_ID_KINDS:
        raise InputError(f"run ids: {kind!r} is unknown; expected one of "
                         + ", ".join(RUN_ID_KINDS))


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
    id_kind : str
        What the run ids are, one of :data:`RUN_ID_KINDS`.
    """

    run: tuple[str, ...]
    speed: np.ndarray
    resistance: np.ndarray
    temperature: np.ndarray
    sinkage: np.ndarray | None = None
    trim: np.ndarray | None = None
    stimulator_drag: np.ndarray | None = None
    source: str = ""
    id_kind: str = "plan"

    def __post_init__(self) -> None:
        _check_kind(self.id_kind)

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
class SelfPropulsionRuns:
    """Measured self-propulsion runs of a model, SI: one row per run (per tow force in the
    load-varying method).

    Attributes
    ----------
    run : tuple of str
    speed : ndarray
        Model speed V_M [m/s].
    rotation_rate : ndarray
        Propeller rate of revolution n_M [1/s].
    thrust : ndarray
        Propeller thrust T_M [N], per propeller (the mean of the shafts of a twin-screw
        model).
    torque : ndarray
        Propeller torque Q_M [N m], per propeller.
    tow_force : ndarray
        Tow force actually applied by the carriage, F_D [N] (positive: helping the model
        along).
    temperature : ndarray
        Tank water temperature [K].
    source : str
    id_kind : str
        What the run ids are, one of :data:`RUN_ID_KINDS`.
    """

    run: tuple[str, ...]
    speed: np.ndarray
    rotation_rate: np.ndarray
    thrust: np.ndarray
    torque: np.ndarray
    tow_force: np.ndarray
    temperature: np.ndarray
    source: str = ""
    id_kind: str = "plan"

    def __post_init__(self) -> None:
        _check_kind(self.id_kind)
        n = len(self.run)
        for key in ("speed", "rotation_rate", "thrust", "torque", "tow_force", "temperature"):
            value = np.asarray(getattr(self, key), dtype=float).reshape(-1)
            if value.size == 1 and n > 1:
                value = np.full(n, value[0])
            if value.size != n:
                raise InputError(f"self-propulsion runs: {value.size} values of {key} for {n} "
                                 "runs; expected one per run")
            object.__setattr__(self, key, value)

    def __len__(self) -> int:
        return len(self.run)

    def to_frame(self):
        """The runs as a DataFrame with units in the headers."""
        return _frame({
            "run": list(self.run),
            "model speed [m/s]": self.speed,
            "rotation rate [1/s]": self.rotation_rate,
            "thrust [N]": self.thrust,
            "torque [N m]": self.torque,
            "tow force [N]": self.tow_force,
            "water temperature [degC]": self.temperature - 273.15,
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


def planned_speed_notes(runs, plan_runs: Iterable[Any], planned_speeds: Iterable[float],
                        tolerance: float = 0.02) -> list[str]:
    """Notes where measured runs disagree with the plan: a hint that the file and the plan (or
    its scale) do not belong together.

    By the runs' ``id_kind``: ``"plan"`` ids are compared run by run, a measured model speed
    more than ``tolerance`` (relative) from the planned one of the same id drawing a note;
    ``"facility"`` ids are matched by speed, a run more than ``tolerance`` from every planned
    speed drawing a note; ``"free"`` and ``"numbered"`` runs, and rows without an id (see
    :data:`EXTRA_RUN_PREFIX`), are never compared.

    Parameters
    ----------
    runs : ResistanceRuns or SelfPropulsionRuns
    plan_runs : iterable
        Run ids of the plan's matrix.
    planned_speeds : iterable of float
        The plan's model speeds [m/s], paired with ``plan_runs``.
    tolerance : float
        Relative difference that draws a note [-].
    """
    kind = getattr(runs, "id_kind", "plan")
    if kind in ("free", "numbered"):
        return []
    planned = {run_id(r): float(v) for r, v in zip(plan_runs, planned_speeds, strict=True)}
    notes = []
    speeds = np.array(sorted(set(planned.values())))
    for rid, v in zip(runs.run, runs.speed, strict=True):
        if rid.startswith(EXTRA_RUN_PREFIX):
            continue
        if kind == "facility":
            nearest = speeds[np.argmin(np.abs(speeds - v))] if speeds.size else np.nan
            if not abs(v / nearest - 1.0) <= tolerance:
                notes.append(f"run {rid} (facility id): measured model speed {v:.4g} m/s is "
                             f"{100 * (v / nearest - 1):+.1f} % from the nearest planned "
                             f"speed {nearest:.4g} m/s; a run beyond the plan, or check the "
                             "scale")
        elif rid in planned and abs(v / planned[rid] - 1.0) > tolerance:
            notes.append(f"run {rid}: measured model speed {v:.4g} m/s differs from the "
                         f"planned {planned[rid]:.4g} m/s by {100 * (v / planned[rid] - 1):+.1f} "
                         "%; check the run ids and the scale")
    return notes


__all__ = [
    "EXTRA_RUN_PREFIX",
    "RUN_ID_KINDS",
    "OpenWaterRuns",
    "PlannedRuns",
    "ResistanceRuns",
    "SelfPropulsionRuns",
    "planned_speed_notes",
    "run_id",
]

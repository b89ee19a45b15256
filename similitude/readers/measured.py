"""Reading measured model data: resistance runs and propeller open-water runs from CSV or xlsx.

A measured file is a table with one row per run and the unit of each column in its header, in
square brackets: ``model speed [m/s]``, ``total resistance [N]``, ``water temperature [degC]``.
Any unit of the shared registry is accepted (``[kn]``, ``[lbf]``, ``[degF]``...); values are
converted to SI here, at the edge, and never again, into the data classes of
:mod:`similitude.prediction.runs`. Every problem found in a file is reported, one line each,
naming the row and the column, in one :class:`~similitude.errors.InputError`.

pandas is imported inside :func:`read_table`: the command line builds every command's parser at
start, and reading measured files must not make that start pay for pandas.
"""

from __future__ import annotations

import math
import re
from collections.abc import Iterable
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import numpy as np
import pint

from fluids_props.water import fresh_water_si
from similitude.errors import InputError
from similitude.prediction.runs import (
    EXTRA_RUN_PREFIX,
    RUN_ID_KINDS,
    OpenWaterRuns,
    ResistanceRuns,
    SelfPropulsionRuns,
    run_id,
)
from similitude.units import radians_per_turn, spell_revolutions, to_si, ureg

_HEADER = re.compile(r"^\s*(?P<name>.*?)\s*\[(?P<unit>[^\]]*)\]\s*$")

FORCE = "[mass] * [length] / [time] ** 2"
SPEED = "[length] / [time]"
TORQUE = "[mass] * [length] ** 2 / [time] ** 2"


@dataclass(frozen=True)
class ColumnSpec:
    """What a measured column means.

    Attributes
    ----------
    key : str
        Field name inside the program.
    names : tuple of str
        Accepted header names (case and spacing ignored), the first is the preferred one.
    dimension : str or None
        pint dimensionality of the column (None: a label such as the run id).
    si_unit : str
        SI unit the column is converted to.
    required : bool
    example : str
        A well-formed header, for error messages.
    """

    key: str
    names: tuple[str, ...]
    dimension: str | None
    si_unit: str
    required: bool = False
    example: str = ""


RESISTANCE_COLUMNS: tuple[ColumnSpec, ...] = (
    ColumnSpec("run", ("run", "run id", "run number", "run no"), None, ""),
    ColumnSpec("speed", ("model speed", "carriage speed", "speed"), SPEED, "m/s", True,
               "model speed [m/s]"),
    ColumnSpec("resistance", ("total resistance", "model resistance", "resistance"), FORCE,
               "N", True, "total resistance [N]"),
    ColumnSpec("temperature", ("water temperature", "temperature"), "[temperature]", "K",
               True, "water temperature [degC]"),
    ColumnSpec("sinkage", ("sinkage", "mean sinkage"), "[length]", "m", False, "sinkage [mm]"),
    ColumnSpec("trim", ("trim", "dynamic trim"), "dimensionless", "deg", False, "trim [deg]"),
    ColumnSpec("stimulator_drag", ("stimulator drag", "turbulence stimulator drag"), FORCE,
               "N", False, "stimulator drag [N]"),
)

OPEN_WATER_COLUMNS: tuple[ColumnSpec, ...] = (
    ColumnSpec("run", ("run", "run id", "run number", "run no"), None, ""),
    ColumnSpec("advance_ratio", ("advance ratio", "j"), "dimensionless", "", False,
               "advance ratio [-]"),
    ColumnSpec("advance_speed", ("advance speed", "speed of advance"), SPEED, "m/s", False,
               "advance speed [m/s]"),
    ColumnSpec("rotation_rate", ("rotation rate", "rate of revolution", "revolutions"),
               "1 / [time]", "1/s", False, "rotation rate [1/s]"),
    ColumnSpec("thrust_coefficient", ("thrust coefficient", "kt"), "dimensionless", "", False,
               "thrust coefficient [-]"),
    ColumnSpec("torque_coefficient", ("torque coefficient", "kq"), "dimensionless", "", False,
               "torque coefficient [-]"),
    ColumnSpec("thrust", ("thrust",), FORCE, "N", False, "thrust [N]"),
    ColumnSpec("torque", ("torque",), TORQUE, "N*m", False, "torque [N m]"),
    ColumnSpec("temperature", ("water temperature", "temperature"), "[temperature]", "K",
               False, "water temperature [degC]"),
)


SELF_PROPULSION_COLUMNS: tuple[ColumnSpec, ...] = (
    ColumnSpec("run", ("run", "run id", "run number", "run no"), None, ""),
    ColumnSpec("speed", ("model speed", "carriage speed", "speed"), SPEED, "m/s", True,
               "model speed [m/s]"),
    ColumnSpec("rotation_rate", ("rotation rate", "rate of revolution", "revolutions",
                                 "propeller rate"), "1 / [time]", "1/s", True,
               "rotation rate [rpm]"),
    ColumnSpec("thrust", ("thrust", "propeller thrust"), FORCE, "N", True, "thrust [N]"),
    ColumnSpec("torque", ("torque", "propeller torque"), TORQUE, "N*m", True, "torque [N m]"),
    ColumnSpec("tow_force", ("tow force", "towing force", "skin friction correction",
                             "skin-friction correction", "friction correction force"), FORCE,
               "N", True, "tow force [N]"),
    ColumnSpec("temperature", ("water temperature", "temperature"), "[temperature]", "K",
               True, "water temperature [degC]"),
)


# -- header and cell parsing ------------------------------------------------------------------


def split_header(header: str) -> tuple[str, str | None]:
    """Split ``"model speed [m/s]"`` into ``("model speed", "m/s")``; no brackets: unit None."""
    m = _HEADER.match(str(header))
    if m:
        return _norm(m.group("name")), m.group("unit").strip()
    return _norm(str(header)), None


def _norm(text: str) -> str:
    return " ".join(text.replace("_", " ").lower().split())


def _unit_factor(unit: str, spec: ColumnSpec, header: str):
    """Return a converter array->SI for a header unit, or raise InputError."""
    text = unit.strip()
    if text in ("", "-", "1"):
        text = "dimensionless"
    if spec.dimension == "1 / [time]":
        text = spell_revolutions(text)
    try:
        probe = ureg.Quantity(1.0, text)
    except (pint.errors.PintError, AttributeError, TypeError, ValueError, SyntaxError,
            AssertionError):
        raise InputError(
            f"column {header!r}: unit {unit!r} is not a known unit; expected e.g. "
            f"{spec.example!r}"
        ) from None
    expected = (ureg.Quantity(1.0, "dimensionless").dimensionality
                if spec.dimension == "dimensionless"
                else ureg.get_dimensionality(spec.dimension))
    if probe.dimensionality != expected:
        raise InputError(
            f"column {header!r}: unit {unit!r} has dimension {probe.dimensionality}; expected "
            f"{spec.dimension} (e.g. {spec.example!r})"
        )

    # pint counts rpm and rps in radians (120 rpm -> 12.57 rad/s); a propeller's rotation rate
    # n of J = V/(nD) counts revolutions, so the angle of such a unit is divided out.
    per_turn = radians_per_turn(text) if spec.dimension == "1 / [time]" else 1.0

    def convert(values: np.ndarray) -> np.ndarray:
        si = ureg.Quantity(values, text).to(spec.si_unit or "dimensionless").magnitude
        return np.asarray(si, dtype=float) / per_turn

    return convert


def _is_blank(value: Any) -> bool:
    if value is None:
        return True
    if isinstance(value, float) and math.isnan(value):
        return True
    return isinstance(value, str) and value.strip() == ""


def _to_float(value: Any) -> float | None:
    if isinstance(value, bool):
        return None
    if isinstance(value, (int, float, np.integer, np.floating)):
        return float(value)
    try:
        return float(str(value).strip())
    except ValueError:
        return None


def read_table(path: str | Path, sheet: str | int | None = None):
    """Read a CSV or xlsx file into a DataFrame of raw cells (strings or numbers).

    Parameters
    ----------
    path : str or Path
        ``.csv`` (comma-separated, ``#`` starts a comment line) or ``.xlsx``.
    sheet : str or int or None
        Worksheet of an xlsx file (default: the first).

    Raises
    ------
    InputError
        Missing file, unknown file type or an unreadable file.
    """
    import pandas as pd

    p = Path(path)
    if not p.is_file():
        raise InputError(f"measured data: file {str(p)!r} not found; expected a .csv or .xlsx")
    suffix = p.suffix.lower()
    try:
        if suffix == ".csv":
            frame = pd.read_csv(p, dtype=str, comment="#", skipinitialspace=True,
                                keep_default_na=False)
        elif suffix in (".xlsx", ".xlsm"):
            frame = pd.read_excel(p, sheet_name=0 if sheet is None else sheet, dtype=object)
        else:
            raise InputError(
                f"measured data: {p.name!r} has type {suffix or '(none)'!r}; expected .csv or "
                ".xlsx"
            )
    except InputError:
        raise
    except (ValueError, OSError, KeyError) as exc:
        raise InputError(f"measured data: cannot read {p.name!r} ({exc})") from None
    frame = frame.dropna(how="all")
    return frame


def _find_columns(headers: list[Any], specs: Iterable[ColumnSpec], where: str,
                  problems: list[str]) -> dict[str, tuple[ColumnSpec, str, str | None]]:
    """key -> (spec, header, unit) of each column of ``specs`` found among the headers."""
    found: dict[str, tuple[ColumnSpec, str, str | None]] = {}
    for header in headers:
        name, unit = split_header(header)
        for spec in specs:
            if name in spec.names:
                if spec.key in found:
                    problems.append(f"{where}columns {found[spec.key][1]!r} and {header!r} both "
                                    f"give {spec.names[0]}; expected one")
                found[spec.key] = (spec, str(header), unit)
                break
    return found


def _run_ids(cells: list[Any]) -> list[str]:
    # A blank run id marks a run made beyond the plan (e.g. a low-speed series for the form
    # factor); such runs are numbered in the order of the file ("extra 1", "extra 2" ...) and
    # not checked against the plan.
    blanks = iter(range(1, len(cells) + 1))
    return [f"{EXTRA_RUN_PREFIX}{next(blanks)}" if _is_blank(cell) else run_id(cell)
            for cell in cells]


def _numbers(cells: list[Any], row_numbers: list[int], header: str, where: str,
             problems: list[str]) -> np.ndarray | None:
    """The cells of one column as floats, or None after a problem per bad cell."""
    values = np.empty(len(cells))
    bad = False
    for i, (row, cell) in enumerate(zip(row_numbers, cells, strict=True)):
        if _is_blank(cell):
            problems.append(f"{where}row {row}, column {header!r}: empty cell; expected a "
                            "number")
            bad = True
            continue
        number = _to_float(cell)
        if number is None or not math.isfinite(number):
            problems.append(f"{where}row {row}, column {header!r}: {cell!r} is not a "
                            "finite number")
            bad = True
            continue
        values[i] = number
    return None if bad else values


def columns_to_si(frame, specs: Iterable[ColumnSpec], source: str = "",
                  given: dict[str, Any] | None = None) -> dict[str, Any]:
    """Find the columns of ``specs`` in a raw frame and convert their cells to SI.

    Parameters
    ----------
    frame : pandas.DataFrame
        Raw cells, headers with units in brackets.
    specs : iterable of ColumnSpec
    source : str
        File name for the messages.
    given : dict, optional
        Values given outside the file for a field (e.g. one water temperature for all runs):
        key -> user value (``"15.2 degC"``, Quantity). A column of the same field in the file
        is an error (two sources for one thing).

    Returns
    -------
    dict
        key -> ndarray of SI floats (``run`` -> list of str); absent optional fields are left
        out.

    Raises
    ------
    InputError
        One line per problem: missing column, header without unit, unknown or wrong unit,
        empty or non-numeric cell (row and column named).
    """
    given = dict(given or {})
    problems: list[str] = []
    where = f"{source}: " if source else ""
    headers = list(frame.columns)
    found = _find_columns(headers, specs, where, problems)
    n = len(frame)
    out: dict[str, Any] = {}
    # Rows are numbered as a spreadsheet shows them: the header is row 1.
    row_numbers = [int(i) + 2 for i in range(n)]
    for spec in specs:
        if spec.key in given and given[spec.key] is not None:
            if spec.key in found:
                problems.append(f"{where}{spec.names[0]}: given both as column "
                                f"{found[spec.key][1]!r} and as a single value; expected one")
                continue
            value = to_si(given[spec.key], spec.dimension, spec.names[0])
            out[spec.key] = np.full(n, value, dtype=float)
            continue
        if spec.key not in found:
            if spec.required:
                problems.append(f"{where}column {spec.example!r} missing; found columns "
                                + ", ".join(repr(str(h)) for h in headers))
            continue
        spec, header, unit = found[spec.key]
        cells = list(frame[header])
        if spec.dimension is None:
            out[spec.key] = _run_ids(cells)
            continue
        if unit is None:
            problems.append(f"{where}column {header!r} has no unit in its header; expected e.g. "
                            f"{spec.example!r}")
            continue
        try:
            convert = _unit_factor(unit, spec, header)
        except InputError as exc:
            problems.extend(f"{where}{p}" for p in exc.problems)
            continue
        values = _numbers(cells, row_numbers, header, where, problems)
        if values is not None:
            out[spec.key] = convert(values)
    if problems:
        raise InputError(problems)
    return out


def _check_ids(ids: list[str], where: str, plan_runs: Iterable[Any] | None,
               problems: list[str]) -> None:
    seen: dict[str, int] = {}
    for i, rid in enumerate(ids):
        if rid in seen:
            problems.append(f"{where}row {i + 2}, column 'run': run id {rid!r} repeats row "
                            f"{seen[rid] + 2}; expected each run once")
        else:
            seen[rid] = i
    if plan_runs is not None:
        allowed = {run_id(r) for r in plan_runs}
        for i, rid in enumerate(ids):
            if rid not in allowed and not rid.startswith(EXTRA_RUN_PREFIX):
                problems.append(f"{where}row {i + 2}, column 'run': run {rid!r} is not in the "
                                f"plan's run matrix; expected one of {_short(sorted(allowed))}")


def _positive_cells(cols: dict[str, Any], columns: Iterable[tuple[str, str]], where: str,
                    problems: list[str]) -> None:
    """A problem for each cell of the (key, column name) columns that is not > 0."""
    for key, label in columns:
        for i, v in enumerate(cols[key]):
            if not v > 0:
                problems.append(f"{where}row {i + 2}, column {label!r}: {label} {v:g} "
                                f"(SI) is not positive; expected a {label} > 0")


def _tank_temperatures(values: np.ndarray, where: str, problems: list[str]) -> None:
    """A problem for each water temperature outside 0 to 40 degC (a towing tank's)."""
    for i, v in enumerate(values):
        if not 273.15 <= v <= 313.15:
            problems.append(f"{where}row {i + 2}, column 'water temperature': {v - 273.15:.2f} "
                            "degC; expected a tank temperature between 0 and 40 degC")


def _short(items: list[str], limit: int = 8) -> str:
    text = ", ".join(items[:limit])
    return text + (", ..." if len(items) > limit else "")


def _ids(cols: dict[str, Any], n: int, run_ids: str, plan_runs, where: str,
         problems: list[str]) -> tuple[list[str], str]:
    """(run ids, their kind): the file's ids checked (against the plan only when they are the
    plan's), or rows numbered 1, 2 ... when the file has no run column (never compared with
    the plan)."""
    if run_ids not in RUN_ID_KINDS[:3]:
        raise InputError(f"run ids: {run_ids!r} is unknown; expected one of "
                         + ", ".join(RUN_ID_KINDS[:3]))
    if "run" not in cols:
        return [str(i + 1) for i in range(n)], "numbered"
    ids = cols["run"]
    _check_ids(ids, where, plan_runs if run_ids == "plan" else None, problems)
    return ids, run_ids


def resistance_runs_from_frame(frame, temperature: Any = None,
                               plan_runs: Iterable[Any] | None = None,
                               source: str = "", run_ids: str = "plan") -> ResistanceRuns:
    """Check and convert a raw table of resistance runs.

    Parameters
    ----------
    frame : pandas.DataFrame
        One row per run; headers with units (see :data:`RESISTANCE_COLUMNS`).
    temperature : str or Quantity, optional
        One water temperature for all runs, when the file has no temperature column.
    plan_runs : iterable, optional
        Run ids of the plan's matrix; with ``run_ids="plan"`` a run id outside it is an error.
        Without a ``run`` column the rows are numbered 1, 2, ... and never compared with the
        plan; a blank run cell marks one extra run beyond the plan (ids ``"extra 1"``,
        ``"extra 2"`` ... in file order).
    source : str
        File name for the messages.
    run_ids : str
        What the file's run ids are: ``"plan"`` (the plan's run numbers; default),
        ``"facility"`` (the facility's own, matched to the plan by speed) or ``"free"`` (not
        matched); see :data:`similitude.prediction.runs.RUN_ID_KINDS`.

    Returns
    -------
    ResistanceRuns

    Raises
    ------
    InputError
        Missing columns, non-numeric cells, non-positive speeds or resistances, duplicate run
        ids, runs outside the plan; one line each.
    """
    where = f"{source}: " if source else ""
    if len(frame) == 0:
        raise InputError(f"{where}no runs in the file; expected one row per run")
    cols = columns_to_si(frame, RESISTANCE_COLUMNS, source, {"temperature": temperature})
    problems: list[str] = []
    ids, kind = _ids(cols, len(frame), run_ids, plan_runs, where, problems)
    _positive_cells(cols, (("speed", "model speed"), ("resistance", "total resistance")),
                    where, problems)
    _tank_temperatures(cols["temperature"], where, problems)
    if "stimulator_drag" in cols:
        for i, v in enumerate(cols["stimulator_drag"]):
            if v < 0 or v >= cols["resistance"][i]:
                problems.append(f"{where}row {i + 2}, column 'stimulator drag': {v:g} N; "
                                "expected 0 <= stimulator drag < total resistance")
    if problems:
        raise InputError(problems)
    return ResistanceRuns(tuple(ids), cols["speed"], cols["resistance"], cols["temperature"],
                          cols.get("sinkage"), cols.get("trim"), cols.get("stimulator_drag"),
                          source, kind)


def read_resistance_runs(path: str | Path, temperature: Any = None,
                         plan_runs: Iterable[Any] | None = None,
                         sheet: str | int | None = None,
                         run_ids: str = "plan") -> ResistanceRuns:
    """Read measured resistance runs from a CSV or xlsx file.

    Parameters
    ----------
    path : str or Path
        The file. Columns (units in brackets, any unit of the right dimension):
        ``model speed [m/s]``, ``total resistance [N]``, ``water temperature [degC]`` (or the
        ``temperature`` argument), optional ``run``, ``sinkage [mm]``, ``trim [deg]``,
        ``stimulator drag [N]`` (parasitic drag of the turbulence stimulators, to be removed).
    temperature : str or Quantity, optional
        One water temperature for all runs, e.g. ``"15.4 degC"``.
    plan_runs : iterable, optional
        Run ids of the plan's matrix (``plan.matrix["run"]``).
    sheet : str or int, optional
        Worksheet of an xlsx file.
    run_ids : str
        ``"plan"`` (default), ``"facility"`` or ``"free"``: see
        :func:`resistance_runs_from_frame`.

    Returns
    -------
    ResistanceRuns
    """
    frame = read_table(path, sheet)
    return resistance_runs_from_frame(frame, temperature, plan_runs, Path(path).name, run_ids)


def open_water_runs_from_frame(frame, diameter: float | None = None,
                               density: float | None = None, temperature: Any = None,
                               source: str = "") -> OpenWaterRuns:
    """Check and convert a raw table of propeller open-water runs.

    The table gives either the coefficients (``advance ratio [-]``, ``thrust coefficient
    [-]``, ``torque coefficient [-]``) or the measured quantities (``advance speed [m/s]``,
    ``rotation rate [1/s]``, ``thrust [N]``, ``torque [N m]``), which are reduced with

    J = V_A/(n D),  K_T = T/(rho n^2 D^4),  K_Q = Q/(rho n^2 D^5).

    Parameters
    ----------
    frame : pandas.DataFrame
    diameter : float, optional
        Model propeller diameter D [m]; needed for measured quantities.
    density : float, optional
        Water density [kg/m^3] for thrust and torque; default: fresh water at each run's
        temperature (``fluids_props.water``).
    temperature : str or Quantity, optional
        One water temperature for all runs.
    source : str

    Returns
    -------
    OpenWaterRuns
    """
    where = f"{source}: " if source else ""
    if len(frame) == 0:
        raise InputError(f"{where}no runs in the file; expected one row per run")
    cols = columns_to_si(frame, OPEN_WATER_COLUMNS, source, {"temperature": temperature})
    problems: list[str] = []
    ids = cols.get("run") or [str(i + 1) for i in range(len(frame))]
    _check_ids(ids, where, None, problems)
    n = cols.get("rotation_rate")
    va = cols.get("advance_speed")
    j = cols.get("advance_ratio")
    kt = cols.get("thrust_coefficient")
    kq = cols.get("torque_coefficient")
    if density is None and "temperature" in cols and (kt is None or kq is None):
        # Tank water: fresh water at the measured temperature of each run.
        density = np.asarray(fresh_water_si(cols["temperature"]).density_si, dtype=float)
    needs_d = (j is None) or (kt is None) or (kq is None)
    if needs_d and not (diameter and diameter > 0):
        problems.append(f"{where}propeller diameter: missing; expected the model diameter to "
                        "reduce measured speed, thrust and torque")
    if (kt is None or kq is None) and (density is None or not np.all(np.asarray(density) > 0)):
        problems.append(f"{where}water density: missing; expected it to reduce thrust and torque")
    if problems:
        raise InputError(problems)
    if j is None:
        if va is None or n is None:
            raise InputError(f"{where}column 'advance ratio [-]' missing; expected it or both "
                             "'advance speed [m/s]' and 'rotation rate [1/s]'")
        j = va / (n * diameter)
    if kt is None:
        if cols.get("thrust") is None or n is None:
            raise InputError(f"{where}column 'thrust coefficient [-]' missing; expected it or "
                             "'thrust [N]' with 'rotation rate [1/s]'")
        kt = cols["thrust"] / (density * n**2 * diameter**4)
    if kq is None:
        if cols.get("torque") is None or n is None:
            raise InputError(f"{where}column 'torque coefficient [-]' missing; expected it or "
                             "'torque [N m]' with 'rotation rate [1/s]'")
        kq = cols["torque"] / (density * n**2 * diameter**5)
    for i in range(len(ids)):
        if not j[i] >= 0:
            problems.append(f"{where}row {i + 2}: advance ratio {j[i]:g}; expected J >= 0")
        if not kq[i] > 0:
            problems.append(f"{where}row {i + 2}: torque coefficient {kq[i]:g}; expected "
                            "K_Q > 0")
    if n is not None and np.any(n <= 0):
        problems.append(f"{where}column 'rotation rate': values must be > 0")
    if problems:
        raise InputError(problems)
    return OpenWaterRuns(tuple(ids), np.asarray(j, float), np.asarray(kt, float),
                         np.asarray(kq, float), cols.get("temperature"), n, va, source)


def self_propulsion_runs_from_frame(frame, temperature: Any = None, source: str = "",
                                    plan_runs: Iterable[Any] | None = None,
                                    run_ids: str = "plan") -> SelfPropulsionRuns:
    """Check and convert a raw table of self-propulsion runs.

    Parameters
    ----------
    frame : pandas.DataFrame
        One row per run (per tow force in the load-varying method); headers with units (see
        :data:`SELF_PROPULSION_COLUMNS`): model speed, rotation rate (``[rpm]``, ``[rps]``,
        ``[Hz]`` or ``[1/s]``, all counting revolutions), thrust and torque per propeller, the
        tow force applied, the water temperature (or the ``temperature`` argument).
    temperature : str or Quantity, optional
        One water temperature for all runs.
    source : str
    plan_runs : iterable, optional
        Run ids of the plan's matrix (checked with ``run_ids="plan"``).
    run_ids : str
        ``"plan"`` (default), ``"facility"`` or ``"free"``: see
        :func:`resistance_runs_from_frame`.

    Returns
    -------
    SelfPropulsionRuns

    Raises
    ------
    InputError
        Missing columns, non-numeric cells, non-positive speeds, rates, thrusts or torques,
        temperatures outside 0 to 40 degC, duplicate run ids; one line each.
    """
    where = f"{source}: " if source else ""
    if len(frame) == 0:
        raise InputError(f"{where}no runs in the file; expected one row per run")
    cols = columns_to_si(frame, SELF_PROPULSION_COLUMNS, source, {"temperature": temperature})
    problems: list[str] = []
    ids, kind = _ids(cols, len(frame), run_ids, plan_runs, where, problems)
    _positive_cells(cols, (("speed", "model speed"), ("rotation_rate", "rotation rate"),
                           ("thrust", "thrust"), ("torque", "torque")), where, problems)
    _tank_temperatures(cols["temperature"], where, problems)
    if problems:
        raise InputError(problems)
    return SelfPropulsionRuns(tuple(ids), cols["speed"], cols["rotation_rate"], cols["thrust"],
                              cols["torque"], cols["tow_force"], cols["temperature"], source,
                              kind)


def read_self_propulsion_runs(path: str | Path, temperature: Any = None,
                              sheet: str | int | None = None,
                              plan_runs: Iterable[Any] | None = None,
                              run_ids: str = "plan") -> SelfPropulsionRuns:
    """Read measured self-propulsion runs from a CSV or xlsx file.

    Parameters
    ----------
    path : str or Path
        The file; columns (units in brackets, any unit of the right dimension):
        ``model speed [kn]``, ``rotation rate [rpm]``, ``thrust [N]``, ``torque [N m]``,
        ``tow force [N]``, ``water temperature [degC]``, optional ``run``.
    temperature : str or Quantity, optional
        One water temperature for all runs, e.g. ``"15.4 degC"``.
    sheet : str or int, optional
        Worksheet of an xlsx file.
    plan_runs : iterable, optional
        Run ids of the self-propulsion plan's matrix.
    run_ids : str
        ``"plan"`` (default), ``"facility"`` or ``"free"``: see
        :func:`resistance_runs_from_frame`.

    Returns
    -------
    SelfPropulsionRuns
    """
    frame = read_table(path, sheet)
    return self_propulsion_runs_from_frame(frame, temperature, Path(path).name, plan_runs,
                                           run_ids)


def read_open_water_runs(path: str | Path, diameter: Any = None, density: Any = None,
                         temperature: Any = None,
                         sheet: str | int | None = None) -> OpenWaterRuns:
    """Read propeller open-water runs from a CSV or xlsx file.

    Parameters
    ----------
    path : str or Path
    diameter : str or Quantity or float, optional
        Model propeller diameter, e.g. ``"0.25 m"`` (a float is taken in m).
    density : str or Quantity or float, optional
        Water density, e.g. ``"999.1 kg/m^3"`` (a float is taken in kg/m^3).
    temperature : str or Quantity, optional
        One water temperature for all runs.
    sheet : str or int, optional

    Returns
    -------
    OpenWaterRuns
    """
    def si(value, dim, name):
        if value is None or isinstance(value, (int, float)):
            return value  # already SI
        return to_si(value, dim, name)

    d = si(diameter, "[length]", "propeller diameter")
    rho = si(density, "[mass] / [length] ** 3", "water density")
    frame = read_table(path, sheet)
    return open_water_runs_from_frame(frame, d, rho, temperature, Path(path).name)


__all__ = [
    "EXTRA_RUN_PREFIX",
    "OPEN_WATER_COLUMNS",
    "RESISTANCE_COLUMNS",
    "SELF_PROPULSION_COLUMNS",
    "ColumnSpec",
    "columns_to_si",
    "open_water_runs_from_frame",
    "read_open_water_runs",
    "read_resistance_runs",
    "read_table",
    "read_self_propulsion_runs",
    "resistance_runs_from_frame",
    "self_propulsion_runs_from_frame",
    "split_header",
]

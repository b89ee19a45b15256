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

import io
import math
import re
import zipfile
from collections.abc import Iterable
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import numpy as np

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
from similitude.readers.fields import show, show_text
from similitude.readers.input_files import (
    DATA_FILE_LIMIT,
    UNPACKED_LIMIT,
    read_limited,
    shown_path,
    size_text,
)
from similitude.units import (
    UnitInputError,
    parse_quantity,
    radians_per_turn,
    spell_revolutions,
    to_si,
    ureg,
)

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
    try:  # the shared parser: guarded against odd text, any failure a UnitInputError
        probe = parse_quantity("1 " + text, "unit")
    except UnitInputError:
        raise InputError(
            f"column {show(header)}: unit {show(unit)} is not a known unit; expected e.g. "
            f"{spec.example!r}"
        ) from None
    expected = (ureg.Quantity(1.0, "dimensionless").dimensionality
                if spec.dimension == "dimensionless"
                else ureg.get_dimensionality(spec.dimension))
    if probe.dimensionality != expected:
        raise InputError(
            f"column {show(header)}: unit {show(unit)} has dimension {probe.dimensionality}; "
            f"expected {spec.dimension} (e.g. {spec.example!r})"
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

    The header is the first row that is not blank (or a ``#`` comment line of a CSV file); the
    rows keep their numbers as a spreadsheet shows them (``frame.attrs["rows"]``), so messages
    name the row a person finds. The file is checked before it is read
    (:func:`similitude.readers.input_files.read_limited`: a regular file of at most
    :data:`~similitude.readers.input_files.DATA_FILE_LIMIT` bytes; an xlsx file must unpack to
    at most :data:`~similitude.readers.input_files.UNPACKED_LIMIT` bytes).

    Parameters
    ----------
    path : str or Path
        ``.csv`` (comma-separated, ``#`` starts a comment line) or ``.xlsx``.
    sheet : str or int or None
        Worksheet of an xlsx file (default: the first).

    Raises
    ------
    InputError
        Missing, unreadable, too large or broken file, unknown file type, no header row, or a
        header written twice.
    """
    p = Path(path)
    label = f"measured data {shown_path(p.name or p)}"
    suffix = p.suffix.lower()
    if suffix not in (".csv", ".xlsx", ".xlsm"):
        raise InputError(f"{label}: has type {suffix or '(none)'!r}; expected .csv or .xlsx")
    data = read_limited(p, label, DATA_FILE_LIMIT, "a .csv or .xlsx table of runs")
    cells = _csv_cells(data, label) if suffix == ".csv" else _xlsx_cells(data, label, sheet)
    return _with_header(cells, label)


def _csv_cells(data: bytes, label: str):
    """Every cell of a CSV file as text, one frame row per line that is not blank or a
    comment, indexed by its line number."""
    import pandas as pd  # heavy: only when a measured file is read

    try:
        text = data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise InputError(f"{label}: is not UTF-8 text (byte {exc.start}); expected a UTF-8 "
                         "CSV file") from None
    if "\x00" in text:
        raise InputError(f"{label}: holds binary data; expected a UTF-8 CSV file")
    # comment and blank lines are left out; each frame row keeps its line number
    numbered = [(n, line) for n, line in enumerate(text.splitlines(), start=1)
                if line.strip() and not line.lstrip().startswith("#")]
    if not numbered:
        raise InputError(f"{label}: is empty; expected a header row and one row per run")
    try:
        cells = pd.read_csv(io.StringIO("\n".join(line for _, line in numbered) + "\n"),
                            header=None, dtype=str, comment="#", skipinitialspace=True,
                            keep_default_na=False, skip_blank_lines=False)
    except (ValueError, pd.errors.ParserError, pd.errors.EmptyDataError) as exc:
        raise InputError(f"{label}: is not a valid CSV table ({show_text(exc)}); expected "
                         "the same number of comma-separated fields on every line") from None
    cells.index = [n for n, _ in numbered][:len(cells)]
    return cells


def _xlsx_cells(data: bytes, label: str, sheet):
    """Every cell of one sheet of an xlsx file, indexed by the sheet's row numbers."""
    import pandas as pd  # heavy: only when a measured file is read

    buffer = io.BytesIO(data)
    try:
        with zipfile.ZipFile(buffer) as z:
            unpacked = sum(i.file_size for i in z.infolist())
    except (zipfile.BadZipFile, OSError, ValueError):
        raise InputError(f"{label}: is not a workbook (not a zip container); expected an xlsx "
                         "file saved by a spreadsheet program") from None
    if unpacked > UNPACKED_LIMIT:
        raise InputError(f"{label}: unpacks to {size_text(unpacked)}; expected a workbook of "
                         f"at most {size_text(UNPACKED_LIMIT)} unpacked")
    try:
        frame = pd.read_excel(buffer, sheet_name=0 if sheet is None else sheet, header=None,
                              dtype=object)
    except Exception as exc:  # noqa: BLE001 - a broken package fails in many ways inside
        raise InputError(f"{label}: cannot be read as a workbook ({type(exc).__name__}: "
                         f"{show_text(exc, 120)}); expected an xlsx file saved by a spreadsheet "
                         "program") from None
    frame.index = frame.index + 1  # the sheet's row numbers
    return frame


def _with_header(cells, label: str):
    """The frame under its header row, rows numbered as the spreadsheet shows them."""
    blank = cells.apply(lambda col: col.map(_is_blank)).all(axis=1).to_numpy()
    filled = np.flatnonzero(~blank)
    if filled.size == 0:
        raise InputError(f"{label}: has no header row; expected a header row such as "
                         "'model speed [m/s],total resistance [N],water temperature [degC]'")
    head = int(filled[0])
    headers = ["" if _is_blank(h) else str(h).strip() for h in cells.iloc[head].tolist()]
    _check_headers(headers, label)
    body = cells.iloc[head + 1:]
    keep = ~blank[head + 1:]
    frame = body[keep]
    frame.columns = headers
    frame.attrs["rows"] = [int(i) for i in np.asarray(body.index)[keep]]
    return frame.reset_index(drop=True)


def _check_headers(headers: list, label: str) -> None:
    """Refuse a header written over two columns (which of them would count?)."""
    seen: dict[str, int] = {}
    problems = []
    for j, h in enumerate(str(h).strip() for h in headers):
        if h and h in seen:
            problems.append(f"{label}: columns {seen[h] + 1} and {j + 1} both have the header "
                            f"{show(h)}; expected each column once")
        seen.setdefault(h, j)
    if problems:
        raise InputError(_bounded(problems))


def row_numbers(frame) -> list[int]:
    """The spreadsheet row of each frame row: as read (:func:`read_table`), else the header in
    row 1 and the runs from row 2."""
    rows = frame.attrs.get("rows")
    if rows is not None and len(rows) == len(frame):
        return list(rows)
    return [i + 2 for i in range(len(frame))]


def _find_columns(headers: list[Any], specs: Iterable[ColumnSpec], where: str,
                  problems: list[str]) -> dict[str, tuple[ColumnSpec, str, str | None]]:
    """key -> (spec, header, unit) of each column of ``specs`` found among the headers."""
    found: dict[str, tuple[ColumnSpec, str, str | None]] = {}
    for header in headers:
        name, unit = split_header(header)
        for spec in specs:
            if name in spec.names:
                if spec.key in found:
                    problems.append(f"{where}columns {show(found[spec.key][1])} and "
                                    f"{show(header)} both give {spec.names[0]}; expected one")
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


#: Problems named one by one in a column; further ones are counted in one line.
MAX_PROBLEMS_PER_COLUMN = 20


def _numbers(cells: list[Any], rows: list[int], header: str, where: str,
             problems: list[str]) -> np.ndarray | None:
    """The cells of one column as floats, or None after a problem per bad cell (the first
    :data:`MAX_PROBLEMS_PER_COLUMN`, then a count of the others)."""
    values = np.empty(len(cells))
    bad = 0
    for i, (row, cell) in enumerate(zip(rows, cells, strict=True)):
        number = None if _is_blank(cell) else _to_float(cell)
        if number is not None and math.isfinite(number):
            values[i] = number
            continue
        bad += 1
        if bad <= MAX_PROBLEMS_PER_COLUMN:
            what = "empty cell" if _is_blank(cell) else f"{show(cell)} is not a finite number"
            problems.append(f"{where}row {row}, column {show(header)}: {what}; expected a "
                            "number")
    if bad > MAX_PROBLEMS_PER_COLUMN:
        problems.append(f"{where}column {show(header)}: {bad - MAX_PROBLEMS_PER_COLUMN} more "
                        "rows without a finite number; expected a number in every row")
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
    _check_headers(headers, where.rstrip(": ") or "measured data")
    found = _find_columns(headers, specs, where, problems)
    n = len(frame)
    out: dict[str, Any] = {}
    # Rows are numbered as a spreadsheet shows them (row_numbers), kept for later messages.
    rows = row_numbers(frame)
    out["rows"] = rows
    for spec in specs:
        if spec.key in given and given[spec.key] is not None:
            if spec.key in found:
                problems.append(f"{where}{spec.names[0]}: given both as column "
                                f"{show(found[spec.key][1])} and as a single value; expected one")
                continue
            value = to_si(given[spec.key], spec.dimension, spec.names[0])
            out[spec.key] = np.full(n, value, dtype=float)
            continue
        if spec.key not in found:
            if spec.required:
                problems.append(f"{where}column {spec.example!r} missing; found columns "
                                + _short([show(str(h)) for h in headers]))
            continue
        spec, header, unit = found[spec.key]
        cells = list(frame[header])
        if spec.dimension is None:
            out[spec.key] = _run_ids(cells)
            continue
        if unit is None:
            problems.append(f"{where}column {show(header)} has no unit in its header; "
                            f"expected e.g. {spec.example!r}")
            continue
        try:
            convert = _unit_factor(unit, spec, header)
        except InputError as exc:
            problems.extend(f"{where}{p}" for p in exc.problems)
            continue
        values = _numbers(cells, rows, header, where, problems)
        if values is not None:
            si = convert(values)
            for i in np.flatnonzero(~np.isfinite(si))[:MAX_PROBLEMS_PER_COLUMN]:
                problems.append(f"{where}row {rows[i]}, column {show(header)}: {show(cells[i])} "
                                f"{unit} is not a finite value in {spec.si_unit or 'SI'}; "
                                "expected a measured value")
            out[spec.key] = si
    if problems:
        raise InputError(_bounded(problems))
    return out


def _check_ids(ids: list[str], where: str, plan_runs: Iterable[Any] | None,
               problems: list[str], rows: list[int]) -> None:
    seen: dict[str, int] = {}
    for i, rid in enumerate(ids):
        if rid in seen:
            problems.append(f"{where}row {rows[i]}, column 'run': run id {show(rid)} repeats "
                            f"row {rows[seen[rid]]}; expected each run once")
        else:
            seen[rid] = i
    if plan_runs is not None:
        allowed = {run_id(r) for r in plan_runs}
        for i, rid in enumerate(ids):
            if rid not in allowed and not rid.startswith(EXTRA_RUN_PREFIX):
                problems.append(f"{where}row {rows[i]}, column 'run': run {show(rid)} is not in "
                                f"the plan's run matrix; expected one of "
                                f"{_short(sorted(allowed))}")


#: Problems reported one per line; the rest are counted in one more line.
MAX_PROBLEMS = 50


def _bounded(problems: list[str]) -> list[str]:
    """At most :data:`MAX_PROBLEMS` lines, then how many more there were."""
    if len(problems) <= MAX_PROBLEMS:
        return problems
    return problems[:MAX_PROBLEMS] + [f"... and {len(problems) - MAX_PROBLEMS} more problems "
                                      "in the same file"]


def _positive_cells(cols: dict[str, Any], columns: Iterable[tuple[str, str]], where: str,
                    problems: list[str]) -> None:
    """A problem for each cell of the (key, column name) columns that is not > 0."""
    rows = cols["rows"]
    for key, label in columns:
        for i, v in enumerate(cols[key]):
            if not v > 0:
                problems.append(f"{where}row {rows[i]}, column {label!r}: {label} {v:g} "
                                f"(SI) is not positive; expected a {label} > 0")


def _tank_temperatures(values: np.ndarray, where: str, problems: list[str],
                       rows: list[int]) -> None:
    """A problem for each water temperature outside 0 to 40 degC (a towing tank's)."""
    for i, v in enumerate(values):
        if not 273.15 <= v <= 313.15:
            problems.append(f"{where}row {rows[i]}, column 'water temperature': "
                            f"{v - 273.15:.2f} "
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
    _check_ids(ids, where, plan_runs if run_ids == "plan" else None, problems, cols["rows"])
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
    _tank_temperatures(cols["temperature"], where, problems, cols["rows"])
    if "stimulator_drag" in cols:
        for i, v in enumerate(cols["stimulator_drag"]):
            if v < 0 or v >= cols["resistance"][i]:
                problems.append(f"{where}row {cols['rows'][i]}, column 'stimulator drag': "
                                f"{v:g} N; "
                                "expected 0 <= stimulator drag < total resistance")
    if problems:
        raise InputError(_bounded(problems))
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
    rows = cols["rows"]
    _check_ids(ids, where, None, problems, rows)
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
        raise InputError(_bounded(problems))
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
            problems.append(f"{where}row {rows[i]}, column 'advance ratio': {j[i]:g}; "
                            "expected J >= 0")
        if not kq[i] > 0:
            problems.append(f"{where}row {rows[i]}, column 'torque coefficient': {kq[i]:g}; "
                            "expected "
                            "K_Q > 0")
    if n is not None:
        for i in np.flatnonzero(~(n > 0)):
            problems.append(f"{where}row {rows[i]}, column 'rotation rate': {n[i]:g} 1/s; "
                            "expected a rotation rate > 0")
    if problems:
        raise InputError(_bounded(problems))
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
    _tank_temperatures(cols["temperature"], where, problems, cols["rows"])
    if problems:
        raise InputError(_bounded(problems))
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

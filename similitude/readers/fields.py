"""The generic field reader of the TOML readers: tables, choices, flags and quantities with units.

A :class:`FieldReader` reads the values of a parsed TOML document one key at a time and never
stops at the first problem: each problem is recorded with its key path, the value as written
and what was expected, and :meth:`FieldReader.finish` raises them together in one
:class:`similitude.errors.InputError`, one line each. Quantities are strings with units
(``"18 kn"``, ``"15 degC"``), converted to SI floats through the one unit registry
(:mod:`similitude.units`) and checked against plausibility limits. What a case file holds is
:mod:`similitude.readers.case_file`'s business.
"""

from __future__ import annotations

import datetime as _dt
import difflib
import math
from collections.abc import Mapping
from typing import Any

from fluids_props.units import shown
from similitude.errors import BAD_INPUT_ERRORS, InputError
from similitude.units import UnitInputError, parse_quantity, to_rotation_rate, to_si

# Dimensions (pint dimensionality strings), with a phrase and an example for messages.
LENGTH = "[length]"
AREA = "[length] ** 2"
VOLUME = "[length] ** 3"
SPEED = "[length] / [time]"
TIME = "[time]"
TEMPERATURE = "[temperature]"
PRESSURE = "[mass] / [length] / [time] ** 2"
RATE = "1 / [time]"
ACCEL = "[length] / [time] ** 2"
RATIO = "dimensionless"
FORCE = "[mass] * [length] / [time] ** 2"
TORQUE = "[mass] * [length] ** 2 / [time] ** 2"
POWER = "[mass] * [length] ** 2 / [time] ** 3"

DIM_WORDS = {
    LENGTH: "a length", AREA: "an area", VOLUME: "a volume", SPEED: "a speed", TIME: "a time",
    TEMPERATURE: "a temperature", PRESSURE: "a pressure", RATE: "a rotation rate or frequency",
    ACCEL: "an acceleration", RATIO: "a dimensionless number", FORCE: "a force",
    TORQUE: "a torque", POWER: "a power",
}
DIM_EXAMPLES = {
    LENGTH: "'3.2 m' or '10 ft'", AREA: "'12 m^2'", VOLUME: "'2100 m^3'",
    SPEED: "'2.5 m/s' or '18 kn'", TIME: "'10 min' or '3 h'", TEMPERATURE: "'15 degC'",
    PRESSURE: "'101325 Pa' or '2 bar'", RATE: "'12 Hz' or '600 rpm'", ACCEL: "'0.5 m/s^2'",
    RATIO: "'0.035' or '35 g/kg'", FORCE: "'150 N' or '30 lbf'", TORQUE: "'6 N*m'",
    POWER: "'1500 kW'",
}

#: Marks a key that is absent (a TOML value is never this object).
MISSING = object()


def show(value: Any) -> str:
    """A value as written in a message, shortened (:func:`fluids_props.units.shown`)."""
    return shown(value)


def show_text(text: str, limit: int = 200) -> str:
    """A message from elsewhere (a parser's) quoted in ours, cut to ``limit`` characters."""
    text = str(text)
    return text if len(text) <= limit else text[:limit - 3] + "..."


def key_path(path: str, key: str | int) -> str:
    """The key path of ``key`` under ``path``: ``path.key``, or ``path[i]`` for an index."""
    if isinstance(key, int):
        return f"{path}[{key}]"
    return f"{path}.{key}" if path else key


class FieldReader:
    """Reads fields of a parsed TOML document; collects problems, raises only in :meth:`finish`.

    Parameters
    ----------
    where : str
        Prefix of every problem (naming the file, e.g. a facility file), or "".
    top_keys : tuple of str
        The document's top-level keys: one of them found inside a table gets the hint that
        TOML reads a key written after ``[table]`` as part of that table.
    """

    def __init__(self, where: str = "", top_keys: tuple[str, ...] = ()) -> None:
        self.problems: list[str] = []
        self.where = where
        self.top_keys = top_keys

    # -- bookkeeping --------------------------------------------------------------------
    def problem(self, path: str, text: str) -> None:
        """Record a problem at key path ``path``."""
        prefix = f"{self.where}: " if self.where else ""
        self.problems.append(f"{prefix}{path}: {text}")

    def finish(self) -> None:
        """Raise every recorded problem in one InputError (one line each); else nothing."""
        if self.problems:
            raise InputError(self.problems)

    # -- tables -------------------------------------------------------------------------
    def table(self, data: Any, path: str, allowed: tuple[str, ...],
              required: tuple[str, ...] = ()) -> dict:
        """Check a table: its type, unknown keys (with a hint) and required keys."""
        if not isinstance(data, Mapping):
            self.problem(path, f"{show(data)} is not a table; expected a TOML table "
                         f"[{path}] with keys " + ", ".join(allowed))
            return {}
        for key in data:
            if key not in allowed:
                close = difflib.get_close_matches(str(key), allowed, n=1, cutoff=0.6)
                hint = f"; did you mean {close[0]!r}?" if close else ""
                if path and key in self.top_keys:
                    # TOML puts a key written after [table] into that table.
                    hint = (f"; a top-level {key!r} must come before the first [table] of "
                            "the file (TOML reads it as part of the table above it)")
                self.problem(key_path(path, key), "unknown key" + hint
                             + ("" if hint else "; expected one of " + ", ".join(allowed)))
        for key in required:
            if key not in data:
                self.problem(key_path(path, key), "missing; this key is required")
        return {k: v for k, v in data.items() if k in allowed}

    def tables(self, data: Any, path: str) -> list:
        """An array of tables ([[path]]) or a single table."""
        if isinstance(data, Mapping):
            return [data]
        if isinstance(data, list):
            if not data:
                self.problem(path, f"empty list; expected at least one [[{path}]] table, or "
                             "no key at all")
            return data
        self.problem(path, f"{show(data)} is not valid; expected [[{path}]] tables")
        return []

    # -- scalars ------------------------------------------------------------------------
    def text(self, data: Mapping, key: str, path: str, default: Any = None) -> Any:
        """A string (a TOML date or time as ISO text), or ``default`` when absent or bad."""
        value = data.get(key, MISSING)
        if value is MISSING:
            return default
        if isinstance(value, (_dt.date, _dt.datetime, _dt.time)):
            return value.isoformat()
        if not isinstance(value, str):
            self.problem(key_path(path, key), f"{show(value)} is not text; expected a string")
            return default
        return value

    def choice(self, data: Mapping, key: str, path: str, allowed: tuple[str, ...],
               default: Any = None, required: bool = False) -> Any:
        """The value of ``key``, one of ``allowed`` (see :meth:`choose`), or ``default``."""
        value = data.get(key, MISSING)
        if value is MISSING:
            if required:
                self.problem(key_path(path, key), "missing; expected one of " + ", ".join(allowed))
            return default
        return self.choose(value, key_path(path, key), allowed, default)

    def choose(self, value: Any, path: str, allowed: tuple[str, ...], default: Any = None):
        """``value`` as one of ``allowed`` (case, hyphens and spaces forgiven), or ``default``
        after recording the problem with a "did you mean" hint."""
        if isinstance(value, str):
            key = value.strip().lower().replace("-", "_").replace(" ", "_")
            if key in allowed:
                return key
            close = difflib.get_close_matches(key, allowed, n=1, cutoff=0.6)
            hint = f" (did you mean {close[0]!r}?)" if close else ""
        else:
            hint = ""
        self.problem(path, f"{show(value)} is not allowed{hint}; expected one of "
                     + ", ".join(allowed))
        return default

    def flag(self, data: Mapping, key: str, path: str, default: bool = False) -> bool:
        """A TOML boolean, or ``default`` when absent or bad."""
        value = data.get(key, MISSING)
        if value is MISSING:
            return default
        if not isinstance(value, bool):
            self.problem(key_path(path, key), f"{show(value)} is not valid; expected true or false")
            return default
        return value

    def integer(self, data: Mapping, key: str, path: str, low: int, high: int,
                default: int) -> int:
        """A whole number from ``low`` to ``high``, or ``default`` when absent or bad."""
        value = data.get(key, MISSING)
        if value is MISSING:
            return default
        if isinstance(value, bool) or not isinstance(value, int) or not low <= value <= high:
            self.problem(key_path(path, key), f"{show(value)} is not valid; expected a whole "
                         f"number from {low} to {high}")
            return default
        return value

    def quantity(self, value: Any, path: str, dim: str, limits: tuple[float, float],
                 strict_low: bool = True, bare_unit: str | None = None) -> float | None:
        """One quantity string → SI float, or None after recording the problem.

        ``bare_unit``: the unit a bare number is read in (dimensionless inputs and angles);
        otherwise a bare number is refused for a dimensional quantity.
        """
        what = DIM_WORDS.get(dim, dim)
        if isinstance(value, bool) or not isinstance(value, (str, int, float)):
            self.problem(path, f"{show(value)} is not valid; expected {what} as a string "
                         f"with a unit, e.g. {DIM_EXAMPLES.get(dim, '')}")
            return None
        if isinstance(value, (int, float)) and dim != RATIO and bare_unit is None:
            self.problem(path, f"{show(value)} has no unit; expected {what} as a string "
                         f"with a unit, e.g. {DIM_EXAMPLES.get(dim, '')}")
            return None
        try:
            if bare_unit is not None:
                # Angles: a bare number is read in bare_unit, a string may carry its unit.
                q = parse_quantity(value, path)
                plain = str(q.units) in ("dimensionless", "")
                if not q.dimensionless or not (plain or _is_angle(q.units)):
                    raise UnitInputError(f"{path}: {show(value)} is not an angle; expected "
                                         f"a number of degrees or a string such as '180 deg'")
                si = float(q.magnitude) if plain else float(q.to(bare_unit).magnitude)
            else:
                # n of J = V/(nD) counts revolutions (pint counts rpm in radians).
                si = to_rotation_rate(value, path) if dim == RATE else to_si(value, dim, path)
        except BAD_INPUT_ERRORS as exc:
            text = str(exc)
            prefix = f"{path}: "
            self.problem(path, text[len(prefix):] if text.startswith(prefix) else text)
            return None
        except Exception:  # noqa: BLE001 - pint can fail in many ways on odd strings
            self.problem(path, f"cannot read {show(value)}; expected {what}, e.g. "
                         f"{DIM_EXAMPLES.get(dim, '')}")
            return None
        if not isinstance(si, float):
            self.problem(path, f"{show(value)} is not one value; expected a single {what}")
            return None
        low, high = limits
        too_low = si <= low if strict_low else si < low
        if not math.isfinite(si) or too_low or si > high:
            shown = _si_text(si, dim, bare_unit)
            rel = ">" if strict_low else ">="
            self.problem(path, f"{show(value)} ({shown}) is out of range; expected {what} "
                         f"{rel} {_si_text(low, dim, bare_unit)} and <= "
                         f"{_si_text(high, dim, bare_unit)}")
            return None
        return si

    def field(self, data: Mapping, key: str, path: str, dim: str, limits: tuple[float, float],
              required: bool = False, **kw) -> float | None:
        """The quantity of ``key`` in SI (see :meth:`quantity`), or None when absent or bad."""
        value = data.get(key, MISSING)
        if value is MISSING:
            if required:
                self.problem(key_path(path, key), f"missing; expected {DIM_WORDS.get(dim, dim)}, "
                             f"e.g. {DIM_EXAMPLES.get(dim, '')}")
            return None
        return self.quantity(value, key_path(path, key), dim, limits, **kw)

    def quantities(self, data: Mapping, key: str, path: str, dim: str,
                   limits: tuple[float, float], required: bool = False,
                   **kw) -> tuple[float, ...] | None:
        """A list of quantities (a single value reads as a list of one)."""
        value = data.get(key, MISSING)
        p = key_path(path, key)
        if value is MISSING:
            if required:
                self.problem(p, f"missing; expected a list of {DIM_WORDS.get(dim, dim)} "
                             f"values, e.g. [{DIM_EXAMPLES.get(dim, '')}]")
            return None
        if not isinstance(value, list):
            value = [value]
            single = True
        else:
            single = False
        if not value:
            self.problem(p, "empty list; expected at least one value")
            return None
        out = []
        ok = True
        for i, item in enumerate(value):
            si = self.quantity(item, p if single else key_path(p, i), dim, limits, **kw)
            ok = ok and si is not None
            out.append(si)
        return tuple(out) if ok else None

    def limits(self, data: Mapping, key: str, path: str, dim: str,
               limits: tuple[float, float], required: bool = False) -> tuple | None:
        """A [low, high] pair of quantities."""
        value = data.get(key, MISSING)
        p = key_path(path, key)
        if value is MISSING:
            if required:
                self.problem(p, f"missing; expected [lowest, highest] as two "
                             f"{DIM_WORDS.get(dim, dim)} values")
            return None
        if not isinstance(value, list) or len(value) != 2:
            self.problem(p, f"{show(value)} is not valid; expected [lowest, highest], two "
                         f"values such as [{DIM_EXAMPLES.get(dim, '')}]")
            return None
        lo = self.quantity(value[0], key_path(p, 0), dim, limits, strict_low=False)
        hi = self.quantity(value[1], key_path(p, 1), dim, limits, strict_low=False)
        if lo is None or hi is None:
            return None
        if not (lo <= hi and hi > 0):
            self.problem(p, f"{show(value)} is not valid; expected lowest <= highest")
            return None
        return (lo, hi)


#: Units of plane angle (pint counts them dimensionless, like a percentage, which is not one).
ANGLE_UNITS = ("radian", "degree", "arcminute", "arcsecond", "turn", "gradian")


def _is_angle(units) -> bool:
    return str(units) in ANGLE_UNITS


def _si_text(si: float, dim: str, unit: str | None = None) -> str:
    if unit is not None:
        return f"{si:g} {unit}"
    if dim == TEMPERATURE:
        return f"{si:g} K"
    sym = {LENGTH: "m", AREA: "m^2", VOLUME: "m^3", SPEED: "m/s", TIME: "s", PRESSURE: "Pa",
           RATE: "1/s", ACCEL: "m/s^2", RATIO: "", FORCE: "N", TORQUE: "N m",
           POWER: "W"}.get(dim, "")
    return f"{si:g} {sym}".strip()


__all__ = [
    "ACCEL",
    "AREA",
    "DIM_EXAMPLES",
    "DIM_WORDS",
    "LENGTH",
    "MISSING",
    "PRESSURE",
    "RATE",
    "RATIO",
    "SPEED",
    "TEMPERATURE",
    "TIME",
    "VOLUME",
    "FORCE",
    "POWER",
    "TORQUE",
    "FieldReader",
    "key_path",
    "show",
    "show_text",
]

"""Units at the edge of similitude: the shared pint registry and parsing of user strings.

``similitude.units.ureg`` is pint's application registry, the same object ``fluids_props``
uses, so Quantities pass freely between the two packages and user code.
"""

from __future__ import annotations

import math
import re
from typing import Any

from fluids_props.units import (
    Q_,
    SI_UNITS,
    UnitInputError,
    example_unit,
    parse_quantity,
    si_quantity,
    to_si,
    ureg,
)

__all__ = [
    "Q_",
    "radians_per_turn",
    "spell_revolutions",
    "to_rotation_rate",
    "SI_UNITS",
    "UnitInputError",
    "example_unit",
    "parse_quantity",
    "format_scale",
    "parse_scale",
    "si_quantity",
    "to_si",
    "ureg",
]

#: "rev" as in "rev/s" or "rev/min": the trade's abbreviation, unknown to pint.
_REV = re.compile(r"\brevs?\b")

_RATIO = re.compile(r"^\s*(?P<a>\d+(?:\.\d*)?)\s*:\s*(?P<b>\d+(?:\.\d*)?)\s*$")


def parse_scale(value: Any, name: str = "scale") -> float:
    """Read a model scale as the ratio lambda = prototype length / model length.

    Parameters
    ----------
    value : str or number
        ``"1:25"`` (the trade's notation, model first), ``25`` or ``"25"``.
    name : str
        Field name for the error message.

    Returns
    -------
    float
        lambda (> 0). ``"1:25"`` gives 25.0.
    """
    if isinstance(value, str):
        m = _RATIO.match(value)
        if m:
            a, b = float(m.group("a")), float(m.group("b"))
            if a > 0 and b > 0:
                return b / a
        else:
            try:
                lam = float(value)
            except ValueError:
                lam = float("nan")
            if lam > 0:
                return lam
        raise UnitInputError(
            f"{name}: cannot read {value!r} as a scale; expected '1:25' or a positive number"
        )
    try:
        lam = float(value)
    except (TypeError, ValueError):
        lam = float("nan")
    if not lam > 0:
        raise UnitInputError(f"{name}: {value!r} is not a valid scale; expected a number > 0")
    return lam


def format_scale(scale: float, digits: int = 4) -> str:
    """The scale lambda in the trade's notation, model first: the inverse of :func:`parse_scale`.

    Parameters
    ----------
    scale : float
        lambda = prototype length / model length (> 0).
    digits : int
        Significant digits of a scale that is not a whole number.

    Returns
    -------
    str
        ``25 -> "1:25"``, ``24.63 -> "1:24.63"``; a model larger than its prototype
        (lambda < 1) the other way round: ``0.5 -> "2:1"``.
    """
    if scale < 1.0:
        return f"{_ratio_number(1.0 / scale, digits)}:1"
    return f"1:{_ratio_number(scale, digits)}"


def _ratio_number(x: float, digits: int) -> str:
    if abs(x - round(x)) < 1e-9 * max(1.0, x):
        return f"{round(x):d}"
    return f"{x:.{digits}g}"


def spell_revolutions(unit_text: str) -> str:
    """Spell the trade's "rev" (``"rev/min"``, ``"revs/s"``) as pint's ``revolution``."""
    return _REV.sub("revolution", unit_text)


def radians_per_turn(unit_text: str) -> float:
    """2 pi raised to the power of radian in a rate unit: 2 pi for rpm, rps and rad/s, 1 for
    Hz and 1/s.

    pint counts rpm and rps in radians (120 rpm -> 12.57 rad/s); a propeller's rotation rate
    n of J = V/(nD) counts revolutions, so dividing by this factor gives revolutions.
    """
    root = Q_(1.0, spell_revolutions(unit_text)).to_root_units()
    power = dict(root.unit_items()).get("radian", 0)
    return (2 * math.pi) ** power if power else 1.0


def to_rotation_rate(value: Any, name: str = "rotation rate"):
    """A rotation rate in revolutions per second [1/s].

    Parameters
    ----------
    value : str or pint.Quantity
        ``"120 rpm"``, ``"2 rps"``, ``"2 rev/s"``, ``"2 Hz"``, ``"12.566 rad/s"`` ... (all
        give 2.0).
    name : str
        Field name for error messages.
    """
    if isinstance(value, str):
        value = spell_revolutions(value)
    si = to_si(value, "1 / [time]", name)  # checks the dimension, echoing the user's text
    return si / radians_per_turn(str(parse_quantity(value, name).units))

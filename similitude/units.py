"""Units at the edge of similitude: the shared pint registry and parsing of user strings.

``similitude.units.ureg`` is pint's application registry, the same object ``fluids_props``
uses, so Quantities pass freely between the two packages and user code.
"""

from __future__ import annotations

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
    "SI_UNITS",
    "UnitInputError",
    "example_unit",
    "parse_quantity",
    "parse_scale",
    "si_quantity",
    "to_si",
    "ureg",
]

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

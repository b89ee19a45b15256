"""Plain data for JSON: one converter from the program's values to what ``json`` can write.

Result objects (``Plan.to_dict``, ``Extrapolation.to_dict``) and the commands' ``--json``
output go through :func:`plain`; :func:`to_json` writes strict JSON (no NaN or Infinity).
"""

from __future__ import annotations

import json
import math
from typing import Any

import numpy as np


def plain(value: Any) -> Any:
    """``value`` as plain Python data: dicts with text keys, lists, numbers, text, None.

    numpy scalars and arrays become Python numbers and lists; a non-finite float becomes None
    (strict JSON has no NaN or Infinity); dates and times their ISO text; sets and tuples
    lists; anything else unknown its text.
    """
    if isinstance(value, dict):
        return {str(k): plain(v) for k, v in value.items()}
    if isinstance(value, (list, tuple, set, frozenset)):
        return [plain(v) for v in value]
    if isinstance(value, np.ndarray):
        return [plain(v) for v in value.tolist()]
    if isinstance(value, (bool, np.bool_)):
        return bool(value)
    if isinstance(value, (int, np.integer)):
        return int(value)
    if isinstance(value, (float, np.floating)):
        f = float(value)
        return f if math.isfinite(f) else None
    if value is None or isinstance(value, str):
        return value
    if hasattr(value, "isoformat"):
        return value.isoformat()
    return str(value)


def to_json(value: Any) -> str:
    """Strict JSON text of ``value`` (through :func:`plain`), indented for reading."""
    return json.dumps(plain(value), indent=2, allow_nan=False)


__all__ = ["plain", "to_json"]

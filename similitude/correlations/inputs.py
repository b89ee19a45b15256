"""Checking the numeric inputs of the formula modules (friction, blockage, ITTC-1978 ...)."""

from __future__ import annotations

import numpy as np

from similitude.errors import InputError


def as_array(value, name: str, *, positive: bool = False, nonnegative: bool = False):
    """``value`` as a float array, refusing non-finite, and optionally non-positive, entries.

    Raises
    ------
    InputError
        Naming the argument, the first bad value and what was expected.
    """
    arr = np.asarray(value, dtype=float)
    if np.any(~np.isfinite(arr)):
        raise InputError(f"{name}: got {value!r}; expected finite numbers")
    for flag, bad, what in ((positive, arr <= 0, "a positive number"),
                            (nonnegative, arr < 0, "zero or a positive number")):
        if flag and np.any(bad):
            first = float(arr[bad].flat[0]) if arr.ndim else float(arr)
            raise InputError(f"{name}: got {first:g}; expected {what}")
    return arr


def scalar_or_array(arr):
    """A 0-d result as a Python float, arrays unchanged."""
    return arr if np.ndim(arr) else float(arr)


def check_method(method: str, names: tuple[str, ...]) -> None:
    """Refuse a method name that is not one of ``names``, listing them."""
    if method not in names:
        raise InputError(f"method: got {method!r}; expected one of {', '.join(names)}")

"""Validity ranges of correlations and the errors raised outside them."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np


class OutOfRangeError(ValueError):
    """An input lies outside the validity range of a correlation."""


@dataclass(frozen=True)
class Range:
    """Closed validity interval of one input, in SI.

    Attributes
    ----------
    quantity : str
        Name of the input, e.g. ``"temperature"``.
    low, high : float
        Bounds in SI units [K, Pa, kg/kg, ...].
    unit : str
        SI unit of the bounds, used in messages.
    """

    quantity: str
    low: float
    high: float
    unit: str

    def text(self) -> str:
        """The range written for people, with degC beside kelvin for temperatures."""
        if self.unit == "K":
            return (f"{self.low - 273.15:g} to {self.high - 273.15:g} degC "
                    f"({self.low:g} to {self.high:g} K)")
        if self.unit == "kg/kg":
            return f"{self.low * 1e3:g} to {self.high * 1e3:g} g/kg"
        if self.unit == "Pa":
            return f"{self.low:g} to {self.high:g} Pa"
        return f"{self.low:g} to {self.high:g} {self.unit}"

    def value_text(self, value: float) -> str:
        if self.unit == "K":
            return f"{value - 273.15:g} degC"
        if self.unit == "kg/kg":
            return f"{value * 1e3:g} g/kg"
        return f"{value:g} {self.unit}"


def check(values, rng: Range, where: str, extrapolate: bool = False) -> None:
    """Raise :class:`OutOfRangeError` if any finite value lies outside ``rng``.

    NaN input passes through (it propagates to NaN output); only the user can put it there.

    Parameters
    ----------
    values : float or array_like
        Input in the SI unit of ``rng``.
    rng : Range
        The validity range.
    where : str
        Name of the correlation or fluid, for the message.
    extrapolate : bool
        If True, no check is made (the caller accepts extrapolation).
    """
    if extrapolate:
        return
    arr = np.asarray(values, dtype=float)
    bad = np.isfinite(arr) & ((arr < rng.low) | (arr > rng.high))
    if np.any(bad):
        first = float(arr[bad].flat[0]) if arr.ndim else float(arr)
        raise OutOfRangeError(
            f"{rng.quantity} {rng.value_text(first)} is outside the validity range of {where}: "
            f"{rng.text()}; pass extrapolate=True to evaluate anyway"
        )

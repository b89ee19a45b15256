"""Validity ranges of correlations and the errors raised outside them."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np


class OutOfRangeError(ValueError):
    """An input lies outside the validity range of a correlation."""


class ShapeMismatchError(ValueError):
    """Array inputs whose shapes do not broadcast together."""


def common_shape(where: str, **inputs) -> tuple[int, ...]:
    """The broadcast shape of named array inputs, or a one-line error naming them.

    Parameters
    ----------
    where : str
        Name of the fluid, for the message.
    **inputs : array_like
        The inputs by name (``temperature=..., pressure=...``).

    Raises
    ------
    ShapeMismatchError
        When numpy cannot broadcast the shapes together.
    """
    shapes = {k: np.shape(v) for k, v in inputs.items()}
    try:
        return np.broadcast_shapes(*shapes.values())
    except ValueError:
        listed = ", ".join(f"{k} {v}" for k, v in shapes.items())
        raise ShapeMismatchError(
            f"{where}: input shapes do not broadcast ({listed}); expected equal shapes, scalars,"
            " or shapes numpy broadcasts such as (3,) with (2, 1)"
        ) from None


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
    """Raise :class:`OutOfRangeError` if any value other than NaN lies outside ``rng``.

    NaN input passes through (it propagates to NaN output); only the user can put it there.
    An infinite value is outside every range and is refused.

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
    bad = ~np.isnan(arr) & ((arr < rng.low) | (arr > rng.high))
    if np.any(bad):
        first = float(arr[bad].flat[0]) if arr.ndim else float(arr)
        raise OutOfRangeError(
            f"{rng.quantity} {rng.value_text(first)} is outside the validity range of {where}: "
            f"{rng.text()}; pass extrapolate=True (--extrapolate on the command line) to "
            "evaluate anyway"
        )

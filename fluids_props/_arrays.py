"""Array helpers shared by the fluid modules (private).

Each ``<fluid>_si`` core does the same few things around its formulas: turn its inputs into
float arrays and check that their shapes broadcast, check each input against its validity
range, and give a scalar back for scalar input. They live here once; the formulas stay in the
module of their fluid.
"""

from __future__ import annotations

from typing import Any

import numpy as np

from .validity import Range, check, common_shape


def float_arrays(where: str, **inputs: Any) -> tuple[tuple[np.ndarray, ...], tuple[int, ...]]:
    """The inputs as float arrays (not broadcast) and their common broadcast shape.

    Parameters
    ----------
    where : str
        Name of the fluid, for the message of a shape mismatch.
    **inputs : float or array_like
        The inputs by name, in the order the message lists them (``temperature=...,
        pressure=...``).

    Returns
    -------
    arrays : tuple of ndarray
        ``np.asarray(value, dtype=float)`` of each input, in the order given.
    shape : tuple of int
        The shape they broadcast to.

    Raises
    ------
    ShapeMismatchError
        When numpy cannot broadcast the shapes together (the message names each input).
    """
    arrays = {name: np.asarray(value, dtype=float) for name, value in inputs.items()}
    shape = common_shape(where, **arrays)
    return tuple(arrays.values()), shape


def broadcast_float_arrays(where: str, **inputs: Any) -> list[np.ndarray]:
    """The inputs as float arrays broadcast to their common shape (read-only views).

    See :func:`float_arrays` for the parameters and the error.
    """
    arrays, _ = float_arrays(where, **inputs)
    return np.broadcast_arrays(*arrays)


def check_ranges(where: str, extrapolate: bool, *pairs: tuple[Any, Range]) -> None:
    """Check each ``(values, range)`` pair in turn with :func:`fluids_props.validity.check`.

    The first input out of its range raises :class:`OutOfRangeError`; nothing is checked when
    ``extrapolate`` is True.
    """
    for values, rng in pairs:
        check(values, rng, where, extrapolate)


def numpy_scalar(x: Any) -> Any:
    """0-d arrays back to numpy scalars, so scalar input gives scalar output; others unchanged."""
    return x[()] if isinstance(x, np.ndarray) and x.ndim == 0 else x


def float_or_array(v: Any) -> float | np.ndarray:
    """A float array, or a Python float when it holds a single value (0-d)."""
    v = np.asarray(v, dtype=float)
    return float(v) if v.ndim == 0 else v


def broadcast_copy(x: Any, shape: tuple[int, ...]) -> Any:
    """``x`` broadcast to ``shape`` as an array of its own (not a view), or a numpy scalar."""
    return numpy_scalar(np.array(np.broadcast_to(x, shape)))


def is_uniform(a: np.ndarray) -> bool:
    """True when an array holds one (finite) value throughout, or is 0-d and finite."""
    if a.ndim == 0:
        return bool(np.isfinite(a))
    return a.size > 0 and bool(np.isfinite(a.flat[0])) and bool(np.all(a == a.flat[0]))


def horner(coeffs, x):
    """Horner evaluation of ``sum_n c_n x^n`` (coefficients in rising order)."""
    x = np.asarray(x, dtype=float)
    out = np.full(x.shape, float(coeffs[-1]))
    for c in coeffs[-2::-1]:  # in place: no temporary array per coefficient on large grids
        out *= x
        out += c
    return out if out.ndim else out[()]

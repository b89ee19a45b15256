"""The one unit registry of the project and the conversion of user input to SI.

Both packages (``fluids_props`` and ``similitude``) and their users share pint's application
registry, so a Quantity made by a user with ``pint.get_application_registry()`` or with
``similitude.units.ureg`` is accepted everywhere and results can be combined freely.

Inside the correlations everything is a plain SI float or numpy array; this module is the edge
where strings ("15 degC", "59 degF", "35 g/kg", "2 bar") and Quantities become SI numbers.
"""

from __future__ import annotations

import functools
import inspect
import re
from collections.abc import Callable
from typing import Any

import numpy as np
import pint


def _shared_registry():
    """Return pint's application registry, installing a disk-cached one if pint's is unbuilt.

    Building pint's default registry parses its definition file (~0.3 s on a quiet machine);
    a registry with ``cache_folder=":auto:"`` reads the parsed result from the user cache
    instead (~0.05 s). It becomes pint's application registry, so users, ``fluids_props`` and
    ``similitude`` still share one registry. A registry the user built or set before this import
    is kept as it is.
    """
    app = pint.get_application_registry()
    if isinstance(app.get(), pint.registry.LazyRegistry):  # pint's own default, still unbuilt
        try:
            pint.set_application_registry(pint.UnitRegistry(cache_folder=":auto:"))
        except Exception:  # noqa: BLE001 - unwritable or half-written cache: build without it
            pint.set_application_registry(pint.UnitRegistry())
    return app


ureg = _shared_registry()
Q_ = ureg.Quantity

#: SI unit, per pint dimensionality, used for the inside of the packages.
SI_UNITS: dict[str, str] = {
    "[temperature]": "K",
    "[length]": "m",
    "[mass]": "kg",
    "[time]": "s",
    "[mass] / [length] / [time] ** 2": "Pa",
    "[mass] / [length] ** 3": "kg/m^3",
    "[length] / [time]": "m/s",
    "[length] ** 2 / [time]": "m^2/s",
    "[mass] / [length] / [time]": "Pa*s",
    "[mass] / [time] ** 2": "N/m",
    "[length] / [time] ** 2": "m/s^2",
    "[length] ** 2": "m^2",
    "[length] ** 3": "m^3",
    "[mass] * [length] / [time] ** 2": "N",
    "[mass] * [length] ** 2 / [time] ** 3": "W",
    "[mass] * [length] ** 2 / [time] ** 2": "J",
    "1 / [time]": "1/s",
    "dimensionless": "",
}

_NUMBER_UNIT = re.compile(
    r"^\s*(?P<num>[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(?P<unit>.*?)\s*$"
)
#: Longest quantity text read [characters]: pint's parser slows down with the square of the
#: length, and "15 degC" or "1.1e-6 m^2/s" need a few characters.
QUANTITY_TEXT_LIMIT = 100
#: Longest echo of a user value in a message [characters].
SHOWN_LIMIT = 60
_EXPONENT_OPERATOR = re.compile(r"\*\*|\^")
_PLAIN_EXPONENT = re.compile(r"\s*[-+]?\d{1,2}(?:\.\d{1,3})?(?![\d.])")
#: Symbols pint does not read, with what to write instead (for the message).
_SYMBOL_HINTS = {"\u2103": "degC", "\u2109": "degF", "\u00ba": "deg", "\u212a": "K",
                 "\u2126": "ohm"}
_EXAMPLE_TEXT = "expected a number and a unit such as '15 degC' or '2 bar'"


class UnitInputError(ValueError):
    """A value could not be read as a quantity of the expected dimension."""


def shown(value, limit: int = SHOWN_LIMIT) -> str:
    """``repr(value)`` for a message, shortened to about ``limit`` characters.

    A long text keeps its start and says how long it was, so a 100,000-character value never
    fills a terminal.
    """
    if isinstance(value, str) and len(value) > limit:
        return repr(value[:limit - 10]) + f"... ({len(value):,} characters)"
    if isinstance(value, (list, tuple)) and len(value) > 8:
        return (repr(type(value)(value[:3]))[:-1] + f", ... ({len(value):,} items)"
                + ("]" if isinstance(value, list) else ")"))
    text = repr(value)
    return text if len(text) <= limit else text[:limit - 3] + "..."


def _text_problem(text: str) -> str | None:
    """Why a quantity text is refused before pint parses it, or None.

    Exponents must be plain numbers (``m^2``, ``s**-1``): pint evaluates an exponent tower
    such as ``2**2**2**2**2**2`` as Python arithmetic and never ends.
    """
    if len(text) > QUANTITY_TEXT_LIMIT:
        return f"is {len(text):,} characters long; expected at most {QUANTITY_TEXT_LIMIT}"
    for m in _EXPONENT_OPERATOR.finditer(text):
        e = _PLAIN_EXPONENT.match(text, m.end())
        if e is None or _EXPONENT_OPERATOR.match(text[e.end():].lstrip()):
            return "has an exponent that is not a plain number; expected e.g. 'm^2' or 's^-1'"
    for symbol, instead in _SYMBOL_HINTS.items():
        if symbol in text:
            return f"uses the symbol {symbol!r}, which is not read; write {instead!r} instead"
    return None


def parse_quantity(value: Any, name: str = "value") -> pint.Quantity:
    """Turn a user value into a Quantity of the shared registry.

    Parameters
    ----------
    value : str, pint.Quantity, number or array
        ``"15 degC"``, ``"2 bar"``, ``"35 g/kg"``, a Quantity from any pint registry, or a bare
        number (dimensionless).
    name : str
        Name of the field, used in error messages.

    Returns
    -------
    pint.Quantity
        A Quantity of :data:`ureg`.

    Notes
    -----
    pint's plain string parser reads ``"15 degC"`` as a product and refuses the offset unit;
    here a leading number is split from its unit, so offset units parse as users expect.
    """
    if isinstance(value, pint.Quantity):
        if value._REGISTRY is ureg.get():
            return value
        # A Quantity of another registry: rebuild it here through its unit name.
        return Q_(value.magnitude, str(value.units))
    if isinstance(value, str):
        return _parse_text(value, name)
    if isinstance(value, np.ndarray) and value.dtype.kind in "OUS":
        value = value.tolist()
    if isinstance(value, (list, tuple)):
        return _parse_list(value, name)
    if isinstance(value, (bool, np.bool_)):
        raise UnitInputError(f"{name}: {value!r} is not a quantity; expected a string such as "
                             "'15 degC', a pint Quantity or a number")
    if isinstance(value, (int, float, np.integer, np.floating)):
        return Q_(float(value), "dimensionless")
    if isinstance(value, np.ndarray):
        if value.dtype.kind not in "iuf":
            raise UnitInputError(f"{name}: an array of {value.dtype} is not a quantity; "
                                 "expected real numbers")
        return Q_(value.astype(float), "dimensionless")
    raise UnitInputError(
        f"{name}: cannot read {shown(value)} (type {type(value).__name__}) as a quantity; "
        "expected a string such as '15 degC', a pint Quantity or a number"
    )


def _parse_text(value: str, name: str) -> pint.Quantity:
    """A quantity from a user's text; any failure of the parser is a :class:`UnitInputError`."""
    text = value.strip()
    problem = _text_problem(text)
    if problem is not None:
        raise UnitInputError(f"{name}: {shown(value)} {problem}")
    match = _NUMBER_UNIT.match(text)
    try:
        if match:
            unit = match.group("unit") or "dimensionless"
            q = Q_(float(match.group("num")), unit)
        else:
            q = Q_(text)
        if not isinstance(q, pint.Quantity):  # pint reads a bare number text as a number
            q = Q_(float(q), "dimensionless")
        return q
    except Exception:  # noqa: BLE001 - pint's parser fails in many ways on odd text
        raise UnitInputError(f"{name}: cannot read {shown(value)} as a quantity; "
                             f"{_EXAMPLE_TEXT}") from None


def _parse_list(values, name: str) -> pint.Quantity:
    """One array Quantity from a list of quantities (all with units) or of bare numbers."""
    texts = [isinstance(v, (str, pint.Quantity)) for v in values]
    if values and all(texts):
        parts = [parse_quantity(v, f"{name}[{i}]") for i, v in enumerate(values)]
        unit = parts[0].units
        for i, p in enumerate(parts):
            if p.dimensionality != parts[0].dimensionality:
                raise UnitInputError(f"{name}[{i}]: {shown(values[i])} has another dimension "
                                     f"than {shown(values[0])}; expected one kind of quantity")
        return Q_(np.array([p.to(unit).magnitude for p in parts], dtype=float), unit)
    if any(texts):
        i = texts.index(True)
        raise UnitInputError(f"{name}: {shown(values)} mixes values with units ({name}[{i}] = "
                             f"{shown(values[i])}) and bare numbers; expected every value "
                             "with its unit")
    try:
        array = np.asarray(values, dtype=float)
    except (TypeError, ValueError, OverflowError):
        raise UnitInputError(f"{name}: {shown(values)} is not a list of numbers; expected "
                             "numbers or strings such as '15 degC'") from None
    return Q_(array, "dimensionless")


def to_si(value: Any, dimension: str, name: str = "value") -> float | np.ndarray:
    """Convert a user value to SI magnitude after checking its dimension.

    Parameters
    ----------
    value : str, pint.Quantity, number or array
        The user value. A bare number is refused unless ``dimension`` is ``"dimensionless"``.
    dimension : str
        pint dimensionality string, e.g. ``"[temperature]"``, ``"[length] / [time]"``, or a
        unit whose dimension is wanted, e.g. ``"Pa"``.
    name : str
        Field name for the error message.

    Returns
    -------
    float or numpy.ndarray
        Magnitude in the SI unit of that dimension (temperatures in kelvin).

    Raises
    ------
    UnitInputError
        If the value cannot be parsed or has another dimension.
    """
    dim = _dimensionality(dimension)
    q = parse_quantity(value, name)
    if q.dimensionality != dim:
        got = "dimensionless" if q.dimensionless else str(q.dimensionality)
        if q.dimensionless and not isinstance(value, (str, pint.Quantity)):
            got = "a bare number"
        raise UnitInputError(
            f"{name}: {shown(value)} has dimension {got}; expected {dim_text(dim)}"
            f" (e.g. {example_unit(dim)})"
        )
    unit = SI_UNITS.get(str(dim)) if str(dim) != "dimensionless" else ""
    if unit is None:
        mag = q.to_base_units().magnitude
    elif unit == "":
        mag = q.to("dimensionless").magnitude
    else:
        mag = q.to(unit).magnitude
    if isinstance(mag, np.ndarray):
        return mag.astype(float)
    return float(mag)


def _dimensionality(dimension: str):
    if dimension.startswith("[") or dimension == "dimensionless" or "[" in dimension:
        if dimension == "dimensionless":
            return Q_(1.0, "dimensionless").dimensionality
        return ureg.get_dimensionality(dimension)
    return Q_(1.0, dimension).dimensionality


def dim_text(dim) -> str:
    """Readable text of a pint dimensionality."""
    text = str(dim)
    return "dimensionless" if text == "dimensionless" else text


_EXAMPLES = {
    "[temperature]": "'15 degC'",
    "[length]": "'3.2 m'",
    "[length] / [time]": "'2.5 m/s' or '18 kn'",
    "[mass] / [length] / [time] ** 2": "'101325 Pa' or '2 bar'",
    "[mass] / [length] ** 3": "'1000 kg/m^3'",
    "[length] ** 2 / [time]": "'1.1e-6 m^2/s'",
    "[mass] / [length] / [time]": "'1e-3 Pa*s'",
    "[length] ** 2": "'12 m^2'",
    "1 / [time]": "'10 Hz' or '600 rpm'",
    "dimensionless": "'0.035' or '35 g/kg'",
    "[time]": "'3 s'",
}


def example_unit(dim) -> str:
    """An example of a well-formed value of this dimension, for error messages."""
    return _EXAMPLES.get(str(dim), f"a value in {SI_UNITS.get(str(dim), 'SI units')}")


def si_quantity(magnitude: Any, unit: str) -> pint.Quantity:
    """Wrap an SI magnitude (float or array) as a Quantity of the shared registry."""
    return Q_(magnitude, unit)


def si_edge(core: Callable[..., Any], **dimensions: str) -> Callable[[Callable], Callable]:
    """Make the decorated function the unit edge of an SI ``core``, declaring each dimension once.

    The decorated function gives the public signature, its defaults and its docstring; its body
    is not run. A call binds the arguments to that signature, converts each argument named in
    ``dimensions`` with :func:`to_si` (so a wrong unit fails at the door with a message naming
    the argument, the value and the expected dimension), passes the others unchanged, and returns
    what ``core`` returns. The core is left as it is, for callers that already hold SI values.

    Parameters
    ----------
    core : callable
        The SI function. Each of its parameters takes the public argument of the same name, or
        of its name without a unit suffix (``temperature_K`` takes ``temperature``,
        ``pressure_Pa`` takes ``pressure``); the arguments are converted in the order of the
        core's parameters.
    **dimensions : str
        Public argument name -> what :func:`to_si` expects, e.g. ``temperature="[temperature]"``,
        ``pressure="[pressure]"``, ``salinity="dimensionless"``.

    Returns
    -------
    callable
        A decorator; the public function it returns keeps name, docstring and signature
        (``functools.wraps``).

    Raises
    ------
    TypeError
        At decoration, when a public argument has no core parameter to go to, a dimension names
        no public argument, or a core parameter without default gets no argument.

    Examples
    --------
    >>> def speed_si(speed_m_s, extrapolate=False):
    ...     return speed_m_s
    >>> @si_edge(speed_si, speed="[length] / [time]")
    ... def speed(speed, extrapolate=False):
    ...     "Speed in m/s."
    >>> speed("36 km/h")
    10.0
    """

    def decorate(public: Callable) -> Callable:
        signature = inspect.signature(public)
        routes = _routes(public, signature, core, dimensions)

        @functools.wraps(public)
        def edge(*args, **kwargs):
            try:
                bound = signature.bind(*args, **kwargs)
            except TypeError:
                public(*args, **kwargs)  # raises Python's own message, naming the function
                raise
            bound.apply_defaults()
            given = bound.arguments
            return core(**{
                target: given[name] if dimension is None else to_si(given[name], dimension, name)
                for name, target, dimension in routes
            })

        return edge

    return decorate


def _routes(public, signature, core, dimensions) -> tuple[tuple[str, str, str | None], ...]:
    """(public name, core parameter, dimension or None) in the order of the core's parameters."""
    public_names = list(signature.parameters)
    unknown = sorted(set(dimensions) - set(public_names))
    if unknown:
        raise TypeError(f"si_edge of {public.__name__}: no argument named {', '.join(unknown)}")
    routes = []
    for target, param in inspect.signature(core).parameters.items():
        if param.kind in (param.VAR_POSITIONAL, param.VAR_KEYWORD):
            continue
        prefixes = [n for n in public_names if target.startswith(n + "_")]
        name = target if target in public_names else max(prefixes, key=len, default=None)
        if name is None:
            if param.default is param.empty:
                raise TypeError(f"si_edge of {public.__name__}: nothing for {core.__name__}'s "
                                f"parameter {target!r}")
            continue
        routes.append((name, target, dimensions.get(name)))
    missing = sorted(set(public_names) - {name for name, _, _ in routes})
    if missing:
        raise TypeError(f"si_edge of {public.__name__}: {core.__name__} takes no "
                        f"{', '.join(missing)}")
    return tuple(routes)

"""The catalogue of fluids: what is available, over which ranges, and how to evaluate it."""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field

from .validity import Range


@dataclass(frozen=True)
class FluidInfo:
    """One fluid of the catalogue.

    Attributes
    ----------
    name : str
        Registry name, e.g. ``"fresh_water"``, ``"sea_water"``, ``"air"``, ``"nitrogen"``.
    kind : str
        ``"liquid"`` or ``"gas"``.
    description : str
        One line for listings.
    ranges : tuple of Range
        Validity ranges of the inputs (temperature [K], pressure [Pa], salinity [kg/kg] ...).
    evaluate_si : callable
        ``evaluate_si(temperature_K, pressure_Pa, extrapolate=False, **extra) -> FluidState``,
        vectorised over numpy arrays; the solver calls it on large grids.
    sources : tuple of str
        Short citations of the correlations.
    fixed_pressure : bool
        True when the correlation holds only at one pressure (e.g. 0.101325 MPa).
    """

    name: str
    kind: str
    description: str
    ranges: tuple[Range, ...]
    evaluate_si: Callable
    sources: tuple[str, ...] = ()
    fixed_pressure: bool = False
    options: dict = field(default_factory=dict)

    def range_of(self, quantity: str) -> Range | None:
        """The validity range of one input, or None."""
        for r in self.ranges:
            if r.quantity == quantity:
                return r
        return None

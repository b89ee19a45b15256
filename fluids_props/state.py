"""The state of a fluid: its properties at one temperature and pressure (or arrays of them)."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np

from .units import si_quantity


@dataclass(frozen=True)
class FluidState:
    """Thermophysical properties of a fluid at a state, stored in SI.

    The ``*_si`` fields are SI floats or numpy arrays (broadcast to a common shape); the
    properties without suffix return pint Quantities of the shared registry.
    Properties that do not apply (surface tension of a gas, speed of sound of a liquid when no
    correlation is implemented) are ``None``.

    Attributes
    ----------
    fluid : str
        Registry name of the fluid, e.g. ``"fresh_water"``.
    temperature_si : float or ndarray
        Temperature [K].
    pressure_si : float or ndarray
        Absolute pressure [Pa].
    density_si : float or ndarray
        Density [kg/m^3].
    dynamic_viscosity_si : float or ndarray
        Dynamic viscosity [Pa s].
    vapour_pressure_si : float or ndarray or None
        Saturation vapour pressure [Pa] (liquids).
    surface_tension_si : float or ndarray or None
        Surface tension against air [N/m] (liquids).
    speed_of_sound_si : float or ndarray or None
        Speed of sound [m/s].
    extra : dict
        Further state variables (e.g. ``salinity`` [kg/kg], ``relative_humidity`` [-],
        ``ratio_of_specific_heats`` [-]), SI.
    sources : tuple of str
        Short citations of the correlations used, one per property.
    """

    fluid: str
    temperature_si: Any
    pressure_si: Any
    density_si: Any
    dynamic_viscosity_si: Any
    vapour_pressure_si: Any = None
    surface_tension_si: Any = None
    speed_of_sound_si: Any = None
    extra: dict = field(default_factory=dict)
    sources: tuple = ()

    # -- derived, SI ---------------------------------------------------------------------
    @property
    def kinematic_viscosity_si(self) -> Any:
        """Kinematic viscosity [m^2/s], dynamic viscosity over density."""
        return np.divide(self.dynamic_viscosity_si, self.density_si)

    # -- Quantities ----------------------------------------------------------------------
    @property
    def temperature(self):
        """Temperature as a Quantity [K]."""
        return si_quantity(self.temperature_si, "K")

    @property
    def pressure(self):
        """Absolute pressure as a Quantity [Pa]."""
        return si_quantity(self.pressure_si, "Pa")

    @property
    def density(self):
        """Density as a Quantity [kg/m^3]."""
        return si_quantity(self.density_si, "kg/m^3")

    @property
    def dynamic_viscosity(self):
        """Dynamic viscosity as a Quantity [Pa s]."""
        return si_quantity(self.dynamic_viscosity_si, "Pa*s")

    @property
    def kinematic_viscosity(self):
        """Kinematic viscosity as a Quantity [m^2/s]."""
        return si_quantity(self.kinematic_viscosity_si, "m^2/s")

    @property
    def vapour_pressure(self):
        """Saturation vapour pressure as a Quantity [Pa], or None."""
        v = self.vapour_pressure_si
        return None if v is None else si_quantity(v, "Pa")

    @property
    def surface_tension(self):
        """Surface tension as a Quantity [N/m], or None."""
        v = self.surface_tension_si
        return None if v is None else si_quantity(v, "N/m")

    @property
    def speed_of_sound(self):
        """Speed of sound as a Quantity [m/s], or None."""
        v = self.speed_of_sound_si
        return None if v is None else si_quantity(v, "m/s")

    def as_dict(self) -> dict[str, Any]:
        """Properties as a flat ``{'name [unit]': SI value}`` mapping, for tables."""
        out = {
            "temperature [K]": self.temperature_si,
            "pressure [Pa]": self.pressure_si,
            "density [kg/m^3]": self.density_si,
            "dynamic viscosity [Pa s]": self.dynamic_viscosity_si,
            "kinematic viscosity [m^2/s]": self.kinematic_viscosity_si,
        }
        if self.vapour_pressure_si is not None:
            out["vapour pressure [Pa]"] = self.vapour_pressure_si
        if self.surface_tension_si is not None:
            out["surface tension [N/m]"] = self.surface_tension_si
        if self.speed_of_sound_si is not None:
            out["speed of sound [m/s]"] = self.speed_of_sound_si
        return out

    def __repr__(self) -> str:
        def fmt(v, unit):
            arr = np.asarray(v, dtype=float)
            if arr.ndim == 0:
                return f"{float(arr):.6g} {unit}"
            return f"array{arr.shape} {unit}"

        parts = [
            f"T={fmt(self.temperature_si, 'K')}",
            f"p={fmt(self.pressure_si, 'Pa')}",
            f"rho={fmt(self.density_si, 'kg/m^3')}",
            f"nu={fmt(self.kinematic_viscosity_si, 'm^2/s')}",
        ]
        if self.vapour_pressure_si is not None:
            parts.append(f"p_v={fmt(self.vapour_pressure_si, 'Pa')}")
        if self.surface_tension_si is not None:
            parts.append(f"sigma={fmt(self.surface_tension_si, 'N/m')}")
        if self.speed_of_sound_si is not None:
            parts.append(f"a={fmt(self.speed_of_sound_si, 'm/s')}")
        return f"FluidState({self.fluid}: " + ", ".join(parts) + ")"

"""The state of a fluid: its properties at one temperature and pressure (or arrays of them)."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np

from .units import si_quantity


def _quantity(field_name: str, unit: str, doc: str, optional: bool = False) -> property:
    """A read-only property giving the SI field ``field_name`` as a Quantity in ``unit``.

    With ``optional``, a field that is None (a property that does not apply) gives None.
    """

    def get(self):
        value = getattr(self, field_name)
        if optional and value is None:
            return None
        return si_quantity(value, unit)

    return property(get, doc=doc)


#: The properties a fluid may lack: (SI field, label in tables, symbol in repr, unit).
_OPTIONAL = (
    ("vapour_pressure_si", "vapour pressure [Pa]", "p_v", "Pa"),
    ("surface_tension_si", "surface tension [N/m]", "sigma", "N/m"),
    ("speed_of_sound_si", "speed of sound [m/s]", "a", "m/s"),
)


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
    temperature = _quantity("temperature_si", "K", "Temperature as a Quantity [K].")
    pressure = _quantity("pressure_si", "Pa", "Absolute pressure as a Quantity [Pa].")
    density = _quantity("density_si", "kg/m^3", "Density as a Quantity [kg/m^3].")
    dynamic_viscosity = _quantity("dynamic_viscosity_si", "Pa*s",
                                  "Dynamic viscosity as a Quantity [Pa s].")
    kinematic_viscosity = _quantity("kinematic_viscosity_si", "m^2/s",
                                    "Kinematic viscosity as a Quantity [m^2/s].")
    vapour_pressure = _quantity("vapour_pressure_si", "Pa",
                                "Saturation vapour pressure as a Quantity [Pa], or None.",
                                optional=True)
    surface_tension = _quantity("surface_tension_si", "N/m",
                                "Surface tension as a Quantity [N/m], or None.", optional=True)
    speed_of_sound = _quantity("speed_of_sound_si", "m/s",
                               "Speed of sound as a Quantity [m/s], or None.", optional=True)

    def as_dict(self) -> dict[str, Any]:
        """Properties as a flat ``{'name [unit]': SI value}`` mapping, for tables."""
        out = {
            "temperature [K]": self.temperature_si,
            "pressure [Pa]": self.pressure_si,
            "density [kg/m^3]": self.density_si,
            "dynamic viscosity [Pa s]": self.dynamic_viscosity_si,
            "kinematic viscosity [m^2/s]": self.kinematic_viscosity_si,
        }
        for name, label, _, _ in _OPTIONAL:
            if getattr(self, name) is not None:
                out[label] = getattr(self, name)
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
        for name, _, symbol, unit in _OPTIONAL:
            if getattr(self, name) is not None:
                parts.append(f"{symbol}={fmt(getattr(self, name), unit)}")
        return f"FluidState({self.fluid}: " + ", ".join(parts) + ")"

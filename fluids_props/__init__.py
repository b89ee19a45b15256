"""fluids_props: thermophysical properties of test and prototype fluids from published
correlations, with their validity ranges.

Entry points (arguments are pint Quantities or strings such as ``"15 degC"``; arrays broadcast)::

    fresh_water(temperature)                      # at 0.101325 MPa
    sea_water(temperature, salinity="35.16504 g/kg")
    air(temperature, pressure="101325 Pa", relative_humidity=0)
    standard_atmosphere(altitude)                 # ISO 2533
    nitrogen(temperature, pressure)               # test gas for pressurised/cryogenic tunnels
    glycerol_water(temperature, mass_fraction)    # viscous model liquid (0-100 degC, 0-1 kg/kg)

Each returns a :class:`FluidState`. This package knows nothing of similitude.
"""

from .air import air
from .atmosphere import standard_atmosphere
from .catalogue import get_fluid, list_fluids
from .gases import nitrogen
from .glycerol_water import glycerol_water
from .registry import FluidInfo
from .seawater import sea_water
from .state import FluidState
from .units import Q_, parse_quantity, to_si, ureg
from .validity import OutOfRangeError, Range, ShapeMismatchError
from .water import fresh_water

__all__ = [
    "FluidInfo",
    "FluidState",
    "OutOfRangeError",
    "Q_",
    "Range",
    "ShapeMismatchError",
    "air",
    "fresh_water",
    "get_fluid",
    "glycerol_water",
    "list_fluids",
    "nitrogen",
    "parse_quantity",
    "sea_water",
    "standard_atmosphere",
    "to_si",
    "ureg",
]

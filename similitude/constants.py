"""Constants shared by the whole package, each with its source. SI units.

One place for the numbers several stages need (the acceleration of gravity, the knot, the
standard atmosphere, the ITTC standard water), so no module keeps its own copy.

References
----------
.. [1] ISO 80000-3:2019, Quantities and units -- Part 3: Space and time (standard acceleration
   of free fall, from the 3rd CGPM, 1901).
.. [2] BIPM, The International System of Units (SI Brochure), 9th ed., 2019, Table 8 (the
   nautical mile, 1852 m; the knot, 1852 m/h).
.. [3] ISO 2533:1975, Standard Atmosphere (sea-level pressure 101 325 Pa, temperature
   288.15 K, density 1.225 kg/m^3).
.. [4] ITTC 7.5-02-01-03 (2011), Fresh Water and Seawater Properties; ITTC 7.5-02-03-01.4
   (2017), 1978 ITTC Performance Prediction Method (standard temperature 15 degC).
.. [5] IOC, SCOR and IAPSO, The international thermodynamic equation of seawater - 2010
   (TEOS-10), Manual, 2010 (standard-ocean reference salinity 35.16504 g/kg).
"""

from __future__ import annotations

#: Standard acceleration of gravity g_0 [m/s^2] [1].
G0 = 9.80665

#: The knot [m/s]: one nautical mile (1852 m) per hour [2].
KNOT = 1852.0 / 3600.0

#: Standard atmospheric pressure at sea level [Pa] [3].
P_ATM = 101325.0

#: Sea-level air density of the standard atmosphere [kg/m^3] [3].
AIR_DENSITY = 1.225

#: Standard water temperature of ITTC model and ship predictions, 15 degC [K] [4].
ITTC_TEMPERATURE = 288.15

#: Absolute salinity of standard sea water [kg/kg] [5].
STANDARD_SALINITY = 0.03516504

#: Zero of the Celsius scale [K] (SI Brochure, 9th ed., 2019) [2].
ZERO_CELSIUS = 273.15

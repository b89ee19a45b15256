"""Test facilities: towing tank, wave basin, cavitation tunnel, wind tunnel (user-described).

Nothing about any real facility is built in; users describe their own. SI inside.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from similitude.errors import InputError

FACILITY_KINDS = ("towing_tank", "wave_basin", "cavitation_tunnel", "wind_tunnel")
FREE_SURFACE_KINDS = ("towing_tank", "wave_basin")


@dataclass(frozen=True)
class Facility:
    """A test facility.

    Attributes
    ----------
    kind : str
        One of :data:`FACILITY_KINDS`.
    name : str
    length : float
        Tank/basin length or tunnel test-section length [m].
    width : float
        Tank/basin width or test-section width [m].
    depth : float
        Water depth of a tank/basin or test-section height of a tunnel [m].
    speed_range : tuple of float
        (min, max) carriage or flow speed [m/s].
    fluids : tuple of str
        Admissible fluid names (``fluids_props`` catalogue): ``("fresh_water",)`` for most
        tanks, ``("air",)`` or ``("nitrogen",)`` for tunnels.
    temperature_range : tuple of float
        (min, max) fluid temperature the facility can hold [K].
    pressure_range : tuple of float or None
        (min, max) absolute static pressure at the model [Pa] for pressurised or
        depressurised tunnels; None: atmospheric only.
    acceleration : float or None
        Carriage or flow acceleration [m/s^2] (run-length estimate).
    deceleration : float or None
        Braking deceleration [m/s^2]; None: same as ``acceleration``.
    open_jet : bool
        Open-jet wind tunnel (other blockage correction).
    wavemaker_period_range : tuple of float or None
        (min, max) wave period the wavemaker makes [s], at model scale.
    wavemaker_max_height : float or None
        Largest wave height the wavemaker makes [m], at model scale.
    max_rotation_rate : float or None
        Largest propeller dynamometer rotation rate [1/s].
    min_model_length, max_model_length : float or None
        Limits on model size the facility imposes (carriage, dynamometer, support) [m].
    loading_changeover : float or None
        Time to change the model from one loading condition to the next [s] (re-ballasting,
        checking draughts and trim, re-zeroing); None: the planner's common-practice default.
    min_steady_time : float or None
        Shortest steady-speed measuring time the facility requires per run [s]; when given,
        the steady-run length after acceleration and stopping becomes a hard limit of the
        planner; None: checked against a common-practice 10 s as a warning only.
    max_thrust : float or None
        Largest thrust the propeller dynamometer measures [N] (self-propulsion tests).
    max_torque : float or None
        Largest torque the propeller dynamometer measures [N m] (self-propulsion tests).
    """

    kind: str
    name: str
    length: float
    width: float
    depth: float
    speed_range: tuple[float, float]
    fluids: tuple[str, ...] = ("fresh_water",)
    temperature_range: tuple[float, float] = (283.15, 298.15)
    pressure_range: tuple[float, float] | None = None
    acceleration: float | None = None
    deceleration: float | None = None
    open_jet: bool = False
    wavemaker_period_range: tuple[float, float] | None = None
    wavemaker_max_height: float | None = None
    max_rotation_rate: float | None = None
    min_model_length: float | None = None
    max_model_length: float | None = None
    min_steady_time: float | None = None
    loading_changeover: float | None = None
    max_thrust: float | None = None
    max_torque: float | None = None

    def __post_init__(self) -> None:
        if self.kind not in FACILITY_KINDS:
            raise InputError(
                f"facility.kind: {self.kind!r} is unknown; expected one of "
                + ", ".join(FACILITY_KINDS)
            )
        for key in ("length", "width", "depth"):
            v = getattr(self, key)
            if not (isinstance(v, (int, float)) and math.isfinite(v) and v > 0):
                raise InputError(f"facility.{key}: {v!r} is not valid; expected a length > 0")
        for key in ("speed_range", "temperature_range", "pressure_range",
                    "wavemaker_period_range"):
            rng = getattr(self, key)
            if rng is None:
                continue
            lo, hi = rng
            if not (math.isfinite(lo) and math.isfinite(hi) and 0 <= lo <= hi and hi > 0):
                raise InputError(
                    f"facility.{key}: {rng!r} is not valid; expected (min, max) with "
                    "0 <= min <= max and max > 0"
                )
        for key in ("acceleration", "deceleration", "wavemaker_max_height", "max_rotation_rate",
                    "min_model_length", "max_model_length", "min_steady_time", "max_thrust",
                    "max_torque"):
            v = getattr(self, key)
            if v is not None and not (isinstance(v, (int, float)) and math.isfinite(v)
                                      and v > 0):
                raise InputError(f"facility.{key}: {v!r} is not valid; expected a positive "
                                 "finite number or none")
        v = self.loading_changeover
        if v is not None and not (isinstance(v, (int, float)) and math.isfinite(v) and v >= 0):
            raise InputError(f"facility.loading_changeover: {v!r} is not valid; expected a time "
                             ">= 0 or none")
        if isinstance(self.fluids, str):
            raise InputError(f"facility.fluids: {self.fluids!r} is a string; expected a list "
                             "of fluid names")
        if not self.fluids:
            raise InputError("facility.fluids: empty; expected at least one fluid name")

    @property
    def free_surface(self) -> bool:
        """True for towing tanks and wave basins."""
        return self.kind in FREE_SURFACE_KINDS

    @property
    def cross_section(self) -> float:
        """Cross-section area of the tank or test section [m^2]."""
        return self.width * self.depth

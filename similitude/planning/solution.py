"""The solver's answer: the model scale, speed ratio and fluid state chosen for a case."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from fluids_props import FluidState
from similitude.planning.case import MatchRequest


@dataclass(frozen=True)
class Solution:
    """Model scale and conditions chosen by the solver (SI).

    Attributes
    ----------
    scale : float
        lambda = prototype length / model length.
    velocity_ratio : float
        Model speed over prototype speed (lambda^-0.5 for Froude scaling).
    rotation_ratio : float or None
        Model rotation rate over prototype rotation rate (propellers), else None.
    prototype_fluid : FluidState
        Prototype fluid at its state (scalar).
    model_fluid : FluidState
        Model fluid at the chosen state (scalar).
    model_pressure : float or None
        Static pressure at the model reference point [Pa] when the facility sets it (tunnels;
        in a depressurised tank, the pressure over the free surface plus the scaled
        hydrostatic head). ``static_pressure`` holds the pressure the facility is set to.
    exact : tuple of str
        Groups matched exactly.
    binding : str
        The constraint that fixed the scale, in words (e.g. "tank width: model length <=
        0.71 B_T").
    objective : str
        The objective used to pick this solution.
    candidates_searched : int
        Number of (fluid, temperature, pressure, scale) candidates evaluated.
    fluid_name : str
        Catalogue name of the model fluid (``fluids_props.get_fluid``); "" when unknown.
    static_pressure : float or None
        Pressure the facility is set to [Pa]: the test-section static pressure of a tunnel,
        or the pressure over the free surface of a tank (atmospheric unless the tank is
        depressurised). None: the model fluid's own pressure.
    solved_by : str
        The variable through which the exact group after the speed-fixing one is met
        ("pressure", "temperature", "scale" or "model speed"); "" when only one exact group
        needs the search.
    relaxed : tuple of (str, str)
        (group, reason) of each requested exact group that could not be met inside the
        facility and was minimised instead (``MatchRequest.relax``); empty when none.
    solved_request : MatchRequest or None
        The request actually solved when groups were relaxed (the dropped group moved to the
        reported ones, objective ``least_mismatch``); None: the case's own request.
    limiting_scale : float or None
        For the largest- and smallest-model objectives: the scale at the binding facility
        limit, before rounding to a convenient one [-]; None for a fixed scale or model
        length, the ``least_mismatch`` objective and solutions found by solving for scale.
    limiting_binding : str
        The binding limit at ``limiting_scale``, in words; "" when ``limiting_scale`` is None.
    scale_rounding : str
        What was done with the limiting scale: "rounded up from ... to ..." (or "down"),
        "not rounded: ..." with the reason, or "" (already convenient, or not rounded by
        request: ``MatchRequest.round_scale``).
    """

    scale: float
    velocity_ratio: float
    prototype_fluid: FluidState
    model_fluid: FluidState
    rotation_ratio: float | None = None
    model_pressure: float | None = None
    exact: tuple[str, ...] = ()
    binding: str = ""
    objective: str = "largest_model"
    candidates_searched: int = 0
    fluid_name: str = ""
    static_pressure: float | None = None
    solved_by: str = ""
    relaxed: tuple[tuple[str, str], ...] = ()
    solved_request: MatchRequest | None = None
    limiting_scale: float | None = None
    limiting_binding: str = ""
    scale_rounding: str = ""

    def model_speed(self, prototype_speed):
        """Model speed [m/s] for prototype speed(s) [m/s]."""
        return np.multiply(prototype_speed, self.velocity_ratio)

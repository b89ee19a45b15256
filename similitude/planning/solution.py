"""The solver's answer: the model scale, speed ratio and fluid state chosen for a case."""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from fluids_props import FluidState


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
        hydrostatic head). ``extra["static_pressure"]`` holds the pressure the facility is
        set to (test-section static pressure, or the pressure over the free surface).
    exact : tuple of str
        Groups matched exactly.
    binding : str
        The constraint that fixed the scale, in words (e.g. "tank width: model length <=
        0.71 B_T").
    objective : str
        The objective used to pick this solution.
    candidates_searched : int
        Number of (fluid, temperature, pressure, scale) candidates evaluated.
    extra : dict
        ``fluid`` (catalogue name), ``static_pressure`` [Pa], ``solved_by`` (the variable
        through which the second exact group is met), and, when a requested exact group had
        to be dropped, ``relaxed`` ((group, reason), ...) and ``request`` (the request solved).
        For the largest/smallest-model objectives: ``limiting_scale`` (the scale at the
        binding facility limit, before rounding), ``limiting_binding`` (that limit in words)
        and ``scale_rounding`` (what was done: "rounded up from ... to ..." or "not rounded:
        ..."), see ``MatchRequest.round_scale``.
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
    extra: dict = field(default_factory=dict)

    def model_speed(self, prototype_speed):
        """Model speed [m/s] for prototype speed(s) [m/s]."""
        return np.multiply(prototype_speed, self.velocity_ratio)

"""What a self-propulsion test plan needs beyond the hull: propeller, open water, resistance.

A :class:`PropulsionSpec` is the ``[propulsion]`` table of a case file (read by
:mod:`similitude.readers.case_file`) or built in Python. SI floats; the measured data it may
carry (an earlier resistance test, the propeller's open-water test) are the run classes of
:mod:`similitude.prediction.runs`, already read.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from similitude.correlations.propulsion import FRICTION_CORRECTION_FORMS
from similitude.errors import InputError
from similitude.prediction.runs import OpenWaterRuns, ResistanceRuns


def _fraction(name: str, value: float | None, low: float, high: float) -> None:
    if value is None:
        return
    if not (isinstance(value, (int, float)) and not isinstance(value, bool)
            and math.isfinite(value) and low <= value <= high):
        raise InputError(f"propulsion.{name}: {value!r} is not valid; expected a number from "
                         f"{low:g} to {high:g}")


@dataclass(frozen=True, eq=False)  # may hold measured arrays
class PropulsionSpec:
    """The self-propulsion test's inputs (all optional but the ones F_D needs come from the
    prototype: its wetted surface and length).

    Attributes
    ----------
    propeller_diameter : float or None
        Full-scale propeller diameter D_S [m]; the model's is D_S/λ. Needed for the expected
        rotation rate, thrust and torque.
    propellers : int
        Number of propellers (1 single screw, 2 twin screw); they share the thrust equally.
    open_water : OpenWaterRuns or None
        Open-water test of the model propeller (J, K_T, K_Q).
    thrust_polynomial, torque_polynomial : tuple of float
        K_T(J) and K_Q(J) of the model propeller as coefficients a0, a1, a2 ... (increasing
        powers of J), instead of ``open_water``.
    resistance_runs : ResistanceRuns or None
        An earlier resistance test of the hull; extrapolated (ITTC-1978) to give C_R and, when
        no form factor is given, k.
    resistance_speeds, resistance_values : tuple of float
        A full-scale resistance estimate instead: ship speeds [m/s] and total resistance R_TS
        [N] at them (interpolated log-log).
    wake_fraction, thrust_deduction, rotative_efficiency : float or None
        Expected model (Taylor) wake fraction w_TM, thrust deduction t and relative rotative
        efficiency η_R [-]; None: estimated (see :mod:`similitude.planning.self_propulsion`).
    form_factor : float or None
        k [-] for F_D; None: ``match.form_factor``, else the resistance test's fit, else 0.
    tow_force_factors : tuple of float
        Tow forces of the runs at each speed as multiples of F_D: ``(1.0,)`` (default) is one
        run at the ship self-propulsion point; several values plan the load-varying method.
    friction_correction : str
        Form of F_D, one of :data:`similitude.correlations.propulsion.FRICTION_CORRECTION_FORMS`.
    """

    propeller_diameter: float | None = None
    propellers: int = 1
    open_water: OpenWaterRuns | None = None
    thrust_polynomial: tuple[float, ...] = ()
    torque_polynomial: tuple[float, ...] = ()
    resistance_runs: ResistanceRuns | None = None
    resistance_speeds: tuple[float, ...] = ()
    resistance_values: tuple[float, ...] = ()
    wake_fraction: float | None = None
    thrust_deduction: float | None = None
    rotative_efficiency: float | None = None
    form_factor: float | None = None
    tow_force_factors: tuple[float, ...] = (1.0,)
    friction_correction: str = "revised"

    def __post_init__(self) -> None:
        d = self.propeller_diameter
        if d is not None and not (isinstance(d, (int, float)) and math.isfinite(d) and d > 0):
            raise InputError(f"propulsion.propeller_diameter: {d!r} is not valid; expected a "
                             "positive length")
        if not (isinstance(self.propellers, int) and not isinstance(self.propellers, bool)
                and 1 <= self.propellers <= 4):
            raise InputError(f"propulsion.propellers: {self.propellers!r} is not valid; "
                             "expected a whole number from 1 to 4")
        if (len(self.thrust_polynomial) == 0) != (len(self.torque_polynomial) == 0):
            raise InputError("propulsion.thrust_polynomial and torque_polynomial: give both or "
                             "neither")
        if self.thrust_polynomial and self.open_water is not None:
            raise InputError("propulsion.open_water and thrust_polynomial: both given; expected "
                             "one open-water curve")
        if len(self.resistance_speeds) != len(self.resistance_values):
            raise InputError(f"propulsion.resistance_estimate: {len(self.resistance_speeds)} "
                             f"speeds and {len(self.resistance_values)} values; expected one "
                             "value per speed")
        if self.resistance_runs is not None and self.resistance_speeds:
            raise InputError("propulsion.resistance_test and resistance_estimate: both given; "
                             "expected one resistance source")
        _fraction("wake_fraction", self.wake_fraction, 0.0, 0.8)
        _fraction("thrust_deduction", self.thrust_deduction, -0.2, 0.6)
        _fraction("rotative_efficiency", self.rotative_efficiency, 0.7, 1.3)
        _fraction("form_factor", self.form_factor, 0.0, 1.5)
        if not self.tow_force_factors or any(
                not (isinstance(f, (int, float)) and math.isfinite(f) and -3 <= f <= 5)
                for f in self.tow_force_factors):
            raise InputError(f"propulsion.tow_force_factors: {list(self.tow_force_factors)!r}; "
                             "expected one or more multiples of F_D from -3 to 5")
        if self.friction_correction not in FRICTION_CORRECTION_FORMS:
            raise InputError(f"propulsion.friction_correction: {self.friction_correction!r} "
                             "is unknown; expected one of "
                             + ", ".join(FRICTION_CORRECTION_FORMS))

    @property
    def has_open_water(self) -> bool:
        """An open-water curve is given (measured runs or polynomials)."""
        return self.open_water is not None or bool(self.thrust_polynomial)

    @property
    def has_resistance(self) -> bool:
        """A resistance source is given (an earlier test or a full-scale estimate)."""
        return self.resistance_runs is not None or bool(self.resistance_speeds)

    @property
    def load_varying(self) -> bool:
        """Several tow forces per speed (the load-varying method)."""
        return len(self.tow_force_factors) > 1


__all__ = ["PropulsionSpec"]

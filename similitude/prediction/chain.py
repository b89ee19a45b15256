"""The after-test chain on SI arrays with a sample axis: resistance, self-propulsion, full scale.

One function, :func:`chain_si`, takes every measured input as an array ``(N, n)`` (N samples
of the n runs) and returns the predicted figures ``(N, ...)``: the resistance extrapolation
(:func:`similitude.prediction.extrapolation.pipeline_si`, k re-fitted in each sample unless
held), the open-water curves faired from the measured K_T and K_Q
(:class:`similitude.prediction.open_water_curve.PropellerCurves`), the self-propulsion
analysis (:func:`similitude.prediction.self_propulsion.analysis_si`) and the full-scale
prediction (:func:`similitude.prediction.power.power_si`). The deterministic prediction is the
chain with N = 1; the uncertainty estimates run it on perturbed copies of the inputs, so all
three use the same arithmetic.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np

from similitude.prediction.extrapolation import Extrapolation, pipeline_si
from similitude.prediction.open_water_curve import PropellerCurves
from similitude.prediction.power import power_si
from similitude.prediction.runs import OpenWaterRuns, ResistanceRuns, SelfPropulsionRuns
from similitude.prediction.self_propulsion import PropulsionSetup, analysis_si

#: Measured inputs of the chain: key -> (data set, attribute of its runs class).
INPUTS = {
    "res_speed": ("resistance", "speed"),
    "res_resistance": ("resistance", "resistance"),
    "res_temperature": ("resistance", "temperature"),
    "sp_speed": ("self_propulsion", "speed"),
    "sp_rate": ("self_propulsion", "rotation_rate"),
    "sp_thrust": ("self_propulsion", "thrust"),
    "sp_torque": ("self_propulsion", "torque"),
    "sp_tow": ("self_propulsion", "tow_force"),
    "sp_temperature": ("self_propulsion", "temperature"),
    "ow_kt": ("open_water", "thrust_coefficient"),
    "ow_kq": ("open_water", "torque_coefficient"),
    "stock_kt": ("stock_open_water", "thrust_coefficient"),
    "stock_kq": ("stock_open_water", "torque_coefficient"),
}


@dataclass(frozen=True, eq=False)  # holds arrays
class ChainInputs:
    """The measured data of a prediction and what stays fixed between samples.

    Attributes
    ----------
    extrapolation : Extrapolation
        The nominal resistance extrapolation (ship, options, runs, k and its fit).
    self_propulsion : SelfPropulsionRuns or None
    open_water : OpenWaterRuns or None
        The design propeller's open-water test (model K_T, K_Q).
    stock_open_water : OpenWaterRuns or None
        A stock propeller's open-water test, when the self-propulsion test used one.
    curves : PropellerCurves or None
    setup : PropulsionSetup or None
    """

    extrapolation: Extrapolation
    self_propulsion: SelfPropulsionRuns | None = None
    open_water: OpenWaterRuns | None = None
    stock_open_water: OpenWaterRuns | None = None
    curves: PropellerCurves | None = None
    setup: PropulsionSetup | None = None

    @property
    def resistance(self) -> ResistanceRuns:
        """The measured resistance runs."""
        return self.extrapolation.runs

    @property
    def keys(self) -> tuple[str, ...]:
        """The input keys this prediction has data for."""
        return tuple(k for k, (source, _) in INPUTS.items()
                     if getattr(self, source) is not None)

    def nominal(self) -> dict[str, np.ndarray]:
        """The measured values, key -> ``(n,)``."""
        return {k: np.asarray(getattr(getattr(self, INPUTS[k][0]), INPUTS[k][1]), float)
                for k in self.keys}

    @property
    def fit_used(self) -> np.ndarray | None:
        """The runs of the nominal Prohaska fit (every sample is fitted to the same ones)."""
        fit = self.extrapolation.form_factor_fit
        return None if fit is None else np.asarray(fit.used, bool)


def chain_si(inputs: ChainInputs, data: dict[str, np.ndarray],
             form_factor=None) -> dict[str, Any]:
    """Run the chain on samples of the measured inputs.

    Parameters
    ----------
    inputs : ChainInputs
    data : dict
        Key of :data:`INPUTS` -> ``(N, n)`` array (the measured values of each sample).
    form_factor : float or array_like, optional
        k held fixed (a column ``(N, 1)`` for one per sample); None: k as the extrapolation
        found it (fitted in each sample when it was fitted).

    Returns
    -------
    dict
        ``resistance`` (the pipeline's arrays), and with self-propulsion data ``analysis``
        (runs and points) and ``power`` (:func:`similitude.prediction.power.power_si`).
    """
    e = inputs.extrapolation
    if form_factor is None and e.form_factor_fit is None:
        form_factor = e.form_factor
    res = pipeline_si(data["res_speed"], data["res_resistance"], data["res_temperature"],
                      e.ship, e.options, form_factor=form_factor,
                      stimulator_drag=e.runs.stimulator_drag, fit_used=inputs.fit_used)
    out: dict[str, Any] = {"resistance": res}
    if inputs.self_propulsion is None:
        return out
    if inputs.curves.stock:
        # the stock propeller is the one analysed, the design propeller the one predicted
        test_curve, ship_curve = inputs.curves.curves(data["stock_kt"], data["stock_kq"],
                                                      data["ow_kt"], data["ow_kq"])
    else:
        test_curve, ship_curve = inputs.curves.curves(data["ow_kt"], data["ow_kq"])
    sp = {name: data[f"sp_{name}"] for name in ("speed", "rate", "thrust", "torque", "tow",
                                                 "temperature")}
    analysis = analysis_si(sp, res, test_curve, inputs.setup)
    out["analysis"] = analysis
    out["power"] = power_si(analysis["points"], res, ship_curve, inputs.setup)
    out["curves"] = (test_curve, ship_curve)
    return out


def nominal_chain(inputs: ChainInputs) -> dict[str, Any]:
    """The chain on the measured values themselves (N = 1)."""
    return chain_si(inputs, {k: v[None, :] for k, v in inputs.nominal().items()})


__all__ = ["INPUTS", "ChainInputs", "chain_si", "nominal_chain"]

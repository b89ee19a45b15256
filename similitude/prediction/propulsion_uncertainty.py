"""Uncertainty of the delivered power P_D and the rate of revolution n_S at each speed.

Both methods of :mod:`similitude.prediction.uncertainty` on the whole chain (resistance test,
open-water test, self-propulsion test, full-scale prediction): first-order propagation (ISO
GUM) and, when asked, Monte Carlo (JCGM 101:2008, seeded, vectorised over the samples, k
re-fitted in each). The table says which method gave each figure; the first-order
contributions show which measurement dominates.

pandas is imported inside :func:`propulsion_uncertainty`, so that building the command line's
parsers at start does not load it.

References
----------
.. [1] JCGM 100:2008 (ISO GUM), §5.1.2; JCGM 101:2008 (Monte Carlo).
.. [2] ITTC, Recommended Procedure 7.5-02-03-01.4 "1978 ITTC Performance Prediction Method",
       Rev 04 (2017), the chain propagated.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np

from similitude.constants import KNOT
from similitude.prediction.chain import ChainInputs
from similitude.prediction.uncertainty import (
    DEFAULT_SEED,
    METHOD_STATEMENT,
    MONTE_CARLO_STATEMENT,
    MeasurementUncertainty,
    combined,
    first_order_si,
    monte_carlo_si,
)


def power_outputs(result: dict[str, Any]) -> dict[str, np.ndarray]:
    """The figures whose uncertainty is estimated: P_DS [W], n_S [1/s] and P_E [W] at each
    self-propulsion point (NaN where the operating point is off the open-water curve)."""
    p = result["power"]
    bad = ~p["on_curve"]
    return {name: np.where(bad, np.nan, p[key]) for name, key in
            (("power", "power"), ("rate", "rate"), ("pe", "pe"))}


@dataclass(frozen=True, eq=False)  # holds DataFrames
class PropulsionUncertainty:
    """Uncertainties of P_D, n_S and P_E at each speed of the full-scale prediction.

    Attributes
    ----------
    table : pandas.DataFrame
        Per speed: P_DS, n_S, P_E with their first-order standard uncertainty and, when run,
        the Monte Carlo standard deviation, 95 % interval and the ratio first order / Monte
        Carlo.
    contributions : pandas.DataFrame
        Per speed and measured input: its first-order contribution to u(P_D) and u(n_S).
    inputs : MeasurementUncertainty
    samples : int or None
        Monte Carlo samples (None: not run).
    seed : int or None
    method : str
        Which method produced which figure.
    """

    table: Any
    contributions: Any
    inputs: MeasurementUncertainty
    samples: int | None
    seed: int | None
    method: str


def propulsion_uncertainty(inputs: ChainInputs, uncertainty: MeasurementUncertainty,
                           samples: int | None = None,
                           seed: int = DEFAULT_SEED) -> PropulsionUncertainty:
    """First-order (and, with ``samples``, Monte Carlo) uncertainty of P_D and n_S.

    Parameters
    ----------
    inputs : ChainInputs
        With self-propulsion data.
    uncertainty : MeasurementUncertainty
    samples : int, optional
        Monte Carlo samples (e.g. 10 000); None: first order only.
    seed : int
        Seed of the Monte Carlo samples.

    Returns
    -------
    PropulsionUncertainty
    """
    import pandas as pd

    values, parts = first_order_si(inputs, uncertainty, power_outputs)
    g = values["power"].size
    v_s = inputs.setup.ship.scale ** 0.5 * np.array(
        [inputs.self_propulsion.speed[idx].mean() for idx in inputs.setup.groups])
    table: dict[str, Any] = {"ship speed [kn]": v_s / KNOT}
    mc = None if samples is None else monte_carlo_si(inputs, uncertainty, power_outputs,
                                                     samples, seed)
    for name, label, scale, unit in (("power", "P_DS", 1e-3, "kW"),
                                     ("rate", "n_S", 60.0, "rpm"),
                                     ("pe", "P_E", 1e-3, "kW")):
        u_fo = combined(parts, name, g)
        table[f"{label} [{unit}]"] = values[name] * scale
        table[f"u({label}) first order [{unit}]"] = u_fo * scale
        table[f"u({label})/{label} first order [%]"] = 100.0 * u_fo / values[name]
        if mc is not None:
            m = mc[name]
            table[f"u({label}) Monte Carlo [{unit}]"] = m["std"] * scale
            table[f"{label} 2.5 % Monte Carlo [{unit}]"] = m["low"] * scale
            table[f"{label} 97.5 % Monte Carlo [{unit}]"] = m["high"] * scale
            table[f"u({label}) first order / Monte Carlo [-]"] = u_fo / m["std"]
    rows = []
    for source, c in parts.items():
        for i in range(g):
            rows.append({"ship speed [kn]": v_s[i] / KNOT, "input": source,
                         "u(P_DS) contribution [kW]": c["power"][i] / 1e3,
                         "u(n_S) contribution [rpm]": c["rate"][i] * 60.0})
    method = "First order: " + METHOD_STATEMENT
    if mc is not None:
        method += " Monte Carlo: " + MONTE_CARLO_STATEMENT.format(samples=samples, seed=seed)
    return PropulsionUncertainty(pd.DataFrame(table), pd.DataFrame(rows), uncertainty,
                                 samples, None if samples is None else seed, method)


__all__ = ["PropulsionUncertainty", "power_outputs", "propulsion_uncertainty"]

"""First-order uncertainty of the full-scale prediction from the measurement uncertainties.

Method: the law of propagation of uncertainty for uncorrelated inputs (ISO GUM, JCGM 100:2008,
§5.1.2), as the ITTC applies it to towing-tank results (ITTC 7.5-02-01-01):

    u_c(y) = sqrt( Σ_i (∂f/∂x_i)² u(x_i)² ),

with the sensitivity coefficients ∂f/∂x_i taken numerically by central differences of the whole
extrapolation, x_i ± u(x_i). The inputs are the model speed, the model resistance and the water
temperature of each run, and the form factor k, which is common to all runs. With k held fixed
the runs do not interact, so the per-run inputs are perturbed together in one pass; the
influence of a run's resistance on a fitted k is carried by u(k) instead. When k is fitted and
no u(k) is given, u(k) is the standard error of the intercept of Prohaska's straight line.

The result is a standard uncertainty (coverage factor 1) and an expanded one (factor 2, about
95 % for a normal distribution). Systematic errors of the method itself (the friction line, the
form-factor concept, the allowances) are not included: it is an estimate of the measurement's
share only.

pandas is imported inside :func:`propagate`, so that building the command line's parsers at
start does not load it.

References
----------
.. [1] JCGM 100:2008, "Evaluation of measurement data - Guide to the expression of uncertainty
       in measurement" (ISO GUM), §5.1.2.
.. [2] ITTC, "Guide to the Expression of Uncertainty in Experimental Hydrodynamics",
       Recommended Procedure 7.5-02-01-01, Rev 02 (2014) (title and revision from memory).
.. [3] ITTC, "Uncertainty Analysis, Example for Resistance Test", 7.5-02-02-02 (an example
       of the method; title from memory).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Any

import numpy as np

from similitude.constants import KNOT
from similitude.errors import InputError
from similitude.prediction.extrapolation import Extrapolation, pipeline_si
from similitude.units import to_si

METHOD_STATEMENT = (
    "First-order propagation of uncorrelated standard uncertainties (ISO GUM JCGM 100:2008 "
    "§5.1.2, in the spirit of ITTC 7.5-02-01-01); sensitivity coefficients by central "
    "differences of the whole extrapolation at x ± u(x); k common to all runs; method errors "
    "of the extrapolation itself not included."
)


@dataclass(frozen=True)
class MeasurementUncertainty:
    """Standard uncertainties (coverage factor 1) of the inputs, SI.

    Attributes
    ----------
    speed : float
        Of the model speed [m/s], absolute.
    resistance : float
        Of the model resistance [N], absolute.
    resistance_relative : float
        Of the model resistance, relative to each reading [-]; adds in quadrature to
        ``resistance``.
    temperature : float
        Of the water temperature [K].
    form_factor : float or None
        Of k [-]; None: the standard error of Prohaska's intercept when k was fitted, 0
        otherwise.
    """

    speed: float = 0.0
    resistance: float = 0.0
    resistance_relative: float = 0.0
    temperature: float = 0.0
    form_factor: float | None = None

    def __post_init__(self) -> None:
        for key in ("speed", "resistance", "resistance_relative", "temperature",
                    "form_factor"):
            value = getattr(self, key)
            if value is None and key == "form_factor":
                continue
            if not (isinstance(value, (int, float)) and math.isfinite(value) and value >= 0):
                raise InputError(f"uncertainty.{key}: {value!r}; expected a standard "
                                 "uncertainty >= 0")

    @classmethod
    def from_quantities(cls, speed: Any = None, resistance: Any = None,
                        temperature: Any = None, form_factor: Any = None):
        """Build from user values: ``"2 mm/s"``, ``"0.05 N"`` or ``"0.5 %"``, ``"0.1 K"``.

        A resistance given in percent (or as a bare fraction) is relative to each reading.
        A temperature uncertainty is a temperature difference: ``"0.1 K"`` or ``"0.1 delta_degC"``.
        """
        kw: dict[str, Any] = {}
        if speed is not None:
            kw["speed"] = to_si(speed, "[length] / [time]", "speed uncertainty")
        if resistance is not None:
            text = str(resistance).strip()
            if text.endswith("%"):
                kw["resistance_relative"] = _fraction(text, "resistance uncertainty")
            else:
                kw["resistance"] = to_si(resistance, "[mass] * [length] / [time] ** 2",
                                         "resistance uncertainty")
        if temperature is not None:
            text = str(temperature).strip()
            if text.endswith("degC") and "delta" not in text:
                text = text.replace("degC", "delta_degC")
            kw["temperature"] = to_si(text, "[temperature]", "temperature uncertainty")
        if form_factor is not None:
            kw["form_factor"] = _fraction(str(form_factor), "form-factor uncertainty")
        return cls(**kw)


def _fraction(text: str, name: str) -> float:
    t = text.strip()
    scale = 1.0
    if t.endswith("%"):
        t, scale = t[:-1], 0.01
    try:
        value = float(t) * scale
    except ValueError:
        raise InputError(f"{name}: {text!r}; expected a number or a percentage such as "
                         "'0.5 %'") from None
    return value


def prohaska_intercept_error(extrapolation: Extrapolation) -> float:
    r"""Standard error of the intercept (1+k) of Prohaska's fit [-].

    .. math:: s_a = s \sqrt{1/n + \bar x^2 / S_{xx}}, \quad
              s^2 = \frac{\sum r_i^2}{n - 2}

    the textbook result for a straight line fitted by least squares (e.g. Montgomery &
    Runger, "Applied Statistics and Probability for Engineers", ch. 11). 0 when k was not
    fitted.
    """
    fit = extrapolation.form_factor_fit
    if fit is None:
        return 0.0
    a = extrapolation.arrays
    used = np.asarray(fit.used, bool)
    x = a["froude"][used] ** extrapolation.options.prohaska_exponent / a["cfm"][used]
    n = x.size
    if n <= 2:
        return 0.0
    s2 = float(np.sum(np.asarray(fit.residuals) ** 2)) / (n - 2)
    sxx = float(np.sum((x - x.mean()) ** 2))
    return math.sqrt(s2 * (1.0 / n + x.mean() ** 2 / sxx)) if sxx > 0 else 0.0


@dataclass(frozen=True, eq=False)
class UncertaintyResult:
    """Propagated uncertainties.

    Attributes
    ----------
    inputs : MeasurementUncertainty
        As given, with ``form_factor`` resolved.
    table : pandas.DataFrame
        Per run: ship speed, C_TS and its contributions and combined u, P_E and its u.
    method : str
        The method statement.
    """

    inputs: MeasurementUncertainty
    table: Any
    method: str = METHOD_STATEMENT


def propagate(extrapolation: Extrapolation,
              uncertainty: MeasurementUncertainty) -> UncertaintyResult:
    """Propagate measurement uncertainties to C_TS and P_E, run by run.

    Parameters
    ----------
    extrapolation : Extrapolation
        From :func:`similitude.prediction.extrapolation.extrapolate`.
    uncertainty : MeasurementUncertainty

    Returns
    -------
    UncertaintyResult

    Notes
    -----
    See the module docstring. Each contribution is c_i u(x_i) = [f(x_i + u_i) − f(x_i − u_i)]/2,
    which is exact for a linear f and a first-order estimate otherwise.
    """
    import pandas as pd

    e = extrapolation
    runs = e.runs
    k = e.form_factor
    u_k = uncertainty.form_factor
    if u_k is None:
        u_k = prohaska_intercept_error(e) if e.form_factor_fit is not None else 0.0
    if e.options.method == "froude":
        u_k = 0.0  # 1 + k = 1 by definition of the method
    u_v = np.full(len(runs), uncertainty.speed)
    u_r = np.hypot(uncertainty.resistance, uncertainty.resistance_relative * runs.resistance)
    u_t = np.full(len(runs), uncertainty.temperature)

    def f(speed=runs.speed, resistance=runs.resistance, temperature=runs.temperature, kk=k):
        a = pipeline_si(speed, resistance, temperature, e.ship, e.options, form_factor=kk,
                        stimulator_drag=runs.stimulator_drag)
        return a["cts"], a["pe"], a["ship_speed"]

    contributions: dict[str, tuple[np.ndarray, np.ndarray, np.ndarray]] = {}
    for name, plus, minus in (
        ("speed", dict(speed=runs.speed + u_v), dict(speed=runs.speed - u_v)),
        ("resistance", dict(resistance=runs.resistance + u_r),
         dict(resistance=runs.resistance - u_r)),
        ("temperature", dict(temperature=runs.temperature + u_t),
         dict(temperature=runs.temperature - u_t)),
        ("form factor", dict(kk=k + u_k), dict(kk=k - u_k)),
    ):
        hi, lo = f(**plus), f(**minus)
        contributions[name] = tuple(np.abs(h - low) / 2.0 for h, low in zip(hi, lo,
                                                                              strict=True))
    cts0, pe0, vs0 = f()
    u_cts = np.sqrt(sum(c[0] ** 2 for c in contributions.values()))
    u_pe = np.sqrt(sum(c[1] ** 2 for c in contributions.values()))
    u_vs = np.sqrt(sum(c[2] ** 2 for c in contributions.values()))
    data: dict[str, Any] = {
        "run": list(runs.run),
        "ship speed [kn]": vs0 / KNOT,
        "u(ship speed) [kn]": u_vs / KNOT,
        "C_TS [-]": cts0,
    }
    for name, c in contributions.items():
        data[f"u(C_TS) from {name} [-]"] = c[0]
    data["u(C_TS) combined [-]"] = u_cts
    data["P_E [kW]"] = pe0 / 1e3
    for name, c in contributions.items():
        data[f"u(P_E) from {name} [kW]"] = c[1] / 1e3
    data["u(P_E) combined [kW]"] = u_pe / 1e3
    data["u(P_E)/P_E [%]"] = 100.0 * u_pe / pe0
    data["expanded U(P_E), k=2 [kW]"] = 2.0 * u_pe / 1e3
    table = pd.DataFrame(data).sort_values("ship speed [kn]", kind="stable")
    return UncertaintyResult(replace(uncertainty, form_factor=float(u_k)),
                             table.reset_index(drop=True))


__all__ = [
    "METHOD_STATEMENT",
    "MeasurementUncertainty",
    "UncertaintyResult",
    "prohaska_intercept_error",
    "propagate",
]

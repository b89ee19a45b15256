"""Uncertainty of the full-scale prediction from the measurement uncertainties.

Two methods, on the same chain of computations (:func:`similitude.prediction.chain.chain_si`):

**First order** — the law of propagation of uncertainty for uncorrelated inputs (ISO GUM,
JCGM 100:2008, §5.1.2), as the ITTC applies it to towing-tank results (ITTC 7.5-02-01-01):

    u_c(y) = sqrt( Σ_i (∂f/∂x_i)² u(x_i)² ),

with each sensitivity taken by a central difference of the whole chain, one input at a time:
c_i u(x_i) = [f(x_i + u_i) - f(x_i - u_i)]/2. The inputs are every measured value of every
run (speed, resistance, temperature; self-propulsion speed, rate, thrust, torque, tow force,
temperature; the open-water K_T and K_Q), each perturbed alone, all the perturbed copies run
at once on a sample axis. When the form factor is fitted, each perturbed copy re-fits
Prohaska's line: a run's resistance then acts on every prediction through k, and k is not
counted again as an input of its own (counting the fit's intercept error as an independent
input besides the runs it came from put the first-order u(P_E) 10 to 12 % off the Monte Carlo
one). A k given with its own standard uncertainty is an independent input, held at k ± u(k).

**Monte Carlo** — propagation of distributions (JCGM 101:2008): N samples of every input drawn
from normal distributions with the stated standard uncertainties (seeded, reproducible), the
chain run once on all of them (vectorised over the samples), k re-fitted in each sample; the
standard deviation of the outputs is the standard uncertainty, the 2.5 and 97.5 percentiles a
95 % coverage interval.

The results are standard uncertainties (coverage factor 1) and expanded ones (factor 2, about
95 % for a normal distribution). Systematic errors of the method itself (the friction line, the
form-factor concept, the allowances, the wake scaling) are not included: they are the
measurement's share only.

pandas is imported inside the table builders, so that building the command line's parsers at
start does not load it.

References
----------
.. [1] JCGM 100:2008, "Evaluation of measurement data - Guide to the expression of uncertainty
       in measurement" (ISO GUM), §5.1.2.
.. [2] JCGM 101:2008, "Evaluation of measurement data - Supplement 1 to the GUM - Propagation
       of distributions using a Monte Carlo method".
.. [3] ITTC, "Guide to the Expression of Uncertainty in Experimental Hydrodynamics",
       Recommended Procedure 7.5-02-01-01, Rev 02 (2014) (title and revision from memory).
.. [4] ITTC, "Uncertainty Analysis, Example for Resistance Test", 7.5-02-02-02 (an example
       of the method; title from memory).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, fields, replace
from typing import Any

import numpy as np

from similitude.constants import KNOT
from similitude.errors import InputError
from similitude.prediction.chain import ChainInputs, chain_si
from similitude.prediction.extrapolation import Extrapolation
from similitude.units import to_rotation_rate, to_si

METHOD_STATEMENT = (
    "First-order propagation of uncorrelated standard uncertainties (ISO GUM JCGM 100:2008 "
    "§5.1.2, in the spirit of ITTC 7.5-02-01-01); sensitivity coefficients by central "
    "differences of the whole chain at x ± u(x), one measured value at a time, with a fitted "
    "form factor re-fitted in each; method errors not included."
)

MONTE_CARLO_STATEMENT = (
    "Monte Carlo propagation of distributions (JCGM 101:2008): {samples} samples (seed {seed}) "
    "of every measured value from normal distributions with the stated standard "
    "uncertainties, the whole chain run on each with a fitted form factor re-fitted; standard "
    "deviation and 2.5/97.5 percentiles of the outputs; method errors not included."
)

#: Seed of the Monte Carlo samples unless given (so that a prediction is reproducible).
DEFAULT_SEED = 1978

#: Samples of a Monte Carlo estimate unless given.
DEFAULT_SAMPLES = 10_000

#: Readable name of each input key of :data:`similitude.prediction.chain.INPUTS`.
INPUT_NAMES = {
    "res_speed": "speed", "res_resistance": "resistance", "res_temperature": "temperature",
    "sp_speed": "self-propulsion speed", "sp_rate": "rotation rate", "sp_thrust": "thrust",
    "sp_torque": "torque", "sp_tow": "tow force", "sp_temperature":
        "self-propulsion temperature", "ow_kt": "open-water K_T", "ow_kq": "open-water K_Q",
    "stock_kt": "stock-propeller K_T", "stock_kq": "stock-propeller K_Q",
    "form_factor": "form factor",
}


@dataclass(frozen=True)
class MeasurementUncertainty:
    """Standard uncertainties (coverage factor 1) of the measured inputs, SI.

    Absolute and relative parts of one quantity add in quadrature:
    u(x) = sqrt(u_abs² + (u_rel x)²).

    Attributes
    ----------
    speed : float
        Of the model speed (resistance and self-propulsion runs) [m/s].
    resistance, resistance_relative : float
        Of the model resistance [N] and relative to each reading [-].
    temperature : float
        Of the water temperature [K].
    form_factor : float or None
        Of k [-], an independent input held at k ± u(k); None: a fitted k carries the
        uncertainty of the runs it is fitted to (re-fitted), a given k none.
    rotation_rate, rotation_rate_relative : float
        Of the propeller rate of revolution [1/s] and relative [-].
    thrust, thrust_relative : float
        Of the propeller thrust [N] and relative [-].
    torque, torque_relative : float
        Of the propeller torque [N m] and relative [-].
    tow_force : float
        Of the tow force applied [N].
    open_water_thrust, open_water_torque : float
        Of the open-water K_T and K_Q, relative to each value [-].
    """

    speed: float = 0.0
    resistance: float = 0.0
    resistance_relative: float = 0.0
    temperature: float = 0.0
    form_factor: float | None = None
    rotation_rate: float = 0.0
    rotation_rate_relative: float = 0.0
    thrust: float = 0.0
    thrust_relative: float = 0.0
    torque: float = 0.0
    torque_relative: float = 0.0
    tow_force: float = 0.0
    open_water_thrust: float = 0.0
    open_water_torque: float = 0.0

    def __post_init__(self) -> None:
        for f in fields(self):
            value = getattr(self, f.name)
            if value is None and f.name == "form_factor":
                continue
            if not (isinstance(value, (int, float)) and math.isfinite(value) and value >= 0):
                raise InputError(f"uncertainty.{f.name}: {value!r}; expected a standard "
                                 "uncertainty >= 0")

    @classmethod
    def from_quantities(cls, speed: Any = None, resistance: Any = None,
                        temperature: Any = None, form_factor: Any = None, *,
                        rotation_rate: Any = None, thrust: Any = None, torque: Any = None,
                        tow_force: Any = None, open_water_thrust: Any = None,
                        open_water_torque: Any = None):
        """Build from user values: ``"2 mm/s"``, ``"0.05 N"`` or ``"0.5 %"``, ``"0.1 K"``,
        ``"0.1 rpm"``, ``"0.02 N*m"``.

        Resistance, rotation rate, thrust and torque given in percent are relative to each
        reading; the open-water K_T and K_Q uncertainties are relative (``"0.5 %"`` or a bare
        fraction). A temperature uncertainty is a temperature difference: ``"0.1 K"`` or
        ``"0.1 delta_degC"`` (``"0.1 degC"`` is read as a difference too).
        """
        kw: dict[str, Any] = {}
        if speed is not None:
            kw["speed"] = to_si(speed, "[length] / [time]", "speed uncertainty")
        for key, value, dim in (("resistance", resistance, _FORCE), ("thrust", thrust, _FORCE),
                                ("torque", torque, _TORQUE), ("rotation_rate", rotation_rate,
                                                               "1 / [time]")):
            if value is None:
                continue
            text = str(value).strip()
            if text.endswith("%"):
                kw[f"{key}_relative"] = _fraction(text, f"{key.replace('_', ' ')} uncertainty")
            elif key == "rotation_rate":
                kw[key] = to_rotation_rate(value, "rotation rate uncertainty")
            else:
                kw[key] = to_si(value, dim, f"{key} uncertainty")
        if tow_force is not None:
            kw["tow_force"] = to_si(tow_force, _FORCE, "tow force uncertainty")
        if temperature is not None:
            text = str(temperature).strip()
            if text.endswith("degC") and "delta" not in text:
                text = text.replace("degC", "delta_degC")
            kw["temperature"] = to_si(text, "[temperature]", "temperature uncertainty")
        if form_factor is not None:
            kw["form_factor"] = _fraction(str(form_factor), "form-factor uncertainty")
        for key, value in (("open_water_thrust", open_water_thrust),
                           ("open_water_torque", open_water_torque)):
            if value is not None:
                kw[key] = _fraction(str(value), f"{key.replace('_', ' ')} uncertainty")
        return cls(**kw)


_FORCE = "[mass] * [length] / [time] ** 2"
_TORQUE = "[mass] * [length] ** 2 / [time] ** 2"


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


def standard_uncertainties(inputs: ChainInputs,
                           u: MeasurementUncertainty) -> dict[str, np.ndarray]:
    """u(x) of every measured value, key of :data:`similitude.prediction.chain.INPUTS` ->
    ``(n,)``."""
    def same(value):
        return lambda v: np.full(v.size, value)

    def parts(absolute, relative):
        return lambda v: np.hypot(absolute, relative * v)

    def relative(fraction):
        return lambda v: fraction * np.abs(v)

    rules = {
        "res_speed": same(u.speed), "res_resistance": parts(u.resistance,
                                                            u.resistance_relative),
        "res_temperature": same(u.temperature), "sp_speed": same(u.speed),
        "sp_rate": parts(u.rotation_rate, u.rotation_rate_relative),
        "sp_thrust": parts(u.thrust, u.thrust_relative),
        "sp_torque": parts(u.torque, u.torque_relative), "sp_tow": same(u.tow_force),
        "sp_temperature": same(u.temperature), "ow_kt": relative(u.open_water_thrust),
        "ow_kq": relative(u.open_water_torque), "stock_kt": relative(u.open_water_thrust),
        "stock_kq": relative(u.open_water_torque),
    }
    return {key: rules[key](value) for key, value in inputs.nominal().items()}


def _form_factor_input(inputs: ChainInputs, u: MeasurementUncertainty) -> float | None:
    """u(k) when k is an independent input (given with its uncertainty, or a given k with
    one); None when k is re-fitted in every sample or held without uncertainty."""
    e = inputs.extrapolation
    if e.options.method == "froude":
        return None  # 1 + k = 1 by definition of the method
    return u.form_factor


def first_order_si(inputs: ChainInputs, u: MeasurementUncertainty, outputs):
    """First-order propagation on the chain.

    Parameters
    ----------
    inputs : ChainInputs
    u : MeasurementUncertainty
    outputs : callable
        chain result -> dict name -> array ``(N, p)`` of the figures wanted.

    Returns
    -------
    (values, contributions)
        ``values``: name -> ``(p,)`` nominal; ``contributions``: input name -> (output name ->
        ``(p,)`` c_i u(x_i) summed in quadrature over the values of that input).
    """
    x = inputs.nominal()
    su = standard_uncertainties(inputs, u)
    rows = [(key, i) for key in inputs.keys for i in np.flatnonzero(su[key] > 0)]
    u_k = _form_factor_input(inputs, u)
    n_rows = 2 * len(rows) + (2 if u_k else 0) + 1
    data = {key: np.repeat(v[None, :], n_rows, axis=0) for key, v in x.items()}
    for r, (key, i) in enumerate(rows):
        data[key][2 * r, i] += su[key][i]
        data[key][2 * r + 1, i] -= su[key][i]
    k_col = None
    if u_k is not None:
        k0 = inputs.extrapolation.form_factor
        k_col = np.full((n_rows, 1), k0)
        if u_k:
            k_col[2 * len(rows)] += u_k
            k_col[2 * len(rows) + 1] -= u_k
    y = outputs(chain_si(inputs, data, form_factor=k_col))
    labels = [key for key, _ in rows] + (["form_factor"] if u_k else [])
    contributions: dict[str, dict[str, np.ndarray]] = {}
    for name, arr in y.items():
        d = (arr[0:-1:2] - arr[1::2]) / 2.0
        for label in dict.fromkeys(labels):
            sel = [j for j, lab in enumerate(labels) if lab == label]
            contributions.setdefault(INPUT_NAMES[label], {})[name] = np.sqrt(
                np.sum(d[sel] ** 2, axis=0))
    values = {name: arr[-1] for name, arr in y.items()}
    return values, contributions


def combined(contributions: dict[str, dict[str, np.ndarray]], name: str, size: int):
    """Root sum of squares of every input's contribution to output ``name``."""
    parts = [c[name] for c in contributions.values() if name in c]
    return np.sqrt(sum(p**2 for p in parts)) if parts else np.zeros(size)


def monte_carlo_si(inputs: ChainInputs, u: MeasurementUncertainty, outputs,
                   samples: int = DEFAULT_SAMPLES, seed: int = DEFAULT_SEED):
    """Monte Carlo propagation on the chain: name -> dict of ``mean``, ``std``, ``low``,
    ``high`` (2.5 and 97.5 percentiles) and ``valid`` (samples with a finite value), each
    ``(p,)``.

    Raises
    ------
    InputError
        ``samples`` below 100 or not a whole number.
    """
    if not (isinstance(samples, int) and not isinstance(samples, bool) and samples >= 100):
        raise InputError(f"Monte Carlo samples: {samples!r}; expected a whole number >= 100")
    rng = np.random.default_rng(seed)
    x = inputs.nominal()
    su = standard_uncertainties(inputs, u)
    data = {key: v[None, :] + su[key][None, :] * rng.standard_normal((samples, v.size))
            for key, v in x.items()}
    u_k = _form_factor_input(inputs, u)
    k_col = None
    if u_k is not None:
        k_col = inputs.extrapolation.form_factor + u_k * rng.standard_normal((samples, 1))
    y = outputs(chain_si(inputs, data, form_factor=k_col))
    out = {}
    for name, arr in y.items():
        low, high = np.nanpercentile(arr, [2.5, 97.5], axis=0)
        out[name] = {"mean": np.nanmean(arr, axis=0), "std": np.nanstd(arr, axis=0, ddof=1),
                     "low": low, "high": high, "valid": np.sum(np.isfinite(arr), axis=0)}
    return out


def prohaska_intercept_error(extrapolation: Extrapolation) -> float:
    r"""Standard error of the intercept (1+k) of Prohaska's fit [-].

    .. math:: s_a = s \sqrt{1/n + \bar x^2 / S_{xx}}, \quad
              s^2 = \frac{\sum r_i^2}{n - 2}

    the textbook result for a straight line fitted by least squares (e.g. Montgomery &
    Runger, "Applied Statistics and Probability for Engineers", ch. 11). 0 when k was not
    fitted. A diagnostic of the scatter of the low-speed runs: a first-order u(k) propagated
    from the stated resistance uncertainty far below it says the stated uncertainty is too
    small for the data.
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
    """Propagated uncertainties of the resistance extrapolation, per run.

    Attributes
    ----------
    inputs : MeasurementUncertainty
        As given, with ``form_factor`` resolved: the u(k) used as an input, or the u(k) the
        run uncertainties give a fitted k (first order).
    table : pandas.DataFrame
        Per run: ship speed, C_TS and its contributions and combined u, P_E and its u.
    method : str
        The method statement.
    intercept_error : float
        Standard error of Prohaska's intercept (0 when k was not fitted): a check on the
        stated resistance uncertainty, not an input.
    """

    inputs: MeasurementUncertainty
    table: Any
    method: str = METHOD_STATEMENT
    intercept_error: float = 0.0


def _resistance_outputs(result: dict[str, Any]) -> dict[str, np.ndarray]:
    r = result["resistance"]
    k = np.broadcast_to(np.asarray(r["k"], float).reshape(-1, 1), r["cts"].shape)
    return {"cts": r["cts"], "pe": r["pe"], "ship_speed": r["ship_speed"], "k": k}


def propagate(extrapolation: Extrapolation, uncertainty: MeasurementUncertainty,
              samples: int | None = None, seed: int = DEFAULT_SEED) -> UncertaintyResult:
    """Propagate measurement uncertainties to C_TS and P_E, run by run (first order, and Monte
    Carlo when ``samples`` is given).

    Parameters
    ----------
    extrapolation : Extrapolation
        From :func:`similitude.prediction.extrapolation.extrapolate`.
    uncertainty : MeasurementUncertainty
    samples : int, optional
        Monte Carlo samples (e.g. 10 000); the table then adds the Monte Carlo standard
        uncertainty of P_E and the ratio of the two methods.
    seed : int
        Seed of the Monte Carlo samples.

    Returns
    -------
    UncertaintyResult

    Notes
    -----
    See the module docstring. Each contribution is c_i u(x_i) = [f(x_i + u_i) − f(x_i − u_i)]/2,
    exact for a linear f and a first-order estimate otherwise; the contributions of one kind of
    input (e.g. every run's resistance) add in quadrature.
    """
    import pandas as pd

    inputs = ChainInputs(extrapolation)
    values, parts = first_order_si(inputs, uncertainty, _resistance_outputs)
    n = values["pe"].size
    u_k = _form_factor_input(inputs, uncertainty)
    if u_k is None:
        fitted = extrapolation.form_factor_fit is not None and extrapolation.options.method \
            != "froude"
        u_k = float(combined(parts, "k", n)[0]) if fitted else 0.0
    order = np.argsort(values["ship_speed"], kind="stable")
    data: dict[str, Any] = {
        "run": list(extrapolation.runs.run),
        "ship speed [kn]": values["ship_speed"] / KNOT,
        "u(ship speed) [kn]": combined(parts, "ship_speed", n) / KNOT,
        "C_TS [-]": values["cts"],
    }
    names = ("speed", "resistance", "temperature", "form factor")
    for name in names:
        data[f"u(C_TS) from {name} [-]"] = parts.get(name, {}).get("cts", np.zeros(n))
    data["u(C_TS) combined [-]"] = combined(parts, "cts", n)
    data["P_E [kW]"] = values["pe"] / 1e3
    for name in names:
        data[f"u(P_E) from {name} [kW]"] = parts.get(name, {}).get("pe", np.zeros(n)) / 1e3
    u_pe = combined(parts, "pe", n)
    data["u(P_E) combined [kW]"] = u_pe / 1e3
    data["u(P_E)/P_E [%]"] = 100.0 * u_pe / values["pe"]
    data["expanded U(P_E), k=2 [kW]"] = 2.0 * u_pe / 1e3
    method = METHOD_STATEMENT
    if samples is not None:
        mc = monte_carlo_si(inputs, uncertainty, _resistance_outputs, samples, seed)["pe"]
        data["u(P_E) Monte Carlo [kW]"] = mc["std"] / 1e3
        data["u(P_E) first order / Monte Carlo [-]"] = u_pe / mc["std"]
        method += " Monte Carlo: " + MONTE_CARLO_STATEMENT.format(samples=samples, seed=seed)
    table = pd.DataFrame(data).iloc[order].reset_index(drop=True)
    return UncertaintyResult(replace(uncertainty, form_factor=float(u_k)), table, method,
                             prohaska_intercept_error(extrapolation))


__all__ = [
    "DEFAULT_SAMPLES",
    "DEFAULT_SEED",
    "INPUT_NAMES",
    "METHOD_STATEMENT",
    "MONTE_CARLO_STATEMENT",
    "MeasurementUncertainty",
    "UncertaintyResult",
    "combined",
    "first_order_si",
    "monte_carlo_si",
    "prohaska_intercept_error",
    "propagate",
    "standard_uncertainties",
]

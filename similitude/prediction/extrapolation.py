"""Full-scale resistance and effective power from measured model resistance (ITTC-1978 method).

The pipeline, one step per function of :mod:`similitude.correlations.ittc78` and its neighbours,
run by run:

1. remove the parasitic drag of the turbulence stimulators, when measured;
2. optional tank blockage correction of the carriage speed (Schuster or Tamura,
   :func:`similitude.correlations.blockage.tank_speed_correction`), before anything else is derived;
3. model coefficients C_TM = R_TM/(½ ρ_M S_M V_M²) and C_FM (ITTC-1957 line) at the test
   temperature;
4. form factor k: Prohaska's fit over the low-speed runs, or given; k = 0 in the Froude method;
5. C_TM corrected to the standard temperature (15 °C): C_TM,15 = C_TM + (1+k)(C_FM,15 − C_FM);
6. residuary coefficient C_R = C_TM,15 − (1+k) C_FM,15, equal at model and ship at equal Fn;
7. ship: V_S = V_M √λ, C_FS, roughness allowance ΔC_F (Bowden–Davison 1978 or Townsin),
   correlation allowance C_A, air resistance C_AAS, bilge-keel wetted-area factor, giving
   C_TS = ((S + S_BK)/S)[(1+k) C_FS + ΔC_F] + C_A + C_R + C_AAS, R_TS and P_E = R_TS V_S.

Predictions are estimates: the facility's own correlation practice, the current ITTC procedures
and licensed practice prevail.

pandas is imported inside the functions that build DataFrames: the command line builds every
command's parser at start (this module gives the ``extrapolate`` command its choices), and that
start must not pay for pandas.

References
----------
.. [1] ITTC, "1978 ITTC Performance Prediction Method", Recommended Procedure 7.5-02-03-01.4,
       Rev 00 (1999, from the 15th, 17th and 18th ITTC 1978/84/87) for the original method;
       Rev 04 (2017) for the revised roughness (Townsin), correlation and air-resistance
       allowances used by default.
.. [2] ITTC, "Resistance Test", Recommended Procedure 7.5-02-02-01, Rev 03 (2011): temperature
       correction (§3.3.4), form factor (§3.6.2), blockage corrections (§3.6.3).
.. [3] Prohaska, C. W., "A simple method for the evaluation of the form factor and the low
       speed wave resistance", Proc. 11th ITTC (1966) 65-66.

The title page of Rev 00 was read; the revised allowances (Townsin roughness, C_A, C_DA air
resistance) are written from memory of Rev 04 (2017), high to medium confidence: check them
against the current revision (Rev 05, 2021) before relying on a prediction.
"""

from __future__ import annotations

import math
from dataclasses import asdict, dataclass, field, replace
from typing import Any

import numpy as np

from fluids_props.seawater import sea_water_si
from fluids_props.water import fresh_water_si
from similitude.cautions import PREDICTION_CAUTION
from similitude.constants import AIR_DENSITY, G0, ITTC_TEMPERATURE, KNOT, P_ATM, STANDARD_SALINITY
from similitude.correlations import blockage as _blockage
from similitude.correlations import friction as _friction
from similitude.correlations import ittc78
from similitude.errors import InputError
from similitude.plain_data import plain
from similitude.prediction.runs import ResistanceRuns
from similitude.units import parse_scale, to_si

METHODS = ("ittc1978", "froude")
"""``"ittc1978"``: form factor (1+k) on the friction; ``"froude"``: 1+k = 1 (Froude's method)."""




def _positive(name: str, value: Any, allow_none: bool = False, allow_zero: bool = False):
    if value is None and allow_none:
        return
    ok = isinstance(value, (int, float)) and math.isfinite(value)
    ok = ok and (value >= 0 if allow_zero else value > 0)
    if not ok:
        need = "a number >= 0" if allow_zero else "a positive number"
        raise InputError(f"{name}: {value!r} is not valid; expected {need}")


@dataclass(frozen=True)
class ShipParticulars:
    """What the extrapolation needs of the ship, SI.

    Attributes
    ----------
    length : float
        Waterline length L_WL [m] (the Reynolds and Froude length).
    wetted_surface : float
        Bare-hull wetted surface S [m^2].
    scale : float
        λ = L_ship / L_model [-].
    transverse_area : float
        Projected transverse area above the waterline A_VS [m^2] (air resistance; 0: none).
    bilge_keel_area : float
        Wetted area of the bilge keels S_BK [m^2]; the model is assumed run without them.
    midship_area : float or None
        Midship section area A_X [m^2] (tank blockage only).
    beam : float or None
        Beam [m] (Tamura's blockage correction only).
    water_temperature : float
        Ship water temperature [K]; 15 °C is the ITTC standard.
    salinity : float
        Absolute salinity of the ship's water [kg/kg]; 0 means fresh water.
    air_density : float
        ρ_A [kg/m^3] for the air resistance.
    hull_roughness : float
        k_S [m]; 150e-6 when not measured (ITTC 7.5-02-03-01.4).
    name : str
    """

    length: float
    wetted_surface: float
    scale: float
    transverse_area: float = 0.0
    bilge_keel_area: float = 0.0
    midship_area: float | None = None
    beam: float | None = None
    water_temperature: float = ITTC_TEMPERATURE
    salinity: float = STANDARD_SALINITY
    air_density: float = AIR_DENSITY
    hull_roughness: float = ittc78.DEFAULT_HULL_ROUGHNESS
    name: str = "ship"

    def __post_init__(self) -> None:
        _positive("ship.length", self.length)
        _positive("ship.wetted_surface", self.wetted_surface)
        _positive("ship.scale", self.scale)
        _positive("ship.transverse_area", self.transverse_area, allow_zero=True)
        _positive("ship.bilge_keel_area", self.bilge_keel_area, allow_zero=True)
        _positive("ship.midship_area", self.midship_area, allow_none=True)
        _positive("ship.beam", self.beam, allow_none=True)
        _positive("ship.water_temperature", self.water_temperature)
        _positive("ship.salinity", self.salinity, allow_zero=True)
        _positive("ship.air_density", self.air_density)
        _positive("ship.hull_roughness", self.hull_roughness, allow_zero=True)

    @property
    def model_length(self) -> float:
        """Model waterline length L_M = L/λ [m]."""
        return self.length / self.scale

    @property
    def model_wetted_surface(self) -> float:
        """Model wetted surface S_M = S/λ² [m^2]."""
        return self.wetted_surface / self.scale**2

    @classmethod
    def from_quantities(cls, length: Any, wetted_surface: Any, scale: Any, **extra: Any):
        """Build from user values: ``"120 m"``, ``"2650 m^2"``, ``"1:25"`` ...

        Parameters
        ----------
        length, wetted_surface : str or Quantity
            L_WL and S.
        scale : str or number
            ``"1:25"`` or 25.
        **extra
            ``transverse_area``, ``bilge_keel_area``, ``midship_area`` (areas), ``beam``,
            ``water_temperature`` (``"15 degC"``), ``salinity`` (``"35.165 g/kg"``),
            ``air_density``, ``hull_roughness`` (``"150 um"``), ``name``.
        """
        dims = {"transverse_area": "[length] ** 2", "bilge_keel_area": "[length] ** 2",
                "midship_area": "[length] ** 2", "beam": "[length]",
                "water_temperature": "[temperature]", "salinity": "dimensionless",
                "air_density": "[mass] / [length] ** 3", "hull_roughness": "[length]"}
        kw: dict[str, Any] = {}
        for key, value in extra.items():
            if key == "name":
                kw[key] = str(value)
            elif key in dims:
                kw[key] = None if value is None else to_si(value, dims[key], f"ship.{key}")
            else:
                raise InputError(f"ship.{key}: unknown particular; expected one of "
                                 + ", ".join(sorted([*dims, "name"])))
        return cls(to_si(length, "[length]", "ship.length"),
                   to_si(wetted_surface, "[length] ** 2", "ship.wetted_surface"),
                   parse_scale(scale, "ship.scale"), **kw)

    @classmethod
    def from_case(cls, case, scale: float | None = None) -> ShipParticulars:
        """Take the particulars from a :class:`similitude.planning.case.Case`.

        Parameters
        ----------
        case : Case
            Its prototype gives L (``length``), ``dimensions["wetted_surface"]`` (required),
            ``transverse_area``, ``bilge_keel_area``, ``midship_area``, ``beam`` and the fluid
            (temperature, salinity; fresh water gives salinity 0).
        scale : float, optional
            λ; default the case's fixed scale (``request.scale`` or from
            ``request.model_length``), else the plan's scale must be passed.
        """
        proto = case.prototype
        dims = proto.dimensions
        if "wetted_surface" not in dims:
            raise InputError("prototype.dimensions.wetted_surface: missing; expected the ship's "
                             "bare-hull wetted surface (e.g. wetted_surface = '2650 m^2')")
        if scale is None:
            scale = case_scale(case)
        if scale is None:
            raise InputError("scale: the case fixes no scale; expected match.scale, "
                             "match.model_length or the plan's scale")
        fluid = proto.fluid
        if fluid.name == "sea_water":
            salinity = STANDARD_SALINITY if fluid.salinity is None else fluid.salinity
        elif fluid.name == "fresh_water":
            salinity = 0.0
        else:
            raise InputError(f"prototype.fluid.name: {fluid.name!r}; expected sea_water or "
                             "fresh_water for a resistance extrapolation")
        return cls(
            length=proto.length, wetted_surface=dims["wetted_surface"], scale=float(scale),
            transverse_area=dims.get("transverse_area", 0.0),
            bilge_keel_area=dims.get("bilge_keel_area", 0.0),
            midship_area=dims.get("midship_area"), beam=dims.get("beam"),
            water_temperature=fluid.temperature, salinity=salinity, name=proto.name,
        )


def case_scale(case) -> float | None:
    """The scale λ a case fixes: ``match.scale``, or the prototype length over
    ``match.model_length``; None when the case leaves the scale to the planner.

    Parameters
    ----------
    case : similitude.planning.case.Case
    """
    req = case.request
    if req.scale is not None:
        return req.scale
    if req.model_length is not None:
        return case.prototype.length / req.model_length
    return None


@dataclass(frozen=True)
class TankParticulars:
    """The towing tank, for the blockage correction.

    Attributes
    ----------
    width : float
        Tank width B_T [m].
    depth : float
        Water depth h [m].
    """

    width: float
    depth: float

    def __post_init__(self) -> None:
        _positive("tank.width", self.width)
        _positive("tank.depth", self.depth)


@dataclass(frozen=True)
class ExtrapolationOptions:
    """Choices of the extrapolation (defaults: ITTC 7.5-02-03-01.4 Rev 04, 2017).

    Attributes
    ----------
    method : str
        One of :data:`METHODS`.
    form_factor : float or None
        k [-] given by the user; None: Prohaska's fit (ignored by the Froude method).
    froude_range : (float, float)
        Froude range of Prohaska's fit [-].
    prohaska_exponent : float
        Exponent n on Fn in Prohaska's fit [-].
    roughness_method : str
        One of :data:`similitude.correlations.ittc78.ROUGHNESS_METHODS`.
    correlation_method : str or None
        One of :data:`similitude.correlations.ittc78.CORRELATION_METHODS`; None: ``"ittc2017"``
        with the
        Townsin roughness, ``"none"`` with Bowden–Davison (the 1978 form, where ΔC_F held the
        whole allowance and each facility added its own correlation).
    correlation_allowance : float or None
        A C_A [-] given by the facility; overrides ``correlation_method``.
    air_method : str
        One of :data:`similitude.correlations.ittc78.AIR_RESISTANCE_METHODS`.
    air_drag_coefficient : float
        C_DA [-] of the revised air-resistance formula.
    friction_line : str
        Friction line (:data:`similitude.correlations.friction.FRICTION_LINES`); the ITTC method
        uses ``"ittc1957"``.
    standard_temperature : float
        Temperature the model C_TM is corrected to [K].
    blockage : str or None
        None, or a method of :data:`similitude.correlations.blockage.TANK_BLOCKAGE_METHODS`.
    tank : TankParticulars or None
        Required with ``blockage``.
    """

    method: str = "ittc1978"
    form_factor: float | None = None
    froude_range: tuple[float, float] = (0.1, 0.2)
    prohaska_exponent: float = 4.0
    roughness_method: str = "townsin"
    correlation_method: str | None = None
    correlation_allowance: float | None = None
    air_method: str = "revised"
    air_drag_coefficient: float = ittc78.DEFAULT_AIR_DRAG_COEFFICIENT
    friction_line: str = "ittc1957"
    standard_temperature: float = ITTC_TEMPERATURE
    blockage: str | None = None
    tank: TankParticulars | None = None

    def __post_init__(self) -> None:
        for key, value, names in (
            ("method", self.method, METHODS),
            ("roughness_method", self.roughness_method, ittc78.ROUGHNESS_METHODS),
            ("air_method", self.air_method, ittc78.AIR_RESISTANCE_METHODS),
            ("friction_line", self.friction_line, _friction.FRICTION_LINES),
        ):
            if value not in names:
                raise InputError(f"{key}: {value!r} is unknown; expected one of "
                                 + ", ".join(names))
        if (self.correlation_method is not None
                and self.correlation_method not in ittc78.CORRELATION_METHODS):
            raise InputError(f"correlation_method: {self.correlation_method!r} is unknown; "
                             "expected one of " + ", ".join(ittc78.CORRELATION_METHODS))
        if self.form_factor is not None and not (
                isinstance(self.form_factor, (int, float)) and math.isfinite(self.form_factor)
                and -0.5 < self.form_factor < 1.5):
            raise InputError(f"form_factor: {self.form_factor!r}; expected k between -0.5 and "
                             "1.5 (typical ship hulls: 0.05 to 0.5)")
        lo, hi = self.froude_range
        if not 0 <= lo < hi:
            raise InputError(f"froude_range: {self.froude_range!r}; expected 0 <= low < high")
        if self.blockage is not None:
            if self.blockage not in _blockage.TANK_BLOCKAGE_METHODS:
                raise InputError(f"blockage: {self.blockage!r} is unknown; expected one of "
                                 + ", ".join(_blockage.TANK_BLOCKAGE_METHODS))
            if self.tank is None:
                raise InputError("tank: missing; the blockage correction needs the tank width "
                                 "and water depth")

    @property
    def resolved_correlation_method(self) -> str:
        """The correlation-allowance method actually used."""
        if self.correlation_method is not None:
            return self.correlation_method
        return "none" if self.roughness_method == "bowden_davison" else "ittc2017"

    @property
    def revision_note(self) -> str:
        """One line naming the procedure and the revision the options follow."""
        if self.method == "froude":
            base = "Froude's method (1+k = 1) with the ITTC-1957 line"
        else:
            base = "ITTC-1978 method (ITTC 7.5-02-03-01.4)"
        rough = ("roughness allowance of Bowden & Davison, as in the 1978 method (Rev 00, 1999)"
                 if self.roughness_method == "bowden_davison" else
                 "roughness allowance of Townsin, as in the revised procedure (Rev 04, 2017)")
        corr = {"ittc2017": "correlation allowance C_A = (5.68 - 0.6 log10 Re) 1e-3 "
                            "(Rev 04, 2017)",
                "none": "no separate correlation allowance"}[self.resolved_correlation_method]
        if self.correlation_allowance is not None:
            corr = f"correlation allowance C_A = {self.correlation_allowance:g} (given)"
        air = ("air resistance C_AAS = C_DA rho_A A_VS/(rho_S S) (Rev 04, 2017)"
               if self.air_method == "revised" else "air resistance C_AAS = 0.001 A_T/S (1978)")
        return f"{base}; {rough}; {corr}; {air}"


@dataclass(frozen=True, eq=False)
class Extrapolation:
    """The result of :func:`extrapolate`: every step, as DataFrames with units in the headers.

    Attributes
    ----------
    ship : ShipParticulars
    options : ExtrapolationOptions
    runs : ResistanceRuns
        The measured input.
    form_factor : float
        k used [-].
    form_factor_fit : similitude.correlations.ittc78.FormFactorFit or None
        Prohaska's fit, when k was fitted.
    model : pandas.DataFrame
        Model-scale steps per run: stimulator drag, blockage, C_TM, C_FM, temperature
        correction, C_R.
    full_scale : pandas.DataFrame
        Ship-scale steps per run: V_S, Re_S, C_FS, ΔC_F, C_A, C_AAS, bilge-keel factor, C_TS,
        R_TS, P_E.
    results : pandas.DataFrame
        The summary: ship speed, Froude number, C_TS, R_TS, P_E.
    notes : tuple of str
        Method statement and cautions.
    arrays : dict
        The SI arrays of the pipeline (for uncertainty propagation and plots).
    """

    ship: ShipParticulars
    options: ExtrapolationOptions
    runs: ResistanceRuns
    form_factor: float
    form_factor_fit: Any
    model: Any
    full_scale: Any
    results: Any
    notes: tuple[str, ...]
    arrays: dict = field(default_factory=dict)

    def prohaska_frame(self):
        """Prohaska's plot data: C_TM/C_FM against Fn^n/C_FM, used points, fitted line."""
        import pandas as pd

        a = self.arrays
        n = self.options.prohaska_exponent
        x = a["froude"] ** n / a["cfm"]
        y = a["ctm"] / a["cfm"]
        used = (np.zeros(len(x), bool) if self.form_factor_fit is None
                else np.asarray(self.form_factor_fit.used, bool))
        slope = 0.0 if self.form_factor_fit is None else self.form_factor_fit.slope
        line = (1.0 + self.form_factor) + slope * x
        return pd.DataFrame({
            "run": list(self.runs.run),
            "Froude number [-]": a["froude"],
            f"Fn^{n:g}/C_FM [-]": x,
            "C_TM/C_FM [-]": y,
            "used in fit": used,
            "fitted line [-]": line,
            "residual [-]": y - line,
        })

    def fit_summary(self) -> dict[str, Any]:
        """The form factor and, when fitted, Prohaska's fit statistics."""
        fit = self.form_factor_fit
        out: dict[str, Any] = {"form factor k [-]": self.form_factor,
                               "source": "Prohaska fit" if fit is not None else
                               ("Froude method (k = 0)" if self.options.method == "froude"
                                else "given")}
        if fit is not None:
            out.update({
                "slope y [-]": fit.slope,
                "R^2 [-]": fit.r_squared,
                "Froude range [-]": f"{fit.froude_range[0]:g} to {fit.froude_range[1]:g}",
                "points used": fit.n_points,
                "exponent n [-]": fit.exponent,
                "largest |residual| [-]": float(np.max(np.abs(fit.residuals))),
            })
        return out

    def to_dict(self) -> dict[str, Any]:
        """Plain data for JSON output (through :func:`similitude.plain_data.plain`)."""
        return plain({
            "ship": asdict(self.ship),
            "options": {k: v for k, v in asdict(self.options).items() if k != "tank"}
            | {"tank": None if self.options.tank is None else asdict(self.options.tank),
               "correlation_method_used": self.options.resolved_correlation_method},
            "method": self.options.revision_note,
            "form_factor": self.fit_summary(),
            "results": self.results.to_dict(orient="records"),
            "notes": list(self.notes),
        })

    def to_excel(self, path, overwrite: bool = False, uncertainty=None, open_water=None,
                 paper: str = "A4"):
        """Write the workbook (see :func:`similitude.report.results_workbook.write_results`)."""
        from similitude.report.results_workbook import write_results

        return write_results(path, self, uncertainty=uncertainty, open_water=open_water,
                             overwrite=overwrite, paper=paper)


# -- the pipeline in SI ------------------------------------------------------------------------


def _water_si(temperature, salinity: float = 0.0):
    """(density [kg/m^3], kinematic viscosity [m^2/s]) of fresh or sea water at 1 atm."""
    t = np.asarray(temperature, dtype=float)
    if salinity > 0:
        state = sea_water_si(t, P_ATM, salinity)
    else:
        state = fresh_water_si(t)
    return (np.asarray(state.density_si, dtype=float),
            np.asarray(state.kinematic_viscosity_si, dtype=float))


def _model_coefficients(v, r_m, rho_m, nu_m, ship: ShipParticulars, line: str):
    """Fn, Re_M, C_TM and C_FM of the model at speed ``v`` [m/s], at the test temperature."""
    lm, sm = ship.model_length, ship.model_wetted_surface
    fn = v / np.sqrt(G0 * lm)
    re = v * lm / nu_m
    ctm = ittc78.coefficient_from_resistance(r_m, rho_m, sm, v)
    cfm = _friction.friction_coefficient(re, line)
    return fn, re, np.atleast_1d(ctm), np.atleast_1d(cfm)


def _form_factor(fn, ctm, cfm, options: ExtrapolationOptions, form_factor, fit_used=None):
    """(k, Prohaska fit or None): 0 in Froude's method, else the given k, else the fit.

    For a batch of samples (2-D arrays, one row each) k is a column ``(N, 1)``: the given
    ones, or Prohaska's line re-fitted to each row over the runs ``fit_used``."""
    if options.method == "froude":
        return 0.0, None
    k_given = form_factor if form_factor is not None else options.form_factor
    if k_given is not None:
        return (float(k_given) if np.ndim(k_given) == 0 else np.asarray(k_given, float)), None
    if np.ndim(ctm) == 2:
        if fit_used is None:
            lo, hi = options.froude_range
            fit_used = (fn[0] >= lo) & (fn[0] <= hi)
        k, _ = ittc78.prohaska_fit_many(fn, ctm, cfm, fit_used, options.prohaska_exponent)
        return k[:, None], None
    fit = ittc78.prohaska_fit(fn, ctm, cfm, options.prohaska_exponent, options.froude_range)
    return fit.form_factor, fit


def _blockage_correction(v_carriage, fn, ctm, cfm, ship: ShipParticulars,
                         options: ExtrapolationOptions, form_factor, fit_used=None):
    """(dV/V, blockage ratio m, depth Froude number) of each run, from the uncorrected
    coefficients (ITTC 7.5-02-02-01 §3.6.3)."""
    tank = options.tank
    if ship.midship_area is None:
        raise InputError("ship.midship_area: missing; the blockage correction needs the "
                         "midship section area A_X")
    blockage_ratio = ship.midship_area / ship.scale**2 / (tank.width * tank.depth)
    depth_froude = v_carriage / np.sqrt(G0 * tank.depth)
    # The viscous share R_V/R_T of Schuster's wave term needs k: a first estimate from the
    # uncorrected runs, then the whole model analysis is redone on the corrected speeds.
    k0, _ = _form_factor(fn, ctm, cfm, options, form_factor, fit_used)
    viscous = np.clip((1.0 + k0) * cfm / ctm, 0.0, 1.0)
    lb = None if ship.beam is None else ship.length / ship.beam
    dvv = np.atleast_1d(_blockage.tank_speed_correction(
        blockage_ratio, depth_froude, options.blockage, length_over_width=lb,
        viscous_fraction=viscous))
    return dvv, blockage_ratio, depth_froude


def _standard_temperature_si(v_m, ctm, cfm, k, ship: ShipParticulars,
                             options: ExtrapolationOptions) -> dict[str, Any]:
    """C_TM and R_TM corrected to the standard temperature (fresh tank water), and C_R."""
    lm, sm = ship.model_length, ship.model_wetted_surface
    rho_15, nu_15 = _water_si(options.standard_temperature)
    re_m15 = v_m * lm / nu_15
    cfm15 = np.atleast_1d(_friction.friction_coefficient(re_m15, options.friction_line))
    ctm15 = np.atleast_1d(ittc78.temperature_corrected_ctm(ctm, cfm, cfm15, k))
    rtm15 = np.atleast_1d(ittc78.resistance_from_coefficient(ctm15, rho_15, sm, v_m))
    cr = np.atleast_1d(ittc78.residuary_coefficient(ctm15, cfm15, k))
    return {"rho_15": float(rho_15), "nu_15": float(nu_15), "cfm15": cfm15, "ctm15": ctm15,
            "rtm15": rtm15, "cr": cr}


def ship_si(v_m, cr, k, ship: ShipParticulars, options: ExtrapolationOptions) -> dict[str, Any]:
    """The ship at the model's Froude number: allowances, C_TS, R_TS and P_E (SI arrays by
    name).

    Parameters
    ----------
    v_m : array_like
        Model speed [m/s] (the ship's is V_M sqrt(lambda)).
    cr : array_like
        Residuary coefficient C_R at the same Froude number [-].
    k : float or array_like
        Form factor [-] (an array broadcasting against ``v_m`` for a batch of samples).
    ship : ShipParticulars
    options : ExtrapolationOptions
    """
    line = options.friction_line
    v_s = v_m * np.sqrt(ship.scale)
    rho_s, nu_s = _water_si(ship.water_temperature, ship.salinity)
    rho_s, nu_s = float(rho_s), float(nu_s)
    re_s = v_s * ship.length / nu_s
    cfs = np.atleast_1d(_friction.friction_coefficient(re_s, line))
    # Bowden-Davison depends on L only (a scalar): broadcast to the runs.
    dcf = np.asarray(ittc78.roughness_allowance(ship.length, re_s, ship.hull_roughness,
                                                options.roughness_method)) * np.ones_like(v_s)
    if options.correlation_allowance is not None:
        ca = np.full_like(v_s, float(options.correlation_allowance))
    else:
        ca = np.atleast_1d(ittc78.correlation_allowance(
            ship.length, re_s, options.resolved_correlation_method)) * np.ones_like(v_s)
    caas = float(ittc78.air_resistance_coefficient(
        ship.transverse_area, ship.wetted_surface, ship.air_density, rho_s,
        options.air_drag_coefficient, options.air_method))
    cts = np.atleast_1d(ittc78.ship_total_resistance_coefficient(
        cfs, k, dcf, ca, cr, caas, ship.wetted_surface, ship.bilge_keel_area))
    rts = np.atleast_1d(ittc78.resistance_from_coefficient(cts, rho_s, ship.wetted_surface, v_s))
    pe = np.atleast_1d(ittc78.effective_power(cts, rho_s, ship.wetted_surface, v_s))
    return {
        "ship_speed": v_s, "rho_s": rho_s, "nu_s": nu_s, "re_s": re_s, "cfs": cfs,
        "dcf": dcf, "ca": ca, "caas": caas,
        "bk_factor": (ship.wetted_surface + ship.bilge_keel_area) / ship.wetted_surface,
        "cts": cts, "rts": rts, "pe": pe,
    }


def pipeline_si(speed, resistance, temperature, ship: ShipParticulars,
                options: ExtrapolationOptions, form_factor=None,
                stimulator_drag=None, fit_used=None) -> dict[str, Any]:
    """The extrapolation on SI arrays (no units, no DataFrames).

    The run arrays are ``(n,)`` for one set of runs or ``(N, n)`` for N samples of them (an
    uncertainty estimate): every step broadcasts over the leading axis, and k is then a
    column ``(N, 1)``, re-fitted to each sample unless given.

    Parameters
    ----------
    speed : array_like
        Carriage (model) speed [m/s].
    resistance : array_like
        Measured model total resistance [N].
    temperature : array_like
        Tank water temperature [K].
    ship : ShipParticulars
    options : ExtrapolationOptions
    form_factor : float or array_like, optional
        k [-]; overrides ``options`` (the uncertainty propagation holds k fixed this way); a
        column ``(N, 1)`` gives each sample its own.
    stimulator_drag : array_like, optional
        Parasitic drag of the turbulence stimulators [N], subtracted from the resistance.
    fit_used : array_like of bool, optional
        ``(n,)``: the runs of Prohaska's fit for a batch of samples (default: those of the
        first sample inside the Froude range), so every sample is fitted to the same runs.

    Returns
    -------
    dict
        SI arrays by name (``ctm``, ``cfm``, ``cr``, ``cts``, ``pe`` ...), ``k`` and ``fit``.
    """
    v_carriage = np.atleast_1d(np.asarray(speed, dtype=float))
    r_meas = np.atleast_1d(np.asarray(resistance, dtype=float))
    t_m = np.broadcast_to(np.asarray(temperature, dtype=float), v_carriage.shape)
    r_m = r_meas - (0.0 if stimulator_drag is None else np.asarray(stimulator_drag, float))
    rho_m, nu_m = _water_si(t_m)
    dvv = np.zeros_like(v_carriage)
    blockage_ratio = depth_froude = None
    if options.blockage is not None:
        uncorrected = _model_coefficients(v_carriage, r_m, rho_m, nu_m, ship,
                                          options.friction_line)
        fn0, _, ctm0, cfm0 = uncorrected
        dvv, blockage_ratio, depth_froude = _blockage_correction(
            v_carriage, fn0, ctm0, cfm0, ship, options, form_factor, fit_used)
    v_m = v_carriage * (1.0 + dvv)
    fn, re_m, ctm, cfm = _model_coefficients(v_m, r_m, rho_m, nu_m, ship, options.friction_line)
    k, fit = _form_factor(fn, ctm, cfm, options, form_factor, fit_used)
    standard = _standard_temperature_si(v_m, ctm, cfm, k, ship, options)
    return {
        "carriage_speed": v_carriage, "resistance_measured": r_meas, "resistance": r_m,
        "temperature": t_m, "rho_m": rho_m, "nu_m": nu_m, "blockage_ratio": blockage_ratio,
        "depth_froude": depth_froude, "dvv": dvv, "model_speed": v_m, "froude": fn,
        "re_m": re_m, "ctm": ctm, "cfm": cfm, "k": k, "fit": fit, **standard,
        **ship_si(v_m, standard["cr"], k, ship, options),
    }


def extrapolate(runs: ResistanceRuns, ship: ShipParticulars,
                options: ExtrapolationOptions | None = None, **changes: Any) -> Extrapolation:
    """Extrapolate measured model resistance to the full-scale ship.

    Parameters
    ----------
    runs : ResistanceRuns
        From :func:`similitude.readers.measured.read_resistance_runs`, or built from arrays.
    ship : ShipParticulars
        Built directly, with :meth:`ShipParticulars.from_quantities` or
        :meth:`ShipParticulars.from_case`.
    options : ExtrapolationOptions, optional
        Default: the ITTC-1978 method as revised (Rev 04, 2017), k by Prohaska's fit.
    **changes
        Fields of :class:`ExtrapolationOptions` to change, e.g. ``form_factor=0.12``,
        ``roughness_method="bowden_davison"``, ``method="froude"``.

    Returns
    -------
    Extrapolation
        Every step as DataFrames, the form-factor fit and the method statement.

    Notes
    -----
    See the module docstring for the steps and equations. The residuary coefficient does not
    depend on the temperature correction (it cancels), but the corrected C_TM,15 and R_TM,15
    are reported because the procedure asks for them.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 "1978 ITTC Performance Prediction Method", Rev 00 (1999) and
           Rev 04 (2017).
    .. [2] ITTC 7.5-02-02-01 "Resistance Test", Rev 03 (2011).
    """
    options = options or ExtrapolationOptions()
    if changes:
        try:
            options = replace(options, **changes)
        except TypeError as exc:
            raise InputError(f"options: {exc}") from None
    a = pipeline_si(runs.speed, runs.resistance, runs.temperature, ship, options,
                    stimulator_drag=runs.stimulator_drag)
    ids = list(runs.run)
    return Extrapolation(ship, options, runs, a["k"], a["fit"], _model_frame(runs, a),
                         _full_scale_frame(ids, a), _results_frame(ids, a),
                         _notes(options, a), a)


def _model_frame(runs: ResistanceRuns, a: dict[str, Any]):
    """The model-scale steps per run, as a DataFrame with units in the headers."""
    import pandas as pd

    ids = list(runs.run)
    model = pd.DataFrame({
        "run": ids,
        "carriage speed [m/s]": a["carriage_speed"],
        "measured resistance [N]": a["resistance_measured"],
        "stimulator drag [N]": (np.zeros(len(ids)) if runs.stimulator_drag is None
                                else runs.stimulator_drag),
        "resistance used [N]": a["resistance"],
        "blockage speed correction dV/V [-]": a["dvv"],
        "model speed [m/s]": a["model_speed"],
        "water temperature [degC]": a["temperature"] - 273.15,
        "water density [kg/m^3]": a["rho_m"],
        "kinematic viscosity [m^2/s]": a["nu_m"],
        "Froude number [-]": a["froude"],
        "model Reynolds number [-]": a["re_m"],
        "C_TM at test temperature [-]": a["ctm"],
        "C_FM at test temperature [-]": a["cfm"],
        "C_FM at 15 degC [-]": a["cfm15"],
        "C_TM at 15 degC [-]": a["ctm15"],
        "R_TM at 15 degC [N]": a["rtm15"],
        "C_R [-]": a["cr"],
    })
    if a["blockage_ratio"] is not None:
        model.insert(6, "depth Froude number [-]", a["depth_froude"])
        model.insert(6, "blockage ratio m [-]", a["blockage_ratio"])
    if runs.sinkage is not None:
        model["sinkage [m]"] = runs.sinkage
    if runs.trim is not None:
        model["trim [deg]"] = runs.trim
    return model


def _full_scale_frame(ids: list[str], a: dict[str, Any]):
    """The ship-scale steps per run, as a DataFrame with units in the headers."""
    import pandas as pd

    return pd.DataFrame({
        "run": ids,
        "Froude number [-]": a["froude"],
        "ship speed [m/s]": a["ship_speed"],
        "ship speed [kn]": a["ship_speed"] / KNOT,
        "ship Reynolds number [-]": a["re_s"],
        "C_FS [-]": a["cfs"],
        "(1+k) C_FS [-]": (1.0 + a["k"]) * a["cfs"],
        "roughness allowance dC_F [-]": a["dcf"],
        "bilge-keel factor (S+S_BK)/S [-]": np.full(len(ids), a["bk_factor"]),
        "correlation allowance C_A [-]": a["ca"],
        "C_R [-]": a["cr"],
        "air resistance C_AAS [-]": np.full(len(ids), a["caas"]),
        "C_TS [-]": a["cts"],
        "R_TS [kN]": a["rts"] / 1e3,
        "P_E [kW]": a["pe"] / 1e3,
    })


def _results_frame(ids: list[str], a: dict[str, Any]):
    """The summary per run, sorted by ship speed."""
    import pandas as pd

    return pd.DataFrame({
        "run": ids,
        "ship speed [kn]": a["ship_speed"] / KNOT,
        "ship speed [m/s]": a["ship_speed"],
        "Froude number [-]": a["froude"],
        "C_TS [-]": a["cts"],
        "R_TS [kN]": a["rts"] / 1e3,
        "P_E [kW]": a["pe"] / 1e3,
    }).sort_values("ship speed [m/s]", kind="stable").reset_index(drop=True)


def _notes(options: ExtrapolationOptions, a: dict[str, Any]) -> tuple[str, ...]:
    """The method statement, the caution, and warnings on the fit and the model flow."""
    notes = [options.revision_note, PREDICTION_CAUTION]
    if a["fit"] is not None and a["fit"].r_squared < 0.9:
        notes.append(f"Prohaska's fit has R^2 = {a['fit'].r_squared:.3f}: the form factor is "
                     "uncertain; check the low-speed runs or give k.")
    if a["fit"] is not None and a["k"] < 0:
        notes.append(f"Prohaska's fit gives k = {a['k']:.3f} < 0, which is not physical: the "
                     "low-speed runs are probably affected by laminar flow or noise; give k.")
    if np.any(a["re_m"] < _friction.MIN_TURBULENT_MODEL_REYNOLDS):
        notes.append("Some runs have a model Reynolds number below "
                     f"{_friction.MIN_TURBULENT_MODEL_REYNOLDS:.0e}: laminar flow may persist "
                     "despite the stimulators; the ITTC-1957 line assumes turbulent flow.")
    if options.blockage is None:
        notes.append("No blockage correction applied.")
    negative = ittc78.correlation_allowance_note(a["ca"], a["re_s"])
    if negative:
        notes.append(negative)
    return tuple(notes)


__all__ = [
    "METHODS",
    "Extrapolation",
    "ExtrapolationOptions",
    "ShipParticulars",
    "TankParticulars",
    "case_scale",
    "extrapolate",
    "pipeline_si",
    "ship_si",
]

"""Facility checks: does the model fit the facility, and is its flow regime acceptable?

Two kinds of limit:

* **hard limits** (:func:`hard_limits`) bound the admissible models in the solver and appear in
  the plan as checks with status ``"ok"`` or ``"fail"``: carriage, fan or flow speed range,
  model size limits of the facility, tank width against the Kelvin wedge, blockage ratio, depth
  Froude number and tank depth against draught (deep-water prototypes), tunnel blockage and
  span, propeller size in a tunnel, dynamometer rotation rate, steady-run length when the
  facility states a minimum steady time, and the wavemaker's period range and largest wave
  for the wave conditions of the run matrix;
* **regime checks** (:func:`facility_checks`) are reported with status ``"ok"`` or
  ``"warning"``: minimum model Reynolds number for turbulent flow (with the
  turbulence-stimulation advice), propeller blade Reynolds number, Mach number against the
  incompressible limit, capillary limits on model waves, steady-run time against a
  common-practice minimum.

Each check carries its value, limit, margin and source. Where no published number was at hand
the source says "common practice", and values recalled from memory say so.

References
----------
.. [1] Kelvin, Lord (W. Thomson), "On ship waves", Proc. Inst. Mech. Eng. 38 (1887) 409-434
       (the wave pattern of a moving point disturbance in deep water is confined to a wedge of
       half-angle arcsin(1/3) = 19.47 deg).
.. [2] ITTC, Recommended Procedures and Guidelines 7.5-04-01-01.1, "Preparation, Conduct and
       Analysis of Speed/Power Trials", 2017 (deep water when h > 3 sqrt(B T_M) and
       h > 2.75 V^2/g), and ISO 15016:2015 (same criterion); from memory, high confidence.
.. [3] IMO MSC.1/Circ.1200, "Interim guidelines for alternative assessment of the weather
       criterion", 2006, §3.2.1 (wind-tunnel model: projected area below 5 % of the test
       section area; overall length at least 1.25 m).
.. [4] Barlow, J. B., Rae, W. H. and Pope, A., "Low-Speed Wind Tunnel Testing", 3rd ed.,
       Wiley, 1999 (frontal area up to about 7.5 % of the test section, span up to 0.8 of its
       width); from memory, medium confidence.
.. [5] Hughes, S. A., "Physical Models and Laboratory Techniques in Coastal Engineering",
       World Scientific, 1993, after Le Méhauté, B., "An Introduction to Hydrodynamics and
       Water Waves", Springer, 1976 (surface tension negligible for T > 0.35 s and depth
       > 2 cm); from memory, medium confidence.
.. [6] Longuet-Higgins, M. S., "On the statistical distribution of the heights of sea waves",
       J. Marine Research 11 (1952) 245-266 (Rayleigh heights: the most probable largest of N
       waves is H_s sqrt(ln N / 2), 1.86 H_s for N = 1000).
.. [7] Schlichting, H. and Gersten, K., "Boundary-Layer Theory", 8th ed., Springer, 2000
       (flat-plate transition band about 5e5 to 5e6).
.. [8] Lamb, H., "Hydrodynamics", 6th ed., Cambridge, 1932, §267 (capillary-gravity waves:
       phase speed minimum at lambda_w = 2 pi sqrt(sigma/(rho g)), 1.71 cm for water).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from similitude.constants import G0
from similitude.planning.case import dimension_power
from similitude.planning.findings import Check

#: Kelvin wedge half-angle arcsin(1/3) [rad] [1].
KELVIN_HALF_ANGLE = math.asin(1.0 / 3.0)

#: Tank width over model length below which the bow waves meet the walls within one model
#: length: 2 tan(19.47 deg) = 0.707 [-] (derived from [1]).
KELVIN_WIDTH_RATIO = 2.0 * math.tan(KELVIN_HALF_ANGLE)

#: Largest blockage ratio A_X/(B_T h) at which blockage is usually left uncorrected [-]
#: (common practice; no ITTC number retrieved).
TANK_BLOCKAGE_LIMIT = 0.005

#: Largest depth Froude number of "deep water": h > 2.75 V^2/g, i.e. Fh < 1/sqrt(2.75) [2].
DEEP_WATER_DEPTH_FROUDE = 1.0 / math.sqrt(2.75)

#: Deep-water depth criterion h > 3 sqrt(B T) [2].
DEEP_WATER_DRAUGHT_FACTOR = 3.0

#: Wind-tunnel blockage limits [-]: IMO weather-criterion tests [3], general practice [4].
IMO_TUNNEL_BLOCKAGE = 0.05
BARLOW_TUNNEL_BLOCKAGE = 0.075

#: Largest wing span over test-section width [-] [4].
BARLOW_SPAN_RATIO = 0.8

#: Largest propeller diameter over the smaller test-section side [-] (common practice, from
#: memory: keeps the wall effect on the propeller small; no source at hand).
PROPELLER_TUNNEL_DIAMETER_RATIO = 0.5

#: Mach number below which compressibility is usually neglected [-]: at Ma = 0.3 the
#: stagnation density rise is 4.6 % and the Prandtl-Glauert factor 1.048 (isentropic flow).
INCOMPRESSIBLE_MACH = 0.3

#: Shortest model wave period free of surface-tension effects [s] [5].
CAPILLARY_MIN_PERIOD = 0.35

#: Largest capillary share (lambda_c/lambda_w)^2 of the restoring force accepted [-]
#: (common practice), lambda_c = 2 pi sqrt(sigma/(rho g)) [8].
CAPILLARY_MAX_SHARE = 0.01

#: Largest over significant wave height in a long irregular record (N = 1000) [-] [6].
MAX_OVER_SIGNIFICANT_HEIGHT = math.sqrt(math.log(1000.0) / 2.0)

#: Minimum steady-run time at constant speed for a resistance measurement [s] when the
#: facility does not state one (common practice, from memory).
DEFAULT_STEADY_TIME = 10.0

#: Smallest model overall length for wind-tunnel tests of the weather criterion [m] [3].
IMO_MIN_TUNNEL_MODEL_LENGTH = 1.25

#: Shortest wave the model's own (transverse) wave system may have so that capillarity adds
#: at most CAPILLARY_MAX_SHARE to gravity: lambda_w = lambda_c / sqrt(share) [m] for water
#: (lambda_c = 1.71 cm) [8]; with lambda_w = 2 pi V^2/g this bounds the lowest model speed.

#: Minimum propeller blade Reynolds number Re_0.7R in open-water and cavitation tests [-]
#: (ITTC practice, from memory, medium confidence; no retrieved number).
MIN_PROPELLER_REYNOLDS = 2.0e5


@dataclass(frozen=True)
class Limit:
    """A hard limit evaluated over candidate models (arrays).

    Attributes
    ----------
    name : str
        What is limited, in words.
    value : ndarray
        The model's value in ``unit``.
    limit : float or ndarray
    kind : str
        ``"max"`` or ``"min"``.
    unit : str
    source : str
    limit_words : str
        The limit in words for messages, e.g. "carriage maximum".
    advice : str
    """

    name: str
    value: object
    limit: object
    kind: str
    unit: str
    source: str
    limit_words: str
    advice: str = ""

    def violation(self):
        """Relative violation: positive when the limit is exceeded, negative inside."""
        v = np.asarray(self.value, dtype=float)
        lim = np.asarray(self.limit, dtype=float)
        with np.errstate(divide="ignore", invalid="ignore"):
            out = v / lim - 1.0 if self.kind == "max" else 1.0 - v / lim
        return np.where(np.isfinite(out), out, np.where(np.isnan(v), 0.0, np.inf))

    def describe(self, j: int, where: str) -> str:
        """One line naming this limit at candidate ``j`` and by how much it is violated."""
        v = float(np.ravel(self.value)[j])
        lim = float(np.ravel(np.broadcast_to(self.limit, np.shape(self.value)))[j]) \
            if np.ndim(self.limit) else float(self.limit)
        verb = "exceeds" if self.kind == "max" else "is below"
        excess = (v / lim - 1.0) if self.kind == "max" else (1.0 - v / lim)
        unit = f" {self.unit}" if self.unit else ""
        return (f"{self.name} {v:.4g}{unit} {where} {verb} the {self.limit_words} "
                f"{lim:.4g}{unit} by {abs(excess) * 100:.3g} %")

    def check(self, j: int = 0) -> Check:
        """The limit at candidate ``j`` as a :class:`Check`."""
        v = float(np.ravel(self.value)[j])
        lim = float(np.ravel(np.broadcast_to(self.limit, np.shape(self.value)))[j]) \
            if np.ndim(self.limit) else float(self.limit)
        bad = float(np.ravel(self.violation())[j]) > 1e-9
        return Check(self.name, v, lim, self.unit, self.kind, "fail" if bad else "ok",
                     self.source, self.advice if bad else "")


def _dim(case, key, scale):
    v = case.prototype.dimension(key)
    if v is None:
        return None
    return v / np.asarray(scale, dtype=float) ** dimension_power(key)


def _speed_words(fac) -> str:
    if fac.free_surface:
        return "carriage"
    return "fan" if fac.kind == "wind_tunnel" else "tunnel"


def hard_limits(prob, c) -> list[Limit]:
    """The facility's hard limits over candidates ``c`` (see the module docstring).

    Parameters
    ----------
    prob : similitude.planning.solver.Problem
    c : similitude.planning.solver.Candidates

    Returns
    -------
    list of Limit
        Value arrays of the candidates' shape.
    """
    case = prob.case
    fac, proto = case.facility, case.prototype
    lam = np.asarray(c.scale, dtype=float)
    lm = proto.length / lam
    vp = np.asarray(proto.speeds, dtype=float)
    v_hi = vp[prob.design] * c.velocity_ratio
    v_lo = vp[prob.lowest] * c.velocity_ratio
    out: list[Limit] = []
    word = _speed_words(fac)
    label = f"{prob.speed_group} speed" if prob.speed_group else "model speed"
    label = label[0].upper() + label[1:]
    out.append(Limit(f"{label} at the highest prototype speed", v_hi, fac.speed_range[1],
                     "max", "m/s", "facility data", f"{word} maximum",
                     "use a smaller model or a faster facility"))
    if fac.speed_range[0] > 0:
        out.append(Limit(f"{label} at the lowest prototype speed", v_lo, fac.speed_range[0],
                         "min", "m/s", "facility data", f"{word} minimum",
                         "use a larger model or drop the lowest speed"))
    if fac.max_model_length is not None:
        out.append(Limit("model length", lm, fac.max_model_length, "max", "m",
                         "facility data", "facility's largest model"))
    if fac.min_model_length is not None:
        out.append(Limit("model length", lm, fac.min_model_length, "min", "m",
                         "facility data", "facility's smallest model"))
    if proto.rotation_rates and fac.max_rotation_rate is not None:
        n_hi = float(np.max(proto.rotation_rates)) * c.velocity_ratio * lam
        out.append(Limit("model rotation rate", n_hi, fac.max_rotation_rate, "max", "1/s",
                         "facility data", "dynamometer maximum",
                         "use a smaller propeller model or a lower speed"))
    if fac.free_surface:
        out.extend(_free_surface_limits(prob, c, lam, lm, v_hi))
        out.extend(wavemaker_limits(case, lam))
    else:
        out.extend(_tunnel_limits(prob, c, lam, lm))
    if fac.acceleration is not None and getattr(fac, "min_steady_time", None) is not None:
        steady = steady_run_length(fac, lm, v_hi)
        out.append(Limit("steady-run length at the highest speed", steady,
                         v_hi * fac.min_steady_time, "min", "m", "facility data",
                         f"distance for the stated {fac.min_steady_time:g} s steady time",
                         "use a smaller model (lower Froude speed) or accept a shorter run"))
    return out


def steady_run_length(fac, model_length, speed):
    """Steady-speed distance left after accelerating and stopping [m].

    s = L_tank - V^2/(2 a) - V^2/(2 d) - L_m, with acceleration a and deceleration d [m/s^2]
    of the carriage (uniform acceleration; kinematics).
    """
    a = fac.acceleration
    d = fac.deceleration if fac.deceleration is not None else a
    v = np.asarray(speed, dtype=float)
    return fac.length - v**2 / (2 * a) - v**2 / (2 * d) - np.asarray(model_length)


def midship_area(case, scale):
    """Model midship section area A_X [m^2]: given, or beam x draught (an upper bound)."""
    ax = _dim(case, "midship_area", scale)
    if ax is not None:
        return ax, "given"
    b, t = _dim(case, "beam", scale), _dim(case, "draught", scale)
    if b is not None and t is not None:
        return b * t, "estimated as beam x draught (midship coefficient 1, an upper bound)"
    return None, ""


def _free_surface_limits(prob, c, lam, lm, v_hi) -> list[Limit]:
    case = prob.case
    fac, proto = case.facility, case.prototype
    out = [Limit("model length vs tank width (Kelvin wedge)", lm,
                 fac.width / KELVIN_WIDTH_RATIO, "max", "m",
                 "Kelvin wedge 19.47 deg (Kelvin 1887): bow waves reach the tank walls within "
                 "one model length when B_T < 2 L tan 19.47 deg = 0.71 L (derived)",
                 "Kelvin-wedge length B_T/0.71",
                 "use a smaller model so that wall reflections pass astern of it")]
    ax, how = midship_area(case, lam)
    if ax is not None and proto.kind in ("surface_ship", "submerged_body", "offshore_structure"):
        m = ax / fac.cross_section
        out.append(Limit("blockage ratio A_X/(B_T h)", m, TANK_BLOCKAGE_LIMIT, "max", "",
                         "common practice (A_X " + how + ")", "usual uncorrected limit",
                         "use a smaller model, or correct for blockage (Schuster; ITTC "
                         "7.5-02-02-01 §3.6.3)"))
    if proto.water_depth is None and "depth_froude" not in case.request.exact:
        fh = v_hi / math.sqrt(G0 * fac.depth)
        out.append(Limit("depth Froude number V_m/sqrt(g h)", fh, DEEP_WATER_DEPTH_FROUDE,
                         "max", "",
                         "ITTC 7.5-04-01-01.1 (2017) / ISO 15016:2015 deep-water criterion "
                         "h > 2.75 V^2/g (from memory)", "deep-water limit",
                         "use a smaller model: the tank bottom would raise resistance and "
                         "sinkage"))
        b, t = _dim(case, "beam", lam), _dim(case, "draught", lam)
        if b is not None and t is not None:
            need = DEEP_WATER_DRAUGHT_FACTOR * np.sqrt(b * t)
            out.append(Limit("tank depth needed 3 sqrt(B_m T_m)", need, fac.depth, "max", "m",
                             "ITTC 7.5-04-01-01.1 (2017) / ISO 15016:2015 deep-water "
                             "criterion h > 3 sqrt(B T) (from memory)", "tank depth",
                             "use a smaller model"))
    return out


def _tunnel_limits(prob, c, lam, lm) -> list[Limit]:
    case = prob.case
    fac, proto = case.facility, case.prototype
    out = [Limit("model length vs test-section length", lm, fac.length, "max", "m",
                 "facility data",
                 "test-section length")]
    if proto.kind == "propeller":
        d = proto.dimension("diameter", proto.length) / lam
        out.append(Limit("propeller diameter", d,
                         PROPELLER_TUNNEL_DIAMETER_RATIO * min(fac.width, fac.depth), "max", "m",
                         "common practice (from memory)",
                         f"{PROPELLER_TUNNEL_DIAMETER_RATIO:g} x smaller test-section side",
                         "use a smaller propeller model"))
        return out
    ship_like = proto.kind in ("surface_ship", "offshore_structure")
    area_key = "lateral_area" if ship_like and proto.dimension("lateral_area") else \
        "frontal_area"
    area = _dim(case, area_key, lam)
    if area is not None and fac.kind == "wind_tunnel":
        if ship_like:
            lim, src = IMO_TUNNEL_BLOCKAGE, "IMO MSC.1/Circ.1200 (2006) §3.2.1"
        else:
            lim, src = BARLOW_TUNNEL_BLOCKAGE, "Barlow, Rae & Pope (1999), from memory"
        out.append(Limit(f"tunnel blockage {area_key.replace('_', ' ')}/test section", area /
                         fac.cross_section, lim, "max", "", src, "blockage limit",
                         "use a smaller model"))
    span = _dim(case, "span", lam)
    if span is not None:
        out.append(Limit("span over test-section width", span / fac.width, BARLOW_SPAN_RATIO,
                         "max", "", "Barlow, Rae & Pope (1999), from memory",
                         "span limit", "use a smaller model"))
    return out


# --------------------------------------------------------------------------------------------
# Checks at the solution
# --------------------------------------------------------------------------------------------
def _status(ok: bool, soft: bool = True) -> str:
    return "ok" if ok else ("warning" if soft else "fail")


def _check(name, value, limit, unit, kind, source, advice="", soft=True) -> Check:
    ok = value <= limit if kind == "max" else value >= limit
    return Check(name, float(value), float(limit), unit, kind, _status(bool(ok), soft), source,
                 "" if ok else advice)


def facility_checks(prob, c) -> tuple[Check, ...]:
    """All checks of the chosen model (candidates ``c`` of size 1): hard limits, then regime.

    Parameters
    ----------
    prob : similitude.planning.solver.Problem
    c : similitude.planning.solver.Candidates
        The solution as a single candidate.

    Returns
    -------
    tuple of Check
    """
    from similitude.correlations import friction
    from similitude.planning.solver import model_groups

    case = prob.case
    fac, proto = case.facility, case.prototype
    checks = [lim.check(0) for lim in hard_limits(prob, c)]
    lam = float(c.scale[0])
    lm = proto.length / lam
    vp = np.asarray(proto.speeds, dtype=float)
    vr = float(c.velocity_ratio[0])
    lo = model_groups(prob, c, prob.lowest, ("reynolds", "mach"))
    re_lo = float(lo["reynolds"][0])
    if proto.kind == "propeller":
        checks.append(_check(
            "propeller Reynolds number Re_0.7R at the lowest speed", re_lo,
            MIN_PROPELLER_REYNOLDS, "", "min",
            "ITTC open-water and cavitation-test practice (from memory, medium confidence)",
            "raise the rotation rate or the model size; blade boundary layers may be laminar"))
    elif fac.kind != "wind_tunnel" or proto.kind in ("surface_ship", "submerged_body"):
        checks.append(_check(
            "model Reynolds number at the lowest speed", re_lo,
            friction.MIN_TURBULENT_MODEL_REYNOLDS, "", "min",
            "common practice (from memory; flat-plate transition band 5e5-5e6, "
            "Schlichting & Gersten 2000)",
            friction.turbulence_stimulation_advice(lm)))
    fixed = case.request.model_fluid
    if fixed is not None:
        # A fixed (test-day) temperature is the case's; outside the facility's stated range
        # it is suspect but not impossible, so it warns.
        t_lo, t_hi = fac.temperature_range
        t = float(np.ravel(c.temperature)[0])
        checks.append(_check("fixed model fluid temperature vs facility minimum", t, t_lo,
                             "K", "min", "facility data",
                             "the facility does not state this temperature; check the case"))
        checks.append(_check("fixed model fluid temperature vs facility maximum", t, t_hi,
                             "K", "max", "facility data",
                             "the facility does not state this temperature; check the case"))
    if fac.pressure_range is not None and c.state.vapour_pressure_si is not None \
            and not fac.free_surface:
        p_ref = float(np.ravel(c.reference_pressure)[0])
        lo_p, hi_p = fac.pressure_range
        checks.append(_check("tunnel static pressure at the model vs facility minimum", p_ref,
                             lo_p, "Pa", "min", "facility data",
                             "the tunnel cannot reach this pressure", soft=False))
        checks.append(_check("tunnel static pressure at the model vs facility maximum", p_ref,
                             hi_p, "Pa", "max", "facility data",
                             "the tunnel cannot reach this pressure", soft=False))
    if fac.kind == "wind_tunnel" and proto.kind in ("surface_ship", "offshore_structure"):
        checks.append(_check("model length (wind-tunnel test of the weather criterion)", lm,
                             IMO_MIN_TUNNEL_MODEL_LENGTH, "m", "min",
                             "IMO MSC.1/Circ.1200 (2006) §3.2.1",
                             "use a larger model for weather-criterion wind tests"))
    if fac.free_surface and c.state.surface_tension_si is not None and \
            proto.kind in ("surface_ship", "offshore_structure"):
        sig = float(np.ravel(c.state.surface_tension_si)[0])
        rho = float(np.ravel(c.state.density_si)[0])
        lam_c = 2 * math.pi * math.sqrt(sig / (rho * G0))
        v_lo = vp[prob.lowest] * vr
        lw = 2 * math.pi * v_lo**2 / G0  # transverse Kelvin wave length at the model speed
        checks.append(_check("capillary share of the model's own waves at the lowest speed "
                             "(lambda_c/lambda_w)^2", (lam_c / lw) ** 2, CAPILLARY_MAX_SHARE,
                             "", "max",
                             "capillary-gravity dispersion (Lamb 1932 §267); 1 % common "
                             "practice",
                             "the model is too small or too slow: surface tension distorts "
                             "its wave pattern; use a larger model"))
    hi = model_groups(prob, c, prob.design, ("mach",))
    ma = float(hi["mach"][0])
    if np.isfinite(ma) and "mach" not in case.request.exact:
        checks.append(_check("model Mach number at the highest speed", ma,
                             INCOMPRESSIBLE_MACH, "", "max",
                             "incompressible-flow limit (isentropic: 4.6 % density rise at "
                             "Ma 0.3)", "compressibility affects the model; see the Mach "
                             "conflict"))
    if fac.free_surface and fac.acceleration is not None and \
            getattr(fac, "min_steady_time", None) is None:
        v_hi = vp[prob.design] * vr
        steady = float(steady_run_length(fac, lm, v_hi))
        checks.append(_check("steady-run time at the highest speed", steady / v_hi,
                             DEFAULT_STEADY_TIME, "s", "min", "common practice (from memory)",
                             "use a smaller model or accept a shorter steady run"))
    checks.extend(wave_checks(case, lam, c))
    return tuple(checks)


def _full_scale_waves(case):
    """(label, kind, period [s] or None, height [m] or None) of each wave condition at full
    scale; regular waves given by length ratio or steepness are converted by linear
    dispersion at the prototype water depth."""
    from similitude.correlations.waves import wave_length, wave_period

    proto = case.prototype
    out = []
    for i, w in enumerate(case.matrix.waves):
        label = w.name or f"wave {i + 1}"
        if w.kind == "regular":
            period = w.period
            if period is None and w.length_ratio is not None:
                period = float(wave_period(w.length_ratio * proto.length, proto.water_depth))
            height = w.height
            if height is None and w.steepness is not None and period is not None:
                height = w.steepness * float(wave_length(period, proto.water_depth))
        else:
            period, height = w.peak_period, w.significant_height
        out.append((label, w.kind, period, height))
    return out


def wavemaker_limits(case, scale) -> list[Limit]:
    """Wavemaker period range and largest wave height as hard limits over scales ``scale``.

    Froude scaling of the waves: T_m = T_p / sqrt(lambda), H_m = H_p / lambda; an irregular
    sea must reach its largest wave, 1.86 H_s for N = 1000 Rayleigh-distributed heights
    (Longuet-Higgins 1952) [6]_. The limits are the facility's data.
    """
    fac = case.facility
    out: list[Limit] = []
    if not fac.free_surface or not case.matrix.waves:
        return out
    lam = np.asarray(scale, dtype=float)
    for label, kind, period, height in _full_scale_waves(case):
        if period is not None and fac.wavemaker_period_range is not None:
            tm = period / np.sqrt(lam)
            lo, hi = fac.wavemaker_period_range
            out.append(Limit(f"{label}: model period vs wavemaker minimum", tm, lo, "min", "s",
                             "facility data", "wavemaker's shortest period",
                             "the wavemaker cannot make it; use a larger model"))
            out.append(Limit(f"{label}: model period vs wavemaker maximum", tm, hi, "max", "s",
                             "facility data", "wavemaker's longest period",
                             "the wavemaker cannot make it; use a smaller model"))
        if fac.wavemaker_max_height is not None and height is not None:
            factor = 1.0 if kind == "regular" else MAX_OVER_SIGNIFICANT_HEIGHT
            what = "model wave height" if kind == "regular" else \
                "largest model wave 1.86 H_s (Longuet-Higgins 1952, N = 1000)"
            out.append(Limit(f"{label}: {what}", height * factor / lam,
                             fac.wavemaker_max_height, "max", "m", "facility data",
                             "wavemaker's highest wave",
                             "the wavemaker cannot make it; use a smaller model"))
    return out


def wave_checks(case, scale: float, c=None) -> list[Check]:
    """Capillary checks of the model waves of ``case.matrix.waves`` (the wavemaker's range
    is a hard limit, :func:`wavemaker_limits`).

    Model period T_m = T_p / sqrt(lambda) (Froude scaling). Capillary length
    lambda_c = 2 pi sqrt(sigma/(rho g)) (Lamb 1932 §267); share of the restoring force
    (lambda_c/lambda_w)^2 (deep water).
    """
    from similitude.correlations.waves import wave_length

    fac = case.facility
    out: list[Check] = []
    if not fac.free_surface or not case.matrix.waves:
        return out
    sigma, rho = 0.0728, 998.0  # water at 20 degC when the state has no surface tension
    if c is not None and c.state.surface_tension_si is not None:
        sigma = float(np.ravel(c.state.surface_tension_si)[0])
        rho = float(np.ravel(c.state.density_si)[0])
    lam_c = 2 * math.pi * math.sqrt(sigma / (rho * G0))
    for label, _, period, _ in _full_scale_waves(case):
        if period is None:
            continue
        tm = period / math.sqrt(scale)
        out.append(_check(f"{label}: model wave period", tm, CAPILLARY_MIN_PERIOD, "s", "min",
                          "Hughes (1993) after Le Méhauté (1976), from memory",
                          "surface tension distorts these waves; use a larger scale model"))
        lw = float(wave_length(tm, fac.depth))
        out.append(_check(f"{label}: capillary share (lambda_c/lambda_w)^2", (lam_c / lw) ** 2,
                          CAPILLARY_MAX_SHARE, "", "max",
                          "capillary-gravity dispersion (Lamb 1932 §267); 1 % common practice",
                          "waves too short: capillarity adds to gravity restoring"))
    return out


__all__ = [
    "BARLOW_SPAN_RATIO",
    "BARLOW_TUNNEL_BLOCKAGE",
    "CAPILLARY_MAX_SHARE",
    "CAPILLARY_MIN_PERIOD",
    "DEEP_WATER_DEPTH_FROUDE",
    "IMO_MIN_TUNNEL_MODEL_LENGTH",
    "IMO_TUNNEL_BLOCKAGE",
    "INCOMPRESSIBLE_MACH",
    "KELVIN_WIDTH_RATIO",
    "TANK_BLOCKAGE_LIMIT",
    "Limit",
    "facility_checks",
    "hard_limits",
    "midship_area",
    "steady_run_length",
    "wave_checks",
    "wavemaker_limits",
]

"""Checks of the chosen model: does it fit the facility, and is its flow regime acceptable?

:func:`facility_checks` reports, for the model the solver chose, every hard limit of
:mod:`similitude.planning.limits` (status ``"ok"`` or ``"fail"``) followed by the regime checks
(status ``"ok"`` or ``"warning"``): minimum model Reynolds number for turbulent flow (with the
turbulence-stimulation advice), propeller blade Reynolds number, a fixed test-day temperature
against the facility's range, the tunnel pressure range, the model length of wind-tunnel tests
of the weather criterion, capillary limits on the model's own waves and on the model waves of
the run matrix (:func:`wave_checks`), Mach number against the incompressible limit, steady-run
time against a common-practice minimum.

Each check carries its value, limit, margin and source. Where no published number was found
the source says "common practice"; values recalled from memory say so in the comments here,
not in the documents a client reads.

References
----------
.. [1] IMO MSC.1/Circ.1200, "Interim guidelines for alternative assessment of the weather
       criterion", 2006, §3.2.1 (wind-tunnel model: overall length at least 1.25 m).
.. [2] Hughes, S. A., "Physical Models and Laboratory Techniques in Coastal Engineering",
       World Scientific, 1993, after Le Méhauté, B., "An Introduction to Hydrodynamics and
       Water Waves", Springer, 1976 (surface tension negligible for T > 0.35 s and depth
       > 2 cm); from memory, medium confidence.
.. [3] Schlichting, H. and Gersten, K., "Boundary-Layer Theory", 8th ed., Springer, 2000
       (flat-plate transition band about 5e5 to 5e6).
.. [4] Lamb, H., "Hydrodynamics", 6th ed., Cambridge, 1932, §267 (capillary-gravity waves:
       phase speed minimum at lambda_w = 2 pi sqrt(sigma/(rho g)), 1.71 cm for water).
.. [6] US Army Corps of Engineers, Coastal Engineering Manual, EM 1110-2-1100, Part II, 2002,
       Table II-5-1 (wave classification after Ippen 1966: deep water from h/L = 1/2).
.. [7] Dean, R. G. and Dalrymple, R. A., "Water Wave Mechanics for Engineers and
       Scientists", World Scientific, 1991, ch. 3 (linear dispersion relation).
.. [5] Schuster, S., "Beitrag zur Frage der Kanalkorrektur bei Modellversuchen",
       Schiffstechnik 3 (1955/56) 93-96; listed in ITTC 7.5-02-02-01 §3.6.3.
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np

from similitude.constants import G0
from similitude.correlations import blockage, friction
from similitude.correlations.waves import DEEP_WATER_RELATIVE_DEPTH, wave_length
from similitude.planning.candidates import (
    Candidates,
    Problem,
    model_groups,
    model_state,
    pressure_labels,
    pressure_set_by_facility,
)
from similitude.planning.findings import AT_LIMIT_MARGIN, Check, judge
from similitude.planning.limits import (
    full_scale_waves,
    hard_limits,
    midship_area,
    missing_limits,
    steady_run_length,
)

#: Mach number below which compressibility is usually neglected [-]: at Ma = 0.3 the
#: stagnation density rise is 4.6 % and the Prandtl-Glauert factor 1.048 (isentropic flow).
INCOMPRESSIBLE_MACH = 0.3

#: Shortest model wave period free of surface-tension effects [s] [2].
CAPILLARY_MIN_PERIOD = 0.35

#: Largest capillary share (lambda_c/lambda_w)^2 of the restoring force accepted [-]
#: (common practice), lambda_c = 2 pi sqrt(sigma/(rho g)) [4].
CAPILLARY_MAX_SHARE = 0.01

#: Minimum steady-run time at constant speed for a resistance measurement [s] when the
#: facility does not state one (common practice, from memory).
DEFAULT_STEADY_TIME = 10.0

#: Smallest model overall length for wind-tunnel tests of the weather criterion [m] [1].
IMO_MIN_TUNNEL_MODEL_LENGTH = 1.25

#: Minimum propeller blade Reynolds number Re_0.7R in open-water and cavitation tests [-]
#: (ITTC practice, from memory, medium confidence; no retrieved number).
MIN_PROPELLER_REYNOLDS = 2.0e5


def _check(name, value, limit, unit, kind, source, advice="", soft=True,
           band=AT_LIMIT_MARGIN) -> Check:
    """A check with its status by :func:`similitude.planning.findings.judge`; the advice is
    kept only when the limit is exceeded."""
    status = judge(float(value), float(limit), kind, soft, band)
    return Check(name, float(value), float(limit), unit, kind, status, source,
                 advice if status in ("warning", "fail") else "")


def facility_checks(prob: Problem, c: Candidates) -> tuple[Check, ...]:
    """All checks of the chosen model (candidates ``c`` of size 1): hard limits, then regime.

    Parameters
    ----------
    prob : Problem
    c : Candidates
        The solution as a single candidate.

    Returns
    -------
    tuple of Check
    """
    scale = float(c.scale[0])
    return tuple([
        *(_limit_check(prob, c, lim) for lim in hard_limits(prob, c)),
        *(Check.not_checked(name, needs, source) for name, needs, source
          in missing_limits(prob.case)),
        *_reynolds_checks(prob, c),
        *_fixed_temperature_checks(prob, c),
        *_pressure_checks(prob, c),
        *_weather_criterion_checks(prob, c),
        *_own_wave_checks(prob, c),
        *_mach_checks(prob, c),
        *_steady_time_checks(prob, c),
        *wave_checks(prob.case, scale, c),
    ])


def _limit_check(prob: Problem, c: Candidates, lim) -> Check:
    """A limit at the chosen model as a check; a soft limit a fixed model exceeds carries the
    correction to apply in its advice."""
    check = lim.check(0)
    if check.status != "warning":
        return check
    fix = _correction_advice(prob, c, check.name)
    return replace(check, advice=fix) if fix else check


def _correction_advice(prob: Problem, c: Candidates, name: str) -> str:
    """The correction for a soft limit a fixed model exceeds, with its size where it has one:
    Schuster's speed correction for tank blockage [5]_."""
    case = prob.case
    fac = case.facility
    if name.startswith("blockage ratio"):
        ax, _ = midship_area(case, float(c.scale[0]))
        m = float(ax / fac.cross_section)
        v = _model_speed(prob, c, prob.design)
        fh = v / math.sqrt(G0 * fac.depth)
        if m + fh**2 >= 1:
            return ("the flow chokes between model and tank (m + Fh^2 >= 1): this model "
                    "cannot be tested at this speed in this tank")
        dv = float(blockage.tank_speed_correction(m, fh, method="schuster"))
        return (f"existing model over the usual limit: correct the measured speed for "
                f"blockage by Schuster's method, dV/V = {dv * 100:.3g} % at the highest speed "
                f"(m = {m:.4g}, Fh = {fh:.3g}; ITTC 7.5-02-02-01 §3.6.3), and report the "
                "correction with the results")
    if name.startswith("tunnel blockage"):
        return ("existing model over the usual limit: apply solid- and wake-blockage "
                "corrections to the measured speed and coefficients (Barlow, Rae & Pope 1999; "
                "Maskell 1963 for bluff bodies)")
    return ("existing model over this rule of thumb: the planner reports it instead of "
            "refusing; weigh the effect named in the check's source")


def _model_length(prob: Problem, c: Candidates) -> float:
    return prob.case.prototype.length / float(c.scale[0])


def _model_speed(prob: Problem, c: Candidates, speed_index: int) -> float:
    vp = np.asarray(prob.case.prototype.speeds, dtype=float)
    return vp[speed_index] * float(c.velocity_ratio[0])


def least_favourable_temperature(prob: Problem, c: Candidates):
    """The facility temperature with the highest kinematic viscosity of the model fluid at
    the chosen pressure [K], and that viscosity [m^2/s]; None when the temperature is not
    free (fixed by the case, or a facility with one temperature).

    A tank's water is at whatever temperature it has on the day, so the Reynolds-dependent
    checks hold at this end of the facility's range, not only at the planned temperature
    (cold water for a liquid, warm air for a gas)."""
    opt = next((o for o in prob.options if o.name == c.fluid), None)
    if opt is None or not opt.axes["T"].free:
        return None
    ax = opt.axes["T"]
    p = float(np.ravel(c.pressure)[0])
    ends = [(float(model_state(opt.info, t, p, opt.spec).kinematic_viscosity_si), t)
            for t in (ax.low, ax.high)]
    nu, t = max(ends)
    return t, nu


def _reynolds_checks(prob: Problem, c: Candidates) -> list[Check]:
    """Model (or propeller blade) Reynolds number at the lowest speed against turbulent flow,
    at the least favourable temperature of the facility's range when the temperature is
    free (:func:`least_favourable_temperature`)."""
    fac, proto = prob.case.facility, prob.case.prototype
    re_lo = float(model_groups(prob, c, prob.lowest, ("reynolds",))["reynolds"][0])
    where = ""
    worst = least_favourable_temperature(prob, c)
    if worst is not None:
        t, nu = worst
        nu_plan = float(np.ravel(c.state.kinematic_viscosity_si)[0])
        if nu > nu_plan * (1 + 1e-9):  # the planned temperature is not already the worst
            re_lo *= nu_plan / nu
            where = (f" (at {t - 273.15:.1f} degC, the least favourable facility "
                     "temperature)")
    if proto.kind == "propeller":
        return [_check(
            f"propeller Reynolds number Re_0.7R at the lowest speed{where}", re_lo,
            MIN_PROPELLER_REYNOLDS, "", "min",
            # 2e5: ITTC open-water practice, from memory (medium confidence); not retrieved
            "common practice",
            "raise the rotation rate or the model size; blade boundary layers may be laminar")]
    if fac.kind != "wind_tunnel" or proto.kind in ("surface_ship", "submerged_body"):
        return [_check(
            f"model Reynolds number at the lowest speed{where}", re_lo,
            friction.MIN_TURBULENT_MODEL_REYNOLDS, "", "min",
            # 2e6: from memory (low confidence); the flat-plate transition band 5e5-5e6
            # (Schlichting & Gersten 2000) is from memory too
            "common practice",
            friction.turbulence_stimulation_advice(_model_length(prob, c)))]
    return []


def _fixed_temperature_checks(prob: Problem, c: Candidates) -> list[Check]:
    """A fixed (test-day) temperature against the facility's stated range.

    The temperature is the case's; outside the facility's stated range it is suspect but not
    impossible, so it warns."""
    if prob.case.request.model_fluid is None:
        return []
    t_lo, t_hi = prob.case.facility.temperature_range
    t = float(np.ravel(c.temperature)[0])
    advice = "the facility does not state this temperature; check the case"
    return [
        # a relative margin of an absolute temperature means little: only equality is at limit
        _check("fixed model fluid temperature vs facility minimum", t, t_lo, "K", "min",
               "facility data", advice, band=0.0),
        _check("fixed model fluid temperature vs facility maximum", t, t_hi, "K", "max",
               "facility data", advice, band=0.0),
    ]


def _pressure_checks(prob: Problem, c: Candidates) -> list[Check]:
    """The pressure the facility is set to against its range, wherever the plan sets one:
    the static pressure at the model in a tunnel (pressurised or depressurised, liquid or
    gas), the air pressure above the water in a depressurised tank or basin."""
    fac = prob.case.facility
    if fac.pressure_range is None or not pressure_set_by_facility(prob):
        return []
    p = float(np.ravel(c.pressure)[0])
    lo_p, hi_p = fac.pressure_range
    what, _ = pressure_labels(prob.case, c.state.vapour_pressure_si is None)
    advice = "the facility cannot reach this pressure"
    return [
        _check(f"{what} vs facility minimum", p, lo_p, "Pa", "min", "facility data", advice,
               soft=False),
        _check(f"{what} vs facility maximum", p, hi_p, "Pa", "max", "facility data", advice,
               soft=False),
    ]


def _weather_criterion_checks(prob: Problem, c: Candidates) -> list[Check]:
    """Smallest model of a wind-tunnel test of a ship's weather criterion [1]_."""
    if prob.case.facility.kind != "wind_tunnel" or prob.case.prototype.kind not in (
            "surface_ship", "offshore_structure"):
        return []
    return [_check("model length (wind-tunnel test of the weather criterion)",
                   _model_length(prob, c), IMO_MIN_TUNNEL_MODEL_LENGTH, "m", "min",
                   "IMO MSC.1/Circ.1200 (2006) Annex §3.2.1",
                   "use a larger model for weather-criterion wind tests")]


def _own_wave_checks(prob: Problem, c: Candidates) -> list[Check]:
    """Capillary share of the model's own (transverse Kelvin) waves at the lowest speed [4]_."""
    if not (prob.case.facility.free_surface and c.state.surface_tension_si is not None
            and prob.case.prototype.kind in ("surface_ship", "offshore_structure")):
        return []
    sig = float(np.ravel(c.state.surface_tension_si)[0])
    rho = float(np.ravel(c.state.density_si)[0])
    lam_c = 2 * math.pi * math.sqrt(sig / (rho * G0))
    v_lo = _model_speed(prob, c, prob.lowest)
    lw = 2 * math.pi * v_lo**2 / G0  # transverse Kelvin wave length at the model speed
    return [_check("capillary share of the model's own waves at the lowest speed "
                   "(lambda_c/lambda_w)^2", (lam_c / lw) ** 2, CAPILLARY_MAX_SHARE, "", "max",
                   "capillary-gravity dispersion omega^2 = g k + sigma k^3/rho (derived); "
                   "1 % common practice",
                   "the model is too small or too slow: surface tension distorts its wave "
                   "pattern; use a larger model")]


def _mach_checks(prob: Problem, c: Candidates) -> list[Check]:
    """Model Mach number at the highest speed against the incompressible limit."""
    ma = float(model_groups(prob, c, prob.design, ("mach",))["mach"][0])
    if not np.isfinite(ma) or "mach" in prob.case.request.exact:
        return []
    return [_check("model Mach number at the highest speed", ma, INCOMPRESSIBLE_MACH, "",
                   "max", "common practice (incompressible-flow limit; isentropic flow: 4.6 % "
                   "density rise at Ma 0.3, derived)",
                   "compressibility affects the model; see the Mach conflict")]


def _steady_time_checks(prob: Problem, c: Candidates) -> list[Check]:
    """Steady-run time at the highest speed, when the facility states no minimum (which
    would make the steady-run length a hard limit)."""
    fac = prob.case.facility
    if not (fac.free_surface and fac.acceleration is not None and fac.min_steady_time is None):
        return []
    v_hi = _model_speed(prob, c, prob.design)
    steady = float(steady_run_length(fac, _model_length(prob, c), v_hi))
    return [_check("steady-run time at the highest speed", steady / v_hi, DEFAULT_STEADY_TIME,
                   "s", "min", "common practice",  # 10 s: from memory
                   "use a smaller model or accept a shorter steady run")]


def wave_checks(case, scale: float, c: Candidates | None = None) -> list[Check]:
    """Capillary checks of the model waves of ``case.matrix.waves`` (the wavemaker's range
    is a hard limit, :func:`similitude.planning.limits.wavemaker_limits`).

    Model period T_m = T_p / sqrt(lambda) (Froude scaling). Capillary length
    lambda_c = 2 pi sqrt(sigma/(rho g)) (Lamb 1932 §267) [4]_; share of the restoring force
    (lambda_c/lambda_w)^2 (deep water).
    """
    fac = case.facility
    out: list[Check] = []
    if not fac.free_surface or not case.matrix.waves:
        return out
    sigma, rho = 0.0728, 998.0  # water at 20 degC when the state has no surface tension
    if c is not None and c.state.surface_tension_si is not None:
        sigma = float(np.ravel(c.state.surface_tension_si)[0])
        rho = float(np.ravel(c.state.density_si)[0])
    lam_c = 2 * math.pi * math.sqrt(sigma / (rho * G0))
    for label, _, period, _ in full_scale_waves(case):
        if period is None:
            continue
        tm = period / math.sqrt(scale)
        out.append(_check(f"{label}: model wave period", tm, CAPILLARY_MIN_PERIOD, "s", "min",
                          # 0.35 s: Hughes (1993) after Le Méhauté (1976), from memory
                          "common practice",
                          "surface tension distorts these waves; use a larger scale model"))
        lw = float(wave_length(tm, fac.depth))
        out.append(_check(f"{label}: capillary share (lambda_c/lambda_w)^2", (lam_c / lw) ** 2,
                          CAPILLARY_MAX_SHARE, "", "max",
                          "capillary-gravity dispersion omega^2 = g k + sigma k^3/rho (derived); "
                   "1 % common practice",
                          "waves too short: capillarity adds to gravity restoring"))
    out.extend(basin_depth_checks(case, scale))
    return out


def basin_depth_checks(case, scale: float) -> list[Check]:
    """Water depth of the basin against the model wave length of each wave condition.

    A deep-water prototype sea (no site depth, or h_p/L_p >= 1/2) needs deep-water model waves:
    h/L >= 1/2 in the basin, L the model wave length there at the Froude-scaled period (the
    peak period of an irregular sea) by linear dispersion, omega^2 = g k tanh(k h) [6]_ [7]_.
    Below it the model waves are shorter and steeper than the Froude-scaled deep-water waves
    L_0 = g T_m^2 / (2 pi); the advice gives both changes. A finite-depth prototype sea gets
    an info row with the basin depth that scales its site depth (h_p / lambda).
    """
    fac, proto = case.facility, case.prototype
    out: list[Check] = []
    if not fac.free_surface:
        return out
    for label, _, period, height in full_scale_waves(case):
        if period is None:
            continue
        tm = period / math.sqrt(scale)
        site = proto.water_depth
        if site is not None and site / float(wave_length(period, site)) < \
                DEEP_WATER_RELATIVE_DEPTH:
            hb = site / scale
            out.append(Check.info(
                f"{label}: basin depth for the site depth h_p/lambda", hb, "m",
                "Froude scaling of the site depth (finite-depth sea, h/L below 1/2: USACE "
                "EM 1110-2-1100 (2002) Part II, Table II-5-1)",
                f"the prototype sea is in finite depth: set the basin water depth to "
                f"{hb:.3g} m (now {fac.depth:g} m) so the waves scale"))
            continue
        l0 = G0 * tm**2 / (2 * math.pi)
        lb = float(wave_length(tm, fac.depth))
        rel = fac.depth / lb
        status = judge(rel, DEEP_WATER_RELATIVE_DEPTH, "min", soft=True)
        advice = (f"at the basin depth {fac.depth:g} m the model waves of period {tm:.3g} s "
                  f"are {lb:.4g} m long against the Froude-scaled deep-water {l0:.4g} m "
                  f"({(1 - lb / l0) * 100:.2g} % shorter) and {(l0 / lb - 1) * 100:.2g} % "
                  "steeper (linear dispersion)")
        if height is not None:
            hm = height / scale
            advice += f", H/L {hm / lb:.3g} against {hm / l0:.3g}"
        if status == "warning":
            advice += ("; use a deeper basin or a smaller model, or accept finite-depth "
                       "model waves")
        out.append(Check(f"{label}: basin depth over model wave length h/L (deep water)", rel,
                         DEEP_WATER_RELATIVE_DEPTH, "", "min", status,
                         "deep water from h/L = 1/2: USACE Coastal Engineering Manual "
                         "EM 1110-2-1100 (2002) Part II, Table II-5-1 (after Ippen 1966); "
                         "wave lengths by linear dispersion (Dean & Dalrymple 1991)", advice))
    return out


__all__ = [
    "CAPILLARY_MAX_SHARE",
    "CAPILLARY_MIN_PERIOD",
    "DEFAULT_STEADY_TIME",
    "IMO_MIN_TUNNEL_MODEL_LENGTH",
    "INCOMPRESSIBLE_MACH",
    "MIN_PROPELLER_REYNOLDS",
    "basin_depth_checks",
    "facility_checks",
    "least_favourable_temperature",
    "wave_checks",
]

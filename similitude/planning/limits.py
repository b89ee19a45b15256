"""Hard limits of a facility: the bounds the solver searches within.

Each :class:`Limit` is evaluated over arrays of candidate models and bounds the admissible ones
in the solver (:mod:`similitude.planning.solver`); at the chosen model it appears in the plan
as a check with status ``"ok"`` or ``"fail"`` (:mod:`similitude.planning.checks` adds the regime
checks). The limits (:func:`hard_limits`): carriage, fan or flow speed range, model size limits
of the facility, tank width against the Kelvin wedge, blockage ratio, depth Froude number and
tank depth against draught (deep-water prototypes), tunnel blockage and span, propeller size in
a tunnel, dynamometer rotation rate, steady-run length when the facility states a minimum
steady time, and the wavemaker's period range and largest wave for the wave conditions of the
run matrix (:func:`wavemaker_limits`).

Each limit carries its value, limit and source. Where no published number was found the
source says "common practice"; values recalled from memory say so in the comments here, not
in the documents a client reads.

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
       section area).
.. [4] Barlow, J. B., Rae, W. H. and Pope, A., "Low-Speed Wind Tunnel Testing", 3rd ed.,
       Wiley, 1999 (frontal area up to about 7.5 % of the test section, span up to 0.8 of its
       width); from memory, medium confidence.
.. [5] Longuet-Higgins, M. S., "On the statistical distribution of the heights of sea waves",
       J. Marine Research 11 (1952) 245-266 (Rayleigh heights: the most probable largest of N
       waves is H_s sqrt(ln N / 2), 1.86 H_s for N = 1000, 1.92 H_s for N = 1543).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from similitude.constants import G0
from similitude.correlations.waves import (
    convert_period,
    most_probable_highest_wave,
    wave_length,
    wave_period,
)
from similitude.planning.case import dimension_power
from similitude.planning.findings import Check, judge
from similitude.planning.matrix import DEFAULT_SEA_DURATION

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

#: How documents cite the two deep-water criteria: the speed-trial procedure states them for
#: full-scale trials; applying them to a model in a tank is common practice. (The numbers
#: 2.75 and 3 are from memory, high confidence: the procedure's title and scope were
#: retrieved, not its text.)
DEEP_WATER_SOURCE = ("common practice, after the deep-water criterion of the speed-trial "
                     "procedure ITTC 7.5-04-01-01.1 (2017) and ISO 15016:2015:")

#: Wind-tunnel blockage limits [-]: IMO weather-criterion tests [3] (retrieved), general
#: practice [4] (from memory; documents say "common practice").
IMO_TUNNEL_BLOCKAGE = 0.05
BARLOW_TUNNEL_BLOCKAGE = 0.075

#: Largest wing span over test-section width [-] [4] (from memory; documents say "common
#: practice").
BARLOW_SPAN_RATIO = 0.8

#: Largest propeller diameter over the smaller test-section side [-] (common practice, from
#: memory: keeps the wall effect on the propeller small; no source at hand).
PROPELLER_TUNNEL_DIAMETER_RATIO = 0.5



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
    soft : bool
        A limit a correction or a rule of thumb covers (blockage, wall reflections, the
        deep-water criteria, wall effects in a tunnel): it bounds the search while the scale
        is free, but a model whose scale is fixed (an existing model, a chosen scale) that
        exceeds it gets a warning with the correction to apply instead of a refusal
        (:func:`applies_to_search`). A hard limit (speeds, sizes, rotation rate, wavemaker)
        always refuses.
    """

    name: str
    value: object
    limit: object
    kind: str
    unit: str
    source: str
    limit_words: str
    advice: str = ""
    soft: bool = False

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
        if self.kind == "max" and excess >= 2:  # three times the limit or more: say the factor
            return (f"{self.name} {v:.4g}{unit} {where} is {v / lim:.3g} times the "
                    f"{self.limit_words} {lim:.4g}{unit}")
        return (f"{self.name} {v:.4g}{unit} {where} {verb} the {self.limit_words} "
                f"{lim:.4g}{unit} by {abs(excess) * 100:.3g} %")

    def check(self, j: int = 0) -> Check:
        """The limit at candidate ``j`` as a :class:`Check` (status by
        :func:`similitude.planning.findings.judge`: a violated soft limit warns, a hard one
        fails; within 2 % of the limit it is "at limit")."""
        v = float(np.ravel(self.value)[j])
        lim = float(np.ravel(np.broadcast_to(self.limit, np.shape(self.value)))[j]) \
            if np.ndim(self.limit) else float(self.limit)
        status = judge(v, lim, self.kind, soft=self.soft)
        return Check(self.name, v, lim, self.unit, self.kind, status, self.source,
                     self.advice if status in ("warning", "fail") else "")


def scale_is_fixed(case) -> bool:
    """True when the case fixes the scale (``match.scale``) or the model (``model_length``)."""
    return case.request.scale is not None or case.request.model_length is not None


def applies_to_search(lim: Limit, case) -> bool:
    """Whether a limit bounds the solver's search: every hard limit, and the soft ones only
    while the scale is free (a fixed model over a soft limit is warned about, not refused)."""
    return not (lim.soft and scale_is_fixed(case))


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
    prob : similitude.planning.candidates.Problem
    c : similitude.planning.candidates.Candidates

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
    if prob.speed_group == "froude":
        label = "Froude speed"
    elif prob.speed_group:
        label = f"Model speed (set by the {prob.speed_group.replace('_', ' ')} number)"
    else:
        label = "Model speed"
    out.append(Limit(f"{label} at the highest prototype speed", v_hi, fac.speed_range[1],
                     "max", "m/s", "facility data", f"{word} maximum",
                     "use a smaller model or a faster facility"))
    if fac.speed_range[0] > 0:
        out.append(Limit(f"{label} at the lowest prototype speed", v_lo, fac.speed_range[0],
                         "min", "m/s", "facility data", f"{word} minimum",
                         "use a larger model or drop the lowest speed"))
    if fac.max_model_length is not None:
        out.append(Limit("model length vs facility maximum", lm, fac.max_model_length, "max",
                         "m", "facility data", "facility's largest model"))
    if fac.min_model_length is not None:
        out.append(Limit("model length vs facility minimum", lm, fac.min_model_length, "min",
                         "m", "facility data", "facility's smallest model"))
    if proto.rotation_rates and fac.max_rotation_rate is not None:
        n_hi = float(np.max(proto.rotation_rates)) * c.velocity_ratio * lam
        out.append(Limit("model rotation rate", n_hi, fac.max_rotation_rate, "max", "1/s",
                         "facility data", "dynamometer maximum",
                         "use a smaller propeller model or a lower speed"))
    if fac.free_surface:
        if proto.kind != "propeller":
            # A propeller on an open-water boat: the tank-wall and deep-water criteria of a
            # hull do not apply to it.
            out.extend(_free_surface_limits(prob, c, lam, lm, v_hi))
        out.extend(wavemaker_limits(case, lam))
    else:
        out.extend(_tunnel_limits(prob, c, lam, lm))
    if fac.acceleration is not None and fac.min_steady_time is not None:
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


#: Prototype kinds with a hull: tank blockage on the midship area, friction lines, loading.
HULL_KINDS = ("surface_ship", "submerged_body", "offshore_structure")


def _free_surface_limits(prob, c, lam, lm, v_hi) -> list[Limit]:
    case = prob.case
    fac, proto = case.facility, case.prototype
    out = [Limit("model length vs tank width (Kelvin wedge)", lm,
                 fac.width / KELVIN_WIDTH_RATIO, "max", "m",
                 "Kelvin wedge 19.47 deg (Kelvin 1887): bow waves reach the tank walls within "
                 "one model length when B_T < 2 L tan 19.47 deg = 0.71 L (derived)",
                 "Kelvin-wedge length B_T/0.71",
                 "use a smaller model so that wall reflections pass astern of it", soft=True)]
    ax, how = midship_area(case, lam)
    if ax is not None and proto.kind in HULL_KINDS:
        m = ax / fac.cross_section
        out.append(Limit("blockage ratio A_X/(B_T h)", m, TANK_BLOCKAGE_LIMIT, "max", "",
                         "common practice (no published limit found; A_X " + how + ")",
                         "usual uncorrected limit",
                         "use a smaller model, or correct for blockage (Schuster; ITTC "
                         "7.5-02-02-01 §3.6.3)", soft=True))
    if proto.water_depth is None and "depth_froude" not in case.request.exact:
        fh = v_hi / math.sqrt(G0 * fac.depth)
        out.append(Limit("depth Froude number V_m/sqrt(g h)", fh, DEEP_WATER_DEPTH_FROUDE,
                         "max", "",
                         DEEP_WATER_SOURCE + " h > 2.75 V^2/g", "deep-water limit",
                         "use a smaller model: the tank bottom would raise resistance and "
                         "sinkage", soft=True))
        b, t = _dim(case, "beam", lam), _dim(case, "draught", lam)
        if b is not None and t is not None:
            need = DEEP_WATER_DRAUGHT_FACTOR * np.sqrt(b * t)
            out.append(Limit("tank depth needed 3 sqrt(B_m T_m)", need, fac.depth, "max", "m",
                             DEEP_WATER_SOURCE + " h > 3 sqrt(B T)", "tank depth",
                             "use a smaller model", soft=True))
    return out


def tunnel_blockage_area(case, scale):
    """Model area for the tunnel blockage ratio [m^2] and how it was found, or (None, "").

    Ship-like models in a wind tunnel use the lateral area when given (IMO weather-criterion
    tests); otherwise the frontal area; a wing without a frontal area uses span x thickness,
    and a wing with a thickness but no span is taken as a 2-D section spanning the test
    section (frontal area thickness x test-section width).
    """
    proto, fac = case.prototype, case.facility
    if proto.kind in ("surface_ship", "offshore_structure") and proto.dimension("lateral_area"):
        return _dim(case, "lateral_area", scale), "lateral area"
    area = _dim(case, "frontal_area", scale)
    if area is not None:
        return area, "frontal area"
    t, span = _dim(case, "thickness", scale), _dim(case, "span", scale)
    if proto.kind == "wing" and t is not None:
        if span is not None:
            return t * span, "frontal area estimated as span x thickness"
        return t * fac.width, "2-D section: thickness x test-section width"
    return None, ""


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
                         "common practice",
                         f"{PROPELLER_TUNNEL_DIAMETER_RATIO:g} x smaller test-section side",
                         "use a smaller propeller model", soft=True))
        return out
    ship_like = proto.kind in ("surface_ship", "offshore_structure")
    area, how = tunnel_blockage_area(case, lam)
    if area is not None:
        if ship_like and fac.kind == "wind_tunnel":
            lim, src = IMO_TUNNEL_BLOCKAGE, "IMO MSC.1/Circ.1200 (2006) Annex §3.2.1"
        else:
            lim, src = BARLOW_TUNNEL_BLOCKAGE, "common practice"
        out.append(Limit(f"tunnel blockage ({how})/test section", area / fac.cross_section,
                         lim, "max", "", src, "blockage limit",
                         "use a smaller model, or correct for blockage (solid and wake "
                         "blockage)", soft=True))
    span = _dim(case, "span", lam)
    if span is not None:
        out.append(Limit("span over test-section width", span / fac.width, BARLOW_SPAN_RATIO,
                         "max", "", "common practice",
                         "span limit", "use a smaller model", soft=True))
    return out


def missing_limits(case) -> list[tuple[str, str, str]]:
    """The limits of :func:`hard_limits` that apply to the case but lack an input: (name,
    input that would enable it, source), for the plan's "not checked" rows."""
    fac, proto, spec = case.facility, case.prototype, case.matrix
    has = proto.dimensions.__contains__
    out = []
    if fac.free_surface and proto.kind in HULL_KINDS and not (
            has("midship_area") or (has("beam") and has("draught"))):
        out.append(("blockage ratio A_X/(B_T h)", "give prototype.sizes.midship_area, or "
                    "beam and draught", "common practice"))
    if fac.free_surface and proto.kind in HULL_KINDS and proto.water_depth is None \
            and not (has("beam") and has("draught")):
        out.append(("tank depth needed 3 sqrt(B_m T_m)", "give prototype.sizes.beam and "
                    "draught", "ITTC 7.5-04-01-01.1 (2017) / ISO 15016:2015"))
    if not fac.free_surface and proto.kind != "propeller" and \
            tunnel_blockage_area(case, 1.0)[0] is None:
        needs = "give prototype.sizes.frontal_area" + (
            " (or lateral_area)" if proto.kind in ("surface_ship", "offshore_structure") else
            ", or span and thickness (thickness alone for a 2-D section spanning the test "
            "section)" if proto.kind == "wing" else "")
        out.append(("tunnel blockage/test section", needs, "facility data"))
    if proto.rotation_rates and fac.max_rotation_rate is None:
        out.append(("model rotation rate", "give facility.fastest_rotation (the dynamometer's "
                    "maximum rotation rate)", "facility data"))
    if fac.free_surface and spec.waves:
        if fac.wavemaker_period_range is None:
            out.append(("model wave periods vs wavemaker range", "give facility.wave_periods "
                        "(the wavemaker's shortest and longest period)", "facility data"))
        if fac.wavemaker_max_height is None:
            out.append(("model wave heights vs wavemaker's highest wave", "give "
                        "facility.highest_wave", "facility data"))
    if fac.free_surface and fac.acceleration is None:
        out.append(("steady-run time at the highest speed", "give facility.acceleration (and "
                    "braking)", "common practice"))
    return out


def full_scale_waves(case):
    """(label, kind, period [s] or None, height [m] or None) of each wave condition at full
    scale; regular waves given by length ratio or steepness are converted by linear
    dispersion at the prototype water depth."""
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


def sea_wave_count(wave) -> tuple[float, float, float]:
    """(N, duration [s], T_z [s]) of an irregular sea: N = D / T_z waves in its full-scale
    duration D (the case's, or the 3 h default of the run matrix), T_z from its spectrum."""
    duration = DEFAULT_SEA_DURATION if wave.duration is None else float(wave.duration)
    gamma = wave.gamma if wave.spectrum == "jonswap" else 3.3
    tz = float(convert_period(wave.peak_period, "peak", "zero_crossing", wave.spectrum, gamma))
    return duration / tz, duration, tz


def highest_wave_words(wave) -> tuple[float, str]:
    """(H_max/H_s [-], the method in words) of an irregular sea: the most probable highest of
    its N = D/T_z Rayleigh-distributed waves [5]_."""
    n, duration, tz = sea_wave_count(wave)
    factor = float(most_probable_highest_wave(1.0, max(n, 1.0 + 1e-9)))
    return factor, (f"most probable highest of N = D/T_z = {duration:.6g} s / {tz:.4g} s = "
                    f"{n:.0f} Rayleigh-distributed waves (full-scale duration and "
                    f"zero-crossing period of the {wave.spectrum} spectrum): H_max = H_s "
                    f"sqrt(ln N / 2) = {factor:.3f} H_s (Longuet-Higgins 1952)")


def wavemaker_limits(case, scale) -> list[Limit]:
    """Wavemaker period range and largest wave height as hard limits over scales ``scale``.

    Froude scaling of the waves: T_m = T_p / sqrt(lambda), H_m = H_p / lambda; an irregular
    sea must reach its most probable highest wave over the requested duration,
    H_s sqrt(ln N / 2) with N = D / T_z (Longuet-Higgins 1952) [5]_, 1.92 H_s for a 3 h
    JONSWAP sea of T_p = 9 s. The limits are the facility's data.
    """
    fac = case.facility
    out: list[Limit] = []
    if not fac.free_surface or not case.matrix.waves:
        return out
    lam = np.asarray(scale, dtype=float)
    for (label, kind, period, height), wave in zip(full_scale_waves(case), case.matrix.waves,
                                                    strict=True):
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
            if kind == "regular":
                factor, what, how = 1.0, "model wave height", "facility data"
            else:
                factor, method = highest_wave_words(wave)
                what = "most probable highest model wave"
                how = f"facility data; {method}"
            out.append(Limit(f"{label}: {what}", height * factor / lam,
                             fac.wavemaker_max_height, "max", "m", how,
                             "wavemaker's highest wave",
                             "the wavemaker cannot make it; use a smaller model"))
    return out


__all__ = [
    "BARLOW_SPAN_RATIO",
    "BARLOW_TUNNEL_BLOCKAGE",
    "DEEP_WATER_DEPTH_FROUDE",
    "DEEP_WATER_DRAUGHT_FACTOR",
    "IMO_TUNNEL_BLOCKAGE",
    "KELVIN_HALF_ANGLE",
    "KELVIN_WIDTH_RATIO",
    "PROPELLER_TUNNEL_DIAMETER_RATIO",
    "TANK_BLOCKAGE_LIMIT",
    "Limit",
    "HULL_KINDS",
    "applies_to_search",
    "full_scale_waves",
    "highest_wave_words",
    "sea_wave_count",
    "hard_limits",
    "missing_limits",
    "scale_is_fixed",
    "tunnel_blockage_area",
    "midship_area",
    "steady_run_length",
    "wavemaker_limits",
]

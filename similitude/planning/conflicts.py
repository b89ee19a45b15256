"""Conflicts and scale effects: what each unmatched group costs, in the trade's terms.

For every group the model does not match, :func:`find_conflicts` gives its prototype and model
values at the design speed, their ratio and the consequence:

* **Reynolds number**, ship and body tests: frictional resistance coefficients of model and
  full scale by the ITTC-1957 correlation line [1]_ (or another line of
  :data:`similitude.correlations.friction.FRICTION_LINES`), the viscous correction of the 1978 ITTC
  method [2]_, C_TS = C_TM - (1 + k)(C_FM - C_FS), and the error of scaling the model's total
  resistance coefficient unchanged (Froude's law applied to the whole resistance). Before the
  test C_TM is not known, so the error is given as its upper bound, with no residuary
  resistance (C_R = 0): e = (1 + k)(C_FM - C_FS) / ((1 + k) C_FS). Laminar and transitional
  model flow is flagged with the turbulence-stimulation advice. Propellers: the blade-section
  drag of the ITTC-78 propeller scale correction [2]_.
* **Weber number**: capillary effects (spray, ventilation, small waves) exaggerated at model
  scale; capillary length 2 pi sqrt(sigma/(rho g)) [5]_.
* **Mach number**: compressibility, through the Prandtl-Glauert factor 1/sqrt(1 - Ma^2) [3]_.
* **Cavitation number**: inception and extent not reproduced.
* **Froude, depth Froude, advance ratio, Strouhal**: wave making, shallow-water effects,
  propeller loading, shedding frequency.

References
----------
.. [1] ITTC, Proc. 8th ITTC, Madrid, 1957 (ITTC-1957 model-ship correlation line
       C_F = 0.075/(log10 Re - 2)^2); ITTC 7.5-02-02-01 "Resistance Test", Rev 03, 2011.
.. [2] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 04, 2017 (form factor method; propeller blade drag
       C_D = 2 (1 + 2t/c)(0.044 Re_c^-1/6 - 5 Re_c^-2/3) at model scale and
       2 (1 + 2t/c)(1.89 + 1.62 log10(c/k_p))^-2.5 at full scale, k_p = 30e-6 m).
.. [3] Glauert, H., "The effect of compressibility on the lift of an aerofoil", Proc. R. Soc.
       London A 118 (1928) 113-119 (Prandtl-Glauert rule).
.. [4] Schuster, S., Schiffstechnik 3 (1955/56) 93-96; listed in ITTC 7.5-02-02-01 §3.6.3.
.. [5] Lamb, H., "Hydrodynamics", 6th ed., Cambridge, 1932, §267.
"""

from __future__ import annotations

import math

import numpy as np

from similitude.constants import G0
from similitude.correlations import blockage, friction
from similitude.planning.candidates import Candidates, Problem, group_value, model_groups
from similitude.planning.findings import Conflict
from similitude.planning.limits import midship_area

#: Propeller blade roughness of the ITTC-78 scale correction [m] [2].
PROPELLER_ROUGHNESS = 30e-6

#: Relative difference below which a group counts as matched [-].
MATCH_TOLERANCE = 1e-6

SHIP_KINDS = ("surface_ship", "submerged_body", "offshore_structure")


def viscous_scale_effect(re_model: float, re_ship: float, form_factor: float = 0.0,
                         method: str = "ittc1957") -> dict:
    """Frictional coefficients at both scales and the error of naive total-resistance scaling.

    Parameters
    ----------
    re_model, re_ship : float
        Reynolds numbers on the waterline length at model and full scale [-].
    form_factor : float
        k of the 1978 ITTC method [-] (0: the friction line alone).
    method : str
        Friction line, see :func:`similitude.correlations.friction.friction_coefficient`.

    Returns
    -------
    dict
        ``C_F model``, ``C_F ship``, ``(1+k)``, ``viscous correction (1+k)(C_FM - C_FS)``,
        ``naive scaling error bound [%]`` = 100 (C_FM - C_FS)/C_FS (C_R = 0), ``method``.

    Notes
    -----
    C_TS = C_TM - (1 + k)(C_FM - C_FS) (1978 ITTC method [2]_, allowances left out). Taking
    C_TS = C_TM instead overestimates it by (1 + k)(C_FM - C_FS); relative to C_TS with no
    residuary resistance the error is (C_FM - C_FS)/C_FS, its upper bound.
    """
    cfm = float(friction.friction_coefficient(re_model, method=method))
    cfs = float(friction.friction_coefficient(re_ship, method=method))
    one_k = 1.0 + form_factor
    corr = one_k * (cfm - cfs)
    return {
        "method": method,
        "C_F model": cfm,
        "C_F ship": cfs,
        "(1+k)": one_k,
        "viscous correction (1+k)(C_FM - C_FS)": corr,
        "naive scaling error bound [%]": 100.0 * (cfm - cfs) / cfs,
    }


def propeller_blade_drag(re_chord: float, chord: float | None = None,
                         thickness_ratio: float = 0.0,
                         roughness: float = PROPELLER_ROUGHNESS) -> dict:
    """Blade-section drag coefficients of the ITTC-78 propeller scale correction [2]_.

    C_DM = 2 (1 + 2 t/c)(0.044 Re_c^(-1/6) - 5 Re_c^(-2/3)) (model, Re_c on the 0.75R chord);
    C_DS = 2 (1 + 2 t/c)(1.89 + 1.62 log10(c/k_p))^(-2.5) (full scale, chord c [m]).
    """
    f = 2.0 * (1.0 + 2.0 * thickness_ratio)
    out = {"C_D model": f * (0.044 * re_chord ** (-1 / 6) - 5.0 * re_chord ** (-2 / 3))}
    if chord is not None:
        out["C_D ship"] = f * (1.89 + 1.62 * math.log10(chord / roughness)) ** -2.5
    return out


def prandtl_glauert(mach: float) -> float:
    """Prandtl-Glauert factor 1/sqrt(1 - Ma^2) [-] (subsonic, Ma < 1) [3]_."""
    if not 0 <= mach < 1:
        return float("nan")
    return 1.0 / math.sqrt(1.0 - mach * mach)


def _reynolds(case, prob, c, gp, gm, i) -> Conflict:
    req = case.request
    proto = case.prototype
    ratio = gp / gm
    details = {"ratio prototype/model": ratio}
    lam = float(c.scale[0])
    lm = proto.length / lam
    if proto.kind == "propeller":
        chord = proto.dimension("blade_chord")
        pd_ = propeller_blade_drag(gm, None if chord is None else chord)
        pd_s = propeller_blade_drag(gp, chord)
        details["C_D model"] = pd_["C_D model"]
        if "C_D ship" in pd_s:
            details["C_D ship"] = pd_s["C_D ship"]
        text = (f"The blade Reynolds number is {ratio:.3g} times lower in the model "
                f"(Re_0.7R {gm:.3g} against {gp:.3g}): blade friction is higher and the "
                f"boundary layer may be laminar; correct K_T and K_Q by the ITTC-78 propeller "
                f"scale correction (section drag C_D model {pd_['C_D model']:.4g}"
                + (f", full scale {details['C_D ship']:.4g})" if "C_D ship" in details
                   else "; give prototype.dimensions.blade_chord for the full-scale value)"))
        return Conflict("reynolds", gp, gm, text, details)
    if proto.kind not in SHIP_KINDS:
        return _reynolds_body(case, gp, gm, lm, details)
    k = req.form_factor if req.form_factor is not None else 0.0
    method = req.friction_line
    ve = viscous_scale_effect(gm, gp, k, method)
    details.update(ve)
    vp = float(np.asarray(proto.speeds)[i])
    re_lo = float(model_groups(prob, c, prob.lowest, ("reynolds",))["reynolds"][0])
    regime = friction.flow_regime(gm)
    details["model flow regime at this speed"] = regime
    line = {"ittc1957": "ITTC-1957 line", "schoenherr": "Schoenherr line",
            "hughes": "Hughes line", "prandtl_schlichting": "Prandtl-Schlichting line",
            "blasius": "Blasius laminar line"}[method]
    kword = f"(1+k) = {1 + k:.3g}" if k else "k = 0 (no form factor given; measure it by a " \
        "Prohaska fit)"
    text = (f"Reynolds number {ratio:.3g} times lower in the model ({gm:.3g} against {gp:.3g} "
            f"at {vp:.3g} m/s): by the {line} C_F model {ve['C_F model']:.5f} against ship "
            f"{ve['C_F ship']:.5f}; the viscous correction (1+k)(C_FM - C_FS) = "
            f"{ve['viscous correction (1+k)(C_FM - C_FS)']:.5f} with {kword}. Scaling the "
            f"model's total resistance by Froude's law alone would overestimate the ship's "
            f"resistance coefficient by up to {ve['naive scaling error bound [%]']:.0f} % "
            "(no residuary part); extrapolate with the 1978 ITTC method.")
    if regime != "turbulent" or re_lo < friction.MIN_TURBULENT_MODEL_REYNOLDS:
        text += (f" Model flow is {regime} by flat-plate limits: "
                 + friction.turbulence_stimulation_advice(lm))
    return Conflict("reynolds", gp, gm, text, details)


#: Band of the drag crisis of a smooth circular cylinder, Re_D [-]: subcritical below about
#: 2e5, supercritical above about 5e5 (Achenbach 1968, J. Fluid Mech. 34, 625-639; values from
#: memory, medium confidence).
DRAG_CRISIS_BAND = (2.0e5, 5.0e5)


def _reynolds_body(case, gp, gm, lm, details) -> Conflict:
    """Reynolds conflict of a wing, vehicle, building or bluff body (no friction-line
    extrapolation of a hull)."""
    ratio = gp / gm
    cfm = float(friction.friction_coefficient(gm, method="prandtl_schlichting"))
    cfp = float(friction.friction_coefficient(gp, method="prandtl_schlichting"))
    details.update({"C_F model (flat plate)": cfm, "C_F prototype (flat plate)": cfp,
                    "method": "prandtl_schlichting"})
    word = "lower" if ratio > 1 else "higher"
    text = (f"Reynolds number {max(ratio, 1 / ratio):.3g} times {word} in the model ({gm:.3g} "
            f"against {gp:.3g}): skin friction, transition and separation differ; a smooth "
            f"flat plate would have C_F {cfm:.5f} against {cfp:.5f} (Prandtl-Schlichting).")
    lo, hi = DRAG_CRISIS_BAND
    if gm < hi and gp > lo and case.prototype.kind in ("bluff_body", "offshore_structure",
                                                        "vehicle"):
        text += (f" Rounded bodies pass the drag crisis (Re about {lo:.0e}-{hi:.0e}, "
                 "Achenbach 1968) between model and full scale: the model's drag coefficient "
                 "may be far higher; trip the flow or roughen the model.")
    regime = friction.flow_regime(gm)
    details["model flow regime at this speed"] = regime
    if regime != "turbulent":
        text += f" Model boundary layer is {regime} by flat-plate limits; fix transition."
    return Conflict("reynolds", gp, gm, text, details)


def _generic(key, gp, gm, case, c) -> Conflict:
    ratio = gp / gm
    details = {"ratio prototype/model": ratio}
    if key == "weber":
        st = c.state
        rho = float(np.ravel(st.density_si)[0])
        sig = float(np.ravel(st.surface_tension_si)[0])
        lc = 2 * math.pi * math.sqrt(sig / (rho * G0))
        details["capillary length [m]"] = lc
        text = (f"Weber number {ratio:.3g} times lower in the model ({gm:.3g} against "
                f"{gp:.3g}): surface tension is relatively stronger, so spray, ventilation, "
                f"air entrainment and short waves (capillary length {lc * 100:.2g} cm) differ "
                "from full scale.")
    elif key == "mach":
        pgm, pgp = prandtl_glauert(gm), prandtl_glauert(gp)
        details.update({"Prandtl-Glauert factor model": pgm,
                        "Prandtl-Glauert factor prototype": pgp})
        text = (f"Mach number model {gm:.3g} against prototype {gp:.3g}: compressibility "
                f"differs; the Prandtl-Glauert factor 1/sqrt(1-Ma^2) is {pgm:.4f} in the model "
                f"and {pgp:.4f} at full scale, so pressure and lift coefficients differ by "
                f"about {abs(pgp / pgm - 1) * 100:.2g} %.")
    elif key == "cavitation":
        more = "less" if gm > gp else "more"
        which = ("Cavitation number on rotation speed sigma_n = (p - p_v)/(rho n^2 D^2/2)"
                 if case.prototype.kind == "propeller" else
                 "Cavitation number sigma_v = (p - p_v)/(rho V^2/2)")
        text = (f"{which}: model {gm:.3g} against prototype {gp:.3g}: cavitation "
                f"inception and extent are not reproduced (the model cavitates {more} than "
                "the prototype); do not use these runs for cavitation or erosion.")
    elif key == "froude":
        text = (f"Froude number model {gm:.3g} against prototype {gp:.3g}: wave making and "
                "gravity effects (free-surface waves, the hydrostatic pressure gradient) are "
                "not reproduced.")
    elif key == "depth_froude":
        text = (f"Depth Froude number model {gm:.3g} against prototype {gp:.3g}: "
                "shallow-water effects on resistance, sinkage and trim differ; set the tank "
                "water depth to prototype depth / lambda to match them.")
    elif key == "advance_ratio":
        text = (f"Advance ratio model {gm:.3g} against prototype {gp:.3g}: the propeller "
                "loading differs.")
    elif key == "strouhal":
        text = (f"Strouhal number model {gm:.3g} against prototype {gp:.3g}: shedding and "
                "excitation frequencies do not scale.")
    else:
        text = f"{key}: model {gm:.3g} against prototype {gp:.3g}."
    return Conflict(key, gp, gm, text, details)


def find_conflicts(prob: Problem, c: Candidates, keys) -> tuple[Conflict, ...]:
    """Conflicts at the design speed of every group in ``keys`` the model does not match.

    Parameters
    ----------
    prob : Problem
    c : Candidates
        The solution as one candidate.
    keys : iterable of str
        Group keys to examine (exact groups are matched by construction and pass silently).

    Returns
    -------
    tuple of Conflict
    """
    case = prob.case
    i = prob.design
    out = []
    gm_all = model_groups(prob, c, i, tuple(keys))
    for key in keys:
        gp_arr = prob.proto_groups.get(key)
        if gp_arr is None:
            gp_arr = np.asarray(group_value(key, prob.proto, prob.propeller), dtype=float)
        gp = float(np.ravel(gp_arr)[i]) if np.ndim(gp_arr) else float(gp_arr)
        gm = float(np.ravel(gm_all[key])[0])
        if not (np.isfinite(gp) and np.isfinite(gm)) or gm == 0:
            continue
        if abs(gm / gp - 1.0) <= MATCH_TOLERANCE:
            continue
        if key == "reynolds":
            out.append(_reynolds(case, prob, c, gp, gm, i))
        else:
            out.append(_generic(key, gp, gm, case, c))
    return tuple(out)


def blockage_notes(prob: Problem, c: Candidates) -> tuple[str, ...]:
    """Blockage corrections the facility makes necessary, as notes with numbers.

    Towing tank: Schuster's speed correction [4]_ at the design speed with the model's
    blockage ratio and depth Froude number. Closed wind tunnel: solid blockage (Thom/Pope form
    in Barlow, Rae & Pope 1999) from the model volume and frontal area; the wake part needs the
    measured drag coefficient.
    """
    case = prob.case
    fac, proto = case.facility, case.prototype
    lam = float(c.scale[0])
    v = float(np.asarray(proto.speeds)[prob.design]) * float(c.velocity_ratio[0])
    notes = []
    if fac.free_surface and proto.kind in SHIP_KINDS:
        ax, _ = midship_area(case, lam)
        if ax is not None:
            m = float(ax / fac.cross_section)
            fh = v / math.sqrt(G0 * fac.depth)
            if m + fh**2 < 1:
                dv = float(blockage.tank_speed_correction(m, fh, method="schuster"))
                notes.append(
                    f"Blockage: m = A_X/(B_T h) = {m:.4f}, Fh = {fh:.3f} at the highest speed; "
                    f"Schuster's correction dV/V = {dv * 100:.3g} % (ITTC 7.5-02-02-01 "
                    "§3.6.3)" + (" - small, usually left uncorrected." if m <= 0.005 else
                                 " - correct the measured speeds.")
                )
    elif fac.kind == "wind_tunnel" and not fac.open_jet:
        vol = proto.dimension("volume") or proto.dimension("displacement")
        area = proto.dimension("frontal_area")
        if vol is not None and area is not None:
            tb = blockage.wind_tunnel_blockage(vol / lam**3, area / lam**2, fac.cross_section,
                                               0.0)
            notes.append(
                f"Blockage: solid blockage dV/V = {float(tb.solid) * 100:.3g} % (Barlow, Rae & "
                "Pope 1999); add the wake blockage (S/4C) C_Du from the measured drag "
                "coefficient."
            )
    elif fac.kind == "wind_tunnel" and fac.open_jet:
        notes.append("Open-jet tunnel: solid blockage is small and of opposite sign; closed-"
                     "section blockage corrections do not apply (Barlow, Rae & Pope 1999).")
    return tuple(notes)


__all__ = [
    "DRAG_CRISIS_BAND",
    "MATCH_TOLERANCE",
    "PROPELLER_ROUGHNESS",
    "blockage_notes",
    "find_conflicts",
    "prandtl_glauert",
    "propeller_blade_drag",
    "viscous_scale_effect",
]

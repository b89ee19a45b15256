"""Conflicts and scale effects: unmatched groups and what they cost, against published forms.

ITTC-1957 line C_F = 0.075/(log10 Re - 2)^2 (8th ITTC 1957; ITTC 7.5-02-03-01.4); 1978 ITTC
viscous correction (1+k)(C_FM - C_FS); ITTC-78 propeller blade drag; Prandtl-Glauert rule
(Glauert 1928).
"""

from __future__ import annotations

import math

import pytest
from scenarios import ship, tank

from similitude.planning import candidates, conflicts, solver
from similitude.planning.case import Case, FluidSpec, MatchRequest, Prototype
from similitude.planning.facilities import Facility


def conflicts_of(case, keys=("reynolds", "weber", "mach", "cavitation")):
    prob = candidates.build_problem(case)
    sol = solver.solve(case)
    c = candidates.candidate_at(prob, sol)
    return {cf.group: cf for cf in conflicts.find_conflicts(prob, c, keys)}, sol


def test_ittc_1957_values_at_1e7_and_1e9():
    # 0.075/(7-2)^2 = 0.003; 0.075/(9-2)^2 = 0.0015306 (ITTC-1957 line, by the formula).
    d = conflicts.viscous_scale_effect(1e7, 1e9)
    assert d["C_F model"] == pytest.approx(0.003, rel=1e-12)
    assert d["C_F ship"] == pytest.approx(0.075 / 49.0, rel=1e-12)


def test_naive_scaling_error_bound_is_cfm_minus_cfs_over_cfs():
    # (0.003 - 0.0015306)/0.0015306 = 96.0 % with no residuary resistance.
    d = conflicts.viscous_scale_effect(1e7, 1e9)
    assert d["naive scaling error bound [%]"] == pytest.approx(
        100 * (0.003 - 0.075 / 49) / (0.075 / 49), rel=1e-12)
    assert d["naive scaling error bound [%]"] == pytest.approx(96.0, abs=0.05)


def test_form_factor_multiplies_the_viscous_correction():
    # 1978 ITTC: C_TS = C_TM - (1+k)(C_FM - C_FS); k = 0.2 -> 1.2 x 0.0014694 = 0.0017633.
    d = conflicts.viscous_scale_effect(1e7, 1e9, form_factor=0.2)
    assert d["viscous correction (1+k)(C_FM - C_FS)"] == pytest.approx(
        1.2 * (0.003 - 0.075 / 49), rel=1e-12)


def test_schoenherr_line_is_selectable():
    # 1957 ITTC table of Schoenherr values (recomputed exactly): Re 1e7 -> 0.002934.
    d = conflicts.viscous_scale_effect(1e7, 1e9, method="schoenherr")
    assert d["C_F model"] == pytest.approx(0.002934, abs=5e-7)
    assert d["method"] == "schoenherr"


def test_prandtl_glauert_factor_at_mach_0_3():
    # 1/sqrt(1 - 0.09) = 1.0483 (Glauert 1928).
    assert conflicts.prandtl_glauert(0.3) == pytest.approx(1 / math.sqrt(0.91), rel=1e-12)
    assert conflicts.prandtl_glauert(0.3) == pytest.approx(1.048, abs=5e-4)


def test_propeller_blade_drag_by_the_ittc_78_formulas():
    # C_DM = 2(0.044 Re^-1/6 - 5 Re^-2/3) at Re = 1e6, t/c = 0: 2(0.044/10 - 5e-4) = 0.0078.
    # C_DS = 2(1.89 + 1.62 log10(1.8/30e-6))^-2.5 for c = 1.8 m.
    d = conflicts.propeller_blade_drag(1e6, chord=1.8)
    assert d["C_D model"] == pytest.approx(2 * (0.044 / 10 - 5e-4), rel=1e-12)
    assert d["C_D ship"] == pytest.approx(
        2 * (1.89 + 1.62 * math.log10(1.8 / 30e-6)) ** -2.5, rel=1e-12)


def test_towing_tank_reynolds_conflict_carries_both_friction_coefficients():
    found, sol = conflicts_of(Case(ship(), tank()))
    cf = found["reynolds"]
    # Values at the design speed (10 m/s): Re_p = 10 x 150 / nu_p; Re_m = V_m L_m / nu_m.
    nu_p = float(sol.prototype_fluid.kinematic_viscosity_si)
    nu_m = float(sol.model_fluid.kinematic_viscosity_si)
    re_p = 10.0 * 150.0 / nu_p
    re_m = 10.0 * sol.velocity_ratio * 150.0 / sol.scale / nu_m
    assert cf.prototype_value == pytest.approx(re_p, rel=1e-12)
    assert cf.model_value == pytest.approx(re_m, rel=1e-12)
    assert cf.ratio == pytest.approx(sol.scale**1.5 * nu_m / nu_p, rel=1e-12)
    assert cf.details["C_F model"] == pytest.approx(0.075 / (math.log10(re_m) - 2) ** 2)
    assert cf.details["C_F ship"] == pytest.approx(0.075 / (math.log10(re_p) - 2) ** 2)
    assert "ITTC-1957" in cf.consequence and "%" in cf.consequence


def test_towing_tank_weber_conflict_names_capillarity():
    found, _ = conflicts_of(Case(ship(), tank()))
    assert "surface tension" in found["weber"].consequence
    # Capillary length 2 pi sqrt(sigma/(rho g)) = 1.71 cm for water (Lamb 1932 §267).
    assert found["weber"].details["capillary length [m]"] == pytest.approx(0.0171, abs=3e-4)


def test_unmatched_cavitation_number_says_inception_is_not_reproduced():
    proto = ship(immersion=5.0)
    found, _ = conflicts_of(Case(proto, tank()))
    assert "inception" in found["cavitation"].consequence


def test_matched_groups_are_not_conflicts():
    found, _ = conflicts_of(Case(ship(), tank()), keys=("froude", "reynolds"))
    assert "froude" not in found and "reynolds" in found


def test_low_model_reynolds_adds_stimulation_advice():
    # 1:100 model of 1.5 m: Re_m at 10 m/s about 1.5e6 < 5e6 (transitional by flat-plate
    # limits, Schlichting & Gersten 2000).
    found, _ = conflicts_of(Case(ship(), tank(), MatchRequest(scale=100.0)))
    assert "transitional" in found["reynolds"].consequence
    assert "studs" in found["reynolds"].consequence


def test_tank_blockage_note_uses_schuster():
    prob = candidates.build_problem(Case(ship(), tank(), MatchRequest(round_scale=False)))
    sol = solver.solve(prob.case)
    notes = conflicts.blockage_notes(prob, candidates.candidate_at(prob, sol))
    # Schuster: dV/V = m/(1 - m - Fh^2) + (2/3) Fh^10 (R_V/R_T = 0 upper bound); m = 0.005 at
    # the limiting scale, Fh = 0.2722 -> 0.005/0.9209 + 0.67 x 2.2e-6 = 0.543 %.
    fh = 10.0 * sol.velocity_ratio / math.sqrt(9.80665 * 4.0)
    dv = 0.005 / (1 - 0.005 - fh**2) + (2 / 3) * fh**10
    assert f"{dv * 100:.3g} %" in notes[0]


def test_bluff_body_reynolds_conflict_warns_of_the_drag_crisis():
    # A 10 m rounded body at 20 m/s in air: Re_p = 20 x 10 / 1.47e-5 = 1.4e7 (supercritical);
    # at 1:100 and the same speed Re_m = 1.4e5 (subcritical, Achenbach 1968).
    proto = Prototype("bluff_body", 10.0, (20.0,), FluidSpec("air", 288.15))
    fac = Facility("wind_tunnel", "wt", 10.0, 4.0, 3.0, (5.0, 40.0), fluids=("air",),
                   temperature_range=(288.15, 288.15))
    found, _ = conflicts_of(Case(proto, fac, MatchRequest(exact=("mach",), report=(),
                                                          scale=100.0)))
    cf = found["reynolds"]
    assert cf.ratio == pytest.approx(100.0, rel=1e-3)
    assert "drag crisis" in cf.consequence
    # Prandtl-Schlichting flat plate 0.455/(log10 Re)^2.58 (Schlichting 1979).
    assert cf.details["C_F model (flat plate)"] == pytest.approx(
        0.455 / math.log10(cf.model_value) ** 2.58, rel=1e-12)


# --- selectable friction lines, form factor, Mach, wind-tunnel blockage ----------------------
FRICTION_FORMS = {
    # Hughes (1954), Trans. RINA 96: C_F = 0.066/(log10 Re - 2.03)^2.
    "hughes": ("Hughes line", lambda re: 0.066 / (math.log10(re) - 2.03) ** 2),
    # Prandtl-Schlichting (Schlichting, Boundary-Layer Theory): 0.455/(log10 Re)^2.58.
    "prandtl_schlichting": ("Prandtl-Schlichting line",
                            lambda re: 0.455 / math.log10(re) ** 2.58),
    # Blasius (1908) laminar flat plate: 1.328/sqrt(Re).
    "blasius": ("Blasius laminar line", lambda re: 1.328 / math.sqrt(re)),
    # ITTC-1957 (8th ITTC, 1957): 0.075/(log10 Re - 2)^2.
    "ittc1957": ("ITTC-1957 line", lambda re: 0.075 / (math.log10(re) - 2.0) ** 2),
}


@pytest.mark.parametrize("line", sorted(FRICTION_FORMS))
def test_requested_friction_line_is_used_for_the_reynolds_conflict(line):
    words, form = FRICTION_FORMS[line]
    found, _ = conflicts_of(Case(ship(), tank(), MatchRequest(friction_line=line)))
    cf = found["reynolds"]
    assert cf.details["method"] == line and words in cf.consequence
    assert cf.details["C_F model"] == pytest.approx(form(cf.model_value), rel=1e-12)
    assert cf.details["C_F ship"] == pytest.approx(form(cf.prototype_value), rel=1e-12)


def test_schoenherr_line_in_a_plan_solves_the_implicit_equation():
    # Schoenherr (1932): 0.242/sqrt(C_F) = log10(Re C_F), solved exactly.
    found, _ = conflicts_of(Case(ship(), tank(), MatchRequest(friction_line="schoenherr")))
    cf = found["reynolds"]
    for re, c in ((cf.model_value, cf.details["C_F model"]),
                  (cf.prototype_value, cf.details["C_F ship"])):
        assert 0.242 / math.sqrt(c) == pytest.approx(math.log10(re * c), rel=1e-10)


def test_requested_form_factor_enters_the_viscous_correction():
    # 1978 ITTC: (1 + k)(C_FM - C_FS) with k = 0.15; the naive-scaling bound stays
    # (C_FM - C_FS)/C_FS because it is relative to (1 + k) C_FS.
    found, _ = conflicts_of(Case(ship(), tank(), MatchRequest(form_factor=0.15)))
    d = found["reynolds"].details
    assert d["(1+k)"] == pytest.approx(1.15, rel=1e-15)
    assert d["viscous correction (1+k)(C_FM - C_FS)"] == pytest.approx(
        1.15 * (d["C_F model"] - d["C_F ship"]), rel=1e-12)
    assert d["naive scaling error bound [%]"] == pytest.approx(
        100 * (d["C_F model"] - d["C_F ship"]) / d["C_F ship"], rel=1e-12)
    assert "(1+k) = 1.15" in found["reynolds"].consequence


def test_unmatched_mach_number_reports_the_prandtl_glauert_factors():
    # Reynolds exact for a 1 m body at 50 m/s at 1:4 needs 200 m/s in the model: Ma_m = 200/a,
    # Ma_p = 50/a (same air); Prandtl-Glauert 1/sqrt(1 - Ma^2) (Glauert 1928) on each side.
    proto = Prototype("bluff_body", 1.0, (50.0,), FluidSpec("air", 288.15))
    fac = Facility("wind_tunnel", "wt", 10.0, 4.0, 3.0, (5.0, 250.0), fluids=("air",),
                   temperature_range=(288.15, 288.15))
    found, sol = conflicts_of(Case(proto, fac, MatchRequest(exact=("reynolds",), report=(),
                                                            scale=4.0)), keys=("mach",))
    cf = found["mach"]
    a = float(sol.model_fluid.speed_of_sound_si)
    assert cf.model_value == pytest.approx(50.0 * sol.velocity_ratio / a, rel=1e-12)
    assert sol.velocity_ratio == pytest.approx(4.0, rel=1e-9)
    assert cf.details["Prandtl-Glauert factor model"] == pytest.approx(
        1 / math.sqrt(1 - cf.model_value**2), rel=1e-12)
    assert "compressibility" in cf.consequence


def test_closed_wind_tunnel_note_gives_the_thom_pope_solid_blockage():
    # Thom/Pope (Barlow, Rae & Pope 1999 ch. 10): eps_sb = K tau_1 V_m / C^1.5 with the
    # module's body and tunnel shape factors; V_m = 40 m^3 / 10^3, C = 4 x 3 m^2.
    from similitude.correlations import blockage

    proto = Prototype("vehicle", 10.0, (30.0,), FluidSpec("air", 288.15),
                      dimensions={"volume": 40.0, "frontal_area": 8.0})
    fac = Facility("wind_tunnel", "wt", 10.0, 4.0, 3.0, (5.0, 60.0), fluids=("air",),
                   temperature_range=(288.15, 288.15))
    case = Case(proto, fac, MatchRequest(exact=("mach",), report=(), scale=10.0))
    prob = candidates.build_problem(case)
    sol = solver.solve(case)
    notes = conflicts.blockage_notes(prob, candidates.candidate_at(prob, sol))
    eps = (blockage.DEFAULT_BODY_SHAPE_FACTOR * blockage.DEFAULT_TUNNEL_SHAPE_FACTOR
           * 40.0 / 1000.0 / 12.0**1.5)
    assert f"solid blockage dV/V = {eps * 100:.3g} %" in notes[0]
    assert "wake blockage" in notes[0]


def test_open_jet_tunnel_note_says_closed_section_corrections_do_not_apply():
    proto = Prototype("vehicle", 10.0, (30.0,), FluidSpec("air", 288.15),
                      dimensions={"volume": 40.0, "frontal_area": 8.0})
    fac = Facility("wind_tunnel", "jet", 10.0, 4.0, 3.0, (5.0, 60.0), fluids=("air",),
                   temperature_range=(288.15, 288.15), open_jet=True)
    case = Case(proto, fac, MatchRequest(exact=("mach",), report=(), scale=10.0))
    prob = candidates.build_problem(case)
    sol = solver.solve(case)
    notes = conflicts.blockage_notes(prob, candidates.candidate_at(prob, sol))
    assert "Open-jet" in notes[0] and "do not apply" in notes[0]

"""Resistance extrapolation (ITTC 7.5-02-03-01.4): each step against the published formulas,
written out here by hand, and the pipeline's invariances."""

from __future__ import annotations

import math

import numpy as np
import pytest

from fluids_props.water import fresh_water_si
from similitude.errors import InputError
from similitude.planning.case import Case, FluidSpec, Prototype
from similitude.planning.facilities import Facility
from similitude.prediction.extrapolation import (
    ExtrapolationOptions,
    ShipParticulars,
    TankParticulars,
    extrapolate,
)
from similitude.prediction.runs import ResistanceRuns
from similitude.prediction.uncertainty import prohaska_intercept_error
from similitude.readers.measured import read_resistance_runs
from similitude.report.atomic import OutputExistsError

G = 9.80665  # standard gravity, ISO 80000-3
KNOT = 1852.0 / 3600.0  # BIPM SI Brochure (2019), Table 8
LBF = 4.4482216152605  # NIST SP 811 (2008), B.8


def ittc57(re):
    # ITTC-1957 model-ship correlation line, 8th ITTC (1957): C_F = 0.075/(log10 Re - 2)^2
    return 0.075 / (math.log10(re) - 2.0) ** 2


def one_run(speed=1.5, resistance=30.0, temperature=291.15):
    return ResistanceRuns(("A",), np.array([speed]), np.array([resistance]),
                          np.array([temperature]))


SHIP = ShipParticulars(length=100.0, wetted_surface=2500.0, scale=25.0, transverse_area=250.0,
                       bilge_keel_area=20.0)


def synthetic_runs(ship, k, noise=0.0, seed=1, froude=None, temperature=291.15):
    """Runs of a hull whose C_TM = (1+k) C_F57 + 0.04 Fn^4 (Prohaska's model, exact)."""
    fn = np.linspace(0.1, 0.2, 11) if froude is None else np.asarray(froude)
    lm, sm = ship.model_length, ship.model_wetted_surface
    v = fn * np.sqrt(G * lm)
    s = fresh_water_si(np.full(fn.size, temperature))
    re = v * lm / s.kinematic_viscosity_si
    cf = 0.075 / (np.log10(re) - 2) ** 2
    ct = (1 + k) * cf + 0.04 * fn**4
    r = ct * 0.5 * s.density_si * sm * v**2
    r = r * (1 + np.random.default_rng(seed).normal(0, noise, fn.size))
    return ResistanceRuns(tuple(str(i) for i in range(fn.size)), v, r,
                          np.full(fn.size, temperature))


def test_every_step_of_one_run_matches_the_hand_calculation():
    e = extrapolate(one_run(), SHIP, form_factor=0.15)
    a = e.arrays
    # Water properties come from fluids_props (tested there); the rest is written out here.
    rho_m, nu_m = a["rho_m"][0], a["nu_m"][0]
    nu_15, rho_s, nu_s = a["nu_15"], a["rho_s"], a["nu_s"]
    lm, sm, k = 100 / 25, 2500 / 25**2, 0.15
    ctm = 30.0 / (0.5 * rho_m * sm * 1.5**2)
    cfm = ittc57(1.5 * lm / nu_m)
    cfm15 = ittc57(1.5 * lm / nu_15)
    ctm15 = ctm + (1 + k) * (cfm15 - cfm)  # ITTC 7.5-02-03-01.4 Rev 04 (2017)
    cr = ctm15 - (1 + k) * cfm15
    vs = 1.5 * math.sqrt(25)
    re_s = vs * 100 / nu_s
    cfs = ittc57(re_s)
    # Townsin roughness allowance and the correlation allowance of the revised procedure
    dcf = 0.044 * ((150e-6 / 100) ** (1 / 3) - 10 * re_s ** (-1 / 3)) + 0.000125
    ca = (5.68 - 0.6 * math.log10(re_s)) * 1e-3
    caas = 0.8 * 1.225 * 250 / (rho_s * 2500)  # C_DA rho_A A_VS/(rho_S S), C_DA = 0.8
    cts = (2500 + 20) / 2500 * ((1 + k) * cfs + dcf) + ca + cr + caas
    pe = 0.5 * rho_s * 2500 * vs**3 * cts
    assert a["froude"][0] == pytest.approx(1.5 / math.sqrt(G * 4), rel=1e-12)
    assert a["ctm"][0] == pytest.approx(ctm, rel=1e-12)
    assert a["cfm"][0] == pytest.approx(cfm, rel=1e-12)
    assert a["ctm15"][0] == pytest.approx(ctm15, rel=1e-12)
    assert a["cr"][0] == pytest.approx(cr, rel=1e-10)
    assert a["dcf"][0] == pytest.approx(dcf, rel=1e-12)
    assert a["ca"][0] == pytest.approx(ca, rel=1e-12)
    assert a["caas"] == pytest.approx(caas, rel=1e-12)
    assert a["cts"][0] == pytest.approx(cts, rel=1e-12)
    assert e.results["P_E [kW]"][0] == pytest.approx(pe / 1e3, rel=1e-12)
    assert e.results["ship speed [kn]"][0] == pytest.approx(7.5 / KNOT, rel=1e-12)


def test_ship_water_is_sea_water_at_15_degc():
    # ITTC 7.5-02-01-03 Rev 02 (2011) table: sea water 15 degC, 35.16504 g/kg:
    # rho = 1026.021 kg/m^3, nu = 1.1892e-6 m^2/s. Loose tolerance: this checks the pipeline
    # asks for sea water at the ship's state (fresh water's nu would be 4 % lower); the
    # property formulation itself is tested in fluids_props.
    a = extrapolate(one_run(), SHIP, form_factor=0.15).arrays
    assert a["rho_s"] == pytest.approx(1026.021, rel=1e-3)
    assert a["nu_s"] == pytest.approx(1.1892e-6, rel=0.015)


def test_bowden_davison_roughness_allowance_of_the_1978_method():
    # 1978 method: dC_F = [105 (k_S/L)^(1/3) - 0.64] 1e-3; for L = 200 m, k_S = 150 um this is
    # 0.314e-3 (ITTC 7.5-02-03-01.4 Rev 00 1999; value recomputed from the formula).
    ship = ShipParticulars(length=200.0, wetted_surface=8000.0, scale=40.0)
    e = extrapolate(one_run(1.5, 60.0), ship, form_factor=0.2,
                    roughness_method="bowden_davison")
    assert e.arrays["dcf"][0] == pytest.approx((105 * (150e-6 / 200) ** (1 / 3) - 0.64) * 1e-3)
    assert e.arrays["dcf"][0] == pytest.approx(0.314e-3, abs=0.0005e-3)
    # with the 1978 roughness allowance no separate C_A is added unless asked for
    assert e.arrays["ca"][0] == 0.0


def test_given_correlation_allowance_is_used():
    e = extrapolate(one_run(), SHIP, form_factor=0.15, correlation_allowance=0.0002)
    assert e.arrays["ca"][0] == 0.0002


def test_air_resistance_of_the_1978_method():
    # 1978 method: C_AA = 0.001 A_T / S
    e = extrapolate(one_run(), SHIP, form_factor=0.15, air_method="1978")
    assert e.arrays["caas"] == pytest.approx(0.001 * 250 / 2500)


def test_bilge_keels_add_their_share_of_the_viscous_resistance():
    # C_TS with bilge keels: ((S + S_BK)/S)[(1+k) C_FS + dC_F] + C_A + C_R + C_AAS
    bare = extrapolate(one_run(), ShipParticulars(100.0, 2500.0, 25.0), form_factor=0.15)
    keels = extrapolate(one_run(), ShipParticulars(100.0, 2500.0, 25.0, bilge_keel_area=50.0),
                        form_factor=0.15)
    a = bare.arrays
    extra = 50.0 / 2500.0 * ((1.15) * a["cfs"][0] + a["dcf"][0])
    assert keels.arrays["cts"][0] - a["cts"][0] == pytest.approx(extra, rel=1e-10)


def test_froude_method_puts_one_plus_k_to_one():
    # Froude's method: C_R = C_TM - C_FM and C_TS = C_FS + dC_F + C_A + C_R + C_AAS
    e = extrapolate(one_run(), ShipParticulars(100.0, 2500.0, 25.0), method="froude",
                    form_factor=0.3)
    a = e.arrays
    assert e.form_factor == 0.0
    assert a["cr"][0] == pytest.approx(a["ctm15"][0] - a["cfm15"][0], rel=1e-12)
    assert a["cts"][0] == pytest.approx(a["cfs"][0] + a["dcf"][0] + a["ca"][0] + a["cr"][0]
                                        + a["caas"], rel=1e-12)


def test_froude_method_predicts_more_than_the_form_factor_method():
    # Common practice: with k > 0 the form-factor method scales more of the resistance by the
    # falling friction line, so it predicts less full-scale resistance than Froude's method.
    runs = synthetic_runs(SHIP, 0.2)
    ittc = extrapolate(runs, SHIP).arrays["cts"]
    froude = extrapolate(runs, SHIP, method="froude").arrays["cts"]
    assert np.all(froude > ittc)


def test_prohaska_fit_recovers_a_known_form_factor_without_noise():
    e = extrapolate(synthetic_runs(SHIP, 0.17), SHIP)
    assert e.form_factor == pytest.approx(0.17, abs=1e-9)
    assert e.form_factor_fit.r_squared == pytest.approx(1.0, abs=1e-9)
    assert e.form_factor_fit.n_points == 11


def test_prohaska_fit_recovers_k_within_its_noise():
    for seed in (1, 2, 3):
        e = extrapolate(synthetic_runs(SHIP, 0.17, noise=0.002, seed=seed), SHIP)
        s_a = prohaska_intercept_error(e)
        assert 0 < s_a < 0.05
        # three standard errors of the intercept: a 99.7 % bound for normal noise
        assert abs(e.form_factor - 0.17) < 3 * s_a


def test_prohaska_fit_uses_only_the_froude_range():
    runs = synthetic_runs(SHIP, 0.17, froude=np.linspace(0.08, 0.35, 28))
    e = extrapolate(runs, SHIP, froude_range=(0.1, 0.2))
    fn = e.arrays["froude"]
    assert e.form_factor_fit.n_points == int(np.sum((fn >= 0.1) & (fn <= 0.2)))
    assert e.form_factor == pytest.approx(0.17, abs=1e-9)


def test_too_few_low_speed_runs_without_k_is_an_input_error():
    runs = synthetic_runs(SHIP, 0.17, froude=[0.25, 0.3, 0.35])
    with pytest.raises(InputError, match="Prohaska"):
        extrapolate(runs, SHIP)


def test_given_form_factor_replaces_the_fit():
    e = extrapolate(synthetic_runs(SHIP, 0.17), SHIP, form_factor=0.1)
    assert e.form_factor == 0.1 and e.form_factor_fit is None


def test_temperature_correction_raises_ctm_of_a_warm_tank_by_the_friction_difference():
    # Warmer water (20 degC) has a lower viscosity, so Re is higher and C_FM lower than at
    # 15 degC; the correction C_TM,15 = C_TM + (1+k)(C_FM,15 - C_FM) is therefore positive.
    # Size by hand with the ITTC 7.5-02-01-03 (2011) fresh-water table: nu(15) = 1.1386e-6,
    # nu(20) = 1.0034e-6 m^2/s; V = 1.5 m/s, L = 4 m, k = 0.15.
    e = extrapolate(one_run(1.5, 30.0, 293.15), SHIP, form_factor=0.15)
    a = e.arrays
    correction = a["ctm15"][0] - a["ctm"][0]
    hand = 1.15 * (ittc57(1.5 * 4 / 1.1386e-6) - ittc57(1.5 * 4 / 1.0034e-6))
    assert correction > 0
    assert correction == pytest.approx(hand, rel=0.02)
    # and the ship prediction does not depend on the tank temperature's correction path:
    # C_R is the same whether computed at t or at 15 degC
    assert a["cr"][0] == pytest.approx(a["ctm"][0] - 1.15 * a["cfm"][0], rel=1e-10)


def test_temperature_correction_is_zero_at_15_degc():
    a = extrapolate(one_run(1.5, 30.0, 288.15), SHIP, form_factor=0.15).arrays
    assert a["ctm15"][0] == pytest.approx(a["ctm"][0], rel=1e-12)


def test_results_do_not_depend_on_the_input_units(tmp_path):
    runs = synthetic_runs(SHIP, 0.17, noise=0.002)
    si = tmp_path / "si.csv"
    us = tmp_path / "us.csv"
    rows = list(zip(runs.speed.tolist(), runs.resistance.tolist(), runs.temperature.tolist(),
                    strict=True))
    si.write_text("model speed [m/s],total resistance [N],water temperature [degC]\n"
                  + "".join(f"{v!r},{r!r},{t - 273.15!r}\n" for v, r, t in rows))
    us.write_text("model speed [kn],total resistance [lbf],water temperature [degF]\n"
                  + "".join(f"{v / KNOT!r},{r / LBF!r},{(t - 273.15) * 1.8 + 32!r}\n"
                            for v, r, t in rows))
    a = extrapolate(read_resistance_runs(si), SHIP)
    b = extrapolate(read_resistance_runs(us), SHIP)
    np.testing.assert_allclose(b.results["P_E [kW]"], a.results["P_E [kW]"], rtol=1e-10)
    assert b.form_factor == pytest.approx(a.form_factor, rel=1e-9)


def test_schuster_blockage_correction_before_extrapolation():
    # Schuster (1955/56) as listed in ITTC 7.5-02-02-01 §3.6.3:
    # dV/V = m/(1 - m - Fh^2) + (1 - R_V/R_T)(2/3) Fh^10, R_V/R_T = (1+k) C_FM / C_TM
    ship = ShipParticulars(100.0, 2500.0, 25.0, midship_area=150.0)
    tank = TankParticulars(width=4.0, depth=2.0)
    e = extrapolate(one_run(), ship, form_factor=0.15, blockage="schuster", tank=tank)
    plain = extrapolate(one_run(), ship, form_factor=0.15)
    m = 150.0 / 25**2 / (4.0 * 2.0)
    fh = 1.5 / math.sqrt(G * 2.0)
    rv_rt = 1.15 * plain.arrays["cfm"][0] / plain.arrays["ctm"][0]
    dvv = m / (1 - m - fh**2) + (1 - rv_rt) * (2 / 3) * fh**10
    assert e.arrays["dvv"][0] == pytest.approx(dvv, rel=1e-10)
    assert e.arrays["model_speed"][0] == pytest.approx(1.5 * (1 + dvv), rel=1e-12)
    # the same resistance at a higher corrected speed means a lower C_TM
    assert e.arrays["ctm"][0] < plain.arrays["ctm"][0]


def test_blockage_without_tank_is_refused():
    with pytest.raises(InputError, match="tank: missing"):
        ExtrapolationOptions(blockage="schuster")


def test_unknown_roughness_method_lists_the_valid_ones():
    with pytest.raises(InputError, match="bowden_davison, townsin"):
        ExtrapolationOptions(roughness_method="smooth")


def test_stimulator_drag_is_removed_before_the_analysis():
    runs = ResistanceRuns(("A",), np.array([1.5]), np.array([30.0]), np.array([291.15]),
                          stimulator_drag=np.array([0.3]))
    a = extrapolate(runs, SHIP, form_factor=0.15).arrays
    b = extrapolate(one_run(1.5, 29.7), SHIP, form_factor=0.15).arrays
    assert a["cts"][0] == pytest.approx(b["cts"][0], rel=1e-12)


def test_particulars_from_quantities_read_units_and_scale_notation():
    ship = ShipParticulars.from_quantities("255.9 ft", "2500 m^2", "1:25",
                                           water_temperature="59 degF")
    assert ship.length == pytest.approx(255.9 * 0.3048)  # 1 ft = 0.3048 m exactly
    assert ship.scale == 25.0
    assert ship.water_temperature == pytest.approx(288.15)


def _case(dimensions):
    proto = Prototype("surface_ship", 78.0, (9.26,), FluidSpec("sea_water", 288.15),
                      dimensions=dimensions)
    tank = Facility("towing_tank", "tank", 200.0, 7.0, 3.5, (0.1, 8.0))
    return Case(proto, tank)


def test_particulars_from_a_case():
    ship = ShipParticulars.from_case(_case({"wetted_surface": 1450.0, "transverse_area": 210.0}),
                                     scale=14.0)
    assert (ship.length, ship.wetted_surface, ship.transverse_area) == (78.0, 1450.0, 210.0)
    assert ship.salinity == pytest.approx(0.03516504)


def test_case_without_wetted_surface_is_refused():
    with pytest.raises(InputError, match="wetted_surface: missing"):
        ShipParticulars.from_case(_case({}), scale=14.0)


def test_dataframes_carry_units_in_their_headers():
    e = extrapolate(synthetic_runs(SHIP, 0.17), SHIP)
    for frame in (e.model, e.full_scale, e.results):
        for col in frame.columns:
            assert col == "run" or col.endswith("]") or col == "used in fit"


def test_notes_state_the_revision_and_the_caution():
    e = extrapolate(synthetic_runs(SHIP, 0.17), SHIP)
    assert "7.5-02-03-01.4" in e.notes[0] and "Rev 04, 2017" in e.notes[0]
    assert any("estimates" in n for n in e.notes)


def test_workbook_is_not_overwritten_from_python_without_overwrite(tmp_path):
    target = tmp_path / "r.xlsx"
    target.write_bytes(b"old")
    e = extrapolate(one_run(), SHIP, form_factor=0.15)
    with pytest.raises(OutputExistsError):
        e.to_excel(target)
    assert target.read_bytes() == b"old"
    e.to_excel(target, overwrite=True)
    assert target.read_bytes()[:2] == b"PK"


def test_negative_fitted_form_factor_draws_a_note():
    # k < 0 has no physical meaning for a ship hull (common practice)
    e = extrapolate(synthetic_runs(SHIP, -0.05), SHIP)
    assert any("not physical" in n for n in e.notes)


def test_negative_correlation_allowance_is_flagged_in_the_notes():
    # a 400 m ship at 1:50: Re_S about 5e9 at the top speed, above 2.9e9 where the revised
    # C_A = (5.68 - 0.6 log10 Re) 1e-3 changes sign (ITTC 7.5-02-03-01.4 Rev 04, 2017)
    from similitude.prediction.runs import ResistanceRuns

    ship = ShipParticulars(400.0, 30000.0, 50.0)
    v = np.array([0.12, 0.14, 0.16, 0.18, 0.2, 0.24]) * np.sqrt(9.80665 * ship.model_length)
    runs = ResistanceRuns(tuple("123456"), v, 0.004 * 500 * ship.model_wetted_surface * v**2,
                          np.full(6, 290.0))
    e = extrapolate(runs, ship, form_factor=0.2)
    assert np.any(e.arrays["ca"] < 0)
    assert any(n.startswith("NEGATIVE CORRELATION ALLOWANCE") for n in e.notes)

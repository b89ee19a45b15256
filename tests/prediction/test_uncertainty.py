"""First-order uncertainty propagation to C_TS and P_E (ISO GUM law of propagation)."""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest
from scipy import stats

from fluids_props.water import fresh_water_si
from similitude.errors import InputError
from similitude.prediction.extrapolation import ShipParticulars, extrapolate
from similitude.prediction.runs import ResistanceRuns
from similitude.prediction.uncertainty import (
    METHOD_STATEMENT,
    MeasurementUncertainty,
    prohaska_intercept_error,
    propagate,
)

G = 9.80665
SHIP = ShipParticulars(length=100.0, wetted_surface=2500.0, scale=25.0, transverse_area=250.0)


def _runs(noise=0.002, seed=4):
    fn = np.linspace(0.1, 0.3, 15)
    lm, sm = SHIP.model_length, SHIP.model_wetted_surface
    v = fn * math.sqrt(G * lm)
    s = fresh_water_si(np.full(fn.size, 291.15))
    cf = 0.075 / (np.log10(v * lm / s.kinematic_viscosity_si) - 2) ** 2
    r = ((1.2 * cf + 0.04 * fn**4) * 0.5 * s.density_si * sm * v**2
         * (1 + np.random.default_rng(seed).normal(0, noise, fn.size)))
    return ResistanceRuns(tuple(str(i) for i in range(fn.size)), v, r, np.full(fn.size, 291.15))


def test_resistance_contribution_is_the_exact_linear_sensitivity():
    # With k fixed, C_TS is linear in R_M: dC_TS/dR_M = 1/(0.5 rho_M S_M V_M^2), so the
    # GUM contribution is u(R)/(0.5 rho_M S_M V_M^2) (JCGM 100:2008 eq. 10).
    e = extrapolate(_runs(), SHIP, form_factor=0.2)
    u = propagate(e, MeasurementUncertainty(resistance=0.05)).table
    a = e.arrays
    hand = 0.05 / (0.5 * a["rho_m"] * SHIP.model_wetted_surface * a["model_speed"] ** 2)
    np.testing.assert_allclose(u["u(C_TS) from resistance [-]"], hand, rtol=1e-6)
    # and P_E = 0.5 rho_S S V_S^3 C_TS at a fixed speed
    pe_hand = hand * 0.5 * a["rho_s"] * SHIP.wetted_surface * a["ship_speed"] ** 3 / 1e3
    np.testing.assert_allclose(u["u(P_E) from resistance [kW]"], pe_hand, rtol=1e-6)


def test_form_factor_contribution_is_the_exact_linear_sensitivity():
    # C_TS = (1+k) C_FS + dC_F + C_A + C_TM - (1+k) C_FM + C_AAS: dC_TS/dk = C_FS - C_FM
    # (no bilge keels), linear in k.
    e = extrapolate(_runs(), SHIP, form_factor=0.2)
    u = propagate(e, MeasurementUncertainty(form_factor=0.02)).table
    a = e.arrays
    np.testing.assert_allclose(u["u(C_TS) from form factor [-]"],
                               0.02 * np.abs(a["cfs"] - a["cfm"]), rtol=1e-8)


def test_relative_resistance_uncertainty_scales_with_each_reading():
    e = extrapolate(_runs(), SHIP, form_factor=0.2)
    rel = propagate(e, MeasurementUncertainty(resistance_relative=0.01)).table
    a = e.arrays
    # u(C_TS) = 0.01 R / (0.5 rho S V^2) = 0.01 C_TM (the measured C_TM at test temperature)
    np.testing.assert_allclose(rel["u(C_TS) from resistance [-]"], 0.01 * a["ctm"], rtol=1e-6)


def test_combined_uncertainty_is_the_root_sum_of_squares():
    e = extrapolate(_runs(), SHIP, form_factor=0.2)
    t = propagate(e, MeasurementUncertainty(speed=0.002, resistance=0.05, temperature=0.1,
                                            form_factor=0.02)).table
    parts = [t[f"u(P_E) from {n} [kW]"] for n in ("speed", "resistance", "temperature",
                                                   "form factor")]
    np.testing.assert_allclose(t["u(P_E) combined [kW]"],
                               np.sqrt(sum(p**2 for p in parts)), rtol=1e-12)
    np.testing.assert_allclose(t["expanded U(P_E), k=2 [kW]"], 2 * t["u(P_E) combined [kW]"])


def test_no_uncertainty_in_gives_none_out():
    e = extrapolate(_runs(), SHIP, form_factor=0.2)
    t = propagate(e, MeasurementUncertainty()).table
    assert np.all(t["u(P_E) combined [kW]"] == 0)


def test_perturbing_all_runs_at_once_equals_perturbing_one_run_alone():
    # With k fixed the runs do not interact, so one vectorised central difference gives each
    # run's own sensitivity (checked against perturbing run 3 alone, GUM eq. 10 by hand).
    runs = _runs()
    e = extrapolate(runs, SHIP, form_factor=0.2)
    t = propagate(e, MeasurementUncertainty(speed=0.003)).table
    up = runs.speed.copy()
    up[3] += 0.003
    down = runs.speed.copy()
    down[3] -= 0.003
    hi = extrapolate(replace(runs, speed=up), SHIP, form_factor=0.2).arrays["pe"][3]
    lo = extrapolate(replace(runs, speed=down), SHIP, form_factor=0.2).arrays["pe"][3]
    row = t.index[t["run"] == "3"][0]
    assert t.loc[row, "u(P_E) from speed [kW]"] == pytest.approx(abs(hi - lo) / 2 / 1e3,
                                                                 rel=1e-9)


def test_prohaska_intercept_error_equals_the_least_squares_standard_error():
    # Reference: scipy.stats.linregress intercept_stderr of the same straight line.
    e = extrapolate(_runs(), SHIP)
    fit = e.form_factor_fit
    used = np.asarray(fit.used)
    a = e.arrays
    x = a["froude"][used] ** 4 / a["cfm"][used]
    y = a["ctm"][used] / a["cfm"][used]
    ref = stats.linregress(x, y)
    assert e.form_factor + 1 == pytest.approx(ref.intercept, rel=1e-10)
    assert prohaska_intercept_error(e) == pytest.approx(ref.intercept_stderr, rel=1e-8)


def test_fitted_form_factor_is_refitted_not_counted_again():
    # With k fitted, each perturbed copy re-fits Prohaska's line: the runs' resistance acts
    # through k, and k is no input of its own (no "form factor" contribution).
    e = extrapolate(_runs(), SHIP)
    result = propagate(e, MeasurementUncertainty(resistance_relative=0.002))
    assert np.all(result.table["u(C_TS) from form factor [-]"] == 0)
    assert result.inputs.form_factor > 0          # u(k) the runs give the fitted k
    assert result.intercept_error == pytest.approx(prohaska_intercept_error(e))


def test_first_order_u_of_a_fitted_k_matches_monte_carlo():
    # JCGM 101:2008 Monte Carlo as the reference for the first-order u(k) and u(P_E): 20000
    # seeded samples of the resistance readings, k re-fitted in each (within 5 %).
    from similitude.prediction.chain import ChainInputs
    from similitude.prediction.uncertainty import monte_carlo_si

    e = extrapolate(_runs(), SHIP)
    u = MeasurementUncertainty(resistance_relative=0.002, speed=0.001)
    fo = propagate(e, u)

    def outputs(r):
        res = r["resistance"]
        return {"k": np.asarray(res["k"], float).reshape(-1, 1), "pe": res["pe"]}

    mc = monte_carlo_si(ChainInputs(e), u, outputs, samples=20000, seed=7)
    assert fo.inputs.form_factor == pytest.approx(mc["k"]["std"][0], rel=0.05)
    order = np.argsort(e.arrays["ship_speed"], kind="stable")
    np.testing.assert_allclose(fo.table["u(P_E) combined [kW]"],
                               mc["pe"]["std"][order] / 1e3, rtol=0.05)


def test_user_values_with_units_and_percent():
    u = MeasurementUncertainty.from_quantities(speed="2 mm/s", resistance="0.5 %",
                                               temperature="0.1 K", form_factor="0.01")
    assert u.speed == pytest.approx(0.002)
    assert u.resistance_relative == pytest.approx(0.005)
    assert u.temperature == pytest.approx(0.1)
    assert u.form_factor == pytest.approx(0.01)


def test_negative_uncertainty_is_refused():
    with pytest.raises(InputError, match="uncertainty.speed"):
        MeasurementUncertainty(speed=-1.0)


def test_method_is_stated():
    assert "GUM" in METHOD_STATEMENT and "7.5-02-01-01" in METHOD_STATEMENT


def test_temperature_uncertainty_in_degc_is_a_difference():
    # an uncertainty of 0.1 degC is a temperature difference of 0.1 K, not 273.25 K
    assert MeasurementUncertainty.from_quantities(temperature="0.1 degC").temperature == (
        pytest.approx(0.1))

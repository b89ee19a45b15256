"""Full-scale speed, power and rate of revolution (ITTC 7.5-02-03-01.4 Rev 04, 2017).

Each step checked against a hand calculation from the published form written out here; the
procedure's own test example could not be read (only its contents page was retrievable).
Sea water at 15 degC, 35.16504 g/kg: rho = 1026.0 kg/m^3, nu = 1.18922e-6 m^2/s (ITTC
7.5-02-01-03, 2011 table, as quoted in the project digest, 4 digits).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from similitude.prediction.power import loglog_interp
from similitude.prediction.predict import predict
from similitude.prediction.self_propulsion import PropulsionOptions
from tests.prediction import propulsion_scenario as sc

KN = 1852.0 / 3600.0


def _predict(**options):
    return predict(sc.resistance_runs(), sc.SHIP, open_water_runs=sc.open_water_runs(),
                   propeller=sc.PROP, self_propulsion_runs=sc.self_propulsion_runs(),
                   propulsion=PropulsionOptions(**options))


def test_ship_resistance_and_wake_by_hand():
    p = _predict()
    pt = p.self_propulsion.points.iloc[2]
    row = p.power.table.iloc[2]
    k = p.extrapolation.form_factor
    v_s = pt["model speed [m/s]"] * 5.0
    re = v_s * 100.0 / 1.18922e-6
    cfs = 0.075 / (math.log10(re) - 2) ** 2                                  # ITTC-1957
    dcf = 0.044 * ((150e-6 / 100.0) ** (1 / 3) - 10 * re ** (-1 / 3)) + 0.000125  # Townsin
    ca = (5.68 - 0.6 * math.log10(re)) * 1e-3                                # C_A
    caas = 0.8 * 1.225 * 250.0 / (1026.0 * 2500.0)                           # C_DA rho A/(rho S)
    cts = (1 + k) * cfs + dcf + ca + pt["C_R [-]"] + caas
    assert row["C_TS [-]"] == pytest.approx(cts, rel=2e-4)
    # w_TS = (t + 0.04) + (w_TM - t - 0.04) ((1+k) C_FS + dC_F)/((1+k) C_FM)
    t, w = pt["thrust deduction t [-]"], pt["wake fraction w_TM [-]"]
    w_s = (t + 0.04) + (w - t - 0.04) * ((1 + k) * cfs + dcf) / ((1 + k) * pt["C_FM [-]"])
    assert row["full-scale wake w_TS [-]"] == pytest.approx(w_s, rel=1e-4)
    # K_T/J^2 = S C_TS / (2 D^2 (1 - t)(1 - w_TS)^2)
    tau = 2500.0 * cts / (2 * 25.0 * (1 - t) * (1 - w_s) ** 2)
    assert row["loading K_T/J^2 [-]"] == pytest.approx(tau, rel=3e-4)


def test_operating_point_by_hand():
    # n_S = (1 - w_TS) V_S/(J_TS D); K_TS(J_TS) = (K_T/J^2) J_TS^2;
    # P_DS = 2 pi rho D^5 n^3 K_QTS/eta_R; thrust = K_TS rho n^2 D^4
    p = _predict()
    t = p.power.table
    rho = p.power.arrays["rho_s"]
    j = t["advance ratio J_TS [-]"]
    n = t["rate of revolution n_S [1/s]"]
    np.testing.assert_allclose(n, (1 - t["full-scale wake w_TS [-]"]) * t["ship speed [m/s]"]
                               / (j * 5.0), rtol=1e-12)
    np.testing.assert_allclose(t["K_TS [-]"], t["loading K_T/J^2 [-]"] * j**2, rtol=1e-9)
    np.testing.assert_allclose(t["P_DS [kW]"] * 1e3, 2 * math.pi * rho * 5.0**5 * n**3
                               * t["K_QTS [-]"] / t["eta_R [-]"], rtol=1e-12)
    np.testing.assert_allclose(t["thrust per propeller [kN]"] * 1e3,
                               t["K_TS [-]"] * rho * n**2 * 5.0**4, rtol=1e-12)
    np.testing.assert_allclose(t["eta_D [-]"], t["P_E [kW]"] / t["P_DS [kW]"], rtol=1e-12)


def test_full_scale_curve_carries_the_blade_drag_correction():
    # K_TS(J) - K_TM(J) is the faired Delta K_T of the ITTC-1978 correction at each run
    # (scale_open_water; it varies with the run's chord Reynolds number)
    p = _predict()
    ow = p.open_water.table
    j = np.array([0.4, 0.6, 0.8])
    shift = np.interp(j, ow["advance ratio J [-]"], ow["K_T ship [-]"] - ow["K_T model [-]"])
    np.testing.assert_allclose(p.power.curve.kt(j) - np.polynomial.polynomial.polyval(j, sc.KT),
                               shift, rtol=2e-3)


def test_trial_factors_cp_and_cn_scale_power_and_rate():
    # ITTC 7.5-02-03-01.4: P_DT = C_P P_DS, n_T = C_N n_S
    t = _predict(power_factor=1.05, rate_factor=1.02).power.table
    np.testing.assert_allclose(t["trial P_DT [kW]"], 1.05 * t["P_DS [kW]"], rtol=1e-12)
    np.testing.assert_allclose(t["trial rate n_T [rpm]"],
                               1.02 * t["rate of revolution n_S [rpm]"], rtol=1e-12)


def test_trial_corrections_dcfc_and_dwc_enter_the_loading():
    # K_T/J^2 = S (C_TS + dC_FC)/(2 D^2 (1-t)(1 - w_TS + dw_C)^2),
    # n_T = (1 - w_TS + dw_C) V_S/(J_T D)  (ITTC 7.5-02-03-01.4, correlation factors)
    zero = _predict(trial_method="dcfc_dwc").power.table
    np.testing.assert_allclose(zero["trial P_DT [kW]"], zero["P_DS [kW]"], rtol=1e-12)
    p = _predict(trial_method="dcfc_dwc", friction_correction=1e-4, wake_correction=0.02)
    t = p.power.table
    pts = p.self_propulsion.points
    wt = t["full-scale wake w_TS [-]"] - 0.02
    j_t = (1 - wt) * t["ship speed [m/s]"] / (t["trial rate n_T [rpm]"] / 60 * 5.0)
    tau = 2500.0 * (t["C_TS [-]"] + 1e-4) / (2 * 25.0 * (1 - pts["thrust deduction t [-]"])
                                             * (1 - wt) ** 2)
    np.testing.assert_allclose(p.power.curve.kt(j_t.to_numpy()), tau * j_t**2, rtol=1e-8)
    assert np.all(t["trial P_DT [kW]"] > t["P_DS [kW]"])


def test_shaft_and_brake_power_from_the_efficiencies():
    # P_S = P_D/eta_S, P_B = P_S/eta_G
    t = _predict(shaft_efficiency=0.98, gearbox_efficiency=0.97).power.table
    np.testing.assert_allclose(t["P_S [kW]"], t["trial P_DT [kW]"] / 0.98, rtol=1e-12)
    np.testing.assert_allclose(t["P_B [kW]"], t["P_S [kW]"] / 0.97, rtol=1e-12)


def test_contract_speed_figures_interpolate_log_log():
    p = _predict()
    sp = p.power.speed_power
    kn = float(sp["ship speed [kn]"].iloc[2] + sp["ship speed [kn]"].iloc[3]) / 2
    got = _predict(contract_speed=kn * KN).power.contract
    v0, v1 = sp["ship speed [kn]"].iloc[2], sp["ship speed [kn]"].iloc[3]
    p0, p1 = sp["P_D [kW]"].iloc[2], sp["P_D [kW]"].iloc[3]
    # by hand: P = P0 (V/V0)^m with m = ln(P1/P0)/ln(V1/V0)
    hand = p0 * (kn / v0) ** (math.log(p1 / p0) / math.log(v1 / v0))
    assert got["P_D [kW]"] == pytest.approx(hand, rel=1e-12)
    assert got["ship speed [kn]"] == pytest.approx(kn)


def test_log_log_interpolation_is_exact_for_a_power_law():
    v = np.array([10.0, 12.0, 16.0])
    assert loglog_interp(14.0, v, 3.0 * v**3.2) == pytest.approx(3.0 * 14.0**3.2, rel=1e-12)


def test_twin_screw_power_is_twice_one_propeller():
    # N = 2 propellers share the thrust: K_T/J^2 halves, P_D counts both (ITTC-1978 twin screw)
    sp = sc.self_propulsion_runs(propellers=2)
    p = predict(sc.resistance_runs(), sc.SHIP, open_water_runs=sc.open_water_runs(),
                propeller=sc.PROP, self_propulsion_runs=sp,
                propulsion=PropulsionOptions(propellers=2))
    t = p.power.table
    rho = p.power.arrays["rho_s"]
    n = t["rate of revolution n_S [1/s]"]
    np.testing.assert_allclose(t["P_DS [kW]"] * 1e3, 2 * 2 * math.pi * rho * 5.0**5 * n**3
                               * t["K_QTS [-]"] / t["eta_R [-]"], rtol=1e-12)
    pts = p.self_propulsion.points
    tau = 2500.0 * t["C_TS [-]"] / (2 * 2 * 25.0 * (1 - pts["thrust deduction t [-]"])
                                    * (1 - t["full-scale wake w_TS [-]"]) ** 2)
    np.testing.assert_allclose(t["loading K_T/J^2 [-]"], tau, rtol=1e-9)


def test_notebook_tables_carry_units_in_their_headers():
    p = _predict(contract_speed=9.0)
    for frame in (p.power.table, p.speed_power, p.propulsion_factors):
        numeric = [c for c in frame.columns if frame[c].dtype.kind == "f"]
        assert all("[" in c and c.endswith("]") for c in numeric), numeric

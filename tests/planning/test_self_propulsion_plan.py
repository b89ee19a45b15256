"""Planning a self-propulsion test: F_D per speed, expected propeller loading, checks, run columns.

Procedures: ITTC 7.5-02-03-01.1 "Propulsion/Bollard Pull Test" Rev 04 (2011) and ITTC
7.5-02-03-01.4 "1978 ITTC Performance Prediction Method" Rev 04 (2017); their text was not at
hand (only contents pages could be read), so each figure is checked against a hand
calculation from the stated form, with property values from a reference library (iapws).
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest
from iapws import IAPWS95

from similitude.errors import InputError
from similitude.planning.case import Case, FluidSpec, MatchRequest, MatrixSpec
from similitude.planning.planner import plan
from similitude.planning.propulsion_spec import PropulsionSpec
from tests.planning.scenarios import ship, tank

KN = 1852.0 / 3600.0
KT = (0.46, -0.30, -0.13)   # invented model propeller: K_T = 0.46 - 0.30 J - 0.13 J^2
KQ = (0.062, -0.032, -0.012)
DIMS = {"beam": 24.0, "draught": 8.0, "midship_area": 190.0, "wetted_surface": 4500.0,
        "transverse_area": 300.0, "displacement": 20000.0}


def _case(spec: PropulsionSpec | None = None, facility=None, speeds=(10 * KN, 14 * KN)) -> Case:
    """The 150 m scenario ship at 1:25 in fresh water at 15 degC (fixed, for hand values)."""
    return Case(
        prototype=ship(dimensions=DIMS, speeds=speeds),
        facility=facility or tank(max_rotation_rate=30.0, max_thrust=200.0, max_torque=8.0),
        request=MatchRequest(scale=25.0, model_fluid=FluidSpec("fresh_water", 288.15)),
        matrix=MatrixSpec(), test="self_propulsion",
        propulsion=spec if spec is not None else PropulsionSpec(
            propeller_diameter=6.0, thrust_polynomial=KT, torque_polynomial=KQ,
            resistance_speeds=(8 * KN, 16 * KN), resistance_values=(300e3, 1400e3),
            wake_fraction=0.3, thrust_deduction=0.2, rotative_efficiency=1.02,
            form_factor=0.2))


def _ittc57(re):
    return 0.075 / (math.log10(re) - 2) ** 2


def test_tow_force_is_the_revised_form_by_hand():
    p = plan(_case())
    row = p.propulsion.speeds.iloc[1]          # 14 kn
    vm = 14 * KN / 5.0                          # Froude: V_M = V_S/sqrt(25)
    water = IAPWS95(T=288.15, P=0.101325)      # reference library for rho and nu at 15 degC
    nu_m = water.mu / water.rho
    cfm = _ittc57(vm * 6.0 / nu_m)
    # ship side: C_FS, dC_F, C_A and C_AAS as the plan computed them (tested in
    # tests/correlations); F_D = 0.5 rho V^2 S_M [(1+k)C_FM - ((1+k)C_FS + dC_F) - C_A - C_AAS]
    bracket = (1.2 * cfm - (1.2 * row["C_FS [-]"] + row["roughness allowance dC_F [-]"])
               - row["correlation allowance C_A [-]"] - row["air resistance C_AAS [-]"])
    hand = 0.5 * water.rho * vm**2 * (4500.0 / 625.0) * bracket
    assert row["C_FM [-]"] == pytest.approx(cfm, rel=1e-5)
    assert row["skin-friction correction F_D [N]"] == pytest.approx(hand, rel=1e-5)


def test_ship_coefficients_of_the_tow_force_by_hand():
    # ITTC-1957 line at the ship with sea water at 15 degC, nu = 1.18922e-6 m^2/s (ITTC
    # 7.5-02-01-03 2011 table, 35.16504 g/kg); Townsin dC_F with k_S = 150 um; C_A =
    # (5.68 - 0.6 log10 Re) 1e-3; C_AAS = 0.8 * 1.225 * 300 / (1026.0 * 4500)
    row = plan(_case()).propulsion.speeds.iloc[1]
    re = 14 * KN * 150.0 / 1.18922e-6
    assert row["C_FS [-]"] == pytest.approx(_ittc57(re), rel=1e-4)
    dcf = 0.044 * ((150e-6 / 150.0) ** (1 / 3) - 10 * re ** (-1 / 3)) + 0.000125
    assert row["roughness allowance dC_F [-]"] == pytest.approx(dcf, rel=1e-4)
    assert row["correlation allowance C_A [-]"] == pytest.approx(
        (5.68 - 0.6 * math.log10(re)) * 1e-3, rel=1e-4)
    assert row["air resistance C_AAS [-]"] == pytest.approx(0.8 * 1.225 * 300 / (1026 * 4500),
                                                             rel=1e-3)


def test_the_1978_form_is_used_when_asked():
    spec = replace(_case().propulsion, friction_correction="1978")
    row = plan(_case(spec)).propulsion.speeds.iloc[0]
    vm = 10 * KN / 5.0
    water = IAPWS95(T=288.15, P=0.101325)
    hand = 0.5 * water.rho * vm**2 * 7.2 * (1.2 * (row["C_FM [-]"] - row["C_FS [-]"])
                                            - row["roughness allowance dC_F [-]"])
    assert row["skin-friction correction F_D [N]"] == pytest.approx(hand, rel=1e-6)


def test_expected_point_meets_the_propeller_equations():
    # At the ship self-propulsion point the planned figures satisfy, by hand:
    # T (1 - t) = R_TM - F_D; K_T(J) = T/(rho n^2 D^4); J = V(1 - w)/(n D);
    # Q = K_Q(J) rho n^2 D^5 / eta_R (ITTC 7.5-02-03-01.4 Rev 04 2017, thrust identity).
    p = plan(_case())
    s = p.propulsion.speeds
    rho = IAPWS95(T=288.15, P=0.101325).rho
    d = 6.0 / 25.0
    for _, row in s.iterrows():
        t, n, q = row["expected thrust [N]"], row["expected rotation rate [1/s]"], row[
            "expected torque [N m]"]
        j = row["model speed [m/s]"] * 0.7 / (n * d)
        assert t * 0.8 == pytest.approx(row["model resistance R_TM [N]"]
                                        - row["skin-friction correction F_D [N]"], rel=1e-9)
        assert np.polyval(KT[::-1], j) == pytest.approx(t / (rho * n**2 * d**4), rel=1e-6)
        assert q == pytest.approx(np.polyval(KQ[::-1], j) * rho * n**2 * d**5 / 1.02, rel=1e-6)
        assert row["expected rotation rate [rpm]"] == pytest.approx(60 * n, rel=1e-12)


def test_thrust_at_the_ship_point_carries_the_ship_resistance_coefficient():
    # With the full-scale resistance given, T (1 - t) at F_D equals C_TS 0.5 rho_M V_M^2 S_M,
    # C_TS = R_TS/(0.5 rho_S S V_S^2): the model propeller works at the ship's loading.
    # R_TS at 14 kn interpolated log-log between (8 kn, 300 kN) and (16 kn, 1400 kN).
    p = plan(_case())
    row = p.propulsion.speeds.iloc[1]
    r_ts = 300e3 * (14 / 8) ** (math.log(1400 / 300) / math.log(2))
    cts = r_ts / (0.5 * 1025.976 * 4500.0 * (14 * KN) ** 2)   # TEOS-10 sea water at 15 degC
    rho_m = IAPWS95(T=288.15, P=0.101325).rho
    assert row["expected thrust [N]"] * 0.8 == pytest.approx(
        cts * 0.5 * rho_m * (14 * KN / 5) ** 2 * 7.2, rel=1e-4)


def test_load_varying_plans_one_run_per_tow_force():
    spec = replace(_case().propulsion, tow_force_factors=(0.0, 0.5, 1.0, 1.5))
    p = plan(_case(spec))
    m = p.matrix
    assert len(m) == 2 * 4 and list(m["run"]) == list(range(1, 9))
    first = m[m["speed index"] == 1]
    fd = first["skin-friction correction F_D [N]"].iloc[0]
    np.testing.assert_allclose(first["tow force [N]"], [0, 0.5 * fd, fd, 1.5 * fd], rtol=1e-12)
    # T = (R_TM - F)/(1 - t): thrust falls by F/(1 - t) = 0.5 F_D/0.8 per step
    np.testing.assert_allclose(np.diff(first["expected thrust [N]"]), -0.5 * fd / 0.8,
                               rtol=1e-9)
    assert list(first["tow force factor [-]"]) == [0.0, 0.5, 1.0, 1.5]


def test_dynamometer_over_its_range_fails_with_advice():
    facility = tank(max_rotation_rate=30.0, max_thrust=5.0, max_torque=8.0)
    checks = {c.name: c for c in plan(_case(facility=facility)).checks}
    thrust = checks["self-propulsion thrust (dynamometer)"]
    assert thrust.status == "fail" and thrust.limit == 5.0
    assert "dynamometer" in thrust.advice
    assert checks["self-propulsion rotation rate (dynamometer)"].status == "ok"


def test_dynamometer_without_its_range_is_not_checked_with_the_key_to_give():
    checks = {c.name: c for c in plan(_case(facility=tank())).checks}
    c = checks["self-propulsion torque (dynamometer)"]
    assert c.status == "not checked" and "facility.largest_torque" in c.advice


def test_without_an_open_water_curve_the_expected_figures_are_not_checked():
    spec = PropulsionSpec(propeller_diameter=6.0, form_factor=0.2)
    p = plan(_case(spec))
    assert "expected rotation rate [1/s]" not in p.matrix
    assert "skin-friction correction F_D [N]" in p.matrix   # F_D needs no propeller
    c = {c.name: c for c in p.checks}["self-propulsion rotation rate (dynamometer)"]
    assert c.status == "not checked" and "open_water" in c.advice


def test_taylor_wake_estimate_when_the_case_gives_no_factors():
    # Taylor (1910), single screw: w = 0.50 C_B - 0.05; C_B = 20000/(150*24*8) = 0.69444;
    # t = 0.6 w (Schoenherr's t = k w), eta_R = 1 (common practice)
    spec = replace(_case().propulsion, wake_fraction=None, thrust_deduction=None,
                   rotative_efficiency=None)
    sp = plan(_case(spec)).propulsion
    w = 0.5 * 20000 / (150 * 24 * 8) - 0.05
    assert sp.wake_fraction == pytest.approx(w, rel=1e-12)
    assert sp.thrust_deduction == pytest.approx(0.6 * w, rel=1e-12)
    assert sp.rotative_efficiency == 1.0
    assert "Taylor" in sp.factors_source


def test_form_factor_defaults_to_the_case_request_then_zero():
    spec = replace(_case().propulsion, form_factor=None)
    case = _case(spec)
    assert plan(case).propulsion.form_factor == 0.0
    assert "k = 0" in plan(case).propulsion.form_factor_source
    with_k = replace(case, request=replace(case.request, form_factor=0.15))
    assert plan(with_k).propulsion.form_factor == 0.15


def test_missing_wetted_surface_is_a_named_error():
    case = _case()
    case = replace(case, prototype=ship(dimensions={"beam": 24.0, "draught": 8.0}))
    with pytest.raises(InputError, match="prototype.sizes.wetted_surface"):
        plan(case)


def test_other_tests_carry_no_propulsion_part():
    case = replace(_case(), test="resistance")
    p = plan(case)
    assert p.propulsion is None and "tow force [N]" not in p.matrix


def test_spec_refuses_two_open_water_sources():
    from similitude.prediction.runs import OpenWaterRuns

    ow = OpenWaterRuns(("1", "2"), np.array([0.2, 0.6]), np.array([0.38, 0.24]),
                       np.array([0.055, 0.04]))
    with pytest.raises(InputError, match="both given"):
        PropulsionSpec(open_water=ow, thrust_polynomial=KT, torque_polynomial=KQ)

"""Uncertainty of P_D and n_S: first order (ISO GUM) against Monte Carlo (JCGM 101:2008) on the
SYNTHETIC demo data, and invariance of the whole prediction to the units of the input files.

Unit definitions (exact): 1 kn = 1852/3600 m/s, 1 rpm = 1/60 s^-1 (BIPM SI Brochure 2019,
Table 8); 1 lbf = 4.4482216152605 N, 1 ft = 0.3048 m (NIST SP 811, 2008, B.8);
t/degF = 1.8 t/degC + 32.
"""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest

from similitude.prediction.extrapolation import ShipParticulars
from similitude.prediction.open_water import PropellerParticulars
from similitude.prediction.predict import predict
from similitude.prediction.propulsion_uncertainty import propulsion_uncertainty
from similitude.prediction.uncertainty import MeasurementUncertainty
from similitude.readers.measured import (
    read_open_water_runs,
    read_resistance_runs,
    read_self_propulsion_runs,
)

DATA = Path(__file__).parents[2] / "demo_cases" / "measured"
SHIP = ShipParticulars(78.0, 1450.0, 21.0, transverse_area=210.0)
PROP = PropellerParticulars.from_text("diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.30; "
                                      "blades=4; thickness_ratio=0.04", 21.0)
# the demo's stated measurement uncertainties (standard, k = 1), as the virtual tank's noise
DEMO_U = MeasurementUncertainty.from_quantities(
    speed="1 mm/s", resistance="0.2 %", temperature="0.05 K", rotation_rate="0.05 %",
    thrust="0.3 %", torque="0.3 %", tow_force="0.005 N", open_water_thrust="0.4 %",
    open_water_torque="0.4 %")


def _demo(sp_file="ferry_self_propulsion_SYNTHETIC.csv", res_file=None, **kw):
    runs = read_resistance_runs(DATA / (res_file or "ferry_resistance_runs_SYNTHETIC.csv"))
    ow = read_open_water_runs(DATA / "ferry_open_water_SYNTHETIC.csv")
    sp = read_self_propulsion_runs(DATA / sp_file)  # an absolute path keeps its folder
    return predict(runs, SHIP, open_water_runs=ow, propeller=PROP, self_propulsion_runs=sp,
                   **kw)


@pytest.fixture(scope="module")
def demo_mc():
    return _demo(uncertainty=DEMO_U, monte_carlo=10_000, seed=12)


def test_first_order_agrees_with_monte_carlo_within_five_percent(demo_mc):
    # JCGM 101:2008 Monte Carlo (10^4 seeded samples, k re-fitted in each) as the reference
    t = demo_mc.propulsion_uncertainty.table
    for label in ("P_DS", "n_S", "P_E"):
        ratio = t[f"u({label}) first order / Monte Carlo [-]"]
        assert np.all(np.abs(ratio - 1) < 0.05), (label, ratio.tolist())


def test_monte_carlo_interval_holds_the_prediction(demo_mc):
    t = demo_mc.propulsion_uncertainty.table
    assert np.all(t["P_DS 2.5 % Monte Carlo [kW]"] < t["P_DS [kW]"])
    assert np.all(t["P_DS [kW]"] < t["P_DS 97.5 % Monte Carlo [kW]"])
    np.testing.assert_allclose(t["P_DS [kW]"], demo_mc.power.table["P_DS [kW]"], rtol=1e-12)


def test_the_method_of_each_figure_is_stated(demo_mc):
    pu = demo_mc.propulsion_uncertainty
    assert "First order" in pu.method and "Monte Carlo" in pu.method
    assert "10000 samples (seed 12)" in pu.method
    assert pu.samples == 10_000 and pu.seed == 12


def test_monte_carlo_repeats_with_its_seed():
    chain = _demo().chain
    a = propulsion_uncertainty(chain, DEMO_U, samples=500, seed=3).table
    b = propulsion_uncertainty(chain, DEMO_U, samples=500, seed=3).table
    c = propulsion_uncertainty(chain, DEMO_U, samples=500, seed=4).table
    col = "u(P_DS) Monte Carlo [kW]"
    np.testing.assert_array_equal(a[col], b[col])
    assert not np.array_equal(a[col], c[col])


def test_contributions_add_up_to_the_combined_uncertainty(demo_mc):
    pu = demo_mc.propulsion_uncertainty
    c = pu.contributions
    first = c[c["ship speed [kn]"] == c["ship speed [kn]"].iloc[0]]
    rss = float(np.sqrt(np.sum(first["u(P_DS) contribution [kW]"] ** 2)))
    assert rss == pytest.approx(pu.table["u(P_DS) first order [kW]"].iloc[0], rel=1e-12)
    assert {"thrust", "torque", "resistance", "open-water K_T"} <= set(c["input"])


def test_a_given_form_factor_uncertainty_is_its_own_input():
    u = MeasurementUncertainty(speed=0.001, form_factor=0.01)
    c = _demo(uncertainty=u).propulsion_uncertainty.contributions
    k_part = c[c["input"] == "form factor"]["u(P_DS) contribution [kW]"]
    assert len(k_part) > 0 and np.all(k_part > 0)


def _us_units(tmp_path: Path, name: str, columns: dict[str, tuple[str, object]]) -> str:
    """The demo file ``name`` rewritten in other units, exactly (full float precision)."""
    import pandas as pd

    frame = pd.read_csv(DATA / name, comment="#")
    out = {}
    for col in frame.columns:
        header, convert = columns.get(col, (col, None))
        out[header] = frame[col] if convert is None else [repr(convert(v)) for v in frame[col]]
    target = tmp_path / name.replace(".csv", "_converted.csv")
    pd.DataFrame(out).to_csv(target, index=False)
    return str(target)


def test_prediction_does_not_depend_on_the_units_of_the_files(tmp_path):
    # The same runs written in kn, rpm, lbf, lbf ft and degF (converted exactly here) give the
    # same analysis and full-scale prediction as the SI files.
    kn, lbf = 1852.0 / 3600.0, 4.4482216152605
    speed = ("model speed [kn]", lambda v: v / kn)
    degf = ("water temperature [degF]", lambda t: 1.8 * t + 32.0)
    sp = _us_units(tmp_path, "ferry_self_propulsion_SYNTHETIC.csv", {
        "model speed [m/s]": speed, "water temperature [degC]": degf,
        "rotation rate [1/s]": ("rotation rate [rpm]", lambda n: 60.0 * n),
        "thrust [N]": ("thrust [lbf]", lambda t: t / lbf),
        "torque [N m]": ("torque [lbf*ft]", lambda q: q / (lbf * 0.3048)),
        "tow force [N]": ("tow force [lbf]", lambda f: f / lbf)})
    res = _us_units(tmp_path, "ferry_resistance_runs_SYNTHETIC.csv", {
        "model speed [m/s]": speed, "water temperature [degC]": degf,
        "total resistance [N]": ("total resistance [lbf]", lambda r: r / lbf)})
    si = _demo()
    us = _demo(sp, res)
    for table, col in ((si.power.table, "P_DS [kW]"),
                       (si.power.table, "rate of revolution n_S [rpm]"),
                       (si.self_propulsion.points, "wake fraction w_TM [-]"),
                       (si.self_propulsion.points, "thrust deduction t [-]")):
        other = us.power.table if table is si.power.table else us.self_propulsion.points
        np.testing.assert_allclose(other[col], table[col], rtol=1e-9)

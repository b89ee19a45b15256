"""Propeller open-water characteristics at full scale (ITTC-1978 blade-drag correction)."""

from __future__ import annotations

import math

import numpy as np
import pytest
from openpyxl import load_workbook

from similitude.errors import InputError
from similitude.prediction.extrapolation import ShipParticulars, extrapolate
from similitude.prediction.open_water import PropellerParticulars, chord_reynolds, scale_open_water
from similitude.prediction.runs import OpenWaterRuns, ResistanceRuns

PROP = PropellerParticulars(diameter=5.0, scale=20.0, pitch_diameter=1.0, chord_diameter=0.3,
                            blades=4, thickness_chord=0.04)


def _runs(**kw):
    return OpenWaterRuns(("1", "2"), np.array([0.3, 0.6]), np.array([0.35, 0.22]),
                         np.array([0.05, 0.035]), **kw)


def test_full_scale_coefficients_match_the_hand_calculation():
    # ITTC 7.5-02-03-01.4 Rev 04 (2017) §2.4, written out:
    # C_DM = 2(1 + 2t/c)[0.044 Re^(-1/6) - 5 Re^(-2/3)]
    # C_DS = 2(1 + 2t/c)(1.89 + 1.62 log10(c/k_p))^(-2.5), k_p = 30 um, c = 0.3 * 5 m
    # K_TS = K_TM - dK_T, dK_T = -dC_D 0.3 (P/D)(cZ/D); K_QS = K_QM - dC_D 0.25 (cZ/D)
    re = 5.0e5
    cdm = 2 * 1.08 * (0.044 * re ** (-1 / 6) - 5 * re ** (-2 / 3))
    cds = 2 * 1.08 * (1.89 + 1.62 * math.log10(1.5 / 30e-6)) ** -2.5
    dcd = cdm - cds
    out = scale_open_water(_runs(), PROP, reynolds_chord=re).table
    assert out["dC_D [-]"][0] == pytest.approx(dcd, rel=1e-12)
    np.testing.assert_allclose(out["K_T ship [-]"], [0.35 + dcd * 0.3 * 1.0 * 1.2,
                                                     0.22 + dcd * 0.3 * 1.0 * 1.2], rtol=1e-12)
    np.testing.assert_allclose(out["K_Q ship [-]"], [0.05 - dcd * 0.25 * 1.2,
                                                     0.035 - dcd * 0.25 * 1.2], rtol=1e-12)


def test_open_water_efficiency_is_j_kt_over_two_pi_kq():
    # eta_0 = J K_T / (2 pi K_Q), ITTC Symbols and Terminology List (2017)
    out = scale_open_water(_runs(), PROP, reynolds_chord=5e5).table
    assert out["eta_0 model [-]"][0] == pytest.approx(0.3 * 0.35 / (2 * math.pi * 0.05))


def test_smoother_full_scale_blades_raise_thrust_and_lower_torque():
    # ITTC-1978: the ship's section drag is lower (dC_D > 0), so K_T rises and K_Q falls,
    # and the efficiency rises.
    out = scale_open_water(_runs(), PROP, reynolds_chord=5e5).table
    assert np.all(out["dC_D [-]"] > 0)
    assert np.all(out["K_T ship [-]"] > out["K_T model [-]"])
    assert np.all(out["K_Q ship [-]"] < out["K_Q model [-]"])
    assert np.all(out["eta_0 ship [-]"] > out["eta_0 model [-]"])


def test_chord_reynolds_number_at_075_radius():
    # Re_co = c_0.75 sqrt(V_A^2 + (0.75 pi n D)^2) / nu with V_A = J n D (ITTC 7.5-02-03-01.4)
    re = chord_reynolds(0.5, 15.0, 0.25, 0.3, 1.1386e-6)
    va = 0.5 * 15 * 0.25
    assert re == pytest.approx(0.075 * math.hypot(va, 0.75 * math.pi * 15 * 0.25) / 1.1386e-6)


def test_reynolds_number_from_measured_rate_and_temperature():
    runs = _runs(rotation_rate=np.array([15.0, 15.0]), temperature=np.array([288.15, 288.15]))
    out = scale_open_water(runs, PROP).table
    # nu(15 degC) = 1.1386e-6 m^2/s, ITTC 7.5-02-01-03 (2011) table; 0.5 % covers the
    # property module's own formulation
    hand = chord_reynolds(0.3, 15.0, 0.25, 0.3, 1.1386e-6)
    assert out["model chord Reynolds number [-]"][0] == pytest.approx(hand, rel=0.005)


def test_without_rate_or_reynolds_number_is_an_input_error():
    with pytest.raises(InputError, match="rotation rate and water temperature missing"):
        scale_open_water(_runs(), PROP)


def test_low_chord_reynolds_number_gives_a_note():
    out = scale_open_water(_runs(), PROP, reynolds_chord=1.5e5)
    assert any("below" in n for n in out.notes)


def test_bad_blade_number_is_refused():
    with pytest.raises(InputError, match="propeller.blades"):
        PropellerParticulars(5.0, 20.0, 1.0, 0.3, 1, 0.04)


def test_propeller_particulars_read_from_text():
    p = PropellerParticulars.from_text("diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.3; "
                                       "blades=4; thickness_ratio=0.04", scale=21.0)
    assert p.diameter == 4.2 and p.blades == 4
    assert p.model_diameter == pytest.approx(0.2)


def test_propeller_text_missing_a_key_is_refused():
    with pytest.raises(InputError, match="missing blades"):
        PropellerParticulars.from_text("diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.3; "
                                       "thickness_ratio=0.04", scale=21.0)


def test_open_water_sheet_in_the_results_workbook(tmp_path):
    runs = ResistanceRuns(("A",), np.array([1.5]), np.array([30.0]), np.array([291.15]))
    e = extrapolate(runs, ShipParticulars(100.0, 2500.0, 20.0), form_factor=0.15)
    ow = scale_open_water(_runs(), PROP, reynolds_chord=5e5)
    e.to_excel(tmp_path / "r.xlsx", open_water=ow)
    ws = load_workbook(tmp_path / "r.xlsx")["Open water"]
    assert len(ws._charts) == 1
    headers = [c.value for row in ws.iter_rows() for c in row if c.value]
    assert "K_T ship [-]" in headers and "eta_0 ship [-]" in headers

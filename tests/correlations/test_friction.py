"""Friction lines: each against its published formula or the published Schoenherr table."""

from re import escape

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st
from scipy.optimize import brentq

from similitude.correlations.friction import (
    FRICTION_LINES,
    MIN_TURBULENT_MODEL_REYNOLDS,
    flow_regime,
    friction_coefficient,
    schoenherr_residual,
    turbulence_stimulation_advice,
)
from similitude.errors import InputError


def test_ittc1957_line_at_1e7_is_0_003():
    # ITTC 1957 (8th ITTC): 0.075 / (log10(1e7) - 2)^2 = 0.075 / 25 = 0.003 exactly
    assert friction_coefficient(1e7) == pytest.approx(0.003, rel=1e-14)


def test_ittc1957_line_at_ship_reynolds():
    # ITTC 1957: 0.075 / (9 - 2)^2 = 0.075 / 49 = 1.5306122e-3
    assert friction_coefficient(1e9, "ittc1957") == pytest.approx(1.5306122e-3, rel=1e-7)


@pytest.mark.parametrize("re, table", [(1e6, 0.004409), (1e7, 0.002934), (1e8, 0.002072),
                                       (1e9, 0.001531)])
def test_schoenherr_matches_the_1957_ittc_table(re, table):
    # 8th ITTC (1957), "Skin Friction and Turbulence Stimulation", table of Schoenherr C_F
    # (values as quoted in a secondary copy; recomputed exactly in the project digest).
    # Table is rounded to 6 decimals, hence the half-unit tolerance.
    assert friction_coefficient(re, "schoenherr") == pytest.approx(table, abs=0.5e-6)


def test_schoenherr_agrees_with_a_bracketing_root_finder():
    # Oracle: scipy brentq on Schoenherr (1932), 0.242/sqrt(C_F) - log10(Re C_F) = 0
    for re in (3e5, 4.2e6, 7.7e8, 2e10):
        ref = brentq(lambda cf, r=re: 0.242 / np.sqrt(cf) - np.log10(r * cf), 1e-5, 0.05,
                     xtol=1e-16, rtol=1e-15)
        assert friction_coefficient(re, "schoenherr") == pytest.approx(ref, rel=1e-12)


def test_hughes_line_hand_value():
    # Hughes (1954): 0.066 / (7 - 2.03)^2 = 0.066 / 24.7009 = 2.671967e-3
    assert friction_coefficient(1e7, "hughes") == pytest.approx(2.671967e-3, rel=1e-6)


def test_prandtl_schlichting_hand_value():
    # Schlichting, Boundary-Layer Theory: 0.455 / 7^2.58; 7^2.58 = exp(2.58 ln 7) = 151.4792
    assert friction_coefficient(1e7, "prandtl_schlichting") == pytest.approx(
        0.455 / 151.4792, rel=1e-6)


def test_blasius_laminar_hand_value():
    # Blasius (1908): 1.328 / sqrt(1e6) = 1.328e-3
    assert friction_coefficient(1e6, "blasius") == pytest.approx(1.328e-3, rel=1e-14)


def test_ittc_line_is_close_to_schoenherr_at_ship_scale():
    # The ITTC-1957 line was set to follow Schoenherr at ship Reynolds numbers (8th ITTC 1957);
    # table above: 0.001531 vs 0.075/49 = 0.0015306 -> within 0.1 %
    assert friction_coefficient(1e9) == pytest.approx(friction_coefficient(1e9, "schoenherr"),
                                                      rel=1e-3)


def test_ittc_line_exceeds_schoenherr_at_model_scale():
    # 8th ITTC 1957: the correlation line lies above Schoenherr at model Re (1e6: 0.004688
    # by 0.075/16 against the table's 0.004409)
    assert friction_coefficient(1e6) > friction_coefficient(1e6, "schoenherr")


def test_arrays_keep_their_shape_and_scalars_give_floats():
    re = np.array([[1e6, 1e7], [1e8, 1e9]])
    for method in FRICTION_LINES:
        assert np.shape(friction_coefficient(re, method)) == (2, 2)
        assert isinstance(friction_coefficient(1e7, method), float)


def test_unknown_method_lists_the_lines():
    with pytest.raises(ValueError, match="ittc1957, schoenherr, hughes"):
        friction_coefficient(1e7, "karman")


@pytest.mark.parametrize("bad", [0.0, -5e6])
def test_nonpositive_reynolds_is_refused_naming_the_value(bad):
    with pytest.raises(InputError, match=escape(f"reynolds: got {bad:g}")):
        friction_coefficient(bad)


@pytest.mark.parametrize("method, re", [("ittc1957", 100.0), ("hughes", 105.0),
                                        ("prandtl_schlichting", 0.5)])
def test_reynolds_at_a_line_pole_is_refused(method, re):
    # ITTC-1957: log10(100) - 2 = 0; Hughes: log10 Re - 2.03 <= 0; Prandtl-Schlichting: log Re <= 0
    with pytest.raises(InputError, match="pole"):
        friction_coefficient(re, method)


def test_nan_reynolds_is_refused():
    with pytest.raises(InputError, match="reynolds"):
        friction_coefficient([1e6, np.nan])


@given(st.floats(min_value=5.0, max_value=10.0), st.floats(min_value=1e-3, max_value=1.0))
def test_turbulent_lines_fall_with_reynolds(log_re, step):
    # Property of every published turbulent line: C_F decreases monotonically with Re
    lo, hi = 10.0**log_re, 10.0 ** (log_re + step)
    for method in FRICTION_LINES:
        assert friction_coefficient(hi, method) < friction_coefficient(lo, method)


@given(st.floats(min_value=3.0, max_value=11.0))
def test_schoenherr_residual_is_below_1e_12(log_re):
    # Schoenherr (1932) equation solved exactly
    re = 10.0**log_re
    cf = friction_coefficient(re, "schoenherr")
    assert abs(schoenherr_residual(re, cf)) < 1e-12


def test_flow_regime_bands():
    # Flat-plate transition band about 5e5 to 5e6 (Schlichting & Gersten, Boundary-Layer
    # Theory, 8th ed. 2000)
    assert flow_regime(1e5) == "laminar"
    assert flow_regime(1e6) == "transitional"
    assert flow_regime(1e7) == "turbulent"
    assert list(flow_regime([1e5, 1e6, 1e7])) == ["laminar", "transitional", "turbulent"]


def test_minimum_model_reynolds_is_the_planning_heuristic():
    # Common practice (from memory): keep model Re above 2e6 to 3e6 at the lowest speed
    assert 2e6 <= MIN_TURBULENT_MODEL_REYNOLDS <= 3e6
    assert flow_regime(MIN_TURBULENT_MODEL_REYNOLDS) == "transitional"


def test_stimulation_advice_gives_stud_size_and_position():
    # Hughes & Allan (1951) studs 3.2 mm x 2.5 mm at 25 mm pitch; 5 % L_PP of a 5 m model
    text = turbulence_stimulation_advice(5.0)
    assert "3.2 mm" in text and "2.5 mm" in text and "25 mm" in text
    assert "250 mm" in text


def test_stimulation_advice_refuses_a_nonpositive_length():
    with pytest.raises(InputError, match="length_m"):
        turbulence_stimulation_advice(0.0)

"""Wave spectra, periods, dispersion and Froude scaling of waves (similitude.correlations.waves)."""

import math

import numpy as np
import pytest
from scipy.optimize import brentq

from similitude.correlations import waves
from similitude.errors import InputError

G = 9.80665


def _grid(tp, n=200001):
    wp = 2 * math.pi / tp
    return np.linspace(0.05 * wp, 30 * wp, n)


# -- ITTC two-parameter spectrum -------------------------------------------------------------
def test_ittc_spectrum_area_is_hs_squared_over_16():
    # ITTC 1978 (15th ITTC Seakeeping Committee): A = 173 H^2/T1^4, B = 691/T1^4, so
    # m0 = A/(4B) = 173/2764 H^2 = 0.06259 H^2, i.e. H_m0 = 4 sqrt(m0) ~ H_1/3 within 0.1 %.
    hs, t1 = 4.0, 9.0
    w = np.geomspace(0.05, 40, 400001)
    m0 = waves.spectral_moment(w, waves.ittc_spectrum(w, hs, t1))
    assert m0 == pytest.approx(173.0 / (4 * 691.0) * hs**2, rel=1e-4)
    assert 4 * math.sqrt(m0) == pytest.approx(hs, rel=1.5e-3)


def test_ittc_spectrum_mean_period_is_its_parameter_t1():
    # T1 = 2 pi m0/m1 is the period the ITTC 1978 formula is written with.
    hs, t1 = 3.0, 8.0
    w = np.geomspace(0.05, 200, 400001)
    s = waves.ittc_spectrum(w, hs, t1)
    m0, m1 = waves.spectral_moment(w, s, 0), waves.spectral_moment(w, s, 1)
    assert 2 * math.pi * m0 / m1 == pytest.approx(t1, rel=1e-3)


def test_pierson_moskowitz_zero_crossing_period_is_0_710_peak_period():
    # Published ratio for the ITTC / Pierson-Moskowitz shape: T_z = 0.710 T_p, T_1 = 0.772 T_p
    # (ITTC 1978; DNV-RP-C205 2010 sec. 3.5.5: T_z/T_p = 0.710 for gamma = 1).
    t1, tz = waves.period_ratios("ittc")
    assert tz == pytest.approx(0.710, abs=5e-4)
    assert t1 == pytest.approx(0.772, abs=5e-4)


def test_pierson_moskowitz_form_equals_ittc_form_with_t1_0772_tp():
    # DNV-RP-C205 (2010) eq. 3.5.5.1 written with H_s, omega_p is the ITTC 1978 spectrum.
    # (A = 173, B = 691 are the rounded constants, so compare near and above the peak.)
    tp, hs = 10.0, 3.0
    w = np.linspace(0.5, 3.0, 50)
    t1 = waves.convert_period(tp, "peak", "mean", spectrum="ittc")
    np.testing.assert_allclose(waves.pierson_moskowitz_spectrum(w, hs, tp),
                               waves.ittc_spectrum(w, hs, t1), rtol=2e-3)


# -- JONSWAP -----------------------------------------------------------------------------------
def test_jonswap_with_dnv_normalisation_keeps_m0_within_one_percent_of_hs2_16():
    # DNV-RP-C205 (2010) sec. 3.5.5.2: A_gamma = 1 - 0.287 ln(gamma) normalises the JONSWAP
    # spectrum to H_s (approximately).
    hs, tp = 5.0, 11.0
    w = _grid(tp)
    for gamma in (1.0, 2.0, 3.3, 5.0):
        m0 = waves.spectral_moment(w, waves.jonswap_spectrum(w, hs, tp, gamma=gamma))
        assert m0 == pytest.approx(hs**2 / 16, rel=0.012)


def test_jonswap_exact_normalisation_gives_hs_exactly():
    # definition of H_m0 = 4 sqrt(m0) (DNV-RP-C205 sec. 3.5.5)
    hs, tp = 2.0, 8.0
    w = _grid(tp)
    s = waves.jonswap_spectrum(w, hs, tp, gamma=3.3, normalise="exact")
    assert 4 * math.sqrt(waves.spectral_moment(w, s)) == pytest.approx(hs, rel=1e-4)


def test_jonswap_with_gamma_one_is_pierson_moskowitz():
    # Hasselmann et al. (1973): gamma = 1 removes the peak enhancement.
    w = np.linspace(0.2, 3.0, 40)
    np.testing.assert_allclose(waves.jonswap_spectrum(w, 3.0, 9.0, gamma=1.0),
                               waves.pierson_moskowitz_spectrum(w, 3.0, 9.0), rtol=1e-12)


def test_jonswap_peak_is_at_the_peak_period():
    tp = 9.0
    w = np.linspace(0.3, 1.5, 120001)
    s = waves.jonswap_spectrum(w, 3.0, tp, gamma=3.3)
    assert w[np.argmax(s)] == pytest.approx(2 * math.pi / tp, rel=1e-4)


def test_jonswap_gamma_3_3_peak_is_3_3_times_pierson_moskowitz_times_a_gamma():
    # At omega_p the enhancement factor is gamma itself (Hasselmann et al. 1973).
    tp, hs = 10.0, 4.0
    wp = 2 * math.pi / tp
    ratio = waves.jonswap_spectrum(wp, hs, tp, 3.3) / waves.pierson_moskowitz_spectrum(wp, hs, tp)
    assert float(ratio) == pytest.approx(3.3 * (1 - 0.287 * math.log(3.3)), rel=1e-12)


def test_jonswap_gamma_3_3_zero_crossing_ratio_matches_imo_1_285():
    # IMO MSC.141(76), Annex 4.1: JONSWAP gamma = 3.3 with T_z = T_p / 1.285 (0.778).
    _, tz = waves.period_ratios("jonswap", 3.3)
    assert tz == pytest.approx(1 / 1.285, rel=2e-3)


@pytest.mark.parametrize("gamma", [1.0, 2.0, 3.3, 5.0, 6.0])
def test_jonswap_period_ratios_match_dnv_fits(gamma):
    # DNV-RP-C205 (2010) sec. 3.5.5.4 polynomial fits of T_z/T_p and T_1/T_p in gamma.
    t1, tz = waves.period_ratios("jonswap", gamma)
    t1_dnv, tz_dnv = waves.jonswap_period_ratios_dnv(gamma)
    assert tz == pytest.approx(float(tz_dnv), rel=3e-3)
    assert t1 == pytest.approx(float(t1_dnv), rel=3e-3)


def test_convert_period_round_trips():
    tz = waves.convert_period(12.0, "peak", "zero_crossing", "jonswap", 2.0)
    assert float(waves.convert_period(tz, "zero_crossing", "peak", "jonswap", 2.0)) == (
        pytest.approx(12.0, rel=1e-12))


def test_unknown_spectrum_is_a_one_line_input_error():
    with pytest.raises(InputError, match="spectrum: 'bretschneider' is unknown"):
        waves.spectrum(1.0, 1.0, 8.0, kind="bretschneider")


# -- dispersion ----------------------------------------------------------------------------------
def test_deep_water_wave_length_is_g_t2_over_2pi():
    # Dean & Dalrymple (1991) eq. 3.21 deep-water limit: L0 = g T^2 / (2 pi), the textbook
    # "L0 = 1.56 T^2 m" (g = 9.81 m/s^2 there, hence 0.05 % tolerance).
    assert float(waves.wave_length(10.0)) == pytest.approx(G * 100 / (2 * math.pi), rel=1e-14)
    assert float(waves.wave_length(10.0)) == pytest.approx(156.13, rel=5e-4)


@pytest.mark.parametrize("period,depth", [(1.0, 0.5), (2.0, 1.0), (8.0, 20.0), (12.0, 5.0),
                                          (20.0, 3000.0), (0.5, 0.05)])
def test_finite_depth_wave_number_matches_independent_root_finding(period, depth):
    # omega^2 = g k tanh(k h) solved independently (scipy brentq, a bracketing method).
    w = 2 * math.pi / period
    k_ref = brentq(lambda k: G * k * math.tanh(k * depth) - w**2, 1e-9, 1e4, xtol=1e-15,
                   rtol=1e-15)
    assert float(waves.wave_number(w, depth)) == pytest.approx(k_ref, rel=1e-12)


def test_wave_number_matches_a_hand_newton_solution():
    # Hand Newton iteration from k0 = omega^2/g for T = 10 s, h = 10 m
    # (Dean & Dalrymple 1991, dispersion relation eq. 3.21).
    w, h = 2 * math.pi / 10.0, 10.0
    k = w**2 / G
    for _ in range(40):
        f = G * k * math.tanh(k * h) - w**2
        k -= f / (G * math.tanh(k * h) + G * k * h / math.cosh(k * h) ** 2)
    assert float(waves.wave_number(w, h)) == pytest.approx(k, rel=1e-13)
    # and the textbook shallow-water length check: L = 92.3 m for T = 10 s at h = 10 m
    # (Dean & Dalrymple 1991, Table/worked example value, from memory: about 92 m).
    assert 2 * math.pi / k == pytest.approx(92.3, abs=0.2)


def test_wave_number_is_vectorised():
    w = np.array([[0.5, 1.0], [2.0, 4.0]])
    h = np.array([1.0, 50.0])
    k = waves.wave_number(w, h)
    assert k.shape == (2, 2)
    np.testing.assert_allclose(G * k * np.tanh(k * h), w**2, rtol=1e-13)


def test_wave_period_is_the_inverse_of_wave_length():
    for depth in (None, 2.0, 40.0):
        length = waves.wave_length(7.0, depth)
        assert float(waves.wave_period(length, depth)) == pytest.approx(7.0, rel=1e-12)


def test_steepness_is_height_over_length():
    assert waves.steepness(2.0, 100.0) == pytest.approx(0.02)


def test_head_sea_encounter_frequency_adds_k_u():
    # omega_e = omega - k U cos(mu) with mu = 180 deg head seas (ITTC Symbols 2017).
    w, u = 1.0, 5.0
    k = w**2 / G
    assert float(waves.encounter_frequency(w, u, 180.0)) == pytest.approx(w + k * u)
    assert float(waves.encounter_frequency(w, u, 90.0)) == pytest.approx(w)


# -- Froude scaling --------------------------------------------------------------------------------
def test_froude_scaling_of_waves():
    # Froude similitude: H ~ lambda, T ~ lambda^0.5, S(omega) ~ lambda^2.5 (derived from the
    # Froude scale factors: m0 ~ lambda^2, omega ~ lambda^-0.5).
    out = waves.froude_scale_waves(25.0, height=5.0, period=10.0, spectral_density=3.0)
    assert out["height"] == pytest.approx(0.2)
    assert out["period"] == pytest.approx(2.0)
    assert out["spectral_density"] == pytest.approx(3.0 / 25**2.5)
    back = waves.froude_scale_waves(25.0, height=0.2, period=2.0, to_model=False)
    assert back["height"] == pytest.approx(5.0) and back["period"] == pytest.approx(10.0)


def test_scaled_spectrum_is_the_spectrum_of_the_scaled_sea():
    # S_m(omega_m) = S_p(omega_p) / lambda^2.5 for the same spectrum shape with scaled H_s, T_p.
    lam, hs, tp = 36.0, 6.0, 12.0
    wp = np.linspace(0.2, 2.0, 30)
    s_p = waves.jonswap_spectrum(wp, hs, tp)
    s_m = waves.jonswap_spectrum(wp * math.sqrt(lam), hs / lam, tp / math.sqrt(lam))
    np.testing.assert_allclose(s_m, s_p / lam**2.5, rtol=1e-12)


def test_three_hour_sea_at_scale_36_lasts_30_minutes():
    # D_m = D_p / sqrt(lambda): 3 h / 6 = 30 min (Froude time scale).
    assert float(waves.model_sea_duration(3 * 3600, 36.0)) == pytest.approx(1800.0)


def test_runs_needed_for_a_sea_state_round_up():
    dm, n = waves.runs_for_duration(3 * 3600, 36.0, np.array([400.0, 1800.0, 0.0]))
    assert float(dm) == pytest.approx(1800.0)
    assert n.tolist() == [5, 1, 0]


def test_most_probable_highest_of_1000_rayleigh_waves_is_1_86_hs():
    # Longuet-Higgins (1952): H_max = H_s sqrt(ln N / 2); N = 1000: sqrt(6.9078/2) = 1.8585
    assert waves.most_probable_highest_wave(1.0, 1000) == pytest.approx(1.8585, abs=1e-4)
    assert waves.most_probable_highest_wave(4.0, 1000) == pytest.approx(4 * 1.8585, abs=4e-4)


def test_highest_wave_needs_more_than_one_wave():
    with pytest.raises(InputError, match="n_waves"):
        waves.most_probable_highest_wave(1.0, 1.0)


def test_waves_in_three_hours_of_a_jonswap_sea_use_its_zero_crossing_period():
    # IMO MSC.141(76) Annex §4.1: JONSWAP gamma 3.3 has T_z = T_p/1.285; 3 h at T_p = 9 s:
    # N = 10800/(9/1.285) = 1542.
    assert waves.waves_in_duration(10800.0, 9.0) == pytest.approx(10800 / (9 / 1.285), rel=2e-3)

"""Ocean waves for model tests: spectra, periods, dispersion and Froude scaling of waves.

Plain functions of SI floats or numpy arrays: angular frequency omega [rad/s], periods [s],
heights and lengths [m], spectral density S(omega) [m^2 s/rad].

References
----------
.. [1] ITTC, "Report of the Seakeeping Committee", Proc. 15th ITTC, The Hague, 1978
       (ITTC two-parameter spectrum).
.. [2] Hasselmann, K. et al., "Measurements of wind-wave growth and swell decay during the
       Joint North Sea Wave Project (JONSWAP)", Dtsch. Hydrogr. Z., Reihe A, 8(12), 1973.
.. [3] DNV, "Environmental conditions and environmental loads", Recommended Practice
       DNV-RP-C205, 2010 (sec. 3.5.5) and 2021 edition.
.. [4] Dean, R. G. and Dalrymple, R. A., "Water Wave Mechanics for Engineers and Scientists",
       World Scientific, 1991, ch. 3 (linear dispersion relation).
.. [5] IMO, Resolution MSC.141(76), 2002, Annex sec. 4.1 (JONSWAP gamma = 3.3,
       T_z = T_p / 1.285).
.. [6] Longuet-Higgins, M. S., "On the statistical distribution of the heights of sea
       waves", J. Marine Research 11 (1952) 245-266 (Rayleigh distribution of wave heights in
       a narrow-band sea; the highest of N consecutive waves).
.. [7] US Army Corps of Engineers, Coastal Engineering Manual, EM 1110-2-1100, Part II,
       2002, Table II-5-1 (wave classification after Ippen 1966: deep water for
       h/L from 1/2).
"""

from __future__ import annotations

import functools
import math

import numpy as np

from similitude.constants import G0
from similitude.errors import InputError

#: Spectrum names understood by :func:`spectrum`.
SPECTRA = ("jonswap", "ittc")

#: Period names understood by :func:`convert_period`.
PERIODS = ("peak", "mean", "zero_crossing")

_TWO_PI = 2.0 * math.pi


# -- spectra ------------------------------------------------------------------------------
def ittc_spectrum(omega, significant_height, mean_period):
    """ITTC two-parameter wave spectrum (modified Pierson-Moskowitz / Bretschneider).

    Parameters
    ----------
    omega : numeric
        Angular frequency [rad/s], > 0.
    significant_height : numeric
        Significant wave height H_1/3 [m].
    mean_period : numeric
        Mean (centroid) period T_1 = 2 pi m0/m1 [s].

    Returns
    -------
    numeric
        Spectral density S(omega) [m^2 s/rad].

    Notes
    -----
    S(omega) = A omega^-5 exp(-B omega^-4), A = 173 H^2 / T_1^4, B = 691 / T_1^4 [1]_.
    Then m0 = 173/(4 * 691) H^2 = 0.0626 H^2 (about H^2/16), T_1 = 0.772 T_p, T_z = 0.710 T_p.

    References
    ----------
    .. [1] ITTC, Proc. 15th ITTC, Seakeeping Committee, 1978.
    """
    w = np.asarray(omega, dtype=float)
    t1 = np.asarray(mean_period, dtype=float)
    a = 173.0 * np.square(significant_height) / t1**4
    b = 691.0 / t1**4
    with np.errstate(divide="ignore", over="ignore", invalid="ignore"):
        s = a * w**-5 * np.exp(-b * w**-4)
    return np.where(w > 0, s, 0.0)


def pierson_moskowitz_spectrum(omega, significant_height, peak_period):
    """Pierson-Moskowitz spectrum written with H_s and T_p.

    Notes
    -----
    S(omega) = (5/16) H_s^2 omega_p^4 omega^-5 exp[-1.25 (omega_p/omega)^4],
    omega_p = 2 pi / T_p; the same shape as the ITTC spectrum with B = 1.25 omega_p^4 [3]_.
    Units: omega [rad/s], H_s [m], T_p [s]; returns [m^2 s/rad].

    References
    ----------
    .. [3] DNV-RP-C205 (2010), sec. 3.5.5.1.
    """
    w = np.asarray(omega, dtype=float)
    wp = _TWO_PI / np.asarray(peak_period, dtype=float)
    with np.errstate(divide="ignore", over="ignore", invalid="ignore"):
        s = 5.0 / 16.0 * np.square(significant_height) * wp**4 * w**-5 * np.exp(
            -1.25 * (wp / w) ** 4)
    return np.where(w > 0, s, 0.0)


def jonswap_normalisation(gamma):
    """DNV normalising factor A_gamma = 1 - 0.287 ln(gamma) [-] of the JONSWAP spectrum.

    Keeps m0 close to H_s^2/16 for 1 <= gamma <= 7 [3]_ (within about 1 %).

    References
    ----------
    .. [3] DNV-RP-C205 (2010), sec. 3.5.5.2.
    """
    return 1.0 - 0.287 * np.log(gamma)


def jonswap_spectrum(omega, significant_height, peak_period, gamma=3.3, sigma_a=0.07,
                     sigma_b=0.09, normalise="dnv"):
    """JONSWAP spectrum S(omega) [m^2 s/rad].

    Parameters
    ----------
    omega : numeric
        Angular frequency [rad/s].
    significant_height : float
        H_s [m].
    peak_period : float
        T_p [s].
    gamma : float
        Peak enhancement factor [-] (3.3 is the mean JONSWAP value [2]_).
    sigma_a, sigma_b : float
        Spectral width parameters for omega <= omega_p and omega > omega_p [-].
    normalise : {"dnv", "exact"}
        ``"dnv"``: the factor A_gamma = 1 - 0.287 ln gamma of DNV-RP-C205 [3]_; ``"exact"``:
        scale numerically so that m0 = H_s^2/16 exactly.

    Notes
    -----
    S_J = A_gamma S_PM(omega) gamma^exp[-(omega - omega_p)^2 / (2 sigma^2 omega_p^2)],
    with S_PM of :func:`pierson_moskowitz_spectrum`. Valid for 1 <= gamma <= 7 and
    3.6 <= T_p/sqrt(H_s) <= 5 (DNV-RP-C205 guidance for the North Sea).

    References
    ----------
    .. [2] Hasselmann et al. (1973).
    .. [3] DNV-RP-C205 (2010), sec. 3.5.5.2; (2021), sec. 3.5.5.
    """
    if not gamma >= 1.0:
        raise InputError(f"gamma: {gamma!r} is not valid; expected a peak enhancement >= 1")
    w = np.asarray(omega, dtype=float)
    wp = _TWO_PI / float(peak_period)
    sigma = np.where(w <= wp, sigma_a, sigma_b)
    shape = np.exp(-np.square(w - wp) / (2.0 * sigma**2 * wp**2))
    s = pierson_moskowitz_spectrum(w, significant_height, peak_period) * gamma**shape
    if normalise == "dnv":
        return jonswap_normalisation(gamma) * s
    if normalise == "exact":
        grid = np.linspace(0.05 * wp, 12.0 * wp, 20001)
        ref = _jonswap_shape_m0(grid, wp, gamma, sigma_a, sigma_b)
        return s * (1.0 / 16.0) / ref
    raise InputError(f"normalise: {normalise!r} is unknown; expected 'dnv' or 'exact'")


def _jonswap_shape_m0(grid, wp, gamma, sigma_a, sigma_b):
    # m0 of the unnormalised spectrum for H_s = 1 m
    sigma = np.where(grid <= wp, sigma_a, sigma_b)
    shape = np.exp(-np.square(grid - wp) / (2.0 * sigma**2 * wp**2))
    s = pierson_moskowitz_spectrum(grid, 1.0, _TWO_PI / wp) * gamma**shape
    return float(np.trapezoid(s, grid))


def spectrum(omega, significant_height, peak_period, kind="jonswap", gamma=3.3):
    """Wave spectrum by name: ``"jonswap"`` (with gamma) or ``"ittc"`` (two-parameter).

    The ITTC spectrum is parametrised here by T_p through T_1 = 0.772 T_p (exact ratio
    (4/5)^(1/4)/Gamma(3/4) of the spectral shape). Units as :func:`jonswap_spectrum`.
    """
    if kind == "jonswap":
        return jonswap_spectrum(omega, significant_height, peak_period, gamma=gamma)
    if kind == "ittc":
        t1 = convert_period(peak_period, "peak", "mean", spectrum="ittc")
        return ittc_spectrum(omega, significant_height, t1)
    raise InputError(f"spectrum: {kind!r} is unknown; expected one of " + ", ".join(SPECTRA))


def spectral_moment(omega, density, order=0):
    """Spectral moment m_n = integral of omega^n S(omega) d omega (trapezoidal rule).

    Parameters
    ----------
    omega : array_like
        Increasing angular frequencies [rad/s].
    density : array_like
        S(omega) [m^2 s/rad].
    order : int
        n [-].

    Returns
    -------
    float
        m_n [m^2 (rad/s)^n]; H_m0 = 4 sqrt(m0), T_1 = 2 pi m0/m1, T_z = 2 pi sqrt(m0/m2).
    """
    w = np.asarray(omega, dtype=float)
    return float(np.trapezoid(w**order * np.asarray(density, dtype=float), w))


@functools.lru_cache(maxsize=64)  # a pure function of two scalars, evaluated in the solver loop
def period_ratios(kind="jonswap", gamma=3.3):
    """Ratios T_1/T_p and T_z/T_p [-] of a spectrum shape, by numerical integration.

    For the ITTC/Pierson-Moskowitz shape the exact values are T_1/T_p = (4/5)^(1/4)/Gamma(3/4)
    = 0.7718 and T_z/T_p = (4/(5 pi))^(1/4) = 0.7104 [1]_; for JONSWAP gamma = 3.3 about
    0.834 and 0.778 ([3]_, [5]_).

    Returns
    -------
    tuple of float
        (T_1/T_p, T_z/T_p).
    """
    if kind == "ittc":
        return ((0.8) ** 0.25 / math.gamma(0.75), (4.0 / (5.0 * math.pi)) ** 0.25)
    if kind != "jonswap":
        raise InputError(f"spectrum: {kind!r} is unknown; expected one of " + ", ".join(SPECTRA))
    wp = _TWO_PI
    # log-spaced grid: the omega^-5 tail converges slowly for m2
    w = np.geomspace(0.2 * wp, 200.0 * wp, 40001)
    s = jonswap_spectrum(w, 1.0, 1.0, gamma=gamma)
    m0, m1, m2 = (spectral_moment(w, s, n) for n in (0, 1, 2))
    # the tail beyond the grid: S ~ (5/16) A wp^4 w^-5 => add its moments analytically
    c = 5.0 / 16.0 * jonswap_normalisation(gamma) * wp**4
    wmax = w[-1]
    m0 += c * wmax**-4 / 4.0
    m1 += c * wmax**-3 / 3.0
    m2 += c * wmax**-2 / 2.0
    return (_TWO_PI * m0 / m1, _TWO_PI * math.sqrt(m0 / m2))


def jonswap_period_ratios_dnv(gamma):
    """DNV-RP-C205 fits (sec. 3.5.5.4): T_1/T_p and T_z/T_p [-] for 1 <= gamma < 7.

    T_z/T_p = 0.6673 + 0.05037 g - 0.006230 g^2 + 0.0003341 g^3,
    T_1/T_p = 0.7303 + 0.04936 g - 0.006556 g^2 + 0.0003610 g^3 (g = gamma) [3]_.
    """
    g = np.asarray(gamma, dtype=float)
    tz = 0.6673 + 0.05037 * g - 0.006230 * g**2 + 0.0003341 * g**3
    t1 = 0.7303 + 0.04936 * g - 0.006556 * g**2 + 0.0003610 * g**3
    return t1, tz


def convert_period(period, from_="peak", to="zero_crossing", spectrum="jonswap", gamma=3.3):
    """Convert between peak T_p, mean T_1 and mean zero-crossing T_z periods [s].

    Parameters
    ----------
    period : numeric
        Period [s] of type ``from_``.
    from_, to : {"peak", "mean", "zero_crossing"}
    spectrum : {"jonswap", "ittc"}
    gamma : float
        JONSWAP peak enhancement [-].
    """
    for name, value in (("from_", from_), ("to", to)):
        if value not in PERIODS:
            raise InputError(f"{name}: {value!r} is unknown; expected one of "
                             + ", ".join(PERIODS))
    t1, tz = period_ratios(spectrum, gamma)
    ratio = {"peak": 1.0, "mean": t1, "zero_crossing": tz}
    return np.multiply(period, ratio[to] / ratio[from_])


# -- dispersion ---------------------------------------------------------------------------
def wave_number(omega, depth=None, g=G0):
    """Wave number k [rad/m] from the linear dispersion relation omega^2 = g k tanh(k h).

    Parameters
    ----------
    omega : numeric
        Angular frequency [rad/s].
    depth : numeric or None
        Water depth h [m]; None (or inf) for deep water, k = omega^2/g.
    g : float
        Acceleration of gravity [m/s^2].

    Notes
    -----
    Solved by Newton iteration on f(k) = g k tanh(kh) - omega^2, vectorised, from the explicit
    approximation k = k0 / tanh((k0 h)^(3/4))^(2/3), k0 = omega^2/g (Fenton and McKee 1990,
    within 1.7 %), to machine precision in a few iterations [4]_.

    References
    ----------
    .. [4] Dean and Dalrymple (1991), eq. (3.21).
    .. [6] Fenton, J. D. and McKee, W. D., "On calculating the lengths of water waves",
           Coastal Engineering 14, 1990, 499-513.
    """
    w = np.asarray(omega, dtype=float)
    k0 = w**2 / g
    if depth is None:
        return k0
    h = np.asarray(depth, dtype=float)
    if np.all(np.isinf(h)):
        return np.broadcast_to(k0, np.broadcast(w, h).shape).copy()
    h = np.where(np.isinf(h), 1e12, h)
    # explicit start of Fenton and McKee (1990), within 1.7 % of the root, then Newton
    with np.errstate(divide="ignore", invalid="ignore"):
        k = np.where(k0 > 0, k0 / np.tanh((k0 * h) ** 0.75) ** (2.0 / 3.0), 0.0)
    for _ in range(50):
        th = np.tanh(k * h)
        f = g * k * th - w**2
        df = g * th + g * k * h * (1.0 - th**2)
        step = np.divide(f, df, out=np.zeros_like(f), where=df > 0)
        k = k - step
        if np.all(np.abs(step) <= 1e-14 * np.abs(k)):
            break
    return k


def wave_length(period, depth=None, g=G0):
    """Wave length L_w = 2 pi / k [m] of a wave of period [s] in water of depth [m]."""
    return _TWO_PI / wave_number(_TWO_PI / np.asarray(period, dtype=float), depth, g)


def wave_period(length, depth=None, g=G0):
    """Period [s] of a wave of length [m] (closed form: omega^2 = g k tanh(k h))."""
    k = _TWO_PI / np.asarray(length, dtype=float)
    th = 1.0 if depth is None else np.tanh(k * np.asarray(depth, dtype=float))
    return _TWO_PI / np.sqrt(g * k * th)


def phase_speed(period, depth=None, g=G0):
    """Phase speed c = L_w / T [m/s]."""
    return wave_length(period, depth, g) / np.asarray(period, dtype=float)


def steepness(height, length):
    """Wave steepness H / L_w [-] (height [m] over wave length [m])."""
    return np.divide(height, length)


def encounter_frequency(omega, speed, heading_deg, depth=None, g=G0):
    """Encounter frequency omega_e = omega - k U cos(mu) [rad/s].

    Heading mu [deg] is measured so that 180 deg is head seas and 0 deg following seas (ITTC
    Symbols and Terminology); speed U [m/s]; omega [rad/s]; depth [m] or None.
    """
    k = wave_number(omega, depth, g)
    return np.abs(np.asarray(omega, dtype=float)
                  - k * np.asarray(speed, dtype=float) * np.cos(np.radians(heading_deg)))


# -- Froude scaling -----------------------------------------------------------------------
def froude_scale_waves(scale, height=None, period=None, spectral_density=None,
                       to_model=True):
    """Froude scaling of wave quantities: H, L_w ~ lambda; T ~ lambda^0.5; S(omega) ~ lambda^2.5.

    Parameters
    ----------
    scale : float
        lambda = L_prototype / L_model [-].
    height, period, spectral_density : numeric or None
        Heights or lengths [m], periods [s], spectral ordinates S(omega) [m^2 s/rad].
    to_model : bool
        True: full scale -> model; False: model -> full scale.

    Returns
    -------
    dict
        ``{"height", "period", "spectral_density"}`` (None where not given).

    Notes
    -----
    With omega ~ lambda^-0.5 and m0 ~ lambda^2, S(omega) = dm0/domega ~ lambda^2.5.
    """
    f = 1.0 / scale if to_model else scale

    def sc(v, p):
        return None if v is None else np.multiply(v, f**p)

    return {"height": sc(height, 1.0), "period": sc(period, 0.5),
            "spectral_density": sc(spectral_density, 2.5)}


#: Relative depth h/L from which waves are deep-water waves [-] [7]_.
DEEP_WATER_RELATIVE_DEPTH = 0.5


def most_probable_highest_wave(significant_height, n_waves):
    """Most probable highest of ``n_waves`` Rayleigh-distributed wave heights [m].

    H_max = H_s sqrt(ln N / 2) [6]_.

    Parameters
    ----------
    significant_height : numeric
        H_s = 4 sqrt(m0) [m].
    n_waves : numeric
        Number of waves N in the record [-], > 1 (e.g. duration / T_z).

    Notes
    -----
    With Rayleigh heights, P(H > h) = exp(-h^2/H_rms^2) and H_s = sqrt(2) H_rms; the mode of
    the largest of N independent heights is close to H_rms sqrt(ln N) for large N, hence
    H_s sqrt(ln N / 2): 1.86 H_s for N = 1000, 1.92 H_s for N = 1543 [6]_.
    """
    n = np.asarray(n_waves, dtype=float)
    if np.any(~(n > 1)):
        raise InputError(f"n_waves: {n_waves!r} is not valid; expected more than one wave")
    return np.multiply(significant_height, np.sqrt(np.log(n) / 2.0))


def waves_in_duration(duration, peak_period, spectrum="jonswap", gamma=3.3):
    """Number of waves N = D / T_z [-] in a sea of duration D [s] and peak period T_p [s].

    T_z is the mean zero-crossing period of the spectrum (:func:`convert_period`); N is the
    same at model and full scale under Froude scaling (both D and T_z scale as sqrt(lambda)).
    """
    return np.divide(duration, convert_period(peak_period, "peak", "zero_crossing", spectrum,
                                              gamma))


def model_sea_duration(full_scale_duration, scale):
    """Model-scale duration [s] of a full-scale sea state duration [s]: D_m = D_p / sqrt(lambda)."""
    return np.divide(full_scale_duration, np.sqrt(scale))


def runs_for_duration(full_scale_duration, scale, run_time):
    """Model duration [s] and number of runs needed when each run lasts ``run_time`` [s].

    A run in a towing tank or a basin with a moving model is limited by the length of the
    facility; the irregular sea is realised over several runs with different random phases
    (or consecutive parts of one time series), so n = ceil(D_m / t_run).

    Returns
    -------
    tuple
        (model duration [s], number of runs [-] as an integer array; 0 where run_time <= 0
        means impossible).
    """
    dm = model_sea_duration(full_scale_duration, scale)
    rt = np.asarray(run_time, dtype=float)
    ok = (rt > 0) & np.isfinite(dm)
    with np.errstate(divide="ignore", invalid="ignore"):
        n = np.where(ok, np.ceil(dm / np.where(ok, rt, 1.0) - 1e-9), 0)
    return dm, n.astype(int)

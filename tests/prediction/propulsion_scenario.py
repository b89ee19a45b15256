"""An invented hull and propeller with known propulsion factors, for the round-trip tests.

Not a test module. Everything is generated here by hand from published forms, independent of
the package's analysis code: the hull's model resistance C_TM = (1+k) C_F57(Re) + y Fn^4 (the
shape Prohaska's method assumes, so its fit recovers k exactly), a quadratic open-water curve,
and self-propulsion runs from the 1978 ITTC relations read backwards (ITTC 7.5-02-03-01.4 Rev 04
2017): T (N) (1 - t) = R_TM - F, thrust identity K_T(J) = T/(rho n^2 D^4) with
J = V (1 - w)/(n D), Q = K_Q(J) rho n^2 D^5 / eta_R. Water properties from the iapws reference
library (IAPWS-95), not from the package.
"""

from __future__ import annotations

import math

import numpy as np
from iapws import IAPWS95

from similitude.prediction.extrapolation import ShipParticulars
from similitude.prediction.open_water import PropellerParticulars
from similitude.prediction.runs import OpenWaterRuns, ResistanceRuns, SelfPropulsionRuns

G = 9.80665
SCALE = 25.0
SHIP = ShipParticulars(length=100.0, wetted_surface=2500.0, scale=SCALE, transverse_area=250.0)
K_TRUE, Y_TRUE = 0.15, 0.05
KT = (0.45, -0.32, -0.10)     # K_T = 0.45 - 0.32 J - 0.10 J^2
KQ = (0.058, -0.030, -0.010)
PROP = PropellerParticulars(diameter=5.0, scale=SCALE, pitch_diameter=1.0, chord_diameter=0.3,
                            blades=4, thickness_chord=0.04)
D_M = 5.0 / SCALE
TEMP_R, TEMP_SP = 291.15, 292.15      # resistance and self-propulsion tests, K


def water(temperature: float) -> tuple[float, float]:
    """(rho, nu) of fresh water at 1 atm, IAPWS-95 (iapws library)."""
    w = IAPWS95(T=temperature, P=0.101325)
    return w.rho, w.mu / w.rho


def ittc57(re):
    return 0.075 / (np.log10(re) - 2.0) ** 2


def model_resistance(v, temperature):
    """R_TM [N] of the invented hull at model speeds v [m/s]."""
    rho, nu = water(temperature)
    lm, sm = SHIP.model_length, SHIP.model_wetted_surface
    fn = v / math.sqrt(G * lm)
    return ((1 + K_TRUE) * ittc57(v * lm / nu) + Y_TRUE * fn**4) * 0.5 * rho * sm * v**2


SP_FROUDE = np.array([0.16, 0.18, 0.20, 0.22, 0.24, 0.26])


def resistance_runs() -> ResistanceRuns:
    """Low-speed runs for the fit and the self-propulsion speeds themselves."""
    fn = np.concatenate([[0.10, 0.12, 0.14], SP_FROUDE])
    v = fn * math.sqrt(G * SHIP.model_length)
    return ResistanceRuns(tuple(str(i + 1) for i in range(v.size)), v,
                          model_resistance(v, TEMP_R), np.full(v.size, TEMP_R))


def open_water_runs(noise: float = 0.0, seed: int = 1) -> OpenWaterRuns:
    j = np.linspace(0.1, 1.0, 10)
    rng = np.random.default_rng(seed)
    kt = np.polynomial.polynomial.polyval(j, KT) * (1 + rng.normal(0, noise, j.size))
    kq = np.polynomial.polynomial.polyval(j, KQ) * (1 + rng.normal(0, noise, j.size))
    return OpenWaterRuns(tuple(str(i) for i in range(j.size)), j, kt, kq,
                         temperature=np.full(j.size, TEMP_R), rotation_rate=np.full(j.size, 15.0))


def self_propulsion_runs(w=0.25, t=0.18, eta_r=1.03, tow=(0.4,), propellers=1,
                         noise: float = 0.0, seed: int = 2, speeds=SP_FROUDE):
    """Runs from known factors: for each speed and each tow force (N, a fraction of R_TM)."""
    v = np.repeat(np.asarray(speeds) * math.sqrt(G * SHIP.model_length), len(tow))
    r = model_resistance(v, TEMP_SP)
    f = np.tile(tow, len(speeds)) * r
    thrust = (r - f) / (1.0 - t) / propellers
    rho, _ = water(TEMP_SP)
    va = v * (1.0 - w)
    tau = thrust / (rho * D_M**2 * va**2)
    c = tau - KT[2]                      # K_T(J) = tau J^2: c J^2 - a1 J - a0 = 0
    j = (KT[1] + np.sqrt(KT[1] ** 2 + 4.0 * c * KT[0])) / (2.0 * c)
    n = va / (j * D_M)
    torque = np.polynomial.polynomial.polyval(j, KQ) * rho * n**2 * D_M**5 / eta_r
    rng = np.random.default_rng(seed)
    thrust = thrust * (1 + rng.normal(0, noise, v.size))
    torque = torque * (1 + rng.normal(0, noise, v.size))
    return SelfPropulsionRuns(tuple(str(i + 1) for i in range(v.size)), v, n, thrust, torque,
                              f, np.full(v.size, TEMP_SP))

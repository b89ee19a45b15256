"""Formulas of the 1978 ITTC method, self-propulsion part: tow force, propulsion factors, loading.

Pure functions over SI floats or numpy arrays (any shape; they broadcast): the skin-friction
correction force F_D applied to the model in a self-propulsion test, the resistance corrected
to the self-propulsion test's temperature, thrust and torque coefficients, the model wake
fraction of thrust (or torque) identity, the thrust deduction fraction, the hull efficiency,
the propeller loading K_T/J^2 and the delivered power. The analysis
(:mod:`similitude.prediction.self_propulsion`) and the planner
(:mod:`similitude.planning.self_propulsion`) chain them; the full-scale wake is
:func:`similitude.correlations.ittc78.wake_fraction_full_scale`.

Revision followed: ITTC 7.5-02-03-01.4 "1978 ITTC Performance Prediction Method", Rev 04
(2017) [1]_ for the analysis and the full-scale prediction, and ITTC 7.5-02-03-01.1
"Propulsion/Bollard Pull Test", Rev 04 (2011) [2]_ for the tow force. Only the contents pages of
the stored copies of both procedures could be read (Rev 00 1999 of the first, Rev 01 2002 and
Rev 04 2011 of the second); the formula shapes are written from memory of the procedures
(medium-high confidence) and checked in the tests against hand calculations.

The skin-friction correction force
----------------------------------
The model is towed with F_D so that its propeller works at the ship's loading: with the model
resistance R_TM = ½ρ_M V_M² S_M C_TM, the ship's C_TS and ``T (1 - t) = R_TM - F_D``, the
model propeller thrust then corresponds to C_TS, i.e.

    F_D = ½ ρ_M V_M² S_M (C_TM - C_TS).

With C_TM = (1+k) C_FM + C_R and the ship's C_TS of the revised method this is the
``"revised"`` form

    F_D = ½ ρ_M V_M² S_M [(1+k) C_FM - (S+S_BK)/S ((1+k) C_FS + ΔC_F) - C_A - C_AAS],

which reduces, without bilge keels, to ½ρ_M V_M² S_M [(1+k)(C_FM - C_FS) - ΔC_F - C_A - C_AAS].
The ``"1978"`` form of the original method, where ΔC_F (Bowden-Davison) held the whole
allowance and air resistance was added afterwards, is
F_D = ½ ρ_M V_M² S_M [(1+k)(C_FM - C_FS) - ΔC_F]. C_FM is taken at the Reynolds number and
water temperature of the self-propulsion run.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 04, 2017 (analysis of the model test results; full-scale wake
       and operating condition of the propeller; model-ship correlation factors).
.. [2] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.1, "Propulsion/Bollard Pull
       Test", Rev 04, 2011 (§3.4.3 skin friction correction force; load varying and constant
       loading methods).
.. [3] ITTC, "ITTC Symbols and Terminology List", 2017 (K_T, K_Q, J, w_T, t, η_R, η_H).
"""

from __future__ import annotations

import numpy as np

from similitude.correlations.inputs import as_array as _arr
from similitude.correlations.inputs import check_method as _check_method
from similitude.correlations.inputs import scalar_or_array as _out

#: Forms of the skin-friction correction force: ``"revised"`` = ½ρV²S (C_TM - C_TS) with the
#: revised C_TS (ΔC_F, C_A, C_AAS, bilge keels); ``"1978"`` = ½ρV²S [(1+k)(C_FM - C_FS) - ΔC_F].
FRICTION_CORRECTION_FORMS = ("revised", "1978")

#: Identities by which the model wake fraction is read off the open-water curve.
IDENTITIES = ("thrust", "torque")


def friction_correction_force(density, speed, wetted_surface, cfm, cfs, form_factor, delta_cf,
                              ca=0.0, caas=0.0, bilge_keel_factor=1.0,
                              form: str = "revised"):
    r"""Skin-friction correction force F_D applied to the model at the ship self-propulsion
    point [N].

    .. math::
        F_D = \tfrac12 \rho_M V_M^2 S_M \left[(1+k) C_{FM}
              - \frac{S + S_{BK}}{S}\left((1+k) C_{FS} + \Delta C_F\right)
              - C_A - C_{AAS}\right] \quad \text{(revised)}

        F_D = \tfrac12 \rho_M V_M^2 S_M \left[(1+k)(C_{FM} - C_{FS}) - \Delta C_F\right]
              \quad \text{(1978)}

    Parameters
    ----------
    density : numeric
        Tank water density ρ_M at the test temperature [kg/m^3].
    speed : numeric
        Model speed V_M [m/s].
    wetted_surface : numeric
        Model wetted surface S_M [m^2].
    cfm, cfs : numeric
        Frictional coefficients of the model (at the test temperature) and of the ship [-].
    form_factor : numeric
        k [-] (0 for Froude's method).
    delta_cf, ca, caas : numeric
        Roughness allowance, correlation allowance and air resistance of the ship [-];
        ``ca`` and ``caas`` are not used by the ``"1978"`` form.
    bilge_keel_factor : numeric
        (S + S_BK)/S of the ship [-]; not used by the ``"1978"`` form.
    form : str
        One of :data:`FRICTION_CORRECTION_FORMS`.

    Returns
    -------
    numpy.ndarray or float
        F_D [N], positive when the model must be helped along (the usual case).

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017); ITTC 7.5-02-03-01.1 Rev 04 (2011), §3.4.3.
    """
    _check_method(form, FRICTION_CORRECTION_FORMS)
    k = _arr(form_factor, "form_factor")
    cfm = _arr(cfm, "cfm", positive=True)
    cfs = _arr(cfs, "cfs", positive=True)
    dcf = _arr(delta_cf, "delta_cf")
    if form == "1978":
        bracket = (1.0 + k) * (cfm - cfs) - dcf
    else:
        bk = _arr(bilge_keel_factor, "bilge_keel_factor", positive=True)
        bracket = ((1.0 + k) * cfm - bk * ((1.0 + k) * cfs + dcf) - _arr(ca, "ca")
                   - _arr(caas, "caas"))
    q = 0.5 * _arr(density, "density", positive=True) * _arr(speed, "speed") ** 2 * _arr(
        wetted_surface, "wetted_surface", positive=True)
    return _out(q * bracket)


def resistance_at_test_temperature(resistance, cfm, cfm_test, cr, form_factor):
    r"""Model resistance corrected to the water temperature of the self-propulsion test [N].

    .. math:: R_C = R_{TM}\,\frac{(1+k) C_{FMC} + C_R}{(1+k) C_{FM} + C_R}

    Parameters
    ----------
    resistance : numeric
        R_TM of the resistance test at the same speed [N].
    cfm : numeric
        C_FM of the resistance test (its temperature) [-].
    cfm_test : numeric
        C_FMC, C_FM at the temperature of the self-propulsion test [-].
    cr : numeric
        Residuary coefficient C_R [-].
    form_factor : numeric
        k [-].

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), analysis of the model test results.
    """
    k = _arr(form_factor, "form_factor")
    cr = _arr(cr, "cr")
    return _out(_arr(resistance, "resistance")
                * ((1.0 + k) * _arr(cfm_test, "cfm_test", positive=True) + cr)
                / ((1.0 + k) * _arr(cfm, "cfm", positive=True) + cr))


def thrust_coefficient(thrust, density, rotation_rate, diameter):
    """Thrust coefficient K_T = T/(ρ n² D⁴) [-]; T [N], ρ [kg/m^3], n [1/s] > 0, D [m] [3]_."""
    return _out(_arr(thrust, "thrust") / (
        _arr(density, "density", positive=True)
        * _arr(rotation_rate, "rotation_rate", positive=True) ** 2
        * _arr(diameter, "diameter", positive=True) ** 4))


def torque_coefficient(torque, density, rotation_rate, diameter):
    """Torque coefficient K_Q = Q/(ρ n² D⁵) [-]; Q [N m], ρ [kg/m^3], n [1/s] > 0, D [m] [3]_."""
    return _out(_arr(torque, "torque") / (
        _arr(density, "density", positive=True)
        * _arr(rotation_rate, "rotation_rate", positive=True) ** 2
        * _arr(diameter, "diameter", positive=True) ** 5))


def wake_fraction(advance_ratio, rotation_rate, diameter, speed):
    r"""Taylor wake fraction from the advance ratio of an identity [-].

    .. math:: w = 1 - \frac{J n D}{V}

    Parameters
    ----------
    advance_ratio : numeric
        J read off the open-water curve at the behind-hull K_T (thrust identity, w_T) or K_Q
        (torque identity, w_Q) [-].
    rotation_rate : numeric
        n [1/s].
    diameter : numeric
        D [m].
    speed : numeric
        Ship or model speed V [m/s] > 0.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017); ITTC Symbols and Terminology (2017).
    """
    return _out(1.0 - _arr(advance_ratio, "advance_ratio") * _arr(rotation_rate, "rotation_rate")
                * _arr(diameter, "diameter", positive=True) / _arr(speed, "speed", positive=True))


def thrust_deduction(thrust, tow_force, resistance):
    r"""Thrust deduction fraction t [-].

    .. math:: t = \frac{T_M + F_D - R_C}{T_M}

    Parameters
    ----------
    thrust : numeric
        Model propeller thrust T_M [N] > 0.
    tow_force : numeric
        Tow force F_D actually applied in the run [N].
    resistance : numeric
        Model resistance R_C at the run's speed and water temperature [N].

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), analysis of the model test results.
    """
    t = _arr(thrust, "thrust", positive=True)
    return _out((t + _arr(tow_force, "tow_force") - _arr(resistance, "resistance")) / t)


def hull_efficiency(thrust_deduction_fraction, wake):
    """Hull efficiency η_H = (1 - t)/(1 - w) [-] [1]_.

    References
    ----------
    .. [1] ITTC Symbols and Terminology List (2017).
    """
    return _out((1.0 - _arr(thrust_deduction_fraction, "thrust_deduction"))
                / (1.0 - _arr(wake, "wake")))


def propeller_loading(wetted_surface, diameter, cts, thrust_deduction_fraction, wake,
                      propellers=1):
    r"""Loading of the full-scale propeller K_T/J² [-].

    .. math:: \frac{K_T}{J^2} = \frac{S}{2 N D^2}\,\frac{C_{TS}}{(1 - t)(1 - w_{TS})^2}

    with N propellers sharing the thrust equally (N = 1 for a single-screw ship).

    Parameters
    ----------
    wetted_surface : numeric
        Ship wetted surface S [m^2] (the one C_TS is referred to).
    diameter : numeric
        Ship propeller diameter D [m].
    cts : numeric
        Total resistance coefficient of the ship [-].
    thrust_deduction_fraction, wake : numeric
        t and w_TS [-].
    propellers : int
        Number of propellers N.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), full-scale wake and operating condition of the
           propeller.
    """
    t = _arr(thrust_deduction_fraction, "thrust_deduction")
    w = _arr(wake, "wake")
    return _out(_arr(wetted_surface, "wetted_surface", positive=True) * _arr(cts, "cts")
                / (2.0 * _arr(propellers, "propellers", positive=True)
                   * _arr(diameter, "diameter", positive=True) ** 2 * (1.0 - t) * (1.0 - w) ** 2))


def delivered_power(density, diameter, rotation_rate, kq, eta_r, propellers=1):
    r"""Delivered power of N propellers P_D = 2π ρ D⁵ n³ K_Q/η_R · N [W].

    Parameters
    ----------
    density : numeric
        Sea-water density [kg/m^3].
    diameter : numeric
        Propeller diameter D [m].
    rotation_rate : numeric
        n [1/s].
    kq : numeric
        Open-water torque coefficient at the operating J [-] (the behind-hull one is K_Q/η_R).
    eta_r : numeric
        Relative rotative efficiency η_R [-] > 0.
    propellers : int
        N.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), full-scale wake and operating condition of the
           propeller.
    """
    return _out(2.0 * np.pi * _arr(density, "density", positive=True)
                * _arr(diameter, "diameter", positive=True) ** 5
                * _arr(rotation_rate, "rotation_rate") ** 3 * _arr(kq, "kq")
                / _arr(eta_r, "eta_r", positive=True) * _arr(propellers, "propellers"))


__all__ = [
    "FRICTION_CORRECTION_FORMS",
    "IDENTITIES",
    "delivered_power",
    "friction_correction_force",
    "hull_efficiency",
    "propeller_loading",
    "resistance_at_test_temperature",
    "thrust_coefficient",
    "thrust_deduction",
    "torque_coefficient",
    "wake_fraction",
]

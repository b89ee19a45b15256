"""Full-scale correction of propeller open-water characteristics (ITTC-1978 method).

The model propeller works at a chord Reynolds number one to two orders below the ship's, so its
blade sections have a larger drag coefficient. The 1978 ITTC method corrects the open-water
thrust and torque coefficients for the difference of the section drag at 0.75 R between model
and ship [1]_ [2]_. SI floats or numpy arrays in and out.

Formula shapes and constants (0.044, 5, 1.89, 1.62, -2.5, 0.3, 0.25, k_p = 30 µm) are from
memory of the procedure (medium-high confidence) and are checked in the tests against values
computed by hand from these forms.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 04, 2017, §2.4 "Propeller open water characteristics".
.. [2] ITTC, "Report of the Performance Committee", Proc. 15th ITTC, The Hague, 1978.
"""

from __future__ import annotations

import numpy as np

from similitude.correlations.inputs import as_array as _arr
from similitude.correlations.inputs import scalar_or_array as _out
from similitude.errors import InputError

#: Blade surface roughness of the full-scale propeller k_p [m] (ITTC 7.5-02-03-01.4 [1]).
DEFAULT_BLADE_ROUGHNESS = 30e-6




def chord_reynolds_075(chord_075, advance_speed, rotation_rate, diameter,
                       kinematic_viscosity):
    r"""Chord Reynolds number of a propeller blade at 0.75 R [-].

    .. math:: Re_{co} = \frac{c_{0.75}\sqrt{V_A^2 + (0.75\pi n D)^2}}{\nu}

    Parameters
    ----------
    chord_075 : numeric
        Blade chord at 0.75 R [m].
    advance_speed : numeric
        Advance speed V_A [m/s].
    rotation_rate : numeric
        Rate of revolutions n [1/s].
    diameter : numeric
        Propeller diameter D [m].
    kinematic_viscosity : numeric
        ν of the test water [m^2/s].

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), §2.4.
    """
    c = _arr(chord_075, "chord_075", positive=True)
    va = _arr(advance_speed, "advance_speed")
    n = _arr(rotation_rate, "rotation_rate", nonnegative=True)
    d = _arr(diameter, "diameter", positive=True)
    nu = _arr(kinematic_viscosity, "kinematic_viscosity", positive=True)
    return _out(c * np.hypot(va, 0.75 * np.pi * n * d) / nu)


def blade_drag_model(thickness_chord, reynolds_chord):
    r"""Section drag coefficient of the model propeller blade at 0.75 R [-].

    .. math:: C_{DM} = 2\left(1 + 2\frac{t}{c}\right)
              \left[\frac{0.044}{Re_{co}^{1/6}} - \frac{5}{Re_{co}^{2/3}}\right]

    Parameters
    ----------
    thickness_chord : numeric
        Maximum thickness over chord t/c at 0.75 R [-].
    reynolds_chord : numeric
        Model chord Reynolds number at 0.75 R,
        Re_co = c_0.75 sqrt(V_A^2 + (0.75 π n D)^2) / ν [-]; must be > 0. The ITTC asks for
        Re_co of at least 2e5 in open-water tests; below about 1e5 the bracket falls towards
        zero and the formula is meaningless.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), §2.4.
    """
    tc = _arr(thickness_chord, "thickness_chord", nonnegative=True)
    re = _arr(reynolds_chord, "reynolds_chord", positive=True)
    return _out(2.0 * (1.0 + 2.0 * tc) * (0.044 * re ** (-1.0 / 6.0) - 5.0 * re ** (-2.0 / 3.0)))


def blade_drag_full_scale(thickness_chord, chord, roughness=DEFAULT_BLADE_ROUGHNESS):
    r"""Section drag coefficient of the full-scale propeller blade at 0.75 R [-].

    .. math:: C_{DS} = 2\left(1 + 2\frac{t}{c}\right)
              \left(1.89 + 1.62 \log_{10}\frac{c}{k_p}\right)^{-2.5}

    Parameters
    ----------
    thickness_chord : numeric
        t/c at 0.75 R [-].
    chord : numeric
        Full-scale chord length c at 0.75 R [m].
    roughness : numeric
        Blade roughness k_p [m]; 30e-6 by default [1]_.

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), §2.4.
    """
    tc = _arr(thickness_chord, "thickness_chord", nonnegative=True)
    c = _arr(chord, "chord", positive=True)
    kp = _arr(roughness, "roughness", positive=True)
    return _out(2.0 * (1.0 + 2.0 * tc) * (1.89 + 1.62 * np.log10(c / kp)) ** -2.5)


def open_water_full_scale(J, KT, KQ, pitch_diameter, chord_diameter_075, z_blades,
                          thickness_chord, reynolds_chord_model, chord_075=None,
                          roughness=DEFAULT_BLADE_ROUGHNESS):
    r"""Full-scale open-water thrust and torque coefficients (ITTC-1978 correction).

    .. math::
        \Delta C_D = C_{DM} - C_{DS},\quad
        \Delta K_T = -\Delta C_D\,0.3\,\frac{P}{D}\,\frac{c Z}{D},\quad
        \Delta K_Q = \Delta C_D\,0.25\,\frac{c Z}{D},

        K_{TS} = K_{TM} - \Delta K_T,\quad K_{QS} = K_{QM} - \Delta K_Q

    with P/D and c at 0.75 R [1]_. A smoother full-scale section (ΔC_D > 0) raises K_T and
    lowers K_Q.

    Parameters
    ----------
    J : numeric
        Advance ratio [-] (carried for shape; the correction does not depend on it).
    KT, KQ : numeric
        Model open-water thrust and torque coefficients at J [-].
    pitch_diameter : numeric
        Pitch ratio P/D at 0.75 R [-].
    chord_diameter_075 : numeric
        Chord over diameter c/D at 0.75 R [-].
    z_blades : int
        Number of blades Z.
    thickness_chord : numeric
        t/c at 0.75 R [-].
    reynolds_chord_model : numeric
        Model chord Reynolds number at 0.75 R [-] (per run, or one value).
    chord_075 : numeric
        Full-scale chord at 0.75 R [m]; required (C_DS depends on c/k_p).
    roughness : numeric
        Full-scale blade roughness k_p [m].

    Returns
    -------
    (KT_s, KQ_s) : tuple of numpy.ndarray or float

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), §2.4.
    """
    if chord_075 is None:
        raise InputError("chord_075: missing; the full-scale blade drag needs the ship "
                         "propeller's chord at 0.75 R in m")
    z = _arr(z_blades, "z_blades", positive=True)
    _arr(J, "J")
    kt = _arr(KT, "KT")
    kq = _arr(KQ, "KQ")
    pd = _arr(pitch_diameter, "pitch_diameter", positive=True)
    cd_ = _arr(chord_diameter_075, "chord_diameter_075", positive=True)
    delta_cd = (np.asarray(blade_drag_model(thickness_chord, reynolds_chord_model))
                - np.asarray(blade_drag_full_scale(thickness_chord, chord_075, roughness)))
    solidity = cd_ * z
    delta_kt = -delta_cd * 0.3 * pd * solidity
    delta_kq = delta_cd * 0.25 * solidity
    return _out(kt - delta_kt), _out(kq - delta_kq)


def open_water_efficiency(J, KT, KQ):
    """Open-water efficiency η_0 = J K_T / (2π K_Q) [-]; J, K_T, K_Q [-], K_Q > 0.

    References
    ----------
    .. [1] ITTC, "ITTC Symbols and Terminology List", 2017 (η_0 definition).
    """
    return _out(_arr(J, "J") * _arr(KT, "KT") / (2.0 * np.pi * _arr(KQ, "KQ", positive=True)))


__all__ = [
    "DEFAULT_BLADE_ROUGHNESS",
    "blade_drag_full_scale",
    "blade_drag_model",
    "chord_reynolds_075",
    "open_water_efficiency",
    "open_water_full_scale",
]

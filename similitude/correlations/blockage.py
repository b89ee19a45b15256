"""Blockage corrections: towing-tank speed corrections and closed wind-tunnel blockage.

A model in a bounded stream sees a faster flow past it than the nominal carriage or tunnel
speed, because the walls (and, in a tank, the bottom and the free surface) constrain the
displacement flow and the wake. The corrections here give that speed increment as a fraction of
the nominal speed. SI floats or numpy arrays in, the same out.

Tank methods are those listed in ITTC Recommended Procedure 7.5-02-02-01 "Resistance Test",
§3.6.3 "Blockage and finite depth corrections" [1]_ (Schuster [2]_, Tamura [3]_; Scott is also
listed there but its exact form was not at hand and is not implemented). Wind-tunnel forms
follow Barlow, Rae & Pope [4]_, Maskell [5]_ and, for two-dimensional aerofoils, Allen &
Vincenti [6]_.

Confidence: the formula shapes below are from memory of the named sources and the ITTC
procedure (medium confidence); the default shape factors of the wind-tunnel solid blockage are
from memory of the charts in [4]_ (low confidence) — pass your own where it matters.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-02-01 "Resistance Test",
       Rev 03 (2011), §3.6.3 (later revisions keep the section).
.. [2] Schuster, S., "Beitrag zur Frage der Kanalkorrektur bei Modellversuchen",
       Schiffstechnik 3 (1955/56) 93-96.
.. [3] Tamura, K., "Study on the blockage correction", J. Society of Naval Architects of
       Japan 131 (1972) 17-28.
.. [4] Barlow, J. B., Rae, W. H. and Pope, A., "Low-Speed Wind Tunnel Testing", 3rd ed.,
       Wiley, 1999, ch. 9-10.
.. [5] Maskell, E. C., "A theory of the blockage effects on bluff bodies and stalled wings in
       a closed wind tunnel", ARC R&M 3400, 1963 (report dated 1965).
.. [6] Allen, H. J. and Vincenti, W. G., "Wall interference in a two-dimensional-flow wind
       tunnel, with consideration of the effect of compressibility", NACA Report 782, 1944.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from similitude.correlations.inputs import as_array as _array
from similitude.correlations.inputs import scalar_or_array as _out
from similitude.errors import InputError

#: Names accepted by ``tank_speed_correction(method=...)``.
TANK_BLOCKAGE_METHODS = ("schuster", "tamura")

#: Names accepted by ``wind_tunnel_blockage(method=...)``.
WIND_TUNNEL_METHODS = ("thom_pope", "maskell")

#: Body shape factor K of the 3-D solid blockage for a streamlined body of revolution of
#: fineness ratio about 6 [-] (Barlow, Rae & Pope 1999, ch. 10 chart; from memory, low
#: confidence).
DEFAULT_BODY_SHAPE_FACTOR = 0.96

#: Tunnel shape factor tau_1 of a closed test section of width/height about 1 to 1.4 with a
#: small model [-] (Barlow, Rae & Pope 1999, ch. 10 chart; from memory, low confidence).
DEFAULT_TUNNEL_SHAPE_FACTOR = 0.86

#: Maskell's bluff-body blockage constant for three-dimensional bluff bodies [-]
#: (Maskell 1963, as quoted by Barlow, Rae & Pope 1999; medium confidence).
MASKELL_EPSILON_3D = 2.5




def tank_speed_correction(blockage_ratio, depth_froude, method: str = "schuster",
                          length_over_width=None, viscous_fraction=None):
    r"""Towing-tank blockage speed correction ΔV/V [-].

    The model in the tank behaves as in unrestricted water at speed V (1 + ΔV/V), V being the
    carriage speed.

    Parameters
    ----------
    blockage_ratio : numeric
        m = A_X / (B_T h), the model's midship section area over the tank cross-section
        area [-]; 0 <= m < 1.
    depth_froude : numeric
        Depth Froude number F_h = V / sqrt(g h) [-], V the carriage speed, h the water depth.
    method : str
        ``"schuster"`` (Schuster 1955/56 [2]_) or ``"tamura"`` (Tamura 1972 [3]_), see Notes.
    length_over_width : numeric, optional
        Model length over model beam L/B [-]; required by ``"tamura"``.
    viscous_fraction : numeric, optional
        R_V/R_T, the viscous share of the model's total resistance [-], used by the wave term of
        ``"schuster"``. When omitted the wave term is taken at its upper bound
        (R_V/R_T = 0); the term grows as F_h^10 and matters only above F_h ≈ 0.6.

    Returns
    -------
    numpy.ndarray or float
        ΔV/V [-], positive (the model sees a faster flow than the carriage speed).

    Notes
    -----
    Schuster [2]_:

    .. math:: \frac{\Delta V}{V} = \frac{m}{1 - m - F_h^2}
              + \left(1 - \frac{R_V}{R_T}\right)\frac{2}{3} F_h^{10}

    Tamura [3]_:

    .. math:: \frac{\Delta V}{V} = 0.67\,m\,\frac{(L/B)^{3/4}}{1 - F_h^2}

    Both are listed in ITTC 7.5-02-02-01 §3.6.3 [1]_ (forms from memory, medium confidence).
    Both are sub-critical corrections: Schuster needs m + F_h^2 < 1 and Tamura F_h < 1;
    inputs at or beyond these limits raise :class:`~similitude.errors.InputError`.

    References
    ----------
    .. [1] ITTC 7.5-02-02-01 "Resistance Test", Rev 03 (2011), §3.6.3.
    .. [2] Schuster, S., Schiffstechnik 3 (1955/56) 93-96.
    .. [3] Tamura, K., J. Soc. Nav. Arch. Japan 131 (1972) 17-28.
    """
    if method not in TANK_BLOCKAGE_METHODS:
        raise InputError(f"method: got {method!r}; expected one of "
                         f"{', '.join(TANK_BLOCKAGE_METHODS)}")
    m = _array(blockage_ratio, "blockage_ratio", nonnegative=True)
    if np.any(m >= 1):
        raise InputError(f"blockage_ratio: got {float(np.max(m)):g}; expected a fraction "
                         "below 1 (model section area / tank section area)")
    fh = _array(depth_froude, "depth_froude", nonnegative=True)
    if method == "schuster":
        denom = 1.0 - m - fh**2
        if np.any(denom <= 0):
            raise InputError(
                "depth_froude: m + Fh^2 reaches 1 (critical flow in the tank); Schuster's "
                "correction holds only for m + Fh^2 < 1")
        if viscous_fraction is None:
            wave_share = 1.0
        else:
            rv = _array(viscous_fraction, "viscous_fraction", nonnegative=True)
            if np.any(rv > 1):
                raise InputError(f"viscous_fraction: got {float(np.max(rv)):g}; expected "
                                 "R_V/R_T between 0 and 1")
            wave_share = 1.0 - rv
        return _out(m / denom + wave_share * (2.0 / 3.0) * fh**10)
    if length_over_width is None:
        raise InputError("length_over_width: missing; Tamura's correction needs the model "
                         "length over beam L/B")
    lb = _array(length_over_width, "length_over_width", positive=True)
    if np.any(fh >= 1):
        raise InputError(f"depth_froude: got {float(np.max(fh)):g}; Tamura's correction holds "
                         "only for Fh < 1")
    return _out(0.67 * m * lb**0.75 / (1.0 - fh**2))


@dataclass(frozen=True)
class TunnelBlockage:
    """Closed wind-tunnel blockage of a model.

    Attributes
    ----------
    solid : numpy.ndarray or float
        Solid-blockage velocity increment ε_sb = ΔV/V [-].
    wake : numpy.ndarray or float
        Wake-blockage velocity increment ε_wb [-] (for Maskell's bluff-body method, the whole
        equivalent increment, which includes the solid blockage).
    total : numpy.ndarray or float
        ε = ε_sb + ε_wb [-]; corrected speed V_c = V_u (1 + ε).
    dynamic_pressure_ratio : numpy.ndarray or float
        q_c / q_u [-]: (1 + ε)^2 for Thom/Pope; 1 + ε_M C_D S/C for Maskell.
    method : str
        The method used.
    """

    solid: object
    wake: object
    total: object
    dynamic_pressure_ratio: object
    method: str = "thom_pope"


def wind_tunnel_blockage(model_volume, frontal_area, test_section_area, drag_coefficient,
                         method: str = "thom_pope",
                         shape_factor: float = DEFAULT_BODY_SHAPE_FACTOR,
                         tunnel_factor: float = DEFAULT_TUNNEL_SHAPE_FACTOR,
                         maskell_epsilon: float = MASKELL_EPSILON_3D,
                         test_section: str = "closed") -> TunnelBlockage:
    r"""Blockage of a three-dimensional model in a closed wind-tunnel test section.

    Parameters
    ----------
    model_volume : numeric
        Model volume V [m^3] (used by the solid blockage).
    frontal_area : numeric
        Model reference (frontal) area S on which ``drag_coefficient`` is based [m^2].
    test_section_area : numeric
        Test-section cross-section area C [m^2].
    drag_coefficient : numeric
        Uncorrected drag coefficient C_Du on area S [-].
    method : str
        ``"thom_pope"`` (streamlined bodies, Barlow, Rae & Pope [1]_) or ``"maskell"``
        (bluff bodies with separated wakes, Maskell [2]_).
    shape_factor : float
        Body shape factor K of the solid blockage [-] (default: body of revolution, from
        memory of [1]_, low confidence).
    tunnel_factor : float
        Tunnel shape factor τ_1 [-] (default from memory of [1]_, low confidence).
    maskell_epsilon : float
        Maskell's constant ε_M [-]; 5/2 for 3-D bluff bodies [2]_.
    test_section : str
        ``"closed"``. Open-jet sections are refused: there the boundary lets the stream expand,
        the solid blockage is small and of opposite sign and the wake blockage is usually
        neglected [1]_, so these closed-section forms would give the wrong sign.

    Returns
    -------
    TunnelBlockage

    Notes
    -----
    Thom/Pope (Barlow, Rae & Pope [1]_):

    .. math:: \varepsilon_{sb} = \frac{K \tau_1 V}{C^{3/2}},\quad
              \varepsilon_{wb} = \frac{S}{4C} C_{Du},\quad
              \frac{q_c}{q_u} = (1 + \varepsilon_{sb} + \varepsilon_{wb})^2

    Maskell [2]_ for bluff bodies:

    .. math:: \frac{q_c}{q_u} = 1 + \varepsilon_M C_{Du} \frac{S}{C}

    reported as an equivalent velocity increment ε = sqrt(q_c/q_u) - 1 in ``wake`` and
    ``total``, with ``solid`` = 0 (Maskell's increment contains it). Valid for small blockage,
    S/C up to about 0.05 to 0.1.

    References
    ----------
    .. [1] Barlow, J. B., Rae, W. H. and Pope, A., "Low-Speed Wind Tunnel Testing", 3rd ed.,
           Wiley, 1999, ch. 10.
    .. [2] Maskell, E. C., ARC R&M 3400, 1963.
    """
    if method not in WIND_TUNNEL_METHODS:
        raise InputError(f"method: got {method!r}; expected one of "
                         f"{', '.join(WIND_TUNNEL_METHODS)}")
    if test_section != "closed":
        raise InputError(
            f"test_section: got {test_section!r}; these blockage forms hold for a closed test "
            "section only (open-jet blockage is small and of opposite sign, Barlow, Rae & Pope "
            "1999 ch. 10)")
    vol = _array(model_volume, "model_volume", nonnegative=True)
    s = _array(frontal_area, "frontal_area", positive=True)
    c = _array(test_section_area, "test_section_area", positive=True)
    cd = _array(drag_coefficient, "drag_coefficient", nonnegative=True)
    if np.any(s >= c):
        raise InputError("frontal_area: not smaller than test_section_area; expected a model "
                         "that blocks only part of the test section")
    if method == "thom_pope":
        solid = shape_factor * tunnel_factor * vol / c**1.5
        wake = s / (4.0 * c) * cd
        total = solid + wake
        q_ratio = (1.0 + total) ** 2
    else:
        q_ratio = 1.0 + maskell_epsilon * cd * s / c
        total = np.sqrt(q_ratio) - 1.0
        wake = total
        solid = np.zeros_like(total)
    return TunnelBlockage(_out(solid), _out(wake), _out(total), _out(q_ratio), method)


@dataclass(frozen=True)
class AirfoilBlockage:
    """Two-dimensional aerofoil wall corrections of Allen & Vincenti (1944).

    Attributes
    ----------
    sigma : float or numpy.ndarray
        Streamline-curvature parameter σ = (π²/48)(c/h)² [-].
    solid, wake, total : float or numpy.ndarray
        Solid, wake and total velocity increments [-].
    dynamic_pressure_ratio : float or numpy.ndarray
        q_c/q_u = 1 + 2ε to first order [-].
    lift_factor : float or numpy.ndarray
        c_l / c_lu = 1 - σ - 2ε [-].
    drag_factor : float or numpy.ndarray
        c_d / c_du = 1 - 3ε_sb - 2ε_wb [-].
    """

    sigma: object
    solid: object
    wake: object
    total: object
    dynamic_pressure_ratio: object
    lift_factor: object
    drag_factor: object


def airfoil_blockage_2d(chord, tunnel_height, drag_coefficient,
                        body_shape_factor) -> AirfoilBlockage:
    r"""Wall corrections of a 2-D aerofoil spanning a closed tunnel (Allen & Vincenti 1944).

    Parameters
    ----------
    chord : numeric
        Aerofoil chord c [m].
    tunnel_height : numeric
        Test-section height h normal to the span [m].
    drag_coefficient : numeric
        Uncorrected section drag coefficient c_du [-].
    body_shape_factor : numeric
        Allen & Vincenti's body-shape factor Λ of the section [-] (read from their chart
        against thickness ratio; about 0.2 to 0.3 for sections 10 to 15 % thick, from memory,
        low confidence — no default on purpose).

    Returns
    -------
    AirfoilBlockage

    Notes
    -----
    .. math:: \sigma = \frac{\pi^2}{48}\left(\frac{c}{h}\right)^2,\quad
              \varepsilon_{sb} = \Lambda\sigma,\quad
              \varepsilon_{wb} = \frac{c}{2h} c_{du}

    with c_l = c_lu (1 - σ - 2ε) and c_d = c_du (1 - 3ε_sb - 2ε_wb) [1]_, first order in
    c/h (forms from memory of [1]_ as restated by Barlow, Rae & Pope 1999 ch. 9; medium
    confidence).

    References
    ----------
    .. [1] Allen, H. J. and Vincenti, W. G., NACA Report 782, 1944.
    """
    c = _array(chord, "chord", positive=True)
    h = _array(tunnel_height, "tunnel_height", positive=True)
    cd = _array(drag_coefficient, "drag_coefficient", nonnegative=True)
    lam = _array(body_shape_factor, "body_shape_factor", nonnegative=True)
    if np.any(c >= h):
        raise InputError("chord: not smaller than tunnel_height; expected c/h well below 1")
    sigma = np.pi**2 / 48.0 * (c / h) ** 2
    solid = lam * sigma
    wake = c / (2.0 * h) * cd
    total = solid + wake
    return AirfoilBlockage(_out(sigma), _out(solid), _out(wake), _out(total),
                           _out(1.0 + 2.0 * total), _out(1.0 - sigma - 2.0 * total),
                           _out(1.0 - 3.0 * solid - 2.0 * wake))


__all__ = [
    "DEFAULT_BODY_SHAPE_FACTOR",
    "DEFAULT_TUNNEL_SHAPE_FACTOR",
    "MASKELL_EPSILON_3D",
    "TANK_BLOCKAGE_METHODS",
    "WIND_TUNNEL_METHODS",
    "AirfoilBlockage",
    "TunnelBlockage",
    "airfoil_blockage_2d",
    "tank_speed_correction",
    "wind_tunnel_blockage",
]

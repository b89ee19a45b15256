"""Skin-friction lines: frictional resistance coefficient C_F of a smooth surface against Re.

Several published lines are offered through one function with a ``method=`` argument; the ship
model trade standard is the ITTC-1957 model-ship correlation line [1]_. The module also names the
flow regime of a model (laminar, transitional, turbulent) and gives the usual advice on
turbulence stimulation.

All functions take and return SI floats or numpy arrays (Re is dimensionless, lengths in [m]).

References
----------
.. [1] ITTC, "Proceedings of the 8th International Towing Tank Conference", Madrid, 1957
       (the ITTC-1957 model-ship correlation line); restated in ITTC Recommended Procedure
       7.5-02-02-02 "Resistance Test" and 7.5-02-03-01.4 "1978 ITTC Performance Prediction
       Method", Rev 05 (2021).
.. [2] Schoenherr, K. E., "Resistance of flat surfaces moving through a fluid",
       Trans. SNAME 40 (1932) 279-313.
.. [3] Hughes, G., "Friction and form resistance in turbulent flow, and a proposed formulation
       for use in model and ship correlation", Trans. INA 96 (1954) 314-376.
.. [4] Schlichting, H., "Boundary-Layer Theory", 7th ed., McGraw-Hill, 1979, ch. XXI
       (Prandtl-Schlichting skin-friction law of the smooth flat plate); Schlichting, H. and
       Gersten, K., "Boundary-Layer Theory", 8th ed., Springer, 2000 (transition).
.. [5] Blasius, H., "Grenzschichten in Flüssigkeiten mit kleiner Reibung",
       Z. Math. Phys. 56 (1908) 1-37 (laminar flat plate, C_F = 1.328/sqrt(Re)).
.. [6] Hughes, G. and Allan, J. F., "Turbulence stimulation on ship models",
       Trans. SNAME 59 (1951) 281-314.
"""

from __future__ import annotations

import numpy as np

from similitude.errors import InputError

#: Names accepted by ``friction_coefficient(method=...)``.
FRICTION_LINES = ("ittc1957", "schoenherr", "hughes", "prandtl_schlichting", "blasius")

#: Lower end of the flat-plate transition band, Re_x [-]: Schlichting & Gersten [4] give a
#: critical Re_x of about 5e5 for a plate in an ordinary (not especially quiet) free stream.
LAMINAR_LIMIT_REYNOLDS = 5.0e5

#: Upper end of the flat-plate transition band, Re_x [-]: in a very quiet free stream natural
#: transition can be delayed to a few 1e6 [4]; 5e6 is the textbook upper bound used here
#: (value from memory of the textbook, medium confidence).
TURBULENT_LIMIT_REYNOLDS = 5.0e6

#: Planning heuristic for the lowest model Reynolds number (on waterline length) at the lowest
#: analysed speed so that turbulence stimulation is effective [-]. Common practice, from memory
#: (no retrieved ITTC number); often quoted as 2e6 to 3e6. The lower value is used.
MIN_TURBULENT_MODEL_REYNOLDS = 2.0e6

# log10(Re) at which a line's denominator vanishes; the lines are meaningless at and below.
_POLES = {"ittc1957": 2.0, "hughes": 2.03, "prandtl_schlichting": 0.0}

_SCHOENHERR_TOL = 1e-12
_SCHOENHERR_MAX_ITER = 60


def _reynolds_array(reynolds) -> np.ndarray:
    re = np.asarray(reynolds, dtype=float)
    bad = ~(re > 0)  # catches NaN as well as zero and negatives
    if np.any(bad):
        first = float(re[bad].flat[0]) if re.ndim else float(re)
        raise InputError(f"reynolds: got {first:g}; expected a positive finite Reynolds number")
    if np.any(~np.isfinite(re)):
        raise InputError("reynolds: got inf; expected a positive finite Reynolds number")
    return re


def schoenherr_residual(reynolds, cf):
    """Residual of the Schoenherr equation, 0.242/sqrt(C_F) - log10(Re C_F) [-].

    Zero where ``cf`` is the exact Schoenherr coefficient at ``reynolds`` [2]_.

    References
    ----------
    .. [2] Schoenherr, K. E., Trans. SNAME 40 (1932) 279-313.
    """
    re = np.asarray(reynolds, dtype=float)
    cf = np.asarray(cf, dtype=float)
    return 0.242 / np.sqrt(cf) - np.log10(re * cf)


def _schoenherr(re: np.ndarray) -> np.ndarray:
    # Solve for x = 1/sqrt(C_F): f(x) = 0.242 x + 2 log10(x) - log10(Re) = 0. f is increasing
    # and concave in x, so Newton from any start converges monotonically once past the root.
    log_re = np.log10(re)
    x = np.sqrt((log_re - 2.0) ** 2 / 0.075)  # ITTC-1957 start
    x = np.maximum(x, 1.0)
    ln10 = np.log(10.0)
    for _ in range(_SCHOENHERR_MAX_ITER):
        f = 0.242 * x + 2.0 * np.log10(x) - log_re
        step = f / (0.242 + 2.0 / (x * ln10))
        x = np.maximum(x - step, 1e-3)
        if np.all(np.abs(f) < _SCHOENHERR_TOL * 0.1):
            break
    return 1.0 / (x * x)


def friction_coefficient(reynolds, method: str = "ittc1957"):
    r"""Frictional resistance coefficient C_F of a smooth surface [-].

    Parameters
    ----------
    reynolds : numeric
        Reynolds number on the reference length, Re = V L / nu [-]; must be > 0.
    method : str
        One of :data:`FRICTION_LINES`:

        ``"ittc1957"``
            ITTC-1957 model-ship correlation line [1]_,
            :math:`C_F = 0.075 / (\log_{10} Re - 2)^2`.
        ``"schoenherr"``
            Schoenherr (1932) [2]_, :math:`0.242/\sqrt{C_F} = \log_{10}(Re\,C_F)`, solved
            exactly by vectorised Newton iteration (residual below 1e-12).
        ``"hughes"``
            Hughes (1954) [3]_, :math:`C_F = 0.066 / (\log_{10} Re - 2.03)^2`.
        ``"prandtl_schlichting"``
            Prandtl-Schlichting [4]_, :math:`C_F = 0.455 / (\log_{10} Re)^{2.58}`.
        ``"blasius"``
            Laminar flat plate, Blasius (1908) [5]_, :math:`C_F = 1.328 / \sqrt{Re}`.

    Returns
    -------
    numpy.ndarray or float
        C_F [-], the shape of ``reynolds`` (a float for scalar input).

    Notes
    -----
    The turbulent lines are meant for fully turbulent flow, roughly Re > 5e6 for a flat plate;
    the ITTC-1957 line is a correlation line, not a flat-plate line, and has a pole at Re = 100.
    The Blasius line holds for laminar flow, Re below about 5e5 (see :func:`flow_regime`).

    Raises
    ------
    InputError
        Unknown ``method`` (the message lists :data:`FRICTION_LINES`), Re <= 0, or Re at or
        below the pole of a turbulent line (Re = 100 for ITTC-1957, 10^2.03 for Hughes, 1 for
        Prandtl-Schlichting).

    References
    ----------
    .. [1] ITTC 1957, 8th ITTC, Madrid; ITTC 7.5-02-03-01.4 Rev 05 (2021).
    .. [2] Schoenherr, K. E., Trans. SNAME 40 (1932) 279-313.
    .. [3] Hughes, G., Trans. INA 96 (1954) 314-376.
    .. [4] Schlichting, H., "Boundary-Layer Theory", 7th ed., McGraw-Hill, 1979.
    .. [5] Blasius, H., Z. Math. Phys. 56 (1908) 1-37.
    """
    if method not in FRICTION_LINES:
        raise InputError(f"method: got {method!r}; expected one of {', '.join(FRICTION_LINES)}")
    re = _reynolds_array(reynolds)
    log_re = np.log10(re)
    if method in _POLES and np.any(log_re <= _POLES[method]):
        first = float(re[log_re <= _POLES[method]].flat[0]) if re.ndim else float(re)
        raise InputError(
            f"reynolds: got {first:g}; the {method} line has a pole at "
            f"Re = {10.0 ** _POLES[method]:.4g} and is meant for turbulent flow; expected a "
            "Reynolds number well above it")
    if method == "ittc1957":
        cf = 0.075 / (log_re - 2.0) ** 2
    elif method == "schoenherr":
        cf = _schoenherr(re)
    elif method == "hughes":
        cf = 0.066 / (log_re - 2.03) ** 2
    elif method == "prandtl_schlichting":
        cf = 0.455 / log_re**2.58
    else:
        cf = 1.328 / np.sqrt(re)
    return cf if np.ndim(cf) else float(cf)


def flow_regime(reynolds, laminar_limit: float = LAMINAR_LIMIT_REYNOLDS,
                turbulent_limit: float = TURBULENT_LIMIT_REYNOLDS):
    """Boundary-layer regime of a smooth flat plate at length Reynolds number Re [-].

    ``"laminar"`` below ``laminar_limit`` (5e5), ``"turbulent"`` at or above
    ``turbulent_limit`` (5e6), ``"transitional"`` between. The band is the flat-plate transition
    band of Schlichting & Gersten [1]_ (critical Re_x ≈ 5e5 in an ordinary free stream, natural
    transition delayed to a few 1e6 in a quiet one). A stimulated ship model is turbulent aft of
    the stimulator at lower Re; the band describes an unstimulated surface.

    Parameters
    ----------
    reynolds : numeric
        Reynolds number on the length of the surface [-]; must be > 0.
    laminar_limit, turbulent_limit : float
        Band limits [-].

    Returns
    -------
    str or numpy.ndarray of str
        A string for scalar input, else an array of strings of the input's shape.

    References
    ----------
    .. [1] Schlichting, H. and Gersten, K., "Boundary-Layer Theory", 8th ed., Springer, 2000.
    """
    re = _reynolds_array(reynolds)
    out = np.where(re < laminar_limit, "laminar",
                   np.where(re < turbulent_limit, "transitional", "turbulent"))
    return str(out) if out.ndim == 0 else out


def turbulence_stimulation_advice(length_m: float) -> str:
    """Short advice on turbulence stimulation for a ship model of waterline length [m].

    Usual practice: a row of cylindrical studs of Hughes & Allan (1951) [1]_, 3.2 mm diameter,
    2.5 mm high, at 25 mm pitch, about 5 % of L_PP aft of the forward perpendicular (station 19
    of 20), with extra rows on a bulb; alternatively a trip wire of about 1 mm diameter, sand
    strips or Hama strips. The stud dimensions are from memory of the paper (medium confidence);
    the trip-wire size is common practice.

    References
    ----------
    .. [1] Hughes, G. and Allan, J. F., Trans. SNAME 59 (1951) 281-314.
    """
    length = float(length_m)
    if not length > 0 or not np.isfinite(length):
        raise InputError(f"length_m: got {length:g}; expected a positive model length in m")
    position = 0.05 * length
    return (
        f"Fit turbulence stimulators about {position * 1000:.0f} mm (5 % of L_PP) aft of the "
        "forward perpendicular: cylindrical studs 3.2 mm in diameter and 2.5 mm high at 25 mm "
        "pitch (Hughes & Allan 1951; medium confidence), or a trip wire of about 1 mm diameter "
        "(common practice); add a row on a bulbous bow. Estimate the studs' own drag, e.g. "
        "by testing with one and with two rows."
    )


__all__ = [
    "FRICTION_LINES",
    "LAMINAR_LIMIT_REYNOLDS",
    "MIN_TURBULENT_MODEL_REYNOLDS",
    "TURBULENT_LIMIT_REYNOLDS",
    "flow_regime",
    "friction_coefficient",
    "schoenherr_residual",
    "turbulence_stimulation_advice",
]

"""A faired open-water curve: K_T(J) and K_Q(J) as least-squares polynomials, and its inverses.

The self-propulsion analysis reads the advance ratio off the open-water curve at the measured
behind-hull K_T (thrust identity) or K_Q (torque identity), and the full-scale prediction reads
the operating point off it at the ship's loading K_T/J^2. Measured open-water points scatter, so
they are faired first: a polynomial in J of low degree fitted by least squares (fairing the
open-water data by polynomials is common practice; the ITTC procedures ask for faired curves
without prescribing the fit).

Every method is vectorised over a leading sample axis: the coefficient arrays may be
``(degree + 1,)`` (one curve) or ``(N, degree + 1)`` (N curves, e.g. the Monte Carlo samples of
:mod:`similitude.prediction.propulsion_uncertainty`), and the values they are evaluated at
``(..., m)``. The inverses are found by bisection on arrays (no loop over values), inside the
bracket of J where the curve is defined; a value outside the curve's range is returned at the
bracket end and flagged in the ``inside`` mask.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-03-02.1, "Open Water Test" (faired
       curves of K_T, K_Q and η_0 against J).
.. [2] ITTC, Recommended Procedures and Guidelines 7.5-02-03-01.4, "1978 ITTC Performance
       Prediction Method", Rev 04 (2017) (thrust identity; operating point from K_T/J^2).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from similitude.errors import InputError

#: Degree of the fairing polynomials unless told otherwise (cubic; common practice).
DEFAULT_DEGREE = 3

#: Bisection steps of the inverses: the bracket shrinks by 2**-52, to floating-point precision.
_BISECTION_STEPS = 52


def horner(coefficients, x):
    """Evaluate polynomials a0 + a1 x + a2 x^2 + ... with a leading sample axis.

    Parameters
    ----------
    coefficients : array_like
        ``(m,)`` or ``(N, m)``, increasing powers.
    x : array_like
        Values; with ``(N, m)`` coefficients, ``(N, ...)`` (each row uses its own polynomial).

    Returns
    -------
    numpy.ndarray
    """
    c = np.asarray(coefficients, dtype=float)
    x = np.asarray(x, dtype=float)
    if c.ndim == 1:
        return np.polynomial.polynomial.polyval(x, c)
    shape = (c.shape[0],) + (1,) * max(x.ndim - 1, 0)
    y = np.zeros(np.broadcast_shapes(x.shape, shape))
    for i in range(c.shape[-1] - 1, -1, -1):
        y = y * x + c[:, i].reshape(shape)
    return y


def fit_matrix(advance_ratio, degree: int) -> np.ndarray:
    """The least-squares operator P with coefficients = values @ P.T: the pseudo-inverse of the
    Vandermonde matrix of ``advance_ratio`` (``(degree + 1, n)``); linear in the values, so N
    sets of values are fitted in one product."""
    j = np.asarray(advance_ratio, dtype=float)
    return np.linalg.pinv(np.polynomial.polynomial.polyvander(j, degree))


def _bisect(g, lo: float, hi: float, shape) -> tuple[np.ndarray, np.ndarray]:
    """Root of a decreasing function g on [lo, hi], elementwise: (root, inside mask)."""
    a = np.full(shape, lo)
    b = np.full(shape, hi)
    ga, gb = g(a), g(b)
    inside = (ga >= 0) & (gb <= 0)
    for _ in range(_BISECTION_STEPS):
        m = 0.5 * (a + b)
        above = g(m) > 0
        a = np.where(above, m, a)
        b = np.where(above, b, m)
    root = 0.5 * (a + b)
    # Outside the curve's range: the nearer end, flagged.
    root = np.where(inside, root, np.where(ga < 0, lo, hi))
    return root, inside


@dataclass(frozen=True, eq=False)  # holds arrays
class OpenWaterCurve:
    """K_T(J) and K_Q(J) of a propeller as polynomials, with the J range they hold on.

    Attributes
    ----------
    thrust : numpy.ndarray
        K_T coefficients a0, a1, ... (increasing powers of J), ``(m,)`` or ``(N, m)``.
    torque : numpy.ndarray
        K_Q coefficients, the same shape.
    advance_range : (float, float)
        J range of the data the curve was fitted to [-]; the inverses search a bracket from
        0 to 1.2 times its upper end.
    source : str
        Where the curve came from (a file name, "polynomial given").
    """

    thrust: np.ndarray
    torque: np.ndarray
    advance_range: tuple[float, float]
    source: str = ""

    def __post_init__(self) -> None:
        kt = np.asarray(self.thrust, dtype=float)
        kq = np.asarray(self.torque, dtype=float)
        for name, c in (("thrust polynomial", kt), ("torque polynomial", kq)):
            if c.shape[-1] < 2 or not np.all(np.isfinite(c)):
                raise InputError(f"{name}: {c.tolist()!r}; expected at least two finite "
                                 "coefficients a0, a1 (K = a0 + a1 J + ...)")
        lo, hi = (float(v) for v in self.advance_range)
        if not (math.isfinite(lo) and math.isfinite(hi) and 0 <= lo < hi):
            raise InputError(f"advance ratio range: {self.advance_range!r}; expected "
                             "0 <= lowest < highest J")
        object.__setattr__(self, "thrust", kt)
        object.__setattr__(self, "torque", kq)
        object.__setattr__(self, "advance_range", (lo, hi))

    @classmethod
    def fit(cls, advance_ratio, kt, kq, degree: int = DEFAULT_DEGREE,
            source: str = "") -> OpenWaterCurve:
        """Fair measured open-water points by least-squares polynomials of ``degree``.

        Parameters
        ----------
        advance_ratio, kt, kq : array_like
            J, K_T and K_Q of the runs [-]; ``kt`` and ``kq`` may be ``(N, n)`` for N sets.
        degree : int
            Degree of both polynomials (1 to 6); it must be below the number of distinct J.

        Raises
        ------
        InputError
            Too few points for the degree.
        """
        j = np.asarray(advance_ratio, dtype=float)
        if not (isinstance(degree, int) and 1 <= degree <= 6):
            raise InputError(f"open-water polynomial degree: {degree!r}; expected a whole "
                             "number from 1 to 6")
        distinct = np.unique(np.round(j, 9)).size
        if distinct <= degree:
            raise InputError(f"open-water runs: {distinct} distinct advance ratios for a "
                             f"polynomial of degree {degree}; expected at least {degree + 1}")
        p = fit_matrix(j, degree)
        return cls(np.asarray(kt, float) @ p.T, np.asarray(kq, float) @ p.T,
                   (float(j.min()), float(j.max())), source)

    def kt(self, advance_ratio):
        """K_T at J [-]."""
        return horner(self.thrust, advance_ratio)

    def kq(self, advance_ratio):
        """K_Q at J [-]."""
        return horner(self.torque, advance_ratio)

    def efficiency(self, advance_ratio):
        """η_0 = J K_T/(2π K_Q) at J [-]."""
        j = np.asarray(advance_ratio, dtype=float)
        return j * self.kt(j) / (2.0 * np.pi * self.kq(j))

    @property
    def bracket(self) -> tuple[float, float]:
        """The J interval the inverses search: 0 to 1.2 times the highest measured J."""
        return 0.0, 1.2 * self.advance_range[1]

    def _solve(self, g, like) -> tuple[np.ndarray, np.ndarray]:
        lo, hi = self.bracket
        return _bisect(g, lo, hi, np.shape(like))

    def advance_ratio_at_thrust(self, kt) -> tuple[np.ndarray, np.ndarray]:
        """J where the curve's K_T equals ``kt`` (thrust identity): (J, inside mask)."""
        target = np.asarray(kt, dtype=float)
        return self._solve(lambda j: self.kt(j) - target, target)

    def advance_ratio_at_torque(self, kq) -> tuple[np.ndarray, np.ndarray]:
        """J where the curve's K_Q equals ``kq`` (torque identity): (J, inside mask)."""
        target = np.asarray(kq, dtype=float)
        return self._solve(lambda j: self.kq(j) - target, target)

    def advance_ratio_at_loading(self, loading) -> tuple[np.ndarray, np.ndarray]:
        """J where K_T(J) = (K_T/J²)·J², the operating point at a loading: (J, inside mask)."""
        tau = np.asarray(loading, dtype=float)
        return self._solve(lambda j: self.kt(j) - tau * j * j, tau)

    def shifted(self, thrust, torque) -> OpenWaterCurve:
        """The curve with ``thrust`` and ``torque`` coefficients added (e.g. the full-scale
        correction, itself a fitted polynomial)."""
        return OpenWaterCurve(self.thrust + np.asarray(thrust, float),
                              self.torque + np.asarray(torque, float), self.advance_range,
                              self.source)

    def table(self, points: int = 21):
        """The faired curve at ``points`` advance ratios over the data range, as a DataFrame
        with units in the headers (one curve only)."""
        import pandas as pd  # lazy: the command line builds its parsers without pandas

        j = np.linspace(*self.advance_range, points)
        return pd.DataFrame({"advance ratio J [-]": j, "K_T [-]": self.kt(j),
                             "K_Q [-]": self.kq(j), "eta_0 [-]": self.efficiency(j)})


__all__ = ["DEFAULT_DEGREE", "OpenWaterCurve", "fit_matrix", "horner"]

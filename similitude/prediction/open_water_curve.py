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
``(..., m)``. The inverses are found on arrays (no loop over values) by bisection inside the
bracket of J where the curve is defined, polished by Newton's method; a value outside the
curve's range is returned at the bracket end and flagged in the ``inside`` mask.

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

#: Bisection steps of the inverses before Newton's method takes over: the bracket shrinks to
#: 2**-12 of its width, where the polynomials are straight to a few parts in 1e6.
_BISECTION_STEPS = 12

#: Newton steps after the bisection, each kept inside the bracket: from 2**-12 of the width
#: the error squares at each step, to floating-point precision in three.
_NEWTON_STEPS = 4


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


def derivative(coefficients) -> np.ndarray:
    """Coefficients of the derivative of polynomials ``(m,)`` or ``(N, m)``."""
    c = np.asarray(coefficients, dtype=float)
    return c[..., 1:] * np.arange(1, c.shape[-1])


def _root(g, dg, lo: float, hi: float, shape) -> tuple[np.ndarray, np.ndarray]:
    """Root of a decreasing function g on [lo, hi], elementwise: (root, inside mask).

    Bisection narrows every bracket first, then Newton's method (derivative ``dg``) polishes
    the root inside it: each step is clipped to the bracket, so it cannot leave it."""
    a = np.full(shape, lo)
    b = np.full(shape, hi)
    ga, gb = g(a), g(b)
    inside = (ga >= 0) & (gb <= 0)
    for _ in range(_BISECTION_STEPS):
        m = 0.5 * (a + b)
        above = g(m) > 0
        a = np.where(above, m, a)
        b = np.where(above, b, m)
    x = 0.5 * (a + b)
    for _ in range(_NEWTON_STEPS):
        slope = dg(x)
        step = np.divide(g(x), slope, out=np.zeros_like(x), where=slope < 0)
        x = np.clip(x - step, a, b)
    # Outside the curve's range: the nearer end, flagged.
    return np.where(inside, x, np.where(ga < 0, lo, hi)), inside


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

    def _solve(self, g, dg, like) -> tuple[np.ndarray, np.ndarray]:
        lo, hi = self.bracket
        return _root(g, dg, lo, hi, np.shape(like))

    def advance_ratio_at_thrust(self, kt) -> tuple[np.ndarray, np.ndarray]:
        """J where the curve's K_T equals ``kt`` (thrust identity): (J, inside mask)."""
        target = np.asarray(kt, dtype=float)
        dkt = derivative(self.thrust)
        return self._solve(lambda j: self.kt(j) - target, lambda j: horner(dkt, j), target)

    def advance_ratio_at_torque(self, kq) -> tuple[np.ndarray, np.ndarray]:
        """J where the curve's K_Q equals ``kq`` (torque identity): (J, inside mask)."""
        target = np.asarray(kq, dtype=float)
        dkq = derivative(self.torque)
        return self._solve(lambda j: self.kq(j) - target, lambda j: horner(dkq, j), target)

    def advance_ratio_at_loading(self, loading) -> tuple[np.ndarray, np.ndarray]:
        """J where K_T(J) = (K_T/J²)·J², the operating point at a loading: (J, inside mask)."""
        tau = np.asarray(loading, dtype=float)
        dkt = derivative(self.thrust)
        return self._solve(lambda j: self.kt(j) - tau * j * j,
                           lambda j: horner(dkt, j) - 2.0 * tau * j, tau)

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


def usable_degree(advance_ratio, degree: int) -> int:
    """``degree``, lowered to one below the number of distinct advance ratios (at least 1)."""
    distinct = np.unique(np.round(np.asarray(advance_ratio, float), 9)).size
    return max(1, min(degree, distinct - 1))


@dataclass(frozen=True, eq=False)  # holds arrays
class PropellerCurves:
    """The fits behind the two open-water curves of a self-propulsion prediction.

    The propeller in the test (the design propeller, or a stock propeller) is analysed on its
    model curve; the full-scale prediction uses the design propeller's full-scale curve, its
    model curve plus the fitted scale correction (K_TS - K_TM, K_QS - K_QM of every run,
    :func:`similitude.prediction.open_water.scale_open_water`). The fits are linear in the
    measured K_T and K_Q, so N perturbed sets of them are faired in one product.

    Attributes
    ----------
    test_j, design_j : numpy.ndarray
        Advance ratios of the two open-water tests (the same test when no stock propeller).
    test_fit, design_fit : numpy.ndarray
        Their least-squares operators (:func:`fit_matrix`).
    shift_kt, shift_kq : numpy.ndarray
        Coefficients of the full-scale correction of the design propeller.
    test_source, design_source : str
    stock : bool
        True when the test used a stock propeller.
    """

    test_j: np.ndarray
    test_fit: np.ndarray
    design_j: np.ndarray
    design_fit: np.ndarray
    shift_kt: np.ndarray
    shift_kq: np.ndarray
    test_source: str = ""
    design_source: str = ""
    stock: bool = False

    @classmethod
    def build(cls, design_j, design_kt_model, design_kq_model, design_kt_ship, design_kq_ship,
              degree: int = DEFAULT_DEGREE, test_j=None, design_source: str = "",
              test_source: str = "") -> PropellerCurves:
        """The fits from the design propeller's model and full-scale points and, for a stock
        propeller, the advance ratios of its own open-water test (``test_j``)."""
        dj = np.asarray(design_j, float)
        design_fit = fit_matrix(dj, usable_degree(dj, degree))
        stock = test_j is not None
        tj = np.asarray(test_j, float) if stock else dj
        test_fit = fit_matrix(tj, usable_degree(tj, degree)) if stock else design_fit
        shift_kt = (np.asarray(design_kt_ship, float) - design_kt_model) @ design_fit.T
        shift_kq = (np.asarray(design_kq_ship, float) - design_kq_model) @ design_fit.T
        return cls(tj, test_fit, dj, design_fit, shift_kt, shift_kq,
                   test_source if stock else design_source, design_source, stock)

    def curves(self, test_kt, test_kq, design_kt=None, design_kq=None):
        """(curve of the propeller in the test, full-scale curve of the design propeller) from
        measured K_T and K_Q, ``(n,)`` or ``(N, n)``; without a stock propeller the design
        values are the test's."""
        if not self.stock:
            design_kt, design_kq = test_kt, test_kq
        test = OpenWaterCurve(np.asarray(test_kt, float) @ self.test_fit.T,
                              np.asarray(test_kq, float) @ self.test_fit.T,
                              (float(self.test_j.min()), float(self.test_j.max())),
                              self.test_source)
        model = OpenWaterCurve(np.asarray(design_kt, float) @ self.design_fit.T,
                               np.asarray(design_kq, float) @ self.design_fit.T,
                               (float(self.design_j.min()), float(self.design_j.max())),
                               self.design_source)
        return test, model.shifted(self.shift_kt, self.shift_kq)


__all__ = ["DEFAULT_DEGREE", "OpenWaterCurve", "PropellerCurves", "derivative", "fit_matrix",
           "horner", "usable_degree"]

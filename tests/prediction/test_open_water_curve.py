"""The faired open-water curve: least-squares polynomials, batched, and their inverses."""

import numpy as np
import pytest

from similitude.errors import InputError
from similitude.prediction.open_water_curve import OpenWaterCurve, horner

KT = np.array([0.46, -0.30, -0.13])
KQ = np.array([0.062, -0.032, -0.012])
J = np.linspace(0.1, 1.0, 10)


def _exact():
    return OpenWaterCurve.fit(J, horner(KT, J), horner(KQ, J), degree=2)


def test_fit_recovers_the_polynomial_of_exact_points():
    curve = _exact()
    np.testing.assert_allclose(curve.thrust, KT, atol=1e-12)
    np.testing.assert_allclose(curve.torque, KQ, atol=1e-12)
    assert curve.advance_range == (pytest.approx(0.1), pytest.approx(1.0))


def test_fit_equals_numpy_polyfit_of_noisy_points():
    # reference: numpy.polynomial.polynomial.polyfit, the same least-squares problem
    rng = np.random.default_rng(3)
    kt = horner(KT, J) * (1 + rng.normal(0, 0.01, J.size))
    kq = horner(KQ, J) * (1 + rng.normal(0, 0.01, J.size))
    curve = OpenWaterCurve.fit(J, kt, kq, degree=3)
    np.testing.assert_allclose(curve.thrust, np.polynomial.polynomial.polyfit(J, kt, 3),
                               rtol=1e-9, atol=1e-12)


def test_thrust_identity_inverts_the_curve():
    # K_T(J) = 0.46 - 0.30 J - 0.13 J^2 = 0.2 -> J = (-0.30 + sqrt(0.09 + 4*0.13*0.26))/0.26
    curve = _exact()
    j, inside = curve.advance_ratio_at_thrust(0.2)
    assert j == pytest.approx((-0.30 + np.sqrt(0.09 + 4 * 0.13 * 0.26)) / 0.26, rel=1e-12)
    assert bool(inside)


def test_loading_gives_the_operating_point():
    # K_T = tau J^2: 0.46 - 0.30 J - (0.13 + tau) J^2 = 0, tau = 0.5:
    # J = (-0.30 + sqrt(0.09 + 4 * 0.63 * 0.46)) / (2 * 0.63)
    curve = _exact()
    j, _ = curve.advance_ratio_at_loading(0.5)
    assert j == pytest.approx((-0.30 + np.sqrt(0.09 + 4 * 0.63 * 0.46)) / 1.26, rel=1e-12)


def test_torque_identity_inverts_the_torque_curve():
    curve = _exact()
    j, _ = curve.advance_ratio_at_torque(curve.kq(0.55))
    assert j == pytest.approx(0.55, rel=1e-12)


def test_value_off_the_curve_is_flagged_not_invented():
    curve = _exact()
    j, inside = curve.advance_ratio_at_thrust(np.array([0.2, 0.9]))
    assert list(inside) == [True, False]  # K_T never reaches 0.9
    assert j[1] == 0.0  # the bracket's end, flagged


def test_batched_curves_each_use_their_own_coefficients():
    # N = 2 curves (rows), each inverted at its own values: the same as two single curves
    kt2 = np.vstack([KT, KT + [0.02, 0, 0]])
    kq2 = np.vstack([KQ, KQ])
    curves = OpenWaterCurve(kt2, kq2, (0.1, 1.0))
    j, _ = curves.advance_ratio_at_thrust(np.array([[0.2, 0.25], [0.2, 0.25]]))
    single = OpenWaterCurve(KT + [0.02, 0, 0], KQ, (0.1, 1.0))
    np.testing.assert_allclose(j[1], single.advance_ratio_at_thrust(np.array([0.2, 0.25]))[0],
                               rtol=1e-12)


def test_too_few_points_for_the_degree_is_refused():
    with pytest.raises(InputError, match="distinct advance ratios"):
        OpenWaterCurve.fit([0.2, 0.4, 0.6], [0.3, 0.2, 0.1], [0.04, 0.03, 0.02], degree=3)

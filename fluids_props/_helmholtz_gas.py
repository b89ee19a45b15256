r"""Real-gas properties of nitrogen and dry air from their reference Helmholtz equations of state.

Private helper of :mod:`fluids_props.gases` and :mod:`fluids_props.air`. Both reference equations
write the molar Helmholtz energy as ``a/(RT) = alpha0(delta, tau) + alphar(delta, tau)`` with
``delta = rho/rho_r`` and ``tau = T_r/T``; every property used here (density from ``(T, p)``,
isochoric and isobaric heat capacity, speed of sound) follows from the derivatives of ``alpha``:

.. math::

    p = \rho R T (1 + \delta \alpha^r_\delta), \qquad
    \frac{c_v}{R} = -\tau^2 (\alpha^0_{\tau\tau} + \alpha^r_{\tau\tau}), \qquad
    \frac{c_p}{R} = \frac{c_v}{R}
        + \frac{(1 + \delta\alpha^r_\delta - \delta\tau\alpha^r_{\delta\tau})^2}
               {1 + 2\delta\alpha^r_\delta + \delta^2\alpha^r_{\delta\delta}}, \qquad
    w^2 = \frac{R T}{M}\frac{c_p}{c_v}
        (1 + 2\delta\alpha^r_\delta + \delta^2\alpha^r_{\delta\delta}).

(These are the standard relations listed in both references.) Viscosity is the Lemmon & Jacobsen
(2004) correlation ``eta = eta0(T) + eta_r(tau, delta)`` with the dilute-gas part from a
Chapman-Enskog collision integral.

For speed on large grids the power terms are rewritten once, at import, as a series in delta
(exact up to delta^4, i.e. a virial series to the fifth coefficient; see :func:`_prepare` for
its accuracy), and the four Gaussian (near-critical) terms of the nitrogen equation are left
out: at the vapour densities reachable here (``delta < 0.15``, saturated vapour at 1.2 MPa) each
carries a factor ``exp(-eta (delta - 1)^2) < 1e-6``; leaving them out changed density by less
than 1e-6 relative (measured against the full equation).

The coefficients are those of the publications (References); they were transcribed from the
machine-readable copy of the same equations in the open-source CoolProp library and are verified
in the tests against CoolProp's own evaluation of these equations.

References
----------
1. Span, R., Lemmon, E. W., Jacobsen, R. T, Wagner, W. & Yokozeki, A. (2000). A reference
   equation of state for the thermodynamic properties of nitrogen for temperatures from 63.151
   to 1000 K and pressures to 2200 MPa. J. Phys. Chem. Ref. Data 29(6), 1361-1433.
2. Lemmon, E. W., Jacobsen, R. T, Penoncello, S. G. & Friend, D. G. (2000). Thermodynamic
   properties of air and mixtures of nitrogen, argon, and oxygen from 60 to 2000 K at pressures
   to 2000 MPa. J. Phys. Chem. Ref. Data 29(3), 331-385.
3. Lemmon, E. W. & Jacobsen, R. T (2004). Viscosity and thermal conductivity equations for
   nitrogen, oxygen, argon, and air. Int. J. Thermophys. 25(1), 21-69.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ._arrays import horner


@dataclass(frozen=True)
class HelmholtzGas:
    """Coefficients of one reference equation of state and its viscosity correlation.

    Attributes
    ----------
    name : str
        Fluid name.
    molar_mass : float
        Molar mass [kg/mol] of the equation of state.
    gas_constant : float
        Molar gas constant used by the equation [J/(mol K)].
    t_reduce : float
        Reducing temperature [K].
    rho_reduce : float
        Reducing molar density [mol/m^3].
    power_terms : tuple
        ``(n, t, d, l)``: terms ``n delta^d tau^t exp(-delta^l)`` (no exponential for l = 0).
    gauss_terms : tuple
        ``(n, t, d, eta, epsilon, beta, gamma)``: terms
        ``n delta^d tau^t exp(-eta (delta - epsilon)^2 - beta (tau - gamma)^2)``.
    ideal_log_tau : float
        Coefficient of ``ln(tau)`` in ``alpha0``.
    ideal_power : tuple
        ``(n, t)``: terms ``n tau^t`` of ``alpha0``.
    ideal_planck : tuple
        ``(n, theta)``: terms ``n ln(1 - exp(-theta tau))`` of ``alpha0``.
    ideal_planck_general : tuple
        ``(n, theta, c, d)``: terms ``n ln(c + d exp(theta tau))`` of ``alpha0``.
    visc_molar_mass_g : float
        Molar mass of the viscosity correlation [g/mol].
    visc_sigma_nm : float
        Lennard-Jones size parameter [nm].
    visc_eps_k : float
        Lennard-Jones energy parameter over Boltzmann constant [K].
    visc_residual : tuple
        ``(N [uPa s], t, d, l, gamma)``: terms ``N tau^t delta^d exp(-gamma delta^l)``.
    """

    name: str
    molar_mass: float
    gas_constant: float
    t_reduce: float
    rho_reduce: float
    power_terms: tuple
    gauss_terms: tuple = ()
    ideal_log_tau: float = 2.5
    ideal_power: tuple = ()
    ideal_planck: tuple = ()
    ideal_planck_general: tuple = ()
    visc_molar_mass_g: float = 28.0
    visc_sigma_nm: float = 0.36
    visc_eps_k: float = 100.0
    visc_residual: tuple = ()


#: Collision-integral coefficients b_i of Lemmon & Jacobsen (2004) (same for all four fluids).
OMEGA_B = (0.431, -0.4623, 0.08406, 0.005341, -0.00331)

NITROGEN = HelmholtzGas(
    name="nitrogen",
    molar_mass=0.02801348,  # Span et al. (2000)
    gas_constant=8.31451,
    t_reduce=126.192,
    rho_reduce=11183.9,  # 11.1839 mol/dm^3
    power_terms=(
    (0.924803575275, 0.25, 1, 0),
    (-0.492448489428, 0.875, 1, 0),
    (0.661883336938, 0.5, 2, 0),
    (-1.92902649201, 0.875, 2, 0),
    (-0.0622469309629, 0.375, 3, 0),
    (0.349943957581, 0.75, 3, 0),
    (0.564857472498, 0.5, 1, 1),
    (-1.61720005987, 0.75, 1, 1),
    (-0.481395031883, 2, 1, 1),
    (0.421150636384, 1.25, 3, 1),
    (-0.0161962230825, 3.5, 3, 1),
    (0.172100994165, 1, 4, 1),
    (0.00735448924933, 0.5, 6, 1),
    (0.0168077305479, 3, 6, 1),
    (-0.00107626664179, 0, 7, 1),
    (-0.0137318088513, 2.75, 7, 1),
    (0.000635466899859, 0.75, 8, 1),
    (0.00304432279419, 2.5, 8, 1),
    (-0.0435762336045, 4, 1, 2),
    (-0.0723174889316, 6, 2, 2),
    (0.0389644315272, 6, 3, 2),
    (-0.021220136391, 3, 4, 2),
    (0.00408822981509, 3, 5, 2),
    (-5.51990017984e-05, 6, 8, 2),
    (-0.0462016716479, 16, 4, 3),
    (-0.00300311716011, 11, 5, 3),
    (0.0368825891208, 15, 5, 3),
    (-0.0025585684622, 12, 8, 3),
    (0.00896915264558, 12, 3, 4),
    (-0.0044151337035, 7, 5, 4),
    (0.00133722924858, 4, 6, 4),
    (0.000264832491957, 16, 9, 4),
    ),
    gauss_terms=(
    (19.6688194015, 0, 1, 20, 1, 325, 1.16),
    (-20.911560073, 1, 1, 20, 1, 325, 1.16),
    (0.0167788306989, 2, 3, 15, 1, 300, 1.13),
    (2627.67566274, 3, 2, 25, 1, 275, 1.25),
    ),
    ideal_log_tau=2.5,
    ideal_power=((-1.934819e-4, -1.0), (-1.247742e-5, -2.0), (6.678326e-8, -3.0)),
    ideal_planck=((1.012941, 3364.011 / 126.192),),
    visc_molar_mass_g=28.01348,
    visc_sigma_nm=0.3656,
    visc_eps_k=98.94,
    visc_residual=(  # Lemmon & Jacobsen (2004), nitrogen
        (10.72, 0.1, 2, 0, 0.0),
        (0.03989, 0.25, 10, 1, 1.0),
        (0.001208, 3.2, 12, 1, 1.0),
        (-7.402, 0.9, 2, 2, 1.0),
        (4.620, 0.3, 1, 3, 1.0),
    ),
)

AIR = HelmholtzGas(
    name="air",
    # CIPM-2007 molar mass of dry air (x_CO2 = 0.0004), used with this equation by CoolProp
    # too; Lemmon et al. (2000) give 28.9586 g/mol (2.4e-4 less; the equation is in molar units)
    molar_mass=0.02896546,
    gas_constant=8.31451,
    t_reduce=132.6312,
    rho_reduce=10447.7,  # 10.4477 mol/dm^3
    power_terms=(
    (0.118160747229, 0, 1, 0),
    (0.713116392079, 0.33, 1, 0),
    (-1.61824192067, 1.01, 1, 0),
    (0.0714140178971, 0, 2, 0),
    (-0.0865421396646, 0, 3, 0),
    (0.134211176704, 0.15, 3, 0),
    (0.0112626704218, 0, 4, 0),
    (-0.0420533228842, 0.2, 4, 0),
    (0.0349008431982, 0.35, 4, 0),
    (0.000164957183186, 1.35, 6, 0),
    (-0.101365037912, 1.6, 1, 1),
    (-0.17381369097, 0.8, 3, 1),
    (-0.0472103183731, 0.95, 5, 1),
    (-0.0122523554253, 1.25, 6, 1),
    (-0.146629609713, 3.6, 1, 2),
    (-0.0316055879821, 6, 3, 2),
    (0.000233594806142, 3.25, 11, 2),
    (0.0148287891978, 3.5, 1, 3),
    (-0.00938782884667, 15, 3, 3),
    ),
    ideal_log_tau=2.490888032,
    ideal_power=(
        (6.057194e-8, -3.0), (-2.10274769e-5, -2.0), (-1.58860716e-4, -1.0),
        (-1.3841928076e1, 0.0), (1.7275266575e1, 1.0), (-1.9536342e-4, 1.5),
    ),
    ideal_planck=((0.791309509, 25.36365), (0.212236768, 16.90741)),
    ideal_planck_general=((-0.197938904, 87.31279, 2.0 / 3.0, 1.0),),
    visc_molar_mass_g=28.9586,
    visc_sigma_nm=0.360,
    visc_eps_k=103.3,
    visc_residual=(  # Lemmon & Jacobsen (2004), air
        (10.72, 0.2, 1, 0, 0.0),
        (1.122, 0.05, 4, 0, 0.0),
        (0.002019, 2.4, 9, 0, 0.0),
        (-8.876, 0.6, 1, 1, 1.0),
        (-0.02916, 3.6, 8, 1, 1.0),
    ),
)


#: Highest power of delta kept in the series form of alphar (see :func:`_prepare`).
SERIES_ORDER = 4


@dataclass(frozen=True)
class _Prepared:
    """alphar of the power terms rewritten as ``sum_k a_k(tau) delta^k``.

    ``a_k(tau) = sum_j m0[k, j] tau^t_j``; ``m1 = m0 t`` and ``m2 = m0 t (t - 1)`` give
    ``tau da_k/dtau`` and ``tau^2 d2a_k/dtau2``.
    """

    t_unique: np.ndarray
    t_steps: tuple  # integer multiples of t_quantum between successive t_unique
    t_quantum: float
    m0: np.ndarray  # (SERIES_ORDER + 1, t_unique)
    m1: np.ndarray
    m2: np.ndarray
    m012: np.ndarray  # m0, m1, m2 stacked
    nonzero: tuple  # (row of m012, column, coefficient) of its non-zero entries
    k: np.ndarray  # 0 .. SERIES_ORDER


def _prepare(gas: HelmholtzGas) -> _Prepared:
    """Expand each power term ``n delta^d tau^t exp(-delta^l)`` in powers of delta.

    ``exp(-delta^l) = sum_m (-delta^l)^m / m!``. Cut at delta^4 (a virial series to the
    fifth coefficient) density and speed of sound differ from the full equation by less than
    2e-4 relative and cp/cv by less than 1e-3 in the gas states used (``delta < 0.15``, worst
    next to the saturated vapour at 1-1.2 MPa; checked in the tests against the full equation
    evaluated by CoolProp), well inside the accuracy asked of the planner's property models.
    """
    t_all = [term[1] for term in gas.power_terms] + [term[1] for term in gas.visc_residual]
    t_unique = np.unique(t_all)
    quantum = next(q for q in (0.125, 0.05, 0.025, 0.01, 0.005, 0.001)
                   if np.allclose(t_unique / q, np.round(t_unique / q)))
    m0 = np.zeros((SERIES_ORDER + 1, t_unique.size))
    for n, t, d, l in gas.power_terms:
        j = np.searchsorted(t_unique, t)
        if l == 0:
            if d <= SERIES_ORDER:
                m0[int(d), j] += n
            continue
        m, fact = 0, 1.0
        while d + l * m <= SERIES_ORDER:
            m0[int(d + l * m), j] += n * (-1.0) ** m / fact
            m += 1
            fact *= m
    # keep only the tau powers the truncated series and the viscosity use
    visc_t = [term[1] for term in gas.visc_residual]
    used = np.any(m0 != 0.0, axis=0) | np.isin(t_unique, visc_t)
    t_unique, m0 = t_unique[used], m0[:, used]
    ints = np.round(t_unique / quantum).astype(int)
    steps = tuple(int(x) for x in np.diff(np.concatenate(([0], ints))))
    m1 = m0 * t_unique
    m2 = m0 * t_unique * (t_unique - 1.0)
    m012 = np.vstack([m0, m1, m2])
    rows, cols = np.nonzero(m012)
    nonzero = tuple((int(r), int(c), float(m012[r, c])) for r, c in zip(rows, cols, strict=True))
    return _Prepared(t_unique, steps, quantum, m0, m1, m2, m012, nonzero,
                     np.arange(SERIES_ORDER + 1, dtype=float))


_PREPARED = {NITROGEN.name: _prepare(NITROGEN), AIR.name: _prepare(AIR)}


def _tau_powers(tau: np.ndarray, prep: _Prepared) -> np.ndarray:
    """tau^t for every t of ``prep.t_unique``, shape (t_unique, points).

    One exponential gives ``x = tau^q`` (q, e.g. 1/8 or 1/200, divides every exponent); the
    powers then follow by multiplication along the sorted exponents, using the binary powers
    of x, which is several times faster than one ``pow`` per exponent on large grids.
    """
    x = np.exp(prep.t_quantum * np.log(tau))
    binary = [x]
    top = max(prep.t_steps)
    while (1 << len(binary)) <= top:
        binary.append(binary[-1] * binary[-1])
    out = np.empty((len(prep.t_steps), tau.size))
    current = np.ones_like(tau)
    for i, step in enumerate(prep.t_steps):
        bit = 0
        while step:
            if step & 1:
                current = current * binary[bit]
            step >>= 1
            bit += 1
        out[i] = current
    return out


def _ideal_tt(tau: np.ndarray, gas: HelmholtzGas) -> np.ndarray:
    """tau^2 d2(alpha0)/d tau^2 [-]."""
    out = np.full_like(tau, -gas.ideal_log_tau)
    inv = 1.0 / tau
    # products instead of pow: the exponents of both equations are -3, -2, -1, 0, 1 and 1.5
    powers = {-1.0: inv, -2.0: inv * inv, -3.0: inv * inv * inv}
    for n, t in gas.ideal_power:
        if t in (0.0, 1.0):
            continue
        tp = tau * np.sqrt(tau) if t == 1.5 else powers[t]
        out += n * t * (t - 1.0) * tp
    for n, theta in gas.ideal_planck:
        e = np.exp(-theta * tau)
        out -= n * (theta * tau) ** 2 * e / (1.0 - e) ** 2
    for n, theta, c, d in gas.ideal_planck_general:
        e = np.exp(-theta * tau)
        out += n * (theta * tau) ** 2 * c * d * e / (c * e + d) ** 2
    return out


def _series(coeffs: np.ndarray, dpow: np.ndarray, weights: np.ndarray | None = None):
    """sum_k w_k a_k delta^k over axis 0."""
    if weights is None:
        return np.einsum("ki,ki->i", coeffs, dpow)
    return np.einsum("k,ki,ki->i", weights, coeffs, dpow)


def _powers(delta: np.ndarray) -> np.ndarray:
    out = np.empty((SERIES_ORDER + 1, delta.size))
    out[0] = 1.0
    for k in range(1, SERIES_ORDER + 1):
        np.multiply(out[k - 1], delta, out=out[k])
    return out


def gas_state(gas: HelmholtzGas, temperature, pressure) -> dict:
    """Density, heat capacities, speed of sound and viscosity of a gas-phase state.

    Parameters
    ----------
    gas : HelmholtzGas
        :data:`NITROGEN` or :data:`AIR`.
    temperature : float or array_like
        Temperature [K].
    pressure : float or array_like
        Absolute pressure [Pa]; the state must be a gas of reduced density below about 0.2
        (the caller checks saturation and range).

    Returns
    -------
    dict
        ``density`` [kg/m^3], ``compressibility`` Z [-], ``cp``, ``cv`` and the ideal-gas
        ``cv0`` [J/(kg K)],
        ``gamma`` [-], ``speed_of_sound`` [m/s], ``viscosity`` [Pa s], arrays of the broadcast
        shape of the inputs.

    Notes
    -----
    Density is found by Newton iteration on ``p/(rho_r R T) = delta (1 + delta alphar_delta)``
    from the second-virial start; in the gas states used it converges to 1e-12 in a few steps.
    """
    T, p = np.broadcast_arrays(np.asarray(temperature, float), np.asarray(pressure, float))
    shape = T.shape
    T = T.ravel()
    p = p.ravel()
    if T.size <= CHUNK:
        out = _gas_state_flat(gas, T, p)
    else:
        # Blocks keep the temporaries in cache: about 1.5x faster on 1e5 points.
        parts = [_gas_state_flat(gas, T[i:i + CHUNK], p[i:i + CHUNK])
                 for i in range(0, T.size, CHUNK)]
        out = {name: np.concatenate([part[name] for part in parts]) for name in parts[0]}
    return {name: v.reshape(shape) for name, v in out.items()}


#: Points evaluated per block by :func:`gas_state`.
CHUNK = 16384


def _gas_state_flat(gas: HelmholtzGas, T: np.ndarray, p: np.ndarray) -> dict:
    prep = _PREPARED[gas.name]
    k = prep.k
    tau = gas.t_reduce / T
    tpow = _tau_powers(tau, prep)
    # a sparse product (about a third of the entries are non-zero); plain ufuncs stay on one
    # thread and in cache: on shared machines a threaded BLAS call here was slower
    coeffs = np.zeros((prep.m012.shape[0], T.size))
    for row, col, c in prep.nonzero:
        coeffs[row] += c * tpow[col]
    a0, a1, a2 = np.split(coeffs, 3)
    target = p / (gas.rho_reduce * gas.gas_constant * T)
    # start from the second-virial solution of delta (1 + a_1 delta) = target
    delta = 2.0 * target / (1.0 + np.sqrt(np.maximum(1.0 + 4.0 * a0[1] * target, 0.25)))
    ka = k[:, None] * a0
    kka = (k * (k - 1.0))[:, None] * a0
    for _ in range(12):
        dpow = _powers(delta)
        ad = _series(ka, dpow)  # delta * d(alphar)/d(delta)
        step = (delta * (1.0 + ad) - target) / (1.0 + 2.0 * ad + _series(kka, dpow))
        delta = delta - step
        if np.all(np.abs(step) <= 1e-10 * np.abs(delta)):  # quadratic: next error < 1e-19
            break
    dpow = _powers(delta)
    ad = _series(ka, dpow)
    add = _series(kka, dpow)
    att = _series(a2, dpow)
    adt = _series(a1, dpow, k)
    r = gas.gas_constant / gas.molar_mass
    itt = _ideal_tt(tau, gas)
    cv = -(itt + att) * r
    stiff = 1.0 + 2.0 * ad + add
    cp = cv + r * (1.0 + ad - adt) ** 2 / stiff
    gamma = cp / cv
    w = np.sqrt(r * T * gamma * stiff)
    rho = delta * gas.rho_reduce * gas.molar_mass
    mu = viscosity(gas, T, delta, tau, dpow, tpow)
    return {
        "density": rho, "compressibility": 1.0 + ad, "cp": cp, "cv": cv, "gamma": gamma,
        "speed_of_sound": w, "viscosity": mu, "cv0": -itt * r,
    }


def _int_power(delta: np.ndarray, d: int, dpow: np.ndarray | None) -> np.ndarray:
    """delta^d for an integer d, from the table of powers where it holds them."""
    if dpow is None:
        return delta ** int(d)
    top = dpow.shape[0] - 1
    out = dpow[min(d, top)]
    while d > top:
        d -= top
        out = out * dpow[min(d, top)]
    return out


def viscosity(gas: HelmholtzGas, temperature, delta, tau, dpow=None, tpow=None) -> np.ndarray:
    r"""Viscosity [Pa s] by Lemmon & Jacobsen (2004), eqs. (2)-(4).

    .. math::

        \eta = \eta^0(T) + \eta^r(\tau, \delta), \quad
        \eta^0 = \frac{0.0266958 \sqrt{M T}}{\sigma^2 \Omega(T^*)}, \quad
        \Omega = \exp\Big(\sum_{i=0}^{4} b_i (\ln T^*)^i\Big), \quad
        \eta^r = \sum_i N_i \tau^{t_i} \delta^{d_i} \exp(-\gamma_i \delta^{l_i})

    with ``eta`` in uPa s, M in g/mol, T in K, sigma in nm and ``T* = T/(epsilon/k)``.
    ``dpow`` (delta^k, k = 0..12) and ``tpow`` (from :func:`_tau_powers`) may be passed to reuse
    powers already computed.
    """
    T = np.asarray(temperature, float)
    delta = np.asarray(delta, float)
    tau = np.asarray(tau, float)
    prep = _PREPARED[gas.name]
    if tpow is None:
        tpow = _tau_powers(tau.ravel(), prep).reshape((-1,) + tau.shape)
    ln_omega = horner(OMEGA_B, np.log(T / gas.visc_eps_k))
    eta0 = (0.0266958 * np.sqrt(gas.visc_molar_mass_g * T)
            / (gas.visc_sigma_nm**2 * np.exp(ln_omega)))
    eta_r = np.zeros_like(eta0)
    expo = {}
    for n, t, d, l, gam in gas.visc_residual:
        dd = _int_power(delta, d, dpow)
        term = n * tpow[np.searchsorted(prep.t_unique, t)] * dd
        if gam:
            if l not in expo:
                expo[l] = np.exp(-gam * _int_power(delta, l, dpow))
            term = term * expo[l]
        eta_r += term
    return (eta0 + eta_r) * 1e-6

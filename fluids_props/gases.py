"""Test gases: nitrogen (built in) and other gases through the optional CoolProp back-end.

Nitrogen: built in, not through CoolProp
----------------------------------------
Cryogenic and pressurised wind tunnels run on nitrogen from about 90 K to room temperature and
1 to 10 bar, and the planner evaluates the test gas on grids of 1e5 states. Nitrogen is therefore
built in: the reference equation of state of Span et al. (2000) and the viscosity correlation of
Lemmon & Jacobsen (2004) are evaluated in vectorised numpy (:mod:`fluids_props._helmholtz_gas`),
so the core package needs no compiled dependency and a 1e5-point grid takes tens of ms rather
than the seconds of a point-by-point call into CoolProp. The equation is used in its gas-phase
virial form (the power terms expanded to delta^4, the near-critical Gaussian terms left out);
against the full equation (CoolProp) density agrees within 1.1e-4, viscosity 1e-5, speed of sound
3e-5 and cp/cv 7e-4 over 65-500 K and 1 kPa-1.2 MPa, the worst next to the saturated vapour at
1 MPa (tests); the acceptance target is 2 %.

Only the gas phase is modelled. Below the critical temperature (126.192 K) a state at or above
the saturation pressure (vapour-pressure equation of Span et al. 2000) is liquid and is refused
with an error naming the saturation pressure and temperature; e.g. 90 K and 10 bar is liquid
(saturation pressure 3.6 bar at 90 K; boiling point 103.8 K at 10 bar).

Other gases: optional CoolProp back-end
---------------------------------------
When the ``coolprop`` extra is installed, :func:`coolprop_fluid` opens any CoolProp fluid
(reference equations of state and transport correlations as cited by CoolProp), and
:func:`optional_fluid_infos` lists a few test gases for the planner under the names
``coolprop:sf6``, ``coolprop:r134a``, ``coolprop:helium``, ``coolprop:co2`` and
``coolprop:argon`` (lower case, as the catalogue look-up folds case). CoolProp is imported only
when such a fluid is evaluated; everything else works without it.

References
----------
1. Span, R., Lemmon, E. W., Jacobsen, R. T, Wagner, W. & Yokozeki, A. (2000). A reference
   equation of state for the thermodynamic properties of nitrogen for temperatures from 63.151
   to 1000 K and pressures to 2200 MPa. J. Phys. Chem. Ref. Data 29(6), 1361-1433.
2. Lemmon, E. W. & Jacobsen, R. T (2004). Viscosity and thermal conductivity equations for
   nitrogen, oxygen, argon, and air. Int. J. Thermophys. 25(1), 21-69.
3. Bell, I. H., Wronski, J., Quoilin, S. & Lemort, V. (2014). Pure and pseudo-pure fluid
   thermophysical property evaluation and the open-source thermophysical property library
   CoolProp. Ind. Eng. Chem. Res. 53(6), 2498-2508.
"""

from __future__ import annotations

import importlib.util
from dataclasses import dataclass

import numpy as np

from . import _helmholtz_gas as hg
from ._arrays import broadcast_float_arrays, check_ranges
from ._arrays import float_or_array as _out
from .registry import FluidInfo
from .state import FluidState
from .units import si_edge
from .validity import OutOfRangeError, Range

N2_T_RANGE = Range("temperature", 65.0, 500.0, "K")
N2_P_RANGE = Range("pressure", 1.0e3, 1.2e6, "Pa")

#: Critical temperature [K] and pressure [Pa] of nitrogen (Span et al. 2000).
N2_T_CRIT = 126.192
N2_P_CRIT = 3.3958e6
#: Coefficients of the vapour-pressure equation of Span et al. (2000).
_N2_PSAT = (-6.12445284, 1.26327220, -0.765910082, -1.77570564)

N2_SOURCES = (
    "density, speed of sound: Span et al. 2000 (JPCRD 29:1361), gas-phase virial form",
    "viscosity: Lemmon & Jacobsen 2004 (IJT 25:21)",
    "saturation pressure: Span et al. 2000 vapour-pressure equation",
)


def nitrogen_saturation_pressure_si(temperature_K):
    r"""Saturation (vapour) pressure of nitrogen [Pa], 63.151-126.192 K.

    .. math::

        \ln\frac{p_s}{p_c} = \frac{T_c}{T}(N_1\theta + N_2\theta^{1.5} + N_3\theta^{2.5}
        + N_4\theta^5), \quad \theta = 1 - T/T_c

    with T_c = 126.192 K, p_c = 3.3958 MPa, N = (-6.12445284, 1.26327220, -0.765910082,
    -1.77570564). NaN above the critical temperature.

    References
    ----------
    1. Span et al. (2000), J. Phys. Chem. Ref. Data 29, 1361-1433 (ancillary equation).
    """
    T = np.asarray(temperature_K, dtype=float)
    out = np.full(T.shape, np.nan)
    sub = T <= N2_T_CRIT
    if np.any(sub):
        ts = T[sub]
        th = 1.0 - ts / N2_T_CRIT
        th15 = th * np.sqrt(th)  # integer and half powers by products: fast on large grids
        th25 = th15 * th
        n1, n2, n3, n4 = _N2_PSAT
        out[sub] = N2_P_CRIT * np.exp(N2_T_CRIT / ts * (n1 * th + n2 * th15 + n3 * th25
                                                        + n4 * th25 * th25))
    return out if out.ndim else float(out)


def nitrogen_saturation_temperature_si(pressure_Pa):
    """Saturation (boiling) temperature of nitrogen [K] at a pressure [Pa] below critical.

    Inverts :func:`nitrogen_saturation_pressure_si` by Newton iteration on ln p.
    """
    p = np.asarray(pressure_Pa, dtype=float)
    T = np.full_like(p, 100.0)
    for _ in range(30):
        f = np.log(nitrogen_saturation_pressure_si(T) / p)
        h = 1e-4
        df = (np.log(nitrogen_saturation_pressure_si(T + h) / p) - f) / h
        T = np.clip(T - f / df, 63.0, N2_T_CRIT)
    return T


def _refuse_liquid(T, p, psat, where, extrapolate):
    """Mask of liquid states; raise for them unless extrapolating."""
    liquid = (T < N2_T_CRIT) & (p >= np.where(np.isnan(psat), np.inf, psat))
    if np.any(liquid) and not extrapolate:
        t0 = float(T[liquid].flat[0])
        p0 = float(p[liquid].flat[0])
        ps = float(nitrogen_saturation_pressure_si(t0))
        msg = (f"{where} at {t0:g} K and {p0 / 1e5:g} bar is liquid (saturation pressure "
               f"{ps / 1e5:.4g} bar at {t0:g} K")
        if p0 < N2_P_CRIT:
            msg += f"; boiling point {float(nitrogen_saturation_temperature_si(p0)):.4g} K at " \
                   f"{p0 / 1e5:g} bar"
        raise OutOfRangeError(msg + "); this model covers the gas phase only: expected a lower "
                              "pressure or a higher temperature")
    return liquid


def nitrogen_si(temperature_K, pressure_Pa=101325.0, extrapolate=False, **_) -> FluidState:
    """Properties of gaseous nitrogen, SI in and out, vectorised.

    Parameters
    ----------
    temperature_K : float or array_like
        Temperature [K], 65-500 K.
    pressure_Pa : float or array_like
        Absolute pressure [Pa], 1 kPa-1.2 MPa, below the saturation pressure.
    extrapolate : bool
        Evaluate outside the ranges instead of raising; liquid states then give NaN.

    Returns
    -------
    FluidState
        Density, viscosity, speed of sound; ``extra`` holds ``ratio_of_specific_heats`` [-],
        ``compressibility`` [-], ``isobaric_heat_capacity`` [J/(kg K)] and
        ``saturation_pressure`` [Pa] (NaN above the critical temperature).

    Raises
    ------
    OutOfRangeError
        Outside the ranges, or for a liquid state.

    References
    ----------
    1. Span et al. (2000), J. Phys. Chem. Ref. Data 29, 1361-1433.
    2. Lemmon & Jacobsen (2004), Int. J. Thermophys. 25, 21-69.
    """
    T, p = broadcast_float_arrays("nitrogen", temperature=temperature_K, pressure=pressure_Pa)
    check_ranges("nitrogen", extrapolate, (T, N2_T_RANGE), (p, N2_P_RANGE))
    psat = nitrogen_saturation_pressure_si(T)
    liquid = _refuse_liquid(T, p, psat, "nitrogen", extrapolate)
    # Liquid points (extrapolate=True) are evaluated at half their saturation pressure, a safe
    # vapour state, and then blanked, so the iteration never runs into the two-phase region.
    p_eval = np.where(liquid, 0.5 * np.nan_to_num(psat, nan=N2_P_CRIT), p) if np.any(liquid) else p
    props = hg.gas_state(hg.NITROGEN, T, p_eval)
    if np.any(liquid):
        props = {k: np.where(liquid, np.nan, v) for k, v in props.items()}
    return FluidState(
        "nitrogen", _out(T), _out(p), _out(props["density"]), _out(props["viscosity"]),
        speed_of_sound_si=_out(props["speed_of_sound"]),
        extra={"ratio_of_specific_heats": _out(props["gamma"]),
               "compressibility": _out(props["compressibility"]),
               "isobaric_heat_capacity": _out(props["cp"]),
               "saturation_pressure": _out(psat)},
        sources=N2_SOURCES,
    )


@si_edge(nitrogen_si, temperature="[temperature]", pressure="[pressure]")
def nitrogen(temperature, pressure="101325 Pa", extrapolate=False) -> FluidState:
    """Properties of gaseous nitrogen, the test gas of cryogenic wind tunnels.

    Parameters
    ----------
    temperature : str, pint.Quantity or array
        Temperature, e.g. ``"110 K"`` or ``"-160 degC"`` (65-500 K).
    pressure : str, pint.Quantity or array
        Absolute pressure, e.g. ``"4.5 bar"`` (1 kPa-1.2 MPa, gas phase).
    extrapolate : bool
        Evaluate outside the ranges instead of raising.

    Returns
    -------
    FluidState
        See :func:`nitrogen_si`.
    """


N2_FLUID_INFO = FluidInfo(
    "nitrogen", "gas",
    "gaseous nitrogen, 65-500 K, 1 kPa-1.2 MPa (Span et al. 2000; Lemmon & Jacobsen 2004)",
    (N2_T_RANGE, N2_P_RANGE), nitrogen_si, sources=N2_SOURCES,
)


def builtin_fluid_infos() -> tuple[FluidInfo, ...]:
    """The test gases built into the package (no optional dependency): nitrogen."""
    return (N2_FLUID_INFO,)


# -- optional CoolProp back-end ------------------------------------------------------------

#: Catalogue key -> (CoolProp name, description, low T [K], high T [K], high p [Pa]).
COOLPROP_GASES: dict[str, tuple[str, str, float, float, float]] = {
    "sf6": ("SF6", "sulphur hexafluoride, heavy test gas", 223.555, 625.0, 1.0e7),
    "r134a": ("R134a", "R-134a (1,1,1,2-tetrafluoroethane), heavy test gas", 169.85, 455.0, 1.0e7),
    "helium": ("Helium", "helium", 2.2, 1500.0, 1.0e7),
    "co2": ("CarbonDioxide", "carbon dioxide", 216.592, 1100.0, 1.0e7),
    "argon": ("Argon", "argon", 83.806, 1500.0, 1.0e7),
}


def coolprop_available() -> bool:
    """True if the optional CoolProp package can be imported (it is not imported here)."""
    return importlib.util.find_spec("CoolProp") is not None


def _coolprop():
    try:
        from CoolProp import CoolProp as cp  # noqa: PLC0415 - optional, imported on first use
    except ImportError:
        raise OutOfRangeError(
            "fluid: CoolProp-backed fluids need the optional 'coolprop' extra "
            "(pip install 'similitude[coolprop]' or pip install CoolProp)"
        ) from None
    return cp


def coolprop_fluid_si(name: str, temperature_K, pressure_Pa=101325.0, extrapolate=False,
                      **_) -> FluidState:
    """Properties of a gas from CoolProp, SI in and out (loops over points in CoolProp).

    Parameters
    ----------
    name : str
        CoolProp fluid name (``"SF6"``, ``"R134a"``, ``"Helium"``, ...) or a key of
        :data:`COOLPROP_GASES` (``"sf6"``).
    temperature_K, pressure_Pa : float or array_like
        Temperature [K] and absolute pressure [Pa].
    extrapolate : bool
        If True, liquid states give NaN instead of an error.

    Returns
    -------
    FluidState
        Density, viscosity, speed of sound; ``extra`` holds ``ratio_of_specific_heats`` [-]
        (cp/cv of the real gas) and ``compressibility`` [-].

    Raises
    ------
    OutOfRangeError
        If CoolProp is missing, the name is unknown to CoolProp, or a state is liquid.

    References
    ----------
    1. Bell et al. (2014), Ind. Eng. Chem. Res. 53, 2498-2508, and the equations of state and
       transport correlations CoolProp cites for the fluid.
    """
    cp = _coolprop()
    key = name.strip().lower()
    cp_name = COOLPROP_GASES[key][0] if key in COOLPROP_GASES else name.strip()
    T, p = broadcast_float_arrays(f"coolprop:{key}", temperature=temperature_K,
                                  pressure=pressure_Pa)
    shape = T.shape
    Tf, pf = T.ravel(), p.ravel()
    try:
        t_crit = cp.PropsSI("Tcrit", cp_name)
    except ValueError:
        raise OutOfRangeError(
            f"fluid: CoolProp does not know {name!r}; expected a CoolProp fluid name such as "
            "'SF6', 'R134a', 'Helium' or 'CarbonDioxide'"
        ) from None
    liquid = np.zeros(Tf.shape, dtype=bool)
    sub = Tf < t_crit
    if np.any(sub):
        psat = np.asarray(cp.PropsSI("P", "T", Tf[sub], "Q", 1, cp_name), dtype=float)
        liquid[sub] = pf[sub] >= psat
    if np.any(liquid) and not extrapolate:
        i = int(np.flatnonzero(liquid)[0])
        raise OutOfRangeError(
            f"{cp_name} at {Tf[i]:g} K and {pf[i] / 1e5:g} bar is liquid; this gas model covers "
            "the gas phase only: expected a lower pressure or a higher temperature"
        )
    ok = ~liquid
    out = {k: np.full(Tf.shape, np.nan) for k in ("D", "V", "A", "Cpmass", "Cvmass", "Z")}
    if np.any(ok):
        for k in out:
            out[k][ok] = cp.PropsSI(k, "T", Tf[ok], "P", pf[ok], cp_name)
    r = {k: v.reshape(shape) for k, v in out.items()}
    return FluidState(
        f"coolprop:{key}", _out(T), _out(p), _out(r["D"]), _out(r["V"]),
        speed_of_sound_si=_out(r["A"]),
        extra={"ratio_of_specific_heats": _out(r["Cpmass"] / r["Cvmass"]),
               "compressibility": _out(r["Z"])},
        sources=(f"CoolProp {cp.get_global_param_string('version')} fluid {cp_name!r} "
                 "(Bell et al. 2014, IECR 53:2498)",),
    )


@si_edge(coolprop_fluid_si, temperature="[temperature]", pressure="[pressure]")
def coolprop_fluid(name: str, temperature, pressure="101325 Pa",
                   extrapolate=False) -> FluidState:
    """Properties of a gas from the optional CoolProp back-end.

    Parameters
    ----------
    name : str
        CoolProp fluid name or catalogue key, e.g. ``"SF6"``, ``"R134a"``, ``"helium"``.
    temperature : str, pint.Quantity or array
        Temperature, e.g. ``"20 degC"``.
    pressure : str, pint.Quantity or array
        Absolute pressure, e.g. ``"1 bar"``.
    extrapolate : bool
        If True, liquid states give NaN instead of an error.

    Returns
    -------
    FluidState
        See :func:`coolprop_fluid_si`.
    """


@dataclass(frozen=True)
class _CoolPropEvaluator:
    """``evaluate_si`` of a catalogue entry: a CoolProp fluid with range checks."""

    key: str
    ranges: tuple

    def __call__(self, temperature_K, pressure_Pa=101325.0, extrapolate=False, **_):
        check_ranges(f"coolprop:{self.key}", extrapolate, (temperature_K, self.ranges[0]),
                     (pressure_Pa, self.ranges[1]))
        return coolprop_fluid_si(self.key, temperature_K, pressure_Pa, extrapolate)


def optional_fluid_infos() -> tuple[FluidInfo, ...]:
    """Catalogue entries for CoolProp test gases; empty when CoolProp is not installed.

    CoolProp is not imported here, only looked for.
    """
    if not coolprop_available():
        return ()
    infos = []
    for key, (cp_name, text, t_low, t_high, p_high) in COOLPROP_GASES.items():
        ranges = (Range("temperature", t_low, t_high, "K"),
                  Range("pressure", 1.0e3, p_high, "Pa"))
        infos.append(FluidInfo(
            f"coolprop:{key}", "gas", f"{text} (CoolProp '{cp_name}', optional; gas phase only)",
            ranges, _CoolPropEvaluator(key, ranges),
            sources=(f"CoolProp fluid {cp_name!r} (Bell et al. 2014, IECR 53:2498)",),
        ))
    return tuple(infos)

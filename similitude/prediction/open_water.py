"""Propeller open-water data: K_T, K_Q and η_0 against J, model and full scale (ITTC-1978).

The model characteristics are corrected for the scale effect on the blade-section drag at
0.75 R (:func:`similitude.correlations.propeller_scaling.open_water_full_scale`):

    ΔC_D = C_DM − C_DS,
    C_DM = 2(1 + 2t/c)[0.044 Re_co^(−1/6) − 5 Re_co^(−2/3)],
    C_DS = 2(1 + 2t/c)(1.89 + 1.62 log10(c/k_p))^(−2.5),
    K_TS = K_TM + ΔC_D · 0.3 (P/D)(c Z/D),   K_QS = K_QM − ΔC_D · 0.25 (c Z/D),

with the model chord Reynolds number Re_co = c_0.75 √(V_A² + (0.75 π n D)²)/ν.

References
----------
.. [1] ITTC, "1978 ITTC Performance Prediction Method", Recommended Procedure 7.5-02-03-01.4,
       Rev 04 (2017), §2.4 "Scale effect corrections for propeller characteristics" (the same
       correction as the 1978 method, Rev 00, 1999).
.. [2] ITTC, "Open Water Test", Recommended Procedure 7.5-02-03-02.1 (model chord Reynolds
       number; at least 2e5 asked).

pandas is imported inside :func:`scale_open_water`, so that building the command line's parsers
at start does not load it.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np

from fluids_props.water import fresh_water_si
from similitude.correlations import propeller_scaling as _ps
from similitude.errors import InputError
from similitude.prediction.runs import OpenWaterRuns
from similitude.units import to_si

MIN_CHORD_REYNOLDS = 2.0e5
"""Smallest model chord Reynolds number at 0.75 R asked for open-water tests (ITTC
7.5-02-03-02.1, from memory, medium confidence)."""


@dataclass(frozen=True)
class PropellerParticulars:
    """Geometry of the propeller at 0.75 R, full scale, and the model scale.

    Attributes
    ----------
    diameter : float
        Ship propeller diameter D_S [m].
    scale : float
        λ = D_S / D_M [-].
    pitch_diameter : float
        P/D at 0.75 R [-].
    chord_diameter : float
        c/D at 0.75 R [-].
    blades : int
        Number of blades Z.
    thickness_chord : float
        t/c at 0.75 R [-].
    blade_roughness : float
        Full-scale blade roughness k_p [m]; 30e-6 by the ITTC method.
    """

    diameter: float
    scale: float
    pitch_diameter: float
    chord_diameter: float
    blades: int
    thickness_chord: float
    blade_roughness: float = _ps.DEFAULT_BLADE_ROUGHNESS

    def __post_init__(self) -> None:
        for key in ("diameter", "scale", "pitch_diameter", "chord_diameter",
                    "thickness_chord", "blade_roughness"):
            value = getattr(self, key)
            if not (isinstance(value, (int, float)) and math.isfinite(value) and value > 0):
                raise InputError(f"propeller.{key}: {value!r}; expected a positive number")
        if not (isinstance(self.blades, int) and 2 <= self.blades <= 9):
            raise InputError(f"propeller.blades: {self.blades!r}; expected a whole number of "
                             "blades from 2 to 9")

    @classmethod
    def from_text(cls, text: str, scale: float) -> PropellerParticulars:
        """Read ``"diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.3; blades=4;
        thickness_ratio=0.04"`` (optional ``roughness=30 um``), full-scale values at 0.75 R.

        Parameters
        ----------
        text : str
            ``key=value`` pairs separated by ``;`` or ``,``.
        scale : float
            λ of the model propeller [-].
        """
        keys = {"diameter": "diameter", "pitch_ratio": "pitch_diameter",
                "chord_ratio": "chord_diameter", "blades": "blades",
                "thickness_ratio": "thickness_chord", "roughness": "blade_roughness"}
        values: dict[str, Any] = {}
        for part in text.replace(",", ";").split(";"):
            if not part.strip():
                continue
            key, sep, value = part.partition("=")
            key = key.strip().lower()
            if not sep or key not in keys:
                raise InputError(f"propeller: {part.strip()!r} is not understood; expected "
                                 "key=value with keys " + ", ".join(keys))
            name = keys[key]
            if name in ("diameter", "blade_roughness"):
                values[name] = to_si(value.strip(), "[length]", f"propeller.{key}")
            else:
                try:
                    number = float(value)
                except ValueError:
                    raise InputError(f"propeller.{key}: {value.strip()!r}; expected a "
                                     "number") from None
                values[name] = int(number) if name == "blades" and number.is_integer() else (
                    number)
        missing = [k for k, n in keys.items() if n not in values and k != "roughness"]
        if missing:
            raise InputError("propeller: missing " + ", ".join(missing) + "; expected e.g. "
                             "'diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.3; blades=4; "
                             "thickness_ratio=0.04'")
        return cls(scale=float(scale), **values)

    @property
    def model_diameter(self) -> float:
        """D_M = D_S/λ [m]."""
        return self.diameter / self.scale

    @property
    def chord(self) -> float:
        """Full-scale chord at 0.75 R [m]."""
        return self.chord_diameter * self.diameter


def chord_reynolds(advance_ratio, rotation_rate, diameter, chord_diameter,
                   kinematic_viscosity):
    r"""Chord Reynolds number of the blade section at 0.75 R [-].

    .. math:: Re_{co} = \frac{c_{0.75} \sqrt{V_A^2 + (0.75 \pi n D)^2}}{\nu},
              \quad V_A = J n D

    Parameters
    ----------
    advance_ratio : array_like
        J [-].
    rotation_rate : array_like
        n [1/s].
    diameter : float
        D [m].
    chord_diameter : float
        c/D at 0.75 R [-].
    kinematic_viscosity : array_like
        ν [m^2/s].

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), §2.4.
    """
    j = np.asarray(advance_ratio, dtype=float)
    n = np.asarray(rotation_rate, dtype=float)
    va = j * n * diameter
    return chord_diameter * diameter * np.hypot(va, 0.75 * np.pi * n * diameter) / np.asarray(
        kinematic_viscosity, dtype=float)


@dataclass(frozen=True, eq=False)
class OpenWaterScaling:
    """Model and full-scale open-water characteristics.

    Attributes
    ----------
    propeller : PropellerParticulars
    table : pandas.DataFrame
        Per run: J, Re_co, K_T, K_Q, η_0 of the model; ΔC_D; K_T, K_Q, η_0 of the ship.
    notes : tuple of str
    """

    propeller: PropellerParticulars
    table: Any
    notes: tuple[str, ...]


def scale_open_water(runs: OpenWaterRuns, propeller: PropellerParticulars,
                     reynolds_chord: float | None = None) -> OpenWaterScaling:
    """Correct measured open-water characteristics to full scale (ITTC-1978).

    Parameters
    ----------
    runs : OpenWaterRuns
        Measured J, K_T, K_Q (and, when measured, n and the water temperature).
    propeller : PropellerParticulars
    reynolds_chord : float, optional
        Model chord Reynolds number at 0.75 R [-], one value for all runs; default: from the
        measured rotation rate and water temperature of each run (fresh water).

    Returns
    -------
    OpenWaterScaling

    References
    ----------
    .. [1] ITTC 7.5-02-03-01.4 Rev 04 (2017), §2.4.
    """
    import pandas as pd

    j, kt, kq = runs.advance_ratio, runs.thrust_coefficient, runs.torque_coefficient
    if reynolds_chord is not None:
        if not (isinstance(reynolds_chord, (int, float)) and reynolds_chord > 0):
            raise InputError(f"reynolds_chord: {reynolds_chord!r}; expected a positive number")
        re_co = np.full(len(j), float(reynolds_chord))
    elif runs.rotation_rate is not None and runs.temperature is not None:
        nu = np.asarray(fresh_water_si(runs.temperature).kinematic_viscosity_si, float)
        re_co = chord_reynolds(j, runs.rotation_rate, propeller.model_diameter,
                               propeller.chord_diameter, nu)
    else:
        raise InputError("open-water runs: rotation rate and water temperature missing; "
                         "expected them in the file, or the model chord Reynolds number")
    kts, kqs = _ps.open_water_full_scale(
        j, kt, kq, propeller.pitch_diameter, propeller.chord_diameter, propeller.blades,
        propeller.thickness_chord, re_co, chord_075=propeller.chord,
        roughness=propeller.blade_roughness)
    cdm = np.atleast_1d(_ps.blade_drag_model(propeller.thickness_chord, re_co))
    cds = float(_ps.blade_drag_full_scale(propeller.thickness_chord, propeller.chord,
                                          propeller.blade_roughness))
    kts, kqs = np.atleast_1d(kts), np.atleast_1d(kqs)
    table = pd.DataFrame({
        "run": list(runs.run),
        "advance ratio J [-]": j,
        "model chord Reynolds number [-]": re_co,
        "K_T model [-]": kt,
        "K_Q model [-]": kq,
        "eta_0 model [-]": np.atleast_1d(_ps.open_water_efficiency(j, kt, kq)),
        "C_DM [-]": cdm,
        "C_DS [-]": np.full(len(j), cds),
        "dC_D [-]": cdm - cds,
        "K_T ship [-]": kts,
        "K_Q ship [-]": kqs,
        "eta_0 ship [-]": np.atleast_1d(_ps.open_water_efficiency(j, kts, kqs)),
    })
    notes = ["ITTC-1978 blade-drag scale correction at 0.75 R (ITTC 7.5-02-03-01.4 Rev 04, "
             "2017, §2.4)."]
    if np.any(re_co < MIN_CHORD_REYNOLDS):
        notes.append(f"Some runs have Re_co below {MIN_CHORD_REYNOLDS:.0e}: laminar flow on the "
                     "model blades makes the correction unreliable.")
    return OpenWaterScaling(propeller, table, tuple(notes))


__all__ = [
    "MIN_CHORD_REYNOLDS",
    "OpenWaterScaling",
    "PropellerParticulars",
    "chord_reynolds",
    "scale_open_water",
]

"""What the model shop builds: mass per loading, draughts, centres, radii of gyration, natural
periods, turbulence stimulators and the model propeller (Froude scaling).

``model_build(case, scale, model_fluid, prototype_fluid)`` scales the prototype's loading
conditions to the model: lengths by 1/lambda, volumes by 1/lambda^3, periods by 1/sqrt(lambda)
and mass by rho_m V_m, the displacement volume of the model in the test water. The mass of a
model floating at the scaled draught is fixed by the water it floats in, so a model tested in
fresh water weighs (rho_fresh/rho_sea)/lambda^3 of the ship (about 2.5 % less than lambda^-3).

References
----------
.. [1] ITTC, Recommended Procedure 7.5-01-01-01, "Ship Models", Rev. 04, 2017 (model
       manufacture, ballasting to the scaled displacement, draughts and centre of gravity,
       turbulence stimulation).
.. [2] ITTC, Recommended Procedure 7.5-02-07-02.1, "Seakeeping Experiments", Rev. 04, 2014
       (radii of gyration and natural periods of a seakeeping model, Froude-scaled).
.. [3] Hughes, G. and Allan, J. F., "Turbulence stimulation on ship models", Trans. SNAME 59
       (1951) 281-314 (cylindrical studs).
.. [4] IMO, MSC.1/Circ.1200 (2006), "Interim guidelines for alternative assessment of the
       weather criterion", section 4.3 (GM of a roll model within 2 % or 1 mm).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from fluids_props import FluidState
from similitude.errors import InputError
from similitude.planning.case import HULL_KINDS, Case, LoadingCondition

#: How each quantity of a loading scales with lambda (Froude): (power of lambda, unit, label).
#: A model value is the prototype value / lambda**power.
SCALED_QUANTITIES = {
    "draught": (1.0, "m", "draught"),
    "trim": (1.0, "m", "trim (+ by the stern)"),
    "displacement": (3.0, "m^3", "displacement volume"),
    "lcg": (1.0, "m", "LCG"),
    "vcg": (1.0, "m", "VCG above keel (KG)"),
    "gm": (1.0, "m", "GM (transverse)"),
    "roll_radius": (1.0, "m", "radius of gyration k_xx (roll)"),
    "pitch_radius": (1.0, "m", "radius of gyration k_yy (pitch)"),
    "yaw_radius": (1.0, "m", "radius of gyration k_zz (yaw)"),
    "heave_period": (0.5, "s", "natural period, heave"),
    "roll_period": (0.5, "s", "natural period, roll"),
    "pitch_period": (0.5, "s", "natural period, pitch"),
}

# Turbulence stimulators [3]: Hughes & Allan's cylindrical studs, 3.2 mm diameter, 2.5 mm
# high, 25 mm apart, at 5 % of L_PP aft of the forward perpendicular (station 19 of 20);
# the sizes from memory of the paper (medium confidence). Trip wire about 1 mm and sand strip
# sizes: common practice, from memory.
STUD_DIAMETER, STUD_HEIGHT, STUD_PITCH = 3.2e-3, 2.5e-3, 25e-3  # [m]
TRIP_WIRE_DIAMETER = 1.0e-3  # [m]
SAND_GRAIN, SAND_STRIP_WIDTH = 0.5e-3, 10e-3  # [m]
STIMULATOR_STATION = 0.05  # [-] of the model length aft of the forward perpendicular


@dataclass(frozen=True)
class LoadingBuild:
    """One loading condition at both scales (SI).

    Attributes
    ----------
    name : str
        The loading condition.
    prototype : dict of str to float
        Prototype values by key of :data:`SCALED_QUANTITIES` (those given or derived).
    model : dict of str to float
        The model values of the same keys (Froude-scaled).
    prototype_mass : float or None
        Displacement mass of the prototype rho_p V_p [kg]; None without a displacement.
    model_mass : float or None
        Mass the model is ballasted to, rho_m V_m [kg] in the test water; None without a
        displacement.
    model_inertia : dict of str to float
        Model mass moments of inertia m k^2 [kg m^2] about the axes whose radius of gyration
        is given (keys ``roll``, ``pitch``, ``yaw``).
    displacement_from : str
        Where the displacement came from: ``"loading"``, ``"prototype"`` (the prototype's
        design displacement, for a loading at the design draught) or ``""`` (none).
    """

    name: str
    prototype: dict
    model: dict
    prototype_mass: float | None
    model_mass: float | None
    model_inertia: dict
    displacement_from: str = ""


@dataclass(frozen=True)
class Stimulator:
    """One turbulence-stimulation device, sized for the model.

    Attributes
    ----------
    device : str
        ``"studs"``, ``"trip wire"`` or ``"sand strip"``.
    size : str
        Its dimensions in words (mm).
    position : float
        Distance aft of the forward perpendicular [m], model scale.
    source : str
        Published source, or "common practice".
    """

    device: str
    size: str
    position: float
    source: str


@dataclass(frozen=True)
class ModelBuild:
    """What the model shop needs to build and ballast the model.

    Attributes
    ----------
    scale : float
        lambda [-].
    model_length : float
        Model reference length [m].
    model_water : str
        The test fluid (catalogue name).
    model_density : float
        Density of the test fluid at its planned state [kg/m^3].
    prototype_density : float
        Density of the prototype's fluid [kg/m^3].
    loadings : tuple of LoadingBuild
        One per loading condition (the design condition when the case gives none).
    stimulators : tuple of Stimulator
        Turbulence stimulators for a hull in a towing tank or wave basin: the studs first, the
        trip wire and sand strip as alternatives; empty otherwise.
    propeller_diameter : float or None
        Model propeller diameter [m], where the model has a propeller.
    notes : tuple of str
        Tolerances, sources and what is missing.
    """

    scale: float
    model_length: float
    model_water: str
    model_density: float
    prototype_density: float
    loadings: tuple[LoadingBuild, ...]
    stimulators: tuple[Stimulator, ...] = ()
    propeller_diameter: float | None = None
    notes: tuple[str, ...] = ()

    @property
    def masses(self) -> dict[str, float]:
        """Model mass [kg] by loading condition, for those with a displacement."""
        return {ld.name: ld.model_mass for ld in self.loadings if ld.model_mass is not None}

    def table(self):
        """The loadings as a DataFrame, one row per (loading, quantity): ``loading``,
        ``quantity``, ``unit``, ``prototype``, ``model``, ``model / prototype`` (the scaling,
        in words), SI values; masses and moments of inertia included."""
        # pandas on call only: a notebook table; the planner does not need it.
        import pandas as pd

        rows = []
        for ld in self.loadings:
            for key, (power, unit, label) in SCALED_QUANTITIES.items():
                if key in ld.prototype:
                    rows.append((ld.name, label, unit, ld.prototype[key], ld.model[key],
                                 scaling_law(power)))
            if ld.model_mass is not None:
                rows.append((ld.name, "mass", "kg", ld.prototype_mass, ld.model_mass,
                             f"rho_m/rho_p / lambda^3 ({self.model_water})"))
            for axis, value in ld.model_inertia.items():
                rows.append((ld.name, f"mass moment of inertia, {axis}", "kg m^2",
                             math.nan, value, "m k^2 of the model"))
        return pd.DataFrame(rows, columns=["loading", "quantity", "unit", "prototype", "model",
                                           "model / prototype"])


def model_build(case: Case, scale: float, model_fluid: FluidState,
                prototype_fluid: FluidState) -> ModelBuild:
    """Scale the prototype's loading conditions and mass properties to the model.

    Parameters
    ----------
    case : Case
        The case: prototype (length, sizes, kind) and its loading conditions
        (``case.matrix.loading``; none: the design condition from ``prototype.sizes``).
    scale : float
        lambda = L_p / L_m [-].
    model_fluid, prototype_fluid : FluidState
        The test water and the prototype's water at their states (densities).

    Returns
    -------
    ModelBuild

    Raises
    ------
    InputError
        For a scale that is not a positive finite number.

    Notes
    -----
    Froude scaling [1]_ [2]_: lengths L_m = L_p/lambda (draught, trim, LCG, VCG, GM, radii of
    gyration), volumes V_m = V_p/lambda^3, periods T_m = T_p/sqrt(lambda); model mass
    m_m = rho_m V_m (the model floats at the scaled draught in the test water), moment of
    inertia I_m = m_m k_m^2. A loading without its own displacement takes the prototype's
    (``sizes.displacement``) when its draught is the prototype's draught or not given.

    References
    ----------
    .. [1] ITTC 7.5-01-01-01 (2017), Ship Models.
    .. [2] ITTC 7.5-02-07-02.1 (2014), Seakeeping Experiments.
    """
    lam = float(scale)
    if not (math.isfinite(lam) and lam > 0):
        raise InputError(f"scale: {scale!r} is not valid; expected a positive number")
    rho_m = float(np.asarray(model_fluid.density_si))
    rho_p = float(np.asarray(prototype_fluid.density_si))
    proto = case.prototype
    loads = case.matrix.loading or (LoadingCondition(
        name="design", draught=proto.dimension("draught"),
        displacement=proto.dimension("displacement")),)
    hull = proto.kind in HULL_KINDS
    builds = tuple(_loading_build(ld, case, lam, rho_m, rho_p) for ld in loads) if hull else ()
    lm = proto.length / lam
    stimulators = (_stimulators(lm) if hull and proto.kind != "offshore_structure"
                   and case.facility.free_surface else ())
    prop_d = lm if proto.kind == "propeller" else None
    notes = _notes(case, builds, stimulators, prop_d)
    return ModelBuild(scale=lam, model_length=lm, model_water=model_fluid.fluid,
                      model_density=rho_m, prototype_density=rho_p, loadings=builds,
                      stimulators=stimulators, propeller_diameter=prop_d, notes=notes)


def scaling_law(power: float) -> str:
    """The Froude scaling of a quantity in words: "1/lambda", "1/sqrt(lambda)", ..."""
    return {1.0: "1/lambda", 0.5: "1/sqrt(lambda)"}.get(power, f"1/lambda^{power:g}")


def _loading_build(ld: LoadingCondition, case: Case, lam: float, rho_m: float,
                   rho_p: float) -> LoadingBuild:
    proto = case.prototype
    given = {"draught": ld.draught, "trim": ld.trim if ld.trim else None,
             "displacement": ld.displacement, **ld.mass_properties()}
    source = "loading" if ld.displacement is not None else ""
    design = proto.dimension("draught")
    if ld.displacement is None and proto.dimension("displacement") is not None and (
            ld.draught is None or design is None or math.isclose(ld.draught, design)):
        given["displacement"] = proto.dimension("displacement")
        source = "prototype"
    if ld.draught is None and design is not None and source == "prototype":
        given["draught"] = design
    p = {k: float(v) for k, v in given.items() if v is not None}
    m = {k: v / lam ** SCALED_QUANTITIES[k][0] for k, v in p.items()}
    vol_p = p.get("displacement")
    mass_p = None if vol_p is None else rho_p * vol_p
    mass_m = None if vol_p is None else rho_m * m["displacement"]
    inertia = {}
    if mass_m is not None:
        for axis in ("roll", "pitch", "yaw"):
            k = m.get(f"{axis}_radius")
            if k is not None:
                inertia[axis] = mass_m * k * k
    return LoadingBuild(name=ld.name, prototype=p, model=m, prototype_mass=mass_p,
                        model_mass=mass_m, model_inertia=inertia, displacement_from=source)


def _stimulators(lm: float) -> tuple[Stimulator, ...]:
    """Studs [3], or a trip wire or sand strip, at 5 % of the model length aft of the FP."""
    x = STIMULATOR_STATION * lm
    return (
        Stimulator("studs", f"cylindrical studs {STUD_DIAMETER * 1e3:.1f} mm diameter, "
                   f"{STUD_HEIGHT * 1e3:.1f} mm high, {STUD_PITCH * 1e3:.0f} mm apart in a "
                   "girthwise row; a second row on a bulbous bow", x,
                   "Hughes & Allan (1951), Trans. SNAME 59; ITTC 7.5-01-01-01 (2017)"),
        Stimulator("trip wire", f"wire of about {TRIP_WIRE_DIAMETER * 1e3:.0f} mm diameter "
                   "round the girth", x, "common practice"),
        Stimulator("sand strip", f"sand grains of about {SAND_GRAIN * 1e3:.1f} mm in a strip "
                   f"about {SAND_STRIP_WIDTH * 1e3:.0f} mm wide", x, "common practice"),
    )


def _notes(case: Case, builds, stimulators, prop_d) -> tuple[str, ...]:
    out = []
    missing = [b.name for b in builds if b.model_mass is None]
    if missing:
        out.append("No displacement for loading " + ", ".join(repr(n) for n in missing)
                   + ": give runs.loading.displacement (or prototype.sizes.displacement) for "
                   "its model mass.")
    if any(b.prototype.get("gm") is not None for b in builds):
        out.append("Ballast the model to its GM within 2 % or 1 mm "
                   "(IMO MSC.1/Circ.1200 (2006) 4.3, for roll tests); check it by an "
                   "inclining test and the roll radius by a swing or roll-decay test.")
    if case.test == "seakeeping" and builds and not any(
            b.prototype.get("roll_radius") for b in builds):
        out.append("Seakeeping model without radii of gyration: give runs.loading.roll_radius "
                   "and pitch_radius (typically 0.35-0.40 B and 0.20-0.25 L; IMO MSC.141(76) "
                   "for damaged ro-ro models) so the model can be ballasted to them.")
    if stimulators:
        out.append("Turbulence stimulators: fit one device (studs preferred) at the position "
                   "given; estimate the studs' own drag by tests with one and with two rows "
                   "(common practice).")
    if prop_d is not None:
        out.append(f"Model propeller diameter {prop_d * 1e3:.1f} mm. Where the final design is "
                   "not yet built, a stock propeller of the facility close to it in diameter, "
                   "pitch ratio, blade area ratio and number of blades may serve for "
                   "preliminary tests (common practice); state which was used.")
    elif case.test == "self_propulsion":
        out.append("Model propeller: the ship's propeller diameter / lambda; a stock propeller "
                   "close to it in diameter, pitch ratio, blade area ratio and number of "
                   "blades may serve before the final design is made (common practice).")
    return tuple(out)


__all__ = ["SCALED_QUANTITIES", "LoadingBuild", "ModelBuild", "Stimulator", "model_build",
           "scaling_law"]

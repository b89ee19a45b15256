"""The case: prototype, facility, matching request and run-matrix specification (SI inside).

A Case is built in Python or read from a TOML case file (:mod:`similitude.readers.case_file`). All
fields are SI floats; units live only at the edge. The dataclasses are frozen: a plan never
changes the case it was made from.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from similitude.constants import P_ATM
from similitude.correlations.friction import FRICTION_LINES
from similitude.correlations.waves import SPECTRA
from similitude.errors import InputError
from similitude.planning.facilities import Facility
from similitude.planning.propulsion_spec import PropulsionSpec
from similitude.units import UnitInputError, to_si

PROTOTYPE_KINDS = (
    "surface_ship",
    "submerged_body",
    "offshore_structure",
    "propeller",
    "bluff_body",
    "vehicle",
    "wing",
)

#: Prototype kinds with a hull: tank blockage on the midship area, a friction line for the
#: viscous resistance, loading conditions, speeds in knots unless written otherwise.
HULL_KINDS = ("surface_ship", "submerged_body", "offshore_structure")


def body_class(prototype_kind: str) -> str:
    """What friction practice a prototype kind follows: ``"hull"`` (a friction line such as
    ITTC-1957), ``"propeller"`` (the ITTC-78 blade-section drag at a blade-section Reynolds
    number) or ``"body"`` (wings, vehicles, bluff bodies: Reynolds numbers only)."""
    if prototype_kind in HULL_KINDS:
        return "hull"
    return "propeller" if prototype_kind == "propeller" else "body"


#: Names of the groups a request may ask to match (keys of :mod:`similitude.dimensional.groups`).
MATCHABLE_GROUPS = (
    "froude",
    "reynolds",
    "mach",
    "weber",
    "cavitation",
    "advance_ratio",
    "strouhal",
    "depth_froude",
)

OBJECTIVES = ("largest_model", "least_mismatch", "smallest_model")

#: Kinds of model test a case plans. A campaign of several tests names each test by one of these.
TEST_KINDS = (
    "resistance",        # calm-water towed resistance of a hull (ITTC 7.5-02-02-01)
    "self_propulsion",   # propelled model at the ship self-propulsion point (ITTC 7.5-02-03-01.1)
    "open_water",        # propeller alone in uniform inflow (ITTC 7.5-02-03-02.1)
    "seakeeping",        # motions and loads in waves (ITTC 7.5-02-07-02.1)
    "cavitation",        # propeller or body in a cavitation tunnel (ITTC 7.5-02-03-03.1)
    "wind_tunnel",       # forces and pressures on a body in air
)

#: Facility kinds each test kind can be run in (common practice).
TEST_FACILITIES = {
    "resistance": ("towing_tank", "wave_basin"),
    "self_propulsion": ("towing_tank", "wave_basin"),
    "open_water": ("towing_tank", "cavitation_tunnel"),
    "seakeeping": ("wave_basin", "towing_tank"),
    "cavitation": ("cavitation_tunnel",),
    "wind_tunnel": ("wind_tunnel",),
}


def default_test(prototype_kind: str, facility_kind: str) -> str:
    """The test a case plans when it does not say: read from the prototype and the facility.

    A wave basin plans a seakeeping test, a cavitation tunnel a cavitation test, a wind tunnel
    a wind-tunnel test; a towing tank an open-water test of a propeller and a resistance test of
    anything else.
    """
    if facility_kind == "wave_basin":
        return "seakeeping"
    if facility_kind == "cavitation_tunnel":
        return "cavitation"
    if facility_kind == "wind_tunnel":
        return "wind_tunnel"
    return "open_water" if prototype_kind == "propeller" else "resistance"

#: How the speeds of a run matrix are given: prototype speeds, Froude numbers or model speeds.
SPEED_BASES = ("prototype", "froude", "model")
#: Orders of the runs within a group of one loading, wave and heading: ascending speed, or
#: shuffled with a seed (speeds and repeats together).
SPEED_ORDERS = ("ascending", "random")
#: Angles a run matrix may sweep at each speed (wind tunnel, or a towed body): the angle of
#: attack of a wing or body, or the yaw (drift) angle; the matrix column each one heads.
SWEEPS = {"angle_of_attack": "angle of attack [deg]", "yaw": "yaw angle [deg]"}

#: Kinds of wave condition: regular waves, or an irregular sea given by its spectrum.
WAVE_KINDS = ("regular", "irregular")

#: Dimension keys of :class:`Prototype` that are areas [m^2] or volumes [m^3]; every other key
#: is a length [m]. Under geometric similarity they scale as lambda^2 and lambda^3.
AREA_KEYS = ("wetted_surface", "midship_area", "frontal_area", "lateral_area",
             "transverse_area", "bilge_keel_area", "waterplane_area", "disk_area")
VOLUME_KEYS = ("displacement", "volume")


def dimension_power(key: str) -> int:
    """Power of the length scale in a dimension: 1 for lengths, 2 for areas, 3 for volumes.

    Keys listed in :data:`AREA_KEYS` or ending in ``_area`` are areas; keys in
    :data:`VOLUME_KEYS` or ending in ``_volume`` are volumes; all others are lengths.
    """
    if key in AREA_KEYS or key.endswith("_area"):
        return 2
    if key in VOLUME_KEYS or key.endswith("_volume"):
        return 3
    return 1


def _at_least(name: str, value, low: float, expected: str) -> None:
    """A finite number >= low, or an InputError naming the field, the value and ``expected``."""
    try:
        ok = math.isfinite(value) and value >= low
    except TypeError:
        ok = False
    if not ok:
        raise InputError(f"{name}: {value!r} is not valid; expected {expected}")


def _positive(name: str, value: float | None, allow_none: bool = True) -> None:
    if value is None:
        if allow_none:
            return
        raise InputError(f"{name}: missing; expected a positive value")
    if not (isinstance(value, (int, float)) and math.isfinite(value) and value > 0):
        raise InputError(f"{name}: {value!r} is not valid; expected a positive finite number")


@dataclass(frozen=True)
class FluidSpec:
    """A fluid at a state.

    Attributes
    ----------
    name : str
        Fluid name of the :func:`fluids_props.list_fluids` catalogue (``"sea_water"``...).
    temperature : float
        Temperature [K].
    pressure : float or None
        Absolute pressure [Pa]; None means the fluid's default (0.101325 MPa).
    salinity : float or None
        Absolute salinity [kg/kg] for sea water; None means 35.16504 g/kg.
    relative_humidity : float
        Relative humidity [-] for air.
    mass_fraction : float or None
        Solute mass fraction [kg/kg] of a mixture whose catalogue entry takes one (the glycerol
        mass fraction of ``"glycerol_water"``); None for pure fluids.
    """

    name: str
    temperature: float
    pressure: float | None = None
    salinity: float | None = None
    relative_humidity: float = 0.0
    mass_fraction: float | None = None

    def __post_init__(self) -> None:
        _positive("fluid.temperature", self.temperature, allow_none=False)
        _positive("fluid.pressure", self.pressure)
        w = self.mass_fraction
        if w is not None and not (isinstance(w, (int, float)) and not isinstance(w, bool)
                                  and math.isfinite(w) and 0.0 <= w <= 1.0):
            raise InputError(f"fluid.mass_fraction: {w!r} is not valid; expected a mass "
                             "fraction between 0 and 1 [kg/kg]")


@dataclass(frozen=True)
class Prototype:
    """The full-scale object.

    Attributes
    ----------
    kind : str
        One of :data:`PROTOTYPE_KINDS`.
    length : float
        Reference length [m]: waterline length for ships, chord for a wing, diameter for a
        propeller, characteristic size for a bluff body.
    speeds : tuple of float
        Operating speeds [m/s] (ship speed, free-stream or advance speed).
    fluid : FluidSpec
        The prototype's fluid and its state.
    name : str
        A label.
    dimensions : dict of str to float
        Further lengths [m] and areas [m^2], by key: ``beam``, ``draught``, ``wetted_surface``,
        ``midship_area`` (A_X), ``frontal_area``, ``lateral_area``, ``span``, ``diameter``,
        ``height``, ``displacement`` [m^3], ``transverse_area`` (A_T, above water, for air
        resistance), ``bilge_keel_area``, ``blade_chord`` (0.7R chord for a propeller) ...
    rotation_rates : tuple of float
        Propeller rotation rates [1/s] paired with ``speeds`` (empty when not a propeller).
    water_depth : float or None
        Water depth at the operating site [m]; None means deep water.
    immersion : float or None
        Depth of the reference point below the free surface [m] (shaft centre of a propeller,
        centre of a submerged body); used for the cavitation number.
    ambient_pressure : float
        Pressure above the free surface [Pa] (atmospheric).
    """

    kind: str
    length: float
    speeds: tuple[float, ...]
    fluid: FluidSpec
    name: str = "prototype"
    dimensions: dict = field(default_factory=dict)
    rotation_rates: tuple[float, ...] = ()
    water_depth: float | None = None
    immersion: float | None = None
    ambient_pressure: float = P_ATM

    def __post_init__(self) -> None:
        if self.kind not in PROTOTYPE_KINDS:
            raise InputError(
                f"prototype.kind: {self.kind!r} is unknown; expected one of "
                + ", ".join(PROTOTYPE_KINDS)
            )
        _positive("prototype.length", self.length, allow_none=False)
        if not self.speeds:
            raise InputError("prototype.speeds: empty; expected at least one speed")
        for i, v in enumerate(self.speeds):
            _positive(f"prototype.speeds[{i}]", v, allow_none=False)
        for i, n in enumerate(self.rotation_rates):
            _positive(f"prototype.rotation_rates[{i}]", n, allow_none=False)
        for key, v in self.dimensions.items():
            _positive(f"prototype.dimensions.{key}", v, allow_none=False)
        _positive("prototype.water_depth", self.water_depth)
        _positive("prototype.ambient_pressure", self.ambient_pressure, allow_none=False)

    def dimension(self, key: str, default: float | None = None) -> float | None:
        """A further dimension [m or m^2] by key, or ``default``."""
        return self.dimensions.get(key, default)


@dataclass(frozen=True)
class MatchRequest:
    """What the model must reproduce.

    Attributes
    ----------
    exact : tuple of str
        Groups to match exactly, in priority order (names of :data:`MATCHABLE_GROUPS`).
    report : tuple of str
        Groups only to report (their mismatch is computed and explained).
    scale : float or None
        Fixed scale lambda = L_prototype / L_model.
    model_length : float or None
        Length of an existing model [m] (fixes the scale).
    model_fluid : FluidSpec or None
        Fixed model fluid and state (otherwise the solver chooses within the facility).
    objective : str
        How to choose among feasible models: ``"largest_model"`` (default for free-surface
        tests: least Reynolds mismatch), ``"least_mismatch"`` (minimise the log-mismatch of the
        unmatched groups) or ``"smallest_model"``.
    friction_line : str
        Friction line for the Reynolds scale effect
        (:data:`similitude.correlations.friction.FRICTION_LINES`; default the ITTC-1957 line).
    form_factor : float or None
        Form factor k of the 1978 ITTC method [-] when known (None: k = 0 in the estimates).
    relax : bool
        When the exact groups cannot all be met inside the facility, drop the lowest-priority
        one (last in ``exact``), keep the others exact and minimise its log-mismatch instead;
        the plan then carries a "requested but not matched" line in every output. False
        (default): refuse with InfeasibleError naming the binding limit and what relaxing
        would give.
    round_scale : bool
        For the ``"largest_model"`` and ``"smallest_model"`` objectives, replace the limiting
        scale by the nearest convenient one that still satisfies every limit (rounded up for
        the largest model, down for the smallest; see
        :func:`similitude.planning.solver.convenient_scale`) and re-solve at it; the limiting scale
        is kept in the solution and the plan notes. False: keep the limiting scale itself.
    """

    exact: tuple[str, ...] = ("froude",)
    report: tuple[str, ...] = ("reynolds",)
    scale: float | None = None
    model_length: float | None = None
    model_fluid: FluidSpec | None = None
    objective: str = "largest_model"
    friction_line: str = "ittc1957"
    form_factor: float | None = None
    relax: bool = False
    round_scale: bool = True

    def __post_init__(self) -> None:
        for key in ("relax", "round_scale"):
            if not isinstance(getattr(self, key), bool):
                raise InputError(f"match.{key}: {getattr(self, key)!r} is not valid; expected "
                                 "true or false")
        for key, names in (("match.exact", self.exact), ("match.report", self.report)):
            for g in names:
                if g not in MATCHABLE_GROUPS:
                    raise InputError(
                        f"{key}: {g!r} is not a group the planner can match; expected one of "
                        + ", ".join(MATCHABLE_GROUPS)
                    )
        if len(set(self.exact)) != len(self.exact):
            raise InputError(f"match.exact: {list(self.exact)!r} names a group twice")
        _positive("match.scale", self.scale)
        _positive("match.model_length", self.model_length)
        if self.scale is not None and self.model_length is not None:
            raise InputError(
                "match.scale and match.model_length: both given; expected one of them"
            )
        if self.friction_line not in FRICTION_LINES:
            raise InputError(
                f"match.friction_line: {self.friction_line!r} is unknown; expected one of "
                + ", ".join(FRICTION_LINES)
            )
        if self.form_factor is not None and not (
                isinstance(self.form_factor, (int, float)) and math.isfinite(self.form_factor)
                and 0 <= self.form_factor < 2):
            raise InputError(f"match.form_factor: {self.form_factor!r} is not valid; expected "
                             "k between 0 and 2")
        if self.objective not in OBJECTIVES:
            raise InputError(
                f"match.objective: {self.objective!r} is unknown; expected one of "
                + ", ".join(OBJECTIVES)
            )


@dataclass(frozen=True)
class LoadingCondition:
    """A loading condition of the prototype (full-scale values).

    Attributes
    ----------
    name : str
    draught : float or None
        Mean draught [m].
    trim : float
        Trim [m], positive by the stern.
    displacement : float or None
        Displacement volume [m^3].
    lcg : float or None
        Longitudinal centre of gravity [m] from the reference the user works to (e.g. the
        aft perpendicular, positive forward).
    vcg : float or None
        Vertical centre of gravity above the keel (KG) [m].
    gm : float or None
        Transverse metacentric height [m].
    roll_radius, pitch_radius, yaw_radius : float or None
        Radii of gyration k_xx, k_yy, k_zz about the centre of gravity [m].
    heave_period, roll_period, pitch_period : float or None
        Natural periods [s].
    """

    name: str
    draught: float | None = None
    trim: float = 0.0
    displacement: float | None = None
    lcg: float | None = None
    vcg: float | None = None
    gm: float | None = None
    roll_radius: float | None = None
    pitch_radius: float | None = None
    yaw_radius: float | None = None
    heave_period: float | None = None
    roll_period: float | None = None
    pitch_period: float | None = None

    def mass_properties(self) -> dict[str, float]:
        """The mass properties given for this loading [m or s], by field name."""
        return {k: getattr(self, k) for k in MASS_PROPERTY_KEYS if getattr(self, k) is not None}


#: Mass properties a loading condition may give (fields of :class:`LoadingCondition`): lengths
#: [m] and natural periods [s], at full scale.
MASS_PROPERTY_KEYS = ("lcg", "vcg", "gm", "roll_radius", "pitch_radius", "yaw_radius",
                      "heave_period", "roll_period", "pitch_period")


@dataclass(frozen=True)
class WaveCondition:
    """A wave condition at full scale.

    Attributes
    ----------
    kind : str
        One of :data:`WAVE_KINDS`.
    period : float or None
        Regular-wave period [s].
    length_ratio : float or None
        Regular-wave length over prototype length [-] (alternative to ``period``).
    height : float or None
        Regular-wave height [m].
    steepness : float or None
        Regular-wave steepness H/lambda_w [-] (alternative to ``height``).
    significant_height : float or None
        Irregular sea H_s [m].
    peak_period : float or None
        Irregular sea T_p [s].
    spectrum : str
        One of :data:`similitude.correlations.waves.SPECTRA`: ``"jonswap"`` or ``"ittc"``
        (two-parameter Bretschneider / ITTC 1978).
    gamma : float
        JONSWAP peak enhancement factor [-].
    duration : float or None
        Full-scale duration of the irregular sea to be realised [s] (e.g. 3 h = 10800 s).
    name : str
    """

    kind: str
    period: float | None = None
    length_ratio: float | None = None
    height: float | None = None
    steepness: float | None = None
    significant_height: float | None = None
    peak_period: float | None = None
    spectrum: str = "jonswap"
    gamma: float = 3.3
    duration: float | None = None
    name: str = ""


@dataclass(frozen=True)
class MatrixSpec:
    """What runs to make.

    Attributes
    ----------
    speeds : tuple of float
        Speeds of the runs, read according to ``speed_basis``: prototype speeds [m/s],
        Froude numbers [-] or model speeds [m/s]. Empty: the prototype's operating speeds.
    speed_basis : str
        One of :data:`SPEED_BASES`: ``"prototype"``, ``"froude"`` or ``"model"``.
    loading : tuple of LoadingCondition
        Loading conditions (empty: the design condition only).
    headings : tuple of float
        Wave headings [deg] (180 = head seas); empty: one heading, not stated.
    current : float
        Full-scale current speed [m/s] (0 if none).
    waves : tuple of WaveCondition
        Wave conditions; empty: calm water.
    repeats : int
        Number of repeats of each run (for repeatability/uncertainty).
    waiting_time : float or None
        Waiting time between runs [s]; None: the planner's estimate.
    speed_order : str
        One of :data:`SPEED_ORDERS`: the runs of a group (one loading, wave and heading) by
        ascending speed, each repeat running the series again, or in a random order drawn
        with ``seed``.
    seed : int
        Seed of the random order (the same seed gives the same order).
    wave_calibration : bool
        Measure each wave condition without the model before its first run (its time is
        counted in the facility hours).
    angles : tuple of float
        Angles [deg] swept at each speed (a polar), innermost in the run order; empty: none.
    sweep : str
        What ``angles`` are, a key of :data:`SWEEPS`: ``"angle_of_attack"`` or ``"yaw"``.
    """

    speeds: tuple[float, ...] = ()
    speed_basis: str = "prototype"
    loading: tuple[LoadingCondition, ...] = ()
    headings: tuple[float, ...] = ()
    current: float = 0.0
    waves: tuple[WaveCondition, ...] = ()
    repeats: int = 1
    waiting_time: float | None = None
    speed_order: str = "ascending"
    seed: int = 1
    wave_calibration: bool = True
    angles: tuple[float, ...] = ()
    sweep: str = "angle_of_attack"

    def __post_init__(self) -> None:
        try:
            whole = int(self.repeats) == self.repeats and self.repeats >= 1
        except (TypeError, ValueError, OverflowError):
            whole = False
        if not whole:
            raise InputError(f"matrix.repeats: {self.repeats!r} is not valid; expected an "
                             "integer >= 1")
        _at_least("matrix.current", self.current, 0.0, "a speed >= 0")
        if self.waiting_time is not None:
            _at_least("matrix.waiting_time", self.waiting_time, 0.0, "a time >= 0")
        if self.speed_basis not in SPEED_BASES:
            raise InputError(f"matrix.speed_basis: {self.speed_basis!r} is unknown; expected "
                             "one of " + ", ".join(SPEED_BASES))
        for i, v in enumerate(self.speeds):
            _at_least(f"matrix.speeds[{i}]", v, 0.0, "a finite speed >= 0")
        if self.speed_order not in SPEED_ORDERS:
            raise InputError(f"matrix.speed_order: {self.speed_order!r} is unknown; expected "
                             "one of " + ", ".join(SPEED_ORDERS))
        if self.sweep not in SWEEPS:
            raise InputError(f"matrix.sweep: {self.sweep!r} is unknown; expected one of "
                             + ", ".join(SWEEPS))
        for i, a in enumerate(self.angles):
            if not (isinstance(a, (int, float)) and math.isfinite(a) and -180 <= a <= 180):
                raise InputError(f"matrix.angles[{i}]: {a!r} is not valid; expected an angle "
                                 "from -180 to 180 deg")
        if isinstance(self.seed, bool) or not isinstance(self.seed, int) or self.seed < 0:
            raise InputError(f"matrix.seed: {self.seed!r} is not valid; expected a whole "
                             "number >= 0")
        for i, w in enumerate(self.waves):
            _check_wave(w, f"matrix.waves[{i}]")


def _check_wave(w: WaveCondition, where: str) -> None:
    """The parameters a wave condition of its kind needs."""
    if w.kind not in WAVE_KINDS:
        raise InputError(f"{where}.kind: {w.kind!r} is unknown; expected one of "
                         + ", ".join(WAVE_KINDS))
    if w.kind == "regular":
        if w.period is None and w.length_ratio is None:
            raise InputError(f"{where}.period: missing; expected a period or a length_ratio")
        if w.height is None and w.steepness is None:
            raise InputError(f"{where}.height: missing; expected a height or a steepness")
        return
    if w.significant_height is None or w.peak_period is None:
        raise InputError(f"{where}: irregular sea needs significant_height and peak_period")
    if w.spectrum not in SPECTRA:
        raise InputError(f"{where}.spectrum: {w.spectrum!r} is unknown; expected one of "
                         + ", ".join(SPECTRA))


#: Most run-matrix rows a case may ask for. Two bounds: a sheet holds 1,048,576 rows (Excel
#: and LibreOffice) less the header rows of the Runs and Test day sheets, and the memory to plan
#: and write them, about 0.6 kB a row (measured: 0.3 GB peak for 5*10^5 runs planned and
#: written, benchmarks/bench_large_outputs.py), so about 0.6 GB at this limit.
MAX_MATRIX_ROWS = 1_000_000


def matrix_rows(spec: MatrixSpec, n_speeds: int) -> int:
    """Rows of the run matrix of ``spec`` with ``n_speeds`` speeds (computed, nothing built):
    loading conditions x wave conditions x headings x repeats x speeds."""
    return (max(1, len(spec.loading)) * max(1, len(spec.waves)) * max(1, len(spec.headings))
            * int(spec.repeats) * max(1, n_speeds))


def _check_matrix_rows(case) -> None:
    """Refuse a run matrix larger than :data:`MAX_MATRIX_ROWS`, before it is built."""
    spec = case.matrix
    n_speeds = len(spec.speeds) or len(case.prototype.speeds)
    rows = matrix_rows(spec, n_speeds)
    if rows <= MAX_MATRIX_ROWS:
        return
    parts = [f"{n_speeds} speeds", f"{max(1, len(spec.loading))} loading conditions",
             f"{max(1, len(spec.waves))} wave conditions",
             f"{max(1, len(spec.headings))} headings", f"{int(spec.repeats)} repeats"]
    raise InputError(f"runs: {' x '.join(parts)} = {rows:,} run-matrix rows; expected at most "
                     f"{MAX_MATRIX_ROWS:,} (a sheet holds 1,048,576 rows, and planning and "
                     "writing take about 0.6 kB of memory a row)")


@dataclass(frozen=True)
class Case:
    """A whole planning case.

    Attributes
    ----------
    prototype : Prototype
    facility : Facility
    request : MatchRequest
    matrix : MatrixSpec
    metadata : dict
        Project, client, author, date ... (strings), shown in reports.
    name : str
    test : str
        The kind of test, one of :data:`TEST_KINDS`; "" (default) reads it from the prototype
        and facility kinds (:func:`default_test`).
    propulsion : PropulsionSpec or None
        The self-propulsion test's inputs (propeller, open water, resistance estimate,
        expected propulsion factors, tow forces); used when ``test`` is ``"self_propulsion"``.
    speed_unit : str
        The unit the prototype speeds are shown in, as the user wrote them (the case-file
        reader keeps the unit of the first prototype speed: "kn", "m/s", "km/h" ...); ""
        (default): "kn" for a hull, "m/s" otherwise. Inside, speeds stay in m/s.
    """

    prototype: Prototype
    facility: Facility
    request: MatchRequest = field(default_factory=MatchRequest)
    matrix: MatrixSpec = field(default_factory=MatrixSpec)
    metadata: dict = field(default_factory=dict)
    name: str = "case"
    test: str = ""
    propulsion: PropulsionSpec | None = None
    speed_unit: str = ""

    def __post_init__(self) -> None:
        unit = self.speed_unit or ("kn" if self.prototype.kind in HULL_KINDS else "m/s")
        try:
            factor = to_si(f"1 {unit}", "[length] / [time]", "speed_unit")
        except UnitInputError:
            factor = float("nan")
        if not (isinstance(unit, str) and math.isfinite(factor) and factor > 0):
            raise InputError(f"speed_unit: {unit!r} is not a unit of speed; expected e.g. "
                             "'kn', 'm/s' or 'km/h'")
        object.__setattr__(self, "speed_unit", unit)  # frozen: resolve the default once
        test = self.test or default_test(self.prototype.kind, self.facility.kind)
        if test not in TEST_KINDS:
            raise InputError(f"test: {test!r} is not a kind of test; expected one of "
                             f"{', '.join(TEST_KINDS)}")
        if self.facility.kind not in TEST_FACILITIES[test]:
            raise InputError(f"test: a {test} test cannot be run in a "
                             f"{self.facility.kind.replace('_', ' ')}; expected a facility of "
                             f"kind {' or '.join(TEST_FACILITIES[test])}")
        object.__setattr__(self, "test", test)  # frozen: resolve the default once, here
        _check_matrix_rows(self)

    @property
    def speed_unit_factor(self) -> float:
        """Metres per second in one :attr:`speed_unit` [m/s]."""
        return float(to_si(f"1 {self.speed_unit}", "[length] / [time]", "speed_unit"))

    @property
    def speed_header(self) -> str:
        """Column header of prototype speeds in the user's unit, e.g. "prototype speed [kn]"."""
        return f"prototype speed [{self.speed_unit}]"

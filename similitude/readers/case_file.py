"""Case files: a planning case written in TOML, read into a :class:`similitude.planning.case.Case`.

A case file has five tables (the key names are this project's own; the README's "Case files"
section is the full reference with a commented example)::

    [about]        title, project, client, author, date, note
    [prototype]    kind, name, length, speeds, rotation_rates, water_depth, immersion,
                   air_pressure, [prototype.sizes], [prototype.fluid]
    facility       an inline [facility] table, a [facility] table with file = "path", or a
                   top-level path string to a facility file (relative to the case file)
    [matching]     exact, report, scale, model_length, choose, friction_line, form_factor,
                   round_scale, relax,
                   [matching.model_fluid]
    [runs]         speeds, speeds_as, repeats, headings, current, wait_between_runs,
                   [[runs.loading]], [[runs.waves]]

Quantities are strings with units (``"18 kn"``, ``"15 degC"``, ``"35 g/kg"``, ``"2 bar"``) and
the scale is ``"1:25"``. Everything is converted to SI here; the dataclasses hold SI floats.

Reading never stops at the first problem: every problem found is collected and reported at once
in one :class:`similitude.errors.InputError`, one line per problem, each naming the key path,
the value and what was expected. Unknown keys are problems too, with a "did you mean" hint.
The reading of single fields (tables, choices, quantities with units and their limits) is the
generic field reader of :mod:`similitude.readers.fields`; this module holds what is particular
to case and facility files.
"""

from __future__ import annotations

import math
import tomllib
from collections.abc import Mapping
from pathlib import Path
from typing import Any

from fluids_props import get_fluid, list_fluids
from similitude.constants import P_ATM
from similitude.correlations.friction import FRICTION_LINES
from similitude.correlations.propulsion import FRICTION_CORRECTION_FORMS
from similitude.correlations.waves import SPECTRA
from similitude.errors import BAD_INPUT_ERRORS, InputError
from similitude.planning.case import (
    MASS_PROPERTY_KEYS,
    MATCHABLE_GROUPS,
    OBJECTIVES,
    PROTOTYPE_KINDS,
    SPEED_BASES,
    SPEED_ORDERS,
    SWEEPS,
    TEST_FACILITIES,
    TEST_KINDS,
    WAVE_KINDS,
    Case,
    FluidSpec,
    LoadingCondition,
    MatchRequest,
    MatrixSpec,
    Prototype,
    WaveCondition,
)
from similitude.planning.facilities import FACILITY_KINDS, Facility
from similitude.planning.propulsion_spec import PropulsionSpec
from similitude.readers.fields import (
    ACCEL,
    AREA,
    FORCE,
    LENGTH,
    MISSING,
    POWER,
    PRESSURE,
    RATE,
    RATIO,
    SPEED,
    TEMPERATURE,
    TIME,
    TORQUE,
    VOLUME,
    FieldReader,
    key_path,
    show,
    show_text,
)
from similitude.readers.input_files import TEXT_FILE_LIMIT, read_limited, shown_path
from similitude.readers.measured import read_open_water_runs, read_resistance_runs
from similitude.units import UnitInputError, parse_quantity, parse_scale

__all__ = ["load_case", "load_facility", "parse_case", "parse_facility", "CASE_KEYS"]

#: Plausibility limits [SI] beyond which a value is taken for a typing slip (common practice;
#: generous on purpose: they catch "18000 kn", not unusual designs).
_LIMITS = {
    "prototype_length": (1e-3, 2000.0),       # m: a 1 mm insect wing to a 2 km structure
    "speed": (0.0, 700.0),                     # m/s: about Mach 2 in air
    "pressure": (1.0, 1e8),                    # Pa
    "rotation": (0.0, 2000.0),                 # 1/s
    "scale": (0.01, 1000.0),                   # lambda
    "facility_size": (0.05, 5000.0),           # m
    "acceleration": (1e-3, 50.0),              # m/s^2
    "model_length": (1e-3, 100.0),             # m
    "wave_period": (0.05, 60.0),               # s
    "wave_height": (1e-4, 40.0),               # m
    "wave_length_ratio": (0.02, 50.0),         # -
    "froude": (0.0, 10.0),                     # -
    "heading": (-360.0, 360.0),                # deg
    "duration": (1.0, 7 * 86400.0),            # s
    "waiting": (0.0, 86400.0),                 # s
    "current": (0.0, 10.0),                    # m/s: a speed; its direction is not modelled
    "draught": (1e-3, 100.0),                  # m
    "trim": (-50.0, 50.0),                     # m
    "displacement": (1e-9, 1e7),               # m^3
    "lcg": (-2000.0, 2000.0),                  # m, from the user's reference point
    "centre_height": (0.0, 500.0),             # m: VCG above the keel, GM
    "gyration": (0.0, 1000.0),                 # m: radii of gyration
    "natural_period": (0.0, 300.0),            # s
    "temperature": (1.0, 2000.0),              # K; the fluid's own range is checked after
    "dynamometer_force": (0.0, 1e5),           # N
    "dynamometer_torque": (0.0, 1e4),          # N m
    "propeller_diameter": (1e-3, 30.0),        # m
    "polynomial": (-10.0, 10.0),               # coefficients of K_T(J), K_Q(J)
    "tow_force_factor": (-3.0, 5.0),           # multiples of F_D
    "ship_resistance": (0.0, 1e9),             # N
    "ship_power": (0.0, 1e10),                 # W
}

#: Further prototype sizes [prototype.sizes] and their dimension.
SIZE_KEYS: dict[str, str] = {
    "beam": LENGTH, "draught": LENGTH, "span": LENGTH, "diameter": LENGTH, "height": LENGTH,
    "width": LENGTH, "thickness": LENGTH, "blade_chord": LENGTH, "hub_diameter": LENGTH,
    "wetted_surface": AREA, "midship_area": AREA, "frontal_area": AREA, "lateral_area": AREA,
    "transverse_area": AREA, "bilge_keel_area": AREA, "waterplane_area": AREA,
    "disk_area": AREA, "displacement": VOLUME, "volume": VOLUME,
}

ABOUT_KEYS = ("title", "project", "client", "author", "date", "note")
FLUID_KEYS = ("name", "temperature", "pressure", "salinity", "humidity", "mass_fraction")
PROTOTYPE_KEYS = ("kind", "name", "length", "speeds", "rotation_rates", "water_depth",
                  "immersion", "air_pressure", "sizes", "fluid")
FACILITY_KEYS = ("file", "kind", "name", "length", "width", "depth", "height", "speed_limits",
                 "fluids", "temperature_limits", "pressure_limits", "acceleration", "braking",
                 "open_jet", "wave_periods", "highest_wave", "fastest_rotation",
                 "shortest_model", "longest_model", "shortest_steady_time", "largest_thrust",
                 "largest_torque", "loading_changeover")
MATCHING_KEYS = ("exact", "report", "scale", "model_length", "choose", "friction_line",
                 "form_factor", "model_fluid", "round_scale", "relax")
RUNS_KEYS = ("speeds", "speeds_as", "repeats", "headings", "current", "wait_between_runs",
             "order", "seed", "wave_calibration", "sweep", "angles", "loading", "waves")
LOADING_KEYS = ("name", "draught", "trim", "displacement", *MASS_PROPERTY_KEYS)
WAVE_KEYS = ("name", "kind", "period", "length_ratio", "height", "steepness",
             "significant_height", "peak_period", "spectrum", "gamma", "duration")
PROPULSION_KEYS = ("propeller_diameter", "propellers", "open_water", "thrust_polynomial",
                   "torque_polynomial", "resistance_test", "resistance_estimate",
                   "wake_fraction", "thrust_deduction", "rotative_efficiency", "form_factor",
                   "tow_force_factors", "friction_correction")
RESISTANCE_ESTIMATE_KEYS = ("speeds", "total_resistance", "effective_power")
TOP_KEYS = ("about", "test", "prototype", "facility", "matching", "runs", "propulsion")

#: Every key of a case file by table, for documentation and "did you mean" hints.
CASE_KEYS: dict[str, tuple[str, ...]] = {
    "": TOP_KEYS, "about": ABOUT_KEYS, "prototype": PROTOTYPE_KEYS,
    "prototype.sizes": tuple(SIZE_KEYS), "prototype.fluid": FLUID_KEYS,
    "facility": FACILITY_KEYS, "matching": MATCHING_KEYS, "matching.model_fluid": FLUID_KEYS,
    "runs": RUNS_KEYS, "runs.loading": LOADING_KEYS, "runs.waves": WAVE_KEYS,
    "propulsion": PROPULSION_KEYS, "propulsion.resistance_estimate": RESISTANCE_ESTIMATE_KEYS,
}

# -- fluids ---------------------------------------------------------------------------------

def _fluid_names() -> tuple[str, ...]:
    return tuple(info.name for info in list_fluids())


def _read_fluid(r: FieldReader, data: Any, path: str) -> FluidSpec | None:
    t = r.table(data, path, FLUID_KEYS, required=("name", "temperature"))
    if not t and not isinstance(data, Mapping):
        return None
    name = None
    info = None
    raw = t.get("name", MISSING)
    if raw is not MISSING:
        if isinstance(raw, str):
            try:
                info = get_fluid(raw)
                name = info.name
            except ValueError:
                r.choose(raw, key_path(path, "name"), _fluid_names())
        else:
            r.choose(raw, key_path(path, "name"), _fluid_names())
    temp = r.field(t, "temperature", path, TEMPERATURE, _LIMITS["temperature"])
    pressure = r.field(t, "pressure", path, PRESSURE, _LIMITS["pressure"])
    salinity = r.field(t, "salinity", path, RATIO, (0.0, 0.2), strict_low=False)
    humidity = r.field(t, "humidity", path, RATIO, (0.0, 1.0), strict_low=False)
    fraction = r.field(t, "mass_fraction", path, RATIO, (0.0, 1.0), strict_low=False)
    if info is not None:
        for key, value in (("temperature", temp), ("salinity", salinity),
                           ("pressure", pressure)):
            rng = info.range_of(key)
            if value is None or rng is None:
                continue
            if not rng.low <= value <= rng.high:
                r.problem(key_path(path, key), f"{show(t[key])} is outside the validity range "
                          f"of {info.name}: {rng.text()}")
        if salinity is not None and info.range_of("salinity") is None:
            r.problem(key_path(path, "salinity"), f"given, but {info.name} has no salinity; "
                      "expected it only for sea_water")
        if fraction is not None and info.range_of("mass_fraction") is None:
            r.problem(key_path(path, "mass_fraction"), f"given, but {info.name} is not a mixture; "
                      "expected it only for glycerol_water")
        if humidity is not None and info.kind != "gas":
            r.problem(key_path(path, "humidity"), f"given, but {info.name} is not a gas; "
                      "expected it only for air")
    if name is None or temp is None:
        return None
    try:
        return FluidSpec(name=name, temperature=temp, pressure=pressure, salinity=salinity,
                         relative_humidity=humidity or 0.0, mass_fraction=fraction)
    except InputError as exc:
        for line in exc.problems:
            r.problems.append(f"{path}: {line}")
        return None


# -- tables of the case ---------------------------------------------------------------------

def _read_prototype(r: FieldReader, data: Any) -> Prototype | None:
    path = "prototype"
    t = r.table(data, path, PROTOTYPE_KEYS, required=("kind", "length", "speeds", "fluid"))
    kind = r.choice(t, "kind", path, PROTOTYPE_KINDS)
    name = r.text(t, "name", path, "prototype")
    length = r.field(t, "length", path, LENGTH, _LIMITS["prototype_length"])
    speeds = r.quantities(t, "speeds", path, SPEED, _LIMITS["speed"])
    rates = r.quantities(t, "rotation_rates", path, RATE, _LIMITS["rotation"])
    depth = r.field(t, "water_depth", path, LENGTH, (0.0, 12000.0))
    immersion = r.field(t, "immersion", path, LENGTH, (0.0, 12000.0), strict_low=False)
    air_p = r.field(t, "air_pressure", path, PRESSURE, _LIMITS["pressure"])
    sizes = {}
    if "sizes" in t:
        st = r.table(t["sizes"], "prototype.sizes", tuple(SIZE_KEYS))
        for key in st:
            lim = {LENGTH: (0.0, 5000.0), AREA: (0.0, 1e7), VOLUME: (0.0, 1e8)}[SIZE_KEYS[key]]
            v = r.field(st, key, "prototype.sizes", SIZE_KEYS[key], lim)
            if v is not None:
                sizes[key] = v
    fluid = _read_fluid(r, t["fluid"], "prototype.fluid") if "fluid" in t else None
    if rates is not None and speeds is not None and len(rates) != len(speeds):
        r.problem("prototype.rotation_rates", f"{len(rates)} values for {len(speeds)} speeds; "
                  "expected one rotation rate per speed")
    if kind == "propeller" and rates is None and "rotation_rates" not in t:
        r.problem("prototype.rotation_rates", "missing; expected one rotation rate per speed "
                  "for a propeller, e.g. ['120 rpm']")
    if None in (kind, length, speeds, fluid):
        return None
    try:
        return Prototype(kind=kind, length=length, speeds=speeds, fluid=fluid, name=name,
                         dimensions=sizes, rotation_rates=rates or (), water_depth=depth,
                         immersion=immersion, ambient_pressure=air_p or P_ATM)
    except InputError as exc:
        r.problems.extend(exc.problems)
        return None


def _read_facility_table(r: FieldReader, data: Any, path: str = "facility") -> Facility | None:
    keys = tuple(k for k in FACILITY_KEYS if k != "file")
    t = r.table(data, path, keys, required=("kind", "length", "width", "speed_limits"))
    kind = r.choice(t, "kind", path, FACILITY_KINDS)
    name = r.text(t, "name", path, "facility")
    size = _LIMITS["facility_size"]
    length = r.field(t, "length", path, LENGTH, size)
    width = r.field(t, "width", path, LENGTH, size)
    if "depth" in t and "height" in t:
        r.problem(key_path(path, "height"), "given with depth; expected one of them (depth for "
                  "tanks and basins, height for a tunnel test section)")
    depth_key = "height" if "height" in t else "depth"
    depth = r.field(t, depth_key, path, LENGTH, size)
    if depth is None and "depth" not in t and "height" not in t:
        r.problem(key_path(path, "depth"), "missing; expected the water depth of a tank or basin "
                  "(depth) or the test-section height of a tunnel (height), e.g. '3.5 m'")
    speeds = r.limits(t, "speed_limits", path, SPEED, _LIMITS["speed"])
    fluids = _read_fluid_names(r, t["fluids"], key_path(path, "fluids")) if "fluids" in t \
        else None
    temps = r.limits(t, "temperature_limits", path, TEMPERATURE, _LIMITS["temperature"])
    pressures = r.limits(t, "pressure_limits", path, PRESSURE, _LIMITS["pressure"])
    accel = r.field(t, "acceleration", path, ACCEL, _LIMITS["acceleration"])
    braking = r.field(t, "braking", path, ACCEL, _LIMITS["acceleration"])
    open_jet = r.flag(t, "open_jet", path)
    periods = r.limits(t, "wave_periods", path, TIME, _LIMITS["wave_period"])
    highest = r.field(t, "highest_wave", path, LENGTH, _LIMITS["wave_height"])
    fastest = r.field(t, "fastest_rotation", path, RATE, _LIMITS["rotation"])
    shortest = r.field(t, "shortest_model", path, LENGTH, _LIMITS["model_length"])
    longest = r.field(t, "longest_model", path, LENGTH, _LIMITS["model_length"])
    steady = r.field(t, "shortest_steady_time", path, TIME, (0.0, 3600.0))
    max_thrust = r.field(t, "largest_thrust", path, FORCE, _LIMITS["dynamometer_force"])
    max_torque = r.field(t, "largest_torque", path, TORQUE, _LIMITS["dynamometer_torque"])
    changeover = r.field(t, "loading_changeover", path, TIME, _LIMITS["waiting"],
                         strict_low=False)
    if shortest is not None and longest is not None and shortest > longest:
        r.problem(key_path(path, "shortest_model"), "longer than longest_model; expected "
                  "shortest_model <= longest_model")
    if kind in ("towing_tank", "wave_basin") and open_jet:
        r.problem(key_path(path, "open_jet"), f"true for a {kind}; expected it only for a "
                  "wind_tunnel")
    if None in (kind, length, width, depth, speeds):
        return None
    kw: dict[str, Any] = {}
    if fluids:
        kw["fluids"] = tuple(fluids)
    if temps is not None:
        kw["temperature_range"] = temps
    try:
        return Facility(kind=kind, name=name, length=length, width=width, depth=depth,
                        speed_range=speeds, pressure_range=pressures, acceleration=accel,
                        deceleration=braking, open_jet=open_jet,
                        wavemaker_period_range=periods, wavemaker_max_height=highest,
                        max_rotation_rate=fastest, min_model_length=shortest,
                        max_model_length=longest, min_steady_time=steady,
                        max_thrust=max_thrust, max_torque=max_torque,
                        loading_changeover=changeover, **kw)
    except InputError as exc:
        r.problems.extend(exc.problems)
        return None


def _read_fluid_names(r: FieldReader, value: Any, path: str) -> list[str]:
    """Catalogue names of the fluids listed (a single name reads as a list of one)."""
    raw = value if isinstance(value, list) else [value]
    fluids = []
    names = _fluid_names()
    for i, item in enumerate(raw):
        try:
            if not isinstance(item, str):
                raise ValueError
            fluids.append(get_fluid(item).name)
        except ValueError:
            r.choose(item, key_path(path, i), names)
    if not raw:
        r.problem(path, "empty list; expected at least one fluid name")
    return fluids


def _read_matching(r: FieldReader, data: Any) -> MatchRequest | None:
    path = "matching"
    t = r.table(data, path, MATCHING_KEYS)
    kw: dict[str, Any] = {}
    for key in ("exact", "report"):
        if key not in t:
            continue
        raw = t[key] if isinstance(t[key], list) else [t[key]]
        names = []
        for i, item in enumerate(raw):
            g = r.choose(item, key_path(key_path(path, key), i), MATCHABLE_GROUPS)
            if g is not None:
                names.append(g)
        if len(names) == len(raw):
            kw[key] = tuple(names)
    if "exact" in kw and len(set(kw["exact"])) != len(kw["exact"]):
        r.problem("matching.exact", f"{list(kw['exact'])!r} names a group twice; expected "
                  "each group once")
        kw.pop("exact")
    if "scale" in t:
        try:
            lam = parse_scale(t["scale"], "matching.scale") if not isinstance(
                t["scale"], bool) else float("nan")
        except (UnitInputError, TypeError, ValueError, OverflowError):
            lam = float("nan")
        lo, hi = _LIMITS["scale"]
        if not (math.isfinite(lam) and lo <= lam <= hi):
            r.problem("matching.scale", f"{show(t['scale'])} is not valid; expected a scale "
                      f"such as '1:25' (prototype/model from {lo:g} to {hi:g})")
        else:
            kw["scale"] = lam
    ml = r.field(t, "model_length", path, LENGTH, _LIMITS["model_length"])
    if ml is not None:
        kw["model_length"] = ml
    if "scale" in t and "model_length" in t:
        r.problem("matching.model_length", "given with scale; expected one of them")
        kw.pop("model_length", None)
    obj = r.choice(t, "choose", path, OBJECTIVES)
    if obj is not None:
        kw["objective"] = obj
    line = r.choice(t, "friction_line", path, tuple(FRICTION_LINES))
    if line is not None:
        kw["friction_line"] = line
    # k of the 1978 ITTC method: the range 0 <= k < 2 is the one Case itself accepts.
    k = r.field(t, "form_factor", path, RATIO, (0.0, 2.0), strict_low=False)
    if k is not None:
        kw["form_factor"] = k
    if "round_scale" in t:
        kw["round_scale"] = r.flag(t, "round_scale", path, True)
    if "relax" in t:
        kw["relax"] = r.flag(t, "relax", path, False)
    if "model_fluid" in t:
        mf = _read_fluid(r, t["model_fluid"], "matching.model_fluid")
        if mf is None:
            return None
        kw["model_fluid"] = mf
    try:
        return MatchRequest(**kw)
    except InputError as exc:
        r.problems.extend(_as_written(line, {"match.": "matching."}) for line in exc.problems)
        return None


def _read_loading(r: FieldReader, data: Any, path: str) -> LoadingCondition | None:
    t = r.table(data, path, LOADING_KEYS, required=("name",))
    name = r.text(t, "name", path)
    draught = r.field(t, "draught", path, LENGTH, _LIMITS["draught"])
    trim = r.field(t, "trim", path, LENGTH, _LIMITS["trim"], strict_low=False)
    disp = r.field(t, "displacement", path, VOLUME, _LIMITS["displacement"])
    mass = {key: r.field(t, key, path, TIME if key.endswith("_period") else LENGTH,
                         _LIMITS[_MASS_LIMIT[key]], strict_low=key != "lcg")
            for key in MASS_PROPERTY_KEYS}
    if name is None:
        return None
    return LoadingCondition(name=name, draught=draught, trim=trim or 0.0, displacement=disp,
                            **mass)


#: Plausibility limits of the mass properties of a loading (keys of _LIMITS).
_MASS_LIMIT = {"lcg": "lcg", "vcg": "centre_height", "gm": "centre_height",
               "roll_radius": "gyration", "pitch_radius": "gyration",
               "yaw_radius": "gyration", "heave_period": "natural_period",
               "roll_period": "natural_period", "pitch_period": "natural_period"}


def _read_wave(r: FieldReader, data: Any, path: str) -> WaveCondition | None:
    t = r.table(data, path, WAVE_KEYS, required=("kind",))
    kind = r.choice(t, "kind", path, WAVE_KINDS)
    name = r.text(t, "name", path, "")
    q = {
        "period": r.field(t, "period", path, TIME, _LIMITS["wave_period"]),
        "length_ratio": r.field(t, "length_ratio", path, RATIO, _LIMITS["wave_length_ratio"]),
        "height": r.field(t, "height", path, LENGTH, _LIMITS["wave_height"]),
        # 1/7: the limiting steepness of a deep-water wave (Michell 1893).
        "steepness": r.field(t, "steepness", path, RATIO, (0.0, 1 / 7)),
        "significant_height": r.field(t, "significant_height", path, LENGTH,
                                      _LIMITS["wave_height"]),
        "peak_period": r.field(t, "peak_period", path, TIME, _LIMITS["wave_period"]),
        "duration": r.field(t, "duration", path, TIME, _LIMITS["duration"]),
    }
    spectrum = r.choice(t, "spectrum", path, SPECTRA, "jonswap")
    # gamma 1 to 7: range of the JONSWAP peak factor in DNV-RP-C205 (2010) section 3.5.5.
    gamma = r.field(t, "gamma", path, RATIO, (1.0, 7.0), strict_low=False)
    if kind == "regular":
        for a, b in (("period", "length_ratio"), ("height", "steepness")):
            if (a in t) == (b in t):
                given = f"both {a} and {b}" if a in t else f"neither {a} nor {b}"
                r.problem(key_path(path, a), f"{given} given; expected exactly one of them for a "
                          "regular wave")
        for key in ("significant_height", "peak_period", "spectrum", "gamma", "duration"):
            if key in t:
                r.problem(key_path(path, key), "given for a regular wave; expected it only for "
                          "kind = 'irregular'")
    elif kind == "irregular":
        for key in ("significant_height", "peak_period"):
            if key not in t:
                r.problem(key_path(path, key), "missing; expected it for an irregular sea")
        for key in ("period", "length_ratio", "height", "steepness"):
            if key in t:
                r.problem(key_path(path, key), "given for an irregular sea; expected it only for "
                          "kind = 'regular'")
        if "gamma" in t and spectrum != "jonswap":
            r.problem(key_path(path, "gamma"), "given for the ittc spectrum; expected it only for "
                      "spectrum = 'jonswap'")
    if kind is None:
        return None
    return WaveCondition(kind=kind, spectrum=spectrum or "jonswap",
                         gamma=3.3 if gamma is None else gamma, name=name or "", **q)


def _read_runs(r: FieldReader, data: Any) -> MatrixSpec | None:
    path = "runs"
    t = r.table(data, path, RUNS_KEYS)
    basis = r.choice(t, "speeds_as", path, SPEED_BASES, "prototype")
    kw: dict[str, Any] = {"speed_basis": basis or "prototype"}
    if basis == "froude":
        speeds = r.quantities(t, "speeds", path, RATIO, _LIMITS["froude"])
    else:
        speeds = r.quantities(t, "speeds", path, SPEED, _LIMITS["speed"])
    if speeds is not None:
        kw["speeds"] = speeds
    kw["repeats"] = r.integer(t, "repeats", path, 1, 100, 1)
    headings = r.quantities(t, "headings", path, RATIO, _LIMITS["heading"], strict_low=False,
                            bare_unit="degree")
    if headings is not None:
        kw["headings"] = headings
    current = r.field(t, "current", path, SPEED, _LIMITS["current"], strict_low=False)
    if current is not None:
        kw["current"] = current
    wait = r.field(t, "wait_between_runs", path, TIME, _LIMITS["waiting"], strict_low=False)
    if wait is not None:
        kw["waiting_time"] = wait
    kw["speed_order"] = r.choice(t, "order", path, SPEED_ORDERS, "ascending") or "ascending"
    kw["seed"] = r.integer(t, "seed", path, 0, 2**32 - 1, 1)
    kw["wave_calibration"] = r.flag(t, "wave_calibration", path, True)
    kw["sweep"] = r.choice(t, "sweep", path, tuple(SWEEPS), "angle_of_attack") or \
        "angle_of_attack"
    angles = r.quantities(t, "angles", path, RATIO, _LIMITS["heading"], strict_low=False,
                          bare_unit="degree")
    if angles is not None:
        kw["angles"] = angles
    ok = True
    for key, reader in (("loading", _read_loading), ("waves", _read_wave)):
        if key not in t:
            continue
        items = []
        tables = r.tables(t[key], key_path(path, key))
        for i, item in enumerate(tables):
            got = reader(r, item, f"{path}.{key}[{i}]")
            ok = ok and got is not None
            items.append(got)
        if not tables:
            ok = False
        kw[key] = tuple(items)
    names = [c.name for c in kw.get("loading", ()) if c is not None]
    if len(set(names)) != len(names):
        r.problem("runs.loading", f"names {names!r} repeat; expected each loading condition "
                  "to have its own name")
    if not ok:
        return None
    try:
        return MatrixSpec(**kw)
    except InputError as exc:
        r.problems.extend(_as_written(line, MATRIX_KEYS) for line in exc.problems)
        return None


#: The fields of MatrixSpec as a case file names them (its messages say "matrix.current").
MATRIX_KEYS = {"matrix.speed_basis": "runs.speeds_as", "matrix.waiting_time":
               "runs.wait_between_runs", "matrix.": "runs."}


def _as_written(line: str, names: dict[str, str]) -> str:
    """A message of a dataclass check with its field names as the file writes them."""
    for inside, written in names.items():
        if line.startswith(inside):
            return written + line[len(inside):]
    return line


def _measured_file(r: FieldReader, value: Any, path: str, base_dir: Path, reader, **kw):
    """Runs read from a measured-data file named in the case (relative to the case file); its
    problems become problems of the case, prefixed with the key path."""
    if not isinstance(value, str) or not value.strip():
        r.problem(path, f"{show(value)} is not valid; expected the path of a .csv or .xlsx file")
        return None
    file = Path(value) if Path(value).is_absolute() else base_dir / value
    try:
        return reader(file, **kw)
    except BAD_INPUT_ERRORS as exc:
        lines = getattr(exc, "problems", None) or [str(exc)]
        r.problems.extend(f"{path}: {line}" for line in lines)
        return None


def _read_resistance_estimate(r: FieldReader, data: Any, path: str):
    """(ship speeds [m/s], total resistance [N]) of a [propulsion.resistance_estimate] table."""
    t = r.table(data, path, RESISTANCE_ESTIMATE_KEYS, required=("speeds",))
    speeds = r.quantities(t, "speeds", path, SPEED, _LIMITS["speed"])
    if ("total_resistance" in t) == ("effective_power" in t):
        r.problem(key_path(path, "total_resistance"), "expected exactly one of "
                  "total_resistance and effective_power")
        return None
    if "total_resistance" in t:
        values = r.quantities(t, "total_resistance", path, FORCE, _LIMITS["ship_resistance"])
    else:
        power = r.quantities(t, "effective_power", path, POWER, _LIMITS["ship_power"])
        values = None if power is None or speeds is None or len(power) != len(speeds) else \
            tuple(p / v for p, v in zip(power, speeds, strict=True))
    if speeds is None or values is None:
        return None
    if len(values) != len(speeds):
        r.problem(path, f"{len(speeds)} speeds and {len(values)} values; expected one value "
                  "per speed")
        return None
    return speeds, values


def _read_propulsion(r: FieldReader, data: Any, base_dir: Path, proto: Prototype | None,
                     request: MatchRequest | None) -> PropulsionSpec | None:
    """The [propulsion] table: propeller, open water, resistance source, expected factors."""
    path = "propulsion"
    t = r.table(data, path, PROPULSION_KEYS)
    kw: dict[str, Any] = {}
    diameter = r.field(t, "propeller_diameter", path, LENGTH, _LIMITS["propeller_diameter"])
    if diameter is not None:
        kw["propeller_diameter"] = diameter
    kw["propellers"] = r.integer(t, "propellers", path, 1, 4, 1)
    for key in ("thrust_polynomial", "torque_polynomial"):
        coeffs = r.quantities(t, key, path, RATIO, _LIMITS["polynomial"], strict_low=False)
        if coeffs is not None:
            kw[key] = coeffs
    for key in ("wake_fraction", "thrust_deduction", "rotative_efficiency", "form_factor"):
        low, high = {"thrust_deduction": (-0.2, 0.6), "rotative_efficiency": (0.7, 1.3),
                     "form_factor": (0.0, 1.5)}.get(key, (0.0, 0.8))
        value = r.field(t, key, path, RATIO, (low, high), strict_low=False)
        if value is not None:
            kw[key] = value
    factors = r.quantities(t, "tow_force_factors", path, RATIO, _LIMITS["tow_force_factor"],
                           strict_low=False)
    if factors is not None:
        kw["tow_force_factors"] = factors
    form = r.choice(t, "friction_correction", path, FRICTION_CORRECTION_FORMS)
    if form is not None:
        kw["friction_correction"] = form
    if "open_water" in t:
        # Thrust and torque in the file are reduced with the model diameter, known only when
        # the case fixes the scale; a file of coefficients needs none.
        scale = None if request is None or proto is None else (
            request.scale if request.scale is not None else
            proto.length / request.model_length if request.model_length is not None else None)
        d_m = None if diameter is None or scale is None else diameter / scale
        kw["open_water"] = _measured_file(r, t["open_water"], key_path(path, "open_water"),
                                          base_dir, read_open_water_runs, diameter=d_m)
    if "resistance_test" in t:
        kw["resistance_runs"] = _measured_file(r, t["resistance_test"],
                                               key_path(path, "resistance_test"), base_dir,
                                               read_resistance_runs)
    if "resistance_estimate" in t:
        got = _read_resistance_estimate(r, t["resistance_estimate"],
                                        key_path(path, "resistance_estimate"))
        if got is not None:
            kw["resistance_speeds"], kw["resistance_values"] = got
    if any(v is None for v in kw.values()):
        return None
    try:
        return PropulsionSpec(**kw)
    except InputError as exc:
        r.problems.extend(exc.problems)
        return None


def _read_about(r: FieldReader, data: Any) -> dict:
    t = r.table(data, "about", ABOUT_KEYS)
    return {k: v for k in ABOUT_KEYS if (v := r.text(t, k, "about")) is not None}


# -- public ---------------------------------------------------------------------------------

def parse_facility(mapping: Any, where: str = "") -> Facility:
    """Read a facility table (the keys of ``[facility]``) into a :class:`Facility` (SI).

    Parameters
    ----------
    mapping : mapping
        The table as read by :mod:`tomllib`.
    where : str
        Prefix of every message (the facility file), or "".

    Raises
    ------
    InputError
        With one line per problem.
    """
    r = FieldReader(where, TOP_KEYS)
    fac = _read_facility_table(r, mapping)
    r.finish()
    return fac


def parse_case(mapping: Any, base_dir: str | Path = ".", name: str = "case") -> Case:
    """Read a case mapping (a parsed TOML document) into a :class:`Case` (SI).

    Parameters
    ----------
    mapping : mapping
        The document as read by :func:`tomllib.loads`.
    base_dir : str or Path
        Folder against which a facility path (``facility = "facilities/tank.toml"``) is read.
    name : str
        Case name used when ``[about] title`` is absent.

    Returns
    -------
    Case

    Raises
    ------
    InputError
        With every problem found, one line each: key path, value, what was expected.
    """
    r = FieldReader(top_keys=TOP_KEYS)
    if not isinstance(mapping, Mapping):
        raise InputError(f"case: {show(mapping)} is not a table; expected a TOML document")
    doc = r.table(mapping, "", TOP_KEYS, required=("prototype", "facility"))
    about = _read_about(r, doc["about"]) if "about" in doc else {}
    proto = _read_prototype(r, doc["prototype"]) if "prototype" in doc else None
    facility = None
    if "facility" in doc:
        raw = doc["facility"]
        if isinstance(raw, str):
            facility = _facility_from_file(r, raw, Path(base_dir))
        elif isinstance(raw, Mapping) and "file" in raw:
            extra = [k for k in raw if k != "file"]
            if extra:
                r.problem("facility", f"keys {extra!r} given with file; expected either "
                          "file = 'path' alone or the facility keys inline")
            if isinstance(raw["file"], str):
                facility = _facility_from_file(r, raw["file"], Path(base_dir))
            else:
                r.problem("facility.file", f"{show(raw['file'])} is not valid; expected "
                          "a path such as 'facilities/tank.toml'")
        else:
            facility = _read_facility_table(r, raw)
    test = r.choice(doc, "test", "", TEST_KINDS, default="")
    request = _read_matching(r, doc["matching"]) if "matching" in doc else MatchRequest()
    matrix = _read_runs(r, doc["runs"]) if "runs" in doc else MatrixSpec()
    if matrix is not None and proto is not None and facility is not None:
        _cross_checks(r, proto, facility, request, matrix)
    if test and facility is not None and facility.kind not in TEST_FACILITIES[test]:
        r.problem("test", f"a {test} test cannot be run in a {facility.kind.replace('_', ' ')}"
                  f"; expected a facility of kind {' or '.join(TEST_FACILITIES[test])}")
    propulsion = None
    if "propulsion" in doc:
        propulsion = _read_propulsion(r, doc["propulsion"], Path(base_dir), proto, request)
    r.finish()
    return Case(prototype=proto, facility=facility, request=request, matrix=matrix,
                metadata=about, name=about.get("title", name), test=test,
                propulsion=propulsion,
                speed_unit=_speed_unit(doc["prototype"].get("speeds")))


def _speed_unit(speeds: Any) -> str:
    """The unit the user wrote the first prototype speed in ("kn", "m/s", "km/h" ...), kept
    for showing speeds; "" when it cannot be read (the Case then takes its default)."""
    first = speeds[0] if isinstance(speeds, list) and speeds else speeds
    if not isinstance(first, str):
        return ""
    try:
        unit = f"{parse_quantity(first, 'prototype.speeds').units:~}"
    except BAD_INPUT_ERRORS:
        return ""
    return unit.replace(" / ", "/").replace(" ", "")


def _cross_checks(r: FieldReader, proto: Prototype, facility: Facility,
                  request: MatchRequest | None, matrix: MatrixSpec) -> None:
    """Problems that span tables."""
    if matrix.waves and not facility.kind == "wave_basin" and facility.kind != "towing_tank":
        r.problem("runs.waves", f"waves given but the facility is a {facility.kind}; expected "
                  "a towing_tank or wave_basin")
    if request is not None and request.model_fluid is not None:
        if request.model_fluid.name not in facility.fluids:
            r.problem("matching.model_fluid.name", f"{request.model_fluid.name!r} is not a "
                      "fluid of the facility; expected one of " + ", ".join(facility.fluids))


def _facility_from_file(r: FieldReader, rel: str, base_dir: Path) -> Facility | None:
    if not rel.strip():
        r.problem("facility", "empty path; expected a facility file such as "
                  "'facilities/tank.toml' or a [facility] table")
        return None
    path = (base_dir / rel) if not Path(rel).is_absolute() else Path(rel)
    try:
        doc = _read_toml(path, "facility")
    except InputError as exc:
        r.problems.extend(exc.problems)
        return None
    sub = FieldReader(where=f"facility file {shown_path(rel)}", top_keys=TOP_KEYS)
    fac = _read_facility_table(sub, doc, "facility")
    r.problems.extend(sub.problems)
    return fac


def _read_toml(path: Path, what: str) -> dict:
    """Read a TOML file; every failure becomes an InputError line."""
    label = f"{what} file {shown_path(path)}"
    data = read_limited(path, label, TEXT_FILE_LIMIT, "a TOML text file")
    if not data.strip():
        raise InputError(f"{label}: is empty; expected a TOML case with [prototype] and "
                         "[facility] tables" if what == "case" else
                         f"{label}: is empty; expected the keys of a facility")
    if b"\x00" in data:
        raise InputError(f"{label}: holds binary data; expected a UTF-8 TOML text file")
    try:
        text = data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise InputError(f"{label}: is not UTF-8 text (byte {exc.start}); expected a UTF-8 "
                         "TOML text file") from None
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError(f"{label}: is not valid TOML ({show_text(str(exc))}); expected TOML "
                         "syntax such as length = \"78 m\"") from None
    except RecursionError:
        raise InputError(f"{label}: is nested too deeply; expected a flat TOML case") from None


def load_facility(path: str | Path) -> Facility:
    """Read a facility file (TOML, the keys of a ``[facility]`` table) into a Facility."""
    p = Path(path)
    doc = _read_toml(p, "facility")
    return parse_facility(doc, where=f"facility file {shown_path(p)}")


def load_case(path: str | Path) -> Case:
    """Read a TOML case file into a :class:`Case` (SI inside).

    Parameters
    ----------
    path : str or Path
        The case file. A facility path inside it is read relative to the case file's folder.

    Returns
    -------
    Case

    Raises
    ------
    InputError
        For a missing, empty, binary or broken file, and for every problem in its content
        (one line each: key path, value, what was expected).
    """
    p = Path(path)
    doc = _read_toml(p, "case")
    return parse_case(doc, base_dir=p.parent, name=p.stem)


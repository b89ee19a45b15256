"""Case files: TOML → Case in SI, and every problem of a bad file reported at once.

Unit definitions used as outside references (exact by definition):
* 1 kn = 1852 m / 3600 s (international nautical mile; BIPM SI Brochure, 9th ed. 2019, Table 8).
* 1 ft = 0.3048 m (international yard and pound agreement, 1959).
* t/degF = 1.8 t/degC + 32, T/K = t/degC + 273.15 (BIPM SI Brochure, 9th ed. 2019, 2.3.1).
* 1 bar = 1e5 Pa; 1 rpm = 1/60 s^-1 (BIPM SI Brochure, 9th ed. 2019, Table 8).
"""

from __future__ import annotations

import copy
from pathlib import Path

import pytest

from similitude.errors import InputError
from similitude.planning.case import Case
from similitude.readers.case_file import load_case, load_facility, parse_case, parse_facility

KN = 1852.0 / 3600.0
FT = 0.3048

FACILITY = {
    "kind": "towing_tank", "name": "tank", "length": "200 m", "width": "7 m",
    "depth": "3.5 m", "speed_limits": ["0.1 m/s", "8 m/s"], "fluids": ["fresh_water"],
    "temperature_limits": ["8 degC", "24 degC"],
}


def metric_case() -> dict:
    return {
        "about": {"title": "t", "project": "p", "client": "c", "author": "a", "date": "d"},
        "prototype": {
            "kind": "surface_ship", "length": "78.0288 m", "speeds": ["9.26 m/s", "7.2022 m/s"],
            "sizes": {"beam": "4.8768 m", "draught": "3.6576 m", "wetted_surface": "1450 m^2"},
            "fluid": {"name": "sea_water", "temperature": "15 degC", "salinity": "35 g/kg"},
        },
        "facility": copy.deepcopy(FACILITY),
        "matching": {"exact": ["froude"], "report": ["reynolds"], "scale": "1:25"},
        "runs": {"speeds": ["9.26 m/s"], "repeats": 2, "current": "0.5144444444 m/s",
                 "loading": [{"name": "design", "draught": "3.6576 m"}]},
    }


def imperial_case() -> dict:
    case = metric_case()
    case["prototype"].update(length="256 ft", speeds=["18 kn", "14 kn"])
    case["prototype"]["sizes"].update(beam="16 ft", draught="12 ft")
    case["prototype"]["fluid"]["temperature"] = "59 degF"
    case["runs"].update(speeds=["18 kn"], current="1 kn",
                        loading=[{"name": "design", "draught": "12 ft"}])
    return case


def problems_of(mapping, base_dir=".") -> list[str]:
    with pytest.raises(InputError) as info:
        parse_case(mapping, base_dir)
    return info.value.problems


# -- reading good files --------------------------------------------------------------------

def test_metric_case_reads_into_si_dataclasses():
    case = parse_case(metric_case())
    assert isinstance(case, Case)
    assert case.prototype.length == pytest.approx(78.0288, rel=1e-12)
    assert case.prototype.fluid.temperature == pytest.approx(288.15, rel=1e-12)  # 15 degC
    assert case.prototype.fluid.salinity == pytest.approx(0.035, rel=1e-12)      # 35 g/kg
    assert case.request.scale == 25.0                                              # "1:25"
    assert case.matrix.repeats == 2
    assert case.metadata["client"] == "c"


def test_knots_feet_and_fahrenheit_give_the_same_si_case_as_metric_units():
    # 18 kn = 9.26 m/s, 256 ft = 78.0288 m, 59 degF = 15 degC (definitions in the module doc).
    a, b = parse_case(metric_case()), parse_case(imperial_case())
    assert b.prototype.length == pytest.approx(a.prototype.length, rel=1e-12)
    assert b.prototype.speeds[0] == pytest.approx(a.prototype.speeds[0], rel=1e-12)
    assert b.prototype.speeds[1] == pytest.approx(14 * KN, rel=1e-12)
    assert b.prototype.fluid.temperature == pytest.approx(a.prototype.fluid.temperature,
                                                           rel=1e-12)
    for key in ("beam", "draught"):
        assert b.prototype.dimensions[key] == pytest.approx(a.prototype.dimensions[key],
                                                            rel=1e-12)
    assert b.matrix.speeds[0] == pytest.approx(a.matrix.speeds[0], rel=1e-12)
    assert b.matrix.current == pytest.approx(a.matrix.current, rel=1e-9)
    assert b.matrix.loading[0].draught == pytest.approx(12 * FT, rel=1e-12)


def test_rotation_rates_in_rpm_are_read_per_second():
    m = metric_case()
    m["prototype"].update(kind="propeller", length="4.2 m", speeds=["6 m/s"],
                          rotation_rates=["120 rpm"])
    assert parse_case(m).prototype.rotation_rates == pytest.approx((2.0,), rel=1e-12)


def test_tunnel_pressure_limits_in_bar_are_read_in_pascal():
    fac = dict(FACILITY, kind="wind_tunnel", fluids=["air"], pressure_limits=["1 bar", "4 bar"])
    fac.pop("depth")
    fac["height"] = "2 m"
    f = parse_facility(fac)
    assert f.pressure_range == (1e5, 4e5)
    assert f.depth == 2.0   # a tunnel's test-section height fills the depth field


def test_headings_accept_bare_degrees_and_angle_strings():
    m = metric_case()
    m["runs"]["headings"] = [180, "150 deg", 90.0]
    assert parse_case(m).matrix.headings == pytest.approx((180.0, 150.0, 90.0), rel=1e-12)


def test_froude_number_speeds_are_bare_numbers():
    m = metric_case()
    m["runs"].update(speeds=[0.2, 0.3], speeds_as="froude")
    spec = parse_case(m).matrix
    assert spec.speed_basis == "froude" and spec.speeds == (0.2, 0.3)


def test_irregular_sea_duration_in_hours_is_read_in_seconds():
    m = metric_case()
    m["runs"]["waves"] = [{"kind": "irregular", "significant_height": "3 m",
                           "peak_period": "9 s", "duration": "3 h", "gamma": 3.3}]
    wave = parse_case(m).matrix.waves[0]
    assert wave.duration == 10800.0 and wave.spectrum == "jonswap"


def test_fluid_names_are_read_like_the_catalogue():
    m = metric_case()
    m["prototype"]["fluid"]["name"] = "sea-water"
    assert parse_case(m).prototype.fluid.name == "sea_water"


def test_toml_dates_become_iso_text_in_the_metadata(tmp_path):
    (tmp_path / "tank.toml").write_text(_facility_toml())
    (tmp_path / "case.toml").write_text(_case_toml(about='date = 2026-03-02\n'))
    assert load_case(tmp_path / "case.toml").metadata["date"] == "2026-03-02"


def _facility_toml() -> str:
    return ('kind = "towing_tank"\nlength = "200 m"\nwidth = "7 m"\ndepth = "3.5 m"\n'
            'speed_limits = ["0.1 m/s", "8 m/s"]\n')


def _case_toml(facility='facility = "tank.toml"\n', about="", extra="") -> str:
    return (facility + "[about]\n" + about + '[prototype]\nkind = "surface_ship"\n'
            'length = "78 m"\nspeeds = ["18 kn"]\n[prototype.fluid]\nname = "sea_water"\n'
            'temperature = "15 degC"\n' + extra)


def test_loading_mass_properties_are_read_to_si(tmp_path):
    # 1 cm = 0.01 m, 1 min = 60 s (SI Brochure, 9th ed. 2019, Tables 8 and 5)
    (tmp_path / "tank.toml").write_text(_facility_toml())
    (tmp_path / "case.toml").write_text(_case_toml(extra=(
        '[[runs.loading]]\nname = "sea"\ndraught = "3.6 m"\nvcg = "5.2 m"\ngm = "120 cm"\n'
        'roll_radius = "5.6 m"\npitch_radius = "19.5 m"\nroll_period = "0.2 min"\n'
        'heave_period = "6 s"\nlcg = "-1.5 m"\n')))
    ld = load_case(tmp_path / "case.toml").matrix.loading[0]
    assert (ld.vcg, ld.gm, ld.roll_radius, ld.pitch_radius) == (5.2, pytest.approx(1.2), 5.6,
                                                                19.5)
    assert ld.roll_period == pytest.approx(12.0) and ld.heave_period == 6.0
    assert ld.lcg == -1.5  # a coordinate: negative is allowed


def test_a_mass_property_without_a_unit_is_refused_naming_the_key(tmp_path):
    (tmp_path / "tank.toml").write_text(_facility_toml())
    (tmp_path / "case.toml").write_text(_case_toml(extra=(
        '[[runs.loading]]\nname = "sea"\ngm = 1.2\n')))
    with pytest.raises(InputError, match=r"runs\.loading\[0\]\.gm"):
        load_case(tmp_path / "case.toml")


def test_run_order_seed_calibration_and_changeover_keys_are_read(tmp_path):
    (tmp_path / "tank.toml").write_text(_facility_toml() + 'loading_changeover = "45 min"\n')
    (tmp_path / "case.toml").write_text(_case_toml(extra=(
        '[runs]\norder = "random"\nseed = 42\nwave_calibration = false\n')))
    case = load_case(tmp_path / "case.toml")
    assert (case.matrix.speed_order, case.matrix.seed) == ("random", 42)
    assert case.matrix.wave_calibration is False
    assert case.facility.loading_changeover == 2700.0  # 45 min = 2700 s


def test_an_unknown_run_order_is_refused_with_the_orders_known(tmp_path):
    (tmp_path / "tank.toml").write_text(_facility_toml())
    (tmp_path / "case.toml").write_text(_case_toml(extra='[runs]\norder = "fastest"\n'))
    with pytest.raises(InputError, match=r"runs\.order: 'fastest'.*ascending, random"):
        load_case(tmp_path / "case.toml")


def test_facility_file_is_read_relative_to_the_case_file(tmp_path):
    (tmp_path / "facilities").mkdir()
    (tmp_path / "facilities" / "tank.toml").write_text(_facility_toml())
    (tmp_path / "case.toml").write_text(_case_toml('facility = "facilities/tank.toml"\n'))
    case = load_case(tmp_path / "case.toml")
    assert case.facility.length == 200.0 and case.facility.width == 7.0


def test_facility_file_and_inline_facility_give_the_same_facility(tmp_path):
    (tmp_path / "tank.toml").write_text(_facility_toml())
    inline = "[facility]\n" + _facility_toml()
    (tmp_path / "a.toml").write_text(_case_toml())
    (tmp_path / "b.toml").write_text(_case_toml(facility="") + inline)
    assert load_case(tmp_path / "a.toml").facility == load_case(tmp_path / "b.toml").facility


def test_facility_table_with_a_file_key_reads_the_file(tmp_path):
    (tmp_path / "tank.toml").write_text(_facility_toml())
    (tmp_path / "case.toml").write_text(_case_toml(facility="")
                                        + '[facility]\nfile = "tank.toml"\n')
    assert load_case(tmp_path / "case.toml").facility.depth == 3.5


def test_load_facility_reads_a_facility_file(tmp_path):
    (tmp_path / "tank.toml").write_text(_facility_toml())
    assert load_facility(tmp_path / "tank.toml").speed_range == (0.1, 8.0)


# -- every problem at once -------------------------------------------------------------------

def test_all_problems_are_reported_together_one_line_each():
    m = metric_case()
    m["prototype"]["length"] = "-78 m"                     # 1 negative
    m["prototype"]["speeds"] = ["15 kg", "18 kn"]          # 2 wrong dimension
    m["prototype"]["fluid"]["name"] = "seawatr"            # 3 unknown fluid
    m["facility"]["width"] = "7 kg"                        # 4 wrong dimension
    m["matching"]["exact"] = ["frode"]                     # 5 unknown group
    m["runs"]["repeats"] = 0                               # 6 out of range
    problems = problems_of(m)
    assert len(problems) == 6
    for start in ("prototype.length:", "prototype.speeds[0]:", "prototype.fluid.name:",
                  "facility.width:", "matching.exact[0]:", "runs.repeats:"):
        assert sum(p.startswith(start) for p in problems) == 1, (start, problems)


def test_each_line_names_key_value_and_expectation():
    m = metric_case()
    m["prototype"]["speeds"] = ["15 kg"]
    (line,) = problems_of(m)
    assert line.startswith("prototype.speeds:") or line.startswith("prototype.speeds[0]:")
    assert "'15 kg'" in line and "[length] / [time]" in line and "kn" in line


def test_unknown_key_suggests_the_nearest_known_key():
    m = metric_case()
    m["prototype"]["lenght"] = "3 m"
    (line,) = problems_of(m)
    assert line.startswith("prototype.lenght:") and "did you mean 'length'" in line


def test_unknown_table_is_an_error_with_a_hint():
    m = metric_case()
    m["matchng"] = {}
    (line,) = problems_of(m)
    assert "did you mean 'matching'" in line


def test_top_level_key_written_after_a_table_gets_an_explanation():
    m = metric_case()
    m["prototype"]["fluid"]["facility"] = "tank.toml"
    m.pop("facility")
    problems = problems_of(m)
    assert any("prototype.fluid.facility" in p and "before the first [table]" in p
               for p in problems)


def test_unknown_choice_suggests_the_nearest_allowed_name():
    m = metric_case()
    m["prototype"]["kind"] = "surface_shp"
    (line,) = problems_of(m)
    assert "did you mean 'surface_ship'" in line and "propeller" in line


def test_number_without_unit_for_a_length_is_refused():
    m = metric_case()
    m["prototype"]["length"] = 78
    (line,) = problems_of(m)
    assert "no unit" in line and "prototype.length" in line


def test_absurd_speed_is_refused_with_its_range():
    m = metric_case()
    m["prototype"]["speeds"] = ["18000 kn"]
    (line,) = problems_of(m)
    assert "out of range" in line and "700 m/s" in line


def test_temperature_outside_the_fluid_validity_is_refused():
    m = metric_case()
    m["prototype"]["fluid"]["temperature"] = "95 degC"
    (line,) = problems_of(m)
    assert "prototype.fluid.temperature" in line and "validity range" in line


def test_missing_required_keys_are_each_reported():
    problems = problems_of({"about": {}})
    assert any(p.startswith("prototype:") for p in problems)
    assert any(p.startswith("facility:") for p in problems)


def test_scale_and_model_length_together_are_refused():
    m = metric_case()
    m["matching"]["model_length"] = "3 m"
    (line,) = problems_of(m)
    assert "matching.model_length" in line and "one of them" in line


def test_regular_wave_needs_exactly_one_of_period_and_length_ratio():
    m = metric_case()
    m["runs"]["waves"] = [{"kind": "regular", "period": "8 s", "length_ratio": 1.0,
                           "height": "2 m"}]
    (line,) = problems_of(m)
    assert "both period and length_ratio" in line


def test_model_fluid_must_be_one_the_facility_holds():
    m = metric_case()
    m["matching"]["model_fluid"] = {"name": "sea_water", "temperature": "15 degC"}
    (line,) = problems_of(m)
    assert "matching.model_fluid.name" in line and "fresh_water" in line


def test_problems_in_a_facility_file_name_the_file(tmp_path):
    (tmp_path / "tank.toml").write_text(_facility_toml().replace('"7 m"', '"7 kg"'))
    (tmp_path / "case.toml").write_text(_case_toml())
    with pytest.raises(InputError) as info:
        load_case(tmp_path / "case.toml")
    (line,) = info.value.problems
    assert "tank.toml" in line and "facility.width" in line


# -- broken files --------------------------------------------------------------------------

@pytest.mark.parametrize("content, words", [
    (b"", "empty"),
    (b"   \n\n", "empty"),
    (b"\x00\x01\x02binary\xff", "binary"),
    (b"\xff\xfe\xfa not utf8", "UTF-8"),
    (b"[prototype\nkind = ", "not valid TOML"),
    (b'length = "78 m"\nlength = "79 m"\n', "not valid TOML"),
])
def test_broken_files_give_one_clear_line(tmp_path, content, words):
    path = tmp_path / "case.toml"
    path.write_bytes(content)
    with pytest.raises(InputError) as info:
        load_case(path)
    (line,) = info.value.problems
    assert words in line and "case.toml" in line


def test_missing_file_gives_one_clear_line(tmp_path):
    with pytest.raises(InputError) as info:
        load_case(tmp_path / "nowhere.toml")
    (line,) = info.value.problems
    assert "not found" in line


def test_folder_instead_of_file_gives_one_clear_line(tmp_path):
    with pytest.raises(InputError) as info:
        load_case(tmp_path)
    assert "folder" in info.value.problems[0]


def test_missing_facility_file_is_reported_with_the_other_problems(tmp_path):
    (tmp_path / "case.toml").write_text(_case_toml('facility = "none.toml"\n').replace(
        '"78 m"', '"-1 m"'))
    with pytest.raises(InputError) as info:
        load_case(tmp_path / "case.toml")
    problems = info.value.problems
    assert len(problems) == 2
    assert any("none.toml" in p and "not found" in p for p in problems)


@pytest.mark.parametrize("path", ["", "  ", ".", "a\x00b", "x" * 5000, "/"])
def test_unusable_facility_paths_give_input_errors(path):
    m = metric_case()
    m["facility"] = path
    assert any(p.startswith("facility") for p in problems_of(m))


def test_document_that_is_not_a_table_is_refused():
    with pytest.raises(InputError):
        parse_case(["not", "a", "table"])


def test_demo_folder_exists_for_the_relative_facility_paths():
    # The demo cases name their facility files relative to demo_cases/ (see test_demo_cases).
    assert (Path(__file__).parents[2] / "demo_cases" / "facilities").is_dir()


def test_commented_example_of_the_reference_reads(tmp_path):
    # The first ```toml block of the README (the case-file reference), with the demo tank beside it.
    root = Path(__file__).parents[2]
    doc = (root / "README.md").read_text()
    example = doc.split("```toml\n", 1)[1].split("```", 1)[0]
    (tmp_path / "facilities").mkdir()
    (tmp_path / "facilities" / "towing_tank_demo.toml").write_text(
        (root / "demo_cases" / "facilities" / "towing_tank_demo.toml").read_text())
    (tmp_path / "case.toml").write_text(example)
    case = load_case(tmp_path / "case.toml")
    assert case.prototype.speeds[-1] == pytest.approx(18 * KN, rel=1e-12)
    assert [c.name for c in case.matrix.loading] == ["design", "full, trimmed by the stern"]


def test_friction_line_and_form_factor_reach_the_request():
    m = metric_case()
    m["matching"].update(friction_line="Schoenherr", form_factor=0.12)
    req = parse_case(m).request
    assert req.friction_line == "schoenherr" and req.form_factor == 0.12


def test_rotation_rate_in_hertz_counts_revolutions():
    m = metric_case()
    m["prototype"].update(kind="propeller", length="4.2 m", speeds=["6 m/s"],
                          rotation_rates=["2 Hz"])
    assert parse_case(m).prototype.rotation_rates == (2.0,)


def test_facility_fastest_rotation_in_rpm_counts_revolutions():
    # 1 rpm = 1/60 revolution per second (module doc): 3000 rpm is n = 50 1/s, not the
    # 314 rad/s pint alone gives; the limit is compared with n of J = V/(nD), in revolutions.
    import tomllib

    demo = Path(__file__).resolve().parents[2] / "demo_cases" / "facilities"
    table = tomllib.loads((demo / "cavitation_tunnel_demo.toml").read_text(encoding="utf-8"))
    in_hz = parse_facility(table).max_rotation_rate
    table["fastest_rotation"] = "3000 rpm"
    assert parse_facility(table).max_rotation_rate == pytest.approx(50.0, rel=1e-12)
    assert in_hz == pytest.approx(50.0, rel=1e-12)  # the file's "50 Hz"


def test_every_key_the_reader_accepts_is_documented_in_the_reference():
    # The case-file reference (in the README) is the user's only list of keys; a key the
    # reader accepts but the reference omits could only be found by reading the code.
    import re

    import similitude.readers.case_file as cf

    doc = (Path(__file__).parents[2] / "README.md").read_text(encoding="utf-8")
    assert set(cf.CASE_KEYS) >= {"", "prototype", "facility", "runs", "runs.waves"}
    missing = [f"{table or 'top level'}: {key}" for table, keys in cf.CASE_KEYS.items()
               for key in keys
               if not re.search(rf"`{re.escape(key)}`|^\s*#?\s*{re.escape(key)}\s*="
                                rf"|\[{re.escape(_dot(table, key))}\]", doc, re.MULTILINE)]
    assert missing == []


def _dot(table: str, key: str) -> str:
    return f"{table}.{key}" if table else key


@pytest.mark.parametrize("text", ["120 rev/min", "2 rev/s", "2 rps", "12.566370614359172 rad/s"])
def test_rotation_rate_in_rev_rps_or_rad_per_second_counts_revolutions(text):
    # 1 rev/min = 1/60 rev/s (module doc); 4 pi rad/s = 2 revolutions per second, as one
    # revolution is 2 pi rad (SI Brochure, 9th ed. 2019, Table 4, the radian).
    m = metric_case()
    m["prototype"].update(kind="propeller", length="4.2 m", speeds=["6 m/s"],
                          rotation_rates=[text])
    assert parse_case(m).prototype.rotation_rates == pytest.approx((2.0,), rel=1e-12)


def test_round_scale_false_reaches_the_request():
    m = metric_case()
    m.setdefault("matching", {})["round_scale"] = False
    assert parse_case(m).request.round_scale is False


def test_round_scale_must_be_true_or_false():
    m = metric_case()
    m.setdefault("matching", {})["round_scale"] = "yes"
    with pytest.raises(InputError, match=r"matching.round_scale: 'yes' is not valid; expected "
                       "true or false"):
        parse_case(m)


def test_mass_fraction_of_a_glycerol_model_fluid_is_read_as_a_fraction():
    m = metric_case()
    m["facility"]["fluids"] = ["fresh_water", "glycerol_water"]
    m.setdefault("matching", {})["model_fluid"] = {
        "name": "glycerol-water", "temperature": "20 degC", "mass_fraction": "60 %"}
    fluid = parse_case(m).request.model_fluid
    assert fluid.name == "glycerol_water" and fluid.mass_fraction == pytest.approx(0.6)


def test_mass_fraction_for_a_pure_fluid_is_refused():
    m = metric_case()
    m["prototype"]["fluid"]["mass_fraction"] = 0.3
    with pytest.raises(InputError, match=r"prototype.fluid.mass_fraction: given, but "
                       "sea_water is not a mixture"):
        parse_case(m)


def test_test_key_names_the_kind_of_test():
    doc = metric_case()
    doc["test"] = "self_propulsion"
    assert parse_case(doc).test == "self_propulsion"


def test_test_key_for_a_facility_that_cannot_run_it_is_one_named_problem():
    doc = metric_case()
    doc["test"] = "wind_tunnel"
    assert problems_of(doc) == ["test: a wind_tunnel test cannot be run in a towing tank; "
                                "expected a facility of kind wind_tunnel"]

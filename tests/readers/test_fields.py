"""The generic field reader: problems are collected, named by key path, and raised together.

Unit conversions are checked against the definitions of the units (cited beside each check).
"""

from __future__ import annotations

import pytest

from similitude.errors import InputError
from similitude.readers.fields import LENGTH, SPEED, TEMPERATURE, FieldReader, key_path


def test_key_path_joins_keys_with_dots_and_indices_with_brackets():
    assert key_path("", "runs") == "runs"
    assert key_path("runs", "waves") == "runs.waves"
    assert key_path("runs.waves", 2) == "runs.waves[2]"


def test_quantity_strings_are_read_in_si():
    # 1 kn = 1852 m / 3600 s (international nautical mile, 1929; from memory) and
    # T/K = t/degC + 273.15 (SI Brochure, 9th ed. 2019, §2.3.1; from memory).
    r = FieldReader()
    assert r.field({"v": "18 kn"}, "v", "x", SPEED, (0.0, 700.0)) == pytest.approx(
        18 * 1852 / 3600, rel=1e-12)
    assert r.field({"t": "15 degC"}, "t", "x", TEMPERATURE, (1.0, 2000.0)) == pytest.approx(
        288.15, rel=1e-12)
    assert r.problems == []


def test_every_problem_is_collected_and_raised_once_with_its_key_path():
    r = FieldReader(where="facility file 'tank.toml'")
    assert r.field({"length": 3.2}, "length", "facility", LENGTH, (0.05, 5000.0)) is None
    assert r.field({"width": "9e9 m"}, "width", "facility", LENGTH, (0.05, 5000.0)) is None
    with pytest.raises(InputError) as err:
        r.finish()
    lines = err.value.problems
    assert len(lines) == 2
    assert lines[0].startswith("facility file 'tank.toml': facility.length: 3.2 has no unit")
    assert lines[1].startswith("facility file 'tank.toml': facility.width:")
    assert "out of range" in lines[1]


def test_unknown_key_gets_a_did_you_mean_hint_and_a_top_level_key_the_toml_hint():
    r = FieldReader(top_keys=("runs",))
    r.table({"lenght": "3 m", "runs": {}}, "prototype", ("length", "speeds"))
    assert r.problems[0] == "prototype.lenght: unknown key; did you mean 'length'?"
    assert r.problems[1].startswith("prototype.runs: unknown key; a top-level 'runs' must come "
                                    "before the first [table]")

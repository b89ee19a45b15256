"""Campaign files (readers.campaign_file): the demo reads as documented, and bad input is
reported all at once, one line per problem, naming the key as written."""

import shutil
from pathlib import Path

import pytest

from similitude.cli import main
from similitude.errors import InputError
from similitude.readers.campaign_file import load_campaign

DEMO = Path(__file__).parents[2] / "demo_cases"
KN = 1852.0 / 3600.0  # BIPM SI Brochure (2019), Table 8


@pytest.fixture(scope="module")
def demo():
    return load_campaign(DEMO / "coastal_campaign.toml")


def test_demo_campaign_reads_its_tests_models_and_candidates(demo):
    assert [t.name for t in demo.tests] == ["resistance", "open water", "self-propulsion",
                                            "seakeeping"]
    assert [m.name for m in demo.models] == ["hull", "stock propeller"]
    assert all(len(t.facilities) == 2 for t in demo.tests)
    assert demo.test("self-propulsion").models == ("hull", "stock propeller")
    assert demo.objective == "largest_model" and demo.start == "2026-09-07"
    assert demo.changeover == pytest.approx(4 * 3600.0)


def test_test_prototype_changes_only_the_keys_it_names(demo):
    seakeeping = demo.test("seakeeping").case.prototype
    resistance = demo.test("resistance").case.prototype
    assert seakeeping.speeds == pytest.approx((6 * KN, 10 * KN), rel=1e-12)
    assert seakeeping.dimensions == resistance.dimensions
    assert seakeeping.length == resistance.length == 68.0


def test_model_of_another_kind_keeps_only_the_ships_fluid(demo):
    prop = demo.test("open water").case.prototype
    assert prop.kind == "propeller" and prop.length == 2.6
    assert prop.fluid == demo.test("resistance").case.prototype.fluid  # sea water, 15 degC
    assert "midship_area" not in prop.dimensions
    assert demo.test("open water").case.test == "open_water"


# -- bad input -------------------------------------------------------------------------------
GOOD_TANK = '''
[[test]]
name = "resistance"
kind = "resistance"
model = "hull"
facility = "facilities/north_towing_tank.toml"
'''


def _write(tmp_path, body: str) -> Path:
    (tmp_path / "facilities").mkdir(exist_ok=True)
    for f in ("north_towing_tank.toml", "cavitation_tunnel_demo.toml"):
        shutil.copy(DEMO / "facilities" / f, tmp_path / "facilities" / f)
    head = (DEMO / "coastal_campaign.toml").read_text().split("[[model]]")[0]
    path = tmp_path / "campaign.toml"
    path.write_text(head + body)
    return path


def _problems(path) -> list[str]:
    with pytest.raises(InputError) as err:
        load_campaign(path)
    return err.value.problems


BAD = GOOD_TANK + '''
[[model]]
name = "hull"

[[test]]
name = "resistance"
kind = "resistance"
model = "hul"
facility = "facilities/no_such_tank.toml"

[[test]]
name = "cavitation"
kind = "cavitation"
model = "hull"
facility = "facilities/cavitation_tunnel_demo.toml"
[test.prototype]
kind = "propeller"
length = "2.6 m"
speeds = ["5 m/s"]
rotation_rates = ["150 rpm"]
'''


def test_every_problem_of_a_bad_campaign_is_one_line_naming_its_key(tmp_path):
    lines = _problems(_write(tmp_path, BAD))
    text = "\n".join(lines)
    assert any(line.startswith("test[1].facility: facility file 'facilities/no_such_tank.toml'")
               and "not found" in line for line in lines)
    assert any(line.startswith("test[1].name: 'resistance' is used twice") for line in lines)
    assert any(line.startswith("test[2].model: 'hull' is a hull model") and "cavitation" in line
               for line in lines)
    assert "did you mean" not in text or "hul" in text
    assert all("\n" not in line for line in lines)


def test_a_test_naming_an_unknown_model_is_refused(tmp_path):
    body = GOOD_TANK.replace('model = "hull"', 'model = "hul"') + '\n[[model]]\nname = "hull"\n'
    lines = _problems(_write(tmp_path, body))
    assert lines == ["test[0].model: 'hul' is not a model of the campaign; expected one of "
                     "'hull'"]


def test_unknown_key_gets_a_did_you_mean(tmp_path):
    lines = _problems(_write(tmp_path, GOOD_TANK.replace("facility =", "facilty =")))
    assert any(line.startswith("test[0].facilty: unknown key; did you mean 'facility'?")
               for line in lines)


def test_problem_in_a_tests_runs_is_named_under_the_test(tmp_path):
    body = GOOD_TANK + '[test.runs]\nspeeds = ["12"]\n[[model]]\nname = "hull"\n'
    lines = _problems(_write(tmp_path, body))
    assert len(lines) == 1 and lines[0].startswith("test[0].runs.speeds[0]: '12' ")


def test_problem_in_a_tests_prototype_is_named_where_it_was_written(tmp_path):
    body = GOOD_TANK + '[test.prototype]\nspeeds = ["fast"]\n[[model]]\nname = "hull"\n'
    lines = _problems(_write(tmp_path, body))
    assert len(lines) == 1 and lines[0].startswith("test[0].prototype.speeds")


def test_a_facility_of_the_wrong_kind_for_the_test_is_refused(tmp_path):
    body = GOOD_TANK.replace("north_towing_tank", "cavitation_tunnel_demo") + \
        '[[model]]\nname = "hull"\n'
    lines = _problems(_write(tmp_path, body))
    assert lines == ["test[0].facility: 'facilities/cavitation_tunnel_demo.toml' is a "
                     "cavitation tunnel; a resistance test needs a towing tank or a wave basin"]


def test_unknown_objective_gets_a_did_you_mean(tmp_path):
    path = _write(tmp_path, GOOD_TANK + '[[model]]\nname = "hull"\n')
    path.write_text(path.read_text().replace('choose = "largest_model"', 'choose = "fewest_hour"'))
    lines = _problems(path)
    assert lines[0].startswith("campaign.choose: 'fewest_hour' is not allowed (did you mean "
                               "'fewest_hours'?)")


def test_bad_campaign_on_the_command_line_exits_2_and_writes_nothing(tmp_path, capsys):
    path = _write(tmp_path, BAD)
    out = tmp_path / "campaign.xlsx"
    assert main(["campaign", str(path), "-o", str(out)]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) >= 4 and all(line.startswith("error: ") for line in err)
    assert not out.exists()

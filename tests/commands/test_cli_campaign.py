"""``similitude campaign``: the demo end to end, outputs with the cautions, refusals."""

import json
import subprocess
import sys
from pathlib import Path

import openpyxl
import pytest

from similitude.cautions import caution_line
from similitude.cli import main

DEMO = Path(__file__).parents[2] / "demo_cases"
CAMPAIGN = DEMO / "coastal_campaign.toml"


@pytest.fixture(scope="module")
def written(tmp_path_factory):
    out = tmp_path_factory.mktemp("campaign") / "campaign.xlsx"
    done = subprocess.run([sys.executable, "-m", "similitude", "campaign", str(CAMPAIGN), "-o",
                           str(out)], capture_output=True, text=True)
    return done, out


def test_demo_campaign_plans_and_writes_its_workbook(written):
    done, out = written
    assert done.returncode == 0, done.stderr
    assert out.is_file() and f"wrote {out}" in done.stdout


def test_summary_names_models_bookings_and_the_binding_basin(written):
    text = written[0].stdout
    assert "model 'hull'" in text and "1:20" in text
    assert "T4  seakeeping" in text and "West seakeeping basin (invented)" in text
    assert "bound by seakeeping in West seakeeping basin (invented)" in text


def test_summary_ends_with_the_caution(written):
    assert written[0].stdout.splitlines()[-2] == caution_line("towing_tank")


def test_workbook_has_the_summary_ranking_and_each_tests_sheets(written):
    wb = openpyxl.load_workbook(written[1])
    names = wb.sheetnames
    assert names[:3] == ["Campaign", "Facility ranking", "Combinations"]
    for label in ("T1", "T2", "T3", "T4"):
        assert f"{label} Overview" in names and f"{label} Runs" in names


def test_json_carries_the_caution_and_every_test(capsys):
    assert main(["campaign", str(CAMPAIGN), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert "ITTC" in data["caution"]
    assert sorted(data["plans"]) == ["T1", "T2", "T3", "T4"]
    assert [b["test"] for b in data["bookings"]] == ["resistance", "open water",
                                                      "self-propulsion", "seakeeping"]


def test_choose_option_overrides_the_campaign_file(capsys):
    assert main(["campaign", str(CAMPAIGN), "--choose", "fewest_hours"]) == 0
    assert "chosen by the fewest facility hours" in capsys.readouterr().out


def test_existing_workbook_is_not_replaced_without_force(written, capsys):
    out = written[1]
    before = out.read_bytes()
    assert main(["campaign", str(CAMPAIGN), "-o", str(out)]) == 2
    assert "exists" in capsys.readouterr().err and out.read_bytes() == before


def test_infeasible_campaign_exits_2_with_one_line_per_reason(tmp_path, capsys):
    text = CAMPAIGN.read_text().replace('"facilities/', f'"{DEMO}/facilities/')
    # the hull fixed at 1:8: too large for every basin's model-size limit
    text = text.replace('[[model]]                            # one hull model for every hull '
                        'test\nname = "hull"', '[[model]]\nname = "hull"\nscale = "1:8"')
    path = tmp_path / "fixed.toml"
    path.write_text(text)
    out = tmp_path / "x.xlsx"
    assert main(["campaign", str(path), "-o", str(out)]) == 2
    err = capsys.readouterr().err.splitlines()
    assert len(err) > 1 and all(line.startswith("error: ") for line in err)
    assert not out.exists()

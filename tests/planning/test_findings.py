"""Check statuses: one vocabulary, one colour each, and a summary that never claims more than
was checked.

The 2 % "at limit" band is this project's stated common practice (a planning figure within 2 %
of a limit is within the spread of its inputs); the margins are worked by hand beside each
assertion.
"""

from __future__ import annotations

import math

import pytest

from similitude.planning.findings import (
    AT_LIMIT_MARGIN,
    STATUS_COLOURS,
    STATUS_MEANINGS,
    STATUSES,
    Check,
    checks_html,
    checks_summary,
    format_margin,
    judge,
    needs_attention,
    status_counts,
)


def _check(status, value=1.0, limit=2.0):
    return Check("x", value, limit, "", "max", status, "common practice")


def test_the_vocabulary_has_the_six_statuses():
    assert STATUSES == ("ok", "at limit", "warning", "fail", "not checked", "info")


def test_every_status_has_its_own_colour_and_meaning():
    assert set(STATUS_COLOURS) == set(STATUSES) == set(STATUS_MEANINGS)
    assert len(set(STATUS_COLOURS.values())) == len(STATUSES)
    assert all(len(c) == 6 and int(c, 16) >= 0 for c in STATUS_COLOURS.values())


def test_the_at_limit_band_is_two_percent():
    assert AT_LIMIT_MARGIN == 0.02


def test_a_limit_met_with_equality_is_at_limit_not_ok():
    # margin (0.005 - 0.005)/0.005 = 0
    assert judge(0.005, 0.005, "max") == "at limit"


def test_a_blockage_a_hair_under_its_limit_is_at_limit():
    # margin (0.005 - 0.004998)/0.005 = 0.04 % < 2 %
    assert judge(0.004998, 0.005, "max") == "at limit"


def test_a_margin_of_four_percent_is_ok():
    # margin (0.005 - 0.0048)/0.005 = 4 %
    assert judge(0.0048, 0.005, "max") == "ok"
    # minimum: (2.08e6 - 2e6)/2e6 = 4 %
    assert judge(2.08e6, 2.0e6, "min") == "ok"


def test_a_minimum_one_percent_above_its_limit_is_at_limit():
    # margin (2.02e6 - 2e6)/2e6 = 1 %
    assert judge(2.02e6, 2.0e6, "min") == "at limit"


def test_an_exceeded_soft_limit_warns_and_a_hard_one_fails():
    # margin (0.005 - 0.0051)/0.005 = -2 %
    assert judge(0.0051, 0.005, "max", soft=True) == "warning"
    assert judge(0.0051, 0.005, "max", soft=False) == "fail"


def test_a_value_that_could_not_be_formed_is_not_checked():
    assert judge(float("nan"), 0.005, "max") == "not checked"


def test_an_unknown_status_is_refused():
    with pytest.raises(ValueError, match="status"):
        _check("passed")


def test_a_not_checked_row_names_the_input_that_would_enable_it():
    c = Check.not_checked("blockage ratio A_X/(B_T h)",
                          "give prototype.sizes.midship_area, or beam and draught")
    assert c.status == "not checked" and math.isnan(c.value) and math.isnan(c.margin)
    assert "midship_area" in c.advice


def test_summary_says_all_passed_only_when_every_check_is_ok():
    assert checks_summary([_check("ok")] * 3) == "all 3 passed"


@pytest.mark.parametrize("other", ["at limit", "warning", "fail", "not checked"])
def test_summary_never_says_all_passed_with_a_check_that_is_not_ok(other):
    text = checks_summary([_check("ok")] * 3 + [_check(other)])
    assert "all" not in text and "passed" not in text
    assert text == f"4 checks: 3 ok, 1 {other}"


def test_summary_counts_each_status_in_the_order_of_the_vocabulary():
    checks = [_check(s) for s in ("not checked", "ok", "fail", "ok", "at limit", "warning")]
    assert checks_summary(checks) == "6 checks: 2 ok, 1 at limit, 1 warning, 1 fail, 1 not checked"
    assert status_counts(checks) == {"ok": 2, "at limit": 1, "warning": 1, "fail": 1,
                                     "not checked": 1}


def test_info_rows_are_counted_apart_from_the_verdicts():
    info = Check.info("model wave length", 3.2, "m", "linear dispersion")
    assert checks_summary([_check("ok"), info]) == "all 1 passed (and 1 for information)"


def test_checks_needing_attention_come_worst_first():
    checks = [_check(s) for s in ("at limit", "ok", "not checked", "warning", "fail")]
    assert [c.status for c in needs_attention(checks)] == [
        "fail", "warning", "not checked", "at limit"]


def test_margins_print_as_percentages():
    assert format_margin(0.00042) == "0.042 %"
    assert format_margin(0.031) == "3.1 %"
    assert format_margin(-2.573) == "-257 %"
    assert format_margin(float("nan")) == ""


def test_notebook_table_colours_each_status_cell_with_the_shared_colour():
    text = checks_html([_check("at limit", 0.004998, 0.005), Check.not_checked("y", "give z")])
    assert f"background-color:#{STATUS_COLOURS['at limit']}" in text
    assert f"background-color:#{STATUS_COLOURS['not checked']}" in text
    assert "0.04 %" in text and "give z" in text


def test_a_zero_band_makes_only_equality_at_limit():
    # 288.15 K against a 283.15 K minimum: relative margin 1.8 % but 5 K inside the range.
    assert judge(288.15, 283.15, "min", band=0.0) == "ok"
    assert judge(283.15, 283.15, "min", band=0.0) == "at limit"

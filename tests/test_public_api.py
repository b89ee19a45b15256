"""The public API is a promise: every promised name imports from the top level, and the one
page that lists them (docs/api.md) lists exactly the packages' ``__all__``."""

from __future__ import annotations

import pathlib
import re

import pytest

import fluids_props
import similitude

API_PAGE = pathlib.Path(__file__).resolve().parents[1] / "docs" / "api.md"

# The names shared/DESIGN.md promises to outside callers (section "Public entry points").
DESIGN_NAMES = (
    "pi_groups", "load_case", "plan", "extrapolate", "ShipParticulars", "TankParticulars",
    "ExtrapolationOptions", "PropellerParticulars", "scale_open_water",
    "MeasurementUncertainty", "propagate", "read_resistance_runs", "read_open_water_runs",
    "friction_coefficient", "InputError", "InfeasibleError", "BAD_INPUT_ERRORS",
)


def _documented(section_start: str, section_end: str | None) -> set[str]:
    text = API_PAGE.read_text(encoding="utf-8")
    part = text.split(section_start, 1)[1]
    if section_end:
        part = part.split(section_end, 1)[0]
    names = set()
    for row in part.splitlines():
        if row.startswith("| `"):
            first_cell = row.split("|")[1]
            names.update(re.findall(r"`([A-Za-z_][A-Za-z_0-9]*)", first_cell))
            names.update(re.findall(r", `?([A-Za-z_][A-Za-z_0-9]*)[(`]", first_cell))
    return names


@pytest.mark.parametrize("name", DESIGN_NAMES)
def test_name_promised_by_the_design_imports_from_the_top_level(name):
    assert getattr(similitude, name) is not None


@pytest.mark.parametrize("name", similitude.__all__)
def test_every_listed_similitude_name_resolves(name):
    assert getattr(similitude, name) is not None


def test_api_page_lists_exactly_the_similitude_names():
    documented = _documented("## `similitude`: before the test", None)
    assert documented == set(similitude.__all__)


def test_api_page_lists_exactly_the_fluids_props_names():
    documented = _documented("## `fluids_props`", "## `similitude`")
    assert documented == set(fluids_props.__all__)


def test_unknown_top_level_name_is_an_attribute_error():
    with pytest.raises(AttributeError, match="no attribute 'no_such_name'"):
        similitude.no_such_name  # noqa: B018

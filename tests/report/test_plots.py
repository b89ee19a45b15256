"""Plots of a plan (similitude.report.plots): the scale window and the friction-line plot."""

import math
import subprocess
import sys

import matplotlib
import pytest

import similitude as sim
from similitude.errors import InputError
from similitude.planning.case import Case, FluidSpec, MatchRequest, MatrixSpec, Prototype
from similitude.planning.facilities import Facility
from similitude.report import plots

matplotlib.use("Agg")


@pytest.fixture(scope="module")
def plan():
    fac = Facility("towing_tank", "test tank (invented)", 200.0, 7.0, 4.0, (0.1, 8.0))
    proto = Prototype("surface_ship", 100.0, (5.0, 7.0, 9.0), FluidSpec("sea_water", 288.15),
                      dimensions={"midship_area": 60.0})
    return sim.plan(Case(proto, fac, request=MatchRequest(scale=25.0),
                         matrix=MatrixSpec(repeats=1)))


def test_scale_window_limits_follow_froude_scaling(plan):
    win = plots.scale_window(plan).set_index("limit")
    # V_m = V_p / sqrt(lambda) <= 8 m/s  ->  lambda >= (9/8)^2
    assert win.loc["carriage speed <= maximum", "lowest scale [-]"] == pytest.approx(
        max(1.0, (9 / 8) ** 2))
    # L_m <= B_T / (2 tan 19.47 deg) (Kelvin wedge, derived) -> lambda >= 100 / (0.707 * 7)
    assert win.loc["model length <= 0.71 x tank width", "lowest scale [-]"] == pytest.approx(
        100 / (7 / (2 * math.tan(math.radians(19.47)))))
    # blockage A_X / (lambda^2 B h) <= 0.5 % -> lambda >= sqrt(60 / (0.005 * 28))
    assert win.loc["blockage ratio <= 0.5%", "lowest scale [-]"] == pytest.approx(
        math.sqrt(60 / (0.005 * 28)))


def test_chosen_scale_lies_inside_the_window_of_a_feasible_plan(plan):
    win = plots.scale_window(plan)
    inside = (win["lowest scale [-]"] <= plan.scale) & (plan.scale <= win["highest scale [-]"])
    # every facility limit except the (common practice) Reynolds number one is met at 1:25
    assert inside[~win["limit"].str.contains("Reynolds")].all()


def test_plot_plan_draws_both_panels(plan):
    fig = plots.plot_plan(plan, kind="all")
    assert len(fig.axes) == 2
    assert fig.axes[0].get_xscale() == "log" and fig.axes[1].get_xscale() == "log"
    assert "friction" in fig.axes[1].get_title()


def test_plot_plan_draws_into_given_axes(plan):
    from matplotlib.figure import Figure

    fig = Figure()
    ax = fig.subplots()
    assert plots.plot_plan(plan, kind="reynolds", ax=ax) is fig
    labels = [t.get_text() for t in ax.get_legend().get_texts()]
    assert labels == ["ITTC-1957 line", "model", "full scale"]


def test_plot_plan_saves_a_png_without_overwriting(plan, tmp_path):
    path = tmp_path / "window.png"
    plots.plot_plan(plan, kind="scale_window", path=path)
    assert path.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    with pytest.raises(InputError, match="--force"):
        plots.plot_plan(plan, kind="scale_window", path=path)
    plots.plot_plan(plan, kind="scale_window", path=path, overwrite=True)


def test_plan_plot_default_kind_works(plan):
    assert len(plan.plot().axes) == 2


def test_unknown_plot_kind_is_a_one_line_input_error(plan):
    with pytest.raises(InputError, match="kind: 'pie' is unknown"):
        plots.plot_plan(plan, kind="pie")


def test_importing_the_plot_module_does_not_import_matplotlib():
    code = ("import sys, similitude.report.plots, similitude.report.plan_workbook; "
            "print('matplotlib' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.strip()
    assert out == "False"

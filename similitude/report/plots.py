"""Plots of a plan: the scale-selection window and the Reynolds numbers on the friction line.

matplotlib is an optional extra (``pip install similitude[plot]``) and is imported only when a
plot is drawn. Files are drawn on a bare ``Figure`` with the Agg canvas, so no display or GUI
backend is needed; without a path (a notebook) pyplot is used so the figure shows inline.

The scale window is computed by :func:`scale_window` (no matplotlib): for each facility limit
the interval of scale ratios lambda = L_p/L_m it admits, with the source of the limit.
"""

from __future__ import annotations

import math
import pathlib

import numpy as np
import pandas as pd

from similitude.constants import G0
from similitude.correlations.friction import MIN_TURBULENT_MODEL_REYNOLDS, friction_coefficient
from similitude.correlations.propeller_scaling import blade_drag_full_scale, blade_drag_model
from similitude.errors import InputError
from similitude.planning.case import body_class
from similitude.planning.matrix import reynolds_columns
from similitude.planning.planner import Plan
from similitude.report.atomic import OutputSet, write_atomic
from similitude.units import format_scale

PLOT_KINDS = ("all", "scale_window", "reynolds", "groups")

#: Blockage ratio A_X/(B_T h) below which viscous blockage is usually neglected (commonly quoted
#: 0.5 %; no ITTC numeric limit retrieved: common practice).
BLOCKAGE_LIMIT = 0.005
#: Model length over tank width from the Kelvin wedge: 1 / (2 tan 19.47 deg) = 0.71*B_T
#: (derived: side-wall reflections reach the model before its stern for longer models).
KELVIN_WIDTH_RATIO = 1.0 / (2.0 * math.tan(math.radians(19.47)))
#: Depth Froude number kept below 0.6 so the tank counts as deep (the ITTC/ISO 15016 speed-trial
#: deep-water criterion, equivalent to Fh < 0.6; applied to tanks as common practice).
DEPTH_FROUDE_LIMIT = 0.6


def scale_window(plan: Plan) -> pd.DataFrame:
    """Admissible scale ratios for each facility limit of a plan.

    Parameters
    ----------
    plan : similitude.planning.planner.Plan

    Returns
    -------
    pandas.DataFrame
        Columns "limit", "lowest scale [-]", "highest scale [-]", "source"; lambda inside
        [lowest, highest] satisfies that limit (inf or 1 where a side is open).

    Notes
    -----
    Free-surface facilities assume Froude scaling, V_m = V_p lambda^-0.5:
    carriage speed V_min <= V_m <= V_max; model length L_m <= 0.71 B_T (Kelvin wedge, derived);
    Fh = V_m/sqrt(g h) <= 0.6 (deep water); blockage A_X/(lambda^2 B_T h) <= 0.5 % (common
    practice); model Re >= 2e6 at the lowest speed for effective turbulence stimulation (common
    practice); and the facility's own model-length limits.
    """
    case = plan.case
    proto, fac = case.prototype, case.facility
    lp = proto.length
    rows = []

    def add(name, lo, hi, source):
        rows.append({"limit": name, "lowest scale [-]": max(1.0, lo),
                     "highest scale [-]": hi, "source": source})

    if fac.max_model_length:
        add("model length <= facility maximum", lp / fac.max_model_length, math.inf,
            "facility data")
    if fac.min_model_length:
        add("model length >= facility minimum", 1.0, lp / fac.min_model_length,
            "facility data")
    if fac.free_surface:
        vmax_p, vmin_p = max(proto.speeds), min(proto.speeds)
        vlo, vhi = fac.speed_range
        add("carriage speed <= maximum", (vmax_p / vhi) ** 2, math.inf, "facility data")
        if vlo > 0:
            add("carriage speed >= minimum", 1.0, (vmin_p / vlo) ** 2, "facility data")
        add("model length <= 0.71 x tank width", lp / (KELVIN_WIDTH_RATIO * fac.width),
            math.inf, "derived: Kelvin wedge half-angle 19.47 deg")
        add(f"depth Froude number <= {DEPTH_FROUDE_LIMIT:g}",
            (vmax_p / (DEPTH_FROUDE_LIMIT * math.sqrt(G0 * fac.depth))) ** 2, math.inf,
            "ITTC 7.5-04-01-01.1 / ISO 15016 deep-water criterion, applied as common practice")
        ax = proto.dimension("midship_area")
        if ax:
            add(f"blockage ratio <= {BLOCKAGE_LIMIT:.1%}",
                math.sqrt(ax / (BLOCKAGE_LIMIT * fac.cross_section)), math.inf,
                "common practice")
        nu_m = float(np.asarray(plan.model_fluid.kinematic_viscosity_si))
        add(f"model Reynolds number >= {MIN_TURBULENT_MODEL_REYNOLDS:.0e} at lowest speed",
            1.0, (vmin_p * lp / (nu_m * MIN_TURBULENT_MODEL_REYNOLDS)) ** (2.0 / 3.0),
            "common practice (turbulence stimulation)")
    else:
        area = proto.dimension("frontal_area")
        if area:
            add("solid blockage area ratio <= 5 %",
                math.sqrt(area / (0.05 * fac.cross_section)), math.inf,
                "common practice for closed tunnels")  # 5 %: from memory
        add("model length <= test-section width", lp / fac.width, math.inf, "geometry")
    return pd.DataFrame(rows, columns=["limit", "lowest scale [-]", "highest scale [-]",
                                       "source"])


def _need_matplotlib():
    try:
        import matplotlib  # noqa: F401
    except ImportError as exc:  # pragma: no cover - depends on the environment
        raise InputError("plots: matplotlib is not installed; expected the optional extra "
                         "(pip install 'similitude[plot]')") from exc


def _figure_axes(n: int, kind: str, ax, to_file: bool):
    """(figure, list of ``n`` axes): the axes given, or a new figure of ``n`` panels."""
    if ax is not None:
        axes = list(ax) if isinstance(ax, (list, tuple, np.ndarray)) else [ax]
        if len(axes) != n:
            raise InputError(f"ax: {len(axes)} axes given; expected {n} for kind {kind!r}")
        return axes[0].figure, axes
    size = (13, 5) if n == 2 else (7, 5)
    if to_file:  # a bare Figure on the Agg canvas: no display or GUI backend needed
        from matplotlib.backends.backend_agg import FigureCanvasAgg
        from matplotlib.figure import Figure

        fig = Figure(figsize=size, layout="constrained")
        FigureCanvasAgg(fig)
    else:  # pyplot, so a notebook shows the figure inline
        import matplotlib.pyplot as plt

        fig = plt.figure(figsize=size, layout="constrained")
    return fig, list(np.atleast_1d(fig.subplots(1, n)))


def _draw_window(plan: Plan, ax) -> None:
    win = scale_window(plan)
    y = np.arange(len(win))
    lam = float(plan.scale)
    finite_hi = win["highest scale [-]"].replace(np.inf, np.nan)
    right = float(np.nanmax([finite_hi.max(), win["lowest scale [-]"].max(), lam])) * 2.0
    left = max(1.0, float(np.nanmin([win["lowest scale [-]"].min(), lam])) / 2.0)
    for i, row in win.iterrows():
        lo, hi = row["lowest scale [-]"], row["highest scale [-]"]
        hi_d = right if not math.isfinite(hi) else hi
        ok = lo <= lam <= hi
        ax.barh(i, hi_d - lo, left=lo, height=0.6, color="#8fc98f" if ok else "#e8a0a0",
                edgecolor="0.3")
    ax.axvline(lam, color="k", lw=2)
    ax.text(lam, len(win) - 0.4, f" chosen {format_scale(lam)}", va="bottom")
    ax.set_xscale("log")
    ax.set_xlim(left, right)
    ax.set_ylim(-0.6, len(win) + 0.2)
    ax.set_yticks(y)
    ax.set_yticklabels(win["limit"])
    ax.set_xlabel("scale ratio lambda = L_prototype / L_model [-]")
    ax.set_title("Scale-selection window (admissible ranges per limit)")


def _draw_reynolds(plan: Plan, ax) -> None:
    """Model and full-scale Reynolds numbers: on the ITTC-1957 line for a hull, on the ITTC-78
    model blade-section drag for a propeller (Re_0.7R), against speed for a wing or body
    (no friction line applies to them)."""
    m, case = plan.matrix, plan.case
    kind = body_class(case.prototype.kind)
    re_col, re_p_col = reynolds_columns(case)
    by = m.groupby("prototype speed [m/s]", sort=True).first().reset_index()
    re_m = by[re_col].to_numpy(float)
    re_p = by[re_p_col].to_numpy(float)
    ok_m, ok_p = re_m > 100, re_p > 100
    if kind == "body":
        col = case.speed_header if case.speed_header in by else "prototype speed [m/s]"
        v = by[col].to_numpy(float)
        ax.plot(v[ok_m], re_m[ok_m], "o-", lw=2.5, label="model")
        ax.plot(v[ok_p], re_p[ok_p], "s--", label="full scale")
        ax.set_yscale("log")
        ax.set_xlabel(col)
        ax.set_ylabel("Reynolds number Re = V L / nu [-]")
        ax.set_title("Model and full-scale Reynolds numbers")
        ax.legend()
        ax.grid(True, which="both", alpha=0.3)
        return
    lo = math.floor(math.log10(max(1e4, re_m[ok_m].min() if ok_m.any() else 1e5))) - 0.5
    hi = math.ceil(math.log10(re_p[ok_p].max() if ok_p.any() else 1e9)) + 0.5
    grid = np.logspace(lo, hi, 200)
    if kind == "propeller":
        chord = float(case.prototype.dimension("blade_chord", case.prototype.dimension(
            "diameter", case.prototype.length)))
        def model(re):  # t/c is not given by a case: the factor 2(1 + 2 t/c) is 2
            return blade_drag_model(0.0, re)

        full = np.full(re_p.shape, float(blade_drag_full_scale(0.0, chord)))
        line_label, y_label = "ITTC-78 model blade-section drag", "C_D [-]"
        x_label = "blade-section Reynolds number Re_0.7R [-]"
        title = "Model and full-scale blade-section drag (ITTC-78)"
        grid = grid[grid > 1e4]  # the model formula goes negative far below 1e5
    else:
        model = friction_coefficient
        full = friction_coefficient(np.where(ok_p, re_p, 1e9))
        line_label, y_label = "ITTC-1957 line", "C_F [-]"
        x_label = "Reynolds number Re = V L / nu [-]"
        title = "Model and full-scale Re on the friction line"
    ax.plot(grid, model(grid), color="0.2", label=line_label)
    ax.plot(re_m[ok_m], model(re_m[ok_m]), "o", label="model")
    ax.plot(re_p[ok_p], full[ok_p], "s", label="full scale")
    for rm, rp, cf in zip(re_m[ok_m & ok_p], re_p[ok_m & ok_p], full[ok_m & ok_p],
                          strict=True):
        ax.annotate("", xy=(rp, cf), xytext=(rm, float(model(rm))),
                    arrowprops={"arrowstyle": "->", "color": "0.6", "lw": 0.8})
    ax.set_xscale("log")
    ax.set_xlabel(x_label)
    ax.set_ylabel(y_label)
    ax.set_title(title)
    ax.legend()
    ax.grid(True, which="both", alpha=0.3)


def plot_plan(plan: Plan, kind: str = "all", ax=None, path=None, overwrite: bool = False,
              outputs: OutputSet | None = None):
    """Draw the plots of a plan.

    Parameters
    ----------
    plan : similitude.planning.planner.Plan
    kind : {"all", "scale_window", "reynolds", "groups"}
        ``"groups"`` (the default of ``Plan.plot``) draws both panels, like ``"all"``.
    ax : matplotlib Axes, or a pair of Axes for ``"all"``, optional
        Draw into these; otherwise a new figure is made.
    path : str or path-like, optional
        Save the figure there (format from the suffix, e.g. .png, .svg, .pdf), atomically;
        an existing file is kept unless ``overwrite``.
    overwrite : bool
    outputs : similitude.report.atomic.OutputSet, optional
        Save the figure as one file of this set (published with the others, or not at all);
        ``overwrite`` is then the set's.

    Returns
    -------
    matplotlib.figure.Figure
    """
    if kind not in PLOT_KINDS:
        raise InputError(f"kind: {kind!r} is unknown; expected one of " + ", ".join(PLOT_KINDS))
    if kind == "groups":  # what Plan.plot() passes by default: both panels
        kind = "all"
    _need_matplotlib()
    fig, axes = _figure_axes(2 if kind == "all" else 1, kind, ax, to_file=path is not None)
    if kind in ("all", "scale_window"):
        _draw_window(plan, axes[0])
    if kind in ("all", "reynolds"):
        _draw_reynolds(plan, axes[-1])
    if path is not None:
        target = pathlib.Path(path)
        fmt = target.suffix.lstrip(".") or "png"
        def save(tmp):
            fig.savefig(tmp, format=fmt, dpi=120)

        if outputs is not None:
            outputs.add(target, save)
        else:
            write_atomic(target, save, overwrite=overwrite)
    return fig

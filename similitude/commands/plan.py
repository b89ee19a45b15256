"""``similitude plan CASE.toml``: plan a model test from a case file.

Reads the case, plans it, prints a short summary (or the plan as JSON) and, when asked, writes
the workbook (``-o``), CSV tables (``--csv DIR``) and plots (``--plots DIR``). Nothing is written
unless the whole case reads and plans without a problem, and no existing file is replaced
without ``--force``.
"""

from __future__ import annotations

import argparse
import math
import sys
from pathlib import Path
from typing import Any

from similitude.cautions import caution_line
from similitude.commands.common import (
    add_paper_option,
    check_targets,
    folder_files,
    json_text,
    print_written,
    workbook_path,
)
from similitude.planning.findings import (
    checks_summary,
    checks_table,
    format_margin,
    needs_attention,
)
from similitude.planning.matrix import facility_time_hours, runs_text
from similitude.planning.planner import Plan
from similitude.planning.planner import plan as make_plan
from similitude.readers.case_file import load_case
from similitude.report.atomic import OutputSet, signals_cleanup
from similitude.report.plots import plot_plan
from similitude.units import format_scale

#: CSV tables written by ``--csv`` (file stems).
CSV_TABLES = ("groups", "checks", "matrix", "scale_factors", "speeds")
#: Plots written by ``--plots``: file stem = kind passed to :func:`plot_plan`.
PLOT_KINDS = ("scale_window", "reynolds")


def add_parser(sub) -> argparse.ArgumentParser:
    """Register the ``plan`` command."""
    p = sub.add_parser(
        "plan",
        help="plan a model test from a TOML case file",
        description="Read a TOML case file, choose the model scale, fluid state and speeds, "
        "check the facility and print a summary; optionally write the workbook, CSV tables "
        "and plots. Nothing is written when the case has a problem.",
    )
    p.add_argument("case", metavar="CASE.toml", help="the case file")
    p.add_argument("-o", "--output", metavar="PLAN.xlsx",
                   help="write the workbook here (not written without this option)")
    p.add_argument("--force", action="store_true",
                   help="replace existing output files")
    add_paper_option(p)
    p.add_argument("--json", action="store_true",
                   help="print the plan as JSON on stdout instead of the summary")
    p.add_argument("--csv", metavar="DIR",
                   help="write groups, checks, run matrix, scale factors and speeds as CSV "
                   "files into DIR")
    p.add_argument("--plots", metavar="DIR",
                   help="write PNG plots into DIR (needs matplotlib)")
    p.set_defaults(func=run)
    return p


# -- the command --------------------------------------------------------------------------

def run(args) -> int:
    """Run ``similitude plan``; returns the exit code."""
    check_targets(_targets(args), args.force)
    if args.plots and not _have_matplotlib():
        print("error: --plots needs matplotlib, which is not installed "
              "(pip install 'similitude[plot]'); nothing was written", file=sys.stderr)
        return 1
    plan = make_plan(load_case(args.case))
    json_out = json_text(plan.to_dict()) if args.json else None
    # Every file is written as one set: all are published, or none (a failing CSV folder
    # takes the workbook back too).
    with signals_cleanup(), OutputSet(args.force) as out:
        if args.output:
            _write_workbook(plan, args.output, out, args.paper)
        if args.csv:
            _write_csv(plan, out.folder(args.csv, "--csv"), out)
        if args.plots:
            _write_plots(plan, out.folder(args.plots, "--plots"), out)
    written = out.written

    if json_out is not None:
        print(json_out)
    else:
        print(summary(plan))
        print_written(written)
    return 0


def _targets(args) -> list[Path]:
    """All files this run would write, checked before any work."""
    out: list[Path] = []
    if args.output:
        out.append(workbook_path(args.output))
    if args.csv:
        out.extend(folder_files(args.csv, "--csv", CSV_TABLES, ".csv"))
    if args.plots:
        out.extend(folder_files(args.plots, "--plots", PLOT_KINDS, ".png"))
    return out


def _have_matplotlib() -> bool:
    try:  # matplotlib is an optional extra: only asked for here, with --plots
        import matplotlib  # noqa: F401
    except ImportError:
        return False
    return True


def _write_workbook(plan: Plan, path: str, out: OutputSet, paper: str = "A4") -> None:
    # The workbook writer loads openpyxl (a heavy library): imported only when -o asks for a
    # workbook, so a run for the summary or --json stays quick.
    from similitude.report.plan_workbook import write_plan

    write_plan(plan, path, paper=paper, outputs=out)


def _csv_texts(plan: Plan) -> dict[str, str]:
    """File stem -> CSV text of each table of ``--csv``, text fields made safe for a
    spreadsheet (:func:`similitude.report.sheets.csv_text`)."""
    # report.sheets loads openpyxl (a heavy library): only when --csv asks for tables
    from similitude.report.sheets import csv_text

    tables = {
        "groups": plan.groups, "checks": checks_table(plan.checks),
        "matrix": plan.matrix, "scale_factors": plan.scale_factors, "speeds": plan.speeds,
    }
    return {stem: csv_text(tables[stem]) for stem in CSV_TABLES}


def _write_csv(plan: Plan, folder: Path, out: OutputSet) -> None:
    for stem, text in _csv_texts(plan).items():
        out.add(folder / f"{stem}.csv", lambda p, text=text: p.write_text(text, encoding="utf-8"))


def _write_plots(plan: Plan, folder: Path, out: OutputSet) -> None:
    for kind in PLOT_KINDS:
        plot_plan(plan, kind=kind, path=folder / f"{kind}.png", outputs=out)


# -- the summary --------------------------------------------------------------------------

def summary(plan: Plan) -> str:
    """The terminal summary of a plan: a few lines for a person."""
    case = plan.case
    lines = [f"{case.name}: {case.prototype.name} in {case.facility.name}",
             *(f"  {t}" for t in plan.requested_not_matched_lines()),
             f"  scale           {format_scale(plan.scale)}  (model length "
             f"{_fmt(plan.model_length)} m, prototype {_fmt(case.prototype.length)} m)",
             f"  model fluid     {_fluid_text(plan.model_fluid, not plan.model_pressures)}"]
    if plan.model_pressures:
        lines.append(f"  pressures       {plan.model_pressure_text()}")
    lines += _speed_lines(case, plan.speeds)
    lines += _propulsion_lines(plan)
    lines += _group_lines(plan.groups)
    if plan.binding_constraint:
        lines.append(f"  binding         {plan.binding_constraint}")
    lines += _check_lines(plan.checks)
    lines.append(f"  runs            {runs_text(plan.matrix)}, about "
                 f"{facility_time_hours(plan.matrix):.1f} h of facility time")
    lines.append(caution_line(case.facility.kind))
    return "\n".join(lines)


def _fmt(x: Any, digits: int = 4) -> str:
    try:
        v = float(x)
    except (TypeError, ValueError):
        return str(x)
    if not math.isfinite(v):
        return str(v)
    return f"{v:.{digits}g}"


def _fluid_text(state, with_pressure: bool = True) -> str:
    text = f"{state.fluid} at {float(state.temperature_si) - 273.15:.1f} degC"
    if with_pressure and state.pressure_si is not None:
        text += f", {float(state.pressure_si) / 1e3:.4g} kPa"
    return text


def _speed_lines(case, speeds) -> list[str]:
    """Prototype speeds in the case's unit -> model speeds in m/s on one line, then one line
    per model rotation rate."""
    lines = []
    col_user, col_m = case.speed_header, "model speed [m/s]"
    if col_user not in speeds:
        col_user = "prototype speed [m/s]"
    unit = col_user[col_user.index("[") + 1:-1]
    if col_m in speeds:
        parts = [f"{row[col_user]:.4g} {unit} -> {row[col_m]:.4g} m/s"
                 for _, row in speeds.iterrows()]
        lines.append("  model speeds    " + "; ".join(parts))
    for c in speeds.columns:
        if "[1/s]" in c and "model" in c:
            lines.append(f"  {c:<15} " + ", ".join(_fmt(v) for v in speeds[c]))
    return lines


def _propulsion_lines(plan: Plan) -> list[str]:
    """A self-propulsion plan's tow force per speed and the expected propeller figures."""
    sp = plan.propulsion
    if sp is None:
        return []
    t = sp.speeds
    lines = ["  tow force F_D   " + "; ".join(
        f"{kn:.4g} kn {fd:.3g} N" for kn, fd in zip(t["prototype speed [kn]"],
                                                    t["skin-friction correction F_D [N]"],
                                                    strict=True))
        + f" (k = {sp.form_factor:.3f})"]
    if "expected rotation rate [1/s]" in t:
        n = t["expected rotation rate [1/s]"]
        lines.append(f"  expected n      {_fmt(n.min())} to {_fmt(n.max())} 1/s ("
                     f"{_fmt(60 * n.min())} to {_fmt(60 * n.max())} rpm); thrust up to "
                     f"{_fmt(t['expected thrust [N]'].max())} N, torque up to "
                     f"{_fmt(t['expected torque [N m]'].max())} N m")
    return lines


def _group_label(name: str, symbol: str) -> str:
    """A group as the summary names it: its name without the definition, and its symbol."""
    return f"{name.split(', ')[0]} ({symbol})"


def _group_lines(groups) -> list[str]:
    """Groups matched and not matched at the design (highest) speed."""
    if not len(groups):
        return []
    at = groups[groups["prototype speed [m/s]"] == groups["prototype speed [m/s]"].max()]
    rows = list(zip(at["group"], at["symbol"], at["matched"], at["ratio"], strict=True))
    matched = [_group_label(g, s) for g, s, m, _ in rows if m]
    unmatched = [f"{_group_label(g, s)} ratio {_fmt(r, 3)}" for g, s, m, r in rows if not m]
    return ["  matched         " + (", ".join(matched) or "none"),
            "  not matched     " + (", ".join(unmatched) or "none")
            + ("  (prototype/model at the design speed)" if unmatched else "")]


def _check_lines(checks) -> list[str]:
    """The count of checks by status, then one line per check that needs attention (fail,
    warning, not checked, at limit), worst first."""
    lines = [f"  checks          {checks_summary(checks)}"]
    for c in needs_attention(checks):
        label = c.status.upper()
        if c.status == "not checked":
            lines.append(f"    {label:<11} {c.name}: {c.advice}")
            continue
        unit = f" {c.unit}" if c.unit else ""
        margin = f", margin {format_margin(c.margin)}" if math.isfinite(c.margin) else ""
        lines.append(f"    {label:<11} {c.name}: {_fmt(c.value)}{unit} (limit "
                     f"{_fmt(c.limit)}{unit}{margin})")
    return lines

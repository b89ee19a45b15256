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

from similitude.errors import InputError
from similitude.plain_data import to_json
from similitude.planning.findings import checks_table
from similitude.units import format_scale

#: CSV tables written by ``--csv``: file stem -> Plan attribute (or builder).
CSV_TABLES = ("groups", "checks", "matrix", "scale_factors", "speeds")
#: Plots written by ``--plots``: file stem -> kind passed to ``Plan.plot``.
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
    p.add_argument("--json", action="store_true",
                   help="print the plan as JSON on stdout instead of the summary")
    p.add_argument("--csv", metavar="DIR",
                   help="write groups, checks, run matrix, scale factors and speeds as CSV "
                   "files into DIR")
    p.add_argument("--plots", metavar="DIR",
                   help="write PNG plots into DIR (needs matplotlib)")
    p.set_defaults(func=run)
    return p


# -- helpers ----------------------------------------------------------------------------

def _targets(args) -> list[Path]:
    """All files this run would write, checked before any work."""
    out: list[Path] = []
    if args.output:
        p = Path(args.output).expanduser()
        if p.suffix.lower() != ".xlsx":
            raise InputError(f"-o: {args.output!r} does not end in .xlsx; expected a workbook "
                             "path such as plan.xlsx")
        out.append(p)
    for opt, stems, suffix in (("csv", CSV_TABLES, ".csv"), ("plots", PLOT_KINDS, ".png")):
        folder = getattr(args, opt)
        if not folder:
            continue
        d = Path(folder).expanduser()
        if d.exists() and not d.is_dir():
            raise InputError(f"--{opt}: {folder!r} is a file; expected a folder")
        out.extend(d / f"{stem}{suffix}" for stem in stems)
    return out


def _check_targets(paths: list[Path], force: bool) -> None:
    problems = []
    for p in paths:
        if p.is_dir():
            problems.append(f"output: {str(p)!r} is a folder; expected a file path")
        elif p.exists() and not force:
            problems.append(f"output: {str(p)!r} exists; not overwritten (use --force)")
        elif not p.parent.exists() and p.suffix == ".xlsx":
            problems.append(f"output: folder {str(p.parent)!r} does not exist; expected an "
                            "existing folder")
    if problems:
        raise InputError(problems)




def _fmt(x: Any, digits: int = 4) -> str:
    try:
        v = float(x)
    except (TypeError, ValueError):
        return str(x)
    if not math.isfinite(v):
        return str(v)
    return f"{v:.{digits}g}"


def _group_label(key: str) -> str:
    try:
        from similitude.dimensional.groups import get

        g = get(key)
        return f"{g.name} ({g.symbol})"
    except Exception:  # the catalogue may not know a key; the key itself is readable
        return key


def summary(plan) -> str:
    """The terminal summary of a plan: a few lines for a person."""
    from similitude.cli import CAUTION

    case = plan.case
    lines = [f"{case.name}: {case.prototype.name} in {case.facility.name}"]
    lines.append(f"  scale           {format_scale(plan.scale)}  (model length "
                 f"{_fmt(plan.model_length)} m, prototype {_fmt(case.prototype.length)} m)")
    mf = plan.model_fluid
    fluid = f"{mf.fluid} at {float(mf.temperature_si) - 273.15:.1f} degC"
    if mf.pressure_si is not None:
        fluid += f", {float(mf.pressure_si) / 1e3:.4g} kPa"
    lines.append(f"  model fluid     {fluid}")
    sp = plan.speeds
    col_kn, col_m = "prototype speed [kn]", "model speed [m/s]"
    if col_m in sp:
        parts = []
        for _, row in sp.iterrows():
            proto = (f"{row[col_kn]:.4g} kn" if col_kn in sp
                     else f"{row['prototype speed [m/s]']:.4g} m/s")
            parts.append(f"{proto} -> {row[col_m]:.4g} m/s")
        lines.append("  model speeds    " + "; ".join(parts))
    rate_cols = [c for c in sp.columns if "[1/s]" in c and "model" in c]
    for c in rate_cols:
        lines.append(f"  {c:<15} " + ", ".join(_fmt(v) for v in sp[c]))
    g = plan.groups
    if len(g):
        design = g["prototype speed [m/s]"].max()
        at = g[g["prototype speed [m/s]"] == design]
        matched = [_group_label(k) for k, m in zip(at["key"], at["matched"], strict=False) if m]
        unmatched = [f"{_group_label(k)} ratio {_fmt(r, 3)}"
                     for k, m, r in zip(at["key"], at["matched"], at["ratio"], strict=False)
                     if not m]
        lines.append("  matched         " + (", ".join(matched) or "none"))
        lines.append("  not matched     " + (", ".join(unmatched) or "none")
                     + ("  (prototype/model at the design speed)" if unmatched else ""))
    if plan.binding_constraint:
        lines.append(f"  binding         {plan.binding_constraint}")
    bad = [c for c in plan.checks if c.status in ("fail", "warning")]
    if bad:
        lines.append("  checks          " + f"{len(bad)} of {len(plan.checks)} need attention:")
        for c in bad:
            lines.append(f"    {c.status.upper():<8} {c.name}: {_fmt(c.value)} {c.unit} "
                         f"(limit {_fmt(c.limit)} {c.unit})".rstrip())
    else:
        lines.append(f"  checks          all {len(plan.checks)} passed")
    try:
        from similitude.planning.matrix import facility_time_hours

        lines.append(f"  runs            {len(plan.matrix)} runs, about "
                     f"{facility_time_hours(plan.matrix):.1f} h of facility time")
    except Exception:  # the matrix summary is a convenience; the plan stands without it
        pass
    lines.append(CAUTION)
    return "\n".join(lines)




# -- the command --------------------------------------------------------------------------

def run(args) -> int:
    """Run ``similitude plan``; returns the exit code."""
    from similitude.readers.case_file import load_case

    targets = _targets(args)
    _check_targets(targets, args.force)
    if args.plots:
        try:
            import matplotlib  # noqa: F401
        except ImportError:
            print("error: --plots needs matplotlib, which is not installed "
                  "(pip install 'similitude[plot]'); nothing was written", file=sys.stderr)
            return 1
    case = load_case(args.case)
    from similitude.planning.planner import plan as make_plan

    plan = make_plan(case)
    # Build every text output before the first write, so a failure leaves nothing behind.
    csv_texts = {}
    if args.csv:
        tables = {
            "groups": plan.groups, "checks": checks_table(plan.checks),
            "matrix": plan.matrix, "scale_factors": plan.scale_factors, "speeds": plan.speeds,
        }
        csv_texts = {stem: tables[stem].to_csv(index=False) for stem in CSV_TABLES}
    json_text = to_json(plan.to_dict()) if args.json else None

    written: list[Path] = []
    if args.output:
        written.append(Path(plan.to_excel(args.output, overwrite=args.force)))
    if csv_texts:
        from similitude.report.atomic import write_text_atomic

        folder = Path(args.csv).expanduser()
        folder.mkdir(parents=True, exist_ok=True)
        for stem, text in csv_texts.items():
            written.append(write_text_atomic(folder / f"{stem}.csv", text,
                                             overwrite=args.force))
    if args.plots:
        written.extend(_write_plots(plan, Path(args.plots).expanduser(), args.force))

    if json_text is not None:
        print(json_text)
    else:
        print(summary(plan))
        for p in written:
            print(f"wrote {p}")
    return 0


def _write_plots(plan, folder: Path, force: bool) -> list[Path]:
    folder.mkdir(parents=True, exist_ok=True)
    out = []
    for kind in PLOT_KINDS:
        target = folder / f"{kind}.png"
        plan.plot(kind=kind, path=target, overwrite=force)  # written atomically there
        out.append(target)
    return out

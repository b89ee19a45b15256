"""Write every demo output of two checkouts and compare them value for value.

Usage::

    python tools/compare_outputs.py OLD_CHECKOUT [NEW_CHECKOUT]   # NEW defaults to this one

Each checkout runs the same demo commands (``similitude plan`` on every demo case with ``-o``,
``--json``, ``--csv`` and ``--plots``; ``similitude extrapolate`` on the synthetic ferry data,
with and without open water and uncertainty) in a fresh interpreter with its own tree first on
``PYTHONPATH``. The outputs are compared: printed text and JSON exactly, CSV files exactly,
workbooks cell by cell on every sheet (values, number formats, merged ranges, print titles,
charts per sheet), the plot files by their image size. The workbook's own creation time is the
only thing left out. Exit 0 when everything agrees, 1 with a list of the differences.

Used to show that a change of layout (no change of behaviour) kept every output the same.
"""

from __future__ import annotations

import json
import os
import pathlib
import subprocess
import sys
import tempfile

DEMO = "demo_cases"
CASES = ("ferry_resistance", "offshore_seakeeping", "propeller_cavitation", "wing_wind_tunnel")
MEASURED = f"{DEMO}/measured/ferry_resistance_runs_SYNTHETIC.csv"
OPEN_WATER = f"{DEMO}/measured/ferry_open_water_SYNTHETIC.csv"
PROPELLER = "diameter=4.2 m; pitch_ratio=1.0; chord_ratio=0.30; blades=4; thickness_ratio=0.04"


def commands(out: pathlib.Path) -> dict[str, list[str]]:
    """Name -> arguments of ``python -m similitude``; outputs go into ``out``."""
    cmds: dict[str, list[str]] = {}
    for case in CASES:
        path = f"{DEMO}/{case}.toml"
        cmds[f"{case}.txt"] = ["plan", path, "-o", str(out / f"{case}.xlsx"),
                               "--csv", str(out / f"csv_{case}"),
                               "--plots", str(out / f"plots_{case}")]
        cmds[f"{case}.json"] = ["plan", path, "--json"]
    base = ["extrapolate", MEASURED, "--case", f"{DEMO}/ferry_resistance.toml"]
    cmds["results.txt"] = [*base, "-o", str(out / "results.xlsx")]
    full = [*base, "--speed-uncertainty", "2 mm/s", "--resistance-uncertainty", "0.3 %",
            "--open-water", OPEN_WATER, "--propeller", PROPELLER]
    cmds["results_full.txt"] = [*full, "-o", str(out / "results_full.xlsx")]
    cmds["results_full.json"] = [*full, "--json"]
    return cmds


def produce(checkout: pathlib.Path, out: pathlib.Path) -> None:
    """Run every demo command of ``checkout``; stdout goes to ``out/<name>``."""
    env = dict(os.environ, PYTHONPATH=str(checkout))
    for name, args in commands(out).items():
        done = subprocess.run([sys.executable, "-m", "similitude", *args], cwd=checkout,
                              capture_output=True, text=True, env=env, timeout=600)
        text = done.stdout.replace(str(out), "<out>")
        (out / name).write_text(f"exit {done.returncode}\n{text}{done.stderr}")


def _workbook_facts(path: pathlib.Path) -> dict:
    import openpyxl

    wb = openpyxl.load_workbook(path)
    facts: dict = {"sheets": wb.sheetnames,
                   "names": sorted(wb.defined_names.keys())}
    for ws in wb.worksheets:
        cells = {c.coordinate: (repr(c.value), c.number_format)
                 for row in ws.iter_rows() for c in row if c.value is not None}
        facts[ws.title] = {
            "cells": cells,
            "merged": sorted(str(r) for r in ws.merged_cells.ranges),
            "print_titles": str(ws.print_title_rows),
            "charts": len(ws._charts),
            "freeze": str(ws.freeze_panes),
        }
    return facts


def _plot_size(path: pathlib.Path) -> tuple[int, int]:
    data = path.read_bytes()[16:24]  # PNG IHDR: width and height, big-endian
    return int.from_bytes(data[:4], "big"), int.from_bytes(data[4:], "big")


def compare(a: pathlib.Path, b: pathlib.Path) -> list[str]:
    """Differences between two output folders, one line each."""
    diffs: list[str] = []
    names_a = {p.relative_to(a) for p in a.rglob("*") if p.is_file()}
    names_b = {p.relative_to(b) for p in b.rglob("*") if p.is_file()}
    for missing in sorted(names_a ^ names_b):
        diffs.append(f"{missing}: only in {'old' if missing in names_a else 'new'}")
    for rel in sorted(names_a & names_b):
        pa, pb = a / rel, b / rel
        if rel.suffix == ".xlsx":
            fa, fb = _workbook_facts(pa), _workbook_facts(pb)
            if fa["sheets"] != fb["sheets"]:
                diffs.append(f"{rel}: sheets {fa['sheets']} != {fb['sheets']}")
            for sheet in set(fa["sheets"]) & set(fb["sheets"]):
                for key in fa[sheet]:
                    if key == "cells":
                        ca, cb = fa[sheet]["cells"], fb[sheet]["cells"]
                        bad = sorted(k for k in set(ca) | set(cb) if ca.get(k) != cb.get(k))
                        for k in bad[:5]:
                            diffs.append(f"{rel} {sheet}!{k}: {ca.get(k)} != {cb.get(k)}")
                        if len(bad) > 5:
                            diffs.append(f"{rel} {sheet}: {len(bad) - 5} more cells differ")
                    elif fa[sheet][key] != fb[sheet][key]:
                        diffs.append(f"{rel} {sheet}: {key} {fa[sheet][key]} != {fb[sheet][key]}")
        elif rel.suffix == ".png":
            if _plot_size(pa) != _plot_size(pb):
                diffs.append(f"{rel}: image size {_plot_size(pa)} != {_plot_size(pb)}")
        elif rel.suffix == ".json" or rel.name.endswith(".json"):
            ta, tb = pa.read_text(), pb.read_text()
            try:
                same = json.loads(ta.split("\n", 1)[1]) == json.loads(tb.split("\n", 1)[1])
            except (ValueError, IndexError):
                same = ta == tb
            if not same:
                diffs.append(f"{rel}: JSON differs")
        elif pa.read_bytes() != pb.read_bytes():
            diffs.append(f"{rel}: text differs")
    return diffs


def main(argv: list[str] | None = None) -> int:
    args = sys.argv[1:] if argv is None else argv
    if not args or len(args) > 2:
        print(__doc__.strip().splitlines()[2].strip(), file=sys.stderr)
        return 2
    old = pathlib.Path(args[0]).resolve()
    new = pathlib.Path(args[1]).resolve() if len(args) == 2 else pathlib.Path(
        __file__).resolve().parents[1]
    with tempfile.TemporaryDirectory() as tmp:
        out_old, out_new = pathlib.Path(tmp, "old"), pathlib.Path(tmp, "new")
        out_old.mkdir()
        out_new.mkdir()
        produce(old, out_old)
        produce(new, out_new)
        diffs = compare(out_old, out_new)
        count = sum(1 for p in out_new.rglob("*") if p.is_file())
    for line in diffs:
        print(line)
    print(f"{count} outputs compared: {len(diffs)} difference(s)")
    return 1 if diffs else 0


if __name__ == "__main__":
    raise SystemExit(main())

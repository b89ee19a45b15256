"""Render the first sheets of a plan workbook to PNG for the README (headless LibreOffice).

Usage: ``python docs/render_workbook.py PLAN.xlsx OUTDIR`` — needs soffice and pdftoppm
(Debian packages libreoffice-calc-nogui and poppler-utils). Each sheet is set to fit one page
wide in a copy, so the picture shows whole tables.
"""

from __future__ import annotations

import pathlib
import shutil
import subprocess
import sys
import tempfile

import openpyxl


def render(workbook: pathlib.Path, outdir: pathlib.Path, sheets: int = 4) -> list[pathlib.Path]:
    outdir.mkdir(parents=True, exist_ok=True)
    with tempfile.TemporaryDirectory() as tmp:
        tmpdir = pathlib.Path(tmp)
        wb = openpyxl.load_workbook(workbook)
        for ws in wb.worksheets:
            ws.page_setup.orientation = "landscape"
            ws.sheet_properties.pageSetUpPr.fitToPage = True
            ws.page_setup.fitToWidth = 1
            ws.page_setup.fitToHeight = 1
        copy = tmpdir / "plan.xlsx"
        wb.save(copy)
        subprocess.run(["soffice", f"-env:UserInstallation=file://{tmpdir}/profile", "--headless",
                        "--convert-to", "pdf", "--outdir", str(tmpdir), str(copy)],
                       check=True, capture_output=True, timeout=180)
        subprocess.run(["pdftoppm", "-r", "80", "-png", "-f", "1", "-l", str(sheets),
                        str(tmpdir / "plan.pdf"), str(tmpdir / "sheet")], check=True)
        out = []
        for png in sorted(tmpdir.glob("sheet-*.png")):
            target = outdir / png.name
            shutil.copy(png, target)
            out.append(target)
        return out


if __name__ == "__main__":
    for path in render(pathlib.Path(sys.argv[1]), pathlib.Path(sys.argv[2])):
        print(path)

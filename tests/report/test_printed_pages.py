"""The ferry demo's plan workbook printed by headless LibreOffice: pages per sheet within the
stated bounds, every word at least as tall as 8 pt text, and every page headed and footed.

Each sheet is printed on its own (a copy of the workbook with the other sheets hidden, an edit
of workbook.xml only), all copies and a calibration workbook in one LibreOffice call with a
private profile. The calibration workbook prints one line of 8 pt text at 100 %: the height
poppler's ``pdftotext -bbox`` reports for its words is the smallest a word of the plan's
sheets may have (the same fonts, the same renderer, the same run).

Needs LibreOffice (soffice) and poppler-utils (pdfinfo, pdftotext); .ci/run installs both.
"""

from __future__ import annotations

import re
import shutil
import subprocess
import zipfile
from pathlib import Path

import openpyxl
import pytest
from openpyxl.styles import Font

import similitude as sim
from similitude.report import plan_workbook

DEMO = Path(__file__).parents[2] / "demo_cases"

#: Most pages each sheet of the ferry demo may print on (A4). The run sheet is the operator's:
#: two pages for its 42 runs and two loading changes (issue 11).
PAGE_BOUNDS = {"Overview": 2, "Run sheet": 2, "Model build": 1, "Similarity": 2,
               "Facility checks": 3, "Runs": 8, "Scaling": 1, "Fluids": 1, "Test day": 4,
               "Charts": 2, "Basis": 2}
#: Smallest font a printed page may show [pt] (issue 11).
SMALLEST_FONT = 8


def _tool(name: str) -> str:
    exe = shutil.which(name)
    assert exe, f"{name} is required for the printed-page tests (.ci/run installs it)"
    return exe


def _sheet_names(path: Path) -> list[str]:
    with zipfile.ZipFile(path) as z:
        return re.findall(r'<sheet [^>]*name="([^"]+)"', z.read("xl/workbook.xml").decode())


def _only_sheet(path: Path, keep: str, out: Path) -> None:
    """A copy of the workbook in which every sheet but ``keep`` is hidden."""
    names = _sheet_names(path)

    def tag(m):
        t = re.sub(r'\sstate="[^"]*"', "", m.group(0))
        name = re.search(r'name="([^"]+)"', t).group(1)
        return t if name == keep else t.replace("<sheet ", '<sheet state="hidden" ', 1)

    with zipfile.ZipFile(path) as z, zipfile.ZipFile(out, "w", zipfile.ZIP_DEFLATED) as zo:
        for item in z.infolist():
            data = z.read(item.filename)
            if item.filename == "xl/workbook.xml":
                xml = re.sub(r"<sheet [^>]*/>", tag, data.decode())
                xml = re.sub(r'activeTab="\d+"', f'activeTab="{names.index(keep)}"', xml)
                if "activeTab" not in xml:
                    xml = xml.replace("<workbookView ",
                                      f'<workbookView activeTab="{names.index(keep)}" ', 1)
                data = xml.encode()
            zo.writestr(item, data)


def _calibration(path: Path) -> None:
    wb = openpyxl.Workbook()
    ws = wb.active
    ws["A1"] = "Calibration line of eight point text"
    ws["A1"].font = Font(name="Calibri", size=SMALLEST_FONT)
    ws.page_setup.scale = 100
    wb.save(path)


def _pages(pdf: Path) -> int:
    info = subprocess.run([_tool("pdfinfo"), str(pdf)], capture_output=True, text=True,
                          check=True).stdout
    return int(re.search(r"Pages:\s+(\d+)", info).group(1))


def _words(pdf: Path) -> list[tuple[int, float, str]]:
    """(page, height [pt], text) of every word of a PDF."""
    xml = subprocess.run([_tool("pdftotext"), "-bbox", str(pdf), "-"], capture_output=True,
                         text=True, check=True).stdout
    out = []
    for k, page in enumerate(xml.split("<page ")[1:], start=1):
        for y0, y1, text in re.findall(r'<word [^>]*yMin="([\d.]+)"[^>]*yMax="([\d.]+)">'
                                       r"([^<]*)</word>", page):
            out.append((k, float(y1) - float(y0), text))
    return out


@pytest.fixture(scope="module")
def printed(tmp_path_factory):
    tmp = tmp_path_factory.mktemp("printed")
    plan = sim.plan(sim.load_case(DEMO / "ferry_resistance.toml"))
    book = plan_workbook.write_plan(plan, tmp / "ferry.xlsx")
    copies = {}
    for k, name in enumerate(_sheet_names(book)):
        copies[name] = tmp / f"sheet{k:02d}.xlsx"
        _only_sheet(book, name, copies[name])
    _calibration(tmp / "calibration.xlsx")
    profile = tmp / "lo_profile"
    out = tmp / "pdf"
    subprocess.run([_tool("soffice"), f"-env:UserInstallation=file://{profile}", "--headless",
                    "--norestore", "--convert-to", "pdf", "--outdir", str(out),
                    str(tmp / "calibration.xlsx"), *map(str, copies.values())],
                   capture_output=True, text=True, timeout=600)
    pdfs = {name: out / (p.stem + ".pdf") for name, p in copies.items()}
    missing = [n for n, p in pdfs.items() if not p.is_file()]
    assert not missing, f"LibreOffice did not print {missing}"
    return plan, pdfs, out / "calibration.pdf"


@pytest.mark.parametrize("sheet", list(PAGE_BOUNDS))
def test_each_sheet_prints_within_its_page_bound(printed, sheet):
    _, pdfs, _ = printed
    assert _pages(pdfs[sheet]) <= PAGE_BOUNDS[sheet]


def test_the_run_sheet_prints_on_at_most_two_pages(printed):
    _, pdfs, _ = printed
    assert _pages(pdfs["Run sheet"]) <= 2


def test_every_printed_word_is_at_least_as_tall_as_eight_point_text(printed):
    _, pdfs, calibration = printed
    smallest = min(h for _, h, _ in _words(calibration))
    for sheet, pdf in pdfs.items():
        heights = [h for _, h, _ in _words(pdf)]
        assert heights, sheet
        assert min(heights) >= smallest * 0.99, sheet


def test_every_page_names_case_sheet_and_page_and_the_program(printed):
    plan, pdfs, _ = printed
    for sheet, pdf in pdfs.items():
        n = _pages(pdf)
        words = _words(pdf)
        for page in range(1, n + 1):
            text = " ".join(w for p, _, w in words if p == page)
            assert plan.case.name in text, (sheet, page)
            assert sheet in text, (sheet, page)
            assert f"page {page} of {n}" in text, (sheet, page)
            assert "similitude" in text and "printed" in text, (sheet, page)

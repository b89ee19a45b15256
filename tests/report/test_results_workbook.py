"""The results workbook of an extrapolation: the Prohaska fit report, each step, cautions and a
write that is atomic (similitude.report.results_workbook)."""

from __future__ import annotations

import re
import zipfile

import numpy as np
import openpyxl
import pytest
from scipy.stats import linregress

from fluids_props.water import fresh_water_si
from similitude.prediction.extrapolation import ShipParticulars, extrapolate
from similitude.prediction.runs import ResistanceRuns
from similitude.prediction.uncertainty import MeasurementUncertainty, propagate
from similitude.report import results_workbook

G = 9.80665  # standard gravity, ISO 80000-3
SHIP = ShipParticulars(length=100.0, wetted_surface=2500.0, scale=25.0, transverse_area=250.0)


def _noisy_runs(k=0.17, noise=0.004, seed=7):
    """An invented hull with C_TM = (1+k) C_F57 + 0.04 Fn^4 (Prohaska's model), with noise."""
    fn = np.linspace(0.08, 0.30, 16)
    lm, sm = SHIP.model_length, SHIP.model_wetted_surface
    v = fn * np.sqrt(G * lm)
    s = fresh_water_si(np.full(fn.size, 288.15))
    cf = 0.075 / (np.log10(v * lm / s.kinematic_viscosity_si) - 2) ** 2  # ITTC-1957 line
    r = ((1 + k) * cf + 0.04 * fn**4) * 0.5 * s.density_si * sm * v**2
    r = r * (1 + np.random.default_rng(seed).normal(0, noise, fn.size))
    return ResistanceRuns(tuple(f"R{i}" for i in range(fn.size)), v, r,
                          np.full(fn.size, 288.15), source="runs_SYNTHETIC.csv")


@pytest.fixture(scope="module")
def result():
    return extrapolate(_noisy_runs(), SHIP, froude_range=(0.1, 0.2))


def _texts(ws) -> str:
    return " ".join(str(c.value) for row in ws.iter_rows() for c in row if c.value is not None)


def test_prohaska_fit_report_matches_an_independent_least_squares_line(result):
    # Oracle: scipy.stats.linregress on Prohaska's coordinates (C_TM/C_FM against Fn^4/C_FM,
    # ITTC 7.5-02-03-01.4 Rev 04 2017) of the runs in the stated Froude range.
    pro = result.prohaska_frame()
    inside = pro["used in fit"].to_numpy()
    fn = pro["Froude number [-]"].to_numpy()
    np.testing.assert_array_equal(inside, (fn >= 0.1) & (fn <= 0.2))
    x, y = pro["Fn^4/C_FM [-]"].to_numpy()[inside], pro["C_TM/C_FM [-]"].to_numpy()[inside]
    ref = linregress(x, y)
    fit = result.form_factor_fit
    assert fit.form_factor == pytest.approx(ref.intercept - 1.0, rel=1e-9)
    assert fit.slope == pytest.approx(ref.slope, rel=1e-9)
    assert fit.r_squared == pytest.approx(ref.rvalue**2, rel=1e-9)
    np.testing.assert_allclose(fit.residuals, y - (ref.intercept + ref.slope * x),
                               rtol=0, atol=1e-12)
    summary = result.fit_summary()
    assert summary["Froude range [-]"] == "0.1 to 0.2"
    assert summary["points used"] == int(inside.sum())
    assert summary["largest |residual| [-]"] == pytest.approx(
        np.max(np.abs(y - ref.intercept - ref.slope * x)), rel=1e-9)


def test_form_factor_sheet_lists_the_fit_and_every_residual(result, tmp_path):
    path = results_workbook.write_results(tmp_path / "r.xlsx", result)
    ws = openpyxl.load_workbook(path)["Form factor"]
    text = _texts(ws)
    for label in ("R^2 [-]", "Froude range [-]", "points used", "largest |residual| [-]",
                  "residual [-]", "used in fit"):
        assert label in text
    header = next(r for r in ws.iter_rows(values_only=True) if "residual [-]" in r)
    col = header.index("residual [-]")
    rows = [r for r in ws.iter_rows(values_only=True)
            if isinstance(r[0], str) and r[0].startswith("R") and r[0][1:].isdigit()]
    np.testing.assert_allclose([r[col] for r in rows],
                               result.prohaska_frame()["residual [-]"], rtol=1e-12)
    assert len(ws._charts) == 1  # the Prohaska plot


def test_each_step_has_its_sheet_and_the_readme_carries_the_cautions(result, tmp_path):
    u = propagate(result, MeasurementUncertainty.from_quantities("2 mm/s", "0.5 %", "0.1 K"))
    wb = openpyxl.load_workbook(results_workbook.write_results(tmp_path / "r.xlsx", result, u))
    assert wb.sheetnames[:8] == ["Read me", "Inputs", "Tank corrections", "Form factor",
                                 "Model scale", "Full scale", "Results", "Uncertainty"]
    readme = _texts(wb["Read me"])
    assert "ESTIMATES" in readme and "licensed professional practice" in readme
    assert "SYNTHETIC" in readme  # the source file is labelled synthetic
    assert "first-order" in _texts(wb["Uncertainty"]).lower()
    headers = [c.value for c in wb["Full scale"][1]]
    for name in ("roughness allowance dC_F [-]", "correlation allowance C_A [-]",
                 "air resistance C_AAS [-]", "C_TS [-]", "P_E [kW]"):
        assert name in headers


def test_interrupted_write_leaves_no_partial_file(result, tmp_path, monkeypatch):
    def broken_save(self, filename):
        with open(filename, "wb") as fh:
            fh.write(b"PK\x03\x04 half a workbook")
        raise KeyboardInterrupt

    monkeypatch.setattr(openpyxl.Workbook, "save", broken_save)
    with pytest.raises(KeyboardInterrupt):
        results_workbook.write_results(tmp_path / "r.xlsx", result)
    assert list(tmp_path.iterdir()) == []  # neither the target nor the temporary file


def test_interrupted_overwrite_keeps_the_old_file(result, tmp_path, monkeypatch):
    old = tmp_path / "r.xlsx"
    old.write_bytes(b"the old results")

    def broken_save(self, filename):
        raise OSError("disk full")

    monkeypatch.setattr(openpyxl.Workbook, "save", broken_save)
    with pytest.raises(OSError, match="disk full"):
        results_workbook.write_results(old, result, overwrite=True)
    assert old.read_bytes() == b"the old results"
    assert list(tmp_path.iterdir()) == [old]


# -- what a reader of the printed or opened workbook sees --------------------------------------
@pytest.fixture(scope="module")
def written(result, tmp_path_factory):
    u = propagate(result, MeasurementUncertainty.from_quantities("2 mm/s", "0.5 %", "0.1 K"))
    path = results_workbook.write_results(tmp_path_factory.mktemp("rw") / "r.xlsx", result, u)
    return path, openpyxl.load_workbook(path)


def _chart_series(path) -> list[str]:
    with zipfile.ZipFile(path) as z:
        xml = "".join(z.read(n).decode() for n in z.namelist()
                      if n.startswith("xl/charts/chart"))
    return re.findall(r"<ser>.*?</ser>", xml, re.S)


def _title(series: str) -> str:
    return re.search(r"<tx>(?:<strRef><f>[^<]*</f>)?.*?<v>([^<]*)</v>", series, re.S).group(1)


def test_measured_series_are_drawn_as_filled_markers(written):
    # a series without a line shows only its markers, and a marker shows only with a fill
    path, _ = written
    measured = [s for s in _chart_series(path) if _title(s) in ("measured",
                                                                 "C_TM at 15 degC [-]")]
    assert len(measured) == 2
    for s in measured:
        assert re.search(r"<spPr><a:ln><a:noFill", s)  # no line through the points
        marker = re.search(r"<marker>.*?</marker>", s, re.S).group(0)
        assert '<symbol val="circle"' in marker and "<a:solidFill>" in marker


def test_the_prohaska_line_spans_only_the_fitted_froude_range(written, result):
    # the fitted line is valid over the runs it was fitted to (ITTC 7.5-02-03-01.4 Rev 04,
    # 2017, Prohaska's method): drawn from the smallest to the largest Fn^4/C_FM used
    path, wb = written
    (fit,) = [s for s in _chart_series(path) if _title(s).startswith("fit")]
    ref = re.search(r"<xVal><numRef><f>'([^']+)'!\$(\w)\$(\d+):\$\w\$(\d+)</f>", fit)
    sheet, col, first, last = ref.group(1), ref.group(2), int(ref.group(3)), int(ref.group(4))
    xs = [wb[sheet][f"{col}{r}"].value for r in range(first, last + 1)]
    pro = result.prohaska_frame()
    used = pro[pro["used in fit"]]["Fn^4/C_FM [-]"]
    assert min(xs) == pytest.approx(used.min(), rel=1e-12)
    assert max(xs) == pytest.approx(used.max(), rel=1e-12)
    assert max(xs) < pro["Fn^4/C_FM [-]"].max()  # the faster runs lie beyond the line


def test_every_sheet_prints_with_paper_titles_and_page_header(written):
    # codes &A sheet, &P page, &N pages, &D date (ECMA-376 Part 1, 18.3.1.46; from memory)
    _, wb = written
    for ws in wb.worksheets:
        assert ws.page_setup.paperSize == 9, ws.title  # A4 (ECMA-376 18.3.1.63)
        assert ws.oddHeader.left.text.endswith(SHIP.name), ws.title
        assert ws.oddHeader.right.text == "page &P of &N"
        assert ws.oddFooter.left.text.startswith("similitude ")
        if ws.title != "Read me":
            assert ws.print_title_rows, ws.title  # the table header on every page


def _column(ws, header: str):
    for row in ws.iter_rows():
        for c in row:
            if c.value == header:
                return [ws.cell(row=r, column=c.column) for r in range(c.row + 1, ws.max_row + 1)
                        if ws.cell(row=r, column=c.column).value is not None]
    raise AssertionError(f"{header!r} not in {ws.title}")


@pytest.mark.parametrize("header, fmt", [("ship speed [kn]", "0.00"), ("C_TS [-]", "0.000000"),
                                         ("P_E [kW]", None), ("run", None)])
def test_each_results_column_has_one_number_format(written, header, fmt):
    _, wb = written
    cells = _column(wb["Results"], header)
    formats = {c.number_format for c in cells}
    assert len(formats) == 1
    if fmt is not None:
        assert formats == {fmt}


def test_the_form_factor_prints_with_four_significant_digits(written, result):
    _, wb = written
    ws = wb["Form factor"]
    (row,) = [r for r in range(1, ws.max_row + 1) if ws.cell(row=r, column=1).value ==
              "form factor k [-]"]
    assert ws.cell(row=row, column=2).number_format == "0.0000"
    assert ws.cell(row=row, column=2).value == pytest.approx(result.form_factor)


def test_charts_sit_below_their_tables_in_column_a(written):
    # beside a wide table a chart would widen the printed sheet and print small
    _, wb = written
    charts = [(ws.title, c) for ws in wb.worksheets for c in ws._charts]
    assert len(charts) == 3  # Prohaska plot, coefficients, effective power
    for title, chart in charts:
        assert chart.anchor._from.col == 0, title
        filled = max(c.row for row in wb[title].iter_rows() for c in row
                     if c.value is not None)
        assert chart.anchor._from.row + 1 > filled, title  # 0-based anchor row

"""The terminal summary of a prediction (``similitude extrapolate``): a few lines for a person.

The resistance extrapolation (method, form factor, P_E per speed), the open-water scaling, and
with a self-propulsion test the propulsion factors, the speed-power-rpm table, the
contract-speed figures and which uncertainty method gave which figure.
"""

from __future__ import annotations

from similitude.cautions import caution_line
from similitude.prediction.open_water import OpenWaterScaling
from similitude.prediction.predict import Prediction
from similitude.units import format_scale


def summary(prediction: Prediction) -> str:
    """The summary of a prediction, one line per figure a reader looks for first."""
    e, u = prediction.extrapolation, prediction.uncertainty
    lines = [f"{e.ship.name}: {len(e.runs)} runs from {e.runs.source or 'input'}, scale "
             f"{format_scale(e.ship.scale)}"]
    lines.append(f"  method       {e.options.revision_note}")
    fs = e.fit_summary()
    text = f"k = {e.form_factor:.4f} ({fs['source']}"
    if e.form_factor_fit is not None:
        text += (f", {fs['points used']} runs in Fn {fs['Froude range [-]']}, "
                 f"R^2 = {fs['R^2 [-]']:.4f}")
    lines.append(f"  form factor  {text})")
    lines.append("  ship speed [kn]   C_TS [-]     R_TS [kN]    P_E [kW]"
                 + ("    u(P_E) [kW]" if u is not None else ""))
    for i, row in e.results.iterrows():
        line = (f"  {row['ship speed [kn]']:15.2f}   {row['C_TS [-]']:.5f}   "
                f"{row['R_TS [kN]']:10.1f}   {row['P_E [kW]']:9.1f}")
        if u is not None:
            line += f"   {u.table['u(P_E) combined [kW]'].iloc[i]:10.1f}"
        lines.append(line)
    if u is not None:
        lines.append(f"  uncertainty  {u.method}")
    for note in (*e.notes[1:], *prediction.plan_notes):  # notes[0]: the method line above
        lines.append(f"  note: {note}")
    if prediction.open_water is not None:
        lines.append(_open_water_summary(prediction.open_water))
    if prediction.power is not None:
        lines.extend(_propulsion_lines(prediction))
    lines.append(caution_line())
    return "\n".join(lines)


def _open_water_summary(ow: OpenWaterScaling) -> str:
    t = ow.table
    best = t["eta_0 ship [-]"].idxmax()
    j_best = t["advance ratio J [-]"][best]
    lines = [f"  open water   {len(t)} runs; ITTC-1978 blade-drag correction dC_D = "
             f"{t['dC_D [-]'].mean():.5f}; best eta_0 ship {t['eta_0 ship [-]'][best]:.3f} "
             f"(model {t['eta_0 model [-]'][best]:.3f}) at J = {j_best:.2f}"]
    lines.extend(f"  note: {n}" for n in ow.notes[1:])
    return "\n".join(lines)


def _range(values) -> str:
    lo, hi = float(values.min()), float(values.max())
    return f"{lo:.3f}" if abs(hi - lo) < 5e-4 else f"{lo:.3f} to {hi:.3f}"


def _propulsion_lines(p: Prediction) -> list[str]:
    sp, pw, pu = p.self_propulsion, p.power, p.propulsion_uncertainty
    pts = sp.points
    w_col = next(c for c in pts.columns if c.startswith("wake fraction"))
    methods = sorted(set(pts["method"]))
    lines = [f"  self-prop.   {len(sp.runs)} runs at {len(pts)} speeds ({', '.join(methods)}), "
             f"{sp.options.identity} identity: {w_col.split(' [')[0].split()[-1]} "
             f"{_range(pts[w_col])}, t {_range(pts['thrust deduction t [-]'])}, eta_R "
             f"{_range(pts['relative rotative efficiency eta_R [-]'])}, eta_D "
             f"{_range(pts['propulsive efficiency eta_D [-]'])}"]
    header = "  ship speed [kn]   P_E [kW]    P_D [kW]    P_B [kW]   n [rpm]"
    if pu is not None:
        header += "   u(P_D) [kW]   u(n) [rpm]"
    lines.append(header)
    t = pw.speed_power
    for i, row in t.iterrows():
        line = (f"  {row['ship speed [kn]']:15.2f} {row['P_E [kW]']:10.1f} "
                f"{row['P_D [kW]']:11.1f} {row['P_B [kW]']:11.1f} "
                f"{row['rate of revolution [rpm]']:9.2f}")
        if pu is not None:
            line += (f" {pu.table['u(P_DS) first order [kW]'].iloc[i]:13.1f} "
                     f"{pu.table['u(n_S) first order [rpm]'].iloc[i]:12.3f}")
        lines.append(line)
    if pw.contract is not None:
        c = pw.contract
        lines.append(f"  contract     {c['ship speed [kn]']:.2f} kn: P_D {c['P_D [kW]']:.0f} kW, "
                     f"P_B {c['P_B [kW]']:.0f} kW, n {c['rate of revolution [rpm]']:.1f} rpm, "
                     f"P_E {c['P_E [kW]']:.0f} kW (interpolated log-log)")
    if pu is not None:
        lines.append("  uncertainty  u(P_D), u(n) by first order"
                     + (f"; Monte Carlo ({pu.samples} samples, seed {pu.seed}) agrees within "
                        f"{_agreement(pu):.1f} %" if pu.samples else ""))
    lines.extend(f"  note: {n}" for n in (*sp.notes, *pw.notes))
    return lines


def _agreement(pu) -> float:
    t = pu.table
    ratios = [t[f"u({x}) first order / Monte Carlo [-]"] for x in ("P_DS", "n_S")]
    return 100.0 * max(float(abs(r - 1.0).max()) for r in ratios)


__all__ = ["summary"]

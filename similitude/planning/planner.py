"""The test plan: scale, model, fluid state, speeds, groups, conflicts, checks and run matrix.

``plan(case)`` runs the solver (:mod:`similitude.planning.solver`), the facility checks
(:mod:`similitude.planning.checks`) and the conflict analysis
(:mod:`similitude.planning.conflicts`), and returns a
frozen :class:`Plan` with tables (pandas DataFrames, units in the column headers) for the
notebook, the workbook writer and the command line.

Example
-------
>>> import similitude as sim                                  # doctest: +SKIP
>>> p = sim.plan(case)                                        # doctest: +SKIP
>>> p.scale, p.model_length, p.speeds                         # doctest: +SKIP

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines 7.5-02-02-01, "Resistance Test", Rev 03,
       2011 (what a resistance-test plan states: model, scale, water properties, turbulence
       stimulation, tank particulars).
"""

from __future__ import annotations

import html
from dataclasses import asdict, dataclass, replace
from typing import TYPE_CHECKING

import numpy as np
import pandas as pd

from fluids_props import FluidState
from similitude.cautions import plan_caution
from similitude.correlations.friction import turbulence_stimulation_advice
from similitude.dimensional import scaling
from similitude.dimensional.numbers import cavitation_number
from similitude.errors import InputError
from similitude.labels import human
from similitude.plain_data import plain
from similitude.planning.candidates import (
    CAVITATION_ON_ADVANCE,
    Candidates,
    Problem,
    build_problem,
    candidate_at,
    group_label,
    group_value,
    model_groups,
    model_side,
    pressure_labels,
)
from similitude.planning.case import MATCHABLE_GROUPS, Case, dimension_power
from similitude.planning.checks import facility_checks
from similitude.planning.conflicts import blockage_notes, find_conflicts
from similitude.planning.findings import (
    STATUS_COLOURS,
    Check,
    Conflict,
    checks_html,
    checks_summary,
    needs_attention,
    status_counts,
)
from similitude.planning.matrix import build_matrix, runs_needed, runs_text
from similitude.planning.model_build import ModelBuild, model_build
from similitude.planning.solution import Solution
from similitude.planning.solver import DEFAULT_CANDIDATES, solve
from similitude.units import format_scale

if TYPE_CHECKING:  # the annotation only; the module loads with a self-propulsion plan
    from similitude.planning.self_propulsion import SelfPropulsionPlan


@dataclass(frozen=True)
class Plan:
    """A solved test plan: the result of :func:`plan` (SI floats; DataFrames with units in
    their column headers).

    Attributes
    ----------
    case : Case
        The case as given (prototype, facility, request, run-matrix specification).
    solution : Solution
        The solver's answer: scale, velocity and rotation ratios, fluids, the pressure the
        facility is set to, how the exact groups were met, and the limiting scale before
        rounding (``solution.limiting_scale``) or the groups relaxed (``solution.relaxed``).
    scale : float
        lambda = L_p / L_m [-] (written "1:lambda").
    model_length : float
        Model reference length L_p / lambda [m].
    model_dimensions : dict of str to float
        Model lengths [m], areas [m^2] and volumes [m^3] by the keys of
        ``Prototype.dimensions`` (scaled by lambda, lambda^2, lambda^3), plus ``"length"``.
    prototype_fluid, model_fluid : FluidState
        The fluids at their states (scalars): density, viscosities and, where they apply,
        vapour pressure, surface tension and speed of sound.
    speeds : pandas.DataFrame
        One row per prototype operating speed: ``prototype speed [m/s]``, the same in the
        unit the case wrote it (``Case.speed_header``, e.g. ``prototype speed [kn]``; absent
        when that is m/s), ``model speed [m/s]``, and for a propeller the prototype and model
        rotation rates [1/s].
    groups : pandas.DataFrame
        One row per (group, prototype speed): ``group``, ``symbol``, ``key``, ``prototype
        speed [m/s]``, ``prototype value``, ``model value``, ``ratio`` (prototype/model),
        ``matched`` (within 1e-6), ``requested`` ("exact" or "report").
    conflicts : tuple of Conflict
        The groups the model does not match, at the design (highest) speed, each with its
        prototype and model values, ratio and consequence in the trade's terms.
    checks : tuple of Check
        Facility and regime checks of the chosen model: value, limit, status (one of
        :data:`similitude.planning.findings.STATUSES`: "ok", "at limit", "warning", "fail",
        "not checked" with the input that would enable it, "info"), margin and source
        (``findings.checks_table`` gives them as a DataFrame).
    scale_factors : pandas.DataFrame
        Factor prototype/model of the usual quantities (force, power, time, ...):
        ``quantity``, ``dimension``, ``factor (prototype/model)``, ``expression``, ``unit``,
        ``example``.
    matrix : pandas.DataFrame
        The run matrix, one row per run (:func:`similitude.planning.matrix.build_matrix`):
        model and prototype values, timing and facility time, units in the headers;
        ``matrix.attrs["notes"]`` lists the defaults assumed.
    notes : tuple of str
        The planner's notes: how the fluid, temperature and scale were chosen, relaxed groups,
        turbulence stimulation, blockage corrections, failed checks.
    binding_constraint : str
        What fixed the scale, in words (e.g. the blockage limit, and the rounding to a
        convenient scale).
    propulsion : SelfPropulsionPlan or None
        For a self-propulsion test: per speed the skin-friction correction force F_D and the
        expected propeller rotation rate, thrust and torque, with the form of F_D, the
        propulsion factors used and their sources (the run matrix carries the same columns
        per run); None for other tests.
    """

    case: Case
    solution: Solution
    scale: float
    model_length: float
    model_dimensions: dict
    prototype_fluid: FluidState
    model_fluid: FluidState
    speeds: object
    groups: object
    conflicts: tuple[Conflict, ...]
    checks: tuple[Check, ...]
    scale_factors: object
    matrix: object
    notes: tuple[str, ...] = ()
    binding_constraint: str = ""
    propulsion: SelfPropulsionPlan | None = None

    @property
    def requested_not_matched(self) -> tuple[dict, ...]:
        """The groups requested exact that the plan does not match (relaxed with
        ``matching.relax = true``): ``group``, ``ratio prototype/model`` at the design speed,
        ``reason`` (why it could not be met), ``scale rounding`` (what was done with the
        scale). Empty when every requested group is matched."""
        out = []
        for group, reason in self.solution.relaxed:
            cf = next((c for c in self.conflicts if c.group == group), None)
            out.append({"group": group,
                        "ratio prototype/model": cf.ratio if cf is not None else 1.0,
                        "reason": reason,
                        "scale rounding": self.solution.scale_rounding})
        return tuple(out)

    def requested_not_matched_lines(self) -> list[str]:
        """The "requested but not matched" lines every output puts first (empty when none)."""
        lines = []
        for d in self.requested_not_matched:
            lines.append(f"REQUESTED BUT NOT MATCHED: {d['group']} was requested exact; "
                         f"prototype/model = {d['ratio prototype/model']:.4g} at the design "
                         "speed; minimised instead because matching.relax = true (reason in "
                         "the notes)")
        if lines:
            rounding = self.solution.scale_rounding or "not rounded"
            lines.append(f"Scale {format_scale(self.scale, 6)}: {rounding}.")
        return lines

    @property
    def model_pressures(self) -> dict[str, float]:
        """The pressures the facility is set to, each labelled [Pa]: the air pressure above
        the water of a depressurised tank or basin and the static pressure at the shaft
        centre (a propeller) or model centre below it; the static pressure at the shaft
        centre or model in a tunnel; the test-section static pressure of a gas tunnel. Empty
        when the plan sets no pressure (an atmospheric tank)."""
        sol, case = self.solution, self.case
        if sol.model_pressure is None:
            return {}
        surface, at_model = pressure_labels(case, self.model_fluid.vapour_pressure_si is None)
        if case.facility.free_surface:
            out = {surface: float(sol.static_pressure)}
            if case.prototype.kind == "propeller" or case.prototype.immersion is not None:
                out[at_model] = float(sol.model_pressure)
            return out
        return {at_model: float(sol.model_pressure)}

    def model_pressure_text(self) -> str:
        """:attr:`model_pressures` in words, e.g. "air pressure above the water 4.5 kPa;
        static pressure at the shaft centre 9.1 kPa" ("" when none)."""
        return "; ".join(f"{k} {v / 1e3:.4g} kPa" for k, v in self.model_pressures.items())

    @property
    def limiting_scale(self) -> float:
        """The scale at the binding facility limit before rounding to a convenient one [-]
        (``scale`` itself when it was not rounded or was fixed by the case)."""
        lam0 = self.solution.limiting_scale
        return self.scale if lam0 is None else lam0

    @property
    def model_build(self) -> ModelBuild:
        """What the model shop builds: mass per loading in the test water, draughts, centres,
        radii of gyration and natural periods scaled, turbulence stimulators, the model
        propeller (:func:`similitude.planning.model_build.model_build`)."""
        return model_build(self.case, self.scale, self.model_fluid, self.prototype_fluid)

    # -- outputs -----------------------------------------------------------------------------
    def to_excel(self, path, overwrite: bool = False, paper: str = "A4"):
        """Write the plan workbook (``similitude.report.plan_workbook.write_plan``); returns the
        Path.

        Refuses to overwrite an existing file unless ``overwrite=True``; ``paper`` is the
        paper size the sheets print on (``"A4"`` or ``"letter"``).
        """
        # A notebook convenience only: the report stage sits above planning, so it is imported
        # on call (and the commands call the writer directly).
        from similitude.report.plan_workbook import write_plan

        return write_plan(self, path, overwrite=overwrite, paper=paper)

    def plot(self, kind: str = "groups", **kwargs):
        """Plot the plan (``similitude.report.plots.plot_plan``; matplotlib needed)."""
        # A notebook convenience, like to_excel: report sits above planning; loads matplotlib.
        from similitude.report.plots import plot_plan

        return plot_plan(self, kind=kind, **kwargs)

    def to_dict(self) -> dict:
        """The plan as JSON-ready plain data (SI values, unit-bearing keys)."""
        def frame(df):
            if df is None:
                return []
            return [{str(k): plain(v) for k, v in row.items()}
                    for row in df.to_dict(orient="records")]

        def check(c: Check) -> dict:
            d = {k: plain(v) for k, v in asdict(c).items()}
            d["margin"] = plain(c.margin)
            return d

        def conflict(c: Conflict) -> dict:
            d = {k: plain(v) for k, v in asdict(c).items()}
            d["ratio"] = plain(c.ratio)
            return d

        sol = self.solution
        return {
            "case": self.case.name,
            "prototype": self.case.prototype.name,
            "facility": self.case.facility.name,
            "scale": self.scale,
            "scale_text": format_scale(self.scale),
            "limiting_scale": plain(self.limiting_scale),
            "model_length [m]": self.model_length,
            "model_dimensions": {k: plain(v) for k, v in self.model_dimensions.items()},
            "prototype_fluid": _state_dict(self.prototype_fluid),
            "model_fluid": _state_dict(self.model_fluid),
            "velocity_ratio": sol.velocity_ratio,
            "rotation_ratio": plain(sol.rotation_ratio),
            "model_pressure [Pa]": plain(sol.model_pressure),
            "model_pressures [Pa]": {k: plain(v) for k, v in self.model_pressures.items()},
            "exact": list(sol.exact),
            "requested_exact": list(self.case.request.exact),
            "requested_not_matched": [{k: plain(v) for k, v in d.items()}
                                      for d in self.requested_not_matched],
            "requested_not_matched_lines": self.requested_not_matched_lines(),
            "objective": sol.objective,
            "binding_constraint": self.binding_constraint,
            "candidates_searched": sol.candidates_searched,
            "speeds": frame(self.speeds),
            "groups": frame(self.groups),
            "conflicts": [conflict(c) for c in self.conflicts],
            "checks": [check(c) for c in self.checks],
            "checks_summary": checks_summary(self.checks),
            "check_status_counts": status_counts(self.checks),
            "scale_factors": frame(self.scale_factors),
            "matrix": frame(self.matrix),
            "conditions": len(self.matrix),
            "runs_needed": runs_needed(self.matrix),
            "notes": list(self.notes),
            "self_propulsion": None if self.propulsion is None else {
                "friction_correction": self.propulsion.friction_correction,
                "form_factor": self.propulsion.form_factor,
                "form_factor_source": self.propulsion.form_factor_source,
                "propulsion_factors": self.propulsion.factors_source,
                "speeds": frame(self.propulsion.speeds),
            },
            "caution": plan_caution(self.case.facility.kind),
        }

    # -- display -----------------------------------------------------------------------------
    def _headline(self) -> list[str]:
        c = self.case
        mf = self.model_fluid
        t = float(mf.temperature_si)
        p = self.solution.static_pressure
        if p is None:
            p = float(mf.pressure_si)
        tp = float(self.prototype_fluid.temperature_si)
        return [
            f"Plan '{c.name}': {c.prototype.name} ({human(c.prototype.kind)}, L = "
            f"{c.prototype.length:.4g} m) in {c.facility.name} ({human(c.facility.kind)})",
            f"  scale {format_scale(self.scale)}; model length {self.model_length:.4g} m"
            + (f" (limiting scale {format_scale(self.limiting_scale, 6)})"
               if self.limiting_scale != self.scale else ""),
            f"  model fluid {human(mf.fluid)} at {t - 273.15:.2f} degC, {p / 1000:.6g} kPa "
            f"(nu = {float(mf.kinematic_viscosity_si):.4g} m^2/s); prototype "
            f"{self.prototype_fluid.fluid} at {tp - 273.15:.2f} degC",
            *([f"  pressures: {self.model_pressure_text()}"] if self.model_pressures else []),
            f"  exact: {', '.join(self.solution.exact)}; binding: {self.binding_constraint}",
        ]

    def __repr__(self) -> str:
        lines = self._headline()
        lines[1:1] = [f"  {t}" for t in self.requested_not_matched_lines()]
        lines.append("  speeds:")
        for row in self.speeds.to_dict(orient="records"):
            lines.append("    " + ", ".join(f"{k} {_fmt(v)}" for k, v in row.items()))
        if self.conflicts:
            lines.append("  not matched:")
            for cf in self.conflicts:
                lines.append(f"    {cf.group}: prototype/model = {cf.ratio:.4g}")
        lines.append(f"  checks: {checks_summary(self.checks)}")
        for ch in needs_attention(self.checks):
            if ch.status == "not checked":
                lines.append(f"    not checked: {ch.name} ({ch.advice})")
            else:
                lines.append(f"    {ch.status}: {ch.name} {_fmt(ch.value)} "
                             f"(limit {_fmt(ch.limit)} {ch.unit})".rstrip())
        lines.append(f"  runs: {runs_text(self.matrix)}")
        lines.append(f"  {plan_caution(self.case.facility.kind)}")
        return "\n".join(lines)

    def _repr_html_(self) -> str:
        head = "<br>".join(html.escape(s.strip()) for s in self._headline())
        warn = "".join(f'<p style="background-color:#{STATUS_COLOURS["fail"]};'
                       f'color:#000000;font-weight:bold">{html.escape(t)}</p>'
                       for t in self.requested_not_matched_lines())
        conf = "".join(f"<li><b>{html.escape(c.group)}</b>: {html.escape(c.consequence)}</li>"
                       for c in self.conflicts)
        notes = "".join(f"<li>{html.escape(n)}</li>" for n in self.notes)
        return (
            f"<div>{warn}<p>{head}</p><h4>Speeds</h4>{self.speeds.to_html(index=False)}"
            f"<h4>Groups (design speed)</h4>{self._design_groups().to_html(index=False)}"
            f"<h4>Conflicts</h4><ul>{conf}</ul>"
            f"<h4>Checks: {html.escape(checks_summary(self.checks))}</h4>"
            f"{checks_html(self.checks)}<h4>Notes</h4><ul>{notes}</ul>"
            f"<p><i>{html.escape(plan_caution(self.case.facility.kind))}</i></p></div>"
        )

    def _design_groups(self):
        vmax = max(self.case.prototype.speeds)
        g = self.groups
        return g[np.isclose(g["prototype speed [m/s]"], vmax)]


def _fmt(v) -> str:
    if isinstance(v, (float, np.floating)):
        return f"{float(v):.4g}"
    return str(v)


def _state_dict(st: FluidState) -> dict:
    d = {"fluid": st.fluid}
    d.update({k: plain(np.asarray(v, dtype=float).item()) for k, v in st.as_dict().items()})
    return d


def _relevant_groups(prob: Problem) -> tuple[str, ...]:
    case = prob.case
    st = prob.proto.state
    keys = set(case.request.exact) | set(case.request.report) | {"reynolds"}
    # Gravity matters with a free surface or in a liquid (hydrostatic pressure gradient, e.g.
    # over a propeller disc); for a body in a gas the Froude number is left out unless asked.
    if (case.facility.free_surface or st.surface_tension_si is not None
            or case.prototype.kind in ("surface_ship", "offshore_structure")):
        keys.add("froude")
    if st.speed_of_sound_si is not None:
        keys.add("mach")
    if st.surface_tension_si is not None and case.facility.free_surface:
        keys.add("weber")
    if st.vapour_pressure_si is not None and (prob.propeller or
                                               case.prototype.immersion is not None):
        keys.add("cavitation")
    if case.prototype.rotation_rates:
        keys.add("advance_ratio")
    if case.prototype.water_depth is not None and case.facility.free_surface:
        keys.add("depth_froude")
    return tuple(k for k in MATCHABLE_GROUPS if k in keys)


def _groups_table(prob: Problem, c: Candidates, keys, requested_exact):
    rows = []
    exact = set(requested_exact)
    speeds = np.asarray(prob.case.prototype.speeds, dtype=float)
    pvals = {k: np.asarray(group_value(k, prob.proto, prob.propeller), dtype=float)
             for k in keys}
    for k in keys:
        name, symbol = group_label(k, prob.propeller)
        for i, vp in enumerate(speeds):
            gp = float(np.ravel(pvals[k])[i]) if np.ndim(pvals[k]) else float(pvals[k])
            gm = float(model_groups(prob, c, i, (k,))[k][0])
            rows.append(_group_row(name, symbol, k, vp, gp, gm,
                                   "exact" if k in exact else "report"))
    if prob.propeller and "cavitation" in keys:
        rows.extend(_advance_cavitation_rows(prob, c))
    return pd.DataFrame([r for r in rows if r is not None],
                        columns=["group", "symbol", "key", "prototype speed [m/s]",
                                 "prototype value", "model value", "ratio", "matched",
                                 "requested"])


def _group_row(name, symbol, key, vp, gp, gm, requested):
    if not (np.isfinite(gp) and np.isfinite(gm)):
        return None
    ratio = gp / gm if gm else float("inf")
    return {"group": name, "symbol": symbol, "key": key, "prototype speed [m/s]": vp,
            "prototype value": gp, "model value": gm, "ratio": ratio,
            "matched": bool(abs(ratio - 1.0) <= 1e-6), "requested": requested}


def _advance_cavitation_rows(prob: Problem, c: Candidates) -> list:
    """A propeller's cavitation number on advance speed, sigma_v = (p - p_v)/(rho V_A^2/2),
    beside the sigma_n it matches (sigma_v = sigma_n / J^2): for cavitation charts drawn on
    the advance speed."""
    name, symbol = CAVITATION_ON_ADVANCE
    rows = []
    for i, vp in enumerate(np.asarray(prob.case.prototype.speeds, dtype=float)):
        sides = []
        for side in (prob.proto, model_side(prob, c, i)):
            st = side.state
            v = float(np.ravel(side.speed)[i if side is prob.proto else 0])
            p = float(np.ravel(side.reference_pressure)[0])
            sides.append(float(cavitation_number(p, float(np.ravel(st.vapour_pressure_si)[0]),
                                                 float(np.ravel(st.density_si)[0]), v)))
        rows.append(_group_row(name, symbol, "cavitation_advance", vp, *sides, "derived"))
    return rows


def _speeds_table(case: Case, solution: Solution):
    vp = np.asarray(case.prototype.speeds, dtype=float)
    data = {"prototype speed [m/s]": vp}
    if case.speed_unit != "m/s":
        data[case.speed_header] = vp / case.speed_unit_factor
    data["model speed [m/s]"] = vp * solution.velocity_ratio
    if case.prototype.rotation_rates and solution.rotation_ratio is not None:
        n = np.asarray(case.prototype.rotation_rates, dtype=float)
        data["prototype rotation rate [1/s]"] = n
        data["model rotation rate [1/s]"] = n * solution.rotation_ratio
    return pd.DataFrame(data)


def _scale_factors(case, solution):
    rho_ratio = float(solution.prototype_fluid.density_si) / float(
        solution.model_fluid.density_si)
    if "froude" in solution.exact:
        return scaling.scale_factor_table(solution.scale, law="froude",
                                          density_ratio=rho_ratio)
    return scaling.scale_factor_table(solution.scale, law="general", density_ratio=rho_ratio,
                                      velocity_ratio=1.0 / solution.velocity_ratio)


def plan(case: Case, n_candidates: int | None = None) -> Plan:
    """Plan a model test: solve for scale, speed and fluid state and report what it costs.

    Parameters
    ----------
    case : Case
        Prototype, facility, matching request and run-matrix specification (SI).
    n_candidates : int, optional
        Size of the solver's search grid (default
        :data:`similitude.planning.solver.DEFAULT_CANDIDATES`).

    Returns
    -------
    Plan

    Raises
    ------
    InputError
        Bad or contradictory input (one line naming the field, value and expectation).
    InfeasibleError
        No model fits the facility; the message names the binding limit and by how much.
    """
    if not isinstance(case, Case):
        raise InputError(f"case: got {type(case).__name__}; expected a similitude Case")
    sol = solve(case, n_candidates or DEFAULT_CANDIDATES)
    # A relaxed solution was found for a request with its last exact group dropped.
    solved_case = case if sol.solved_request is None else replace(
        case, request=sol.solved_request)
    prob = build_problem(solved_case)
    c = candidate_at(prob, sol)
    proto = case.prototype
    lam = sol.scale
    dims = {"length": proto.length / lam}
    for k, v in proto.dimensions.items():
        dims[k] = v / lam ** dimension_power(k)
    keys = _relevant_groups(prob)
    keys = tuple(dict.fromkeys(keys + tuple(g for g in case.request.exact if g not in keys)))
    groups = _groups_table(prob, c, keys, case.request.exact)
    conflicts = find_conflicts(prob, c, [k for k in keys if k not in sol.exact])
    checks = facility_checks(prob, c)
    matrix = build_matrix(case, sol)
    propulsion = None
    if case.test == "self_propulsion":
        # Imported here: it loads the after-test stage (the resistance extrapolation), which
        # no other kind of plan needs at start-up (tests/commands/test_cli_frame.py).
        from similitude.planning.self_propulsion import plan_self_propulsion

        propulsion = plan_self_propulsion(case, sol, matrix)
        matrix = propulsion.runs
        checks = checks + propulsion.checks
    notes = list(_notes(case, sol, checks))
    notes.extend(blockage_notes(prob, c))
    if propulsion is not None:
        notes.extend(propulsion.notes)
    return Plan(
        case=case, solution=sol, scale=lam, model_length=proto.length / lam,
        model_dimensions=dims, prototype_fluid=sol.prototype_fluid,
        model_fluid=sol.model_fluid, speeds=_speeds_table(case, sol), groups=groups,
        conflicts=conflicts, checks=checks, scale_factors=_scale_factors(case, sol),
        matrix=matrix, notes=tuple(notes), binding_constraint=sol.binding,
        propulsion=propulsion,
    )


def _temperature_notes(case: Case, sol: Solution, checks) -> list[str]:
    """How the model fluid temperature was chosen, at which end of the facility range, at
    which temperature the Reynolds-dependent checks hold, and where the test-day value goes."""
    fac = case.facility
    mf = sol.model_fluid
    t = float(mf.temperature_si) - 273.15
    workbook = ("enter the temperature measured on the test day in the temperature cell of "
                "the workbook's 'Test day' sheet, which recomputes the model fluid properties "
                "and Reynolds numbers of the runs")
    fixed = case.request.model_fluid
    if fixed is not None:
        return [f"Model fluid temperature {t:.2f} degC is fixed by the case "
                f"(matching.model_fluid); {workbook}."]
    lo, hi = fac.temperature_range
    if hi <= lo:
        return [f"Model fluid temperature {t:.2f} degC is the facility's only temperature; "
                f"{workbook}."]
    lo_c, hi_c = lo - 273.15, hi - 273.15
    if abs(t - hi_c) <= 0.01:
        end = "the warm end"
    elif abs(t - lo_c) <= 0.01:
        end = "the cold end"
    else:
        end = "inside"
    solved = case.request if sol.solved_request is None else sol.solved_request
    why = (f"to minimise the mismatch of the reported groups ({', '.join(solved.report)})"
           if solved.report else "by the objective")
    if "reynolds" in solved.report:
        why += " (the warmer the water, the smaller the Reynolds mismatch)" if \
            fac.free_surface else ""
    if any(g in ("reynolds", "mach", "weber", "cavitation") for g in sol.exact):
        why = "to meet the exact groups"
    text = (f"Model fluid temperature {t:.2f} degC is {end} of the facility range "
            f"{lo_c:.1f}-{hi_c:.1f} degC, chosen {why}.")
    shifted = [c for c in checks if "least favourable facility temperature" in c.name]
    if shifted:
        text += (" The Reynolds-number checks are evaluated at the least favourable end of the "
                 "range instead (" + "; ".join(c.name for c in shifted) + "), because the "
                 "fluid may be at any temperature of the range on the test day.")
    if fac.free_surface:
        text += (f" A tank's water is at whatever temperature it has on the day: {workbook}; "
                 "to plan at a known temperature, fix it with matching.model_fluid.")
    else:
        text += f" On the test day, {workbook}."
    return [text]


def _notes(case: Case, sol: Solution, checks) -> list[str]:
    out = []
    mf = sol.model_fluid
    out.append(
        f"Model fluid chosen: {human(mf.fluid)} at {float(mf.temperature_si) - 273.15:.2f} "
        f"degC (objective: {human(sol.objective)}); the scale is set by: {sol.binding}."
    )
    if sol.exact:
        out.append("Exact groups (" + ", ".join(sol.exact) + ") hold to 1e-9 relative at every "
                   "prototype speed; all values are SI.")
    else:
        out.append("Report-only plan: no group is matched exactly at the fixed scale; the "
                   "model speeds, fluid temperature and pressure minimise the mismatch of the "
                   "reported groups (" + (", ".join(case.request.report) or "none") + ").")
    if sol.solved_by:
        out.append(f"The second exact group is met through the {sol.solved_by}.")
    rounding = sol.scale_rounding
    if rounding:
        lam0 = sol.limiting_scale
        if rounding.startswith("rounded"):
            out.append(
                f"Scale {rounding}: the facility limits allow {format_scale(lam0, 6)} "
                f"({sol.limiting_binding}); every limit still holds at "
                f"{format_scale(sol.scale, 6)} (switch off with round_scale = false)."
            )
        else:
            out.append(f"Scale kept at the limiting {format_scale(lam0)}, {rounding}.")
    out.extend(_temperature_notes(case, sol, checks))
    if case.prototype.kind in ("surface_ship", "submerged_body") and case.facility.free_surface:
        out.append(turbulence_stimulation_advice(case.prototype.length / sol.scale))
    for group, reason in sol.relaxed:
        out.append(f"Requested exact group '{group}' cannot be met inside the facility, so it "
                   f"is minimised instead while the others stay exact. Reason: {reason}")
    fails = [c for c in checks if c.status == "fail"]
    if fails:
        out.append("Failed checks: " + "; ".join(c.name for c in fails) + ".")
    return out


__all__ = ["Plan", "plan"]

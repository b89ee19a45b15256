"""What a plan reports besides numbers: facility checks, their statuses, and unmatched groups.

One vocabulary of check statuses (:data:`STATUSES`) and one colour per status
(:data:`STATUS_COLOURS`) serve every output: the workbook, the notebook view, the command-line
summary and the JSON. :func:`judge` gives a check its status from its value and limit;
:func:`checks_summary` is the one line that counts them (it never says "all passed" while a
check is "not checked", "at limit" or worse).

Statuses
--------
``ok``
    Inside the limit with a margin of :data:`AT_LIMIT_MARGIN` or more.
``at limit``
    Inside the limit, or on it, with a margin below :data:`AT_LIMIT_MARGIN` (2 %): the largest
    admissible model sits here by construction; any error in the inputs takes it over.
``warning``
    A soft limit (a rule of thumb, or one a correction can cover) is exceeded.
``fail``
    A hard limit (the facility cannot do it) is exceeded.
``not checked``
    The check applies to this case but an input it needs is missing; the advice names it.
``info``
    A figure worth knowing with no pass/fail limit.
"""

from __future__ import annotations

import html
import math
from dataclasses import dataclass, field

#: The statuses of a check, from good to bad, then the two that are not a verdict.
STATUSES = ("ok", "at limit", "warning", "fail", "not checked", "info")

#: Display colour of each status (RGB hex, no '#'): the workbook fills and the notebook view
#: colour alike. Green, amber, yellow, red, grey, blue; "at limit" is amber so it stands apart
#: from both "ok" and "warning".
STATUS_COLOURS = {
    "ok": "C6EFCE",
    "at limit": "F8CBAD",
    "warning": "FFEB9C",
    "fail": "FFC7CE",
    "not checked": "D9D9D9",
    "info": "DDEBF7",
}

#: What each status means, in a line, for the legend of the workbook and the notebook view.
STATUS_MEANINGS = {
    "ok": "inside the limit with at least 2 % margin",
    "at limit": "inside or on the limit with less than 2 % margin: any input error takes it over",
    "warning": "a soft limit (a rule of thumb, or one a correction covers) is exceeded",
    "fail": "a hard limit is exceeded: the facility cannot do this",
    "not checked": "applies to this case but an input is missing; the advice names it",
    "info": "a figure to know, with no limit",
}

#: Relative margin below which a met limit shows as "at limit" [-]: 2 % (common practice: a
#: planning figure inside 2 % of a limit is within the spread of the inputs it rests on).
AT_LIMIT_MARGIN = 0.02

#: Relative excess treated as equality [-] (the solver meets binding limits to about 1e-9).
EQUALITY_TOLERANCE = 1e-9

#: Statuses that need a reader's attention, worst first (the order of the summary lines).
ATTENTION = ("fail", "warning", "not checked", "at limit")

#: Columns of :func:`checks_table`, in order.
CHECK_COLUMNS = ("check", "value", "limit", "unit", "kind", "status", "margin [-]", "source",
                 "advice")


def relative_margin(value: float, limit: float, kind: str) -> float:
    """Relative margin to a limit [-]: (limit - value)/|limit| for a maximum, (value -
    limit)/|limit| for a minimum; positive inside, negative when violated, NaN when it
    cannot be formed (a zero or missing limit, another kind)."""
    if kind not in ("max", "min") or not (math.isfinite(value) and math.isfinite(limit)) \
            or limit == 0:
        return float("nan")
    if kind == "max":
        return (limit - value) / abs(limit)
    return (value - limit) / abs(limit)


def judge(value: float, limit: float, kind: str, soft: bool = True,
          band: float = AT_LIMIT_MARGIN) -> str:
    """The status of a value against a limit.

    Parameters
    ----------
    value, limit : float
        In the same unit.
    kind : str
        ``"max"`` (value must not exceed limit) or ``"min"`` (must not fall below).
    soft : bool
        A violated soft limit is a ``"warning"``, a violated hard one a ``"fail"``.
    band : float
        The "at limit" band [-]; 0 for a quantity whose relative margin means little (an
        absolute temperature): then only a limit met with equality is "at limit".

    Returns
    -------
    str
        ``"ok"``, ``"at limit"`` (margin below :data:`AT_LIMIT_MARGIN`, equality included),
        ``"warning"`` or ``"fail"``; ``"not checked"`` when the value is not a finite number.
    """
    if not math.isfinite(value):
        return "not checked"
    m = relative_margin(value, limit, kind)
    if not math.isfinite(m):  # a zero limit: judge by the sign alone
        ok = value <= limit if kind == "max" else value >= limit
        return "ok" if ok else ("warning" if soft else "fail")
    if m < -EQUALITY_TOLERANCE:
        return "warning" if soft else "fail"
    return "at limit" if (m < band or m <= EQUALITY_TOLERANCE) else "ok"


@dataclass(frozen=True)
class Check:
    """One facility or regime check.

    Attributes
    ----------
    name : str
        What is checked, e.g. ``"blockage ratio A_X/(B_T h)"``.
    value : float
        The model's value, in ``unit`` (NaN when not checked).
    limit : float
        The limit, in ``unit`` (NaN when not checked).
    unit : str
        Unit of value and limit ("" for ratios).
    kind : str
        ``"max"`` (value must stay below limit), ``"min"`` (above), or "" (an info row or a
        check that could not run).
    status : str
        One of :data:`STATUSES`.
    source : str
        Published procedure or paper, or "common practice" when no source is at hand.
    advice : str
        What to do about it; for a check that could not run, the input that would enable it.
    """

    name: str
    value: float
    limit: float
    unit: str
    kind: str
    status: str
    source: str
    advice: str = ""

    def __post_init__(self) -> None:
        if self.status not in STATUSES:
            raise ValueError(f"status: {self.status!r} is unknown; expected one of "
                             + ", ".join(STATUSES))

    @property
    def margin(self) -> float:
        """Relative margin to the limit: positive inside, negative when violated."""
        return relative_margin(self.value, self.limit, self.kind)

    @classmethod
    def not_checked(cls, name: str, needs: str, source: str = "", unit: str = "") -> Check:
        """A check that applies to the case but lacks an input; ``needs`` names it, as the
        advice (e.g. ``"give prototype.sizes.midship_area, or beam and draught"``)."""
        return cls(name, float("nan"), float("nan"), unit, "", "not checked", source, needs)

    @classmethod
    def info(cls, name: str, value: float, unit: str, source: str, advice: str = "") -> Check:
        """A figure with no pass/fail limit."""
        return cls(name, float(value), float("nan"), unit, "", "info", source, advice)


def format_margin(margin: float) -> str:
    """A relative margin as a percentage for documents: "0.042 %", "3.1 %", "-257 %", or ""
    when there is none."""
    if not math.isfinite(margin):
        return ""
    pct = margin * 100.0
    if abs(pct) >= 10:
        return f"{pct:.0f} %"
    if abs(pct) >= 1:
        return f"{pct:.1f} %"
    return f"{pct:.2g} %"


def status_counts(checks) -> dict[str, int]:
    """Number of checks of each status, in the order of :data:`STATUSES` (zeros left out)."""
    out = {s: 0 for s in STATUSES}
    for c in checks:
        out[c.status] += 1
    return {s: n for s, n in out.items() if n}


def needs_attention(checks) -> list[Check]:
    """The checks a reader must look at ("fail", "warning", "not checked", "at limit"),
    worst first, in their order within a status."""
    return [c for s in ATTENTION for c in checks if c.status == s]


def checks_summary(checks) -> str:
    """One line counting the checks by status.

    "all 11 passed" only when every check (info rows aside) is "ok"; otherwise each status
    with its count, e.g. "12 checks: 9 ok, 1 at limit, 1 warning, 1 not checked".
    """
    counts = status_counts(checks)
    verdicts = sum(n for s, n in counts.items() if s != "info")
    info = counts.get("info", 0)
    extra = f" (and {info} for information)" if info else ""
    if verdicts and counts.get("ok", 0) == verdicts:
        return f"all {verdicts} passed{extra}"
    parts = ", ".join(f"{n} {s}" for s, n in counts.items() if s != "info")
    return f"{verdicts} checks: {parts or 'none'}{extra}"


@dataclass(frozen=True)
class Conflict:
    """A group the model does not match, with what that costs.

    Attributes
    ----------
    group : str
        Group key, e.g. ``"reynolds"``.
    prototype_value, model_value : float
        Values at the reference (design) speed.
    consequence : str
        The scale effect in the trade's terms, one or two sentences with numbers.
    details : dict
        Figures behind the consequence (e.g. ``C_F model``, ``C_F ship``, error of naive
        scaling), for tables.
    """

    group: str
    prototype_value: float
    model_value: float
    consequence: str
    details: dict = field(default_factory=dict)

    @property
    def ratio(self) -> float:
        """Prototype value over model value."""
        return self.prototype_value / self.model_value if self.model_value else float("inf")


def status_style(status: str) -> str:
    """CSS of a status cell in the notebook view (the colour of :data:`STATUS_COLOURS`)."""
    return f"background-color:#{STATUS_COLOURS.get(status, 'FFFFFF')};color:#000000"


def checks_html(checks) -> str:
    """The checks as an HTML table with coloured status cells, margins in % (the notebook
    view; the workbook colours its status cells alike)."""
    def num(v: float) -> str:
        return f"{v:.4g}" if math.isfinite(v) else ""

    head = ("<tr><th>check</th><th>model value</th><th>limit</th><th>unit</th>"
            "<th>margin</th><th>status</th><th>source</th><th>advice</th></tr>")
    rows = "".join(
        f"<tr><td>{html.escape(c.name)}</td><td>{num(c.value)}</td><td>{num(c.limit)}</td>"
        f"<td>{html.escape(c.unit)}</td><td>{format_margin(c.margin)}</td>"
        f'<td style="{status_style(c.status)}">{html.escape(c.status)}</td>'
        f"<td>{html.escape(c.source)}</td><td>{html.escape(c.advice)}</td></tr>"
        for c in checks)
    return f'<table border="1" class="dataframe"><thead>{head}</thead><tbody>{rows}</tbody></table>'


def checks_table(checks):
    """The checks as a DataFrame, one row each, columns :data:`CHECK_COLUMNS`.

    The one conversion of checks to a table; the workbook, the CSV output and the notebook
    view select and label its columns.
    """
    # pandas on call only: the command line loads this module for every command (through
    # commands/plan.py), and the checks themselves do not need it.
    import pandas as pd

    rows = [(c.name, c.value, c.limit, c.unit, c.kind, c.status, c.margin, c.source, c.advice)
            for c in checks]
    return pd.DataFrame(rows, columns=list(CHECK_COLUMNS))


__all__ = [
    "ATTENTION",
    "AT_LIMIT_MARGIN",
    "CHECK_COLUMNS",
    "EQUALITY_TOLERANCE",
    "STATUSES",
    "STATUS_COLOURS",
    "STATUS_MEANINGS",
    "Check",
    "Conflict",
    "checks_html",
    "checks_summary",
    "checks_table",
    "format_margin",
    "judge",
    "needs_attention",
    "relative_margin",
    "status_counts",
    "status_style",
]

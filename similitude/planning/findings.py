"""What a plan reports besides numbers: facility checks and unmatched-group conflicts."""

from __future__ import annotations

from dataclasses import dataclass, field

STATUSES = ("ok", "warning", "fail", "info")

#: Columns of :func:`checks_table`, in order.
CHECK_COLUMNS = ("check", "value", "limit", "unit", "kind", "status", "margin [-]", "source",
                 "advice")


@dataclass(frozen=True)
class Check:
    """One facility or regime check.

    Attributes
    ----------
    name : str
        What is checked, e.g. ``"blockage ratio A_X/(B_T h)"``.
    value : float
        The model's value, in ``unit``.
    limit : float
        The limit, in ``unit``.
    unit : str
        Unit of value and limit ("" for ratios).
    kind : str
        ``"max"`` (value must stay below limit) or ``"min"`` (above).
    status : str
        One of :data:`STATUSES`.
    source : str
        Published procedure, or "common practice" when no source is at hand.
    advice : str
        What to do about it.
    """

    name: str
    value: float
    limit: float
    unit: str
    kind: str
    status: str
    source: str
    advice: str = ""

    @property
    def margin(self) -> float:
        """Relative margin to the limit: positive inside, negative when violated."""
        if self.limit == 0:
            return float("nan")
        if self.kind == "max":
            return (self.limit - self.value) / abs(self.limit)
        return (self.value - self.limit) / abs(self.limit)


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

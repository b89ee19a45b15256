"""Term-balance scaling: which terms of a governing equation matter, at full scale and in the model.

Scale analysis estimates each term of an equation by a product of characteristic scales (for the
momentum equation of a ship hull: unsteady U/T... in acceleration units, advective U^2/L,
pressure dp/(rho L), gravity g, viscous nu U/L^2, capillary sigma/(rho L^2)) [1]_ [2]_. The
ratio of a term to a reference term is a dimensionless group (viscous/advective = 1/Re,
gravity/advective = 1/Fr^2, capillary/advective = 1/We). Terms whose ratio falls below a
threshold are negligible; what remains is the dominant balance. Comparing the balance of the
prototype with that of the model shows whether a model, distorted in some group, still sits in
the same regime.

Terms are strings of products, quotients and powers of scale symbols and numbers, e.g.
``"U**2/L"``, ``"nu*U/L**2"``, ``"sigma/(rho*L**2)"``, ``"Omega*U"``, ``"sqrt(g*h)*U/L"``.
They are parsed with :mod:`ast` and evaluated node by node over pint Quantities: nothing is
``eval``-ed. Roles of the scale symbols follow the conventions of
:mod:`similitude.dimensional.dimensions`,
so the ratios are named from the catalogue of :mod:`similitude.dimensional.groups`.

References
----------
.. [1] H. Tennekes and J. L. Lumley, *A First Course in Turbulence*, MIT Press, 1972, ch. 1-2
   (order-of-magnitude estimates of the terms of the equations of motion).
.. [2] J. Pedlosky, *Geophysical Fluid Dynamics*, 2nd ed., Springer, 1987, sec. 1.5 and 2.2
   (scale analysis; Rossby number as the ratio of advective to Coriolis terms).
"""

from __future__ import annotations

import ast
import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from fractions import Fraction
from typing import Any

import pandas as pd
import pint

from similitude.dimensional import groups as _catalogue
from similitude.dimensional.dimensions import infer_role
from similitude.errors import InputError
from similitude.units import Q_, SI_UNITS, UnitInputError, parse_quantity

__all__ = ["TermBalance", "term_balance", "parse_term"]


@dataclass(frozen=True)
class _Monomial:
    """coefficient * prod(symbol ** exponent), kept exactly alongside the evaluated value."""

    coefficient: float
    exponents: dict[str, Fraction]


@dataclass(frozen=True)
class TermBalance:
    """Result of :func:`term_balance`.

    Attributes
    ----------
    table : pandas.DataFrame
        One row per term: ``term``, ``expression``, ``prototype magnitude [<SI unit>]``,
        ``ratio to reference``, ``group``, ``negligible at prototype``, ``model magnitude
        [<SI unit>]``, ``model ratio``, ``negligible in model``, ``regime change``.
    reference : str
        Name of the reference term.
    unit : str
        SI unit of the terms.
    threshold : float
        Ratio to the reference below which a term is negligible [-].
    dominant_prototype, dominant_model : tuple of str
        Terms not negligible (the dominant balance); empty for the model when no model scales
        were given.
    changes : tuple of str
        One sentence per term whose negligibility differs between prototype and model.
    """

    table: Any
    reference: str
    unit: str
    threshold: float
    dominant_prototype: tuple[str, ...]
    dominant_model: tuple[str, ...]
    changes: tuple[str, ...] = field(default=())


_FUNCS = {"sqrt": Fraction(1, 2), "cbrt": Fraction(1, 3)}


def _constant(node: ast.AST, where: str) -> float:
    """Evaluate a numeric exponent: numbers, unary minus, + - * / of numbers."""
    if isinstance(node, ast.Constant) and isinstance(node.value, (int, float)) and \
            not isinstance(node.value, bool):
        return node.value
    if isinstance(node, ast.UnaryOp) and isinstance(node.op, (ast.USub, ast.UAdd)):
        v = _constant(node.operand, where)
        return -v if isinstance(node.op, ast.USub) else v
    if isinstance(node, ast.BinOp) and isinstance(node.op, (ast.Div, ast.Mult, ast.Add, ast.Sub)):
        a, b = _constant(node.left, where), _constant(node.right, where)
        if isinstance(node.op, ast.Div):
            if b == 0:
                raise InputError(f"{where}: division by zero in an exponent")
            return Fraction(a) / Fraction(b) if isinstance(a, int) and isinstance(b, int) \
                else a / b
        if isinstance(node.op, ast.Mult):
            return a * b
        return a + b if isinstance(node.op, ast.Add) else a - b
    raise InputError(f"{where}: exponents must be numbers, got {ast.unparse(node)!r}")


def parse_term(expression: str, where: str = "term") -> _Monomial:
    """Parse a term into an exact monomial (coefficient and symbol exponents).

    Parameters
    ----------
    expression : str
        Products, quotients and powers of symbols and numbers; ``sqrt(...)`` and ``cbrt(...)``.
        ``^`` is read as a power.
    where : str
        Field name for error messages.

    Raises
    ------
    InputError
        For a syntax error or anything other than the allowed operations (sums included: a
        term is one product of scales; write each addend as its own term).
    """
    if not isinstance(expression, str) or not expression.strip():
        raise InputError(f"{where}: {expression!r} is not a term; expected e.g. 'U**2/L'")
    text = expression.replace("^", "**")
    try:
        tree = ast.parse(text, mode="eval")
    except SyntaxError:
        raise InputError(f"{where}: cannot parse {expression!r}; expected e.g. 'nu*U/L**2'") \
            from None

    def walk(node: ast.AST) -> _Monomial:
        if isinstance(node, ast.Name):
            return _Monomial(1.0, {node.id: Fraction(1)})
        if isinstance(node, ast.Constant) and isinstance(node.value, (int, float)) and \
                not isinstance(node.value, bool):
            return _Monomial(float(node.value), {})
        if isinstance(node, ast.UnaryOp) and isinstance(node.op, (ast.USub, ast.UAdd)):
            m = walk(node.operand)
            sign = -1.0 if isinstance(node.op, ast.USub) else 1.0
            return _Monomial(sign * m.coefficient, m.exponents)
        if isinstance(node, ast.BinOp) and isinstance(node.op, (ast.Mult, ast.Div)):
            a, b = walk(node.left), walk(node.right)
            s = 1 if isinstance(node.op, ast.Mult) else -1
            if s == -1 and b.coefficient == 0:
                raise InputError(f"{where}: division by zero in {expression!r}")
            exps = dict(a.exponents)
            for k, e in b.exponents.items():
                exps[k] = exps.get(k, Fraction(0)) + s * e
            coeff = a.coefficient * b.coefficient if s == 1 else a.coefficient / b.coefficient
            return _Monomial(coeff, {k: e for k, e in exps.items() if e != 0})
        if isinstance(node, ast.BinOp) and isinstance(node.op, ast.Pow):
            base = walk(node.left)
            p = Fraction(_constant(node.right, where)).limit_denominator(1000)
            return _Monomial(base.coefficient ** float(p),
                             {k: e * p for k, e in base.exponents.items()})
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Name) and \
                node.func.id in _FUNCS and len(node.args) == 1 and not node.keywords:
            base = walk(node.args[0])
            p = _FUNCS[node.func.id]
            return _Monomial(base.coefficient ** float(p),
                             {k: e * p for k, e in base.exponents.items()})
        if isinstance(node, ast.BinOp) and isinstance(node.op, (ast.Add, ast.Sub)):
            raise InputError(
                f"{where}: {expression!r} is a sum; a term is one product of scales, so give "
                "each addend as its own term (or a difference such as p - p_v as one scale)"
            )
        raise InputError(
            f"{where}: {ast.unparse(node)!r} is not allowed in {expression!r}; expected "
            "symbols, numbers, * / ** and sqrt()"
        )

    return walk(tree.body)


def _scales(scales: Mapping[str, Any], where: str) -> dict[str, pint.Quantity]:
    if not isinstance(scales, Mapping):
        raise InputError(f"{where}: {scales!r} is not valid; expected a mapping symbol -> value")
    out = {}
    for k, v in scales.items():
        try:
            q = parse_quantity(v, f"{where}.{k}")
        except UnitInputError as exc:
            raise InputError(str(exc)) from None
        if not isinstance(q.magnitude, (int, float)):
            raise InputError(f"{where}.{k}: {v!r} is not a single value; expected a scalar")
        out[k] = q.to_base_units()
    return out


def _evaluate(term: _Monomial, scales: Mapping[str, pint.Quantity], where: str,
              expression: str) -> pint.Quantity:
    q = Q_(term.coefficient, "dimensionless")
    for s, e in term.exponents.items():
        if s not in scales:
            raise InputError(
                f"{where}: scale {s!r} of term {expression!r} has no value; give it under the "
                "scales"
            )
        q = q * scales[s] ** float(e)
    return q.to_base_units()


def _dim_text(q: pint.Quantity) -> str:
    return "dimensionless" if q.dimensionless else str(q.dimensionality)


def _si_unit(q: pint.Quantity) -> str:
    unit = SI_UNITS.get(str(q.dimensionality))
    if unit is not None:
        return unit or "-"
    return f"{q.units:~}".replace(" ", "")


def _group_label(exps: dict[str, Fraction], scales: Mapping[str, pint.Quantity]) -> str:
    """Name the ratio of two terms as a power of a catalogued group, e.g. 'Re^-1 (Reynolds...)'."""
    if not exps:
        return ""
    roles: dict[str, Fraction] = {}
    for s, e in exps.items():
        q = scales.get(s)
        role = infer_role(s, q.dimensionality if q is not None else None) or f"?{s}"
        roles[role] = roles.get(role, Fraction(0)) + e
    match = _catalogue.lookup(roles)
    if match is None:
        return ""
    p = match.power
    power = "" if p == 1 else f"^{p.numerator}" if p.denominator == 1 else f"^({p})"
    return f"{match.group.symbol}{power} ({match.group.name})"


def term_balance(terms: Mapping[str, str] | Sequence[str],
                 scales_prototype: Mapping[str, Any],
                 scales_model: Mapping[str, Any] | None = None,
                 reference: str | None = None,
                 threshold: float = 0.01) -> TermBalance:
    """Scale analysis of an equation's terms for the prototype and the model.

    Parameters
    ----------
    terms : mapping name -> expression, or sequence of expressions
        Each term as a product of scales (``"U**2/L"``); a sequence uses the expressions as
        names.
    scales_prototype : mapping
        symbol -> value with unit (``"7.7 m/s"``, a Quantity; a bare number is
        dimensionless).
    scales_model : mapping, optional
        The model's scales; a symbol left out takes its prototype value (``g``, usually).
    reference : str, optional
        Name (or expression) of the reference term; the first term by default.
    threshold : float
        A term is negligible when |term| / |reference| < threshold [-] (default 0.01).

    Returns
    -------
    TermBalance

    Raises
    ------
    InputError
        For an unparsable term, a scale without a value, or terms of inconsistent dimensions
        (the message names the odd term and both dimensions).

    Notes
    -----
    ratio_i = |T_i| / |T_ref|; negligible_i = ratio_i < threshold; the regime changes where
    negligible differs between prototype and model.
    """
    items = _term_items(terms)
    threshold = _threshold(threshold)
    names = [n for n, _ in items]
    ref_index = _reference_index(reference, items)
    parsed = [parse_term(expr, f"terms.{name}") for name, expr in items]
    proto = _scales(scales_prototype, "prototype")
    model = None
    if scales_model is not None:
        model = dict(proto)
        model.update(_scales(scales_model, "model"))

    p_vals = [_evaluate(m, proto, f"terms.{n}", e) for m, (n, e) in zip(parsed, items,
                                                                         strict=True)]
    _check_dimensions(p_vals, items, ref_index)
    unit = _si_unit(p_vals[ref_index])
    m_vals = None
    if model is not None:
        m_vals = [_evaluate(m, model, f"terms.{n}", e) for m, (n, e) in zip(parsed, items,
                                                                             strict=True)]
    p_ratio = _ratios(p_vals, ref_index, names)
    m_ratio = _ratios(m_vals, ref_index, names) if m_vals is not None else None
    rows = []
    changes = []
    for i, (name, expr) in enumerate(items):
        neg_p = i != ref_index and p_ratio[i] < threshold
        row = {
            "term": name,
            "expression": expr,
            f"prototype magnitude [{unit}]": float(p_vals[i].magnitude),
            "ratio to reference": p_ratio[i],
            "group": (_group_label(_ratio_exponents(parsed[i], parsed[ref_index]), proto)
                      if i != ref_index else "reference"),
            "negligible at prototype": neg_p,
        }
        if m_vals is not None:
            neg_m = i != ref_index and m_ratio[i] < threshold
            row.update({
                f"model magnitude [{unit}]": float(m_vals[i].magnitude),
                "model ratio": m_ratio[i],
                "negligible in model": neg_m,
                "regime change": neg_p != neg_m,
            })
            if neg_p != neg_m:
                changes.append(_change_sentence(name, neg_p, p_ratio[i], m_ratio[i], threshold))
        else:
            row.update({
                f"model magnitude [{unit}]": float("nan"),
                "model ratio": float("nan"),
                "negligible in model": None,
                "regime change": None,
            })
        rows.append(row)
    table = pd.DataFrame(rows)
    dominant_p = tuple(r["term"] for r in rows if not r["negligible at prototype"])
    dominant_m = tuple(r["term"] for r in rows if r["negligible in model"] is False) \
        if m_vals is not None else ()
    return TermBalance(table, names[ref_index], unit, threshold, dominant_p, dominant_m,
                       tuple(changes))


def _term_items(terms: Mapping[str, str] | Sequence[str]) -> list[tuple[str, Any]]:
    """(name, expression) of each term; at least two are needed."""
    if isinstance(terms, Mapping):
        items = [(str(k), v) for k, v in terms.items()]
    elif isinstance(terms, Sequence) and not isinstance(terms, str):
        items = [(str(v), v) for v in terms]
    else:
        raise InputError(f"terms: {terms!r} is not valid; expected a mapping name -> expression")
    if len(items) < 2:
        raise InputError("terms: at least two terms are needed to compare their magnitudes")
    return items


def _threshold(threshold: Any) -> float:
    """The negligibility threshold as a positive float."""
    try:
        threshold = float(threshold)
    except (TypeError, ValueError):
        threshold = float("nan")
    if not (math.isfinite(threshold) and threshold > 0):
        raise InputError(f"threshold: {threshold!r} is not valid; expected a positive number")
    return threshold


def _reference_index(reference: str | None, items: list[tuple[str, Any]]) -> int:
    """Index of the reference term, named by its name or its expression (the first: None)."""
    names = [n for n, _ in items]
    expressions = [e for _, e in items]
    if reference is None:
        return 0
    if reference in names:
        return names.index(reference)
    if reference in expressions:
        return expressions.index(reference)
    raise InputError(f"reference: {reference!r} is not one of the terms ({', '.join(names)})")


def _check_dimensions(values: list[pint.Quantity], items: list[tuple[str, Any]],
                      ref_index: int) -> None:
    """Every term has the equation's dimension: the one most terms share (the reference wins
    ties); the first odd term is named with both dimensions."""
    dims = [v.dimensionality for v in values]
    counts = {d: dims.count(d) for d in dims}
    best = max(counts.values())
    common = dims[ref_index] if counts[dims[ref_index]] == best else \
        next(d for d in dims if counts[d] == best)
    like = next(i for i, d in enumerate(dims) if d == common)
    for i, d in enumerate(dims):
        if d != common:
            raise InputError(
                f"terms.{items[i][0]}: {items[i][1]!r} has dimension {_dim_text(values[i])}, "
                f"but term {items[like][0]!r} ({items[like][1]!r}) has "
                f"{_dim_text(values[like])}"
            )


def _ratios(values: list[pint.Quantity], ref_index: int, names: list[str]) -> list[float]:
    """|T_i| / |T_ref| of each term."""
    ref = abs(float(values[ref_index].magnitude))
    if ref == 0:
        raise InputError(f"reference: term {names[ref_index]!r} is zero; choose another")
    return [abs(float(v.magnitude)) / ref for v in values]


def _ratio_exponents(term: _Monomial, reference: _Monomial) -> dict[str, Fraction]:
    """Symbol exponents of the ratio term / reference (zero exponents dropped)."""
    exps = dict(term.exponents)
    for k, e in reference.exponents.items():
        exps[k] = exps.get(k, Fraction(0)) - e
    return {k: e for k, e in exps.items() if e != 0}


def _change_sentence(name: str, negligible_prototype: bool, p_ratio: float, m_ratio: float,
                     threshold: float) -> str:
    """One sentence on a term whose negligibility differs between prototype and model."""
    if negligible_prototype:
        return (f"{name}: negligible at full scale (ratio {p_ratio:.3g}) but not in "
                f"the model (ratio {m_ratio:.3g} >= {threshold:g})")
    return (f"{name}: matters at full scale (ratio {p_ratio:.3g}) but is "
            f"negligible in the model (ratio {m_ratio:.3g} < {threshold:g})")

"""Exact linear algebra over the rationals (fractions.Fraction) for dimension matrices.

Gauss-Jordan elimination without pivoting tolerances: every exponent stays exact, so a group
exponent of 1/2 is 1/2 and never 0.49999999 [1]_.

References
----------
.. [1] G. Strang, *Linear Algebra and Its Applications*, 4th ed., Thomson, 2006, ch. 2
   (reduced row echelon form, rank, null space).
"""

from __future__ import annotations

from fractions import Fraction

Matrix = list[list[Fraction]]


def as_fraction_matrix(rows) -> Matrix:
    """Copy a nested sequence into a list of lists of Fraction."""
    return [[Fraction(x) for x in row] for row in rows]


def rref(rows) -> tuple[Matrix, list[int]]:
    """Reduced row echelon form and the pivot columns."""
    m = as_fraction_matrix(rows)
    if not m:
        return m, []
    n_rows, n_cols = len(m), len(m[0])
    pivots: list[int] = []
    r = 0
    for c in range(n_cols):
        pivot = next((i for i in range(r, n_rows) if m[i][c] != 0), None)
        if pivot is None:
            continue
        m[r], m[pivot] = m[pivot], m[r]
        p = m[r][c]
        m[r] = [x / p for x in m[r]]
        for i in range(n_rows):
            if i != r and m[i][c] != 0:
                f = m[i][c]
                m[i] = [a - f * b for a, b in zip(m[i], m[r], strict=True)]
        pivots.append(c)
        r += 1
        if r == n_rows:
            break
    return m, pivots


def rank(rows) -> int:
    """Rank of a matrix (rows may be empty)."""
    rows = [list(r) for r in rows]
    if not rows or not rows[0]:
        return 0
    return len(rref(rows)[1])


def solve(a_rows, b) -> list[Fraction] | None:
    """One exact solution x of A x = b, or None when the system is inconsistent.

    Free unknowns are set to zero.
    """
    n_cols = len(a_rows[0]) if a_rows else 0
    aug = [list(row) + [bi] for row, bi in zip(a_rows, b, strict=True)]
    m, pivots = rref(aug)
    if n_cols in pivots:
        return None
    x = [Fraction(0)] * n_cols
    for i, c in enumerate(pivots):
        x[c] = m[i][n_cols]
    return x


def transpose(rows) -> Matrix:
    """Transpose of a matrix given as a list of rows."""
    return [list(col) for col in zip(*rows, strict=True)] if rows else []

"""Errors raised for bad input: each names the field, the value and what was expected."""

from __future__ import annotations

from fluids_props.units import UnitInputError
from fluids_props.validity import OutOfRangeError


class InputError(ValueError):
    """Bad user input. ``problems`` holds one line per problem (key path, value, expectation)."""

    def __init__(self, problems: str | list[str]):
        self.problems = [problems] if isinstance(problems, str) else list(problems)
        super().__init__("; ".join(self.problems))


class InfeasibleError(ValueError):
    """No model satisfies the request inside the facility; the message names the binding
    constraint and by how much it is violated."""


BAD_INPUT_ERRORS = (InputError, UnitInputError, OutOfRangeError, InfeasibleError)

__all__ = ["BAD_INPUT_ERRORS", "InfeasibleError", "InputError", "OutOfRangeError",
           "UnitInputError"]

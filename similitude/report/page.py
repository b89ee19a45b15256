"""Paper sizes and what every printed page of a workbook shows (light: no openpyxl).

The command line reads ``--paper`` with :func:`paper_name`; the workbook writers set up their
sheets from a :class:`PageSetup` (:func:`similitude.report.sheets.print_setup`).
"""

from __future__ import annotations

import importlib.metadata
from dataclasses import dataclass, field

from similitude.errors import InputError

#: Paper sizes a workbook can be set up for: name -> (OOXML paper code, width, height [mm]).
PAPER_SIZES = {"A4": (9, 210.0, 297.0), "letter": (1, 215.9, 279.4)}


def paper_name(text: str) -> str:
    """The key of :data:`PAPER_SIZES` named by ``text`` (any case: "a4", "Letter").

    Raises
    ------
    InputError
        Naming the value and the sizes known.
    """
    for name in PAPER_SIZES:
        if str(text).strip().lower() == name.lower():
            return name
    raise InputError(f"paper: {text!r} is not a paper size; expected one of "
                     + ", ".join(PAPER_SIZES))


def program_label() -> str:
    """``"similitude <version>"`` for page footers (the installed package's version)."""
    try:
        return f"similitude {importlib.metadata.version('similitude')}"
    except importlib.metadata.PackageNotFoundError:  # run from a source tree, not installed
        return "similitude (source tree)"


@dataclass(frozen=True)
class PageSetup:
    """How every sheet of a workbook prints.

    Attributes
    ----------
    title : str
        The case (or ship) name, printed at the left of every page header.
    paper : str
        A key of :data:`PAPER_SIZES` ("A4" or "letter").
    program : str
        Program and version, printed in every page footer.
    """

    title: str = ""
    paper: str = "A4"
    program: str = field(default_factory=program_label)

    def __post_init__(self) -> None:
        object.__setattr__(self, "paper", paper_name(self.paper))

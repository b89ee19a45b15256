"""What the commands share: the caution line, output-path checks, JSON text and "wrote" lines.

Kept light (no pandas, no openpyxl): :mod:`similitude.cli` imports it for every command.
"""

from __future__ import annotations

import argparse
import json
import os
from collections.abc import Iterable
from pathlib import Path
from typing import Any

from similitude.cautions import caution_line
from similitude.errors import InputError
from similitude.plain_data import plain, to_json
from similitude.report.page import PAPER_SIZES, paper_name

#: Printed under the top-level help: the outputs are estimates (each summary prints the caution
#: worded for its own kind of test, :func:`similitude.cautions.caution_line`).
CAUTION = caution_line()


def add_paper_option(parser) -> None:
    """``--paper``: the paper size the workbook's sheets are set up to print on."""
    parser.add_argument("--paper", metavar="SIZE", type=_paper, default="A4",
                        help="paper size the workbook prints on: "
                        + " or ".join(PAPER_SIZES) + " (default: %(default)s)")


def _paper(text: str) -> str:
    try:
        return paper_name(text)
    except InputError as exc:  # argparse prints it as the option's error, exit code 2
        raise argparse.ArgumentTypeError(str(exc).removeprefix("paper: ")) from exc


def workbook_path(text: str, option: str = "-o", example: str = "plan.xlsx") -> Path:
    """The path of a workbook option; it must end in .xlsx.

    Raises
    ------
    InputError
        Naming the option and the value, when the suffix is not .xlsx.
    """
    path = Path(text).expanduser()
    if path.suffix.lower() != ".xlsx":
        raise InputError(f"{option}: {text!r} does not end in .xlsx; expected a workbook path "
                         f"such as {example}")
    return path


def folder_files(text: str, option: str, stems: Iterable[str], suffix: str) -> list[Path]:
    """The files ``<stem><suffix>`` a folder option (``--csv DIR``) will hold.

    Raises
    ------
    InputError
        When the folder named is an existing file.
    """
    folder = Path(text).expanduser()
    if folder.exists() and not folder.is_dir():
        raise InputError(f"{option}: {text!r} is a file; expected a folder")
    return [folder / f"{stem}{suffix}" for stem in stems]


def check_targets(paths: Iterable[Path], force: bool) -> None:
    """Refuse, before any work, output files that are folders, exist (without ``--force``) or
    are workbooks in a missing folder; one line per problem.

    Raises
    ------
    InputError
    """
    problems = []
    for p in paths:
        if p.is_dir():
            problems.append(f"output: {str(p)!r} is a folder; expected a file path")
        elif os.path.lexists(p) and not force:  # a symbolic link counts, even a dangling one
            what = "is a symbolic link" if p.is_symlink() else "exists"
            problems.append(f"output: {str(p)!r} {what}; not overwritten (use --force)")
        elif not p.parent.exists() and p.suffix == ".xlsx":
            problems.append(f"output: folder {str(p.parent)!r} does not exist; expected an "
                            "existing folder")
    if problems:
        raise InputError(problems)


def json_text(data: Any, keep_unicode: bool = False) -> str:
    """Strict JSON text of ``data`` for ``--json`` (through :mod:`similitude.plain_data`).

    ``keep_unicode`` writes non-ASCII text as it is instead of ``\\u`` escapes: the groups and
    balance commands echo the user's own symbols (``ρ``, ``ν``).
    """
    if not keep_unicode:
        return to_json(data)
    return json.dumps(plain(data), indent=2, allow_nan=False, ensure_ascii=False)


def print_written(paths: Iterable[Path]) -> None:
    """One line ``wrote PATH`` per file written."""
    for p in paths:
        print(f"wrote {p}")

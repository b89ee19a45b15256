"""Command line: ``similitude <command> ...`` (also ``python -m similitude``).

Each command lives in ``similitude/commands/<name>.py`` with ``add_parser(subparsers)`` and
``run(args) -> int``. Exit codes: 0 success, 2 bad input (one line per problem on stderr, never a
traceback), 1 anything else.
"""

from __future__ import annotations

import argparse
import importlib
import sys

from similitude.commands.common import CAUTION
from similitude.errors import BAD_INPUT_ERRORS, InputError

COMMANDS = ("plan", "campaign", "props", "groups", "balance", "extrapolate")


def commands_to_load(argv: list[str]) -> tuple[str, ...]:
    """The commands whose modules a run needs: the one ``argv`` names, else all of them.

    Only the named command's module is imported, so a run loads no other command's stages;
    the top-level help, a missing or an unknown command get every parser (argparse lists them).
    """
    for arg in argv:
        if arg == "--debug":  # the one top-level option that may stand before the command
            continue
        return (arg,) if arg in COMMANDS else COMMANDS
    return COMMANDS


def build_parser(names: tuple[str, ...] = COMMANDS) -> argparse.ArgumentParser:
    """The argument parser with the sub-commands ``names`` (default: all)."""
    parser = argparse.ArgumentParser(
        prog="similitude",
        description="Plan scale-model tests: fluid properties, dimensionless groups, model "
        "scale and speed, facility checks, run-matrix workbook, extrapolation to full scale.",
        epilog=CAUTION,
    )
    parser.add_argument("--debug", action="store_true", help="show tracebacks of failures")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND")
    for name in names:
        # imported by name, on demand: each command module pulls in the stages it needs
        importlib.import_module(f"similitude.commands.{name}").add_parser(sub)
    return parser


def main(argv: list[str] | None = None) -> int:
    """Run the command line; returns the exit code."""
    argv = sys.argv[1:] if argv is None else list(argv)
    parser = build_parser(commands_to_load(argv))
    try:
        args = parser.parse_args(argv)
    except SystemExit as exc:  # argparse: --help (0) or usage error (2)
        return int(exc.code or 0)
    if not args.command:
        parser.print_help()
        return 2
    try:
        return int(args.func(args) or 0)
    except BAD_INPUT_ERRORS as exc:
        # an infeasible campaign says why on several lines
        problems = exc.problems if isinstance(exc, InputError) else (
            str(exc).splitlines() or [str(exc)])
        for line in problems:
            print(f"error: {line}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        print("error: interrupted", file=sys.stderr)
        return 1
    except Exception as exc:  # anything else: one line, traceback only on request
        if args.debug:
            raise
        print(f"error: {exc.__class__.__name__}: {exc}", file=sys.stderr)
        return 1


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())

"""What each command does, as functions the CLI calls with its parsed arguments.

Each returns an exit code and prints only what the user must read. User errors never end in
a traceback: they are the project's own exceptions, printed as messages.
"""

from __future__ import annotations

import argparse
import sys

from rating.errors import PintrussError

EXIT_OK = 0
EXIT_INPUT = 1
EXIT_USAGE = 2


def _fail(exc: PintrussError) -> int:
    print(f"pintruss: {exc}", file=sys.stderr)
    return EXIT_INPUT


def run_template(args: argparse.Namespace) -> int:
    from rating.inventory.template import write_template

    try:
        write_template(args.path, force=args.force)
    except PintrussError as exc:
        return _fail(exc)
    print(f"wrote blank inspection workbook: {args.path}")
    return EXIT_OK


def run_check(args: argparse.Namespace) -> int:
    from rating.inventory.reader import read_workbook

    try:
        reading = read_workbook(args.workbook)
    except PintrussError as exc:
        return _fail(exc)
    for problem in reading.problems:
        print(problem.format())
    if reading.errors:
        print(f"{len(reading.errors)} error(s), {len(reading.warnings)} warning(s)")
        return EXIT_INPUT
    print(f"{args.workbook}: no errors, {len(reading.warnings)} warning(s)")
    return EXIT_OK

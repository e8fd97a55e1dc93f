"""Command line: parses arguments, calls the pieces, sets exit codes. Nothing else.

Exit codes: 0 success; 1 input problems (listed with Sheet!Cell); 2 usage errors.
"""

from __future__ import annotations

import argparse
import sys
from collections.abc import Sequence
from pathlib import Path

from rating.process import settle_process

EXIT_OK = 0
EXIT_INPUT = 1
EXIT_USAGE = 2


def _parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(
        prog="pintruss",
        description=(
            "Load rating (LRFR) of existing pin-connected truss bridges from an inspection "
            "workbook. Results are an aid to the licensed engineer in responsible charge, "
            "not a substitute for that engineer's judgement."
        ),
    )
    sub = p.add_subparsers(dest="command", metavar="COMMAND")

    t = sub.add_parser("template", help="write a blank inspection workbook to fill in",
                       description="Write a blank inspection workbook with instructions, "
                       "dropdown lists and marked example rows.")
    t.add_argument("path", type=Path, help="where to write the new workbook (.xlsx)")
    t.add_argument("--force", action="store_true",
                   help="replace the file if it already exists (never done without this)")
    t.epilog = ("Exit status: 0 written; 1 it could not be written (a full disk, a folder "
                "that may not be written to); 2 the command was misused (the file exists "
                "and --force was not given, a folder, a name not ending in .xlsx, a folder "
                "that does not exist).")

    c = sub.add_parser("check", help="check an inspection workbook without rating it",
                       description="Validate the workbook: every problem is listed with its "
                       "Sheet!Cell. Exit 0 when clean, 1 when there are problems.")
    c.add_argument("workbook", type=Path, help="the inspection workbook (.xlsx)")

    r = sub.add_parser("rate", help="rate a bridge from its inspection workbook",
                       description="Rate every truss member and pin for every chosen vehicle, "
                       "recommend posting or closing for the engineer's decision, and write "
                       "the rating report (HTML) and the results file (JSON).",
                       epilog="Exit status: 0 rated; 1 the workbook has problems (each listed "
                       "with its Sheet!Cell), or it was rated but writing the outputs failed "
                       "(a full disk); 2 the command was misused, found before rating (an "
                       "unknown option or vehicle id, an --out that is a file or a folder "
                       "that cannot be written to, a --previous that is no results file of "
                       "this bridge).")
    r.add_argument("workbook", type=Path, help="the inspection workbook (.xlsx)")
    r.add_argument("--out", type=Path, default=None,
                   help="folder for the report and results (default: beside the workbook)")
    r.add_argument("--json", type=Path, default=None, dest="json_path",
                   help="write the results file to this path")
    r.add_argument("--vehicles", default=None,
                   help="comma-separated vehicle ids to rate (default: the workbook's choice, "
                   "else the whole library); see 'pintruss vehicles'")
    r.add_argument("--no-report", action="store_true", help="write the results file only")
    r.add_argument("--paper", choices=("letter", "a4", "auto"), default=None,
                   help="page size of the printed report (default: Letter for US units, A4 "
                   "for SI)")
    r.add_argument("--previous", type=Path, default=None, metavar="RESULTS",
                   help="the results file (*.rating.json) of this bridge's previous rating: "
                   "the report then says what changed since (postings, the members and pins "
                   "that rate lower or higher, the findings on them); read only, never "
                   "written over")

    v = sub.add_parser("vehicles", help="list the rating vehicles in the library with sources",
                       description="List the rating vehicles: id, axle loads, spacings, gross "
                       "weight and the source of each.")
    v.add_argument("--json", action="store_true", help="print as JSON")

    b = sub.add_parser("batch", help="rate every workbook in a folder",
                       description="Rate every workbook in a folder and its sub-folders, "
                       "carrying on past bad ones, and write each bridge's report and results "
                       "(in the same sub-folders of --out) and a summary table (summary.csv "
                       "and index.html in --out).",
                       epilog="Exit status: 0 every workbook was rated; 1 a workbook was not "
                       "rated (each is listed in the summary with its problems); 2 the "
                       "command was misused (no such folder, an --out that is a file, "
                       "--workers below 1, a --previous that is no folder or is --out).")
    b.add_argument("folder", type=Path,
                   help="folder holding the inspection workbooks (sub-folders included)")
    b.add_argument("--out", type=Path, required=True, help="folder for reports and the summary")
    b.add_argument("--workers", type=int, default=None, help="processes (default: cores)")
    b.add_argument("--vehicles", default=None,
                   help="comma-separated vehicle ids to rate on every bridge (default: each "
                   "workbook's choice, else the whole library)")
    b.add_argument("--previous", type=Path, default=None, metavar="FOLDER",
                   help="the --out folder of an earlier batch: each bridge is compared with "
                   "its results file there (same sub-folder and name, else the one file "
                   "that rates the same structure id), and the summary says what changed; "
                   "read only, so it must not be this batch's --out")
    return p


def main(argv: Sequence[str] | None = None) -> int:
    parser = _parser()
    try:
        args = parser.parse_args(argv)
    except SystemExit as exc:  # argparse exits 2 on usage errors, 0 on --help
        return int(exc.code or 0)
    if args.command is None:
        parser.print_help()
        return EXIT_USAGE
    settle_process()
    from rating import commands

    handler = getattr(commands, f"run_{args.command}")
    try:
        return int(handler(args))
    except BrokenPipeError:  # output piped into a pager or head that closed early
        sys.stderr.close()
        return EXIT_OK


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())

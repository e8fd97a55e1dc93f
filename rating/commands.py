"""What each command does, as functions the CLI calls with its parsed arguments.

Each returns an exit code and prints only what the user must read. User errors never end in
a traceback: they are the project's own exceptions, printed as messages.
"""

from __future__ import annotations

import argparse
import os
import sys

from rating.errors import PintrussError, UsageError

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
    except UsageError as exc:  # (an existing file without --force, a folder: exit 2)
        print(f"pintruss: {exc}", file=sys.stderr)
        return EXIT_USAGE
    except PintrussError as exc:  # (the disk full, a folder we may not write to)
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


def _same_file(a, b) -> bool:
    from pathlib import Path

    try:
        return Path(a).resolve() == Path(b).resolve()
    except OSError:
        return False


def _not_writable(path: os.PathLike[str] | str, option: str, folder: bool = False
                  ) -> str | None:
    """Why ``path`` (given with ``option``) cannot take an output file, or be the folder of
    outputs when ``folder``, found before any rating is done; None where nothing is wrong."""
    from pathlib import Path

    path = Path(path)
    if path.exists():
        if folder and not path.is_dir():
            return f"{option} {path} is a file, not a folder"
        if not folder and path.is_dir():
            return f"{option} {path} is a folder, not a file name"
    for parent in path.parents:  # the nearest folder that exists must be one
        if parent.exists():
            return None if parent.is_dir() else f"{option} {path}: {parent} is a file, not a folder"
    return None


def run_rate(args: argparse.Namespace) -> int:
    from rating.pipeline import (
        VEHICLES_OPTION,
        output_paths,
        rate_workbook,
        write_atomic,
        write_outputs,
    )
    from rating.results import reported_rf, results_json

    workbook = args.workbook
    if not workbook.is_file():
        what = "is a folder, not a workbook file" if workbook.is_dir() else "does not exist"
        print(f"pintruss: no workbook at {workbook}: it {what}", file=sys.stderr)
        return EXIT_INPUT
    vehicle_ids = None
    if args.vehicles:
        vehicle_ids = [v.strip() for v in args.vehicles.split(",") if v.strip()]
        if not vehicle_ids:
            print("pintruss: --vehicles names no vehicle", file=sys.stderr)
            return EXIT_USAGE
    html_path, json_path = output_paths(workbook, args.out)
    targets = [(json_path, "results file")] + ([] if args.no_report else [(html_path, "report")])
    if args.json_path is not None:
        targets.append((args.json_path, "--json"))
    for t, _ in targets:
        if _same_file(t, workbook):
            print(f"pintruss: refusing to write {t}: it is the input workbook", file=sys.stderr)
            return EXIT_USAGE
    problems = [_not_writable(args.out, "--out", folder=True)] if args.out is not None else []
    problems += [_not_writable(t, what) for t, what in targets]
    previous_path = getattr(args, "previous", None)
    if previous_path is not None:
        problems += [f"refusing to write {t}: it is the previous results file given with "
                     "--previous (read only; give --out or --json elsewhere)"
                     for t, _ in targets if _same_file(t, previous_path)]
    problem = next((p for p in problems if p is not None), None)
    if problem is not None:
        print(f"pintruss: {problem}; nothing was rated or written", file=sys.stderr)
        return EXIT_USAGE
    previous = None
    if previous_path is not None:
        from rating.previous import read_previous

        try:
            previous = read_previous(previous_path)
        except PintrussError as exc:
            print(f"pintruss: --previous {exc}; nothing was rated or written", file=sys.stderr)
            return EXIT_USAGE
    outcome = rate_workbook(workbook, vehicle_ids)
    for problem in outcome.problems:
        print(problem.format(), file=sys.stderr)
    if outcome.results is None:
        print(f"pintruss: {workbook} was not rated: {len(outcome.errors)} error(s) listed above",
              file=sys.stderr)
        earlier = [p for p in (html_path, json_path) if p.exists()]
        if earlier:  # never removed (nothing the user has is lost), but never mistaken
            print("pintruss: " + " and ".join(str(p) for p in earlier)
                  + f" {'is' if len(earlier) == 1 else 'are'} from an earlier run and "
                  "do not reflect this workbook as it is now", file=sys.stderr)
        # an id on the command line that names no vehicle is a usage error, not the workbook's
        return EXIT_USAGE if any(p.where == VEHICLES_OPTION for p in outcome.errors) \
            else EXIT_INPUT
    res = outcome.results
    if previous is not None:
        import dataclasses

        from rating.previous import compare, same_bridge

        if not same_bridge(previous.bridge_id, res.bridge.id):
            print(f"pintruss: --previous {previous_path}: it is the rating of bridge "
                  f"{previous.bridge_id!r}, not of {res.bridge.id!r} (this workbook's "
                  "structure id); nothing was written", file=sys.stderr)
            return EXIT_USAGE
        try:
            res = dataclasses.replace(res, previous=compare(res, previous))
        except Exception as exc:  # a fault of the program: the rating is written without it
            print(f"pintruss: internal error in pintruss while comparing with --previous "
                  f"{previous_path} ({type(exc).__name__}: {exc}); please report it. The "
                  "rating is written without the comparison.", file=sys.stderr)
    try:
        html, js = write_outputs(res, html_path.parent, workbook.stem,
                                 report=not args.no_report, paper=args.paper)
        if args.json_path is not None:
            write_atomic(args.json_path, results_json(res))
            js = args.json_path
    except OSError as exc:  # a full disk, a folder we may not write to: each file is whole
        # or absent (written through a temporary file and a rename)
        print(f"pintruss: {workbook} was rated, but the outputs could not be written: "
              f"{exc}", file=sys.stderr)
        return EXIT_INPUT
    print(f"{res.bridge.id} {res.bridge.name}")
    import math

    from rating.report.display import display_for
    from rating.report.view import action_text

    d = display_for(res)
    level = {v.id: v.rating_level for v in res.vehicles}
    category = {v.id: v.category for v in res.vehicles}
    for vid, p in res.posting.items():
        # rounded down, as in the report: 0.996 is never shown as 1.00
        rf = ("no live load" if p.rf == math.inf else "-inf" if p.rf == -math.inf
              else f"{reported_rf(p.rf):.2f}")
        # the action in the report's words (never "none" beside an RF below 1.0)
        print(f"  {vid:<12} RF {rf:>6}  controlled by {p.member or '-':<10} "
              f"{action_text(p, level.get(vid, ''), d, category.get(vid, ''))}")
    print(f"recommendation: {res.recommendation}")
    if res.previous is not None:
        print(res.previous.headline)
    if html is not None:
        print(f"report:  {html}")
    print(f"results: {js}")
    return EXIT_OK


def run_vehicles(args: argparse.Namespace) -> int:
    import json

    from rating.vehicles.library import library, rating_loads

    if not args.json:
        print("Rating loads (ids for --vehicles; the ids of the vehicles listed after them "
              "are taken too, each rated on its own):")
        for load in rating_loads():
            models = "; ".join(m.name for m in load.models)
            # (the parts only where they say more than the name)
            parts = f": {models}" if models != load.name else ""
            span = (f", spans over {load.min_span_ft:g} ft only"
                    if load.min_span_ft and "spans over" not in load.name else "")
            print(f"  {load.id:<12} {load.name} [{load.category.value}]{parts}"
                  f"{span}; W = {load.gross_weight_tons:g} tons")
        print("\nVehicles in the library:")
    rows = []
    for v in library():
        spacing = ", ".join(f"{s.min_ft:g}" if not s.is_variable else f"{s.min_ft:g}-{s.max_ft:g}"
                            for s in v.spacings)
        rows.append({"id": v.id, "name": v.name, "category": v.category.value,
                     "axle_loads_kip": list(v.axle_loads_kip), "spacings_ft": spacing,
                     "lane_load_klf": v.lane_load_klf, "gross_weight_tons": v.gross_weight_tons,
                     "source": v.source, "tag": v.tag})
    if args.json:
        print(json.dumps(rows, indent=2))
        return EXIT_OK
    for r in rows:
        axles = " / ".join(f"{a:g}" for a in r["axle_loads_kip"]) or "-"
        lane = f", lane {r['lane_load_klf']:g} klf" if r["lane_load_klf"] else ""
        print(f"{r['id']:<12} {r['name']} [{r['category']}]")
        print(f"{'':12} axles {axles} kip at {r['spacings_ft'] or '-'} ft{lane}; "
              f"W = {r['gross_weight_tons']:g} tons")
        print(f"{'':12} source: {r['source']} ({r['tag']})")
    return EXIT_OK


def run_batch(args: argparse.Namespace) -> int:
    """Rate every workbook in a folder; exit 0 when all were rated, 1 when any was not."""
    from rating.batch import print_summary, rate_folder

    if not args.folder.is_dir():
        print(f"pintruss: there is no folder {args.folder}", file=sys.stderr)
        return EXIT_USAGE
    if args.workers is not None and args.workers < 1:
        print("pintruss: --workers must be 1 or more", file=sys.stderr)
        return EXIT_USAGE
    blocked = next((q for q in (args.out, *args.out.parents)
                    if q.exists() and not q.is_dir()), None)
    if blocked is not None:
        print(f"pintruss: --out {args.out}: {blocked} is a file, not a folder; nothing was "
              "rated or written", file=sys.stderr)
        return EXIT_USAGE
    vehicle_ids = None
    if getattr(args, "vehicles", None):
        vehicle_ids = [v.strip() for v in args.vehicles.split(",") if v.strip()] or None
        if vehicle_ids is None:
            print("pintruss: --vehicles names no vehicle", file=sys.stderr)
            return EXIT_USAGE
        from rating.vehicles.library import known_ids

        known = known_ids()
        for vid in vehicle_ids:
            if vid.casefold() not in known:  # (it may be an owner's vehicle on the workbooks)
                print(f"pintruss: note: {vid} is not in the vehicle library, so it must be an "
                      "owner's vehicle on each workbook's Vehicles sheet; a workbook without "
                      "it is not rated (see 'pintruss vehicles')", file=sys.stderr)
    previous = getattr(args, "previous", None)
    if previous is not None and not previous.is_dir():
        print(f"pintruss: --previous {previous}: there is no such folder (give the --out "
              "folder of an earlier batch); nothing was rated or written", file=sys.stderr)
        return EXIT_USAGE
    if previous is not None and _same_file(previous, args.out):
        print(f"pintruss: --previous {previous} is this batch's --out folder: its results "
              "files would be written over; give another --out. Nothing was rated or "
              "written", file=sys.stderr)
        return EXIT_USAGE
    try:
        summary = rate_folder(args.folder, args.out, workers=args.workers,
                              vehicle_ids=vehicle_ids, progress=sys.stderr,
                              previous=previous)
    except PintrussError as exc:
        return _fail(exc)
    print_summary(summary)
    return EXIT_OK if not summary.failed else EXIT_INPUT

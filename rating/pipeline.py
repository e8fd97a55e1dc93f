"""The whole chain for one workbook: read -> rate -> results -> report and JSON files.

This is the top of the data flow (like the CLI it may call every layer); nothing calls back
into it except the CLI and the batch runner.
"""

from __future__ import annotations

import os
import tempfile
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING

from rating.errors import ConvergenceError, InputError, PintrussError
from rating.results import RatingResults, bears_on_the_decision, results_json

if TYPE_CHECKING:  # the reader's package is imported where a workbook is read, so that
    # writing files (the batch's summary, in the parent process) does not load it
    from rating.inventory.problems import Problem


@dataclass(frozen=True)
class RateOutcome:
    """Results when the workbook could be rated; every problem found either way."""

    workbook: Path
    results: RatingResults | None
    problems: tuple[Problem, ...]

    @property
    def errors(self) -> tuple[Problem, ...]:
        return tuple(p for p in self.problems if p.severity == "error")


def rate_workbook(path: Path, vehicle_ids: Sequence[str] | None = None) -> RateOutcome:
    """Read and rate one inspection workbook. User errors become problems, never tracebacks."""
    from rating.inventory.problems import Problem
    from rating.inventory.reader import read_workbook
    from rating.lrfr.engine import rate_bridge
    from rating.results_build import build_results

    path = Path(path)
    try:
        reading = read_workbook(path)
    except PintrussError as exc:
        return RateOutcome(path, None, (Problem("error", _where(exc, path), _message(exc)),))
    problems = tuple(reading.problems)
    if reading.bridge is None or reading.errors:
        return RateOutcome(path, None, problems)
    unknown = _unknown_vehicles(vehicle_ids or (), reading.bridge.owner_vehicles)
    if unknown:
        return RateOutcome(path, None, problems + tuple(
            Problem("error", VEHICLES_OPTION, message) for message in unknown))
    try:
        rating = rate_bridge(reading.bridge, vehicle_ids)
    except (InputError, ConvergenceError) as exc:
        return RateOutcome(path, None, problems + (Problem("error", _where(exc, path),
                                                           _message(exc)),))
    warnings = tuple(_located(p.where, p.message) for p in reading.warnings)
    results = build_results(rating, extra_warnings=warnings,
                            extra_assumptions=tuple(reading.assumptions))
    return RateOutcome(path, results, problems)


def _located(where: str, message: str) -> str:
    """A workbook warning for the results, with its place: after the head of a warning that
    bears on the decision (``"NO DECK DEAD LOAD: DeadLoads!A4: ..."``), so that the results
    still know it as one (rating.results.bears_on_the_decision), else before it."""
    if bears_on_the_decision(message):
        head, _, rest = message.partition(": ")
        return f"{head}: {where}: {rest}"
    return f"{where}: {message}"


VEHICLES_OPTION = "--vehicles"
"""Where a problem with the vehicles asked for on the command line is reported: the ids are
the user's words, not the workbook's, so the problem names the option, not a cell."""


def _unknown_vehicles(vehicle_ids: Sequence[str], owner_vehicles: Sequence) -> list[str]:
    """A message for each id that is neither a shipped rating load or vehicle nor one of the
    workbook's own vehicles."""
    from rating.vehicles.library import rating_load

    out = []
    for vid in vehicle_ids:
        try:
            rating_load(vid, owner_vehicles)
        except InputError as exc:
            out.append(_message(exc))
    return out


def _where(exc: PintrussError, path: Path) -> str:
    w = getattr(exc, "where", None)
    return w or path.name


def _message(exc: PintrussError) -> str:
    return getattr(exc, "message", None) or str(exc)


def write_atomic(target: Path, text: str) -> None:
    """Write ``text`` to ``target`` through a temporary file and a rename (never half a file)."""
    target = Path(target)
    target.parent.mkdir(parents=True, exist_ok=True)
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=target.parent)
    try:
        with os.fdopen(fd, "wb") as fh:  # UTF-8, newlines as they are
            fh.write(text.encode("utf-8"))
        umask = os.umask(0)
        os.umask(umask)
        os.chmod(tmp, 0o666 & ~umask)  # an ordinary file, not mkstemp's private 0600
        os.replace(tmp, target)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise


def output_paths(workbook: Path, out_dir: Path | None) -> tuple[Path, Path]:
    """Report and JSON paths for a workbook: beside it, or in ``out_dir``."""
    folder = Path(out_dir) if out_dir is not None else Path(workbook).resolve().parent
    stem = Path(workbook).stem
    return folder / f"{stem}.rating.html", folder / f"{stem}.rating.json"


def write_outputs(results: RatingResults, out_dir: Path, stem: str,
                  report: bool = True, paper: str | None = None) -> tuple[Path | None, Path]:
    """Write the report (HTML) and the results (JSON) atomically; returns their paths."""
    out_dir = Path(out_dir)
    json_path = out_dir / f"{stem}.rating.json"
    html_path = html = None
    # both made before either is written: a failure in making the report leaves no new
    # results file beside an earlier report
    text = results_json(results)
    if report:
        from rating.report.html import render_report

        html_path = out_dir / f"{stem}.rating.html"
        html = render_report(results, paper=paper)
    write_atomic(json_path, text)
    if html_path is not None and html is not None:
        write_atomic(html_path, html)
    return html_path, json_path

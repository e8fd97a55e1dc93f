"""Batch rating: every inspection workbook in a folder, on a pool of processes.

Each workbook is rated by the same pipeline as ``pintruss rate`` and gets its own report and
results file in the output folder. A workbook that cannot be rated does not stop the batch:
its problems are recorded and it is listed in the summary. The summary is written twice, as
a CSV table (``summary.csv``) and as an HTML index (``index.html``) linking every report.
Every file is written atomically (temporary file + rename) and no output may replace an
input workbook.

Like the pipeline, this module sits at the top of the data flow; nothing calls back into it
except the command line.
"""

from __future__ import annotations

import csv
import gc
import io
import math
import multiprocessing
import os
import sys
import time
import urllib.parse
from collections.abc import Callable, Mapping, Sequence
from concurrent.futures import ProcessPoolExecutor, as_completed
from concurrent.futures.process import BrokenProcessPool
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any, TextIO

from rating.errors import InputError
from rating.process import GC_THRESHOLDS, settle_process
from rating.results import (
    CLOSING_UNLESS,
    DECISION_NOTE,
    EMERGENCY,
    UNTIL_CONFIRMED,
    overall_action,
    permit_words,
    reported_rf,
)

SUMMARY_CSV = "summary.csv"
INDEX_HTML = "index.html"


# ------------------------------------------------------------------ what one workbook gave


EV_ONLY = "post emergency vehicles"
"""A bridge's action where only emergency vehicles are posted or barred (its trucks rate 1.0
or more): not a truck posting (rating.results.overall_action says "post")."""


@dataclass(frozen=True)
class VehicleLine:
    """The controlling rating of one vehicle on one bridge (values in the bridge's units)."""

    vehicle: str
    name: str
    level: str
    rf: float | None
    member: str
    action: str  # "none", "post", "close", "bar" (an emergency vehicle that cannot be
    # posted), "not posted" (a screening load below 1.0), "design-load rating" (HL-93) or
    # the words of rating.results.permit_words (a permit load)
    posting: float | None  # safe posting load, display weight unit, whole units
    category: str = ""  # the vehicle's category (rating.results.VehicleResult.category)


@dataclass(frozen=True)
class BridgeRow:
    """One workbook of the batch: rated (with its vehicles) or not (with its problems)."""

    workbook: str
    rated: bool
    structure: str = ""
    name: str = ""
    location: str = ""
    inspection_date: str = ""
    weight_unit: str = "ton"
    vehicles: tuple[VehicleLine, ...] = ()
    recommendation: str = ""
    action: str = ""  # "none" | "post" | "close" over the legal loads, or EV_ONLY
    report: str = ""  # file name in the output folder
    results_file: str = ""
    errors: tuple[str, ...] = ()
    warnings: tuple[str, ...] = ()
    seconds: float = 0.0
    decision_warnings: tuple[str, ...] = ()  # the rating's warnings that bear on the posting
    # decision (rating.results.bears_on_the_decision), repeated beside the recommendation
    stale: tuple[str, ...] = ()  # a workbook not rated this run: its outputs in the output
    # folder from an earlier run (kept, never removed, but never to be mistaken for this one)
    since: str = ""  # the change since the previous rating (batch --previous), in one
    # sentence (rating.previous.headline), or why there is none
    worse: bool = False  # an outcome worse than at the previous rating
    # (rating.previous.worse_since)

    @property
    def conditional(self) -> bool:
        """The recommendation rests on a condition the engineer should confirm ("Consider
        closing the bridge unless ... is confirmed ...", "Until ... is confirmed, ...":
        rating.results_build.recommendation; "Only if", as results of earlier versions
        worded it)."""
        return self.recommendation.startswith(("Only if ", UNTIL_CONFIRMED, CLOSING_UNLESS))

    @property
    def closure_to_consider(self) -> bool:
        """A closure to consider: a truck's rating calls for it, or the recommendation leads
        with it until a condition is confirmed (rating.results_build.CLOSING_UNLESS)."""
        return self.action == "close" or self.recommendation.startswith(CLOSING_UNLESS)

    def lowest_legal(self) -> VehicleLine | None:
        """The vehicle that decides the bridge's action: among the trucks (legal loads, SHVs
        and owner vehicles) the lowest RF of those calling for closing, else the lowest posting
        (the single weight limit); else a barred emergency vehicle (the bridge's "post" is then
        its barring: rating.results.overall_action); else the lowest RF of a truck that could
        be posted. (The lowest RF alone may be a posted truck while a lighter one closes the
        bridge by the 3-ton rule.)"""
        legal = [v for v in self.vehicles if v.level == "legal" and v.rf is not None
                 and v.category != EMERGENCY]

        def rf(v: VehicleLine) -> float:
            return v.rf if v.rf is not None else math.inf

        closing = [v for v in legal if v.action == "close"]
        if closing:
            return min(closing, key=rf)
        posted = [v for v in legal if v.action == "post" and v.posting is not None]
        if posted:
            return min(posted, key=lambda v: v.posting)  # (the first of equal postings, in
            # the vehicles' order, as the report's single weight limit names it)
        barred = [v for v in self.vehicles if v.action == "bar" and v.rf is not None]
        if barred:  # the bridge's "post" is an emergency vehicle's barring alone
            return min(barred, key=rf)
        # (not a screening load: it is never posted, so it decides nothing)
        return min((v for v in legal if v.action != "not posted"), key=rf, default=None)


@dataclass(frozen=True)
class BatchSummary:
    """The outcome of a batch: input and output folders, one row per workbook in name order, the
    paths of the summary CSV and HTML index, the batch's time (s) and the number of processes."""

    folder: Path
    out_dir: Path
    rows: tuple[BridgeRow, ...]
    csv_path: Path
    index_path: Path
    seconds: float
    workers: int
    others: tuple[str, ...] = ()  # rating files in the output folder from no workbook of
    # this run (an earlier run of another folder, a workbook since renamed)

    @property
    def rated(self) -> tuple[BridgeRow, ...]:
        return tuple(r for r in self.rows if r.rated)

    @property
    def failed(self) -> tuple[BridgeRow, ...]:
        return tuple(r for r in self.rows if not r.rated)


@dataclass(frozen=True)
class _Task:
    """One workbook to rate: its path, the output folder and file stem, the vehicles asked for
    (None: all), and stand-ins for the pipeline's rate and write (tests)."""

    workbook: Path
    out_dir: Path
    stem: str
    vehicle_ids: tuple[str, ...] | None
    rate: Callable[..., Any] | None = None
    write: Callable[..., Any] | None = None
    label: str = ""  # the workbook's path within the folder rated ("north/a.xlsx")
    root: Path | None = None  # the batch's output folder (``out_dir`` mirrors sub-folders)
    previous: Path | None = None  # the results file of its previous rating (batch
    # --previous), which need not exist
    previous_by_id: Mapping[str, tuple[str, ...]] | None = None  # the --previous folder's
    # results files by structure id (rating.previous.results_by_bridge), for a workbook
    # renamed or moved since

    @property
    def name(self) -> str:
        return self.label or self.workbook.name


# ------------------------------------------------------------------ finding the workbooks

def find_workbooks(folder: Path) -> tuple[Path, ...]:
    """The inspection workbooks (*.xlsx) in ``folder`` and its sub-folders (a county may file
    its bridges by township), sorted by their path within it; Excel's lock files (``~$name``)
    and hidden files and folders are skipped."""
    folder = Path(folder)
    if not folder.is_dir():
        raise InputError(f"there is no folder {folder}", where=str(folder))
    books = []
    for dirpath, dirnames, filenames in os.walk(folder):
        dirnames[:] = sorted(d for d in dirnames if not d.startswith("."))
        # (a broken link is listed too: rated, it is recorded as not readable, never passed
        # over without a word)
        books += [Path(dirpath) / f for f in filenames
                  if f.lower().endswith(".xlsx") and not f.startswith(("~$", "."))
                  and ((Path(dirpath) / f).is_file() or (Path(dirpath) / f).is_symlink())]
    return tuple(sorted(books, key=lambda p: (workbook_label(p, folder).lower(),
                                              workbook_label(p, folder))))


def workbook_label(book: Path, folder: Path) -> str:
    """The workbook's path within the folder rated, as the summary names it ("north/a.xlsx";
    the file name alone for one directly in the folder)."""
    try:
        return book.relative_to(folder).as_posix()
    except ValueError:
        return book.name


def output_stems(workbooks: Sequence[Path], folder: Path | None = None) -> tuple[str, ...]:
    """One output stem per workbook, unique even where names differ only in case: its path
    within ``folder`` without the suffix ("north/a" for north/a.xlsx), so the outputs mirror
    the sub-folders."""
    used: set[str] = set()
    out = []
    for wb in workbooks:
        rel = wb.name if folder is None else workbook_label(wb, folder)
        base = rel[: -len(wb.suffix)] if wb.suffix else rel
        stem, n = base, 1
        while stem.lower() in used:
            n += 1
            stem = f"{base}-{n}"
        used.add(stem.lower())
        out.append(stem)
    return tuple(out)


# ------------------------------------------------------------------ one workbook (worker)

def _worker_setup() -> None:
    """Pool initializer: the settings of a rating process (rating.process.settle_process:
    one numeric thread per process, the pool being the parallelism; the collector run less
    often)."""
    settle_process()


def _row_from_results(workbook: Path, results: Any, html: Path | None, js: Path,
                      problems: Sequence[Any], seconds: float, name: str = "",
                      root: Path | None = None) -> BridgeRow:
    from rating.report.display import display_for

    d = display_for(results)
    vehicles = []
    for v in results.vehicles:
        entry = results.posting.get(v.id)
        rf = entry.rf if entry is not None else None
        if rf is not None and (math.isnan(rf) or rf == math.inf):
            rf = None  # no live-load effect: no rating factor
        posting = None
        if entry is not None and entry.action == "post" and entry.posting_tons is not None:
            posting = float(math.floor(d.convert(entry.posting_tons, "weight") + 1e-6))
        action = entry.action if entry is not None else ""
        if entry is not None and entry.not_posted_below_one(v.rating_level):
            action = "not posted"  # as in the report
        if action == "close" and v.category == EMERGENCY:
            action = "bar"  # an emergency vehicle that cannot be posted: not a closure
        if action == "none" and v.rating_level in ("inventory", "operating"):
            action = "design-load rating"  # as in the report: HL-93 is never posted
        if entry is not None and v.rating_level == "permit":
            action = permit_words(entry)  # as in the report: a permit is never posted
        vehicles.append(VehicleLine(v.id, v.name, v.rating_level, rf,
                                    entry.member if entry is not None else "", action,
                                    posting, v.category))
    action = overall_action((results.posting[v.id].action, v.category)
                            for v in results.vehicles
                            if v.rating_level == "legal" and v.id in results.posting)
    if action == "post" and not any(v.action in ("post", "close") for v in vehicles
                                    if v.category != EMERGENCY):
        action = EV_ONLY  # the trucks rate 1.0 or more: the sign is for emergency vehicles
    b = results.bridge
    return BridgeRow(
        workbook=name or workbook.name, rated=True, structure=b.id, name=b.name,
        location=b.location,
        inspection_date=b.inspection_date or "", weight_unit=d.unit("weight"),
        vehicles=tuple(vehicles), recommendation=results.recommendation, action=action,
        report=_relative(html, root) if html is not None else "",
        results_file=_relative(js, root),
        errors=(), warnings=tuple(p.format() for p in problems if p.severity != "error"),
        seconds=seconds,
        decision_warnings=results.decision_warnings)


def _relative(path: Path, root: Path | None) -> str:
    """An output's path within the batch's output folder ("north/a.rating.html")."""
    if root is not None:
        try:
            return path.relative_to(root).as_posix()
        except ValueError:
            pass
    return path.name


def rate_one(task: _Task) -> BridgeRow:
    """Rate one workbook and write its report and results; never raises for a bad workbook."""
    t0 = time.perf_counter()
    wb, name = task.workbook, task.name
    try:
        if task.rate is None or task.write is None:
            from rating.pipeline import rate_workbook, write_outputs
        rate = task.rate or rate_workbook
        write = task.write or write_outputs
        outcome = rate(wb, list(task.vehicle_ids) if task.vehicle_ids else None)
        problems = tuple(outcome.problems)
        if outcome.results is None:
            errors = tuple(p.format() for p in problems if p.severity == "error")
            return BridgeRow(
                workbook=name, rated=False, errors=errors or ("error   not rated",),
                warnings=tuple(p.format() for p in problems if p.severity != "error"),
                seconds=time.perf_counter() - t0)
        results, since, notes, worse = _with_previous(outcome.results, task.previous,
                                                      task.previous_by_id)
        out_dir = task.out_dir
        stem = task.stem
        if "/" in stem:  # a workbook in a sub-folder: its outputs in the same sub-folder
            sub, _, stem = stem.rpartition("/")
            out_dir = out_dir / sub
            out_dir.mkdir(parents=True, exist_ok=True)
        html, js = write(results, out_dir, stem)
        row = _row_from_results(wb, results, html, js, problems, time.perf_counter() - t0,
                                name=name, root=task.out_dir)
        return replace(row, since=since, warnings=row.warnings + notes, worse=worse) \
            if task.previous is not None else row
    except OSError as exc:  # unreadable workbook, full disk: recorded, the batch goes on
        return BridgeRow(workbook=name, rated=False,
                         errors=(f"error   {name}: could not be read or written: {exc}",),
                         seconds=time.perf_counter() - t0)
    except Exception as exc:  # a fault of the program: recorded so the batch goes on
        return BridgeRow(workbook=name, rated=False,
                         errors=(f"error   {name}: internal error in pintruss "
                                 f"({type(exc).__name__}: {exc}); please report it",),
                         seconds=time.perf_counter() - t0)


def _with_previous(results: Any, previous: Path | None,
                   by_id: Mapping[str, tuple[str, ...]] | None = None
                   ) -> tuple[Any, str, tuple[str, ...], bool]:
    """The results compared with the previous rating's results file at ``previous`` where
    there is one of this bridge (rating.previous), else with the one file of the
    --previous folder that rates the same structure id (``by_id``: a workbook renamed or
    moved since); the change in one sentence (or why there is none), a warning where a file
    could not be used (the bridge is rated and written all the same), and whether an
    outcome is worse than then."""
    if previous is None:
        return results, "", (), False
    from rating.previous import bridge_key, previous_for, worse_since
    from rating.report.display import display_for

    try:
        compared, why = (previous_for(results, previous) if previous.is_file()
                         else (None, f"no {previous.name} in the --previous folder"))
        found = ""
        if compared is None:
            others = [Path(q) for q in (by_id or {}).get(bridge_key(results.bridge.id), ())
                      if Path(q) != previous]
            if len(others) == 1:
                compared, other_why = previous_for(results, others[0])
                found = f" (found by its structure id: {others[0].name})"
                why = other_why or why
            elif len(others) > 1:
                why += (f"; {len(others)} results files there rate structure "
                        f"{results.bridge.id}: " + ", ".join(q.name for q in others))
        if compared is None:
            if not previous.is_file() and not (by_id or {}).get(
                    bridge_key(results.bridge.id)):
                return results, f"no previous rating: {why}", (), False
            return results, f"not compared: {why}", (f"warning --previous {why}",), False
        levels = {v.id: v.rating_level for v in results.vehicles}
        worse = worse_since(compared.previous, levels, display_for(results).unit("weight"))
    except Exception as exc:  # a fault of the program: the bridge is rated and written all
        # the same, without the comparison
        why = (f"{previous}: internal error in pintruss while comparing "
               f"({type(exc).__name__}: {exc}); please report it")
        return results, f"not compared: {why}", (f"warning --previous {why}",), False
    return compared, compared.previous.headline + found, (), worse


def _in_pool(tasks: Sequence[_Task], workers: int,
             done: Callable[[_Task, BridgeRow], None]) -> list[_Task]:
    """Rate ``tasks`` in a pool of ``workers`` processes, each row given to ``done``; the
    tasks lost when a worker died (the pool then breaks), in the order given. With one
    worker the tasks run in that order, so the first one lost is the one that died."""
    ctx = multiprocessing.get_context("spawn")
    lost: list[_Task] = []
    with ProcessPoolExecutor(max_workers=workers, mp_context=ctx,
                             initializer=_worker_setup) as pool:
        futures = {pool.submit(rate_one, t): t for t in tasks}
        for fut in as_completed(futures):
            t = futures[fut]
            try:
                row = fut.result()
            except BrokenProcessPool:
                lost.append(t)
                continue
            except Exception as exc:  # (rate_one records its own; a result that could not
                # come back from the worker, say)
                row = BridgeRow(workbook=t.name, rated=False, errors=(
                    f"error   {t.name}: the rating process failed "
                    f"({type(exc).__name__}: {exc})",))
            done(t, row)
    order = {id(t): i for i, t in enumerate(tasks)}
    return sorted(lost, key=lambda t: order[id(t)])


def _largest_first(tasks: Sequence[_Task]) -> list[_Task]:
    """The tasks with the largest workbooks first (a larger bridge takes longer to rate), so
    that the pool does not end on one long workbook while the other processes wait; the
    summary keeps the order of the names."""

    def size(t: _Task) -> int:
        try:
            return t.workbook.stat().st_size
        except OSError:  # gone since it was listed: rate_one records it
            return 0

    return sorted(tasks, key=size, reverse=True)


# ------------------------------------------------------------------ progress on stderr

@dataclass
class Progress:
    """A plain-text progress bar: redrawn in place on a terminal, one line per workbook
    otherwise (log files)."""

    total: int
    stream: TextIO | None = None
    width: int = 30
    done: int = 0
    failed: int = 0
    t0: float = field(default_factory=time.perf_counter)

    def update(self, row: BridgeRow) -> None:
        self.done += 1
        self.failed += 0 if row.rated else 1
        s = self.stream
        if s is None:
            return
        elapsed = time.perf_counter() - self.t0
        if s.isatty():
            filled = int(self.width * self.done / max(self.total, 1))
            bar = "#" * filled + "-" * (self.width - filled)
            note = f", {self.failed} not rated" if self.failed else ""
            s.write(f"\r[{bar}] {self.done}/{self.total} workbooks{note}, {elapsed:.0f} s ")
            if self.done == self.total:
                s.write("\n")
        else:
            what = "rated" if row.rated else f"NOT RATED ({len(row.errors)} error(s))"
            s.write(f"[{self.done:>{len(str(self.total))}}/{self.total}] {row.workbook}: "
                    f"{what}\n")
        s.flush()


# ------------------------------------------------------------------ the batch

def default_workers() -> int:
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except AttributeError:  # pragma: no cover - not Linux
        return max(1, os.cpu_count() or 1)


def rate_folder(folder: Path, out_dir: Path, *, workers: int | None = None,
                vehicle_ids: Sequence[str] | None = None, progress: TextIO | None = None,
                rate: Callable[..., Any] | None = None,
                write: Callable[..., Any] | None = None,
                previous: Path | None = None) -> BatchSummary:
    """Rate every workbook in ``folder`` into ``out_dir`` and write the summary CSV and the
    HTML index there.

    ``workers``: processes (default: the cores available); 1 rates in this process.
    ``previous``: the output folder of an earlier batch; each bridge is compared with its
    results file there (the same stem), read only.
    ``rate``/``write`` replace :func:`rating.pipeline.rate_workbook` and
    :func:`rating.pipeline.write_outputs` (module-level functions, for tests).
    """
    t0 = time.perf_counter()
    folder, out_dir = Path(folder), Path(out_dir)
    books = find_workbooks(folder)
    if not books:
        raise InputError(f"no inspection workbooks (*.xlsx) in {folder}", where=str(folder))
    if out_dir.exists() and not out_dir.is_dir():
        raise InputError(f"the output folder {out_dir} is a file", where=str(out_dir))
    stems = output_stems(books, folder)
    inputs = {p.resolve() for p in books}
    planned = [out_dir / name for s in stems
               for name in (f"{s}.rating.html", f"{s}.rating.json")]
    planned += [out_dir / SUMMARY_CSV, out_dir / INDEX_HTML]
    for p in planned:
        if p.resolve() in inputs:
            raise InputError(f"refusing to write {p}: it is an input workbook", where=str(p))
    earlier: list[Path | None] = [None] * len(stems)
    by_id: dict[str, tuple[str, ...]] | None = None
    if previous is not None:
        previous = Path(previous)
        if not previous.is_dir():
            raise InputError(f"there is no folder {previous} (--previous)", where=str(previous))
        earlier = [previous / f"{s}.rating.json" for s in stems]
        from rating.previous import results_by_bridge

        by_id = results_by_bridge(previous)
        read_only = {p.resolve() for p in earlier}
        clash = next((p for p in planned if p.resolve() in read_only), None)
        if clash is not None:
            raise InputError(f"refusing to write {clash}: it is a previous results file read "
                             "with --previous (give another --out)", where=str(clash))
    try:
        out_dir.mkdir(parents=True, exist_ok=True)
    except OSError as exc:  # a file on the way, a folder we may not write to
        raise InputError(f"the output folder {out_dir} cannot be made: {exc}",
                         where=str(out_dir)) from exc
    vids = tuple(vehicle_ids) if vehicle_ids else None
    tasks = [_Task(b, out_dir, s, vids, rate, write, workbook_label(b, folder), previous=e,
                   previous_by_id=by_id)
             for b, s, e in zip(books, stems, earlier, strict=True)]
    n = min(workers or default_workers(), len(tasks))
    n = max(n, 1)
    bar = Progress(len(tasks), progress)
    rows: dict[str, BridgeRow] = {}
    if n == 1:
        before = gc.get_threshold()
        gc.set_threshold(*GC_THRESHOLDS)  # as in a worker (_worker_setup), for this run
        try:
            for t in tasks:
                row = rate_one(t)
                rows[t.name] = row
                bar.update(row)
        finally:
            gc.set_threshold(*before)
    else:
        def done(t: _Task, row: BridgeRow) -> None:
            rows[t.name] = row
            bar.update(row)

        left = _in_pool(_largest_first(tasks), n, done)
        # A worker died (killed by the system, out of memory on a large truss): every
        # workbook still waiting in that pool was lost with it. They are rated again one
        # at a time, so that the one that kills its process is known and the rest are rated
        while left:
            lost = _in_pool(left, 1, done)
            if not lost:
                break
            culprit, left = lost[0], lost[1:]
            done(culprit, BridgeRow(workbook=culprit.name, rated=False, errors=(
                f"error   {culprit.name}: the rating process died, also when rated alone "
                "(killed by the system: out of memory on a very large truss?); the other "
                "workbooks were rated",)))
    ordered, others = _earlier_outputs(tuple(rows[t.name] for t in tasks), tasks, out_dir)
    from rating.pipeline import write_atomic

    csv_path, index_path = out_dir / SUMMARY_CSV, out_dir / INDEX_HTML
    write_atomic(csv_path, summary_csv(ordered))
    summary = BatchSummary(folder, out_dir, ordered, csv_path, index_path,
                           time.perf_counter() - t0, n, others)
    write_atomic(index_path, render_index(summary))
    return summary


# ------------------------------------------------------------------ the summary views

def _earlier_outputs(rows: tuple[BridgeRow, ...], tasks: Sequence[_Task], out_dir: Path
                     ) -> tuple[tuple[BridgeRow, ...], tuple[str, ...]]:
    """The rows with, for each workbook not rated this run, its outputs left in the output
    folder by an earlier run; and the other rating files there that no workbook of this run
    made. Nothing is removed (the folder is the user's); the summary says which is which."""
    out, made = [], set()
    for row, t in zip(rows, tasks, strict=True):
        mine = [f"{t.stem}.rating.html", f"{t.stem}.rating.json"]
        if row.rated:
            made.update(x for x in (row.report, row.results_file) if x)
            out.append(row)
            continue
        earlier = tuple(x for x in mine if (out_dir / x).is_file())
        made.update(earlier)
        out.append(replace(row, stale=earlier) if earlier else row)
    found = sorted(p.relative_to(out_dir).as_posix() for pattern in ("*.rating.html",
                                                                    "*.rating.json")
                   for p in out_dir.rglob(pattern) if p.is_file())
    return tuple(out), tuple(x for x in found if x not in made)


def vehicle_order(rows: Sequence[BridgeRow]) -> tuple[tuple[str, str], ...]:
    """(id, name) of every vehicle rated in the batch, in order of first appearance."""
    seen: dict[str, str] = {}
    for r in rows:
        for v in r.vehicles:
            seen.setdefault(v.vehicle, v.name)
    return tuple(seen.items())


def _rf_text(rf: float | None) -> str:
    """RF rounded down to 2 decimals as in the report; empty when none; "-inf" when the
    member cannot carry its dead load."""
    if rf is None or math.isnan(rf) or rf == math.inf:
        return ""
    if rf == -math.inf:
        return "-inf"
    return f"{reported_rf(rf):.2f}"


def _cell(text: str) -> str:
    """Text cell for a spreadsheet: a leading = + - @ would be read as a formula."""
    return "'" + text if text[:1] in ("=", "+", "-", "@", "\t", "\r") else text


def summary_csv(rows: Sequence[BridgeRow]) -> str:
    """The summary table as CSV text (UTF-8 with a byte-order mark so spreadsheet programs
    read the dashes and accents; RF rounded down to 2 decimals; posting loads in each
    bridge's own weight unit, named in its row)."""
    vehicles = vehicle_order(rows)
    head = ["workbook", "status", "structure", "bridge", "location", "inspection date",
            "weight unit", "deciding truck RF", "deciding truck", "action",
            "closure to consider", "rests on a condition", "recommendation",
            "read before deciding",
            "since the previous rating", "worse than at the previous rating", "errors",
            "warnings", "problems",
            "report", "results"]
    for vid, _ in vehicles:
        head += [f"{vid} RF", f"{vid} controlling member", f"{vid} action",
                 f"{vid} safe posting load"]
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(head)
    for r in rows:
        low = r.lowest_legal()
        line = [_cell(r.workbook), "rated" if r.rated else "not rated", _cell(r.structure),
                _cell(r.name), _cell(r.location), r.inspection_date,
                r.weight_unit if r.rated else "", _rf_text(low.rf) if low else "",
                _cell(low.vehicle) if low else "", r.action,
                "yes" if r.closure_to_consider else "",
                "yes" if r.conditional else "", _cell(r.recommendation),
                _cell(" | ".join(r.decision_warnings)), _cell(r.since),
                "yes" if r.worse else "", str(len(r.errors)),
                str(len(r.warnings)),
                _cell(" | ".join(r.errors[:20]) + (f" | and {len(r.errors) - 20} more"
                                                   if len(r.errors) > 20 else "")
                      + (f" | from an earlier run, not this one: {', '.join(r.stale)}"
                         if r.stale else "")),
                r.report, r.results_file]
        by_id = {v.vehicle: v for v in r.vehicles}
        for vid, _ in vehicles:
            v = by_id.get(vid)
            if v is None:
                line += ["", "", "", ""]
            else:
                line += [_rf_text(v.rf), _cell(v.member), v.action,
                         f"{v.posting:g}" if v.posting is not None else ""]
        w.writerow(line)
    return "\ufeff" + buf.getvalue()


@dataclass(frozen=True)
class _IndexCell:
    """One vehicle's cell of the batch index: the RF text, its band key for shading and the
    controlling member or pin."""

    text: str
    band: str
    member: str


@dataclass(frozen=True)
class _IndexRow:
    """One workbook's row of the batch index: its summary row, its RF cells by vehicle, the
    errors shown and how many more were left out."""

    row: BridgeRow
    cells: tuple[_IndexCell, ...]
    errors_shown: tuple[str, ...]
    more_errors: int
    advice: str  # the recommendation without the closing sentence the index says once
    decision: tuple[str, ...] = ()  # the decision-bearing warnings, each to its first clause

    @property
    def href(self) -> str:
        """The link to the bridge's report, relative to the index: its path percent-encoded
        ("#", "?", "%" and spaces in a file name are a file's, not a fragment or a query)."""
        return urllib.parse.quote(self.row.report, safe="/")


@dataclass(frozen=True)
class _IndexView:
    """Everything the batch index template shows."""

    title: str
    folder: str
    vehicles: tuple[tuple[str, str], ...]
    rated: tuple[_IndexRow, ...]
    failed: tuple[_IndexRow, ...]
    counts: dict[str, int]
    footer: str
    seconds: str
    workers: int
    duplicates: tuple[tuple[str, tuple[str, ...]], ...] = ()  # structure id -> workbooks
    others: tuple[str, ...] = ()


def _first_clause(text: str) -> str:
    """A warning to its first clause (up to the first "; " or ". "), for the index's row,
    with the verdict of a sensitivity it ends with ("Rated as if L3U4 did not act ..., the
    members give a closure to consider: lowest truck RF 0.12 (SU7, U3L4)"; "... the trucks
    give a posting: lowest truck RF 0.78 (...)": the part that bears on the decision)."""
    cut = [i for i in (text.find("; "), text.find(". ")) if i > 0]
    head = text[:min(cut)] if cut else text
    at = text.find(" Rated as if ")
    if at > 0:
        verdict = text[at + 1:]
        end = verdict.find("; ")
        head += ". " + (verdict[:end] if end > 0 else verdict.rstrip("."))
    at = text.find("the trucks give ")  # (a sensitivity's verdict: the steel, the hips)
    if at > len(head):
        verdict = text[at:]
        end = verdict.find(". ")
        head += "; " + (verdict[:end] if end > 0 else verdict.rstrip("."))
    return head


def render_index(summary: BatchSummary, max_problems: int = 30) -> str:
    """The HTML index of a batch (same look and print rules as the reports)."""
    from rating.report.bands import RFBands
    from rating.report.jinja import environment

    bands = RFBands()
    vehicles = vehicle_order(summary.rows)
    rated, failed = [], []
    for r in summary.rows:
        by_id = {v.vehicle: v for v in r.vehicles}
        cells = []
        for vid, _ in vehicles:
            v = by_id.get(vid)
            if v is None:
                cells.append(_IndexCell("", "", ""))
            else:
                text = _rf_text(v.rf).replace("-inf", "\u2212\u221e") or "\u2014"
                # (a permit's verdict beside its member: it never posts the bridge)
                who = f"{v.member} ({v.action})" if v.level == "permit" else v.member
                cells.append(_IndexCell(text, bands.band(v.rf).key if v.rf is not None
                                        else "nr", who))
        item = _IndexRow(r, tuple(cells), r.errors[:max_problems],
                         max(0, len(r.errors) - max_problems),
                         r.recommendation.removesuffix(DECISION_NOTE),
                         tuple(_first_clause(w) for w in r.decision_warnings))
        (rated if r.rated else failed).append(item)
    counts = {"total": len(summary.rows), "rated": len(rated), "failed": len(failed),
              # (each bridge counted once: one that leads with a closure is not also posted)
              "post": sum(1 for r in summary.rows if r.action in ("post", EV_ONLY)
                          and not r.closure_to_consider),
              "close": sum(1 for r in summary.rows if r.closure_to_consider),
              "read": sum(1 for r in summary.rows if r.decision_warnings),
              "conditional": sum(1 for r in summary.rows if r.conditional),
              "worse": sum(1 for r in summary.rows if r.worse)}
    view = _IndexView(
        title=f"Batch load rating \u2014 {summary.folder.name or summary.folder}",
        folder=str(summary.folder), vehicles=vehicles, rated=tuple(rated),
        failed=tuple(failed), counts=counts,
        footer=f"batch summary of {summary.folder.name} \u2014 recommendations for the "
        "licensed engineer in responsible charge",
        seconds=f"{summary.seconds:.1f}", workers=summary.workers,
        duplicates=_same_structure(summary.rated), others=summary.others)
    return environment().get_template("index.html.j2").render(v=view, page_size="landscape")


def _same_structure(rows: Sequence[BridgeRow]) -> tuple[tuple[str, tuple[str, ...]], ...]:
    """Structure ids rated from more than one workbook, with those workbooks: a copy of a
    workbook, or a bridge entered under another's id; either way the reviewer should know."""
    by_id: dict[str, tuple[str, list[str]]] = {}
    for r in rows:
        if r.structure.strip():
            # (the same id typed in another case or with spaces is the same bridge)
            key = " ".join(r.structure.split()).casefold()
            by_id.setdefault(key, (r.structure.strip(), []))[1].append(r.workbook)
    return tuple((sid, tuple(books)) for sid, books in by_id.values() if len(books) > 1)


def print_summary(summary: BatchSummary, stream: TextIO | None = None) -> None:
    """A few lines for the terminal after a batch (standard output by default)."""
    stream = stream if stream is not None else sys.stdout
    c = len(summary.rated), len(summary.failed)
    stream.write(f"{c[0]} of {len(summary.rows)} workbook(s) rated, {c[1]} not rated "
                 f"({summary.seconds:.1f} s on {summary.workers} process(es))\n")
    for r in summary.failed:
        stream.write(f"  not rated: {r.workbook}\n")
        for e in r.errors[:5]:
            stream.write(f"    {e}\n")
        if len(r.errors) > 5:
            stream.write(f"    ... and {len(r.errors) - 5} more (see {INDEX_HTML})\n")
    for sid, books in _same_structure(summary.rated):
        stream.write(f"  note: structure {sid} is rated from {len(books)} workbooks: "
                     f"{', '.join(books)}\n")
    worse = [r.workbook for r in summary.rows if r.worse]
    if worse:
        stream.write(f"  {len(worse)} bridge(s) rate worse than at their previous rating: "
                     f"{', '.join(worse[:10])}{', ...' if len(worse) > 10 else ''}\n")
    stale = [x for r in summary.rows for x in r.stale]
    if stale or summary.others:
        stream.write(f"  note: {len(stale) + len(summary.others)} rating file(s) in the output "
                     "folder are not from this run (listed in the index)\n")
    stream.write(f"summary: {summary.csv_path}\nindex:   {summary.index_path}\n")

"""Benchmark (not a test): reading an inspection workbook, in one process after the imports.

For each bundled sample (or the workbooks given):

1. ``read_workbook`` as the batch runs it (the fast reader, rating.inventory.xlsx), the least
   CPU time of ``--runs`` after one warm-up read, and its stages: opening the workbook into grids
   (``open_book``), and turning the grids into the bridge and its problems (tables, cells and
   the checks across sheets).
2. The same read through the reference reader (openpyxl), for the comparison.
3. Whether both give the same result: the grids cell by cell (value types included) and the
   bridge with every problem (``Sheet!Cell`` and message) and assumption.

Target: well under 0.1 s per workbook on the development container (about 0.025-0.035 s
of CPU for the samples), out of the batch's budget of about 0.12 s of one core per bridge for
everything. Run with OMP_NUM_THREADS=1.

Run:  python bench/reader_bench.py [--runs N] [WORKBOOK ...]
"""

from __future__ import annotations

import argparse
import platform
import time
import timeit
import zipfile
from collections.abc import Callable
from pathlib import Path
from unittest import mock

from rating.inventory import book, reader
from rating.inventory.problems import ProblemLog

SAMPLES = sorted((Path(__file__).resolve().parents[1] / "sample_inventory").glob("*.xlsx"))
TARGET_S = 0.1


def best(fn: Callable[[], object], runs: int) -> float:
    """Least CPU time of this process over ``runs`` calls, after one warm-up call (this
    machine is shared and noisy: CPU time, the best of several, is what can be compared)."""
    fn()
    return min(timeit.repeat(fn, number=1, repeat=runs, timer=time.process_time))


def snapshot(b: book.Book) -> object:
    """A book's grids with the type of every value (1, 1.0 and True compare equal)."""
    return (b.sheet_names, {k: (g.name, [[(type(v).__name__, repr(v)) for v in row]
                                         for row in g.rows],
                                sorted(g.uncached_formulas.items()), g.merges, g.truncated,
                                g.failure) for k, g in b.grids.items()})


def reading(result: reader.WorkbookReading) -> object:
    return (repr(result.bridge), [(p.severity, p.where, p.message) for p in result.problems],
            result.assumptions)


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("workbooks", nargs="*", type=Path, default=SAMPLES)
    ap.add_argument("--runs", type=int, default=5)
    args = ap.parse_args()
    print(f"Python {platform.python_version()}, {platform.machine()}; CPU time, best of "
          f"{args.runs}, in-process after one warm-up read")
    sheets, rows = reader.sheets_read(), reader.rows_read()
    met = True
    for path in args.workbooks:
        with zipfile.ZipFile(path) as z:
            try:
                book.open_book_fast(z, path, sheets, rows)
                fast = "fast reader"
            except Exception as exc:  # noqa: BLE001 - left to the reference reader
                fast = f"reference reader ({type(exc).__name__}: {str(exc)[:40]})"
        total = best(lambda p=path: reader.read_workbook(p), args.runs)
        opened = best(lambda p=path: book.open_book(p, sheets, rows), args.runs)
        grids = book.open_book(path, sheets, rows)
        rest = best(lambda g=grids: reader._Reading(g, ProblemLog()).bridge(), args.runs)
        with mock.patch.object(reader, "open_book", book.open_book_reference):
            reference = best(lambda p=path: reader.read_workbook(p), args.runs)
            same_reading = reading(reader.read_workbook(path))
        same = (snapshot(grids) == snapshot(book.open_book_reference(path, sheets, rows))
                and reading(reader.read_workbook(path)) == same_reading)
        met = met and total < TARGET_S
        print(f"{path.name}: read {total * 1000:.1f} ms (open_book {opened * 1000:.1f} ms, "
              f"grids to bridge {rest * 1000:.1f} ms) by the {fast}; reference reader "
              f"{reference * 1000:.1f} ms ({reference / total:.1f} times); same grids, bridge "
              f"and problems: {'yes' if same else 'NO'}")
    print(f"target: under {TARGET_S * 1000:.0f} ms per workbook: {'met' if met else 'NOT met'}")


if __name__ == "__main__":
    main()

"""Benchmarks of the report and the batch (not tests; results go in bench/README.md).

1. One workbook to its report, wall time of ``python -m rating.cli rate`` in a fresh
   interpreter (interpreter start and imports included), median of several runs, and the
   same chain timed stage by stage in one process. Target: under 1.5 s.
2. Batch throughput: a generated folder of N workbooks (copies of the bundled samples,
   round-robin) rated by ``python -m rating.cli batch --workers W``. Target: at least
   1,000 bridges per minute on 2 cores.
3. A larger truss (the Pratt sample's members on 12 panels, counters in every inner panel):
   wall time and peak memory of ``rate`` in a fresh interpreter. No target; a batch runs
   one such rating per worker at a time, so its memory is what a worker may need.

Run from the repository root:
    python bench/report_bench.py                 # all, 200 workbooks, 2 workers
    python bench/report_bench.py --count 40      # a quicker batch
    python bench/report_bench.py --only single
    python bench/report_bench.py --only stages     # in process, every sample, no fresh runs
    python bench/report_bench.py --only stand-in   # batch machinery + report, no engine
    python bench/report_bench.py --only large      # a 12-panel truss: wall time, peak memory
Outputs go to a temporary folder (or --keep DIR); nothing is written into the checkout.
"""

from __future__ import annotations

import argparse
import functools
import os
import platform
import resource
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
SAMPLES = REPO / "sample_inventory"


def sample_workbooks() -> list[Path]:
    books = sorted(p for p in SAMPLES.glob("*.xlsx") if not p.name.startswith("~$"))
    if not books:
        sys.exit("no sample workbooks in sample_inventory/ (run sample_inventory/make_samples.py)")
    return books


def installed_env(work: Path) -> dict[str, str]:
    """The environment of an ordinary installation: Python keeps its bytecode cache (some
    sandboxes set PYTHONDONTWRITEBYTECODE, which makes every start compile every module);
    the cache goes to a folder of the benchmark's own, never into the checkout."""
    env = dict(os.environ)
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    env["PYTHONPYCACHEPREFIX"] = str(work / "pycache")
    return env


def single(runs: int, work: Path) -> None:
    books = sample_workbooks()
    env = installed_env(work)
    print(f"== one workbook to report ({runs} runs each, fresh interpreter, bytecode cache "
          "as installed; one untimed run first fills it) ==")
    subprocess.run([sys.executable, "-m", "rating.cli", "rate", str(books[0]), "--out",
                    str(work / "single-warm")], capture_output=True, text=True, cwd=REPO,
                   env=env)
    for book in books:
        times, cpu, codes = [], [], set()
        for k in range(runs):
            out = work / f"single-{book.stem}-{k}"
            c0 = _children_cpu()
            t0 = time.perf_counter()
            proc = subprocess.run([sys.executable, "-m", "rating.cli", "rate", str(book),
                                   "--out", str(out)], capture_output=True, text=True,
                                  cwd=REPO, env=env)
            times.append(time.perf_counter() - t0)
            cpu.append(_children_cpu() - c0)
            codes.add(proc.returncode)
        status = "rated" if codes == {0} else f"NOT RATED (exit {sorted(codes)})"
        print(f"{book.name:<32} median {statistics.median(times):6.2f} s  "
              f"min {min(times):6.2f} s  (CPU median {statistics.median(cpu):5.2f} s)  {status}")
    stages(books[0], work=work)


def _children_cpu() -> float:
    """CPU time (user + system, s) of this process's finished children: on a shared machine
    it moves less than the wall time with load from elsewhere, so it tells a slower machine
    from a slower program."""
    ru = resource.getrusage(resource.RUSAGE_CHILDREN)
    return ru.ru_utime + ru.ru_stime


def _best(fn, runs: int = 5) -> float:
    """Least wall time of ``runs`` calls (the least is the one the machine disturbed least)."""
    times = []
    for _ in range(runs):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return min(times)


_IMPORT_PROBE = """
import time
t0 = time.perf_counter()
import numpy
t1 = time.perf_counter()
import openpyxl
t2 = time.perf_counter()
import jinja2
t3 = time.perf_counter()
import rating.pipeline, rating.inventory.reader, rating.lrfr.engine, rating.report.html
import rating.results, rating.results_build
t4 = time.perf_counter()
print(t1 - t0, t2 - t1, t3 - t2, t4 - t3)
"""


def import_times(work: Path, runs: int = 3) -> list[float]:
    """Import time of numpy, openpyxl, jinja2 and the package's modules of a run, in a fresh
    interpreter with the bytecode cache as installed (median of ``runs``, after one run that
    fills the cache)."""
    env = installed_env(work)
    rows = []
    for _ in range(runs + 1):
        proc = subprocess.run([sys.executable, "-c", _IMPORT_PROBE], capture_output=True,
                              text=True, cwd=REPO, env=env, check=True)
        rows.append([float(x) for x in proc.stdout.split()])
    return [statistics.median(col) for col in zip(*rows[1:], strict=True)]


def stages(book: Path, runs: int = 5, *, work: Path, imports: bool = True) -> None:
    """The chain of one workbook timed stage by stage: the imports in a fresh interpreter
    (:func:`import_times`), then, in this process, reading and rating, and the stages after
    the rating (results, report, JSON) as the best of ``runs``, after one call that compiles
    the templates."""
    from rating.process import settle_process

    settle_process()  # as the command line does before numpy loads (one BLAS thread)
    from rating.inventory.reader import read_workbook
    from rating.lrfr.engine import rate_bridge
    from rating.report.html import render_report
    from rating.results import results_json
    from rating.results_build import build_results

    if imports:
        t_np, t_xl, t_j2, t_own = import_times(work)
        print(f"imports in a fresh interpreter: numpy {t_np:.2f} s, openpyxl {t_xl:.2f} s, "
              f"jinja2 {t_j2:.2f} s, pintruss's own modules {t_own:.2f} s, together "
              f"{t_np + t_xl + t_j2 + t_own:.2f} s")
    t = time.perf_counter()
    reading = read_workbook(book)
    t_read = time.perf_counter() - t
    print(f"stages for {book.name}: read {t_read:.2f} s", end="")
    if reading.bridge is None or reading.errors:
        print(" (workbook has errors: not rated)")
        return
    t = time.perf_counter()
    try:
        rating = rate_bridge(reading.bridge, None)
    except Exception as exc:  # a benchmark reports, it does not stop
        print(f", rate failed after {time.perf_counter() - t:.2f} s: {exc}")
        return
    t_rate = time.perf_counter() - t
    results = build_results(rating)
    html = render_report(results)
    js = results_json(results)
    t_build = _best(lambda: build_results(rating), runs)
    t_html = _best(lambda: render_report(results), runs)
    t_json = _best(lambda: results_json(results), runs)
    print(f", rate {t_rate:.2f} s; best of {runs}: results {t_build:.3f} s, report "
          f"{t_html:.3f} s ({len(html) / 1e3:.0f} kB), JSON {t_json:.3f} s "
          f"({len(js) / 1e3:.0f} kB), together {t_build + t_html + t_json:.3f} s")


def batch(count: int, workers: int, work: Path) -> None:
    books = sample_workbooks()
    folder = work / "batch-in"
    out = work / "batch-out"
    folder.mkdir(parents=True, exist_ok=True)
    for k in range(count):
        src = books[k % len(books)]
        shutil.copyfile(src, folder / f"bridge_{k:04d}_{src.name}")
    print(f"== batch of {count} workbooks, {workers} worker(s) ==")
    t0 = time.perf_counter()
    env = installed_env(work)
    subprocess.run([sys.executable, "-c", "import rating.pipeline, rating.report.html"],
                   cwd=REPO, env=env, capture_output=True)  # fill the bytecode cache
    proc = subprocess.run([sys.executable, "-m", "rating.cli", "batch", str(folder), "--out",
                           str(out), "--workers", str(workers)], capture_output=True, text=True,
                          cwd=REPO, env=env)
    wall = time.perf_counter() - t0
    head = proc.stdout.splitlines()[:1]
    print(f"wall {wall:.1f} s -> {count / wall * 60:.0f} workbooks per minute "
          f"(exit {proc.returncode}; {head[0] if head else 'no summary'})")


@functools.lru_cache(maxsize=1)
def _sample() -> object:
    sys.path.insert(0, str(REPO / "tests" / "report"))
    from sample_results import sample_results

    return sample_results()


def _stand_in_rate(path: Path, vehicle_ids: object = None) -> object:
    """Every workbook "rates" as the hand-built 31-member sample of tests/report, built once
    per process (measures the batch machinery, the report and the JSON, not the engine)."""
    from rating.pipeline import RateOutcome

    return RateOutcome(Path(path), _sample(), ())


def stand_in(count: int, workers: int, work: Path) -> None:
    from rating.batch import rate_folder
    from rating.report.html import render_report

    sys.path.insert(0, str(REPO / "tests" / "report"))
    from sample_results import sample_results

    from rating.results import results_json

    r = sample_results()
    render_report(r)  # templates compiled once per process
    t_html = _best(lambda: render_report(r), 20)
    t_json = _best(lambda: results_json(r), 20)
    print(f"== report of the 31-member sample results: {t_html:.3f} s per report, JSON "
          f"{t_json:.3f} s (in process, templates compiled, best of 20) ==")
    folder = work / "standin-in"
    folder.mkdir(parents=True, exist_ok=True)
    for k in range(count):
        (folder / f"bridge_{k:04d}.xlsx").write_bytes(b"stand-in")
    t0 = time.perf_counter()
    s = rate_folder(folder, work / "standin-out", workers=workers, rate=_stand_in_rate)
    wall = time.perf_counter() - t0
    print(f"== batch machinery with a stand-in rating, {count} workbooks, {workers} worker(s): "
          f"wall {wall:.1f} s -> {count / wall * 60:.0f} per minute "
          f"({len(s.rated)} reports and JSON files written) ==")


LARGE_TRUSSES = ((12, tuple(range(2, 12))),)
"""The larger trusses of ``--only large``: the Pratt sample's members on (panels, counter
panels), written by sample_inventory/make_samples.py (invented)."""


def large(runs: int, work: Path) -> None:
    """Wall time and peak memory of ``rate`` in a fresh interpreter on a larger truss with
    counters in every inner panel (the searches grow with the positions, the active sets
    and the pieces of each path), median of ``runs``."""
    sys.path.insert(0, str(SAMPLES))
    from make_samples import pratt_1898

    from rating.inventory.template import write_workbook

    env = installed_env(work)
    print(f"== larger trusses ({runs} runs each, fresh interpreter) ==")
    for n, counters in LARGE_TRUSSES:
        book = work / f"pratt_{n}_panels.xlsx"
        write_workbook(book, pratt_1898(n, counters))
        times, peaks, codes = [], [], set()
        for k in range(runs):
            t0 = time.perf_counter()
            proc = subprocess.run(
                [sys.executable, "-c", _PEAK_PROBE, str(book), str(work / f"large-{n}-{k}")],
                capture_output=True, text=True, cwd=REPO, env=env)
            times.append(time.perf_counter() - t0)
            codes.add(proc.returncode)
            peaks.append(float(proc.stdout.split()[-1]) if proc.returncode == 0 else 0.0)
        status = "rated" if codes == {0} else f"NOT RATED (exit {sorted(codes)})"
        print(f"Pratt sample's members, {n} panels, counters in panels {counters[0]}-"
              f"{counters[-1]}: median {statistics.median(times):6.2f} s, peak memory "
              f"{max(peaks):.0f} MB  {status}")


_PEAK_PROBE = """
import resource, sys
from rating.cli import main
code = main(["rate", sys.argv[1], "--out", sys.argv[2]])
print(resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024)
sys.exit(code)
"""


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--only", choices=("single", "stages", "batch", "stand-in", "large"),
                    default=None)
    ap.add_argument("--runs", type=int, default=5)
    ap.add_argument("--count", type=int, default=200)
    ap.add_argument("--workers", type=int, default=2)
    ap.add_argument("--keep", type=Path, default=None, help="keep the outputs in this folder")
    a = ap.parse_args()
    print(f"python {platform.python_version()} on {platform.machine()}, "
          f"{len(os.sched_getaffinity(0))} core(s) available")
    with tempfile.TemporaryDirectory(prefix="pintruss-bench-") as tmp:
        work = a.keep or Path(tmp)
        work.mkdir(parents=True, exist_ok=True)
        if a.only in (None, "single"):
            single(a.runs, work)
        if a.only == "stages":
            for i, book in enumerate(sample_workbooks()):
                stages(book, a.runs, work=work, imports=i == 0)
        if a.only in (None, "stand-in"):
            stand_in(a.count, a.workers, work)
        if a.only in (None, "batch"):
            batch(a.count, a.workers, work)
        if a.only in (None, "large"):
            large(min(a.runs, 3), work)


if __name__ == "__main__":
    main()

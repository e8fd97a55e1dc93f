"""Settings of a process that rates bridges: the command line's own process and each of the
batch's worker processes. Made before the heavy modules load (numpy reads its thread
settings once, when it is imported)."""

from __future__ import annotations

import gc
import os

THREAD_ENV = ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS")
"""numpy's linear-algebra thread settings (OpenMP, OpenBLAS, MKL)."""

GC_THRESHOLDS = (100_000, 50, 100)
"""The cyclic garbage collector's thresholds for a rating process."""


def settle_process() -> None:
    """One thread for numpy's linear algebra unless the environment says otherwise: the
    rating's matrices are small; on the bundled samples a second thread made a one-workbook
    run about 0.1 s slower and used a third more CPU (bench/README.md), and the batch has its
    own processes for the cores. The cyclic garbage collector run less often: a rating makes
    many short-lived objects that form no cycles, and the default threshold (700) has it scan
    them all the time (about 5 % of a workbook's time); cycles are still collected."""
    for name in THREAD_ENV:
        os.environ.setdefault(name, "1")
    gc.set_threshold(*GC_THRESHOLDS)

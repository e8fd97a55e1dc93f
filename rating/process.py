"""Settings of a process that rates bridges: the command line's own process and each of the
batch's worker processes. Made before the heavy modules load (numpy reads its thread
settings once, when it is imported)."""

from __future__ import annotations

import gc
import os
import sys

THREAD_ENV = ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS")
"""numpy's linear-algebra thread settings (OpenMP, OpenBLAS, MKL)."""

GC_THRESHOLDS = (100_000, 50, 100)
"""The cyclic garbage collector's thresholds for a rating process."""


MALLOC_SETTINGS = ((-3, 32 << 20), (-1, 128 << 20), (-2, 16 << 20))
"""glibc's allocator settings for a rating process, (mallopt parameter, value):
M_MMAP_THRESHOLD 32 MiB (glibc's largest), M_TRIM_THRESHOLD 128 MiB, M_TOP_PAD 16 MiB. The
rating's array temporaries of a few hundred kB to a few MB are then taken from and given back
to the process's heap, instead of each being mapped from the system and unmapped again (a
fresh mapping costs a page fault per page touched): on the Parker sample a run's page faults
fell from about 31,000 to 22,000 and its system time by about 0.05 s (bench/README.md). A
process holds at most the trim threshold of freed memory beyond what it uses."""


def keep_freed_memory() -> bool:
    """Apply :data:`MALLOC_SETTINGS` where the C library is glibc (Linux); elsewhere nothing.
    True when every setting was taken."""
    if not sys.platform.startswith("linux"):
        return False
    try:
        import ctypes  # (numpy imports it anyway)

        mallopt = ctypes.CDLL(None).mallopt
    except (OSError, AttributeError):
        return False
    mallopt.argtypes = (ctypes.c_int, ctypes.c_int)
    mallopt.restype = ctypes.c_int
    return all([mallopt(param, value) == 1 for param, value in MALLOC_SETTINGS])


def settle_process() -> None:
    """One thread for numpy's linear algebra unless the environment says otherwise: the
    rating's matrices are small; on the bundled samples a second thread made a one-workbook
    run about 0.1 s slower and used a third more CPU (bench/README.md), and the batch has its
    own processes for the cores. The cyclic garbage collector run less often: a rating makes
    many short-lived objects that form no cycles, and the default threshold (700) has it scan
    them all the time (about 5 % of a workbook's time); cycles are still collected. Freed
    memory kept for reuse (:func:`keep_freed_memory`)."""
    for name in THREAD_ENV:
        os.environ.setdefault(name, "1")
    gc.set_threshold(*GC_THRESHOLDS)
    keep_freed_memory()

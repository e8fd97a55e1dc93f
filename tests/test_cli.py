"""The command line's own job: one numeric thread by default, set before numpy loads; the
cyclic garbage collector run less often; freed memory kept for reuse (glibc)."""

from __future__ import annotations

import gc
import os
import platform
import resource
import subprocess
import sys
from collections.abc import Iterator

import pytest

from rating.cli import main
from rating.process import GC_THRESHOLDS, THREAD_ENV


@pytest.fixture(autouse=True)
def _collector_restored() -> Iterator[None]:
    """main() sets this process's collector thresholds: the test process gets its own back."""
    before = gc.get_threshold()
    yield
    gc.set_threshold(*before)


def test_the_command_line_module_loads_nothing_heavy() -> None:
    # the thread settings are read by numpy's linear algebra when numpy is imported: the
    # command line sets them first, so it must not import numpy itself (nor the batch's
    # process pool, which a one-workbook run does not need)
    heavy = ("numpy", "multiprocessing", "concurrent.futures", "rating.batch")
    out = subprocess.run([sys.executable, "-c", "import sys, rating.cli; print(*(m in "
                          f"sys.modules for m in {heavy!r}))"],
                         capture_output=True, text=True, check=True)
    assert out.stdout.split() == ["False"] * len(heavy)


def test_one_numeric_thread_unless_the_user_said_otherwise(
        monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    for name in THREAD_ENV:
        monkeypatch.delenv(name, raising=False)
    monkeypatch.setenv("OPENBLAS_NUM_THREADS", "3")
    assert main(["vehicles"]) == 0
    capsys.readouterr()
    assert os.environ["OPENBLAS_NUM_THREADS"] == "3"
    assert all(os.environ[name] == "1" for name in THREAD_ENV if name != "OPENBLAS_NUM_THREADS")


def test_the_collector_runs_less_often_during_a_run(
        capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["vehicles"]) == 0
    capsys.readouterr()
    assert gc.get_threshold() == GC_THRESHOLDS


@pytest.mark.skipif(platform.libc_ver()[0] != "glibc", reason="the allocator settings are "
                    "glibc's (mallopt); elsewhere nothing is changed")
def test_freed_memory_is_kept_for_reuse() -> None:
    """Every allocator setting is taken, and a process that allocates and frees arrays of a
    few MB again and again then faults in far fewer fresh pages (counted by the kernel:
    ru_minflt), as the rating's temporaries do."""
    probe = (
        "import resource, sys, numpy as np\n"
        "from rating.process import keep_freed_memory\n"
        "ok = keep_freed_memory() if sys.argv[1] == 'kept' else True\n"
        "for _ in range(2):\n"  # the first touch of the pages, either way
        "    a = np.ones(500_000) * 2.0\n"
        "f0 = resource.getrusage(resource.RUSAGE_SELF).ru_minflt\n"
        "for _ in range(50):\n"
        "    a = np.ones(500_000) * 2.0\n"
        "print(ok, resource.getrusage(resource.RUSAGE_SELF).ru_minflt - f0)\n")
    runs = {}
    for mode in ("default", "kept"):
        out = subprocess.run([sys.executable, "-c", probe, mode], capture_output=True,
                             text=True, check=True).stdout.split()
        assert out[0] == "True"
        runs[mode] = int(out[1])
    assert runs["kept"] * 5 < runs["default"], runs  # (here: 0 against 1,953)
    assert resource.getrusage(resource.RUSAGE_SELF).ru_minflt >= 0


def test_a_run_keeps_freed_memory(monkeypatch: pytest.MonkeyPatch,
                                  capsys: pytest.CaptureFixture[str]) -> None:
    import rating.process

    calls: list[bool] = []
    monkeypatch.setattr(rating.process, "keep_freed_memory", lambda: calls.append(True))
    assert main(["vehicles"]) == 0
    capsys.readouterr()
    assert calls == [True]

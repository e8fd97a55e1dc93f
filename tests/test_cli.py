"""The command line's own job: one numeric thread by default, set before numpy loads; the
cyclic garbage collector run less often."""

from __future__ import annotations

import gc
import os
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

"""The command line's own job: one numeric thread by default, set before numpy loads."""

from __future__ import annotations

import os
import subprocess
import sys

import pytest

from rating.batch import THREAD_ENV
from rating.cli import main


def test_the_command_line_module_does_not_load_numpy() -> None:
    # the thread settings are read by numpy's linear algebra when numpy is imported: the
    # command line sets them first, so it must not import numpy itself
    out = subprocess.run([sys.executable, "-c",
                          "import sys, rating.cli; print('numpy' in sys.modules)"],
                         capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "False"


def test_one_numeric_thread_unless_the_user_said_otherwise(
        monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    for name in THREAD_ENV:
        monkeypatch.delenv(name, raising=False)
    monkeypatch.setenv("OPENBLAS_NUM_THREADS", "3")
    assert main(["vehicles"]) == 0
    capsys.readouterr()
    assert os.environ["OPENBLAS_NUM_THREADS"] == "3"
    assert all(os.environ[name] == "1" for name in THREAD_ENV if name != "OPENBLAS_NUM_THREADS")

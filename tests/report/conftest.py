"""Shared fixtures of the report tests: the hand-built sample results (see sample_results.py)."""

from __future__ import annotations

import multiprocessing
from concurrent.futures import ProcessPoolExecutor
from pathlib import Path
from typing import Any

import pytest
from report_support import sample_workbooks
from sample_results import sample_results

from rating.results import RatingResults


@pytest.fixture(scope="session")
def results_us() -> RatingResults:
    return sample_results("US")


@pytest.fixture(scope="session")
def results_si() -> RatingResults:
    return sample_results("SI")


@pytest.fixture(scope="session")
def results_hostile() -> RatingResults:
    return sample_results("US", hostile=True)


@pytest.fixture(scope="session")
def sample_outcomes(tmp_path_factory: pytest.TempPathFactory) -> list[Any]:
    """Every sample workbook rated through the real pipeline (outcomes, rated or not), in
    parallel on the available cores (the rating is the slow part of these tests)."""
    from rating.batch import default_workers
    from rating.pipeline import rate_workbook

    books = sample_workbooks(tmp_path_factory.mktemp("samples"))
    workers = min(default_workers(), len(books))
    if workers <= 1:
        return [rate_workbook(b) for b in books]
    ctx = multiprocessing.get_context("spawn")
    with ProcessPoolExecutor(max_workers=workers, mp_context=ctx) as pool:
        return list(pool.map(rate_workbook, books))


@pytest.fixture(scope="session")
def sample_reports(sample_outcomes: list[Any], tmp_path_factory: pytest.TempPathFactory
                   ) -> list[tuple[Path, str]]:
    """(report path, unit system) of every sample workbook that could be rated."""
    from rating.pipeline import write_outputs
    from rating.report.display import unit_system

    out = tmp_path_factory.mktemp("sample_reports")
    paths = []
    for o in sample_outcomes:
        if o.results is not None:
            html, _ = write_outputs(o.results, out, o.workbook.stem)
            paths.append((html, unit_system(o.results)))
    return paths


def pytest_configure(config: pytest.Config) -> None:
    config.addinivalue_line(
        "markers", "slow: builds a wheel and a temporary venv (deselect with -m 'not slow')")

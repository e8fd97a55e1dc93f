"""The compiled templates kept between runs (rating.report.jinja.TemplateCodeCache): a report
rendered from the cache is the report rendered from the template's source, and a cache that
cannot be written or read is simply not used."""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from rating.report.jinja import TemplateCodeCache, build_environment
from rating.report.view import build_view
from tests.report.sample_results import sample_results


def _render(cache: TemplateCodeCache | None) -> str:
    view = build_view(sample_results())
    env = build_environment(cache)
    return env.get_template("report.html.j2").render(v=view, page_size="letter")


@pytest.fixture(scope="module")
def uncached() -> str:
    return _render(None)


def test_second_run_reads_the_compiled_template_and_renders_the_same(tmp_path: Path,
                                                                     uncached: str) -> None:
    cache = TemplateCodeCache(str(tmp_path), "pintruss-%s.cache")
    assert _render(cache) == uncached
    files = sorted(tmp_path.glob("pintruss-*.cache"))
    assert files, "the first run keeps the compiled templates"
    stamps = [f.stat().st_mtime_ns for f in files]
    assert _render(TemplateCodeCache(str(tmp_path), "pintruss-%s.cache")) == uncached
    assert [f.stat().st_mtime_ns for f in files] == stamps  # read, not compiled again


def test_a_damaged_cache_file_is_compiled_again(tmp_path: Path, uncached: str) -> None:
    _render(TemplateCodeCache(str(tmp_path), "pintruss-%s.cache"))
    for f in tmp_path.glob("pintruss-*.cache"):
        f.write_bytes(f.read_bytes()[:40] + b"\x00garbage")
    assert _render(TemplateCodeCache(str(tmp_path), "pintruss-%s.cache")) == uncached


def test_a_folder_that_cannot_be_written_is_not_used(tmp_path: Path, uncached: str) -> None:
    missing = tmp_path / "not-there"
    assert _render(TemplateCodeCache(str(missing), "pintruss-%s.cache")) == uncached
    assert not missing.exists()
    if os.geteuid() != 0:  # root writes anywhere
        locked = tmp_path / "locked"
        locked.mkdir(mode=0o500)
        assert _render(TemplateCodeCache(str(locked), "pintruss-%s.cache")) == uncached

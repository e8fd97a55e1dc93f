"""The report from an installed wheel (not an editable install) in a temporary venv equals
the report from the source tree, byte for byte, and its templates come from package data.

Slow (builds a wheel): marked ``slow`` so it can be deselected with ``-m "not slow"``; it runs
in the default suite.
"""

from __future__ import annotations

import json
import shutil
import site
import subprocess
import sys
import textwrap
import zipfile
from pathlib import Path
from typing import Any

import pytest
from report_support import smallest_rated
from sample_results import sample_results

from rating.report import render_report

REPO = Path(__file__).resolve().parents[2]
HERE = Path(__file__).resolve().parent

pytestmark = pytest.mark.slow


def _run(cmd: list[str], cwd: Path, timeout: float = 300) -> subprocess.CompletedProcess[str]:
    proc = subprocess.run(cmd, cwd=cwd, capture_output=True, text=True, timeout=timeout)
    if proc.returncode != 0:
        pytest.fail(f"{' '.join(cmd)} failed ({proc.returncode}):\n{proc.stdout}\n"
                    f"{proc.stderr}")
    return proc


@pytest.fixture(scope="module")
def installed(tmp_path_factory: pytest.TempPathFactory) -> dict[str, Path]:
    tmp = tmp_path_factory.mktemp("wheel")
    src = tmp / "src"  # a clean copy, so the build leaves nothing in the checkout
    shutil.copytree(REPO, src, symlinks=True, ignore=shutil.ignore_patterns(
        ".git", ".venv", "build", "dist", "*.egg-info", "__pycache__", ".pytest_cache",
        ".hypothesis", ".ruff_cache", "out", "tests", "bench"))
    dist = tmp / "dist"
    _run([sys.executable, "-m", "pip", "wheel", "--no-deps", "-q", "-w", str(dist), str(src)],
         tmp)
    wheels = list(dist.glob("pintruss-*.whl"))
    assert len(wheels) == 1
    with zipfile.ZipFile(wheels[0]) as z:
        names = z.namelist()
    assert "rating/templates/report.html.j2" in names and "rating/templates/report.css" in names
    venv = tmp / "venv"
    _run([sys.executable, "-m", "venv", "--without-pip", str(venv)], tmp)
    py = venv / "bin" / "python"
    _run([sys.executable, "-m", "pip", "--python", str(py), "install", "--no-deps",
          "--no-index", "-q", str(wheels[0])], tmp)
    # the dependencies (numpy, jinja2, ...) from this environment, appended after the venv's
    # own site-packages: a plain path line, so the editable finder there is not activated
    purelib = Path(_run([str(py), "-c", "import sysconfig; print(sysconfig.get_paths()"
                         "['purelib'])"], tmp).stdout.strip())
    (purelib / "zz_deps.pth").write_text("\n".join(site.getsitepackages()) + "\n")
    return {"python": py, "venv": venv, "tmp": tmp}


def _in_venv(installed: dict[str, Path], code: str) -> Any:
    script = installed["tmp"] / "probe.py"
    script.write_text(textwrap.dedent(code))
    out = _run([str(installed["python"]), "-I", str(script)], installed["tmp"]).stdout
    return json.loads(out.strip().splitlines()[-1])


def test_installed_wheel_report_equals_source_report(installed: dict[str, Path]) -> None:
    out = installed["tmp"] / "from_wheel.html"
    info = _in_venv(installed, f"""
        import json, sys
        sys.path.append({str(HERE)!r})  # the fixture module only; rating comes from the venv
        import rating, rating.report.html as h
        from sample_results import sample_results
        from rating.report import render_report
        open({str(out)!r}, "w", encoding="utf-8").write(render_report(sample_results()))
        print(json.dumps({{"rating": rating.__file__, "templates": str(h.template_dir())}}))
    """)
    venv = str(installed["venv"].resolve())
    assert info["rating"].startswith(venv), info  # not the source tree, not editable
    assert info["templates"].startswith(venv), info
    assert Path(info["templates"]).is_dir() and not Path(info["templates"]).is_symlink()
    assert out.read_text(encoding="utf-8") == render_report(sample_results())


def test_installed_wheel_rates_a_sample_workbook_like_the_source(
        installed: dict[str, Path], sample_outcomes: list[Any],
        tmp_path: Path) -> None:
    """End to end with the installed command line, when a sample workbook can be rated."""
    from rating.pipeline import write_outputs

    o = smallest_rated(sample_outcomes)
    if o is None:
        pytest.skip("no sample workbook could be rated (sample_inventory/ not ready)")
    src_html, src_json = write_outputs(o.results, tmp_path / "src", o.workbook.stem)
    cli = installed["venv"] / "bin" / "pintruss"
    _run([str(cli), "rate", str(o.workbook), "--out", str(tmp_path / "wheel")], tmp_path)
    wheel_html = tmp_path / "wheel" / src_html.name
    wheel_json = tmp_path / "wheel" / src_json.name
    assert wheel_json.read_bytes() == src_json.read_bytes()
    assert wheel_html.read_bytes() == src_html.read_bytes()

"""The whole chain on the bundled sample workbooks: rate, validate the results file against
its documented schema (docs/results.schema.json, JSON Schema 2020-12, checked with the
independent jsonschema library), determinism, inputs untouched, exit codes."""

from __future__ import annotations

import hashlib
import json
import shutil
from pathlib import Path

import pytest

from rating.cli import main
from rating.pipeline import rate_workbook
from rating.results import results_json

ROOT = Path(__file__).resolve().parents[1]
SAMPLES = sorted((ROOT / "sample_inventory").glob("*.xlsx"))
SCHEMA = json.loads((ROOT / "docs" / "results.schema.json").read_text())


@pytest.fixture(scope="module")
def outcomes():
    return {p.name: rate_workbook(p) for p in SAMPLES}


def test_there_are_three_samples():
    assert len(SAMPLES) >= 3


@pytest.mark.parametrize("name", [p.name for p in SAMPLES])
def test_sample_rates_and_validates_against_schema(outcomes, name):
    jsonschema = pytest.importorskip("jsonschema")
    out = outcomes[name]
    assert out.results is not None, [p.format() for p in out.errors]
    doc = json.loads(results_json(out.results))
    jsonschema.validate(doc, SCHEMA)
    assert doc["posting"] and doc["members"] and doc["vehicles"]
    assert "licensed engineer" in doc["recommendation"]


def test_parker_sample_forces_a_posting(outcomes):
    res = outcomes["tc0622_parker_1907.xlsx"].results
    assert res.recommendation.startswith("Post the bridge")
    assert any(p.action == "post" for p in res.posting.values())


def test_si_sample_reports_in_si_with_whole_tonnes(outcomes):
    res = outcomes["tc0903_pony_1903_si.xlsx"].results
    doc = json.loads(results_json(res))
    assert doc["units"]["force"] == "kN" and doc["units"]["weight"] == "tonne"
    posted = [p for p in doc["posting"].values() if p["action"] == "post"]
    assert posted and all(float(p["posting_tons"]).is_integer() for p in posted)


def test_same_input_gives_byte_identical_json():
    pony = next(p for p in SAMPLES if "pony" in p.name)
    a = results_json(rate_workbook(pony).results)
    b = results_json(rate_workbook(pony).results)
    assert a == b


def test_rate_command_leaves_the_workbook_alone(tmp_path):
    src = next(p for p in SAMPLES if "pony" in p.name)
    wb = tmp_path / src.name
    shutil.copy2(src, wb)
    before = hashlib.sha256(wb.read_bytes()).hexdigest()
    assert main(["rate", str(wb), "--out", str(tmp_path / "out")]) == 0
    assert hashlib.sha256(wb.read_bytes()).hexdigest() == before
    assert (tmp_path / "out" / f"{wb.stem}.rating.html").is_file()
    assert (tmp_path / "out" / f"{wb.stem}.rating.json").is_file()
    # never over the input, whatever the options say
    assert main(["rate", str(wb), "--json", str(wb)]) == 2
    assert hashlib.sha256(wb.read_bytes()).hexdigest() == before


def test_exit_codes(tmp_path, capsys):
    assert main(["rate"]) == 2  # usage: workbook missing
    assert main(["rate", str(tmp_path / "nowhere.xlsx")]) == 1
    bad = tmp_path / "broken.xlsx"
    bad.write_bytes(b"not a workbook")
    assert main(["rate", str(bad)]) == 1
    err = capsys.readouterr().err
    assert "broken.xlsx" in err and "Traceback" not in err
    assert main(["vehicles"]) == 0
    assert "HL-93" in capsys.readouterr().out

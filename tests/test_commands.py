"""The rate command with output places it cannot write: a clear message naming the option
and the path, exit 2 before any rating, nothing written; a failure while writing: exit 1, a
message, no traceback."""

from __future__ import annotations

import errno
import sys
from pathlib import Path

import pytest

sys.path.insert(0, str(Path(__file__).resolve().parent / "report"))

from sample_results import sample_results  # noqa: E402

import rating.pipeline  # noqa: E402
from rating.cli import main  # noqa: E402
from rating.pipeline import RateOutcome  # noqa: E402

SAMPLE = sorted((Path(__file__).resolve().parents[1] / "sample_inventory").glob("*pony*.xlsx"))


@pytest.fixture
def workbook(tmp_path: Path) -> Path:
    """A workbook to rate (its rating replaced by the hand-built sample results: these tests
    are about where the outputs go)."""
    if not SAMPLE:
        pytest.skip("sample_inventory/ has no pony sample")
    book = tmp_path / "in" / "bridge.xlsx"
    book.parent.mkdir()
    book.write_bytes(SAMPLE[0].read_bytes())
    return book


@pytest.fixture
def rated(monkeypatch: pytest.MonkeyPatch) -> list[Path]:
    calls: list[Path] = []

    def rate(path: Path, vehicle_ids: list[str] | None = None) -> RateOutcome:
        calls.append(Path(path))
        return RateOutcome(Path(path), sample_results(), ())

    monkeypatch.setattr(rating.pipeline, "rate_workbook", rate)
    return calls


def _files(folder: Path) -> set[str]:
    return {str(p.relative_to(folder)) for p in folder.rglob("*")}


@pytest.mark.parametrize(("args", "said"), [
    (["--out", "{tmp}/afile"], "--out {tmp}/afile is a file, not a folder"),
    (["--out", "{tmp}/afile/sub"], "--out {tmp}/afile/sub: {tmp}/afile is a file"),
    (["--out", "{tmp}/o", "--json", "{tmp}/afile/r.json"],
     "--json {tmp}/afile/r.json: {tmp}/afile is a file"),
    (["--out", "{tmp}/o", "--json", "{tmp}/o"], "--json {tmp}/o is a folder, not a file name"),
    (["--out", "{tmp}/taken"], "results file {tmp}/taken/bridge.rating.json is a folder"),
])
def test_an_output_place_that_cannot_be_written_is_refused_before_rating(
        tmp_path: Path, workbook: Path, rated: list[Path], capsys: pytest.CaptureFixture[str],
        args: list[str], said: str) -> None:
    (tmp_path / "afile").write_text("a file the user keeps")
    (tmp_path / "o").mkdir()
    (tmp_path / "taken" / "bridge.rating.json").mkdir(parents=True)
    before = _files(tmp_path)
    code = main(["rate", str(workbook), *[a.format(tmp=tmp_path) for a in args]])
    err = capsys.readouterr().err
    assert code == 2
    assert said.format(tmp=tmp_path) in err and "Traceback" not in err
    assert rated == []  # refused before the rating
    assert _files(tmp_path) == before  # nothing written
    assert (tmp_path / "afile").read_text() == "a file the user keeps"


def test_a_failure_while_writing_is_a_message_not_a_traceback(
        tmp_path: Path, workbook: Path, rated: list[Path], monkeypatch: pytest.MonkeyPatch,
        capsys: pytest.CaptureFixture[str]) -> None:
    def full_disk(*args: object, **kwargs: object) -> None:
        raise OSError(errno.ENOSPC, "No space left on device")

    monkeypatch.setattr(rating.pipeline, "write_outputs", full_disk)
    code = main(["rate", str(workbook), "--out", str(tmp_path / "out")])
    err = capsys.readouterr().err
    assert code == 1
    assert "could not be written" in err and "No space left on device" in err
    assert "Traceback" not in err and rated == [workbook]


def test_a_workbook_that_is_missing_or_a_folder_is_named(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["rate", str(tmp_path / "gone.xlsx")]) == 1
    assert f"{tmp_path / 'gone.xlsx'}: it does not exist" in capsys.readouterr().err
    (tmp_path / "folder.xlsx").mkdir()
    assert main(["rate", str(tmp_path / "folder.xlsx")]) == 1
    assert "it is a folder, not a workbook file" in capsys.readouterr().err


def test_the_printout_states_each_action_in_the_report_words(
        workbook: Path, rated: list[Path], tmp_path: Path,
        capsys: pytest.CaptureFixture[str]) -> None:
    """The command's line for each vehicle ends with the action of the report's summary
    table (the printout said "none" beside HL-93 and beside a screening load rated below 1.0,
    where the report says "design-load rating" and "not posted")."""
    from rating.report.view import build_view

    assert main(["rate", str(workbook), "--out", str(tmp_path / "o")]) == 0
    lines = {ln.split()[0]: ln for ln in capsys.readouterr().out.splitlines()
             if ln.startswith("  ")}
    summary = build_view(sample_results()).summary
    assert {s.vehicle_id for s in summary} == set(lines)
    for s in summary:
        assert lines[s.vehicle_id].endswith(f" {s.action}"), (lines[s.vehicle_id], s.action)
    words = {s.action.split(" for ")[0] for s in summary}
    assert {"design-load rating", "post"} <= words and "none" not in words


def test_a_failed_rerun_says_the_outputs_left_in_place_are_from_an_earlier_run(
        workbook: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str],
        monkeypatch: pytest.MonkeyPatch) -> None:
    """The report and results of an earlier run stay (nothing the user has is removed), but
    a run that cannot rate the workbook says they do not reflect it as it is now."""
    from rating.inventory.problems import Problem

    out = tmp_path / "o"
    out.mkdir()
    (out / "bridge.rating.html").write_text("earlier report")
    (out / "bridge.rating.json").write_text("{}")
    monkeypatch.setattr(rating.pipeline, "rate_workbook", lambda path, ids=None: RateOutcome(
        Path(path), None, (Problem("error", "Members!C7", "no section"),)))
    assert main(["rate", str(workbook), "--out", str(out)]) == 1
    err = capsys.readouterr().err
    assert f"{out / 'bridge.rating.html'} and {out / 'bridge.rating.json'} are from an " \
        "earlier run and do not reflect this workbook as it is now" in err
    assert (out / "bridge.rating.html").read_text() == "earlier report"


def test_a_report_that_cannot_be_made_leaves_no_new_results_beside_an_old_report(
        workbook: Path, rated: list[Path], tmp_path: Path,
        monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    """Both outputs are made before either is written."""
    import rating.report.html

    out = tmp_path / "o"
    out.mkdir()
    (out / "bridge.rating.html").write_text("earlier report")

    def broken(*args: object, **kwargs: object) -> str:
        raise OSError("template folder unreadable")

    monkeypatch.setattr(rating.report.html, "render_report", broken)
    assert main(["rate", str(workbook), "--out", str(out)]) == 1
    assert not (out / "bridge.rating.json").exists()
    assert (out / "bridge.rating.html").read_text() == "earlier report"


# ------------------------------------------------------------------ --previous


def _previous_file(tmp_path: Path, bridge_id: str | None = None) -> Path:
    """The sample's results as an earlier inspection's, with SU4 posted higher then."""
    import json

    from rating.results import results_json

    data = json.loads(results_json(sample_results()))
    data["bridge"]["inspection_date"] = "2022-05-10"
    data["posting"]["SU4"].update(rf=1.02, action="post", posting_tons=31.0)
    if bridge_id is not None:
        data["bridge"]["id"] = bridge_id
    path = tmp_path / "earlier" / "bridge.rating.json"
    path.parent.mkdir(exist_ok=True)
    path.write_text(json.dumps(data), encoding="utf-8")
    return path


def test_rate_with_previous_says_what_changed_in_the_printout_json_and_report(
        workbook: Path, rated: list[Path], tmp_path: Path,
        capsys: pytest.CaptureFixture[str]) -> None:
    import json

    previous = _previous_file(tmp_path)
    kept = previous.read_bytes()
    out = tmp_path / "o"
    assert main(["rate", str(workbook), "--out", str(out), "--previous", str(previous)]) == 0
    said = capsys.readouterr().out
    assert "Since the rating of the inspection of 2022-05-10: truck weight limit lowered " \
        "from 31 to 26 tons; worse: SU4 posting lowered from 31 to 26 tons" in said
    data = json.loads((out / "bridge.rating.json").read_text(encoding="utf-8"))
    assert data["previous"]["file"] == "bridge.rating.json"
    assert "Since the previous rating" in (out / "bridge.rating.html").read_text()
    assert previous.read_bytes() == kept  # read only
    first = (out / "bridge.rating.json").read_bytes()
    assert main(["rate", str(workbook), "--out", str(out), "--previous", str(previous)]) == 0
    assert (out / "bridge.rating.json").read_bytes() == first  # byte-identical again


def test_previous_that_would_be_written_over_or_is_no_results_file_is_refused(
        workbook: Path, rated: list[Path], tmp_path: Path,
        capsys: pytest.CaptureFixture[str]) -> None:
    previous = _previous_file(tmp_path)
    kept = previous.read_bytes()
    # its folder as --out: the new results file would replace it
    code = main(["rate", str(workbook), "--out", str(previous.parent), "--previous",
                 str(previous)])
    err = capsys.readouterr().err
    assert code == 2 and "it is the previous results file given with --previous" in err
    assert rated == [] and previous.read_bytes() == kept
    before = _files(tmp_path)
    for bad, said in ((tmp_path / "none.json", "there is no such file"),
                      (workbook, "it is a workbook (or another zip file), not a results "
                                 "file")):
        code = main(["rate", str(workbook), "--out", str(tmp_path / "o"), "--previous",
                     str(bad)])
        err = capsys.readouterr().err
        assert code == 2 and said in err and "nothing was rated or written" in err
        assert "Traceback" not in err
    assert rated == [] and _files(tmp_path) == before


def test_previous_of_another_bridge_is_refused_and_nothing_written(
        workbook: Path, rated: list[Path], tmp_path: Path,
        capsys: pytest.CaptureFixture[str]) -> None:
    previous = _previous_file(tmp_path, bridge_id="CR-999")
    code = main(["rate", str(workbook), "--out", str(tmp_path / "o"), "--previous",
                 str(previous)])
    err = capsys.readouterr().err
    assert code == 2
    assert "it is the rating of bridge 'CR-999', not of 'CR-114-0032'" in err
    assert not (tmp_path / "o").exists()

"""Batch rating: carries on past a bad workbook, lists it, never writes over an input, writes
the summary CSV and the HTML index atomically. The CSV is read back with the standard
library's csv module; the index with html.parser (tests/report/htmlcheck.py)."""

from __future__ import annotations

import csv
import hashlib
import io
import os
import sys
from dataclasses import replace
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

sys.path.insert(0, str(Path(__file__).resolve().parent / "report"))

from htmlcheck import read  # noqa: E402
from sample_results import sample_results  # noqa: E402

from rating.batch import (  # noqa: E402
    INDEX_HTML,
    SUMMARY_CSV,
    BridgeRow,
    Progress,
    find_workbooks,
    output_stems,
    print_summary,
    rate_folder,
    summary_csv,
)
from rating.cli import main  # noqa: E402
from rating.errors import InputError  # noqa: E402
from rating.inventory.problems import Problem  # noqa: E402
from rating.pipeline import RateOutcome  # noqa: E402

GOOD = b"GOOD workbook stand-in"


def fake_rate(path: Path, vehicle_ids: list[str] | None = None) -> RateOutcome:
    """Stand-in for the pipeline (module level, so a pool process can use it): files that
    start with GOOD rate as the hand-built sample; FAULT raises; others have an error."""
    data = Path(path).read_bytes()
    if data.startswith(GOOD):
        return RateOutcome(Path(path), sample_results(),
                           (Problem("warning", "Bridge!B10", "assumed: steel by year"),))
    if data.startswith(b"FAULT"):
        raise RuntimeError("simulated program fault")
    if data.startswith(b"KILL"):  # the process dies, as when the system kills it (memory)
        os._exit(9)
    return RateOutcome(Path(path), None, (Problem("error", "Members!C7",
                                                  "member U1U2 has no section"),))


def _folder(tmp_path: Path, files: dict[str, bytes]) -> Path:
    folder = tmp_path / "inspections"
    folder.mkdir()
    for name, data in files.items():
        (folder / name).write_bytes(data)
    return folder


def _digest(folder: Path) -> dict[str, str]:
    return {p.name: hashlib.sha256(p.read_bytes()).hexdigest() for p in folder.iterdir()}


def _csv_rows(path: Path) -> list[dict[str, str]]:
    return list(csv.DictReader(io.StringIO(path.read_text(encoding="utf-8-sig"))))


def test_a_rating_process_that_dies_loses_no_other_workbook(tmp_path: Path) -> None:
    # A worker that dies (killed for memory on a very large truss) breaks its pool: every
    # workbook waiting in it was lost. They are rated again one at a time; only the one
    # whose process dies is not rated, and said so.
    files = {f"bridge_{i}.xlsx": GOOD for i in range(5)}
    files["bridge_2.xlsx"] = b"KILL" + b" " * 100  # (the largest: rated first)
    folder = _folder(tmp_path, files)
    s = rate_folder(folder, tmp_path / "out", workers=2, rate=fake_rate)
    assert [r.workbook for r in s.rows] == [f"bridge_{i}.xlsx" for i in range(5)]
    assert [r.rated for r in s.rows] == [True, True, False, True, True]
    (msg,) = s.rows[2].errors
    assert "bridge_2.xlsx: the rating process died, also when rated alone" in msg
    rows = _csv_rows(tmp_path / "out" / SUMMARY_CSV)
    assert [r["status"] for r in rows] == ["rated", "rated", "not rated", "rated", "rated"]


@pytest.mark.parametrize("workers", [1, 2])
def test_batch_rates_the_others_and_lists_the_broken_one(tmp_path: Path, workers: int) -> None:
    folder = _folder(tmp_path, {"b_mill.xlsx": GOOD, "a_creek.xlsx": GOOD,
                                "c_broken.xlsx": b"not a workbook",
                                "~$a_creek.xlsx": b"excel lock file", "notes.txt": b"x"})
    before = _digest(folder)
    out = tmp_path / "out"
    err = io.StringIO()
    s = rate_folder(folder, out, workers=workers, progress=err, rate=fake_rate)
    assert [r.workbook for r in s.rows] == ["a_creek.xlsx", "b_mill.xlsx", "c_broken.xlsx"]
    assert [r.rated for r in s.rows] == [True, True, False]
    assert s.failed[0].errors == ("error   Members!C7: member U1U2 has no section",)
    assert s.workers == workers
    for stem in ("a_creek", "b_mill"):
        assert (out / f"{stem}.rating.html").is_file() and (out / f"{stem}.rating.json").is_file()
    assert not (out / "c_broken.rating.html").exists()
    assert _digest(folder) == before  # inputs untouched
    assert not list(out.glob(".*.tmp"))  # no temporary file left behind
    # the summary table
    rows = _csv_rows(out / SUMMARY_CSV)
    assert [r["status"] for r in rows] == ["rated", "rated", "not rated"]
    res = sample_results()
    assert rows[0]["structure"] == res.bridge.id
    assert rows[0]["recommendation"] == res.recommendation
    for vid, p in res.posting.items():
        assert rows[0][f"{vid} controlling member"] == p.member
        assert float(rows[0][f"{vid} RF"]) <= p.rf < float(rows[0][f"{vid} RF"]) + 0.01
    assert rows[0]["SU4 safe posting load"] == "26" and rows[0]["weight unit"] == "ton"
    assert "member U1U2 has no section" in rows[2]["problems"]
    # the HTML index: every bridge with its RF per vehicle, the broken one with its problem
    html = (out / INDEX_HTML).read_text(encoding="utf-8")
    doc = read(html)
    assert doc.errors == []
    text = " ".join(doc.text)
    assert "c_broken.xlsx" in text and "member U1U2 has no section" in text
    links = [a.get("href") for t, a in doc.tags if t == "a"]
    assert links == ["a_creek.rating.html", "b_mill.rating.html"]
    assert "recommendations for the" in html and "licensed engineer in responsible charge" in text
    # progress: one line per workbook when stderr is not a terminal
    lines = err.getvalue().splitlines()
    assert len(lines) == 3 and lines[-1].startswith("[3/3]")


def test_second_run_gives_byte_identical_outputs(tmp_path: Path) -> None:
    folder = _folder(tmp_path, {"a.xlsx": GOOD, "b.xlsx": b"broken"})
    out = tmp_path / "out"
    rate_folder(folder, out, workers=1, rate=fake_rate)
    first = {p.name: p.read_bytes() for p in out.iterdir() if p.name != INDEX_HTML}
    rate_folder(folder, out, workers=1, rate=fake_rate)
    second = {p.name: p.read_bytes() for p in out.iterdir() if p.name != INDEX_HTML}
    assert first == second  # reports, results and the CSV (the index records the run time)
    assert set(first) == {"a.rating.html", "a.rating.json", SUMMARY_CSV}


def test_program_fault_is_recorded_and_the_batch_goes_on(tmp_path: Path) -> None:
    folder = _folder(tmp_path, {"ok.xlsx": GOOD, "bad.xlsx": b"FAULT"})
    s = rate_folder(folder, tmp_path / "out", workers=1, rate=fake_rate)
    bad = next(r for r in s.rows if r.workbook == "bad.xlsx")
    assert not bad.rated and "internal error" in bad.errors[0]
    assert "simulated program fault" in bad.errors[0]
    assert next(r for r in s.rows if r.workbook == "ok.xlsx").rated


def test_never_writes_over_an_input(tmp_path: Path) -> None:
    folder = _folder(tmp_path, {"a.xlsx": GOOD})
    out = tmp_path / "out"
    out.mkdir()
    (out / SUMMARY_CSV).symlink_to(folder / "a.xlsx")  # an output that IS the input
    before = _digest(folder)
    with pytest.raises(InputError, match="refusing to write"):
        rate_folder(folder, out, workers=1, rate=fake_rate)
    assert _digest(folder) == before


def test_no_workbooks_and_missing_folder(tmp_path: Path) -> None:
    empty = tmp_path / "empty"
    empty.mkdir()
    (empty / "~$lock.xlsx").write_bytes(b"x")
    with pytest.raises(InputError, match="no inspection workbooks"):
        rate_folder(empty, tmp_path / "out")
    with pytest.raises(InputError, match="there is no folder"):
        find_workbooks(tmp_path / "nowhere")


def test_output_stems_unique_when_names_differ_only_in_case() -> None:
    assert output_stems([Path("A.xlsx"), Path("a.xlsx"), Path("b.xlsx")]) == ("A", "a-2", "b")


@settings(max_examples=60, deadline=None)
@given(st.lists(st.sampled_from(["a", "A", "b", "B", "a-2", "c"]), max_size=8))
def test_output_stems_always_unique(names: list[str]) -> None:
    stems = output_stems([Path(n + ".xlsx") for n in names])
    assert len({s.lower() for s in stems}) == len(stems)


def test_csv_cells_cannot_become_formulas() -> None:
    """Text starting with = + - @ is prefixed so a spreadsheet shows it as text (OWASP,
    CSV injection)."""
    row = BridgeRow("x.xlsx", True, structure="=HYPERLINK(\"x\")", name="+1", location="@a",
                    recommendation="-2")
    text = summary_csv([row])
    rec = next(csv.DictReader(io.StringIO(text.lstrip("\ufeff"))))
    assert rec["structure"].startswith("'=") and rec["bridge"] == "'+1"
    assert rec["location"] == "'@a" and rec["recommendation"] == "'-2"


class _Tty(io.StringIO):
    def isatty(self) -> bool:
        return True


def test_progress_bar_on_a_terminal() -> None:
    s = _Tty()
    bar = Progress(2, s, width=10)
    bar.update(BridgeRow("a.xlsx", True))
    bar.update(BridgeRow("b.xlsx", False, errors=("e",)))
    out = s.getvalue()
    assert out.startswith("\r[#####-----] 1/2 workbooks")
    assert "[##########] 2/2 workbooks, 1 not rated" in out and out.endswith("\n")


def test_cli_batch_exit_codes(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["batch", str(tmp_path / "nowhere"), "--out", str(tmp_path / "o")]) == 2
    folder = _folder(tmp_path, {"broken.xlsx": b"not a workbook"})
    code = main(["batch", str(folder), "--out", str(tmp_path / "o"), "--workers", "1"])
    assert code == 1
    out = capsys.readouterr()
    assert "0 of 1 workbook(s) rated" in out.out and "not rated: broken.xlsx" in out.out
    assert (tmp_path / "o" / SUMMARY_CSV).is_file() and (tmp_path / "o" / INDEX_HTML).is_file()
    assert main(["batch", str(folder), "--out", str(tmp_path / "o"), "--workers", "0"]) == 2
    # an --out that is a file is a misuse, as for 'rate' (it exited 1), and nothing is written
    a_file = tmp_path / "a_file.txt"
    a_file.write_text("mine")
    capsys.readouterr()
    assert main(["batch", str(folder), "--out", str(a_file), "--workers", "1"]) == 2
    assert "is a file, not a folder" in capsys.readouterr().err
    # and a folder beneath a file (it raised NotADirectoryError, a traceback)
    assert main(["batch", str(folder), "--out", str(a_file / "sub"), "--workers", "1"]) == 2
    assert "is a file, not a folder" in capsys.readouterr().err
    assert a_file.read_text() == "mine"
    # an id outside the library may be an owner's vehicle: said once, before the workbooks
    main(["batch", str(folder), "--out", str(tmp_path / "o"), "--workers", "1",
          "--vehicles", "HL-93,TWP-9"])
    err = capsys.readouterr().err
    assert err.count("TWP-9 is not in the vehicle library") == 1
    assert "HL-93 is not in" not in err


def test_batch_end_to_end_on_a_sample_workbook(tmp_path: Path) -> None:
    """The real pipeline in a pool: a sample workbook (the smallest) and one broken file."""
    samples = sorted((Path(__file__).resolve().parents[1] / "sample_inventory").glob("*.xlsx"),
                     key=lambda p: p.stat().st_size)
    if not samples:
        pytest.skip("no sample workbooks in sample_inventory/ yet")
    folder = tmp_path / "in"
    folder.mkdir()
    (folder / samples[0].name).write_bytes(samples[0].read_bytes())
    (folder / "zz_broken.xlsx").write_bytes(b"PK\x03\x04 truncated")
    s = rate_folder(folder, tmp_path / "out", workers=2)
    broken = next(r for r in s.rows if r.workbook == "zz_broken.xlsx")
    assert not broken.rated and broken.errors
    good = next(r for r in s.rows if r.workbook == samples[0].name)
    if not good.rated:
        pytest.skip(f"the sample workbook does not rate yet: {good.errors[:1]}")
    assert (tmp_path / "out" / good.report).is_file()
    assert good.vehicles and all(v.member for v in good.vehicles if v.rf is not None)


def test_pool_starts_with_the_largest_workbooks(tmp_path: Path) -> None:
    """Largest first (longest to rate), ties in name order, a vanished file last: the pool
    does not end on one long workbook while the other processes wait."""
    from rating.batch import _largest_first, _Task

    folder = _folder(tmp_path, {"a.xlsx": b"x" * 10, "b.xlsx": b"x" * 30, "c.xlsx": b"x" * 10,
                                "d.xlsx": b"x" * 20})
    tasks = [_Task(folder / n, tmp_path, n[:-5], None) for n in ("a.xlsx", "b.xlsx",
                                                                  "c.xlsx", "d.xlsx", "e.xlsx")]
    assert [t.workbook.name for t in _largest_first(tasks)] == \
        ["b.xlsx", "d.xlsx", "a.xlsx", "c.xlsx", "e.xlsx"]


def _rate_with_decision_note(path: Path, vehicle_ids: list[str] | None = None) -> RateOutcome:
    from dataclasses import replace

    from rating.results import DECISION_NOTE

    res = sample_results()
    return RateOutcome(Path(path), replace(res, recommendation="Post the bridge: 26 tons."
                                           + DECISION_NOTE), ())


def test_index_says_the_decision_note_once_the_csv_in_every_row(tmp_path: Path) -> None:
    """The sentence every recommendation ends with (the engineer decides; the owner's manual
    governs) is in the index's caution, once, not in each row's narrow column; the CSV, a
    row per bridge that may be read alone, keeps it in every row."""
    from rating.results import DECISION_NOTE

    folder = _folder(tmp_path, {"a.xlsx": GOOD, "b.xlsx": GOOD})
    out = tmp_path / "out"
    rate_folder(folder, out, workers=1, rate=_rate_with_decision_note)
    text = " ".join(read((out / INDEX_HTML).read_text(encoding="utf-8")).text)
    assert text.count("Post the bridge: 26 tons.") == 2
    assert text.count("for the decision of the licensed engineer in responsible charge") == 1
    rows = _csv_rows(out / SUMMARY_CSV)
    assert all(r["recommendation"].endswith(DECISION_NOTE.strip()) for r in rows)


def test_csv_says_not_posted_for_a_screening_load_below_one(tmp_path: Path) -> None:
    """A legal-level load rated below 1.0 whose posting is none (the NRL as a screen, FHWA SHV
    Q&A, March 2014) is "not posted" in the CSV, as in the report, never "none"."""
    from dataclasses import replace

    from rating.batch import _row_from_results

    res = sample_results()
    vid = next(v.id for v in res.vehicles if v.rating_level == "legal")
    entry = replace(res.posting[vid], rf=0.48, action="none", posting_tons=None,
                    note="screening load")
    res = replace(res, posting={**res.posting, vid: entry})
    row = _row_from_results(tmp_path / "a.xlsx", res, None, tmp_path / "a.json", (), 0.0)
    line = next(v for v in row.vehicles if v.vehicle == vid)
    assert line.action == "not posted"
    csv_row = _csv_rows_text(summary_csv([row]))[0]
    assert csv_row[f"{vid} action"] == "not posted"


def test_an_emergency_vehicle_that_cannot_be_posted_is_barred_not_a_closure(
        tmp_path: Path) -> None:
    """An emergency vehicle whose action is "close" (RF below 0.3, or a posting under 3 tons)
    reads "bar" in the CSV and leaves the bridge's action at "post" (rating.results.
    overall_action); a truck's "close" makes it "close"."""
    from dataclasses import replace

    from rating.batch import _row_from_results

    res = sample_results()
    ev = next(v.id for v in res.vehicles if v.category == "emergency")
    truck = next(v.id for v in res.vehicles
                 if v.rating_level == "legal" and v.category != "emergency")
    barred = replace(res, posting={**res.posting, ev: replace(
        res.posting[ev], rf=0.25, action="close", posting_tons=None)})
    row = _row_from_results(tmp_path / "a.xlsx", barred, None, tmp_path / "a.json", (), 0.0)
    assert next(v for v in row.vehicles if v.vehicle == ev).action == "bar"
    assert row.action == "post"
    assert _csv_rows_text(summary_csv([row]))[0][f"{ev} action"] == "bar"
    closed = replace(barred, posting={**barred.posting, truck: replace(
        barred.posting[truck], rf=0.2, action="close", posting_tons=None)})
    row = _row_from_results(tmp_path / "a.xlsx", closed, None, tmp_path / "a.json", (), 0.0)
    assert row.action == "close"


def test_a_bridge_whose_trucks_all_rate_one_or_more_posts_emergency_vehicles_only(
        tmp_path: Path) -> None:
    """Where the trucks rate 1.0 or more and only an emergency vehicle is posted or barred, the
    bridge's action says so ("post emergency vehicles"), not "post" beside a deciding truck
    RF of 1.0 or more (a reviewer read it as a truck posting); the index counts it with the
    postings."""
    from dataclasses import replace

    from rating.batch import EV_ONLY, _row_from_results

    res = sample_results()
    trucks = [v.id for v in res.vehicles
              if v.rating_level == "legal" and v.category != "emergency"]
    ev = next(v.id for v in res.vehicles if v.category == "emergency")
    fine = {**res.posting, **{t: replace(res.posting[t], rf=1.2, action="none",
                                         posting_tons=None) for t in trucks}}
    fine[ev] = replace(res.posting[ev], rf=0.6, action="post", posting_tons=10.0)
    row = _row_from_results(tmp_path / "a.xlsx", replace(res, posting=fine), None,
                            tmp_path / "a.json", (), 0.0)
    assert row.action == EV_ONLY == "post emergency vehicles"
    assert _csv_rows_text(summary_csv([row]))[0]["action"] == EV_ONLY


def _csv_rows_text(text: str) -> list[dict[str, str]]:
    return list(csv.DictReader(io.StringIO(text.lstrip("\ufeff"))))


BENT = ("BENT COUNTER RELIED ON: member L3U4 is recorded bent (Findings!B10) and is counted "
        "as fully effective in tension; the load path of its panel rests on it.")


def _rate_with_a_decision_warning(path: Path, vehicle_ids: list[str] | None = None
                                  ) -> RateOutcome:
    from dataclasses import replace

    res = sample_results()
    if Path(path).name == "a.xlsx":
        res = replace(res, warnings=(BENT, "member L0L1: pack rust recorded", *res.warnings))
    return RateOutcome(Path(path), res, ())


def test_a_warning_that_bears_on_the_decision_is_beside_the_recommendation(
        tmp_path: Path) -> None:
    """A consultant scanning a county's summary sees which bridges carry a warning that bears
    on the posting decision (rating.results.bears_on_the_decision): the CSV gives it in full in
    its own column, the index its first clause beside the recommendation; a bridge without
    one has none, and ordinary warnings stay in the reports."""
    folder = _folder(tmp_path, {"a.xlsx": GOOD, "b.xlsx": GOOD})
    out = tmp_path / "out"
    rate_folder(folder, out, workers=1, rate=_rate_with_a_decision_warning)
    rows = {r["workbook"]: r for r in _csv_rows(out / SUMMARY_CSV)}
    assert rows["a.xlsx"]["read before deciding"] == BENT
    assert rows["b.xlsx"]["read before deciding"] == ""
    text = " ".join(read((out / INDEX_HTML).read_text(encoding="utf-8")).text)
    assert text.count("Read before deciding:") == 1
    assert ("BENT COUNTER RELIED ON: member L3U4 is recorded bent (Findings!B10) and is "
            "counted as fully effective in tension (see the report)") in " ".join(text.split())
    assert "pack rust" not in text
    assert "; 1 with a warning to read before deciding." in " ".join(text.split())


def test_sub_folders_are_rated_and_their_outputs_mirror_them(tmp_path: Path) -> None:
    """A county filing its bridges by township: workbooks in sub-folders are found (hidden
    folders and lock files are not), named by their path in the summary, and their outputs
    go to the same sub-folders of --out, so two workbooks of one name in two townships keep
    apart; the index links reach each report."""
    folder = _folder(tmp_path, {"a.xlsx": GOOD})
    (folder / "north" / "deep").mkdir(parents=True)
    (folder / "north" / "a.xlsx").write_bytes(GOOD)
    (folder / "north" / "deep" / "b.xlsx").write_bytes(b"broken")
    (folder / ".hidden").mkdir()
    (folder / ".hidden" / "c.xlsx").write_bytes(GOOD)
    (folder / "north" / "~$a.xlsx").write_bytes(b"lock")
    assert [p.relative_to(folder).as_posix() for p in find_workbooks(folder)] == [
        "a.xlsx", "north/a.xlsx", "north/deep/b.xlsx"]
    out = tmp_path / "out"
    summary = rate_folder(folder, out, workers=1, rate=fake_rate)
    assert [r.workbook for r in summary.rows] == ["a.xlsx", "north/a.xlsx", "north/deep/b.xlsx"]
    assert (out / "a.rating.html").is_file() and (out / "north" / "a.rating.html").is_file()
    assert [r.report for r in summary.rated] == ["a.rating.html", "north/a.rating.html"]
    assert [r.workbook for r in summary.failed] == ["north/deep/b.xlsx"]
    index = (out / INDEX_HTML).read_text(encoding="utf-8")
    assert 'href="north/a.rating.html"' in index
    rows = _csv_rows(out / SUMMARY_CSV)
    assert [r["workbook"] for r in rows] == ["a.xlsx", "north/a.xlsx", "north/deep/b.xlsx"]


def test_index_links_are_percent_encoded(tmp_path: Path) -> None:
    """A "#" in a file name would make the rest of the link a fragment (the report did not
    open); spaces, "%" and letters beyond ASCII are encoded too (RFC 3986)."""
    folder = _folder(tmp_path, {"bridge #12 (old) 50%.xlsx": GOOD, "Brücke.xlsx": GOOD})
    out = tmp_path / "out"
    rate_folder(folder, out, workers=1, rate=fake_rate)
    index = (out / INDEX_HTML).read_text(encoding="utf-8")
    assert 'href="bridge%20%2312%20%28old%29%2050%25.rating.html"' in index
    assert 'href="Br%C3%BCcke.rating.html"' in index
    assert (out / "bridge #12 (old) 50%.rating.html").is_file()


def test_earlier_outputs_and_copies_are_named_in_the_summary(tmp_path: Path) -> None:
    """A workbook rated once and broken since: its report from the earlier run stays (the
    output folder is the user's; nothing is removed) but the index and CSV say it is not from
    this run. Rating files no workbook of this run made are counted; one structure rated
    from two workbooks is pointed out."""
    folder = _folder(tmp_path, {"a.xlsx": GOOD, "b.xlsx": GOOD})
    out = tmp_path / "out"
    rate_folder(folder, out, workers=1, rate=fake_rate)
    (folder / "a.xlsx").write_bytes(b"broken since")
    (out / "gone.rating.json").write_text("{}")
    before = (out / "a.rating.html").read_bytes()
    summary = rate_folder(folder, out, workers=1, rate=fake_rate)
    row = next(r for r in summary.rows if r.workbook == "a.xlsx")
    assert not row.rated and row.stale == ("a.rating.html", "a.rating.json")
    assert (out / "a.rating.html").read_bytes() == before  # kept as it was
    assert summary.others == ("gone.rating.json",)
    index = (out / INDEX_HTML).read_text(encoding="utf-8")
    assert "From an earlier run, not this one:" in index and "gone.rating.json" in index
    csv_row = next(r for r in _csv_rows(out / SUMMARY_CSV) if r["workbook"] == "a.xlsx")
    assert "from an earlier run, not this one: a.rating.html, a.rating.json" in csv_row["problems"]
    # two workbooks of one structure (both stand-ins are the same sample bridge)
    (folder / "a.xlsx").write_bytes(GOOD)
    rate_folder(folder, out, workers=1, rate=fake_rate)
    index = (out / INDEX_HTML).read_text(encoding="utf-8")
    sid = sample_results().bridge.id
    assert f"Structure {sid}</strong> is rated from 2 workbooks" in index
    # the terminal says so too, not only the index
    from rating.batch import print_summary

    text = io.StringIO()
    print_summary(rate_folder(folder, out, workers=1, rate=fake_rate), text)
    assert f"note: structure {sid} is rated from 2 workbooks: a.xlsx, b.xlsx" in text.getvalue()
    assert "rating file(s) in the output folder are not from this run" in text.getvalue()
    assert index.index('id="failed"') < index.index('id="rated"')  # what needs action first


def test_csv_speaks_as_the_report_and_its_lowest_rf_is_a_trucks(tmp_path: Path) -> None:
    """HL-93's action reads "design-load rating" as in the report (not "none"); the lowest RF
    beside the action is the lowest truck's: an emergency vehicle never closes a bridge
    (rating.results.overall_action), so it is not the one named there."""
    from dataclasses import replace

    from rating.batch import _row_from_results

    res = sample_results()
    ev = next(v.id for v in res.vehicles if v.category == "emergency")
    low_ev = replace(res, posting={**res.posting, ev: replace(res.posting[ev], rf=0.05)})
    row = _row_from_results(tmp_path / "a.xlsx", low_ev, None, tmp_path / "a.json", (), 0.0)
    design = [v for v in row.vehicles if v.level in ("inventory", "operating")]
    assert design and all(v.action == "design-load rating" for v in design
                          if res.posting[v.vehicle].action == "none")
    low = row.lowest_legal()
    assert low is not None and low.vehicle != ev and low.category != "emergency"
    csv_row = _csv_rows_text(summary_csv([row]))[0]
    assert csv_row["deciding truck"] == low.vehicle


def test_the_deciding_truck_is_the_one_behind_the_action(tmp_path: Path) -> None:
    """The CSV's deciding truck: a closing one where the bridge closes (a lighter truck can
    close it by the 3-ton rule while the lowest RF is posted), the lowest posting where it is
    posted. Structure ids that differ only in case or spaces are one bridge."""
    from dataclasses import replace

    from rating.batch import VehicleLine, _same_structure

    lines = (VehicleLine("SU7", "SU7", "legal", 0.36, "L1U1", "post", 3.0, "specialized"),
             VehicleLine("SU6", "SU6", "legal", 0.37, "L1U1", "close", None, "specialized"),
             VehicleLine("T3", "T3", "legal", 0.40, "L1U1", "post", 5.0, "legal"))
    row = BridgeRow(workbook="a.xlsx", rated=True, vehicles=lines, action="close")
    assert row.lowest_legal().vehicle == "SU6"
    posted = replace(row, vehicles=(lines[0], lines[2]), action="post")
    assert posted.lowest_legal().vehicle == "SU7"
    # a bridge whose "post" is an emergency vehicle's barring names that vehicle; the NRL, a
    # screen never posted, decides nothing
    nrl = VehicleLine("NRL", "NRL", "legal", 0.49, "U2L3", "not posted", None, "specialized")
    fine = VehicleLine("T3", "T3", "legal", 1.2, "L1U1", "none", None, "legal")
    ev = VehicleLine("EV3", "EV3", "legal", 0.25, "L1U1", "bar", None, "emergency")
    assert replace(row, vehicles=(nrl, fine, ev), action="post").lowest_legal().vehicle == "EV3"
    assert replace(row, vehicles=(nrl, fine), action="none").lowest_legal().vehicle == "T3"
    same = _same_structure([replace(row, structure="TC-0417"),
                            replace(row, workbook="b.xlsx", structure=" tc-0417 ")])
    assert same == (("TC-0417", ("a.xlsx", "b.xlsx")),)


def test_the_index_keeps_the_verdict_of_a_sensitivity() -> None:
    """A bent counter's warning is cut to its first clause in the index, but the verdict of
    its sensitivity (what the members give without it) is kept: it is the part that bears on
    the decision (a reviewer saw "post 9 tonnes" beside a warning stripped of "a closure to
    consider")."""
    from rating.batch import _first_clause

    w = ("BENT COUNTER RELIED ON: member L2U3 is recorded bent (Findings!B9) and is counted as "
         "fully effective; the load path rests on it. The engineer should confirm it. Rated as "
         "if L2U3 did not act (its bars loose), the members give a closure to consider: lowest "
         "truck RF 0.07 (SU6, U2L3); the pins were not rated again, so this RF is the most.")
    assert _first_clause(w) == (
        "BENT COUNTER RELIED ON: member L2U3 is recorded bent (Findings!B9) and is counted as "
        "fully effective. Rated as if L2U3 did not act (its bars loose), the members give a "
        "closure to consider: lowest truck RF 0.07 (SU6, U2L3)")
    assert _first_clause("OUT OF SERVICE: x; y") == "OUT OF SERVICE: x"


def test_a_permit_says_its_verdict_and_decides_nothing_for_the_bridge(tmp_path: Path) -> None:
    """A permit load (MBE 6A.4.5 [value from memory]) is never posted: in the CSV its action
    is the report's words for it, and even an RF of 0.2 neither closes the bridge nor becomes
    its deciding truck."""
    from dataclasses import replace

    from rating.batch import _row_from_results
    from rating.results import PostingResultEntry

    res = sample_results()
    truck = next(v for v in res.vehicles if v.rating_level == "legal"
                 and v.category != "emergency")
    permit = replace(truck, id="PERMIT-1", name="invented crane", category="single-trip permit",
                     rating_level="permit")
    entry = PostingResultEntry(rf=0.2, rating_tons=9.2, posting_tons=None, member="L1U1",
                               action="none", note="permit load", permit="not as requested")
    fine = {**res.posting, "PERMIT-1": entry}
    res = replace(res, vehicles=(*res.vehicles, permit), posting=fine)
    row = _row_from_results(tmp_path / "a.xlsx", res, None, tmp_path / "a.json", (), 0.0)
    line = next(v for v in row.vehicles if v.vehicle == "PERMIT-1")
    assert line.action == "permit: not as requested"
    assert row.action != "close"
    low = row.lowest_legal()
    assert low is not None and low.vehicle != "PERMIT-1"
    csv_row = _csv_rows_text(summary_csv([row]))[0]
    assert csv_row["PERMIT-1 action"] == "permit: not as requested"
    assert csv_row["deciding truck"] != "PERMIT-1"
    # the index names the verdict beside the permit's member
    from rating.batch import BatchSummary, render_index

    index = render_index(BatchSummary(tmp_path, tmp_path, (row,), tmp_path / "s.csv",
                                      tmp_path / "i.html", 1.0, 1))
    assert "L1U1 (permit: not as requested)" in index


def test_a_recommendation_resting_on_a_condition_is_marked_and_its_verdict_kept(
        tmp_path: Path) -> None:
    """A recommendation that starts "Only if ... is confirmed" is marked in the CSV ("rests
    on a condition") and counted in the index; the index's short form of a sensitivity's
    warning keeps what the trucks give (the part that bears on the decision)."""
    from dataclasses import replace

    from rating.batch import BatchSummary, _first_clause, _row_from_results, render_index
    from rating.results import DECISION_NOTE

    res = sample_results()
    warning = ("STEEL GRADE NEAR A TABLE BOUNDARY: the bridge was built in 1906, within the 3 "
               "years 1905-1907 after the 1905 boundary of MBE Table 6A.6.2.1-1 [value from "
               "memory]; its 31 members taking the steel by year may be of the older steel "
               "(F_y = 26 ksi, F_u = 52 ksi). Rated so, the trucks give a posting: lowest "
               "truck RF 0.78 (SU7, L1U1), against 0.92 (SU7, L1U1). Coupon tests would "
               "settle the grade")
    res = replace(res, recommendation="Only if the steel is confirmed of the later grade "
                  "(coupon tests or mill records): post the bridge. " + DECISION_NOTE.strip(),
                  warnings=(*res.warnings, warning))
    row = _row_from_results(tmp_path / "a.xlsx", res, None, tmp_path / "a.json", (), 0.0)
    assert row.conditional
    assert _csv_rows_text(summary_csv([row]))[0]["rests on a condition"] == "yes"
    short = _first_clause(warning)
    assert short.endswith("the trucks give a posting: lowest truck RF 0.78 (SU7, L1U1), "
                          "against 0.92 (SU7, L1U1)")
    index = render_index(BatchSummary(tmp_path, tmp_path, (row,), tmp_path / "s.csv",
                                      tmp_path / "i.html", 1.0, 1))
    assert "1 whose recommendation rests on a condition to confirm" in index


def rate_with_ids(path: Path, vehicle_ids: list[str] | None = None) -> RateOutcome:
    """Stand-in for the pipeline: as :func:`fake_rate`, each workbook's structure id taken
    from its bytes after "id=" (module level, so a pool process can use it)."""
    outcome = fake_rate(path, vehicle_ids)
    data = Path(path).read_bytes()
    if outcome.results is None or b"id=" not in data:
        return outcome
    sid = data.split(b"id=", 1)[1].decode()
    res = outcome.results
    return replace(outcome, results=replace(res, bridge=replace(res.bridge, id=sid)))


def test_batch_with_previous_compares_each_bridge_with_its_earlier_results(
        tmp_path: Path) -> None:
    import json

    folder = _folder(tmp_path, {"a.xlsx": GOOD + b"id=A", "b.xlsx": GOOD + b"id=B",
                                "c.xlsx": GOOD + b"id=C", "d.xlsx": b"bad",
                                "e.xlsx": GOOD + b"id=E"})
    earlier = tmp_path / "earlier"
    rate_folder(folder, earlier, workers=1, rate=rate_with_ids)
    data = json.loads((earlier / "a.rating.json").read_text(encoding="utf-8"))
    data["bridge"]["inspection_date"] = "2022-05-10"
    data["posting"]["SU4"].update(rf=1.02, action="post", posting_tons=31.0)
    (earlier / "a.rating.json").write_text(json.dumps(data), encoding="utf-8")
    # b's file is another bridge's, and no other file rates B; c's is gone; e's was filed
    # under another name (its workbook renamed since)
    data["bridge"]["id"] = "CR-999"
    (earlier / "b.rating.json").write_text(json.dumps(data), encoding="utf-8")
    (earlier / "c.rating.json").unlink()
    (earlier / "e.rating.json").rename(earlier / "old-name.rating.json")
    kept = _digest(earlier)
    s = rate_folder(folder, tmp_path / "now", workers=2, rate=rate_with_ids,
                    previous=earlier)
    since = {r.workbook: r.since for r in s.rows}
    assert since["a.xlsx"].startswith("Since the rating of the inspection of 2022-05-10: "
                                      "truck weight limit lowered from 31 to 26 tons; "
                                      "worse: SU4 posting lowered from 31 to 26 tons")
    assert since["b.xlsx"].startswith("not compared: ") and "'CR-999'" in since["b.xlsx"]
    assert any("--previous" in w for w in s.rows[1].warnings)
    assert since["c.xlsx"] == "no previous rating: no c.rating.json in the --previous folder"
    assert since["d.xlsx"] == ""  # not rated: nothing to compare
    assert since["e.xlsx"].endswith("(found by its structure id: old-name.rating.json)")
    assert [r.workbook for r in s.rows if r.worse] == ["a.xlsx"]
    rows = {r["workbook"]: r for r in _csv_rows(s.csv_path)}
    assert rows["a.xlsx"]["since the previous rating"] == since["a.xlsx"]
    assert [rows[k]["worse than at the previous rating"] for k in sorted(rows)] == \
        ["yes", "", "", "", ""]
    assert "1 whose outcome is worse than at its previous rating" in \
        " ".join(read(s.index_path.read_text(encoding="utf-8")).text)
    out = io.StringIO()
    print_summary(s, out)
    assert "1 bridge(s) rate worse than at their previous rating: a.xlsx" in out.getvalue()
    assert _digest(earlier) == kept  # read only


def test_batch_with_previous_says_which_files_rate_the_same_bridge(tmp_path: Path) -> None:
    """Two earlier results files rate the bridge of a workbook whose own file is gone: the
    comparison is not guessed, and both are named."""
    import shutil

    folder = _folder(tmp_path, {"a.xlsx": GOOD + b"id=A"})
    earlier = tmp_path / "earlier"
    rate_folder(folder, earlier, workers=1, rate=rate_with_ids)
    (earlier / "a.rating.json").rename(earlier / "one.rating.json")
    shutil.copy(earlier / "one.rating.json", earlier / "two.rating.json")
    s = rate_folder(folder, tmp_path / "now", workers=1, rate=rate_with_ids,
                    previous=earlier)
    assert s.rows[0].since == ("not compared: no a.rating.json in the --previous folder; 2 "
                               "results files there rate structure A: one.rating.json, "
                               "two.rating.json")


def test_batch_refuses_previous_that_it_would_write_over(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    folder = _folder(tmp_path, {"a.xlsx": GOOD})
    out = tmp_path / "out"
    rate_folder(folder, out, workers=1, rate=fake_rate)
    kept = _digest(out)
    with pytest.raises(InputError, match="it is a previous results file read with --previous"):
        rate_folder(folder, out, workers=1, rate=fake_rate, previous=out)
    assert main(["batch", str(folder), "--out", str(out), "--previous", str(out)]) == 2
    assert "is this batch's --out folder" in capsys.readouterr().err
    assert main(["batch", str(folder), "--out", str(tmp_path / "o2"), "--previous",
                 str(tmp_path / "nowhere")]) == 2
    assert "there is no such folder" in capsys.readouterr().err
    assert _digest(out) == kept and not (tmp_path / "o2").exists()


def test_a_closure_resting_on_a_condition_is_counted_as_one_to_consider() -> None:
    """A recommendation that leads with a closure until a bent member is confirmed to act
    (rating.results.CLOSING_UNLESS) rests on a condition and is a closure to consider, though
    its trucks, as rated, are posted (a reviewer found the index saying "0 with a closure to
    consider" above two such bridges)."""
    row = BridgeRow(workbook="a.xlsx", rated=True, action="post",
                    recommendation="Consider closing the bridge unless L3U4 is confirmed to "
                    "act (recorded bent): without L3U4, lowest truck RF 0.12 (SU7, U3L4). If "
                    "L3U4 is confirmed to act (recorded bent): post the bridge.")
    assert row.conditional and row.closure_to_consider
    plain = replace(row, recommendation="Post the bridge. Safe posting loads ...")
    assert not plain.conditional and not plain.closure_to_consider
    assert replace(plain, action="close").closure_to_consider
    until = replace(plain, recommendation="Until the steel is confirmed of the later grade, "
                    "post the bridge (...). If the steel is confirmed ...: no load restriction")
    assert until.conditional and not until.closure_to_consider
    # in the summary: a column of its own, and counted once (not also as a posting)
    rows = _csv_rows_of(summary_csv([row, plain]))
    assert [r["closure to consider"] for r in rows] == ["yes", ""]
    assert [r["action"] for r in rows] == ["post", "post"]  # (the trucks' own, as rated)


def test_a_broken_link_named_like_a_workbook_is_listed_not_passed_over(tmp_path: Path) -> None:
    folder = _folder(tmp_path, {"a.xlsx": GOOD})
    (folder / "gone.xlsx").symlink_to(tmp_path / "nowhere.xlsx")
    assert [p.name for p in find_workbooks(folder)] == ["a.xlsx", "gone.xlsx"]
    s = rate_folder(folder, tmp_path / "out", workers=1, rate=fake_rate)
    gone = next(r for r in s.rows if r.workbook == "gone.xlsx")
    assert not gone.rated and "could not be read" in gone.errors[0]


def _csv_rows_of(text: str) -> list[dict[str, str]]:
    return list(csv.DictReader(io.StringIO(text.lstrip("\ufeff"))))

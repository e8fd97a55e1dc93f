"""This rating compared with the previous one (rating.previous): the previous results file is
read with a clear message for every problem, naming the file and the place in it; postings,
members and pins are compared case by case; the comparison reaches the JSON and the report.

The previous ratings here are the hand-built sample results (tests/report/sample_results.py)
written as a results file and then edited, so that every expected change is known exactly."""

from __future__ import annotations

import copy
import dataclasses
import json
import sys
from pathlib import Path
from typing import Any

import pytest

sys.path.insert(0, str(Path(__file__).resolve().parent / "report"))

from htmlcheck import read  # noqa: E402
from sample_results import sample_results  # noqa: E402

from rating.errors import InputError  # noqa: E402
from rating.previous import (  # noqa: E402
    RF_CHANGE,
    compare,
    direction,
    moved,
    previous_for,
    read_previous,
    truck_words,
    vehicle_change_words,
    worse_since,
)
from rating.report.html import render_report  # noqa: E402
from rating.results import SincePrevious, VehicleChange, results_json  # noqa: E402
from rating.units import TON_PER_TONNE  # noqa: E402


def _plain() -> dict[str, Any]:
    return json.loads(results_json(sample_results()))


def _write(tmp_path: Path, data: dict[str, Any] | str, name: str = "then.rating.json") -> Path:
    path = tmp_path / name
    path.write_text(data if isinstance(data, str) else json.dumps(data), encoding="utf-8")
    return path


def _earlier(edit: Any = None) -> dict[str, Any]:
    """The sample's own results as an earlier inspection's (2022), edited by ``edit``."""
    data = _plain()
    data["bridge"]["inspection_date"] = "2022-05-10"
    if edit is not None:
        edit(data)
    return data


# ------------------------------------------------------------------ reading the file


@pytest.mark.parametrize(("content", "needle"), [
    ("{not json", "not valid JSON (line 1, column 2"),
    ("[1, 2]", "it is not a results file written by pintruss"),
    ('{"schema_version": "1.0"}', "it has no schema_version or no posting"),
    ("[" * 5000 + "]" * 5000, "nested too deep"),
])
def test_a_file_that_is_no_results_file_is_refused_by_name(tmp_path: Path, content: str,
                                                            needle: str) -> None:
    path = _write(tmp_path, content)
    with pytest.raises(InputError) as info:
        read_previous(path)
    assert needle in str(info.value)
    assert info.value.where == str(path)


def test_a_missing_file_or_a_folder_is_said_so(tmp_path: Path) -> None:
    with pytest.raises(InputError, match="there is no such file"):
        read_previous(tmp_path / "nothing.rating.json")
    with pytest.raises(InputError, match="it is a folder"):
        read_previous(tmp_path)


@pytest.mark.parametrize(("edit", "place", "needle"), [
    (lambda d: d["posting"]["TYPE3"].__setitem__("rf", "high"), "posting.TYPE3.rf",
     "expected a rating factor, not 'high'"),
    (lambda d: d["posting"]["SU4"].__setitem__("action", "restrict"), "posting.SU4.action",
     "unknown action 'restrict'"),
    (lambda d: d["posting"]["SU4"].__setitem__("posting_tons", "26 t"),
     "posting.SU4.posting_tons", "expected a number"),
    (lambda d: d["members"][2]["ratings"]["SU4"].__setitem__("rf", [1]),
     "members[2].ratings.SU4.rf", "expected a rating factor"),
    (lambda d: d["units"].__setitem__("weight", "kg"), "units.weight", "unknown weight unit"),
    (lambda d: d.__setitem__("schema_version", "2.0"), "schema_version",
     "this pintruss reads schema 1"),
    (lambda d: d["bridge"].pop("id"), "bridge.id", "expected text but it is missing"),
    (lambda d: d.__setitem__("pins", {}), "pins", "expected a list"),
    (lambda d: d.__setitem__("findings", 5), "findings", "expected a list"),
    (lambda d: d["findings"].__setitem__(0, "rust"), "findings[0]", "expected an object"),
    (lambda d: d["findings"][0].__setitem__("condition_rating", [5]),
     "findings[0].condition_rating", "expected a whole number"),
    (lambda d: d["findings"][1].__setitem__("percent_loss", "12 %"),
     "findings[1].percent_loss", "expected a number"),
    (lambda d: d["findings"][0].__setitem__("member", 7), "findings[0].member",
     "expected text"),
    (lambda d: d["posting"]["SU4"].__setitem__("posting_tons", None),
     "posting.SU4.posting_tons", "the action is post but no safe posting load is given"),
    (lambda d: d["posting"]["TYPE3"].__setitem__("rf", float("nan")), "posting.TYPE3.rf",
     "expected a rating factor, not nan"),
])
def test_a_bad_value_is_named_at_its_place_in_the_file(tmp_path: Path, edit: Any, place: str,
                                                       needle: str) -> None:
    path = _write(tmp_path, _earlier(edit))
    with pytest.raises(InputError) as info:
        read_previous(path)
    assert f"at {place}:" in str(info.value) and needle in str(info.value)


def test_an_si_file_is_read_in_core_units(tmp_path: Path) -> None:
    # A posting of 10 tonnes is 11.02 tons (1 tonne = 1/0.90718474 ton, NIST SP 811 B.8).
    data = _earlier()
    data["units"]["weight"] = "tonne"
    data["posting"]["SU4"]["posting_tons"] = 10.0
    previous = read_previous(_write(tmp_path, data))
    assert previous.system == "SI"
    assert previous.cases["SU4"].posting_tons == pytest.approx(10.0 * TON_PER_TONNE)
    assert previous.cases["SU4"].posting_tons == pytest.approx(11.023, abs=5e-4)


def test_infinite_ratings_are_read_as_written(tmp_path: Path) -> None:
    data = _earlier()
    data["members"][0]["ratings"]["SU4"]["rf"] = "inf"
    data["members"][1]["ratings"]["SU4"]["rf"] = "-inf"
    data["members"][3]["ratings"]["SU4"]["rf"] = None  # (NaN is written null: no rating)
    previous = read_previous(_write(tmp_path, data))
    ids = [m["id"] for m in data["members"]]
    assert previous.elements[ids[0]]["SU4"] == float("inf")
    assert previous.elements[ids[1]]["SU4"] == float("-inf")
    assert previous.elements[ids[3]]["SU4"] == float("inf")


# ------------------------------------------------------------------ the comparison


def test_the_same_rating_changes_nothing_and_a_re_rating_is_said(tmp_path: Path) -> None:
    results = sample_results()
    since = compare(results, read_previous(_write(tmp_path, _plain())))
    assert all(v.change == "no change" for v in since.vehicles)
    assert since.elements == ()
    assert not since.out_of_order
    assert since.notes == ("Both ratings are of the inspection of 2024-05-14 (a re-rating: "
                           "coupon tests, corrected entries or another version of the "
                           "program).",)
    assert since.headline == ("Since the rating of the inspection of 2024-05-14: no posting, "
                              "closing or permit verdict changed; 0 members or pins rate "
                              "lower and 0 higher by more than 2 %.")


@pytest.mark.parametrize(("date", "said"), [
    ("2025-01-02", "is later than this one's (2024-05-14): the changes below run backwards"),
    ("14/05/2023", "The inspection date of the previous rating is not known"),
    (None, "The inspection date of the previous rating is not known"),
])
def test_a_previous_inspection_later_or_undated_is_said_first(tmp_path: Path, date: str | None,
                                                              said: str) -> None:
    data = _plain()
    data["bridge"]["inspection_date"] = date
    since = compare(sample_results(), read_previous(_write(tmp_path, data)))
    assert any(said in n for n in since.notes)
    assert since.out_of_order == (date == "2025-01-02")
    assert since.headline.startswith("CHECK THE FILE GIVEN") == since.out_of_order


def test_a_lower_posting_a_new_posting_and_a_barring_are_worse(tmp_path: Path) -> None:
    def edit(d: dict[str, Any]) -> None:
        d["posting"]["SU4"].update(rf=1.02, action="post", posting_tons=31.0)  # was higher
        d["posting"]["EV3"].update(rf=1.2, action="none", posting_tons=None)  # not posted
        d["posting"]["TYPE3"].update(rf=1.5, member="U2U3")
    results = sample_results()
    results = dataclasses.replace(results, posting={
        **results.posting, "EV3": dataclasses.replace(results.posting["EV3"], action="close",
                                                      posting_tons=None)})
    since = compare(results, read_previous(_write(tmp_path, _earlier(edit))))
    by = {v.vehicle: v for v in since.vehicles}
    assert by["SU4"].change == "posting lowered from 31 to 26 tons"
    # an emergency vehicle that cannot be posted: barring, not closing, is to be considered
    assert by["EV3"].change == "barring now to be considered (was not posted)"
    assert by["TYPE3"].change.startswith("RF lower by 29 %")  # 1.06 / 1.5 = 0.707
    assert by["TYPE3"].change.endswith("now controlled by pin L2 (was U2U3)")
    assert by["SU4"].posting_before == 31.0 and by["SU4"].posting_now == 26.0
    assert "worse: SU4 posting lowered from 31 to 26 tons; EV3 barring now to be " \
        "considered" in since.headline
    # the trucks' single weight limit (EV3, an emergency vehicle, is not a truck)
    assert (since.trucks_before, since.limit_before) == ("post", 31.0)
    assert (since.trucks_now, since.limit_now) == ("post", 26.0)
    assert since.headline.startswith("Since the rating of the inspection of 2022-05-10: "
                                     "truck weight limit lowered from 31 to 26 tons; worse:")
    assert not since.out_of_order and since.notes == ()


@pytest.mark.parametrize(("before", "now", "words", "sign"), [
    (("none", None), ("post", 12.0), "now posted at 12 tons (was not posted)", -1),
    (("post", 20.0), ("close", None), "closing now to be considered (was posted at 20 tons)",
     -1),
    (("close", None), ("post", 5.0), "now posted at 5 tons (was closing to be considered)", 1),
    (("close", None), ("none", None), "closing no longer indicated", 1),
    (("post", 9.0), ("none", None), "no longer posted (was posted at 9 tons)", 1),
    (("post", 9.0), ("post", 12.0), "posting raised from 9 to 12 tons", 1),
    (("post", 9.0), ("post", 9.0), "no change", 0),
])
def test_each_change_of_a_legal_load_in_words(before: tuple, now: tuple, words: str,
                                              sign: int) -> None:
    c = VehicleChange("TYPE3", 0.8, 0.8, "U1L2", "U1L2", before[0], now[0], before[1], now[1])
    assert vehicle_change_words(c, "ton", "legal", "legal") == words
    assert direction(c, "legal", "ton") == sign


def test_a_permit_changes_by_its_verdict_and_a_design_load_by_its_rf() -> None:
    c = VehicleChange("P1", 1.1, 0.9, "L1U1", "L1U1", "can be carried", "not as requested")
    assert vehicle_change_words(c, "ton", "single-trip permit", "permit") == \
        "permit now 'not as requested' (was 'can be carried')"
    assert direction(c, "permit", "ton") == -1
    d = VehicleChange("HL93-INV", 0.62, 0.50, "L1U1", "L1U1", "none", "none")
    assert vehicle_change_words(d, "ton", "design", "inventory") == "RF lower by 19 %"
    assert direction(d, "inventory", "ton") == 0  # a design load's RF is not an outcome


def test_a_case_not_rated_before_is_said_and_listed(tmp_path: Path) -> None:
    since = compare(sample_results(), read_previous(_write(tmp_path, _earlier(
        lambda d: d["posting"].pop("SU4")))))
    su4 = next(v for v in since.vehicles if v.vehicle == "SU4")
    assert su4.rf_before is None and su4.change == "not rated in the previous rating"
    assert "Rated now, not in the previous rating: SU4." in since.notes


def test_members_and_pins_that_moved_are_listed_with_their_findings(tmp_path: Path) -> None:
    results = sample_results()
    member = results.members[2]  # L2L3
    pin = results.pins[0]

    def edit(d: dict[str, Any]) -> None:
        for r in d["members"][2]["ratings"].values():
            if isinstance(r["rf"], float):
                r["rf"] *= 1.25  # rated 25 % higher then
        for r in d["pins"][0]["ratings"].values():
            if isinstance(r["rf"], float):
                r["rf"] *= 1.0 + RF_CHANGE / 2  # within the threshold: not listed
        d["findings"] = [f for f in d["findings"] if f["member"] != "L1U1"]
        d["findings"].append({"member": member.id, "component": "bar 1", "region": "body",
                              "percent_loss": 5.0, "condition_rating": 6})
    since = compare(results, read_previous(_write(tmp_path, _earlier(edit))))
    # L2L3 moved (and its findings changed); L1U1's findings alone changed (none then)
    assert [(e.element, e.moved, e.findings_changed) for e in since.elements] == [
        (member.id, True, True), ("L1U1", False, True)]
    assert since.elements[1].findings_before == ()
    e = since.elements[0]
    lowest = min((r.rf, c) for c, r in member.ratings.items())
    assert (e.rf_now, e.case) == lowest
    assert e.rf_before == pytest.approx(1.25 * lowest[0], rel=1e-5)  # (6 decimals in JSON)
    assert e.findings_before == ("bar 1 body: 5 % loss, condition 6",)
    assert f"pin at {pin.joint}" not in [x.element for x in since.elements]
    assert "1 member or pin rates lower and 0 higher by more than 2 %; the findings " \
        "changed on 2 members." in since.headline


def test_moved_is_relative_and_says_an_infinite_change() -> None:
    assert not moved(1.00, 1.019) and moved(1.00, 0.979)
    assert moved(float("inf"), 2.0) and not moved(float("-inf"), float("-inf"))
    assert not moved(0.0, 0.0009)  # (near zero: RF_CHANGE of 0.05)


def test_what_makes_the_ratings_differ_besides_the_bridge_is_noted(tmp_path: Path) -> None:
    def edit(d: dict[str, Any]) -> None:
        d["generator"] = "pintruss 0.0.9"
        d["provision_set"] = "MBE 2011"
        d["members"].append(copy.deepcopy(d["members"][0]) | {"id": "X9Y9"})
    since = compare(sample_results(), read_previous(_write(tmp_path, _earlier(edit))))
    text = " ".join(since.notes)
    assert "made with pintruss 0.0.9" in text and "the program's changes" in text
    assert "used MBE 2011" in text
    assert "then only: X9Y9" in text


def test_another_bridges_file_is_not_compared(tmp_path: Path) -> None:
    path = _write(tmp_path, _earlier(lambda d: d["bridge"].__setitem__("id", "CR-999")))
    results, why = previous_for(sample_results(), path)
    assert results is None
    assert "rating of bridge 'CR-999', not of 'CR-114-0032'" in why
    # the same id in another case or spacing is the same bridge
    path = _write(tmp_path, _earlier(lambda d: d["bridge"].__setitem__("id", "cr-114-0032 ")))
    results, why = previous_for(sample_results(), path)
    assert results is not None and why == ""


# ------------------------------------------------------------------ JSON and report


def test_the_comparison_is_in_the_json_and_the_report(tmp_path: Path) -> None:
    def edit(d: dict[str, Any]) -> None:
        d["posting"]["SU4"].update(rf=1.02, action="post", posting_tons=31.0)
        f = d["findings"][0]
        f["component"] = "<b>bar</b>"  # words from the workbook, shown beside the member
        m = next(m for m in d["members"] if m["id"] == f["member"])
        for r in m["ratings"].values():
            if isinstance(r["rf"], float):
                r["rf"] *= 1.3  # it moved: its findings are shown
    results, why = previous_for(sample_results(), _write(tmp_path, _earlier(edit)))
    assert results is not None, why
    data = json.loads(results_json(results))
    assert data["previous"]["file"] == "then.rating.json"  # the name, never the folder
    assert data["previous"]["inspection_date"] == "2022-05-10"
    assert results_json(results) == results_json(results)
    html = render_report(results)
    doc = read(html)
    text = " ".join(doc.text)
    assert doc.errors == []
    assert "Since the previous rating" in text
    assert "posting lowered from 31 to 26 tons" in text
    assert "<b>bar</b>" not in html and "&lt;b&gt;bar&lt;/b&gt;" in html  # text, inert
    # page 1 says the change in the recommendation's box; the previous words are quoted
    box = html.index("Posting recommendation, for the licensed")
    assert box < html.index('class="since-lead"') < html.index('<table class="summary">')
    assert "The previous recommendation read: &ldquo;" in html
    # no previous rating: no such part, and "previous": null in the file
    plain = sample_results()
    assert "Since the previous rating" not in " ".join(read(render_report(plain)).text)
    assert json.loads(results_json(plain))["previous"] is None


# ------------------------------------------------------------------ end to end


def test_more_loss_since_the_previous_inspection_never_rates_higher(tmp_path: Path) -> None:
    """The pony sample rated at an earlier (invented) inspection with half its measured
    losses and none of its remaining-thickness findings, then as it is: with the same dead
    load and more loss no resistance grows, so no case's outcome is better, no member or pin
    rates higher, and the members whose findings grew are among those listed (statics:
    common practice)."""
    import datetime as dt

    sys.path.insert(0, str(Path(__file__).resolve().parent / "inventory"))
    from inventory_helpers import load_make_samples

    from rating.inventory.template import WorkbookContent, write_workbook
    from rating.pipeline import rate_workbook

    ms = load_make_samples()
    now = ms.SAMPLES["tc0903_pony_1903_si.xlsx"]()
    findings = [dict(f, loss=f["loss"] / 2) for f in now.tables["Findings"]
                if f.get("remaining") is None and f.get("loss") is not None]
    assert findings  # the sample has percent losses to halve
    earlier = WorkbookContent({**now.bridge, "inspection_date": dt.date(2021, 6, 1)},
                              {**now.tables, "Findings": findings}, now.settings)
    write_workbook(tmp_path / "then.xlsx", earlier)
    write_workbook(tmp_path / "now.xlsx", now)
    then = rate_workbook(tmp_path / "then.xlsx").results
    assert then is not None
    (tmp_path / "then.rating.json").write_text(results_json(then), encoding="utf-8")
    results = rate_workbook(tmp_path / "now.xlsx").results
    assert results is not None
    compared, why = previous_for(results, tmp_path / "then.rating.json")
    assert compared is not None, why
    since = compared.previous
    assert since is not None and not since.out_of_order and since.notes == ()
    assert all(e.findings_changed for e in since.elements if not e.moved)
    levels = {v.id: v.rating_level for v in results.vehicles}
    assert all(direction(v, levels[v.vehicle], "tonne") <= 0 for v in since.vehicles)
    # (the previous RFs as the results file writes them: 6 decimals)
    assert all(v.rf_now <= v.rf_before + 1e-6 for v in since.vehicles)
    assert all(e.rf_now <= e.rf_before + 1e-6 for e in since.elements)
    assert any(e.moved for e in since.elements)
    assert all(e.rf_now < e.rf_before for e in since.elements if e.moved)
    halved = {f["member"] for f in findings}
    assert halved <= {e.element for e in since.elements}  # every member whose loss grew
    assert "higher by more than" in since.headline and " 0 higher" in since.headline


def test_a_permit_compared_with_itself_is_unchanged_and_its_verdict_change_is_said(
        tmp_path: Path) -> None:
    results = sample_results()
    vehicles = tuple(dataclasses.replace(v, rating_level="permit",
                                         category="single-trip permit")
                     if v.id == "TYPE3-3" else v for v in results.vehicles)
    posting = {**results.posting, "TYPE3-3": dataclasses.replace(
        results.posting["TYPE3-3"], permit="can be carried")}
    results = dataclasses.replace(results, vehicles=vehicles, posting=posting)
    then = json.loads(results_json(results))
    then["bridge"]["inspection_date"] = "2022-05-10"
    since = compare(results, read_previous(_write(tmp_path, then)))
    permit = next(v for v in since.vehicles if v.vehicle == "TYPE3-3")
    assert permit.change == "no change" and permit.action_now == "can be carried"
    assert direction(permit, "permit", "ton") == 0
    assert "no posting, closing or permit verdict changed" in since.headline
    then["posting"]["TYPE3-3"]["permit"] = "not as requested"
    since = compare(results, read_previous(_write(tmp_path, then)))
    permit = next(v for v in since.vehicles if v.vehicle == "TYPE3-3")
    assert permit.change == "permit now 'can be carried' (was 'not as requested')"
    assert "better: TYPE3-3 permit now 'can be carried'" in since.headline


@pytest.mark.parametrize(("then", "now", "words"), [
    (("none", None), ("post", 12.0), "trucks now to be posted at 12 tons (was no restriction)"),
    (("post", 20.0), ("close", None),
     "closing now to be considered for trucks (was a weight limit of 20 tons)"),
    (("close", None), ("none", None),
     "no restriction now indicated for trucks (was a closing to consider)"),
    (("post", 20.0), ("post", 24.0), "truck weight limit raised from 20 to 24 tons"),
    (("post", 20.0), ("post", 20.0), ""),
    (("", None), ("post", 20.0), ""),  # no truck rated then: nothing to compare
])
def test_the_trucks_single_weight_limit_then_and_now(then: tuple, now: tuple,
                                                     words: str) -> None:
    since = SincePrevious("f", "2020-01-01", "", (), (), trucks_before=then[0],
                          limit_before=then[1], trucks_now=now[0], limit_now=now[1])
    assert truck_words(since, "ton") == words


def test_worse_since_weighs_the_trucks_and_every_case() -> None:
    lowered = SincePrevious("f", "2020-01-01", "", (), (), trucks_before="post",
                            limit_before=20.0, trucks_now="post", limit_now=19.0)
    assert worse_since(lowered, {}, "ton")
    raised = dataclasses.replace(lowered, limit_now=21.0)
    assert not worse_since(raised, {}, "ton")
    same = dataclasses.replace(lowered, limit_now=20.0 + 1e-9)  # (round-off: the same sign)
    assert not worse_since(same, {}, "ton") and not worse_since(
        dataclasses.replace(lowered, limit_now=20.0 - 1e-9), {}, "ton")
    barred = VehicleChange("EV3", 1.1, 0.5, "L1U1", "L1U1", "none", "close")
    assert worse_since(dataclasses.replace(same, vehicles=(barred,)), {"EV3": "legal"}, "ton")
    design = VehicleChange("HL93-INV", 1.1, 0.5, "L1U1", "L1U1", "none", "none")
    assert not worse_since(dataclasses.replace(same, vehicles=(design,)),
                           {"HL93-INV": "inventory"}, "ton")


# ------------------------------------------------------------------ the review's cases


def test_postings_of_another_unit_system_are_shown_as_posted_and_compared_beyond_rounding(
        tmp_path: Path) -> None:
    """A previous rating posted in tonnes, this one in tons: SU4 posted at 23 tonnes (25.35
    tons) then and 26 tons now is the same posting within the rounding (one tonne, 1.10 tons:
    1 tonne = 1/0.90718474 ton, NIST SP 811 B.8); 20 tonnes (22.05 tons) then is a posting
    raised now."""
    def edit(d: dict[str, Any]) -> None:
        d["units"]["weight"] = "tonne"
        d["posting"]["SU4"]["posting_tons"] = 23.0
    since = compare(sample_results(), read_previous(_write(tmp_path, _earlier(edit))))
    su4 = next(v for v in since.vehicles if v.vehicle == "SU4")
    assert su4.change == "no change" and since.weight_unit_before == "tonne"
    assert not worse_since(since, {"SU4": "legal"}, "ton")
    assert any("shown as posted then" in n for n in since.notes)

    def edit20(d: dict[str, Any]) -> None:
        edit(d)
        d["posting"]["SU4"]["posting_tons"] = 20.0
    since = compare(sample_results(), read_previous(_write(tmp_path, _earlier(edit20))))
    su4 = next(v for v in since.vehicles if v.vehicle == "SU4")
    assert su4.change == "posting raised from 20 tonnes (22 tons) to 26 tons"
    assert direction(su4, "legal", "ton", "tonne") == 1


def test_the_trucks_limit_is_compared_over_the_trucks_rated_both_times(tmp_path: Path) -> None:
    """SU4 (posted at 26 tons now) was not rated then: the trucks rated both times were not
    posted then and are not now, so no truck posting is said to be new; the note gives the
    outcome with every truck rated now."""
    since = compare(sample_results(), read_previous(_write(tmp_path, _earlier(
        lambda d: d["posting"].pop("SU4")))))
    assert (since.trucks_before, since.trucks_now) == ("none", "none")
    assert truck_words(since, "ton") == ""
    assert any("with every truck rated now it is a weight limit of 26 tons" in n
               for n in since.notes)


def test_a_switch_to_the_mirror_member_is_no_change_of_control(tmp_path: Path) -> None:
    results = sample_results()
    results = dataclasses.replace(results, posting={
        **results.posting, "SU4": dataclasses.replace(results.posting["SU4"], alike=("L4U4",))})
    since = compare(results, read_previous(_write(tmp_path, _earlier(
        lambda d: d["posting"]["SU4"].update(member="L4U4")))))
    assert next(v for v in since.vehicles if v.vehicle == "SU4").change == "no change"


def test_a_permit_verdict_is_ranked_and_a_missing_one_is_not_known() -> None:
    c = VehicleChange("P1", 1.1, 1.1, "L1U1", "L1U1", "not as requested",
                      "not over a bridge restricted for legal loads")
    assert direction(c, "permit", "ton") == 0  # not carried either way
    unknown = dataclasses.replace(c, action_before="", action_now="can be carried")
    assert direction(unknown, "permit", "ton") == 0
    assert vehicle_change_words(unknown, "ton", "single-trip permit", "permit") == \
        "its permit verdict is not in the previous results file"


def test_a_screening_load_below_one_then_reads_not_posted_in_the_report(tmp_path: Path) -> None:
    from rating.report.view import build_view

    def edit(d: dict[str, Any]) -> None:
        d["posting"]["TYPE3"].update(rf=0.95, action="none", posting_tons=None)
    results, why = previous_for(sample_results(), _write(tmp_path, _earlier(edit)))
    assert results is not None, why
    view = build_view(results)
    assert view.since is not None
    row = next(r for r in view.since.vehicles if r.vehicle == "TYPE3")
    assert row.outcome_then == "not posted"


def test_a_comparison_that_fails_inside_the_program_still_rates_the_bridge(
        tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    import rating.previous
    from rating.batch import _with_previous

    def broken(*args: object) -> None:
        raise ZeroDivisionError("simulated fault")

    monkeypatch.setattr(rating.previous, "previous_for", broken)
    path = _write(tmp_path, _earlier())
    results = sample_results()
    out, since, notes, worse = _with_previous(results, path)
    assert out is results and not worse
    assert since.startswith("not compared: ") and "internal error" in since
    assert notes and "please report it" in notes[0]


def test_a_member_that_moved_with_unchanged_findings_says_so_and_its_move_checks_by_hand(
        tmp_path: Path) -> None:
    from rating.report.view import build_view

    results = sample_results()
    member = results.members[5]

    def edit(d: dict[str, Any]) -> None:
        m = next(m for m in d["members"] if m["id"] == member.id)
        for r in m["ratings"].values():
            if isinstance(r["rf"], float):
                r["rf"] *= 1.4
    compared, why = previous_for(results, _write(tmp_path, _earlier(edit)))
    assert compared is not None, why
    view = build_view(compared)
    assert view.since is not None
    row = next(r for r in view.since.elements if r.element == member.id)
    assert row.findings_now == "unchanged"
    e = next(e for e in compared.previous.elements if e.element == member.id)
    from rating.results import reported_rf
    printed = reported_rf(e.rf_now) / reported_rf(e.rf_before) - 1.0
    assert row.move == f"{printed * 100:+.0f} %".replace("-", "\u2212")


def test_a_closure_now_put_first_is_worse_whatever_each_vehicle_says(tmp_path: Path) -> None:
    """The same postings, but the recommendation now leads with a closure to consider (a new
    condition found, say): worse, and said first (a reviewer found "no posting, closing or
    permit verdict changed" above a box that now read "Consider closing the bridge unless
    ...")."""
    results = sample_results()
    now = dataclasses.replace(results, recommendation="Consider closing the bridge unless "
                              "L3U4 is confirmed to act (recorded bent): ... If L3U4 is "
                              "confirmed to act (recorded bent): post the bridge.")
    since = compare(now, read_previous(_write(tmp_path, _earlier())))
    assert since.closure_first_now and not since.closure_first_before
    assert worse_since(since, {}, "ton")
    assert since.headline.startswith("Since the rating of the inspection of 2022-05-10: the "
                                     "recommendation now leads with a closure to consider;")
    back = compare(results, read_previous(_write(tmp_path, _earlier(
        lambda d: d.__setitem__("recommendation", now.recommendation)))))
    assert not worse_since(back, {}, "ton")
    assert "no longer leads with a closure to consider" in back.headline


def test_results_files_are_found_by_the_structure_id_at_their_start(tmp_path: Path) -> None:
    from rating.previous import results_by_bridge

    data = _plain()
    data["bridge"]["id"] = 'CR "7"  North'
    _write(tmp_path, data, "a.rating.json")
    (tmp_path / "sub").mkdir()
    _write(tmp_path / "sub", _plain(), "b.rating.json")
    _write(tmp_path, "{not json", "c.rating.json")
    found = results_by_bridge(tmp_path)
    assert found == {'cr "7" north': (str(tmp_path / "a.rating.json"),),
                     "cr-114-0032": (str(tmp_path / "sub" / "b.rating.json"),)}

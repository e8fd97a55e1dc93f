"""The whole chain on the bundled sample workbooks: rate, validate the results file against
its documented schema (docs/results.schema.json, JSON Schema 2020-12, checked with the
independent jsonschema library), determinism, inputs untouched, exit codes."""

from __future__ import annotations

import functools
import hashlib
import json
import math
import re
import shutil
import sys
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

sys.path.insert(0, str(Path(__file__).resolve().parent / "report"))

from sample_results import sample_results  # noqa: E402

from rating.cli import main  # noqa: E402
from rating.pipeline import rate_workbook  # noqa: E402
from rating.results import DECISION_NOTE, Position, results_json, to_plain  # noqa: E402

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
    # (its hanger's loss at the loop, if it ran along the bar, would close it: said first)
    assert res.recommendation.startswith("Consider closing the bridge unless the loss at the "
                                         "loop of L1U1 is confirmed local")
    assert "(not along the bar around the pin): post the bridge. Safe posting loads" \
        in res.recommendation
    assert any(p.action == "post" for p in res.posting.values())


def test_si_sample_reports_in_si_with_whole_tonnes(outcomes):
    res = outcomes["tc0903_pony_1903_si.xlsx"].results
    doc = json.loads(results_json(res))
    assert doc["units"]["force"] == "kN" and doc["units"]["weight"] == "tonne"
    posted = [p for p in doc["posting"].values() if p["action"] == "post"]
    assert posted and all(float(p["posting_tons"]).is_integer() for p in posted)


@pytest.mark.parametrize("name", [p.name for p in SAMPLES])
def test_rt_and_posting_follow_from_the_printed_rf_and_w(outcomes, name):
    """A reviewer checks each posted vehicle by hand from the printed RF (two decimals,
    rounded down) and W: RT = RF x W and (W / 0.7)(RF - 0.3) rounded down (MBE 6A.8.3,
    equation as in Khan 2010 p. 187), in the report's weight unit."""
    doc = json.loads(results_json(outcomes[name].results))
    weight = {v["id"]: v["gross_weight"] for v in doc["vehicles"]}
    posted = 0
    for vid, p in doc["posting"].items():
        if not math.isfinite(p["rf"]):
            continue
        printed = math.floor(p["rf"] * 100.0 + 1e-7) / 100.0
        assert p["rating_tons"] == pytest.approx(printed * weight[vid], rel=1e-5), vid
        if p["action"] == "post":
            posted += 1
            assert p["posting_tons"] == math.floor(weight[vid] / 0.7 * (printed - 0.3) + 1e-6), vid
    assert posted


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


def test_a_vehicle_id_that_names_nothing_is_a_usage_error(tmp_path, capsys):
    """--vehicles with an id that is neither shipped nor the workbook's own: exit 2, the
    message names the option and the id (not a workbook cell), nothing rated or written; a
    workbook's own vehicle (the pony sample's TWP-HAY, any case) is accepted."""
    pony = next(p for p in SAMPLES if "pony" in p.name)
    out = tmp_path / "out"
    assert main(["rate", str(pony), "--vehicles", "SU4,XYZ", "--out", str(out)]) == 2
    err = capsys.readouterr().err
    assert "--vehicles: no rating load or vehicle with id 'XYZ'" in err
    assert "TWP-HAY" in err  # the known ids include the workbook's own
    assert not out.exists() or not any(out.iterdir())
    outcome = rate_workbook(pony, ["su4", "twp-hay"])
    assert outcome.results is not None
    assert set(outcome.results.posting) == {"SU4", "TWP-HAY"}


def test_heavy_loss_on_the_controlling_rod_leads_to_closing(tmp_path):
    """End to end through a real workbook: the pony sample with an added finding of 55 %
    diameter loss on its controlling rod U2L3 (invented, as all sample data): every legal
    load rates below 0.3, each is a closure (MBE 6A.8.3), the recommendation says to
    consider closing and names the loads, the report's recommendation box is the closing
    one, and it stays a recommendation for the engineer."""
    import openpyxl

    from rating.report import render_report

    pony = next(p for p in SAMPLES if "pony" in p.name)
    wb = openpyxl.load_workbook(pony)
    ws = wb["Findings"]
    row = ws.max_row + 1
    col = {str(c.value).split(" [")[0]: c.column_letter for c in ws[3] if c.value}
    for title, value in zip(("Member", "Component", "Location", "Distance from start joint",
                             "Loss", "Condition rating", "Note"),
                            ["U2L3", "all", "body", 2.0, 55, 3, "heavy loss"], strict=True):
        ws[f"{col[title]}{row}"] = value
    book = tmp_path / "pony_heavy_loss.xlsx"
    wb.save(book)
    res = rate_workbook(book).results
    assert res is not None
    legal = {vid: p for vid, p in res.posting.items()
             if vid not in ("HL-93-INV", "HL-93-OPR", "NRL")}
    assert legal and all(p.action == "close" and p.rf < 0.3 for p in legal.values())
    assert all(p.member == "U2L3" for p in legal.values())
    assert res.recommendation.startswith("Consider closing the bridge: the rating factor is "
                                         "below 0.3 for AASHTO legal load Type 3 (RF ")
    assert "licensed engineer in responsible charge" in res.recommendation
    html = render_report(res)
    assert 'class="recommendation close"' in html


def _through_json_module(res) -> str:
    """The results file as the plain view (``to_plain``) written by the json module: what
    ``results_json`` writes in one pass."""
    system = "SI" if res.units.get("force") == "kN" else "US"
    return json.dumps(to_plain(res, system), separators=(",", ":"), ensure_ascii=False) + "\n"


@pytest.mark.parametrize("name", [p.name for p in SAMPLES])
def test_results_file_is_the_plain_view_written_by_the_json_module(outcomes, name):
    res = outcomes[name].results
    assert res is not None
    assert results_json(res) == _through_json_module(res)


@pytest.mark.parametrize("system", ["US", "SI"])
def test_results_file_odd_values_as_the_json_module_writes_them(system):
    """Infinities, NaN, negative zero, integers with and without a unit, text that needs
    escaping, odd mapping keys, shared and repeated objects."""
    res = sample_results(system)
    m = res.members[0]
    vid, r = next(iter(m.ratings.items()))
    pos = Position(-0.0, "reverse", (14, 14.0), (-0.0, 14.0, 28.0), (8.0, 32, 32.0), "truck",
                   ((0.0, 1e-7), (2.5e-7, 160.0)))
    odd = replace(
        m, dead_load={"DC": math.inf, "DW": -0.0, 7: 3, True: -math.inf},
        ratings={**m.ratings, vid: replace(r, rf=math.nan, position=pos),
                 "other": replace(r, rf=-math.inf, position=pos)},
        warnings=('quote " backslash \\ </script> \u00fc \u2014 \x01 tab\t', ""))
    res = replace(res, members=(odd, *res.members[1:], odd),
                  distribution={"factor": 0.8, "lanes": 2, "flag": True, "none": None,
                                "list": [1, 2.5, math.inf, "x"], "nested": {"a": -0.0}},
                  bridge=replace(res.bridge, year_built=1898, span=160))
    assert results_json(res) == _through_json_module(res)


@settings(max_examples=80, deadline=None)
@given(front=st.floats(-400.0, 600.0), reverse=st.booleans(),
       spacings=st.lists(st.floats(0.0, 40.0), min_size=6, max_size=6))
def test_result_positions_place_the_axles_as_the_moving_load_search(front, reverse, spacings):
    """The results hold each axle's station as plain floats, equal to the last bit to
    ``rating.analysis.moving.axle_stations`` (the search's own)."""
    from rating.analysis.moving import Direction, Extreme, VehiclePosition, axle_stations
    from rating.results_build import _position
    from rating.vehicles.library import rating_loads

    load = next(x for x in rating_loads() if x.id == "SU7")
    at = VehiclePosition(front, Direction.REVERSE if reverse else Direction.FORWARD,
                         tuple(spacings))
    ext = Extreme(1.0, 0.0, load.models[0].name, load.models[0].vehicle_id, at)
    pos = _position(ext, load, {})
    assert all(type(x) is float for x in pos.axle_stations)
    assert np.array(pos.axle_stations).tobytes() == axle_stations(at).tobytes()
    assert pos == _position(ext, load)


@functools.cache
def _sample_results(system: str):
    """The hand-built sample, built once per unit system (frozen: each example replaces
    parts of it, never changes it)."""
    return sample_results(system)


@settings(max_examples=60, deadline=None)
@given(values=st.lists(st.floats(allow_nan=True, allow_infinity=True) | st.floats(-1e9, 1e9)
                       | st.integers(-10**6, 10**6), min_size=1, max_size=40),
       system=st.sampled_from(["US", "SI"]))
def test_results_file_numbers_as_the_json_module_writes_them(values, system):
    """Any numbers, with a unit (converted in SI) and without, rounded to 6 decimals."""
    res = _sample_results(system)
    m = res.members[0]
    loads = {f"x{k}": v for k, v in enumerate(values)}
    res = replace(res, members=(replace(m, dead_load=loads), *res.members[1:]),
                  distribution={"values": values})
    assert results_json(res) == _through_json_module(res)


def test_a_pin_where_bearing_governs_names_the_plate_at_its_limit(outcomes):
    """Where bearing governs a pin, the results name the plate (numbered as in the packing)
    with its force and its factored bearing resistance; at the rating load of the governing
    case the pin is at its limit, so the two are equal to the printed precision (the RF is
    the load level that brings the governing check to 1.0, MBE 6A.4.2.1). The resistance is
    phi_b 1.5 t D F_y (AASHTO LRFD 6.7.6.2.2, phi_b = 1.0 [value from memory]) for the
    plate's thickness and the pin's diameter, so it is proportional to the thickness."""
    import re

    res = outcomes["tc0622_parker_1907.xlsx"].results
    said = re.compile(r"^bearing of item (\d+) \((\S+), t = ([0-9.]+) in\) governs: "
                      r"([0-9.]+) kip against a factored bearing resistance of ([0-9.]+) kip "
                      r"\(phi_b 1\.5 t D F_y, F_y = ([0-9.]+) ksi\); flexure and shear at z = ")
    per_inch: dict[str, float] = {}
    bearing = 0
    for p in res.pins:
        m = said.match(p.governing_section)
        if p.governing_item is None:
            assert m is None and p.governing_section.startswith("flexure and shear govern at z = ")
            continue
        bearing += 1
        assert m is not None, p.governing_section
        item, member, t, F, R, F_y = m.groups()
        row = p.packing[p.governing_item - 1]
        assert int(item) == p.governing_item and member == row.member
        assert float(t) == pytest.approx(row.thickness, abs=5e-4)
        assert F == R  # at the limit: printed alike (236.3 against 236.2 read as over)
        per_inch.setdefault(member, float(R) / (float(t) * p.diameter))
        assert float(R) / (float(t) * p.diameter) == pytest.approx(per_inch[member], rel=2e-3)
        # the F_y printed gives the printed resistance: 1.0 x 1.5 t D F_y
        assert 1.5 * row.thickness * p.diameter * float(F_y) == pytest.approx(float(R),
                                                                              abs=0.15)
    assert bearing >= 2 and bearing < len(res.pins)


def test_a_bent_counter_the_ratings_rest_on_is_said_before_the_decision(outcomes, tmp_path):
    """The Pratt sample's counter L3U4 is recorded bent (bowed, turnbuckle seized) and counted
    in tension: the results say, first among the warnings and again in the report's
    recommendation box, that the panel's load path rests on it and how to rate without it
    (common practice: a bowed rod takes load only once straightened). Rated without it (its
    bar recorded loose, as the warning says), the main of that panel goes slack under a much
    smaller live load and the legal loads rate below 0.3 (the sensitivity the warning is
    about; invented sample data)."""
    import openpyxl

    from rating.report import render_report
    from rating.results import bears_on_the_decision

    res = outcomes["tc0417_pratt_1898.xlsx"].results
    first = res.warnings[0]
    assert first.startswith("BENT COUNTER RELIED ON: member L3U4 is recorded bent "
                            "(Findings!B10)") and bears_on_the_decision(first)
    assert "recording its bars as loose" in first
    box = render_report(res).split('<div class="recommendation', 1)[1].split("</div>", 3)
    assert "BENT COUNTER RELIED ON" in "".join(box[:3])
    parker = outcomes["tc0622_parker_1907.xlsx"].results
    assert not any("RELIED ON" in w for w in parker.warnings)

    pratt = next(p for p in SAMPLES if "pratt" in p.name)
    wb = openpyxl.load_workbook(pratt)
    ws = wb["Findings"]
    state = next(c.column_letter for c in ws[3] if c.value == "Bar state")
    assert (ws["B10"].value, ws[f"{state}10"].value) == ("L3U4", "bent")
    ws[f"{state}10"] = "loose"
    book = tmp_path / "pratt_without_l3u4.xlsx"
    wb.save(book)
    without = rate_workbook(book).results
    assert without is not None
    assert without.warnings[0].startswith("OUT OF SERVICE: member(s) L3U4")
    assert not any("RELIED ON" in w for w in without.warnings)
    level = {v.id: v.rating_level for v in without.vehicles}
    legal = [p for vid, p in without.posting.items()
             if level[vid] == "legal" and vid != "NRL"]
    assert legal and all(p.rf < 0.3 and p.action == "close" for p in legal)
    # the warning itself gives that sensitivity (members rated again without the counter,
    # the trucks only): the same verdict, and an RF no lower than the full re-rating's (the
    # pins, not rated in it, can only lower a rating)
    import re

    said = re.search(r"Rated as if L3U4 did not act \(its bars loose\), the members give "
                     r"a closure to consider: lowest truck RF (\d\.\d\d) \(([\w-]+), ", first)
    assert said is not None, first
    trucks = [p for vid, p in without.posting.items()
              if vid not in ("HL-93-INV", "HL-93-OPR", "NRL", "EV2", "EV3")]
    full = min(math.floor(p.rf * 100 + 1e-7) / 100 for p in trucks)
    assert float(said.group(1)) >= full - 1e-9
    # and the recommendation itself is made conditional on the counter (a reviewer would not
    # sign a "post" headline with the closure only in a warning)
    rec = res.recommendation
    # the closure first: the bent counter is taken as not acting until it is confirmed to
    assert rec.startswith(f"Consider closing the bridge unless L3U4 is confirmed to act "
                          f"(recorded bent): without L3U4, lowest truck RF {said.group(1)} "
                          f"({said.group(2)}, ")
    # then the lower loads until the loop's loss is confirmed local, and the rating's own
    # posting for the case both are confirmed
    assert "; members only, see the warning. Until the loss at the loop of L1U1 is confirmed " \
        "local (not along the bar around the pin), post the bridge for lower loads" in rec
    assert ". If L3U4 is confirmed to act (recorded bent) and the loss at the loop of L1U1 " \
        "is confirmed local (not along the bar around the pin): post the bridge." in rec
    assert rec.endswith(DECISION_NOTE)
    assert not any(r.startswith("Only if") for r in (parker.recommendation,))


def test_the_pony_sample_says_its_top_chord_rests_on_unchecked_u_frames(outcomes):
    """The pony sample's top chord does not control (the rods do): the U-frame warning is an
    ordinary one (AASHTO LRFD 6.14.2.9 [value from memory]); the through trusses have none."""
    pony = outcomes["tc0903_pony_1903_si.xlsx"].results
    said = [w for w in pony.warnings if "U-frames" in w]
    assert len(said) == 1 and said[0].startswith("pony truss: the top chord and end posts")
    for name in ("tc0417_pratt_1898.xlsx", "tc0622_parker_1907.xlsx"):
        assert not any("U-frames" in w for w in outcomes[name].results.warnings)


def test_parker_measured_wearing_surface_and_water_line_take_their_own_factors(outcomes):
    """The Parker sample's wearing surface was measured (gamma_DW 1.25, MBE 6A.4.2.2 [value
    from memory]); its water line is DW too and keeps 1.50 (AASHTO LRFD Table 3.4.1-2 [V]).
    Each linear rating shows the weighted gamma_DW, between the two, and the LRFR equation
    (MBE 6A.4.2.1) worked from the results' own numbers gives its RF."""
    res = outcomes["tc0622_parker_1907.xlsx"].results
    checked = 0
    for m in res.members:
        DC, DW = m.dead_load["DC"], m.dead_load["DW"]
        for vid, r in m.ratings.items():
            if r.method != "linear" or not math.isfinite(r.rf) or r.sense != "tension":
                continue
            if DW <= 1e-6:
                continue
            f = r.factors
            assert 1.25 < f.gamma_dw < 1.50, (m.id, vid, f.gamma_dw)
            C = m.resistance.tension
            ll = m.live_load[vid].max_with_im
            assert r.rf == pytest.approx((C - f.gamma_dc * DC - f.gamma_dw * DW)
                                         / (f.gamma_ll * ll), rel=1e-9)
            checked += 1
    assert checked > 20
    assert any("the rest of DW (utilities) keeps 1.50" in a for a in res.assumptions)


def test_parker_names_the_rated_truss_for_dead_and_live_load(outcomes):
    """The Parker sample's water line hangs toward the right truss, which is rated; its
    roadway is centred, so the live load is described for the same truss."""
    res = outcomes["tc0622_parker_1907.xlsx"].results
    assert any(a.startswith("The right truss is rated") for a in res.assumptions)
    assert "toward the right truss" in res.distribution["description"]
    assert not any("combined, conservative" in a for a in res.assumptions)


def test_an_off_centre_roadway_combines_the_two_trusses_worst_loads_and_says_so(tmp_path):
    """The pony sample with its roadway moved toward the right truss (left curb 0.6 m from
    the left truss instead of 0.3 m; invented): the deck's dead load stays centred, so the
    trusses tie for dead load and the left one is rated, while the live load's larger share
    is the right truss's. The two are combined (conservative) and the results say so."""
    import openpyxl

    pony = next(p for p in SAMPLES if "pony" in p.name)
    wb = openpyxl.load_workbook(pony)
    assert wb["Bridge"]["A20"].value.startswith("Left curb from left truss")
    wb["Bridge"]["B20"] = 0.6
    book = tmp_path / "pony_off_centre.xlsx"
    wb.save(book)
    res = rate_workbook(book).results
    assert res is not None
    assert "toward the right truss" in res.distribution["description"]
    said = [a for a in res.assumptions if "combined, conservative" in a]
    assert len(said) == 1 and said[0].startswith("The dead load is that of the left truss")


def test_the_member_table_explains_a_tension_only_member_the_vehicle_reverses(outcomes):
    """Where a member's governing check is "compression: tension-only member" (Parker's
    mains U2L3 and L7U8 go slack under the vehicle), the member table's note says what its RF
    is; a report with no such row does not carry the sentence."""
    from rating.report import render_report

    said = "the vehicle reverses the member, and its RF is the live-load level"
    parker = outcomes["tc0622_parker_1907.xlsx"].results
    assert any(m.ratings[min(m.ratings, key=lambda k: m.ratings[k].rf)].check
               == "compression: tension-only member" for m in parker.members if m.ratings)
    assert said in render_report(parker)
    pratt = outcomes["tc0417_pratt_1898.xlsx"].results
    assert said not in render_report(pratt)


def test_a_rod_is_called_a_rod(outcomes):
    """The Pratt sample's findings name "rod 1" of hanger L1U1 and counter L3U4: the echo of
    the findings, the governing finding and the warnings call it so (it read "bar 1")."""
    res = outcomes["tc0417_pratt_1898.xlsx"].results
    assert {f.component for f in res.findings if f.member in ("L1U1", "L3U4")} == {"rod 1"}
    hanger = next(m for m in res.members if m.id == "L1U1")
    assert any(c.finding.startswith("L1U1 rod 1, thread") for c in hanger.resistance.checks)
    assert any(w.startswith("member L3U4: rod 1 is bent") for w in res.warnings)
    assert not any("bar 1" in w for w in res.warnings if "L3U4" in w)


def test_a_rod_loss_of_diameter_says_the_loss_of_area(outcomes):
    """On a rod the recorded percent loss is of the diameter; the governing finding says the
    loss of area it means, 1 - (1 - 0.45)^2 = 69.75 % for the Parker hanger's 45 % (closed
    form), so a reviewer does not read 45 % as the loss of section."""
    res = outcomes["tc0622_parker_1907.xlsx"].results
    hanger = next(m for m in res.members if m.id == "L1U1")
    said = {c.finding for c in hanger.resistance.checks if c.finding}
    assert said == {"L1U1 rod 1, thread, at 0.5 ft, 45% loss of diameter (70% of area) "
                    "(Findings!B5)"}
    bars = next(m for m in res.members if m.id == "L2L3")
    assert all("of diameter" not in c.finding for c in bars.resistance.checks)


def test_parker_pins_say_what_their_check_assumes(outcomes):
    """The pins' own assumptions reach the results (grouped by text): the bearings' pins take
    the shoe's reaction where the floorbeam's load acts (the workbook has no place for the
    shoe), and a member's loss recorded at its head or connection at a pin (L0U1 at L0, U2L3
    at L3) is said not to reach the packing thicknesses the bearing uses; a loss at the far
    end of a member is not said at this pin."""
    res = outcomes["tc0622_parker_1907.xlsx"].results
    shoe = [a for a in res.assumptions if "the shoe's reaction" in a]
    assert len(shoe) == 1 and shoe[0].startswith("pins at joints L0, L10: at this bearing")
    assert any(a.startswith("pins at joints L0, L1, L2") and "floorbeam load is shared" in a
               for a in res.assumptions)
    ends = [w for w in res.warnings if "use the plate thicknesses of the Packing sheet" in w]
    assert any(w.startswith("pin at joint L0: member L0U1 has section loss recorded at its "
                            "connection (Findings!B11)") for w in ends)
    assert any(w.startswith("pin at joint L3: member U2L3 has section loss recorded at its "
                            "head (Findings!B9)") for w in ends)
    assert not any(w.startswith("pin at joint U2: member U2L3") for w in ends)


@pytest.mark.parametrize("name", [p.name for p in SAMPLES])
def test_pin_moments_follow_from_the_plate_forces_printed(outcomes, name):
    """Each pin's plate forces at the rating load (printed in its packing table) are in
    balance, and the moment printed at the governing section is their statics: M = the
    vector sum over the plates on one side of sum F_i (z - z_i), horizontal and vertical
    planes combined (closed form; each plate's force at its mid-thickness, and the force from
    outside the bars at mid-pin where no floorbeam plate takes it, as the report says)."""
    res = outcomes[name].results
    checked = 0
    for p in res.pins:
        if p.governing_z is None or not p.plate_forces:
            continue
        z, zs = 0.0, []
        for row in p.packing:
            z += row.gap_before
            zs.append(z + row.thickness / 2.0)
            z += row.thickness
        # with what acts at mid-pin where no floorbeam plate takes the outside force
        F = np.array([*p.plate_forces, p.mid_pin_force])
        zs.append(z / 2.0)
        big = np.abs(F).max()
        assert np.abs(F.sum(axis=0)).max() <= 1e-9 * big
        left = np.array(zs) < p.governing_z - 1e-9
        arm = p.governing_z - np.array(zs)[left]
        M = math.hypot(*(F[left] * arm[:, None]).sum(axis=0))
        assert M == pytest.approx(p.governing_M, rel=1e-9, abs=1e-9)
        checked += 1
    assert checked == len(res.pins)


def test_the_pin_tables_print_the_plate_forces_at_the_rating_load(outcomes):
    """A checking engineer gets the forces to work the pin's moments from (they were not
    printed): two rows of each packing table, and what acts at mid-pin where no floorbeam
    plate takes the outside force (the upper-chord pins of a through truss)."""
    from rating.report import render_report

    res = outcomes["tc0622_parker_1907.xlsx"].results
    html = render_report(res)
    rows = sum(-(-len(p.packing) // 12) for p in res.pins)  # a row of 12 plates at most
    assert html.count("<th>F horizontal (kip)</th>") == rows
    assert html.count("<th>F vertical (kip)</th>") == rows
    assert "acts at mid-pin from outside the bars (no floorbeam plate takes it)" in html


def test_workbook_warnings_that_bear_on_the_decision_reach_the_recommendation(tmp_path):
    """A workbook warning headed in capitals (here: no deck dead load listed, the workbook
    open with edits perhaps unsaved) keeps its head first in the results, with its cell after
    it, so the report's recommendation box and the batch's "read before deciding" show it."""
    sys.path.insert(0, str(Path(__file__).resolve().parent / "inventory"))
    from inventory_helpers import fresh, write

    d = fresh()
    d["tables"]["DeadLoads"] = []
    d["bridge"].update(ws_thickness=None)
    book = write(tmp_path / "bare.xlsx", d)
    (tmp_path / ".~lock.bare.xlsx#").write_text("someone,host,2026-12-05")
    outcome = rate_workbook(book)
    assert outcome.results is not None
    heads = [w.partition(":")[0] for w in outcome.results.decision_warnings]
    assert "NO DECK DEAD LOAD" in heads and "UNSAVED EDITS POSSIBLE" in heads
    dead = next(w for w in outcome.results.decision_warnings if w.startswith("NO DECK"))
    assert dead.startswith("NO DECK DEAD LOAD: DeadLoads!A6: the DeadLoads sheet lists no DC")


def test_path_table_checks_by_hand(outcomes):
    """The report's table of ratings on the load path gives C, D, L and gamma_LL as printed:
    (C - D) / (gamma_LL L) from those printed numbers (0.1 kip) is the printed RF, rounded
    down, to within 0.01 (the note beneath the summary table says so)."""
    import math as _m
    import re

    from rating.report.html import render_report

    res = outcomes["tc0622_parker_1907.xlsx"].results
    html = render_report(res)
    body = html[html.index("Ratings on the load path: the forces"):]
    body = body[:body.index("</table>")]
    rows = re.findall(r'<tr>\s*<td class="id">(\w+)</td>.*?</tr>', body, re.S)
    cells = [re.findall(r'<td class="num">([^<]*)</td>', r)
             for r in re.findall(r'<tr>\s*<td class="id">.*?</tr>', body, re.S)]
    rfs = re.findall(r'<td class="rf [^"]*">([^<]*)</td>', body)
    assert rows and len(cells) == len(rows) == len(rfs)
    assert any("(sets the posting)" in r for r in
               re.findall(r'<tr>\s*<td class="id">.*?</tr>', body, re.S))
    for (c, d, _factors, ll, g), rf in zip(cells, rfs, strict=True):
        num = [float(x.replace("\u2212", "-").replace("+", "")) for x in (c, d, ll, g)]
        by_hand = (num[0] - num[1]) / (num[3] * num[2])
        assert abs(_m.floor(by_hand * 100) / 100 - float(rf)) <= 0.011, (c, d, ll, g, rf)


def test_every_rating_on_the_load_path_checks_by_hand(outcomes):
    """The appendix gives C, D, L and gamma_LL of every rating on the load path (a reviewer
    found 117 of 429 live-load cells of the Pratt report whose RF did not follow from the
    envelope beside it: those are marked * and checked here instead). From the printed
    numbers (C - D) / (gamma_LL L), rounded down, is the printed RF to within 0.01; the rows
    are as many as the ratings the results carry forces for, and as many as the * marks."""
    import math as _m
    import re

    from rating.report.html import render_report

    res = outcomes["tc0417_pratt_1898.xlsx"].results
    html = render_report(res)
    body = html[html.index("<h3>Every rating on the load path</h3>"):]
    body = body[:body.index("</table>")]
    rows = re.findall(r"<tr><td class=\"id\">.*?</tr>", body, re.S)
    expected = sum(1 for m in res.members for r in m.ratings.values()
                   if r.dead_at_rating is not None)
    assert len(rows) == expected > 0
    stars = len(re.findall(r'<td class="rf [^"]*">[^<]*\*</td>', html))
    assert stars == expected
    for row in rows:
        nums = re.findall(r'<td class="num">([^<]*)</td>', row)
        c, d, _factors, ll, g = nums
        rf = re.search(r'<td class="rf [^"]*">([^<]*)</td>', row).group(1)
        v = [float(x.replace("\u2212", "-").replace("+", "")) for x in (c, d, ll, g)]
        by_hand = (v[0] - v[1]) / (v[3] * v[2])
        # each printed force is within 0.05 of its value: the RF they give, within this
        slack = 0.1 / (v[3] * v[2]) + abs(by_hand) * 0.05 / v[2] + 0.011
        assert abs(_m.floor(by_hand * 100) / 100 - float(rf)) <= slack, row


def test_the_pratt_samples_permit_is_rated_for_its_issue(outcomes):
    """The Pratt sample's single-trip permit (invented): its own load factor (ADTT 40, MBE
    Table 6A.4.5.4.2a-1 [value from memory]: 1.35), one vehicle alone in one lane (trusses
    17 ft apart, a 15 ft roadway between them: wheels 3 ft and 9 ft from the truss, (14 + 8)
    / 17 / 2 = 11/17 of an axle by the lever rule, no multiple presence), never posted, and
    said last in the recommendation and as such in the report."""
    from rating.report.html import render_report

    res = outcomes["tc0417_pratt_1898.xlsx"].results
    v = next(v for v in res.vehicles if v.id == "TAM-CRANE")
    assert (v.category, v.rating_level, v.gamma_ll) == ("single-trip permit", "permit", 1.35)
    legal = next(v for v in res.vehicles if v.id == "TAM-PLOW")
    m = res.members[0]
    assert m.live_load["TAM-CRANE"].distribution_factor == pytest.approx(11.0 / 17.0, abs=1e-6)
    assert m.live_load["TAM-PLOW"].distribution_factor == pytest.approx(1.2 * 11.0 / 17.0,
                                                                        abs=1e-6)
    assert legal.rating_level == "legal"
    entry = res.posting["TAM-CRANE"]
    assert entry.action == "none" and entry.posting_tons is None and entry.rf < 1.0
    assert "should not cross as requested" in entry.note
    # last, after the condition on the bent counter and before the engineer's decision
    tail = res.recommendation.split("If L3U4 is confirmed to act (recorded bent)")[1]
    assert tail.endswith(" Permit loads (for the permit's issue, not a posting): mobile crane "
                         "to Hollis Mill, single-trip permit, RF 0.71 (L1U1): not as "
                         "requested." + DECISION_NOTE)
    assert entry.permit == "not as requested"
    html = render_report(res)
    assert "permit: not as requested" in html
    # the review block has a line for the permit's decision (not in reports without one)
    assert "Permits: issued, with conditions, or refused" in html
    parker = render_report(outcomes["tc0622_parker_1907.xlsx"].results)
    assert "Permits: issued" not in parker


def test_an_owner_specified_posted_vehicle_is_told_not_to_cross_at_full_weight(outcomes):
    # the county's snowplow (27 tons, invented) posted for 26 tons on the Pratt sample: at
    # its full weight it should not cross (lightened to the posting, as the owner allows)
    res = outcomes["tc0417_pratt_1898.xlsx"].results
    assert res.posting["TAM-PLOW"].action == "post"
    assert ("county snowplow, tandem 26 tons (an owner-specified vehicle of 27 tons: not to "
            "cross at full weight)" in res.recommendation)


def test_a_load_path_rating_prints_the_weighted_dw_factor_it_took(outcomes):
    """The Parker sample's wearing surface was measured: it takes gamma_DW = 1.25 and the
    rest of DW 1.50 (AASHTO LRFD Table 3.4.1-2 [V]; MBE 6A.4.2.2 [value from memory]). A
    rating on the load path prints their weighted value, the one its dead state took (it
    printed the nominal 1.50, and a reviewer's hand check of the factored dead load failed):
    where no tension-only member is slack at the rating level beyond those slack under dead
    load alone, the factored dead load is gamma_DC DC + gamma_DW DW of the member's own DC
    and DW (statics of the dead-load state: common practice)."""
    res = outcomes["tc0622_parker_1907.xlsx"].results
    linear = {r.factors.gamma_dw for m in res.members for r in m.ratings.values()
              if r.method == "linear" and r.factors is not None and m.dead_load["DW"] > 0}
    path = [(m, r) for m in res.members for r in m.ratings.values()
            if r.method == "load multiplier" and r.factors is not None]
    assert path and 1.5 not in {r.factors.gamma_dw for _, r in path}
    assert all(any(abs(r.factors.gamma_dw - g) < 1e-9 for g in linear)
               for _, r in path if r.factors.gamma_dw > 1.0)
    m = res.member("L3L4")
    r = next(r for r in m.ratings.values() if r.method == "load multiplier")
    assert r.dead_at_rating == pytest.approx(
        r.factors.gamma_dc * m.dead_load["DC"] + r.factors.gamma_dw * m.dead_load["DW"],
        rel=1e-6)


def test_a_condition_and_system_factor_below_085_says_085_is_taken(outcomes):
    from rating.report import render_report
    from rating.report.view import build_view

    res = outcomes["tc0417_pratt_1898.xlsx"].results
    rows = build_view(res).members
    rated = [r for r in rows if "\u00d7" in r.factors]
    for r in rated:  # (MBE 6A.4.2.1: phi_c phi_s >= 0.85)
        phi_c, phi_s = (float(x) for x in r.factors.split(" \u00d7 "))
        assert r.factors_floor == (phi_c * phi_s < 0.85 - 1e-9), r
    assert [r.id for r in rated if r.factors_floor] == ["L3U4"]  # 0.95 x 0.85 = 0.81
    assert "0.85 taken" in render_report(res)


def test_loss_at_a_loop_that_may_run_along_the_bar_is_a_condition_of_the_recommendation(
        outcomes):
    """The Parker sample's hanger L1U1 has 45 % of its diameter lost at the loop, rated as a
    local section (fracture only). Along the bar around the pin, yielding on the reduced
    section governs (its warning gives phi_y F_y A): rated so, SU7's RF is, by the rating
    equation (MBE 6A.4.2.1 [value from memory]) with that resistance and phi_c phi_s >= 0.85,
    (max(phi_c phi_s, 0.85) phi_y F_y A - gamma_DC DC - gamma_DW DW) / (gamma_LL (LL + IM)),
    a closure to consider: the recommendation leads with it until the loss is confirmed
    local (a reader's finding: the warning alone left the headline 'Post the bridge')."""
    res = outcomes["tc0622_parker_1907.xlsx"].results
    loop = next(w for w in res.warnings if "the loss at its loop" in w)
    phi_y_fy_a = float(re.search(r"= ([\d.]+) kip, against", loop).group(1))
    m = res.member("L1U1")
    r, e = m.ratings["SU7"], m.live_load["SU7"]
    f = r.factors
    C = max(f.phi_c * f.phi_s, 0.85) * phi_y_fy_a
    rf = (C - f.gamma_dc * m.dead_load["DC"] - f.gamma_dw * m.dead_load["DW"]) / (
        f.gamma_ll * e.max_with_im)
    said = next(w for w in res.warnings if w.startswith("LOOP LOSS MAY RUN ALONG THE BAR"))
    assert f"lowest truck RF {math.floor(rf * 100 + 1e-7) / 100:.2f} (SU7, L1U1)" in said
    assert rf < 0.3  # (a closure to consider)
    assert res.recommendation.startswith(
        "Consider closing the bridge unless the loss at the loop of L1U1 is confirmed local "
        "(not along the bar around the pin): if the loss at the loop of L1U1 runs along the "
        "bar, lowest truck RF")
    assert "If the loss at the loop of L1U1 is confirmed local (not along the bar around the " \
        "pin): post the bridge." in res.recommendation


def test_the_weighted_dw_factor_of_a_load_path_rating_is_the_members_own():
    """The Parker sample with its water line given as a load at each floorbeam (not spread
    like the wearing surface): the surface's and the utilities' shares of DW differ member by
    member, and the factor printed beside a rating on the load path is the member's own
    weighting (a reviewer found a whole-bridge weighting 1.354 printed against 1.349
    applied). Where the tension-only members slack at the rating level are those slack
    under dead load alone, gamma_DC DC + gamma_DW DW of the member's own DC and DW is the
    factored dead load it prints (statics of one active set: common practice)."""
    from rating.inventory.reader import read_workbook
    from rating.lrfr.engine import rate_bridge
    from rating.model import DeadLoadBasis
    from rating.results_build import build_results

    bridge = read_workbook(next(p for p in SAMPLES if "parker" in p.name)).bridge
    items = tuple(replace(d, basis=DeadLoadBasis.KIP_PER_FLOORBEAM, intensity=2.0)
                  if d.description.startswith("water line") else d for d in bridge.dead_loads)
    assert items != bridge.dead_loads
    rating = rate_bridge(replace(bridge, dead_loads=items), ["SU7", "HL-93"], what_if=False)
    res = build_results(rating)
    dead_slack = set(rating.dead.slack_members)
    checked = set()
    for m in res.members:
        for r in m.ratings.values():
            if (r.method == "load multiplier" and r.dead_at_rating is not None
                    and r.factors.gamma_dw > 1.0 and set(r.slack_at_rating) == dead_slack):
                sense = -1.0 if r.sense == "compression" else 1.0  # (D in the sense rated)
                assert r.dead_at_rating == pytest.approx(sense * (
                    r.factors.gamma_dc * m.dead_load["DC"] + r.factors.gamma_dw
                    * m.dead_load["DW"]), rel=1e-6), (m.id, r)
                checked.add(m.id)
    assert checked  # (a weighting over the whole bridge, its end floorbeams' loads
    # included, printed 1.354 here against the 1.349 these members took)

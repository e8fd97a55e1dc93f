"""The report document: self-contained, deterministic, in the bridge's units, with every part
the brief asks for. Parsed with the standard library's HTML parser (htmlcheck.py)."""

from __future__ import annotations

import re

import pytest
from htmlcheck import read

from rating.errors import InputError
from rating.report import render_report
from rating.report.html import environment, template_dir
from rating.report.svg import lowest_rating
from rating.report.view import build_view, controls
from rating.results import RatingResults
from rating.units import from_core


@pytest.fixture(scope="module")
def html_us(results_us: RatingResults) -> str:
    return render_report(results_us)


@pytest.fixture(scope="module")
def html_si(results_si: RatingResults) -> str:
    return render_report(results_si)


def test_the_recommendation_box_says_whose_decision_it_is_once(
        results_us: RatingResults) -> None:
    """The recommendation of the results ends with the sentence that the decision is the
    licensed engineer's; the box says so in its own, fuller paragraph, so the sentence is not
    repeated in the verdict above it."""
    from dataclasses import replace

    from rating.results import DECISION_NOTE

    said = replace(results_us, recommendation=results_us.recommendation + DECISION_NOTE)
    text = re.sub(r"\s+", " ", " ".join(read(render_report(said)).text))
    assert text.count("recommendation for the decision of the licensed engineer") == 1
    assert results_us.recommendation in text


def test_well_formed_and_deterministic(html_us: str, results_us: RatingResults) -> None:
    doc = read(html_us)
    assert doc.errors == []
    assert html_us == render_report(results_us)  # same results, byte-identical report
    assert html_us.startswith("<!DOCTYPE html>")


def test_self_contained_no_network_no_script(html_us: str) -> None:
    doc = read(html_us)
    names = {t for t, _ in doc.tags}
    assert not names & {"script", "link", "img", "iframe", "object", "embed", "base", "form"}
    ids = {attrs["id"] for _, attrs in doc.tags if "id" in attrs}
    for tag, attrs in doc.tags:
        for k, val in attrs.items():
            assert not k.startswith("on"), (tag, k)
            if tag == "a" and k == "href" and val.startswith("#") and val[1:] in ids:
                continue  # the contents: a place in this page, nothing fetched
            if k in ("src", "href", "xlink:href", "action"):
                pytest.fail(f"{tag} has {k}={val!r}")
            if k == "xmlns":
                assert val == "http://www.w3.org/2000/svg"
    css = "".join(doc.style)
    assert "@import" not in css
    assert re.findall(r"url\(([^)]*)\)", html_us) == \
        [u for u in re.findall(r"url\(([^)]*)\)", html_us) if u.startswith("#")]
    assert all(m == "http://www.w3.org/2000/svg" for m in re.findall(r"https?://[^\"' )]+",
                                                                     html_us))


def test_summary_parts(html_us: str, results_us: RatingResults) -> None:
    text = " ".join(read(html_us).text)
    text = re.sub(r"\s+", " ", text)
    b = results_us.bridge
    for part in (b.name, b.location, b.owner, b.inspection_date, b.inspector,
                 results_us.provision_set, "LRFR"):
        assert part in text
    for v in results_us.vehicles:
        assert v.name in text
    for c in controls(results_us):
        assert c.element in text
    assert "recommendation for the decision of the licensed engineer in responsible charge" \
        in text
    for part in ("Seal", "Signature", "Date of review", "Reviewed by"):
        assert part in text
    assert results_us.recommendation in text
    # the RF is worked from unrounded forces: a hand check from the printed ones may be 0.01 off
    assert "so one worked by hand from the forces printed to 0.1 can differ from it by 0.01" \
        in text
    # the cautions
    assert "an aid to, not a substitute for, the judgement of the licensed engineer" in text
    assert "owner\u2019s bridge manual and local codes govern" in text
    assert "Posting and closure are recommendations" in text
    # what is not rated is said beside the recommendation and among the cautions: floor
    # systems often govern old trusses (Bowen & Engelhardt, TxDOT 1741-2, 2003)
    assert "Scope: the truss members and their pins only" in text
    assert "Only the truss members and pins are rated" in text


def test_one_influence_figure_per_controlling_member(html_us: str,
                                                     results_us: RatingResults) -> None:
    members = {m.id for m in results_us.members}
    ctl = {c.element for c in controls(results_us) if c.element in members}
    assert html_us.count('class="influence"') == len(ctl)
    pins = {c.element for c in controls(results_us) if c.kind == "pin"}
    assert pins  # the sample has a pin that controls: it is explained, with its packing
    assert "has no single influence line" in html_us


def test_member_and_pin_tables(html_us: str, results_us: RatingResults) -> None:
    doc = read(html_us)
    text = " ".join(doc.text)
    for header in ("DC (kip)", "DW (kip)", "LL+IM max (kip)", "\u03c6R tension (kip)",
                   "Lowest RF", "Governing check", "Governing finding", "Thickness (in)",
                   "Gap before (in)"):
        assert header in text, header
    assert "At the rating load" in text
    for p in results_us.pins:
        assert p.governing_section in text
    # the finding that governs L1U1 is in its row
    row = re.search(r">L1U1</td><td>hanger</td>(.*?)</tr>", html_us, re.S)
    assert row and "18% loss" in row.group(1)
    # the no-live-load dash is explained
    assert "\u2014" in text and "no live-load effect of that sense" in text


def test_si_report_in_si_units(html_si: str, results_si: RatingResults) -> None:
    text = " ".join(read(html_si).text)
    assert "DC (kN)" in text and "Length (m)" in text and "W (tonne)" in text
    m = results_si.member("L2L3")
    dc_kn = from_core(m.dead_load["DC"], "kN")  # NIST SP 811 B.9: 1 kip = 4.448222 kN
    assert f"+{dc_kn:.1f}" in text
    assert "(kip)" not in text


def test_assumptions_from_memory_are_marked(html_us: str, results_us: RatingResults) -> None:
    view = build_view(results_us)
    marked = [a for a in view.assumptions if a.from_memory]
    assert marked and all("memory" in a.text.lower() for a in marked)
    assert html_us.count('class="memory"') == len(marked)
    for w in results_us.warnings:
        assert w in " ".join(read(html_us).text)


@pytest.mark.parametrize(("paper", "css"), [(None, "size: letter"), ("a4", "size: A4"),
                                             ("letter", "size: letter"), ("auto", "size: auto"),
                                             (" A4 ", "size: A4")])
def test_page_size(results_us: RatingResults, paper: str | None, css: str) -> None:
    assert css in render_report(results_us, paper=paper)


def test_page_size_si_default_and_print_rules(html_si: str) -> None:
    assert "size: A4" in html_si
    for rule in ("break-inside: avoid", "break-after: avoid", "display: table-header-group",
                 "@media print"):
        assert rule in html_si


def test_unknown_paper_is_an_input_error(results_us: RatingResults) -> None:
    with pytest.raises(InputError, match="paper size 'legal' is not known"):
        render_report(results_us, paper="legal")


def test_templates_from_package_data_with_autoescape() -> None:
    d = template_dir()
    assert (d / "report.html.j2").is_file() and (d / "report.css").is_file()
    env = environment()
    assert env.autoescape is True
    assert str(env.from_string("{{ x }}").render(x="<b>")) == "&lt;b&gt;"


def test_pin_named_either_way_controls(results_us: RatingResults) -> None:
    """The engine names a pin "pin at L2"; "pin L2" and "L2" are understood too."""
    from dataclasses import replace

    for name in ("pin at L2", "pin L2", "Pin  at  L2"):
        posting = {k: replace(p, member=name) if p.member == "pin L2" else p
                   for k, p in results_us.posting.items()}
        ctl = controls(replace(results_us, posting=posting))
        pins = [c for c in ctl if c.kind == "pin"]
        assert pins and all(c.rating is not None for c in pins), name


def test_minus_infinity_is_explained(results_us: RatingResults) -> None:
    from dataclasses import replace

    m = results_us.members[0]
    vid = next(iter(m.ratings))
    bad = replace(m, ratings={**m.ratings, vid: replace(m.ratings[vid], rf=float("-inf"))})
    r = replace(results_us, members=(bad, *results_us.members[1:]))
    html = render_report(r)
    assert "\u2212\u221e" in html and "no rating is possible" in html


def test_mirror_members_rated_alike_are_named_beside_the_controlling_one() -> None:
    # the SI pony truss is symmetric: its mirror diagonals rate the same within round-off;
    # the first in the member order is named, its mirror beside it
    from pathlib import Path

    from rating.pipeline import rate_workbook
    from rating.report.html import render_report

    root = Path(__file__).resolve().parents[2]
    r = rate_workbook(root / "sample_inventory" / "tc0903_pony_1903_si.xlsx").results
    entry = r.posting["SU4"]
    assert entry.member == "U2L3" and entry.alike == ("L3U4",)
    assert entry.rf == pytest.approx(r.member("L3U4").ratings["SU4"].rf, rel=1e-9)
    html = render_report(r)
    assert "same RF: L3U4" in html
    # its Type 3 rating is a load reversal of an eyebar diagonal without a counter: said so
    assert r.posting["TYPE-3"].member == "U1L2" and r.posting["TYPE-3"].alike == ("L4U5",)
    assert "same RF: L4U5" in html
    assert "reverses this tension-only member" in html


def test_each_warning_once_for_each_member(sample_outcomes) -> None:
    """A warning several members share is listed once as "members X, Y: text"; a member's
    own copy of it is not listed again as "member X: text" (the Parker sample's report
    used to list its eyebar, rod and slender-plate warnings twice)."""
    seen = 0
    for o in sample_outcomes:
        if o.results is None:
            continue
        said: set[tuple[str, str]] = set()
        for line in build_view(o.results).warnings:
            head, sep, rest = line.partition(": ")
            if not sep or not head.startswith("member"):
                continue
            for name in head.split(" ", 1)[1].split(", "):
                assert (name, rest) not in said, line
                said.add((name, rest))
                seen += 1
    assert seen  # the samples have member warnings


def test_a_members_own_warning_not_in_the_general_list_is_kept(results_us) -> None:
    from dataclasses import replace

    m = results_us.members[0]
    extra = f"member {m.id}: a warning only this member carries"
    r = replace(results_us, members=(replace(m, warnings=(*m.warnings, extra)),
                                     *results_us.members[1:]))
    assert build_view(r).warnings.count(extra) == 1


def test_a_long_packing_is_one_table_whose_rows_line_up(results_us) -> None:
    """A pin of 15 plates: its packing in rows of 12 plates in one table (so the columns line
    up), the last row padded with empty cells to 12."""
    from dataclasses import replace

    from rating.results import PackingRow

    pin = results_us.pins[0]
    plates = tuple(PackingRow(f"M{k}", 1.0, 0.0625) for k in range(15))
    r = replace(results_us, pins=(replace(pin, packing=plates), *results_us.pins[1:]))
    view = build_view(r)
    chunks = view.pins[0].packing_chunks
    assert [str(c.order).count("<td") for c in chunks] == [12, 12]
    assert ">15<" in str(chunks[1].order)
    # sixteenths of an inch echoed as recorded (not 0.062), whole inches to three places
    assert ">0.0625<" in str(chunks[0].gap) and ">1.000<" in str(chunks[0].thickness)
    html = render_report(r)
    block = html.split(f"Pin {pin.joint} ")[1].split("</table>")[0]
    assert block.count('<table class="compact packing">') == 1 and block.count("<tbody>") == 2


def test_a_screening_load_below_one_is_not_shown_as_no_restriction(sample_outcomes) -> None:
    """The Parker sample's NRL rates 0.48: the SHVs are rated and posted one by one (FHWA SHV
    Q&A, March 2014), the NRL itself is not posted, and the summary must not read "no
    restriction" beside an RF under 1.0."""
    parker = next(o for o in sample_outcomes if "parker" in o.workbook.name)
    row = next(r for r in build_view(parker.results).summary if r.vehicle_id == "NRL")
    assert float(row.rf.text) < 1.0
    assert row.action == "not posted" and "screening load" in row.note


def test_an_emergency_vehicle_that_cannot_be_posted_reads_consider_barring(
        results_us: RatingResults) -> None:
    """An emergency vehicle with the action "close" is worded "consider barring" in the
    summary and leaves the recommendation box at the posting colour (the bridge is not
    closed for it: rating.results.overall_action); a truck with "close" still reads
    "consider closing"."""
    from dataclasses import replace

    ev = next(v.id for v in results_us.vehicles if v.category == "emergency")
    barred = replace(results_us, posting={**results_us.posting, ev: replace(
        results_us.posting[ev], rf=0.25, action="close", posting_tons=None)})
    view = build_view(barred)
    row = next(s for s in view.summary if s.vehicle_id == ev)
    assert row.action == "consider barring"
    assert view.worst_action != "close"
    truck = next(v.id for v in results_us.vehicles
                 if v.rating_level == "legal" and v.category != "emergency")
    closed = replace(barred, posting={**barred.posting, truck: replace(
        barred.posting[truck], rf=0.2, action="close", posting_tons=None)})
    view = build_view(closed)
    assert next(s for s in view.summary if s.vehicle_id == truck).action == "consider closing"
    assert view.worst_action == "close"


def test_the_closing_footnote_states_the_rule_the_posting_applies(
        html_us: str, html_si: str) -> None:
    """The summary's footnote gives the least posting load the posting rule applies
    (rating.lrfr.posting.least_posting_load, MBE 6A.8.1 [value from memory]): the two must
    not drift apart."""
    from rating.lrfr.factors import provisions
    from rating.lrfr.posting import least_posting_load

    tons = provisions()["posting"]["least_tons"]
    us = re.sub(r"\s+", " ", " ".join(read(html_us).text))
    si = re.sub(r"\s+", " ", " ".join(read(html_si).text))
    assert f"a safe posting load under {tons:g} tons, the least a bridge kept open" in us
    assert (f"a safe posting load under {tons:g} tons ({least_posting_load('tonne'):.2f} "
            "tonnes), the least a bridge kept open") in si


def test_the_recommendation_comes_before_the_vehicle_table(html_us: str) -> None:
    """The first page gives the outcome: the recommendation box follows the bridge's facts and
    comes before the table of every vehicle (which runs on to later pages); the review and
    sign-off block follows the table, in a box of its own (a reviewer's finding: with the
    sign-off inside it, the box did not fit beneath the facts and page 1 held no outcome)."""
    rec = html_us.index("<h2>Posting recommendation, for the licensed engineer&rsquo;s "
                        "decision</h2>")
    table = html_us.index('<table class="summary">')
    review = html_us.index('<h2>Review and decision</h2>')
    assert html_us.index('<div class="facts">') < rec < table < review
    assert html_us.count('class="signoff"') == 1 and html_us.index('class="signoff"') > review


def test_a_pin_warning_said_for_several_pins_is_not_repeated_pin_by_pin() -> None:
    """The results group a warning shared by pins ("pins at joints L3, L4: text"); each
    pin's own copy ("pin at joint L3: text") is then not listed again (it was, once per
    joint: a reviewer counted the same warning four ways)."""
    from rating.report.view import _with_own_warnings

    general = ["pins at joints L3, L4: pin 5 in is small", "member A: rusty"]
    own = ["pin at joint L3: pin 5 in is small", "pin at joint L4: pin 5 in is small",
           "pin at joint L5: other", "member A: rusty", "member B: rusty"]
    assert _with_own_warnings(general, own) == (
        "pins at joints L3, L4: pin 5 in is small", "member A: rusty",
        "pin at joint L5: other", "member B: rusty")


def test_member_table_details(results_us: RatingResults) -> None:
    """A tension-only member's compression resistance reads as a dash (it has none), not
    0.0; the truss form is written with a capital."""
    view = build_view(results_us)
    t_only = [r for r in view.members if r.tension_only]
    assert t_only and all(r.phi_rc != "0.0" for r in t_only)
    truss = next(f.value for f in view.bridge_facts if f.label == "Truss")
    assert truss[:1] == truss[:1].upper()


def test_the_summary_names_the_finding_behind_each_governing_check(
        results_us: RatingResults) -> None:
    """Beside a governing check that rests on a recorded finding, the summary names it (a
    reviewer read "rod end fracture at the loop" without the 45 % loss that drives it)."""
    view = build_view(results_us)
    with_finding = [r for r in view.summary if r.finding]
    controls_ = {c.vehicle.id: c for c in controls(results_us)}
    for r in view.summary:
        c = controls_[r.vehicle_id]
        assert r.finding == (c.rating.finding if c.rating is not None else "")
    assert with_finding  # (the hand-built sample's controlling checks rest on findings)
    if with_finding:
        html = render_report(results_us)
        assert f"finding: {with_finding[0].finding}" in html
        # a finding the row above already gives is not written out again
        repeats = sum(1 for a, b in zip(view.summary, view.summary[1:], strict=False)
                      if b.finding and b.finding == a.finding)
        assert html.count("finding: as above") == repeats


def test_an_emergency_vehicle_is_named_as_one_in_the_level_column(
        results_us: RatingResults) -> None:
    view = build_view(results_us)
    ev = {v.id for v in results_us.vehicles if v.category == "emergency"}
    assert ev and all(r.level == "legal load (emergency vehicle)" for r in view.summary
                      if r.vehicle_id in ev)
    assert all(r.level != "legal load (emergency vehicle)" for r in view.summary
               if r.vehicle_id not in ev)


def test_member_table_gives_the_condition_and_system_factors(results_us: RatingResults) -> None:
    """phi_c x phi_s of each member's resistance is in the member table (a reviewer found a
    posting resting on phi_c 0.95 from a condition rating with nothing in the table to say
    so)."""
    view = build_view(results_us)
    for m, row in zip(results_us.members, view.members, strict=True):
        low = lowest_rating(m.ratings.items())
        if low is not None and low[1].factors is not None:
            assert row.factors == f"{low[1].factors.phi_c:.2f} \u00d7 {low[1].factors.phi_s:.2f}"
    assert "&phi;<sub>c</sub> &times; &phi;<sub>s</sub>" in render_report(results_us)


def test_a_section_heading_is_kept_with_its_first_drawing(html_us: str) -> None:
    """In print a page must not end on a section's heading with its drawing on the next page
    (a reviewer's 16-panel report left "3. Influence lines ..." and its note at the foot of a
    page). The heading of sections 2 and 3, the note and the first drawing are one block the
    browser does not break (class "keep": break-inside avoid), checked on the document's
    structure: the heading and the first figure's drawing share that block."""
    for section, first in (("elevation", "<svg"), ("influence", "<figure")):
        body = html_us[html_us.index(f'<section id="{section}">'):]
        body = body[:body.index("</section>")]
        assert '<div class="keep lead">' in body, section
        block = body[body.index('<div class="keep lead">'):]
        head = block.index("<h2>")
        assert head < block.index(first, head), section
        # the first drawing's figure closes before the keep block does
        assert block.index("</figure>") < _closing_div(block), section


def _closing_div(block: str) -> int:
    """Index of the </div> that closes the <div> the block starts with."""
    depth = 0
    for m in re.finditer(r"<div\b|</div>", block):
        depth += 1 if m.group().startswith("<div") else -1
        if depth == 0:
            return m.start()
    raise AssertionError("unclosed <div>")


def test_the_appendix_works_out_the_own_weight_checks(sample_outcomes) -> None:
    """A check "with own-weight bending" has an R_n worked back from an interaction
    (rating.capacity.own_weight): the appendix prints its quantities under its name (P_r,
    M_u, M_r, P_e and the axial force reached); the other checks' quantities stay in the
    results file (their R_n is one formula of the sections table's numbers)."""
    results = next(o.results for o in sample_outcomes
                   if o.results is not None and o.workbook.name.startswith("tc0417"))
    html = render_report(results)
    # each such check's row is followed by a row across the table with its terms
    own = re.findall(r'<tr class="has-worked"><td class="id">[^<]*</td><td>([^<]*)</td>.*?'
                     r'</tr>\s*<tr class="worked"><td></td><td colspan="8">(.*?)</td></tr>',
                     html, re.S)
    assert own and all("with own-weight bending" in name for name, _ in own)
    assert all("the interaction reaches 1.0 at P =" in worked for _, worked in own)
    n_own = sum(1 for m in results.members for c in m.resistance.checks
                if c.name.endswith("with own-weight bending"))
    assert len(own) == n_own == html.count('<tr class="worked">')
    checks = [c for m in results.members for c in m.resistance.checks]
    assert all(c.detail for c in checks if c.name == "yielding on the gross section")


def test_the_contents_name_every_numbered_section(html_us: str) -> None:
    """Page 1 lists the report's ten sections, each a link to its place in this page."""
    nav = html_us[html_us.index('<nav class="contents"'):html_us.index("</nav>")]
    targets = re.findall(r'href="#([a-z]+)"', nav)
    assert targets == re.findall(r'<section id="([a-z]+)">', html_us)
    assert len(targets) == 10


def test_an_estimated_loss_is_marked_in_the_findings_echo(results_us: RatingResults) -> None:
    """A loss judged by eye is echoed with the word "estimated" beside it (the Findings sheet's
    "Loss found by"), and the results file carries it."""
    from dataclasses import replace

    from rating.results import results_json

    f0 = results_us.findings[0]
    said = replace(results_us, findings=(replace(f0, estimated=True),) + results_us.findings[1:])
    html = render_report(said)
    body = html[html.index('<section id="findings">'):html.index('<section id="vehicles">')]
    assert body.count(" estimated</td>") == 1
    assert '"estimated":true' in results_json(said)
    assert " estimated</td>" not in render_report(results_us)


def test_a_flexural_torsional_check_is_explained_under_the_member_table() -> None:
    """Posts of two channels and one plate with nothing across the open side (invented, the
    Pratt sample's verticals made so): their flexural-torsional buckling governs, and the
    note under the member table says what it is and where its terms are."""
    from dataclasses import replace
    from pathlib import Path

    from rating.inventory.reader import read_workbook
    from rating.lrfr.engine import rate_bridge
    from rating.model import (
        BuiltUpSection,
        ChannelPart,
        ConnectorKind,
        Connectors,
        MemberRole,
        PlatePart,
    )
    from rating.results_build import build_results

    root = Path(__file__).resolve().parents[2]
    b = read_workbook(root / "sample_inventory" / "tc0417_pratt_1898.xlsx").bridge

    def post(section: BuiltUpSection) -> BuiltUpSection:
        ch = tuple(p for p in section.parts if isinstance(p, ChannelPart))
        top = max(p.y_in + p.depth_in / 2 for p in ch)
        return replace(section, parts=ch + (PlatePart("plate", 12.0, 0.25, y_in=top + 0.125),),
                       connectors=Connectors(ConnectorKind.SOLID))

    b = replace(b, member_designs=tuple(
        replace(d, section=post(d.section)) if b.geometry.member(d.member).role
        is MemberRole.VERTICAL and isinstance(d.section, BuiltUpSection) else d
        for d in b.member_designs))
    r = rate_bridge(b, ["TYPE-3"], what_if=False)
    assert r.ratings[("L2U2", "TYPE-3")].check == "compression: flexural-torsional buckling"
    html = render_report(build_results(r))
    assert "the member&rsquo;s open section twists as it buckles (AASHTO LRFD 6.9.4.1.3)" \
        in html


def test_the_review_block_lists_the_provisions_of_values_recalled_from_memory(
        html_us: str) -> None:
    """The signing engineer gets one list of what to check against the owner's editions, in
    the review block (a reader counted 176 marks scattered through one report): the
    provisions named beside a value from memory, once each, in article order, and the
    vehicles whose axles are recalled from memory."""
    from rating.report.view import to_verify

    said = to_verify((
        "gamma_LL from MBE Table 6A.4.4.2.3a-1 [value from memory]",
        "IM 33 % (AASHTO LRFD 3.6.2.1, value from memory); also AASHTO LRFD 3.6.2.1",
        "phi_c from MBE Table 6A.4.2.3-1 (read in the source)",
        "K from AASHTO LRFD 4.6.2.5 [value from memory] and AASHTO LRFD 10.5.1 [V]",
        "AISC 360-10 E7.1(c). [value from memory]",
        "dead-load factors of AASHTO LRFD 3.4.1 [V]; gamma_DW 1.25 of MBE 6A.4.2.2 [M]",
    ))
    # (a reference marked read, [V], is not listed; one marked from memory is, wherever
    # the mark is before the next reference)
    assert said == ("AASHTO LRFD 3.6.2.1", "AASHTO LRFD 4.6.2.5", "AISC 360-10 E7.1(c)",
                    "MBE 6A.4.2.2", "MBE Table 6A.4.4.2.3a-1")
    assert "Values recalled from memory, to be checked against the owner&rsquo;s editions" \
        in html_us


def test_the_list_to_verify_of_a_sample_names_the_checks_that_govern(sample_outcomes
                                                                      ) -> None:
    """On the Parker sample the tension check of its controlling hanger (AASHTO LRFD 6.8.2.1,
    [value from memory] in the member's check) and the permit's article are listed, found
    in the checks and the recommendation, not in the assumptions alone (a reviewer's
    finding)."""
    parker = next(o for o in sample_outcomes if "parker" in o.workbook.name)
    view = build_view(parker.results)
    assert "AASHTO LRFD 6.8.2.1" in view.verify


def test_the_recommendation_is_set_in_parts_with_the_same_words() -> None:
    """The box sets the recommendation's lead in bold and what applies until a condition is
    confirmed, the outcome once it is and the permits in a paragraph each (a reader found one
    bold block of twenty lines); joined, the parts are the recommendation word for word."""
    from rating.report.view import paragraphs

    text = ("Consider closing the bridge unless L3U4 is confirmed to act (recorded bent): "
            "without L3U4, lowest truck RF 0.12 (SU7, U3L4). If L3U4 is confirmed to act "
            "(recorded bent): post the bridge. Safe posting loads by vehicle class: SU4 25 "
            "tons (from Specialized hauling vehicle SU4). Emergency vehicles: post for 20 "
            "tons. If the loss runs along the bar, or until it is confirmed otherwise, post "
            "the bridge for lower loads (...). Permit loads (for the permit's issue, not a "
            "posting): crane, RF 0.71 (L1U1): not as requested.")
    parts = paragraphs(text)
    # (the emergency vehicles' words stay with the outcome they belong to)
    assert [p.split()[0] for p in parts] == ["Consider", "If", "If", "Permit"]
    assert " ".join(parts) == text

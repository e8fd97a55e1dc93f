"""What a clean workbook becomes: the rating.model.Bridge, faithfully and in core units."""

from __future__ import annotations

import math

import pytest
from inventory_helpers import cell, check, explicit, find, fresh

from rating.model import (
    BuiltUpSection,
    ConnectorKind,
    DeadLoadBasis,
    DeadLoadKind,
    EyebarSet,
    FindingRegion,
    RodEnd,
    RodSet,
    RolledShape,
    SupportKind,
    VehicleCategory,
)


@pytest.fixture(scope="module")
def base(tmp_path_factory):
    r = check(tmp_path_factory.mktemp("base"), fresh())
    assert r.errors == ()
    return r.bridge


def test_bridge_info_and_cross_section(base) -> None:
    assert base.info.structure_id == "TEST-1" and base.info.year_built == 1900
    assert base.info.inspection_date.isoformat() == "2024-06-01"
    assert base.cross_section.truss_spacing_ft == 16.0
    assert base.cross_section.curb_left_ft == 1.0  # centred: (16 - 14) / 2


def test_generated_geometry_and_stiffness_areas(base) -> None:
    g = base.geometry
    assert g.form == "pratt" and g.span_ft == 64.0
    assert {m.label for m in g.members} == {d.member for d in base.member_designs}
    # stiffness area = gross area as built: 2 bars 3.5 x 0.875 in (closed form)
    assert g.member("L0L1").area_in2 == pytest.approx(2 * 3.5 * 0.875)
    # loop rods: 2 x pi/4 x 1.125^2 (closed form)
    assert g.member("L1U1").area_in2 == pytest.approx(2 * math.pi / 4 * 1.125**2)
    assert [d.member for d in base.member_designs] == [m.label for m in g.members]


def test_sections_as_given(base) -> None:
    eb = base.design_of("L0L1").section
    assert isinstance(eb, EyebarSet) and (eb.count, eb.width_in, eb.thickness_in) == (2, 3.5, 0.875)
    rod = base.design_of("L1U1").section
    assert isinstance(rod, RodSet) and rod.end is RodEnd.LOOP
    tc = base.design_of("U1U2").section
    assert isinstance(tc, BuiltUpSection) and len(tc.parts) == 6
    assert tc.connectors.kind is ConnectorKind.LACING and tc.connectors.spacing_in == 14.0
    assert tc.holes_per_section == 4 and tc.shear_lag_U == 0.85
    assert isinstance(base.design_of("L2U2").section, RolledShape)
    assert base.design_of("L0L1").material.F_y == 30.0
    assert base.design_of("L1U1").material.assumed  # default by year


def test_findings_carried_faithfully(base) -> None:
    f = base.findings_for("L1L2")[0]
    assert (f.component, f.region, f.station_ft, f.percent_loss, f.condition_rating) == (
        "bar 2", FindingRegion.BODY, 8.0, 15.0, 5)
    assert f.where == "Findings!B5"
    rod = base.findings_for("L1U1")[0]
    # a rod is named as a reviewer calls it ("rod 1"), as the workbook names it
    assert rod.component == "rod 1" and rod.region is FindingRegion.THREAD
    assert not f.estimated and not rod.estimated  # (blank: measured)


def test_a_loss_judged_by_eye_is_carried_as_estimated(tmp_path) -> None:
    d = fresh()
    d["tables"]["Findings"][0]["how_found"] = "estimated"
    d["tables"]["Findings"][1]["how_found"] = "measured"
    r = check(tmp_path, d)
    assert r.errors == ()
    assert r.bridge.findings_for("L1L2")[0].estimated
    assert not r.bridge.findings_for("U1U2")[0].estimated
    d["tables"]["Findings"][0]["how_found"] = "guessed"
    bad = check(tmp_path, d, name="bad.xlsx")
    find(bad, cell("Findings", 0, "how_found"), "must be one of")


def test_pins_loads_vehicles_settings(base) -> None:
    pin = base.pins[0]
    assert pin.joint == "L2" and pin.diameter_in == 3.5 and len(pin.packing) == 10
    assert pin.packing[0].gap_before_in == 0.0 and pin.packing[1].gap_before_in == 0.0625
    assert pin.material.F_y == 30.0
    kinds = {(d.kind, d.basis) for d in base.dead_loads}
    assert kinds == {(DeadLoadKind.DC, DeadLoadBasis.PSF_DECK),
                     (DeadLoadKind.DC, DeadLoadBasis.KIP_PER_FLOORBEAM)}
    v = base.owner_vehicles[0]
    assert v.category is VehicleCategory.OWNER and v.axle_loads_kip == (12.0, 22.0)
    assert v.gross_weight_tons == 17.0 and v.spacings[0].min_ft == 14.0
    assert base.settings.vehicle_ids == ("HL-93", "OWN-1")
    assert base.settings.detail_allowance == 0.15 and not base.settings.detail_allowance_given


def test_settings_percentages_become_fractions(tmp_path) -> None:
    d = fresh()
    d["settings"].update(im_override=10.0, detail_allowance=20.0, gamma_ll_override=1.45,
                         df_override=0.6)
    d["bridge"].update(adtt=120, riding_surface="smooth", ws_thickness=2.0,
                       ws_unit_weight=144.0, ws_measured="yes")
    r = check(tmp_path, d)
    s = r.bridge.settings
    assert (s.im_override, s.detail_allowance, s.detail_allowance_given) == (0.1, 0.2, True)
    assert (s.gamma_ll_override, s.distribution_factor_override) == (1.45, 0.6)
    assert s.adtt_one_direction == 120 and s.wearing_surface_measured
    ws = [x for x in r.bridge.dead_loads if x.kind is DeadLoadKind.DW]
    # 2 in at 144 pcf = 24 psf (closed form)
    assert len(ws) == 1 and ws[0].intensity == pytest.approx(24.0)
    assert ws[0].where.startswith("Bridge!B")


def test_unknown_adtt_is_a_warning_at_its_cell(tmp_path) -> None:
    """A blank ADTT is allowed (the provision set's unknown-ADTT factor, the highest: MBE
    Table 6A.4.4.2.3a-1 [value from memory]) but said at its cell, since it can lower every
    legal-load rating."""
    d = fresh()
    d["bridge"].update(adtt=None)
    r = check(tmp_path, d)
    assert r.bridge is not None and r.bridge.settings.adtt_one_direction is None
    hits = [w for w in r.warnings if "the ADTT is not given" in w.message]
    assert len(hits) == 1 and hits[0].where.startswith("Bridge!B")
    d["bridge"].update(adtt=40)
    assert not [w for w in check(tmp_path, d).warnings if "ADTT" in w.message]


def test_fractions_tension_only_and_consistent_loss(tmp_path) -> None:
    d = fresh()
    d["tables"]["Eyebars"][0]["thickness"] = "7/8"
    d["tables"]["Members"][11]["tension_only"] = "yes"  # U1L2
    d["tables"]["Findings"].append({"member": "L3L4", "component": "bar 2",
                                    "remaining": 0.7, "loss": 20.0})
    d["tables"]["Vehicles"][0]["gross"] = None
    r = check(tmp_path, d)
    assert r.errors == ()
    assert r.bridge.design_of("L0L1").section.thickness_in == 0.875
    assert r.bridge.geometry.member("U1L2").tension_only
    assert r.bridge.owner_vehicles[0].gross_weight_tons == 17.0  # (12 + 22) / 2


def test_polygonal_heights(tmp_path) -> None:
    d = fresh()
    d["bridge"].update(truss_form="parker", height=None)
    d["tables"]["Heights"] = [{"point": 1, "height": 16.0}, {"point": 2, "height": 20.0},
                              {"point": 3, "height": 16.0}]
    r = check(tmp_path, d)
    assert r.errors == ()
    g = r.bridge.geometry
    assert (g.joint("U1").y_ft, g.joint("U2").y_ft, g.joint("U3").y_ft) == (16.0, 20.0, 16.0)


def test_explicit_geometry(tmp_path) -> None:
    r = check(tmp_path, explicit())
    assert r.errors == (), [p.format() for p in r.errors]
    g = r.bridge.geometry
    assert g.form == "explicit" and g.deck_joints == ("L0", "L1", "L2")
    assert {(s.joint, s.kind) for s in g.supports} == {("L0", SupportKind.PIN),
                                                       ("L2", SupportKind.ROLLER)}
    assert g.member("L1U1").tension_only and not g.member("L0L1").tension_only


@pytest.mark.parametrize(("note", "state", "word"), [
    ("forge line of the lower loop opened slightly", None, "opened"),
    ("hairline crack at the loop weld", "bent", "crack"),
    ("corrosion at the forge weld; no crack found with dye penetrant", None, None),
    ("not cracked, light rust", None, None),
    ("crack through the loop weld", "cracked", None),
    ("pitting at the thread", None, None),
])
def test_a_note_that_speaks_of_a_crack_beside_a_sound_bar_is_a_warning(
        tmp_path, note: str, state: str | None, word: str | None) -> None:
    """An inspector's note that speaks of a crack or an opened weld beside a bar recorded
    sound (or bent) is counted as carrying its load: the reading warns at the bar state, so
    the engineer records the state that takes it out (common practice: a cracked bar or
    forge weld is not counted). Words just before that deny it ("no crack found") do not."""


    d = fresh()
    d["tables"]["Findings"][2]["note"] = note
    if state is not None:
        d["tables"]["Findings"][2]["bar_state"] = state
    reading = check(tmp_path, d)
    where = cell("Findings", 2, "bar_state")
    said = [p for p in reading.problems if "speaks of" in p.message]
    if word is None:
        assert said == []
    else:
        p = find(reading, where, f"speaks of {word!r}", "warning")
        assert "member L1U1" in p.message and "record that bar state" in p.message
        # it bears on the decision (a crack taken as sound metal): headed in capitals
        assert p.message.startswith("DAMAGE IN A NOTE: the note on member L1U1")


def test_two_bars_of_a_member_without_a_section_are_not_taken_for_one(tmp_path) -> None:
    """Where a member's section cannot be read, findings on its rod 1 and rod 2 at the same
    place are not reported as the same finding recorded twice (the component stays as
    written)."""
    d = fresh()
    d["tables"]["Findings"].append({"member": "L1U1", "component": "rod 2",
                                    "region": "thread", "station": 0.3, "remaining": 1.0})
    d["tables"]["Members"] = [m for m in d["tables"]["Members"] if m["member"] != "L1U1"]
    reading = check(tmp_path, d)
    assert not any("already recorded" in p.message for p in reading.problems), \
        [p.format() for p in reading.problems]
    d2 = fresh()
    d2["tables"]["Findings"].append(dict(d2["tables"]["Findings"][2]))
    again = check(tmp_path, d2, name="again.xlsx")
    assert any("already recorded" in p.message for p in again.problems)


def test_one_member_left_out_of_a_packing_is_named_in_the_singular(tmp_path) -> None:
    d = fresh()
    kept = [p for p in d["tables"]["Packing"] if p["member"] != "L2U3"]
    for k, p in enumerate(kept, start=1):
        p["position"] = k
    d["tables"]["Packing"] = kept
    said = [p.message for p in check(tmp_path, d).errors if "no plate" in p.message]
    assert said == ["member L2U3 meets at L2 but has no plate in its packing; every bar on "
                    "the pin is needed to check it"]


def test_a_gap_in_the_packing_positions_is_questioned(tmp_path) -> None:
    """Positions 1, 2, 4 ...: a plate may have been left out (each plate's place along the
    pin follows from those before it), so the reading warns and names the missing one."""
    d = fresh()
    for p in d["tables"]["Packing"]:
        if p["position"] >= 3:
            p["position"] += 1
    said = [p.message for p in check(tmp_path, d).warnings if "has no position" in p.message]
    assert said == ["the packing of the pin at L2 has no position 3; its plates are taken in "
                    "order of position with nothing between them; check that no plate was "
                    "left out"]
    assert not any("has no position" in p.message for p in check(tmp_path, fresh(),
                                                                 name="ok.xlsx").problems)


def test_a_missing_packing_sheet_is_one_error_not_one_per_pin(tmp_path) -> None:
    from inventory_helpers import write

    from rating.inventory import read_workbook

    d = fresh()
    d["tables"]["Pins"].append({"joint": "L1", "diameter": 3.5, "material": "M-1"})

    def drop(wb) -> None:
        del wb["Packing"]

    errors = read_workbook(write(tmp_path / "w.xlsx", d, drop)).errors
    assert [p.message for p in errors] == [
        "the Packing sheet is missing, so the 2 pin(s) listed here cannot be checked: list "
        "the bars on each pin in order on that sheet, or delete the pin rows"]


def test_a_pin_plate_listed_with_a_sections_parts_is_a_warning_at_its_cell(tmp_path) -> None:
    """Every part on the Plates sheet runs the member's whole length (its area, weight and
    buckling use it); a pin plate at the ends belongs on Packing only. A plate named as one
    is warned about at its cell (a reviewer found the bundled samples' laced chords 27 %
    too strong in buckling from such plates)."""


    d = fresh()
    d["tables"]["Plates"].append({"section": "EP", "part": "pin plate L", "x": -4.5, "y": 0.0,
                                  "width": 6.0, "thickness": 0.375, "along": "y"})
    r = check(tmp_path, d)
    find(r, cell("Plates", 3, "part"), "pin plates and other plates at the ends only belong "
         "on the Packing sheet", severity="warning")
    assert not [w for w in check(tmp_path, fresh()).warnings if "Packing sheet" in w.message]


def test_a_gross_weight_apart_from_the_axles_is_kept_only_with_a_lane_load(tmp_path) -> None:
    """The RF comes from the axles and the safe posting load from W: a W of 50 tons on 15
    tons of axles posted a bridge for 26 tons instead of about 7. Without a lane load the two
    must agree (an error at the gross weight's cell); with one, W may be given apart."""


    d = fresh()
    d["tables"]["Vehicles"][0]["gross"] = 50.0  # axles: 12 + 22 kip = 17 tons
    r = check(tmp_path, d)
    find(r, cell("Vehicles", 0, "gross"), "the posting load from the gross weight")
    assert len(r.errors) == 1
    d["tables"]["Vehicles"][0]["lane_load"] = 0.2
    r = check(tmp_path, d)
    assert r.errors == ()
    find(r, cell("Vehicles", 0, "gross"), "with its lane load", severity="warning")
    assert [v for v in r.bridge.owner_vehicles if v.id == "OWN-1"][0].gross_weight_tons == 50.0


def test_a_permit_vehicle_and_its_own_live_load_factor_are_read(tmp_path) -> None:
    """A permit is a category of the owner's vehicles (MBE 6A.4.5 [value from memory]); the
    live-load factor given with a vehicle is kept, and one out of range is said at its
    cell."""
    from rating.model import VehicleCategory

    d = fresh()
    d["tables"]["Vehicles"][0]["category"] = "Single-trip permit (escorted)"
    d["tables"]["Vehicles"][0]["gamma_ll"] = 1.25
    d["tables"]["Vehicles"][0]["im"] = 0.0
    r = check(tmp_path, d)
    assert r.errors == ()
    v = next(v for v in r.bridge.owner_vehicles if v.id == "OWN-1")
    assert v.category is VehicleCategory.PERMIT_ESCORTED and v.gamma_ll == 1.25
    assert v.im == 0.0
    d["tables"]["Vehicles"][0]["im"] = 10.0
    d["tables"]["Vehicles"][0]["wheel_gauge"] = 9.0
    v = next(v for v in check(tmp_path, d).bridge.owner_vehicles if v.id == "OWN-1")
    assert v.im == pytest.approx(0.10) and v.wheel_gauge_ft == 9.0
    d["tables"]["Vehicles"][0]["wheel_gauge"] = 30.0
    find(check(tmp_path, d), cell("Vehicles", 0, "wheel_gauge"), "14")
    d["tables"]["Vehicles"][0]["wheel_gauge"] = None
    d["tables"]["Vehicles"][0]["gamma_ll"] = 4.0
    r = check(tmp_path, d)
    find(r, cell("Vehicles", 0, "gamma_ll"), "3")
    d["tables"]["Vehicles"][0]["gamma_ll"] = 0.4  # below the least factor read (0.5)
    find(check(tmp_path, d), cell("Vehicles", 0, "gamma_ll"), "0.5")
    d["tables"]["Vehicles"][0]["gamma_ll"] = None
    d["tables"]["Vehicles"][0]["category"] = "permit"
    r = check(tmp_path, d)
    find(r, cell("Vehicles", 0, "category"), "routine permit")


def test_the_owners_own_factors_and_a_permits_lane_load_are_said_at_their_cells(
        tmp_path) -> None:
    """A live-load factor or dynamic load allowance given with a vehicle replaces its
    category's (a lower one lifts a posting): said at its cell; so is an IM given for
    anything but an escorted permit (MBE 6A.4.5.5 [value from memory]), and a permit's lane
    load, placed like a legal load's."""
    d = fresh()
    d["tables"]["Vehicles"][0]["gamma_ll"] = 1.2
    d["tables"]["Vehicles"][0]["im"] = 0.0
    r = check(tmp_path, d)
    find(r, cell("Vehicles", 0, "gamma_ll"), "its own live-load factor 1.2",
         severity="warning")
    find(r, cell("Vehicles", 0, "im"), "only an escorted permit held to a crawl",
         severity="warning")
    d["tables"]["Vehicles"][0].update(category="single-trip permit (escorted)", gamma_ll=None,
                                      lane_load=0.2, gross=None)
    r = check(tmp_path, d)
    assert not [w for w in r.warnings if w.where == cell("Vehicles", 0, "im")]
    find(r, cell("Vehicles", 0, "lane_load"), "placed like a legal load's",
         severity="warning")


def test_counter_panels_that_get_no_counter_are_said_at_their_cell(tmp_path) -> None:
    """A through Pratt's end panels are crossed by the end posts, and the Warren forms get no
    generated counters at all: a listed panel that gets none was dropped without a word."""
    from inventory_helpers import form_cell

    d = fresh()
    d["bridge"].update(counter_panels="1, 2, 3, 4")
    r = check(tmp_path, d)
    find(r, form_cell("Bridge", "counter_panels"), "counter panels 1, 4 get no counter: an "
         "end panel is crossed by the end post", severity="warning")
    assert "counter panel 2" not in " ".join(w.message for w in r.warnings)
    d["bridge"].update(counter_panels="2", truss_form="warren")
    r = check(tmp_path, d)
    find(r, form_cell("Bridge", "counter_panels"), "counter panel 2 gets no counter: counters "
         "are generated for Pratt and Parker trusses only", severity="warning")
    d["bridge"].update(counter_panels="2, 3", truss_form="pratt")
    assert not [w for w in check(tmp_path, d).warnings if "get no counter" in w.message
                or "gets no counter" in w.message]


def test_a_bar_marked_not_tension_only_is_said_to_be_rated_as_one(tmp_path) -> None:
    """An eyebar or a rod cannot push whatever the Members sheet says: "no" in its
    tension-only cell was ignored without a word."""


    d = fresh()
    rows = d["tables"]["Members"]
    k = next(i for i, r in enumerate(rows) if r["member"] == "L1U1")  # the loop-rod hanger
    rows[k]["tension_only"] = "no"
    r = check(tmp_path, d)
    (w,) = [w for w in r.warnings if "marked not tension-only" in w.message]
    assert w.where == cell("Members", k, "tension_only")
    assert "its section is a rod set, which cannot push: it is rated as tension-only" in w.message


def test_a_hole_far_larger_than_its_pin_is_said_once_for_each_member(tmp_path) -> None:
    """One error for each member's bars on the pin, not one for every plate of the packing (a
    reviewer counted 13 identical errors); a pin worn a quarter inch under its holes is read
    (its rating says PIN WORN), not refused."""
    d = fresh()
    d["tables"]["Pins"][0].update(diameter=2.5)  # holes 3.53 in: 1.03 in over, a data error
    r = check(tmp_path, d)
    said = [e for e in r.errors if "larger than the 2.5 in pin" in e.message]
    assert sorted(e.message.split()[3] for e in said) == ["L1L2", "L2L3", "L2U3", "U1L2"]
    d["tables"]["Pins"][0].update(diameter=3.25)  # 0.28 in over: worn, rated
    assert check(tmp_path, d).errors == ()


def test_hidden_rows_and_sheets_and_sheets_not_read_are_said(tmp_path) -> None:
    """A hidden Findings row (60 % loss) controlled a reviewer's rating unseen; an older copy
    of a sheet ("Findings (2023)") was ignored without a word. Both are said, at their place,
    by either reader of the workbook."""
    import zipfile

    from inventory_helpers import coords, write

    from rating.inventory.book import _with_hidden, open_book_reference
    from rating.inventory.reader import read_workbook, rows_read, sheets_read

    _, ref_cell = coords(cell("Findings", 1, "member"))
    row = int("".join(ch for ch in ref_cell if ch.isdigit()))

    def edit(wb) -> None:
        wb["Findings"].row_dimensions[row].hidden = True
        wb["Vehicles"].sheet_state = "hidden"
        wb.create_sheet("Findings (2023)")["A1"] = "last inspection"

    path = write(tmp_path / "hidden.xlsx", fresh(), edit)
    r = read_workbook(path)
    (said,) = [w for w in r.warnings if w.where == f"Findings!A{row}"]
    assert f"row {row} of sheet Findings is hidden in the spreadsheet and is read" in said.message
    assert any(w.where == "Vehicles!A1" and "sheet Vehicles is hidden" in w.message
               for w in r.warnings)
    assert any(w.where == "Findings (2023)!A1" and "is not read" in w.message
               for w in r.warnings)
    assert r.errors == ()
    # the reference reader (openpyxl) finds the same
    with zipfile.ZipFile(path) as z:
        ref = _with_hidden(open_book_reference(path, sheets_read(), rows_read()), z)
    assert ref.hidden_sheets == ("Vehicles",) and ref.hidden_rows["Findings"] == (row,)
    # the template's own workbook hides nothing and has no other sheet
    assert not [w for w in check(tmp_path, fresh()).warnings
                if "hidden" in w.message or "is not read" in w.message]


def test_a_one_axle_owner_vehicle_is_said_to_be_an_axle_load(tmp_path) -> None:
    """A 24 kip roller set a reviewer's single weight limit for trucks at 7 tons where SU4 gave
    10: a one-axle vehicle's posting is an axle load, which is said at its row."""
    d = fresh()
    d["tables"]["Axles"] = [a for a in d["tables"]["Axles"] if a["axle"] == 1]
    d["tables"]["Vehicles"][0]["gross"] = None
    r = check(tmp_path, d)
    (said,) = [w for w in r.warnings if "has one axle" in w.message]
    assert said.where == cell("Vehicles", 0, "vehicle") and r.errors == ()


def test_the_floorbeams_moment_of_inertia_is_read_and_used_for_pony_trusses(tmp_path) -> None:
    """The floorbeam's I (for the U-frames of a pony truss) is read in in4, or mm4 in an SI
    workbook (1 in = 25.4 mm, NIST SP 811); on another truss it is said to go unused."""
    from inventory_helpers import form_cell

    d = fresh()
    d["bridge"]["floorbeam_I"] = 440.0
    d["bridge"]["chord_at_hips"] = "hinged"
    r = check(tmp_path, d)
    assert r.errors == () and r.bridge.cross_section.floorbeam_I_in4 == 440.0
    assert r.bridge.cross_section.chord_hinged_at_hips
    find(r, form_cell("Bridge", "floorbeam_I"), "pony truss only", severity="warning")
    find(r, form_cell("Bridge", "chord_at_hips"), "pony truss only", severity="warning")
    d["bridge"]["chord_at_hips"] = None
    d["bridge"]["deck_position"] = "pony"
    d["bridge"]["uframe_height"] = 9.5
    r = check(tmp_path, d)
    assert not [w for w in r.warnings if "pony truss only" in w.message]
    find(r, form_cell("Bridge", "chord_at_hips"), "taken as continuous", severity="warning")
    assert r.bridge.cross_section.chord_hinged_at_hips is None
    assert r.bridge.cross_section.uframe_height_ft == 9.5
    d["bridge"]["floorbeam_I"] = None
    find(check(tmp_path, d), form_cell("Bridge", "uframe_height"), "which is not given",
         severity="warning")
    d["bridge"]["floorbeam_I"] = 440.0
    d["bridge"]["floorbeam_I"] = -5.0
    find(check(tmp_path, d), form_cell("Bridge", "floorbeam_I"), "0")


def test_a_chord_spliced_through_a_pin_is_read_with_its_two_members(tmp_path) -> None:
    """Pins sheet, "Chord spliced through": the two members of one chord meeting at the
    joint (the end post and top chord at the hip U1); an error at the cell where no two
    members of one chord meet, or where they are eyebars (they bear on the pin)."""
    d = fresh()
    d["tables"]["Pins"].append({"joint": "U1", "diameter": 3.5, "material": "M-1",
                                "spliced": True})
    d["tables"]["Packing"] += [{"joint": "U1", "position": k + 1, "member": m,
                                "thickness": 0.75}
                               for k, m in enumerate(("L0U1", "U1L2", "L1U1", "U1L2", "U1U2"))]
    r = check(tmp_path, d)
    assert not [e for e in r.errors if e.where.startswith("Pins!")], r.errors
    pin = next(p for p in r.bridge.pins if p.joint == "U1")
    assert set(pin.spliced_chord) == {"L0U1", "U1U2"}
    # a hip spliced while the Bridge sheet gives the chord as hinged at the hips: said
    d["bridge"]["chord_at_hips"] = "hinged"
    find(check(tmp_path, d), cell("Pins", 1, "spliced"), "the two disagree",
         severity="warning")
    d["bridge"]["chord_at_hips"] = None
    # the eyebar bottom chord at L2 bears on its pin: not spliced
    d["tables"]["Pins"][0]["spliced"] = True
    find(check(tmp_path, d), cell("Pins", 0, "spliced"), "of eyebars or rods")
    # at the bearing L0 the end post meets the bottom chord: not one chord
    d["tables"]["Pins"][0]["spliced"] = None
    d["tables"]["Pins"].append({"joint": "L0", "diameter": 3.5, "material": "M-1",
                                "spliced": True})
    d["tables"]["Packing"] += [{"joint": "L0", "position": 1, "member": "L0L1",
                                "thickness": 0.875},
                               {"joint": "L0", "position": 2, "member": "L0U1",
                                "thickness": 0.75}]
    find(check(tmp_path, d), cell("Pins", 2, "spliced"), "two members of one chord")

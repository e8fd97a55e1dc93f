"""Where a section's dimensions come from (each section sheet's "Dimensions from"): an
estimated section is carried to its members, said in the assumptions, and headed in capitals
where a member with it sets a posting. Invented test data (the small bridge of
inventory_helpers: section DG is an eyebar set of the diagonals, PV a rolled I)."""

from __future__ import annotations

from pathlib import Path

from inventory_helpers import cell, check, fresh

from rating.lrfr.engine import ESTIMATED_SECTION, rate_bridge
from rating.results import bears_on_the_decision


def _with(sheet: str, section: str, source: str) -> dict:
    d = fresh()
    for row in d["tables"][sheet]:
        if row["section"] == section:
            row["dims_from"] = source
    return d


def test_an_estimated_section_is_carried_to_its_members(tmp_path: Path) -> None:
    r = check(tmp_path, _with("Rolled", "PV", "estimated"))
    assert r.errors == ()
    users = [d.member for d in r.bridge.member_designs if d.estimated_at]
    assert users and all(r.bridge.design_of(m).section.designation == "I 8 x 18.4 lb"
                         for m in users)
    assert r.bridge.design_of(users[0]).estimated_at == cell("Rolled", 0, "dims_from")
    plain = check(tmp_path, _with("Rolled", "PV", "plans"), name="p.xlsx")
    assert not any(d.estimated_at for d in plain.bridge.member_designs)


def test_an_estimated_section_that_sets_a_posting_heads_a_warning(tmp_path: Path) -> None:
    base = check(tmp_path, fresh(), name="base.xlsx").bridge
    rated = rate_bridge(base, ["OWN-1"], what_if=False)
    cp = rated.postings["OWN-1"]
    assert cp.result.action.value in ("post", "close"), "the test bridge must be posted"
    member = cp.controlling
    sheet = {"EyebarSet": "Eyebars", "RodSet": "Rods", "BuiltUpSection": "BuiltUp",
             "RolledShape": "Rolled"}[type(base.design_of(member).section).__name__]
    sid = next(row["section"] for row in fresh()["tables"]["Members"]
               if row["member"] == member)
    est = check(tmp_path, _with(sheet, sid, "estimated"), name="est.xlsx").bridge
    r = rate_bridge(est, ["OWN-1"], what_if=False)
    (said,) = [w for w in r.warnings if w.startswith(ESTIMATED_SECTION)]
    assert f"member {member}:" in said and bears_on_the_decision(said)
    assert any(a.startswith(f"member {member}: its section's dimensions are recorded as "
                            "estimated") for a in r.assumptions)
    assert not [w for w in rated.warnings if w.startswith(ESTIMATED_SECTION)]


def test_an_estimated_pin_that_sets_a_posting_heads_a_warning(tmp_path: Path) -> None:
    """The Pratt sample's pin at U3 controls the Type 3-3; given a smaller diameter it posts
    it: with its dimensions recorded as estimated (Pins sheet), the decision rests on them.
    (Invented test data.)"""
    import shutil

    import openpyxl
    from inventory_helpers import header

    from rating.inventory.reader import read_workbook

    book = tmp_path / "pratt.xlsx"
    shutil.copy(Path(__file__).resolve().parents[2] / "sample_inventory"
                / "tc0417_pratt_1898.xlsx", book)
    wb = openpyxl.load_workbook(book)
    ws = wb["Pins"]
    col = header("Pins", "dims_from").split("!")[1].rstrip("0123456789")
    joints = header("Pins", "joint").split("!")[1].rstrip("0123456789")
    row = next(c.row for c in ws[joints] if c.value == "U3")
    ws[f"{col}{row}"] = "estimated"
    dia = header("Pins", "diameter").split("!")[1].rstrip("0123456789")
    ws[f"{dia}{row}"] = ws[f"{dia}{row}"].value * 0.8
    wb.save(book)
    bridge = read_workbook(book).bridge
    assert next(p for p in bridge.pins if p.joint == "U3").estimated_at == f"Pins!{col}{row}"
    r = rate_bridge(bridge, ["TYPE-3-3"], what_if=False)
    assert r.postings["TYPE-3-3"].controlling == "pin at U3"
    assert r.postings["TYPE-3-3"].result.action.value == "post"
    (said,) = [w for w in r.warnings if w.startswith(ESTIMATED_SECTION)]
    assert said.startswith(f"{ESTIMATED_SECTION}: pin at U3: its dimensions (or those of a "
                           "plate on it) are recorded as estimated") and bears_on_the_decision(said)
    assert any(a.startswith("pin at joint U3: its dimensions (or those of a plate on it) are "
                            "recorded as estimated") for a in r.assumptions)


def test_an_estimated_plate_on_a_pin_makes_the_pin_estimated(tmp_path: Path) -> None:
    # a plate thickness on the Packing sheet judged by eye: the pin's bearing and moments
    # rest on it (the small bridge's pin at L2)
    d = fresh()
    rows = [row for row in d["tables"]["Packing"] if row["joint"] == "L2"]
    rows[1]["dims_from"] = "estimated"
    r = check(tmp_path, d)
    assert r.errors == ()
    pin = next(p for p in r.bridge.pins if p.joint == "L2")
    index = d["tables"]["Packing"].index(rows[1])
    assert pin.estimated_at == cell("Packing", index, "dims_from")

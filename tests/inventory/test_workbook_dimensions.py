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

"""A built-up section whose parts share metal is refused at its row of the BuiltUp sheet.
Invented test data (the small bridge of inventory_helpers)."""

from __future__ import annotations

from pathlib import Path

from inventory_helpers import cell, check, find, fresh


def test_overlapping_parts_are_an_error_at_the_section(tmp_path: Path) -> None:
    d = fresh()
    # section EP: two channels and a cover plate; sink the cover 0.1 in into the channels
    cover = next(p for p in d["tables"]["Plates"] if p["section"] == "EP")
    cover["y"] = 5.09
    r = check(tmp_path, d)
    find(r, cell("BuiltUp", 1, "section"), "built-up member EP cannot be used: member using "
         "section EP: parts cover (plate) and C-L (web) overlap by 0.24 in x 0.0975 in")
    assert r.bridge is None
